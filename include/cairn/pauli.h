/* pauli.h — Pauli words of any width and sums of them.
 *
 * A word on n qubits is a tensor product of letters I, X, Y, Z, stored as two
 * bit masks of pauli_nwords(n) 64-bit words each: qubit q has x bit and z bit
 *   I = (0,0)   X = (1,0)   Y = (1,1)   Z = (0,1)
 * (bit q%64 of mask word q/64).  A word carries no phase; phases live in the
 * complex coefficient of a sum, and word products return theirs as a power of i.
 *
 * Text forms: sparse "X0 Y1 Z5" (qubits from 0, any order on input, increasing
 * on output; "I" is the identity) and dense "XYZI" (character q is qubit q).
 *
 * Ownership: a pauli_sum owns its arrays.  Functions that write a pauli_sum
 * `out` expect it initialized (pauli_sum_init) and replace its contents; `out`
 * may not alias an input unless stated.
 */
#ifndef CAIRN_PAULI_H
#define CAIRN_PAULI_H

#include <complex.h>
#include <stddef.h>

/* C11's CMPLX where the C library leaves it to the compiler (clang). */
#ifndef CMPLX
#define CMPLX(x, y) __builtin_complex((double)(x), (double)(y))
#endif
#include <stdint.h>

static inline int pauli_nwords(int n) { return n <= 0 ? 1 : (n + 63) / 64; }

static inline int pauli_get_x(const uint64_t *x, int q) { return (int)((x[q >> 6] >> (q & 63)) & 1u); }
static inline void pauli_flip(uint64_t *m, int q) { m[q >> 6] ^= (uint64_t)1 << (q & 63); }
static inline void pauli_set(uint64_t *m, int q, int v) {
  uint64_t b = (uint64_t)1 << (q & 63);
  if (v) m[q >> 6] |= b;
  else m[q >> 6] &= ~b;
}

/* Letter of qubit q: 'I', 'X', 'Y' or 'Z'. */
char pauli_letter(const uint64_t *x, const uint64_t *z, int q);
/* Set qubit q of a word to letter ('I','X','Y','Z'). */
void pauli_set_letter(uint64_t *x, uint64_t *z, int q, char letter);

/* Product of words: w3 = w1 w2 up to the returned phase, i^k with k in 0..3
 * (w1 w2 = i^k w3).  x3/z3 may alias either input. */
int pauli_word_mul(int nw, const uint64_t *x1, const uint64_t *z1, const uint64_t *x2,
                   const uint64_t *z2, uint64_t *x3, uint64_t *z3);
/* 1 when the words commute, 0 when they anticommute. */
int pauli_word_commutes(int nw, const uint64_t *x1, const uint64_t *z1, const uint64_t *x2,
                        const uint64_t *z2);
/* Qubits with a letter other than I. */
int pauli_word_weight(int nw, const uint64_t *x, const uint64_t *z);
/* Support: the qubits with a letter other than I, increasing, written into
 * `qubits` (room for the weight); returns how many. */
int pauli_word_support(int nw, const uint64_t *x, const uint64_t *z, int *qubits);
/* Number of Y letters. */
int pauli_word_ycount(int nw, const uint64_t *x, const uint64_t *z);
int pauli_word_equal(int nw, const uint64_t *x1, const uint64_t *z1, const uint64_t *x2,
                     const uint64_t *z2);
int pauli_word_is_identity(int nw, const uint64_t *x, const uint64_t *z);
/* Total order used for canonical sums: lower weight first; then at the lowest
 * qubit where the words differ, a letter before I, and X < Y < Z. */
int pauli_word_cmp(int nw, const uint64_t *x1, const uint64_t *z1, const uint64_t *x2,
                   const uint64_t *z2);
uint64_t pauli_word_hash(int nw, const uint64_t *x, const uint64_t *z);

/* Parse sparse or dense text into a word of n qubits (masks zeroed first).
 * Returns 0, or -1 with a message in err (and *err_off, the byte offset of the
 * offending token in text): unknown letter, repeated qubit, qubit beyond n. */
