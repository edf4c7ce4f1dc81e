/* sim.h — a simulated optimization run of a rotation program (ansatz.h):
 * energy and gradient by the adjoint method, expectation values on the final
 * state, and the optimizers (through NLopt) with several starts.
 *
 * The state is |psi(theta)> = R_K ... R_1 |init>,  R_k = exp(-i a_k P_k / 2),
 * a_k = theta[param_k] * mult_k (or the fixed angle mult_k when param_k < 0).
 * The objective is <psi|O|psi> for a Hermitian Pauli sum O the caller builds:
 * the Hamiltonian, plus any penalty terms mu (X - x0)^2.
 *
 * Gradient (Jones & Gacon 2020, reverse mode): one forward pass to |psi>,
 * lambda = O|psi>, then a backward pass that undoes one rotation at a time on
 * both vectors; with dR_k/da = -i/2 P_k R_k,
 *     dE/dtheta_p = sum over rotations k using p of  mult_k Im <lambda_k|P_k|phi_k>,
 * phi_k = R_k..R_1|init>, lambda_k = R_{k+1}^dag..R_K^dag O|psi>.  Cost: about
 * 2 * (rotations) passes over 2^n amplitudes plus one application of O; two
 * vectors of memory (and the objective's diagonal, half a vector).  A run of
 * rotations with one parameter and one X mask (a Jordan-Wigner excitation's
 * words) is one fused step that touches only the pairs it connects (sv_gen).
 *
 * This is a noise-free statevector simulation: energies are what an ideal
 * device with exact expectation values would give, not a hardware estimate.
 *
 * Ownership: sim_engine owns its vectors and compiled operators
 * (sim_engine_free); it keeps no pointer to the circuit or the sums it was
 * built from.  sim_opt_result owns its arrays (sim_opt_result_free).
 */
#ifndef CAIRN_SIM_H
#define CAIRN_SIM_H

#include "cairn/ansatz.h"
#include "cairn/ir.h"
#include "cairn/pauli.h"
#include "cairn/sv.h"

#include <stddef.h>
#include <stdint.h>

/* ---- engine ---------------------------------------------------------------- */

typedef struct sim_engine sim_engine;

/* Vectors the engine allocates (for memory estimates before building); it
 * also tabulates the objective's diagonal (half a vector, SV_DIAG_BYTES). */
#define SIM_VECTORS 2

/* Memory the engine needs for n qubits and an objective of `terms` terms. */
uint64_t sim_engine_bytes(int nqubits, size_t terms);

/* Build an engine for circuit c with objective O (same qubit count).  Checks
 * the register width and the memory (SIM_VECTORS vectors + tables) before
 * allocating anything large.  Returns NULL with a message in err (the memory
 * refusal names what is needed and what there is). */
sim_engine *sim_engine_new(const ans_circuit *c, const pauli_sum *objective, char *err, size_t errlen);
void sim_engine_free(sim_engine *e);
int sim_engine_qubits(const sim_engine *e);
int sim_engine_params(const sim_engine *e);
size_t sim_engine_rotations(const sim_engine *e);
/* Passes the program takes after fusing runs of rotations that share a
 * parameter and an X mask (a Jordan-Wigner excitation becomes one step). */
size_t sim_engine_steps(const sim_engine *e);

/* Objective at theta (nparams values): forward pass, one application of O
 * (the same sums as sim_energy_grad, so the same bits).  Leaves |psi(theta)>
 * as the engine's current state. */
double sim_energy(sim_engine *e, const double *theta);
/* Objective and its gradient (grad: nparams values).  Afterwards the current
 * state is no longer |psi(theta)> (the backward pass unwinds it); call
 * sim_prepare before reading it. */
double sim_energy_grad(sim_engine *e, const double *theta, double *grad);
/* Make the current state |psi(theta)>; returns it (owned by the engine, valid
 * until the next call on e). */
const sv_state *sim_prepare(sim_engine *e, const double *theta);
/* The circuit's initial parameter values (ans_circuit.param_init: optimized
 * mean-field angles for reference parameters, 0 for generator amplitudes;
 * all 0 when the circuit has none).  nparams values, owned by the engine. */
const double *sim_engine_initial(const sim_engine *e);
/* Evaluations so far (sim_energy and sim_energy_grad calls). */
long sim_engine_evaluations(const sim_engine *e);

/* Gradients for adaptive growth: for each candidate generator c (words
 * off[c] .. off[c]+len[c]-1 of `words`, real coefficients m_k, as in
 * ans_pool), the derivative at t = 0 of the objective with exp(-i t G_c/2)
 * appended after the program at theta:
 *     g_c = (i/2) <psi|[G_c, O]|psi> = sum_k m_k Im <O psi|P_k|psi>.
 * One forward pass and one O|psi>, then one read-only pass per word (one per
 * candidate when its words fuse).  Returns 0, or -1 with a message in err
 * (a word wider than the register). */
