/* test_front_fmt.c — fmt (layout, number spelling, comments, idempotence)
 * and diff (equal meaning, changed geometry, changed pool) on in-memory
 * recipes. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <cmocka.h>

#include <math.h>

#include "test_front.h"

/* fmt of a text (NULL when it does not parse). */
static char *fmt(const char *text) {
  ft t;
  ft_init(&t);
  util_buf b = {0};
  util_buf_append(&b, "", 0);
  int rc = front_fmt(t.d, ft_text(&t, "f.cairn", text), &b);
  ft_free(&t);
  if (rc != 0) {
    util_buf_free(&b);
    return NULL;
  }
  return b.s;
}

/* fmt(text) == want, and fmt(want) == want. */
static void fmt_is(const char *text, const char *want) {
  char *once = fmt(text);
  assert_non_null(once);
  assert_string_equal(once, want);
  char *twice = fmt(once);
  assert_string_equal(twice, once);
  free(once);
  free(twice);
}

static void test_layout(void **state) {
  (void)state;
  fmt_is("cairn   1\nlet r=0.96   angstrom\n\n\n\nbasis   sto-3g\n",
         "cairn 1\nlet r = 0.96 angstrom\n\nbasis sto-3g\n");
  fmt_is("\n\npool{\n\n   singles\n doubles   paired\n\n}\n\n",
         "pool {\n  singles\n  doubles paired\n}\n");
  fmt_is("orbitals {\nfreeze   1 2\nactive orbitals 3..6  8\n}\n", "orbitals {\n  freeze 1 2\n  active orbitals 3..6 8\n}\n");
  fmt_is("let x = 2*( a+b )-  -c/d^e\n", "let x = 2*(a + b) - -c/d^e\n");
  fmt_is("optimize lbfgs   tolerance 1e-8 guess   mp2\npool {\n  excite 0 1->4 5\n}\n",
         "optimize lbfgs tolerance 1e-8 guess mp2\npool {\n  excite 0 1 -> 4 5\n}\n");
}

/* Numbers: canonical spellings that are no longer than the shortest one are
 * kept; the rest become util_fmt_double's (whole numbers: digits). */
static void test_numbers(void **state) {
  (void)state;
  fmt_is("trotter 1.0\n", "trotter 1\n");
  fmt_is("let a = 1e-08\n", "let a = 1e-8\n");
  fmt_is("let a = 1E-4\n", "let a = 0.0001\n");
  fmt_is("let a = 1e-4\n", "let a = 1e-4\n");
  fmt_is("let a = 0.50\n", "let a = 0.5\n");
  fmt_is("let a = .5\n", "let a = 0.5\n");
  fmt_is("let a = 500\n", "let a = 500\n");
  fmt_is("let a = 1e3\n", "let a = 1e3\n");
  fmt_is("let a = 0007\n", "let a = 7\n");
  fmt_is("let a = 2.50e-3\n", "let a = 0.0025\n");
  fmt_is("let a = 0.1000000000000000055511151231257827\n", "let a = 0.1\n");
  /* bit strings and basis names are kept as written */
  fmt_is("reference bits 00001111\nbasis 6-31G*\n", "reference bits 00001111\nbasis 6-31G*\n");
}

/* Atom tables: columns aligned, signs hang to the left. */
static void test_atoms(void **state) {
  (void)state;
  fmt_is("atoms angstrom {\nO 0 0 0\nH 0 r*sin(a) r*cos(a)\nH 0 -r*sin(a) r*cos(a)\n}\n",
         "atoms angstrom {\n"
         "  O  0   0         0\n"
         "  H  0   r*sin(a)  r*cos(a)\n"
         "  H  0  -r*sin(a)  r*cos(a)\n"
         "}\n");
}

/* Comments stay where they were: own-line ones at the indentation of their
 * block, trailing ones after their code, aligned with their neighbours. */
