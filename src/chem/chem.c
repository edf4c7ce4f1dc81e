/* chem.c — the chemistry module's entry points (chem.h): orbital counts for
 * the front end, the active space of a scan point, and the space's lifetime. */
#include "config.h"

#include "cairn/basis.h"
#include "cairn/chem.h"
#include "cairn/element.h"
#include "cairn/fcidump.h"
#include "cairn/integrals.h"
#include "cairn/scf.h"
#include "cairn/util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* Load the recipe's basis set (shipped name or file). */
static int load_recipe_basis(const ir_recipe *r, diag_ctx *d, basis_set *b) {
  if (!r->basis_file && !r->basis_name) {
    diag_report(d, DIAG_ERROR, r->basis_span, "the recipe gives atoms but no basis set");
    diag_help(d, "add `basis sto-3g` (shipped: %s) or `basis file \"mine.gbs\"`", basis_builtin_list());
    return -1;
  }
  return basis_load(d, r->basis_file ? NULL : r->basis_name, r->basis_file, r->basis_span, b);
}

int chem_count_orbitals(const ir_recipe *r, diag_ctx *d) {
  if (r->problem != IR_PROBLEM_ATOMS || r->npoints < 1) return -1;
  basis_set b;
  if (load_recipe_basis(r, d, &b) != 0) return -1;
  int total = 0, bad = 0;
  const ir_atom *atoms = r->points[0].atoms;
  for (int a = 0; a < r->natoms; a++) {
    int n = basis_element_size(&b, atoms[a].z);
    if (n == 0) {
      const char *sym = element_symbol(atoms[a].z);
      /* one message per element, at its first atom */
      int first = 1;
      for (int k = 0; k < a; k++) first &= atoms[k].z != atoms[a].z;
      if (first) {
        diag_report(d, DIAG_ERROR, atoms[a].span, "basis set `%s` has no functions for %s", b.name,
                    sym ? sym : "this element");
        diag_note(d, r->basis_span, "the basis set is chosen here");
      }
      bad = 1;
    }
    total += n;
  }
  basis_set_free(&b);
  return bad ? -1 : total;
}

static const char *unit_word(ir_unit u) {
  switch (u) {
  case IR_UNIT_BOHR: return "bohr";
  case IR_UNIT_ANGSTROM: return "angstrom";
  case IR_UNIT_DEGREE: return "deg";
  case IR_UNIT_RADIAN: return "rad";
  default: return "";
  }
}

/* The IR's scan-point description for messages: " (r = 1.2)" or "". */
static void point_label(const ir_recipe *r, int point, char *buf, size_t n) {
  if (r->scan.active && r->scan.name)
    snprintf(buf, n, "scan point %d of %d (%s = %g %s)", point + 1, r->npoints, r->scan.name, r->points[point].param,
             unit_word(r->scan.unit));
  else snprintf(buf, n, "the geometry");
}

/* The active space of an atoms-and-basis recipe at one point: integrals,
 * Hartree-Fock, transformation. */
