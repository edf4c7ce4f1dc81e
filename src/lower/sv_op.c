/* sv_op.c — compiled Pauli sums: expectation values and op|psi> grouped by
 * X mask (see sv.h).
 *
 * For a word P = c X^x Z^z (letters as in pauli.h, Y = XZ up to i) acting on
 * a basis state,  (P psi)_i = c i^ny (-1)^|(i^x) & z| psi_{i^x},  ny = |x & z|.
 * Folding the constant phases into the coefficient, a group of terms sharing
 * x gives
 *     (H_g psi)_i = h_g(i) psi_{i^x},   h_g(i) = sum_t d_t (-1)^|i & z_t|,
 *     d_t = c_t (-i)^ny_t.
 *
 * Sub-cubes.  Let S be the bits of x (at most SV_SBITS of them; for wider
 * words the highest ones).  On the rows where the bits S of i equal v,
 *     h_g(i) = sum_zeta e_{v,zeta} (-1)^|i & zeta|,
 *     e_{v,zeta} = sum_{t : z_t & ~S = zeta} d_t (-1)^|z_t & v|,
 * and terms that differ only on S merge.  This is where the structure of
 * fermionic Hamiltonians shows: X_p X_q + Y_p Y_q-type pairs cancel exactly
 * on half of the rows, and those sub-cubes are skipped altogether (a merged
 * coefficient below rounding, 8 eps sum |d_t|, counts as zero).
 *
 * Blocks.  Inside a sub-cube the rows are enumerated as base | off[l]: the
 * lowest SV_LOG_BLOCK free bits form the block index l, whose sign is a row
 * of a 64 x 64 table; the other bits (base) give one parity per merged term.
 * So a block of B rows costs one parity per term plus B multiply-adds per
 * distinct low pattern.
 *
 * Threads.  The top OP_TOP bits of the row index cut the register into
 * chunks; each chunk (one thread) writes only its own rows, summing groups in
 * a fixed order, so results do not depend on the team. */
#include "config.h"

#include "cairn/sv.h"
#include "cairn/util.h"
#include "lower/sv_priv.h"

#include <float.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define OP_TOP 6 /* most top bits that cut the register into chunks */

typedef struct op_term {  /* a merged term of a sub-cube */
  uint64_t zhi;           /* its Z mask outside the block bits */
  double er, ei;          /* e_{v,zeta} */
} op_term;

typedef struct op_pat {   /* terms sharing one pattern on the block bits */
  uint32_t u;             /* the pattern, compressed to the block index */
  uint32_t tfirst, nt;
} op_pat;

typedef struct op_sub {   /* a live sub-cube: rows with bits S equal to vm */
  uint64_t vm;
  uint32_t pfirst, np;
} op_sub;

typedef struct op_group {
  uint64_t x;
  uint64_t S;             /* bits that split the group */
  uint64_t mid;           /* free bits enumerated by base (not S, not block, not top) */
  uint64_t xhi;           /* x outside the block bits */
  uint32_t xlo;           /* x on the block bits, compressed */
  int lb;                 /* log2 of the block size of this group */
  uint32_t *off;          /* 2^lb row offsets of the block index */
  uint32_t sfirst, ns;    /* live sub-cubes */
} op_group;

struct sv_op {
  int n;
  int top;                /* chunk bits */
  size_t nterms;          /* terms of the canonical sum */
  size_t ngroups, nsubs, npats, nmerged;
  op_group *g;
  op_sub *sub;
  op_pat *pat;
  op_term *term;
  double *tau;            /* sv_sign_table() */
  int real;               /* every merged coefficient is real: h(i) is real */
  double *diag;           /* sv_op_cache_diagonal: h of the X-mask-0 group per row, or NULL */
  size_t diag_group;      /* that group's index */
};

double *sv_sign_table(void) {
  double *t = xmalloc(64 * 64 * sizeof *t);
  for (unsigned u = 0; u < 64; u++)
    for (unsigned l = 0; l < 64; l++) t[u * 64 + l] = sv_parity(u & l) ? -1.0 : 1.0;
  return t;
}

typedef struct raw_term {
  uint64_t x, z;
  double dr, di;
  uint64_t key1, key2;  /* sort keys inside a group: block pattern, then zeta */
} raw_term;

