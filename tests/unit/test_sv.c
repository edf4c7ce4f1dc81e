/* test_sv.c — statevector kernels against dense matrices built here, letter
 * by letter, from the Pauli matrices' definitions (X = [[0,1],[1,0]],
 * Y = [[0,-i],[i,0]], Z = diag(1,-1); common practice), with qubit q acting on
 * bit q of the basis index.  Also: exp(-i t P/2) = cos(t/2) I - i sin(t/2) P
 * for a Pauli word P (P^2 = I; common practice), memory refusal, and
 * thread-count independence of the reductions. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "lower/sv_priv.h" /* the access-order entry points */

#include <complex.h>
#include <math.h>
#ifdef _OPENMP
#include <omp.h>
#endif

#include "cairn/sv.h"
#include "cairn/util.h"

/* The 2x2 matrix of a letter: m[row][col]. */
static void letter_matrix(char L, double complex m[2][2]) {
  m[0][0] = m[0][1] = m[1][0] = m[1][1] = 0;
  switch (L) {
  case 'X': m[0][1] = m[1][0] = 1; break;
  case 'Y': m[0][1] = -I; m[1][0] = I; break;
  case 'Z': m[0][0] = 1; m[1][1] = -1; break;
  default: m[0][0] = m[1][1] = 1; break;
  }
}

/* Dense matrix (dim x dim, row-major) of the word given by letters[q]:
 * element <r|P|c> = prod_q <r_q|L_q|c_q>. */
static double complex *dense_word(int n, const char *letters) {
  uint64_t dim = (uint64_t)1 << n;
  double complex *M = xcalloc(dim * dim, sizeof *M);
  for (uint64_t r = 0; r < dim; r++)
    for (uint64_t c = 0; c < dim; c++) {
      double complex v = 1;
      for (int q = 0; q < n && v != 0; q++) {
        double complex m[2][2];
        letter_matrix(letters[q], m);
        v *= m[(r >> q) & 1][(c >> q) & 1];
      }
      M[r * dim + c] = v;
    }
  return M;
}

static void word_of_letters(int n, const char *letters, uint64_t *x, uint64_t *z) {
  *x = *z = 0;
  for (int q = 0; q < n; q++) {
    char L = letters[q];
    if (L == 'X' || L == 'Y') *x |= (uint64_t)1 << q;
    if (L == 'Z' || L == 'Y') *z |= (uint64_t)1 << q;
  }
}

static void random_letters(util_rng *r, int n, char *letters) {
  for (int q = 0; q < n; q++) letters[q] = "IXYZ"[util_rng_next(r) & 3];
  letters[n] = 0;
}

static void random_state(util_rng *r, sv_state *s) {
  for (uint64_t i = 0; i < s->dim; i++) {
    double re = util_rng_uniform(r) - 0.5, im = util_rng_uniform(r) - 0.5;
    s->a[i] = re + I * im;
  }
}

static void matvec(uint64_t dim, const double complex *M, const double complex *v, double complex *out) {
  for (uint64_t r = 0; r < dim; r++) {
    double complex acc = 0;
    for (uint64_t c = 0; c < dim; c++) acc += M[r * dim + c] * v[c];
    out[r] = acc;
  }
}

static double max_diff(uint64_t dim, const double complex *a, const double complex *b) {
  double m = 0;
  for (uint64_t i = 0; i < dim; i++) m = fmax(m, cabs(a[i] - b[i]));
  return m;
}

/* sv_rotate and sv_apply_word equal the dense matrices for random words on
 * 1..9 qubits (diagonal words, Y-heavy words and the identity included).
 * Trials 3 and 4 force words with letters on qubit 5, or 6 and 7, and on a
 * qubit above them: the words that take sv.c's partner copies when vectors
 * stream from memory (test_streaming_orders compares the two orders). */
