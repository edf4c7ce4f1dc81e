/* main.c — the cairn command line: global options, then one command. */
#include "config.h"

#include "cairn/help.h"
#include "cmd/cmd.h"

#include <cblas.h>

#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct command {
  const char *name;
  cmd_fn fn;
  const char *summary;
  const char *usage;
} command;

/* ORDER COMMANDS: the order `cairn --help` lists them in. */
static const command commands[] = {
    {"check", cmd_check, "parse, resolve and type-check recipes; print diagnostics",
     "cairn check [--werror] FILE...\n"
     "  Parse each recipe, resolve names and units, and check that the generators\n"
     "  respect the symmetries the recipe keeps.  Prints diagnostics only.\n"},
    {"fmt", cmd_fmt, "rewrite recipes in canonical layout",
     "cairn fmt [--check] FILE...\n"
     "  Rewrite each recipe in canonical layout (comments kept).  With --check,\n"
     "  print the names of files that are not formatted and exit 1; change nothing.\n"},
    {"diff", cmd_diff, "semantic difference of two recipes and of their circuits",
     "cairn diff [--json] [--no-lower] [--point K] A B\n"
     "  Say what differs in meaning between recipes A and B and, when they differ,\n"
     "  between their lowered circuits at scan point K (default 1): generators\n"
     "  added, removed or reordered, and the change in CNOT count and depth.\n"
     "  --no-lower compares meaning only (no chemistry is computed).  Exit 0 when\n"
     "  they mean the same (even if written differently), 1 when they differ.\n"},
    {"show", cmd_show, "the generator table or the qubit Hamiltonian",
     "cairn show [--json] [--hamiltonian] FILE\n"
     "  Print the ranked generator table of the recipe, or with --hamiltonian the\n"
     "  qubit Hamiltonian after encoding and tapering.\n"},
    {"run", cmd_run, "simulated optimization run (statevector)",
     "cairn run [--json OUT] [--plot FILE.svg] [--no-plot] [--points] [--no-time] FILE\n"
     "  Optimize the recipe's ansatz on a noise-free statevector and compare it with\n"
     "  the exact and classical reference energies of the active space; every point\n"
     "  of a scan.  Prints the report on the terminal.\n"
     "  --json OUT      also write the report as JSON (schema 1), and beside it a CSV\n"
     "                  table (OUT.csv) and an SVG figure (OUT.svg): the scan figure,\n"
     "                  or for one point the error against iteration\n"
     "  --plot FILE.svg write the figure (and FILE.csv) there instead\n"
     "  --no-plot       write no table or figure\n"
     "  --points        for a scan, one full block per point instead of the table\n"
     "  --no-time       leave wall-clock times out (same bytes on every run)\n"
     "  Exit 1 when a point failed or a `keep ... checked` symmetry did not hold\n"
     "  (the report is still written).\n"},
    {"build", cmd_build, "lower the ansatz to gates",
     "cairn build [-o OUT] [--format listing|qasm2|qasm3] [--bind REPORT [--point K]]\n"
     "            [--tree] [--short] [--no-passes] [--json] [--program] [--save-program F] FILE\n"
     "  Lower the recipe's ansatz to a gate circuit; print gate counts (cx, single,\n"
     "  total, depth, per generator).  Without -o, write the recipe's `emit` files;\n"
     "  `-o -` writes to standard output.  The format follows --format, else the\n"
     "  extension of OUT (.qasm, .qasm3: OpenQASM 3.0; .qasm2: OpenQASM 2.0; else\n"
     "  the listing).  --bind binds the final parameters of a `cairn run --json`\n"
     "  report (point K, default 0); --tree uses balanced cx trees (lower depth);\n"
     "  --short lowers excitations as short circuits; --no-passes skips the\n"
     "  cancellation passes; --program reads a rotation program in JSON instead of\n"
     "  a recipe; --save-program FILE writes the rotation program as JSON.\n"},
    {"integrals", cmd_integrals, "write the active-space Hamiltonian as FCIDUMP",
     "cairn integrals -o OUT.fcidump FILE\n"
     "  Compute the active-space integrals of the recipe's molecule and write them\n"
     "  in the FCIDUMP format.\n"},
};
enum { NCOMMANDS = (int)(sizeof commands / sizeof commands[0]) };

