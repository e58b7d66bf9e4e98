/*
 * chart_axis.c — axes of the chart renderer (chart.h): automatic ranges,
 * "nice" ticks and their labels, the grid and the drawn axes.
 *
 * Display units: a linear axis shows the value itself, a log axis its log10,
 * so ranges, ticks and clipping are linear in display units everywhere.
 * Linear ticks step by 1, 2 or 5 times a power of ten: the step for about one
 * tick per 95 px across or 55 px up, then coarser until the estimated labels
 * fit (chart.h's text-box estimate plus a gap). Lines alone snap the range to
 * the enclosing ticks; markers, bars and labels pad it by 5 % of the span,
 * except where a bar foot or zero bounds it (a bar never floats). Log axes
 * snap to the 1-2-5 values around the data; they label whole decades (every
 * 1st, 2nd, 3rd, 5th, 10th ... so the labels fit) with minor ticks at 2..9
 * when a decade is at least 40 px long; under two whole decades in range
 * they label the 1-2-5 values (or every integer mantissa when that still
 * gives fewer than two labels).
 */
#include "chart_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

double gc__chart_disp(const gc__chart_axis *a, double v)
{
    return a->log ? log10(v) : v;
}

double gc__chart_px(const gc__chart_axis *a, double d)
{
    return a->p0 + (d - a->lo) / (a->hi - a->lo) * (a->p1 - a->p0);
}

/* ---- ranges ------------------------------------------------------------ */

int gc__chart_axis_range(gc__chart_ctx *x, gc__chart_axis *a, double lo, double hi,
                         double hard_lo, double hard_hi)
{
    const gc_chart_axis *s = a->spec;
    a->log = s->scale == GC_CHART_LOG;
    double dlo = fmin(lo, hard_lo), dhi = fmax(hi, hard_hi);
    if (!isfinite(dlo) || !isfinite(dhi)) {     /* nothing on this axis */
        dlo = lo = 0.0;
        dhi = hi = 1.0;
    }
    double mag = fmax(fabs(dlo), fabs(dhi));
    if (!(dhi - dlo > 1e-12 * mag) || dhi - dlo < 1e-290) {   /* one value: open it up */
        double d = a->log ? 0.5 : (mag > 0.0 ? 0.1 * mag : 1.0);
        dlo -= d;
        dhi += d;
        lo = fmin(lo, dlo);
        hi = fmax(hi, dhi);
    }
    if (a->pad) {
        double pad = 0.05 * (dhi - dlo);
        dlo = isfinite(lo) && lo < hard_lo ? lo - pad : hard_lo;
        dhi = isfinite(hi) && hi > hard_hi ? hi + pad : hard_hi;
    }
    double fmin_d = s->fixed_min ? gc__chart_disp(a, s->min) : dlo;
    double fmax_d = s->fixed_max ? gc__chart_disp(a, s->max) : dhi;
    if (s->fixed_min && !s->fixed_max && !(fmax_d > fmin_d))
        fmax_d = fmin_d + (a->log ? 1.0 : fmax(dhi - dlo, 1e-9 * fabs(fmin_d) + 1e-300));
    if (s->fixed_max && !s->fixed_min && !(fmax_d > fmin_d))
        fmin_d = fmax_d - (a->log ? 1.0 : fmax(dhi - dlo, 1e-9 * fabs(fmax_d) + 1e-300));
    if (!(fmax_d > fmin_d) || !isfinite(fmax_d - fmin_d) ||
        !(fmax_d - fmin_d > 1e-12 * fmax(fabs(fmin_d), fabs(fmax_d))))
        return gc_error_set(x->err, GC_ERR_INVALID, NULL,
                            "an axis's fixed range is empty (min must be below max)");
    a->lo = fmin_d;
    a->hi = fmax_d;
    return GC_OK;
}

/* ---- linear ticks -------------------------------------------------------- */

static double nice_step(double range, double target)
{
    double raw = range / target;
    double mag = pow(10.0, floor(log10(raw)));
    double f = raw / mag;
    double m = f < 1.5 ? 1.0 : f < 3.0 ? 2.0 : f < 7.0 ? 5.0 : 10.0;
    return m * mag;
}

static double coarser(double step)
{
    double mag = pow(10.0, floor(log10(step) + 1e-9));
    double m = step / mag;
    return (m < 1.5 ? 2.0 : m < 3.5 ? 5.0 : 10.0) * mag;
}

