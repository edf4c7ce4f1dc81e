/* diag.h — source files, byte spans and diagnostics.
 *
 * Every text that cairn reads and may report errors against (recipes, FCIDUMP
 * files, basis files) is registered here once; the rest of the program refers to
 * places in it by byte spans.  Line and column are computed only when a message
 * is printed, as
 *
 *     file:line:col: error: message
 *      12 |   doubles paired generalized
 *         |   ^^^^^^^
 *     note: ...
 *     help: ...
 *
 * Ownership: the diag_ctx owns every registered text and path; spans and the
 * pointers returned by diag_file_* stay valid until diag_free.
 */
#ifndef CAIRN_DIAG_H
#define CAIRN_DIAG_H

#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>

/* A half-open byte range [start, end) in registered file `file`.  file < 0 means
 * "no location" (a message about the run, not about a text). */
typedef struct diag_span {
  int32_t file;
  uint32_t start, end;
} diag_span;

#define DIAG_NOWHERE ((diag_span){-1, 0, 0})

typedef enum diag_level { DIAG_ERROR, DIAG_WARNING } diag_level;
typedef enum diag_color { DIAG_COLOR_NEVER, DIAG_COLOR_ALWAYS, DIAG_COLOR_AUTO } diag_color;

typedef struct diag_ctx diag_ctx;

/* Messages go to `out` (normally stderr).  AUTO colours when `out` is a tty. */
diag_ctx *diag_new(FILE *out, diag_color color);
void diag_free(diag_ctx *d);

/* Register a text.  Takes ownership of `text` (malloc'd, `len` bytes, need not
 * be NUL-terminated; a NUL is appended).  Returns the file index. */
int32_t diag_add_file(diag_ctx *d, const char *path, char *text, size_t len);
/* Read a file from disk and register it.  On failure reports an I/O error
 * (at `from`, when it is a real span: the `use`/`integrals` statement) and
 * returns -1. */
int32_t diag_load_file(diag_ctx *d, const char *path, diag_span from);
int32_t diag_nfiles(const diag_ctx *d);
const char *diag_file_path(const diag_ctx *d, int32_t file);
const char *diag_file_text(const diag_ctx *d, int32_t file, size_t *len);
/* 1-based line and column of byte `off` in `file` (column counts bytes). */
void diag_line_col(const diag_ctx *d, int32_t file, uint32_t off, int *line, int *col);
/* Span of the whole 1-based line `line` of `file` (without its newline). */
diag_span diag_line_span(const diag_ctx *d, int32_t file, int line);

/* Report an error or a warning.  Notes and help lines that follow attach to it. */
void diag_report(diag_ctx *d, diag_level level, diag_span where, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));
void diag_vreport(diag_ctx *d, diag_level level, diag_span where, const char *fmt, va_list ap);
void diag_note(diag_ctx *d, diag_span where, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));
void diag_help(diag_ctx *d, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

int diag_errors(const diag_ctx *d);
/* Text of the most recent error (without location), "" if none: lets a caller
 * that goes on after a failure (a scan point) say what went wrong. */
const char *diag_last_error(const diag_ctx *d);
int diag_warnings(const diag_ctx *d);
/* With werror set, warnings are counted as errors (cairn --werror). */
void diag_set_werror(diag_ctx *d, int on);
FILE *diag_stream(const diag_ctx *d);
int diag_use_color(const diag_ctx *d);

#endif
