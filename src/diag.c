/* diag.c — the one place messages about texts are formatted and counted. */
#include "config.h"

#include "cairn/diag.h"
#include "cairn/util.h"

#include <errno.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

typedef struct diag_file {
  char *path;
  char *text;
  size_t len;
  uint32_t *lines; /* byte offset of the start of each line */
  size_t nlines;
} diag_file;

struct diag_ctx {
  FILE *out;
  int color;
  int werror;
  int errors, warnings;
  diag_file *files;
  size_t nfiles, cap;
  char last[512]; /* most recent error message */
};

diag_ctx *diag_new(FILE *out, diag_color color) {
  diag_ctx *d = xcalloc(1, sizeof *d);
  d->out = out;
  if (color == DIAG_COLOR_AUTO) d->color = isatty(fileno(out)) && getenv("NO_COLOR") == NULL;
  else d->color = color == DIAG_COLOR_ALWAYS;
  return d;
}

void diag_free(diag_ctx *d) {
  if (!d) return;
  for (size_t i = 0; i < d->nfiles; i++) {
    free(d->files[i].path);
    free(d->files[i].text);
    free(d->files[i].lines);
  }
  free(d->files);
  free(d);
}

int32_t diag_add_file(diag_ctx *d, const char *path, char *text, size_t len) {
  UTIL_GROW(d->files, d->cap, d->nfiles + 1);
  diag_file *f = &d->files[d->nfiles];
  f->path = xstrdup(path);
  f->text = xrealloc(text, len + 1);
  f->text[len] = 0;
  f->len = len;
  size_t cap = 0;
  f->lines = NULL;
  f->nlines = 0;
  UTIL_GROW(f->lines, cap, 1);
  f->lines[f->nlines++] = 0;
  for (size_t i = 0; i < len; i++) {
    if (f->text[i] == '\n' && i + 1 < len) {
      UTIL_GROW(f->lines, cap, f->nlines + 1);
      f->lines[f->nlines++] = (uint32_t)(i + 1);
    }
  }
  return (int32_t)d->nfiles++;
}

int32_t diag_load_file(diag_ctx *d, const char *path, diag_span from) {
  size_t len;
  char *text = util_read_file(path, &len);
  if (!text) {
    int e = errno;
    if (from.file >= 0) diag_report(d, DIAG_ERROR, from, "cannot read `%s`: %s", path, strerror(e));
    else diag_report(d, DIAG_ERROR, DIAG_NOWHERE, "cannot read `%s`: %s", path, strerror(e));
    return -1;
  }
  return diag_add_file(d, path, text, len);
}

int32_t diag_nfiles(const diag_ctx *d) { return (int32_t)d->nfiles; }

const char *diag_file_path(const diag_ctx *d, int32_t file) {
  return file >= 0 && (size_t)file < d->nfiles ? d->files[file].path : "<none>";
}

const char *diag_file_text(const diag_ctx *d, int32_t file, size_t *len) {
  if (file < 0 || (size_t)file >= d->nfiles) {
    if (len) *len = 0;
    return "";
  }
  if (len) *len = d->files[file].len;
  return d->files[file].text;
}

/* Index of the line holding byte `off` (binary search over line starts). */
static size_t line_index(const diag_file *f, uint32_t off) {
  size_t lo = 0, hi = f->nlines;
  while (hi - lo > 1) {
    size_t mid = (lo + hi) / 2;
    if (f->lines[mid] <= off) lo = mid;
    else hi = mid;
  }
  return lo;
}

void diag_line_col(const diag_ctx *d, int32_t file, uint32_t off, int *line, int *col) {
  if (file < 0 || (size_t)file >= d->nfiles) {
    *line = *col = 0;
    return;
  }
  const diag_file *f = &d->files[file];
  if (off > f->len) off = (uint32_t)f->len;
  size_t li = line_index(f, off);
  *line = (int)li + 1;
  *col = (int)(off - f->lines[li]) + 1;
}

diag_span diag_line_span(const diag_ctx *d, int32_t file, int line) {
  const diag_file *f = &d->files[file];
  if (line < 1) line = 1;
  if ((size_t)line > f->nlines) line = (int)f->nlines;
  uint32_t s = f->lines[line - 1], e = s;
  while (e < f->len && f->text[e] != '\n') e++;
  return (diag_span){file, s, e};
}

