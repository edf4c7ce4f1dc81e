/* integrals.c — overlap, kinetic, nuclear-attraction and electron-repulsion
 * integrals over contracted Gaussian shells (McMurchie-Davidson).
 *
 * Notation (Helgaker, Jorgensen, Olsen, Molecular Electronic-Structure Theory,
 * ch. 9): a product of primitives with exponents a, b on centres A, B is a
 * Gaussian of exponent p = a + b on P = (aA + bB)/p, expanded per axis in
 * Hermite Gaussians with coefficients E^{ij}_t; Coulomb integrals are sums of
 * Hermite integrals R_tuv(alpha, R), built from the Boys function.
 *
 * Integrals are first made over "raw" cartesian components (every component of
 * a shell scaled like its x^l component) and then transformed by a per-shell
 * matrix into normalized cartesian or real solid-harmonic functions.
 */
#include "config.h"

#include "cairn/integrals.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#ifdef _OPENMP
#include <omp.h>
#endif

enum { LMAX = BASIS_MAXL, NCMAX = (LMAX + 1) * (LMAX + 2) / 2, EJ = LMAX + 3, ET = 2 * LMAX + 3 };

/* Index of Hermite (t,u,v) in the order: total n = t+u+v, then s = u+v, then v. */
static inline int hidx(int t, int u, int v) {
  int n = t + u + v, s = u + v;
  return n * (n + 1) * (n + 2) / 6 + s * (s + 1) / 2 + v;
}
static inline int nherm(int L) { return (L + 1) * (L + 2) * (L + 3) / 6; }

/* Cartesian components of angular momentum l in the order xx, xy, xz, yy, ... */
static void cart_comps(int l, int (*c)[3]) {
  int k = 0;
  for (int a = l; a >= 0; a--)
    for (int b = l - a; b >= 0; b--) {
      c[k][0] = a;
      c[k][1] = b;
      c[k][2] = l - a - b;
      k++;
    }
}

static double dfact(int n) { /* (n)!! for n >= -1 */
  double r = 1;
  for (int k = n; k > 1; k -= 2) r *= k;
  return r;
}

static double binom(int n, int k) {
  if (k < 0 || k > n) return 0;
  double r = 1;
  for (int i = 1; i <= k; i++) r = r * (n - k + i) / i;
  return r;
}

/* Overlap of raw monomials x^a y^b z^c and x^a' y^b' z^c' sharing one radial
 * factor, in units where the x^l component has norm 1. */
static double mono_overlap(const int *p, const int *q, int l) {
  for (int k = 0; k < 3; k++)
    if ((p[k] + q[k]) % 2) return 0;
  return dfact(p[0] + q[0] - 1) * dfact(p[1] + q[1] - 1) * dfact(p[2] + q[2] - 1) / dfact(2 * l - 1);
}

/* The matrix (size x ncart, row-major) from raw cartesian components to the
 * shell's functions.  Spherical: real solid harmonics S_lm, m = -l..l, with
 * the coefficients of Helgaker, Jorgensen, Olsen eq. 6.4.47-6.4.48, each
 * normalized numerically against the monomial overlaps. */
