/*
 * test_chart.c — the generic SVG chart renderer (include/gascycle/chart.h).
 *
 * Every document is parsed with a real XML parser (libxml2, no network) and
 * checked as a client would read it:
 *  - structure: SVG namespace, class gc-chart, size and viewBox, one
 *    gc-series-N group per series with its kind's class, a legend when a
 *    series has a name, one gc-caption per caption; no script, no external
 *    reference, no "nan"/"inf", every numeric attribute plain digits;
 *  - clipping: every vertex of every line and fill, every marker centre and
 *    every bar lies in the gc-plot rectangle (fixed ranges narrower than the
 *    data included);
 *  - axes: the tick marks and their labels define the axis mapping (a
 *    least-squares line through (value, px) of every labelled tick must fit
 *    each of them within 0.05 px: ticks where their labels say); through that
 *    mapping every data point must land inside the plot, on its own path
 *    vertex, so the range holds the data and the drawing is where the labels
 *    say; linear tick labels never in exponent notation, log axes labelled
 *    at decades;
 *  - labels: boxes from the label's position, its text and the stated
 *    estimate (GC_CHART_CHAR_EM per character, GC_CHART_ASCENT_EM /
 *    GC_CHART_DESCENT_EM of the font size about the baseline) never overlap
 *    each other or another label's marker, for close points: the states of a
 *    regenerative Brayton cycle from the engine (states 1/2 and 5/6 nearly
 *    coincide on its T-s chart) and synthetic clusters of up to 8 points on
 *    one spot;
 *  - refusals: NaN or infinity in any number, a non-positive value on a log
 *    axis, every limit, inconsistent series, sizes;
 *  - escaping of hostile text ("<script>", quotes, ampersands, control
 *    characters, invalid UTF-8 -> '?');
 *  - number formatting: a table of expected strings (common practice of
 *    engineering documents: thin-space thousands grouping, no exponent
 *    notation, no binary noise); equal bytes on two renderings.
 *
 * An example of each chart kind (correction curves, uncertainty budget, P-V
 * and log P - log V of a pressure trace, heat release with mass fraction
 * burned, per-cycle IMEP scatter, heat-recovery T-Q, steam T-s with the
 * saturation dome, state labels, vertical bars, step line) is written to
 * <build>/chart-examples/ (next to the test binary's build tree; set
 * GC_CHART_EXAMPLES to another folder, or to "" for none). Their data are
 * invented for the pictures (Quillmere unit 1, Test cell 3), except the
 * saturation dome (python3-iapws, IF97) and the Brayton states (the engine):
 * they are pictures, not checks.
 */
#include "check.h"
#include "gascycle/brayton.h"
#include "gascycle/chart.h"

#include <errno.h>
#include <libxml/parser.h>
#include <libxml/tree.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

static char examples_dir[512];

/* ---- XML helpers ---------------------------------------------------------- */

static int class_has(xmlNode *n, const char *cls)
{
    xmlChar *v = xmlGetProp(n, (const xmlChar *)"class");
    int yes = 0;
    if (v) {
        size_t k = strlen(cls);
        for (const char *p = (const char *)v; (p = strstr(p, cls)) != NULL; p += k) {
            int start = p == (const char *)v || p[-1] == ' ';
            int end = p[k] == '\0' || p[k] == ' ';
            if (start && end) {
                yes = 1;
                break;
            }
        }
    }
    xmlFree(v);
    return yes;
}

static int is_elem(xmlNode *n, const char *name)
{
    return n && n->type == XML_ELEMENT_NODE && strcmp((const char *)n->name, name) == 0;
}

typedef int (*visit_fn)(xmlNode *n, void *ctx);

/* Calls fn on every element under n (depth first); returns the sum. */
static int walk(xmlNode *n, visit_fn fn, void *ctx)
{
    int k = 0;
    for (; n; n = n->next) {
        if (n->type != XML_ELEMENT_NODE)
            continue;
        k += fn(n, ctx);
        k += walk(n->children, fn, ctx);
    }
    return k;
}

static xmlNode *find_class(xmlNode *n, const char *cls)
{
    for (; n; n = n->next) {
        if (n->type != XML_ELEMENT_NODE)
            continue;
        if (class_has(n, cls))
            return n;
        xmlNode *c = find_class(n->children, cls);
        if (c)
            return c;
    }
    return NULL;
}

static int count_cb(xmlNode *n, void *ctx)
{
    return class_has(n, *(const char **)ctx);
}

