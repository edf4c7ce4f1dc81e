## tests shared by several modules
check_PROGRAMS += tests/unit/test_util
UNIT_TESTS += tests/unit/test_util
tests_unit_test_util_SOURCES = tests/unit/test_util.c
tests_unit_test_util_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_util_LDADD = $(UNIT_LDADD)
## helpers shared by the reference checks of several modules (tests/ref/*.py)
EXTRA_DIST += tests/ref/ref_common.py

## acceptance studies and examples (owned by the acceptance work)
include tests/accept.mk
