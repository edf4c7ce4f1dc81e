/* testdata.h — data for the unit tests, check drivers and benchmarks: random
 * active spaces with the symmetries of real orbitals (invented data), and
 * molecules from a one-line text.
 *
 * Each caller keeps its own numbers (scales, diagonal, seed): the draws are in
 * one fixed order, so the same arguments give the same integrals bit for bit.
 *
 * Ownership: the chem_space filled by testdata_space is the caller's
 * (chem_space_free); the generator `r` is the caller's and is advanced; the
 * atoms of testdata_atoms are the caller's (free).
 */
#ifndef CAIRN_TESTDATA_H
#define CAIRN_TESTDATA_H

#include "cairn/chem.h"
#include "cairn/ir.h"
#include "cairn/util.h"

/* How the integrals are drawn from u, uniform on [0, 1):
 *   h1[pq] = h1 (u - 1/2), plus on the diagonal  diag0 + diag_rise p / diag_over
 *            (diag_over 0 counts as 1);
 *   (pq|rs) = h2 (u - 1/2), plus coulomb when p == q and r == s;
 * with irrep given (a Z2 label per orbital, a point group of order two),
 * integrals that break the labelling are zero (their draw is still made). */
typedef struct testdata_scales {
  double e_constant;
  double h1, diag0, diag_rise;
  int diag_over;
  double h2, coulomb;
  const int *irrep;
} testdata_scales;

/* A random active space of norb orbitals with nalpha/nbeta electrons: h1
 * symmetric, (pq|rs) 8-fold symmetric; one draw per unique h1 element (p >= q,
 * row by row), then one per unique (pq|rs) (pair pq >= pair rs). */
void testdata_space(chem_space *s, int norb, int nalpha, int nbeta, const testdata_scales *k, util_rng *r);

/* Atoms from "Sym x y z; Sym x y z; ..." (';' or newline between atoms;
 * pieces that are not four fields are skipped), positions in bohr, or in
 * angstrom converted to bohr (CODATA 2018 bohr).  An unknown element is
 * reported on stderr after `who`.  0 with *out (malloc'd) and *nat, or -1
 * when an element is unknown or there are no atoms. */
int testdata_atoms(const char *who, const char *txt, int angstrom, ir_atom **out, int *nat);

#endif
