/* basis.c — the Gaussian-94 basis-set text format, shipped sets and user files.
 *
 * The format, line by line: `!` comments and blank lines anywhere; before the
 * first element an optional `spherical` or `cartesian` line and `****`
 * separators; then blocks
 *     SYMBOL 0
 *     TYPE NPRIM SCALE          (TYPE one of S P D F G, or SP)
 *     exponent coefficient [p-coefficient]     (NPRIM lines)
 *     ...
 *     ****
 * Numbers may use Fortran D exponents.  Exponents are multiplied by SCALE^2.
 */
#include "config.h"

#include "cairn/basis.h"
#include "cairn/element.h"
#include "cairn/util.h"
#include "chem/chem_private.h"

#include <ctype.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

static const char *const shell_letters = "SPDFG";

const char *basis_builtin_name(const char *name) {
  if (!name) return NULL;
  for (int i = 0; i < chem_basis_ntexts; i++) {
    const char *c = chem_basis_texts[i].name;
    if (strcasecmp(name, c) == 0) return c;
    /* `6-31gs` spells `6-31g*` without the star. */
    size_t n = strlen(c);
    if (n > 1 && c[n - 1] == '*' && strlen(name) == n && strncasecmp(name, c, n - 1) == 0 &&
        (name[n - 1] == 's' || name[n - 1] == 'S'))
      return c;
  }
  return NULL;
}

const char *basis_builtin_list(void) { return "sto-3g, 6-31g, 6-31g* (also 6-31gs), cc-pvdz"; }

static const char *builtin_text(const char *canonical) {
  for (int i = 0; i < chem_basis_ntexts; i++)
    if (strcmp(chem_basis_texts[i].name, canonical) == 0) return chem_basis_texts[i].text;
  return NULL;
}

void basis_set_free(basis_set *b) {
  if (!b) return;
  for (int z = 0; z <= BASIS_MAXZ; z++) {
    for (int s = 0; s < b->elem[z].nshells; s++) {
      free(b->elem[z].shells[s].exps);
      free(b->elem[z].shells[s].coefs);
    }
    free(b->elem[z].shells);
  }
  free(b->name);
  memset(b, 0, sizeof *b);
}

int basis_element_size(const basis_set *b, int z) {
  if (z < 1 || z > BASIS_MAXZ) return 0;
  int n = 0;
  for (int s = 0; s < b->elem[z].nshells; s++) n += basis_shell_size(b->elem[z].shells[s].l, b->spherical);
  return n;
}

/* Parser state: the text, where we are, and the element being read. */
typedef struct parser {
  diag_ctx *d;
  int32_t file;
  const char *text;
  uint32_t len;
  uint32_t pos;        /* start of the next line */
  int line;            /* 1-based number of the current line */
  int errors;
  basis_set *out;
  size_t cap[BASIS_MAXZ + 1];
  int first_line[BASIS_MAXZ + 1];
  int declared;        /* 0 none, 1 spherical, 2 cartesian */
  int high_l_at_z;     /* an element with l >= 2 shells (for the declaration check) */
  int high_l_letter;
  chem_tok high_l_tok;
} parser;

static void perr(parser *p, diag_span where, const char *fmt, ...) __attribute__((format(printf, 3, 4)));
static void perr(parser *p, diag_span where, const char *fmt, ...) {
  va_list ap;
  va_start(ap, fmt);
  diag_vreport(p->d, DIAG_ERROR, p->file >= 0 ? where : DIAG_NOWHERE, fmt, ap);
  va_end(ap);
  p->errors++;
}

/* Read the next line into [*s, *e); 0 at end of text. */
static int next_line(parser *p, uint32_t *s, uint32_t *e) {
  if (p->pos >= p->len) return 0;
  *s = p->pos;
  uint32_t i = p->pos;
  while (i < p->len && p->text[i] != '\n') i++;
  *e = i;
  p->pos = i < p->len ? i + 1 : i;
  p->line++;
  return 1;
}

