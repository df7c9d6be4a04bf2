locind_bench(bench/hawkes_bench.cc)
locind_bench(bench/diffusion_bench.cc)
