/* sv_gen.c — fused generators: several commuting words with one X mask and a
 * shared angle, applied in one pass over the pairs they connect (see sv.h).
 *
 * With the notation of sv_op.c, G psi has (G psi)_i = h(i) psi_j, j = i ^ x,
 * and on a sub-cube (bits S of i equal to v) with one merged term
 *     h(i) = e (-1)^|i & zeta|,   |h| = |e| = r.
 * Hermitian G gives h(j) = conj(h(i)), G^2 = r^2 on the pair, so
 *     exp(-i t G/2):  psi_i' = c psi_i - i s h(i) psi_j,
 *                     psi_j' = c psi_j - i s conj(h(i)) psi_i,
 * c = cos(t r/2), s = sin(t r/2)/r.  Only sub-cubes whose pivot bit (the top
 * bit of x) is 0 are visited; each pair once. */
#include "config.h"

#include "cairn/sv.h"
#include "cairn/util.h"
#include "lower/sv_priv.h"

#include <float.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

typedef struct gen_sub {
  uint64_t vm;     /* bits S of the rows */
  uint64_t zhi;    /* merged term's Z mask outside S and the block bits */
  uint32_t u;      /* its pattern on the block bits (compressed) */
  double er, ei, r; /* e and |e| */
} gen_sub;

struct sv_gen {
  int n;
  uint64_t x, S, mid, xhi;
  uint32_t xlo;
  int lb;
  uint32_t *off;
  gen_sub *sub;
  int ns;
  double *tau;
};

typedef struct gen_term {
  uint64_t z, zeta;
  double dr, di;
} gen_term;

static int cmp_zeta(const void *pa, const void *pb) {
  const gen_term *a = pa, *b = pb;
  if (a->zeta != b->zeta) return a->zeta < b->zeta ? -1 : 1;
  return a->z < b->z ? -1 : a->z > b->z;
}

sv_gen *sv_gen_new(int n, int count, const uint64_t *x, const uint64_t *z, const double *m) {
  if (count < 1 || n < 1 || n > SV_MAX_QUBITS || x[0] == 0) return NULL;
  uint64_t all = ((uint64_t)1 << n) - 1;
  int ny0 = __builtin_popcountll(x[0] & z[0]);
  for (int k = 0; k < count; k++) {
    /* same X mask; words with one X mask commute iff their Y counts have equal parity */
    if (x[k] != x[0] || ((__builtin_popcountll(x[k] & z[k]) ^ ny0) & 1) || ((x[k] | z[k]) & ~all)) return NULL;
    if (!isfinite(m[k])) return NULL;
  }
  gen_term *t = xmalloc((size_t)count * sizeof *t);
  uint64_t S = sv_highest_bits(x[0], SV_SBITS);
  for (int k = 0; k < count; k++) {
    double complex d = m[k];
    switch (__builtin_popcountll(x[k] & z[k]) & 3) { /* d = m (-i)^ny */
    case 1: d *= -I; break;
    case 2: d = -d; break;
    case 3: d *= I; break;
    default: break;
    }
    t[k] = (gen_term){z[k], z[k] & ~S, creal(d), cimag(d)};
  }
  qsort(t, (size_t)count, sizeof *t, cmp_zeta);

  sv_gen *g = xcalloc(1, sizeof *g);
  g->n = n;
  g->x = x[0];
  g->S = S;
  uint64_t freeb = all & ~S;
  int nf = __builtin_popcountll(freeb);
  g->lb = nf < SV_LOG_BLOCK ? nf : SV_LOG_BLOCK;
  uint64_t blk = sv_lowest_bits(freeb, g->lb);
  g->mid = freeb & ~blk;
  g->xhi = x[0] & ~blk;
  g->xlo = (uint32_t)sv_extract(x[0] & blk, blk);
  g->off = xmalloc(((size_t)1 << g->lb) * sizeof *g->off);
  for (uint64_t l = 0; l < ((uint64_t)1 << g->lb); l++) g->off[l] = (uint32_t)sv_deposit(l, blk);
  int k = __builtin_popcountll(S);
  uint64_t pivot = (uint64_t)1 << sv_top_bit(x[0]);
  g->sub = xmalloc(((size_t)1 << k) * sizeof *g->sub);
  int ok = 1;
  for (uint64_t v = 0; v < ((uint64_t)1 << k) && ok; v++) {
    uint64_t vm = sv_deposit(v, S);
    if (vm & pivot) continue;
    int live = 0;
    gen_sub one = {0};
    for (int a = 0; a < count;) {
      int b = a;
      double er = 0, ei = 0, abs_sum = 0;
      while (b < count && t[b].zeta == t[a].zeta) {
        double s = sv_parity(t[b].z & vm) ? -1.0 : 1.0;
        er += s * t[b].dr;
        ei += s * t[b].di;
        abs_sum += fabs(t[b].dr) + fabs(t[b].di);
        b++;
      }
      double tol = 8 * DBL_EPSILON * abs_sum;
      if (fabs(er) > tol || fabs(ei) > tol) {
        if (++live > 1) {
          ok = 0; /* |h| would vary over the sub-cube: not fused */
          break;
        }
        one = (gen_sub){vm, t[a].zeta & ~blk, (uint32_t)sv_extract(t[a].zeta & blk, blk), er, ei, hypot(er, ei)};
      }
      a = b;
    }
    if (ok && live) g->sub[g->ns++] = one;
  }
  free(t);
  if (!ok) {
    sv_gen_free(g);
    return NULL;
  }
  g->tau = sv_sign_table();
  return g;
}