static int count_class(xmlNode *n, const char *cls)
{
    return walk(n, count_cb, &cls);
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

static char *node_text(xmlNode *n)
{
    xmlChar *t = xmlNodeGetContent(n);
    char *s = strdup(t ? (const char *)t : "");
    xmlFree(t);
    return s;
}

/* Characters (code points) of UTF-8 text. */
static int utf8_chars(const char *s)
{
    int n = 0;
    for (; *s; s++)
        n += ((unsigned char)*s & 0xC0) != 0x80;
    return n;
}

typedef struct rect {
    double x, y, w, h;
} rect;

static int inside(const rect *r, double x, double y, double tol)
{
    return x >= r->x - tol && x <= r->x + r->w + tol && y >= r->y - tol && y <= r->y + r->h + tol;
}

/* ---- rendering and the checks every document gets ------------------------- */

typedef struct doc {
    char *svg;
    size_t len;
    xmlDoc *xml;
    xmlNode *root;
    rect plot;
} doc;

static void doc_free(doc *d)
{
    if (d->xml)
        xmlFreeDoc(d->xml);
    free(d->svg);
    memset(d, 0, sizeof *d);
}

static void write_example(const char *name, const doc *d)
{
    if (!examples_dir[0] || !name)
        return;
    char path[700];
    snprintf(path, sizeof path, "%s/%s.svg", examples_dir, name);
    FILE *f = fopen(path, "w");
    if (!f)
        return;
    fwrite(d->svg, 1, d->len, f);
    fclose(f);
}

/* Numeric attributes: plain decimal numbers only (no exponent, nan, inf). */
static const char *const numeric_attrs[] = {
    "x", "y", "cx", "cy", "r", "width", "height", "x1", "y1", "x2", "y2", "font-size", NULL,
};

static int attr_cb(xmlNode *n, void *ctx)
{
    (void)ctx;
    int bad = 0;
    for (const char *const *a = numeric_attrs; *a; a++) {
        xmlChar *v = xmlGetProp(n, (const xmlChar *)*a);
        if (!v)
            continue;
        const char *s = (const char *)v;
        if (strcmp(*a, "font-size") == 0 && strchr(s, '%'))   /* tspan superscripts: 75% */
            s = "0";
        if (!*s || strspn(s, "-0123456789.") != strlen(s)) {
            fprintf(stderr, "element %s: %s=\"%s\" is not a plain number\n", n->name, *a, s);
            bad++;
        }
        xmlFree(v);
    }
    xmlChar *d = xmlGetProp(n, (const xmlChar *)"d");
    if (d && strspn((const char *)d, "MLZ -0123456789.,") != strlen((const char *)d)) {
        fprintf(stderr, "path d=\"%.60s...\" holds more than coordinates\n", d);
        bad++;
    }
    xmlFree(d);
    return bad;
}

/* Vertices of a path's d ("Mx,y Lx,y ... Z") into vx/vy (up to max); returns the count. */
static int path_vertices(xmlNode *n, double *vx, double *vy, int max)
{
    xmlChar *d = xmlGetProp(n, (const xmlChar *)"d");
    int k = 0;
    if (!d)
        return 0;
    const char *p = (const char *)d;
    while (*p) {
        if (*p == 'M' || *p == 'L' || *p == 'Z' || *p == ' ') {
            p++;
            continue;
        }
        char *end;
        double x = strtod(p, &end);
        if (end == p || *end != ',')
            break;
        double y = strtod(end + 1, &end);
        p = end;
        if (k < max) {
            vx[k] = x;
            vy[k] = y;
        }
        k++;
    }
    xmlFree(d);
    return k;
}

typedef struct clipctx {
    rect plot;
    int outside;
    int in_series;
} clipctx;

static void note_outside(clipctx *c, const char *what, double x, double y)
{
    if (c->outside < 5)
        fprintf(stderr, "%s at (%.2f, %.2f) outside the plot (%.2f %.2f %.2f %.2f)\n", what, x, y,
                c->plot.x, c->plot.y, c->plot.w, c->plot.h);
    c->outside++;
}

/* Every drawn series element inside the plot (tolerance: 2-decimal px). */
static void check_series_inside(xmlNode *g, clipctx *c)
{
    static double vx[200000], vy[200000];
    for (xmlNode *n = g; n; n = n->next) {
        if (n->type != XML_ELEMENT_NODE)
            continue;
        if ((class_has(n, "gc-line") || class_has(n, "gc-fill")) && is_elem(n, "path")) {
            int k = path_vertices(n, vx, vy, 200000);
            for (int i = 0; i < k && i < 200000; i++)
                if (!inside(&c->plot, vx[i], vy[i], 0.011))
                    note_outside(c, "path vertex", vx[i], vy[i]);
        } else if (is_elem(n, "circle")) {
            double x = num_prop(n, "cx"), y = num_prop(n, "cy");
            if (!inside(&c->plot, x, y, 0.011))
                note_outside(c, "marker", x, y);
        } else if (is_elem(n, "rect")) {
            double x = num_prop(n, "x"), y = num_prop(n, "y");
            double w = num_prop(n, "width"), h = num_prop(n, "height");
            if (class_has(n, "gc-bar")) {
                if (!inside(&c->plot, x, y, 0.011) || !inside(&c->plot, x + w, y + h, 0.011))
                    note_outside(c, "bar", x, y);
            } else if (!inside(&c->plot, x + w / 2, y + h / 2, 0.011)) {
                note_outside(c, "square marker", x, y);
            }
        } else if (is_elem(n, "path") && n->parent && class_has(n->parent, "gc-marks")) {
            int k = path_vertices(n, vx, vy, 8);
            double mx = 0.0, my = 0.0;
            for (int i = 0; i < k && i < 8; i++) {
                mx += vx[i] / k;
                my += vy[i] / k;
            }
            if (!inside(&c->plot, mx, my, 4.0))   /* a shape's centroid is near its point */
                note_outside(c, "marker shape", mx, my);
        }
        check_series_inside(n->children, c);
    }
}

static const char *const kind_names[] = { "gc-kind-line", "gc-kind-markers", "gc-kind-step",
                                          "gc-kind-vbars", "gc-kind-hbars", "gc-kind-area" };

/* Renders c, writes the example, parses, and runs the checks every chart gets. */
static int render_doc(const gc_chart *c, const char *example, doc *d)
{
    memset(d, 0, sizeof *d);
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_chart_svg(c, &d->svg, &d->len, &err);
    if (rc != GC_OK) {
        fprintf(stderr, "%s: refused: %s\n", example ? example : "chart", err.message);
        CU_FAIL("chart refused");
        return -1;
    }
    CU_ASSERT_EQUAL(strlen(d->svg), d->len);
    write_example(example, d);
    CU_ASSERT_PTR_NULL(strstr(d->svg, "nan"));
    CU_ASSERT_PTR_NULL(strstr(d->svg, "inf"));
    CU_ASSERT_PTR_NULL(strstr(d->svg, "<script"));
    CU_ASSERT_PTR_NULL(strstr(d->svg, "href"));
    CU_ASSERT_PTR_NULL(strstr(d->svg, "<image"));
    CU_ASSERT_PTR_NULL(strstr(d->svg, "url(http"));
    d->xml = xmlReadMemory(d->svg, (int)d->len, "chart.svg", NULL, XML_PARSE_NONET | XML_PARSE_NOERROR);
    CU_ASSERT_PTR_NOT_NULL(d->xml);
    if (!d->xml)
        return -1;
    d->root = xmlDocGetRootElement(d->xml);
    CU_ASSERT_STRING_EQUAL(d->root->name, "svg");
    CU_ASSERT(d->root->ns && strcmp((const char *)d->root->ns->href, "http://www.w3.org/2000/svg") == 0);
    CU_ASSERT(class_has(d->root, "gc-chart"));
    int W = c->width_px ? c->width_px : GC_CHART_DEFAULT_WIDTH;
    int H = c->height_px ? c->height_px : GC_CHART_DEFAULT_HEIGHT;
    CU_ASSERT_EQUAL((int)num_prop(d->root, "width"), W);
    CU_ASSERT_EQUAL((int)num_prop(d->root, "height"), H);
    xmlChar *vb = xmlGetProp(d->root, (const xmlChar *)"viewBox");
    char want[64];
    snprintf(want, sizeof want, "0 0 %d %d", W, H);
    CU_ASSERT(vb && strcmp((const char *)vb, want) == 0);
    xmlFree(vb);
    CU_ASSERT_EQUAL(walk(d->root, attr_cb, NULL), 0);

    xmlNode *pl = find_class(d->root->children, "gc-plot");
    CU_ASSERT_PTR_NOT_NULL(pl);
    if (!pl)
        return -1;
    d->plot = (rect){ num_prop(pl, "x"), num_prop(pl, "y"), num_prop(pl, "width"),
                      num_prop(pl, "height") };
    CU_ASSERT(d->plot.w > 0.4 * W && d->plot.h > 0.3 * H);

    int named = 0;
    for (int i = 0; i < c->n_series; i++) {
        char id[32], cls[32];
        snprintf(id, sizeof id, "series-%d", i + 1);
        snprintf(cls, sizeof cls, "gc-series-%d", i + 1);
        xmlNode *g = find_id(d->root->children, id);
        CU_ASSERT_PTR_NOT_NULL(g);
        if (g) {
            CU_ASSERT(class_has(g, "gc-series") && class_has(g, cls) &&
                      class_has(g, kind_names[c->series[i].kind]));
        }
        named += c->series[i].name && *c->series[i].name;
    }
    xmlNode *legend = find_class(d->root->children, "gc-legend");
    CU_ASSERT_EQUAL(legend != NULL, named > 0);
    if (legend)
        CU_ASSERT_EQUAL(count_class(legend->children, "gc-legend-item"), named);
    CU_ASSERT_EQUAL(count_class(d->root->children, "gc-caption"), c->n_captions);

    clipctx cc = { d->plot, 0, 0 };
    for (xmlNode *n = d->root->children; n; n = n->next)
        if (n->type == XML_ELEMENT_NODE && class_has(n, "gc-series"))
            check_series_inside(n->children, &cc);
    CU_ASSERT_EQUAL(cc.outside, 0);
    return 0;
}

/* ---- axes read back from the document --------------------------------------- */

/* Value of a tick label: "12.5", "10 000" (thin spaces), "10" + <tspan>e</tspan>,
 * "2.5×10" + <tspan>e</tspan>. Sets *expo when written with a power of ten. */
static double tick_value(xmlNode *t, int *expo)
{
    char head[96] = "";
    double e = NAN;
    *expo = 0;
    for (xmlNode *k = t->children; k; k = k->next) {
        if (k->type == XML_TEXT_NODE) {
            strncat(head, (const char *)k->content, sizeof head - strlen(head) - 1);
        } else if (is_elem(k, "tspan")) {
            char *s = node_text(k);
            e = strtod(s, NULL);
            free(s);
            *expo = 1;
        }
    }
    char clean[96];
    size_t n = 0;
    for (const char *p = head; *p && n + 1 < sizeof clean; p++) {
        if (strncmp(p, "\xe2\x80\x89", 3) == 0) {   /* thin space */
            p += 2;
            continue;
        }
        clean[n++] = *p;
    }
    clean[n] = '\0';
    if (!*expo)
        return strtod(clean, NULL);
    char *times = strstr(clean, "\xc3\x97");   /* "m×10" */
    double m = times ? strtod(clean, NULL) : 1.0;
    return m * pow(10.0, e);
}

typedef struct axismap {
    double a, b;                /* px = a + b * display value */
    int n;                      /* labelled ticks */
    int log;
} axismap;

/* The mapping of axis id ("x", "y", "y2") from its labelled ticks: each label
 * paired with its tick mark (the line before it). Checks the fit. */
static int axis_map(const doc *d, const char *id, int log_axis, axismap *m)
{
    char gid[32];
    snprintf(gid, sizeof gid, "ticks-%s", id);
    xmlNode *g = find_id(d->root->children, gid);
    CU_ASSERT_PTR_NOT_NULL(g);
    if (!g)
        return -1;
    int horizontal = strcmp(id, "x") == 0;
    double vs[256], ps[256];
    int n = 0;
    xmlNode *last_line = NULL;
    for (xmlNode *k = g->children; k; k = k->next) {
        if (is_elem(k, "line"))
            last_line = k;
        if (!is_elem(k, "text") || !last_line || n >= 256)
            continue;
        int expo;
        double v = tick_value(k, &expo);
        char *s = node_text(k);
        if (!log_axis && (strchr(s, 'e') || strchr(s, 'E') || expo)) {
            fprintf(stderr, "linear tick label '%s' in exponent notation\n", s);
            CU_FAIL("exponent notation on a linear axis");
        }
        free(s);
        ps[n] = num_prop(last_line, horizontal ? "x1" : "y1");
        vs[n] = log_axis ? log10(v) : v;
        n++;
    }
    CU_ASSERT(n >= 2);
    if (n < 2)
        return -1;
    double sx = 0, sy = 0, sxx = 0, sxy = 0;
    for (int i = 0; i < n; i++) {
        sx += vs[i];
        sy += ps[i];
        sxx += vs[i] * vs[i];
        sxy += vs[i] * ps[i];
    }
    m->b = (n * sxy - sx * sy) / (n * sxx - sx * sx);
    m->a = (sy - m->b * sx) / n;
    m->n = n;
    m->log = log_axis;
    for (int i = 0; i < n; i++) {
        double r = fabs(m->a + m->b * vs[i] - ps[i]);
        if (r > 0.05)
            fprintf(stderr, "axis %s: tick %g at %.2f px, fit says %.2f\n", id, vs[i], ps[i],
                    m->a + m->b * vs[i]);
        CU_ASSERT(r <= 0.05);
    }
    return 0;
}

static double map_px(const axismap *m, double v)
{
    return m->a + m->b * (m->log ? log10(v) : v);
}

/* Every point of line series i is inside the plot and is vertex k of its path. */
static void check_line_on_axes(const doc *d, const gc_chart_series *s, int i, const axismap *mx,
                               const axismap *my)
{
    char id[32];
    snprintf(id, sizeof id, "series-%d", i + 1);
    xmlNode *g = find_id(d->root->children, id);
    CU_ASSERT_PTR_NOT_NULL_FATAL(g);
    xmlNode *p = find_class(g->children, "gc-line");
    CU_ASSERT_PTR_NOT_NULL_FATAL(p);
    static double vx[GC_CHART_MAX_POINTS * 2], vy[GC_CHART_MAX_POINTS * 2];
    int k = path_vertices(p, vx, vy, GC_CHART_MAX_POINTS * 2);
    CU_ASSERT_EQUAL(k, s->n);   /* nothing clipped: the range holds the data */
    int off = 0;
    for (int j = 0; j < s->n && j < k; j++) {
        double X = map_px(mx, s->x[j]), Y = map_px(my, s->y[j]);
        if (!inside(&d->plot, X, Y, 0.05))
            off++;
        double e = fmax(fabs(X - vx[j]), fabs(Y - vy[j]));
        if (e > 0.06) {
            if (off < 3)
                fprintf(stderr, "series %d point %d: drawn (%.2f, %.2f), axes say (%.2f, %.2f)\n",
                        i + 1, j + 1, vx[j], vy[j], X, Y);
            off++;
        }
    }
    CU_ASSERT_EQUAL(off, 0);
}

/* ---- label boxes ------------------------------------------------------------- */

typedef struct lbox {
    double x0, y0, x1, y1;
} lbox;

static int overlap(const lbox *a, const lbox *b, double tol)
{
    return a->x0 < b->x1 - tol && b->x0 < a->x1 - tol && a->y0 < b->y1 - tol && b->y0 < a->y1 - tol;
}

/* Reads every point label: its text box by the stated estimate and its marker box. */
static int label_boxes(const doc *d, lbox *text, lbox *mark, int *has_mark, int max)
{
    xmlNode *g = find_class(d->root->children, "gc-labels");
    if (!g)
        return 0;
    double fs = num_prop(g, "font-size");
    CU_ASSERT(fs > 0.0);
    int n = 0;
    for (xmlNode *l = g->children; l && n < max; l = l->next) {
        if (!is_elem(l, "g") || !class_has(l, "gc-label"))
            continue;
        has_mark[n] = 0;
        for (xmlNode *k = l->children; k; k = k->next) {
            if (is_elem(k, "circle")) {
                double cx = num_prop(k, "cx"), cy = num_prop(k, "cy"), r = num_prop(k, "r");
                mark[n] = (lbox){ cx - r, cy - r, cx + r, cy + r };
                has_mark[n] = 1;
            } else if (is_elem(k, "text")) {
                xmlChar *anchor = xmlGetProp(k, (const xmlChar *)"text-anchor");
                CU_ASSERT(anchor && strcmp((const char *)anchor, "middle") == 0);
                xmlFree(anchor);
                char *s = node_text(k);
                double w = GC_CHART_CHAR_EM * fs * utf8_chars(s);
                double x = num_prop(k, "x"), y = num_prop(k, "y");
                text[n] = (lbox){ x - w / 2, y - GC_CHART_ASCENT_EM * fs, x + w / 2,
                                  y + GC_CHART_DESCENT_EM * fs };
                free(s);
            }
        }
        n++;
    }
    return n;
}

/* No label box overlaps another label box or another label's marker; all in the plot. */
static void check_labels_apart(const doc *d, int want)
{
    lbox text[GC_CHART_MAX_LABELS], mark[GC_CHART_MAX_LABELS];
    int has_mark[GC_CHART_MAX_LABELS];
    int n = label_boxes(d, text, mark, has_mark, GC_CHART_MAX_LABELS);
    CU_ASSERT_EQUAL(n, want);
    int clashes = 0;
    for (int i = 0; i < n; i++) {
        CU_ASSERT(inside(&d->plot, text[i].x0, text[i].y0, 0.02) &&
                  inside(&d->plot, text[i].x1, text[i].y1, 0.02));
        for (int j = 0; j < n; j++) {
            if (j > i && overlap(&text[i], &text[j], 0.01)) {
                fprintf(stderr, "labels %d and %d overlap\n", i + 1, j + 1);
                clashes++;
            }
            if (has_mark[j] && overlap(&text[i], &mark[j], 0.01)) {
                fprintf(stderr, "label %d covers the marker of label %d\n", i + 1, j + 1);
                clashes++;
            }
        }
    }
    CU_ASSERT_EQUAL(clashes, 0);
}

/* ---- number formatting ------------------------------------------------------ */

#define TS "\xe2\x80\x89"   /* thin space */

static void test_format_numbers(void)
{
    static const struct { double v; int sig; unsigned f; const char *want; } sig[] = {
        { 0.30000000000000004, 3, 0, "0.3" },       /* binary noise dropped */
        { 0.1 + 0.2, 15, 0, "0.3" },
        { 12345.6, 3, GC_CHART_FMT_GROUP, "12" TS "300" },
        { 12345.6, 6, GC_CHART_FMT_GROUP, "12" TS "345.6" },
        { 12345.6, 6, 0, "12345.6" },
        { 1500.0, 4, GC_CHART_FMT_GROUP, "1500" },  /* four digits stay whole */
        { 1e6, 3, GC_CHART_FMT_GROUP, "1" TS "000" TS "000" },
        { -0.000123456, 3, 0, "-0.000123" },
        { 2.5e-7, 3, 0, "2.5\xc3\x97" "10\xe2\x81\xbb\xe2\x81\xb7" },
        { 2.5e-7, 3, GC_CHART_FMT_SVG, "2.5\xc3\x97" "10<tspan baseline-shift=\"super\" "
                                       "font-size=\"75%\">-7</tspan>" },
        { 3e15, 2, 0, "3\xc3\x97" "10\xc2\xb9\xe2\x81\xb5" },
        { 0.0, 3, 0, "0" },
        { -0.0, 3, 0, "0" },
        { 9.9999, 3, 0, "10" },
        { 100.0, 1, 0, "100" },
        { 0.001, 1, 0, "0.001" },
        { 123456789012.0, 12, GC_CHART_FMT_GROUP, "123" TS "456" TS "789" TS "012" },
    };
    char out[128];
    for (size_t i = 0; i < sizeof sig / sizeof sig[0]; i++) {
        int n = gc_chart_format_sig(sig[i].v, sig[i].sig, sig[i].f, out, sizeof out);
        if (strcmp(out, sig[i].want) != 0)
            fprintf(stderr, "format_sig(%.17g, %d) = '%s', want '%s'\n", sig[i].v, sig[i].sig, out,
                    sig[i].want);
        CU_ASSERT_STRING_EQUAL(out, sig[i].want);
        CU_ASSERT_EQUAL(n, (int)strlen(sig[i].want));
    }
    static const struct { double v; int dec; unsigned f; const char *want; } fix[] = {
        { 0.30000000000000004, 1, 0, "0.3" },
        { 0.1 * 3.0, 2, 0, "0.30" },               /* fixed decimals as ticks of step 0.05 */
        { 10000.0, 0, GC_CHART_FMT_GROUP, "10" TS "000" },
        { 10000.0, 0, 0, "10000" },
        { -0.0001, 2, 0, "0.00" },                  /* no "-0.00" */
        { -12.5, 1, 0, "-12.5" },
        { 1234567.25, 2, GC_CHART_FMT_GROUP, "1" TS "234" TS "567.25" },
        { 5e12, 0, 0, "5\xc3\x97" "10\xc2\xb9\xc2\xb2" },
    };
    for (size_t i = 0; i < sizeof fix / sizeof fix[0]; i++) {
        gc_chart_format_fixed(fix[i].v, fix[i].dec, fix[i].f, out, sizeof out);
        if (strcmp(out, fix[i].want) != 0)
            fprintf(stderr, "format_fixed(%.17g, %d) = '%s', want '%s'\n", fix[i].v, fix[i].dec,
                    out, fix[i].want);
        CU_ASSERT_STRING_EQUAL(out, fix[i].want);
    }
    /* refusals: non-finite, bad digits, a buffer too small */
    CU_ASSERT_EQUAL(gc_chart_format_sig(NAN, 3, 0, out, sizeof out), -1);
    CU_ASSERT_STRING_EQUAL(out, "");
    CU_ASSERT_EQUAL(gc_chart_format_sig(INFINITY, 3, 0, out, sizeof out), -1);
    CU_ASSERT_EQUAL(gc_chart_format_sig(1.0, 0, 0, out, sizeof out), -1);
    CU_ASSERT_EQUAL(gc_chart_format_sig(1.0, 16, 0, out, sizeof out), -1);
    CU_ASSERT_EQUAL(gc_chart_format_fixed(-INFINITY, 2, 0, out, sizeof out), -1);
    CU_ASSERT_EQUAL(gc_chart_format_fixed(1.0, 13, 0, out, sizeof out), -1);
    CU_ASSERT_EQUAL(gc_chart_format_sig(123456.0, 6, 0, out, 4), -1);
    CU_ASSERT_STRING_EQUAL(out, "");
}

static void test_escape(void)
{
    gc_strbuf b = { 0 };
    gc_chart_escape(&b, "<script>alert(\"x\")</script> & 'q' \x01\xff\xc0\xaf caf\xc3\xa9 "
                        "\xed\xa0\x80 \xf4\x90\x80\x80", 1000);
    CU_ASSERT_STRING_EQUAL(b.s, "&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; "
                                "&#39;q&#39;  ??? caf\xc3\xa9 ??? ????");
    free(b.s);
    b = (gc_strbuf){ 0 };
    gc_chart_escape(&b, "caf\xc3\xa9", 4);     /* never cut inside a character */
    CU_ASSERT_STRING_EQUAL(b.s, "caf");
    free(b.s);
    CU_ASSERT_EQUAL(gc_chart_text_chars("caf\xc3\xa9", 100), 4);
    CU_ASSERT_EQUAL(gc_chart_text_chars(NULL, 100), 0);
}

/* ---- example charts (invented data, for pictures) ---------------------------- */

/* Correction curves of Quillmere unit 1 (invented): output and heat rate
 * against ambient temperature, reference 15 degC, two y axes. */
static void chart_correction(gc_chart *c, gc_chart_series *s, gc_chart_refline *r, double *buf)
{
    double *t = buf, *out = buf + 16, *hr = buf + 32;
    for (int i = 0; i < 11; i++) {
        t[i] = -10.0 + 5.0 * i;
        double d = t[i] - 15.0;
        out[i] = 100.0 * (1.0 - 0.0068 * d - 0.00002 * d * d);
        hr[i] = 100.0 * (1.0 + 0.0018 * d + 0.00001 * d * d);
    }
    gc_chart_init(c);
    c->title = "Quillmere unit 1: ambient temperature correction";
    c->x = (gc_chart_axis){ .title = "Ambient temperature", .unit = "\xc2\xb0" "C" };
    c->y = (gc_chart_axis){ .title = "Output, share of reference", .unit = "%" };
    c->y2 = (gc_chart_axis){ .title = "Heat rate, share of reference", .unit = "%" };
    c->has_y2 = 1;
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "Output", .n = 11, .x = t, .y = out,
                              .show_marks = 1, .color = 0 };
    s[1] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "Heat rate (right axis)", .n = 11,
                              .x = t, .y = hr, .y2 = 1, .dash = GC_CHART_DASHED,
                              .show_marks = 1, .color = 0 };
    c->series = s;
    c->n_series = 2;
    r[0] = (gc_chart_refline){ .vertical = 1, .value = 15.0, .label = "ISO 15 \xc2\xb0" "C",
                               .dash = GC_CHART_DOTTED, .color = 0 };
    r[1] = (gc_chart_refline){ .value = 100.0, .dash = GC_CHART_DOTTED, .color = 0 };
    c->refs = r;
    c->n_refs = 2;
}

