/* space.c — electrons, spin and the orbital space of a recipe.
 *
 * From the molecule (atoms + charge + basis, or an FCIDUMP header) and the
 * multiplicity: the electron count, nalpha - nbeta = multiplicity - 1, and the
 * number of orbitals.  Then the `orbitals` block splits the orbitals into core
 * (doubly occupied, folded into the constant), active (the qubit problem) and
 * discarded virtuals:
 *   - `freeze core` freezes the core orbitals of every element (element.h);
 *     `freeze 1 2` names doubly occupied orbitals;
 *   - `active N electrons in M orbitals` makes the (electrons - 2 frozen - N)/2
 *     lowest unfrozen orbitals inactive core too, then takes the next M;
 *   - `active orbitals LIST` takes the listed orbitals; occupied orbitals not
 *     listed become core, so a singly occupied one must be listed.
 * Each impossibility is an error at the statement that causes it.
 */
#include "config.h"

#include "front/resolve.h"
#include "cairn/element.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

/* "electron" or "electrons" after a count. */
static const char *el(long n) { return n == 1 ? "electron" : "electrons"; }

/* Where the orbital count comes from, for messages. */
static const char *orbital_source(const rs *c) {
  if (c->r->problem == IR_PROBLEM_INTEGRALS) return "the integrals file";
  return c->r->basis_name ? c->r->basis_name : "the basis file";
}

/* Electrons, multiplicity and orbital count; 0 when they are settled. */
static int molecule(rs *c, int *nalpha, int *nbeta) {
  ir_recipe *r = c->r;
  ast_stmt *atoms = c->one[RS_ATOMS], *ints = c->one[RS_INTEGRALS], *basis = c->one[RS_BASIS];
  ast_stmt *charge = c->one[RS_CHARGE], *mult = c->one[RS_MULT];
  if (atoms && ints) {
    diag_report(c->d, DIAG_ERROR, ints->kw, "a recipe gives either `atoms` with a `basis`, or `integrals`, not both");
    diag_note(c->d, atoms->span, "the atoms are given here");
    return -1;
  }
  if (!atoms && !ints) {
    if (c->use_failed) return -1; /* it may be in the file that could not be read */
    diag_report(c->d, DIAG_ERROR, c->header_span, "the recipe names no molecule");
    diag_help(c->d, "give `atoms { ... }` and `basis NAME`, or `integrals \"file.fcidump\"`");
    return -1;
  }
  int norb, nelec, ms2 = -1;
  if (atoms) {
    r->problem = IR_PROBLEM_ATOMS;
    if (!basis) {
      if (c->use_failed) return -1;
      diag_report(c->d, DIAG_ERROR, atoms->kw, "the atoms need a basis set");
      diag_help(c->d, "add a line such as `basis sto-3g`, or `basis file \"mine.gbs\"`");
      return -1;
    }
    if (!(c->molecule_ok & 1) || (c->molecule_ok & 4) || (!r->basis_name && !r->basis_file)) return -1;
    int zsum = 0;
    for (int a = 0; a < r->natoms; a++) zsum += r->points[0].atoms[a].z;
    nelec = zsum - r->charge;
    if (nelec <= 0) {
      diag_report(c->d, DIAG_ERROR, charge->e[0]->span, "a charge of %d leaves %s electrons", r->charge,
                  nelec == 0 ? "no" : "a negative number of");
      diag_note(c->d, atoms->span, "the atoms have %d %s", zsum, el(zsum));
      return -1;
    }
  } else {
    r->problem = IR_PROBLEM_INTEGRALS;
    /* one point, no atoms: later stages read point 0 */
    r->npoints = 1;
    r->points = xcalloc(1, sizeof *r->points);
    int bad = 0;
    if (r->scan.active) {
      diag_report(c->d, DIAG_ERROR, r->scan.span, "a scan varies atom coordinates, and an integrals file has none");
      diag_note(c->d, ints->span, "the molecule comes from this file");
      bad = 1;
    }
    if (basis) {
      diag_report(c->d, DIAG_ERROR, basis->kw, "`basis` is for atoms; an integrals file has its own orbitals");
      diag_note(c->d, ints->span, "the integrals are read from here");
      bad = 1;
    }
    if (charge) {
      diag_report(c->d, DIAG_ERROR, charge->kw, "`charge` does not apply to an integrals file");
      diag_help(c->d, "the file's header (NELEC) gives the number of electrons");
      bad = 1;
    }
    if (bad || !r->integrals_file || (c->molecule_ok & 4)) return -1;
    if (c->o.fcidump_header(c->o.ctx, r->integrals_file, ints->name, c->d, &norb, &nelec, &ms2) != 0) return -1;
    if (nelec <= 0 || norb <= 0) {
      diag_report(c->d, DIAG_ERROR, ints->name, "the integrals file has %d electrons in %d orbitals", nelec, norb);
      return -1;
    }
  }

  int m = mult ? r->multiplicity : ms2 >= 0 ? ms2 + 1 : 1;
  if (mult && ms2 >= 0 && m - 1 != ms2) {
    diag_report(c->d, DIAG_ERROR, mult->e[0]->span,
                "multiplicity %d means %d unpaired electrons, but the integrals file has MS2=%d", m, m - 1, ms2);
    diag_help(c->d, "remove `multiplicity` (it then follows the file), or write `multiplicity %d`", ms2 + 1);
    return -1;
  }
  int unpaired = m - 1;
  diag_span mspan = mult ? mult->e[0]->span : charge ? charge->span : atoms ? atoms->kw : ints->span;
  if (unpaired > nelec) {
    diag_report(c->d, DIAG_ERROR, mspan, "multiplicity %d needs %d unpaired electrons, but there %s only %d %s",
                m, unpaired, nelec == 1 ? "is" : "are", nelec, el(nelec));
    return -1;
  }
  if ((nelec - unpaired) % 2 != 0) {
    if (mult) {
      diag_report(c->d, DIAG_ERROR, mspan, "multiplicity %d does not fit %d %s", m, nelec, el(nelec));
      diag_note(c->d, DIAG_NOWHERE, "%s electron count needs %s multiplicity (%s)", nelec % 2 ? "an odd" : "an even",
                nelec % 2 ? "an even" : "an odd", nelec % 2 ? "2, 4, ..." : "1, 3, ...");
    } else {
      diag_report(c->d, DIAG_ERROR, mspan, "the molecule has %d %s, an odd number, so it cannot be a singlet",
                  nelec, el(nelec));
      diag_help(c->d, "give its spin: `multiplicity 2` for one unpaired electron");
    }
    return -1;
  }
  r->multiplicity = m;
  r->nelectrons = nelec;
  if (atoms) {
    norb = c->o.count_orbitals(c->o.ctx, r, c->d);
    if (norb < 0) return -1;
  }
  if (nelec > 2 * norb) {
    diag_span at = ints ? ints->name : charge ? charge->span : r->basis_span;
    diag_report(c->d, DIAG_ERROR, at, "%d electrons do not fit in the %d orbitals of %s (room for %d)", nelec, norb,
                orbital_source(c), 2 * norb);
    return -1;
  }
  *nalpha = (nelec + unpaired) / 2;
  *nbeta = (nelec - unpaired) / 2;
  if (*nalpha > norb) {
    diag_report(c->d, DIAG_ERROR, mspan, "multiplicity %d puts %d electrons in spin up, more than the %d orbitals of %s",
                m, *nalpha, norb, orbital_source(c));
    return -1;
  }
  r->orbitals.norbitals = norb;
  return 0;
}

