/*
 * chart_draw.c — the series of a chart (chart.h): polylines, step lines,
 * markers, vertical bars, filled areas, the horizontal bar chart, and the
 * legend.
 *
 * Clipping is geometric and done in display units before mapping to px, so
 * every written vertex lies in the plot area and no coordinate can grow
 * without bound whatever the data and a fixed range: segments by
 * Liang-Barsky (Liang & Barsky 1984), polygons by Sutherland-Hodgman
 * (Sutherland & Hodgman 1974) against the four sides in turn, bars cut to
 * the frame (exact for axis-aligned rectangles), markers outside left out.
 * The clip-path on each series group only trims marker outlines and stroke
 * widths at the frame.
 *
 * Palette (kept apart for the common colour-vision deficiencies and doubled
 * by dash patterns and marker shapes): deep blue, burnt orange, plum, teal
 * green, crimson, ochre, sky blue, slate grey — the first three as in the
 * cycle diagrams (diagram.c).
 */
#include "chart_internal.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

const char *const gc__chart_palette[GC_CHART_PALETTE] = {
    "#1f5ea8", "#cc5f1a", "#7b4a92", "#1b8a6b", "#b8324f", "#8a7414", "#3f9fd1", "#5b6470",
};

/* gc-kind-<name> classes of the series groups, by gc_chart_kind */
static const char *const kind_class[] = { "line", "markers", "step", "vbars", "hbars", "area" };

const char *gc__chart_color(int color, int series_index)
{
    int i = color >= 1 ? color - 1 : series_index;
    return gc__chart_palette[(unsigned)i % GC_CHART_PALETTE];
}

const char *gc__chart_dash_attr(gc_chart_dash d)
{
    switch (d) {
    case GC_CHART_DASHED: return " stroke-dasharray=\"8 5\"";
    case GC_CHART_DOTTED: return " stroke-dasharray=\"0.1 5\" stroke-linecap=\"round\"";
    default: return "";
    }
}

static void put_xy(gc_strbuf *b, double x, double y)
{
    gc__chart_num(b, x);
    gc_strbuf_ch(b, ',');
    gc__chart_num(b, y);
}

/* Takes back what was written since mark (an element with nothing visible). */
static void rewind_to(gc_strbuf *b, size_t mark)
{
    if (!b->failed && b->s && mark <= b->len) {
        b->len = mark;
        b->s[mark] = '\0';
    }
}

static void attr_num(gc_strbuf *b, const char *name, double v)
{
    gc_strbuf_printf(b, " %s=\"", name);
    gc__chart_num(b, v);
    gc_strbuf_ch(b, '"');
}

/* ---- clipping (display units) ------------------------------------------ */

typedef struct clipbox {
    double xl, xh, yl, yh;
} clipbox;

/* Liang-Barsky: the part [t0, t1] of p0 + t (p1 - p0) inside the box; 0 if none. */
static int clip_segment(const clipbox *c, double x0, double y0, double x1, double y1,
                        double *t0, double *t1)
{
    double dx = x1 - x0, dy = y1 - y0;
    double p[4] = { -dx, dx, -dy, dy };
    double q[4] = { x0 - c->xl, c->xh - x0, y0 - c->yl, c->yh - y0 };
    double a = 0.0, z = 1.0;
    for (int i = 0; i < 4; i++) {
        if (p[i] == 0.0) {
            if (q[i] < 0.0)
                return 0;
            continue;
        }
        double r = q[i] / p[i];
        if (p[i] < 0.0) {
            if (r > z)
                return 0;
            if (r > a)
                a = r;
        } else {
            if (r < a)
                return 0;
            if (r < z)
                z = r;
        }
    }
    *t0 = a;
    *t1 = z;
    return 1;
}

typedef struct pts {
    double *x, *y;
    int n, cap;
} pts;

