/* test_qubit.c — encodings, the qubit Hamiltonian, symmetry operators and Z2
 * tapering, checked against facts of the trade and against a slow, generic
 * route (products of ladder operators expanded term by term). */
#include "config.h"

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include <lapacke.h>
#include <math.h>

#include "cairn/qubit.h"
#include "cairn/util.h"

static const ir_encoding ENCODINGS[3] = {IR_ENC_JORDAN_WIGNER, IR_ENC_BRAVYI_KITAEV, IR_ENC_PARITY};

/* ---- helpers ---- */

/* A random active space: real integrals with the 8-fold permutational
 * symmetry; with `irrep` given, integrals that break the Z2 labelling of the
 * orbitals (a point group of order two) are zero.  Invented data. */
static chem_space random_space(int norb, int nalpha, int nbeta, uint64_t seed, const int *irrep) {
  chem_space s = {0};
  s.norb = norb;
  s.nalpha = nalpha;
  s.nbeta = nbeta;
  s.e_constant = 0.75;
  s.h1 = xcalloc((size_t)norb * norb, sizeof(double));
  s.h2 = xcalloc((size_t)norb * norb * norb * norb, sizeof(double));
  util_rng r;
  util_rng_seed(&r, seed);
  for (int p = 0; p < norb; p++)
    for (int q = 0; q <= p; q++) {
      double v = util_rng_uniform(&r) - 0.5;
      if (p == q) v -= 2.0 - 0.3 * p;
      if (irrep && irrep[p] != irrep[q]) v = 0;
      s.h1[p * norb + q] = s.h1[q * norb + p] = v;
    }
  for (int p = 0; p < norb; p++)
    for (int q = 0; q <= p; q++)
      for (int rr = 0; rr < norb; rr++)
        for (int ss = 0; ss <= rr; ss++) {
          if (p * (p + 1) / 2 + q < rr * (rr + 1) / 2 + ss) continue;
          double v = 0.3 * (util_rng_uniform(&r) - 0.5);
          if (p == q && rr == ss) v += 0.5;
          if (irrep && (irrep[p] ^ irrep[q] ^ irrep[rr] ^ irrep[ss])) v = 0;
          int idx[8][4] = {{p, q, rr, ss}, {q, p, rr, ss}, {p, q, ss, rr}, {q, p, ss, rr},
                           {rr, ss, p, q}, {ss, rr, p, q}, {rr, ss, q, p}, {ss, rr, q, p}};
          for (int k = 0; k < 8; k++) s.h2[chem_h2_index(norb, idx[k][0], idx[k][1], idx[k][2], idx[k][3])] = v;
        }
  return s;
}

static void free_space(chem_space *s) {
  free(s->h1);
  free(s->h2);
}

/* The slow route: every integral as a product of ladder operators. */
static void slow_hamiltonian(const chem_space *s, const qubit_encoder *enc, pauli_sum *out) {
  int nq = 2 * s->norb, no = s->norb;
  pauli_acc *acc = pauli_acc_new(nq, 1024);
  uint64_t zero[4] = {0};
  pauli_acc_add(acc, zero, zero, s->e_constant);
  for (int P = 0; P < nq; P++)
    for (int Q = 0; Q < nq; Q++) {
      if ((P ^ Q) & 1) continue;
      qubit_ladder ops[2] = {{P, 1}, {Q, 0}};
      qubit_encoder_add_product(enc, ops, 2, s->h1[(P / 2) * no + Q / 2], acc);
    }
  for (int P = 0; P < nq; P++)
    for (int Q = 0; Q < nq; Q++)
      for (int R = 0; R < nq; R++)
        for (int S = 0; S < nq; S++) {
          if (((P ^ Q) & 1) || ((R ^ S) & 1)) continue;
          double g = s->h2[chem_h2_index(no, P / 2, Q / 2, R / 2, S / 2)];
          if (g == 0) continue;
          qubit_ladder ops[4] = {{P, 1}, {R, 1}, {S, 0}, {Q, 0}};
          qubit_encoder_add_product(enc, ops, 4, 0.5 * g, acc);
        }
  pauli_acc_finish(acc, out, 1e-14);
}

