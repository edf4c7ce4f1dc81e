/* table.c — the generator table of `cairn show`, as text and as JSON
 * (DESIGN.md "JSON report"): the chosen generators in program order with
 * kind, text, gradient, symmetry signature, CNOT cost and origin line. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/json.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* ORDER ir_encoding */
static const char *const enc_names[] = {"jordan-wigner", "bravyi-kitaev", "parity"};
/* ORDER ir_reference_kind */
static const char *const ref_names[] = {"hartree-fock", "mean-field", "bits"};
/* ORDER ir_symmetry */
static const char *const sym_keys[IR_SYM_COUNT] = {"particles", "spin_z", "spin_squared"};

static const char *enc_name(ir_encoding e) { return (unsigned)e < 3 ? enc_names[e] : "?"; }
static const char *ref_name(ir_reference_kind k) { return (unsigned)k < 3 ? ref_names[k] : "?"; }

static const char *sig_mark(int v) {
  switch (v) {
  case ANS_SIG_KEEPS: return "yes";
  case ANS_SIG_BREAKS: return "no";
  case ANS_SIG_UNKNOWN: return "?";
  default: return "-";
  }
}

static char *choose_text(const ir_recipe *r) {
  const ir_choose *c = &r->choose;
  char b[32];
  switch (c->kind) {
  case IR_CHOOSE_COUNT: return xasprintf("choose %d by gradient", c->count);
  case IR_CHOOSE_ABOVE: return xasprintf("choose gradient above %s", util_fmt_double(b, c->threshold));
  case IR_CHOOSE_GROW: return xasprintf("grow to %d until %s", c->count, util_fmt_double(b, c->threshold));
  default: return xstrdup("choose all");
  }
}

static const char *order_text(const ir_recipe *r) {
  switch (r->order) {
  case IR_ORDER_GRADIENT: return "order by gradient";
  case IR_ORDER_RANK: return "order by rank";
  default: return "order as written";
  }
}

void ans_table_print(const ans_plan *pl, const ir_recipe *r, const ans_problem *p, const diag_ctx *d, FILE *out) {
  (void)d;
  const ans_pool *pool = &pl->pool;
  int tapered = p->taper && p->taper->nsym > 0;
  char *ct = choose_text(r);
  if (pl->grow)
    fprintf(out, "%s: a pool of %zu generator%s, ranked by |gradient| for `%s` (the run picks)\n",
            r->path ? r->path : "recipe", pool->len, pool->len == 1 ? "" : "s", ct);
  else
    fprintf(out, "%s: %zu generator%s chosen from a pool of %zu (%s, %s)\n", r->path ? r->path : "recipe",
            pl->norder, pl->norder == 1 ? "" : "s", pool->len, ct, order_text(r));
  free(ct);
  fprintf(out, "encoding %s, %d qubits", enc_name(r->encoding), p->nqubits);
  if (tapered) fprintf(out, " (%d removed by tapering)", p->taper->nsym);
  fprintf(out, "; reference %s", ref_name(pl->ref.kind));
  if (!isnan(pl->ref.energy)) fprintf(out, ", energy %.10f Eh", pl->ref.energy);
  if (pl->ref.kind == IR_REF_MEAN_FIELD) fprintf(out, ", %d qubit%s tilted", pl->ref.tilted, pl->ref.tilted == 1 ? "" : "s");
  fputc('\n', out);
  if (pl->screened)
    fprintf(out, "gradient = dE/dtheta at the reference (exact, noise-free, for the active-space Hamiltonian)\n");
  if (r->scan.active && r->npoints > 1)
    fprintf(out, "scan point 1 of %d (%s = %g)\n", r->npoints, r->scan.name ? r->scan.name : "?", r->points[0].param);
  size_t tw = 9;
  for (size_t i = 0; i < pl->norder; i++) {
    size_t l = strlen(pool->gen[pl->order[i]].info.text);
    if (l > tw) tw = l;
  }
  if (tw > 60) tw = 60;
  fprintf(out, "%5s  %-12s  %-*s  %16s  %-3s %-3s %-3s%s %5s %5s\n", "index", "kind", (int)tw, "generator", "gradient",
          "N", "Sz", "S2", tapered ? " Z2 " : "", "cnot", "line");
  for (size_t i = 0; i < pl->norder; i++) {
    const ans_gen *g = &pool->gen[pl->order[i]];
    char gb[40];
    if (isnan(g->gradient)) snprintf(gb, sizeof gb, "-");
    else snprintf(gb, sizeof gb, "%.10f", fabs(g->gradient) < 5e-11 ? 0.0 : g->gradient); /* no "-0.0000000000" */
    fprintf(out, "%5zu  %-12s  %-*s  %16s  %-3s %-3s %-3s%s%s %5d %5d\n", i, ans_kind_name(g->info.kind), (int)tw,
            g->info.text, gb, sig_mark(g->sig.sym[0]), sig_mark(g->sig.sym[1]), sig_mark(g->sig.sym[2]),
            tapered ? " " : "", tapered ? sig_mark(g->sig.z2) : "", g->cnot, g->info.line);
  }
  if (pl->ref.kind == IR_REF_MEAN_FIELD)
    fprintf(out, "note: the mean-field reference breaks particle number and spin; its angles are optimized again with "
                 "the amplitudes during `run`\n");
}

