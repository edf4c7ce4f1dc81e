/* emit_listing.c — cairn's gate listing (docs/listing.md): a header of
 * keyword lines, then one gate per line, a comment line per section, `end`.
 * Built to diff well: angles stay symbolic (t<k>), numbers have one spelling,
 * counts sit in the header where a review sees them first. */
#include "config.h"

#include "lower/emit_int.h"

static void header(emit_ctx *e) {
  const gate_counts *k = e->k;
  emit_str(e, "cairn gates 1\n");
  if (e->meta->source) {
    emit_str(e, "source ");
    emit_comment_text(e, e->meta->source);
    emit_ch(e, '\n');
  }
  emit_printf(e, "qubits %d\nparams %d\n", e->c->nqubits, e->c->nparams);
  emit_printf(e, "counts cx %ld single %ld total %ld depth %ld cx-depth %ld\n", k->cx, k->single, k->total,
              k->depth, k->cx_depth);
  emit_str(e, "lowering ");
  emit_lowering(e);
  emit_ch(e, '\n');
  if (e->cnt->maxstep > 0) emit_printf(e, "trotter %d\n", e->cnt->maxstep + 1);
  if (e->meta->values) {
    emit_str(e, "values bound");
    if (e->meta->bound_from) {
      emit_str(e, " from ");
      emit_comment_text(e, e->meta->bound_from);
    }
    emit_ch(e, '\n');
    for (int p = 0; p < e->c->nparams; p++) {
      emit_str(e, "value t");
      emit_long(e, p);
      emit_ch(e, ' ');
      emit_number(e, e->meta->values[p]);
      emit_ch(e, '\n');
    }
  } else {
    emit_str(e, "values symbolic\n");
  }
}

static void mark(emit_ctx *e, const gate *g, long run) {
  if (g->gen >= 0 && e->cnt->maxstep > 0 && g->step > e->step) {
    e->step = g->step;
    emit_printf(e, "# trotter step %d of %d\n", g->step + 1, e->cnt->maxstep + 1);
  }
  emit_str(e, "# ");
  emit_section(e, g, run);
  emit_ch(e, '\n');
}

static void put_gate(emit_ctx *e, const gate *g) {
  emit_op(e, g->op);
  emit_ch(e, ' ');
  emit_qubit(e, g->q0);
  if (g->op == GATE_CX) {
    emit_ch(e, ' ');
    emit_qubit(e, g->q1);
  } else if (gate_is_rotation(g->op)) {
    emit_ch(e, ' ');
    emit_angle(e, g, "t");
  }
  emit_ch(e, '\n');
}

static void footer(emit_ctx *e) { emit_str(e, "end\n"); }

const emit_fmt emit_listing_fmt = {header, mark, put_gate, footer};
