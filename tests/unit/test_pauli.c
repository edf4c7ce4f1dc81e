/* test_pauli.c — Pauli word algebra and sums. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "cairn/json.h"
#include "cairn/pauli.h"
#include "cairn/util.h"

#include <complex.h>

static void word1(char L, uint64_t *x, uint64_t *z) {
  x[0] = z[0] = 0;
  if (L != 'I') pauli_set_letter(x, z, 0, L);
}

/* The single-qubit multiplication table (XY = iZ, YZ = iX, ZX = iY, squares are
 * the identity): the Pauli matrices' defining relations, common practice. */
static void test_single_qubit_table(void **state) {
  (void)state;
  const char *L = "IXYZ";
  /* expected[a][b] = letter and power of i of sigma_a sigma_b */
  const char prod[4][4] = {{'I', 'X', 'Y', 'Z'}, {'X', 'I', 'Z', 'Y'}, {'Y', 'Z', 'I', 'X'}, {'Z', 'Y', 'X', 'I'}};
  const int phase[4][4] = {{0, 0, 0, 0}, {0, 0, 1, 3}, {0, 3, 0, 1}, {0, 1, 3, 0}};
  for (int a = 0; a < 4; a++)
    for (int b = 0; b < 4; b++) {
      uint64_t x1, z1, x2, z2, x3, z3;
      word1(L[a], &x1, &z1);
      word1(L[b], &x2, &z2);
      int k = pauli_word_mul(1, &x1, &z1, &x2, &z2, &x3, &z3);
      assert_int_equal(pauli_letter(&x3, &z3, 0), prod[a][b]);
      assert_int_equal(k, phase[a][b]);
      int commute = a == 0 || b == 0 || a == b;
      assert_int_equal(pauli_word_commutes(1, &x1, &z1, &x2, &z2), commute);
    }
}

/* Words on n qubits: 4^n - 1 non-identity words (fact of the trade), all
 * distinct under the canonical order, and each squares to the identity. */
static void test_enumerate_words(void **state) {
  (void)state;
  for (int n = 1; n <= 5; n++) {
    pauli_sum s;
    pauli_sum_init(&s, n);
    long total = 1L << (2 * n);
    for (long code = 0; code < total; code++) {
      uint64_t x = 0, z = 0;
      for (int q = 0; q < n; q++) pauli_set_letter(&x, &z, q, "IXYZ"[(code >> (2 * q)) & 3]);
      uint64_t x3, z3;
      assert_int_equal(pauli_word_mul(1, &x, &z, &x, &z, &x3, &z3), 0);
      assert_true(pauli_word_is_identity(1, &x3, &z3));
      if (code) pauli_sum_add(&s, &x, &z, 1.0);
    }
    pauli_sum_canonicalize(&s, 0.0);
    assert_int_equal((long)s.len, total - 1);
    for (size_t i = 1; i < s.len; i++)
      assert_true(pauli_word_cmp(s.nw, pauli_sum_x(&s, i - 1), pauli_sum_z(&s, i - 1), pauli_sum_x(&s, i),
                                 pauli_sum_z(&s, i)) < 0);
    pauli_sum_free(&s);
  }
}

/* Two words anticommute exactly when they differ (both non-I) on an odd
 * number of qubits; checked across a 64-bit word boundary. */
static void test_wide_words(void **state) {
  (void)state;
  int n = 130, nw = pauli_nwords(n);
  assert_int_equal(nw, 3);
  uint64_t x1[3], z1[3], x2[3], z2[3], x3[3], z3[3];
  char err[128];
  assert_int_equal(pauli_word_parse("X0 Y63 Z64 X129", n, x1, z1, err, sizeof err, NULL), 0);
  assert_int_equal(pauli_word_parse("Z0 Y63 X64", n, x2, z2, err, sizeof err, NULL), 0);
  /* differs on qubits 0 and 64: two anticommuting letters -> commute */
  assert_true(pauli_word_commutes(nw, x1, z1, x2, z2));
  int k = pauli_word_mul(nw, x1, z1, x2, z2, x3, z3);
  /* X0 Z0 = -i Y0; Y63 Y63 = I; Z64 X64 = i Y64; X129 */
  char *s = pauli_word_str(n, x3, z3);
  assert_string_equal(s, "Y0 Y64 X129");
  free(s);
  assert_int_equal(k, 0); /* (-i)(i) = 1 */
  assert_int_equal(pauli_word_weight(nw, x1, z1), 4);
  assert_int_equal(pauli_word_ycount(nw, x1, z1), 1);
  int sup[4];
  assert_int_equal(pauli_word_support(nw, x1, z1, sup), 4);
  assert_true(sup[0] == 0 && sup[1] == 63 && sup[2] == 64 && sup[3] == 129);
}