static void shell_transform(int l, int pure, double *T) {
  int c[NCMAX][3];
  cart_comps(l, c);
  int nc = (l + 1) * (l + 2) / 2;
  if (!pure || l < 2) {
    memset(T, 0, sizeof(double) * nc * nc);
    for (int k = 0; k < nc; k++) T[k * nc + k] = 1.0 / sqrt(mono_overlap(c[k], c[k], l));
    return;
  }
  for (int m = -l; m <= l; m++) {
    double *row = T + (m + l) * nc;
    memset(row, 0, sizeof(double) * nc);
    int am = abs(m), vm2 = m < 0 ? 1 : 0;
    for (int t = 0; t <= (l - am) / 2; t++)
      for (int u = 0; u <= t; u++)
        for (int v2 = vm2; v2 <= am; v2 += 2) {
          int sgn = ((t + (v2 - vm2) / 2) % 2) ? -1 : 1;
          double coef = sgn * pow(0.25, t) * binom(l, t) * binom(l - t, am + t) * binom(t, u) * binom(am, v2);
          int px = 2 * t + am - 2 * u - v2, py = 2 * u + v2, pz = l - 2 * t - am;
          for (int k = 0; k < nc; k++)
            if (c[k][0] == px && c[k][1] == py && c[k][2] == pz) row[k] += coef;
        }
    double nrm = 0;
    for (int i = 0; i < nc; i++)
      for (int j = 0; j < nc; j++) nrm += row[i] * row[j] * mono_overlap(c[i], c[j], l);
    for (int k = 0; k < nc; k++) row[k] /= sqrt(nrm);
  }
}

int int_basis_build(const basis_set *b, const ir_atom *atoms, int natoms, int_basis *out) {
  memset(out, 0, sizeof *out);
  int ns = 0;
  for (int a = 0; a < natoms; a++) {
    int z = atoms[a].z;
    if (z < 1 || z > BASIS_MAXZ || b->elem[z].nshells == 0) return -1;
    ns += b->elem[z].nshells;
  }
  out->nshells = ns;
  out->shells = xcalloc((size_t)ns, sizeof *out->shells);
  out->natoms = natoms;
  out->xyz = xmalloc(3 * (size_t)natoms * sizeof(double));
  out->charge = xmalloc((size_t)natoms * sizeof(double));
  out->atom_start = xmalloc(((size_t)natoms + 1) * sizeof(int));
  int k = 0, f = 0;
  for (int a = 0; a < natoms; a++) {
    const basis_element *el = &b->elem[atoms[a].z];
    out->charge[a] = atoms[a].z;
    for (int x = 0; x < 3; x++) out->xyz[3 * a + x] = atoms[a].xyz[x];
    out->atom_start[a] = f;
    for (int s = 0; s < el->nshells; s++, k++) {
      const basis_shell *src = &el->shells[s];
      int_shell *sh = &out->shells[k];
      int l = src->l;
      sh->l = l;
      sh->nprim = src->nprim;
      sh->pure = b->spherical && l >= 2;
      sh->atom = a;
      for (int x = 0; x < 3; x++) sh->center[x] = atoms[a].xyz[x];
      sh->exps = xmalloc((size_t)src->nprim * sizeof(double));
      sh->coefs = xmalloc((size_t)src->nprim * sizeof(double));
      /* primitive normalization of x^l exp(-a r^2), then the contraction */
      for (int i = 0; i < src->nprim; i++) {
        double e = src->exps[i];
        sh->exps[i] = e;
        sh->coefs[i] = src->coefs[i] * pow(2 * e / M_PI, 0.75) * pow(4 * e, 0.5 * l) / sqrt(dfact(2 * l - 1));
      }
      double s2 = 0;
      for (int i = 0; i < src->nprim; i++)
        for (int j = 0; j < src->nprim; j++) {
          double p = sh->exps[i] + sh->exps[j];
          s2 += sh->coefs[i] * sh->coefs[j] * pow(M_PI / p, 1.5) * dfact(2 * l - 1) / pow(2 * p, l);
        }
      for (int i = 0; i < src->nprim; i++) sh->coefs[i] /= sqrt(s2);
      sh->start = f;
      sh->size = basis_shell_size(l, b->spherical);
      f += sh->size;
      if (l > out->lmax) out->lmax = l;
    }
  }
  out->atom_start[natoms] = f;
  out->nbf = f;
  return 0;
}

void int_basis_free(int_basis *ib) {
  if (!ib) return;
  for (int s = 0; s < ib->nshells; s++) {
    free(ib->shells[s].exps);
    free(ib->shells[s].coefs);
  }
  free(ib->shells);
  free(ib->xyz);
  free(ib->charge);
  free(ib->atom_start);
  memset(ib, 0, sizeof *ib);
}

