/* test_report.c — the report module: axes and ticks, number spelling, file
 * names, JSON fields present and absent, the JSON round trip, CSV columns,
 * the text report's statements, the curves of the figures, failed writes,
 * and the help topics.
 *
 * The rep_run values below are TEST DATA made up for the writers (not results
 * of cairn), except where a comment names a source. */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>
#include <cmocka.h>

#include "cairn/help.h"
#include "cairn/report.h"
#include "cairn/util.h"
#include "report/plot.h"
#include "report/report_int.h"

/* ---- test data ------------------------------------------------------- */

/* A scan of `n` points; `drop` leaves out a series: 0 none, 1 MP2, 2 exact. */
static void make_scan(rep_run *r, int n, int drop) {
  memset(r, 0, sizeof *r);
  r->recipe = xstrdup("h2-test");
  r->file = xstrdup("tests/h2-test.cairn");
  r->param_name = xstrdup("r");
  r->param_unit = xstrdup("angstrom");
  r->basis = xstrdup("sto-3g");
  r->npoints = n;
  r->points = xcalloc((size_t)n, sizeof *r->points);
  for (int i = 0; i < n; i++) {
    rep_point *p = &r->points[i];
    double x = 0.5 + 0.25 * i;
    p->has_param = 1;
    p->param = x;
    p->qubits = 4, p->electrons = 2, p->orbitals = 2;
    p->e.has_nuclear = 1, p->e.nuclear = 0.529177210903 / x;
    double ex = -1.1 + 0.1 * (x - 0.75) * (x - 0.75);
    p->e.has_exact = drop != 2, p->e.exact = ex;
    p->e.has_hf = 1, p->e.hf = ex + 0.02 * x;
    p->e.has_mp2 = drop != 1, p->e.mp2 = ex + 0.005 * x;
    p->e.has_ccsd = 1, p->e.ccsd = ex + 1e-6, p->e.ccsd_converged = 1;
    p->e.has_ansatz = 1, p->e.ansatz = ex + 1e-4 * (i + 1);
    p->has_error = drop != 2, p->error = 1e-4 * (i + 1);
    p->exact_s2 = 0;
    p->ngens = 1;
    p->gens = xcalloc(1, sizeof *p->gens);
    p->gens[0] = (rep_generator){
        .kind = xstrdup("double"), .text = xstrdup("0 1 -> 2 3"), .gradient = -0.18, .theta = 0.11, .cnot = 13, .line = 7};
    p->sym = (rep_symmetry){1, 2, 0, 1e-9};
    p->has_gates = 1, p->cnot = 13, p->single = 20, p->depth = 25;
    p->has_optimizer = 1, p->method = xstrdup("lbfgs"), p->iterations = 12, p->converged = 1;
    p->seconds = 0.25;
  }
}

static char *slurp(const char *path) {
  size_t len;
  char *s = util_read_file(path, &len);
  assert_non_null(s);
  return s;
}

static int count(const char *hay, const char *needle) {
  int n = 0;
  for (const char *s = strstr(hay, needle); s; s = strstr(s + 1, needle)) n++;
  return n;
}

static char *tmpdir(void) {
  char *d = xstrdup("/tmp/cairn-report-XXXXXX");
  assert_non_null(mkdtemp(d));
  return d;
}

/* ---- axes -------------------------------------------------------------- */

static void test_nice_numbers(void **state) {
  (void)state;
  /* Heckbert's rounding: 1, 2, 5, 10 times a power of ten */
  assert_true(rep_nice_number(1.4, 1) == 1);
  assert_true(rep_nice_number(1.6, 1) == 2);
  assert_true(rep_nice_number(3.3, 1) == 5);
  assert_true(rep_nice_number(8, 1) == 10);
  assert_true(fabs(rep_nice_number(0.023, 1) - 0.02) < 1e-15);
  assert_true(rep_nice_number(1.1, 0) == 2);
  assert_true(rep_nice_number(2.5, 0) == 5);
  assert_true(rep_nice_number(6, 0) == 10);
}

/* For many data ranges: the ticks are evenly spaced nice numbers, cover the
 * data (or lie inside a tight range), and their labels read back. */
