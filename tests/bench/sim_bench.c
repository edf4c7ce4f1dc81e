/* sim_bench.c — timings of the statevector engine, driven by sim_bench.py.
 *
 *   sim_bench rotation NQUBITS REPEATS
 *       a STREAM-like copy and Pauli rotations over one register, median
 *       seconds and GB/s (bytes read + written / time) of each;
 *   sim_bench evalgrad FILE REPEATS
 *       median seconds of one energy + gradient evaluation (and of its parts)
 *       of the job in FILE (the sim_driver format: hamiltonian, circuit,
 *       theta), with the energy and gradient for the cross-check;
 *   sim_bench molecule NORB NELEC REPEATS
 *       a molecule-shaped register of 2 NORB qubits: the Jordan-Wigner
 *       Hamiltonian (cairn's qubit module) of random real integrals with the
 *       8-fold symmetry, 16 entanglers and every double excitation of the
 *       NELEC-electron reference; median seconds of O|psi> and of energy +
 *       gradient (speed only, not chemistry).
 * Output: one JSON object on stdout. */
#include "config.h"

#include "cairn/chem.h"
#include "cairn/json.h"
#include "cairn/qubit.h"
#include "cairn/sim.h"
#include "cairn/util.h"
#include "../support/testdata.h"

#include <complex.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#ifdef _OPENMP
#include <omp.h>
#endif

static double minimum(const double *t, int n) {
  double m = t[0];
  for (int k = 1; k < n; k++) m = t[k] < m ? t[k] : m;
  return m;
}

static int threads(void) {
#ifdef _OPENMP
  return omp_get_max_threads();
#else
  return 1;
#endif
}

static int bench_rotation(int n, int reps) {
  char err[300];
  if (sv_mem_check(n, 2, 0, err, sizeof err) != 0) {
    fprintf(stderr, "sim_bench: %s\n", err);
    return 2;
  }
  sv_state a, b;
  sv_state_alloc(&a, n);
  sv_state_alloc(&b, n);
  util_rng r;
  util_rng_seed(&r, 1);
  for (uint64_t i = 0; i < a.dim; i++) a.a[i] = (util_rng_uniform(&r) - 0.5) + I * (util_rng_uniform(&r) - 0.5);
  double bytes = 2.0 * (double)sv_vector_bytes(n); /* one read and one write of a vector */
  double *t = xmalloc((size_t)reps * sizeof *t);
  printf("{\"qubits\": %d, \"threads\": %d, \"vector_bytes\": %.0f, \"repeats\": %d", n, threads(), bytes / 2,
         reps);
  sv_copy(&b, &a); /* first touch */
  for (int k = 0; k < reps; k++) {
    double t0 = util_now();
    sv_copy(&b, &a);
    t[k] = util_now() - t0;
  }
  double tc = util_median(t, (size_t)reps);
  printf(", \"copy\": {\"seconds\": %.6g, \"gbps\": %.4g}", tc, bytes / tc / 1e9);
  struct {
    const char *name;
    uint64_t x, z;
  } words[] = {
      {"X0 Y5 Z9 X23", (1ull << 0) | (1ull << 5) | (1ull << 23), (1ull << 5) | (1ull << 9)},
      {"Y0 X1 X2 X3", 0xfull, 0x1ull},
      {"Z3 Z17", 0, (1ull << 3) | (1ull << 17)},
      {"Y10 Y11 Y12 Y13", 0xfull << 10, 0xfull << 10},
      {"X6 X23", (1ull << 6) | (1ull << 23), 0}, /* partner blocks 1 KiB apart in the page (sv.c's runs) */
  };
  printf(", \"rotations\": [");
  for (size_t w = 0; w < sizeof words / sizeof *words; w++) {
    uint64_t mask = n >= 64 ? ~0ull : ((1ull << n) - 1);
    for (int k = 0; k < reps; k++) {
      double t0 = util_now();
      sv_rotate(&a, words[w].x & mask, words[w].z & mask, 0.1 + 0.01 * k);
      t[k] = util_now() - t0;
    }
    double tr = util_median(t, (size_t)reps);
    printf("%s{\"word\": \"%s\", \"seconds\": %.6g, \"gbps\": %.4g, \"of_copy\": %.4g}", w ? ", " : "",
           words[w].name, tr, bytes / tr / 1e9, tc / tr);
  }
  printf("]}\n");
  free(t);
  sv_state_free(&a);
  sv_state_free(&b);
  return 0;
}

