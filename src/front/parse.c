/* parse.c — the parse driver: keywords, the lexer wrapper that keeps blocks
 * from swallowing the rest of a file, and the wording of syntax errors. */
#include "config.h"

#include "front/parse.h"
#include "front/suggest.h"
#include "cairn/util.h"

#include "recipe.tab.h"
#define YYSTYPE RECIPE_YYSTYPE
#define YYLTYPE diag_span
#include "recipe.lex.h"

#include <stdarg.h>
#include <stdlib.h>
#include <string.h>

typedef struct keyword {
  const char *word;
  int kind;
} keyword;

/* ORDER KEYWORDS: the %token list of grammar/recipe.y.  Units and functions
 * are keywords too, so that `0 r` and `r (1)` stay two coordinates. */
static const keyword keywords[] = {
    {"cairn", CAIRN},         {"let", LET},
    {"vary", VARY},           {"from", FROM},
    {"to", TO},               {"step", STEP},
    {"atoms", ATOMS},         {"charge", CHARGE},
    {"multiplicity", MULTIPLICITY}, {"basis", BASIS},
    {"integrals", INTEGRALS}, {"orbitals", ORBITALS},
    {"freeze", FREEZE},       {"core", CORE},
    {"active", ACTIVE},       {"electrons", ELECTRONS},
    {"in", IN},               {"encoding", ENCODING},
    {"reference", REFERENCE}, {"bits", BITS},
    {"keep", KEEP},           {"exactly", EXACTLY},
    {"penalty", PENALTY},     {"checked", CHECKED},
    {"pool", POOL},           {"word", WORD},
    {"excite", EXCITE},       {"choose", CHOOSE},
    {"by", BY},               {"gradient", GRADIENT},
    {"above", ABOVE},         {"all", ALL},
    {"grow", GROW},           {"until", UNTIL},
    {"order", ORDER},         {"as", AS},
    {"written", WRITTEN},     {"rank", RANK},
    {"trotter", TROTTER},     {"optimize", OPTIMIZE},
    {"emit", EMIT},           {"use", USE},
    {"angstrom", UNIT},       {"bohr", UNIT},
    {"deg", UNIT},            {"rad", UNIT},
    {"sin", FUNC},            {"cos", FUNC},
    {"tan", FUNC},            {"sqrt", FUNC},
    {"exp", FUNC},            {"log", FUNC},
};
enum { NKEYWORDS = (int)(sizeof keywords / sizeof keywords[0]) };

/* The words that begin a statement, for messages and suggestions. */
static const char *const statement_words[] = {
    "cairn",     "let",  "vary",   "atoms", "charge", "multiplicity", "basis",
    "integrals", "orbitals", "encoding", "reference", "keep", "pool", "choose",
    "grow",      "order", "trotter", "optimize", "emit", "use"};
enum { NSTATEMENT_WORDS = (int)(sizeof statement_words / sizeof statement_words[0]) };

int front_keyword(const char *s, size_t len) {
  for (int i = 0; i < NKEYWORDS; i++)
    if (strlen(keywords[i].word) == len && memcmp(keywords[i].word, s, len) == 0) return keywords[i].kind;
  return 0;
}

static int is_statement_kind(int k) {
  switch (k) {
  case CAIRN: case LET: case VARY: case ATOMS: case CHARGE: case MULTIPLICITY: case BASIS:
  case INTEGRALS: case ORBITALS: case ENCODING: case REFERENCE: case KEEP: case POOL:
  case CHOOSE: case GROW: case ORDER: case TROTTER: case OPTIMIZE: case EMIT: case USE:
    return 1;
  default:
    return 0;
  }
}

static void front_missing_open(front_parser *p, diag_span at);

static int is_block_kind(int k) { return k == ATOMS || k == POOL || k == ORBITALS; }

static int line_of(const front_parser *p, diag_span s) {
  int line, col;
  diag_line_col(p->d, s.file, s.start, &line, &col);
  return line;
}

/* One message per line: later errors on a line that already has one are
 * almost always consequences of the first. */
static int claim_line(front_parser *p, diag_span s) {
  int line = line_of(p, s);
  if (line == p->last_error_line) return 0;
  p->last_error_line = line;
  return 1;
}

static void count_error(front_parser *p) { p->out->errors++; }