static void test_linear_axis(void **state) {
  (void)state;
  util_rng g;
  util_rng_seed(&g, 11);
  for (int t = 0; t < 2000; t++) {
    double c = (util_rng_uniform(&g) - 0.5) * pow(10, (int)(util_rng_uniform(&g) * 8) - 3);
    double w = pow(10, util_rng_uniform(&g) * 8 - 5);
    double lo = c, hi = c + w;
    unsigned flags = t % 2 ? REP_AXIS_TIGHT : 0;
    rep_axis a;
    rep_axis_linear(&a, lo, hi, 7, flags);
    assert_true(a.nticks >= 2 && a.nticks <= REP_AXIS_MAXTICKS);
    assert_true(a.lo <= lo && a.hi >= hi);
    double m = a.step / pow(10, floor(log10(a.step) + 1e-9));
    assert_true(fabs(m - 1) < 1e-9 || fabs(m - 2) < 1e-9 || fabs(m - 5) < 1e-9);
    for (int i = 0; i < a.nticks; i++) {
      assert_true(a.ticks[i] >= a.lo - a.step * 1e-9 && a.ticks[i] <= a.hi + a.step * 1e-9);
      if (i) assert_true(fabs(a.ticks[i] - a.ticks[i - 1] - a.step) < a.step * 1e-6);
      char b[32];
      assert_true(fabs(strtod(rep_axis_label(&a, a.ticks[i], b), NULL) - a.ticks[i]) < a.step * 1e-6);
    }
    if (!(flags & REP_AXIS_TIGHT)) {
      assert_true(a.ticks[0] == a.lo);
      assert_true(a.ticks[a.nticks - 1] == a.hi);
    }
  }
  /* iteration axes tick at whole numbers */
  rep_axis a;
  rep_axis_linear(&a, 1, 4, 7, REP_AXIS_INTEGER | REP_AXIS_TIGHT);
  for (int i = 0; i < a.nticks; i++) assert_true(a.ticks[i] == floor(a.ticks[i]));
  /* a degenerate range still makes an axis around the value */
  rep_axis_linear(&a, -74.5, -74.5, 7, REP_AXIS_TIGHT);
  assert_true(a.lo < -74.5 && a.hi > -74.5 && a.nticks >= 2);
}

static void test_log_axis(void **state) {
  (void)state;
  rep_axis a;
  rep_axis_log(&a, 0.021, 360, 10);
  assert_true(a.log);
  assert_true(fabs(a.lo - 0.01) < 1e-15 && fabs(a.hi - 1000) < 1e-9);
  assert_int_equal(a.nticks, 6);
  char b[32];
  assert_string_equal(rep_axis_label(&a, a.ticks[0], b), "0.01");
  assert_string_equal(rep_axis_label(&a, a.ticks[2], b), "1");
  assert_string_equal(rep_axis_label(&a, a.ticks[5], b), "1000");
  /* decades are evenly spaced */
  for (int i = 0; i < a.nticks; i++) assert_true(fabs(rep_axis_frac(&a, a.ticks[i]) - i / 5.0) < 1e-12);
  assert_true(isnan(rep_axis_frac(&a, 0)));
  /* at most maxdecades, keeping the top */
  rep_axis_log(&a, 1e-12, 100, 6);
  assert_true(fabs(a.hi - 100) < 1e-9 && fabs(a.lo - 1e-4) < 1e-19);
  rep_axis_log(&a, 1e-7, 1e-6, 10);
  assert_string_equal(rep_axis_label(&a, a.ticks[0], b), "1e-7");
}

/* ---- numbers and names --------------------------------------------------- */

static void test_fmt_num(void **state) {
  (void)state;
  char b[40];
  assert_string_equal(rep_fmt_num(b, 10), "10");
  assert_string_equal(rep_fmt_num(b, 0.1), "0.1");
  assert_string_equal(rep_fmt_num(b, 1e-7), "1e-7");
  assert_string_equal(rep_fmt_num(b, 2.5e20), "2.5e20");
  assert_string_equal(rep_fmt_num(b, 0), "0");
  assert_string_equal(rep_fmt_num(b, -74.85022706439678), "-74.85022706439678");
  util_rng g;
  util_rng_seed(&g, 5);
  for (int i = 0; i < 20000; i++) {
    double x = (util_rng_uniform(&g) - 0.5) * pow(10, util_rng_uniform(&g) * 40 - 20);
    assert_true(strtod(rep_fmt_num(b, x), NULL) == x);
    assert_null(strchr(b, '+'));
  }
}

