/* hamiltonian.c — the active-space Hamiltonian as a qubit Pauli sum.
 *
 * In spin orbitals (P = 2p + spin) the Hamiltonian of chem.h is
 *   H = E_c + sum_PQ h_pq [sP = sQ] a+_P a_Q
 *       + 1/2 sum_PQRS (pq|rs) [sP = sQ][sR = sS] a+_P a+_R a_S a_Q.
 *
 * Fast route, in Jordan-Wigner form.  A product of ladder operators acting on
 * the distinct modes m_0 < ... < m_{d-1} (d <= 4) is, under Jordan-Wigner,
 * the same product on a d-mode "toy" register with its qubits relabelled t ->
 * m_t, times Z on every open interval (m_t, m_{t+1}) that an odd number of the
 * operators on modes above m_t run through (the strings below m_0 cancel in a
 * number-conserving product).  So each class of integrals has a closed form:
 * the toy expansions of every operator pattern are computed once per call with
 * the generic encoder (encoder.c) and, for each set of distinct modes, every
 * integral that acts on exactly that set is folded into one small table of
 * coefficients indexed by (interval pattern, toy word), from which each Pauli
 * word is written once.  For four distinct modes (the bulk of the terms: the
 * XXYY-type words of double excitations) each word belongs to one mode set
 * only; number (Z, ZZ) and hopping (XZ..ZX, YZ..ZY) words are merged by the
 * final sort.  Other encodings: every word through the Clifford of
 * qubit_encoder_map_jw.
 *
 * Only real parts are kept: with real symmetric integrals the imaginary
 * parts cancel exactly in theory and to rounding in practice.
 */
#include "config.h"

#include "qubit/qubit_impl.h"

#include "cairn/util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* One operator pattern on the toy register: which toy mode each ladder
 * operator acts on, and the real parts of its expansion as (slot, value). */
typedef struct toy_pattern {
  int nops;        /* 2 (one-body a+ a) or 4 (two-body a+ a+ a a) */
  int m[4];        /* toy modes of the operators, in product order */
  size_t first, count; /* entries [first, first + count) of the class */
} toy_pattern;

typedef struct toy_entry {
  int slot;        /* (interval bits << 2d) | (toy x << d) | toy z */
  double re;
} toy_entry;

typedef struct toy_class {
  int d;           /* distinct modes */
  toy_pattern *pat;
  int npat;
  toy_entry *ent;
  size_t nent, capent;
  int nslots;      /* 2^(d-1) * 4^d */
} toy_class;

/* Every pattern of nops operators over toy modes 0..d-1 that uses each of them
 * (surjective), with its Jordan-Wigner expansion on d qubits. */
static void toy_class_build(toy_class *tc, int d) {
  memset(tc, 0, sizeof *tc);
  tc->d = d;
  tc->nslots = (1 << (d - 1)) * (1 << (2 * d));
  qubit_encoder *toy = qubit_encoder_new(IR_ENC_JORDAN_WIGNER, d);
  int cap = 0;
  for (int nops = 2; nops <= 4; nops += 2) {
    int total = 1;
    for (int k = 0; k < nops; k++) total *= d;
    for (int code = 0; code < total; code++) {
      int m[4], used = 0, c = code;
      for (int k = 0; k < nops; k++) {
        m[k] = c % d;
        c /= d;
        used |= 1 << m[k];
      }
      if (used != (1 << d) - 1) continue;
      qubit_ladder ops[4];
      for (int k = 0; k < nops; k++) {
        ops[k].mode = m[k];
        ops[k].dagger = k < nops / 2;
      }
      pauli_acc *acc = pauli_acc_new(d, 16);
      qubit_encoder_add_product(toy, ops, nops, 1.0, acc);
      pauli_sum s;
      pauli_sum_init(&s, d);
      pauli_acc_finish(acc, &s, 0.0);
      /* interval t is crossed by the operators on modes above t */
      int ip = 0;
      for (int t = 0; t + 1 < d; t++) {
        int above = 0;
        for (int k = 0; k < nops; k++) above += m[k] > t;
        if (above & 1) ip |= 1 << t;
      }
      if (tc->npat == cap) {
        cap = cap ? 2 * cap : 16;
        tc->pat = xrealloc(tc->pat, (size_t)cap * sizeof *tc->pat);
      }
      toy_pattern *p = &tc->pat[tc->npat++];
      p->nops = nops;
      memcpy(p->m, m, sizeof m);
      p->first = tc->nent;
      for (size_t t = 0; t < s.len; t++) {
        double re = creal(s.c[t]);
        if (re == 0) continue;
        UTIL_GROW(tc->ent, tc->capent, tc->nent + 1);
        int slot = (ip << (2 * d)) | ((int)s.x[t] << d) | (int)s.z[t];
        tc->ent[tc->nent++] = (toy_entry){slot, re};
      }
      p->count = tc->nent - p->first;
      pauli_sum_free(&s);
    }
  }
  qubit_encoder_free(toy);
}

