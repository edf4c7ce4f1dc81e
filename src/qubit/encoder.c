/* encoder.c — linear fermion-to-qubit encodings over GF(2): one code path for
 * Jordan-Wigner, parity and Bravyi-Kitaev, which differ only in the matrix A.
 *
 * For the occupation vector n the qubit basis state is b = A n.  Flipping mode
 * j flips the qubits of column j of A; (-1)^{n_k} is the Z word on row k of
 * A^-1.  With p_j = XOR_{k<j} rinv[k] (the parity of the modes below j), the
 * Majorana operators are
 *     c_j = a_j + a_j^dag   = X^{col_j} Z^{p_j}
 *     d_j = -i(a_j - a_j^dag) = i X^{col_j} Z^{p_j ^ rinv_j}
 * and a_j = (c_j + i d_j)/2, a_j^dag = (c_j - i d_j)/2.  In Jordan-Wigner
 * (A = I) these are Z_{<j} X_j and Z_{<j} Y_j. */
#include "config.h"

#include "qubit/qubit_impl.h"

#include "cairn/util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* ---- the table of encodings: each entry fills the columns of A ---- */

typedef void (*qenc_matrix_fn)(int n, int nw, uint64_t *col);

/* Jordan-Wigner (1928): qubit j holds n_j. */
static void matrix_jw(int n, int nw, uint64_t *col) {
  for (int j = 0; j < n; j++) pauli_set(col + (size_t)j * nw, j, 1);
}

/* Parity: qubit i holds n_0 + ... + n_i, so column j is every i >= j. */
static void matrix_parity(int n, int nw, uint64_t *col) {
  for (int j = 0; j < n; j++)
    for (int i = j; i < n; i++) pauli_set(col + (size_t)j * nw, i, 1);
}

/* Bravyi-Kitaev in the construction of Seeley, Richard and Love (2012): qubit
 * i holds the parity of modes (i & (i+1)) .. i (the Fenwick-tree ranges),
 * which is their recursive matrix for n a power of two and its leading n x n
 * block otherwise. */
static void matrix_bk(int n, int nw, uint64_t *col) {
  for (int i = 0; i < n; i++)
    for (int j = i & (i + 1); j <= i; j++) pauli_set(col + (size_t)j * nw, i, 1);
}

typedef struct qenc_kind {
  ir_encoding kind;
  const char *name;
  qenc_matrix_fn matrix;
} qenc_kind;

/* ORDER ir_encoding */
static const qenc_kind qenc_kinds[] = {
    {IR_ENC_JORDAN_WIGNER, "jordan-wigner", matrix_jw},
    {IR_ENC_BRAVYI_KITAEV, "bravyi-kitaev", matrix_bk},
    {IR_ENC_PARITY, "parity", matrix_parity},
};

static const qenc_kind *find_kind(ir_encoding e) {
  for (size_t i = 0; i < sizeof qenc_kinds / sizeof qenc_kinds[0]; i++)
    if (qenc_kinds[i].kind == e) return &qenc_kinds[i];
  return NULL;
}

const char *qubit_encoding_name(ir_encoding e) {
  const qenc_kind *k = find_kind(e);
  return k ? k->name : "unknown";
}

/* Rows of A^-1 from the columns of A, by Gauss-Jordan elimination on [A | I]
 * over GF(2).  A is unit lower triangular for every encoding in the table,
 * but the elimination does not rely on it. */