double int_nuclear_repulsion(const int_basis *ib) {
  double e = 0;
  for (int a = 0; a < ib->natoms; a++)
    for (int b = 0; b < a; b++) {
      double r2 = 0;
      for (int x = 0; x < 3; x++) {
        double d = ib->xyz[3 * a + x] - ib->xyz[3 * b + x];
        r2 += d * d;
      }
      e += ib->charge[a] * ib->charge[b] / sqrt(r2);
    }
  return e;
}

/* Hermite expansion coefficients along one axis, E[i][j][t] for i <= la,
 * j <= lb, t <= i + j, of primitives with exponents a, b, separation
 * xab = A - B.  E^{00}_0 = exp(-ab/p xab^2). */
static void hermite_e(int la, int lb, double a, double b, double xab, double E[LMAX + 1][EJ][ET]) {
  double p = a + b, mu = a * b / p;
  double xpa = -b / p * xab, xpb = a / p * xab, i2p = 0.5 / p;
  for (int i = 0; i <= la; i++)
    for (int j = 0; j <= lb; j++)
      for (int t = 0; t <= i + j + 1 && t < ET; t++) E[i][j][t] = 0;
  E[0][0][0] = exp(-mu * xab * xab);
  for (int i = 0; i <= la; i++) {
    for (int j = 0; j <= lb; j++) {
      if (i == 0 && j == 0) continue;
      if (i > 0) {
        for (int t = 0; t <= i + j; t++) {
          double v = xpa * (t <= i - 1 + j ? E[i - 1][j][t] : 0);
          if (t > 0) v += i2p * E[i - 1][j][t - 1];
          if (t + 1 <= i - 1 + j) v += (t + 1) * E[i - 1][j][t + 1];
          E[i][j][t] = v;
        }
      } else {
        for (int t = 0; t <= j; t++) {
          double v = xpb * (t <= j - 1 ? E[0][j - 1][t] : 0);
          if (t > 0) v += i2p * E[0][j - 1][t - 1];
          if (t + 1 <= j - 1) v += (t + 1) * E[0][j - 1][t + 1];
          E[0][j][t] = v;
        }
      }
    }
  }
}

/* Hermite Coulomb integrals R_tuv = R^0_tuv(alpha, PC) for t+u+v <= L into
 * out[hidx(t,u,v)].  work holds (L+1) * nherm(L) doubles. */
static void hermite_r(int L, double alpha, const double *pc, const int_boys *boys, double *work, double *out) {
  double F[INT_BOYS_MMAX + 1];
  double T = alpha * (pc[0] * pc[0] + pc[1] * pc[1] + pc[2] * pc[2]);
  int_boys_eval(boys, L, T, F);
  int nh = nherm(L);
  double m2a = -2 * alpha, f = 1;
  for (int n = 0; n <= L; n++) {
    work[n * nh] = f * F[n];
    f *= m2a;
  }
  for (int k = 1; k <= L; k++) {
    for (int n = 0; n <= L - k; n++) {
      double *Rn = work + n * nh;
      const double *R1 = work + (n + 1) * nh;
      for (int s = 0; s <= k; s++)
        for (int v = 0; v <= s; v++) {
          int u = s - v, t = k - s;
          double val;
          if (t > 0) val = (t > 1 ? (t - 1) * R1[hidx(t - 2, u, v)] : 0) + pc[0] * R1[hidx(t - 1, u, v)];
          else if (u > 0) val = (u > 1 ? (u - 1) * R1[hidx(t, u - 2, v)] : 0) + pc[1] * R1[hidx(t, u - 1, v)];
          else val = (v > 1 ? (v - 1) * R1[hidx(t, u, v - 2)] : 0) + pc[2] * R1[hidx(t, u, v - 1)];
          Rn[hidx(t, u, v)] = val;
        }
    }
  }
  for (int h = 0; h < nh; h++) out[h] = work[h];
}

