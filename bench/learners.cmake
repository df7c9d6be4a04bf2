locind_bench(bench/learners_methods_bench.cc)
locind_bench(bench/learners_tests_bench.cc)
