/* runner.c — a recipe's simulated optimization run, point by point.
 *
 * For each scan point: the pipeline to the ansatz's Hamiltonian (pipe.h), the
 * classical references (MP2, CCSD, exact in the kept sector), the generators
 * (pool.h: screening, selection, order, or adaptive growth), the objective
 * (Hamiltonian plus symmetry penalties), the statevector optimization from
 * several starts (sim.h), the symmetry values and checks of the final state,
 * and the gate counts of its circuit (gates.h). */
#include "config.h"

#include "cairn/runner.h"

#include "cairn/ansatz.h"
#include "cairn/chem.h"
#include "cairn/gates.h"
#include "cairn/pipe.h"
#include "cairn/pool.h"
#include "cairn/sim.h"
#include "cairn/sv.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

void run_carry_free(run_carry *c) {
  free(c->theta);
  free(c->signature);
  memset(c, 0, sizeof *c);
}

/* The value a kept symmetry must have: N = active electrons, S_z = (na-nb)/2,
 * S^2 = S(S+1) with 2S+1 the multiplicity. */
static double sym_target(const ir_recipe *r, ir_symmetry s) {
  const ir_orbitals *o = &r->orbitals;
  switch (s) {
  case IR_SYM_PARTICLES: return (double)(o->nalpha + o->nbeta);
  case IR_SYM_SPIN_Z: return 0.5 * (o->nalpha - o->nbeta);
  default: {
    double S = 0.5 * (r->multiplicity - 1);
    return S * (S + 1);
  }
  }
}

/* Identify a program by the texts of its generators, for warm starts. */
static char *program_signature(const ans_circuit *c) {
  util_buf b = {0};
  util_buf_printf(&b, "%d|%d|", c->nqubits, c->nparams);
  for (int g = 0; g < c->ngens; g++) util_buf_printf(&b, "%s;", c->gens[g].text);
  if (!b.s) b.s = xstrdup("");
  return b.s;
}

typedef struct progress_ctx {
  int point, npoints;
  double t0;
  double last;
} progress_ctx;

static void progress_line(void *user, const sim_progress *p) {
  progress_ctx *pc = user;
  double now = util_now();
  if (now - pc->last < 0.2) return;
  pc->last = now;
  fprintf(stderr, "\r  point %d/%d  start %d/%d  evaluation %ld  E = %.10f  (%.0f s)   ", pc->point + 1,
          pc->npoints, p->start + 1, p->nstarts, p->evaluation, p->best, now - pc->t0);
  fflush(stderr);
}

/* The first start's vector: zeros, or MP2 amplitudes for doubles (`guess
 * mp2`); reference angles always start at the optimized mean field. */
static void first_start(const ir_recipe *r, const ans_circuit *c, const chem_space *cs, double *theta) {
  for (int p = 0; p < c->nparams; p++) {
    theta[p] = c->param_init ? c->param_init[p] : 0.0;
    int g = c->param_gen[p];
    if (g < 0 || r->optimize.guess != IR_GUESS_MP2) continue;
    const ans_gen_info *gi = &c->gens[g];
    if ((gi->kind == ANS_DOUBLE || gi->kind == ANS_EXCITE) && gi->nexc == 2)
      theta[p] = chem_mp2_amplitude(cs, gi->from[0], gi->from[1], gi->to[0], gi->to[1]);
  }
}

/* Seeded random start k: amplitudes uniform in [-range, range], reference
 * angles perturbed by the same amount around the mean field; the stream of
 * start k depends only on (seed, k). */
static void random_start(const ans_circuit *c, uint64_t seed, int k, double *theta) {
  util_rng rng;
  util_rng_seed(&rng, seed * 0x9e3779b97f4a7c15ULL + (uint64_t)k + 1);
  for (int p = 0; p < c->nparams; p++) {
    double base = c->param_init ? c->param_init[p] : 0.0;
    theta[p] = base + SIM_RANDOM_RANGE * (2.0 * util_rng_uniform(&rng) - 1.0);
  }
}

/* Everything one optimization needs and gives back. */
typedef struct opt_job {
  const ir_recipe *r;
  const chem_space *cs;
  const pauli_sum *objective;
  const double *warm;      /* previous parameters, or NULL */
  const run_options *o;
  progress_ctx *pc;
  sim_engine *e;           /* out: the engine, at the best state */
  sim_opt_result res;      /* out */
} opt_job;

