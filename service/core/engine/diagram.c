/*
 * diagram.c — T-s, P-v and h-s diagrams of an evaluated cycle as SVG 1.1
 * (diagram.h). One pass into a growing buffer: sample the process paths
 * (path.h), convert to the output unit system (units.h), find the axis
 * ranges and "nice" ticks (steps of 1, 2 or 5 times a power of ten; on log
 * axes the 1-2-5 values of each decade), then write the document.
 *
 * Layout (px, for the default 760 x 520; scaled with the size): title row,
 * legend row, plot area, tick labels and axis titles, two caption lines with
 * the key figures. Palette (chosen to stay apart for the common colour-vision
 * deficiencies, and told apart by line style as well): actual cycle deep blue
 * solid, ideal counterpart burnt orange dashed, Carnot bound plum dotted.
 *
 * Tick labels as engineers read them (chart.h's formats: "10 000" with a
 * thin space, never "1e+04"); state numbers placed without collision (8
 * directions around each marker at 3 distances, a leader line beyond the
 * first), so close states ("1" and "2" across an inlet loss) stay readable.
 *
 * Safety: every number written is checked finite first; a non-finite value
 * refuses the drawing (GC_ERR_INVALID) instead of writing "nan". All text is
 * XML-escaped and forced to valid UTF-8.
 */
#include "gascycle/diagram.h"
#include "gascycle/chart.h"
#include "gascycle/gas.h"
#include "gascycle/path.h"
#include "gascycle/strbuf.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

/* Appends v with two decimals ("%.2f", without printf's cost: coordinates are
 * most of a document). v is finite; |v| beyond 1e12 goes through printf. */
static void sb_fixed2(gc_strbuf *b, double v)
{
    if (!(fabs(v) < 1e12)) {
        gc_strbuf_printf(b, "%.2f", v);
        return;
    }
    char tmp[32];
    char *e = tmp + sizeof tmp, *p = e;
    long long q = llround(fabs(v) * 100.0);
    int neg = v < 0.0 && q != 0;
    *--p = (char)('0' + q % 10);
    q /= 10;
    *--p = (char)('0' + q % 10);
    q /= 10;
    *--p = '.';
    do {
        *--p = (char)('0' + q % 10);
        q /= 10;
    } while (q > 0);
    if (neg)
        *--p = '-';
    gc_strbuf_put(b, p, (size_t)(e - p));
}

/* Length of the valid UTF-8 sequence at s (at most `left` bytes), 0 if
 * invalid (overlong forms, surrogates and code points above U+10FFFF are
 * invalid too). */
static size_t utf8_len(const unsigned char *s, size_t left)
{
    unsigned c = s[0];
    size_t n;
    unsigned cp;
    if (c < 0x80)
        return 1;
    if (c >= 0xC2 && c <= 0xDF) {
        n = 2;
        cp = c & 0x1F;
    } else if (c >= 0xE0 && c <= 0xEF) {
        n = 3;
        cp = c & 0x0F;
    } else if (c >= 0xF0 && c <= 0xF4) {
        n = 4;
        cp = c & 0x07;
    } else {
        return 0;
    }
    if (n > left)
        return 0;
    for (size_t i = 1; i < n; i++) {
        if ((s[i] & 0xC0) != 0x80)
            return 0;
        cp = (cp << 6) | (s[i] & 0x3F);
    }
    if ((n == 3 && cp < 0x800) || (n == 4 && cp < 0x10000) || cp > 0x10FFFF ||
        (cp >= 0xD800 && cp <= 0xDFFF) || cp == 0xFFFE || cp == 0xFFFF)
        return 0;
    return n;
}

/* Appends at most max_bytes of s as XML character data / attribute text. */
static void sb_text(gc_strbuf *b, const char *s, size_t max_bytes)
{
    const unsigned char *u = (const unsigned char *)s;
    size_t len = strlen(s);
    if (len > max_bytes) {
        len = max_bytes;
        while (len > 0 && (u[len] & 0xC0) == 0x80)   /* do not cut a character */
            len--;
    }
    size_t i = 0;
    while (i < len) {
        unsigned c = u[i];
        if (c == '&') {
            gc_strbuf_puts(b, "&amp;");
        } else if (c == '<') {
            gc_strbuf_puts(b, "&lt;");
        } else if (c == '>') {
            gc_strbuf_puts(b, "&gt;");
        } else if (c == '"') {
            gc_strbuf_puts(b, "&quot;");
        } else if (c == '\'') {
            gc_strbuf_puts(b, "&#39;");
        } else if (c < 0x20) {
            gc_strbuf_put(b, " ", 1);            /* XML 1.0 forbids most controls */
        } else if (c < 0x80) {
            gc_strbuf_put(b, (const char *)u + i, 1);
        } else {
            size_t n = utf8_len(u + i, len - i);
            if (n == 0) {
                gc_strbuf_put(b, "?", 1);
                i++;
                continue;
            }
            gc_strbuf_put(b, (const char *)u + i, n);
            i += n;
            continue;
        }
        i++;
    }
}

/* ---- series of points --------------------------------------------------- */

typedef struct series {
    double *x, *y;              /* display coordinates (output units; log10 on log axes) */
    unsigned char *move;        /* 1: the point starts a new sub-path */
    int n, cap;
} series;

static int series_push(series *sr, double x, double y, int move)
{
    if (sr->n == sr->cap) {
        int cap = sr->cap ? sr->cap * 2 : 256;
        double *nx = realloc(sr->x, (size_t)cap * sizeof *nx);
        if (!nx)
            return -1;
        sr->x = nx;
        double *ny = realloc(sr->y, (size_t)cap * sizeof *ny);
        if (!ny)
            return -1;
        sr->y = ny;
        unsigned char *nm = realloc(sr->move, (size_t)cap);
        if (!nm)
            return -1;
        sr->move = nm;
        sr->cap = cap;
    }
    sr->x[sr->n] = x;
    sr->y[sr->n] = y;
    sr->move[sr->n] = (unsigned char)(move != 0);
    sr->n++;
    return 0;
}

static void series_free(series *sr)
{
    free(sr->x);
    free(sr->y);
    free(sr->move);
    memset(sr, 0, sizeof *sr);
}

typedef struct ctx {
    const gc_diagram_options *opt;
    gc_unit_system sys;
    gc_error *err;
} ctx;

