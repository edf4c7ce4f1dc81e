/* plot.c — axes with nice ticks, panels and curves as plain SVG text (plot.h). */
#include "config.h"

#include "report/plot.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* Nice numbers after Heckbert ("Nice numbers for graph labels", Graphics
 * Gems, 1990): the mantissa is snapped to 1, 2, 5 or 10. */
double rep_nice_number(double x, int round) {
  if (!(x > 0) || !isfinite(x)) return 1;
  double e = floor(log10(x));
  double p = pow(10, e);
  double f = x / p, nf;
  if (round) nf = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
  else nf = f <= 1 + 1e-12 ? 1 : f <= 2 + 1e-12 ? 2 : f <= 5 + 1e-12 ? 5 : 10;
  return nf * p;
}

/* Ticks at whole multiples of the step, so the labels never accumulate
 * rounding. */
void rep_axis_linear(rep_axis *a, double dmin, double dmax, int target, unsigned flags) {
  int integer = (flags & REP_AXIS_INTEGER) != 0;
  memset(a, 0, sizeof *a);
  if (!isfinite(dmin) || !isfinite(dmax)) dmin = 0, dmax = 1;
  if (dmin > dmax) {
    double t = dmin;
    dmin = dmax;
    dmax = t;
  }
  if (dmax - dmin <= 1e-12 * fmax(1, fabs(dmax))) {
    double pad = dmin != 0 ? fabs(dmin) * 0.01 : 0.5;
    if (integer && pad < 1) pad = 1;
    dmin -= pad;
    dmax += pad;
  }
  if (target < 2) target = 2;
  double step = rep_nice_number(rep_nice_number(dmax - dmin, 0) / (target - 1), 1);
  if (integer && step < 1) step = 1;
  double lo = dmin, hi = dmax;
  if (flags & REP_AXIS_TIGHT) {
    double pad = 0.04 * (dmax - dmin);
    lo -= pad;
    hi += pad;
  }
  double k0, k1;
  for (;;) {
    if (flags & REP_AXIS_TIGHT) {
      k0 = ceil(lo / step - 1e-9);
      k1 = floor(hi / step + 1e-9);
    } else {
      k0 = floor(lo / step + 1e-9);
      k1 = ceil(hi / step - 1e-9);
    }
    if (k1 - k0 + 1 <= REP_AXIS_MAXTICKS) break;
    step = rep_nice_number(step * 1.5, 0);
  }
  a->step = step;
  a->lo = flags & REP_AXIS_TIGHT ? lo : k0 * step;
  a->hi = flags & REP_AXIS_TIGHT ? hi : k1 * step;
  int d = -(int)floor(log10(step) + 1e-9);
  a->decimals = d > 0 ? d : 0;
  for (double k = k0; k <= k1 + 0.5; k += 1) {
    double v = k * step;
    if (fabs(v) < step * 1e-9) v = 0; /* no "-0.00" */
    a->ticks[a->nticks++] = v;
  }
}

void rep_axis_log(rep_axis *a, double dmin, double dmax, int maxdecades) {
  memset(a, 0, sizeof *a);
  a->log = 1;
  if (!(dmin > 0) || !isfinite(dmin)) dmin = 1e-3;
  if (!(dmax > 0) || !isfinite(dmax)) dmax = dmin * 10;
  if (dmin > dmax) {
    double t = dmin;
    dmin = dmax;
    dmax = t;
  }
  int e0 = (int)floor(log10(dmin) + 1e-9);
  int e1 = (int)ceil(log10(dmax) - 1e-9);
  if (e1 <= e0) e1 = e0 + 1;
  if (maxdecades < 1) maxdecades = 1;
  if (e1 - e0 > maxdecades) e0 = e1 - maxdecades;
  a->lo = pow(10, e0);
  a->hi = pow(10, e1);
  int every = (e1 - e0 + 9) / 10; /* at most about ten labels */
  for (int e = e0; e <= e1 && a->nticks < REP_AXIS_MAXTICKS; e++)
    if ((e - e0) % every == 0) a->ticks[a->nticks++] = pow(10, e);
  a->minor = e1 - e0 <= 6;
}

