locind_bench(bench/study_bench.cc)
