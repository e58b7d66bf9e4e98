/*
 * heatrel_csv.c — a cylinder-pressure recording as a test cell stores it:
 * CSV text with a crank-angle column, then one pressure column per cycle,
 * units in the header (format and limits in heatrel.h), parsed into a
 * gc_heatrel_traces; and the recording's allocation and release.
 *
 * Two passes over the text: the first finds the header, the separator, the
 * number of rows and checks every row's field count (so the arrays are
 * allocated once, at their size); the second converts the numbers. Numbers:
 * a strict decimal syntax is checked first; a mantissa of at most 15 digits
 * with a power of ten up to 22 is converted exactly as one correctly rounded
 * multiplication or division (W. D. Clinger, "How to read floating point
 * numbers accurately", PLDI 1990, the fast path; from memory), anything else
 * by strtod_l in the "C" locale, so the result never depends on the process
 * locale.
 *
 * Units: angles stored in degrees, pressures in Pa (units.h factors).
 */
#include "gascycle/heatrel.h"
#include "gascycle/units.h"

#include <locale.h>
#include <math.h>
#include <stdarg.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define PI 3.14159265358979323846
#define CELL_MAX 64               /* longest numeric cell accepted, bytes */

const char *gc_heatrel_csv_code_name(int code)
{
    static const char *const names[] = {
        "ok", "csv_empty", "csv_too_large", "csv_bad_header", "csv_column_count",
        "csv_ragged_row", "csv_not_a_number", "csv_angle_not_increasing",
        "csv_too_few_rows", "csv_too_many_values", "csv_out_of_memory",
    };
    if (code < 0 || code >= (int)(sizeof names / sizeof names[0]))
        return "csv_unknown";
    return names[code];
}

/* ---- the recording ----------------------------------------------------------- */

int gc_heatrel_traces_alloc(gc_heatrel_traces *t, int n_cycles, int n_samples, gc_error *err)
{
    memset(t, 0, sizeof *t);
    if (n_cycles < 1 || n_cycles > GC_HEATREL_MAX_CYCLES || n_samples < GC_HEATREL_MIN_SAMPLES ||
        n_samples > GC_HEATREL_MAX_SAMPLES ||
        (long)n_cycles * n_samples > GC_HEATREL_MAX_VALUES)
        return gc_error_set(err, GC_ERR_INVALID, "/trace", "a recording holds 1 to %d cycles "
                            "of %d to %d samples, at most %d values; got %d x %d",
                            GC_HEATREL_MAX_CYCLES, GC_HEATREL_MIN_SAMPLES,
                            GC_HEATREL_MAX_SAMPLES, GC_HEATREL_MAX_VALUES, n_cycles, n_samples);
    t->angle_deg = calloc((size_t)n_samples, sizeof *t->angle_deg);
    t->P_Pa = calloc((size_t)n_cycles * (size_t)n_samples, sizeof *t->P_Pa);
    t->label = calloc((size_t)n_cycles, sizeof *t->label);
    if (!t->angle_deg || !t->P_Pa || !t->label) {
        gc_heatrel_traces_free(t);
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory for the recording");
    }
    t->n_cycles = n_cycles;
    t->n_samples = n_samples;
    return GC_OK;
}

void gc_heatrel_traces_free(gc_heatrel_traces *t)
{
    if (t == NULL)
        return;
    free(t->angle_deg);
    free(t->P_Pa);
    free(t->label);
    memset(t, 0, sizeof *t);
}

/* ---- errors -------------------------------------------------------------------- */

