/* entry.c — the two calls the commands make: `cairn check` (symmetry typing
 * after front_load) and `cairn show` (the generator table). */
#include "config.h"

#include "ans_priv.h"
#include "cairn/json.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

/* Does checking the recipe need its Hamiltonian? */
static int needs_hamiltonian(const ir_recipe *r) {
  if (r->taper || r->choose.kind == IR_CHOOSE_ABOVE) return 1;
  for (int i = 0; i < r->nrules; i++)
    if (r->rules[i].kind == IR_RULE_ENTANGLERS) return 1;
  return 0;
}

int ans_check(const ir_recipe *r, diag_ctx *d) {
  int need = needs_hamiltonian(r);
  chem_space cs;
  chem_refs refs;
  memset(&cs, 0, sizeof cs);
  memset(&refs, 0, sizeof refs);
  if (need && chem_build_space(r, 0, d, &cs, &refs) != 0) return -1;
  ans_setup s;
  int rc = ans_setup_init(&s, r, need ? &cs : NULL, d);
  if (rc == 0) {
    ans_plan pl;
    rc = ans_plan_build(&pl, r, &s.prob, d);
    ans_plan_free(&pl);
  }
  ans_setup_free(&s);
  if (need) chem_space_free(&cs);
  return rc;
}

int ans_show(const ir_recipe *r, diag_ctx *d, FILE *out, int json) {
  chem_space cs;
  chem_refs refs;
  memset(&cs, 0, sizeof cs);
  memset(&refs, 0, sizeof refs);
  if (chem_build_space(r, 0, d, &cs, &refs) != 0) return -1;
  ans_setup s;
  int rc = ans_setup_init(&s, r, &cs, d);
  ans_plan pl;
  memset(&pl, 0, sizeof pl);
  if (rc == 0) rc = ans_plan_build(&pl, r, &s.prob, d);
  if (rc == 0) {
    ans_plan_type(&pl, &s.prob);
    if (json) {
      cJSON *j = ans_table_json(&pl, r, &s.prob, d);
      char *text = json_print(j);
      fprintf(out, "%s\n", text);
      free(text);
      cJSON_Delete(j);
    } else {
      ans_table_print(&pl, r, &s.prob, d, out);
    }
  }
  ans_plan_free(&pl);
  ans_setup_free(&s);
  chem_space_free(&cs);
  return rc;
}
