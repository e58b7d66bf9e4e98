/*
 * chart.c — gc_chart_svg (chart.h): checks every input, finds the axis
 * ranges, lays out the picture and writes the document in a fixed order
 * (background, title, legend, grid, frame, axes, series in the caller's
 * order, reference lines, point labels, captions).
 *
 * Layout (px at the default 760 x 520; fonts and margins scale with the
 * picture, never below 0.7 of that): a title row, legend rows (wrapped to the
 * width), the plot, x tick labels and axis title, caption lines (word-wrapped,
 * at most 3 lines each). Left and right margins follow the widest estimated
 * tick label (or category label of a bar chart, at most 40 % of the width).
 * A picture too small for its plot after all that (under 80 px either way)
 * is refused rather than drawn illegibly.
 */
#include "chart_internal.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

void gc_chart_init(gc_chart *c)
{
    memset(c, 0, sizeof *c);
    c->group_thousands = 1;
}

/* ---- checks -------------------------------------------------------------- */

/* A number that can be drawn on an axis of the given scale. */
static const char *number_problem(double v, int log_axis)
{
    if (!isfinite(v))
        return "is not a finite number";
    if (fabs(v) > GC_CHART_MAX_ABS)
        return "is beyond the chart's range of +-1e300";
    if (log_axis && !(v > 0.0))
        return "is not positive, so it has no place on a log axis";
    return NULL;
}

static int check_axis(const gc_chart_axis *a, const char *name, gc_error *err)
{
    const char *p;
    if (a->scale != GC_CHART_LINEAR && a->scale != GC_CHART_LOG)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "the %s axis has an unknown scale", name);
    if (a->fixed_min && (p = number_problem(a->min, a->scale == GC_CHART_LOG)))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "the %s axis's fixed minimum %s", name, p);
    if (a->fixed_max && (p = number_problem(a->max, a->scale == GC_CHART_LOG)))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "the %s axis's fixed maximum %s", name, p);
    if (a->fixed_min && a->fixed_max && !(a->max > a->min))
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "the %s axis's fixed range is empty (min must be below max)", name);
    return GC_OK;
}

static int y_log(const gc_chart *c, int y2)
{
    return (y2 ? c->y2.scale : c->y.scale) == GC_CHART_LOG;
}

static int check_series_shape(const gc_chart *c, int i, long *total, gc_error *err)
{
    const gc_chart_series *s = &c->series[i];
    if ((unsigned)s->kind > GC_CHART_AREA)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "series %d has an unknown kind", i + 1);
    if ((unsigned)s->dash > GC_CHART_DOTTED || (unsigned)s->mark > GC_CHART_MARK_DIAMOND)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "series %d has an unknown dash or marker style", i + 1);
    int max = s->kind == GC_CHART_HBARS ? GC_CHART_MAX_BARS : GC_CHART_MAX_POINTS;
    if (s->n < 1 || s->n > max)
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "series %d has %d points; a chart takes 1 to %d per series", i + 1,
                            s->n, max);
    *total += s->n;
    if (!s->x || (!s->y && s->kind != GC_CHART_HBARS))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "series %d has no x or y values", i + 1);
    if (s->kind == GC_CHART_HBARS && !s->text)
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "series %d (horizontal bars) has no category labels", i + 1);
    if (s->y2 && !c->has_y2)
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "series %d is on the second y axis, which the chart does not have",
                            i + 1);
    if (s->kind == GC_CHART_AREA && s->n < 2)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "series %d (area) needs at least 2 points",
                            i + 1);
    return GC_OK;
}

static int check_series_values(const gc_chart *c, int i, gc_error *err)
{
    const gc_chart_series *s = &c->series[i];
    int xlog = c->x.scale == GC_CHART_LOG, ylog = y_log(c, s->y2);
    const char *p;
    for (int k = 0; k < s->n; k++) {
        if ((p = number_problem(s->x[k], xlog)))
            return gc_error_set(err, GC_ERR_INVALID, NULL, "series %d, point %d: x %s", i + 1, k + 1, p);
        if (s->kind != GC_CHART_HBARS && (p = number_problem(s->y[k], ylog)))
            return gc_error_set(err, GC_ERR_INVALID, NULL, "series %d, point %d: y %s", i + 1, k + 1, p);
    }
    if ((s->kind == GC_CHART_VBARS || s->kind == GC_CHART_AREA) && (p = number_problem(s->base, 0)))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "series %d: the base value %s", i + 1, p);
    return GC_OK;
}

