/*
 * cases.c — reads *.case files (format: tests/integration/README.md), sends
 * each request with libcurl, checks the expectations and dumps every JSON
 * response for the contract test. Unknown keywords are errors, so a typo in
 * a case fails loudly instead of checking nothing.
 */
#include "cases.h"
#include "harness.h"

#include <ctype.h>
#include <dirent.h>
#include <errno.h>
#include <jansson.h>
#include <math.h>
#include <regex.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>

#define MAX_HEADERS 32
#define MAX_EXPECT 128
#define MAX_IGNORE 16
#define DEFAULT_REL 1e-9       /* relative tolerance of "json PTR = number" */
#define SAME_AS_REL 1e-12      /* relative tolerance of numbers in same-as */

typedef struct case_line {
    int line;                  /* 1-based line number in the file */
    char *text;                /* the line after "expect " */
} case_line;

typedef struct it_case {
    char path[1024];           /* file path */
    char name[512];            /* path relative to the cases folder */
    int req_line;
    char method[16];
    char *target;
    char *headers[MAX_HEADERS + 1];
    size_t n_headers;
    char *body;
    size_t body_len;
    int has_body;
    int chunked;
    case_line expect[MAX_EXPECT];
    size_t n_expect;
    char *ignore[MAX_IGNORE];
    size_t n_ignore;
    char error[512];           /* parse error, "" when none */
} it_case;

static void case_free(it_case *c)
{
    free(c->target);
    for (size_t i = 0; i < c->n_headers; i++)
        free(c->headers[i]);
    free(c->body);
    for (size_t i = 0; i < c->n_expect; i++)
        free(c->expect[i].text);
    for (size_t i = 0; i < c->n_ignore; i++)
        free(c->ignore[i]);
    memset(c, 0, sizeof *c);
}

static char *read_file(const char *path, size_t *len)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        return NULL;
    size_t cap = 4096, n = 0;
    char *buf = malloc(cap);
    for (;;) {
        if (!buf)
            break;
        size_t r = fread(buf + n, 1, cap - n - 1, f);
        n += r;
        if (n + 1 < cap)
            break;
        cap *= 2;
        char *nb = realloc(buf, cap);
        if (!nb) {
            free(buf);
            buf = NULL;
            break;
        }
        buf = nb;
    }
    fclose(f);
    if (buf) {
        buf[n] = '\0';
        if (len)
            *len = n;
    }
    return buf;
}

static char *skip_ws(char *s)
{
    while (*s == ' ' || *s == '\t')
        s++;
    return s;
}

static void rtrim(char *s)
{
    size_t n = strlen(s);
    while (n > 0 && (s[n - 1] == '\r' || s[n - 1] == '\n' || s[n - 1] == ' ' || s[n - 1] == '\t'))
        s[--n] = '\0';
}

/* Splits text into lines in place; returns the count. */
static size_t split_lines(char *text, char ***out)
{
    size_t n = 1;
    for (char *p = text; *p; p++)
        if (*p == '\n')
            n++;
    char **lines = calloc(n, sizeof *lines);
    if (!lines)
        return 0;
    size_t i = 0;
    char *p = text;
    while (p && i < n) {
        lines[i++] = p;
        char *e = strchr(p, '\n');
        if (!e)
            break;
        *e = '\0';
        p = e + 1;
    }
    *out = lines;
    return i;
}