/* max |a - b| over all words */
static double sum_distance(const pauli_sum *a, const pauli_sum *b) {
  pauli_sum d;
  pauli_sum_init(&d, a->n);
  pauli_sum_copy(&d, a);
  pauli_sum_add_sum(&d, b, -1.0);
  pauli_sum_canonicalize(&d, 0.0);
  double m = pauli_sum_max_abs(&d);
  pauli_sum_free(&d);
  return m;
}

/* Dense matrix of a sum on n <= 12 qubits: column b holds H|b>. */
static double complex *dense(const pauli_sum *s) {
  size_t dim = (size_t)1 << s->n;
  double complex *m = xcalloc(dim * dim, sizeof *m);
  static const double complex ip[4] = {1, I, -1, -I};
  for (size_t t = 0; t < s->len; t++) {
    uint64_t x = pauli_sum_x(s, t)[0], z = pauli_sum_z(s, t)[0];
    int y = __builtin_popcountll(x & z);
    for (size_t b = 0; b < dim; b++) {
      int sign = __builtin_popcountll(z & b) & 1;
      m[(b ^ x) * dim + b] += s->c[t] * ip[(y + 2 * sign) & 3];
    }
  }
  return m;
}

/* Eigenvalues (ascending) of the Hermitian matrix m restricted to the basis
 * states listed in idx (dim entries). */
static double *eigenvalues(const double complex *m, size_t full, const size_t *idx, size_t dim) {
  lapack_complex_double *a = xmalloc(dim * dim * sizeof *a);
  for (size_t i = 0; i < dim; i++)
    for (size_t j = 0; j < dim; j++) a[i * dim + j] = m[idx[i] * full + idx[j]];
  double *w = xmalloc(dim * sizeof *w);
  int info = LAPACKE_zheev(LAPACK_ROW_MAJOR, 'N', 'U', (lapack_int)dim, a, (lapack_int)dim, w);
  assert_int_equal(info, 0);
  free(a);
  return w;
}

static size_t *all_states(size_t dim) {
  size_t *idx = xmalloc(dim * sizeof *idx);
  for (size_t i = 0; i < dim; i++) idx[i] = i;
  return idx;
}

/* ---- encodings ---- */

/* The Bravyi-Kitaev matrix for 8 modes as printed by Seeley, Richard and
 * Love (J. Chem. Phys. 137, 224109, 2012), rows recalled from memory as the
 * ranges each qubit sums: b0=n0, b1=n0+n1, b2=n2, b3=n0..n3, b4=n4,
 * b5=n4+n5, b6=n6, b7=n0..n7.  Parity: b_i = n_0 + ... + n_i. */
static void test_encoding_matrices(void **state) {
  (void)state;
  static const char *bk8[8] = {"10000000", "11000000", "00100000", "11110000",
                               "00001000", "00001100", "00000010", "11111111"};
  qubit_encoder *bk = qubit_encoder_new(IR_ENC_BRAVYI_KITAEV, 8);
  qubit_encoder *par = qubit_encoder_new(IR_ENC_PARITY, 8);
  for (int j = 0; j < 8; j++) {
    uint64_t occ = (uint64_t)1 << j, b = 0, p = 0;
    qubit_encoder_bits(bk, &occ, &b);
    qubit_encoder_bits(par, &occ, &p);
    for (int i = 0; i < 8; i++) {
      assert_int_equal((int)((b >> i) & 1), bk8[i][j] - '0');
      assert_int_equal((int)((p >> i) & 1), j <= i);
    }
  }
  qubit_encoder_free(bk);
  qubit_encoder_free(par);
  /* bits and occupations are inverse on every basis state (n = 7: not a power of two) */
  for (int e = 0; e < 3; e++) {
    qubit_encoder *enc = qubit_encoder_new(ENCODINGS[e], 7);
    for (uint64_t occ = 0; occ < 128; occ++) {
      uint64_t b = 0, back = 0;
      qubit_encoder_bits(enc, &occ, &b);
      qubit_encoder_occupations(enc, &b, &back);
      assert_true(back == occ);
    }
    qubit_encoder_free(enc);
  }
}

