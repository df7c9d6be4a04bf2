locind_bench(bench/mu_separation_bench.cc)
locind_bench(bench/equivalence_class_bench.cc)