static void invert_rows(int n, int nw, const uint64_t *col, uint64_t *rinv) {
  size_t w = (size_t)nw;
  uint64_t *a = xcalloc((size_t)n * w, sizeof *a); /* rows of A */
  for (int j = 0; j < n; j++)
    for (int i = 0; i < n; i++)
      if (pauli_get_x(col + (size_t)j * w, i)) pauli_set(a + (size_t)i * w, j, 1);
  memset(rinv, 0, (size_t)n * w * sizeof *rinv);
  for (int i = 0; i < n; i++) pauli_set(rinv + (size_t)i * w, i, 1);
  for (int c = 0; c < n; c++) {
    int piv = -1;
    for (int r = c; r < n && piv < 0; r++)
      if (pauli_get_x(a + (size_t)r * w, c)) piv = r;
    if (piv < 0) {
      fprintf(stderr, "cairn: internal error: encoding matrix is singular\n");
      abort();
    }
    if (piv != c)
      for (size_t k = 0; k < w; k++) {
        uint64_t t = a[(size_t)piv * w + k];
        a[(size_t)piv * w + k] = a[(size_t)c * w + k];
        a[(size_t)c * w + k] = t;
        t = rinv[(size_t)piv * w + k];
        rinv[(size_t)piv * w + k] = rinv[(size_t)c * w + k];
        rinv[(size_t)c * w + k] = t;
      }
    for (int r = 0; r < n; r++)
      if (r != c && pauli_get_x(a + (size_t)r * w, c))
        for (size_t k = 0; k < w; k++) {
          a[(size_t)r * w + k] ^= a[(size_t)c * w + k];
          rinv[(size_t)r * w + k] ^= rinv[(size_t)c * w + k];
        }
  }
  free(a);
}

/* Byte tables: tab[g*256 + b] = XOR of m[8g + t] over the bits t of b. */
static uint64_t *build_table(int n, int nw, const uint64_t *m, int ngroups) {
  size_t w = (size_t)nw;
  uint64_t *tab = xcalloc((size_t)ngroups * 256 * w, sizeof *tab);
  for (int g = 0; g < ngroups; g++) {
    uint64_t *t = tab + (size_t)g * 256 * w;
    for (int b = 1; b < 256; b++) {
      int low = __builtin_ctz((unsigned)b), idx = 8 * g + low;
      const uint64_t *prev = t + (size_t)(b & (b - 1)) * w;
      for (size_t k = 0; k < w; k++) t[(size_t)b * w + k] = prev[k] ^ (idx < n ? m[(size_t)idx * w + k] : 0);
    }
  }
  return tab;
}

static void apply_table(const qubit_encoder *e, const uint64_t *tab, const uint64_t *v, uint64_t *out) {
  size_t w = (size_t)e->nw;
  uint64_t stack[8];
  uint64_t *o = w <= 8 ? stack : xmalloc(w * sizeof *o); /* out may alias v */
  memset(o, 0, w * sizeof *o);
  for (int g = 0; g < e->ngroups; g++) {
    unsigned b = (unsigned)((v[g >> 3] >> (8 * (g & 7))) & 255u);
    if (!b) continue;
    const uint64_t *t = tab + ((size_t)g * 256 + b) * w;
    for (size_t k = 0; k < w; k++) o[k] ^= t[k];
  }
  memcpy(out, o, w * sizeof *o);
  if (o != stack) free(o);
}

void qenc_apply_a(const qubit_encoder *e, const uint64_t *v, uint64_t *out) {
  if (!e->tab_a) {
    if (out != v) memcpy(out, v, (size_t)e->nw * sizeof *out);
    return;
  }
  apply_table(e, e->tab_a, v, out);
}

void qenc_apply_at(const qubit_encoder *e, const uint64_t *w, uint64_t *out) {
  if (!e->tab_t) {
    if (out != w) memcpy(out, w, (size_t)e->nw * sizeof *out);
    return;
  }
  apply_table(e, e->tab_t, w, out);
}

static inline int popcount_and(int nw, const uint64_t *a, const uint64_t *b) {
  int k = 0;
  for (int i = 0; i < nw; i++) k += __builtin_popcountll(a[i] & b[i]);
  return k;
}

/* The Clifford U|n> = |A n> maps X^v Z^w to X^{Av} Z^{A^-T w} exactly.  With
 * sigma(x, z) = i^{|x&z|} X^x Z^z (our words), sigma(v, w) goes to
 * i^{|v&w| - |v'&w'|} sigma(v', w'); both counts have the parity of v.w, so
 * the factor is +1 or -1 and a Hermitian word stays Hermitian. */
int qenc_map_word(const qubit_encoder *e, uint64_t *x, uint64_t *z) {
  if (e->kind == IR_ENC_JORDAN_WIGNER) return 0;
  int before = popcount_and(e->nw, x, z);
  qenc_apply_a(e, x, x);
  qenc_apply_at(e, z, z);
  int after = popcount_and(e->nw, x, z);
  return (((before - after) % 4) + 4) % 4;
}

static const double complex ipow[4] = {1, I, -1, -I};

