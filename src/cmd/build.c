/* build.c — `cairn build`: lower the ansatz to gates, print the counts, write
 * the gate listing or OpenQASM (atomically).
 *
 *   cairn build FILE [-o OUT] [--format listing|qasm2|qasm3] [--bind REPORT
 *               [--point K]] [--tree] [--short] [--no-passes] [--json]
 *   cairn build --program PROGRAM.json ...   a rotation program (json.h) instead of a recipe
 *   --save-program FILE                      also write the rotation program lowered, as JSON
 *
 * Without -o, a recipe's `emit` statements say what to write; `-o -` writes to
 * standard output (the counts then go to standard error). */
#include "config.h"

#include "cmd/cmd.h"

#include "cairn/diag.h"
#include "cairn/front.h"
#include "cairn/gates.h"
#include "cairn/runner.h"
#include "cairn/ir.h"
#include "cairn/json.h"
#include "cairn/util.h"

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct build_args {
  const char *file, *out, *bind, *save;
  int program, json, point, have_format;
  gate_format format;
  gate_opts opts;
} build_args;

static int parse_args(int argc, char **argv, build_args *a) {
  memset(a, 0, sizeof *a);
  gate_opts_default(&a->opts);
  for (int i = 1; i < argc; i++) {
    const char *s = argv[i];
    if ((strcmp(s, "-o") == 0 || strcmp(s, "--format") == 0 || strcmp(s, "--bind") == 0 ||
         strcmp(s, "--point") == 0 || strcmp(s, "--save-program") == 0) &&
        i + 1 >= argc)
      return cmd_usage_error("build", "%s needs a value", s);
    if (strcmp(s, "-o") == 0) {
      a->out = argv[++i];
    } else if (strcmp(s, "--format") == 0) {
      if (gate_format_parse(argv[++i], &a->format) != 0)
        return cmd_usage_error("build", "--format takes listing, qasm2 or qasm3, not `%s`", argv[i]);
      a->have_format = 1;
    } else if (strcmp(s, "--bind") == 0) {
      a->bind = argv[++i];
    } else if (strcmp(s, "--save-program") == 0) {
      a->save = argv[++i];
    } else if (strcmp(s, "--point") == 0) {
      char *end;
      long v = strtol(argv[++i], &end, 10);
      if (*end || end == argv[i] || v < 0 || v > 1000000)
        return cmd_usage_error("build", "--point takes a point index (0, 1, ...), not `%s`", argv[i]);
      a->point = (int)v;
    } else if (strcmp(s, "--tree") == 0) {
      a->opts.ladder = GATE_LADDER_TREE;
    } else if (strcmp(s, "--short") == 0) {
      a->opts.shortexc = 1;
    } else if (strcmp(s, "--no-passes") == 0) {
      a->opts.passes = 0;
    } else if (strcmp(s, "--program") == 0) {
      a->program = 1;
    } else if (strcmp(s, "--json") == 0) {
      a->json = 1;
    } else if (s[0] == '-' && s[1]) {
      return cmd_usage_error("build", "unknown option `%s`", s);
    } else if (!a->file) {
      a->file = s;
    } else {
      return cmd_usage_error("build", "one FILE at a time (got `%s` and `%s`)", a->file, s);
    }
  }
  if (!a->file) return cmd_usage_error("build", "no FILE given");
  return 0;
}

/* Format of an output path when --format is not given: .qasm and .qasm3 mean
 * OpenQASM 3.0, .qasm2 OpenQASM 2.0, anything else the listing. */
static gate_format format_of(const char *path) {
  const char *dot = strrchr(path, '.');
  if (dot && (strcmp(dot, ".qasm") == 0 || strcmp(dot, ".qasm3") == 0)) return GATE_FMT_QASM3;
  if (dot && strcmp(dot, ".qasm2") == 0) return GATE_FMT_QASM2;
  return GATE_FMT_LISTING;
}

static cJSON *read_json_file(const char *path, const char *what) {
  size_t len;
  char *text = util_read_file(path, &len);
  if (!text) {
    fprintf(stderr, "cairn build: cannot read %s %s: %s\n", what, path, strerror(errno));
    return NULL;
  }
  const char *end = NULL;
  cJSON *j = cJSON_ParseWithLengthOpts(text, len, &end, 0);
  if (!j) {
    size_t off = end ? (size_t)(end - text) : 0;
    int line = 1;
    for (size_t i = 0; i < off && i < len; i++) line += text[i] == '\n';
    fprintf(stderr, "cairn build: %s:%d: %s is not valid JSON\n", path, line, what);
  }
  free(text);
  return j;
}