/* Canonical anticommutation relations {a_i, a_j^dag} = delta_ij and
 * {a_i, a_j} = 0 (common practice) hold in every encoding, here computed with
 * the Pauli algebra on 7 modes and on a sample of a 130-mode register. */
static void check_car(ir_encoding e, int n, const int *modes, int nmodes) {
  qubit_encoder *enc = qubit_encoder_new(e, n);
  for (int a = 0; a < nmodes; a++)
    for (int b = 0; b < nmodes; b++)
      for (int da = 0; da < 2; da++)
        for (int db = 0; db < 2; db++) {
          int i = modes[a], j = modes[b];
          pauli_acc *acc = pauli_acc_new(n, 16);
          qubit_ladder p1[2] = {{i, da}, {j, db}}, p2[2] = {{j, db}, {i, da}};
          qubit_encoder_add_product(enc, p1, 2, 1.0, acc);
          qubit_encoder_add_product(enc, p2, 2, 1.0, acc);
          pauli_sum s;
          pauli_sum_init(&s, n);
          pauli_acc_finish(acc, &s, 1e-15);
          if (i == j && da != db) {
            assert_int_equal(s.len, 1);
            assert_true(pauli_word_is_identity(s.nw, s.x, s.z));
            assert_true(cabs(s.c[0] - 1.0) < 1e-15);
          } else {
            assert_int_equal(s.len, 0);
          }
          pauli_sum_free(&s);
        }
  qubit_encoder_free(enc);
}

static void test_anticommutation(void **state) {
  (void)state;
  int small[7] = {0, 1, 2, 3, 4, 5, 6};
  int wide[6] = {0, 1, 63, 64, 100, 129};
  for (int e = 0; e < 3; e++) {
    check_car(ENCODINGS[e], 7, small, 7);
    check_car(ENCODINGS[e], 130, wide, 6);
  }
}

/* Jordan-Wigner images: a_j^dag a_j = (1 - Z_j)/2 and the hopping
 * a_0^dag a_2 + a_2^dag a_0 = (X0 Z1 X2 + Y0 Z1 Y2)/2 (common practice). */
static void test_jordan_wigner_forms(void **state) {
  (void)state;
  qubit_encoder *enc = qubit_encoder_new(IR_ENC_JORDAN_WIGNER, 3);
  pauli_acc *acc = pauli_acc_new(3, 8);
  qubit_ladder n1[2] = {{1, 1}, {1, 0}};
  qubit_encoder_add_product(enc, n1, 2, 1.0, acc);
  pauli_sum s, want;
  pauli_sum_init(&s, 3);
  pauli_sum_init(&want, 3);
  pauli_acc_finish(acc, &s, 1e-15);
  pauli_sum_add_identity(&want, 0.5);
  pauli_sum_add_text(&want, "Z1", -0.5);
  assert_true(sum_distance(&s, &want) < 1e-15);
  acc = pauli_acc_new(3, 8);
  qubit_ladder h1[2] = {{0, 1}, {2, 0}}, h2[2] = {{2, 1}, {0, 0}};
  qubit_encoder_add_product(enc, h1, 2, 1.0, acc);
  qubit_encoder_add_product(enc, h2, 2, 1.0, acc);
  pauli_acc_finish(acc, &s, 1e-15);
  pauli_sum_clear(&want);
  pauli_sum_add_text(&want, "X0 Z1 X2", 0.5);
  pauli_sum_add_text(&want, "Y0 Z1 Y2", 0.5);
  assert_true(sum_distance(&s, &want) < 1e-15);
  pauli_sum_free(&s);
  pauli_sum_free(&want);
  qubit_encoder_free(enc);
}

/* The Clifford map from Jordan-Wigner agrees with expanding the same operator
 * directly in the target encoding (spin-conserving double excitation plus
 * adjoint, 10 modes: 8 words in Jordan-Wigner, a fact of the trade). */
