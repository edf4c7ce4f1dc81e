/* setup.c — from a checked recipe to the inputs of the ansatz module
 * (encoder, Hamiltonian, tapering, symmetry operators, reference bits), and the
 * two entry points the commands call: `cairn check` and `cairn show`. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/json.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

void ans_setup_free(ans_setup *s) {
  if (s->enc) qubit_encoder_free(s->enc);
  pauli_sum_free(&s->H_full);
  pauli_sum_free(&s->H);
  if (s->has_taper) qubit_taper_free(&s->taper);
  for (int k = 0; k < IR_SYM_COUNT; k++) {
    pauli_sum_free(&s->sym[k]);
    pauli_sum_free(&s->sym_reg[k]);
  }
  free(s->ref_full);
  memset(s, 0, sizeof *s);
}

/* Encoded bits of the reference on the full register: the Hartree-Fock
 * determinant (also under a mean-field reference) or the recipe's bits. */
static int reference_bits(ans_setup *s, const ir_recipe *r, diag_ctx *d) {
  int n = s->prob.nmodes, nw = pauli_nwords(n);
  s->ref_full = xcalloc((size_t)nw, sizeof *s->ref_full);
  if (r->reference.kind == IR_REF_BITS) {
    const char *b = r->reference.bits ? r->reference.bits : "";
    size_t len = strlen(b);
    if ((int)len != n) {
      diag_report(d, DIAG_ERROR, r->reference.span,
                  "`bits` needs %d bits, one per qubit of the active space (2 x %d orbitals), not %zu", n,
                  s->prob.norb, len);
      return -1;
    }
    for (int q = 0; q < n; q++) {
      if (b[q] != '0' && b[q] != '1') {
        diag_report(d, DIAG_ERROR, r->reference.span, "`bits` holds only 0 and 1, not `%c`", b[q]);
        return -1;
      }
      pauli_set(s->ref_full, q, b[q] == '1');
    }
    return 0;
  }
  uint64_t *occ = xcalloc((size_t)nw, sizeof *occ);
  for (int p = 0; p < s->prob.norb; p++) {
    if (p < s->prob.nalpha) pauli_set(occ, 2 * p, 1);
    if (p < s->prob.nbeta) pauli_set(occ, 2 * p + 1, 1);
  }
  qubit_encoder_bits(s->enc, occ, s->ref_full);
  free(occ);
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
  for (int k = 0; k < IR_SYM_COUNT; k++) {
    pauli_sum_init(&s->sym[k], p->nmodes);
    pauli_sum_init(&s->sym_reg[k], p->nmodes);
  }
  pauli_sum_init(&s->H_full, p->nmodes);
  pauli_sum_init(&s->H, p->nmodes);
  s->enc = qubit_encoder_new(r->encoding, p->nmodes);
  p->enc = s->enc;
  qubit_number(s->enc, &s->sym[IR_SYM_PARTICLES]);
  qubit_spin_z(s->enc, &s->sym[IR_SYM_SPIN_Z]);
  qubit_spin_squared(s->enc, &s->sym[IR_SYM_SPIN_SQUARED]);
  for (int k = 0; k < IR_SYM_COUNT; k++) p->sym[k] = p->sym_reg[k] = &s->sym[k];
  if (reference_bits(s, r, d) != 0) return -1;
  p->ref_full = s->ref_full;
  if (!cs) return 0;
  qubit_hamiltonian(cs, s->enc, &s->H_full);
  s->has_h = 1;
  p->H = &s->H_full;
  if (r->taper) {
    qubit_taper_find(&s->H_full, s->ref_full, s->enc, &s->taper);
    s->has_taper = 1;
    p->taper = &s->taper;
    p->nqubits = p->nmodes - s->taper.nsym;
    if (s->taper.nsym > 0) {
      if (qubit_taper_apply(&s->taper, &s->H_full, &s->H) != 0) {
        diag_report(d, DIAG_ERROR, r->encoding_span, "internal error: the Hamiltonian does not commute with its own "
                                                     "symmetries");
        return -1;
      }
      p->H = &s->H;
      for (int k = 0; k < IR_SYM_COUNT; k++) {
        s->has_sym_reg[k] = qubit_taper_apply(&s->taper, &s->sym[k], &s->sym_reg[k]) == 0;
        p->sym_reg[k] = s->has_sym_reg[k] ? &s->sym_reg[k] : NULL;
      }
    }
  }
  return 0;
}

/* Does checking the recipe need its Hamiltonian? */
static int needs_hamiltonian(const ir_recipe *r) {
  if (r->taper || r->choose.kind == IR_CHOOSE_ABOVE) return 1;
  for (int i = 0; i < r->nrules; i++)
    if (r->rules[i].kind == IR_RULE_ENTANGLERS) return 1;
  return 0;
}

int ans_check(const ir_recipe *r, diag_ctx *d) {
  int need = needs_hamiltonian(r);
  chem_space cs;
  chem_refs refs;
  memset(&cs, 0, sizeof cs);
  memset(&refs, 0, sizeof refs);
  if (need && chem_build_space(r, 0, d, &cs, &refs) != 0) return -1;
  ans_setup s;
  int rc = ans_setup_init(&s, r, need ? &cs : NULL, d);
  if (rc == 0) {
    ans_plan pl;
    rc = ans_plan_build(&pl, r, &s.prob, d);
    ans_plan_free(&pl);
  }
  ans_setup_free(&s);
  if (need) chem_space_free(&cs);
  return rc;
}

int ans_show(const ir_recipe *r, diag_ctx *d, FILE *out, int json) {
  chem_space cs;
  chem_refs refs;
  memset(&cs, 0, sizeof cs);
  memset(&refs, 0, sizeof refs);
  if (chem_build_space(r, 0, d, &cs, &refs) != 0) return -1;
  ans_setup s;
  int rc = ans_setup_init(&s, r, &cs, d);
  ans_plan pl;
  memset(&pl, 0, sizeof pl);
  if (rc == 0) rc = ans_plan_build(&pl, r, &s.prob, d);
  if (rc == 0) {
    if (json) {
      cJSON *j = ans_table_json(&pl, r, &s.prob, d);
      char *text = json_print(j);
      fprintf(out, "%s\n", text);
      free(text);
      cJSON_Delete(j);
    } else {
      ans_table_print(&pl, r, &s.prob, d, out);
    }
  }
  ans_plan_free(&pl);
  ans_setup_free(&s);
  chem_space_free(&cs);
  return rc;
}
