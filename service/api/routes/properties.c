/*
 * properties.c — GET|POST /v1/properties: ideal-gas properties of one gas
 * model at T and P (cp, cv, k, R, M, h, u, s, s0, v; pr and vr for the
 * NASA-9 mixture models), through the core's gas.h / species.h only.
 *
 * Inputs: gas ("air" default, "cold", "humid_air", "mixture"; or an object
 * {"model": ..., members}), T (required), P (default 101.325 kPa).
 * Reference state (gas.h): h absolute, including the enthalpy of formation
 * (h = cp T for the cold model); s at the standard pressure 1 bar.
 * Validity (validity.h): for air-like gases the departure of the real gas
 * from these ideal-gas values ("ideal_gas_departure": Z, and v and cp as
 * ideal over real minus 1) with a "real_gas" warning from 1 %; for other
 * mixtures a note above 1 MPa; the CO2 dissociation rule ("dissociation").
 */
#include "api/request/decode.h"
#include "api/handlers.h"
#include "api/respond/output.h"
#include "api/respond/validity_out.h"
#include "gascycle/gas.h"
#include "gascycle/humid.h"
#include "gascycle/species.h"
#include "gascycle/validity.h"

#include <stddef.h>
#include <stdio.h>
#include <string.h>

enum { GAS_AIR = 0, GAS_COLD, GAS_HUMID, GAS_MIXTURE };

typedef struct prop_req {
    int gas;                              /* variant index (enum above) */
    double cp_J_per_kgK;                  /* cold: constant cp, J/(kg K) */
    double k;                             /* cold: cp/cv, - */
    double w_kg_per_kg;                   /* humid air: humidity ratio, kg/kg dry air */
    int has_w;                            /* humid air: humidity_ratio given */
    double rh;                            /* humid air: relative humidity, 0..1 */
    int has_rh;                           /* humid air: relative_humidity given */
    int n_species;                        /* mixture: species given */
    int species[GC_GAS_MAX_SPECIES];      /* mixture: gc_species ids */
    double x[GC_GAS_MAX_SPECIES];         /* mixture: mole fractions, - */
    double T_K;                           /* temperature, K */
    double P_Pa;                          /* pressure, Pa */
} prop_req;

/* {"N2": 0.78, "O2": "21 %", ...}: species names (species.h) -> mole fractions. */
static int decode_composition(gc_decoder *d, const gc_field_spec *f, json_t *value,
                              const char *pointer, void *target, json_t *echo_parent)
{
    prop_req *r = target;
    (void)f;
    r->n_species = 0;
    if (!value) {
        gc_decode_error(d, pointer, "is required for the mixture model");
        return -1;
    }
    if (!json_is_object(value) || json_object_size(value) == 0) {
        gc_decode_error(d, pointer, "must be an object of species names and mole fractions, "
                        "e.g. {\"N2\": 0.79, \"O2\": 0.21}");
        return -1;
    }
    json_t *echo = echo_parent ? json_object() : NULL;
    int bad = gc_decode_mole_fractions(d, value, pointer, r->species, r->x, &r->n_species, echo,
                                       1) != 0;
    if (echo)
        json_object_set_new(echo_parent, "composition", echo);
    return bad ? -1 : 0;
}

static const gc_field_spec cold_fields[] = {
    GC_F_NUM("cp", GC_Q_SPECIFIC_ENTROPY, prop_req, cp_J_per_kgK, .def = 1005.0,
             .flags = GC_F_MIN | GC_F_MAX, .min = 100.0, .max = 20000.0,
             .description = "constant specific heat at constant pressure"),
    GC_F_NUM("k", GC_Q_RATIO, prop_req, k, .def = 1.4,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 1.0, .max = 1.7,
             .description = "constant ratio of specific heats cp/cv"),
    GC_F_END
};

static const gc_field_spec humid_fields[] = {
    GC_F_NUM("humidity_ratio", GC_Q_FRACTION, prop_req, w_kg_per_kg,
             .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_DEFAULT, .min = 0.0, .max = 0.5,
             .present = GC_PRESENT(prop_req, has_w),
             .description = "kg of water vapour per kg of dry air (or give relative_humidity)"),
    GC_F_NUM("relative_humidity", GC_Q_FRACTION, prop_req, rh,
             .flags = GC_F_MIN | GC_F_MAX | GC_F_NO_DEFAULT, .min = 0.0, .max = 1.0,
             .present = GC_PRESENT(prop_req, has_rh),
             .description = "relative humidity at T and P (ASHRAE 2017 saturation pressure), "
                            "instead of humidity_ratio"),
    GC_F_END
};