static void test_clifford_map(void **state) {
  (void)state;
  int n = 10;
  qubit_encoder *jw = qubit_encoder_new(IR_ENC_JORDAN_WIGNER, n);
  for (int e = 1; e < 3; e++) {
    qubit_encoder *enc = qubit_encoder_new(ENCODINGS[e], n);
    qubit_ladder t[4] = {{8, 1}, {5, 1}, {3, 0}, {0, 0}}, td[4] = {{0, 1}, {3, 1}, {5, 0}, {8, 0}};
    pauli_acc *a1 = pauli_acc_new(n, 32), *a2 = pauli_acc_new(n, 32);
    qubit_encoder_add_product(jw, t, 4, 1.0, a1);
    qubit_encoder_add_product(jw, td, 4, -1.0, a1);
    qubit_encoder_add_product(enc, t, 4, 1.0, a2);
    qubit_encoder_add_product(enc, td, 4, -1.0, a2);
    pauli_sum s1, s2;
    pauli_sum_init(&s1, n);
    pauli_sum_init(&s2, n);
    pauli_acc_finish(a1, &s1, 1e-15);
    pauli_acc_finish(a2, &s2, 1e-15);
    assert_int_equal(s1.len, 8);
    qubit_encoder_map_jw(enc, &s1);
    assert_true(sum_distance(&s1, &s2) < 1e-15);
    pauli_sum_free(&s1);
    pauli_sum_free(&s2);
    qubit_encoder_free(enc);
  }
  qubit_encoder_free(jw);
}

/* ---- the Hamiltonian ---- */

/* Fast closed-form route equals the slow generic route term by term, for
 * random integrals, in every encoding (6, 8 and 10 qubits). */
static void test_hamiltonian_routes(void **state) {
  (void)state;
  for (int norb = 2; norb <= 5; norb++) {
    chem_space s = random_space(norb, 1, 1, 11 + (uint64_t)norb, NULL);
    for (int e = 0; e < 3; e++) {
      qubit_encoder *enc = qubit_encoder_new(ENCODINGS[e], 2 * norb);
      pauli_sum fast, slow;
      pauli_sum_init(&fast, 2 * norb);
      pauli_sum_init(&slow, 2 * norb);
      qubit_hamiltonian(&s, enc, &fast);
      slow_hamiltonian(&s, enc, &slow);
      assert_true(fast.len > 0);
      assert_true(sum_distance(&fast, &slow) < 1e-12);
      for (size_t t = 0; t < fast.len; t++) assert_true(cimag(fast.c[t]) == 0);
      assert_true(cabs(pauli_sum_identity_coeff(&fast) - pauli_sum_identity_coeff(&slow)) < 1e-12);
      pauli_sum_free(&fast);
      pauli_sum_free(&slow);
      qubit_encoder_free(enc);
    }
    free_space(&s);
  }
}

/* N, S_z and S^2 commute with H in every encoding (the Hamiltonian conserves
 * particles and spin; common practice); N and S_z commute with S^2. */
static void test_symmetry_commutators(void **state) {
  (void)state;
  int norb = 4;
  chem_space s = random_space(norb, 2, 1, 5, NULL);
  for (int e = 0; e < 3; e++) {
    qubit_encoder *enc = qubit_encoder_new(ENCODINGS[e], 2 * norb);
    pauli_sum h, op[3], c;
    pauli_sum_init(&h, 2 * norb);
    pauli_sum_init(&c, 2 * norb);
    qubit_hamiltonian(&s, enc, &h);
    for (int k = 0; k < 3; k++) pauli_sum_init(&op[k], 2 * norb);
    qubit_number(enc, &op[0]);
    qubit_spin_z(enc, &op[1]);
    qubit_spin_squared(enc, &op[2]);
    for (int k = 0; k < 3; k++) {
      assert_true(op[k].len > 0);
      /* zero to rounding: the words' coefficients cancel in exact arithmetic
       * and leave about 1e-17 in floating point (measured; integrals ~0.1) */
      pauli_sum_commutator(&c, &h, &op[k]);
      assert_true(pauli_sum_max_abs(&c) < 1e-15);
    }
    pauli_sum_commutator(&c, &op[2], &op[1]);
    assert_true(pauli_sum_max_abs(&c) < 1e-14);
    pauli_sum_commutator(&c, &op[2], &op[0]);
    assert_true(pauli_sum_max_abs(&c) < 1e-14);
    /* S_z is not conserved by S_+ : a nonzero commutator must be seen */
    pauli_acc *acc = pauli_acc_new(2 * norb, 8);
    qubit_ladder sp[2] = {{0, 1}, {1, 0}};
    qubit_encoder_add_product(enc, sp, 2, 1.0, acc);
    pauli_sum spl;
    pauli_sum_init(&spl, 2 * norb);
    pauli_acc_finish(acc, &spl, 0.0);
    pauli_sum_commutator(&c, &spl, &op[1]);
    assert_true(pauli_sum_max_abs(&c) > 0.1);
    pauli_sum_free(&spl);
    for (int k = 0; k < 3; k++) pauli_sum_free(&op[k]);
    pauli_sum_free(&h);
    pauli_sum_free(&c);
    qubit_encoder_free(enc);
  }
  free_space(&s);
}

