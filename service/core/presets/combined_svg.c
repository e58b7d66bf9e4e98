/*
 * combined_svg.c — the combined-cycle preset's own diagrams
 * (format=svg&diagram=<name>), drawn by the generic chart module (chart.h):
 *   TQ           the HRSG's T-Q diagram: the gas line and each level's water
 *                line (and the reheat steam) against the heat taken from the
 *                gas counted from the stack, each level's pinch labelled at
 *                its evaporator's gas exit;
 *   Ts           the steam cycle on T-s with the saturation dome (IF97,
 *                273.16 K to 647 K): each level's water heated along its
 *                isobar (sampled by IF97 (P, h)), the reheat, the expansion
 *                through the turbine sections (straight between their end
 *                states: the real path of an irreversible expansion is not
 *                known), condenser and pumps;
 *   combined_Ts  the gas (the topping's states to the HRSG inlet, then the
 *                HRSG's gas stations to the stack) and the steam cycle on one
 *                T-s chart, each fluid on its own entropy basis (gas: ideal
 *                gas at 1 bar, NASA-9; water: IF97), as the captions say.
 * Units: the request's unit system (units.h) for T, s and Q. Default
 * diagram: TQ.
 */
#include "core/presets/combined_internal.h"
#include "gascycle/chart.h"
#include "gascycle/diagram.h"
#include "gascycle/if97.h"
#include "gascycle/path.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <strings.h>
#include <string.h>

const char *const gc__combined_diagrams[] = { "TQ", "Ts", "combined_Ts", NULL };

#define POOL 6000          /* points over all series of one chart */
#define DOME_POINTS 48     /* per branch of the saturation dome */
#define ISOBAR_POINTS 10   /* per heating or cooling process */

typedef struct plot {
    gc_chart chart;
    gc_chart_series series[GC_CHART_MAX_SERIES];
    gc_chart_label labels[GC_CHART_MAX_LABELS];
    char label_text[GC_CHART_MAX_LABELS][48];
    char names[GC_CHART_MAX_SERIES][64];
    const char *captions[4];
    char caption_text[4][160];
    double x[POOL], y[POOL];
    int used;
    gc_unit_system sys;
} plot;

/* ---- building series ------------------------------------------------------------------ */

static gc_chart_series *series_begin(plot *p, gc_chart_kind kind, const char *name)
{
    if (p->chart.n_series >= GC_CHART_MAX_SERIES)
        return NULL;
    int k = p->chart.n_series++;
    gc_chart_series *s = &p->series[k];
    memset(s, 0, sizeof *s);
    s->kind = kind;
    snprintf(p->names[k], sizeof p->names[k], "%s", name);
    s->name = p->names[k];
    s->x = p->x + p->used;
    s->y = p->y + p->used;
    return s;
}

/* Appends one point (SI) to s in display units. */
static void point(plot *p, gc_chart_series *s, double x, gc_quantity qx, double T)
{
    if (s == NULL || p->used >= POOL || !isfinite(x) || !isfinite(T))
        return;
    p->x[p->used] = gc_units_from_si(qx, p->sys, x);
    p->y[p->used] = gc_units_from_si(GC_Q_TEMPERATURE, p->sys, T);
    p->used++;
    s->n++;
}

/* Drops a series that got fewer than two points. */
static void series_end(plot *p, gc_chart_series *s)
{
    if (s && s->n < 2 && &p->series[p->chart.n_series - 1] == s) {
        p->used -= s->n;
        p->chart.n_series--;
    }
}

static void label(plot *p, double x, gc_quantity qx, double T, const char *text)
{
    int k = p->chart.n_labels;
    if (k >= GC_CHART_MAX_LABELS || !isfinite(x) || !isfinite(T))
        return;
    snprintf(p->label_text[k], sizeof p->label_text[k], "%s", text);
    p->labels[k].x = gc_units_from_si(qx, p->sys, x);
    p->labels[k].y = gc_units_from_si(GC_Q_TEMPERATURE, p->sys, T);
    p->labels[k].text = p->label_text[k];
    p->labels[k].marker = 1;
    p->chart.n_labels++;
}

static void caption(plot *p, const char *text)
{
    int k = p->chart.n_captions;
    if (k >= 4)
        return;
    snprintf(p->caption_text[k], sizeof p->caption_text[k], "%s", text);
    p->captions[k] = p->caption_text[k];
    p->chart.n_captions++;
}

