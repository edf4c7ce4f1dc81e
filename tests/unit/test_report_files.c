/* test_report_files.c — test driver, not a unit test: read a JSON report
 * (test data) and write every output of the report module beside each other,
 * so the checks in tests/ref/report_*.py and the golden test can look at real
 * files made by the real writers.
 *
 *   test_report_files IN.json OUTDIR NAME
 *
 * writes OUTDIR/NAME.txt (terminal report), NAME-points.txt (one block per
 * point), NAME.json, NAME.csv and NAME.svg (the scan figure, or the
 * convergence figure of a single run), all without timings so the bytes
 * are the same on every run.  Exit 0, or 1 with a message. */
#include "config.h"

#include "cairn/report.h"
#include "cairn/util.h"

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int text_file(const rep_run *r, const char *path, unsigned flags) {
  util_afile *a = util_afile_open(path);
  if (!a) return -1;
  rep_text(util_afile_stream(a), r, flags);
  return util_afile_commit(a);
}

int main(int argc, char **argv) {
  if (argc != 4) {
    fprintf(stderr, "usage: test_report_files IN.json OUTDIR NAME\n");
    return 2;
  }
  size_t len;
  char *text = util_read_file(argv[1], &len);
  if (!text) {
    fprintf(stderr, "%s: %s\n", argv[1], strerror(errno));
    return 1;
  }
  cJSON *j = cJSON_Parse(text);
  free(text);
  if (!j) {
    fprintf(stderr, "%s: not valid JSON\n", argv[1]);
    return 1;
  }
  rep_run r;
  char err[256];
  int rc = rep_read_json(j, &r, err, sizeof err);
  cJSON_Delete(j);
  if (rc != 0) {
    fprintf(stderr, "%s: %s\n", argv[1], err);
    return 1;
  }
  const char *dir = argv[2], *name = argv[3];
  char *p[5] = {xasprintf("%s/%s.txt", dir, name), xasprintf("%s/%s-points.txt", dir, name),
                xasprintf("%s/%s.json", dir, name), xasprintf("%s/%s.csv", dir, name),
                xasprintf("%s/%s.svg", dir, name)};
  int bad = 0;
  bad |= text_file(&r, p[0], REP_NO_TIME) != 0;
  bad |= text_file(&r, p[1], REP_NO_TIME | REP_TEXT_POINTS) != 0;
  bad |= rep_write_json(&r, p[2], REP_NO_TIME) != 0;
  bad |= rep_write_csv(&r, p[3], REP_NO_TIME) != 0;
  if (rep_is_scan(&r)) bad |= rep_write_scan_svg(&r, p[4]) != 0;
  else bad |= rep_write_convergence_svg(&r, 0, p[4]) != 0;
  if (bad) fprintf(stderr, "test_report_files: writing into %s failed: %s\n", dir, strerror(errno));
  for (int i = 0; i < 5; i++) free(p[i]);
  rep_run_free(&r);
  return bad;
}
