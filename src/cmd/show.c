/* show.c — `cairn show [--json] FILE`: the generator table of the recipe
 * (ans_show).  `--hamiltonian` is not built yet. */
#include "config.h"

#include "cmd/cmd.h"
#include "cairn/front.h"
#include "cairn/pool.h"

#include <stdio.h>
#include <string.h>

int cmd_show(const cmd_env *env, int argc, char **argv) {
  int json = 0;
  const char *path = NULL;
  for (int i = 1; i < argc; i++) {
    if (!strcmp(argv[i], "--json")) json = 1;
    else if (!strcmp(argv[i], "--hamiltonian")) return cmd_usage_error("show", "--hamiltonian is not built yet");
    else if (argv[i][0] == '-' && argv[i][1]) return cmd_usage_error("show", "unknown option `%s`", argv[i]);
    else if (path) return cmd_usage_error("show", "one recipe at a time");
    else path = argv[i];
  }
  if (!path) return cmd_usage_error("show", "no recipe given");
  diag_ctx *d = diag_new(stderr, env->color);
  diag_set_werror(d, env->werror);
  ir_recipe *r = front_load(d, path);
  int status = 1;
  if (r && ans_show(r, d, stdout, json) == 0 && diag_errors(d) == 0) status = 0;
  ir_recipe_free(r);
  diag_free(d);
  return status;
}