/* 1 when the line is blank or a comment. */
static int skip_line(const char *text, uint32_t s, uint32_t e) {
  while (s < e && isspace((unsigned char)text[s])) s++;
  return s >= e || text[s] == '!';
}

static int tok_is(const chem_tok *t, const char *w) {
  return (int)strlen(w) == t->len && strncasecmp(t->s, w, (size_t)t->len) == 0;
}

static diag_span line_span(parser *p, uint32_t s, uint32_t e) { return (diag_span){p->file, s, e}; }

static void add_shell(parser *p, int z, int l, int nprim, const double *ex, const double *co) {
  basis_element *el = &p->out->elem[z];
  UTIL_GROW(el->shells, p->cap[z], (size_t)el->nshells + 1);
  basis_shell *sh = &el->shells[el->nshells++];
  sh->l = l;
  sh->nprim = nprim;
  sh->exps = xmalloc((size_t)nprim * sizeof *sh->exps);
  sh->coefs = xmalloc((size_t)nprim * sizeof *sh->coefs);
  memcpy(sh->exps, ex, (size_t)nprim * sizeof *ex);
  memcpy(sh->coefs, co, (size_t)nprim * sizeof *co);
}

/* Read the shells of element z up to its `****`.  Returns 0 at `****`, -1 at
 * the end of the text. */