static int cmp_x(const void *pa, const void *pb) {
  const raw_term *a = pa, *b = pb;
  if (a->x != b->x) return a->x < b->x ? -1 : 1;
  return a->z < b->z ? -1 : a->z > b->z;
}
static int cmp_keys(const void *pa, const void *pb) {
  const raw_term *a = pa, *b = pb;
  if (a->key1 != b->key1) return a->key1 < b->key1 ? -1 : 1;
  if (a->key2 != b->key2) return a->key2 < b->key2 ? -1 : 1;
  return a->z < b->z ? -1 : a->z > b->z;
}

uint64_t sv_op_bytes_bound(size_t terms) {
  /* every term in every sub-cube of its group, plus per-group tables */
  return (uint64_t)terms * (((uint64_t)1 << SV_SBITS) * (sizeof(op_term) + sizeof(op_pat) + sizeof(op_sub)) +
                            sizeof(op_group) + sizeof(raw_term) + 4 * ((uint64_t)1 << SV_LOG_BLOCK)) +
         64 * 64 * sizeof(double) + 4096;
}

typedef struct op_build {  /* growable arrays of sv_op while compiling */
  size_t capg, caps, capp, capt;
} op_build;

/* Compile the nt terms at t (one X mask) into a group: split bits, block
 * layout, and for every value of the split bits the merged terms (dropping
 * sub-cubes where they all cancel). */
static void build_group(sv_op *op, op_build *b, raw_term *t, size_t nt, uint64_t topm) {
  int n = op->n;
  uint64_t all = n >= 64 ? ~(uint64_t)0 : (((uint64_t)1 << n) - 1);
  uint64_t x = t[0].x;
  uint64_t S = sv_highest_bits(x, SV_SBITS);
  uint64_t freeb = all & ~S & ~topm;
  int lb = __builtin_popcountll(freeb) < SV_LOG_BLOCK ? __builtin_popcountll(freeb) : SV_LOG_BLOCK;
  uint64_t blk = sv_lowest_bits(freeb, lb);
  UTIL_GROW(op->g, b->capg, op->ngroups + 1);
  op_group *g = &op->g[op->ngroups++];
  g->x = x;
  g->S = S;
  g->mid = freeb & ~blk;
  g->xhi = x & ~blk;
  g->xlo = (uint32_t)sv_extract(x & blk, blk);
  g->lb = lb;
  g->off = xmalloc(((size_t)1 << lb) * sizeof *g->off);
  for (uint64_t l = 0; l < ((uint64_t)1 << lb); l++) g->off[l] = (uint32_t)sv_deposit(l, blk);
  g->sfirst = (uint32_t)op->nsubs;
  g->ns = 0;
  for (size_t k = 0; k < nt; k++) {
    uint64_t zeta = t[k].z & ~S;
    t[k].key1 = sv_extract(zeta & blk, blk);
    t[k].key2 = zeta;
  }
  qsort(t, nt, sizeof *t, cmp_keys);
  int k = __builtin_popcountll(S);
  for (uint64_t v = 0; v < ((uint64_t)1 << k); v++) {
    uint64_t vm = sv_deposit(v, S);
    size_t p0 = op->npats;
    uint32_t np = 0;
    for (size_t a = 0; a < nt;) {
      /* one run of equal zeta: merge; runs of equal block pattern: one op_pat */
      size_t e = a;
      double er = 0, ei = 0, abs_sum = 0;
      while (e < nt && t[e].key2 == t[a].key2) {
        double s = sv_parity(t[e].z & vm) ? -1.0 : 1.0;
        er += s * t[e].dr;
        ei += s * t[e].di;
        abs_sum += fabs(t[e].dr) + fabs(t[e].di);
        e++;
      }
      double tol = 8 * DBL_EPSILON * abs_sum;
      if (fabs(er) > tol || fabs(ei) > tol) {
        uint32_t u = (uint32_t)t[a].key1;
        if (np == 0 || op->pat[op->npats - 1].u != u) {
          UTIL_GROW(op->pat, b->capp, op->npats + 1);
          op->pat[op->npats++] = (op_pat){u, (uint32_t)op->nmerged, 0};
          np++;
        }
        UTIL_GROW(op->term, b->capt, op->nmerged + 1);
        op->term[op->nmerged++] = (op_term){t[a].key2 & ~blk, er, ei};
        op->pat[op->npats - 1].nt++;
      }
      a = e;
    }
    if (np == 0) continue; /* the group has no element on these rows */
    UTIL_GROW(op->sub, b->caps, op->nsubs + 1);
    op->sub[op->nsubs++] = (op_sub){vm, (uint32_t)p0, np};
    g->ns++;
  }
}

