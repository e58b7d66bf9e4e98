/*
 * test_decode.c — the API layer's request decoding and response building
 * (service/api/request/decode.h, respond/output.h): GET and POST giving the identical struct,
 * every error class with its status and message, the closest-name
 * suggestion, line and column for malformed JSON, output parameters, the
 * NaN guard, JSON pointers with ~0/~1 escapes, CSV quoting, and the
 * /v1/properties handler end to end (without a server).
 */
#include "check.h"
#include "api/request/decode.h"
#include "api/handlers.h"
#include "api/respond/output.h"

#include <stdlib.h>
#include <string.h>

/* ---- a test route covering every field type ---------------------------- */
typedef struct t_req {
    int model;           /* variant */
    double cp;           /* J/(kg K) */
    double T_K;          /* K */
    double P_Pa;         /* Pa */
    double alt_m;        /* m */
    double site_T_K;     /* K */
    int n;               /* integer */
    int flag;            /* bool */
    int mode;            /* enum */
    char label[GC_DECODE_MAX_STRING];
    int P_given;
} t_req;

static const char *const modes[] = { "fast", "exact", NULL };

static const gc_field_spec cold[] = {
    GC_F_NUM("cp", GC_Q_SPECIFIC_ENTROPY, t_req, cp, .def = 1005.0, .flags = GC_F_MIN | GC_F_MAX,
             .min = 100.0, .max = 20000.0, .description = "cp"),
    GC_F_END
};
static const gc_variant_spec models[] = {
    { "air", NULL, "air" }, { "cold", cold, "cold" }, { NULL, NULL, NULL }
};
static const gc_field_spec site[] = {
    GC_F_NUM("altitude", GC_Q_LENGTH, t_req, alt_m, .def = 0.0, .flags = GC_F_MIN | GC_F_MAX,
             .min = -500.0, .max = 5000.0, .description = "altitude"),
    GC_F_NUM("temperature", GC_Q_AMBIENT_TEMPERATURE, t_req, site_T_K, .def = 288.15,
             .flags = GC_F_MIN | GC_F_MIN_EXCL, .min = 0.0, .description = "ambient"),
    GC_F_END
};
static const gc_field_spec fields[] = {
    GC_F_VARIANT("gas", models, t_req, model, .def_string = "air", .description = "gas"),
    GC_F_NUM("T", GC_Q_TEMPERATURE, t_req, T_K, .flags = GC_F_REQUIRED | GC_F_MIN | GC_F_MIN_EXCL,
             .min = 0.0, .description = "T"),
    GC_F_NUM("P", GC_Q_PRESSURE, t_req, P_Pa, .def = 101325.0, .present = GC_PRESENT(t_req, P_given),
             .flags = GC_F_MIN | GC_F_MIN_EXCL, .min = 0.0, .description = "P"),
    GC_F_OBJ("site", site, .description = "site"),
    GC_F_INT("stages", t_req, n, .def = 1, .flags = GC_F_MIN | GC_F_MAX, .min = 1, .max = 4,
             .description = "stages"),
    GC_F_BOOL("reheat", t_req, flag, .def = 0, .description = "reheat"),
    GC_F_ENUM("mode", modes, t_req, mode, .def = 0, .description = "mode"),
    GC_F_STR("label", t_req, label, .def_string = "unit 1", .description = "label"),
    GC_F_END
};

typedef struct result {
    int rc;
    int status;
    json_t *body;      /* parsed response body or NULL */
    gc_out out;
    t_req r;
} result;

static void result_free(result *x)
{
    json_decref(x->body);
    gc_out_free(&x->out);
}

