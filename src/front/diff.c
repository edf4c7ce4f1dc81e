/* diff.c — the semantic difference of two checked recipes.
 *
 * Compares meaning, section by section, on the IR: two recipes that say the
 * same thing in different words (units, `freeze core` or `freeze 1`, a `let`
 * or a literal, defaults written out or left away, comments, layout) have no
 * differences.  Each difference is one record (front_change) with the section
 * and the old and new values as text, so that later stages can append their
 * own records (generators, gate counts) to the same list.
 */
#include "config.h"

#include "cairn/front.h"
#include "cairn/util.h"

#include <cjson/cJSON.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

enum { GEOMETRY_LINES = 12 };
#define LENGTH_TOL 1e-10 /* bohr */

void front_changes_add(front_changes *c, front_change_op op, const char *section, const char *item,
                       const char *before, const char *after) {
  UTIL_GROW(c->v, c->cap, c->n + 1);
  front_change *x = &c->v[c->n++];
  x->op = op;
  x->section = xstrdup(section);
  x->item = item ? xstrdup(item) : NULL;
  x->before = before ? xstrdup(before) : NULL;
  x->after = after ? xstrdup(after) : NULL;
}

void front_changes_free(front_changes *c) {
  for (size_t i = 0; i < c->n; i++) {
    free(c->v[i].section);
    free(c->v[i].item);
    free(c->v[i].before);
    free(c->v[i].after);
  }
  free(c->v);
  memset(c, 0, sizeof *c);
}

/* Record a change when the two texts differ (NULL: absent). */
static void compare(front_changes *c, const char *section, const char *a, const char *b) {
  if (a && b && strcmp(a, b) == 0) return;
  if (!a && !b) return;
  front_changes_add(c, !a ? FRONT_ADDED : !b ? FRONT_REMOVED : FRONT_CHANGED, section, NULL, a, b);
}

/* compare() for two texts of the caller's, which it frees. */
static void compare_free(front_changes *c, const char *section, char *a, char *b) {
  compare(c, section, a, b);
  free(a);
  free(b);
}

static char *num(double x) {
  char b[32];
  return xstrdup(util_fmt_double(b, x));
}

/* ---- molecule ------------------------------------------------------------ */

static char *formula(const ir_recipe *r) {
  util_buf b = {0};
  util_buf_append(&b, "", 0);
  for (int a = 0; a < r->natoms; a++) util_buf_printf(&b, "%s%s", a ? " " : "", r->points[0].atoms[a].symbol);
  return b.s;
}

static char *scan_text(const ir_recipe *r) {
  if (!r->scan.active) return NULL;
  char f[32], t[32], s[32];
  const char *u = ir_unit_name(r->scan.unit);
  return xasprintf("%s from %s to %s step %s%s%s (%d points)", r->scan.name, util_fmt_double(f, r->scan.from),
                   util_fmt_double(t, r->scan.to), util_fmt_double(s, r->scan.step), *u ? " " : "", u, r->npoints);
}

/* 12 significant digits: enough to show any difference above the 1e-10 bohr
 * tolerance for coordinates below 10 bohr, few enough to read. */
static char *xyz_text(const double *x) {
  return xasprintf("(%.12g, %.12g, %.12g) bohr", x[0], x[1], x[2]);
}

/* Geometry at the scan points both recipes have (matched by value). */
static void diff_geometry(const ir_recipe *a, const ir_recipe *b, front_changes *out) {
  int shown = 0, more = 0;
  for (int p = 0; p < a->npoints; p++) {
    int q = -1;
    if (!a->scan.active && !b->scan.active) q = p;
    else if (a->scan.active && b->scan.active)
      for (int k = 0; k < b->npoints && q < 0; k++)
        if (fabs(a->points[p].param - b->points[k].param) <= 1e-12 * fmax(1, fabs(a->points[p].param)) &&
            a->scan.unit == b->scan.unit)
          q = k;
    if (q < 0 && a->scan.active != b->scan.active && a->npoints == 1) q = 0;
    if (q < 0 && a->scan.active != b->scan.active && b->npoints == 1) q = 0;
    if (q < 0 || q >= b->npoints) continue;
    for (int i = 0; i < a->natoms; i++) {
      const double *x = a->points[p].atoms[i].xyz, *y = b->points[q].atoms[i].xyz;
      if (fabs(x[0] - y[0]) <= LENGTH_TOL && fabs(x[1] - y[1]) <= LENGTH_TOL && fabs(x[2] - y[2]) <= LENGTH_TOL) continue;
      if (shown >= GEOMETRY_LINES) {
        more++;
        continue;
      }
      char *sec;
      if (a->scan.active) {
        char v[32];
        const char *u = ir_unit_name(a->scan.unit);
        sec = xasprintf("atom %d (%s) at %s = %s%s%s", i + 1, a->points[p].atoms[i].symbol, a->scan.name,
                        util_fmt_double(v, a->points[p].param), *u ? " " : "", u);
      } else {
        sec = xasprintf("atom %d (%s)", i + 1, a->points[p].atoms[i].symbol);
      }
      char *s1 = xyz_text(x), *s2 = xyz_text(y);
      front_changes_add(out, FRONT_CHANGED, "geometry", sec, s1, s2);
      free(sec);
      free(s1);
      free(s2);
      shown++;
    }
  }
  if (more) {
    char *m = xasprintf("%d more atom positions", more);
    front_changes_add(out, FRONT_CHANGED, "geometry", m, NULL, NULL);
    free(m);
  }
}

