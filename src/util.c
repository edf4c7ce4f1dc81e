/* util.c — allocation, buffers, atomic output, machine facts. */
#include "config.h"

#include "cairn/util.h"

#include <errno.h>
#include <fcntl.h>
#include <math.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

static void oom(size_t n) {
  fprintf(stderr, "cairn: out of memory (asked for %zu bytes)\n", n);
  exit(2);
}

void *xmalloc(size_t n) {
  void *p = malloc(n ? n : 1);
  if (!p) oom(n);
  return p;
}

void *xcalloc(size_t count, size_t size) {
  void *p = calloc(count ? count : 1, size ? size : 1);
  if (!p) oom(count * size);
  return p;
}

void *xrealloc(void *p, size_t n) {
  void *q = realloc(p, n ? n : 1);
  if (!q) oom(n);
  return q;
}

char *xstrdup(const char *s) { return xstrndup(s, strlen(s)); }

char *xstrndup(const char *s, size_t n) {
  char *p = xmalloc(n + 1);
  memcpy(p, s, n);
  p[n] = 0;
  return p;
}

char *xasprintf(const char *fmt, ...) {
  va_list ap;
  va_start(ap, fmt);
  int n = vsnprintf(NULL, 0, fmt, ap);
  va_end(ap);
  char *p = xmalloc((size_t)n + 1);
  va_start(ap, fmt);
  vsnprintf(p, (size_t)n + 1, fmt, ap);
  va_end(ap);
  return p;
}

void util_grow(void **p, size_t *cap, size_t need, size_t size) {
  if (need <= *cap) return;
  size_t c = *cap ? *cap : 8;
  while (c < need) c *= 2;
  *p = xrealloc(*p, c * size);
  *cap = c;
}

void util_buf_append(util_buf *b, const char *s, size_t n) {
  util_grow((void **)&b->s, &b->cap, b->len + n + 1, 1);
  memcpy(b->s + b->len, s, n);
  b->len += n;
  b->s[b->len] = 0;
}

void util_buf_printf(util_buf *b, const char *fmt, ...) {
  va_list ap;
  va_start(ap, fmt);
  int n = vsnprintf(NULL, 0, fmt, ap);
  va_end(ap);
  util_grow((void **)&b->s, &b->cap, b->len + (size_t)n + 1, 1);
  va_start(ap, fmt);
  vsnprintf(b->s + b->len, (size_t)n + 1, fmt, ap);
  va_end(ap);
  b->len += (size_t)n;
}

void util_buf_free(util_buf *b) {
  free(b->s);
  b->s = NULL;
  b->len = b->cap = 0;
}

char *util_read_file(const char *path, size_t *len) {
  FILE *f = fopen(path, "rb");
  if (!f) return NULL;
  util_buf b = {0};
  char chunk[65536];
  size_t n;
  while ((n = fread(chunk, 1, sizeof chunk, f)) > 0) util_buf_append(&b, chunk, n);
  int err = ferror(f);
  fclose(f);
  if (err) {
    util_buf_free(&b);
    errno = EIO;
    return NULL;
  }
  if (!b.s) b.s = xcalloc(1, 1);
  if (len) *len = b.len;
  return b.s;
}

struct util_afile {
  char *path, *tmp;
  FILE *f;
};

util_afile *util_afile_open(const char *path) {
  util_afile *a = xcalloc(1, sizeof *a);
  a->path = xstrdup(path);
  a->tmp = xasprintf("%s.tmp.XXXXXX", path);
  int fd = mkstemp(a->tmp);
  if (fd < 0) goto fail;
  /* mkstemp makes 0600; outputs are ordinary files. */
  mode_t um = umask(0);
  umask(um);
  fchmod(fd, 0666 & ~um);
  a->f = fdopen(fd, "wb");
  if (!a->f) {
    int e = errno;
    close(fd);
    unlink(a->tmp);
    errno = e;
    goto fail;
  }
  return a;
fail:;
  int e = errno;
  free(a->path);
  free(a->tmp);
  free(a);
  errno = e;
  return NULL;
}

FILE *util_afile_stream(util_afile *a) { return a->f; }

static void afile_free(util_afile *a) {
  free(a->path);
  free(a->tmp);
  free(a);
}

