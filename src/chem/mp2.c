/* mp2.c — second-order Moller-Plesset energy of a closed-shell active space
 * (RMP2 on canonical Hartree-Fock orbitals), and first-order amplitudes for
 * the `guess mp2` start. */
#include "config.h"

#include "cairn/chem.h"
#include "cairn/util.h"
#include "chem/chem_private.h"

#include <math.h>
#include <stdlib.h>

/* Fock matrix of the reference determinant for spin sigma (0 alpha, 1 beta):
 * f_pq = h_pq + sum_{k in alpha} [(pq|kk) - d_{sigma,alpha} (pk|kq)]
 *             + sum_{k in beta}  [(pq|kk) - d_{sigma,beta} (pk|kq)]. */
static double fock(const chem_space *s, int sigma, int p, int q) {
  int n = s->norb;
  double f = s->h1[p * n + q];
  for (int k = 0; k < s->nalpha; k++)
    f += s->h2[chem_h2_index(n, p, q, k, k)] - (sigma == 0 ? s->h2[chem_h2_index(n, p, k, k, q)] : 0);
  for (int k = 0; k < s->nbeta; k++)
    f += s->h2[chem_h2_index(n, p, q, k, k)] - (sigma == 1 ? s->h2[chem_h2_index(n, p, k, k, q)] : 0);
  return f;
}

int chem_mp2(const chem_space *s, diag_ctx *d, chem_refs *refs) {
  int n = s->norb, no = s->nalpha;
  refs->has_mp2 = 0;
  if (s->nalpha != s->nbeta) return 0; /* open shell: not computed (absent, never a placeholder) */
  double *e = xmalloc((size_t)n * sizeof(double));
  double off = 0;
  for (int p = 0; p < n; p++) {
    e[p] = fock(s, 0, p, p);
    for (int q = 0; q < p; q++) off = fmax(off, fabs(fock(s, 0, p, q)));
  }
  if (off > 1e-6) {
    diag_report(d, DIAG_WARNING, DIAG_NOWHERE,
                "MP2 not computed: the orbitals are not canonical Hartree-Fock orbitals (largest off-diagonal "
                "Fock element %.2e)",
                off);
    free(e);
    return 0;
  }
  double e2 = 0;
  for (int i = 0; i < no; i++)
    for (int j = 0; j < no; j++)
      for (int a = no; a < n; a++)
        for (int b = no; b < n; b++) {
          double iajb = s->h2[chem_h2_index(n, i, a, j, b)], ibja = s->h2[chem_h2_index(n, i, b, j, a)];
          e2 += iajb * (2 * iajb - ibja) / (e[i] + e[j] - e[a] - e[b]);
        }
  free(e);
  refs->has_mp2 = 1;
  refs->mp2 = chem_reference_energy(s) + e2;
  return 0;
}

static int occupied(const chem_space *s, int so) { return (so & 1) ? (so >> 1) < s->nbeta : (so >> 1) < s->nalpha; }

double chem_mp2_amplitude(const chem_space *s, int i, int j, int a, int b) {
  int nso = 2 * s->norb;
  if (i < 0 || j < 0 || a < 0 || b < 0 || i >= nso || j >= nso || a >= nso || b >= nso) return 0;
  if (!occupied(s, i) || !occupied(s, j) || occupied(s, a) || occupied(s, b) || i == j || a == b) return 0;
  double num = chem_so_int(s, i, j, a, b) - chem_so_int(s, i, j, b, a);
  if (num == 0) return 0;
  double den = fock(s, i & 1, i >> 1, i >> 1) + fock(s, j & 1, j >> 1, j >> 1) - fock(s, a & 1, a >> 1, a >> 1) -
               fock(s, b & 1, b >> 1, b >> 1);
  return den != 0 ? num / den : 0;
}
