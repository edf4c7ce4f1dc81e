## reports: text, JSON, CSV, SVG; help topics
libcairn_a_SOURCES += src/report/run.c src/report/text.c src/report/json.c src/report/json_read.c src/report/csv.c \
	src/report/plot.c src/report/figure.c src/report/help.c src/report/plot.h src/report/report_int.h \
	include/cairn/report.h include/cairn/help.h

## the driver that writes every output of a JSON report (used by the checks)
check_PROGRAMS += tests/unit/test_report_files
tests_unit_test_report_files_SOURCES = tests/unit/test_report_files.c
tests_unit_test_report_files_LDADD = $(CAIRN_LIBS)

check_PROGRAMS += tests/unit/test_report
UNIT_TESTS += tests/unit/test_report
tests_unit_test_report_SOURCES = tests/unit/test_report.c
tests_unit_test_report_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_report_LDADD = $(UNIT_LDADD)
