## test support: code that several unit tests, check drivers and benchmarks
## share (invented data, slow reference routes, hand-built recipes);
## link $(TESTSUPPORT_LIBS) before libcairn.a
noinst_LIBRARIES += tests/support/libtestsupport.a
tests_support_libtestsupport_a_SOURCES = tests/support/testdata.c tests/support/testdata.h \
	tests/support/testref.c tests/support/testref.h tests/support/testrecipe.c tests/support/testrecipe.h \
	tests/support/testbench.c tests/support/testbench.h
TESTSUPPORT_LIBS = tests/support/libtestsupport.a
