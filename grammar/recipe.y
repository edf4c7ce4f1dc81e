/* recipe.y — the grammar of cairn recipes (language version 1).
 *
 * A pure parser with byte-span locations.  Statements end at a newline (NL is
 * a token); blocks `{ ... }` hold one item per line.  Actions only call ast_*
 * builders: all meaning is decided in src/front/resolve.c.
 *
 * %expect 0: the grammar has no conflicts; the few operator ambiguities are
 * settled by precedence, never by raising that number.  Unary signs are their
 * own token (SIGN): the scanner decides from the spacing whether `-` subtracts
 * or starts a new value, which is what lets `H 0 -r*sin(x) r*cos(x)` hold three
 * coordinates.
 *
 * Error recovery: a bad statement or block item is skipped up to its newline,
 * and the lexer wrapper (src/front/parse.c) closes a block whose `}` is missing
 * when the next statement begins, so one mistake gives one message.
 */

%code requires {
#include "cairn/diag.h"
#include "front/ast.h"
struct front_parser;
/* A location is a byte span; a rule's span runs from its first symbol's start
 * to its last symbol's end (an empty rule: empty, at the previous end). */
#define YYLLOC_DEFAULT(Cur, Rhs, N)                              \
  do {                                                           \
    if (N) {                                                     \
      (Cur).file = YYRHSLOC(Rhs, 1).file;                        \
      (Cur).start = YYRHSLOC(Rhs, 1).start;                      \
      (Cur).end = YYRHSLOC(Rhs, N).end;                          \
    } else {                                                     \
      (Cur).file = YYRHSLOC(Rhs, 0).file;                        \
      (Cur).start = (Cur).end = YYRHSLOC(Rhs, 0).end;            \
    }                                                            \
  } while (0)
}

%code provides {
int recipe_yylex(RECIPE_YYSTYPE *lval, diag_span *lloc, struct front_parser *p);
}

%code {
#include "front/parse.h"
#include "cairn/util.h"

#include <string.h>

static void recipe_yyerror(diag_span *loc, struct front_parser *p, const char *msg);
#define D (p->d)
}

%define api.prefix {recipe_yy}
%define api.pure full
%define api.location.type {diag_span}
%define parse.error custom
%define parse.lac full
%locations
%expect 0
%param {struct front_parser *p}

%initial-action {
  @$ = (diag_span){p->file, 0, 0};
}

%union {
  ast_expr *expr;
  ast_stmt *stmt;
  ast_block *block;
  ast_spans *spans;
  ast_ranges *ranges;
  diag_span span;
  int flag;
}

%destructor { ast_expr_free($$); } <expr>
%destructor { ast_stmt_free($$); } <stmt>
%destructor { ast_block_free($$); } <block>
%destructor { ast_spans_free($$); } <spans>
%destructor { ast_ranges_free($$); } <ranges>

%token NL "end of line"
%token <flag> NUMBER "number"
%token IDENT "name"
%token STRING "string"
%token BASISNAME "basis set name"
%token BITSTR "bit string"
%token <flag> SIGN "sign"
%token FUNC "function"
%token UNIT "unit"
%token PLUS "`+`" MINUS "`-`" STAR "`*`" SLASH "`/`" CARET "`^`" EQ "`=`"
%token LPAREN "`(`" RPAREN "`)`" LBRACE "`{`" RBRACE "`}`" ARROW "`->`" DOTDOT "`..`"
/* keywords: ORDER KEYWORDS in src/front/parse.c */
%token CAIRN "`cairn`" LET "`let`" VARY "`vary`" FROM "`from`" TO "`to`" STEP "`step`"
%token ATOMS "`atoms`" CHARGE "`charge`" MULTIPLICITY "`multiplicity`" BASIS "`basis`"
%token FILE_ "`file`" INTEGRALS "`integrals`" ORBITALS "`orbitals`" FREEZE "`freeze`"
%token CORE "`core`" ACTIVE "`active`" ELECTRONS "`electrons`" IN "`in`"
%token ENCODING "`encoding`" REFERENCE "`reference`" BITS "`bits`" KEEP "`keep`"
%token EXACTLY "`exactly`" PENALTY "`penalty`" CHECKED "`checked`" POOL "`pool`"
%token WORD "`word`" EXCITE "`excite`" CHOOSE "`choose`" BY "`by`" GRADIENT "`gradient`"
%token ABOVE "`above`" ALL "`all`" GROW "`grow`" UNTIL "`until`" ORDER "`order`"
%token AS "`as`" WRITTEN "`written`" RANK "`rank`" TROTTER "`trotter`"
%token OPTIMIZE "`optimize`" EMIT "`emit`" USE "`use`"