/* A horizontal bar chart stands alone: one series, no second axis, no point
 * labels, vertical reference lines only, a linear value axis. */
static int check_hbars(const gc_chart *c, gc_error *err)
{
    int any = 0;
    for (int i = 0; i < c->n_series; i++)
        any |= c->series[i].kind == GC_CHART_HBARS;
    if (!any)
        return GC_OK;
    const char *why = NULL;
    if (c->n_series != 1)
        why = "holds that one series only";
    else if (c->has_y2 || c->n_labels > 0)
        why = "has no second y axis and no point labels";
    else if (c->x.scale != GC_CHART_LINEAR)
        why = "needs a linear value axis (bars stand on zero)";
    for (int i = 0; !why && i < c->n_refs; i++)
        if (!c->refs[i].vertical)
            why = "takes vertical reference lines only";
    if (why)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "a horizontal bar chart %s", why);
    return GC_OK;
}

static int check_refs_labels(const gc_chart *c, gc_error *err)
{
    const char *p;
    if (c->n_refs < 0 || c->n_refs > GC_CHART_MAX_REFLINES || (c->n_refs > 0 && !c->refs))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "a chart takes 0 to %d reference lines",
                            GC_CHART_MAX_REFLINES);
    for (int i = 0; i < c->n_refs; i++) {
        const gc_chart_refline *r = &c->refs[i];
        if (r->y2 && !r->vertical && !c->has_y2)
            return gc_error_set(err, GC_ERR_INVALID, NULL, "reference line %d is on the second y axis, which the chart does "
                       "not have", i + 1);
        if ((unsigned)r->dash > GC_CHART_DOTTED)
            return gc_error_set(err, GC_ERR_INVALID, NULL, "reference line %d has an unknown dash style", i + 1);
        int lg = r->vertical ? c->x.scale == GC_CHART_LOG : y_log(c, r->y2);
        if ((p = number_problem(r->value, lg)))
            return gc_error_set(err, GC_ERR_INVALID, NULL, "reference line %d: the value %s", i + 1, p);
    }
    if (c->n_labels < 0 || c->n_labels > GC_CHART_MAX_LABELS || (c->n_labels > 0 && !c->labels))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "a chart takes 0 to %d point labels",
                            GC_CHART_MAX_LABELS);
    for (int i = 0; i < c->n_labels; i++) {
        const gc_chart_label *l = &c->labels[i];
        if (l->y2 && !c->has_y2)
            return gc_error_set(err, GC_ERR_INVALID, NULL, "point label %d is on the second y axis, which the chart does not "
                       "have", i + 1);
        if ((p = number_problem(l->x, c->x.scale == GC_CHART_LOG)))
            return gc_error_set(err, GC_ERR_INVALID, NULL, "point label %d: x %s", i + 1, p);
        if ((p = number_problem(l->y, y_log(c, l->y2))))
            return gc_error_set(err, GC_ERR_INVALID, NULL, "point label %d: y %s", i + 1, p);
    }
    return GC_OK;
}

static int check_size(const gc_chart *c, gc_error *err)
{
    int W = c->width_px ? c->width_px : GC_CHART_DEFAULT_WIDTH;
    int H = c->height_px ? c->height_px : GC_CHART_DEFAULT_HEIGHT;
    if (W < GC_CHART_MIN_SIZE || W > GC_CHART_MAX_SIZE)
        return gc_error_set(err, GC_ERR_INVALID, "/width", "must be from %d to %d px",
                            GC_CHART_MIN_SIZE, GC_CHART_MAX_SIZE);
    if (H < GC_CHART_MIN_SIZE || H > GC_CHART_MAX_SIZE)
        return gc_error_set(err, GC_ERR_INVALID, "/height", "must be from %d to %d px",
                            GC_CHART_MIN_SIZE, GC_CHART_MAX_SIZE);
    return GC_OK;
}

