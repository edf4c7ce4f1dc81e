/* pool.c — the generator pool: adding generators (typing, tapering,
 * duplicates), screening, and the plan that ties reference, pool and selection
 * together. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

void ans_pool_free(ans_pool *pool) {
  for (size_t k = 0; k < pool->len; k++) free(pool->gen[k].info.text);
  free(pool->gen);
  pauli_sum_free(&pool->words);
  free(pool->rule_made);
  memset(pool, 0, sizeof *pool);
}

void ans_plan_free(ans_plan *pl) {
  ans_reference_free(&pl->ref);
  ans_pool_free(&pl->pool);
  free(pl->order);
  memset(pl, 0, sizeof *pl);
}

long long ans_grad_key(double g) {
  if (isnan(g)) return -1;
  double a = fabs(g) / 1e-12;
  if (a > 9e18) return (long long)9e18;
  return llround(a);
}

char *ans_excitation_text(int k, const int *from, const int *to) {
  util_buf b = {0};
  for (int i = 0; i < k; i++) util_buf_printf(&b, i ? " %d" : "%d", from[i]);
  util_buf_printf(&b, " ->");
  for (int i = 0; i < k; i++) util_buf_printf(&b, " %d", to[i]);
  return b.s;
}

/* ---- duplicates: generators equal up to a real factor ---- */

static uint64_t gen_hash(const pauli_sum *w, size_t off, size_t len) {
  uint64_t h = 0x51afd7ed558ccd1ULL ^ len;
  for (size_t t = off; t < off + len; t++) {
    h ^= pauli_word_hash(w->nw, pauli_sum_x(w, t), pauli_sum_z(w, t)) + (h << 7) + (h >> 3);
    h *= 0x9e3779b97f4a7c15ULL;
  }
  return h;
}

/* Same words and proportional coefficients (both sums canonical). */
static int gen_same(const pauli_sum *w, size_t oa, size_t la, const pauli_sum *v, size_t ob, size_t lb) {
  if (la != lb || la == 0) return 0;
  double ca = creal(w->c[oa]), cb = creal(v->c[ob]);
  for (size_t k = 0; k < la; k++) {
    if (!pauli_word_equal(w->nw, pauli_sum_x(w, oa + k), pauli_sum_z(w, oa + k), pauli_sum_x(v, ob + k),
                          pauli_sum_z(v, ob + k)))
      return 0;
    double a = creal(w->c[oa + k]) * cb, b2 = creal(v->c[ob + k]) * ca;
    if (fabs(a - b2) > 1e-10 * (fabs(a) + fabs(b2))) return 0;
  }
  return 1;
}

/* Rebuild the duplicate table over the pool (open addressing). */
static void dd_rehash(ans_build *b, size_t nslots) {
  free(b->dd.slot);
  b->dd.slot = xcalloc(nslots, sizeof *b->dd.slot);
  b->dd.nslots = nslots;
  const ans_pool *pool = &b->pl->pool;
  for (size_t k = 0; k < pool->len; k++) {
    size_t h = (size_t)gen_hash(&pool->words, pool->gen[k].off, pool->gen[k].len) & (nslots - 1);
    while (b->dd.slot[h]) h = (h + 1) & (nslots - 1);
    b->dd.slot[h] = k + 1;
  }
}

/* Pool index of a generator equal to G (words off..off+len of s), or -1. */
static long dd_find(const ans_build *b, const pauli_sum *s, size_t off, size_t len, size_t *slot_out) {
  const ans_pool *pool = &b->pl->pool;
  size_t mask = b->dd.nslots - 1;
  size_t h = (size_t)gen_hash(s, off, len) & mask;
  while (b->dd.slot[h]) {
    size_t k = b->dd.slot[h] - 1;
    if (gen_same(&pool->words, pool->gen[k].off, pool->gen[k].len, s, off, len)) return (long)k;
    h = (h + 1) & mask;
  }
  *slot_out = h;
  return -1;
}

/* ---- appending ---- */

static int x_weight(int nw, const uint64_t *x) {
  int k = 0;
  for (int i = 0; i < nw; i++) k += __builtin_popcountll(x[i]);
  return k;
}

