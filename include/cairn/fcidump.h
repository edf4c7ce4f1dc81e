/* fcidump.h — the FCIDUMP integral file (Knowles & Handy, Comput. Phys.
 * Commun. 54, 75 (1989)): reader with validation, and writer.
 *
 * A file is a Fortran namelist header
 *     &FCI NORB=4, NELEC=4, MS2=0, ORBSYM=1,1,1,1, ISYM=1, &END   (or `/`)
 * followed by one record per line, `value i j k l` with 1-based orbitals:
 *     i j k l > 0           (ij|kl), chemists' notation, 8-fold symmetric
 *     i j > 0, k = l = 0    h_ij, symmetric
 *     i > 0, j = k = l = 0  orbital energy of i (an extension some writers add)
 *     0 0 0 0               the constant (nuclear repulsion + frozen core)
 * Absent integrals are zero.  cairn reads restricted files only (UHF=.FALSE.).
 *
 * Every problem is reported through diag with the line and the field: header
 * fields and their values, index ranges, index patterns, symmetry-equivalent
 * duplicates that disagree, non-finite values, a missing constant line.
 *
 * Ownership: the chem_space filled by fcidump_read belongs to the caller
 * (chem_space_free).
 */
#ifndef CAIRN_FCIDUMP_H
#define CAIRN_FCIDUMP_H

#include "cairn/chem.h"
#include "cairn/diag.h"

typedef struct fcidump_header {
  int norb, nelec, ms2, isym;
  int uhf;              /* as written; the reader refuses 1 */
  diag_span start;      /* the `&FCI` token */
  uint32_t body;        /* byte offset of the first record line */
} fcidump_header;

/* Parse and check the header of the registered text `file`.  0 or -1. */
int fcidump_parse_header(diag_ctx *d, int32_t file, fcidump_header *h);

/* Read a whole file into `out` (norb, nalpha, nbeta from the header,
 * e_nuclear = 0 because the format does not carry it, e_constant from the
 * 0 0 0 0 line, orbital energies when the file gives them for every orbital).
 * I/O problems are reported at `from`.  0 or -1. */
int fcidump_read(diag_ctx *d, const char *path, diag_span from, chem_space *out);

/* Same, from a text already registered with d. */
int fcidump_read_file(diag_ctx *d, int32_t file, chem_space *out);

/* Write `s` (atomically; deterministic layout, 17 significant digits, unique
 * integrals i>=j, k>=l, ij>=kl that are not exactly zero).  0, or -1 with errno. */
int fcidump_write(const chem_space *s, const char *path);

#endif