static int read_element(parser *p, int z, const char *sym, diag_span head) {
  uint32_t s, e;
  chem_tok t[8];
  int nsh = 0;
  while (next_line(p, &s, &e)) {
    if (skip_line(p->text, s, e)) continue;
    int n = chem_split(p->text, s, e, NULL, t, 8);
    if (n == 1 && t[0].len == 4 && strncmp(t[0].s, "****", 4) == 0) {
      if (nsh == 0) perr(p, head, "element `%s` has no shells", sym);
      return 0;
    }
    /* a shell line: TYPE NPRIM SCALE */
    if (n != 3) {
      perr(p, line_span(p, s, e), "shell line of `%s`: expected `TYPE NPRIM SCALE`, found %d field%s", sym,
           n, n == 1 ? "" : "s");
      goto resync;
    }
    int l = -1, sp = 0;
    if (tok_is(&t[0], "SP") || tok_is(&t[0], "L")) sp = 1, l = 0;
    else if (t[0].len == 1) {
      const char *c = strchr(shell_letters, toupper((unsigned char)t[0].s[0]));
      if (c && *c) l = (int)(c - shell_letters);
    }
    if (l < 0) {
      perr(p, chem_tok_span(p->file, &t[0]), "unknown shell type `%.*s` (expected S, P, D, F, G or SP)",
           t[0].len, t[0].s);
      goto resync;
    }
    char shname[4];
    snprintf(shname, sizeof shname, "%s", sp ? "SP" : (char[]){shell_letters[l], 0});
    int nprim;
    if (chem_tok_int(&t[1], &nprim) != 0 || nprim < 1) {
      perr(p, chem_tok_span(p->file, &t[1]), "number of primitives must be a positive integer, found `%.*s`",
           t[1].len, t[1].s);
      goto resync;
    }
    double scale;
    if (chem_tok_double(&t[2], &scale) != 0 || !isfinite(scale) || scale <= 0) {
      perr(p, chem_tok_span(p->file, &t[2]), "scale factor must be a positive number, found `%.*s`", t[2].len,
           t[2].s);
      goto resync;
    }
    /* each primitive takes a line: a count beyond the lines left is an error,
     * not an allocation (counted only for counts no real set uses) */
    if (nprim > 64) {
      uint32_t left = 0;
      for (uint32_t i = p->pos; i < p->len; i++) left += p->text[i] == '\n';
      if (p->pos < p->len && p->text[p->len - 1] != '\n') left++;
      if ((uint32_t)nprim > left) {
        perr(p, chem_tok_span(p->file, &t[1]),
             "the %s shell of `%s` announces %d primitives but only %u line%s follow%s", shname, sym, nprim, left,
             left == 1 ? "" : "s", left == 1 ? "s" : "");
        goto resync;
      }
    }
    if (l >= 2 && !p->high_l_at_z) {
      p->high_l_at_z = z;
      p->high_l_letter = shell_letters[l];
      p->high_l_tok = t[0];
    }
    double *ex = xmalloc((size_t)nprim * sizeof *ex);
    double *c1 = xmalloc((size_t)nprim * sizeof *c1);
    double *c2 = xmalloc((size_t)nprim * sizeof *c2);
    int got = 0, bad = 0;
    int want = sp ? 3 : 2;
    while (got < nprim && next_line(p, &s, &e)) {
      if (skip_line(p->text, s, e)) continue;
      int m = chem_split(p->text, s, e, NULL, t, 8);
      if (m == 1 && t[0].len == 4 && strncmp(t[0].s, "****", 4) == 0) {
        perr(p, line_span(p, s, e), "the %s shell of `%s` has %d primitive%s but only %d %s given", shname, sym,
             nprim, nprim == 1 ? "" : "s", got, got == 1 ? "is" : "are");
        free(ex), free(c1), free(c2);
        return 0;
      }
      got++;
      if (m != want) {
        perr(p, line_span(p, s, e),
             "primitive %d of the %s shell of `%s`: expected %d numbers (exponent, %s), found %d", got, shname,
             sym, want, sp ? "s and p coefficients" : "coefficient", m);
        bad = 1;
        continue;
      }
      double v;
      if (chem_tok_double(&t[0], &v) != 0 || !isfinite(v) || v <= 0) {
        perr(p, chem_tok_span(p->file, &t[0]),
             "primitive %d of the %s shell of `%s`: exponent must be a positive finite number, found `%.*s`",
             got, shname, sym, t[0].len, t[0].s);
        bad = 1;
      } else ex[got - 1] = v * scale * scale;
      for (int k = 1; k < want; k++) {
        if (chem_tok_double(&t[k], &v) != 0 || !isfinite(v)) {
          perr(p, chem_tok_span(p->file, &t[k]),
               "primitive %d of the %s shell of `%s`: coefficient must be a finite number, found `%.*s`", got,
               shname, sym, t[k].len, t[k].s);
          bad = 1;
        } else (k == 1 ? c1 : c2)[got - 1] = v;
      }
    }
    if (got < nprim) {
      perr(p, head, "file ends inside the block of `%s`: expected `****`", sym);
      free(ex), free(c1), free(c2);
      return -1;
    }
    if (!bad) {
      add_shell(p, z, l, nprim, ex, c1);
      if (sp) add_shell(p, z, 1, nprim, ex, c2);
    }
    nsh++;
    free(ex), free(c1), free(c2);
    continue;
  resync:
    /* skip to the element's `****` so one mistake gives one message */
    while (next_line(p, &s, &e)) {
      int m = chem_split(p->text, s, e, NULL, t, 2);
      if (m == 1 && t[0].len == 4 && strncmp(t[0].s, "****", 4) == 0) return 0;
    }
    perr(p, head, "file ends inside the block of `%s`: expected `****`", sym);
    return -1;
  }
  perr(p, head, "file ends inside the block of `%s`: expected `****`", sym);
  return -1;
}

