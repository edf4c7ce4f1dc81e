/* pauli.c — Pauli words as bit masks; sums with merging by sort or by hash. */
#include "config.h"

#include "cairn/pauli.h"
#include "cairn/util.h"

#include <ctype.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static inline int popc(uint64_t v) { return __builtin_popcountll(v); }

char pauli_letter(const uint64_t *x, const uint64_t *z, int q) {
  int xb = pauli_get_x(x, q), zb = pauli_get_x(z, q);
  return xb ? (zb ? 'Y' : 'X') : (zb ? 'Z' : 'I');
}

void pauli_set_letter(uint64_t *x, uint64_t *z, int q, char letter) {
  pauli_set(x, q, letter == 'X' || letter == 'Y');
  pauli_set(z, q, letter == 'Z' || letter == 'Y');
}

/* With sigma(x,z) = i^(x z) X^x Z^z per qubit,
 *   sigma1 sigma2 = i^(x1.z1 + x2.z2 + 2 z1.x2 - x3.z3) sigma3,
 * dot products counted as integers over all qubits. */
int pauli_word_mul(int nw, const uint64_t *x1, const uint64_t *z1, const uint64_t *x2,
                   const uint64_t *z2, uint64_t *x3, uint64_t *z3) {
  int k = 0;
  for (int i = 0; i < nw; i++) {
    uint64_t a = x1[i], b = z1[i], c = x2[i], d = z2[i];
    uint64_t xr = a ^ c, zr = b ^ d;
    k += popc(a & b) + popc(c & d) + 2 * popc(b & c) - popc(xr & zr);
    x3[i] = xr;
    z3[i] = zr;
  }
  return ((k % 4) + 4) % 4;
}

int pauli_word_commutes(int nw, const uint64_t *x1, const uint64_t *z1, const uint64_t *x2,
                        const uint64_t *z2) {
  int k = 0;
  for (int i = 0; i < nw; i++) k += popc((x1[i] & z2[i]) ^ (z1[i] & x2[i]));
  return (k & 1) == 0;
}

int pauli_word_weight(int nw, const uint64_t *x, const uint64_t *z) {
  int w = 0;
  for (int i = 0; i < nw; i++) w += popc(x[i] | z[i]);
  return w;
}

int pauli_word_ycount(int nw, const uint64_t *x, const uint64_t *z) {
  int w = 0;
  for (int i = 0; i < nw; i++) w += popc(x[i] & z[i]);
  return w;
}

int pauli_word_equal(int nw, const uint64_t *x1, const uint64_t *z1, const uint64_t *x2,
                     const uint64_t *z2) {
  for (int i = 0; i < nw; i++)
    if (x1[i] != x2[i] || z1[i] != z2[i]) return 0;
  return 1;
}

int pauli_word_is_identity(int nw, const uint64_t *x, const uint64_t *z) {
  for (int i = 0; i < nw; i++)
    if (x[i] | z[i]) return 0;
  return 1;
}

/* Letter code for ordering: X=1, Y=2, Z=3, I=0. */
static inline int code_at(uint64_t x, uint64_t z, int b) {
  int xb = (int)((x >> b) & 1), zb = (int)((z >> b) & 1);
  return xb ? (zb ? 2 : 1) : (zb ? 3 : 0);
}

int pauli_word_cmp(int nw, const uint64_t *x1, const uint64_t *z1, const uint64_t *x2,
                   const uint64_t *z2) {
  int w1 = pauli_word_weight(nw, x1, z1), w2 = pauli_word_weight(nw, x2, z2);
  if (w1 != w2) return w1 < w2 ? -1 : 1;
  for (int i = 0; i < nw; i++) {
    uint64_t d = (x1[i] ^ x2[i]) | (z1[i] ^ z2[i]);
    if (!d) continue;
    int b = __builtin_ctzll(d);
    int c1 = code_at(x1[i], z1[i], b), c2 = code_at(x2[i], z2[i], b);
    if (c1 == 0) return 1;
    if (c2 == 0) return -1;
    return c1 < c2 ? -1 : 1;
  }
  return 0;
}

