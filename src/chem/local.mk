## chemistry: basis sets, integrals, SCF, transforms, FCIDUMP, MP2, CCSD, FCI
libcairn_a_SOURCES += src/chem/element.c src/chem/chem.c src/chem/chem_util.c src/chem/chem_private.h \
	src/chem/basis.c src/chem/fcidump.c src/chem/space.c src/chem/boys.c src/chem/integrals.c src/chem/scf.c \
	src/chem/mp2.c src/chem/ccsd.c src/chem/fci.c \
	include/cairn/basis.h include/cairn/fcidump.h include/cairn/integrals.h include/cairn/scf.h
nodist_libcairn_a_SOURCES = src/chem/basis_data.c

## The shipped basis sets: embedded into the binary (a generated C source) so
## cairn works from the build tree, and installed for users to read and copy.
CHEM_BASIS_FILES = data/basis/sto-3g.gbs data/basis/6-31g.gbs data/basis/6-31gs.gbs data/basis/cc-pvdz.gbs
chembasisdir = $(pkgdatadir)/basis
dist_chembasis_DATA = $(CHEM_BASIS_FILES)
EXTRA_DIST += src/chem/basis-extract.py
CLEANFILES += src/chem/basis_data.c
src/chem/basis_data.c: $(CHEM_BASIS_FILES) $(srcdir)/src/chem/local.mk
	$(AM_V_GEN)$(MKDIR_P) src/chem && { \
	  echo '/* Generated from the files in data/basis by a rule in src/chem/local.mk: do not edit. */'; \
	  echo '#include "config.h"'; \
	  echo '#include "chem/chem_private.h"'; \
	  echo 'const chem_basis_text chem_basis_texts[] = {'; \
	  for f in $(CHEM_BASIS_FILES); do \
	    n=`basename $$f .gbs | sed 's/^6-31gs$$/6-31g*/'`; \
	    echo "  {\"$$n\","; \
	    sed -e 's/\\/\\\\/g' -e 's/"/\\"/g' -e 's/^/   "/' -e 's/$$/\\n"/' $(srcdir)/$$f; \
	    echo '  },'; \
	  done; \
	  echo '};'; \
	  echo 'const int chem_basis_ntexts = (int)(sizeof chem_basis_texts / sizeof chem_basis_texts[0]);'; \
	} > $@-t && mv $@-t $@

## unit tests
check_PROGRAMS += tests/unit/test_chem_io
UNIT_TESTS += tests/unit/test_chem_io
tests_unit_test_chem_io_SOURCES = tests/unit/test_chem_io.c
tests_unit_test_chem_io_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_chem_io_LDADD = $(UNIT_LDADD)

## the check program the reference tests drive beside psi4
check_PROGRAMS += tests/ref/chem_driver
tests_ref_chem_driver_SOURCES = tests/ref/chem_driver.c
tests_ref_chem_driver_LDADD = $(TESTSUPPORT_LIBS) $(CAIRN_LIBS)
check_PROGRAMS += tests/unit/test_chem_ints tests/unit/test_chem_methods
UNIT_TESTS += tests/unit/test_chem_ints tests/unit/test_chem_methods
tests_unit_test_chem_ints_SOURCES = tests/unit/test_chem_ints.c
tests_unit_test_chem_ints_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_chem_ints_LDADD = $(UNIT_LDADD)
tests_unit_test_chem_methods_SOURCES = tests/unit/test_chem_methods.c
tests_unit_test_chem_methods_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_chem_methods_LDADD = $(UNIT_LDADD)

## reference checks against psi4 (run live), numpy and scipy; golden messages
CHEM_REF_TESTS = tests/ref/chem_scf.py tests/ref/chem_corr.py tests/ref/chem_rohf.py tests/ref/chem_szabo.py \
	tests/ref/chem_boys.py tests/ref/chem_fcidump_roundtrip.py tests/ref/chem_fci_numpy.py tests/ref/chem_golden.py \
	tests/ref/chem_cmd_integrals.py tests/ref/chem_limits.py
TESTS += $(CHEM_REF_TESTS)
EXTRA_DIST += $(CHEM_REF_TESTS) tests/ref/chem_common.py tests/ref/chem_heh.gbs tests/ref/chem_water.cairn tests/golden/fcidump tests/golden/basis

## benchmark (make bench): integrals + SCF and the exact solver, beside psi4
noinst_PROGRAMS += tests/bench/chem_bench
tests_bench_chem_bench_SOURCES = tests/bench/chem_bench.c
tests_bench_chem_bench_LDADD = $(TESTSUPPORT_LIBS) $(CAIRN_LIBS)
EXTRA_DIST += tests/bench/chem_bench.py
BENCH_TARGETS += bench-chem
bench-chem: tests/bench/chem_bench$(EXEEXT)
	$(PYTHON) $(srcdir)/tests/bench/chem_bench.py $(abs_top_builddir)

## libFuzzer target for the FCIDUMP and basis-file readers (`make fuzz`, as
## for the recipe parser in src/front/local.mk; .ci/run runs it for 45
## seconds).  Built from the readers' own sources and the few they call.
CHEM_FUZZ_FILES = $(srcdir)/tests/fuzz/fuzz_inputs.c $(srcdir)/src/chem/fcidump.c $(srcdir)/src/chem/basis.c \
	$(srcdir)/src/chem/basis_data.c $(srcdir)/src/chem/chem_util.c $(srcdir)/src/chem/element.c \
	$(srcdir)/src/chem/space.c $(srcdir)/src/util.c $(srcdir)/src/diag.c
EXTRA_DIST += tests/fuzz/fuzz_inputs.c tests/fuzz/inputs.dict
CLEANFILES += tests/fuzz/fuzz_inputs
fuzz: tests/fuzz/fuzz_inputs
tests/fuzz/fuzz_inputs: $(CHEM_FUZZ_FILES)
	@case "$(CC)" in *clang*) ;; *) echo "make fuzz: needs libFuzzer: configure with CC=clang" >&2; exit 2;; esac
	@$(MKDIR_P) tests/fuzz
	$(AM_V_CCLD)$(CC) $(DEFS) -I$(top_builddir) $(AM_CPPFLAGS) $(CPPFLAGS) -std=gnu11 $(CAIRN_CFLAGS) $(CFLAGS) -fsanitize=fuzzer \
	  -o $@ $(CHEM_FUZZ_FILES) -lm