/* Display coordinates of one property set; GC_ERR_INVALID when not drawable. */
static int to_display(const ctx *c, double T, double s, double P, double v, double h,
                      double *x, double *y)
{
    gc_unit_system sys = c->sys;
    switch (c->opt->kind) {
    case GC_DIAGRAM_TS:
        *x = gc_units_from_si(GC_Q_SPECIFIC_ENTROPY, sys, s);
        *y = gc_units_from_si(GC_Q_TEMPERATURE, sys, T);
        break;
    case GC_DIAGRAM_HS:
        *x = gc_units_from_si(GC_Q_SPECIFIC_ENTROPY, sys, s);
        *y = gc_units_from_si(GC_Q_SPECIFIC_ENERGY, sys, h);
        break;
    default:
        *x = gc_units_from_si(GC_Q_SPECIFIC_VOLUME, sys, v);
        *y = gc_units_from_si(GC_Q_PRESSURE, sys, P);
        if (c->opt->log_x) {
            if (!(*x > 0.0))
                return gc_error_set(c->err, GC_ERR_INVALID, "/scale",
                                    "a specific volume is not positive, so it has no log scale");
            *x = log10(*x);
        }
        if (c->opt->log_y) {
            if (!(*y > 0.0))
                return gc_error_set(c->err, GC_ERR_INVALID, "/scale",
                                    "a pressure is not positive, so it has no log scale");
            *y = log10(*y);
        }
        break;
    }
    if (!isfinite(*x) || !isfinite(*y))
        return gc_error_set(c->err, GC_ERR_INVALID, NULL,
                            "the cycle result holds a non-finite value; no diagram drawn");
    return GC_OK;
}

/* All process paths of a run, points per process, joined where a process
 * starts at the previous one's end state. */
static int run_series(const ctx *c, const gc_cycle_run *run, int points, series *sr)
{
    gc_path_point *pts = malloc((size_t)points * sizeof *pts);
    if (!pts)
        return gc_error_set(c->err, GC_ERR_NOMEM, NULL, "out of memory drawing the diagram");
    int rc = GC_OK;
    int prev_to = -1;
    for (int i = 0; i < run->n_processes && rc == GC_OK; i++) {
        rc = gc_cycle_path(run, i, points, pts, c->err);
        if (rc != GC_OK)
            break;
        int join = run->processes[i].from == prev_to;
        for (int k = join ? 1 : 0; k < points; k++) {
            double x, y;
            rc = to_display(c, pts[k].T_K, pts[k].s_J_per_kgK, pts[k].P_Pa, pts[k].v_m3_per_kg,
                            pts[k].h_J_per_kg, &x, &y);
            if (rc != GC_OK)
                break;
            if (series_push(sr, x, y, k == 0) != 0) {
                rc = gc_error_set(c->err, GC_ERR_NOMEM, NULL, "out of memory drawing the diagram");
                break;
            }
        }
        prev_to = run->processes[i].to;
    }
    free(pts);
    return rc;
}

/* The Carnot cycle between T_lo and T_hi over [s_lo, s_hi] with gas g:
 * isentropic compression at s_lo, isothermal heat addition at T_hi,
 * isentropic expansion at s_hi, isothermal rejection at T_lo. */
static int carnot_series(const ctx *c, const gc_gas *g, double T_lo, double T_hi, double s_lo,
                         double s_hi, int points, series *sr)
{
    const double R = g->R_J_per_kgK;
    if (!(R > 0.0) || !(T_hi > T_lo) || !(T_lo > 0.0))
        return gc_error_set(c->err, GC_ERR_INVALID, NULL,
                            "the cycle's temperature range gives no Carnot cycle");
    if (!(s_hi > s_lo))
        s_hi = s_lo;   /* no entropy range: a line, still drawable */
    /* T-s and h-s need only the corners; P-v needs the curves. */
    int n = c->opt->kind == GC_DIAGRAM_PV ? points : 2;
    for (int leg = 0; leg < 4; leg++) {
        for (int k = 0; k < n; k++) {
            if (leg > 0 && k == 0)
                continue;
            double t = n > 1 ? (double)k / (double)(n - 1) : 0.0;
            double T, s;
            switch (leg) {
            case 0: T = T_lo + t * (T_hi - T_lo); s = s_lo; break;
            case 1: T = T_hi; s = s_lo + t * (s_hi - s_lo); break;
            case 2: T = T_hi - t * (T_hi - T_lo); s = s_hi; break;
            default: T = T_lo; s = s_hi - t * (s_hi - s_lo); break;
            }
            double P = GC_P_STD_PA * exp((gc_gas_s0_T(g, T) - s) / R);
            double v = R * T / P;
            double h = gc_gas_h_T(g, T) - gc_cycle_h_ref(g); /* sensible basis (cycle.h) */
            double x, y;
            int rc = to_display(c, T, s, P, v, h, &x, &y);
            if (rc != GC_OK)
                return rc;
            if (series_push(sr, x, y, leg == 0 && k == 0) != 0)
                return gc_error_set(c->err, GC_ERR_NOMEM, NULL, "out of memory drawing the diagram");
        }
    }
    return GC_OK;
}

/* ---- axes --------------------------------------------------------------- */

typedef struct axis {
    double lo, hi;              /* display range (log10 units on a log axis) */
    int log;
    double step;                /* linear tick step */
    int decimals;               /* linear tick label decimals */
} axis;

static void range_add(double *lo, double *hi, const series *sr, int use_x)
{
    for (int i = 0; i < sr->n; i++) {
        double v = use_x ? sr->x[i] : sr->y[i];
        if (v < *lo)
            *lo = v;
        if (v > *hi)
            *hi = v;
    }
}

static double nice_step(double range, int target)
{
    double raw = range / target;
    double mag = pow(10.0, floor(log10(raw)));
    double f = raw / mag;
    double m = f < 1.5 ? 1.0 : f < 3.0 ? 2.0 : f < 7.0 ? 5.0 : 10.0;
    return m * mag;
}

static void axis_setup(axis *a, double lo, double hi, int log_axis, int target_ticks)
{
    a->log = log_axis;
    double span = hi - lo;
    double scale = fmax(fabs(lo), fabs(hi));
    if (!(span > 1e-9 * fmax(scale, 1e-300))) {   /* degenerate: open it up */
        double d = log_axis ? 0.1 : (scale > 0.0 ? 0.05 * scale : 1.0);
        lo -= d;
        hi += d;
        span = hi - lo;
    }
    lo -= 0.05 * span;
    hi += 0.05 * span;
    a->lo = lo;
    a->hi = hi;
    if (!log_axis) {
        a->step = nice_step(hi - lo, target_ticks);
        double e = -floor(log10(a->step) + 1e-9);
        a->decimals = e > 0.0 ? (int)e : 0;
        if (a->decimals > 9)
            a->decimals = 9;
    } else {
        a->step = 0.0;
        a->decimals = 0;
    }
}

