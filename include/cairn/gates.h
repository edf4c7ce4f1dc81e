/* gates.h — lowering a rotation program (ansatz.h) to gates, the passes that
 * shrink the circuit, gate counts, and the written forms: cairn's gate listing,
 * OpenQASM 2.0 (Cross et al., arXiv:1707.03429, 2017) and OpenQASM 3.0 (Cross
 * et al., ACM Trans. Quantum Comput. 3, 12, 2022).
 *
 * Gate set: x h s sdg rx ry rz cx.  Counts are real cx counts: nothing is
 * hidden in a composite gate.
 *
 * Lowering of one rotation exp(-i phi P / 2), P a Pauli word of weight w:
 *   w = 0      nothing (a global phase);
 *   w = 1      rx / ry / rz (phi) on the qubit;
 *   w >= 2     basis changes (X: h before and after; Y: rx(pi/2) before and
 *              rx(-pi/2) after, which maps Y to Z), a cx ladder that gathers
 *              the parity on the last qubit of the chain (or a balanced tree of
 *              cx, for lower depth), rz(phi) there, the ladder undone, the
 *              basis changes undone.  2(w - 1) cx either way (common practice).
 * The init basis state becomes x gates.  Trotter steps are already expanded in
 * the program; the listing marks each step.
 *
 * Angles stay symbolic: a rotation gate's angle is mult * theta[param], or the
 * fixed angle mult when param < 0.  Values are bound only when written.
 *
 * Passes (gate_opts.passes):
 *   - the mutually commuting words of one generator are ordered so that
 *     neighbours differ on few qubits, and every word's cx chain visits the
 *     generator's qubits in one order, steadiest letters first, so that
 *     consecutive words share the start of their ladders and their basis
 *     changes;
 *   - cancellation and merging across the whole circuit, commutation-aware:
 *     a new gate walks back over the gates on its qubits that commute with it
 *     (gates on other qubits always do; rz/s/sdg commute with a cx control,
 *     rx/x with a cx target, cx's sharing only a control or only a target
 *     commute) and cancels an inverse (cx cx, h h, x x, s sdg) or merges into
 *     a rotation about the same axis with the same parameter (or both fixed);
 *     rotations that become zero disappear.  The walk looks back over at most
 *     GATE_PASS_WINDOW gates of the circuit, so that huge circuits stream
 *     through in bounded memory; below that size it is the whole circuit.
 * Passes only remove or merge gates, never add: an optimized circuit never has
 * more gates than the plain one.
 *
 * Short excitation circuits (gate_opts.shortexc), after Yordanov,
 * Arvidsson-Shukur, Barnes, Phys. Rev. A 102, 062612 (2020): a generator whose
 * words share one Z string S and one X/Y support T is lowered as a whole:
 *   |T| = 2, two words (single excitations): local Cliffords map the words to
 *     XX and ZZ, which cost 2 cx (+ 2|S| + 2 for the parity of S);
 *   |T| = 4 and the generator a Givens rotation between two basis states of T
 *     (double excitations): a cx network (3 + 3) that makes the two states
 *     differ on one qubit, and a rotation there controlled by the other three
 *     (8 cx, Gray-code order): 14 cx (+ 2|S| for the parity of S).
 * Other generators, and any whose short circuit would need more cx, get the
 * plain lowering.
 *
 * Ownership: a gate_list owns its array (gate_list_free); gate_counts owns its
 * per-generator arrays (gate_counts_free); gate_diff owns its index arrays
 * (gate_diff_free).  No function keeps a pointer to its arguments.
 */
#ifndef CAIRN_GATES_H
#define CAIRN_GATES_H

#include "cairn/ansatz.h"

#include <cjson/cJSON.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>

/* ORDER gate_op: gate_op_name and the emitters' tables follow it. */
typedef enum gate_op {
  GATE_X,
  GATE_H,
  GATE_S,
  GATE_SDG,
  GATE_RX,
  GATE_RY,
  GATE_RZ,
  GATE_CX,
  GATE_MARK, /* not a gate: a section starts (generator gen, Trotter step step;
              * param 1 when it is lowered as a short excitation circuit) */
  GATE_NOPS
} gate_op;

const char *gate_op_name(gate_op op); /* "x", "h", ..., "cx", "mark" */
static inline int gate_is_rotation(int op) { return op == GATE_RX || op == GATE_RY || op == GATE_RZ; }

typedef struct gate {
  double mult;    /* rotation angle mult * theta[param]; the angle itself when param < 0 */
  int32_t q0;     /* the qubit; cx: control (-1 for a mark) */
  int32_t q1;     /* cx: target; else -1 */
  int32_t param;  /* rotations: parameter index, or -1 (fixed angle) */
  int32_t gen;    /* generator the gate lowers (-1: reference preparation) */
  int32_t step;   /* Trotter step of that generator, 0-based */
  uint8_t op;     /* gate_op */
} gate;

