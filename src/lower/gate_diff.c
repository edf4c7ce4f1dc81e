/* gate_diff.c — the difference of two lowered programs: which generators
 * came, went or moved, and what that did to the counts. */
#include "config.h"

#include "cairn/gates.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

/* Generators in program order (first rotation that uses them; generators
 * without rotations last, by index). Returns a malloc'd array of ngens. */
static int *program_order(const ans_circuit *c) {
  int n = c->ngens;
  int *ord = xmalloc((size_t)(n > 0 ? n : 1) * sizeof *ord);
  char *seen = xcalloc((size_t)(n > 0 ? n : 1), 1);
  int k = 0;
  for (size_t r = 0; r < c->nrot; r++) {
    int g = c->rot[r].gen;
    if (g >= 0 && g < n && !seen[g]) {
      seen[g] = 1;
      ord[k++] = g;
    }
  }
  for (int g = 0; g < n; g++)
    if (!seen[g]) ord[k++] = g;
  free(seen);
  return ord;
}

static int same_gen(const ans_gen_info *a, const ans_gen_info *b) {
  return a->kind == b->kind && strcmp(a->text ? a->text : "", b->text ? b->text : "") == 0;
}

typedef struct keyed {
  const ans_gen_info *g;
  int pos; /* position in program order */
} keyed;

static int keyed_cmp(const void *x, const void *y) {
  const keyed *a = x, *b = y;
  if (a->g->kind != b->g->kind) return a->g->kind < b->g->kind ? -1 : 1;
  int c = strcmp(a->g->text ? a->g->text : "", b->g->text ? b->g->text : "");
  if (c) return c;
  return (a->pos > b->pos) - (a->pos < b->pos);
}

void gate_diff_programs(const ans_circuit *a, const ans_circuit *b, const gate_opts *o, gate_diff *out) {
  memset(out, 0, sizeof *out);
  int na = a->ngens, nb = b->ngens;
  int *oa = program_order(a), *ob = program_order(b);
  /* Match equal generators (k-th occurrence to k-th occurrence) by sorting a's. */
  keyed *ka = xmalloc((size_t)(na > 0 ? na : 1) * sizeof *ka);
  for (int i = 0; i < na; i++) ka[i] = (keyed){&a->gens[oa[i]], i};
  qsort(ka, (size_t)na, sizeof *ka, keyed_cmp);
  char *used = xcalloc((size_t)(na > 0 ? na : 1), 1);
  int *match = xmalloc((size_t)(nb > 0 ? nb : 1) * sizeof *match); /* b position -> a position, -1 */
  for (int j = 0; j < nb; j++) {
    const ans_gen_info *g = &b->gens[ob[j]];
    int lo = 0, hi = na; /* first entry not less than g (any position) */
    while (lo < hi) {
      int mid = (lo + hi) / 2;
      keyed probe = {g, -1};
      if (keyed_cmp(&ka[mid], &probe) < 0) lo = mid + 1;
      else hi = mid;
    }
    match[j] = -1;
    for (int i = lo; i < na && same_gen(ka[i].g, g); i++)
      if (!used[i]) {
        used[i] = 1;
        match[j] = ka[i].pos;
        break;
      }
  }
  out->added = xmalloc((size_t)(nb > 0 ? nb : 1) * sizeof *out->added);
  out->removed = xmalloc((size_t)(na > 0 ? na : 1) * sizeof *out->removed);
  out->moved = xmalloc((size_t)(nb > 0 ? nb : 1) * sizeof *out->moved);
  for (int j = 0; j < nb; j++)
    if (match[j] < 0) out->added[out->nadded++] = ob[j];
  char *hit = xcalloc((size_t)(na > 0 ? na : 1), 1);
  for (int j = 0; j < nb; j++)
    if (match[j] >= 0) hit[match[j]] = 1;
  for (int i = 0; i < na; i++)
    if (!hit[i]) out->removed[out->nremoved++] = oa[i];
  /* Longest increasing run of a-positions in b order (patience sorting);
   * matched generators outside it moved. */
  int *seq = xmalloc((size_t)(nb > 0 ? nb : 1) * sizeof *seq), ns = 0;
  for (int j = 0; j < nb; j++)
    if (match[j] >= 0) seq[ns++] = j;
  int *tail = xmalloc((size_t)(ns > 0 ? ns : 1) * sizeof *tail);  /* index into seq */
  int *prevx = xmalloc((size_t)(ns > 0 ? ns : 1) * sizeof *prevx);
  int len = 0;
  for (int s = 0; s < ns; s++) {
    int v = match[seq[s]], lo = 0, hi = len;
    while (lo < hi) {
      int mid = (lo + hi) / 2;
      if (match[seq[tail[mid]]] < v) lo = mid + 1;
      else hi = mid;
    }
    prevx[s] = lo > 0 ? tail[lo - 1] : -1;
    tail[lo] = s;
    if (lo == len) len++;
  }
  char *inlis = xcalloc((size_t)(ns > 0 ? ns : 1), 1);
  for (int s = len > 0 ? tail[len - 1] : -1; s >= 0; s = prevx[s]) inlis[s] = 1;
  for (int s = 0; s < ns; s++)
    if (!inlis[s]) out->moved[out->nmoved++] = ob[seq[s]];
  free(inlis);
  free(prevx);
  free(tail);
  free(seq);
  free(hit);
  free(match);
  free(used);
  free(ka);
  free(oa);
  free(ob);
  gate_count_circuit(a, o, &out->ka);
  gate_count_circuit(b, o, &out->kb);
}