/* On basis states: N counts electrons, S_z = (Na - Nb)/2, and S^2 of the
 * closed-shell reference is 0, of the high-spin two-electron state 2 = 1(1+1)
 * (common practice). */
static void test_symmetry_values(void **state) {
  (void)state;
  int n = 8;
  for (int e = 0; e < 3; e++) {
    qubit_encoder *enc = qubit_encoder_new(ENCODINGS[e], n);
    pauli_sum op[3];
    for (int k = 0; k < 3; k++) pauli_sum_init(&op[k], n);
    qubit_number(enc, &op[0]);
    qubit_spin_z(enc, &op[1]);
    qubit_spin_squared(enc, &op[2]);
    double complex *m[3];
    for (int k = 0; k < 3; k++) m[k] = dense(&op[k]);
    size_t dim = 256;
    for (uint64_t occ = 0; occ < dim; occ++) {
      uint64_t b = 0;
      qubit_encoder_bits(enc, &occ, &b);
      int na = __builtin_popcountll(occ & 0x55), nb = __builtin_popcountll(occ & 0xaa);
      assert_true(cabs(m[0][b * dim + b] - (na + nb)) < 1e-12);
      assert_true(cabs(m[1][b * dim + b] - 0.5 * (na - nb)) < 1e-12);
    }
    uint64_t occ = 0x3, b = 0; /* orbital 0 doubly occupied */
    qubit_encoder_bits(enc, &occ, &b);
    assert_true(cabs(m[2][b * dim + b]) < 1e-12);
    occ = 0x5; /* two alpha electrons: a triplet component */
    qubit_encoder_bits(enc, &occ, &b);
    assert_true(cabs(m[2][b * dim + b] - 2.0) < 1e-12);
    for (int k = 0; k < 3; k++) {
      free(m[k]);
      pauli_sum_free(&op[k]);
    }
    qubit_encoder_free(enc);
  }
}

/* ---- tapering ---- */

/* Tapering keeps the spectrum: the tapered Hamiltonian's eigenvalues are those
 * of the untapered one restricted to the reference's sector (every tau_i
 * equal to its s_i), and its lowest one is the sector ground energy.  With a
 * Z2 orbital labelling there is one more (spatial) symmetry. */
