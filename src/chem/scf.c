/* scf.c — RHF and ROHF with DIIS and a superposition-of-atomic-densities
 * start; see scf.h.  Matrices are row-major nbf x nbf; the AO electron
 * repulsion integrals are held in full (nbf^4) so that Coulomb and exchange
 * matrices are plain contractions. */
#include "config.h"

#include "cairn/scf.h"
#include "cairn/util.h"

#include <cblas.h>
#include <lapacke.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void scf_options_default(scf_options *o) {
  o->max_iter = 200;
  o->e_tol = 1e-10;
  o->d_tol = 1e-8;
  o->diis_size = 8;
}

void scf_result_free(scf_result *r) {
  if (!r) return;
  free(r->C);
  free(r->eps);
  free(r->H);
  free(r->eri);
  memset(r, 0, sizeof *r);
}

/* C = op(A) op(B), all n x n. */
static void mm(int n, int ta, int tb, const double *A, const double *B, double *C) {
  cblas_dgemm(CblasRowMajor, ta ? CblasTrans : CblasNoTrans, tb ? CblasTrans : CblasNoTrans, n, n, n, 1.0, A, n, B,
              n, 0.0, C, n);
}

/* Eigen-decomposition of symmetric A (n x n): vectors into V (columns), values
 * ascending into w.  0 on success. */
static int eigh(int n, const double *A, double *V, double *w) {
  memcpy(V, A, sizeof(double) * n * n);
  return LAPACKE_dsyevd(LAPACK_ROW_MAJOR, 'V', 'U', n, V, n, w) == 0 ? 0 : -1;
}

/* J[mn] = sum_ls (mn|ls) D[ls];  K[mn] = sum_ls (ml|ns) D[ls] (either may be NULL). */
static void build_jk(int n, const double *eri, const double *D, double *J, double *K) {
  size_t n2 = (size_t)n * n;
  if (J) cblas_dgemv(CblasRowMajor, CblasNoTrans, (int)n2, (int)n2, 1.0, eri, (int)n2, D, 1, 0.0, J, 1);
  if (K) {
#pragma omp parallel for schedule(static) if (n >= 40)
    for (int m = 0; m < n; m++) {
      double *km = K + (size_t)m * n;
      for (int v = 0; v < n; v++) km[v] = 0;
      for (int l = 0; l < n; l++) {
        const double *slab = eri + ((size_t)m * n + l) * n2; /* [v][s] = (ml|vs) */
        const double *dl = D + (size_t)l * n;
        for (int v = 0; v < n; v++) {
          const double *row = slab + (size_t)v * n;
          double s = 0;
          for (int t = 0; t < n; t++) s += row[t] * dl[t];
          km[v] += s;
        }
      }
    }
  }
}

/* Pulay DIIS: a ring of (F, error) pairs; extrapolate F = sum c_i F_i with
 * sum c_i = 1 minimizing |sum c_i e_i|. */
typedef struct diis {
  int n2, max, count, next;
  double *F, *E;
} diis;

static void diis_init(diis *d, int n2, int max) {
  d->n2 = n2;
  d->max = max;
  d->count = d->next = 0;
  d->F = xmalloc((size_t)max * n2 * sizeof(double));
  d->E = xmalloc((size_t)max * n2 * sizeof(double));
}

static void diis_free(diis *d) {
  free(d->F);
  free(d->E);
}

static void diis_push(diis *d, const double *F, const double *E) {
  memcpy(d->F + (size_t)d->next * d->n2, F, sizeof(double) * d->n2);
  memcpy(d->E + (size_t)d->next * d->n2, E, sizeof(double) * d->n2);
  d->next = (d->next + 1) % d->max;
  if (d->count < d->max) d->count++;
}

/* Extrapolated F into out; falls back to the newest F when the system is
 * singular even after dropping the oldest vectors. */
