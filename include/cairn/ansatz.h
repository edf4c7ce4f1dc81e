/* ansatz.h — generators and the ordered rotation program both lowerings read.
 *
 * A generator is a Hermitian Pauli sum G = sum_k m_k P_k with real m_k whose
 * words commute pairwise; its unitary is
 *     U(theta) = exp(-i theta G / 2) = prod_k exp(-i theta m_k P_k / 2).
 * A fermionic excitation T - T^dagger (anti-Hermitian) is stored as
 * G = 2i (T - T^dagger), so that U(theta) = exp(theta (T - T^dagger)).
 * A single entangler word P is G = P.
 *
 * The ansatz state is  |psi> = U_R ... U_1 |ref>  where the rotation program
 * lists, in the order they act, each exp(-i theta_p mult P / 2).
 *
 * Ownership: ans_circuit owns its arrays; ans_circuit_free frees them.
 */
#ifndef CAIRN_ANSATZ_H
#define CAIRN_ANSATZ_H

#include "cairn/diag.h"
#include "cairn/pauli.h"

#include <stdint.h>

typedef enum ans_kind {
  ANS_SINGLE,        /* fermionic single excitation (pool rule `singles`) */
  ANS_DOUBLE,        /* fermionic double excitation (`doubles`) */
  ANS_QUBIT_SINGLE,  /* qubit excitation, no parity strings (`qubit singles`) */
  ANS_QUBIT_DOUBLE,  /* (`qubit doubles`) */
  ANS_ENTANGLER,     /* one Pauli word per flip set of the Hamiltonian (`entanglers`) */
  ANS_WORD,          /* an explicit Pauli word (`word`) */
  ANS_EXCITE         /* an explicit fermionic excitation (`excite`) */
} ans_kind;

const char *ans_kind_name(ans_kind k); /* "single", "double", "qubit-single", ... */

/* What a lowering needs to know of a generator besides its rotations. */
typedef struct ans_gen_info {
  ans_kind kind;
  char *text;        /* display text ("X0 Y1 X4 X5", "0 1 -> 4 5"); owned by the circuit */
  int rule;          /* index of the pool rule in ir_recipe.rules, -1 if none */
  int line;          /* 1-based line of that rule in its file, 0 if none */
  int nexc;          /* excitations: spin orbitals from[0..nexc) -> to[0..nexc), else 0 */
  int from[4], to[4];
  int spin_adapted;  /* 1: two excitations (alpha and beta) under one parameter */
} ans_gen_info;

/* One rotation exp(-i theta[param] * mult * P / 2), P = word `word` of the
 * circuit's word table.  param < 0 means a fixed angle `mult` (radians). */
typedef struct ans_rotation {
  int32_t word;
  int32_t param;
  double mult;
  int32_t gen;      /* generator the rotation belongs to (-1: reference preparation) */
} ans_rotation;

typedef struct ans_circuit {
  int nqubits;
  uint64_t *init;        /* basis state the program starts from (pauli_nwords(nqubits) words) */
  pauli_sum words;       /* distinct words the rotations use (coefficients unused) */
  ans_rotation *rot;     /* in the order they act on the state */
  size_t nrot, caprot;
  int nparams;
  int *param_gen;        /* generator of each parameter; -1 for reference angles */
  double *param_init;    /* initial value of each parameter: the optimized mean-field
                            angles for reference parameters, 0 for generator amplitudes */
  ans_gen_info *gens;    /* ngens entries, indexed by ans_rotation.gen */
  int ngens;
  int nref_params;       /* leading parameters that belong to the reference (mean-field angles) */
  size_t *slot;          /* private: hash index over `words` (index + 1, 0 = empty) */
  size_t nslots;
} ans_circuit;

void ans_circuit_init(ans_circuit *c, int nqubits);
void ans_circuit_free(ans_circuit *c);
/* Add a word to the table (deduplicated) and return its index. */
int32_t ans_circuit_word(ans_circuit *c, const uint64_t *x, const uint64_t *z);
void ans_circuit_push(ans_circuit *c, int32_t word, int32_t param, double mult, int32_t gen);
/* Append a generator's info (text copied) and return its index. */
int ans_circuit_add_gen(ans_circuit *c, const ans_gen_info *info);
/* Add a parameter owned by generator `gen` (-1: reference); returns its index. */
int ans_circuit_add_param(ans_circuit *c, int gen);

#endif