/* Apply the per-shell transforms to a raw block [na][nb] (cartesian) giving
 * [fa][fb]. */
static void transform2(const double *Ta, int fa, int na, const double *Tb, int fb, int nb, const double *raw,
                       double *out) {
  double tmp[NCMAX * NCMAX];
  for (int i = 0; i < na; i++)
    for (int q = 0; q < fb; q++) {
      double v = 0;
      for (int j = 0; j < nb; j++) v += raw[i * nb + j] * Tb[q * nb + j];
      tmp[i * fb + q] = v;
    }
  for (int p = 0; p < fa; p++)
    for (int q = 0; q < fb; q++) {
      double v = 0;
      for (int i = 0; i < na; i++) v += Ta[p * na + i] * tmp[i * fb + q];
      out[p * fb + q] = v;
    }
}

typedef enum { ONE_S, ONE_T, ONE_V } one_kind;

/* One-electron matrix of the given kind. */
static void one_electron(const int_basis *ib, one_kind kind, double *M) {
  int n = ib->nbf;
  int_boys *boys = kind == ONE_V ? int_boys_new() : NULL;
  memset(M, 0, sizeof(double) * n * n);
  for (int sa = 0; sa < ib->nshells; sa++)
    for (int sb = 0; sb <= sa; sb++) {
      const int_shell *A = &ib->shells[sa], *B = &ib->shells[sb];
      int la = A->l, lb = B->l, na = (la + 1) * (la + 2) / 2, nb = (lb + 1) * (lb + 2) / 2;
      int ca[NCMAX][3], cb[NCMAX][3];
      cart_comps(la, ca);
      cart_comps(lb, cb);
      double raw[NCMAX * NCMAX] = {0};
      double AB[3];
      for (int x = 0; x < 3; x++) AB[x] = A->center[x] - B->center[x];
      for (int i = 0; i < A->nprim; i++)
        for (int j = 0; j < B->nprim; j++) {
          double a = A->exps[i], b = B->exps[j], p = a + b;
          double cc = A->coefs[i] * B->coefs[j];
          double E[3][LMAX + 1][EJ][ET];
          for (int x = 0; x < 3; x++) hermite_e(la, lb + 2, a, b, AB[x], E[x]);
          if (kind == ONE_S || kind == ONE_T) {
            double sp = sqrt(M_PI / p);
            for (int u = 0; u < na; u++)
              for (int w = 0; w < nb; w++) {
                double s[3], t[3];
                for (int x = 0; x < 3; x++) {
                  int ix = ca[u][x], jx = cb[w][x];
                  s[x] = E[x][ix][jx][0] * sp;
                  if (kind == ONE_T) {
                    double v = -2 * b * b * E[x][ix][jx + 2][0] + b * (2 * jx + 1) * E[x][ix][jx][0];
                    if (jx >= 2) v -= 0.5 * jx * (jx - 1) * E[x][ix][jx - 2][0];
                    t[x] = v * sp;
                  }
                }
                double val = kind == ONE_S ? s[0] * s[1] * s[2]
                                           : t[0] * s[1] * s[2] + s[0] * t[1] * s[2] + s[0] * s[1] * t[2];
                raw[u * nb + w] += cc * val;
              }
          } else {
            int L = la + lb, nh = nherm(L);
            double P[3];
            for (int x = 0; x < 3; x++) P[x] = (a * A->center[x] + b * B->center[x]) / p;
            double work[(2 * LMAX + 1) * (2 * LMAX + 2) * (2 * LMAX + 3) / 6 * (2 * LMAX + 1)];
            double R[(2 * LMAX + 1) * (2 * LMAX + 2) * (2 * LMAX + 3) / 6];
            double Rsum[(2 * LMAX + 1) * (2 * LMAX + 2) * (2 * LMAX + 3) / 6];
            for (int h = 0; h < nh; h++) Rsum[h] = 0;
            for (int c = 0; c < ib->natoms; c++) {
              double PC[3];
              for (int x = 0; x < 3; x++) PC[x] = P[x] - ib->xyz[3 * c + x];
              hermite_r(L, p, PC, boys, work, R);
              for (int h = 0; h < nh; h++) Rsum[h] -= ib->charge[c] * R[h];
            }
            double pref = 2 * M_PI / p * cc;
            for (int u = 0; u < na; u++)
              for (int w = 0; w < nb; w++) {
                const int *ia = ca[u], *jb = cb[w];
                double v = 0;
                for (int t = 0; t <= ia[0] + jb[0]; t++)
                  for (int s = 0; s <= ia[1] + jb[1]; s++)
                    for (int r = 0; r <= ia[2] + jb[2]; r++)
                      v += E[0][ia[0]][jb[0]][t] * E[1][ia[1]][jb[1]][s] * E[2][ia[2]][jb[2]][r] * Rsum[hidx(t, s, r)];
                raw[u * nb + w] += pref * v;
              }
          }
        }
      double Ta[NCMAX * NCMAX], Tb[NCMAX * NCMAX], blk[NCMAX * NCMAX];
      shell_transform(la, A->pure, Ta);
      shell_transform(lb, B->pure, Tb);
      transform2(Ta, A->size, na, Tb, B->size, nb, raw, blk);
      for (int p = 0; p < A->size; p++)
        for (int q = 0; q < B->size; q++) {
          M[(A->start + p) * n + B->start + q] = blk[p * B->size + q];
          M[(B->start + q) * n + A->start + p] = blk[p * B->size + q];
        }
    }
  int_boys_free(boys);
}

