/* test_ans.c — generators: pool rules, closed-form screening, entanglers, the
 * mean-field reference, symmetry typing, selection and ordering, and the
 * rotation program.
 *
 * Outside facts used here (common practice unless a source is named):
 *  - closed-shell counts: 2 o v spin-conserving singles, 2 C(o,2) C(v,2) + o^2 v^2
 *    doubles, o v pair doubles and spin-adapted singles;
 *  - under Jordan-Wigner a spin-conserving double minus its adjoint is 8 Pauli
 *    words, a single 2;
 *  - dE/dtheta at theta = 0 of U = exp(-i theta G / 2) is (i/2)<[G, H]>, checked
 *    here against central finite differences of the energy on a dense
 *    statevector built by separate code in this file (the numpy checks in
 *    tests/ref/ans_*.py are the outside reference).
 * The integrals are random (invented data with the 8-fold symmetry). */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include <complex.h>
#include <lapacke.h>
#include <math.h>

#include "cairn/pool.h"
#include "cairn/util.h"
#include "ansatz/ans_priv.h" /* ans_rule_estimate */
#include "../support/testdata.h"
#include "../support/testrecipe.h"
#include "../support/testref.h"

static const ir_encoding ENCODINGS[3] = {IR_ENC_JORDAN_WIGNER, IR_ENC_BRAVYI_KITAEV, IR_ENC_PARITY};

/* ---- fixtures ---- */

/* Random real integrals with the 8-fold symmetry (invented data;
 * tests/support/testdata.c). */
static chem_space random_space(int norb, int nalpha, int nbeta, uint64_t seed) {
  const testdata_scales k = {.e_constant = 0.5, .h1 = 0.4, .diag0 = -2.0, .diag_rise = 0.6, .h2 = 0.2, .coulomb = 0.4};
  chem_space s;
  util_rng r;
  util_rng_seed(&r, seed);
  testdata_space(&s, norb, nalpha, nbeta, &k, &r);
  return s;
}

/* A recipe built by hand: one rule per line of a registered text, so every
 * span points at a real line. */
typedef struct fix {
  diag_ctx *d;
  char *msg;          /* diagnostics written so far (open_memstream) */
  size_t msglen;
  FILE *err;
  int32_t file;       /* the recipe's text */
  ir_recipe r;
  ir_rule rules[16];
  chem_space cs;
  int have_cs;
  ans_setup s;
  ans_plan pl;
  int built;
} fix;

/* The recipe's text and spans (tests/support/testrecipe.c); the rules are
 * parsed by fix_rules. */
static void fix_init(fix *f, const char *const *rule_lines, int nrules, ir_encoding enc, ir_reference_kind ref) {
  memset(f, 0, sizeof *f);
  f->err = open_memstream(&f->msg, &f->msglen);
  f->d = diag_new(f->err, DIAG_COLOR_NEVER);
  f->file = testrecipe_text(f->d, "test.cairn", &f->r, rule_lines, nrules);
  f->r.encoding = enc;
  f->r.reference.kind = ref;
  f->r.choose.kind = IR_CHOOSE_ALL;
  f->r.trotter = 1;
  f->r.rules = f->rules;
  f->r.nrules = nrules;
  f->r.multiplicity = 1;
}

/* Parse the rule lines into IR rules (the subset of the language the tests use). */
static void fix_rules(fix *f, const char *const *rule_lines) {
  int ok = testrecipe_rules(f->d, f->file, f->rules, rule_lines, f->r.nrules);
  if (ok < f->r.nrules) fail_msg("test rule `%s` not understood", rule_lines[ok]);
}

static void fix_free(fix *f) {
  if (f->built) ans_plan_free(&f->pl);
  ans_setup_free(&f->s);
  if (f->have_cs) chem_space_free(&f->cs);
  testrecipe_rules_free(f->rules, f->r.nrules);
  diag_free(f->d);
  fclose(f->err);
  free(f->msg);
}

/* Build setup and plan for norb orbitals with random integrals (cs) or
 * without a Hamiltonian (static). */
static int fix_build(fix *f, const char *const *lines, int norb, int na, int nb, uint64_t seed, int with_h) {
  fix_rules(f, lines);
  f->r.orbitals.nactive = norb;
  f->r.orbitals.nalpha = na;
  f->r.orbitals.nbeta = nb;
  f->r.multiplicity = na - nb + 1;
  if (with_h) {
    f->cs = random_space(norb, na, nb, seed);
    f->have_cs = 1;
  }
  if (ans_setup_init(&f->s, &f->r, with_h ? &f->cs : NULL, f->d) != 0) return -1;
  f->built = 1;
  int rc = ans_plan_build(&f->pl, &f->r, &f->s.prob, f->d);
  if (rc == 0) ans_plan_type(&f->pl, &f->s.prob);
  fflush(f->err);
  return rc;
}

/* ---- an independent dense statevector (n <= 12) ---- */

static const double complex IP[4] = {1, I, -1, -I};

/* out = P in for the word (x, z) on one 64-bit mask. */
static void apply_word(int n, uint64_t x, uint64_t z, const double complex *in, double complex *out) {
  size_t dim = (size_t)1 << n;
  int y = __builtin_popcountll(x & z);
  for (size_t b = 0; b < dim; b++) {
    int sign = __builtin_popcountll(z & b) & 1;
    out[b ^ x] = in[b] * IP[(y + 2 * sign) & 3];
  }
}

static double energy(const pauli_sum *H, const double complex *psi) {
  size_t dim = (size_t)1 << H->n;
  double complex *t = xmalloc(dim * sizeof *t), e = 0;
  for (size_t k = 0; k < H->len; k++) {
    apply_word(H->n, pauli_sum_x(H, k)[0], pauli_sum_z(H, k)[0], psi, t);
    double complex v = 0;
    for (size_t b = 0; b < dim; b++) v += conj(psi[b]) * t[b];
    e += H->c[k] * v;
  }
  free(t);
  return creal(e);
}