static void test_rotation_matches_dense(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 11);
  for (int n = 1; n <= 9; n++)
    for (int trial = 0; trial < 12; trial++) {
      char letters[10];
      random_letters(&r, n, letters);
      if (trial == 0) memset(letters, 'I', (size_t)n);
      if (trial == 1) memset(letters, 'Y', (size_t)n);
      if (trial == 2) memset(letters, 'Z', (size_t)n);
      if (trial == 3 && n >= 7) letters[5] = 'X', letters[n - 1] = 'Y';
      if (trial == 4 && n >= 9) letters[6] = 'Y', letters[7] = 'X', letters[n - 1] = 'X';
      uint64_t x, z;
      word_of_letters(n, letters, &x, &z);
      sv_state s;
      sv_state_alloc(&s, n);
      random_state(&r, &s);
      double complex *P = dense_word(n, letters), *v0 = xmalloc(s.dim * sizeof *v0),
                     *Pv = xmalloc(s.dim * sizeof *Pv), *want = xmalloc(s.dim * sizeof *want);
      memcpy(v0, s.a, s.dim * sizeof *v0);
      matvec(s.dim, P, v0, Pv);
      double theta = 4 * util_rng_uniform(&r) - 2;
      for (uint64_t i = 0; i < s.dim; i++) want[i] = cos(theta / 2) * v0[i] - I * sin(theta / 2) * Pv[i];
      sv_rotate(&s, x, z, theta);
      assert_true(max_diff(s.dim, s.a, want) < 1e-14);
      memcpy(s.a, v0, s.dim * sizeof *v0);
      sv_apply_word(&s, x, z);
      assert_true(max_diff(s.dim, s.a, Pv) < 1e-15);
      free(P);
      free(v0);
      free(Pv);
      free(want);
      sv_state_free(&s);
    }
}

/* <a|P|b> and the fused backward step equal the dense computation (1..9
 * qubits; trials 3 and 4 as in test_rotation_matches_dense). */
static void test_word_inner(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 12);
  for (int n = 1; n <= 9; n++)
    for (int trial = 0; trial < 10; trial++) {
      char letters[10];
      random_letters(&r, n, letters);
      if (trial == 3 && n >= 7) letters[5] = 'Y', letters[n - 1] = 'X';
      if (trial == 4 && n >= 9) letters[7] = 'X', letters[n - 1] = 'Y';
      uint64_t x, z;
      word_of_letters(n, letters, &x, &z);
      sv_state a, b;
      sv_state_alloc(&a, n);
      sv_state_alloc(&b, n);
      random_state(&r, &a);
      random_state(&r, &b);
      double complex *P = dense_word(n, letters), *Pb = xmalloc(a.dim * sizeof *Pb);
      matvec(a.dim, P, b.a, Pb);
      double complex want = 0;
      for (uint64_t i = 0; i < a.dim; i++) want += conj(a.a[i]) * Pb[i];
      assert_true(cabs(sv_word_inner(&a, x, z, &b) - want) < 1e-13);
      /* fused: same inner product, then both vectors rotated */
      sv_state a2, b2;
      sv_state_alloc(&a2, n);
      sv_state_alloc(&b2, n);
      sv_copy(&a2, &a);
      sv_copy(&b2, &b);
      double theta = 1.234 * (trial + 1);
      double complex got = sv_word_inner_rotate2(&a2, &b2, x, z, theta);
      assert_true(cabs(got - want) < 1e-13);
      sv_rotate(&a, x, z, theta);
      sv_rotate(&b, x, z, theta);
      assert_true(max_diff(a.dim, a.a, a2.a) < 1e-15);
      assert_true(max_diff(b.dim, b.a, b2.a) < 1e-15);
      free(P);
      free(Pb);
      sv_state_free(&a);
      sv_state_free(&b);
      sv_state_free(&a2);
      sv_state_free(&b2);
    }
}

/* The access orders for registers that stream from memory (sv.c) give the
 * same rotations, word products and inner products as the default order,
 * which the two tests above check against dense matrices: on 7 to 10 qubits,
 * with words forced onto qubit 5 (the partner-block copy) and onto qubits 6
 * and 7 (the 4 KiB runs) besides random ones. */
