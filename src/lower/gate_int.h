/* gate_int.h — private to src/lower/gate*.c, pass*.c, emit*.c: the gate stream.
 *
 * Lowering produces gates in circuit order into a sink; sinks are chained
 * (lowering -> cancellation pass -> counter or emitter), so a program of any
 * size streams through in bounded memory.  A sink receives batches; `finish`
 * is called once after the last batch.
 *
 * Ownership: each sink is owned by whoever created it (usually a stack
 * variable); a sink never frees its downstream.
 */
#ifndef CAIRN_GATE_INT_H
#define CAIRN_GATE_INT_H

#include "cairn/gates.h"

typedef struct gate_sink gate_sink;
struct gate_sink {
  void (*put)(gate_sink *s, const gate *g, size_t n);
  void (*finish)(gate_sink *s);
};

/* Lower c with o into out (through the cancellation pass when o->passes);
 * calls out->finish at the end. */
void gate_stream(const ans_circuit *c, const gate_opts *o, gate_sink *out);

/* --- lowering state shared by gate_lower.c and gate_short.c --- */
typedef struct gate_lw {
  const ans_circuit *c;
  const gate_opts *o;
  gate_sink *out;
  gate buf[512];        /* batch on its way to out */
  size_t nbuf;
  int32_t gen, step;    /* stamped on every gate */
  int *sup;             /* scratch: support of a word, nqubits */
  char *let;            /* scratch: letter of each qubit, nqubits */
  int *cxa, *cxb;       /* scratch: the forward ladder, nqubits */
  int *lv;              /* scratch: a level of the tree ladder, nqubits */
} gate_lw;

void gate_lw_emit(gate_lw *w, int op, int q0, int q1, int32_t param, double mult);
/* The cx ladder (chain or tree, per options) gathering the parity of qubits
 * q[0..n) onto q[n-1]; `undo` writes it in reverse. */
void gate_lw_ladder(gate_lw *w, const int *q, int n, int undo);

/* Whether rotations rot[0..k) of one generator (same parameter) have a short
 * excitation circuit with fewer cx than the plain lowering; with `write`,
 * also write it.  0: use the plain lowering (nothing written). */
int gate_short_run(gate_lw *w, const ans_rotation *rot, size_t k, int write);

/* --- the cancellation pass as a sink in front of `down` --- */
typedef struct gate_pass gate_pass;
gate_pass *gate_pass_new(int nqubits, gate_sink *down);
gate_sink *gate_pass_sink(gate_pass *p);
void gate_pass_free(gate_pass *p);

/* --- counting sink --- */
typedef struct gate_counter {
  gate_sink sink;
  gate_counts *k;
  long *level, *cxlevel;    /* per qubit */
  long *run_cx, *run_single;/* per mark (section), in stream order */
  size_t nruns, capruns;
  int maxstep;
} gate_counter;

/* k is initialized by the caller (gate_counts_init). */
void gate_counter_init(gate_counter *g, int nqubits, gate_counts *k);
void gate_counter_free(gate_counter *g);
void gate_counts_init(gate_counts *k, int ngens);

/* --- list sink --- */
typedef struct gate_list_sink {
  gate_sink sink;
  gate_list *l;
} gate_list_sink;
void gate_list_sink_init(gate_list_sink *s, gate_list *l);

/* Fixed angles that are k*pi/d (d in 1, 2, 4, 8; |k| < 64): writes "pi/2",
 * "-3*pi/4", ... into buf and returns 1; else 0. */
int gate_pi_spelling(char *buf, double a);

#endif
