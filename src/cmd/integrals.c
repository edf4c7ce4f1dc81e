/* integrals.c — `cairn integrals`.  Not built yet: fails loudly until its module lands. */
#include "config.h"

#include "cmd/cmd.h"

#include <stdio.h>

int cmd_integrals(const cmd_env *env, int argc, char **argv) {
  fprintf(stderr, "cairn integrals: this command is not built yet\n");
  return 2;
}
