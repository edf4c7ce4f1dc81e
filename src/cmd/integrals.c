/* integrals.c — `cairn integrals`: the active-space Hamiltonian of a recipe
 * (integrals, Hartree-Fock, core folding, active orbitals; or the recipe's
 * FCIDUMP file with its core and active space applied) written as an FCIDUMP
 * file, atomically.
 *
 *   cairn integrals -o OUT.fcidump [--point K] FILE
 *
 * K is the scan point (0, 1, ...; default 0).  A summary goes to standard
 * output. */
#include "config.h"

#include "cmd/cmd.h"

#include "cairn/chem.h"
#include "cairn/diag.h"
#include "cairn/front.h"
#include "cairn/ir.h"
#include "cairn/util.h"

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int cmd_integrals(const cmd_env *env, int argc, char **argv) {
  const char *file = NULL, *out = NULL;
  int point = 0;
  for (int i = 1; i < argc; i++) {
    const char *s = argv[i];
    if ((strcmp(s, "-o") == 0 || strcmp(s, "--point") == 0) && i + 1 >= argc)
      return cmd_usage_error("integrals", "%s needs a value", s);
    if (strcmp(s, "-o") == 0) {
      out = argv[++i];
    } else if (strcmp(s, "--point") == 0) {
      char *end;
      long v = strtol(argv[++i], &end, 10);
      if (*end || end == argv[i] || v < 0 || v > 1000000)
        return cmd_usage_error("integrals", "--point takes a point index (0, 1, ...), not `%s`", argv[i]);
      point = (int)v;
    } else if (s[0] == '-' && s[1]) {
      return cmd_usage_error("integrals", "unknown option `%s`", s);
    } else if (!file) {
      file = s;
    } else {
      return cmd_usage_error("integrals", "one FILE at a time (got `%s` and `%s`)", file, s);
    }
  }
  if (!file) return cmd_usage_error("integrals", "no FILE given");
  if (!out) return cmd_usage_error("integrals", "no output given (-o OUT.fcidump)");

  diag_ctx *d = diag_new(stderr, env->color);
  diag_set_werror(d, env->werror);
  ir_recipe *r = front_load(d, file);
  if (!r || diag_errors(d)) {
    if (r) ir_recipe_free(r);
    diag_free(d);
    return 1;
  }
  if (point >= r->npoints && !(r->problem == IR_PROBLEM_INTEGRALS && point == 0)) {
    fprintf(stderr, "cairn integrals: --point %d: the recipe has %d point%s (0..%d)\n", point, r->npoints,
            r->npoints == 1 ? "" : "s", r->npoints - 1);
    ir_recipe_free(r);
    diag_free(d);
    return 2;
  }
  chem_space s;
  chem_refs refs;
  memset(&refs, 0, sizeof refs);
  int rc = 0;
  if (chem_build_space(r, point, d, &s, &refs) != 0) {
    rc = 1;
  } else {
    if (chem_fcidump_write(&s, out) != 0) {
      fprintf(stderr, "cairn integrals: cannot write `%s`: %s\n", out, strerror(errno));
      rc = 2;
    } else {
      char b1[32], b2[32];
      printf("wrote %s: %d orbitals, %d alpha + %d beta electrons, constant %s hartree", out, s.norb, s.nalpha,
             s.nbeta, util_fmt_double(b1, s.e_constant));
      if (refs.has_hf) printf(", E(HF) %s hartree", util_fmt_double(b2, refs.hf));
      printf("\n");
      if (r->problem == IR_PROBLEM_ATOMS)
        printf("note: integrals in the recipe's basis set; the constant is the nuclear repulsion plus the "
               "energy of %d folded core orbital%s\n",
               r->orbitals.ncore, r->orbitals.ncore == 1 ? "" : "s");
    }
    chem_space_free(&s);
  }
  if (rc == 0 && diag_errors(d)) rc = 1;
  ir_recipe_free(r);
  diag_free(d);
  return rc;
}