enum { C_ERR, C_WARN, C_NOTE, C_HELP, C_BOLD, C_GUTTER, C_RESET };
static const char *const colors[] = {"\033[1;31m", "\033[1;33m", "\033[1;36m",
                                     "\033[1;32m", "\033[1m",    "\033[34m", "\033[0m"};

static const char *col(const diag_ctx *d, int c) { return d->color ? colors[c] : ""; }

/* The source line of `sp` with a caret line under the span (first line only). */
static void show_source(diag_ctx *d, diag_span sp, int kind) {
  const diag_file *f = &d->files[sp.file];
  uint32_t start = sp.start > f->len ? (uint32_t)f->len : sp.start;
  size_t li = line_index(f, start);
  uint32_t ls = f->lines[li], le = ls;
  while (le < f->len && f->text[le] != '\n' && f->text[le] != '\r') le++;
  uint32_t end = sp.end < start ? start : sp.end;
  if (end > le) end = le;
  int width = snprintf(NULL, 0, "%zu", li + 1);
  fprintf(d->out, "%s%*zu |%s ", col(d, C_GUTTER), width, li + 1, col(d, C_RESET));
  fwrite(f->text + ls, 1, le - ls, d->out);
  fprintf(d->out, "\n%s%*s |%s ", col(d, C_GUTTER), width, "", col(d, C_RESET));
  for (uint32_t i = ls; i < start; i++) fputc(f->text[i] == '\t' ? '\t' : ' ', d->out);
  fputs(col(d, kind), d->out);
  uint32_t n = end > start ? end - start : 1;
  for (uint32_t i = 0; i < n; i++) fputc('^', d->out);
  fprintf(d->out, "%s\n", col(d, C_RESET));
}

static void emit(diag_ctx *d, const char *word, int kind, diag_span where, const char *suffix,
                 const char *fmt, va_list ap) {
  int located = where.file >= 0 && (size_t)where.file < d->nfiles;
  if (located) {
    int line, c;
    diag_line_col(d, where.file, where.start, &line, &c);
    fprintf(d->out, "%s%s:%d:%d:%s ", col(d, C_BOLD), d->files[where.file].path, line, c,
            col(d, C_RESET));
  }
  fprintf(d->out, "%s%s:%s ", col(d, kind), word, col(d, C_RESET));
  vfprintf(d->out, fmt, ap);
  fputs(suffix, d->out);
  fputc('\n', d->out);
  if (located && d->files[where.file].len > 0) show_source(d, where, kind);
}

void diag_vreport(diag_ctx *d, diag_level level, diag_span where, const char *fmt, va_list ap) {
  int as_error = level == DIAG_ERROR || d->werror;
  if (as_error) {
    va_list aq;
    va_copy(aq, ap);
    vsnprintf(d->last, sizeof d->last, fmt, aq);
    va_end(aq);
  }
  if (as_error) d->errors++;
  else d->warnings++;
  /* a promoted warning reads as an error, marked so the user knows why */
  emit(d, as_error ? "error" : "warning", as_error ? C_ERR : C_WARN, where,
       as_error && level != DIAG_ERROR ? " [--werror]" : "", fmt, ap);
}

void diag_report(diag_ctx *d, diag_level level, diag_span where, const char *fmt, ...) {
  va_list ap;
  va_start(ap, fmt);
  diag_vreport(d, level, where, fmt, ap);
  va_end(ap);
}

void diag_note(diag_ctx *d, diag_span where, const char *fmt, ...) {
  va_list ap;
  va_start(ap, fmt);
  emit(d, "note", C_NOTE, where, "", fmt, ap);
  va_end(ap);
}

void diag_help(diag_ctx *d, const char *fmt, ...) {
  va_list ap;
  va_start(ap, fmt);
  emit(d, "help", C_HELP, DIAG_NOWHERE, "", fmt, ap);
  va_end(ap);
}

int diag_errors(const diag_ctx *d) { return d->errors; }
const char *diag_last_error(const diag_ctx *d) { return d->last; }
int diag_warnings(const diag_ctx *d) { return d->warnings; }
void diag_set_werror(diag_ctx *d, int on) { d->werror = on; }
FILE *diag_stream(const diag_ctx *d) { return d->out; }
int diag_use_color(const diag_ctx *d) { return d->color; }