__attribute__((format(printf, 5, 6)))
static int csv_fail(gc_heatrel_csv_error *err, int code, int line, int column,
                    const char *fmt, ...)
{
    if (err != NULL) {
        err->code = code;
        err->line = line;
        err->column = column;
        int used = 0;
        if (line > 0 && column > 0)
            used = snprintf(err->message, sizeof err->message, "line %d, column %d: ", line,
                            column);
        else if (line > 0)
            used = snprintf(err->message, sizeof err->message, "line %d: ", line);
        if (used < 0 || (size_t)used >= sizeof err->message)
            used = 0;
        va_list ap;
        va_start(ap, fmt);
        vsnprintf(err->message + used, sizeof err->message - (size_t)used, fmt, ap);
        va_end(ap);
    }
    return code == GC_HEATREL_CSV_NOMEM ? GC_ERR_NOMEM : GC_ERR_INVALID;
}

/* ---- lines and fields ------------------------------------------------------------ */

typedef struct cursor {
    const char *p, *end;      /* rest of the text */
    int line;                 /* number of the line last returned */
} cursor;

/* Next line [*ls, *le) without its CR/LF; 0 at the end of the text. */
static int next_line(cursor *c, const char **ls, const char **le)
{
    if (c->p >= c->end)
        return 0;
    const char *s = c->p;
    const char *nl = memchr(s, '\n', (size_t)(c->end - s));
    const char *e = nl ? nl : c->end;
    c->p = nl ? nl + 1 : c->end;
    if (e > s && e[-1] == '\r')
        e--;
    *ls = s;
    *le = e;
    c->line++;
    return 1;
}

static int is_space(char ch)
{
    return ch == ' ' || ch == '\t';
}

/* A line that holds no data: empty, blanks only, or a '#' comment. */
static int skip_line(const char *s, const char *e)
{
    while (s < e && is_space(*s))
        s++;
    return s == e || *s == '#';
}

/* Trims blanks (not the separator, which may be a TAB) from [*s, *e). */
static void trim(const char **s, const char **e, char sep)
{
    while (*s < *e && is_space(**s) && **s != sep)
        (*s)++;
    while (*e > *s && is_space((*e)[-1]) && (*e)[-1] != sep)
        (*e)--;
}

/* Fields of [s, e) separated by sep. */
static int count_fields(const char *s, const char *e, char sep)
{
    int n = 1;
    for (const char *q = s; q < e; q++)
        n += (*q == sep);
    return n;
}

/* ---- numbers ---------------------------------------------------------------------- */

static const double pow10_exact[23] = {
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11,
    1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
};

/* Strict decimal syntax [+-]digits[.digits][(e|E)[+-]digits] with at least one
 * mantissa digit; on success the exact fast-path value when it exists. */
typedef struct decimal {
    int ok;                   /* syntax accepted */
    int fast;                 /* *value set exactly */
    double value;
} decimal;

static decimal scan_decimal(const char *s, const char *e)
{
    decimal d = { 0, 0, 0.0 };
    int neg = 0, digits = 0, frac = 0, sig = 0;
    uint64_t mant = 0;
    const char *q = s;
    if (q < e && (*q == '+' || *q == '-'))
        neg = (*q++ == '-');
    for (; q < e && *q >= '0' && *q <= '9'; q++, digits++)
        if (mant != 0 || *q != '0') {
            if (sig < 19)
                mant = mant * 10u + (uint64_t)(*q - '0');
            sig++;
        }
    if (q < e && *q == '.')
        for (q++; q < e && *q >= '0' && *q <= '9'; q++, digits++, frac++)
            if (mant != 0 || *q != '0') {
                if (sig < 19)
                    mant = mant * 10u + (uint64_t)(*q - '0');
                sig++;
            }
    if (digits == 0)
        return d;
    long ex = 0;
    if (q < e && (*q == 'e' || *q == 'E')) {
        q++;
        int eneg = 0, edig = 0;
        if (q < e && (*q == '+' || *q == '-'))
            eneg = (*q++ == '-');
        for (; q < e && *q >= '0' && *q <= '9'; q++, edig++)
            if (ex < 100000)
                ex = ex * 10 + (*q - '0');
        if (edig == 0)
            return d;
        if (eneg)
            ex = -ex;
    }
    if (q != e)
        return d;
    d.ok = 1;
    /* the fraction digits count against the exponent; a zero mantissa is exact */
    long p10 = ex - frac;
    if (mant == 0) {
        d.fast = 1;
        d.value = neg ? -0.0 : 0.0;
    } else if (sig <= 15 && p10 >= -22 && p10 <= 22) {
        double m = (double)mant;   /* exact: below 2^53 */
        d.value = p10 >= 0 ? m * pow10_exact[p10] : m / pow10_exact[-p10];
        if (neg)
            d.value = -d.value;
        d.fast = 1;
    }
    return d;
}

