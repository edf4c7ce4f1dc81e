/* rules.c — the pool rules that need no Hamiltonian: fermionic singles and
 * doubles (plain, generalized, paired, spin-adapted), qubit excitations,
 * explicit words and explicit excitations.  One function per rule, found
 * through a small table; entanglers live in entangler.c.
 *
 * "Occupied" and "virtual" are the spin orbitals filled and empty in the
 * reference (its encoded bits decoded to occupations; the Hartree-Fock
 * determinant under a mean-field reference).  Enumeration order, which is the
 * pool order: singles by (from, to), doubles by (from pair, to pair), both
 * lexicographic in spin-orbital indices; spin-adapted singles by spatial
 * (from, to). */
#include "config.h"

#include "ans_priv.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

/* Occupation of every mode in the reference. */
static unsigned char *ref_occupations(const ans_build *b) {
  int n = b->p->nmodes, nw = pauli_nwords(n);
  uint64_t *occ = xcalloc((size_t)nw, sizeof *occ);
  qubit_encoder_occupations(b->p->enc, b->p->ref_full, occ);
  unsigned char *o = xcalloc((size_t)(n > 0 ? n : 1), 1);
  for (int m = 0; m < n; m++) o[m] = (unsigned char)pauli_get_x(occ, m);
  free(occ);
  return o;
}

/* G = 2i (T - T+) of the excitation from -> to (pool.h convention) through
 * the encoder, on the full register. */
static void fermion_generator(const ans_build *b, int k, const int *from, const int *to, pauli_sum *G) {
  qubit_ladder ops[16], adj[16];
  for (int i = 0; i < k; i++) {
    ops[i] = (qubit_ladder){to[i], 1};
    ops[k + i] = (qubit_ladder){from[k - 1 - i], 0};
  }
  /* T+ reverses the product and swaps creation and annihilation */
  for (int i = 0; i < 2 * k; i++) adj[i] = (qubit_ladder){ops[2 * k - 1 - i].mode, !ops[2 * k - 1 - i].dagger};
  pauli_acc *acc = pauli_acc_new(b->p->nmodes, 64);
  qubit_encoder_add_product(b->p->enc, ops, 2 * k, 2.0 * I, acc);
  qubit_encoder_add_product(b->p->enc, adj, 2 * k, -2.0 * I, acc);
  pauli_acc_finish(acc, G, ANS_WORD_TOL);
}

/* G = 2i (Q - Q+) with Q = prod_t Q+_t prod_f Q_f on occupations, Q+ = (X - iY)/2,
 * mapped into the encoding by its Clifford. */
static void qubit_generator(const ans_build *b, int k, const int *from, const int *to, pauli_sum *G) {
  int n = b->p->nmodes;
  pauli_sum S, f, tmp;
  pauli_sum_init(&S, n);
  pauli_sum_init(&f, n);
  pauli_sum_init(&tmp, n);
  pauli_sum_add_identity(&S, 1.0);
  uint64_t *x = xcalloc((size_t)pauli_nwords(n), sizeof *x), *z = xcalloc((size_t)pauli_nwords(n), sizeof *z);
  for (int i = 0; i < 2 * k; i++) {
    int q = i < k ? to[i] : from[i - k];
    double sy = i < k ? -1.0 : 1.0; /* creation (X - iY)/2, annihilation (X + iY)/2 */
    pauli_sum_clear(&f);
    memset(x, 0, sizeof(uint64_t) * (size_t)pauli_nwords(n));
    memset(z, 0, sizeof(uint64_t) * (size_t)pauli_nwords(n));
    pauli_set_letter(x, z, q, 'X');
    pauli_sum_add(&f, x, z, 0.5);
    pauli_set_letter(x, z, q, 'Y');
    pauli_sum_add(&f, x, z, 0.5 * sy * I);
    pauli_sum_mul(&tmp, &S, &f);
    pauli_sum_copy(&S, &tmp);
  }
  free(x);
  free(z);
  pauli_sum_adjoint(&tmp, &S);
  pauli_sum_clear(G);
  pauli_sum_add_sum(G, &S, 2.0 * I);
  pauli_sum_add_sum(G, &tmp, -2.0 * I);
  pauli_sum_canonicalize(G, ANS_WORD_TOL);
  qubit_encoder_map_jw(b->p->enc, G);
  pauli_sum_free(&S);
  pauli_sum_free(&f);
  pauli_sum_free(&tmp);
}