/* Label of a linear tick t with step `step` on an axis reaching `maxabs`. */
static void linear_label(const gc__chart_ctx *x, gc__chart_tick *t, double step, double maxabs)
{
    unsigned f = x->fmt | GC_CHART_FMT_SVG | (maxabs >= 9999.5 ? GC_CHART_FMT_GROUP4 : 0u);
    int n;
    if (step >= 1e-12 && maxabs < 1e12) {
        int dec = step >= 1.0 ? 0 : (int)ceil(-log10(step) - 1e-9);
        n = gc_chart_format_fixed(t->v, dec > 12 ? 12 : dec, f, t->text, sizeof t->text);
    } else {
        int sig = (int)(floor(log10(maxabs)) - floor(log10(step))) + 1;
        sig = sig < 1 ? 1 : sig > 15 ? 15 : sig;
        n = gc_chart_format_sig(t->v, sig, f, t->text, sizeof t->text);
    }
    if (n < 0)
        t->text[0] = '\0';
    const char *sup = strstr(t->text, "<tspan");
    if (sup) {   /* "m×10" then a superscript exponent */
        t->chars = (double)gc_chart_text_chars(t->text, (size_t)(sup - t->text));
        const char *e = strchr(sup, '>');
        const char *z = e ? strstr(e, "</tspan>") : NULL;
        if (e && z)
            t->chars += 0.75 * (double)(z - e - 1);
    } else {
        t->chars = (double)gc_chart_text_chars(t->text, sizeof t->text);
    }
}

/* Snaps the free ends of a (not padded) axis to multiples of step. */
static void snap_linear(gc__chart_axis *a, double lo0, double hi0, double step)
{
    if (a->pad)
        return;
    if (!a->spec->fixed_min)
        a->lo = floor(lo0 / step + 1e-9) * step;
    if (!a->spec->fixed_max)
        a->hi = ceil(hi0 / step - 1e-9) * step;
}

static int linear_fill(const gc__chart_ctx *x, gc__chart_axis *a, double step)
{
    double first = ceil(a->lo / step - 1e-9), last = floor(a->hi / step + 1e-9);
    if (last - first + 1.0 > GC__CHART_MAX_TICKS)
        return -1;
    double maxabs = fmax(fabs(a->lo), fabs(a->hi));
    a->n_ticks = 0;
    a->label_chars = 0.0;
    for (double k = first; k <= last; k += 1.0) {
        gc__chart_tick *t = &a->ticks[a->n_ticks++];
        t->v = fabs(k) < 0.5 ? 0.0 : k * step;
        t->major = 1;
        linear_label(x, t, step, maxabs);
        a->label_chars = fmax(a->label_chars, t->chars);
    }
    return 0;
}

static int fits(const gc__chart_ctx *x, const gc__chart_axis *a, double step_px, int horizontal)
{
    double fst = 0.92 * x->fs;
    if (horizontal)
        return step_px >= a->label_chars * GC_CHART_CHAR_EM * fst + 10.0 * x->scale;
    return step_px >= 1.4 * fst;
}

static double finer(double step)
{
    double mag = pow(10.0, floor(log10(step) + 1e-9));
    double m = step / mag;
    return (m < 1.5 ? 0.5 : m < 3.5 ? 1.0 : 2.0) * mag;
}

/* Multiples of step within [lo, hi]. */
static double tick_count(const gc__chart_axis *a, double step)
{
    return floor(a->hi / step + 1e-9) - ceil(a->lo / step - 1e-9) + 1.0;
}

static int linear_ticks(gc__chart_ctx *x, gc__chart_axis *a, int horizontal, double len)
{
    double lo0 = a->lo, hi0 = a->hi;
    double step = nice_step(hi0 - lo0, fmin(fmax(len / (horizontal ? 95.0 : 60.0), 2.0), 40.0));
    /* ends that do not snap (fixed, padded) may hold fewer multiples: at least two */
    int free_ends = !a->pad && !a->spec->fixed_min && !a->spec->fixed_max;
    for (int i = 0; !free_ends && i < 6 && tick_count(a, step) < 2.0; i++)
        step = finer(step);
    for (int iter = 0; iter < 40; iter++) {
        snap_linear(a, lo0, hi0, step);
        int ok = linear_fill(x, a, step) == 0;
        double step_px = step / (a->hi - a->lo) * len;
        if (ok && (fits(x, a, step_px, horizontal) || a->n_ticks <= 2))
            break;
        double next = coarser(step);
        if (ok && !free_ends && tick_count(a, next) < 2.0)
            break;   /* the coarser step would leave fewer than two ticks */
        step = next;
    }
    a->step = step;
    return GC_OK;
}