typedef struct numparser {
    locale_t c_locale;        /* created on first need */
} numparser;

/* Converts the cell [s, e) (trimmed); 0 when it is not a finite number. */
static int parse_cell(numparser *np, const char *s, const char *e, double *x)
{
    decimal d = scan_decimal(s, e);
    if (!d.ok)
        return 0;
    if (d.fast) {
        *x = d.value;
        return 1;
    }
    if (e - s >= CELL_MAX)
        return 0;
    if (np->c_locale == (locale_t)0) {
        np->c_locale = newlocale(LC_NUMERIC_MASK, "C", (locale_t)0);
        if (np->c_locale == (locale_t)0)
            return 0;
    }
    char buf[CELL_MAX];
    memcpy(buf, s, (size_t)(e - s));
    buf[e - s] = '\0';
    char *end;
    *x = strtod_l(buf, &end, np->c_locale);
    return *end == '\0' && isfinite(*x);
}

/* ---- header ------------------------------------------------------------------------- */

/* Splits a header cell "name [unit]" (optionally in double quotes) into its
 * name and unit (NUL-terminated copies); 0 when there is no "[unit]". */
static int split_header_cell(const char *s, const char *e, char sep, char *name, size_t nname,
                             char *unit, size_t nunit)
{
    trim(&s, &e, sep);
    if (e - s >= 2 && *s == '"' && e[-1] == '"') {
        s++;
        e--;
        trim(&s, &e, sep);
    }
    if (e == s || e[-1] != ']')
        return 0;
    const char *lb = e - 1;
    while (lb > s && *lb != '[')
        lb--;
    if (*lb != '[')
        return 0;
    const char *us = lb + 1, *ue = e - 1, *ns = s, *ne = lb;
    trim(&us, &ue, sep);
    trim(&ns, &ne, sep);
    if (ue == us || (size_t)(ue - us) >= nunit)
        return 0;
    memcpy(unit, us, (size_t)(ue - us));
    unit[ue - us] = '\0';
    size_t nl = (size_t)(ne - ns) < nname - 1 ? (size_t)(ne - ns) : nname - 1;
    memcpy(name, ns, nl);
    name[nl] = '\0';
    return 1;
}

typedef struct header {
    char sep;
    int ncol;                 /* fields, angle included */
    int line;                 /* its line number */
    double angle_factor;      /* recording unit -> deg */
    double *p_factor;         /* ncol - 1: recording unit -> Pa (heap) */
    char (*label)[GC_HEATREL_LABEL_LEN]; /* ncol - 1 (heap) */
} header;

static void header_free(header *h)
{
    free(h->p_factor);
    free(h->label);
}

/* The unit factor of one header cell, as a csv error when it fails. */
static int header_unit(gc_heatrel_csv_error *err, int line, int col, gc_quantity q,
                       const char *unit, double *factor)
{
    gc_error ue;
    if (gc_units_to_si(q, 1.0, unit, factor, &ue) != GC_OK)
        return csv_fail(err, GC_HEATREL_CSV_HEADER, line, col, "unit '%s': %s", unit,
                        ue.message);
    if (q == GC_Q_ANGLE)
        *factor *= 180.0 / PI;    /* rad -> deg */
    return GC_OK;
}