static int pts_push(pts *p, double x, double y)
{
    if (p->n == p->cap) {
        int cap = p->cap ? 2 * p->cap : 64;
        double *nx = realloc(p->x, (size_t)cap * sizeof *nx);
        if (!nx)
            return -1;
        p->x = nx;
        double *ny = realloc(p->y, (size_t)cap * sizeof *ny);
        if (!ny)
            return -1;
        p->y = ny;
        p->cap = cap;
    }
    p->x[p->n] = x;
    p->y[p->n] = y;
    p->n++;
    return 0;
}

static void pts_free(pts *p)
{
    free(p->x);
    free(p->y);
    memset(p, 0, sizeof *p);
}

/* Signed distance inside one side: side 0 x >= xl, 1 x <= xh, 2 y >= yl, 3 y <= yh. */
static double inside_by(const clipbox *c, int side, double x, double y)
{
    switch (side) {
    case 0: return x - c->xl;
    case 1: return c->xh - x;
    case 2: return y - c->yl;
    default: return c->yh - y;
    }
}

/* One Sutherland-Hodgman pass of polygon in against one side into out. */
static int clip_side(const clipbox *c, int side, const pts *in, pts *out)
{
    out->n = 0;
    for (int i = 0; i < in->n; i++) {
        int j = (i + 1) % in->n;
        double di = inside_by(c, side, in->x[i], in->y[i]);
        double dj = inside_by(c, side, in->x[j], in->y[j]);
        if (di >= 0.0 && pts_push(out, in->x[i], in->y[i]) != 0)
            return -1;
        if ((di >= 0.0) != (dj >= 0.0)) {
            double t = di / (di - dj);
            double xx = in->x[i] + t * (in->x[j] - in->x[i]);
            double yy = in->y[i] + t * (in->y[j] - in->y[i]);
            if (side < 2)   /* land exactly on the side despite rounding */
                xx = side == 0 ? c->xl : c->xh;
            else
                yy = side == 2 ? c->yl : c->yh;
            if (pts_push(out, xx, yy) != 0)
                return -1;
        }
    }
    return 0;
}

static int clip_polygon(const clipbox *c, pts *poly)
{
    pts tmp = { 0 };
    for (int side = 0; side < 4 && poly->n > 0; side++) {
        if (clip_side(c, side, poly, &tmp) != 0) {
            pts_free(&tmp);
            return -1;
        }
        pts sw = *poly;
        *poly = tmp;
        tmp = sw;
    }
    pts_free(&tmp);
    return 0;
}

/* ---- series in display units --------------------------------------------- */

static const gc__chart_axis *yaxis(const gc__chart_ctx *x, int y2)
{
    return y2 ? &x->ay2 : &x->ay;
}

static clipbox box_of(const gc__chart_ctx *x, int y2)
{
    const gc__chart_axis *ay = yaxis(x, y2);
    clipbox c = { x->ax.lo, x->ax.hi, ay->lo, ay->hi };
    return c;
}

/* The series' points in display units (STEP expanded into its corners). */
static int display_points(const gc__chart_ctx *x, const gc_chart_series *s, pts *p)
{
    const gc__chart_axis *ay = yaxis(x, s->y2);
    for (int i = 0; i < s->n; i++) {
        double dx = gc__chart_disp(&x->ax, s->x[i]), dy = gc__chart_disp(ay, s->y[i]);
        if (s->kind == GC_CHART_STEP && i > 0 && pts_push(p, dx, p->y[p->n - 1]) != 0)
            return -1;
        if (pts_push(p, dx, dy) != 0)
            return -1;
    }
    return 0;
}

/* Writes the visible parts of the polyline p (closed: back to its start) as
 * path data; returns the number of drawn segments. */