static void test_comments(void **state) {
  (void)state;
  fmt_is("# top\ncairn 1 # version\nlet a = 1   # one\nlet bb = 22 # two\npool {\n# inside\nsingles # s\n}  # end\n# last\n",
         "# top\ncairn 1      # version\nlet a = 1    # one\nlet bb = 22  # two\npool {\n  # inside\n  singles  # s\n}  # end\n"
         "# last\n");
  assert_null(fmt("let = 1\n"));
}

static front_changes diff(const char *a, const char *b) {
  ft t;
  ft_init(&t);
  ir_recipe *ra = ft_resolve(&t, "a.cairn", a), *rb = ft_resolve(&t, "b.cairn", b);
  assert_non_null(ra);
  assert_non_null(rb);
  front_changes c = {0};
  front_diff(ra, rb, &c);
  ir_recipe_free(ra);
  ir_recipe_free(rb);
  ft_free(&t);
  return c;
}

#define H2A "cairn 1\natoms {\n  H 0 0 0\n  H 0 0 0.74\n}\nbasis sto-3g\n"

static void test_diff(void **state) {
  (void)state;
  /* the same meaning written differently: bohr for angstrom (CODATA 2018),
   * defaults spelled out, a let, different layout */
  front_changes c = diff(H2A "pool {\n  doubles\n}\n",
                         "cairn 1\nlet d = 0.74 angstrom\natoms bohr {\n  H 0 0 0\n  H 0 0 d\n}\nbasis STO-3G\ncharge 0\n"
                         "multiplicity 1\nencoding jordan-wigner\nreference hartree-fock\npool {\n  doubles\n}\n"
                         "choose all\norder as written\ntrotter 1\noptimize lbfgs tolerance 1e-8 iterations 500 seed 7\n");
  assert_int_equal(c.n, 0);
  front_changes_free(&c);
  /* 0.74 angstrom = 1.398397332223... bohr: 12 digits are within the
   * tolerance of 1e-10 bohr, 8 digits are not */
  c = diff(H2A, "cairn 1\natoms bohr {\n  H 0 0 0\n  H 0 0 1.39839733222\n}\nbasis sto-3g\n");
  assert_int_equal(c.n, 0);
  front_changes_free(&c);
  c = diff(H2A, "cairn 1\natoms bohr {\n  H 0 0 0\n  H 0 0 1.3983973\n}\nbasis sto-3g\n");
  assert_int_equal(c.n, 1);
  front_changes_free(&c);
  c = diff(H2A, "cairn 1\natoms {\n  H 0 0 0\n  H 0 0 0.75\n}\nbasis sto-3g\n");
  assert_int_equal(c.n, 1);
  assert_string_equal(c.v[0].section, "geometry");
  assert_string_equal(c.v[0].item, "atom 2 (H)");
  front_changes_free(&c);
  c = diff(H2A "pool {\n  singles\n  doubles\n}\n", H2A "pool {\n  doubles paired\n  word X0 Y1\n}\n");
  assert_int_equal(c.n, 3);
  assert_int_equal(c.v[0].op, FRONT_CHANGED);
  assert_string_equal(c.v[0].before, "doubles");
  assert_string_equal(c.v[0].after, "doubles paired");
  assert_int_equal(c.v[1].op, FRONT_REMOVED);
  assert_string_equal(c.v[1].before, "singles");
  assert_int_equal(c.v[2].op, FRONT_ADDED);
  assert_string_equal(c.v[2].after, "word X0 Y1");
  front_changes_free(&c);
  c = diff(H2A "pool {\n  singles\n  doubles\n}\n", H2A "pool {\n  doubles\n  singles\n}\n");
  assert_int_equal(c.n, 1);
  assert_string_equal(c.v[0].section, "pool order");
  front_changes_free(&c);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_layout),   cmocka_unit_test(test_numbers), cmocka_unit_test(test_atoms),
      cmocka_unit_test(test_comments), cmocka_unit_test(test_diff),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