static void test_paths(void **state) {
  (void)state;
  rep_paths p;
  rep_paths_derive("examples/water-scan.cairn", "out/water-scan.json", NULL, &p);
  assert_string_equal(p.csv, "out/water-scan.csv");
  assert_string_equal(p.svg, "out/water-scan.svg");
  rep_paths_free(&p);
  rep_paths_derive("examples/water-scan.cairn", NULL, NULL, &p);
  assert_string_equal(p.csv, "water-scan.csv");
  assert_string_equal(p.svg, "water-scan.svg");
  rep_paths_free(&p);
  rep_paths_derive("w.cairn", "run.json", "figs/curve.svg", &p);
  assert_string_equal(p.svg, "figs/curve.svg");
  assert_string_equal(p.csv, "figs/curve.csv");
  rep_paths_free(&p);
  rep_paths_derive("w.cairn", NULL, "a.dir/plot", &p); /* no extension: one is added */
  assert_string_equal(p.csv, "a.dir/plot.csv");
  rep_paths_free(&p);
  rep_paths_derive("w.cairn", NULL, "t.csv", &p); /* never the same file twice */
  assert_string_not_equal(p.csv, p.svg);
  rep_paths_free(&p);
}

/* ---- JSON ---------------------------------------------------------------- */

static void test_json_fields(void **state) {
  (void)state;
  rep_run r;
  make_scan(&r, 3, 1);
  r.points[1].e.ccsd_converged = 0;
  r.points[2].has_gates = 0;
  r.points[2].sym.has = 0;
  r.points[2].failure = xstrdup("test failure");
  cJSON *j = rep_json(&r, 0);
  assert_int_equal(cJSON_GetObjectItem(j, "cairn")->valueint, 1);
  assert_string_equal(cJSON_GetObjectItem(j, "recipe")->valuestring, "h2-test");
  cJSON *pts = cJSON_GetObjectItem(j, "points");
  assert_int_equal(cJSON_GetArraySize(pts), 3);
  cJSON *p0 = cJSON_GetArrayItem(pts, 0);
  const char *keys[] = {"params", "qubits", "electrons", "orbitals", "energies", "error", "generators",
                        "symmetry", "gates", "optimizer", "seconds"};
  for (size_t k = 0; k < sizeof keys / sizeof *keys; k++) assert_non_null(cJSON_GetObjectItem(p0, keys[k]));
  assert_true(cJSON_GetObjectItem(cJSON_GetObjectItem(p0, "params"), "r")->valuedouble == 0.5);
  assert_null(cJSON_GetObjectItem(p0, "parameters")); /* none given: absent */
  cJSON *e0 = cJSON_GetObjectItem(p0, "energies");
  assert_null(cJSON_GetObjectItem(e0, "mp2")); /* absent values are absent */
  assert_non_null(cJSON_GetObjectItem(e0, "hf"));
  assert_null(cJSON_GetObjectItem(e0, "ccsd_converged"));
  cJSON *g = cJSON_GetArrayItem(cJSON_GetObjectItem(p0, "generators"), 0);
  assert_string_equal(cJSON_GetObjectItem(g, "kind")->valuestring, "double");
  assert_int_equal(cJSON_GetObjectItem(g, "cnot")->valueint, 13);
  cJSON *p1 = cJSON_GetArrayItem(pts, 1);
  assert_true(cJSON_IsFalse(cJSON_GetObjectItem(cJSON_GetObjectItem(p1, "energies"), "ccsd_converged")));
  cJSON *p2 = cJSON_GetArrayItem(pts, 2);
  assert_null(cJSON_GetObjectItem(p2, "gates"));
  assert_null(cJSON_GetObjectItem(p2, "symmetry"));
  assert_string_equal(cJSON_GetObjectItem(p2, "failure")->valuestring, "test failure");
  cJSON_Delete(j);
  /* without timings */
  j = rep_json(&r, REP_NO_TIME);
  assert_null(cJSON_GetObjectItem(cJSON_GetArrayItem(cJSON_GetObjectItem(j, "points"), 0), "seconds"));
  cJSON_Delete(j);
  rep_run_free(&r);
  assert_null(r.points);
  rep_run_free(&r); /* an empty run frees to nothing */
}