static void test_streaming_orders(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 13);
  int forced = 0;
  for (int n = 7; n <= 10; n++)
    for (int trial = 0; trial < 16; trial++) {
      char letters[12];
      random_letters(&r, n, letters);
      if (trial % 3 == 0) letters[5] = 'X', letters[n - 1] = 'Y';
      if (trial % 3 == 1 && n >= 9) letters[6] = 'Y', letters[7] = 'X', letters[n - 1] = 'X';
      uint64_t x, z;
      word_of_letters(n, letters, &x, &z);
      forced += (x >> 5 & 1) && n >= 9 && (x >> (n - 1) & 1);
      sv_state a, b, a1, b1;
      sv_state_alloc(&a, n);
      sv_state_alloc(&b, n);
      sv_state_alloc(&a1, n);
      sv_state_alloc(&b1, n);
      random_state(&r, &a);
      random_state(&r, &b);
      double theta = 4 * util_rng_uniform(&r) - 2;
      sv_copy(&a1, &a);
      sv_rotate_order(&a, x, z, theta, 0);
      sv_rotate_order(&a1, x, z, theta, 1);
      assert_true(max_diff(a.dim, a.a, a1.a) == 0); /* the same arithmetic per pair */
      sv_apply_word_order(&a, x, z, 0);
      sv_apply_word_order(&a1, x, z, 1);
      assert_true(max_diff(a.dim, a.a, a1.a) == 0);
      double complex w0 = sv_word_inner_order(&a, &b, x, z, 0, 0.0, 0), w1 = sv_word_inner_order(&a, &b, x, z, 0, 0.0, 1);
      assert_true(cabs(w0 - w1) < 1e-13); /* sums in another order */
      sv_copy(&b1, &b);
      w0 = sv_word_inner_order(&a, &b, x, z, 1, theta, 0);
      w1 = sv_word_inner_order(&a1, &b1, x, z, 1, theta, 1);
      assert_true(cabs(w0 - w1) < 1e-13);
      assert_true(max_diff(a.dim, a.a, a1.a) == 0 && max_diff(b.dim, b.a, b1.a) == 0);
      sv_state_free(&a);
      sv_state_free(&b);
      sv_state_free(&a1);
      sv_state_free(&b1);
    }
  assert_true(forced >= 8); /* the copy paths were taken */
}

/* op psi and <psi|op|psi> for random sums with complex coefficients (not
 * Hermitian: every element of the group tables is exercised) on 1..8 qubits,
 * below and above the block size, against the dense sum of word matrices. */
static void test_op_matches_dense(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 13);
  for (int n = 1; n <= 8; n++) {
    uint64_t dim = (uint64_t)1 << n;
    for (int trial = 0; trial < 4; trial++) {
      pauli_sum s;
      pauli_sum_init(&s, n);
      double complex *M = xcalloc(dim * dim, sizeof *M);
      int nterms = 1 + (int)(util_rng_next(&r) % (uint64_t)(6 * n + 4));
      for (int t = 0; t < nterms; t++) {
        char letters[9];
        random_letters(&r, n, letters);
        /* repeat some X masks with other Z letters: groups of several terms */
        if (t > 0 && (t % 3) == 0)
          for (int q = 0; q < n; q++)
            if (letters[q] == 'Z') letters[q] = 'I';
        double cre = util_rng_uniform(&r) - 0.5, cim = (trial & 1) ? util_rng_uniform(&r) - 0.5 : 0;
        double complex c = cre + I * cim;
        char *dense = letters; /* pauli_word_parse takes dense text */
        pauli_sum_add_text(&s, dense, c);
        double complex *P = dense_word(n, letters);
        for (uint64_t k = 0; k < dim * dim; k++) M[k] += c * P[k];
        free(P);
      }
      char err[200];
      sv_op *op = sv_op_new(&s, err, sizeof err);
      assert_non_null(op);
      sv_state psi, out;
      sv_state_alloc(&psi, n);
      sv_state_alloc(&out, n);
      random_state(&r, &psi);
      double complex *want = xmalloc(dim * sizeof *want);
      matvec(dim, M, psi.a, want);
      double complex e_want = 0;
      for (uint64_t i = 0; i < dim; i++) e_want += conj(psi.a[i]) * want[i];
      double complex e1 = sv_op_apply(op, &psi, &out);
      assert_true(max_diff(dim, out.a, want) < 1e-12);
      assert_true(cabs(e1 - e_want) < 1e-12);
      assert_true(cabs(sv_op_expect(op, &psi) - e_want) < 1e-12);
      sv_op_free(op);
      free(M);
      free(want);
      sv_state_free(&psi);
      sv_state_free(&out);
      pauli_sum_free(&s);
    }
  }
}

