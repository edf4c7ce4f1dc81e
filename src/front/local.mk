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
