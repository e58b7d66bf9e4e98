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
 * Safety: every number written is checked finite first; a non-finite value
 * refuses the drawing (GC_ERR_INVALID) instead of writing "nan". All text is
 * XML-escaped and forced to valid UTF-8.
 */
#include "gascycle/diagram.h"
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

/* A tick label: linear with the axis's decimals, log as the plain value. */
static void tick_label(const axis *a, double t, char *out, size_t n)
{
    if (!a->log) {
        snprintf(out, n, "%.*f", a->decimals, t);
    } else {
        double v = pow(10.0, t);
        double av = fabs(v);
        if (av >= 1e-3 && av < 1e6)
            snprintf(out, n, "%.4g", v);
        else
            snprintf(out, n, "%.0e", v);
    }
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

/* The body: everything after the options are known good. */
static int render(const gc_cycle_result *r, const gc_diagram_options *opt, int points,
                  int W, int H, gc_strbuf *b, gc_error *err)
{
    ctx c = { opt, opt->units == GC_UNITS_US ? GC_UNITS_US : GC_UNITS_SI, err };
    const gc_cycle_run *act = &r->actual;
    int want_ideal = (opt->overlays & GC_DIAGRAM_OVERLAY_IDEAL) && r->has_ideal;
    int ideal_same = want_ideal && r->ideal_is_actual;
    int want_carnot = (opt->overlays & GC_DIAGRAM_OVERLAY_CARNOT) != 0;
    series sa = { 0 }, si = { 0 }, sc = { 0 };
    int rc = run_series(&c, act, points, &sa);
    if (rc == GC_OK && want_ideal && !ideal_same) {
        rc = check_run(&r->ideal, err);
        if (rc == GC_OK)
            rc = run_series(&c, &r->ideal, points, &si);
    }

    /* extremes of the actual cycle's states (for the Carnot overlay) */
    int ns = gc_diagram_state_count(act);
    double T_lo = INFINITY, T_hi = -INFINITY, s_lo = INFINITY, s_hi = -INFINITY;
    for (int i = 0; i < act->n_states; i++) {
        const gc_cycle_state *st = &act->states[i];
        T_lo = fmin(T_lo, st->T_K);
        T_hi = fmax(T_hi, st->T_K);
        s_lo = fmin(s_lo, st->s_J_per_kgK);
        s_hi = fmax(s_hi, st->s_J_per_kgK);
    }
    if (rc == GC_OK && want_carnot) {
        if (!isfinite(T_lo) || !isfinite(T_hi) || !isfinite(s_lo) || !isfinite(s_hi))
            rc = gc_error_set(err, GC_ERR_INVALID, NULL,
                              "the cycle result holds a non-finite value; no diagram drawn");
        else
            rc = carnot_series(&c, &act->gases[0], T_lo, T_hi, s_lo, s_hi, points, &sc);
    }
    /* state markers in display coordinates */
    double mx[GC_CYCLE_MAX_STATES], my[GC_CYCLE_MAX_STATES];
    for (int i = 0; i < ns && rc == GC_OK; i++) {
        const gc_cycle_state *st = &act->states[i];
        rc = to_display(&c, st->T_K, st->s_J_per_kgK, st->P_Pa, st->v_m3_per_kg, st->hs_J_per_kg,
                        &mx[i], &my[i]);
    }
    if (rc != GC_OK)
        goto done;

    /* ranges: the actual and ideal cycles; Carnot too where it is a rectangle
     * inside the same T and s range (T-s, h-s); on P-v it is clipped. */
    double xlo = INFINITY, xhi = -INFINITY, ylo = INFINITY, yhi = -INFINITY;
    range_add(&xlo, &xhi, &sa, 1);
    range_add(&ylo, &yhi, &sa, 0);
    range_add(&xlo, &xhi, &si, 1);
    range_add(&ylo, &yhi, &si, 0);
    if (opt->kind != GC_DIAGRAM_PV) {
        range_add(&xlo, &xhi, &sc, 1);
        range_add(&ylo, &yhi, &sc, 0);
    }
    if (!isfinite(xlo) || !isfinite(xhi) || !isfinite(ylo) || !isfinite(yhi)) {
        rc = gc_error_set(err, GC_ERR_INVALID, NULL, "the cycle result has no points to draw");
        goto done;
    }

    /* caption segments (key figures), all checked finite */
    char cap[6][96];
    int ncap = 0, cap_note = -1;          /* segments 0-2 figures, 3.. bounds, then the note */
    {
        const gc_cycle_summary *sm = &act->summary;
        char wnet[32], qin[32];
        double wv = gc_units_from_si(GC_Q_SPECIFIC_ENERGY, c.sys, sm->net_work);
        double qv = gc_units_from_si(GC_Q_SPECIFIC_ENERGY, c.sys,
                                     opt->has_figures ? opt->heat_in : sm->heat_in);
        const char *eu = gc_units_label(GC_Q_SPECIFIC_ENERGY, c.sys);
        double eta = (opt->has_figures ? opt->thermal_efficiency : sm->thermal_efficiency) * 100.0;
        double eta_c = r->carnot_efficiency * 100.0;
        double eta_i = !r->has_ideal ? 0.0
                     : (opt->has_figures ? opt->ideal_thermal_efficiency
                                         : r->ideal.summary.thermal_efficiency) * 100.0;
        double tlo = gc_units_from_si(GC_Q_TEMPERATURE, c.sys, T_lo);
        double thi = gc_units_from_si(GC_Q_TEMPERATURE, c.sys, T_hi);
        if (!isfinite(eta) || !isfinite(eta_c) || !isfinite(tlo) || !isfinite(thi) ||
            !isfinite(wv) || !isfinite(qv) || !isfinite(eta_i)) {
            rc = gc_error_set(err, GC_ERR_INVALID, NULL,
                              "the cycle summary holds a non-finite value; no diagram drawn");
            goto done;
        }
        fmt_energy(wnet, sizeof wnet, wv);
        fmt_energy(qin, sizeof qin, qv);
        snprintf(cap[ncap++], sizeof cap[0], "Thermal efficiency %.1f %%", eta);
        snprintf(cap[ncap++], sizeof cap[0], "net work %s %s", wnet, eu);
        snprintf(cap[ncap++], sizeof cap[0], "heat added %s %s", qin, eu);
        if (r->has_ideal)
            snprintf(cap[ncap++], sizeof cap[0], "Ideal counterpart %.1f %%", eta_i);
        snprintf(cap[ncap++], sizeof cap[0], "Carnot %.1f %% between %.0f and %.0f %s", eta_c, tlo,
                 thi, gc_units_label(GC_Q_TEMPERATURE, c.sys));
        /* s and h of different gases (air, then combustion products) are not
         * one closed curve: say so rather than let the gap look like an error */
        if (act->n_gases > 1 && opt->kind != GC_DIAGRAM_PV) {
            cap_note = ncap;
            snprintf(cap[ncap++], sizeof cap[0], "The gas changes at combustion: the loop need not close");
        }
    }

    /* Layout. Text shrinks less than the picture (scale >= 0.7); the legend
     * and the caption wrap when the width runs short, and a picture too small
     * for its caption (plot under 45 % of the height) goes without it. Text
     * widths are estimated at 0.56 em per character (generic sans-serif). */
    double scale = fmin(W / (double)GC_DIAGRAM_DEFAULT_WIDTH, H / (double)GC_DIAGRAM_DEFAULT_HEIGHT);
    if (scale < 0.7)
        scale = 0.7;
    double fs = 12.0 * scale;            /* base font size, px */
    const double em = 0.56;
    frame f;
    f.x0 = 86.0 * scale;
    double usable = W - f.x0 - 12.0 * scale;

    /* legend items: 0 actual, 1 ideal (or its note), 2 carnot, 3 state */
    const char *leg_text[4];
    int leg_on[4] = { 1, want_ideal, want_carnot, 1 };
    leg_text[0] = "Actual cycle";
    leg_text[1] = ideal_same ? "Ideal counterpart = actual" : "Ideal counterpart";
    leg_text[2] = opt->kind == GC_DIAGRAM_PV ? "Carnot, same T range (clipped)" : "Carnot, same T range";
    leg_text[3] = "State";
    double leg_x[4], leg_row[4];
    int rows = 1;
    {
        double seg = 30.0 * scale, lfs = fs * 0.95, x = 0.0;
        for (int i = 0; i < 4; i++) {
            if (!leg_on[i])
                continue;
            double lead = (i == 1 && ideal_same) ? 0.0 : (i == 3 ? 16.0 * scale : seg + 6.0 * scale);
            double wdt = lead + em * lfs * (double)strlen(leg_text[i]) + 24.0 * scale;
            if (x > 0.0 && x + wdt - 24.0 * scale > usable) {
                rows++;
                x = 0.0;
            }
            leg_x[i] = f.x0 + x;
            leg_row[i] = rows - 1;
            x += wdt;
        }
    }
    /* caption lines: greedy fill of the segments */
    int cap_line[6], cap_lines = 1;
    {
        double x = 0.0, sep = em * fs * 3.0;
        for (int i = 0; i < ncap; i++) {
            double wdt = em * fs * (double)strlen(cap[i]);
            int newline = (i == 3) || (i == cap_note) || (x > 0.0 && x + sep + wdt > usable);
            if (newline && x > 0.0) {
                cap_lines++;
                x = 0.0;
            }
            x += (x > 0.0 ? sep : 0.0) + wdt;
            cap_line[i] = cap_lines - 1;
        }
    }
    double leg_y0 = 46.0 * scale;
    f.y0 = leg_y0 + (rows - 1) * 18.0 * scale + 20.0 * scale;
    f.w = W - f.x0 - 26.0 * scale;
    f.h = H - f.y0 - (64.0 + 20.0 * cap_lines) * scale;
    if (f.h < 0.45 * H) {
        f.h += 20.0 * cap_lines * scale;
        cap_lines = 0;
    }
    if (f.h < 60.0 || f.w < 60.0) {
        rc = gc_error_set(err, GC_ERR_INVALID, "/height",
                          "the picture is too small for its legend and caption");
        goto done;
    }
    int xticks = (int)fmax(4.0, f.w / 95.0), yticks = (int)fmax(4.0, f.h / 60.0);
    axis_setup(&f.ax, xlo, xhi, opt->kind == GC_DIAGRAM_PV && opt->log_x, xticks);
    axis_setup(&f.ay, ylo, yhi, opt->kind == GC_DIAGRAM_PV && opt->log_y, yticks);

    const char *xsym, *ysym, *xname, *yname;
    gc_quantity xq, yq;
    switch (opt->kind) {
    case GC_DIAGRAM_PV:
        xsym = "v"; xname = "Specific volume"; xq = GC_Q_SPECIFIC_VOLUME;
        ysym = "P"; yname = "Pressure"; yq = GC_Q_PRESSURE;
        break;
    case GC_DIAGRAM_HS:
        xsym = "s"; xname = "Specific entropy"; xq = GC_Q_SPECIFIC_ENTROPY;
        ysym = "h"; yname = "Specific enthalpy"; yq = GC_Q_SPECIFIC_ENERGY;
        break;
    default:
        xsym = "s"; xname = "Specific entropy"; xq = GC_Q_SPECIFIC_ENTROPY;
        ysym = "T"; yname = "Temperature"; yq = GC_Q_TEMPERATURE;
        break;
    }
    const char *kind_title = opt->kind == GC_DIAGRAM_PV ? "P-v diagram"
                           : opt->kind == GC_DIAGRAM_HS ? "h-s diagram" : "T-s diagram";

    /* header */
    gc_strbuf_puts(b, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
    gc_strbuf_printf(b, "<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"%d\" "
                 "height=\"%d\" viewBox=\"0 0 %d %d\" font-family=\"sans-serif\" "
                 "font-size=\"%.1f\" fill=\"" COL_TEXT "\">\n", W, H, W, H, fs);
    gc_strbuf_puts(b, "<title>");
    sb_text(b, opt->title ? opt->title : kind_title, GC_DIAGRAM_TITLE_LEN);
    gc_strbuf_puts(b, "</title>\n");
    gc_strbuf_printf(b, "<desc>%s of the actual cycle (%d states)%s%s.</desc>\n", kind_title, ns,
              want_ideal ? ", with its ideal counterpart" : "",
              want_carnot ? " and the Carnot cycle between the same extreme temperatures" : "");
    gc_strbuf_printf(b, "<defs><clipPath id=\"gc-clip\"><rect x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" "
                 "height=\"%.2f\"/></clipPath></defs>\n", f.x0, f.y0, f.w, f.h);
    gc_strbuf_printf(b, "<rect class=\"gc-background\" x=\"0\" y=\"0\" width=\"%d\" height=\"%d\" "
                 "fill=\"#ffffff\"/>\n", W, H);
    gc_strbuf_printf(b, "<text class=\"gc-title\" x=\"%.2f\" y=\"%.2f\" font-size=\"%.1f\" "
                 "font-weight=\"bold\">", f.x0, 24.0 * scale, fs * 1.25);
    sb_text(b, opt->title ? opt->title : kind_title, GC_DIAGRAM_TITLE_LEN);
    gc_strbuf_puts(b, "</text>\n");

    /* grid and ticks */
    double tv[32], tvy[32];
    int tl[32], tly[32];
    char lab[48];
    int nt = axis_ticks(&f.ax, tv, tl, 32);
    gc_strbuf_printf(b, "<g class=\"gc-grid\" stroke=\"" COL_GRID "\" stroke-width=\"1\">\n");
    for (int i = 0; i < nt; i++) {
        double x = px_x(&f, tv[i]);
        gc_strbuf_printf(b, "<line x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\"/>\n", x, f.y0, x,
                  f.y0 + f.h);
    }
    int nty = axis_ticks(&f.ay, tvy, tly, 32);
    for (int i = 0; i < nty; i++) {
        double y = px_y(&f, tvy[i]);
        gc_strbuf_printf(b, "<line x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\"/>\n", f.x0, y,
                  f.x0 + f.w, y);
    }
    gc_strbuf_puts(b, "</g>\n");
    gc_strbuf_printf(b, "<rect class=\"gc-plot\" x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" height=\"%.2f\" "
                 "fill=\"none\" stroke=\"" COL_FRAME "\" stroke-width=\"1.2\"/>\n",
              f.x0, f.y0, f.w, f.h);
    gc_strbuf_printf(b, "<g class=\"gc-ticks-x\" font-size=\"%.1f\" text-anchor=\"middle\">\n", fs * 0.92);
    for (int i = 0; i < nt; i++) {
        double x = px_x(&f, tv[i]);
        gc_strbuf_printf(b, "<line x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"" COL_FRAME
                     "\"/>\n", x, f.y0 + f.h, x, f.y0 + f.h + (tl[i] ? 6.0 : 3.0) * scale);
        if (tl[i]) {
            tick_label(&f.ax, tv[i], lab, sizeof lab);
            gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">%s</text>\n", x, f.y0 + f.h + 19.0 * scale,
                      lab);
        }
    }
    gc_strbuf_puts(b, "</g>\n");
    gc_strbuf_printf(b, "<g class=\"gc-ticks-y\" font-size=\"%.1f\" text-anchor=\"end\">\n", fs * 0.92);
    for (int i = 0; i < nty; i++) {
        double y = px_y(&f, tvy[i]);
        gc_strbuf_printf(b, "<line x1=\"%.2f\" y1=\"%.2f\" x2=\"%.2f\" y2=\"%.2f\" stroke=\"" COL_FRAME
                     "\"/>\n", f.x0 - (tly[i] ? 6.0 : 3.0) * scale, y, f.x0, y);
        if (tly[i]) {
            tick_label(&f.ay, tvy[i], lab, sizeof lab);
            gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">%s</text>\n", f.x0 - 9.0 * scale,
                      y + 4.0 * scale, lab);
        }
    }
    gc_strbuf_puts(b, "</g>\n");

    /* axis titles */
    gc_strbuf_printf(b, "<text class=\"gc-axis-title\" id=\"axis-x\" x=\"%.2f\" y=\"%.2f\" "
                 "text-anchor=\"middle\">%s %s [", f.x0 + f.w / 2.0, f.y0 + f.h + 40.0 * scale,
              xname, xsym);
    sb_text(b, gc_units_label(xq, c.sys), 64);
    gc_strbuf_printf(b, "]%s</text>\n", f.ax.log ? ", log scale" : "");
    double yt_x = 20.0 * scale, yt_y = f.y0 + f.h / 2.0;
    gc_strbuf_printf(b, "<text class=\"gc-axis-title\" id=\"axis-y\" x=\"%.2f\" y=\"%.2f\" "
                 "text-anchor=\"middle\" transform=\"rotate(-90 %.2f %.2f)\">%s %s [",
              yt_x, yt_y, yt_x, yt_y, yname, ysym);
    sb_text(b, gc_units_label(yq, c.sys), 64);
    gc_strbuf_printf(b, "]%s</text>\n", f.ay.log ? ", log scale" : "");

    /* curves: bounds below, actual on top */
    if (want_carnot)
        write_path(b, &f, &sc, "gc-carnot", STYLE_CARNOT, 1);
    if (want_ideal && !ideal_same)
        write_path(b, &f, &si, "gc-ideal", STYLE_IDEAL, 1);
    write_path(b, &f, &sa, "gc-actual", STYLE_ACTUAL, 0);

    /* numbered states: labels pushed away from the states' centroid */
    double cx = 0.0, cy = 0.0;
    for (int i = 0; i < ns; i++) {
        cx += px_x(&f, mx[i]);
        cy += px_y(&f, my[i]);
    }
    cx /= ns;
    cy /= ns;
    gc_strbuf_printf(b, "<g class=\"gc-states\" font-size=\"%.1f\" font-weight=\"bold\" "
                 "text-anchor=\"middle\">\n", fs);
    for (int i = 0; i < ns; i++) {
        double x = px_x(&f, mx[i]), y = px_y(&f, my[i]);
        double dx = x - cx, dy = y - cy, d = hypot(dx, dy);
        if (d < 1e-6) {
            dx = 0.0;
            dy = -1.0;
            d = 1.0;
        }
        double lx = x + dx / d * 15.0 * scale, ly = y + dy / d * 15.0 * scale + 4.0 * scale;
        lx = fmin(fmax(lx, 8.0), W - 8.0);
        ly = fmin(fmax(ly, 12.0), H - 4.0);
        gc_strbuf_printf(b, "<g class=\"gc-state\" id=\"state-%d\"><circle cx=\"%.2f\" cy=\"%.2f\" "
                     "r=\"%.1f\" fill=\"#ffffff\" stroke=\"" COL_ACTUAL "\" stroke-width=\"2\"/>"
                     "<text x=\"%.2f\" y=\"%.2f\">%d</text></g>\n",
                  i + 1, x, y, 4.5 * scale, lx, ly, i + 1);
    }
    gc_strbuf_puts(b, "</g>\n");

    /* legend rows above the plot */
    {
        double seg = 30.0 * scale;
        gc_strbuf_printf(b, "<g class=\"gc-legend\" font-size=\"%.1f\">\n", fs * 0.95);
        static const char *const styles[3] = { STYLE_ACTUAL, STYLE_IDEAL, STYLE_CARNOT };
        for (int i = 0; i < 4; i++) {
            if (!leg_on[i])
                continue;
            double lx = leg_x[i], ly = leg_y0 + leg_row[i] * 18.0 * scale;
            if (i == 3) {
                gc_strbuf_printf(b, "<circle cx=\"%.2f\" cy=\"%.2f\" r=\"%.1f\" fill=\"#ffffff\" "
                             "stroke=\"" COL_ACTUAL "\" stroke-width=\"2\"/>",
                          lx + 5.0 * scale, ly - 4.0 * scale, 4.5 * scale);
                gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">", lx + 16.0 * scale, ly);
            } else if (i == 1 && ideal_same) {
                gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">", lx, ly);
            } else {
                gc_strbuf_printf(b, "<path fill=\"none\" %s d=\"M%.2f,%.2f L%.2f,%.2f\"/>", styles[i], lx,
                          ly - 4.0 * scale, lx + seg, ly - 4.0 * scale);
                gc_strbuf_printf(b, "<text x=\"%.2f\" y=\"%.2f\">", lx + seg + 6.0 * scale, ly);
            }
            sb_text(b, leg_text[i], 64);
            gc_strbuf_puts(b, "</text>\n");
        }
        gc_strbuf_puts(b, "</g>\n");
    }

    /* caption: key figures, one <text> per line */
    for (int line = 0; line < cap_lines; line++) {
        double y = H - (14.0 + 20.0 * (cap_lines - 1 - line)) * scale;
        gc_strbuf_printf(b, "<text class=\"gc-caption\" x=\"%.2f\" y=\"%.2f\">", f.x0, y);
        int first = 1;
        for (int i = 0; i < ncap; i++) {
            if (cap_line[i] != line)
                continue;
            if (!first)
                gc_strbuf_puts(b, " \xc2\xb7 ");
            sb_text(b, cap[i], sizeof cap[0]);
            first = 0;
        }
        gc_strbuf_puts(b, "</text>\n");
    }
    gc_strbuf_puts(b, "</svg>\n");
    if (b->failed)
        rc = gc_error_set(err, GC_ERR_NOMEM, NULL, "out of memory drawing the diagram");

done:
    series_free(&sa);
    series_free(&si);
    series_free(&sc);
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
