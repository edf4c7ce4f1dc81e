/* sim_driver.c — a small check driver for the reference tests: reads a JSON
 * problem, runs the statevector engine, prints JSON results on stdout.
 *
 *   sim_driver eval FILE       energy, gradient, final state, observables
 *   sim_driver optimize FILE   every start of the optimizer
 *
 * FILE: { "hamiltonian": <Pauli sum>, "circuit": <rotation program>,
 *         "theta": [...], "observables": [<Pauli sum>, ...],
 *         (circuit may carry "param_init": [...], the initial values)
 *         "optimize": {"method": "lbfgs", "tolerance": t, "max_evals": m,
 *                      "random": k, "seed": s} }
 * (the JSON forms of include/cairn/json.h).  Exit status 0, or 2 with a
 * message on bad input. */
#include "config.h"

#include "cairn/json.h"
#include "cairn/sim.h"
#include "cairn/util.h"

#include <complex.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int fail(const char *what, const char *msg) {
  fprintf(stderr, "sim_driver: %s: %s\n", what, msg);
  return 2;
}

static cJSON *num_array(const double *v, int n) {
  cJSON *a = cJSON_CreateArray();
  for (int k = 0; k < n; k++) cJSON_AddItemToArray(a, json_number(v[k]));
  return a;
}

static int parse_method(const char *s, ir_method *m) {
  for (int k = IR_OPT_LBFGS; k <= IR_OPT_NELDER_MEAD; k++)
    if (strcmp(sim_method_name((ir_method)k), s) == 0) {
      *m = (ir_method)k;
      return 0;
    }
  return -1;
}

static void print_tree(cJSON *o) {
  char *s = json_print(o);
  printf("%s\n", s);
  free(s);
  cJSON_Delete(o);
}

static int do_eval(const cJSON *in, sim_engine *e, int np) {
  double *theta = xcalloc(np ? (size_t)np : 1, sizeof *theta), *grad = xcalloc(np ? (size_t)np : 1, sizeof *grad);
  const cJSON *t = cJSON_GetObjectItemCaseSensitive(in, "theta");
  if (cJSON_GetArraySize(t) != np) return fail("theta", "needs one value per parameter");
  for (int p = 0; p < np; p++) theta[p] = cJSON_GetArrayItem(t, p)->valuedouble;
  double E = sim_energy(e, theta);
  double Eg = sim_energy_grad(e, theta, grad);
  const sv_state *psi = sim_prepare(e, theta);
  cJSON *o = cJSON_CreateObject();
  cJSON_AddItemToObject(o, "energy", json_number(E));
  cJSON_AddItemToObject(o, "energy_from_gradient_pass", json_number(Eg));
  cJSON_AddItemToObject(o, "gradient", num_array(grad, np));
  cJSON_AddNumberToObject(o, "rotations", (double)sim_engine_rotations(e));
  cJSON_AddNumberToObject(o, "steps", (double)sim_engine_steps(e));
  cJSON *st = cJSON_CreateArray();
  for (uint64_t i = 0; i < psi->dim; i++) {
    double pr[2] = {creal(psi->a[i]), cimag(psi->a[i])};
    cJSON_AddItemToArray(st, num_array(pr, 2));
  }
  cJSON_AddItemToObject(o, "state", st);
  cJSON *obs = cJSON_CreateArray(), *ob;
  cJSON_ArrayForEach(ob, cJSON_GetObjectItemCaseSensitive(in, "observables")) {
    pauli_sum s;
    char err[300];
    if (json_read_pauli_sum(ob, &s, err, sizeof err) != 0) return fail("observable", err);
    sv_op *op = sim_observable(e, &s, err, sizeof err);
    if (!op) return fail("observable", err);
    cJSON_AddItemToArray(obs, json_number(sim_expect(e, op)));
    sv_op_free(op);
    pauli_sum_free(&s);
  }
  cJSON_AddItemToObject(o, "observables", obs);
  print_tree(o);
  free(theta);
  free(grad);
  return 0;
}

