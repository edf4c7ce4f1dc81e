/* fci.c — the exact (full configuration interaction) ground state of an
 * active space, by Davidson iteration (J. Comput. Phys. 17, 87 (1975)) in the
 * space of determinants |I_alpha I_beta> with the space's electron counts.
 *
 * The coefficient vector is a matrix C[I_alpha][I_beta] over alpha and beta
 * strings (bit strings of occupied orbitals, ranked in increasing numeric
 * order).  With E_pq = E^a_pq + E^b_pq,
 *   H = sum_s [ sum_pq k_pq E^s_pq + 1/2 sum_pqrs (pq|rs) E^s_pq E^s_rs ]
 *       + sum_pqrs (pq|rs) E^a_pq E^b_rs,      k_pq = h_pq - 1/2 sum_r (pr|rp);
 * the same-spin parts are sparse matrices over strings of one spin, applied
 * row by row; the opposite-spin part in blocks of alpha strings as
 *   D_kl = E^b_kl C,  G_ij = sum_kl (ij|kl) D_kl  (one dgemm per block),
 *   sigma += sum_ij E^a_ij G_ij,
 * with orbital pairs packed by symmetry (Knowles and Handy, Chem. Phys.
 * Lett. 111, 315 (1984)).
 *
 * Spin: S^2 = S_z^2 + S_z + N_b - sum_pq E^a_qp E^b_pq is applied exactly.
 * To target multiplicity 2S+1 the Davidson runs on
 *   H + mu (S^2 - S(S+1))      when S = |S_z| (no lower spin exists in the sector),
 *   H + mu (S^2 - S(S+1))^2    otherwise;
 * both commute with H and leave states of spin S where they are while lifting
 * every other spin by at least mu (chosen 1 hartree), so the lowest state found
 * is the lowest state of that spin.  This is cheaper and more robust than
 * computing many roots and sorting them by <S^2>: one root, and near-degenerate
 * states of other spin cannot be mixed in.
 */
#include "config.h"

#include "cairn/chem.h"
#include "cairn/util.h"

#include <cblas.h>
#include <lapacke.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#ifdef _OPENMP
#include <omp.h>
#endif

/* Below this many determinants the sigma loops run on one thread: starting
 * threads would cost more than the work. */
enum { FCI_PAR = 20000 };

/* Strings of k electrons in n orbitals, and their single replacements. */
typedef struct strings {
  int n, k;
  long count;
  uint64_t *bits;     /* count strings, increasing */
  long binom[65][65]; /* binomial coefficients for ranking */
  /* replacement list of string Is: entries [off[Is], off[Is+1]) with
   * E_pq |Is> = sign |J>; pq = p*n + q */
  long *off;
  int32_t *J;
  int16_t *pq;
  int8_t *sign;
} strings;

static long rank_of(const strings *s, uint64_t b) {
  long r = 0;
  int i = 0;
  for (int p = 0; p < s->n; p++)
    if (b >> p & 1) r += s->binom[p][++i];
  return r;
}

static void strings_init(strings *s, int n, int k) {
  memset(s, 0, sizeof *s);
  s->n = n;
  s->k = k;
  for (int a = 0; a <= 64; a++) {
    s->binom[a][0] = 1;
    for (int b = 1; b <= 64; b++) s->binom[a][b] = a == 0 ? 0 : s->binom[a - 1][b - 1] + s->binom[a - 1][b];
  }
  s->count = s->binom[n][k];
  s->bits = xmalloc((size_t)s->count * sizeof(uint64_t));
  /* strings in increasing order: Gosper's hack */
  if (k == 0) s->bits[0] = 0;
  else {
    uint64_t b = (k == 64) ? ~0ULL : ((1ULL << k) - 1);
    for (long i = 0; i < s->count; i++) {
      s->bits[i] = b;
      uint64_t c = b & (~b + 1), r = b + c;
      b = (((r ^ b) >> 2) / c) | r;
    }
  }
  long per = (long)k * (n - k) + k;
  s->off = xmalloc(((size_t)s->count + 1) * sizeof(long));
  s->J = xmalloc((size_t)(s->count * per + 1) * sizeof(int32_t));
  s->pq = xmalloc((size_t)(s->count * per + 1) * sizeof(int16_t));
  s->sign = xmalloc((size_t)(s->count * per + 1) * sizeof(int8_t));
  long e = 0;
  for (long Is = 0; Is < s->count; Is++) {
    s->off[Is] = e;
    uint64_t b = s->bits[Is];
    for (int q = 0; q < n; q++) {
      if (!(b >> q & 1)) continue;
      for (int p = 0; p < n; p++) {
        if (p != q && (b >> p & 1)) continue;
        uint64_t nb = (b & ~(1ULL << q)) | (1ULL << p);
        /* sign: occupied orbitals strictly between p and q */
        int lo = p < q ? p : q, hi = p < q ? q : p;
        uint64_t mask = hi - lo > 1 ? (((1ULL << (hi - lo - 1)) - 1) << (lo + 1)) : 0;
        int cnt = __builtin_popcountll(b & mask);
        s->J[e] = (int32_t)rank_of(s, nb);
        s->pq[e] = (int16_t)(p * n + q);
        s->sign[e] = (cnt & 1) ? -1 : 1;
        e++;
      }
    }
  }
  s->off[s->count] = e;
}

