/* sim_bench.c — timings of the statevector engine, driven by sim_bench.py.
 *
 *   sim_bench rotation NQUBITS REPEATS
 *       a STREAM-like copy and Pauli rotations over one register, median
 *       seconds and GB/s (bytes read + written / time) of each;
 *   sim_bench evalgrad FILE REPEATS
 *       median seconds of one energy + gradient evaluation (and of its parts)
 *       of the job in FILE (the sim_driver format: hamiltonian, circuit,
 *       theta), with the energy and gradient for the cross-check.
 * Output: one JSON object on stdout. */
#include "config.h"

#include "cairn/json.h"
#include "cairn/sim.h"
#include "cairn/util.h"

#include <complex.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#ifdef _OPENMP
#include <omp.h>
#endif

static int cmp_double(const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return x < y ? -1 : x > y;
}

static double median(double *t, int n) {
  qsort(t, (size_t)n, sizeof *t, cmp_double);
  return n % 2 ? t[n / 2] : 0.5 * (t[n / 2 - 1] + t[n / 2]);
}

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
  for (uint64_t i = 0; i < a.dim; i++) a.a[i] = CMPLX(util_rng_uniform(&r) - 0.5, util_rng_uniform(&r) - 0.5);
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
  double tc = median(t, reps);
  printf(", \"copy\": {\"seconds\": %.6g, \"gbps\": %.4g}", tc, bytes / tc / 1e9);
  struct {
    const char *name;
    uint64_t x, z;
  } words[] = {
      {"X0 Y5 Z9 X23", (1ull << 0) | (1ull << 5) | (1ull << 23), (1ull << 5) | (1ull << 9)},
      {"Y0 X1 X2 X3", 0xfull, 0x1ull},
      {"Z3 Z17", 0, (1ull << 3) | (1ull << 17)},
      {"Y10 Y11 Y12 Y13", 0xfull << 10, 0xfull << 10},
  };
  printf(", \"rotations\": [");
  for (size_t w = 0; w < sizeof words / sizeof *words; w++) {
    uint64_t mask = n >= 64 ? ~0ull : ((1ull << n) - 1);
    for (int k = 0; k < reps; k++) {
      double t0 = util_now();
      sv_rotate(&a, words[w].x & mask, words[w].z & mask, 0.1 + 0.01 * k);
      t[k] = util_now() - t0;
    }
    double tr = median(t, reps);
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
         c.nqubits, threads(), sv_op_terms(op), sv_op_groups(op), c.nrot, np, reps, E, median(t, reps),
         median(t2, reps), median(t3, reps), minimum(t, reps), minimum(t3, reps));
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

int main(int argc, char **argv) {
  if (argc == 4 && strcmp(argv[1], "rotation") == 0) return bench_rotation(atoi(argv[2]), atoi(argv[3]));
  if (argc == 4 && strcmp(argv[1], "evalgrad") == 0) return bench_evalgrad(argv[2], atoi(argv[3]));
  fprintf(stderr, "usage: sim_bench rotation NQUBITS REPEATS | evalgrad FILE REPEATS\n");
  return 2;
}
