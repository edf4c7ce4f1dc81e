/* resolve.c — from the ASTs of a recipe (and the files it uses) to the IR.
 *
 * Steps, each reporting every error it finds:
 *   1. read the top file and every `use`d file, depth first, into one list of
 *      statements (a file is read once; a cycle is an error at the `use`);
 *   2. check the header and that once-only statements appear once; collect
 *      the names of `let` and `vary`;
 *   3. evaluate the lets and the vary in order (names are defined before use);
 *   4. resolve the molecule, the orbital space (space.c) and then every
 *      remaining section into its IR form.
 * When a file has syntax errors, resolution stops after step 1: meaning
 * checked on a half-read recipe would mostly report consequences.
 */
#include "config.h"

#include "front/resolve.h"
#include "front/parse.h"
#include "front/suggest.h"
#include "cairn/chem.h"
#include "cairn/element.h"
#include "cairn/pauli.h"
#include "cairn/util.h"

#include <ctype.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

enum { RS_MAX_USE_DEPTH = 32, RS_MAX_POINTS = 10000 };

/* ---- small helpers ------------------------------------------------------ */

/* Lexical normalization of a path: drops `.` parts and empty parts, folds
 * `dir/..`.  (Lexical, so that it also works for files that do not exist yet,
 * like outputs.) */
static char *path_normalize(const char *path) {
  size_t n = strlen(path);
  char *buf = xstrdup(path);
  const char **parts = xmalloc(sizeof *parts * (n / 2 + 2));
  int np = 0;
  int absolute = path[0] == '/';
  char *save = NULL;
  for (char *t = strtok_r(buf, "/", &save); t; t = strtok_r(NULL, "/", &save)) {
    if (strcmp(t, ".") == 0) continue;
    if (strcmp(t, "..") == 0 && np > 0 && strcmp(parts[np - 1], "..") != 0) {
      np--;
      continue;
    }
    if (strcmp(t, "..") == 0 && absolute) continue;
    parts[np++] = t;
  }
  util_buf out = {0};
  if (absolute) util_buf_append(&out, "/", 1);
  for (int i = 0; i < np; i++) {
    if (i) util_buf_append(&out, "/", 1);
    util_buf_printf(&out, "%s", parts[i]);
  }
  if (out.len == 0) util_buf_append(&out, ".", 1);
  free(parts);
  free(buf);
  return out.s;
}

/* The text of a string token without its quotes; \" and \\ are escapes. */
static char *unquote(const diag_ctx *d, diag_span s) {
  size_t len;
  const char *t = ast_text(d, s, &len);
  size_t i = 0, end = len;
  if (len > 0 && t[0] == '"') i = 1;
  if (end > i && t[end - 1] == '"' && !(end >= 2 && t[end - 2] == '\\' && end - 2 >= i)) end--;
  util_buf b = {0};
  util_buf_append(&b, "", 0);
  for (; i < end; i++) {
    if (t[i] == '\\' && i + 1 < end && (t[i + 1] == '"' || t[i + 1] == '\\')) i++;
    util_buf_append(&b, t + i, 1);
  }
  return b.s;
}

/* A path written in file `in_file`, made relative to that file's directory. */
static char *relative_to(const rs *c, int32_t in_file, const char *p) {
  char *dir = util_dirname(diag_file_path(c->d, in_file));
  char *j = util_path_join(dir, p);
  char *n = path_normalize(j);
  free(dir);
  free(j);
  return n;
}

static char *str_of(const rs *c, diag_span s) { return ast_text_dup(c->d, s); }

int front_index(rs *c, diag_span s, int bad, long *out) {
  if (bad) return -1;
  size_t len;
  const char *t = ast_text(c->d, s, &len);
  long v = 0;
  size_t i = 0;
  for (; i < len && isdigit((unsigned char)t[i]); i++) {
    v = v * 10 + (t[i] - '0');
    if (v > 100000000L) break;
  }
  if (len == 0 || i != len) {
    diag_report(c->d, DIAG_ERROR, s, "expected a whole number, not `%.*s`", (int)len, t);
    return -1;
  }
  *out = v;
  return 0;
}

/* "unknown X `w`" with a did-you-mean and the list of what is known. */
static void unknown_word(rs *c, diag_span w, const char *what, const char *plural, const char *const *known, int n) {
  size_t len;
  const char *t = ast_text(c->d, w, &len);
  diag_report(c->d, DIAG_ERROR, w, "unknown %s `%.*s`", what, (int)len, t);
  const char *s = front_suggest(t, len, known, n);
  util_buf b = {0};
  for (int i = 0; i < n; i++) util_buf_printf(&b, "%s%s", i ? ", " : "", known[i]);
  if (s) diag_help(c->d, "did you mean `%s`? (%s: %s)", s, plural, b.s);
  else diag_help(c->d, "%s: %s", plural, b.s);
  util_buf_free(&b);
}

/* Index of w in known, or -1. */
static int word_index(const rs *c, diag_span w, const char *const *known, int n) {
  for (int i = 0; i < n; i++)
    if (ast_text_is(c->d, w, known[i])) return i;
  return -1;
}

/* ---- step 1: reading files ---------------------------------------------- */

static int32_t default_load(void *ctx, diag_ctx *d, const char *path, diag_span from) {
  (void)ctx;
  return diag_load_file(d, path, from);
}
static int default_count(void *ctx, const ir_recipe *r, diag_ctx *d) {
  (void)ctx;
  return chem_count_orbitals(r, d);
}
static int default_header(void *ctx, const char *path, diag_span from, diag_ctx *d, int *norb, int *nelec,
                          int *ms2) {
  (void)ctx;
  return chem_fcidump_header(path, from, d, norb, nelec, ms2);
}

static void collect(rs *c, int32_t file, int top);

/* use "path": read the file once; a file that is being read further up the
 * chain is a cycle. */
