/* json.c — JSON forms of Pauli sums and rotation programs (see json.h). */
#include "config.h"

#include "cairn/json.h"
#include "cairn/util.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

cJSON *json_number(double x) { return cJSON_CreateNumber(x); }

/* Numbers go out in the shortest spelling that reads back exactly: cJSON's own
 * printer accepts a 15-digit spelling that reads back only within an epsilon
 * (0.7794640752287191 prints as 0.779464075228719).  The tree is copied and
 * every finite number turned into raw text before printing; integers are
 * spelled as integers (10, not 1e1). */
static void exact_numbers(cJSON *n) {
  for (; n; n = n->next) {
    double x = n->valuedouble;
    if (cJSON_IsNumber(n) && isfinite(x)) {
      char buf[32];
      if (x == floor(x) && fabs(x) < 1e15) snprintf(buf, sizeof buf, "%.0f", x);
      else util_fmt_double(buf, x);
      n->valuestring = xstrdup(strcmp(buf, "-0") == 0 ? "0" : buf);
      n->type = cJSON_Raw;
    }
    if (n->child) exact_numbers(n->child);
  }
}

char *json_print(const cJSON *j) {
  cJSON *copy = cJSON_Duplicate(j, 1);
  if (!copy) {
    fprintf(stderr, "cairn: out of memory printing JSON\n");
    exit(2);
  }
  exact_numbers(copy);
  char *s = cJSON_Print(copy);
  cJSON_Delete(copy);
  if (!s) {
    fprintf(stderr, "cairn: out of memory printing JSON\n");
    exit(2);
  }
  return s;
}

static cJSON *coeff(double complex c) {
  if (cimag(c) == 0) return cJSON_CreateNumber(creal(c));
  cJSON *a = cJSON_CreateArray();
  cJSON_AddItemToArray(a, cJSON_CreateNumber(creal(c)));
  cJSON_AddItemToArray(a, cJSON_CreateNumber(cimag(c)));
  return a;
}

static int read_coeff(const cJSON *j, double complex *c) {
  if (cJSON_IsNumber(j)) {
    *c = j->valuedouble;
    return 0;
  }
  if (cJSON_IsArray(j) && cJSON_GetArraySize(j) == 2 && cJSON_IsNumber(cJSON_GetArrayItem(j, 0)) &&
      cJSON_IsNumber(cJSON_GetArrayItem(j, 1))) {
    *c = cJSON_GetArrayItem(j, 0)->valuedouble + I * cJSON_GetArrayItem(j, 1)->valuedouble;
    return 0;
  }
  return -1;
}

cJSON *json_pauli_sum(const pauli_sum *s) {
  cJSON *o = cJSON_CreateObject();
  cJSON_AddNumberToObject(o, "qubits", s->n);
  double complex id = 0;
  cJSON *terms = cJSON_CreateArray();
  for (size_t t = 0; t < s->len; t++) {
    const uint64_t *x = pauli_sum_x(s, t), *z = pauli_sum_z(s, t);
    if (pauli_word_is_identity(s->nw, x, z)) {
      id += s->c[t];
      continue;
    }
    cJSON *term = cJSON_CreateObject();
    char *w = pauli_word_str(s->n, x, z);
    cJSON_AddStringToObject(term, "pauli", w);
    free(w);
    cJSON_AddItemToObject(term, "coeff", coeff(s->c[t]));
    cJSON_AddItemToArray(terms, term);
  }
  cJSON_AddItemToObject(o, "constant", coeff(id));
  cJSON_AddItemToObject(o, "terms", terms);
  return o;
}

