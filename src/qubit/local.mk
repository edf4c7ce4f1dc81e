## qubit layer: Pauli algebra, encodings, symmetry operators, tapering
libcairn_a_SOURCES += src/qubit/pauli.c src/qubit/encoder.c src/qubit/hamiltonian.c src/qubit/symmetry.c \
	src/qubit/taper.c src/qubit/qubit_impl.h

check_PROGRAMS += tests/unit/test_pauli
UNIT_TESTS += tests/unit/test_pauli
tests_unit_test_pauli_SOURCES = tests/unit/test_pauli.c
tests_unit_test_pauli_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_pauli_LDADD = $(UNIT_LDADD)

check_PROGRAMS += tests/unit/test_qubit
UNIT_TESTS += tests/unit/test_qubit
tests_unit_test_qubit_SOURCES = tests/unit/test_qubit.c
tests_unit_test_qubit_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_qubit_LDADD = $(UNIT_LDADD)

## reference checks (psi4, numpy, scipy live): a C driver prints our Pauli sums as JSON
check_PROGRAMS += tests/ref/qubit_driver
tests_ref_qubit_driver_SOURCES = tests/ref/qubit_driver.c
tests_ref_qubit_driver_LDADD = $(CAIRN_LIBS)
TESTS += tests/ref/qubit_spectrum.py tests/ref/qubit_fci.py tests/ref/qubit_show.py
EXTRA_DIST += tests/ref/qubit_common.py tests/ref/qubit_spectrum.py tests/ref/qubit_fci.py tests/ref/qubit_show.py

## benchmark (make bench): Hamiltonian build at 40 and 100 qubits
noinst_PROGRAMS += tests/bench/qubit_bench
tests_bench_qubit_bench_SOURCES = tests/bench/qubit_bench.c
tests_bench_qubit_bench_LDADD = $(CAIRN_LIBS)
EXTRA_DIST += tests/bench/qubit_bench.sh
BENCH_TARGETS += bench-qubit
bench-qubit: tests/bench/qubit_bench$(EXEEXT)
	$(SHELL) $(srcdir)/tests/bench/qubit_bench.sh $(abs_top_builddir) $(PYTHON)
