/* util.h — allocation that cannot return NULL, growable buffers, atomic output.
 *
 * Out of memory is not a recoverable condition for cairn: x* functions print
 * one line and exit with status 2.  Large allocations whose size the user
 * controls (the statevector, the determinant space) must be checked with
 * util_mem_available() first and refused with a clear message instead.
 */
#ifndef CAIRN_UTIL_H
#define CAIRN_UTIL_H

#include <stddef.h>
#include <stdio.h>
#include <stdint.h>

void *xmalloc(size_t n);
void *xcalloc(size_t count, size_t size);
void *xrealloc(void *p, size_t n);
char *xstrdup(const char *s);
char *xstrndup(const char *s, size_t n);
char *xasprintf(const char *fmt, ...) __attribute__((format(printf, 1, 2)));

/* Grow *p (element size `size`) so that it holds at least `need` elements;
 * *cap is updated.  Doubling, so appends are amortized O(1). */
void util_grow(void **p, size_t *cap, size_t need, size_t size);
#define UTIL_GROW(p, cap, need) util_grow((void **)&(p), &(cap), (need), sizeof *(p))

/* A growable text buffer.  Owns `s`; util_buf_free releases it. */
typedef struct util_buf {
  char *s;
  size_t len, cap;
} util_buf;
void util_buf_printf(util_buf *b, const char *fmt, ...) __attribute__((format(printf, 2, 3)));
void util_buf_append(util_buf *b, const char *s, size_t n);
void util_buf_free(util_buf *b);

/* Read a whole file into a malloc'd NUL-terminated buffer (caller frees).
 * Returns NULL and sets errno on failure. */
char *util_read_file(const char *path, size_t *len);

/* Atomic output: write to a temporary file beside `path`, then rename over it
 * on commit, so a failure never leaves a half-written file.  The handle owns the
 * stream; commit or abort (exactly one) frees it.  Returns NULL with errno set. */
typedef struct util_afile util_afile;
util_afile *util_afile_open(const char *path);
FILE *util_afile_stream(util_afile *f);
int util_afile_commit(util_afile *f); /* 0 on success, -1 with errno (file removed) */
void util_afile_abort(util_afile *f);
/* Write a whole buffer atomically. 0 on success, -1 with errno. */
int util_write_atomic(const char *path, const void *data, size_t len);

/* Memory the machine can give this process now, in bytes (MemAvailable from
 * /proc/meminfo, capped by RLIMIT_AS), or 0 if unknown. */
uint64_t util_mem_available(void);
/* Peak resident set size of this process in bytes (for benchmarks). */
uint64_t util_peak_rss(void);
/* Wall-clock seconds from a monotonic clock. */
double util_now(void);
/* Median of v[0..n), n >= 1: sorts v in place (ascending, so v[0] and v[n-1]
 * are then the extremes) and returns the middle value, or the mean of the two
 * middle values when n is even. */
double util_median(double *v, size_t n);

/* Shortest decimal spelling of x that reads back to the same double
 * ("%.17g" trimmed), written into buf (at least 32 bytes). */
const char *util_fmt_double(char *buf, double x);

/* Directory part of path (malloc'd; "." if none) and path joined to dir when it
 * is relative (malloc'd). */
char *util_dirname(const char *path);
char *util_path_join(const char *dir, const char *path);

/* A small deterministic PRNG (splitmix64 seeding xoshiro256**): same seed, same
 * numbers on every machine. */
typedef struct util_rng {
  uint64_t s[4];
} util_rng;
void util_rng_seed(util_rng *r, uint64_t seed);
uint64_t util_rng_next(util_rng *r);
double util_rng_uniform(util_rng *r); /* [0, 1) */

#endif
