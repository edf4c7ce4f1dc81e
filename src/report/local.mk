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

## checks against outside references (psi4 live, rsvg-convert, groff, vim) and goldens
TESTS += tests/ref/report_figures.py tests/ref/report_golden.sh tests/ref/report_help.py \
	tests/ref/report_man.sh tests/ref/report_editors.py
EXTRA_DIST += tests/ref/report_figures.py tests/ref/report_golden.sh tests/ref/report_help.py \
	tests/ref/report_man.sh tests/ref/report_editors.py tests/ref/report_pngcheck.py \
	tests/ref/report_keywords.py \
	tests/golden/report/README.md tests/golden/report/make_inputs.py tests/golden/report/scan-in.json tests/golden/report/single-in.json \
	tests/golden/report/scan.txt tests/golden/report/scan-points.txt tests/golden/report/scan.json \
	tests/golden/report/scan.csv tests/golden/report/scan.svg \
	tests/golden/report/single.txt tests/golden/report/single-points.txt tests/golden/report/single.json \
	tests/golden/report/single.csv tests/golden/report/single.svg \
	editors/README.md editors/vim/syntax/cairn.vim editors/vim/ftdetect/cairn.vim \
	editors/vim/ftplugin/cairn.vim editors/textmate/cairn.tmLanguage.json

## the manual page, installed by `make install`
dist_man_MANS += doc/cairn.1