/* Parses the case file; on error c->error is set. */
static void case_parse(it_case *c, const char *path, const char *name)
{
    char **lines = NULL;
    size_t n_lines;
    char *text = read_file(path, NULL);

    memset(c, 0, sizeof *c);
    snprintf(c->path, sizeof c->path, "%s", path);
    snprintf(c->name, sizeof c->name, "%s", name);
    if (!text) {
        snprintf(c->error, sizeof c->error, "cannot read: %s", strerror(errno));
        return;
    }
    n_lines = split_lines(text, &lines);
    for (size_t i = 0; i < n_lines && !c->error[0]; i++) {
        int ln = (int)i + 1;
        char *raw = lines[i];
        rtrim(raw);
        char *s = skip_ws(raw);
        if (*s == '\0' || *s == '#')
            continue;
        char *sp = s + strcspn(s, " \t");
        size_t kw_len = (size_t)(sp - s);
        char *arg = skip_ws(sp);
#define KW(k) (kw_len == strlen(k) && strncmp(s, k, kw_len) == 0)
        if (KW("request")) {
            char m[16], t[4096];
            if (c->target) {
                snprintf(c->error, sizeof c->error, "line %d: a second request line", ln);
            } else if (sscanf(arg, "%15s %4095s", m, t) != 2 || t[0] != '/') {
                snprintf(c->error, sizeof c->error, "line %d: write \"request METHOD /path?query\"", ln);
            } else {
                snprintf(c->method, sizeof c->method, "%s", m);
                c->target = strdup(t);
                c->req_line = ln;
            }
        } else if (KW("header")) {
            if (c->n_headers >= MAX_HEADERS || !strchr(arg, ':'))
                snprintf(c->error, sizeof c->error, "line %d: write \"header Name: value\" (at most %d)", ln, MAX_HEADERS);
            else
                c->headers[c->n_headers++] = strdup(arg);
        } else if (KW("body") || KW("body-file")) {
            if (c->has_body) {
                snprintf(c->error, sizeof c->error, "line %d: a second body", ln);
            } else if (KW("body-file")) {
                char full[1536];
                const char *slash = strrchr(path, '/');
                int dl = slash ? (int)(slash - path) : 1;
                snprintf(full, sizeof full, "%.*s/%s", dl, slash ? path : ".", arg);
                c->body = read_file(full, &c->body_len);
                if (!c->body)
                    snprintf(c->error, sizeof c->error, "line %d: cannot read %.400s", ln, full);
                c->has_body = 1;
            } else if (strncmp(arg, "<<", 2) == 0 && arg[2]) {
                const char *mark = arg + 2;
                size_t cap = 1, len = 0;
                char *b = calloc(1, 1);
                size_t k = i + 1;
                for (; k < n_lines; k++) {
                    char *l = lines[k];
                    size_t ll = strlen(l);
                    if (ll > 0 && l[ll - 1] == '\r')
                        l[--ll] = '\0';
                    if (strcmp(l, mark) == 0)
                        break;
                    char *nb = realloc(b, cap + ll + 1);
                    if (!nb)
                        break;
                    b = nb;
                    cap += ll + 1;
                    if (len > 0)
                        b[len++] = '\n';
                    memcpy(b + len, l, ll);
                    len += ll;
                    b[len] = '\0';
                }
                if (k >= n_lines)
                    snprintf(c->error, sizeof c->error, "line %d: no closing %s line", ln, mark);
                c->body = b;
                c->body_len = len;
                c->has_body = 1;
                i = k;
            } else {
                c->body = strdup(arg);
                c->body_len = strlen(arg);
                c->has_body = 1;
            }
        } else if (KW("chunked")) {
            c->chunked = 1;
        } else if (KW("expect")) {
            if (c->n_expect >= MAX_EXPECT)
                snprintf(c->error, sizeof c->error, "line %d: more than %d expectations", ln, MAX_EXPECT);
            else {
                c->expect[c->n_expect].line = ln;
                c->expect[c->n_expect].text = strdup(arg);
                c->n_expect++;
            }
        } else if (KW("ignore")) {
            if (c->n_ignore >= MAX_IGNORE || arg[0] != '/')
                snprintf(c->error, sizeof c->error, "line %d: write \"ignore /json/pointer\"", ln);
            else
                c->ignore[c->n_ignore++] = strdup(arg);
        } else {
            snprintf(c->error, sizeof c->error, "line %d: unknown keyword \"%.*s\"", ln, (int)kw_len, s);
        }
#undef KW
    }
    if (!c->error[0] && !c->target)
        snprintf(c->error, sizeof c->error, "no request line");
    free(lines);
    free(text);
}

/* ---- JSON helpers ------------------------------------------------------------ */

