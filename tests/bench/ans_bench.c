/* ans_bench.c — how fast generator pools are screened at the reference.
 *
 *   ans_bench [FILE.fcidump]
 *
 * Cases, each in its own child process so its peak memory is its own:
 *   - the FCIDUMP file's active space (the bench script gives a 20-orbital,
 *     40-qubit one written by psi4), Jordan-Wigner, Hartree-Fock reference:
 *     all flip-set entanglers (flip sets found, best word chosen, gradient)
 *     and all UCCSD doubles (built through the encoder, then screened);
 *     median of 3 runs of each;
 *   - 50 orbitals (100 qubits) of random integrals with the 8-fold symmetry
 *     (fixed seed; invented data), 25 + 25 electrons: the same, median of 3;
 *   - baseline, measured in the same run on 10 random orbitals (20 qubits):
 *     the generic route (for each generator the commutator [G, H] by the Pauli
 *     algebra, then its expectation at the reference) against the grouped
 *     closed form, on the same pools; ratio and largest difference.
 * Goal (issue 5): 100-qubit entangler screening under 10 s.
 */
#include "config.h"

#include "cairn/diag.h"
#include "cairn/fcidump.h"
#include "cairn/pool.h"
#include "cairn/util.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

typedef struct result {
  size_t hterms, pool;
  double build_s;      /* Hamiltonian (not part of screening) */
  double screen_s;     /* median */
  double screen_cpu;   /* CPU seconds of the same run (the machine is shared) */
  double rescreen_s;   /* doubles: screening alone (median) */
  double peak_mb;
  double ratio, maxdiff; /* baseline only */
} result;

static void random_space(chem_space *s, int norb, int nocc, uint64_t seed) {
  memset(s, 0, sizeof *s);
  s->norb = norb;
  s->nalpha = s->nbeta = nocc;
  s->h1 = xcalloc((size_t)norb * norb, sizeof(double));
  s->h2 = xcalloc((size_t)norb * norb * norb * norb, sizeof(double));
  util_rng r;
  util_rng_seed(&r, seed);
  for (int p = 0; p < norb; p++)
    for (int q = 0; q <= p; q++) {
      double v = 0.3 * (util_rng_uniform(&r) - 0.5);
      if (p == q) v += -2.0 + 4.0 * p / norb;
      s->h1[p * norb + q] = s->h1[q * norb + p] = v;
    }
  for (int p = 0; p < norb; p++)
    for (int q = 0; q <= p; q++)
      for (int a = 0; a < norb; a++)
        for (int b = 0; b <= a; b++) {
          if (p * (p + 1) / 2 + q < a * (a + 1) / 2 + b) continue;
          double v = 0.05 * (util_rng_uniform(&r) - 0.5);
          int idx[8][4] = {{p, q, a, b}, {q, p, a, b}, {p, q, b, a}, {q, p, b, a},
                           {a, b, p, q}, {b, a, p, q}, {a, b, q, p}, {b, a, q, p}};
          for (int k = 0; k < 8; k++) s->h2[chem_h2_index(norb, idx[k][0], idx[k][1], idx[k][2], idx[k][3])] = v;
        }
}

static int cmp_double(const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return x < y ? -1 : x > y;
}

