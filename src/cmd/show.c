/* show.c — `cairn show FILE`: the ranked generator table, or with
 * --hamiltonian the qubit Hamiltonian after encoding and tapering.
 *
 * The two parts share the option parsing and the recipe loading; each prints
 * its own table.  The generator table is the ansatz module's (ans_show).  The
 * Hamiltonian part prints, for every scan point, the encoding, the qubit
 * counts, each removed symmetry with its sector and the reason it exists, and
 * every term with its full-precision coefficient (shortest round-trip
 * spelling), in text or JSON. */
#include "config.h"

#include "cmd/cmd.h"

#include "cairn/front.h"
#include "cairn/json.h"
#include "cairn/pipe.h"
#include "cairn/pool.h"
#include "cairn/qubit.h"
#include "cairn/util.h"

#include <cjson/cJSON.h>
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct show_opts {
  int json;
  int hamiltonian;
  const char *file;
} show_opts;

static int parse_args(int argc, char **argv, show_opts *o) {
  memset(o, 0, sizeof *o);
  for (int i = 1; i < argc; i++) {
    const char *a = argv[i];
    if (strcmp(a, "--json") == 0) o->json = 1;
    else if (strcmp(a, "--hamiltonian") == 0) o->hamiltonian = 1;
    else if (a[0] == '-' && a[1]) return cmd_usage_error("show", "unknown option `%s`", a);
    else if (o->file) return cmd_usage_error("show", "one recipe at a time (got `%s` and `%s`)", o->file, a);
    else o->file = a;
  }
  if (!o->file) return cmd_usage_error("show", "which recipe? (cairn show FILE)");
  return 0;
}

/* ---- the generator table (ansatz module) ---- */

static int show_generators(const ir_recipe *r, diag_ctx *d, const show_opts *o) {
  return ans_show(r, d, stdout, o->json) == 0 ? 0 : 1;
}

/* ---- the qubit Hamiltonian ---- */

/* Numbers are printed by json_print in the shortest spelling that reads back
 * exactly (json.h). */
static cJSON *num(double x) { return json_number(x); }

static cJSON *coeff_json(double complex c) {
  if (cimag(c) == 0) return num(creal(c));
  cJSON *a = cJSON_CreateArray();
  cJSON_AddItemToArray(a, num(creal(c)));
  cJSON_AddItemToArray(a, num(cimag(c)));
  return a;
}

static char *coeff_text(double complex c) {
  char re[32], im[32];
  util_fmt_double(re, creal(c));
  if (cimag(c) == 0) return xstrdup(re);
  util_fmt_double(im, cimag(c));
  return xasprintf("%s%s%si", re, im[0] == '-' ? "" : "+", im);
}

static char *bits_text(int n, const uint64_t *b) {
  char *s = xmalloc((size_t)n + 1);
  for (int q = 0; q < n; q++) s[q] = pauli_get_x(b, q) ? '1' : '0';
  s[n] = 0;
  return s;
}

/* "particle-number parity, spin-up parity and spin-down parity" or NULL. */
static char *parities_text(unsigned bits) {
  static const char *names[3] = {"particle-number parity", "spin-up parity", "spin-down parity"};
  const char *have[3];
  int n = 0;
  for (int p = 0; p < 3; p++)
    if (bits & (1u << p)) have[n++] = names[p];
  if (n == 0) return NULL;
  if (n == 1) return xstrdup(have[0]);
  if (n == 2) return xasprintf("%s and %s", have[0], have[1]);
  return xasprintf("%s, %s and %s", have[0], have[1], have[2]);
}