static const gc_field_spec mixture_fields[] = {
    GC_F_CUSTOM("composition", decode_composition, prop_req, n_species,
                .flags = GC_F_REQUIRED, .description = "species name -> mole fraction"),
    GC_F_END
};

static const gc_variant_spec gas_variants[] = {
    { "air", NULL, "dry air, NASA 9-coefficient polynomials" },
    { "cold", cold_fields, "constant cp and k (cold-air standard)" },
    { "humid_air", humid_fields,
      "dry air plus water vapour at a humidity ratio or a relative humidity" },
    { "mixture", mixture_fields, "any mixture of the listed species by mole fraction" },
    { NULL, NULL, NULL }
};

static const gc_field_spec prop_fields[] = {
    GC_F_VARIANT("gas", gas_variants, prop_req, gas, .def_string = "air",
                 .description = "working-fluid model"),
    GC_F_NUM("T", GC_Q_TEMPERATURE, prop_req, T_K,
             .flags = GC_F_REQUIRED | GC_F_MIN | GC_F_MIN_EXCL, .min = 0.0,
             .description = "temperature"),
    GC_F_NUM("P", GC_Q_PRESSURE, prop_req, P_Pa, .def = 101325.0,
             .flags = GC_F_MIN | GC_F_MIN_EXCL | GC_F_MAX, .min = 0.0, .max = 1.0e8,
             .description = "absolute pressure"),
    GC_F_END
};

static int core_problem(gc_api_response *resp, gc_out *out, const gc_error *err,
                        const char *fallback_field)
{
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    gc_api_errors_add(&errs, err->field[0] ? err->field : fallback_field, "%s", err->message);
    gc_api_problem_errors(resp, 422, err->code == GC_ERR_RANGE ? "out_of_range" : "validation",
                          "Inputs cannot be evaluated", NULL, &errs);
    gc_out_free(out);
    return 0;
}

/* The gas model of the request into g; GC_OK, or an error with *field. */
static int gas_of(prop_req *r, gc_gas *g, gc_error *err, const char **field)
{
    *field = "/gas";
    switch (r->gas) {
    case GAS_COLD:
        return gc_gas_init_cold(g, r->cp_J_per_kgK, r->k, err);
    case GAS_HUMID: {
        int rc = GC_OK;
        if (r->has_w == r->has_rh)
            return gc_error_set(err, GC_ERR_INVALID, "", "give exactly one of humidity_ratio "
                                "and relative_humidity");
        *field = r->has_w ? "/gas/humidity_ratio" : "/gas/relative_humidity";
        if (r->has_rh)
            rc = gc_humid_W_from_RH(r->T_K, r->P_Pa, r->rh, &r->w_kg_per_kg, err);
        return rc == GC_OK ? gc_gas_init_humid_air(g, r->w_kg_per_kg, err) : rc;
    }
    case GAS_MIXTURE:
        *field = "/gas/composition";
        return gc_gas_init_mixture(g, r->n_species, r->species, r->x, err);
    default:
        gc_gas_init_air(g);
        return GC_OK;
    }
}

static json_t *gas_part(gc_out *out, const prop_req *r, const gc_gas *g)
{
    json_t *gas = json_object();
    json_object_set_new(gas, "model", json_string(gas_variants[r->gas].name));
    json_object_set_new(gas, "label", json_string(g->label));
    gc_out_q(out, gas, "T_min", g->T_min_K, GC_Q_TEMPERATURE);
    gc_out_q(out, gas, "T_max", g->T_max_K, GC_Q_TEMPERATURE);
    if (r->gas == GAS_HUMID) {
        gc_out_num(out, gas, "humidity_ratio", r->w_kg_per_kg);
        if (r->has_rh)
            gc_out_num(out, gas, "relative_humidity", r->rh);
    }
    if (g->kind == GC_GAS_MIXTURE) {
        json_t *comp = json_object();
        for (int i = 0; i < g->n_species; i++) {
            const gc_species *sp = gc_species_get(g->species[i]);
            if (sp)
                gc_out_num(out, comp, sp->name, g->x[i]);
        }
        json_object_set_new(gas, "composition", comp);
    }
    return gas;
}

