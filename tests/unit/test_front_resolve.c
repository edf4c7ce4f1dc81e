/* test_front_resolve.c — AST -> IR: units, geometry, scans, the orbital
 * space (with the real basis-set counts of the chem module), pool rules,
 * defaults, `use`, and the errors that must stop a recipe. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <cmocka.h>

#include <math.h>

#include "cairn/ir.h"
#include "test_front.h"

/* CODATA 2018: 1 bohr = 0.529177210903 angstrom. */
#define BOHR_IN_ANGSTROM 0.529177210903

static ir_recipe *ok(ft *t, const char *text) {
  ir_recipe *r = ft_resolve(t, "r.cairn", text);
  if (!r) fprintf(stderr, "unexpected errors:\n%s", ft_messages(t));
  assert_non_null(r);
  return r;
}

/* Resolving must fail with a message containing `want`. */
static void fails(const char *text, const char *want) {
  ft t;
  ft_init(&t);
  ir_recipe *r = ft_resolve(&t, "r.cairn", text);
  if (r || !strstr(ft_messages(&t), want)) fprintf(stderr, "wanted `%s`, got:\n%s", want, ft_messages(&t));
  assert_null(r);
  assert_non_null(strstr(ft_messages(&t), want));
  ft_free(&t);
}

#define H2 "cairn 1\natoms {\n  H 0 0 0\n  H 0 0 0.74\n}\nbasis sto-3g\n"

/* Units: 1 angstrom = 1/0.529177210903 bohr (CODATA 2018); bohr blocks are
 * taken as written. */
static void test_units(void **state) {
  (void)state;
  ft t;
  ft_init(&t);
  ir_recipe *r = ok(&t, "cairn 1\natoms {\n  H 0 0 0\n  H 0 0 1\n}\nbasis sto-3g\n");
  assert_int_equal(r->natoms, 2);
  assert_int_equal(r->npoints, 1);
  assert_true(fabs(r->points[0].atoms[1].xyz[2] - 1 / BOHR_IN_ANGSTROM) < 1e-15);
  assert_string_equal(r->points[0].atoms[1].symbol, "H");
  assert_int_equal(r->points[0].atoms[1].z, 1);
  ir_recipe_free(r);
  r = ok(&t, "cairn 1\natoms bohr {\n  H 0 0 0\n  H 0 0 1.4\n}\nbasis sto-3g\n");
  assert_true(r->points[0].atoms[1].xyz[2] == 1.4);
  ir_recipe_free(r);
  /* explicit units inside a block override it; 100 pm = 1 angstrom */
  r = ok(&t, "cairn 1\nlet d = 100 * 0.01 angstrom\natoms bohr {\n  H 0 0 0\n  H 0 0 d\n}\nbasis sto-3g\n");
  assert_true(fabs(r->points[0].atoms[1].xyz[2] - 1 / BOHR_IN_ANGSTROM) < 1e-14);
  ir_recipe_free(r);
  ft_free(&t);
}

/* Water from a bond length and half the angle, as in DESIGN.md:
 * y = r sin(52.25 deg), z = r cos(52.25 deg). */
static void test_angles(void **state) {
  (void)state;
  ft t;
  ft_init(&t);
  ir_recipe *r = ok(&t,
                    "cairn 1\nlet r = 0.96 angstrom\natoms angstrom {\n  O 0 0 0\n  H 0 r*sin(52.25 deg) r*cos(52.25 deg)\n"
                    "  H 0 -r*sin(0.911934 rad) r*cos(104.5 deg / 2)\n}\nbasis sto-3g\n");
  double y = 0.96 / BOHR_IN_ANGSTROM * sin(52.25 * M_PI / 180), z = 0.96 / BOHR_IN_ANGSTROM * cos(52.25 * M_PI / 180);
  const ir_atom *a = r->points[0].atoms;
  assert_true(fabs(a[1].xyz[1] - y) < 1e-14 && fabs(a[1].xyz[2] - z) < 1e-14);
  /* 0.911934 rad is 52.25 deg to 6 digits */
  assert_true(fabs(a[2].xyz[1] + y) < 1e-6 && fabs(a[2].xyz[2] - z) < 1e-14);
  /* the O-H distance is the bond length */
  assert_true(fabs(hypot(a[1].xyz[1], a[1].xyz[2]) - 0.96 / BOHR_IN_ANGSTROM) < 1e-13);
  ir_recipe_free(r);
  ft_free(&t);
}

