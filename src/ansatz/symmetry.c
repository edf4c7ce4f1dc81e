/* symmetry.c — symmetry typing: each generator's signature against N, S_z,
 * S^2 (exact commutators in the Pauli algebra of the recipe's encoding), the
 * reference against every kept symmetry, and the messages of each pool rule. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* ORDER ir_symmetry */
static const char *const sym_word[IR_SYM_COUNT] = {"particles", "spin-z", "spin-squared"};
static const char *const sym_op[IR_SYM_COUNT] = {"N (particle number)", "S_z", "S^2 (total spin)"};
static const char *const sym_what[IR_SYM_COUNT] = {"particle number", "S_z", "total spin S^2"};

int ans_sig_commutes(const pauli_sum *s, size_t off, size_t len, const pauli_sum *S, double *worst) {
  static const double complex ip[4] = {1, I, -1, -I};
  int nw = s->nw;
  pauli_acc *acc = NULL;
  uint64_t buf[16] = {0}, *x = nw <= 8 ? buf : xmalloc(2 * (size_t)nw * sizeof *x), *z = x + nw;
  double ms = 0, ss = pauli_sum_max_abs(S);
  for (size_t t = off; t < off + len; t++) {
    const uint64_t *gx = pauli_sum_x(s, t), *gz = pauli_sum_z(s, t);
    if (cabs(s->c[t]) > ms) ms = cabs(s->c[t]);
    for (size_t j = 0; j < S->len; j++) {
      const uint64_t *sx = pauli_sum_x(S, j), *sz = pauli_sum_z(S, j);
      if (pauli_word_commutes(nw, gx, gz, sx, sz)) continue;
      int k = pauli_word_mul(nw, gx, gz, sx, sz, x, z);
      if (!acc) acc = pauli_acc_new(s->n, 4 * len);
      pauli_acc_add(acc, x, z, 2.0 * ip[k] * s->c[t] * S->c[j]);
    }
  }
  if (x != buf) free(x);
  double w = 0;
  if (acc) {
    pauli_sum c;
    pauli_sum_init(&c, s->n);
    pauli_acc_finish(acc, &c, 0.0);
    w = pauli_sum_max_abs(&c);
    pauli_sum_free(&c);
  }
  if (worst) *worst = w;
  return w <= ANS_COMM_TOL * (ms * ss > 1 ? ms * ss : 1) ? ANS_SIG_KEEPS : ANS_SIG_BREAKS;
}

double ans_type_gen(ans_pool *pool, size_t k, const ans_problem *p, int sym) {
  ans_gen *g = &pool->gen[k];
  int tapered = p->taper && p->taper->nsym > 0;
  if (!p->sym[sym]) {
    g->sig.sym[sym] = ANS_SIG_UNKNOWN;
    return 0;
  }
  /* Provable shortcut: on an untapered register N and S_z are diagonal in a
   * linear encoding, and one word with an X part maps every basis state to
   * another whose occupations differ on a nonempty set of modes; the change of
   * N (or S_z) is not zero for all states, so [P, N] != 0. */
  if (g->len == 1 && !tapered && (sym == IR_SYM_PARTICLES || sym == IR_SYM_SPIN_Z)) {
    const uint64_t *x = pauli_sum_x(&pool->words, g->off);
    int nz = 0;
    for (int i = 0; i < pool->words.nw; i++) nz |= x[i] != 0;
    if (nz) {
      g->sig.sym[sym] = ANS_SIG_BREAKS;
      return 1;
    }
  }
  double worst = 0;
  g->sig.sym[sym] = (signed char)ans_sig_commutes(&pool->words, g->off, g->len, p->sym[sym], &worst);
  return worst;
}

void ans_plan_type(ans_plan *pl, const ans_problem *p) {
  for (size_t i = 0; i < pl->norder; i++)
    for (int s = 0; s < IR_SYM_COUNT; s++)
      if (pl->pool.gen[pl->order[i]].sig.sym[s] == ANS_SIG_UNTYPED) ans_type_gen(&pl->pool, pl->order[i], p, s);
}

/* S|b> for a basis state b: the amplitude on b (the eigenvalue when b is an
 * eigenstate) and the largest amplitude on any other state. */
