/* eval.c — expressions: names, arithmetic, functions, units and dimensions.
 *
 * Values carry a dimension (bare, length, angle) and are computed in bohr and
 * radians.  The rules are few and strict so that a unit mistake is an error at
 * its span instead of a wrong geometry: + and - need equal dimensions, * and /
 * combine a dimension with a bare number (or divide equal ones), ^ and
 * sqrt/exp/log take bare numbers, sin/cos/tan an angle or a bare number
 * (radians), and a unit word applies to a bare number.
 */
#include "config.h"

#include "front/resolve.h"
#include "front/suggest.h"
#include "cairn/util.h"

#include <math.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>

const char *front_dim_name(rs_dim d) {
  switch (d) {
  case RS_BARE: return "a bare number";
  case RS_LENGTH: return "a length";
  case RS_ANGLE: return "an angle";
  }
  return "?";
}

/* An error inside an expression; at a scan point, say which. */
static void eval_error(rs *c, diag_span at, const char *help, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));
static void eval_error(rs *c, diag_span at, const char *help, const char *fmt, ...) {
  va_list ap;
  va_start(ap, fmt);
  diag_vreport(c->d, DIAG_ERROR, at, fmt, ap);
  va_end(ap);
  if (c->point >= 0 && c->varied) {
    char b[32];
    char *name = ast_text_dup(c->d, c->varied->name);
    const char *u = ir_unit_name(c->vary_unit);
    diag_note(c->d, c->r->scan.span, "at the scan point %s = %s%s%s", name, util_fmt_double(b, c->point_param),
              *u ? " " : "", u);
    free(name);
  }
  if (help) diag_help(c->d, "%s", help);
}

rs_name *front_lookup(rs *c, diag_span name, int report) {
  size_t len;
  const char *t = ast_text(c->d, name, &len);
  rs_name *later = NULL;
  for (int i = 0; i < c->nnames; i++) {
    size_t l2;
    const char *t2 = ast_text(c->d, c->names[i].name, &l2);
    if (l2 != len || memcmp(t, t2, len) != 0) continue;
    if (c->names[i].order < c->cur) return &c->names[i];
    later = &c->names[i];
  }
  if (!report) return NULL;
  if (later) {
    diag_report(c->d, DIAG_ERROR, name, "`%.*s` is used before it is defined", (int)len, t);
    diag_note(c->d, later->def->span, "`%.*s` is defined here", (int)len, t);
    diag_help(c->d, "move the definition above its first use");
    return NULL;
  }
  diag_report(c->d, DIAG_ERROR, name, "undefined name `%.*s`", (int)len, t);
  const char **words = xmalloc(sizeof *words * (size_t)(c->nnames + 1));
  char **owned = xmalloc(sizeof *owned * (size_t)(c->nnames + 1));
  int n = 0;
  for (int i = 0; i < c->nnames; i++)
    if (c->names[i].order < c->cur) owned[n] = ast_text_dup(c->d, c->names[i].name), words[n] = owned[n], n++;
  const char *s = front_suggest(t, len, words, n);
  if (s) diag_help(c->d, "did you mean `%s`?", s);
  else if (memchr(t, '-', len))
    diag_help(c->d, "names may contain `-`; to subtract, put spaces around it: `%.*s - %s`",
              (int)((const char *)memchr(t, '-', len) - t), t, (const char *)memchr(t, '-', len) + 1);
  else diag_help(c->d, "define it first: `let %.*s = ...`", (int)len, t);
  for (int i = 0; i < n; i++) free(owned[i]);
  free(owned);
  free(words);
  return NULL;
}

/* The value of a name at the current point (definition values when point < 0). */
static int name_value(rs *c, const ast_expr *e, rs_val *out) {
  rs_name *n = front_lookup(c, e->span, 1);
  if (!n) return -1;
  if (n->state == 3) return -1;
  if (n->is_vary && c->point >= 0) {
    *out = (rs_val){c->point_value, c->vary_dim, c->vary_unit, 1, e->span};
    return 0;
  }
  if (n->is_vary && n->def->kind == AST_VARY) {
    if (!c->vary_ok) return -1;
    *out = (rs_val){c->vary_from, c->vary_dim, c->vary_unit, 1, e->span};
    return 0;
  }
  if (n->state != 2) return -1;
  if (c->point >= 0 && n->val.varies) {
    /* a let that depends on the scan: recompute at this point (cached) */
    if (n->cache_point != c->point) {
      int save = c->cur;
      c->cur = n->order;
      rs_val v;
      int rc = front_eval(c, n->def->e[0], &v);
      c->cur = save;
      if (rc != 0) return -1;
      n->cache = v;
      n->cache_point = c->point;
    }
    *out = n->cache;
  } else {
    *out = n->val;
  }
  if (out->varies || n->is_vary) {
    out->varies = 1;
    out->vspan = e->span;
  }
  return 0;
}

