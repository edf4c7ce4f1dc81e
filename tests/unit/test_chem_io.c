/* test_chem_io.c — basis-set files, orbital counts and the FCIDUMP reader/writer. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <cmocka.h>

#include "cairn/basis.h"
#include "cairn/chem.h"
#include "cairn/element.h"
#include "cairn/fcidump.h"
#include "cairn/util.h"

/* A one-point recipe with the given atoms (symbols only; positions do not
 * matter for counting). */
static ir_recipe *recipe(const char *basis, const char *const *syms, int n) {
  ir_recipe *r = xcalloc(1, sizeof *r);
  r->problem = IR_PROBLEM_ATOMS;
  r->natoms = n;
  r->npoints = 1;
  r->points = xcalloc(1, sizeof *r->points);
  r->points[0].atoms = xcalloc((size_t)n, sizeof(ir_atom));
  for (int i = 0; i < n; i++) {
    r->points[0].atoms[i].z = element_z(syms[i], (int)strlen(syms[i]));
    r->points[0].atoms[i].span = DIAG_NOWHERE;
  }
  r->basis_name = xstrdup(basis);
  r->basis_span = DIAG_NOWHERE;
  return r;
}

static void recipe_free(ir_recipe *r) {
  free(r->points[0].atoms);
  free(r->points);
  free(r->basis_name);
  free(r);
}

/* Basis-function counts of water: common practice (STO-3G 7; 6-31G 13;
 * 6-31G* with cartesian d 19; cc-pVDZ with spherical d 24 — psi4 reports the
 * same nbf for these sets). */
static void test_water_counts(void **state) {
  (void)state;
  const char *w[] = {"O", "H", "H"};
  struct { const char *name; int n; } cases[] = {
      {"sto-3g", 7}, {"STO-3G", 7}, {"6-31g", 13}, {"6-31g*", 19}, {"6-31GS", 19}, {"cc-pvdz", 24}};
  for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
    diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
    ir_recipe *r = recipe(cases[i].name, w, 3);
    assert_int_equal(chem_count_orbitals(r, d), cases[i].n);
    assert_int_equal(diag_errors(d), 0);
    recipe_free(r);
    diag_free(d);
  }
}

/* Every shipped set covers H-Ar; argon in cc-pVDZ has 4s3p1d = 18 functions
 * (common practice: [4s3p1d] contraction for Al-Ar). */
static void test_coverage(void **state) {
  (void)state;
  const char *names[] = {"sto-3g", "6-31g", "6-31g*", "cc-pvdz"};
  for (int i = 0; i < 4; i++) {
    diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
    basis_set b;
    assert_int_equal(basis_load(d, names[i], NULL, DIAG_NOWHERE, &b), 0);
    for (int z = 1; z <= 18; z++) assert_true(basis_element_size(&b, z) > 0);
    assert_int_equal(basis_element_size(&b, 19), 0);
    if (i == 3) assert_int_equal(basis_element_size(&b, 18), 18);
    basis_set_free(&b);
    diag_free(d);
  }
}

static void test_unknown_element_and_set(void **state) {
  (void)state;
  FILE *sink = fopen("/dev/null", "w");
  diag_ctx *d = diag_new(sink, DIAG_COLOR_NEVER);
  const char *k[] = {"K", "H"};
  ir_recipe *r = recipe("sto-3g", k, 2);
  assert_int_equal(chem_count_orbitals(r, d), -1);
  assert_int_equal(diag_errors(d), 1);
  recipe_free(r);
  const char *h[] = {"H"};
  r = recipe("sto-4g", h, 1);
  assert_int_equal(chem_count_orbitals(r, d), -1);
  assert_int_equal(diag_errors(d), 2);
  recipe_free(r);
  diag_free(d);
  fclose(sink);
}

/* SP shells split into S and P with shared exponents; the scale factor
 * multiplies exponents by its square (Gaussian-94 convention). */