%type <expr> expr
%type <stmt> stmt atom_item orb_item pool_item setting
%type <block> atom_items orb_items pool_items settings
%type <spans> names ptoks
%type <ranges> ranges nums
%type <span> unit_opt bopen symbol ptok

%left PLUS MINUS
%left STAR SLASH
%precedence SIGN
%right CARET
%precedence UNIT

%%

file
  : %empty
  | file stmt                   { ast_block_add(&p->out->stmts, $2); }
  ;

stmt
  : NL                          { $$ = NULL; }
  | error NL                    { yyerrok; $$ = NULL; }
  | CAIRN expr NL               { $$ = ast_stmt_expr(ast_stmt_new(AST_HEADER, @1, @2), 0, $2); }
  | LET IDENT EQ expr NL        { $$ = ast_stmt_expr(ast_stmt_name(ast_stmt_new(AST_LET, @1, @4), @2), 0, $4); }
  | VARY IDENT FROM expr TO expr STEP expr NL
      { $$ = ast_stmt_expr(ast_stmt_expr(ast_stmt_expr(ast_stmt_name(ast_stmt_new(AST_VARY, @1, @8), @2),
                                                       0, $4), 1, $6), 2, $8); }
  | ATOMS unit_opt bopen atom_items RBRACE NL
      { $$ = ast_stmt_block(ast_stmt_variant(ast_stmt_new(AST_ATOMS, @1, @1), 0, $2), $3, $4, @5); }
  | CHARGE expr NL              { $$ = ast_stmt_expr(ast_stmt_new(AST_CHARGE, @1, @2), 0, $2); }
  | MULTIPLICITY expr NL        { $$ = ast_stmt_expr(ast_stmt_new(AST_MULTIPLICITY, @1, @2), 0, $2); }
  | BASIS BASISNAME NL          { $$ = ast_stmt_name(ast_stmt_new(AST_BASIS, @1, @2), @2); }
  | BASIS FILE_ STRING NL       { $$ = ast_stmt_name(ast_stmt_new(AST_BASIS_FILE, @1, @3), @3); }
  | INTEGRALS STRING NL         { $$ = ast_stmt_name(ast_stmt_new(AST_INTEGRALS, @1, @2), @2); }
  | ORBITALS bopen orb_items RBRACE NL
      { $$ = ast_stmt_block(ast_stmt_new(AST_ORBITALS, @1, @1), $2, $3, @4); }
  | ENCODING IDENT names NL     { $$ = ast_stmt_words(ast_stmt_name(ast_stmt_new(AST_ENCODING, @1, @2), @2), $3); }
  | REFERENCE IDENT NL          { $$ = ast_stmt_name(ast_stmt_new(AST_REFERENCE, @1, @2), @2); }
  | REFERENCE BITS BITSTR NL    { $$ = ast_stmt_name(ast_stmt_new(AST_REFERENCE_BITS, @1, @3), @3); }
  | KEEP IDENT EXACTLY NL
      { $$ = ast_stmt_variant(ast_stmt_name(ast_stmt_new(AST_KEEP, @1, @3), @2), IR_KEEP_EXACTLY, @3); }
  | KEEP IDENT PENALTY expr NL
      { $$ = ast_stmt_expr(ast_stmt_variant(ast_stmt_name(ast_stmt_new(AST_KEEP, @1, @4), @2),
                                            IR_KEEP_PENALTY, @3), 0, $4); }
  | KEEP IDENT CHECKED expr NL
      { $$ = ast_stmt_expr(ast_stmt_variant(ast_stmt_name(ast_stmt_new(AST_KEEP, @1, @4), @2),
                                            IR_KEEP_CHECKED, @3), 0, $4); }
  | POOL bopen pool_items RBRACE NL
      { $$ = ast_stmt_block(ast_stmt_new(AST_POOL, @1, @1), $2, $3, @4); }
  | CHOOSE expr BY GRADIENT NL
      { $$ = ast_stmt_expr(ast_stmt_variant(ast_stmt_new(AST_CHOOSE, @1, @4), IR_CHOOSE_COUNT, ast_join(@3, @4)), 0, $2); }
  | CHOOSE GRADIENT ABOVE expr NL
      { $$ = ast_stmt_expr(ast_stmt_variant(ast_stmt_new(AST_CHOOSE, @1, @4), IR_CHOOSE_ABOVE, ast_join(@2, @3)), 1, $4); }
  | CHOOSE ALL NL               { $$ = ast_stmt_variant(ast_stmt_new(AST_CHOOSE, @1, @2), IR_CHOOSE_ALL, @2); }
  | GROW TO expr UNTIL expr NL
      { $$ = ast_stmt_expr(ast_stmt_expr(ast_stmt_variant(ast_stmt_new(AST_CHOOSE, @1, @5), IR_CHOOSE_GROW, @1),
                                         0, $3), 1, $5); }
  | ORDER AS WRITTEN NL         { $$ = ast_stmt_variant(ast_stmt_new(AST_ORDER, @1, @3), IR_ORDER_WRITTEN, ast_join(@2, @3)); }
  | ORDER BY GRADIENT NL        { $$ = ast_stmt_variant(ast_stmt_new(AST_ORDER, @1, @3), IR_ORDER_GRADIENT, ast_join(@2, @3)); }
  | ORDER BY RANK NL            { $$ = ast_stmt_variant(ast_stmt_new(AST_ORDER, @1, @3), IR_ORDER_RANK, ast_join(@2, @3)); }
  | TROTTER expr NL             { $$ = ast_stmt_expr(ast_stmt_new(AST_TROTTER, @1, @2), 0, $2); }
  | OPTIMIZE IDENT settings NL  { $$ = ast_stmt_settings(ast_stmt_name(ast_stmt_new(AST_OPTIMIZE, @1, @2), @2), $3); }
  | EMIT IDENT STRING NL        { $$ = ast_stmt_word(ast_stmt_name(ast_stmt_new(AST_EMIT, @1, @3), @2), @3); }
  | USE STRING NL               { $$ = ast_stmt_name(ast_stmt_new(AST_USE, @1, @2), @2); }
  ;

