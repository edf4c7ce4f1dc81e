/* testrecipe.c — hand-built recipes for the ansatz tests and check drivers. */
#include "config.h"

#include "testrecipe.h"

#include "cairn/util.h"

#include <stdlib.h>
#include <string.h>

int32_t testrecipe_text(diag_ctx *d, const char *path, ir_recipe *r, const char *const *lines, int nrules) {
  util_buf b = {0};
  util_buf_printf(&b, "reference\nkeep particles\nkeep spin-z\nkeep spin-squared\nencoding\nchoose\npool {\n");
  for (int i = 0; i < nrules; i++) util_buf_printf(&b, "  %s\n", lines[i]);
  util_buf_printf(&b, "}\n");
  int32_t file = diag_add_file(d, path, b.s, b.len);
  r->path = (char *)path; /* borrowed: these recipes never go to ir_recipe_free */
  r->reference.span = diag_line_span(d, file, 1);
  for (int s = 0; s < IR_SYM_COUNT; s++) r->keep[s].span = diag_line_span(d, file, 2 + s);
  r->encoding_span = diag_line_span(d, file, 5);
  r->choose.span = diag_line_span(d, file, 6);
  r->pool_span = diag_line_span(d, file, 7);
  return file;
}

/* One rule line into ru (zeroed first); -1 when it is not understood. */
static int parse_rule(const char *l, ir_rule *ru) {
  memset(ru, 0, sizeof *ru);
  if (strstr(l, "generalized")) ru->options |= IR_OPT_GENERALIZED;
  if (strstr(l, "paired")) ru->options |= IR_OPT_PAIRED;
  if (strstr(l, "spin-adapted")) ru->options |= IR_OPT_SPIN_ADAPTED;
  if (!strncmp(l, "qubit singles", 13)) ru->kind = IR_RULE_QUBIT_SINGLES;
  else if (!strncmp(l, "qubit doubles", 13)) ru->kind = IR_RULE_QUBIT_DOUBLES;
  else if (!strncmp(l, "singles", 7)) ru->kind = IR_RULE_SINGLES;
  else if (!strncmp(l, "doubles", 7)) ru->kind = IR_RULE_DOUBLES;
  else if (!strncmp(l, "entanglers", 10)) ru->kind = IR_RULE_ENTANGLERS;
  else if (!strncmp(l, "word ", 5)) {
    ru->kind = IR_RULE_WORD;
    ru->letters = xcalloc(strlen(l), sizeof *ru->letters);
    const char *p = l + 5;
    while (*p) {
      while (*p == ' ') p++;
      if (!*p) break;
      ru->letters[ru->nletters].letter = *p++;
      ru->letters[ru->nletters].qubit = (int)strtol(p, (char **)&p, 10);
      ru->nletters++;
    }
  } else if (!strncmp(l, "excite ", 7)) {
    ru->kind = IR_RULE_EXCITE;
    ru->from = xcalloc(strlen(l), sizeof(int));
    ru->to = xcalloc(strlen(l), sizeof(int));
    const char *p = l + 7;
    int *dst = ru->from, k = 0;
    while (*p) {
      while (*p == ' ') p++;
      if (!*p) break;
      if (*p == '-') {
        p += 2;
        ru->nexcite = k;
        dst = ru->to;
        k = 0;
        continue;
      }
      dst[k++] = (int)strtol(p, (char **)&p, 10);
    }
  } else {
    return -1;
  }
  return 0;
}

int testrecipe_rules(diag_ctx *d, int32_t file, ir_rule *rules, const char *const *lines, int nrules) {
  for (int i = 0; i < nrules; i++) {
    if (parse_rule(lines[i], &rules[i]) != 0) return i;
    rules[i].span = diag_line_span(d, file, 8 + i);
    rules[i].span.start += 2; /* after the indentation */
  }
  return nrules;
}

void testrecipe_rules_free(ir_rule *rules, int nrules) {
  for (int i = 0; i < nrules; i++) {
    free(rules[i].letters);
    free(rules[i].from);
    free(rules[i].to);
  }
}