static void diis_extrapolate(const diis *d, double *out) {
  int m = d->count;
  int newest = (d->next - 1 + d->max) % d->max;
  for (int use = m; use >= 2; use--) {
    /* the `use` newest vectors */
    int idx[64];
    for (int k = 0; k < use; k++) idx[k] = (newest - k + d->max) % d->max;
    int dim = use + 1;
    double B[65 * 65], rhs[65];
    lapack_int piv[65];
    for (int i = 0; i < use; i++)
      for (int j = 0; j <= i; j++) {
        double v = cblas_ddot(d->n2, d->E + (size_t)idx[i] * d->n2, 1, d->E + (size_t)idx[j] * d->n2, 1);
        B[i * dim + j] = B[j * dim + i] = v;
      }
    for (int i = 0; i < use; i++) {
      B[i * dim + use] = B[use * dim + i] = -1;
      rhs[i] = 0;
    }
    B[use * dim + use] = 0;
    rhs[use] = -1;
    /* scale for conditioning */
    double mx = 0;
    for (int i = 0; i < use; i++) mx = fmax(mx, B[i * dim + i]);
    if (mx > 0)
      for (int i = 0; i < use; i++)
        for (int j = 0; j < use; j++) B[i * dim + j] /= mx;
    if (LAPACKE_dgesv(LAPACK_ROW_MAJOR, dim, 1, B, dim, piv, rhs, 1) != 0) continue;
    int ok = 1;
    for (int i = 0; i < use; i++) ok &= isfinite(rhs[i]) && fabs(rhs[i]) < 1e6;
    if (!ok) continue;
    memset(out, 0, sizeof(double) * d->n2);
    for (int k = 0; k < use; k++) cblas_daxpy(d->n2, rhs[k], d->F + (size_t)idx[k] * d->n2, 1, out, 1);
    return;
  }
  memcpy(out, d->F + (size_t)newest * d->n2, sizeof(double) * d->n2);
}

/* Symmetric orthogonalizer X = S^(-1/2).  -1 when S is nearly singular. */
static int orthogonalizer(int n, const double *S, double *X, double *smin) {
  double *V = xmalloc(sizeof(double) * n * n), *w = xmalloc(sizeof(double) * n);
  if (eigh(n, S, V, w) != 0) {
    free(V), free(w);
    return -1;
  }
  *smin = w[0];
  if (w[0] < 1e-7) {
    free(V), free(w);
    return -1;
  }
  for (int i = 0; i < n; i++)
    for (int j = 0; j < n; j++) {
      double v = 0;
      for (int k = 0; k < n; k++) v += V[i * n + k] * V[j * n + k] / sqrt(w[k]);
      X[i * n + j] = v;
    }
  free(V), free(w);
  return 0;
}

/* Diagonalize F in the orthogonal basis: C = X eig(X F X), eigenvalues in eps. */
static void diag_fock(int n, const double *F, const double *X, double *C, double *eps, double *t1, double *t2) {
  mm(n, 0, 0, F, X, t1);
  mm(n, 1, 0, X, t1, t2); /* X^T F X (X symmetric) */
  eigh(n, t2, t1, eps);
  mm(n, 0, 0, X, t1, C);
}

/* D = sum_i occ_i C_i C_i^T over the first nocc columns, weight w. */
static void density(int n, const double *C, int nocc, double w, double *D) {
  if (nocc == 0) {
    memset(D, 0, sizeof(double) * n * n);
    return;
  }
  cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasTrans, n, n, nocc, w, C, n, C, n, 0.0, D, n);
}

static double rms_diff(int n2, const double *a, const double *b) {
  double s = 0;
  for (int i = 0; i < n2; i++) s += (a[i] - b[i]) * (a[i] - b[i]);
  return sqrt(s / n2);
}

/* Spherically averaged density of a neutral atom of element z in basis bs:
 * restricted SCF with fractional occupations, electrons spread evenly over
 * each set of degenerate orbitals (so a spherical start stays spherical).
 * D (nf x nf) is the total density. */