/* psi <- exp(-i a P / 2) psi */
static void rotate(int n, uint64_t x, uint64_t z, double a, double complex *psi) {
  size_t dim = (size_t)1 << n;
  double complex *t = xmalloc(dim * sizeof *t);
  apply_word(n, x, z, psi, t);
  for (size_t b = 0; b < dim; b++) psi[b] = cos(a / 2) * psi[b] - I * sin(a / 2) * t[b];
  free(t);
}

/* The reference state: a basis state, or a product state from angles. */
static double complex *ref_state(const ans_reference *ref) {
  int n = ref->nqubits;
  size_t dim = (size_t)1 << n;
  double complex *psi = xcalloc(dim, sizeof *psi);
  for (size_t b = 0; b < dim; b++) {
    double complex a = 1;
    for (int q = 0; q < n; q++) {
      int bit = (int)((b >> q) & 1);
      if (ref->theta) a *= bit ? cexp(I * ref->phi[q]) * sin(ref->theta[q] / 2) : cos(ref->theta[q] / 2);
      else a *= bit == pauli_get_x(ref->bits, q) ? 1 : 0;
    }
    psi[b] = a;
  }
  return psi;
}

/* Central difference of E(theta) = <ref|U+ H U|ref>, U = exp(-i theta G/2). */
static double fd_gradient(const pauli_sum *H, const ans_reference *ref, const ans_pool *pool, size_t k) {
  const ans_gen *g = &pool->gen[k];
  double h = 1e-4, e[2];
  for (int s = 0; s < 2; s++) {
    double th = s ? -h : h;
    double complex *psi = ref_state(ref);
    for (size_t t = g->off; t < g->off + g->len; t++)
      rotate(ref->nqubits, pauli_sum_x(&pool->words, t)[0], pauli_sum_z(&pool->words, t)[0],
             th * creal(pool->words.c[t]), psi);
    e[s] = energy(H, psi);
    free(psi);
  }
  return (e[0] - e[1]) / (2 * h);
}

/* ---- tests ---- */

static size_t count_kind(const ans_pool *pool, ans_kind k) {
  size_t c = 0;
  for (size_t i = 0; i < pool->len; i++) c += pool->gen[i].info.kind == k;
  return c;
}

static long binom(long n, long k) { return k < 0 || k > n ? 0 : k == 0 ? 1 : binom(n - 1, k - 1) * n / k; }

/* Closed-shell counts (common practice) and words per generator (8 per double,
 * 2 per single: a fact of the trade under Jordan-Wigner; our qubit excitations
 * and every Clifford image keep those counts in all three encodings). */
static void test_counts(void **state) {
  (void)state;
  const int cases[][2] = {{4, 2}, {6, 2}, {6, 3}, {5, 1}};
  for (int e = 0; e < 3; e++)
    for (size_t c = 0; c < sizeof cases / sizeof cases[0]; c++) {
      int norb = cases[c][0], o = cases[c][1], v = norb - o;
      static const char *const lines[] = {"singles", "doubles", "singles spin-adapted", "doubles paired",
                                          "singles generalized", "doubles generalized", "doubles paired generalized",
                                          "qubit singles", "qubit doubles"};
      const int nl = 9;
      size_t expect[9] = {(size_t)(2 * o * v),
                          (size_t)(2 * binom(o, 2) * binom(v, 2) + o * o * v * v),
                          (size_t)(o * v),
                          (size_t)(o * v),
                          (size_t)(2 * binom(norb, 2)),
                          (size_t)(binom(norb, 2) * binom(norb - 2, 2) + norb * norb * (norb - 1) * (norb - 1) / 2),
                          (size_t)binom(norb, 2),
                          (size_t)(2 * o * v),
                          (size_t)(2 * binom(o, 2) * binom(v, 2) + o * o * v * v)};
      size_t words[9] = {2, 8, 4, 8, 2, 8, 8, 2, 8};
      for (int i = 0; i < nl; i++) {
        fix f;
        fix_init(&f, &lines[i], 1, ENCODINGS[e], IR_REF_HARTREE_FOCK);
        assert_int_equal(fix_build(&f, &lines[i], norb, o, o, 1, 0), 0);
        assert_int_equal(f.pl.pool.len, expect[i]);
        /* the memory check's closed forms count the same generators */
        ans_build eb;
        memset(&eb, 0, sizeof eb);
        eb.p = &f.s.prob;
        int ew = 0;
        assert_int_equal(ans_rule_estimate(&eb, &f.rules[0], &ew), expect[i]);
        assert_int_equal(ew, words[i]);
        for (size_t k = 0; k < f.pl.pool.len; k++) {
          const ans_gen *g = &f.pl.pool.gen[k];
          assert_int_equal(g->len, words[i]);
          /* the words of a generator commute (ansatz.h) */
          for (size_t a = g->off; a < g->off + g->len; a++)
            for (size_t b2 = a + 1; b2 < g->off + g->len; b2++)
              assert_true(pauli_word_commutes(f.pl.pool.words.nw, pauli_sum_x(&f.pl.pool.words, a),
                                              pauli_sum_z(&f.pl.pool.words, a), pauli_sum_x(&f.pl.pool.words, b2),
                                              pauli_sum_z(&f.pl.pool.words, b2)));
        }
        fix_free(&f);
      }
    }
}

/* Open shells: the memory check's closed forms (ans_rule_estimate) count
 * exactly the generators each rule makes, with different alpha and beta
 * occupations (the enumeration in rules.c is the reference). */
