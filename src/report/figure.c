/* figure.c — the scan figure and the convergence figure of a run (report.h),
 * drawn with the private plot engine (plot.h). */
#include "config.h"

#include "cairn/report.h"
#include "cairn/util.h"
#include "report/plot.h"
#include "report/report_int.h"

#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

/* ORDER SERIES: the series of the energy panel, in legend order.  Colours
 * are the Okabe-Ito palette (distinguishable with colour-blind vision);
 * dashes tell the curves apart in grey print too. */
static const struct series {
  rep_series which;
  const char *id, *label;
  rep_style style;
} series[] = {
    {REP_S_HF, "hf", "HF", {"#e69f00", 2.0, "8,4", 0}},
    {REP_S_MP2, "mp2", "MP2", {"#56b4e9", 2.0, "2,3", 0}},
    {REP_S_CCSD, "ccsd", "CCSD", {"#009e73", 2.0, "8,3,2,3", 0}},
    {REP_S_EXACT, "exact", "exact (full CI)", {"#000000", 1.5, NULL, 0}},
    {REP_S_ANSATZ, "ansatz", "ansatz (VQE)", {"#d55e00", 2.5, NULL, 1}},
};
enum { NSERIES = (int)(sizeof series / sizeof series[0]) };

enum { FIG_W = 900, PANEL_X = 96, PANEL_W = 540, LEGEND_X = 660 };

/* The figure's footnote: what the numbers are and are not. */
static void footnote(util_buf *b, const rep_run *r, double y) {
  char *s;
  if (r->basis)
    s = xasprintf("Noise-free statevector simulation. Energies are exact only within the %s basis set and the "
                  "active space.",
                  r->basis);
  else
    s = xasprintf("Noise-free statevector simulation. Energies are exact only within the given integrals and the "
                  "active space.");
  rep_svg_text(b, PANEL_X, y, "start", 12, 0, NULL, "note", s);
  free(s);
}

/* The key to the off-axis triangles, beside a panel at height y. */
static void offscale_note(util_buf *b, double y) {
  rep_svg_offscale_mark(b, LEGEND_X + 15, y + 4, 1, "#000000");
  rep_svg_text(b, LEGEND_X + 38, y, "start", 12, 0, NULL, "note", "off the axis (|error| below");
  rep_svg_text(b, LEGEND_X + 38, y + 16, "start", 12, 0, NULL, "note", "its lowest value, or zero)");
}

static char *param_label(const rep_run *r) {
  const char *name = r->param_name ? r->param_name : "parameter";
  if (r->param_unit && *r->param_unit) return xasprintf("%s / %s", name, r->param_unit);
  return xstrdup(name);
}

static int write_buf(const char *path, util_buf *b) {
  int rc = util_write_atomic(path, b->s, b->len);
  int e = errno;
  util_buf_free(b);
  errno = e;
  return rc;
}

/* Range of the present values; returns how many there were. */
static int range(int n, const double *v, const int *ok, double *lo, double *hi) {
  int k = 0;
  for (int i = 0; i < n; i++) {
    if (!ok[i]) continue;
    if (k == 0 || v[i] < *lo) *lo = v[i];
    if (k == 0 || v[i] > *hi) *hi = v[i];
    k++;
  }
  return k;
}

/* Smallest positive and largest present value (for a log axis). */
static int range_pos(int n, const double *v, const int *ok, double *lo, double *hi) {
  int k = 0;
  for (int i = 0; i < n; i++) {
    if (!ok[i]) continue;
    if (v[i] > 0 && (k == 0 || v[i] < *lo)) *lo = v[i];
    if (k == 0 || v[i] > *hi) *hi = v[i];
    if (v[i] > 0) k++;
  }
  return k;
}

