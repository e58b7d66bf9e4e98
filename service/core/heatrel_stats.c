/*
 * heatrel_stats.c — statistics over the cycles of a recording (step 8 of
 * heatrel.h): mean, sample standard deviation, coefficient of variation,
 * lowest normalised value, the median the misfire and partial-burn flags are
 * judged against, and the coded warnings of the analysis.
 *
 * Definitions (common practice): mean = sum x / n; std = sqrt(sum (x -
 * mean)^2 / (n - 1)), the sample standard deviation; COV = std / |mean|;
 * LNV = min / mean. The mean and deviation take two passes over the data,
 * so a large common value does not cancel digits.
 *
 * Units: those of the values (Pa, deg, J, W/m2, -).
 */
#include "core/heatrel_internal.h"

#include <math.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void gc_heatrel_stats(const double *x, int n, gc_heatrel_stat *s)
{
    memset(s, 0, sizeof *s);
    s->i_min = s->i_max = -1;
    if (n <= 0)
        return;
    double sum = 0.0;
    s->i_min = s->i_max = 0;
    for (int i = 0; i < n; i++) {
        sum += x[i];
        if (x[i] < x[s->i_min])
            s->i_min = i;
        if (x[i] > x[s->i_max])
            s->i_max = i;
    }
    s->n = n;
    s->mean = sum / n;
    s->min = x[s->i_min];
    s->max = x[s->i_max];
    if (n > 1) {
        double ss = 0.0;
        for (int i = 0; i < n; i++)
            ss += (x[i] - s->mean) * (x[i] - s->mean);
        s->std = sqrt(ss / (n - 1));
    }
    if (s->mean != 0.0) {
        s->cov = n > 1 ? s->std / fabs(s->mean) : 0.0;
        s->lnv = s->min / s->mean;
    }
}

static int cmp_double(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

double gc__hr_median(const double *x, int n, double *scratch)
{
    if (n <= 0)
        return 0.0;
    memcpy(scratch, x, (size_t)n * sizeof *x);
    qsort(scratch, (size_t)n, sizeof *scratch, cmp_double);
    return (n % 2) ? scratch[n / 2] : 0.5 * (scratch[n / 2 - 1] + scratch[n / 2]);
}

void gc__hr_warn(gc_heatrel_result *r, const char *field, const char *code, const char *fmt,
                 ...)
{
    if (r->n_warnings >= GC_HEATREL_MAX_WARNINGS)
        return;
    gc_heatrel_warning *w = &r->warnings[r->n_warnings++];
    if (r->n_warnings == GC_HEATREL_MAX_WARNINGS) {
        snprintf(w->field, sizeof w->field, "%s", "");
        snprintf(w->code, sizeof w->code, "%s", "warnings_truncated");
        snprintf(w->message, sizeof w->message, "more warnings were dropped: at most %d are "
                 "kept", GC_HEATREL_MAX_WARNINGS);
        return;
    }
    snprintf(w->field, sizeof w->field, "%s", field);
    snprintf(w->code, sizeof w->code, "%s", code);
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(w->message, sizeof w->message, fmt, ap);
    va_end(ap);
}