static void resolve_use(rs *c, ast_stmt *s) {
  char *p = unquote(c->d, s->name);
  if (!*p) {
    diag_report(c->d, DIAG_ERROR, s->name, "`use` needs a file name");
    free(p);
    return;
  }
  char *path = relative_to(c, s->span.file, p);
  free(p);
  for (int i = 0; i < c->nstack; i++) {
    if (strcmp(c->stack[i], path) != 0) continue;
    c->use_failed = 1;
    diag_report(c->d, DIAG_ERROR, s->span, "`use` cycle: `%s` is already being read", path);
    for (int j = i; j < c->nstack; j++)
      diag_note(c->d, DIAG_NOWHERE, "`%s` uses `%s`", c->stack[j], j + 1 < c->nstack ? c->stack[j + 1] : path);
    diag_help(c->d, "a file may not use itself, directly or through other files");
    free(path);
    return;
  }
  for (int i = 0; i < c->nincluded; i++)
    if (strcmp(c->included[i], path) == 0) {
      free(path); /* read once: its statements are already in */
      return;
    }
  if (c->nstack >= RS_MAX_USE_DEPTH) {
    diag_report(c->d, DIAG_ERROR, s->span, "`use` files nest deeper than %d levels", RS_MAX_USE_DEPTH);
    free(path);
    return;
  }
  int32_t f = c->o.load(c->o.ctx, c->d, path, s->span);
  if (f < 0) {
    c->use_failed = 1;
    free(path);
    return;
  }
  c->r->uses = xrealloc(c->r->uses, sizeof *c->r->uses * (size_t)(c->r->nuses + 1));
  c->r->uses[c->r->nuses++] = xstrdup(path);
  c->included = xrealloc(c->included, sizeof *c->included * (size_t)(c->nincluded + 1));
  c->included[c->nincluded++] = path;
  collect(c, f, 0);
}

/* The `cairn 1` header: first in the top file, optional in used files. */
static void check_header(rs *c, ast_file *a, int top) {
  for (int i = 0; i < a->stmts.n; i++) {
    ast_stmt *s = a->stmts.v[i];
    if (s->kind != AST_HEADER) continue;
    if (i > 0) {
      diag_report(c->d, DIAG_ERROR, s->span, "`cairn 1` belongs on the first line of the file");
      continue;
    }
    if (top) c->header_span = s->span;
    long v;
    int save = c->cur;
    c->cur = 0;
    if (front_eval_int(c, s->e[0], "the language version", 0, 1000000, &v) == 0 && v != 1) {
      diag_report(c->d, DIAG_ERROR, s->e[0]->span, "this cairn reads language version 1, not %ld", v);
      diag_help(c->d, "start the recipe with `cairn 1`");
    }
    c->cur = save;
  }
  if (top && (a->stmts.n == 0 || a->stmts.v[0]->kind != AST_HEADER)) {
    diag_span at = a->stmts.n ? a->stmts.v[0]->span : (diag_span){a->file, 0, 0};
    c->header_span = at;
    diag_report(c->d, DIAG_ERROR, at, "a recipe starts with the line `cairn 1`");
    diag_help(c->d, "add `cairn 1` (the language version) as the first line");
  }
}

static void collect(rs *c, int32_t file, int top) {
  ast_file *a = front_parse(c->d, file);
  UTIL_GROW(c->asts, c->capasts, (size_t)c->nasts + 1);
  c->asts[c->nasts++] = a;
  c->syntax_errors += a->errors;
  if (a->errors) return;
  char *self = path_normalize(diag_file_path(c->d, file));
  UTIL_GROW(c->stack, c->capstack, (size_t)c->nstack + 1);
  c->stack[c->nstack++] = self;
  if (top) {
    c->included = xrealloc(c->included, sizeof *c->included * (size_t)(c->nincluded + 1));
    c->included[c->nincluded++] = xstrdup(self);
  }
  check_header(c, a, top);
  for (int i = 0; i < a->stmts.n; i++) {
    ast_stmt *s = a->stmts.v[i];
    if (s->kind == AST_USE) resolve_use(c, s);
    else if (s->kind != AST_HEADER) {
      UTIL_GROW(c->st, c->capst, (size_t)c->nst + 1);
      c->st[c->nst++] = s;
    }
  }
  free(c->stack[--c->nstack]);
}

/* ---- step 2: once-only statements and names ------------------------------ */

static int slot_of(ast_kind k) {
  switch (k) {
  case AST_ATOMS: return RS_ATOMS;
  case AST_CHARGE: return RS_CHARGE;
  case AST_MULTIPLICITY: return RS_MULT;
  case AST_BASIS: case AST_BASIS_FILE: return RS_BASIS;
  case AST_INTEGRALS: return RS_INTEGRALS;
  case AST_ORBITALS: return RS_ORBITALS;
  case AST_ENCODING: return RS_ENCODING;
  case AST_REFERENCE: case AST_REFERENCE_BITS: return RS_REFERENCE;
  case AST_POOL: return RS_POOL;
  case AST_CHOOSE: return RS_CHOOSE;
  case AST_ORDER: return RS_ORDER;
  case AST_TROTTER: return RS_TROTTER;
  case AST_OPTIMIZE: return RS_OPTIMIZE;
  case AST_VARY: return RS_VARY;
  default: return -1;
  }
}

static const char *slot_word(int slot) {
  static const char *const w[RS_NSLOTS] = {"atoms", "charge", "multiplicity", "basis", "integrals", "orbitals",
                                           "encoding", "reference", "pool", "choose", "order", "trotter",
                                           "optimize", "vary"};
  return w[slot];
}

static rs_name *find_name(rs *c, diag_span name) {
  size_t len;
  const char *t = ast_text(c->d, name, &len);
  for (int i = 0; i < c->nnames; i++) {
    size_t l2;
    const char *t2 = ast_text(c->d, c->names[i].name, &l2);
    if (l2 == len && memcmp(t, t2, len) == 0) return &c->names[i];
  }
  return NULL;
}

static void add_name(rs *c, ast_stmt *s, int order, int is_vary) {
  UTIL_GROW(c->names, c->capnames, (size_t)c->nnames + 1);
  rs_name *n = &c->names[c->nnames++];
  memset(n, 0, sizeof *n);
  n->name = s->name;
  n->def = s;
  n->order = order;
  n->is_vary = is_vary;
  n->cache_point = -1;
}