static result run(unsigned method, const gc_api_param *q, size_t nq, const char *body,
                  const char *ct)
{
    result x;
    memset(&x, 0, sizeof x);
    gc_api_request req = { .method = method, .path = "/test", .query = q, .n_query = nq,
                           .body = body, .body_len = body ? strlen(body) : 0,
                           .content_type = ct, .request_id = "t" };
    gc_api_response resp;
    memset(&resp, 0, sizeof resp);
    CU_ASSERT_EQUAL_FATAL(gc_out_init(&x.out), 0);
    x.rc = gc_decode_request(&req, fields, GC_OUT_ACCEPT_EVAL, &x.r, &x.out, &resp);
    x.status = x.rc == 0 ? 200 : resp.status;
    if (resp.body) {
        x.body = json_loadb(resp.body, resp.body_len, 0, NULL);
        free(resp.body);
    }
    return x;
}

#define GET(...) run(GC_M_GET, (const gc_api_param[]){ __VA_ARGS__ }, \
                     sizeof((const gc_api_param[]){ __VA_ARGS__ }) / sizeof(gc_api_param), NULL, NULL)
#define POST(b) run(GC_M_POST, NULL, 0, b, "application/json")

/* The message of the error at field, or NULL. */
static const char *error_at(const json_t *body, const char *field)
{
    size_t i;
    json_t *e;
    json_array_foreach(json_object_get(body, "errors"), i, e) {
        if (strcmp(json_string_value(json_object_get(e, "field")), field) == 0)
            return json_string_value(json_object_get(e, "message"));
    }
    return NULL;
}

static int n_errors(const json_t *body)
{
    return (int)json_array_size(json_object_get(body, "errors"));
}

static void expect_error(const result *x, int status, const char *field, const char *substring)
{
    CU_ASSERT_EQUAL(x->status, status);
    const char *m = x->body ? error_at(x->body, field) : NULL;
    if (!m || !strstr(m, substring)) {
        char *dump = x->body ? json_dumps(x->body, JSON_COMPACT) : NULL;
        fprintf(stderr, "expected %d error at '%s' containing '%s'; got status %d body %s\n",
                status, field, substring, x->status, dump ? dump : "(none)");
        free(dump);
    }
    CU_ASSERT_PTR_NOT_NULL(m);
    if (m)
        CU_ASSERT_PTR_NOT_NULL(strstr(m, substring));
}

/* ---- tests --------------------------------------------------------------- */

static void test_get_post_identical(void)
{
    result g = GET({ "gas.model", "cold" }, { "gas.cp", "0.24 Btu/(lbm R)" }, { "T", "59 degF" },
                   { "P", "14.7 psi" }, { "site.altitude", "1000 ft" }, { "site.temperature", "15 degC" },
                   { "stages", "2" }, { "reheat", "true" }, { "mode", "exact" }, { "label", "Quillmere 1" },
                   { "units", "us" });
    result p = POST("{\"gas\":{\"model\":\"cold\",\"cp\":\"0.24 Btu/(lbm R)\"},\"T\":\"59 degF\","
                    "\"P\":\"14.7 psi\",\"site\":{\"altitude\":\"1000 ft\",\"temperature\":288.15},"
                    "\"stages\":2,\"reheat\":true,\"mode\":\"exact\",\"label\":\"Quillmere 1\"}");
    CU_ASSERT_EQUAL(g.rc, 0);
    CU_ASSERT_EQUAL(p.rc, 0);
    CU_ASSERT_EQUAL(memcmp(&g.r, &p.r, sizeof g.r), 0);
    CU_ASSERT_EQUAL(g.r.model, 1);
    CHECK_REL(g.r.cp, 0.24 * 4186.8, 1e-12, "Btu/(lbm R) = 4186.8 J/(kg K), NIST SP 811 B.8");
    CHECK_ABS(g.r.T_K, 288.15, 1e-9, "59 degF");
    CHECK_REL(g.r.alt_m, 304.8, 1e-12, "1000 ft");
    CU_ASSERT_EQUAL(g.r.n, 2);
    CU_ASSERT_EQUAL(g.r.flag, 1);
    CU_ASSERT_EQUAL(g.r.mode, 1);
    CU_ASSERT_EQUAL(g.r.P_given, 1);
    CU_ASSERT_STRING_EQUAL(g.r.label, "Quillmere 1");
    /* the echo is in the output system (us for GET here) */
    CU_ASSERT_EQUAL(g.out.sys, GC_UNITS_US);
    CHECK_ABS(json_real_value(json_object_get(g.out.inputs, "T")), 518.67, 1e-9, "288.15 K in R");
    CHECK_ABS(json_real_value(json_object_get(json_object_get(g.out.inputs, "site"), "temperature")),
              59.0, 1e-9, "ambient temperature in degF");
    CU_ASSERT_STRING_EQUAL(json_string_value(json_object_get(g.out.units, "P")), "psia");
    result_free(&g);
    result_free(&p);
}

