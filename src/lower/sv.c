/* sv.c — statevector storage, memory checks, Pauli rotations by bit masks and
 * the inner products the adjoint gradient needs (see sv.h).
 *
 * Arithmetic is written on the real and imaginary parts (a double complex is
 * two doubles, C11 6.2.5) so the loops need no library calls for complex
 * products and keep to what the hardware does well. */
#include "config.h"

#include "cairn/sv.h"
#include "cairn/util.h"
#include "lower/sv_priv.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

uint64_t sv_vector_bytes(int nqubits) { return (uint64_t)16 << nqubits; }

const char *sv_fmt_bytes(char *buf, uint64_t bytes) {
  static const char *const unit[] = {"B", "KiB", "MiB", "GiB", "TiB", "PiB", "EiB"};
  double v = (double)bytes;
  int u = 0;
  while (v >= 1024.0 && u < 6) {
    v /= 1024.0;
    u++;
  }
  if (u == 0) snprintf(buf, 32, "%llu B", (unsigned long long)bytes);
  else snprintf(buf, 32, "%.1f %s", v, unit[u]);
  return buf;
}

int sv_mem_check(int nqubits, int nvectors, uint64_t extra, char *err, size_t errlen) {
  if (nqubits < 1 || nqubits > SV_MAX_QUBITS) {
    snprintf(err, errlen, "a %d-qubit register cannot be simulated: the statevector engine takes 1 to %d qubits",
             nqubits, SV_MAX_QUBITS);
    return -1;
  }
  uint64_t one = sv_vector_bytes(nqubits);
  /* n <= 48 keeps nvectors * one far below 2^64 for any sane nvectors */
  uint64_t need = (uint64_t)nvectors * one + extra;
  uint64_t have = util_mem_available();
  if (have != 0 && need > have) {
    char b1[32], b2[32], b3[32];
    snprintf(err, errlen,
             "a %d-qubit statevector run needs %s (%d vector%s of %s%s); this machine has %s available", nqubits,
             sv_fmt_bytes(b1, need), nvectors, nvectors == 1 ? "" : "s", sv_fmt_bytes(b2, one),
             extra ? " and tables" : "", sv_fmt_bytes(b3, have));
    return -1;
  }
  return 0;
}

int sv_word_masks(const pauli_sum *s, size_t term, uint64_t *x, uint64_t *z) {
  const uint64_t *wx = pauli_sum_x(s, term), *wz = pauli_sum_z(s, term);
  for (int k = 1; k < s->nw; k++)
    if (wx[k] | wz[k]) return -1;
  *x = wx[0];
  *z = wz[0];
  return 0;
}

void sv_state_alloc(sv_state *s, int n) {
  s->n = n;
  s->dim = (uint64_t)1 << n;
  s->a = xcalloc((size_t)s->dim, sizeof *s->a);
}

void sv_state_free(sv_state *s) {
  free(s->a);
  memset(s, 0, sizeof *s);
}

void sv_set_basis(sv_state *s, uint64_t bits) {
  memset(s->a, 0, (size_t)s->dim * sizeof *s->a);
  s->a[bits & (s->dim - 1)] = 1.0;
}

void sv_copy(sv_state *dst, const sv_state *src) {
  const double *restrict in = (const double *)src->a;
  double *restrict out = (double *)dst->a;
  uint64_t len = 2 * src->dim;
#pragma omp parallel for schedule(static) if (len >= 2 * SV_PAR_MIN)
  for (uint64_t k = 0; k < len; k++) out[k] = in[k];
}

/* Sum of nch chunk results in chunk order (the fixed-order half of every
 * reduction). */
static double complex sum_parts(const double *part, uint64_t nch) {
  double re = 0, im = 0;
  for (uint64_t c = 0; c < nch; c++) {
    re += part[2 * c];
    im += part[2 * c + 1];
  }
  return CMPLX(re, im);
}

/* Scratch for per-chunk partial sums: on the stack for small registers. */
typedef struct parts {
  double stack[2 * 64];
  double *p;
} parts;
static double *parts_get(parts *ps, uint64_t nch) {
  ps->p = nch <= 64 ? ps->stack : xmalloc((size_t)nch * 2 * sizeof(double));
  return ps->p;
}
static void parts_free(parts *ps) {
  if (ps->p != ps->stack) free(ps->p);
}

