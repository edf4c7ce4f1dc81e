/* taper.c — Z2 tapering with Z-type symmetries (qubit.h states the scheme).
 *
 * Symmetries: the Z words Z^a with a . x = 0 (mod 2) for the x mask of every
 * term, i.e. the GF(2) null space of the check matrix whose rows are those x
 * masks.  The row space is reduced to an XOR basis as the terms stream by
 * (cost per term ~ its X weight), brought to reduced row echelon form, and the
 * null space read off its free columns.  A basis of the null space with
 * exclusive pivot qubits is then chosen, preferring one that keeps the named
 * parity words of the encoding intact so the report can say why each qubit
 * goes. */
#include "config.h"

#include "qubit/qubit_impl.h"

#include "cairn/util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static inline int bit(const uint64_t *m, int q) { return pauli_get_x(m, q); }

static int low_bit(int nw, const uint64_t *v) {
  for (int i = 0; i < nw; i++)
    if (v[i]) return 64 * i + __builtin_ctzll(v[i]);
  return -1;
}

static int high_bit_in(int nw, const uint64_t *v, const uint64_t *allowed) {
  for (int i = nw - 1; i >= 0; i--) {
    uint64_t m = allowed ? v[i] & allowed[i] : v[i];
    if (m) return 64 * i + 63 - __builtin_clzll(m);
  }
  return -1;
}

static int is_zero(int nw, const uint64_t *v) {
  for (int i = 0; i < nw; i++)
    if (v[i]) return 0;
  return 1;
}

static inline void xor_into(int nw, uint64_t *a, const uint64_t *b) {
  for (int i = 0; i < nw; i++) a[i] ^= b[i];
}

static int parity_and(int nw, const uint64_t *a, const uint64_t *b) {
  int k = 0;
  for (int i = 0; i < nw; i++) k += __builtin_popcountll(a[i] & b[i]);
  return k & 1;
}

/* The null space of the x masks of H: returns k and fills ns (n masks room);
 * rows (n masks room) receives the reduced row basis, with rowpiv[p] = 1 for
 * the pivot columns. */
static int null_space(const pauli_sum *H, uint64_t *rows, char *rowpiv, uint64_t *ns) {
  int n = H->n, nw = H->nw;
  size_t w = (size_t)nw;
  uint64_t *v = xmalloc(w * sizeof *v);
  int rank = 0;
  for (size_t t = 0; t < H->len && rank < n; t++) {
    memcpy(v, pauli_sum_x(H, t), w * sizeof *v);
    for (;;) {
      int p = low_bit(nw, v);
      if (p < 0) break;
      if (!rowpiv[p]) {
        memcpy(rows + (size_t)p * w, v, w * sizeof *v);
        rowpiv[p] = 1;
        rank++;
        break;
      }
      xor_into(nw, v, rows + (size_t)p * w);
    }
  }
  free(v);
  /* reduced row echelon form: clear each pivot column from the rows below it */
  for (int p = 0; p < n; p++) {
    if (!rowpiv[p]) continue;
    for (int q = 0; q < p; q++)
      if (rowpiv[q] && bit(rows + (size_t)q * w, p)) xor_into(nw, rows + (size_t)q * w, rows + (size_t)p * w);
  }
  int k = 0;
  for (int f = 0; f < n; f++) {
    if (rowpiv[f]) continue;
    uint64_t *a = ns + (size_t)k * w;
    memset(a, 0, w * sizeof *a);
    pauli_set(a, f, 1);
    for (int p = 0; p < n; p++)
      if (rowpiv[p] && bit(rows + (size_t)p * w, f)) pauli_set(a, p, 1);
    k++;
  }
  return k;
}

static int in_null_space(int n, int nw, const uint64_t *rows, const char *rowpiv, const uint64_t *a) {
  for (int p = 0; p < n; p++)
    if (rowpiv[p] && parity_and(nw, rows + (size_t)p * nw, a)) return 0;
  return 1;
}

/* Try to build a basis of span(ns) with exclusive pivots in which the named
 * words L[0..nl) appear unchanged.  On success fills tau/piv (k entries) and
 * returns 1. */