static void strings_free(strings *s) {
  free(s->bits);
  free(s->off);
  free(s->J);
  free(s->pq);
  free(s->sign);
}

/* A sparse symmetric matrix over strings (CSR). */
typedef struct sparse {
  long n;
  long *row;
  int32_t *col;
  double *val;
} sparse;

static void sparse_free(sparse *m) {
  free(m->row);
  free(m->col);
  free(m->val);
}

/* The same-spin Hamiltonian over strings s:
 * <Is| sum_pq k_pq E_pq + 1/2 sum_pqrs (pq|rs) E_pq E_rs |J>. */
static void same_spin(const strings *s, const double *k, const double *g, sparse *out) {
  int n = s->n;
  long N = s->count;
  out->n = N;
  out->row = xmalloc(((size_t)N + 1) * sizeof(long));
  long cap = 0;
  int32_t **cols = xmalloc((size_t)N * sizeof(int32_t *));
  double **vals = xmalloc((size_t)N * sizeof(double *));
  long *cnt = xmalloc((size_t)N * sizeof(long));
#pragma omp parallel if (N > 2000)
  {
    double *acc = xcalloc((size_t)N, sizeof(double));
    char *mark = xcalloc((size_t)N, 1);
    int32_t *touched = xmalloc((size_t)N * sizeof(int32_t));
#pragma omp for schedule(dynamic, 16)
    for (long J = 0; J < N; J++) {
      long nt = 0;
      for (long e1 = s->off[J]; e1 < s->off[J + 1]; e1++) {
        long K = s->J[e1];
        int rs = s->pq[e1], r = rs / n, t = rs % n;
        double s1 = s->sign[e1];
        if (!mark[K]) { mark[K] = 1; touched[nt++] = (int32_t)K; }
        acc[K] += s1 * k[r * n + t];
        for (long e2 = s->off[K]; e2 < s->off[K + 1]; e2++) {
          long Is = s->J[e2];
          int pq = s->pq[e2], p = pq / n, q = pq % n;
          if (!mark[Is]) { mark[Is] = 1; touched[nt++] = (int32_t)Is; }
          acc[Is] += 0.5 * s1 * s->sign[e2] * g[chem_h2_index(n, p, q, r, t)];
        }
      }
      long m = 0;
      for (long x = 0; x < nt; x++)
        if (acc[touched[x]] != 0) m++;
      cols[J] = xmalloc((size_t)(m ? m : 1) * sizeof(int32_t));
      vals[J] = xmalloc((size_t)(m ? m : 1) * sizeof(double));
      m = 0;
      for (long x = 0; x < nt; x++) {
        long Is = touched[x];
        if (acc[Is] != 0) { cols[J][m] = (int32_t)Is; vals[J][m] = acc[Is]; m++; }
        acc[Is] = 0;
        mark[Is] = 0;
      }
      cnt[J] = m;
    }
    free(acc);
    free(mark);
    free(touched);
  }
  out->row[0] = 0;
  for (long J = 0; J < N; J++) out->row[J + 1] = out->row[J] + cnt[J];
  cap = out->row[N];
  out->col = xmalloc((size_t)(cap ? cap : 1) * sizeof(int32_t));
  out->val = xmalloc((size_t)(cap ? cap : 1) * sizeof(double));
  for (long J = 0; J < N; J++) {
    memcpy(out->col + out->row[J], cols[J], (size_t)cnt[J] * sizeof(int32_t));
    memcpy(out->val + out->row[J], vals[J], (size_t)cnt[J] * sizeof(double));
    free(cols[J]);
    free(vals[J]);
  }
  free(cols);
  free(vals);
  free(cnt);
}