static void sad_atom(const basis_set *bs, int z, int nf, double *D) {
  ir_atom at;
  memset(&at, 0, sizeof at);
  at.z = z;
  int_basis ib;
  int_basis_build(bs, &at, 1, &ib);
  int n = ib.nbf;
  size_t n2 = (size_t)n * n;
  double *S = xmalloc(n2 * sizeof(double)), *H = xmalloc(n2 * sizeof(double)), *V = xmalloc(n2 * sizeof(double));
  double *eri = xmalloc(n2 * n2 * sizeof(double));
  int_overlap(&ib, S);
  int_kinetic(&ib, H);
  int_nuclear(&ib, V);
  for (size_t i = 0; i < n2; i++) H[i] += V[i];
  int_eri(&ib, 1e-14, eri);
  double *X = xmalloc(n2 * sizeof(double)), *F = xmalloc(n2 * sizeof(double)), *J = xmalloc(n2 * sizeof(double)),
         *K = xmalloc(n2 * sizeof(double)), *C = xmalloc(n2 * sizeof(double)), *eps = xmalloc(n * sizeof(double)),
         *t1 = xmalloc(n2 * sizeof(double)), *t2 = xmalloc(n2 * sizeof(double)),
         *Err = xmalloc(n2 * sizeof(double)), *occ = xmalloc(n * sizeof(double));
  double smin;
  memset(D, 0, sizeof(double) * nf * nf);
  if (orthogonalizer(n, S, X, &smin) == 0) {
    diis dd;
    diis_init(&dd, (int)n2, 6);
    memcpy(F, H, n2 * sizeof(double));
    double eold = 0;
    for (int it = 0; it < 60; it++) {
      if (it > 1) {
        diis_extrapolate(&dd, t2);
        memcpy(F, t2, n2 * sizeof(double));
      }
      diag_fock(n, F, X, C, eps, t1, t2);
      /* occupations: fill degenerate groups evenly */
      double left = z;
      for (int i = 0; i < n;) {
        int j = i + 1;
        while (j < n && fabs(eps[j] - eps[i]) < 1e-4) j++;
        double cap = 2.0 * (j - i), put = left < cap ? left : cap;
        for (int k = i; k < j; k++) occ[k] = put / (j - i);
        left -= put;
        i = j;
      }
      memset(D, 0, n2 * sizeof(double));
      for (int k = 0; k < n; k++)
        if (occ[k] > 0)
          for (int a = 0; a < n; a++)
            for (int b = 0; b < n; b++) D[a * n + b] += occ[k] * C[a * n + k] * C[b * n + k];
      build_jk(n, eri, D, J, K);
      double e = 0;
      for (size_t i = 0; i < n2; i++) {
        F[i] = H[i] + J[i] - 0.5 * K[i];
        e += 0.5 * D[i] * (H[i] + F[i]);
      }
      /* error FDS - SDF */
      mm(n, 0, 0, F, D, t1);
      mm(n, 0, 0, t1, S, t2);
      mm(n, 0, 0, S, D, t1);
      mm(n, 0, 0, t1, F, Err);
      for (size_t i = 0; i < n2; i++) Err[i] = t2[i] - Err[i];
      diis_push(&dd, F, Err);
      if (it > 0 && fabs(e - eold) < 1e-8) break;
      eold = e;
    }
    diis_free(&dd);
  }
  free(S), free(H), free(V), free(eri), free(X), free(F), free(J), free(K), free(C), free(eps), free(t1), free(t2);
  free(Err), free(occ);
  int_basis_free(&ib);
}

/* The superposition of atomic densities of the molecule (block diagonal). */
static void sad_guess(const int_basis *ib, const basis_set *bs, double *D) {
  int n = ib->nbf;
  memset(D, 0, sizeof(double) * n * n);
  for (int a = 0; a < ib->natoms; a++) {
    int z = (int)ib->charge[a];
    int s0 = ib->atom_start[a], nf = ib->atom_start[a + 1] - s0;
    int prev = -1;
    for (int b = 0; b < a; b++)
      if ((int)ib->charge[b] == z) prev = b;
    double *Da = xmalloc(sizeof(double) * nf * nf);
    if (prev >= 0) {
      int p0 = ib->atom_start[prev];
      for (int i = 0; i < nf; i++)
        for (int j = 0; j < nf; j++) Da[i * nf + j] = D[(p0 + i) * n + p0 + j];
    } else sad_atom(bs, z, nf, Da);
    for (int i = 0; i < nf; i++)
      for (int j = 0; j < nf; j++) D[(s0 + i) * n + s0 + j] = Da[i * nf + j];
    free(Da);
  }
}