static void test_estimates_open_shell(void **state) {
  (void)state;
  static const char *const lines[] = {"singles", "doubles", "singles spin-adapted", "doubles paired",
                                      "singles generalized", "doubles generalized", "doubles paired generalized",
                                      "qubit singles", "qubit doubles"};
  const int cases[][3] = {{5, 3, 1}, {6, 4, 2}, {4, 2, 1}, {7, 3, 0}};
  for (size_t c = 0; c < sizeof cases / sizeof cases[0]; c++)
    for (int i = 0; i < 9; i++) {
      fix f;
      fix_init(&f, &lines[i], 1, IR_ENC_JORDAN_WIGNER, IR_REF_HARTREE_FOCK);
      assert_int_equal(fix_build(&f, &lines[i], cases[c][0], cases[c][1], cases[c][2], 1, 0), 0);
      ans_build eb;
      memset(&eb, 0, sizeof eb);
      eb.p = &f.s.prob;
      int ew = 0;
      assert_int_equal(ans_rule_estimate(&eb, &f.rules[0], &ew), f.pl.pool.len);
      fix_free(&f);
    }
}

/* Closed-form gradients at the reference equal central differences of the
 * exact energy, for every pool kind, HF and mean-field references, all
 * encodings. */
static void test_gradients(void **state) {
  (void)state;
  static const char *const lines[] = {"singles",       "doubles",          "singles spin-adapted",
                                      "doubles paired", "singles generalized", "doubles generalized",
                                      "qubit singles",  "qubit doubles",    "entanglers",
                                      "word X0 Y1 Z3 X5", "excite 0 3 -> 4 5", "excite 1 -> 5"};
  const int nl = (int)(sizeof lines / sizeof lines[0]);
  for (int e = 0; e < 3; e++)
    for (int ref = 0; ref < 2; ref++) {
      fix f;
      fix_init(&f, lines, nl, ENCODINGS[e], ref ? IR_REF_MEAN_FIELD : IR_REF_HARTREE_FOCK);
      if (fix_build(&f, lines, 3, 2, 1, 11 + (uint64_t)e, 1) != 0) fail_msg("%s", f.msg);
      const ans_plan *pl = &f.pl;
      assert_true(pl->screened);
      if (pl->pool.len < 40) fail_msg("pool %zu", pl->pool.len);
      double worst = 0;
      for (size_t k = 0; k < pl->pool.len; k++) {
        double fd = fd_gradient(f.s.prob.H, &pl->ref, &pl->pool, k);
        double d = fabs(fd - pl->pool.gen[k].gradient);
        if (d > worst) worst = d;
      }
      assert_true(worst < 1e-7);
      fix_free(&f);
    }
}

/* Gradients at arbitrary product states (every qubit tilted) by the closed
 * form equal finite differences. */
static void test_product_state_gradients(void **state) {
  (void)state;
  static const char *const lines[] = {"doubles generalized", "singles generalized", "entanglers", "word Y0 X2 Z4"};
  for (int e = 0; e < 3; e++) {
    fix f;
    fix_init(&f, lines, 4, ENCODINGS[e], IR_REF_HARTREE_FOCK);
    assert_int_equal(fix_build(&f, lines, 3, 1, 1, 5, 1), 0);
    ans_reference ref = f.pl.ref;
    int n = ref.nqubits;
    double th[16], ph[16];
    util_rng rng;
    util_rng_seed(&rng, 99);
    for (int q = 0; q < n; q++) th[q] = 3.0 * util_rng_uniform(&rng) + 0.05, ph[q] = 6.0 * util_rng_uniform(&rng);
    ref.theta = th;
    ref.phi = ph;
    double worst = 0;
    for (size_t k = 0; k < f.pl.pool.len; k++) {
      double g = ans_gen_gradient(&f.pl.pool, k, f.s.prob.H, &ref);
      double fd = fd_gradient(f.s.prob.H, &ref, &f.pl.pool, k);
      if (fabs(g - fd) > worst) worst = fabs(g - fd);
    }
    assert_true(worst < 1e-7);
    /* the product-state energy formula against the dense state */
    double complex *psi = ref_state(&ref);
    assert_true(fabs(ans_product_energy(f.s.prob.H, &ref) - energy(f.s.prob.H, psi)) < 1e-10);
    free(psi);
    fix_free(&f);
  }
}

/* Entangler choice: at a basis state every odd-Y candidate of a flip set has
 * the same |gradient| and the canonical first is kept; at a tilted mean-field
 * state the kept candidate has the largest |gradient| (brute force). */
static void test_entangler_choice(void **state) {
  (void)state;
  static const char *const lines[] = {"entanglers"};
  for (int e = 0; e < 3; e++)
    for (int ref = 0; ref < 2; ref++) {
      fix f;
      fix_init(&f, lines, 1, ENCODINGS[e], ref ? IR_REF_MEAN_FIELD : IR_REF_HARTREE_FOCK);
      assert_int_equal(fix_build(&f, lines, 3, 1, 1, 21 + (uint64_t)e, 1), 0);
      const ans_pool *pool = &f.pl.pool;
      const ans_reference *rf = &f.pl.ref;
      int n = rf->nqubits;
      for (size_t k = 0; k < pool->len; k++) {
        uint64_t x = pauli_sum_x(&pool->words, pool->gen[k].off)[0];
        uint64_t z0 = pauli_sum_z(&pool->words, pool->gen[k].off)[0];
        assert_true((z0 & ~x) == 0);
        assert_true(__builtin_popcountll(z0) & 1);
        double best = 0;
        int tilted = 0;
        for (int q = 0; q < n; q++)
          if (((x >> q) & 1) && rf->theta && rf->theta[q] != 0 && rf->theta[q] != M_PI) tilted = 1;
        /* enumerate all odd-Y subsets of x */
        for (uint64_t y = x;; y = (y - 1) & x) {
          if (__builtin_popcountll(y) & 1) {
            pauli_sum w;
            pauli_sum_init(&w, n);
            pauli_sum_add(&w, &x, &y, 1.0);
            ans_pool tmp = *pool;
            ans_gen gg = pool->gen[k];
            gg.off = 0;
            gg.len = 1;
            tmp.words = w;
            tmp.gen = &gg;
            double g = ans_gen_gradient(&tmp, 0, f.s.prob.H, rf);
            if (!tilted) assert_true(fabs(fabs(g) - fabs(pool->gen[k].gradient)) < 1e-12);
            if (fabs(g) > best) best = fabs(g);
            pauli_sum_free(&w);
          }
          if (y == 0) break;
        }
        assert_true(fabs(pool->gen[k].gradient) >= best - 1e-12);
        if (!tilted) assert_int_equal(z0, (uint64_t)1 << (63 - __builtin_clzll(x))); /* X...X Y */
      }
      fix_free(&f);
    }
}

