/* text.c — the terminal report of a run (report.h).
 *
 * One block per point for a single run (or a scan with REP_TEXT_POINTS); a
 * scan otherwise prints two compact tables, energies and then state and
 * cost, each under 80 columns, followed by the points that need a word
 * (failures, failed checks, CCSD that did not converge). */
#include "config.h"

#include "cairn/report.h"
#include "cairn/util.h"
#include "report/report_int.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define ACC_MEH (REP_CHEMICAL_ACCURACY * 1e3)

/* An error in mEh, readable at any size: 4 decimals, or 3 digits and an
 * exponent below 0.001 mEh. */
static const char *mEh(char *buf, double eh) {
  double m = eh * 1e3;
  if (m != 0 && fabs(m) < 1e-3) snprintf(buf, 32, "%.2e", m);
  else snprintf(buf, 32, "%.4f", m);
  return buf;
}

/* The fewest decimals (at most 6) that show every scanned value exactly
 * enough to tell them apart as written: 0.8, 1.0, 1.2 rather than 1. */
static int param_decimals(const rep_run *r) {
  int d = 0;
  for (int i = 0; i < r->npoints; i++) {
    const rep_point *p = &r->points[i];
    if (!p->has_param || !isfinite(p->param)) continue;
    while (d < 6) {
      char b[64];
      snprintf(b, sizeof b, "%.*f", d, p->param);
      if (fabs(strtod(b, NULL) - p->param) <= 1e-9 * fmax(1, fabs(p->param))) break;
      d++;
    }
  }
  return d;
}

static const char *unit_sp(const rep_run *r) { return r->param_unit && *r->param_unit ? " " : ""; }
static const char *unit(const rep_run *r) { return r->param_unit ? r->param_unit : ""; }

static void header(FILE *f, const rep_run *r) {
  fprintf(f, "cairn run: %s (%s)", r->recipe ? r->recipe : "recipe", r->file ? r->file : "");
  if (r->basis) fprintf(f, ", basis %s", r->basis);
  if (rep_is_scan(r)) fprintf(f, ", %d points along %s", r->npoints, r->param_name);
  fprintf(f, "\n");
  fprintf(f, "Noise-free statevector simulation: energies are exact only within the %s%s and the active "
             "space.\n",
          r->basis ? r->basis : "given integrals", r->basis ? " basis set" : "");
}

static const char *series_label(rep_series s) {
  static const char *const names[] = {"HF", "MP2", "CCSD", "exact (full CI)", "ansatz (VQE)"};
  return names[s];
}

/* The energies of one point, each with its distance from the exact energy. */
static void block_energies(FILE *f, const rep_point *p) {
  char b[32];
  fprintf(f, "  %-19s %15s   %13s\n", "energies", "/ hartree", "- exact / mEh");
  if (p->e.has_nuclear && isfinite(p->e.nuclear)) fprintf(f, "    %-17s %15.8f\n", "nuclear repulsion", p->e.nuclear);
  for (rep_series s = REP_S_HF; s <= REP_S_ANSATZ; s++) {
    double e, d;
    if (s == REP_S_CCSD && p->e.has_ccsd && !p->e.ccsd_converged) {
      fprintf(f, "    %-17s %15.8f   (did not converge; not used in tables and figures)\n", "CCSD", p->e.ccsd);
      continue;
    }
    if (!rep_point_energy(p, s, &e)) continue;
    fprintf(f, "    %-17s %15.8f", series_label(s), e);
    if (rep_point_error(p, s, &d)) fprintf(f, "   %13s", mEh(b, d));
    fprintf(f, "\n");
  }
}

static void block_error(FILE *f, const rep_point *p) {
  char b[32];
  double d;
  if (!rep_point_error(p, REP_S_ANSATZ, &d)) return;
  int ok = fabs(d) * 1e3 <= ACC_MEH;
  fprintf(f, "  error: ansatz - exact = %s mEh, %s chemical accuracy (%.1f mEh, about 1 kcal/mol)\n", mEh(b, d),
          ok ? "within" : "NOT within", ACC_MEH);
}

