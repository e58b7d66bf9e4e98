/*
 * chart_label.c — reference lines and point labels of a chart (chart.h).
 *
 * Reference lines cross the whole plot; a vertical line's label sits at the
 * top beside it (moved down a row at a time, up to 6 rows, while it would
 * overlap an earlier reference label), a horizontal line's label at the
 * right end above it (below when there is no room above; moved left by its
 * own width while it overlaps). Lines outside the axis range are left out.
 *
 * Point labels (e.g. state numbers): a simple deterministic placement. Each
 * label's box (chart.h's text-box estimate, plus 2 px) is tried in 8
 * directions around its point — ordered by how well they point away from the
 * centroid of all labelled points, so labels fall outside a cycle's loop —
 * at 3 distances from the point's marker (rings one box size apart); the first position inside
 * the plot that overlaps no earlier label box, no reference-line label and no
 * label marker is kept. When none is free, the position with the least
 * overlap (area outside the plot counting ten-fold) is kept. A label placed
 * beyond the nearest ring gets a thin leader line to its point. Labels of
 * points outside the axis ranges are left out.
 */
#include "chart_internal.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

int gc__chart_box_overlap(const gc__chart_box *a, const gc__chart_box *b)
{
    return a->x0 < b->x1 && b->x0 < a->x1 && a->y0 < b->y1 && b->y0 < a->y1;
}

static double overlap_area(const gc__chart_box *a, const gc__chart_box *b)
{
    double w = fmin(a->x1, b->x1) - fmax(a->x0, b->x0);
    double h = fmin(a->y1, b->y1) - fmax(a->y0, b->y0);
    return w > 0.0 && h > 0.0 ? w * h : 0.0;
}

static int box_inside(const gc__chart_ctx *x, const gc__chart_box *a)
{
    return a->x0 >= x->px0 && a->x1 <= x->px0 + x->pw && a->y0 >= x->py0 &&
           a->y1 <= x->py0 + x->ph;
}

static double outside_area(const gc__chart_ctx *x, const gc__chart_box *a)
{
    gc__chart_box plot = { x->px0, x->py0, x->px0 + x->pw, x->py0 + x->ph };
    return (a->x1 - a->x0) * (a->y1 - a->y0) - overlap_area(a, &plot);
}

static void attr_num(gc_strbuf *b, const char *name, double v)
{
    gc_strbuf_printf(b, " %s=\"", name);
    gc__chart_num(b, v);
    gc_strbuf_ch(b, '"');
}

static int in_range(const gc__chart_axis *a, double d)
{
    double tol = 1e-9 * (a->hi - a->lo);
    return d >= a->lo - tol && d <= a->hi + tol;
}

/* ---- reference lines ----------------------------------------------------- */

/* The label box of reference line r at px p: candidate k (0..5). */
static gc__chart_box ref_candidate(const gc__chart_ctx *x, const gc_chart_refline *r, double p,
                                   double w, double h, int k)
{
    double sc = x->scale;
    gc__chart_box bx;
    if (r->vertical) {
        double left = p + 4.0 * sc;
        if (left + w > x->px0 + x->pw)
            left = p - 4.0 * sc - w;
        bx.x0 = left;
        bx.y0 = x->py0 + 3.0 * sc + k * (h + 2.0 * sc);
    } else {
        bx.x0 = x->px0 + x->pw - 4.0 * sc - w - k * (w + 8.0 * sc);
        bx.y0 = p - 3.0 * sc - h;
        if (bx.y0 < x->py0)
            bx.y0 = p + 3.0 * sc;
    }
    bx.x1 = bx.x0 + w;
    bx.y1 = bx.y0 + h;
    return bx;
}