static void apply_to_basis(const pauli_sum *S, const uint64_t *b, double *diag, double *off) {
  static const double complex ip[4] = {1, I, -1, -I};
  int nw = S->nw;
  ans_maskset xs;
  ans_maskset_init(&xs, nw, S->len);
  double complex *amp = xcalloc(S->len + 1, sizeof *amp);
  double complex d = 0;
  for (size_t j = 0; j < S->len; j++) {
    const uint64_t *x = pauli_sum_x(S, j), *z = pauli_sum_z(S, j);
    int k = 0, neg = 0, zero = 1;
    for (int i = 0; i < nw; i++) {
      k += __builtin_popcountll(x[i] & z[i]);
      neg += __builtin_popcountll(z[i] & b[i]);
      zero &= x[i] == 0;
    }
    double complex a = S->c[j] * ip[k & 3] * ((neg & 1) ? -1.0 : 1.0);
    if (zero) d += a;
    else amp[ans_maskset_add(&xs, x, NULL)] += a;
  }
  double worst = 0;
  for (size_t i = 0; i < xs.len; i++)
    if (cabs(amp[i]) > worst) worst = cabs(amp[i]);
  *diag = creal(d);
  *off = worst;
  free(amp);
  ans_maskset_free(&xs);
}

static void help_soft(diag_ctx *d, int s) {
  diag_help(d, "keep it softly: `keep %s penalty 0.5` adds a penalty to the energy, `keep %s checked 1e-6` "
               "verifies the optimized state",
            sym_word[s], sym_word[s]);
}

static int electrons_of(const ans_problem *p, const uint64_t *bits, int *na, int *nb) {
  int nw = pauli_nwords(p->nmodes);
  uint64_t *occ = xcalloc((size_t)nw, sizeof *occ);
  qubit_encoder_occupations(p->enc, bits, occ);
  *na = *nb = 0;
  for (int m = 0; m < p->nmodes; m++)
    if (pauli_get_x(occ, m)) (m & 1 ? (*nb)++ : (*na)++);
  free(occ);
  return *na + *nb;
}

void ans_type_reference(ans_build *b) {
  const ir_recipe *r = b->r;
  const ans_problem *p = b->p;
  diag_ctx *d = b->d;
  diag_span at = r->reference.span;
  if (r->reference.kind == IR_REF_MEAN_FIELD) {
    int kept[IR_SYM_COUNT], nk = 0;
    for (int s = 0; s < IR_SYM_COUNT; s++)
      if (r->keep[s].policy == IR_KEEP_EXACTLY) kept[nk++] = s;
    if (!nk) return;
    util_buf what = {0};
    for (int i = 0; i < nk; i++)
      util_buf_printf(&what, "%s%s", i == 0 ? "" : i == nk - 1 ? " and " : ", ", sym_what[kept[i]]);
    diag_report(d, DIAG_ERROR, at,
                "a mean-field reference cannot keep %s exactly: a product of single-qubit states is not an "
                "eigenstate of them, and its angles are only known after optimization",
                what.s);
    util_buf_free(&what);
    for (int i = 0; i < nk; i++) diag_note(d, ans_keep_span(r, kept[i]), "%s is kept exactly here", sym_what[kept[i]]);
    diag_help(d, "use `reference hartree-fock`, or keep %s softly with `penalty` or `checked`", nk > 1 ? "them" : "it");
    return;
  }
  const char *name = r->reference.kind == IR_REF_BITS ? "the reference bits" : "the Hartree-Fock reference";
  int na, nb;
  electrons_of(p, p->ref_full, &na, &nb);
  double target[IR_SYM_COUNT];
  target[IR_SYM_PARTICLES] = p->nalpha + p->nbeta;
  target[IR_SYM_SPIN_Z] = 0.5 * (p->nalpha - p->nbeta);
  double S = 0.5 * (p->multiplicity - 1);
  target[IR_SYM_SPIN_SQUARED] = S * (S + 1);
  for (int s = 0; s < IR_SYM_COUNT; s++) {
    if (!p->sym[s]) continue;
    int exact = r->keep[s].policy == IR_KEEP_EXACTLY;
    double ev, off;
    apply_to_basis(p->sym[s], b->pl->ref.bits, &ev, &off);
    double scale = pauli_sum_norm1(p->sym[s]) + 1;
    int eigen = off <= 1e-10 * scale;
    int right = fabs(ev - target[s]) <= 1e-9 * scale;
    if (!eigen) {
      if (!exact) continue;
      diag_report(d, DIAG_ERROR, at, "%s are not an eigenstate of %s, which the recipe keeps exactly", name,
                  sym_op[s]);
      diag_note(d, ans_keep_span(r, s), "%s is kept exactly here", sym_what[s]);
      if (s == IR_SYM_SPIN_SQUARED)
        diag_note(d, DIAG_NOWHERE, "a determinant with %d alpha and %d beta electrons in different orbitals mixes "
                                   "spin states",
                  na, nb);
      help_soft(d, s);
      continue;
    }
    if (right) continue;
    if (s == IR_SYM_PARTICLES) {
      diag_report(d, exact ? DIAG_ERROR : DIAG_WARNING, at, "%s hold %d electrons, but the active space has %d", name,
                  na + nb, p->nalpha + p->nbeta);
    } else if (s == IR_SYM_SPIN_Z) {
      diag_report(d, exact ? DIAG_ERROR : DIAG_WARNING, at,
                  "%s have S_z = %g (%d alpha, %d beta electrons), but the recipe's spin state has S_z = %g", name,
                  0.5 * (na - nb), na, nb, target[s]);
    } else {
      if (!exact) continue;
      diag_report(d, DIAG_ERROR, at, "%s have S^2 = %g, but multiplicity %d has S^2 = %g", name, ev,
                  p->multiplicity, target[s]);
    }
    if (exact) diag_note(d, ans_keep_span(r, s), "%s is kept exactly here", sym_what[s]);
    diag_note(d, DIAG_NOWHERE, "spin orbital 2p is orbital p alpha, 2p+1 orbital p beta; bit q is qubit q");
  }
}