/* ---- log ticks ----------------------------------------------------------- */

/* log10 of the 1-2-5 value at or below (down) / at or above (!down) d. */
static double snap125(double d, int down)
{
    static const double m[] = { 1.0, 2.0, 5.0, 10.0 };
    double k = floor(d + 1e-9);
    if (down) {
        double best = k;
        for (int i = 0; i < 3; i++)
            if (k + log10(m[i]) <= d + 1e-9)
                best = k + log10(m[i]);
        return best;
    }
    for (int i = 0; i < 4; i++)
        if (k + log10(m[i]) >= d - 1e-9)
            return k + log10(m[i]);
    return k + 1.0;
}

/* a_hi: the axis end (display units): an axis reaching 10 000 groups 1 000 too */
static void log_label(const gc__chart_ctx *x, gc__chart_tick *t, int decade, int pow_form,
                      double a_hi)
{
    if (decade && pow_form) {
        int e = (int)lround(t->v);
        snprintf(t->text, sizeof t->text,
                 "10<tspan baseline-shift=\"super\" font-size=\"75%%\">%d</tspan>", e);
        char tmp[16];
        snprintf(tmp, sizeof tmp, "%d", e);
        t->chars = 2.0 + 0.75 * (double)strlen(tmp);
        return;
    }
    double v = decade ? pow(10.0, (double)lround(t->v)) : pow(10.0, t->v);
    unsigned f = x->fmt | GC_CHART_FMT_SVG | (a_hi >= 4.0 ? GC_CHART_FMT_GROUP4 : 0u);
    if (gc_chart_format_sig(v, decade ? 1 : 2, f, t->text, sizeof t->text) < 0)
        t->text[0] = '\0';
    t->chars = (double)gc_chart_text_chars(t->text, sizeof t->text);
    if (strstr(t->text, "<tspan"))
        t->chars = 6.0;
}

static void push_tick(gc__chart_axis *a, double v, int major)
{
    if (a->n_ticks >= GC__CHART_MAX_TICKS)
        return;
    gc__chart_tick *t = &a->ticks[a->n_ticks++];
    memset(t, 0, sizeof *t);
    t->v = v;
    t->major = major;
}

/* Whole decades from lo to hi, labelled every `every`. */
static void decade_ticks(const gc__chart_ctx *x, gc__chart_axis *a, int every, int minor)
{
    double d0 = ceil(a->lo - 1e-9), d1 = floor(a->hi + 1e-9);
    int pow_form = 0;
    for (double d = d0; d <= d1; d += 1.0)
        if (fmod(fabs(d), (double)every) < 0.5 && (d < -3.0 || d > 7.0))
            pow_form = 1;
    a->n_ticks = 0;
    a->label_chars = 0.0;
    for (double d = floor(a->lo); d <= d1 && a->n_ticks < GC__CHART_MAX_TICKS; d += 1.0) {
        if (d >= a->lo - 1e-9) {
            int lab = fmod(fabs(d), (double)every) < 0.5;
            if (lab || d1 - d0 < 60.0) {
                push_tick(a, d, lab);
                if (lab) {
                    log_label(x, &a->ticks[a->n_ticks - 1], 1, pow_form, a->hi);
                    a->label_chars = fmax(a->label_chars, a->ticks[a->n_ticks - 1].chars);
                }
            }
        }
        for (int m = 2; minor && m <= 9; m++) {
            double v = d + log10((double)m);
            if (v > a->lo + 1e-9 && v < a->hi - 1e-9)
                push_tick(a, v, 0);
        }
    }
}

/* Under two decades: the 1-2-5 (or 1..9) values, the rest as minor ticks. */
static int mantissa_ticks(const gc__chart_ctx *x, gc__chart_axis *a, int all)
{
    int labelled = 0;
    a->n_ticks = 0;
    a->label_chars = 0.0;
    for (double d = floor(a->lo); d <= ceil(a->hi); d += 1.0) {
        for (int m = 1; m <= 9; m++) {
            double v = d + log10((double)m);
            if (v < a->lo - 1e-9 || v > a->hi + 1e-9)
                continue;
            int lab = all || m == 1 || m == 2 || m == 5;
            push_tick(a, v, lab);
            if (lab) {
                log_label(x, &a->ticks[a->n_ticks - 1], m == 1, 0, a->hi);
                a->label_chars = fmax(a->label_chars, a->ticks[a->n_ticks - 1].chars);
                labelled++;
            }
        }
    }
    return labelled;
}

