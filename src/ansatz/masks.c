/* masks.c — hash sets of bit masks, and the Clifford map of a linear encoding. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

uint64_t ans_mask_hash(int nw, const uint64_t *m) {
  uint64_t h = 0x243f6a8885a308d3ULL;
  for (int i = 0; i < nw; i++) {
    h ^= m[i] + 0x9e3779b97f4a7c15ULL + (h << 6) + (h >> 2);
    h *= 0xbf58476d1ce4e5b9ULL;
  }
  h ^= h >> 31;
  h *= 0x94d049bb133111ebULL;
  h ^= h >> 29;
  return h;
}

static void set_rehash(ans_maskset *s, size_t nslots) {
  free(s->slot);
  s->slot = xcalloc(nslots, sizeof *s->slot);
  s->nslots = nslots;
  for (size_t t = 0; t < s->len; t++) {
    size_t h = (size_t)ans_mask_hash(s->nw, s->m + t * (size_t)s->nw) & (nslots - 1);
    while (s->slot[h]) h = (h + 1) & (nslots - 1);
    s->slot[h] = (uint32_t)(t + 1);
  }
}

void ans_maskset_init(ans_maskset *s, int nw, size_t expect) {
  memset(s, 0, sizeof *s);
  s->nw = nw;
  size_t ns = 64;
  while (ns < 2 * expect) ns *= 2;
  set_rehash(s, ns);
}

void ans_maskset_free(ans_maskset *s) {
  free(s->m);
  free(s->slot);
  memset(s, 0, sizeof *s);
}

long ans_maskset_find(const ans_maskset *s, const uint64_t *m) {
  size_t mask = s->nslots - 1, nw = (size_t)s->nw;
  size_t h = (size_t)ans_mask_hash(s->nw, m) & mask;
  while (s->slot[h]) {
    size_t t = s->slot[h] - 1;
    if (memcmp(s->m + t * nw, m, nw * sizeof *m) == 0) return (long)t;
    h = (h + 1) & mask;
  }
  return -1;
}

size_t ans_maskset_add(ans_maskset *s, const uint64_t *m, int *added) {
  size_t mask = s->nslots - 1, nw = (size_t)s->nw;
  size_t h = (size_t)ans_mask_hash(s->nw, m) & mask;
  while (s->slot[h]) {
    size_t t = s->slot[h] - 1;
    if (memcmp(s->m + t * nw, m, nw * sizeof *m) == 0) {
      if (added) *added = 0;
      return t;
    }
    h = (h + 1) & mask;
  }
  if (s->len >= UINT32_MAX - 1) {
    fprintf(stderr, "cairn: too many distinct Pauli masks (limit is %u)\n", UINT32_MAX - 1);
    exit(2);
  }
  UTIL_GROW(s->m, s->cap, (s->len + 1) * nw);
  memcpy(s->m + s->len * nw, m, nw * sizeof *m);
  s->slot[h] = (uint32_t)(s->len + 1);
  s->len++;
  if (2 * s->len > s->nslots) set_rehash(s, 2 * s->nslots);
  if (added) *added = 1;
  return s->len - 1;
}

/* The encoding sends occupation n to bits A n; column j of A is the encoded
 * state of the single occupied mode j, column j of A^-1 the occupations of the
 * single set bit j.  Jordan-Wigner is recognised and skipped. */
void ans_clifford_init(ans_clifford *c, const qubit_encoder *enc) {
  memset(c, 0, sizeof *c);
  int n = qubit_encoder_modes(enc), nw = pauli_nwords(n);
  c->n = n;
  c->nw = nw;
  c->identity = qubit_encoder_kind(enc) == IR_ENC_JORDAN_WIGNER;
  if (c->identity) return;
  c->acol = xcalloc((size_t)n * (size_t)nw, sizeof *c->acol);
  c->ainv = xcalloc((size_t)n * (size_t)nw, sizeof *c->ainv);
  uint64_t *e = xcalloc((size_t)nw, sizeof *e);
  for (int j = 0; j < n; j++) {
    memset(e, 0, (size_t)nw * sizeof *e);
    pauli_flip(e, j);
    qubit_encoder_bits(enc, e, c->acol + (size_t)j * (size_t)nw);
    qubit_encoder_occupations(enc, e, c->ainv + (size_t)j * (size_t)nw);
  }
  free(e);
}

void ans_clifford_free(ans_clifford *c) {
  free(c->acol);
  free(c->ainv);
  memset(c, 0, sizeof *c);
}

static int popc_and(int nw, const uint64_t *a, const uint64_t *b) {
  int k = 0;
  for (int i = 0; i < nw; i++) k += __builtin_popcountll(a[i] & b[i]);
  return k;
}

/* sigma(v,u) = i^{|v&u|} X^v Z^u, and C X^v Z^u C^+ = X^{Av} Z^{A^-T u}, so
 * sigma(v,u) -> i^{|v&u| - |v'&u'|} sigma(v',u'). */
void ans_clifford_apply(const ans_clifford *c, pauli_sum *s) {
  if (c->identity) return;
  static const double complex ip[4] = {1, I, -1, -I};
  int nw = c->nw, n = c->n;
  uint64_t *xv = xmalloc((size_t)nw * sizeof *xv), *zu = xmalloc((size_t)nw * sizeof *zu);
  for (size_t t = 0; t < s->len; t++) {
    uint64_t *x = pauli_sum_x(s, t), *z = pauli_sum_z(s, t);
    int k0 = popc_and(nw, x, z);
    memset(xv, 0, (size_t)nw * sizeof *xv);
    memset(zu, 0, (size_t)nw * sizeof *zu);
    for (int j = 0; j < n; j++) {
      if (pauli_get_x(x, j)) {
        const uint64_t *a = c->acol + (size_t)j * (size_t)nw;
        for (int i = 0; i < nw; i++) xv[i] ^= a[i];
      }
      if (popc_and(nw, c->ainv + (size_t)j * (size_t)nw, z) & 1) pauli_flip(zu, j);
    }
    int k1 = popc_and(nw, xv, zu);
    s->c[t] *= ip[(((k0 - k1) % 4) + 4) % 4];
    memcpy(x, xv, (size_t)nw * sizeof *xv);
    memcpy(z, zu, (size_t)nw * sizeof *zu);
  }
  free(xv);
  free(zu);
}
