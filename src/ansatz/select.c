/* select.c — which generators the ansatz uses and in what order.
 *
 * choose all | N by gradient (the N largest |g|) | gradient above t (|g| > t)
 * | grow (the run picks; here the pool ranked by |g|).  Orders: as written
 * (pool order), by gradient (decreasing |g|), by rank (qubits moved,
 * ascending, then decreasing |g|).  Gradients compare through ans_grad_key
 * (|g| quantized to 1e-12), and every tie falls back to pool order, so the same
 * recipe gives the same order on every run. */
#include "config.h"

#include "ans_priv.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

enum { BY_INDEX, BY_GRADIENT, BY_RANK };

typedef struct sel_ctx {
  const ans_pool *pool;
  int mode;
} sel_ctx;

/* Order of two pool indices: by rank, then by |gradient| key, then pool
 * order, as the mode asks. */
static int cmp_sel(const void *a, const void *b, void *arg) {
  const sel_ctx *c = arg;
  size_t i = *(const size_t *)a, j = *(const size_t *)b;
  const ans_gen *gi = &c->pool->gen[i], *gj = &c->pool->gen[j];
  if (c->mode == BY_RANK && gi->rank != gj->rank) return gi->rank < gj->rank ? -1 : 1;
  if (c->mode != BY_INDEX) {
    long long ki = ans_grad_key(gi->gradient), kj = ans_grad_key(gj->gradient);
    if (ki != kj) return ki > kj ? -1 : 1;
  }
  return i < j ? -1 : i > j;
}

static void sort_idx(size_t *v, size_t n, const ans_pool *pool, int mode) {
  sel_ctx c = {pool, mode};
  qsort_r(v, n, sizeof *v, cmp_sel, &c);
}

void ans_select(ans_plan *pl, const ir_recipe *r, diag_ctx *d) {
  const ans_pool *pool = &pl->pool;
  size_t n = pool->len;
  size_t *v = xmalloc((n ? n : 1) * sizeof *v);
  for (size_t i = 0; i < n; i++) v[i] = i;
  size_t m = n;
  const ir_choose *ch = &r->choose;
  if (pl->screened) {
    switch (ch->kind) {
    case IR_CHOOSE_ALL: break;
    case IR_CHOOSE_COUNT:
      sort_idx(v, n, pool, BY_GRADIENT);
      if (ch->count >= 0 && (size_t)ch->count < m) m = (size_t)ch->count;
      break;
    case IR_CHOOSE_ABOVE: {
      size_t k = 0;
      for (size_t i = 0; i < n; i++)
        if (fabs(pool->gen[i].gradient) > ch->threshold) v[k++] = i;
      m = k;
      break;
    }
    case IR_CHOOSE_GROW:
      sort_idx(v, n, pool, BY_GRADIENT);
      pl->grow = 1;
      break;
    }
  } else if (ch->kind == IR_CHOOSE_GROW) {
    pl->grow = 1;
  }
  if (!pl->grow) {
    int mode = BY_INDEX;
    if (r->order == IR_ORDER_GRADIENT && pl->screened) mode = BY_GRADIENT;
    if (r->order == IR_ORDER_RANK) mode = BY_RANK;
    sort_idx(v, m, pool, mode);
  }
  pl->order = v;
  pl->norder = m;

  int unexpanded = 0; /* entanglers are not expanded without a Hamiltonian */
  for (int i = 0; i < r->nrules; i++) unexpanded |= r->rules[i].kind == IR_RULE_ENTANGLERS && !pl->screened;
  if (n == 0 && !unexpanded && d) {
    diag_report(d, DIAG_WARNING, r->nrules ? r->pool_span : r->choose.span,
                "the pool has no generators: the ansatz is the reference state alone");
  } else if (n > 0 && m == 0 && pl->screened && d) {
    double gmax = 0;
    for (size_t i = 0; i < n; i++)
      if (fabs(pool->gen[i].gradient) > gmax) gmax = fabs(pool->gen[i].gradient);
    diag_report(d, DIAG_WARNING, ch->span, "the selection leaves none of the %zu generators in the pool", n);
    diag_note(d, DIAG_NOWHERE, "the largest |gradient| at the reference is %.6g", gmax);
  }
}
