/* scf.h — Hartree-Fock for molecules: restricted closed shell (RHF) and
 * restricted open shell (ROHF), with Pulay's DIIS (Chem. Phys. Lett. 73, 393
 * (1980); J. Comput. Chem. 3, 556 (1982)) and a superposition-of-atomic-
 * densities start; and the transformation of the result to the molecular-
 * orbital Hamiltonian of an active space.
 *
 * Start (why SAD): the core-Hamiltonian guess puts electrons in orbitals of a
 * bare-nucleus problem, far too compact and often in the wrong order for
 * stretched bonds and for heavier atoms; the superposition of spherically
 * averaged atomic densities (each atom's fractional-occupation SCF in the same
 * basis) is a density of the right size and charge on every atom, so the first
 * Fock matrix already has the molecular orbitals in a sensible order.
 *
 * ROHF: one set of orbitals; the effective Fock matrix in the orbital basis
 * has Fc = (Fa + Fb)/2 on its diagonal blocks, Fb between doubly and singly
 * occupied, Fa between singly occupied and virtual, Fc between doubly occupied
 * and virtual orbitals; its eigenvalues are the orbital energies.
 *
 * Ownership: scf_result owns its arrays (scf_result_free).
 */
#ifndef CAIRN_SCF_H
#define CAIRN_SCF_H

#include "cairn/basis.h"
#include "cairn/chem.h"
#include "cairn/integrals.h"

typedef struct scf_options {
  int max_iter;       /* 200 */
  double e_tol;       /* |Delta E| below this (1e-10 hartree) */
  double d_tol;       /* and RMS change of the density below this (1e-8) */
  int diis_size;      /* vectors kept (8) */
} scf_options;

void scf_options_default(scf_options *o);

typedef enum scf_status { SCF_OK = 0, SCF_NOT_CONVERGED = 1, SCF_FAILED = -1 } scf_status;

typedef struct scf_result {
  int nbf;             /* basis functions = orbitals */
  int nalpha, nbeta;
  double energy;       /* total, hartree */
  double e_nuclear;
  double *C;           /* nbf x nbf, C[mu * nbf + i]: orbital i (columns by increasing energy,
                          occupied first for ROHF: doubly, singly, virtual) */
  double *eps;         /* nbf orbital energies */
  double *H;           /* core Hamiltonian (AO), nbf x nbf */
  double *eri;         /* AO (pq|rs), nbf^4 */
  int iterations;
  double last_de, last_dd;  /* the last energy and density changes */
  double seconds_integrals, seconds_scf;
  char message[256];   /* why SCF_FAILED */
} scf_result;

/* Run RHF (nalpha == nbeta) or ROHF on the molecule of `ib` (built from `bs`,
 * which also gives the atomic starts).  Returns SCF_OK, SCF_NOT_CONVERGED (the
 * result holds the last iterate; do not use its energy) or SCF_FAILED (the
 * message says why: memory, linear dependence). */
scf_status scf_run(const int_basis *ib, const basis_set *bs, int nalpha, int nbeta, const scf_options *o,
                   scf_result *out);
void scf_result_free(scf_result *r);

/* The active-space Hamiltonian of an SCF result: doubly occupied `core`
 * orbitals folded into the constant (through the AO core density), the
 * `active` orbitals' integrals by four quarter transformations with dgemm. */
void scf_active_space(const scf_result *r, const int *core, int ncore, const int *active, int nact, int nalpha,
                      int nbeta, chem_space *out);

#endif
