/* chem_bench.c — the timed parts of the chemistry benchmark (make bench; run
 * by tests/bench/chem_bench.py, which repeats, takes medians and compares with
 * psi4 measured in the same run).
 *
 *   chem_bench scf BASIS "Sym x y z; ..."     basis, integrals, RHF (bohr)
 *   chem_bench exact BASIS "Sym x y z; ..."   RHF, then the exact solver on all orbitals
 *
 * Prints one JSON object: nbf, energy, the seconds of each stage, peak RSS. */
#include "config.h"

#include "cairn/basis.h"
#include "cairn/chem.h"
#include "cairn/element.h"
#include "cairn/integrals.h"
#include "cairn/scf.h"
#include "cairn/util.h"

#include <cblas.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int atoms_of(const char *txt, ir_atom **out) {
  char *copy = xstrdup(txt), *save = NULL;
  int n = 0;
  size_t cap = 0;
  ir_atom *a = NULL;
  for (char *t = strtok_r(copy, ";", &save); t; t = strtok_r(NULL, ";", &save)) {
    char sym[8];
    double x, y, z;
    if (sscanf(t, " %7s %lf %lf %lf", sym, &x, &y, &z) != 4) continue;
    UTIL_GROW(a, cap, (size_t)n + 1);
    memset(&a[n], 0, sizeof a[n]);
    a[n].z = element_z(sym, (int)strlen(sym));
    a[n].xyz[0] = x, a[n].xyz[1] = y, a[n].xyz[2] = z;
    a[n].span = DIAG_NOWHERE;
    n++;
  }
  free(copy);
  *out = a;
  return n;
}

int main(int argc, char **argv) {
  if (argc != 4 || (strcmp(argv[1], "scf") && strcmp(argv[1], "exact"))) {
    fprintf(stderr, "usage: chem_bench scf|exact BASIS \"Sym x y z; ...\"\n");
    return 2;
  }
  openblas_set_num_threads(1); /* OpenMP does the threading */
  double t0 = util_now();
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  basis_set bs;
  if (basis_load(d, argv[2], NULL, DIAG_NOWHERE, &bs) != 0) return 1;
  ir_atom *at;
  int n = atoms_of(argv[3], &at), ne = 0;
  for (int i = 0; i < n; i++) ne += at[i].z;
  int_basis ib;
  if (n == 0 || ne % 2 || int_basis_build(&bs, at, n, &ib) != 0) {
    fprintf(stderr, "chem_bench: bad geometry (closed shells only)\n");
    return 1;
  }
  scf_options o;
  scf_options_default(&o);
  scf_result r;
  if (scf_run(&ib, &bs, ne / 2, ne / 2, &o, &r) != SCF_OK) {
    fprintf(stderr, "chem_bench: SCF did not converge\n");
    return 1;
  }
  double t1 = util_now();
  printf("{\"nbf\": %d, \"hf\": %.12f, \"iterations\": %d, \"integrals_s\": %.6f, \"scf_s\": %.6f, "
         "\"total_s\": %.6f",
         r.nbf, r.energy, r.iterations, r.seconds_integrals, r.seconds_scf, t1 - t0);
  if (!strcmp(argv[1], "exact")) {
    int *act = xmalloc((size_t)r.nbf * sizeof(int));
    for (int k = 0; k < r.nbf; k++) act[k] = k;
    chem_space s;
    scf_active_space(&r, NULL, 0, act, r.nbf, ne / 2, ne / 2, &s);
    free(act);
    chem_refs refs;
    memset(&refs, 0, sizeof refs);
    chem_target t = {0, 0};
    double t2 = util_now();
    int rc = chem_exact(&s, t, d, &refs);
    double t3 = util_now();
    double ndet = 1;
    for (int k = 0; k < ne / 2; k++) ndet = ndet * (s.norb - k) / (k + 1);
    printf(", \"determinants\": %.0f, \"exact\": %.12f, \"exact_s\": %.6f", ndet * ndet, rc == 0 ? refs.exact : 0.0,
           t3 - t2);
    chem_space_free(&s);
    if (rc != 0) return 1;
  }
  printf(", \"peak_rss_mb\": %.1f}\n", (double)util_peak_rss() / 1048576.0);
  scf_result_free(&r);
  int_basis_free(&ib);
  basis_set_free(&bs);
  free(at);
  diag_free(d);
  return 0;
}