/* Do the labelled ticks stand clear of each other (estimated widths)? */
static int labels_fit(const gc__chart_ctx *x, const gc__chart_axis *a, int horizontal, double len)
{
    double fst = 0.92 * x->fs, per = len / (a->hi - a->lo);
    const gc__chart_tick *prev = NULL;
    for (int i = 0; i < a->n_ticks; i++) {
        const gc__chart_tick *t = &a->ticks[i];
        if (!t->major || !t->text[0])
            continue;
        if (prev) {
            double gap = (t->v - prev->v) * per;
            double need = horizontal ? 0.5 * (t->chars + prev->chars) * GC_CHART_CHAR_EM * fst +
                                       10.0 * x->scale
                                     : 1.4 * fst;
            if (gap < need)
                return 0;
        }
        prev = t;
    }
    return 1;
}

static int log_ticks(gc__chart_ctx *x, gc__chart_axis *a, int horizontal, double len)
{
    if (!a->pad) {
        if (!a->spec->fixed_min)
            a->lo = snap125(a->lo, 1);
        if (!a->spec->fixed_max)
            a->hi = snap125(a->hi, 0);
    }
    double decade_px = len / (a->hi - a->lo);
    double whole = floor(a->hi + 1e-9) - ceil(a->lo - 1e-9) + 1.0;
    if (whole < 2.0) {
        if (mantissa_ticks(x, a, 0) < 2) {   /* 1..9 labelled, unless crowded */
            mantissa_ticks(x, a, 1);
            if (!labels_fit(x, a, horizontal, len))
                mantissa_ticks(x, a, 0);
        }
        a->step = 0.0;
        return GC_OK;
    }
    static const int everies[] = { 1, 2, 3, 5, 10, 20, 50, 100, 200 };
    int minor = decade_px >= 40.0 * x->scale && whole <= 24.0;
    for (size_t i = 0; i < sizeof everies / sizeof everies[0]; i++) {
        decade_ticks(x, a, everies[i], minor);
        a->step = everies[i];
        if (fits(x, a, decade_px * everies[i], horizontal))
            break;
    }
    return GC_OK;
}

int gc__chart_axis_ticks(gc__chart_ctx *x, gc__chart_axis *a, int horizontal, double len_px)
{
    return a->log ? log_ticks(x, a, horizontal, len_px) : linear_ticks(x, a, horizontal, len_px);
}

/* ---- drawing ------------------------------------------------------------- */

/* A <line>; cls and extra (further attributes) may be NULL. */
static void line_xy(gc_strbuf *b, const char *cls, const char *extra, double x1, double y1,
                    double x2, double y2)
{
    gc_strbuf_puts(b, "<line");
    if (cls)
        gc_strbuf_printf(b, " class=\"%s\"", cls);
    if (extra) {
        gc_strbuf_ch(b, ' ');
        gc_strbuf_puts(b, extra);
    }
    gc_strbuf_puts(b, " x1=\"");
    gc__chart_num(b, x1);
    gc_strbuf_puts(b, "\" y1=\"");
    gc__chart_num(b, y1);
    gc_strbuf_puts(b, "\" x2=\"");
    gc__chart_num(b, x2);
    gc_strbuf_puts(b, "\" y2=\"");
    gc__chart_num(b, y2);
    gc_strbuf_puts(b, "\"/>\n");
}

void gc__chart_grid(gc__chart_ctx *x)
{
    gc_strbuf *b = x->b;
    gc_strbuf_puts(b, "<g class=\"gc-grid\" stroke=\"" GC__CHART_COL_GRID "\" stroke-width=\"1\">\n");
    for (int i = 0; i < x->ax.n_ticks; i++) {
        if (!x->ax.ticks[i].major)
            continue;
        double p = gc__chart_px(&x->ax, x->ax.ticks[i].v);
        line_xy(b, NULL, NULL, p, x->py0, p, x->py0 + x->ph);
    }
    for (int i = 0; !x->hbars && i < x->ay.n_ticks; i++) {
        if (!x->ay.ticks[i].major)
            continue;
        double p = gc__chart_px(&x->ay, x->ay.ticks[i].v);
        line_xy(b, NULL, NULL, x->px0, p, x->px0 + x->pw, p);
    }
    gc_strbuf_puts(b, "</g>\n");
}