static const char *const budget_names[] = {
    "Compressor discharge temperature", "Exhaust temperature", "Fuel flow",
    "Fuel lower heating value", "Ambient pressure", "Generator output",
};
static const double budget_share[] = { 41.2, 23.5, 15.1, 11.0, 6.3, 2.9 };

static void chart_budget(gc_chart *c, gc_chart_series *s)
{
    gc_chart_init(c);
    c->title = "Uncertainty budget: heat rate of Quillmere unit 1";
    c->x = (gc_chart_axis){ .title = "Share of the variance", .unit = "%" };
    s[0] = (gc_chart_series){ .kind = GC_CHART_HBARS, .n = 6, .x = budget_share,
                              .text = budget_names, .color = 0 };
    c->series = s;
    c->n_series = 1;
    static const char *const caps[] = { "Combined standard uncertainty 0.62 %, expanded (k = 2) 1.24 %" };
    c->captions = caps;
    c->n_captions = 1;
}

/* Slider-crank volume of the Test cell 3 engine (invented: bore 79 mm, stroke
 * 81.5 mm, rod 138 mm, compression ratio 10.5), m3, at crank angle deg. */
static double cyl_volume(double ca_deg)
{
    const double B = 0.079, S = 0.0815, L = 0.138, cr = 10.5;
    double Vd = M_PI / 4.0 * B * B * S, Vc = Vd / (cr - 1.0), a = S / 2.0;
    double th = ca_deg * M_PI / 180.0;
    double s = a * cos(th) + sqrt(L * L - a * a * sin(th) * sin(th));
    return Vc + M_PI / 4.0 * B * B * (L + a - s);
}

/* Wiebe mass fraction burned (Wiebe 1962 closed form; a = 5, m = 2). */
static double wiebe(double ca, double start, double dur)
{
    if (ca <= start)
        return 0.0;
    double u = (ca - start) / dur;
    return 1.0 - exp(-5.0 * pow(u, 3.0));
}

/* An invented fired trace: polytropic with a Wiebe pressure rise. */
static void trace(double *ca, double *V, double *P, double *Pid, int n)
{
    for (int i = 0; i < n; i++) {
        ca[i] = -180.0 + 360.0 * i / (n - 1);
        V[i] = cyl_volume(ca[i]) * 1e6;   /* cm3 */
        double Vbdc = cyl_volume(-180.0) * 1e6;
        double pm = 95.0 * pow(Vbdc / V[i], 1.32);
        double xb = wiebe(ca[i], -15.0, 55.0);
        P[i] = pm * (1.0 + 2.6 * xb);
        Pid[i] = pm * (ca[i] > 0.0 ? 3.9 : 1.0);
    }
}

static void chart_pv(gc_chart *c, gc_chart_series *s, double *buf, int n, int log)
{
    double *ca = buf, *V = buf + n, *P = buf + 2 * n, *Pid = buf + 3 * n;
    trace(ca, V, P, Pid, n);
    gc_chart_init(c);
    c->title = log ? "Test cell 3, cylinder 1: log P - log V" : "Test cell 3, cylinder 1: P-V";
    c->x = (gc_chart_axis){ .title = "Cylinder volume", .unit = "cm\xc2\xb3",
                            .scale = log ? GC_CHART_LOG : GC_CHART_LINEAR };
    c->y = (gc_chart_axis){ .title = "Cylinder pressure", .unit = "kPa",
                            .scale = log ? GC_CHART_LOG : GC_CHART_LINEAR };
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "Ideal Otto cycle", .n = n, .x = V,
                              .y = Pid, .dash = GC_CHART_DASHED, .color = 2 };
    s[1] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "Measured (ensemble mean)", .n = n,
                              .x = V, .y = P, .color = 1 };
    c->series = s;
    c->n_series = 2;
}

static void chart_hrr(gc_chart *c, gc_chart_series *s, gc_chart_refline *r, double *buf, int n)
{
    double *ca = buf, *hrr = buf + n, *mfb = buf + 2 * n;
    for (int i = 0; i < n; i++) {
        ca[i] = -40.0 + 120.0 * i / (n - 1);
        mfb[i] = 100.0 * wiebe(ca[i], -15.0, 55.0);
        double u = (ca[i] + 15.0) / 55.0;
        hrr[i] = ca[i] <= -15.0 ? 0.0 : 520.0 * 15.0 * u * u * exp(-5.0 * u * u * u) / 55.0;
    }
    gc_chart_init(c);
    c->title = "Test cell 3: heat release, 2000 rpm, 6 bar IMEP";
    c->x = (gc_chart_axis){ .title = "Crank angle", .unit = "\xc2\xb0" "CA aTDC" };
    c->y = (gc_chart_axis){ .title = "Apparent heat-release rate", .unit = "J/\xc2\xb0" "CA" };
    c->y2 = (gc_chart_axis){ .title = "Mass fraction burned", .unit = "%", .fixed_min = 1,
                             .min = 0.0, .fixed_max = 1, .max = 100.0 };
    c->has_y2 = 1;
    s[0] = (gc_chart_series){ .kind = GC_CHART_AREA, .name = "Heat-release rate", .n = n, .x = ca,
                              .y = hrr, .fill_to_base = 1, .color = 1 };
    s[1] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "Mass fraction burned (right axis)",
                              .n = n, .x = ca, .y = mfb, .y2 = 1, .color = 2 };
    c->series = s;
    c->n_series = 2;
    r[0] = (gc_chart_refline){ .vertical = 1, .value = 5.9, .label = "MFB10", .dash = GC_CHART_DASHED, .color = 0 };
    r[1] = (gc_chart_refline){ .vertical = 1, .value = 24.1, .label = "MFB50", .dash = GC_CHART_DASHED, .color = 0 };
    r[2] = (gc_chart_refline){ .vertical = 1, .value = 27.0, .label = "peak pressure", .dash = GC_CHART_DOTTED, .color = 0 };
    r[3] = (gc_chart_refline){ .vertical = 1, .value = 45.6, .label = "MFB90", .dash = GC_CHART_DASHED, .color = 0 };
    c->refs = r;
    c->n_refs = 4;
}