void sv_gen_free(sv_gen *g) {
  if (!g) return;
  free(g->off);
  free(g->sub);
  free(g->tau);
  free(g);
}

double sv_gen_coverage(const sv_gen *g) {
  /* each sub-cube holds 2^(n - |S|) rows, i.e. that many pairs of 2^(n-1) */
  int k = __builtin_popcountll(g->S);
  return g->ns * ldexp(1.0, 1 - k);
}

/* The rows of one sub-cube's blocks [b0, b1) for one operation (inlined
 * with constant flags: inner = accumulate <a|G|b>, rot = rotate b, and a
 * too when inner).  Per pair (i, j) with sign sg of row i:
 *   <a|G|b> += sg (e conj(a_i) b_j + conj(e) conj(a_j) b_i)
 *   b_i' = c b_i + sg f b_j,  b_j' = c b_j + sg q b_i. */
static inline __attribute__((always_inline)) void gen_blocks(const sv_gen *g, const gen_sub *s, int inner, int rot,
                                                             sv_v2 *restrict a, sv_v2 *restrict b, uint64_t b0,
                                                             uint64_t b1, sv_v2 C, sv_v2 F1, sv_v2 F2, sv_v2 Q1,
                                                             sv_v2 Q2, sv_v2 *acc) {
  unsigned B = 1u << g->lb;
  const double *row = g->tau + (size_t)s->u * 64;
  uint64_t m = sv_deposit(b0, g->mid);
  for (uint64_t bb = b0; bb < b1; bb++) {
    uint64_t base = s->vm | m, jb = base ^ g->xhi;
    double sb = sv_parity(base & s->zhi) ? -1.0 : 1.0;
    for (unsigned l = 0; l < B; l++) {
      uint64_t i = base | g->off[l], j = jb | g->off[l ^ g->xlo];
      double sg = sb * row[l];
      sv_v2 bi = b[i], bj = b[j];
      if (inner) {
        /* x = conj(a_i) b_j, y = conj(a_j) b_i as lanes (re-part, im-part) pairs */
        sv_v2 ai = sg * a[i], aj = sg * a[j];
        acc[0] += ai * bj;          /* (air bjr, aii bji): sum = Re x */
        acc[1] += ai * sv_swap(bj); /* (air bji, aii bjr): diff = Im x */
        acc[2] += aj * bi;
        acc[3] += aj * sv_swap(bi);
        if (rot) {
          sv_v2 Ai = a[i], Aj = a[j];
          a[i] = C * Ai + sg * (F1 * Aj + F2 * sv_swap(Aj));
          a[j] = C * Aj + sg * (Q1 * Ai + Q2 * sv_swap(Ai));
        }
      }
      if (rot) {
        b[i] = C * bi + sg * (F1 * bj + F2 * sv_swap(bj));
        b[j] = C * bj + sg * (Q1 * bi + Q2 * sv_swap(bi));
      }
    }
    m = (m - g->mid) & g->mid;
  }
}

