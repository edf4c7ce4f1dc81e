/* ans_driver.c — a check driver for the reference tests of the ansatz module:
 * reads an FCIDUMP file, builds the pool of the given rules, screens it, and
 * prints the generator table as JSON (ans_table_json) on stdout, with every
 * generator's words, so numpy can rebuild and check each one.
 *
 *   ans_driver [options] FCIDUMP RULE...
 *     --encoding jordan-wigner|bravyi-kitaev|parity
 *     --reference hartree-fock|mean-field|BITS      (BITS: a 0/1 string, qubit 0 first)
 *     --taper
 *     --keep particles|spin-z|spin-squared          (exactly; repeatable)
 *     --choose all|N|above:T    --order written|gradient|rank    --trotter K
 *     --product SEED    also print gradients at a random product state
 *     --circuit         also print the rotation program
 *   RULE: "singles", "doubles paired generalized", "qubit doubles",
 *         "entanglers", "word X0 Y1 X2 X3", "excite 0 1 -> 4 5".
 * Diagnostics go to stderr; exit 0, 1 (recipe errors) or 2 (usage). */
#include "config.h"

#include "cairn/fcidump.h"
#include "cairn/json.h"
#include "cairn/pool.h"
#include "cairn/util.h"
#include "../support/testrecipe.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int usage(const char *msg) {
  fprintf(stderr, "ans_driver: %s\n", msg);
  return 2;
}