/* RFC 6901 JSON pointer lookup; NULL when the pointer names nothing. */
static json_t *ptr_get(json_t *root, const char *ptr)
{
    json_t *cur = root;
    if (!root)
        return NULL;
    if (ptr[0] == '\0')
        return root;
    if (ptr[0] != '/')
        return NULL;
    const char *p = ptr + 1;
    for (;;) {
        char tok[512];
        size_t n = 0;
        while (*p && *p != '/' && n + 1 < sizeof tok) {
            if (p[0] == '~' && p[1] == '1') {
                tok[n++] = '/';
                p += 2;
            } else if (p[0] == '~' && p[1] == '0') {
                tok[n++] = '~';
                p += 2;
            } else {
                tok[n++] = *p++;
            }
        }
        tok[n] = '\0';
        if (json_is_object(cur)) {
            cur = json_object_get(cur, tok);
        } else if (json_is_array(cur)) {
            char *end;
            if (n == 0 || (n > 1 && tok[0] == '0') || !isdigit((unsigned char)tok[0]))
                return NULL;
            unsigned long idx = strtoul(tok, &end, 10);
            if (*end)
                return NULL;
            cur = json_array_get(cur, idx);
        } else {
            return NULL;
        }
        if (!cur)
            return NULL;
        if (*p == '\0')
            return cur;
        p++;   /* the '/' */
    }
}

static int num_close(double a, double b, double rel)
{
    if (a == b)
        return 1;
    double scale = fabs(b) > fabs(a) ? fabs(b) : fabs(a);
    return fabs(a - b) <= rel * scale;
}

/* Deep equality with a relative tolerance on numbers (integer vs real ok). */
static int json_close(json_t *a, json_t *b, double rel)
{
    if (json_is_number(a) && json_is_number(b))
        return num_close(json_number_value(a), json_number_value(b), rel);
    if (json_typeof(a) != json_typeof(b))
        return 0;
    if (json_is_object(a)) {
        const char *k;
        json_t *v;
        if (json_object_size(a) != json_object_size(b))
            return 0;
        json_object_foreach(a, k, v) {
            json_t *w = json_object_get(b, k);
            if (!w || !json_close(v, w, rel))
                return 0;
        }
        return 1;
    }
    if (json_is_array(a)) {
        if (json_array_size(a) != json_array_size(b))
            return 0;
        for (size_t i = 0; i < json_array_size(a); i++)
            if (!json_close(json_array_get(a, i), json_array_get(b, i), rel))
                return 0;
        return 1;
    }
    return json_equal(a, b);
}

/* Removes the member or element a pointer names (for "ignore"). */
static void ptr_remove(json_t *root, const char *ptr)
{
    char parent[512];
    const char *last = strrchr(ptr, '/');
    if (!last)
        return;
    size_t pl = (size_t)(last - ptr);
    if (pl >= sizeof parent)
        return;
    memcpy(parent, ptr, pl);
    parent[pl] = '\0';
    json_t *p = ptr_get(root, parent);
    char key[512];
    size_t n = 0;
    for (const char *q = last + 1; *q && n + 1 < sizeof key;) {
        if (q[0] == '~' && q[1] == '1') {
            key[n++] = '/';
            q += 2;
        } else if (q[0] == '~' && q[1] == '0') {
            key[n++] = '~';
            q += 2;
        } else {
            key[n++] = *q++;
        }
    }
    key[n] = '\0';
    if (json_is_object(p))
        json_object_del(p, key);
    else if (json_is_array(p))
        json_array_remove(p, strtoul(key, NULL, 10));
}

static const char *type_name(json_t *v)
{
    switch (json_typeof(v)) {
    case JSON_OBJECT: return "object";
    case JSON_ARRAY: return "array";
    case JSON_STRING: return "string";
    case JSON_INTEGER:
    case JSON_REAL: return "number";
    case JSON_TRUE:
    case JSON_FALSE: return "boolean";
    case JSON_NULL: return "null";
    }
    return "?";
}

/* Short text of a JSON value for failure messages (malloc'd). */
static char *show(json_t *v)
{
    if (!v)
        return strdup("(nothing)");
    char *s = json_dumps(v, JSON_ENCODE_ANY | JSON_COMPACT);
    if (s && strlen(s) > 200)
        strcpy(s + 190, "...");
    return s ? s : strdup("?");
}

