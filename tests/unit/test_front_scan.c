/* test_front_scan.c — the scanner: token kinds, byte spans, the sign rule,
 * start conditions, lexical errors, and the block-keeping lexer wrapper. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <cmocka.h>

#include "front/parse.h"
#include "recipe.tab.h"
#include "test_front.h"

enum { MAXTOK = 64 };

typedef struct toks {
  front_tok v[MAXTOK];
  int n;
  int errors;
} toks;

static void lex(const char *text, toks *out) {
  ft t;
  ft_init(&t);
  int32_t f = ft_text(&t, "t.cairn", text);
  out->n = front_tokens(t.d, f, out->v, MAXTOK);
  out->errors = diag_errors(t.d);
  ft_free(&t);
}

/* Assert the kinds of all tokens (0 = end of file ends the list). */
static void kinds(const toks *t, const int *want) {
  int i = 0;
  for (; want[i]; i++) {
    assert_true(i < t->n);
    assert_int_equal(t->v[i].kind, want[i]);
  }
  assert_int_equal(t->v[i].kind, 0);
  assert_int_equal(t->n, i + 1);
}

static void span_is(const front_tok *k, uint32_t start, uint32_t end) {
  assert_int_equal(k->loc.start, start);
  assert_int_equal(k->loc.end, end);
}

static void test_let(void **state) {
  (void)state;
  toks t;
  lex("let r = 0.96 angstrom\n", &t);
  kinds(&t, (int[]){LET, IDENT, EQ, NUMBER, UNIT, NL, 0});
  span_is(&t.v[0], 0, 3);
  span_is(&t.v[1], 4, 5);
  span_is(&t.v[2], 6, 7);
  span_is(&t.v[3], 8, 12);
  span_is(&t.v[4], 13, 21);
  span_is(&t.v[5], 21, 22);
  assert_int_equal(t.errors, 0);
}

/* The sign rule: `x -y` at depth 0 is two values; `x - y`, `x-y`... are not. */
static void test_signs(void **state) {
  (void)state;
  toks t;
  lex("H 0 -r*sin(x) r*cos(x)", &t);
  kinds(&t, (int[]){IDENT, NUMBER, SIGN, IDENT, STAR, FUNC, LPAREN, IDENT, RPAREN, IDENT, STAR, FUNC, LPAREN, IDENT,
                    RPAREN, NL, 0});
  assert_int_equal(t.v[2].flag, '-');
  lex("a - b", &t);
  kinds(&t, (int[]){IDENT, MINUS, IDENT, NL, 0});
  lex("a -b", &t);
  kinds(&t, (int[]){IDENT, SIGN, IDENT, NL, 0});
  lex("(a -b)", &t);
  kinds(&t, (int[]){LPAREN, IDENT, MINUS, IDENT, RPAREN, NL, 0});
  lex("2-1 x-1 2*-1 = +3", &t);
  kinds(&t, (int[]){NUMBER, MINUS, NUMBER, IDENT, MINUS, NUMBER, NUMBER, STAR, SIGN, NUMBER, EQ, SIGN, NUMBER, NL, 0});
  assert_int_equal(t.v[11].flag, '+');
  /* the final newline of a file without one is supplied, empty */
  span_is(&t.v[13], 17, 17);
}

/* Names may carry hyphens between letters: keywords like jordan-wigner are
 * one token, `a-b` is one name. */
static void test_names(void **state) {
  (void)state;
  toks t;
  lex("encoding jordan-wigner taper\nkeep spin-z exactly\nx a-b", &t);
  kinds(&t, (int[]){ENCODING, IDENT, IDENT, NL, KEEP, IDENT, EXACTLY, NL, IDENT, IDENT, NL, 0});
  span_is(&t.v[1], 9, 22);
  span_is(&t.v[9], 51, 54);
}

static void test_start_conditions(void **state) {
  (void)state;
  toks t;
  lex("basis 6-31g*\nbasis file \"x.gbs\"\nreference bits 00110011 # c\n", &t);
  kinds(&t, (int[]){BASIS, BASISNAME, NL, BASIS, FILE_, STRING, NL, REFERENCE, BITS, BITSTR, NL, 0});
  span_is(&t.v[1], 6, 12);
  span_is(&t.v[5], 24, 31);
  span_is(&t.v[9], 47, 55);
  assert_int_equal(t.errors, 0);
}

static void test_ranges_and_arrows(void **state) {
  (void)state;
  toks t;
  lex("active orbitals 3..6 8\nexcite 0 1 -> 4 5\n", &t);
  kinds(&t, (int[]){ACTIVE, ORBITALS, NUMBER, DOTDOT, NUMBER, NUMBER, NL, EXCITE, NUMBER, NUMBER, ARROW, NUMBER, NUMBER,
                    NL, 0});
  span_is(&t.v[2], 16, 17);
  span_is(&t.v[3], 17, 19);
  span_is(&t.v[4], 19, 20);
}

static void test_numbers(void **state) {
  (void)state;
  toks t;
  lex("1 0.5 .5 1e-8 2.5E+3 3.", &t);
  kinds(&t, (int[]){NUMBER, NUMBER, NUMBER, NUMBER, NUMBER, NUMBER, NL, 0});
  for (int i = 0; i < 6; i++) assert_int_equal(t.v[i].flag, 0);
  assert_int_equal(t.errors, 0);
  lex("1.2.3 2deg", &t);
  kinds(&t, (int[]){NUMBER, NUMBER, NL, 0});
  assert_int_equal(t.v[0].flag, 1);
  span_is(&t.v[0], 0, 5);
  assert_int_equal(t.v[1].flag, 1);
  assert_int_equal(t.errors, 1); /* one message per line */
}

static void test_comments_and_errors(void **state) {
  (void)state;
  toks t;
  lex("# only a comment\ncharge 0 # trailing\n", &t);
  kinds(&t, (int[]){NL, CHARGE, NUMBER, NL, 0});
  lex("use \"abc\n", &t);
  kinds(&t, (int[]){USE, STRING, NL, 0});
  span_is(&t.v[1], 4, 8);
  assert_int_equal(t.errors, 1);
  lex("charge @ 0\n", &t);
  kinds(&t, (int[]){CHARGE, NUMBER, NL, 0});
  assert_int_equal(t.errors, 1);
}

/* A block whose `}` is missing is closed by the wrapper before the next
 * statement, with one error. */
static void test_missing_brace(void **state) {
  (void)state;
  toks t;
  lex("atoms {\n  H 0 0 0\ncharge 0\n", &t);
  kinds(&t, (int[]){ATOMS, LBRACE, NL, IDENT, NUMBER, NUMBER, NUMBER, NL, RBRACE, NL, CHARGE, NUMBER, NL, 0});
  span_is(&t.v[8], 18, 18);
  assert_int_equal(t.errors, 1);
  lex("pool {\n  singles\n", &t);
  kinds(&t, (int[]){POOL, LBRACE, NL, IDENT, NL, RBRACE, NL, 0});
  assert_int_equal(t.errors, 1);
  /* `}` after an item gets its own line */
  lex("pool {\n  singles }\n", &t);
  kinds(&t, (int[]){POOL, LBRACE, NL, IDENT, NL, RBRACE, NL, 0});
  assert_int_equal(t.errors, 1);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_let),          cmocka_unit_test(test_signs),
      cmocka_unit_test(test_names),        cmocka_unit_test(test_start_conditions),
      cmocka_unit_test(test_ranges_and_arrows), cmocka_unit_test(test_numbers),
      cmocka_unit_test(test_comments_and_errors), cmocka_unit_test(test_missing_brace),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
