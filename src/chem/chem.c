/* chem.c — the chemistry module's entry points (chem.h): orbital counts for
 * the front end, the active space of a scan point, and the space's lifetime. */
#include "config.h"

#include "cairn/basis.h"
#include "cairn/chem.h"
#include "cairn/element.h"
#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

void chem_space_free(chem_space *s) {
  if (!s) return;
  free(s->h1);
  free(s->h2);
  free(s->orbital_energies);
  memset(s, 0, sizeof *s);
}

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
