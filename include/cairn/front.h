/* front.h — the recipe language front end: parse, resolve, check.
 *
 * front_load reads the recipe at `path` (and every file it `use`s), reports all
 * syntax and resolution errors through `d`, and returns the checked recipe, or
 * NULL when there were errors.  The caller owns the result (ir_recipe_free).
 */
#ifndef CAIRN_FRONT_H
#define CAIRN_FRONT_H

#include "cairn/diag.h"
#include "cairn/ir.h"

ir_recipe *front_load(diag_ctx *d, const char *path);

#endif
