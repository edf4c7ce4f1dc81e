/* qubit_bench.c — how fast the qubit Hamiltonian is built.
 *
 *   qubit_bench [FILE.fcidump]
 *
 * Cases, each in its own child process so its peak memory is its own:
 *   - the FCIDUMP file's active space (the bench script gives a 20-orbital,
 *     40-qubit one written by psi4), every encoding, median of 3;
 *   - 50 orbitals (100 qubits) of random integrals with the 8-fold
 *     permutational symmetry (fixed seed; invented data), every encoding,
 *     median of 3;
 *   - baseline, measured in the same run: the generic route (every integral
 *     expanded as a product of ladder operators into a hash accumulator)
 *     against the closed-form route on 12 random orbitals (24 qubits).
 * Goals (issue 4): 40 qubits under 2 s, 100 qubits under 60 s within 8 GiB.
 */
#include "config.h"

#include "cairn/diag.h"
#include "cairn/fcidump.h"
#include "cairn/qubit.h"
#include "cairn/util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/wait.h>
#include <unistd.h>

static const ir_encoding ENCODINGS[3] = {IR_ENC_JORDAN_WIGNER, IR_ENC_BRAVYI_KITAEV, IR_ENC_PARITY};

typedef struct result {
  size_t terms;
  double seconds;   /* median */
  double peak_mb;
} result;

static void random_space(chem_space *s, int norb, uint64_t seed) {
  memset(s, 0, sizeof *s);
  s->norb = norb;
  s->nalpha = s->nbeta = norb / 4;
  s->h1 = xcalloc((size_t)norb * norb, sizeof(double));
  s->h2 = xcalloc((size_t)norb * norb * norb * norb, sizeof(double));
  util_rng r;
  util_rng_seed(&r, seed);
  for (int p = 0; p < norb; p++)
    for (int q = 0; q <= p; q++) s->h1[p * norb + q] = s->h1[q * norb + p] = util_rng_uniform(&r) - 0.5;
  for (int p = 0; p < norb; p++)
    for (int q = 0; q <= p; q++)
      for (int a = 0; a < norb; a++)
        for (int b = 0; b <= a; b++) {
          if (p * (p + 1) / 2 + q < a * (a + 1) / 2 + b) continue;
          double v = 0.2 * (util_rng_uniform(&r) - 0.5);
          int idx[8][4] = {{p, q, a, b}, {q, p, a, b}, {p, q, b, a}, {q, p, b, a},
                           {a, b, p, q}, {b, a, p, q}, {a, b, q, p}, {b, a, q, p}};
          for (int k = 0; k < 8; k++) s->h2[chem_h2_index(norb, idx[k][0], idx[k][1], idx[k][2], idx[k][3])] = v;
        }
}

static int cmp_double(const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return x < y ? -1 : x > y;
}

/* The generic route: every integral as a ladder-operator product. */
static void generic_hamiltonian(const chem_space *s, const qubit_encoder *enc, pauli_sum *out) {
  int nq = 2 * s->norb, no = s->norb;
  pauli_acc *acc = pauli_acc_new(nq, 1 << 16);
  uint64_t zero[2] = {0, 0};
  pauli_acc_add(acc, zero, zero, s->e_constant);
  for (int P = 0; P < nq; P++)
    for (int Q = 0; Q < nq; Q++) {
      if ((P ^ Q) & 1) continue;
      qubit_ladder ops[2] = {{P, 1}, {Q, 0}};
      qubit_encoder_add_product(enc, ops, 2, s->h1[(P / 2) * no + Q / 2], acc);
    }
  for (int P = 0; P < nq; P++)
    for (int Q = 0; Q < nq; Q++)
      for (int R = 0; R < nq; R++)
        for (int S = 0; S < nq; S++) {
          if (((P ^ Q) & 1) || ((R ^ S) & 1)) continue;
          double g = s->h2[chem_h2_index(no, P / 2, Q / 2, R / 2, S / 2)];
          if (g == 0) continue;
          qubit_ladder ops[4] = {{P, 1}, {R, 1}, {S, 0}, {Q, 0}};
          qubit_encoder_add_product(enc, ops, 4, 0.5 * g, acc);
        }
  pauli_acc_finish(acc, out, 1e-14);
}