/* The rule as written (first line of its span). */
static char *rule_text(const ans_build *b, const ir_rule *rule) {
  size_t len;
  const char *text = diag_file_text(b->d, rule->span.file, &len);
  if (rule->span.file >= 0 && rule->span.end <= len && rule->span.end > rule->span.start) {
    size_t n = rule->span.end - rule->span.start;
    const char *s = text + rule->span.start;
    const char *nl = memchr(s, '\n', n);
    if (nl) n = (size_t)(nl - s);
    while (n && (s[n - 1] == ' ' || s[n - 1] == '\t' || s[n - 1] == '\r')) n--;
    return xstrndup(s, n);
  }
  /* ORDER ir_rule_kind */
  static const char *const names[] = {"singles", "doubles", "entanglers", "qubit singles", "qubit doubles", "word",
                                      "excite"};
  return xstrdup((unsigned)rule->kind < sizeof names / sizeof names[0] ? names[rule->kind] : "rule");
}

static int is_explicit(const ir_rule *rule) { return rule->kind == IR_RULE_WORD || rule->kind == IR_RULE_EXCITE; }

static void symmetry_errors(ans_build *b, int i) {
  const ir_recipe *r = b->r;
  const ir_rule *rule = &r->rules[i];
  ans_tally *t = &b->tally[i];
  diag_ctx *d = b->d;
  const ans_pool *pool = &b->pl->pool;
  char *rt = rule_text(b, rule);
  for (int s = 0; s < IR_SYM_COUNT; s++) {
    if (r->keep[s].policy != IR_KEEP_EXACTLY) continue;
    if (t->unknown[s]) {
      diag_report(d, DIAG_ERROR, rule->span,
                  "`%s` cannot be typed against %s: the operator does not survive tapering, and the recipe "
                  "keeps it exactly",
                  rt, sym_op[s]);
      diag_note(d, ans_keep_span(r, s), "%s is kept exactly here", sym_what[s]);
      diag_help(d, "keep %s with `checked`, or drop `taper`", sym_word[s]);
      t->had_error = 1;
    }
    if (!t->breaks[s] && !t->static_break[s]) continue;
    t->had_error = 1;
    int all = t->static_break[s] || t->breaks[s] == t->made;
    if (is_explicit(rule)) {
      diag_report(d, DIAG_ERROR, rule->span, "`%s` does not commute with %s, which the recipe keeps exactly", rt,
                  sym_op[s]);
    } else if (all) {
      diag_report(d, DIAG_ERROR, rule->span,
                  "no generator of `%s` commutes with %s, which the recipe keeps exactly", rt, sym_op[s]);
    } else {
      diag_report(d, DIAG_ERROR, rule->span,
                  "%zu of the %zu generators of `%s` do not commute with %s, which the recipe keeps exactly",
                  t->breaks[s], t->made, rt, sym_op[s]);
    }
    diag_note(d, ans_keep_span(r, s), "%s is kept exactly here", sym_what[s]);
    if (!all && t->first_break[s] >= 0)
      diag_note(d, DIAG_NOWHERE, "the first is %s", pool->gen[t->first_break[s]].info.text);
    int word_like = rule->kind == IR_RULE_WORD || rule->kind == IR_RULE_ENTANGLERS;
    if (word_like && s != IR_SYM_SPIN_SQUARED && !(b->p->taper && b->p->taper->nsym > 0))
      diag_note(d, DIAG_NOWHERE,
                "a single Pauli word with an X or Y letter changes the occupations it flips, so it never commutes "
                "with N or S_z in a linear encoding");
    if (rule->kind == IR_RULE_EXCITE && s == IR_SYM_SPIN_Z)
      diag_note(d, DIAG_NOWHERE, "even spin orbitals are alpha, odd ones beta: an excitation keeps S_z when it "
                                 "moves as many alpha electrons in as out");
    help_soft(d, s);
    if (s == IR_SYM_SPIN_SQUARED && rule->kind == IR_RULE_SINGLES && !(rule->options & IR_OPT_SPIN_ADAPTED))
      diag_help(d, "or use `singles spin-adapted` (alpha and beta moves under one parameter commute with S^2)");
    if (s == IR_SYM_SPIN_SQUARED && rule->kind == IR_RULE_DOUBLES && !(rule->options & IR_OPT_PAIRED))
      diag_help(d, "or use `doubles paired` (pair moves commute with S^2)");
    if (rule->kind == IR_RULE_ENTANGLERS && s != IR_SYM_SPIN_SQUARED)
      diag_help(d, "or use a pool that conserves particles: singles, doubles, qubit singles, qubit doubles");
  }
  free(rt);
}

