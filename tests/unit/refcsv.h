/*
 * refcsv.h — reading the generated reference tables of tests/reference/
 * (numeric CSV written by tools/ref/: '#' comment lines, one column-name
 * line, then rows of numbers) for the unit tests that compare with them.
 * Paths are relative to the repository root, where the unit tests run.
 */
#ifndef GC_TEST_REFCSV_H
#define GC_TEST_REFCSV_H

/* Most columns a reference row may have. */
#define REFCSV_MAX_COLS 8

/* Reads the first ncols numbers of every data row of the CSV at path into
 * rows[][REFCSV_MAX_COLS] (at most max_rows rows; '#' lines, empty lines and
 * the column-name line skipped); returns the number of rows, -1 when the
 * file cannot be opened or a row does not have ncols numbers. */
int refcsv_read(const char *path, int ncols, double rows[][REFCSV_MAX_COLS], int max_rows);

#endif
