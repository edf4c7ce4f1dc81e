/* sim.c — the rotation program on a statevector: energy, adjoint gradient,
 * expectation values (see sim.h). */
#include "config.h"

#include "cairn/sim.h"
#include "cairn/util.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* One step of the program: a rotation with its word as single masks, or a
 * fused run of rotations (same parameter, same X mask, commuting; see
 * sv_gen), whose multipliers live in the fused generator. */
typedef struct sim_rot {
  uint64_t x, z;
  int32_t param; /* < 0: fixed angle mult */
  double mult;   /* 1 for a fused step */
  sv_gen *gen;   /* non-NULL: a fused step */
} sim_rot;

struct sim_engine {
  int n;
  uint64_t init;   /* basis state the program starts from */
  sim_rot *rot;   /* steps */
  size_t nrot;    /* steps */
  size_t nrot_in; /* rotations of the program */
  int nparams;
  sv_op *obj;      /* the objective */
  sv_state psi;    /* the state (phi during the backward pass) */
  sv_state lam;    /* lambda of the backward pass */
  double *theta;   /* parameters of the last forward pass */
  double *initial; /* the circuit's initial parameter values (param_init) */
  int valid;       /* psi holds |psi(theta)> */
  long evals;
};

uint64_t sim_engine_bytes(int nqubits, size_t terms) {
  return (uint64_t)SIM_VECTORS * sv_vector_bytes(nqubits) + sv_op_bytes_bound(terms) + SV_DIAG_BYTES(nqubits);
}

/* Replace each maximal run (>= 2) of consecutive rotations with one parameter
 * and one X mask by a fused step when the words fuse (sv_gen_new); other
 * rotations stay as they are.  Works in place; returns the number of steps. */
static size_t fuse_steps(int n, sim_rot *rot, size_t nrot) {
  size_t out = 0;
  uint64_t xs[64], zs[64];
  double ms[64];
  for (size_t a = 0; a < nrot;) {
    size_t b = a + 1;
    while (b < nrot && b - a < 64 && rot[a].param >= 0 && rot[b].param == rot[a].param && rot[b].x == rot[a].x &&
           rot[a].x != 0)
      b++;
    sv_gen *g = NULL;
    if (b - a >= 2) {
      for (size_t k = a; k < b; k++) {
        xs[k - a] = rot[k].x;
        zs[k - a] = rot[k].z;
        ms[k - a] = rot[k].mult;
      }
      g = sv_gen_new(n, (int)(b - a), xs, zs, ms);
    }
    if (g) {
      rot[out++] = (sim_rot){rot[a].x, 0, rot[a].param, 1.0, g};
      a = b;
    } else {
      rot[out++] = rot[a];
      a++;
    }
  }
  return out;
}

