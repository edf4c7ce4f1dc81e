/* qubit.h — fermions to qubits: encodings, the qubit Hamiltonian, symmetry
 * operators and Z2 tapering.
 *
 * Modes are spin orbitals (mode 2p = orbital p alpha, 2p+1 = orbital p beta).
 * Every encoding here is linear over GF(2): the qubit basis state of an
 * occupation vector n is b = A n (mod 2), with A the identity (Jordan-Wigner),
 * lower-triangular ones (parity), or the Bravyi-Kitaev matrix (Seeley, Richard,
 * Love 2012).  A product of ladder operators maps to a Pauli sum.
 *
 * Conventions, used everywhere:
 *   - mode 2p is orbital p alpha (spin up), 2p+1 is orbital p beta;
 *   - qubit q of a basis state is bit q of its index; occupied = 1;
 *   - Jordan-Wigner: a_j = Z_0 ... Z_{j-1} (X_j + i Y_j)/2 (annihilates |1>);
 *     every encoding is the Clifford image of it: X^u Z^w -> X^{Au} Z^{A^-T w};
 *   - the Hartree-Fock state of (nalpha, nbeta) occupies modes 2p, p < nalpha,
 *     and 2p+1, p < nbeta, encoded by qubit_encoder_bits.
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

/* The table of encodings has one entry per ir_encoding (encoder.c). */
qubit_encoder *qubit_encoder_new(ir_encoding e, int nmodes);
const char *qubit_encoding_name(ir_encoding e); /* "jordan-wigner", "bravyi-kitaev", "parity" */
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
/* The encoded Hartree-Fock basis state of (nalpha, nbeta) electrons. */
void qubit_encoder_reference(const qubit_encoder *enc, int nalpha, int nbeta, uint64_t *bits);
/* Re-express in place a sum written in the Jordan-Wigner encoding in enc's
 * encoding (each word through the Clifford, sign kept exact); canonical after. */
void qubit_encoder_map_jw(const qubit_encoder *enc, pauli_sum *s);

/* Z words whose eigenvalue is a parity: (-1)^N, (-1)^{N_alpha}, (-1)^{N_beta}. */
typedef enum qubit_parity { QUBIT_PARITY_N, QUBIT_PARITY_ALPHA, QUBIT_PARITY_BETA } qubit_parity;
/* The Z mask (pauli_nwords(nmodes) words) of a parity in enc's encoding. */
void qubit_parity_word(const qubit_encoder *enc, qubit_parity which, uint64_t *z);

/* The active-space Hamiltonian (chem.h) as a canonical Pauli sum on 2*norb
 * qubits (enc must have 2*norb modes); terms with |c| <= 1e-14 dropped.  The
 * constant goes to the identity.  Coefficients are real: the integrals are
 * real and 8-fold symmetric, so H is Hermitian and its imaginary parts cancel;
 * what is kept is the Hermitian part (H + H^dag)/2.  Built in Jordan-Wigner
 * form from closed-form pieces per integral class, then mapped (qubit.h top). */
void qubit_hamiltonian(const chem_space *s, const qubit_encoder *enc, pauli_sum *out);
/* N (particle number), S_z and S^2 as canonical Pauli sums. */
void qubit_number(const qubit_encoder *enc, pauli_sum *out);
void qubit_spin_z(const qubit_encoder *enc, pauli_sum *out);
void qubit_spin_squared(const qubit_encoder *enc, pauli_sum *out);

/* Z2 tapering (Bravyi, Gambetta, Mezzacapo, Temme 2017), restricted to
 * Z-type symmetries: words tau_i = Z^{a_i} that commute with every term of H.
 * The a_i span the GF(2) null space of H's X-part check matrix (rows: the x
 * masks of the terms).  Each tau_i is assigned a pivot qubit q_i (in no other
 * tau_j); the Clifford U_i = (X_{q_i} + tau_i)/sqrt 2 maps tau_i to X_{q_i}
 * and a term P that commutes with tau_i to P (if P commutes with X_{q_i}) or
 * P tau_i X_{q_i}; the sector s_i = +-1 is the eigenvalue of tau_i on the
 * reference; X_{q_i} is replaced by s_i and the pivot qubits are removed.
 * The basis is chosen so that as many tau_i as possible are the named parity
 * words of the encoding (qubit_parity); why[i] names each one:
 * "particle-number parity", "spin-up parity", "spin-down parity", or
 * "spatial symmetry" for any other (point-group) symmetry. */
typedef struct qubit_taper {
  int nqubits;        /* before tapering */
  int nsym;           /* symmetries removed */
  uint64_t *tau;      /* nsym Z masks, pauli_nwords(nqubits) words each */
  int *pivot;         /* nsym pivot qubits */
  int *sector;        /* nsym eigenvalues +1 / -1 */
  int *keep;          /* nqubits - nsym kept qubits, increasing: new qubit j = old keep[j] */
  char **why;         /* nsym short explanations ("particle-number parity", ...), malloc'd */
  unsigned parities;  /* bit p: parity word p (qubit_parity) is a product of the tau_i */
} qubit_taper;

/* Find the symmetries of H, the sector of the reference basis state `ref`
 * (encoded bits).  Fills t (nsym may be 0).  enc names the symmetries; it
 * may be NULL (then every why[i] is "symmetry"). */
void qubit_taper_find(const pauli_sum *H, const uint64_t *ref, const qubit_encoder *enc, qubit_taper *t);
void qubit_taper_free(qubit_taper *t); /* safe on a zeroed struct */
/* Apply the tapering to a Pauli sum: out lives on nqubits - nsym qubits.
 * Returns 0, or -1 when `in` does not commute with every tau_i (out is then
 * left empty). */
int qubit_taper_apply(const qubit_taper *t, const pauli_sum *in, pauli_sum *out);
/* The tapered reference basis state (kept qubits of ref). */
void qubit_taper_bits(const qubit_taper *t, const uint64_t *ref, uint64_t *out);

#endif
