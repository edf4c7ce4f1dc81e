/* test_gates.c — gate lowering, the cancellation pass, counts, spelling,
 * binding and the lowered diff. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include <complex.h>
#include <math.h>
#include <stdio.h>

#include "cairn/gates.h"
#include "cairn/util.h"
#include "lower/gate_int.h"

static gate G(int op, int q0, int q1, int param, double mult) {
  gate g = {mult, q0, q1, param, 0, 0, (uint8_t)op};
  return g;
}

static int add_word(ans_circuit *c, const char *text) {
  int nw = pauli_nwords(c->nqubits);
  uint64_t *x = calloc((size_t)nw, 8), *z = calloc((size_t)nw, 8);
  char err[100];
  assert_int_equal(pauli_word_parse(text, c->nqubits, x, z, err, sizeof err, NULL), 0);
  int w = ans_circuit_word(c, x, z);
  free(x);
  free(z);
  return w;
}

/* A generator of one or more words under one new parameter. */
static int add_gen(ans_circuit *c, ans_kind kind, const char *txt, const char *const *words, const double *mults,
                   int n) {
  ans_gen_info gi = {kind, (char *)txt, 0, 7, 0, {0}, {0}, 0};
  int g = ans_circuit_add_gen(c, &gi);
  int p = ans_circuit_add_param(c, g);
  for (int i = 0; i < n; i++) ans_circuit_push(c, add_word(c, words[i]), p, mults[i], g);
  return g;
}

/* ---- a small statevector for self-checks of the pass ---- */

static void apply(double complex *psi, int n, const gate *g, const double *theta) {
  size_t N = (size_t)1 << n;
  if (g->op == GATE_MARK) return;
  if (g->op == GATE_CX) {
    size_t c = (size_t)1 << g->q0, t = (size_t)1 << g->q1;
    for (size_t i = 0; i < N; i++)
      if ((i & c) && !(i & t)) {
        double complex tmp = psi[i];
        psi[i] = psi[i | t];
        psi[i | t] = tmp;
      }
    return;
  }
  double a = g->param >= 0 ? g->mult * theta[g->param] : g->mult;
  double complex u[4];
  double s2 = sqrt(0.5);
  switch (g->op) {
  case GATE_X: u[0] = 0, u[1] = 1, u[2] = 1, u[3] = 0; break;
  case GATE_H: u[0] = s2, u[1] = s2, u[2] = s2, u[3] = -s2; break;
  case GATE_S: u[0] = 1, u[1] = 0, u[2] = 0, u[3] = I; break;
  case GATE_SDG: u[0] = 1, u[1] = 0, u[2] = 0, u[3] = -I; break;
  case GATE_RX: u[0] = cos(a / 2), u[1] = -I * sin(a / 2), u[2] = -I * sin(a / 2), u[3] = cos(a / 2); break;
  case GATE_RY: u[0] = cos(a / 2), u[1] = -sin(a / 2), u[2] = sin(a / 2), u[3] = cos(a / 2); break;
  default: u[0] = cexp(-I * a / 2), u[1] = 0, u[2] = 0, u[3] = cexp(I * a / 2); break;
  }
  size_t b = (size_t)1 << g->q0;
  for (size_t i = 0; i < N; i++)
    if (!(i & b)) {
      double complex x0 = psi[i], x1 = psi[i | b];
      psi[i] = u[0] * x0 + u[1] * x1;
      psi[i | b] = u[2] * x0 + u[3] * x1;
    }
}

/* |<a|b>| == 1 within tol, for unit vectors. */
static double overlap_defect(const double complex *a, const double complex *b, size_t N) {
  double complex s = 0;
  for (size_t i = 0; i < N; i++) s += conj(a[i]) * b[i];
  return fabs(1 - cabs(s));
}

static void run_list(const gate_list *l, int n, const double *theta, double complex *psi, util_rng *r) {
  size_t N = (size_t)1 << n;
  double norm = 0;
  for (size_t i = 0; i < N; i++) {
    psi[i] = util_rng_uniform(r) - 0.5 + I * (util_rng_uniform(r) - 0.5);
    norm += creal(psi[i] * conj(psi[i]));
  }
  for (size_t i = 0; i < N; i++) psi[i] /= sqrt(norm);
  for (size_t k = 0; k < l->len; k++) apply(psi, n, &l->g[k], theta);
}