sim_engine *sim_engine_new(const ans_circuit *c, const pauli_sum *objective, char *err, size_t errlen) {
  int n = c->nqubits;
  if (objective->n != n) {
    snprintf(err, errlen, "the objective acts on %d qubits but the rotation program on %d", objective->n, n);
    return NULL;
  }
  /* Width and memory first: nothing large is allocated before this. */
  if (sv_mem_check(n, SIM_VECTORS, sv_op_bytes_bound(objective->len) + SV_DIAG_BYTES(n), err, errlen) != 0)
    return NULL;
  for (int k = 1; k < pauli_nwords(n); k++)
    if (c->init[k]) {
      snprintf(err, errlen, "the initial state sets a qubit beyond the register");
      return NULL;
    }
  sim_rot *rot = xcalloc(c->nrot ? c->nrot : 1, sizeof *rot);
  for (size_t k = 0; k < c->nrot; k++) {
    const ans_rotation *r = &c->rot[k];
    if (r->word < 0 || (size_t)r->word >= c->words.len || r->param >= c->nparams) {
      snprintf(err, errlen, "rotation %zu refers to a word or parameter the program does not have", k);
      free(rot);
      return NULL;
    }
    sv_word_masks(&c->words, (size_t)r->word, &rot[k].x, &rot[k].z);
    rot[k].param = r->param;
    rot[k].mult = r->mult;
    rot[k].gen = NULL;
  }
  size_t nsteps = fuse_steps(n, rot, c->nrot);
  sv_op *op = sv_op_new(objective, err, errlen);
  if (!op) {
    for (size_t k = 0; k < nsteps; k++) sv_gen_free(rot[k].gen);
    free(rot);
    return NULL;
  }
  sv_op_cache_diagonal(op); /* counted in the memory check above; fails harmlessly on complex diagonals */
  sim_engine *e = xcalloc(1, sizeof *e);
  e->n = n;
  e->init = c->init[0];
  e->rot = rot;
  e->nrot = nsteps;
  e->nrot_in = c->nrot;
  e->nparams = c->nparams;
  e->obj = op;
  e->theta = xcalloc(c->nparams ? (size_t)c->nparams : 1, sizeof *e->theta);
  e->initial = xcalloc(c->nparams ? (size_t)c->nparams : 1, sizeof *e->initial);
  if (c->param_init && c->nparams) memcpy(e->initial, c->param_init, (size_t)c->nparams * sizeof *e->initial);
  sv_state_alloc(&e->psi, n);
  sv_state_alloc(&e->lam, n);
  return e;
}

void sim_engine_free(sim_engine *e) {
  if (!e) return;
  for (size_t k = 0; k < e->nrot; k++) sv_gen_free(e->rot[k].gen);
  free(e->rot);
  free(e->theta);
  free(e->initial);
  sv_op_free(e->obj);
  sv_state_free(&e->psi);
  sv_state_free(&e->lam);
  free(e);
}

int sim_engine_qubits(const sim_engine *e) { return e->n; }
int sim_engine_params(const sim_engine *e) { return e->nparams; }
size_t sim_engine_rotations(const sim_engine *e) { return e->nrot_in; }
size_t sim_engine_steps(const sim_engine *e) { return e->nrot; }
long sim_engine_evaluations(const sim_engine *e) { return e->evals; }
const double *sim_engine_initial(const sim_engine *e) { return e->initial; }

static double angle(const sim_rot *r, const double *theta) {
  return r->param >= 0 ? theta[r->param] * r->mult : r->mult;
}

/* Forward pass: psi = R_K ... R_1 |init>; remembers theta. */
static void forward(sim_engine *e, const double *theta) {
  if (e->nparams && theta != e->theta) memcpy(e->theta, theta, (size_t)e->nparams * sizeof *theta);
  sv_set_basis(&e->psi, e->init);
  for (size_t k = 0; k < e->nrot; k++) {
    const sim_rot *r = &e->rot[k];
    if (r->gen) sv_gen_rotate(r->gen, &e->psi, angle(r, theta));
    else sv_rotate(&e->psi, r->x, r->z, angle(r, theta));
  }
  e->valid = 1;
}

const sv_state *sim_prepare(sim_engine *e, const double *theta) {
  forward(e, theta);
  return &e->psi;
}

/* The energy goes through O|psi> into the second vector, exactly as in
 * sim_energy_grad, so an energy does not depend on whether a gradient was
 * taken with it (same bits). */
double sim_energy(sim_engine *e, const double *theta) {
  forward(e, theta);
  e->evals++;
  return creal(sv_op_apply(e->obj, &e->psi, &e->lam));
}

/* Reverse mode: lambda = O psi, then walk the rotations backwards.  At step k
 * both vectors hold phi_k and lambda_k; the gradient term needs
 * <lambda_k|P_k|phi_k>, then R_k^dag (the rotation by -a_k) moves both to k-1,
 * in the same pass.  The first rotation needs no undoing. */