static void block_symmetry(FILE *f, const rep_point *p) {
  if (!p->sym.has && !p->e.has_exact) return;
  fprintf(f, "  symmetry:");
  if (p->sym.has)
    fprintf(f, " <N> = %.6f  <Sz> = %.6f  <S^2> = %.6f", p->sym.particles, p->sym.spin_z, p->sym.spin_squared);
  if (p->e.has_exact) fprintf(f, "%s<S^2> of the exact state = %.6f", p->sym.has ? ";  " : " ", p->exact_s2);
  fprintf(f, "\n");
}

static void block_optimizer(FILE *f, const rep_point *p) {
  if (!p->has_optimizer) return;
  fprintf(f, "  optimizer: %s, %d evaluations, %s", p->method ? p->method : "?", p->iterations,
          p->converged ? "converged" : "NOT converged");
  if (p->nstarts > 1 && p->start_energies) {
    double lo = p->start_energies[0], hi = lo;
    for (int k = 1; k < p->nstarts; k++) {
      lo = fmin(lo, p->start_energies[k]);
      hi = fmax(hi, p->start_energies[k]);
    }
    int best = p->best_start >= 0 && p->best_start < p->nstarts ? p->best_start : 0;
    fprintf(f, "; %d starts, best #%d (%.8f Eh), spread of final energies %.2e Eh", p->nstarts, best + 1,
            p->start_energies[best], hi - lo);
  } else if (p->nstarts == 1) {
    fprintf(f, "; 1 start");
  }
  fprintf(f, "\n");
}

static void block_generators(FILE *f, const rep_point *p) {
  if (p->ngens == 0) {
    if (!p->failure) fprintf(f, "  generators: none (the reference state alone)\n");
    return;
  }
  int wk = 4, wt = 9;
  for (int g = 0; g < p->ngens; g++) {
    int k = p->gens[g].kind ? (int)strlen(p->gens[g].kind) : 0;
    int t = p->gens[g].text ? (int)strlen(p->gens[g].text) : 0;
    if (k > wk) wk = k;
    if (t > wt) wt = t;
  }
  int grown = 0; /* `grow` runs: the gradient each generator was chosen at, beside the reference's */
  for (int g = 0; g < p->ngens; g++) grown |= p->gens[g].has_chosen;
  fprintf(f, "  generators (%d, in the order they act)\n", p->ngens);
  fprintf(f, "    %3s  %-*s  %-*s  %11s", "#", wk, "kind", wt, "generator", "gradient");
  if (grown) fprintf(f, "  %11s", "chosen at");
  fprintf(f, "  %14s  %5s\n", "theta", "CNOT");
  for (int g = 0; g < p->ngens; g++) {
    const rep_generator *x = &p->gens[g];
    fprintf(f, "    %3d  %-*s  %-*s  %11.3e", g + 1, wk, x->kind ? x->kind : "", wt, x->text ? x->text : "",
            x->gradient);
    if (grown && x->has_chosen) fprintf(f, "  %11.3e", x->chosen);
    else if (grown) fprintf(f, "  %11s", "");
    fprintf(f, "  %14.8f  %5d\n", x->theta, x->cnot);
  }
  if (grown)
    fprintf(f, "    (gradient: at the reference; chosen at: at the state where `grow` added the generator)\n");
}

static void block_checks(FILE *f, const rep_point *p) {
  int passed = 0;
  for (int c = 0; c < p->nchecks; c++) {
    const rep_check *k = &p->checks[c];
    if (k->passed) {
      passed++;
      continue;
    }
    fprintf(f, "  check FAILED: %s = %.8g, target %g within %g (off by %.3g)\n", k->symmetry ? k->symmetry : "?",
            k->value, k->target, k->tolerance, fabs(k->value - k->target));
  }
  if (passed) {
    fprintf(f, "  checks passed:");
    for (int c = 0; c < p->nchecks; c++)
      if (p->checks[c].passed) fprintf(f, " %s", p->checks[c].symmetry ? p->checks[c].symmetry : "?");
    fprintf(f, "\n");
  }
}