double rep_axis_frac(const rep_axis *a, double v) {
  if (a->log) {
    if (!(v > 0)) return NAN;
    double l0 = log10(a->lo), l1 = log10(a->hi);
    return (log10(v) - l0) / (l1 - l0);
  }
  return (v - a->lo) / (a->hi - a->lo);
}

const char *rep_axis_label(const rep_axis *a, double v, char *buf) {
  if (a->log) {
    int e = (int)lround(log10(v));
    if (e >= 0 && e <= 4) snprintf(buf, 32, "%.0f", pow(10, e));
    else if (e < 0 && e >= -3) snprintf(buf, 32, "%.*f", -e, pow(10, e));
    else snprintf(buf, 32, "1e%d", e);
  } else {
    snprintf(buf, 32, "%.*f", a->decimals, v);
  }
  return buf;
}

static double clamp01(double f) { return f < 0 ? 0 : f > 1 ? 1 : f; }

double rep_panel_px(const rep_panel *p, double x) {
  double f = rep_axis_frac(&p->ax, x);
  if (isnan(f)) f = 0;
  return p->x + p->w * clamp01(f);
}

double rep_panel_py(const rep_panel *p, double y) {
  double f = rep_axis_frac(&p->ay, y);
  if (isnan(f)) f = 0;
  return p->y + p->h * (1 - clamp01(f));
}

void rep_svg_escape(util_buf *b, const char *s) {
  for (; s && *s; s++) {
    switch (*s) {
    case '&': util_buf_append(b, "&amp;", 5); break;
    case '<': util_buf_append(b, "&lt;", 4); break;
    case '>': util_buf_append(b, "&gt;", 4); break;
    case '"': util_buf_append(b, "&quot;", 6); break;
    case '\'': util_buf_append(b, "&apos;", 6); break;
    default:
      /* control characters are not allowed in XML 1.0 text */
      if ((unsigned char)*s < 0x20 && *s != '\t' && *s != '\n') util_buf_append(b, "?", 1);
      else util_buf_append(b, s, 1);
    }
  }
}

void rep_svg_begin(util_buf *b, int width, int height, const char *title) {
  util_buf_printf(b,
                  "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                  "<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"%d\" height=\"%d\" "
                  "viewBox=\"0 0 %d %d\" font-family=\"DejaVu Sans, Arial, Helvetica, sans-serif\">\n"
                  "<title>",
                  width, height, width, height);
  rep_svg_escape(b, title);
  util_buf_printf(b, "</title>\n<rect x=\"0\" y=\"0\" width=\"%d\" height=\"%d\" fill=\"#ffffff\"/>\n", width,
                  height);
}

void rep_svg_end(util_buf *b) { util_buf_printf(b, "</svg>\n"); }

void rep_svg_text(util_buf *b, double x, double y, const char *anchor, int size, double rotate,
                  const char *weight, const char *cls, const char *text) {
  util_buf_printf(b, "<text x=\"%.2f\" y=\"%.2f\" font-size=\"%d\" text-anchor=\"%s\" fill=\"#000000\"", x, y,
                  size, anchor);
  if (weight) util_buf_printf(b, " font-weight=\"%s\"", weight);
  if (rotate != 0) util_buf_printf(b, " transform=\"rotate(%.0f %.2f %.2f)\"", rotate, x, y);
  if (cls) util_buf_printf(b, " class=\"%s\"", cls);
  util_buf_printf(b, ">");
  rep_svg_escape(b, text);
  util_buf_printf(b, "</text>\n");
}

/* Grid line, tick mark and label of one x tick at figure x = px. */
static void xtick(util_buf *b, const rep_panel *p, double px, const char *label) {
  util_buf_printf(b, "<g class=\"xtick\">");
  util_buf_printf(b, "<line class=\"grid\" x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"#e0e0e0\"/>", px,
                  p->y, px, p->y + p->h);
  util_buf_printf(b, "<line class=\"mark\" x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"#000000\"/>",
                  px, p->y + p->h, px, p->y + p->h + 5);
  util_buf_printf(b, "\n");
  rep_svg_text(b, px, p->y + p->h + 19, "middle", 12, 0, NULL, NULL, label);
  util_buf_printf(b, "</g>\n");
}