static void chart_imep(gc_chart *c, gc_chart_series *s, gc_chart_refline *r, double *buf, int n)
{
    double *k = buf, *imep = buf + n, mean = 0.0;
    unsigned st = 12345u;   /* a fixed LCG: the same invented scatter every run */
    for (int i = 0; i < n; i++) {
        st = st * 1103515245u + 12345u;
        double u = ((st >> 8) & 0xFFFF) / 65535.0 - 0.5;
        k[i] = i + 1;
        imep[i] = 6.02 + 0.11 * u + (i == 57 ? -1.9 : 0.0);
        mean += imep[i] / n;
    }
    gc_chart_init(c);
    c->title = "Test cell 3: net IMEP of 150 consecutive cycles";
    c->x = (gc_chart_axis){ .title = "Cycle", .unit = NULL };
    c->y = (gc_chart_axis){ .title = "Net IMEP", .unit = "bar" };
    s[0] = (gc_chart_series){ .kind = GC_CHART_MARKERS, .name = "Cycle", .n = n, .x = k, .y = imep,
                              .mark = GC_CHART_MARK_CIRCLE, .color = 1 };
    c->series = s;
    c->n_series = 1;
    static char mean_label[64];
    snprintf(mean_label, sizeof mean_label, "mean %.2f bar", mean);
    r[0] = (gc_chart_refline){ .value = mean, .label = mean_label, .dash = GC_CHART_DASHED, .color = 0 };
    r[1] = (gc_chart_refline){ .value = 0.9 * mean, .label = "90 % of mean (partial burn)",
                               .dash = GC_CHART_DOTTED, .color = 5 };
    c->refs = r;
    c->n_refs = 2;
    static const char *const caps[] = { "COV of IMEP 1.9 %, lowest normalised value 0.68 (cycle 58)" };
    c->captions = caps;
    c->n_captions = 1;
}

static const double tq_q[] = { 0.0, 18.0, 62.0, 74.7 }, tq_gas[] = { 598.0, 538.0, 261.0, 98.0 };
static const double tq_wq[] = { 0.0, 18.0, 62.0, 74.7 }, tq_water[] = { 565.0, 251.0, 251.0, 60.0 };

static void chart_tq(gc_chart *c, gc_chart_series *s, gc_chart_refline *r, gc_chart_label *l)
{
    gc_chart_init(c);
    c->title = "Quillmere combined cycle: heat-recovery T-Q";
    c->x = (gc_chart_axis){ .title = "Heat transferred", .unit = "MW" };
    c->y = (gc_chart_axis){ .title = "Temperature", .unit = "\xc2\xb0" "C" };
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "Exhaust gas", .n = 4, .x = tq_q,
                              .y = tq_gas, .show_marks = 1, .color = 5 };
    s[1] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "Water and steam", .n = 4, .x = tq_wq,
                              .y = tq_water, .show_marks = 1, .color = 1 };
    c->series = s;
    c->n_series = 2;
    r[0] = (gc_chart_refline){ .vertical = 1, .value = 62.0, .label = "pinch 10 K",
                               .dash = GC_CHART_DOTTED, .color = 0 };
    c->refs = r;
    c->n_refs = 1;
    l[0] = (gc_chart_label){ .x = 0.0, .y = 598.0, .text = "stack", .marker = 0 };
    l[0].x = 74.7;
    l[0].y = 98.0;
    l[1] = (gc_chart_label){ .x = 0.0, .y = 598.0, .text = "turbine exhaust" };
    c->labels = l;
    c->n_labels = 2;
}

/* Saturation line of water, IAPWS-IF97 as computed by python3-iapws 1.5
 * (T degC, s' and s'' kJ/(kg K)); for the picture only. */
static const double sat[][3] = {
    { 0.01, 0.0000, 9.1555 }, { 25.0, 0.3673, 8.5568 }, { 50.0, 0.7038, 8.0749 },
    { 75.0, 1.0156, 7.6812 }, { 100.0, 1.3070, 7.3541 }, { 125.0, 1.5815, 7.0770 },
    { 150.0, 1.8420, 6.8370 }, { 175.0, 2.0909, 6.6241 }, { 200.0, 2.3308, 6.4303 },
    { 225.0, 2.5641, 6.2485 }, { 250.0, 2.7934, 6.0722 }, { 275.0, 3.0221, 5.8943 },
    { 300.0, 3.2547, 5.7058 }, { 325.0, 3.4997, 5.4911 }, { 350.0, 3.7783, 5.2109 },
    { 365.0, 4.0010, 4.9482 }, { 373.0, 4.2380, 4.6293 },
};
#define N_SAT ((int)(sizeof sat / sizeof sat[0]))

static void chart_steam_ts(gc_chart *c, gc_chart_series *s, gc_chart_label *l, double *buf)
{
    double *ds = buf, *dt = buf + 64;
    int n = 0;
    for (int i = 0; i < N_SAT; i++, n++) {
        ds[n] = sat[i][1];
        dt[n] = sat[i][0];
    }
    ds[n] = 4.4120;   /* critical point, 373.946 degC (IF97) */
    dt[n++] = 373.946;
    for (int i = N_SAT - 1; i >= 0; i--, n++) {
        ds[n] = sat[i][2];
        dt[n] = sat[i][0];
    }
    /* a Rankine cycle 10 MPa / 540 degC / 8 kPa, ideal (python3-iapws states);
     * the feedwater heating drawn along the saturated-liquid line, which the
     * compressed liquid follows closely */
    static double cs[32], ct[32];
    int nc = 0, idx[6];
    idx[0] = nc; cs[nc] = 0.5925; ct[nc++] = 41.51;
    idx[1] = nc; cs[nc] = 0.5925; ct[nc++] = 41.81;
    for (int i = 0; i < N_SAT && sat[i][0] < 311.0; i++) {
        if (sat[i][0] <= 41.81)
            continue;
        cs[nc] = sat[i][1];
        ct[nc++] = sat[i][0];
    }
    idx[2] = nc; cs[nc] = 3.3603; ct[nc++] = 311.0;
    idx[3] = nc; cs[nc] = 5.6159; ct[nc++] = 311.0;
    idx[4] = nc; cs[nc] = 6.7277; ct[nc++] = 540.0;
    idx[5] = nc; cs[nc] = 6.7277; ct[nc++] = 41.51;
    cs[nc] = 0.5925;
    ct[nc++] = 41.51;
    gc_chart_init(c);
    c->title = "Steam cycle T-s with the saturation dome";
    c->x = (gc_chart_axis){ .title = "Specific entropy", .unit = "kJ/(kg K)" };
    c->y = (gc_chart_axis){ .title = "Temperature", .unit = "\xc2\xb0" "C" };
    s[0] = (gc_chart_series){ .kind = GC_CHART_AREA, .name = "Saturation dome", .n = n, .x = ds,
                              .y = dt, .color = 8, .dash = GC_CHART_SOLID };
    s[1] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "Rankine cycle", .n = nc, .x = cs,
                              .y = ct, .color = 1 };
    c->series = s;
    c->n_series = 2;
    static const char *const num[] = { "1", "2", "3", "4", "5", "6" };
    for (int i = 0; i < 6; i++)
        l[i] = (gc_chart_label){ .x = cs[idx[i]], .y = ct[idx[i]], .text = num[i], .marker = 1 };
    c->labels = l;
    c->n_labels = 6;
}

/* ---- tests of the example charts -------------------------------------------- */

static double g_buf[8 * GC_CHART_MAX_POINTS];

static void test_correction_curves(void)
{
    gc_chart c;
    gc_chart_series s[2];
    gc_chart_refline r[2];
    chart_correction(&c, s, r, g_buf);
    doc d;
    if (render_doc(&c, "correction-curves", &d) == 0) {
        axismap mx, my, my2;
        CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
        CU_ASSERT_EQUAL(axis_map(&d, "y", 0, &my), 0);
        CU_ASSERT_EQUAL(axis_map(&d, "y2", 0, &my2), 0);
        check_line_on_axes(&d, &s[0], 0, &mx, &my);
        check_line_on_axes(&d, &s[1], 1, &mx, &my2);
        CU_ASSERT_PTR_NOT_NULL(find_id(d.root->children, "axis-y2"));
        CU_ASSERT_EQUAL(count_class(d.root->children, "gc-refline"), 2);
    }
    doc_free(&d);
}

static void test_budget_bars(void)
{
    gc_chart c;
    gc_chart_series s[1];
    chart_budget(&c, s);
    doc d;
    if (render_doc(&c, "uncertainty-budget", &d) == 0) {
        CU_ASSERT_EQUAL(count_class(d.root->children, "gc-bar"), 6);
        CU_ASSERT_EQUAL(count_class(d.root->children, "gc-category"), 6);
        xmlNode *row = find_id(d.root->children, "bar-1");
        CU_ASSERT_PTR_NOT_NULL_FATAL(row);
        xmlNode *cat = find_class(row->children, "gc-category");
        xmlNode *val = find_class(row->children, "gc-bar-value");
        CU_ASSERT_PTR_NOT_NULL_FATAL(cat);
        CU_ASSERT_PTR_NOT_NULL_FATAL(val);
        char *ct = node_text(cat), *vt = node_text(val);
        CU_ASSERT_STRING_EQUAL(ct, "Compressor discharge temperature");
        CU_ASSERT_STRING_EQUAL(vt, "41.2");            /* 3 significant digits */
        free(ct);
        free(vt);
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">11.0</text>"));   /* significant zero kept */
        /* bars: a longer value, a longer bar; category labels left of the plot */
        axismap mx;
        CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
        for (int i = 1; i <= 6; i++) {
            char id[16];
            snprintf(id, sizeof id, "bar-%d", i);
            xmlNode *g = find_id(d.root->children, id);
            CU_ASSERT_PTR_NOT_NULL_FATAL(g);
            xmlNode *bar = find_class(g->children, "gc-bar");
            xmlNode *lab = find_class(g->children, "gc-category");
            CU_ASSERT_PTR_NOT_NULL_FATAL(bar);
            double x0 = num_prop(bar, "x"), w = num_prop(bar, "width");
            CHECK_ABS(x0, map_px(&mx, 0.0), 0.06, "bar foot on the zero tick");
            CHECK_ABS(x0 + w, map_px(&mx, budget_share[i - 1]), 0.06, "bar end at its value");
            CU_ASSERT(num_prop(lab, "x") < d.plot.x);
        }
    }
    doc_free(&d);
}