/* Everything the sigma operations need. */
typedef struct fci {
  int n, npair;         /* orbitals, n(n+1)/2 */
  strings a, b;
  sparse Ha, Hb;
  double *Vp;           /* npair x npair: (pq|rs) over packed pairs */
  int *pidx;            /* n*n: pq -> packed pair */
  int32_t *bexc;        /* Nb x n^2: E_pq |Ib> -> J (or -1); sign in bsgn */
  int8_t *bsgn;
  double *ct, *st;      /* Na x Nb scratch for the transposed beta part */
  long block;           /* alpha strings per opposite-spin block */
  double *D, *G;        /* block x Nb x npair */
} fci;

/* out = a^T for a (rows x cols), in cache-sized tiles. */
static void transpose(const double *a, long rows, long cols, double *out) {
  enum { TILE = 32 };
#pragma omp parallel for schedule(static) if (rows * cols > FCI_PAR)
  for (long r0 = 0; r0 < rows; r0 += TILE)
    for (long c0 = 0; c0 < cols; c0 += TILE) {
      long r1 = r0 + TILE < rows ? r0 + TILE : rows, c1 = c0 + TILE < cols ? c0 + TILE : cols;
      for (long r = r0; r < r1; r++)
        for (long c = c0; c < c1; c++) out[c * rows + r] = a[r * cols + c];
    }
}

