/* fuzz_inputs.c — libFuzzer target for the two input files cairn reads
 * besides recipes: FCIDUMP integral files and Gaussian-94 basis sets.
 *
 * The first byte of an input chooses the reader (even: FCIDUMP, odd: basis
 * file); the rest is the file's text, registered with diag as in a real run.
 * Either reader must return 0 or -1 with at least one error reported; on
 * success the result is checked (an FCIDUMP's integrals are finite and its
 * electron counts fit its orbitals; a basis set's shells have positive
 * exponents and sizes), and everything is freed, so a leak is a finding too.
 * FCIDUMP headers of more than 40 orbitals are only parsed (their integrals
 * would pass the fuzzer's memory limit legitimately).  Diagnostics go to
 * /dev/null.
 */
#include "config.h"

#include "cairn/basis.h"
#include "cairn/diag.h"
#include "cairn/fcidump.h"
#include "cairn/util.h"

#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

static void check_space(const chem_space *s) {
  if (s->norb < 1 || s->nalpha < 0 || s->nbeta < 0 || s->nalpha > s->norb || s->nbeta > s->norb) abort();
  size_t n = (size_t)s->norb;
  for (size_t k = 0; k < n * n; k++)
    if (!isfinite(s->h1[k])) abort();
  for (size_t k = 0; k < n * n * n * n; k++)
    if (!isfinite(s->h2[k])) abort();
  if (!isfinite(s->e_constant)) abort();
}

static void check_basis(const basis_set *b) {
  for (int z = 0; z <= BASIS_MAXZ; z++) {
    const basis_element *e = &b->elem[z];
    for (int k = 0; k < e->nshells; k++) {
      const basis_shell *sh = &e->shells[k];
      if (sh->l < 0 || sh->nprim < 1) abort();
      for (int p = 0; p < sh->nprim; p++)
        if (!(sh->exps[p] > 0) || !isfinite(sh->exps[p]) || !isfinite(sh->coefs[p])) abort();
    }
  }
}

/* A valid FCIDUMP header of more than 40 orbitals (parsed in a diag context
 * of its own, so the real read's messages are counted alone). */
static int wide_header(FILE *null, const uint8_t *text, size_t len) {
  diag_ctx *d = diag_new(null, 0);
  char *copy = xmalloc(len + 1);
  memcpy(copy, text, len);
  int32_t f = diag_add_file(d, "fuzz.fcidump", copy, len);
  fcidump_header h;
  int wide = fcidump_parse_header(d, f, &h) == 0 && h.norb > 40;
  diag_free(d);
  return wide;
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  if (size < 1) return 0;
  int kind = data[0] & 1;
  FILE *null = fopen("/dev/null", "w");
  if (!null) abort();
  diag_ctx *d = diag_new(null, 0);
  char *copy = xmalloc(size);
  memcpy(copy, data + 1, size - 1);
  int32_t f = diag_add_file(d, kind ? "fuzz.gbs" : "fuzz.fcidump", copy, size - 1); /* d owns the copy now */
  size_t len;
  const char *text = diag_file_text(d, f, &len);
  int rc;
  if (kind == 0 && wide_header(null, data + 1, size - 1)) {
    /* a valid header asking for norb^4 doubles that this machine may well
     * hold (the reader refuses what it cannot): beyond the fuzzer's memory
     * limit, and not a finding */
    rc = 0;
  } else if (kind == 0) {
    chem_space s;
    memset(&s, 0, sizeof s);
    rc = fcidump_read_file(d, f, &s);
    if (rc == 0) {
      check_space(&s);
      chem_space_free(&s);
    }
  } else {
    basis_set b;
    memset(&b, 0, sizeof b);
    rc = basis_parse(d, f, text, len, "fuzz", &b);
    if (rc == 0) {
      check_basis(&b);
      basis_set_free(&b);
    }
  }
  if (rc != 0 && diag_errors(d) == 0) abort(); /* a refusal must say why */
  if (rc != 0 && rc != -1) abort();
  diag_free(d);
  fclose(null);
  return 0;
}