/* |gradient| of the single word (x, z) at reference rf. */
static double word_gradient(int n, uint64_t x, uint64_t z, const pauli_sum *H, const ans_reference *rf) {
  ans_pool tmp;
  memset(&tmp, 0, sizeof tmp);
  pauli_sum_init(&tmp.words, n);
  pauli_sum_add(&tmp.words, &x, &z, 1.0);
  ans_gen gg;
  memset(&gg, 0, sizeof gg);
  gg.len = 1;
  tmp.gen = &gg;
  tmp.len = 1;
  double g = ans_gen_gradient(&tmp, 0, H, rf);
  pauli_sum_free(&tmp.words);
  return g;
}

/* A Hamiltonian that tilts the mean field (single-qubit X terms, flip sets up
 * to 10 qubits; invented data): the mean-field reference is a true product
 * state, every entangler's gradient matches finite differences, and the kept
 * candidate is the best of all (|f| <= 7, exhaustive) or at least of every
 * single-Y candidate (larger flip sets, bounded search). */
static void test_entangler_tilted(void **state) {
  (void)state;
  static const char *const lines[] = {"entanglers"};
  fix f;
  fix_init(&f, lines, 1, IR_ENC_JORDAN_WIGNER, IR_REF_MEAN_FIELD);
  assert_int_equal(fix_build(&f, lines, 5, 2, 2, 0, 0), 0);
  ans_plan_free(&f.pl);
  int n = 10;
  pauli_sum H;
  pauli_sum_init(&H, n);
  util_rng rng;
  util_rng_seed(&rng, 77);
  for (int q = 0; q < n; q++) {
    uint64_t x = 0, z = (uint64_t)1 << q;
    pauli_sum_add(&H, &x, &z, util_rng_uniform(&rng) - 0.5);
    x = z, z = 0;
    pauli_sum_add(&H, &x, &z, 0.6 * (util_rng_uniform(&rng) - 0.5));
  }
  for (int t = 0; t < 40; t++) {
    int w = 2 + (int)(util_rng_uniform(&rng) * 9);
    uint64_t x = 0, z = 0;
    while (__builtin_popcountll(x) < w && __builtin_popcountll(x) < n) x |= (uint64_t)1 << (int)(util_rng_uniform(&rng) * n);
    for (int q = 0; q < n; q++)
      if (util_rng_uniform(&rng) < 0.4) z |= (uint64_t)1 << q;
    if (__builtin_popcountll(x & z) & 1) z ^= x & (~x + 1); /* even Y: a real Hamiltonian */
    pauli_sum_add(&H, &x, &z, 0.4 * (util_rng_uniform(&rng) - 0.5));
  }
  pauli_sum_canonicalize(&H, 0);
  f.s.prob.H = &H;
  assert_int_equal(ans_plan_build(&f.pl, &f.r, &f.s.prob, f.d), 0);
  const ans_pool *pool = &f.pl.pool;
  const ans_reference *rf = &f.pl.ref;
  assert_true(rf->tilted > 0);
  int big = 0;
  for (size_t k = 0; k < pool->len; k++) {
    uint64_t x = pauli_sum_x(&pool->words, pool->gen[k].off)[0];
    double g = pool->gen[k].gradient;
    assert_true(fabs(fd_gradient(&H, rf, pool, k) - g) < 1e-7);
    double best = 0;
    if (__builtin_popcountll(x) <= 7) {
      for (uint64_t y = x;; y = (y - 1) & x) {
        if (__builtin_popcountll(y) & 1) best = fmax(best, fabs(word_gradient(n, x, y, &H, rf)));
        if (y == 0) break;
      }
    } else {
      big++;
      for (int q = 0; q < n; q++)
        if ((x >> q) & 1) best = fmax(best, fabs(word_gradient(n, x, (uint64_t)1 << q, &H, rf)));
    }
    assert_true(fabs(g) >= best - 1e-12);
  }
  assert_true(big > 0);
  fix_free(&f);
  pauli_sum_free(&H);
}

/* The mean-field reference: no higher than Hartree-Fock, stationary, angles
 * normalized, and the same on every build. */
