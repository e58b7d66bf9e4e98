/*
 * text.c — small text helpers (text.h): the case-insensitive edit distance
 * (Levenshtein 1966, two rows of the dynamic-programming table) behind every
 * "did you mean" suggestion of a field, preset or unit name.
 */
#include "gascycle/text.h"

#include <ctype.h>
#include <string.h>

int gc_text_edit_distance(const char *a, const char *b)
{
    enum { N = 64 };
    size_t la = strlen(a), lb = strlen(b);
    if (la >= N || lb >= N)
        return 99;
    int prev[N + 1], cur[N + 1];
    for (size_t j = 0; j <= lb; j++)
        prev[j] = (int)j;
    for (size_t i = 1; i <= la; i++) {
        cur[0] = (int)i;
        for (size_t j = 1; j <= lb; j++) {
            int cost = tolower((unsigned char)a[i - 1]) != tolower((unsigned char)b[j - 1]);
            int best = prev[j - 1] + cost;
            if (prev[j] + 1 < best)
                best = prev[j] + 1;
            if (cur[j - 1] + 1 < best)
                best = cur[j - 1] + 1;
            cur[j] = best;
        }
        memcpy(prev, cur, sizeof(int) * (lb + 1));
    }
    return prev[lb] > 99 ? 99 : prev[lb];
}