static void toy_class_free(toy_class *tc) {
  free(tc->pat);
  free(tc->ent);
}

/* Set bits [a, b) of mask m. */
static void set_range(uint64_t *m, int a, int b) {
  while (a < b) {
    int w = a >> 6, lo = a & 63;
    int hi = (b - (w << 6)) < 64 ? b - (w << 6) : 64;
    uint64_t bits = (hi == 64 ? ~0ULL : (((uint64_t)1 << hi) - 1)) & (~0ULL << lo);
    m[w] |= bits;
    a = (w << 6) + hi;
  }
}

/* The active space is the user's choice, so running out of memory is refused
 * with a message that says what to change (util.h), not an allocation abort. */
static void refuse(int norb, size_t terms, uint64_t need, uint64_t avail) {
  fprintf(stderr,
          "cairn: the qubit Hamiltonian of %d orbitals (%d qubits) has more than %zu terms and needs "
          "%.1f GiB more memory than is available (%.1f GiB); choose a smaller active space\n",
          norb, 2 * norb, terms, (double)need / 1073741824.0, (double)avail / 1073741824.0);
  exit(2);
}

/* Room for one more term: double the sum's arrays, checking memory first. */
static void grow_checked(pauli_sum *out, int norb) {
  if (out->len < out->cap) return;
  size_t cap = out->cap ? 2 * out->cap : 1024;
  uint64_t per = 2 * (uint64_t)out->nw * sizeof(uint64_t) + sizeof(double complex);
  uint64_t need = (uint64_t)(cap - out->cap) * per, avail = util_mem_available();
  if (avail && need > avail) refuse(norb, out->len, need, avail);
  pauli_sum_reserve(out, cap);
}

/* Scratch for one mode set: coefficients by slot and the slots touched. */
typedef struct ham_ctx {
  const chem_space *s;
  int nq, nw;
  double *buf;
  int *touched;
  int ntouched;
  char *mark;
  uint64_t *x, *z;
  pauli_sum *out;
} ham_ctx;

/* Fold every pattern of class tc on the mode set D into the scratch table,
 * then write its words into the output sum. */
static void fold_set(ham_ctx *h, const toy_class *tc, const int *D) {
  const chem_space *cs = h->s;
  int no = cs->norb, d = tc->d;
  for (int pi = 0; pi < tc->npat; pi++) {
    const toy_pattern *p = &tc->pat[pi];
    if (!p->count) continue;
    double coef;
    if (p->nops == 2) {
      int P = D[p->m[0]], Q = D[p->m[1]];
      if ((P ^ Q) & 1) continue;
      coef = cs->h1[(P >> 1) * no + (Q >> 1)];
    } else {
      int P = D[p->m[0]], R = D[p->m[1]], S = D[p->m[2]], Q = D[p->m[3]];
      if (((P ^ Q) & 1) || ((R ^ S) & 1)) continue;
      coef = 0.5 * cs->h2[chem_h2_index(no, P >> 1, Q >> 1, R >> 1, S >> 1)];
    }
    if (coef == 0) continue;
    for (size_t e = p->first; e < p->first + p->count; e++) {
      int slot = tc->ent[e].slot;
      if (!h->mark[slot]) {
        h->mark[slot] = 1;
        h->touched[h->ntouched++] = slot;
      }
      h->buf[slot] += coef * tc->ent[e].re;
    }
  }
  size_t w = (size_t)h->nw;
  for (int k = 0; k < h->ntouched; k++) {
    int slot = h->touched[k];
    double c = h->buf[slot];
    h->buf[slot] = 0;
    h->mark[slot] = 0;
    if (c == 0) continue;
    memset(h->x, 0, w * sizeof *h->x);
    memset(h->z, 0, w * sizeof *h->z);
    int tz = slot & ((1 << d) - 1), tx = (slot >> d) & ((1 << d) - 1), ip = slot >> (2 * d);
    for (int t = 0; t < d; t++) {
      if ((tx >> t) & 1) pauli_set(h->x, D[t], 1);
      if ((tz >> t) & 1) pauli_set(h->z, D[t], 1);
    }
    for (int t = 0; t + 1 < d; t++)
      if ((ip >> t) & 1) set_range(h->z, D[t] + 1, D[t + 1]);
    grow_checked(h->out, cs->norb);
    pauli_sum_add(h->out, h->x, h->z, c);
  }
  h->ntouched = 0;
}