/* `{` and its newline; without `{` the block is read anyway (the lexer
 * wrapper reports it). */
bopen
  : LBRACE NL                   { $$ = @1; }
  | LBRACE error NL             { yyerrok; $$ = @1; }
  | NL                          { $$ = DIAG_NOWHERE; }
  ;

unit_opt
  : %empty                      { $$ = DIAG_NOWHERE; }
  | UNIT                        { $$ = @1; }
  ;

atom_items
  : %empty                      { $$ = ast_block_new(); }
  | atom_items atom_item        { $$ = ast_block_add($1, $2); }
  ;

atom_item
  : NL                          { $$ = NULL; }
  | error NL                    { yyerrok; $$ = NULL; }
  | symbol expr expr expr NL
      { $$ = ast_stmt_expr(ast_stmt_expr(ast_stmt_expr(ast_stmt_name(ast_stmt_new(AST_ATOM, $1, $1), $1),
                                                       0, $2), 1, $3), 2, $4); }
  ;

/* Element symbols; `in` (indium) and `as` (arsenic) are also keywords. */
symbol
  : IDENT                       { $$ = @1; }
  | IN                          { $$ = @1; }
  | AS                          { $$ = @1; }
  ;

orb_items
  : %empty                      { $$ = ast_block_new(); }
  | orb_items orb_item          { $$ = ast_block_add($1, $2); }
  ;

orb_item
  : NL                          { $$ = NULL; }
  | error NL                    { yyerrok; $$ = NULL; }
  | FREEZE CORE NL              { $$ = ast_stmt_variant(ast_stmt_new(AST_FREEZE_CORE, @1, @2), 0, @2); }
  | FREEZE ranges NL            { $$ = ast_stmt_lists(ast_stmt_new(AST_FREEZE_LIST, @1, @1), $2, DIAG_NOWHERE, NULL); }
  | ACTIVE expr ELECTRONS IN expr ORBITALS NL
      { $$ = ast_stmt_expr(ast_stmt_expr(ast_stmt_new(AST_ACTIVE_COUNT, @1, @6), 0, $2), 1, $5); }
  | ACTIVE ORBITALS ranges NL
      { $$ = ast_stmt_lists(ast_stmt_variant(ast_stmt_new(AST_ACTIVE_LIST, @1, @2), 0, @2), $3, DIAG_NOWHERE, NULL); }
  ;