/* Plain lowering: cx = sum 2(w-1) (common practice), singles 2 per X/Y
 * letter plus one rz for w >= 2, one rotation for w = 1, nothing for w = 0;
 * on a 100-qubit register (two mask words). */
static void test_plain_counts(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 11);
  ans_circuit c;
  ans_circuit_init(&c, 100);
  ans_gen_info gi = {ANS_WORD, "w", 0, 1, 0, {0}, {0}, 0};
  int g = ans_circuit_add_gen(&c, &gi);
  int p = ans_circuit_add_param(&c, g);
  long want_cx = 0, want_single = 0;
  uint64_t x[2], z[2];
  for (int t = 0; t < 200; t++) {
    x[0] = x[1] = z[0] = z[1] = 0;
    int w = 0, xy = 0;
    double dens = util_rng_uniform(&r);
    for (int q = 0; q < 100; q++) {
      if (util_rng_uniform(&r) > dens * dens) continue;
      char L = "XYZ"[util_rng_next(&r) % 3];
      pauli_set_letter(x, z, q, L);
      w++;
      xy += L != 'Z';
    }
    ans_circuit_push(&c, ans_circuit_word(&c, x, z), p, 1.0, g);
    if (w >= 2) {
      want_cx += 2L * (w - 1);
      want_single += 2L * xy + 1;
    } else if (w == 1) {
      want_single += 1;
    }
  }
  gate_opts o;
  gate_opts_default(&o);
  o.passes = 0;
  gate_counts k;
  gate_count_circuit(&c, &o, &k);
  assert_int_equal(k.cx, want_cx);
  assert_int_equal(k.single, want_single);
  assert_int_equal(gate_plain_cx(&c, -2), want_cx);
  assert_int_equal(gate_plain_cx(&c, g), want_cx);
  assert_int_equal(k.gen_cx[g], want_cx);
  o.ladder = GATE_LADDER_TREE;
  gate_counts kt;
  gate_count_circuit(&c, &o, &kt);
  assert_int_equal(kt.cx, want_cx);
  gate_counts_free(&k);
  gate_counts_free(&kt);
  ans_circuit_free(&c);
}

/* One weight-16 word: the chain's cx depth is 2*15, the tree's 2*log2(16). */
static void test_tree_depth(void **state) {
  (void)state;
  ans_circuit c;
  ans_circuit_init(&c, 16);
  const char *w[] = {"ZZZZZZZZZZZZZZZZ"};
  double m[] = {1};
  add_gen(&c, ANS_WORD, "z16", w, m, 1);
  gate_opts o;
  gate_opts_default(&o);
  gate_counts kc, kt;
  gate_count_circuit(&c, &o, &kc);
  o.ladder = GATE_LADDER_TREE;
  gate_count_circuit(&c, &o, &kt);
  assert_int_equal(kc.cx, 30);
  assert_int_equal(kt.cx, 30);
  assert_int_equal(kc.cx_depth, 30);
  assert_int_equal(kt.cx_depth, 8);
  assert_int_equal(kt.depth, 9);
  gate_counts_free(&kc);
  gate_counts_free(&kt);
  ans_circuit_free(&c);
}

static size_t optimized_len(const gate *g, size_t n, int nq, gate_list *out) {
  gate_list_init(out, nq);
  for (size_t i = 0; i < n; i++) gate_list_push(out, &g[i]);
  gate_optimize(out);
  return out->len;
}

/* Inverse pairs cancel; rotations about one axis with one parameter merge;
 * what becomes the identity disappears. */
