/*
 * refcsv_wide.c — the reader of refcsv_wide.h: generated reference tables
 * with up to REFCSV_WIDE_MAX_COLS numeric columns. Linked into every unit
 * program (the Makefile links every non-test_*.c file of tests/unit).
 */
#include "refcsv_wide.h"

#include <stdio.h>
#include <stdlib.h>

int refcsv_read_wide(const char *path, int ncols, double rows[][REFCSV_WIDE_MAX_COLS],
                     int max_rows)
{
    if (ncols < 1 || ncols > REFCSV_WIDE_MAX_COLS)
        return -1;
    FILE *f = fopen(path, "r");
    if (f == NULL) {
        fprintf(stderr, "cannot open %s (run the unit tests from the repository root)\n", path);
        return -1;
    }
    char line[4096];
    int n = 0, seen_names = 0;
    while (n < max_rows && fgets(line, sizeof line, f) != NULL) {
        if (line[0] == '#' || line[0] == '\n')
            continue;
        if (!seen_names) {
            seen_names = 1;
            continue;
        }
        char *p = line, *end;
        for (int c = 0; c < ncols; c++, p = (*end == ',') ? end + 1 : end) {
            rows[n][c] = strtod(p, &end);
            if (end == p) {
                fclose(f);
                return -1;
            }
        }
        n++;
    }
    fclose(f);
    return n;
}
