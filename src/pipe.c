/* pipe.c — one scan point from recipe to the ansatz's Hamiltonian. */
#include "config.h"

#include "cairn/pipe.h"
#include "cairn/pool.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

/* The span a register-size error points at: where the size comes from. */
static diag_span size_span(const ir_recipe *r) {
  const diag_span c[] = {r->orbitals.active_span, r->integrals_span, r->basis_span, r->encoding_span};
  for (size_t k = 0; k < sizeof c / sizeof c[0]; k++)
    if (c[k].file >= 0) return c[k];
  return r->encoding_span;
}

/* S^2 is built as S_- S_+ (qubit_spin_squared): (2 norb)^2 products of
 * words held in an accumulator, then the merged sum; at a few thousand
 * qubits that alone outgrows the machine, so it is refused first. */
static int operators_fit(const ir_recipe *r, int nmodes, diag_ctx *d) {
  double norb = nmodes / 2, terms = 4 * norb * norb, word = 16.0 * pauli_nwords(nmodes) + 16;
  double need = 3 * terms * word, avail = (double)util_mem_available();
  if (avail == 0 || need <= avail) return 0;
  diag_report(d, DIAG_ERROR, size_span(r),
              "a register of %d qubits is too large here: its spin operator S^2 alone needs about %.1f GiB "
              "(%.0f Pauli words); %.1f GiB are available",
              nmodes, need / (1 << 30), terms, avail / (1 << 30));
  diag_help(d, "make the active space smaller (`orbitals { active N electrons in M orbitals }`)");
  return -1;
}

int pipe_point_from_space(const ir_recipe *r, const chem_space *cs, diag_ctx *d, pipe_point *out) {
  if (out->cs != &out->space) memset(out, 0, sizeof *out);
  out->cs = cs;
  out->norb = cs ? cs->norb : r->orbitals.nactive;
  out->nalpha = cs ? cs->nalpha : r->orbitals.nalpha;
  out->nbeta = cs ? cs->nbeta : r->orbitals.nbeta;
  int nmodes = 2 * out->norb;
  int nw = pauli_nwords(nmodes);
  if (operators_fit(r, nmodes, d) != 0) {
    pipe_point_free(out); /* as on the other failures: the space pipe_point_build made goes too */
    return -1;
  }
  out->enc = qubit_encoder_new(r->encoding, nmodes);
  pauli_sum_init(&out->ham_full, nmodes);
  if (cs) {
    qubit_hamiltonian(cs, out->enc, &out->ham_full);
    out->has_ham = 1;
  }
  /* The reference basis state (the Hartree-Fock determinant, or the recipe's
   * `bits`): tapering keeps its symmetry sector. */
  out->ref_full = xcalloc((size_t)nw, sizeof(uint64_t));
  if (ans_reference_bits(r, out->enc, out->norb, out->nalpha, out->nbeta, d, out->ref_full) != 0) {
    pipe_point_free(out);
    return -1;
  }

  pauli_sum full[IR_SYM_COUNT];
  for (int s = 0; s < IR_SYM_COUNT; s++) pauli_sum_init(&full[s], nmodes);
  qubit_number(out->enc, &full[IR_SYM_PARTICLES]);
  qubit_spin_z(out->enc, &full[IR_SYM_SPIN_Z]);
  qubit_spin_squared(out->enc, &full[IR_SYM_SPIN_SQUARED]);

  memset(&out->taper, 0, sizeof out->taper);
  out->taper.nqubits = nmodes;
  if (r->taper && out->has_ham) qubit_taper_find(&out->ham_full, out->ref_full, out->enc, &out->taper);
  out->nqubits = nmodes - out->taper.nsym;
  out->ref = xcalloc((size_t)pauli_nwords(out->nqubits), sizeof(uint64_t));
  pauli_sum_init(&out->ham, out->nqubits);
  if (out->taper.nsym > 0) {
    qubit_taper_apply(&out->taper, &out->ham_full, &out->ham);
    qubit_taper_bits(&out->taper, out->ref_full, out->ref);
    for (int s = 0; s < IR_SYM_COUNT; s++) {
      pauli_sum_init(&out->sym[s], out->nqubits);
      /* N, S_z and S^2 commute with every Z2 symmetry of a molecular
       * Hamiltonian (parities and point-group operations), so they taper. */
      if (qubit_taper_apply(&out->taper, &full[s], &out->sym[s]) != 0)
        diag_report(d, DIAG_ERROR, r->encoding_span, "internal: %s does not commute with a tapered symmetry",
                    ir_symmetry_name((ir_symmetry)s));
      pauli_sum_free(&full[s]);
    }
  } else {
    pauli_sum_copy(&out->ham, &out->ham_full);
    memcpy(out->ref, out->ref_full, (size_t)nw * sizeof(uint64_t));
    for (int s = 0; s < IR_SYM_COUNT; s++) out->sym[s] = full[s];
  }
  return 0;
}

int pipe_point_build(const ir_recipe *r, int point, diag_ctx *d, pipe_point *out) {
  memset(out, 0, sizeof *out);
  if (chem_build_space(r, point, d, &out->space, &out->refs) != 0) {
    chem_space_free(&out->space);
    memset(out, 0, sizeof *out);
    return -1;
  }
  out->cs = &out->space; /* owned: from_space keeps space and refs */
  if (pipe_point_from_space(r, &out->space, d, out) != 0) return -1;
  out->point = point;
  return 0;
}

void pipe_point_free(pipe_point *p) {
  chem_space_free(&p->space); /* empty unless pipe_point_build made it */
  if (p->enc) qubit_encoder_free(p->enc);
  pauli_sum_free(&p->ham_full);
  qubit_taper_free(&p->taper); /* safe on a zeroed taper */
  pauli_sum_free(&p->ham);
  free(p->ref_full);
  free(p->ref);
  for (int s = 0; s < IR_SYM_COUNT; s++) pauli_sum_free(&p->sym[s]);
  memset(p, 0, sizeof *p);
}