static int check_chart(const gc_chart *c, gc_error *err)
{
    int rc;
    if (c->n_series < 1 || c->n_series > GC_CHART_MAX_SERIES || !c->series)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "a chart takes 1 to %d series",
                            GC_CHART_MAX_SERIES);
    if (c->n_captions < 0 || c->n_captions > GC_CHART_MAX_CAPTIONS ||
        (c->n_captions > 0 && !c->captions))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "a chart takes 0 to %d caption lines",
                            GC_CHART_MAX_CAPTIONS);
    if (c->value_digits < 0 || c->value_digits > 15)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "value digits must be from 1 to 15");
    if ((rc = check_size(c, err)) != GC_OK || (rc = check_axis(&c->x, "x", err)) != GC_OK ||
        (rc = check_axis(&c->y, "y", err)) != GC_OK ||
        (c->has_y2 && (rc = check_axis(&c->y2, "second y", err)) != GC_OK))
        return rc;
    long total = 0;
    for (int i = 0; i < c->n_series; i++)
        if ((rc = check_series_shape(c, i, &total, err)) != GC_OK)
            return rc;
    if (total > GC_CHART_MAX_TOTAL_POINTS)
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "the series hold %ld points; a chart takes at most %d", total,
                            GC_CHART_MAX_TOTAL_POINTS);
    for (int i = 0; i < c->n_series; i++)
        if ((rc = check_series_values(c, i, err)) != GC_OK)
            return rc;
    if ((rc = check_hbars(c, err)) != GC_OK)
        return rc;
    return check_refs_labels(c, err);
}

/* ---- ranges ------------------------------------------------------------- */

typedef struct extent {
    double lo, hi;              /* soft: data, padded */
    double hard_lo, hard_hi;    /* hard: bar feet and zero, never padded past */
    double bar_pad;             /* display units the bars need beside their positions */
    int pad;
} extent;

static void ext_init(extent *e)
{
    e->lo = e->hard_lo = INFINITY;
    e->hi = e->hard_hi = -INFINITY;
    e->bar_pad = 0.0;
    e->pad = 0;
}

static void ext_add(extent *e, double d)
{
    e->lo = fmin(e->lo, d);
    e->hi = fmax(e->hi, d);
}

static void ext_hard(extent *e, double d)
{
    e->hard_lo = fmin(e->hard_lo, d);
    e->hard_hi = fmax(e->hard_hi, d);
}

static int cmp_double(const void *a, const void *b)
{
    double u = *(const double *)a, v = *(const double *)b;
    return (u > v) - (u < v);
}

/* Room beside vertical bars: 60 % of their closest spacing (display units). */
static int vbar_pad(gc__chart_ctx *x, extent *ex)
{
    const gc_chart *c = x->c;
    int n = 0;
    for (int i = 0; i < c->n_series; i++)
        if (c->series[i].kind == GC_CHART_VBARS)
            n += c->series[i].n;
    if (n < 2)
        return GC_OK;
    double *v = malloc((size_t)n * sizeof *v);
    if (!v)
        return gc_error_set(x->err, GC_ERR_NOMEM, NULL, "out of memory drawing the chart");
    int k = 0;
    for (int i = 0; i < c->n_series; i++)
        for (int j = 0; c->series[i].kind == GC_CHART_VBARS && j < c->series[i].n; j++)
            v[k++] = gc__chart_disp(&x->ax, c->series[i].x[j]);
    qsort(v, (size_t)k, sizeof *v, cmp_double);
    double gap = INFINITY;
    for (int i = 1; i < k; i++)
        if (v[i] > v[i - 1])
            gap = fmin(gap, v[i] - v[i - 1]);
    free(v);
    if (isfinite(gap))
        ex->bar_pad = 0.6 * gap;
    return GC_OK;
}

static void series_extent(const gc__chart_ctx *x, const gc_chart_series *s, extent *ex,
                          extent *ey)
{
    const gc__chart_axis *ay = s->y2 ? &x->ay2 : &x->ay;
    if (s->kind == GC_CHART_HBARS) {
        for (int k = 0; k < s->n; k++)
            ext_add(ex, s->x[k]);
        ext_hard(ex, 0.0);
        ex->pad = 1;
        return;
    }
    for (int k = 0; k < s->n; k++) {
        ext_add(ex, gc__chart_disp(&x->ax, s->x[k]));
        ext_add(ey, gc__chart_disp(ay, s->y[k]));
    }
    int marks = s->kind == GC_CHART_MARKERS || s->kind == GC_CHART_VBARS || s->show_marks;
    ex->pad |= marks;
    ey->pad |= marks;
    if (s->kind == GC_CHART_VBARS || (s->kind == GC_CHART_AREA && s->fill_to_base)) {
        if (!ay->log)
            ext_hard(ey, s->base);
        else if (s->base > 0.0)
            ext_hard(ey, log10(s->base));
    }
}

