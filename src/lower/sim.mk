## statevector engine, adjoint gradients, optimizers
libcairn_a_SOURCES += src/lower/sv.c src/lower/sv_op.c src/lower/sv_priv.h src/lower/sim.c src/lower/opt.c \
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
TESTS += tests/ref/sim_expm.py tests/ref/sim_optimize.py
EXTRA_DIST += tests/ref/sim_expm.py tests/ref/sim_optimize.py