static void test_mean_field(void **state) {
  (void)state;
  static const char *const lines[] = {"entanglers"};
  for (int e = 0; e < 3; e++) {
    double first[32];
    for (int rep = 0; rep < 2; rep++) {
      fix f;
      fix_init(&f, lines, 1, ENCODINGS[e], IR_REF_MEAN_FIELD);
      assert_int_equal(fix_build(&f, lines, 3, 2, 1, 31, 1), 0);
      const ans_reference *rf = &f.pl.ref;
      ans_reference hf = *rf;
      hf.theta = hf.phi = NULL;
      double ehf = ans_product_energy(f.s.prob.H, &hf);
      assert_true(rf->energy <= ehf + 1e-12);
      int n = rf->nqubits;
      for (int q = 0; q < n; q++) {
        assert_true(rf->theta[q] >= 0 && rf->theta[q] <= M_PI);
        assert_true(rf->phi[q] >= 0 && rf->phi[q] < 2 * M_PI);
        if (rep == 0) first[2 * q] = rf->theta[q], first[2 * q + 1] = rf->phi[q];
        else assert_true(first[2 * q] == rf->theta[q] && first[2 * q + 1] == rf->phi[q]);
      }
      /* stationary: the energy rises (to second order) along each angle */
      ans_reference t = *rf;
      double th[32], ph[32];
      memcpy(th, rf->theta, (size_t)n * sizeof *th);
      memcpy(ph, rf->phi, (size_t)n * sizeof *ph);
      t.theta = th;
      t.phi = ph;
      for (int q = 0; q < n; q++) {
        double h = 1e-5, e0 = rf->energy;
        th[q] += h;
        double ep = ans_product_energy(f.s.prob.H, &t);
        th[q] -= 2 * h;
        double em = ans_product_energy(f.s.prob.H, &t);
        th[q] += h;
        assert_true(fabs(ep - em) / (2 * h) < 1e-5);
        assert_true(ep >= e0 - 1e-9 && em >= e0 - 1e-9);
      }
      fix_free(&f);
    }
  }
}

/* Signatures (Pauli algebra): spin-conserving excitations commute with N and
 * S_z in every encoding; plain singles and mixed doubles break S^2, spin-adapted
 * singles and pair doubles keep it; single entangler words break N. */
static void test_signatures(void **state) {
  (void)state;
  static const char *const lines[] = {"singles", "singles spin-adapted", "doubles paired", "doubles", "qubit doubles",
                                      "entanglers"};
  for (int e = 0; e < 3; e++) {
    fix f;
    fix_init(&f, lines, 6, ENCODINGS[e], IR_REF_HARTREE_FOCK);
    f.r.choose.kind = IR_CHOOSE_ALL;
    assert_int_equal(fix_build(&f, lines, 4, 2, 2, 41, 1), 0);
    const ans_pool *pool = &f.pl.pool;
    size_t s2_break_singles = 0, s2_break_doubles = 0, ndoubles = 0;
    for (size_t k = 0; k < pool->len; k++) {
      const ans_gen *g = &pool->gen[k];
      int rule = g->info.rule;
      if (rule <= 4) {
        assert_int_equal(g->sig.sym[IR_SYM_PARTICLES], ANS_SIG_KEEPS);
        assert_int_equal(g->sig.sym[IR_SYM_SPIN_Z], ANS_SIG_KEEPS);
      }
      if (rule == 0) s2_break_singles += g->sig.sym[IR_SYM_SPIN_SQUARED] == ANS_SIG_BREAKS;
      if (rule == 1 || rule == 2) assert_int_equal(g->sig.sym[IR_SYM_SPIN_SQUARED], ANS_SIG_KEEPS);
      if (rule == 3) {
        ndoubles++;
        s2_break_doubles += g->sig.sym[IR_SYM_SPIN_SQUARED] == ANS_SIG_BREAKS;
      }
      if (rule == 5) assert_int_equal(g->sig.sym[IR_SYM_PARTICLES], ANS_SIG_BREAKS);
    }
    assert_int_equal(s2_break_singles, count_kind(pool, ANS_SINGLE) - 4); /* every plain single (8) */
    /* what is left of `doubles` after the pair doubles (duplicates) breaks S^2 */
    assert_true(ndoubles == 14 && s2_break_doubles == ndoubles);
    fix_free(&f);
  }
}

/* Selection and ordering: counts, thresholds, orders, ties by pool order,
 * the same on every run. */
static void test_selection(void **state) {
  (void)state;
  static const char *const lines[] = {"doubles", "singles"};
  for (int mode = 0; mode < 5; mode++) {
    size_t first[128], nfirst = 0;
    for (int rep = 0; rep < 2; rep++) {
      fix f;
      fix_init(&f, lines, 2, IR_ENC_JORDAN_WIGNER, IR_REF_HARTREE_FOCK);
      if (mode == 0) f.r.choose.kind = IR_CHOOSE_COUNT, f.r.choose.count = 5, f.r.order = IR_ORDER_GRADIENT;
      if (mode == 1) f.r.choose.kind = IR_CHOOSE_ABOVE, f.r.choose.threshold = 1e-3, f.r.order = IR_ORDER_WRITTEN;
      if (mode == 2) f.r.choose.kind = IR_CHOOSE_ALL, f.r.order = IR_ORDER_RANK;
      if (mode == 3) f.r.choose.kind = IR_CHOOSE_COUNT, f.r.choose.count = 1000, f.r.order = IR_ORDER_GRADIENT;
      if (mode == 4) f.r.choose.kind = IR_CHOOSE_ABOVE, f.r.choose.threshold = 1e6;
      assert_int_equal(fix_build(&f, lines, 4, 2, 2, 51, 1), 0);
      const ans_plan *pl = &f.pl;
      const ans_pool *pool = &pl->pool;
      if (mode == 0) assert_int_equal(pl->norder, 5);
      if (mode == 3) assert_int_equal(pl->norder, pool->len);
      if (mode == 4) {
        assert_int_equal(pl->norder, 0);
        assert_non_null(strstr(f.msg, "test.cairn:6:1: warning: the selection leaves none of the"));
      }
      for (size_t i = 0; i + 1 < pl->norder; i++) {
        const ans_gen *a = &pool->gen[pl->order[i]], *b = &pool->gen[pl->order[i + 1]];
        long long ka = ans_grad_key(a->gradient), kb = ans_grad_key(b->gradient);
        if (mode == 0 || mode == 3) assert_true(ka > kb || (ka == kb && pl->order[i] < pl->order[i + 1]));
        if (mode == 1) assert_true(pl->order[i] < pl->order[i + 1]);
        if (mode == 2)
          assert_true(a->rank < b->rank || (a->rank == b->rank && (ka > kb || (ka == kb && pl->order[i] < pl->order[i + 1]))));
      }
      if (mode == 1)
        for (size_t k = 0, i = 0; k < pool->len; k++) {
          int in = i < pl->norder && pl->order[i] == k;
          assert_int_equal(in, fabs(pool->gen[k].gradient) > 1e-3);
          i += in;
        }
      if (mode == 0) /* the 5 largest |g| */
        for (size_t k = 0; k < pool->len; k++) {
          int in = 0;
          for (size_t i = 0; i < pl->norder; i++) in |= pl->order[i] == k;
          if (!in) assert_true(ans_grad_key(pool->gen[k].gradient) <= ans_grad_key(pool->gen[pl->order[4]].gradient));
        }
      if (mode == 3) {
        /* closed shell: the alpha-alpha and beta-beta copies of a double have
         * equal gradients by spin symmetry; such ties keep pool order */
        int ties = 0;
        for (size_t i = 0; i + 1 < pl->norder; i++)
          if (ans_grad_key(pool->gen[pl->order[i]].gradient) == ans_grad_key(pool->gen[pl->order[i + 1]].gradient) &&
              ans_grad_key(pool->gen[pl->order[i]].gradient) > 0) {
            ties++;
            assert_true(pl->order[i] < pl->order[i + 1]);
          }
        assert_true(ties > 0);
      }
      if (rep == 0) {
        nfirst = pl->norder;
        memcpy(first, pl->order, pl->norder * sizeof *first);
      } else {
        assert_int_equal(nfirst, pl->norder);
        assert_memory_equal(first, pl->order, nfirst * sizeof *first);
      }
      fix_free(&f);
    }
  }
}

