## statevector engine, adjoint gradients, optimizers
libcairn_a_SOURCES += src/lower/sv.c src/lower/sv_op.c src/lower/sv_priv.h src/lower/sim.c src/lower/opt.c \
	include/cairn/sv.h include/cairn/sim.h

check_PROGRAMS += tests/unit/test_sv
UNIT_TESTS += tests/unit/test_sv
tests_unit_test_sv_SOURCES = tests/unit/test_sv.c
tests_unit_test_sv_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_sv_LDADD = $(UNIT_LDADD)