uint64_t pauli_word_hash(int nw, const uint64_t *x, const uint64_t *z) {
  uint64_t h = 0x9e3779b97f4a7c15ULL;
  for (int i = 0; i < nw; i++) {
    h ^= x[i] + 0x9e3779b97f4a7c15ULL + (h << 6) + (h >> 2);
    h *= 0xff51afd7ed558ccdULL;
    h ^= z[i] + 0xc4ceb9fe1a85ec53ULL + (h << 6) + (h >> 2);
    h *= 0xc4ceb9fe1a85ec53ULL;
  }
  h ^= h >> 33;
  return h;
}

int pauli_word_parse(const char *text, int n, uint64_t *x, uint64_t *z, char *err, size_t errlen,
                     size_t *err_off) {
  int nw = pauli_nwords(n);
  memset(x, 0, sizeof(uint64_t) * (size_t)nw);
  memset(z, 0, sizeof(uint64_t) * (size_t)nw);
  uint64_t *seen = xcalloc((size_t)nw, sizeof(uint64_t));
  const char *p = text;
  int rc = 0, tokens = 0;
  while (*p) {
    while (isspace((unsigned char)*p)) p++;
    if (!*p) break;
    const char *tok = p;
    while (*p && !isspace((unsigned char)*p)) p++;
    size_t len = (size_t)(p - tok);
    tokens++;
    if (err_off) *err_off = (size_t)(tok - text);
    char L = (char)toupper((unsigned char)tok[0]);
    int has_digit = len > 1 && isdigit((unsigned char)tok[1]);
    if (has_digit) {
      /* sparse letter: X12 */
      if (L != 'X' && L != 'Y' && L != 'Z' && L != 'I') {
        snprintf(err, errlen, "`%.*s` is not a Pauli letter with a qubit (X, Y or Z and a number)",
                 (int)len, tok);
        rc = -1;
        break;
      }
      long q = 0;
      size_t i = 1;
      for (; i < len && isdigit((unsigned char)tok[i]); i++) {
        q = q * 10 + (tok[i] - '0');
        if (q > 1000000) break;
      }
      if (i != len) {
        snprintf(err, errlen, "`%.*s` is not a Pauli letter with a qubit (X, Y or Z and a number)",
                 (int)len, tok);
        rc = -1;
        break;
      }
      if (q >= n) {
        snprintf(err, errlen, "qubit %ld is beyond the register (qubits 0..%d)", q, n - 1);
        rc = -1;
        break;
      }
      if (pauli_get_x(seen, (int)q)) {
        snprintf(err, errlen, "qubit %ld appears twice", q);
        rc = -1;
        break;
      }
      pauli_set(seen, (int)q, 1);
      if (L != 'I') pauli_set_letter(x, z, (int)q, L);
    } else {
      /* dense: XYZI, character q is qubit q; "I" alone is the identity */
      if (tokens > 1 || len > (size_t)n) {
        if (len > (size_t)n)
          snprintf(err, errlen, "dense word `%.*s` has %zu letters but the register has %d qubits",
                   (int)len, tok, len, n);
        else snprintf(err, errlen, "a dense word must be written alone");
        rc = -1;
        break;
      }
      for (size_t i = 0; i < len; i++) {
        char c = (char)toupper((unsigned char)tok[i]);
        if (c != 'I' && c != 'X' && c != 'Y' && c != 'Z') {
          snprintf(err, errlen, "`%c` is not a Pauli letter (I, X, Y, Z)", tok[i]);
          if (err_off) *err_off = (size_t)(tok - text) + i;
          rc = -1;
          break;
        }
        pauli_set(seen, (int)i, 1);
        if (c != 'I') pauli_set_letter(x, z, (int)i, c);
      }
      if (rc) break;
      while (isspace((unsigned char)*p)) p++;
      if (*p) {
        snprintf(err, errlen, "a dense word must be written alone");
        if (err_off) *err_off = (size_t)(p - text);
        rc = -1;
        break;
      }
    }
  }
  if (rc == 0 && tokens == 0) {
    snprintf(err, errlen, "empty Pauli word");
    if (err_off) *err_off = 0;
    rc = -1;
  }
  free(seen);
  return rc;
}

char *pauli_word_str(int n, const uint64_t *x, const uint64_t *z) {
  util_buf b = {0};
  int nw = pauli_nwords(n);
  for (int i = 0; i < nw; i++) {
    uint64_t m = x[i] | z[i];
    while (m) {
      int q = i * 64 + __builtin_ctzll(m);
      m &= m - 1;
      util_buf_printf(&b, b.len ? " %c%d" : "%c%d", pauli_letter(x, z, q), q);
    }
  }
  if (!b.len) util_buf_append(&b, "I", 1);
  return b.s;
}