static int write_polyline(gc__chart_ctx *x, const gc__chart_axis *ay, const pts *p, int closed)
{
    clipbox c = { x->ax.lo, x->ax.hi, ay->lo, ay->hi };
    int drawn = 0, pen = 0;
    double lx = 0.0, ly = 0.0;
    int segs = closed && p->n > 2 ? p->n : p->n - 1;
    for (int i = 0; i < segs; i++) {
        int j = (i + 1) % p->n;
        double t0, t1;
        if (!clip_segment(&c, p->x[i], p->y[i], p->x[j], p->y[j], &t0, &t1))
            continue;
        double ax0 = p->x[i] + t0 * (p->x[j] - p->x[i]), ay0 = p->y[i] + t0 * (p->y[j] - p->y[i]);
        double ax1 = p->x[i] + t1 * (p->x[j] - p->x[i]), ay1 = p->y[i] + t1 * (p->y[j] - p->y[i]);
        double X0 = gc__chart_px(&x->ax, ax0), Y0 = gc__chart_px(ay, ay0);
        double X1 = gc__chart_px(&x->ax, ax1), Y1 = gc__chart_px(ay, ay1);
        if (!pen || t0 > 0.0 || X0 != lx || Y0 != ly) {
            gc_strbuf_puts(x->b, drawn ? " M" : "M");
            put_xy(x->b, X0, Y0);
        }
        gc_strbuf_puts(x->b, " L");
        put_xy(x->b, X1, Y1);
        pen = t1 >= 1.0;
        lx = X1;
        ly = Y1;
        drawn++;
    }
    return drawn;
}

/* ---- markers ------------------------------------------------------------- */

static gc_chart_mark mark_of(const gc_chart_series *s, int index)
{
    if (s->mark >= GC_CHART_MARK_CIRCLE && s->mark <= GC_CHART_MARK_DIAMOND)
        return s->mark;
    return (gc_chart_mark)(GC_CHART_MARK_CIRCLE + index % 4);
}

static void mark_shape(gc_strbuf *b, gc_chart_mark m, double cx, double cy, double r)
{
    switch (m) {
    case GC_CHART_MARK_SQUARE:
        gc_strbuf_puts(b, "<rect");
        attr_num(b, "x", cx - 0.85 * r);
        attr_num(b, "y", cy - 0.85 * r);
        attr_num(b, "width", 1.7 * r);
        attr_num(b, "height", 1.7 * r);
        gc_strbuf_puts(b, "/>");
        break;
    case GC_CHART_MARK_TRIANGLE:
        gc_strbuf_puts(b, "<path d=\"M");
        put_xy(b, cx, cy - 1.15 * r);
        gc_strbuf_puts(b, " L");
        put_xy(b, cx + r, cy + 0.6 * r);
        gc_strbuf_puts(b, " L");
        put_xy(b, cx - r, cy + 0.6 * r);
        gc_strbuf_puts(b, " Z\"/>");
        break;
    case GC_CHART_MARK_DIAMOND:
        gc_strbuf_puts(b, "<path d=\"M");
        put_xy(b, cx, cy - 1.2 * r);
        gc_strbuf_puts(b, " L");
        put_xy(b, cx + 1.2 * r, cy);
        gc_strbuf_puts(b, " L");
        put_xy(b, cx, cy + 1.2 * r);
        gc_strbuf_puts(b, " L");
        put_xy(b, cx - 1.2 * r, cy);
        gc_strbuf_puts(b, " Z\"/>");
        break;
    default:
        gc_strbuf_puts(b, "<circle");
        attr_num(b, "cx", cx);
        attr_num(b, "cy", cy);
        attr_num(b, "r", r);
        gc_strbuf_puts(b, "/>");
        break;
    }
}

static int in_range(const gc__chart_axis *a, double d)
{
    double tol = 1e-9 * (a->hi - a->lo);
    return d >= a->lo - tol && d <= a->hi + tol;
}