static void test_cancel_pairs(void **state) {
  (void)state;
  gate_list l;
  gate a[] = {G(GATE_CX, 0, 1, -1, 0), G(GATE_CX, 0, 1, -1, 0)};
  assert_int_equal(optimized_len(a, 2, 2, &l), 0);
  gate_list_free(&l);
  gate b[] = {G(GATE_H, 0, -1, -1, 0), G(GATE_S, 1, -1, -1, 0), G(GATE_SDG, 1, -1, -1, 0), G(GATE_H, 0, -1, -1, 0),
              G(GATE_X, 1, -1, -1, 0), G(GATE_X, 1, -1, -1, 0)};
  assert_int_equal(optimized_len(b, 6, 2, &l), 0);
  gate_list_free(&l);
  gate c[] = {G(GATE_RX, 0, -1, 3, 0.5), G(GATE_RX, 0, -1, 3, -0.5), G(GATE_RY, 1, -1, -1, M_PI / 2),
              G(GATE_RY, 1, -1, -1, -M_PI / 2), G(GATE_RZ, 1, -1, -1, M_PI), G(GATE_RZ, 1, -1, -1, M_PI)};
  assert_int_equal(optimized_len(c, 6, 2, &l), 0);
  gate_list_free(&l);
  gate d[] = {G(GATE_RZ, 0, -1, 1, 0.25), G(GATE_RZ, 0, -1, 1, 0.5), G(GATE_RZ, 0, -1, 2, 0.5)};
  assert_int_equal(optimized_len(d, 3, 1, &l), 2);
  assert_true(l.g[0].mult == 0.75 && l.g[0].param == 1 && l.g[1].param == 2);
  gate_list_free(&l);
}

/* The walk steps over what commutes and stops at what does not. */
static void test_commutation(void **state) {
  (void)state;
  gate_list l;
  /* rz on a cx control passes it; on the target it does not. */
  gate a[] = {G(GATE_RZ, 0, -1, 0, 1), G(GATE_CX, 0, 1, -1, 0), G(GATE_RZ, 0, -1, 0, 1)};
  assert_int_equal(optimized_len(a, 3, 2, &l), 2);
  assert_true(l.g[0].op == GATE_RZ && l.g[0].mult == 2);
  gate_list_free(&l);
  gate b[] = {G(GATE_RZ, 1, -1, 0, 1), G(GATE_CX, 0, 1, -1, 0), G(GATE_RZ, 1, -1, 0, 1)};
  assert_int_equal(optimized_len(b, 3, 2, &l), 3);
  gate_list_free(&l);
  /* rx on a cx target passes it; on the control it does not. */
  gate c[] = {G(GATE_RX, 1, -1, 0, 1), G(GATE_CX, 0, 1, -1, 0), G(GATE_RX, 1, -1, 0, -1)};
  assert_int_equal(optimized_len(c, 3, 2, &l), 1);
  gate_list_free(&l);
  gate d[] = {G(GATE_RX, 0, -1, 0, 1), G(GATE_CX, 0, 1, -1, 0), G(GATE_RX, 0, -1, 0, -1)};
  assert_int_equal(optimized_len(d, 3, 2, &l), 3);
  gate_list_free(&l);
  /* cx sharing a control, or a target, commute; control against target does not. */
  gate e[] = {G(GATE_CX, 0, 1, -1, 0), G(GATE_CX, 0, 2, -1, 0), G(GATE_CX, 0, 1, -1, 0)};
  assert_int_equal(optimized_len(e, 3, 3, &l), 1);
  assert_true(l.g[0].q1 == 2);
  gate_list_free(&l);
  gate f[] = {G(GATE_CX, 0, 2, -1, 0), G(GATE_CX, 1, 2, -1, 0), G(GATE_CX, 0, 2, -1, 0)};
  assert_int_equal(optimized_len(f, 3, 3, &l), 1);
  gate_list_free(&l);
  gate h[] = {G(GATE_CX, 0, 1, -1, 0), G(GATE_CX, 1, 2, -1, 0), G(GATE_CX, 0, 1, -1, 0)};
  assert_int_equal(optimized_len(h, 3, 3, &l), 3);
  gate_list_free(&l);
  gate i[] = {G(GATE_CX, 0, 1, -1, 0), G(GATE_CX, 1, 0, -1, 0), G(GATE_CX, 0, 1, -1, 0)};
  assert_int_equal(optimized_len(i, 3, 2, &l), 3);
  gate_list_free(&l);
  /* h blocks everything; different axes block. */
  gate j[] = {G(GATE_RZ, 0, -1, 0, 1), G(GATE_H, 0, -1, -1, 0), G(GATE_RZ, 0, -1, 0, -1)};
  assert_int_equal(optimized_len(j, 3, 1, &l), 3);
  gate_list_free(&l);
  gate k[] = {G(GATE_RZ, 0, -1, 0, 1), G(GATE_S, 0, -1, -1, 0), G(GATE_RZ, 0, -1, 0, -1)};
  assert_int_equal(optimized_len(k, 3, 1, &l), 1);
  assert_true(l.g[0].op == GATE_S);
  gate_list_free(&l);
}

