list(APPEND LOCIND_CORE_SOURCES
  learners/oracle_test.cc
)