int util_afile_commit(util_afile *a) {
  int bad = ferror(a->f);
  if (fflush(a->f) != 0) bad = 1;
  if (fsync(fileno(a->f)) != 0 && errno != EINVAL) bad = 1;
  if (fclose(a->f) != 0) bad = 1;
  int e = bad ? (errno ? errno : EIO) : 0;
  if (!bad && rename(a->tmp, a->path) != 0) {
    bad = 1;
    e = errno;
  }
  if (bad) unlink(a->tmp);
  afile_free(a);
  if (bad) {
    errno = e;
    return -1;
  }
  return 0;
}

void util_afile_abort(util_afile *a) {
  fclose(a->f);
  unlink(a->tmp);
  afile_free(a);
}

int util_write_atomic(const char *path, const void *data, size_t len) {
  util_afile *a = util_afile_open(path);
  if (!a) return -1;
  if (len && fwrite(data, 1, len, a->f) != len) {
    int e = errno;
    util_afile_abort(a);
    errno = e ? e : EIO;
    return -1;
  }
  return util_afile_commit(a);
}

uint64_t util_mem_available(void) {
  uint64_t avail = 0;
  FILE *f = fopen("/proc/meminfo", "r");
  if (f) {
    char line[256];
    while (fgets(line, sizeof line, f)) {
      unsigned long long kb;
      if (sscanf(line, "MemAvailable: %llu kB", &kb) == 1) {
        avail = (uint64_t)kb * 1024u;
        break;
      }
    }
    fclose(f);
  }
  struct rlimit rl;
  if (getrlimit(RLIMIT_AS, &rl) == 0 && rl.rlim_cur != RLIM_INFINITY) {
    if (avail == 0 || (uint64_t)rl.rlim_cur < avail) avail = (uint64_t)rl.rlim_cur;
  }
  return avail;
}

uint64_t util_peak_rss(void) {
  struct rusage ru;
  if (getrusage(RUSAGE_SELF, &ru) != 0) return 0;
  return (uint64_t)ru.ru_maxrss * 1024u;
}

double util_now(void) {
  struct timespec ts;
  clock_gettime(CLOCK_MONOTONIC, &ts);
  return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

static int cmp_double(const void *a, const void *b) {
  double x = *(const double *)a, y = *(const double *)b;
  return x < y ? -1 : x > y;
}

double util_median(double *v, size_t n) {
  qsort(v, n, sizeof *v, cmp_double);
  return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

const char *util_fmt_double(char *buf, double x) {
  if (x == 0) {
    strcpy(buf, signbit(x) ? "-0" : "0");
    return buf;
  }
  for (int prec = 1; prec <= 17; prec++) {
    snprintf(buf, 32, "%.*g", prec, x);
    if (strtod(buf, NULL) == x) break;
  }
  /* Normalize exponents: 1e-06 -> 1e-6, 1e+20 -> 1e20. */
  char *e = strchr(buf, 'e');
  if (e) {
    char *p = e + 1, *q = e + 1;
    if (*p == '+') p++;
    else if (*p == '-') *q++ = *p++;
    while (*p == '0' && p[1]) p++;
    memmove(q, p, strlen(p) + 1);
  }
  return buf;
}

char *util_dirname(const char *path) {
  const char *slash = strrchr(path, '/');
  if (!slash) return xstrdup(".");
  if (slash == path) return xstrdup("/");
  return xstrndup(path, (size_t)(slash - path));
}

char *util_path_join(const char *dir, const char *path) {
  if (path[0] == '/' || !dir || !*dir || strcmp(dir, ".") == 0) return xstrdup(path);
  return xasprintf("%s/%s", dir, path);
}

static uint64_t splitmix64(uint64_t *x) {
  uint64_t z = (*x += 0x9e3779b97f4a7c15ULL);
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
  return z ^ (z >> 31);
}

void util_rng_seed(util_rng *r, uint64_t seed) {
  for (int i = 0; i < 4; i++) r->s[i] = splitmix64(&seed);
}

static uint64_t rotl(uint64_t x, int k) { return (x << k) | (x >> (64 - k)); }

uint64_t util_rng_next(util_rng *r) {
  uint64_t *s = r->s;
  uint64_t result = rotl(s[1] * 5, 7) * 9;
  uint64_t t = s[1] << 17;
  s[2] ^= s[0];
  s[3] ^= s[1];
  s[1] ^= s[2];
  s[0] ^= s[3];
  s[2] ^= t;
  s[3] = rotl(s[3], 45);
  return result;
}

double util_rng_uniform(util_rng *r) { return (double)(util_rng_next(r) >> 11) * 0x1.0p-53; }
