/* chem_driver.c — a check program for the chemistry module: runs the whole
 * chain (basis, integrals, SCF, active space, MP2, CCSD, exact) on a geometry
 * given on the command line, or from an FCIDUMP file, and prints JSON.  The
 * reference tests (tests/ref/chem_*.py) run it beside psi4.
 *
 *   chem_driver [options]
 *     --atoms "O 0 0 0; H 0 1.43 1.1; H 0 -1.43 1.1"   geometry (bohr unless --angstrom)
 *     --angstrom            coordinates in angstrom (CODATA 2018 bohr)
 *     --charge N --mult M   charge and multiplicity (default 0, 1)
 *     --basis NAME | --basis-file PATH
 *     --fcidump PATH        instead of atoms and basis
 *     --core N              fold the N lowest orbitals into the constant
 *     --frozen-core         --core by element (1s for Li-Ne, 1s2s2p for Na-Ar)
 *     --active N            keep N orbitals after the core (default: all)
 *     --no-mp2 --no-ccsd --no-exact
 *     --exact-mult M        target multiplicity of the exact state (default: lowest of any spin)
 *     --write-fcidump PATH  write the active space
 *     --boys M T            print F_0..F_M(T) and exit
 *     --overlap             also print the largest |S_ii - 1| of the basis
 * Exit status 0, 1 on input errors (messages on stderr), 2 on usage errors.
 */
#include "config.h"

#include "cairn/basis.h"
#include "cairn/chem.h"
#include "cairn/element.h"
#include "cairn/fcidump.h"
#include "cairn/integrals.h"
#include "cairn/json.h"
#include "cairn/util.h"

#include <cblas.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int usage(const char *msg) {
  fprintf(stderr, "chem_driver: %s\n", msg);
  return 2;
}

/* Parse "Sym x y z; Sym x y z; ..." into atoms (bohr). */
static int parse_atoms(const char *txt, int angstrom, ir_atom **out, int *nat) {
  char *copy = xstrdup(txt), *save = NULL;
  int n = 0;
  size_t cap = 0;
  ir_atom *a = NULL;
  for (char *tok = strtok_r(copy, ";\n", &save); tok; tok = strtok_r(NULL, ";\n", &save)) {
    char sym[8];
    double x, y, z;
    if (sscanf(tok, " %7s %lf %lf %lf", sym, &x, &y, &z) != 4) continue;
    UTIL_GROW(a, cap, (size_t)n + 1);
    memset(&a[n], 0, sizeof a[n]);
    a[n].z = element_z(sym, (int)strlen(sym));
    if (a[n].z == 0) {
      fprintf(stderr, "chem_driver: unknown element `%s`\n", sym);
      free(copy);
      free(a);
      return -1;
    }
    snprintf(a[n].symbol, sizeof a[n].symbol, "%s", element_symbol(a[n].z));
    double f = angstrom ? 1.0 / 0.529177210903 : 1.0; /* CODATA 2018 */
    a[n].xyz[0] = x * f;
    a[n].xyz[1] = y * f;
    a[n].xyz[2] = z * f;
    a[n].span = DIAG_NOWHERE;
    n++;
  }
  free(copy);
  *out = a;
  *nat = n;
  return n > 0 ? 0 : -1;
}