/* Diagnostics of the symmetry checker at the right lines. */
static void test_messages(void **state) {
  (void)state;
  {
    static const char *const lines[] = {"entanglers"};
    fix f;
    fix_init(&f, lines, 1, IR_ENC_JORDAN_WIGNER, IR_REF_HARTREE_FOCK);
    f.r.keep[IR_SYM_PARTICLES].policy = IR_KEEP_EXACTLY;
    assert_int_equal(fix_build(&f, lines, 2, 1, 1, 3, 0), -1); /* static: provable */
    assert_non_null(strstr(f.msg, "test.cairn:8:3: error: no generator of `entanglers` commutes with N"));
    assert_non_null(strstr(f.msg, "test.cairn:2:1: note: particle number is kept exactly here"));
    assert_non_null(strstr(f.msg, "help: keep it softly: `keep particles penalty 0.5`"));
    fix_free(&f);
  }
  {
    static const char *const lines[] = {"singles", "singles spin-adapted", "excite 0 -> 3"};
    fix f;
    fix_init(&f, lines, 3, IR_ENC_BRAVYI_KITAEV, IR_REF_HARTREE_FOCK);
    f.r.keep[IR_SYM_SPIN_SQUARED].policy = IR_KEEP_EXACTLY;
    f.r.keep[IR_SYM_SPIN_Z].policy = IR_KEEP_EXACTLY;
    assert_int_equal(fix_build(&f, lines, 3, 1, 1, 3, 0), -1);
    assert_non_null(strstr(f.msg, "test.cairn:8:3: error: no generator of `singles` commutes with S^2"));
    assert_null(strstr(f.msg, "test.cairn:9:3: error"));
    assert_non_null(strstr(f.msg, "test.cairn:10:3: error: `excite 0 -> 3` does not commute with S_z"));
    assert_non_null(strstr(f.msg, "or use `singles spin-adapted`"));
    fix_free(&f);
  }
  {
    static const char *const lines[] = {"doubles"};
    fix f;
    fix_init(&f, lines, 1, IR_ENC_PARITY, IR_REF_MEAN_FIELD);
    f.r.keep[IR_SYM_PARTICLES].policy = IR_KEEP_EXACTLY;
    assert_int_equal(fix_build(&f, lines, 3, 1, 1, 3, 0), -1);
    assert_non_null(strstr(f.msg, "test.cairn:1:1: error: a mean-field reference cannot keep particle number exactly"));
    fix_free(&f);
  }
  {
    /* duplicates and an explicit word under tapering */
    static const char *const lines[] = {"doubles", "excite 0 1 -> 2 3", "word X0", "word X0 Y1 Y2 Y3"};
    fix f;
    fix_init(&f, lines, 4, IR_ENC_JORDAN_WIGNER, IR_REF_HARTREE_FOCK);
    f.r.taper = 1;
    assert_int_equal(fix_build(&f, lines, 2, 1, 1, 3, 1), -1);
    assert_non_null(strstr(f.msg, "test.cairn:10:3: error: `word X0` does not commute with the tapered symmetry"));
    assert_non_null(strstr(f.msg, "test.cairn:9:3: warning: `excite 0 1 -> 2 3` duplicates generator 0 1 -> 2 3 of `doubles`"));
    fix_free(&f);
  }
  {
    /* a rule with nothing to make, and an empty pool */
    static const char *const lines[] = {"singles"};
    fix f;
    fix_init(&f, lines, 1, IR_ENC_PARITY, IR_REF_HARTREE_FOCK);
    assert_int_equal(fix_build(&f, lines, 2, 2, 2, 3, 1), 0);
    assert_non_null(strstr(f.msg, "test.cairn:8:3: warning: `singles` makes no generators for this reference"));
    assert_non_null(strstr(f.msg, "test.cairn:7:1: warning: the pool has no generators"));
    fix_free(&f);
  }
  {
    /* an explicit bits reference with the wrong electron count */
    static const char *const lines[] = {"doubles"};
    fix f;
    fix_init(&f, lines, 1, IR_ENC_JORDAN_WIGNER, IR_REF_BITS);
    f.r.reference.bits = xstrdup("1110");
    f.r.keep[IR_SYM_PARTICLES].policy = IR_KEEP_EXACTLY;
    assert_int_equal(fix_build(&f, lines, 2, 1, 1, 3, 0), -1);
    assert_non_null(strstr(f.msg, "test.cairn:1:1: error: the reference bits hold 3 electrons, but the active space has 2"));
    free(f.r.reference.bits);
    fix_free(&f);
  }
}