/* Markers at the points inside the plot; filled (scatter) or hollow (on a line). */
static void write_marks(gc__chart_ctx *x, const gc_chart_series *s, int idx, int filled)
{
    const gc__chart_axis *ay = yaxis(x, s->y2);
    const char *col = gc__chart_color(s->color, idx);
    gc_strbuf_printf(x->b, "<g class=\"gc-marks\" fill=\"%s\" stroke=\"%s\" stroke-width=\"%s\">\n",
                     filled ? col : "#ffffff", filled ? "#ffffff" : col, filled ? "0.8" : "1.6");
    gc_chart_mark m = mark_of(s, idx);
    double r = (filled ? 3.6 : 3.2) * x->scale;
    for (int i = 0; i < s->n; i++) {
        double dx = gc__chart_disp(&x->ax, s->x[i]), dy = gc__chart_disp(ay, s->y[i]);
        if (!in_range(&x->ax, dx) || !in_range(ay, dy))
            continue;
        mark_shape(x->b, m, gc__chart_px(&x->ax, fmin(fmax(dx, x->ax.lo), x->ax.hi)),
                   gc__chart_px(ay, fmin(fmax(dy, ay->lo), ay->hi)), r);
        gc_strbuf_ch(x->b, '\n');
    }
    gc_strbuf_puts(x->b, "</g>\n");
}

/* ---- the kinds ----------------------------------------------------------- */

static int oom(gc__chart_ctx *x)
{
    return gc_error_set(x->err, GC_ERR_NOMEM, NULL, "out of memory drawing the chart");
}

static int draw_line(gc__chart_ctx *x, const gc_chart_series *s, int idx)
{
    pts p = { 0 };
    if (display_points(x, s, &p) != 0) {
        pts_free(&p);
        return oom(x);
    }
    size_t mark = x->b->len;
    gc_strbuf_printf(x->b, "<path class=\"gc-line\" fill=\"none\" stroke=\"%s\" stroke-width=\"2.2\" "
                     "stroke-linejoin=\"round\"%s d=\"", gc__chart_color(s->color, idx),
                     gc__chart_dash_attr(s->dash));
    int drawn = write_polyline(x, yaxis(x, s->y2), &p, 0);
    if (drawn > 0)
        gc_strbuf_puts(x->b, "\"/>\n");
    else
        rewind_to(x->b, mark);   /* nothing visible: no element */
    pts_free(&p);
    if (s->show_marks || s->n == 1)
        write_marks(x, s, idx, 0);
    return GC_OK;
}

static int draw_area(gc__chart_ctx *x, const gc_chart_series *s, int idx)
{
    const gc__chart_axis *ay = yaxis(x, s->y2);
    pts curve = { 0 }, poly = { 0 };
    int rc = GC_OK;
    if (display_points(x, s, &curve) != 0 || display_points(x, s, &poly) != 0)
        rc = oom(x);
    if (rc == GC_OK && s->fill_to_base) {
        double base = ay->log ? (s->base > 0.0 ? log10(s->base) : ay->lo) : s->base;
        if (pts_push(&poly, poly.x[poly.n - 1], base) != 0 || pts_push(&poly, poly.x[0], base) != 0)
            rc = oom(x);
    }
    clipbox c = box_of(x, s->y2);
    if (rc == GC_OK && clip_polygon(&c, &poly) != 0)
        rc = oom(x);
    const char *col = gc__chart_color(s->color, idx);
    if (rc == GC_OK && poly.n >= 3) {
        gc_strbuf_printf(x->b, "<path class=\"gc-fill\" fill=\"%s\" fill-opacity=\"0.16\" "
                         "stroke=\"none\" d=\"M", col);
        for (int i = 0; i < poly.n; i++) {
            if (i > 0)
                gc_strbuf_puts(x->b, " L");
            put_xy(x->b, gc__chart_px(&x->ax, poly.x[i]), gc__chart_px(ay, poly.y[i]));
        }
        gc_strbuf_puts(x->b, " Z\"/>\n");
    }
    if (rc == GC_OK) {
        size_t mark = x->b->len;
        gc_strbuf_printf(x->b, "<path class=\"gc-line\" fill=\"none\" stroke=\"%s\" "
                         "stroke-width=\"1.6\" stroke-linejoin=\"round\"%s d=\"", col,
                         gc__chart_dash_attr(s->dash));
        if (write_polyline(x, ay, &curve, !s->fill_to_base) > 0)
            gc_strbuf_puts(x->b, "\"/>\n");
        else
            rewind_to(x->b, mark);
    }
    pts_free(&curve);
    pts_free(&poly);
    return rc;
}

