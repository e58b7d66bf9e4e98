/*
 * test_diagram.c — the diagram renderer (include/gascycle/diagram.h) and the
 * process paths it draws (path.h).
 *
 * SVG checks: every document (several cycles x T-s, P-v, log P-v, h-s x si,
 * us) is parsed with a real XML parser (libxml2, no network access) and must
 * be well-formed SVG 1.1 with the SVG namespace, a viewBox and a size; it
 * must hold one marker per distinct state, axis titles carrying the unit
 * labels of the chosen system (units.h), no "nan"/"inf" anywhere, and every
 * vertex of the actual (and ideal) cycle's path and every state marker inside
 * the plot rectangle; each state marker must sit on a vertex of the actual
 * path (the states are the ends of the drawn curves).
 *
 * Paths checks: the areas of the very points the picture uses (default
 * points per process) must satisfy the engine's area balance within 0.1 %:
 * loop integral of T ds and of P dv (closed frame) or -v dP (flow frame)
 * equal the net work for the ideal cycle, net work plus dissipated work for
 * the actual one (first and second law for an internally irreversible
 * process: T ds = dq + dw_dissipated; common practice). The integral is taken
 * here independently of the engine: x(t) and y(t) interpolated by parabolas
 * through each three consecutive points (evenly spaced in the path parameter
 * t, path.h), and the cubic y x' integrated exactly by Simpson's rule.
 * gc_cycle_path_areas, the engine's own integral over the same points, must
 * agree too.
 *
 * GC_TEST_SVG_DIR=<folder> writes every drawn document there, to look at.
 *
 * Error cases: bad options name their field; a non-finite value in a result
 * refuses the drawing; caller text is escaped and forced to valid UTF-8.
 */
#include "check.h"
#include "gascycle/cycle.h"
#include "gascycle/diagram.h"
#include "gascycle/gas.h"
#include "gascycle/path.h"
#include "gascycle/brayton.h"
#include "gascycle/piston.h"

#include <libxml/parser.h>
#include <libxml/tree.h>
#include <stdlib.h>
#include <string.h>

/* ---- the cycles under test ---------------------------------------------- */

typedef struct tcase {
    const char *name;
    gc_cycle_result r;          /* evaluated */
} tcase;

#define N_CASES 12
static tcase cases[N_CASES];
static int n_cases;

