# Every layer lists its own benchmark programs in bench/<layer>.cmake.
include(bench/graph.cmake)
include(bench/sim.cmake OPTIONAL)
include(bench/learners.cmake OPTIONAL)
include(bench/app.cmake OPTIONAL)
