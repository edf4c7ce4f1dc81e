/* test_sim.c — the simulated run: adjoint gradients against central finite
 * differences, the optimizers on problems with a known minimum, determinism,
 * and the memory refusal of the engine. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include <complex.h>
#include <math.h>

#include "cairn/sim.h"
#include "cairn/util.h"

static void random_word(util_rng *r, int n, uint64_t *x, uint64_t *z) {
  *x = *z = 0;
  while (*x == 0 && *z == 0)
    for (int q = 0; q < n; q++) {
      uint64_t L = util_rng_next(r) & 3; /* 0 I, 1 X, 2 Y, 3 Z */
      if (L == 1 || L == 2) *x |= (uint64_t)1 << q;
      if (L == 2 || L == 3) *z |= (uint64_t)1 << q;
    }
}

/* A random program: nrot rotations over np shared parameters, some fixed
 * angles, random multipliers, a random initial basis state. */
static void random_circuit(util_rng *r, int n, int np, int nrot, ans_circuit *c) {
  ans_circuit_init(c, n);
  c->init[0] = util_rng_next(r) & (((uint64_t)1 << n) - 1);
  ans_gen_info gi = {.kind = ANS_WORD, .text = "w", .rule = -1};
  int g = ans_circuit_add_gen(c, &gi);
  for (int p = 0; p < np; p++) ans_circuit_add_param(c, g);
  for (int k = 0; k < nrot; k++) {
    uint64_t x, z;
    random_word(r, n, &x, &z);
    int32_t w = ans_circuit_word(c, &x, &z);
    int fixed = util_rng_next(r) % 5 == 0;
    int32_t p = fixed ? -1 : (int32_t)(util_rng_next(r) % (uint64_t)np);
    double m = 3 * util_rng_uniform(r) - 1.5;
    ans_circuit_push(c, w, p, m, fixed ? -1 : g);
  }
}

static void random_hermitian(util_rng *r, int n, int nterms, pauli_sum *s) {
  pauli_sum_init(s, n);
  pauli_sum_add_identity(s, util_rng_uniform(r) - 0.5);
  for (int t = 0; t < nterms; t++) {
    uint64_t x, z;
    random_word(r, n, &x, &z);
    pauli_sum_add(s, &x, &z, util_rng_uniform(r) - 0.5);
  }
}

/* A Hermitian sum that connects the states excitations reach: Z_q and
 * Z_p Z_q terms, every X/Y word on the flip sets `flips`, and a few random
 * words (random words alone almost never act on a given basis state). */
static void structured_hermitian(util_rng *r, int n, const uint64_t *flips, int nflips, pauli_sum *s) {
  random_hermitian(r, n, 10, s);
  for (int p = 0; p < n; p++) {
    uint64_t x = 0, z = (uint64_t)1 << p;
    pauli_sum_add(s, &x, &z, util_rng_uniform(r) - 0.5);
    for (int q = p + 1; q < n; q++) {
      z = ((uint64_t)1 << p) | ((uint64_t)1 << q);
      pauli_sum_add(s, &x, &z, 0.2 * (util_rng_uniform(r) - 0.5));
    }
  }
  for (int f = 0; f < nflips; f++) {
    uint64_t x = flips[f];
    int w = __builtin_popcountll(x);
    for (uint64_t ys = 0; ys < ((uint64_t)1 << w); ys++) {
      uint64_t z = 0, m = x;
      for (int b = 0; b < w; b++, m &= m - 1)
        if (ys >> b & 1) z |= m & -m;
      pauli_sum_add(s, &x, &z, util_rng_uniform(r) - 0.5);
    }
  }
  pauli_sum_canonicalize(s, 0.0);
}

/* Adjoint gradient = central differences (step 1e-5, error ~1e-10) to 1e-7,
 * for registers of 1 to 12 qubits, shared parameters and fixed angles. */
