/* fcidump.c — FCIDUMP reader (validating) and writer; see fcidump.h. */
#include "config.h"

#include "cairn/fcidump.h"
#include "cairn/util.h"
#include "chem/chem_private.h"

#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

/* Header scanner over the registered text. */
typedef struct hscan {
  diag_ctx *d;
  int32_t file;
  const char *t;
  uint32_t len, pos;
  int errors;
} hscan;

static void herr(hscan *h, uint32_t s, uint32_t e, const char *fmt, ...) __attribute__((format(printf, 4, 5)));
static void herr(hscan *h, uint32_t s, uint32_t e, const char *fmt, ...) {
  va_list ap;
  va_start(ap, fmt);
  diag_vreport(h->d, DIAG_ERROR, (diag_span){h->file, s, e}, fmt, ap);
  va_end(ap);
  h->errors++;
}

static void skip_sep(hscan *h) {
  while (h->pos < h->len) {
    char c = h->t[h->pos];
    if (c == ',' || isspace((unsigned char)c)) h->pos++;
    else break;
  }
}

static int is_name_start(char c) { return isalpha((unsigned char)c) || c == '_'; }
static int is_name_char(char c) { return isalnum((unsigned char)c) || c == '_'; }

/* At an end marker (`&END`, `$END`, `/`)?  Returns its length or 0. */
static int at_end(const hscan *h) {
  const char *p = h->t + h->pos;
  uint32_t left = h->len - h->pos;
  if (left >= 1 && p[0] == '/') return 1;
  if (left >= 4 && (p[0] == '&' || p[0] == '$') && strncasecmp(p + 1, "END", 3) == 0 &&
      (left == 4 || !is_name_char(p[4])))
    return 4;
  return 0;
}

/* At `NAME =`?  Returns the name length or 0 (does not move). */
static int at_key(const hscan *h) {
  uint32_t i = h->pos;
  if (i >= h->len || !is_name_start(h->t[i])) return 0;
  while (i < h->len && is_name_char(h->t[i])) i++;
  uint32_t n = i - h->pos;
  while (i < h->len && (h->t[i] == ' ' || h->t[i] == '\t')) i++;
  return i < h->len && h->t[i] == '=' ? (int)n : 0;
}

/* A field's values as tokens. */
enum { MAXVALS = 4096 };
typedef struct hfield {
  chem_tok name;
  chem_tok *vals;
  int nvals;
  size_t cap;
} hfield;

static int key_is(const chem_tok *t, const char *w) {
  return (int)strlen(w) == t->len && strncasecmp(t->s, w, (size_t)t->len) == 0;
}

static int parse_logical(const chem_tok *t, int *v) {
  char b[16];
  int n = 0;
  for (int i = 0; i < t->len && n < 15; i++)
    if (t->s[i] != '.') b[n++] = (char)toupper((unsigned char)t->s[i]);
  b[n] = 0;
  if (strcmp(b, "T") == 0 || strcmp(b, "TRUE") == 0) return *v = 1, 0;
  if (strcmp(b, "F") == 0 || strcmp(b, "FALSE") == 0) return *v = 0, 0;
  return -1;
}

/* One integer field: exactly one value, an integer. */
static int int_field(hscan *h, const hfield *f, int *out) {
  if (f->nvals != 1) {
    herr(h, f->name.off, f->name.off + (uint32_t)f->name.len, "%.*s takes one value, found %d", f->name.len,
         f->name.s, f->nvals);
    return -1;
  }
  if (chem_tok_int(&f->vals[0], out) != 0) {
    herr(h, f->vals[0].off, f->vals[0].off + (uint32_t)f->vals[0].len, "%.*s must be an integer, found `%.*s`",
         f->name.len, f->name.s, f->vals[0].len, f->vals[0].s);
    return -1;
  }
  return 0;
}

