/* plot.h — private to src/report: axes with nice ticks, plot panels and
 * curves, written as plain SVG 1.1 text into a util_buf.
 *
 * Everything is drawn with presentation attributes (no CSS, no scripts), so
 * any browser or image viewer renders it.  Numbers are printed with fixed
 * formats, so the same data give the same bytes.
 *
 * Ownership: the caller owns the util_buf; nothing here allocates otherwise.
 */
#ifndef CAIRN_REPORT_PLOT_H
#define CAIRN_REPORT_PLOT_H

#include "cairn/util.h"

enum { REP_AXIS_MAXTICKS = 32 };

/* One axis: the range shown and its labelled ticks. */
typedef struct rep_axis {
  int log;                         /* 1: log10 axis (lo, hi are powers of ten) */
  double lo, hi;                   /* range shown, data units */
  double step;                     /* linear: tick spacing */
  int decimals;                    /* linear: digits after the point in labels */
  double ticks[REP_AXIS_MAXTICKS]; /* labelled ticks, increasing */
  int nticks;
  int minor;                       /* log: draw 2..9 minor ticks in each decade */
} rep_axis;

/* "Nice" number near x (1, 2, 5 times a power of ten); rounded to the
 * closest when round is set, else the smallest nice number >= x. */
double rep_nice_number(double x, int round);
/* Options of rep_axis_linear. */
enum {
  REP_AXIS_INTEGER = 1 << 0, /* ticks at whole numbers only (iteration counts) */
  REP_AXIS_TIGHT = 1 << 1    /* range = data plus 4 % on each side, ticks inside; else the
                              * range is widened to the ticks around the data */
};
/* A linear axis covering [dmin, dmax] with about `target` ticks at nice
 * numbers; a degenerate range is widened around its value. */
void rep_axis_linear(rep_axis *a, double dmin, double dmax, int target, unsigned flags);
/* A log10 axis from the decade at or below dmin to the decade at or above
 * dmax (both > 0), at most `maxdecades` decades (the top is kept). */
void rep_axis_log(rep_axis *a, double dmin, double dmax, int maxdecades);
/* Position of v on the axis, 0 at lo and 1 at hi (not clamped; NaN for
 * v <= 0 on a log axis). */
double rep_axis_frac(const rep_axis *a, double v);
/* Tick label of v (buf >= 32 bytes): fixed decimals on a linear axis;
 * 0.001 ... 10000 or 1e-5 style on a log axis. */
const char *rep_axis_label(const rep_axis *a, double v, char *buf);

/* A rectangle of the figure with an x and a y axis. */
typedef struct rep_panel {
  double x, y, w, h;          /* plot area in SVG user units (y down) */
  rep_axis ax, ay;
  const char *id;             /* id of the panel's group ("energy", "error") */
  const char *xlabel, *ylabel;
} rep_panel;

/* Figure coordinates of a data point; values off the axis are clamped to
 * the frame edge. */
double rep_panel_px(const rep_panel *p, double x);
double rep_panel_py(const rep_panel *p, double y);

/* Style of one curve. */
typedef struct rep_style {
  const char *color;  /* "#rrggbb" */
  double width;
  const char *dash;   /* stroke-dasharray or NULL */
  int markers;        /* draw a circle at each point */
} rep_style;

/* Start and end of the SVG document (white background, title element). */
void rep_svg_begin(util_buf *b, int width, int height, const char *title);
void rep_svg_end(util_buf *b);
/* Append s with XML escapes (& < > " '). */
void rep_svg_escape(util_buf *b, const char *s);
/* A text element; anchor "start", "middle" or "end"; rotate in degrees
 * about (x, y) (0: none); weight NULL or "bold". */
void rep_svg_text(util_buf *b, double x, double y, const char *anchor, int size, double rotate,
                  const char *weight, const char *cls, const char *text);

/* Open the panel's group and draw grid, ticks, tick labels, frame and axis
 * labels; rep_panel_end closes the group. */
void rep_panel_begin(util_buf *b, const rep_panel *p);
void rep_panel_end(util_buf *b);
/* One curve: a single <path class="curve"> through the points with ok[i]
 * set (ok NULL: all); a point left out breaks the line.  With markers a
 * <g class="markers"> of circles follows; without, a point with no
 * neighbour still gets a dot.  A value off the y axis (below or above it,
 * or not positive on a log axis) is drawn on the edge with a hollow triangle
 * (<g class="offscale">) pointing the way it went.  Nothing when no point is
 * ok.  Returns the number of off-axis values. */
int rep_panel_curve(util_buf *b, const rep_panel *p, const char *id, const rep_style *s, int n,
                    const double *x, const double *y, const int *ok);
/* The hollow triangle of an off-axis value at (cx, cy); down: points down. */
void rep_svg_offscale_mark(util_buf *b, double cx, double cy, int down, const char *color);
/* A horizontal reference line at data value y (the chemical-accuracy line),
 * and its label above the right end: draw the label after the curves, so its
 * white halo keeps it readable where a curve crosses. */
void rep_panel_hline(util_buf *b, const rep_panel *p, double y, const char *color, const char *dash);
void rep_panel_hline_label(util_buf *b, const rep_panel *p, double y, const char *color, const char *label);

/* The legend: a column of line samples with labels, from (x, y) down. */
typedef struct rep_legend_item {
  const char *label;
  rep_style style;
} rep_legend_item;
void rep_svg_legend(util_buf *b, double x, double y, int n, const rep_legend_item *items);

#endif