static void test_gradient_finite_differences(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 21);
  const int sizes[] = {1, 2, 3, 5, 7, 9, 12};
  int checked = 0, nonzero = 0;
  for (size_t si = 0; si < sizeof sizes / sizeof *sizes; si++) {
    int n = sizes[si];
    for (int trial = 0; trial < 3; trial++) {
      int np = 1 + (int)(util_rng_next(&r) % 6), nrot = 4 + (int)(util_rng_next(&r) % 20);
      ans_circuit c;
      random_circuit(&r, n, np, nrot, &c);
      pauli_sum H;
      random_hermitian(&r, n, 5 + 4 * n, &H);
      char err[300];
      sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
      assert_non_null(e);
      double theta[8], g[8], tp[8];
      for (int p = 0; p < np; p++) theta[p] = 4 * util_rng_uniform(&r) - 2;
      double E = sim_energy_grad(e, theta, g);
      assert_true(fabs(E - sim_energy(e, theta)) < 1e-13);
      const double h = 1e-5;
      for (int p = 0; p < np; p++) {
        memcpy(tp, theta, sizeof tp);
        tp[p] = theta[p] + h;
        double ep = sim_energy(e, tp);
        tp[p] = theta[p] - h;
        double em = sim_energy(e, tp);
        double fd = (ep - em) / (2 * h);
        if (fabs(fd - g[p]) >= 1e-7) fprintf(stderr, "n=%d p=%d adjoint %.12g fd %.12g\n", n, p, g[p], fd);
        assert_true(fabs(fd - g[p]) < 1e-7);
        checked++;
        nonzero += fabs(fd) > 1e-4;
      }
      sim_engine_free(e);
      ans_circuit_free(&c);
      pauli_sum_free(&H);
    }
  }
  assert_true(nonzero >= checked * 3 / 4); /* the gradients are not trivially zero */
}

/* Jordan-Wigner a_p (dagger: a_p^+) = Z_0..Z_{p-1} (X_p +- i Y_p)/2 (common practice). */
static void jw_ladder(int n, int p, int dagger, pauli_sum *out) {
  pauli_sum_init(out, n);
  uint64_t x = (uint64_t)1 << p, zx = x - 1, zy = (x - 1) | x;
  pauli_sum_add(out, &x, &zx, 0.5);
  pauli_sum_add(out, &x, &zy, dagger ? -0.5 * I : 0.5 * I);
}

/* Append the words of G = 2i (T - T^+), T = a_to^+.. a_from.., under one new
 * parameter (as the ansatz module lays out an excitation). */
static void push_excitation(ans_circuit *c, int k, const int *from, const int *to) {
  int n = c->nqubits;
  pauli_sum T, f, tmp, Td, G;
  pauli_sum_init(&T, n);
  pauli_sum_init(&tmp, n);
  pauli_sum_add_identity(&T, 1.0);
  for (int a = 0; a < 2 * k; a++) {
    int q = a < k ? to[a] : from[2 * k - 1 - a];
    jw_ladder(n, q, a < k, &f);
    pauli_sum_mul(&tmp, &T, &f);
    pauli_sum_copy(&T, &tmp);
    pauli_sum_free(&f);
  }
  pauli_sum_init(&Td, n);
  pauli_sum_adjoint(&Td, &T);
  pauli_sum_init(&G, n);
  pauli_sum_add_sum(&G, &T, 2.0 * I);
  pauli_sum_add_sum(&G, &Td, -2.0 * I);
  pauli_sum_canonicalize(&G, 1e-15);
  ans_gen_info gi = {.kind = k == 1 ? ANS_SINGLE : ANS_DOUBLE, .text = "exc", .rule = -1};
  int g = ans_circuit_add_gen(c, &gi);
  int p = ans_circuit_add_param(c, g);
  for (size_t t = 0; t < G.len; t++)
    ans_circuit_push(c, ans_circuit_word(c, pauli_sum_x(&G, t), pauli_sum_z(&G, t)), p, creal(G.c[t]), g);
  pauli_sum_free(&T);
  pauli_sum_free(&Td);
  pauli_sum_free(&tmp);
  pauli_sum_free(&G);
}

/* Excitations run as fused steps (one per excitation); their adjoint
 * gradient still equals central differences, with a plain word and a fixed
 * rotation in between. */