/* Write c in fmt to path (atomically; "-" is standard output). Returns 0 or
 * 2 after a message. */
static int write_one(const char *path, gate_format fmt, const ans_circuit *c, const gate_opts *o,
                     const gate_meta *meta, FILE *say) {
  uint64_t bytes = 0;
  if (strcmp(path, "-") == 0) {
    if (gate_write(stdout, fmt, c, o, meta, NULL, &bytes) != 0) {
      fprintf(stderr, "cairn build: writing to standard output: %s\n", strerror(errno));
      return 2;
    }
    return 0;
  }
  util_afile *f = util_afile_open(path);
  if (!f) {
    fprintf(stderr, "cairn build: cannot write %s: %s\n", path, strerror(errno));
    return 2;
  }
  if (gate_write(util_afile_stream(f), fmt, c, o, meta, NULL, &bytes) != 0) {
    int e = errno;
    util_afile_abort(f);
    fprintf(stderr, "cairn build: cannot write %s: %s\n", path, strerror(e));
    return 2;
  }
  if (util_afile_commit(f) != 0) {
    fprintf(stderr, "cairn build: cannot write %s: %s\n", path, strerror(errno));
    return 2;
  }
  fprintf(say, "wrote %s (%s, %llu bytes)\n", path, gate_format_name(fmt), (unsigned long long)bytes);
  return 0;
}

static void print_counts(FILE *f, const char *src, const ans_circuit *c, const gate_opts *o, const gate_counts *k) {
  fprintf(f, "%s: %d qubits, %d parameters, %d generators, %zu rotations\n", src, c->nqubits, c->nparams, c->ngens,
          c->nrot);
  fprintf(f, "lowering: %s ladder%s%s\n", o->ladder == GATE_LADDER_TREE ? "tree" : "chain",
          o->passes ? ", passes" : "", o->shortexc ? ", short excitations" : "");
  fprintf(f, "gates: cx %ld, single %ld, total %ld, depth %ld, cx depth %ld\n", k->cx, k->single, k->total, k->depth,
          k->cx_depth);
  fprintf(f, "plain cx (sum of 2(w-1) over the words): %ld\n", gate_plain_cx(c, -2));
  fprintf(f, "%6s  %-12s %8s %8s  %s\n", "gen", "kind", "cx", "single", "generator");
  if (k->ref_single || c->nref_params) {
    fprintf(f, "%6s  %-12s %8d %8ld  basis state ", "ref", "reference", 0, k->ref_single);
    for (int q = 0; q < c->nqubits; q++) fputc(pauli_get_x(c->init, q) ? '1' : '0', f);
    fprintf(f, "%s\n", c->nref_params ? " and mean-field rotations" : "");
  }
  for (int g = 0; g < c->ngens; g++)
    fprintf(f, "%6d  %-12s %8ld %8ld  %s\n", g, ans_kind_name(c->gens[g].kind), k->gen_cx[g], k->gen_single[g],
            c->gens[g].text ? c->gens[g].text : "");
}

static cJSON *counts_json(const char *src, const ans_circuit *c, const gate_counts *k) {
  cJSON *o = cJSON_CreateObject();
  cJSON_AddStringToObject(o, "file", src);
  cJSON_AddNumberToObject(o, "qubits", c->nqubits);
  cJSON_AddNumberToObject(o, "parameters", c->nparams);
  cJSON_AddItemToObject(o, "gates", gate_counts_json(k));
  cJSON_AddNumberToObject(o, "plain_cnot", (double)gate_plain_cx(c, -2));
  cJSON *gens = cJSON_AddArrayToObject(o, "generators");
  for (int g = 0; g < c->ngens; g++) {
    cJSON *e = cJSON_CreateObject();
    cJSON_AddStringToObject(e, "kind", ans_kind_name(c->gens[g].kind));
    cJSON_AddStringToObject(e, "text", c->gens[g].text ? c->gens[g].text : "");
    cJSON_AddNumberToObject(e, "cnot", (double)k->gen_cx[g]);
    cJSON_AddNumberToObject(e, "single", (double)k->gen_single[g]);
    cJSON_AddItemToArray(gens, e);
  }
  return o;
}

/* The checked recipe (point `point` of a scan) to its rotation program:
 * chemistry -> Hamiltonian -> generators -> screening and order (runner.h). */
