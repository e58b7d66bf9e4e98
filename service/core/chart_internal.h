/*
 * chart_internal.h — declarations shared by the chart renderer's files
 * (chart.h is the contract): the rendering context, axes in display units
 * (log10 of the value on a log axis), ticks, text boxes and the low-level
 * writers. Not installed; gc__chart_ names are internal.
 *
 *   chart.c        gc_chart_init, gc_chart_svg: checks, layout, document order
 *   chart_text.c   escaping, number formatting, coordinate writer
 *   chart_axis.c   ranges, ticks and tick labels, axis drawing
 *   chart_draw.c   series: clipping, lines, markers, bars, areas; legend
 *   chart_label.c  reference lines and point labels with collision avoidance
 */
#ifndef GASCYCLE_CHART_INTERNAL_H
#define GASCYCLE_CHART_INTERNAL_H

#include "gascycle/chart.h"

/* Colours (text, frame, grid) and the series palette. */
#define GC__CHART_COL_TEXT "#1c2330"
#define GC__CHART_COL_FRAME "#4d5562"
#define GC__CHART_COL_GRID "#e4e8ee"
#define GC__CHART_COL_REF "#3b4250"
extern const char *const gc__chart_palette[GC_CHART_PALETTE];

#define GC__CHART_MAX_TICKS 256

typedef struct gc__chart_box {
    double x0, y0, x1, y1;      /* px, x0 <= x1, y0 <= y1 */
} gc__chart_box;

typedef struct gc__chart_tick {
    double v;                   /* display value */
    int major;                  /* 1: labelled, grid line */
    char text[96];              /* label (SVG character data, already safe), "" if none */
    double chars;               /* estimated width of the label, characters */
} gc__chart_tick;

typedef struct gc__chart_axis {
    const gc_chart_axis *spec;
    int used;                   /* 1: this axis is drawn */
    int log;
    int pad;                    /* 1: markers, bars or labels: pad instead of snapping */
    double lo, hi;              /* display range */
    double p0, p1;              /* px of lo and hi */
    double step;                /* linear: major step; log: decades between labels */
    gc__chart_tick ticks[GC__CHART_MAX_TICKS];
    int n_ticks;
    double label_chars;         /* widest tick label, characters */
} gc__chart_axis;

typedef struct gc__chart_ctx {
    const gc_chart *c;
    gc_strbuf *b;
    gc_error *err;
    int W, H;
    double scale;               /* size factor against the default picture (>= 0.7) */
    double fs;                  /* base font size, px */
    double px0, py0, pw, ph;    /* plot area, px */
    gc__chart_axis ax, ay, ay2;
    int hbars;                  /* 1: a horizontal bar chart */
    unsigned fmt;               /* GC_CHART_FMT_* for numbers */
    int value_digits;
    /* boxes taken by reference-line labels (point labels avoid them) */
    gc__chart_box ref_boxes[GC_CHART_MAX_REFLINES];
    int n_ref_boxes;
} gc__chart_ctx;

/* chart_text.c */
void gc__chart_num(gc_strbuf *b, double v);   /* px, at most 2 decimals, locale-free */
/* Caller text, escaped; cut with "…" beyond max_chars characters (INFINITY:
 * no room limit) or GC_CHART_TEXT_LEN bytes. */
void gc__chart_text_cut(gc_strbuf *b, const char *s, double max_chars);

/* chart_axis.c */
double gc__chart_disp(const gc__chart_axis *a, double v);      /* value -> display */
double gc__chart_px(const gc__chart_axis *a, double d);        /* display -> px */
int gc__chart_axis_range(gc__chart_ctx *x, gc__chart_axis *a, double lo, double hi,
                         double hard_lo, double hard_hi);
int gc__chart_axis_ticks(gc__chart_ctx *x, gc__chart_axis *a, int horizontal, double len_px);
void gc__chart_axis_draw(gc__chart_ctx *x, const gc__chart_axis *a, const char *id, int side);
void gc__chart_grid(gc__chart_ctx *x);

/* chart_draw.c */
const char *gc__chart_color(int color, int series_index);   /* color 0: by index */
const char *gc__chart_dash_attr(gc_chart_dash d);
int gc__chart_series(gc__chart_ctx *x, int i);
int gc__chart_hbars(gc__chart_ctx *x);
int gc__chart_legend_rows(const gc__chart_ctx *x, double usable);
void gc__chart_legend(gc__chart_ctx *x, double left, double top, double usable);

/* chart_label.c */
int gc__chart_reflines(gc__chart_ctx *x);
int gc__chart_labels(gc__chart_ctx *x);
int gc__chart_box_overlap(const gc__chart_box *a, const gc__chart_box *b);

#endif
