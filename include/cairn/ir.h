/* ir.h — the checked recipe: what a recipe means, with every unit resolved.
 *
 * Produced by the front end (front_load), read by every later stage.  Lengths
 * are in bohr, angles in radians.  Every item keeps the span of the text it came
 * from, so later stages report errors against the recipe.
 *
 * Index conventions (stated once, used everywhere):
 *   - molecular orbitals in recipes (`freeze 1 2`, `active orbitals 3..6`) are
 *     1-based, as in FCIDUMP files; in the IR they are stored 0-based;
 *   - spin orbitals, qubits and bits (`excite 0 1 -> 4 5`, `word X0 Y1`,
 *     `bits 1100`) are 0-based; spin orbital 2p is orbital p with spin up
 *     (alpha), 2p+1 the same orbital with spin down (beta); the leftmost
 *     character of a bit string is qubit 0.
 *
 * Ownership: an ir_recipe owns everything it points to; ir_recipe_free frees it.
 */
#ifndef CAIRN_IR_H
#define CAIRN_IR_H

#include "cairn/diag.h"

#include <stdint.h>

typedef struct ir_atom {
  int z;           /* atomic number */
  char symbol[4];  /* as written, normalized case ("He") */
  double xyz[3];   /* bohr */
  diag_span span;  /* the atom's line in the atoms block */
} ir_atom;

/* One geometry of a scan (or the only one). */
typedef struct ir_point {
  double param;    /* value of the scanned variable, in ir_scan.unit; 0 when no scan */
  ir_atom *atoms;  /* ir_recipe.natoms entries */
} ir_point;

typedef enum ir_unit { IR_UNIT_NONE, IR_UNIT_BOHR, IR_UNIT_ANGSTROM, IR_UNIT_DEGREE, IR_UNIT_RADIAN } ir_unit;

typedef struct ir_scan {
  int active;       /* 1 when the recipe has `vary` */
  char *name;       /* the varied name */
  ir_unit unit;     /* unit the values are shown in (the let's or the vary's) */
  double from, to, step; /* in `unit` */
  diag_span span;
} ir_scan;

typedef enum ir_problem_kind { IR_PROBLEM_ATOMS, IR_PROBLEM_INTEGRALS } ir_problem_kind;

typedef enum ir_freeze_kind { IR_FREEZE_NONE, IR_FREEZE_CORE, IR_FREEZE_LIST } ir_freeze_kind;
typedef enum ir_active_kind { IR_ACTIVE_ALL, IR_ACTIVE_COUNT, IR_ACTIVE_LIST } ir_active_kind;

/* The orbital space, fully resolved: `core` orbitals are doubly occupied and
 * folded into the constant (frozen core plus inactive occupied orbitals the
 * active space leaves out); `active` are the orbitals of the qubit problem, in
 * increasing order; all other orbitals are discarded virtuals. */
typedef struct ir_orbitals {
  ir_freeze_kind freeze;
  ir_active_kind active_kind;
  int norbitals;     /* orbitals of the whole problem (basis functions or FCIDUMP NORB) */
  int *core;         /* 0-based, increasing */
  int ncore;
  int *active;       /* 0-based, increasing */
  int nactive;
  int nelec_active;  /* electrons in the active space */
  int nalpha, nbeta; /* active electrons of each spin (nalpha >= nbeta) */
  diag_span freeze_span, active_span;
} ir_orbitals;

typedef enum ir_encoding { IR_ENC_JORDAN_WIGNER, IR_ENC_BRAVYI_KITAEV, IR_ENC_PARITY } ir_encoding;

typedef enum ir_reference_kind { IR_REF_HARTREE_FOCK, IR_REF_MEAN_FIELD, IR_REF_BITS } ir_reference_kind;

typedef struct ir_reference {
  ir_reference_kind kind;
  char *bits;      /* IR_REF_BITS: '0'/'1' per qubit, qubit 0 first; NUL-terminated */
  diag_span span;
} ir_reference;

typedef enum ir_symmetry { IR_SYM_PARTICLES, IR_SYM_SPIN_Z, IR_SYM_SPIN_SQUARED, IR_SYM_COUNT } ir_symmetry;
typedef enum ir_policy { IR_KEEP_NONE, IR_KEEP_EXACTLY, IR_KEEP_PENALTY, IR_KEEP_CHECKED } ir_policy;

typedef struct ir_keep {
  ir_policy policy;
  double value;    /* penalty weight (hartree) or check tolerance */
  diag_span span;  /* the keep statement */
} ir_keep;

typedef enum ir_rule_kind {
  IR_RULE_SINGLES,
  IR_RULE_DOUBLES,
  IR_RULE_ENTANGLERS,
  IR_RULE_QUBIT_SINGLES,
  IR_RULE_QUBIT_DOUBLES,
  IR_RULE_WORD,
  IR_RULE_EXCITE
} ir_rule_kind;