/* sigma = H c (c, sigma: Na x Nb). */
static void fci_sigma(const fci *f, const double *c, double *sigma) {
  long Na = f->a.count, Nb = f->b.count;
  int n = f->n, np = f->npair;
  /* same spin, beta, on the transpose so that it is row operations too:
   * sigma^T[Ib][:] = sum_Jb Hb(Ib, Jb) C^T[Jb][:] */
  double *ct = f->ct, *st = f->st;
  transpose(c, Na, Nb, ct);
#pragma omp parallel for schedule(static) if (Na * Nb > FCI_PAR)
  for (long Ib = 0; Ib < Nb; Ib++) {
    double *sr = st + Ib * Na;
    for (long Ia = 0; Ia < Na; Ia++) sr[Ia] = 0;
    for (long x = f->Hb.row[Ib]; x < f->Hb.row[Ib + 1]; x++) {
      double h = f->Hb.val[x];
      const double *cj = ct + (long)f->Hb.col[x] * Na;
      for (long Ia = 0; Ia < Na; Ia++) sr[Ia] += h * cj[Ia];
    }
  }
  transpose(st, Nb, Na, sigma);
  /* same spin, alpha: sigma[Ia][:] += sum_Ja Ha(Ia, Ja) C[Ja][:] */
#pragma omp parallel for schedule(static) if (Na * Nb > FCI_PAR)
  for (long Ia = 0; Ia < Na; Ia++) {
    double *sr = sigma + Ia * Nb;
    for (long x = f->Ha.row[Ia]; x < f->Ha.row[Ia + 1]; x++) {
      double h = f->Ha.val[x];
      const double *cj = c + (long)f->Ha.col[x] * Nb;
      for (long Ib = 0; Ib < Nb; Ib++) sr[Ib] += h * cj[Ib];
    }
  }
  /* opposite spin, in blocks of alpha strings Ja:
   *   D[Ja][Ib][(kl)] = sum_Jb <Ib|E_kl + E_lk|Jb> C[Ja][Jb]   (k >= l packed),
   *   G = D Vp  (one dgemm: G[Ja][Ib][(ij)] = sum_(kl) (ij|kl) D[Ja][Ib][(kl)]),
   *   sigma[Ia][Ib] += <Ia|E_ij|Ja> G[Ja][Ib][(ij)]  for the Ia that E_ji reaches from Ja. */
  for (long a0 = 0; a0 < Na; a0 += f->block) {
    long B = Na - a0 < f->block ? Na - a0 : f->block;
    size_t rows = (size_t)B * Nb;
    memset(f->D, 0, rows * np * sizeof(double));
#pragma omp parallel for schedule(static) if (Na * Nb > FCI_PAR)
    for (long Ib = 0; Ib < Nb; Ib++) {
      for (long e = f->b.off[Ib]; e < f->b.off[Ib + 1]; e++) {
        /* E_pq |Ib> = s |Jb>  =>  <Ib|E_qp|Jb> = s */
        long Jb = f->b.J[e];
        int pr = f->pidx[f->b.pq[e]];
        double sg = f->b.sign[e];
        for (long ja = 0; ja < B; ja++) f->D[((size_t)ja * Nb + Ib) * np + pr] += sg * c[(a0 + ja) * Nb + Jb];
      }
    }
#pragma omp parallel if (Na * Nb > FCI_PAR)
    {
      int nt = 1, id = 0;
#ifdef _OPENMP
      nt = omp_get_num_threads();
      id = omp_get_thread_num();
#endif
      size_t chunk = (rows + (size_t)nt - 1) / (size_t)nt, r0 = chunk * (size_t)id;
      if (r0 < rows) {
        size_t w = rows - r0 < chunk ? rows - r0 : chunk;
        cblas_dgemm(CblasRowMajor, CblasNoTrans, CblasNoTrans, (int)w, np, np, 1.0, f->D + r0 * np, np, f->Vp, np, 0.0,
                    f->G + r0 * np, np);
      }
      /* scatter, each thread over its own range of beta strings */
      size_t bc = ((size_t)Nb + (size_t)nt - 1) / (size_t)nt;
      long b0 = (long)(bc * (size_t)id), b1 = b0 + (long)bc > Nb ? Nb : b0 + (long)bc;
#pragma omp barrier
      for (long ja = 0; ja < B; ja++) {
        long Ja = a0 + ja;
        for (long e = f->a.off[Ja]; e < f->a.off[Ja + 1]; e++) {
          /* E_pq |Ja> = s |Ia>  =>  <Ia|E_qp|Ja> = s */
          long Ia = f->a.J[e];
          int pr = f->pidx[f->a.pq[e]];
          double sg = f->a.sign[e];
          double *sr = sigma + Ia * Nb;
          const double *g = f->G + (size_t)ja * Nb * np + pr;
          for (long Ib = b0; Ib < b1; Ib++) sr[Ib] += sg * g[(size_t)Ib * np];
        }
      }
    }
  }
  (void)n;
}

/* sigma = S^2 c. */
static void fci_s2(const fci *f, const double *c, double *sigma) {
  long Na = f->a.count, Nb = f->b.count;
  int n = f->n;
  double sz = 0.5 * (f->a.k - f->b.k);
  double diag = sz * sz + sz + f->b.k;
#pragma omp parallel for schedule(static) if (Na * Nb > FCI_PAR)
  for (long Ia = 0; Ia < Na; Ia++) {
    double *sr = sigma + Ia * Nb;
    for (long Ib = 0; Ib < Nb; Ib++) sr[Ib] = diag * c[Ia * Nb + Ib];
    /* - sum_pq E^a_qp E^b_pq: E_pq|Ia> = s|Ja> gives <Ia|E_qp|Ja> = s; then
     * <Ib|E_pq|Jb> = s' with E_qp|Ib> = s'|Jb>. */
    for (long e = f->a.off[Ia]; e < f->a.off[Ia + 1]; e++) {
      long Ja = f->a.J[e];
      int pq = f->a.pq[e], p = pq / n, q = pq % n;
      double s = f->a.sign[e];
      int qp = q * n + p;
      const double *cj = c + Ja * Nb;
      for (long Ib = 0; Ib < Nb; Ib++) {
        int32_t Jb = f->bexc[Ib * (long)n * n + qp];
        if (Jb >= 0) sr[Ib] -= s * f->bsgn[Ib * (long)n * n + qp] * cj[Jb];
      }
    }
  }
}