static void ytick(util_buf *b, const rep_panel *p, double py, const char *label) {
  util_buf_printf(b, "<g class=\"ytick\">");
  util_buf_printf(b, "<line class=\"grid\" x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"#e0e0e0\"/>",
                  p->x, py, p->x + p->w, py);
  util_buf_printf(b, "<line class=\"mark\" x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"#000000\"/>",
                  p->x - 5, py, p->x, py);
  util_buf_printf(b, "\n");
  rep_svg_text(b, p->x - 8, py + 4, "end", 12, 0, NULL, NULL, label);
  util_buf_printf(b, "</g>\n");
}

/* Unlabelled minor ticks at 2..9 times each decade of a log y axis. */
static void yminor(util_buf *b, const rep_panel *p) {
  const rep_axis *a = &p->ay;
  for (double dec = a->lo; dec < a->hi * 0.999; dec *= 10)
    for (int m = 2; m <= 9; m++) {
      double py = rep_panel_py(p, dec * m);
      util_buf_printf(b, "<line class=\"minor\" x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"#000000\"/>\n",
                      p->x - 3, py, p->x, py);
    }
}

void rep_panel_begin(util_buf *b, const rep_panel *p) {
  char lab[32];
  util_buf_printf(b, "<g id=\"%s\" class=\"panel\">\n", p->id);
  for (int i = 0; i < p->ax.nticks; i++)
    xtick(b, p, rep_panel_px(p, p->ax.ticks[i]), rep_axis_label(&p->ax, p->ax.ticks[i], lab));
  for (int i = 0; i < p->ay.nticks; i++)
    ytick(b, p, rep_panel_py(p, p->ay.ticks[i]), rep_axis_label(&p->ay, p->ay.ticks[i], lab));
  if (p->ay.log && p->ay.minor) yminor(b, p);
  util_buf_printf(b,
                  "<rect class=\"frame\" x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" height=\"%.2f\" fill=\"none\" "
                  "stroke=\"#000000\"/>\n",
                  p->x, p->y, p->w, p->h);
  if (p->xlabel) rep_svg_text(b, p->x + p->w / 2, p->y + p->h + 40, "middle", 14, 0, NULL, "xlabel", p->xlabel);
  if (p->ylabel) rep_svg_text(b, p->x - 66, p->y + p->h / 2, "middle", 14, -90, NULL, "ylabel", p->ylabel);
}

void rep_panel_end(util_buf *b) { util_buf_printf(b, "</g>\n"); }

static void stroke_attrs(util_buf *b, const rep_style *s) {
  util_buf_printf(b, " fill=\"none\" stroke=\"%s\" stroke-width=\"%.1f\" stroke-linejoin=\"round\"", s->color,
                  s->width);
  if (s->dash) util_buf_printf(b, " stroke-dasharray=\"%s\"", s->dash);
}

void rep_svg_offscale_mark(util_buf *b, double cx, double cy, int down, const char *color) {
  double d = down ? 1 : -1; /* the tip is at (cx, cy) */
  util_buf_printf(b, "<path d=\"M%.2f,%.2f L%.2f,%.2f L%.2f,%.2f Z\" fill=\"#ffffff\" stroke=\"%s\" "
                     "stroke-width=\"1.5\"/>\n",
                  cx, cy, cx - 5, cy - 9 * d, cx + 5, cy - 9 * d, color);
}

/* -1 below the y axis, +1 above it, 0 on it. */
static int off_axis(const rep_panel *p, double y) {
  double f = rep_axis_frac(&p->ay, y);
  if (isnan(f) || f < -1e-9) return -1;
  return f > 1 + 1e-9 ? 1 : 0;
}

