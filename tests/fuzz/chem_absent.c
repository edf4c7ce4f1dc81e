/* chem_absent.c — the fuzzer links the front end without the chemistry
 * module (and without the rest of libcairn), so that it builds with clang
 * whatever the numerical modules need.  fuzz_recipe.c passes its own
 * stand-ins in front_opts, so these two are never called; if one is, the
 * fuzzer stops with a crash report. */
#include "config.h"

#include "cairn/chem.h"

#include <stdlib.h>

int chem_count_orbitals(const ir_recipe *r, diag_ctx *d) {
  (void)r;
  (void)d;
  abort();
}

int chem_fcidump_header(const char *path, diag_span from, diag_ctx *d, int *norb, int *nelec, int *ms2) {
  (void)path;
  (void)from;
  (void)d;
  (void)norb;
  (void)nelec;
  (void)ms2;
  abort();
}
