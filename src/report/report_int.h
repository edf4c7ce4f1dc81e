/* report_int.h — private to src/report: what the writers share about a
 * point's values.  No allocation. */
#ifndef CAIRN_REPORT_INT_H
#define CAIRN_REPORT_INT_H

#include "cairn/report.h"

typedef enum rep_series { REP_S_HF, REP_S_MP2, REP_S_CCSD, REP_S_EXACT, REP_S_ANSATZ } rep_series;

/* The energy of series s at p, if it is there and trustworthy (a CCSD that
 * did not converge and non-finite values count as absent).  1 or 0. */
int rep_point_energy(const rep_point *p, rep_series s, double *e);
/* E(s) - E(exact) at p (the ansatz uses p->error when set).  1 or 0. */
int rep_point_error(const rep_point *p, rep_series s, double *err);

/* x in the fewest significant digits that read back to the same double,
 * in plain decimal notation between 1e-5 and 1e15 (10, not 1e1) and with
 * an exponent outside (buf >= 40 bytes). */
const char *rep_fmt_num(char *buf, double x);

#endif
