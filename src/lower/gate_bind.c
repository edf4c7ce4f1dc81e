/* gate_bind.c — parameter values from a `cairn run --json` report. */
#include "config.h"

#include "cairn/gates.h"
#include "cairn/util.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

static int finite_number(const cJSON *j, double *v) {
  if (!cJSON_IsNumber(j) || !isfinite(j->valuedouble)) return -1;
  *v = j->valuedouble;
  return 0;
}

double *gate_bind_report(const cJSON *report, const ans_circuit *c, int point, char *err, size_t errlen) {
  const cJSON *points = cJSON_GetObjectItemCaseSensitive(report, "points");
  if (!cJSON_IsArray(points)) {
    snprintf(err, errlen, "the report has no \"points\" array");
    return NULL;
  }
  int npts = cJSON_GetArraySize(points);
  if (point < 0 || point >= npts) {
    snprintf(err, errlen, "point %d does not exist: the report has %d point%s", point, npts, npts == 1 ? "" : "s");
    return NULL;
  }
  const cJSON *pt = cJSON_GetArrayItem(points, point);
  const cJSON *gens = cJSON_GetObjectItemCaseSensitive(pt, "generators");
  const cJSON *params = cJSON_GetObjectItemCaseSensitive(pt, "parameters");
  if (gens) {
    if (!cJSON_IsArray(gens) || cJSON_GetArraySize(gens) != c->ngens) {
      snprintf(err, errlen, "points[%d].generators has %d entries; the program has %d generators", point,
               cJSON_IsArray(gens) ? cJSON_GetArraySize(gens) : 0, c->ngens);
      return NULL;
    }
    for (int g = 0; g < c->ngens; g++) {
      const cJSON *e = cJSON_GetArrayItem(gens, g);
      const cJSON *kind = cJSON_GetObjectItemCaseSensitive(e, "kind");
      const cJSON *text = cJSON_GetObjectItemCaseSensitive(e, "text");
      const char *want = c->gens[g].text ? c->gens[g].text : "";
      if (!cJSON_IsString(kind) || strcmp(kind->valuestring, ans_kind_name(c->gens[g].kind)) != 0) {
        snprintf(err, errlen, "points[%d].generators[%d].kind is %s%s%s; the program's generator %d is a %s", point,
                 g, cJSON_IsString(kind) ? "`" : "", cJSON_IsString(kind) ? kind->valuestring : "missing",
                 cJSON_IsString(kind) ? "`" : "", g, ans_kind_name(c->gens[g].kind));
        return NULL;
      }
      if (!cJSON_IsString(text) || strcmp(text->valuestring, want) != 0) {
        snprintf(err, errlen, "points[%d].generators[%d].text is %s%s%s; the program's generator %d is `%s`", point,
                 g, cJSON_IsString(text) ? "`" : "", cJSON_IsString(text) ? text->valuestring : "missing",
                 cJSON_IsString(text) ? "`" : "", g, want);
        return NULL;
      }
    }
  }
  double *v = xcalloc((size_t)(c->nparams > 0 ? c->nparams : 1), sizeof *v);
  if (params) {
    if (!cJSON_IsArray(params) || cJSON_GetArraySize(params) != c->nparams) {
      snprintf(err, errlen, "points[%d].parameters has %d values; the program has %d parameters", point,
               cJSON_IsArray(params) ? cJSON_GetArraySize(params) : 0, c->nparams);
      free(v);
      return NULL;
    }
    for (int p = 0; p < c->nparams; p++)
      if (finite_number(cJSON_GetArrayItem(params, p), &v[p]) != 0) {
        snprintf(err, errlen, "points[%d].parameters[%d] is not a finite number", point, p);
        free(v);
        return NULL;
      }
    return v;
  }
  if (!gens) {
    snprintf(err, errlen, "points[%d] has neither \"parameters\" nor \"generators\"", point);
    free(v);
    return NULL;
  }
  if (c->nref_params > 0) {
    snprintf(err, errlen,
             "points[%d] has no \"parameters\" array, and the program's %d reference angles are not in "
             "\"generators\"",
             point, c->nref_params);
    free(v);
    return NULL;
  }
  /* One parameter per generator: theta of generator g binds it. */
  int *owner = xmalloc((size_t)(c->ngens > 0 ? c->ngens : 1) * sizeof *owner);
  for (int g = 0; g < c->ngens; g++) owner[g] = -1;
  for (int p = 0; p < c->nparams; p++) {
    int g = c->param_gen[p];
    if (g < 0 || g >= c->ngens || owner[g] >= 0) {
      snprintf(err, errlen, "points[%d] has no \"parameters\" array, and generator %d has several parameters", point,
               g);
      free(owner);
      free(v);
      return NULL;
    }
    owner[g] = p;
  }
  for (int g = 0; g < c->ngens; g++) {
    if (owner[g] < 0) continue;
    const cJSON *th = cJSON_GetObjectItemCaseSensitive(cJSON_GetArrayItem(gens, g), "theta");
    if (finite_number(th, &v[owner[g]]) != 0) {
      snprintf(err, errlen, "points[%d].generators[%d].theta is %s", point, g, th ? "not a finite number" : "missing");
      free(owner);
      free(v);
      return NULL;
    }
  }
  free(owner);
  return v;
}
