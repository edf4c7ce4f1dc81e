/* screen.c — energy gradients of Pauli words at a product state by closed forms
 * over the Hamiltonian's terms: no statevector, so it works at any width.
 *
 * At the product state |psi> = prod_q |r_q> (Bloch vector r_q), the expectation
 * of a word w is  <w> = prod_q r_q[w_q]  (r[I] = 1).  For a word P and a term h
 * with P h = i^k w, (i/2)<[P, h]> = i * i^k <w> when they anticommute, 0 else.
 * On an untilted qubit r = (0, 0, +-1), so <w> vanishes unless w has I or Z
 * there: only terms whose X-mask equals P's outside the tilted qubits count.
 * The terms are grouped by that masked X-mask once; each word then costs the
 * size of its group.  At a basis state (no tilted qubit) the group of P is the
 * flip set of P. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* Bloch vectors of the reference, the tilted mask, and H's terms grouped by
 * X-mask outside the tilted qubits (hash, then a counting sort). */
void ans_screen_init(ans_screen *s, const pauli_sum *H, const ans_reference *ref) {
  memset(s, 0, sizeof *s);
  s->H = H;
  s->n = H->n;
  s->nw = H->nw;
  int nw = s->nw, n = s->n;
  s->tilt = xcalloc((size_t)nw, sizeof *s->tilt);
  s->bits = xcalloc((size_t)nw, sizeof *s->bits);
  s->r = xcalloc(3 * (size_t)(n > 0 ? n : 1), sizeof *s->r);
  for (int q = 0; q < n; q++) {
    int b = pauli_get_x(ref->bits, q);
    if (ref->theta) {
      double th = ref->theta[q], ph = ref->phi[q];
      if (ans_angle_is_pole(th)) {
        s->r[3 * q + 2] = th == 0 ? 1.0 : -1.0;
        pauli_set(s->bits, q, th != 0);
        continue;
      }
      double st = sin(th);
      s->r[3 * q] = st * cos(ph);
      s->r[3 * q + 1] = st * sin(ph);
      s->r[3 * q + 2] = cos(th);
      pauli_set(s->tilt, q, 1);
    } else {
      s->r[3 * q + 2] = b ? -1.0 : 1.0;
      pauli_set(s->bits, q, b);
    }
  }
  if (H->len >= UINT32_MAX) {
    fprintf(stderr, "cairn: Hamiltonian too large to screen (%zu terms, limit is %u)\n", H->len,
            UINT32_MAX - 1);
    exit(2);
  }
  /* Group by key; counting sort into `term`. */
  ans_maskset_init(&s->keys, nw, H->len / 4 + 16);
  uint32_t *gid = xmalloc((H->len ? H->len : 1) * sizeof *gid);
  uint64_t *key = xmalloc((size_t)nw * sizeof *key);
  for (size_t t = 0; t < H->len; t++) {
    const uint64_t *x = pauli_sum_x(H, t);
    for (int i = 0; i < nw; i++) key[i] = x[i] & ~s->tilt[i];
    gid[t] = (uint32_t)ans_maskset_add(&s->keys, key, NULL);
  }
  free(key);
  size_t ng = s->keys.len;
  s->start = xcalloc(ng + 1, sizeof *s->start);
  for (size_t t = 0; t < H->len; t++) s->start[gid[t] + 1]++;
  for (size_t g = 0; g < ng; g++) s->start[g + 1] += s->start[g];
  size_t *fill = xmalloc((ng ? ng : 1) * sizeof *fill);
  memcpy(fill, s->start, ng * sizeof *fill);
  s->term = xmalloc((H->len ? H->len : 1) * sizeof *s->term);
  for (size_t t = 0; t < H->len; t++) s->term[fill[gid[t]]++] = (uint32_t)t;
  free(fill);
  free(gid);
}

void ans_screen_free(ans_screen *s) {
  free(s->tilt);
  free(s->bits);
  free(s->r);
  ans_maskset_free(&s->keys);
  free(s->start);
  free(s->term);
  memset(s, 0, sizeof *s);
}

const uint32_t *ans_screen_group(const ans_screen *s, const uint64_t *x, size_t *len) {
  int nw = s->nw;
  uint64_t kbuf[8] = {0}, *key = nw <= 8 ? kbuf : xmalloc((size_t)nw * sizeof *key);
  for (int i = 0; i < nw; i++) key[i] = x[i] & ~s->tilt[i];
  long g = ans_maskset_find(&s->keys, key);
  if (key != kbuf) free(key);
  if (g < 0) {
    *len = 0;
    return NULL;
  }
  *len = s->start[g + 1] - s->start[g];
  return s->term + s->start[g];
}

/* <w> at the product state for a word w whose X-mask is zero outside the
 * tilted qubits: the sign of the untilted Z letters times the Bloch components
 * of the tilted letters. */
static double expect_grouped(const ans_screen *s, const uint64_t *x, const uint64_t *z) {
  int nw = s->nw, neg = 0;
  for (int i = 0; i < nw; i++) neg += __builtin_popcountll(z[i] & s->bits[i] & ~s->tilt[i]);
  double v = (neg & 1) ? -1.0 : 1.0;
  for (int i = 0; i < nw; i++) {
    uint64_t m = (x[i] | z[i]) & s->tilt[i];
    while (m) {
      int b = __builtin_ctzll(m);
      m &= m - 1;
      int q = i * 64 + b;
      int xb = (int)((x[i] >> b) & 1), zb = (int)((z[i] >> b) & 1);
      v *= s->r[3 * q + (xb ? (zb ? 1 : 0) : 2)];
    }
  }
  return v;
}

double ans_screen_expect(const ans_screen *s, const uint64_t *x, const uint64_t *z) {
  for (int i = 0; i < s->nw; i++)
    if (x[i] & ~s->tilt[i]) return 0.0;
  return expect_grouped(s, x, z);
}

/* (i/2)<[P, H]> = Re(i sum_h c_h i^k <P h>) over the anticommuting terms of
 * P's group (P h = i^k w). */
double ans_screen_word(const ans_screen *s, const uint64_t *x, const uint64_t *z) {
  static const double complex ip[4] = {1, I, -1, -I};
  size_t len;
  const uint32_t *grp = ans_screen_group(s, x, &len);
  if (!len) return 0.0;
  const pauli_sum *H = s->H;
  int nw = s->nw;
  uint64_t wbuf[16] = {0}, *wx = nw <= 8 ? wbuf : xmalloc(2 * (size_t)nw * sizeof *wx), *wz = wx + nw;
  double complex acc = 0;
  for (size_t k = 0; k < len; k++) {
    size_t t = grp[k];
    const uint64_t *hx = pauli_sum_x(H, t), *hz = pauli_sum_z(H, t);
    if (pauli_word_commutes(nw, x, z, hx, hz)) continue;
    int ph = pauli_word_mul(nw, x, z, hx, hz, wx, wz);
    acc += H->c[t] * ip[ph] * expect_grouped(s, wx, wz);
  }
  if (wx != wbuf) free(wx);
  return creal(I * acc);
}