/* Operator of the Davidson run: H, plus the spin penalty. */
typedef struct op {
  const fci *f;
  int penalty;     /* 0 none, 1 linear, 2 quadratic */
  double mu, s2t;  /* weight, target S(S+1) */
  double *tmp, *tmp2;
} op;

static void op_apply(const op *o, const double *c, double *out) {
  long N = o->f->a.count * o->f->b.count;
  fci_sigma(o->f, c, out);
  if (o->penalty == 0) return;
  fci_s2(o->f, c, o->tmp);
  if (o->penalty == 1) {
    for (long i = 0; i < N; i++) out[i] += o->mu * (o->tmp[i] - o->s2t * c[i]);
    return;
  }
  /* (S^2 - t)^2 c = (S^2 - t) y with y = (S^2 - t) c */
  for (long i = 0; i < N; i++) o->tmp[i] -= o->s2t * c[i];
  fci_s2(o->f, o->tmp, o->tmp2);
  for (long i = 0; i < N; i++) out[i] += o->mu * (o->tmp2[i] - o->s2t * o->tmp[i]);
}

/* Indices of the k smallest entries of v (not in skip[0..nskip-1]) into
 * out[0..k-1], in increasing order of v; one pass with a small sorted list. */
static int lowest_k(const double *v, long N, int k, const long *skip, int nskip, long *out) {
  int have = 0;
  for (long i = 0; i < N; i++) {
    int used = 0;
    for (int h = 0; h < nskip; h++) used |= skip[h] == i;
    if (used || (have == k && v[i] >= v[out[have - 1]])) continue;
    int pos = have < k ? have++ : k - 1;
    while (pos > 0 && v[out[pos - 1]] > v[i]) {
      out[pos] = out[pos - 1];
      pos--;
    }
    out[pos] = i;
  }
  return have;
}

/* Lowest eigenpair of the operator by Davidson with diagonal preconditioner
 * hd (the diagonal of H).  Start vectors: unit vectors on the lowest entries
 * of hd and, with a spin penalty, as many again on the lowest entries of hp
 * (hd plus the penalty of each determinant's diagonal S^2; also the
 * preconditioner then, as it follows the large penalty), so that the
 * start space holds both the low-energy configurations and those of the
 * target spin.  Returns 0 when converged; x gets the normalized vector. */
static int davidson(const op *o, const double *hd, const double *hp, long N, double *x, double *theta_out,
                    int *iters) {
  int maxdim = N > 20000000 ? 10 : 24;
  if (maxdim > N) maxdim = (int)N;
  double *V = xmalloc((size_t)maxdim * N * sizeof(double)), *HV = xmalloc((size_t)maxdim * N * sizeof(double));
  double *r = xmalloc((size_t)N * sizeof(double));
  int half = 4; /* start vectors of each kind: each costs one sigma */
  if (half < 1) half = 1;
  long low[64];
  int nguess = lowest_k(hd, N, half, NULL, 0, low);
  if (hp) nguess += lowest_k(hp, N, half, low, nguess, low + nguess);
  int m = 0;
  for (int g = 0; g < nguess; g++) {
    memset(V + (size_t)m * N, 0, N * sizeof(double));
    V[(size_t)m * N + low[g]] = 1;
    op_apply(o, V + (size_t)m * N, HV + (size_t)m * N);
    m++;
  }
  double Hs[64 * 64], ev[64 * 64], w[64];
  double theta = 0, old = 1e300;
  int conv = 0, it;
  for (it = 1; it <= 500; it++) {
    for (int i = 0; i < m; i++)
      for (int j = 0; j <= i; j++) {
        double v = cblas_ddot((int)N, V + (size_t)i * N, 1, HV + (size_t)j * N, 1);
        Hs[i * m + j] = Hs[j * m + i] = v;
      }
    memcpy(ev, Hs, sizeof(double) * m * m);
    if (LAPACKE_dsyev(LAPACK_ROW_MAJOR, 'V', 'U', m, ev, m, w) != 0) break;
    theta = w[0];
    /* Ritz vector and residual */
    memset(x, 0, N * sizeof(double));
    memset(r, 0, N * sizeof(double));
    for (int i = 0; i < m; i++) {
      cblas_daxpy((int)N, ev[i * m], V + (size_t)i * N, 1, x, 1);
      cblas_daxpy((int)N, ev[i * m], HV + (size_t)i * N, 1, r, 1);
    }
    cblas_daxpy((int)N, -theta, x, 1, r, 1);
    double rn = cblas_dnrm2((int)N, r, 1);
    /* residual 1e-6: the Ritz value is then within about r^2/gap ~ 1e-11 of the eigenvalue */
    if (rn < 1e-6 && fabs(theta - old) < 1e-10) {
      conv = 1;
      break;
    }
    if (m == N) { /* the whole space: exact */
      conv = 1;
      break;
    }
    old = theta;
    if (m + 1 > maxdim) {
      /* restart from the Ritz vector: V = {x}, HV = {H x = r + theta x} */
      memcpy(V, x, N * sizeof(double));
      memcpy(HV, r, N * sizeof(double));
      cblas_daxpy((int)N, theta, x, 1, HV, 1);
      m = 1;
    }
    /* correction (theta - Hd)^-1 r, orthogonalized twice */
    double *t = V + (size_t)m * N;
    for (long i = 0; i < N; i++) {
      double den = theta - (hp ? hp[i] : hd[i]);
      if (fabs(den) < 1e-8) den = den < 0 ? -1e-8 : 1e-8;
      t[i] = r[i] / den;
    }
    for (int pass = 0; pass < 2; pass++)
      for (int i = 0; i < m; i++) {
        double ov = cblas_ddot((int)N, V + (size_t)i * N, 1, t, 1);
        cblas_daxpy((int)N, -ov, V + (size_t)i * N, 1, t, 1);
      }
    double tn = cblas_dnrm2((int)N, t, 1);
    if (tn < 1e-14) {
      conv = rn < 1e-5;
      break;
    }
    cblas_dscal((int)N, 1.0 / tn, t, 1);
    op_apply(o, t, HV + (size_t)m * N);
    m++;
  }
  *theta_out = theta;
  *iters = it;
  free(V);
  free(HV);
  free(r);
  return conv ? 0 : -1;
}