static char *basis_text(const ir_recipe *r) {
  if (r->problem != IR_PROBLEM_ATOMS) return NULL;
  if (r->basis_file) return xasprintf("file %s", r->basis_file);
  return r->basis_name ? xstrdup(r->basis_name) : NULL;
}

static char *molecule_text(const ir_recipe *r) {
  return r->problem == IR_PROBLEM_ATOMS ? formula(r) : xasprintf("integrals %s", r->integrals_file);
}

static void diff_molecule(const ir_recipe *a, const ir_recipe *b, front_changes *out) {
  char *s1, *s2;
  if (a->problem != b->problem) {
    compare_free(out, "molecule", molecule_text(a), molecule_text(b));
  } else if (a->problem == IR_PROBLEM_INTEGRALS) {
    compare(out, "integrals", a->integrals_file, b->integrals_file);
  } else {
    s1 = formula(a);
    s2 = formula(b);
    compare(out, "atoms", s1, s2);
    int same_atoms = strcmp(s1, s2) == 0;
    free(s1);
    free(s2);
    compare_free(out, "scan", scan_text(a), scan_text(b));
    if (same_atoms) diff_geometry(a, b, out);
  }
  if (a->problem == IR_PROBLEM_ATOMS && b->problem == IR_PROBLEM_ATOMS) {
    compare_free(out, "charge", num(a->charge), num(b->charge));
  }
  compare_free(out, "multiplicity", num(a->multiplicity), num(b->multiplicity));
  compare_free(out, "basis", basis_text(a), basis_text(b));
}

/* ---- orbital space ------------------------------------------------------- */

/* 1-based orbital list with runs folded: "1 3..6". */
static void put_orbitals(util_buf *b, const int *v, int n) {
  if (n == 0) util_buf_printf(b, "none");
  for (int i = 0; i < n;) {
    int j = i;
    while (j + 1 < n && v[j + 1] == v[j] + 1) j++;
    util_buf_printf(b, "%s%d", i ? " " : "", v[i] + 1);
    if (j > i) util_buf_printf(b, "..%d", v[j] + 1);
    i = j + 1;
  }
}

static char *space_text(const ir_recipe *r) {
  const ir_orbitals *o = &r->orbitals;
  util_buf b = {0};
  util_buf_printf(&b, "core ");
  put_orbitals(&b, o->core, o->ncore);
  util_buf_printf(&b, ", active ");
  put_orbitals(&b, o->active, o->nactive);
  util_buf_printf(&b, " (%d electrons in %d orbitals)", o->nelec_active, o->nactive);
  return b.s;
}

/* ---- pool rules ---------------------------------------------------------- */

static char *rule_text(const ir_rule *u) {
  util_buf b = {0};
  util_buf_printf(&b, "%s", ir_rule_name(u->kind));
  if (u->options & IR_OPT_GENERALIZED) util_buf_printf(&b, " generalized");
  if (u->options & IR_OPT_PAIRED) util_buf_printf(&b, " paired");
  if (u->options & IR_OPT_SPIN_ADAPTED) util_buf_printf(&b, " spin-adapted");
  for (int i = 0; i < u->nletters; i++) util_buf_printf(&b, " %c%d", u->letters[i].letter, u->letters[i].qubit);
  if (u->kind == IR_RULE_EXCITE) {
    for (int i = 0; i < u->nexcite; i++) util_buf_printf(&b, " %d", u->from[i]);
    util_buf_printf(&b, " ->");
    for (int i = 0; i < u->nexcite; i++) util_buf_printf(&b, " %d", u->to[i]);
  }
  return b.s;
}

/* Rules in written order: a longest common subsequence keeps what both have;
 * of the rest, a rule that only moved is `~ ... moved`, a removed and an added
 * rule of the same kind between the same kept rules are one change. */