void int_overlap(const int_basis *ib, double *S) { one_electron(ib, ONE_S, S); }
void int_kinetic(const int_basis *ib, double *T) { one_electron(ib, ONE_T, T); }
void int_nuclear(const int_basis *ib, double *V) { one_electron(ib, ONE_V, V); }

/* ---- electron repulsion ---- */

/* A shell pair with its primitive-pair data: for each primitive pair the
 * exponent p, centre P, and Hermite coefficients Eab[comp pair][hermite]
 * including contraction coefficients. */
typedef struct shell_pair {
  int a, b;         /* shells, a >= b */
  int L, nh, nab;   /* la+lb, nherm(L), ncart_a * ncart_b */
  int nprim;
  double *p, *P;    /* nprim, 3*nprim */
  double *E;        /* nprim * nab * nh */
  double schwarz;   /* sqrt(max |(ab|ab)|) */
} shell_pair;

static void make_pair(const int_basis *ib, int sa, int sb, shell_pair *sp) {
  const int_shell *A = &ib->shells[sa], *B = &ib->shells[sb];
  int la = A->l, lb = B->l, na = (la + 1) * (la + 2) / 2, nb = (lb + 1) * (lb + 2) / 2;
  int ca[NCMAX][3], cb[NCMAX][3];
  cart_comps(la, ca);
  cart_comps(lb, cb);
  sp->a = sa;
  sp->b = sb;
  sp->L = la + lb;
  sp->nh = nherm(sp->L);
  sp->nab = na * nb;
  int np = A->nprim * B->nprim;
  sp->p = xmalloc((size_t)np * sizeof(double));
  sp->P = xmalloc(3 * (size_t)np * sizeof(double));
  sp->E = xcalloc((size_t)np * sp->nab * sp->nh, sizeof(double));
  double AB[3];
  for (int x = 0; x < 3; x++) AB[x] = A->center[x] - B->center[x];
  int k = 0;
  for (int i = 0; i < A->nprim; i++)
    for (int j = 0; j < B->nprim; j++) {
      double a = A->exps[i], b = B->exps[j], p = a + b;
      double E[3][LMAX + 1][EJ][ET];
      for (int x = 0; x < 3; x++) hermite_e(la, lb, a, b, AB[x], E[x]);
      double cc = A->coefs[i] * B->coefs[j];
      /* a primitive pair whose overlap factor vanishes contributes nothing */
      if (fabs(cc * E[0][0][0][0] * E[1][0][0][0] * E[2][0][0][0]) < 1e-30) continue;
      sp->p[k] = p;
      for (int x = 0; x < 3; x++) sp->P[3 * k + x] = (a * A->center[x] + b * B->center[x]) / p;
      double *Ek = sp->E + (size_t)k * sp->nab * sp->nh;
      for (int u = 0; u < na; u++)
        for (int w = 0; w < nb; w++) {
          double *row = Ek + (u * nb + w) * sp->nh;
          const int *ia = ca[u], *jb = cb[w];
          for (int t = 0; t <= ia[0] + jb[0]; t++)
            for (int s = 0; s <= ia[1] + jb[1]; s++)
              for (int r = 0; r <= ia[2] + jb[2]; r++)
                row[hidx(t, s, r)] = cc * E[0][ia[0]][jb[0]][t] * E[1][ia[1]][jb[1]][s] * E[2][ia[2]][jb[2]][r];
        }
      k++;
    }
  sp->nprim = k;
}