/* The pass shared by rotate, inner and inner_rotate2: over every live
 * sub-cube, blocks in fixed chunks (partial sums per chunk, in order).  a is
 * the vector conjugated in the inner product (l), b the other (p); with rot
 * set, both (or only b when a is NULL) are rotated. */
static double complex gen_pass(const sv_gen *g, double *restrict ad, double *restrict bd, int inner, int rot,
                               double theta) {
  sv_v2 *a = (sv_v2 *)ad, *b = (sv_v2 *)bd;
  unsigned B = 1u << g->lb;
  int nmid = __builtin_popcountll(g->mid);
  uint64_t nblk = (uint64_t)1 << nmid;
  uint64_t cb = SV_CHUNK / B ? SV_CHUNK / B : 1;
  uint64_t nch = (nblk + cb - 1) / cb;
  double re_all = 0, im_all = 0;
  double *part = inner ? xmalloc((size_t)nch * 2 * sizeof *part) : NULL;
  for (int si = 0; si < g->ns; si++) {
    const gen_sub *s = &g->sub[si];
    double c = cos(0.5 * theta * s->r), sn = sin(0.5 * theta * s->r) / s->r;
    /* f = -i sn e (row i), q = -i sn conj(e) (row j); z w = Z1 w + Z2 swap(w) */
    const double fr = sn * s->ei, fi = -sn * s->er, qr = -sn * s->ei, qi = -sn * s->er;
    const sv_v2 C = {c, c}, F1 = {fr, fr}, F2 = {-fi, fi}, Q1 = {qr, qr}, Q2 = {-qi, qi};
    const double er = s->er, ei = s->ei;
#pragma omp parallel for schedule(static) if (nblk * B >= 2 * SV_PAR_MIN)
    for (uint64_t ch = 0; ch < nch; ch++) {
      uint64_t b0 = ch * cb, b1 = b0 + cb < nblk ? b0 + cb : nblk;
      sv_v2 acc[4] = {{0, 0}, {0, 0}, {0, 0}, {0, 0}};
      if (inner && rot) gen_blocks(g, s, 1, 1, a, b, b0, b1, C, F1, F2, Q1, Q2, acc);
      else if (inner) gen_blocks(g, s, 1, 0, a, b, b0, b1, C, F1, F2, Q1, Q2, acc);
      else gen_blocks(g, s, 0, 1, a, b, b0, b1, C, F1, F2, Q1, Q2, acc);
      if (inner) {
        double xr = acc[0][0] + acc[0][1], xi = acc[1][0] - acc[1][1];
        double yr = acc[2][0] + acc[2][1], yi = acc[3][0] - acc[3][1];
        /* e x + conj(e) y */
        part[2 * ch] = (er * xr - ei * xi) + (er * yr + ei * yi);
        part[2 * ch + 1] = (er * xi + ei * xr) + (er * yi - ei * yr);
      }
    }
    if (inner)
      for (uint64_t ch = 0; ch < nch; ch++) {
        re_all += part[2 * ch];
        im_all += part[2 * ch + 1];
      }
  }
  free(part);
  return CMPLX(re_all, im_all);
}

void sv_gen_rotate(const sv_gen *g, sv_state *s, double theta) {
  gen_pass(g, NULL, (double *)s->a, 0, 1, theta);
}

double complex sv_gen_inner_rotate2(const sv_gen *g, sv_state *l, sv_state *p, double theta) {
  return gen_pass(g, (double *)l->a, (double *)p->a, 1, 1, theta);
}

double complex sv_gen_inner(const sv_gen *g, const sv_state *l, const sv_state *p) {
  return gen_pass(g, (double *)l->a, (double *)p->a, 1, 0, 0.0);
}
