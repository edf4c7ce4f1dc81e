/* testdata.c — random active spaces for the unit tests and benchmarks
 * (invented data). */
#include "config.h"

#include "testdata.h"

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
