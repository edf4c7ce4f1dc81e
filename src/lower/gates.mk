## gate lowering, passes, emitters
libcairn_a_SOURCES += include/cairn/gates.h src/lower/gate_int.h src/lower/emit_int.h \
	src/lower/gate_lower.c src/lower/gate_short.c src/lower/pass_cancel.c src/lower/gate_count.c \
	src/lower/gate_bind.c src/lower/gate_diff.c \
	src/lower/emit.c src/lower/emit_listing.c src/lower/emit_qasm.c

## reference checks: a C driver over the JSON rotation program, checked by numpy
check_PROGRAMS += tests/ref/gates_driver
tests_ref_gates_driver_SOURCES = tests/ref/gates_driver.c
tests_ref_gates_driver_LDADD = $(CAIRN_LIBS)
TESTS += tests/ref/gates_sim.py tests/ref/gates_recipes.py tests/ref/gates_examples.py tests/ref/gates_sparse.py
EXTRA_DIST += tests/ref/gates_sim.py tests/ref/gates_recipes.py tests/ref/gates_examples.py tests/ref/gates_sparse.py

check_PROGRAMS += tests/unit/test_gates
UNIT_TESTS += tests/unit/test_gates
tests_unit_test_gates_SOURCES = tests/unit/test_gates.c
tests_unit_test_gates_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_gates_LDADD = $(UNIT_LDADD)

## golden listings and the build command (shell checks)
TESTS += tests/ref/gates_golden.sh tests/ref/gates_build.sh
EXTRA_DIST += docs/listing.md tests/bench/gates_acceptance.py tests/ref/gates_golden.sh tests/ref/gates_build.sh \
	tests/golden/listing/h2-uccsd.json tests/golden/listing/qcc-meanfield.json \
	tests/golden/listing/h2-uccsd.gates tests/golden/listing/h2-uccsd.short.gates \
	tests/golden/listing/h2-uccsd.plain.gates tests/golden/listing/qcc-meanfield.gates \
	tests/golden/listing/qcc-meanfield.tree.gates

## benchmark (make bench): the 100-qubit UCCSD pool to listing and OpenQASM 3
noinst_PROGRAMS += tests/bench/gates_bench
tests_bench_gates_bench_SOURCES = tests/bench/gates_bench.c
tests_bench_gates_bench_LDADD = $(CAIRN_LIBS)
bench-gates: tests/bench/gates_bench$(EXEEXT)
	./tests/bench/gates_bench$(EXEEXT)