char *pauli_word_dense(int n, const uint64_t *x, const uint64_t *z) {
  char *s = xmalloc((size_t)n + 1);
  for (int q = 0; q < n; q++) s[q] = pauli_letter(x, z, q);
  s[n] = 0;
  return s;
}

/* ---- sums ---- */

void pauli_sum_init(pauli_sum *s, int n) {
  memset(s, 0, sizeof *s);
  s->n = n;
  s->nw = pauli_nwords(n);
}

void pauli_sum_free(pauli_sum *s) {
  free(s->x);
  free(s->z);
  free(s->c);
  int n = s->n;
  pauli_sum_init(s, n);
}

void pauli_sum_clear(pauli_sum *s) { s->len = 0; }

void pauli_sum_reserve(pauli_sum *s, size_t cap) {
  if (cap <= s->cap) return;
  size_t nw = (size_t)s->nw;
  s->x = xrealloc(s->x, cap * nw * sizeof(uint64_t));
  s->z = xrealloc(s->z, cap * nw * sizeof(uint64_t));
  s->c = xrealloc(s->c, cap * sizeof(double complex));
  s->cap = cap;
}

static void grow(pauli_sum *s, size_t need) {
  if (need <= s->cap) return;
  size_t c = s->cap ? s->cap : 8;
  while (c < need) c *= 2;
  pauli_sum_reserve(s, c);
}

void pauli_sum_copy(pauli_sum *out, const pauli_sum *in) {
  out->n = in->n;
  out->nw = in->nw;
  out->len = 0;
  pauli_sum_reserve(out, in->len);
  size_t nw = (size_t)in->nw;
  if (in->len) {
    memcpy(out->x, in->x, in->len * nw * sizeof(uint64_t));
    memcpy(out->z, in->z, in->len * nw * sizeof(uint64_t));
    memcpy(out->c, in->c, in->len * sizeof(double complex));
  }
  out->len = in->len;
}

void pauli_sum_add(pauli_sum *s, const uint64_t *x, const uint64_t *z, double complex c) {
  grow(s, s->len + 1);
  size_t nw = (size_t)s->nw;
  memcpy(s->x + s->len * nw, x, nw * sizeof(uint64_t));
  memcpy(s->z + s->len * nw, z, nw * sizeof(uint64_t));
  s->c[s->len++] = c;
}

void pauli_sum_add_text(pauli_sum *s, const char *text, double complex c) {
  uint64_t *x = xcalloc((size_t)s->nw, sizeof *x), *z = xcalloc((size_t)s->nw, sizeof *z);
  char err[160];
  if (pauli_word_parse(text, s->n, x, z, err, sizeof err, NULL) != 0) {
    fprintf(stderr, "cairn: internal error: bad Pauli text `%s`: %s\n", text, err);
    abort();
  }
  pauli_sum_add(s, x, z, c);
  free(x);
  free(z);
}

void pauli_sum_add_identity(pauli_sum *s, double complex c) {
  grow(s, s->len + 1);
  size_t nw = (size_t)s->nw;
  memset(s->x + s->len * nw, 0, nw * sizeof(uint64_t));
  memset(s->z + s->len * nw, 0, nw * sizeof(uint64_t));
  s->c[s->len++] = c;
}

void pauli_sum_add_sum(pauli_sum *s, const pauli_sum *t, double complex scale) {
  grow(s, s->len + t->len);
  for (size_t i = 0; i < t->len; i++) pauli_sum_add(s, pauli_sum_x(t, i), pauli_sum_z(t, i), scale * t->c[i]);
}

void pauli_sum_scale(pauli_sum *s, double complex f) {
  for (size_t i = 0; i < s->len; i++) s->c[i] *= f;
}

/* Sort a permutation of term indices in canonical word order. */
typedef struct sort_ctx {
  const pauli_sum *s;
} sort_ctx;

static int cmp_terms(const void *a, const void *b, void *arg) {
  const pauli_sum *s = ((sort_ctx *)arg)->s;
  size_t i = *(const size_t *)a, j = *(const size_t *)b;
  int c = pauli_word_cmp(s->nw, pauli_sum_x(s, i), pauli_sum_z(s, i), pauli_sum_x(s, j),
                         pauli_sum_z(s, j));
  if (c) return c;
  return i < j ? -1 : i > j; /* stable: equal words merge in insertion order */
}