int rep_write_scan_svg(const rep_run *r, const char *path) {
  int n = r->npoints;
  double *x = xcalloc((size_t)n + 1, sizeof *x);
  double *val[NSERIES], *err[NSERIES];
  int *ok[NSERIES], *eok[NSERIES], has[NSERIES] = {0}, ehas[NSERIES] = {0};
  int xok_any = 0;
  double elo = 0, ehi = 0, rlo = 0, rhi = 0;
  int nval = 0, nerr = 0;
  for (int s = 0; s < NSERIES; s++) {
    val[s] = xcalloc((size_t)n + 1, sizeof **val);
    err[s] = xcalloc((size_t)n + 1, sizeof **err);
    ok[s] = xcalloc((size_t)n + 1, sizeof **ok);
    eok[s] = xcalloc((size_t)n + 1, sizeof **eok);
  }
  for (int i = 0; i < n; i++) {
    const rep_point *p = &r->points[i];
    if (!p->has_param || !isfinite(p->param)) continue;
    x[i] = p->param;
    xok_any = 1;
    for (int s = 0; s < NSERIES; s++) {
      ok[s][i] = rep_point_energy(p, series[s].which, &val[s][i]);
      has[s] |= ok[s][i];
      if (series[s].which != REP_S_EXACT) {
        eok[s][i] = rep_point_error(p, series[s].which, &err[s][i]);
        if (eok[s][i]) err[s][i] = fabs(err[s][i]) * 1e3; /* mEh */
        ehas[s] |= eok[s][i];
      }
    }
  }
  double xlo = 0, xhi = 0;
  int xk = 0;
  for (int i = 0; i < n; i++)
    if (r->points[i].has_param && isfinite(r->points[i].param)) {
      if (xk == 0 || x[i] < xlo) xlo = x[i];
      if (xk == 0 || x[i] > xhi) xhi = x[i];
      xk++;
    }
  for (int s = 0; s < NSERIES; s++) {
    double lo, hi;
    if (range(n, val[s], ok[s], &lo, &hi)) {
      if (nval == 0 || lo < elo) elo = lo;
      if (nval == 0 || hi > ehi) ehi = hi;
      nval++;
    }
    if (range_pos(n, err[s], eok[s], &lo, &hi)) {
      if (nerr == 0 || lo < rlo) rlo = lo;
      if (nerr == 0 || hi > rhi) rhi = hi;
      nerr++;
    }
  }
  int two = nerr > 0; /* the error panel needs the exact energy somewhere */
  int height = two ? 860 : 540;
  char *xl = param_label(r);
  char *title = xasprintf("%s: energy along %s", r->recipe ? r->recipe : "recipe",
                          r->param_name ? r->param_name : "the scan");
  util_buf b = {0};
  rep_svg_begin(&b, FIG_W, height, title);
  rep_svg_text(&b, PANEL_X, 30, "start", 17, 0, "bold", "title", title);

  rep_panel top = {.x = PANEL_X, .y = 56, .w = PANEL_W, .h = 360, .id = "energy", .xlabel = xl,
                   .ylabel = "energy / hartree"};
  rep_axis_linear(&top.ax, xok_any ? xlo : 0, xok_any ? xhi : 1, 7, REP_AXIS_TIGHT);
  rep_axis_linear(&top.ay, nval ? elo : -1, nval ? ehi : 0, 7, REP_AXIS_TIGHT);
  rep_panel_begin(&b, &top);
  for (int s = 0; s < NSERIES; s++) {
    if (!has[s]) continue;
    char *id = xasprintf("energy-%s", series[s].id);
    rep_panel_curve(&b, &top, id, &series[s].style, n, x, val[s], ok[s]);
    free(id);
  }
  rep_panel_end(&b);

  rep_legend_item items[NSERIES];
  int nitems = 0;
  for (int s = 0; s < NSERIES; s++)
    if (has[s]) items[nitems++] = (rep_legend_item){series[s].label, series[s].style};
  rep_svg_legend(&b, LEGEND_X, 72, nitems, items);

  double foot = 520;
  int off = 0;
  if (two) {
    rep_panel bot = {.x = PANEL_X, .y = 500, .w = PANEL_W, .h = 270, .id = "error", .xlabel = xl,
                     .ylabel = "|E - E(exact)| / mEh"};
    bot.ax = top.ax;
    /* keep 1.6 mEh on the axis whatever the errors are */
    double acc = REP_CHEMICAL_ACCURACY * 1e3;
    rep_axis_log(&bot.ay, fmin(rlo, acc / 1.6), fmax(rhi, acc * 6.25), 10);
    rep_panel_begin(&b, &bot);
    rep_panel_hline(&b, &bot, acc, "#cc0000", "6,3");
    for (int s = 0; s < NSERIES; s++) {
      if (!ehas[s]) continue;
      char *id = xasprintf("error-%s", series[s].id);
      off += rep_panel_curve(&b, &bot, id, &series[s].style, n, x, err[s], eok[s]);
      free(id);
    }
    rep_panel_hline_label(&b, &bot, acc, "#cc0000", "chemical accuracy 1.6 mEh");
    if (off) offscale_note(&b, bot.y + 14);
    rep_panel_end(&b);
    rep_svg_text(&b, PANEL_X, 482, "start", 14, 0, "bold", "subtitle", "error against the exact energy");
    foot = 840;
  } else {
    rep_svg_text(&b, LEGEND_X, 72 + 22.0 * nitems + 10, "start", 12, 0, NULL, "note",
                 "no exact energies: errors not shown");
  }
  footnote(&b, r, foot);
  rep_svg_end(&b);
  free(xl);
  free(title);
  free(x);
  for (int s = 0; s < NSERIES; s++) {
    free(val[s]);
    free(err[s]);
    free(ok[s]);
    free(eok[s]);
  }
  return write_buf(path, &b);
}

