/* test_front_parse.c — the parser: statement kinds, expression trees
 * (precedence, signs, units), block items, and error recovery that gives one
 * message per mistake. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <cmocka.h>

#include "front/ast.h"
#include "front/parse.h"
#include "test_front.h"

typedef struct parsed {
  ft t;
  ast_file *a;
} parsed;

static void parse(parsed *p, const char *text) {
  ft_init(&p->t);
  p->a = front_parse(p->t.d, ft_text(&p->t, "p.cairn", text));
}

static void done(parsed *p) {
  ast_file_free(p->a);
  ft_free(&p->t);
}

/* An expression tree in prefix form: "(+ 1 (* 2 (^ 3 2)))". */
static void tree(parsed *p, const ast_expr *e, util_buf *b) {
  size_t n;
  const char *t;
  switch (e->kind) {
  case AST_E_NUM:
  case AST_E_NAME:
    t = ast_text(p->t.d, e->span, &n);
    util_buf_append(b, t, n);
    break;
  case AST_E_SIGN:
    util_buf_printf(b, "(neg%c ", e->op);
    tree(p, e->a, b);
    util_buf_printf(b, ")");
    break;
  case AST_E_BIN:
    util_buf_printf(b, "(%c ", e->op);
    tree(p, e->a, b);
    util_buf_printf(b, " ");
    tree(p, e->b, b);
    util_buf_printf(b, ")");
    break;
  case AST_E_CALL:
    util_buf_printf(b, "(%s ", ast_func_name(e->func));
    tree(p, e->a, b);
    util_buf_printf(b, ")");
    break;
  case AST_E_UNIT:
    util_buf_printf(b, "(%s ", ir_unit_name(e->unit));
    tree(p, e->a, b);
    util_buf_printf(b, ")");
    break;
  case AST_E_PAREN:
    util_buf_printf(b, "[");
    tree(p, e->a, b);
    util_buf_printf(b, "]");
    break;
  }
}

static void expect_tree(parsed *p, const ast_expr *e, const char *want) {
  util_buf b = {0};
  util_buf_append(&b, "", 0);
  tree(p, e, &b);
  assert_string_equal(b.s, want);
  util_buf_free(&b);
}

static void test_precedence(void **state) {
  (void)state;
  parsed p;
  parse(&p, "let x = 1 + 2*3^2^2 - 4/5\nlet y = -r^2*3\nlet z = 2*(1 + 3) deg\nlet w = sin(52.25 deg)*r angstrom\n");
  assert_int_equal(p.a->errors, 0);
  assert_int_equal(p.a->stmts.n, 4);
  for (int i = 0; i < 4; i++) assert_int_equal(p.a->stmts.v[i]->kind, AST_LET);
  expect_tree(&p, p.a->stmts.v[0]->e[0], "(- (+ 1 (* 2 (^ 3 (^ 2 2)))) (/ 4 5))");
  expect_tree(&p, p.a->stmts.v[1]->e[0], "(* (neg- (^ r 2)) 3)");
  expect_tree(&p, p.a->stmts.v[2]->e[0], "(* 2 (deg [(+ 1 3)]))");
  expect_tree(&p, p.a->stmts.v[3]->e[0], "(* (sin (deg 52.25)) (angstrom r))");
  done(&p);
}

/* The atom line of DESIGN.md: three coordinates, the second negative. */
static void test_atoms(void **state) {
  (void)state;
  parsed p;
  parse(&p, "atoms angstrom {\n  O 0 0 0\n  H 0 -r*sin(x) r*cos(x)\n\n  in 1 2 3\n}\n");
  assert_int_equal(p.a->errors, 0);
  assert_int_equal(p.a->stmts.n, 1);
  ast_stmt *s = p.a->stmts.v[0];
  assert_int_equal(s->kind, AST_ATOMS);
  assert_true(ast_text_is(p.t.d, s->variant_span, "angstrom"));
  assert_int_equal(s->items.n, 3);
  ast_stmt *h = s->items.v[1];
  assert_int_equal(h->kind, AST_ATOM);
  assert_true(ast_text_is(p.t.d, h->name, "H"));
  expect_tree(&p, h->e[0], "0");
  expect_tree(&p, h->e[1], "(* (neg- r) (sin x))");
  expect_tree(&p, h->e[2], "(* r (cos x))");
  assert_true(ast_text_is(p.t.d, s->items.v[2]->name, "in")); /* indium */
  assert_true(ast_text_is(p.t.d, s->close, "}"));
  done(&p);
}