/* Pool rule options (bit flags). */
enum {
  IR_OPT_GENERALIZED = 1 << 0,  /* all orbital pairs, not only occupied -> virtual */
  IR_OPT_PAIRED = 1 << 1,       /* doubles: pair excitations (i_alpha i_beta -> a_alpha a_beta) */
  IR_OPT_SPIN_ADAPTED = 1 << 2  /* singles: alpha and beta moves under one parameter */
};

typedef struct ir_pauli_letter {
  int qubit;   /* 0-based */
  char letter; /* 'X', 'Y' or 'Z' */
} ir_pauli_letter;

typedef struct ir_rule {
  ir_rule_kind kind;
  unsigned options;
  /* IR_RULE_WORD: the letters, sorted by qubit, no repeats */
  ir_pauli_letter *letters;
  int nletters;
  /* IR_RULE_EXCITE: spin orbitals `from` -> `to` (equal counts, 1 or 2 or more) */
  int *from, *to;
  int nexcite;
  diag_span span;
} ir_rule;

typedef enum ir_choose_kind { IR_CHOOSE_ALL, IR_CHOOSE_COUNT, IR_CHOOSE_ABOVE, IR_CHOOSE_GROW } ir_choose_kind;

typedef struct ir_choose {
  ir_choose_kind kind;
  int count;         /* COUNT: how many; GROW: the most generators */
  double threshold;  /* ABOVE: |gradient| threshold; GROW: stop when max |gradient| < this */
  diag_span span;
} ir_choose;

/* WRITTEN: pool order; GRADIENT: decreasing |gradient|; RANK: excitation rank
 * (qubits moved) first, then decreasing |gradient|.  Ties: pool order. */
typedef enum ir_order { IR_ORDER_WRITTEN, IR_ORDER_GRADIENT, IR_ORDER_RANK } ir_order;

typedef enum ir_method { IR_OPT_LBFGS, IR_OPT_SLSQP, IR_OPT_BOBYQA, IR_OPT_COBYLA, IR_OPT_NELDER_MEAD } ir_method;
typedef enum ir_guess { IR_GUESS_ZEROS, IR_GUESS_MP2 } ir_guess;

typedef struct ir_optimize {
  ir_method method;
  double tolerance;  /* stop when the energy changes less than this (hartree) */
  int iterations;    /* most objective evaluations per start */
  int starts;        /* 1 = only the first start */
  uint64_t seed;     /* seed of the random starts */
  ir_guess guess;    /* the first start */
  diag_span span;
} ir_optimize;

typedef enum ir_emit_format { IR_EMIT_LISTING, IR_EMIT_QASM2, IR_EMIT_QASM3 } ir_emit_format;

typedef struct ir_emit {
  ir_emit_format format;
  char *path;        /* resolved against the recipe's directory */
  diag_span span;
} ir_emit;

typedef struct ir_recipe {
  char *path;        /* the top recipe file as given */
  int version;       /* `cairn 1` */

  ir_problem_kind problem;
  /* IR_PROBLEM_ATOMS */
  int natoms;
  ir_point *points;  /* npoints geometries (1 when no scan) */
  int npoints;
  ir_scan scan;
  int charge;
  int multiplicity;  /* 2S+1 */
  int nelectrons;    /* all electrons of the molecule (or FCIDUMP NELEC) */
  char *basis_name;  /* canonical lower-case name ("sto-3g"), or NULL */
  char *basis_file;  /* resolved path of `basis file "x.gbs"`, or NULL */
  diag_span basis_span;
  /* IR_PROBLEM_INTEGRALS */
  char *integrals_file; /* resolved path */
  diag_span integrals_span;

  ir_orbitals orbitals;
  ir_encoding encoding;
  int taper;
  diag_span encoding_span;
  ir_reference reference;
  ir_keep keep[IR_SYM_COUNT];

  ir_rule *rules;    /* pool rules in written order */
  int nrules;
  diag_span pool_span;
  ir_choose choose;
  ir_order order;
  diag_span order_span;
  int trotter;       /* Trotter steps of the whole product, >= 1 */
  diag_span trotter_span;
  ir_optimize optimize;
  ir_emit *emits;
  int nemits;

  char **uses;       /* resolved paths of every `use`d file, in first-use order */
  int nuses;
} ir_recipe;

void ir_recipe_free(ir_recipe *r);

/* Names of enum values as they are written in recipes ("jordan-wigner", ...). */
const char *ir_encoding_name(ir_encoding e);
const char *ir_reference_name(ir_reference_kind k);
const char *ir_symmetry_name(ir_symmetry s);
const char *ir_policy_name(ir_policy p);
const char *ir_rule_name(ir_rule_kind k);
const char *ir_method_name(ir_method m);
const char *ir_emit_name(ir_emit_format f);
const char *ir_unit_name(ir_unit u);
const char *ir_order_name(ir_order o); /* "as written", "by gradient", "by rank" */
/* The selection as written in recipes ("choose all", "choose 8 by gradient",
 * "choose gradient above 1e-3", "grow to 30 until 1e-5"); malloc'd. */
char *ir_choose_text(const ir_choose *c);

/* Number of qubits before tapering: 2 * active orbitals. */
int ir_qubits(const ir_recipe *r);

#endif