static void plot_init(plot *p, const struct gc_diagram_options *opt, const char *title,
                      gc_quantity qx, const char *x_title)
{
    memset(p, 0, sizeof *p);
    p->sys = opt ? opt->units : GC_UNITS_SI;
    gc_chart_init(&p->chart);
    p->chart.title = title;
    p->chart.x.title = x_title;
    p->chart.x.unit = gc_units_label(qx, p->sys);
    p->chart.y.title = "Temperature";
    p->chart.y.unit = gc_units_label(GC_Q_TEMPERATURE, p->sys);
    p->chart.series = p->series;
    p->chart.labels = p->labels;
    p->chart.captions = p->captions;
    if (opt) {
        p->chart.width_px = opt->width_px;
        p->chart.height_px = opt->height_px;
    }
}

/* ---- T-Q ---------------------------------------------------------------------------------- */

/* The stream's level name ("hp", "ip", "lp") or "reheat". */
static void stream_group(const char *stream, char *out, size_t n)
{
    if (strncmp(stream, "reheat", 6) == 0) {
        snprintf(out, n, "reheat");
        return;
    }
    size_t k = strcspn(stream, "_");
    snprintf(out, n, "%.*s", (int)(k < 8 ? k : 8), stream);
}

static void tq_water(plot *p, const gc_combined_result *r, const char *group)
{
    char name[64], g[16];
    snprintf(name, sizeof name, "%s water", group);
    if (strcmp(group, "reheat") == 0)
        snprintf(name, sizeof name, "reheat steam");
    gc_chart_series *s = series_begin(p, GC_CHART_LINE, name);
    for (int i = 0; s && i < r->n_tq; i++)
        for (int j = 0; j < GC_STEAM_MAX_LEVELS; j++) {
            if (!r->tq[i].has[j])
                continue;
            stream_group(r->tq[i].stream[j], g, sizeof g);
            if (strcmp(g, group) == 0)
                point(p, s, r->tq[i].Q_W, GC_Q_POWER, r->tq[i].T_water_K[j]);
        }
    series_end(p, s);
}

/* Each level's pinch, labelled on the gas line at its evaporator's gas exit. */
static void tq_pinches(plot *p, const gc_combined_result *r)
{
    for (int l = 0; l < r->n_levels; l++) {
        char evap[GC_STEAM_NAME_LEN], text[48];
        snprintf(evap, sizeof evap, "%s_evaporator", r->levels[l].name);
        for (int i = 0; i < r->n_tq; i++) {
            int hit = 0;
            for (int j = 0; j < GC_STEAM_MAX_LEVELS; j++)
                hit |= r->tq[i].has[j] && strcmp(r->tq[i].stream[j], evap) == 0;
            if (!hit)
                continue;
            snprintf(text, sizeof text, "%s pinch %.1f K", r->levels[l].name,
                     r->levels[l].pinch_K);
            label(p, r->tq[i].Q_W, GC_Q_POWER, r->tq[i].T_gas_K, text);
            break;
        }
    }
}

static int draw_tq(plot *p, const gc_combined_result *r)
{
    gc_chart_series *gas = series_begin(p, GC_CHART_LINE, "gas");
    for (int i = 0; gas && i < r->n_tq; i++)
        point(p, gas, r->tq[i].Q_W, GC_Q_POWER, r->tq[i].T_gas_K);
    series_end(p, gas);
    static const char *const groups[] = { "hp", "ip", "lp", "reheat" };
    for (int k = 0; k < 4; k++)
        tq_water(p, r, groups[k]);
    tq_pinches(p, r);
    caption(p, "Heat taken from the gas, counted from the stack; a pinch is the evaporator's "
               "gas exit minus the saturation temperature.");
    return r->n_tq >= 2 ? GC_OK : GC_ERR_INVALID;
}

/* ---- T-s of the steam cycle ------------------------------------------------------------- */

static void dome(plot *p)
{
    gc_chart_series *s = series_begin(p, GC_CHART_LINE, "saturation (IF97)");
    double T0 = 273.16, T1 = GC_IF97_TC_K - 0.2;
    gc_if97_state l, v;
    for (int i = 0; s && i <= DOME_POINTS; i++) {
        double T = T0 + (T1 - T0) * i / DOME_POINTS;
        if (gc_if97_sat_T(T, &l, NULL, NULL) == GC_OK)
            point(p, s, l.s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY, T);
    }
    for (int i = DOME_POINTS; s && i >= 0; i--) {
        double T = T0 + (T1 - T0) * i / DOME_POINTS;
        if (gc_if97_sat_T(T, NULL, &v, NULL) == GC_OK)
            point(p, s, v.s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY, T);
    }
    if (s)
        s->dash = GC_CHART_DOTTED;
    series_end(p, s);
}