int fcidump_parse_header(diag_ctx *d, int32_t file, fcidump_header *hd) {
  size_t len;
  const char *text = diag_file_text(d, file, &len);
  hscan h = {.d = d, .file = file, .t = text, .len = (uint32_t)len};
  memset(hd, 0, sizeof *hd);
  skip_sep(&h);
  uint32_t s = h.pos;
  while (h.pos < h.len && !isspace((unsigned char)text[h.pos]) && text[h.pos] != ',') h.pos++;
  hd->start = (diag_span){file, s, h.pos};
  if (!(h.pos - s == 4 && (text[s] == '&' || text[s] == '$') && strncasecmp(text + s + 1, "FCI", 3) == 0)) {
    if (h.pos == s) herr(&h, s, s, "expected `&FCI` at the start of an FCIDUMP file, found the end of the file");
    else herr(&h, s, h.pos, "expected `&FCI` at the start of an FCIDUMP file, found `%.*s`", (int)(h.pos - s), text + s);
    return -1;
  }
  hfield fields[16];
  int nf = 0;
  int ended = 0;
  for (;;) {
    skip_sep(&h);
    if (h.pos >= h.len) break;
    int e = at_end(&h);
    if (e) {
      h.pos += (uint32_t)e;
      ended = 1;
      break;
    }
    int kl = at_key(&h);
    if (!kl) {
      uint32_t b = h.pos;
      while (h.pos < h.len && !isspace((unsigned char)text[h.pos]) && text[h.pos] != ',') h.pos++;
      herr(&h, b, h.pos, "expected a header field `NAME=value` or `&END`, found `%.*s`", (int)(h.pos - b), text + b);
      continue;
    }
    chem_tok name = {text + h.pos, kl, h.pos};
    h.pos += (uint32_t)kl;
    while (text[h.pos] != '=') h.pos++;
    h.pos++;
    hfield f = {.name = name};
    for (;;) {
      skip_sep(&h);
      if (h.pos >= h.len || at_end(&h) || at_key(&h)) break;
      uint32_t b = h.pos;
      while (h.pos < h.len && !isspace((unsigned char)text[h.pos]) && text[h.pos] != ',' && text[h.pos] != '=' &&
             !(text[h.pos] == '/' || ((text[h.pos] == '&' || text[h.pos] == '$') && at_end(&h))))
        h.pos++;
      if (h.pos == b) {  /* a stray `=` */
        herr(&h, b, b + 1, "unexpected `%c` in the value of %.*s", text[b], name.len, name.s);
        h.pos++;
        continue;
      }
      UTIL_GROW(f.vals, f.cap, (size_t)f.nvals + 1);
      f.vals[f.nvals++] = (chem_tok){text + b, (int)(h.pos - b), b};
    }
    int dup = -1;
    for (int i = 0; i < nf; i++)
      if (fields[i].name.len == name.len && strncasecmp(fields[i].name.s, name.s, (size_t)name.len) == 0) dup = i;
    if (dup >= 0 || nf == 16) {
      if (dup >= 0) {
        int line, col;
        diag_line_col(d, file, fields[dup].name.off, &line, &col);
        herr(&h, name.off, name.off + (uint32_t)name.len, "field %.*s is given twice (first at line %d)", name.len,
             name.s, line);
      } else herr(&h, name.off, name.off + (uint32_t)name.len, "too many header fields (limit is 16)");
      free(f.vals);
      continue;
    }
    fields[nf++] = f;
  }
  if (!ended) {
    /* without its end the records were read as header values: say only this */
    herr(&h, hd->start.start, hd->start.end, "the &FCI header does not end: expected `&END` or `/`");
    for (int i = 0; i < nf; i++) free(fields[i].vals);
    return -1;
  }
  /* the records start on the line after the end marker */
  while (h.pos < h.len && text[h.pos] != '\n') h.pos++;
  if (h.pos < h.len) h.pos++;
  hd->body = h.pos;

  int have_norb = 0, have_nelec = 0, have_ms2 = 0, norbsym = -1;
  diag_span nelec_at = hd->start, ms2_at = hd->start;
  const hfield *orbsym = NULL;
  hd->isym = 1;
  for (int i = 0; i < nf; i++) {
    const hfield *f = &fields[i];
    uint32_t ns = f->name.off, ne = f->name.off + (uint32_t)f->name.len;
    if (key_is(&f->name, "NORB")) {
      if (int_field(&h, f, &hd->norb) == 0) {
        if (hd->norb < 1) herr(&h, f->vals[0].off, f->vals[0].off + (uint32_t)f->vals[0].len,
                               "NORB must be a positive integer, found `%.*s`", f->vals[0].len, f->vals[0].s);
        else have_norb = 1;
      }
    } else if (key_is(&f->name, "NELEC")) {
      if (int_field(&h, f, &hd->nelec) == 0) {
        if (hd->nelec < 0) herr(&h, f->vals[0].off, f->vals[0].off + (uint32_t)f->vals[0].len,
                                "NELEC must not be negative, found `%.*s`", f->vals[0].len, f->vals[0].s);
        else have_nelec = 1;
        nelec_at = chem_tok_span(file, &f->name);
      }
    } else if (key_is(&f->name, "MS2")) {
      if (int_field(&h, f, &hd->ms2) == 0) have_ms2 = 1;
      ms2_at = chem_tok_span(file, &f->name);
    } else if (key_is(&f->name, "ISYM")) {
      if (int_field(&h, f, &hd->isym) == 0 && (hd->isym < 1 || hd->isym > 8))
        herr(&h, f->vals[0].off, f->vals[0].off + (uint32_t)f->vals[0].len, "ISYM must be 1..8, found `%.*s`",
             f->vals[0].len, f->vals[0].s);
    } else if (key_is(&f->name, "UHF") || key_is(&f->name, "IUHF")) {
      int v = 0;
      int ok = f->nvals == 1 && (parse_logical(&f->vals[0], &v) == 0 || chem_tok_int(&f->vals[0], &v) == 0);
      if (!ok) {
        herr(&h, ns, ne, "%.*s must be .TRUE. or .FALSE.", f->name.len, f->name.s);
      } else if (v) {
        hd->uhf = 1;
        herr(&h, f->vals[0].off, f->vals[0].off + (uint32_t)f->vals[0].len,
             "unrestricted FCIDUMP files (%.*s=%.*s) are not supported", f->name.len, f->name.s, f->vals[0].len,
             f->vals[0].s);
        diag_help(d, "write the file from restricted (RHF or ROHF) orbitals: one set of orbitals for both spins");
      }
    } else if (key_is(&f->name, "ORBSYM")) {
      orbsym = f;
      norbsym = f->nvals;
      for (int k = 0; k < f->nvals; k++) {
        int v;
        if (chem_tok_int(&f->vals[k], &v) != 0 || v < 1 || v > 8) {
          herr(&h, f->vals[k].off, f->vals[k].off + (uint32_t)f->vals[k].len,
               "ORBSYM entries must be irreducible representations 1..8, found `%.*s`", f->vals[k].len,
               f->vals[k].s);
          break;
        }
      }
    } else {
      diag_report(d, DIAG_WARNING, (diag_span){file, ns, ne}, "header field %.*s is not used by cairn; ignored",
                  f->name.len, f->name.s);
    }
  }
  for (int i = 0; i < nf; i++) free(fields[i].vals);
  if (!have_norb && !h.errors) herr(&h, hd->start.start, hd->start.end, "the &FCI header has no NORB field");
  if (!have_nelec && !h.errors) herr(&h, hd->start.start, hd->start.end, "the &FCI header has no NELEC field");
  if (h.errors) return -1;
  if (!have_ms2) hd->ms2 = 0; /* Knowles & Handy: MS2 defaults to 0 */
  if (orbsym && norbsym != hd->norb)
    herr(&h, orbsym->name.off, orbsym->name.off + (uint32_t)orbsym->name.len, "ORBSYM has %d entr%s, NORB is %d",
         norbsym, norbsym == 1 ? "y" : "ies", hd->norb);
  if (hd->ms2 < 0) {
    herr(&h, ms2_at.start, ms2_at.end, "MS2 = %d is negative", hd->ms2);
    diag_help(d, "cairn takes the component with more alpha electrons: write MS2=%d (the energies are the same)",
              -hd->ms2);
  } else if ((hd->nelec + hd->ms2) % 2 != 0) {
    herr(&h, nelec_at.start, nelec_at.end, "NELEC = %d and MS2 = %d do not agree: NELEC + MS2 must be even",
         hd->nelec, hd->ms2);
  } else if (hd->ms2 > hd->nelec) {
    herr(&h, ms2_at.start, ms2_at.end, "MS2 = %d exceeds NELEC = %d", hd->ms2, hd->nelec);
  } else if ((hd->nelec + hd->ms2) / 2 > hd->norb) {
    herr(&h, nelec_at.start, nelec_at.end, "NELEC = %d with MS2 = %d does not fit in NORB = %d orbitals",
         hd->nelec, hd->ms2, hd->norb);
  }
  return h.errors ? -1 : 0;
}