static int is_json_ct(const char *ct)
{
    if (!ct)
        return 0;
    size_t n = strcspn(ct, ";");
    while (n > 0 && ct[n - 1] == ' ')
        n--;
    return (n == 16 && strncasecmp(ct, "application/json", 16) == 0) ||
           (n > 5 && strncasecmp(ct + n - 5, "+json", 5) == 0);
}

int it_common_checks(const it_response *r, int head, int allow_5xx, char *why, size_t len)
{
    const char *ct = it_header_get(r, "Content-Type");
    if (r->status == 0) {
        snprintf(why, len, "no response (%s)", r->error);
        return -1;
    }
    if (!allow_5xx && r->status >= 500) {
        snprintf(why, len, "status %ld: the service must never answer 5xx; body: %.300s",
                 r->status, r->body);
        return -1;
    }
    if (!it_header_get(r, "X-Request-Id")) {
        snprintf(why, len, "no X-Request-Id header");
        return -1;
    }
    if ((r->body_len > 0 || (head && ct)) && (!ct || !strcasestr(ct, "charset="))) {
        snprintf(why, len, "Content-Type \"%s\" names no charset", ct ? ct : "(none)");
        return -1;
    }
    if (!head && r->body_len > 0 && is_json_ct(ct)) {
        json_error_t e;
        json_t *j = json_loadb(r->body, r->body_len, JSON_DECODE_ANY, &e);
        if (!j) {
            snprintf(why, len, "body is not valid JSON (line %d column %d: %s)", e.line, e.column, e.text);
            return -1;
        }
        json_decref(j);
    }
    return 0;
}

/* ---- running a case -------------------------------------------------------------- */

typedef struct run_ctx {
    const it_case *c;
    const char *base;
    const it_response *r;
    json_t *json;             /* parsed body, or NULL */
    char msg[1024];           /* failure message of the last check */
} run_ctx;

static void build_request(const it_case *c, it_request *rq)
{
    memset(rq, 0, sizeof *rq);
    rq->method = c->method;
    rq->target = c->target;
    rq->headers = (const char *const *)c->headers;
    rq->body = c->has_body ? c->body : NULL;
    rq->body_len = c->body_len;
    rq->chunked = c->chunked;
}

static int fail(run_ctx *x, const char *fmt, ...) __attribute__((format(printf, 2, 3)));
static int fail(run_ctx *x, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(x->msg, sizeof x->msg, fmt, ap);
    va_end(ap);
    return -1;
}

static int regex_match(const char *re, const char *text, int newline, char *err, size_t err_len)
{
    regex_t rx;
    int rc = regcomp(&rx, re, REG_EXTENDED | REG_NOSUB | (newline ? REG_NEWLINE : 0));
    if (rc != 0) {
        regerror(rc, &rx, err, err_len);
        return -1;
    }
    rc = regexec(&rx, text, 0, NULL, 0);
    regfree(&rx);
    return rc == 0 ? 1 : 0;
}

/* In-place escapes of plain-text expectations: \r \n \t and \\ (a backslash). */
static void unescape_text(char *s)
{
    char *w = s;
    for (const char *r = s; *r; r++) {
        if (r[0] == '\\' && r[1]) {
            char c = r[1];
            char out = c == 'r' ? '\r' : c == 'n' ? '\n' : c == 't' ? '\t' : c == '\\' ? '\\' : 0;
            if (out) {
                *w++ = out;
                r++;
                continue;
            }
        }
        *w++ = *r;
    }
    *w = '\0';
}

/* Parses "NUMBER [rel TOL | abs TOL]". Returns 0 or -1. */
static int parse_tol(const char *s, double *want, double *tol, int *is_abs)
{
    char kind[8] = "";
    double t = DEFAULT_REL;
    int n = sscanf(s, "%lf %7s %lf", want, kind, &t);
    if (n < 1)
        return -1;
    *is_abs = 0;
    if (n >= 2) {
        if (n != 3)
            return -1;
        if (strcmp(kind, "abs") == 0)
            *is_abs = 1;
        else if (strcmp(kind, "rel") != 0)
            return -1;
    }
    *tol = t;
    return 0;
}

