/*
 * refcsv_wide.h — reading a generated reference table of tests/reference/
 * that has more columns than refcsv.h reads (REFCSV_MAX_COLS): same format
 * ('#' comment lines, one column-name line, rows of numbers), any number of
 * columns up to REFCSV_WIDE_MAX_COLS. Used by test_if97.c and test_steam.c.
 * Paths are relative to the repository root, where the unit tests run.
 */
#ifndef GC_TEST_REFCSV_WIDE_H
#define GC_TEST_REFCSV_WIDE_H

#define REFCSV_WIDE_MAX_COLS 32

/* Reads the first ncols numbers of every data row into
 * rows[][REFCSV_WIDE_MAX_COLS] (at most max_rows rows); returns the number
 * of rows, -1 when the file cannot be opened or a row is short. */
int refcsv_read_wide(const char *path, int ncols, double rows[][REFCSV_WIDE_MAX_COLS],
                     int max_rows);

#endif
