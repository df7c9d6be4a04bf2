# graph engine benchmarks
