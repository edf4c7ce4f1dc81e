## benchmarks (make bench); each module appends its target to BENCH_TARGETS
BENCH_TARGETS += bench-gates

## benchmark (make bench): pool screening at 40 and 100 qubits
noinst_PROGRAMS += tests/bench/ans_bench
tests_bench_ans_bench_SOURCES = tests/bench/ans_bench.c
tests_bench_ans_bench_LDADD = $(TESTSUPPORT_LIBS) $(CAIRN_LIBS)
EXTRA_DIST += tests/bench/n2_fcidump.sh
BENCH_TARGETS += bench-ans
bench-ans: tests/bench/ans_bench$(EXEEXT)
	$(SHELL) $(srcdir)/tests/bench/n2_fcidump.sh $(abs_top_builddir) $(PYTHON) ans_bench