/* A scan over a let: bare numbers take the let's unit; 0.8..2.6 by 0.2 is
 * 10 points with both ends included. */
static void test_scan(void **state) {
  (void)state;
  ft t;
  ft_init(&t);
  ir_recipe *r = ok(&t, "cairn 1\nlet r = 0.96 angstrom\nvary r from 0.8 to 2.6 step 0.2\natoms {\n  O 0 0 0\n"
                        "  H 0 0 r\n  H 0 r 0\n}\nbasis sto-3g\n");
  assert_int_equal(r->scan.active, 1);
  assert_string_equal(r->scan.name, "r");
  assert_int_equal(r->scan.unit, IR_UNIT_ANGSTROM);
  assert_int_equal(r->npoints, 10);
  assert_true(r->points[0].param == 0.8);
  assert_true(r->points[9].param == 2.6);
  assert_true(fabs(r->points[9].atoms[1].xyz[2] - 2.6 / BOHR_IN_ANGSTROM) < 1e-14);
  assert_true(fabs(r->points[3].atoms[2].xyz[1] - 1.4 / BOHR_IN_ANGSTROM) < 1e-14);
  ir_recipe_free(r);
  /* a new name: bare, so it takes the atoms block's unit (bohr here); a
   * downward scan with a negative step */
  r = ok(&t, "cairn 1\nvary d from 3 to 1 step -0.5\natoms bohr {\n  H 0 0 0\n  H 0 0 d\n}\nbasis sto-3g\n");
  assert_int_equal(r->npoints, 5);
  assert_int_equal(r->scan.unit, IR_UNIT_NONE);
  assert_true(r->points[4].atoms[1].xyz[2] == 1.0);
  ir_recipe_free(r);
  /* a let that depends on the scan is recomputed at each point */
  r = ok(&t, "cairn 1\nvary x from 1 to 2 step 1\nlet h = (x / 2) angstrom\natoms angstrom {\n  H 0 0 -h\n  H 0 0 h\n}\n"
             "basis sto-3g\n");
  assert_int_equal(r->npoints, 2);
  assert_true(fabs(r->points[1].atoms[1].xyz[2] - 1 / BOHR_IN_ANGSTROM) < 1e-14);
  ir_recipe_free(r);
  ft_free(&t);
  fails("cairn 1\nvary r from 1 to 2 step 0\natoms {\n  H 0 0 0\n  H 0 0 r\n}\nbasis sto-3g\n", "step of the scan is zero");
  fails("cairn 1\nvary r from 2 to 1 step 0.1\natoms {\n  H 0 0 0\n  H 0 0 r\n}\nbasis sto-3g\n", "scan is empty");
  fails("cairn 1\nvary n from 1 to 2 step 1\nlet m = n + 1\n" H2 "trotter m\n", "varies over the scan");
}

/* Water, STO-3G: 7 orbitals (O 1s 2s 2p, two H 1s); `freeze core` freezes O 1s;
 * 4 electrons in 4 orbitals leave (10 - 2 - 4)/2 = 2 inactive orbitals, so
 * the core is orbitals 1..3 and the active orbitals 4..7 (common practice for
 * counting; the basis sizes come from chem_count_orbitals). */