void pauli_sum_canonicalize(pauli_sum *s, double tol) {
  size_t n = s->len, nw = (size_t)s->nw;
  if (n == 0) return;
  size_t *perm = xmalloc(n * sizeof *perm);
  for (size_t i = 0; i < n; i++) perm[i] = i;
  sort_ctx ctx = {s};
  qsort_r(perm, n, sizeof *perm, cmp_terms, &ctx);
  uint64_t *nx = xmalloc(n * nw * sizeof(uint64_t)), *nz = xmalloc(n * nw * sizeof(uint64_t));
  double complex *nc = xmalloc(n * sizeof(double complex));
  size_t m = 0;
  for (size_t k = 0; k < n;) {
    size_t i = perm[k];
    double complex c = 0;
    size_t k2 = k;
    while (k2 < n && pauli_word_equal(s->nw, pauli_sum_x(s, i), pauli_sum_z(s, i),
                                      pauli_sum_x(s, perm[k2]), pauli_sum_z(s, perm[k2]))) {
      c += s->c[perm[k2]];
      k2++;
    }
    if (cabs(c) > tol) {
      memcpy(nx + m * nw, pauli_sum_x(s, i), nw * sizeof(uint64_t));
      memcpy(nz + m * nw, pauli_sum_z(s, i), nw * sizeof(uint64_t));
      nc[m++] = c;
    }
    k = k2;
  }
  free(perm);
  free(s->x);
  free(s->z);
  free(s->c);
  s->x = nx;
  s->z = nz;
  s->c = nc;
  s->len = m;
  s->cap = n;
}

static const double complex ipow[4] = {1, I, -1, -I};

void pauli_sum_mul(pauli_sum *out, const pauli_sum *a, const pauli_sum *b) {
  int nw = a->nw;
  pauli_acc *acc = pauli_acc_new(a->n, a->len * b->len);
  uint64_t *x = xmalloc((size_t)nw * sizeof *x), *z = xmalloc((size_t)nw * sizeof *z);
  for (size_t i = 0; i < a->len; i++)
    for (size_t j = 0; j < b->len; j++) {
      int k = pauli_word_mul(nw, pauli_sum_x(a, i), pauli_sum_z(a, i), pauli_sum_x(b, j),
                             pauli_sum_z(b, j), x, z);
      pauli_acc_add(acc, x, z, ipow[k] * a->c[i] * b->c[j]);
    }
  free(x);
  free(z);
  pauli_acc_finish(acc, out, 0.0);
}

void pauli_sum_commutator(pauli_sum *out, const pauli_sum *a, const pauli_sum *b) {
  int nw = a->nw;
  pauli_acc *acc = pauli_acc_new(a->n, a->len + b->len);
  uint64_t *x = xmalloc((size_t)nw * sizeof *x), *z = xmalloc((size_t)nw * sizeof *z);
  for (size_t i = 0; i < a->len; i++)
    for (size_t j = 0; j < b->len; j++) {
      if (pauli_word_commutes(nw, pauli_sum_x(a, i), pauli_sum_z(a, i), pauli_sum_x(b, j),
                              pauli_sum_z(b, j)))
        continue;
      int k = pauli_word_mul(nw, pauli_sum_x(a, i), pauli_sum_z(a, i), pauli_sum_x(b, j),
                             pauli_sum_z(b, j), x, z);
      pauli_acc_add(acc, x, z, 2.0 * ipow[k] * a->c[i] * b->c[j]);
    }
  free(x);
  free(z);
  pauli_acc_finish(acc, out, 0.0);
}

void pauli_sum_adjoint(pauli_sum *out, const pauli_sum *s) {
  if (out != s) pauli_sum_copy(out, s);
  for (size_t i = 0; i < out->len; i++) out->c[i] = conj(out->c[i]);
}

double pauli_sum_max_abs(const pauli_sum *s) {
  double m = 0;
  for (size_t i = 0; i < s->len; i++)
    if (cabs(s->c[i]) > m) m = cabs(s->c[i]);
  return m;
}

double pauli_sum_norm1(const pauli_sum *s) {
  double m = 0;
  for (size_t i = 0; i < s->len; i++) m += cabs(s->c[i]);
  return m;
}

