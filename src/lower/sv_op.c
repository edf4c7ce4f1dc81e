/* sv_op.c — compiled Pauli sums: expectation values and op|psi> grouped by
 * X mask (see sv.h).
 *
 * For a word P = c X^x Z^z (letters as in pauli.h, Y = XZ up to i) acting on
 * a basis state,  (P psi)_i = c i^ny (-1)^|(i^x) & z| psi_{i^x},  ny = |x & z|.
 * Folding the constant phases into the coefficient, a group of terms sharing
 * x gives
 *     (H_g psi)_i = h_g(i) psi_{i^x},   h_g(i) = sum_t d_t (-1)^|i & z_t|,
 *     d_t = c_t (-i)^ny_t.
 * The register is cut into blocks of B = 2^L consecutive amplitudes
 * (i = H | l, H the high bits).  Within a block the high part of each sign is
 * one parity per term, and the low part is a row of a B x B table of signs:
 *     h_g(H | l) = sum_u a_u(H) tau[u][l],  a_u(H) = sum_{t : z_t low = u} d_t (-1)^|H & z_t|,
 * so a block costs one parity per term plus B multiply-adds per distinct low
 * pattern, and a block where every a_u vanishes (a whole block of states the
 * group cannot connect) costs nothing more.  Each block of the output is
 * written by one thread, summing the groups in a fixed order. */
#include "config.h"

#include "cairn/sv.h"
#include "cairn/util.h"
#include "lower/sv_priv.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* log2 of the block size: the sign table (B*B doubles, 32 KiB) stays in L1. */
#define OP_LOG_BLOCK 6

typedef struct op_group {
  uint64_t x;          /* X mask shared by the group */
  uint32_t ufirst, nu; /* distinct low patterns: u index range [ufirst, ufirst+nu) */
} op_group;

struct sv_op {
  int n;           /* qubits */
  int L;           /* log2 of the block size (min(n, OP_LOG_BLOCK)) */
  size_t nterms, ngroups, nu;
  op_group *g;     /* ngroups */
  uint32_t *ulow;  /* nu: the low pattern u (0..B-1) */
  uint32_t *ut;    /* nu + 1: terms of pattern k are [ut[k], ut[k+1]) */
  uint64_t *z;     /* nterms: Z masks */
  double *dr, *di; /* nterms: d_t, phases folded in */
  double *tau;     /* B*B: tau[u*B + l] = (-1)^|u & l| */
};

typedef struct op_term {
  uint64_t x, z;
  double dr, di;
} op_term;

static int term_cmp(const void *pa, const void *pb) {
  const op_term *a = pa, *b = pb;
  if (a->x != b->x) return a->x < b->x ? -1 : 1;
  uint64_t m = 63; /* low patterns compared first; OP_LOG_BLOCK <= 6 */
  uint64_t la = a->z & m, lb = b->z & m;
  if (la != lb) return la < lb ? -1 : 1;
  if (a->z != b->z) return a->z < b->z ? -1 : 1;
  return 0;
}

uint64_t sv_op_bytes_bound(size_t terms) {
  size_t B = (size_t)1 << OP_LOG_BLOCK;
  return (uint64_t)terms * (sizeof(op_group) + 2 * sizeof(uint32_t) + sizeof(uint64_t) + 2 * sizeof(double) +
                            sizeof(op_term)) +
         B * B * sizeof(double) + 4096;
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

  op_term *t = xcalloc(cs.len ? cs.len : 1, sizeof *t);
  for (size_t k = 0; k < cs.len; k++) {
    uint64_t x, z;
    sv_word_masks(&cs, k, &x, &z); /* n <= 48: always one word */
    int ny = __builtin_popcountll(x & z);
    /* d = c (-i)^ny */
    double complex d = cs.c[k];
    switch (ny & 3) {
    case 1: d *= -I; break;
    case 2: d = -d; break;
    case 3: d *= I; break;
    default: break;
    }
    t[k] = (op_term){x, z, creal(d), cimag(d)};
  }
  size_t nt = cs.len;
  pauli_sum_free(&cs);
  qsort(t, nt, sizeof *t, term_cmp);

  sv_op *op = xcalloc(1, sizeof *op);
  op->n = s->n;
  op->L = s->n < OP_LOG_BLOCK ? s->n : OP_LOG_BLOCK;
  op->nterms = nt;
  uint64_t B = (uint64_t)1 << op->L, lowm = B - 1;
  op->g = xcalloc(nt ? nt : 1, sizeof *op->g);
  op->ulow = xcalloc(nt ? nt : 1, sizeof *op->ulow);
  op->ut = xcalloc(nt + 1, sizeof *op->ut);
  op->z = xcalloc(nt ? nt : 1, sizeof *op->z);
  op->dr = xcalloc(nt ? nt : 1, sizeof *op->dr);
  op->di = xcalloc(nt ? nt : 1, sizeof *op->di);
  for (size_t k = 0; k < nt; k++) {
    op->z[k] = t[k].z;
    op->dr[k] = t[k].dr;
    op->di[k] = t[k].di;
    int new_group = k == 0 || t[k].x != t[k - 1].x;
    if (new_group) op->g[op->ngroups++] = (op_group){t[k].x, (uint32_t)op->nu, 0};
    if (new_group || (t[k].z & lowm) != (t[k - 1].z & lowm)) {
      op->ulow[op->nu] = (uint32_t)(t[k].z & lowm);
      op->ut[op->nu] = (uint32_t)k;
      op->nu++;
      op->g[op->ngroups - 1].nu++;
    }
  }
  op->ut[op->nu] = (uint32_t)nt;
  free(t);
  op->tau = xmalloc((size_t)(B * B) * sizeof *op->tau);
  for (uint64_t u = 0; u < B; u++)
    for (uint64_t l = 0; l < B; l++) op->tau[u * B + l] = sv_parity(u & l) ? -1.0 : 1.0;
  return op;
}