/* rep_json -> text -> rep_read_json -> rep_json gives the same text. */
static void test_json_round_trip(void **state) {
  (void)state;
  rep_run r;
  make_scan(&r, 4, 0);
  rep_point *p = &r.points[0];
  p->nstarts = 3;
  p->start_energies = xcalloc(3, sizeof(double));
  p->start_energies[0] = -1.0, p->start_energies[1] = -1.1, p->start_energies[2] = -1.05;
  p->best_start = 1;
  p->ntrace = 3;
  p->trace = xcalloc(3, sizeof(double));
  p->trace[0] = -0.9, p->trace[1] = -1.05, p->trace[2] = -1.1;
  p->nchecks = 1;
  p->checks = xcalloc(1, sizeof *p->checks);
  p->checks[0] = (rep_check){xstrdup("spin-squared"), 3e-5, 0, 1e-6, 0};
  p->nparams = 2; /* a reference angle and the generator's theta */
  p->params = xcalloc(2, sizeof(double));
  p->params[0] = 0.25, p->params[1] = 0.11;
  cJSON *j = rep_json(&r, 0);
  char *a = cJSON_Print(j);
  cJSON_Delete(j);
  cJSON *back = cJSON_Parse(a);
  rep_run q;
  char err[200];
  assert_int_equal(rep_read_json(back, &q, err, sizeof err), 0);
  cJSON_Delete(back);
  assert_int_equal(q.npoints, 4);
  assert_true(q.points[0].start_energies[1] == -1.1);
  assert_int_equal(q.points[0].checks[0].passed, 0);
  assert_string_equal(q.param_unit, "angstrom");
  assert_int_equal(q.points[0].nparams, 2);
  assert_true(q.points[0].params[0] == 0.25);
  assert_null(q.points[1].params);
  assert_int_equal(q.points[0].gens[0].has_chosen, 0); /* only grown generators carry chosen_gradient */
  j = rep_json(&q, 0);
  char *b = cJSON_Print(j);
  cJSON_Delete(j);
  assert_string_equal(a, b);
  free(a);
  free(b);
  rep_run_free(&q);
  rep_run_free(&r);
}

/* A malformed report is refused with the field and what was expected. */
static void test_json_read_errors(void **state) {
  (void)state;
  static const struct {
    const char *json, *message;
  } cases[] = {
      {"[]", "the report: expected an object"},
      {"{\"cairn\": 2, \"points\": []}", "cairn: expected 1 (report schema version 1)"},
      {"{\"cairn\": 1}", "points: missing (expected an array)"},
      {"{\"cairn\": 1, \"points\": [{\"qubits\": 4, \"electrons\": 2, \"orbitals\": 2, "
       "\"energies\": {\"hf\": \"low\"}}]}",
       "points[0].energies.hf: expected a number"},
      {"{\"cairn\": 1, \"points\": [{\"qubits\": -4, \"electrons\": 2, \"orbitals\": 2}]}",
       "points[0].qubits: expected a whole number >= 0, not -4"},
      {"{\"cairn\": 1, \"points\": [{\"qubits\": 4, \"electrons\": 2, \"orbitals\": 2, \"optimizer\": "
       "{\"method\": \"lbfgs\", \"iterations\": 3, \"converged\": true, \"starts\": 2, \"best_start\": 5, "
       "\"start_energies\": [1, 2]}}]}",
       "points[0].optimizer.best_start: 5 is not one of the 2 starts"},
      {"{\"cairn\": 1, \"points\": [{\"qubits\": 4, \"electrons\": 2, \"orbitals\": 2, \"generators\": "
       "[{\"kind\": \"double\", \"text\": \"0 1 -> 2 3\", \"gradient\": 1, \"theta\": 0}]}]}",
       "points[0].generators[0].cnot: missing (expected a number)"},
  };
  for (size_t i = 0; i < sizeof cases / sizeof *cases; i++) {
    cJSON *j = cJSON_Parse(cases[i].json);
    assert_non_null(j);
    rep_run r;
    char err[200];
    assert_int_equal(rep_read_json(j, &r, err, sizeof err), -1);
    assert_string_equal(err, cases[i].message);
    assert_null(r.points);
    cJSON_Delete(j);
  }
}