static void diff_pool(const ir_recipe *a, const ir_recipe *b, front_changes *out) {
  int n = a->nrules, m = b->nrules;
  char **ta = xcalloc((size_t)n + 1, sizeof *ta), **tb = xcalloc((size_t)m + 1, sizeof *tb);
  for (int i = 0; i < n; i++) ta[i] = rule_text(&a->rules[i]);
  for (int j = 0; j < m; j++) tb[j] = rule_text(&b->rules[j]);
  int *L = xcalloc((size_t)(n + 1) * (size_t)(m + 1), sizeof *L);
#define LL(i, j) L[(size_t)(i) * (size_t)(m + 1) + (size_t)(j)]
  for (int i = n - 1; i >= 0; i--)
    for (int j = m - 1; j >= 0; j--)
      LL(i, j) = strcmp(ta[i], tb[j]) == 0 ? LL(i + 1, j + 1) + 1 : LL(i + 1, j) > LL(i, j + 1) ? LL(i + 1, j) : LL(i, j + 1);
  char *keep_a = xcalloc((size_t)n + 1, 1), *keep_b = xcalloc((size_t)m + 1, 1);
  int *seg_a = xcalloc((size_t)n + 1, sizeof(int)), *seg_b = xcalloc((size_t)m + 1, sizeof(int));
  int i = 0, j = 0, seg = 0;
  while (i < n || j < m) {
    if (i < n && j < m && strcmp(ta[i], tb[j]) == 0) {
      keep_a[i] = keep_b[j] = 1;
      i++, j++, seg++;
    } else if (j >= m || (i < n && LL(i + 1, j) >= LL(i, j + 1))) {
      seg_a[i++] = seg;
    } else {
      seg_b[j++] = seg;
    }
  }
#undef LL
  /* moved rules: the same text removed in one place and added in another */
  for (i = 0; i < n; i++) {
    if (keep_a[i]) continue;
    for (j = 0; j < m; j++)
      if (!keep_b[j] && strcmp(ta[i], tb[j]) == 0) {
        char *x = xasprintf("rule %d", i + 1), *y = xasprintf("rule %d", j + 1);
        front_changes_add(out, FRONT_CHANGED, "pool order", ta[i], x, y);
        free(x);
        free(y);
        keep_a[i] = keep_b[j] = 1;
        break;
      }
  }
  /* changed rules: same kind, same place */
  for (i = 0; i < n; i++) {
    if (keep_a[i]) continue;
    for (j = 0; j < m; j++)
      if (!keep_b[j] && seg_a[i] == seg_b[j] && a->rules[i].kind == b->rules[j].kind) {
        front_changes_add(out, FRONT_CHANGED, "pool", NULL, ta[i], tb[j]);
        keep_a[i] = keep_b[j] = 1;
        break;
      }
  }
  for (i = 0; i < n; i++)
    if (!keep_a[i]) front_changes_add(out, FRONT_REMOVED, "pool", NULL, ta[i], NULL);
  for (j = 0; j < m; j++)
    if (!keep_b[j]) front_changes_add(out, FRONT_ADDED, "pool", NULL, NULL, tb[j]);
  for (i = 0; i < n; i++) free(ta[i]);
  for (j = 0; j < m; j++) free(tb[j]);
  free(ta);
  free(tb);
  free(L);
  free(keep_a);
  free(keep_b);
  free(seg_a);
  free(seg_b);
}

/* ---- the rest ------------------------------------------------------------ */

static char *keep_text(const ir_keep *k, ir_symmetry s) {
  if (k->policy == IR_KEEP_NONE) return NULL;
  if (k->policy == IR_KEEP_EXACTLY) return xasprintf("%s exactly", ir_symmetry_name(s));
  char v[32];
  return xasprintf("%s %s %s", ir_symmetry_name(s), ir_policy_name(k->policy), util_fmt_double(v, k->value));
}

static void diff_optimizer(const ir_optimize *a, const ir_optimize *b, front_changes *out) {
  compare(out, "optimizer", ir_method_name(a->method), ir_method_name(b->method));
  char x[64], y[64];
  util_fmt_double(x, a->tolerance);
  util_fmt_double(y, b->tolerance);
  if (strcmp(x, y)) {
    compare_free(out, "optimizer", xasprintf("tolerance %s", x), xasprintf("tolerance %s", y));
  }
  struct {
    const char *w;
    unsigned long long u, v;
  } f[] = {{"iterations", (unsigned long long)a->iterations, (unsigned long long)b->iterations},
           {"starts", (unsigned long long)a->starts, (unsigned long long)b->starts},
           {"seed", (unsigned long long)a->seed, (unsigned long long)b->seed}};
  for (int i = 0; i < 3; i++)
    if (f[i].u != f[i].v) {
      snprintf(x, sizeof x, "%s %llu", f[i].w, f[i].u);
      snprintf(y, sizeof y, "%s %llu", f[i].w, f[i].v);
      compare(out, "optimizer", x, y);
    }
  if (a->guess != b->guess)
    compare(out, "optimizer", a->guess == IR_GUESS_MP2 ? "guess mp2" : "guess zeros",
            b->guess == IR_GUESS_MP2 ? "guess mp2" : "guess zeros");
}