/* Build the engine for c and run the recipe's starts.  Returns 0, or -1 with
 * a message in err. */
static int optimize_program(opt_job *j, const ans_circuit *c, char *err, size_t errlen) {
  j->e = sim_engine_new(c, j->objective, err, errlen);
  if (!j->e) return -1;
  const ir_optimize *op = &j->r->optimize;
  int nstarts = op->starts > 0 ? op->starts : 1;
  int np = c->nparams;
  double **vec = xcalloc((size_t)nstarts + 1, sizeof *vec);
  char **label = xcalloc((size_t)nstarts + 1, sizeof *label);
  int ng = 0;
  /* With one start and a warm vector, the warm vector is the start; with
   * more, the recipe's guess comes first, then warm, then random ones. */
  if (j->warm && nstarts == 1) {
    vec[ng] = xmalloc((size_t)(np ? np : 1) * sizeof(double));
    memcpy(vec[ng], j->warm, (size_t)np * sizeof(double));
    label[ng++] = xstrdup("warm");
  } else {
    vec[ng] = xmalloc((size_t)(np ? np : 1) * sizeof(double));
    first_start(j->r, c, j->cs, vec[ng]);
    label[ng++] = xstrdup(op->guess == IR_GUESS_MP2 ? "mp2" : "zeros");
    if (j->warm && ng < nstarts) {
      vec[ng] = xmalloc((size_t)(np ? np : 1) * sizeof(double));
      memcpy(vec[ng], j->warm, (size_t)np * sizeof(double));
      label[ng++] = xstrdup("warm");
    }
  }
  for (int k = 0; ng < nstarts; k++) {
    vec[ng] = xmalloc((size_t)(np ? np : 1) * sizeof(double));
    random_start(c, op->seed, k, vec[ng]);
    label[ng++] = xasprintf("random %d", k + 1);
  }
  sim_opt_options so;
  sim_opt_options_init(&so);
  so.method = op->method;
  so.tolerance = op->tolerance;
  so.max_evals = op->iterations;
  so.given = (const double *const *)vec;
  so.given_label = (const char *const *)label;
  so.ngiven = ng;
  so.nrandom = 0;
  so.seed = op->seed;
  if (j->o->progress) {
    so.progress = progress_line;
    so.progress_user = j->pc;
  }
  int rc = sim_optimize(j->e, &so, &j->res, err, errlen);
  for (int k = 0; k < ng; k++) {
    free(vec[k]);
    free(label[k]);
  }
  free(vec);
  free(label);
  if (rc != 0) {
    sim_engine_free(j->e);
    j->e = NULL;
  }
  return rc;
}

/* objective = H + mu (X - x0)^2 for every `keep X penalty mu`. */
static void build_objective(const pipe_point *pp, const ir_recipe *r, pauli_sum *objective) {
  pauli_sum_init(objective, pp->nqubits);
  pauli_sum_copy(objective, &pp->ham);
  for (int s = 0; s < IR_SYM_COUNT; s++)
    if (r->keep[s].policy == IR_KEEP_PENALTY)
      sim_add_penalty(objective, &pp->sym[s], sym_target(r, (ir_symmetry)s), r->keep[s].value);
}

int run_circuit(const ir_recipe *r, int k, diag_ctx *d, ans_circuit *c) {
  memset(c, 0, sizeof *c);
  pipe_point pp;
  if (pipe_point_build(r, k, d, &pp) != 0) return -1;
  ans_problem prob;
  ans_problem_from_point(&prob, r, &pp);
  ans_plan plan;
  int rc = ans_plan_build(&plan, r, &prob, d);
  if (rc == 0 && plan.grow) {
    pauli_sum objective;
    build_objective(&pp, r, &objective);
    ans_grow_result gr;
    char err[512];
    if (ans_grow(&plan, r, &objective, &gr, err, sizeof err) != 0) {
      diag_report(d, DIAG_ERROR, r->choose.span, "%s", err);
      rc = -1;
    }
    ans_grow_result_free(&gr);
    pauli_sum_free(&objective);
  }
  if (rc == 0) ans_plan_circuit(&plan, r, c);
  ans_plan_free(&plan);
  pipe_point_free(&pp);
  return rc;
}

