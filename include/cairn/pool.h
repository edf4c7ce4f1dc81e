/* pool.h — the generators of an ansatz: pool rules, the reference state,
 * screening by energy gradient, selection and ordering, symmetry typing, and the
 * rotation program built from them (ansatz.h).
 *
 * Conventions, stated once:
 *
 *  - Spin orbital 2p is orbital p alpha, 2p+1 orbital p beta.  The Hartree-Fock
 *    reference fills spin orbitals 2p for p < nalpha and 2p+1 for p < nbeta.
 *  - An excitation from spin orbitals f[0..k) to t[0..k) is the operator
 *        T = a+_{t0} a+_{t1} ... a+_{t(k-1)}  a_{f(k-1)} ... a_{f1} a_{f0}
 *    (creators in written order, annihilators in reverse written order): the
 *    single f -> t is a+_t a_f, the double i j -> a b is a+_a a+_b a_j a_i.
 *    Its generator is G = 2i (T - T+), so U(theta) = exp(theta (T - T+)).
 *    Rule-made excitations list f and t in increasing order.
 *  - A qubit excitation (Yordanov, Arvidsson-Shukur, Barnes 2020) uses the same
 *    index sets with Q+_q = |1><0| on the occupation of mode q in place of a+_q
 *    (no parity strings): G = 2i (Q - Q+).  It is defined on occupation states
 *    and carried into any linear encoding through the encoding's Clifford map
 *    |n> -> |A n>: the word X^v Z^u on occupations becomes X^(A v) Z^(A^-T u).  So
 *    a qubit excitation means the same operator in Jordan-Wigner, Bravyi-Kitaev
 *    and parity (8 words per double, 2 per single in every encoding).
 *  - An entangler or an explicit word P is G = P.
 *  - The gradient of a generator is g = dE/dtheta at theta = 0
 *        = (i/2) <ref| [G, H] |ref>.
 *
 * Registers: generators are built on the full register (2*norb qubits, before
 * tapering), typed there against N, S_z, S^2 and the removed Z2 symmetries, then
 * carried to the ansatz register by the tapering Clifford.  Entanglers are made
 * from the Hamiltonian the ansatz acts on, directly on the ansatz register.
 *
 * Ownership: ans_problem only borrows.  ans_setup, ans_reference, ans_pool and
 * ans_plan own their arrays; each has a _free function.  Output structs are
 * initialized by the function that fills them.
 */
#ifndef CAIRN_POOL_H
#define CAIRN_POOL_H

#include "cairn/ansatz.h"
#include "cairn/chem.h"
#include "cairn/diag.h"
#include "cairn/ir.h"
#include "cairn/pauli.h"
#include "cairn/qubit.h"

#include <cjson/cJSON.h>
#include <stdio.h>

/* What the generators are built for.  All pointers are borrowed. */
typedef struct ans_problem {
  int nmodes;                 /* spin orbitals = qubits of the full register */
  int nqubits;                /* qubits of the ansatz register (nmodes - removed Z2s) */
  int norb, nalpha, nbeta;    /* active orbitals and electrons of each spin */
  int multiplicity;           /* 2S+1 the recipe asks for */
  const qubit_encoder *enc;
  const qubit_taper *taper;   /* NULL or nsym == 0: no tapering */
  const pauli_sum *H;         /* Hamiltonian on the ansatz register; NULL: static checks only */
  const pauli_sum *sym[IR_SYM_COUNT];  /* N, S_z, S^2 on the ansatz register; an entry
                                          may be NULL when it does not survive tapering */
  const uint64_t *ref_full;   /* reference basis state on the full register (encoded bits;
                                 Hartree-Fock bits under a mean-field reference); under
                                 tapering its sector is the one the taper kept */
} ans_problem;

/* The inputs of ans_problem built from a recipe (and its active space, when
 * given): encoder, Hamiltonian, tapering (sector of the reference bits),
 * symmetry operators, reference bits. */
typedef struct ans_setup {
  ans_problem prob;
  qubit_encoder *enc;
  pauli_sum H_full, H;        /* H: on the ansatz register */
  int has_h;
  qubit_taper taper;
  pauli_sum sym[IR_SYM_COUNT];
  uint64_t *ref_full;
} ans_setup;

/* Build the setup of recipe r; cs (may be NULL) is the active space of the point
 * used.  Without cs there is no Hamiltonian and no tapering (static checks).
 * Reports bad `bits` references through d.  Returns 0 or -1. */