/* A Hermitian sum's expectation value is real (to rounding) and equals the
 * inner product with op psi. */
static void test_op_hermitian_real(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 14);
  int n = 10;
  pauli_sum s;
  pauli_sum_init(&s, n);
  for (int t = 0; t < 300; t++) {
    char letters[11];
    random_letters(&r, n, letters);
    pauli_sum_add_text(&s, letters, util_rng_uniform(&r) - 0.5);
  }
  char err[200];
  sv_op *op = sv_op_new(&s, err, sizeof err);
  assert_non_null(op);
  assert_true(sv_op_groups(op) <= sv_op_terms(op));
  sv_state psi, out;
  sv_state_alloc(&psi, n);
  sv_state_alloc(&out, n);
  random_state(&r, &psi);
  double complex e = sv_op_expect(op, &psi);
  assert_true(fabs(cimag(e)) < 1e-12 * fmax(1, fabs(creal(e))));
  sv_op_apply(op, &psi, &out);
  assert_true(cabs(sv_inner(&psi, &out) - e) < 1e-11);
  sv_op_free(op);
  sv_state_free(&psi);
  sv_state_free(&out);
  pauli_sum_free(&s);
}

/* A register the machine cannot hold is refused with both figures; a width
 * beyond the engine's masks is refused by width. */
static void test_memory_refusal(void **state) {
  (void)state;
  char err[300];
  uint64_t have = util_mem_available();
  /* 40 qubits: 2 vectors of 16 TiB each (16 * 2^40 bytes) */
  assert_int_equal(sv_vector_bytes(40), (uint64_t)16 << 40);
  if (have != 0 && have < ((uint64_t)32 << 40)) {
    assert_int_equal(sv_mem_check(40, 2, 0, err, sizeof err), -1);
    assert_non_null(strstr(err, "40-qubit"));
    assert_non_null(strstr(err, "needs 32.0 TiB (2 vectors of 16.0 TiB)"));
    char hb[32], want[64];
    snprintf(want, sizeof want, "this machine has %s available", sv_fmt_bytes(hb, have));
    assert_non_null(strstr(err, want));
  }
  assert_int_equal(sv_mem_check(SV_MAX_QUBITS + 1, 1, 0, err, sizeof err), -1);
  assert_non_null(strstr(err, "cannot be simulated"));
  assert_int_equal(sv_mem_check(0, 1, 0, err, sizeof err), -1);
  assert_int_equal(sv_mem_check(4, 2, 0, err, sizeof err), 0);
  char b[32];
  assert_string_equal(sv_fmt_bytes(b, 512), "512 B");
  assert_string_equal(sv_fmt_bytes(b, (uint64_t)3 << 29), "1.5 GiB");
}

/* Reductions give the same bits with one thread and with two (OpenMP): the
 * chunked sums do not depend on the team. */
static void test_thread_independence(void **state) {
  (void)state;
#ifdef _OPENMP
  util_rng r;
  util_rng_seed(&r, 15);
  int n = 17;
  pauli_sum s;
  pauli_sum_init(&s, n);
  for (int t = 0; t < 60; t++) {
    char letters[18];
    random_letters(&r, n, letters);
    pauli_sum_add_text(&s, letters, util_rng_uniform(&r) - 0.5);
  }
  char err[200];
  sv_op *op = sv_op_new(&s, err, sizeof err);
  sv_state psi, out;
  sv_state_alloc(&psi, n);
  sv_state_alloc(&out, n);
  random_state(&r, &psi);
  double complex v[2][3];
  int saved = omp_get_max_threads();
  for (int k = 0; k < 2; k++) {
    omp_set_num_threads(k + 1);
    v[k][0] = sv_op_expect(op, &psi);
    v[k][1] = sv_op_apply(op, &psi, &out);
    v[k][2] = sv_word_inner(&psi, 0x5a5a, 0x0ff0, &out);
  }
  omp_set_num_threads(saved);
  assert_memory_equal(v[0], v[1], sizeof v[0]);
  sv_op_free(op);
  sv_state_free(&psi);
  sv_state_free(&out);
  pauli_sum_free(&s);
#else
  skip();
#endif
}