static void refs_labels_extent(const gc__chart_ctx *x, extent *ex, extent *ey, extent *ey2)
{
    const gc_chart *c = x->c;
    for (int i = 0; i < c->n_refs; i++) {
        const gc_chart_refline *r = &c->refs[i];
        if (r->vertical)
            ext_add(ex, gc__chart_disp(&x->ax, r->value));
        else
            ext_add(r->y2 ? ey2 : ey, gc__chart_disp(r->y2 ? &x->ay2 : &x->ay, r->value));
    }
    for (int i = 0; i < c->n_labels; i++) {
        const gc_chart_label *l = &c->labels[i];
        extent *e = l->y2 ? ey2 : ey;
        ext_add(ex, gc__chart_disp(&x->ax, l->x));
        ext_add(e, gc__chart_disp(l->y2 ? &x->ay2 : &x->ay, l->y));
        ex->pad = e->pad = 1;
    }
}

static int axis_from_extent(gc__chart_ctx *x, gc__chart_axis *a, extent *e)
{
    if (!a->log && a->spec->include_zero)
        ext_hard(e, 0.0);
    a->pad = e->pad;
    double lo = e->lo, hi = e->hi;
    if (e->bar_pad > 0.0 && isfinite(lo)) {   /* whole bars at the ends */
        lo -= e->bar_pad;
        hi += e->bar_pad;
    }
    return gc__chart_axis_range(x, a, lo, hi, e->hard_lo, e->hard_hi);
}

static int ranges(gc__chart_ctx *x)
{
    const gc_chart *c = x->c;
    extent ex, ey, ey2;
    ext_init(&ex);
    ext_init(&ey);
    ext_init(&ey2);
    x->ax.log = c->x.scale == GC_CHART_LOG;
    x->ay.log = c->y.scale == GC_CHART_LOG;
    x->ay2.log = c->y2.scale == GC_CHART_LOG;
    for (int i = 0; i < c->n_series; i++)
        series_extent(x, &c->series[i], &ex, c->series[i].y2 ? &ey2 : &ey);
    refs_labels_extent(x, &ex, &ey, &ey2);
    int rc = vbar_pad(x, &ex);
    if (rc == GC_OK)
        rc = axis_from_extent(x, &x->ax, &ex);
    if (rc == GC_OK && !x->hbars)
        rc = axis_from_extent(x, &x->ay, &ey);
    if (rc == GC_OK && c->has_y2)
        rc = axis_from_extent(x, &x->ay2, &ey2);
    return rc;
}

/* ---- captions ------------------------------------------------------------ */

typedef struct capline {
    int cap;                    /* caption index */
    size_t off, len;            /* bytes of the caption on this line */
    int cut;                    /* 1: the caption goes on beyond this last line: "…" */
} capline;

#define CAP_LINES_EACH 3

/* Word-wraps the captions to max_chars characters a line; returns the lines. */
static int wrap_captions(const gc_chart *c, double max_chars, capline *out)
{
    int n = 0;
    for (int i = 0; i < c->n_captions; i++) {
        const char *s = c->captions[i] ? c->captions[i] : "";
        size_t len = strlen(s) > GC_CHART_TEXT_LEN ? GC_CHART_TEXT_LEN : strlen(s);
        size_t off = 0;
        for (int k = 0; k < CAP_LINES_EACH; k++) {
            size_t end = off, last_space = 0;
            while (end < len && gc_chart_text_chars(s + off, end - off + 1) <= (size_t)max_chars) {
                if (s[end] == ' ')
                    last_space = end;
                end++;
            }
            if (end < len && last_space > off)
                end = last_space;
            while (end < len && end > off && (((unsigned char)s[end]) & 0xC0) == 0x80)
                end--;   /* never split a character */
            out[n] = (capline){ i, off, end - off, 0 };
            off = end;
            while (off < len && s[off] == ' ')
                off++;
            n++;
            if (off >= len) {
                out[n - 1].cut = strlen(s) > len;   /* beyond GC_CHART_TEXT_LEN */
                break;
            }
            if (k == CAP_LINES_EACH - 1)
                out[n - 1].cut = 1;
        }
    }
    return n;
}

