/* gate_lower.c — rotation program to gates: reference preparation, Pauli
 * exponentials (cx chain or tree), word grouping within a generator. */
#include "config.h"

#include "lower/gate_int.h"

#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* ORDER gate_op */
const char *gate_op_name(gate_op op) {
  static const char *const names[] = {"x", "h", "s", "sdg", "rx", "ry", "rz", "cx", "mark"};
  return (unsigned)op < sizeof names / sizeof names[0] ? names[op] : "?";
}

void gate_opts_default(gate_opts *o) {
  o->ladder = GATE_LADDER_CHAIN;
  o->passes = 1;
  o->shortexc = 0;
}

void gate_list_init(gate_list *l, int nqubits) {
  memset(l, 0, sizeof *l);
  l->nqubits = nqubits;
}

void gate_list_free(gate_list *l) {
  free(l->g);
  memset(l, 0, sizeof *l);
}

void gate_list_push(gate_list *l, const gate *g) {
  UTIL_GROW(l->g, l->cap, l->len + 1);
  l->g[l->len++] = *g;
}

static void list_put(gate_sink *s, const gate *g, size_t n) {
  gate_list *l = ((gate_list_sink *)s)->l;
  UTIL_GROW(l->g, l->cap, l->len + n);
  memcpy(l->g + l->len, g, n * sizeof *g);
  l->len += n;
}

static void list_finish(gate_sink *s) { (void)s; }

void gate_list_sink_init(gate_list_sink *s, gate_list *l) {
  s->sink.put = list_put;
  s->sink.finish = list_finish;
  s->l = l;
}

static void lw_flush(gate_lw *w) {
  if (w->nbuf) w->out->put(w->out, w->buf, w->nbuf);
  w->nbuf = 0;
}

void gate_lw_emit(gate_lw *w, int op, int q0, int q1, int32_t param, double mult) {
  if (w->nbuf == sizeof w->buf / sizeof w->buf[0]) lw_flush(w);
  gate *g = &w->buf[w->nbuf++];
  g->op = (uint8_t)op;
  g->q0 = q0;
  g->q1 = q1;
  g->param = param;
  g->mult = mult;
  g->gen = w->gen;
  g->step = w->step;
}

void gate_lw_ladder(gate_lw *w, const int *q, int n, int undo) {
  int m = 0;
  if (w->o->ladder == GATE_LADDER_TREE) {
    /* Balanced tree: pair neighbours level by level; the right one of a pair
     * carries the parity on, an odd one out waits a level.  The last qubit
     * of q ends up holding the parity, as with the chain. */
    int len = n, *lv = w->lv;
    memcpy(lv, q, (size_t)n * sizeof *lv);
    while (len > 1) {
      int k = 0;
      for (int i = 0; i < len; i += 2) {
        if (i + 1 < len) {
          w->cxa[m] = lv[i];
          w->cxb[m] = lv[i + 1];
          m++;
          lv[k++] = lv[i + 1];
        } else {
          lv[k++] = lv[i];
        }
      }
      len = k;
    }
  } else {
    for (int i = 0; i + 1 < n; i++) {
      w->cxa[m] = q[i];
      w->cxb[m] = q[i + 1];
      m++;
    }
  }
  if (undo)
    for (int i = m - 1; i >= 0; i--) gate_lw_emit(w, GATE_CX, w->cxa[i], w->cxb[i], -1, 0);
  else
    for (int i = 0; i < m; i++) gate_lw_emit(w, GATE_CX, w->cxa[i], w->cxb[i], -1, 0);
}

/* The support of word t in chain order: `order` (n qubits, the generator's
 * preferred order) when given, else increasing qubits.  Fills w->sup and
 * w->let; returns the weight. */
static int word_support(gate_lw *w, size_t t, const int *order, int norder) {
  const pauli_sum *ws = &w->c->words;
  const uint64_t *x = pauli_sum_x(ws, t), *z = pauli_sum_z(ws, t);
  int k = 0;
  if (order) {
    for (int i = 0; i < norder; i++) {
      char L = pauli_letter(x, z, order[i]);
      if (L != 'I') {
        w->sup[k] = order[i];
        w->let[k++] = L;
      }
    }
    return k;
  }
  for (int j = 0; j < ws->nw; j++) {
    uint64_t m = x[j] | z[j];
    while (m) {
      int b = __builtin_ctzll(m);
      m &= m - 1;
      int q = j * 64 + b;
      w->sup[k] = q;
      w->let[k++] = pauli_letter(x, z, q);
    }
  }
  return k;
}