static cJSON *point_json(const ir_recipe *r, const pipe_point *p) {
  cJSON *o = cJSON_CreateObject();
  if (r->scan.active) {
    cJSON *params = cJSON_CreateObject();
    cJSON_AddItemToObject(params, r->scan.name, num(r->points[p->point].param));
    cJSON_AddItemToObject(o, "params", params);
  }
  const qubit_taper *t = &p->taper;
  cJSON_AddStringToObject(o, "encoding", qubit_encoding_name(r->encoding));
  cJSON_AddBoolToObject(o, "tapered", r->taper != 0);
  cJSON_AddNumberToObject(o, "orbitals", p->space.norb);
  cJSON_AddNumberToObject(o, "electrons", p->space.nalpha + p->space.nbeta);
  cJSON_AddNumberToObject(o, "qubits", p->nqubits);
  cJSON_AddNumberToObject(o, "qubits_before", t->nqubits);
  cJSON_AddNumberToObject(o, "removed", t->nsym);
  cJSON *sector = cJSON_CreateArray(), *syms = cJSON_CreateArray();
  int nw = pauli_nwords(t->nqubits);
  uint64_t *zero = xcalloc((size_t)nw, sizeof *zero);
  for (int i = 0; i < t->nsym; i++) {
    cJSON_AddItemToArray(sector, cJSON_CreateNumber(t->sector[i]));
    cJSON *s = cJSON_CreateObject();
    char *w = pauli_word_str(t->nqubits, zero, t->tau + (size_t)i * nw);
    cJSON_AddStringToObject(s, "word", w);
    free(w);
    cJSON_AddNumberToObject(s, "qubit", t->pivot[i]);
    cJSON_AddNumberToObject(s, "sector", t->sector[i]);
    cJSON_AddStringToObject(s, "why", t->why[i]);
    cJSON_AddItemToArray(syms, s);
  }
  free(zero);
  cJSON_AddItemToObject(o, "sector", sector);
  cJSON_AddItemToObject(o, "symmetries", syms);
  char *ref = bits_text(p->nqubits, p->ref);
  cJSON_AddStringToObject(o, "reference", ref);
  free(ref);
  const pauli_sum *h = &p->ham;
  double complex constant = 0;
  cJSON *terms = cJSON_CreateArray();
  int nterms = 0;
  for (size_t k = 0; k < h->len; k++) {
    const uint64_t *x = pauli_sum_x(h, k), *z = pauli_sum_z(h, k);
    if (pauli_word_is_identity(h->nw, x, z)) {
      constant += h->c[k];
      continue;
    }
    cJSON *term = cJSON_CreateObject();
    char *w = pauli_word_str(h->n, x, z);
    cJSON_AddStringToObject(term, "pauli", w);
    free(w);
    cJSON_AddItemToObject(term, "coeff", coeff_json(h->c[k]));
    cJSON_AddItemToArray(terms, term);
    nterms++;
  }
  cJSON_AddNumberToObject(o, "nterms", nterms);
  cJSON_AddItemToObject(o, "constant", coeff_json(constant));
  cJSON_AddItemToObject(o, "terms", terms);
  return o;
}