static void write_captions(gc__chart_ctx *x, const capline *cl, int n, double top, double lh)
{
    gc_strbuf *b = x->b;
    double fsc = 0.95 * x->fs;
    for (int i = 0; i < n; i++) {
        if (i == 0 || cl[i].cap != cl[i - 1].cap) {
            gc_strbuf_printf(b, "<text class=\"gc-caption\" id=\"caption-%d\" font-size=\"", cl[i].cap + 1);
            gc__chart_num(b, fsc);
            gc_strbuf_puts(b, "\">");
        }
        gc_strbuf_puts(b, "<tspan x=\"");
        gc__chart_num(b, 12.0 * x->scale);
        gc_strbuf_puts(b, "\" y=\"");
        gc__chart_num(b, top + i * lh + GC_CHART_ASCENT_EM * fsc);
        gc_strbuf_puts(b, "\">");
        gc_chart_escape(b, x->c->captions[cl[i].cap] + cl[i].off, cl[i].len);
        if (cl[i].cut)
            gc_strbuf_puts(b, "\xe2\x80\xa6");
        gc_strbuf_puts(b, "</tspan>");
        if (i == n - 1 || cl[i + 1].cap != cl[i].cap)
            gc_strbuf_puts(b, "</text>\n");
    }
}

/* ---- layout -------------------------------------------------------------- */

typedef struct layout {
    double title_y;             /* baseline of the title, or 0 */
    double legend_top;
    double usable;              /* width for legend and captions */
    capline caps[GC_CHART_MAX_CAPTIONS * CAP_LINES_EACH];
    int n_caps;
    double caps_top, cap_lh;
} layout;

static int has_title(const gc_chart_axis *a)
{
    return (a->title && *a->title) || (a->unit && *a->unit);
}

static double hbar_label_width(const gc__chart_ctx *x)
{
    const gc_chart_series *s = &x->c->series[0];
    double chars = 0.0;
    for (int i = 0; i < s->n; i++)
        chars = fmax(chars, (double)gc_chart_text_chars(s->text[i], GC_CHART_TEXT_LEN));
    return fmin(chars * GC_CHART_CHAR_EM * x->fs, 0.4 * x->W);
}

/* Vertical layout: title, legend, plot top and height, captions. */
static int layout_rows(gc__chart_ctx *x, layout *L)
{
    const gc_chart *c = x->c;
    double sc = x->scale, fs = x->fs;
    double top = 10.0 * sc;
    L->usable = x->W - 24.0 * sc;
    L->title_y = 0.0;
    if (c->title && *c->title) {
        L->title_y = top + GC_CHART_ASCENT_EM * 1.25 * fs + 4.0 * sc;
        top = L->title_y + GC_CHART_DESCENT_EM * 1.25 * fs + 8.0 * sc;
    }
    L->legend_top = top;
    int rows = gc__chart_legend_rows(x, L->usable);
    top += rows * 18.0 * sc + (rows ? 4.0 * sc : 0.0);
    x->py0 = top + 8.0 * sc;
    double fsc = 0.95 * fs;
    L->cap_lh = 1.35 * fsc;
    L->n_caps = wrap_captions(c, L->usable / (GC_CHART_CHAR_EM * fsc), L->caps);
    double bottom = x->H - 8.0 * sc - L->n_caps * L->cap_lh;
    L->caps_top = bottom + 2.0 * sc;
    if (has_title(&c->x))
        bottom -= fs + 8.0 * sc;
    bottom -= 14.0 * sc + 0.92 * fs;
    x->ph = bottom - x->py0;
    if (x->ph < 80.0)
        return gc_error_set(x->err, GC_ERR_INVALID, "/height",
                            "the picture is too small for its legend, captions and plot");
    return GC_OK;
}

