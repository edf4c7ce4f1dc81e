/* emit_int.h — private to src/lower/emit*.c: the writers of the gate forms.
 *
 * gate_write (emit.c) counts the circuit in a first streamed pass, then runs
 * the lowering again into an emitter sink that hands each gate and each
 * section mark to the format's functions (a small table, one per format).
 * Output goes through a 64 KiB buffer with hand-rolled integer formatting:
 * writing is the cost that matters for 10^8-gate circuits.
 *
 * Ownership: the emit_ctx lives on gate_write's stack and borrows everything.
 */
#ifndef CAIRN_EMIT_INT_H
#define CAIRN_EMIT_INT_H

#include "lower/gate_int.h"

#include <string.h>

typedef struct emit_ctx emit_ctx;

typedef struct emit_fmt {
  void (*header)(emit_ctx *e);
  void (*mark)(emit_ctx *e, const gate *g, long run);
  void (*gate)(emit_ctx *e, const gate *g);
  void (*footer)(emit_ctx *e);
} emit_fmt;

extern const emit_fmt emit_listing_fmt, emit_qasm2_fmt, emit_qasm3_fmt;

enum { EMIT_BUF = 1 << 16, EMIT_CACHE = 256 };

struct emit_ctx {
  gate_sink sink;
  const emit_fmt *fmt;
  const ans_circuit *c;
  const gate_opts *o;
  const gate_meta *meta;
  const gate_counts *k;
  const gate_counter *cnt; /* per-run counts and steps from the first pass */
  FILE *f;
  char buf[EMIT_BUF];
  size_t n;
  uint64_t bytes;
  int err;
  long run;           /* marks seen so far */
  int step;           /* Trotter step shown last (-1 none) */
  int qasm;           /* number spelling: 1 for OpenQASM literals */
  /* each qubit spelled once ("q12", or "q[12]" at OpenQASM 3.0 top level) */
  char *qtxt;
  uint32_t *qoff;
  uint8_t *qlen;
  /* spelled multipliers: a direct-mapped cache (output never depends on it) */
  double cache_key[2][EMIT_CACHE];     /* [0] multipliers, [1] fixed angles */
  char cache_txt[2][EMIT_CACHE][40];
  unsigned char cache_used[2][EMIT_CACHE];
};

void emit_flush(emit_ctx *e);
static inline void emit_ch(emit_ctx *e, char ch) {
  if (e->n == EMIT_BUF) emit_flush(e);
  e->buf[e->n++] = ch;
}
void emit_str(emit_ctx *e, const char *s);
/* The spelled name of qubit q, and of a gate (no length computations on the
 * path every gate takes). */
static inline void emit_qubit(emit_ctx *e, int q) {
  size_t n = e->qlen[q];
  if (e->n + n > EMIT_BUF) emit_flush(e);
  memcpy(e->buf + e->n, e->qtxt + e->qoff[q], n);
  e->n += n;
}
void emit_op(emit_ctx *e, int op);
void emit_mem_big(emit_ctx *e, const char *s, size_t n);
static inline void emit_mem(emit_ctx *e, const char *s, size_t n) {
  if (e->n + n > EMIT_BUF) {
    emit_mem_big(e, s, n);
    return;
  }
  memcpy(e->buf + e->n, s, n);
  e->n += n;
}
void emit_long(emit_ctx *e, long v);
void emit_printf(emit_ctx *e, const char *fmt, ...) __attribute__((format(printf, 2, 3)));
/* A number: shortest round-trip spelling; in OpenQASM mode a mantissa with
 * an exponent always has a decimal point ("1.0e-5"), as both grammars want. */
void emit_number(emit_ctx *e, double x);
/* The angle of a rotation: "pi/2", "-0.125*t3" (listing) / "-0.125*theta_3". */
void emit_angle(emit_ctx *e, const gate *g, const char *prefix);
/* Text made safe for a one-line comment (control characters become spaces). */
void emit_comment_text(emit_ctx *e, const char *s);
/* "double 0 1 -> 2 3 (rule 1, line 12): cx 12, single 20" for a run mark. */
void emit_section(emit_ctx *e, const gate *g, long run);
/* "chain ladder, passes, short excitations" */
void emit_lowering(emit_ctx *e);

#endif
