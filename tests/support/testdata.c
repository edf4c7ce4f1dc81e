/* testdata.c — random active spaces (invented data) and molecules from text
 * for the unit tests, check drivers and benchmarks. */
#include "config.h"

#include "testdata.h"

#include "cairn/element.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void testdata_space(chem_space *s, int norb, int nalpha, int nbeta, const testdata_scales *k, util_rng *r) {
  memset(s, 0, sizeof *s);
  s->norb = norb;
  s->nalpha = nalpha;
  s->nbeta = nbeta;
  s->e_constant = k->e_constant;
  s->h1 = xcalloc((size_t)norb * norb, sizeof *s->h1);
  s->h2 = xcalloc((size_t)norb * norb * norb * norb, sizeof *s->h2);
  const int *irrep = k->irrep;
  double over = k->diag_over > 0 ? k->diag_over : 1;
  for (int p = 0; p < norb; p++)
    for (int q = 0; q <= p; q++) {
      double v = k->h1 * (util_rng_uniform(r) - 0.5);
      if (p == q) v += k->diag0 + k->diag_rise * p / over;
      if (irrep && irrep[p] != irrep[q]) v = 0;
      s->h1[p * norb + q] = s->h1[q * norb + p] = v;
    }
  for (int p = 0; p < norb; p++)
    for (int q = 0; q <= p; q++)
      for (int a = 0; a < norb; a++)
        for (int b = 0; b <= a; b++) {
          if (p * (p + 1) / 2 + q < a * (a + 1) / 2 + b) continue;
          double v = k->h2 * (util_rng_uniform(r) - 0.5);
          if (p == q && a == b) v += k->coulomb;
          if (irrep && (irrep[p] ^ irrep[q] ^ irrep[a] ^ irrep[b])) v = 0;
          int idx[8][4] = {{p, q, a, b}, {q, p, a, b}, {p, q, b, a}, {q, p, b, a},
                           {a, b, p, q}, {b, a, p, q}, {a, b, q, p}, {b, a, q, p}};
          for (int i = 0; i < 8; i++) s->h2[chem_h2_index(norb, idx[i][0], idx[i][1], idx[i][2], idx[i][3])] = v;
        }
}

int testdata_atoms(const char *who, const char *txt, int angstrom, ir_atom **out, int *nat) {
  char *copy = xstrdup(txt), *save = NULL;
  int n = 0;
  size_t cap = 0;
  ir_atom *a = NULL;
  for (char *tok = strtok_r(copy, ";\n", &save); tok; tok = strtok_r(NULL, ";\n", &save)) {
    char sym[8];
    double x, y, z;
    if (sscanf(tok, " %7s %lf %lf %lf", sym, &x, &y, &z) != 4) continue;
    UTIL_GROW(a, cap, (size_t)n + 1);
    memset(&a[n], 0, sizeof a[n]);
    a[n].z = element_z(sym, (int)strlen(sym));
    if (a[n].z == 0) {
      fprintf(stderr, "%s: unknown element `%s`\n", who, sym);
      free(copy);
      free(a);
      return -1;
    }
    snprintf(a[n].symbol, sizeof a[n].symbol, "%s", element_symbol(a[n].z));
    double f = angstrom ? 1.0 / 0.529177210903 : 1.0; /* CODATA 2018 */
    a[n].xyz[0] = x * f;
    a[n].xyz[1] = y * f;
    a[n].xyz[2] = z * f;
    a[n].span = DIAG_NOWHERE;
    n++;
  }
  free(copy);
  *out = a;
  *nat = n;
  return n > 0 ? 0 : -1;
}