static int cmp_double(const void *a, const void *b)
{
    double u = *(const double *)a, v = *(const double *)b;
    return (u > v) - (u < v);
}

/* Display x clamped to a band around the axis (px stay bounded). */
static double clamp_band(const gc__chart_axis *a, double d)
{
    double span = a->hi - a->lo;
    return fmin(fmax(d, a->lo - span), a->hi + span);
}

/* Width of one group of bars (px): 80 % of the closest spacing of any two
 * bar positions of all vertical-bar series, or 30 % of the plot for one. */
static int bar_group_px(gc__chart_ctx *x, double *group)
{
    const gc_chart *c = x->c;
    int n = 0;
    for (int i = 0; i < c->n_series; i++)
        if (c->series[i].kind == GC_CHART_VBARS)
            n += c->series[i].n;
    double *v = malloc((size_t)n * sizeof *v);
    if (!v)
        return oom(x);
    int k = 0;
    for (int i = 0; i < c->n_series; i++) {
        const gc_chart_series *s = &c->series[i];
        for (int j = 0; s->kind == GC_CHART_VBARS && j < s->n; j++)
            v[k++] = gc__chart_px(&x->ax, clamp_band(&x->ax, gc__chart_disp(&x->ax, s->x[j])));
    }
    qsort(v, (size_t)k, sizeof *v, cmp_double);
    double gap = INFINITY;
    for (int i = 1; i < k; i++)
        if (v[i] - v[i - 1] > 0.5)
            gap = fmin(gap, v[i] - v[i - 1]);
    free(v);
    *group = isfinite(gap) ? 0.8 * gap : 0.3 * x->pw;
    *group = fmin(*group, 0.3 * x->pw);
    return GC_OK;
}

static int draw_vbars(gc__chart_ctx *x, const gc_chart_series *s, int idx)
{
    const gc_chart *c = x->c;
    const gc__chart_axis *ay = yaxis(x, s->y2);
    int m = 0, k = 0;
    for (int i = 0; i < c->n_series; i++) {
        if (c->series[i].kind != GC_CHART_VBARS)
            continue;
        if (i == idx)
            k = m;
        m++;
    }
    double group = 0.0;
    int rc = bar_group_px(x, &group);
    if (rc != GC_OK)
        return rc;
    double bw = group / m;
    double base = ay->log ? (s->base > 0.0 ? log10(s->base) : ay->lo) : s->base;
    double yb = gc__chart_px(ay, fmin(fmax(base, ay->lo), ay->hi));
    gc_strbuf_printf(x->b, "<g class=\"gc-bars\" fill=\"%s\">\n", gc__chart_color(s->color, idx));
    for (int i = 0; i < s->n; i++) {
        double xc = gc__chart_px(&x->ax, clamp_band(&x->ax, gc__chart_disp(&x->ax, s->x[i])));
        double x0 = fmax(xc - group / 2.0 + k * bw + 0.5, x->px0);
        double x1 = fmin(xc - group / 2.0 + (k + 1) * bw - 0.5, x->px0 + x->pw);
        double dy = fmin(fmax(gc__chart_disp(ay, s->y[i]), ay->lo), ay->hi);
        double yt = gc__chart_px(ay, dy);
        double y0 = fmin(yt, yb), y1 = fmax(yt, yb);
        if (!(x1 > x0) || !(y1 > y0))
            continue;
        gc_strbuf_printf(x->b, "<rect class=\"gc-bar\" id=\"series-%d-bar-%d\"", idx + 1, i + 1);
        attr_num(x->b, "x", x0);
        attr_num(x->b, "y", y0);
        attr_num(x->b, "width", x1 - x0);
        attr_num(x->b, "height", y1 - y0);
        gc_strbuf_puts(x->b, "/>\n");
        if (s->text && s->text[i] && *s->text[i]) {
            double ty = yt <= yb ? y0 - 4.0 * x->scale : y1 + x->fs;
            gc_strbuf_puts(x->b, "<text class=\"gc-bar-value\" text-anchor=\"middle\" fill=\""
                           GC__CHART_COL_TEXT "\"");
            attr_num(x->b, "x", 0.5 * (x0 + x1));
            attr_num(x->b, "y", ty);
            gc_strbuf_ch(x->b, '>');
            gc__chart_text_cut(x->b, s->text[i], INFINITY);
            gc_strbuf_puts(x->b, "</text>\n");
        }
    }
    gc_strbuf_puts(x->b, "</g>\n");
    return GC_OK;
}

