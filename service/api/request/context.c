/*
 * context.c — completing the readings that need more than their own text
 * (decode.h, "readings in context"), once the whole request is decoded:
 *
 *   gauge pressure  absolute = gauge + the barometric pressure, taken from
 *                   the request's site (its pressure; else the U.S. Standard
 *                   Atmosphere 1976 at its altitude; else the site's ISO
 *                   reference 101.325 kPa), or on a route without a site
 *                   from its own ambient_pressure or intake_pressure input,
 *                   else the standard atmosphere at sea level (101.325 kPa).
 *   standard volume mass flow = volume flow x the ideal-gas density of the
 *                   request's (gaseous) fuel at the named conditions
 *                   (units.h: gc_units_std_density); for fuel flows only.
 *
 * The completed value is checked against its row's bounds like any other
 * (the message in the unit it was written in). What was used goes into the
 * context for the echo: "barometric_pressure" and its source,
 * "standard_conditions" and "fuel_density_standard".
 */
#include "api/request/fields.h"
#include "api/respond/localise.h"
#include "gascycle/atmosphere.h"
#include "gascycle/combustion.h"
#include "gascycle/site.h"

#include <stddef.h>
#include <stdio.h>
#include <string.h>

#define STD_ATM_PA 101325.0   /* U.S. Standard Atmosphere 1976 at sea level, Pa */

/* Everything zero but the two tables (about 8 KB, once per request): their
 * entries are only read below n and n_written, and each is written whole
 * when added. */
void gc_decode_ctx_init(gc_decode_ctx *c)
{
    memset(c, 0, offsetof(gc_decode_ctx, d));
    c->n_written = 0;
    memset((char *)c + offsetof(gc_decode_ctx, baro_used), 0,
           sizeof *c - offsetof(gc_decode_ctx, baro_used));
    c->opts.input_sys = GC_UNITS_SI;
}

const char *gc_decode_ctx_unit(const gc_decode_ctx *c, const char *pointer)
{
    for (int i = 0; c && i < c->n_written; i++)
        if (strcmp(c->written[i].pointer, pointer) == 0)
            return c->written[i].unit;
    return NULL;
}

static int deferred(const gc_decode_ctx *c, const void *target)
{
    for (int i = 0; i < c->n; i++)
        if (c->d[i].target == target)
            return 1;
    return 0;
}

/* ---- the barometric pressure of a preset's request ------------------------------------ */

static int row_given(const gc_field *f, const char *input)
{
    return f->given ? *(const int *)(const void *)(input + f->given - 1) != 0 : 1;
}

/* From the site row: its pressure, the standard atmosphere at its altitude,
 * or its ISO reference. */
static double site_baro(const gc_preset *p, int site, const char *input, const gc_decode_ctx *c,
                        const char **src)
{
    int pr = gc_preset_child(p, site, "pressure"), ar = gc_preset_child(p, site, "altitude");
    if (pr > 0 && row_given(&p->fields[pr], input) &&
        !deferred(c, input + p->fields[pr].offset)) {
        *src = "site_pressure";
        return *(const double *)(const void *)(input + p->fields[pr].offset);
    }
    double T, P;
    if (ar > 0 && row_given(&p->fields[ar], input) &&
        gc_atm_1976(*(const double *)(const void *)(input + p->fields[ar].offset), &T, &P,
                    NULL) == GC_OK) {
        *src = "site_altitude";
        return P;
    }
    *src = "site_default";
    return GC_SITE_ISO_P_PA;
}

static double preset_baro(const gc_preset *p, const char *input, const gc_decode_ctx *c,
                          const char **src)
{
    static const char *const own[] = { "ambient_pressure", "intake_pressure" };
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (f->name && f->parent == 0 && f->type == GC_FT_OBJECT && (f->flags & GC_FF_SITE))
            return site_baro(p, r, input, c, src);
    }
    for (size_t k = 0; k < sizeof own / sizeof own[0]; k++) {
        int r = gc_preset_child(p, 0, own[k]);
        if (r > 0 && p->fields[r].type == GC_FT_NUMBER &&
            !deferred(c, input + p->fields[r].offset) && row_given(&p->fields[r], input)) {
            double v = *(const double *)(const void *)(input + p->fields[r].offset);
            if (v > 0.0) {
                *src = own[k];
                return v;
            }
        }
    }
    *src = "standard_atmosphere";
    return STD_ATM_PA;
}

