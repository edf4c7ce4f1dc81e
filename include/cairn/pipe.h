/* pipe.h — the pipeline of one scan point: recipe → active space → qubit
 * Hamiltonian (encoded, tapered) → symmetry operators, ready for the ansatz.
 *
 * Each stage owns its data and hands it on; pipe_point only holds the results
 * together.  Ownership: pipe_point owns everything in it; pipe_point_free.
 */
#ifndef CAIRN_PIPE_H
#define CAIRN_PIPE_H

#include "cairn/chem.h"
#include "cairn/diag.h"
#include "cairn/ir.h"
#include "cairn/pauli.h"
#include "cairn/qubit.h"

typedef struct pipe_point {
  int point;              /* scan point index */
  chem_space space;       /* active-space integrals built by pipe_point_build */
  const chem_space *cs;   /* the integrals in use: &space, or the caller's (borrowed); NULL for a
                             static build (no Hamiltonian) */
  int norb, nalpha, nbeta; /* active orbitals and electrons of each spin */
  chem_refs refs;         /* HF (and later MP2, CCSD, exact) energies */
  qubit_encoder *enc;     /* the recipe's encoding over 2*norb modes */
  int has_ham;            /* 0: static build, ham_full and ham are empty */
  pauli_sum ham_full;     /* qubit Hamiltonian before tapering */
  qubit_taper taper;      /* nsym = 0 without `taper` */
  pauli_sum ham;          /* the Hamiltonian the ansatz acts on (tapered) */
  int nqubits;            /* qubits of the ansatz register */
  uint64_t *ref_full;     /* reference basis state (Hartree-Fock or `bits`), encoded, before tapering */
  uint64_t *ref;          /* the same on the ansatz register */
  pauli_sum sym[IR_SYM_COUNT]; /* N, S_z, S^2 on the ansatz register */
} pipe_point;

/* Build point `point` of recipe r up to the symmetry operators.  Returns 0, or
 * -1 after reporting through d (the partial result is freed). */
int pipe_point_build(const ir_recipe *r, int point, diag_ctx *d, pipe_point *out);
/* The same from given integrals (borrowed: cs must outlive out), or with
 * cs == NULL a static build from the recipe's orbital counts: encoder,
 * reference bits and symmetry operators, no Hamiltonian and no tapering (what
 * type checking needs without any chemistry).  Returns 0 or -1. */
int pipe_point_from_space(const ir_recipe *r, const chem_space *cs, diag_ctx *d, pipe_point *out);
void pipe_point_free(pipe_point *p);

#endif
