/* parse.h — the parse driver shared by the scanner (grammar/recipe.l), the
 * parser (grammar/recipe.y) and the rest of the front end.  Private.
 *
 * One front_parser reads one registered source file into an ast_file.  The
 * scanner and parser keep no state of their own outside this struct (the
 * scanner is reentrant, the parser pure).
 *
 * Ownership: front_parse returns an ast_file the caller frees (ast_file_free);
 * it is returned even when there were syntax errors (ast_file.errors > 0), with
 * the statements that could be read.
 */
#ifndef CAIRN_FRONT_PARSE_H
#define CAIRN_FRONT_PARSE_H

#include "cairn/diag.h"
#include "front/ast.h"

#include <stddef.h>
#include <stdint.h>

/* A token the lexer wrapper has queued (an injected `}` and newline). */
typedef struct front_tok {
  int kind;
  diag_span loc;
  int flag;
} front_tok;

typedef struct front_parser {
  diag_ctx *d;
  int32_t file;
  const char *text;   /* the registered source (NUL-terminated) */
  size_t len;
  void *scanner;      /* the flex scanner (yyscan_t) */
  ast_file *out;

  /* scanner state */
  uint32_t off;       /* byte offset of the next character to scan */
  uint32_t last_end;  /* end of the last token returned */
  int paren;          /* parenthesis depth on this line */
  int prev_operand;   /* the last token ends an operand (number, name, `)`, unit) */
  int eof_nl;         /* a final newline has been supplied at end of file */
  int last_kind;      /* kind of the last token (0: none yet) */

  /* lexer wrapper state (block structure, see front_lex) */
  int line_start;     /* the next token starts a line */
  int in_block;       /* inside `{ ... }` */
  int block_noopen;   /* ... of a block whose `{` was missing (already reported) */
  int block_kw;       /* token kind of the statement that opens (or opened) a block */
  diag_span block_kw_span, block_open;
  int line_has_open;  /* a `{` was seen on the current line */
  front_tok queue[4];
  int nqueue, qhead;

  /* error bookkeeping: at most one syntax error per line */
  int last_error_line;
} front_parser;

/* Parse registered file `file`. */
ast_file *front_parse(diag_ctx *d, int32_t file);

/* All tokens of registered file `file` as the parser would see them (through
 * the block-keeping wrapper), up to `max`; returns how many there were (which
 * may exceed max).  The last token is the end of file (kind 0).  For tests. */
int front_tokens(diag_ctx *d, int32_t file, front_tok *out, int max);

/* Called by the scanner. */
void front_comment(front_parser *p, diag_span s);
/* A malformed number (`1.2.3`, `2deg`). */
void front_bad_number(front_parser *p, diag_span s, const char *text, size_t len);
/* Report a lexical error at s (skipped when the line already has an error). */
void front_lex_error(front_parser *p, diag_span s, const char *help, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));
/* Called by the parser: a syntax error at `at` with the unexpected token's
 * name and the names of the tokens that were expected. */
void front_syntax_error(front_parser *p, diag_span at, const char *unexpected, int nexpected,
                        const char *const *expected);
/* The parser gave up (its stack is exhausted). */
void front_parse_failure(front_parser *p, diag_span at, const char *msg);
/* Token kind of a keyword, or 0 (then the word is a name). */
int front_keyword(const char *s, size_t len);

#endif