void qubit_encoder_map_jw(const qubit_encoder *enc, pauli_sum *s) {
  if (enc->kind == IR_ENC_JORDAN_WIGNER) return;
  for (size_t t = 0; t < s->len; t++) {
    int k = qenc_map_word(enc, pauli_sum_x(s, t), pauli_sum_z(s, t));
    s->c[t] *= ipow[k];
  }
  pauli_sum_canonicalize(s, 0.0);
}

qubit_encoder *qubit_encoder_new(ir_encoding e, int nmodes) {
  const qenc_kind *kind = find_kind(e);
  if (!kind || nmodes < 0) {
    fprintf(stderr, "cairn: internal error: no encoding %d on %d modes\n", (int)e, nmodes);
    abort();
  }
  qubit_encoder *enc = xcalloc(1, sizeof *enc);
  enc->kind = e;
  enc->n = nmodes;
  enc->nw = pauli_nwords(nmodes);
  size_t w = (size_t)enc->nw, nm = (size_t)(nmodes > 0 ? nmodes : 1);
  enc->col = xcalloc(nm * w, sizeof(uint64_t));
  enc->rinv = xcalloc(nm * w, sizeof(uint64_t));
  kind->matrix(nmodes, enc->nw, enc->col);
  invert_rows(nmodes, enc->nw, enc->col, enc->rinv);
  enc->ngroups = (nmodes + 7) / 8;
  if (e != IR_ENC_JORDAN_WIGNER) {
    enc->tab_a = build_table(nmodes, enc->nw, enc->col, enc->ngroups);
    enc->tab_t = build_table(nmodes, enc->nw, enc->rinv, enc->ngroups);
  }
  enc->cx = xcalloc(nm * w, sizeof(uint64_t));
  enc->cz = xcalloc(nm * w, sizeof(uint64_t));
  enc->dx = xcalloc(nm * w, sizeof(uint64_t));
  enc->dz = xcalloc(nm * w, sizeof(uint64_t));
  enc->cph = xcalloc(nm, sizeof(int));
  enc->dph = xcalloc(nm, sizeof(int));
  uint64_t *p = xcalloc(w, sizeof *p); /* parity set of the modes below j */
  for (int j = 0; j < nmodes; j++) {
    uint64_t *cx = enc->cx + (size_t)j * w, *cz = enc->cz + (size_t)j * w;
    uint64_t *dx = enc->dx + (size_t)j * w, *dz = enc->dz + (size_t)j * w;
    const uint64_t *u = enc->col + (size_t)j * w, *r = enc->rinv + (size_t)j * w;
    memcpy(cx, u, w * sizeof *cx);
    memcpy(cz, p, w * sizeof *cz);
    memcpy(dx, u, w * sizeof *dx);
    for (size_t k = 0; k < w; k++) dz[k] = p[k] ^ r[k];
    /* X^u Z^p = i^{-|u&p|} sigma(u, p); i X^u Z^w = i^{1-|u&w|} sigma(u, w) */
    enc->cph[j] = ((-popcount_and(enc->nw, cx, cz)) % 4 + 4) % 4;
    enc->dph[j] = ((1 - popcount_and(enc->nw, dx, dz)) % 4 + 4) % 4;
    for (size_t k = 0; k < w; k++) p[k] ^= r[k];
  }
  free(p);
  return enc;
}

void qubit_encoder_free(qubit_encoder *enc) {
  if (!enc) return;
  free(enc->col);
  free(enc->rinv);
  free(enc->tab_a);
  free(enc->tab_t);
  free(enc->cx);
  free(enc->cz);
  free(enc->dx);
  free(enc->dz);
  free(enc->cph);
  free(enc->dph);
  free(enc);
}

int qubit_encoder_modes(const qubit_encoder *enc) { return enc->n; }
ir_encoding qubit_encoder_kind(const qubit_encoder *enc) { return enc->kind; }

/* Expand the product by distributing each ladder operator (two Majorana
 * words) over the terms so far: 2^k words, merged by the accumulator.  Each
 * partial product is kept as (word, coefficient) in a small scratch list. */