static int finite_or_report(rs *c, const ast_expr *e, rs_val *v) {
  if (isfinite(v->v)) return 0;
  eval_error(c, e->span, NULL, "this value is not a finite number");
  return -1;
}

static int eval_bin(rs *c, const ast_expr *e, rs_val *out) {
  rs_val a, b;
  int ra = front_eval(c, e->a, &a);
  int rb = front_eval(c, e->b, &b);
  if (ra || rb) return -1;
  rs_val v = {0, RS_BARE, IR_UNIT_NONE, a.varies || b.varies, a.varies ? a.vspan : b.vspan};
  switch (e->op) {
  case '+':
  case '-':
    if (a.dim != b.dim) {
      const char *help = NULL;
      if (a.dim == RS_BARE || b.dim == RS_BARE)
        help = a.dim == RS_LENGTH || b.dim == RS_LENGTH ? "give the bare number a unit, like `0.5 angstrom`"
                                                        : "give the bare number a unit, like `10 deg`";
      eval_error(c, e->span, help, "cannot %s %s and %s", e->op == '+' ? "add" : "subtract",
                 front_dim_name(a.dim), front_dim_name(b.dim));
      return -1;
    }
    v.v = e->op == '+' ? a.v + b.v : a.v - b.v;
    v.dim = a.dim;
    v.unit = a.unit != IR_UNIT_NONE ? a.unit : b.unit;
    break;
  case '*':
    if (a.dim != RS_BARE && b.dim != RS_BARE) {
      eval_error(c, e->span, "cairn computes lengths, angles and bare numbers only",
                 "cannot multiply %s by %s", front_dim_name(a.dim), front_dim_name(b.dim));
      return -1;
    }
    v.v = a.v * b.v;
    v.dim = a.dim != RS_BARE ? a.dim : b.dim;
    v.unit = a.dim != RS_BARE ? a.unit : b.unit;
    break;
  case '/':
    if (b.dim != RS_BARE && b.dim != a.dim) {
      eval_error(c, e->span, "cairn computes lengths, angles and bare numbers only",
                 "cannot divide %s by %s", front_dim_name(a.dim), front_dim_name(b.dim));
      return -1;
    }
    if (b.v == 0) {
      eval_error(c, e->b->span, NULL, "division by zero");
      return -1;
    }
    v.v = a.v / b.v;
    v.dim = b.dim == RS_BARE ? a.dim : RS_BARE;
    v.unit = b.dim == RS_BARE ? a.unit : IR_UNIT_NONE;
    break;
  default: /* '^' */
    if (a.dim != RS_BARE || b.dim != RS_BARE) {
      eval_error(c, e->span, NULL, "a power takes bare numbers, not %s",
                 front_dim_name(a.dim != RS_BARE ? a.dim : b.dim));
      return -1;
    }
    v.v = pow(a.v, b.v);
    break;
  }
  *out = v;
  return finite_or_report(c, e, out);
}

static int eval_call(rs *c, const ast_expr *e, rs_val *out) {
  rs_val a;
  if (front_eval(c, e->a, &a)) return -1;
  const char *fn = ast_func_name(e->func);
  rs_val v = {0, RS_BARE, IR_UNIT_NONE, a.varies, a.vspan};
  switch (e->func) {
  case AST_F_SIN:
  case AST_F_COS:
  case AST_F_TAN:
    if (a.dim == RS_LENGTH) {
      eval_error(c, e->a->span, "write the angle with a unit (`52.25 deg`) or as a bare number of radians",
                 "`%s` takes an angle, not a length", fn);
      return -1;
    }
    v.v = e->func == AST_F_SIN ? sin(a.v) : e->func == AST_F_COS ? cos(a.v) : tan(a.v);
    break;
  default:
    if (a.dim != RS_BARE) {
      eval_error(c, e->a->span, NULL, "`%s` takes a bare number, not %s", fn, front_dim_name(a.dim));
      return -1;
    }
    if (e->func == AST_F_SQRT && a.v < 0) {
      char b[32];
      eval_error(c, e->a->span, NULL, "`sqrt` of a negative number (%s)", util_fmt_double(b, a.v));
      return -1;
    }
    if (e->func == AST_F_LOG && a.v <= 0) {
      char b[32];
      eval_error(c, e->a->span, NULL, "`log` of a number that is not positive (%s)", util_fmt_double(b, a.v));
      return -1;
    }
    v.v = e->func == AST_F_SQRT ? sqrt(a.v) : e->func == AST_F_EXP ? exp(a.v) : log(a.v);
    break;
  }
  *out = v;
  return finite_or_report(c, e, out);
}

