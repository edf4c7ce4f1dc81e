/* diff.c — `cairn diff [--json] A B`: what differs in meaning between two
 * recipes.  Exit 0 when they mean the same, 1 when they differ, 2 when one
 * cannot be read or has errors (then there is nothing to compare). */
#include "config.h"

#include "cmd/cmd.h"
#include "cairn/front.h"
#include "cairn/ir.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int cmd_diff(const cmd_env *env, int argc, char **argv) {
  int json = 0;
  const char *path[2] = {NULL, NULL};
  int n = 0;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--json") == 0) json = 1;
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
    if (json) {
      char *s = front_changes_json(&c, path[0], path[1]);
      printf("%s\n", s);
      free(s);
    } else {
      front_changes_print(&c, stdout);
    }
    status = c.n ? 1 : 0;
    front_changes_free(&c);
  }
  ir_recipe_free(r[0]);
  ir_recipe_free(r[1]);
  diag_free(d);
  return status;
}