static void point_text(FILE *f, const ir_recipe *r, const pipe_point *p) {
  const qubit_taper *t = &p->taper;
  if (r->scan.active) {
    char v[32];
    fprintf(f, "point %d of %d: %s = %s %s\n", p->point + 1, r->npoints, r->scan.name,
            util_fmt_double(v, r->points[p->point].param), ir_unit_name(r->scan.unit));
  }
  fprintf(f, "encoding: %s%s\n", qubit_encoding_name(r->encoding), r->taper ? ", tapered" : "");
  fprintf(f, "active space: %d electrons in %d orbitals\n", p->space.nalpha + p->space.nbeta, p->space.norb);
  if (r->taper)
    fprintf(f, "qubits: %d (%d before tapering, %d removed)\n", p->nqubits, t->nqubits, t->nsym);
  else fprintf(f, "qubits: %d\n", p->nqubits);
  int nw = pauli_nwords(t->nqubits);
  uint64_t *zero = xcalloc((size_t)nw, sizeof *zero);
  for (int i = 0; i < t->nsym; i++) {
    char *w = pauli_word_str(t->nqubits, zero, t->tau + (size_t)i * nw);
    fprintf(f, "  removed qubit %d: %s = %+d (%s)\n", t->pivot[i], w, t->sector[i], t->why[i]);
    free(w);
  }
  free(zero);
  if (r->taper) {
    char *par = parities_text(t->parities);
    if (par) fprintf(f, "  the removed symmetries include %s\n", par);
    free(par);
    if (t->nsym == 0) fprintf(f, "  no Z2 symmetry found: nothing to remove\n");
  }
  char *ref = bits_text(p->nqubits, p->ref);
  fprintf(f, "reference: %s\n", ref);
  free(ref);
  const pauli_sum *h = &p->ham;
  double complex constant = pauli_sum_identity_coeff(h);
  size_t nterms = h->len;
  for (size_t k = 0; k < h->len; k++)
    if (pauli_word_is_identity(h->nw, pauli_sum_x(h, k), pauli_sum_z(h, k))) nterms--;
  char *c = coeff_text(constant);
  fprintf(f, "terms: %zu and the constant %s hartree\n", nterms, c);
  free(c);
  for (size_t k = 0; k < h->len; k++) {
    const uint64_t *x = pauli_sum_x(h, k), *z = pauli_sum_z(h, k);
    if (pauli_word_is_identity(h->nw, x, z)) continue;
    char *w = pauli_word_str(h->n, x, z), *cc = coeff_text(h->c[k]);
    fprintf(f, "  %s%-24s %s\n", cc[0] == '-' ? "" : " ", cc, w);
    free(w);
    free(cc);
  }
}

static int show_hamiltonian(const ir_recipe *r, diag_ctx *d, const show_opts *o) {
  int npoints = r->npoints > 0 ? r->npoints : 1, rc = 0;
  cJSON *points = o->json && r->scan.active ? cJSON_CreateArray() : NULL;
  cJSON *single = NULL;
  if (!o->json)
    printf("# the qubit Hamiltonian of %s: the active space in the recipe's basis set\n"
           "# (or integral file) as a Pauli sum, coefficients in hartree\n",
           o->file);
  for (int k = 0; k < npoints && rc == 0; k++) {
    pipe_point p;
    if (pipe_point_build(r, k, d, &p) != 0) {
      rc = 1;
      break;
    }
    if (o->json) {
      cJSON *pj = point_json(r, &p);
      if (points) cJSON_AddItemToArray(points, pj);
      else single = pj;
    } else {
      if (k) putchar('\n');
      point_text(stdout, r, &p);
    }
    pipe_point_free(&p);
  }
  if (diag_errors(d)) rc = 1;
  if (o->json && rc == 0) {
    cJSON *top = single;
    if (points) {
      top = cJSON_CreateObject();
      cJSON_AddItemToObject(top, "points", points);
      points = NULL;
    }
    char *s = json_print(top);
    puts(s);
    free(s);
    cJSON_Delete(top);
    single = NULL;
  }
  cJSON_Delete(points);
  cJSON_Delete(single);
  return rc;
}

int cmd_show(const cmd_env *env, int argc, char **argv) {
  show_opts o;
  int rc = parse_args(argc, argv, &o);
  if (rc) return rc;
  FILE *probe = fopen(o.file, "r");
  if (!probe) {
    fprintf(stderr, "cairn show: cannot read `%s`: %s\n", o.file, strerror(errno));
    return 2;
  }
  fclose(probe);
  diag_ctx *d = diag_new(stderr, env->color);
  diag_set_werror(d, env->werror);
  ir_recipe *r = front_load(d, o.file);
  if (!r) {
    diag_free(d);
    return 1;
  }
  rc = o.hamiltonian ? show_hamiltonian(r, d, &o) : show_generators(r, d, &o);
  if (rc == 0 && diag_errors(d)) rc = 1;
  if (fflush(stdout) != 0) {
    fprintf(stderr, "cairn show: cannot write the output: %s\n", strerror(errno));
    rc = 2;
  }
  ir_recipe_free(r);
  diag_free(d);
  return rc;
}