void qubit_encoder_add_product(const qubit_encoder *enc, const qubit_ladder *ops, int k,
                               double complex coeff, pauli_acc *acc) {
  int nw = enc->nw;
  size_t w = (size_t)nw;
  size_t cap = (size_t)1 << (k < 20 ? k : 20);
  if (k > 20) {
    fprintf(stderr, "cairn: internal error: product of %d ladder operators\n", k);
    abort();
  }
  uint64_t *x = xcalloc(cap * w * 2, sizeof *x), *z = xcalloc(cap * w * 2, sizeof *z);
  double complex *c = xmalloc(cap * 2 * sizeof *c);
  size_t len = 1;
  c[0] = coeff;
  uint64_t *nx = x + cap * w, *nz = z + cap * w;
  double complex *nc = c + cap;
  for (int i = 0; i < k; i++) {
    int j = ops[i].mode;
    if (j < 0 || j >= enc->n) {
      fprintf(stderr, "cairn: internal error: mode %d outside 0..%d\n", j, enc->n - 1);
      abort();
    }
    const uint64_t *m[2][2] = {{enc->cx + (size_t)j * w, enc->cz + (size_t)j * w},
                               {enc->dx + (size_t)j * w, enc->dz + (size_t)j * w}};
    /* a = (c + i d)/2, a^dag = (c - i d)/2 */
    double complex f[2] = {0.5 * ipow[enc->cph[j]], (ops[i].dagger ? -0.5 * I : 0.5 * I) * ipow[enc->dph[j]]};
    size_t nlen = 0;
    for (size_t t = 0; t < len; t++)
      for (int h = 0; h < 2; h++) {
        int ph = pauli_word_mul(nw, x + t * w, z + t * w, m[h][0], m[h][1], nx + nlen * w, nz + nlen * w);
        nc[nlen++] = c[t] * f[h] * ipow[ph];
      }
    /* swap halves */
    for (size_t t = 0; t < nlen; t++) {
      memcpy(x + t * w, nx + t * w, w * sizeof *x);
      memcpy(z + t * w, nz + t * w, w * sizeof *z);
      c[t] = nc[t];
    }
    len = nlen;
  }
  for (size_t t = 0; t < len; t++)
    if (c[t] != 0) pauli_acc_add(acc, x + t * w, z + t * w, c[t]);
  free(x);
  free(z);
  free(c);
}

void qubit_encoder_bits(const qubit_encoder *enc, const uint64_t *occ, uint64_t *bits) {
  size_t w = (size_t)enc->nw;
  uint64_t *o = xcalloc(w, sizeof *o);
  for (int j = 0; j < enc->n; j++)
    if (pauli_get_x(occ, j))
      for (size_t k = 0; k < w; k++) o[k] ^= enc->col[(size_t)j * w + k];
  memcpy(bits, o, w * sizeof *o);
  free(o);
}

void qubit_encoder_occupations(const qubit_encoder *enc, const uint64_t *bits, uint64_t *occ) {
  size_t w = (size_t)enc->nw;
  uint64_t *o = xcalloc(w, sizeof *o);
  for (int k = 0; k < enc->n; k++)
    if (popcount_and(enc->nw, enc->rinv + (size_t)k * w, bits) & 1) pauli_set(o, k, 1);
  memcpy(occ, o, w * sizeof *o);
  free(o);
}

void qubit_encoder_reference(const qubit_encoder *enc, int nalpha, int nbeta, uint64_t *bits) {
  size_t w = (size_t)enc->nw;
  uint64_t *occ = xcalloc(w, sizeof *occ);
  for (int p = 0; p < nalpha && 2 * p < enc->n; p++) pauli_set(occ, 2 * p, 1);
  for (int p = 0; p < nbeta && 2 * p + 1 < enc->n; p++) pauli_set(occ, 2 * p + 1, 1);
  qubit_encoder_bits(enc, occ, bits);
  free(occ);
}

void qubit_parity_word(const qubit_encoder *enc, qubit_parity which, uint64_t *z) {
  size_t w = (size_t)enc->nw;
  memset(z, 0, w * sizeof *z);
  for (int k = 0; k < enc->n; k++) {
    int spin = k & 1; /* 0 alpha, 1 beta */
    if (which == QUBIT_PARITY_ALPHA && spin) continue;
    if (which == QUBIT_PARITY_BETA && !spin) continue;
    for (size_t i = 0; i < w; i++) z[i] ^= enc->rinv[(size_t)k * w + i];
  }
}