/* exp(-i phi P / 2) with phi = mult * theta[param] (or mult), P word t. */
static void lower_word(gate_lw *w, size_t t, int32_t param, double mult, const int *order, int norder) {
  int n = word_support(w, t, order, norder);
  if (n == 0) return; /* identity: a global phase */
  if (n == 1) {
    int op = w->let[0] == 'X' ? GATE_RX : w->let[0] == 'Y' ? GATE_RY : GATE_RZ;
    gate_lw_emit(w, op, w->sup[0], -1, param, mult);
    return;
  }
  for (int i = 0; i < n; i++) {
    if (w->let[i] == 'X') gate_lw_emit(w, GATE_H, w->sup[i], -1, -1, 0);
    else if (w->let[i] == 'Y') gate_lw_emit(w, GATE_RX, w->sup[i], -1, -1, M_PI / 2);
  }
  gate_lw_ladder(w, w->sup, n, 0);
  gate_lw_emit(w, GATE_RZ, w->sup[n - 1], -1, param, mult);
  gate_lw_ladder(w, w->sup, n, 1);
  for (int i = 0; i < n; i++) {
    if (w->let[i] == 'X') gate_lw_emit(w, GATE_H, w->sup[i], -1, -1, 0);
    else if (w->let[i] == 'Y') gate_lw_emit(w, GATE_RX, w->sup[i], -1, -1, -M_PI / 2);
  }
}

/* Qubits where two words have different letters. */
static int word_distance(const pauli_sum *ws, size_t a, size_t b) {
  int d = 0;
  for (int j = 0; j < ws->nw; j++)
    d += __builtin_popcountll((pauli_sum_x(ws, a)[j] ^ pauli_sum_x(ws, b)[j]) |
                              (pauli_sum_z(ws, a)[j] ^ pauli_sum_z(ws, b)[j]));
  return d;
}

enum { GROUP_MAX = 64 }; /* larger generators keep their written order */

typedef struct qrank {
  int q, changes, first;
} qrank;

static int qrank_cmp(const void *a, const void *b) {
  const qrank *x = a, *y = b;
  if (x->changes != y->changes) return x->changes < y->changes ? -1 : 1;
  if (x->first != y->first) return x->first < y->first ? -1 : 1;
  return (x->q > y->q) - (x->q < y->q);
}

/* Lower the k rotations of one generator run with the word grouping pass:
 * order the (pairwise commuting) words greedily so that each differs from
 * the previous on as few qubits as possible, then give every word one chain
 * order over the run's qubits, steadiest first (fewest letter changes along
 * the run), so that consecutive words share the start of their ladders and
 * the basis changes there cancel in the pass that follows. */
static void lower_grouped(gate_lw *w, const ans_rotation *rot, size_t k) {
  const pauli_sum *ws = &w->c->words;
  for (size_t i = 0; i < k; i++)
    for (size_t j = i + 1; j < k; j++)
      if (!pauli_word_commutes(ws->nw, pauli_sum_x(ws, (size_t)rot[i].word), pauli_sum_z(ws, (size_t)rot[i].word),
                               pauli_sum_x(ws, (size_t)rot[j].word), pauli_sum_z(ws, (size_t)rot[j].word))) {
        for (size_t r = 0; r < k; r++) lower_word(w, (size_t)rot[r].word, rot[r].param, rot[r].mult, NULL, 0);
        return;
      }
  size_t ord[GROUP_MAX];
  int used[GROUP_MAX] = {0};
  ord[0] = 0;
  used[0] = 1;
  for (size_t i = 1; i < k; i++) {
    size_t best = 0;
    int bd = -1;
    for (size_t j = 0; j < k; j++) {
      if (used[j]) continue;
      int d = word_distance(ws, (size_t)rot[ord[i - 1]].word, (size_t)rot[j].word);
      if (bd < 0 || d < bd) {
        bd = d;
        best = j;
      }
    }
    ord[i] = best;
    used[best] = 1;
  }
  /* Union support with letter changes along the order. */
  int n = w->c->nqubits, nq = 0;
  qrank *qr = xmalloc((size_t)(n > 0 ? n : 1) * sizeof *qr);
  int *slot = xmalloc((size_t)(n > 0 ? n : 1) * sizeof *slot);
  for (int q = 0; q < n; q++) slot[q] = -1;
  char *prev = xcalloc((size_t)(n > 0 ? n : 1), 1);
  for (size_t i = 0; i < k; i++) {
    size_t t = (size_t)rot[ord[i]].word;
    const uint64_t *x = pauli_sum_x(ws, t), *z = pauli_sum_z(ws, t);
    for (int j = 0; j < ws->nw; j++) {
      uint64_t m = x[j] | z[j];
      while (m) {
        int q = j * 64 + __builtin_ctzll(m);
        m &= m - 1;
        if (slot[q] < 0) {
          slot[q] = nq;
          qr[nq] = (qrank){q, 0, (int)i};
          nq++;
        }
      }
    }
    /* a qubit entering or leaving the support (letter I) changes too */
    for (int s = 0; s < nq; s++) {
      char L = pauli_letter(x, z, qr[s].q);
      if (i > 0 && L != prev[qr[s].q]) qr[s].changes++;
      prev[qr[s].q] = L;
    }
  }
  qsort(qr, (size_t)nq, sizeof *qr, qrank_cmp);
  int *order = xmalloc((size_t)(nq > 0 ? nq : 1) * sizeof *order);
  for (int s = 0; s < nq; s++) order[s] = qr[s].q;
  for (size_t i = 0; i < k; i++) {
    const ans_rotation *r = &rot[ord[i]];
    lower_word(w, (size_t)r->word, r->param, r->mult, order, nq);
  }
  free(order);
  free(prev);
  free(slot);
  free(qr);
}

