/*
 * water.c — GET|POST /v1/properties/water: water and steam properties by
 * IAPWS-IF97 (IAPWS R7-97(2012), the core's if97.h, no other steam
 * library).
 *
 * Inputs: two of T, P, h, s, x as one of the pairs (T, P) single phase,
 * (P, h), (P, s) single phase or a two-phase mixture, (P, x), (T, x) a
 * saturated mixture of quality x; or T or P alone: the saturated liquid and
 * vapour at that temperature or pressure.
 * Output: "state" (T, P, v, rho, u, h, s; cp, cv, w of a single phase or a
 * saturated phase; x on or inside the dome; the IF97 region; the phase) for
 * a pair; "saturation" (T, P) and "states" (the saturated liquid and
 * vapour) for one input. Reference state of IF97: u = 0 and s = 0 for the
 * saturated liquid at the triple point (273.16 K, 611.657 Pa).
 * Range (if97.h): 273.15..1073.15 K up to 100 MPa, 1073.15..2273.15 K up to
 * 50 MPa; saturated states up to 50 Pa below the critical pressure. Outside
 * it a 422 naming the input and the bound; nothing is extrapolated.
 */
#include "api/request/decode.h"
#include "api/respond/localise.h"
#include "api/handlers.h"
#include "api/respond/output.h"
#include "gascycle/if97.h"

#include <stddef.h>
#include <stdio.h>
#include <string.h>

typedef struct water_req {
    double T_K, P_Pa, h_J_per_kg, s_J_per_kgK, x;
    int has_T, has_P, has_h, has_s, has_x;
} water_req;

static const gc_field_spec water_fields[] = {
    GC_F_NUM("T", GC_Q_TEMPERATURE, water_req, T_K,
             .flags = GC_F_NO_DEFAULT | GC_F_MIN | GC_F_MIN_EXCL, .min = 0.0,
             .present = GC_PRESENT(water_req, has_T), .description = "temperature"),
    GC_F_NUM("P", GC_Q_PRESSURE, water_req, P_Pa,
             .flags = GC_F_NO_DEFAULT | GC_F_MIN | GC_F_MIN_EXCL, .min = 0.0,
             .present = GC_PRESENT(water_req, has_P), .description = "absolute pressure"),
    GC_F_NUM("h", GC_Q_SPECIFIC_ENERGY, water_req, h_J_per_kg, .flags = GC_F_NO_DEFAULT,
             .present = GC_PRESENT(water_req, has_h),
             .description = "specific enthalpy (IF97 basis)"),
    GC_F_NUM("s", GC_Q_SPECIFIC_ENTROPY, water_req, s_J_per_kgK, .flags = GC_F_NO_DEFAULT,
             .present = GC_PRESENT(water_req, has_s),
             .description = "specific entropy (IF97 basis)"),
    GC_F_NUM("x", GC_Q_FRACTION, water_req, x,
             .flags = GC_F_NO_DEFAULT | GC_F_MIN | GC_F_MAX, .min = 0.0, .max = 1.0,
             .present = GC_PRESENT(water_req, has_x),
             .description = "quality (vapour mass fraction) of a saturated mixture"),
    GC_F_END
};

enum { PAIR_TP = 0, PAIR_PH, PAIR_PS, PAIR_PX, PAIR_TX, SAT_T, SAT_P, PAIR_NONE };

/* Which inputs were given, as one of the routes above. */
static int pair_of(const water_req *r)
{
    int n = r->has_T + r->has_P + r->has_h + r->has_s + r->has_x;
    if (n == 1 && r->has_T)
        return SAT_T;
    if (n == 1 && r->has_P)
        return SAT_P;
    if (n != 2)
        return PAIR_NONE;
    if (r->has_T && r->has_P)
        return PAIR_TP;
    if (r->has_P && r->has_h)
        return PAIR_PH;
    if (r->has_P && r->has_s)
        return PAIR_PS;
    if (r->has_P && r->has_x)
        return PAIR_PX;
    if (r->has_T && r->has_x)
        return PAIR_TX;
    return PAIR_NONE;
}

/* The input a 422 names: the core's own ("/T", "/h" ...), else the first given. */
static const char *first_given(const water_req *r)
{
    return r->has_T ? "/T" : r->has_P ? "/P" : r->has_h ? "/h" : r->has_s ? "/s"
                                                                     : r->has_x ? "/x" : "";
}

/* The quantity of an input by its pointer. */
static int quantity_of(const char *field)
{
    static const struct { const char *field; int q; } q[] = {
        { "/T", GC_Q_TEMPERATURE }, { "/P", GC_Q_PRESSURE }, { "/h", GC_Q_SPECIFIC_ENERGY },
        { "/s", GC_Q_SPECIFIC_ENTROPY }, { "/x", GC_Q_FRACTION },
    };
    for (size_t i = 0; i < sizeof q / sizeof q[0]; i++)
        if (strcmp(field, q[i].field) == 0)
            return q[i].q;
    return -1;
}

/* A 422 naming field; the message's figures in the unit the user wrote the
 * value in (or its input unit system). */
static int problem(gc_api_response *resp, gc_out *out, int status, const char *cls,
                   const char *title, const char *field, const char *message)
{
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    char msg[GC_API_MESSAGE_LEN];
    int q = quantity_of(field);
    const char *written = json_string_value(json_object_get(out->written, field));
    if (!written && q >= 0 && out->input_sys == GC_UNITS_US)
        written = gc_units_label((gc_quantity)q, GC_UNITS_US);
    snprintf(msg, sizeof msg, "%s", message);
    gc_api_localise(msg, sizeof msg, q, written, out->sys);
    gc_api_errors_add(&errs, field, "%s", msg);
    gc_api_problem_errors(resp, status, cls, title, NULL, &errs);
    gc_out_free(out);
    return 0;
}

