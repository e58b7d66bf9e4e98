/*
 * gases.c — GET /v1/gases: what the property core offers: the gas models
 * (with their parameters and validity ranges), the species of the NASA-9
 * table (molar mass, enthalpy of formation, data range, source record) and
 * the named fuels with their heating values (combustion.h). Everything comes
 * from the core at request time; only the model descriptions are text here.
 * Accepts units=si|us.
 */
#include "api/request/decode.h"
#include "api/handlers.h"
#include "api/respond/output.h"
#include "gascycle/combustion.h"
#include "gascycle/gas.h"
#include "gascycle/species.h"

#include <string.h>

/* Named fuels of combustion.h (its header lists them). */
static const char *const fuel_names[] = {
    "methane", "ethane", "propane", "n-butane", "hydrogen", "carbon monoxide"
};

static void add_model(gc_out *o, json_t *models, const char *name, const char *description,
                      const gc_gas *g, json_t *params)
{
    json_t *m = json_object();
    json_object_set_new(m, "name", json_string(name));
    json_object_set_new(m, "description", json_string(description));
    gc_out_q(o, m, "T_min", g->T_min_K, GC_Q_TEMPERATURE);
    gc_out_q(o, m, "T_max", g->T_max_K, GC_Q_TEMPERATURE);
    json_object_set_new(m, "parameters", params ? params : json_array());
    json_array_append_new(models, m);
}

static json_t *param(const char *name, const char *quantity, const char *description)
{
    json_t *p = json_object();
    json_object_set_new(p, "name", json_string(name));
    json_object_set_new(p, "quantity", json_string(quantity));
    json_object_set_new(p, "description", json_string(description));
    return p;
}

/* The gas models with their parameters and validity ranges. */
static json_t *models_of(gc_out *out)
{
    json_t *models = json_array();
    gc_gas g;
    gc_gas_init_air(&g);
    add_model(out, models, "air", "Dry air: N2, O2, Ar and CO2 as an ideal-gas mixture with "
              "temperature-dependent properties (NASA 9-coefficient polynomials).", &g, NULL);
    gc_gas_init_cold(&g, 1005.0, 1.4, NULL);
    json_t *cp = json_array();
    json_array_append_new(cp, param("cp", "specific_entropy", "constant cp; default 1.005 kJ/(kg K)"));
    json_array_append_new(cp, param("k", "ratio", "constant cp/cv; default 1.4"));
    add_model(out, models, "cold", "Constant cp and k (the cold-air standard).", &g, cp);
    if (gc_gas_init_humid_air(&g, 0.01, NULL) == GC_OK) {
        json_t *hp = json_array();
        json_array_append_new(hp, param("humidity_ratio", "fraction",
                                        "kg of water vapour per kg of dry air, 0 to 0.5"));
        add_model(out, models, "humid_air", "Dry air plus water vapour at a humidity ratio.",
                  &g, hp);
    }
    json_t *mp = json_array();
    json_array_append_new(mp, param("composition", "fraction",
                                    "species name -> mole fraction, summing to 1"));
    /* the mixture's range is the overlap of its species' ranges: report the
     * widest, the range of the species table as a whole */
    double lo = 1e300, hi = 0.0;
    for (int i = 0; i < gc_species_count(); i++) {
        const gc_species *sp = gc_species_get(i);
        if (!sp)
            continue;
        if (sp->T_K[0] < lo)
            lo = sp->T_K[0];
        if (sp->T_K[sp->n_intervals] > hi)
            hi = sp->T_K[sp->n_intervals];
    }
    g.T_min_K = lo;
    g.T_max_K = hi;
    add_model(out, models, "mixture", "Any mixture of the species below by mole fraction; its "
              "validity range is the overlap of its species' ranges (the widest possible is shown).",
              &g, mp);
    return models;
}

static json_t *species_of(gc_out *out)
{
    json_t *species = json_array();
    for (int i = 0; i < gc_species_count(); i++) {
        const gc_species *sp = gc_species_get(i);
        if (!sp)
            continue;
        json_t *s = json_object();
        json_object_set_new(s, "name", json_string(sp->name));
        json_object_set_new(s, "source_record", json_string(sp->source_name));
        gc_out_q(out, s, "M", sp->M_kg_per_mol, GC_Q_MOLAR_MASS);
        /* per kg of the species, so the value shares the specific-energy unit */
        gc_out_q(out, s, "dHf298", sp->dHf298_J_per_mol / sp->M_kg_per_mol, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(out, s, "T_min", sp->T_K[0], GC_Q_TEMPERATURE);
        gc_out_q(out, s, "T_max", sp->T_K[sp->n_intervals], GC_Q_TEMPERATURE);
        json_array_append_new(species, s);
    }
    return species;
}

static json_t *fuels_of(gc_out *out)
{
    json_t *fuels = json_array();
    for (size_t i = 0; i < sizeof fuel_names / sizeof fuel_names[0]; i++) {
        gc_fuel f;
        if (gc_fuel_init_named(&f, fuel_names[i], NULL) != GC_OK)
            continue;
        json_t *fj = json_object();
        json_object_set_new(fj, "name", json_string(fuel_names[i]));
        gc_out_q(out, fj, "M", f.M_kg_per_mol, GC_Q_MOLAR_MASS);
        gc_out_q(out, fj, "LHV", f.LHV_J_per_kg, GC_Q_SPECIFIC_ENERGY);
        gc_out_q(out, fj, "HHV", f.HHV_J_per_kg, GC_Q_SPECIFIC_ENERGY);
        json_array_append_new(fuels, fj);
    }
    return fuels;
}

int gc_api_h_gases(const gc_api_request *req, gc_api_response *resp)
{
    gc_out out;
    if (gc_out_init(&out) != 0)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    static const gc_field_spec none[] = { GC_F_END };
    int unused = 0;
    if (gc_decode_request(req, none, GC_OUT_ACCEPT_UNITS | GC_OUT_ACCEPT_SELECT, &unused, &out,
                          resp) != 0) {
        gc_out_free(&out);
        return 0;
    }
    json_t *doc = json_object();
    json_object_set_new(doc, "models", models_of(&out));
    json_object_set_new(doc, "species", species_of(&out));
    json_object_set_new(doc, "species_source", json_string(
        "NASA Glenn 9-coefficient polynomials: B. J. McBride, M. J. Zehe, S. Gordon, "
        "NASA/TP-2002-211556 (2002)"));
    json_object_set_new(doc, "fuels", fuels_of(&out));
    return gc_out_respond(&out, doc, 0, resp);
}
