/* space.c — operations on active-space Hamiltonians: freeing, core folding
 * and orbital selection in the orbital basis, and the reference energy. */
#include "config.h"

#include "cairn/chem.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

void chem_space_free(chem_space *s) {
  if (!s) return;
  free(s->h1);
  free(s->h2);
  free(s->orbital_energies);
  memset(s, 0, sizeof *s);
}

/* Fold the doubly occupied `core` orbitals of `full` into the constant and
 * keep the `active` orbitals:
 *   E_core = sum_c 2 h_cc + sum_cd [2 (cc|dd) - (cd|dc)]
 *   h'_pq  = h_pq + sum_c [2 (pq|cc) - (pc|cq)]
 * Orbital energies follow the selection when `full` has them. */
void chem_space_select(const chem_space *full, const int *core, int ncore, const int *active, int nact,
                       int nalpha, int nbeta, chem_space *out) {
  int n = full->norb;
  const double *h = full->h1, *g = full->h2;
  memset(out, 0, sizeof *out);
  double ec = 0;
  for (int a = 0; a < ncore; a++) {
    int c = core[a];
    ec += 2 * h[c * n + c];
    for (int b = 0; b < ncore; b++) {
      int e = core[b];
      ec += 2 * g[chem_h2_index(n, c, c, e, e)] - g[chem_h2_index(n, c, e, e, c)];
    }
  }
  out->norb = nact;
  out->nalpha = nalpha;
  out->nbeta = nbeta;
  out->e_nuclear = full->e_nuclear;
  out->has_nuclear = full->has_nuclear;
  out->e_constant = full->e_constant + ec;
  out->h1 = xmalloc((size_t)nact * nact * sizeof *out->h1);
  for (int i = 0; i < nact; i++)
    for (int j = 0; j < nact; j++) {
      int p = active[i], q = active[j];
      double v = h[p * n + q];
      for (int a = 0; a < ncore; a++) {
        int c = core[a];
        v += 2 * g[chem_h2_index(n, p, q, c, c)] - g[chem_h2_index(n, p, c, c, q)];
      }
      out->h1[i * nact + j] = v;
    }
  size_t m = (size_t)nact;
  out->h2 = xmalloc(m * m * m * m * sizeof *out->h2);
  for (int i = 0; i < nact; i++)
    for (int j = 0; j < nact; j++)
      for (int k = 0; k < nact; k++)
        for (int l = 0; l < nact; l++)
          out->h2[chem_h2_index(nact, i, j, k, l)] = g[chem_h2_index(n, active[i], active[j], active[k], active[l])];
  if (full->orbital_energies) {
    out->orbital_energies = xmalloc(m * sizeof(double));
    for (int i = 0; i < nact; i++) out->orbital_energies[i] = full->orbital_energies[active[i]];
  }
}

/* Energy of the reference determinant (orbitals 0..nbeta-1 doubly occupied,
 * nbeta..nalpha-1 alpha): the Slater-Condon diagonal element. */
double chem_reference_energy(const chem_space *s) {
  int n = s->norb, na = s->nalpha, nb = s->nbeta;
  const double *h = s->h1, *g = s->h2;
  double e = s->e_constant;
  for (int i = 0; i < na; i++) e += h[i * n + i];
  for (int i = 0; i < nb; i++) e += h[i * n + i];
  /* Coulomb between all pairs of electrons, exchange between same spins */
  for (int i = 0; i < na; i++)
    for (int j = 0; j < na; j++) e += 0.5 * (g[chem_h2_index(n, i, i, j, j)] - g[chem_h2_index(n, i, j, j, i)]);
  for (int i = 0; i < nb; i++)
    for (int j = 0; j < nb; j++) e += 0.5 * (g[chem_h2_index(n, i, i, j, j)] - g[chem_h2_index(n, i, j, j, i)]);
  for (int i = 0; i < na; i++)
    for (int j = 0; j < nb; j++) e += g[chem_h2_index(n, i, i, j, j)];
  return e;
}
