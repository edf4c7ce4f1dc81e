/* chem_private.h — helpers shared by the files of the chemistry module only. */
#ifndef CAIRN_CHEM_PRIVATE_H
#define CAIRN_CHEM_PRIVATE_H

#include "cairn/chem.h"
#include "cairn/diag.h"

#include <stddef.h>
#include <stdint.h>

/* The text of a shipped basis set, embedded at build time (basis_data.c is
 * generated from the .gbs files in data/basis by a rule in src/chem/local.mk). */
typedef struct chem_basis_text {
  const char *name;  /* canonical name, "6-31g*" */
  const char *text;
} chem_basis_text;
extern const chem_basis_text chem_basis_texts[];
extern const int chem_basis_ntexts;

/* The diag index of `path` if it is registered already, else load it
 * (reporting I/O errors at `from`).  -1 on failure. */
int32_t chem_file_index(diag_ctx *d, const char *path, diag_span from);

/* One whitespace-separated field of a line of text. */
typedef struct chem_tok {
  const char *s;   /* into the text, not NUL-terminated */
  int len;
  uint32_t off;    /* byte offset in the text */
} chem_tok;

/* Split the line [start, end) of `text` into at most `max` fields separated by
 * blanks (and by `extra` characters, e.g. "," for namelists).  Returns the
 * number of fields (it may exceed `max`: only `max` are stored). */
int chem_split(const char *text, uint32_t start, uint32_t end, const char *extra, chem_tok *tok,
               int max);
/* Parse a whole field as a number (Fortran D exponents allowed).  0 on
 * success; -1 if it is not a number.  Non-finite values parse (caller checks). */
int chem_tok_double(const chem_tok *t, double *x);
/* Parse a whole field as a decimal integer in [INT_MIN/2, INT_MAX/2]; 0 or -1. */
int chem_tok_int(const chem_tok *t, int *x);
/* Span of a field in file `file`. */
static inline diag_span chem_tok_span(int32_t file, const chem_tok *t) {
  return (diag_span){file, t->off, t->off + (uint32_t)t->len};
}

/* <pq|rs> over spin orbitals (physicists' notation) from (pr|qs): zero
 * unless p and r, and q and t, have the same spin (MP2 and CCSD). */
static inline double chem_so_int(const chem_space *s, int p, int q, int r, int t) {
  if ((p & 1) != (r & 1) || (q & 1) != (t & 1)) return 0;
  return s->h2[chem_h2_index(s->norb, p >> 1, r >> 1, q >> 1, t >> 1)];
}

#endif