sv_op *sv_op_new(const pauli_sum *s, char *err, size_t errlen) {
  if (s->n < 1 || s->n > SV_MAX_QUBITS) {
    snprintf(err, errlen, "a %d-qubit operator cannot be compiled: the statevector engine takes 1 to %d qubits", s->n,
             SV_MAX_QUBITS);
    return NULL;
  }
  pauli_sum cs;
  pauli_sum_init(&cs, s->n);
  pauli_sum_copy(&cs, s);
  pauli_sum_canonicalize(&cs, 0.0);
  size_t nt = cs.len;
  raw_term *t = xcalloc(nt ? nt : 1, sizeof *t);
  for (size_t k = 0; k < nt; k++) {
    uint64_t x, z;
    sv_word_masks(&cs, k, &x, &z); /* n <= 48: always one word */
    double complex d = cs.c[k];
    switch (__builtin_popcountll(x & z) & 3) { /* d = c (-i)^ny */
    case 1: d *= -I; break;
    case 2: d = -d; break;
    case 3: d *= I; break;
    default: break;
    }
    t[k] = (raw_term){x, z, creal(d), cimag(d), 0, 0};
  }
  pauli_sum_free(&cs);
  qsort(t, nt, sizeof *t, cmp_x);

  sv_op *op = xcalloc(1, sizeof *op);
  op->n = s->n;
  op->nterms = nt;
  /* chunk bits: room below them for a block and the split bits of most groups */
  int top = s->n - SV_LOG_BLOCK - 4; /* groups with more than 4 split bits get smaller blocks */
  op->top = top < 0 ? 0 : top > OP_TOP ? OP_TOP : top;
  uint64_t topm = op->top ? (((uint64_t)1 << op->top) - 1) << (s->n - op->top) : 0;
  op_build b = {0, 0, 0, 0};
  for (size_t a = 0; a < nt;) {
    size_t e = a;
    while (e < nt && t[e].x == t[a].x) e++;
    build_group(op, &b, t + a, e - a, topm);
    a = e;
  }
  free(t);
  op->tau = sv_sign_table();
  op->real = 1;
  for (size_t k = 0; k < op->nmerged; k++)
    if (op->term[k].ei != 0) op->real = 0;
  return op;
}

void sv_op_free(sv_op *op) {
  if (!op) return;
  for (size_t k = 0; k < op->ngroups; k++) free(op->g[k].off);
  free(op->g);
  free(op->sub);
  free(op->pat);
  free(op->term);
  free(op->tau);
  free(op->diag);
  free(op);
}

int sv_op_qubits(const sv_op *op) { return op->n; }
size_t sv_op_terms(const sv_op *op) { return op->nterms; }
size_t sv_op_groups(const sv_op *op) { return op->ngroups; }
uint64_t sv_op_bytes(const sv_op *op) {
  uint64_t b = (op->diag ? SV_DIAG_BYTES(op->n) : 0) + sizeof *op + op->ngroups * sizeof(op_group) + op->nsubs * sizeof(op_sub) +
               op->npats * sizeof(op_pat) + op->nmerged * sizeof(op_term) + 64 * 64 * sizeof(double);
  for (size_t k = 0; k < op->ngroups; k++) b += ((uint64_t)1 << op->g[k].lb) * sizeof(uint32_t);
  return b;
}

