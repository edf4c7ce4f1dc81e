/* runner.h — one simulated optimization run of a recipe: every scan point
 * through the pipeline, the classical references, the generators, the
 * statevector optimization and the checks, into a rep_run (report.h).
 *
 * Points are independent except for the warm start (the previous point's
 * parameters when its program has the same generators): run_point is the unit
 * a distributed build would hand out.
 *
 * Ownership: run_carry owns its arrays (run_carry_free); the rep_point that
 * run_point fills belongs to the caller's rep_run.
 */
#ifndef CAIRN_RUNNER_H
#define CAIRN_RUNNER_H

#include "cairn/ansatz.h"
#include "cairn/diag.h"
#include "cairn/ir.h"
#include "cairn/report.h"

typedef struct run_options {
  int progress;      /* print a progress line on stderr (a terminal) */
  int npoints;       /* for the progress line */
} run_options;

/* What one point hands to the next: its final parameters and the texts of
 * its generators, so the next point can start warm when they agree. */
typedef struct run_carry {
  int nparams;
  double *theta;
  char *signature;   /* generator texts joined, identifying the program */
} run_carry;

void run_carry_free(run_carry *c);

/* Run point k of r into out (zeroed here).  Returns 0; 1 when a `checked`
 * symmetry failed (the point is still complete); -1 when the point failed
 * (out->failure says why; diagnostics went through d). */
int run_point(const ir_recipe *r, int k, diag_ctx *d, const run_options *o, run_carry *carry,
              rep_point *out);

/* The rotation program of point k without optimizing it (for `cairn build`
 * and `cairn diff`): pipeline, generators, selection and order.  A `grow`
 * recipe has to simulate to know its generators, and does.  c is
 * initialized here.  Returns 0, or -1 after reporting through d. */
int run_circuit(const ir_recipe *r, int k, diag_ctx *d, ans_circuit *c);

/* Fill the run-level fields of rep (recipe name, file, scan name and unit,
 * basis) and run every point.  Returns 0 when every point ran and every check
 * passed, 1 otherwise. */
int run_recipe(const ir_recipe *r, diag_ctx *d, const run_options *o, rep_run *rep);

#endif
