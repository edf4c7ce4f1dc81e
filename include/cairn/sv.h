/* sv.h — the statevector engine: a register of n qubits as 2^n complex
 * amplitudes (double precision), Pauli rotations applied in place by bit
 * masks, and a compiled form of Pauli sums for expectation values and H|psi>.
 *
 * Conventions (DEVELOPERS.md): bit q of a basis-state index is qubit q; a
 * rotation is exp(-i theta P / 2).  Inside the engine a Pauli word is one pair
 * of 64-bit masks (x, z) with the letters of pauli.h (X = x, Z = z, Y = both),
 * so registers are limited to SV_MAX_QUBITS; wider ones are refused.
 *
 * Noise-free simulation: amplitudes are exact up to double rounding; nothing
 * here models a device.
 *
 * Memory: a vector takes 16 * 2^n bytes.  Callers that allocate vectors whose
 * size the user controls check sv_mem_check first (sim_engine_new does), so
 * a register the machine cannot hold is refused with the figures, not killed.
 *
 * Determinism: every reduction (inner products, expectation values) sums in a
 * fixed order of fixed-size chunks, so results are bit-identical for any
 * number of OpenMP threads.
 *
 * Ownership: an sv_state owns its amplitudes (sv_state_free); an sv_op owns
 * its tables (sv_op_free).  Functions never keep pointers to their inputs.
 */
#ifndef CAIRN_SV_H
#define CAIRN_SV_H

#include "cairn/pauli.h"

#include <complex.h>
#include <stddef.h>
#include <stdint.h>

/* Widest register the engine accepts (index arithmetic and masks fit 64 bits
 * with room; memory runs out long before). */
#define SV_MAX_QUBITS 48

/* Bytes of one statevector of n qubits (16 * 2^n). */
uint64_t sv_vector_bytes(int nqubits);

/* Check that `nvectors` statevectors of n qubits plus `extra` bytes fit in the
 * memory the machine has now (util_mem_available).  Returns 0, or -1 with a
 * message in err naming both figures, e.g.
 *   "a 30-qubit statevector run needs 32.0 GiB (2 vectors of 16.0 GiB); this
 *    machine has 21.3 GiB available".
 * Also refuses n outside 1..SV_MAX_QUBITS.  When the available memory is
 * unknown (0), only the width is checked. */
int sv_mem_check(int nqubits, int nvectors, uint64_t extra, char *err, size_t errlen);
/* Human-readable size ("512 B", "3.5 MiB", "16.0 GiB") into buf (>= 32 bytes). */
const char *sv_fmt_bytes(char *buf, uint64_t bytes);

/* A Pauli word of a pauli_sum term as single masks.  Returns 0, or -1 when the
 * word touches a qubit >= 64 (callers check the register width first). */
int sv_word_masks(const pauli_sum *s, size_t term, uint64_t *x, uint64_t *z);

typedef struct sv_state {
  int n;              /* qubits */
  uint64_t dim;       /* 2^n */
  double complex *a;  /* amplitudes, a[i] = <i|psi> */
} sv_state;

/* Allocate a register of n qubits (1 <= n <= SV_MAX_QUBITS), all amplitudes
 * zero.  Does not check memory: call sv_mem_check first. */
void sv_state_alloc(sv_state *s, int n);
void sv_state_free(sv_state *s);
/* |bits> (bits < 2^n). */
void sv_set_basis(sv_state *s, uint64_t bits);
/* dst = src (same n). */
void sv_copy(sv_state *dst, const sv_state *src);
/* <a|b> and <a|a>. */
double complex sv_inner(const sv_state *a, const sv_state *b);
double sv_norm2(const sv_state *a);

/* psi <- exp(-i theta P / 2) psi, P the word (x, z), in place: amplitudes i
 * and i^x are paired, phases from the parity of i & z and the Y count. */
void sv_rotate(sv_state *s, uint64_t x, uint64_t z, double theta);
/* psi <- P psi. */
void sv_apply_word(sv_state *s, uint64_t x, uint64_t z);
/* <a|P|b> without changing either vector. */
double complex sv_word_inner(const sv_state *a, uint64_t x, uint64_t z, const sv_state *b);
/* The adjoint method's backward step: returns <l|P|p>, then applies
 * exp(-i theta P / 2) to both l and p, in one pass over both vectors. */
