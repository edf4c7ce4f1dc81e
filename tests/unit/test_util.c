/* test_util.c — number spelling, atomic output, the deterministic PRNG, medians. */
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

#include "cairn/util.h"

static void test_fmt_double(void **state) {
  (void)state;
  char b[32];
  assert_string_equal(util_fmt_double(b, 1.0), "1");
  assert_string_equal(util_fmt_double(b, 0.5), "0.5");
  assert_string_equal(util_fmt_double(b, 1e-6), "1e-6");
  assert_string_equal(util_fmt_double(b, 0.1), "0.1");
  assert_string_equal(util_fmt_double(b, 1e20), "1e20");
  /* every spelling reads back to the same double */
  util_rng r;
  util_rng_seed(&r, 3);
  for (int i = 0; i < 10000; i++) {
    double x = (util_rng_uniform(&r) - 0.5) * 1e3 * util_rng_uniform(&r);
    assert_true(strtod(util_fmt_double(b, x), NULL) == x);
  }
}

static void test_atomic_write(void **state) {
  (void)state;
  char dir[] = "/tmp/cairn-test-XXXXXX";
  assert_non_null(mkdtemp(dir));
  char *path = xasprintf("%s/out.txt", dir);
  assert_int_equal(util_write_atomic(path, "abc", 3), 0);
  util_afile *f = util_afile_open(path);
  assert_non_null(f);
  fputs("half", util_afile_stream(f));
  util_afile_abort(f);
  size_t len;
  char *text = util_read_file(path, &len);
  assert_string_equal(text, "abc"); /* the aborted write left the old file */
  free(text);
  unlink(path);
  rmdir(dir);
  free(path);
}

static void test_rng_repeatable(void **state) {
  (void)state;
  util_rng a, b;
  util_rng_seed(&a, 7);
  util_rng_seed(&b, 7);
  for (int i = 0; i < 100; i++) assert_true(util_rng_next(&a) == util_rng_next(&b));
}

/* The median as commonly defined (common practice): the middle value of the
 * sorted list, the mean of the two middle values for an even count. */
static void test_median(void **state) {
  (void)state;
  double odd[5] = {3.0, -1.0, 7.5, 2.0, 2.5};
  assert_true(util_median(odd, 5) == 2.5);
  for (int i = 1; i < 5; i++) assert_true(odd[i - 1] <= odd[i]); /* sorted in place */
  assert_true(odd[0] == -1.0 && odd[4] == 7.5);
  double even[4] = {4.0, 1.0, 10.0, 2.0};
  assert_true(util_median(even, 4) == 3.0);
  double one[1] = {0.25};
  assert_true(util_median(one, 1) == 0.25);
}

int main(void) {
  const struct CMUnitTest tests[] = {cmocka_unit_test(test_fmt_double), cmocka_unit_test(test_atomic_write),
                                     cmocka_unit_test(test_rng_repeatable), cmocka_unit_test(test_median)};
  return cmocka_run_group_tests(tests, NULL, NULL);
}
