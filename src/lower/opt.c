/* opt.c — the optimizers of a simulated run, through NLopt, with several
 * starts (see sim.h).
 *
 * Determinism: the five methods used here (L-BFGS, SLSQP, BOBYQA, COBYLA,
 * Nelder-Mead) draw no random numbers for fixed inputs; NLopt's generator is
 * still seeded (nlopt_srand) before each start so that no start could depend
 * on the clock.  The engine's reductions are thread-count independent, so a
 * run is bit-identical for a given seed. */
#include "config.h"

#include "cairn/sim.h"
#include "cairn/util.h"

#include <math.h>
#include <nlopt.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void sim_opt_options_init(sim_opt_options *o) {
  memset(o, 0, sizeof *o);
  o->method = IR_OPT_LBFGS;
  o->tolerance = 1e-8;
  o->max_evals = 1000;
  o->ngiven = 1; /* given[0] absent: zeros */
  o->random_range = SIM_RANDOM_RANGE;
  o->initial_step = SIM_INITIAL_STEP;
}

/* ORDER sim_stop */
const char *sim_stop_name(sim_stop s) {
  static const char *const names[] = {"converged", "evaluation limit", "stopped at round-off", "no parameters",
                                      "failed"};
  return (unsigned)s < sizeof names / sizeof names[0] ? names[s] : "?";
}

/* ORDER ir_method */
const char *sim_method_name(ir_method m) {
  static const char *const names[] = {"lbfgs", "slsqp", "bobyqa", "cobyla", "nelder-mead"};
  return (unsigned)m < sizeof names / sizeof names[0] ? names[m] : "?";
}

static nlopt_algorithm method_algorithm(ir_method m) {
  switch (m) {
  case IR_OPT_SLSQP: return NLOPT_LD_SLSQP;
  case IR_OPT_BOBYQA: return NLOPT_LN_BOBYQA;
  case IR_OPT_COBYLA: return NLOPT_LN_COBYLA;
  case IR_OPT_NELDER_MEAD: return NLOPT_LN_NELDERMEAD;
  case IR_OPT_LBFGS:
  default: return NLOPT_LD_LBFGS;
  }
}

static int method_uses_gradient(ir_method m) { return m == IR_OPT_LBFGS || m == IR_OPT_SLSQP; }

/* State of one start, handed to the NLopt objective. */
typedef struct opt_ctx {
  sim_engine *e;
  const sim_opt_options *o;
  sim_start *s;
  int index, nstarts;
  size_t cap;      /* trace capacity */
  double best;
} opt_ctx;

/* NLopt objective: energy (and gradient when NLopt asks for one); records the
 * trace, keeps the best point, reports progress. */
static double objective(unsigned n, const double *x, double *grad, void *data) {
  opt_ctx *c = data;
  double E = grad ? sim_energy_grad(c->e, x, grad) : sim_energy(c->e, x);
  sim_start *s = c->s;
  UTIL_GROW(s->trace, c->cap, (size_t)s->evals + 1);
  s->trace[s->evals++] = E;
  if (s->evals == 1 || E < c->best) {
    c->best = E;
    s->energy = E;
    memcpy(s->theta, x, n * sizeof *x);
  }
  if (c->o->progress) {
    sim_progress p = {c->index, c->nstarts, s->evals, E, c->best};
    c->o->progress(c->o->progress_user, &p);
  }
  return E;
}

static sim_stop stop_of(nlopt_result r) {
  switch (r) {
  case NLOPT_SUCCESS:
  case NLOPT_STOPVAL_REACHED:
  case NLOPT_FTOL_REACHED:
  case NLOPT_XTOL_REACHED: return SIM_STOP_TOLERANCE;
  case NLOPT_MAXEVAL_REACHED:
  case NLOPT_MAXTIME_REACHED: return SIM_STOP_EVALUATIONS;
  case NLOPT_ROUNDOFF_LIMITED: return SIM_STOP_ROUNDOFF;
  default: return SIM_STOP_FAILED;
  }
}

/* The starting point of start k: a given vector (NULL: the initial values)
 * or the initial values plus a seeded random offset.  Random start r (0-based
 * among the random ones) draws from its own generator, seeded from (seed, r). */
static void start_point(const sim_opt_options *o, const double *initial, int k, int np, double *x, char **label) {
  if (k < o->ngiven) {
    const double *g = o->given ? o->given[k] : NULL;
    for (int p = 0; p < np; p++) x[p] = g ? g[p] : initial[p];
    const char *l = o->given_label && o->given_label[k] ? o->given_label[k] : (g ? "given" : "zeros");
    *label = xstrdup(l);
    return;
  }
  int r = k - o->ngiven;
  double range = o->random_range > 0 ? o->random_range : SIM_RANDOM_RANGE;
  util_rng rng;
  util_rng_seed(&rng, o->seed ^ ((uint64_t)(r + 1) * 0x9E3779B97F4A7C15ull));
  for (int p = 0; p < np; p++) x[p] = initial[p] + range * (2.0 * util_rng_uniform(&rng) - 1.0);
  *label = xasprintf("random %d", r + 1);
}

