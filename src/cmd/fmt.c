/* fmt.c — `cairn fmt [--check] FILE...`: rewrite recipes in canonical layout.
 * `-` reads standard input and writes the result to standard output. */
#include "config.h"

#include "cmd/cmd.h"
#include "cairn/front.h"
#include "cairn/util.h"

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

/* Replace `path` with `text` atomically, keeping the file's permissions. */
static int rewrite(const char *path, const char *text, size_t len) {
  struct stat st;
  int have_mode = stat(path, &st) == 0;
  util_afile *a = util_afile_open(path);
  if (!a) return -1;
  FILE *f = util_afile_stream(a);
  if (have_mode) fchmod(fileno(f), st.st_mode & 07777);
  if (len && fwrite(text, 1, len, f) != len) {
    int e = errno;
    util_afile_abort(a);
    errno = e ? e : EIO;
    return -1;
  }
  return util_afile_commit(a);
}

/* Read all of standard input (caller frees). */
static char *read_stdin(size_t *len) {
  util_buf b = {0};
  util_buf_append(&b, "", 0);
  char chunk[4096];
  size_t n;
  while ((n = fread(chunk, 1, sizeof chunk, stdin)) > 0) util_buf_append(&b, chunk, n);
  if (ferror(stdin)) {
    util_buf_free(&b);
    return NULL;
  }
  *len = b.len;
  return b.s;
}

int cmd_fmt(const cmd_env *env, int argc, char **argv) {
  int check = 0, nfiles = 0;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--check") == 0) check = 1;
    else if (argv[i][0] == '-' && argv[i][1]) return cmd_usage_error("fmt", "unknown option `%s`", argv[i]);
    else nfiles++;
  }
  if (nfiles == 0) return cmd_usage_error("fmt", "no recipe given");
  diag_ctx *d = diag_new(stderr, env->color);
  diag_set_werror(d, env->werror);
  int status = 0;
  for (int i = 1; i < argc; i++) {
    const char *path = argv[i];
    if (strcmp(path, "--check") == 0) continue;
    int is_stdin = strcmp(path, "-") == 0;
    int32_t f;
    if (is_stdin) {
      size_t len;
      char *text = read_stdin(&len);
      if (!text) {
        fprintf(stderr, "cairn fmt: cannot read standard input: %s\n", strerror(errno));
        status = 2;
        continue;
      }
      f = diag_add_file(d, "<stdin>", text, len);
    } else {
      f = diag_load_file(d, path, DIAG_NOWHERE);
    }
    if (f < 0) {
      status = 2;
      continue;
    }
    util_buf out = {0};
    util_buf_append(&out, "", 0);
    if (front_fmt(d, f, &out) != 0) {
      if (status == 0) status = 1;
      util_buf_free(&out);
      continue;
    }
    size_t len;
    const char *text = diag_file_text(d, f, &len);
    int same = len == out.len && memcmp(text, out.s, len) == 0;
    if (check) {
      if (!same) {
        printf("%s\n", path);
        if (status == 0) status = 1;
      }
    } else if (is_stdin) {
      fwrite(out.s, 1, out.len, stdout);
    } else if (!same && rewrite(path, out.s, out.len) != 0) {
      fprintf(stderr, "cairn fmt: cannot write `%s`: %s\n", path, strerror(errno));
      status = 2;
    }
    util_buf_free(&out);
  }
  diag_free(d);
  return status;
}