static void free_pair(shell_pair *sp) {
  free(sp->p);
  free(sp->P);
  free(sp->E);
}

/* Per-thread scratch for quartets. */
typedef struct eri_work {
  double *R, *Rw, *Rmat, *X, *raw, *tmp;
} eri_work;

enum { NHMAX = (4 * LMAX + 1) * (4 * LMAX + 2) * (4 * LMAX + 3) / 6, NH2 = (2 * LMAX + 1) * (2 * LMAX + 2) * (2 * LMAX + 3) / 6 };

static void work_init(eri_work *w) {
  w->R = xmalloc(NHMAX * sizeof(double));
  w->Rw = xmalloc((size_t)(4 * LMAX + 1) * NHMAX * sizeof(double));
  w->Rmat = xmalloc((size_t)NH2 * NH2 * sizeof(double));
  w->X = xmalloc((size_t)NH2 * NCMAX * NCMAX * sizeof(double));
  w->raw = xmalloc((size_t)NCMAX * NCMAX * NCMAX * NCMAX * sizeof(double));
  w->tmp = xmalloc((size_t)NCMAX * NCMAX * NCMAX * NCMAX * sizeof(double));
}

static void work_free(eri_work *w) {
  free(w->R);
  free(w->Rw);
  free(w->Rmat);
  free(w->X);
  free(w->raw);
  free(w->tmp);
}