void front_comment(front_parser *p, diag_span s) {
  ast_file *f = p->out;
  UTIL_GROW(f->comments, f->capcomments, (size_t)f->ncomments + 1);
  f->comments[f->ncomments++] = s;
}

void front_lex_error(front_parser *p, diag_span s, const char *help, const char *fmt, ...) {
  if (!claim_line(p, s)) return;
  count_error(p);
  va_list ap;
  va_start(ap, fmt);
  diag_vreport(p->d, DIAG_ERROR, s, fmt, ap);
  va_end(ap);
  if (help) diag_help(p->d, "%s", help);
}

void front_bad_number(front_parser *p, diag_span s, const char *text, size_t len) {
  static const char *const units[] = {"angstrom", "bohr", "deg", "rad"};
  const char *help = NULL;
  for (int i = 0; i < 4; i++) {
    size_t n = strlen(units[i]);
    if (len > n && memcmp(text + len - n, units[i], n) == 0) help = "put a space between a number and its unit: `0.96 angstrom`, `104.5 deg`";
  }
  if (!help && memchr(text, '.', len) && strstr(text, "..") == NULL)
    help = "a number has at most one decimal point, like `0.96` or `1.5e-3`";
  front_lex_error(p, s, help, "bad number `%.*s`", (int)len, text);
}

/* Queue a token for the wrapper to return before scanning further. */
static void push(front_parser *p, int kind, diag_span loc) {
  p->queue[p->nqueue].kind = kind;
  p->queue[p->nqueue].loc = loc;
  p->queue[p->nqueue].flag = 0;
  p->nqueue++;
}

static const char *block_name(int k) {
  return k == ATOMS ? "atoms" : k == POOL ? "pool" : "orbitals";
}

/* The lexer the parser calls.  Besides passing tokens through it keeps track
 * of blocks: when a line inside a block begins with a statement keyword (or
 * the file ends), the block's `}` is missing; the wrapper reports that once
 * and supplies `}` and a newline, so the rest of the file parses as written.
 * A `}` after an item on the same line gets a newline before it. */
int recipe_yylex(RECIPE_YYSTYPE *lval, diag_span *lloc, front_parser *p) {
  if (p->qhead < p->nqueue) {
    front_tok *t = &p->queue[p->qhead++];
    if (p->qhead == p->nqueue) p->qhead = p->nqueue = 0;
    *lloc = t->loc;
    lval->flag = t->flag;
    p->line_start = t->kind == NL;
    if (t->kind == RBRACE) p->in_block = 0, p->block_kw = 0;
    return t->kind;
  }
  RECIPE_YYSTYPE v;
  memset(&v, 0, sizeof v);
  diag_span loc;
  int k = recipe_lxlex(&v, &loc, p->scanner);
  *lval = v;
  *lloc = loc;

  if (p->in_block && ((p->line_start && is_statement_kind(k)) || k == 0)) {
    diag_span at = {loc.file, loc.start, loc.start};
    if (!p->block_noopen) {
      if (claim_line(p, k == 0 ? p->block_open : loc)) {
        count_error(p);
        if (k == 0)
          diag_report(p->d, DIAG_ERROR, p->block_open, "this `%s` block is never closed", block_name(p->block_kw));
        else {
          diag_report(p->d, DIAG_ERROR, loc, "expected `}` to close the `%s` block before this statement",
                      block_name(p->block_kw));
          diag_note(p->d, p->block_open, "the block opens here");
        }
        diag_help(p->d, "end the block with `}` on a line of its own");
      }
    }
    p->in_block = 0;
    p->block_kw = 0;
    push(p, NL, at);
    push(p, k, loc);
    p->queue[1].flag = v.flag;
    p->qhead = 0;
    lval->flag = 0;
    *lloc = at;
    p->line_start = 0;
    return RBRACE;
  }
  if (k == RBRACE && p->in_block && !p->line_start) {
    if (claim_line(p, loc)) {
      count_error(p);
      diag_report(p->d, DIAG_ERROR, loc, "`}` must be on a line of its own");
      diag_help(p->d, "a block holds one item per line; move `}` to the next line");
    }
    diag_span at = {loc.file, loc.start, loc.start};
    push(p, RBRACE, loc);
    *lloc = at;
    p->line_start = 1;
    return NL;
  }

  if (p->line_start && is_block_kind(k) && !p->in_block) {
    p->block_kw = k;
    p->block_kw_span = loc;
    p->line_has_open = 0;
  }
  if (k == LBRACE && !p->in_block && p->block_kw) {
    p->in_block = 1;
    p->block_noopen = 0;
    p->block_open = loc;
    p->line_has_open = 1;
  } else if (k == RBRACE && p->in_block) {
    p->in_block = 0;
    p->block_kw = 0;
  } else if (k == NL && p->block_kw && !p->in_block && !p->line_has_open) {
    /* the grammar reads a block without `{`: say so once */
    front_missing_open(p, loc);
    p->in_block = 1;
    p->block_noopen = 1;
    p->block_open = p->block_kw_span;
  }
  if (k == NL) {
    p->line_has_open = 0;
    if (!p->in_block) p->block_kw = 0;
  }
  p->line_start = k == NL;
  return k;
}