/* Random circuits over the gate set: the pass never adds gates and the
 * optimized circuit acts as the original (same state up to a phase, on a
 * random input, 6 qubits); running the pass again finds nothing more. */
static void test_pass_preserves_action(void **state) {
  (void)state;
  util_rng r;
  util_rng_seed(&r, 5);
  const int n = 6;
  double theta[3] = {0.3, -1.1, 2.0};
  double complex *a = malloc(sizeof(double complex) << n), *b = malloc(sizeof(double complex) << n);
  long before = 0, after = 0;
  for (int trial = 0; trial < 200; trial++) {
    gate_list l;
    gate_list_init(&l, n);
    int len = 5 + (int)(util_rng_next(&r) % 60);
    for (int i = 0; i < len; i++) {
      int op = (int)(util_rng_next(&r) % 8);
      int q0 = (int)(util_rng_next(&r) % 3), q1 = (int)(util_rng_next(&r) % 3); /* few qubits: many meetings */
      if (op == GATE_CX && q0 == q1) q1 = (q0 + 1) % 3;
      int param = gate_is_rotation(op) ? (int)(util_rng_next(&r) % 4) - 1 : -1;
      double m = param < 0 ? M_PI / 2 * (double)((int)(util_rng_next(&r) % 5) - 2) : (util_rng_next(&r) % 2 ? 1 : -1);
      gate g = G(op, q0, op == GATE_CX ? q1 : -1, param, m);
      gate_list_push(&l, &g);
    }
    gate_list o;
    gate_list_init(&o, n);
    for (size_t i = 0; i < l.len; i++) gate_list_push(&o, &l.g[i]);
    gate_optimize(&o);
    assert_true(o.len <= l.len);
    before += (long)l.len;
    after += (long)o.len;
    util_rng r1 = r, r2 = r;
    run_list(&l, n, theta, a, &r1);
    run_list(&o, n, theta, b, &r2);
    util_rng_next(&r);
    assert_true(overlap_defect(a, b, (size_t)1 << n) < 1e-12);
    size_t once = o.len;
    gate_optimize(&o);
    assert_int_equal(o.len, once);
    gate_list_free(&l);
    gate_list_free(&o);
  }
  assert_true(after < before);
  free(a);
  free(b);
}

/* A Jordan-Wigner double excitation 0 1 -> 4 7 on 8 qubits (Z string on 5 and
 * 6), its 8 words as the generators module writes them: the lowered circuit
 * acts as the product of exp(-i theta m P / 2) (applied word by word here),
 * for chain, tree, passes and short circuits; the short one is smaller. */