static void test_pv_log(void)
{
    const int n = 721;
    gc_chart c;
    gc_chart_series s[2];
    for (int log = 0; log < 2; log++) {
        chart_pv(&c, s, g_buf, n, log);
        doc d;
        if (render_doc(&c, log ? "pressure-trace-loglog" : "pressure-trace-pv", &d) == 0) {
            axismap mx, my;
            CU_ASSERT_EQUAL(axis_map(&d, "x", log, &mx), 0);
            CU_ASSERT_EQUAL(axis_map(&d, "y", log, &my), 0);
            check_line_on_axes(&d, &s[0], 0, &mx, &my);
            check_line_on_axes(&d, &s[1], 1, &mx, &my);
            if (log) {
                /* decades labelled as plain numbers: 100, 1000 and 10 000 kPa */
                CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">100</text>"));
                CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">1" TS "000</text>"));
                CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">10" TS "000</text>"));
                CU_ASSERT_PTR_NULL(strstr(d.svg, "e+0"));
            }
        }
        doc_free(&d);
    }
}

static void test_heat_release(void)
{
    const int n = 481;
    gc_chart c;
    gc_chart_series s[2];
    gc_chart_refline r[4];
    chart_hrr(&c, s, r, g_buf, n);
    doc d;
    if (render_doc(&c, "heat-release", &d) == 0) {
        axismap mx, my, my2;
        CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
        CU_ASSERT_EQUAL(axis_map(&d, "y", 0, &my), 0);
        CU_ASSERT_EQUAL(axis_map(&d, "y2", 0, &my2), 0);
        check_line_on_axes(&d, &s[1], 1, &mx, &my2);
        /* fixed 0..100 % range: the ends are exactly the plot's edges */
        CHECK_ABS(map_px(&my2, 0.0), d.plot.y + d.plot.h, 0.06, "fixed y2 minimum at the bottom");
        CHECK_ABS(map_px(&my2, 100.0), d.plot.y, 0.06, "fixed y2 maximum at the top");
        /* reference-line labels do not overlap (MFB50 and peak pressure are 3 deg apart) */
        xmlNode *g = find_class(d.root->children, "gc-reflines");
        CU_ASSERT_PTR_NOT_NULL_FATAL(g);
        lbox box[8];
        int n_box = 0;
        double fs = num_prop(g, "font-size");
        for (xmlNode *k = g->children; k; k = k->next) {
            xmlNode *t = is_elem(k, "g") ? find_class(k->children, "gc-refline-label") : NULL;
            if (!t || n_box >= 8)
                continue;
            char *txt = node_text(t);
            double x = num_prop(t, "x"), y = num_prop(t, "y");
            box[n_box++] = (lbox){ x, y - GC_CHART_ASCENT_EM * fs,
                                   x + GC_CHART_CHAR_EM * fs * utf8_chars(txt),
                                   y + GC_CHART_DESCENT_EM * fs };
            free(txt);
        }
        CU_ASSERT_EQUAL(n_box, 4);
        for (int i = 0; i < n_box; i++)
            for (int j = i + 1; j < n_box; j++)
                CU_ASSERT(!overlap(&box[i], &box[j], 0.01));
    }
    doc_free(&d);
}

static void test_imep_scatter(void)
{
    const int n = 150;
    gc_chart c;
    gc_chart_series s[1];
    gc_chart_refline r[2];
    chart_imep(&c, s, r, g_buf, n);
    doc d;
    if (render_doc(&c, "imep-scatter", &d) == 0) {
        xmlNode *g = find_id(d.root->children, "series-1");
        CU_ASSERT_PTR_NOT_NULL_FATAL(g);
        xmlNode *marks = find_class(g->children, "gc-marks");
        CU_ASSERT_PTR_NOT_NULL_FATAL(marks);
        int k = 0;
        axismap mx, my;
        CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
        CU_ASSERT_EQUAL(axis_map(&d, "y", 0, &my), 0);
        int off = 0;
        for (xmlNode *m = marks->children; m; m = m->next) {
            if (!is_elem(m, "circle"))
                continue;
            double ex = map_px(&mx, s[0].x[k]), ey = map_px(&my, s[0].y[k]);
            if (fabs(num_prop(m, "cx") - ex) > 0.06 || fabs(num_prop(m, "cy") - ey) > 0.06)
                off++;
            k++;
        }
        CU_ASSERT_EQUAL(k, n);      /* one marker a cycle, the misfire included */
        CU_ASSERT_EQUAL(off, 0);
    }
    doc_free(&d);
}

static void test_tq_and_steam(void)
{
    gc_chart c;
    gc_chart_series s[2];
    gc_chart_refline r[1];
    gc_chart_label l[6];
    chart_tq(&c, s, r, l);
    doc d;
    if (render_doc(&c, "hrsg-tq", &d) == 0)
        check_labels_apart(&d, 2);
    doc_free(&d);
    chart_steam_ts(&c, s, l, g_buf);
    if (render_doc(&c, "steam-ts-dome", &d) == 0) {
        check_labels_apart(&d, 6);   /* states 1 and 2 nearly coincide */
        xmlNode *g = find_id(d.root->children, "series-1");
        CU_ASSERT(g != NULL && find_class(g->children, "gc-fill") != NULL);
    }
    doc_free(&d);
}

/* Vertical bars (grouped, two series) and a step line (an empirical
 * cumulative distribution): the remaining kinds. */
static void test_vbars_and_step(void)
{
    static const double cyl[] = { 1, 2, 3, 4 }, pmax[] = { 58.2, 61.0, 55.4, 59.9 };
    static const double pmax2[] = { 57.1, 59.3, 56.0, 58.8 };
    static const char *const txt[] = { "58.2", "61.0", "55.4", "59.9" };
    gc_chart c;
    gc_chart_series s[3];
    gc_chart_init(&c);
    c.title = "Test cell 3: peak pressure per cylinder";
    c.x = (gc_chart_axis){ .title = "Cylinder" };
    c.y = (gc_chart_axis){ .title = "Peak pressure", .unit = "bar" };
    s[0] = (gc_chart_series){ .kind = GC_CHART_VBARS, .name = "2000 rpm", .n = 4, .x = cyl,
                              .y = pmax, .text = txt, .color = 1 };
    s[1] = (gc_chart_series){ .kind = GC_CHART_VBARS, .name = "2500 rpm", .n = 4, .x = cyl,
                              .y = pmax2, .color = 2 };
    c.series = s;
    c.n_series = 2;
    doc d;
    if (render_doc(&c, "vertical-bars", &d) == 0) {
        CU_ASSERT_EQUAL(count_class(d.root->children, "gc-bar"), 8);
        axismap my;
        CU_ASSERT_EQUAL(axis_map(&d, "y", 0, &my), 0);
        xmlNode *b1 = find_id(d.root->children, "series-1-bar-2");
        xmlNode *b2 = find_id(d.root->children, "series-2-bar-2");
        CU_ASSERT_PTR_NOT_NULL_FATAL(b1);
        CU_ASSERT_PTR_NOT_NULL_FATAL(b2);
        CHECK_ABS(num_prop(b1, "y"), map_px(&my, 61.0), 0.06, "bar top at its value");
        CHECK_ABS(num_prop(b1, "y") + num_prop(b1, "height"), map_px(&my, 0.0), 0.06,
                  "bar foot at zero");
        CU_ASSERT(num_prop(b1, "x") + num_prop(b1, "width") <= num_prop(b2, "x") + 0.01);
    }
    doc_free(&d);

    static double xs[40], ys[40];
    for (int i = 0; i < 40; i++) {
        xs[i] = 5.9 + 0.006 * i * i / 4.0;
        ys[i] = (i + 1) / 40.0;
    }
    gc_chart_init(&c);
    c.title = "Empirical distribution of net IMEP";
    c.x = (gc_chart_axis){ .title = "Net IMEP", .unit = "bar" };
    c.y = (gc_chart_axis){ .title = "Cumulative share", .unit = "-" };
    s[0] = (gc_chart_series){ .kind = GC_CHART_STEP, .name = "150 cycles", .n = 40, .x = xs,
                              .y = ys, .color = 4 };
    c.series = s;
    c.n_series = 1;
    if (render_doc(&c, "step-line", &d) == 0) {
        static double vx[200], vy[200];
        xmlNode *p = find_class(d.root->children, "gc-line");
        CU_ASSERT_PTR_NOT_NULL_FATAL(p);
        int k = path_vertices(p, vx, vy, 200);
        CU_ASSERT_EQUAL(k, 2 * 40 - 1);        /* a corner between each two points */
        for (int i = 1; i + 1 < k && i < 200; i += 2) {
            CHECK_ABS(vy[i], vy[i - 1], 0.011, "held flat to the next x");
            CHECK_ABS(vx[i], vx[i + 1], 0.011, "then a vertical rise");
        }
    }
    doc_free(&d);
}

/* ---- state labels of a regenerative Brayton cycle and synthetic clusters ---- */

/* The states of a regenerative Brayton cycle from the engine, labelled on
 * T-s and P-v at the default and the smallest size. Regeneration brings
 * states close together (on P-v the compressor exit, the regenerator's air
 * exit and the turbine inlet share one pressure at small specific volumes):
 * the closest two labelled points over the four pictures lie within 15 px. */
static void test_labels_regenerative_brayton(void)
{
    static gc_brayton_result br;
    gc_brayton_input in;
    gc_brayton_input_init(&in);
    in.flags = GC_BRAYTON_NO_OPTIMUM;
    in.pressure_ratio = 8.0;
    in.turbine_inlet_temperature = 1400.0;
    in.compressor_efficiency = 0.85;
    in.turbine_efficiency = 0.88;
    in.regenerator_effectiveness = 0.8;
    gc_error err;
    int rc = gc_brayton_evaluate(&in, &br, &err);
    if (rc != GC_OK)
        fprintf(stderr, "brayton: %s %s\n", err.field, err.message);
    CU_ASSERT_EQUAL_FATAL(rc, GC_OK);
    const gc_cycle_run *run = &br.cycle.actual;
    int ns = run->n_states;
    CU_ASSERT_FATAL(ns >= 5 && ns <= GC_CHART_MAX_LABELS);
    static double px[2][GC_CHART_MAX_LABELS], py[2][GC_CHART_MAX_LABELS];
    static char names[GC_CHART_MAX_LABELS][16];
    gc_chart_label l[GC_CHART_MAX_LABELS];
    for (int i = 0; i < ns; i++) {
        px[0][i] = run->states[i].s_J_per_kgK * 1e-3;   /* kJ/(kg K) */
        py[0][i] = run->states[i].T_K;
        px[1][i] = run->states[i].v_m3_per_kg;
        py[1][i] = run->states[i].P_Pa * 1e-3;          /* kPa */
    }
    int nl = ns;
    if (fabs(py[0][ns - 1] - py[0][0]) < 1e-6 * py[0][0] &&
        fabs(py[1][ns - 1] - py[1][0]) < 1e-6 * py[1][0])
        nl--;   /* the closing state is state 1 again */
    double closest = INFINITY;
    for (int kind = 0; kind < 2; kind++) {
        for (int i = 0; i < nl; i++) {
            snprintf(names[i], sizeof names[i], "%d", i + 1);
            l[i] = (gc_chart_label){ .x = px[kind][i], .y = py[kind][i], .text = names[i],
                                     .marker = 1 };
        }
        gc_chart c;
        gc_chart_series s[1];
        gc_chart_init(&c);
        c.title = kind ? "Regenerative Brayton cycle: P-v states" : "Regenerative Brayton cycle: T-s states";
        c.x = kind ? (gc_chart_axis){ .title = "Specific volume", .unit = "m\xc2\xb3/kg" }
                   : (gc_chart_axis){ .title = "Specific entropy", .unit = "kJ/(kg K)" };
        c.y = kind ? (gc_chart_axis){ .title = "Pressure", .unit = "kPa" }
                   : (gc_chart_axis){ .title = "Temperature", .unit = "K" };
        s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "States in order", .n = ns,
                                  .x = px[kind], .y = py[kind], .color = 1 };
        c.series = s;
        c.n_series = 1;
        c.labels = l;
        c.n_labels = nl;
        for (int size = 0; size < 2; size++) {
            c.width_px = size ? GC_CHART_MIN_SIZE : 0;
            c.height_px = size ? GC_CHART_MIN_SIZE : 0;
            static const char *const ex[2][2] = { { "state-labels-ts", "state-labels-ts-small" },
                                                  { "state-labels-pv", "state-labels-pv-small" } };
            doc d;
            if (render_doc(&c, ex[kind][size], &d) == 0) {
                check_labels_apart(&d, nl);
                axismap mx, my;
                CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
                CU_ASSERT_EQUAL(axis_map(&d, "y", 0, &my), 0);
                double near = INFINITY;
                for (int i = 0; i < nl; i++)
                    for (int j = i + 1; j < nl; j++)
                        near = fmin(near, hypot(map_px(&mx, l[i].x) - map_px(&mx, l[j].x),
                                                map_px(&my, l[i].y) - map_px(&my, l[j].y)));
                fprintf(stderr, "  regenerative Brayton %s %s: %d labels, closest points %.1f px\n",
                        kind ? "P-v" : "T-s", size ? "small" : "default", nl, near);
                closest = fmin(closest, near);
            }
            doc_free(&d);
        }
    }
    CU_ASSERT(closest < 15.0);   /* the case the placement is for */
}