/* "Title [unit]" escaped; nothing when both are empty. */
static void axis_title_text(gc_strbuf *b, const gc_chart_axis *s)
{
    int has_t = s->title && *s->title, has_u = s->unit && *s->unit;
    gc__chart_text_cut(b, has_t ? s->title : "", INFINITY);
    if (has_u) {
        gc_strbuf_puts(b, has_t ? " [" : "[");
        gc__chart_text_cut(b, s->unit, INFINITY);
        gc_strbuf_puts(b, "]");
    }
}

static void axis_title(gc__chart_ctx *x, const gc__chart_axis *a, const char *id, int side)
{
    const gc_chart_axis *s = a->spec;
    if (!(s->title && *s->title) && !(s->unit && *s->unit))
        return;
    gc_strbuf *b = x->b;
    double tx, ty, rot;
    if (side == 0) {
        tx = x->px0 + x->pw / 2.0;
        ty = x->py0 + x->ph + 14.0 * x->scale + 0.92 * x->fs + GC_CHART_ASCENT_EM * x->fs;
        rot = 0.0;
    } else {
        ty = x->py0 + x->ph / 2.0;
        tx = side == 1 ? 8.0 * x->scale + GC_CHART_ASCENT_EM * x->fs
                       : x->W - 8.0 * x->scale - GC_CHART_ASCENT_EM * x->fs;
        rot = side == 1 ? -90.0 : 90.0;
    }
    gc_strbuf_printf(b, "<text class=\"gc-axis-title\" id=\"%s\" text-anchor=\"middle\" x=\"", id);
    gc__chart_num(b, tx);
    gc_strbuf_puts(b, "\" y=\"");
    gc__chart_num(b, ty);
    gc_strbuf_puts(b, "\"");
    if (rot != 0.0) {
        gc_strbuf_printf(b, " transform=\"rotate(%d ", (int)rot);
        gc__chart_num(b, tx);
        gc_strbuf_puts(b, " ");
        gc__chart_num(b, ty);
        gc_strbuf_puts(b, ")\"");
    }
    gc_strbuf_puts(b, ">");
    axis_title_text(b, s);
    gc_strbuf_puts(b, "</text>\n");
}

/* Ticks, tick labels and title of one axis; side 0 bottom, 1 left, 2 right. */
void gc__chart_axis_draw(gc__chart_ctx *x, const gc__chart_axis *a, const char *id, int side)
{
    gc_strbuf *b = x->b;
    double fst = 0.92 * x->fs, sc = x->scale;
    gc_strbuf_printf(b, "<g class=\"gc-ticks\" id=\"ticks-%s\" font-size=\"", id);
    gc__chart_num(b, fst);
    gc_strbuf_printf(b, "\" text-anchor=\"%s\" stroke-width=\"1\">\n",
                     side == 0 ? "middle" : side == 1 ? "end" : "start");
    for (int i = 0; i < a->n_ticks; i++) {
        const gc__chart_tick *t = &a->ticks[i];
        double p = gc__chart_px(a, t->v), len = (t->major ? 6.0 : 3.0) * sc;
        const char *cls = t->major ? NULL : "gc-tick-minor";
        const char *stroke = "stroke=\"" GC__CHART_COL_FRAME "\"";
        if (side == 0)
            line_xy(b, cls, stroke, p, x->py0 + x->ph, p, x->py0 + x->ph + len);
        else if (side == 1)
            line_xy(b, cls, stroke, x->px0 - len, p, x->px0, p);
        else
            line_xy(b, cls, stroke, x->px0 + x->pw, p, x->px0 + x->pw + len, p);
        if (!t->major || !t->text[0])
            continue;
        double tx = side == 0 ? p : side == 1 ? x->px0 - 9.0 * sc : x->px0 + x->pw + 9.0 * sc;
        double ty = side == 0 ? x->py0 + x->ph + 8.0 * sc + GC_CHART_ASCENT_EM * fst
                              : p + 0.5 * (GC_CHART_ASCENT_EM - GC_CHART_DESCENT_EM) * fst;
        gc_strbuf_puts(b, "<text class=\"gc-tick-label\" x=\"");
        gc__chart_num(b, tx);
        gc_strbuf_puts(b, "\" y=\"");
        gc__chart_num(b, ty);
        gc_strbuf_puts(b, "\">");
        gc_strbuf_puts(b, t->text);   /* formatted here: digits, '.', '-', thin space, tspan */
        gc_strbuf_puts(b, "</text>\n");
    }
    gc_strbuf_puts(b, "</g>\n");
    axis_title(x, a, side == 0 ? "axis-x" : side == 1 ? "axis-y" : "axis-y2", side);
}
