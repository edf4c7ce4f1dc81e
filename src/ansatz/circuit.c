/* circuit.c — the rotation program: a word table with a hash index, and the
 * ordered list of parametrized rotations. */
#include "config.h"

#include "cairn/ansatz.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

void ans_circuit_init(ans_circuit *c, int nqubits) {
  memset(c, 0, sizeof *c);
  c->nqubits = nqubits;
  c->init = xcalloc((size_t)pauli_nwords(nqubits), sizeof(uint64_t));
  pauli_sum_init(&c->words, nqubits);
}

void ans_circuit_free(ans_circuit *c) {
  free(c->init);
  pauli_sum_free(&c->words);
  free(c->rot);
  free(c->param_gen);
  free(c->param_init);
  free(c->slot);
  for (int g = 0; g < c->ngens; g++) free(c->gens[g].text);
  free(c->gens);
  memset(c, 0, sizeof *c);
}

static void rehash(ans_circuit *c, size_t nslots) {
  free(c->slot);
  c->slot = xcalloc(nslots, sizeof *c->slot);
  c->nslots = nslots;
  const pauli_sum *w = &c->words;
  for (size_t t = 0; t < w->len; t++) {
    size_t h = (size_t)pauli_word_hash(w->nw, pauli_sum_x(w, t), pauli_sum_z(w, t)) & (nslots - 1);
    while (c->slot[h]) h = (h + 1) & (nslots - 1);
    c->slot[h] = t + 1;
  }
}

int32_t ans_circuit_word(ans_circuit *c, const uint64_t *x, const uint64_t *z) {
  pauli_sum *w = &c->words;
  if (!c->slot) rehash(c, 64);
  size_t mask = c->nslots - 1;
  size_t h = (size_t)pauli_word_hash(w->nw, x, z) & mask;
  while (c->slot[h]) {
    size_t t = c->slot[h] - 1;
    if (pauli_word_equal(w->nw, pauli_sum_x(w, t), pauli_sum_z(w, t), x, z)) return (int32_t)t;
    h = (h + 1) & mask;
  }
  c->slot[h] = w->len + 1;
  pauli_sum_add(w, x, z, 1.0);
  if (2 * w->len > c->nslots) rehash(c, 2 * c->nslots);
  return (int32_t)(w->len - 1);
}

void ans_circuit_push(ans_circuit *c, int32_t word, int32_t param, double mult, int32_t gen) {
  UTIL_GROW(c->rot, c->caprot, c->nrot + 1);
  c->rot[c->nrot++] = (ans_rotation){word, param, mult, gen};
}

int ans_circuit_add_gen(ans_circuit *c, const ans_gen_info *info) {
  c->gens = xrealloc(c->gens, (size_t)(c->ngens + 1) * sizeof *c->gens);
  c->gens[c->ngens] = *info;
  c->gens[c->ngens].text = xstrdup(info->text ? info->text : "");
  return c->ngens++;
}

int ans_circuit_add_param(ans_circuit *c, int gen) {
  c->param_gen = xrealloc(c->param_gen, (size_t)(c->nparams + 1) * sizeof *c->param_gen);
  c->param_gen[c->nparams] = gen;
  c->param_init = xrealloc(c->param_init, (size_t)(c->nparams + 1) * sizeof *c->param_init);
  c->param_init[c->nparams] = 0;
  if (gen < 0) c->nref_params++;
  return c->nparams++;
}

/* ORDER ans_kind */
const char *ans_kind_name(ans_kind k) {
  static const char *const names[] = {"single",    "double", "qubit-single", "qubit-double",
                                      "entangler", "word",   "excite"};
  return (unsigned)k < sizeof names / sizeof names[0] ? names[k] : "?";
}