static int eval_unit(rs *c, const ast_expr *e, rs_val *out) {
  rs_val a;
  if (front_eval(c, e->a, &a)) return -1;
  const char *u = ir_unit_name(e->unit);
  if (a.dim != RS_BARE) {
    eval_error(c, e->word, NULL, "`%s` goes after a bare number; this is already %s", u, front_dim_name(a.dim));
    return -1;
  }
  rs_val v = a;
  v.unit = e->unit;
  switch (e->unit) {
  case IR_UNIT_ANGSTROM: v.v = a.v / RS_ANGSTROM_PER_BOHR; v.dim = RS_LENGTH; break;
  case IR_UNIT_BOHR: v.dim = RS_LENGTH; break;
  case IR_UNIT_DEGREE: v.v = a.v * (M_PI / 180.0); v.dim = RS_ANGLE; break;
  default: v.dim = RS_ANGLE; break;
  }
  *out = v;
  return 0;
}

int front_eval(rs *c, const ast_expr *e, rs_val *out) {
  switch (e->kind) {
  case AST_E_NUM:
    if (e->bad) return -1;
    *out = (rs_val){e->value, RS_BARE, IR_UNIT_NONE, 0, DIAG_NOWHERE};
    return 0;
  case AST_E_NAME: return name_value(c, e, out);
  case AST_E_SIGN:
    if (front_eval(c, e->a, out)) return -1;
    if (e->op == '-') out->v = -out->v;
    return 0;
  case AST_E_BIN: return eval_bin(c, e, out);
  case AST_E_CALL: return eval_call(c, e, out);
  case AST_E_UNIT: return eval_unit(c, e, out);
  case AST_E_PAREN: return front_eval(c, e->a, out);
  }
  return -1;
}

void front_varies_error(rs *c, const rs_val *v, const char *where) {
  size_t len;
  const char *t = ast_text(c->d, v->vspan, &len);
  char *name = c->varied ? ast_text_dup(c->d, c->varied->name) : xstrdup("?");
  if (c->varied && ast_text_is(c->d, v->vspan, name))
    diag_report(c->d, DIAG_ERROR, v->vspan, "`%s` varies over the scan; it cannot be used in %s", name, where);
  else
    diag_report(c->d, DIAG_ERROR, v->vspan, "`%.*s` depends on `%s`, which varies over the scan; it cannot be used in %s",
                (int)len, t, name, where);
  if (c->varied) diag_note(c->d, c->r->scan.span, "`%s` is scanned here", name);
  diag_help(c->d, "a scanned value can only reach atom coordinates");
  free(name);
}

int front_eval_number(rs *c, const ast_expr *e, const char *what, double *out) {
  rs_val v;
  if (front_eval(c, e, &v)) return -1;
  if (v.varies) {
    front_varies_error(c, &v, what);
    return -1;
  }
  if (v.dim != RS_BARE) {
    diag_report(c->d, DIAG_ERROR, e->span, "%s is a bare number, not %s", what, front_dim_name(v.dim));
    return -1;
  }
  *out = v.v;
  return 0;
}

int front_eval_int(rs *c, const ast_expr *e, const char *what, long lo, long hi, long *out) {
  double x;
  if (front_eval_number(c, e, what, &x)) return -1;
  char b[32];
  if (x != floor(x)) {
    diag_report(c->d, DIAG_ERROR, e->span, "%s must be a whole number, not %s", what, util_fmt_double(b, x));
    return -1;
  }
  if (x < (double)lo || x > (double)hi) {
    if (hi >= 1000000L)
      diag_report(c->d, DIAG_ERROR, e->span, "%s must be at least %ld, not %s", what, lo, util_fmt_double(b, x));
    else
      diag_report(c->d, DIAG_ERROR, e->span, "%s must be from %ld to %ld, not %s", what, lo, hi,
                  util_fmt_double(b, x));
    return -1;
  }
  *out = (long)x;
  return 0;
}