static int do_optimize(const cJSON *in, sim_engine *e, int np) {
  const cJSON *oj = cJSON_GetObjectItemCaseSensitive(in, "optimize");
  sim_opt_options o;
  sim_opt_options_init(&o);
  const cJSON *v;
  if ((v = cJSON_GetObjectItemCaseSensitive(oj, "method")) && (!cJSON_IsString(v) || parse_method(v->valuestring, &o.method)))
    return fail("optimize", "unknown method");
  if ((v = cJSON_GetObjectItemCaseSensitive(oj, "tolerance"))) o.tolerance = v->valuedouble;
  if ((v = cJSON_GetObjectItemCaseSensitive(oj, "max_evals"))) o.max_evals = v->valueint;
  if ((v = cJSON_GetObjectItemCaseSensitive(oj, "random"))) o.nrandom = v->valueint;
  if ((v = cJSON_GetObjectItemCaseSensitive(oj, "seed"))) o.seed = (uint64_t)v->valuedouble;
  sim_opt_result r;
  char err[300];
  if (sim_optimize(e, &o, &r, err, sizeof err) != 0) return fail("optimize", err);
  cJSON *out = cJSON_CreateObject();
  cJSON *starts = cJSON_CreateArray();
  for (int k = 0; k < r.nstarts; k++) {
    const sim_start *s = &r.start[k];
    cJSON *j = cJSON_CreateObject();
    cJSON_AddStringToObject(j, "label", s->label);
    cJSON_AddItemToObject(j, "energy", json_number(s->energy));
    cJSON_AddItemToObject(j, "theta", num_array(s->theta, np));
    cJSON_AddNumberToObject(j, "evals", (double)s->evals);
    cJSON_AddStringToObject(j, "stop", sim_stop_name(s->stop));
    cJSON_AddBoolToObject(j, "converged", s->converged);
    cJSON_AddItemToArray(starts, j);
  }
  cJSON_AddItemToObject(out, "starts", starts);
  cJSON_AddNumberToObject(out, "best", r.best);
  cJSON_AddItemToObject(out, "min", json_number(r.e_min));
  cJSON_AddItemToObject(out, "max", json_number(r.e_max));
  cJSON_AddItemToObject(out, "median", json_number(r.e_median));
  print_tree(out);
  sim_opt_result_free(&r);
  return 0;
}

int main(int argc, char **argv) {
  if (argc != 3 || (strcmp(argv[1], "eval") != 0 && strcmp(argv[1], "optimize") != 0)) {
    fprintf(stderr, "usage: sim_driver eval|optimize FILE\n");
    return 2;
  }
  size_t len;
  char *text = util_read_file(argv[2], &len);
  if (!text) return fail(argv[2], "cannot read");
  cJSON *in = cJSON_ParseWithLength(text, len);
  free(text);
  if (!in) return fail(argv[2], "not JSON");
  char err[300];
  pauli_sum H;
  ans_circuit c;
  if (json_read_pauli_sum(cJSON_GetObjectItemCaseSensitive(in, "hamiltonian"), &H, err, sizeof err) != 0)
    return fail("hamiltonian", err);
  if (json_read_circuit(cJSON_GetObjectItemCaseSensitive(in, "circuit"), &c, err, sizeof err) != 0)
    return fail("circuit", err);
  /* optional initial parameter values (ans_circuit.param_init) */
  const cJSON *pi = cJSON_GetObjectItemCaseSensitive(cJSON_GetObjectItemCaseSensitive(in, "circuit"), "param_init");
  for (int p = 0; p < c.nparams && p < cJSON_GetArraySize(pi); p++) c.param_init[p] = cJSON_GetArrayItem(pi, p)->valuedouble;
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  if (!e) return fail("engine", err);
  int rc = strcmp(argv[1], "eval") == 0 ? do_eval(in, e, c.nparams) : do_optimize(in, e, c.nparams);
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
  cJSON_Delete(in);
  return rc;
}
