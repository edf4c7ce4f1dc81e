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

/* dst = src with memcpy over fixed chunks (also the benchmark's copy: the C
 * library's copy is the fastest plain one we have). */
void sv_copy(sv_state *dst, const sv_state *src) {
  uint64_t dim = src->dim, cb = 4 * SV_CHUNK, nch = (dim + cb - 1) / cb;
#pragma omp parallel for schedule(static) if (dim >= 2 * SV_PAR_MIN)
  for (uint64_t c = 0; c < nch; c++) {
    uint64_t lo = c * cb, n = lo + cb < dim ? cb : dim - lo;
    memcpy(dst->a + lo, src->a + lo, (size_t)n * sizeof *dst->a);
  }
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
#pragma omp parallel for schedule(static) if (dim >= 2 * SV_PAR_MIN)
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

/* The kernels below walk the register in blocks of 64 amplitudes: the sign
 * (-1)^|i & z| of row i = base + l is the block's parity times row[l], a
 * 64-entry table of (-1)^|l & z| built once per call.  Pairs (i, j = i ^ x)
 * with bit p (the top bit of x) of i clear: when p >= 6 they are whole blocks
 * (base with bit p clear, partner block base ^ x_high, partner row l ^ x_low);
 * when p < 6 both rows lie in one block. */
#define BLK 64


static void sign_row(uint64_t z, double *row) {
  for (unsigned l = 0; l < BLK; l++) row[l] = sv_parity(l & z) ? -1.0 : 1.0;
}

/* A chunk's inner-product accumulators, lanes (re re, im im) and (re im, im re),
 * as the (re, im) of sum conj(a) b, stored at its place among the parts. */
static inline void acc_store(double *part, uint64_t ch, const sv_v2 *acc) {
  part[2 * ch] = acc[0][0] + acc[0][1];
  part[2 * ch + 1] = acc[1][0] - acc[1][1];
}

/* The parts summed in chunk order, then freed. */
static double complex parts_sum_free(parts *ps, const double *part, uint64_t nch) {
  double complex r = sum_parts(part, nch);
  parts_free(ps);
  return r;
}

/* The operation on one pair, given the sign of row i. */
typedef enum pair_op { OP_ROTATE, OP_WORD, OP_INNER, OP_INNER_ROTATE } pair_op;

typedef struct kparams {
  sv_v2 C;       /* (c, c) */
  sv_v2 F1, F2;  /* f b = F1 b + F2 swap(b): f = -i s i^ny (rotate) or i^ny (word) */
  double eps;    /* (-1)^ny */
} kparams;

/* W(b) = b or swap(b): the lane order f multiplies (fim: f imaginary). */
static inline __attribute__((always_inline)) sv_v2 wlanes(int fim, sv_v2 b) { return fim ? sv_swap(b) : b; }

/* Per-call tables, for the two parities sb of a block (index 0: +1, 1: -1),
 * indexed by the row l in the block: the sign sigma = sb row[l] and
 * sigma eps as lane pairs, and the same times f's lanes (F1 or F2). */
typedef struct ktab {
  sv_v2 sg[2][BLK], se[2][BLK]; /* sigma, sigma eps */
  sv_v2 fj[2][BLK], fi[2][BLK]; /* sigma f (row j), sigma eps f (row i) */
} ktab;

static void ktab_build(ktab *t, const kparams *k, int fim, const double *row) {
  sv_v2 F = fim ? k->F2 : k->F1;
  for (int s = 0; s < 2; s++)
    for (unsigned l = 0; l < BLK; l++) {
      double sg = (s ? -1.0 : 1.0) * row[l];
      t->sg[s][l] = (sv_v2){sg, sg};
      t->se[s][l] = (sv_v2){sg * k->eps, sg * k->eps};
      t->fj[s][l] = sg * F;
      t->fi[s][l] = (sg * k->eps) * F;
    }
}

/* One pair (i, j) at row l of a block with parity index s: a (the vector
 * conjugated in the inner product, or NULL) and b. */
static inline __attribute__((always_inline)) void pair_step(pair_op op, int fim, const kparams *k, const ktab *t,
                                                            int s, unsigned l, sv_v2 *restrict pa, sv_v2 *restrict qa,
                                                            sv_v2 *restrict pb, sv_v2 *restrict qb, sv_v2 *acc) {
  /* pb, qb: rows i and j of b; pa, qa: of a */
  sv_v2 bi = *pb, bj = *qb;
  if (op == OP_INNER || op == OP_INNER_ROTATE) {
    /* eps conj(a_i) b_j + conj(a_j) b_i, times sigma_i; the phase i^ny later */
    sv_v2 ai = *pa, aj = *qa;
    sv_v2 t1 = t->se[s][l] * ai, t2 = t->sg[s][l] * aj;
    acc[0] += t1 * bj + t2 * bi;                   /* lanes (ar br, ai bi) */
    acc[1] += t1 * sv_swap(bj) + t2 * sv_swap(bi); /* lanes (ar bi, ai br) */
    if (op == OP_INNER_ROTATE) {
      *pa = k->C * ai + t->fi[s][l] * wlanes(fim, aj);
      *qa = k->C * aj + t->fj[s][l] * wlanes(fim, ai);
    }
  }
  if (op == OP_ROTATE || op == OP_INNER_ROTATE) {
    *pb = k->C * bi + t->fi[s][l] * wlanes(fim, bj);
    *qb = k->C * bj + t->fj[s][l] * wlanes(fim, bi);
  } else if (op == OP_WORD) {
    *pb = t->fi[s][l] * wlanes(fim, bj);
    *qb = t->fj[s][l] * wlanes(fim, bi);
  }
}

/* Blocks [q0, q1) of the pass (see pairs_pass); specialized by the inliner
 * for each (op, fim). */
static inline __attribute__((always_inline)) void pairs_chunk(pair_op op, int fim, const kparams *k, const ktab *t,
                                                              sv_v2 *restrict a, sv_v2 *restrict b, uint64_t q0,
                                                              uint64_t q1, int p, uint64_t x, uint64_t z,
                                                              const unsigned char *lows, int stream, sv_v2 *acc) {
  uint64_t xl = x & (BLK - 1), xh = x & ~(uint64_t)(BLK - 1);
  for (uint64_t q = q0; q < q1; q++) {
    uint64_t base = (p >= 6 ? sv_insert0(q, p - 6) : q) * BLK, jb = base ^ xh;
    int s = (int)sv_parity(base & z);
    sv_v2 *ab = a ? a + base : NULL, *aj = a ? a + jb : NULL, *bb = b + base, *bj = b + jb;
    if (p >= 6 && xl == 0) { /* partner rows in the same order */
      for (unsigned l = 0; l < BLK; l++) pair_step(op, fim, k, t, s, l, ab + l, aj + l, bb + l, bj + l, acc);
    } else if (p >= 6 && (xl < 32 || !stream)) {
      for (unsigned l = 0; l < BLK; l++)
        pair_step(op, fim, k, t, s, l, ab + l, aj + (l ^ xl), bb + l, bj + (l ^ xl), acc);
    } else if (p >= 6) { /* x has bit 5: the partner block through an L1 copy, as in pairs_chunk_run */
      sv_v2 ta[BLK], tb[BLK];
      for (unsigned l = 0; l < BLK; l++) tb[l ^ xl] = bj[l];
      if (a)
        for (unsigned l = 0; l < BLK; l++) ta[l ^ xl] = aj[l];
      for (unsigned l = 0; l < BLK; l++) pair_step(op, fim, k, t, s, l, ab + l, ta + l, bb + l, tb + l, acc);
      if (op != OP_INNER)
        for (unsigned l = 0; l < BLK; l++) bj[l] = tb[l ^ xl];
      if (op == OP_INNER_ROTATE)
        for (unsigned l = 0; l < BLK; l++) aj[l] = ta[l ^ xl];
    } else {
      for (unsigned h = 0; h < BLK / 2; h++) {
        unsigned l = lows[h];
        pair_step(op, fim, k, t, s, l, ab + l, ab + (l ^ xl), bb + l, bb + (l ^ xl), acc);
      }
    }
  }
}

/* Runs of RUN rows (4 KiB) for vectors that stream from memory, when x has
 * bit 6 or 7 and p >= 8 (bit 5 alone: one block, in pairs_chunk): the partner of row o of a run is row o ^ d of the
 * partner run, d = x & (RUN - 1).  Taken in the plain order, that partner
 * stream jumps back and forth by 512 B to 2 KiB, and the pass ran at half
 * the speed of the others (24 qubits: X0 Y5 Z9 X23 at 43 % of the copy
 * bandwidth and X6 X23 at 50 %, X0 Y1 Z9 X23 at 120 %).  Here the partner run is read and
 * written in address order through an L1 copy; the arithmetic is the same.
 * In cache the copy costs more than it saves, hence SV_STREAM_MIN. */
#define RUN 256
static inline __attribute__((always_inline)) void pairs_chunk_run(pair_op op, int fim, const kparams *k,
                                                                  const ktab *t, sv_v2 *restrict a,
                                                                  sv_v2 *restrict b, uint64_t q0, uint64_t q1, int p,
                                                                  uint64_t x, uint64_t z, sv_v2 *acc) {
  unsigned d = (unsigned)(x & (RUN - 1));
  uint64_t xh = x & ~(uint64_t)(RUN - 1);
  sv_v2 ta[RUN], tb[RUN];
  for (uint64_t q = q0; q < q1; q += RUN / BLK) {
    uint64_t base = sv_insert0(q, p - 6) * BLK, jb = base ^ xh; /* RUN / BLK whole blocks: p - 6 >= 2 */
    sv_v2 *ab = a ? a + base : NULL, *aj = a ? a + jb : NULL, *bb = b + base, *bj = b + jb;
    for (unsigned o = 0; o < RUN; o++) tb[o ^ d] = bj[o];
    if (a)
      for (unsigned o = 0; o < RUN; o++) ta[o ^ d] = aj[o];
    for (unsigned u = 0; u < RUN / BLK; u++) {
      int s = (int)sv_parity((base + u * BLK) & z);
      for (unsigned l = 0; l < BLK; l++) {
        unsigned o = u * BLK + l;
        pair_step(op, fim, k, t, s, l, ab + o, ta + o, bb + o, tb + o, acc);
      }
    }
    if (op != OP_INNER)
      for (unsigned o = 0; o < RUN; o++) bj[o] = tb[o ^ d];
    if (op == OP_INNER_ROTATE)
      for (unsigned o = 0; o < RUN; o++) aj[o] = ta[o ^ d];
  }
}

#define PAIRS_CHUNK(OP, ...) (fim ? pairs_chunk(OP, 1, k, &t, __VA_ARGS__) : pairs_chunk(OP, 0, k, &t, __VA_ARGS__))
#define PAIRS_RUN(OP, ...) \
  (fim ? pairs_chunk_run(OP, 1, k, &t, __VA_ARGS__) : pairs_chunk_run(OP, 0, k, &t, __VA_ARGS__))


/* Every pair of the register, in chunks of blocks; returns the sum of the
 * per-chunk accumulators (in chunk order) as (re, im) of sum conj(a) ... . */
static double complex pairs_pass(pair_op op, int fim, const kparams *k, sv_v2 *restrict a, sv_v2 *restrict b,
                                 uint64_t dim, uint64_t x, uint64_t z, int stream) {
  int p = sv_top_bit(x);
  double row[BLK];
  sign_row(z & (BLK - 1), row);
  ktab t;
  ktab_build(&t, k, fim, row);
  unsigned char lows[BLK / 2]; /* rows of a block with bit p clear (p < 6) */
  for (unsigned h = 0; h < BLK / 2; h++) lows[h] = (unsigned char)(p < 6 ? sv_insert0(h, p) : h);
  int inner = op == OP_INNER || op == OP_INNER_ROTATE;
  if (dim < BLK) { /* small registers: one block, pairs one by one */
    sv_v2 acc[2] = {{0, 0}, {0, 0}};
    for (uint64_t q = 0; q < dim / 2; q++) {
      uint64_t i = sv_insert0(q, p);
      pair_step(op, fim, k, &t, 0, (unsigned)i, a ? a + i : NULL, a ? a + (i ^ x) : NULL, b + i, b + (i ^ x), acc);
    }
    return CMPLX(acc[0][0] + acc[0][1], acc[1][0] - acc[1][1]);
  }
  uint64_t nblk = dim / BLK;
  /* blocks visited: all of them (p < 6) or those with bit p clear */
  uint64_t nvis = p >= 6 ? nblk / 2 : nblk, cb = SV_CHUNK / BLK, nch = (nvis + cb - 1) / cb;
  /* vectors from memory, not from cache: 4 KiB runs.  Their block steps fit
   * the chunks (static assert) and nvis = 2^(n-7) >= RUN / BLK when p >= 8. */
  _Static_assert(SV_CHUNK / BLK % (RUN / BLK) == 0, "a chunk holds whole 4 KiB runs");
  int run = stream && p >= 8 && (x & 0xC0);
  parts ps;
  double *part = parts_get(&ps, inner ? nch : 1);
#pragma omp parallel for schedule(static) if (dim >= 2 * SV_PAR_MIN)
  for (uint64_t ch = 0; ch < nch; ch++) {
    sv_v2 acc[2] = {{0, 0}, {0, 0}};
    uint64_t q0 = ch * cb, q1 = (ch + 1) * cb < nvis ? (ch + 1) * cb : nvis;
    if (run) {
      switch (op) {
      case OP_ROTATE: PAIRS_RUN(OP_ROTATE, a, b, q0, q1, p, x, z, acc); break;
      case OP_WORD: PAIRS_RUN(OP_WORD, a, b, q0, q1, p, x, z, acc); break;
      case OP_INNER: PAIRS_RUN(OP_INNER, a, b, q0, q1, p, x, z, acc); break;
      case OP_INNER_ROTATE: PAIRS_RUN(OP_INNER_ROTATE, a, b, q0, q1, p, x, z, acc); break;
      }
    } else {
      switch (op) {
      case OP_ROTATE: PAIRS_CHUNK(OP_ROTATE, a, b, q0, q1, p, x, z, lows, stream, acc); break;
      case OP_WORD: PAIRS_CHUNK(OP_WORD, a, b, q0, q1, p, x, z, lows, stream, acc); break;
      case OP_INNER: PAIRS_CHUNK(OP_INNER, a, b, q0, q1, p, x, z, lows, stream, acc); break;
      case OP_INNER_ROTATE: PAIRS_CHUNK(OP_INNER_ROTATE, a, b, q0, q1, p, x, z, lows, stream, acc); break;
      }
    }
    if (inner) acc_store(part, ch, acc);
  }
  return inner ? parts_sum_free(&ps, part, nch) : (parts_free(&ps), 0);
}

/* Per-call tables of a diagonal pass, for the two block parities: sigma and
 * sigma S as lane pairs (S = (s, -s): the sine part of c - i s sigma). */
typedef struct dtab {
  sv_v2 sg[2][BLK], ss[2][BLK];
} dtab;

/* Blocks [q0, q1) of a diagonal pass (inlined per operation). */
static inline __attribute__((always_inline)) void diag_chunk(pair_op op, sv_v2 C, const dtab *t, sv_v2 *restrict a,
                                                             sv_v2 *restrict b, uint64_t q0, uint64_t q1, uint64_t bl,
                                                             uint64_t z, sv_v2 *acc) {
  int inner = op == OP_INNER || op == OP_INNER_ROTATE;
  for (uint64_t q = q0; q < q1; q++) {
    uint64_t base = q * bl;
    int s = (int)sv_parity(base & z);
    sv_v2 *ab = a ? a + base : NULL, *bb = b + base;
    const sv_v2 *sg = t->sg[s], *ss = t->ss[s];
    for (unsigned l = 0; l < bl; l++) {
      sv_v2 bi = bb[l];
      if (inner) {
        sv_v2 ai = ab[l], sa = sg[l] * ai;
        acc[0] += sa * bi;
        acc[1] += sa * sv_swap(bi);
        if (op == OP_INNER_ROTATE) ab[l] = C * ai + ss[l] * sv_swap(ai);
      }
      if (op == OP_ROTATE || op == OP_INNER_ROTATE) bb[l] = C * bi + ss[l] * sv_swap(bi);
      else if (op == OP_WORD) bb[l] = sg[l] * bi;
    }
  }
}

/* Diagonal words (x = 0): a_i <- (c - i s sigma_i) a_i, or <a|Z^z|b>. */
static double complex diag_pass(pair_op op, double c, double s, sv_v2 *restrict a, sv_v2 *restrict b, uint64_t dim,
                                uint64_t z) {
  double row[BLK];
  sign_row(z & (BLK - 1), row);
  dtab t;
  for (int k = 0; k < 2; k++)
    for (unsigned l = 0; l < BLK; l++) {
      double sg = (k ? -1.0 : 1.0) * row[l];
      t.sg[k][l] = (sv_v2){sg, sg};
      t.ss[k][l] = (sv_v2){sg * s, -sg * s}; /* (c - i s)(x + iy) = (c x + s y, c y - s x) */
    }
  uint64_t bl = dim < BLK ? dim : BLK, nblk = dim / bl, cb = SV_CHUNK / bl, nch = (nblk + cb - 1) / cb;
  int inner = op == OP_INNER || op == OP_INNER_ROTATE;
  const sv_v2 C = {c, c};
  parts ps;
  double *part = parts_get(&ps, inner ? nch : 1);
#pragma omp parallel for schedule(static) if (dim >= 2 * SV_PAR_MIN)
  for (uint64_t ch = 0; ch < nch; ch++) {
    sv_v2 acc[2] = {{0, 0}, {0, 0}};
    uint64_t q0 = ch * cb, q1 = (ch + 1) * cb < nblk ? (ch + 1) * cb : nblk;
    switch (op) {
    case OP_ROTATE: diag_chunk(OP_ROTATE, C, &t, a, b, q0, q1, bl, z, acc); break;
    case OP_WORD: diag_chunk(OP_WORD, C, &t, a, b, q0, q1, bl, z, acc); break;
    case OP_INNER: diag_chunk(OP_INNER, C, &t, a, b, q0, q1, bl, z, acc); break;
    case OP_INNER_ROTATE: diag_chunk(OP_INNER_ROTATE, C, &t, a, b, q0, q1, bl, z, acc); break;
    }
    if (inner) acc_store(part, ch, acc);
  }
  return inner ? parts_sum_free(&ps, part, nch) : (parts_free(&ps), 0);
}

/* exp(-i theta P/2) = c - i s P with (P a)_i = i^ny sigma_j a_j, j = i ^ x,
 * sigma_j = sigma_i (-1)^ny.  With f = -i s i^ny:
 *   a_i' = c a_i + eps sigma_i f a_j,  a_j' = c a_j + sigma_i f a_i,
 * eps = (-1)^ny. */
/* f = -i s i^ny is imaginary for even ny, real for odd ny. */
static void rot_params(uint64_t x, uint64_t z, double theta, kparams *k) {
  double c = cos(0.5 * theta), sn = sin(0.5 * theta), wr, wi;
  int ny = ycount(x, z);
  ipow(ny + 3, &wr, &wi);
  k->C = (sv_v2){c, c};
  k->F1 = (sv_v2){sn * wr, sn * wr};
  k->F2 = (sv_v2){-sn * wi, sn * wi};
  k->eps = (ny & 1) ? -1.0 : 1.0;
}

void sv_rotate(sv_state *s, uint64_t x, uint64_t z, double theta) {
  sv_rotate_order(s, x, z, theta, s->dim >= SV_STREAM_MIN);
}

void sv_rotate_order(sv_state *s, uint64_t x, uint64_t z, double theta, int stream) {
  sv_v2 *v = (sv_v2 *)s->a;
  if (x == 0) {
    diag_pass(OP_ROTATE, cos(0.5 * theta), sin(0.5 * theta), NULL, v, s->dim, z);
    return;
  }
  kparams k;
  rot_params(x, z, theta, &k);
  pairs_pass(OP_ROTATE, !(ycount(x, z) & 1), &k, NULL, v, s->dim, x, z, stream);
}

/* (P a)_i = i^ny sigma_j a_j: swap the pair with the phases. */
void sv_apply_word(sv_state *s, uint64_t x, uint64_t z) { sv_apply_word_order(s, x, z, s->dim >= SV_STREAM_MIN); }

void sv_apply_word_order(sv_state *s, uint64_t x, uint64_t z, int stream) {
  sv_v2 *v = (sv_v2 *)s->a;
  if (x == 0) {
    diag_pass(OP_WORD, 0, 0, NULL, v, s->dim, z);
    return;
  }
  int ny = ycount(x, z);
  double vr, vi;
  ipow(ny, &vr, &vi);
  kparams k = {{0, 0}, {vr, vr}, {-vi, vi}, (ny & 1) ? -1.0 : 1.0};
  pairs_pass(OP_WORD, ny & 1, &k, NULL, v, s->dim, x, z, stream);
}

/* <a|P|b> = i^ny sum over pairs of sigma_i (eps conj(a_i) b_j + conj(a_j) b_i)
 * (diagonal words: sum of sigma_i conj(a_i) b_i).  With rot set, both vectors
 * are then rotated by exp(-i theta P/2) in the same pass. */
static double complex word_inner(sv_v2 *restrict a, uint64_t x, uint64_t z, sv_v2 *restrict b, uint64_t dim, int rot,
                                 double theta, int stream) {
  pair_op op = rot ? OP_INNER_ROTATE : OP_INNER;
  if (x == 0) return diag_pass(op, cos(0.5 * theta), sin(0.5 * theta), a, b, dim, z);
  kparams k;
  rot_params(x, z, theta, &k);
  double complex r = pairs_pass(op, !(ycount(x, z) & 1), &k, a, b, dim, x, z, stream);
  double vr, vi;
  ipow(ycount(x, z), &vr, &vi);
  return r * CMPLX(vr, vi);
}

double complex sv_word_inner(const sv_state *a, uint64_t x, uint64_t z, const sv_state *b) {
  return word_inner((sv_v2 *)a->a, x, z, (sv_v2 *)b->a, a->dim, 0, 0.0, a->dim >= SV_STREAM_MIN);
}

double complex sv_word_inner_rotate2(sv_state *l, sv_state *p, uint64_t x, uint64_t z, double theta) {
  return word_inner((sv_v2 *)l->a, x, z, (sv_v2 *)p->a, l->dim, 1, theta, l->dim >= SV_STREAM_MIN);
}

double complex sv_word_inner_order(sv_state *l, sv_state *p, uint64_t x, uint64_t z, int rot, double theta,
                                   int stream) {
  return word_inner((sv_v2 *)l->a, x, z, (sv_v2 *)p->a, l->dim, rot, theta, stream);
}