static void scan_statements(rs *c) {
  for (int i = 0; i < c->nst; i++) {
    ast_stmt *s = c->st[i];
    int slot = slot_of(s->kind);
    if (slot >= 0) {
      if (c->one[slot]) {
        if (slot == RS_VARY) {
          diag_report(c->d, DIAG_ERROR, s->kw, "a recipe scans at most one name: `vary` is given twice");
          diag_note(c->d, c->one[slot]->span, "the first `vary` is here");
        } else if (slot == RS_CHOOSE) {
          diag_report(c->d, DIAG_ERROR, s->kw, "the selection (`choose` or `grow`) is given twice");
          diag_note(c->d, c->one[slot]->span, "first given here");
        } else {
          diag_report(c->d, DIAG_ERROR, s->kw, "`%s` is given twice", slot_word(slot));
          diag_note(c->d, c->one[slot]->span, "first given here");
        }
        continue;
      }
      c->one[slot] = s;
    }
    if (s->kind == AST_LET) {
      rs_name *old = find_name(c, s->name);
      if (old) {
        char *n = str_of(c, s->name);
        diag_report(c->d, DIAG_ERROR, s->name, "`%s` is defined twice", n);
        diag_note(c->d, old->def->span, "first defined here%s", old->def->kind == AST_VARY ? ", by `vary`" : "");
        free(n);
        continue;
      }
      add_name(c, s, i, 0);
    } else if (s->kind == AST_VARY && c->one[RS_VARY] == s) {
      rs_name *old = find_name(c, s->name);
      if (old) {
        old->is_vary = 1; /* a let the scan overrides: the let gives the unit */
        c->varied = old;
      } else {
        add_name(c, s, i, 1);
        c->varied = &c->names[c->nnames - 1];
      }
    }
  }
  /* c->varied may point into names, which no longer grows */
}

/* ---- step 3: lets and the scan ------------------------------------------ */

static double to_internal(double v, ir_unit u) {
  if (u == IR_UNIT_ANGSTROM) return v / RS_ANGSTROM_PER_BOHR;
  if (u == IR_UNIT_DEGREE) return v * (M_PI / 180.0);
  return v;
}
static double from_internal(double v, ir_unit u) {
  if (u == IR_UNIT_ANGSTROM) return v * RS_ANGSTROM_PER_BOHR;
  if (u == IR_UNIT_DEGREE) return v / (M_PI / 180.0);
  return v;
}

/* Round a scan value to 12 significant digits, so that 0.8 + 8 * 0.2 is 2.4:
 * the points of a scan are meant as the decimals they print as. */
static double snap(double x) {
  char b[40];
  snprintf(b, sizeof b, "%.12g", x);
  return strtod(b, NULL);
}

static void resolve_vary(rs *c, ast_stmt *s, int order) {
  ir_scan *sc = &c->r->scan;
  rs_name *n = c->varied;
  c->cur = order;
  rs_val v[3];
  int ok = 1;
  for (int k = 0; k < 3; k++) {
    if (front_eval(c, s->e[k], &v[k])) {
      ok = 0;
      continue;
    }
    if (v[k].varies) {
      diag_report(c->d, DIAG_ERROR, v[k].vspan, "the range of `vary` cannot depend on the scanned name");
      ok = 0;
    }
  }
  if (!ok) return;
  rs_dim dim = RS_BARE;
  ir_unit unit = IR_UNIT_NONE;
  if (n->def->kind == AST_LET) {
    if (n->state != 2) return;
    dim = n->val.dim;
    unit = n->val.unit;
  } else {
    for (int k = 0; k < 3; k++)
      if (v[k].dim != RS_BARE) {
        dim = v[k].dim;
        unit = v[k].unit;
        break;
      }
  }
  double x[3];
  static const char *const part[3] = {"start", "end", "step"};
  for (int k = 0; k < 3; k++) {
    if (v[k].dim == RS_BARE) x[k] = to_internal(v[k].v, unit);
    else if (v[k].dim == dim) x[k] = v[k].v;
    else {
      char *nm = str_of(c, n->name);
      diag_report(c->d, DIAG_ERROR, s->e[k]->span, "the %s of the scan is %s, but `%s` is %s", part[k],
                  front_dim_name(v[k].dim), nm, front_dim_name(dim));
      if (n->def->kind == AST_LET) diag_note(c->d, n->def->span, "`%s` is defined here", nm);
      free(nm);
      ok = 0;
      break;
    }
  }
  if (!ok) return;
  if (x[2] == 0) {
    diag_report(c->d, DIAG_ERROR, s->e[2]->span, "the step of the scan is zero");
    diag_help(c->d, "give a step such as `step 0.1`");
    return;
  }
  double span_steps = (x[1] - x[0]) / x[2];
  if (span_steps < -1e-9) {
    char b0[32], b1[32], b2[32];
    diag_report(c->d, DIAG_ERROR, ast_join(s->e[0]->span, s->e[2]->span),
                "the scan is empty: from %s in steps of %s it never reaches %s", util_fmt_double(b0, from_internal(x[0], unit)),
                util_fmt_double(b2, from_internal(x[2], unit)), util_fmt_double(b1, from_internal(x[1], unit)));
    diag_help(c->d, "%s", x[2] > 0 ? "to scan downwards, give a negative step" : "to scan upwards, give a positive step");
    return;
  }
  double count = floor(span_steps + 1e-9) + 1;
  if (!(count <= RS_MAX_POINTS)) {
    char b[32];
    diag_report(c->d, DIAG_ERROR, s->span, "the scan has %s points; the limit is %d", util_fmt_double(b, count),
                RS_MAX_POINTS);
    return;
  }
  sc->active = 1;
  sc->name = str_of(c, n->name);
  sc->unit = unit;
  sc->from = snap(from_internal(x[0], unit));
  sc->to = snap(from_internal(x[1], unit));
  sc->step = snap(from_internal(x[2], unit));
  sc->span = s->span;
  c->scan_points = (int)count;
  c->vary_dim = dim;
  c->vary_unit = unit;
  c->vary_from = to_internal(sc->from, unit);
  c->vary_ok = 1;
}