static int build_from_atoms(const ir_recipe *r, int point, diag_ctx *d, chem_space *out, chem_refs *refs) {
  basis_set bs;
  if (load_recipe_basis(r, d, &bs) != 0) return -1;
  const ir_point *pt = &r->points[point];
  int_basis ib;
  if (int_basis_build(&bs, pt->atoms, r->natoms, &ib) != 0) {
    basis_set_free(&bs);
    if (chem_count_orbitals(r, d) >= 0)
      diag_report(d, DIAG_ERROR, r->basis_span, "basis set `%s` does not cover every atom", bs.name);
    return -1;
  }
  int ne = r->nelectrons, mult = r->multiplicity > 0 ? r->multiplicity : 1;
  int na = (ne + mult - 1) / 2, nb = (ne - mult + 1) / 2;
  char where[160];
  point_label(r, point, where, sizeof where);
  diag_span at = r->natoms > 0 ? pt->atoms[0].span : r->basis_span;
  if (mult < 1 || (ne + mult - 1) % 2 != 0 || mult - 1 > ne) {
    diag_report(d, DIAG_ERROR, r->basis_span, "%d electrons cannot have multiplicity %d", ne, mult);
    int_basis_free(&ib);
    basis_set_free(&bs);
    return -1;
  }
  scf_options o;
  scf_options_default(&o);
  scf_result sr;
  scf_status st = scf_run(&ib, &bs, na, nb, &o, &sr);
  int rc = 0;
  if (st == SCF_FAILED) {
    diag_report(d, DIAG_ERROR, at, "Hartree-Fock cannot start at %s of recipe `%s`: %s", where, r->path ? r->path : "",
                sr.message);
    rc = -1;
  } else if (st == SCF_NOT_CONVERGED) {
    diag_report(d, DIAG_ERROR, at,
                "%s did not converge in %d iterations at %s of recipe `%s` (last energy change %.1e hartree, "
                "density change %.1e)",
                na == nb ? "restricted Hartree-Fock" : "restricted open-shell Hartree-Fock", sr.iterations, where,
                r->path ? r->path : "", sr.last_de, sr.last_dd);
    diag_help(d, "try a geometry nearer equilibrium or a smaller basis set at this point; or compute the "
                 "orbitals elsewhere and give them as `integrals \"x.fcidump\"`");
    rc = -1;
  } else {
    const ir_orbitals *ob = &r->orbitals;
    if (ob->nactive > 0) {
      scf_active_space(&sr, ob->core, ob->ncore, ob->active, ob->nactive, ob->nalpha, ob->nbeta, out);
    } else {
      /* no active list: every orbital after the core */
      int nact = sr.nbf - ob->ncore;
      int *act = xmalloc((size_t)(nact > 0 ? nact : 1) * sizeof(int));
      for (int k = 0, p = 0; p < sr.nbf; p++) {
        int core = 0;
        for (int c = 0; c < ob->ncore; c++) core |= ob->core[c] == p;
        if (!core) act[k++] = p;
      }
      scf_active_space(&sr, ob->core, ob->ncore, act, nact, na - ob->ncore, nb - ob->ncore, out);
      free(act);
    }
    refs->has_hf = 1;
    refs->hf = sr.energy;
    refs->scf_iterations = sr.iterations;
  }
  scf_result_free(&sr);
  int_basis_free(&ib);
  basis_set_free(&bs);
  return rc;
}

/* The active space of an FCIDUMP recipe: the file's orbitals, the recipe's
 * core folded in, its active orbitals kept. */
static int build_from_fcidump(const ir_recipe *r, diag_ctx *d, chem_space *out, chem_refs *refs) {
  chem_space full;
  if (fcidump_read(d, r->integrals_file, r->integrals_span, &full) != 0) return -1;
  const ir_orbitals *ob = &r->orbitals;
  if (ob->nactive > 0 || ob->ncore > 0) {
    int nact = ob->nactive;
    int *act = ob->active;
    int *own = NULL;
    if (nact == 0) {
      nact = full.norb - ob->ncore;
      own = xmalloc((size_t)(nact > 0 ? nact : 1) * sizeof(int));
      for (int k = 0, p = 0; p < full.norb; p++) {
        int core = 0;
        for (int c = 0; c < ob->ncore; c++) core |= ob->core[c] == p;
        if (!core) own[k++] = p;
      }
      act = own;
    }
    int na = ob->nactive > 0 ? ob->nalpha : full.nalpha - ob->ncore;
    int nb = ob->nactive > 0 ? ob->nbeta : full.nbeta - ob->ncore;
    chem_space_select(&full, ob->core, ob->ncore, act, nact, na, nb, out);
    free(own);
    chem_space_free(&full);
  } else {
    *out = full;
  }
  refs->has_hf = 1;
  refs->hf = chem_reference_energy(out);
  return 0;
}

int chem_build_space(const ir_recipe *r, int point, diag_ctx *d, chem_space *out, chem_refs *refs) {
  memset(out, 0, sizeof *out);
  if (r->problem == IR_PROBLEM_INTEGRALS) return build_from_fcidump(r, d, out, refs);
  if (point < 0 || point >= r->npoints) {
    diag_report(d, DIAG_ERROR, DIAG_NOWHERE, "scan point %d does not exist (the recipe has %d)", point + 1,
                r->npoints);
    return -1;
  }
  return build_from_atoms(r, point, d, out, refs);
}