static void fill_energies(rep_point *out, const chem_refs *refs, const chem_space *cs) {
  out->e.has_nuclear = cs->has_nuclear; /* FCIDUMP files do not carry it */
  out->e.nuclear = cs->e_nuclear;
  if (refs->has_hf) {
    out->e.has_hf = 1;
    out->e.hf = refs->hf;
  }
  if (refs->has_mp2) {
    out->e.has_mp2 = 1;
    out->e.mp2 = refs->mp2;
  }
  if (refs->has_ccsd) {
    out->e.has_ccsd = 1;
    out->e.ccsd = refs->ccsd;
    out->e.ccsd_converged = refs->ccsd_converged;
  }
  if (refs->has_exact) {
    out->e.has_exact = 1;
    out->e.exact = refs->exact;
    out->exact_s2 = refs->exact_s2;
  }
}

static char *failure_text(const char *stage, const diag_ctx *d, const char *err) {
  const char *why = err && *err ? err : diag_last_error(d);
  return xasprintf("%s: %s", stage, *why ? why : "failed (see the messages above)");
}

int run_point(const ir_recipe *r, int k, diag_ctx *d, const run_options *o, run_carry *carry,
              rep_point *out) {
  memset(out, 0, sizeof *out);
  double t0 = util_now();
  char err[512] = "";
  if (r->scan.active && k < r->npoints) {
    out->has_param = 1;
    out->param = r->points[k].param;
  }
  out->orbitals = r->orbitals.nactive;
  out->electrons = r->orbitals.nelec_active;

  pipe_point pp;
  if (pipe_point_build(r, k, d, &pp) != 0) {
    out->failure = failure_text("active space", d, NULL);
    out->seconds = util_now() - t0;
    return -1;
  }
  out->qubits = pp.nqubits;
  fill_energies(out, &pp.refs, pp.cs);

  /* Refuse a register the machine cannot hold now, before the references
   * (which can take long for a large active space) and before allocating. */
  if (r->nrules > 0 || r->reference.kind == IR_REF_MEAN_FIELD) {
    char merr[256];
    uint64_t need = sim_engine_bytes(pp.nqubits, pp.ham.len);
    uint64_t vec = sv_vector_bytes(pp.nqubits);
    if (sv_mem_check(pp.nqubits, SIM_VECTORS, need > SIM_VECTORS * vec ? need - SIM_VECTORS * vec : 0, merr,
                     sizeof merr) != 0) {
      diag_report(d, DIAG_ERROR, r->orbitals.active_span.file >= 0 ? r->orbitals.active_span : r->pool_span,
                  "%s", merr);
      diag_help(d, "choose a smaller active space (`active N electrons in M orbitals`), or taper");
      out->failure = failure_text("statevector", d, merr);
      pipe_point_free(&pp);
      out->seconds = util_now() - t0;
      return -1;
    }
  }

  /* Classical references in the sector the recipe keeps. */
  chem_mp2(&pp.space, d, &pp.refs);
  chem_ccsd(&pp.space, d, &pp.refs);
  chem_target tgt = {r->orbitals.nalpha - r->orbitals.nbeta,
                     r->keep[IR_SYM_SPIN_SQUARED].policy != IR_KEEP_NONE ? r->multiplicity : 0};
  if (chem_exact(&pp.space, tgt, d, &pp.refs) != 0) {
    out->failure = failure_text("exact energy", d, NULL);
    fill_energies(out, &pp.refs, &pp.space);
    pipe_point_free(&pp);
    out->seconds = util_now() - t0;
    return -1;
  }
  fill_energies(out, &pp.refs, &pp.space);

  ans_problem prob;
  ans_plan plan;
  ans_problem_from_point(&prob, r, &pp);
  if (ans_plan_build(&plan, r, &prob, d) != 0) {
    out->failure = failure_text("generators", d, NULL);
    ans_plan_free(&plan); /* the plan is freed even when it failed */
    pipe_point_free(&pp);
    out->seconds = util_now() - t0;
    return -1;
  }

  pauli_sum objective;
  build_objective(&pp, r, &objective);

  progress_ctx pc = {k, o->npoints, t0, 0};
  opt_job job = {r, &pp.space, &objective, NULL, o, &pc, NULL, {0}};
  ans_circuit c;
  memset(&c, 0, sizeof c);
  int rc = 0;
  double *chosen = NULL; /* grow: the gradient each step chose its generator at */
  int nchosen = 0;
  if (plan.grow) {
    /* ADAPT-style growth picks the generators (pool.h); the grown program is
     * then optimized from its optimum with the recipe's starts. */
    ans_grow_result gr;
    rc = ans_grow(&plan, r, &objective, &gr, err, sizeof err);
    if (rc == 0) {
      nchosen = gr.nsteps;
      chosen = xmalloc((size_t)(nchosen ? nchosen : 1) * sizeof *chosen);
      for (int i = 0; i < nchosen; i++) chosen[i] = gr.step[i].gradient;
      ans_plan_circuit(&plan, r, &c);
      job.warm = gr.theta;
      rc = optimize_program(&job, &c, err, sizeof err);
      job.warm = NULL;
    }
    ans_grow_result_free(&gr);
  } else {
    ans_plan_circuit(&plan, r, &c);
    char *sig = program_signature(&c);
    if (carry->signature && strcmp(sig, carry->signature) == 0 && carry->nparams == c.nparams)
      job.warm = carry->theta;
    free(sig);
    rc = optimize_program(&job, &c, err, sizeof err);
  }
  if (o->progress) fprintf(stderr, "\r%*s\r", 78, "");
  int ret = -1;
  if (rc != 0) {
    diag_report(d, DIAG_ERROR, r->optimize.span, "%s", err);
    out->failure = failure_text("optimization", d, err);
    goto done;
  }

  const sim_opt_result *res = &job.res;
  const sim_start *best = &res->start[res->best];
  sim_prepare(job.e, best->theta);
  sv_op *ops[IR_SYM_COUNT + 1];
  double vals[IR_SYM_COUNT + 1];
  for (int s = 0; s <= IR_SYM_COUNT; s++) {
    const pauli_sum *sum = s < IR_SYM_COUNT ? &pp.sym[s] : &pp.ham;
    ops[s] = sim_observable(job.e, sum, err, sizeof err);
    vals[s] = ops[s] ? sim_expect(job.e, ops[s]) : NAN;
    sv_op_free(ops[s]);
  }
  out->e.has_ansatz = 1;
  out->e.ansatz = vals[IR_SYM_COUNT];
  if (out->e.has_exact) {
    out->has_error = 1;
    out->error = out->e.ansatz - out->e.exact;
  }
  out->sym.has = 1;
  out->sym.particles = vals[IR_SYM_PARTICLES];
  out->sym.spin_z = vals[IR_SYM_SPIN_Z];
  out->sym.spin_squared = vals[IR_SYM_SPIN_SQUARED];

  /* Below the exact energy of the sector means the state left it: say so,
   * with the symmetries that moved. */
  if (out->has_error && out->error < -1e-8) {
    util_buf why = {0};
    for (int s = 0; s < IR_SYM_COUNT; s++) {
      double t = sym_target(r, (ir_symmetry)s);
      if (fabs(vals[s] - t) > 1e-6)
        util_buf_printf(&why, "%s<%s> = %.6g (not %.6g)", why.len ? ", " : "", ir_symmetry_name((ir_symmetry)s),
                        vals[s], t);
    }
    diag_report(d, DIAG_WARNING, r->pool_span,
                "point %d: the ansatz energy is %.4g mEh below the exact energy, which is computed for %d "
                "electrons with S_z = %g; the state has left that sector%s%s",
                k + 1, -1e3 * out->error, r->orbitals.nalpha + r->orbitals.nbeta,
                sym_target(r, IR_SYM_SPIN_Z), why.len ? ": " : "", why.len ? why.s : "");
    diag_help(d, "hold the state in the sector with `keep particles penalty MU` (or spin-z / spin-squared)");
    util_buf_free(&why);
  }

  /* `keep X checked tol`: verify the final state. */
  int failed = 0;
  for (int s = 0; s < IR_SYM_COUNT; s++) {
    if (r->keep[s].policy != IR_KEEP_CHECKED) continue;
    out->checks = xrealloc(out->checks, (size_t)(out->nchecks + 1) * sizeof *out->checks);
    rep_check *ck = &out->checks[out->nchecks++];
    ck->symmetry = xstrdup(ir_symmetry_name((ir_symmetry)s));
    ck->value = vals[s];
    ck->target = sym_target(r, (ir_symmetry)s);
    ck->tolerance = r->keep[s].value;
    ck->passed = fabs(ck->value - ck->target) <= ck->tolerance;
    if (!ck->passed) {
      failed = 1;
      diag_report(d, DIAG_ERROR, r->keep[s].span,
                  "point %d: the optimized state has <%s> = %.10g, %.3g away from %.10g (tolerance %.3g)",
                  k + 1, ck->symmetry, ck->value, fabs(ck->value - ck->target), ck->target, ck->tolerance);
    }
  }

  /* Generators with their final amplitudes, in program order. */
  out->ngens = c.ngens;
  out->gens = xcalloc((size_t)(c.ngens ? c.ngens : 1), sizeof *out->gens);
  for (int p = 0; p < c.nparams; p++) {
    int g = c.param_gen[p];
    if (g < 0) continue;
    rep_generator *rg = &out->gens[g];
    size_t pi = plan.order[g];
    rg->kind = xstrdup(ans_kind_name(c.gens[g].kind));
    rg->text = xstrdup(c.gens[g].text);
    rg->gradient = plan.pool.gen[pi].gradient;
    if (g < nchosen) rg->has_chosen = 1, rg->chosen = chosen[g]; /* grow adds generator g at step g */
    rg->theta = best->theta[p];
    rg->cnot = (int)gate_plain_cx(&c, g);
    rg->line = c.gens[g].line;
  }
  out->nparams = c.nparams;
  out->params = xmalloc((size_t)(c.nparams ? c.nparams : 1) * sizeof *out->params);
  memcpy(out->params, best->theta, (size_t)c.nparams * sizeof *out->params);

  gate_opts go;
  gate_opts_default(&go);
  gate_counts gc;
  gate_count_circuit(&c, &go, &gc);
  out->has_gates = 1;
  out->cnot = gc.cx;
  out->single = gc.single;
  out->depth = gc.depth;
  gate_counts_free(&gc);

  out->has_optimizer = 1;
  out->method = xstrdup(sim_method_name(r->optimize.method));
  out->iterations = (int)best->evals;
  out->converged = best->converged;
  out->nstarts = res->nstarts;
  out->best_start = res->best;
  out->start_energies = xmalloc((size_t)res->nstarts * sizeof(double));
  for (int s = 0; s < res->nstarts; s++) out->start_energies[s] = res->start[s].energy;
  out->ntrace = (int)best->evals;
  out->trace = xmalloc((size_t)(best->evals ? best->evals : 1) * sizeof(double));
  memcpy(out->trace, best->trace, (size_t)best->evals * sizeof(double));

  /* Hand the parameters to the next point. */
  run_carry_free(carry);
  carry->nparams = c.nparams;
  carry->theta = xmalloc((size_t)(c.nparams ? c.nparams : 1) * sizeof(double));
  memcpy(carry->theta, best->theta, (size_t)c.nparams * sizeof(double));
  carry->signature = program_signature(&c);

  sim_opt_result_free(&job.res);
  ret = failed ? 1 : 0;
done: /* one exit: what the point built, freed in reverse */
  if (job.e) sim_engine_free(job.e);
  free(chosen);
  ans_circuit_free(&c);
  pauli_sum_free(&objective);
  ans_plan_free(&plan);
  pipe_point_free(&pp);
  out->seconds = util_now() - t0;
  return ret;
}