static void evaluate_names(rs *c) {
  for (int i = 0; i < c->nst; i++) {
    ast_stmt *s = c->st[i];
    if (s->kind == AST_LET) {
      rs_name *n = NULL;
      for (int k = 0; k < c->nnames; k++)
        if (c->names[k].def == s) n = &c->names[k];
      if (!n) continue; /* a duplicate, reported */
      c->cur = i;
      n->state = front_eval(c, s->e[0], &n->val) == 0 ? 2 : 3;
    } else if (s->kind == AST_VARY && s == c->one[RS_VARY]) {
      resolve_vary(c, s, i);
      if (c->varied && c->varied->def == s) c->varied->state = c->vary_ok ? 2 : 3;
    }
  }
}

/* ---- step 4: sections --------------------------------------------------- */

static int order_of(const rs *c, const ast_stmt *s) {
  for (int i = 0; i < c->nst; i++)
    if (c->st[i] == s) return i;
  return c->nst;
}

/* A coordinate: a length, or a bare number in the block's unit. */
static int coordinate(rs *c, const ast_expr *e, ir_unit block, int report_dim, double *out) {
  rs_val v;
  if (front_eval(c, e, &v)) return -1;
  if (v.dim == RS_ANGLE) {
    if (report_dim) {
      diag_report(c->d, DIAG_ERROR, e->span, "a coordinate is a length, not an angle");
      diag_help(c->d, "an angle goes inside sin, cos or tan: `r*sin(52.25 deg)`");
    }
    return -1;
  }
  *out = v.dim == RS_BARE ? to_internal(v.v, block) : v.v;
  return 0;
}

static void resolve_atoms(rs *c) {
  ir_recipe *r = c->r;
  ast_stmt *s = c->one[RS_ATOMS];
  if (!s) return;
  ir_unit block = IR_UNIT_ANGSTROM;
  if (s->variant_span.file >= 0) {
    if (ast_text_is(c->d, s->variant_span, "bohr")) block = IR_UNIT_BOHR;
    else if (!ast_text_is(c->d, s->variant_span, "angstrom")) {
      diag_report(c->d, DIAG_ERROR, s->variant_span, "atoms take a length unit: `angstrom` or `bohr`");
      return;
    }
  }
  int na = s->items.n;
  if (na == 0) {
    diag_report(c->d, DIAG_ERROR, s->kw, "the `atoms` block is empty");
    diag_help(c->d, "list one atom per line: `H  0  0  0.74`");
    return;
  }
  int ok = 1;
  int np = c->scan_points > 0 ? c->scan_points : 1;
  r->natoms = na;
  r->npoints = np;
  r->points = xcalloc((size_t)np, sizeof *r->points);
  for (int p = 0; p < np; p++) {
    r->points[p].atoms = xcalloc((size_t)na, sizeof(ir_atom));
    r->points[p].param = r->scan.active ? snap(r->scan.from + p * r->scan.step) : 0;
  }
  int order = order_of(c, s);
  for (int a = 0; a < na; a++) {
    ast_stmt *it = s->items.v[a];
    size_t len;
    const char *sym = ast_text(c->d, it->name, &len);
    int z = element_z(sym, (int)len);
    if (z == 0) {
      diag_report(c->d, DIAG_ERROR, it->name, "unknown element `%.*s`", (int)len, sym);
      diag_help(c->d, "write the element symbol, like H, He, Li, C, N, O");
      ok = 0;
    }
    for (int p = 0; p < np; p++) {
      ir_atom *at = &r->points[p].atoms[a];
      at->z = z;
      snprintf(at->symbol, sizeof at->symbol, "%s", z ? element_symbol(z) : "?");
      at->span = it->span;
    }
    for (int k = 0; k < 3; k++) {
      c->cur = order;
      c->point = -1;
      double x;
      rs_val v;
      if (coordinate(c, it->e[k], block, 1, &x)) {
        ok = 0;
        continue;
      }
      front_eval(c, it->e[k], &v);
      if (v.varies) c->scan_used = 1;
      for (int p = 0; p < np; p++) {
        if (v.varies && r->scan.active) {
          c->point = p;
          c->point_param = r->points[p].param;
          c->point_value = to_internal(c->point_param, c->vary_unit);
          if (coordinate(c, it->e[k], block, 0, &x)) {
            ok = 0;
            break;
          }
        }
        r->points[p].atoms[a].xyz[k] = x;
      }
      c->point = -1;
    }
  }
  /* two nuclei in one place make the energy infinite */
  for (int p = 0; p < np && ok; p++)
    for (int a = 0; a < na && ok; a++)
      for (int b = 0; b < a && ok; b++) {
        const double *u = r->points[p].atoms[a].xyz, *w = r->points[p].atoms[b].xyz;
        double dd = sqrt((u[0] - w[0]) * (u[0] - w[0]) + (u[1] - w[1]) * (u[1] - w[1]) + (u[2] - w[2]) * (u[2] - w[2]));
        if (dd < 1e-6) {
          diag_report(c->d, DIAG_ERROR, s->items.v[a]->span, "atoms %d and %d are at the same place", b + 1, a + 1);
          if (r->scan.active) {
            char buf[32];
            diag_note(c->d, r->scan.span, "at the scan point %s = %s", r->scan.name, util_fmt_double(buf, r->points[p].param));
          }
          diag_note(c->d, s->items.v[b]->span, "atom %d is here", b + 1);
          ok = 0;
        }
      }
  if (ok) c->molecule_ok |= 1;
  if (ok && r->scan.active && !c->scan_used) {
    diag_report(c->d, DIAG_WARNING, r->scan.span, "no atom coordinate depends on `%s`: every point of the scan is the same geometry",
                r->scan.name);
    diag_help(c->d, "use the scanned name in the atoms block, directly or through a `let`");
  }
}

static void resolve_basis(rs *c) {
  ast_stmt *s = c->one[RS_BASIS];
  if (!s) return;
  c->r->basis_span = s->span;
  if (s->kind == AST_BASIS) {
    char *n = str_of(c, s->name);
    for (char *q = n; *q; q++) *q = (char)tolower((unsigned char)*q);
    if (n[0] == '"') {
      diag_report(c->d, DIAG_ERROR, s->name, "a basis set name is written without quotes");
      diag_help(c->d, "for a basis set file write `basis file %s`", n);
      free(n);
      return;
    }
    c->r->basis_name = n;
  } else {
    char *p = unquote(c->d, s->name);
    if (!*p) {
      diag_report(c->d, DIAG_ERROR, s->name, "`basis file` needs a file name");
      free(p);
      return;
    }
    c->r->basis_file = relative_to(c, s->span.file, p);
    free(p);
  }
}

