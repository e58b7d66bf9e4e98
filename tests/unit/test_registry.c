/*
 * test_registry.c — unit tests of the preset registry and the descriptors'
 * tables (preset.h): every output row named (a field row may be left out of
 * a family's shared ids) and every row placed under a container of the right
 * kind, descriptions everywhere (the OpenAPI generator reads them),
 * field paths and ids each other's inverse, defaults within their own
 * bounds, and every preset's defaults refused or evaluated as its own
 * checks say, never crashed on. The worked example of DEVELOPERS.md
 * (example_preset.c, outside the registry) evaluated through the core and
 * answered by the API's writer like any preset.
 */
#include "check.h"
#include "example_preset.h"
#include "api/api.h"
#include "api/handlers.h"
#include "gascycle/preset.h"

#include <jansson.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

static int container(gc_field_type t)
{
    return t == GC_FT_OBJECT || t == GC_FT_LIST || t == GC_FT_GAS;
}

static void test_fields(void)
{
    int n = 0;
    const gc_preset *const *all = gc_presets(&n);
    CU_ASSERT(n >= 14);
    for (int i = 0; i < n; i++) {
        const gc_preset *p = all[i];
        CU_ASSERT_PTR_EQUAL(gc_preset_find(p->name), p);
        CU_ASSERT_PTR_NOT_NULL(p->description);
        for (int r = 1; r < p->n_fields; r++) {
            const gc_field *f = &p->fields[r];
            if (f->name == NULL)   /* a row of a family's ids this preset leaves out */
                continue;
            if (f->description == NULL)
                fprintf(stderr, "%s: field %s has no description\n", p->name, f->name);
            CU_ASSERT_PTR_NOT_NULL(f->description);
            CU_ASSERT(f->parent >= 0 && f->parent < p->n_fields);
            CU_ASSERT(container(p->fields[f->parent].type));
            char path[128];
            int idx[2] = { 0, 0 }, got[2];
            gc_preset_field_path(p, r, idx, path, sizeof path);
            if (!(f->flags & GC_FF_DERIVED)) {
                int back = gc_preset_field_find(p, path, got);
                if (back != r)
                    fprintf(stderr, "%s: %s -> %d, not %d\n", p->name, path, back, r);
                CU_ASSERT_EQUAL(back, r);
            }
            if (f->type == GC_FT_NUMBER && !(f->flags & GC_FF_OPTIONAL) && f->given == 0) {
                gc_error e;
                gc_error_clear(&e);
                CU_ASSERT_EQUAL(gc_field_check_value(f, f->def, &e), GC_OK);
            }
        }
    }
}

static void test_outputs(void)
{
    int n = 0;
    const gc_preset *const *all = gc_presets(&n);
    for (int i = 0; i < n; i++) {
        const gc_preset *p = all[i];
        for (int r = 0; r < p->n_outputs; r++) {
            const gc_output *o = &p->outputs[r];
            if (o->name == NULL || o->description == NULL) {
                fprintf(stderr, "%s: output row %d has no %s\n", p->name, r,
                        o->name ? "description" : "name");
                CU_FAIL("an output row without a name or description");
                continue;
            }
            CU_ASSERT(o->parent < r);
            if (o->parent >= 0) {
                gc_output_type t = p->outputs[o->parent].type;
                CU_ASSERT(t == GC_OT_OBJECT || t == GC_OT_ARRAY || t == GC_OT_LIST);
            }
        }
    }
}

/* Every preset's defaults: an answer or a report's own error, no crash. */
static void test_defaults(void)
{
    int n = 0;
    const gc_preset *const *all = gc_presets(&n);
    for (int i = 0; i < n; i++) {
        const gc_preset *p = all[i];
        void *in = calloc(1, p->input_size), *res = calloc(1, p->result_size);
        gc_report *rep = malloc(sizeof *rep);
        CU_ASSERT_FATAL(in && res && rep);
        gc_preset_input_init(p, in);
        gc_report_init(rep);
        int rc = gc_preset_evaluate(p, in, res, rep);
        CU_ASSERT(rc == GC_OK || rep->n_errors > 0);
        free(in);
        free(res);
        free(rep);
    }
}

/* The example preset as a new preset meets it: defaults, bounds, the engine,
 * its own output row, and the API's decoder and writer. */
static void test_example_preset(void)
{
    const gc_preset *p = &gc_preset_example;
    void *in = calloc(1, p->input_size), *res = calloc(1, p->result_size);
    gc_report *rep = malloc(sizeof *rep);
    CU_ASSERT_FATAL(in && res && rep);
    gc_preset_input_init(p, in);
    gc_report_init(rep);
    CU_ASSERT_EQUAL_FATAL(gc_preset_evaluate(p, in, res, rep), GC_OK);
    const gc_cycle_result *cr = p->cycle(res);
    double eta = cr->actual.summary.thermal_efficiency;
    CU_ASSERT(eta > 0.3 && eta < cr->carnot_efficiency);   /* rp 8: about 0.45 with air */
    CU_ASSERT_EQUAL(cr->actual.n_processes, 4);
    /* a bound of the table refuses an in-process caller with the field's id */
    ((ex_input *)in)->ratio = 0.5;
    gc_report_init(rep);
    CU_ASSERT_EQUAL(gc_preset_evaluate(p, in, res, rep), GC_ERR_INVALID);
    CU_ASSERT_EQUAL(rep->errors[0].field_id, 3);
    CU_ASSERT_STRING_EQUAL(rep->errors[0].message, "must be greater than 1");

    /* through the API: decoded, evaluated, written with its own row */
    gc_api_response r;
    memset(&r, 0, sizeof r);
    json_t *body = json_pack("{s:i, s:s}", "pressure_ratio", 10, "efficiency", "88 %");
    gc_api_preset_answer(p, body, 0, 0, &r);
    json_decref(body);
    CU_ASSERT_EQUAL(r.status, 200);
    json_t *doc = r.body ? json_loadb(r.body, r.body_len, 0, NULL) : NULL;
    CU_ASSERT_PTR_NOT_NULL_FATAL(doc);
    CU_ASSERT_STRING_EQUAL(json_string_value(json_object_get(doc, "cycle")), "example");
    double wr = json_number_value(json_object_get(doc, "work_ratio"));
    CU_ASSERT(wr > 0.0 && wr < 1.0);
    json_t *inputs = json_object_get(doc, "inputs");
    CU_ASSERT_DOUBLE_EQUAL(json_number_value(json_object_get(inputs, "efficiency")), 0.88, 1e-12);
    CU_ASSERT_EQUAL(json_array_size(json_object_get(doc, "states")), 4);
    json_decref(doc);
    free(r.body);

    memset(&r, 0, sizeof r);
    body = json_pack("{s:f}", "pressure_ratio", 0.5);
    gc_api_preset_answer(p, body, 0, 0, &r);
    json_decref(body);
    CU_ASSERT_EQUAL(r.status, 422);
    CU_ASSERT_PTR_NOT_NULL(r.body && strstr(r.body, "\"/pressure_ratio\""));
    free(r.body);
    free(in);
    free(res);
    free(rep);
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "fields", test_fields },
        { "outputs", test_outputs },
        { "defaults", test_defaults },
        { "example preset", test_example_preset },
        { NULL, NULL },
    };
    return gc_run_suite("registry", cases);
}
