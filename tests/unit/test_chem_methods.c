/* test_chem_methods.c — small end-to-end runs of the chemistry chain with
 * checks that do not need an outside program: facts of the trade. */
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
#include "cairn/chem.h"
#include "cairn/integrals.h"
#include "cairn/scf.h"
#include "cairn/element.h"
#include "cairn/util.h"

/* A recipe of one geometry with all orbitals active after `ncore` core ones. */
static ir_recipe *recipe(const char *basis, const char *const *sym, const double (*xyz)[3], int n, int charge,
                         int mult, int ncore, int nact) {
  ir_recipe *r = xcalloc(1, sizeof *r);
  r->path = xstrdup("test");
  r->problem = IR_PROBLEM_ATOMS;
  r->natoms = n;
  r->npoints = 1;
  r->points = xcalloc(1, sizeof *r->points);
  r->points[0].atoms = xcalloc((size_t)n, sizeof(ir_atom));
  int ne = -charge;
  for (int i = 0; i < n; i++) {
    ir_atom *a = &r->points[0].atoms[i];
    a->z = element_z(sym[i], (int)strlen(sym[i]));
    memcpy(a->xyz, xyz[i], sizeof a->xyz);
    a->span = DIAG_NOWHERE;
    ne += a->z;
  }
  r->charge = charge;
  r->multiplicity = mult;
  r->nelectrons = ne;
  r->basis_name = xstrdup(basis);
  r->basis_span = DIAG_NOWHERE;
  ir_orbitals *o = &r->orbitals;
  o->ncore = ncore;
  o->core = xcalloc((size_t)ncore + 1, sizeof(int));
  for (int k = 0; k < ncore; k++) o->core[k] = k;
  o->nactive = nact;
  o->active = xcalloc((size_t)nact + 1, sizeof(int));
  for (int k = 0; k < nact; k++) o->active[k] = ncore + k;
  o->nalpha = (ne + mult - 1) / 2 - ncore;
  o->nbeta = (ne - mult + 1) / 2 - ncore;
  return r;
}

static void recipe_free(ir_recipe *r) {
  free(r->points[0].atoms);
  free(r->points);
  free(r->basis_name);
  free(r->orbitals.core);
  free(r->orbitals.active);
  free(r->path);
  free(r);
}

/* H2: for two electrons CCSD is exact (common practice); the exact energy is
 * below CCSD-or-equal, MP2 and HF in the usual order; the reference energy of
 * the active space is the SCF energy; the exact state is a singlet. */
static void test_h2(void **state) {
  (void)state;
  const char *sym[] = {"H", "H"};
  const double xyz[][3] = {{0, 0, 0}, {0, 0, 1.4}};
  ir_recipe *r = recipe("6-31g", sym, xyz, 2, 0, 1, 0, 4);
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  chem_space s;
  chem_refs refs = {0};
  assert_int_equal(chem_build_space(r, 0, d, &s, &refs), 0);
  assert_true(refs.has_hf);
  assert_true(fabs(chem_reference_energy(&s) - refs.hf) < 1e-10);
  assert_true(fabs(s.e_nuclear - 1 / 1.4) < 1e-15);
  assert_int_equal(chem_mp2(&s, d, &refs), 0);
  assert_int_equal(chem_ccsd(&s, d, &refs), 0);
  chem_target t = {0, 0};
  assert_int_equal(chem_exact(&s, t, d, &refs), 0);
  assert_true(refs.has_mp2 && refs.has_ccsd && refs.has_exact && refs.ccsd_converged);
  assert_true(fabs(refs.ccsd - refs.exact) < 1e-9);
  assert_true(refs.exact < refs.mp2 && refs.mp2 < refs.hf);
  assert_true(fabs(refs.exact_s2) < 1e-9);
  /* the MP2 amplitude of the pair 0a 0b -> 1a 1b is negative-definite in
   * sign convention <ij||ab>/(e_i+e_j-e_a-e_b): denominator < 0, (ia|jb) > 0 */
  assert_true(chem_mp2_amplitude(&s, 0, 1, 2, 3) < 0);
  assert_true(chem_mp2_amplitude(&s, 0, 2, 1, 3) == 0); /* 2 is not occupied */
  chem_space_free(&s);
  recipe_free(r);
  diag_free(d);
}

