/*
 * chart.h — a generic, self-contained SVG 1.1 chart renderer (core: no
 * JSON, no HTTP) for every diagram that is not a cycle's own T-s / P-v / h-s
 * picture (diagram.h): correction curves, uncertainty budgets, pressure
 * traces, heat release, per-cycle scatter, heat-recovery T-Q lines, steam
 * T-s with its saturation dome.
 *
 * The caller passes numbers already in the units it wants to show and the
 * axis titles with their unit labels: nothing is converted here. A chart is
 * a plain description (gc_chart) pointing at caller-owned arrays; rendering
 * writes one document into a growing buffer (strbuf.h) and keeps no state.
 *
 * Axes: x, y and an optional second y axis on the right (series, reference
 * lines and labels choose it with y2 = 1), each linear or logarithmic (base
 * 10), with a title and a unit shown as "Title [unit]". Automatic ranges hold
 * all the data of their axis (series, reference lines, point labels); lines
 * alone snap the range to the enclosing ticks, markers, bars and labels pad it
 * by 5 % so nothing sits on the frame. A fixed range (fixed_min/fixed_max)
 * clips whatever lies outside.
 * Ticks: linear axes step by 1, 2 or 5 times a power of ten (coarser until
 * the labels fit side by side); log axes label whole decades (with minor
 * ticks at 2..9 when there is room), and the 1-2-5 values (or 1..9) when
 * fewer than two whole decades lie in the range. Labels are plain numbers ("0.3", "10 000"
 * with a thin space, four-digit labels grouped too on an axis that reaches
 * 10 000, or "10000" without grouping), never "1e+04"; decade
 * labels become 10 with a superscript exponent only when a label would lie
 * outside 0.001 .. 10 000 000.
 *
 * Series kinds (gc_chart_kind): polyline (solid, dashed, dotted; optional
 * markers), markers (scatter), step line (value held from x[i] to x[i+1]),
 * vertical bars (at numeric x; several bar series stand side by side), a
 * horizontal bar chart (category labels on the left, values on the bars: a
 * chart with such a series holds that one series only, plus vertical
 * reference lines; its y axis is the category list) and filled areas (a
 * closed polygon such as a saturation dome, or the region between a curve
 * and a base value). Reference lines are horizontal or vertical lines across
 * the plot with a label (a mean, a limit, a pinch point). Point labels (state
 * numbers) are placed without collision: for each label in turn, up to 24
 * positions around its point (8 directions, 3 distances, outward from the
 * labels' centroid first) are tried and the first whose box overlaps no
 * earlier label, reference-line label or label marker and stays inside the
 * plot is kept (the least-overlapping one if none is free); a label moved
 * beyond the nearest ring gets a thin leader line.
 *
 * Text boxes are estimated, not measured (no font metrics in a server): a
 * text of n characters (UTF-8 code points) at font size f px is
 * GC_CHART_CHAR_EM * f * n wide, from GC_CHART_ASCENT_EM * f above its
 * baseline to GC_CHART_DESCENT_EM * f below it.
 *
 * Document structure (stable, for tests and for clients that style it):
 *   <svg class="gc-chart" ...>              size in px and a viewBox
 *   <title>, <desc>                         the title, a description
 *   <rect class="gc-background"/>
 *   <text class="gc-title">                 the title row (when a title is given)
 *   <g class="gc-legend">                   one <g class="gc-legend-item" id="legend-N"> per
 *                                           named series (N its series number)
 *   <g class="gc-grid">                     grid lines (major ticks)
 *   <rect class="gc-plot" x y width height/>  the plot area
 *   <g class="gc-ticks" id="ticks-x">       also id="ticks-y", id="ticks-y2"; tick marks
 *                                           and <text class="gc-tick-label"> (minor
 *                                           ticks carry class="gc-tick-minor")
 *   <text class="gc-axis-title" id="axis-x">  also id="axis-y", id="axis-y2"
 *   <g class="gc-series gc-series-N gc-kind-KIND" id="series-N">  N from 1 in
 *                                           the caller's order; KIND is one of line,
 *                                           markers, step, vbars, hbars, area;
 *                                           drawn with clip-path="url(#gc-chart-clip)"
 *                                           (hbars: the bars only, not their texts)
 *     <path class="gc-line"/>, <path class="gc-fill"/>, <g class="gc-marks">,
 *     <g class="gc-bars"> of <rect class="gc-bar" id="series-N-bar-K"/> and
 *     <text class="gc-bar-value">; a horizontal bar chart has one
 *     <g class="gc-bar-row" id="bar-K"> per category (K from 1, top down) with
 *     <rect class="gc-bar"/>, <text class="gc-category"> and
 *     <text class="gc-bar-value">, and <path class="gc-zero"/> on zero
 *   <g class="gc-reflines">, each <g class="gc-refline" id="ref-N"> a line,
 *                                           <rect class="gc-refline-label-bg"/> and
 *                                           <text class="gc-refline-label">
 *   <g class="gc-labels">, each <g class="gc-label" id="label-N"> an optional
 *                                           <circle class="gc-label-mark">, an
 *                                           optional <line class="gc-leader"> and
 *                                           <text class="gc-label-text" text-anchor="middle">
 *   <text class="gc-caption" id="caption-N">  one per caption, its lines as <tspan>s
 * Every series coordinate is clipped to the plot area geometrically (lines
 * and polygons cut at the frame, bars cut to it, markers and labels outside
 * left out), so no vertex of a series lies outside the gc-plot rectangle.
 * The clip path's id is "gc-chart-clip": a page that inlines several charts
 * (rather than loading them as images) must rename it.
 * No scripts, no external resources, generic font families only. All caller
 * text is XML-escaped, control characters become spaces and invalid UTF-8
 * bytes become '?'; a text longer than GC_CHART_TEXT_LEN bytes, or than the
 * room it has (title, legend, category labels), is cut on a character
 * boundary and ends in "…".
 *
 * Refusals (GC_ERR_INVALID, nothing written): a non-finite or out-of-range
 * (|v| > GC_CHART_MAX_ABS) number anywhere, a non-positive value on a log
 * axis, limits exceeded, inconsistent series (no arrays, a horizontal bar
 * series mixed with others, an item on a second y axis the chart lacks), a
 * size out of bounds or too small for its legend, captions and plot (field
 * "/width" or "/height"), a fixed range that is empty. The message names the
 * series, point, reference line or label.
 */