static json_t *properties_part(gc_out *out, const gc_gas *g, double T, double P)
{
    json_t *p = json_object();
    gc_out_q(out, p, "T", T, GC_Q_TEMPERATURE);
    gc_out_q(out, p, "P", P, GC_Q_PRESSURE);
    gc_out_q(out, p, "cp", gc_gas_cp_T(g, T), GC_Q_SPECIFIC_ENTROPY);
    gc_out_q(out, p, "cv", gc_gas_cv_T(g, T), GC_Q_SPECIFIC_ENTROPY);
    gc_out_q(out, p, "k", gc_gas_k_T(g, T), GC_Q_RATIO);
    gc_out_q(out, p, "R", g->R_J_per_kgK, GC_Q_SPECIFIC_ENTROPY);
    gc_out_q(out, p, "M", g->M_kg_per_mol, GC_Q_MOLAR_MASS);
    gc_out_q(out, p, "h", gc_gas_h_T(g, T), GC_Q_SPECIFIC_ENERGY);
    gc_out_q(out, p, "u", gc_gas_u_T(g, T), GC_Q_SPECIFIC_ENERGY);
    gc_out_q(out, p, "s", gc_gas_s_TP(g, T, P), GC_Q_SPECIFIC_ENTROPY);
    gc_out_q(out, p, "s0", gc_gas_s0_T(g, T), GC_Q_SPECIFIC_ENTROPY);
    gc_out_q(out, p, "v", gc_gas_v_TP(g, T, P), GC_Q_SPECIFIC_VOLUME);
    if (g->kind == GC_GAS_MIXTURE) {
        gc_out_q(out, p, "pr", gc_gas_pr_T(g, T), GC_Q_RATIO);
        gc_out_q(out, p, "vr", gc_gas_vr_T(g, T), GC_Q_RATIO);
    }
    return p;
}

/* How far the real gas is from the ideal-gas values (validity.h), and the
 * warnings. */
static void validity_part(gc_out *out, json_t *doc, const prop_req *r, const gc_gas *g)
{
    gc_real_gas rg;
    gc_validity_real_gas(g, r->T_K, r->P_Pa, &rg);
    if (rg.estimated) {
        json_t *d = json_object();
        gc_out_num(out, d, "Z", rg.Z);
        gc_out_num(out, d, "v", rg.v_departure);
        gc_out_num(out, d, "cp", rg.cp_departure);
        json_object_set_new(d, "basis", json_string(
            "ideal-gas value over the real one, minus 1; virial estimate (B and C) from the "
            "Lemmon et al. 2000 dry-air equation"));
        json_object_set_new(doc, "ideal_gas_departure", d);
    }
    gc_validity_scan vs;
    gc_validity_scan_init(&vs);
    gc_validity_scan_state(&vs, g, r->T_K, r->P_Pa, "this state");
    gc_api_validity_warn(out, &vs, "/P");
    if (r->gas == GAS_COLD)
        gc_out_warn(out, "cold_model", "/gas",
                    "the cold model holds cp and k constant at every temperature");
}

int gc_api_h_properties(const gc_api_request *req, gc_api_response *resp)
{
    gc_out out;
    if (gc_out_init(&out) != 0)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    prop_req r;
    memset(&r, 0, sizeof r);
    if (gc_decode_request(req, prop_fields, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_CSV |
                          GC_OUT_ACCEPT_SELECT | GC_OUT_ACCEPT_READ, &r, &out, resp) != 0) {
        gc_out_free(&out);
        return 0;
    }
    gc_gas g;
    gc_error err;
    gc_error_clear(&err);
    const char *gas_field;
    if (gas_of(&r, &g, &err, &gas_field) != GC_OK) {
        err.field[0] = '\0';   /* the core names its own argument; ours is gas_field */
        return core_problem(resp, &out, &err, gas_field);
    }
    if (gc_gas_check_T(&g, r.T_K, "/T", &err) != GC_OK)
        return core_problem(resp, &out, &err, "/T");
    json_t *doc = json_object();
    json_object_set_new(doc, "gas", gas_part(&out, &r, &g));
    json_object_set_new(doc, "properties", properties_part(&out, &g, r.T_K, r.P_Pa));
    json_object_set_new(doc, "reference_state", json_string(
        g.kind == GC_GAS_MIXTURE
            ? "h and u are absolute (they include the enthalpy of formation at 298.15 K); "
              "s is referred to 1 bar; pr and vr are 1 at 298.15 K"
            : "h = cp T and u = cv T; s = cp ln(T / 298.15 K) - R ln(P / 1 bar)"));
    validity_part(&out, doc, &r, &g);
    out.csv_row = "properties";
    return gc_out_respond(&out, doc, GC_OUT_EVALUATION, resp);
}