static void test_labels_clusters(void)
{
    static const double lx[] = { 0.0, 10.0 }, ly[] = { 0.0, 10.0 };
    static const char *const txt[] = { "1", "2", "3", "4", "5", "6", "7", "8", "12", "13" };
    gc_chart_label l[10];
    gc_chart c;
    gc_chart_series s[1];
    for (int n = 2; n <= 8; n++) {
        for (int spread = 0; spread < 3; spread++) {
            for (int i = 0; i < n; i++) {
                /* spread 0: one spot; 1: within 0.2 % of the span; 2: a line of close points */
                double dx = spread == 1 ? 0.02 * (i % 3) : spread == 2 ? 0.05 * i : 0.0;
                double dy = spread == 1 ? 0.02 * (i / 3) : 0.0;
                l[i] = (gc_chart_label){ .x = 5.0 + dx, .y = 5.0 + dy, .text = txt[i],
                                         .marker = i % 2 == 0 };
            }
            gc_chart_init(&c);
            s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .n = 2, .x = lx, .y = ly };
            c.series = s;
            c.n_series = 1;
            c.labels = l;
            c.n_labels = n;
            doc d;
            if (render_doc(&c, n == 8 && spread == 0 ? "labels-cluster" : NULL, &d) == 0)
                check_labels_apart(&d, n);
            doc_free(&d);
        }
    }
    /* labels in the plot's corners stay inside it */
    static const double cx[] = { 0.0, 10.0, 0.0, 10.0 }, cy[] = { 0.0, 0.0, 10.0, 10.0 };
    for (int i = 0; i < 4; i++)
        l[i] = (gc_chart_label){ .x = cx[i], .y = cy[i], .text = txt[8 + i % 2], .marker = 1 };
    gc_chart_init(&c);
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .n = 2, .x = lx, .y = ly };
    c.series = s;
    c.n_series = 1;
    c.labels = l;
    c.n_labels = 4;
    c.x.fixed_min = c.y.fixed_min = 1;   /* the corners on the frame itself */
    c.x.fixed_max = c.y.fixed_max = 1;
    c.x.max = c.y.max = 10.0;
    doc d;
    if (render_doc(&c, NULL, &d) == 0)
        check_labels_apart(&d, 4);
    doc_free(&d);
}

/* ---- clipping, ranges and ticks ------------------------------------------- */

static void test_clipping(void)
{
    static const double x[] = { -100.0, 2.0, 5.0, 50.0, 8.0, 1e250, -1e250 };
    static const double y[] = { -5.0, 3.0, 12.0, 20.0, 7.0, 5.0, -1e300 };
    static const double bx[] = { -3.0, 1.0, 5.0, 9.5, 30.0 }, by[] = { 4.0, 15.0, 6.0, 3.0, 2.0 };
    gc_chart c;
    gc_chart_series s[4];
    gc_chart_init(&c);
    c.x = (gc_chart_axis){ .title = "x", .fixed_min = 1, .min = 0.0, .fixed_max = 1, .max = 10.0 };
    c.y = (gc_chart_axis){ .title = "y", .fixed_min = 1, .min = 0.0, .fixed_max = 1, .max = 10.0 };
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .name = "line", .n = 7, .x = x, .y = y,
                              .show_marks = 1 };
    s[1] = (gc_chart_series){ .kind = GC_CHART_AREA, .name = "area", .n = 7, .x = x, .y = y };
    s[2] = (gc_chart_series){ .kind = GC_CHART_VBARS, .name = "bars", .n = 5, .x = bx, .y = by,
                              .base = -2.0 };
    s[3] = (gc_chart_series){ .kind = GC_CHART_MARKERS, .name = "marks", .n = 7, .x = x, .y = y,
                              .mark = GC_CHART_MARK_SQUARE };
    c.series = s;
    c.n_series = 4;
    doc d;
    if (render_doc(&c, "clipping", &d) == 0) {   /* render_doc checks all inside */
        xmlNode *g = find_id(d.root->children, "series-4");
        CU_ASSERT_PTR_NOT_NULL_FATAL(g);
        xmlChar *cp = xmlGetProp(g, (const xmlChar *)"clip-path");
        CU_ASSERT(cp && strcmp((const char *)cp, "url(#gc-chart-clip)") == 0);
        xmlFree(cp);
        /* markers: only (2,3) and (8,7) lie in 0..10 x 0..10 */
        CU_ASSERT_EQUAL(count_class(g->children, "gc-marks"), 1);
        int rects = 0;
        for (xmlNode *m = find_class(g->children, "gc-marks")->children; m; m = m->next)
            rects += is_elem(m, "rect");
        CU_ASSERT_EQUAL(rects, 2);
        /* the line is cut at the frame: a vertex on the left edge */
        static double vx[64], vy[64];
        xmlNode *p = find_class(find_id(d.root->children, "series-1")->children, "gc-line");
        CU_ASSERT_PTR_NOT_NULL_FATAL(p);
        int k = path_vertices(p, vx, vy, 64);
        CU_ASSERT(k >= 4);
        int on_edge = 0;
        for (int i = 0; i < k; i++)
            on_edge += fabs(vx[i] - d.plot.x) < 0.011 || fabs(vy[i] - (d.plot.y + d.plot.h)) < 0.011;
        CU_ASSERT(on_edge >= 1);
        /* bars: those at x = -3 and 30 are outside; the one at 9.5 is cut at the frame */
        CU_ASSERT_EQUAL(count_class(find_id(d.root->children, "series-3")->children, "gc-bar"), 3);
    }
    doc_free(&d);
}

/* Tick labels as engineers read them: fixed decimals, no noise, grouping. */
static void test_tick_labels(void)
{
    static const double x[] = { 0.0, 0.3 }, y[] = { 9800.0, 31000.0 };
    gc_chart c;
    gc_chart_series s[1];
    gc_chart_init(&c);
    c.x = (gc_chart_axis){ .title = "Share", .unit = "-" };
    c.y = (gc_chart_axis){ .title = "Power", .unit = "kW" };
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .n = 2, .x = x, .y = y };
    c.series = s;
    c.n_series = 1;
    doc d;
    if (render_doc(&c, "tick-labels", &d) == 0) {
        CU_ASSERT_PTR_NULL(strstr(d.svg, "0000000"));      /* no 0.30000000000000004 */
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">0.30</text>"));   /* step 0.05: 2 decimals */
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">0.05</text>"));
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">10" TS "000</text>"));
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">8" TS "000</text>"));  /* grouped like 10 000 */
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">30" TS "000</text>"));
        axismap mx, my;
        CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
        CU_ASSERT_EQUAL(axis_map(&d, "y", 0, &my), 0);
        check_line_on_axes(&d, &s[0], 0, &mx, &my);
    }
    doc_free(&d);
    c.group_thousands = 0;
    if (render_doc(&c, NULL, &d) == 0) {
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">10000</text>"));
        CU_ASSERT_PTR_NULL(strstr(d.svg, TS));
    }
    doc_free(&d);

    /* a wide log range: decades as 10 with a superscript exponent */
    static const double wx[] = { 1.0, 2.0, 3.0 }, wy[] = { 3e2, 4e7, 2e11 };
    c.group_thousands = 1;
    c.y = (gc_chart_axis){ .title = "Wide", .scale = GC_CHART_LOG };
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .n = 3, .x = wx, .y = wy };
    if (render_doc(&c, "log-wide", &d) == 0) {
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">10<tspan baseline-shift=\"super\" font-size=\"75%\">8</tspan>"));
        axismap mx, my;
        CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
        CU_ASSERT_EQUAL(axis_map(&d, "y", 1, &my), 0);
        check_line_on_axes(&d, &s[0], 0, &mx, &my);
    }
    doc_free(&d);

    /* a narrow log range (under two decades): 1-2-5 labels */
    static const double ny[] = { 2.2, 37.0, 9.0 };
    c.y = (gc_chart_axis){ .title = "Narrow", .scale = GC_CHART_LOG };
    s[0].y = ny;
    if (render_doc(&c, "log-narrow", &d) == 0) {
        axismap mx, my;
        CU_ASSERT_EQUAL(axis_map(&d, "y", 1, &my), 0);
        CU_ASSERT(my.n >= 3);
        CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
        check_line_on_axes(&d, &s[0], 0, &mx, &my);
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">20</text>"));
    }
    doc_free(&d);

    /* a narrow fixed range of long labels at the smallest width: still two ticks */
    static const double fx[] = { 123456.2, 123456.8 }, fy[] = { 1.0, 2.0 };
    gc_chart_init(&c);
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .n = 2, .x = fx, .y = fy };
    c.series = s;
    c.n_series = 1;
    c.width_px = GC_CHART_MIN_SIZE;
    c.x = (gc_chart_axis){ .title = "x", .fixed_min = 1, .min = 123456.1, .fixed_max = 1,
                           .max = 123456.9 };
    if (render_doc(&c, NULL, &d) == 0) {
        axismap mx, my;
        CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
        CU_ASSERT_EQUAL(axis_map(&d, "y", 0, &my), 0);
        check_line_on_axes(&d, &s[0], 0, &mx, &my);
        CU_ASSERT_PTR_NOT_NULL(strstr(d.svg, ">123" TS "456.4</text>"));
    }
    doc_free(&d);
    c.width_px = 0;

    /* an awkward linear range with negative values, many sizes (and the fixed
     * x range above kept: the data lie outside it, the axis still has ticks) */
    static const double ax[] = { -0.0123, 0.0456, 0.0311 }, ay[] = { -1234.5, 987.6, 1e-3 };
    c.y = (gc_chart_axis){ .title = "y" };
    s[0].x = ax;
    s[0].y = ay;
    s[0].n = 3;
    for (int w = GC_CHART_MIN_SIZE; w <= 2000; w += 420) {
        c.width_px = w;
        c.height_px = w * 2 / 3 < GC_CHART_MIN_SIZE ? GC_CHART_MIN_SIZE : w * 2 / 3;
        if (render_doc(&c, NULL, &d) == 0) {
            axismap mx, my;
            CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
            CU_ASSERT_EQUAL(axis_map(&d, "y", 0, &my), 0);
            CU_ASSERT_PTR_NULL(find_class(d.root->children, "gc-line"));   /* all outside */
        }
        doc_free(&d);
    }
    c.x = (gc_chart_axis){ .title = "x" };
    for (int w = GC_CHART_MIN_SIZE; w <= 2000; w += 420) {
        c.width_px = w;
        c.height_px = w * 2 / 3 < GC_CHART_MIN_SIZE ? GC_CHART_MIN_SIZE : w * 2 / 3;
        if (render_doc(&c, NULL, &d) == 0) {
            axismap mx, my;
            CU_ASSERT_EQUAL(axis_map(&d, "x", 0, &mx), 0);
            CU_ASSERT_EQUAL(axis_map(&d, "y", 0, &my), 0);
            check_line_on_axes(&d, &s[0], 0, &mx, &my);
        }
        doc_free(&d);
    }
}

