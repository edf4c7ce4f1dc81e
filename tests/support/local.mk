## test support: code that several unit tests and benchmarks share (invented
## data, slow reference routes); link $(TESTSUPPORT_LIBS) before libcairn.a
noinst_LIBRARIES += tests/support/libtestsupport.a
tests_support_libtestsupport_a_SOURCES = tests/support/testdata.c tests/support/testdata.h \
	tests/support/testref.c tests/support/testref.h
TESTSUPPORT_LIBS = tests/support/libtestsupport.a
