## generators: pool rules, screening, selection, symmetry typing, rotation program
libcairn_a_SOURCES += src/ansatz/circuit.c src/ansatz/ans_priv.h include/cairn/pool.h \
	src/ansatz/masks.c src/ansatz/screen.c src/ansatz/reference.c src/ansatz/pool.c \
	src/ansatz/rules.c src/ansatz/entangler.c src/ansatz/symmetry.c src/ansatz/select.c \
	src/ansatz/program.c src/ansatz/table.c src/ansatz/setup.c \
	src/ansatz/entry.c src/ansatz/grow.c

check_PROGRAMS += tests/unit/test_ans
UNIT_TESTS += tests/unit/test_ans
tests_unit_test_ans_SOURCES = tests/unit/test_ans.c
tests_unit_test_ans_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_ans_LDADD = $(UNIT_LDADD)

## reference checks: a C driver over FCIDUMP files, checked by numpy and psi4
check_PROGRAMS += tests/ref/ans_driver
tests_ref_ans_driver_SOURCES = tests/ref/ans_driver.c
tests_ref_ans_driver_LDADD = $(CAIRN_LIBS)
TESTS += tests/ref/ans_gradients.py tests/ref/ans_doubles.py tests/ref/ans_symmetry.py
EXTRA_DIST += tests/ref/ans_gradients.py tests/ref/ans_doubles.py tests/ref/ans_symmetry.py tests/ref/ans_common.py