/* One start: NLopt from theta0 until the tolerance or the evaluation limit. */
static int run_start(sim_engine *e, const sim_opt_options *o, int k, int nstarts, sim_start *s, char *err,
                     size_t errlen) {
  int np = sim_engine_params(e);
  double t0 = util_now();
  s->theta0 = xcalloc(np ? (size_t)np : 1, sizeof *s->theta0);
  s->theta = xcalloc(np ? (size_t)np : 1, sizeof *s->theta);
  start_point(o, sim_engine_initial(e), k, np, s->theta0, &s->label);
  memcpy(s->theta, s->theta0, (size_t)np * sizeof *s->theta);
  if (np == 0) {
    s->trace = xmalloc(sizeof *s->trace);
    s->energy = s->trace[0] = sim_energy(e, s->theta);
    s->evals = 1;
    s->stop = SIM_STOP_NO_PARAMS;
    s->converged = 1;
    s->seconds = util_now() - t0;
    return 0;
  }
  nlopt_opt opt = nlopt_create(method_algorithm(o->method), (unsigned)np);
  if (!opt) {
    snprintf(err, errlen, "NLopt could not set up %s for %d parameters", sim_method_name(o->method), np);
    return -1;
  }
  opt_ctx ctx = {e, o, s, k, nstarts, 0, 0};
  double tol = o->tolerance > 0 ? o->tolerance : 1e-8;
  int maxev = o->max_evals > 0 ? o->max_evals : 1000;
  nlopt_srand(o->seed);
  nlopt_set_min_objective(opt, objective, &ctx);
  nlopt_set_ftol_abs(opt, tol);
  nlopt_set_maxeval(opt, maxev);
  if (!method_uses_gradient(o->method)) {
    double step = o->initial_step > 0 ? o->initial_step : SIM_INITIAL_STEP;
    nlopt_set_initial_step1(opt, step);
  }
  double *x = xmalloc((size_t)np * sizeof *x), f = 0;
  memcpy(x, s->theta0, (size_t)np * sizeof *x);
  nlopt_result r = nlopt_optimize(opt, x, &f);
  nlopt_destroy(opt);
  free(x);
  s->nlopt_code = (int)r;
  s->stop = stop_of(r);
  s->converged = s->stop == SIM_STOP_TOLERANCE || s->stop == SIM_STOP_ROUNDOFF;
  s->seconds = util_now() - t0;
  if (s->evals == 0) {
    snprintf(err, errlen, "NLopt's %s stopped before evaluating the objective (%s)", sim_method_name(o->method),
             nlopt_result_to_string(r));
    return -1;
  }
  return 0;
}

static int cmp_double(const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return x < y ? -1 : x > y;
}

int sim_optimize(sim_engine *e, const sim_opt_options *o, sim_opt_result *out, char *err, size_t errlen) {
  memset(out, 0, sizeof *out);
  if (o->ngiven < 0 || o->nrandom < 0 || o->ngiven + o->nrandom < 1) {
    snprintf(err, errlen, "an optimization needs at least one start");
    return -1;
  }
  if ((unsigned)o->method > IR_OPT_NELDER_MEAD) {
    snprintf(err, errlen, "unknown optimization method %d", (int)o->method);
    return -1;
  }
  double t0 = util_now();
  int ns = o->ngiven + o->nrandom;
  out->nparams = sim_engine_params(e);
  out->start = xcalloc((size_t)ns, sizeof *out->start);
  out->nstarts = ns;
  for (int k = 0; k < ns; k++) {
    if (run_start(e, o, k, ns, &out->start[k], err, errlen) != 0) {
      sim_opt_result_free(out);
      return -1;
    }
    out->evals += out->start[k].evals;
  }
  double *en = xmalloc((size_t)ns * sizeof *en);
  out->best = 0;
  for (int k = 0; k < ns; k++) {
    en[k] = out->start[k].energy;
    if (en[k] < out->start[out->best].energy) out->best = k;
  }
  qsort(en, (size_t)ns, sizeof *en, cmp_double);
  out->e_min = en[0];
  out->e_max = en[ns - 1];
  out->e_median = ns % 2 ? en[ns / 2] : 0.5 * (en[ns / 2 - 1] + en[ns / 2]);
  free(en);
  sim_prepare(e, out->start[out->best].theta);
  out->seconds = util_now() - t0;
  return 0;
}

void sim_opt_result_free(sim_opt_result *r) {
  for (int k = 0; k < r->nstarts; k++) {
    free(r->start[k].label);
    free(r->start[k].theta0);
    free(r->start[k].theta);
    free(r->start[k].trace);
  }
  free(r->start);
  memset(r, 0, sizeof *r);
}