double complex sv_word_inner_rotate2(sv_state *l, sv_state *p, uint64_t x, uint64_t z, double theta);

/* A compiled Pauli sum: terms grouped by X mask, each group's Y phases folded
 * into its coefficients.  Each group's rows are split into sub-cubes by the
 * values of its X bits; on a sub-cube the terms that differ only there merge
 * exactly, and sub-cubes where they cancel (X_p X_q + Y_p Y_q-type pairs of
 * fermionic Hamiltonians) are skipped.  Inside a sub-cube, Z phases come from
 * one parity per block of 64 rows and a table of signs.  Any complex
 * coefficients; expectation values of Hermitian sums are real up to rounding.
 * Threads own fixed chunks of rows, so results do not depend on the team. */
typedef struct sv_op sv_op;

/* Compile s (not kept).  Returns NULL with a message in err when the sum is
 * wider than SV_MAX_QUBITS qubits. */
sv_op *sv_op_new(const pauli_sum *s, char *err, size_t errlen);
void sv_op_free(sv_op *op);
int sv_op_qubits(const sv_op *op);
size_t sv_op_terms(const sv_op *op);   /* after merging equal words */
size_t sv_op_groups(const sv_op *op);  /* distinct X masks */
uint64_t sv_op_bytes(const sv_op *op); /* memory of the tables */
/* Upper bound of sv_op_bytes for a sum of `terms` terms, for memory checks
 * before compiling. */
uint64_t sv_op_bytes_bound(size_t terms);
/* Tabulate the diagonal part (the group of X mask 0) once, 8 * 2^n bytes
 * (a real diagonal only; a complex one stays computed), so that each
 * application reads it instead of summing its terms.  Returns 0, or -1 when
 * there is nothing to cache.  Callers count SV_DIAG_BYTES(n) in their memory
 * check first. */
int sv_op_cache_diagonal(sv_op *op);
#define SV_DIAG_BYTES(n) ((uint64_t)8 << (n))
/* <psi|op|psi> (not normalized by <psi|psi>); sums in another order than
 * sv_op_apply, so the two agree to rounding, not bit for bit. */
double complex sv_op_expect(const sv_op *op, const sv_state *psi);
/* out = op psi (out != psi, same n).  Returns <psi|op|psi>, which the same
 * pass computes. */
double complex sv_op_apply(const sv_op *op, const sv_state *psi, sv_state *out);

/* A fused generator: G = sum_k m_k P_k of words sharing one X mask that
 * commute pairwise, with real multipliers, applied as one unitary
 *     exp(-i theta G / 2) = prod_k exp(-i theta m_k P_k / 2)
 * in one pass over the pairs (i, i^x) that G connects.  G restricted to such
 * a pair is [[0, h*], [h, 0]]; fusing is allowed only where |h| is the same on
 * every row of each sub-cube (one merged term, see sv_op), which holds for
 * fermionic excitations under Jordan-Wigner: a double excitation's 8 words
 * touch 1/8 of the pairs, instead of 8 passes over all of them. */
typedef struct sv_gen sv_gen;

/* Compile words (x[k], z[k], m[k]), k < count.  Returns NULL (nothing to free)
 * when they do not share an X mask, do not commute, or G does not fuse; the
 * caller then applies them one by one. */
sv_gen *sv_gen_new(int n, int count, const uint64_t *x, const uint64_t *z, const double *m);
void sv_gen_free(sv_gen *g);
/* Fraction of the register's pairs the generator touches (for reports). */
double sv_gen_coverage(const sv_gen *g);
/* psi <- exp(-i theta G/2) psi. */
void sv_gen_rotate(const sv_gen *g, sv_state *s, double theta);
/* <l|G|p>, then exp(-i theta G/2) applied to l and p, in one pass. */
double complex sv_gen_inner_rotate2(const sv_gen *g, sv_state *l, sv_state *p, double theta);
/* <l|G|p> alone. */
double complex sv_gen_inner(const sv_gen *g, const sv_state *l, const sv_state *p);

#endif