static void test_lowerings_agree(void **state) {
  (void)state;
  ans_circuit c;
  ans_circuit_init(&c, 8);
  const char *w[] = {"Y0 X1 X4 Z5 Z6 X7", "X0 Y1 X4 Z5 Z6 X7", "X0 X1 Y4 Z5 Z6 X7", "Y0 Y1 Y4 Z5 Z6 X7",
                     "X0 X1 X4 Z5 Z6 Y7", "Y0 Y1 X4 Z5 Z6 Y7", "Y0 X1 Y4 Z5 Z6 Y7", "X0 Y1 Y4 Z5 Z6 Y7"};
  double m[] = {0.25, 0.25, -0.25, 0.25, -0.25, 0.25, -0.25, -0.25};
  add_gen(&c, ANS_DOUBLE, "0 1 -> 4 7", w, m, 8);
  const char *s1[] = {"X2 Z3 Y4", "Y2 Z3 X4"};
  double ms[] = {1.0, -1.0}; /* as the JW single 2 -> 4 gives them */
  add_gen(&c, ANS_SINGLE, "2 -> 4", s1, ms, 2);
  pauli_set(c.init, 0, 1);
  pauli_set(c.init, 1, 1);
  pauli_set(c.init, 2, 1);
  double theta[2] = {0.7, -0.4};
  size_t N = 256;
  /* reference: word by word */
  double complex *ref = calloc(N, sizeof *ref), *psi = calloc(N, sizeof *psi);
  ref[7] = 1;
  for (size_t k = 0; k < c.nrot; k++) {
    gate_list one;
    ans_circuit t;
    ans_circuit_init(&t, 8);
    ans_gen_info gi = {ANS_WORD, "", 0, 0, 0, {0}, {0}, 0};
    int g = ans_circuit_add_gen(&t, &gi);
    int p = ans_circuit_add_param(&t, g);
    ans_circuit_push(&t, ans_circuit_word(&t, pauli_sum_x(&c.words, (size_t)c.rot[k].word),
                                          pauli_sum_z(&c.words, (size_t)c.rot[k].word)),
                     p, c.rot[k].mult, g);
    gate_opts o;
    gate_opts_default(&o);
    o.passes = 0;
    gate_lower(&t, &o, &one);
    double th = theta[c.rot[k].param];
    for (size_t i = 0; i < one.len; i++) apply(ref, 8, &one.g[i], &th);
    gate_list_free(&one);
    ans_circuit_free(&t);
  }
  long plain_cx = 0, short_cx[2] = {0, 0};
  for (int variant = 0; variant < 6; variant++) {
    gate_opts o;
    gate_opts_default(&o);
    o.passes = variant % 2;
    o.ladder = variant >= 2 && variant < 4 ? GATE_LADDER_TREE : GATE_LADDER_CHAIN;
    o.shortexc = variant >= 4;
    gate_list l;
    gate_lower(&c, &o, &l);
    memset(psi, 0, N * sizeof *psi);
    psi[0] = 1;
    for (size_t i = 0; i < l.len; i++) apply(psi, 8, &l.g[i], theta);
    assert_true(overlap_defect(ref, psi, N) < 1e-12);
    gate_counts k;
    gate_count_list(&l, c.ngens, &k);
    if (variant == 0) plain_cx = k.cx;
    if (variant == 0) assert_int_equal(k.cx, 8 * 2 * 5 + 2 * 2 * 2);
    assert_true(k.cx <= plain_cx);
    /* short circuits (docs/listing.md): 14 cx for the double and 2 per
     * qubit of its Z string {5, 6}; 2 for the single, 2 per qubit of its Z
     * string {3} and 2 more; the passes never add to them */
    if (variant == 4) {
      assert_int_equal(k.gen_cx[0], 14 + 2 * 2);
      assert_int_equal(k.gen_cx[1], 2 * 1 + 4);
      short_cx[0] = k.gen_cx[0], short_cx[1] = k.gen_cx[1];
    }
    if (variant == 5) assert_true(k.gen_cx[0] <= short_cx[0] && k.gen_cx[1] <= short_cx[1]);
    gate_counts_free(&k);
    gate_list_free(&l);
  }
  free(ref);
  free(psi);
  ans_circuit_free(&c);
}

/* Fixed angles at k pi / d read as such; others do not. */
static void test_pi_spelling(void **state) {
  (void)state;
  char b[40];
  assert_true(gate_pi_spelling(b, M_PI / 2) && strcmp(b, "pi/2") == 0);
  assert_true(gate_pi_spelling(b, -M_PI / 2) && strcmp(b, "-pi/2") == 0);
  assert_true(gate_pi_spelling(b, M_PI) && strcmp(b, "pi") == 0);
  assert_true(gate_pi_spelling(b, 3 * M_PI / 4) && strcmp(b, "3*pi/4") == 0);
  assert_true(gate_pi_spelling(b, -2 * M_PI) && strcmp(b, "-2*pi") == 0);
  assert_true(gate_pi_spelling(b, 0) && strcmp(b, "0") == 0);
  assert_false(gate_pi_spelling(b, 0.3));
  assert_false(gate_pi_spelling(b, M_PI / 3));
}

static char *write_mem(const ans_circuit *c, gate_format f, const gate_opts *o, const gate_meta *m, size_t *len) {
  char *buf = NULL;
  FILE *mf = open_memstream(&buf, len);
  assert_int_equal(gate_write(mf, f, c, o, m, NULL, NULL), 0);
  fclose(mf);
  return buf;
}

/* Same input, same bytes: every format written twice is identical; the
 * OpenQASM 2.0 real literals always carry a decimal point. */
