/* ccsd.c — coupled cluster with singles and doubles over spin orbitals
 * (Stanton, Gauss, Watts, Bartlett, J. Chem. Phys. 94, 4334 (1991)), with
 * DIIS on the amplitudes.  The reference is the space's reference determinant;
 * the Fock matrix is that determinant's, so non-canonical references (ROHF
 * orbitals) are handled through the off-diagonal Fock terms of the equations.
 *
 * Spin orbitals are renumbered occupied first: i, j, m, n run over 0..o-1 and
 * a, b, e, f over 0..v-1 (virtual index a is spin orbital o+a of the
 * renumbering).  Integral blocks <pq||rs> are stored densely. */
#include "config.h"

#include "cairn/chem.h"
#include "cairn/util.h"

#include <cblas.h>
#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Below this many doubles amplitudes a loop runs on one thread: starting
 * threads would cost more than the work. */
enum { CCSD_PAR = 20000 };

typedef struct ccsd {
  int o, v;
  int *so;        /* o+v: renumbered index -> spin orbital */
  double *f;      /* (o+v)^2 Fock matrix */
  double *oooo, *ooov, *oovv, *ovvo, *ovov, *ovvv, *vvvv, *vvvo, *ovoo;
} ccsd;

/* <pq|rs> over spin orbitals from (pr|qs). */
static double so_int(const chem_space *s, int p, int q, int r, int t) {
  if ((p & 1) != (r & 1) || (q & 1) != (t & 1)) return 0;
  return s->h2[chem_h2_index(s->norb, p >> 1, r >> 1, q >> 1, t >> 1)];
}

/* <pq||rs> in the renumbering. */
static double anti(const chem_space *s, const int *so, int p, int q, int r, int t) {
  return so_int(s, so[p], so[q], so[r], so[t]) - so_int(s, so[p], so[q], so[t], so[r]);
}

/* Fill a block <p q || r t> with index ranges given by kinds ('o' or 'v'). */
static double *block(const chem_space *s, const ccsd *c, const char *kinds) {
  int dim[4], off[4];
  for (int k = 0; k < 4; k++) {
    dim[k] = kinds[k] == 'o' ? c->o : c->v;
    off[k] = kinds[k] == 'o' ? 0 : c->o;
  }
  size_t n = (size_t)dim[0] * dim[1] * dim[2] * dim[3];
  double *b = xmalloc((n ? n : 1) * sizeof(double));
#pragma omp parallel for collapse(2) schedule(static) if (n > CCSD_PAR)
  for (int p = 0; p < dim[0]; p++)
    for (int q = 0; q < dim[1]; q++)
      for (int r = 0; r < dim[2]; r++)
        for (int t = 0; t < dim[3]; t++)
          b[(((size_t)p * dim[1] + q) * dim[2] + r) * dim[3] + t] =
              anti(s, c->so, p + off[0], q + off[1], r + off[2], t + off[3]);
  return b;
}

static void ccsd_free(ccsd *c) {
  free(c->so);
  free(c->f);
  free(c->oooo), free(c->ooov), free(c->oovv), free(c->ovvo), free(c->ovov);
  free(c->ovvv), free(c->vvvv), free(c->vvvo), free(c->ovoo);
}

#define T1(i, a) t1[(size_t)(i) * v + (a)]
#define T2(i, j, a, b) t2[(((size_t)(i) * o + (j)) * v + (a)) * v + (b)]
#define OOOO(m, n, i, j) c->oooo[(((size_t)(m) * o + (n)) * o + (i)) * o + (j)]
#define OOOV(m, n, i, e) c->ooov[(((size_t)(m) * o + (n)) * o + (i)) * v + (e)]
#define OOVV(m, n, e, f) c->oovv[(((size_t)(m) * o + (n)) * v + (e)) * v + (f)]
#define OVVO(m, b, e, j) c->ovvo[(((size_t)(m) * v + (b)) * v + (e)) * o + (j)]
#define OVOV(m, a, i, f) c->ovov[(((size_t)(m) * v + (a)) * o + (i)) * v + (f)]
#define OVVV(m, a, e, f) c->ovvv[(((size_t)(m) * v + (a)) * v + (e)) * v + (f)]
#define VVVO(a, b, e, j) c->vvvo[(((size_t)(a) * v + (b)) * v + (e)) * o + (j)]
#define OVOO(m, b, i, j) c->ovoo[(((size_t)(m) * v + (b)) * o + (i)) * o + (j)]
#define FO(i, j) c->f[(size_t)(i) * (o + v) + (j)]
#define FOV(i, a) c->f[(size_t)(i) * (o + v) + o + (a)]
#define FVV(a, b) c->f[(size_t)(o + (a)) * (o + v) + o + (b)]