/* The n-th node of the tree in preorder and its parent (NULL when n is past
 * the end). */
static cJSON *nth_node(cJSON *root, int n, cJSON **parent) {
  int k = 0;
  cJSON *stack[64], *pstack[64];
  int top = 0;
  stack[top] = root, pstack[top++] = NULL;
  while (top) {
    cJSON *x = stack[--top], *px = pstack[top];
    if (k++ == n) {
      *parent = px;
      return x;
    }
    /* push children last-first so they pop in order */
    int m = 0;
    for (cJSON *c = x->child; c; c = c->next) m++;
    for (int i = m - 1; i >= 0; i--) {
      cJSON *c = x->child;
      for (int j = 0; j < i; j++) c = c->next;
      assert_true(top < 64);
      stack[top] = c, pstack[top++] = x;
    }
  }
  return NULL;
}

/* Every node of a valid report replaced by each wrong kind of value: the
 * reader either accepts it (an optional member became absent or another
 * valid value) or refuses it with a message naming the field; never a crash
 * (the sanitizer run watches for memory errors and leaks). */
static void test_json_read_mutations(void **state) {
  (void)state;
  rep_run r;
  make_scan(&r, 2, 0);
  r.points[0].nchecks = 1;
  r.points[0].checks = xcalloc(1, sizeof *r.points[0].checks);
  r.points[0].checks[0] = (rep_check){xstrdup("particles"), 2, 2, 1e-6, 1};
  r.points[1].ntrace = 2;
  r.points[1].trace = xcalloc(2, sizeof(double));
  cJSON *good = rep_json(&r, 0);
  rep_run_free(&r);
  int refused = 0, accepted = 0;
  for (int n = 1;; n++) {
    cJSON *parent, *probe = nth_node(good, n, &parent);
    if (!probe) break;
    for (int kind = 0; kind < 5; kind++) {
      cJSON *copy = cJSON_Duplicate(good, 1);
      cJSON *pp, *node = nth_node(copy, n, &pp);
      cJSON *bad = kind == 0 ? cJSON_CreateString("x") : kind == 1 ? cJSON_CreateNumber(-1.5)
                 : kind == 2 ? cJSON_CreateNull() : kind == 3 ? cJSON_CreateArray() : cJSON_CreateObject();
      assert_true(cJSON_ReplaceItemViaPointer(pp, node, bad));
      rep_run q;
      char err[200];
      if (rep_read_json(copy, &q, err, sizeof err) == 0) {
        accepted++;
        cJSON *again = rep_json(&q, 0);
        assert_non_null(again);
        cJSON_Delete(again);
        rep_run_free(&q);
      } else {
        refused++;
        assert_true(strlen(err) > 0);
        assert_true(strstr(err, "expected") || strstr(err, "not one of") || strstr(err, "entries for"));
        assert_null(q.points);
      }
      cJSON_Delete(copy);
    }
  }
  cJSON_Delete(good);
  assert_true(refused > 100);
  assert_true(accepted > 0);
}

/* ---- CSV ----------------------------------------------------------------- */

