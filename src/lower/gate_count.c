/* gate_count.c — gate counts and depth of a gate stream. */
#include "config.h"

#include "lower/gate_int.h"

#include "cairn/json.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

void gate_counts_init(gate_counts *k, int ngens) {
  memset(k, 0, sizeof *k);
  k->ngens = ngens;
  k->gen_cx = xcalloc((size_t)(ngens > 0 ? ngens : 1), sizeof *k->gen_cx);
  k->gen_single = xcalloc((size_t)(ngens > 0 ? ngens : 1), sizeof *k->gen_single);
}

void gate_counts_free(gate_counts *k) {
  free(k->gen_cx);
  free(k->gen_single);
  memset(k, 0, sizeof *k);
}

/* Depth by as-soon-as-possible layers: a gate sits one layer above the
 * highest gate on its qubits. */
static void counter_put(gate_sink *s, const gate *g, size_t n) {
  gate_counter *c = (gate_counter *)s;
  gate_counts *k = c->k;
  for (size_t i = 0; i < n; i++) {
    const gate *x = &g[i];
    if (x->op == GATE_MARK) {
      if (c->nruns == c->capruns) {
        c->capruns = c->capruns ? 2 * c->capruns : 64;
        c->run_cx = xrealloc(c->run_cx, c->capruns * sizeof *c->run_cx);
        c->run_single = xrealloc(c->run_single, c->capruns * sizeof *c->run_single);
      }
      c->run_cx[c->nruns] = c->run_single[c->nruns] = 0;
      c->nruns++;
      if (x->step > c->maxstep) c->maxstep = x->step;
      continue;
    }
    int gen = x->gen;
    if (x->op == GATE_CX) {
      long l = c->level[x->q0] > c->level[x->q1] ? c->level[x->q0] : c->level[x->q1];
      c->level[x->q0] = c->level[x->q1] = ++l;
      if (l > k->depth) k->depth = l;
      long m = c->cxlevel[x->q0] > c->cxlevel[x->q1] ? c->cxlevel[x->q0] : c->cxlevel[x->q1];
      c->cxlevel[x->q0] = c->cxlevel[x->q1] = ++m;
      if (m > k->cx_depth) k->cx_depth = m;
      k->cx++;
      if (gen >= 0 && gen < k->ngens) k->gen_cx[gen]++;
      if (c->nruns) c->run_cx[c->nruns - 1]++;
    } else {
      long l = ++c->level[x->q0];
      if (l > k->depth) k->depth = l;
      k->single++;
      if (gen >= 0 && gen < k->ngens) k->gen_single[gen]++;
      else k->ref_single++;
      if (c->nruns) c->run_single[c->nruns - 1]++;
    }
    k->total++;
  }
}

static void counter_finish(gate_sink *s) { (void)s; }

void gate_counter_init(gate_counter *g, int nqubits, gate_counts *k) {
  memset(g, 0, sizeof *g);
  g->sink.put = counter_put;
  g->sink.finish = counter_finish;
  g->k = k;
  g->level = xcalloc((size_t)(nqubits > 0 ? nqubits : 1), sizeof *g->level);
  g->cxlevel = xcalloc((size_t)(nqubits > 0 ? nqubits : 1), sizeof *g->cxlevel);
}

void gate_counter_free(gate_counter *g) {
  free(g->level);
  free(g->cxlevel);
  free(g->run_cx);
  free(g->run_single);
  memset(g, 0, sizeof *g);
}

void gate_count_list(const gate_list *l, int ngens, gate_counts *out) {
  gate_counts_init(out, ngens);
  gate_counter c;
  gate_counter_init(&c, l->nqubits, out);
  c.sink.put(&c.sink, l->g, l->len);
  gate_counter_free(&c);
}

void gate_count_circuit(const ans_circuit *c, const gate_opts *o, gate_counts *out) {
  gate_counts_init(out, c->ngens);
  gate_counter k;
  gate_counter_init(&k, c->nqubits, out);
  gate_stream(c, o, &k.sink);
  gate_counter_free(&k);
}

cJSON *gate_counts_json(const gate_counts *k) {
  cJSON *o = cJSON_CreateObject();
  cJSON_AddNumberToObject(o, "cnot", (double)k->cx);
  cJSON_AddNumberToObject(o, "single", (double)k->single);
  cJSON_AddNumberToObject(o, "total", (double)k->total);
  cJSON_AddNumberToObject(o, "depth", (double)k->depth);
  cJSON_AddNumberToObject(o, "cnot_depth", (double)k->cx_depth);
  return o;
}
