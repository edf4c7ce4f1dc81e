/* symmetry.c — particle number, S_z and S^2 as Pauli sums in any encoding,
 * built from their ladder-operator forms with the generic encoder:
 *   N   = sum_P a+_P a_P
 *   S_z = 1/2 sum_p (a+_{p,a} a_{p,a} - a+_{p,b} a_{p,b})
 *   S^2 = S_- S_+ + S_z (S_z + 1),  S_+ = sum_p a+_{p,a} a_{p,b},  S_- = S_+^dag. */
#include "config.h"

#include "qubit/qubit_impl.h"

#include <stdlib.h>

static void add_pair(const qubit_encoder *enc, int P, int Q, double complex c, pauli_acc *acc) {
  qubit_ladder ops[2] = {{P, 1}, {Q, 0}};
  qubit_encoder_add_product(enc, ops, 2, c, acc);
}

void qubit_number(const qubit_encoder *enc, pauli_sum *out) {
  pauli_acc *acc = pauli_acc_new(enc->n, (size_t)enc->n + 1);
  for (int P = 0; P < enc->n; P++) add_pair(enc, P, P, 1.0, acc);
  pauli_acc_finish(acc, out, 1e-14);
}

void qubit_spin_z(const qubit_encoder *enc, pauli_sum *out) {
  pauli_acc *acc = pauli_acc_new(enc->n, (size_t)enc->n + 1);
  for (int P = 0; P < enc->n; P++) add_pair(enc, P, P, (P & 1) ? -0.5 : 0.5, acc);
  pauli_acc_finish(acc, out, 1e-14);
}

void qubit_spin_squared(const qubit_encoder *enc, pauli_sum *out) {
  int n = enc->n;
  pauli_acc *acc = pauli_acc_new(n, 4 * (size_t)n + 1);
  for (int p = 0; 2 * p + 1 < n; p++) add_pair(enc, 2 * p, 2 * p + 1, 1.0, acc);
  pauli_sum sp, sm, sz, t;
  pauli_sum_init(&sp, n);
  pauli_sum_init(&sm, n);
  pauli_sum_init(&sz, n);
  pauli_sum_init(&t, n);
  pauli_acc_finish(acc, &sp, 0.0);
  pauli_sum_adjoint(&sm, &sp);
  qubit_spin_z(enc, &sz);
  pauli_sum_mul(&t, &sm, &sp);       /* S_- S_+ */
  pauli_sum_add_sum(&t, &sz, 1.0);   /* + S_z */
  pauli_sum zz;
  pauli_sum_init(&zz, n);
  pauli_sum_mul(&zz, &sz, &sz);      /* + S_z^2 */
  pauli_sum_add_sum(&t, &zz, 1.0);
  pauli_sum_canonicalize(&t, 1e-14);
  pauli_sum_free(out);
  *out = t;
  pauli_sum_free(&sp);
  pauli_sum_free(&sm);
  pauli_sum_free(&sz);
  pauli_sum_free(&zz);
}