/* Horizontal layout after the y ticks are known: margins, plot width. */
static int layout_columns(gc__chart_ctx *x)
{
    const gc_chart *c = x->c;
    double sc = x->scale, fst = 0.92 * x->fs;
    double left = 8.0 * sc + (has_title(&c->y) ? x->fs + 6.0 * sc : 0.0);
    if (x->hbars)
        left += hbar_label_width(x) + 14.0 * sc;
    else
        left += x->ay.label_chars * GC_CHART_CHAR_EM * fst + 15.0 * sc;
    left = fmax(left, 30.0 * sc);
    double right = 24.0 * sc;
    if (c->has_y2)
        right = 8.0 * sc + (has_title(&c->y2) ? x->fs + 6.0 * sc : 0.0) +
                x->ay2.label_chars * GC_CHART_CHAR_EM * fst + 15.0 * sc;
    x->px0 = left;
    x->pw = x->W - left - right;
    if (x->pw < 80.0)
        return gc_error_set(x->err, GC_ERR_INVALID, "/width",
                            "the picture is too narrow for its labels and plot");
    return GC_OK;
}

static int layout_axes(gc__chart_ctx *x)
{
    int rc = GC_OK;
    x->ay.p0 = x->ay2.p0 = x->py0 + x->ph;
    x->ay.p1 = x->ay2.p1 = x->py0;
    if (!x->hbars)
        rc = gc__chart_axis_ticks(x, &x->ay, 0, x->ph);
    if (rc == GC_OK && x->c->has_y2)
        rc = gc__chart_axis_ticks(x, &x->ay2, 0, x->ph);
    if (rc == GC_OK)
        rc = layout_columns(x);
    if (rc == GC_OK) {
        x->ax.p0 = x->px0;
        x->ax.p1 = x->px0 + x->pw;
        rc = gc__chart_axis_ticks(x, &x->ax, 1, x->pw);
    }
    return rc;
}

/* ---- the document -------------------------------------------------------- */