static void test_parse_errors(void **state) {
  (void)state;
  uint64_t x[1], z[1];
  char err[128];
  size_t off = 99;
  assert_int_equal(pauli_word_parse("X0 Q1", 4, x, z, err, sizeof err, &off), -1);
  assert_int_equal(off, 3);
  assert_int_equal(pauli_word_parse("X0 Y0", 4, x, z, err, sizeof err, &off), -1);
  assert_string_equal(err, "qubit 0 appears twice");
  assert_int_equal(pauli_word_parse("X7", 4, x, z, err, sizeof err, &off), -1);
  assert_string_equal(err, "qubit 7 is beyond the register (qubits 0..3)");
  assert_int_equal(pauli_word_parse("XYZI", 4, x, z, err, sizeof err, &off), 0);
  char *d = pauli_word_dense(4, x, z);
  assert_string_equal(d, "XYZI");
  free(d);
  assert_int_equal(pauli_word_parse("XYZIZ", 4, x, z, err, sizeof err, &off), -1);
  assert_int_equal(pauli_word_parse("", 4, x, z, err, sizeof err, &off), -1);
}

/* [X0, Y0] = 2i Z0; [X0 X1, Z0 Z1] = 0; the accumulator merges like sort does. */
static void test_sums(void **state) {
  (void)state;
  pauli_sum a, b, c;
  pauli_sum_init(&a, 2);
  pauli_sum_init(&b, 2);
  pauli_sum_init(&c, 2);
  pauli_sum_add_text(&a, "X0", 1.0);
  pauli_sum_add_text(&b, "Y0", 1.0);
  pauli_sum_commutator(&c, &a, &b);
  assert_int_equal(c.len, 1);
  char *s = pauli_word_str(2, pauli_sum_x(&c, 0), pauli_sum_z(&c, 0));
  assert_string_equal(s, "Z0");
  free(s);
  assert_true(cabs(c.c[0] - 2.0 * I) < 1e-15);

  pauli_sum_clear(&a);
  pauli_sum_clear(&b);
  pauli_sum_add_text(&a, "X0 X1", 1.0);
  pauli_sum_add_text(&b, "Z0 Z1", 1.0);
  pauli_sum_commutator(&c, &a, &b);
  assert_int_equal(c.len, 0);

  /* (X0 + Z1)^2 = 2 I + 2 X0 Z1 */
  pauli_sum_clear(&a);
  pauli_sum_add_text(&a, "X0", 1.0);
  pauli_sum_add_text(&a, "Z1", 1.0);
  pauli_sum_mul(&c, &a, &a);
  assert_int_equal(c.len, 2);
  assert_true(pauli_word_is_identity(c.nw, pauli_sum_x(&c, 0), pauli_sum_z(&c, 0)));
  assert_true(cabs(c.c[0] - 2.0) < 1e-15 && cabs(c.c[1] - 2.0) < 1e-15);

  pauli_acc *acc = pauli_acc_new(2, 1);
  for (int i = 0; i < 1000; i++) {
    uint64_t x = (uint64_t)(i % 4), zz = (uint64_t)((i / 4) % 4);
    pauli_acc_add(acc, &x, &zz, 1.0);
  }
  assert_int_equal(pauli_acc_len(acc), 16);
  pauli_acc_finish(acc, &c, 0.0);
  assert_int_equal(c.len, 16);
  double total = 0;
  for (size_t i = 0; i < c.len; i++) total += creal(c.c[i]);
  assert_true(total == 1000.0);
  pauli_sum_free(&a);
  pauli_sum_free(&b);
  pauli_sum_free(&c);
}


/* The radix-sorted canonical form agrees with pauli_word_cmp at widths around
 * the 32- and 64-qubit boundaries, keeps every word exactly and sums repeats
 * in arrival order (compared with a naive quadratic merge). */
static void test_canonical_order(void **state) {
  (void)state;
  const int widths[] = {1, 2, 5, 31, 32, 33, 63, 64, 65, 100, 130, 200};
  util_rng r;
  util_rng_seed(&r, 42);
  for (size_t wi = 0; wi < sizeof widths / sizeof widths[0]; wi++) {
    int n = widths[wi], nw = pauli_nwords(n);
    pauli_sum s, ref;
    pauli_sum_init(&s, n);
    pauli_sum_init(&ref, n);
    uint64_t *x = calloc((size_t)nw, 8), *z = calloc((size_t)nw, 8);
    int nterms = 400;
    for (int t = 0; t < nterms; t++) {
      memset(x, 0, (size_t)nw * 8);
      memset(z, 0, (size_t)nw * 8);
      int dens = (int)(util_rng_next(&r) % 4); /* sparse to dense words */
      for (int q = 0; q < n; q++)
        if ((int)(util_rng_next(&r) % 8) <= dens) pauli_set_letter(x, z, q, "XYZ"[util_rng_next(&r) % 3]);
      /* repeat an earlier word now and then */
      if (t > 0 && util_rng_next(&r) % 5 == 0) {
        size_t k = util_rng_next(&r) % s.len;
        memcpy(x, pauli_sum_x(&s, k), (size_t)nw * 8);
        memcpy(z, pauli_sum_z(&s, k), (size_t)nw * 8);
      }
      double complex c = (double)(util_rng_next(&r) % 7) - 3.0 + I * (double)(util_rng_next(&r) % 3);
      pauli_sum_add(&s, x, z, c);
      /* naive merge */
      size_t k = 0;
      for (; k < ref.len; k++)
        if (pauli_word_equal(nw, pauli_sum_x(&ref, k), pauli_sum_z(&ref, k), x, z)) break;
      if (k < ref.len) ref.c[k] += c;
      else pauli_sum_add(&ref, x, z, c);
    }
    pauli_sum_canonicalize(&s, 0.0);
    size_t nonzero = 0;
    for (size_t k = 0; k < ref.len; k++) {
      if (ref.c[k] == 0) continue;
      nonzero++;
      long i = pauli_sum_find(&s, pauli_sum_x(&ref, k), pauli_sum_z(&ref, k));
      assert_true(i >= 0);
      assert_true(s.c[i] == ref.c[k]);
    }
    assert_int_equal(s.len, nonzero);
    for (size_t i = 1; i < s.len; i++)
      assert_true(pauli_word_cmp(nw, pauli_sum_x(&s, i - 1), pauli_sum_z(&s, i - 1), pauli_sum_x(&s, i),
                                 pauli_sum_z(&s, i)) < 0);
    free(x);
    free(z);
    pauli_sum_free(&s);
    pauli_sum_free(&ref);
  }
}

