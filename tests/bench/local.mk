## benchmarks (make bench); each module appends its target to BENCH_TARGETS
BENCH_TARGETS += bench-gates
