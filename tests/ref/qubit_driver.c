/* qubit_driver.c — check driver for the reference tests: reads an FCIDUMP
 * file and prints, as JSON, the qubit Hamiltonian in one encoding, the
 * symmetry operators, the Hartree-Fock reference and (with --taper) the
 * tapering and the tapered Hamiltonian.  Not installed.
 *
 *   qubit_driver FILE.fcidump jordan-wigner|bravyi-kitaev|parity [--taper]
 */
#include "config.h"

#include "cairn/diag.h"
#include "cairn/fcidump.h"
#include "cairn/json.h"
#include "cairn/qubit.h"
#include "cairn/util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static char *bits_text(int n, const uint64_t *b) {
  char *s = xmalloc((size_t)n + 1);
  for (int q = 0; q < n; q++) s[q] = pauli_get_x(b, q) ? '1' : '0';
  s[n] = 0;
  return s;
}

static void add_bits(cJSON *o, const char *key, int n, const uint64_t *b) {
  char *s = bits_text(n, b);
  cJSON_AddStringToObject(o, key, s);
  free(s);
}

int main(int argc, char **argv) {
  if (argc < 3) {
    fprintf(stderr, "usage: qubit_driver FILE.fcidump ENCODING [--taper]\n");
    return 2;
  }
  ir_encoding e;
  if (strcmp(argv[2], "jordan-wigner") == 0) e = IR_ENC_JORDAN_WIGNER;
  else if (strcmp(argv[2], "bravyi-kitaev") == 0) e = IR_ENC_BRAVYI_KITAEV;
  else if (strcmp(argv[2], "parity") == 0) e = IR_ENC_PARITY;
  else {
    fprintf(stderr, "qubit_driver: unknown encoding `%s`\n", argv[2]);
    return 2;
  }
  int taper = argc > 3 && strcmp(argv[3], "--taper") == 0;
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  chem_space s = {0};
  if (fcidump_read(d, argv[1], DIAG_NOWHERE, &s) != 0) {
    diag_free(d);
    return 1;
  }
  int n = 2 * s.norb, nw = pauli_nwords(n);
  qubit_encoder *enc = qubit_encoder_new(e, n);
  pauli_sum h, op;
  pauli_sum_init(&h, n);
  pauli_sum_init(&op, n);
  qubit_hamiltonian(&s, enc, &h);
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "encoding", qubit_encoding_name(e));
  cJSON_AddNumberToObject(o, "norb", s.norb);
  cJSON_AddNumberToObject(o, "nalpha", s.nalpha);
  cJSON_AddNumberToObject(o, "nbeta", s.nbeta);
  cJSON_AddItemToObject(o, "hamiltonian", json_pauli_sum(&h));
  qubit_number(enc, &op);
  cJSON_AddItemToObject(o, "number", json_pauli_sum(&op));
  qubit_spin_z(enc, &op);
  cJSON_AddItemToObject(o, "spin_z", json_pauli_sum(&op));
  qubit_spin_squared(enc, &op);
  cJSON_AddItemToObject(o, "spin_squared", json_pauli_sum(&op));
  uint64_t *ref = xcalloc((size_t)nw, sizeof *ref);
  qubit_encoder_reference(enc, s.nalpha, s.nbeta, ref);
  add_bits(o, "reference", n, ref);
  int rc = 0;
  if (taper) {
    qubit_taper t;
    qubit_taper_find(&h, ref, enc, &t);
    cJSON *tj = cJSON_CreateObject();
    cJSON_AddNumberToObject(tj, "removed", t.nsym);
    cJSON *taus = cJSON_CreateArray(), *piv = cJSON_CreateArray(), *sec = cJSON_CreateArray(),
          *why = cJSON_CreateArray();
    for (int i = 0; i < t.nsym; i++) {
      char *tb = bits_text(n, t.tau + (size_t)i * nw);
      cJSON_AddItemToArray(taus, cJSON_CreateString(tb));
      free(tb);
      cJSON_AddItemToArray(piv, cJSON_CreateNumber(t.pivot[i]));
      cJSON_AddItemToArray(sec, cJSON_CreateNumber(t.sector[i]));
      cJSON_AddItemToArray(why, cJSON_CreateString(t.why[i]));
    }
    cJSON_AddItemToObject(tj, "tau", taus);
    cJSON_AddItemToObject(tj, "pivot", piv);
    cJSON_AddItemToObject(tj, "sector", sec);
    cJSON_AddItemToObject(tj, "why", why);
    pauli_sum ht;
    pauli_sum_init(&ht, n - t.nsym);
    if (qubit_taper_apply(&t, &h, &ht) != 0) {
      fprintf(stderr, "qubit_driver: the Hamiltonian does not commute with its own symmetries\n");
      rc = 1;
    }
    cJSON_AddItemToObject(tj, "hamiltonian", json_pauli_sum(&ht));
    uint64_t *tref = xcalloc((size_t)pauli_nwords(n - t.nsym), sizeof *tref);
    qubit_taper_bits(&t, ref, tref);
    add_bits(tj, "reference", n - t.nsym, tref);
    free(tref);
    cJSON_AddItemToObject(o, "taper", tj);
    pauli_sum_free(&ht);
    qubit_taper_free(&t);
  }
  char *text = json_print(o);
  fputs(text, stdout);
  fputc('\n', stdout);
  free(text);
  cJSON_Delete(o);
  free(ref);
  pauli_sum_free(&h);
  pauli_sum_free(&op);
  qubit_encoder_free(enc);
  chem_space_free(&s);
  diag_free(d);
  return rc;
}
