locind_bench(bench/learners_methods_bench.cc)