static void ref_label(gc__chart_ctx *x, const gc_chart_refline *r, double p, double fsr)
{
    double w = (double)gc_chart_text_chars(r->label, GC_CHART_TEXT_LEN) * GC_CHART_CHAR_EM * fsr;
    double h = (GC_CHART_ASCENT_EM + GC_CHART_DESCENT_EM) * fsr;
    gc__chart_box bx = ref_candidate(x, r, p, w, h, 0);
    for (int k = 0; k < 6; k++) {
        gc__chart_box c = ref_candidate(x, r, p, w, h, k);
        int free_ = 1;
        for (int j = 0; j < x->n_ref_boxes; j++)
            free_ &= !gc__chart_box_overlap(&c, &x->ref_boxes[j]);
        if (free_) {
            bx = c;
            break;
        }
    }
    if (x->n_ref_boxes < GC_CHART_MAX_REFLINES)
        x->ref_boxes[x->n_ref_boxes++] = bx;
    gc_strbuf *b = x->b;
    gc_strbuf_puts(b, "<rect class=\"gc-refline-label-bg\" fill=\"#ffffff\" fill-opacity=\"0.8\"");
    attr_num(b, "x", bx.x0 - 1.0);
    attr_num(b, "y", bx.y0);
    attr_num(b, "width", w + 2.0);
    attr_num(b, "height", h);
    gc_strbuf_puts(b, "/><text class=\"gc-refline-label\"");
    attr_num(b, "x", bx.x0);
    attr_num(b, "y", bx.y0 + GC_CHART_ASCENT_EM * fsr);
    gc_strbuf_ch(b, '>');
    gc__chart_text_cut(b, r->label, INFINITY);
    gc_strbuf_puts(b, "</text>");
}

int gc__chart_reflines(gc__chart_ctx *x)
{
    const gc_chart *c = x->c;
    if (c->n_refs == 0)
        return GC_OK;
    gc_strbuf *b = x->b;
    double fsr = 0.88 * x->fs;
    gc_strbuf_puts(b, "<g class=\"gc-reflines\" font-size=\"");
    gc__chart_num(b, fsr);
    gc_strbuf_puts(b, "\">\n");
    for (int i = 0; i < c->n_refs; i++) {
        const gc_chart_refline *r = &c->refs[i];
        const gc__chart_axis *a = r->vertical ? &x->ax : r->y2 ? &x->ay2 : &x->ay;
        double d = gc__chart_disp(a, r->value);
        if (!in_range(a, d))
            continue;
        double p = gc__chart_px(a, fmin(fmax(d, a->lo), a->hi));
        const char *col = r->color >= 1 ? gc__chart_color(r->color, 0) : GC__CHART_COL_REF;
        gc_strbuf_printf(b, "<g class=\"gc-refline\" id=\"ref-%d\" fill=\"%s\">", i + 1, col);
        gc_strbuf_printf(b, "<path stroke=\"%s\" stroke-width=\"1.3\"%s d=\"M", col,
                         gc__chart_dash_attr(r->dash));
        if (r->vertical) {
            gc__chart_num(b, p);
            gc_strbuf_ch(b, ',');
            gc__chart_num(b, x->py0);
            gc_strbuf_puts(b, " L");
            gc__chart_num(b, p);
            gc_strbuf_ch(b, ',');
            gc__chart_num(b, x->py0 + x->ph);
        } else {
            gc__chart_num(b, x->px0);
            gc_strbuf_ch(b, ',');
            gc__chart_num(b, p);
            gc_strbuf_puts(b, " L");
            gc__chart_num(b, x->px0 + x->pw);
            gc_strbuf_ch(b, ',');
            gc__chart_num(b, p);
        }
        gc_strbuf_puts(b, "\"/>");
        if (r->label && *r->label)
            ref_label(x, r, p, fsr);
        gc_strbuf_puts(b, "</g>\n");
    }
    gc_strbuf_puts(b, "</g>\n");
    return GC_OK;
}

/* ---- point labels -------------------------------------------------------- */

typedef struct lpoint {
    double px, py, r;           /* point and the radius it keeps clear, px */
    int visible;
} lpoint;

static const int dirs[8][2] = {
    { 1, 0 }, { 1, -1 }, { 0, -1 }, { -1, -1 }, { -1, 0 }, { -1, 1 }, { 0, 1 }, { 1, 1 },
};