/* Jordan-Wigner ladder operator a_p (dagger: a_p^+) = Z_0..Z_{p-1} (X_p +- i Y_p)/2
 * (the Jordan-Wigner transformation, 1928; common practice). */
static void jw_ladder(int n, int p, int dagger, pauli_sum *out) {
  pauli_sum_init(out, n);
  uint64_t x = (uint64_t)1 << p, zs = x - 1;
  uint64_t zx = zs, zy = zs | x;
  pauli_sum_add(out, &x, &zx, 0.5);
  pauli_sum_add(out, &x, &zy, dagger ? -0.5 * I : 0.5 * I);
}

/* G = 2i (T - T^+) for T = a_to[k]^+ ... a_from[k] ... (a fermionic excitation,
 * stored as in ansatz.h). */
static void jw_excitation(int n, int k, const int *from, const int *to, pauli_sum *G) {
  pauli_sum T, f, tmp;
  pauli_sum_init(&T, n);
  pauli_sum_add_identity(&T, 1.0);
  pauli_sum_init(&tmp, n);
  for (int a = 0; a < k; a++) {
    jw_ladder(n, to[a], 1, &f);
    pauli_sum_mul(&tmp, &T, &f);
    pauli_sum_copy(&T, &tmp);
    pauli_sum_free(&f);
  }
  for (int a = k - 1; a >= 0; a--) {
    jw_ladder(n, from[a], 0, &f);
    pauli_sum_mul(&tmp, &T, &f);
    pauli_sum_copy(&T, &tmp);
    pauli_sum_free(&f);
  }
  pauli_sum Td;
  pauli_sum_init(&Td, n);
  pauli_sum_adjoint(&Td, &T);
  pauli_sum_init(G, n);
  pauli_sum_add_sum(G, &T, 2.0 * I);
  pauli_sum_add_sum(G, &Td, -2.0 * I);
  pauli_sum_canonicalize(G, 1e-15);
  pauli_sum_free(&T);
  pauli_sum_free(&Td);
  pauli_sum_free(&tmp);
}

/* Check a fused generator against the same words one by one. */
static void check_gen(util_rng *r, int n, int count, const uint64_t *x, const uint64_t *z, const double *m,
                      const sv_gen *g) {
  sv_state a, b, a2, b2;
  sv_state_alloc(&a, n);
  sv_state_alloc(&b, n);
  sv_state_alloc(&a2, n);
  sv_state_alloc(&b2, n);
  random_state(r, &a);
  random_state(r, &b);
  sv_copy(&a2, &a);
  sv_copy(&b2, &b);
  double theta = 3 * util_rng_uniform(r) - 1.5;
  double complex want = 0;
  for (int k = 0; k < count; k++) want += m[k] * sv_word_inner(&a, x[k], z[k], &b);
  assert_true(cabs(sv_gen_inner(g, &a, &b) - want) < 1e-12);
  for (int k = 0; k < count; k++) {
    sv_rotate(&a, x[k], z[k], theta * m[k]);
    sv_rotate(&b, x[k], z[k], theta * m[k]);
  }
  double complex got = sv_gen_inner_rotate2(g, &a2, &b2, theta);
  assert_true(cabs(got - want) < 1e-12);
  assert_true(max_diff(a.dim, a.a, a2.a) < 1e-13);
  assert_true(max_diff(b.dim, b.a, b2.a) < 1e-13);
  random_state(r, &a);
  sv_copy(&a2, &a);
  for (int k = 0; k < count; k++) sv_rotate(&a, x[k], z[k], theta * m[k]);
  sv_gen_rotate(g, &a2, theta);
  assert_true(max_diff(a.dim, a.a, a2.a) < 1e-13);
  sv_state_free(&a);
  sv_state_free(&b);
  sv_state_free(&a2);
  sv_state_free(&b2);
}

/* Jordan-Wigner single and double excitations fuse, touch 1/2 and 1/8 of the
 * pairs (a single moves one of 2 occupation patterns of its 2 spin orbitals
 * to the other, a double one of 16 patterns of 4; common practice), and equal
 * their words applied one by one; single words fuse trivially. */