/* Correlation energy of amplitudes t1, t2. */
static double cc_energy(const ccsd *c, const double *t1, const double *t2) {
  int o = c->o, v = c->v;
  double e = 0;
  for (int i = 0; i < o; i++)
    for (int a = 0; a < v; a++) e += FOV(i, a) * T1(i, a);
  for (int i = 0; i < o; i++)
    for (int j = 0; j < o; j++)
      for (int a = 0; a < v; a++)
        for (int b = 0; b < v; b++) {
          double g = OOVV(i, j, a, b);
          e += 0.25 * g * T2(i, j, a, b) + 0.5 * g * T1(i, a) * T1(j, b);
        }
  return e;
}

/* One update: new amplitudes (before division by D) from t1, t2. */
static void cc_update(const ccsd *c, const double *t1, const double *t2, double *n1, double *n2) {
  int o = c->o, v = c->v;
  size_t oo = (size_t)o * o, vv = (size_t)v * v;
  double *tau = xmalloc(oo * vv * sizeof(double)), *taut = xmalloc(oo * vv * sizeof(double));
  for (int i = 0; i < o; i++)
    for (int j = 0; j < o; j++)
      for (int a = 0; a < v; a++)
        for (int b = 0; b < v; b++) {
          double x = T1(i, a) * T1(j, b) - T1(i, b) * T1(j, a);
          tau[((i * o + j) * (size_t)v + a) * v + b] = T2(i, j, a, b) + x;
          taut[((i * o + j) * (size_t)v + a) * v + b] = T2(i, j, a, b) + 0.5 * x;
        }
#define TAU(i, j, a, b) tau[(((size_t)(i) * o + (j)) * v + (a)) * v + (b)]
#define TAUT(i, j, a, b) taut[(((size_t)(i) * o + (j)) * v + (a)) * v + (b)]
  double *Fae = xmalloc(vv * sizeof(double)), *Fmi = xmalloc(oo * sizeof(double));
  double *Fme = xmalloc((size_t)o * v * sizeof(double));
  /* Fae */
#pragma omp parallel for schedule(static) if ((size_t)o * o * v * v > CCSD_PAR)
  for (int a = 0; a < v; a++)
    for (int e = 0; e < v; e++) {
      double x = a == e ? 0 : FVV(a, e);
      for (int m = 0; m < o; m++) {
        x -= 0.5 * FOV(m, e) * T1(m, a);
        for (int f = 0; f < v; f++) x += T1(m, f) * OVVV(m, a, f, e);
        for (int n = 0; n < o; n++)
          for (int f = 0; f < v; f++) x -= 0.5 * TAUT(m, n, a, f) * OOVV(m, n, e, f);
      }
      Fae[a * v + e] = x;
    }
  /* Fmi */
#pragma omp parallel for schedule(static) if ((size_t)o * o * v * v > CCSD_PAR)
  for (int m = 0; m < o; m++)
    for (int i = 0; i < o; i++) {
      double x = m == i ? 0 : FO(m, i);
      for (int e = 0; e < v; e++) {
        x += 0.5 * T1(i, e) * FOV(m, e);
        for (int n = 0; n < o; n++) {
          x += T1(n, e) * OOOV(m, n, i, e);
          for (int f = 0; f < v; f++) x += 0.5 * TAUT(i, n, e, f) * OOVV(m, n, e, f);
        }
      }
      Fmi[m * o + i] = x;
    }
  /* Fme */
  for (int m = 0; m < o; m++)
    for (int e = 0; e < v; e++) {
      double x = FOV(m, e);
      for (int n = 0; n < o; n++)
        for (int f = 0; f < v; f++) x += T1(n, f) * OOVV(m, n, e, f);
      Fme[m * v + e] = x;
    }
  /* Wmnij */
  double *Wmnij = xmalloc(oo * oo * sizeof(double));
  for (int m = 0; m < o; m++)
    for (int n = 0; n < o; n++)
      for (int i = 0; i < o; i++)
        for (int j = 0; j < o; j++) {
          double x = OOOO(m, n, i, j);
          for (int e = 0; e < v; e++) x += T1(j, e) * OOOV(m, n, i, e) - T1(i, e) * OOOV(m, n, j, e);
          for (int e = 0; e < v; e++)
            for (int f = 0; f < v; f++) x += 0.25 * TAU(i, j, e, f) * OOVV(m, n, e, f);
          Wmnij[((m * o + n) * (size_t)o + i) * o + j] = x;
        }
  /* Wabef = <ab||ef> - P(ab) sum_m t_m^b <am||ef> + 1/4 sum_mn tau_mn^ab <mn||ef>;
   * <am||ef> = -<ma||ef>. */
  double *Wabef = xmalloc(vv * vv * sizeof(double));
  memcpy(Wabef, c->vvvv, vv * vv * sizeof(double));
#pragma omp parallel for schedule(static) if ((size_t)o * o * v * v > CCSD_PAR)
  for (int a = 0; a < v; a++)
    for (int b = 0; b < v; b++) {
      double *w = Wabef + ((size_t)a * v + b) * vv;
      for (int m = 0; m < o; m++) {
        double tb = T1(m, b), ta = T1(m, a);
        const double *ma = c->ovvv + ((size_t)m * v + a) * vv, *mb = c->ovvv + ((size_t)m * v + b) * vv;
        for (size_t ef = 0; ef < vv; ef++) w[ef] += tb * ma[ef] - ta * mb[ef];
      }
    }
  /* + 1/4 tau^T[ab][mn] oovv[mn][ef] */
  cblas_dgemm(CblasRowMajor, CblasTrans, CblasNoTrans, (int)vv, (int)vv, (int)oo, 0.25, tau, (int)vv, c->oovv,
              (int)vv, 1.0, Wabef, (int)vv);
  /* Wmbej, stored [m][b][e][j] */
  double *Wmbej = xmalloc(oo * vv * sizeof(double));
#pragma omp parallel for collapse(2) schedule(static) if ((size_t)o * o * v * v > CCSD_PAR)
  for (int m = 0; m < o; m++)
    for (int b = 0; b < v; b++)
      for (int e = 0; e < v; e++)
        for (int j = 0; j < o; j++) {
          double x = OVVO(m, b, e, j);
          for (int f = 0; f < v; f++) x += T1(j, f) * OVVV(m, b, e, f);
          for (int n = 0; n < o; n++) x += T1(n, b) * OOOV(m, n, j, e); /* - t_n^b <mn||ej>, <mn||ej> = -<mn||je> */
          for (int n = 0; n < o; n++)
            for (int f = 0; f < v; f++)
              x -= (0.5 * T2(j, n, f, b) + T1(j, f) * T1(n, b)) * OOVV(m, n, e, f);
          Wmbej[(((size_t)m * v + b) * v + e) * o + j] = x;
        }
  /* T1 */
  for (int i = 0; i < o; i++)
    for (int a = 0; a < v; a++) {
      double x = FOV(i, a);
      for (int e = 0; e < v; e++) x += T1(i, e) * Fae[a * v + e];
      for (int m = 0; m < o; m++) x -= T1(m, a) * Fmi[m * o + i];
      for (int m = 0; m < o; m++)
        for (int e = 0; e < v; e++) {
          x += T2(i, m, a, e) * Fme[m * v + e];
          x -= T1(m, e) * OVOV(m, a, i, e);
          for (int f = 0; f < v; f++) x -= 0.5 * T2(i, m, e, f) * OVVV(m, a, e, f);
          for (int n = 0; n < o; n++) x += 0.5 * T2(m, n, a, e) * OOOV(n, m, i, e); /* <nm||ei> = -<nm||ie> */
        }
      n1[i * v + a] = x;
    }
  /* T2 */
  double *Ft = xmalloc(vv * sizeof(double)), *Fm2 = xmalloc(oo * sizeof(double));
  for (int b = 0; b < v; b++)
    for (int e = 0; e < v; e++) {
      double x = Fae[b * v + e];
      for (int m = 0; m < o; m++) x -= 0.5 * T1(m, b) * Fme[m * v + e];
      Ft[b * v + e] = x;
    }
  for (int m = 0; m < o; m++)
    for (int j = 0; j < o; j++) {
      double x = Fmi[m * o + j];
      for (int e = 0; e < v; e++) x += 0.5 * T1(j, e) * Fme[m * v + e];
      Fm2[m * o + j] = x;
    }
  /* 1/2 tau[ij][ef] Wabef[ab][ef]^T into n2 */
  cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasTrans, (int)oo, (int)vv, (int)vv, 0.5, tau, (int)vv, Wabef,
              (int)vv, 0.0, n2, (int)vv);
  /* the ring term Z[i a][j b] = sum_me t_im^ae Wmbej - t_i^e t_m^a <mb||ej>, by dgemm over (me) */
  size_t ov = (size_t)o * v;
  double *A = xmalloc(ov * ov * sizeof(double)), *B = xmalloc(ov * ov * sizeof(double));
  double *Z = xmalloc(ov * ov * sizeof(double));
  for (int i = 0; i < o; i++)
    for (int a = 0; a < v; a++)
      for (int m = 0; m < o; m++)
        for (int e = 0; e < v; e++) A[(i * v + a) * ov + m * v + e] = T2(i, m, a, e);
  for (int m = 0; m < o; m++)
    for (int e = 0; e < v; e++)
      for (int j = 0; j < o; j++)
        for (int b = 0; b < v; b++) B[(m * v + e) * ov + j * v + b] = Wmbej[(((size_t)m * v + b) * v + e) * o + j];
  cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasNoTrans, (int)ov, (int)ov, (int)ov, 1.0, A, (int)ov, B, (int)ov, 0.0,
              Z, (int)ov);
  /* - t_i^e t_m^a <mb||ej>: A2[ia][me] = t_i^e t_m^a, B2[me][jb] = <mb||ej> */
  for (int i = 0; i < o; i++)
    for (int a = 0; a < v; a++)
      for (int m = 0; m < o; m++)
        for (int e = 0; e < v; e++) A[(i * v + a) * ov + m * v + e] = T1(i, e) * T1(m, a);
  for (int m = 0; m < o; m++)
    for (int e = 0; e < v; e++)
      for (int j = 0; j < o; j++)
        for (int b = 0; b < v; b++) B[(m * v + e) * ov + j * v + b] = OVVO(m, b, e, j);
  cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasNoTrans, (int)ov, (int)ov, (int)ov, -1.0, A, (int)ov, B, (int)ov, 1.0,
              Z, (int)ov);
  free(A), free(B);