/* Real h (op->real) over the block into hr[0..B); 0 when it vanishes. */
static int block_h_real(const sv_op *op, const op_sub *s, uint64_t base, unsigned B, double *restrict hr) {
  int any = 0;
  for (uint32_t k = s->pfirst; k < s->pfirst + s->np; k++) {
    const op_pat *p = &op->pat[k];
    double ar = 0;
    for (uint32_t t = p->tfirst; t < p->tfirst + p->nt; t++) {
      const op_term *m = &op->term[t];
      ar += sv_parity(base & m->zhi) ? -m->er : m->er;
    }
    if (ar == 0) continue;
    const double *restrict row = op->tau + (size_t)p->u * 64;
    if (!any) {
#pragma omp simd
      for (unsigned l = 0; l < B; l++) hr[l] = ar * row[l];
      any = 1;
    } else {
#pragma omp simd
      for (unsigned l = 0; l < B; l++) hr[l] += ar * row[l];
    }
  }
  return any;
}

/* h over the block at `base` of sub-cube s into (hr, hi)[0..B).  Returns 0
 * when every merged coefficient's sum vanishes there (nothing written). */
static int block_h(const sv_op *op, const op_sub *s, uint64_t base, unsigned B, double *restrict hr,
                   double *restrict hi) {
  int any = 0;
  for (uint32_t k = s->pfirst; k < s->pfirst + s->np; k++) {
    const op_pat *p = &op->pat[k];
    double ar = 0, ai = 0;
    for (uint32_t t = p->tfirst; t < p->tfirst + p->nt; t++) {
      const op_term *m = &op->term[t];
      if (sv_parity(base & m->zhi)) {
        ar -= m->er;
        ai -= m->ei;
      } else {
        ar += m->er;
        ai += m->ei;
      }
    }
    if (ar == 0 && ai == 0) continue;
    const double *restrict row = op->tau + (size_t)p->u * 64;
    if (!any) {
#pragma omp simd
      for (unsigned l = 0; l < B; l++) {
        hr[l] = ar * row[l];
        hi[l] = ai * row[l];
      }
      any = 1;
    } else {
#pragma omp simd
      for (unsigned l = 0; l < B; l++) {
        hr[l] += ar * row[l];
        hi[l] += ai * row[l];
      }
    }
  }
  return any;
}

/* Rows of one block: y = h(i) psi_j with h = k * tau_row[l] (a sub-cube with
 * a single merged term; k complex, real when ki == 0) or h = (hr + i hi)[l]. */
typedef struct blk {
  const uint32_t *off;
  unsigned B, xlo;
  uint64_t base, jb;
} blk;

/* o_i += k tau_row[l] psi_j (apply), k = kr + i ki */
static void rows_apply1(const blk *b, double kr, double ki, const double *restrict row, const double *restrict v,
                        double *restrict o) {
  const sv_v2 *vv = (const sv_v2 *)v;
  sv_v2 *vo = (sv_v2 *)o;
  if (ki == 0 && b->xlo == 0) { /* the common case: x inside the split bits */
    const sv_v2 *vj = vv + b->jb;
    sv_v2 *oi = vo + b->base;
#pragma GCC unroll 4
    for (unsigned l = 0; l < b->B; l++) oi[b->off[l]] += (kr * row[l]) * vj[b->off[l]];
  } else if (ki == 0) {
    for (unsigned l = 0; l < b->B; l++) {
      uint64_t i = b->base | b->off[l], j = b->jb | b->off[l ^ b->xlo];
      vo[i] += (kr * row[l]) * vv[j];
    }
  } else {
    const sv_v2 K1 = {kr, kr}, K2 = {-ki, ki};
    for (unsigned l = 0; l < b->B; l++) {
      uint64_t i = b->base | b->off[l], j = b->jb | b->off[l ^ b->xlo];
      sv_v2 p = vv[j];
      vo[i] += row[l] * (K1 * p + K2 * sv_swap(p));
    }
  }
}

/* sum over the block of conj(psi_i) k tau_row[l] psi_j */
static double complex rows_expect1(const blk *b, double kr, double ki, const double *restrict row,
                                   const double *restrict v) {
  const sv_v2 *vv = (const sv_v2 *)v;
  sv_v2 a1 = {0, 0}, a2 = {0, 0};
  for (unsigned l = 0; l < b->B; l++) {
    uint64_t i = b->base | b->off[l], j = b->jb | b->off[l ^ b->xlo];
    sv_v2 u = row[l] * vv[i], p = vv[j];
    a1 += u * p;          /* (ur pr, ui pi) */
    a2 += u * sv_swap(p); /* (ur pi, ui pr) */
  }
  double re = a1[0] + a1[1], im = a2[0] - a2[1]; /* conj(u) p */
  return CMPLX(kr * re - ki * im, kr * im + ki * re);
}

