/* testref.c — slow, generic reference routes for the tests and benchmarks. */
#include "config.h"

#include "testref.h"

#include "cairn/util.h"

#include <complex.h>
#include <stdlib.h>

/* H = e_constant + sum h_PQ a+_P a_Q + 1/2 sum (PQ|RS) a+_P a+_R a_S a_Q over
 * spin orbitals (spin kept along each pair), term by term. */
void testref_hamiltonian(const chem_space *s, const qubit_encoder *enc, size_t expected_terms, pauli_sum *out) {
  int nq = 2 * s->norb, no = s->norb;
  pauli_acc *acc = pauli_acc_new(nq, expected_terms);
  uint64_t *zero = xcalloc((size_t)pauli_nwords(nq), sizeof *zero);
  pauli_acc_add(acc, zero, zero, s->e_constant);
  free(zero);
  for (int P = 0; P < nq; P++)
    for (int Q = 0; Q < nq; Q++) {
      if ((P ^ Q) & 1) continue;
      qubit_ladder ops[2] = {{P, 1}, {Q, 0}};
      qubit_encoder_add_product(enc, ops, 2, s->h1[(P / 2) * no + Q / 2], acc);
    }
  for (int P = 0; P < nq; P++)
    for (int Q = 0; Q < nq; Q++)
      for (int R = 0; R < nq; R++)
        for (int S = 0; S < nq; S++) {
          if (((P ^ Q) & 1) || ((R ^ S) & 1)) continue;
          double g = s->h2[chem_h2_index(no, P / 2, Q / 2, R / 2, S / 2)];
          if (g == 0) continue;
          qubit_ladder ops[4] = {{P, 1}, {R, 1}, {S, 0}, {Q, 0}};
          qubit_encoder_add_product(enc, ops, 4, 0.5 * g, acc);
        }
  pauli_acc_finish(acc, out, 1e-14);
}

/* G from the generator's words, C = [G, H] by the Pauli algebra, then the sum
 * of <b|C|b> over the words of C without X or Y letters. */
double testref_gradient(const ans_pool *pool, size_t k, const pauli_sum *H, const uint64_t *b) {
  static const double complex ip[4] = {1, I, -1, -I};
  const ans_gen *g = &pool->gen[k];
  pauli_sum G, C;
  pauli_sum_init(&G, pool->words.n);
  pauli_sum_init(&C, pool->words.n);
  for (size_t t = g->off; t < g->off + g->len; t++)
    pauli_sum_add(&G, pauli_sum_x(&pool->words, t), pauli_sum_z(&pool->words, t), pool->words.c[t]);
  pauli_sum_commutator(&C, &G, H);
  double complex e = 0;
  for (size_t t = 0; t < C.len; t++) {
    const uint64_t *x = pauli_sum_x(&C, t), *z = pauli_sum_z(&C, t);
    int zero = 1, neg = 0, y = 0;
    for (int i = 0; i < C.nw; i++) {
      zero &= x[i] == 0;
      neg += __builtin_popcountll(z[i] & b[i]);
      y += __builtin_popcountll(x[i] & z[i]);
    }
    if (zero) e += C.c[t] * ip[y & 3] * ((neg & 1) ? -1.0 : 1.0);
  }
  pauli_sum_free(&G);
  pauli_sum_free(&C);
  return creal(0.5 * I * e);
}