/* Tick values of an axis into v[] (display units), labelled ones flagged.
 * Returns the count (<= max). */
static int axis_ticks(const axis *a, double *v, int *labelled, int max)
{
    int n = 0;
    if (!a->log) {
        double first = ceil(a->lo / a->step - 1e-9);
        for (double k = first; n < max; k += 1.0) {
            double t = k * a->step;
            if (t > a->hi + 1e-9 * a->step)
                break;
            v[n] = fabs(t) < 1e-12 * a->step ? 0.0 : t;
            labelled[n] = 1;
            n++;
        }
        return n;
    }
    double decades = a->hi - a->lo;
    static const double all[] = { 1, 2, 3, 4, 5, 6, 7, 8, 9 };
    static const double m125[] = { 1, 2, 5 };
    const double *ms = decades < 0.7 ? all : m125;
    int nm = decades < 0.7 ? 9 : 3;
    for (double d = floor(a->lo); d <= ceil(a->hi) && n < max; d += 1.0) {
        for (int i = 0; i < nm && n < max; i++) {
            double t = d + log10(ms[i]);
            if (t < a->lo - 1e-12 || t > a->hi + 1e-12)
                continue;
            v[n] = t;
            labelled[n] = decades > 3.0 ? (i == 0) : 1;
            n++;
        }
    }
    return n;
}

/* A tick label as engineers read it (chart.h formats): linear with the
 * axis's decimals, log as the plain value; thousands grouped with a thin
 * space from 10 000 ("10 000"), a power of ten only outside 1e-5 .. 1e12
 * ("10" with a superscript exponent), never "1e+04" (issue 17). */
static void tick_label(const axis *a, double t, char *out, size_t n)
{
    int rc;
    if (!a->log)
        rc = gc_chart_format_fixed(t, a->decimals, GC_CHART_FMT_GROUP |
                                   (fmax(fabs(a->lo), fabs(a->hi)) >= 1e4 ? GC_CHART_FMT_GROUP4 : 0u),
                                   out, n);
    else
        rc = gc_chart_format_sig(pow(10.0, t), 4, GC_CHART_FMT_GROUP | GC_CHART_FMT_SVG |
                                 (a->hi >= 4.0 ? GC_CHART_FMT_GROUP4 : 0u), out, n);
    if (rc < 0)
        snprintf(out, n, "%.4g", a->log ? pow(10.0, t) : t);
    if (strcmp(out, "-0") == 0 || strspn(out, "-0.") == strlen(out)) {
        /* "-0", "-0.00": write a plain zero with the same decimals */
        if (out[0] == '-')
            memmove(out, out + 1, strlen(out));
    }
}

/* ---- writing ------------------------------------------------------------ */

typedef struct frame {
    double x0, y0, w, h;        /* plot area, px */
    axis ax, ay;
} frame;

static double px_x(const frame *f, double x)
{
    return f->x0 + (x - f->ax.lo) / (f->ax.hi - f->ax.lo) * f->w;
}

static double px_y(const frame *f, double y)
{
    return f->y0 + f->h - (y - f->ay.lo) / (f->ay.hi - f->ay.lo) * f->h;
}

static void write_path(gc_strbuf *b, const frame *f, const series *sr, const char *cls,
                       const char *style, int clip)
{
    if (sr->n == 0)
        return;
    gc_strbuf_printf(b, "<path class=\"%s\" fill=\"none\" %s%s d=\"", cls, style,
              clip ? " clip-path=\"url(#gc-clip)\"" : "");
    for (int i = 0; i < sr->n; i++) {
        gc_strbuf_puts(b, i == 0 ? "M" : sr->move[i] ? " M" : " L");
        sb_fixed2(b, px_x(f, sr->x[i]));
        gc_strbuf_put(b, ",", 1);
        sb_fixed2(b, px_y(f, sr->y[i]));
    }
    gc_strbuf_puts(b, "\"/>\n");
}

/* Styles of the three curves and the markers (attributes). */
#define COL_TEXT "#1c2330"
#define COL_FRAME "#4d5562"
#define COL_GRID "#e4e8ee"
#define COL_ACTUAL "#1f5ea8"
#define COL_IDEAL "#cc5f1a"
#define COL_CARNOT "#7b4a92"
#define STYLE_ACTUAL "stroke=\"" COL_ACTUAL "\" stroke-width=\"2.6\" stroke-linejoin=\"round\" stroke-linecap=\"round\""
#define STYLE_IDEAL "stroke=\"" COL_IDEAL "\" stroke-width=\"1.9\" stroke-dasharray=\"8 5\" stroke-linejoin=\"round\""
#define STYLE_CARNOT "stroke=\"" COL_CARNOT "\" stroke-width=\"2\" stroke-dasharray=\"0.1 5\" stroke-linecap=\"round\" stroke-linejoin=\"round\""

static void fmt_energy(char *out, size_t n, double v)
{
    double a = fabs(v);
    if (a >= 1000.0)
        snprintf(out, n, "%.0f", v);
    else if (a >= 100.0)
        snprintf(out, n, "%.1f", v);
    else
        snprintf(out, n, "%.2f", v);
}

int gc_diagram_state_count(const gc_cycle_run *run)
{
    if (!run || run->n_states <= 0)
        return 0;
    int n = run->n_states;
    if (n > GC_CYCLE_MAX_STATES)
        n = GC_CYCLE_MAX_STATES;
    if (n > 1) {
        const gc_cycle_state *a = &run->states[0], *z = &run->states[n - 1];
        double dT = fabs(z->T_K - a->T_K) / fmax(fabs(a->T_K), 1e-300);
        double dP = fabs(z->P_Pa - a->P_Pa) / fmax(fabs(a->P_Pa), 1e-300);
        if (dT < 1e-6 && dP < 1e-6)
            n--;
    }
    return n;
}

void gc_diagram_options_default(gc_diagram_options *opt)
{
    memset(opt, 0, sizeof *opt);
    opt->kind = GC_DIAGRAM_TS;
    opt->units = GC_UNITS_SI;
    opt->points = 0;
    opt->overlays = GC_DIAGRAM_OVERLAY_IDEAL | GC_DIAGRAM_OVERLAY_CARNOT;
}

