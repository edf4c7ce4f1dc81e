/* run.c — `cairn run`: the simulated optimization run of a recipe, its
 * terminal report, and the JSON, CSV and SVG outputs. */
#include "config.h"

#include "cmd/cmd.h"

#include "cairn/front.h"
#include "cairn/report.h"
#include "cairn/runner.h"
#include "cairn/util.h"

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

int cmd_run(const cmd_env *env, int argc, char **argv) {
  const char *file = NULL, *json = NULL, *plot = NULL;
  int no_plot = 0, per_point = 0, no_time = 0;
  for (int i = 1; i < argc; i++) {
    const char *a = argv[i];
    if (strcmp(a, "--json") == 0 || strcmp(a, "--plot") == 0) {
      if (i + 1 >= argc) return cmd_usage_error("run", "%s needs a file name", a);
      if (a[2] == 'j') json = argv[++i];
      else plot = argv[++i];
    } else if (strcmp(a, "--no-plot") == 0) {
      no_plot = 1;
    } else if (strcmp(a, "--points") == 0) {
      per_point = 1;
    } else if (strcmp(a, "--no-time") == 0) {
      no_time = 1;
    } else if (a[0] == '-' && a[1]) {
      return cmd_usage_error("run", "unknown option `%s`", a);
    } else if (file) {
      return cmd_usage_error("run", "one recipe at a time (got `%s` and `%s`)", file, a);
    } else {
      file = a;
    }
  }
  if (!file) return cmd_usage_error("run", "which recipe?");

  diag_ctx *d = diag_new(stderr, env->color);
  diag_set_werror(d, env->werror);
  ir_recipe *r = front_load(d, file);
  if (!r) {
    int st = diag_errors(d) ? 1 : 2;
    diag_free(d);
    return st;
  }
  run_options o = {isatty(fileno(stderr)), r->npoints};
  rep_run rep;
  int status = run_recipe(r, d, &o, &rep);
  unsigned flags = (no_time ? REP_NO_TIME : 0) | (per_point ? REP_TEXT_POINTS : 0);
  rep_text(stdout, &rep, flags);
  fflush(stdout);
  if (json && rep_write_json(&rep, json, flags & REP_NO_TIME) != 0) {
    fprintf(stderr, "cairn run: cannot write `%s`: %s\n", json, strerror(errno));
    status = 2;
  }
  /* The table and figure go beside the JSON, or where --plot says; a run
   * with neither writes no files. */
  if (!no_plot && (json || plot)) {
    rep_paths p;
    rep_paths_derive(file, json, plot, &p);
    const char *bad = NULL;
    if (rep_write_outputs(&rep, &p, flags & REP_NO_TIME, &bad) != 0) {
      fprintf(stderr, "cairn run: cannot write `%s`: %s\n", bad ? bad : "?", strerror(errno));
      status = 2;
    }
    rep_paths_free(&p);
  }
  rep_run_free(&rep);
  ir_recipe_free(r);
  diag_free(d);
  return status;
}