static void test_deterministic(void **state) {
  (void)state;
  ans_circuit c;
  ans_circuit_init(&c, 4);
  const char *w[] = {"X0 Y1", "Y0 X1"};
  double m[] = {1e-7, -1e-7};
  add_gen(&c, ANS_QUBIT_SINGLE, "0 -> 1", w, m, 2);
  gate_opts o;
  gate_opts_default(&o);
  double vals[1] = {2.5e-9};
  gate_meta meta = {"x.json", vals, "r.json"};
  for (int f = GATE_FMT_LISTING; f <= GATE_FMT_QASM3; f++) {
    size_t l1, l2;
    char *a = write_mem(&c, (gate_format)f, &o, &meta, &l1);
    char *b = write_mem(&c, (gate_format)f, &o, &meta, &l2);
    assert_int_equal(l1, l2);
    assert_memory_equal(a, b, l1);
    if (f == GATE_FMT_QASM2) {
      assert_non_null(strstr(a, "1.0e-7*theta_0"));
      assert_non_null(strstr(a, "cairn_ansatz(2.5e-9)"));
    }
    if (f == GATE_FMT_LISTING) assert_non_null(strstr(a, "value t0 2.5e-9\n"));
    if (f == GATE_FMT_QASM3) assert_non_null(strstr(a, "const float[64] theta_0 = 2.5e-9;\n"));
    free(a);
    free(b);
  }
  ans_circuit_free(&c);
}

static cJSON *parse(const char *s) {
  cJSON *j = cJSON_Parse(s);
  assert_non_null(j);
  return j;
}

/* Values from a run report: the "parameters" array, or each generator's
 * theta; mismatches name the field. */
static void test_bind(void **state) {
  (void)state;
  ans_circuit c;
  ans_circuit_init(&c, 2);
  const char *w1[] = {"X0 Y1"}, *w2[] = {"Z0"};
  double m[] = {1};
  add_gen(&c, ANS_ENTANGLER, "X0 Y1", w1, m, 1);
  add_gen(&c, ANS_WORD, "Z0", w2, m, 1);
  char err[256];
  cJSON *r = parse("{\"points\":[{\"parameters\":[0.5,-0.25]}]}");
  double *v = gate_bind_report(r, &c, 0, err, sizeof err);
  assert_non_null(v);
  assert_true(v[0] == 0.5 && v[1] == -0.25);
  free(v);
  assert_null(gate_bind_report(r, &c, 1, err, sizeof err));
  assert_non_null(strstr(err, "point 1 does not exist"));
  cJSON_Delete(r);
  r = parse("{\"points\":[{\"generators\":[{\"kind\":\"entangler\",\"text\":\"X0 Y1\",\"theta\":0.1},"
            "{\"kind\":\"word\",\"text\":\"Z0\",\"theta\":0.2}]}]}");
  v = gate_bind_report(r, &c, 0, err, sizeof err);
  assert_non_null(v);
  assert_true(v[0] == 0.1 && v[1] == 0.2);
  free(v);
  cJSON_Delete(r);
  r = parse("{\"points\":[{\"generators\":[{\"kind\":\"entangler\",\"text\":\"X0 Y1\",\"theta\":0.1},"
            "{\"kind\":\"word\",\"text\":\"Z1\",\"theta\":0.2}]}]}");
  assert_null(gate_bind_report(r, &c, 0, err, sizeof err));
  assert_non_null(strstr(err, "points[0].generators[1].text is `Z1`"));
  cJSON_Delete(r);
  r = parse("{\"points\":[{\"parameters\":[0.5]}]}");
  assert_null(gate_bind_report(r, &c, 0, err, sizeof err));
  assert_non_null(strstr(err, "points[0].parameters has 1 values; the program has 2"));
  cJSON_Delete(r);
  r = parse("{\"points\":[{\"generators\":[{\"kind\":\"entangler\",\"text\":\"X0 Y1\"},"
            "{\"kind\":\"word\",\"text\":\"Z0\",\"theta\":0.2}]}]}");
  assert_null(gate_bind_report(r, &c, 0, err, sizeof err));
  assert_non_null(strstr(err, "generators[0].theta is missing"));
  cJSON_Delete(r);
  ans_circuit_free(&c);
}

