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
#include "../support/testbench.h"
#include "../support/testdata.h"
#include "../support/testref.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

static const ir_encoding ENCODINGS[3] = {IR_ENC_JORDAN_WIGNER, IR_ENC_BRAVYI_KITAEV, IR_ENC_PARITY};

typedef struct result {
  size_t terms;
  double seconds;   /* median */
  double peak_mb;
} result;

/* Random integrals with the 8-fold symmetry (invented data;
 * tests/support/testdata.c), norb / 4 electrons of each spin. */
static void random_space(chem_space *s, int norb, uint64_t seed) {
  const testdata_scales k = {.h1 = 1.0, .h2 = 0.2};
  util_rng r;
  util_rng_seed(&r, seed);
  testdata_space(s, norb, norb / 4, norb / 4, &k, &r);
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
    if (generic) testref_hamiltonian(s, enc, 1 << 16, &h); /* tests/support/testref.c */
    else qubit_hamiltonian(s, enc, &h);
    t[k] = util_now() - t0;
    r.terms = h.len;
    pauli_sum_free(&h);
    qubit_encoder_free(enc);
  }
  r.seconds = util_median(t, (size_t)reps);
  r.peak_mb = (double)util_peak_rss() / (1024.0 * 1024.0);
  return r;
}

/* One case; the space is made in the child too (from file or random). */
typedef struct spec {
  const char *file;  /* FCIDUMP, or NULL for random */
  int norb;
  ir_encoding e;
  int reps, generic;
} spec;

/* One case (testbench_in_child): arg is a spec, out a result. */
static void child_case(void *arg, void *out) {
  const spec *sp = arg;
  chem_space s;
  if (sp->file) {
    diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
    memset(&s, 0, sizeof s);
    if (fcidump_read(d, sp->file, DIAG_NOWHERE, &s) != 0) _exit(1);
    diag_free(d);
  } else {
    random_space(&s, sp->norb, 2024);
  }
  *(result *)out = run_case(&s, sp->e, sp->reps, sp->generic);
  chem_space_free(&s);
}

/* Run one case in a child so its peak RSS is measured alone. */
static int run_child(const spec *sp, result *out) {
  return testbench_in_child(child_case, (void *)sp, out, sizeof *out);
}

int main(int argc, char **argv) {
  const char *file = argc > 1 ? argv[1] : NULL;
  int fail = 0;
  printf("qubit Hamiltonian build (closed-form Jordan-Wigner route, then the Clifford map)\n");
  printf("%-34s %-14s %10s %10s %10s %8s\n", "case", "encoding", "terms", "seconds", "peak MiB", "goal");
  /* the FCIDUMP file's space (goal 2 s), then 50 random orbitals (goal 60 s within 8 GiB) */
  const struct {
    const char *file, *name;
    int norb;
    double goal_s, goal_mb; /* goal_mb 0: no memory goal */
  } cases[2] = {{file, "FCIDUMP (median of 3)", 0, 2.0, 0},
                {NULL, "random 50 orbitals (median of 3)", 50, 60.0, 8192.0}};
  for (int c = 0; c < 2; c++) {
    if (c == 0 && !file) continue;
    for (int k = 0; k < 3; k++) {
      spec sp = {cases[c].file, cases[c].norb, ENCODINGS[k], 3, 0};
      result r;
      if (run_child(&sp, &r) != 0) {
        fprintf(stderr, "qubit_bench: case failed\n");
        return 1;
      }
      printf("%-34s %-14s %10zu %10.3f %10.1f %7.3fx\n", cases[c].name, qubit_encoding_name(ENCODINGS[k]), r.terms,
             r.seconds, r.peak_mb, r.seconds / cases[c].goal_s);
      if (r.seconds > cases[c].goal_s || (cases[c].goal_mb > 0 && r.peak_mb > cases[c].goal_mb)) fail = 1;
    }
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