/* Append G (canonical, on the ansatz register) unless it duplicates an
 * earlier generator.  Returns the new pool index, or -1 (tallied). */
static long append_gen(ans_build *b, const ans_gen_info *info, const pauli_sum *G, double gradient) {
  ans_pool *pool = &b->pl->pool;
  ans_tally *t = &b->tally[b->rule];
  size_t slot = 0;
  long dup = dd_find(b, G, 0, G->len, &slot);
  if (dup >= 0) {
    /* Overlapping rule families (pair doubles within doubles, ...) are a
     * normal way to compose a pool: their copies go quietly.  A copy that
     * involves an explicit word or excitation is worth a warning. */
    ir_rule_kind k0 = b->r->rules[pool->gen[dup].info.rule].kind, k1 = b->r->rules[b->rule].kind;
    if (k0 == IR_RULE_WORD || k0 == IR_RULE_EXCITE || k1 == IR_RULE_WORD || k1 == IR_RULE_EXCITE) {
      if (t->dup++ == 0) t->dup_of = dup;
    } else {
      t->dup_quiet++;
    }
    return -1;
  }
  UTIL_GROW(pool->gen, pool->cap, pool->len + 1);
  ans_gen *g = &pool->gen[pool->len];
  memset(g, 0, sizeof *g);
  g->info = *info;
  g->info.text = xstrdup(info->text ? info->text : "");
  g->info.rule = b->rule;
  g->info.line = b->rule_line;
  g->span = b->r->rules[b->rule].span;
  g->off = pool->words.len;
  g->len = G->len;
  g->gradient = gradient;
  for (int s = 0; s < IR_SYM_COUNT; s++) g->sig.sym[s] = ANS_SIG_UNTYPED;
  g->sig.z2 = 1;
  pauli_sum_add_sum(&pool->words, G, 1.0);
  int xw = 0;
  for (size_t k = 0; k < G->len; k++) {
    int w = pauli_word_weight(G->nw, pauli_sum_x(G, k), pauli_sum_z(G, k));
    if (w > 1) g->cnot += 2 * (w - 1);
    int xk = x_weight(G->nw, pauli_sum_x(G, k));
    if (xk > xw) xw = xk;
  }
  g->rank = info->nexc > 0 ? 2 * info->nexc : xw;
  size_t k = pool->len++;
  b->dd.slot[slot] = k + 1;
  if (2 * pool->len > b->dd.nslots) dd_rehash(b, 2 * b->dd.nslots);
  t->made++;
  for (int s = 0; s < IR_SYM_COUNT; s++) {
    if (!b->type_all[s]) continue;
    double worst = ans_type_gen(pool, k, b->p, s);
    int v = pool->gen[k].sig.sym[s];
    if (v == ANS_SIG_BREAKS) {
      if (t->breaks[s]++ == 0) t->first_break[s] = (long)k;
      if (worst > t->worst[s]) t->worst[s] = worst;
    } else if (v == ANS_SIG_UNKNOWN) {
      t->unknown[s]++;
    }
  }
  return (long)k;
}

/* Real coefficients: G is Hermitian by construction, so imaginary parts are
 * rounding only.  The identity word is dropped: exp(-i theta c I / 2) is only
 * a global phase. */
static void make_real(pauli_sum *G) {
  size_t m = 0;
  for (size_t k = 0; k < G->len; k++) {
    if (pauli_word_is_identity(G->nw, pauli_sum_x(G, k), pauli_sum_z(G, k))) continue;
    if (m != k) {
      memcpy(pauli_sum_x(G, m), pauli_sum_x(G, k), (size_t)G->nw * sizeof(uint64_t));
      memcpy(pauli_sum_z(G, m), pauli_sum_z(G, k), (size_t)G->nw * sizeof(uint64_t));
    }
    G->c[m++] = creal(G->c[k]);
  }
  G->len = m;
}

/* Does every word of G commute with the Z word tau (even overlap of X parts)? */
static int commutes_with_z(int nw, const pauli_sum *G, const uint64_t *tau) {
  for (size_t k = 0; k < G->len; k++) {
    const uint64_t *x = pauli_sum_x(G, k);
    int par = 0;
    for (int i = 0; i < nw; i++) par += __builtin_popcountll(x[i] & tau[i]);
    if (par & 1) return 0;
  }
  return 1;
}