/* Folding the core gives the same exact energy as keeping every orbital,
 * when the active space is everything but the core and the core stays
 * doubly occupied: compared for LiH with the 1s of Li frozen, the frozen-core
 * exact energy is above the all-electron one (variational, common practice)
 * and the frozen-core SCF reference energy equals the all-electron SCF energy. */
static void test_core_folding(void **state) {
  (void)state;
  const char *sym[] = {"Li", "H"};
  const double xyz[][3] = {{0, 0, 0}, {0, 0, 3.0}};
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  ir_recipe *all = recipe("sto-3g", sym, xyz, 2, 0, 1, 0, 6), *fc = recipe("sto-3g", sym, xyz, 2, 0, 1, 1, 5);
  chem_space s1, s2;
  chem_refs r1 = {0}, r2 = {0};
  assert_int_equal(chem_build_space(all, 0, d, &s1, &r1), 0);
  assert_int_equal(chem_build_space(fc, 0, d, &s2, &r2), 0);
  assert_true(fabs(chem_reference_energy(&s2) - r1.hf) < 1e-10);
  chem_target t = {0, 0};
  assert_int_equal(chem_exact(&s1, t, d, &r1), 0);
  assert_int_equal(chem_exact(&s2, t, d, &r2), 0);
  assert_true(r2.exact > r1.exact && r2.exact - r1.exact < 1e-3);
  /* chem_space_select with no core is a plain copy */
  chem_space s3;
  int act[6] = {0, 1, 2, 3, 4, 5};
  chem_space_select(&s1, NULL, 0, act, 6, 2, 2, &s3);
  assert_memory_equal(s3.h2, s1.h2, 6 * 6 * 6 * 6 * sizeof(double));
  assert_true(s3.e_constant == s1.e_constant);
  chem_space_free(&s1);
  chem_space_free(&s2);
  chem_space_free(&s3);
  recipe_free(all);
  recipe_free(fc);
  diag_free(d);
}

/* Impossible electron counts are refused with an error; an SCF stopped
 * before convergence says so (SCF_NOT_CONVERGED), never a silent number. */
static void test_refusals(void **state) {
  (void)state;
  const char *sym[] = {"H"};
  const double xyz[][3] = {{0, 0, 0}};
  FILE *sink = fopen("/dev/null", "w");
  diag_ctx *d = diag_new(sink, DIAG_COLOR_NEVER);
  ir_recipe *r = recipe("sto-3g", sym, xyz, 1, 0, 3, 0, 1); /* one electron, triplet */
  chem_space s;
  chem_refs refs = {0};
  assert_int_equal(chem_build_space(r, 0, d, &s, &refs), -1);
  assert_true(diag_errors(d) > 0);
  recipe_free(r);
  /* water with two iterations allowed */
  const char *w[] = {"O", "H", "H"};
  const double wx[][3] = {{0, 0, 0}, {0, 1.43, 1.1}, {0, -1.43, 1.1}};
  basis_set bs;
  assert_int_equal(basis_load(d, "sto-3g", NULL, DIAG_NOWHERE, &bs), 0);
  ir_atom at[3];
  memset(at, 0, sizeof at);
  for (int i = 0; i < 3; i++) {
    at[i].z = element_z(w[i], (int)strlen(w[i]));
    memcpy(at[i].xyz, wx[i], sizeof at[i].xyz);
  }
  int_basis ib;
  assert_int_equal(int_basis_build(&bs, at, 3, &ib), 0);
  scf_options o;
  scf_options_default(&o);
  o.max_iter = 2;
  scf_result sr;
  assert_int_equal(scf_run(&ib, &bs, 5, 5, &o, &sr), SCF_NOT_CONVERGED);
  scf_result_free(&sr);
  o.max_iter = 200;
  assert_int_equal(scf_run(&ib, &bs, 5, 5, &o, &sr), SCF_OK);
  assert_true(sr.iterations < 30);
  scf_result_free(&sr);
  int_basis_free(&ib);
  basis_set_free(&bs);
  diag_free(d);
  fclose(sink);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_h2),
      cmocka_unit_test(test_core_folding),
      cmocka_unit_test(test_refusals),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