/* A water process along its isobar (heating, cooling) or straight. */
static void water_path(plot *p, gc_chart_series *s, const gc_steam_result *st,
                       const gc_steam_process *sp, int isobar)
{
    const gc_steam_station *a = &st->stations[sp->from], *b = &st->stations[sp->to];
    int n = isobar ? ISOBAR_POINTS : 1;
    for (int i = 0; i <= n; i++) {
        double f = (double)i / n;
        if (!isobar || i == 0 || i == n) {
            const gc_steam_station *e = i == 0 ? a : b;
            point(p, s, e->s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY, e->T_K);
            continue;
        }
        gc_if97_state w;
        if (gc_if97_state_Ph(b->P_Pa, a->h_J_per_kg + f * (b->h_J_per_kg - a->h_J_per_kg), &w,
                             NULL) == GC_OK)
            point(p, s, w.s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY, w.T_K);
    }
}

static int valid_process(const gc_steam_result *st, const gc_steam_process *sp, int kind)
{
    return sp->kind == kind && sp->from >= 0 && sp->to >= 0 && sp->from < st->n_stations &&
           sp->to < st->n_stations && st->stations[sp->from].fluid == GC_STEAM_WATER;
}

/* One level's water: its HRSG sections by rising temperature, each on its isobar. */
static void level_path(plot *p, const gc_steam_result *st, const char *lv)
{
    char name[64];
    snprintf(name, sizeof name, "%s water and steam", lv);
    gc_chart_series *s = series_begin(p, GC_CHART_LINE, name);
    int order[GC_STEAM_MAX_PROCESSES], n = 0;
    size_t len = strlen(lv);
    for (int k = 0; s && k < st->n_processes; k++) {
        const gc_steam_process *sp = &st->processes[k];
        int heat = sp->kind == GC_STEAM_ECONOMISER || sp->kind == GC_STEAM_EVAPORATOR ||
                   sp->kind == GC_STEAM_SUPERHEATER;
        if (heat && valid_process(st, sp, sp->kind) && strncmp(sp->name, lv, len) == 0 &&
            sp->name[len] == '_')
            order[n++] = k;
    }
    for (int i = 1; i < n; i++)   /* insertion sort by inlet temperature */
        for (int j = i; j > 0 && st->stations[st->processes[order[j]].from].T_K <
                                     st->stations[st->processes[order[j - 1]].from].T_K; j--) {
            int t = order[j];
            order[j] = order[j - 1];
            order[j - 1] = t;
        }
    for (int i = 0; i < n; i++)
        water_path(p, s, st, &st->processes[order[i]], 1);
    series_end(p, s);
}

/* The processes of one kind in list order, one series. */
static void kind_path(plot *p, const gc_steam_result *st, int kind, int kind2, const char *name,
                      int isobar, gc_chart_dash dash)
{
    gc_chart_series *s = series_begin(p, GC_CHART_LINE, name);
    for (int k = 0; s && k < st->n_processes; k++) {
        const gc_steam_process *sp = &st->processes[k];
        if (valid_process(st, sp, kind) || valid_process(st, sp, kind2))
            water_path(p, s, st, sp, isobar);
    }
    if (s)
        s->dash = dash;
    series_end(p, s);
}

static void steam_labels(plot *p, const gc_steam_result *st)
{
    static const char *const names[] = { "hp_steam", "ip_steam", "lp_steam", "hot_reheat",
                                         "condensate", NULL };
    for (int i = 0; names[i]; i++) {
        int k = gc_steam_station_index(st, names[i]);
        if (k >= 0)
            label(p, st->stations[k].s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY, st->stations[k].T_K,
                  names[i]);
    }
}

static void steam_series(plot *p, const gc_steam_result *st)
{
    static const char *const lv[] = { "hp", "ip", "lp" };
    for (int i = 0; i < 3; i++)
        level_path(p, st, lv[i]);
    kind_path(p, st, GC_STEAM_REHEATER, -1, "reheat", 1, GC_CHART_SOLID);
    kind_path(p, st, GC_STEAM_TURBINE, -1, "expansion (end states)", 0, GC_CHART_DASHED);
    kind_path(p, st, GC_STEAM_CONDENSER, GC_STEAM_PUMP, "condenser and pumps", 0,
              GC_CHART_SOLID);
}