static int choose_basis(int n, int nw, const uint64_t *ns, int k, const uint64_t *const *L, int nl,
                        uint64_t *tau, int *piv) {
  size_t w = (size_t)nw;
  uint64_t *uni = xcalloc(w, sizeof *uni), *C = xcalloc(w, sizeof *C);
  for (int i = 0; i < nl; i++)
    for (size_t j = 0; j < w; j++) uni[j] |= L[i][j];
  for (int q = 0; q < n; q++)
    if (!bit(uni, q)) pauli_set(C, q, 1);
  int ok = 1, m = 0;
  /* pivots of the named words: a qubit of l in no other named word */
  for (int i = 0; i < nl && ok; i++) {
    uint64_t *only = xmalloc(w * sizeof *only);
    memcpy(only, L[i], w * sizeof *only);
    for (int j = 0; j < nl; j++)
      if (j != i)
        for (size_t t = 0; t < w; t++) only[t] &= ~L[j][t];
    int q = high_bit_in(nw, only, NULL);
    free(only);
    if (q < 0) ok = 0;
    else {
      memcpy(tau + (size_t)m * w, L[i], w * sizeof *tau);
      piv[m++] = q;
    }
  }
  /* the rest: vectors of the space independent on the columns C */
  uint64_t *proj = xcalloc((size_t)(k > 0 ? k : 1) * w, sizeof *proj);
  int nr = 0;
  for (int s = 0; s < k && ok && m + nr < k; s++) {
    uint64_t *full = tau + (size_t)(m + nr) * w, *pr = proj + (size_t)nr * w;
    memcpy(full, ns + (size_t)s * w, w * sizeof *full);
    for (size_t t = 0; t < w; t++) pr[t] = full[t] & C[t];
    /* reduce by the earlier ones on their pivots (highest bit in C) */
    for (int r = 0; r < nr; r++) {
      int q = piv[m + r];
      if (bit(pr, q)) {
        xor_into(nw, pr, proj + (size_t)r * w);
        xor_into(nw, full, tau + (size_t)(m + r) * w);
      }
    }
    int q = high_bit_in(nw, pr, NULL);
    if (q < 0) continue;
    /* clear the new pivot from the earlier rest vectors */
    for (int r = 0; r < nr; r++)
      if (bit(proj + (size_t)r * w, q)) {
        xor_into(nw, proj + (size_t)r * w, pr);
        xor_into(nw, tau + (size_t)(m + r) * w, full);
      }
    piv[m + nr] = q;
    nr++;
  }
  if (ok && m + nr != k) ok = 0;
  if (ok) {
    /* clear the named pivots from the rest (named words are zero on C) */
    for (int r = m; r < k; r++)
      for (int i = 0; i < m; i++)
        if (bit(tau + (size_t)r * w, piv[i])) xor_into(nw, tau + (size_t)r * w, tau + (size_t)i * w);
  }
  free(proj);
  free(uni);
  free(C);
  return ok;
}

static const char *parity_name(qubit_parity p) {
  switch (p) {
  case QUBIT_PARITY_N: return "particle-number parity";
  case QUBIT_PARITY_ALPHA: return "spin-up parity";
  case QUBIT_PARITY_BETA: return "spin-down parity";
  }
  return "symmetry";
}

void qubit_taper_find(const pauli_sum *H, const uint64_t *ref, const qubit_encoder *enc, qubit_taper *t) {
  int n = H->n, nw = H->nw;
  size_t w = (size_t)nw, nm = (size_t)(n > 0 ? n : 1);
  memset(t, 0, sizeof *t);
  t->nqubits = n;
  uint64_t *rows = xcalloc(nm * w, sizeof *rows), *ns = xcalloc(nm * w, sizeof *ns);
  char *rowpiv = xcalloc(nm, 1);
  int k = null_space(H, rows, rowpiv, ns);

  /* the named parity words that are symmetries of H */
  uint64_t *named[3] = {NULL, NULL, NULL};
  int have[3] = {0, 0, 0};
  if (enc && enc->n == n)
    for (int p = 0; p < 3; p++) {
      named[p] = xcalloc(w, sizeof(uint64_t));
      qubit_parity_word(enc, (qubit_parity)p, named[p]);
      have[p] = !is_zero(nw, named[p]) && in_null_space(n, nw, rows, rowpiv, named[p]);
      if (have[p]) t->parities |= 1u << p;
    }
  uint64_t *tau = xcalloc((size_t)(k > 0 ? k : 1) * w, sizeof *tau);
  int *piv = xcalloc((size_t)(k > 0 ? k : 1), sizeof *piv);
  /* ORDER: particle number with a spin parity first, then pairs, singles, none */
  static const int options[7][2] = {{0, 1}, {0, 2}, {1, 2}, {0, -1}, {1, -1}, {2, -1}, {-1, -1}};
  for (int o = 0; o < 7; o++) {
    const uint64_t *L[2];
    int nl = 0, usable = 1;
    for (int j = 0; j < 2; j++) {
      int p = options[o][j];
      if (p < 0) continue;
      if (!have[p]) usable = 0;
      else L[nl++] = named[p];
    }
    if (!usable) continue;
    if (choose_basis(n, nw, ns, k, L, nl, tau, piv)) break;
  }
  /* order by pivot qubit */
  for (int i = 1; i < k; i++)
    for (int j = i; j > 0 && piv[j - 1] > piv[j]; j--) {
      int tp = piv[j];
      piv[j] = piv[j - 1];
      piv[j - 1] = tp;
      for (size_t s = 0; s < w; s++) {
        uint64_t tv = tau[(size_t)j * w + s];
        tau[(size_t)j * w + s] = tau[(size_t)(j - 1) * w + s];
        tau[(size_t)(j - 1) * w + s] = tv;
      }
    }
  t->nsym = k;
  t->tau = tau;
  t->pivot = piv;
  t->sector = xcalloc((size_t)(k > 0 ? k : 1), sizeof *t->sector);
  t->why = xcalloc((size_t)(k > 0 ? k : 1), sizeof *t->why);
  for (int i = 0; i < k; i++) {
    const uint64_t *a = tau + (size_t)i * w;
    t->sector[i] = parity_and(nw, a, ref) ? -1 : 1;
    const char *why = enc ? "spatial symmetry" : "symmetry";
    for (int p = 0; p < 3; p++)
      if (named[p] && memcmp(named[p], a, w * sizeof *a) == 0) why = parity_name((qubit_parity)p);
    t->why[i] = xstrdup(why);
  }
  t->keep = xcalloc(nm, sizeof *t->keep);
  char *removed = xcalloc(nm, 1);
  for (int i = 0; i < k; i++) removed[piv[i]] = 1;
  int m = 0;
  for (int q = 0; q < n; q++)
    if (!removed[q]) t->keep[m++] = q;
  free(removed);
  for (int p = 0; p < 3; p++) free(named[p]);
  free(rows);
  free(ns);
  free(rowpiv);
}