static void test_defaults(void)
{
    result x = POST("{\"T\": 300}");
    CU_ASSERT_EQUAL(x.rc, 0);
    CU_ASSERT_EQUAL(x.r.model, 0);
    CU_ASSERT_EQUAL(x.r.P_given, 0);
    CHECK_REL(x.r.P_Pa, 101325.0, 0, "default");
    CHECK_REL(x.r.cp, 0.0, 0, "members of a variant not chosen stay untouched");
    CHECK_REL(x.r.site_T_K, 288.15, 0, "nested default");
    CU_ASSERT_EQUAL(x.r.n, 1);
    CU_ASSERT_STRING_EQUAL(x.r.label, "unit 1");
    json_t *site_echo = json_object_get(x.out.inputs, "site");
    CU_ASSERT_PTR_NOT_NULL(json_object_get(site_echo, "altitude"));
    CU_ASSERT_STRING_EQUAL(json_string_value(json_object_get(json_object_get(x.out.inputs, "gas"), "model")), "air");
    result_free(&x);
}

static void test_malformed_json(void)
{
    result x = POST("{\n  \"T\": 300,\n  \"P\": ,\n}");
    expect_error(&x, 400, "", "line 3, column");
    CU_ASSERT_STRING_EQUAL(json_string_value(json_object_get(x.body, "type")),
                           "https://gascycled.invalid/problems/malformed");
    result_free(&x);
    x = POST("{\"T\": NaN}");
    expect_error(&x, 400, "", "NaN and Infinity are not JSON numbers");
    result_free(&x);
    x = POST("{\"T\": -Infinity}");
    expect_error(&x, 400, "", "NaN and Infinity");
    result_free(&x);
    x = POST("{\"T\": 300, \"T\": 301}");
    expect_error(&x, 400, "", "duplicate key");
    result_free(&x);
    x = POST("");
    expect_error(&x, 400, "", "body is empty");
    result_free(&x);
    x = POST("  \r\n ");
    expect_error(&x, 400, "", "body is empty");
    result_free(&x);
    x = POST("[1, 2]");
    expect_error(&x, 400, "", "must be a JSON object, got an array");
    result_free(&x);
    x = POST("{\"T\": 1e999}");
    expect_error(&x, 400, "", "malformed JSON");
    result_free(&x);
    x = run(GC_M_POST, NULL, 0, "{\"T\": 300}", "text/plain");
    CU_ASSERT_EQUAL(x.status, 415);
    result_free(&x);
    x = run(GC_M_POST, NULL, 0, "{\"T\": 300}", "application/json; charset=utf-8");
    CU_ASSERT_EQUAL(x.rc, 0);
    result_free(&x);
}

static void test_depth(void)
{
    char body[256] = "{\"site\":";
    for (int i = 0; i < 16; i++)
        strcat(body, "{\"a\":");
    strcat(body, "1");
    for (int i = 0; i < 17; i++)
        strcat(body, "}");
    result x = POST(body);
    expect_error(&x, 400, "/site/a/a/a/a/a/a/a/a/a/a/a/a/a/a/a", "nesting deeper than 16");
    result_free(&x);
    result g = GET({ "a.b.c.d.e.f.g.h.i.j.k.l.m.n.o.p.q", "1" });
    CU_ASSERT_EQUAL(g.status, 400);
    CU_ASSERT_PTR_NOT_NULL(strstr(json_string_value(json_object_get(g.body, "detail")), "nesting"));
    result_free(&g);
}

