/* check.c — `cairn check FILE...`: parse and resolve each recipe, print its
 * diagnostics, and one summary line per recipe that is fine. */
#include "config.h"

#include "cmd/cmd.h"
#include "cairn/front.h"
#include "cairn/ir.h"
#include "cairn/pool.h"

#include <stdio.h>
#include <string.h>

/* What a checked recipe amounts to, in one line. */
static void summary(const ir_recipe *r) {
  const ir_orbitals *o = &r->orbitals;
  printf("%s: ok: ", r->path);
  if (r->scan.active) printf("%d points of %s, ", r->npoints, r->scan.name);
  printf("%d electrons in %d active orbitals (%d qubits), %d pool rule%s\n", o->nelec_active, o->nactive,
         ir_qubits(r), r->nrules, r->nrules == 1 ? "" : "s");
}

int cmd_check(const cmd_env *env, int argc, char **argv) {
  int nfiles = 0;
  for (int i = 1; i < argc; i++) {
    if (argv[i][0] == '-' && argv[i][1]) return cmd_usage_error("check", "unknown option `%s`", argv[i]);
    nfiles++;
  }
  if (nfiles == 0) return cmd_usage_error("check", "no recipe given");
  diag_ctx *d = diag_new(stderr, env->color);
  diag_set_werror(d, env->werror);
  int status = 0;
  for (int i = 1; i < argc; i++) {
    int32_t f = diag_load_file(d, argv[i], DIAG_NOWHERE);
    if (f < 0) {
      status = 2;
      continue;
    }
    int before = diag_errors(d);
    ir_recipe *r = front_resolve(d, f, NULL);
    /* The symmetry type check of the generators and the reference, on a
     * resolved recipe; it builds the Hamiltonian only when typing needs it
     * (entanglers, tapering), and never simulates. */
    if (r && diag_errors(d) == before) ans_check(r, d);
    if (r && diag_errors(d) == before) summary(r);
    else if (status == 0) status = 1;
    ir_recipe_free(r);
  }
  diag_free(d);
  return status;
}