int gc_diagram_kind_parse(const char *name, gc_diagram_kind *kind)
{
    static const struct { const char *name; gc_diagram_kind kind; } names[] = {
        { "Ts", GC_DIAGRAM_TS }, { "T-s", GC_DIAGRAM_TS },
        { "Pv", GC_DIAGRAM_PV }, { "P-v", GC_DIAGRAM_PV },
        { "hs", GC_DIAGRAM_HS }, { "h-s", GC_DIAGRAM_HS },
    };
    if (name) {
        for (size_t i = 0; i < sizeof names / sizeof names[0]; i++) {
            if (strcasecmp(name, names[i].name) == 0) {
                *kind = names[i].kind;
                return GC_OK;
            }
        }
    }
    return GC_ERR_INVALID;
}

const char *gc_diagram_kind_name(gc_diagram_kind kind)
{
    switch (kind) {
    case GC_DIAGRAM_PV: return "Pv";
    case GC_DIAGRAM_HS: return "hs";
    default: return "Ts";
    }
}

static int check_run(const gc_cycle_run *run, gc_error *err)
{
    if (run->n_processes < 1 || run->n_processes > GC_CYCLE_MAX_PROCESSES ||
        run->n_states < 1 || run->n_states > GC_CYCLE_MAX_STATES)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "the cycle result has no processes to draw");
    return GC_OK;
}

/* One drawing: the inputs, the curves, the layout (filled in that order). */
typedef struct drawing {
    ctx c;
    const gc_cycle_result *r;
    const gc_diagram_options *opt;
    int points, W, H;
    gc_strbuf *b;
    const gc_cycle_run *act;
    int want_ideal, ideal_same, want_carnot;
    series sa, si, sc;          /* actual, ideal, Carnot */
    int ns;                     /* states drawn */
    double mx[GC_CYCLE_MAX_STATES], my[GC_CYCLE_MAX_STATES];   /* state markers */
    double T_lo, T_hi, s_lo, s_hi;   /* extremes of the actual cycle's states */
    double xlo, xhi, ylo, yhi;  /* data ranges */
    char cap[6][96];            /* caption segments: 0-2 figures, 3.. bounds, then the note */
    int ncap, cap_note;
    int cap_line[6], cap_lines;
    double scale, fs;           /* text scale; base font size, px */
    frame f;
    const char *leg_text[4];    /* legend items: 0 actual, 1 ideal (or its note), 2 carnot, 3 state */
    int leg_on[4];
    double leg_x[4], leg_row[4], leg_y0;
    const char *kind_title;
} drawing;

/* The curves, the extremes of the actual cycle's states (for the Carnot
 * overlay) and the state markers in display coordinates. */
static int draw_curves(drawing *d)
{
    const gc_cycle_run *act = d->act;
    int rc = run_series(&d->c, act, d->points, &d->sa);
    if (rc == GC_OK && d->want_ideal && !d->ideal_same) {
        rc = check_run(&d->r->ideal, d->c.err);
        if (rc == GC_OK)
            rc = run_series(&d->c, &d->r->ideal, d->points, &d->si);
    }
    d->ns = gc_diagram_state_count(act);
    d->T_lo = INFINITY, d->T_hi = -INFINITY, d->s_lo = INFINITY, d->s_hi = -INFINITY;
    for (int i = 0; i < act->n_states; i++) {
        const gc_cycle_state *st = &act->states[i];
        d->T_lo = fmin(d->T_lo, st->T_K);
        d->T_hi = fmax(d->T_hi, st->T_K);
        d->s_lo = fmin(d->s_lo, st->s_J_per_kgK);
        d->s_hi = fmax(d->s_hi, st->s_J_per_kgK);
    }
    if (rc == GC_OK && d->want_carnot) {
        if (!isfinite(d->T_lo) || !isfinite(d->T_hi) || !isfinite(d->s_lo) || !isfinite(d->s_hi))
            rc = gc_error_set(d->c.err, GC_ERR_INVALID, NULL,
                              "the cycle result holds a non-finite value; no diagram drawn");
        else
            rc = carnot_series(&d->c, &act->gases[0], d->T_lo, d->T_hi, d->s_lo, d->s_hi,
                               d->points, &d->sc);
    }
    for (int i = 0; i < d->ns && rc == GC_OK; i++) {
        const gc_cycle_state *st = &act->states[i];
        rc = to_display(&d->c, st->T_K, st->s_J_per_kgK, st->P_Pa, st->v_m3_per_kg,
                        st->hs_J_per_kg, &d->mx[i], &d->my[i]);
    }
    return rc;
}

/* Ranges: the actual and ideal cycles; Carnot too where it is a rectangle
 * inside the same T and s range (T-s, h-s); on P-v it is clipped. */
static int draw_ranges(drawing *d)
{
    d->xlo = INFINITY, d->xhi = -INFINITY, d->ylo = INFINITY, d->yhi = -INFINITY;
    range_add(&d->xlo, &d->xhi, &d->sa, 1);
    range_add(&d->ylo, &d->yhi, &d->sa, 0);
    range_add(&d->xlo, &d->xhi, &d->si, 1);
    range_add(&d->ylo, &d->yhi, &d->si, 0);
    if (d->opt->kind != GC_DIAGRAM_PV) {
        range_add(&d->xlo, &d->xhi, &d->sc, 1);
        range_add(&d->ylo, &d->yhi, &d->sc, 0);
    }
    if (!isfinite(d->xlo) || !isfinite(d->xhi) || !isfinite(d->ylo) || !isfinite(d->yhi))
        return gc_error_set(d->c.err, GC_ERR_INVALID, NULL,
                            "the cycle result has no points to draw");
    return GC_OK;
}

