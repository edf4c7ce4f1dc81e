/* testref.h — slow, generic routes that the unit tests and benchmarks hold
 * cairn's closed forms against (checks and speed baselines).
 *
 * They use only the general operations of the library (ladder-operator
 * products through an encoder, the Pauli algebra), never the closed forms
 * they are compared with.
 *
 * Ownership: `out` is the caller's, initialized (pauli_sum_init); its
 * contents are replaced.
 */
#ifndef CAIRN_TESTREF_H
#define CAIRN_TESTREF_H

#include "cairn/chem.h"
#include "cairn/pool.h"
#include "cairn/qubit.h"

/* The qubit Hamiltonian of s in the encoding enc, every integral expanded as
 * a product of ladder operators into a hash accumulator sized for
 * expected_terms (a size hint only: the result does not depend on it). */
void testref_hamiltonian(const chem_space *s, const qubit_encoder *enc, size_t expected_terms, pauli_sum *out);

/* dE/dtheta at theta = 0 of generator k of pool at the basis state b,
 * (i/2)<b|[G, H]|b>: the commutator by the Pauli algebra, then its diagonal
 * terms one by one. */
double testref_gradient(const ans_pool *pool, size_t k, const pauli_sum *H, const uint64_t *b);

#endif
