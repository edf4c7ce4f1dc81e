/* ast.h — a recipe as it was written (private to the front end).
 *
 * The parser builds one ast_file per source file.  Nodes hold byte spans into
 * the registered source text (diag_ctx), never copies of it: names, numbers and
 * strings are read back from the spans when they are needed (ast_text).  The
 * AST keeps everything fmt needs to rewrite the file (parentheses, the order of
 * statements and options, the raw spelling of numbers and bit strings); all
 * meaning is decided later, in resolve.c.
 *
 * Ownership: an ast_file owns its statements; a statement owns its
 * expressions, span lists and block items; an expression owns its operands.
 * Builders take ownership of the pointers they are given.  ast_file_free,
 * ast_stmt_free and ast_expr_free free a node and everything below it.
 */
#ifndef CAIRN_FRONT_AST_H
#define CAIRN_FRONT_AST_H

#include "cairn/diag.h"
#include "cairn/ir.h"

#include <stddef.h>

/* Built-in functions of expressions.  ORDER FUNCS: ast_func_names in ast.c. */
typedef enum ast_func { AST_F_SIN, AST_F_COS, AST_F_TAN, AST_F_SQRT, AST_F_EXP, AST_F_LOG, AST_F_COUNT } ast_func;

typedef enum ast_expr_kind {
  AST_E_NUM,    /* a number literal; its spelling is the span's text */
  AST_E_NAME,   /* a let or vary name */
  AST_E_SIGN,   /* unary + or - (op) applied to a */
  AST_E_BIN,    /* a op b, op one of + - * / ^ */
  AST_E_CALL,   /* func(a) */
  AST_E_UNIT,   /* a followed by a unit word (unit) */
  AST_E_PAREN   /* (a), kept so fmt writes what was written */
} ast_expr_kind;

typedef struct ast_expr {
  ast_expr_kind kind;
  diag_span span;        /* the whole expression */
  char op;               /* SIGN, BIN */
  ast_func func;         /* CALL */
  ir_unit unit;          /* UNIT */
  diag_span word;        /* CALL: the function name; UNIT: the unit word */
  double value;          /* NUM */
  int bad;               /* NUM: not a valid number (already reported) */
  struct ast_expr *a, *b;
} ast_expr;

/* A list of token spans (option words, Pauli tokens, orbital indices). */
typedef struct ast_spans {
  diag_span *v;
  int n;
  size_t cap;
} ast_spans;

typedef enum ast_kind {
  /* statements */
  AST_HEADER,        /* cairn E */
  AST_LET,           /* let NAME = E */
  AST_VARY,          /* vary NAME from E to E step E */
  AST_ATOMS,         /* atoms [unit] { items: AST_ATOM } */
  AST_CHARGE,        /* charge E */
  AST_MULTIPLICITY,  /* multiplicity E */
  AST_BASIS,         /* basis NAME (name = the basis word) */
  AST_BASIS_FILE,    /* basis file "path" */
  AST_INTEGRALS,     /* integrals "path" */
  AST_ORBITALS,      /* orbitals { items: AST_FREEZE_*, AST_ACTIVE_* } */
  AST_ENCODING,      /* encoding NAME words... (name = encoding, words = extra words: taper) */
  AST_REFERENCE,     /* reference NAME */
  AST_REFERENCE_BITS,/* reference bits TEXT (name = the bit string) */
  AST_KEEP,          /* keep NAME policy [E] (variant = ir_policy) */
  AST_POOL,          /* pool { items: AST_RULE, AST_PAULI, AST_EXCITE } */
  AST_CHOOSE,        /* choose ... (variant = ir_choose_kind; e[0] count, e[1] threshold) */
  AST_ORDER,         /* order ... (variant = ir_order) */
  AST_TROTTER,       /* trotter E */
  AST_OPTIMIZE,      /* optimize NAME settings (items: AST_SETTING) */
  AST_EMIT,          /* emit NAME "path" */
  AST_USE,           /* use "path" */
  /* block items */
  AST_ATOM,          /* SYMBOL E E E (name = symbol) */
  AST_FREEZE_CORE,   /* freeze core */
  AST_FREEZE_LIST,   /* freeze N N ... (list) */
  AST_ACTIVE_COUNT,  /* active E electrons in E orbitals */
  AST_ACTIVE_LIST,   /* active orbitals N N..M ... (list) */
  AST_RULE,          /* WORD WORD ... (words: rule name and options) */
  AST_PAULI,         /* word TOKENS (words: the Pauli tokens) */
  AST_EXCITE,        /* excite N... -> N... (list -> list2) */
  AST_SETTING        /* an optimizer setting: name [E] or name WORD (name, e[0] or word) */
} ast_kind;

/* One index or range of a list: `3` (hi.file < 0) or `3..6`. */
typedef struct ast_range {
  diag_span lo, hi;
  int bad;  /* a bad number, already reported by the scanner */
} ast_range;