/* Read a list of 1-based orbitals (`1 2 5..7`) into 0-based marks. */
static int orbital_list(rs *c, const ast_ranges *l, int norb, char *mark, const char *what) {
  int ok = 1;
  for (int i = 0; i < l->n; i++) {
    const ast_range *g = &l->v[i];
    long lo, hi;
    if (front_index(c, g->lo, g->bad, &lo)) {
      ok = 0;
      continue;
    }
    hi = lo;
    if (g->hi.file >= 0 && front_index(c, g->hi, g->bad, &hi)) {
      ok = 0;
      continue;
    }
    diag_span at = g->hi.file >= 0 ? ast_join(g->lo, g->hi) : g->lo;
    if (hi < lo) {
      diag_report(c->d, DIAG_ERROR, at, "the range %ld..%ld is empty", lo, hi);
      diag_help(c->d, "write the lower orbital first: `%ld..%ld`", hi, lo);
      ok = 0;
      continue;
    }
    if (lo < 1 || hi > norb) {
      diag_report(c->d, DIAG_ERROR, at, "orbital %ld is out of range: %s gives orbitals 1..%d", lo < 1 ? lo : hi,
                  orbital_source(c), norb);
      ok = 0;
      continue;
    }
    for (long p = lo; p <= hi; p++) {
      if (mark[p - 1]) {
        diag_report(c->d, DIAG_ERROR, at, "orbital %ld is %s twice", p, what);
        ok = 0;
        break;
      }
      mark[p - 1] = 1;
    }
  }
  return ok ? 0 : -1;
}