int chem_exact(const chem_space *s, chem_target t, diag_ctx *d, chem_refs *refs) {
  refs->has_exact = 0;
  int n = s->norb, na = s->nalpha, nb = s->nbeta;
  if (n > 62) {
    diag_report(d, DIAG_ERROR, DIAG_NOWHERE, "the exact solver takes at most 62 orbitals; the active space has %d", n);
    return -1;
  }
  if (na < nb) {
    diag_report(d, DIAG_ERROR, DIAG_NOWHERE, "the active space has fewer alpha (%d) than beta (%d) electrons", na, nb);
    return -1;
  }
  double sz = 0.5 * (na - nb);
  int penalty = 0;
  double s2t = 0;
  if (t.multiplicity > 0) {
    double S = 0.5 * (t.multiplicity - 1);
    if (S + 1e-9 < sz || fmod(S - sz + 1e-9, 1.0) > 1e-6) {
      diag_report(d, DIAG_ERROR, DIAG_NOWHERE, "multiplicity %d has no state with S_z = %g", t.multiplicity, sz);
      return -1;
    }
    s2t = S * (S + 1);
    penalty = fabs(S - sz) < 1e-9 ? 1 : 2;
  }
  /* memory: strings, replacement lists, Davidson vectors, blocks */
  double binom_a = 1, binom_b = 1;
  for (int i = 0; i < na; i++) binom_a = binom_a * (n - i) / (i + 1);
  for (int i = 0; i < nb; i++) binom_b = binom_b * (n - i) / (i + 1);
  double N = binom_a * binom_b;
  int npair = n * (n + 1) / 2;
  int maxdim = N > 2e7 ? 10 : 24;
  double need = 8.0 * N * (2.0 * maxdim + 7) + 2.0 * 8.0 * fmax(4194304.0, binom_b * npair) +
                (binom_a + binom_b) * ((double)na * (n - na) + na + 1) * 7.0 + binom_b * n * n * 5.0;
  uint64_t avail = util_mem_available();
  if (N > 2e9 || (avail && need > 0.8 * (double)avail)) {
    diag_report(d, DIAG_ERROR, DIAG_NOWHERE,
                "the exact solver for %d electrons in %d orbitals (%.0f determinants) needs %.1f GiB; %.1f GiB "
                "are available",
                na + nb, n, N, need / 1073741824.0, (double)avail / 1073741824.0);
    diag_help(d, "choose a smaller active space (`active N electrons in M orbitals`)");
    return -1;
  }
  fci f;
  memset(&f, 0, sizeof f);
  f.n = n;
  f.npair = npair;
  strings_init(&f.a, n, na);
  strings_init(&f.b, n, nb);
  /* k_pq = h_pq - 1/2 sum_r (pr|rp) */
  double *k = xmalloc((size_t)n * n * sizeof(double));
  for (int p = 0; p < n; p++)
    for (int q = 0; q < n; q++) {
      double v = s->h1[p * n + q];
      for (int r = 0; r < n; r++) v -= 0.5 * s->h2[chem_h2_index(n, p, r, r, q)];
      k[p * n + q] = v;
    }
  same_spin(&f.a, k, s->h2, &f.Ha);
  if (na == nb) {
    f.Hb = f.Ha; /* same strings, same matrix: share (freed once) */
  } else same_spin(&f.b, k, s->h2, &f.Hb);
  free(k);
  f.pidx = xmalloc((size_t)n * n * sizeof(int));
  for (int p = 0; p < n; p++)
    for (int q = 0; q < n; q++) f.pidx[p * n + q] = p >= q ? p * (p + 1) / 2 + q : q * (q + 1) / 2 + p;
  /* packed (pq|rs): D already holds E_rs + E_sr for r != s */
  f.Vp = xmalloc((size_t)npair * npair * sizeof(double));
  for (int p = 0; p < n; p++)
    for (int q = 0; q <= p; q++)
      for (int r = 0; r < n; r++)
        for (int t2 = 0; t2 <= r; t2++)
          f.Vp[(size_t)f.pidx[p * n + q] * npair + f.pidx[r * n + t2]] = s->h2[chem_h2_index(n, p, q, r, t2)];
  long Na = f.a.count, Nb = f.b.count;
  /* blocks of about 32 MB for D (and G): few blocks, few thread barriers */
  f.block = (long)(4194304.0 / ((double)Nb * npair));
  if (f.block < 1) f.block = 1;
  if (f.block > Na) f.block = Na;
  f.D = xmalloc((size_t)f.block * Nb * npair * sizeof(double));
  f.ct = xmalloc((size_t)Na * Nb * sizeof(double));
  f.st = xmalloc((size_t)Na * Nb * sizeof(double));
  f.G = xmalloc((size_t)f.block * Nb * npair * sizeof(double));
  /* beta replacement table for S^2 */
  f.bexc = xmalloc((size_t)Nb * n * n * sizeof(int32_t));
  f.bsgn = xmalloc((size_t)Nb * n * n);
  for (long x = 0; x < Nb * n * n; x++) f.bexc[x] = -1;
  for (long Ib = 0; Ib < Nb; Ib++)
    for (long e = f.b.off[Ib]; e < f.b.off[Ib + 1]; e++) {
      f.bexc[Ib * n * n + f.b.pq[e]] = f.b.J[e];
      f.bsgn[Ib * n * n + f.b.pq[e]] = f.b.sign[e];
    }
  long Nd = Na * Nb;
  /* diagonal of H (not of the penalty): same-spin parts from the sparse
   * matrices, Coulomb between spins.  It picks the start vectors and
   * preconditions.  The penalty stays out of it on purpose: determinants whose
   * diagonal S^2 happens to equal the target are often far from the target
   * state (four open shells for a two-open-shell triplet) and would make start
   * vectors that do not overlap it at all. */
  double *hd = xmalloc((size_t)Nd * sizeof(double));
  double *hp = penalty ? xmalloc((size_t)Nd * sizeof(double)) : NULL;
  {
    double *da = xmalloc((size_t)Na * sizeof(double)), *db = xmalloc((size_t)Nb * sizeof(double));
    for (long Is = 0; Is < Na; Is++) {
      da[Is] = 0;
      for (long x = f.Ha.row[Is]; x < f.Ha.row[Is + 1]; x++)
        if (f.Ha.col[x] == Is) da[Is] = f.Ha.val[x];
    }
    for (long Is = 0; Is < Nb; Is++) {
      db[Is] = 0;
      for (long x = f.Hb.row[Is]; x < f.Hb.row[Is + 1]; x++)
        if (f.Hb.col[x] == Is) db[Is] = f.Hb.val[x];
    }
#pragma omp parallel for schedule(static) if (Na * Nb > FCI_PAR)
    for (long Ia = 0; Ia < Na; Ia++) {
      double wv[64];
      for (int j = 0; j < n; j++) {
        wv[j] = 0;
        for (int i = 0; i < n; i++)
          if (f.a.bits[Ia] >> i & 1) wv[j] += s->h2[chem_h2_index(n, i, i, j, j)];
      }
      for (long Ib = 0; Ib < Nb; Ib++) {
        double x = da[Ia] + db[Ib];
        uint64_t bb = f.b.bits[Ib];
        for (int j = 0; j < n; j++)
          if (bb >> j & 1) x += wv[j];
        hd[Ia * Nb + Ib] = x;
        if (hp) {
          double s2d = sz * sz + sz + nb - __builtin_popcountll(f.a.bits[Ia] & bb) - s2t;
          hp[Ia * Nb + Ib] = x + (penalty == 1 ? s2d : s2d * s2d);
        }
      }
    }
    free(da);
    free(db);
  }
  op o = {.f = &f, .penalty = penalty, .mu = 1.0, .s2t = s2t};
  o.tmp = xmalloc((size_t)Nd * sizeof(double));
  o.tmp2 = penalty == 2 ? xmalloc((size_t)Nd * sizeof(double)) : NULL;
  double *x = xmalloc((size_t)Nd * sizeof(double)), *hx = xmalloc((size_t)Nd * sizeof(double));
  double theta;
  int iters, rc = 0;
  int conv;
  if (Nd <= 400) {
    /* tiny space: the dense matrix of the operator, LAPACK */
    double *M = xmalloc((size_t)Nd * Nd * sizeof(double)), *wv = xmalloc((size_t)Nd * sizeof(double));
    double *u = xcalloc((size_t)Nd, sizeof(double));
    for (long j = 0; j < Nd; j++) {
      u[j] = 1;
      op_apply(&o, u, hx);
      u[j] = 0;
      for (long i = 0; i < Nd; i++) M[i * Nd + j] = hx[i];
    }
    conv = LAPACKE_dsyevd(LAPACK_ROW_MAJOR, 'V', 'U', (int)Nd, M, (int)Nd, wv) == 0 ? 0 : -1;
    for (long i = 0; i < Nd; i++) x[i] = M[i * Nd];
    theta = wv[0];
    iters = 0;
    free(M), free(wv), free(u);
  } else {
    conv = davidson(&o, hd, hp, Nd, x, &theta, &iters);
  }
  if (conv != 0) {
    diag_report(d, DIAG_ERROR, DIAG_NOWHERE, "the exact (Davidson) solver did not converge in %d iterations", iters);
    rc = -1;
  } else {
    /* energy and spin of the vector, with H itself */
    double nrm = cblas_dnrm2((int)Nd, x, 1);
    cblas_dscal((int)Nd, 1.0 / nrm, x, 1);
    fci_sigma(&f, x, hx);
    double e = cblas_ddot((int)Nd, x, 1, hx, 1);
    fci_s2(&f, x, hx);
    double s2 = cblas_ddot((int)Nd, x, 1, hx, 1);
    if (penalty && fabs(s2 - s2t) > 1e-6) {
      diag_report(d, DIAG_ERROR, DIAG_NOWHERE,
                  "the exact solver found <S^2> = %.6f, not %.6f for multiplicity %d", s2, s2t, t.multiplicity);
      rc = -1;
    } else {
      refs->has_exact = 1;
      refs->exact = e + s->e_constant;
      refs->exact_s2 = s2;
      refs->exact_sz = sz;
    }
  }
  free(x), free(hx), free(hd), free(hp), free(o.tmp), free(o.tmp2);
  free(f.Vp), free(f.pidx), free(f.D), free(f.G), free(f.ct), free(f.st), free(f.bexc), free(f.bsgn);
  if (na != nb) sparse_free(&f.Hb);
  sparse_free(&f.Ha);
  strings_free(&f.a);
  strings_free(&f.b);
  return rc;
}
