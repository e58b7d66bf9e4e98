/*
 * demo.c — GET /: the demo page (web/index.html, a self-contained HTML page
 * that calls the public API like any other client), built into the binary
 * as gc_api_demo_html by mk/diagram.mk. Static content: no inputs read.
 */
#include "api/api.h"
#include "api/respond/problem.h"

#include <stdlib.h>
#include <string.h>

#define GC_API_CT_HTML "text/html; charset=utf-8"

/* Generated from web/index.html (UTF-8 bytes, NUL-terminated). */
extern const unsigned char gc_api_demo_html[];

/* Declared here and in table.c (the route table's only other user). */
int gc_api_h_demo(const gc_api_request *req, gc_api_response *resp);

int gc_api_h_demo(const gc_api_request *req, gc_api_response *resp)
{
    (void)req;
    size_t n = strlen((const char *)gc_api_demo_html);
    char *copy = malloc(n + 1);
    if (!copy)
        return gc_api_problem(resp, 503, "overloaded", NULL, "Out of memory.", NULL);
    memcpy(copy, gc_api_demo_html, n + 1);
    resp->status = 200;
    resp->content_type = GC_API_CT_HTML;
    resp->body = copy;
    resp->body_len = n;
    resp->cache_seconds = 0;
    return 0;
}