static int bench_evalgrad(const char *path, int reps) {
  size_t len;
  char *text = util_read_file(path, &len);
  if (!text) {
    fprintf(stderr, "sim_bench: cannot read %s\n", path);
    return 2;
  }
  cJSON *in = cJSON_ParseWithLength(text, len);
  free(text);
  char err[300];
  pauli_sum H;
  ans_circuit c;
  if (!in || json_read_pauli_sum(cJSON_GetObjectItemCaseSensitive(in, "hamiltonian"), &H, err, sizeof err) != 0 ||
      json_read_circuit(cJSON_GetObjectItemCaseSensitive(in, "circuit"), &c, err, sizeof err) != 0) {
    fprintf(stderr, "sim_bench: %s: bad job\n", path);
    return 2;
  }
  sim_engine *e = sim_engine_new(&c, &H, err, sizeof err);
  if (!e) {
    fprintf(stderr, "sim_bench: %s\n", err);
    return 2;
  }
  int np = c.nparams;
  double *theta = xcalloc((size_t)np + 1, sizeof *theta), *grad = xcalloc((size_t)np + 1, sizeof *grad);
  const cJSON *tj = cJSON_GetObjectItemCaseSensitive(in, "theta");
  for (int p = 0; p < np && p < cJSON_GetArraySize(tj); p++) theta[p] = cJSON_GetArrayItem(tj, p)->valuedouble;
  double *t = xmalloc((size_t)reps * sizeof *t), *t2 = xmalloc((size_t)reps * sizeof *t2),
         *t3 = xmalloc((size_t)reps * sizeof *t3);
  double E = sim_energy_grad(e, theta, grad); /* warm-up */
  for (int k = 0; k < reps; k++) {
    double t0 = util_now();
    E = sim_energy_grad(e, theta, grad);
    t[k] = util_now() - t0;
  }
  for (int k = 0; k < reps; k++) {
    double t0 = util_now();
    sim_energy(e, theta);
    t2[k] = util_now() - t0;
  }
  /* the operator alone, on the prepared state */
  const sv_state *psi = sim_prepare(e, theta);
  sv_op *op = sv_op_new(&H, err, sizeof err);
  sv_op_cache_diagonal(op); /* as the engine does */
  sv_state out;
  sv_state_alloc(&out, c.nqubits);
  for (int k = 0; k < reps; k++) {
    double t0 = util_now();
    sv_op_apply(op, psi, &out);
    t3[k] = util_now() - t0;
  }
  printf("{\"qubits\": %d, \"threads\": %d, \"terms\": %zu, \"groups\": %zu, \"rotations\": %zu, \"params\": %d, "
         "\"repeats\": %d, \"energy\": %.17g, \"evalgrad_seconds\": %.6g, \"energy_seconds\": %.6g, "
         "\"apply_seconds\": %.6g, \"evalgrad_min\": %.6g, \"apply_min\": %.6g, \"gradient\": [",
         c.nqubits, threads(), sv_op_terms(op), sv_op_groups(op), c.nrot, np, reps, E, util_median(t, (size_t)reps),
         util_median(t2, (size_t)reps), util_median(t3, (size_t)reps), minimum(t, reps), minimum(t3, reps));
  for (int p = 0; p < np; p++) printf("%s%.17g", p ? ", " : "", grad[p]);
  printf("]}\n");
  sv_state_free(&out);
  sv_op_free(op);
  free(t);
  free(t2);
  free(t3);
  free(theta);
  free(grad);
  sim_engine_free(e);
  ans_circuit_free(&c);
  pauli_sum_free(&H);
  cJSON_Delete(in);
  return 0;
}

/* G = 2i (T - T^+) of the double i j -> a b as words under one parameter. */
static void push_double(ans_circuit *c, const qubit_encoder *enc, int i, int j, int a, int b, int gen, int param) {
  pauli_acc *acc = pauli_acc_new(c->nqubits, 16);
  qubit_ladder t[4] = {{a, 1}, {b, 1}, {j, 0}, {i, 0}}, td[4] = {{i, 1}, {j, 1}, {b, 0}, {a, 0}};
  qubit_encoder_add_product(enc, t, 4, 2.0 * I, acc);
  qubit_encoder_add_product(enc, td, 4, -2.0 * I, acc);
  pauli_sum G;
  pauli_sum_init(&G, c->nqubits);
  pauli_acc_finish(acc, &G, 1e-14);
  for (size_t k = 0; k < G.len; k++)
    ans_circuit_push(c, ans_circuit_word(c, pauli_sum_x(&G, k), pauli_sum_z(&G, k)), param, creal(G.c[k]), gen);
  pauli_sum_free(&G);
}

static double time_evalgrad(sim_engine *e, const double *theta, double *grad, int reps) {
  double *t = xmalloc((size_t)reps * sizeof *t);
  sim_energy_grad(e, theta, grad);
  for (int k = 0; k < reps; k++) {
    double t0 = util_now();
    sim_energy_grad(e, theta, grad);
    t[k] = util_now() - t0;
  }
  double m = util_median(t, (size_t)reps);
  free(t);
  return m;
}

