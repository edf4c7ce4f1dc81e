/* pass_cancel.c — commutation-aware cancellation and rotation merging, as a
 * streaming sink.
 *
 * Every gate that arrives walks back along the gates on its own qubits,
 * stepping over those it commutes with, looking for one it cancels with or
 * merges into.  Gates live in a ring of absolute indices with, per qubit, a
 * doubly linked list of the live gates on that qubit; a gate leaves the ring
 * (goes downstream) once GATE_PASS_WINDOW newer gates have arrived, or at the
 * end.  Nothing is ever moved: a gate that survives stays where it was
 * written, so generator sections stay contiguous.
 */
#include "config.h"

#include "lower/gate_int.h"

#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

enum { WALK_MAX = 64 }; /* gates a walk steps over on one qubit */

typedef struct node {
  gate g;
  int64_t prev[2], next[2]; /* neighbours on g.q0 and g.q1 (-1: none) */
  int alive;
} node;

struct gate_pass {
  gate_sink sink;
  gate_sink *down;
  node *ring;
  size_t cap;           /* power of two, grows up to GATE_PASS_WINDOW */
  int64_t base, head;   /* live range [base, head) of absolute indices */
  int64_t *last;        /* newest live gate on each qubit, -1 */
  int nqubits;
  gate out[512];
  size_t nout;
};

static node *at(gate_pass *p, int64_t i) { return &p->ring[(size_t)i & (p->cap - 1)]; }

static void out_flush(gate_pass *p) {
  if (p->nout) p->down->put(p->down, p->out, p->nout);
  p->nout = 0;
}

static void emit_down(gate_pass *p, const gate *g) {
  if (p->nout == sizeof p->out / sizeof p->out[0]) out_flush(p);
  p->out[p->nout++] = *g;
}

/* Slot (0 or 1) of qubit q in gate g. */
static int slot_of(const gate *g, int q) { return g->q0 == q ? 0 : 1; }

static void unlink_node(gate_pass *p, int64_t i) {
  node *n = at(p, i);
  int nq = n->g.op == GATE_CX ? 2 : n->g.op == GATE_MARK ? 0 : 1;
  for (int s = 0; s < nq; s++) {
    int q = s == 0 ? n->g.q0 : n->g.q1;
    int64_t pv = n->prev[s], nx = n->next[s];
    if (pv >= p->base) {
      node *a = at(p, pv);
      a->next[slot_of(&a->g, q)] = nx;
    }
    if (nx >= 0) {
      node *b = at(p, nx);
      b->prev[slot_of(&b->g, q)] = pv;
    } else {
      p->last[q] = pv >= p->base ? pv : -1;
    }
  }
  n->alive = 0;
}

static void grow(gate_pass *p) {
  size_t nc = p->cap * 2;
  node *r = xmalloc(nc * sizeof *r);
  for (int64_t i = p->base; i < p->head; i++) r[(size_t)i & (nc - 1)] = *at(p, i);
  free(p->ring);
  p->ring = r;
  p->cap = nc;
}

static void append(gate_pass *p, const gate *g) {
  if ((size_t)(p->head - p->base) == p->cap) {
    if (p->cap < GATE_PASS_WINDOW) {
      grow(p);
    } else {
      /* The oldest gate leaves the window; walks never reach it again. */
      node *o = at(p, p->base);
      if (o->alive) emit_down(p, &o->g);
      p->base++;
    }
  }
  int64_t i = p->head++;
  node *n = at(p, i);
  n->g = *g;
  n->alive = 1;
  n->prev[0] = n->prev[1] = n->next[0] = n->next[1] = -1;
  int nq = g->op == GATE_CX ? 2 : g->op == GATE_MARK ? 0 : 1;
  for (int s = 0; s < nq; s++) {
    int q = s == 0 ? g->q0 : g->q1;
    int64_t l = p->last[q];
    if (l >= p->base) {
      n->prev[s] = l;
      node *a = at(p, l);
      a->next[slot_of(&a->g, q)] = i;
    }
    p->last[q] = i;
  }
}

/* Axis class of a single-qubit gate: 'z' (rz, s, sdg), 'x' (rx, x), 'y' (ry),
 * 'h'. */
static char axis(int op) {
  switch (op) {
  case GATE_RZ:
  case GATE_S:
  case GATE_SDG:
    return 'z';
  case GATE_RX:
  case GATE_X:
    return 'x';
  case GATE_RY:
    return 'y';
  default:
    return 'h';
  }
}

