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

int pauli_word_support(int nw, const uint64_t *x, const uint64_t *z, int *qubits) {
  int k = 0;
  for (int i = 0; i < nw; i++)
    for (uint64_t m = x[i] | z[i]; m; m &= m - 1) qubits[k++] = 64 * i + __builtin_ctzll(m);
  return k;
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

/* ---- canonical order by radix sort ----
 *
 * Each term becomes a record of K key words followed by its coefficient.  The
 * key is a big-endian bit string: the weight (wb bits), then two bits per qubit
 * from qubit 0 on, X=00 Y=01 Z=10 I=11, so that unsigned comparison of keys is
 * exactly pauli_word_cmp.  Records are sorted by a stable most-significant-byte
 * radix sort (contiguous memory, no comparisons through pointers), which keeps
 * sums of tens of millions of terms fast; the masks are decoded from the keys
 * afterwards, so the term arrays can be freed while sorting. */

typedef struct canon_layout {
  int n, nw;    /* qubits, mask words */
  int wb;       /* bits of the weight field */
  int K;        /* key words */
  int stride;   /* uint64 words per record: K + 2 (coefficient re, im) */
} canon_layout;

static canon_layout canon_layout_of(int n) {
  canon_layout L;
  L.n = n;
  L.nw = pauli_nwords(n);
  L.wb = n < 65536 ? 16 : 32;
  L.K = (L.wb + 2 * n + 63) / 64;
  if (L.K < 1) L.K = 1;
  L.stride = L.K + 2;
  return L;
}

/* Spread the low 32 bits of v to the even bit positions. */
static inline uint64_t spread32(uint64_t v) {
  v &= 0xffffffffULL;
  v = (v | (v << 16)) & 0x0000ffff0000ffffULL;
  v = (v | (v << 8)) & 0x00ff00ff00ff00ffULL;
  v = (v | (v << 4)) & 0x0f0f0f0f0f0f0f0fULL;
  v = (v | (v << 2)) & 0x3333333333333333ULL;
  v = (v | (v << 1)) & 0x5555555555555555ULL;
  return v;
}

/* Inverse of spread32: gather the even bits into the low 32. */
static inline uint64_t gather32(uint64_t v) {
  v &= 0x5555555555555555ULL;
  v = (v | (v >> 1)) & 0x3333333333333333ULL;
  v = (v | (v >> 2)) & 0x0f0f0f0f0f0f0f0fULL;
  v = (v | (v >> 4)) & 0x00ff00ff00ff00ffULL;
  v = (v | (v >> 8)) & 0x0000ffff0000ffffULL;
  v = (v | (v >> 16)) & 0x00000000ffffffffULL;
  return v;
}

static inline uint64_t rev64(uint64_t v) {
  v = ((v >> 1) & 0x5555555555555555ULL) | ((v & 0x5555555555555555ULL) << 1);
  v = ((v >> 2) & 0x3333333333333333ULL) | ((v & 0x3333333333333333ULL) << 2);
  v = ((v >> 4) & 0x0f0f0f0f0f0f0f0fULL) | ((v & 0x0f0f0f0f0f0f0f0fULL) << 4);
  return __builtin_bswap64(v);
}

/* 32 bits of x and z (qubit t at bit t) -> 64 code bits, qubit 0 at the top. */
static inline uint64_t code_chunk(uint64_t x32, uint64_t z32) {
  uint64_t hi = ~x32 & 0xffffffffULL, lo = ~(x32 ^ z32) & 0xffffffffULL;
  return rev64((spread32(lo) << 1) | spread32(hi));
}

static inline void chunk_masks(uint64_t code, uint64_t *x32, uint64_t *z32) {
  uint64_t r = rev64(code);
  uint64_t hi = gather32(r), lo = gather32(r >> 1);
  *x32 = ~hi & 0xffffffffULL;
  *z32 = ~(*x32 ^ lo) & 0xffffffffULL;
}

/* The key of word (x, z) into key[0..K). */
static void canon_key(const canon_layout *L, const uint64_t *x, const uint64_t *z, uint64_t *key) {
  memset(key, 0, (size_t)L->K * sizeof *key);
  int w = pauli_word_weight(L->nw, x, z);
  /* bit stream position p (0 = MSB of key[0]) */
  key[0] = (uint64_t)w << (64 - L->wb);
  int nchunks = (L->n + 31) / 32;
  for (int c = 0; c < nchunks; c++) {
    uint64_t xs = (x[c / 2] >> (32 * (c & 1))) & 0xffffffffULL;
    uint64_t zs = (z[c / 2] >> (32 * (c & 1))) & 0xffffffffULL;
    int valid = L->n - 32 * c < 32 ? L->n - 32 * c : 32;
    uint64_t code = code_chunk(xs, zs);
    if (valid < 32) code &= ~0ULL << (64 - 2 * valid); /* padding qubits: 00 */
    long p = L->wb + 64L * c;
    int kw = (int)(p / 64), sh = (int)(p % 64);
    key[kw] |= code >> sh;
    if (sh && kw + 1 < L->K) key[kw + 1] |= code << (64 - sh);
  }
}

static void canon_unkey(const canon_layout *L, const uint64_t *key, uint64_t *x, uint64_t *z) {
  memset(x, 0, (size_t)L->nw * sizeof *x);
  memset(z, 0, (size_t)L->nw * sizeof *z);
  int nchunks = (L->n + 31) / 32;
  for (int c = 0; c < nchunks; c++) {
    long p = L->wb + 64L * c;
    int kw = (int)(p / 64), sh = (int)(p % 64);
    uint64_t code = key[kw] << sh;
    if (sh && kw + 1 < L->K) code |= key[kw + 1] >> (64 - sh);
    int valid = L->n - 32 * c < 32 ? L->n - 32 * c : 32;
    uint64_t xs, zs;
    chunk_masks(code, &xs, &zs);
    uint64_t m = valid == 32 ? 0xffffffffULL : (((uint64_t)1 << valid) - 1);
    x[c / 2] |= (xs & m) << (32 * (c & 1));
    z[c / 2] |= (zs & m) << (32 * (c & 1));
  }
}

static inline int key_cmp(const uint64_t *a, const uint64_t *b, int K) {
  for (int i = 0; i < K; i++)
    if (a[i] != b[i]) return a[i] < b[i] ? -1 : 1;
  return 0;
}

/* Stable insertion sort of cnt records by whole key (small buckets). */
static void canon_insertion(uint64_t *rec, size_t cnt, int K, int stride, uint64_t *tmp1) {
  for (size_t i = 1; i < cnt; i++) {
    uint64_t *r = rec + i * (size_t)stride;
    if (key_cmp(r - stride, r, K) <= 0) continue;
    memcpy(tmp1, r, (size_t)stride * sizeof *r);
    size_t j = i;
    while (j > 0 && key_cmp(rec + (j - 1) * (size_t)stride, tmp1, K) > 0) {
      memcpy(rec + j * (size_t)stride, rec + (j - 1) * (size_t)stride, (size_t)stride * sizeof *r);
      j--;
    }
    memcpy(rec + j * (size_t)stride, tmp1, (size_t)stride * sizeof *r);
  }
}

/* Stable MSD radix sort of cnt records on key byte `byte` and after. */
static void canon_radix(uint64_t *rec, uint64_t *tmp, size_t cnt, int byte, int K, int stride) {
  size_t sz = (size_t)stride;
  while (cnt > 1) {
    if (cnt <= 48 || byte >= 8 * K) {
      if (byte < 8 * K) canon_insertion(rec, cnt, K, stride, tmp);
      return;
    }
    int kw = byte / 8, sh = 56 - 8 * (byte % 8);
    size_t count[256] = {0};
    for (size_t i = 0; i < cnt; i++) count[(rec[i * sz + (size_t)kw] >> sh) & 255]++;
    int nonempty = 0;
    for (int b = 0; b < 256; b++) nonempty += count[b] != 0;
    if (nonempty == 1) {
      byte++;
      continue;
    }
    size_t start[256], pos[256], s = 0;
    for (int b = 0; b < 256; b++) {
      start[b] = pos[b] = s;
      s += count[b];
    }
    for (size_t i = 0; i < cnt; i++) {
      int b = (int)((rec[i * sz + (size_t)kw] >> sh) & 255);
      memcpy(tmp + pos[b]++ * sz, rec + i * sz, sz * sizeof *rec);
    }
    memcpy(rec, tmp, cnt * sz * sizeof *rec);
    for (int b = 0; b < 256; b++)
      if (count[b] > 1) canon_radix(rec + start[b] * sz, tmp, count[b], byte + 1, K, stride);
    return;
  }
}

void pauli_sum_canonicalize(pauli_sum *s, double tol) {
  size_t n = s->len, nw = (size_t)s->nw;
  if (n == 0) return;
  canon_layout L = canon_layout_of(s->n);
  size_t sz = (size_t)L.stride;
  uint64_t *rec = xmalloc(n * sz * sizeof *rec);
  for (size_t t = 0; t < n; t++) {
    uint64_t *r = rec + t * sz;
    canon_key(&L, pauli_sum_x(s, t), pauli_sum_z(s, t), r);
    memcpy(r + L.K, &s->c[t], sizeof(double complex));
  }
  free(s->x);
  free(s->z);
  free(s->c);
  s->x = s->z = NULL;
  s->c = NULL;
  s->cap = s->len = 0;
  uint64_t *tmp = xmalloc((n > 48 ? n : 1) * sz * sizeof *tmp);
  canon_radix(rec, tmp, n, 0, L.K, L.stride);
  free(tmp);
  /* merge runs of equal keys in their (stable) arrival order */
  size_t m = 0;
  for (size_t k = 0; k < n;) {
    double complex c;
    memcpy(&c, rec + k * sz + L.K, sizeof c);
    size_t k2 = k + 1;
    while (k2 < n && key_cmp(rec + k * sz, rec + k2 * sz, L.K) == 0) {
      double complex c2;
      memcpy(&c2, rec + k2 * sz + L.K, sizeof c2);
      c += c2;
      k2++;
    }
    if (cabs(c) > tol) {
      if (m != k) memmove(rec + m * sz, rec + k * sz, (size_t)L.K * sizeof *rec);
      memcpy(rec + m * sz + L.K, &c, sizeof c);
      m++;
    }
    k = k2;
  }
  pauli_sum_reserve(s, m ? m : 1);
  for (size_t t = 0; t < m; t++) {
    canon_unkey(&L, rec + t * sz, s->x + t * nw, s->z + t * nw);
    memcpy(&s->c[t], rec + t * sz + L.K, sizeof(double complex));
  }
  s->len = m;
  free(rec);
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
  free(a->slot); /* before sorting: the sort needs the memory */
  pauli_sum_free(out);
  *out = a->terms;
  free(a);
  pauli_sum_canonicalize(out, tol);
}

void pauli_acc_free(pauli_acc *a) {
  if (!a) return;
  pauli_sum_free(&a->terms);
  free(a->slot);
  free(a);
}