static void test_statements(void **state) {
  (void)state;
  parsed p;
  parse(&p,
        "cairn 1\nvary r from 0.8 to 2.4 step 0.2\ncharge -1\nmultiplicity 2\nbasis 6-31g*\n"
        "orbitals {\n  freeze 1 2\n  active orbitals 3..6 8\n}\nencoding parity taper\nreference bits 0011\n"
        "keep spin-squared checked 1e-6\npool {\n  doubles paired\n  qubit singles\n  word X0 Y1\n"
        "  excite 0 1 -> 4 5\n}\nchoose 8 by gradient\ngrow to 30 until 1e-3\norder by rank\ntrotter 2\n"
        "optimize cobyla iterations 10 guess mp2\nemit qasm2 \"a.qasm\"\nuse \"b.cairn\"\n");
  assert_int_equal(p.a->errors, 0);
  static const ast_kind want[] = {AST_HEADER, AST_VARY, AST_CHARGE, AST_MULTIPLICITY, AST_BASIS, AST_ORBITALS,
                                  AST_ENCODING, AST_REFERENCE_BITS, AST_KEEP, AST_POOL, AST_CHOOSE, AST_CHOOSE,
                                  AST_ORDER, AST_TROTTER, AST_OPTIMIZE, AST_EMIT, AST_USE};
  int n = (int)(sizeof want / sizeof want[0]);
  assert_int_equal(p.a->stmts.n, n);
  for (int i = 0; i < n; i++) assert_int_equal(p.a->stmts.v[i]->kind, want[i]);
  ast_stmt **v = p.a->stmts.v;
  expect_tree(&p, v[2]->e[0], "(neg- 1)");
  assert_true(ast_text_is(p.t.d, v[4]->name, "6-31g*"));
  ast_stmt *orb = v[5];
  assert_int_equal(orb->items.n, 2);
  assert_int_equal(orb->items.v[0]->kind, AST_FREEZE_LIST);
  assert_int_equal(orb->items.v[0]->list.n, 2);
  assert_int_equal(orb->items.v[1]->kind, AST_ACTIVE_LIST);
  assert_int_equal(orb->items.v[1]->list.n, 2);
  assert_true(ast_text_is(p.t.d, orb->items.v[1]->list.v[0].hi, "6"));
  assert_true(orb->items.v[1]->list.v[1].hi.file < 0);
  assert_int_equal(v[6]->words.n, 1);
  assert_true(ast_text_is(p.t.d, v[7]->name, "0011"));
  assert_int_equal(v[8]->variant, IR_KEEP_CHECKED);
  ast_stmt *pool = v[9];
  assert_int_equal(pool->items.n, 4);
  assert_int_equal(pool->items.v[0]->kind, AST_RULE);
  assert_int_equal(pool->items.v[0]->words.n, 2);
  assert_int_equal(pool->items.v[2]->kind, AST_PAULI);
  assert_int_equal(pool->items.v[2]->words.n, 2);
  assert_int_equal(pool->items.v[3]->kind, AST_EXCITE);
  assert_int_equal(pool->items.v[3]->list.n, 2);
  assert_int_equal(pool->items.v[3]->list2.n, 2);
  assert_int_equal(v[10]->variant, IR_CHOOSE_COUNT);
  assert_int_equal(v[11]->variant, IR_CHOOSE_GROW);
  assert_int_equal(v[12]->variant, IR_ORDER_RANK);
  assert_int_equal(v[14]->items.n, 2);
  assert_true(ast_text_is(p.t.d, v[14]->items.v[1]->name, "guess"));
  expect_tree(&p, v[14]->items.v[1]->e[0], "mp2");
  done(&p);
}

/* Comments are kept for fmt, with their spans. */
static void test_comments(void **state) {
  (void)state;
  parsed p;
  parse(&p, "# head\ncharge 0 # tail\n");
  assert_int_equal(p.a->ncomments, 2);
  assert_int_equal(p.a->comments[0].start, 0);
  assert_int_equal(p.a->comments[0].end, 6);
  assert_int_equal(p.a->comments[1].start, 16);
  done(&p);
}

/* One mistake, one message: the statements around it still parse. */
static void test_recovery(void **state) {
  (void)state;
  parsed p;
  parse(&p, "let = 1\nlet y = 2\nbassis sto-3g\ncharge 0\n");
  assert_int_equal(p.a->errors, 2);
  assert_int_equal(p.a->stmts.n, 2);
  assert_int_equal(p.a->stmts.v[0]->kind, AST_LET);
  assert_int_equal(p.a->stmts.v[1]->kind, AST_CHARGE);
  assert_non_null(strstr(ft_messages(&p.t), "did you mean `basis`?"));
  done(&p);
  /* a missing `}`: the following statements are not swallowed */
  parse(&p, "atoms {\n  H 0 0 0\n  H 0 0 0.74\nbasis sto-3g\ncharge 0\nmultiplicity 1\n");
  assert_int_equal(p.a->errors, 1);
  assert_int_equal(p.a->stmts.n, 4);
  assert_int_equal(p.a->stmts.v[0]->items.n, 2);
  assert_int_equal(p.a->stmts.v[3]->kind, AST_MULTIPLICITY);
  done(&p);
  /* a missing `{` */
  parse(&p, "pool\n  singles\n}\ntrotter 1\n");
  assert_int_equal(p.a->errors, 1);
  assert_int_equal(p.a->stmts.n, 2);
  assert_int_equal(p.a->stmts.v[0]->items.n, 1);
  done(&p);
  /* errors on consecutive lines are all reported */
  parse(&p, "let = 1\nlet = 2\nlet = 3\n");
  assert_int_equal(p.a->errors, 3);
  assert_int_equal(diag_errors(p.t.d), 3);
  done(&p);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_precedence), cmocka_unit_test(test_atoms),    cmocka_unit_test(test_statements),
      cmocka_unit_test(test_comments),   cmocka_unit_test(test_recovery),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
