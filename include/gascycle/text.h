/*
 * text.h — small text helpers the core and the API layer share: the edit
 * distance that picks the closest name or unit to suggest for a misspelling.
 */
#ifndef GASCYCLE_TEXT_H
#define GASCYCLE_TEXT_H

/* Case-insensitive Levenshtein distance of two strings (bytes), capped at
 * 99 (also the answer when either is 64 bytes or longer). */
int gc_text_edit_distance(const char *a, const char *b);

#endif
