/*
 * problem.c — RFC 9457 problem details (application/problem+json) for every
 * error the service returns, and the error list that decoding fills.
 * Body: { "type", "title", "status", "detail", "errors": [{field, message}] }.
 * See problem.h for the type URIs and the 400/422 convention.
 */
#include "api/respond/problem.h"

#include <jansson.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void gc_api_errors_init(gc_api_errors *errs)
{
    errs->n = 0;
    errs->dropped = 0;
}

/* Replaces every byte that does not belong to a well-formed UTF-8 sequence
 * with '?': a message may quote a request's bytes (a query key that is not
 * UTF-8) or be cut inside a character, and JSON strings must be UTF-8 (issue
 * 12: such a message was dropped from the problem document). */
static void utf8_sanitize(char *s)
{
    unsigned char *p = (unsigned char *)s;
    while (*p) {
        int n = *p < 0x80 ? 1 : (*p >= 0xc2 && *p <= 0xdf) ? 2 : (*p >= 0xe0 && *p <= 0xef) ? 3
              : (*p >= 0xf0 && *p <= 0xf4) ? 4 : 0;
        int ok = n > 0;
        for (int k = 1; ok && k < n; k++)
            ok = (p[k] & 0xc0) == 0x80;
        if (ok && n == 3)   /* no overlong forms, no UTF-16 surrogates */
            ok = !(p[0] == 0xe0 && p[1] < 0xa0) && !(p[0] == 0xed && p[1] >= 0xa0);
        if (ok && n == 4)   /* no overlong forms, nothing past U+10FFFF */
            ok = !(p[0] == 0xf0 && p[1] < 0x90) && !(p[0] == 0xf4 && p[1] >= 0x90);
        if (!ok) {
            *p++ = '?';
            continue;
        }
        p += n;
    }
}

/* A JSON string of s, with bytes that are not UTF-8 read as '?' (a detail
 * may quote a path parameter such as an unknown preset name). */
static json_t *json_text(const char *s)
{
    json_t *j = json_string(s);
    if (j)
        return j;
    char *copy = strdup(s);
    if (!copy)
        return NULL;
    utf8_sanitize(copy);
    j = json_string(copy);
    free(copy);
    return j;
}

/* full (length n) into out (size cap): a text too long ends at a word, with
 * an ellipsis, never inside a word or a character (issue 17). */
static void whole_words(char *out, size_t cap, const char *full, int n)
{
    if (n >= 0 && (size_t)n < cap) {
        memcpy(out, full, (size_t)n + 1);
        return;
    }
    size_t end = cap - 4;   /* room for "…" (3 bytes) and the NUL */
    size_t cut = end;
    while (cut > 0 && full[cut] != ' ' && full[cut] != ',')
        cut--;
    if (cut < end / 2)
        cut = end;          /* one very long word: cut it rather than lose the text */
    while (cut > 0 && ((unsigned char)full[cut] & 0xC0) == 0x80)
        cut--;              /* not inside a UTF-8 character */
    while (cut > 0 && (full[cut - 1] == ' ' || full[cut - 1] == ','))
        cut--;
    memcpy(out, full, cut);
    memcpy(out + cut, "\xE2\x80\xA6", 4);
}

void gc_api_errors_add(gc_api_errors *errs, const char *field, const char *fmt, ...)
{
    if (errs->n >= GC_API_MAX_ERRORS) {
        errs->dropped++;
        return;
    }
    gc_api_field_error *e = &errs->e[errs->n++];
    snprintf(e->field, sizeof e->field, "%s", field ? field : "");
    char full[4 * GC_API_MESSAGE_LEN];
    va_list ap;
    va_start(ap, fmt);
    int n = vsnprintf(full, sizeof full, fmt, ap);
    va_end(ap);
    whole_words(e->message, sizeof e->message, full, n);
    utf8_sanitize(e->field);
    utf8_sanitize(e->message);
}

const char *gc_api_status_title(int status)
{
    switch (status) {
    case 400: return "Bad Request";
    case 404: return "Not Found";
    case 405: return "Method Not Allowed";
    case 406: return "Not Acceptable";
    case 408: return "Request Timeout";
    case 413: return "Content Too Large";
    case 415: return "Unsupported Media Type";
    case 422: return "Unprocessable Content";
    case 429: return "Too Many Requests";
    case 503: return "Service Unavailable";
    default: return status >= 500 ? "Server Error" : "Client Error";
    }
}

/* Serialises doc (stolen) into resp; -1 on allocation failure. */
static int finish(gc_api_response *resp, json_t *doc)
{
    resp->body = NULL;
    resp->body_len = 0;
    if (!doc)
        return -1;
    char *s = json_dumps(doc, JSON_COMPACT);
    json_decref(doc);
    if (!s)
        return -1;
    resp->body = s;
    resp->body_len = strlen(s);
    return 0;
}

static json_t *base_doc(gc_api_response *resp, int status, const char *error_class,
                        const char *title, const char *detail)
{
    const char *cls = error_class ? error_class : "error";
    char type[160];
    snprintf(type, sizeof type, "%s%s", GC_API_PROBLEM_TYPE_BASE, cls);
    resp->status = status;
    resp->content_type = GC_API_CT_PROBLEM;
    resp->error_class = cls;
    resp->cache_seconds = 0;
    json_t *doc = json_object();
    if (!doc)
        return NULL;
    json_object_set_new(doc, "type", json_string(type));
    json_object_set_new(doc, "title", json_text(title ? title : gc_api_status_title(status)));
    json_object_set_new(doc, "status", json_integer(status));
    if (detail)
        json_object_set_new(doc, "detail", json_text(detail));
    return doc;
}

static json_t *error_item(const char *field, const char *message)
{
    json_t *it = json_object();
    if (!it)
        return NULL;
    json_object_set_new(it, "field", json_text(field ? field : ""));
    json_object_set_new(it, "message", json_text(message ? message : ""));
    return it;
}

int gc_api_problem(gc_api_response *resp, int status, const char *error_class,
                   const char *title, const char *detail, const char *field)
{
    json_t *doc = base_doc(resp, status, error_class, title, detail);
    if (doc && field) {
        json_t *arr = json_array();
        json_array_append_new(arr, error_item(field, detail ? detail : title));
        json_object_set_new(doc, "errors", arr);
    }
    return finish(resp, doc);
}

int gc_api_problem_errors(gc_api_response *resp, int status, const char *error_class,
                          const char *title, const char *detail,
                          const gc_api_errors *errs)
{
    char buf[128];
    int n = errs ? errs->n + errs->dropped : 0;
    if (!detail) {
        if (n == 1 && errs->n == 1) {
            detail = errs->e[0].message;
        } else {
            snprintf(buf, sizeof buf, "The request has %d invalid field%s; see errors.",
                     n, n == 1 ? "" : "s");
            detail = buf;
        }
    }
    json_t *doc = base_doc(resp, status, error_class, title, detail);
    if (doc) {
        json_t *arr = json_array();
        for (int i = 0; errs && i < errs->n; i++)
            json_array_append_new(arr, error_item(errs->e[i].field, errs->e[i].message));
        json_object_set_new(doc, "errors", arr);
        if (errs && errs->dropped > 0)
            json_object_set_new(doc, "errors_not_shown", json_integer(errs->dropped));
    }
    return finish(resp, doc);
}