double complex sv_inner(const sv_state *a, const sv_state *b) {
  const double *restrict u = (const double *)a->a, *restrict v = (const double *)b->a;
  uint64_t dim = a->dim, nch = (dim + SV_CHUNK - 1) / SV_CHUNK;
  parts ps;
  double *part = parts_get(&ps, nch);
#pragma omp parallel for schedule(static) if (dim >= SV_PAR_MIN)
  for (uint64_t c = 0; c < nch; c++) {
    uint64_t lo = c * SV_CHUNK, hi = lo + SV_CHUNK < dim ? lo + SV_CHUNK : dim;
    double re = 0, im = 0;
    for (uint64_t i = lo; i < hi; i++) {
      double ur = u[2 * i], ui = u[2 * i + 1], vr = v[2 * i], vi = v[2 * i + 1];
      re += ur * vr + ui * vi;
      im += ur * vi - ui * vr;
    }
    part[2 * c] = re;
    part[2 * c + 1] = im;
  }
  double complex r = sum_parts(part, nch);
  parts_free(&ps);
  return r;
}

double sv_norm2(const sv_state *a) { return creal(sv_inner(a, a)); }

/* i^m as (re, im). */
static void ipow(int m, double *re, double *im) {
  static const double r[4] = {1, 0, -1, 0}, i[4] = {0, 1, 0, -1};
  *re = r[m & 3];
  *im = i[m & 3];
}

static int ycount(uint64_t x, uint64_t z) { return __builtin_popcountll(x & z); }

/* Diagonal rotation (x = 0): a_i <- (c - i s sigma_i) a_i, sigma_i = (-1)^|i & z|. */
static void rotate_diag(double *restrict v, uint64_t dim, uint64_t z, double c, double s) {
#pragma omp parallel for schedule(static) if (dim >= SV_PAR_MIN)
  for (uint64_t i = 0; i < dim; i++) {
    double si = sv_parity(i & z) ? -s : s;
    double ar = v[2 * i], ai = v[2 * i + 1];
    v[2 * i] = c * ar + si * ai;
    v[2 * i + 1] = c * ai - si * ar;
  }
}

/* exp(-i theta P/2) = c - i s P with (P a)_i = i^ny sigma_j a_j, j = i ^ x,
 * sigma_j = sigma_i (-1)^ny.  With f = -i s i^ny:
 *   a_i' = c a_i + eps sigma_i f a_j,  a_j' = c a_j + sigma_i f a_i,
 * eps = (-1)^ny; i runs over indices with bit p (the top bit of x) clear. */
void sv_rotate(sv_state *s, uint64_t x, uint64_t z, double theta) {
  double c = cos(0.5 * theta), sn = sin(0.5 * theta);
  double *restrict v = (double *)s->a;
  if (x == 0) {
    rotate_diag(v, s->dim, z, c, sn);
    return;
  }
  int ny = ycount(x, z), p = sv_top_bit(x);
  double wr, wi;
  ipow(ny + 3, &wr, &wi);
  const double fr = sn * wr, fi = sn * wi, eps = (ny & 1) ? -1.0 : 1.0;
  uint64_t npairs = s->dim >> 1;
#pragma omp parallel for schedule(static) if (npairs >= SV_PAR_MIN)
  for (uint64_t k = 0; k < npairs; k++) {
    uint64_t i = sv_insert0(k, p), j = i ^ x;
    double sg = sv_parity(i & z) ? -1.0 : 1.0;
    double gr = sg * fr, gi = sg * fi; /* sigma_i f */
    double ar = v[2 * i], ai = v[2 * i + 1], br = v[2 * j], bi = v[2 * j + 1];
    v[2 * i] = c * ar + eps * (gr * br - gi * bi);
    v[2 * i + 1] = c * ai + eps * (gr * bi + gi * br);
    v[2 * j] = c * br + (gr * ar - gi * ai);
    v[2 * j + 1] = c * bi + (gr * ai + gi * ar);
  }
}

/* (P a)_i = i^ny sigma_j a_j: swap the pair with the phases. */
void sv_apply_word(sv_state *s, uint64_t x, uint64_t z) {
  double *restrict v = (double *)s->a;
  int ny = ycount(x, z);
  double vr, vi;
  ipow(ny, &vr, &vi);
  if (x == 0) {
#pragma omp parallel for schedule(static) if (s->dim >= SV_PAR_MIN)
    for (uint64_t i = 0; i < s->dim; i++)
      if (sv_parity(i & z)) {
        v[2 * i] = -v[2 * i];
        v[2 * i + 1] = -v[2 * i + 1];
      }
    return;
  }
  int p = sv_top_bit(x);
  const double eps = (ny & 1) ? -1.0 : 1.0;
  uint64_t npairs = s->dim >> 1;
#pragma omp parallel for schedule(static) if (npairs >= SV_PAR_MIN)
  for (uint64_t k = 0; k < npairs; k++) {
    uint64_t i = sv_insert0(k, p), j = i ^ x;
    double sg = sv_parity(i & z) ? -1.0 : 1.0;
    double gr = sg * vr, gi = sg * vi; /* i^ny sigma_i */
    double ar = v[2 * i], ai = v[2 * i + 1], br = v[2 * j], bi = v[2 * j + 1];
    v[2 * i] = eps * (gr * br - gi * bi);
    v[2 * i + 1] = eps * (gr * bi + gi * br);
    v[2 * j] = gr * ar - gi * ai;
    v[2 * j + 1] = gr * ai + gi * ar;
  }
}