void qubit_hamiltonian(const chem_space *s, const qubit_encoder *enc, pauli_sum *out) {
  int nq = 2 * s->norb;
  if (enc->n != nq) {
    fprintf(stderr, "cairn: internal error: encoder of %d modes for %d orbitals\n", enc->n, s->norb);
    abort();
  }
  pauli_sum_free(out);
  pauli_sum_init(out, nq);
  /* terms before merging: at most 8 per spin-allowed set of four modes
   * (fewer when integrals vanish by symmetry); start there, capped, and grow */
  double no = s->norb;
  double est = 8.0 * (2.0 * no * (no - 1) * (no - 2) * (no - 3) / 24.0 + (no * (no - 1) / 2) * (no * (no - 1) / 2)) +
               4.0 * (double)nq * nq * nq + 64;
  pauli_sum_reserve(out, est < 4e6 ? (size_t)est : (size_t)4000000);
  pauli_sum_add_identity(out, s->e_constant);

  toy_class tc[5];
  for (int d = 1; d <= 4; d++) toy_class_build(&tc[d], d);
  ham_ctx h = {0};
  h.s = s;
  h.nq = nq;
  h.nw = pauli_nwords(nq);
  h.buf = xcalloc(2048, sizeof *h.buf);
  h.mark = xcalloc(2048, 1);
  h.touched = xmalloc(2048 * sizeof *h.touched);
  h.x = xcalloc((size_t)h.nw, sizeof *h.x);
  h.z = xcalloc((size_t)h.nw, sizeof *h.z);
  h.out = out;

  int D[4];
  for (D[0] = 0; D[0] < nq; D[0]++) {
    fold_set(&h, &tc[1], D);
    for (D[1] = D[0] + 1; D[1] < nq; D[1]++) {
      fold_set(&h, &tc[2], D);
      for (D[2] = D[1] + 1; D[2] < nq; D[2]++) {
        fold_set(&h, &tc[3], D);
        for (D[3] = D[2] + 1; D[3] < nq; D[3]++) {
          /* a spin-conserving two-body term has an even number of beta modes */
          if (((D[0] ^ D[1] ^ D[2] ^ D[3]) & 1) == 0) fold_set(&h, &tc[4], D);
        }
      }
    }
  }
  free(h.buf);
  free(h.mark);
  free(h.touched);
  free(h.x);
  free(h.z);
  for (int d = 1; d <= 4; d++) toy_class_free(&tc[d]);

  /* the sort needs one record per term beside the arrays (pauli.c) */
  uint64_t rec = 8 * (uint64_t)((16 + 2 * nq + 63) / 64 + 2), avail = util_mem_available();
  if (avail && (uint64_t)out->len * rec > avail) refuse(s->norb, out->len, (uint64_t)out->len * rec, avail);
  if (enc->kind != IR_ENC_JORDAN_WIGNER)
    for (size_t t = 0; t < out->len; t++) {
      int k = qenc_map_word(enc, pauli_sum_x(out, t), pauli_sum_z(out, t));
      if (k == 2) out->c[t] = -out->c[t];
    }
  pauli_sum_canonicalize(out, 1e-14);
}
