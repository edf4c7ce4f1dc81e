/* qubit_impl.h — what the files of the qubit layer share and nobody else sees.
 *
 * An encoder is the GF(2) matrix A of a linear encoding (b = A n), kept in the
 * forms the algorithms need: columns of A (the qubits that flip when mode j
 * flips), rows of A^-1 (the Z mask whose eigenvalue is (-1)^{n_k}), the
 * Majorana images of every mode, and byte-indexed tables that apply A and
 * A^-T to a whole mask in n/8 lookups (the Clifford map from Jordan-Wigner).
 * All arrays are owned by the encoder.
 */
#ifndef CAIRN_QUBIT_IMPL_H
#define CAIRN_QUBIT_IMPL_H

#include "cairn/qubit.h"

#include <stdint.h>

struct qubit_encoder {
  ir_encoding kind;
  int n;            /* modes = qubits */
  int nw;           /* mask words */
  uint64_t *col;    /* n masks: column j of A */
  uint64_t *rinv;   /* n masks: row k of A^-1 */
  /* Majorana images c_j = i^cph[j] sigma(cx_j, cz_j), d_j = i^dph[j] sigma(dx_j, dz_j) */
  uint64_t *cx, *cz, *dx, *dz;
  int *cph, *dph;
  /* Four-Russians tables: tab_a[g*256 + b] = XOR of col[8g + t] over bits t of b,
   * tab_t the same over rinv.  NULL for Jordan-Wigner (the identity). */
  uint64_t *tab_a, *tab_t;
  int ngroups;      /* ceil(n / 8) */
};

static inline const uint64_t *qenc_mask(const uint64_t *base, const qubit_encoder *e, int i) {
  return base + (size_t)i * (size_t)e->nw;
}

/* out = A v and out = A^-T w over GF(2) (masks of e->nw words). */
void qenc_apply_a(const qubit_encoder *e, const uint64_t *v, uint64_t *out);
void qenc_apply_at(const qubit_encoder *e, const uint64_t *w, uint64_t *out);
/* Map one Jordan-Wigner word (x, z) in place into e's encoding; returns the
 * power of i (0 or 2) the coefficient picks up. */
int qenc_map_word(const qubit_encoder *e, uint64_t *x, uint64_t *z);

#endif