static int recipe_circuit(const ir_recipe *r, int point, diag_ctx *d, ans_circuit *c) {
  int npoints = r->npoints > 0 ? r->npoints : 1;
  if (point < 0 || point >= npoints) {
    fprintf(stderr, "cairn build: %s has %d point%s; --point %d is out of range\n", r->path, npoints,
            npoints == 1 ? "" : "s", point);
    return 2;
  }
  return run_circuit(r, point, d, c) == 0 ? 0 : 1;
}

int cmd_build(const cmd_env *env, int argc, char **argv) {
  build_args a;
  int rc = parse_args(argc, argv, &a);
  if (rc) return rc;
  ans_circuit c;
  memset(&c, 0, sizeof c);
  const ir_emit *emits = NULL;
  int nemits = 0;
  diag_ctx *d = NULL;
  ir_recipe *recipe = NULL;
  if (!a.program) {
    d = diag_new(stderr, env->color);
    diag_set_werror(d, env->werror);
    recipe = front_load(d, a.file);
    if (!recipe || diag_errors(d)) {
      if (recipe) ir_recipe_free(recipe);
      diag_free(d);
      return 1;
    }
    if ((rc = recipe_circuit(recipe, a.point, d, &c)) != 0) {
      ir_recipe_free(recipe);
      diag_free(d);
      return rc;
    }
    emits = recipe->emits;
    nemits = recipe->nemits;
  } else {
    cJSON *j = read_json_file(a.file, "rotation program");
    if (!j) return 2;
    char err[256];
    rc = json_read_circuit(j, &c, err, sizeof err);
    cJSON_Delete(j);
    if (rc != 0) {
      fprintf(stderr, "cairn build: %s: bad rotation program: %s\n", a.file, err);
      ans_circuit_free(&c);
      return 2;
    }
  }
  double *values = NULL;
  if (c.nqubits < 1) {
    fprintf(stderr, "cairn build: %s: the program has no qubits; there is nothing to lower\n", a.file);
    rc = 2;
    goto done;
  }
  if (a.bind) {
    cJSON *r = read_json_file(a.bind, "report");
    if (!r) {
      rc = 2;
      goto done;
    }
    char err[256];
    values = gate_bind_report(r, &c, a.point, err, sizeof err);
    cJSON *pts = cJSON_GetObjectItemCaseSensitive(r, "points");
    int npts = cJSON_IsArray(pts) ? cJSON_GetArraySize(pts) : 0;
    cJSON_Delete(r);
    if (!values) {
      fprintf(stderr, "cairn build: --bind %s: %s\n", a.bind, err);
      rc = 2;
      goto done;
    }
    if (npts > 1)
      fprintf(stderr, "cairn build: note: %s has %d points; bound the values of point %d (choose with --point K)\n",
              a.bind, npts, a.point);
  }
  if (a.save) {
    cJSON *j = json_circuit(&c);
    char *s = json_print(j);
    cJSON_Delete(j);
    size_t len = strlen(s);
    s[len++] = '\n';  /* json_print's buffer has room: it held the NUL */
    int w = util_write_atomic(a.save, s, len);
    free(s);
    if (w != 0) {
      fprintf(stderr, "cairn build: cannot write %s: %s\n", a.save, strerror(errno));
      rc = 2;
      goto done;
    }
  }
  gate_meta meta = {a.file, values, a.bind};
  FILE *say = a.out && strcmp(a.out, "-") == 0 ? stderr : stdout;
  gate_counts k;
  gate_count_circuit(&c, &a.opts, &k);
  if (a.json) {
    cJSON *j = counts_json(a.file, &c, &k);
    char *s = json_print(j);
    fprintf(say, "%s\n", s);
    free(s);
    cJSON_Delete(j);
  } else {
    print_counts(say, a.file, &c, &a.opts, &k);
  }
  gate_counts_free(&k);
  rc = 0;
  if (a.out) {
    rc = write_one(a.out, a.have_format ? a.format : format_of(a.out), &c, &a.opts, &meta, a.json ? stderr : say);
  } else {
    for (int i = 0; i < nemits && rc == 0; i++) {
      gate_format f = emits[i].format == IR_EMIT_QASM2   ? GATE_FMT_QASM2
                      : emits[i].format == IR_EMIT_QASM3 ? GATE_FMT_QASM3
                                                         : GATE_FMT_LISTING;
      rc = write_one(emits[i].path, f, &c, &a.opts, &meta, a.json ? stderr : say);
    }
  }
done:
  free(values);
  ans_circuit_free(&c);
  if (recipe) ir_recipe_free(recipe);
  if (d) diag_free(d);
  return rc;
}