static void header(gc__chart_ctx *x, const layout *L)
{
    const gc_chart *c = x->c;
    gc_strbuf *b = x->b;
    gc_strbuf_puts(b, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
    gc_strbuf_printf(b, "<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" class=\"gc-chart\" "
                     "width=\"%d\" height=\"%d\" viewBox=\"0 0 %d %d\" font-family=\"sans-serif\" "
                     "font-size=\"", x->W, x->H, x->W, x->H);
    gc__chart_num(b, x->fs);
    gc_strbuf_puts(b, "\" fill=\"" GC__CHART_COL_TEXT "\">\n<title>");
    gc_chart_escape(b, c->title && *c->title ? c->title : "Chart", GC_CHART_TEXT_LEN);
    gc_strbuf_puts(b, "</title>\n<desc>");
    if (c->desc) {
        gc_chart_escape(b, c->desc, 4 * GC_CHART_TEXT_LEN);
    } else {
        gc_strbuf_printf(b, "Chart of %d series", c->n_series);
        const char *sep = ": ";
        for (int i = 0; i < c->n_series; i++) {
            if (!c->series[i].name || !*c->series[i].name)
                continue;
            gc_strbuf_puts(b, sep);
            gc_chart_escape(b, c->series[i].name, GC_CHART_TEXT_LEN);
            sep = "; ";
        }
        gc_strbuf_ch(b, '.');
    }
    gc_strbuf_puts(b, "</desc>\n<defs><clipPath id=\"gc-chart-clip\"><rect x=\"");
    gc__chart_num(b, x->px0);
    gc_strbuf_puts(b, "\" y=\"");
    gc__chart_num(b, x->py0);
    gc_strbuf_puts(b, "\" width=\"");
    gc__chart_num(b, x->pw);
    gc_strbuf_puts(b, "\" height=\"");
    gc__chart_num(b, x->ph);
    gc_strbuf_printf(b, "\"/></clipPath></defs>\n<rect class=\"gc-background\" x=\"0\" y=\"0\" "
                     "width=\"%d\" height=\"%d\" fill=\"#ffffff\"/>\n", x->W, x->H);
    if (L->title_y > 0.0) {
        gc_strbuf_puts(b, "<text class=\"gc-title\" font-weight=\"bold\" x=\"");
        gc__chart_num(b, 12.0 * x->scale);
        gc_strbuf_puts(b, "\" y=\"");
        gc__chart_num(b, L->title_y);
        gc_strbuf_puts(b, "\" font-size=\"");
        gc__chart_num(b, 1.25 * x->fs);
        gc_strbuf_puts(b, "\">");
        gc__chart_text_cut(b, c->title, L->usable / (GC_CHART_CHAR_EM * 1.25 * x->fs));
        gc_strbuf_puts(b, "</text>\n");
    }
}

static void frame(gc__chart_ctx *x)
{
    gc_strbuf *b = x->b;
    gc_strbuf_puts(b, "<rect class=\"gc-plot\" x=\"");
    gc__chart_num(b, x->px0);
    gc_strbuf_puts(b, "\" y=\"");
    gc__chart_num(b, x->py0);
    gc_strbuf_puts(b, "\" width=\"");
    gc__chart_num(b, x->pw);
    gc_strbuf_puts(b, "\" height=\"");
    gc__chart_num(b, x->ph);
    gc_strbuf_puts(b, "\" fill=\"none\" stroke=\"" GC__CHART_COL_FRAME "\" stroke-width=\"1.2\"/>\n");
}

static int body(gc__chart_ctx *x, const layout *L)
{
    const gc_chart *c = x->c;
    header(x, L);
    gc__chart_legend(x, 12.0 * x->scale, L->legend_top, L->usable);
    gc__chart_grid(x);
    frame(x);
    gc__chart_axis_draw(x, &x->ax, "x", 0);
    if (!x->hbars)
        gc__chart_axis_draw(x, &x->ay, "y", 1);
    else if (has_title(&c->y))   /* the category axis: its title only */
        gc__chart_axis_draw(x, &x->ay, "y", 1);
    if (c->has_y2)
        gc__chart_axis_draw(x, &x->ay2, "y2", 2);
    int rc = GC_OK;
    if (x->hbars)
        rc = gc__chart_hbars(x);
    for (int i = 0; !x->hbars && i < c->n_series && rc == GC_OK; i++)
        rc = gc__chart_series(x, i);
    if (rc == GC_OK)
        rc = gc__chart_reflines(x);
    if (rc == GC_OK)
        rc = gc__chart_labels(x);
    write_captions(x, L->caps, L->n_caps, L->caps_top, L->cap_lh);
    gc_strbuf_puts(x->b, "</svg>\n");
    return rc;
}

static int render(gc__chart_ctx *x)
{
    layout L;
    int rc = ranges(x);
    if (rc == GC_OK)
        rc = layout_rows(x, &L);
    if (rc == GC_OK)
        rc = layout_axes(x);
    if (rc == GC_OK)
        rc = body(x, &L);
    if (rc == GC_OK && x->b->failed)
        rc = gc_error_set(x->err, GC_ERR_NOMEM, NULL, "out of memory drawing the chart");
    return rc;
}

int gc_chart_svg(const gc_chart *c, char **svg_out, size_t *len, gc_error *err)
{
    if (svg_out)
        *svg_out = NULL;
    if (len)
        *len = 0;
    if (!c || !svg_out || !len)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "no chart to draw");
    int rc = check_chart(c, err);
    if (rc != GC_OK)
        return rc;
    gc__chart_ctx *x = calloc(1, sizeof *x);   /* tick tables: too big for small stacks */
    if (!x)
        return gc_error_set(err, GC_ERR_NOMEM, NULL, "out of memory drawing the chart");
    gc_strbuf b = { .first_cap = 16384 };
    x->c = c;
    x->b = &b;
    x->err = err;
    x->W = c->width_px ? c->width_px : GC_CHART_DEFAULT_WIDTH;
    x->H = c->height_px ? c->height_px : GC_CHART_DEFAULT_HEIGHT;
    x->scale = fmax(0.7, fmin(x->W / (double)GC_CHART_DEFAULT_WIDTH,
                              x->H / (double)GC_CHART_DEFAULT_HEIGHT));
    x->fs = 12.0 * x->scale;
    x->hbars = c->series[0].kind == GC_CHART_HBARS;
    x->fmt = c->group_thousands ? GC_CHART_FMT_GROUP : 0u;
    x->value_digits = c->value_digits ? c->value_digits : 3;
    x->ax.spec = &c->x;
    x->ay.spec = &c->y;
    x->ay2.spec = &c->y2;
    rc = render(x);
    free(x);
    if (rc != GC_OK || !b.s) {
        free(b.s);
        return rc != GC_OK ? rc
                           : gc_error_set(err, GC_ERR_NOMEM, NULL, "out of memory drawing the chart");
    }
    *svg_out = b.s;
    *len = b.len;
    return GC_OK;
}