static void add_piston(const char *name, const gc_piston_input *in)
{
    static gc_piston_result pr;
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_piston_evaluate(in, &pr, &err);
    if (rc != GC_OK)
        fprintf(stderr, "%s: evaluation failed: %s %s\n", name, err.field, err.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    CU_ASSERT_FATAL(n_cases < N_CASES);
    cases[n_cases].name = name;
    cases[n_cases++].r = pr.cycle;
}

/* Every piston preset of piston.h (the Test cell 3 engine's compression
 * ratio 10.5 among them) and two Brayton presets (flow frame, brayton.h),
 * with and without irreversibilities. */
static void build_cases(void)
{
    gc_error err;
    if (n_cases > 0)
        return;
    static gc_piston_input in;

    gc_piston_input_init(&in, GC_PISTON_OTTO);    /* ideal Otto, cold-air standard */
    CU_ASSERT_EQUAL_FATAL(gc_gas_init_cold(&in.gas, 1005.0, 1.4, &err), GC_OK);
    in.compression_ratio = 10.5;
    in.peak_temperature = 2000.0;
    add_piston("otto cold ideal", &in);

    gc_piston_input_init(&in, GC_PISTON_OTTO);    /* Otto, air, irreversible */
    in.compression_ratio = 10.5;
    in.peak_temperature = 2200.0;
    in.compression_efficiency = 0.9;
    in.expansion_efficiency = 0.92;
    add_piston("otto air actual", &in);

    gc_piston_input_init(&in, GC_PISTON_DIESEL);
    in.compression_ratio = 18.0;
    in.cutoff_ratio = 2.0;
    in.compression_efficiency = 0.88;
    add_piston("diesel air", &in);

    gc_piston_input_init(&in, GC_PISTON_DUAL);
    in.compression_ratio = 16.0;
    in.pressure_ratio = 1.5;
    in.peak_temperature = 2300.0;
    in.expansion_efficiency = 0.9;
    add_piston("dual air", &in);

    gc_piston_input_init(&in, GC_PISTON_ATKINSON);
    in.compression_ratio = 10.5;
    in.expansion_ratio = 14.0;
    add_piston("atkinson air", &in);

    gc_piston_input_init(&in, GC_PISTON_MILLER);
    in.compression_ratio = 12.0;
    in.effective_compression_ratio = 9.0;
    in.peak_temperature = 2200.0;
    add_piston("miller air", &in);

    gc_piston_input_init(&in, GC_PISTON_STIRLING);
    in.compression_ratio = 3.0;
    in.peak_temperature = 900.0;
    in.regenerator_effectiveness = 0.8;
    add_piston("stirling air", &in);

    gc_piston_input_init(&in, GC_PISTON_ERICSSON);
    in.pressure_ratio = 4.0;
    in.peak_temperature = 900.0;
    add_piston("ericsson air", &in);

    gc_piston_input_init(&in, GC_PISTON_LENOIR);
    in.peak_temperature = 1500.0;
    add_piston("lenoir air", &in);

    gc_piston_input_init(&in, GC_PISTON_CARNOT);
    in.compression_ratio = 80.0;              /* > the isentropic ratio 288 K -> 1200 K */
    in.peak_temperature = 1200.0;
    add_piston("carnot air", &in);

    /* Brayton presets (flow frame) */
    static gc_brayton_input bin;
    static gc_brayton_result br;
    gc_brayton_input_init(&bin);
    bin.flags = GC_BRAYTON_NO_OPTIMUM;
    bin.pressure_ratio = 14.0;
    bin.turbine_inlet_temperature = 1450.0;
    bin.compressor_efficiency = 0.86;
    bin.turbine_efficiency = 0.9;
    bin.combustor_pressure_loss = 0.04;
    int rc = gc_brayton_evaluate(&bin, &br, &err);
    if (rc == GC_OK) {
        cases[n_cases].name = "brayton simple";
        cases[n_cases++].r = br.cycle;
    } else {
        fprintf(stderr, "brayton simple: %s %s\n", err.field, err.message);
        CU_FAIL("brayton simple did not evaluate");
    }
    gc_brayton_input_init(&bin);
    bin.flags = GC_BRAYTON_NO_OPTIMUM;
    bin.pressure_ratio = 8.0;
    bin.turbine_inlet_temperature = 1350.0;
    bin.compressor_efficiency = 0.85;
    bin.turbine_efficiency = 0.88;
    bin.compressor_stages = 2;
    bin.regenerator_effectiveness = 0.8;
    bin.regenerator_air_pressure_loss = 0.02;
    bin.regenerator_gas_pressure_loss = 0.03;
    rc = gc_brayton_evaluate(&bin, &br, &err);
    if (rc == GC_OK) {
        cases[n_cases].name = "brayton regen ic";
        cases[n_cases++].r = br.cycle;
    } else {
        fprintf(stderr, "brayton regen ic: %s %s\n", err.field, err.message);
        CU_FAIL("brayton regen ic did not evaluate");
    }
}

/* ---- XML helpers ---------------------------------------------------------- */

static int has_class(xmlNode *n, const char *cls)
{
    xmlChar *v = xmlGetProp(n, (const xmlChar *)"class");
    int yes = v && strcmp((const char *)v, cls) == 0;
    xmlFree(v);
    return yes;
}

static xmlNode *find_class(xmlNode *n, const char *cls)
{
    for (; n; n = n->next) {
        if (n->type != XML_ELEMENT_NODE)
            continue;
        if (has_class(n, cls))
            return n;
        xmlNode *c = find_class(n->children, cls);
        if (c)
            return c;
    }
    return NULL;
}

static int count_class(xmlNode *n, const char *cls)
{
    int k = 0;
    for (; n; n = n->next) {
        if (n->type != XML_ELEMENT_NODE)
            continue;
        k += has_class(n, cls);
        k += count_class(n->children, cls);
    }
    return k;
}

static xmlNode *find_id(xmlNode *n, const char *id)
{
    for (; n; n = n->next) {
        if (n->type != XML_ELEMENT_NODE)
            continue;
        xmlChar *v = xmlGetProp(n, (const xmlChar *)"id");
        int yes = v && strcmp((const char *)v, id) == 0;
        xmlFree(v);
        if (yes)
            return n;
        xmlNode *c = find_id(n->children, id);
        if (c)
            return c;
    }
    return NULL;
}

static double num_prop(xmlNode *n, const char *name)
{
    xmlChar *v = xmlGetProp(n, (const xmlChar *)name);
    double d = v ? strtod((const char *)v, NULL) : NAN;
    xmlFree(v);
    return d;
}

typedef struct rect { double x, y, w, h; } rect;

static int inside(const rect *r, double x, double y)
{
    const double tol = 0.02;   /* px: coordinates are written with two decimals */
    return x >= r->x - tol && x <= r->x + r->w + tol && y >= r->y - tol && y <= r->y + r->h + tol;
}

/* Vertices of a path's d attribute ("Mx,y Lx,y ..."): count, all inside r. */
static int path_vertices(xmlNode *n, double *vx, double *vy, int max, const rect *r,
                         int *outside)
{
    xmlChar *d = xmlGetProp(n, (const xmlChar *)"d");
    int k = 0;
    *outside = 0;
    if (!d)
        return 0;
    const char *p = (const char *)d;
    while (*p) {
        if (*p == 'M' || *p == 'L' || *p == ' ') {
            p++;
            continue;
        }
        char *end;
        double x = strtod(p, &end);
        if (end == p || *end != ',')
            break;
        double y = strtod(end + 1, &end);
        p = end;
        if (!inside(r, x, y))
            (*outside)++;
        if (k < max) {
            vx[k] = x;
            vy[k] = y;
        }
        k++;
    }
    xmlFree(d);
    return k;
}

static char *node_text(xmlNode *n)
{
    xmlChar *t = xmlNodeGetContent(n);
    char *s = strdup(t ? (const char *)t : "");
    xmlFree(t);
    return s;
}

/* ---- SVG structure ---------------------------------------------------------- */

static void check_svg(const tcase *t, const gc_diagram_options *o)
{
    char *svg = NULL;
    size_t len = 0;
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_diagram_svg(&t->r, o, &svg, &len, &err);
    if (rc != GC_OK)
        fprintf(stderr, "%s %s: %s\n", t->name, gc_diagram_kind_name(o->kind), err.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    CU_ASSERT_PTR_NOT_NULL_FATAL(svg);
    CU_ASSERT_EQUAL(strlen(svg), len);
    const char *dump = getenv("GC_TEST_SVG_DIR");   /* for a human: write the pictures */
    if (dump) {
        char path[512];
        snprintf(path, sizeof path, "%s/%s-%s%s-%s-%d.svg", dump, t->name,
                 gc_diagram_kind_name(o->kind), o->log_y ? "log" : "",
                 gc_units_system_name(o->units), o->points);
        for (char *q = path + strlen(dump) + 1; *q; q++)
            if (*q == ' ')
                *q = '_';
        FILE *f = fopen(path, "w");
        if (f) {
            fwrite(svg, 1, len, f);
            fclose(f);
        }
    }
    CU_ASSERT_PTR_NULL(strstr(svg, "nan"));
    CU_ASSERT_PTR_NULL(strstr(svg, "inf"));
    CU_ASSERT_PTR_NULL(strstr(svg, "<script"));
    CU_ASSERT_PTR_NULL(strstr(svg, "<image"));
    CU_ASSERT_PTR_NULL(strstr(svg, "href"));

    xmlDoc *doc = xmlReadMemory(svg, (int)len, "diagram.svg", NULL, XML_PARSE_NONET | XML_PARSE_NOERROR);
    if (!doc)
        fprintf(stderr, "%s %s: not well-formed XML\n", t->name, gc_diagram_kind_name(o->kind));
    CU_ASSERT_PTR_NOT_NULL_FATAL(doc);
    xmlNode *root = xmlDocGetRootElement(doc);
    CU_ASSERT_STRING_EQUAL(root->name, "svg");
    CU_ASSERT_PTR_NOT_NULL(root->ns);
    if (root->ns)
        CU_ASSERT_STRING_EQUAL(root->ns->href, "http://www.w3.org/2000/svg");
    xmlChar *vb = xmlGetProp(root, (const xmlChar *)"viewBox");
    CU_ASSERT_PTR_NOT_NULL(vb);
    xmlFree(vb);
    CU_ASSERT(num_prop(root, "width") > 0.0 && num_prop(root, "height") > 0.0);

    /* one marker per distinct state */
    int want_states = gc_diagram_state_count(&t->r.actual);
    CU_ASSERT(want_states >= 3);
    int got_states = count_class(root->children, "gc-state");
    if (got_states != want_states)
        fprintf(stderr, "%s: %d state markers, expected %d\n", t->name, got_states, want_states);
    CU_ASSERT_EQUAL(got_states, want_states);

    /* axis titles in the chosen units */
    const char *xu, *yu;
    switch (o->kind) {
    case GC_DIAGRAM_PV:
        xu = gc_units_label(GC_Q_SPECIFIC_VOLUME, o->units);
        yu = gc_units_label(GC_Q_PRESSURE, o->units);
        break;
    case GC_DIAGRAM_HS:
        xu = gc_units_label(GC_Q_SPECIFIC_ENTROPY, o->units);
        yu = gc_units_label(GC_Q_SPECIFIC_ENERGY, o->units);
        break;
    default:
        xu = gc_units_label(GC_Q_SPECIFIC_ENTROPY, o->units);
        yu = gc_units_label(GC_Q_TEMPERATURE, o->units);
        break;
    }
    xmlNode *ax = find_id(root->children, "axis-x"), *ay = find_id(root->children, "axis-y");
    CU_ASSERT_PTR_NOT_NULL_FATAL(ax);
    CU_ASSERT_PTR_NOT_NULL_FATAL(ay);
    char *tx = node_text(ax), *ty = node_text(ay);
    char want[64];
    snprintf(want, sizeof want, "[%s]", xu);
    if (!strstr(tx, want))
        fprintf(stderr, "x axis title '%s' lacks '%s'\n", tx, want);
    CU_ASSERT_PTR_NOT_NULL(strstr(tx, want));
    snprintf(want, sizeof want, "[%s]", yu);
    if (!strstr(ty, want))
        fprintf(stderr, "y axis title '%s' lacks '%s'\n", ty, want);
    CU_ASSERT_PTR_NOT_NULL(strstr(ty, want));
    free(tx);
    free(ty);

    /* every point inside the plot area */
    xmlNode *pl = find_class(root->children, "gc-plot");
    CU_ASSERT_PTR_NOT_NULL_FATAL(pl);
    rect r = { num_prop(pl, "x"), num_prop(pl, "y"), num_prop(pl, "width"), num_prop(pl, "height") };
    CU_ASSERT(r.w > 0.5 * num_prop(root, "width") && r.h > 0.4 * num_prop(root, "height"));
    static double vx[GC_CYCLE_MAX_PROCESSES * GC_PATH_MAX_POINTS];
    static double vy[GC_CYCLE_MAX_PROCESSES * GC_PATH_MAX_POINTS];
    const int vmax = GC_CYCLE_MAX_PROCESSES * GC_PATH_MAX_POINTS;
    int outside = 0;
    xmlNode *pa = find_class(root->children, "gc-actual");
    CU_ASSERT_PTR_NOT_NULL_FATAL(pa);
    int nv = path_vertices(pa, vx, vy, vmax, &r, &outside);
    int points = o->points ? o->points : GC_PATH_DEFAULT_POINTS;
    CU_ASSERT(nv >= t->r.actual.n_processes * (points - 1));
    if (outside)
        fprintf(stderr, "%s: %d actual-path vertices outside the plot\n", t->name, outside);
    CU_ASSERT_EQUAL(outside, 0);
    /* state markers inside, each on a vertex of the actual path */
    int markers_checked = 0;
    for (int i = 1; i <= want_states; i++) {
        char id[32];
        snprintf(id, sizeof id, "state-%d", i);
        xmlNode *g = find_id(root->children, id);
        CU_ASSERT_PTR_NOT_NULL_FATAL(g);
        xmlNode *circle = g->children;
        while (circle && (circle->type != XML_ELEMENT_NODE ||
                          strcmp((const char *)circle->name, "circle") != 0))
            circle = circle->next;
        CU_ASSERT_PTR_NOT_NULL_FATAL(circle);
        double cx = num_prop(circle, "cx"), cy = num_prop(circle, "cy");
        CU_ASSERT(inside(&r, cx, cy));
        int on_path = 0;
        for (int k = 0; k < nv && k < vmax; k++)
            if (fabs(vx[k] - cx) <= 0.011 && fabs(vy[k] - cy) <= 0.011)
                on_path = 1;
        if (!on_path)
            fprintf(stderr, "%s: state %d at (%.2f, %.2f) is not on the drawn path\n", t->name, i,
                    cx, cy);
        CU_ASSERT(on_path);
        markers_checked++;
    }
    CU_ASSERT_EQUAL(markers_checked, want_states);
    xmlNode *pi = find_class(root->children, "gc-ideal");
    if ((o->overlays & GC_DIAGRAM_OVERLAY_IDEAL) && !t->r.ideal_is_actual) {
        CU_ASSERT_PTR_NOT_NULL(pi);
    }
    if (pi) {
        path_vertices(pi, vx, vy, vmax, &r, &outside);
        CU_ASSERT_EQUAL(outside, 0);
    }
    xmlNode *pc = find_class(root->children, "gc-carnot");
    CU_ASSERT_EQUAL(pc != NULL, (o->overlays & GC_DIAGRAM_OVERLAY_CARNOT) != 0);
    if (pc && o->kind != GC_DIAGRAM_PV) {   /* P-v: clipped by design (diagram.h) */
        path_vertices(pc, vx, vy, vmax, &r, &outside);
        CU_ASSERT_EQUAL(outside, 0);
    }
    CU_ASSERT_PTR_NOT_NULL(find_class(root->children, "gc-legend"));
    int captions = count_class(root->children, "gc-caption");
    if (num_prop(root, "height") >= 400.0)   /* a smaller picture may go without */
        CU_ASSERT(captions >= 2);
    xmlFreeDoc(doc);
    free(svg);
}

static void test_svg_all_cases(void)
{
    build_cases();
    CU_ASSERT_FATAL(n_cases == N_CASES);
    static const gc_diagram_kind kinds[] = { GC_DIAGRAM_TS, GC_DIAGRAM_PV, GC_DIAGRAM_HS };
    int docs = 0;
    for (int i = 0; i < n_cases; i++) {
        for (int k = 0; k < 3; k++) {
            for (int u = 0; u < 2; u++) {
                gc_diagram_options o;
                gc_diagram_options_default(&o);
                o.kind = kinds[k];
                o.units = u ? GC_UNITS_US : GC_UNITS_SI;
                check_svg(&cases[i], &o);
                docs++;
                if (o.kind == GC_DIAGRAM_PV) {
                    o.log_x = o.log_y = 1;
                    check_svg(&cases[i], &o);
                    o.log_x = 0;
                    o.points = 9;
                    o.overlays = 0;
                    check_svg(&cases[i], &o);
                    docs += 2;
                }
            }
        }
    }
    CU_ASSERT_EQUAL(docs, N_CASES * 10);
}

/* A larger picture with the most points still parses and stays inside. */
static void test_svg_max_points_and_size(void)
{
    build_cases();
    gc_diagram_options o;
    gc_diagram_options_default(&o);
    o.points = GC_PATH_MAX_POINTS;
    o.width_px = 1400;
    o.height_px = 900;
    o.kind = GC_DIAGRAM_PV;
    check_svg(&cases[1], &o);
    o.width_px = GC_DIAGRAM_MIN_SIZE;
    o.height_px = GC_DIAGRAM_MIN_SIZE;
    o.points = GC_PATH_MIN_POINTS;
    check_svg(&cases[2], &o);
}

/* ---- paths: areas over the drawn points -------------------------------- */

/* Loop integral of y dx over the points of every process (see the file
 * comment), mass-weighted. which: 0 T ds, 1 P dv, 2 -v dP. */
static double drawn_area(const gc_cycle_run *run, int points, int which)
{
    static gc_path_point p[GC_PATH_MAX_POINTS];
    double total = 0.0;
    for (int i = 0; i < run->n_processes; i++) {
        gc_error err;
        int rc = gc_cycle_path(run, i, points, p, &err);
        CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
        double a = 0.0;
        for (int k = 0; k + 2 < points; k += 2) {
            double x[3], y[3];
            for (int j = 0; j < 3; j++) {
                const gc_path_point *q = &p[k + j];
                switch (which) {
                case 0: x[j] = q->s_J_per_kgK; y[j] = q->T_K; break;
                case 1: x[j] = q->v_m3_per_kg; y[j] = q->P_Pa; break;
                default: x[j] = q->P_Pa; y[j] = -q->v_m3_per_kg; break;
                }
            }
            a += (y[0] * (-3.0 * x[0] + 4.0 * x[1] - x[2]) + 4.0 * y[1] * (x[2] - x[0]) +
                  y[2] * (x[0] - 4.0 * x[1] + 3.0 * x[2])) / 6.0;
        }
        total += run->processes[i].mass_ratio * a;
    }
    return total;
}

static void check_run_areas(const char *name, const gc_cycle_run *run, int ideal)
{
    const int points = GC_PATH_DEFAULT_POINTS;   /* what the picture uses by default */
    CU_ASSERT_EQUAL_FATAL(points % 2, 1);
    const gc_cycle_summary *sm = &run->summary;
    double want_ts = sm->net_work + sm->dissipated;
    double want_pv = run->checks.area_expected_pv;   /* net + dissipated (+ m dke, flow) */
    if (ideal) {
        /* the ideal counterpart dissipates nothing: its areas are the net work */
        CHECK_ABS(sm->dissipated, 0.0, 1e-9 * sm->heat_in, "ideal cycle: no dissipation");
        want_ts = sm->net_work;
    }
    CHECK_REL(run->checks.area_expected_ts, want_ts, 1e-9, "engine's expected T-s area");
    double ts = drawn_area(run, points, 0);
    double pv = drawn_area(run, points, run->frame == GC_FRAME_CLOSED ? 1 : 2);
    fprintf(stderr, "  %-18s %-6s T-s %.6g J/kg (expected %.6g), P-v %.6g (expected %.6g)\n",
            name, ideal ? "ideal" : "actual", ts, want_ts, pv, want_pv);
    CHECK_REL(ts, want_ts, 1e-3, "area balance, T ds over the drawn points");
    CHECK_REL(pv, want_pv, 1e-3, "area balance, P dv / -v dP over the drawn points");
    double epv = 0.0, ets = 0.0;
    gc_error err;
    CU_ASSERT_EQUAL(gc_cycle_path_areas(run, points, &epv, &ets, &err), GC_OK);
    CHECK_REL(ets, want_ts, 1e-3, "engine's Simpson over the drawn points, T-s");
    CHECK_REL(epv, want_pv, 1e-3, "engine's Simpson over the drawn points, P-v");
}

static void test_path_areas(void)
{
    build_cases();
    for (int i = 0; i < n_cases; i++) {
        const gc_cycle_result *r = &cases[i].r;
        if (!r->actual.checks.areas_applicable)
            continue;
        check_run_areas(cases[i].name, &r->actual, r->ideal_is_actual);
        if (r->has_ideal)
            check_run_areas(cases[i].name, &r->ideal, 1);
    }
}

/* The drawn curves end exactly on the states. */
static void test_path_ends_on_states(void)
{
    build_cases();
    static gc_path_point p[GC_PATH_DEFAULT_POINTS];
    for (int i = 0; i < n_cases; i++) {
        const gc_cycle_run *run = &cases[i].r.actual;
        for (int k = 0; k < run->n_processes; k++) {
            CU_ASSERT_EQUAL_FATAL(gc_cycle_path(run, k, GC_PATH_DEFAULT_POINTS, p, NULL), GC_OK);
            const gc_cycle_state *a = &run->states[run->processes[k].from];
            const gc_cycle_state *b = &run->states[run->processes[k].to];
            CHECK_REL(p[0].T_K, a->T_K, 1e-9, "path starts on its state");
            CHECK_REL(p[0].P_Pa, a->P_Pa, 1e-9, "path starts on its state");
            CHECK_REL(p[GC_PATH_DEFAULT_POINTS - 1].T_K, b->T_K, 1e-9, "path ends on its state");
            CHECK_REL(p[GC_PATH_DEFAULT_POINTS - 1].P_Pa, b->P_Pa, 1e-9, "path ends on its state");
        }
    }
}

/* ---- options and errors -------------------------------------------------- */

static void expect_error(const gc_cycle_result *r, const gc_diagram_options *o, int code,
                         const char *field)
{
    char *svg = (char *)1;
    size_t len = 99;
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_diagram_svg(r, o, &svg, &len, &err);
    CU_ASSERT_EQUAL(rc, code);
    CU_ASSERT_PTR_NULL(svg);
    CU_ASSERT_EQUAL(len, 0);
    CU_ASSERT(err.message[0] != '\0');
    if (field)
        CU_ASSERT_STRING_EQUAL(err.field, field);
}

static void test_option_errors(void)
{
    build_cases();
    const gc_cycle_result *r = &cases[1].r;
    gc_diagram_options o;
    gc_diagram_options_default(&o);
    o.points = 1;
    expect_error(r, &o, GC_ERR_INVALID, "/points");
    o.points = GC_PATH_MAX_POINTS + 1;
    expect_error(r, &o, GC_ERR_INVALID, "/points");
    o.points = -3;
    expect_error(r, &o, GC_ERR_INVALID, "/points");
    gc_diagram_options_default(&o);
    o.log_y = 1;                               /* log scale on T-s */
    expect_error(r, &o, GC_ERR_INVALID, "/scale");
    gc_diagram_options_default(&o);
    o.kind = (gc_diagram_kind)7;
    expect_error(r, &o, GC_ERR_INVALID, "/diagram");
    gc_diagram_options_default(&o);
    o.width_px = 10;
    expect_error(r, &o, GC_ERR_INVALID, "/width");
    o.width_px = 0;
    o.height_px = GC_DIAGRAM_MAX_SIZE + 1;
    expect_error(r, &o, GC_ERR_INVALID, "/height");
    gc_diagram_options_default(&o);
    expect_error(NULL, &o, GC_ERR_INVALID, NULL);

    gc_diagram_kind k;
    CU_ASSERT_EQUAL(gc_diagram_kind_parse("Ts", &k), GC_OK);
    CU_ASSERT_EQUAL(k, GC_DIAGRAM_TS);
    CU_ASSERT_EQUAL(gc_diagram_kind_parse("pv", &k), GC_OK);
    CU_ASSERT_EQUAL(k, GC_DIAGRAM_PV);
    CU_ASSERT_EQUAL(gc_diagram_kind_parse("h-s", &k), GC_OK);
    CU_ASSERT_EQUAL(k, GC_DIAGRAM_HS);
    CU_ASSERT_EQUAL(gc_diagram_kind_parse("Tv", &k), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(gc_diagram_kind_parse(NULL, &k), GC_ERR_INVALID);
    CU_ASSERT_STRING_EQUAL(gc_diagram_kind_name(GC_DIAGRAM_HS), "hs");
}


/* A result with a non-finite number is refused, never drawn with "nan". */
static void test_nonfinite_refused(void)
{
    build_cases();
    static gc_cycle_result bad;
    gc_diagram_options o;
    gc_diagram_options_default(&o);

    bad = cases[1].r;
    bad.actual.summary.thermal_efficiency = NAN;
    expect_error(&bad, &o, GC_ERR_INVALID, NULL);

    bad = cases[1].r;
    bad.carnot_efficiency = INFINITY;
    expect_error(&bad, &o, GC_ERR_INVALID, NULL);

    bad = cases[1].r;
    bad.actual.states[1].s_J_per_kgK = NAN;     /* a state marker */
    expect_error(&bad, &o, GC_ERR_INVALID, NULL);

    bad = cases[1].r;
    bad.actual.n_processes = 0;
    expect_error(&bad, &o, GC_ERR_INVALID, NULL);

    o.has_figures = 1;                          /* a caller's caption figure */
    o.heat_in = 1e6;
    o.thermal_efficiency = 0.4;
    o.ideal_thermal_efficiency = NAN;
    expect_error(&cases[1].r, &o, GC_ERR_INVALID, NULL);
}

/* The caption quotes the caller's figures when given. */
static void test_caption_figures(void)
{
    build_cases();
    gc_diagram_options o;
    gc_diagram_options_default(&o);
    o.has_figures = 1;
    o.heat_in = 1234.2e3;
    o.thermal_efficiency = 0.3456;
    o.ideal_thermal_efficiency = 0.4567;
    char *svg = NULL;
    size_t len = 0;
    CU_ASSERT_EQUAL_FATAL(gc_diagram_svg(&cases[1].r, &o, &svg, &len, NULL), GC_OK);
    CU_ASSERT_PTR_NOT_NULL(strstr(svg, "Thermal efficiency 34.6 %"));
    CU_ASSERT_PTR_NOT_NULL(strstr(svg, "heat added 1234 kJ/kg"));
    CU_ASSERT_PTR_NOT_NULL(strstr(svg, "Ideal counterpart 45.7 %"));
    free(svg);
}

/* Caller text is escaped; invalid UTF-8 becomes '?'; the document parses. */
static void test_title_escaped(void)
{
    build_cases();
    gc_diagram_options o;
    gc_diagram_options_default(&o);
    o.title = "Test cell 3 <engine> & \"friends\" \xff\xfe caf\xc3\xa9";
    char *svg = NULL;
    size_t len = 0;
    CU_ASSERT_EQUAL_FATAL(gc_diagram_svg(&cases[1].r, &o, &svg, &len, NULL), GC_OK);
    xmlDoc *doc = xmlReadMemory(svg, (int)len, "t.svg", NULL, XML_PARSE_NONET | XML_PARSE_NOERROR);
    CU_ASSERT_PTR_NOT_NULL_FATAL(doc);
    xmlNode *t = find_class(xmlDocGetRootElement(doc)->children, "gc-title");
    CU_ASSERT_PTR_NOT_NULL_FATAL(t);
    char *text = node_text(t);
    CU_ASSERT_STRING_EQUAL(text, "Test cell 3 <engine> & \"friends\" ?? caf\xc3\xa9");
    free(text);
    xmlFreeDoc(doc);
    free(svg);
}


/* One heat-input definition (issue 10): the caption of a fuel-fired Brayton
 * cycle at -23.4 degC quotes the efficiency and heat added the route's JSON
 * quotes (far x LHV, brayton.h), with no caller figures: before, the caption
 * used the heating value at the site temperature (41.0 % against 41.1 %).
 * On h-s (sensible enthalpy, cycle.h) the turbine inlet lies above the
 * compressor exit, as heat release raises h. */
static void test_caption_fuel_brayton(void)
{
    static gc_brayton_result br;
    gc_brayton_input in;
    gc_brayton_input_init(&in);
    in.pressure_ratio = 15.5;
    in.turbine_inlet_temperature = 1480.0;
    in.compressor_efficiency = 0.87;
    in.turbine_efficiency = 0.9;
    in.heat_mode = GC_BRAYTON_FUEL;
    in.has_fuel = 1;
    CU_ASSERT_EQUAL_FATAL(gc_fuel_init_named(&in.fuel, "methane", NULL), GC_OK);
    in.site.has_temperature = 1;
    in.site.T_K = 273.15 - 23.4;
    in.flags = GC_BRAYTON_NO_OPTIMUM;
    CU_ASSERT_EQUAL_FATAL(gc_brayton_evaluate(&in, &br, NULL), GC_OK);
    gc_diagram_options o;
    gc_diagram_options_default(&o);
    o.kind = GC_DIAGRAM_HS;
    char *svg = NULL;
    size_t len = 0;
    CU_ASSERT_EQUAL_FATAL(gc_diagram_svg(&br.cycle, &o, &svg, &len, NULL), GC_OK);
    char want[64];
    snprintf(want, sizeof want, "Thermal efficiency %.1f %%", br.thermal_efficiency * 100.0);
    CU_ASSERT_PTR_NOT_NULL(strstr(svg, want));
    snprintf(want, sizeof want, "heat added %.0f kJ/kg", br.heat_in * 1e-3);
    CU_ASSERT_PTR_NOT_NULL(strstr(svg, want));
    /* markers: state ids are engine state index + 1 */
    xmlDoc *doc = xmlReadMemory(svg, (int)len, "b.svg", NULL, XML_PARSE_NONET | XML_PARSE_NOERROR);
    CU_ASSERT_PTR_NOT_NULL_FATAL(doc);
    double cy[2];
    int idx[2] = { br.stations.compressor_exit, br.stations.turbine_inlet };
    for (int k = 0; k < 2; k++) {
        char id[32];
        snprintf(id, sizeof id, "state-%d", idx[k] + 1);
        xmlNode *g = find_id(xmlDocGetRootElement(doc)->children, id);
        CU_ASSERT_PTR_NOT_NULL_FATAL(g);
        xmlNode *c = g->children;
        while (c && (c->type != XML_ELEMENT_NODE || strcmp((const char *)c->name, "circle") != 0))
            c = c->next;
        CU_ASSERT_PTR_NOT_NULL_FATAL(c);
        cy[k] = num_prop(c, "cy");
    }
    CU_ASSERT(cy[1] < cy[0]); /* SVG y grows downward: the turbine inlet is higher */
    xmlFreeDoc(doc);
    free(svg);
}

int main(void)
{
    LIBXML_TEST_VERSION
    static const gc_test_case tests[] = {
        { "SVG of every case, kind and unit system", test_svg_all_cases },
        { "most points, largest and smallest size", test_svg_max_points_and_size },
        { "areas over the drawn points", test_path_areas },
        { "drawn curves end on the states", test_path_ends_on_states },
        { "option errors", test_option_errors },
        { "non-finite results refused", test_nonfinite_refused },
        { "title escaped", test_title_escaped },
        { "caption figures from the caller", test_caption_figures },
        { "fuel Brayton: caption = JSON figures, h-s order", test_caption_fuel_brayton },
        { NULL, NULL },
    };
    int rc = gc_run_suite("diagram", tests);
    xmlCleanupParser();
    return rc;
}