static void test_gradient_fused(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 24);
  ans_circuit c;
  ans_circuit_init(&c, 8);
  c.init[0] = 0x0f; /* 4 electrons in spin orbitals 0..3 */
  const int f1[] = {0, 1}, t1[] = {4, 5}, f2[] = {2}, t2[] = {6}, f3[] = {1, 3}, t3[] = {5, 7}, f4[] = {0},
            t4[] = {4};
  push_excitation(&c, 2, f1, t1);
  push_excitation(&c, 1, f2, t2);
  uint64_t x = 0x11, z = 0x10; /* X0 Y4, fixed angle */
  ans_circuit_push(&c, ans_circuit_word(&c, &x, &z), -1, 0.37, -1);
  push_excitation(&c, 2, f3, t3);
  ans_gen_info gi = {.kind = ANS_WORD, .text = "X1 Y6", .rule = -1};
  int g = ans_circuit_add_gen(&c, &gi);
  int pw = ans_circuit_add_param(&c, g);
  x = 0x42;
  z = 0x40;
  ans_circuit_push(&c, ans_circuit_word(&c, &x, &z), pw, 1.0, g);
  push_excitation(&c, 1, f4, t4);
  pauli_sum H;
  const uint64_t flips[] = {0x33, 0x44, 0xaa, 0x11, 0x42};
  structured_hermitian(&r, 8, flips, 5, &H);
  char err[300];
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  assert_non_null(e);
  assert_int_equal((int)sim_engine_rotations(e), 8 + 2 + 1 + 8 + 1 + 2);
  assert_int_equal((int)sim_engine_steps(e), 6);
  int np = c.nparams;
  double theta[5], grad[5], tp[5];
  for (int p = 0; p < np; p++) theta[p] = 2 * util_rng_uniform(&r) - 1;
  sim_energy_grad(e, theta, grad);
  for (int p = 0; p < np; p++) {
    memcpy(tp, theta, sizeof tp);
    tp[p] = theta[p] + 1e-5;
    double ep = sim_energy(e, tp);
    tp[p] = theta[p] - 1e-5;
    double em = sim_energy(e, tp);
    assert_true(fabs((ep - em) / 2e-5 - grad[p]) < 1e-7);
    assert_true(fabs(grad[p]) > 1e-3); /* the check is not vacuous */
  }
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
}

/* After a gradient pass the engine re-prepares |psi(theta)> for observables:
 * <psi|H|psi> of the objective itself equals the energy. */
static void test_expect_after_gradient(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 22);
  ans_circuit c;
  random_circuit(&r, 6, 3, 12, &c);
  pauli_sum H;
  random_hermitian(&r, 6, 30, &H);
  char err[300];
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  sv_op *op = sim_observable(e, &H, err, sizeof err);
  assert_non_null(op);
  double theta[3] = {0.3, -0.7, 1.1}, g[3];
  double E = sim_energy_grad(e, theta, g);
  assert_true(fabs(sim_expect(e, op) - E) < 1e-13);
  const sv_state *psi = sim_prepare(e, theta);
  assert_true(fabs(sv_norm2(psi) - 1) < 1e-13);
  pauli_sum wrong;
  pauli_sum_init(&wrong, 5);
  assert_null(sim_observable(e, &wrong, err, sizeof err));
  pauli_sum_free(&wrong);
  sv_op_free(op);
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
}

/* One qubit, H = a X + b Y + c Z + d: the eigenvalues of n.sigma are +-1, so
 * the ground energy is d - sqrt(a^2 + b^2 + c^2) (common practice).  Ansatz
 * Rz(t2) Ry(t1) |0> reaches every Bloch direction. */
static void one_qubit_problem(ans_circuit *c, pauli_sum *H, double *ground) {
  const double a = 0.3, b = -0.45, cz = 0.8, d = -0.2;
  pauli_sum_init(H, 1);
  pauli_sum_add_text(H, "X0", a);
  pauli_sum_add_text(H, "Y0", b);
  pauli_sum_add_text(H, "Z0", cz);
  pauli_sum_add_identity(H, d);
  *ground = d - sqrt(a * a + b * b + cz * cz);
  ans_circuit_init(c, 1);
  ans_gen_info gi = {.kind = ANS_WORD, .text = "Y0", .rule = -1};
  int g0 = ans_circuit_add_gen(c, &gi);
  gi.text = "Z0";
  int g1 = ans_circuit_add_gen(c, &gi);
  int p0 = ans_circuit_add_param(c, g0), p1 = ans_circuit_add_param(c, g1);
  uint64_t x = 1, z = 1;
  ans_circuit_push(c, ans_circuit_word(c, &x, &z), p0, 1.0, g0);
  x = 0;
  ans_circuit_push(c, ans_circuit_word(c, &x, &z), p1, 1.0, g1);
}