static const char *phase_of(const gc_if97_state *st)
{
    if (st->x == 0.0)
        return "saturated_liquid";
    if (st->x == 1.0)
        return "saturated_vapour";
    if (st->x > 0.0)
        return "two_phase";
    if (st->P_Pa > GC_IF97_PC_PA && st->T_K > GC_IF97_TC_K)
        return "supercritical";
    return st->region == 2 || st->region == 5 ? "vapour" : "liquid";
}

static json_t *state_part(gc_out *out, const gc_if97_state *st)
{
    json_t *p = json_object();
    json_object_set_new(p, "phase", json_string(phase_of(st)));
    json_object_set_new(p, "region", json_integer(st->region));
    gc_out_q(out, p, "T", st->T_K, GC_Q_TEMPERATURE);
    gc_out_q(out, p, "P", st->P_Pa, GC_Q_PRESSURE);
    gc_out_q(out, p, "v", st->v_m3_per_kg, GC_Q_SPECIFIC_VOLUME);
    gc_out_q(out, p, "rho", st->rho_kg_per_m3, GC_Q_DENSITY);
    gc_out_q(out, p, "u", st->u_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(out, p, "h", st->h_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    gc_out_q(out, p, "s", st->s_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
    if (!(st->x > 0.0 && st->x < 1.0)) {   /* not defined for a two-phase mixture */
        gc_out_q(out, p, "cp", st->cp_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
        gc_out_q(out, p, "cv", st->cv_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
        gc_out_q(out, p, "w", st->w_m_per_s, GC_Q_VELOCITY);
    }
    if (st->x >= 0.0)
        gc_out_num(out, p, "x", st->x);
    return p;
}

static int evaluate_pair(const water_req *r, int pair, gc_if97_state *st, gc_error *err)
{
    switch (pair) {
    case PAIR_TP: return gc_if97_state_TP(r->T_K, r->P_Pa, st, err);
    case PAIR_PH: return gc_if97_state_Ph(r->P_Pa, r->h_J_per_kg, st, err);
    case PAIR_PS: return gc_if97_state_Ps(r->P_Pa, r->s_J_per_kgK, st, err);
    case PAIR_PX: return gc_if97_state_Px(r->P_Pa, r->x, st, err);
    default: return gc_if97_state_Tx(r->T_K, r->x, st, err);
    }
}

/* The document of a pair, or of a saturation (liquid and vapour). */
static int build(gc_out *out, json_t *doc, const water_req *r, int pair, gc_error *err)
{
    if (pair != SAT_T && pair != SAT_P) {
        gc_if97_state st;
        int rc = evaluate_pair(r, pair, &st, err);
        if (rc == GC_OK) {
            json_object_set_new(doc, "state", state_part(out, &st));
            out->csv_row = "state";
        }
        return rc;
    }
    gc_if97_state liq, vap;
    int rc = pair == SAT_T ? gc_if97_sat_T(r->T_K, &liq, &vap, err)
                           : gc_if97_sat_P(r->P_Pa, &liq, &vap, err);
    if (rc != GC_OK)
        return rc;
    json_t *sat = json_object();
    gc_out_q(out, sat, "T", liq.T_K, GC_Q_TEMPERATURE);
    gc_out_q(out, sat, "P", liq.P_Pa, GC_Q_PRESSURE);
    gc_out_q(out, sat, "h_fg", vap.h_J_per_kg - liq.h_J_per_kg, GC_Q_SPECIFIC_ENERGY);
    json_object_set_new(doc, "saturation", sat);
    json_t *states = json_array();
    json_array_append_new(states, state_part(out, &liq));
    json_array_append_new(states, state_part(out, &vap));
    json_object_set_new(doc, "states", states);
    return GC_OK;
}

int gc_api_h_water(const gc_api_request *req, gc_api_response *resp)
{
    gc_out out;
    if (gc_out_init(&out) != 0)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    water_req r;
    memset(&r, 0, sizeof r);
    if (gc_decode_request(req, water_fields, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_CSV |
                          GC_OUT_ACCEPT_SELECT | GC_OUT_ACCEPT_READ, &r, &out, resp) != 0) {
        gc_out_free(&out);
        return 0;
    }
    int pair = pair_of(&r);
    if (pair == PAIR_NONE)
        return problem(resp, &out, 422, "validation", "Invalid input", first_given(&r),
                       "give two of T, P, h, s, x as one of the pairs (T, P), (P, h), (P, s), "
                       "(P, x), (T, x), or T or P alone for the saturated liquid and vapour");
    json_t *doc = json_object();
    gc_error err;
    gc_error_clear(&err);
    int rc = build(&out, doc, &r, pair, &err);
    if (rc != GC_OK) {
        json_decref(doc);
        return problem(resp, &out, 422, rc == GC_ERR_RANGE ? "out_of_range"
                                        : rc == GC_ERR_NOCONV ? "no_convergence" : "validation",
                       rc == GC_ERR_RANGE ? "Outside the validity range"
                                          : "Inputs cannot be evaluated",
                       err.field[0] ? err.field : first_given(&r), err.message);
    }
    json_object_set_new(doc, "model", json_string("IAPWS-IF97 (IAPWS R7-97(2012))"));
    json_object_set_new(doc, "reference_state", json_string(
        "u = 0 and s = 0 for the saturated liquid at the triple point (273.16 K, 611.657 Pa)"));
    return gc_out_respond(&out, doc, GC_OUT_EVALUATION, resp);
}