/* The 8 directions ordered by alignment with (ox, oy), ties in table order. */
static void order_dirs(double ox, double oy, int order[8])
{
    double score[8];
    for (int i = 0; i < 8; i++) {
        double n = hypot((double)dirs[i][0], (double)dirs[i][1]);
        score[i] = (ox * dirs[i][0] + oy * dirs[i][1]) / n;
        order[i] = i;
    }
    for (int i = 1; i < 8; i++) {   /* stable insertion sort, best first */
        int k = order[i], j = i - 1;
        while (j >= 0 && score[order[j]] < score[k] - 1e-12) {
            order[j + 1] = order[j];
            j--;
        }
        order[j + 1] = k;
    }
}

static gc__chart_box candidate(const lpoint *p, int dir, double gap, double w, double h)
{
    double ux = dirs[dir][0], uy = dirs[dir][1];
    double cx = p->px + ux * (p->r + gap + w / 2.0);
    double cy = p->py + uy * (p->r + gap + h / 2.0);
    gc__chart_box bx = { cx - w / 2.0, cy - h / 2.0, cx + w / 2.0, cy + h / 2.0 };
    return bx;
}

static double penalty(const gc__chart_ctx *x, const gc__chart_box *c, const gc__chart_box *taken,
                      int n_taken)
{
    double pen = 10.0 * outside_area(x, c);
    for (int j = 0; j < n_taken; j++)
        pen += overlap_area(c, &taken[j]);
    return pen;
}

/* Best box for label i; *ring gets the distance index used. */
static gc__chart_box place(const gc__chart_ctx *x, const lpoint *p, double w, double h,
                           const int order[8], const gc__chart_box *taken, int n_taken, int *ring)
{
    /* rings one box apart, so two labels in one direction never overlap */
    double step = 1.1 * fmax(w, h);
    const double gaps[3] = { 2.0 * x->scale, 2.0 * x->scale + step, 2.0 * x->scale + 2.0 * step };
    gc__chart_box best = candidate(p, order[0], gaps[0], w, h);
    double best_pen = INFINITY;
    *ring = 0;
    for (int g = 0; g < 3; g++) {
        for (int k = 0; k < 8; k++) {
            gc__chart_box c = candidate(p, order[k], gaps[g], w, h);
            double pen = penalty(x, &c, taken, n_taken);
            if (pen == 0.0 && box_inside(x, &c)) {
                *ring = g;
                return c;
            }
            if (pen < best_pen) {
                best_pen = pen;
                best = c;
                *ring = g;
            }
        }
    }
    return best;
}

static void label_out(gc__chart_ctx *x, int i, const lpoint *p, const gc__chart_box *bx, int ring,
                      double fsl)
{
    const gc_chart_label *l = &x->c->labels[i];
    gc_strbuf *b = x->b;
    gc_strbuf_printf(b, "<g class=\"gc-label\" id=\"label-%d\">", i + 1);
    if (l->marker) {
        gc_strbuf_puts(b, "<circle class=\"gc-label-mark\" fill=\"#ffffff\" stroke=\""
                       GC__CHART_COL_TEXT "\" stroke-width=\"1.8\"");
        attr_num(b, "cx", p->px);
        attr_num(b, "cy", p->py);
        attr_num(b, "r", 0.8 * p->r);
        gc_strbuf_puts(b, "/>");
    }
    double cx = 0.5 * (bx->x0 + bx->x1), cy = 0.5 * (bx->y0 + bx->y1);
    if (ring > 0) {   /* leader from the marker's edge to the nearest point of the box */
        double ex = fmin(fmax(p->px, bx->x0), bx->x1), ey = fmin(fmax(p->py, bx->y0), bx->y1);
        double d = hypot(ex - p->px, ey - p->py);
        if (d > p->r) {
            double sx = p->px + (ex - p->px) / d * p->r, sy = p->py + (ey - p->py) / d * p->r;
            gc_strbuf_puts(b, "<line class=\"gc-leader\" stroke=\"" GC__CHART_COL_FRAME
                           "\" stroke-width=\"0.8\"");
            attr_num(b, "x1", sx);
            attr_num(b, "y1", sy);
            attr_num(b, "x2", ex);
            attr_num(b, "y2", ey);
            gc_strbuf_puts(b, "/>");
        }
    }
    gc_strbuf_puts(b, "<text class=\"gc-label-text\" text-anchor=\"middle\"");
    attr_num(b, "x", cx);
    attr_num(b, "y", cy + 0.5 * (GC_CHART_ASCENT_EM - GC_CHART_DESCENT_EM) * fsl);
    gc_strbuf_ch(b, '>');
    gc__chart_text_cut(b, l->text, INFINITY);
    gc_strbuf_puts(b, "</text></g>\n");
}