static void test_query_shape(void)
{
    result x = GET({ "T", "300" }, { "T", "301" });
    expect_error(&x, 400, "/T", "given more than once");
    result_free(&x);
    x = GET({ "T", "300" }, { "site", "high" }, { "site.altitude", "3" });
    expect_error(&x, 400, "/site", "both as a value and with sub-keys");
    result_free(&x);
    x = GET({ "T", "300" }, { "site..altitude", "3" });
    expect_error(&x, 400, "", "empty or overlong part");
    result_free(&x);
    x = GET({ "T", "300" }, { "units.x", "us" });
    expect_error(&x, 400, "", "takes no sub-keys");
    result_free(&x);
    const gc_api_param q[] = { { "T", "300" } };
    x = run(GC_M_POST, q, 1, "{\"T\": 300}", "application/json");
    expect_error(&x, 400, "", "a POST sends its input fields in the JSON body");
    result_free(&x);
}

static void test_field_errors_all_at_once(void)
{
    result x = POST("{\"gas\":{\"model\":\"cold\",\"cp\":\"3 bar\",\"kk\":1},\"T\":\"nan\","
                    "\"stagse\":3,\"P\":-1,\"site\":{\"altitude\":\"9000 m\",\"temperature\":true},"
                    "\"stages\":2.5,\"reheat\":\"yes\",\"mode\":\"exakt\",\"label\":7,\"units\":\"us\"}");
    CU_ASSERT_EQUAL(x.status, 422);
    CU_ASSERT_STRING_EQUAL(json_string_value(json_object_get(x.body, "type")),
                           "https://gascycled.invalid/problems/validation");
    expect_error(&x, 422, "/gas/cp", "unit 'bar' is a pressure, expected a specific entropy");
    expect_error(&x, 422, "/gas/kk", "unknown field 'kk'");
    expect_error(&x, 422, "/T", "NaN and Infinity are not accepted");
    expect_error(&x, 422, "/stagse", "did you mean 'stages'?");
    expect_error(&x, 422, "/P", "must be greater than 0 kPa");
    expect_error(&x, 422, "/site/altitude", "must be at most 5000 m");
    expect_error(&x, 422, "/site/temperature", "got a boolean");
    expect_error(&x, 422, "/stages", "whole number");
    expect_error(&x, 422, "/reheat", "must be true or false");
    expect_error(&x, 422, "/mode", "did you mean 'exact'?");
    expect_error(&x, 422, "/label", "must be a string");
    expect_error(&x, 422, "/units", "output parameter");
    CU_ASSERT_EQUAL(n_errors(x.body), 12);
    result_free(&x);
}

static void test_query_values(void)
{
    result x = GET({ "T", "inf" });
    expect_error(&x, 422, "/T", "NaN and Infinity");
    result_free(&x);
    x = GET({ "T", "NaN K" });
    expect_error(&x, 422, "/T", "NaN and Infinity");
    result_free(&x);
    x = GET({ "T", "300 K extra" });
    expect_error(&x, 422, "/T", "unknown unit 'extra'");
    result_free(&x);
    x = GET({ "T", "12 bar" });
    expect_error(&x, 422, "/T", "unit 'bar' is a pressure, expected a temperature");
    result_free(&x);
    x = GET({ "T", "" });
    expect_error(&x, 422, "/T", "is empty");
    result_free(&x);
    x = GET({ "P", "100" });
    expect_error(&x, 422, "/T", "is required");
    result_free(&x);
    x = GET({ "T", "300" }, { "stages", "9" });
    expect_error(&x, 422, "/stages", "must be at most 4");
    result_free(&x);
    x = GET({ "T", "300" }, { "stages", "2x" });
    expect_error(&x, 422, "/stages", "whole number");
    result_free(&x);
    x = GET({ "T", "300" }, { "gas", "cld" });
    expect_error(&x, 422, "/gas", "did you mean 'cold'?");
    result_free(&x);
    x = GET({ "T", "300" }, { "gas.model", "cold" }, { "gas.cpp", "1" });
    expect_error(&x, 422, "/gas/cpp", "did you mean 'cp'?");
    result_free(&x);
    x = GET({ "T", "300" }, { "gas.cp", "1" });
    expect_error(&x, 422, "/gas/model", "is required when gas is an object");
    result_free(&x);
    x = GET({ "T", "300" }, { "gas", "air" }, { "xyzzy", "1" });
    expect_error(&x, 422, "/xyzzy", "the fields here are: gas, T, P");
    result_free(&x);
}