int gc__chart_series(gc__chart_ctx *x, int i)
{
    const gc_chart_series *s = &x->c->series[i];
    gc_strbuf_printf(x->b, "<g class=\"gc-series gc-series-%d gc-kind-%s\" id=\"series-%d\" "
                     "clip-path=\"url(#gc-chart-clip)\">\n", i + 1, kind_class[s->kind], i + 1);
    int rc = GC_OK;
    switch (s->kind) {
    case GC_CHART_LINE:
    case GC_CHART_STEP: rc = draw_line(x, s, i); break;
    case GC_CHART_MARKERS: write_marks(x, s, i, 1); break;
    case GC_CHART_VBARS: rc = draw_vbars(x, s, i); break;
    case GC_CHART_AREA: rc = draw_area(x, s, i); break;
    default: break;
    }
    gc_strbuf_puts(x->b, "</g>\n");
    return rc;
}

/* ---- horizontal bar chart ------------------------------------------------ */

/* One bar's value text: the caller's, or the value with value_digits digits. */
static void bar_value_text(const gc__chart_ctx *x, const gc_chart_series *s, int i, char *out,
                           size_t n, double *chars)
{
    if (s->value_text && s->value_text[i]) {
        gc_strbuf t = { 0 };
        gc__chart_text_cut(&t, s->value_text[i], INFINITY);
        snprintf(out, n, "%s", t.s ? t.s : "");
        free(t.s);
        *chars = (double)gc_chart_text_chars(s->value_text[i], GC_CHART_TEXT_LEN);
        return;
    }
    unsigned f = x->fmt | GC_CHART_FMT_SVG | GC_CHART_FMT_ZEROS;
    if (gc_chart_format_sig(s->x[i], x->value_digits, f, out, n) < 0)
        out[0] = '\0';
    *chars = (double)gc_chart_text_chars(out, n);
    if (strstr(out, "<tspan"))
        *chars = 8.0;
}

static void hbar_one(gc__chart_ctx *x, const gc_chart_series *s, int i, double row, double yb0)
{
    double sc = x->scale, fsb = fmin(x->fs, 0.8 * row);
    double th = fmin(0.7 * row, 40.0 * sc);
    double yc = x->py0 + (i + 0.5) * row;
    double p0 = gc__chart_px(&x->ax, fmin(fmax(yb0, x->ax.lo), x->ax.hi));
    double p1 = gc__chart_px(&x->ax, fmin(fmax(s->x[i], x->ax.lo), x->ax.hi));
    double l = fmin(p0, p1), r = fmax(p0, p1);
    gc_strbuf *b = x->b;
    gc_strbuf_printf(b, "<g class=\"gc-bar-row\" id=\"bar-%d\">", i + 1);
    gc_strbuf_printf(b, "<rect class=\"gc-bar\" fill=\"%s\" clip-path=\"url(#gc-chart-clip)\"",
                     gc__chart_color(s->color, 0));
    attr_num(b, "x", l);
    attr_num(b, "y", yc - th / 2.0);
    attr_num(b, "width", r - l);
    attr_num(b, "height", th);
    gc_strbuf_puts(b, "/>");
    /* category label, right-aligned left of the plot, cut to the margin */
    gc_strbuf_puts(b, "<text class=\"gc-category\" text-anchor=\"end\"");
    attr_num(b, "x", x->px0 - 8.0 * sc);
    attr_num(b, "y", yc + 0.5 * (GC_CHART_ASCENT_EM - GC_CHART_DESCENT_EM) * fsb);
    attr_num(b, "font-size", fsb);
    gc_strbuf_ch(b, '>');
    gc__chart_text_cut(b, s->text[i], (x->px0 - 20.0 * sc) / (GC_CHART_CHAR_EM * fsb));
    gc_strbuf_puts(b, "</text>");
    /* value: inside the bar's end when it fits, else just beyond it */
    char val[6 * GC_CHART_TEXT_LEN + 16];   /* escaped: at most 6 bytes a byte, and "…" */
    double chars;
    bar_value_text(x, s, i, val, sizeof val, &chars);
    double tw = chars * GC_CHART_CHAR_EM * fsb;
    int neg = p1 < p0, inside = r - l >= tw + 10.0 * sc;
    double tx = inside ? (neg ? l + 5.0 * sc : r - 5.0 * sc) : (neg ? l - 5.0 * sc : r + 5.0 * sc);
    const char *anchor = (inside != neg) ? "end" : "start";
    gc_strbuf_printf(b, "<text class=\"gc-bar-value\" text-anchor=\"%s\" fill=\"%s\"", anchor,
                     inside ? "#ffffff" : GC__CHART_COL_TEXT);
    attr_num(b, "x", tx);
    attr_num(b, "y", yc + 0.5 * (GC_CHART_ASCENT_EM - GC_CHART_DESCENT_EM) * fsb);
    attr_num(b, "font-size", fsb);
    gc_strbuf_ch(b, '>');
    gc_strbuf_puts(b, val);   /* escaped or formatted above */
    gc_strbuf_puts(b, "</text></g>\n");
}