#define ZZ(i, a, j, b) Z[((size_t)(i) * v + (a)) * ov + (size_t)(j) * v + (b)]
#pragma omp parallel for collapse(2) schedule(static) if ((size_t)o * o * v * v > CCSD_PAR)
  for (int i = 0; i < o; i++)
    for (int j = 0; j < o; j++)
      for (int a = 0; a < v; a++)
        for (int b = 0; b < v; b++) {
          double x = OOVV(i, j, a, b);
          for (int e = 0; e < v; e++) x += T2(i, j, a, e) * Ft[b * v + e] - T2(i, j, b, e) * Ft[a * v + e];
          for (int m = 0; m < o; m++) x -= T2(i, m, a, b) * Fm2[m * o + j] - T2(j, m, a, b) * Fm2[m * o + i];
          for (int m = 0; m < o; m++)
            for (int n = 0; n < o; n++) x += 0.5 * TAU(m, n, a, b) * Wmnij[((m * o + n) * (size_t)o + i) * o + j];
          x += ZZ(i, a, j, b) - ZZ(j, a, i, b) - ZZ(i, b, j, a) + ZZ(j, b, i, a);
          for (int e = 0; e < v; e++) x += T1(i, e) * VVVO(a, b, e, j) - T1(j, e) * VVVO(a, b, e, i);
          for (int m = 0; m < o; m++) x -= T1(m, a) * OVOO(m, b, i, j) - T1(m, b) * OVOO(m, a, i, j);
          n2[(((size_t)i * o + j) * v + a) * v + b] += x;
        }
  free(Z), free(Ft), free(Fm2), free(tau), free(taut), free(Fae), free(Fmi), free(Fme), free(Wmnij);
  free(Wabef), free(Wmbej);