static double median(double *v, int n) {
  qsort(v, (size_t)n, sizeof *v, cmp_double);
  return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

/* A recipe with one pool rule, choose all, nothing kept. */
static void one_rule(ir_recipe *r, ir_rule *rule, ir_rule_kind k, const chem_space *cs) {
  memset(r, 0, sizeof *r);
  memset(rule, 0, sizeof *rule);
  rule->kind = k;
  rule->span = DIAG_NOWHERE;
  r->rules = rule;
  r->nrules = 1;
  r->encoding = IR_ENC_JORDAN_WIGNER;
  r->reference.kind = IR_REF_HARTREE_FOCK;
  r->reference.span = r->choose.span = r->pool_span = r->encoding_span = DIAG_NOWHERE;
  for (int s = 0; s < IR_SYM_COUNT; s++) r->keep[s].span = DIAG_NOWHERE;
  r->choose.kind = IR_CHOOSE_ALL;
  r->trotter = 1;
  r->orbitals.nactive = cs->norb;
  r->orbitals.nalpha = cs->nalpha;
  r->orbitals.nbeta = cs->nbeta;
  r->multiplicity = cs->nalpha - cs->nbeta + 1;
}

/* Screen both pools of cs; times the median of `reps` runs. */
static void screen_case(const chem_space *cs, ir_rule_kind kind, int reps, result *out) {
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  ir_recipe r;
  ir_rule rule;
  one_rule(&r, &rule, kind, cs);
  double t0 = util_now();
  ans_setup s;
  if (ans_setup_init(&s, &r, cs, d) != 0) exit(3);
  out->build_s = util_now() - t0;
  out->hterms = s.prob.H->len;
  double ts[8], tr[8], tc[8];
  for (int k = 0; k < reps; k++) {
    ans_plan pl;
    double a = util_now();
    clock_t c0 = clock();
    if (ans_plan_build(&pl, &r, &s.prob, d) != 0) exit(3);
    ts[k] = util_now() - a;
    tc[k] = (double)(clock() - c0) / CLOCKS_PER_SEC;
    out->pool = pl.pool.len;
    a = util_now();
    ans_pool_screen(&pl.pool, s.prob.H, &pl.ref);
    tr[k] = util_now() - a;
    ans_plan_free(&pl);
  }
  out->screen_s = median(ts, reps);
  out->screen_cpu = median(tc, reps);
  out->rescreen_s = median(tr, reps);
  ans_setup_free(&s);
  diag_free(d);
  out->peak_mb = (double)util_peak_rss() / 1048576.0;
}

/* The generic route for every generator of a pool: [G, H] by the Pauli
 * algebra, then (i/2)<b|[G, H]|b> term by term at the basis state b. */
static double generic_gradient(const ans_pool *pool, size_t k, const pauli_sum *H, const uint64_t *b) {
  static const double complex ip[4] = {1, I, -1, -I};
  const ans_gen *g = &pool->gen[k];
  pauli_sum G, C;
  pauli_sum_init(&G, pool->words.n);
  pauli_sum_init(&C, pool->words.n);
  for (size_t t = g->off; t < g->off + g->len; t++)
    pauli_sum_add(&G, pauli_sum_x(&pool->words, t), pauli_sum_z(&pool->words, t), pool->words.c[t]);
  pauli_sum_commutator(&C, &G, H);
  double complex e = 0;
  for (size_t t = 0; t < C.len; t++) {
    const uint64_t *x = pauli_sum_x(&C, t), *z = pauli_sum_z(&C, t);
    int zero = 1, neg = 0, y = 0;
    for (int i = 0; i < C.nw; i++) {
      zero &= x[i] == 0;
      neg += __builtin_popcountll(z[i] & b[i]);
      y += __builtin_popcountll(x[i] & z[i]);
    }
    if (zero) e += C.c[t] * ip[y & 3] * ((neg & 1) ? -1.0 : 1.0);
  }
  pauli_sum_free(&G);
  pauli_sum_free(&C);
  return creal(0.5 * I * e);
}

static void baseline_case(result *out) {
  chem_space cs;
  random_space(&cs, 10, 3, 7);
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  double closed = 0, generic = 0, maxdiff = 0;
  size_t pool = 0;
  for (int kind = 0; kind < 2; kind++) {
    ir_recipe r;
    ir_rule rule;
    one_rule(&r, &rule, kind ? IR_RULE_DOUBLES : IR_RULE_ENTANGLERS, &cs);
    ans_setup s;
    if (ans_setup_init(&s, &r, &cs, d) != 0) exit(3);
    ans_plan pl;
    if (ans_plan_build(&pl, &r, &s.prob, d) != 0) exit(3);
    out->hterms = s.prob.H->len;
    pool += pl.pool.len;
    double a = util_now();
    ans_pool_screen(&pl.pool, s.prob.H, &pl.ref);
    closed += util_now() - a;
    a = util_now();
    for (size_t k = 0; k < pl.pool.len; k++) {
      double g = generic_gradient(&pl.pool, k, s.prob.H, pl.ref.bits);
      double diff = fabs(g - pl.pool.gen[k].gradient);
      if (diff > maxdiff) maxdiff = diff;
    }
    generic += util_now() - a;
    ans_plan_free(&pl);
    ans_setup_free(&s);
  }
  out->pool = pool;
  out->screen_s = closed;
  out->rescreen_s = generic;
  out->ratio = generic / closed;
  out->maxdiff = maxdiff;
  out->peak_mb = (double)util_peak_rss() / 1048576.0;
  diag_free(d);
  chem_space_free(&cs);
}

/* Run fn in a child; its result comes back through a pipe. */
static int in_child(result *out, void (*fn)(void *, result *), void *arg) {
  int fd[2];
  if (pipe(fd) != 0) return -1;
  fflush(stdout);
  pid_t pid = fork();
  if (pid == 0) {
    close(fd[0]);
    result r;
    memset(&r, 0, sizeof r);
    fn(arg, &r);
    ssize_t w = write(fd[1], &r, sizeof r);
    _exit(w == (ssize_t)sizeof r ? 0 : 1);
  }
  close(fd[1]);
  ssize_t got = read(fd[0], out, sizeof *out);
  close(fd[0]);
  int st = 0;
  waitpid(pid, &st, 0);
  return got == (ssize_t)sizeof *out && WIFEXITED(st) && WEXITSTATUS(st) == 0 ? 0 : -1;
}

typedef struct job {
  const char *fcidump;
  int random_norb;
  ir_rule_kind kind;
} job;

static void run_job(void *arg, result *out) {
  const job *j = arg;
  chem_space cs;
  if (j->fcidump) {
    diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
    if (fcidump_read(d, j->fcidump, DIAG_NOWHERE, &cs) != 0) exit(3);
    diag_free(d);
  } else {
    random_space(&cs, j->random_norb, j->random_norb / 2, 11);
  }
  screen_case(&cs, j->kind, 3, out);
  chem_space_free(&cs);
}

static void run_baseline(void *arg, result *out) {
  (void)arg;
  baseline_case(out);
}

int main(int argc, char **argv) {
  const char *fcidump = argc > 1 ? argv[1] : NULL;
  printf("generator screening at the Hartree-Fock reference, Jordan-Wigner (closed forms, no statevector)\n");
  printf("%-40s %7s %10s %9s %9s %9s %9s %11s %8s\n", "case", "qubits", "H terms", "pool", "H build s", "screen s",
         "cpu s", "screen-only", "peak MB");
  double ent100 = -1;
  for (int c = 0; c < 4; c++) {
    job j = {c < 2 ? fcidump : NULL, 50, c % 2 ? IR_RULE_DOUBLES : IR_RULE_ENTANGLERS};
    if (c < 2 && !fcidump) continue;
    result r;
    memset(&r, 0, sizeof r);
    char name[64];
    snprintf(name, sizeof name, "%s %s", c < 2 ? "FCIDUMP" : "random 50 orbitals",
             c % 2 ? "UCCSD doubles" : "flip-set entanglers");
    if (in_child(&r, run_job, &j) != 0) {
      printf("%-40s failed\n", name);
      continue;
    }
    int q = c < 2 ? 0 : 100;
    if (c < 2) {
      chem_space h;
      diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
      if (fcidump_read(d, fcidump, DIAG_NOWHERE, &h) == 0) {
        q = 2 * h.norb;
        chem_space_free(&h);
      }
      diag_free(d);
    }
    char only[32];
    if (c % 2) snprintf(only, sizeof only, "%.3f", r.rescreen_s);
    else snprintf(only, sizeof only, "(same)");
    printf("%-40s %7d %10zu %9zu %9.2f %9.3f %9.3f %11s %8.0f\n", name, q, r.hterms, r.pool, r.build_s, r.screen_s,
           r.screen_cpu, only, r.peak_mb);
    if (c == 2) ent100 = r.screen_s;
  }
  result b;
  memset(&b, 0, sizeof b);
  if (in_child(&b, run_baseline, NULL) == 0) {
    printf("baseline, 20 qubits (10 random orbitals), entanglers + doubles, %zu generators, %zu H terms:\n", b.pool,
           b.hterms);
    printf("  generic commutator route %.3f s, grouped closed form %.4f s: ratio %.1fx; largest difference %.1e\n",
           b.rescreen_s, b.screen_s, b.ratio, b.maxdiff);
  } else {
    printf("baseline failed\n");
  }
  if (ent100 >= 0)
    printf("goal: 100-qubit entangler screening under 10 s: %.2f s (%s)\n", ent100, ent100 < 10 ? "met" : "NOT met");
  printf("\"screen s\" = wall seconds to build the pool and screen it (median of 3), \"cpu s\" the CPU seconds of\n"
         "the same runs (wall exceeds cpu when the shared machine is busy); \"screen-only\" = gradients of an existing pool\n");
  return 0;
}