static char *z_text(int n, const uint64_t *tau) {
  uint64_t *x = xcalloc((size_t)pauli_nwords(n), sizeof *x);
  char *s = pauli_word_str(n, x, tau);
  free(x);
  return s;
}

void ans_rule_messages(ans_build *b) {
  const ir_recipe *r = b->r;
  diag_ctx *d = b->d;
  const ans_pool *pool = &b->pl->pool;
  const qubit_taper *tp = b->p->taper;
  for (int i = 0; i < r->nrules; i++) {
    const ir_rule *rule = &r->rules[i];
    ans_tally *t = &b->tally[i];
    char *rt = rule_text(b, rule);
    symmetry_errors(b, i);
    if (tp && is_explicit(rule)) {
      util_buf syms = {0}, words = {0};
      int nf = 0, last = -1;
      for (int k = 0; k < tp->nsym; k++)
        if (t->z2_drop[k]) nf++, last = k;
      for (int k = 0, seen = 0; k < tp->nsym; k++) {
        if (!t->z2_drop[k]) continue;
        char *zt = z_text(tp->nqubits, tp->tau + (size_t)k * (size_t)pauli_nwords(tp->nqubits));
        const char *why = tp->why && tp->why[k] ? tp->why[k] : "a symmetry of the Hamiltonian";
        util_buf_printf(&syms, "%s%s (%s)", seen == 0 ? "" : k == last ? " and " : ", ", zt, why);
        util_buf_printf(&words, "%s%s", seen == 0 ? "" : k == last ? " and " : ", ", zt);
        seen++;
        free(zt);
      }
      if (nf) {
        diag_report(d, DIAG_ERROR, rule->span,
                    "`%s` does not commute with the tapered symmetr%s %s, so it cannot act on the tapered register", rt,
                    nf == 1 ? "y" : "ies", syms.s);
        diag_note(d, r->encoding_span, "the encoding removes %s here", nf == 1 ? "that symmetry" : "those symmetries");
        diag_help(d, "drop `taper`, or use a generator that commutes with %s", words.s);
        t->had_error = 1;
      }
      util_buf_free(&syms);
      util_buf_free(&words);
    } else if (tp) {
      /* one warning per rule: how many, and under which symmetry (the first
       * each generator breaks) */
      size_t total = 0;
      int nf = 0, last = -1;
      for (int k = 0; k < tp->nsym; k++)
        if (t->z2_drop[k]) total += t->z2_drop[k], nf++, last = k;
      if (nf) {
        util_buf what = {0};
        for (int k = 0, seen = 0; k < tp->nsym; k++) {
          if (!t->z2_drop[k]) continue;
          char *zt = z_text(tp->nqubits, tp->tau + (size_t)k * (size_t)pauli_nwords(tp->nqubits));
          const char *why = tp->why && tp->why[k] ? tp->why[k] : "a symmetry of the Hamiltonian";
          if (nf == 1) util_buf_printf(&what, "the tapered symmetry %s (%s)", zt, why);
          else util_buf_printf(&what, "%s%zu with %s (%s)", seen == 0 ? "" : k == last ? " and " : ", ", t->z2_drop[k], zt, why);
          seen++;
          free(zt);
        }
        if (nf == 1)
          diag_report(d, DIAG_WARNING, rule->span, "%zu generator%s of `%s` do%s not commute with %s and %s dropped", total,
                      total == 1 ? "" : "s", rt, total == 1 ? "es" : "", what.s, total == 1 ? "is" : "are");
        else
          diag_report(d, DIAG_WARNING, rule->span,
                      "%zu generators of `%s` do not commute with the tapered symmetries and are dropped: %s", total, rt,
                      what.s);
        util_buf_free(&what);
        diag_note(d, r->encoding_span, "the encoding removes %s here", nf == 1 ? "that symmetry" : "those symmetries");
        if (t->z2_text) diag_note(d, DIAG_NOWHERE, "the first is %s", t->z2_text);
      }
    }
    if (t->vanished) {
      if (is_explicit(rule))
        diag_report(d, DIAG_WARNING, rule->span, "`%s` is the zero operator and is dropped", rt);
      else
        diag_report(d, DIAG_WARNING, rule->span, "%zu generators of `%s` are the zero operator and are dropped",
                    t->vanished, rt);
    }
    if (t->vanished_taper) {
      if (is_explicit(rule))
        diag_report(d, DIAG_WARNING, rule->span,
                    "`%s` vanishes on the tapered register (at most a global phase is left) and is dropped", rt);
      else
        diag_report(d, DIAG_WARNING, rule->span, "%zu generators of `%s` vanish on the tapered register and are dropped",
                    t->vanished_taper, rt);
      diag_note(d, r->encoding_span, "tapering is asked for here");
    }
    if (t->dup) {
      const ans_gen *g0 = &pool->gen[t->dup_of];
      char *ot = rule_text(b, &r->rules[g0->info.rule]);
      if (is_explicit(rule))
        diag_report(d, DIAG_WARNING, rule->span, "`%s` duplicates generator %s of `%s`; the copy is dropped", rt,
                    g0->info.text, ot);
      else
        diag_report(d, DIAG_WARNING, rule->span,
                    "%zu generator%s of `%s` duplicate%s explicit generators and %s dropped", t->dup,
                    t->dup == 1 ? "" : "s", rt, t->dup == 1 ? "s" : "", t->dup == 1 ? "is" : "are");
      diag_note(d, g0->span, "%s first made by `%s` here", g0->info.text, ot);
      free(ot);
    }
    if (!t->unexpanded && !t->had_error && t->made == 0) {
      if (t->tried == 0)
        diag_report(d, DIAG_WARNING, rule->span, "`%s` makes no generators for this reference and active space", rt);
      else if (!is_explicit(rule)) {
        size_t z2 = 0;
        if (tp)
          for (int k = 0; k < tp->nsym; k++) z2 += t->z2_drop[k];
        util_buf why = {0};
        if (t->dup + t->dup_quiet) util_buf_printf(&why, ", %zu copies of earlier generators", t->dup + t->dup_quiet);
        if (z2) util_buf_printf(&why, ", %zu breaking a tapered symmetry", z2);
        if (t->vanished + t->vanished_taper) util_buf_printf(&why, ", %zu zero", t->vanished + t->vanished_taper);
        diag_report(d, DIAG_WARNING, rule->span, "no generator of `%s` survives (%zu proposed%s)", rt, t->tried,
                    why.s ? why.s : "");
        util_buf_free(&why);
      }
    }
    free(rt);
  }
}
