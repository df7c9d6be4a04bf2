# Every layer lists its own test files in tests/<layer>/tests.cmake.
include(tests/graph/tests.cmake)
include(tests/sim/tests.cmake OPTIONAL)
include(tests/learners/tests.cmake OPTIONAL)
include(tests/metrics/tests.cmake OPTIONAL)
include(tests/app/tests.cmake OPTIONAL)
include(tests/reference/tests.cmake OPTIONAL)
include(tests/fuzz/tests.cmake)
include(tests/scripts/tests.cmake)