/* Walk the program run by run (a run: consecutive rotations of one generator
 * and one parameter), with a mark in front of each, and lower each run. */
static void lower_all(gate_lw *w) {
  const ans_circuit *c = w->c;
  int *seen = xcalloc((size_t)(c->ngens > 0 ? c->ngens : 1), sizeof *seen);
  /* The reference: x gates for the init basis state. */
  int any_init = 0;
  for (int j = 0; j < pauli_nwords(c->nqubits); j++) any_init |= c->init[j] != 0;
  size_t r = 0;
  if (any_init || (c->nrot > 0 && c->rot[0].gen < 0)) {
    w->gen = -1;
    w->step = 0;
    gate_lw_emit(w, GATE_MARK, -1, -1, -1, 0);
    for (int q = 0; q < c->nqubits; q++)
      if (pauli_get_x(c->init, q)) gate_lw_emit(w, GATE_X, q, -1, -1, 0);
    while (r < c->nrot && c->rot[r].gen < 0) {
      lower_word(w, (size_t)c->rot[r].word, c->rot[r].param, c->rot[r].mult, NULL, 0);
      r++;
    }
  }
  while (r < c->nrot) {
    const ans_rotation *a = &c->rot[r];
    size_t e = r + 1;
    if (a->gen >= 0)
      while (e < c->nrot && c->rot[e].gen == a->gen && c->rot[e].param == a->param) e++;
    else
      while (e < c->nrot && c->rot[e].gen < 0) e++;
    w->gen = a->gen;
    w->step = a->gen >= 0 ? seen[a->gen]++ : 0;
    size_t k = e - r;
    int sh = a->gen >= 0 && w->o->shortexc && gate_short_run(w, a, k, 0);
    gate_lw_emit(w, GATE_MARK, -1, -1, sh ? 1 : -1, 0);
    if (sh) {
      gate_short_run(w, a, k, 1);
    } else if (a->gen >= 0 && w->o->passes && k >= 2 && k <= GROUP_MAX) {
      lower_grouped(w, a, k);
    } else {
      for (size_t i = r; i < e; i++) lower_word(w, (size_t)c->rot[i].word, c->rot[i].param, c->rot[i].mult, NULL, 0);
    }
    r = e;
  }
  free(seen);
}

void gate_stream(const ans_circuit *c, const gate_opts *o, gate_sink *out) {
  gate_lw w;
  memset(&w, 0, sizeof w);
  w.c = c;
  w.o = o;
  gate_pass *p = NULL;
  if (o->passes) {
    p = gate_pass_new(c->nqubits, out);
    w.out = gate_pass_sink(p);
  } else {
    w.out = out;
  }
  size_t n = (size_t)(c->nqubits > 0 ? c->nqubits : 1);
  w.sup = xmalloc(n * sizeof *w.sup);
  w.let = xmalloc(n);
  w.cxa = xmalloc(n * sizeof *w.cxa);
  w.cxb = xmalloc(n * sizeof *w.cxb);
  w.lv = xmalloc(n * sizeof *w.lv);
  lower_all(&w);
  lw_flush(&w);
  w.out->finish(w.out);
  if (p) gate_pass_free(p);
  free(w.sup);
  free(w.let);
  free(w.cxa);
  free(w.cxb);
  free(w.lv);
}

void gate_lower(const ans_circuit *c, const gate_opts *o, gate_list *out) {
  gate_list_init(out, c->nqubits);
  gate_list_sink s;
  gate_list_sink_init(&s, out);
  gate_stream(c, o, &s.sink);
}

long gate_plain_cx(const ans_circuit *c, int gen) {
  long n = 0;
  for (size_t r = 0; r < c->nrot; r++) {
    if (gen != -2 && c->rot[r].gen != gen) continue;
    size_t t = (size_t)c->rot[r].word;
    int wt = pauli_word_weight(c->words.nw, pauli_sum_x(&c->words, t), pauli_sum_z(&c->words, t));
    if (wt > 1) n += 2L * (wt - 1);
  }
  return n;
}