/* One point as a block of lines. */
static void block(FILE *f, const rep_run *r, int i, unsigned flags) {
  const rep_point *p = &r->points[i];
  if (rep_is_scan(r)) {
    fprintf(f, "\npoint %d of %d: %s = ", i + 1, r->npoints, r->param_name);
    if (p->has_param) fprintf(f, "%.*f%s%s\n", param_decimals(r), p->param, unit_sp(r), unit(r));
    else fprintf(f, "?\n");
  } else {
    fprintf(f, "\n");
  }
  fprintf(f, "  %d qubits, %d electrons in %d orbitals\n", p->qubits, p->electrons, p->orbitals);
  if (p->failure) fprintf(f, "  FAILED: %s\n", p->failure);
  block_energies(f, p);
  block_error(f, p);
  block_symmetry(f, p);
  block_optimizer(f, p);
  if (p->has_gates) fprintf(f, "  gates: %ld CNOT, %ld single-qubit, depth %ld\n", p->cnot, p->single, p->depth);
  block_generators(f, p);
  block_checks(f, p);
  if (!(flags & REP_NO_TIME)) fprintf(f, "  time: %.2f s\n", p->seconds);
}

static void cell_mEh(FILE *f, int has, double eh) {
  if (has) fprintf(f, " %9.4f", eh * 1e3);
  else fprintf(f, " %9s", "-");
}

static void cell(FILE *f, int width, int has, const char *fmt, double v) {
  if (has && isfinite(v)) {
    char b[48];
    snprintf(b, sizeof b, fmt, v);
    fprintf(f, " %*s", width, b);
  } else {
    fprintf(f, " %*s", width, "-");
  }
}