static int within(double got, double want, double tol, int is_abs)
{
    if (!isfinite(got))
        return 0;
    return is_abs ? fabs(got - want) <= tol : num_close(got, want, tol);
}

static int check_same_as(run_ctx *x, const char *arg)
{
    it_case other;
    int own = 0;
    size_t al = strlen(arg);
    if (al > 5 && strcmp(arg + al - 5, ".case") == 0) {
        char full[1536];
        const char *slash = strrchr(x->c->path, '/');
        snprintf(full, sizeof full, "%.*s/%s", slash ? (int)(slash - x->c->path) : 1,
                 slash ? x->c->path : ".", arg);
        case_parse(&other, full, arg);
        own = 1;
        if (other.error[0]) {
            int r = fail(x, "same-as %s: %s", arg, other.error);
            case_free(&other);
            return r;
        }
    } else {
        char m[16], t[4096];
        memset(&other, 0, sizeof other);
        if (sscanf(arg, "%15s %4095s", m, t) != 2 || t[0] != '/')
            return fail(x, "write \"expect same-as FILE.case\" or \"expect same-as METHOD /target\"");
        snprintf(other.method, sizeof other.method, "%s", m);
        other.target = strdup(t);
        own = 1;
    }
    it_request rq;
    it_response r2;
    build_request(&other, &rq);
    it_http(NULL, x->base, &rq, &r2);
    it_dump(x->c->name, &rq, &r2);
    int result = 0;
    if (r2.status != x->r->status) {
        result = fail(x, "same-as %s: status %ld here, %ld there", arg, x->r->status, r2.status);
    } else {
        json_t *a = json_loadb(x->r->body, x->r->body_len, JSON_DECODE_ANY, NULL);
        json_t *b = json_loadb(r2.body, r2.body_len, JSON_DECODE_ANY, NULL);
        if (a && b) {
            for (size_t i = 0; i < x->c->n_ignore; i++) {
                ptr_remove(a, x->c->ignore[i]);
                ptr_remove(b, x->c->ignore[i]);
            }
            if (!json_close(a, b, SAME_AS_REL)) {
                char *sa = show(a), *sb = show(b);
                result = fail(x, "same-as %s: JSON bodies differ:\n      here:  %s\n      there: %s", arg, sa, sb);
                free(sa);
                free(sb);
            }
        } else if (x->r->body_len != r2.body_len || memcmp(x->r->body, r2.body, r2.body_len) != 0) {
            result = fail(x, "same-as %s: bodies differ (%zu and %zu bytes)", arg, x->r->body_len, r2.body_len);
        }
        json_decref(a);
        json_decref(b);
    }
    it_response_free(&r2);
    if (own)
        case_free(&other);
    return result;
}