int gc__chart_hbars(gc__chart_ctx *x)
{
    const gc_chart_series *s = &x->c->series[0];
    double row = x->ph / s->n;
    gc_strbuf_puts(x->b, "<g class=\"gc-series gc-series-1 gc-kind-hbars\" id=\"series-1\">\n");
    for (int i = 0; i < s->n; i++)
        hbar_one(x, s, i, row, 0.0);
    if (in_range(&x->ax, 0.0)) {   /* the zero line the bars stand on */
        double p = gc__chart_px(&x->ax, 0.0);
        gc_strbuf_puts(x->b, "<path class=\"gc-zero\" stroke=\"" GC__CHART_COL_FRAME "\" "
                       "stroke-width=\"1.2\" d=\"M");
        put_xy(x->b, p, x->py0);
        gc_strbuf_puts(x->b, " L");
        put_xy(x->b, p, x->py0 + x->ph);
        gc_strbuf_puts(x->b, "\"/>\n");
    }
    gc_strbuf_puts(x->b, "</g>\n");
    return GC_OK;
}

/* ---- legend -------------------------------------------------------------- */

#define LEG_SWATCH 28.0     /* px at scale 1 */
#define LEG_GAP 18.0
#define LEG_ROW 18.0

static double legend_font(const gc__chart_ctx *x)
{
    return 0.95 * x->fs;
}

static double item_width(const gc__chart_ctx *x, const gc_chart_series *s, double usable)
{
    double lfs = legend_font(x), sc = x->scale;
    double max_chars = fmax(4.0, (usable - (LEG_SWATCH + 6.0) * sc) / (GC_CHART_CHAR_EM * lfs));
    double chars = fmin((double)gc_chart_text_chars(s->name, GC_CHART_TEXT_LEN), max_chars);
    return (LEG_SWATCH + 6.0) * sc + chars * GC_CHART_CHAR_EM * lfs;
}

/* Rows the legend takes in `usable` px (0 when no series has a name);
 * row_of (optional) gets each series' row, x_of its offset. */
static int legend_layout(const gc__chart_ctx *x, double usable, int *row_of, double *x_of)
{
    int rows = 0;
    double pos = 0.0;
    for (int i = 0; i < x->c->n_series; i++) {
        const gc_chart_series *s = &x->c->series[i];
        if (!s->name || !*s->name)
            continue;
        double w = item_width(x, s, usable);
        if (rows == 0 || (pos > 0.0 && pos + w > usable)) {
            rows++;
            pos = 0.0;
        }
        if (row_of)
            row_of[i] = rows - 1;
        if (x_of)
            x_of[i] = pos;
        pos += w + LEG_GAP * x->scale;
    }
    return rows;
}