static void test_water_space(void **state) {
  (void)state;
  ft t;
  ft_init(&t);
  ir_recipe *r = ok(&t, "cairn 1\natoms {\n  O 0 0 0\n  H 0 0.757 0.587\n  H 0 -0.757 0.587\n}\nbasis sto-3g\n"
                        "orbitals {\n  freeze core\n  active 4 electrons in 4 orbitals\n}\n");
  const ir_orbitals *o = &r->orbitals;
  assert_int_equal(r->nelectrons, 10);
  assert_int_equal(r->multiplicity, 1);
  assert_int_equal(o->norbitals, 7);
  assert_int_equal(o->freeze, IR_FREEZE_CORE);
  assert_int_equal(o->ncore, 3);
  assert_int_equal(o->core[0], 0);
  assert_int_equal(o->core[2], 2);
  assert_int_equal(o->nactive, 4);
  assert_int_equal(o->active[0], 3);
  assert_int_equal(o->active[3], 6);
  assert_int_equal(o->nelec_active, 4);
  assert_int_equal(o->nalpha, 2);
  assert_int_equal(o->nbeta, 2);
  assert_int_equal(ir_qubits(r), 8);
  ir_recipe_free(r);
  /* the same space written as a list */
  r = ok(&t, "cairn 1\natoms {\n  O 0 0 0\n  H 0 0.757 0.587\n  H 0 -0.757 0.587\n}\nbasis sto-3g\n"
             "orbitals {\n  freeze 1\n  active orbitals 4..7\n}\n");
  assert_int_equal(r->orbitals.ncore, 3);
  assert_int_equal(r->orbitals.nactive, 4);
  assert_int_equal(r->orbitals.nelec_active, 4);
  ir_recipe_free(r);
  /* 6-31G: O has 9 functions, H 2 each: 13 orbitals; all but O 1s active */
  r = ok(&t, "cairn 1\natoms {\n  O 0 0 0\n  H 0 0.757 0.587\n  H 0 -0.757 0.587\n}\nbasis 6-31g\n"
             "orbitals {\n  freeze core\n}\n");
  assert_int_equal(r->orbitals.norbitals, 13);
  assert_int_equal(r->orbitals.nactive, 12);
  assert_int_equal(r->orbitals.nelec_active, 8);
  ir_recipe_free(r);
  ft_free(&t);
}

/* Open shells: OH radical, 9 electrons, doublet: 5 alpha, 4 beta. */
static void test_open_shell(void **state) {
  (void)state;
  ft t;
  ft_init(&t);
  ir_recipe *r = ok(&t, "cairn 1\natoms {\n  O 0 0 0\n  H 0 0 0.97\n}\nmultiplicity 2\nbasis sto-3g\n"
                        "orbitals {\n  freeze core\n  active 3 electrons in 3 orbitals\n}\n");
  assert_int_equal(r->nelectrons, 9);
  assert_int_equal(r->orbitals.norbitals, 6);
  assert_int_equal(r->orbitals.ncore, 3);
  assert_int_equal(r->orbitals.nalpha, 2);
  assert_int_equal(r->orbitals.nbeta, 1);
  ir_recipe_free(r);
  ft_free(&t);
  fails("cairn 1\natoms {\n  O 0 0 0\n  H 0 0 0.97\n}\nbasis sto-3g\n", "cannot be a singlet");
  fails("cairn 1\natoms {\n  O 0 0 0\n  H 0 0 0.97\n}\nmultiplicity 3\nbasis sto-3g\n", "does not fit 9 electrons");
  fails("cairn 1\natoms {\n  O 0 0 0\n  H 0 0 0.97\n}\nmultiplicity 2\nbasis sto-3g\n"
        "orbitals {\n  active orbitals 3 4 6\n}\n",
        "orbital 5 holds an unpaired electron");
}

/* What a recipe gets when it says nothing (decisions of the front end). */
static void test_defaults(void **state) {
  (void)state;
  ft t;
  ft_init(&t);
  ir_recipe *r = ok(&t, H2);
  assert_int_equal(r->version, 1);
  assert_int_equal(r->problem, IR_PROBLEM_ATOMS);
  assert_int_equal(r->charge, 0);
  assert_int_equal(r->multiplicity, 1);
  assert_string_equal(r->basis_name, "sto-3g");
  assert_int_equal(r->encoding, IR_ENC_JORDAN_WIGNER);
  assert_int_equal(r->taper, 0);
  assert_int_equal(r->reference.kind, IR_REF_HARTREE_FOCK);
  assert_int_equal(r->choose.kind, IR_CHOOSE_ALL);
  assert_int_equal(r->order, IR_ORDER_WRITTEN);
  assert_int_equal(r->trotter, 1);
  assert_int_equal(r->optimize.method, IR_OPT_LBFGS);
  assert_true(r->optimize.tolerance == 1e-8);
  assert_int_equal(r->optimize.iterations, 500);
  assert_int_equal(r->optimize.starts, 1);
  assert_int_equal(r->optimize.seed, 7);
  assert_int_equal(r->optimize.guess, IR_GUESS_ZEROS);
  for (int k = 0; k < IR_SYM_COUNT; k++) assert_int_equal(r->keep[k].policy, IR_KEEP_NONE);
  assert_int_equal(r->orbitals.active_kind, IR_ACTIVE_ALL);
  assert_int_equal(r->orbitals.nactive, 2);
  assert_int_equal(r->nrules, 0);
  assert_int_equal(r->nemits, 0);
  assert_true(r->scan.span.file < 0 && r->basis_span.file >= 0);
  ir_recipe_free(r);
  ft_free(&t);
}