static void diff_emits(const ir_recipe *a, const ir_recipe *b, front_changes *out) {
  for (int i = 0; i < a->nemits; i++) {
    const ir_emit *e = &a->emits[i];
    int k = -1;
    for (int j = 0; j < b->nemits && k < 0; j++)
      if (strcmp(b->emits[j].path, e->path) == 0) k = j;
    char *s1 = xasprintf("%s %s", ir_emit_name(e->format), e->path);
    char *s2 = k >= 0 ? xasprintf("%s %s", ir_emit_name(b->emits[k].format), b->emits[k].path) : NULL;
    compare_free(out, "emit", s1, s2);
  }
  for (int j = 0; j < b->nemits; j++) {
    int found = 0;
    for (int i = 0; i < a->nemits && !found; i++) found = strcmp(a->emits[i].path, b->emits[j].path) == 0;
    if (found) continue;
    compare_free(out, "emit", NULL, xasprintf("%s %s", ir_emit_name(b->emits[j].format), b->emits[j].path));
  }
}

static char *reference_text(const ir_reference *r) {
  return r->kind == IR_REF_BITS ? xasprintf("bits %s", r->bits) : xstrdup(ir_reference_name(r->kind));
}

void front_diff(const ir_recipe *a, const ir_recipe *b, front_changes *out) {
  diff_molecule(a, b, out);
  compare_free(out, "orbital space", space_text(a), space_text(b));
  compare_free(out, "encoding", xasprintf("%s%s", ir_encoding_name(a->encoding), a->taper ? " taper" : ""),
               xasprintf("%s%s", ir_encoding_name(b->encoding), b->taper ? " taper" : ""));
  compare_free(out, "reference", reference_text(&a->reference), reference_text(&b->reference));
  for (int k = 0; k < IR_SYM_COUNT; k++) {
    compare_free(out, "keep", keep_text(&a->keep[k], (ir_symmetry)k), keep_text(&b->keep[k], (ir_symmetry)k));
  }
  diff_pool(a, b, out);
  compare_free(out, "selection", ir_choose_text(&a->choose), ir_choose_text(&b->choose));
  compare(out, "order", ir_order_name(a->order), ir_order_name(b->order));
  compare_free(out, "trotter", num(a->trotter), num(b->trotter));
  diff_optimizer(&a->optimize, &b->optimize, out);
  diff_emits(a, b, out);
}

void front_changes_print(const front_changes *c, FILE *out) {
  for (size_t i = 0; i < c->n; i++) {
    const front_change *x = &c->v[i];
    static const char mark[] = {'+', '-', '~'};
    fprintf(out, "%c %s:", mark[x->op], x->section);
    if (x->item) fprintf(out, " %s%s", x->item, x->before || x->after ? ":" : " differ");
    if (x->before) fprintf(out, " %s", x->before);
    if (x->before && x->after) fprintf(out, " ->");
    if (x->after) fprintf(out, " %s", x->after);
    fputc('\n', out);
  }
}

char *front_changes_json(const front_changes *c, const char *a_path, const char *b_path) {
  cJSON *root = cJSON_CreateObject();
  cJSON_AddNumberToObject(root, "cairn", 1);
  cJSON_AddStringToObject(root, "a", a_path);
  cJSON_AddStringToObject(root, "b", b_path);
  cJSON_AddBoolToObject(root, "same", c->n == 0);
  cJSON *arr = cJSON_AddArrayToObject(root, "changes");
  static const char *const ops[] = {"added", "removed", "changed"};
  for (size_t i = 0; i < c->n; i++) {
    cJSON *o = cJSON_CreateObject();
    cJSON_AddStringToObject(o, "op", ops[c->v[i].op]);
    cJSON_AddStringToObject(o, "section", c->v[i].section);
    if (c->v[i].item) cJSON_AddStringToObject(o, "item", c->v[i].item);
    if (c->v[i].before) cJSON_AddStringToObject(o, "before", c->v[i].before);
    if (c->v[i].after) cJSON_AddStringToObject(o, "after", c->v[i].after);
    cJSON_AddItemToArray(arr, o);
  }
  char *s = cJSON_Print(root);
  cJSON_Delete(root);
  if (!s) {
    fprintf(stderr, "cairn: out of memory printing JSON\n");
    exit(2);
  }
  char *r = xstrdup(s);
  cJSON_free(s);
  return r;
}