static void check_taper(ir_encoding e, int norb, int nalpha, int nbeta, const int *irrep, int want_nsym) {
  chem_space s = random_space(norb, nalpha, nbeta, 23, irrep);
  int n = 2 * norb;
  qubit_encoder *enc = qubit_encoder_new(e, n);
  pauli_sum h, ht;
  pauli_sum_init(&h, n);
  pauli_sum_init(&ht, n);
  qubit_hamiltonian(&s, enc, &h);
  uint64_t ref = 0, tref = 0;
  qubit_encoder_reference(enc, nalpha, nbeta, &ref);
  qubit_taper t;
  qubit_taper_find(&h, &ref, enc, &t);
  assert_int_equal(t.nsym, want_nsym);
  assert_int_equal(qubit_taper_apply(&t, &h, &ht), 0);
  assert_int_equal(ht.n, n - t.nsym);
  qubit_taper_bits(&t, &ref, &tref);
  /* pivots exclusive */
  for (int i = 0; i < t.nsym; i++)
    for (int j = 0; j < t.nsym; j++)
      assert_int_equal((int)((t.tau[j] >> t.pivot[i]) & 1), i == j);
  /* particle-number and spin parity are always symmetries */
  assert_true(t.parities & (1u << QUBIT_PARITY_N));
  assert_true(t.parities & (1u << QUBIT_PARITY_ALPHA));
  assert_true(t.parities & (1u << QUBIT_PARITY_BETA));
  size_t full = (size_t)1 << n, dim = 0;
  size_t *idx = xmalloc(full * sizeof *idx);
  for (size_t b = 0; b < full; b++) {
    int in = 1;
    for (int i = 0; i < t.nsym; i++) {
      int sgn = __builtin_popcountll(t.tau[i] & b) & 1 ? -1 : 1;
      if (sgn != t.sector[i]) in = 0;
    }
    if (in) idx[dim++] = b;
  }
  assert_int_equal(dim, (size_t)1 << ht.n);
  double complex *m = dense(&h), *mt = dense(&ht);
  double *w = eigenvalues(m, full, idx, dim);
  size_t *all = all_states(dim);
  double *wt = eigenvalues(mt, dim, all, dim);
  for (size_t i = 0; i < dim; i++) assert_true(fabs(w[i] - wt[i]) < 1e-10);
  /* the reference energy is kept: <ref|H|ref> = <tref|H_t|tref> */
  assert_true(cabs(m[ref * full + ref] - mt[tref * dim + tref]) < 1e-12);
  free(w);
  free(wt);
  free(all);
  free(idx);
  free(m);
  free(mt);
  qubit_taper_free(&t);
  pauli_sum_free(&h);
  pauli_sum_free(&ht);
  qubit_encoder_free(enc);
  free_space(&s);
}

static void test_taper(void **state) {
  (void)state;
  int irrep[4] = {0, 1, 0, 1};
  for (int e = 0; e < 3; e++) {
    check_taper(ENCODINGS[e], 4, 2, 2, NULL, 2);
    check_taper(ENCODINGS[e], 4, 2, 1, NULL, 2);
    check_taper(ENCODINGS[e], 4, 2, 2, irrep, 3);
    check_taper(ENCODINGS[e], 3, 1, 1, NULL, 2);
  }
}

/* Parity encoding: (-1)^N is Z on the last qubit; tapering names it. */
static void test_taper_names(void **state) {
  (void)state;
  chem_space s = random_space(3, 1, 1, 3, NULL);
  qubit_encoder *enc = qubit_encoder_new(IR_ENC_PARITY, 6);
  uint64_t zn = 0;
  qubit_parity_word(enc, QUBIT_PARITY_N, &zn);
  assert_true(zn == (uint64_t)1 << 5);
  pauli_sum h;
  pauli_sum_init(&h, 6);
  qubit_hamiltonian(&s, enc, &h);
  uint64_t ref = 0;
  qubit_encoder_reference(enc, 1, 1, &ref);
  qubit_taper t;
  qubit_taper_find(&h, &ref, enc, &t);
  assert_int_equal(t.nsym, 2);
  int named_n = 0, named_spin = 0;
  for (int i = 0; i < t.nsym; i++) {
    if (strcmp(t.why[i], "particle-number parity") == 0) named_n++;
    if (strcmp(t.why[i], "spin-up parity") == 0 || strcmp(t.why[i], "spin-down parity") == 0) named_spin++;
  }
  assert_int_equal(named_n, 1);
  assert_int_equal(named_spin, 1);
  /* a word that breaks a symmetry cannot be tapered */
  pauli_sum g, gt;
  pauli_sum_init(&g, 6);
  pauli_sum_init(&gt, 5);
  pauli_sum_add_text(&g, "X5", 1.0);
  assert_int_equal(qubit_taper_apply(&t, &g, &gt), -1);
  assert_int_equal(gt.len, 0);
  pauli_sum_free(&g);
  pauli_sum_free(&gt);
  qubit_taper_free(&t);
  pauli_sum_free(&h);
  qubit_encoder_free(enc);
  free_space(&s);
}