static char *recipe_name(const char *path) {
  const char *base = strrchr(path, '/');
  base = base ? base + 1 : path;
  size_t n = strlen(base);
  if (n > 6 && strcmp(base + n - 6, ".cairn") == 0) n -= 6;
  return xstrndup(base, n);
}

int run_recipe(const ir_recipe *r, diag_ctx *d, const run_options *o, rep_run *rep) {
  memset(rep, 0, sizeof *rep);
  rep->recipe = recipe_name(r->path);
  rep->file = xstrdup(r->path);
  if (r->scan.active) {
    rep->param_name = xstrdup(r->scan.name);
    rep->param_unit = xstrdup(ir_unit_name(r->scan.unit));
  }
  if (r->basis_name) rep->basis = xstrdup(r->basis_name);
  else if (r->basis_file) rep->basis = xstrdup(r->basis_file);
  /* An FCIDUMP recipe has no geometries but is one point. */
  int npoints = r->npoints > 0 ? r->npoints : 1;
  rep->npoints = npoints;
  rep->points = xcalloc((size_t)npoints, sizeof *rep->points);
  run_carry carry = {0};
  int status = 0;
  run_options oo = *o;
  oo.npoints = npoints;
  for (int k = 0; k < npoints; k++) {
    int rc = run_point(r, k, d, &oo, &carry, &rep->points[k]);
    if (rc != 0) status = 1;
    if (rc < 0) run_carry_free(&carry); /* a failed point breaks the warm chain */
  }
  run_carry_free(&carry);
  return status;
}
