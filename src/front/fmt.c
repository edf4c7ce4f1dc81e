/* fmt.c — canonical layout of a recipe, from its AST and comments.
 *
 * The layout: one statement or block item per line, block items indented by
 * two spaces, single spaces between words, binary + and - spaced, * / ^ not,
 * atom tables aligned in columns (signs hang left of the digits), trailing
 * comments two spaces after the code, at most one blank line where the source
 * had any (none at the start of a block or before its `}`).  Numbers keep
 * their spelling when it is already canonical and no longer than the shortest
 * one; otherwise they are written by util_fmt_double (whole numbers as plain
 * digits).  No value changes.  Bit strings, strings and basis names are kept
 * as written.
 *
 * Idempotence follows from the construction: the output of every rule is a
 * fixed point of that rule, and comments and blank lines are placed by line
 * order, which formatting preserves.
 */
#include "config.h"

#include "cairn/front.h"
#include "front/ast.h"
#include "front/parse.h"
#include "cairn/util.h"

#include <ctype.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

typedef struct fmt_line {
  int line;        /* source line */
  int indent;      /* 0 or 1 */
  char *text;      /* the code (or the comment of a comment line) */
  int comment;     /* trailing comment index, -1 */
  int is_comment;  /* a comment on a line of its own */
  int opens;       /* ends with `{` */
  int closes;      /* is `}` */
  int table;       /* atom table id, -1 */
  char *cell[4];   /* atom lines: symbol and coordinates */
} fmt_line;

typedef struct fmt_ctx {
  diag_ctx *d;
  ast_file *a;
  fmt_line *v;
  size_t n, cap;
  int *comment_line;  /* source line of each comment */
  int *trailing;      /* 1 when code precedes the comment on its line */
  int *used;          /* comment already placed */
} fmt_ctx;

static int line_of(const fmt_ctx *f, diag_span s) {
  int line, col;
  diag_line_col(f->d, s.file, s.start, &line, &col);
  return line;
}

static fmt_line *add_line(fmt_ctx *f, int line, int indent, char *text) {
  UTIL_GROW(f->v, f->cap, f->n + 1);
  fmt_line *l = &f->v[f->n++];
  memset(l, 0, sizeof *l);
  l->line = line;
  l->indent = indent;
  l->text = text;
  l->comment = -1;
  l->table = -1;
  return l;
}

/* ---- numbers and expressions ------------------------------------------- */

/* 1 for spellings fmt writes itself: no sign, no leading zeros, no trailing
 * fraction zeros, lower-case `e`, no `+` and no leading zeros in the exponent. */
static int canonical_form(const char *t, size_t n) {
  size_t i = 0;
  if (i < n && t[i] == '0') i++;
  else if (i < n && t[i] >= '1' && t[i] <= '9')
    while (i < n && isdigit((unsigned char)t[i])) i++;
  else return 0;
  if (i < n && t[i] == '.') {
    i++;
    size_t s = i;
    while (i < n && isdigit((unsigned char)t[i])) i++;
    if (i == s || t[i - 1] == '0') return 0;
  }
  if (i < n && t[i] == 'e') {
    i++;
    if (i < n && t[i] == '-') i++;
    if (i >= n || t[i] < '1' || t[i] > '9') return 0;
    while (i < n && isdigit((unsigned char)t[i])) i++;
  }
  return i == n;
}

static void put_number(fmt_ctx *f, const ast_expr *e, util_buf *b) {
  size_t n;
  const char *t = ast_text(f->d, e->span, &n);
  char cand[40];
  double v = e->value;
  if (v == floor(v) && fabs(v) < 1e15) snprintf(cand, sizeof cand, "%.0f", v);
  else util_fmt_double(cand, v);
  char *raw = xstrndup(t, n);
  int keep = canonical_form(t, n) && strtod(raw, NULL) == v && n <= strlen(cand);
  free(raw);
  if (keep) util_buf_append(b, t, n);
  else util_buf_printf(b, "%s", cand);
}