/* Build H `reps` times in encoding e (in this process); median seconds. */
static result run_case(const chem_space *s, ir_encoding e, int reps, int generic) {
  result r = {0};
  double t[5];
  for (int k = 0; k < reps; k++) {
    qubit_encoder *enc = qubit_encoder_new(e, 2 * s->norb);
    pauli_sum h;
    pauli_sum_init(&h, 2 * s->norb);
    double t0 = util_now();
    if (generic) generic_hamiltonian(s, enc, &h);
    else qubit_hamiltonian(s, enc, &h);
    t[k] = util_now() - t0;
    r.terms = h.len;
    pauli_sum_free(&h);
    qubit_encoder_free(enc);
  }
  qsort(t, (size_t)reps, sizeof t[0], cmp_double);
  r.seconds = t[reps / 2];
  r.peak_mb = (double)util_peak_rss() / (1024.0 * 1024.0);
  return r;
}

/* Run one case in a child so its peak RSS is measured alone.  The space is
 * made in the child too (from file or random). */
typedef struct spec {
  const char *file;  /* FCIDUMP, or NULL for random */
  int norb;
  ir_encoding e;
  int reps, generic;
} spec;

static int run_child(const spec *sp, result *out) {
  int fd[2];
  if (pipe(fd) != 0) return -1;
  pid_t pid = fork();
  if (pid < 0) return -1;
  if (pid == 0) {
    close(fd[0]);
    chem_space s;
    if (sp->file) {
      diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
      memset(&s, 0, sizeof s);
      if (fcidump_read(d, sp->file, DIAG_NOWHERE, &s) != 0) _exit(1);
      diag_free(d);
    } else {
      random_space(&s, sp->norb, 2024);
    }
    result r = run_case(&s, sp->e, sp->reps, sp->generic);
    ssize_t wr = write(fd[1], &r, sizeof r);
    chem_space_free(&s);
    _exit(wr == (ssize_t)sizeof r ? 0 : 1);
  }
  close(fd[1]);
  ssize_t got = read(fd[0], out, sizeof *out);
  close(fd[0]);
  int st = 0;
  waitpid(pid, &st, 0);
  return got == (ssize_t)sizeof *out && WIFEXITED(st) && WEXITSTATUS(st) == 0 ? 0 : -1;
}

int main(int argc, char **argv) {
  const char *file = argc > 1 ? argv[1] : NULL;
  int fail = 0;
  printf("qubit Hamiltonian build (closed-form Jordan-Wigner route, then the Clifford map)\n");
  printf("%-34s %-14s %10s %10s %10s %8s\n", "case", "encoding", "terms", "seconds", "peak MiB", "goal");
  if (file) {
    for (int k = 0; k < 3; k++) {
      spec sp = {file, 0, ENCODINGS[k], 3, 0};
      result r;
      if (run_child(&sp, &r) != 0) {
        fprintf(stderr, "qubit_bench: case failed\n");
        return 1;
      }
      printf("%-34s %-14s %10zu %10.3f %10.1f %7.3fx\n", "FCIDUMP (median of 3)", qubit_encoding_name(ENCODINGS[k]),
             r.terms, r.seconds, r.peak_mb, r.seconds / 2.0);
      if (r.seconds > 2.0) fail = 1;
    }
  }
  for (int k = 0; k < 3; k++) {
    spec sp = {NULL, 50, ENCODINGS[k], 3, 0};
    result r;
    if (run_child(&sp, &r) != 0) {
      fprintf(stderr, "qubit_bench: case failed\n");
      return 1;
    }
    printf("%-34s %-14s %10zu %10.3f %10.1f %7.3fx\n", "random 50 orbitals (median of 3)", qubit_encoding_name(ENCODINGS[k]),
           r.terms, r.seconds, r.peak_mb, r.seconds / 60.0);
    if (r.seconds > 60.0 || r.peak_mb > 8192.0) fail = 1;
  }
  /* baseline: the generic ladder-operator route on 24 qubits */
  spec fast = {NULL, 12, IR_ENC_JORDAN_WIGNER, 3, 0}, slow = {NULL, 12, IR_ENC_JORDAN_WIGNER, 1, 1};
  result rf, rs;
  if (run_child(&fast, &rf) != 0 || run_child(&slow, &rs) != 0) {
    fprintf(stderr, "qubit_bench: baseline failed\n");
    return 1;
  }
  printf("baseline, random 12 orbitals (24 qubits), jordan-wigner:\n");
  printf("  generic ladder products %zu terms %.3f s; closed form (median of 3) %zu terms %.3f s; speedup %.1fx\n",
         rs.terms, rs.seconds, rf.terms, rf.seconds, rs.seconds / rf.seconds);
  if (rs.terms != rf.terms) {
    printf("  the two routes disagree on the number of terms\n");
    fail = 1;
  }
  printf("goal column: seconds / goal (40 qubits: 2 s; 100 qubits: 60 s within 8 GiB); %s\n",
         fail ? "A GOAL IS MISSED" : "all goals met");
  return fail;
}