/* Caption segments (key figures), all checked finite. */
static int draw_caption_texts(drawing *d)
{
    const gc_diagram_options *opt = d->opt;
    const gc_cycle_result *r = d->r;
    const gc_cycle_summary *sm = &d->act->summary;
    gc_unit_system sys = d->c.sys;
    char wnet[32], qin[32];
    double wv = gc_units_from_si(GC_Q_SPECIFIC_ENERGY, sys, sm->net_work);
    double qv = gc_units_from_si(GC_Q_SPECIFIC_ENERGY, sys,
                                 opt->has_figures ? opt->heat_in : sm->heat_in);
    const char *eu = gc_units_label(GC_Q_SPECIFIC_ENERGY, sys);
    double eta = (opt->has_figures ? opt->thermal_efficiency : sm->thermal_efficiency) * 100.0;
    double eta_c = r->carnot_efficiency * 100.0;
    double eta_i = !r->has_ideal ? 0.0
                 : (opt->has_figures ? opt->ideal_thermal_efficiency
                                     : r->ideal.summary.thermal_efficiency) * 100.0;
    double tlo = gc_units_from_si(GC_Q_TEMPERATURE, sys, d->T_lo);
    double thi = gc_units_from_si(GC_Q_TEMPERATURE, sys, d->T_hi);
    if (!isfinite(eta) || !isfinite(eta_c) || !isfinite(tlo) || !isfinite(thi) ||
        !isfinite(wv) || !isfinite(qv) || !isfinite(eta_i))
        return gc_error_set(d->c.err, GC_ERR_INVALID, NULL,
                            "the cycle summary holds a non-finite value; no diagram drawn");
    fmt_energy(wnet, sizeof wnet, wv);
    fmt_energy(qin, sizeof qin, qv);
    size_t cn = sizeof d->cap[0];
    d->ncap = 0;
    d->cap_note = -1;
    snprintf(d->cap[d->ncap++], cn, "Thermal efficiency %.1f %%", eta);
    snprintf(d->cap[d->ncap++], cn, "net work %s %s", wnet, eu);
    snprintf(d->cap[d->ncap++], cn, "heat added %s %s", qin, eu);
    if (r->has_ideal)
        snprintf(d->cap[d->ncap++], cn, "Ideal counterpart %.1f %%", eta_i);
    snprintf(d->cap[d->ncap++], cn, "Carnot %.1f %% between %.0f and %.0f %s", eta_c, tlo, thi,
             gc_units_label(GC_Q_TEMPERATURE, sys));
    /* s and h of different gases (air, then combustion products) are not
     * one closed curve: say so rather than let the gap look like an error */
    if (d->act->n_gases > 1 && opt->kind != GC_DIAGRAM_PV) {
        d->cap_note = d->ncap;
        snprintf(d->cap[d->ncap++], cn, "The gas changes at combustion: the loop need not close");
    }
    return GC_OK;
}

/* Legend items placed in rows (wrapping when the width runs short). */
static int layout_legend(drawing *d, double usable, double em)
{
    double scale = d->scale;
    d->leg_on[0] = 1;
    d->leg_on[1] = d->want_ideal;
    d->leg_on[2] = d->want_carnot;
    d->leg_on[3] = 1;
    d->leg_text[0] = "Actual cycle";
    d->leg_text[1] = d->ideal_same ? "Ideal counterpart = actual" : "Ideal counterpart";
    d->leg_text[2] = d->opt->kind == GC_DIAGRAM_PV ? "Carnot, same T range (clipped)"
                                                    : "Carnot, same T range";
    d->leg_text[3] = "State";
    int rows = 1;
    double seg = 30.0 * scale, lfs = d->fs * 0.95, x = 0.0;
    for (int i = 0; i < 4; i++) {
        if (!d->leg_on[i])
            continue;
        double lead = (i == 1 && d->ideal_same) ? 0.0
                    : (i == 3 ? 16.0 * scale : seg + 6.0 * scale);
        double wdt = lead + em * lfs * (double)strlen(d->leg_text[i]) + 24.0 * scale;
        if (x > 0.0 && x + wdt - 24.0 * scale > usable) {
            rows++;
            x = 0.0;
        }
        d->leg_x[i] = d->f.x0 + x;
        d->leg_row[i] = rows - 1;
        x += wdt;
    }
    return rows;
}

/* Caption lines: greedy fill of the segments. */
static void layout_caption(drawing *d, double usable, double em)
{
    double x = 0.0, sep = em * d->fs * 3.0;
    d->cap_lines = 1;
    for (int i = 0; i < d->ncap; i++) {
        double wdt = em * d->fs * (double)strlen(d->cap[i]);
        int newline = (i == 3) || (i == d->cap_note) || (x > 0.0 && x + sep + wdt > usable);
        if (newline && x > 0.0) {
            d->cap_lines++;
            x = 0.0;
        }
        x += (x > 0.0 ? sep : 0.0) + wdt;
        d->cap_line[i] = d->cap_lines - 1;
    }
}

/* Layout. Text shrinks less than the picture (scale >= 0.7); the legend
 * and the caption wrap when the width runs short, and a picture too small
 * for its caption (plot under 45 % of the height) goes without it. Text
 * widths are estimated at 0.56 em per character (generic sans-serif). */
static int draw_layout(drawing *d)
{
    int W = d->W, H = d->H;
    d->scale = fmin(W / (double)GC_DIAGRAM_DEFAULT_WIDTH, H / (double)GC_DIAGRAM_DEFAULT_HEIGHT);
    if (d->scale < 0.7)
        d->scale = 0.7;
    double scale = d->scale;
    d->fs = 12.0 * scale;
    const double em = 0.56;
    frame *f = &d->f;
    f->x0 = 86.0 * scale;
    double usable = W - f->x0 - 12.0 * scale;
    int rows = layout_legend(d, usable, em);
    layout_caption(d, usable, em);
    d->leg_y0 = 46.0 * scale;
    f->y0 = d->leg_y0 + (rows - 1) * 18.0 * scale + 20.0 * scale;
    f->w = W - f->x0 - 26.0 * scale;
    f->h = H - f->y0 - (64.0 + 20.0 * d->cap_lines) * scale;
    if (f->h < 0.45 * H) {
        f->h += 20.0 * d->cap_lines * scale;
        d->cap_lines = 0;
    }
    if (f->h < 60.0 || f->w < 60.0)
        return gc_error_set(d->c.err, GC_ERR_INVALID, "/height",
                            "the picture is too small for its legend and caption");
    int xticks = (int)fmax(4.0, f->w / 95.0), yticks = (int)fmax(4.0, f->h / 60.0);
    axis_setup(&f->ax, d->xlo, d->xhi, d->opt->kind == GC_DIAGRAM_PV && d->opt->log_x, xticks);
    axis_setup(&f->ay, d->ylo, d->yhi, d->opt->kind == GC_DIAGRAM_PV && d->opt->log_y, yticks);
    d->kind_title = d->opt->kind == GC_DIAGRAM_PV ? "P-v diagram"
                  : d->opt->kind == GC_DIAGRAM_HS ? "h-s diagram" : "T-s diagram";
    return GC_OK;
}

