## qubit layer: Pauli algebra, encodings, symmetry operators, tapering
libcairn_a_SOURCES += src/qubit/pauli.c

check_PROGRAMS += tests/unit/test_pauli
UNIT_TESTS += tests/unit/test_pauli
tests_unit_test_pauli_SOURCES = tests/unit/test_pauli.c
tests_unit_test_pauli_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_pauli_LDADD = $(UNIT_LDADD)