int ans_setup_init(ans_setup *s, const ir_recipe *r, const chem_space *cs, diag_ctx *d);
void ans_setup_free(ans_setup *s);
/* The reference's encoded bits on the full register (nmodes = 2 norb): the
 * Hartree-Fock determinant (also for a mean-field reference) or the recipe's
 * `bits`, checked for length and letters (reported at the reference).
 * out has pauli_nwords(2 norb) words.  Returns 0 or -1. */
int ans_reference_bits(const ir_recipe *r, const qubit_encoder *enc, int norb, int nalpha, int nbeta,
                       diag_ctx *d, uint64_t *out);

/* The problem of one pipeline point (pipe.h) without rebuilding anything:
 * ref_bits is the caller's buffer (pauli_nwords(2 norb) words) for the
 * reference bits (ans_reference_bits).  The pipeline tapers in the sector of
 * the Hartree-Fock state, so `reference bits` in another sector is reported
 * at the reference (then use ans_setup_init, which tapers in the sector of
 * the bits).  Returns 0 or -1. */
struct pipe_point;
int ans_problem_from_point(ans_problem *p, const ir_recipe *r, const struct pipe_point *pp, uint64_t *ref_bits,
                           diag_ctx *d);

/* The reference state on the ansatz register. */
typedef struct ans_reference {
  ir_reference_kind kind;
  int nqubits;
  uint64_t *bits;        /* basis state (Hartree-Fock bits under a mean-field reference) */
  double *theta, *phi;   /* mean-field only: Bloch angles of each qubit, the state
                            prod_q cos(theta/2)|0> + e^{i phi} sin(theta/2)|1>; else NULL */
  double energy;         /* <ref|H|ref>, NAN without a Hamiltonian */
  int tilted;            /* mean-field qubits off the z axis (0 for basis states) */
} ans_reference;

void ans_reference_free(ans_reference *ref);
/* Hartree-Fock or explicit bits (tapered), or the qubit mean-field state: the
 * product state of lowest energy, found by L-BFGS on the closed-form energy
 * from the Hartree-Fock bits plus a small fixed perturbation, and from further
 * seeded starts.  Without a Hamiltonian a mean-field reference stays at the
 * Hartree-Fock bits. */
void ans_reference_build(ans_reference *ref, const ir_recipe *r, const ans_problem *p);
/* Energy of a product state (closed form over H's terms). */
double ans_product_energy(const pauli_sum *H, const ans_reference *ref);

/* Symmetry signature entries. */
enum {
  ANS_SIG_UNTYPED = -2,  /* not computed (no `keep ... exactly` needs it, not chosen) */
  ANS_SIG_UNKNOWN = -1,  /* the operator does not survive tapering: not typed on this register */
  ANS_SIG_BREAKS = 0,    /* [G, S] != 0 */
  ANS_SIG_KEEPS = 1      /* [G, S] = 0 exactly (Pauli algebra, |coefficients| <= 1e-10) */
};
typedef struct ans_sig {
  signed char sym[IR_SYM_COUNT];  /* N, S_z, S^2 */
  signed char z2;                 /* every removed Z2 (1 when nothing is tapered) */
} ans_sig;

/* One generator of the pool. */
typedef struct ans_gen {
  ans_gen_info info;     /* kind, text (owned by the pool), rule, line, excitation */
  diag_span span;        /* the pool rule it came from */
  size_t off, len;       /* its words: terms off..off+len of ans_pool.words */
  double gradient;       /* at the reference; NAN before screening */
  ans_sig sig;
  int rank;              /* qubits moved: 2k for a k-fold excitation, X-part size of a word */
  int cnot;              /* CNOTs of its plain circuit: sum of 2(w-1) over its words */
} ans_gen;

typedef struct ans_pool {
  int nqubits;           /* ansatz register */
  pauli_sum words;       /* every generator's words, concatenated; real coefficients m_k */
  ans_gen *gen;
  size_t len, cap;
  int nrules;
  size_t *rule_made;     /* generators each rule contributed (after tapering, duplicates) */
} ans_pool;

void ans_pool_free(ans_pool *pool);

/* The pool, the reference, and the chosen generators in program order. */
typedef struct ans_plan {
  ans_reference ref;
  ans_pool pool;
  size_t *order;         /* indices into pool.gen, in the order they act */
  size_t norder;
  int screened;          /* gradients are known (a Hamiltonian was given) */
  int grow;              /* `grow`: order holds the pool ranked by gradient; the run picks */
} ans_plan;