static void test_every_method_finds_minimum(void **state) {
  (void)state;
  ans_circuit c;
  pauli_sum H;
  double ground;
  one_qubit_problem(&c, &H, &ground);
  char err[300];
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  assert_non_null(e);
  for (int m = IR_OPT_LBFGS; m <= IR_OPT_NELDER_MEAD; m++) {
    sim_opt_options o;
    sim_opt_options_init(&o);
    o.method = (ir_method)m;
    o.tolerance = 1e-12;
    o.max_evals = 4000;
    o.nrandom = 2;
    o.seed = 5;
    sim_opt_result res;
    assert_int_equal(sim_optimize(e, &o, &res, err, sizeof err), 0);
    assert_int_equal(res.nstarts, 3);
    double tol = (m == IR_OPT_LBFGS || m == IR_OPT_SLSQP) ? 1e-9 : 1e-7;
    if (fabs(res.e_min - ground) >= tol)
      fprintf(stderr, "%s: %.12f vs %.12f\n", sim_method_name((ir_method)m), res.e_min, ground);
    assert_true(fabs(res.e_min - ground) < tol);
    assert_true(res.e_min <= res.e_median && res.e_median <= res.e_max);
    assert_true(res.start[res.best].energy == res.e_min);
    assert_string_equal(res.start[0].label, "zeros");
    assert_string_equal(res.start[1].label, "random 1");
    for (int k = 0; k < res.nstarts; k++) {
      const sim_start *s = &res.start[k];
      assert_true(s->evals >= 1 && s->evals <= o.max_evals);
      /* the reported energy is the lowest of the trace, at the reported theta */
      double lo = s->trace[0];
      for (long t = 1; t < s->evals; t++) lo = fmin(lo, s->trace[t]);
      assert_true(lo == s->energy);
      assert_true(sim_energy(e, s->theta) == s->energy);
    }
    /* the engine is left at the best start's state */
    sim_prepare(e, res.start[res.best].theta);
    sim_opt_result_free(&res);
  }
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
}

static void run_twice_equal(sim_engine *e, sim_opt_options *o) {
  char err[300];
  sim_opt_result a, b;
  assert_int_equal(sim_optimize(e, o, &a, err, sizeof err), 0);
  assert_int_equal(sim_optimize(e, o, &b, err, sizeof err), 0);
  assert_int_equal(a.nstarts, b.nstarts);
  for (int k = 0; k < a.nstarts; k++) {
    assert_int_equal(a.start[k].evals, b.start[k].evals);
    assert_memory_equal(&a.start[k].energy, &b.start[k].energy, sizeof(double));
    assert_memory_equal(a.start[k].theta, b.start[k].theta, (size_t)a.nparams * sizeof(double));
    assert_memory_equal(a.start[k].trace, b.start[k].trace, (size_t)a.start[k].evals * sizeof(double));
  }
  sim_opt_result_free(&a);
  sim_opt_result_free(&b);
}

/* Same seed, same bits; another seed, other random starts; random start k
 * does not depend on how many starts there are. */
static void test_determinism(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 23);
  ans_circuit c;
  random_circuit(&r, 8, 5, 16, &c);
  pauli_sum H;
  random_hermitian(&r, 8, 60, &H);
  char err[300];
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  for (int m = IR_OPT_LBFGS; m <= IR_OPT_NELDER_MEAD; m++) {
    sim_opt_options o;
    sim_opt_options_init(&o);
    o.method = (ir_method)m;
    o.max_evals = 150;
    o.nrandom = 2;
    o.seed = 7;
    run_twice_equal(e, &o);
  }
  sim_opt_options o;
  sim_opt_options_init(&o);
  o.max_evals = 5;
  o.nrandom = 3;
  o.seed = 7;
  sim_opt_result a, b;
  assert_int_equal(sim_optimize(e, &o, &a, err, sizeof err), 0);
  o.nrandom = 1;
  assert_int_equal(sim_optimize(e, &o, &b, err, sizeof err), 0);
  assert_memory_equal(a.start[1].theta0, b.start[1].theta0, 5 * sizeof(double));
  for (int p = 0; p < 5; p++) assert_true(fabs(a.start[1].theta0[p]) <= SIM_RANDOM_RANGE);
  assert_true(memcmp(a.start[1].theta0, a.start[2].theta0, 5 * sizeof(double)) != 0);
  sim_opt_result_free(&b);
  o.seed = 8;
  assert_int_equal(sim_optimize(e, &o, &b, err, sizeof err), 0);
  assert_true(memcmp(a.start[1].theta0, b.start[1].theta0, 5 * sizeof(double)) != 0);
  sim_opt_result_free(&a);
  sim_opt_result_free(&b);
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
}

