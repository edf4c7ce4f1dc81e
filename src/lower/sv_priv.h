/* sv_priv.h — helpers shared by the statevector files (not public API). */
#ifndef CAIRN_SV_PRIV_H
#define CAIRN_SV_PRIV_H

#include <stdint.h>

/* Reductions sum fixed chunks of this many elements (pairs or amplitudes),
 * then the chunk sums in order: the same bits for any thread count. */
#define SV_CHUNK ((uint64_t)1 << 12)
/* Loops over fewer elements than this run on one thread: below it the cost
 * of waking the team is larger than the work (measured with tests/bench). */
#define SV_PAR_MIN ((uint64_t)1 << 14)

/* (-1)^popcount(v) as 0 or 1. */
static inline unsigned sv_parity(uint64_t v) { return (unsigned)__builtin_parityll(v); }

/* Index of the k-th amplitude whose bit p is 0 (a zero inserted at bit p). */
static inline uint64_t sv_insert0(uint64_t k, int p) {
  uint64_t low = ((uint64_t)1 << p) - 1;
  return ((k & ~low) << 1) | (k & low);
}

/* Highest set bit of v != 0. */
static inline int sv_top_bit(uint64_t v) { return 63 - __builtin_clzll(v); }

#endif
