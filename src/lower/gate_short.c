/* gate_short.c — short excitation circuits (after Yordanov, Arvidsson-Shukur,
 * Barnes, Phys. Rev. A 102, 062612, 2020), recognised from the words
 * themselves rather than from the generator's kind, so that any sign
 * convention of the pool builds the right circuit and anything else falls
 * back to the plain lowering.
 *
 * A run of rotations exp(-i theta m_j P_j / 2) qualifies when every word P_j
 * has the same Z string S and the same X/Y support T; then the generator is
 * G = G_T (x) Z_S with G_T = sum_j m_j P_j|_T.
 */
#include "config.h"

#include "lower/gate_int.h"

#include <math.h>
#include <string.h>

enum { SHORT_MAX_WORDS = 64 };

static int bits_of(const uint64_t *m, int nw, int *out, int max) {
  int k = 0;
  for (int j = 0; j < nw; j++) {
    uint64_t b = m[j];
    while (b) {
      if (k == max) return max + 1;
      out[k++] = j * 64 + __builtin_ctzll(b);
      b &= b - 1;
    }
  }
  return k;
}

/* |T| = 2, G_T = a P1 + b P2 with P2 = P1 with both letters swapped (X <-> Y).
 * Local Cliffords L take P1 to X X and P2 to Z Z (letter X: rx(pi/2), which
 * keeps X and takes Y to Z; letter Y: h then s, which take Y to X and X to Z;
 * no signs appear), and cx(a, b) takes X X to X_a and Z Z to Z_b:
 *     exp(-i theta G / 2) = L^+ cx [rx_a(a theta) rz_b(b theta)] cx L.
 * With a Z string, the parity of S gathered on s* turns rx_a into
 * h cx(s*, a) rz cx(s*, a) h and rz_b into cx(s*, b) rz cx(s*, b). */
static void emit_single(gate_lw *w, const int *T, const char *let, const int *S, int nS, int32_t param,
                        double ma, double mb) {
  for (int i = 0; i < 2; i++) {
    if (let[i] == 'X') {
      gate_lw_emit(w, GATE_RX, T[i], -1, -1, M_PI / 2);
    } else {
      gate_lw_emit(w, GATE_H, T[i], -1, -1, 0);
      gate_lw_emit(w, GATE_S, T[i], -1, -1, 0);
    }
  }
  int a = T[0], b = T[1];
  if (nS) gate_lw_ladder(w, S, nS, 0);
  gate_lw_emit(w, GATE_CX, a, b, -1, 0);
  if (nS == 0) {
    gate_lw_emit(w, GATE_RX, a, -1, param, ma);
    gate_lw_emit(w, GATE_RZ, b, -1, param, mb);
  } else {
    int s = S[nS - 1];
    gate_lw_emit(w, GATE_H, a, -1, -1, 0);
    gate_lw_emit(w, GATE_CX, s, a, -1, 0);
    gate_lw_emit(w, GATE_RZ, a, -1, param, ma);
    gate_lw_emit(w, GATE_CX, s, a, -1, 0);
    gate_lw_emit(w, GATE_H, a, -1, -1, 0);
    gate_lw_emit(w, GATE_CX, s, b, -1, 0);
    gate_lw_emit(w, GATE_RZ, b, -1, param, mb);
    gate_lw_emit(w, GATE_CX, s, b, -1, 0);
  }
  gate_lw_emit(w, GATE_CX, a, b, -1, 0);
  if (nS) gate_lw_ladder(w, S, nS, 1);
  for (int i = 0; i < 2; i++) {
    if (let[i] == 'X') {
      gate_lw_emit(w, GATE_RX, T[i], -1, -1, -M_PI / 2);
    } else {
      gate_lw_emit(w, GATE_SDG, T[i], -1, -1, 0);
      gate_lw_emit(w, GATE_H, T[i], -1, -1, 0);
    }
  }
}

/* |T| = 4 and G_T = c |u'><u| + conj(c) |u><u'| (u' = u with every bit of T
 * flipped, c = i*b purely imaginary): a Givens rotation of the pair.  The
 * network cx(t0, tj), j = 1..3, maps u and u' to states that agree on t1..t3
 * (bits u_j xor u_0) and differ on t0; there the pair sees exp(-i theta (-b)
 * sigma_y / 2) = ry(-b theta), applied only for that control pattern x*: a
 * uniformly controlled ry in Gray-code order, 8 ry(+-b theta / 8) and 8 cx.
 * With a Z string, cx(s*, t0) on both sides flips the angle on odd parity. */
