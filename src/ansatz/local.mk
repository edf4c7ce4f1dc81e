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
TESTS += tests/ref/ans_gradients.py tests/ref/ans_doubles.py tests/ref/ans_symmetry.py tests/ref/ans_show.py
EXTRA_DIST += tests/ref/ans_gradients.py tests/ref/ans_doubles.py tests/ref/ans_symmetry.py tests/ref/ans_common.py \
	tests/ref/ans_show.py


## recipes that must fail the symmetry checker, with golden diagnostics
## (tests/golden/check/run.sh --update rewrites the .err files)
TESTS += tests/golden/check/run.sh
EXTRA_DIST += tests/golden/check/run.sh tests/golden/check/data/README tests/golden/check/data/h4.fcidump \
	tests/golden/check/data/make-h4.py
EXTRA_DIST += tests/golden/check/bits-electrons.cairn tests/golden/check/bits-electrons.err \
	tests/golden/check/bits-spin-squared.cairn tests/golden/check/bits-spin-squared.err \
	tests/golden/check/doubles-spin-squared.cairn tests/golden/check/doubles-spin-squared.err \
	tests/golden/check/entanglers-particles.cairn tests/golden/check/entanglers-particles.err \
	tests/golden/check/entanglers-spin-z.cairn tests/golden/check/entanglers-spin-z.err \
	tests/golden/check/excite-spin-flip.cairn tests/golden/check/excite-spin-flip.err \
	tests/golden/check/generalized-spin-squared.cairn tests/golden/check/generalized-spin-squared.err \
	tests/golden/check/mean-field-exact.cairn tests/golden/check/mean-field-exact.err \
	tests/golden/check/qubit-doubles-spin-squared.cairn \
	tests/golden/check/qubit-doubles-spin-squared.err tests/golden/check/singles-spin-squared.cairn \
	tests/golden/check/singles-spin-squared.err tests/golden/check/taper-excite.cairn \
	tests/golden/check/taper-excite.err tests/golden/check/taper-word.cairn \
	tests/golden/check/taper-word.err tests/golden/check/word-particles.cairn \
	tests/golden/check/word-particles.err
