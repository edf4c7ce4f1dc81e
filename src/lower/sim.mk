## statevector engine, adjoint gradients, optimizers
libcairn_a_SOURCES += src/lower/sv.c src/lower/sv_op.c src/lower/sv_gen.c src/lower/sv_priv.h src/lower/sim.c src/lower/opt.c \
	include/cairn/sv.h include/cairn/sim.h

check_PROGRAMS += tests/unit/test_sv
UNIT_TESTS += tests/unit/test_sv
tests_unit_test_sv_SOURCES = tests/unit/test_sv.c
tests_unit_test_sv_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_sv_LDADD = $(UNIT_LDADD)

check_PROGRAMS += tests/unit/test_sim
UNIT_TESTS += tests/unit/test_sim
tests_unit_test_sim_SOURCES = tests/unit/test_sim.c
tests_unit_test_sim_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_sim_LDADD = $(UNIT_LDADD)

## reference checks: a C driver over the JSON forms, checked by numpy/scipy
check_PROGRAMS += tests/ref/sim_driver
tests_ref_sim_driver_SOURCES = tests/ref/sim_driver.c
tests_ref_sim_driver_LDADD = $(CAIRN_LIBS)
TESTS += tests/ref/sim_expm.py tests/ref/sim_optimize.py tests/ref/sim_h2_uccsd.py
EXTRA_DIST += tests/ref/sim_expm.py tests/ref/sim_optimize.py tests/ref/sim_h2_uccsd.py

## benchmark (make bench): rotation bandwidth and energy + gradient vs numpy/scipy
noinst_PROGRAMS += tests/bench/sim_bench
tests_bench_sim_bench_SOURCES = tests/bench/sim_bench.c
tests_bench_sim_bench_LDADD = $(CAIRN_LIBS)
EXTRA_DIST += tests/bench/sim_bench.py
BENCH_TARGETS += bench-sim
bench-sim: tests/bench/sim_bench$(EXEEXT)
	SIM_BENCH='$(abs_top_builddir)/tests/bench/sim_bench' OMP_NUM_THREADS=$${OMP_NUM_THREADS:-2} \
	OPENBLAS_NUM_THREADS=1 $(PYTHON) $(srcdir)/tests/bench/sim_bench.py