/* A rotation that is the identity up to a global phase. */
static int is_zero_rotation(const gate *g) {
  if (!gate_is_rotation(g->op)) return 0;
  if (g->mult == 0) return 1;
  return g->param < 0 && isfinite(g->mult) && fmod(g->mult, 2 * M_PI) == 0;
}

static int inverse_pair(int a, int b) {
  return (a == GATE_H && b == GATE_H) || (a == GATE_X && b == GATE_X) || (a == GATE_S && b == GATE_SDG) ||
         (a == GATE_SDG && b == GATE_S);
}

/* A single-qubit gate g on q: cancel or merge with an earlier gate, or
 * append. */
static void put_single(gate_pass *p, const gate *g) {
  int q = g->q0;
  int64_t k = p->last[q];
  for (int steps = 0; k >= p->base && steps < WALK_MAX; steps++) {
    node *n = at(p, k);
    const gate *e = &n->g;
    int s = slot_of(e, q);
    if (e->op == GATE_CX) {
      int commute = s == 0 ? axis(g->op) == 'z' : axis(g->op) == 'x';
      if (!commute) break;
    } else {
      if (e->op == g->op && gate_is_rotation(g->op) && e->param == g->param) {
        n->g.mult += g->mult;
        if (is_zero_rotation(&n->g)) unlink_node(p, k);
        return;
      }
      if (inverse_pair(e->op, g->op)) {
        unlink_node(p, k);
        return;
      }
      char a = axis(e->op);
      if (a == 'h' || a != axis(g->op)) break;
    }
    k = n->prev[s];
  }
  append(p, g);
}

/* Walk back from the newest gate on qubit q, over gates that commute with a
 * cx(c, t) in which q plays the role of control (q == c) or target; return
 * the index of an equal cx met first, or -1. */
static int64_t find_cx(gate_pass *p, int q, int c, int t) {
  int64_t k = p->last[q];
  for (int steps = 0; k >= p->base && steps < WALK_MAX; steps++) {
    node *n = at(p, k);
    const gate *e = &n->g;
    if (e->op == GATE_CX) {
      if (e->q0 == c && e->q1 == t) return k;
      if (q == c ? e->q0 != c : e->q1 != t) return -1; /* roles clash */
    } else if (axis(e->op) != (q == c ? 'z' : 'x')) {
      return -1;
    }
    k = n->prev[slot_of(e, q)];
  }
  return -1;
}

static void pass_put(gate_sink *s, const gate *g, size_t n) {
  gate_pass *p = (gate_pass *)s;
  for (size_t i = 0; i < n; i++) {
    const gate *x = &g[i];
    if (x->op == GATE_MARK) {
      append(p, x);
    } else if (x->op == GATE_CX) {
      int64_t a = find_cx(p, x->q0, x->q0, x->q1);
      if (a >= 0 && find_cx(p, x->q1, x->q0, x->q1) == a) unlink_node(p, a);
      else append(p, x);
    } else if (is_zero_rotation(x)) {
      /* identity */
    } else {
      put_single(p, x);
    }
  }
}

static void pass_finish(gate_sink *s) {
  gate_pass *p = (gate_pass *)s;
  for (int64_t i = p->base; i < p->head; i++) {
    node *n = at(p, i);
    if (n->alive) emit_down(p, &n->g);
  }
  p->base = p->head;
  out_flush(p);
  p->down->finish(p->down);
}

gate_pass *gate_pass_new(int nqubits, gate_sink *down) {
  gate_pass *p = xcalloc(1, sizeof *p);
  p->sink.put = pass_put;
  p->sink.finish = pass_finish;
  p->down = down;
  p->cap = 4096;
  p->ring = xmalloc(p->cap * sizeof *p->ring);
  p->nqubits = nqubits;
  p->last = xmalloc((size_t)(nqubits > 0 ? nqubits : 1) * sizeof *p->last);
  for (int q = 0; q < nqubits; q++) p->last[q] = -1;
  return p;
}

gate_sink *gate_pass_sink(gate_pass *p) { return &p->sink; }

void gate_pass_free(gate_pass *p) {
  if (!p) return;
  free(p->ring);
  free(p->last);
  free(p);
}

void gate_optimize(gate_list *l) {
  gate_list out;
  gate_list_init(&out, l->nqubits);
  gate_list_sink s;
  gate_list_sink_init(&s, &out);
  gate_pass *p = gate_pass_new(l->nqubits, &s.sink);
  pass_put(&p->sink, l->g, l->len);
  pass_finish(&p->sink);
  gate_pass_free(p);
  gate_list_free(l);
  *l = out;
}
