/*
 * forms.c — what every API answer shares, applied once around the handler
 * (api.h: gc_api_call), and the evaluation tally the metrics read.
 *
 * on_error=text (a query parameter of every API route): a problem answer
 * (application/problem+json) becomes its first message as text/plain, one
 * line: "<field>: <message>" (or the problem's detail or title when it
 * names no field), with the problem's own status, for clients that show the
 * body of an error answer.
 *
 * on_error=cell: the same line after "error <status>: ", answered with
 * status 200. A spreadsheet's web function (LibreOffice Calc's and Excel's
 * WEBSERVICE) shows only an error code for any status but 2xx, whatever
 * the body says (seen in LibreOffice 7.4, tests/calc); with cell the cell
 * shows the reason. The text never reads as a number (VALUE() of it is an
 * error), the error class still counts in the metrics, and the client asked
 * for it by name.
 *
 * A path with a trailing slash (the router matched it without one) reaches
 * the handler without it.
 */
#include "api/api.h"
#include "api/respond/problem.h"

#include <jansson.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void gc_api_count_evaluations(gc_api_response *resp, const char *preset, unsigned long n)
{
    if (!preset || n == 0)
        return;
    for (int i = 0; i < resp->n_evaluated; i++)
        if (strcmp(resp->evaluated[i].preset, preset) == 0) {
            resp->evaluated[i].n += n;
            return;
        }
    if (resp->n_evaluated < GC_API_MAX_EVALUATED) {
        resp->evaluated[resp->n_evaluated].preset = preset;
        resp->evaluated[resp->n_evaluated++].n = n;
    }
    if (!resp->preset)
        resp->preset = preset;
}

/* on_error= in the query: 0 problem, 1 text, 2 cell (output.c refuses repeats). */
static int error_form(const gc_api_request *req)
{
    int form = 0;
    for (size_t i = 0; i < req->n_query; i++)
        if (req->query[i].key && req->query[i].value &&
            strcmp(req->query[i].key, "on_error") == 0)
            form = strcmp(req->query[i].value, "text") == 0 ? 1
                 : strcmp(req->query[i].value, "cell") == 0 ? 2 : 0;
    return form;
}

/* The problem in resp as one line of text (cell: after "error <status>: ",
 * status 200); 0, or -1 (left as it was). */
static int problem_as_text(gc_api_response *resp, int cell)
{
    json_t *doc = resp->body ? json_loadb(resp->body, resp->body_len, 0, NULL) : NULL;
    if (!doc)
        return -1;
    json_t *e0 = json_array_get(json_object_get(doc, "errors"), 0);
    const char *field = json_string_value(json_object_get(e0, "field"));
    const char *msg = json_string_value(json_object_get(e0, "message"));
    const char *detail = json_string_value(json_object_get(doc, "detail"));
    const char *title = json_string_value(json_object_get(doc, "title"));
    char *text = NULL, head[32] = "";
    int n;
    if (cell)
        snprintf(head, sizeof head, "error %d: ", resp->status);
    if (msg)
        n = field && *field ? asprintf(&text, "%s%s: %s", head, field, msg)
                            : asprintf(&text, "%s%s", head, msg);
    else
        n = asprintf(&text, "%s%s", head, detail ? detail : title ? title : "error");
    json_decref(doc);
    if (n < 0 || !text)
        return -1;
    free(resp->body);
    resp->body = text;
    resp->body_len = (size_t)n;
    resp->content_type = GC_API_CT_TEXT;
    if (cell)
        resp->status = 200;
    return 0;
}

int gc_api_call(gc_api_handler h, const gc_api_request *req, gc_api_response *resp)
{
    /* a route reached with a trailing slash (the router matched it without
     * one) gets the path without it */
    size_t len = req->path ? strlen(req->path) : 0;
    int rc;
    if (len > 1 && req->path[len - 1] == '/') {
        gc_api_request q = *req;
        char *trimmed = strndup(req->path, len - 1);
        if (!trimmed)
            return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
        q.path = trimmed;
        rc = h(&q, resp);
        free(trimmed);
    } else {
        rc = h(req, resp);
    }
    int form = resp->status >= 400 && resp->content_type &&
               strncmp(resp->content_type, "application/problem+json", 24) == 0 ? error_form(req)
                                                                                 : 0;
    if (form)
        problem_as_text(resp, form == 2);
    return rc;
}
