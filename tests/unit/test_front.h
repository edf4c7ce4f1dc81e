/* test_front.h — helpers shared by the front-end unit tests: recipes held in
 * memory, diagnostics captured in a buffer. */
#ifndef CAIRN_TEST_FRONT_H
#define CAIRN_TEST_FRONT_H

#include "cairn/diag.h"
#include "cairn/front.h"
#include "cairn/util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct ft {
  diag_ctx *d;
  FILE *f;
  char *msgs;
  size_t len;
  /* files a `use` may read: path, text pairs, NULL-terminated */
  const char *const *files;
} ft;

static inline void ft_init(ft *t) {
  memset(t, 0, sizeof *t);
  t->f = open_memstream(&t->msgs, &t->len);
  t->d = diag_new(t->f, DIAG_COLOR_NEVER);
}

static inline int32_t ft_text(ft *t, const char *path, const char *text) {
  return diag_add_file(t->d, path, xstrdup(text), strlen(text));
}

/* Everything reported so far. */
static inline const char *ft_messages(ft *t) {
  fflush(t->f);
  return t->msgs ? t->msgs : "";
}

static inline void ft_free(ft *t) {
  diag_free(t->d);
  fclose(t->f);
  free(t->msgs);
}

/* A loader that serves t->files and reports every other path as missing. */
static inline int32_t ft_load(void *ctx, diag_ctx *d, const char *path, diag_span from) {
  ft *t = ctx;
  for (int i = 0; t->files && t->files[i]; i += 2)
    if (strcmp(t->files[i], path) == 0) return diag_add_file(d, path, xstrdup(t->files[i + 1]), strlen(t->files[i + 1]));
  diag_report(d, DIAG_ERROR, from, "cannot read `%s`: not in the test's files", path);
  return -1;
}

/* Resolve an in-memory recipe (files for `use` from t->files). */
static inline ir_recipe *ft_resolve(ft *t, const char *path, const char *text) {
  front_opts o = {t, ft_load, NULL, NULL};
  return front_resolve(t->d, ft_text(t, path, text), &o);
}

#endif