static int check_json(run_ctx *x, char *arg)
{
    char *ptr = arg;
    char *sp = ptr + strcspn(ptr, " \t");
    if (*sp == '\0' && strcmp(ptr, "") != 0)
        return fail(x, "write \"expect json /pointer OP ...\"");
    *sp = '\0';
    char *op = skip_ws(sp + 1);
    char *rest = op + strcspn(op, " \t");
    if (*rest) {
        *rest = '\0';
        rest = skip_ws(rest + 1);
    }
    if (strcmp(ptr, "\"\"") == 0)
        ptr[0] = '\0';   /* the whole document */
    if (!x->json)
        return fail(x, "body is not JSON: %.200s", x->r->body);
    json_t *v = ptr_get(x->json, ptr);

    if (strcmp(op, "exists") == 0)
        return v ? 0 : fail(x, "%s does not exist", ptr);
    if (strcmp(op, "absent") == 0) {
        if (!v)
            return 0;
        char *s = show(v);
        int r = fail(x, "%s exists: %s", ptr, s);
        free(s);
        return r;
    }
    if (!v)
        return fail(x, "%s does not exist", ptr);
    if (strcmp(op, "=") == 0 || strcmp(op, "!=") == 0) {
        json_error_t e;
        json_t *want = json_loads(rest, JSON_DECODE_ANY, &e);
        if (!want)
            return fail(x, "expected value is not JSON: %s (%s)", rest, e.text);
        int eq = json_close(v, want, DEFAULT_REL);
        int neg = (op[0] == '!');
        int r = 0;
        if (eq == neg) {
            char *s = show(v);
            r = fail(x, "%s = %s, expected %s%s", ptr, s, neg ? "anything but " : "", rest);
            free(s);
        }
        json_decref(want);
        return r;
    }
    if (strcmp(op, "~") == 0) {
        double want, tol;
        int is_abs;
        if (parse_tol(rest, &want, &tol, &is_abs) != 0)
            return fail(x, "write \"~ NUMBER [rel TOL | abs TOL]\"");
        if (!json_is_number(v))
            return fail(x, "%s is a %s, not a number", ptr, type_name(v));
        double got = json_number_value(v);
        if (!within(got, want, tol, is_abs))
            return fail(x, "%s = %.12g, expected %.12g within %s %g (error %.3g)", ptr, got, want,
                        is_abs ? "abs" : "rel", tol,
                        is_abs ? fabs(got - want) : fabs(got - want) / (want != 0 ? fabs(want) : 1));
        return 0;
    }
    if (!strcmp(op, ">") || !strcmp(op, ">=") || !strcmp(op, "<") || !strcmp(op, "<=")) {
        char *end;
        double lim = strtod(rest, &end);
        if (end == rest)
            return fail(x, "write \"%s NUMBER\"", op);
        if (!json_is_number(v))
            return fail(x, "%s is a %s, not a number", ptr, type_name(v));
        double g = json_number_value(v);
        int ok = (op[0] == '>') ? (op[1] ? g >= lim : g > lim) : (op[1] ? g <= lim : g < lim);
        return ok ? 0 : fail(x, "%s = %.12g, expected %s %g", ptr, g, op, lim);
    }
    if (strcmp(op, "type") == 0)
        return strcmp(type_name(v), rest) == 0 ? 0
             : fail(x, "%s is a %s, expected %s", ptr, type_name(v), rest);
    if (strcmp(op, "length") == 0) {
        size_t n = json_is_array(v) ? json_array_size(v)
                 : json_is_object(v) ? json_object_size(v)
                 : json_is_string(v) ? json_string_length(v) : (size_t)-1;
        char *end;
        unsigned long want = strtoul(rest, &end, 10);
        if (end == rest)
            return fail(x, "write \"length N\"");
        return n == want ? 0 : fail(x, "%s has length %zu, expected %lu", ptr, n, want);
    }
    if (strcmp(op, "contains") == 0) {
        if (json_is_string(v))
            return strstr(json_string_value(v), rest) ? 0
                 : fail(x, "%s = \"%.200s\" does not contain \"%s\"", ptr, json_string_value(v), rest);
        if (json_is_array(v)) {
            for (size_t i = 0; i < json_array_size(v); i++) {
                json_t *e = json_array_get(v, i);
                if (json_is_string(e) && strcmp(json_string_value(e), rest) == 0)
                    return 0;
            }
            return fail(x, "array %s has no element \"%s\"", ptr, rest);
        }
        if (json_is_object(v))
            return json_object_get(v, rest) ? 0 : fail(x, "object %s has no member \"%s\"", ptr, rest);
        return fail(x, "%s is a %s; contains needs a string, array or object", ptr, type_name(v));
    }
    if (strcmp(op, "matches") == 0) {
        char err[128];
        if (!json_is_string(v))
            return fail(x, "%s is a %s, not a string", ptr, type_name(v));
        int m = regex_match(rest, json_string_value(v), 0, err, sizeof err);
        if (m < 0)
            return fail(x, "bad regular expression: %s", err);
        return m ? 0 : fail(x, "%s = \"%.200s\" does not match %s", ptr, json_string_value(v), rest);
    }
    return fail(x, "unknown json operator \"%s\"", op);
}