/* The messages the front end shows at a recipe's `word` span. */
static void test_parse_messages(void **state) {
  (void)state;
  uint64_t x[2], z[2];
  char err[160];
  size_t off = 0;
  assert_int_equal(pauli_word_parse("X0 Q1", 8, x, z, err, sizeof err, &off), -1);
  assert_string_equal(err, "`Q1` is not a Pauli letter with a qubit (X, Y or Z and a number)");
  assert_int_equal(off, 3);
  assert_int_equal(pauli_word_parse("X0 Y3 Z3", 8, x, z, err, sizeof err, &off), -1);
  assert_string_equal(err, "qubit 3 appears twice");
  assert_int_equal(off, 6);
  assert_int_equal(pauli_word_parse("X0 Z8", 8, x, z, err, sizeof err, &off), -1);
  assert_string_equal(err, "qubit 8 is beyond the register (qubits 0..7)");
  assert_int_equal(off, 3);
  assert_int_equal(pauli_word_parse("XQZ", 8, x, z, err, sizeof err, &off), -1);
  assert_int_equal(off, 1);
  assert_int_equal(pauli_word_parse("X1x", 8, x, z, err, sizeof err, &off), -1);
  /* 100-qubit register: sparse text round trip */
  assert_int_equal(pauli_word_parse("Z99 X0 Y64", 100, x, z, err, sizeof err, &off), 0);
  char *t = pauli_word_str(100, x, z);
  assert_string_equal(t, "X0 Y64 Z99");
  free(t);
}


/* A Pauli sum survives JSON text exactly: every coefficient reads back to the
 * same double (0.7794640752287191 is one cJSON alone would print short). */
static void test_json_round_trip(void **state) {
  (void)state;
  pauli_sum s, back;
  pauli_sum_init(&s, 70);
  util_rng r;
  util_rng_seed(&r, 5);
  pauli_sum_add_identity(&s, -46.42853115310073);
  pauli_sum_add_text(&s, "Z0 Z69", 0.7794640752287191);
  for (int k = 0; k < 200; k++) {
    char w[32];
    snprintf(w, sizeof w, "X%d Y%d", k % 35, 35 + k % 35);
    double re = (util_rng_uniform(&r) - 0.5) * 1e-3 * (double)(k + 1);
    double complex c = k % 3 ? re : re + I * util_rng_uniform(&r);
    pauli_sum_add_text(&s, w, c);
  }
  pauli_sum_canonicalize(&s, 0.0);
  cJSON *j = json_pauli_sum(&s);
  char *text = json_print(j);
  assert_non_null(strstr(text, "70")); /* integers as integers, not 7e1 */
  assert_null(strstr(text, "7e1"));
  cJSON *parsed = cJSON_Parse(text);
  assert_non_null(parsed);
  char err[160];
  assert_int_equal(json_read_pauli_sum(parsed, &back, err, sizeof err), 0);
  pauli_sum_canonicalize(&back, 0.0);
  assert_int_equal(back.len, s.len);
  for (size_t t = 0; t < s.len; t++) {
    assert_true(pauli_word_equal(s.nw, pauli_sum_x(&s, t), pauli_sum_z(&s, t), pauli_sum_x(&back, t),
                                 pauli_sum_z(&back, t)));
    assert_true(s.c[t] == back.c[t]);
  }
  free(text);
  cJSON_Delete(j);
  cJSON_Delete(parsed);
  pauli_sum_free(&s);
  pauli_sum_free(&back);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_single_qubit_table), cmocka_unit_test(test_enumerate_words),
      cmocka_unit_test(test_wide_words),         cmocka_unit_test(test_parse_errors),
      cmocka_unit_test(test_sums),               cmocka_unit_test(test_canonical_order),
      cmocka_unit_test(test_parse_messages),     cmocka_unit_test(test_json_round_trip),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