int basis_parse(diag_ctx *d, int32_t file, const char *text, size_t len, const char *name, basis_set *out) {
  memset(out, 0, sizeof *out);
  parser p = {.d = d, .file = file, .text = text, .len = (uint32_t)len, .out = out};
  uint32_t s, e;
  chem_tok t[8];
  int nelem = 0;
  while (next_line(&p, &s, &e)) {
    if (skip_line(text, s, e)) continue;
    int n = chem_split(text, s, e, NULL, t, 8);
    if (n == 1 && t[0].len == 4 && strncmp(t[0].s, "****", 4) == 0) continue;
    if (n == 1 && (tok_is(&t[0], "spherical") || tok_is(&t[0], "cartesian"))) {
      int kind = tok_is(&t[0], "spherical") ? 1 : 2;
      if (nelem > 0)
        perr(&p, chem_tok_span(file, &t[0]), "`%.*s` must come before the first element", t[0].len, t[0].s);
      else if (p.declared && p.declared != kind)
        perr(&p, chem_tok_span(file, &t[0]), "the file declares both `spherical` and `cartesian`");
      p.declared = kind;
      continue;
    }
    int z = element_z(t[0].s, t[0].len);
    if (z == 0) {
      if (nelem == 0 && n == 1)
        perr(&p, chem_tok_span(file, &t[0]),
             "expected `spherical`, `cartesian`, `****` or an element line, found `%.*s`", t[0].len, t[0].s);
      else
        perr(&p, chem_tok_span(file, &t[0]), "unknown element `%.*s` in the element line", t[0].len, t[0].s);
      /* skip this block */
      while (next_line(&p, &s, &e)) {
        int m = chem_split(text, s, e, NULL, t, 2);
        if (m == 1 && t[0].len == 4 && strncmp(t[0].s, "****", 4) == 0) break;
      }
      continue;
    }
    diag_span head = chem_tok_span(file, &t[0]);
    const char *sym = element_symbol(z);
    if (n > 2 || (n == 2 && !tok_is(&t[1], "0"))) {
      perr(&p, line_span(&p, s, e), "element line: expected `%s 0`, found `%.*s`", sym, (int)(e - s),
           text + s);
    }
    int dup = out->elem[z].nshells > 0 || p.first_line[z] > 0;
    if (dup) {
      perr(&p, head, "element `%s` appears twice (first at line %d)", sym, p.first_line[z]);
      /* read it into a scratch set so its own errors are still found */
      basis_set scratch;
      memset(&scratch, 0, sizeof scratch);
      basis_set *keep = p.out;
      size_t capz = p.cap[z];
      p.out = &scratch;
      p.cap[z] = 0;
      int r = read_element(&p, z, sym, head);
      p.out = keep;
      p.cap[z] = capz;
      basis_set_free(&scratch);
      if (r < 0) break;
      continue;
    }
    p.first_line[z] = p.line;
    nelem++;
    if (read_element(&p, z, sym, head) < 0) break;
  }
  if (nelem == 0 && p.errors == 0) perr(&p, (diag_span){file, 0, 0}, "no elements found in the basis file");
  if (p.high_l_at_z && !p.declared && p.errors == 0) {
    perr(&p, chem_tok_span(file, &p.high_l_tok),
         "the %c shell of `%s` needs a `spherical` or `cartesian` line at the top of the file",
         p.high_l_letter, element_symbol(p.high_l_at_z));
    diag_help(d, "`spherical` gives 2l+1 functions per shell, `cartesian` (l+1)(l+2)/2; "
                 "the publication of the basis set says which one it was made for");
  }
  if (p.errors) {
    basis_set_free(out);
    return -1;
  }
  out->spherical = p.declared != 2;
  out->name = xstrdup(name);
  return 0;
}

int basis_load(diag_ctx *d, const char *name, const char *path, diag_span from, basis_set *out) {
  memset(out, 0, sizeof *out);
  if (path) {
    int32_t f = chem_file_index(d, path, from);
    if (f < 0) return -1;
    size_t len;
    const char *text = diag_file_text(d, f, &len);
    return basis_parse(d, f, text, len, path, out);
  }
  const char *c = basis_builtin_name(name);
  if (!c) {
    diag_report(d, DIAG_ERROR, from, "unknown basis set `%s`", name ? name : "");
    diag_help(d, "the shipped sets are %s; or write `basis file \"mine.gbs\"` (Gaussian-94 format)",
              basis_builtin_list());
    return -1;
  }
  const char *text = builtin_text(c);
  if (basis_parse(d, -1, text, strlen(text), c, out) != 0) return -1;
  out->builtin = 1;
  return 0;
}