static int check_one(run_ctx *x, char *text)
{
    char *kw = text;
    char *sp = kw + strcspn(kw, " \t");
    char *arg = "";
    if (*sp) {
        *sp = '\0';
        arg = skip_ws(sp + 1);
    }
    const it_response *r = x->r;

    if (strcmp(kw, "status") == 0) {
        char buf[128];
        snprintf(buf, sizeof buf, "%s", arg);
        for (char *tok = strtok(buf, "|"); tok; tok = strtok(NULL, "|"))
            if (strtol(tok, NULL, 10) == r->status && r->status > 0)
                return 0;
        return fail(x, "status %ld, expected %s; body: %.300s", r->status, arg, r->body);
    }
    if (strcmp(kw, "content-type") == 0) {
        const char *ct = it_header_get(r, "Content-Type");
        return (ct && strncasecmp(ct, arg, strlen(arg)) == 0) ? 0
             : fail(x, "Content-Type \"%s\", expected it to start with \"%s\"", ct ? ct : "(none)", arg);
    }
    if (strcmp(kw, "header") == 0) {
        char *name = arg;
        char *s2 = name + strcspn(name, " \t");
        if (!*s2)
            return fail(x, "write \"expect header NAME present|absent|= V|contains V|matches RE\"");
        *s2 = '\0';
        char *op = skip_ws(s2 + 1);
        char *val = op + strcspn(op, " \t");
        if (*val) {
            *val = '\0';
            val = skip_ws(val + 1);
        }
        const char *h = it_header_get(r, name);
        if (strcmp(op, "=") == 0 || strcmp(op, "contains") == 0)
            unescape_text(val);
        if (strcmp(op, "present") == 0)
            return h ? 0 : fail(x, "no %s header", name);
        if (strcmp(op, "absent") == 0)
            return h ? fail(x, "%s header present: \"%s\"", name, h) : 0;
        if (!h)
            return fail(x, "no %s header", name);
        if (strcmp(op, "=") == 0)
            return strcmp(h, val) == 0 ? 0 : fail(x, "%s: \"%s\", expected \"%s\"", name, h, val);
        if (strcmp(op, "contains") == 0)
            return strcasestr(h, val) ? 0 : fail(x, "%s: \"%s\" does not contain \"%s\"", name, h, val);
        if (strcmp(op, "matches") == 0) {
            char err[128];
            int m = regex_match(val, h, 0, err, sizeof err);
            if (m < 0)
                return fail(x, "bad regular expression: %s", err);
            return m ? 0 : fail(x, "%s: \"%s\" does not match %s", name, h, val);
        }
        return fail(x, "unknown header operator \"%s\"", op);
    }
    if (strcmp(kw, "json") == 0)
        return check_json(x, arg);
    if (strcmp(kw, "body") == 0) {
        char *op = arg;
        char *val = op + strcspn(op, " \t");
        if (*val) {
            *val = '\0';
            val = skip_ws(val + 1);
        }
        if (strcmp(op, "contains") == 0 || strcmp(op, "lacks") == 0 || strcmp(op, "=") == 0)
            unescape_text(val);
        if (strcmp(op, "empty") == 0)
            return r->body_len == 0 ? 0 : fail(x, "body has %zu bytes, expected none", r->body_len);
        if (strcmp(op, "contains") == 0)
            return strstr(r->body, val) ? 0 : fail(x, "body does not contain \"%s\"; body: %.300s", val, r->body);
        if (strcmp(op, "lacks") == 0)
            return strstr(r->body, val) ? fail(x, "body contains \"%s\"", val) : 0;
        if (strcmp(op, "=") == 0)
            return strcmp(r->body, val) == 0 ? 0 : fail(x, "body \"%.300s\", expected \"%s\"", r->body, val);
        if (strcmp(op, "matches") == 0) {
            char err[128];
            int m = regex_match(val, r->body, 1, err, sizeof err);
            if (m < 0)
                return fail(x, "bad regular expression: %s", err);
            return m ? 0 : fail(x, "no line of the body matches %s", val);
        }
        return fail(x, "unknown body operator \"%s\"", op);
    }
    if (strcmp(kw, "text") == 0) {
        if (arg[0] == '~') {
            double want, tol;
            int is_abs;
            if (parse_tol(skip_ws(arg + 1), &want, &tol, &is_abs) != 0)
                return fail(x, "write \"expect text ~ NUMBER [rel TOL | abs TOL]\"");
            char *end;
            errno = 0;
            double got = strtod(r->body, &end);
            while (*end == '\n' || *end == '\r' || *end == ' ')
                end++;
            if (end == r->body || *end != '\0')
                return fail(x, "body \"%.100s\" is not a single number", r->body);
            return within(got, want, tol, is_abs) ? 0
                 : fail(x, "body %.12g, expected %.12g within %s %g", got, want, is_abs ? "abs" : "rel", tol);
        }
        return fail(x, "write \"expect text ~ NUMBER [rel TOL | abs TOL]\"");
    }
    if (strcmp(kw, "same-as") == 0)
        return check_same_as(x, arg);
    return fail(x, "unknown expectation \"%s\"", kw);
}