static void write_header(const drawing *d)
{
    gc_strbuf *b = d->b;
    const gc_diagram_options *opt = d->opt;
    const frame *f = &d->f;
    int W = d->W, H = d->H;
    gc_strbuf_puts(b, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
    gc_strbuf_printf(b, "<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"%d\" "
                 "height=\"%d\" viewBox=\"0 0 %d %d\" font-family=\"sans-serif\" "
                 "font-size=\"%.1f\" fill=\"" COL_TEXT "\">\n", W, H, W, H, d->fs);
    gc_strbuf_puts(b, "<title>");
    sb_text(b, opt->title ? opt->title : d->kind_title, GC_DIAGRAM_TITLE_LEN);
    gc_strbuf_puts(b, "</title>\n");
    gc_strbuf_printf(b, "<desc>%s of the actual cycle (%d states)%s%s.</desc>\n", d->kind_title,
              d->ns, d->want_ideal ? ", with its ideal counterpart" : "",
              d->want_carnot ? " and the Carnot cycle between the same extreme temperatures" : "");
    gc_strbuf_printf(b, "<defs><clipPath id=\"gc-clip\"><rect x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" "
                 "height=\"%.2f\"/></clipPath></defs>\n", f->x0, f->y0, f->w, f->h);
    gc_strbuf_printf(b, "<rect class=\"gc-background\" x=\"0\" y=\"0\" width=\"%d\" height=\"%d\" "
                 "fill=\"#ffffff\"/>\n", W, H);
    gc_strbuf_printf(b, "<text class=\"gc-title\" x=\"%.2f\" y=\"%.2f\" font-size=\"%.1f\" "
                 "font-weight=\"bold\">", f->x0, 24.0 * d->scale, d->fs * 1.25);
    sb_text(b, opt->title ? opt->title : d->kind_title, GC_DIAGRAM_TITLE_LEN);
    gc_strbuf_puts(b, "</text>\n");
}

/* Grid lines at every tick, then the plot frame. */
static void write_grid(const drawing *d, const double *tv, int nt, const double *tvy, int nty)
{
    gc_strbuf *b = d->b;
    const frame *f = &d->f;
    gc_strbuf_printf(b, "<g class=\"gc-grid\" stroke=\"" COL_GRID "\" stroke-width=\"1\">\n");
    for (int i = 0; i < nt; i++) {
        double x = px_x(f, tv[i]);
        gc_strbuf_printf(b, "<line x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\"/>\n", x, f->y0, x,
                  f->y0 + f->h);
    }
    for (int i = 0; i < nty; i++) {
        double y = px_y(f, tvy[i]);
        gc_strbuf_printf(b, "<line x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\"/>\n", f->x0, y,
                  f->x0 + f->w, y);
    }
    gc_strbuf_puts(b, "</g>\n");
    gc_strbuf_printf(b, "<rect class=\"gc-plot\" x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" height=\"%.2f\" "
                 "fill=\"none\" stroke=\"" COL_FRAME "\" stroke-width=\"1.2\"/>\n",
              f->x0, f->y0, f->w, f->h);
}

/* Tick marks and labels of both axes. */
static void write_ticks(const drawing *d, const double *tv, const int *tl, int nt,
                        const double *tvy, const int *tly, int nty)
{
    gc_strbuf *b = d->b;
    const frame *f = &d->f;
    double scale = d->scale;
    char lab[48];
    gc_strbuf_printf(b, "<g class=\"gc-ticks-x\" font-size=\"%.1f\" text-anchor=\"middle\">\n",
                     d->fs * 0.92);
    for (int i = 0; i < nt; i++) {
        double x = px_x(f, tv[i]);
        gc_strbuf_printf(b, "<line x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"" COL_FRAME
                     "\"/>\n", x, f->y0 + f->h, x, f->y0 + f->h + (tl[i] ? 6.0 : 3.0) * scale);
        if (tl[i]) {
            tick_label(&f->ax, tv[i], lab, sizeof lab);
            gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">%s</text>\n", x,
                             f->y0 + f->h + 19.0 * scale, lab);
        }
    }
    gc_strbuf_puts(b, "</g>\n");
    gc_strbuf_printf(b, "<g class=\"gc-ticks-y\" font-size=\"%.1f\" text-anchor=\"end\">\n",
                     d->fs * 0.92);
    for (int i = 0; i < nty; i++) {
        double y = px_y(f, tvy[i]);
        gc_strbuf_printf(b, "<line x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"" COL_FRAME
                     "\"/>\n", f->x0 - (tly[i] ? 6.0 : 3.0) * scale, y, f->x0, y);
        if (tly[i]) {
            tick_label(&f->ay, tvy[i], lab, sizeof lab);
            gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">%s</text>\n", f->x0 - 9.0 * scale,
                      y + 4.0 * scale, lab);
        }
    }
    gc_strbuf_puts(b, "</g>\n");
}

static void write_axes(const drawing *d)
{
    double tv[32], tvy[32];
    int tl[32], tly[32];
    int nt = axis_ticks(&d->f.ax, tv, tl, 32);
    int nty = axis_ticks(&d->f.ay, tvy, tly, 32);
    write_grid(d, tv, nt, tvy, nty);
    write_ticks(d, tv, tl, nt, tvy, tly, nty);
}

static void write_axis_titles(const drawing *d)
{
    gc_strbuf *b = d->b;
    const frame *f = &d->f;
    const char *xsym = "s", *xname = "Specific entropy", *ysym = "T", *yname = "Temperature";
    gc_quantity xq = GC_Q_SPECIFIC_ENTROPY, yq = GC_Q_TEMPERATURE;
    if (d->opt->kind == GC_DIAGRAM_PV) {
        xsym = "v", xname = "Specific volume", xq = GC_Q_SPECIFIC_VOLUME;
        ysym = "P", yname = "Pressure", yq = GC_Q_PRESSURE;
    } else if (d->opt->kind == GC_DIAGRAM_HS) {
        ysym = "h", yname = "Specific enthalpy", yq = GC_Q_SPECIFIC_ENERGY;
    }
    gc_strbuf_printf(b, "<text class=\"gc-axis-title\" id=\"axis-x\" x=\"%.2f\" y=\"%.2f\" "
                 "text-anchor=\"middle\">%s %s [", f->x0 + f->w / 2.0,
                 f->y0 + f->h + 40.0 * d->scale, xname, xsym);
    sb_text(b, gc_units_label(xq, d->c.sys), 64);
    gc_strbuf_printf(b, "]%s</text>\n", f->ax.log ? ", log scale" : "");
    double yt_x = 20.0 * d->scale, yt_y = f->y0 + f->h / 2.0;
    gc_strbuf_printf(b, "<text class=\"gc-axis-title\" id=\"axis-y\" x=\"%.2f\" y=\"%.2f\" "
                 "text-anchor=\"middle\" transform=\"rotate(-90 %.2f %.2f)\">%s %s [",
              yt_x, yt_y, yt_x, yt_y, yname, ysym);
    sb_text(b, gc_units_label(yq, d->c.sys), 64);
    gc_strbuf_printf(b, "]%s</text>\n", f->ay.log ? ", log scale" : "");
}

