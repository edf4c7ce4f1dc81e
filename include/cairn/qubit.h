/* qubit.h — fermions to qubits: encodings, the qubit Hamiltonian, symmetry
 * operators and Z2 tapering.
 *
 * Modes are spin orbitals (mode 2p = orbital p alpha, 2p+1 = orbital p beta).
 * Every encoding here is linear over GF(2): the qubit basis state of an
 * occupation vector n is b = A n (mod 2), with A the identity (Jordan-Wigner),
 * lower-triangular ones (parity), or the Bravyi-Kitaev matrix (Seeley, Richard,
 * Love 2012).  A product of ladder operators maps to a Pauli sum.
 *
 * Ownership: qubit_encoder and qubit_taper own their tables; free them with
 * their _free functions.  Output sums are initialized by the caller.
 */
#ifndef CAIRN_QUBIT_H
#define CAIRN_QUBIT_H

#include "cairn/chem.h"
#include "cairn/ir.h"
#include "cairn/pauli.h"

#include <complex.h>

typedef struct qubit_ladder {
  int mode;    /* spin orbital */
  int dagger;  /* 1: creation a^dagger, 0: annihilation a */
} qubit_ladder;

typedef struct qubit_encoder qubit_encoder;

qubit_encoder *qubit_encoder_new(ir_encoding e, int nmodes);
void qubit_encoder_free(qubit_encoder *enc);
int qubit_encoder_modes(const qubit_encoder *enc);
ir_encoding qubit_encoder_kind(const qubit_encoder *enc);
/* acc += coeff * ops[0] ops[1] ... ops[k-1] (operator product as written). */
void qubit_encoder_add_product(const qubit_encoder *enc, const qubit_ladder *ops, int k,
                               double complex coeff, pauli_acc *acc);
/* Encoded basis state of an occupation vector (both pauli_nwords(nmodes) words). */
void qubit_encoder_bits(const qubit_encoder *enc, const uint64_t *occ, uint64_t *bits);
/* Occupation vector of an encoded basis state (inverse of the above). */
void qubit_encoder_occupations(const qubit_encoder *enc, const uint64_t *bits, uint64_t *occ);

/* The active-space Hamiltonian (chem.h) as a canonical Pauli sum on 2*norb
 * qubits; terms with |c| <= 1e-14 dropped.  The constant goes to the identity. */
void qubit_hamiltonian(const chem_space *s, const qubit_encoder *enc, pauli_sum *out);
/* N (particle number), S_z and S^2 as canonical Pauli sums. */
void qubit_number(const qubit_encoder *enc, pauli_sum *out);
void qubit_spin_z(const qubit_encoder *enc, pauli_sum *out);
void qubit_spin_squared(const qubit_encoder *enc, pauli_sum *out);

/* Z2 tapering (Bravyi, Gambetta, Mezzacapo, Temme 2017), restricted to
 * Z-type symmetries: words tau_i = Z^{a_i} that commute with every term of H.
 * Each tau_i is assigned a pivot qubit q_i (in no other tau_j); the Clifford
 * U_i = (X_{q_i} + tau_i)/sqrt 2 maps tau_i to X_{q_i}; the sector s_i = +-1 is
 * the eigenvalue of tau_i on the reference; the pivot qubits are removed. */
typedef struct qubit_taper {
  int nqubits;        /* before tapering */
  int nsym;           /* symmetries removed */
  uint64_t *tau;      /* nsym Z masks, pauli_nwords(nqubits) words each */
  int *pivot;         /* nsym pivot qubits */
  int *sector;        /* nsym eigenvalues +1 / -1 */
  int *keep;          /* nqubits - nsym kept qubits, increasing: new qubit j = old keep[j] */
  char **why;         /* nsym short explanations ("particle-number parity", ...), malloc'd */
} qubit_taper;

/* Find the symmetries of H, the sector of the reference basis state `ref`
 * (encoded bits).  Fills t (nsym may be 0). */
void qubit_taper_find(const pauli_sum *H, const uint64_t *ref, const qubit_encoder *enc, qubit_taper *t);
void qubit_taper_free(qubit_taper *t); /* safe on a zeroed struct */
/* Apply the tapering to a Pauli sum: out lives on nqubits - nsym qubits.
 * Returns 0, or -1 when `in` does not commute with every tau_i (out is then
 * left empty). */
int qubit_taper_apply(const qubit_taper *t, const pauli_sum *in, pauli_sum *out);
/* The tapered reference basis state (kept qubits of ref). */
void qubit_taper_bits(const qubit_taper *t, const uint64_t *ref, uint64_t *out);

#endif
