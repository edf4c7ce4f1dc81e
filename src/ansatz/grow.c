/* grow.c — adaptive growth (`grow to N until tol`; ADAPT-VQE, Grimsley et al.,
 * Nat. Commun. 10, 3007 (2019)): at the current optimized state, the gradient
 * of every pool generator; append the largest |gradient| (ties: pool order),
 * re-optimize every parameter from the previous optimum (the new one from 0),
 * repeat until N generators or the largest |gradient| is under tol.
 *
 * Gradients at a state |psi> (no product-state closed form here): with
 * lambda = O|psi> (one application of the objective),
 *     dE/dtheta = (i/2)<psi|[G, O]|psi> = -Im <G psi|O psi> = -Im sum_k m_k <psi|P_k|lambda>,
 * one pass over the vector per word of the pool. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/sim.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

void ans_grow_result_free(ans_grow_result *g) {
  free(g->step);
  free(g->theta);
  memset(g, 0, sizeof *g);
}

/* Gradients of every pool generator at |psi(theta)> of engine e. */
static int state_gradients(sim_engine *e, const double *theta, const ans_pool *pool, const pauli_sum *obj,
                           double *g, char *err, size_t errlen) {
  const sv_state *psi = sim_prepare(e, theta);
  sv_op *op = sv_op_new(obj, err, errlen);
  if (!op) return -1;
  sv_state lam;
  sv_state_alloc(&lam, psi->n);
  sv_op_apply(op, psi, &lam);
  sv_op_free(op);
  for (size_t k = 0; k < pool->len; k++) {
    const ans_gen *gen = &pool->gen[k];
    double complex s = 0;
    for (size_t t = gen->off; t < gen->off + gen->len; t++) {
      uint64_t x, z;
      sv_word_masks(&pool->words, t, &x, &z);
      s += creal(pool->words.c[t]) * sv_word_inner(psi, x, z, &lam);
    }
    g[k] = -cimag(s);
  }
  sv_state_free(&lam);
  return 0;
}

int ans_grow(ans_plan *pl, const ir_recipe *r, const pauli_sum *objective, ans_grow_result *out, char *err,
             size_t errlen) {
  memset(out, 0, sizeof *out);
  const ans_pool *pool = &pl->pool;
  int maxgen = r->choose.kind == IR_CHOOSE_GROW && r->choose.count > 0 ? r->choose.count : (int)pool->len;
  double tol = r->choose.kind == IR_CHOOSE_GROW ? r->choose.threshold : 0;
  free(pl->order);
  pl->order = xmalloc(((size_t)maxgen + 1) * sizeof *pl->order);
  pl->norder = 0;
  pl->grow = 0;
  double *g = xmalloc((pool->len ? pool->len : 1) * sizeof *g);
  double *theta = NULL;
  int np = 0, rc = 0;
  out->step = xcalloc((size_t)maxgen + 1, sizeof *out->step);
  for (;;) {
    ans_circuit c;
    ans_plan_circuit(pl, r, &c);
    sim_engine *e = sim_engine_new(&c, objective, err, errlen);
    if (!e) {
      ans_circuit_free(&c);
      rc = -1;
      break;
    }
    /* parameters: the previous optimum, then the initial values of new ones */
    double *t0 = xmalloc((c.nparams ? (size_t)c.nparams : 1) * sizeof *t0);
    for (int p = 0; p < c.nparams; p++) t0[p] = p < np ? theta[p] : c.param_init[p];
    sim_opt_options o;
    sim_opt_options_init(&o);
    o.method = r->optimize.method;
    if (r->optimize.tolerance > 0) o.tolerance = r->optimize.tolerance;
    if (r->optimize.iterations > 0) o.max_evals = r->optimize.iterations;
    const double *given[1] = {t0};
    o.given = given;
    o.ngiven = 1;
    sim_opt_result res;
    if (sim_optimize(e, &o, &res, err, errlen) != 0) {
      free(t0);
      sim_engine_free(e);
      ans_circuit_free(&c);
      rc = -1;
      break;
    }
    free(theta);
    np = c.nparams;
    theta = xmalloc((np ? (size_t)np : 1) * sizeof *theta);
    memcpy(theta, res.start[res.best].theta, (size_t)np * sizeof *theta);
    out->energy = res.start[res.best].energy;
    if (out->nsteps > 0) {
      out->step[out->nsteps - 1].energy = out->energy;
      out->step[out->nsteps - 1].evals = res.evals;
    } else {
      out->energy0 = out->energy;
    }
    sim_opt_result_free(&res);
    free(t0);
    int grc = state_gradients(e, theta, pool, objective, g, err, errlen);
    sim_engine_free(e);
    ans_circuit_free(&c);
    if (grc != 0) {
      rc = -1;
      break;
    }
    size_t best = 0;
    long long bk = -1;
    for (size_t k = 0; k < pool->len; k++) {
      long long key = ans_grad_key(g[k]);
      if (key > bk) bk = key, best = k;
    }
    out->max_gradient = pool->len ? fabs(g[best]) : 0;
    if (pool->len == 0 || out->max_gradient < tol) {
      out->converged = 1;
      break;
    }
    if ((int)pl->norder >= maxgen) break;
    pl->order[pl->norder++] = best;
    out->step[out->nsteps].gen = best;
    out->step[out->nsteps].gradient = g[best];
    out->nsteps++;
  }
  free(g);
  out->theta = theta;
  out->nparams = np;
  return rc;
}