static void change(FILE *f, const char *what, long x, long y, int *first) {
  fprintf(f, "%s%s %ld -> %ld (%+ld)", *first ? "" : ", ", what, x, y, y - x);
  *first = 0;
}

int gate_diff_print(FILE *f, const gate_diff *d, const ans_circuit *a, const ans_circuit *b) {
  for (int i = 0; i < d->nadded; i++) {
    int g = d->added[i];
    fprintf(f, "gates: added g%d %s %s: cx %ld\n", g, ans_kind_name(b->gens[g].kind), b->gens[g].text,
            d->kb.gen_cx[g]);
  }
  for (int i = 0; i < d->nremoved; i++) {
    int g = d->removed[i];
    fprintf(f, "gates: removed g%d %s %s: cx %ld\n", g, ans_kind_name(a->gens[g].kind), a->gens[g].text,
            d->ka.gen_cx[g]);
  }
  for (int i = 0; i < d->nmoved; i++) {
    int g = d->moved[i];
    fprintf(f, "gates: moved g%d %s %s\n", g, ans_kind_name(b->gens[g].kind), b->gens[g].text);
  }
  int differs = d->nadded || d->nremoved || d->nmoved || d->ka.cx != d->kb.cx || d->ka.single != d->kb.single ||
                d->ka.depth != d->kb.depth;
  if (differs) {
    int first = 1;
    fprintf(f, "gates: ");
    change(f, "cx", d->ka.cx, d->kb.cx, &first);
    change(f, "single", d->ka.single, d->kb.single, &first);
    change(f, "depth", d->ka.depth, d->kb.depth, &first);
    change(f, "cx depth", d->ka.cx_depth, d->kb.cx_depth, &first);
    fputc('\n', f);
  }
  return differs;
}

static cJSON *gen_entry(const ans_circuit *c, const gate_counts *k, int g) {
  cJSON *e = cJSON_CreateObject();
  cJSON_AddNumberToObject(e, "index", g);
  cJSON_AddStringToObject(e, "kind", ans_kind_name(c->gens[g].kind));
  cJSON_AddStringToObject(e, "text", c->gens[g].text ? c->gens[g].text : "");
  cJSON_AddNumberToObject(e, "cnot", (double)k->gen_cx[g]);
  return e;
}

static cJSON *pair(long x, long y) {
  cJSON *o = cJSON_CreateObject();
  cJSON_AddNumberToObject(o, "a", (double)x);
  cJSON_AddNumberToObject(o, "b", (double)y);
  cJSON_AddNumberToObject(o, "change", (double)(y - x));
  return o;
}

cJSON *gate_diff_json(const gate_diff *d, const ans_circuit *a, const ans_circuit *b) {
  cJSON *o = cJSON_CreateObject();
  cJSON *add = cJSON_AddArrayToObject(o, "added");
  for (int i = 0; i < d->nadded; i++) cJSON_AddItemToArray(add, gen_entry(b, &d->kb, d->added[i]));
  cJSON *rem = cJSON_AddArrayToObject(o, "removed");
  for (int i = 0; i < d->nremoved; i++) cJSON_AddItemToArray(rem, gen_entry(a, &d->ka, d->removed[i]));
  cJSON *mov = cJSON_AddArrayToObject(o, "moved");
  for (int i = 0; i < d->nmoved; i++) cJSON_AddItemToArray(mov, gen_entry(b, &d->kb, d->moved[i]));
  cJSON_AddItemToObject(o, "cnot", pair(d->ka.cx, d->kb.cx));
  cJSON_AddItemToObject(o, "single", pair(d->ka.single, d->kb.single));
  cJSON_AddItemToObject(o, "depth", pair(d->ka.depth, d->kb.depth));
  cJSON_AddItemToObject(o, "cnot_depth", pair(d->ka.cx_depth, d->kb.cx_depth));
  return o;
}

void gate_diff_free(gate_diff *d) {
  free(d->added);
  free(d->removed);
  free(d->moved);
  gate_counts_free(&d->ka);
  gate_counts_free(&d->kb);
  memset(d, 0, sizeof *d);
}