static void put_span(fmt_ctx *f, diag_span s, util_buf *b) {
  size_t n;
  const char *t = ast_text(f->d, s, &n);
  util_buf_append(b, t, n);
}

static void put_expr(fmt_ctx *f, const ast_expr *e, util_buf *b) {
  switch (e->kind) {
  case AST_E_NUM: put_number(f, e, b); break;
  case AST_E_NAME: put_span(f, e->span, b); break;
  case AST_E_SIGN:
    util_buf_append(b, &e->op, 1);
    put_expr(f, e->a, b);
    break;
  case AST_E_BIN:
    put_expr(f, e->a, b);
    if (e->op == '+' || e->op == '-') util_buf_printf(b, " %c ", e->op);
    else util_buf_append(b, &e->op, 1);
    put_expr(f, e->b, b);
    break;
  case AST_E_CALL:
    util_buf_printf(b, "%s(", ast_func_name(e->func));
    put_expr(f, e->a, b);
    util_buf_append(b, ")", 1);
    break;
  case AST_E_UNIT:
    put_expr(f, e->a, b);
    util_buf_append(b, " ", 1);
    put_span(f, e->word, b);
    break;
  case AST_E_PAREN:
    util_buf_append(b, "(", 1);
    put_expr(f, e->a, b);
    util_buf_append(b, ")", 1);
    break;
  }
}

static char *expr_str(fmt_ctx *f, const ast_expr *e) {
  util_buf b = {0};
  util_buf_append(&b, "", 0);
  put_expr(f, e, &b);
  return b.s;
}

static void put_ranges(fmt_ctx *f, const ast_ranges *l, util_buf *b) {
  for (int i = 0; i < l->n; i++) {
    util_buf_append(b, " ", 1);
    put_span(f, l->v[i].lo, b);
    if (l->v[i].hi.file >= 0) {
      util_buf_append(b, "..", 2);
      put_span(f, l->v[i].hi, b);
    }
  }
}

static void put_words(fmt_ctx *f, const ast_spans *w, int from, util_buf *b) {
  for (int i = from; i < w->n; i++) {
    if (i > 0 || b->len > 0) util_buf_append(b, " ", 1);
    put_span(f, w->v[i], b);
  }
}

/* ---- statements --------------------------------------------------------- */