/* The span of the list entry that holds orbital p (1-based). */
static diag_span list_span(rs *c, const ast_ranges *l, long p) {
  for (int i = 0; i < l->n; i++) {
    long lo, hi;
    if (l->v[i].bad || front_index(c, l->v[i].lo, 0, &lo)) continue;
    hi = lo;
    if (l->v[i].hi.file >= 0 && front_index(c, l->v[i].hi, 0, &hi)) continue;
    if (lo <= p && p <= hi) return l->v[i].hi.file >= 0 ? ast_join(l->v[i].lo, l->v[i].hi) : l->v[i].lo;
  }
  return l->n ? l->v[0].lo : DIAG_NOWHERE;
}

static void take_list(const char *mark, int norb, int **out, int *n) {
  *n = 0;
  for (int p = 0; p < norb; p++) *n += mark[p] != 0;
  *out = xcalloc((size_t)*n + 1, sizeof **out);
  int k = 0;
  for (int p = 0; p < norb; p++)
    if (mark[p]) (*out)[k++] = p;
}

void front_space(rs *c) {
  ir_recipe *r = c->r;
  ir_orbitals *o = &r->orbitals;
  int nalpha, nbeta;
  if (molecule(c, &nalpha, &nbeta)) return;
  int norb = o->norbitals, nelec = r->nelectrons;

  ast_stmt *freeze = NULL, *active = NULL, *ob = c->one[RS_ORBITALS];
  for (int i = 0; ob && i < ob->items.n; i++) {
    ast_stmt *it = ob->items.v[i];
    int is_freeze = it->kind == AST_FREEZE_CORE || it->kind == AST_FREEZE_LIST;
    ast_stmt **slot = is_freeze ? &freeze : &active;
    if (*slot) {
      diag_report(c->d, DIAG_ERROR, it->kw, "`%s` is given twice in the orbitals block", is_freeze ? "freeze" : "active");
      diag_note(c->d, (*slot)->span, "first given here");
      return;
    }
    *slot = it;
  }
  if (ob) c->cur = c->nst;

  char *frozen = xcalloc((size_t)norb, 1), *core = xcalloc((size_t)norb, 1), *act = xcalloc((size_t)norb, 1);
  int ok = 1;
  if (freeze && freeze->kind == AST_FREEZE_CORE) {
    o->freeze = IR_FREEZE_CORE;
    o->freeze_span = freeze->span;
    if (r->problem == IR_PROBLEM_INTEGRALS) {
      diag_report(c->d, DIAG_ERROR, freeze->span, "`freeze core` needs the elements of the molecule, and an integrals file has none");
      diag_help(c->d, "name the orbitals to freeze: `freeze 1 2`");
      ok = 0;
    } else {
      int nf = 0;
      for (int a = 0; a < r->natoms; a++) nf += element_core_orbitals(r->points[0].atoms[a].z);
      if (nf > nbeta) {
        diag_report(c->d, DIAG_ERROR, freeze->span, "`freeze core` would freeze %d orbitals, but only %d are doubly occupied",
                    nf, nbeta);
        ok = 0;
      } else {
        for (int p = 0; p < nf; p++) frozen[p] = 1;
      }
    }
  } else if (freeze) {
    o->freeze = IR_FREEZE_LIST;
    o->freeze_span = freeze->span;
    if (orbital_list(c, &freeze->list, norb, frozen, "frozen")) ok = 0;
    for (int p = 0; p < norb && ok; p++)
      if (frozen[p] && p >= nbeta) {
        diag_report(c->d, DIAG_ERROR, list_span(c, &freeze->list, p + 1), "orbital %d is not doubly occupied, so it cannot be frozen", p + 1);
        if (nbeta > 1) diag_note(c->d, DIAG_NOWHERE, "the doubly occupied orbitals are 1..%d", nbeta);
        else if (nbeta == 1) diag_note(c->d, DIAG_NOWHERE, "only orbital 1 is doubly occupied");
        else diag_note(c->d, DIAG_NOWHERE, "no orbital is doubly occupied");
        ok = 0;
      }
  }
  int nfrozen = 0;
  for (int p = 0; p < norb; p++) nfrozen += frozen[p];
  memcpy(core, frozen, (size_t)norb);
  int unpaired = nalpha - nbeta;

  if (ok && active && active->kind == AST_ACTIVE_COUNT) {
    o->active_kind = IR_ACTIVE_COUNT;
    o->active_span = active->span;
    long ne, no;
    int a = front_eval_int(c, active->e[0], "the number of active electrons", 1, 100000, &ne);
    int b = front_eval_int(c, active->e[1], "the number of active orbitals", 1, 100000, &no);
    int rem = nelec - 2 * nfrozen;
    if (a || b) ok = 0;
    else if (ne > rem) {
      diag_report(c->d, DIAG_ERROR, active->e[0]->span, "the active space asks for %ld %s, but only %d remain%s", ne,
                  el(ne), rem, nfrozen ? " after freezing" : "");
      ok = 0;
    } else if ((rem - ne) % 2) {
      diag_report(c->d, DIAG_ERROR, active->e[0]->span,
                  "%ld active %s leave %ld outside the active space, an odd number", ne, el(ne), rem - ne);
      diag_note(c->d, DIAG_NOWHERE, "electrons outside the active space fill whole orbitals, two at a time");
      ok = 0;
    } else if (ne < unpaired) {
      diag_report(c->d, DIAG_ERROR, active->e[0]->span,
                  "multiplicity %d has %d unpaired electrons; they must all be active, but only %ld are", r->multiplicity,
                  unpaired, ne);
      ok = 0;
    } else if (ne > 2 * no) {
      diag_report(c->d, DIAG_ERROR, active->span, "%ld electrons do not fit in %ld orbitals (room for %ld)", ne, no,
                  2 * no);
      ok = 0;
    } else {
      int ninact = (int)((rem - ne) / 2);
      int p = 0;
      for (int k = 0; k < ninact; p++)
        if (!core[p]) core[p] = 1, k++;
      int need = nfrozen + ninact + (int)no;
      if (need > norb) {
        diag_report(c->d, DIAG_ERROR, active->span,
                    "the active space does not fit: %d core and %ld active orbitals need %d, but %s gives %d", nfrozen + ninact,
                    no, need, orbital_source(c), norb);
        if (nfrozen) diag_note(c->d, o->freeze_span, "%d orbital%s frozen here", nfrozen, nfrozen == 1 ? " is" : "s are");
        ok = 0;
      } else {
        for (int k = 0; k < no; p++)
          if (!core[p]) act[p] = 1, k++;
      }
    }
  } else if (ok && active) {
    o->active_kind = IR_ACTIVE_LIST;
    o->active_span = active->span;
    if (orbital_list(c, &active->list, norb, act, "listed")) ok = 0;
    for (int p = 0; p < norb && ok; p++) {
      if (act[p] && frozen[p]) {
        diag_report(c->d, DIAG_ERROR, list_span(c, &active->list, p + 1), "orbital %d is frozen, so it cannot be active", p + 1);
        diag_note(c->d, o->freeze_span, "frozen here");
        ok = 0;
      } else if (!act[p] && !frozen[p] && p < nalpha) {
        if (p >= nbeta) {
          diag_report(c->d, DIAG_ERROR, active->span, "orbital %d holds an unpaired electron, so it must be active", p + 1);
          diag_help(c->d, "add orbital %d to the list", p + 1);
          ok = 0;
        } else {
          core[p] = 1;
        }
      }
    }
  } else if (ok) {
    o->active_kind = IR_ACTIVE_ALL;
    for (int p = 0; p < norb; p++) act[p] = !frozen[p];
  }

  if (ok) {
    int ncore = 0, nact = 0;
    for (int p = 0; p < norb; p++) ncore += core[p], nact += act[p];
    int ne = nelec - 2 * ncore;
    diag_span at = active ? active->span : freeze ? freeze->span : r->basis_span.file >= 0 ? r->basis_span : r->integrals_span;
    if (nact == 0 || ne <= 0) {
      diag_report(c->d, DIAG_ERROR, at, "the active space holds %s", nact == 0 ? "no orbitals" : "no electrons");
      ok = 0;
    } else if (ne > 2 * nact) {
      diag_report(c->d, DIAG_ERROR, at, "%d active electrons do not fit in %d active orbitals (room for %d)", ne, nact,
                  2 * nact);
      ok = 0;
    } else if (nalpha - ncore > nact) {
      diag_report(c->d, DIAG_ERROR, at, "multiplicity %d puts %d active electrons in spin up, more than the %d active orbitals",
                  r->multiplicity, nalpha - ncore, nact);
      ok = 0;
    } else {
      take_list(core, norb, &o->core, &o->ncore);
      take_list(act, norb, &o->active, &o->nactive);
      o->nelec_active = ne;
      o->nalpha = nalpha - ncore;
      o->nbeta = nbeta - ncore;
      c->qubits = 2 * nact;
    }
  }
  free(frozen);
  free(core);
  free(act);
}
