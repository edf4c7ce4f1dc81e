/* program.c — the rotation program of a plan (ansatz.h): reference
 * preparation, then the chosen generators in order, Trotter steps sharing
 * parameters. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Append the rotation exp(-i theta_param mult P / 2) for the word P on one qubit. */
static void one_qubit(ans_circuit *c, int q, char letter, int param, double mult, int gen) {
  int nw = pauli_nwords(c->nqubits);
  uint64_t *x = xcalloc((size_t)nw, sizeof *x), *z = xcalloc((size_t)nw, sizeof *z);
  pauli_set_letter(x, z, q, letter);
  ans_circuit_push(c, ans_circuit_word(c, x, z), param, mult, gen);
  free(x);
  free(z);
}

void ans_plan_circuit(const ans_plan *pl, const ir_recipe *r, ans_circuit *c) {
  const ans_reference *ref = &pl->ref;
  const ans_pool *pool = &pl->pool;
  int n = ref->nqubits;
  ans_circuit_init(c, n);
  memcpy(c->init, ref->bits, (size_t)pauli_nwords(n) * sizeof *c->init);
  if (ref->kind == IR_REF_MEAN_FIELD) {
    /* From the Hartree-Fock bit b: Ry(theta - pi b) gives polar angle theta,
     * then Rz(phi) the azimuth (up to a global phase). */
    for (int q = 0; q < n; q++) {
      int b = pauli_get_x(ref->bits, q);
      int py = ans_circuit_add_param(c, -1);
      c->param_init[py] = ref->theta ? ref->theta[q] - M_PI * b : 0.0;
      one_qubit(c, q, 'Y', py, 1.0, -1);
      int pz = ans_circuit_add_param(c, -1);
      c->param_init[pz] = ref->phi ? ref->phi[q] : 0.0;
      one_qubit(c, q, 'Z', pz, 1.0, -1);
    }
  }
  int *param = xmalloc((pl->norder ? pl->norder : 1) * sizeof *param);
  int *gi = xmalloc((pl->norder ? pl->norder : 1) * sizeof *gi);
  for (size_t i = 0; i < pl->norder; i++) {
    gi[i] = ans_circuit_add_gen(c, &pool->gen[pl->order[i]].info);
    param[i] = ans_circuit_add_param(c, gi[i]);
  }
  int steps = r->trotter > 0 ? r->trotter : 1;
  for (int s = 0; s < steps; s++)
    for (size_t i = 0; i < pl->norder; i++) {
      const ans_gen *g = &pool->gen[pl->order[i]];
      for (size_t t = g->off; t < g->off + g->len; t++) {
        int32_t w = ans_circuit_word(c, pauli_sum_x(&pool->words, t), pauli_sum_z(&pool->words, t));
        ans_circuit_push(c, w, param[i], creal(pool->words.c[t]) / steps, gi[i]);
      }
    }
  free(param);
  free(gi);
}