/* ---- the fuel's density at standard conditions ----------------------------------------- */

static int fuel_density(const gc_preset *p, const char *input, const gc_decode_deferred *x,
                        double *rho, gc_api_errors *errs)
{
    if (!x->row || !strstr(x->row->name, "fuel")) {
        gc_api_errors_add(errs, x->pointer, "'%s' is a volume flow at standard conditions, which "
                          "is read for fuel flows only (from the fuel's density); give a mass "
                          "flow (kg/s, lbm/h)", x->r.unit);
        return -1;
    }
    for (int r = 1; r < p->n_fields; r++) {
        const gc_field *f = &p->fields[r];
        if (!f->name || f->parent != 0 || f->type != GC_FT_FUEL)
            continue;
        const gc_fuel *fu = (const gc_fuel *)(const void *)(input + f->offset);
        if (fu->kind == GC_FUEL_GAS && fu->M_kg_per_mol > 0.0) {
            *rho = gc_units_std_density(x->r.cond, fu->M_kg_per_mol);
            return 0;
        }
        gc_api_errors_add(errs, x->pointer, "'%s' needs the density of a gaseous fuel at "
                          "standard conditions: give the fuel as a gas (a name or an analysis), "
                          "or the flow as a mass flow", x->r.unit);
        return -1;
    }
    gc_api_errors_add(errs, x->pointer, "'%s' needs the fuel's density at standard conditions, "
                      "and this route has no fuel: give a mass flow (kg/s, lbm/h)", x->r.unit);
    return -1;
}

/* ---- completing ---------------------------------------------------------------------------- */

/* The bounds of the completed value (row or spec); 0, or -1 with the error. */
static int bounds(gc_decoder *d, const gc_decode_deferred *x, double v)
{
    gc_error e;
    gc_error_clear(&e);
    if (x->row) {
        if (gc_field_check_value(x->row, v, &e) == GC_OK)
            return 0;
        gc_decode_range_error(d, x->pointer, x->row->quantity, e.message);
        return -1;
    }
    return x->spec ? gc_decode_check_spec(d, x->pointer, x->spec, v) : 0;
}

static void note_baro(gc_decode_ctx *c, double P, const char *src)
{
    if (c->baro_used)
        return;
    c->baro_used = 1;
    c->baro_Pa = P;
    c->baro_source = src;
}

static int complete_one(gc_decoder *d, const gc_preset *p, char *input, gc_decode_deferred *x)
{
    gc_decode_ctx *c = d->ctx;
    double v;
    if (x->r.kind == GC_READING_GAUGE) {
        const char *src = "standard_atmosphere";
        double baro = p ? preset_baro(p, input, c, &src) : STD_ATM_PA;
        if (p && x->row && x->row->parent > 0 && (p->fields[x->row->parent].flags & GC_FF_SITE)) {
            gc_decode_error(d, x->pointer, "the site pressure is the barometric pressure itself: "
                            "give it absolute ('kPa', 'bar', 'psia', 'inHg')");
            return -1;
        }
        v = x->r.si + baro;
        note_baro(c, baro, src);
    } else {
        double rho = 0.0;
        if (!p || fuel_density(p, input, x, &rho, d->errs) != 0) {
            if (!p)
                gc_decode_error(d, x->pointer, "'%s' is a volume flow at standard conditions; "
                                "this route has no fuel to give its density", x->r.unit);
            return -1;
        }
        v = x->r.si * rho;
        if (!c->std_used) {
            c->std_used = 1;
            c->std_cond = x->r.cond;
            c->std_density = rho;
        }
    }
    if (bounds(d, x, v) != 0)
        return -1;
    *x->target = v;
    if (x->echo && d->out)
        gc_out_q(d->out, x->echo, x->echo_key, v, x->spec ? x->spec->quantity : GC_Q_PRESSURE);
    return 0;
}

int gc_decode_ctx_complete(gc_decoder *d, const gc_preset *p, void *input)
{
    int bad = 0;
    if (!d->ctx)
        return 0;
    for (int i = 0; i < d->ctx->n; i++)
        bad += complete_one(d, p, input, &d->ctx->d[i]) != 0;
    d->ctx->n = 0;
    return bad;
}