#undef TAU
#undef TAUT
#undef ZZ
}

int chem_ccsd(const chem_space *s, diag_ctx *d, chem_refs *refs) {
  refs->has_ccsd = 0;
  ccsd cc, *c = &cc;
  memset(c, 0, sizeof cc);
  int nso = 2 * s->norb;
  int o = s->nalpha + s->nbeta, v = nso - o;
  c->o = o;
  c->v = v;
  double eref = chem_reference_energy(s);
  if (o == 0 || v == 0) {
    refs->has_ccsd = 1;
    refs->ccsd_converged = 1;
    refs->ccsd = eref;
    return 0;
  }
  /* memory: the integral blocks, the intermediates and the DIIS store */
  double vv = (double)v * v, oo = (double)o * o;
  double need = 8.0 * (3 * vv * vv + vv * v * (2 * o) + 12 * oo * vv + 3 * (o * v) * (o * v) + 8 * 2 * oo * vv);
  uint64_t avail = util_mem_available();
  if (avail && need > 0.8 * (double)avail) {
    diag_report(d, DIAG_ERROR, DIAG_NOWHERE,
                "CCSD of %d electrons in %d orbitals needs %.1f GiB; %.1f GiB are available", o, s->norb,
                need / 1073741824.0, (double)avail / 1073741824.0);
    diag_help(d, "choose a smaller active space");
    return -1;
  }
  c->so = xmalloc((size_t)nso * sizeof(int));
  {
    int k = 0;
    for (int p = 0; p < nso; p++)
      if ((p & 1) ? (p >> 1) < s->nbeta : (p >> 1) < s->nalpha) c->so[k++] = p;
    for (int p = 0; p < nso; p++)
      if (!((p & 1) ? (p >> 1) < s->nbeta : (p >> 1) < s->nalpha)) c->so[k++] = p;
  }
  /* Fock matrix of the reference: f_pq = h_pq + sum_k <pk||qk> */
  c->f = xmalloc((size_t)nso * nso * sizeof(double));
  for (int p = 0; p < nso; p++)
    for (int q = 0; q < nso; q++) {
      int P = c->so[p], Q = c->so[q];
      double x = (P & 1) == (Q & 1) ? s->h1[(P >> 1) * s->norb + (Q >> 1)] : 0;
      for (int k = 0; k < o; k++) x += anti(s, c->so, p, k, q, k);
      c->f[(size_t)p * nso + q] = x;
    }
  c->oooo = block(s, c, "oooo");
  c->ooov = block(s, c, "ooov");
  c->oovv = block(s, c, "oovv");
  c->ovvo = block(s, c, "ovvo");
  c->ovov = block(s, c, "ovov");
  c->ovvv = block(s, c, "ovvv");
  c->vvvv = block(s, c, "vvvv");
  c->vvvo = block(s, c, "vvvo");
  c->ovoo = block(s, c, "ovoo");
  size_t n1 = (size_t)o * v, n2 = (size_t)o * o * v * v, nt = n1 + n2;
  double *t = xcalloc(nt, sizeof(double)), *tn = xmalloc(nt * sizeof(double));
  double *t1 = t, *t2 = t + n1;
  double *D1 = xmalloc(n1 * sizeof(double)), *D2 = xmalloc(n2 * sizeof(double));
  for (int i = 0; i < o; i++)
    for (int a = 0; a < v; a++) D1[i * v + a] = FO(i, i) - FVV(a, a);
  for (int i = 0; i < o; i++)
    for (int j = 0; j < o; j++)
      for (int a = 0; a < v; a++)
        for (int b = 0; b < v; b++)
          D2[(((size_t)i * o + j) * v + a) * v + b] = FO(i, i) + FO(j, j) - FVV(a, a) - FVV(b, b);
  /* first-order start */
  for (int i = 0; i < o; i++)
    for (int a = 0; a < v; a++) T1(i, a) = FOV(i, a) / D1[i * v + a];
  for (size_t k = 0; k < n2; k++) t2[k] = c->oovv[k] / D2[k];
  enum { NDIIS = 8, MAXIT = 200 };
  double *hist = xmalloc((size_t)NDIIS * nt * sizeof(double)), *errs = xmalloc((size_t)NDIIS * nt * sizeof(double));
  int nh = 0, next = 0, converged = 0, it;
  double e = cc_energy(c, t1, t2), eold = e, rms = 0;
  for (it = 1; it <= MAXIT; it++) {
    cc_update(c, t1, t2, tn, tn + n1);
    for (size_t k = 0; k < n1; k++) tn[k] /= D1[k];
    for (size_t k = 0; k < n2; k++) tn[n1 + k] /= D2[k];
    double ss = 0;
    for (size_t k = 0; k < nt; k++) ss += (tn[k] - t[k]) * (tn[k] - t[k]);
    rms = sqrt(ss / nt);
    /* DIIS on the amplitudes, error = change of the amplitudes */
    double *er = errs + (size_t)next * nt, *hv = hist + (size_t)next * nt;
    for (size_t k = 0; k < nt; k++) er[k] = tn[k] - t[k];
    memcpy(hv, tn, nt * sizeof(double));
    next = (next + 1) % NDIIS;
    if (nh < NDIIS) nh++;
    memcpy(t, tn, nt * sizeof(double));
    if (nh >= 3) {
      int dim = nh + 1;
      double B[(NDIIS + 1) * (NDIIS + 1)], r[NDIIS + 1];
      lapack_int piv[NDIIS + 1];
      for (int a = 0; a < nh; a++)
        for (int b = 0; b <= a; b++)
          B[a * dim + b] = B[b * dim + a] = cblas_ddot((int)nt, errs + (size_t)a * nt, 1, errs + (size_t)b * nt, 1);
      double mx = 0;
      for (int a = 0; a < nh; a++) mx = fmax(mx, B[a * dim + a]);
      for (int a = 0; a < nh; a++) {
        for (int b = 0; b < nh; b++) B[a * dim + b] /= mx > 0 ? mx : 1;
        B[a * dim + nh] = B[nh * dim + a] = -1;
        r[a] = 0;
      }
      B[nh * dim + nh] = 0;
      r[nh] = -1;
      if (LAPACKE_dgesv(LAPACK_ROW_MAJOR, dim, 1, B, dim, piv, r, 1) == 0) {
        memset(t, 0, nt * sizeof(double));
        for (int a = 0; a < nh; a++) cblas_daxpy((int)nt, r[a], hist + (size_t)a * nt, 1, t, 1);
      }
    }
    e = cc_energy(c, t1, t2);
    if (fabs(e - eold) < 1e-12 && rms < 1e-10) {
      converged = 1;
      break;
    }
    eold = e;
  }
  refs->has_ccsd = 1;
  refs->ccsd_converged = converged;
  refs->ccsd = eref + e;
  if (!converged)
    diag_report(d, DIAG_WARNING, DIAG_NOWHERE,
                "CCSD did not converge in %d iterations (last amplitude change %.1e); its energy is not reliable",
                MAXIT, rms);
  free(t), free(tn), free(D1), free(D2), free(hist), free(errs);
  ccsd_free(c);
  return 0;
}
