/* diff.c — `cairn diff [--json] [--no-lower] [--point K] A B`: what differs in
 * meaning between two recipes, and, when they differ, between their lowered
 * forms (generators added, removed, reordered; CNOT count and depth).  Exit 0
 * when they mean the same, 1 when they differ, 2 when one cannot be read or
 * has errors (then there is nothing to compare). */
#include "config.h"

#include "cmd/cmd.h"
#include "cairn/front.h"
#include "cairn/gates.h"
#include "cairn/ir.h"
#include "cairn/json.h"
#include "cairn/runner.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int cmd_diff(const cmd_env *env, int argc, char **argv) {
  int json = 0, lower = 1, point = 0;
  const char *path[2] = {NULL, NULL};
  int n = 0;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--json") == 0) json = 1;
    else if (strcmp(argv[i], "--no-lower") == 0) lower = 0;
    else if (strcmp(argv[i], "--point") == 0) {
      char *end;
      if (i + 1 >= argc || (point = (int)strtol(argv[i + 1], &end, 10), *end) || point < 1)
        return cmd_usage_error("diff", "--point takes a scan point number from 1");
      point--;
      i++;
    }
    else if (argv[i][0] == '-' && argv[i][1]) return cmd_usage_error("diff", "unknown option `%s`", argv[i]);
    else if (n < 2) path[n++] = argv[i];
    else return cmd_usage_error("diff", "give exactly two recipes");
  }
  if (n != 2) return cmd_usage_error("diff", "give exactly two recipes");
  diag_ctx *d = diag_new(stderr, env->color);
  diag_set_werror(d, env->werror);
  ir_recipe *r[2] = {NULL, NULL};
  for (int k = 0; k < 2; k++) r[k] = front_load(d, path[k]);
  int status;
  if (!r[0] || !r[1]) {
    fprintf(stderr, "cairn diff: nothing compared: %s has errors\n", !r[0] ? path[0] : path[1]);
    status = 2;
  } else {
    front_changes c = {0};
    front_diff(r[0], r[1], &c);
    /* The lowered forms, only when the meanings differ (equal meaning gives an
     * equal program); a recipe that cannot be lowered is said, not fatal. */
    ans_circuit prog[2];
    int lowered = 0;
    gate_diff gd;
    if (lower && c.n) {
      lowered = 1;
      for (int k = 0; k < 2; k++) {
        int np = r[k]->npoints > 0 ? r[k]->npoints : 1;
        if (point >= np || run_circuit(r[k], point, d, &prog[k]) != 0) {
          fprintf(stderr, "cairn diff: %s: no lowered form to compare%s\n", path[k],
                  point >= np ? " (no such scan point)" : "");
          if (k == 1) ans_circuit_free(&prog[0]);
          lowered = 0;
          break;
        }
      }
      if (lowered) {
        gate_opts go;
        gate_opts_default(&go);
        gate_diff_programs(&prog[0], &prog[1], &go, &gd);
      }
    }
    if (json) {
      char *meaning = front_changes_json(&c, path[0], path[1]);
      if (lowered) {
        cJSON *j = cJSON_Parse(meaning);
        cJSON_AddItemToObject(j, "lowered", gate_diff_json(&gd, &prog[0], &prog[1]));
        char *t = json_print(j);
        printf("%s\n", t);
        free(t);
        cJSON_Delete(j);
      } else {
        printf("%s\n", meaning);
      }
      free(meaning);
    } else {
      front_changes_print(&c, stdout);
      if (lowered) {
        printf("lowered forms (scan point %d, default lowering):\n", point + 1);
        if (!gate_diff_print(stdout, &gd, &prog[0], &prog[1]))
          printf("gates: the same generators in the same order, the same counts\n");
      }
    }
    status = c.n ? 1 : 0;
    if (lowered) {
      gate_diff_free(&gd);
      ans_circuit_free(&prog[0]);
      ans_circuit_free(&prog[1]);
    }
    front_changes_free(&c);
  }
  ir_recipe_free(r[0]);
  ir_recipe_free(r[1]);
  diag_free(d);
  return status;
}