/* A given warm start is used as given, and its label kept. */
static void test_given_start(void **state) {
  (void)state;
  ans_circuit c;
  pauli_sum H;
  double ground;
  one_qubit_problem(&c, &H, &ground);
  char err[300];
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  const double warm[2] = {1.0, -0.5};
  const double *given[2] = {NULL, warm};
  const char *labels[2] = {"zeros", "warm"};
  sim_opt_options o;
  sim_opt_options_init(&o);
  o.given = given;
  o.given_label = labels;
  o.ngiven = 2;
  sim_opt_result res;
  assert_int_equal(sim_optimize(e, &o, &res, err, sizeof err), 0);
  assert_string_equal(res.start[1].label, "warm");
  assert_memory_equal(res.start[1].theta0, warm, sizeof warm);
  assert_true(res.start[1].trace[0] == sim_energy(e, warm));
  sim_opt_result_free(&res);
  o.ngiven = 0;
  assert_int_equal(sim_optimize(e, &o, &res, err, sizeof err), -1);
  assert_non_null(strstr(err, "at least one start"));
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
}

/* A program without parameters is evaluated once and reported as such. */
static void test_no_parameters(void **state) {
  (void)state;
  ans_circuit c;
  ans_circuit_init(&c, 2);
  c.init[0] = 1; /* |q0 = 1, q1 = 0> */
  pauli_sum H;
  pauli_sum_init(&H, 2);
  pauli_sum_add_text(&H, "Z0", 0.5);
  pauli_sum_add_text(&H, "Z1", 0.25);
  char err[300];
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  sim_opt_options o;
  sim_opt_options_init(&o);
  sim_opt_result res;
  assert_int_equal(sim_optimize(e, &o, &res, err, sizeof err), 0);
  /* Z0 on |1> is -1, Z1 on |0> is +1 */
  assert_true(res.start[0].energy == -0.5 + 0.25);
  assert_int_equal(res.start[0].stop, SIM_STOP_NO_PARAMS);
  assert_string_equal(sim_stop_name(res.start[0].stop), "no parameters");
  sim_opt_result_free(&res);
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
}

/* 40 qubits would need 32 TiB: refused before anything large is allocated
 * (an attempt would end the process in xcalloc); mismatched widths too. */
static void test_engine_refuses(void **state) {
  (void)state;
  ans_circuit c;
  ans_circuit_init(&c, 40);
  pauli_sum H;
  pauli_sum_init(&H, 40);
  pauli_sum_add_text(&H, "Z0 Z39", 1.0);
  char err[300];
  uint64_t have = util_mem_available();
  if (have != 0 && have < ((uint64_t)32 << 40)) {
    assert_null(sim_engine_new(&c, &H, err, sizeof err));
    /* 2 vectors of 16 TiB and the tabulated diagonal, 8 TiB */
    assert_non_null(strstr(err, "a 40-qubit statevector run needs 40.0 TiB (2 vectors of 16.0 TiB and tables)"));
    assert_non_null(strstr(err, "available"));
  }
  pauli_sum_free(&H);
  pauli_sum_init(&H, 39);
  assert_null(sim_engine_new(&c, &H, err, sizeof err));
  assert_non_null(strstr(err, "39 qubits"));
  pauli_sum_free(&H);
  ans_circuit_free(&c);
  assert_true(sim_engine_bytes(20, 100) > 2 * sv_vector_bytes(20));
}

