/* ans_priv.h — shared between the files of the ansatz module only.
 *
 * Ownership: every struct here owns its arrays and has an _init/_free pair;
 * ans_build borrows everything except its tallies and its duplicate table.
 */
#ifndef CAIRN_ANS_PRIV_H
#define CAIRN_ANS_PRIV_H

#include "cairn/pool.h"

#include <complex.h>
#include <math.h>
#include <stdint.h>

/* Relative size under which a commutator coefficient counts as zero. */
#define ANS_COMM_TOL 1e-10
/* Coefficients of generator words at or under this are dropped. */
#define ANS_WORD_TOL 1e-12

/* ---- a hash set of bit masks (nw 64-bit words each), in insertion order ---- */
typedef struct ans_maskset {
  int nw;
  size_t len, cap;
  uint64_t *m;       /* len*nw */
  uint32_t *slot;    /* index + 1, 0 = empty */
  size_t nslots;     /* power of two */
} ans_maskset;

void ans_maskset_init(ans_maskset *s, int nw, size_t expect);
void ans_maskset_free(ans_maskset *s);
/* Index of mask m, adding it when new (*added set to 1 then, else 0). */
size_t ans_maskset_add(ans_maskset *s, const uint64_t *m, int *added);
/* Index of m, or -1. */
long ans_maskset_find(const ans_maskset *s, const uint64_t *m);
uint64_t ans_mask_hash(int nw, const uint64_t *m);

/* Mean-field angles are normalized so that a qubit on the z axis has theta
 * exactly 0 or pi. */
static inline int ans_angle_is_pole(double theta) { return theta == 0.0 || theta == M_PI; }

/* ---- closed-form screening at a product state ----
 * The terms of H grouped by their X-mask outside the tilted qubits: a word P
 * has <psi|P h|psi> != 0 only for terms h in the group of P's X-mask, because
 * on an untilted qubit (Bloch vector on the z axis) X and Y average to zero. */
typedef struct ans_screen {
  const pauli_sum *H;
  int n, nw;
  uint64_t *tilt;     /* nw: qubits off the z axis */
  uint64_t *bits;     /* nw: pole of untilted qubits (1 = |1>) */
  double *r;          /* 3n: Bloch vector (x, y, z) of each qubit */
  ans_maskset keys;   /* group keys: x & ~tilt */
  size_t *start;      /* keys.len + 1 */
  uint32_t *term;     /* H->len term indices, grouped */
} ans_screen;

void ans_screen_init(ans_screen *s, const pauli_sum *H, const ans_reference *ref);
void ans_screen_free(ans_screen *s);
/* Terms of H that can pair with a word of X-mask x (NULL, *len 0 if none). */
const uint32_t *ans_screen_group(const ans_screen *s, const uint64_t *x, size_t *len);
/* (i/2)<psi|[P, H]|psi> for the word P = (x, z). */
double ans_screen_word(const ans_screen *s, const uint64_t *x, const uint64_t *z);
/* Expectation <psi|P|psi> of a word (real: P is Hermitian). */
double ans_screen_expect(const ans_screen *s, const uint64_t *x, const uint64_t *z);

/* ---- building a plan ---- */

/* What one pool rule did, for the messages after all rules ran. */
typedef struct ans_tally {
  size_t made;                       /* generators it added to the pool */
  size_t tried;                      /* generators it proposed */
  size_t vanished, vanished_taper;   /* zero in the encoding / after tapering */
  size_t dup;                        /* copies involving an explicit generator, dropped */
  size_t dup_quiet;                  /* copies between rule families, dropped quietly */
  long dup_of;                       /* pool index of the first one copied */
  size_t *z2_drop;                   /* per removed Z2: generators dropped */
  char *z2_text;                     /* text of the first generator dropped by a Z2 */
  int unexpanded;                    /* not expanded: needs the Hamiltonian */
  int had_error;                     /* an error was reported at the rule */
  size_t breaks[IR_SYM_COUNT];       /* generators that do not commute (kept exactly) */
  size_t unknown[IR_SYM_COUNT];
  long first_break[IR_SYM_COUNT];    /* pool index */
  double worst[IR_SYM_COUNT];        /* largest |coefficient| of [G, S] seen */
  int static_break[IR_SYM_COUNT];    /* provable without building (entanglers, no H) */
} ans_tally;

typedef struct ans_dedupe {
  size_t *slot;      /* pool index + 1 */
  size_t nslots;
  size_t len;
} ans_dedupe;

typedef struct ans_build {
  const ir_recipe *r;
  const ans_problem *p;
  diag_ctx *d;
  ans_plan *pl;
  const ans_screen *scr;             /* NULL without a Hamiltonian */
  ans_tally *tally;                  /* r->nrules */
  ans_dedupe dd;
  int type_all[IR_SYM_COUNT];        /* kept exactly: type every generator now */
  int rule;                          /* rule being expanded */
  int rule_line;                     /* its 1-based line */
  pauli_sum word;                    /* scratch for one-word generators */
} ans_build;

/* One pool rule: expands rule b->rule into generators through ans_add_*. */
typedef void (*ans_rule_fn)(ans_build *b, const ir_rule *rule);
ans_rule_fn ans_rule_lookup(ir_rule_kind k);
uint64_t ans_rule_estimate(const ans_build *b, const ir_rule *rule, int *words);
void ans_rule_entanglers(ans_build *b, const ir_rule *rule);

/* Add a generator made on the full register (G is consumed): canonicalize,
 * type against the removed Z2s, taper, type, deduplicate, append. */
void ans_add_full(ans_build *b, const ans_gen_info *info, pauli_sum *G);
/* Room for `more` generators (one word each) before a large rule adds them. */
void ans_reserve(ans_build *b, size_t more);
/* Add a generator made on the ansatz register (entanglers): one word. */
void ans_add_reg_word(ans_build *b, const ans_gen_info *info, const uint64_t *x, const uint64_t *z,
                      double gradient);

/* Signature entry of words off..off+len of s against operator S (ANS_SIG_*):
 * the commutator by the Pauli algebra; *worst gets its largest |coefficient|. */
int ans_sig_commutes(const pauli_sum *s, size_t off, size_t len, const pauli_sum *S, double *worst);
/* Type generator k against symmetry `sym` now (fills gen->sig.sym[sym]);
 * returns the largest |coefficient| of the commutator (0 when it commutes). */
double ans_type_gen(ans_pool *pool, size_t k, const ans_problem *p, int sym);
/* Selection and ordering (select.c): fills pl->order; warns at the choose
 * statement when nothing is left. */
void ans_select(ans_plan *pl, const ir_recipe *r, diag_ctx *d);
/* Reference typing and messages (symmetry.c). */
void ans_type_reference(ans_build *b);
/* Messages of every rule after expansion (symmetry.c). */
void ans_rule_messages(ans_build *b);


/* The span of the `keep` statement of symmetry s. */
static inline diag_span ans_keep_span(const ir_recipe *r, int s) { return r->keep[s].span; }

/* Format a generator's text (malloc'd). */
char *ans_excitation_text(int k, const int *from, const int *to);

#endif