/* One excitation of the given kind, built and handed to ans_add_full. */
static void add_excitation(ans_build *b, ans_kind kind, int k, const int *from, const int *to) {
  ans_gen_info info;
  memset(&info, 0, sizeof info);
  info.kind = kind;
  info.nexc = k;
  for (int i = 0; i < k && i < 4; i++) info.from[i] = from[i], info.to[i] = to[i];
  info.text = ans_excitation_text(k, from, to);
  pauli_sum G;
  pauli_sum_init(&G, b->p->nmodes);
  if (kind == ANS_QUBIT_SINGLE || kind == ANS_QUBIT_DOUBLE) qubit_generator(b, k, from, to, &G);
  else fermion_generator(b, k, from, to, &G);
  ans_add_full(b, &info, &G);
  pauli_sum_free(&G);
  free(info.text);
}

/* Spin-adapted single: the alpha and beta moves of spatial i -> a under one
 * parameter (they act on different modes and commute).  A half that is not
 * occupied -> virtual in the reference is left out; with one half left the
 * generator is a plain single. */
static void add_spin_adapted(ans_build *b, int i, int a, int alpha, int beta) {
  if (alpha && beta) {
    ans_gen_info info;
    memset(&info, 0, sizeof info);
    info.kind = ANS_SINGLE;
    info.nexc = 1;
    info.from[0] = 2 * i;
    info.to[0] = 2 * a;
    info.spin_adapted = 1;
    info.text = xasprintf("%d -> %d, %d -> %d", 2 * i, 2 * a, 2 * i + 1, 2 * a + 1);
    pauli_sum G, Gb;
    pauli_sum_init(&G, b->p->nmodes);
    pauli_sum_init(&Gb, b->p->nmodes);
    int f = 2 * i, t = 2 * a;
    fermion_generator(b, 1, &f, &t, &G);
    f++, t++;
    fermion_generator(b, 1, &f, &t, &Gb);
    pauli_sum_add_sum(&G, &Gb, 1.0);
    ans_add_full(b, &info, &G);
    pauli_sum_free(&G);
    pauli_sum_free(&Gb);
    free(info.text);
  } else {
    int f = 2 * i + (alpha ? 0 : 1), t = 2 * a + (alpha ? 0 : 1);
    add_excitation(b, ANS_SINGLE, 1, &f, &t);
  }
}

/* Singles (fermionic or qubit): occupied -> virtual of the same spin, or all
 * pairs with `generalized`; spin-adapted pairs with `spin-adapted`. */
static void singles_like(ans_build *b, const ir_rule *rule, ans_kind kind) {
  int n = b->p->nmodes;
  unsigned char *occ = ref_occupations(b);
  int gen = (rule->options & IR_OPT_GENERALIZED) != 0;
  if (kind == ANS_SINGLE && (rule->options & IR_OPT_SPIN_ADAPTED)) {
    int norb = n / 2;
    for (int i = 0; i < norb; i++)
      for (int a = 0; a < norb; a++) {
        if (gen) {
          if (a > i) add_spin_adapted(b, i, a, 1, 1);
          continue;
        }
        int al = occ[2 * i] && !occ[2 * a], be = occ[2 * i + 1] && !occ[2 * a + 1];
        if (a != i && (al || be)) add_spin_adapted(b, i, a, al, be);
      }
    free(occ);
    return;
  }
  for (int p = 0; p < n; p++)
    for (int q = 0; q < n; q++) {
      if ((p & 1) != (q & 1) || p == q) continue;
      if (gen ? q < p : !(occ[p] && !occ[q])) continue;
      add_excitation(b, kind, 1, &p, &q);
    }
  free(occ);
}

/* Doubles (fermionic or qubit): spin-conserving occupied pair -> virtual
 * pair; `generalized`: every unordered pair of disjoint pairs; `paired`: pair
 * moves i_alpha i_beta -> a_alpha a_beta. */
