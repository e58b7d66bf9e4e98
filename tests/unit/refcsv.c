/*
 * refcsv.c — the reader of the generated reference CSV tables shared by the
 * unit tests (see refcsv.h). Linked into every unit program.
 */
#include "refcsv.h"

#include <stdio.h>
#include <stdlib.h>

int refcsv_read(const char *path, int ncols, double rows[][REFCSV_MAX_COLS], int max_rows)
{
    FILE *f = fopen(path, "r");
    if (f == NULL) {
        fprintf(stderr, "cannot open %s (run the unit tests from the repository root)\n", path);
        return -1;
    }
    char line[1024];
    int n = 0, seen_names = 0;
    while (fgets(line, sizeof line, f) != NULL) {
        if (line[0] == '#' || line[0] == '\n')
            continue;
        if (!seen_names) {
            seen_names = 1;
            continue;
        }
        if (n >= max_rows)
            break;
        char *p = line;
        for (int c = 0; c < ncols; c++) {
            char *end;
            rows[n][c] = strtod(p, &end);
            if (end == p) {
                fclose(f);
                return -1;
            }
            p = (*end == ',') ? end + 1 : end;
        }
        n++;
    }
    fclose(f);
    return n;
}