/* Raw cartesian block (ab|cd) [nab][ncd] of two shell pairs into w->raw. */
static void quartet_raw(const shell_pair *ab, const shell_pair *cd, const int_boys *boys, eri_work *w) {
  int L = ab->L + cd->L, nh1 = ab->nh, nh2 = cd->nh, nab = ab->nab, ncd = cd->nab;
  double *raw = w->raw, *X = w->X, *Rm = w->Rmat, *R = w->R;
  memset(raw, 0, sizeof(double) * nab * ncd);
  /* Hermite index -> (t,u,v), and the sign (-1)^(tau+nu+phi) on the cd side */
  int tuv1[NH2][3], tuv2[NH2][3];
  double sgn2[NH2];
  for (int n = 0, h = 0; n <= ab->L; n++)
    for (int s = 0; s <= n; s++)
      for (int v = 0; v <= s; v++, h++) tuv1[h][0] = n - s, tuv1[h][1] = s - v, tuv1[h][2] = v;
  for (int n = 0, h = 0; n <= cd->L; n++)
    for (int s = 0; s <= n; s++)
      for (int v = 0; v <= s; v++, h++) {
        tuv2[h][0] = n - s, tuv2[h][1] = s - v, tuv2[h][2] = v;
        sgn2[h] = (n % 2) ? -1.0 : 1.0;
      }
  for (int i = 0; i < ab->nprim; i++) {
    double p = ab->p[i];
    const double *P = ab->P + 3 * i;
    memset(X, 0, sizeof(double) * nh1 * ncd);
    for (int j = 0; j < cd->nprim; j++) {
      double q = cd->p[j];
      const double *Q = cd->P + 3 * j;
      double alpha = p * q / (p + q);
      double PQ[3] = {P[0] - Q[0], P[1] - Q[1], P[2] - Q[2]};
      hermite_r(L, alpha, PQ, boys, w->Rw, R);
      double pref = 2 * pow(M_PI, 2.5) / (p * q * sqrt(p + q));
      for (int h1 = 0; h1 < nh1; h1++) {
        const int *a = tuv1[h1];
        double *row = Rm + h1 * nh2;
        for (int h2 = 0; h2 < nh2; h2++) {
          const int *b = tuv2[h2];
          row[h2] = pref * sgn2[h2] * R[hidx(a[0] + b[0], a[1] + b[1], a[2] + b[2])];
        }
      }
      /* X[h1][c] += sum_h2 Rm[h1][h2] Ecd[c][h2] */
      const double *Ecd = cd->E + (size_t)j * ncd * nh2;
      for (int h1 = 0; h1 < nh1; h1++) {
        const double *row = Rm + h1 * nh2;
        double *xr = X + h1 * ncd;
        for (int c = 0; c < ncd; c++) {
          const double *e = Ecd + c * nh2;
          double v = 0;
          for (int h2 = 0; h2 < nh2; h2++) v += row[h2] * e[h2];
          xr[c] += v;
        }
      }
    }
    /* raw[ab][c] += sum_h1 Eab[ab][h1] X[h1][c] */
    const double *Eab = ab->E + (size_t)i * nab * nh1;
    for (int u = 0; u < nab; u++) {
      const double *e = Eab + u * nh1;
      double *rr = raw + u * ncd;
      for (int h1 = 0; h1 < nh1; h1++) {
        double eu = e[h1];
        if (eu == 0) continue;
        const double *xr = X + h1 * ncd;
        for (int c = 0; c < ncd; c++) rr[c] += eu * xr[c];
      }
    }
  }
}

/* Transform index `which` (0..3) of a 4-index block from n[which] raw
 * components to f[which] functions with T (f x n). dims are updated. */
static void transform_index(double *in, double *out, int dims[4], int which, const double *T, int f) {
  int n = dims[which];
  int outer = 1, inner = 1;
  for (int k = 0; k < which; k++) outer *= dims[k];
  for (int k = which + 1; k < 4; k++) inner *= dims[k];
  for (int o = 0; o < outer; o++)
    for (int p = 0; p < f; p++) {
      double *dst = out + ((size_t)o * f + p) * inner;
      for (int i = 0; i < inner; i++) dst[i] = 0;
      for (int m = 0; m < n; m++) {
        double t = T[p * n + m];
        if (t == 0) continue;
        const double *src = in + ((size_t)o * n + m) * inner;
        for (int i = 0; i < inner; i++) dst[i] += t * src[i];
      }
    }
  dims[which] = f;
}

/* The final block of a quartet (functions of the four shells) in w->raw. */
static double *quartet(const int_basis *ib, const shell_pair *ab, const shell_pair *cd, const int_boys *boys,
                       const double *const *T, eri_work *w) {
  quartet_raw(ab, cd, boys, w);
  const int_shell *S[4] = {&ib->shells[ab->a], &ib->shells[ab->b], &ib->shells[cd->a], &ib->shells[cd->b]};
  int dims[4];
  for (int k = 0; k < 4; k++) dims[k] = (S[k]->l + 1) * (S[k]->l + 2) / 2;
  double *cur = w->raw, *other = w->tmp;
  for (int k = 0; k < 4; k++) {
    if (S[k]->l <= 1) continue; /* s and p: the transform is the identity */
    transform_index(cur, other, dims, k, T[S[k]->l * 2 + S[k]->pure], S[k]->size);
    double *t = cur;
    cur = other;
    other = t;
  }
  return cur;
}

