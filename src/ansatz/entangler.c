/* entangler.c — the `entanglers` rule (QCC, J. Chem. Theory Comput. 14, 6317
 * (2018)): one Pauli word per flip set of the Hamiltonian the ansatz acts on.
 *
 * A flip set is the X-mask f of a term (the qubits where it has X or Y).  The
 * candidates of f are the words with X or Y on f, nothing elsewhere, and an
 * odd number of Y (only those can have a nonzero gradient against a real
 * Hamiltonian); the rule keeps the one with the largest |gradient| at the
 * reference, ties to the first in canonical word order.
 *
 * Choosing without enumerating 2^(|f|-1) candidates:
 *  - When no qubit of f is tilted (always at a basis-state reference), every
 *    candidate has the same |gradient| (closed form): swapping X and Y on two
 *    qubits of f multiplies every term's contribution by the same sign,
 *    (-i r_z)(-i r_z') = -r_z r_z'.  The rule takes the canonical first
 *    candidate, X on f with Y on its highest qubit: no search.
 *  - Otherwise (a mean-field reference with tilted qubits in f): exhaustive over
 *    the odd-Y patterns when |f| <= 7 (at most 64), else a bounded local search:
 *    all single-Y patterns, then pair swaps with first improvement, at most
 *    ANS_SEARCH_BUDGET evaluations in all.  Each evaluation costs the size of
 *    f's group of terms times |f|. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

#define ANS_EXHAUSTIVE_MAX 7
#define ANS_SEARCH_BUDGET 4096

typedef struct fs_sort {
  const ans_maskset *fs;
  const uint64_t *zero;
} fs_sort;

/* Flip sets in the canonical order of their X words (weight, then qubits). */
static int cmp_flipsets(const void *a, const void *b, void *arg) {
  const fs_sort *c = arg;
  size_t i = *(const size_t *)a, j = *(const size_t *)b;
  int nw = c->fs->nw;
  int r = pauli_word_cmp(nw, c->fs->m + i * (size_t)nw, c->zero, c->fs->m + j * (size_t)nw, c->zero);
  return r ? r : (i < j ? -1 : i > j);
}

/* Contributions of f's group of terms as per-qubit factors:
 * <P h> = R_h prod_{j} (P_j == Y ? my : mx)[h][j] over the qubits j of f. */
typedef struct cand_eval {
  int m;              /* |f| */
  size_t nt;          /* terms */
  double *R;          /* nt: c_h times the factors off f */
  double complex *mx, *my;  /* nt*m */
} cand_eval;

/* Precompute, for every term of f's group, the factor off f and the two
 * per-qubit factors on f, so that each candidate costs |group| * |f|. */
static void cand_init(cand_eval *ce, const ans_screen *s, const uint64_t *f, const int *pos, int m) {
  size_t len;
  const uint32_t *grp = ans_screen_group(s, f, &len);
  ce->m = m;
  ce->nt = len;
  ce->R = xmalloc((len ? len : 1) * sizeof *ce->R);
  ce->mx = xmalloc((len ? len : 1) * (size_t)m * sizeof *ce->mx);
  ce->my = xmalloc((len ? len : 1) * (size_t)m * sizeof *ce->my);
  const pauli_sum *H = s->H;
  int nw = s->nw;
  for (size_t k = 0; k < len; k++) {
    size_t t = grp[k];
    const uint64_t *hx = pauli_sum_x(H, t), *hz = pauli_sum_z(H, t);
    double R = creal(H->c[t]);
    for (int i = 0; i < nw; i++) {
      uint64_t mm = (hx[i] | hz[i]) & ~f[i];
      while (mm) {
        int bb = __builtin_ctzll(mm);
        mm &= mm - 1;
        int q = i * 64 + bb;
        int xb = (int)((hx[i] >> bb) & 1), zb = (int)((hz[i] >> bb) & 1);
        R *= s->r[3 * q + (xb ? (zb ? 1 : 0) : 2)];
      }
    }
    ce->R[k] = R;
    for (int j = 0; j < m; j++) {
      int q = pos[j];
      double rx = s->r[3 * q], ry = s->r[3 * q + 1], rz = s->r[3 * q + 2];
      char L = pauli_letter(hx, hz, q);
      double complex a, c;
      switch (L) {
      case 'I': a = rx, c = ry; break;
      case 'X': a = 1, c = -I * rz; break;
      case 'Y': a = I * rz, c = 1; break;
      default: a = -I * ry, c = I * rx; break;
      }
      ce->mx[k * (size_t)m + (size_t)j] = a;
      ce->my[k * (size_t)m + (size_t)j] = c;
    }
  }
}

static void cand_free(cand_eval *ce) {
  free(ce->R);
  free(ce->mx);
  free(ce->my);
}

/* g = -sum_h c_h Im <P h> for the Y pattern y (y[j] = 1: Y on qubit j of f). */
static double cand_grad(const cand_eval *ce, const unsigned char *y) {
  double g = 0;
  for (size_t k = 0; k < ce->nt; k++) {
    double complex p = ce->R[k];
    const double complex *ax = ce->mx + k * (size_t)ce->m, *ay = ce->my + k * (size_t)ce->m;
    for (int j = 0; j < ce->m; j++) p *= y[j] ? ay[j] : ax[j];
    g -= cimag(p);
  }
  return g;
}

/* Is pattern a before pattern b in canonical word order (X before Y at the
 * lowest qubit where they differ)? */
static int pattern_before(const unsigned char *a, const unsigned char *b, int m) {
  for (int j = 0; j < m; j++)
    if (a[j] != b[j]) return a[j] < b[j];
  return 0;
}