static int parse_header(const char *s, const char *e, int line, header *h,
                        gc_heatrel_csv_error *err)
{
    h->sep = ',';
    for (const char *q = s; q < e; q++)
        if (*q == ',' || *q == ';' || *q == '\t') {
            h->sep = *q;
            break;
        }
    h->line = line;
    h->ncol = count_fields(s, e, h->sep);
    if (h->ncol < 2 || h->ncol > GC_HEATREL_MAX_CYCLES + 1)
        return csv_fail(err, GC_HEATREL_CSV_COLUMNS, line, 0, "the header has %d field(s); "
                        "it needs the crank angle and 1 to %d pressure columns, separated by "
                        "',', ';' or TAB", h->ncol, GC_HEATREL_MAX_CYCLES);
    h->p_factor = calloc((size_t)h->ncol - 1, sizeof *h->p_factor);
    h->label = calloc((size_t)h->ncol - 1, sizeof *h->label);
    if (!h->p_factor || !h->label)
        return csv_fail(err, GC_HEATREL_CSV_NOMEM, 0, 0, "out of memory for the header");
    const char *fs = s;
    for (int col = 0; col < h->ncol; col++) {
        const char *fe = fs;
        while (fe < e && *fe != h->sep)
            fe++;
        char name[GC_HEATREL_LABEL_LEN], unit[48];
        if (!split_header_cell(fs, fe, h->sep, name, sizeof name, unit, sizeof unit))
            return csv_fail(err, GC_HEATREL_CSV_HEADER, line, col + 1, "a header cell must "
                            "be a name and its unit in brackets, e.g. \"%s\"",
                            col == 0 ? "angle [deg]" : "p1 [bar]");
        int rc = col == 0 ? header_unit(err, line, 1, GC_Q_ANGLE, unit, &h->angle_factor)
                          : header_unit(err, line, col + 1, GC_Q_PRESSURE, unit,
                                        &h->p_factor[col - 1]);
        if (rc != GC_OK)
            return rc;
        if (col > 0)
            memcpy(h->label[col - 1], name, sizeof name);
        fs = fe + 1;
    }
    return GC_OK;
}

/* ---- the two passes -------------------------------------------------------------------- */

/* Pass 1: rows after the header, each with the header's field count. */
static int count_rows(cursor c, const header *h, int *rows, gc_heatrel_csv_error *err)
{
    const char *s, *e;
    int n = 0;
    long max_rows = GC_HEATREL_MAX_VALUES / (h->ncol - 1);
    if (max_rows > GC_HEATREL_MAX_SAMPLES)
        max_rows = GC_HEATREL_MAX_SAMPLES;
    while (next_line(&c, &s, &e)) {
        if (skip_line(s, e))
            continue;
        int nf = count_fields(s, e, h->sep);
        if (nf != h->ncol)
            return csv_fail(err, GC_HEATREL_CSV_RAGGED, c.line, nf > h->ncol ? h->ncol + 1 : nf + 1,
                            "the row has %d field(s), the header %d", nf, h->ncol);
        if (++n > max_rows)
            return csv_fail(err, GC_HEATREL_CSV_TOO_LONG, c.line, 0, "more than %ld rows: a "
                            "recording holds at most %d samples per cycle and %d values",
                            max_rows, GC_HEATREL_MAX_SAMPLES, GC_HEATREL_MAX_VALUES);
    }
    if (n == 0)
        return csv_fail(err, GC_HEATREL_CSV_EMPTY, h->line, 0, "the header is followed by no "
                        "data row");
    if (n < GC_HEATREL_MIN_SAMPLES)
        return csv_fail(err, GC_HEATREL_CSV_TOO_SHORT, c.line, 0, "%d data rows; a cycle needs "
                        "at least %d samples", n, GC_HEATREL_MIN_SAMPLES);
    *rows = n;
    return GC_OK;
}

