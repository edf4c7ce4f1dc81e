/* json.c — the JSON report, schema v1 of DESIGN.md plus the additive fields
 * named in report.h.  Absent values are absent; keys in a fixed order, so
 * the same run gives the same bytes (timings can be left out). */
#include "config.h"

#include "cairn/json.h"
#include "cairn/report.h"
#include "cairn/util.h"
#include "report/report_int.h"

#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Add a number when it is there (and finite: JSON has no NaN). */
static void num(cJSON *o, const char *key, int has, double v) {
  if (has && isfinite(v)) cJSON_AddItemToObject(o, key, json_number(v));
}

/* An array of numbers (a non-finite entry becomes null: the position counts). */
static cJSON *numbers(const double *v, int n) {
  cJSON *a = cJSON_CreateArray();
  for (int i = 0; i < n; i++) cJSON_AddItemToArray(a, isfinite(v[i]) ? json_number(v[i]) : cJSON_CreateNull());
  return a;
}

static cJSON *energies(const rep_point *p) {
  const rep_energies *e = &p->e;
  cJSON *o = cJSON_CreateObject();
  num(o, "nuclear", e->has_nuclear, e->nuclear);
  num(o, "hf", e->has_hf, e->hf);
  num(o, "mp2", e->has_mp2, e->mp2);
  num(o, "ccsd", e->has_ccsd, e->ccsd);
  num(o, "exact", e->has_exact, e->exact);
  num(o, "ansatz", e->has_ansatz, e->ansatz);
  if (e->has_ccsd && isfinite(e->ccsd) && !e->ccsd_converged) cJSON_AddFalseToObject(o, "ccsd_converged");
  return o;
}

static cJSON *point(const rep_run *r, const rep_point *p, unsigned flags) {
  cJSON *o = cJSON_CreateObject();
  cJSON *params = cJSON_AddObjectToObject(o, "params");
  if (r->param_name) num(params, r->param_name, p->has_param, p->param);
  cJSON_AddNumberToObject(o, "qubits", p->qubits);
  cJSON_AddNumberToObject(o, "electrons", p->electrons);
  cJSON_AddNumberToObject(o, "orbitals", p->orbitals);
  cJSON_AddItemToObject(o, "energies", energies(p));
  double err = 0;
  int has_err = rep_point_error(p, REP_S_ANSATZ, &err);
  num(o, "error", has_err, err);
  num(o, "exact_spin_squared", p->e.has_exact, p->exact_s2);
  if (p->nparams > 0 && p->params) cJSON_AddItemToObject(o, "parameters", numbers(p->params, p->nparams));
  cJSON *gens = cJSON_AddArrayToObject(o, "generators");
  for (int g = 0; g < p->ngens; g++) {
    const rep_generator *x = &p->gens[g];
    cJSON *j = cJSON_CreateObject();
    cJSON_AddStringToObject(j, "kind", x->kind ? x->kind : "");
    cJSON_AddStringToObject(j, "text", x->text ? x->text : "");
    num(j, "gradient", 1, x->gradient);
    if (x->has_chosen) num(j, "chosen_gradient", 1, x->chosen);
    num(j, "theta", 1, x->theta);
    cJSON_AddNumberToObject(j, "cnot", x->cnot);
    cJSON_AddItemToArray(gens, j);
  }
  if (p->sym.has) {
    cJSON *s = cJSON_AddObjectToObject(o, "symmetry");
    num(s, "particles", 1, p->sym.particles);
    num(s, "spin_z", 1, p->sym.spin_z);
    num(s, "spin_squared", 1, p->sym.spin_squared);
  }
  if (p->nchecks > 0) {
    cJSON *cs = cJSON_AddArrayToObject(o, "checks");
    for (int c = 0; c < p->nchecks; c++) {
      const rep_check *k = &p->checks[c];
      cJSON *j = cJSON_CreateObject();
      cJSON_AddStringToObject(j, "symmetry", k->symmetry ? k->symmetry : "");
      num(j, "value", 1, k->value);
      num(j, "target", 1, k->target);
      num(j, "tolerance", 1, k->tolerance);
      cJSON_AddBoolToObject(j, "passed", k->passed != 0);
      cJSON_AddItemToArray(cs, j);
    }
  }
  if (p->has_gates) {
    cJSON *g = cJSON_AddObjectToObject(o, "gates");
    cJSON_AddNumberToObject(g, "cnot", (double)p->cnot);
    cJSON_AddNumberToObject(g, "single", (double)p->single);
    cJSON_AddNumberToObject(g, "depth", (double)p->depth);
  }
  if (p->has_optimizer) {
    cJSON *m = cJSON_AddObjectToObject(o, "optimizer");
    cJSON_AddStringToObject(m, "method", p->method ? p->method : "");
    cJSON_AddNumberToObject(m, "iterations", p->iterations);
    cJSON_AddBoolToObject(m, "converged", p->converged != 0);
    if (p->nstarts > 0) {
      cJSON_AddNumberToObject(m, "starts", p->nstarts);
      if (p->start_energies) {
        cJSON_AddNumberToObject(m, "best_start", p->best_start);
        cJSON_AddItemToObject(m, "start_energies", numbers(p->start_energies, p->nstarts));
      }
    }
    if (p->ntrace > 0 && p->trace) cJSON_AddItemToObject(m, "trace", numbers(p->trace, p->ntrace));
  }
  num(o, "seconds", !(flags & REP_NO_TIME), p->seconds);
  if (p->failure) cJSON_AddStringToObject(o, "failure", p->failure);
  return o;
}

cJSON *rep_json(const rep_run *r, unsigned flags) {
  cJSON *o = cJSON_CreateObject();
  cJSON_AddNumberToObject(o, "cairn", 1);
  cJSON_AddStringToObject(o, "recipe", r->recipe ? r->recipe : "");
  cJSON_AddStringToObject(o, "file", r->file ? r->file : "");
  if (r->basis) cJSON_AddStringToObject(o, "basis", r->basis);
  if (r->param_name) {
    cJSON *s = cJSON_AddObjectToObject(o, "scan");
    cJSON_AddStringToObject(s, "name", r->param_name);
    cJSON_AddStringToObject(s, "unit", r->param_unit ? r->param_unit : "");
  }
  cJSON *pts = cJSON_AddArrayToObject(o, "points");
  for (int i = 0; i < r->npoints; i++) cJSON_AddItemToArray(pts, point(r, &r->points[i], flags));
  return o;
}

int rep_write_json(const rep_run *r, const char *path, unsigned flags) {
  cJSON *j = rep_json(r, flags);
  char *s = json_print(j);
  cJSON_Delete(j);
  size_t n = strlen(s);
  s = xrealloc(s, n + 2);
  s[n] = '\n';
  s[n + 1] = 0;
  int rc = util_write_atomic(path, s, n + 1);
  int e = errno;
  free(s);
  errno = e;
  return rc;
}