static void front_missing_open(front_parser *p, diag_span at) {
  if (!claim_line(p, at)) return;
  count_error(p);
  const char *what = p->block_kw ? block_name(p->block_kw) : "block";
  diag_report(p->d, DIAG_ERROR, at, "expected `{` after `%s`", what);
  diag_help(p->d, "a block opens with `{` at the end of its first line: `%s {`", what);
}

void front_parse_failure(front_parser *p, diag_span at, const char *msg) {
  count_error(p);
  diag_report(p->d, DIAG_ERROR, at, "cannot read the recipe: %s", msg);
  diag_help(p->d, "expressions this deep are not supported; split them with `let`");
}

static int has(int n, const char *const *names, const char *w) {
  for (int i = 0; i < n; i++)
    if (strcmp(names[i], w) == 0) return 1;
  return 0;
}

/* How to call the token at `at` in a message. */
static void describe(front_parser *p, diag_span at, const char *name, util_buf *b) {
  size_t len;
  const char *t = ast_text(p->d, at, &len);
  if (strcmp(name, "end of line") == 0 && len == 0) util_buf_printf(b, "end of file");
  else if (strcmp(name, "end of line") == 0 || strcmp(name, "end of file") == 0) util_buf_printf(b, "%s", name);
  else if (strcmp(name, "number") == 0) util_buf_printf(b, "number `%.*s`", (int)len, t);
  else if (strcmp(name, "string") == 0) util_buf_printf(b, "string %.*s", (int)(len > 40 ? 40 : len), t);
  else if (len > 0 && len <= 40) util_buf_printf(b, "`%.*s`", (int)len, t);
  else util_buf_printf(b, "%s", name);
}