static void resolve_simple_molecule(rs *c) {
  ir_recipe *r = c->r;
  c->cur = c->nst;
  if (c->one[RS_CHARGE]) {
    long v;
    if (front_eval_int(c, c->one[RS_CHARGE]->e[0], "the charge", -1000, 1000, &v) == 0) r->charge = (int)v;
    else c->molecule_ok |= 4;
  }
  if (c->one[RS_MULT]) {
    long v;
    if (front_eval_int(c, c->one[RS_MULT]->e[0], "the multiplicity", 1, 1000, &v) == 0) r->multiplicity = (int)v;
    else c->molecule_ok |= 4;
  }
  resolve_basis(c);
  if (c->one[RS_INTEGRALS]) {
    ast_stmt *s = c->one[RS_INTEGRALS];
    char *p = unquote(c->d, s->name);
    if (!*p) {
      diag_report(c->d, DIAG_ERROR, s->name, "`integrals` needs a file name");
      c->molecule_ok |= 4;
    } else {
      r->integrals_file = relative_to(c, s->span.file, p);
    }
    r->integrals_span = s->span;
    free(p);
  }
}

static void resolve_encoding(rs *c) {
  ast_stmt *s = c->one[RS_ENCODING];
  if (!s) return;
  static const char *const names[] = {"jordan-wigner", "bravyi-kitaev", "parity"};
  int k = word_index(c, s->name, names, 3);
  if (k < 0) unknown_word(c, s->name, "encoding", "encodings", names, 3);
  else c->r->encoding = (ir_encoding)k;
  c->r->encoding_span = s->span;
  static const char *const opts[] = {"taper"};
  for (int i = 0; i < s->words.n; i++) {
    diag_span w = s->words.v[i];
    if (word_index(c, w, opts, 1) < 0) {
      size_t len;
      const char *t = ast_text(c->d, w, &len);
      diag_report(c->d, DIAG_ERROR, w, "unknown option `%.*s` for `encoding`", (int)len, t);
      const char *sg = front_suggest(t, len, opts, 1);
      diag_help(c->d, "%s`encoding` takes one option: taper", sg ? "did you mean `taper`? " : "");
    } else if (c->r->taper) {
      diag_report(c->d, DIAG_ERROR, w, "`taper` is given twice");
    } else {
      c->r->taper = 1;
    }
  }
}

static void resolve_reference(rs *c) {
  ast_stmt *s = c->one[RS_REFERENCE];
  if (!s) return;
  ir_reference *ref = &c->r->reference;
  ref->span = s->span;
  if (s->kind == AST_REFERENCE) {
    static const char *const names[] = {"hartree-fock", "mean-field"};
    int k = word_index(c, s->name, names, 2);
    if (k < 0) {
      unknown_word(c, s->name, "reference", "references", names, 2);
      diag_help(c->d, "or give the occupation of each qubit: `reference bits 11110000`");
    } else {
      ref->kind = (ir_reference_kind)k;
    }
    return;
  }
  size_t len;
  const char *t = ast_text(c->d, s->name, &len);
  for (size_t i = 0; i < len; i++)
    if (t[i] != '0' && t[i] != '1') {
      diag_span at = {s->name.file, s->name.start + (uint32_t)i, s->name.start + (uint32_t)i + 1};
      diag_report(c->d, DIAG_ERROR, at, "a bit string holds only 0 and 1, not `%c`", t[i]);
      diag_help(c->d, "character q is the occupation of qubit q, qubit 0 first: `11110000`");
      return;
    }
  if (c->qubits > 0 && (int)len != c->qubits) {
    diag_report(c->d, DIAG_ERROR, s->name, "the reference has %zu bits but the register has %d qubits", len,
                c->qubits);
    diag_note(c->d, c->r->orbitals.active_span.file >= 0 ? c->r->orbitals.active_span : DIAG_NOWHERE,
              "%d active orbitals give %d qubits (2 per orbital)", c->qubits / 2, c->qubits);
    return;
  }
  ref->kind = IR_REF_BITS;
  ref->bits = xstrndup(t, len);
}

static void resolve_keeps(rs *c) {
  static const char *const names[] = {"particles", "spin-z", "spin-squared"};
  const ast_stmt *first[IR_SYM_COUNT] = {0};
  for (int i = 0; i < c->nst; i++) {
    ast_stmt *s = c->st[i];
    if (s->kind != AST_KEEP) continue;
    c->cur = i;
    int k = word_index(c, s->name, names, 3);
    if (k < 0) {
      unknown_word(c, s->name, "symmetry", "symmetries", names, 3);
      continue;
    }
    if (first[k]) {
      diag_report(c->d, DIAG_ERROR, s->name, "`keep %s` is given twice", names[k]);
      diag_note(c->d, first[k]->span, "first given here");
      continue;
    }
    first[k] = s;
    ir_keep *kp = &c->r->keep[k];
    double v = 0;
    if (s->variant == IR_KEEP_PENALTY || s->variant == IR_KEEP_CHECKED) {
      const char *what = s->variant == IR_KEEP_PENALTY ? "the penalty weight" : "the check tolerance";
      if (front_eval_number(c, s->e[0], what, &v)) continue;
      if (!(v > 0)) {
        char b[32];
        diag_report(c->d, DIAG_ERROR, s->e[0]->span, "%s must be positive, not %s", what, util_fmt_double(b, v));
        continue;
      }
    }
    kp->policy = (ir_policy)s->variant;
    kp->value = v;
    kp->span = s->span;
  }
}