static void test_fused_excitations(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 16);
  const int n = 9;
  const int cases[][5] = {{1, 0, 0, 3, 0}, {1, 2, 0, 7, 0}, {2, 0, 1, 4, 6}, {2, 1, 3, 5, 8}, {2, 0, 7, 2, 8}};
  for (size_t c = 0; c < sizeof cases / sizeof *cases; c++) {
    int k = cases[c][0], from[2], to[2];
    if (k == 1) {
      from[0] = cases[c][1];
      to[0] = cases[c][3];
    } else {
      from[0] = cases[c][1];
      from[1] = cases[c][2];
      to[0] = cases[c][3];
      to[1] = cases[c][4];
    }
    pauli_sum G;
    jw_excitation(n, k, from, to, &G);
    assert_int_equal((int)G.len, k == 1 ? 2 : 8); /* 2 and 8 words (REFERENCES.md, common practice) */
    uint64_t x[8], z[8];
    double m[8];
    for (size_t t = 0; t < G.len; t++) {
      x[t] = pauli_sum_x(&G, t)[0];
      z[t] = pauli_sum_z(&G, t)[0];
      assert_true(fabs(cimag(G.c[t])) < 1e-15);
      m[t] = creal(G.c[t]);
    }
    sv_gen *g = sv_gen_new(n, (int)G.len, x, z, m);
    assert_non_null(g);
    assert_true(sv_gen_coverage(g) == (k == 1 ? 0.5 : 0.125));
    check_gen(&r, n, (int)G.len, x, z, m, g);
    sv_gen_free(g);
    pauli_sum_free(&G);
  }
  for (int trial = 0; trial < 20; trial++) {
    uint64_t x = 1 + util_rng_next(&r) % 511, z = util_rng_next(&r) % 512;
    double m = util_rng_uniform(&r) - 0.5;
    sv_gen *g = sv_gen_new(n, 1, &x, &z, &m);
    assert_non_null(g);
    assert_true(sv_gen_coverage(g) == 1.0);
    check_gen(&r, n, 1, &x, &z, &m, g);
    sv_gen_free(g);
  }
}

/* Random commuting words on one X mask: fused when |h| is constant on every
 * sub-cube (then equal to the words one by one), refused otherwise; words
 * that do not commute or differ in X are refused. */
static void test_fused_random(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 17);
  int fused = 0, refused = 0;
  for (int trial = 0; trial < 60; trial++) {
    int n = 3 + trial % 8, count = 2 + (int)(util_rng_next(&r) % 4);
    uint64_t all = ((uint64_t)1 << n) - 1, x[6], z[6];
    double m[6];
    x[0] = 1 + util_rng_next(&r) % all;
    for (int k = 0; k < count; k++) {
      x[k] = x[0];
      do z[k] = util_rng_next(&r) & all;
      while (((__builtin_popcountll(x[k] & z[k]) ^ __builtin_popcountll(x[0] & z[0])) & 1) != 0);
      /* keep Z letters away from x most of the time: X/Y variants merge */
      if (trial % 2) z[k] &= x[0];
      m[k] = util_rng_uniform(&r) - 0.5;
    }
    sv_gen *g = sv_gen_new(n, count, x, z, m);
    if (g) {
      fused++;
      check_gen(&r, n, count, x, z, m, g);
      sv_gen_free(g);
    } else
      refused++;
  }
  assert_true(fused > 0 && refused > 0);
  uint64_t x[2] = {3, 3}, z[2] = {0, 1}; /* X0 X1 and Y0 X1 anticommute */
  double m[2] = {1, 1};
  assert_null(sv_gen_new(4, 2, x, z, m));
  x[1] = 5;
  z[1] = 0;
  assert_null(sv_gen_new(4, 2, x, z, m));
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_rotation_matches_dense), cmocka_unit_test(test_word_inner), cmocka_unit_test(test_streaming_orders),
      cmocka_unit_test(test_op_matches_dense),       cmocka_unit_test(test_op_hermitian_real),
      cmocka_unit_test(test_memory_refusal),         cmocka_unit_test(test_thread_independence),
      cmocka_unit_test(test_fused_excitations),      cmocka_unit_test(test_fused_random),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
