/*
 * gases.c — GET /v1/gases: the working-fluid models the property core offers,
 * with their parameters and validity ranges (species and fuels join the list
 * as their core modules land).
 */
#include "api/handlers.h"
#include "api/problem.h"

#include <jansson.h>
#include <string.h>

static json_t *model(const char *name, const char *description)
{
    json_t *m = json_object();
    json_object_set_new(m, "name", json_string(name));
    json_object_set_new(m, "description", json_string(description));
    return m;
}

int gc_api_h_gases(const gc_api_request *req, gc_api_response *resp)
{
    (void)req;
    json_t *doc = json_object();
    json_t *models = json_array();
    json_array_append_new(models, model("cold", "Constant cp and k (cold-air standard)."));
    json_array_append_new(models, model("air", "Dry air, NASA 9-coefficient polynomials."));
    json_object_set_new(doc, "models", models);
    char *s = json_dumps(doc, JSON_COMPACT);
    json_decref(doc);
    if (!s)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    resp->status = 200;
    resp->content_type = GC_API_CT_JSON;
    resp->body = s;
    resp->body_len = strlen(s);
    return 0;
}