void qubit_taper_free(qubit_taper *t) {
  if (!t) return;
  for (int i = 0; i < t->nsym; i++) free(t->why ? t->why[i] : NULL);
  free(t->why);
  free(t->tau);
  free(t->pivot);
  free(t->sector);
  free(t->keep);
  int n = t->nqubits;
  memset(t, 0, sizeof *t);
  t->nqubits = n;
}

static const double complex ipow[4] = {1, I, -1, -I};

int qubit_taper_apply(const qubit_taper *t, const pauli_sum *in, pauli_sum *out) {
  int n = t->nqubits, nw = pauli_nwords(n), m = n - t->nsym, mw = pauli_nwords(m);
  size_t w = (size_t)nw;
  pauli_sum_free(out);
  pauli_sum_init(out, m);
  if (in->n != n) return -1;
  for (size_t k = 0; k < in->len; k++)
    for (int i = 0; i < t->nsym; i++)
      if (parity_and(nw, pauli_sum_x(in, k), t->tau + (size_t)i * w)) return -1;
  uint64_t *x = xmalloc(w * sizeof *x), *z = xmalloc(w * sizeof *z);
  uint64_t *zero = xcalloc(w, sizeof *zero), *xq = xcalloc(w, sizeof *xq);
  uint64_t *ox = xcalloc((size_t)mw, sizeof *ox), *oz = xcalloc((size_t)mw, sizeof *oz);
  pauli_acc *acc = pauli_acc_new(m, in->len);
  for (size_t k = 0; k < in->len; k++) {
    memcpy(x, pauli_sum_x(in, k), w * sizeof *x);
    memcpy(z, pauli_sum_z(in, k), w * sizeof *z);
    int ph = 0;
    double complex c = in->c[k];
    for (int i = 0; i < t->nsym; i++) {
      int q = t->pivot[i];
      if (!bit(z, q)) continue; /* commutes with X_q: U P U = P */
      /* anticommutes with X_q: U P U = P tau X_q */
      ph += pauli_word_mul(nw, x, z, zero, t->tau + (size_t)i * w, x, z);
      pauli_set(xq, q, 1);
      ph += pauli_word_mul(nw, x, z, xq, zero, x, z);
      pauli_set(xq, q, 0);
    }
    for (int i = 0; i < t->nsym; i++)
      if (bit(x, t->pivot[i]) && t->sector[i] < 0) ph += 2;
    c *= ipow[ph & 3];
    memset(ox, 0, (size_t)mw * sizeof *ox);
    memset(oz, 0, (size_t)mw * sizeof *oz);
    for (int j = 0; j < m; j++) {
      int q = t->keep[j];
      if (bit(x, q)) pauli_set(ox, j, 1);
      if (bit(z, q)) pauli_set(oz, j, 1);
    }
    pauli_acc_add(acc, ox, oz, c);
  }
  pauli_acc_finish(acc, out, 1e-14);
  free(x);
  free(z);
  free(zero);
  free(xq);
  free(ox);
  free(oz);
  return 0;
}

void qubit_taper_bits(const qubit_taper *t, const uint64_t *ref, uint64_t *out) {
  int m = t->nqubits - t->nsym;
  memset(out, 0, (size_t)pauli_nwords(m) * sizeof *out);
  for (int j = 0; j < m; j++)
    if (bit(ref, t->keep[j])) pauli_set(out, j, 1);
}