static void test_csv(void **state) {
  (void)state;
  rep_run r;
  make_scan(&r, 3, 1);
  r.points[2].has_gates = 0;
  char *dir = tmpdir();
  char *path = xasprintf("%s/t.csv", dir);
  assert_int_equal(rep_write_csv(&r, path, REP_NO_TIME), 0);
  char *s = slurp(path);
  assert_memory_equal(s, REP_CSV_HEADER "\n", strlen(REP_CSV_HEADER) + 1);
  /* 13 columns in every row */
  int rows = 0;
  for (char *line = strtok(s, "\n"); line; line = strtok(NULL, "\n"), rows++) assert_int_equal(count(line, ","), 12);
  assert_int_equal(rows, 4);
  free(s);
  s = slurp(path);
  char *row1 = strchr(s, '\n') + 1;
  /* param, nuclear, hf, then the MP2 field is empty; seconds empty without timings */
  assert_memory_equal(row1, "0.5,", 4);
  char *f = row1;
  for (int k = 0; k < 3; k++) f = strchr(f, ',') + 1;
  assert_true(*f == ',');
  char *last = strrchr(s, '\n'); /* the last row ends "...,spin_squared,," (no CNOT, no time) */
  *last = 0;
  assert_memory_equal(strrchr(s, '\n') + 1, "1", 1);
  assert_true(last[-1] == ',' && last[-2] == ',');
  free(s);
  /* with timings the seconds are there */
  assert_int_equal(rep_write_csv(&r, path, 0), 0);
  s = slurp(path);
  assert_non_null(strstr(s, ",0.25\n"));
  free(s);
  unlink(path);
  rmdir(dir);
  free(path);
  free(dir);
  rep_run_free(&r);
}

/* ---- text -------------------------------------------------------------- */

static char *text_of(const rep_run *r, unsigned flags) {
  /* the stream's buffer pointer lives on the heap: GCC otherwise takes the
   * result for a pointer into this frame */
  char **buf = xcalloc(1, sizeof *buf);
  size_t len = 0;
  FILE *f = open_memstream(buf, &len);
  rep_text(f, r, flags);
  fclose(f);
  char *s = *buf;
  free(buf);
  return s;
}

static void test_text(void **state) {
  (void)state;
  rep_run r;
  make_scan(&r, 1, 0);
  free(r.param_name);
  r.param_name = NULL; /* a single run */
  rep_point *p = &r.points[0];
  /* chemical accuracy: 1 kcal/mol = 1.6 mEh (common practice) */
  p->error = 1.5e-3;
  char *t = text_of(&r, 0);
  assert_non_null(strstr(t, "Noise-free statevector simulation"));
  assert_non_null(strstr(t, "exact only within the sto-3g basis set and the active space"));
  assert_non_null(strstr(t, "1.5000 mEh, within chemical accuracy"));
  assert_non_null(strstr(t, "<S^2> of the exact state"));
  assert_non_null(strstr(t, "0 1 -> 2 3"));
  assert_non_null(strstr(t, "time: 0.25 s"));
  free(t);
  p->error = 1.7e-3;
  p->nchecks = 1;
  p->checks = xcalloc(1, sizeof *p->checks);
  p->checks[0] = (rep_check){xstrdup("spin-squared"), 3e-5, 0, 1e-6, 0};
  t = text_of(&r, REP_NO_TIME);
  assert_non_null(strstr(t, "1.7000 mEh, NOT within chemical accuracy"));
  assert_non_null(strstr(t, "check FAILED: spin-squared"));
  assert_null(strstr(t, "time"));
  free(t);
  rep_run_free(&r);

  make_scan(&r, 3, 0);
  r.points[1].error = 2e-3;
  t = text_of(&r, REP_NO_TIME);
  assert_non_null(strstr(t, "3 points along r"));
  assert_non_null(strstr(t, "1 of 3 points NOT within chemical accuracy"));
  assert_int_equal(count(t, "\n      0.75 "), 2); /* the point's row in each table */
  free(t);
  t = text_of(&r, REP_NO_TIME | REP_TEXT_POINTS);
  assert_int_equal(count(t, "\npoint "), 3);
  free(t);
  rep_run_free(&r);

  /* a grown generator: the gradient it was chosen at gets its own column, in
   * the text and in the JSON (chosen_gradient), and reads back */
  make_scan(&r, 1, 0);
  free(r.param_name);
  r.param_name = NULL;
  t = text_of(&r, REP_NO_TIME);
  assert_null(strstr(t, "chosen at"));
  free(t);
  r.points[0].gens[0].has_chosen = 1, r.points[0].gens[0].chosen = 2.5e-3;
  t = text_of(&r, REP_NO_TIME);
  assert_non_null(strstr(t, "chosen at"));
  assert_non_null(strstr(t, "-1.800e-01    2.500e-03"));
  free(t);
  cJSON *j = rep_json(&r, 0);
  rep_run q;
  char err[200];
  assert_int_equal(rep_read_json(j, &q, err, sizeof err), 0);
  cJSON_Delete(j);
  assert_int_equal(q.points[0].gens[0].has_chosen, 1);
  assert_true(q.points[0].gens[0].chosen == 2.5e-3);
  rep_run_free(&q);
  rep_run_free(&r);
}

