/* setup.c — from a checked recipe to the inputs of the ansatz module:
 * encoder, Hamiltonian, tapering, symmetry operators, reference bits. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/pipe.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

void ans_setup_free(ans_setup *s) {
  if (s->pp) {
    pipe_point_free(s->pp);
    free(s->pp);
  }
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

/* The pipeline (pipe.h) builds encoder, Hamiltonian, tapering and symmetry
 * operators; the setup only adds the problem view of them. */
int ans_setup_init(ans_setup *s, const ir_recipe *r, const chem_space *cs, diag_ctx *d) {
  memset(s, 0, sizeof *s);
  s->pp = xcalloc(1, sizeof *s->pp);
  if (pipe_point_from_space(r, cs, d, s->pp) != 0) return -1;
  ans_problem_from_point(&s->prob, r, s->pp);
  return 0;
}

void ans_problem_from_point(ans_problem *p, const ir_recipe *r, const struct pipe_point *pp) {
  memset(p, 0, sizeof *p);
  p->norb = pp->norb;
  p->nalpha = pp->nalpha;
  p->nbeta = pp->nbeta;
  p->multiplicity = r->multiplicity > 0 ? r->multiplicity : p->nalpha - p->nbeta + 1;
  p->nmodes = 2 * p->norb;
  p->nqubits = pp->nqubits;
  p->enc = pp->enc;
  p->taper = pp->taper.nsym > 0 ? &pp->taper : NULL;
  p->H = pp->has_ham ? &pp->ham : NULL;
  for (int k = 0; k < IR_SYM_COUNT; k++) p->sym[k] = &pp->sym[k];
  p->ref_full = pp->ref_full;
}
