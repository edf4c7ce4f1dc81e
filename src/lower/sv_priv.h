/* sv_priv.h — helpers shared by the statevector files (not public API). */
#ifndef CAIRN_SV_PRIV_H
#define CAIRN_SV_PRIV_H

#include "cairn/sv.h"

#include <complex.h>
#include <stdint.h>

/* C11's CMPLX; glibc leaves it out for compilers without __builtin_complex
 * (clang).  The fallback is exact for finite parts, all we build. */
#ifndef CMPLX
#define CMPLX(x, y) ((double complex)((double)(x) + I * (double)(y)))
#endif

/* Reductions sum fixed chunks of this many elements (pairs or amplitudes),
 * then the chunk sums in order: the same bits for any thread count. */
#define SV_CHUNK ((uint64_t)1 << 12)
/* Loops over fewer elements than this run on one thread: below it the cost
 * of waking the team is larger than the work.  Measured with
 * tests/bench/sim_bench on 2 cores: a rotation pays from 2^16 amplitudes
 * (1.15x at 2^15, 1.85x at 2^16), so whole-register loops start at 2 * SV_PAR_MIN
 * amplitudes.  H|psi> pays from 2^12 on an idle machine (1.5x at 2^14), but on
 * a loaded one a team of two stalls for a scheduler slice at every barrier
 * (0.64 ms on one thread became 9.7 ms on two at 2^14, make bench under load),
 * so it too waits for registers where the gain outweighs that risk. */
#define SV_PAR_MIN ((uint64_t)1 << 15)
#define SV_OP_PAR_MIN ((uint64_t)1 << 16)
/* From this many amplitudes on (64 MiB vectors, twice the L3 of the 2-core
 * machine), rotation passes assume the vectors stream from memory and take
 * the access orders that suit that (sv.c): below it the extra copy costs
 * (X5 X19 at 20 qubits: 88 GB/s with it, 162 GB/s without), at 24 qubits it
 * gains 2x. */
#define SV_STREAM_MIN ((uint64_t)1 << 22)
/* sv_rotate, sv_apply_word and the inner products (rot: also rotate both
 * vectors, as sv_word_inner_rotate2) with the access order chosen by the
 * caller (stream: the order for vectors from memory), so that the unit tests
 * can check that both orders agree on small registers. */
void sv_rotate_order(sv_state *s, uint64_t x, uint64_t z, double theta, int stream);
void sv_apply_word_order(sv_state *s, uint64_t x, uint64_t z, int stream);
double complex sv_word_inner_order(sv_state *l, sv_state *p, uint64_t x, uint64_t z, int rot, double theta,
                                   int stream);

/* (-1)^popcount(v) as 0 or 1. */
static inline unsigned sv_parity(uint64_t v) { return (unsigned)__builtin_parityll(v); }

/* Index of the k-th amplitude whose bit p is 0 (a zero inserted at bit p). */
static inline uint64_t sv_insert0(uint64_t k, int p) {
  uint64_t low = ((uint64_t)1 << p) - 1;
  return ((k & ~low) << 1) | (k & low);
}

/* Highest set bit of v != 0. */
static inline int sv_top_bit(uint64_t v) { return 63 - __builtin_clzll(v); }

/* One complex amplitude as a two-lane vector (GCC/clang vector extension:
 * SSE2 on x86-64, NEON on arm64); may alias the doubles of the vectors. */
typedef double sv_v2 __attribute__((vector_size(16), may_alias));
typedef long long sv_v2i __attribute__((vector_size(16)));
/* (re, im) -> (im, re) */
static inline sv_v2 sv_swap(sv_v2 a) {
#if defined(__clang__)
  return __builtin_shufflevector(a, a, 1, 0);
#else
  return __builtin_shuffle(a, (sv_v2i){1, 0});
#endif
}

/* Software pdep / pext on masks (compile-time tables only). */
static inline uint64_t sv_deposit(uint64_t v, uint64_t mask) {
  uint64_t r = 0;
  for (uint64_t b = 1; mask; b <<= 1) {
    if (v & b) r |= mask & -mask;
    mask &= mask - 1;
  }
  return r;
}
static inline uint64_t sv_extract(uint64_t v, uint64_t mask) {
  uint64_t r = 0, b = 1;
  for (; mask; b <<= 1) {
    if (v & mask & -mask) r |= b;
    mask &= mask - 1;
  }
  return r;
}
/* The lowest / highest k set bits of mask. */
static inline uint64_t sv_lowest_bits(uint64_t mask, int k) {
  uint64_t r = 0;
  for (int i = 0; i < k && mask; i++) {
    r |= mask & -mask;
    mask &= mask - 1;
  }
  return r;
}
static inline uint64_t sv_highest_bits(uint64_t mask, int k) {
  uint64_t r = 0;
  for (int i = 0; i < k && mask; i++) {
    uint64_t b = (uint64_t)1 << sv_top_bit(mask);
    r |= b;
    mask &= ~b;
  }
  return r;
}

/* Sub-cube layout shared by compiled operators and fused generators: the bits
 * S (of the X mask) split the rows into sub-cubes; inside one, rows are
 * base | off[l], with l the block index over the lowest free bits and base
 * running over the subsets of `mid`. */
#define SV_LOG_BLOCK 6 /* blocks of 64 rows: a 64 x 64 sign table stays in L1 */
#define SV_SBITS 6     /* most bits of x that split rows into sub-cubes */

/* The 64 x 64 table tau[u*64 + l] = (-1)^|u & l| (malloc'd, caller frees). */
double *sv_sign_table(void);

#endif
