/* json.h — the JSON forms of Pauli sums and rotation programs that tools and
 * tests exchange.  Built on cJSON.
 *
 * Pauli sum (the shape of `cairn show --hamiltonian --json`, DESIGN.md):
 *   { "qubits": n, "constant": c, "terms": [ {"pauli": "X0 Y1", "coeff": c}, ... ] }
 * a real coefficient is a number, a complex one a pair [re, im]; the identity
 * goes into "constant" (a number or a pair).
 *
 * Rotation program:
 *   { "qubits": n, "init": "0101...", "params": [gen of each parameter],
 *     "generators": [ {"kind": "double", "text": "...", "rule": r, "line": l,
 *                      "from": [...], "to": [...]} ],
 *     "rotations": [ {"word": "X0 Y1", "param": p, "mult": m, "gen": g} ] }
 *
 * Ownership: returned cJSON trees belong to the caller (cJSON_Delete).
 */
#ifndef CAIRN_JSON_H
#define CAIRN_JSON_H

#include "cairn/ansatz.h"
#include "cairn/pauli.h"

#include <cjson/cJSON.h>

cJSON *json_pauli_sum(const pauli_sum *s);
/* Read a sum; returns 0 or -1 with a message in err. out is initialized here. */
int json_read_pauli_sum(const cJSON *j, pauli_sum *out, char *err, size_t errlen);
cJSON *json_circuit(const ans_circuit *c);
int json_read_circuit(const cJSON *j, ans_circuit *out, char *err, size_t errlen);
/* A double as JSON: numbers that read back exactly (cJSON prints 15 digits). */
cJSON *json_number(double x);
/* Print a tree with 17-significant-digit numbers, deterministic layout;
 * malloc'd text, caller frees. */
char *json_print(const cJSON *j);

#endif
