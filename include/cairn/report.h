/* report.h — what a `cairn run` found, and its text, JSON, CSV and SVG forms.
 *
 * The run command fills a rep_run; the writers only read it.  A value that was
 * not computed has its has_* flag clear and is left out of every output (never
 * a placeholder).  Energies in hartree; the scanned parameter in the recipe's
 * unit (rep_run.param_unit).
 *
 * Ownership: a rep_run owns every string and array in it; rep_run_free.
 */
#ifndef CAIRN_REPORT_H
#define CAIRN_REPORT_H

#include <cjson/cJSON.h>
#include <stdio.h>

typedef struct rep_generator {
  char *kind;         /* "double", "entangler", ... (ans_kind_name) */
  char *text;         /* "X0 Y1 X4 X5", "0 1 -> 4 5" */
  double gradient;    /* at the reference, before optimization */
  double theta;       /* optimized amplitude */
  int cnot;           /* CNOTs of its plain circuit */
  int line;           /* recipe line of its pool rule */
} rep_generator;

typedef struct rep_energies {
  int has_nuclear, has_hf, has_mp2, has_ccsd, has_exact, has_ansatz;
  double nuclear, hf, mp2, ccsd, exact, ansatz;
  int ccsd_converged;
} rep_energies;

typedef struct rep_symmetry {
  int has;                     /* 0: not measured */
  double particles, spin_z, spin_squared;
} rep_symmetry;

/* One `keep ... checked TOL` verification of the final state. */
typedef struct rep_check {
  char *symmetry;     /* "particles", "spin-z", "spin-squared" */
  double value, target, tolerance;
  int passed;
} rep_check;

typedef struct rep_point {
  int has_param;
  double param;
  int qubits, electrons, orbitals;
  rep_energies e;
  int has_error;
  double error;                /* ansatz - exact */
  double exact_s2;             /* <S^2> of the exact state */
  rep_generator *gens;
  int ngens;
  rep_symmetry sym;            /* of the ansatz state */
  rep_check *checks;
  int nchecks;
  int has_gates;
  long cnot, single, depth;
  /* optimizer */
  int has_optimizer;
  char *method;                /* "lbfgs", ... */
  int iterations;              /* evaluations of the best start */
  int converged;
  int nstarts;
  double *start_energies;      /* final energy of each start */
  int best_start;
  double *trace;               /* energy after each iteration of the best start */
  int ntrace;
  double seconds;
  char *failure;               /* non-NULL: the point failed; the message */
} rep_point;

typedef struct rep_run {
  char *recipe;                /* recipe name (file name without directory and .cairn) */
  char *file;                  /* recipe path as given */
  char *param_name;            /* scanned variable, or NULL */
  char *param_unit;            /* "angstrom", "bohr", "deg", "" */
  char *basis;                 /* basis name, or NULL for FCIDUMP input */
  rep_point *points;
  int npoints;
} rep_run;

void rep_run_free(rep_run *r);

/* The terminal report (energies, error in mEh against chemical accuracy,
 * symmetry values, generator table with theta, optimizer, time). */
void rep_text(FILE *f, const rep_run *r);
/* The JSON report, schema v1 (DESIGN.md). Caller owns the tree. */
cJSON *rep_json(const rep_run *r);
/* A scan as CSV (one row per point) and as an SVG figure (energies and
 * |error| on a log scale with the chemical-accuracy line); the convergence
 * figure of a single point (error vs iteration).  Each returns 0 or -1 with
 * errno; written atomically. */
int rep_write_csv(const rep_run *r, const char *path);
int rep_write_scan_svg(const rep_run *r, const char *path);
int rep_write_convergence_svg(const rep_run *r, int point, const char *path);

#endif