/* The lowered diff: one generator added, one removed, one moved. */
static void test_diff(void **state) {
  (void)state;
  const char *names[] = {"X0 Y1", "X1 Y2", "X2 Y3", "X0 X1 X2 Y3"};
  ans_circuit a, b;
  ans_circuit_init(&a, 4);
  ans_circuit_init(&b, 4);
  double m[] = {1};
  /* a: 0 1 2; b: 2 0 3 (1 removed, 3 added, 2 moved before 0) */
  int ia[] = {0, 1, 2}, ib[] = {2, 0, 3};
  for (int i = 0; i < 3; i++) add_gen(&a, ANS_ENTANGLER, names[ia[i]], &names[ia[i]], m, 1);
  for (int i = 0; i < 3; i++) add_gen(&b, ANS_ENTANGLER, names[ib[i]], &names[ib[i]], m, 1);
  gate_opts o;
  gate_opts_default(&o);
  gate_diff d;
  gate_diff_programs(&a, &b, &o, &d);
  assert_int_equal(d.nadded, 1);
  assert_int_equal(d.added[0], 2);
  assert_int_equal(d.nremoved, 1);
  assert_int_equal(d.removed[0], 1);
  assert_int_equal(d.nmoved, 1);
  assert_true(d.kb.cx - d.ka.cx == 4);
  char *buf = NULL;
  size_t len;
  FILE *mf = open_memstream(&buf, &len);
  assert_int_equal(gate_diff_print(mf, &d, &a, &b), 1);
  fclose(mf);
  assert_non_null(strstr(buf, "gates: added g2 entangler X0 X1 X2 Y3: cx 6\n"));
  assert_non_null(strstr(buf, "gates: removed g1 entangler X1 Y2: cx 2\n"));
  assert_non_null(strstr(buf, "cx 6 -> 10 (+4)"));
  free(buf);
  gate_diff_free(&d);
  gate_diff_programs(&a, &a, &o, &d);
  mf = open_memstream(&buf, &len);
  assert_int_equal(gate_diff_print(mf, &d, &a, &a), 0);
  fclose(mf);
  assert_int_equal(len, 0);
  free(buf);
  gate_diff_free(&d);
  ans_circuit_free(&a);
  ans_circuit_free(&b);
}

/* A circuit longer than the pass window streams through; the streamed
 * counts equal the counts of the stored list, and passes still help. */
static void test_window(void **state) {
  (void)state;
  ans_circuit c;
  ans_circuit_init(&c, 30);
  ans_gen_info gi = {ANS_SINGLE, "0 -> 29", 0, 1, 0, {0}, {0}, 0};
  int w1 = add_word(&c, "X0 Z1 Z2 Z3 Z4 Z5 Z6 Z7 Z8 Z9 Z10 Z11 Z12 Z13 Z14 Z15 Z16 Z17 Z18 Z19 Z20 Z21 Z22 Z23 Z24 Z25 Z26 Z27 Z28 Y29");
  int w2 = add_word(&c, "Y0 Z1 Z2 Z3 Z4 Z5 Z6 Z7 Z8 Z9 Z10 Z11 Z12 Z13 Z14 Z15 Z16 Z17 Z18 Z19 Z20 Z21 Z22 Z23 Z24 Z25 Z26 Z27 Z28 X29");
  /* the same single excitation many times over, each its own generator */
  for (long i = 0; i < GATE_PASS_WINDOW / 100 + 100; i++) {
    int g = ans_circuit_add_gen(&c, &gi);
    int p = ans_circuit_add_param(&c, g);
    ans_circuit_push(&c, w1, p, 1.0, g);
    ans_circuit_push(&c, w2, p, -1.0, g);
  }
  gate_opts o;
  gate_opts_default(&o);
  gate_counts k, kp;
  gate_count_circuit(&c, &o, &k);
  gate_list l;
  gate_lower(&c, &o, &l);
  gate_counts kl;
  gate_count_list(&l, c.ngens, &kl);
  assert_int_equal(k.total, kl.total);
  assert_int_equal(k.depth, kl.depth);
  o.passes = 0;
  gate_count_circuit(&c, &o, &kp);
  assert_true(kp.total > GATE_PASS_WINDOW);
  assert_true(k.cx < kp.cx / 2);
  gate_counts_free(&k);
  gate_counts_free(&kp);
  gate_counts_free(&kl);
  gate_list_free(&l);
  ans_circuit_free(&c);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_plain_counts),   cmocka_unit_test(test_tree_depth),
      cmocka_unit_test(test_cancel_pairs),   cmocka_unit_test(test_commutation),
      cmocka_unit_test(test_pass_preserves_action), cmocka_unit_test(test_lowerings_agree),
      cmocka_unit_test(test_pi_spelling),    cmocka_unit_test(test_deterministic),
      cmocka_unit_test(test_bind),           cmocka_unit_test(test_diff),
      cmocka_unit_test(test_window),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
