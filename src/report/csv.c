/* csv.c — a run as a CSV table (report.h): fixed columns, one row per point,
 * absent values as empty fields, numbers in their shortest exact spelling. */
#include "config.h"

#include "cairn/report.h"
#include "cairn/util.h"
#include "report/report_int.h"

#include <errno.h>
#include <math.h>

static void field(util_buf *b, int has, double v) {
  char num[40];
  util_buf_append(b, ",", 1);
  if (has && isfinite(v)) util_buf_printf(b, "%s", rep_fmt_num(num, v));
}

int rep_write_csv(const rep_run *r, const char *path, unsigned flags) {
  util_buf b = {0};
  util_buf_printf(&b, "%s\n", REP_CSV_HEADER);
  for (int i = 0; i < r->npoints; i++) {
    const rep_point *p = &r->points[i];
    char num[40];
    double v;
    if (p->has_param && isfinite(p->param)) util_buf_printf(&b, "%s", rep_fmt_num(num, p->param));
    field(&b, p->e.has_nuclear, p->e.nuclear);
    for (rep_series s = REP_S_HF; s <= REP_S_ANSATZ; s++) {
      int has = rep_point_energy(p, s, &v);
      field(&b, has, v);
    }
    int has = rep_point_error(p, REP_S_ANSATZ, &v);
    field(&b, has, v * 1e3);
    field(&b, p->sym.has, p->sym.particles);
    field(&b, p->sym.has, p->sym.spin_z);
    field(&b, p->sym.has, p->sym.spin_squared);
    if (p->has_gates) util_buf_printf(&b, ",%ld", p->cnot);
    else util_buf_append(&b, ",", 1);
    field(&b, !(flags & REP_NO_TIME), p->seconds);
    util_buf_append(&b, "\n", 1);
  }
  int rc = util_write_atomic(path, b.s, b.len);
  int e = errno;
  util_buf_free(&b);
  errno = e;
  return rc;
}