long int_eri(const int_basis *ib, double screen, double *eri) {
  int ns = ib->nshells;
  size_t n = (size_t)ib->nbf;
  long npairs = (long)ns * (ns + 1) / 2;
  shell_pair *pairs = xcalloc((size_t)npairs, sizeof *pairs);
  for (int a = 0, k = 0; a < ns; a++)
    for (int b = 0; b <= a; b++, k++) make_pair(ib, a, b, &pairs[k]);
  int_boys *boys = int_boys_new();
  /* shell transforms by (l, pure) */
  double *Tl[2 * (LMAX + 1)];
  for (int l = 0; l <= LMAX; l++)
    for (int pure = 0; pure < 2; pure++) {
      int nc = (l + 1) * (l + 2) / 2;
      Tl[2 * l + pure] = xmalloc((size_t)nc * nc * sizeof(double));
      shell_transform(l, pure, Tl[2 * l + pure]);
    }
  const double *const *T = (const double *const *)Tl;
  /* Schwarz factors from the diagonal quartets */
#pragma omp parallel if (npairs > 200)
  {
    eri_work w;
    work_init(&w);
#pragma omp for schedule(dynamic)
    for (long k = 0; k < npairs; k++) {
      const shell_pair *sp = &pairs[k];
      double *blk = quartet(ib, sp, sp, boys, T, &w);
      int fa = ib->shells[sp->a].size, fb = ib->shells[sp->b].size;
      double mx = 0;
      for (int i = 0; i < fa * fb; i++) mx = fmax(mx, fabs(blk[(size_t)i * fa * fb + i]));
      pairs[k].schwarz = sqrt(mx);
    }
    work_free(&w);
  }
  memset(eri, 0, n * n * n * n * sizeof(double));
  long computed = 0;
#pragma omp parallel reduction(+ : computed) if (npairs > 200)
  {
    eri_work w;
    work_init(&w);
#pragma omp for schedule(dynamic)
    for (long ij = 0; ij < npairs; ij++) {
      const shell_pair *ab = &pairs[ij];
      for (long kl = 0; kl <= ij; kl++) {
        const shell_pair *cd = &pairs[kl];
        if (ab->schwarz * cd->schwarz < screen) continue;
        double *blk = quartet(ib, ab, cd, boys, T, &w);
        computed++;
        const int_shell *A = &ib->shells[ab->a], *B = &ib->shells[ab->b], *C = &ib->shells[cd->a],
                        *D = &ib->shells[cd->b];
        for (int p = 0; p < A->size; p++)
          for (int q = 0; q < B->size; q++)
            for (int r = 0; r < C->size; r++)
              for (int s = 0; s < D->size; s++) {
                double v = blk[((p * B->size + q) * C->size + r) * D->size + s];
                size_t P = (size_t)(A->start + p), Q = (size_t)(B->start + q), R = (size_t)(C->start + r),
                       S = (size_t)(D->start + s);
                eri[((P * n + Q) * n + R) * n + S] = v;
                eri[((Q * n + P) * n + R) * n + S] = v;
                eri[((P * n + Q) * n + S) * n + R] = v;
                eri[((Q * n + P) * n + S) * n + R] = v;
                eri[((R * n + S) * n + P) * n + Q] = v;
                eri[((S * n + R) * n + P) * n + Q] = v;
                eri[((R * n + S) * n + Q) * n + P] = v;
                eri[((S * n + R) * n + Q) * n + P] = v;
              }
      }
    }
    work_free(&w);
  }
  for (int k = 0; k < 2 * (LMAX + 1); k++) free(Tl[k]);
  int_boys_free(boys);
  for (long k = 0; k < npairs; k++) free_pair(&pairs[k]);
  free(pairs);
  return computed;
}