static void doubles_like(ans_build *b, const ir_rule *rule, ans_kind kind) {
  int n = b->p->nmodes;
  unsigned char *occ = ref_occupations(b);
  int gen = (rule->options & IR_OPT_GENERALIZED) != 0;
  if (rule->options & IR_OPT_PAIRED) {
    int norb = n / 2;
    for (int i = 0; i < norb; i++)
      for (int a = 0; a < norb; a++) {
        if (a == i) continue;
        if (gen ? a < i : !(occ[2 * i] && occ[2 * i + 1] && !occ[2 * a] && !occ[2 * a + 1])) continue;
        int from[2] = {2 * i, 2 * i + 1}, to[2] = {2 * a, 2 * a + 1};
        add_excitation(b, kind, 2, from, to);
      }
    free(occ);
    return;
  }
  for (int i = 0; i < n; i++)
    for (int j = i + 1; j < n; j++) {
      if (!gen && !(occ[i] && occ[j])) continue;
      for (int a = 0; a < n; a++)
        for (int c = a + 1; c < n; c++) {
          if ((i & 1) + (j & 1) != (a & 1) + (c & 1)) continue;
          if (gen) {
            /* each unordered pair of distinct pairs once, four distinct modes */
            if (a < i || (a == i && c <= j)) continue;
            if (a == i || a == j || c == i || c == j) continue;
          } else if (occ[a] || occ[c]) {
            continue;
          }
          int from[2] = {i, j}, to[2] = {a, c};
          add_excitation(b, kind, 2, from, to);
        }
    }
  free(occ);
}

static void rule_singles(ans_build *b, const ir_rule *rule) { singles_like(b, rule, ANS_SINGLE); }
static void rule_doubles(ans_build *b, const ir_rule *rule) { doubles_like(b, rule, ANS_DOUBLE); }
static void rule_qubit_singles(ans_build *b, const ir_rule *rule) { singles_like(b, rule, ANS_QUBIT_SINGLE); }
static void rule_qubit_doubles(ans_build *b, const ir_rule *rule) { doubles_like(b, rule, ANS_QUBIT_DOUBLE); }

/* `word`: the written Pauli word on the full register. */
static void rule_word(ans_build *b, const ir_rule *rule) {
  int n = b->p->nmodes, nw = pauli_nwords(n);
  uint64_t *x = xcalloc((size_t)nw, sizeof *x), *z = xcalloc((size_t)nw, sizeof *z);
  for (int i = 0; i < rule->nletters; i++) {
    int q = rule->letters[i].qubit;
    if (q < 0 || q >= n) {
      b->tally[b->rule].had_error = 1;
      diag_report(b->d, DIAG_ERROR, rule->span, "qubit %d is beyond the register (qubits 0..%d)", q, n - 1);
      free(x);
      free(z);
      return;
    }
    pauli_set_letter(x, z, q, rule->letters[i].letter);
  }
  if (pauli_word_is_identity(nw, x, z)) {
    b->tally[b->rule].had_error = 1;
      diag_report(b->d, DIAG_ERROR, rule->span, "the identity word is not a generator (it only changes a global phase)");
    free(x);
    free(z);
    return;
  }
  ans_gen_info info;
  memset(&info, 0, sizeof info);
  info.kind = ANS_WORD;
  info.text = pauli_word_str(n, x, z);
  pauli_sum G;
  pauli_sum_init(&G, n);
  pauli_sum_add(&G, x, z, 1.0);
  ans_add_full(b, &info, &G);
  pauli_sum_free(&G);
  free(info.text);
  free(x);
  free(z);
}

/* `excite`: the written excitation (1 to 4 electrons), pool.h convention. */
static void rule_excite(ans_build *b, const ir_rule *rule) {
  int n = b->p->nmodes, k = rule->nexcite;
  if (k < 1 || k > 4) {
    b->tally[b->rule].had_error = 1;
      diag_report(b->d, DIAG_ERROR, rule->span, "an excitation moves 1 to 4 electrons, not %d", k);
    return;
  }
  for (int i = 0; i < 2 * k; i++) {
    int m = i < k ? rule->from[i] : rule->to[i - k];
    if (m < 0 || m >= n) {
      b->tally[b->rule].had_error = 1;
      diag_report(b->d, DIAG_ERROR, rule->span, "spin orbital %d is beyond the active space (spin orbitals 0..%d)", m,
                  n - 1);
      return;
    }
  }
  add_excitation(b, ANS_EXCITE, k, rule->from, rule->to);
}