static void rows_apply(const blk *b, const double *restrict hr, const double *restrict hi, const double *restrict v,
                       double *restrict o) {
  const sv_v2 *vv = (const sv_v2 *)v;
  sv_v2 *vo = (sv_v2 *)o;
  const sv_v2 sg = {-1, 1};
  if (!hi) {
    for (unsigned l = 0; l < b->B; l++) {
      uint64_t i = b->base | b->off[l], j = b->jb | b->off[l ^ b->xlo];
      vo[i] += hr[l] * vv[j];
    }
    return;
  }
  for (unsigned l = 0; l < b->B; l++) {
    uint64_t i = b->base | b->off[l], j = b->jb | b->off[l ^ b->xlo];
    sv_v2 p = vv[j];
    vo[i] += hr[l] * p + hi[l] * (sg * sv_swap(p));
  }
}

static double complex rows_expect(const blk *b, const double *restrict hr, const double *restrict hi,
                                  const double *restrict v) {
  const sv_v2 *vv = (const sv_v2 *)v;
  const sv_v2 sg = {-1, 1};
  sv_v2 a1 = {0, 0}, a2 = {0, 0};
  for (unsigned l = 0; l < b->B; l++) {
    uint64_t i = b->base | b->off[l], j = b->jb | b->off[l ^ b->xlo];
    sv_v2 p = vv[j], y = hr[l] * p + (hi ? hi[l] : 0.0) * (sg * sv_swap(p)), u = vv[i];
    a1 += u * y;
    a2 += u * sv_swap(y);
  }
  return CMPLX(a1[0] + a1[1], a2[0] - a2[1]);
}

/* One chunk (rows whose top bits are c): adds op psi into o (when o is set)
 * and returns the chunk's part of <psi|op psi>.  Sub-cubes with one merged
 * term (most of them for fermionic Hamiltonians) skip the block table. */
static double complex op_chunk(const sv_op *op, const double *restrict v, double *restrict o, uint64_t c,
                               double *restrict hr, double *restrict hi) {
  int n = op->n;
  uint64_t topm = op->top ? (((uint64_t)1 << op->top) - 1) << (n - op->top) : 0;
  uint64_t tc = op->top ? c << (n - op->top) : 0;
  double complex acc = 0;
  if (op->diag) { /* the tabulated diagonal: one multiply-add per row */
    uint64_t r0 = tc, r1 = tc + ((uint64_t)1 << (n - op->top));
    const sv_v2 *vv = (const sv_v2 *)v;
    if (o) {
      sv_v2 *vo = (sv_v2 *)o;
      for (uint64_t i = r0; i < r1; i++) vo[i] += op->diag[i] * vv[i];
    } else {
      double re = 0;
      for (uint64_t i = r0; i < r1; i++) re += op->diag[i] * (v[2 * i] * v[2 * i] + v[2 * i + 1] * v[2 * i + 1]);
      acc += re;
    }
  }
  for (size_t gi = 0; gi < op->ngroups; gi++) {
    const op_group *g = &op->g[gi];
    if (op->diag && gi == op->diag_group) continue;
    blk b = {g->off, 1u << g->lb, g->xlo, 0, 0};
    for (uint32_t si = g->sfirst; si < g->sfirst + g->ns; si++) {
      const op_sub *s = &op->sub[si];
      if ((tc ^ s->vm) & g->S & topm) continue; /* this sub-cube has no row in the chunk */
      uint64_t base0 = (tc & ~g->S) | s->vm, mid = g->mid, m = 0;
      const op_pat *p = &op->pat[s->pfirst];
      if (s->np == 1 && p->nt == 1) {
        const op_term *t = &op->term[p->tfirst];
        const double *row = op->tau + (size_t)p->u * 64;
        do {
          b.base = base0 | m;
          b.jb = b.base ^ g->xhi;
          double sg = sv_parity(b.base & t->zhi) ? -1.0 : 1.0;
          if (o) rows_apply1(&b, sg * t->er, sg * t->ei, row, v, o);
          else acc += rows_expect1(&b, sg * t->er, sg * t->ei, row, v);
          m = (m - mid) & mid; /* next subset of mid, increasing */
        } while (m);
        continue;
      }
      do {
        b.base = base0 | m;
        b.jb = b.base ^ g->xhi;
        if (op->real ? block_h_real(op, s, b.base, b.B, hr) : block_h(op, s, b.base, b.B, hr, hi)) {
          const double *h2 = op->real ? NULL : hi;
          if (o) rows_apply(&b, hr, h2, v, o);
          else acc += rows_expect(&b, hr, h2, v);
        }
        m = (m - mid) & mid;
      } while (m);
    }
  }
  if (o) { /* <psi|op psi> over the chunk's rows, after all groups */
    double re = 0, im = 0;
    uint64_t r0 = tc, r1 = tc + ((uint64_t)1 << (n - op->top));
    for (uint64_t i = r0; i < r1; i++) {
      re += v[2 * i] * o[2 * i] + v[2 * i + 1] * o[2 * i + 1];
      im += v[2 * i] * o[2 * i + 1] - v[2 * i + 1] * o[2 * i];
    }
    acc = CMPLX(re, im);
  }
  return acc;
}

