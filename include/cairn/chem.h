/* chem.h — from a recipe's molecule (or FCIDUMP file) to the active-space
 * Hamiltonian and its classical reference energies.
 *
 * This header is the contract between the chemistry module and the rest of
 * cairn.  The modules behind it (basis, integrals, scf, mo transform, fcidump,
 * mp2, ccsd, fci) have their own headers beside this one.
 *
 * Ownership: a chem_space owns its arrays; chem_space_free frees them.
 */
#ifndef CAIRN_CHEM_H
#define CAIRN_CHEM_H

#include "cairn/diag.h"
#include "cairn/ir.h"

/* The active-space Hamiltonian
 *   H = e_constant + sum_pq h1[pq] E_pq + 1/2 sum_pqrs (pq|rs) (E_pq E_rs - delta_qr E_ps)
 * over real spatial orbitals 0..norb-1 (chemists' notation, 8-fold symmetric).
 * Orbital p carries spin orbitals 2p (alpha) and 2p+1 (beta).  The reference
 * determinant fills orbitals 0..nbeta-1 doubly and nbeta..nalpha-1 with alpha. */
typedef struct chem_space {
  int norb;
  int nalpha, nbeta;
  double e_nuclear;          /* nuclear repulsion (0 when unknown, e.g. FCIDUMP) */
  int has_nuclear;           /* 1 when e_nuclear is known (atoms); FCIDUMP files do not carry it */
  double e_constant;         /* nuclear repulsion + frozen-core energy */
  double *h1;                /* norb*norb, h1[p*norb+q] */
  double *h2;                /* norb^4, h2[((p*norb+q)*norb+r)*norb+s] = (pq|rs) */
  double *orbital_energies;  /* norb entries, or NULL when not known */
} chem_space;

void chem_space_free(chem_space *s);
/* Fold the doubly occupied orbitals `core` (0-based) of `full` into the
 * constant and keep the orbitals `active`, in the given order; the result has
 * nalpha/nbeta active electrons.  `out` is the caller's (chem_space_free). */
void chem_space_select(const chem_space *full, const int *core, int ncore, const int *active, int nact,
                       int nalpha, int nbeta, chem_space *out);
/* Energy of the reference determinant of `s` (the Hartree-Fock energy when the
 * orbitals are the SCF orbitals). */
double chem_reference_energy(const chem_space *s);
/* Index into h2. */
static inline long chem_h2_index(int n, int p, int q, int r, int s) {
  return (((long)p * n + q) * n + r) * n + s;
}

/* Classical reference energies of one point; has_* says what was computed. */
typedef struct chem_refs {
  int has_hf, has_mp2, has_ccsd, has_exact;
  double hf, mp2, ccsd, exact;  /* total energies, hartree */
  double exact_s2;              /* <S^2> of the exact state */
  double exact_sz;              /* <S_z> of the exact state */
  int ccsd_converged;           /* 0: has_ccsd is set but the value did not converge */
  int scf_iterations;
} chem_refs;

/* Build the active-space Hamiltonian of scan point `point` of recipe `r`
 * (basis + integrals + SCF + transform + core folding, or the FCIDUMP file).
 * Fills refs->hf.  Returns 0, or -1 after reporting through `d` (SCF that does
 * not converge, bad FCIDUMP, ...). */
int chem_build_space(const ir_recipe *r, int point, diag_ctx *d, chem_space *out, chem_refs *refs);

/* What the front end needs to resolve a recipe without running anything:
 * the number of orbitals (contracted basis functions) of the molecule in the
 * recipe's basis.  Reports missing basis sets or elements the basis does not
 * cover, at the recipe spans.  Returns -1 on error. */
int chem_count_orbitals(const ir_recipe *r, diag_ctx *d);

/* Read only the header of an FCIDUMP file (NORB, NELEC, MS2).  Reports problems
 * at `from` and inside the file.  Returns 0 or -1. */
int chem_fcidump_header(const char *path, diag_span from, diag_ctx *d, int *norb, int *nelec, int *ms2);

/* Write the active space as an FCIDUMP file (atomically). 0 or -1 with errno. */
int chem_fcidump_write(const chem_space *s, const char *path);

/* Which exact state `chem_exact` targets. */
typedef struct chem_target {
  int ms2;           /* 2 S_z = nalpha - nbeta */
  int multiplicity;  /* 0: the lowest state of any spin in the S_z sector; else 2S+1 */
} chem_target;

/* MP2, CCSD and the exact (full CI, Davidson) energy of the active space.
 * Each returns 0 and fills its field in refs, or -1 after reporting. */
int chem_mp2(const chem_space *s, diag_ctx *d, chem_refs *refs);
int chem_ccsd(const chem_space *s, diag_ctx *d, chem_refs *refs);
int chem_exact(const chem_space *s, chem_target t, diag_ctx *d, chem_refs *refs);

/* MP2 first-order doubles amplitudes t[i j a b] over spin orbitals, for the
 * `guess mp2` start: returns the amplitude of the excitation i j -> a b
 * (i<j occupied, a<b virtual spin orbitals of the reference), 0 if none. */
double chem_mp2_amplitude(const chem_space *s, int i, int j, int a, int b);

#endif