/* Keep `y` as best when its |g| is larger, or equal and canonically earlier. */
static int better(double g, const unsigned char *y, long long bestkey, const unsigned char *best, int m) {
  long long k = ans_grad_key(g);
  return k > bestkey || (k == bestkey && pattern_before(y, best, m));
}

/* The best odd-Y pattern on a flip set with tilted qubits: exhaustive up to
 * ANS_EXHAUSTIVE_MAX qubits, else single-Y patterns then first-improvement
 * pair swaps within ANS_SEARCH_BUDGET evaluations.  best gets the pattern. */
static void search(const cand_eval *ce, unsigned char *best) {
  int m = ce->m;
  unsigned char *y = xcalloc((size_t)m, 1);
  long long bestkey = -1;
  if (m <= ANS_EXHAUSTIVE_MAX) {
    for (unsigned code = 1; code < (1u << m); code++) {
      if (!(__builtin_popcount(code) & 1)) continue;
      for (int j = 0; j < m; j++) y[j] = (code >> j) & 1;
      double g = cand_grad(ce, y);
      if (bestkey < 0 || better(g, y, bestkey, best, m)) {
        memcpy(best, y, (size_t)m);
        bestkey = ans_grad_key(g);
      }
    }
    free(y);
    return;
  }
  int evals = 0;
  for (int j = m - 1; j >= 0; j--) { /* the single-Y patterns, canonical first */
    memset(y, 0, (size_t)m);
    y[j] = 1;
    double g = cand_grad(ce, y);
    evals++;
    if (bestkey < 0 || better(g, y, bestkey, best, m)) {
      memcpy(best, y, (size_t)m);
      bestkey = ans_grad_key(g);
    }
  }
  int improved = 1;
  while (improved && evals < ANS_SEARCH_BUDGET) {
    improved = 0;
    for (int j = 0; j < m && evals < ANS_SEARCH_BUDGET; j++)
      for (int l = j + 1; l < m && evals < ANS_SEARCH_BUDGET; l++) {
        memcpy(y, best, (size_t)m);
        y[j] ^= 1;
        y[l] ^= 1;
        double g = cand_grad(ce, y);
        evals++;
        if (ans_grad_key(g) > bestkey) {
          memcpy(best, y, (size_t)m);
          bestkey = ans_grad_key(g);
          improved = 1;
        }
      }
  }
  free(y);
}

/* The `entanglers` rule: every flip set of H (hash over X-masks, canonical
 * order), its representative word and gradient, into the pool. */
void ans_rule_entanglers(ans_build *b, const ir_rule *rule) {
  (void)rule;
  ans_tally *t = &b->tally[b->rule];
  if (!b->p->H || !b->scr) {
    /* No Hamiltonian: what is provable is that every word with an X or Y
     * letter fails to commute with N and S_z in a linear encoding. */
    if (!(b->p->taper && b->p->taper->nsym > 0)) t->static_break[IR_SYM_PARTICLES] = t->static_break[IR_SYM_SPIN_Z] = 1;
    t->unexpanded = 1;
    return;
  }
  const pauli_sum *H = b->p->H;
  const ans_screen *s = b->scr;
  int n = H->n, nw = H->nw;
  ans_maskset fs;
  ans_maskset_init(&fs, nw, H->len / 4 + 16);
  for (size_t k = 0; k < H->len; k++) {
    const uint64_t *x = pauli_sum_x(H, k);
    int nz = 0;
    for (int i = 0; i < nw; i++) nz |= x[i] != 0;
    if (nz) ans_maskset_add(&fs, x, NULL);
  }
  size_t nf = fs.len;
  size_t *ord = xmalloc((nf ? nf : 1) * sizeof *ord);
  for (size_t i = 0; i < nf; i++) ord[i] = i;
  uint64_t *zero = xcalloc((size_t)nw, sizeof *zero);
  fs_sort ctx = {&fs, zero};
  qsort_r(ord, nf, sizeof *ord, cmp_flipsets, &ctx);

  uint64_t *y = xcalloc((size_t)nw, sizeof *y);
  int *pos = xmalloc((size_t)(n > 0 ? n : 1) * sizeof *pos);
  unsigned char *pat = xmalloc((size_t)(n > 0 ? n : 1));
  for (size_t oi = 0; oi < nf; oi++) {
    const uint64_t *f = fs.m + ord[oi] * (size_t)nw;
    int m = 0, tilted = 0;
    for (int i = 0; i < nw; i++) {
      if (f[i] & s->tilt[i]) tilted = 1;
      uint64_t mm = f[i];
      while (mm) {
        pos[m++] = i * 64 + __builtin_ctzll(mm);
        mm &= mm - 1;
      }
    }
    memset(pat, 0, (size_t)m);
    pat[m - 1] = 1;
    if (tilted) {
      cand_eval ce;
      cand_init(&ce, s, f, pos, m);
      search(&ce, pat);
      cand_free(&ce);
    }
    memset(y, 0, (size_t)nw * sizeof *y);
    for (int j = 0; j < m; j++)
      if (pat[j]) pauli_flip(y, pos[j]);
    /* word: X-mask f, Z-mask y (Y where both) */
    double g = ans_screen_word(s, f, y);
    ans_gen_info info;
    memset(&info, 0, sizeof info);
    info.kind = ANS_ENTANGLER;
    info.text = pauli_word_str(n, f, y);
    ans_add_reg_word(b, &info, f, y, g);
    free(info.text);
  }
  free(pat);
  free(pos);
  free(y);
  free(zero);
  free(ord);
  ans_maskset_free(&fs);
}