/* ---- figures ------------------------------------------------------------- */

static char *figure(const rep_run *r, int conv) {
  char *dir = tmpdir();
  char *path = xasprintf("%s/f.svg", dir);
  assert_int_equal(conv ? rep_write_convergence_svg(r, 0, path) : rep_write_scan_svg(r, path), 0);
  char *s = slurp(path);
  unlink(path);
  rmdir(dir);
  free(path);
  free(dir);
  return s;
}

static void test_scan_curves(void **state) {
  (void)state;
  rep_run r;
  make_scan(&r, 5, 0);
  char *s = figure(&r, 0);
  /* five energy curves, four error curves (exact has none), one legend entry each */
  assert_int_equal(count(s, "class=\"curve\" id=\"energy-"), 5);
  assert_int_equal(count(s, "class=\"curve\" id=\"error-"), 4);
  assert_int_equal(count(s, "class=\"legend-item\""), 5);
  assert_int_equal(count(s, "class=\"accuracy\""), 1);
  assert_null(strstr(s, "offscale")); /* every value is on its axis */
  assert_non_null(strstr(s, "r / angstrom"));
  assert_non_null(strstr(s, "energy / hartree"));
  free(s);
  rep_run_free(&r);

  make_scan(&r, 1, 0); /* one point: every series still shows, as a dot */
  r.points[0].error = 0; /* and an error of zero is marked off the log axis */
  r.points[0].e.ansatz = r.points[0].e.exact;
  s = figure(&r, 0);
  assert_int_equal(count(s, "class=\"curve\""), 5 + 4);
  assert_int_equal(count(s, "<circle"), 5 + 3 + 1); /* energy dots, error dots but the zero, legend marker */
  assert_int_equal(count(s, "class=\"offscale\" id=\"error-ansatz-offscale\""), 1);
  assert_non_null(strstr(s, "off the axis"));
  free(s);
  rep_run_free(&r);

  make_scan(&r, 5, 1); /* no MP2: left out of plot and legend */
  s = figure(&r, 0);
  assert_int_equal(count(s, "class=\"curve\""), 4 + 3);
  assert_int_equal(count(s, "class=\"legend-item\""), 4);
  assert_null(strstr(s, ">MP2<"));
  free(s);
  rep_run_free(&r);

  make_scan(&r, 5, 2); /* no exact energy: no error panel */
  s = figure(&r, 0);
  assert_int_equal(count(s, "class=\"curve\""), 4);
  assert_null(strstr(s, "id=\"error\""));
  assert_non_null(strstr(s, "no exact energies"));
  free(s);
  /* XML escapes in names */
  free(r.recipe);
  r.recipe = xstrdup("a<b&\"c\"");
  s = figure(&r, 0);
  assert_non_null(strstr(s, "a&lt;b&amp;&quot;c&quot;"));
  free(s);
  rep_run_free(&r);
}

static void test_convergence(void **state) {
  (void)state;
  rep_run r;
  make_scan(&r, 1, 0);
  char *dir = tmpdir();
  char *path = xasprintf("%s/c.svg", dir);
  errno = 0;
  assert_int_equal(rep_write_convergence_svg(&r, 0, path), -1); /* no trace */
  assert_int_equal(errno, EINVAL);
  assert_int_equal(rep_write_convergence_svg(&r, 3, path), -1);
  rep_point *p = &r.points[0];
  p->ntrace = 30;
  p->trace = xcalloc(30, sizeof(double));
  for (int k = 0; k < 30; k++) p->trace[k] = p->e.exact + 0.05 * pow(0.6, k);
  rmdir(dir);
  free(path);
  free(dir);
  char *s = figure(&r, 1);
  assert_int_equal(count(s, "class=\"curve\""), 1);
  assert_int_equal(count(s, "<circle"), 30 + 1); /* markers and the legend sample */
  assert_non_null(strstr(s, "|E - E(exact)| / mEh"));
  assert_non_null(strstr(s, "chemical accuracy 1.6 mEh"));
  free(s);
  p->e.has_exact = 0; /* no exact: energy on a linear axis */
  s = figure(&r, 1);
  assert_non_null(strstr(s, "energy / hartree"));
  assert_null(strstr(s, "chemical accuracy"));
  free(s);
  rep_run_free(&r);
}

