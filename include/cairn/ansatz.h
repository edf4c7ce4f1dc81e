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
  int ngens;
  size_t *slot;          /* private: hash index over `words` (index + 1, 0 = empty) */
  size_t nslots;
} ans_circuit;

void ans_circuit_init(ans_circuit *c, int nqubits);
void ans_circuit_free(ans_circuit *c);
/* Add a word to the table (deduplicated) and return its index. */
int32_t ans_circuit_word(ans_circuit *c, const uint64_t *x, const uint64_t *z);
void ans_circuit_push(ans_circuit *c, int32_t word, int32_t param, double mult, int32_t gen);

#endif
