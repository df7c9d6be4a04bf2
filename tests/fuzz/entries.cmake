# The fuzzed readers behind one signature (tests/fuzz/reader_entries.h), used
# by the libFuzzer programs and by the corpus replay test.
include_guard(GLOBAL)
add_library(locind_fuzz_entries STATIC tests/fuzz/reader_entries.cc)
target_include_directories(locind_fuzz_entries PUBLIC ${CMAKE_CURRENT_SOURCE_DIR})
target_link_libraries(locind_fuzz_entries PUBLIC locind_app)
