/* reference.c — the reference state: Hartree-Fock or explicit bits, or the qubit
 * mean-field product state of lowest energy (QCC, J. Chem. Theory Comput. 14,
 * 6317 (2018)).
 *
 * Mean-field: each qubit is cos(theta/2)|0> + e^{i phi} sin(theta/2)|1>, Bloch
 * vector r = (sin theta cos phi, sin theta sin phi, cos theta).  The energy is
 * the closed form E = sum_h c_h prod_{q in h} r_q[h_q]; its 2n partial
 * derivatives come from prefix and suffix products over each term's support.
 * NLopt's L-BFGS minimizes it from the Hartree-Fock bits plus a small fixed
 * perturbation (so symmetric saddle points are left) and from further seeded
 * starts; the lowest wins, ties to the earlier start.  When no start beats the
 * Hartree-Fock bits by more than 1e-12 Eh, the reference is exactly those bits
 * (no qubit tilted).  Angles the optimizer leaves within rounding of a pole
 * are set to the pole when that raises the energy by at most 1e-10 Eh. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/util.h"

#include <math.h>
#include <nlopt.h>
#include <stdlib.h>
#include <string.h>

#define MF_STARTS 4
#define MF_SEED 0x6d65616e6669656cULL /* fixed: same reference every run */
#define MF_POLE 1e-12

void ans_reference_free(ans_reference *ref) {
  free(ref->bits);
  free(ref->theta);
  free(ref->phi);
  memset(ref, 0, sizeof *ref);
}

/* Terms of H as support lists, for fast repeated evaluation. */
typedef struct mf_terms {
  int n;
  size_t nt;
  double *c;       /* nt coefficients (real part) */
  size_t *off;     /* nt + 1 offsets into q/l */
  int *q;          /* qubit of each letter */
  signed char *l;  /* 0 X, 1 Y, 2 Z */
  double constant;
  int maxw;
  double *pre, *suf, *f;  /* scratch, maxw + 1 */
} mf_terms;

/* Flatten H into support lists (qubit, letter) per term; the identity goes
 * to the constant. */
static void mf_terms_init(mf_terms *m, const pauli_sum *H) {
  memset(m, 0, sizeof *m);
  m->n = H->n;
  size_t total = 0;
  for (size_t t = 0; t < H->len; t++) total += (size_t)pauli_word_weight(H->nw, pauli_sum_x(H, t), pauli_sum_z(H, t));
  m->c = xmalloc((H->len + 1) * sizeof *m->c);
  m->off = xmalloc((H->len + 1) * sizeof *m->off);
  m->q = xmalloc((total + 1) * sizeof *m->q);
  m->l = xmalloc(total + 1);
  size_t k = 0;
  for (size_t t = 0; t < H->len; t++) {
    const uint64_t *x = pauli_sum_x(H, t), *z = pauli_sum_z(H, t);
    if (pauli_word_is_identity(H->nw, x, z)) {
      m->constant += creal(H->c[t]);
      continue;
    }
    m->c[m->nt] = creal(H->c[t]);
    m->off[m->nt] = k;
    for (int i = 0; i < H->nw; i++) {
      uint64_t mm = x[i] | z[i];
      while (mm) {
        int b = __builtin_ctzll(mm);
        mm &= mm - 1;
        int xb = (int)((x[i] >> b) & 1), zb = (int)((z[i] >> b) & 1);
        m->q[k] = i * 64 + b;
        m->l[k] = (signed char)(xb ? (zb ? 1 : 0) : 2);
        k++;
      }
    }
    int w = (int)(k - m->off[m->nt]);
    if (w > m->maxw) m->maxw = w;
    m->nt++;
  }
  m->off[m->nt] = k;
  m->pre = xmalloc((size_t)(m->maxw + 2) * sizeof *m->pre);
  m->suf = xmalloc((size_t)(m->maxw + 2) * sizeof *m->suf);
  m->f = xmalloc((size_t)(m->maxw + 2) * sizeof *m->f);
}

static void mf_terms_free(mf_terms *m) {
  free(m->c);
  free(m->off);
  free(m->q);
  free(m->l);
  free(m->pre);
  free(m->suf);
  free(m->f);
}