int rep_write_convergence_svg(const rep_run *r, int point, const char *path) {
  if (point < 0 || point >= r->npoints || r->points[point].ntrace < 1 || !r->points[point].trace) {
    errno = EINVAL;
    return -1;
  }
  const rep_point *p = &r->points[point];
  int n = p->ntrace;
  double *x = xcalloc((size_t)n, sizeof *x), *y = xcalloc((size_t)n, sizeof *y);
  int *ok = xcalloc((size_t)n, sizeof *ok);
  int exact = p->e.has_exact && isfinite(p->e.exact);
  for (int k = 0; k < n; k++) {
    x[k] = k + 1;
    ok[k] = isfinite(p->trace[k]);
    y[k] = exact ? fabs(p->trace[k] - p->e.exact) * 1e3 : p->trace[k];
  }
  char *title = xasprintf("%s: convergence of the best start%s%s%s", r->recipe ? r->recipe : "recipe",
                          p->method ? " (" : "", p->method ? p->method : "", p->method ? ")" : "");
  util_buf b = {0};
  rep_svg_begin(&b, FIG_W, 520, title);
  rep_svg_text(&b, PANEL_X, 30, "start", 17, 0, "bold", "title", title);
  rep_panel pan = {.x = PANEL_X, .y = 56, .w = PANEL_W, .h = 360, .id = "convergence", .xlabel = "iteration",
                   .ylabel = exact ? "|E - E(exact)| / mEh" : "energy / hartree"};
  rep_axis_linear(&pan.ax, 1, n, 7, REP_AXIS_INTEGER | REP_AXIS_TIGHT);
  double lo = 0, hi = 0;
  rep_style st = {"#d55e00", 2.0, NULL, n <= 60};
  if (exact) {
    double acc = REP_CHEMICAL_ACCURACY * 1e3;
    if (!range_pos(n, y, ok, &lo, &hi)) lo = hi = acc;
    rep_axis_log(&pan.ay, fmin(lo, acc / 1.6), fmax(hi, acc * 6.25), 12);
    rep_panel_begin(&b, &pan);
    rep_panel_hline(&b, &pan, acc, "#cc0000", "6,3");
  } else {
    if (!range(n, y, ok, &lo, &hi)) lo = -1, hi = 0;
    rep_axis_linear(&pan.ay, lo, hi, 7, REP_AXIS_TIGHT);
    rep_panel_begin(&b, &pan);
  }
  int off = rep_panel_curve(&b, &pan, "convergence-ansatz", &st, n, x, y, ok);
  if (exact) rep_panel_hline_label(&b, &pan, REP_CHEMICAL_ACCURACY * 1e3, "#cc0000", "chemical accuracy 1.6 mEh");
  rep_panel_end(&b);
  rep_legend_item item = {exact ? "ansatz (VQE) error" : "ansatz (VQE) energy", st};
  rep_svg_legend(&b, LEGEND_X, 72, 1, &item);
  if (off && exact) offscale_note(&b, 110);
  footnote(&b, r, 500);
  rep_svg_end(&b);
  free(title);
  free(x);
  free(y);
  free(ok);
  return write_buf(path, &b);
}