void ans_add_full(ans_build *b, const ans_gen_info *info, pauli_sum *G) {
  ans_tally *t = &b->tally[b->rule];
  t->tried++;
  pauli_sum_canonicalize(G, ANS_WORD_TOL);
  make_real(G);
  pauli_sum_canonicalize(G, ANS_WORD_TOL);
  if (G->len == 0) {
    t->vanished++;
    return;
  }
  const qubit_taper *tp = b->p->taper;
  if (tp && tp->nsym > 0) {
    int nw = pauli_nwords(tp->nqubits);
    const ir_rule_kind rk = b->r->rules[b->rule].kind;
    int explicit = rk == IR_RULE_WORD || rk == IR_RULE_EXCITE, dropped = 0;
    /* a rule-made generator is counted under the first symmetry it breaks,
     * an explicit one under every one (its error names them all) */
    for (int i = 0; i < tp->nsym && (explicit || !dropped); i++)
      if (!commutes_with_z(nw, G, tp->tau + (size_t)i * (size_t)nw)) {
        if (!t->z2_text) t->z2_text = xstrdup(info->text ? info->text : "");
        t->z2_drop[i]++;
        dropped = 1;
      }
    if (dropped) return;
    pauli_sum Gt;
    pauli_sum_init(&Gt, b->p->nqubits);
    if (qubit_taper_apply(tp, G, &Gt) != 0) {
      fprintf(stderr, "cairn: internal error: a generator that commutes with the tapered symmetries "
                      "could not be tapered\n");
      abort();
    }
    pauli_sum_canonicalize(&Gt, ANS_WORD_TOL);
    make_real(&Gt);
    if (Gt.len == 0) t->vanished_taper++;
    else append_gen(b, info, &Gt, NAN);
    pauli_sum_free(&Gt);
    return;
  }
  append_gen(b, info, G, NAN);
}

void ans_reserve(ans_build *b, size_t more) {
  ans_pool *pool = &b->pl->pool;
  UTIL_GROW(pool->gen, pool->cap, pool->len + more);
  pauli_sum_reserve(&pool->words, pool->words.len + more);
  size_t need = 64;
  while (need < 2 * (pool->len + more)) need *= 2;
  if (need > b->dd.nslots) dd_rehash(b, need);
}

void ans_add_reg_word(ans_build *b, const ans_gen_info *info, const uint64_t *x, const uint64_t *z,
                      double gradient) {
  b->tally[b->rule].tried++;
  pauli_sum_clear(&b->word);
  pauli_sum_add(&b->word, x, z, 1.0);
  append_gen(b, info, &b->word, gradient);
}

double ans_gen_gradient(const ans_pool *pool, size_t k, const pauli_sum *H, const ans_reference *ref) {
  ans_screen s;
  ans_screen_init(&s, H, ref);
  const ans_gen *g = &pool->gen[k];
  double v = 0;
  for (size_t t = g->off; t < g->off + g->len; t++)
    v += creal(pool->words.c[t]) * ans_screen_word(&s, pauli_sum_x(&pool->words, t), pauli_sum_z(&pool->words, t));
  ans_screen_free(&s);
  return v;
}

/* Gradients of the generators (all, or those not screened yet):
 * g = sum_k m_k g(P_k). */
static void screen_pool(ans_pool *pool, const ans_screen *s, int all) {
  for (size_t k = 0; k < pool->len; k++) {
    ans_gen *g = &pool->gen[k];
    if (!all && !isnan(g->gradient)) continue;
    double v = 0;
    for (size_t t = g->off; t < g->off + g->len; t++)
      v += creal(pool->words.c[t]) * ans_screen_word(s, pauli_sum_x(&pool->words, t), pauli_sum_z(&pool->words, t));
    g->gradient = v;
  }
}

void ans_pool_screen(ans_pool *pool, const pauli_sum *H, const ans_reference *ref) {
  ans_screen s;
  ans_screen_init(&s, H, ref);
  screen_pool(pool, &s, 1);
  ans_screen_free(&s);
}