static int bench_molecule(int norb, int nelec, int reps) {
  int n = 2 * norb;
  util_rng r;
  util_rng_seed(&r, 3);
  /* random real integrals with the symmetries of real orbitals, scaled like a
   * small molecule's (invented data; tests/support/testdata.c) */
  const testdata_scales scales = {.h1 = 1.0, .diag0 = -2.0, .h2 = 0.1};
  chem_space sp;
  testdata_space(&sp, norb, (nelec + 1) / 2, nelec / 2, &scales, &r);
  qubit_encoder *enc = qubit_encoder_new(IR_ENC_JORDAN_WIGNER, n);
  pauli_sum H;
  pauli_sum_init(&H, n);
  double t0 = util_now();
  qubit_hamiltonian(&sp, enc, &H);
  double t_ham = util_now() - t0;
  char err[300];
  /* program 1: 16 entanglers on weight-4 flip sets of H (one Y each) */
  ans_circuit ce, cu;
  ans_circuit_init(&ce, n);
  ans_circuit_init(&cu, n);
  ce.init[0] = cu.init[0] = ((uint64_t)1 << nelec) - 1;
  ans_gen_info gi = {.kind = ANS_ENTANGLER, .text = "e", .rule = -1};
  int got = 0;
  for (size_t k = 0; k < H.len && got < 16; k += 1 + H.len / 64) {
    uint64_t x = pauli_sum_x(&H, k)[0];
    if (__builtin_popcountll(x) != 4) continue;
    uint64_t z = x & -x;
    int g = ans_circuit_add_gen(&ce, &gi);
    ans_circuit_push(&ce, ans_circuit_word(&ce, &x, &z), ans_circuit_add_param(&ce, g), 1.0, g);
    got++;
  }
  /* program 2: every spin-conserving double of the reference */
  gi.kind = ANS_DOUBLE;
  for (int i = 0; i < nelec; i++)
    for (int j = i + 1; j < nelec; j++)
      for (int a = nelec; a < n; a++)
        for (int b = a + 1; b < n; b++) {
          if ((i % 2) + (j % 2) != (a % 2) + (b % 2)) continue;
          int g = ans_circuit_add_gen(&cu, &gi);
          push_double(&cu, enc, i, j, a, b, g, ans_circuit_add_param(&cu, g));
        }
  printf("{\"qubits\": %d, \"threads\": %d, \"terms\": %zu, \"hamiltonian_seconds\": %.3g", n, threads(), H.len,
         t_ham);
  sim_engine *e = sim_engine_new(&ce, &H, err, sizeof err);
  if (!e) {
    printf(", \"refused\": \"%s\"}\n", err);
    return 0;
  }
  double *theta = xcalloc((size_t)cu.nparams + 16, sizeof *theta), *grad = xcalloc((size_t)cu.nparams + 16, sizeof *grad);
  for (int p = 0; p < cu.nparams + 16; p++) theta[p] = 0.1 * (util_rng_uniform(&r) - 0.5);
  char b1[32];
  printf(", \"engine_bytes\": \"%s\"", sv_fmt_bytes(b1, sim_engine_bytes(n, H.len)));
  printf(", \"entanglers\": {\"rotations\": %zu, \"evalgrad_seconds\": %.4g}", ce.nrot,
         time_evalgrad(e, theta, grad, reps));
  sim_engine_free(e);
  e = sim_engine_new(&cu, &H, err, sizeof err);
  printf(", \"doubles\": {\"generators\": %d, \"rotations\": %zu, \"steps\": %zu, \"evalgrad_seconds\": %.4g}}\n",
         cu.nparams, cu.nrot, sim_engine_steps(e), time_evalgrad(e, theta, grad, reps));
  sim_engine_free(e);
  free(theta);
  free(grad);
  ans_circuit_free(&ce);
  ans_circuit_free(&cu);
  pauli_sum_free(&H);
  qubit_encoder_free(enc);
  chem_space_free(&sp);
  return 0;
}

int main(int argc, char **argv) {
  if (argc == 4 && strcmp(argv[1], "rotation") == 0) return bench_rotation(atoi(argv[2]), atoi(argv[3]));
  if (argc == 4 && strcmp(argv[1], "evalgrad") == 0) return bench_evalgrad(argv[2], atoi(argv[3]));
  if (argc == 5 && strcmp(argv[1], "molecule") == 0) return bench_molecule(atoi(argv[2]), atoi(argv[3]), atoi(argv[4]));
  fprintf(stderr, "usage: sim_bench rotation NQUBITS REPEATS | evalgrad FILE REPEATS | molecule NORB NELEC REPEATS\n");
  return 2;
}