/* Energy at angles x = (theta_0..theta_{n-1}, phi_0..phi_{n-1}); gradient
 * into g when not NULL. */
static double mf_energy(mf_terms *m, const double *x, double *g) {
  int n = m->n;
  const double *th = x, *ph = x + n;
  double *r = xmalloc(9 * (size_t)(n ? n : 1) * sizeof *r); /* r, dr/dtheta, dr/dphi */
  for (int q = 0; q < n; q++) {
    double st = sin(th[q]), ct = cos(th[q]), sp = sin(ph[q]), cp = cos(ph[q]);
    if (ans_angle_is_pole(th[q])) st = 0, ct = th[q] == 0 ? 1.0 : -1.0; /* exact at the poles */
    double *v = r + 9 * q;
    v[0] = st * cp, v[1] = st * sp, v[2] = ct;
    v[3] = ct * cp, v[4] = ct * sp, v[5] = -st;
    v[6] = -st * sp, v[7] = st * cp, v[8] = 0;
  }
  if (g) memset(g, 0, 2 * (size_t)n * sizeof *g);
  double e = m->constant;
  for (size_t t = 0; t < m->nt; t++) {
    size_t o = m->off[t];
    int w = (int)(m->off[t + 1] - o);
    double p = 1;
    for (int k = 0; k < w; k++) {
      m->f[k] = r[9 * m->q[o + k] + m->l[o + k]];
      p *= m->f[k];
    }
    e += m->c[t] * p;
    if (!g) continue;
    m->pre[0] = 1;
    for (int k = 0; k < w; k++) m->pre[k + 1] = m->pre[k] * m->f[k];
    m->suf[w] = 1;
    for (int k = w - 1; k >= 0; k--) m->suf[k] = m->suf[k + 1] * m->f[k];
    for (int k = 0; k < w; k++) {
      int q = m->q[o + k], l = m->l[o + k];
      double rest = m->c[t] * m->pre[k] * m->suf[k + 1];
      g[q] += rest * r[9 * q + 3 + l];
      g[n + q] += rest * r[9 * q + 6 + l];
    }
  }
  free(r);
  return e;
}

static double mf_objective(unsigned n, const double *x, double *grad, void *data) {
  (void)n;
  return mf_energy(data, x, grad);
}

double ans_product_energy(const pauli_sum *H, const ans_reference *ref) {
  int n = H->n;
  double *x = xcalloc(2 * (size_t)(n ? n : 1), sizeof *x);
  for (int q = 0; q < n; q++) {
    x[q] = ref->theta ? ref->theta[q] : (pauli_get_x(ref->bits, q) ? M_PI : 0.0);
    x[n + q] = ref->phi ? ref->phi[q] : 0.0;
  }
  double e;
  if (!ref->theta) {
    /* basis state: only Z-type terms, with signs */
    e = 0;
    for (size_t t = 0; t < H->len; t++) {
      const uint64_t *hx = pauli_sum_x(H, t), *hz = pauli_sum_z(H, t);
      int zero = 1, neg = 0;
      for (int i = 0; i < H->nw; i++) {
        if (hx[i]) zero = 0;
        neg += __builtin_popcountll(hz[i] & ref->bits[i]);
      }
      if (zero) e += creal(H->c[t]) * ((neg & 1) ? -1.0 : 1.0);
    }
  } else {
    mf_terms m;
    mf_terms_init(&m, H);
    e = mf_energy(&m, x, NULL);
    mf_terms_free(&m);
  }
  free(x);
  return e;
}

/* Bring (theta, phi) to theta in [0, pi], phi in [0, 2 pi), poles exact. */
static void normalize_angles(double *th, double *ph) {
  double t = fmod(*th, 2 * M_PI), p = *ph;
  if (t < 0) t += 2 * M_PI;
  if (t > M_PI) {
    t = 2 * M_PI - t;
    p += M_PI;
  }
  if (fabs(sin(t)) < MF_POLE) {
    t = cos(t) > 0 ? 0.0 : M_PI;
    p = 0;
  }
  p = fmod(p, 2 * M_PI);
  if (p < 0) p += 2 * M_PI;
  if (p >= 2 * M_PI) p = 0;
  *th = t;
  *ph = p;
}