int json_read_pauli_sum(const cJSON *j, pauli_sum *out, char *err, size_t errlen) {
  const cJSON *q = cJSON_GetObjectItemCaseSensitive(j, "qubits");
  if (!cJSON_IsNumber(q) || q->valuedouble < 0 || q->valuedouble > 1e6) {
    snprintf(err, errlen, "\"qubits\" must be a non-negative number");
    return -1;
  }
  int n = (int)q->valuedouble;
  pauli_sum_init(out, n);
  const cJSON *k = cJSON_GetObjectItemCaseSensitive(j, "constant");
  double complex c;
  if (k) {
    if (read_coeff(k, &c) != 0) {
      snprintf(err, errlen, "\"constant\" must be a number or a pair");
      return -1;
    }
    if (c != 0) pauli_sum_add_identity(out, c);
  }
  const cJSON *terms = cJSON_GetObjectItemCaseSensitive(j, "terms");
  if (terms && !cJSON_IsArray(terms)) {
    snprintf(err, errlen, "\"terms\" must be an array");
    return -1;
  }
  uint64_t *x = xcalloc((size_t)out->nw, sizeof *x), *z = xcalloc((size_t)out->nw, sizeof *z);
  int i = 0, rc = 0;
  const cJSON *t;
  cJSON_ArrayForEach(t, terms) {
    const cJSON *p = cJSON_GetObjectItemCaseSensitive(t, "pauli");
    const cJSON *cc = cJSON_GetObjectItemCaseSensitive(t, "coeff");
    char perr[160];
    if (!cJSON_IsString(p) || pauli_word_parse(p->valuestring, n, x, z, perr, sizeof perr, NULL) != 0) {
      snprintf(err, errlen, "term %d: bad \"pauli\"%s%s", i, cJSON_IsString(p) ? ": " : "",
               cJSON_IsString(p) ? perr : "");
      rc = -1;
      break;
    }
    if (!cc || read_coeff(cc, &c) != 0) {
      snprintf(err, errlen, "term %d: \"coeff\" must be a number or a pair", i);
      rc = -1;
      break;
    }
    pauli_sum_add(out, x, z, c);
    i++;
  }
  free(x);
  free(z);
  return rc;
}

cJSON *json_circuit(const ans_circuit *c) {
  cJSON *o = cJSON_CreateObject();
  cJSON_AddNumberToObject(o, "qubits", c->nqubits);
  char *bits = xmalloc((size_t)c->nqubits + 1);
  for (int q = 0; q < c->nqubits; q++) bits[q] = pauli_get_x(c->init, q) ? '1' : '0';
  bits[c->nqubits] = 0;
  cJSON_AddStringToObject(o, "init", bits);
  free(bits);
  cJSON *params = cJSON_CreateArray();
  for (int p = 0; p < c->nparams; p++) cJSON_AddItemToArray(params, cJSON_CreateNumber(c->param_gen[p]));
  cJSON_AddItemToObject(o, "params", params);
  cJSON *gens = cJSON_CreateArray();
  for (int g = 0; g < c->ngens; g++) {
    const ans_gen_info *gi = &c->gens[g];
    cJSON *e = cJSON_CreateObject();
    cJSON_AddStringToObject(e, "kind", ans_kind_name(gi->kind));
    cJSON_AddStringToObject(e, "text", gi->text ? gi->text : "");
    cJSON_AddNumberToObject(e, "rule", gi->rule);
    cJSON_AddNumberToObject(e, "line", gi->line);
    cJSON *from = cJSON_CreateArray(), *to = cJSON_CreateArray();
    for (int k = 0; k < gi->nexc; k++) {
      cJSON_AddItemToArray(from, cJSON_CreateNumber(gi->from[k]));
      cJSON_AddItemToArray(to, cJSON_CreateNumber(gi->to[k]));
    }
    cJSON_AddItemToObject(e, "from", from);
    cJSON_AddItemToObject(e, "to", to);
    if (gi->spin_adapted) cJSON_AddTrueToObject(e, "spin_adapted");
    cJSON_AddItemToArray(gens, e);
  }
  cJSON_AddItemToObject(o, "generators", gens);
  cJSON *rots = cJSON_CreateArray();
  for (size_t r = 0; r < c->nrot; r++) {
    const ans_rotation *ro = &c->rot[r];
    cJSON *e = cJSON_CreateObject();
    char *w = pauli_word_str(c->nqubits, pauli_sum_x(&c->words, (size_t)ro->word),
                             pauli_sum_z(&c->words, (size_t)ro->word));
    cJSON_AddStringToObject(e, "word", w);
    free(w);
    cJSON_AddNumberToObject(e, "param", ro->param);
    cJSON_AddNumberToObject(e, "mult", ro->mult);
    cJSON_AddNumberToObject(e, "gen", ro->gen);
    cJSON_AddItemToArray(rots, e);
  }
  cJSON_AddItemToObject(o, "rotations", rots);
  return o;
}

static int get_int(const cJSON *o, const char *key, int *v) {
  const cJSON *j = cJSON_GetObjectItemCaseSensitive(o, key);
  if (!cJSON_IsNumber(j) || j->valuedouble != floor(j->valuedouble) || fabs(j->valuedouble) > 1e9) return -1;
  *v = (int)j->valuedouble;
  return 0;
}