/* mu (N - x0)^2 with the Jordan-Wigner number operator N = sum_q (1 - Z_q)/2
 * (common practice): on a basis state with k ones it is mu (k - x0)^2, and
 * the objective H + penalty is H's value plus that. */
static void test_penalty(void **state) {
  (void)state;
  const int n = 4;
  pauli_sum N;
  pauli_sum_init(&N, n);
  for (int q = 0; q < n; q++) {
    uint64_t x = 0, z = (uint64_t)1 << q;
    pauli_sum_add(&N, &x, &z, -0.5);
    pauli_sum_add_identity(&N, 0.5);
  }
  pauli_sum_canonicalize(&N, 0.0);
  for (uint64_t bits = 0; bits < 16; bits++) {
    pauli_sum obj;
    pauli_sum_init(&obj, n);
    pauli_sum_add_text(&obj, "Z0", 0.25);
    sim_add_penalty(&obj, &N, 2.0, 0.5);
    ans_circuit c;
    ans_circuit_init(&c, n);
    c.init[0] = bits;
    char err[300];
    sim_engine *e = sim_engine_new(&c, &obj, err, sizeof err);
    int k = __builtin_popcountll(bits);
    double want = ((bits & 1) ? -0.25 : 0.25) + 0.5 * (k - 2.0) * (k - 2.0);
    assert_true(fabs(sim_energy(e, NULL) - want) < 1e-14);
    sim_engine_free(e);
    ans_circuit_free(&c);
    pauli_sum_free(&obj);
  }
  pauli_sum_free(&N);
}

/* Starts begin at the circuit's initial values (mean-field angles): the
 * "zeros" start is param_init, random starts are offsets from it. */
static void test_initial_values(void **state) {
  (void)state;
  ans_circuit c;
  pauli_sum H;
  double ground;
  one_qubit_problem(&c, &H, &ground);
  c.param_init[0] = 2.0;
  c.param_init[1] = -1.0;
  char err[300];
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  assert_true(sim_engine_initial(e)[0] == 2.0 && sim_engine_initial(e)[1] == -1.0);
  sim_opt_options o;
  sim_opt_options_init(&o);
  o.max_evals = 3;
  o.nrandom = 2;
  sim_opt_result res;
  assert_int_equal(sim_optimize(e, &o, &res, err, sizeof err), 0);
  assert_true(res.start[0].theta0[0] == 2.0 && res.start[0].theta0[1] == -1.0);
  for (int k = 1; k < 3; k++) {
    assert_true(fabs(res.start[k].theta0[0] - 2.0) <= SIM_RANDOM_RANGE);
    assert_true(fabs(res.start[k].theta0[1] + 1.0) <= SIM_RANDOM_RANGE);
    assert_true(res.start[k].theta0[0] != 2.0);
  }
  sim_opt_result_free(&res);
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
}

/* Candidate gradients equal the central difference of the program with the
 * candidate appended under a new parameter at 0 (an excitation that fuses, a
 * single word, and a two-word candidate that does not fuse). */