/* Minimize the mean-field energy; fills ref->theta/phi. */
static void mean_field(ans_reference *ref, const pauli_sum *H) {
  int n = ref->nqubits;
  ref->theta = xcalloc((size_t)(n ? n : 1), sizeof *ref->theta);
  ref->phi = xcalloc((size_t)(n ? n : 1), sizeof *ref->phi);
  for (int q = 0; q < n; q++) ref->theta[q] = pauli_get_x(ref->bits, q) ? M_PI : 0.0;
  if (!H || n == 0) return;
  mf_terms m;
  mf_terms_init(&m, H);
  double *x = xmalloc(2 * (size_t)n * sizeof *x), *best = xmalloc(2 * (size_t)n * sizeof *best);
  for (int q = 0; q < n; q++) best[q] = ref->theta[q], best[n + q] = 0;
  double e_hf = mf_energy(&m, best, NULL), e_best = e_hf;
  util_rng rng;
  util_rng_seed(&rng, MF_SEED);
  nlopt_opt opt = nlopt_create(NLOPT_LD_LBFGS, (unsigned)(2 * n));
  nlopt_set_min_objective(opt, mf_objective, &m);
  nlopt_set_ftol_abs(opt, 1e-14);
  nlopt_set_ftol_rel(opt, 1e-15);
  nlopt_set_xtol_rel(opt, 1e-12);
  nlopt_set_maxeval(opt, 4000);
  for (int s = 0; s < MF_STARTS; s++) {
    double amp = s == 0 ? 0.05 : 0.6;
    for (int q = 0; q < n; q++) {
      x[q] = ref->theta[q] + amp * (2 * util_rng_uniform(&rng) - 1);
      x[n + q] = 2 * M_PI * util_rng_uniform(&rng);
    }
    double f = 0;
    nlopt_result rc = nlopt_optimize(opt, x, &f);
    if (rc < 0 && rc != NLOPT_ROUNDOFF_LIMITED) continue;
    f = mf_energy(&m, x, NULL);
    if (f < e_best - 1e-12) {
      e_best = f;
      memcpy(best, x, 2 * (size_t)n * sizeof *x);
    }
  }
  nlopt_destroy(opt);
  if (e_best < e_hf - 1e-12) {
    /* Qubits the optimizer left within rounding of a pole go to the pole
     * when that costs at most 1e-10 Eh: fewer tilted qubits, cheaper and
     * exact screening at the state actually used. */
    static const double snap[] = {1e-4, 1e-6, 1e-8};
    for (int q = 0; q < n; q++) normalize_angles(&best[q], &best[n + q]);
    memcpy(x, best, 2 * (size_t)n * sizeof *x);
    for (size_t k = 0; k < sizeof snap / sizeof snap[0]; k++) {
      for (int q = 0; q < n; q++) {
        x[q] = best[q], x[n + q] = best[n + q];
        if (fabs(sin(best[q])) < snap[k]) x[q] = cos(best[q]) > 0 ? 0.0 : M_PI, x[n + q] = 0;
      }
      if (mf_energy(&m, x, NULL) <= e_best + 1e-10) break;
      memcpy(x, best, 2 * (size_t)n * sizeof *x);
    }
    for (int q = 0; q < n; q++) {
      ref->theta[q] = x[q];
      ref->phi[q] = x[n + q];
    }
  }
  free(x);
  free(best);
  mf_terms_free(&m);
}

void ans_reference_build(ans_reference *ref, const ir_recipe *r, const ans_problem *p) {
  memset(ref, 0, sizeof *ref);
  ref->kind = r->reference.kind;
  ref->nqubits = p->nqubits;
  int nw = pauli_nwords(p->nqubits);
  ref->bits = xcalloc((size_t)nw, sizeof *ref->bits);
  if (p->taper && p->taper->nsym > 0) qubit_taper_bits(p->taper, p->ref_full, ref->bits);
  else memcpy(ref->bits, p->ref_full, (size_t)nw * sizeof *ref->bits);
  if (ref->kind == IR_REF_MEAN_FIELD) {
    mean_field(ref, p->H);
    for (int q = 0; q < ref->nqubits; q++)
      if (!ans_angle_is_pole(ref->theta[q])) ref->tilted++;
  }
  ref->energy = p->H ? ans_product_energy(p->H, ref) : NAN;
}
