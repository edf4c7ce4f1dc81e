/* check.c — `cairn check`.  Not built yet: fails loudly until its module lands. */
#include "config.h"

#include "cmd/cmd.h"

#include <stdio.h>

int cmd_check(const cmd_env *env, int argc, char **argv) {
  fprintf(stderr, "cairn check: this command is not built yet\n");
  return 2;
}