int pauli_word_parse(const char *text, int n, uint64_t *x, uint64_t *z, char *err, size_t errlen,
                     size_t *err_off);
/* Sparse text ("X0 Y1 Z5", "I" for the identity); malloc'd, caller frees. */
char *pauli_word_str(int n, const uint64_t *x, const uint64_t *z);
/* Dense text of exactly n characters; malloc'd, caller frees. */
char *pauli_word_dense(int n, const uint64_t *x, const uint64_t *z);

typedef struct pauli_sum {
  int n;               /* qubits */
  int nw;              /* 64-bit words per mask */
  size_t len, cap;     /* terms */
  uint64_t *x, *z;     /* len*nw each; term t at x + t*nw */
  double complex *c;   /* coefficient of each term */
} pauli_sum;

static inline uint64_t *pauli_sum_x(const pauli_sum *s, size_t t) { return s->x + t * (size_t)s->nw; }
static inline uint64_t *pauli_sum_z(const pauli_sum *s, size_t t) { return s->z + t * (size_t)s->nw; }

void pauli_sum_init(pauli_sum *s, int n);
void pauli_sum_free(pauli_sum *s);
void pauli_sum_clear(pauli_sum *s); /* len = 0, keeps n and storage */
void pauli_sum_copy(pauli_sum *out, const pauli_sum *in);
void pauli_sum_reserve(pauli_sum *s, size_t cap);
/* Append a term (no merging; see pauli_sum_canonicalize). */
void pauli_sum_add(pauli_sum *s, const uint64_t *x, const uint64_t *z, double complex c);
/* Append the term given in text form (aborts on bad text: for code, not users). */
void pauli_sum_add_text(pauli_sum *s, const char *text, double complex c);
void pauli_sum_add_identity(pauli_sum *s, double complex c);
/* s += scale * t (appended). */
void pauli_sum_add_sum(pauli_sum *s, const pauli_sum *t, double complex scale);
void pauli_sum_scale(pauli_sum *s, double complex f);
/* Merge equal words, drop terms with |c| <= tol, sort into canonical order. */
void pauli_sum_canonicalize(pauli_sum *s, double tol);
/* out = a b (canonicalized with tol 0, exact zeros dropped). */
void pauli_sum_mul(pauli_sum *out, const pauli_sum *a, const pauli_sum *b);
/* out = [a, b] = a b - b a (only anticommuting pairs contribute). */
void pauli_sum_commutator(pauli_sum *out, const pauli_sum *a, const pauli_sum *b);
/* out = s^dagger (coefficients conjugated). out may alias s. */
void pauli_sum_adjoint(pauli_sum *out, const pauli_sum *s);
/* Largest |c| of a canonical sum (0 for the empty sum). */
double pauli_sum_max_abs(const pauli_sum *s);
double pauli_sum_norm1(const pauli_sum *s);
/* Coefficient of the identity word (after canonicalize it is term 0 if present). */
double complex pauli_sum_identity_coeff(const pauli_sum *s);
/* Index of word (x,z) in a canonical sum, or -1 (binary search). */
long pauli_sum_find(const pauli_sum *s, const uint64_t *x, const uint64_t *z);
/* Widen or narrow the register (narrowing requires the removed qubits to be I). */
void pauli_sum_resize(pauli_sum *s, int n);

/* A hash accumulator for building large sums: add many terms, equal words are
 * merged as they arrive, finish into a canonical pauli_sum.  Owns its tables. */
typedef struct pauli_acc pauli_acc;
pauli_acc *pauli_acc_new(int n, size_t expected_terms);
void pauli_acc_add(pauli_acc *a, const uint64_t *x, const uint64_t *z, double complex c);
size_t pauli_acc_len(const pauli_acc *a);
/* Move the terms into out (canonicalized, |c| <= tol dropped) and free a. */
void pauli_acc_finish(pauli_acc *a, pauli_sum *out, double tol);
void pauli_acc_free(pauli_acc *a);

#endif