/* Everything up to the program: reference, pool rules, symmetry typing (errors
 * and warnings through d), screening, selection and ordering.  With
 * p->H == NULL only the static part runs: rules that need the Hamiltonian
 * (entanglers) are typed by what is provable without it.  Returns 0, or -1
 * when the recipe has errors. */
int ans_plan_build(ans_plan *pl, const ir_recipe *r, const ans_problem *p, diag_ctx *d);
void ans_plan_free(ans_plan *pl);

/* The rotation program of the plan's chosen generators (ansatz.h): the
 * reference basis state in init; a mean-field reference as leading Ry(theta')
 * then Rz(phi) rotations per qubit with their own parameters (param_gen -1,
 * initial values theta' = theta - pi*bit and phi); then `trotter` repetitions
 * of the ordered product with mult/trotter, parameters shared. */
void ans_plan_circuit(const ans_plan *pl, const ir_recipe *r, ans_circuit *c);

/* Type the chosen generators against every symmetry still untyped (plan
 * building types only what `keep ... exactly` needs; tables want all). */
void ans_plan_type(ans_plan *pl, const ans_problem *p);

/* Gradient (i/2)<ref|[G, H]|ref> of the pool's generator k at a product state,
 * by closed forms over H's terms (no statevector; builds the term index, so
 * for many generators use ans_pool_screen). */
double ans_gen_gradient(const ans_pool *pool, size_t k, const pauli_sum *H, const ans_reference *ref);
/* The gradients of every generator of the pool at a product state ref: H's
 * terms grouped by X-mask once (hash), then each word costs its group. */
void ans_pool_screen(ans_pool *pool, const pauli_sum *H, const ans_reference *ref);

/* Ordering key of a gradient: |g| quantized to 1e-12 Eh, so that gradients
 * equal up to rounding tie exactly and ties fall back to pool order (-1: NAN). */
long long ans_grad_key(double g);

/* Adaptive growth (`grow to N until tol`, ADAPT-VQE): on the statevector
 * engine (sim.h), repeatedly append the pool generator with the largest
 * |gradient| at the current optimized state and re-optimize all parameters
 * (warm start; the recipe's method, tolerance and iterations), until N
 * generators or the largest |gradient| is under tol.  `objective` is what is
 * minimized (the Hamiltonian on the ansatz register, plus any penalties).
 * Afterwards pl->order holds the chosen generators in program order (a
 * generator may be chosen again: it gets a new parameter) and
 * ans_plan_circuit builds the grown program; out->theta are its optimized
 * parameters.  Returns 0, or -1 with a message in err (the statevector does
 * not fit, an optimizer failure). */
typedef struct ans_grow_step {
  size_t gen;          /* pool index added */
  double gradient;     /* its gradient when it was chosen */
  double energy;       /* objective after re-optimizing with it */
  long evals;          /* objective evaluations of that optimization */
} ans_grow_step;

typedef struct ans_grow_result {
  ans_grow_step *step;
  int nsteps;
  double energy0;      /* objective of the reference (mean-field angles optimized) */
  double energy;       /* objective at the end */
  double *theta;       /* nparams optimized parameters of the grown program */
  int nparams;
  int converged;       /* 1: stopped because the largest |gradient| < tol; 0: N reached */
  double max_gradient; /* largest |gradient| at the final state */
} ans_grow_result;

int ans_grow(ans_plan *pl, const ir_recipe *r, const pauli_sum *objective, ans_grow_result *out, char *err,
             size_t errlen);
void ans_grow_result_free(ans_grow_result *g);

/* Generator table in program order (`cairn show`): text or JSON (DESIGN.md). */
void ans_table_print(const ans_plan *pl, const ir_recipe *r, const ans_problem *p, const diag_ctx *d,
                     FILE *out);
cJSON *ans_table_json(const ans_plan *pl, const ir_recipe *r, const ans_problem *p, const diag_ctx *d);

/* `cairn check` after front_load: builds the active space and the Hamiltonian
 * only when the recipe needs them (entanglers, tapering, a gradient threshold),
 * then types every generator and the reference.  Returns 0 or -1 (errors
 * reported through d). */
int ans_check(const ir_recipe *r, diag_ctx *d);
/* `cairn show`: the generator table of scan point 0, text or JSON, to out.
 * Returns 0, or -1 after reporting through d. */
int ans_show(const ir_recipe *r, diag_ctx *d, FILE *out, int json);

#endif
