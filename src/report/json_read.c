/* json_read.c — a JSON report read back into a rep_run (report.h), so a saved
 * run can be tabulated and plotted again.  Every message names the field
 * ("points[2].energies.hf") and what was expected there. */
#include "config.h"

#include "cairn/report.h"
#include "cairn/util.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct reader {
  char *err;
  size_t errlen;
  int bad;
} reader;

static void fail(reader *rd, const char *fmt, ...) __attribute__((format(printf, 2, 3)));
static void fail(reader *rd, const char *fmt, ...) {
  if (rd->bad++) return; /* keep the first message */
  va_list ap;
  va_start(ap, fmt);
  vsnprintf(rd->err, rd->errlen, fmt, ap);
  va_end(ap);
}

/* An optional number: absent leaves *has 0; anything but a number is an error. */
static double opt_num(reader *rd, const cJSON *o, const char *key, const char *where, int *has) {
  const cJSON *v = cJSON_GetObjectItemCaseSensitive(o, key);
  if (has) *has = 0;
  if (!v) return 0;
  if (!cJSON_IsNumber(v)) {
    fail(rd, "%s.%s: expected a number", where, key);
    return 0;
  }
  if (has) *has = 1;
  return v->valuedouble;
}

static double req_num(reader *rd, const cJSON *o, const char *key, const char *where) {
  int has;
  double v = opt_num(rd, o, key, where, &has);
  if (!has && !rd->bad) fail(rd, "%s.%s: missing (expected a number)", where, key);
  return v;
}

/* A count: a whole number in [0, 2^31). */
static long req_count(reader *rd, const cJSON *o, const char *key, const char *where) {
  double v = req_num(rd, o, key, where);
  if (rd->bad) return 0;
  if (!(v >= 0 && v < 2147483648.0) || v != floor(v)) {
    fail(rd, "%s.%s: expected a whole number >= 0, not %g", where, key, v);
    return 0;
  }
  return (long)v;
}

static char *opt_str(reader *rd, const cJSON *o, const char *key, const char *where) {
  const cJSON *v = cJSON_GetObjectItemCaseSensitive(o, key);
  if (!v) return NULL;
  if (!cJSON_IsString(v)) {
    fail(rd, "%s.%s: expected a string", where, key);
    return NULL;
  }
  return xstrdup(v->valuestring);
}

static int req_bool(reader *rd, const cJSON *o, const char *key, const char *where) {
  const cJSON *v = cJSON_GetObjectItemCaseSensitive(o, key);
  if (!cJSON_IsBool(v)) {
    fail(rd, "%s.%s: %s (expected true or false)", where, key, v ? "not a boolean" : "missing");
    return 0;
  }
  return cJSON_IsTrue(v);
}

/* An optional object member: absent gives NULL; not an object is an error. */
static const cJSON *opt_obj(reader *rd, const cJSON *o, const char *key, const char *where) {
  const cJSON *v = cJSON_GetObjectItemCaseSensitive(o, key);
  if (v && !cJSON_IsObject(v)) {
    fail(rd, "%s.%s: expected an object", where, key);
    return NULL;
  }
  return v;
}

static const cJSON *opt_arr(reader *rd, const cJSON *o, const char *key, const char *where) {
  const cJSON *v = cJSON_GetObjectItemCaseSensitive(o, key);
  if (v && !cJSON_IsArray(v)) {
    fail(rd, "%s.%s: expected an array", where, key);
    return NULL;
  }
  return v;
}

/* An array of numbers (null reads as NaN); *n its length. */
static double *numbers(reader *rd, const cJSON *a, const char *where, const char *key, int *n) {
  int len = cJSON_GetArraySize(a);
  double *v = xcalloc((size_t)len + 1, sizeof *v);
  for (int i = 0; i < len; i++) {
    const cJSON *x = cJSON_GetArrayItem(a, i);
    if (cJSON_IsNumber(x)) v[i] = x->valuedouble;
    else if (cJSON_IsNull(x)) v[i] = NAN;
    else fail(rd, "%s.%s[%d]: expected a number", where, key, i);
  }
  *n = len;
  return v;
}

