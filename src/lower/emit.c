/* emit.c — the buffered writer, number and angle spelling shared by the
 * formats, and gate_write: count, then write. */
#include "config.h"

#include "lower/emit_int.h"

#include "cairn/util.h"

#include <errno.h>
#include <math.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>

void emit_flush(emit_ctx *e) {
  if (e->n && !e->err && fwrite(e->buf, 1, e->n, e->f) != e->n) e->err = errno ? errno : EIO;
  e->bytes += e->n;
  e->n = 0;
}

void emit_mem_big(emit_ctx *e, const char *s, size_t n) {
  emit_flush(e);
  if (n > EMIT_BUF) {
    if (!e->err && fwrite(s, 1, n, e->f) != n) e->err = errno ? errno : EIO;
    e->bytes += n;
    return;
  }
  memcpy(e->buf + e->n, s, n);
  e->n += n;
}

void emit_str(emit_ctx *e, const char *s) { emit_mem(e, s, strlen(s)); }

void emit_op(emit_ctx *e, int op) {
  /* ORDER gate_op */
  static const char names[][5] = {"x", "h", "s", "sdg", "rx", "ry", "rz", "cx", "mark"};
  static const unsigned char lens[] = {1, 1, 1, 3, 2, 2, 2, 2, 4};
  if ((unsigned)op >= sizeof lens) return;
  emit_mem(e, names[op], lens[op]);
}

/* Spell every qubit once: "q<k>", or "q[<k>]" when bracketed. */
static void spell_qubits(emit_ctx *e, int n, int bracket) {
  e->qoff = xmalloc((size_t)(n > 0 ? n : 1) * sizeof *e->qoff);
  e->qlen = xmalloc((size_t)(n > 0 ? n : 1));
  e->qtxt = xmalloc((size_t)(n > 0 ? n : 1) * 16);
  size_t at = 0;
  for (int q = 0; q < n; q++) {
    int len = snprintf(e->qtxt + at, 16, bracket ? "q[%d]" : "q%d", q);
    e->qoff[q] = (uint32_t)at;
    e->qlen[q] = (uint8_t)len;
    at += (size_t)len;
  }
}

void emit_long(emit_ctx *e, long v) {
  char t[24];
  int i = 24;
  unsigned long u = v < 0 ? 0UL - (unsigned long)v : (unsigned long)v;
  do {
    t[--i] = (char)('0' + u % 10);
    u /= 10;
  } while (u);
  if (v < 0) t[--i] = '-';
  emit_mem(e, t + i, (size_t)(24 - i));
}

void emit_printf(emit_ctx *e, const char *fmt, ...) {
  char t[512];
  va_list ap;
  va_start(ap, fmt);
  int n = vsnprintf(t, sizeof t, fmt, ap);
  va_end(ap);
  if (n < 0) return;
  if ((size_t)n < sizeof t) {
    emit_mem(e, t, (size_t)n);
    return;
  }
  char *big = xmalloc((size_t)n + 1);
  va_start(ap, fmt);
  vsnprintf(big, (size_t)n + 1, fmt, ap);
  va_end(ap);
  emit_mem(e, big, (size_t)n);
  free(big);
}

/* Spell x into out (40 bytes) as emit_number does. */
static void spell(char *out, double x, int qasm) {
  char t[32];
  util_fmt_double(t, x);
  char *ex = strchr(t, 'e');
  if (qasm && ex && !memchr(t, '.', (size_t)(ex - t))) {
    size_t m = (size_t)(ex - t);
    memcpy(out, t, m);
    memcpy(out + m, ".0", 2);
    strcpy(out + m + 2, ex);
  } else {
    strcpy(out, t);
  }
}

/* Spelling of x as a multiplier (kind 0) or as a fixed angle (kind 1, k pi / d
 * where it is one), through a direct-mapped cache. */
static const char *cached(emit_ctx *e, double x, int kind) {
  uint64_t bits;
  memcpy(&bits, &x, sizeof bits);
  size_t h = (size_t)((bits * 0x9E3779B97F4A7C15ULL) >> 56) & (EMIT_CACHE - 1);
  if (!e->cache_used[kind][h] || memcmp(&e->cache_key[kind][h], &x, sizeof x) != 0) {
    if (!kind || !gate_pi_spelling(e->cache_txt[kind][h], x)) spell(e->cache_txt[kind][h], x, e->qasm);
    e->cache_key[kind][h] = x;
    e->cache_used[kind][h] = 1;
  }
  return e->cache_txt[kind][h];
}

void emit_number(emit_ctx *e, double x) { emit_str(e, cached(e, x, 0)); }

int gate_pi_spelling(char *buf, double a) {
  if (a == 0) {
    strcpy(buf, "0");
    return 1;
  }
  static const int dens[] = {1, 2, 4, 8};
  for (size_t i = 0; i < sizeof dens / sizeof dens[0]; i++) {
    int d = dens[i];
    double k = nearbyint(a * d / M_PI);
    if (k == 0 || fabs(k) >= 64 || k * M_PI / d != a) continue;
    long kk = (long)k;
    const char *sg = kk < 0 ? "-" : "";
    long ak = kk < 0 ? -kk : kk;
    if (d == 1) {
      if (ak == 1) sprintf(buf, "%spi", sg);
      else sprintf(buf, "%s%ld*pi", sg, ak);
    } else {
      if (ak == 1) sprintf(buf, "%spi/%d", sg, d);
      else sprintf(buf, "%s%ld*pi/%d", sg, ak, d);
    }
    return 1;
  }
  return 0;
}

