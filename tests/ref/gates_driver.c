/* gates_driver.c — check driver for the gate reference tests: reads a
 * rotation program in JSON (include/cairn/json.h) and writes it lowered.
 *
 *   gates_driver [options] PROGRAM.json            the circuit on stdout
 *   gates_driver --counts [options] PROGRAM.json   counts as JSON on stdout
 *
 * options: --format listing|qasm2|qasm3, --tree, --no-passes, --short,
 *          --bind REPORT.json [--point K]
 * Exit status 0, or 2 with a message on bad input. */
#include "config.h"

#include "cairn/gates.h"
#include "cairn/json.h"
#include "cairn/util.h"

#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static cJSON *read_json(const char *path) {
  size_t len;
  char *text = util_read_file(path, &len);
  if (!text) {
    fprintf(stderr, "gates_driver: cannot read %s\n", path);
    exit(2);
  }
  cJSON *j = cJSON_ParseWithLength(text, len);
  free(text);
  if (!j) {
    fprintf(stderr, "gates_driver: %s is not JSON\n", path);
    exit(2);
  }
  return j;
}

int main(int argc, char **argv) {
  gate_opts o;
  gate_opts_default(&o);
  gate_format fmt = GATE_FMT_LISTING;
  const char *path = NULL, *bind = NULL;
  int counts = 0, point = 0;
  for (int i = 1; i < argc; i++) {
    if (strcmp(argv[i], "--format") == 0 && i + 1 < argc) {
      if (gate_format_parse(argv[++i], &fmt) != 0) {
        fprintf(stderr, "gates_driver: unknown format %s\n", argv[i]);
        return 2;
      }
    } else if (strcmp(argv[i], "--tree") == 0) {
      o.ladder = GATE_LADDER_TREE;
    } else if (strcmp(argv[i], "--no-passes") == 0) {
      o.passes = 0;
    } else if (strcmp(argv[i], "--short") == 0) {
      o.shortexc = 1;
    } else if (strcmp(argv[i], "--counts") == 0) {
      counts = 1;
    } else if (strcmp(argv[i], "--bind") == 0 && i + 1 < argc) {
      bind = argv[++i];
    } else if (strcmp(argv[i], "--point") == 0 && i + 1 < argc) {
      point = atoi(argv[++i]);
    } else if (argv[i][0] != '-' && !path) {
      path = argv[i];
    } else {
      fprintf(stderr, "gates_driver: bad argument %s\n", argv[i]);
      return 2;
    }
  }
  if (!path) {
    fprintf(stderr, "usage: gates_driver [--counts] [--format F] [--tree] [--no-passes] [--short] PROGRAM.json\n");
    return 2;
  }
  cJSON *j = read_json(path);
  ans_circuit c;
  char err[256];
  if (json_read_circuit(j, &c, err, sizeof err) != 0) {
    fprintf(stderr, "gates_driver: %s: %s\n", path, err);
    cJSON_Delete(j);
    ans_circuit_free(&c);
    return 2;
  }
  cJSON_Delete(j);
  int rc = 0;
  if (counts) {
    gate_counts k;
    gate_count_circuit(&c, &o, &k);
    cJSON *out = gate_counts_json(&k);
    cJSON_AddNumberToObject(out, "plain_cnot", (double)gate_plain_cx(&c, -2));
    cJSON *gc = cJSON_AddArrayToObject(out, "gen_cnot");
    cJSON *gs = cJSON_AddArrayToObject(out, "gen_single");
    for (int g = 0; g < c.ngens; g++) {
      cJSON_AddItemToArray(gc, cJSON_CreateNumber((double)k.gen_cx[g]));
      cJSON_AddItemToArray(gs, cJSON_CreateNumber((double)k.gen_single[g]));
    }
    cJSON_AddNumberToObject(out, "ref_single", (double)k.ref_single);
    char *s = json_print(out);
    puts(s);
    free(s);
    cJSON_Delete(out);
    gate_counts_free(&k);
  } else {
    double *values = NULL;
    if (bind) {
      cJSON *r = read_json(bind);
      values = gate_bind_report(r, &c, point, err, sizeof err);
      cJSON_Delete(r);
      if (!values) {
        fprintf(stderr, "gates_driver: %s: %s\n", bind, err);
        ans_circuit_free(&c);
        return 2;
      }
    }
    gate_meta meta = {path, values, bind};
    if (gate_write(stdout, fmt, &c, &o, &meta, NULL, NULL) != 0) {
      perror("gates_driver: writing");
      rc = 2;
    }
    free(values);
  }
  ans_circuit_free(&c);
  return rc;
}
