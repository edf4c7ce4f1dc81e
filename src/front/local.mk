## recipe language front end: scanner, parser, AST, resolve, fmt, diff
## The scanner and parser are generated into the build tree (grammar/).
libcairn_a_SOURCES += src/front/ast.c src/front/ast.h src/front/parse.c src/front/parse.h \
	src/front/suggest.c src/front/suggest.h src/front/resolve.c src/front/resolve.h src/front/eval.c \
	src/front/space.c src/front/ir.c src/front/fmt.c src/front/diff.c
# The generated scanner and parser are compiled as their own convenience
# library, whose objects go into libcairn.a.
noinst_LIBRARIES += libcairn_grammar.a
nodist_libcairn_grammar_a_SOURCES = grammar/recipe.tab.c grammar/recipe.tab.h grammar/recipe.lex.c grammar/recipe.lex.h
libcairn_a_LIBADD = grammar/recipe.tab.$(OBJEXT) grammar/recipe.lex.$(OBJEXT)
BUILT_SOURCES += grammar/recipe.tab.h grammar/recipe.lex.h
CLEANFILES += grammar/recipe.tab.c grammar/recipe.tab.h grammar/recipe.lex.c grammar/recipe.lex.h \
	grammar/recipe.output
EXTRA_DIST += grammar/recipe.y grammar/recipe.l

# bison writes the .c and the .h in one run; the .h rule only orders them.
grammar/recipe.tab.c: $(top_srcdir)/grammar/recipe.y
	@$(MKDIR_P) grammar
	$(AM_V_GEN)$(BISON) -Wall -Werror -o grammar/recipe.tab.c --defines=grammar/recipe.tab.h $(top_srcdir)/grammar/recipe.y
grammar/recipe.tab.h: grammar/recipe.tab.c
	@test -f $@ || { rm -f grammar/recipe.tab.c; $(MAKE) $(AM_MAKEFLAGS) grammar/recipe.tab.c; }
grammar/recipe.lex.c: $(top_srcdir)/grammar/recipe.l grammar/recipe.tab.h
	@$(MKDIR_P) grammar
	$(AM_V_GEN)$(LEX) -o grammar/recipe.lex.c --header-file=grammar/recipe.lex.h $(top_srcdir)/grammar/recipe.l
grammar/recipe.lex.h: grammar/recipe.lex.c
	@test -f $@ || { rm -f grammar/recipe.lex.c; $(MAKE) $(AM_MAKEFLAGS) grammar/recipe.lex.c; }

## unit tests
check_PROGRAMS += tests/unit/test_front_scan
UNIT_TESTS += tests/unit/test_front_scan
tests_unit_test_front_scan_SOURCES = tests/unit/test_front_scan.c tests/unit/test_front.h
tests_unit_test_front_scan_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_front_scan_LDADD = $(UNIT_LDADD)
check_PROGRAMS += tests/unit/test_front_parse
UNIT_TESTS += tests/unit/test_front_parse
tests_unit_test_front_parse_SOURCES = tests/unit/test_front_parse.c tests/unit/test_front.h
tests_unit_test_front_parse_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_front_parse_LDADD = $(UNIT_LDADD)
check_PROGRAMS += tests/unit/test_front_resolve
UNIT_TESTS += tests/unit/test_front_resolve
tests_unit_test_front_resolve_SOURCES = tests/unit/test_front_resolve.c tests/unit/test_front.h
tests_unit_test_front_resolve_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_front_resolve_LDADD = $(UNIT_LDADD)
check_PROGRAMS += tests/unit/test_front_fmt
UNIT_TESTS += tests/unit/test_front_fmt
tests_unit_test_front_fmt_SOURCES = tests/unit/test_front_fmt.c tests/unit/test_front.h
tests_unit_test_front_fmt_CFLAGS = $(UNIT_CFLAGS)
tests_unit_test_front_fmt_LDADD = $(UNIT_LDADD)

## golden files: bad recipes with their diagnostics, fmt pairs, diff cases
TESTS += tests/golden/recipes/run.sh tests/golden/fmt/run.sh tests/golden/diff/run.sh tests/golden/cli.sh
EXTRA_DIST += tests/golden/recipes tests/golden/fmt tests/golden/diff tests/golden/cli.sh tests/unit/test_front.h \
	examples/lih-stretched.cairn examples/water-scan.cairn examples/h4-fcidump.cairn examples/data

## libFuzzer target for the parser and resolver: `make fuzz` in a tree
## configured with CC=clang and CFLAGS holding -fsanitize=fuzzer-no-link
## (and address,undefined); .ci/run runs it for 60 seconds.
EXTRA_DIST += tests/fuzz/fuzz_recipe.c tests/fuzz/recipe.dict
CLEANFILES += tests/fuzz/fuzz_recipe
fuzz: tests/fuzz/fuzz_recipe
tests/fuzz/fuzz_recipe: $(srcdir)/tests/fuzz/fuzz_recipe.c libcairn.a
	@case "$(CC)" in *clang*) ;; *) echo "make fuzz: needs libFuzzer: configure with CC=clang" >&2; exit 2;; esac
	@$(MKDIR_P) tests/fuzz
	$(AM_V_CCLD)$(CC) $(DEFS) -I$(top_builddir) $(AM_CPPFLAGS) $(CPPFLAGS) $(AM_CFLAGS) $(CFLAGS) -fsanitize=fuzzer \
	  -o $@ $(srcdir)/tests/fuzz/fuzz_recipe.c $(CAIRN_LIBS) $(LIBS)
.PHONY: fuzz