/* Options of the pool rules.  ORDER RULES: ir_rule_kind up to IR_RULE_QUBIT_DOUBLES. */
static const char *const rule_words[] = {"singles", "doubles", "entanglers"};
static const char *const all_rules[] = {"singles", "doubles", "entanglers", "qubit singles", "qubit doubles", "word", "excite"};
static const char *const opt_words[] = {"generalized", "paired", "spin-adapted"};
static const unsigned opt_bits[] = {IR_OPT_GENERALIZED, IR_OPT_PAIRED, IR_OPT_SPIN_ADAPTED};

static unsigned rule_allows(ir_rule_kind k) {
  switch (k) {
  case IR_RULE_SINGLES: return IR_OPT_GENERALIZED | IR_OPT_SPIN_ADAPTED;
  case IR_RULE_DOUBLES: return IR_OPT_GENERALIZED | IR_OPT_PAIRED;
  case IR_RULE_QUBIT_SINGLES:
  case IR_RULE_QUBIT_DOUBLES: return IR_OPT_GENERALIZED;
  default: return 0;
  }
}

static int rule_words_kind(rs *c, ast_stmt *it, ir_rule *rule) {
  diag_span w0 = it->words.v[0];
  int first = 1;
  if (ast_text_is(c->d, w0, "qubit")) {
    static const char *const q[] = {"singles", "doubles"};
    int k = it->words.n > 1 ? word_index(c, it->words.v[1], q, 2) : -1;
    if (k < 0) {
      diag_span at = it->words.n > 1 ? it->words.v[1] : w0;
      diag_report(c->d, DIAG_ERROR, at, "`qubit` is followed by `singles` or `doubles`");
      return -1;
    }
    rule->kind = k == 0 ? IR_RULE_QUBIT_SINGLES : IR_RULE_QUBIT_DOUBLES;
    first = 2;
  } else {
    int k = word_index(c, w0, rule_words, 3);
    if (k < 0) {
      unknown_word(c, w0, "pool rule", "pool rules", all_rules, 7);
      return -1;
    }
    rule->kind = k == 0 ? IR_RULE_SINGLES : k == 1 ? IR_RULE_DOUBLES : IR_RULE_ENTANGLERS;
  }
  unsigned allowed = rule_allows(rule->kind);
  const char *rn = ir_rule_name(rule->kind);
  int ok = 1;
  for (int i = first; i < it->words.n; i++) {
    diag_span w = it->words.v[i];
    int o = word_index(c, w, opt_words, 3);
    if (o < 0 || !(allowed & opt_bits[o])) {
      size_t len;
      const char *t = ast_text(c->d, w, &len);
      diag_report(c->d, DIAG_ERROR, w, "unknown option `%.*s` for `%s`", (int)len, t, rn);
      const char *known[3];
      int nk = 0;
      util_buf b = {0};
      for (int j = 0; j < 3; j++)
        if (allowed & opt_bits[j]) {
          known[nk++] = opt_words[j];
          util_buf_printf(&b, "%s%s", b.len ? ", " : "", opt_words[j]);
        }
      const char *sg = front_suggest(t, len, known, nk);
      if (nk == 0) diag_help(c->d, "`%s` takes no options", rn);
      else if (sg) diag_help(c->d, "did you mean `%s`? (`%s` takes: %s)", sg, rn, b.s);
      else diag_help(c->d, "`%s` takes: %s", rn, b.s);
      util_buf_free(&b);
      ok = 0;
    } else if (rule->options & opt_bits[o]) {
      diag_report(c->d, DIAG_ERROR, w, "option `%s` is given twice", opt_words[o]);
      ok = 0;
    } else {
      rule->options |= opt_bits[o];
    }
  }
  return ok ? 0 : -1;
}

/* word X0 Y1 ... : validated with the Pauli parser against the register. */
static int rule_pauli(rs *c, ast_stmt *it, ir_rule *rule) {
  diag_span all = ast_join(it->words.v[0], it->words.v[it->words.n - 1]);
  char *text = str_of(c, all);
  int n = c->qubits > 0 ? c->qubits : 1 << 20;
  int nw = pauli_nwords(n);
  uint64_t *x = xcalloc((size_t)nw, sizeof *x), *z = xcalloc((size_t)nw, sizeof *z);
  char err[160];
  size_t off = 0;
  int rc = pauli_word_parse(text, n, x, z, err, sizeof err, &off);
  if (rc != 0) {
    diag_span at = it->words.v[0];
    for (int i = 0; i < it->words.n; i++)
      if (it->words.v[i].start <= all.start + off) at = it->words.v[i];
    if (off > at.start - all.start && off < at.end - all.start) /* one letter of a dense word */
      at = (diag_span){at.file, all.start + (uint32_t)off, all.start + (uint32_t)off + 1};
    diag_report(c->d, DIAG_ERROR, at, "%s", err);
    if (strstr(err, "beyond"))
      diag_note(c->d, c->r->orbitals.active_span, "the register has %d qubits: 2 per active orbital", c->qubits);
    else if (!strstr(err, "twice"))
      diag_help(c->d, "write a Pauli word as letters with qubits, `X0 Y1 Z3`, or densely, `XYIZ`");
  } else if (pauli_word_is_identity(nw, x, z)) {
    diag_report(c->d, DIAG_ERROR, all, "the identity is not a generator");
    diag_help(c->d, "a word needs at least one X, Y or Z");
    rc = -1;
  } else if (c->qubits > 0) {
    rule->nletters = pauli_word_weight(nw, x, z);
    rule->letters = xcalloc((size_t)rule->nletters, sizeof *rule->letters);
    int k = 0;
    for (int q = 0; q < n; q++) {
      char L = pauli_letter(x, z, q);
      if (L != 'I') rule->letters[k++] = (ir_pauli_letter){q, L};
    }
  }
  free(x);
  free(z);
  free(text);
  return rc;
}

