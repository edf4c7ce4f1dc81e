/* testrecipe.h — recipes built by hand for the ansatz unit tests and check
 * drivers, without the front end: a recipe-like text registered with the
 * diagnostics (so every message points at a real line) and the subset of the
 * rule language the checks use.
 *
 * The text is, line by line: 1 "reference", 2-4 "keep particles",
 * "keep spin-z", "keep spin-squared", 5 "encoding", 6 "choose", 7 "pool {",
 * 8.. the rule lines (indented by two), then "}".
 *
 * Ownership: the text belongs to the diag_ctx; the letters/from/to arrays
 * that testrecipe_rules allocates are the caller's (testrecipe_rules_free).
 */
#ifndef CAIRN_TESTRECIPE_H
#define CAIRN_TESTRECIPE_H

#include "cairn/diag.h"
#include "cairn/ir.h"

/* Register the text of the rule lines under `path` (kept, not copied: a
 * literal) and point r's path and the spans of its reference, keeps,
 * encoding, choose and pool at their lines.  Returns the file index. */
int32_t testrecipe_text(diag_ctx *d, const char *path, ir_recipe *r, const char *const *lines, int nrules);

/* Parse the rule lines ("singles", "doubles paired generalized",
 * "singles spin-adapted", "qubit doubles", "entanglers", "word X0 Y1 Z3",
 * "excite 0 1 -> 4 5") into rules[0..nrules), each zeroed first and given
 * the span of its line in `file`.  Returns how many were understood: nrules,
 * or the index of the first line that was not. */
int testrecipe_rules(diag_ctx *d, int32_t file, ir_rule *rules, const char *const *lines, int nrules);
/* Free what testrecipe_rules allocated in rules[0..nrules). */
void testrecipe_rules_free(ir_rule *rules, int nrules);

#endif