/* ---- state labels: placed without collision (issue 17: "1" and "2", "5"
 * and "6" no longer overlap where two states lie close) ---------------------- */

typedef struct lbox { double x0, y0, x1, y1; } lbox;

static double lbox_overlap(const lbox *a, const lbox *b)
{
    double w = fmin(a->x1, b->x1) - fmax(a->x0, b->x0), h = fmin(a->y1, b->y1) - fmax(a->y0, b->y0);
    return w > 0.0 && h > 0.0 ? w * h : 0.0;
}

/* The text box of state i's number with its baseline centre at (x, y). */
static lbox label_box(const drawing *d, int i, double x, double y)
{
    double w = (i + 1 >= 10 ? 2.0 : 1.0) * 0.62 * d->fs + 2.0 * d->scale, h = 0.78 * d->fs;
    lbox b = { x - w / 2.0, y - h, x + w / 2.0, y + 0.12 * d->fs };
    return b;
}

/* Overlap of box c with the labels placed before i, every state marker and
 * the area outside the canvas (a placement's penalty; 0 = free). */
static double label_penalty(const drawing *d, int i, const lbox *c, const lbox *placed)
{
    const frame *f = &d->f;
    double pen = 0.0, r = 6.0 * d->scale;
    for (int k = 0; k < i; k++)
        pen += lbox_overlap(c, &placed[k]);
    for (int k = 0; k < d->ns; k++) {
        double mx = px_x(f, d->mx[k]), my = px_y(f, d->my[k]);
        lbox m = { mx - r, my - r, mx + r, my + r };
        pen += lbox_overlap(c, &m);
    }
    lbox canvas = { 2.0, 2.0, d->W - 2.0, d->H - 2.0 };
    double area = (c->x1 - c->x0) * (c->y1 - c->y0);
    return pen + (area - lbox_overlap(c, &canvas)) * 4.0;
}

/* The place of state i's label: 8 directions (outward from the states'
 * centroid first) at 3 distances; the first free one, else the least
 * overlapping. *ring: the distance step taken (a leader line beyond 0). */
static void place_label(const drawing *d, int i, double cx, double cy, const lbox *placed,
                        double *lx, double *ly, int *ring)
{
    const frame *f = &d->f;
    double x = px_x(f, d->mx[i]), y = px_y(f, d->my[i]);
    double out = atan2(y - cy, x - cx);
    if (hypot(y - cy, x - cx) < 1e-6)
        out = -M_PI / 2.0;
    double best = INFINITY;
    for (int rg = 0; rg < 3 && best > 0.0; rg++) {
        double dist = (13.0 + 10.0 * rg) * d->scale;
        for (int k = 0; k < 8 && best > 0.0; k++) {
            /* outward, then alternately either side of it */
            double a = out + (k % 2 ? 1.0 : -1.0) * ((k + 1) / 2) * (M_PI / 4.0);
            double tx = x + cos(a) * dist, ty = y + sin(a) * dist + 0.33 * d->fs;
            lbox c = label_box(d, i, tx, ty);
            double pen = label_penalty(d, i, &c, placed);
            if (pen < best) {
                best = pen;
                *lx = tx;
                *ly = ty;
                *ring = rg;
            }
        }
    }
}

/* Numbered states: a marker each, and its number placed without collision. */
static void write_states(const drawing *d)
{
    gc_strbuf *b = d->b;
    const frame *f = &d->f;
    double scale = d->scale, cx = 0.0, cy = 0.0;
    lbox placed[GC_CYCLE_MAX_STATES];
    for (int i = 0; i < d->ns; i++) {
        cx += px_x(f, d->mx[i]);
        cy += px_y(f, d->my[i]);
    }
    cx /= d->ns;
    cy /= d->ns;
    gc_strbuf_printf(b, "<g class=\"gc-states\" font-size=\"%.1f\" font-weight=\"bold\" "
                 "text-anchor=\"middle\">\n", d->fs);
    for (int i = 0; i < d->ns; i++) {
        double x = px_x(f, d->mx[i]), y = px_y(f, d->my[i]), lx = x, ly = y;
        int ring = 0;
        place_label(d, i, cx, cy, placed, &lx, &ly, &ring);
        placed[i] = label_box(d, i, lx, ly);
        gc_strbuf_printf(b, "<g class=\"gc-state\" id=\"state-%d\">", i + 1);
        if (ring > 0)
            gc_strbuf_printf(b, "<line class=\"gc-leader\" x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" "
                             "y2=\"%.2f\" stroke=\"" COL_FRAME "\" stroke-width=\"0.8\"/>", x, y,
                             lx, ly - 0.33 * d->fs);
        gc_strbuf_printf(b, "<circle cx=\"%.2f\" cy=\"%.2f\" r=\"%.1f\" fill=\"#ffffff\" "
                     "stroke=\"" COL_ACTUAL "\" stroke-width=\"2\"/>"
                     "<text x=\"%.2f\" y=\"%.2f\">%d</text></g>\n",
                  x, y, 4.5 * scale, lx, ly, i + 1);
    }
    gc_strbuf_puts(b, "</g>\n");
}

/* Legend rows above the plot. */
static void write_legend(const drawing *d)
{
    gc_strbuf *b = d->b;
    double scale = d->scale, seg = 30.0 * scale;
    static const char *const styles[3] = { STYLE_ACTUAL, STYLE_IDEAL, STYLE_CARNOT };
    gc_strbuf_printf(b, "<g class=\"gc-legend\" font-size=\"%.1f\">\n", d->fs * 0.95);
    for (int i = 0; i < 4; i++) {
        if (!d->leg_on[i])
            continue;
        double lx = d->leg_x[i], ly = d->leg_y0 + d->leg_row[i] * 18.0 * scale;
        if (i == 3) {
            gc_strbuf_printf(b, "<circle cx=\"%.2f\" cy=\"%.2f\" r=\"%.1f\" fill=\"#ffffff\" "
                         "stroke=\"" COL_ACTUAL "\" stroke-width=\"2\"/>",
                      lx + 5.0 * scale, ly - 4.0 * scale, 4.5 * scale);
            gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">", lx + 16.0 * scale, ly);
        } else if (i == 1 && d->ideal_same) {
            gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">", lx, ly);
        } else {
            gc_strbuf_printf(b, "<path fill=\"none\" %s d=\"M%.2f,%.2f L%.2f,%.2f\"/>", styles[i],
                             lx, ly - 4.0 * scale, lx + seg, ly - 4.0 * scale);
            gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">", lx + seg + 6.0 * scale, ly);
        }
        sb_text(b, d->leg_text[i], 64);
        gc_strbuf_puts(b, "</text>\n");
    }
    gc_strbuf_puts(b, "</g>\n");
}

