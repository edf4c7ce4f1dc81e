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
