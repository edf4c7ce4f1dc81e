/* run.c — the report data model: freeing, what counts as a value, where the
 * table and the figure go (report.h). */
#include "config.h"

#include "cairn/report.h"
#include "cairn/util.h"
#include "report/report_int.h"

#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void rep_run_free(rep_run *r) {
  if (!r) return;
  for (int i = 0; i < r->npoints; i++) {
    rep_point *p = &r->points[i];
    for (int g = 0; g < p->ngens; g++) {
      free(p->gens[g].kind);
      free(p->gens[g].text);
    }
    free(p->gens);
    for (int c = 0; c < p->nchecks; c++) free(p->checks[c].symmetry);
    free(p->checks);
    free(p->method);
    free(p->start_energies);
    free(p->trace);
    free(p->params);
    free(p->failure);
  }
  free(r->points);
  free(r->recipe);
  free(r->file);
  free(r->param_name);
  free(r->param_unit);
  free(r->basis);
  memset(r, 0, sizeof *r);
}

int rep_is_scan(const rep_run *r) { return r->param_name != NULL; }

int rep_point_energy(const rep_point *p, rep_series s, double *e) {
  const rep_energies *x = &p->e;
  int has = 0;
  double v = 0;
  switch (s) {
  case REP_S_HF: has = x->has_hf, v = x->hf; break;
  case REP_S_MP2: has = x->has_mp2, v = x->mp2; break;
  case REP_S_CCSD: has = x->has_ccsd && x->ccsd_converged, v = x->ccsd; break;
  case REP_S_EXACT: has = x->has_exact, v = x->exact; break;
  case REP_S_ANSATZ: has = x->has_ansatz, v = x->ansatz; break;
  }
  if (!has || !isfinite(v)) return 0;
  *e = v;
  return 1;
}

int rep_point_error(const rep_point *p, rep_series s, double *err) {
  if (s == REP_S_ANSATZ && p->has_error && isfinite(p->error)) {
    *err = p->error;
    return 1;
  }
  double e, x;
  if (s == REP_S_EXACT || !rep_point_energy(p, s, &e) || !rep_point_energy(p, REP_S_EXACT, &x)) return 0;
  *err = e - x;
  return 1;
}

const char *rep_fmt_num(char *buf, double x) {
  if (x == 0 || !isfinite(x)) {
    snprintf(buf, 40, "%g", x == 0 ? 0.0 : x);
    return buf;
  }
  int prec = 1;
  for (; prec < 17; prec++) {
    snprintf(buf, 40, "%.*e", prec - 1, x);
    if (strtod(buf, NULL) == x) break;
  }
  snprintf(buf, 40, "%.*e", prec - 1, x);
  int e = atoi(strchr(buf, 'e') + 1); /* the exponent of the rounded value */
  if (e >= -5 && e < 15) {
    int dec = prec - 1 - e;
    snprintf(buf, 40, "%.*f", dec > 0 ? dec : 0, x);
  } else {
    char m[26]; /* sign, 17 digits, point, exponent */
    snprintf(m, sizeof m, "%.*e", prec - 1, x);
    *strchr(m, 'e') = 0;
    snprintf(buf, 40, "%se%d", m, e);
  }
  return buf;
}

/* path with its extension (the part after the last '.' of the last
 * component, when there is one) replaced by ext (".csv"). */
static char *with_ext(const char *path, const char *ext) {
  const char *slash = strrchr(path, '/');
  const char *base = slash ? slash + 1 : path;
  const char *dot = strrchr(base, '.');
  size_t keep = dot && dot != base ? (size_t)(dot - path) : strlen(path);
  return xasprintf("%.*s%s", (int)keep, path, ext);
}

void rep_paths_derive(const char *recipe, const char *json, const char *plot, rep_paths *out) {
  if (plot) {
    out->svg = xstrdup(plot);
    out->csv = with_ext(plot, ".csv");
    if (strcmp(out->csv, out->svg) == 0) { /* --plot fig.csv: do not write both into one file */
      free(out->csv);
      out->csv = xasprintf("%s.csv", plot);
    }
    return;
  }
  if (json) {
    out->csv = with_ext(json, ".csv");
    out->svg = with_ext(json, ".svg");
    return;
  }
  const char *slash = strrchr(recipe ? recipe : "", '/');
  const char *base = recipe ? (slash ? slash + 1 : recipe) : "";
  if (!*base) base = "cairn-run";
  out->csv = with_ext(base, ".csv");
  out->svg = with_ext(base, ".svg");
}

void rep_paths_free(rep_paths *p) {
  free(p->csv);
  free(p->svg);
  p->csv = p->svg = NULL;
}

int rep_write_outputs(const rep_run *r, const rep_paths *p, unsigned flags, const char **failed) {
  if (rep_write_csv(r, p->csv, flags) != 0) {
    if (failed) *failed = p->csv;
    return -1;
  }
  int rc = 0;
  if (rep_is_scan(r)) rc = rep_write_scan_svg(r, p->svg);
  else if (r->npoints == 1 && r->points[0].ntrace > 0) rc = rep_write_convergence_svg(r, 0, p->svg);
  if (rc != 0 && failed) *failed = p->svg;
  return rc;
}