static void test_candidate_gradients(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 25);
  ans_circuit base;
  ans_circuit_init(&base, 8);
  base.init[0] = 0x0f;
  const int f1[] = {0, 1}, t1[] = {4, 5};
  push_excitation(&base, 2, f1, t1);
  pauli_sum H;
  const uint64_t flips[] = {0x33, 0xcc, 0x22, 0x84, 0x08};
  structured_hermitian(&r, 8, flips, 5, &H);
  /* candidates: the words of a double, of a single, and "X2 Y7" + "Z0 Y3" */
  ans_circuit tmp;
  ans_circuit_init(&tmp, 8);
  const int f2[] = {2, 3}, t2[] = {6, 7}, f3[] = {1}, t3[] = {5};
  push_excitation(&tmp, 2, f2, t2);
  push_excitation(&tmp, 1, f3, t3);
  pauli_sum words;
  pauli_sum_init(&words, 8);
  for (size_t k = 0; k < tmp.nrot; k++)
    pauli_sum_add(&words, pauli_sum_x(&tmp.words, (size_t)tmp.rot[k].word),
                  pauli_sum_z(&tmp.words, (size_t)tmp.rot[k].word), tmp.rot[k].mult);
  pauli_sum_add_text(&words, "X2 Y7", 0.7);
  pauli_sum_add_text(&words, "Z0 Y3", -0.4);
  size_t off[3] = {0, 8, 10}, len[3] = {8, 2, 2};
  char err[300];
  sim_engine *e = sim_engine_new(&base, &H, err, sizeof err);
  double theta[1] = {0.3}, g[3];
  assert_int_equal(sim_candidate_gradients(e, theta, &words, off, len, 3, g, err, sizeof err), 0);
  for (int c = 0; c < 3; c++) {
    ans_circuit ext;
    ans_circuit_init(&ext, 8);
    ext.init[0] = base.init[0];
    ans_gen_info gi = {.kind = ANS_WORD, .text = "x", .rule = -1};
    int gg = ans_circuit_add_gen(&ext, &gi);
    int p0 = ans_circuit_add_param(&ext, gg), p1 = ans_circuit_add_param(&ext, gg);
    for (size_t k = 0; k < base.nrot; k++)
      ans_circuit_push(&ext,
                       ans_circuit_word(&ext, pauli_sum_x(&base.words, (size_t)base.rot[k].word),
                                        pauli_sum_z(&base.words, (size_t)base.rot[k].word)),
                       p0, base.rot[k].mult, gg);
    for (size_t k = off[c]; k < off[c] + len[c]; k++)
      ans_circuit_push(&ext, ans_circuit_word(&ext, pauli_sum_x(&words, k), pauli_sum_z(&words, k)), p1,
                       creal(words.c[k]), gg);
    sim_engine *e2 = sim_engine_new(&ext, &H, err, sizeof err);
    double tp[2] = {0.3, 1e-5}, tm[2] = {0.3, -1e-5};
    double fd = (sim_energy(e2, tp) - sim_energy(e2, tm)) / 2e-5;
    assert_true(fabs(fd - g[c]) < 1e-7);
    assert_true(fabs(g[c]) > 1e-3); /* the check is not vacuous */
    sim_engine_free(e2);
    ans_circuit_free(&ext);
  }
  sim_engine_free(e);
  ans_circuit_free(&base);
  ans_circuit_free(&tmp);
  pauli_sum_free(&words);
  pauli_sum_free(&H);
}

typedef struct progress_log {
  long calls, last_eval[3];
  int last_start;
  double best_seen;
} progress_log;

static void on_progress(void *user, const sim_progress *p) {
  progress_log *l = user;
  l->calls++;
  assert_true(p->start >= l->last_start && p->start < p->nstarts && p->nstarts == 3);
  l->last_start = p->start;
  assert_int_equal(p->evaluation, l->last_eval[p->start] + 1); /* one call per evaluation, in order */
  l->last_eval[p->start] = p->evaluation;
  assert_true(p->best <= p->energy);
}

/* The progress hook sees every evaluation of every start, in order. */
static void test_progress_hook(void **state) {
  (void)state;
  ans_circuit c;
  pauli_sum H;
  double ground;
  one_qubit_problem(&c, &H, &ground);
  char err[300];
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  progress_log log = {0, {0, 0, 0}, 0, 0};
  sim_opt_options o;
  sim_opt_options_init(&o);
  o.nrandom = 2;
  o.progress = on_progress;
  o.progress_user = &log;
  sim_opt_result res;
  assert_int_equal(sim_optimize(e, &o, &res, err, sizeof err), 0);
  assert_int_equal(log.calls, res.evals);
  for (int k = 0; k < 3; k++) assert_int_equal(log.last_eval[k], res.start[k].evals);
  sim_opt_result_free(&res);
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_gradient_finite_differences),
      cmocka_unit_test(test_gradient_fused),
      cmocka_unit_test(test_expect_after_gradient),
      cmocka_unit_test(test_every_method_finds_minimum),
      cmocka_unit_test(test_determinism),
      cmocka_unit_test(test_given_start),
      cmocka_unit_test(test_no_parameters),
      cmocka_unit_test(test_engine_refuses),
      cmocka_unit_test(test_penalty),
      cmocka_unit_test(test_progress_hook),
      cmocka_unit_test(test_candidate_gradients),
      cmocka_unit_test(test_initial_values),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
