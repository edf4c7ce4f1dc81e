/* cmd.h — the commands of the cairn program.  Each lives in its own file
 * src/cmd/<name>.c and returns the process exit status:
 *   0 ok, 1 the input has errors (or a check failed), 2 usage or I/O problems. */
#ifndef CAIRN_CMD_H
#define CAIRN_CMD_H

#include "cairn/diag.h"

/* Options that apply to every command (given before or after the command). */
typedef struct cmd_env {
  diag_color color;
  int werror;
} cmd_env;

typedef int (*cmd_fn)(const cmd_env *env, int argc, char **argv);

/* argv[0] is the command name; options and operands follow. */
int cmd_check(const cmd_env *env, int argc, char **argv);
int cmd_fmt(const cmd_env *env, int argc, char **argv);
int cmd_diff(const cmd_env *env, int argc, char **argv);
int cmd_show(const cmd_env *env, int argc, char **argv);
int cmd_run(const cmd_env *env, int argc, char **argv);
int cmd_build(const cmd_env *env, int argc, char **argv);
int cmd_integrals(const cmd_env *env, int argc, char **argv);

/* Usage text of a command (for `cairn help COMMAND` and usage errors), or NULL. */
const char *cmd_usage(const char *name);
/* Print "cairn NAME: message" and the usage line; returns 2. */
int cmd_usage_error(const char *name, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

#endif