/* Refuse a rule whose generators (with those of the rules before it) would
 * not fit in memory, before making any: each takes its words (two masks and
 * a coefficient), its record and its slots in the duplicate table. */
static int pool_fits(ans_build *b, const ir_rule *rule, uint64_t *planned) {
  int words = 0;
  uint64_t count = ans_rule_estimate(b, rule, &words);
  if (count == 0) return 1;
  uint64_t per = (uint64_t)words * (2 * (uint64_t)pauli_nwords(b->p->nqubits) * 8 + 16) + sizeof(ans_gen) + 64,
           need = count > UINT64_MAX / per ? UINT64_MAX : count * per, avail = util_mem_available();
  if (avail == 0 || *planned + need <= avail) {
    *planned += need;
    return 1;
  }
  b->tally[b->rule].had_error = 1;
  diag_report(b->d, DIAG_ERROR, rule->span,
              "this rule makes up to %llu generators on %d qubits, which need about %.1f GiB; %.1f GiB are available",
              (unsigned long long)count, b->p->nqubits, (double)need / (1 << 30), (double)avail / (1 << 30));
  diag_help(b->d, "make the active space smaller (`orbitals { active N electrons in M orbitals }`), or use a "
                  "rule that makes fewer generators");
  return 0;
}

int ans_plan_build(ans_plan *pl, const ir_recipe *r, const ans_problem *p, diag_ctx *d) {
  memset(pl, 0, sizeof *pl);
  int errors0 = diag_errors(d);
  ans_reference_build(&pl->ref, r, p);
  pauli_sum_init(&pl->pool.words, p->nqubits);
  pl->pool.nqubits = p->nqubits;
  pl->pool.nrules = r->nrules;
  pl->pool.rule_made = xcalloc((size_t)(r->nrules > 0 ? r->nrules : 1), sizeof *pl->pool.rule_made);

  ans_build b;
  memset(&b, 0, sizeof b);
  b.r = r;
  b.p = p;
  b.d = d;
  b.pl = pl;
  ans_screen scr;
  if (p->H) {
    ans_screen_init(&scr, p->H, &pl->ref);
    b.scr = &scr;
  }
  b.tally = xcalloc((size_t)(r->nrules > 0 ? r->nrules : 1), sizeof *b.tally);
  int nsym = p->taper ? p->taper->nsym : 0;
  for (int i = 0; i < r->nrules; i++) {
    b.tally[i].z2_drop = xcalloc((size_t)(nsym > 0 ? nsym : 1), sizeof(size_t));
    for (int s = 0; s < IR_SYM_COUNT; s++) b.tally[i].first_break[s] = -1;
    b.tally[i].dup_of = -1;
  }
  dd_rehash(&b, 64);
  pauli_sum_init(&b.word, p->nqubits);
  for (int s = 0; s < IR_SYM_COUNT; s++) b.type_all[s] = r->keep[s].policy == IR_KEEP_EXACTLY;

  ans_type_reference(&b);
  uint64_t planned = 0;
  for (int i = 0; i < r->nrules; i++) {
    b.rule = i;
    int col = 0;
    b.rule_line = 0;
    if (r->rules[i].span.file >= 0) diag_line_col(d, r->rules[i].span.file, r->rules[i].span.start, &b.rule_line, &col);
    ans_rule_fn fn = ans_rule_lookup(r->rules[i].kind);
    if (fn && pool_fits(&b, &r->rules[i], &planned)) fn(&b, &r->rules[i]);
    pl->pool.rule_made[i] = b.tally[i].made;
  }
  ans_rule_messages(&b);

  if (b.scr) {
    screen_pool(&pl->pool, b.scr, 0);
    pl->screened = 1;
  }
  ans_select(pl, r, diag_errors(d) > errors0 ? NULL : d); /* no empty-pool warning after a refused rule */

  if (b.scr) ans_screen_free(&scr);
  for (int i = 0; i < r->nrules; i++) {
    free(b.tally[i].z2_drop);
    free(b.tally[i].z2_text);
  }
  free(b.tally);
  free(b.dd.slot);
  pauli_sum_free(&b.word);
  return diag_errors(d) > errors0 ? -1 : 0;
}
