/* front.h — the recipe language front end: parse, resolve, format, compare.
 *
 * front_load reads the recipe at `path` (and every file it `use`s), reports all
 * syntax and resolution errors through `d`, and returns the checked recipe, or
 * NULL when there were errors.  The caller owns the result (ir_recipe_free).
 *
 * Language decisions the rest of cairn can rely on (DESIGN.md has the words):
 *   - a recipe starts with `cairn 1`; a `use`d file holds statements and may
 *     start with `cairn 1` too; `use` paths, `basis file` and `integrals` paths
 *     are relative to the file that contains them, `emit` paths to the top
 *     recipe's directory; a file is included once even if used again;
 *   - names are defined before they are used; bare numbers in an `atoms` block
 *     take the block's unit (angstrom when the block names none);
 *   - counts and indices are whole numbers; numeric settings may be
 *     expressions of earlier `let`s, but the `vary` name only reaches atom
 *     coordinates.
 *
 * Ownership: results returned by front_* belong to the caller; the diag_ctx
 * keeps every text it registered.
 */
#ifndef CAIRN_FRONT_H
#define CAIRN_FRONT_H

#include "cairn/diag.h"
#include "cairn/ir.h"
#include "cairn/util.h"

#include <stdio.h>

ir_recipe *front_load(diag_ctx *d, const char *path);

/* Where resolution gets what lies outside the recipe text.  NULL members (or a
 * NULL front_opts) mean the defaults: files from disk (diag_load_file), orbital
 * counts from chem_count_orbitals, FCIDUMP headers from chem_fcidump_header.
 * Tests and the fuzzer supply their own, so that nothing touches the disk. */
typedef struct front_opts {
  void *ctx;
  /* Register the text of `path`, or report at `from` and return -1. */
  int32_t (*load)(void *ctx, diag_ctx *d, const char *path, diag_span from);
  int (*count_orbitals)(void *ctx, const ir_recipe *r, diag_ctx *d);
  int (*fcidump_header)(void *ctx, const char *path, diag_span from, diag_ctx *d, int *norb, int *nelec,
                        int *ms2);
} front_opts;

/* Resolve the recipe in registered file `file` (the top recipe). */
ir_recipe *front_resolve(diag_ctx *d, int32_t file, const front_opts *opts);

/* Canonical layout of registered file `file`, appended to `out`.  Returns 0,
 * or -1 after reporting syntax errors (then `out` is unchanged).  fmt reads
 * only the text: it does not follow `use` or check meaning. */
int front_fmt(diag_ctx *d, int32_t file, util_buf *out);

/* ---- Semantic difference of two recipes ------------------------------------
 * front_diff compares what two checked recipes mean, section by section, and
 * appends one record per difference.  Records are plain text so later stages
 * can add their own (generators, gate counts) with front_changes_add. */
typedef enum front_change_op { FRONT_ADDED, FRONT_REMOVED, FRONT_CHANGED } front_change_op;

typedef struct front_change {
  front_change_op op;
  char *section;  /* "basis", "geometry", "pool", ... */
  char *item;     /* which part of the section ("atom 2 (H)"), or NULL */
  char *before;   /* REMOVED, CHANGED: the old value; NULL for ADDED */
  char *after;    /* ADDED, CHANGED: the new value; NULL for REMOVED */
} front_change;

typedef struct front_changes {
  front_change *v;
  size_t n, cap;
} front_changes;

/* Copies its strings (item and either value may be NULL). */
void front_changes_add(front_changes *c, front_change_op op, const char *section, const char *item,
                       const char *before, const char *after);
void front_changes_free(front_changes *c);

/* Append the differences from a to b.  Lengths compare with a tolerance of
 * 1e-10 bohr; everything else exactly. */
void front_diff(const ir_recipe *a, const ir_recipe *b, front_changes *out);

/* Text form, one line per change:  `~ basis: sto-3g -> 6-31g`,
 * `- pool: doubles paired`, `+ pool: doubles`,
 * `~ geometry: atom 2 (H): (0, 0, 1.4) -> (0, 0, 1.5) bohr`. */
void front_changes_print(const front_changes *c, FILE *out);
/* JSON form: {"cairn": 1, "a": path, "b": path, "same": bool, "changes":
 * [{"op": "changed", "section": ..., "item": ..., "before": ..., "after": ...}]}
 * (absent values are left out); malloc'd text, caller frees. */
char *front_changes_json(const front_changes *c, const char *a_path, const char *b_path);

#endif
