/* chem_util.c — small text helpers shared by the basis and FCIDUMP readers. */
#include "config.h"

#include "chem/chem_private.h"

#include <errno.h>
#include <limits.h>
#include <stdlib.h>
#include <string.h>

int32_t chem_file_index(diag_ctx *d, const char *path, diag_span from) {
  for (int32_t i = diag_nfiles(d) - 1; i >= 0; i--)
    if (strcmp(diag_file_path(d, i), path) == 0) return i;
  return diag_load_file(d, path, from);
}

static int is_sep(char c, const char *extra) {
  return c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v' ||
         (extra && c && strchr(extra, c));
}

int chem_split(const char *text, uint32_t start, uint32_t end, const char *extra, chem_tok *tok,
               int max) {
  int n = 0;
  uint32_t i = start;
  while (i < end) {
    while (i < end && is_sep(text[i], extra)) i++;
    if (i >= end) break;
    uint32_t s = i;
    while (i < end && !is_sep(text[i], extra)) i++;
    if (n < max) tok[n] = (chem_tok){text + s, (int)(i - s), s};
    n++;
  }
  return n;
}

int chem_tok_double(const chem_tok *t, double *x) {
  char buf[80];
  if (t->len <= 0 || t->len >= (int)sizeof buf) return -1;
  for (int i = 0; i < t->len; i++) {
    char c = t->s[i];
    buf[i] = (c == 'D' || c == 'd') ? 'e' : c;
  }
  buf[t->len] = 0;
  char *end;
  errno = 0;
  double v = strtod(buf, &end);
  if (end != buf + t->len) return -1;
  /* A hexadecimal float is not a number of these formats. */
  if (strchr(buf, 'x') || strchr(buf, 'X')) return -1;
  *x = v;
  return 0;
}

int chem_tok_int(const chem_tok *t, int *x) {
  char buf[32];
  if (t->len <= 0 || t->len >= (int)sizeof buf) return -1;
  memcpy(buf, t->s, (size_t)t->len);
  buf[t->len] = 0;
  char *end;
  errno = 0;
  long v = strtol(buf, &end, 10);
  if (end != buf + t->len || errno || v < INT_MIN / 2 || v > INT_MAX / 2) return -1;
  *x = (int)v;
  return 0;
}