#ifndef GASCYCLE_CHART_H
#define GASCYCLE_CHART_H

#include <stddef.h>

#include "gascycle/error.h"
#include "gascycle/strbuf.h"

/* Limits: a chart request can never hold the server. */
#define GC_CHART_MAX_SERIES 12          /* series per chart */
#define GC_CHART_MAX_POINTS 20000       /* points per series */
#define GC_CHART_MAX_TOTAL_POINTS 100000 /* points over all series */
#define GC_CHART_MAX_BARS 64            /* categories of a horizontal bar chart */
#define GC_CHART_MAX_REFLINES 16        /* reference lines */
#define GC_CHART_MAX_LABELS 64          /* point labels */
#define GC_CHART_MAX_CAPTIONS 6         /* caption lines (each may wrap once more) */
#define GC_CHART_TEXT_LEN 160           /* bytes of any one caller text that are used */
#define GC_CHART_MAX_ABS 1e300          /* largest magnitude of a number drawn */

#define GC_CHART_DEFAULT_WIDTH 760      /* px */
#define GC_CHART_DEFAULT_HEIGHT 520     /* px */
#define GC_CHART_MIN_SIZE 320           /* px, either dimension */
#define GC_CHART_MAX_SIZE 4000          /* px, either dimension */

#define GC_CHART_PALETTE 8              /* colours before they repeat */

/* The text-box estimate (see the file comment), in em of the font size. */
#define GC_CHART_CHAR_EM 0.6
#define GC_CHART_ASCENT_EM 0.75
#define GC_CHART_DESCENT_EM 0.25

