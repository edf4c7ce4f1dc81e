/* integrals.h — molecular integrals over contracted Gaussian shells.
 *
 * McMurchie-Davidson scheme (J. Comput. Phys. 26, 218 (1978)): products of
 * Gaussians expanded in Hermite Gaussians, Coulomb integrals from Hermite
 * integrals R_tuv built on the Boys function.  Shells of any l up to
 * BASIS_MAXL (s, p, d, f, g); cartesian shells have (l+1)(l+2)/2 functions, each
 * normalized to 1; spherical shells are real solid harmonics (2l+1 functions,
 * normalized), as the basis file declares.
 *
 * Function order: atoms in input order, shells in file order, then the
 * functions of a shell (cartesian: xx, xy, xz, yy, yz, zz, ...; spherical:
 * m = -l .. l).
 *
 * Ownership: int_basis owns its shells (int_basis_free).  Output matrices are
 * caller-allocated, row-major, nbf x nbf (nbf^4 for the electron repulsion
 * integrals, index ((p*nbf+q)*nbf+r)*nbf+s, chemists' notation (pq|rs)).
 */
#ifndef CAIRN_INTEGRALS_H
#define CAIRN_INTEGRALS_H

#include "cairn/basis.h"
#include "cairn/ir.h"

#include <stdint.h>

typedef struct int_shell {
  int l, nprim;
  int pure;           /* 1: spherical functions */
  int atom;           /* index into the atom list */
  double center[3];   /* bohr */
  double *exps;       /* nprim */
  double *coefs;      /* nprim: contraction coefficient x primitive normalization, so
                         that the x^l component of the contracted shell has norm 1 */
  int start;          /* first function of the shell */
  int size;           /* functions in the shell */
} int_shell;

typedef struct int_basis {
  int nshells;
  int_shell *shells;
  int nbf;
  int lmax;
  int natoms;
  double *xyz;        /* 3 * natoms, bohr */
  double *charge;     /* natoms nuclear charges */
  int *atom_start;    /* natoms + 1: functions of atom a are atom_start[a] .. atom_start[a+1]-1 */
} int_basis;

/* The shells of a molecule in basis set b.  Returns 0, or -1 when an atom's
 * element is not covered (the caller has checked that already through
 * chem_count_orbitals; here it is only a guard). */
int int_basis_build(const basis_set *b, const ir_atom *atoms, int natoms, int_basis *out);
void int_basis_free(int_basis *ib);

/* Nuclear repulsion energy sum_{A<B} Z_A Z_B / R_AB (hartree). */
double int_nuclear_repulsion(const int_basis *ib);

/* One-electron matrices: overlap, kinetic energy, nuclear attraction. */
void int_overlap(const int_basis *ib, double *S);
void int_kinetic(const int_basis *ib, double *T);
void int_nuclear(const int_basis *ib, double *V);

/* Bytes the full electron-repulsion array takes. */
static inline uint64_t int_eri_bytes(const int_basis *ib) {
  uint64_t n = (uint64_t)ib->nbf;
  return n * n * n * n * sizeof(double);
}
/* All (pq|rs) into eri (nbf^4, caller-allocated), computed once per unique
 * shell quartet (8-fold symmetry) and skipped when the Schwarz bound
 * sqrt((ab|ab)(cd|cd)) is below `screen` (1e-14 is a safe default).  Returns
 * the number of shell quartets computed. */
long int_eri(const int_basis *ib, double screen, double *eri);

/* Boys function F_m(T) = int_0^1 t^(2m) exp(-T t^2) dt for m = 0..mmax
 * (mmax <= INT_BOYS_MMAX), into f[0..mmax].  Relative accuracy about 1e-14. */
enum { INT_BOYS_MMAX = 4 * BASIS_MAXL + 2 };
typedef struct int_boys int_boys;
int_boys *int_boys_new(void);
void int_boys_free(int_boys *b);
void int_boys_eval(const int_boys *b, int mmax, double T, double *f);

#endif