scf_status scf_run(const int_basis *ib, const basis_set *bs, int nalpha, int nbeta, const scf_options *o,
                   scf_result *out) {
  memset(out, 0, sizeof *out);
  int n = ib->nbf;
  size_t n2 = (size_t)n * n;
  out->nbf = n;
  out->nalpha = nalpha;
  out->nbeta = nbeta;
  out->e_nuclear = int_nuclear_repulsion(ib);
  if (nalpha > n || nbeta > nalpha || nbeta < 0) {
    snprintf(out->message, sizeof out->message, "%d alpha and %d beta electrons do not fit in %d orbitals", nalpha,
             nbeta, n);
    return SCF_FAILED;
  }
  uint64_t need = int_eri_bytes(ib) + 24 * n2 * sizeof(double);
  uint64_t avail = util_mem_available();
  if (avail && need > 0.8 * (double)avail) {
    snprintf(out->message, sizeof out->message,
             "the %d basis functions need %.1f GiB for the integrals; %.1f GiB are available", n,
             (double)need / 1073741824.0, (double)avail / 1073741824.0);
    return SCF_FAILED;
  }
  double t0 = util_now();
  double *S = xmalloc(n2 * sizeof(double)), *H = xmalloc(n2 * sizeof(double));
  double *eri = xmalloc(int_eri_bytes(ib));
  int_overlap(ib, S);
  int_kinetic(ib, H);
  {
    double *V = xmalloc(n2 * sizeof(double));
    int_nuclear(ib, V);
    for (size_t i = 0; i < n2; i++) H[i] += V[i];
    free(V);
  }
  int_eri(ib, 1e-14, eri);
  double t1s = util_now();
  out->seconds_integrals = t1s - t0;
  out->H = H;
  out->eri = eri;
  out->C = xmalloc(n2 * sizeof(double));
  out->eps = xmalloc((size_t)n * sizeof(double));

  double *X = xmalloc(n2 * sizeof(double));
  double smin = 0;
  if (orthogonalizer(n, S, X, &smin) != 0) {
    snprintf(out->message, sizeof out->message,
             "the basis set is nearly linearly dependent (smallest overlap eigenvalue %.3g)", smin);
    free(S), free(X);
    return SCF_FAILED;
  }
  int rohf = nalpha != nbeta;
  double *Da = xmalloc(n2 * sizeof(double)), *Db = xmalloc(n2 * sizeof(double)), *Dt = xmalloc(n2 * sizeof(double));
  double *Dold = xmalloc(n2 * sizeof(double)), *J = xmalloc(n2 * sizeof(double)), *Ka = xmalloc(n2 * sizeof(double));
  double *Kb = xmalloc(n2 * sizeof(double)), *Fa = xmalloc(n2 * sizeof(double)), *Fb = xmalloc(n2 * sizeof(double));
  double *F = xmalloc(n2 * sizeof(double)), *Err = xmalloc(n2 * sizeof(double)), *t1 = xmalloc(n2 * sizeof(double));
  double *t2 = xmalloc(n2 * sizeof(double)), *t3 = xmalloc(n2 * sizeof(double)), *C = out->C, *eps = out->eps;
  double *Cp = xmalloc(n2 * sizeof(double)); /* orbitals in the orthogonal basis */
  diis dd;
  diis_init(&dd, (int)n2, o->diis_size);

  /* start: the Fock matrix of the atomic densities, diagonalized */
  sad_guess(ib, bs, Dt);
  build_jk(n, eri, Dt, J, Ka);
  for (size_t i = 0; i < n2; i++) F[i] = H[i] + J[i] - 0.5 * Ka[i];
  diag_fock(n, F, X, C, eps, t1, t2);
  density(n, C, nalpha, 1.0, Da);
  density(n, C, nbeta, 1.0, Db);
  for (size_t i = 0; i < n2; i++) Dt[i] = Da[i] + Db[i];

  double e = 0, eold = 0;
  scf_status st = SCF_NOT_CONVERGED;
  int it;
  for (it = 1; it <= o->max_iter; it++) {
    if (!rohf) {
      build_jk(n, eri, Dt, J, Ka);
      e = out->e_nuclear;
      for (size_t i = 0; i < n2; i++) {
        F[i] = H[i] + J[i] - 0.5 * Ka[i];
        e += 0.5 * Dt[i] * (H[i] + F[i]);
      }
      /* error X (F D S - S D F) X */
      mm(n, 0, 0, F, Dt, t1);
      mm(n, 0, 0, t1, S, t2);
      for (int i = 0; i < n; i++)
        for (int j = 0; j < n; j++) t3[i * n + j] = t2[i * n + j] - t2[j * n + i];
      mm(n, 0, 0, t3, X, t1);
      mm(n, 1, 0, X, t1, Err);
    } else {
      build_jk(n, eri, Dt, J, NULL);
      build_jk(n, eri, Da, NULL, Ka);
      build_jk(n, eri, Db, NULL, Kb);
      e = out->e_nuclear;
      for (size_t i = 0; i < n2; i++) {
        Fa[i] = H[i] + J[i] - Ka[i];
        Fb[i] = H[i] + J[i] - Kb[i];
        e += 0.5 * (Da[i] * (H[i] + Fa[i]) + Db[i] * (H[i] + Fb[i]));
      }
      /* effective Fock matrix in the current orbitals, then back to the AO
       * basis as F = S C Feff C^T S (so that diagonalizing it as usual
       * reproduces Feff's eigenvectors) */
      mm(n, 0, 0, Fa, C, t1);
      mm(n, 1, 0, C, t1, t2); /* Fa in MO */
      mm(n, 0, 0, Fb, C, t1);
      mm(n, 1, 0, C, t1, t3); /* Fb in MO */
      double *Fm = Fa;        /* reuse Fa's storage for Feff (MO) after this */
      double *Em = Fb;
      for (int i = 0; i < n; i++)
        for (int j = 0; j < n; j++) {
          int ci = i < nbeta ? 0 : i < nalpha ? 1 : 2, cj = j < nbeta ? 0 : j < nalpha ? 1 : 2;
          double fa = t2[i * n + j], fb = t3[i * n + j], fc = 0.5 * (fa + fb), v;
          if (ci == cj) v = fc;
          else if ((ci == 0 && cj == 1) || (ci == 1 && cj == 0)) v = fb;
          else if ((ci == 1 && cj == 2) || (ci == 2 && cj == 1)) v = fa;
          else v = fc;
          t1[i * n + j] = v;
        }
      memcpy(Fm, t1, n2 * sizeof(double));
      for (int i = 0; i < n; i++)
        for (int j = 0; j < n; j++) {
          int ci = i < nbeta ? 0 : i < nalpha ? 1 : 2, cj = j < nbeta ? 0 : j < nalpha ? 1 : 2;
          Em[i * n + j] = ci != cj ? (ci < cj ? Fm[i * n + j] : -Fm[i * n + j]) : 0;
        }
      /* to the orthogonal basis: Cp = X^-1 C = X S C; M_orth = Cp M Cp^T */
      mm(n, 0, 0, S, C, t1);
      mm(n, 0, 0, X, t1, Cp);
      mm(n, 0, 1, Fm, Cp, t1);
      mm(n, 0, 0, Cp, t1, t2); /* Feff orth */
      mm(n, 0, 1, Em, Cp, t1);
      mm(n, 0, 0, Cp, t1, Err);
      /* store Feff in the AO form used below: F = X^-1 Feff_orth X^-1 = S X Feff_orth X S */
      mm(n, 0, 0, t2, X, t1);
      mm(n, 0, 0, X, t1, t3);
      mm(n, 0, 0, S, t3, t1);
      mm(n, 0, 0, t1, S, F);
    }
    diis_push(&dd, F, Err);
    double dD = rms_diff((int)n2, Dt, Dold);
    out->last_de = fabs(e - eold);
    out->last_dd = dD;
    if (it > 1 && fabs(e - eold) < o->e_tol && dD < o->d_tol) {
      st = SCF_OK;
      break;
    }
    eold = e;
    memcpy(Dold, Dt, n2 * sizeof(double));
    diis_extrapolate(&dd, t3);
    diag_fock(n, t3, X, C, eps, t1, t2);
    density(n, C, nalpha, 1.0, Da);
    density(n, C, nbeta, 1.0, Db);
    for (size_t i = 0; i < n2; i++) Dt[i] = Da[i] + Db[i];
  }
  out->iterations = it > o->max_iter ? o->max_iter : it;
  out->energy = e;
  /* canonical orbitals of the converged (not extrapolated) Fock matrix */
  if (st == SCF_OK) diag_fock(n, F, X, C, eps, t1, t2);
  out->seconds_scf = util_now() - t1s;
  diis_free(&dd);
  free(S), free(X), free(Da), free(Db), free(Dt), free(Dold), free(J), free(Ka), free(Kb), free(Fa), free(Fb);
  free(F), free(Err), free(t1), free(t2), free(t3), free(Cp);
  return st;
}

