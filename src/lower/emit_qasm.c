/* emit_qasm.c — OpenQASM 2.0 (Cross et al., arXiv:1707.03429, 2017) and
 * OpenQASM 3.0 (Cross et al., ACM Trans. Quantum Comput. 3, 12, 2022).
 *
 * 2.0 has no free parameters at top level, so the ansatz is a parametrized
 * gate `cairn_ansatz(theta_0, ...)` over the register's qubits, followed by one
 * call that binds the parameters: the values of --bind, or zeros with a
 * comment saying so.  Only qelib1.inc gates appear in the body.
 *
 * 3.0 declares each parameter as `input float[64] theta_k;` (or, when bound,
 * `const float[64] theta_k = value;`) and writes the gates at top level on
 * `qubit[n] q;`, using stdgates.inc gates. */
#include "config.h"

#include "lower/emit_int.h"

static void comments(emit_ctx *e, const char *lead) {
  const gate_counts *k = e->k;
  emit_printf(e, "%s cairn %s gate circuit", lead, PACKAGE_VERSION);
  if (e->meta->source) {
    emit_str(e, " of ");
    emit_comment_text(e, e->meta->source);
  }
  emit_ch(e, '\n');
  emit_printf(e, "%s qubits %d, parameters %d; cx %ld, single %ld, total %ld, depth %ld, cx depth %ld\n", lead,
              e->c->nqubits, e->c->nparams, k->cx, k->single, k->total, k->depth, k->cx_depth);
  emit_printf(e, "%s lowering: ", lead);
  emit_lowering(e);
  emit_ch(e, '\n');
  if (e->cnt->maxstep > 0) emit_printf(e, "%s trotter steps: %d\n", lead, e->cnt->maxstep + 1);
}

static void mark(emit_ctx *e, const gate *g, long run, const char *indent) {
  if (g->gen >= 0 && e->cnt->maxstep > 0 && g->step > e->step) {
    e->step = g->step;
    emit_printf(e, "%s// trotter step %d of %d\n", indent, g->step + 1, e->cnt->maxstep + 1);
  }
  emit_str(e, indent);
  emit_str(e, "// ");
  emit_section(e, g, run);
  emit_ch(e, '\n');
}

/* --- OpenQASM 2.0 --- */

static void header2(emit_ctx *e) {
  emit_str(e, "OPENQASM 2.0;\ninclude \"qelib1.inc\";\n");
  comments(e, "//");
  emit_str(e, "// the circuit is the gate cairn_ansatz; the call at the end binds its parameters\n");
  emit_str(e, "gate cairn_ansatz");
  if (e->c->nparams) {
    emit_ch(e, '(');
    for (int p = 0; p < e->c->nparams; p++) {
      if (p) emit_ch(e, ',');
      emit_str(e, "theta_");
      emit_long(e, p);
    }
    emit_ch(e, ')');
  }
  for (int q = 0; q < e->c->nqubits; q++) {
    emit_str(e, q ? ",q" : " q");
    emit_long(e, q);
  }
  emit_str(e, "\n{\n");
}

static void mark2(emit_ctx *e, const gate *g, long run) { mark(e, g, run, "  "); }

/* One gate statement of either version: `op(angle) q[a]` or `cx q[a]<sep>q[b]`,
 * after `indent` (inside OpenQASM 2.0's gate body) and ending the line. */
static inline void qasm_gate(emit_ctx *e, const gate *g, const char *indent, size_t nindent, const char *sep,
                             size_t nsep) {
  emit_mem(e, indent, nindent);
  emit_op(e, g->op);
  if (gate_is_rotation(g->op)) {
    emit_ch(e, '(');
    emit_angle(e, g, "theta_");
    emit_ch(e, ')');
  }
  emit_ch(e, ' ');
  emit_qubit(e, g->q0);
  if (g->op == GATE_CX) {
    emit_mem(e, sep, nsep);
    emit_qubit(e, g->q1);
  }
  emit_mem(e, ";\n", 2);
}

static void gate2(emit_ctx *e, const gate *g) { qasm_gate(e, g, "  ", 2, ",", 1); }

static void footer2(emit_ctx *e) {
  emit_str(e, "}\n");
  emit_printf(e, "qreg q[%d];\n", e->c->nqubits);
  if (e->c->nparams && !e->meta->values)
    emit_str(e, "// parameters not bound: zeros (cairn build --bind REPORT binds them)\n");
  else if (e->c->nparams && e->meta->bound_from) {
    emit_str(e, "// parameters bound from ");
    emit_comment_text(e, e->meta->bound_from);
    emit_ch(e, '\n');
  }
  emit_str(e, "cairn_ansatz");
  if (e->c->nparams) {
    emit_ch(e, '(');
    for (int p = 0; p < e->c->nparams; p++) {
      if (p) emit_ch(e, ',');
      emit_number(e, e->meta->values ? e->meta->values[p] : 0.0);
    }
    emit_ch(e, ')');
  }
  for (int q = 0; q < e->c->nqubits; q++) {
    emit_str(e, q ? ",q[" : " q[");
    emit_long(e, q);
    emit_ch(e, ']');
  }
  emit_str(e, ";\n");
}

const emit_fmt emit_qasm2_fmt = {header2, mark2, gate2, footer2};

/* --- OpenQASM 3.0 --- */

static void header3(emit_ctx *e) {
  emit_str(e, "OPENQASM 3.0;\ninclude \"stdgates.inc\";\n");
  comments(e, "//");
  if (e->meta->values && e->meta->bound_from) {
    emit_str(e, "// parameters bound from ");
    emit_comment_text(e, e->meta->bound_from);
    emit_ch(e, '\n');
  }
  for (int p = 0; p < e->c->nparams; p++) {
    if (e->meta->values) {
      emit_str(e, "const float[64] theta_");
      emit_long(e, p);
      emit_str(e, " = ");
      emit_number(e, e->meta->values[p]);
      emit_str(e, ";\n");
    } else {
      emit_str(e, "input float[64] theta_");
      emit_long(e, p);
      emit_str(e, ";\n");
    }
  }
  emit_printf(e, "qubit[%d] q;\n", e->c->nqubits);
}

static void mark3(emit_ctx *e, const gate *g, long run) { mark(e, g, run, ""); }

static void gate3(emit_ctx *e, const gate *g) { qasm_gate(e, g, "", 0, ", ", 2); }

static void footer3(emit_ctx *e) { (void)e; }

const emit_fmt emit_qasm3_fmt = {header3, mark3, gate3, footer3};