ranges
  : NUMBER                      { $$ = ast_ranges_add(ast_ranges_new(), @1, DIAG_NOWHERE, $1); }
  | NUMBER DOTDOT NUMBER        { $$ = ast_ranges_add(ast_ranges_new(), @1, @3, $1 || $3); }
  | ranges NUMBER               { $$ = ast_ranges_add($1, @2, DIAG_NOWHERE, $2); }
  | ranges NUMBER DOTDOT NUMBER { $$ = ast_ranges_add($1, @2, @4, $2 || $4); }
  ;

pool_items
  : %empty                      { $$ = ast_block_new(); }
  | pool_items pool_item        { $$ = ast_block_add($1, $2); }
  ;

pool_item
  : NL                          { $$ = NULL; }
  | error NL                    { yyerrok; $$ = NULL; }
  | IDENT names NL              { $$ = ast_stmt_words(ast_stmt_new(AST_RULE, @1, @1), ast_spans_prepend($2, @1)); }
  | WORD ptoks NL               { $$ = ast_stmt_words(ast_stmt_new(AST_PAULI, @1, @1), $2); }
  | EXCITE nums ARROW nums NL   { $$ = ast_stmt_lists(ast_stmt_new(AST_EXCITE, @1, @1), $2, @3, $4); }
  ;

names
  : %empty                      { $$ = ast_spans_new(); }
  | names IDENT                 { $$ = ast_spans_add($1, @2); }
  ;

ptoks
  : ptok                        { $$ = ast_spans_add(ast_spans_new(), $1); }
  | ptoks ptok                  { $$ = ast_spans_add($1, $2); }
  ;

ptok
  : IDENT                       { $$ = @1; }
  | NUMBER                      { $$ = @1; }
  ;

nums
  : NUMBER                      { $$ = ast_ranges_add(ast_ranges_new(), @1, DIAG_NOWHERE, $1); }
  | nums NUMBER                 { $$ = ast_ranges_add($1, @2, DIAG_NOWHERE, $2); }
  ;

settings
  : %empty                      { $$ = ast_block_new(); }
  | settings setting            { $$ = ast_block_add($1, $2); }
  ;

setting
  : IDENT expr                  { $$ = ast_stmt_expr(ast_stmt_name(ast_stmt_new(AST_SETTING, @1, @1), @1), 0, $2); }
  ;

expr
  : NUMBER                      { $$ = ast_num(D, @1, $1); }
  | IDENT                       { $$ = ast_name(@1); }
  | LPAREN expr RPAREN          { $$ = ast_paren(@1, $2, @3); }
  | FUNC LPAREN expr RPAREN     { $$ = ast_call(D, @1, $3, @4); }
  | expr PLUS expr              { $$ = ast_bin('+', $1, $3); }
  | expr MINUS expr             { $$ = ast_bin('-', $1, $3); }
  | expr STAR expr              { $$ = ast_bin('*', $1, $3); }
  | expr SLASH expr             { $$ = ast_bin('/', $1, $3); }
  | expr CARET expr             { $$ = ast_bin('^', $1, $3); }
  | SIGN expr                   { $$ = ast_sign(@1, (char)$1, $2); }
  | expr UNIT                   { $$ = ast_unit(D, $1, @2); }
  ;

%%

static void recipe_yyerror(diag_span *loc, struct front_parser *p, const char *msg) {
  front_parse_failure(p, *loc, msg);
}

/* Strip the quotes bison puts around token aliases. */
static const char *symbol_name(yysymbol_kind_t k, char *buf, size_t n) {
  const char *s = yysymbol_name(k);
  size_t len = strlen(s);
  if (len >= 2 && s[0] == '"' && s[len - 1] == '"') {
    snprintf(buf, n, "%.*s", (int)(len - 2), s + 1);
    return buf;
  }
  return s;
}

/* Hand the unexpected token and what would have been accepted to the driver,
 * which words the message. */
static int yyreport_syntax_error(const yypcontext_t *ctx, struct front_parser *p) {
  enum { MAXEXP = 80 };
  yysymbol_kind_t exp[MAXEXP];
  int n = yypcontext_expected_tokens(ctx, exp, MAXEXP);
  if (n < 0) n = 0;
  const char *names[MAXEXP];
  char bufs[MAXEXP][40];
  for (int i = 0; i < n; i++) names[i] = symbol_name(exp[i], bufs[i], sizeof bufs[i]);
  char lbuf[40];
  const char *la = symbol_name(yypcontext_token(ctx), lbuf, sizeof lbuf);
  front_syntax_error(p, *yypcontext_location(ctx), la, n, names);
  return 0;
}
