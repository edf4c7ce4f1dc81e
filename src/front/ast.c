/* ast.c — builders and destructors of the recipe AST (see ast.h). */
#include "config.h"

#include "front/ast.h"
#include "cairn/util.h"

#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

const char *ast_text(const diag_ctx *d, diag_span s, size_t *len) {
  size_t flen;
  const char *t = diag_file_text(d, s.file, &flen);
  if (s.file < 0 || s.start > flen || s.end < s.start) {
    *len = 0;
    return "";
  }
  uint32_t end = s.end > flen ? (uint32_t)flen : s.end;
  *len = end - s.start;
  return t + s.start;
}

int ast_text_is(const diag_ctx *d, diag_span s, const char *w) {
  size_t n;
  const char *t = ast_text(d, s, &n);
  return strlen(w) == n && memcmp(t, w, n) == 0;
}

char *ast_text_dup(const diag_ctx *d, diag_span s) {
  size_t n;
  const char *t = ast_text(d, s, &n);
  return xstrndup(t, n);
}

diag_span ast_join(diag_span a, diag_span b) {
  if (a.file < 0) return b;
  if (b.file < 0 || b.file != a.file) return a;
  diag_span r = a;
  if (b.start < r.start) r.start = b.start;
  if (b.end > r.end) r.end = b.end;
  return r;
}

/* ORDER FUNCS */
static const char *const func_names[AST_F_COUNT] = {"sin", "cos", "tan", "sqrt", "exp", "log"};

const char *ast_func_name(ast_func f) { return f >= 0 && f < AST_F_COUNT ? func_names[f] : "?"; }

int ast_func_lookup(const char *s, size_t len) {
  for (int i = 0; i < AST_F_COUNT; i++)
    if (strlen(func_names[i]) == len && memcmp(func_names[i], s, len) == 0) return i;
  return -1;
}

static ast_expr *expr_new(ast_expr_kind k, diag_span s) {
  ast_expr *e = xcalloc(1, sizeof *e);
  e->kind = k;
  e->span = s;
  e->word = DIAG_NOWHERE;
  return e;
}

/* A number literal: the value is read from the spelling; a spelling the scanner
 * already rejected (bad) or one out of range is marked bad so that resolve does
 * not report it a second time. */
ast_expr *ast_num(const diag_ctx *d, diag_span s, int bad) {
  ast_expr *e = expr_new(AST_E_NUM, s);
  e->bad = bad;
  if (!bad) {
    char *t = ast_text_dup(d, s);
    errno = 0;
    char *end;
    e->value = strtod(t, &end);
    if (*end || !isfinite(e->value)) e->bad = 1;
    free(t);
  }
  return e;
}

ast_expr *ast_name(diag_span s) { return expr_new(AST_E_NAME, s); }

ast_expr *ast_sign(diag_span op, char sign, ast_expr *a) {
  ast_expr *e = expr_new(AST_E_SIGN, ast_join(op, a->span));
  e->op = sign;
  e->a = a;
  return e;
}

ast_expr *ast_bin(char op, ast_expr *a, ast_expr *b) {
  ast_expr *e = expr_new(AST_E_BIN, ast_join(a->span, b->span));
  e->op = op;
  e->a = a;
  e->b = b;
  return e;
}

ast_expr *ast_call(const diag_ctx *d, diag_span fn, ast_expr *a, diag_span close) {
  ast_expr *e = expr_new(AST_E_CALL, ast_join(fn, close));
  size_t n;
  const char *t = ast_text(d, fn, &n);
  int f = ast_func_lookup(t, n);
  e->func = f < 0 ? AST_F_SIN : (ast_func)f;
  e->word = fn;
  e->a = a;
  return e;
}

ast_expr *ast_unit(const diag_ctx *d, ast_expr *a, diag_span unit) {
  ast_expr *e = expr_new(AST_E_UNIT, ast_join(a->span, unit));
  e->word = unit;
  if (ast_text_is(d, unit, "angstrom")) e->unit = IR_UNIT_ANGSTROM;
  else if (ast_text_is(d, unit, "bohr")) e->unit = IR_UNIT_BOHR;
  else if (ast_text_is(d, unit, "deg")) e->unit = IR_UNIT_DEGREE;
  else e->unit = IR_UNIT_RADIAN;
  e->a = a;
  return e;
}

ast_expr *ast_paren(diag_span open, ast_expr *a, diag_span close) {
  ast_expr *e = expr_new(AST_E_PAREN, ast_join(open, close));
  e->a = a;
  return e;
}

void ast_expr_free(ast_expr *e) {
  if (!e) return;
  ast_expr_free(e->a);
  ast_expr_free(e->b);
  free(e);
}

ast_stmt *ast_stmt_new(ast_kind kind, diag_span kw, diag_span end) {
  ast_stmt *s = xcalloc(1, sizeof *s);
  s->kind = kind;
  s->kw = kw;
  s->span = ast_join(kw, end);
  s->name = s->word = s->variant_span = s->arrow = s->open = s->close = DIAG_NOWHERE;
  return s;
}

