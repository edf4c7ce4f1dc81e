/* fuzz_recipe.c — libFuzzer target for the recipe front end.
 *
 * Each input is a recipe text held in memory.  It is parsed and resolved, and
 * then the properties the front end promises are checked, aborting when one
 * fails:
 *   - a resolved recipe has no differences from itself (front_diff);
 *   - fmt is idempotent: fmt(fmt(x)) == fmt(x) byte for byte;
 *   - fmt keeps the meaning: when x resolves, fmt(x) resolves and front_diff
 *     finds no differences.
 * Nothing touches the file system: `use` gets a fixed fragment for any path
 * ending in .cairn (a cycle still is a cycle), other files are missing; the
 * orbital count and FCIDUMP header come from stand-ins below instead of the
 * chemistry module.  Diagnostics go to /dev/null.
 */
#include "config.h"

#include "cairn/diag.h"
#include "cairn/element.h"
#include "cairn/front.h"
#include "cairn/util.h"

#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

static int ends_with(const char *s, const char *tail) {
  size_t n = strlen(s), m = strlen(tail);
  return n >= m && strcmp(s + n - m, tail) == 0;
}

static int32_t fuzz_load(void *ctx, diag_ctx *d, const char *path, diag_span from) {
  (void)ctx;
  static const char fragment[] = "# a used fragment\nlet fuzz_bond = 0.74 angstrom\ncharge 0\n";
  if (ends_with(path, ".cairn")) return diag_add_file(d, path, xstrdup(fragment), sizeof fragment - 1);
  diag_report(d, DIAG_ERROR, from, "cannot read `%s`", path);
  return -1;
}

/* A minimal-basis-like count: 1 orbital for H and He, 5 for Li-Ne, 9 beyond;
 * a basis named `none` does not exist. */
static int fuzz_count(void *ctx, const ir_recipe *r, diag_ctx *d) {
  (void)ctx;
  if (r->basis_name && strcmp(r->basis_name, "none") == 0) {
    diag_report(d, DIAG_ERROR, r->basis_span, "unknown basis set");
    return -1;
  }
  int n = 0;
  for (int a = 0; a < r->natoms; a++) {
    int z = r->points[0].atoms[a].z;
    n += z <= 2 ? 1 : z <= 10 ? 5 : 9;
  }
  return n;
}

static int fuzz_header(void *ctx, const char *path, diag_span from, diag_ctx *d, int *norb, int *nelec, int *ms2) {
  (void)ctx;
  if (!ends_with(path, ".fcidump")) {
    diag_report(d, DIAG_ERROR, from, "cannot read `%s`", path);
    return -1;
  }
  *norb = 4;
  *nelec = 4;
  *ms2 = 0;
  return 0;
}

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size) {
  FILE *sink = fopen("/dev/null", "w");
  if (!sink) return 0;
  diag_ctx *d = diag_new(sink, DIAG_COLOR_NEVER);
  char *text = xmalloc(size + 1);
  memcpy(text, data, size);
  int32_t f = diag_add_file(d, "fuzz/recipe.cairn", text, size);
  front_opts o = {NULL, fuzz_load, fuzz_count, fuzz_header};

  ir_recipe *r = front_resolve(d, f, &o);
  if (r) {
    front_changes c = {0};
    front_diff(r, r, &c);
    if (c.n) abort();
    front_changes_free(&c);
  }

  util_buf once = {0};
  util_buf_append(&once, "", 0);
  if (front_fmt(d, f, &once) == 0) {
    int32_t g = diag_add_file(d, "fuzz/recipe-fmt.cairn", xstrndup(once.s, once.len), once.len);
    util_buf twice = {0};
    util_buf_append(&twice, "", 0);
    if (front_fmt(d, g, &twice) != 0) abort();
    if (twice.len != once.len || memcmp(twice.s, once.s, once.len) != 0) abort();
    util_buf_free(&twice);
    if (r) {
      ir_recipe *r2 = front_resolve(d, g, &o);
      if (!r2) abort();
      front_changes c = {0};
      front_diff(r, r2, &c);
      if (c.n) abort();
      front_changes_free(&c);
      ir_recipe_free(r2);
    }
  } else if (r) {
    abort(); /* it resolved, so it parsed */
  }
  util_buf_free(&once);
  ir_recipe_free(r);
  diag_free(d);
  fclose(sink);
  return 0;
}