void front_syntax_error(front_parser *p, diag_span at, const char *unexpected, int nexpected,
                        const char *const *expected) {
  if (!claim_line(p, at)) return;
  count_error(p);
  util_buf what = {0};
  describe(p, at, unexpected, &what);
  size_t len;
  const char *text = ast_text(p->d, at, &len);
  int is_name = strcmp(unexpected, "name") == 0;

  /* A statement was expected. */
  if (has(nexpected, expected, "`let`")) {
    if (is_name) {
      diag_report(p->d, DIAG_ERROR, at, "unknown statement `%.*s`", (int)len, text);
      const char *s = front_suggest(text, len, statement_words, NSTATEMENT_WORDS);
      if (s) diag_help(p->d, "did you mean `%s`?", s);
      else
        diag_help(p->d, "a statement starts with a keyword: let, vary, atoms, basis, orbitals, encoding, "
                        "reference, keep, pool, choose, order, optimize, emit, use, ...");
    } else if (strcmp(unexpected, "`}`") == 0) {
      diag_report(p->d, DIAG_ERROR, at, "unexpected `}`: no block is open here");
    } else {
      diag_report(p->d, DIAG_ERROR, at, "unexpected %s; expected a statement", what.s);
    }
    util_buf_free(&what);
    return;
  }

  /* Collapse the expected tokens into phrases. */
  util_buf list = {0};
  const char *items[90];
  int nitems = 0;
  int value = has(nexpected, expected, "number") && has(nexpected, expected, "sign");
  int in_block = has(nexpected, expected, "`}`");
  if (value) items[nitems++] = "a value";
  for (int i = 0; i < nexpected && nitems < 88; i++) {
    const char *e = expected[i];
    if (value && (!strcmp(e, "number") || !strcmp(e, "name") || !strcmp(e, "sign") || !strcmp(e, "`(`") ||
                  !strcmp(e, "function")))
      continue;
    if (!strcmp(e, "error")) continue;
    if (in_block && !strcmp(e, "end of line")) continue; /* a blank line: not worth saying */
    if (!strcmp(e, "name")) e = "a name";
    else if (!strcmp(e, "number")) e = "a number";
    else if (!strcmp(e, "string")) e = "a string";
    else if (!strcmp(e, "unit") && nexpected > 1) continue; /* an optional suffix */
    else if (!strcmp(e, "unit")) e = "a unit";
    else if (!strcmp(e, "bit string")) e = "a bit string";
    else if (!strcmp(e, "basis set name")) e = "a basis set name";
    else if (!strcmp(e, "`+`") || !strcmp(e, "`-`") || !strcmp(e, "`*`") || !strcmp(e, "`/`") ||
             !strcmp(e, "`^`"))
      continue; /* operators: never the point of the message */
    items[nitems++] = e;
  }
  for (int i = 0; i < nitems; i++) {
    if (i > 0) util_buf_printf(&list, i == nitems - 1 ? " or " : ", ");
    util_buf_printf(&list, "%s", items[i]);
  }
  if (nitems > 0) diag_report(p->d, DIAG_ERROR, at, "unexpected %s; expected %s", what.s, list.s);
  else diag_report(p->d, DIAG_ERROR, at, "unexpected %s", what.s);

  /* Hints for the common cases. */
  if (is_name) {
    const char *kw[90];
    int nkw = 0;
    char words[90][32];
    for (int i = 0; i < nexpected && nkw < 88; i++) {
      size_t l = strlen(expected[i]);
      if (l > 2 && l < 32 && expected[i][0] == '`' && expected[i][l - 1] == '`') {
        memcpy(words[nkw], expected[i] + 1, l - 2);
        words[nkw][l - 2] = 0;
        kw[nkw] = words[nkw];
        nkw++;
      }
    }
    const char *s = front_suggest(text, len, kw, nkw);
    if (s) diag_help(p->d, "did you mean `%s`?", s);
  }
  if (strcmp(unexpected, "sign") == 0 && has(nexpected, expected, "end of line"))
    diag_help(p->d, "after a space, a sign that touches what follows starts a new value (`0 -1` is two "
                    "numbers); to subtract, put spaces on both sides: `a - 1`");
  else if (p->in_block && p->block_kw == ATOMS && (value || has(nexpected, expected, "end of line")))
    diag_help(p->d, "an atom line is an element symbol and three coordinates: `H  0  0  0.74`");
  util_buf_free(&what);
  util_buf_free(&list);
}

static void parser_init(front_parser *p, diag_ctx *d, int32_t file) {
  memset(p, 0, sizeof *p);
  p->d = d;
  p->file = file;
  p->text = diag_file_text(d, file, &p->len);
  p->out = xcalloc(1, sizeof *p->out);
  p->out->file = file;
  p->line_start = 1;
  p->last_error_line = -1;
}

/* A parser over the registered text `file` with its reentrant scanner
 * (recipe_lxlex_destroy(p->scanner) when done). */
static void parser_open(front_parser *p, diag_ctx *d, int32_t file) {
  parser_init(p, d, file);
  yyscan_t scanner;
  recipe_lxlex_init_extra(p, &scanner);
  p->scanner = scanner;
  recipe_lx_scan_bytes(p->text, (int)p->len, scanner);
}

int front_tokens(diag_ctx *d, int32_t file, front_tok *out, int max) {
  front_parser p;
  parser_open(&p, d, file);
  yyscan_t scanner = p.scanner;
  int n = 0;
  for (;;) {
    RECIPE_YYSTYPE v;
    memset(&v, 0, sizeof v);
    diag_span loc;
    int k = recipe_yylex(&v, &loc, &p);
    if (n < max) out[n] = (front_tok){k, loc, v.flag};
    n++;
    if (k == 0) break;
  }
  recipe_lxlex_destroy(scanner);
  ast_file_free(p.out);
  return n;
}

ast_file *front_parse(diag_ctx *d, int32_t file) {
  front_parser p;
  parser_open(&p, d, file);
  recipe_yyparse(&p);
  recipe_lxlex_destroy(p.scanner);
  return p.out;
}