/* Gates in circuit order (marks included). */
typedef struct gate_list {
  int nqubits;
  gate *g;
  size_t len, cap;
} gate_list;

void gate_list_init(gate_list *l, int nqubits);
void gate_list_free(gate_list *l);
void gate_list_push(gate_list *l, const gate *g);

typedef enum gate_ladder { GATE_LADDER_CHAIN, GATE_LADDER_TREE } gate_ladder;

typedef struct gate_opts {
  gate_ladder ladder;
  int passes;    /* 1: word grouping and cancellation passes (default) */
  int shortexc;  /* 1: short excitation circuits where a generator has their form */
} gate_opts;

/* Gates the cancellation pass may look back over. */
enum { GATE_PASS_WINDOW = 1 << 18 };

/* chain ladder, passes on, no short circuits */
void gate_opts_default(gate_opts *o);

/* Lower the whole program into out (initialized here; marks included). */
void gate_lower(const ans_circuit *c, const gate_opts *o, gate_list *out);
/* Run the cancellation pass over a list in place (one pass; the same pass
 * gate_lower applies with o->passes). */
void gate_optimize(gate_list *l);

typedef struct gate_counts {
  long cx, single, total;  /* total = cx + single */
  long depth;              /* circuit depth over all gates (ASAP layers) */
  long cx_depth;           /* depth counting only cx */
  int ngens;
  long *gen_cx;            /* per generator (ngens); gates of the reference not included */
  long *gen_single;
  long ref_single;         /* gates of the reference preparation */
} gate_counts;

/* Counts of a lowered list. out is initialized here. */
void gate_count_list(const gate_list *l, int ngens, gate_counts *out);
/* Counts of the program lowered with o, streamed (bounded memory). */
void gate_count_circuit(const ans_circuit *c, const gate_opts *o, gate_counts *out);
void gate_counts_free(gate_counts *k);
/* {"cnot": .., "single": .., "total": .., "depth": .., "cnot_depth": ..}
 * (the "gates" object of the run report). */
cJSON *gate_counts_json(const gate_counts *k);

/* CNOTs of the plain chain lowering, sum of 2(w - 1) over the rotations of
 * generator gen (gen == -2: all rotations). */
long gate_plain_cx(const ans_circuit *c, int gen);

typedef enum gate_format { GATE_FMT_LISTING, GATE_FMT_QASM2, GATE_FMT_QASM3 } gate_format;
/* "listing", "qasm2", "qasm3"; returns 0 or -1. */
int gate_format_parse(const char *s, gate_format *f);
const char *gate_format_name(gate_format f);

/* What the written forms say beside the gates. */
typedef struct gate_meta {
  const char *source;    /* recipe or program path for the header, or NULL */
  const double *values;  /* nparams bound values, or NULL (symbolic) */
  const char *bound_from;/* where the values came from (report path), or NULL */
} gate_meta;

/* Lower c with o and write it in format fmt to f.  Two streamed passes (the
 * counts for the header, then the gates), so memory stays bounded for any
 * program size.  Fills *counts (when non-NULL; initialized here) and *bytes.
 * Returns 0, or -1 when writing failed (errno set). */
int gate_write(FILE *f, gate_format fmt, const ans_circuit *c, const gate_opts *o, const gate_meta *meta,
               gate_counts *counts, uint64_t *bytes);

/* Read the parameter values of a `cairn run --json` report for program c:
 * points[point]."parameters" (every parameter of the program in order,
 * reference angles first) when present, else points[point].generators[i].theta
 * for generator i (one parameter per generator, no reference angles).  The
 * generators' kind and text must match c's.  Returns a malloc'd array of
 * c->nparams values, or NULL with a message naming the field in err. */
double *gate_bind_report(const cJSON *report, const ans_circuit *c, int point, char *err, size_t errlen);

/* The lowered difference of two programs: generators (identified by kind and
 * text) added, removed and moved (not in the longest in-order common part),
 * and the change in counts. */
typedef struct gate_diff {
  int *added;      /* generator indices in b */
  int nadded;
  int *removed;    /* generator indices in a */
  int nremoved;
  int *moved;      /* generator indices in b */
  int nmoved;
  gate_counts ka, kb;
} gate_diff;

void gate_diff_programs(const ans_circuit *a, const ans_circuit *b, const gate_opts *o, gate_diff *out);
/* Text for `cairn diff`: one line per change, then the count changes. Returns
 * 1 when the lowered forms differ, 0 when they are the same. */
int gate_diff_print(FILE *f, const gate_diff *d, const ans_circuit *a, const ans_circuit *b);
cJSON *gate_diff_json(const gate_diff *d, const ans_circuit *a, const ans_circuit *b);
void gate_diff_free(gate_diff *d);

#endif