ast_stmt *ast_stmt_name(ast_stmt *s, diag_span name) {
  s->name = name;
  s->span = ast_join(s->span, name);
  return s;
}

ast_stmt *ast_stmt_expr(ast_stmt *s, int slot, ast_expr *e) {
  ast_expr_free(s->e[slot]);
  s->e[slot] = e;
  if (e) s->span = ast_join(s->span, e->span);
  return s;
}

ast_stmt *ast_stmt_variant(ast_stmt *s, int variant, diag_span where) {
  s->variant = variant;
  s->variant_span = where;
  s->span = ast_join(s->span, where);
  return s;
}

ast_stmt *ast_stmt_word(ast_stmt *s, diag_span word) {
  s->word = word;
  s->span = ast_join(s->span, word);
  return s;
}

ast_stmt *ast_stmt_words(ast_stmt *s, ast_spans *words) {
  if (words) {
    free(s->words.v);
    s->words = *words;
    free(words);
    for (int i = 0; i < s->words.n; i++) s->span = ast_join(s->span, s->words.v[i]);
  }
  return s;
}

static void ranges_extend(ast_stmt *s, const ast_ranges *l) {
  for (int i = 0; i < l->n; i++) {
    s->span = ast_join(s->span, l->v[i].lo);
    if (l->v[i].hi.file >= 0) s->span = ast_join(s->span, l->v[i].hi);
  }
}

ast_stmt *ast_stmt_lists(ast_stmt *s, ast_ranges *list, diag_span arrow, ast_ranges *list2) {
  if (list) {
    s->list = *list;
    free(list);
    ranges_extend(s, &s->list);
  }
  s->arrow = arrow;
  if (list2) {
    s->list2 = *list2;
    free(list2);
    ranges_extend(s, &s->list2);
  }
  return s;
}

ast_stmt *ast_stmt_block(ast_stmt *s, diag_span open, ast_block *items, diag_span close) {
  s->open = open;
  s->close = close;
  if (open.file >= 0) s->span = ast_join(s->span, open);
  if (items) ast_block_move(&s->items, items);
  return s;
}

ast_stmt *ast_stmt_settings(ast_stmt *s, ast_block *settings) {
  if (settings) {
    ast_block_move(&s->items, settings);
    for (int i = 0; i < s->items.n; i++) s->span = ast_join(s->span, s->items.v[i]->span);
  }
  return s;
}

static void block_clear(ast_block *b) {
  for (int i = 0; i < b->n; i++) ast_stmt_free(b->v[i]);
  free(b->v);
  b->v = NULL;
  b->n = 0;
  b->cap = 0;
}

void ast_stmt_free(ast_stmt *s) {
  if (!s) return;
  for (int i = 0; i < 3; i++) ast_expr_free(s->e[i]);
  free(s->words.v);
  free(s->list.v);
  free(s->list2.v);
  block_clear(&s->items);
  free(s);
}

ast_spans *ast_spans_new(void) { return xcalloc(1, sizeof(ast_spans)); }

ast_spans *ast_spans_add(ast_spans *l, diag_span s) {
  UTIL_GROW(l->v, l->cap, (size_t)l->n + 1);
  l->v[l->n++] = s;
  return l;
}

ast_spans *ast_spans_prepend(ast_spans *l, diag_span s) {
  UTIL_GROW(l->v, l->cap, (size_t)l->n + 1);
  memmove(l->v + 1, l->v, sizeof *l->v * (size_t)l->n);
  l->v[0] = s;
  l->n++;
  return l;
}

void ast_spans_free(ast_spans *l) {
  if (!l) return;
  free(l->v);
  free(l);
}

ast_ranges *ast_ranges_new(void) { return xcalloc(1, sizeof(ast_ranges)); }

ast_ranges *ast_ranges_add(ast_ranges *l, diag_span lo, diag_span hi, int bad) {
  UTIL_GROW(l->v, l->cap, (size_t)l->n + 1);
  l->v[l->n].lo = lo;
  l->v[l->n].hi = hi;
  l->v[l->n].bad = bad;
  l->n++;
  return l;
}

void ast_ranges_free(ast_ranges *l) {
  if (!l) return;
  free(l->v);
  free(l);
}

ast_block *ast_block_new(void) { return xcalloc(1, sizeof(ast_block)); }

ast_block *ast_block_add(ast_block *b, ast_stmt *s) {
  if (!s) return b;
  UTIL_GROW(b->v, b->cap, (size_t)b->n + 1);
  b->v[b->n++] = s;
  return b;
}

void ast_block_free(ast_block *b) {
  if (!b) return;
  block_clear(b);
  free(b);
}

void ast_block_move(ast_block *dst, ast_block *src) {
  block_clear(dst);
  *dst = *src;
  free(src);
}

void ast_file_free(ast_file *f) {
  if (!f) return;
  block_clear(&f->stmts);
  free(f->comments);
  free(f);
}