/* <b|H|b> of a basis state: only the Z-type words contribute. */
static double complex diagonal(const pauli_sum *h, const uint64_t *b) {
  double complex e = 0;
  for (size_t t = 0; t < h->len; t++) {
    const uint64_t *x = pauli_sum_x(h, t), *z = pauli_sum_z(h, t);
    int xz = 0, par = 0;
    for (int i = 0; i < h->nw; i++) {
      xz |= x[i] != 0;
      par += __builtin_popcountll(z[i] & b[i]);
    }
    if (!xz) e += (par & 1) ? -h->c[t] : h->c[t];
  }
  return e;
}

/* Registers wider than one 64-bit word: 40 orbitals (80 qubits) with a few
 * integrals on orbitals around the word boundary; fast and slow routes agree
 * in every encoding, and tapering keeps the reference energy. */
static void test_wide_hamiltonian(void **state) {
  (void)state;
  int norb = 40, n = 80;
  chem_space s = {0};
  s.norb = norb;
  s.nalpha = 20;
  s.nbeta = 19;
  s.e_constant = -1.5;
  s.h1 = xcalloc((size_t)norb * norb, sizeof(double));
  s.h2 = xcalloc((size_t)norb * norb * norb * norb, sizeof(double));
  util_rng r;
  util_rng_seed(&r, 99);
  const int orbs[6] = {0, 15, 30, 31, 32, 39};
  for (int a = 0; a < 6; a++)
    for (int b = 0; b <= a; b++) {
      int p = orbs[a], q = orbs[b];
      s.h1[p * norb + q] = s.h1[q * norb + p] = util_rng_uniform(&r) - 0.5;
    }
  for (int k = 0; k < 40; k++) {
    int p = orbs[util_rng_next(&r) % 6], q = orbs[util_rng_next(&r) % 6];
    int rr = orbs[util_rng_next(&r) % 6], ss = orbs[util_rng_next(&r) % 6];
    double v = util_rng_uniform(&r) - 0.5;
    int idx[8][4] = {{p, q, rr, ss}, {q, p, rr, ss}, {p, q, ss, rr}, {q, p, ss, rr},
                     {rr, ss, p, q}, {ss, rr, p, q}, {rr, ss, q, p}, {ss, rr, q, p}};
    for (int i = 0; i < 8; i++) s.h2[chem_h2_index(norb, idx[i][0], idx[i][1], idx[i][2], idx[i][3])] = v;
  }
  for (int e = 0; e < 3; e++) {
    qubit_encoder *enc = qubit_encoder_new(ENCODINGS[e], n);
    pauli_sum fast, slow, ht;
    pauli_sum_init(&fast, n);
    pauli_sum_init(&slow, n);
    pauli_sum_init(&ht, n);
    qubit_hamiltonian(&s, enc, &fast);
    slow_hamiltonian(&s, enc, &slow);
    assert_true(fast.len > 100);
    assert_true(sum_distance(&fast, &slow) < 1e-12);
    uint64_t ref[2] = {0, 0}, tref[2] = {0, 0};
    qubit_encoder_reference(enc, s.nalpha, s.nbeta, ref);
    qubit_taper t;
    qubit_taper_find(&fast, ref, enc, &t);
    assert_true(t.nsym >= 2);
    assert_int_equal(qubit_taper_apply(&t, &fast, &ht), 0);
    qubit_taper_bits(&t, ref, tref);
    assert_true(cabs(diagonal(&fast, ref) - diagonal(&ht, tref)) < 1e-12);
    qubit_taper_free(&t);
    pauli_sum_free(&fast);
    pauli_sum_free(&slow);
    pauli_sum_free(&ht);
    qubit_encoder_free(enc);
  }
  free_space(&s);
}

int main(void) {
  const struct CMUnitTest tests[] = {
      cmocka_unit_test(test_encoding_matrices),   cmocka_unit_test(test_anticommutation),
      cmocka_unit_test(test_jordan_wigner_forms), cmocka_unit_test(test_clifford_map),
      cmocka_unit_test(test_hamiltonian_routes),  cmocka_unit_test(test_symmetry_commutators),
      cmocka_unit_test(test_symmetry_values),     cmocka_unit_test(test_taper),
      cmocka_unit_test(test_taper_names),         cmocka_unit_test(test_wide_hamiltonian),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
