/* resolve.h — shared state of AST -> IR resolution (private to the front end).
 *
 * resolve.c walks the statements, eval.c computes expressions (units,
 * dimensions, names), space.c settles electrons and the orbital space.
 *
 * Ownership: the rs context owns the parsed ASTs of every file it read and the
 * tables below; rs_free releases them.  The ir_recipe it builds is handed to
 * the caller of front_resolve.
 */
#ifndef CAIRN_FRONT_RESOLVE_H
#define CAIRN_FRONT_RESOLVE_H

#include "cairn/diag.h"
#include "cairn/front.h"
#include "cairn/ir.h"
#include "front/ast.h"

#include <stddef.h>

/* CODATA 2018: 1 bohr = 0.529177210903 angstrom. */
#define RS_ANGSTROM_PER_BOHR 0.529177210903

typedef enum rs_dim { RS_BARE, RS_LENGTH, RS_ANGLE } rs_dim;

/* A computed value: internal units (bohr, radian) and what it was made of. */
typedef struct rs_val {
  double v;
  rs_dim dim;
  ir_unit unit;      /* unit word it was written in (NONE: bare) */
  int varies;        /* depends on the varied name */
  diag_span vspan;   /* where the varied name (or a let using it) appears */
} rs_val;

typedef struct rs_name {
  diag_span name;    /* its spelling */
  ast_stmt *def;     /* the let, or the vary for a new name */
  int order;         /* index of the defining statement */
  int is_vary;       /* the scanned name (a new name, or a let that `vary` overrides) */
  int state;         /* 0 not yet evaluated, 2 ok, 3 failed (reported) */
  rs_val val;        /* the value at its definition */
  int cache_point;   /* scan point of `cache`, -1 none */
  rs_val cache;
} rs_name;

typedef enum rs_slot {
  RS_ATOMS, RS_CHARGE, RS_MULT, RS_BASIS, RS_INTEGRALS, RS_ORBITALS, RS_ENCODING, RS_REFERENCE,
  RS_POOL, RS_CHOOSE, RS_ORDER, RS_TROTTER, RS_OPTIMIZE, RS_VARY, RS_NSLOTS
} rs_slot;

typedef struct rs {
  diag_ctx *d;
  front_opts o;
  ir_recipe *r;
  int32_t top;               /* the top file */

  ast_file **asts;           /* every parsed file */
  int nasts;
  size_t capasts;
  ast_stmt **st;             /* all statements in order, `use`s expanded */
  int nst;
  size_t capst;
  char **stack;              /* normalized paths of the files being read (use chain) */
  int nstack;
  size_t capstack;
  char **included;           /* normalized paths of every file read */
  int nincluded;
  size_t capincluded;

  rs_name *names;
  int nnames;
  size_t capnames;
  ast_stmt *one[RS_NSLOTS];  /* the statement of each once-only slot */
  rs_name *varied;           /* the scanned name, or NULL */
  rs_dim vary_dim;
  ir_unit vary_unit;
  double vary_from;          /* internal units */
  int vary_ok;
  int scan_points;           /* points of the scan (0: no scan) */
  int scan_used;             /* an atom coordinate depends on the scanned name */

  int point;                 /* -1: definition values; k >= 0: scan point k */
  double point_value;        /* the scanned value at point k, internal units */
  double point_param;        /* ... in the scan's unit */
  int cur;                   /* index of the statement being evaluated (names defined before it) */
  int syntax_errors;
  int use_failed;            /* a `use`d file could not be read */
  diag_span header_span;     /* the `cairn 1` line of the top file */
  int molecule_ok;           /* atoms, charge, basis (or integrals) resolved */
  int qubits;                /* 2 x active orbitals, -1 while unknown */
} rs;

/* eval.c */
/* Evaluate e; 0 and *out, or -1 after reporting (or silently when the error
 * was reported before). */
int front_eval(rs *c, const ast_expr *e, rs_val *out);
/* A setting value: bare, not varying, finite.  `what` names it in messages. */
int front_eval_number(rs *c, const ast_expr *e, const char *what, double *out);
/* A whole number in [lo, hi]. */
int front_eval_int(rs *c, const ast_expr *e, const char *what, long lo, long hi, long *out);
/* Find a name defined before statement c->cur; reports when missing. */
rs_name *front_lookup(rs *c, diag_span name, int report);
const char *front_dim_name(rs_dim d);
/* Report that the varied name reaches a place it may not. */
void front_varies_error(rs *c, const rs_val *v, const char *where);

/* space.c: electrons, multiplicity, orbital count and the orbital space. */
void front_space(rs *c);

/* resolve.c helpers used by the others */
/* Parse a whole number token ("12"); -1 after reporting when it is not one. */
int front_index(rs *c, diag_span s, int bad, long *out);

#endif