/* The one-line text of a statement or item (not blocks' items). */
static char *stmt_text(fmt_ctx *f, const ast_stmt *s) {
  util_buf b = {0};
  util_buf_append(&b, "", 0);
  char *x;
#define EXPR(k) (x = expr_str(f, s->e[k]), util_buf_printf(&b, "%s", x), free(x))
  switch (s->kind) {
  case AST_HEADER: util_buf_printf(&b, "cairn "); EXPR(0); break;
  case AST_LET:
    util_buf_printf(&b, "let ");
    put_span(f, s->name, &b);
    util_buf_printf(&b, " = ");
    EXPR(0);
    break;
  case AST_VARY:
    util_buf_printf(&b, "vary ");
    put_span(f, s->name, &b);
    util_buf_printf(&b, " from ");
    EXPR(0);
    util_buf_printf(&b, " to ");
    EXPR(1);
    util_buf_printf(&b, " step ");
    EXPR(2);
    break;
  case AST_ATOMS:
    util_buf_printf(&b, "atoms ");
    if (s->variant_span.file >= 0) {
      put_span(f, s->variant_span, &b);
      util_buf_printf(&b, " ");
    }
    util_buf_printf(&b, "{");
    break;
  case AST_CHARGE: util_buf_printf(&b, "charge "); EXPR(0); break;
  case AST_MULTIPLICITY: util_buf_printf(&b, "multiplicity "); EXPR(0); break;
  case AST_BASIS: util_buf_printf(&b, "basis "); put_span(f, s->name, &b); break;
  case AST_BASIS_FILE: util_buf_printf(&b, "basis file "); put_span(f, s->name, &b); break;
  case AST_INTEGRALS: util_buf_printf(&b, "integrals "); put_span(f, s->name, &b); break;
  case AST_ORBITALS: util_buf_printf(&b, "orbitals {"); break;
  case AST_ENCODING:
    util_buf_printf(&b, "encoding ");
    put_span(f, s->name, &b);
    put_words(f, &s->words, 0, &b);
    break;
  case AST_REFERENCE: util_buf_printf(&b, "reference "); put_span(f, s->name, &b); break;
  case AST_REFERENCE_BITS: util_buf_printf(&b, "reference bits "); put_span(f, s->name, &b); break;
  case AST_KEEP:
    util_buf_printf(&b, "keep ");
    put_span(f, s->name, &b);
    util_buf_printf(&b, " %s", ir_policy_name((ir_policy)s->variant));
    if (s->variant != IR_KEEP_EXACTLY) {
      util_buf_printf(&b, " ");
      EXPR(0);
    }
    break;
  case AST_POOL: util_buf_printf(&b, "pool {"); break;
  case AST_CHOOSE:
    switch (s->variant) {
    case IR_CHOOSE_COUNT: util_buf_printf(&b, "choose "); EXPR(0); util_buf_printf(&b, " by gradient"); break;
    case IR_CHOOSE_ABOVE: util_buf_printf(&b, "choose gradient above "); EXPR(1); break;
    case IR_CHOOSE_ALL: util_buf_printf(&b, "choose all"); break;
    default: util_buf_printf(&b, "grow to "); EXPR(0); util_buf_printf(&b, " until "); EXPR(1); break;
    }
    break;
  case AST_ORDER:
    util_buf_printf(&b, "%s", s->variant == IR_ORDER_WRITTEN    ? "order as written"
                              : s->variant == IR_ORDER_GRADIENT ? "order by gradient"
                                                                : "order by rank");
    break;
  case AST_TROTTER: util_buf_printf(&b, "trotter "); EXPR(0); break;
  case AST_OPTIMIZE:
    util_buf_printf(&b, "optimize ");
    put_span(f, s->name, &b);
    for (int i = 0; i < s->items.n; i++) {
      util_buf_printf(&b, " ");
      put_span(f, s->items.v[i]->name, &b);
      util_buf_printf(&b, " ");
      x = expr_str(f, s->items.v[i]->e[0]);
      util_buf_printf(&b, "%s", x);
      free(x);
    }
    break;
  case AST_EMIT:
    util_buf_printf(&b, "emit ");
    put_span(f, s->name, &b);
    util_buf_printf(&b, " ");
    put_span(f, s->word, &b);
    break;
  case AST_USE: util_buf_printf(&b, "use "); put_span(f, s->name, &b); break;
  case AST_FREEZE_CORE: util_buf_printf(&b, "freeze core"); break;
  case AST_FREEZE_LIST: util_buf_printf(&b, "freeze"); put_ranges(f, &s->list, &b); break;
  case AST_ACTIVE_COUNT:
    util_buf_printf(&b, "active ");
    EXPR(0);
    util_buf_printf(&b, " electrons in ");
    EXPR(1);
    util_buf_printf(&b, " orbitals");
    break;
  case AST_ACTIVE_LIST: util_buf_printf(&b, "active orbitals"); put_ranges(f, &s->list, &b); break;
  case AST_RULE: put_words(f, &s->words, 0, &b); break;
  case AST_PAULI: util_buf_printf(&b, "word"); put_words(f, &s->words, 0, &b); break;
  case AST_EXCITE:
    util_buf_printf(&b, "excite");
    put_ranges(f, &s->list, &b);
    util_buf_printf(&b, " ->");
    put_ranges(f, &s->list2, &b);
    break;
  case AST_ATOM:
  case AST_SETTING: break;
  }
#undef EXPR
  return b.s;
}