/* Shared body of sv_word_inner and sv_word_inner_rotate2.
 * <a|P|b> = i^ny sum over pairs of sigma_i (eps conj(a_i) b_j + conj(a_j) b_i)
 * (diagonal words: sum of sigma_i conj(a_i) b_i).  With rot set, both vectors
 * are then rotated by exp(-i theta P/2) in the same pass. */
static double complex word_inner(double *restrict a, uint64_t x, uint64_t z, double *restrict b, uint64_t dim,
                                 int rot, double theta) {
  double c = cos(0.5 * theta), sn = sin(0.5 * theta);
  int ny = ycount(x, z);
  double vr, vi, wr, wi;
  ipow(ny, &vr, &vi);
  ipow(ny + 3, &wr, &wi);
  const double fr = sn * wr, fi = sn * wi, eps = (ny & 1) ? -1.0 : 1.0;
  int p = x ? sv_top_bit(x) : 0;
  uint64_t n = x ? dim >> 1 : dim, nch = (n + SV_CHUNK - 1) / SV_CHUNK;
  parts ps;
  double *part = parts_get(&ps, nch);
#pragma omp parallel for schedule(static) if (n >= SV_PAR_MIN)
  for (uint64_t ch = 0; ch < nch; ch++) {
    uint64_t lo = ch * SV_CHUNK, hi = lo + SV_CHUNK < n ? lo + SV_CHUNK : n;
    double re = 0, im = 0;
    if (x == 0) {
      for (uint64_t i = lo; i < hi; i++) {
        double sg = sv_parity(i & z) ? -1.0 : 1.0;
        double ar = a[2 * i], ai = a[2 * i + 1], br = b[2 * i], bi = b[2 * i + 1];
        re += sg * (ar * br + ai * bi);
        im += sg * (ar * bi - ai * br);
        if (rot) {
          double s1 = sg * sn;
          a[2 * i] = c * ar + s1 * ai;
          a[2 * i + 1] = c * ai - s1 * ar;
          b[2 * i] = c * br + s1 * bi;
          b[2 * i + 1] = c * bi - s1 * br;
        }
      }
    } else {
      for (uint64_t k = lo; k < hi; k++) {
        uint64_t i = sv_insert0(k, p), j = i ^ x;
        double sg = sv_parity(i & z) ? -1.0 : 1.0;
        double air = a[2 * i], aii = a[2 * i + 1], ajr = a[2 * j], aji = a[2 * j + 1];
        double bir = b[2 * i], bii = b[2 * i + 1], bjr = b[2 * j], bji = b[2 * j + 1];
        /* eps conj(a_i) b_j + conj(a_j) b_i */
        double tr = eps * (air * bjr + aii * bji) + (ajr * bir + aji * bii);
        double ti = eps * (air * bji - aii * bjr) + (ajr * bii - aji * bir);
        re += sg * tr;
        im += sg * ti;
        if (rot) {
          double gr = sg * fr, gi = sg * fi;
          a[2 * i] = c * air + eps * (gr * ajr - gi * aji);
          a[2 * i + 1] = c * aii + eps * (gr * aji + gi * ajr);
          a[2 * j] = c * ajr + (gr * air - gi * aii);
          a[2 * j + 1] = c * aji + (gr * aii + gi * air);
          b[2 * i] = c * bir + eps * (gr * bjr - gi * bji);
          b[2 * i + 1] = c * bii + eps * (gr * bji + gi * bjr);
          b[2 * j] = c * bjr + (gr * bir - gi * bii);
          b[2 * j + 1] = c * bji + (gr * bii + gi * bir);
        }
      }
    }
    part[2 * ch] = re;
    part[2 * ch + 1] = im;
  }
  double complex r = sum_parts(part, nch);
  parts_free(&ps);
  if (x) r *= CMPLX(vr, vi);
  return r;
}

double complex sv_word_inner(const sv_state *a, uint64_t x, uint64_t z, const sv_state *b) {
  return word_inner((double *)a->a, x, z, (double *)b->a, a->dim, 0, 0.0);
}

double complex sv_word_inner_rotate2(sv_state *l, sv_state *p, uint64_t x, uint64_t z, double theta) {
  return word_inner((double *)l->a, x, z, (double *)p->a, l->dim, 1, theta);
}