void scf_active_space(const scf_result *r, const int *core, int ncore, const int *active, int nact, int nalpha,
                      int nbeta, chem_space *out) {
  int n = r->nbf, m = nact;
  size_t n2 = (size_t)n * n;
  memset(out, 0, sizeof *out);
  /* AO core density and the Fock-like operator of the core */
  double *Dc = xcalloc(n2, sizeof(double)), *J = xmalloc(n2 * sizeof(double)), *K = xmalloc(n2 * sizeof(double));
  double *Fc = xmalloc(n2 * sizeof(double));
  for (int c = 0; c < ncore; c++)
    for (int a = 0; a < n; a++)
      for (int b = 0; b < n; b++) Dc[a * n + b] += 2.0 * r->C[a * n + core[c]] * r->C[b * n + core[c]];
  double ecore = 0;
  if (ncore > 0) {
    build_jk(n, r->eri, Dc, J, K);
    for (size_t i = 0; i < n2; i++) {
      Fc[i] = r->H[i] + J[i] - 0.5 * K[i];
      ecore += 0.5 * Dc[i] * (r->H[i] + Fc[i]);
    }
  } else memcpy(Fc, r->H, n2 * sizeof(double));
  /* active orbital coefficients, n x m */
  double *Ca = xmalloc((size_t)n * m * sizeof(double));
  for (int a = 0; a < n; a++)
    for (int k = 0; k < m; k++) Ca[a * m + k] = r->C[a * n + active[k]];
  out->norb = m;
  out->nalpha = nalpha;
  out->nbeta = nbeta;
  out->e_nuclear = r->e_nuclear;
  out->has_nuclear = 1;
  out->e_constant = r->e_nuclear + ecore;
  out->h1 = xmalloc((size_t)m * m * sizeof(double));
  {
    double *t = xmalloc((size_t)n * m * sizeof(double));
    cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasNoTrans, n, m, n, 1.0, Fc, n, Ca, m, 0.0, t, m);
    cblas_dgemm(CblasRowMajor, CblasTrans, CblasNoTrans, m, m, n, 1.0, Ca, m, t, m, 0.0, out->h1, m);
    free(t);
  }
  /* (pq|rs): the array as a matrix [mu nu][la si]; transform the last two
   * indices of every row, transpose, and transform them again. */
  size_t m2 = (size_t)m * m;
  double *A = xmalloc(n2 * n * m * sizeof(double));  /* [mu nu la][s] */
  cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasNoTrans, (int)(n2 * n), m, n, 1.0, r->eri, n, Ca, m, 0.0, A, m);
  double *B = xmalloc(n2 * m2 * sizeof(double));  /* [mu nu][r s] */