static int draw_ts(plot *p, const gc_combined_result *r)
{
    dome(p);
    steam_series(p, &r->steam);
    steam_labels(p, &r->steam);
    caption(p, "Water and steam by IAPWS-IF97 (s = 0: saturated liquid at the triple point).");
    caption(p, "Heating along the isobars; expansions straight between their end states.");
    return GC_OK;
}

/* ---- combined T-s --------------------------------------------------------------------------- */

#define PATH_POINTS 16   /* per topping process, along its real curve (path.h) */

/* The topping's processes up to the HRSG inlet along their curves; its states
 * joined straight when it has no engine run (an exhaust as given). */
static void topping_gas(plot *p, gc_chart_series *s, const gc_combined_input *in,
                        const gc_combined_result *r)
{
    const gc_combined_topping *t = gc__combined_topping_of(in);
    int n = 0;
    const gc_cycle_result *c = t && t->cycle ? t->cycle(r->topping.bytes, &n) : NULL;
    gc_path_point pts[PATH_POINTS];
    for (int k = 0; c && k < c->actual.n_processes; k++) {
        const gc_cycle_process *cp = &c->actual.processes[k];
        if (cp->to >= n || cp->from >= n ||
            gc_cycle_path(&c->actual, k, PATH_POINTS, pts, NULL) != GC_OK)
            continue;
        for (int i = 0; i < PATH_POINTS; i++)
            point(p, s, pts[i].s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY, pts[i].T_K);
    }
    for (int i = 0; !c && i < r->n_states; i++)
        if (r->states[i].part == GC_CC_GAS_TURBINE)
            point(p, s, r->states[i].s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY, r->states[i].T_K);
}

static int draw_combined(plot *p, const gc_combined_input *in, const gc_combined_result *r)
{
    gc_chart_series *gt = series_begin(p, GC_CHART_LINE, "gas turbine (gas)");
    topping_gas(p, gt, in, r);
    series_end(p, gt);
    gc_chart_series *hg = series_begin(p, GC_CHART_LINE, "HRSG gas");
    for (int i = 0; hg && i < r->n_states; i++)
        if (r->states[i].part == GC_CC_HRSG)
            point(p, hg, r->states[i].s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY, r->states[i].T_K);
    series_end(p, hg);
    dome(p);
    steam_series(p, &r->steam);
    caption(p, "Each fluid on its own entropy basis: gas as an ideal gas at 1 bar (NASA-9);");
    caption(p, "water and steam by IAPWS-IF97 (s = 0: saturated liquid at the triple point).");
    caption(p, "The gas runs from the compressor inlet along its processes to the stack.");
    return GC_OK;
}

/* ---- the hook ------------------------------------------------------------------------------- */

int gc__combined_svg(const void *input, const void *result, const char *diagram,
                     const struct gc_diagram_options *opt, char **svg, size_t *len,
                     gc_error *err)
{
    const gc_combined_input *in = input;
    const gc_combined_result *r = result;
    plot *p = malloc(sizeof *p);
    if (p == NULL)
        return gc_error_set(err, GC_ERR_NOMEM, "", "out of memory");
    int rc;
    if (diagram == NULL || strcasecmp(diagram, "TQ") == 0) {
        plot_init(p, opt, "HRSG T-Q diagram", GC_Q_POWER, "Heat from the gas");
        rc = draw_tq(p, r);
    } else if (strcasecmp(diagram, "Ts") == 0) {
        plot_init(p, opt, "Steam cycle T-s diagram", GC_Q_SPECIFIC_ENTROPY, "Entropy");
        rc = draw_ts(p, r);
    } else if (strcasecmp(diagram, "combined_Ts") == 0) {
        plot_init(p, opt, "Combined cycle T-s diagram", GC_Q_SPECIFIC_ENTROPY, "Entropy");
        rc = draw_combined(p, in, r);
    } else {
        free(p);
        return gc_error_set(err, GC_ERR_INVALID, "/diagram",
                            "must be one of 'TQ', 'Ts', 'combined_Ts'");
    }
    if (rc != GC_OK) {
        free(p);
        return gc_error_set(err, GC_ERR_INVALID, "/diagram",
                            "the T-Q data were not kept for this evaluation");
    }
    rc = gc_chart_svg(&p->chart, svg, len, err);
    free(p);
    return rc;
}