int main(int argc, char **argv) {
  const char *atoms = NULL, *basis = NULL, *basis_file = NULL, *fcidump = NULL, *write = NULL;
  int angstrom = 0, charge = 0, mult = 1, core = 0, frozen_core = 0, active = -1, overlap = 0;
  int do_mp2 = 1, do_ccsd = 1, do_exact = 1, exact_mult = 0;
  for (int i = 1; i < argc; i++) {
    const char *a = argv[i];
    const char *v = i + 1 < argc ? argv[i + 1] : NULL;
    if (!v && strncmp(a, "--", 2) == 0 &&
        (!strcmp(a, "--atoms") || !strcmp(a, "--charge") || !strcmp(a, "--mult") || !strcmp(a, "--basis") ||
         !strcmp(a, "--basis-file") || !strcmp(a, "--fcidump") || !strcmp(a, "--core") || !strcmp(a, "--active") ||
         !strcmp(a, "--exact-mult") || !strcmp(a, "--write-fcidump")))
      return usage("missing value");
    if (!strcmp(a, "--atoms")) { atoms = v; i++; }
    else if (!strcmp(a, "--angstrom")) angstrom = 1;
    else if (!strcmp(a, "--charge")) { charge = atoi(v); i++; }
    else if (!strcmp(a, "--mult")) { mult = atoi(v); i++; }
    else if (!strcmp(a, "--basis")) { basis = v; i++; }
    else if (!strcmp(a, "--basis-file")) { basis_file = v; i++; }
    else if (!strcmp(a, "--fcidump")) { fcidump = v; i++; }
    else if (!strcmp(a, "--core")) { core = atoi(v); i++; }
    else if (!strcmp(a, "--frozen-core")) frozen_core = 1;
    else if (!strcmp(a, "--active")) { active = atoi(v); i++; }
    else if (!strcmp(a, "--no-mp2")) do_mp2 = 0;
    else if (!strcmp(a, "--no-ccsd")) do_ccsd = 0;
    else if (!strcmp(a, "--no-exact")) do_exact = 0;
    else if (!strcmp(a, "--exact-mult")) { exact_mult = atoi(v); i++; }
    else if (!strcmp(a, "--write-fcidump")) { write = v; i++; }
    else if (!strcmp(a, "--overlap")) overlap = 1;
    else if (!strcmp(a, "--boys")) {
      if (i + 2 >= argc) return usage("--boys M T");
      int m = atoi(argv[i + 1]);
      double T = strtod(argv[i + 2], NULL);
      if (m < 0 || m > INT_BOYS_MMAX) return usage("--boys: M out of range");
      double f[INT_BOYS_MMAX + 1];
      int_boys *b = int_boys_new();
      int_boys_eval(b, m, T, f);
      int_boys_free(b);
      for (int k = 0; k <= m; k++) printf("%.17g\n", f[k]);
      return 0;
    } else return usage("unknown option");
  }
  /* cairn parallelizes with OpenMP; OpenBLAS's own threads would only compete */
  openblas_set_num_threads(1);
  diag_ctx *d = diag_new(stderr, DIAG_COLOR_NEVER);
  ir_recipe r;
  memset(&r, 0, sizeof r);
  r.path = xstrdup("<chem_driver>");
  r.basis_span = r.integrals_span = DIAG_NOWHERE;
  r.multiplicity = mult;
  r.charge = charge;
  ir_point pt = {0};
  int status = 0;
  int nmo = 0, nalpha_all, nbeta_all;
  double t0 = util_now();
  if (fcidump) {
    r.problem = IR_PROBLEM_INTEGRALS;
    r.integrals_file = xstrdup(fcidump);
    int norb, nelec, ms2;
    if (chem_fcidump_header(fcidump, DIAG_NOWHERE, d, &norb, &nelec, &ms2) != 0) {
      status = 1;
      goto done;
    }
    nmo = norb;
    nalpha_all = (nelec + ms2) / 2;
    nbeta_all = (nelec - ms2) / 2;
    r.nelectrons = nelec;
  } else {
    if (!atoms || (!basis && !basis_file)) {
      status = usage("give --atoms and --basis (or --fcidump)");
      goto done;
    }
    r.problem = IR_PROBLEM_ATOMS;
    if (parse_atoms(atoms, angstrom, &pt.atoms, &r.natoms) != 0) {
      status = usage("bad --atoms");
      goto done;
    }
    r.points = &pt;
    r.npoints = 1;
    if (basis) r.basis_name = xstrdup(basis);
    if (basis_file) r.basis_file = xstrdup(basis_file);
    nmo = chem_count_orbitals(&r, d);
    if (nmo < 0) {
      status = 1;
      goto done;
    }
    int ne = -charge;
    for (int k = 0; k < r.natoms; k++) ne += pt.atoms[k].z;
    r.nelectrons = ne;
    nalpha_all = (ne + mult - 1) / 2;
    nbeta_all = (ne - mult + 1) / 2;
    if (frozen_core)
      for (int k = 0; k < r.natoms; k++) core += element_core_orbitals(pt.atoms[k].z);
  }
  /* the orbital space: core orbitals 0..core-1, then `active` orbitals */
  r.orbitals.norbitals = nmo;
  r.orbitals.ncore = core;
  r.orbitals.core = xmalloc((size_t)(core > 0 ? core : 1) * sizeof(int));
  for (int k = 0; k < core; k++) r.orbitals.core[k] = k;
  int nact = active >= 0 ? active : nmo - core;
  if (core < 0 || nact < 0 || core + nact > nmo || core > nbeta_all) {
    status = usage("bad --core/--active");
    goto done;
  }
  r.orbitals.nactive = nact;
  r.orbitals.active = xmalloc((size_t)(nact > 0 ? nact : 1) * sizeof(int));
  for (int k = 0; k < nact; k++) r.orbitals.active[k] = core + k;
  r.orbitals.nalpha = nalpha_all - core;
  r.orbitals.nbeta = nbeta_all - core;
  r.orbitals.nelec_active = r.orbitals.nalpha + r.orbitals.nbeta;
  if (r.orbitals.nalpha > nact) {
    status = usage("the active space cannot hold the electrons");
    goto done;
  }

  chem_space s;
  chem_refs refs;
  memset(&refs, 0, sizeof refs);
  int rc = chem_build_space(&r, 0, d, &s, &refs);
  double t1 = util_now();
  cJSON *j = cJSON_CreateObject();
  if (rc == 0) {
    cJSON_AddItemToObject(j, "nbf", cJSON_CreateNumber(nmo));
    cJSON_AddItemToObject(j, "norb", cJSON_CreateNumber(s.norb));
    cJSON_AddItemToObject(j, "nalpha", cJSON_CreateNumber(s.nalpha));
    cJSON_AddItemToObject(j, "nbeta", cJSON_CreateNumber(s.nbeta));
    cJSON_AddItemToObject(j, "constant", json_number(s.e_constant));
    if (s.has_nuclear) cJSON_AddItemToObject(j, "nuclear", json_number(s.e_nuclear));
    if (refs.has_hf) cJSON_AddItemToObject(j, "hf", json_number(refs.hf));
    cJSON_AddItemToObject(j, "reference", json_number(chem_reference_energy(&s)));
    cJSON_AddItemToObject(j, "scf_iterations", cJSON_CreateNumber(refs.scf_iterations));
    if (write && chem_fcidump_write(&s, write) != 0) {
      fprintf(stderr, "chem_driver: cannot write %s\n", write);
      rc = -1;
    }
    double t2 = util_now(), t3 = t2, t4 = t2, t5 = t2;
    if (do_mp2 && chem_mp2(&s, d, &refs) == 0 && refs.has_mp2) cJSON_AddItemToObject(j, "mp2", json_number(refs.mp2));
    t3 = util_now();
    if (do_ccsd && chem_ccsd(&s, d, &refs) == 0 && refs.has_ccsd) {
      cJSON_AddItemToObject(j, "ccsd", json_number(refs.ccsd));
      cJSON_AddItemToObject(j, "ccsd_converged", cJSON_CreateBool(refs.ccsd_converged));
    }
    t4 = util_now();
    if (do_exact) {
      chem_target tg = {s.nalpha - s.nbeta, exact_mult};
      if (chem_exact(&s, tg, d, &refs) == 0 && refs.has_exact) {
        cJSON_AddItemToObject(j, "exact", json_number(refs.exact));
        cJSON_AddItemToObject(j, "exact_s2", json_number(refs.exact_s2));
        cJSON_AddItemToObject(j, "exact_sz", json_number(refs.exact_sz));
      } else rc = -1;
    }
    t5 = util_now();
    cJSON *sec = cJSON_CreateObject();
    cJSON_AddItemToObject(sec, "space", json_number(t1 - t0));
    cJSON_AddItemToObject(sec, "mp2", json_number(t3 - t2));
    cJSON_AddItemToObject(sec, "ccsd", json_number(t4 - t3));
    cJSON_AddItemToObject(sec, "exact", json_number(t5 - t4));
    cJSON_AddItemToObject(j, "seconds", sec);
    if (overlap && !fcidump) {
      basis_set bs;
      int_basis ib;
      basis_load(d, r.basis_name, r.basis_file, DIAG_NOWHERE, &bs);
      int_basis_build(&bs, pt.atoms, r.natoms, &ib);
      double *S = xmalloc((size_t)ib.nbf * ib.nbf * sizeof(double));
      int_overlap(&ib, S);
      double dev = 0;
      for (int k = 0; k < ib.nbf; k++) dev = fmax(dev, fabs(S[k * ib.nbf + k] - 1));
      cJSON_AddItemToObject(j, "overlap_diag_dev", json_number(dev));
      free(S);
      int_basis_free(&ib);
      basis_set_free(&bs);
    }
    chem_space_free(&s);
  }
  if (rc == 0) {
    char *txt = json_print(j);
    printf("%s\n", txt);
    free(txt);
  }
  cJSON_Delete(j);
  status = rc == 0 ? 0 : 1;
done:
  free(r.path);
  free(r.basis_name);
  free(r.basis_file);
  free(r.integrals_file);
  free(r.orbitals.core);
  free(r.orbitals.active);
  free(pt.atoms);
  diag_free(d);
  return status;
}