/* Caption: key figures, one <text> per line. */
static void write_caption(const drawing *d)
{
    gc_strbuf *b = d->b;
    for (int line = 0; line < d->cap_lines; line++) {
        double y = d->H - (14.0 + 20.0 * (d->cap_lines - 1 - line)) * d->scale;
        gc_strbuf_printf(b, "<text class=\"gc-caption\" x=\"%.2f\" y=\"%.2f\">", d->f.x0, y);
        int first = 1;
        for (int i = 0; i < d->ncap; i++) {
            if (d->cap_line[i] != line)
                continue;
            if (!first)
                gc_strbuf_puts(b, " \xc2\xb7 ");
            sb_text(b, d->cap[i], sizeof d->cap[0]);
            first = 0;
        }
        gc_strbuf_puts(b, "</text>\n");
    }
}

/* The body: everything after the options are known good. */
static int render(const gc_cycle_result *r, const gc_diagram_options *opt, int points,
                  int W, int H, gc_strbuf *b, gc_error *err)
{
    drawing *d = calloc(1, sizeof *d);
    if (!d)
        return gc_error_set(err, GC_ERR_NOMEM, NULL, "out of memory drawing the diagram");
    d->c = (ctx){ opt, opt->units == GC_UNITS_US ? GC_UNITS_US : GC_UNITS_SI, err };
    d->r = r;
    d->opt = opt;
    d->points = points;
    d->W = W;
    d->H = H;
    d->b = b;
    d->act = &r->actual;
    d->want_ideal = (opt->overlays & GC_DIAGRAM_OVERLAY_IDEAL) && r->has_ideal;
    d->ideal_same = d->want_ideal && r->ideal_is_actual;
    d->want_carnot = (opt->overlays & GC_DIAGRAM_OVERLAY_CARNOT) != 0;
    int rc = draw_curves(d);
    if (rc == GC_OK)
        rc = draw_ranges(d);
    if (rc == GC_OK)
        rc = draw_caption_texts(d);
    if (rc == GC_OK)
        rc = draw_layout(d);
    if (rc == GC_OK) {
        write_header(d);
        write_axes(d);
        write_axis_titles(d);
        /* curves: bounds below, actual on top */
        if (d->want_carnot)
            write_path(b, &d->f, &d->sc, "gc-carnot", STYLE_CARNOT, 1);
        if (d->want_ideal && !d->ideal_same)
            write_path(b, &d->f, &d->si, "gc-ideal", STYLE_IDEAL, 1);
        write_path(b, &d->f, &d->sa, "gc-actual", STYLE_ACTUAL, 0);
        write_states(d);
        write_legend(d);
        write_caption(d);
        gc_strbuf_puts(b, "</svg>\n");
        if (b->failed)
            rc = gc_error_set(err, GC_ERR_NOMEM, NULL, "out of memory drawing the diagram");
    }
    series_free(&d->sa);
    series_free(&d->si);
    series_free(&d->sc);
    free(d);
    return rc;
}

int gc_diagram_svg(const gc_cycle_result *r, const gc_diagram_options *opt_in,
                   char **svg_out, size_t *len, gc_error *err)
{
    if (svg_out)
        *svg_out = NULL;
    if (len)
        *len = 0;
    if (!r || !svg_out || !len)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "no cycle result to draw");
    gc_diagram_options opt;
    if (opt_in)
        opt = *opt_in;
    else
        gc_diagram_options_default(&opt);
    if (opt.kind != GC_DIAGRAM_TS && opt.kind != GC_DIAGRAM_PV && opt.kind != GC_DIAGRAM_HS)
        return gc_error_set(err, GC_ERR_INVALID, "/diagram", "must be one of Ts, Pv, hs");
    if (opt.units != GC_UNITS_SI && opt.units != GC_UNITS_US)
        return gc_error_set(err, GC_ERR_INVALID, "/units", "must be si or us");
    if ((opt.log_x || opt.log_y) && opt.kind != GC_DIAGRAM_PV)
        return gc_error_set(err, GC_ERR_INVALID, "/scale",
                            "a log scale is available for P-v diagrams only");
    int points = opt.points == 0 ? GC_PATH_DEFAULT_POINTS : opt.points;
    if (points < GC_PATH_MIN_POINTS || points > GC_PATH_MAX_POINTS)
        return gc_error_set(err, GC_ERR_INVALID, "/points", "must be an integer from %d to %d",
                            GC_PATH_MIN_POINTS, GC_PATH_MAX_POINTS);
    int W = opt.width_px ? opt.width_px : GC_DIAGRAM_DEFAULT_WIDTH;
    int H = opt.height_px ? opt.height_px : GC_DIAGRAM_DEFAULT_HEIGHT;
    if (W < GC_DIAGRAM_MIN_SIZE || W > GC_DIAGRAM_MAX_SIZE)
        return gc_error_set(err, GC_ERR_INVALID, "/width", "must be from %d to %d px",
                            GC_DIAGRAM_MIN_SIZE, GC_DIAGRAM_MAX_SIZE);
    if (H < GC_DIAGRAM_MIN_SIZE || H > GC_DIAGRAM_MAX_SIZE)
        return gc_error_set(err, GC_ERR_INVALID, "/height", "must be from %d to %d px",
                            GC_DIAGRAM_MIN_SIZE, GC_DIAGRAM_MAX_SIZE);
    int rc = check_run(&r->actual, err);
    if (rc != GC_OK)
        return rc;

    gc_strbuf b = { .first_cap = 16384 };
    rc = render(r, &opt, points, W, H, &b, err);
    if (rc != GC_OK || b.failed || !b.s) {
        free(b.s);
        if (rc == GC_OK)
            rc = gc_error_set(err, GC_ERR_NOMEM, NULL, "out of memory drawing the diagram");
        return rc;
    }
    *svg_out = b.s;
    *len = b.len;
    return GC_OK;
}
