/* help.h — `cairn help TOPIC`: one topic for each construct of the recipe
 * language (what it does, its forms, defaults, a short example), plus a few
 * topics on conventions and outputs.
 *
 * A topic is found by its name or by any keyword it explains, so
 * `cairn help electrons` shows the `orbitals` topic; a word explained by
 * several topics (`gradient`) shows each of them.
 *
 * Ownership: the topic table and every string in it are static and
 * read-only; nothing here allocates.
 */
#ifndef CAIRN_HELP_H
#define CAIRN_HELP_H

#include <stdio.h>

typedef struct help_entry {
  const char *name;     /* topic name ("pool") */
  const char *keywords; /* space-separated words of the language it explains */
  const char *summary;  /* one line, for the topic list */
  const char *text;     /* forms, meaning, defaults; lines indented by two spaces */
  const char *example;  /* a short example in recipe syntax, or NULL */
  const char *see;      /* related topics, space-separated, or NULL */
} help_entry;

int help_count(void);
const help_entry *help_get(int i); /* 0 <= i < help_count() */

/* Print every topic named `word` or explaining it.  Returns the number of
 * topics printed (0: none; nothing is printed then). */
int help_topic(const char *word, FILE *out);
/* How many topics help_topic would print for `word` (prints nothing). */
int help_find(const char *word);
/* The list of topics with their summaries (for `cairn help`). */
void help_list(FILE *out);

#endif