static const command *find(const char *name) {
  for (int i = 0; i < NCOMMANDS; i++)
    if (strcmp(commands[i].name, name) == 0) return &commands[i];
  return NULL;
}

const char *cmd_usage(const char *name) {
  const command *c = find(name);
  return c ? c->usage : NULL;
}

int cmd_usage_error(const char *name, const char *fmt, ...) {
  va_list ap;
  fprintf(stderr, "cairn %s: ", name);
  va_start(ap, fmt);
  vfprintf(stderr, fmt, ap);
  va_end(ap);
  fputc('\n', stderr);
  const char *u = cmd_usage(name);
  if (u) fprintf(stderr, "usage: %.*s\n", (int)strcspn(u, "\n"), u);
  return 2;
}

static void print_help(FILE *f) {
  fprintf(f,
          "cairn %s — a compiler for VQE ansatz recipes\n\n"
          "usage: cairn [--color=auto|always|never] [--werror] COMMAND [ARGS]\n\n"
          "commands:\n",
          PACKAGE_VERSION);
  for (int i = 0; i < NCOMMANDS; i++) fprintf(f, "  %-10s %s\n", commands[i].name, commands[i].summary);
  fprintf(f,
          "  %-10s %s\n\n"
          "Simulations are noise-free statevector computations; energies are exact only\n"
          "within the recipe's basis set and active space.\n",
          "help", "help on a command or a word of the recipe language (cairn help TOPIC)");
  fprintf(f, "\nhelp topics on the recipe language (cairn help TOPIC, or any keyword):\n");
  help_list(f);
}

static int cmd_help(int argc, char **argv) {
  if (argc < 2) {
    print_help(stdout);
    return 0;
  }
  const command *c = find(argv[1]);
  if (c) {
    fputs(c->usage, stdout);
    /* a command that is also a word of the language (`integrals`) */
    if (help_find(argv[1]) > 0) {
      printf("\nIn recipes:\n\n");
      help_topic(argv[1], stdout);
    }
    return 0;
  }
  if (help_topic(argv[1], stdout) > 0) return 0;
  fprintf(stderr, "cairn help: no help on `%s`; try `cairn help` for the list of topics\n", argv[1]);
  return 2;
}

/* Pull the global options out of argv wherever they stand; returns the new argc. */
static int take_globals(int argc, char **argv, cmd_env *env, int *bad) {
  int out = 0;
  for (int i = 0; i < argc; i++) {
    const char *a = argv[i];
    if (strncmp(a, "--color=", 8) == 0) {
      const char *w = a + 8;
      if (strcmp(w, "auto") == 0) env->color = DIAG_COLOR_AUTO;
      else if (strcmp(w, "always") == 0) env->color = DIAG_COLOR_ALWAYS;
      else if (strcmp(w, "never") == 0) env->color = DIAG_COLOR_NEVER;
      else {
        fprintf(stderr, "cairn: --color takes auto, always or never, not `%s`\n", w);
        *bad = 1;
      }
    } else if (strcmp(a, "--werror") == 0) {
      env->werror = 1;
    } else {
      argv[out++] = argv[i];
    }
  }
  argv[out] = NULL;
  return out;
}

int main(int argc, char **argv) {
  /* OpenMP does cairn's threading; BLAS threads on top of it only contend. */
  openblas_set_num_threads(1);
  cmd_env env = {DIAG_COLOR_AUTO, 0};
  int bad = 0;
  argc = take_globals(argc - 1, argv + 1, &env, &bad);
  argv = argv + 1;
  if (bad) return 2;
  if (argc < 1) {
    print_help(stderr);
    return 2;
  }
  if (strcmp(argv[0], "--help") == 0 || strcmp(argv[0], "-h") == 0) {
    print_help(stdout);
    return 0;
  }
  if (strcmp(argv[0], "--version") == 0) {
    printf("cairn %s\n", PACKAGE_VERSION);
    return 0;
  }
  if (strcmp(argv[0], "help") == 0) return cmd_help(argc, argv);
  const command *c = find(argv[0]);
  if (!c) {
    fprintf(stderr, "cairn: unknown command `%s`; try `cairn --help`\n", argv[0]);
    return 2;
  }
  for (int i = 1; i < argc; i++)
    if (strcmp(argv[i], "--help") == 0 || strcmp(argv[i], "-h") == 0) {
      fputs(c->usage, stdout);
      return 0;
    }
  return c->fn(&env, argc, argv);
}