/* Points of the labels in px; the centroid of the visible ones. */
static int label_points(const gc__chart_ctx *x, lpoint *lp, double *gx, double *gy)
{
    int nvis = 0;
    *gx = *gy = 0.0;
    for (int i = 0; i < x->c->n_labels; i++) {
        const gc_chart_label *l = &x->c->labels[i];
        const gc__chart_axis *ay = l->y2 ? &x->ay2 : &x->ay;
        double dx = gc__chart_disp(&x->ax, l->x), dy = gc__chart_disp(ay, l->y);
        lp[i].visible = in_range(&x->ax, dx) && in_range(ay, dy);
        lp[i].px = gc__chart_px(&x->ax, fmin(fmax(dx, x->ax.lo), x->ax.hi));
        lp[i].py = gc__chart_px(ay, fmin(fmax(dy, ay->lo), ay->hi));
        lp[i].r = (l->marker ? 5.6 : 2.0) * x->scale;
        if (lp[i].visible) {
            *gx += lp[i].px;
            *gy += lp[i].py;
            nvis++;
        }
    }
    if (nvis > 0) {
        *gx /= nvis;
        *gy /= nvis;
    }
    return nvis;
}

int gc__chart_labels(gc__chart_ctx *x)
{
    const gc_chart *c = x->c;
    if (c->n_labels == 0)
        return GC_OK;
    lpoint lp[GC_CHART_MAX_LABELS];
    gc__chart_box taken[2 * GC_CHART_MAX_LABELS + GC_CHART_MAX_REFLINES];
    int n_taken = 0;
    double gx, gy;
    label_points(x, lp, &gx, &gy);
    for (int j = 0; j < x->n_ref_boxes; j++)
        taken[n_taken++] = x->ref_boxes[j];
    for (int i = 0; i < c->n_labels; i++) {   /* every marker is kept clear first */
        if (!lp[i].visible)
            continue;
        gc__chart_box m = { lp[i].px - lp[i].r, lp[i].py - lp[i].r, lp[i].px + lp[i].r,
                            lp[i].py + lp[i].r };
        taken[n_taken++] = m;
    }
    double fsl = x->fs;
    gc_strbuf_puts(x->b, "<g class=\"gc-labels\" font-weight=\"bold\" font-size=\"");
    gc__chart_num(x->b, fsl);
    gc_strbuf_puts(x->b, "\">\n");
    for (int i = 0; i < c->n_labels; i++) {
        if (!lp[i].visible)
            continue;
        double ox = lp[i].px - gx, oy = lp[i].py - gy, on = hypot(ox, oy);
        if (on < 1.0) {
            ox = 0.0;
            oy = -1.0;
        }
        int order[8], ring;
        order_dirs(ox, oy, order);
        double chars = (double)gc_chart_text_chars(c->labels[i].text, GC_CHART_TEXT_LEN);
        double w = chars * GC_CHART_CHAR_EM * fsl + 2.0 * x->scale;
        double h = (GC_CHART_ASCENT_EM + GC_CHART_DESCENT_EM) * fsl + 2.0 * x->scale;
        gc__chart_box bx = place(x, &lp[i], w, h, order, taken, n_taken, &ring);
        taken[n_taken++] = bx;
        label_out(x, i, &lp[i], &bx, ring, fsl);
    }
    gc_strbuf_puts(x->b, "</g>\n");
    return GC_OK;
}