static void test_output_params(void)
{
    result x = GET({ "T", "300" }, { "units", "metric" }, { "format", "xml" }, { "select", "cp" },
                   { "table", "x" });
    CU_ASSERT_EQUAL(x.status, 400);
    CU_ASSERT_STRING_EQUAL(json_string_value(json_object_get(x.body, "type")),
                           "https://gascycled.invalid/problems/bad_output");
    expect_error(&x, 400, "/units", "must be 'si' or 'us'");
    expect_error(&x, 400, "/format", "must be one of 'json', 'csv', 'svg'");
    expect_error(&x, 400, "/select", "must be a JSON pointer");
    expect_error(&x, 400, "/table", "must be 'states', 'processes' or 'summary'");
    result_free(&x);
    x = GET({ "T", "300" }, { "format", "csv" }, { "select", "/T" });
    expect_error(&x, 400, "/select", "cannot be combined with format=csv");
    result_free(&x);
    x = GET({ "T", "300" }, { "units", "us" }, { "units", "si" });
    expect_error(&x, 400, "/units", "given more than once");
    result_free(&x);
}

static void test_suggest(void)
{
    static const char *const names[] = { "pressure_ratio", "peak_temperature", "T", "P",
                                         "turbine_inlet_temperature" };
    CU_ASSERT_STRING_EQUAL(gc_decode_suggest("pressure_raito", names, 5), "pressure_ratio");
    CU_ASSERT_STRING_EQUAL(gc_decode_suggest("turbine_inlet_temp", names, 5) ? "x" : "none", "none");
    CU_ASSERT_STRING_EQUAL(gc_decode_suggest("t", names, 5), "T");
    CU_ASSERT_STRING_EQUAL(gc_decode_suggest("peak_temprature", names, 5), "peak_temperature");
    CU_ASSERT_PTR_NULL(gc_decode_suggest("efficiency", names, 5));
    CU_ASSERT_EQUAL(gc_decode_edit_distance("kitten", "sitting"), 3);
    CU_ASSERT_EQUAL(gc_decode_edit_distance("", "abc"), 3);
    CU_ASSERT_EQUAL(gc_decode_edit_distance("Flaw", "lawn"), 2);
}

/* ---- output builder -------------------------------------------------- */

static json_t *respond(gc_out *o, json_t *doc, unsigned flags, int *status, const char **ct,
                       char **text)
{
    gc_api_response resp;
    memset(&resp, 0, sizeof resp);
    gc_out_respond(o, doc, flags, &resp);
    *status = resp.status;
    *ct = resp.content_type;
    *text = resp.body;
    return resp.body ? json_loadb(resp.body, resp.body_len, JSON_DECODE_ANY, NULL) : NULL;
}

static void test_nonfinite_guard(void)
{
    gc_out o;
    gc_out_init(&o);
    json_t *doc = json_object();
    CU_ASSERT_EQUAL(gc_out_q(&o, doc, "h", 1000.0, GC_Q_SPECIFIC_ENERGY), 0);
    CU_ASSERT_EQUAL(gc_out_q(&o, doc, "s", 0.0 / 0.0, GC_Q_SPECIFIC_ENTROPY), -1);
    CU_ASSERT_EQUAL(gc_out_num(&o, doc, "eta", 1.0 / 0.0), -1);
    int status;
    const char *ct;
    char *text;
    json_t *b = respond(&o, doc, GC_OUT_EVALUATION, &status, &ct, &text);
    CU_ASSERT_EQUAL(status, 422);
    CU_ASSERT_STRING_EQUAL(ct, GC_API_CT_PROBLEM);
    CU_ASSERT_PTR_NULL(strstr(text, "nan"));
    CU_ASSERT_PTR_NOT_NULL(strstr(json_string_value(json_object_get(b, "detail")), "'s'"));
    free(text);
    json_decref(b);
}