static void test_parse_sp_and_scale(void **state) {
  (void)state;
  const char *txt = "! test\ncartesian\n****\nC 0\nS 1 2.0\n  1.5 1.0\nSP 2 1.00\n  3.0D+00 0.5 0.25\n"
                    "  0.5 0.5 0.75\nD 1 1.0\n 0.8 1.0\n****\n";
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  basis_set b;
  assert_int_equal(basis_parse(d, -1, txt, strlen(txt), "t", &b), 0);
  assert_int_equal(b.spherical, 0);
  assert_int_equal(b.elem[6].nshells, 4);
  assert_true(b.elem[6].shells[0].exps[0] == 6.0);
  assert_int_equal(b.elem[6].shells[1].l, 0);
  assert_int_equal(b.elem[6].shells[2].l, 1);
  assert_true(b.elem[6].shells[2].exps[0] == 3.0);
  assert_true(b.elem[6].shells[2].coefs[1] == 0.75);
  assert_int_equal(basis_element_size(&b, 6), 1 + 1 + 3 + 6);
  basis_set_free(&b);
  diag_free(d);
}

static char *tmpdir_path(char *dir, const char *name) {
  return xasprintf("%s/%s", dir, name);
}

/* Knowles & Handy layout: write a small space, read it back, same numbers. */
static void test_fcidump_round_trip(void **state) {
  (void)state;
  chem_space s = {0};
  int n = 3;
  s.norb = n;
  s.nalpha = 2;
  s.nbeta = 1;
  s.e_constant = 1.25;
  s.h1 = xcalloc(9, sizeof(double));
  s.h2 = xcalloc(81, sizeof(double));
  util_rng g;
  util_rng_seed(&g, 11);
  for (int p = 0; p < n; p++)
    for (int q = 0; q <= p; q++) s.h1[p * n + q] = s.h1[q * n + p] = util_rng_uniform(&g) - 0.5;
  for (int p = 0; p < n; p++)
    for (int q = 0; q < n; q++)
      for (int r = 0; r < n; r++)
        for (int t = 0; t < n; t++) {
          int a = p > q ? p : q, b = p > q ? q : p, c = r > t ? r : t, e = r > t ? t : r;
          int ab = a * (a + 1) / 2 + b, ce = c * (c + 1) / 2 + e;
          int hi = ab > ce ? ab : ce, lo = ab > ce ? ce : ab;
          s.h2[chem_h2_index(n, p, q, r, t)] = 0.01 * (hi * 7 + lo) + 1e-3 / 3.0;
        }
  char dir[] = "/tmp/cairn-chem-XXXXXX";
  assert_non_null(mkdtemp(dir));
  char *path = tmpdir_path(dir, "x.fcidump");
  assert_int_equal(chem_fcidump_write(&s, path), 0);
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  chem_space t;
  assert_int_equal(fcidump_read(d, path, DIAG_NOWHERE, &t), 0);
  assert_int_equal(t.norb, 3);
  assert_int_equal(t.nalpha, 2);
  assert_int_equal(t.nbeta, 1);
  assert_true(t.e_constant == s.e_constant);
  assert_null(t.orbital_energies);
  assert_memory_equal(t.h1, s.h1, 9 * sizeof(double));
  assert_memory_equal(t.h2, s.h2, 81 * sizeof(double));
  int norb, nelec, ms2;
  assert_int_equal(chem_fcidump_header(path, DIAG_NOWHERE, d, &norb, &nelec, &ms2), 0);
  assert_int_equal(norb, 3);
  assert_int_equal(nelec, 3);
  assert_int_equal(ms2, 1);
  /* writing twice gives the same bytes */
  char *p2 = tmpdir_path(dir, "y.fcidump");
  assert_int_equal(chem_fcidump_write(&t, p2), 0);
  size_t l1, l2;
  char *a = util_read_file(path, &l1), *b = util_read_file(p2, &l2);
  assert_int_equal(l1, l2);
  assert_memory_equal(a, b, l1);
  free(a);
  free(b);
  unlink(path);
  unlink(p2);
  rmdir(dir);
  free(path);
  free(p2);
  chem_space_free(&s);
  chem_space_free(&t);
  diag_free(d);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_water_counts),
      cmocka_unit_test(test_coverage),
      cmocka_unit_test(test_unknown_element_and_set),
      cmocka_unit_test(test_parse_sp_and_scale),
      cmocka_unit_test(test_fcidump_round_trip),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