/* Pass 2: the numbers of one row into sample i. */
static int parse_row(numparser *np, const char *s, const char *e, int line, int i,
                     const header *h, gc_heatrel_traces *t, gc_heatrel_csv_error *err)
{
    const char *fs = s;
    for (int col = 0; col < h->ncol; col++) {
        const char *fe = fs;
        while (fe < e && *fe != h->sep)
            fe++;
        const char *cs = fs, *ce = fe;
        trim(&cs, &ce, h->sep);
        double x;
        if (!parse_cell(np, cs, ce, &x)) {
            int shown = (int)(ce - cs) > 24 ? 24 : (int)(ce - cs);
            return csv_fail(err, GC_HEATREL_CSV_NOT_NUMBER, line, col + 1, "'%.*s%s' is not a "
                            "finite decimal number (a '.' decimal point, no NaN or Inf)",
                            shown, cs, (ce - cs) > 24 ? "..." : "");
        }
        if (col == 0) {
            x *= h->angle_factor;
            if (i > 0 && !(x > t->angle_deg[i - 1]))
                return csv_fail(err, GC_HEATREL_CSV_NOT_INCREASING, line, 1, "the crank angle "
                                "%.10g deg is not above the one before it (%.10g deg); angles "
                                "must increase strictly", x, t->angle_deg[i - 1]);
            t->angle_deg[i] = x;
        } else {
            t->P_Pa[(size_t)(col - 1) * (size_t)t->n_samples + (size_t)i] =
                x * h->p_factor[col - 1];
        }
        fs = fe + 1;
    }
    return GC_OK;
}

static int fill(cursor c, const header *h, gc_heatrel_traces *t, gc_heatrel_csv_error *err)
{
    numparser np = { (locale_t)0 };
    const char *s, *e;
    int i = 0, rc = GC_OK;
    while (rc == GC_OK && next_line(&c, &s, &e)) {
        if (skip_line(s, e))
            continue;
        rc = parse_row(&np, s, e, c.line, i++, h, t, err);
    }
    if (np.c_locale != (locale_t)0)
        freelocale(np.c_locale);
    return rc;
}

int gc_heatrel_csv_parse(const char *text, size_t len, gc_heatrel_traces *out,
                         gc_heatrel_csv_error *err)
{
    memset(out, 0, sizeof *out);
    if (err != NULL)
        memset(err, 0, sizeof *err);
    if (len > (size_t)GC_HEATREL_CSV_MAX_BYTES)
        return csv_fail(err, GC_HEATREL_CSV_TOO_LARGE, 0, 0, "the text has %zu bytes, more "
                        "than the %ld accepted", len, (long)GC_HEATREL_CSV_MAX_BYTES);
    cursor c = { text ? text : "", text ? text + len : "", 0 };
    if (c.end - c.p >= 3 && memcmp(c.p, "\xEF\xBB\xBF", 3) == 0)
        c.p += 3;
    const char *s = NULL, *e = NULL;
    int found = 0;
    while (!found && next_line(&c, &s, &e))
        found = !skip_line(s, e);
    if (!found)
        return csv_fail(err, GC_HEATREL_CSV_EMPTY, 0, 0, "no header line: the text is empty "
                        "or holds only comments");
    header h;
    memset(&h, 0, sizeof h);
    int rows = 0;
    int rc = parse_header(s, e, c.line, &h, err);
    if (rc == GC_OK)
        rc = count_rows(c, &h, &rows, err);
    if (rc == GC_OK) {
        gc_error ae;
        rc = gc_heatrel_traces_alloc(out, h.ncol - 1, rows, &ae);
        if (rc != GC_OK)
            rc = csv_fail(err, rc == GC_ERR_NOMEM ? GC_HEATREL_CSV_NOMEM : GC_HEATREL_CSV_TOO_LONG,
                          0, 0, "%s", ae.message);
    }
    if (rc == GC_OK)
        rc = fill(c, &h, out, err);
    if (rc == GC_OK)
        memcpy(out->label, h.label, (size_t)out->n_cycles * sizeof *out->label);
    header_free(&h);
    if (rc != GC_OK)
        gc_heatrel_traces_free(out);
    return rc;
}