static void test_select_and_csv(void)
{
    gc_out o;
    gc_out_init(&o);
    const gc_api_param q[] = { { "select", "/a~1b/x~0y/1" } };
    gc_api_request req = { .method = GC_M_GET, .query = q, .n_query = 1 };
    gc_api_errors errs;
    gc_api_errors_init(&errs);
    CU_ASSERT_EQUAL(gc_out_parse_params(&o, &req, GC_OUT_ACCEPT_EVAL, &errs), 0);
    json_t *doc = json_pack("{s:{s:[i,f]}}", "a/b", "x~y", 7, 2.5);
    int status;
    const char *ct;
    char *text;
    json_t *b = respond(&o, doc, 0, &status, &ct, &text);
    CU_ASSERT_EQUAL(status, 200);
    CU_ASSERT_STRING_EQUAL(ct, GC_API_CT_TEXT);
    CU_ASSERT_STRING_EQUAL(text, "2.5");
    free(text);
    json_decref(b);

    gc_out_init(&o);
    const gc_api_param q2[] = { { "select", "/nothing/here" } };
    req.query = q2;
    gc_out_parse_params(&o, &req, GC_OUT_ACCEPT_EVAL, &errs);
    b = respond(&o, json_object(), 0, &status, &ct, &text);
    CU_ASSERT_EQUAL(status, 400);
    CU_ASSERT_PTR_NOT_NULL(strstr(text, "no value at '/nothing/here'"));
    free(text);
    json_decref(b);

    /* CSV: header with units, RFC 4180 quoting, CRLF, two tables */
    gc_out_init(&o);
    const gc_api_param q3[] = { { "format", "csv" } };
    req.query = q3;
    gc_out_parse_params(&o, &req, GC_OUT_ACCEPT_EVAL, &errs);
    doc = json_object();
    json_t *states = json_array(), *s1 = json_object(), *procs = json_array(), *p1 = json_object();
    json_object_set_new(s1, "name", json_string("inlet, \"1\""));
    gc_out_q(&o, s1, "T", 300.0, GC_Q_TEMPERATURE);
    gc_out_q(&o, s1, "P", 100000.0, GC_Q_PRESSURE);
    json_array_append_new(states, s1);
    json_object_set_new(p1, "kind", json_string("compression"));
    gc_out_q(&o, p1, "w", -250000.0, GC_Q_SPECIFIC_ENERGY);
    json_array_append_new(procs, p1);
    json_object_set_new(doc, "states", states);
    json_object_set_new(doc, "processes", procs);
    b = respond(&o, doc, 0, &status, &ct, &text);
    CU_ASSERT_EQUAL(status, 200);
    CU_ASSERT_STRING_EQUAL(ct, GC_API_CT_CSV);
    CU_ASSERT_STRING_EQUAL(text, "name,T [K],P [kPa]\r\n\"inlet, \"\"1\"\"\",300,100\r\n\r\n"
                                 "kind,w [kJ/kg]\r\ncompression,-250\r\n");
    free(text);
    json_decref(b);
    CU_ASSERT_EQUAL(errs.n, 0);

    char buf[64] = "";
    gc_out_pointer_append(buf, sizeof buf, "a/b~c");
    CU_ASSERT_STRING_EQUAL(buf, "/a~1b~0c");
}

/* ---- the properties handler end to end ----------------------------------- */