double complex pauli_sum_identity_coeff(const pauli_sum *s) {
  double complex c = 0;
  for (size_t i = 0; i < s->len; i++)
    if (pauli_word_is_identity(s->nw, pauli_sum_x(s, i), pauli_sum_z(s, i))) c += s->c[i];
  return c;
}

long pauli_sum_find(const pauli_sum *s, const uint64_t *x, const uint64_t *z) {
  size_t lo = 0, hi = s->len;
  while (lo < hi) {
    size_t mid = (lo + hi) / 2;
    int c = pauli_word_cmp(s->nw, pauli_sum_x(s, mid), pauli_sum_z(s, mid), x, z);
    if (c == 0) return (long)mid;
    if (c < 0) lo = mid + 1;
    else hi = mid;
  }
  return -1;
}

void pauli_sum_resize(pauli_sum *s, int n) {
  int nw = pauli_nwords(n), ow = s->nw;
  if (nw == ow) {
    s->n = n;
    return;
  }
  uint64_t *nx = xcalloc(s->len * (size_t)nw, sizeof(uint64_t));
  uint64_t *nz = xcalloc(s->len * (size_t)nw, sizeof(uint64_t));
  int m = nw < ow ? nw : ow;
  for (size_t t = 0; t < s->len; t++) {
    memcpy(nx + t * (size_t)nw, s->x + t * (size_t)ow, (size_t)m * sizeof(uint64_t));
    memcpy(nz + t * (size_t)nw, s->z + t * (size_t)ow, (size_t)m * sizeof(uint64_t));
  }
  free(s->x);
  free(s->z);
  s->x = nx;
  s->z = nz;
  s->cap = s->len;
  if (!s->cap) {
    free(s->c);
    s->c = NULL;
  }
  s->n = n;
  s->nw = nw;
}

/* ---- hash accumulator ---- */

struct pauli_acc {
  pauli_sum terms;  /* distinct words in arrival order */
  size_t *slot;     /* open addressing: term index + 1, 0 = empty */
  size_t nslots;    /* power of two */
};

static void acc_rehash(pauli_acc *a, size_t nslots) {
  free(a->slot);
  a->slot = xcalloc(nslots, sizeof *a->slot);
  a->nslots = nslots;
  const pauli_sum *s = &a->terms;
  for (size_t t = 0; t < s->len; t++) {
    size_t h = (size_t)pauli_word_hash(s->nw, pauli_sum_x(s, t), pauli_sum_z(s, t)) & (nslots - 1);
    while (a->slot[h]) h = (h + 1) & (nslots - 1);
    a->slot[h] = t + 1;
  }
}

pauli_acc *pauli_acc_new(int n, size_t expected_terms) {
  pauli_acc *a = xcalloc(1, sizeof *a);
  pauli_sum_init(&a->terms, n);
  size_t ns = 64;
  if (expected_terms > (size_t)1 << 26) expected_terms = (size_t)1 << 26;
  while (ns < 2 * expected_terms) ns *= 2;
  acc_rehash(a, ns);
  return a;
}

void pauli_acc_add(pauli_acc *a, const uint64_t *x, const uint64_t *z, double complex c) {
  pauli_sum *s = &a->terms;
  size_t mask = a->nslots - 1;
  size_t h = (size_t)pauli_word_hash(s->nw, x, z) & mask;
  while (a->slot[h]) {
    size_t t = a->slot[h] - 1;
    if (pauli_word_equal(s->nw, pauli_sum_x(s, t), pauli_sum_z(s, t), x, z)) {
      s->c[t] += c;
      return;
    }
    h = (h + 1) & mask;
  }
  a->slot[h] = s->len + 1;
  pauli_sum_add(s, x, z, c);
  if (2 * s->len > a->nslots) acc_rehash(a, a->nslots * 2);
}

size_t pauli_acc_len(const pauli_acc *a) { return a->terms.len; }

void pauli_acc_finish(pauli_acc *a, pauli_sum *out, double tol) {
  pauli_sum_free(out);
  *out = a->terms;
  pauli_sum_canonicalize(out, tol);
  free(a->slot);
  free(a);
}

void pauli_acc_free(pauli_acc *a) {
  if (!a) return;
  pauli_sum_free(&a->terms);
  free(a->slot);
  free(a);
}