static void test_pool_and_settings(void **state) {
  (void)state;
  ft t;
  ft_init(&t);
  ir_recipe *r = ok(&t, H2 "encoding bravyi-kitaev taper\nreference bits 1100\nkeep particles exactly\n"
                           "keep spin-squared penalty 0.5\npool {\n  singles spin-adapted generalized\n"
                           "  doubles paired\n  qubit doubles\n  entanglers\n  word Z3 X0\n  word XIYZ\n"
                           "  excite 0 1 -> 2 3\n}\nchoose gradient above 1e-4\norder by gradient\ntrotter 3\n"
                           "optimize nelder-mead tolerance 1e-6 iterations 20 starts 4 seed 11 guess mp2\n"
                           "emit listing \"out/h2.gates\"\nemit qasm3 \"h2.qasm\"\n");
  assert_int_equal(r->encoding, IR_ENC_BRAVYI_KITAEV);
  assert_int_equal(r->taper, 1);
  assert_int_equal(r->reference.kind, IR_REF_BITS);
  assert_string_equal(r->reference.bits, "1100");
  assert_int_equal(r->keep[IR_SYM_PARTICLES].policy, IR_KEEP_EXACTLY);
  assert_int_equal(r->keep[IR_SYM_SPIN_SQUARED].policy, IR_KEEP_PENALTY);
  assert_true(r->keep[IR_SYM_SPIN_SQUARED].value == 0.5);
  assert_int_equal(r->nrules, 7);
  assert_int_equal(r->rules[0].kind, IR_RULE_SINGLES);
  assert_int_equal(r->rules[0].options, IR_OPT_SPIN_ADAPTED | IR_OPT_GENERALIZED);
  assert_int_equal(r->rules[1].options, IR_OPT_PAIRED);
  assert_int_equal(r->rules[2].kind, IR_RULE_QUBIT_DOUBLES);
  assert_int_equal(r->rules[3].kind, IR_RULE_ENTANGLERS);
  assert_int_equal(r->rules[4].kind, IR_RULE_WORD);
  assert_int_equal(r->rules[4].nletters, 2);
  assert_int_equal(r->rules[4].letters[0].qubit, 0);
  assert_int_equal(r->rules[4].letters[0].letter, 'X');
  assert_int_equal(r->rules[4].letters[1].qubit, 3);
  assert_int_equal(r->rules[4].letters[1].letter, 'Z');
  assert_int_equal(r->rules[5].nletters, 3); /* dense XIYZ: X0 Y2 Z3 */
  assert_int_equal(r->rules[5].letters[1].qubit, 2);
  assert_int_equal(r->rules[6].kind, IR_RULE_EXCITE);
  assert_int_equal(r->rules[6].nexcite, 2);
  assert_int_equal(r->rules[6].from[1], 1);
  assert_int_equal(r->rules[6].to[0], 2);
  assert_int_equal(r->choose.kind, IR_CHOOSE_ABOVE);
  assert_true(r->choose.threshold == 1e-4);
  assert_int_equal(r->order, IR_ORDER_GRADIENT);
  assert_int_equal(r->trotter, 3);
  assert_int_equal(r->optimize.method, IR_OPT_NELDER_MEAD);
  assert_int_equal(r->optimize.starts, 4);
  assert_int_equal(r->optimize.seed, 11);
  assert_int_equal(r->optimize.guess, IR_GUESS_MP2);
  assert_int_equal(r->nemits, 2);
  assert_string_equal(r->emits[0].path, "out/h2.gates");
  assert_int_equal(r->emits[1].format, IR_EMIT_QASM3);
  ir_recipe_free(r);
  ft_free(&t);
  fails(H2 "pool {\n  word X0 X4\n}\n", "qubit 4 is beyond the register");
  fails(H2 "pool {\n  word X0 X0\n}\n", "qubit 0 appears twice");
  fails(H2 "pool {\n  excite 0 4 -> 2 3\n}\n", "spin orbital 4 is beyond the register");
  fails(H2 "pool {\n  doubles spin-adapted\n}\n", "`doubles` takes: generalized, paired");
  fails(H2 "reference bits 110\n", "the reference has 3 bits but the register has 4 qubits");
}