static void add_bool_or_absent(cJSON *o, const char *k, int v) {
  if (v == ANS_SIG_KEEPS || v == ANS_SIG_BREAKS) cJSON_AddBoolToObject(o, k, v == ANS_SIG_KEEPS);
}

cJSON *ans_table_json(const ans_plan *pl, const ir_recipe *r, const ans_problem *p, const diag_ctx *d) {
  const ans_pool *pool = &pl->pool;
  int tapered = p->taper && p->taper->nsym > 0;
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "encoding", enc_name(r->encoding));
  cJSON_AddNumberToObject(o, "qubits", p->nqubits);
  cJSON_AddNumberToObject(o, "removed", tapered ? p->taper->nsym : 0);
  cJSON *ref = cJSON_CreateObject();
  cJSON_AddStringToObject(ref, "kind", ref_name(pl->ref.kind));
  char *bits = xmalloc((size_t)pl->ref.nqubits + 1);
  for (int q = 0; q < pl->ref.nqubits; q++) bits[q] = pauli_get_x(pl->ref.bits, q) ? '1' : '0';
  bits[pl->ref.nqubits] = 0;
  cJSON_AddStringToObject(ref, "bits", bits);
  free(bits);
  if (!isnan(pl->ref.energy)) cJSON_AddItemToObject(ref, "energy", json_number(pl->ref.energy));
  if (pl->ref.theta) {
    cJSON *th = cJSON_CreateArray(), *ph = cJSON_CreateArray();
    for (int q = 0; q < pl->ref.nqubits; q++) {
      cJSON_AddItemToArray(th, json_number(pl->ref.theta[q]));
      cJSON_AddItemToArray(ph, json_number(pl->ref.phi[q]));
    }
    cJSON_AddItemToObject(ref, "theta", th);
    cJSON_AddItemToObject(ref, "phi", ph);
  }
  cJSON_AddItemToObject(o, "reference", ref);
  cJSON_AddNumberToObject(o, "pool", (double)pool->len);
  if (pl->grow) cJSON_AddBoolToObject(o, "grow", 1);
  cJSON *gens = cJSON_CreateArray();
  for (size_t i = 0; i < pl->norder; i++) {
    const ans_gen *g = &pool->gen[pl->order[i]];
    cJSON *e = cJSON_CreateObject();
    cJSON_AddNumberToObject(e, "index", (double)i);
    cJSON_AddStringToObject(e, "kind", ans_kind_name(g->info.kind));
    cJSON_AddStringToObject(e, "text", g->info.text);
    if (!isnan(g->gradient)) cJSON_AddItemToObject(e, "gradient", json_number(g->gradient));
    cJSON *sym = cJSON_CreateObject();
    for (int s = 0; s < IR_SYM_COUNT; s++) add_bool_or_absent(sym, sym_keys[s], g->sig.sym[s]);
    if (tapered) cJSON_AddBoolToObject(sym, "z2", g->sig.z2 == ANS_SIG_KEEPS);
    cJSON_AddItemToObject(e, "symmetry", sym);
    cJSON_AddNumberToObject(e, "cnot", g->cnot);
    cJSON_AddNumberToObject(e, "rank", g->rank);
    cJSON_AddNumberToObject(e, "line", g->info.line);
    if (d && g->span.file >= 0 && r->path && strcmp(diag_file_path(d, g->span.file), r->path) != 0)
      cJSON_AddStringToObject(e, "file", diag_file_path(d, g->span.file));
    if (g->info.nexc > 0) {
      cJSON *f = cJSON_CreateArray(), *t = cJSON_CreateArray();
      for (int k = 0; k < g->info.nexc; k++) {
        cJSON_AddItemToArray(f, cJSON_CreateNumber(g->info.from[k]));
        cJSON_AddItemToArray(t, cJSON_CreateNumber(g->info.to[k]));
      }
      cJSON_AddItemToObject(e, "from", f);
      cJSON_AddItemToObject(e, "to", t);
      if (g->info.spin_adapted) cJSON_AddBoolToObject(e, "spin_adapted", 1);
    }
    cJSON *w = cJSON_CreateArray();
    for (size_t t = g->off; t < g->off + g->len; t++) {
      cJSON *term = cJSON_CreateObject();
      char *s = pauli_word_str(pool->words.n, pauli_sum_x(&pool->words, t), pauli_sum_z(&pool->words, t));
      cJSON_AddStringToObject(term, "pauli", s);
      free(s);
      cJSON_AddItemToObject(term, "coeff", json_number(creal(pool->words.c[t])));
      cJSON_AddItemToArray(w, term);
    }
    cJSON_AddItemToObject(e, "words", w);
    cJSON_AddItemToArray(gens, e);
  }
  cJSON_AddItemToObject(o, "generators", gens);
  return o;
}