/* A scan as two tables and the notes about particular points. */
static void scan_tables(FILE *f, const rep_run *r, unsigned flags) {
  char pname[64];
  snprintf(pname, sizeof pname, "%s%s%s", r->param_name, r->param_unit && *r->param_unit ? "/" : "", unit(r));
  int wp = (int)strlen(pname) > 10 ? (int)strlen(pname) : 10;
  int any_exact = 0;
  for (int i = 0; i < r->npoints; i++) any_exact |= r->points[i].e.has_exact;
  char pfmt[16];
  snprintf(pfmt, sizeof pfmt, "%%.%df", param_decimals(r));

  if (any_exact) {
    fprintf(f, "\nenergies: the exact energy in hartree, the others in mEh above it\n");
    fprintf(f, "%*s %14s %9s %9s %9s %9s  %s\n", wp, pname, "exact/Eh", "HF", "MP2", "CCSD", "ansatz",
            "chem.acc.");
  } else {
    fprintf(f, "\nenergies / hartree (no exact energies: errors not known)\n");
    fprintf(f, "%*s %14s %14s %14s %14s\n", wp, pname, "HF", "MP2", "CCSD", "ansatz");
  }
  for (int i = 0; i < r->npoints; i++) {
    const rep_point *p = &r->points[i];
    double v;
    cell(f, wp - 1, p->has_param, pfmt, p->param);
    if (any_exact) {
      int hx = rep_point_energy(p, REP_S_EXACT, &v);
      cell(f, 14, hx, "%.8f", v);
      for (rep_series s = REP_S_HF; s <= REP_S_CCSD; s++) {
        int has = rep_point_error(p, s, &v);
        cell_mEh(f, has, v);
      }
      int has = rep_point_error(p, REP_S_ANSATZ, &v);
      cell_mEh(f, has, v);
      fprintf(f, "  %s\n", !has ? "-" : fabs(v) * 1e3 <= ACC_MEH ? "yes" : "NO");
    } else {
      for (rep_series s = REP_S_HF; s <= REP_S_ANSATZ; s++) {
        if (s == REP_S_EXACT) continue;
        int has = rep_point_energy(p, s, &v);
        cell(f, 14, has, "%.8f", v);
      }
      fprintf(f, "\n");
    }
  }
  if (any_exact) fprintf(f, "chem.acc.: |ansatz - exact| <= %.1f mEh (about 1 kcal/mol)\n", ACC_MEH);

  fprintf(f, "\nstate and cost\n");
  fprintf(f, "%*s %8s %8s %8s %11s %5s %6s %6s %6s", wp, pname, "<N>", "<Sz>", "<S^2>", "exact <S^2>", "gens",
          "CNOT", "evals", "starts");
  if (!(flags & REP_NO_TIME)) fprintf(f, " %7s", "time/s");
  fprintf(f, "\n");
  double total = 0;
  for (int i = 0; i < r->npoints; i++) {
    const rep_point *p = &r->points[i];
    cell(f, wp - 1, p->has_param, pfmt, p->param);
    cell(f, 8, p->sym.has, "%.4f", p->sym.particles);
    cell(f, 8, p->sym.has, "%.4f", p->sym.spin_z);
    cell(f, 8, p->sym.has, "%.4f", p->sym.spin_squared);
    cell(f, 11, p->e.has_exact, "%.4f", p->exact_s2);
    cell(f, 5, !p->failure || p->ngens > 0, "%.0f", p->ngens);
    cell(f, 6, p->has_gates, "%.0f", (double)p->cnot);
    cell(f, 6, p->has_optimizer, "%.0f", p->iterations);
    cell(f, 6, p->has_optimizer && p->nstarts > 0, "%.0f", p->nstarts);
    if (!(flags & REP_NO_TIME)) fprintf(f, " %7.2f", p->seconds);
    fprintf(f, "\n");
    total += p->seconds;
  }

  /* the points that need a word, after a blank line */
  int notes = 0;
  for (int i = 0; i < r->npoints; i++) {
    const rep_point *p = &r->points[i];
    notes |= p->failure || (p->e.has_ccsd && !p->e.ccsd_converged) || (p->has_optimizer && !p->converged);
    for (int c = 0; c < p->nchecks; c++) notes |= !p->checks[c].passed;
  }
  if (notes) fprintf(f, "\n");
  int outside = 0, known = 0;
  for (int i = 0; i < r->npoints; i++) {
    const rep_point *p = &r->points[i];
    double v;
    if (rep_point_error(p, REP_S_ANSATZ, &v)) {
      known++;
      outside += fabs(v) * 1e3 > ACC_MEH;
    }
    char where[96];
    if (p->has_param)
      snprintf(where, sizeof where, "point %d (%s = %.*f)", i + 1, r->param_name, param_decimals(r), p->param);
    else snprintf(where, sizeof where, "point %d", i + 1);
    if (p->failure) fprintf(f, "%s: FAILED: %s\n", where, p->failure);
    if (p->e.has_ccsd && !p->e.ccsd_converged) fprintf(f, "%s: CCSD did not converge (left out)\n", where);
    if (p->has_optimizer && !p->converged) fprintf(f, "%s: the optimizer did not converge\n", where);
    for (int c = 0; c < p->nchecks; c++) {
      const rep_check *k = &p->checks[c];
      if (!k->passed)
        fprintf(f, "%s: check FAILED: %s = %.8g, target %g within %g\n", where, k->symmetry ? k->symmetry : "?",
                k->value, k->target, k->tolerance);
    }
  }
  if (known) {
    if (outside) fprintf(f, "\n%d of %d points NOT within chemical accuracy\n", outside, known);
    else fprintf(f, "\nall %d points within chemical accuracy\n", known);
  }
  if (!(flags & REP_NO_TIME)) fprintf(f, "time: %.2f s in all\n", total);
}

void rep_text(FILE *f, const rep_run *r, unsigned flags) {
  header(f, r);
  if (rep_is_scan(r) && !(flags & REP_TEXT_POINTS)) scan_tables(f, r, flags);
  else
    for (int i = 0; i < r->npoints; i++) block(f, r, i, flags);
}