/* ---- refusals, limits and escaping ---------------------------------------- */

static void expect_refused(const gc_chart *c, const char *field, const char *words)
{
    char *svg = (char *)1;
    size_t len = 99;
    gc_error err;
    gc_error_clear(&err);
    int rc = gc_chart_svg(c, &svg, &len, &err);
    if (rc != GC_ERR_INVALID)
        fprintf(stderr, "not refused (%d), expected a message with '%s'\n", rc, words);
    CU_ASSERT_EQUAL(rc, GC_ERR_INVALID);
    CU_ASSERT_PTR_NULL(svg);
    CU_ASSERT_EQUAL(len, 0);
    CU_ASSERT_STRING_EQUAL(err.field, field ? field : "");
    if (words && !strstr(err.message, words))
        fprintf(stderr, "message '%s' lacks '%s'\n", err.message, words);
    CU_ASSERT(words == NULL || strstr(err.message, words) != NULL);
}

static void base_chart(gc_chart *c, gc_chart_series *s, const double *x, const double *y, int n)
{
    gc_chart_init(c);
    s[0] = (gc_chart_series){ .kind = GC_CHART_LINE, .n = n, .x = x, .y = y };
    c->series = s;
    c->n_series = 1;
}

static void test_refusals(void)
{
    double x[3] = { 1.0, 2.0, 3.0 }, y[3] = { 1.0, 2.0, 3.0 };
    gc_chart c;
    gc_chart_series s[GC_CHART_MAX_SERIES + 1];
    static const double bad[] = { NAN, INFINITY, -INFINITY, 2e300 };
    for (int i = 0; i < 4; i++) {
        base_chart(&c, s, x, y, 3);
        x[1] = bad[i];
        expect_refused(&c, NULL, "series 1, point 2: x");
        x[1] = 2.0;
        y[2] = bad[i];
        expect_refused(&c, NULL, "series 1, point 3: y");
        y[2] = 3.0;
        gc_chart_refline r = { .value = bad[i] };
        c.refs = &r;
        c.n_refs = 1;
        expect_refused(&c, NULL, "reference line 1");
        c.n_refs = 0;
        gc_chart_label l = { .x = 1.0, .y = bad[i], .text = "1" };
        c.labels = &l;
        c.n_labels = 1;
        expect_refused(&c, NULL, "point label 1: y");
        c.n_labels = 0;
        c.x.fixed_min = 1;
        c.x.min = bad[i];
        expect_refused(&c, NULL, "fixed minimum");
        c.x.fixed_min = 0;
        s[0].kind = GC_CHART_VBARS;
        s[0].base = bad[i];
        expect_refused(&c, NULL, "base value");
    }
    /* log axes take positive values only */
    base_chart(&c, s, x, y, 3);
    c.y.scale = GC_CHART_LOG;
    y[0] = 0.0;
    expect_refused(&c, NULL, "log axis");
    y[0] = -1.0;
    expect_refused(&c, NULL, "log axis");
    y[0] = 1.0;
    gc_chart_refline r = { .vertical = 0, .value = -2.0 };
    c.refs = &r;
    c.n_refs = 1;
    expect_refused(&c, NULL, "log axis");
    /* limits */
    base_chart(&c, s, x, y, 3);
    c.n_series = 0;
    expect_refused(&c, NULL, "series");
    c.n_series = GC_CHART_MAX_SERIES + 1;
    for (int i = 0; i <= GC_CHART_MAX_SERIES; i++)
        s[i] = s[0];
    expect_refused(&c, NULL, "series");
    base_chart(&c, s, x, y, GC_CHART_MAX_POINTS + 1);
    expect_refused(&c, NULL, "points");
    base_chart(&c, s, g_buf, g_buf, GC_CHART_MAX_POINTS);
    for (int i = 0; i < GC_CHART_MAX_POINTS; i++)
        g_buf[i] = i + 1.0;
    c.n_series = 6;   /* 6 x 20 000 > 100 000 */
    for (int i = 1; i < 6; i++)
        s[i] = s[0];
    expect_refused(&c, NULL, "at most");
    base_chart(&c, s, x, y, 3);
    c.n_refs = GC_CHART_MAX_REFLINES + 1;
    c.refs = &r;
    expect_refused(&c, NULL, "reference lines");
    c.n_refs = 0;
    c.n_labels = GC_CHART_MAX_LABELS + 1;
    gc_chart_label l = { .x = 1.0, .y = 1.0, .text = "1" };
    c.labels = &l;
    expect_refused(&c, NULL, "point labels");
    c.n_labels = 0;
    static const char *const caps[GC_CHART_MAX_CAPTIONS + 1] = { "a" };
    c.captions = caps;
    c.n_captions = GC_CHART_MAX_CAPTIONS + 1;
    expect_refused(&c, NULL, "caption");
    c.n_captions = 0;
    c.width_px = GC_CHART_MIN_SIZE - 1;
    expect_refused(&c, "/width", NULL);
    c.width_px = 0;
    c.height_px = GC_CHART_MAX_SIZE + 1;
    expect_refused(&c, "/height", NULL);
    c.height_px = 0;
    c.value_digits = 16;
    expect_refused(&c, NULL, "digits");
    c.value_digits = 0;
    /* inconsistent series */
    s[0].y2 = 1;
    expect_refused(&c, NULL, "second y axis");
    s[0].y2 = 0;
    s[0].y = NULL;
    expect_refused(&c, NULL, "no x or y");
    s[0].y = y;
    s[0].kind = (gc_chart_kind)9;
    expect_refused(&c, NULL, "unknown kind");
    s[0].kind = GC_CHART_LINE;
    c.x.fixed_min = c.x.fixed_max = 1;
    c.x.min = 5.0;
    c.x.max = 5.0;
    expect_refused(&c, NULL, "empty");
    c.x.fixed_min = c.x.fixed_max = 0;
    static const char *const cats[] = { "a", "b", "c" };
    gc_chart_series hb = { .kind = GC_CHART_HBARS, .n = 3, .x = x, .text = cats };
    s[1] = hb;
    c.n_series = 2;
    expect_refused(&c, NULL, "horizontal bar chart");
    s[0] = hb;
    c.n_series = 1;
    c.x.scale = GC_CHART_LOG;
    expect_refused(&c, NULL, "linear value axis");
    c.x.scale = GC_CHART_LINEAR;
    s[0].text = NULL;
    expect_refused(&c, NULL, "category labels");
    s[0].text = cats;
    s[0].n = GC_CHART_MAX_BARS + 1;
    expect_refused(&c, NULL, "points");
    CU_ASSERT_EQUAL(gc_chart_svg(NULL, NULL, NULL, NULL), GC_ERR_INVALID);
}

static void test_hostile_text(void)
{
    static const double x[] = { 1.0, 2.0 }, y[] = { 1.0, 2.0 };
    gc_chart c;
    gc_chart_series s[1];
    base_chart(&c, s, x, y, 2);
    c.title = "<script>alert('x')</script>";
    c.x.title = "Temp\"erature\" & <b>";
    c.x.unit = "\xff\xfe";
    s[0].name = "name with \x01 control and caf\xc3\xa9";
    gc_chart_label l = { .x = 1.0, .y = 1.0, .text = "</text><script>", .marker = 1 };
    c.labels = &l;
    c.n_labels = 1;
    gc_chart_refline r = { .vertical = 1, .value = 1.5, .label = "a]]>b" };
    c.refs = &r;
    c.n_refs = 1;
    static const char *const caps[] = { "caption \xc0\xaf overlong" };
    c.captions = caps;
    c.n_captions = 1;
    doc d;
    if (render_doc(&c, "hostile-text", &d) == 0) {
        xmlNode *t = find_class(d.root->children, "gc-title");
        CU_ASSERT_PTR_NOT_NULL_FATAL(t);
        char *s1 = node_text(t);
        CU_ASSERT_STRING_EQUAL(s1, "<script>alert('x')</script>");
        free(s1);
        xmlNode *ax = find_id(d.root->children, "axis-x");
        CU_ASSERT_PTR_NOT_NULL_FATAL(ax);
        char *s2 = node_text(ax);
        CU_ASSERT_STRING_EQUAL(s2, "Temp\"erature\" & <b> [??]");
        free(s2);
        xmlNode *lt = find_class(d.root->children, "gc-label-text");
        CU_ASSERT_PTR_NOT_NULL_FATAL(lt);
        char *s3 = node_text(lt);
        CU_ASSERT_STRING_EQUAL(s3, "</text><script>");
        free(s3);
        xmlNode *cp = find_class(d.root->children, "gc-caption");
        CU_ASSERT_PTR_NOT_NULL_FATAL(cp);
        char *s4 = node_text(cp);
        CU_ASSERT_STRING_EQUAL(s4, "caption ?? overlong");
        free(s4);
        xmlNode *li = find_id(d.root->children, "legend-1");   /* control character: a space */
        CU_ASSERT_PTR_NOT_NULL_FATAL(li);
        char *s6 = node_text(li);
        CU_ASSERT_STRING_EQUAL(s6, "name with   control and caf\xc3\xa9");
        free(s6);
        xmlNode *rl = find_class(d.root->children, "gc-refline-label");
        CU_ASSERT_PTR_NOT_NULL_FATAL(rl);
        char *s7 = node_text(rl);
        CU_ASSERT_STRING_EQUAL(s7, "a]]>b");
        free(s7);
    }
    doc_free(&d);
    /* bar texts: category and value texts of 160 quotes each stay well-formed */
    static char quotes[300];
    memset(quotes, '"', sizeof quotes - 1);
    static const double bv[] = { 1.0, 2.0 };
    const char *cats[] = { quotes, "<b>" }, *vals[] = { quotes, NULL };
    gc_chart_series hb = { .kind = GC_CHART_HBARS, .n = 2, .x = bv, .text = cats,
                           .value_text = vals };
    gc_chart hc;
    gc_chart_init(&hc);
    hc.series = &hb;
    hc.n_series = 1;
    if (render_doc(&hc, NULL, &d) == 0) {
        xmlNode *v = find_class(find_id(d.root->children, "bar-1")->children, "gc-bar-value");
        CU_ASSERT_PTR_NOT_NULL_FATAL(v);
        char *s8 = node_text(v);
        CU_ASSERT_EQUAL(utf8_chars(s8), GC_CHART_TEXT_LEN);   /* 159 quotes and "…" */
        CU_ASSERT(strncmp(s8, "\"\"\"", 3) == 0);
        free(s8);
    }
    doc_free(&d);
    /* a very long title is cut with an ellipsis, never split inside a character */
    char longt[400];
    for (int i = 0; i < 199; i++)
        memcpy(longt + 2 * i, "\xc3\xa9", 2);
    longt[398] = '\0';
    c.title = longt;
    if (render_doc(&c, NULL, &d) == 0) {
        xmlNode *t = find_class(d.root->children, "gc-title");
        char *s5 = node_text(t);
        CU_ASSERT(utf8_chars(s5) <= GC_CHART_TEXT_LEN / 2 + 1);
        CU_ASSERT(strstr(s5, "\xe2\x80\xa6") != NULL);
        free(s5);
    }
    doc_free(&d);
}