/* excite 0 1 -> 4 5 : spin orbitals in range, distinct, equal counts. */
static int rule_excite(rs *c, ast_stmt *it, ir_rule *rule) {
  int nf = it->list.n, nt = it->list2.n;
  if (nf != nt) {
    diag_report(c->d, DIAG_ERROR, it->arrow, "an excitation moves as many electrons as it takes: %d -> %d", nf, nt);
    diag_help(c->d, "list the same number of spin orbitals on both sides: `excite 0 1 -> 4 5`");
    return -1;
  }
  if (nf > 4) {
    diag_report(c->d, DIAG_ERROR, it->span, "an explicit excitation moves at most 4 electrons, not %d", nf);
    return -1;
  }
  long idx[8];
  diag_span where[8];
  int ok = 1;
  for (int i = 0; i < nf + nt; i++) {
    const ast_range *g = i < nf ? &it->list.v[i] : &it->list2.v[i - nf];
    where[i] = g->lo;
    if (front_index(c, g->lo, g->bad, &idx[i])) {
      ok = 0;
      idx[i] = -1;
      continue;
    }
    if (c->qubits > 0 && idx[i] >= c->qubits) {
      diag_report(c->d, DIAG_ERROR, g->lo, "spin orbital %ld is beyond the register (spin orbitals 0..%d)", idx[i],
                  c->qubits - 1);
      diag_note(c->d, c->r->orbitals.active_span, "%d active orbitals give %d spin orbitals", c->qubits / 2, c->qubits);
      ok = 0;
      continue;
    }
    for (int j = 0; j < i; j++)
      if (idx[j] == idx[i]) {
        diag_report(c->d, DIAG_ERROR, g->lo, "spin orbital %ld appears twice in the excitation", idx[i]);
        diag_note(c->d, where[j], "first here");
        ok = 0;
        break;
      }
  }
  if (!ok) return -1;
  rule->nexcite = nf;
  rule->from = xcalloc((size_t)nf, sizeof(int));
  rule->to = xcalloc((size_t)nf, sizeof(int));
  for (int i = 0; i < nf; i++) {
    rule->from[i] = (int)idx[i];
    rule->to[i] = (int)idx[nf + i];
  }
  return 0;
}

static void resolve_pool(rs *c) {
  ast_stmt *s = c->one[RS_POOL];
  if (!s) return;
  ir_recipe *r = c->r;
  r->pool_span = s->span;
  r->rules = xcalloc((size_t)s->items.n + 1, sizeof *r->rules);
  for (int i = 0; i < s->items.n; i++) {
    ast_stmt *it = s->items.v[i];
    ir_rule rule;
    memset(&rule, 0, sizeof rule);
    rule.span = it->span;
    int rc;
    if (it->kind == AST_RULE) rc = rule_words_kind(c, it, &rule);
    else if (it->kind == AST_PAULI) {
      rule.kind = IR_RULE_WORD;
      rc = rule_pauli(c, it, &rule);
    } else {
      rule.kind = IR_RULE_EXCITE;
      rc = rule_excite(c, it, &rule);
    }
    if (rc == 0) r->rules[r->nrules++] = rule;
    else {
      free(rule.letters);
      free(rule.from);
      free(rule.to);
    }
  }
}

static void resolve_selection(rs *c) {
  ir_recipe *r = c->r;
  ast_stmt *s = c->one[RS_CHOOSE];
  if (s) {
    c->cur = order_of(c, s);
    ir_choose *ch = &r->choose;
    ch->span = s->span;
    long n = 0;
    double t = 0;
    int ok = 1;
    if (s->variant == IR_CHOOSE_COUNT || s->variant == IR_CHOOSE_GROW)
      ok &= front_eval_int(c, s->e[0], "the number of generators", 1, 1000000000L, &n) == 0;
    if (s->variant == IR_CHOOSE_ABOVE || s->variant == IR_CHOOSE_GROW) {
      const char *what = s->variant == IR_CHOOSE_ABOVE ? "the gradient threshold" : "the stopping gradient";
      if (front_eval_number(c, s->e[1], what, &t) == 0) {
        if (!(t > 0)) {
          char b[32];
          diag_report(c->d, DIAG_ERROR, s->e[1]->span, "%s must be positive, not %s", what, util_fmt_double(b, t));
          ok = 0;
        }
      } else ok = 0;
    }
    if (ok) {
      ch->kind = (ir_choose_kind)s->variant;
      ch->count = (int)n;
      ch->threshold = t;
    }
  }
  if (c->one[RS_ORDER]) {
    r->order = (ir_order)c->one[RS_ORDER]->variant;
    r->order_span = c->one[RS_ORDER]->span;
  }
  if ((s = c->one[RS_TROTTER])) {
    c->cur = order_of(c, s);
    long k;
    if (front_eval_int(c, s->e[0], "the number of Trotter steps", 1, 1000000, &k) == 0) r->trotter = (int)k;
    r->trotter_span = s->span;
  }
}

static void resolve_optimize(rs *c) {
  ast_stmt *s = c->one[RS_OPTIMIZE];
  if (!s) return;
  ir_optimize *o = &c->r->optimize;
  o->span = s->span;
  c->cur = order_of(c, s);
  static const char *const methods[] = {"lbfgs", "slsqp", "bobyqa", "cobyla", "nelder-mead"};
  int m = word_index(c, s->name, methods, 5);
  if (m < 0) unknown_word(c, s->name, "optimizer", "optimizers", methods, 5);
  else o->method = (ir_method)m;
  static const char *const settings[] = {"tolerance", "iterations", "starts", "seed", "guess"};
  const ast_stmt *seen[5] = {0};
  for (int i = 0; i < s->items.n; i++) {
    ast_stmt *it = s->items.v[i];
    int k = word_index(c, it->name, settings, 5);
    if (k < 0) {
      size_t len;
      const char *t = ast_text(c->d, it->name, &len);
      diag_report(c->d, DIAG_ERROR, it->name, "unknown option `%.*s` for `optimize`", (int)len, t);
      const char *sg = front_suggest(t, len, settings, 5);
      diag_help(c->d, "%s%s%s`optimize` takes: tolerance, iterations, starts, seed, guess", sg ? "did you mean `" : "",
                sg ? sg : "", sg ? "`? " : "");
      continue;
    }
    if (seen[k]) {
      diag_report(c->d, DIAG_ERROR, it->name, "`%s` is given twice", settings[k]);
      diag_note(c->d, seen[k]->span, "first given here");
      continue;
    }
    seen[k] = it;
    long n;
    double t;
    switch (k) {
    case 0:
      if (front_eval_number(c, it->e[0], "the tolerance", &t) == 0) {
        if (t > 0) o->tolerance = t;
        else {
          char b[32];
          diag_report(c->d, DIAG_ERROR, it->e[0]->span, "the tolerance must be positive, not %s", util_fmt_double(b, t));
        }
      }
      break;
    case 1:
      if (front_eval_int(c, it->e[0], "the number of iterations", 1, 1000000000L, &n) == 0) o->iterations = (int)n;
      break;
    case 2:
      if (front_eval_int(c, it->e[0], "the number of starts", 1, 1000000, &n) == 0) o->starts = (int)n;
      break;
    case 3:
      if (front_eval_int(c, it->e[0], "the seed", 0, 9007199254740992L, &n) == 0) o->seed = (uint64_t)n;
      break;
    default: {
      static const char *const guesses[] = {"zeros", "mp2"};
      int g = it->e[0]->kind == AST_E_NAME ? word_index(c, it->e[0]->span, guesses, 2) : -1;
      if (g < 0) {
        diag_report(c->d, DIAG_ERROR, it->e[0]->span, "`guess` takes `zeros` or `mp2`");
        diag_help(c->d, "the first start begins at all angles zero, or at the MP2 amplitudes");
      } else {
        o->guess = (ir_guess)g;
      }
    }
    }
  }
}