int rep_panel_curve(util_buf *b, const rep_panel *p, const char *id, const rep_style *s, int n,
                    const double *x, const double *y, const int *ok) {
  int any = 0, off = 0;
  for (int i = 0; i < n; i++) any |= !ok || ok[i];
  if (!any) return 0;
  util_buf_printf(b, "<path class=\"curve\" id=\"%s\"", id);
  stroke_attrs(b, s);
  util_buf_printf(b, " stroke-linecap=\"round\" d=\"");
  int open = 0, first = 1; /* points in the current subpath */
  for (int i = 0; i < n; i++) {
    if (ok && !ok[i]) {
      open = 0;
      continue;
    }
    util_buf_printf(b, "%s%c%.2f,%.2f", first ? "" : " ", open ? 'L' : 'M', rep_panel_px(p, x[i]),
                    rep_panel_py(p, y[i]));
    open++;
    first = 0;
  }
  util_buf_printf(b, "\"/>\n");
  /* dots: every point with markers, else the points with no neighbour */
  int dots = 0;
  for (int i = 0; i < n; i++) {
    if (ok && !ok[i]) continue;
    int lone = (i == 0 || (ok && !ok[i - 1])) && (i == n - 1 || (ok && !ok[i + 1]));
    if (!(s->markers || lone) || off_axis(p, y[i]) != 0) continue;
    if (!dots++)
      util_buf_printf(b, "<g class=\"markers\" id=\"%s-markers\" fill=\"%s\" stroke=\"none\">\n", id, s->color);
    util_buf_printf(b, "<circle cx=\"%.2f\" cy=\"%.2f\" r=\"%.1f\"/>\n", rep_panel_px(p, x[i]), rep_panel_py(p, y[i]),
                    s->markers ? 3.5 : 3.0);
  }
  if (dots) util_buf_printf(b, "</g>\n");
  for (int i = 0; i < n; i++) {
    if (ok && !ok[i]) continue;
    int o = off_axis(p, y[i]);
    if (!o) continue;
    if (!off++) util_buf_printf(b, "<g class=\"offscale\" id=\"%s-offscale\">\n", id);
    rep_svg_offscale_mark(b, rep_panel_px(p, x[i]), o < 0 ? p->y + p->h - 1 : p->y + 1, o < 0, s->color);
  }
  if (off) util_buf_printf(b, "</g>\n");
  return off;
}

void rep_panel_hline(util_buf *b, const rep_panel *p, double y, const char *color, const char *dash) {
  double py = rep_panel_py(p, y);
  util_buf_printf(b, "<line class=\"accuracy\" x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"%s\" "
                     "stroke-width=\"1.5\"",
                  p->x, py, p->x + p->w, py, color);
  if (dash) util_buf_printf(b, " stroke-dasharray=\"%s\"", dash);
  util_buf_printf(b, "/>\n");
}

void rep_panel_hline_label(util_buf *b, const rep_panel *p, double y, const char *color, const char *label) {
  double py = rep_panel_py(p, y);
  /* the halo: the same text in a wide white stroke underneath */
  for (int pass = 0; pass < 2; pass++) {
    util_buf_printf(b, "<text x=\"%.2f\" y=\"%.2f\" font-size=\"12\" text-anchor=\"end\" ", p->x + p->w - 6,
                    py - 6);
    if (pass == 0)
      util_buf_printf(b, "fill=\"#ffffff\" stroke=\"#ffffff\" stroke-width=\"4\" stroke-linejoin=\"round\">");
    else util_buf_printf(b, "fill=\"%s\" class=\"accuracy-label\">", color);
    rep_svg_escape(b, label);
    util_buf_printf(b, "</text>\n");
  }
}

void rep_svg_legend(util_buf *b, double x, double y, int n, const rep_legend_item *items) {
  util_buf_printf(b, "<g class=\"legend\">\n");
  for (int i = 0; i < n; i++) {
    double yy = y + 22.0 * i;
    util_buf_printf(b, "<g class=\"legend-item\"><line x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\"", x, yy,
                    x + 30, yy);
    stroke_attrs(b, &items[i].style);
    util_buf_printf(b, "/>");
    if (items[i].style.markers)
      util_buf_printf(b, "<circle cx=\"%.2f\" cy=\"%.2f\" r=\"3.5\" fill=\"%s\"/>", x + 15, yy,
                      items[i].style.color);
    util_buf_printf(b, "\n");
    rep_svg_text(b, x + 38, yy + 4, "start", 13, 0, NULL, NULL, items[i].label);
    util_buf_printf(b, "</g>\n");
  }
  util_buf_printf(b, "</g>\n");
}