/* The same chart twice: the same bytes (no clock, no randomness, no locale). */
static void test_deterministic(void)
{
    gc_chart c;
    gc_chart_series s[2];
    gc_chart_refline r[4];
    chart_hrr(&c, s, r, g_buf, 300);
    char *a = NULL, *b = NULL;
    size_t la = 0, lb = 0;
    CU_ASSERT_EQUAL_FATAL(gc_chart_svg(&c, &a, &la, NULL), GC_OK);
    CU_ASSERT_EQUAL_FATAL(gc_chart_svg(&c, &b, &lb, NULL), GC_OK);
    CU_ASSERT_EQUAL(la, lb);
    CU_ASSERT(la == lb && memcmp(a, b, la) == 0);
    free(a);
    free(b);
}

/* A chart at the limits renders and stays bounded in size. */
static void test_limits_render(void)
{
    static double xs[GC_CHART_MAX_POINTS], ys[GC_CHART_MAX_SERIES][GC_CHART_MAX_POINTS / 2];
    const int per = GC_CHART_MAX_TOTAL_POINTS / GC_CHART_MAX_SERIES;
    CU_ASSERT_FATAL(per <= GC_CHART_MAX_POINTS / 2);
    for (int i = 0; i < per; i++)
        xs[i] = i;
    gc_chart_series s[GC_CHART_MAX_SERIES];
    static char names[GC_CHART_MAX_SERIES][32];
    for (int k = 0; k < GC_CHART_MAX_SERIES; k++) {
        for (int i = 0; i < per; i++)
            ys[k][i] = sin(0.001 * i * (k + 1)) + k;
        snprintf(names[k], sizeof names[k], "series number %d", k + 1);
        s[k] = (gc_chart_series){ .kind = k % 2 ? GC_CHART_MARKERS : GC_CHART_LINE,
                                  .name = names[k], .n = per, .x = xs, .y = ys[k], .color = 0 };
    }
    gc_chart c;
    gc_chart_init(&c);
    c.series = s;
    c.n_series = GC_CHART_MAX_SERIES;
    c.width_px = GC_CHART_MIN_SIZE;
    c.height_px = 480;
    doc d;
    if (render_doc(&c, NULL, &d) == 0) {
        CU_ASSERT(d.len < 10u * 1024u * 1024u);
        fprintf(stderr, "  %d series x %d points: %zu bytes\n", GC_CHART_MAX_SERIES, per, d.len);
    }
    doc_free(&d);
}

/* ---- random charts ------------------------------------------------------------ */

static unsigned long long rng = 0x9E3779B97F4A7C15ull;

static double urand(void)   /* xorshift64*: the same sequence on every machine */
{
    rng ^= rng >> 12;
    rng ^= rng << 25;
    rng ^= rng >> 27;
    return (double)((rng * 2685821657736338717ull) >> 11) / 9007199254740992.0;
}

static int irand(int lo, int hi)
{
    return lo + (int)(urand() * (hi - lo + 1));
}

/* Values of one random series: a magnitude from 1e-12 to 1e12 (1e-280 to
 * 1e280 now and then), an offset, sometimes all equal, positive on log axes. */
static void random_values(double *v, int n, int log_axis)
{
    double mag = urand() < 0.05 ? pow(10.0, irand(-280, 280)) : pow(10.0, irand(-12, 12));
    double off = urand() < 0.3 ? mag * (urand() * 2000.0 - 1000.0) : 0.0;
    int flat = urand() < 0.05;
    for (int i = 0; i < n; i++) {
        double u = flat ? 0.5 : urand();
        v[i] = log_axis ? mag * (0.001 + u * u * 50.0) : off + mag * (u * 2.0 - 1.0);
    }
    if (urand() < 0.5)   /* ordered, like a sweep */
        for (int i = 1; i < n; i++)
            for (int k = i; k > 0 && v[k] < v[k - 1]; k--) {
                double t = v[k];
                v[k] = v[k - 1];
                v[k - 1] = t;
            }
}

static void random_axis(gc_chart_axis *a, const double *v, int n)
{
    a->scale = urand() < 0.3 ? GC_CHART_LOG : GC_CHART_LINEAR;
    (void)v;
    (void)n;
}

static void random_fixed(gc_chart_axis *a, const double *v, int n)
{
    double lo = v[0], hi = v[0];
    for (int i = 1; i < n; i++) {
        lo = fmin(lo, v[i]);
        hi = fmax(hi, v[i]);
    }
    if (urand() < 0.15) {
        a->fixed_min = 1;
        a->min = a->scale == GC_CHART_LOG ? lo * (0.5 + urand()) : lo + (hi - lo) * (urand() - 0.3);
    }
    if (urand() < 0.15) {
        a->fixed_max = 1;
        a->max = a->scale == GC_CHART_LOG ? hi * (0.5 + urand()) : hi - (hi - lo) * (urand() - 0.3);
    }
}

static const char *const words[] = {
    "Output", "heat rate", "caf\xc3\xa9", "<b>", "x & y", "\xff", "Quillmere unit 1",
    "a rather long legend entry that will need cutting somewhere", "T", "\xe2\x80\x89",
};

static const char *rword(void)
{
    return words[irand(0, (int)(sizeof words / sizeof words[0]) - 1)];
}

/* Hundreds of random charts: each renders (and passes every document check)
 * or is refused with GC_ERR_INVALID and a message; nothing else happens. */
static void test_random_charts(void)
{
    static double xs[4][300], ys[4][300];
    static const char *cats[GC_CHART_MAX_BARS];
    int ok = 0, refused = 0;
    for (int it = 0; it < 400; it++) {
        gc_chart c;
        gc_chart_series s[4];
        gc_chart_refline r[3];
        gc_chart_label l[6];
        static const char *caps[2];
        gc_chart_init(&c);
        memset(s, 0, sizeof s);
        c.width_px = urand() < 0.5 ? 0 : irand(GC_CHART_MIN_SIZE, 1600);
        c.height_px = urand() < 0.5 ? 0 : irand(GC_CHART_MIN_SIZE, 1200);
        c.title = urand() < 0.7 ? rword() : NULL;
        c.group_thousands = urand() < 0.8;
        random_axis(&c.x, NULL, 0);
        random_axis(&c.y, NULL, 0);
        random_axis(&c.y2, NULL, 0);
        c.x.title = rword();
        c.y.unit = urand() < 0.5 ? rword() : NULL;
        if (urand() < 0.1) {   /* a horizontal bar chart */
            int n = irand(1, 20);
            c.x.scale = GC_CHART_LINEAR;
            random_values(xs[0], n, 0);
            for (int i = 0; i < n; i++)
                cats[i] = rword();
            s[0] = (gc_chart_series){ .kind = GC_CHART_HBARS, .n = n, .x = xs[0], .text = cats,
                                      .name = rword(), .color = 0 };
            c.n_series = 1;
            c.value_digits = irand(0, 6);
        } else {
            c.has_y2 = urand() < 0.3;
            c.n_series = irand(1, 4);
            for (int k = 0; k < c.n_series; k++) {
                int n = irand(1, 300);
                int y2 = c.has_y2 && urand() < 0.5;
                static const gc_chart_kind kinds[] = { GC_CHART_LINE, GC_CHART_MARKERS,
                                                       GC_CHART_STEP, GC_CHART_VBARS,
                                                       GC_CHART_AREA };
                random_values(xs[k], n, c.x.scale == GC_CHART_LOG);
                random_values(ys[k], n, (y2 ? c.y2.scale : c.y.scale) == GC_CHART_LOG);
                s[k] = (gc_chart_series){ .kind = kinds[irand(0, 4)], .n = n, .x = xs[k],
                                          .y = ys[k], .y2 = y2, .show_marks = urand() < 0.3,
                                          .dash = (gc_chart_dash)irand(0, 2),
                                          .mark = (gc_chart_mark)irand(0, 4),
                                          .fill_to_base = urand() < 0.5, .color = irand(0, 10),
                                          .base = urand() < 0.5 ? 0.0 : ys[k][0],
                                          .name = urand() < 0.7 ? rword() : NULL };
            }
            random_fixed(&c.x, xs[0], s[0].n);
            random_fixed(&c.y, ys[0], s[0].n);
            c.n_labels = irand(0, 6);
            for (int i = 0; i < c.n_labels; i++) {
                const gc_chart_series *q = &s[irand(0, c.n_series - 1)];
                int j = irand(0, q->n - 1);
                l[i] = (gc_chart_label){ .x = q->x[j], .y = q->y[j], .y2 = q->y2,
                                         .text = rword(), .marker = urand() < 0.5 };
            }
            c.labels = l;
        }
        c.series = s;
        c.n_refs = irand(0, 3);
        for (int i = 0; i < c.n_refs; i++) {
            int vertical = c.series[0].kind == GC_CHART_HBARS || urand() < 0.5;
            const double *src = vertical ? xs[0] : ys[0];
            r[i] = (gc_chart_refline){ .vertical = vertical, .value = src[0], .label = rword(),
                                       .dash = (gc_chart_dash)irand(0, 2), .color = irand(0, 4),
                                       .y2 = !vertical && s[0].y2 };
        }
        c.refs = r;
        c.n_captions = irand(0, 2);
        for (int i = 0; i < c.n_captions; i++)
            caps[i] = rword();
        c.captions = caps;

        char *svg = NULL;
        size_t len = 0;
        gc_error err;
        gc_error_clear(&err);
        int rc = gc_chart_svg(&c, &svg, &len, &err);
        free(svg);
        if (rc == GC_OK) {
            doc d;
            if (render_doc(&c, NULL, &d) == 0)
                ok++;
            doc_free(&d);
        } else {
            if (rc != GC_ERR_INVALID || !err.message[0])
                fprintf(stderr, "random chart %d: status %d, '%s'\n", it, rc, err.message);
            CU_ASSERT(rc == GC_ERR_INVALID && err.message[0]);
            fprintf(stderr, "  refused: %s\n", err.message);
            refused++;
        }
    }
    fprintf(stderr, "  random charts: %d drawn, %d refused\n", ok, refused);
    CU_ASSERT(ok >= 300);
}

/* <build>/chart-examples next to the test binary (build/tests/unit/x). */
static void examples_setup(const char *argv0)
{
    const char *env = getenv("GC_CHART_EXAMPLES");
    if (env) {
        snprintf(examples_dir, sizeof examples_dir, "%s", env);
    } else {
        snprintf(examples_dir, sizeof examples_dir, "%s", argv0);
        char *p = strstr(examples_dir, "/tests/unit/");
        if (!p) {
            examples_dir[0] = '\0';
            return;
        }
        strcpy(p, "/chart-examples");
    }
    if (examples_dir[0] && mkdir(examples_dir, 0755) != 0 && errno != EEXIST)
        examples_dir[0] = '\0';
    if (examples_dir[0])
        fprintf(stderr, "chart examples in %s\n", examples_dir);
}

int main(int argc, char **argv)
{
    (void)argc;
    LIBXML_TEST_VERSION
    examples_setup(argv[0]);
    static const gc_test_case tests[] = {
        { "number formatting", test_format_numbers },
        { "text escaping", test_escape },
        { "correction curves, two y axes", test_correction_curves },
        { "uncertainty budget, horizontal bars", test_budget_bars },
        { "P-V and log P - log V", test_pv_log },
        { "heat release and mass fraction burned", test_heat_release },
        { "IMEP scatter", test_imep_scatter },
        { "T-Q and steam T-s with the dome", test_tq_and_steam },
        { "vertical bars and step line", test_vbars_and_step },
        { "state labels of a regenerative Brayton cycle", test_labels_regenerative_brayton },
        { "label clusters", test_labels_clusters },
        { "clipping", test_clipping },
        { "tick labels", test_tick_labels },
        { "refusals and limits", test_refusals },
        { "hostile text", test_hostile_text },
        { "deterministic output", test_deterministic },
        { "largest chart", test_limits_render },
        { "random charts", test_random_charts },
        { NULL, NULL },
    };
    int rc = gc_run_suite("chart", tests);
    xmlCleanupParser();
    return rc;
}