typedef struct ast_ranges {
  ast_range *v;
  int n;
  size_t cap;
} ast_ranges;

typedef struct ast_stmt ast_stmt;

typedef struct ast_block {
  ast_stmt **v;
  int n;
  size_t cap;
} ast_block;

struct ast_stmt {
  ast_kind kind;
  diag_span span;       /* the statement's line, first token to last (a block: its header line) */
  diag_span kw;         /* the leading keyword (an atom line: the symbol) */
  diag_span name;       /* the name/value word or string (see ast_kind); file < 0 if none */
  diag_span word;       /* AST_SETTING: a word value (guess mp2); file < 0 if none */
  int variant;          /* kind-specific (see ast_kind); atoms: ir_unit of the block */
  diag_span variant_span; /* the words that chose the variant (the policy, `by gradient`, the unit) */
  ast_expr *e[3];       /* expressions (see ast_kind) */
  ast_spans words;      /* AST_ENCODING, AST_RULE, AST_PAULI */
  ast_ranges list, list2; /* AST_FREEZE_LIST, AST_ACTIVE_LIST; AST_EXCITE from -> to */
  diag_span arrow;      /* AST_EXCITE: the `->` */
  ast_block items;      /* blocks and optimize settings */
  diag_span open, close;/* block braces; open.file < 0 when `{` was missing, close when `}` was */
};

typedef struct ast_file {
  int32_t file;         /* registered source */
  ast_block stmts;
  diag_span *comments;  /* every `#` comment, in source order */
  int ncomments;
  size_t capcomments;
  int errors;           /* syntax errors found while parsing this file */
} ast_file;

/* Text of a span (not NUL-terminated; *len bytes). */
const char *ast_text(const diag_ctx *d, diag_span s, size_t *len);
/* 1 when the span's text equals the NUL-terminated word w. */
int ast_text_is(const diag_ctx *d, diag_span s, const char *w);
/* The span's text as a malloc'd string (caller frees). */
char *ast_text_dup(const diag_ctx *d, diag_span s);
/* The span from the start of a to the end of b. */
diag_span ast_join(diag_span a, diag_span b);

const char *ast_func_name(ast_func f);
/* Function of a name ("sin"), or -1. */
int ast_func_lookup(const char *s, size_t len);

/* Expression builders (grammar actions call these; they take ownership). */
ast_expr *ast_num(const diag_ctx *d, diag_span s, int bad);
ast_expr *ast_name(diag_span s);
ast_expr *ast_sign(diag_span op, char sign, ast_expr *a);
ast_expr *ast_bin(char op, ast_expr *a, ast_expr *b);
ast_expr *ast_call(const diag_ctx *d, diag_span fn, ast_expr *a, diag_span close);
ast_expr *ast_unit(const diag_ctx *d, ast_expr *a, diag_span unit);
ast_expr *ast_paren(diag_span open, ast_expr *a, diag_span close);
void ast_expr_free(ast_expr *e);

/* Statement builders.  `kw` is the leading keyword's span; the statement span
 * runs from kw to `end` (the last token before the newline). */
ast_stmt *ast_stmt_new(ast_kind kind, diag_span kw, diag_span end);
ast_stmt *ast_stmt_name(ast_stmt *s, diag_span name);
ast_stmt *ast_stmt_expr(ast_stmt *s, int slot, ast_expr *e);
ast_stmt *ast_stmt_variant(ast_stmt *s, int variant, diag_span where);
ast_stmt *ast_stmt_word(ast_stmt *s, diag_span word);
ast_stmt *ast_stmt_words(ast_stmt *s, ast_spans *words);
ast_stmt *ast_stmt_lists(ast_stmt *s, ast_ranges *list, diag_span arrow, ast_ranges *list2);
/* Block statements: `open` may be DIAG_NOWHERE when `{` was missing. */
ast_stmt *ast_stmt_block(ast_stmt *s, diag_span open, ast_block *items, diag_span close);
ast_stmt *ast_stmt_settings(ast_stmt *s, ast_block *settings);
void ast_stmt_free(ast_stmt *s);

ast_spans *ast_spans_new(void);
ast_spans *ast_spans_add(ast_spans *l, diag_span s);
ast_spans *ast_spans_prepend(ast_spans *l, diag_span s);
void ast_spans_free(ast_spans *l);
ast_ranges *ast_ranges_new(void);
ast_ranges *ast_ranges_add(ast_ranges *l, diag_span lo, diag_span hi, int bad);
void ast_ranges_free(ast_ranges *l);
ast_block *ast_block_new(void);
ast_block *ast_block_add(ast_block *b, ast_stmt *s); /* s may be NULL (a blank line): ignored */
void ast_block_free(ast_block *b);
/* Move a heap ast_block's contents into *dst (which must be empty) and free it. */
void ast_block_move(ast_block *dst, ast_block *src);

void ast_file_free(ast_file *f);

#endif
