/* gates_bench.c — lower the full UCCSD pool of a 100-qubit system (50 spatial
 * orbitals, 20 electrons, Jordan-Wigner, no screening: every spin-conserving
 * single and double occupied -> virtual) to the gate listing and to OpenQASM
 * 3.0, and report gates written per second, output size and peak memory.
 *
 * Goal (issue 7): over 10 million gates per second written.  Baseline, timed
 * in the same run: the same gate stream written with one fprintf per gate.
 * Each figure is the median of `reps` runs (CAIRN_BENCH_REPS, default 3).
 * Output goes to /dev/null through stdio (bytes counted by the writer), or
 * to files in CAIRN_BENCH_DIR when set (removed afterwards).
 *
 * The words are built here directly: a single i -> a is Y_i Z.. X_a (-1) and
 * X_i Z.. Y_a (+1); a double i j -> a b (i < j < a < b) is the 8 words with an
 * odd number of Y on i, j, a, b, Z on the qubits strictly between i and j
 * and between a and b, multipliers +-1/4 (the signs the Jordan-Wigner
 * expansion gives for sorted indices; tests/ref/gates_sim.py derives them). */
#include "config.h"

#include "cairn/gates.h"
#include "cairn/util.h"
#include "lower/gate_int.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

enum { NORB = 50, NELEC = 20, NQ = 2 * NORB };

static void zrange(uint64_t *x, uint64_t *z, int lo, int hi) {
  for (int q = lo + 1; q < hi; q++) pauli_set_letter(x, z, q, 'Z');
}

static void build_pool(ans_circuit *c) {
  ans_circuit_init(c, NQ);
  for (int i = 0; i < NELEC; i++) pauli_set(c->init, i, 1);
  uint64_t x[2], z[2];
  char txt[64];
  /* singles */
  for (int i = 0; i < NELEC; i++)
    for (int a = NELEC; a < NQ; a++) {
      if (i % 2 != a % 2) continue;
      snprintf(txt, sizeof txt, "%d -> %d", i, a);
      ans_gen_info gi = {ANS_SINGLE, txt, 0, 1, 1, {i}, {a}, 0};
      int g = ans_circuit_add_gen(c, &gi);
      int p = ans_circuit_add_param(c, g);
      for (int k = 0; k < 2; k++) {
        memset(x, 0, sizeof x);
        memset(z, 0, sizeof z);
        zrange(x, z, i, a);
        pauli_set_letter(x, z, i, k ? 'X' : 'Y');
        pauli_set_letter(x, z, a, k ? 'Y' : 'X');
        ans_circuit_push(c, ans_circuit_word(c, x, z), p, k ? 1.0 : -1.0, g);
      }
    }
  /* doubles: letters on (i, j, a, b) and their multipliers */
  static const char *const pat[8] = {"YXXX", "XYXX", "XXYX", "YYYX", "XXXY", "YYXY", "YXYY", "XYYY"};
  static const double mul[8] = {0.25, 0.25, -0.25, 0.25, -0.25, 0.25, -0.25, -0.25};
  for (int i = 0; i < NELEC; i++)
    for (int j = i + 1; j < NELEC; j++)
      for (int a = NELEC; a < NQ; a++)
        for (int b = a + 1; b < NQ; b++) {
          if ((i % 2) + (j % 2) != (a % 2) + (b % 2)) continue; /* spin-conserving */
          snprintf(txt, sizeof txt, "%d %d -> %d %d", i, j, a, b);
          ans_gen_info gi = {ANS_DOUBLE, txt, 1, 2, 2, {i, j}, {a, b}, 0};
          int g = ans_circuit_add_gen(c, &gi);
          int p = ans_circuit_add_param(c, g);
          int q[4] = {i, j, a, b};
          for (int k = 0; k < 8; k++) {
            memset(x, 0, sizeof x);
            memset(z, 0, sizeof z);
            zrange(x, z, i, j);
            zrange(x, z, a, b);
            for (int t = 0; t < 4; t++) pauli_set_letter(x, z, q[t], pat[k][t]);
            ans_circuit_push(c, ans_circuit_word(c, x, z), p, mul[k], g);
          }
        }
}

/* Baseline writer: one fprintf per gate (OpenQASM 3.0 lines). */
typedef struct naive_sink {
  gate_sink sink;
  FILE *f;
} naive_sink;

static void naive_put(gate_sink *s, const gate *g, size_t n) {
  FILE *f = ((naive_sink *)s)->f;
  for (size_t i = 0; i < n; i++) {
    const gate *x = &g[i];
    if (x->op == GATE_MARK) continue;
    if (x->op == GATE_CX) fprintf(f, "cx q[%d], q[%d];\n", x->q0, x->q1);
    else if (gate_is_rotation(x->op) && x->param >= 0)
      fprintf(f, "%s(%.17g*theta_%d) q[%d];\n", gate_op_name((gate_op)x->op), x->mult, x->param, x->q0);
    else if (gate_is_rotation(x->op)) fprintf(f, "%s(%.17g) q[%d];\n", gate_op_name((gate_op)x->op), x->mult, x->q0);
    else fprintf(f, "%s q[%d];\n", gate_op_name((gate_op)x->op), x->q0);
  }
}

static void naive_finish(gate_sink *s) { (void)s; }