static void add_stmt(fmt_ctx *f, const ast_stmt *s, int *ntables) {
  fmt_line *l = add_line(f, line_of(f, s->kw), 0, stmt_text(f, s));
  if (s->kind != AST_ATOMS && s->kind != AST_ORBITALS && s->kind != AST_POOL) return;
  l->opens = 1;
  int table = (*ntables)++;
  for (int i = 0; i < s->items.n; i++) {
    const ast_stmt *it = s->items.v[i];
    fmt_line *il;
    if (it->kind == AST_ATOM) {
      il = add_line(f, line_of(f, it->kw), 1, NULL);
      il->table = table;
      il->cell[0] = ast_text_dup(f->d, it->name);
      for (int k = 0; k < 3; k++) il->cell[k + 1] = expr_str(f, it->e[k]);
    } else {
      add_line(f, line_of(f, it->kw), 1, stmt_text(f, it));
    }
  }
  fmt_line *cl = add_line(f, line_of(f, s->close), 0, xstrdup("}"));
  cl->closes = 1;
}

/* ---- comments ----------------------------------------------------------- */

static void classify_comments(fmt_ctx *f) {
  int n = f->a->ncomments;
  f->comment_line = xcalloc((size_t)n + 1, sizeof(int));
  f->trailing = xcalloc((size_t)n + 1, sizeof(int));
  f->used = xcalloc((size_t)n + 1, sizeof(int));
  size_t len;
  const char *text = diag_file_text(f->d, f->a->file, &len);
  for (int i = 0; i < n; i++) {
    diag_span s = f->a->comments[i];
    f->comment_line[i] = line_of(f, s);
    uint32_t p = s.start;
    while (p > 0 && text[p - 1] != '\n') {
      if (!isspace((unsigned char)text[p - 1])) f->trailing[i] = 1;
      p--;
    }
  }
}

static char *comment_text(fmt_ctx *f, int i) {
  size_t n;
  const char *t = ast_text(f->d, f->a->comments[i], &n);
  while (n > 0 && isspace((unsigned char)t[n - 1])) n--;
  return xstrndup(t, n);
}

static int cmp_line(const void *x, const void *y) {
  const fmt_line *a = x, *b = y;
  if (a->line != b->line) return a->line < b->line ? -1 : 1;
  return 0;
}

/* ---- layout -------------------------------------------------------------- */

/* Atom tables: column widths, with one column of room for signs when any
 * coordinate of the column starts with one. */
static void layout_tables(fmt_ctx *f) {
  for (size_t i = 0; i < f->n;) {
    if (f->v[i].table < 0) {
      i++;
      continue;
    }
    int t = f->v[i].table;
    size_t j = i;
    size_t w[4] = {0, 0, 0, 0};
    int sign[4] = {0, 0, 0, 0};
    int any_comment = 0;
    for (j = i; j < f->n && (f->v[j].table == t || f->v[j].is_comment); j++) {
      if (f->v[j].table != t) continue;
      for (int k = 1; k < 4; k++) sign[k] |= f->v[j].cell[k][0] == '-' || f->v[j].cell[k][0] == '+';
      any_comment |= f->v[j].comment >= 0;
    }
    for (size_t r = i; r < j; r++) {
      if (f->v[r].table != t) continue;
      for (int k = 0; k < 4; k++) {
        const char *c = f->v[r].cell[k];
        size_t len = strlen(c) + (sign[k] && c[0] != '-' && c[0] != '+');
        if (len > w[k]) w[k] = len;
      }
    }
    for (size_t r = i; r < j; r++) {
      fmt_line *l = &f->v[r];
      if (l->table != t) continue;
      util_buf b = {0};
      util_buf_append(&b, "", 0);
      for (int k = 0; k < 4; k++) {
        const char *c = l->cell[k];
        int pad = sign[k] && c[0] != '-' && c[0] != '+';
        size_t len = strlen(c) + (size_t)pad;
        util_buf_printf(&b, "%s%s%s", k ? "  " : "", pad ? " " : "", c);
        if (k < 3 || (any_comment && l->comment >= 0))
          for (size_t q = len; q < w[k]; q++) util_buf_append(&b, " ", 1);
      }
      l->text = b.s;
    }
    i = j;
  }
}