/* Expect and apply share this driver: chunks in parallel, partial sums per
 * chunk added in chunk order. */
static double complex op_run(const sv_op *op, const sv_state *psi, sv_state *out) {
  uint64_t nch = (uint64_t)1 << op->top;
  double complex part[1 << OP_TOP];
  const double *v = (const double *)psi->a;
  double *o = out ? (double *)out->a : NULL;
  uint64_t rows = psi->dim >> op->top;
#pragma omp parallel if (psi->dim >= SV_OP_PAR_MIN && nch > 1)
  {
    double h[2 * 64];
#pragma omp for schedule(dynamic, 1)
    for (uint64_t c = 0; c < nch; c++) {
      if (o) memset(o + 2 * c * rows, 0, (size_t)rows * 2 * sizeof *o);
      part[c] = op_chunk(op, v, o, c, h, h + 64);
    }
  }
  double re = 0, im = 0;
  for (uint64_t c = 0; c < nch; c++) {
    re += creal(part[c]);
    im += cimag(part[c]);
  }
  return CMPLX(re, im);
}

/* The diagonal group's h on every row, block by block (the same sums as an
 * application, done once). */
int sv_op_cache_diagonal(sv_op *op) {
  if (op->diag || !op->real || op->ngroups == 0 || op->g[0].x != 0) return -1; /* x = 0 sorts first */
  const op_group *g = &op->g[0];
  uint64_t dim = (uint64_t)1 << op->n;
  double *d = xcalloc((size_t)dim, sizeof *d);
  unsigned B = 1u << g->lb;
#pragma omp parallel if (dim >= SV_OP_PAR_MIN)
  {
    double h[64];
    for (uint32_t si = g->sfirst; si < g->sfirst + g->ns; si++) {
      const op_sub *s = &op->sub[si];
      /* every row: the group's free bits and the chunk bits */
      uint64_t topm = op->top ? (((uint64_t)1 << op->top) - 1) << (op->n - op->top) : 0;
      uint64_t mid = g->mid | (topm & ~g->S), nb = (uint64_t)1 << __builtin_popcountll(mid);
#pragma omp for schedule(static)
      for (uint64_t q = 0; q < nb; q++) {
        uint64_t base = s->vm | sv_deposit(q, mid);
        if (block_h_real(op, s, base, B, h))
          for (unsigned l = 0; l < B; l++) d[base | g->off[l]] += h[l];
      }
    }
  }
  op->diag = d;
  op->diag_group = 0;
  return 0;
}

double complex sv_op_expect(const sv_op *op, const sv_state *psi) { return op_run(op, psi, NULL); }

double complex sv_op_apply(const sv_op *op, const sv_state *psi, sv_state *out) { return op_run(op, psi, out); }