typedef enum gc_chart_scale {
    GC_CHART_LINEAR = 0,
    GC_CHART_LOG = 1                    /* base 10; every value on it must be > 0 */
} gc_chart_scale;

typedef struct gc_chart_axis {
    const char *title;          /* quantity in words, e.g. "Ambient temperature" (NULL: none) */
    const char *unit;           /* unit label, shown as "Title [unit]" (NULL or "": no brackets) */
    gc_chart_scale scale;
    int fixed_min, fixed_max;   /* 1: min / max below is the axis end (data beyond is clipped) */
    double min, max;            /* fixed ends, in the axis's (display) units */
    int include_zero;           /* automatic range reaches 0 (linear axes) */
} gc_chart_axis;

typedef enum gc_chart_kind {
    GC_CHART_LINE = 0,          /* polyline through (x[i], y[i]) */
    GC_CHART_MARKERS = 1,       /* one marker per point (scatter) */
    GC_CHART_STEP = 2,          /* y[i] held from x[i] to x[i+1], then a vertical rise */
    GC_CHART_VBARS = 3,         /* a bar from `base` to y[i] at x[i] */
    GC_CHART_HBARS = 4,         /* bar chart: x[i] the value of category text[i] (y unused) */
    GC_CHART_AREA = 5           /* filled polygon (or down/up to `base`) with its outline */
} gc_chart_kind;

typedef enum gc_chart_dash {
    GC_CHART_SOLID = 0,
    GC_CHART_DASHED = 1,
    GC_CHART_DOTTED = 2
} gc_chart_dash;

typedef enum gc_chart_mark {
    GC_CHART_MARK_AUTO = 0,     /* by series number: circle, square, triangle, diamond, ... */
    GC_CHART_MARK_CIRCLE = 1,
    GC_CHART_MARK_SQUARE = 2,
    GC_CHART_MARK_TRIANGLE = 3,
    GC_CHART_MARK_DIAMOND = 4
} gc_chart_mark;

typedef struct gc_chart_series {
    gc_chart_kind kind;
    const char *name;           /* legend entry (NULL or "": not in the legend) */
    int n;                      /* points, 1..GC_CHART_MAX_POINTS (HBARS: ..GC_CHART_MAX_BARS) */
    const double *x;            /* n values (HBARS: the bar values) */
    const double *y;            /* n values (HBARS: unused, may be NULL) */
    const char *const *text;    /* HBARS: n category labels (required); VBARS: n texts shown
                                   above the bars (optional); others: unused */
    const char *const *value_text; /* HBARS: n texts on the bars instead of the formatted
                                   values (optional, entries may be NULL) */
    gc_chart_dash dash;         /* LINE, STEP and the AREA outline */
    gc_chart_mark mark;         /* MARKERS, and LINE/STEP with show_marks */
    int show_marks;             /* LINE/STEP: a marker at every point as well */
    int y2;                     /* 1: plotted against the second y axis */
    int color;                  /* 0: by series number; k >= 1: palette colour k (repeating
                                   after GC_CHART_PALETTE) */
    double base;                /* VBARS: foot of the bars; AREA with fill_to_base: the
                                   value the region reaches (a log axis uses its lower end
                                   when base <= 0) */
    int fill_to_base;           /* AREA: 0 the points are a closed polygon, 1 the region
                                   between the curve and y = base */
} gc_chart_series;

typedef struct gc_chart_refline {
    int vertical;               /* 1: x = value; 0: y = value */
    int y2;                     /* horizontal line on the second y axis */
    double value;               /* axis units */
    const char *label;          /* text at the line's end, e.g. "mean 9.82 bar" (NULL: none) */
    gc_chart_dash dash;
    int color;                  /* 0: neutral dark grey; k >= 1: palette colour k */
} gc_chart_refline;

typedef struct gc_chart_label {
    double x, y;                /* the point labelled, axis units */
    int y2;                     /* y on the second y axis */
    const char *text;           /* e.g. "1" (a state number) */
    int marker;                 /* 1: a ring marker at the point */
} gc_chart_label;

