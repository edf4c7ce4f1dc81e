/* suggest.h — "did you mean" for misspelled words (private to the front end). */
#ifndef CAIRN_FRONT_SUGGEST_H
#define CAIRN_FRONT_SUGGEST_H

#include <stddef.h>

/* The word of `words` closest to s[0..len) by edit distance (insertions,
 * deletions, substitutions and swaps of neighbours), or NULL when none is close
 * enough to be a likely typo.  Case is ignored.  Returns a pointer into words. */
const char *front_suggest(const char *s, size_t len, const char *const *words, int n);

/* The edit distance itself (for tests). */
int front_suggest_distance(const char *a, size_t na, const char *b, size_t nb);

#endif