static FILE *open_out(const char *dir, const char *name, char **path) {
  *path = dir ? xasprintf("%s/%s", dir, name) : xstrdup("/dev/null");
  FILE *f = fopen(*path, "w");
  if (!f) {
    perror(*path);
    exit(2);
  }
  return f;
}

static void close_out(FILE *f, const char *dir, char *path) {
  fclose(f);
  if (dir) remove(path);
  free(path);
}

int main(void) {
  const char *dir = getenv("CAIRN_BENCH_DIR");
  int reps = getenv("CAIRN_BENCH_REPS") ? atoi(getenv("CAIRN_BENCH_REPS")) : 3;
  if (reps < 1) reps = 1;
  double t0 = util_now();
  ans_circuit c;
  build_pool(&c);
  double tpool = util_now() - t0;
  printf("gates bench: UCCSD pool, %d qubits (%d orbitals, %d electrons), Jordan-Wigner, no screening\n", NQ, NORB,
         NELEC);
  printf("  pool: %d generators, %zu rotations, %zu distinct words, built in %.2f s\n", c.ngens, c.nrot, c.words.len,
         tpool);
  printf("  output: %s; each figure the median of %d runs\n", dir ? dir : "/dev/null through stdio", reps);

  gate_opts plain;
  gate_opts_default(&plain);
  plain.passes = 0;
  gate_opts opt;
  gate_opts_default(&opt);

  /* counts (lowering alone) */
  gate_counts kp, ko;
  t0 = util_now();
  gate_count_circuit(&c, &plain, &kp);
  double tcount = util_now() - t0;
  t0 = util_now();
  gate_count_circuit(&c, &opt, &ko);
  double tcount_opt = util_now() - t0;
  printf("  plain: cx %ld (sum of 2(w-1): %ld), single %ld, total %ld, depth %ld; lowered and counted in %.2f s "
         "(%.1f M gates/s)\n",
         kp.cx, gate_plain_cx(&c, -2), kp.single, kp.total, kp.depth, tcount, kp.total / tcount / 1e6);
  printf("  with passes: cx %ld (%.1f%% of plain), total %ld (%.1f%%), depth %ld; lowered, optimized, counted in "
         "%.2f s (%.1f M gates/s in)\n",
         ko.cx, 100.0 * ko.cx / kp.cx, ko.total, 100.0 * ko.total / kp.total, ko.depth, tcount_opt,
         kp.total / tcount_opt / 1e6);

  struct {
    const char *name;
    gate_format fmt;
    const gate_opts *o;
    const gate_counts *k;
  } runs[] = {
      {"listing, plain", GATE_FMT_LISTING, &plain, &kp},
      {"qasm3, plain", GATE_FMT_QASM3, &plain, &kp},
      {"qasm3, passes", GATE_FMT_QASM3, &opt, &ko},
  };
  double best_rate = 0;
  double *tm = xmalloc((size_t)reps * sizeof *tm);
  for (size_t r = 0; r < sizeof runs / sizeof runs[0]; r++) {
    uint64_t bytes = 0;
    for (int k = 0; k < reps; k++) {
      char *path;
      FILE *f = open_out(dir, "bench.out", &path);
      gate_meta meta = {"uccsd-100", NULL, NULL};
      t0 = util_now();
      if (gate_write(f, runs[r].fmt, &c, runs[r].o, &meta, NULL, &bytes) != 0) {
        perror("gate_write");
        return 2;
      }
      tm[k] = util_now() - t0;
      close_out(f, dir, path);
    }
    double t = util_median(tm, (size_t)reps);
    double rate = runs[r].k->total / t;
    if (r < 2 && (best_rate == 0 || rate < best_rate)) best_rate = rate;
    printf("  %-15s %11ld gates, %6.2f GB, %6.2f s (counting pass + writing pass): %6.1f M gates/s, %6.0f MB/s, "
           "goal ratio %.2f\n",
           runs[r].name, runs[r].k->total, bytes / 1e9, t, rate / 1e6, bytes / t / 1e6, rate / 1e7);
    if (runs[r].o->passes)
      printf("  %-15s (the pass runs in both passes: %.1f M plain gates lowered and optimized per second)\n", "",
             kp.total / t / 1e6);
  }
  /* baseline: the plain stream with one fprintf per gate */
  for (int k = 0; k < reps; k++) {
    char *path;
    FILE *f = open_out(dir, "naive.out", &path);
    naive_sink s = {{naive_put, naive_finish}, f};
    t0 = util_now();
    gate_stream(&c, &plain, &s.sink);
    fflush(f);
    tm[k] = util_now() - t0;
    close_out(f, dir, path);
  }
  double tn = util_median(tm, (size_t)reps);
  printf("  baseline (fprintf per gate, qasm3 lines, one pass): %.2f s: %.1f M gates/s; ours/baseline %.2f\n", tn,
         kp.total / tn / 1e6, best_rate / (kp.total / tn));
  printf("  peak memory (RSS): %.0f MB\n", util_peak_rss() / 1e6);
  printf("  goal: > 10 M gates/s written; slowest plain format: %.1f M gates/s (ratio %.2f)\n", best_rate / 1e6,
         best_rate / 1e7);
  free(tm);
  gate_counts_free(&kp);
  gate_counts_free(&ko);
  ans_circuit_free(&c);
  return 0;
}