typedef struct gc_chart {
    const char *title;          /* title row and <title> (NULL: none; <title> "Chart") */
    const char *desc;           /* <desc> (NULL: generated from the series names) */
    gc_chart_axis x, y, y2;
    int has_y2;                 /* 1: draw the second y axis (needed by any y2 item) */
    const gc_chart_series *series;
    int n_series;               /* 1..GC_CHART_MAX_SERIES */
    const gc_chart_refline *refs;
    int n_refs;
    const gc_chart_label *labels;
    int n_labels;
    const char *const *captions; /* lines under the plot */
    int n_captions;
    int width_px, height_px;    /* 0: the defaults */
    int group_thousands;        /* 1: thin-space grouping of numbers >= 10 000 (default) */
    int value_digits;           /* significant digits of bar values, 1..15 (0: 3); significant
                                   trailing zeros are kept ("11.0", "0.500") */
} gc_chart;

/* Fills the defaults: everything empty, linear axes, default size, thousands
 * grouped, 3 significant digits on bars. */
void gc_chart_init(gc_chart *c);

/* Renders c into a malloc'd, NUL-terminated SVG document *svg_out of *len
 * bytes (the caller frees it). GC_ERR_INVALID (see the file comment; field
 * "/width" or "/height" for a size out of bounds, otherwise no field and a
 * message naming the item) or GC_ERR_NOMEM; on error *svg_out is NULL and
 * *len 0. */
int gc_chart_svg(const gc_chart *c, char **svg_out, size_t *len, gc_error *err);

/* ---- numbers and text, shared with other SVG writers ---------------------- */

#define GC_CHART_FMT_GROUP 0x1u     /* thin space (U+2009) between thousands when |v| >= 10 000 */
#define GC_CHART_FMT_SVG 0x2u       /* a power of ten as 10<tspan baseline-shift="super">n</tspan>
                                       (SVG character data) instead of Unicode superscripts */
#define GC_CHART_FMT_GROUP4 0x4u    /* with GROUP: four-digit integers grouped too ("8 000"), for a
                                       column or axis that also holds "10 000" */
#define GC_CHART_FMT_ZEROS 0x8u     /* sig: keep significant trailing zeros ("11.0" at 3 digits) */

/* Formats v with `decimals` digits after the point (0..12), as a linear-axis
 * tick of step 10^-decimals or coarser is written: "0.3", "-12.50", "10 000".
 * No exponent notation: |v| >= 1e12 is written as in gc_chart_format_sig with
 * 6 digits. "-0" is written "0". The decimal point is '.' whatever the locale.
 * Returns the length written (without the NUL), or -1 (v not finite, bad
 * decimals, or out too small; out then holds ""). */
int gc_chart_format_fixed(double v, int decimals, unsigned flags, char *out, size_t n);

/* Formats v with at most `sig` significant digits (1..15), trailing zeros and
 * a trailing point dropped (kept with GC_CHART_FMT_ZEROS): 0.30000000000000004
 * -> "0.3", 12345.6 (sig 3) -> "12 300" (grouped). Magnitudes from 1e-5 to below 1e12 are written
 * positionally; others as "2.5×10⁻⁷" (Unicode superscripts) or, with
 * GC_CHART_FMT_SVG, "2.5×10<tspan ...>-7</tspan>". Returns as above. */
int gc_chart_format_sig(double v, int sig, unsigned flags, char *out, size_t n);

/* Appends at most max_bytes of s (cut on a character boundary) as XML text:
 * & < > " ' escaped, control characters as spaces, invalid UTF-8 bytes
 * (overlong forms, surrogates, U+FFFE/U+FFFF, beyond U+10FFFF) as '?'.
 * A NULL s appends nothing. */
void gc_chart_escape(gc_strbuf *b, const char *s, size_t max_bytes);

/* Characters (UTF-8 code points; an invalid byte counts as one) of the first
 * max_bytes of s: the n of the text-box estimate. */
size_t gc_chart_text_chars(const char *s, size_t max_bytes);

#endif