int sim_candidate_gradients(sim_engine *e, const double *theta, const pauli_sum *words, const size_t *off,
                            const size_t *len, size_t ncand, double *out, char *err, size_t errlen);

/* A compiled observable (N, S_z, S^2, H without penalties, ...) for
 * expectation values on the current state. */
sv_op *sim_observable(const sim_engine *e, const pauli_sum *s, char *err, size_t errlen);
/* <psi|op|psi> on |psi(theta)> of the last sim_energy, sim_energy_grad or
 * sim_prepare call (re-prepared first when a gradient pass unwound it); the
 * real part (the sums are Hermitian). */
double sim_expect(sim_engine *e, const sv_op *op);

/* objective += mu (X - x0)^2 for a Hermitian X (N, S_z, S^2): the term of
 * `keep ... penalty mu`, whose gradient the adjoint pass then includes.  The
 * result is canonical (pauli_sum_canonicalize, exact zeros dropped). */
void sim_add_penalty(pauli_sum *objective, const pauli_sum *X, double x0, double mu);

/* ---- optimizer --------------------------------------------------------------- */

/* What the progress hook sees after every objective evaluation. */
typedef struct sim_progress {
  int start, nstarts;  /* current start (0-based) and how many */
  long evaluation;     /* evaluations in this start so far */
  double energy;       /* objective at this evaluation */
  double best;         /* lowest objective of this start so far */
} sim_progress;
typedef void (*sim_progress_fn)(void *user, const sim_progress *p);

typedef struct sim_opt_options {
  ir_method method;        /* lbfgs (default), slsqp, bobyqa, cobyla, nelder-mead */
  double tolerance;        /* stop when the objective changes less than this (hartree); <= 0: 1e-8 */
  int max_evals;           /* most objective evaluations per start; <= 0: 1000 */
  /* Starts: first the given vectors in order (a NULL vector = the circuit's
   * initial values, sim_engine_initial: zero amplitudes, mean-field angles as
   * optimized for the reference), then `nrandom` random ones: the initial
   * values plus, per parameter, a uniform offset in [-random_range,
   * random_range] radians from util_rng seeded by (seed, random start index),
   * so a start does not depend on how many others there are. */
  const double *const *given;
  const char *const *given_label; /* names for the report ("zeros", "warm"), may be NULL */
  int ngiven;
  int nrandom;
  uint64_t seed;
  double random_range;     /* <= 0: SIM_RANDOM_RANGE */
  double initial_step;     /* derivative-free first step (radians); <= 0: SIM_INITIAL_STEP */
  sim_progress_fn progress; /* may be NULL */
  void *progress_user;
} sim_opt_options;

#define SIM_RANDOM_RANGE 0.5
#define SIM_INITIAL_STEP 0.1

/* Defaults: lbfgs, tolerance 1e-8, 1000 evaluations, one zero start. */
void sim_opt_options_init(sim_opt_options *o);

typedef enum sim_stop {
  SIM_STOP_TOLERANCE,   /* the objective (or the step) changed less than the tolerance */
  SIM_STOP_EVALUATIONS, /* hit the evaluation limit */
  SIM_STOP_ROUNDOFF,    /* NLopt: no further progress possible at double precision */
  SIM_STOP_NO_PARAMS,   /* nothing to optimize: the program has no parameters */
  SIM_STOP_FAILED       /* NLopt reported a failure (see message) */
} sim_stop;

/* The method as written in recipes ("lbfgs", "nelder-mead", ...). */
const char *sim_method_name(ir_method m);
/* Words for a stop reason ("converged", "evaluation limit", ...). */
const char *sim_stop_name(sim_stop s);

typedef struct sim_start {
  char *label;          /* "zeros", "warm", "random 1", ... (owned) */
  double *theta0;       /* nparams: where the start began */
  double *theta;        /* nparams: best point found */
  double energy;        /* objective at theta */
  long evals;           /* objective evaluations */
  sim_stop stop;
  int converged;        /* 1 for SIM_STOP_TOLERANCE and SIM_STOP_NO_PARAMS */
  int nlopt_code;       /* NLopt's result code (0 for SIM_STOP_NO_PARAMS) */
  double *trace;        /* evals entries: objective at each evaluation, in order
                           (NLopt does not expose iterations; line searches show as
                           evaluations that did not improve) */
  double seconds;
} sim_start;

typedef struct sim_opt_result {
  int nparams;
  int nstarts;
  sim_start *start;     /* nstarts */
  int best;             /* start with the lowest energy (first one on ties) */
  double e_min, e_max, e_median; /* spread of final energies over the starts */
  long evals;           /* all starts */
  double seconds;
} sim_opt_result;

/* Run every start of o on engine e.  The engine's current state is the best
 * start's final state afterwards.  Returns 0, or -1 with a message in err
 * (bad options, NLopt unable to create the method); *out is then empty. */
int sim_optimize(sim_engine *e, const sim_opt_options *o, sim_opt_result *out, char *err, size_t errlen);
void sim_opt_result_free(sim_opt_result *r);

#endif