#pragma omp parallel for schedule(static) if (n >= 40)
  for (size_t mn = 0; mn < n2; mn++)
    cblas_dgemm(CblasRowMajor, CblasTrans, CblasNoTrans, m, m, n, 1.0, Ca, m, A + mn * n * m, m, 0.0, B + mn * m2,
                (int)m);
  free(A);
  double *Bt = xmalloc(n2 * m2 * sizeof(double));  /* [r s][mu nu] */
  for (size_t mn = 0; mn < n2; mn++)
    for (size_t rs = 0; rs < m2; rs++) Bt[rs * n2 + mn] = B[mn * m2 + rs];
  free(B);
  double *A2 = xmalloc(m2 * n * m * sizeof(double));  /* [r s mu][q] */
  cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasNoTrans, (int)(m2 * n), m, n, 1.0, Bt, n, Ca, m, 0.0, A2, m);
  free(Bt);
  out->h2 = xmalloc(m2 * m2 * sizeof(double));  /* [r s][p q] = (pq|rs) = (rs|pq) */
#pragma omp parallel for schedule(static) if (n >= 40)
  for (size_t rs = 0; rs < m2; rs++)
    cblas_dgemm(CblasRowMajor, CblasTrans, CblasNoTrans, m, m, n, 1.0, Ca, m, A2 + rs * n * m, m, 0.0,
                out->h2 + rs * m2, m);
  free(A2);
  out->orbital_energies = xmalloc((size_t)m * sizeof(double));
  for (int k = 0; k < m; k++) out->orbital_energies[k] = r->eps[active[k]];
  free(Dc), free(J), free(K), free(Fc), free(Ca);
}
