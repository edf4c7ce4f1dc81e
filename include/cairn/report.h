/* report.h — what a `cairn run` found, and its text, JSON, CSV and SVG forms.
 *
 * The run command fills a rep_run; the writers only read it.  A value that was
 * not computed has its has_* flag clear and is left out of every output (never
 * a placeholder).  Energies in hartree; the scanned parameter in the recipe's
 * unit (rep_run.param_unit).  A zero-initialized rep_run is an empty run.
 *
 * A CCSD energy that did not converge (has_ccsd set, ccsd_converged clear) is
 * shown in the text report with a warning and kept in the JSON with
 * "ccsd_converged": false, but left out of the CSV table and the figures, so
 * no plotted number is silently wrong.
 *
 * Ownership: a rep_run owns every string and array in it; rep_run_free frees
 * them (and leaves *r empty).  The writers borrow r.  Strings returned by
 * rep_paths_derive belong to the rep_paths; rep_paths_free.
 */
#ifndef CAIRN_REPORT_H
#define CAIRN_REPORT_H

#include <cjson/cJSON.h>
#include <stdio.h>

typedef struct rep_generator {
  char *kind;         /* "double", "entangler", ... (ans_kind_name) */
  char *text;         /* "X0 Y1 X4 X5", "0 1 -> 4 5" */
  double gradient;    /* at the reference, before optimization */
  int has_chosen;     /* grown by `grow` (ADAPT-style): */
  double chosen;      /* its gradient at the state where growth chose it */
  double theta;       /* optimized amplitude */
  int cnot;           /* CNOTs of its plain circuit */
  int line;           /* recipe line of its pool rule (0: none) */
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
  double exact_s2;             /* <S^2> of the exact state (valid when e.has_exact) */
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
  double *start_energies;      /* final energy of each start (nstarts entries) */
  int best_start;              /* 0-based index into start_energies */
  double *trace;               /* energy after each iteration of the best start */
  int ntrace;
  double *params;              /* every parameter of the rotation program, optimized, in program
                                * order (reference angles first): what `cairn build --bind` reads */
  int nparams;
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

/* Chemical accuracy, 1 kcal/mol = 1.5936 mEh, quoted as 1.6 mEh (common
 * practice); the line drawn in the figures and the mark in the text report. */
#define REP_CHEMICAL_ACCURACY 1.6e-3

/* Output options (bit flags) of the writers below. */
enum {
  REP_NO_TIME = 1 << 0,     /* leave wall-clock times out (golden tests: same bytes every run) */
  REP_TEXT_POINTS = 1 << 1  /* text report of a scan: one full block per point, not a table */
};

/* True when r is a scan (a varied parameter), so the writers make the scan
 * table and figure rather than the single-run ones. */
int rep_is_scan(const rep_run *r);

/* The terminal report: energies, the error in mEh against chemical accuracy,
 * symmetry values, the generator table with theta, optimizer and starts,
 * gate counts, failed checks, time; and the plain statement of what the
 * numbers are (noise-free statevector, exact only within the basis set and
 * active space).  A scan prints a compact table (or blocks with
 * REP_TEXT_POINTS). */
void rep_text(FILE *f, const rep_run *r, unsigned flags);

/* The JSON report, schema v1 (DESIGN.md), plus these additive fields:
 * top level "basis" (when known) and "scan": {"name", "unit"} for a scan;
 * per point "parameters" (rep_point.params, when there are any),
 * "exact_spin_squared" (with the exact energy), "checks"
 * [{symmetry, value, target, tolerance, passed}] when there are any,
 * "energies.ccsd_converged": false when CCSD did not converge,
 * "optimizer": {"starts", "best_start", "start_energies", "trace"} when
 * known, and "failure" for a failed point.  Caller owns the tree. */
cJSON *rep_json(const rep_run *r, unsigned flags);
/* rep_json printed (json_print) and written atomically; 0 or -1 with errno. */
int rep_write_json(const rep_run *r, const char *path, unsigned flags);
/* Read a report as rep_json writes it back into *out (initialized here), so
 * a saved run can be tabulated and plotted again; every field the JSON
 * carries survives the round trip (generator lines do not: the JSON has
 * none).  Returns 0, or -1 with the offending field and what was expected in
 * err; *out is then empty. */
int rep_read_json(const cJSON *j, rep_run *out, char *err, size_t errlen);

/* A scan (or a single run) as CSV: a header row, one row per point, the fixed
 * columns of REP_CSV_HEADER, absent values as empty fields, energies in
 * hartree, the error in mEh.  0 or -1 with errno; written atomically. */
#define REP_CSV_HEADER \
  "param,nuclear,hf,mp2,ccsd,exact,ansatz,error_mEh,particles,spin_z,spin_squared,cnot,seconds"
int rep_write_csv(const rep_run *r, const char *path, unsigned flags);

/* The scan figure (SVG 1.1): top panel energy vs the varied parameter for HF,
 * MP2, CCSD, exact and ansatz; bottom panel |E - E(exact)| in mEh on a log
 * axis with the chemical-accuracy line.  Absent series are left out of the
 * plot and the legend.  0 or -1 with errno; written atomically. */
int rep_write_scan_svg(const rep_run *r, const char *path);
/* The convergence figure of point `point`: |E - E(exact)| in mEh vs
 * iteration of the best start on a log axis (energy on a linear axis when
 * there is no exact energy).  0, or -1 with errno (EINVAL: no such point or
 * no trace); written atomically. */
int rep_write_convergence_svg(const rep_run *r, int point, const char *path);

/* Where the table and the figure go.  With `plot` (--plot FILE): svg = plot,
 * csv = plot with its .svg extension replaced by .csv.  Else beside the JSON
 * (`json`, --json OUT: out.json -> out.csv, out.svg).  Else in the current
 * directory, named after the recipe (dir/water-scan.cairn -> water-scan.csv,
 * water-scan.svg). */
typedef struct rep_paths {
  char *csv, *svg;
} rep_paths;
void rep_paths_derive(const char *recipe, const char *json, const char *plot, rep_paths *out);
void rep_paths_free(rep_paths *p);

/* The table and the figure of a run: CSV plus the scan figure for a scan, or
 * CSV plus the convergence figure of the only point (when it has a trace);
 * flags as for rep_write_csv.
 * Returns 0, or -1 with errno after the first write that failed; *failed (if
 * not NULL) is set to the path that failed (borrowed from p). */
int rep_write_outputs(const rep_run *r, const rep_paths *p, unsigned flags, const char **failed);

#endif
