/* setup.c — from a checked recipe to the inputs of the ansatz module:
 * encoder, Hamiltonian, tapering, symmetry operators, reference bits. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/pipe.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

void ans_setup_free(ans_setup *s) {
  if (s->enc) qubit_encoder_free(s->enc);
  pauli_sum_free(&s->H_full);
  pauli_sum_free(&s->H);
  qubit_taper_free(&s->taper);
  for (int k = 0; k < IR_SYM_COUNT; k++) pauli_sum_free(&s->sym[k]);
  free(s->ref_full);
  memset(s, 0, sizeof *s);
}

int ans_reference_bits(const ir_recipe *r, const qubit_encoder *enc, int norb, int nalpha, int nbeta,
                       diag_ctx *d, uint64_t *out) {
  int n = 2 * norb;
  memset(out, 0, (size_t)pauli_nwords(n) * sizeof *out);
  if (r->reference.kind != IR_REF_BITS) {
    qubit_encoder_reference(enc, nalpha, nbeta, out);
    return 0;
  }
  const char *b = r->reference.bits ? r->reference.bits : "";
  size_t len = strlen(b);
  if ((int)len != n) {
    diag_report(d, DIAG_ERROR, r->reference.span,
                "`bits` needs %d bits, one per qubit of the active space (2 x %d orbitals), not %zu", n, norb, len);
    return -1;
  }
  for (int q = 0; q < n; q++) {
    if (b[q] != '0' && b[q] != '1') {
      diag_report(d, DIAG_ERROR, r->reference.span, "`bits` holds only 0 and 1, not `%c`", b[q]);
      return -1;
    }
    pauli_set(out, q, b[q] == '1');
  }
  return 0;
}

int ans_setup_init(ans_setup *s, const ir_recipe *r, const chem_space *cs, diag_ctx *d) {
  memset(s, 0, sizeof *s);
  ans_problem *p = &s->prob;
  p->norb = cs ? cs->norb : r->orbitals.nactive;
  p->nalpha = cs ? cs->nalpha : r->orbitals.nalpha;
  p->nbeta = cs ? cs->nbeta : r->orbitals.nbeta;
  p->multiplicity = r->multiplicity > 0 ? r->multiplicity : p->nalpha - p->nbeta + 1;
  p->nmodes = 2 * p->norb;
  p->nqubits = p->nmodes;
  pauli_sum_init(&s->H_full, p->nmodes);
  pauli_sum_init(&s->H, p->nmodes);
  for (int k = 0; k < IR_SYM_COUNT; k++) pauli_sum_init(&s->sym[k], p->nmodes);
  s->taper.nqubits = p->nmodes;
  s->enc = qubit_encoder_new(r->encoding, p->nmodes);
  p->enc = s->enc;
  s->ref_full = xcalloc((size_t)pauli_nwords(p->nmodes), sizeof *s->ref_full);
  p->ref_full = s->ref_full;
  if (ans_reference_bits(r, s->enc, p->norb, p->nalpha, p->nbeta, d, s->ref_full) != 0) return -1;
  pauli_sum full[IR_SYM_COUNT];
  for (int k = 0; k < IR_SYM_COUNT; k++) pauli_sum_init(&full[k], p->nmodes);
  qubit_number(s->enc, &full[IR_SYM_PARTICLES]);
  qubit_spin_z(s->enc, &full[IR_SYM_SPIN_Z]);
  qubit_spin_squared(s->enc, &full[IR_SYM_SPIN_SQUARED]);
  if (cs) {
    qubit_hamiltonian(cs, s->enc, &s->H_full);
    s->has_h = 1;
    if (r->taper) qubit_taper_find(&s->H_full, s->ref_full, s->enc, &s->taper);
  }
  if (s->taper.nsym > 0) {
    p->taper = &s->taper;
    p->nqubits = p->nmodes - s->taper.nsym;
    pauli_sum_free(&s->H);
    pauli_sum_init(&s->H, p->nqubits);
    qubit_taper_apply(&s->taper, &s->H_full, &s->H);
    for (int k = 0; k < IR_SYM_COUNT; k++) {
      pauli_sum_free(&s->sym[k]);
      pauli_sum_init(&s->sym[k], p->nqubits);
      p->sym[k] = qubit_taper_apply(&s->taper, &full[k], &s->sym[k]) == 0 ? &s->sym[k] : NULL;
    }
  } else {
    pauli_sum_free(&s->H);
    s->H = s->H_full;
    pauli_sum_init(&s->H_full, p->nmodes);
    for (int k = 0; k < IR_SYM_COUNT; k++) {
      pauli_sum_free(&s->sym[k]);
      s->sym[k] = full[k];
      pauli_sum_init(&full[k], p->nmodes);
      p->sym[k] = &s->sym[k];
    }
  }
  for (int k = 0; k < IR_SYM_COUNT; k++) pauli_sum_free(&full[k]);
  p->H = s->has_h ? &s->H : NULL;
  return 0;
}

int ans_problem_from_point(ans_problem *p, const ir_recipe *r, const struct pipe_point *pp, uint64_t *ref_bits,
                           diag_ctx *d) {
  memset(p, 0, sizeof *p);
  p->norb = pp->space.norb;
  p->nalpha = pp->space.nalpha;
  p->nbeta = pp->space.nbeta;
  p->multiplicity = r->multiplicity > 0 ? r->multiplicity : p->nalpha - p->nbeta + 1;
  p->nmodes = 2 * p->norb;
  p->nqubits = pp->nqubits;
  p->enc = pp->enc;
  p->taper = pp->taper.nsym > 0 ? &pp->taper : NULL;
  p->H = &pp->ham;
  for (int k = 0; k < IR_SYM_COUNT; k++) p->sym[k] = &pp->sym[k];
  if (ans_reference_bits(r, pp->enc, p->norb, p->nalpha, p->nbeta, d, ref_bits) != 0) return -1;
  p->ref_full = ref_bits;
  const qubit_taper *t = p->taper;
  if (t) {
    int nw = pauli_nwords(t->nqubits);
    for (int i = 0; i < t->nsym; i++) {
      int par = 0;
      for (int w = 0; w < nw; w++) par += __builtin_popcountll(t->tau[(size_t)i * (size_t)nw + (size_t)w] & ref_bits[w]);
      if ((par & 1 ? -1 : 1) != t->sector[i]) {
        diag_report(d, DIAG_ERROR, r->reference.span,
                    "the reference bits lie in another symmetry sector (%s) than the Hartree-Fock state the "
                    "tapering kept",
                    t->why && t->why[i] ? t->why[i] : "a Z2 symmetry");
        return -1;
      }
    }
  }
  return 0;
}