void sv_op_free(sv_op *op) {
  if (!op) return;
  free(op->g);
  free(op->ulow);
  free(op->ut);
  free(op->z);
  free(op->dr);
  free(op->di);
  free(op->tau);
  free(op);
}

int sv_op_qubits(const sv_op *op) { return op->n; }
size_t sv_op_terms(const sv_op *op) { return op->nterms; }
size_t sv_op_groups(const sv_op *op) { return op->ngroups; }
uint64_t sv_op_bytes(const sv_op *op) {
  uint64_t B = (uint64_t)1 << op->L;
  return sizeof *op + op->ngroups * sizeof(op_group) + op->nu * sizeof(uint32_t) * 2 +
         op->nterms * (sizeof(uint64_t) + 2 * sizeof(double)) + B * B * sizeof(double);
}

/* h_g over block H into (hr, hi)[0..B).  Returns 0 when the group has no
 * element in this block (every a_u is zero), leaving hr/hi untouched. */
static int group_block(const sv_op *op, const op_group *g, uint64_t H, uint64_t B, double *restrict hr,
                       double *restrict hi) {
  int any = 0;
  for (uint32_t k = g->ufirst; k < g->ufirst + g->nu; k++) {
    double ar = 0, ai = 0;
    for (uint32_t t = op->ut[k]; t < op->ut[k + 1]; t++) {
      if (sv_parity(H & op->z[t])) {
        ar -= op->dr[t];
        ai -= op->di[t];
      } else {
        ar += op->dr[t];
        ai += op->di[t];
      }
    }
    if (ar == 0 && ai == 0) continue;
    const double *restrict row = op->tau + (uint64_t)op->ulow[k] * B;
    if (!any) {
      for (uint64_t l = 0; l < B; l++) {
        hr[l] = ar * row[l];
        hi[l] = ai * row[l];
      }
      any = 1;
    } else {
      for (uint64_t l = 0; l < B; l++) {
        hr[l] += ar * row[l];
        hi[l] += ai * row[l];
      }
    }
  }
  return any;
}

/* One block of (op psi) into acc (interleaved re/im, 2B doubles); returns the
 * block's part of <psi|op psi>. */
static void op_block(const sv_op *op, const double *restrict v, uint64_t H, uint64_t B, double *restrict acc,
                     double *restrict hr, double *restrict hi) {
  uint64_t lowm = B - 1;
  memset(acc, 0, 2 * B * sizeof *acc);
  for (size_t gi = 0; gi < op->ngroups; gi++) {
    const op_group *g = &op->g[gi];
    if (!group_block(op, g, H, B, hr, hi)) continue;
    uint64_t xl = g->x & lowm, jb = H ^ (g->x & ~lowm);
    const double *restrict w = v + 2 * jb;
    for (uint64_t l = 0; l < B; l++) {
      uint64_t jl = l ^ xl;
      double pr = w[2 * jl], pi = w[2 * jl + 1];
      acc[2 * l] += hr[l] * pr - hi[l] * pi;
      acc[2 * l + 1] += hr[l] * pi + hi[l] * pr;
    }
  }
}

/* The shared driver of expect and apply: blocks in fixed chunks, each chunk
 * one thread's, partial <psi|op psi> per chunk summed in order. */
static double complex op_run(const sv_op *op, const sv_state *psi, sv_state *out) {
  uint64_t B = (uint64_t)1 << op->L, nblk = psi->dim >> op->L;
  uint64_t cb = SV_CHUNK / B ? SV_CHUNK / B : 1; /* blocks per chunk */
  uint64_t nch = (nblk + cb - 1) / cb;
  double *part = xmalloc((size_t)nch * 2 * sizeof *part);
  const double *v = (const double *)psi->a;
  double *o = out ? (double *)out->a : NULL;
#pragma omp parallel if (psi->dim >= SV_PAR_MIN)
  {
    double *scratch = xmalloc((size_t)(4 * B) * sizeof *scratch);
    double *acc = out ? NULL : xmalloc((size_t)(2 * B) * sizeof *acc);
#pragma omp for schedule(static)
    for (uint64_t ch = 0; ch < nch; ch++) {
      double re = 0, im = 0;
      uint64_t b1 = (ch + 1) * cb < nblk ? (ch + 1) * cb : nblk;
      for (uint64_t b = ch * cb; b < b1; b++) {
        uint64_t H = b << op->L;
        double *a = out ? o + 2 * H : acc;
        op_block(op, v, H, B, a, scratch, scratch + B);
        const double *restrict u = v + 2 * H;
        for (uint64_t l = 0; l < B; l++) {
          re += u[2 * l] * a[2 * l] + u[2 * l + 1] * a[2 * l + 1];
          im += u[2 * l] * a[2 * l + 1] - u[2 * l + 1] * a[2 * l];
        }
      }
      part[2 * ch] = re;
      part[2 * ch + 1] = im;
    }
    free(acc);
    free(scratch);
  }
  double re = 0, im = 0;
  for (uint64_t c = 0; c < nch; c++) {
    re += part[2 * c];
    im += part[2 * c + 1];
  }
  free(part);
  return CMPLX(re, im);
}

double complex sv_op_expect(const sv_op *op, const sv_state *psi) { return op_run(op, psi, NULL); }

double complex sv_op_apply(const sv_op *op, const sv_state *psi, sv_state *out) { return op_run(op, psi, out); }
