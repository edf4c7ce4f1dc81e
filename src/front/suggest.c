/* suggest.c — edit distance for "did you mean" hints. */
#include "config.h"

#include "front/suggest.h"
#include "cairn/util.h"

#include <ctype.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

/* Optimal string alignment distance (Damerau-Levenshtein without repeated
 * edits of one substring), case-insensitive; three rows of the table. */
int front_suggest_distance(const char *a, size_t na, const char *b, size_t nb) {
  if (na > 64 || nb > 64) return 1000;
  int rows[3][65];
  int *pp = rows[0], *prev = rows[1], *cur = rows[2];
  for (size_t j = 0; j <= nb; j++) prev[j] = (int)j;
  for (size_t i = 1; i <= na; i++) {
    cur[0] = (int)i;
    for (size_t j = 1; j <= nb; j++) {
      int ca = tolower((unsigned char)a[i - 1]), cb = tolower((unsigned char)b[j - 1]);
      int cost = ca != cb;
      int v = prev[j] + 1;
      if (cur[j - 1] + 1 < v) v = cur[j - 1] + 1;
      if (prev[j - 1] + cost < v) v = prev[j - 1] + cost;
      if (i > 1 && j > 1 && ca == tolower((unsigned char)b[j - 2]) && tolower((unsigned char)a[i - 2]) == cb &&
          pp[j - 2] + 1 < v)
        v = pp[j - 2] + 1;
      cur[j] = v;
    }
    int *t = pp;
    pp = prev;
    prev = cur;
    cur = t;
  }
  return prev[nb];
}

const char *front_suggest(const char *s, size_t len, const char *const *words, int n) {
  int limit = len <= 3 ? 1 : len <= 7 ? 2 : 3;
  int best = limit + 1;
  const char *pick = NULL;
  for (int i = 0; i < n; i++) {
    size_t wl = strlen(words[i]);
    if (wl == len && strncasecmp(words[i], s, len) == 0) continue; /* the same word: not a typo */
    int dist = front_suggest_distance(s, len, words[i], wl);
    if (dist < best && dist < (int)wl) {
      best = dist;
      pick = words[i];
    }
  }
  return pick;
}
