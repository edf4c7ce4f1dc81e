/* basis.h — Gaussian basis sets: the Gaussian-94 text format, the sets shipped
 * with cairn (STO-3G, 6-31G, 6-31G*, cc-pVDZ for H-Ar), and user files.
 *
 * A basis_set is what the text says, element by element: contracted shells of
 * one angular momentum each (an SP shell of the file becomes an S and a P shell
 * with the same exponents), exponents already multiplied by the square of the
 * shell's scale factor, contraction coefficients as written (they multiply
 * normalized primitives).  Whether shells of l >= 2 have 2l+1 (spherical) or
 * (l+1)(l+2)/2 (cartesian) functions is the file's `spherical`/`cartesian`
 * line; a file with d or higher shells must have one.
 *
 * Ownership: a basis_set owns its shells and name; basis_set_free frees them.
 */
#ifndef CAIRN_BASIS_H
#define CAIRN_BASIS_H

#include "cairn/diag.h"

#include <stddef.h>
#include <stdint.h>

enum { BASIS_MAXZ = 118, BASIS_MAXL = 4 };

typedef struct basis_shell {
  int l;          /* 0 s, 1 p, 2 d, 3 f, 4 g */
  int nprim;
  double *exps;   /* nprim exponents (bohr^-2), scale factor applied */
  double *coefs;  /* nprim contraction coefficients (of normalized primitives) */
} basis_shell;

typedef struct basis_element {
  int nshells;    /* 0: the set does not cover this element */
  basis_shell *shells;
} basis_element;

typedef struct basis_set {
  char *name;       /* canonical name of a shipped set, or the file's path */
  int spherical;    /* 1: pure functions for l >= 2; 0: cartesian */
  int builtin;      /* 1 for a shipped set */
  basis_element elem[BASIS_MAXZ + 1];  /* indexed by atomic number */
} basis_set;

/* Canonical name of a shipped set ("sto-3g", "6-31g", "6-31g*", "cc-pvdz"):
 * names compare case-insensitively and `6-31gs` means `6-31g*`.  NULL when
 * `name` is not a shipped set. */
const char *basis_builtin_name(const char *name);
/* The shipped names, comma-separated, for messages ("sto-3g, 6-31g, ..."). */
const char *basis_builtin_list(void);

/* Parse Gaussian-94 text.  `file` is the diag index of the registered text
 * (errors are reported there with line, column and field), or -1 for a text
 * that is not registered (the shipped sets).  Returns 0, or -1 after
 * reporting every problem found.  On error `out` is left empty. */
int basis_parse(diag_ctx *d, int32_t file, const char *text, size_t len, const char *name,
                basis_set *out);

/* Load a shipped set by name (`path` NULL) or the file `path` (`name` NULL).
 * A file already registered with `d` under the same path is reused, so loading
 * once per scan point reports its errors once.  Problems with the name or the
 * file's existence are reported at `from` (the recipe's basis statement).
 * Returns 0 or -1. */
int basis_load(diag_ctx *d, const char *name, const char *path, diag_span from, basis_set *out);

void basis_set_free(basis_set *b);

/* Functions in a shell of angular momentum l. */
static inline int basis_shell_size(int l, int spherical) {
  return spherical && l >= 2 ? 2 * l + 1 : (l + 1) * (l + 2) / 2;
}
/* Functions the set gives element z (0 when it does not cover z). */
int basis_element_size(const basis_set *b, int z);

#endif