static void read_energies(reader *rd, const cJSON *e, const char *w, rep_energies *x) {
  x->nuclear = opt_num(rd, e, "nuclear", w, &x->has_nuclear);
  x->hf = opt_num(rd, e, "hf", w, &x->has_hf);
  x->mp2 = opt_num(rd, e, "mp2", w, &x->has_mp2);
  x->ccsd = opt_num(rd, e, "ccsd", w, &x->has_ccsd);
  x->exact = opt_num(rd, e, "exact", w, &x->has_exact);
  x->ansatz = opt_num(rd, e, "ansatz", w, &x->has_ansatz);
  x->ccsd_converged = x->has_ccsd;
  const cJSON *c = cJSON_GetObjectItemCaseSensitive(e, "ccsd_converged");
  if (c) x->ccsd_converged = req_bool(rd, e, "ccsd_converged", w);
}

static void read_point(reader *rd, const cJSON *j, const char *w, const char *pname, rep_point *p) {
  char sub[96];
  const cJSON *params = opt_obj(rd, j, "params", w);
  if (params && pname) {
    snprintf(sub, sizeof sub, "%s.params", w);
    p->param = opt_num(rd, params, pname, sub, &p->has_param);
  }
  p->qubits = (int)req_count(rd, j, "qubits", w);
  p->electrons = (int)req_count(rd, j, "electrons", w);
  p->orbitals = (int)req_count(rd, j, "orbitals", w);
  const cJSON *e = opt_obj(rd, j, "energies", w);
  if (e) {
    snprintf(sub, sizeof sub, "%s.energies", w);
    read_energies(rd, e, sub, &p->e);
  }
  p->error = opt_num(rd, j, "error", w, &p->has_error);
  int has;
  p->exact_s2 = opt_num(rd, j, "exact_spin_squared", w, &has);
  const cJSON *pa = opt_arr(rd, j, "parameters", w);
  if (pa) p->params = numbers(rd, pa, w, "parameters", &p->nparams);
  const cJSON *gens = opt_arr(rd, j, "generators", w);
  if (gens) {
    p->ngens = cJSON_GetArraySize(gens);
    p->gens = xcalloc((size_t)p->ngens + 1, sizeof *p->gens);
    for (int g = 0; g < p->ngens && !rd->bad; g++) {
      const cJSON *x = cJSON_GetArrayItem(gens, g);
      snprintf(sub, sizeof sub, "%s.generators[%d]", w, g);
      if (!cJSON_IsObject(x)) {
        fail(rd, "%s: expected an object", sub);
        break;
      }
      p->gens[g].kind = opt_str(rd, x, "kind", sub);
      p->gens[g].text = opt_str(rd, x, "text", sub);
      p->gens[g].gradient = req_num(rd, x, "gradient", sub);
      p->gens[g].chosen = opt_num(rd, x, "chosen_gradient", sub, &p->gens[g].has_chosen);
      p->gens[g].theta = req_num(rd, x, "theta", sub);
      p->gens[g].cnot = (int)req_count(rd, x, "cnot", sub);
    }
  }
  const cJSON *s = opt_obj(rd, j, "symmetry", w);
  if (s) {
    snprintf(sub, sizeof sub, "%s.symmetry", w);
    p->sym.has = 1;
    p->sym.particles = req_num(rd, s, "particles", sub);
    p->sym.spin_z = req_num(rd, s, "spin_z", sub);
    p->sym.spin_squared = req_num(rd, s, "spin_squared", sub);
  }
  const cJSON *cs = opt_arr(rd, j, "checks", w);
  if (cs) {
    p->nchecks = cJSON_GetArraySize(cs);
    p->checks = xcalloc((size_t)p->nchecks + 1, sizeof *p->checks);
    for (int c = 0; c < p->nchecks && !rd->bad; c++) {
      const cJSON *x = cJSON_GetArrayItem(cs, c);
      snprintf(sub, sizeof sub, "%s.checks[%d]", w, c);
      if (!cJSON_IsObject(x)) {
        fail(rd, "%s: expected an object", sub);
        break;
      }
      p->checks[c].symmetry = opt_str(rd, x, "symmetry", sub);
      p->checks[c].value = req_num(rd, x, "value", sub);
      p->checks[c].target = req_num(rd, x, "target", sub);
      p->checks[c].tolerance = req_num(rd, x, "tolerance", sub);
      p->checks[c].passed = req_bool(rd, x, "passed", sub);
    }
  }
  const cJSON *g = opt_obj(rd, j, "gates", w);
  if (g) {
    snprintf(sub, sizeof sub, "%s.gates", w);
    p->has_gates = 1;
    p->cnot = req_count(rd, g, "cnot", sub);
    p->single = req_count(rd, g, "single", sub);
    p->depth = req_count(rd, g, "depth", sub);
  }
  const cJSON *m = opt_obj(rd, j, "optimizer", w);
  if (m) {
    snprintf(sub, sizeof sub, "%s.optimizer", w);
    p->has_optimizer = 1;
    p->method = opt_str(rd, m, "method", sub);
    p->iterations = (int)req_count(rd, m, "iterations", sub);
    p->converged = req_bool(rd, m, "converged", sub);
    if (cJSON_GetObjectItemCaseSensitive(m, "starts")) p->nstarts = (int)req_count(rd, m, "starts", sub);
    const cJSON *se = opt_arr(rd, m, "start_energies", sub);
    if (se) {
      int n;
      p->start_energies = numbers(rd, se, sub, "start_energies", &n);
      if (n != p->nstarts) fail(rd, "%s.start_energies: %d entries for %d starts", sub, n, p->nstarts);
      p->best_start = (int)req_count(rd, m, "best_start", sub);
      if (!rd->bad && p->best_start >= p->nstarts)
        fail(rd, "%s.best_start: %d is not one of the %d starts", sub, p->best_start, p->nstarts);
    }
    const cJSON *t = opt_arr(rd, m, "trace", sub);
    if (t) p->trace = numbers(rd, t, sub, "trace", &p->ntrace);
  }
  p->seconds = opt_num(rd, j, "seconds", w, &has);
  p->failure = opt_str(rd, j, "failure", w);
}