/* `use`: paths relative to the including file, read once, cycles refused. */
static void test_use(void **state) {
  (void)state;
  ft t;
  ft_init(&t);
  static const char *const files[] = {
      "dir/geo.cairn", "use \"../basis.cairn\"\natoms {\n  H 0 0 0\n  H 0 0 0.74\n}\n",
      "basis.cairn", "cairn 1\nbasis sto-3g\n",
      "loop/a.cairn", "use \"b.cairn\"\n",
      "loop/b.cairn", "use \"a.cairn\"\n",
      NULL};
  t.files = files;
  ir_recipe *r = ft_resolve(&t, "top.cairn", "cairn 1\nuse \"dir/geo.cairn\"\nuse \"basis.cairn\"\n");
  assert_non_null(r);
  assert_int_equal(r->nuses, 2);
  assert_string_equal(r->uses[0], "dir/geo.cairn");
  assert_string_equal(r->uses[1], "basis.cairn");
  assert_int_equal(r->natoms, 2);
  ir_recipe_free(r);
  r = ft_resolve(&t, "loop/top.cairn", "cairn 1\nuse \"a.cairn\"\n" H2);
  assert_null(r);
  assert_non_null(strstr(ft_messages(&t), "`use` cycle: `loop/a.cairn` is already being read"));
  ft_free(&t);
}

/* Each of these stops the recipe (the golden files hold the full messages). */
static void test_errors(void **state) {
  (void)state;
  fails("atoms {\n  H 0 0 0\n}\nbasis sto-3g\n", "a recipe starts with the line `cairn 1`");
  fails("cairn 2\n" H2, "language version 1, not 2");
  fails(H2 "let x = 1 angstrom + 1 deg\n", "cannot add a length and an angle");
  fails(H2 "let x = sin(1 angstrom)\n", "`sin` takes an angle, not a length");
  fails(H2 "let x = y\n", "undefined name `y`");
  fails(H2 "let x = 1\nlet x = 2\n", "`x` is defined twice");
  fails("cairn 1\natoms {\n  Hx 0 0 0\n}\nbasis sto-3g\n", "unknown element `Hx`");
  fails("cairn 1\natoms {\n  H 0 0 0\n  H 0 0 1\n}\nbasis sto-99g\n", "sto-99g");
  fails(H2 "charge 2\n", "a charge of 2 leaves no electrons");
  fails(H2 "charge -4\n", "6 electrons do not fit in the 2 orbitals");
  fails(H2 "orbitals {\n  freeze 3\n}\n", "orbital 3 is out of range");
  fails(H2 "orbitals {\n  freeze 2\n}\n", "orbital 2 is not doubly occupied");
  fails(H2 "orbitals {\n  active 2 electrons in 3 orbitals\n}\n", "the active space does not fit");
  fails(H2 "emit qasm3 \"a\"\nemit listing \"./a\"\n", "two outputs go to the same file `a`");
  fails(H2 "pool {\n  singles paired\n}\n", "unknown option `paired` for `singles`");
  fails(H2 "optimize lbfgs tolerence 1e-8\n", "unknown option `tolerence` for `optimize`");
  fails("cairn 1\natoms {\n  H 0 0 0\n  H 0 0 0\n}\nbasis sto-3g\n", "atoms 1 and 2 are at the same place");
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_units),        cmocka_unit_test(test_angles),   cmocka_unit_test(test_scan),
      cmocka_unit_test(test_water_space),  cmocka_unit_test(test_open_shell), cmocka_unit_test(test_defaults),
      cmocka_unit_test(test_pool_and_settings), cmocka_unit_test(test_use), cmocka_unit_test(test_errors),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