int gc__chart_legend_rows(const gc__chart_ctx *x, double usable)
{
    return legend_layout(x, usable, NULL, NULL);
}

static void swatch(gc__chart_ctx *x, const gc_chart_series *s, int i, double lx, double ly)
{
    gc_strbuf *b = x->b;
    double sc = x->scale, mid = ly - 0.3 * legend_font(x);
    const char *col = gc__chart_color(s->color, i);
    if (s->kind == GC_CHART_LINE || s->kind == GC_CHART_STEP) {
        gc_strbuf_printf(b, "<path fill=\"none\" stroke=\"%s\" stroke-width=\"2.2\"%s d=\"M", col,
                         gc__chart_dash_attr(s->dash));
        put_xy(b, lx, mid);
        gc_strbuf_puts(b, " L");
        put_xy(b, lx + LEG_SWATCH * sc, mid);
        gc_strbuf_puts(b, "\"/>");
        if (s->show_marks) {
            gc_strbuf_printf(b, "<g fill=\"#ffffff\" stroke=\"%s\" stroke-width=\"1.6\">", col);
            mark_shape(b, mark_of(s, i), lx + LEG_SWATCH * sc / 2.0, mid, 3.2 * sc);
            gc_strbuf_puts(b, "</g>");
        }
    } else if (s->kind == GC_CHART_MARKERS) {
        gc_strbuf_printf(b, "<g fill=\"%s\" stroke=\"#ffffff\" stroke-width=\"0.8\">", col);
        mark_shape(b, mark_of(s, i), lx + LEG_SWATCH * sc / 2.0, mid, 3.6 * sc);
        gc_strbuf_puts(b, "</g>");
    } else {
        gc_strbuf_printf(b, "<rect fill=\"%s\"%s stroke=\"%s\"", col,
                         s->kind == GC_CHART_AREA ? " fill-opacity=\"0.3\"" : "", col);
        attr_num(b, "x", lx + 6.0 * sc);
        attr_num(b, "y", mid - 5.0 * sc);
        attr_num(b, "width", LEG_SWATCH * sc - 12.0 * sc);
        attr_num(b, "height", 10.0 * sc);
        gc_strbuf_puts(b, "/>");
    }
}

void gc__chart_legend(gc__chart_ctx *x, double left, double top, double usable)
{
    int row_of[GC_CHART_MAX_SERIES];
    double x_of[GC_CHART_MAX_SERIES];
    if (legend_layout(x, usable, row_of, x_of) == 0)
        return;
    gc_strbuf *b = x->b;
    double lfs = legend_font(x), sc = x->scale;
    gc_strbuf_puts(b, "<g class=\"gc-legend\" font-size=\"");
    gc__chart_num(b, lfs);
    gc_strbuf_puts(b, "\">\n");
    for (int i = 0; i < x->c->n_series; i++) {
        const gc_chart_series *s = &x->c->series[i];
        if (!s->name || !*s->name)
            continue;
        double lx = left + x_of[i], ly = top + 13.0 * sc + row_of[i] * LEG_ROW * sc;
        gc_strbuf_printf(b, "<g class=\"gc-legend-item\" id=\"legend-%d\">", i + 1);
        swatch(x, s, i, lx, ly);
        gc_strbuf_puts(b, "<text");
        attr_num(b, "x", lx + (LEG_SWATCH + 6.0) * sc);
        attr_num(b, "y", ly);
        gc_strbuf_ch(b, '>');
        gc__chart_text_cut(b, s->name,
                           fmax(4.0, (usable - (LEG_SWATCH + 6.0) * sc) / (GC_CHART_CHAR_EM * lfs)));
        gc_strbuf_puts(b, "</text></g>\n");
    }
    gc_strbuf_puts(b, "</g>\n");
}