static void resolve_emits(rs *c) {
  ir_recipe *r = c->r;
  static const char *const formats[] = {"listing", "qasm2", "qasm3"};
  const ast_stmt **first = xcalloc((size_t)c->nst + 1, sizeof *first);
  r->emits = xcalloc((size_t)c->nst + 1, sizeof *r->emits);
  char *topdir = util_dirname(diag_file_path(c->d, c->top));
  for (int i = 0; i < c->nst; i++) {
    ast_stmt *s = c->st[i];
    if (s->kind != AST_EMIT) continue;
    int f = word_index(c, s->name, formats, 3);
    if (f < 0) unknown_word(c, s->name, "output format", "output formats", formats, 3);
    char *p = unquote(c->d, s->word);
    if (!*p) {
      diag_report(c->d, DIAG_ERROR, s->word, "`emit` needs a file name");
      free(p);
      continue;
    }
    char *j = util_path_join(topdir, p);
    char *path = path_normalize(j);
    free(j);
    free(p);
    int dup = -1;
    for (int k = 0; k < r->nemits; k++)
      if (strcmp(r->emits[k].path, path) == 0) dup = k;
    if (dup >= 0) {
      diag_report(c->d, DIAG_ERROR, s->word, "two outputs go to the same file `%s`", path);
      diag_note(c->d, first[dup]->span, "the first is written here");
      diag_help(c->d, "give each `emit` its own file");
      free(path);
      continue;
    }
    if (f < 0) {
      free(path);
      continue;
    }
    first[r->nemits] = s;
    ir_emit *e = &r->emits[r->nemits++];
    e->format = (ir_emit_format)f;
    e->path = path;
    e->span = s->span;
  }
  free(topdir);
  free(first);
}

/* ---- driver ------------------------------------------------------------- */

static void recipe_defaults(ir_recipe *r) {
  r->version = 1;
  r->npoints = 0;
  r->scan.span = DIAG_NOWHERE;
  r->multiplicity = 0; /* decided in space.c */
  r->basis_span = r->integrals_span = r->encoding_span = r->pool_span = r->order_span = r->trotter_span = DIAG_NOWHERE;
  r->orbitals.freeze_span = r->orbitals.active_span = DIAG_NOWHERE;
  r->encoding = IR_ENC_JORDAN_WIGNER;
  r->reference.kind = IR_REF_HARTREE_FOCK;
  r->reference.span = DIAG_NOWHERE;
  for (int k = 0; k < IR_SYM_COUNT; k++) r->keep[k] = (ir_keep){IR_KEEP_NONE, 0, DIAG_NOWHERE};
  r->choose = (ir_choose){IR_CHOOSE_ALL, 0, 0, DIAG_NOWHERE};
  r->order = IR_ORDER_WRITTEN;
  r->trotter = 1;
  r->optimize = (ir_optimize){IR_OPT_LBFGS, 1e-8, 500, 1, 7, IR_GUESS_ZEROS, DIAG_NOWHERE};
}

static void rs_free(rs *c) {
  for (int i = 0; i < c->nasts; i++) ast_file_free(c->asts[i]);
  free(c->asts);
  free(c->st);
  for (int i = 0; i < c->nstack; i++) free(c->stack[i]);
  free(c->stack);
  for (int i = 0; i < c->nincluded; i++) free(c->included[i]);
  free(c->included);
  free(c->names);
}

ir_recipe *front_resolve(diag_ctx *d, int32_t file, const front_opts *opts) {
  rs c;
  memset(&c, 0, sizeof c);
  c.d = d;
  c.top = file;
  c.point = -1;
  c.qubits = -1;
  c.o.ctx = opts ? opts->ctx : NULL;
  c.o.load = opts && opts->load ? opts->load : default_load;
  c.o.count_orbitals = opts && opts->count_orbitals ? opts->count_orbitals : default_count;
  c.o.fcidump_header = opts && opts->fcidump_header ? opts->fcidump_header : default_header;
  c.r = xcalloc(1, sizeof *c.r);
  recipe_defaults(c.r);
  c.r->path = xstrdup(diag_file_path(d, file));
  int before = diag_errors(d);

  collect(&c, file, 1);
  if (c.syntax_errors == 0) {
    scan_statements(&c);
    evaluate_names(&c);
    resolve_atoms(&c);
    resolve_simple_molecule(&c);
    front_space(&c);
    resolve_encoding(&c);
    resolve_reference(&c);
    resolve_keeps(&c);
    resolve_pool(&c);
    resolve_selection(&c);
    resolve_optimize(&c);
    resolve_emits(&c);
  }
  rs_free(&c);
  if (c.syntax_errors || diag_errors(d) > before) {
    ir_recipe_free(c.r);
    return NULL;
  }
  return c.r;
}

ir_recipe *front_load(diag_ctx *d, const char *path) {
  int32_t f = diag_load_file(d, path, DIAG_NOWHERE);
  if (f < 0) return NULL;
  return front_resolve(d, f, NULL);
}