int main(int argc, char **argv) {
  ir_recipe r;
  memset(&r, 0, sizeof r);
  r.encoding = IR_ENC_JORDAN_WIGNER;
  r.reference.kind = IR_REF_HARTREE_FOCK;
  r.choose.kind = IR_CHOOSE_ALL;
  r.trotter = 1;
  const char *fcidump = NULL, *choose = "all";
  const char *rules[64];
  int nrules = 0, circuit = 0, product = 0;
  uint64_t seed = 0;
  for (int i = 1; i < argc; i++) {
    const char *a = argv[i];
    if (!strcmp(a, "--encoding") && i + 1 < argc) {
      const char *e = argv[++i];
      r.encoding = !strcmp(e, "parity") ? IR_ENC_PARITY : !strcmp(e, "bravyi-kitaev") ? IR_ENC_BRAVYI_KITAEV
                                                                                        : IR_ENC_JORDAN_WIGNER;
    } else if (!strcmp(a, "--reference") && i + 1 < argc) {
      const char *e = argv[++i];
      if (!strcmp(e, "mean-field")) r.reference.kind = IR_REF_MEAN_FIELD;
      else if (strcmp(e, "hartree-fock") != 0) r.reference.kind = IR_REF_BITS, r.reference.bits = xstrdup(e);
    } else if (!strcmp(a, "--taper")) {
      r.taper = 1;
    } else if (!strcmp(a, "--keep") && i + 1 < argc) {
      const char *e = argv[++i];
      int s = !strcmp(e, "particles") ? 0 : !strcmp(e, "spin-z") ? 1 : 2;
      r.keep[s].policy = IR_KEEP_EXACTLY;
    } else if (!strcmp(a, "--choose") && i + 1 < argc) {
      choose = argv[++i];
    } else if (!strcmp(a, "--order") && i + 1 < argc) {
      const char *e = argv[++i];
      r.order = !strcmp(e, "gradient") ? IR_ORDER_GRADIENT : !strcmp(e, "rank") ? IR_ORDER_RANK : IR_ORDER_WRITTEN;
    } else if (!strcmp(a, "--trotter") && i + 1 < argc) {
      r.trotter = atoi(argv[++i]);
    } else if (!strcmp(a, "--product") && i + 1 < argc) {
      product = 1;
      seed = strtoull(argv[++i], NULL, 10);
    } else if (!strcmp(a, "--circuit")) {
      circuit = 1;
    } else if (a[0] == '-') {
      return usage("unknown option");
    } else if (!fcidump) {
      fcidump = a;
    } else if (nrules < 64) {
      rules[nrules++] = a;
    }
  }
  if (!fcidump) return usage("needs an FCIDUMP file");
  if (!strncmp(choose, "above:", 6)) r.choose.kind = IR_CHOOSE_ABOVE, r.choose.threshold = atof(choose + 6);
  else if (strcmp(choose, "all") != 0) r.choose.kind = IR_CHOOSE_COUNT, r.choose.count = atoi(choose);

  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  /* a recipe-like text so that every message has a line (tests/support/testrecipe.c) */
  int32_t file = testrecipe_text(d, "driver.cairn", &r, rules, nrules);
  r.rules = xcalloc((size_t)(nrules ? nrules : 1), sizeof *r.rules);
  r.nrules = nrules;
  if (testrecipe_rules(d, file, r.rules, rules, nrules) < nrules) return usage("rule not understood");

  chem_space cs;
  if (fcidump_read(d, fcidump, DIAG_NOWHERE, &cs) != 0) return 2;
  r.orbitals.nactive = cs.norb;
  r.orbitals.nalpha = cs.nalpha;
  r.orbitals.nbeta = cs.nbeta;
  r.multiplicity = cs.nalpha - cs.nbeta + 1;
  ans_setup s;
  ans_plan pl;
  memset(&pl, 0, sizeof pl);
  int rc = ans_setup_init(&s, &r, &cs, d);
  if (rc == 0) rc = ans_plan_build(&pl, &r, &s.prob, d);
  if (rc == 0) {
    ans_plan_type(&pl, &s.prob);
    cJSON *o = ans_table_json(&pl, &r, &s.prob, d);
    cJSON_AddNumberToObject(o, "nalpha", cs.nalpha);
    cJSON_AddNumberToObject(o, "nbeta", cs.nbeta);
    cJSON_AddNumberToObject(o, "norb", cs.norb);
    if (product) {
      /* every qubit tilted: the closed forms at a general product state */
      int n = pl.ref.nqubits;
      ans_reference pr = pl.ref;
      pr.theta = xmalloc((size_t)n * sizeof *pr.theta);
      pr.phi = xmalloc((size_t)n * sizeof *pr.phi);
      util_rng rng;
      util_rng_seed(&rng, seed);
      for (int q = 0; q < n; q++) pr.theta[q] = 0.1 + 2.9 * util_rng_uniform(&rng), pr.phi[q] = 6.2 * util_rng_uniform(&rng);
      cJSON *po = cJSON_CreateObject(), *th = cJSON_CreateArray(), *ph = cJSON_CreateArray(), *gr = cJSON_CreateArray();
      for (int q = 0; q < n; q++) {
        cJSON_AddItemToArray(th, json_number(pr.theta[q]));
        cJSON_AddItemToArray(ph, json_number(pr.phi[q]));
      }
      for (size_t i = 0; i < pl.norder; i++)
        cJSON_AddItemToArray(gr, json_number(ans_gen_gradient(&pl.pool, pl.order[i], s.prob.H, &pr)));
      cJSON_AddItemToObject(po, "theta", th);
      cJSON_AddItemToObject(po, "phi", ph);
      cJSON_AddItemToObject(po, "gradients", gr);
      cJSON_AddItemToObject(po, "energy", json_number(ans_product_energy(s.prob.H, &pr)));
      cJSON_AddItemToObject(o, "product", po);
      free(pr.theta);
      free(pr.phi);
    }
    if (circuit) {
      ans_circuit c;
      ans_plan_circuit(&pl, &r, &c);
      cJSON *cj = json_circuit(&c);
      cJSON *init = cJSON_CreateArray();
      for (int p = 0; p < c.nparams; p++) cJSON_AddItemToArray(init, json_number(c.param_init[p]));
      cJSON_AddItemToObject(cj, "param_init", init);
      cJSON_AddItemToObject(o, "circuit", cj);
      ans_circuit_free(&c);
    }
    char *text = json_print(o);
    printf("%s\n", text);
    free(text);
    cJSON_Delete(o);
  }
  ans_plan_free(&pl);
  ans_setup_free(&s);
  chem_space_free(&cs);
  testrecipe_rules_free(r.rules, nrules);
  free(r.rules);
  free(r.reference.bits);
  int errors = diag_errors(d);
  diag_free(d);
  return rc == 0 && errors == 0 ? 0 : 1;
}