void emit_angle(emit_ctx *e, const gate *g, const char *prefix) {
  if (g->param < 0) {
    emit_str(e, cached(e, g->mult, 1));
    return;
  }
  if (g->mult == -1) emit_ch(e, '-');
  else if (g->mult != 1) {
    emit_number(e, g->mult);
    emit_ch(e, '*');
  }
  emit_str(e, prefix);
  emit_long(e, g->param);
}

void emit_comment_text(emit_ctx *e, const char *s) {
  for (; *s; s++) emit_ch(e, (unsigned char)*s < 0x20 || *s == 0x7f ? ' ' : *s);
}

void emit_section(emit_ctx *e, const gate *g, long run) {
  long cx = run < (long)e->cnt->nruns ? e->cnt->run_cx[run] : 0;
  long single = run < (long)e->cnt->nruns ? e->cnt->run_single[run] : 0;
  if (g->gen < 0) {
    emit_str(e, "reference, basis state ");
    for (int q = 0; q < e->c->nqubits; q++) emit_ch(e, pauli_get_x(e->c->init, q) ? '1' : '0');
    if (e->c->nref_params) emit_str(e, " and mean-field rotations");
  } else {
    const ans_gen_info *gi = &e->c->gens[g->gen];
    emit_ch(e, 'g');
    emit_long(e, g->gen);
    emit_ch(e, ' ');
    emit_str(e, ans_kind_name(gi->kind));
    emit_ch(e, ' ');
    emit_comment_text(e, gi->text ? gi->text : "");
    if (gi->rule >= 0) {
      emit_str(e, " (rule ");
      emit_long(e, gi->rule);
      if (gi->line > 0) {
        emit_str(e, ", line ");
        emit_long(e, gi->line);
      }
      emit_ch(e, ')');
    }
    if (g->param == 1) emit_str(e, " short circuit");
  }
  emit_str(e, ": cx ");
  emit_long(e, cx);
  emit_str(e, ", single ");
  emit_long(e, single);
}

void emit_lowering(emit_ctx *e) {
  emit_str(e, e->o->ladder == GATE_LADDER_TREE ? "tree ladder" : "chain ladder");
  if (e->o->passes) emit_str(e, ", passes");
  if (e->o->shortexc) emit_str(e, ", short excitations");
}

static void emitter_put(gate_sink *s, const gate *g, size_t n) {
  emit_ctx *e = (emit_ctx *)s;
  for (size_t i = 0; i < n; i++) {
    if (g[i].op == GATE_MARK) {
      e->fmt->mark(e, &g[i], e->run);
      e->run++;
    } else {
      e->fmt->gate(e, &g[i]);
    }
  }
}

static void emitter_finish(gate_sink *s) { (void)s; }

const char *gate_format_name(gate_format f) {
  return f == GATE_FMT_QASM2 ? "qasm2" : f == GATE_FMT_QASM3 ? "qasm3" : "listing";
}

int gate_format_parse(const char *s, gate_format *f) {
  if (strcmp(s, "listing") == 0) *f = GATE_FMT_LISTING;
  else if (strcmp(s, "qasm2") == 0) *f = GATE_FMT_QASM2;
  else if (strcmp(s, "qasm3") == 0) *f = GATE_FMT_QASM3;
  else return -1;
  return 0;
}

int gate_write(FILE *f, gate_format fmt, const ans_circuit *c, const gate_opts *o, const gate_meta *meta,
               gate_counts *counts, uint64_t *bytes) {
  gate_counts k;
  gate_counts_init(&k, c->ngens);
  gate_counter cnt;
  gate_counter_init(&cnt, c->nqubits, &k);
  gate_stream(c, o, &cnt.sink);

  gate_meta none = {0};
  emit_ctx *e = xcalloc(1, sizeof *e);
  e->sink.put = emitter_put;
  e->sink.finish = emitter_finish;
  e->fmt = fmt == GATE_FMT_QASM2 ? &emit_qasm2_fmt : fmt == GATE_FMT_QASM3 ? &emit_qasm3_fmt : &emit_listing_fmt;
  e->c = c;
  e->o = o;
  e->meta = meta ? meta : &none;
  e->k = &k;
  e->cnt = &cnt;
  e->f = f;
  e->step = -1;
  e->qasm = fmt != GATE_FMT_LISTING;
  spell_qubits(e, c->nqubits, fmt == GATE_FMT_QASM3);
  e->fmt->header(e);
  gate_stream(c, o, &e->sink);
  e->fmt->footer(e);
  emit_flush(e);
  if (!e->err && fflush(f) != 0) e->err = errno ? errno : EIO;
  int err = e->err;
  if (bytes) *bytes = e->bytes;
  free(e->qtxt);
  free(e->qoff);
  free(e->qlen);
  free(e);
  gate_counter_free(&cnt);
  if (counts) *counts = k;
  else gate_counts_free(&k);
  if (err) {
    errno = err;
    return -1;
  }
  return 0;
}