static int kind_from_name(const char *s, ans_kind *k) {
  for (int i = ANS_SINGLE; i <= ANS_EXCITE; i++)
    if (strcmp(ans_kind_name((ans_kind)i), s) == 0) {
      *k = (ans_kind)i;
      return 0;
    }
  return -1;
}

int json_read_circuit(const cJSON *j, ans_circuit *out, char *err, size_t errlen) {
  int n;
  if (get_int(j, "qubits", &n) != 0 || n < 0) {
    snprintf(err, errlen, "\"qubits\" must be a non-negative integer");
    return -1;
  }
  ans_circuit_init(out, n);
  const cJSON *init = cJSON_GetObjectItemCaseSensitive(j, "init");
  if (init) {
    if (!cJSON_IsString(init) || (int)strlen(init->valuestring) != n) {
      snprintf(err, errlen, "\"init\" must be a bit string of %d characters", n);
      return -1;
    }
    for (int q = 0; q < n; q++) {
      char b = init->valuestring[q];
      if (b != '0' && b != '1') {
        snprintf(err, errlen, "\"init\" must hold only 0 and 1");
        return -1;
      }
      pauli_set(out->init, q, b == '1');
    }
  }
  const cJSON *g, *gens = cJSON_GetObjectItemCaseSensitive(j, "generators");
  cJSON_ArrayForEach(g, gens) {
    ans_gen_info gi = {0};
    const cJSON *kind = cJSON_GetObjectItemCaseSensitive(g, "kind");
    const cJSON *text = cJSON_GetObjectItemCaseSensitive(g, "text");
    if (!cJSON_IsString(kind) || kind_from_name(kind->valuestring, &gi.kind) != 0) {
      snprintf(err, errlen, "generator %d: unknown \"kind\"", out->ngens);
      return -1;
    }
    gi.text = cJSON_IsString(text) ? text->valuestring : "";
    if (get_int(g, "rule", &gi.rule) != 0) gi.rule = -1;
    if (get_int(g, "line", &gi.line) != 0) gi.line = 0;
    const cJSON *from = cJSON_GetObjectItemCaseSensitive(g, "from");
    const cJSON *to = cJSON_GetObjectItemCaseSensitive(g, "to");
    int nf = cJSON_GetArraySize(from), nt = cJSON_GetArraySize(to);
    if (nf != nt || nf > 4) {
      snprintf(err, errlen, "generator %d: \"from\" and \"to\" must have equal length (at most 4)", out->ngens);
      return -1;
    }
    gi.nexc = nf;
    for (int k = 0; k < nf; k++) {
      gi.from[k] = (int)cJSON_GetArrayItem(from, k)->valuedouble;
      gi.to[k] = (int)cJSON_GetArrayItem(to, k)->valuedouble;
    }
    gi.spin_adapted = cJSON_IsTrue(cJSON_GetObjectItemCaseSensitive(g, "spin_adapted"));
    ans_circuit_add_gen(out, &gi);
  }
  const cJSON *p, *params = cJSON_GetObjectItemCaseSensitive(j, "params");
  cJSON_ArrayForEach(p, params) {
    if (!cJSON_IsNumber(p) || p->valuedouble >= out->ngens) {
      snprintf(err, errlen, "parameter %d: generator index out of range", out->nparams);
      return -1;
    }
    ans_circuit_add_param(out, (int)p->valuedouble);
  }
  const cJSON *r, *rots = cJSON_GetObjectItemCaseSensitive(j, "rotations");
  uint64_t *x = xcalloc((size_t)out->words.nw, sizeof *x), *z = xcalloc((size_t)out->words.nw, sizeof *z);
  int i = 0, rc = 0;
  cJSON_ArrayForEach(r, rots) {
    const cJSON *w = cJSON_GetObjectItemCaseSensitive(r, "word");
    const cJSON *m = cJSON_GetObjectItemCaseSensitive(r, "mult");
    int param, gen;
    char perr[160];
    if (!cJSON_IsString(w) || pauli_word_parse(w->valuestring, n, x, z, perr, sizeof perr, NULL) != 0 ||
        !cJSON_IsNumber(m) || get_int(r, "param", &param) != 0 || param >= out->nparams ||
        get_int(r, "gen", &gen) != 0 || gen >= out->ngens) {
      snprintf(err, errlen, "rotation %d: needs a valid \"word\", \"param\", \"mult\" and \"gen\"", i);
      rc = -1;
      break;
    }
    ans_circuit_push(out, ans_circuit_word(out, x, z), param, m->valuedouble, gen);
    i++;
  }
  free(x);
  free(z);
  return rc;
}