double sim_energy_grad(sim_engine *e, const double *theta, double *grad) {
  forward(e, theta);
  e->evals++;
  double E = creal(sv_op_apply(e->obj, &e->psi, &e->lam));
  for (int p = 0; p < e->nparams; p++) grad[p] = 0;
  for (size_t k = e->nrot; k-- > 0;) {
    const sim_rot *r = &e->rot[k];
    if (r->gen) {
      double complex w = k > 0 ? sv_gen_inner_rotate2(r->gen, &e->lam, &e->psi, -angle(r, theta))
                               : sv_gen_inner(r->gen, &e->lam, &e->psi);
      grad[r->param] += cimag(w);
    } else if (r->param >= 0) {
      double complex w = k > 0 ? sv_word_inner_rotate2(&e->lam, &e->psi, r->x, r->z, -angle(r, theta))
                               : sv_word_inner(&e->lam, r->x, r->z, &e->psi);
      grad[r->param] += r->mult * cimag(w);
    } else if (k > 0) {
      sv_rotate(&e->lam, r->x, r->z, -r->mult);
      sv_rotate(&e->psi, r->x, r->z, -r->mult);
    }
  }
  e->valid = 0;
  return E;
}

int sim_candidate_gradients(sim_engine *e, const double *theta, const pauli_sum *words, const size_t *off,
                            const size_t *len, size_t ncand, double *out, char *err, size_t errlen) {
  if (words->n != e->n) {
    snprintf(err, errlen, "the candidates act on %d qubits but the register has %d", words->n, e->n);
    return -1;
  }
  forward(e, theta);
  sv_op_apply(e->obj, &e->psi, &e->lam);
  uint64_t *x = NULL, *z = NULL;
  double *m = NULL;
  size_t cap = 0;
  for (size_t c = 0; c < ncand; c++) {
    if (len[c] > cap) {
      cap = len[c];
      x = xrealloc(x, cap * sizeof *x);
      z = xrealloc(z, cap * sizeof *z);
      m = xrealloc(m, cap * sizeof *m);
    }
    for (size_t k = 0; k < len[c]; k++) {
      size_t t = off[c] + k;
      if (t >= words->len || sv_word_masks(words, t, &x[k], &z[k]) != 0) {
        snprintf(err, errlen, "candidate %zu refers to a word the sum does not have", c);
        free(x), free(z), free(m);
        return -1;
      }
      m[k] = creal(words->c[t]);
    }
    sv_gen *g = len[c] >= 2 && len[c] <= 64 ? sv_gen_new(e->n, (int)len[c], x, z, m) : NULL;
    double complex w = 0;
    if (g) {
      w = sv_gen_inner(g, &e->lam, &e->psi);
      sv_gen_free(g);
    } else {
      for (size_t k = 0; k < len[c]; k++) w += m[k] * sv_word_inner(&e->lam, x[k], z[k], &e->psi);
    }
    out[c] = cimag(w);
  }
  free(x);
  free(z);
  free(m);
  return 0;
}

sv_op *sim_observable(const sim_engine *e, const pauli_sum *s, char *err, size_t errlen) {
  if (s->n != e->n) {
    snprintf(err, errlen, "the observable acts on %d qubits but the register has %d", s->n, e->n);
    return NULL;
  }
  return sv_op_new(s, err, errlen);
}

double sim_expect(sim_engine *e, const sv_op *op) {
  if (!e->valid) forward(e, e->theta);
  return creal(sv_op_apply(op, &e->psi, &e->lam));
}

/* (X - x0)^2 = X^2 - 2 x0 X + x0^2, by the Pauli algebra (one product). */
void sim_add_penalty(pauli_sum *objective, const pauli_sum *X, double x0, double mu) {
  pauli_sum d, d2;
  pauli_sum_init(&d, X->n);
  pauli_sum_copy(&d, X);
  pauli_sum_add_identity(&d, -x0);
  pauli_sum_canonicalize(&d, 0.0);
  pauli_sum_init(&d2, X->n);
  pauli_sum_mul(&d2, &d, &d);
  pauli_sum_add_sum(objective, &d2, mu);
  pauli_sum_canonicalize(objective, 0.0);
  pauli_sum_free(&d);
  pauli_sum_free(&d2);
}
