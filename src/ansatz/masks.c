/* masks.c — hash sets of bit masks (flip sets, group keys). */
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