/* The rotation program: mean-field preparation, generators in order, Trotter
 * steps sharing parameters; at its initial parameters it prepares the
 * reference (dense check of the energy). */
static void test_circuit(void **state) {
  (void)state;
  static const char *const lines[] = {"doubles", "singles"};
  for (int ref = 0; ref < 2; ref++) {
    fix f;
    fix_init(&f, lines, 2, IR_ENC_PARITY, ref ? IR_REF_MEAN_FIELD : IR_REF_HARTREE_FOCK);
    f.r.choose.kind = IR_CHOOSE_COUNT;
    f.r.choose.count = 4;
    f.r.order = IR_ORDER_GRADIENT;
    f.r.trotter = 3;
    assert_int_equal(fix_build(&f, lines, 3, 1, 1, 61, 1), 0);
    ans_circuit c;
    ans_plan_circuit(&f.pl, &f.r, &c);
    int n = c.nqubits;
    assert_int_equal(c.ngens, 4);
    assert_int_equal(c.nparams, 4 + (ref ? 2 * n : 0));
    assert_int_equal(c.nref_params, ref ? 2 * n : 0);
    size_t words = 0;
    for (int g = 0; g < 4; g++) words += f.pl.pool.gen[f.pl.order[g]].len;
    assert_int_equal(c.nrot, 3 * words + (ref ? 2 * (size_t)n : 0));
    double complex *psi = xcalloc((size_t)1 << n, sizeof *psi);
    psi[c.init[0]] = 1;
    for (size_t k = 0; k < c.nrot; k++) {
      const ans_rotation *ro = &c.rot[k];
      double a = ro->param >= 0 ? c.param_init[ro->param] * ro->mult : ro->mult;
      rotate(n, pauli_sum_x(&c.words, (size_t)ro->word)[0], pauli_sum_z(&c.words, (size_t)ro->word)[0], a, psi);
    }
    assert_true(fabs(energy(f.s.prob.H, psi) - f.pl.ref.energy) < 1e-10);
    free(psi);
    ans_circuit_free(&c);
    fix_free(&f);
  }
}

/* Registers wider than one 64-bit word (68 qubits, sparse random integrals
 * across the word boundary; invented data): screening gradients agree with
 * the generic commutator route (testref_gradient), signatures with the
 * fermionic facts, in every encoding, with and without tapering. */
static void test_wide_register(void **state) {
  (void)state;
  static const char *const lines[] = {"doubles", "qubit doubles", "entanglers", "singles spin-adapted"};
  for (int e = 0; e < 3; e++)
    for (int taper = 0; taper < 2; taper++) {
      fix f;
      fix_init(&f, lines, 4, ENCODINGS[e], IR_REF_HARTREE_FOCK);
      f.r.taper = taper;
      fix_rules(&f, lines);
      int norb = 34;
      f.r.orbitals.nactive = norb;
      f.r.orbitals.nalpha = f.r.orbitals.nbeta = 3;
      f.r.multiplicity = 1;
      chem_space *cs = &f.cs;
      memset(cs, 0, sizeof *cs);
      cs->norb = norb;
      cs->nalpha = cs->nbeta = 3;
      cs->h1 = xcalloc((size_t)norb * norb, sizeof(double));
      cs->h2 = xcalloc((size_t)norb * norb * norb * norb, sizeof(double));
      f.have_cs = 1;
      util_rng rng;
      util_rng_seed(&rng, 123);
      for (int p = 0; p < norb; p++) cs->h1[p * norb + p] = -1.5 + 0.08 * p;
      for (int t = 0; t < 40; t++) {
        int idx[4];
        for (int k = 0; k < 4; k++) idx[k] = (int)(util_rng_uniform(&rng) * norb);
        if (t % 3 == 0) idx[0] = 1, idx[2] = 33 - t % 5; /* across qubit 64 */
        double v = 0.1 * (util_rng_uniform(&rng) - 0.5);
        int p = idx[0], q = idx[1], r = idx[2], ss = idx[3];
        int perm[8][4] = {{p, q, r, ss}, {q, p, r, ss}, {p, q, ss, r}, {q, p, ss, r},
                          {r, ss, p, q}, {ss, r, p, q}, {r, ss, q, p}, {ss, r, q, p}};
        for (int k = 0; k < 8; k++) cs->h2[chem_h2_index(norb, perm[k][0], perm[k][1], perm[k][2], perm[k][3])] = v;
        double h = 0.05 * (util_rng_uniform(&rng) - 0.5);
        cs->h1[p * norb + r] = cs->h1[r * norb + p] = h;
      }
      if (ans_setup_init(&f.s, &f.r, cs, f.d) != 0) fail_msg("%s", f.msg);
      f.built = 1;
      if (ans_plan_build(&f.pl, &f.r, &f.s.prob, f.d) != 0) fail_msg("%s", f.msg);
      const ans_pool *pool = &f.pl.pool;
      assert_true(f.s.prob.nqubits > 64 - 4 * taper);
      assert_true(pool->len > 1000);
      double worst = 0;
      for (size_t k = 0; k < pool->len; k += 53) {
        double g = testref_gradient(pool, k, f.s.prob.H, f.pl.ref.bits);
        worst = fmax(worst, fabs(g - pool->gen[k].gradient));
      }
      assert_true(worst < 1e-12);
      for (size_t k = 0; k < pool->len; k += 211) {
        ans_gen_type(&f.pl.pool, k, &f.s.prob);
        const ans_gen *g = &pool->gen[k];
        if (g->info.kind == ANS_DOUBLE || g->info.kind == ANS_QUBIT_DOUBLE) {
          assert_int_equal(g->sig.sym[IR_SYM_PARTICLES], ANS_SIG_KEEPS);
          assert_int_equal(g->sig.sym[IR_SYM_SPIN_Z], ANS_SIG_KEEPS);
        }
        if (g->info.spin_adapted) assert_int_equal(g->sig.sym[IR_SYM_SPIN_SQUARED], ANS_SIG_KEEPS);
      }
      fix_free(&f);
    }
}