static void emit_double(gate_lw *w, const int *T, int u, const int *S, int nS, int32_t param, double b) {
  int t0 = T[0];
  int xstar = 0; /* bit j-1: control T[j] */
  for (int j = 1; j < 4; j++)
    if (((u >> j) & 1) ^ (u & 1)) xstar |= 1 << (j - 1);
  for (int j = 1; j < 4; j++) gate_lw_emit(w, GATE_CX, t0, T[j], -1, 0);
  if (nS) {
    gate_lw_ladder(w, S, nS, 0);
    gate_lw_emit(w, GATE_CX, S[nS - 1], t0, -1, 0);
  }
  for (int k = 0; k < 8; k++) {
    int g = k ^ (k >> 1), gn = ((k + 1) & 7) ^ (((k + 1) & 7) >> 1);
    int d = __builtin_ctz((unsigned)(g ^ gn));
    double sign = (__builtin_popcount((unsigned)(g & xstar)) & 1) ? -1.0 : 1.0;
    gate_lw_emit(w, GATE_RY, t0, -1, param, sign * (-b) / 8);
    gate_lw_emit(w, GATE_CX, T[1 + d], t0, -1, 0);
  }
  if (nS) {
    gate_lw_emit(w, GATE_CX, S[nS - 1], t0, -1, 0);
    gate_lw_ladder(w, S, nS, 1);
  }
  for (int j = 3; j >= 1; j--) gate_lw_emit(w, GATE_CX, t0, T[j], -1, 0);
}

int gate_short_run(gate_lw *w, const ans_rotation *rot, size_t k, int write) {
  const pauli_sum *ws = &w->c->words;
  int nw = ws->nw;
  if (k < 2 || k > SHORT_MAX_WORDS) return 0;
  const uint64_t *x0 = pauli_sum_x(ws, (size_t)rot[0].word), *z0 = pauli_sum_z(ws, (size_t)rot[0].word);
  for (size_t i = 1; i < k; i++) {
    const uint64_t *x = pauli_sum_x(ws, (size_t)rot[i].word), *z = pauli_sum_z(ws, (size_t)rot[i].word);
    if (rot[i].param != rot[0].param) return 0;
    for (int j = 0; j < nw; j++)
      if (x[j] != x0[j] || (z[j] & ~x[j]) != (z0[j] & ~x0[j])) return 0;
  }
  int T[5];
  int nT = bits_of(x0, nw, T, 4);
  if (nT != 2 && nT != 4) return 0;
  int *S = w->sup; /* scratch; the ladder uses cxa/cxb and lv only */
  int nS = 0;
  for (int j = 0; j < nw; j++) {
    uint64_t b = z0[j] & ~x0[j];
    while (b) {
      S[nS++] = j * 64 + __builtin_ctzll(b);
      b &= b - 1;
    }
  }
  /* plain cost: per word 2(w - 1) cx, 2 basis changes per X/Y letter and one rz */
  long plain = (long)k * 2L * (nT + nS - 1), plain_single = (long)k * (2L * nT + 1);
  int32_t param = rot[0].param;
  if (nT == 2) {
    if (k != 2) return 0;
    char l0[2], l1[2];
    const uint64_t *z1 = pauli_sum_z(ws, (size_t)rot[1].word);
    for (int i = 0; i < 2; i++) {
      l0[i] = pauli_get_x(z0, T[i]) ? 'Y' : 'X';
      l1[i] = pauli_get_x(z1, T[i]) ? 'Y' : 'X';
      if (l0[i] == l1[i]) return 0; /* the words would anticommute or be equal */
    }
    long cost = nS ? 2L * nS + 4 : 2;
    long single = 2 + (nS ? 2 : 0);
    for (int i = 0; i < 2; i++) single += l0[i] == 'X' ? 2 : 4;
    if (cost >= plain || cost + single > plain + plain_single) return 0;
    if (write) emit_single(w, T, l0, S, nS, param, rot[0].mult, rot[1].mult);
    return 1;
  }
  /* nT == 4: the matrix elements c(b) = <b'| G_T |b> over the 16 patterns b
   * of T (bit j: qubit T[j]); a word maps |b> to i^e |b'> with e counting,
   * per Y letter, 1 for a 0 bit (Y|0> = i|1>) and 3 for a 1 bit. */
  double re[16] = {0}, im[16] = {0}, scale = 0;
  for (size_t i = 0; i < k; i++) {
    const uint64_t *z = pauli_sum_z(ws, (size_t)rot[i].word);
    double m = rot[i].mult;
    scale += fabs(m);
    for (int b = 0; b < 16; b++) {
      int e = 0;
      for (int j = 0; j < 4; j++)
        if (pauli_get_x(z, T[j])) e += ((b >> j) & 1) ? 3 : 1;
      switch (e & 3) {
      case 0: re[b] += m; break;
      case 1: im[b] += m; break;
      case 2: re[b] -= m; break;
      default: im[b] -= m; break;
      }
    }
  }
  double tol = 1e-12 * (scale > 0 ? scale : 1);
  int u = -1, nz = 0;
  for (int b = 0; b < 16; b++)
    if (hypot(re[b], im[b]) > tol) {
      nz++;
      if (b & 1) u = b;
    }
  if (nz != 2 || u < 0 || hypot(re[u ^ 15], im[u ^ 15]) <= tol || fabs(re[u]) > tol) return 0;
  long cost = 14 + 2L * nS;
  if (cost >= plain || cost + 8 > plain + plain_single) return 0;
  if (write) emit_double(w, T, u, S, nS, param, im[u]);
  return 1;
}
