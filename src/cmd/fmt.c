/* fmt.c — `cairn fmt`.  Not built yet: fails loudly until its module lands. */
#include "config.h"

#include "cmd/cmd.h"

#include <stdio.h>

int cmd_fmt(const cmd_env *env, int argc, char **argv) {
  fprintf(stderr, "cairn fmt: this command is not built yet\n");
  return 2;
}