static int run_case(const char *path, const char *name, const char *base)
{
    it_case c;
    it_request rq;
    it_response r;
    int ok = 1, allow_5xx = 0;

    case_parse(&c, path, name);
    if (c.error[0]) {
        printf("FAIL %s: %s\n", name, c.error);
        case_free(&c);
        return 0;
    }
    for (size_t i = 0; i < c.n_expect; i++)
        if (strncmp(c.expect[i].text, "status 5", 8) == 0)
            allow_5xx = 1;
    build_request(&c, &rq);
    it_http(NULL, base, &rq, &r);
    it_dump(name, &rq, &r);

    char why[512];
    if (it_common_checks(&r, strcmp(c.method, "HEAD") == 0, allow_5xx, why, sizeof why) != 0) {
        printf("FAIL %s:%d: %s %s: %s\n", name, c.req_line, c.method, c.target, why);
        ok = 0;
    }
    run_ctx x = { &c, base, &r, NULL, "" };
    if (r.body_len > 0)
        x.json = json_loadb(r.body, r.body_len, JSON_DECODE_ANY, NULL);
    for (size_t i = 0; i < c.n_expect; i++) {
        char *t = strdup(c.expect[i].text);
        if (check_one(&x, t) != 0) {
            printf("FAIL %s:%d: expect %s\n      %s\n", name, c.expect[i].line, c.expect[i].text, x.msg);
            ok = 0;
        }
        free(t);
    }
    if (ok)
        printf("ok   %s\n", name);
    json_decref(x.json);
    it_response_free(&r);
    case_free(&c);
    return ok;
}

/* ---- directory walk ------------------------------------------------------------- */

typedef struct path_list {
    char **items;
    size_t n, cap;
} path_list;

static void collect(const char *dir, path_list *pl)
{
    DIR *d = opendir(dir);
    struct dirent *e;
    if (!d)
        return;
    while ((e = readdir(d)) != NULL) {
        if (e->d_name[0] == '.')
            continue;
        char full[2048];
        struct stat st;
        snprintf(full, sizeof full, "%s/%s", dir, e->d_name);
        if (stat(full, &st) != 0)
            continue;
        if (S_ISDIR(st.st_mode)) {
            collect(full, pl);
        } else {
            size_t n = strlen(e->d_name);
            if (n > 5 && strcmp(e->d_name + n - 5, ".case") == 0) {
                if (pl->n == pl->cap) {
                    pl->cap = pl->cap ? pl->cap * 2 : 64;
                    char **ni = realloc(pl->items, pl->cap * sizeof *ni);
                    if (!ni)
                        break;
                    pl->items = ni;
                }
                pl->items[pl->n++] = strdup(full);
            }
        }
    }
    closedir(d);
}

static int cmp_str(const void *a, const void *b)
{
    return strcmp(*(char *const *)a, *(char *const *)b);
}

void it_cases_run_dir(const char *dir, const char *base, const char *filter, it_stats *st)
{
    path_list pl = { NULL, 0, 0 };
    size_t dl = strlen(dir);
    collect(dir, &pl);
    if (pl.n)
        qsort(pl.items, pl.n, sizeof *pl.items, cmp_str);
    for (size_t i = 0; i < pl.n; i++) {
        const char *name = pl.items[i] + dl + (pl.items[i][dl] == '/' ? 1 : 0);
        if (!filter || strstr(name, filter)) {
            if (run_case(pl.items[i], name, base))
                st->passed++;
            else
                st->failed++;
        }
        free(pl.items[i]);
    }
    free(pl.items);
}