/* A write into a missing directory fails with errno and leaves nothing. */
static void test_failed_writes(void **state) {
  (void)state;
  rep_run r;
  make_scan(&r, 2, 0);
  errno = 0;
  assert_int_equal(rep_write_csv(&r, "/nonexistent-cairn-dir/x.csv", 0), -1);
  assert_int_equal(errno, ENOENT);
  assert_int_equal(rep_write_scan_svg(&r, "/nonexistent-cairn-dir/x.svg"), -1);
  assert_int_equal(rep_write_json(&r, "/nonexistent-cairn-dir/x.json", 0), -1);
  rep_paths p = {xstrdup("/nonexistent-cairn-dir/x.csv"), xstrdup("/nonexistent-cairn-dir/x.svg")};
  const char *failed = NULL;
  assert_int_equal(rep_write_outputs(&r, &p, 0, &failed), -1);
  assert_ptr_equal(failed, p.csv);
  rep_paths_free(&p);
  /* and a good write is whole */
  char *dir = tmpdir();
  rep_paths_derive("x.cairn", NULL, NULL, &p);
  char *csv = util_path_join(dir, p.csv), *svg = util_path_join(dir, p.svg);
  rep_paths_free(&p);
  p.csv = csv, p.svg = svg;
  assert_int_equal(rep_write_outputs(&r, &p, 0, NULL), 0);
  struct stat st;
  assert_int_equal(stat(p.svg, &st), 0);
  char *s = slurp(p.svg);
  assert_non_null(strstr(s, "</svg>\n"));
  free(s);
  unlink(p.csv);
  unlink(p.svg);
  rmdir(dir);
  free(dir);
  rep_paths_free(&p);
  rep_run_free(&r);
}

/* ---- help ------------------------------------------------------------------ */

static void test_help_topics(void **state) {
  (void)state;
  assert_true(help_count() > 20);
  for (int i = 0; i < help_count(); i++) {
    const help_entry *t = help_get(i);
    assert_true(t->name && *t->name && t->summary && *t->summary && t->text && *t->text);
    for (int k = 0; k < i; k++) assert_string_not_equal(help_get(k)->name, t->name);
    /* readable in an 80-column terminal */
    for (const char *s = t->text; *s;) {
      size_t n = strcspn(s, "\n");
      assert_true(n <= 78);
      s += n + (s[n] != 0);
    }
    char *buf = NULL;
    size_t len = 0;
    FILE *f = open_memstream(&buf, &len);
    assert_true(help_topic(t->name, f) >= 1);
    fclose(f);
    assert_memory_equal(buf, t->name, strlen(t->name));
    free(buf);
  }
  assert_null(help_get(help_count()));
  FILE *f = fopen("/dev/null", "w");
  assert_int_equal(help_topic("electrons", f), 1); /* a keyword finds its topic */
  assert_int_equal(help_topic("gradient", f), 2);  /* choose and order */
  assert_int_equal(help_find("gradient"), 2);
  assert_int_equal(help_find("integrals"), 1);
  assert_int_equal(help_topic("no-such-word", f), 0);
  assert_int_equal(help_find("no-such-word"), 0);
  assert_int_equal(help_topic("", f), 0);
  fclose(f);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_nice_numbers),  cmocka_unit_test(test_linear_axis),
      cmocka_unit_test(test_log_axis),      cmocka_unit_test(test_fmt_num),
      cmocka_unit_test(test_paths),         cmocka_unit_test(test_json_fields),
      cmocka_unit_test(test_json_round_trip), cmocka_unit_test(test_json_read_errors),
      cmocka_unit_test(test_json_read_mutations),
      cmocka_unit_test(test_csv),           cmocka_unit_test(test_text),
      cmocka_unit_test(test_scan_curves),   cmocka_unit_test(test_convergence),
      cmocka_unit_test(test_failed_writes), cmocka_unit_test(test_help_topics),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