/* Lowest eigenvalue of H restricted to basis states with `ne` electrons and
 * S_z = 0 (Jordan-Wigner: bits are occupations), by LAPACK. */
static double exact_ground(const pauli_sum *H, int ne) {
  int n = H->n;
  size_t dim = (size_t)1 << n, m = 0;
  size_t *idx = xmalloc(dim * sizeof *idx);
  for (size_t b = 0; b < dim; b++)
    if (__builtin_popcountll(b) == ne && __builtin_popcountll(b & 0x5555555555555555ULL) == ne / 2) idx[m++] = b;
  double complex *col = xmalloc(dim * sizeof *col), *e = xcalloc(dim, sizeof *e);
  lapack_complex_double *a = xcalloc(m * m, sizeof *a);
  for (size_t j = 0; j < m; j++) {
    memset(e, 0, dim * sizeof *e);
    e[idx[j]] = 1;
    memset(col, 0, dim * sizeof *col);
    double complex *t = xmalloc(dim * sizeof *t);
    for (size_t k = 0; k < H->len; k++) {
      apply_word(n, pauli_sum_x(H, k)[0], pauli_sum_z(H, k)[0], e, t);
      for (size_t b = 0; b < dim; b++) col[b] += H->c[k] * t[b];
    }
    free(t);
    for (size_t i = 0; i < m; i++) a[i * m + j] = col[idx[i]];
  }
  double *w = xmalloc(m * sizeof *w);
  assert_int_equal(LAPACKE_zheev(LAPACK_ROW_MAJOR, 'N', 'U', (lapack_int)m, a, (lapack_int)m, w), 0);
  double e0 = w[0];
  free(w);
  free(a);
  free(col);
  free(e);
  free(idx);
  return e0;
}

/* Adaptive growth on the statevector engine: its first gradient (statevector
 * route) equals the closed form at the reference; energies fall step by step
 * and stay above the exact ground energy; the grown program at the returned
 * parameters gives the returned energy; the error reaches chemical accuracy
 * (1.6 mEh, common practice) for this small problem. */
static void test_grow(void **state) {
  (void)state;
  static const char *const lines[] = {"singles", "doubles"};
  fix f;
  fix_init(&f, lines, 2, IR_ENC_JORDAN_WIGNER, IR_REF_HARTREE_FOCK);
  f.r.choose.kind = IR_CHOOSE_GROW;
  f.r.choose.count = 30;
  f.r.choose.threshold = 1e-5;
  f.r.optimize.method = IR_OPT_LBFGS;
  f.r.optimize.tolerance = 1e-12;
  f.r.optimize.iterations = 2000;
  assert_int_equal(fix_build(&f, lines, 4, 2, 2, 71, 1), 0);
  assert_true(f.pl.grow);
  const pauli_sum *H = f.s.prob.H;
  double e_exact = exact_ground(H, 4);
  ans_grow_result g;
  char err[256];
  if (ans_grow(&f.pl, &f.r, H, &g, err, sizeof err) != 0) fail_msg("%s", err);
  assert_true(g.nsteps > 0);
  assert_true(fabs(g.step[0].gradient - f.pl.pool.gen[g.step[0].gen].gradient) < 1e-10);
  assert_true(fabs(g.energy0 - f.pl.ref.energy) < 1e-10);
  double prev = g.energy0;
  for (int k = 0; k < g.nsteps; k++) {
    assert_true(g.step[k].energy <= prev + 1e-10);
    assert_true(g.step[k].energy >= e_exact - 1e-9);
    prev = g.step[k].energy;
  }
  assert_true(g.energy - e_exact < 1.6e-3);
  assert_int_equal(f.pl.norder, (size_t)g.nsteps);
  ans_circuit c;
  ans_plan_circuit(&f.pl, &f.r, &c);
  assert_int_equal(c.nparams, g.nparams);
  double complex *psi = xcalloc((size_t)1 << c.nqubits, sizeof *psi);
  psi[c.init[0]] = 1;
  for (size_t k = 0; k < c.nrot; k++) {
    const ans_rotation *ro = &c.rot[k];
    rotate(c.nqubits, pauli_sum_x(&c.words, (size_t)ro->word)[0], pauli_sum_z(&c.words, (size_t)ro->word)[0],
           g.theta[ro->param] * ro->mult, psi);
  }
  assert_true(fabs(energy(H, psi) - g.energy) < 1e-9);
  printf("grow: %d steps, E - E_exact = %.3e, converged %d\n", g.nsteps, g.energy - e_exact, g.converged);
  free(psi);
  ans_circuit_free(&c);
  ans_grow_result_free(&g);
  fix_free(&f);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_counts),          cmocka_unit_test(test_estimates_open_shell),
      cmocka_unit_test(test_gradients),
      cmocka_unit_test(test_product_state_gradients), cmocka_unit_test(test_entangler_choice),
      cmocka_unit_test(test_entangler_tilted),
      cmocka_unit_test(test_mean_field),      cmocka_unit_test(test_signatures),
      cmocka_unit_test(test_selection),       cmocka_unit_test(test_messages),
      cmocka_unit_test(test_circuit),         cmocka_unit_test(test_grow),
      cmocka_unit_test(test_wide_register),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