int front_fmt(diag_ctx *d, int32_t file, util_buf *out) {
  ast_file *a = front_parse(d, file);
  if (a->errors) {
    ast_file_free(a);
    return -1;
  }
  fmt_ctx f;
  memset(&f, 0, sizeof f);
  f.d = d;
  f.a = a;
  classify_comments(&f);
  int ntables = 0;
  for (int i = 0; i < a->stmts.n; i++) add_stmt(&f, a->stmts.v[i], &ntables);
  size_t ncode = f.n;

  /* trailing comments go with the code on their line; the others become lines */
  for (int c = 0; c < a->ncomments; c++) {
    if (!f.trailing[c]) continue;
    for (size_t i = 0; i < ncode; i++)
      if (f.v[i].line == f.comment_line[c]) {
        f.v[i].comment = c;
        f.used[c] = 1;
        break;
      }
  }
  for (int c = 0; c < a->ncomments; c++) {
    if (f.used[c]) continue;
    fmt_line *l = add_line(&f, f.comment_line[c], 0, comment_text(&f, c));
    l->is_comment = 1;
  }
  if (f.n > 1) qsort(f.v, f.n, sizeof *f.v, cmp_line);
  /* comments inside a block are indented with it */
  int depth = 0;
  for (size_t i = 0; i < f.n; i++) {
    if (f.v[i].closes) depth = 0;
    if (f.v[i].is_comment) f.v[i].indent = depth;
    if (f.v[i].opens) depth = 1;
  }
  layout_tables(&f);

  /* a blank line before line i? */
  char *blank = xcalloc(f.n + 1, 1);
  for (size_t i = 1; i < f.n; i++)
    blank[i] = f.v[i].line > f.v[i - 1].line + 1 && !f.v[i - 1].opens && !f.v[i].closes;
  /* trailing comments of neighbouring lines at one indentation line up */
  size_t *col = xcalloc(f.n + 1, sizeof *col);
  for (size_t i = 0; i < f.n;) {
    if (f.v[i].comment < 0) {
      i++;
      continue;
    }
    size_t j = i, w = 0;
    while (j < f.n && f.v[j].comment >= 0 && (j == i || (!blank[j] && f.v[j].indent == f.v[i].indent))) {
      size_t len = strlen(f.v[j].text) + 2 * (size_t)f.v[j].indent;
      if (len > w) w = len;
      j++;
    }
    for (size_t k = i; k < j; k++) col[k] = w;
    i = j;
  }
  util_buf b = {0};
  util_buf_append(&b, "", 0);
  for (size_t i = 0; i < f.n; i++) {
    fmt_line *l = &f.v[i];
    if (blank[i]) util_buf_append(&b, "\n", 1);
    size_t start = b.len;
    if (l->indent) util_buf_append(&b, "  ", 2);
    util_buf_printf(&b, "%s", l->text);
    if (l->comment >= 0) {
      while (b.len - start < col[i]) util_buf_append(&b, " ", 1);
      char *ct = comment_text(&f, l->comment);
      util_buf_printf(&b, "  %s", ct);
      free(ct);
    }
    util_buf_append(&b, "\n", 1);
  }
  free(blank);
  free(col);
  util_buf_append(out, b.s, b.len);
  util_buf_free(&b);
  for (size_t i = 0; i < f.n; i++) {
    free(f.v[i].text);
    for (int k = 0; k < 4; k++) free(f.v[i].cell[k]);
  }
  free(f.v);
  free(f.comment_line);
  free(f.trailing);
  free(f.used);
  ast_file_free(a);
  return 0;
}