int rep_read_json(const cJSON *j, rep_run *out, char *err, size_t errlen) {
  reader rd = {err, errlen, 0};
  memset(out, 0, sizeof *out);
  if (errlen) err[0] = 0;
  if (!cJSON_IsObject(j)) {
    fail(&rd, "the report: expected an object");
    return -1;
  }
  const cJSON *v = cJSON_GetObjectItemCaseSensitive(j, "cairn");
  if (!cJSON_IsNumber(v) || v->valuedouble != 1) {
    fail(&rd, "cairn: expected 1 (report schema version 1)");
    return -1;
  }
  out->recipe = opt_str(&rd, j, "recipe", "report");
  out->file = opt_str(&rd, j, "file", "report");
  out->basis = opt_str(&rd, j, "basis", "report");
  const cJSON *scan = opt_obj(&rd, j, "scan", "report");
  if (scan) {
    out->param_name = opt_str(&rd, scan, "name", "scan");
    out->param_unit = opt_str(&rd, scan, "unit", "scan");
    if (!out->param_name && !rd.bad) fail(&rd, "scan.name: missing (expected a string)");
  }
  const cJSON *pts = opt_arr(&rd, j, "points", "report");
  if (!pts && !rd.bad) fail(&rd, "points: missing (expected an array)");
  if (!rd.bad) {
    out->npoints = cJSON_GetArraySize(pts);
    out->points = xcalloc((size_t)out->npoints + 1, sizeof *out->points);
    for (int i = 0; i < out->npoints && !rd.bad; i++) {
      char w[32];
      snprintf(w, sizeof w, "points[%d]", i);
      const cJSON *p = cJSON_GetArrayItem(pts, i);
      if (!cJSON_IsObject(p)) fail(&rd, "%s: expected an object", w);
      else read_point(&rd, p, w, out->param_name, &out->points[i]);
    }
  }
  if (rd.bad) {
    rep_run_free(out);
    return -1;
  }
  return 0;
}
