/* boys.c — the Boys function F_m(T) = int_0^1 t^(2m) exp(-T t^2) dt.
 *
 * For T < BOYS_TMAX: a table of F_m at grid points T_k = k h, made once per
 * int_boys object from the convergent series
 *   F_m(T) = exp(-T) sum_i (2T)^i / ((2m+1)(2m+3)...(2m+2i+1))
 * (all terms positive, so no cancellation), then a 6-term Taylor expansion
 * around the nearest grid point, F_m(T_k + d) = sum_j F_{m+j}(T_k) (-d)^j / j!,
 * for the highest m needed and downward recursion
 *   F_{m-1}(T) = (2T F_m(T) + exp(-T)) / (2m-1),
 * which is stable.  For T >= BOYS_TMAX: F_0 = sqrt(pi/T) erf(sqrt T) / 2 and
 * upward recursion F_{m+1} = ((2m+1) F_m - exp(-T)) / (2T), stable there.
 */
#include "config.h"

#include "cairn/integrals.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>

enum { BOYS_TAYLOR = 6, BOYS_MTAB = INT_BOYS_MMAX + BOYS_TAYLOR + 1 };
#define BOYS_TMAX 36.0
#define BOYS_H 0.025

struct int_boys {
  int npts;
  double *tab; /* npts x BOYS_MTAB */
};

/* F_m(T) for m = 0..mtop from the series for F_mtop and downward recursion. */
static void boys_series(int mtop, double T, double *f) {
  double term = 1.0 / (2 * mtop + 1), sum = term;
  for (int i = 1; i < 2000; i++) {
    term *= 2 * T / (2 * mtop + 2 * i + 1);
    sum += term;
    if (term < 1e-17 * sum) break;
  }
  double e = exp(-T);
  f[mtop] = e * sum;
  for (int m = mtop; m > 0; m--) f[m - 1] = (2 * T * f[m] + e) / (2 * m - 1);
}

int_boys *int_boys_new(void) {
  int_boys *b = xmalloc(sizeof *b);
  b->npts = (int)(BOYS_TMAX / BOYS_H) + 2;
  b->tab = xmalloc((size_t)b->npts * BOYS_MTAB * sizeof *b->tab);
  for (int k = 0; k < b->npts; k++) boys_series(BOYS_MTAB - 1, k * BOYS_H, b->tab + (size_t)k * BOYS_MTAB);
  return b;
}

void int_boys_free(int_boys *b) {
  if (!b) return;
  free(b->tab);
  free(b);
}

void int_boys_eval(const int_boys *b, int mmax, double T, double *f) {
  if (T < BOYS_TMAX) {
    int k = (int)(T / BOYS_H + 0.5);
    double d = T - k * BOYS_H; /* |d| <= h/2 */
    const double *row = b->tab + (size_t)k * BOYS_MTAB + mmax;
    /* Taylor in -d with coefficients 1/j! */
    double md = -d;
    double v = row[5];
    v = row[4] + md * v / 5.0;
    v = row[3] + md * v / 4.0;
    v = row[2] + md * v / 3.0;
    v = row[1] + md * v / 2.0;
    v = row[0] + md * v;
    f[mmax] = v;
    if (mmax > 0) {
      double e = exp(-T);
      for (int m = mmax; m > 0; m--) f[m - 1] = (2 * T * f[m] + e) / (2 * m - 1);
    }
    return;
  }
  double e = exp(-T), st = sqrt(T);
  f[0] = 0.5 * sqrt(M_PI) / st * erf(st);
  for (int m = 0; m < mmax; m++) f[m + 1] = ((2 * m + 1) * f[m] - e) / (2 * T);
}