static json_t *call_props(unsigned method, const gc_api_param *q, size_t nq, const char *body,
                          int *status, char **text)
{
    gc_api_request req = { .method = method, .path = "/v1/properties", .query = q, .n_query = nq,
                           .body = body, .body_len = body ? strlen(body) : 0,
                           .content_type = body ? "application/json" : NULL };
    gc_api_response resp;
    memset(&resp, 0, sizeof resp);
    gc_api_h_properties(&req, &resp);
    *status = resp.status;
    *text = resp.body;
    return json_loadb(resp.body, resp.body_len, 0, NULL);
}

static void test_properties_handler(void)
{
    int st1, st2;
    char *t1, *t2;
    const gc_api_param q[] = { { "gas.model", "cold" }, { "gas.cp", "1.005" }, { "T", "59 degF" },
                               { "P", "14.7 psi" } };
    json_t *a = call_props(GC_M_GET, q, 4, NULL, &st1, &t1);
    json_t *b = call_props(GC_M_POST, NULL, 0,
                           "{\"gas\":{\"model\":\"cold\",\"cp\":1.005},\"T\":\"59 degF\",\"P\":\"14.7 psi\"}",
                           &st2, &t2);
    CU_ASSERT_EQUAL(st1, 200);
    CU_ASSERT_EQUAL(st2, 200);
    CU_ASSERT_STRING_EQUAL(t1, t2);   /* GET and POST: byte-identical responses */
    json_t *p = json_object_get(a, "properties");
    /* cold model: h = cp T (gas.h), cp 1.005 kJ/(kg K), T = 288.15 K */
    CHECK_REL(json_real_value(json_object_get(p, "h")), 1.005 * 288.15, 1e-9, "h = cp T");
    CHECK_REL(json_real_value(json_object_get(p, "k")), 1.4, 1e-12, "default k");
    CU_ASSERT(json_array_size(json_object_get(a, "cautions")) >= 1);
    CU_ASSERT(json_is_array(json_object_get(a, "warnings")));
    free(t1);
    free(t2);
    json_decref(a);
    json_decref(b);

    const gc_api_param q2[] = { { "T", "100 K" } };
    a = call_props(GC_M_GET, q2, 1, NULL, &st1, &t1);
    CU_ASSERT_EQUAL(st1, 422);
    CU_ASSERT_STRING_EQUAL(json_string_value(json_object_get(a, "type")),
                           "https://gascycled.invalid/problems/out_of_range");
    CU_ASSERT_PTR_NOT_NULL(error_at(a, "/T"));
    free(t1);
    json_decref(a);

    a = call_props(GC_M_POST, NULL, 0,
                   "{\"gas\":{\"model\":\"mixture\",\"composition\":{\"N2\":0.5,\"Xe\":0.5}},\"T\":300}",
                   &st1, &t1);
    CU_ASSERT_EQUAL(st1, 422);
    CU_ASSERT_PTR_NOT_NULL(error_at(a, "/gas/composition/Xe"));
    free(t1);
    json_decref(a);

    a = call_props(GC_M_POST, NULL, 0,
                   "{\"gas\":{\"model\":\"mixture\",\"composition\":{\"N2\":0.5,\"O2\":0.2}},\"T\":300}",
                   &st1, &t1);
    CU_ASSERT_EQUAL(st1, 422);
    CU_ASSERT_PTR_NOT_NULL(error_at(a, "/gas/composition"));
    free(t1);
    json_decref(a);
}

int main(void)
{
    static const gc_test_case cases[] = {
        { "GET and POST decode to the identical struct", test_get_post_identical },
        { "defaults and the inputs echo", test_defaults },
        { "malformed bodies: line/column, NaN, duplicates, empty, media type", test_malformed_json },
        { "nesting depth limit", test_depth },
        { "query-string shape errors", test_query_shape },
        { "every field error at once", test_field_errors_all_at_once },
        { "query values: NaN, units, required, enums", test_query_values },
        { "output parameters", test_output_params },
        { "closest-name suggestion", test_suggest },
        { "NaN/Infinity guard on output", test_nonfinite_guard },
        { "select pointers and CSV", test_select_and_csv },
        { "properties handler end to end", test_properties_handler },
        { NULL, NULL },
    };
    return gc_run_suite("decode", cases);
}
