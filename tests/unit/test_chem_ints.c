/* test_chem_ints.c — integral identities and analytic values. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "cairn/basis.h"
#include "cairn/element.h"
#include "cairn/integrals.h"
#include "cairn/util.h"

/* Boys function: F_m(0) = 1/(2m+1) (common practice); F_0(T) =
 * sqrt(pi/T) erf(sqrt T) / 2 (common practice; erf from libm); and the
 * recurrence (2m+1) F_m = 2T F_{m+1} + exp(-T) holds across the table range
 * and the asymptotic range. */
static void test_boys(void **state) {
  (void)state;
  int_boys *b = int_boys_new();
  double f[INT_BOYS_MMAX + 1];
  int_boys_eval(b, INT_BOYS_MMAX, 0.0, f);
  for (int m = 0; m <= INT_BOYS_MMAX; m++) assert_true(fabs(f[m] - 1.0 / (2 * m + 1)) < 1e-15);
  const double Ts[] = {1e-6, 0.013, 0.5, 1.7, 9.9, 24.0, 35.99, 36.01, 41.0, 120.0};
  for (size_t k = 0; k < sizeof Ts / sizeof Ts[0]; k++) {
    double T = Ts[k];
    int_boys_eval(b, INT_BOYS_MMAX, T, f);
    double f0 = 0.5 * sqrt(M_PI / T) * erf(sqrt(T));
    assert_true(fabs(f[0] - f0) <= 1e-14 * f0);
    for (int m = 0; m < INT_BOYS_MMAX; m++) {
      double lhs = (2 * m + 1) * f[m], rhs = 2 * T * f[m + 1] + exp(-T);
      assert_true(fabs(lhs - rhs) <= 1e-13 * lhs);
    }
  }
  int_boys_free(b);
}

static void molecule(const char *basis, const char *const *sym, const double (*xyz)[3], int n, basis_set *bs,
                     int_basis *ib) {
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  assert_int_equal(basis_load(d, basis, NULL, DIAG_NOWHERE, bs), 0);
  ir_atom *at = xcalloc((size_t)n, sizeof *at);
  for (int i = 0; i < n; i++) {
    at[i].z = element_z(sym[i], (int)strlen(sym[i]));
    memcpy(at[i].xyz, xyz[i], sizeof at[i].xyz);
  }
  assert_int_equal(int_basis_build(bs, at, n, ib), 0);
  free(at);
  diag_free(d);
}

/* Normalized functions: the overlap diagonal is 1 for every shipped set, in
 * cartesian (6-31G*) and spherical (cc-pVDZ) form (common practice). */
static void test_overlap_diagonal(void **state) {
  (void)state;
  const char *sym[] = {"Cl", "C", "O", "H"};
  const double xyz[][3] = {{0, 0, 0}, {0, 0, 3.3}, {0, 2.1, 4.5}, {0.3, -1.9, 4.0}};
  const char *sets[] = {"sto-3g", "6-31g", "6-31g*", "cc-pvdz"};
  for (int k = 0; k < 4; k++) {
    basis_set bs;
    int_basis ib;
    molecule(sets[k], sym, xyz, 4, &bs, &ib);
    int n = ib.nbf;
    double *S = xmalloc((size_t)n * n * sizeof(double));
    int_overlap(&ib, S);
    for (int i = 0; i < n; i++) {
      assert_true(fabs(S[i * n + i] - 1) < 1e-12);
      for (int j = 0; j < n; j++) assert_true(fabs(S[i * n + j] - S[j * n + i]) < 1e-14);
    }
    free(S);
    int_basis_free(&ib);
    basis_set_free(&bs);
  }
}

/* One normalized s Gaussian of exponent a (common practice, Gaussian product
 * theorem): kinetic 3a/2, attraction to its own nucleus of charge Z
 * -2 Z sqrt(2a/pi), self-repulsion (ss|ss) = 2 sqrt(a/pi). */
static void test_single_gaussian(void **state) {
  (void)state;
  const char *txt = "****\nHe 0\nS 1 1.00\n  0.8 1.0\n****\n";
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  basis_set bs;
  assert_int_equal(basis_parse(d, -1, txt, strlen(txt), "one", &bs), 0);
  ir_atom at = {0};
  at.z = 2;
  int_basis ib;
  assert_int_equal(int_basis_build(&bs, &at, 1, &ib), 0);
  double a = 0.8, S, T, V, g;
  int_overlap(&ib, &S);
  int_kinetic(&ib, &T);
  int_nuclear(&ib, &V);
  int_eri(&ib, 0, &g);
  assert_true(fabs(S - 1) < 1e-14);
  assert_true(fabs(T - 1.5 * a) < 1e-13);
  assert_true(fabs(V + 2 * 2 * sqrt(2 * a / M_PI)) < 1e-13);
  assert_true(fabs(g - 2 * sqrt(a / M_PI)) < 1e-13);
  int_basis_free(&ib);
  basis_set_free(&bs);
  diag_free(d);
}

/* (pq|rs) has the 8-fold symmetry of real orbitals; the Schwarz inequality
 * |(pq|rs)| <= sqrt((pq|pq)(rs|rs)) holds (common practice). */
static void test_eri_symmetry(void **state) {
  (void)state;
  const char *sym[] = {"O", "H", "H"};
  const double xyz[][3] = {{0, 0, 0}, {0, 1.43, 1.1}, {0, -1.43, 1.1}};
  basis_set bs;
  int_basis ib;
  molecule("cc-pvdz", sym, xyz, 3, &bs, &ib);
  int n = ib.nbf;
  double *g = xmalloc(int_eri_bytes(&ib));
  int_eri(&ib, 1e-14, g);
#define G(p, q, r, s) g[(((size_t)(p) * n + (q)) * n + (r)) * n + (s)]
  for (int p = 0; p < n; p += 3)
    for (int q = 0; q < n; q += 2)
      for (int r = 0; r < n; r++)
        for (int s = 0; s < n; s += 5) {
          double v = G(p, q, r, s);
          assert_true(v == G(q, p, r, s) && v == G(p, q, s, r) && v == G(r, s, p, q) && v == G(s, r, q, p));
          assert_true(fabs(v) <= sqrt(G(p, q, p, q) * G(r, s, r, s)) + 1e-12);
        }
  free(g);
  int_basis_free(&ib);
  basis_set_free(&bs);
}

/* Counting: spherical d has 5 functions, cartesian 6 (the files' lines). */
static void test_d_counts(void **state) {
  (void)state;
  const char *sym[] = {"O"};
  const double xyz[][3] = {{0, 0, 0}};
  basis_set bs;
  int_basis ib;
  molecule("cc-pvdz", sym, xyz, 1, &bs, &ib);
  assert_int_equal(ib.nbf, 14); /* [3s2p1d], spherical */
  int_basis_free(&ib);
  basis_set_free(&bs);
  molecule("6-31g*", sym, xyz, 1, &bs, &ib);
  assert_int_equal(ib.nbf, 15); /* [3s2p1d], cartesian */
  int_basis_free(&ib);
  basis_set_free(&bs);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_boys),
      cmocka_unit_test(test_overlap_diagonal),
      cmocka_unit_test(test_single_gaussian),
      cmocka_unit_test(test_eri_symmetry),
      cmocka_unit_test(test_d_counts),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