/* Packed index of a symmetric pair p >= q. */
static inline long pair(int p, int q) { return p >= q ? (long)p * (p + 1) / 2 + q : (long)q * (q + 1) / 2 + p; }

static const char *const idx_names[4] = {"i", "j", "k", "l"};

int fcidump_read_file(diag_ctx *d, int32_t file, chem_space *out) {
  memset(out, 0, sizeof *out);
  fcidump_header hd;
  if (fcidump_parse_header(d, file, &hd) != 0) return -1;
  size_t len;
  const char *text = diag_file_text(d, file, &len);
  int n = hd.norb;
  long npair = (long)n * (n + 1) / 2;
  long nquad = npair * (npair + 1) / 2;
  double need = (double)n * n * n * n * 8.0 + (double)nquad * 4.0;
  uint64_t avail = util_mem_available();
  if (avail && need > 0.8 * (double)avail) {
    diag_report(d, DIAG_ERROR, hd.start, "NORB = %d needs %.1f GiB for the integrals; %.1f GiB are available", n,
                need / 1073741824.0, (double)avail / 1073741824.0);
    return -1;
  }
  double *h1 = xcalloc((size_t)n * n, sizeof *h1);
  double *h2 = xcalloc((size_t)n * n * n * n, sizeof *h2);
  double *eps = xcalloc((size_t)n, sizeof *eps);
  int *seen2 = xcalloc((size_t)nquad, sizeof *seen2);  /* line of first record, 0 = none */
  int *seen1 = xcalloc((size_t)npair, sizeof *seen1);
  int *seene = xcalloc((size_t)n, sizeof *seene);
  int seenc = 0, neps = 0, first_eps = 0;
  uint32_t first_eps_off = 0;
  double core = 0;
  int errors = 0;
  uint32_t pos = hd.body;
  int line;
  {
    int c;
    diag_line_col(d, file, pos, &line, &c);
  }
  if (pos >= len) line++;
  for (; pos < len; line++) {
    uint32_t s = pos, e = pos;
    while (e < len && text[e] != '\n') e++;
    pos = e < len ? e + 1 : e;
    chem_tok t[6];
    int nt = chem_split(text, s, e, NULL, t, 6);
    if (nt == 0) continue;
    if (nt != 5) {
      diag_report(d, DIAG_ERROR, (diag_span){file, s, e}, "expected a record `value i j k l`, found %d field%s", nt,
                  nt == 1 ? "" : "s");
      errors++;
      continue;
    }
    double v;
    if (chem_tok_double(&t[0], &v) != 0) {
      diag_report(d, DIAG_ERROR, chem_tok_span(file, &t[0]), "integral value must be a number, found `%.*s`",
                  t[0].len, t[0].s);
      errors++;
      continue;
    }
    if (!isfinite(v)) {
      diag_report(d, DIAG_ERROR, chem_tok_span(file, &t[0]), "integral value is not finite (`%.*s`)", t[0].len,
                  t[0].s);
      errors++;
      continue;
    }
    int ix[4], bad = 0;
    for (int k = 0; k < 4 && !bad; k++) {
      if (chem_tok_int(&t[k + 1], &ix[k]) != 0) {
        diag_report(d, DIAG_ERROR, chem_tok_span(file, &t[k + 1]), "index %s must be an integer, found `%.*s`",
                    idx_names[k], t[k + 1].len, t[k + 1].s);
        bad = 1;
      } else if (ix[k] < 0 || ix[k] > n) {
        diag_report(d, DIAG_ERROR, chem_tok_span(file, &t[k + 1]), "index %s = %d is out of range 0..%d (NORB = %d)",
                    idx_names[k], ix[k], n, n);
        bad = 1;
      }
    }
    if (bad) {
      errors++;
      continue;
    }
    int i = ix[0] - 1, j = ix[1] - 1, k = ix[2] - 1, l = ix[3] - 1;
    int nz = (ix[0] > 0) + (ix[1] > 0) + (ix[2] > 0) + (ix[3] > 0);
    char vb[32], ob[32];
    if (nz == 4) {
      long ij = pair(i, j), kl = pair(k, l);
      long q = ij >= kl ? ij * (ij + 1) / 2 + kl : kl * (kl + 1) / 2 + ij;
      double old = h2[chem_h2_index(n, i, j, k, l)];
      if (seen2[q] && fabs(old - v) > 1e-10 * fmax(1.0, fabs(v))) {
        diag_report(d, DIAG_ERROR, chem_tok_span(file, &t[0]),
                    "(%d %d|%d %d) is given twice with different values: %s here, %s at line %d", ix[0], ix[1], ix[2],
                    ix[3], util_fmt_double(vb, v), util_fmt_double(ob, old), seen2[q]);
        errors++;
        continue;
      }
      if (!seen2[q]) seen2[q] = line;
      int p4[8][4] = {{i, j, k, l}, {j, i, k, l}, {i, j, l, k}, {j, i, l, k},
                      {k, l, i, j}, {l, k, i, j}, {k, l, j, i}, {l, k, j, i}};
      for (int m = 0; m < 8; m++) h2[chem_h2_index(n, p4[m][0], p4[m][1], p4[m][2], p4[m][3])] = v;
    } else if (nz == 2 && ix[0] > 0 && ix[1] > 0) {
      long q = pair(i, j);
      double old = h1[i * n + j];
      if (seen1[q] && fabs(old - v) > 1e-10 * fmax(1.0, fabs(v))) {
        diag_report(d, DIAG_ERROR, chem_tok_span(file, &t[0]),
                    "h(%d,%d) is given twice with different values: %s here, %s at line %d", ix[0], ix[1],
                    util_fmt_double(vb, v), util_fmt_double(ob, old), seen1[q]);
        errors++;
        continue;
      }
      if (!seen1[q]) seen1[q] = line;
      h1[i * n + j] = h1[j * n + i] = v;
    } else if (nz == 1 && ix[0] > 0) {
      if (seene[i] && fabs(eps[i] - v) > 1e-10 * fmax(1.0, fabs(v))) {
        diag_report(d, DIAG_ERROR, chem_tok_span(file, &t[0]),
                    "the orbital energy of %d is given twice with different values: %s here, %s at line %d", ix[0],
                    util_fmt_double(vb, v), util_fmt_double(ob, eps[i]), seene[i]);
        errors++;
        continue;
      }
      if (!seene[i]) {
        seene[i] = line;
        neps++;
        if (!first_eps) first_eps = line, first_eps_off = t[0].off;
      }
      eps[i] = v;
    } else if (nz == 0) {
      if (seenc && fabs(core - v) > 1e-10 * fmax(1.0, fabs(v))) {
        diag_report(d, DIAG_ERROR, chem_tok_span(file, &t[0]),
                    "the core energy (0 0 0 0) is given twice with different values: %s here, %s at line %d",
                    util_fmt_double(vb, v), util_fmt_double(ob, core), seenc);
        errors++;
        continue;
      }
      if (!seenc) seenc = line;
      core = v;
    } else {
      diag_report(d, DIAG_ERROR, (diag_span){file, t[1].off, t[4].off + (uint32_t)t[4].len},
                  "indices (%d %d %d %d) are not an FCIDUMP record", ix[0], ix[1], ix[2], ix[3]);
      diag_help(d, "records are (ij|kl): i j k l > 0; h_ij: i j > 0, k = l = 0; orbital energy: i > 0, "
                   "j = k = l = 0; constant: 0 0 0 0");
      errors++;
    }
  }
  if (!errors && !seenc) {
    diag_report(d, DIAG_ERROR, hd.start, "the file has no core energy record `value 0 0 0 0`");
    diag_help(d, "give the nuclear repulsion plus frozen-core energy as `E 0 0 0 0`, or `0.0 0 0 0 0` if there is none");
    errors++;
  }
  if (!errors && neps > 0 && neps < n) {
    diag_report(d, DIAG_ERROR, (diag_span){file, first_eps_off, first_eps_off + 1},
                "orbital energies (i 0 0 0) are given for %d of %d orbitals", neps, n);
    errors++;
  }
  free(seen2);
  free(seen1);
  free(seene);
  if (errors) {
    free(h1);
    free(h2);
    free(eps);
    return -1;
  }
  out->norb = n;
  out->nalpha = (hd.nelec + hd.ms2) / 2;
  out->nbeta = (hd.nelec - hd.ms2) / 2;
  out->e_nuclear = 0;
  out->e_constant = core;
  out->h1 = h1;
  out->h2 = h2;
  if (neps == n) out->orbital_energies = eps;
  else free(eps);
  return 0;
}