/* How many generators a rule makes at most, and Pauli words each, in closed
 * form from the reference's occupations per spin (the enumerations above,
 * counted): so a pool too large for the machine is refused before it is
 * built.  0 for the rules whose size is bounded otherwise (entanglers: by the
 * Hamiltonian, which is already in memory; explicit words and excitations). */
uint64_t ans_rule_estimate(const ans_build *b, const ir_rule *rule, int *words) {
  int kind = rule->kind;
  if (kind != IR_RULE_SINGLES && kind != IR_RULE_DOUBLES && kind != IR_RULE_QUBIT_SINGLES &&
      kind != IR_RULE_QUBIT_DOUBLES)
    return 0;
  int n = b->p->nmodes;
  unsigned char *occ = ref_occupations(b);
  double o[2] = {0, 0}, v[2] = {0, 0}, m[2] = {0, 0}, dbl = 0, empty = 0, alpha = 0, beta = 0;
  for (int q = 0; q < n; q++) {
    m[q & 1]++;
    if (occ[q]) o[q & 1]++;
    else v[q & 1]++;
  }
  for (int i = 0; 2 * i + 1 < n; i++) { /* spatial orbitals: doubly, singly (alpha or beta), not occupied */
    dbl += occ[2 * i] && occ[2 * i + 1];
    empty += !occ[2 * i] && !occ[2 * i + 1];
    alpha += occ[2 * i] && !occ[2 * i + 1];
    beta += !occ[2 * i] && occ[2 * i + 1];
  }
  free(occ);
  int gen = (rule->options & IR_OPT_GENERALIZED) != 0;
  double norb = n / 2, c;
#define C2(x) ((x) * ((x) - 1) / 2)
  if (kind == IR_RULE_SINGLES || kind == IR_RULE_QUBIT_SINGLES) {
    *words = 2;
    if (kind == IR_RULE_SINGLES && (rule->options & IR_OPT_SPIN_ADAPTED)) {
      *words = 4;
      /* spatial i -> a with an alpha move or a beta move open: both when i is doubly occupied and a empty */
      c = gen ? C2(norb) : (dbl + alpha) * (beta + empty) + (dbl + beta) * (alpha + empty) - dbl * empty;
    } else {
      c = gen ? C2(m[0]) + C2(m[1]) : o[0] * v[0] + o[1] * v[1];
    }
  } else {
    *words = 8;
    if (rule->options & IR_OPT_PAIRED)
      c = gen ? C2(norb) : dbl * empty;
    else if (gen)
      c = C2(m[0]) * C2(m[0] - 2) / 2 + C2(m[1]) * C2(m[1] - 2) / 2 + m[0] * m[1] * (m[0] - 1) * (m[1] - 1) / 2;
    else
      c = C2(o[0]) * C2(v[0]) + C2(o[1]) * C2(v[1]) + o[0] * o[1] * v[0] * v[1];
  }
#undef C2
  return c > 1e18 ? (uint64_t)1e18 : (uint64_t)c;
}

/* ORDER ir_rule_kind */
static const struct {
  ir_rule_kind kind;
  ans_rule_fn fn;
} rule_table[] = {
    {IR_RULE_SINGLES, rule_singles},
    {IR_RULE_DOUBLES, rule_doubles},
    {IR_RULE_ENTANGLERS, ans_rule_entanglers},
    {IR_RULE_QUBIT_SINGLES, rule_qubit_singles},
    {IR_RULE_QUBIT_DOUBLES, rule_qubit_doubles},
    {IR_RULE_WORD, rule_word},
    {IR_RULE_EXCITE, rule_excite},
};

ans_rule_fn ans_rule_lookup(ir_rule_kind k) {
  for (size_t i = 0; i < sizeof rule_table / sizeof rule_table[0]; i++)
    if (rule_table[i].kind == k) return rule_table[i].fn;
  return NULL;
}