int fcidump_read(diag_ctx *d, const char *path, diag_span from, chem_space *out) {
  memset(out, 0, sizeof *out);
  int32_t f = chem_file_index(d, path, from);
  if (f < 0) return -1;
  return fcidump_read_file(d, f, out);
}

int chem_fcidump_header(const char *path, diag_span from, diag_ctx *d, int *norb, int *nelec, int *ms2) {
  int32_t f = chem_file_index(d, path, from);
  if (f < 0) return -1;
  fcidump_header h;
  if (fcidump_parse_header(d, f, &h) != 0) return -1;
  *norb = h.norb;
  *nelec = h.nelec;
  *ms2 = h.ms2;
  return 0;
}

int fcidump_write(const chem_space *s, const char *path) {
  util_afile *a = util_afile_open(path);
  if (!a) return -1;
  FILE *f = util_afile_stream(a);
  int n = s->norb;
  fprintf(f, "&FCI NORB=%d,NELEC=%d,MS2=%d,\n ORBSYM=", n, s->nalpha + s->nbeta, s->nalpha - s->nbeta);
  for (int p = 0; p < n; p++) fprintf(f, "1,%s", (p + 1) % 20 == 0 && p + 1 < n ? "\n  " : "");
  fprintf(f, "\n ISYM=1,\n UHF=.FALSE.,\n&END\n");
  for (int i = 0; i < n; i++)
    for (int j = 0; j <= i; j++)
      for (int k = 0; k <= i; k++)
        for (int l = 0; l <= (k == i ? j : k); l++) {
          double v = s->h2[chem_h2_index(n, i, j, k, l)];
          if (v != 0.0) fprintf(f, "%24.16e %4d %4d %4d %4d\n", v, i + 1, j + 1, k + 1, l + 1);
        }
  for (int i = 0; i < n; i++)
    for (int j = 0; j <= i; j++) {
      double v = s->h1[i * n + j];
      if (v != 0.0) fprintf(f, "%24.16e %4d %4d %4d %4d\n", v, i + 1, j + 1, 0, 0);
    }
  if (s->orbital_energies)
    for (int i = 0; i < n; i++) fprintf(f, "%24.16e %4d %4d %4d %4d\n", s->orbital_energies[i], i + 1, 0, 0, 0);
  fprintf(f, "%24.16e %4d %4d %4d %4d\n", s->e_constant, 0, 0, 0, 0);
  return util_afile_commit(a);
}

int chem_fcidump_write(const chem_space *s, const char *path) { return fcidump_write(s, path); }
