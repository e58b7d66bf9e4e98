/*
 * runner.c — the integration test runner. Starts the server under test
 * (--server, e.g. build/gascycled or the sanitizer build) on a free port,
 * runs every case file under --cases, then the tests that need more than one
 * request/response pair (written in C below), stops the server by PID and
 * requires exit status 0. Every JSON response is dumped to --dump for the
 * contract test. Exit status: 0 all passed, 1 some failed, 2 usage/setup.
 *
 * The main server runs with: --cors https://portal.example,https://dash.example
 * (origins under the reserved .example domain, RFC 2606) and default limits
 * (--max-body 1M, --timeout 30). Cases may rely on these.
 */
#include "cases.h"
#include "harness.h"

#include <errno.h>
#include <jansson.h>
#include <math.h>
#include <regex.h>
#include <signal.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

#define MAIN_MAX_BODY 1048576u   /* the server's default --max-body, bytes */

typedef struct ctx {
    const char *binary;
    const char *logs;            /* folder for server logs */
    it_server *main;
    char msg[2048];              /* failure of the current test */
} ctx;

static void sleep_ms(long ms)
{
    struct timespec ts = { ms / 1000, (ms % 1000) * 1000000L };
    while (nanosleep(&ts, &ts) != 0 && errno == EINTR)
        ;
}

#define CHECK(cond, ...)                                                     \
    do {                                                                     \
        if (!(cond)) {                                                       \
            int n_ = snprintf(x->msg, sizeof x->msg, "%s:%d: ", __FILE__, __LINE__); \
            snprintf(x->msg + n_, sizeof x->msg - (size_t)n_, __VA_ARGS__);  \
            goto fail;                                                       \
        }                                                                    \
    } while (0)

/* One request on the main server (fresh connection), dumped, with the
 * checks every response must pass. */
static int get(ctx *x, const char *method, const char *target, const char *const *headers,
               it_response *r, const char *test)
{
    it_request rq = { method, target, headers, NULL, 0, 0, 0 };
    char why[512];
    it_http(NULL, x->main->base, &rq, r);
    it_dump(test, &rq, r);
    if (it_common_checks(r, strcmp(method, "HEAD") == 0, 0, why, sizeof why) != 0) {
        snprintf(x->msg, sizeof x->msg, "%s %s: %s", method, target, why);
        return -1;
    }
    return 0;
}

static int is_hex16(const char *s)
{
    if (!s || strlen(s) != 16)
        return 0;
    for (int i = 0; i < 16; i++)
        if (!((s[i] >= '0' && s[i] <= '9') || (s[i] >= 'a' && s[i] <= 'f')))
            return 0;
    return 1;
}

/* A JSON body of exactly n bytes: {"gas":"air","T":300} padded with spaces. */
static char *padded_json(size_t n)
{
    static const char core[] = "{\"gas\":\"air\",\"T\":300";
    char *b = malloc(n + 1);
    if (!b)
        return NULL;
    memcpy(b, core, sizeof core - 1);
    memset(b + sizeof core - 1, ' ', n - sizeof core);
    b[n - 1] = '}';
    b[n] = '\0';
    return b;
}

/* ---- keep-alive -------------------------------------------------------------- */

static int t_keep_alive(ctx *x)
{
    CURL *h = curl_easy_init();
    it_response r;
    memset(&r, 0, sizeof r);
    static const char body[] = "{\"gas\":\"air\",\"T\":500}";
    const struct { const char *m, *t, *b; long want; } seq[] = {
        { "GET", "/healthz", NULL, 200 },
        { "GET", "/healthz", NULL, 200 },
        { "HEAD", "/healthz", NULL, 200 },
        { "GET", "/no/such/route", NULL, 404 },
        { "POST", "/healthz", NULL, 405 },
        { "POST", "/v1/properties", body, 200 },
        { "GET", "/v1/properties?gas=air&T=500", NULL, 200 },
        { "GET", "/metrics", NULL, 200 },
    };
    for (size_t i = 0; i < sizeof seq / sizeof seq[0]; i++) {
        it_request rq = { seq[i].m, seq[i].t, NULL, seq[i].b, seq[i].b ? strlen(seq[i].b) : 0, 0, 0 };
        it_http(h, x->main->base, &rq, &r);
        it_dump("special/keep_alive", &rq, &r);
        CHECK(r.status == seq[i].want, "%s %s: status %ld, expected %ld (%s)", seq[i].m, seq[i].t,
              r.status, seq[i].want, r.error);
        const char *conn = it_header_get(&r, "Connection");
        CHECK(!conn || strcasecmp(conn, "close") != 0, "%s %s answered Connection: close", seq[i].m, seq[i].t);
        if (i > 0)
            CHECK(r.connects == 0, "%s %s (request %zu) opened a new connection: keep-alive broken",
                  seq[i].m, seq[i].t, i + 1);
        it_response_free(&r);
    }
    curl_easy_cleanup(h);
    return 0;
fail:
    it_response_free(&r);
    curl_easy_cleanup(h);
    return -1;
}

/* ---- body limit ----------------------------------------------------------------- */

static int t_body_limit(ctx *x)
{
    it_response r;
    char *big = padded_json(MAIN_MAX_BODY + 1);
    char *exact = padded_json(MAIN_MAX_BODY);
    char *huge = padded_json(2 * MAIN_MAX_BODY);
    char buf[8192];
    int fd = -1;
    memset(&r, 0, sizeof r);
    CHECK(big && exact && huge, "out of memory");

    /* Sent as curl's command line sends a body this large: with "Expect:
     * 100-continue", so the early 413 arrives before any of the body.
     * Without it the answer races the upload into a connection the server
     * closes after answering (seen as "Broken pipe" on a loaded machine). */
    static const char *const expect[] = { "Expect: 100-continue", NULL };
    it_request rq = { "POST", "/v1/properties", expect, big, MAIN_MAX_BODY + 1, 0, 0 };
    it_http(NULL, x->main->base, &rq, &r);
    it_dump("special/body_limit", &rq, &r);
    rq.headers = NULL;
    CHECK(r.status == 413, "body of limit+1 bytes: status %ld, expected 413 (%s)", r.status, r.error);
    CHECK(it_header_get(&r, "Content-Type") &&
          strncmp(it_header_get(&r, "Content-Type"), "application/problem+json", 24) == 0,
          "413 is not problem+json");
    CHECK(strstr(r.body, "\"status\":413") || strstr(r.body, "\"status\": 413"), "413 body lacks status: %s", r.body);
    it_response_free(&r);

    rq.body = huge;
    rq.body_len = 2 * MAIN_MAX_BODY;
    rq.chunked = 1;
    it_http(NULL, x->main->base, &rq, &r);
    it_dump("special/body_limit", &rq, &r);
    CHECK(r.status == 413, "chunked body of twice the limit: status %ld, expected 413 (%s)", r.status, r.error);
    it_response_free(&r);

    rq.body = exact;
    rq.body_len = MAIN_MAX_BODY;
    rq.chunked = 0;
    it_http(NULL, x->main->base, &rq, &r);
    it_dump("special/body_limit", &rq, &r);
    CHECK(r.status == 200, "JSON body of exactly the limit: status %ld, expected 200; %.300s", r.status, r.body);
    it_response_free(&r);

    /* Declared far too large and never sent: the answer must come from the
     * headers alone, without waiting for (or reading) the body. */
    fd = it_connect(x->main->port);
    CHECK(fd >= 0, "connect failed");
    static const char hdr[] = "POST /v1/properties HTTP/1.1\r\nHost: t\r\n"
                              "Content-Type: application/json\r\nContent-Length: 10000000000\r\n\r\n{";
    CHECK(it_send_all(fd, hdr, sizeof hdr - 1) == 0, "send failed");
    long n = it_read_response(fd, buf, sizeof buf, 5000);
    CHECK(n > 12 && strncmp(buf, "HTTP/1.1 413", 12) == 0, "declared 10 GB body: got \"%.80s\"", buf);
    CHECK(it_wait_closed(fd, 5000) == 1, "connection left open after an early 413");
    close(fd);
    free(big);
    free(exact);
    free(huge);
    return 0;
fail:
    if (fd >= 0)
        close(fd);
    it_response_free(&r);
    free(big);
    free(exact);
    free(huge);
    return -1;
}

/* ---- the recording routes' own body limit ------------------------------------------ */

#define MAIN_MAX_RECORDING_BODY (16u * 1048576u)   /* the default --max-recording-body */

/* /v1/measured/combustion takes bodies beyond --max-body (up to
 * --max-recording-body): a 2 MiB body is read and answered by the route
 * (422: no recording), and a declared 17 MiB one is refused from the
 * headers with 413 naming max_recording_body. */
static int t_recording_body_limit(ctx *x)
{
    it_response r;
    char buf[8192];
    int fd = -1;
    size_t n = 2 * MAIN_MAX_BODY;
    char *big = malloc(n + 1);
    memset(&r, 0, sizeof r);
    CHECK(big, "out of memory");
    memcpy(big, "{\"bore\": 0.09", 13);
    memset(big + 13, ' ', n - 14);
    big[n - 1] = '}';
    big[n] = '\0';
    it_request rq = { "POST", "/v1/measured/combustion", NULL, big, n, 0, 0 };
    it_http(NULL, x->main->base, &rq, &r);
    it_dump("special/recording_body_limit", &rq, &r);
    CHECK(r.status == 422, "a 2 MiB body on the recording route: status %ld, expected 422 (%s)",
          r.status, r.error);
    it_response_free(&r);
    fd = it_connect(x->main->port);
    CHECK(fd >= 0, "connect failed");
    char hdr[256];
    snprintf(hdr, sizeof hdr, "POST /v1/measured/combustion HTTP/1.1\r\nHost: t\r\n"
             "Content-Type: text/csv\r\nContent-Length: %u\r\n\r\na", MAIN_MAX_RECORDING_BODY + 1);
    CHECK(it_send_all(fd, hdr, strlen(hdr)) == 0, "send failed");
    long got = it_read_response(fd, buf, sizeof buf - 1, 5000);
    CHECK(got > 12 && strncmp(buf, "HTTP/1.1 413", 12) == 0, "declared 16 MiB + 1 recording: "
          "got \"%.80s\"", buf);
    buf[got] = '\0';
    CHECK(strstr(buf, "\"max_recording_body\"") != NULL, "413 does not name max_recording_body: "
          "%.300s", buf);
    close(fd);
    free(big);
    return 0;
fail:
    if (fd >= 0)
        close(fd);
    it_response_free(&r);
    free(big);
    return -1;
}

/* ---- HEAD ---------------------------------------------------------------------- */

static int t_head(ctx *x)
{
    it_response g, h;
    const char *targets[] = { "/healthz", "/v1/gases", "/openapi.json", "/v1/properties?gas=air&T=800" };
    memset(&g, 0, sizeof g);
    memset(&h, 0, sizeof h);
    for (size_t i = 0; i < sizeof targets / sizeof targets[0]; i++) {
        if (!(get(x, "GET", targets[i], NULL, &g, "special/head") == 0))
        goto fail;
        if (!(get(x, "HEAD", targets[i], NULL, &h, "special/head") == 0))
        goto fail;
        CHECK(g.status == 200 && h.status == 200, "%s: GET %ld, HEAD %ld", targets[i], g.status, h.status);
        CHECK(h.body_len == 0, "HEAD %s sent %zu body bytes", targets[i], h.body_len);
        const char *cl = it_header_get(&h, "Content-Length");
        CHECK(cl && strtoul(cl, NULL, 10) == g.body_len, "HEAD %s Content-Length %s, GET body %zu bytes",
              targets[i], cl ? cl : "(none)", g.body_len);
        CHECK(strcmp(it_header_get(&g, "Content-Type"), it_header_get(&h, "Content-Type")) == 0,
              "HEAD %s Content-Type differs from GET", targets[i]);
        it_response_free(&g);
        it_response_free(&h);
    }
    return 0;
fail:
    it_response_free(&g);
    it_response_free(&h);
    return -1;
}

/* ---- long request targets ------------------------------------------------------ */

static int t_long_target(ctx *x)
{
    it_response r;
    char *target = malloc(48 * 1024);
    memset(&r, 0, sizeof r);
    CHECK(target, "out of memory");
    /* About 10 KB of query (a spreadsheet building a long URL) reaches the API
     * layer, which answers for the unknown field, not the HTTP layer. */
    int n = snprintf(target, 48 * 1024, "/v1/properties?gas=air&T=300&remark=");
    memset(target + n, 'q', 10000);
    target[n + 10000] = '\0';
    if (get(x, "GET", target, NULL, &r, "special/long_target") != 0)
        goto fail;
    CHECK(r.status == 400 || r.status == 422, "10 KB query: status %ld, expected the API's 400/422", r.status);
    it_response_free(&r);
    /* Far beyond the connection memory: refused with a 4xx, server unharmed. */
    memset(target + n, 'q', 40000);
    target[n + 40000] = '\0';
    it_request rq = { "GET", target, NULL, NULL, 0, 0, 0 };
    it_http(NULL, x->main->base, &rq, &r);
    CHECK(r.status == 414 || r.status == 431, "40 KB query: status %ld, expected 414 or 431", r.status);
    it_response_free(&r);
    if (get(x, "GET", "/healthz", NULL, &r, "special/long_target") != 0)
        goto fail;
    CHECK(r.status == 200, "healthz after a huge request target: %ld", r.status);
    it_response_free(&r);
    free(target);
    return 0;
fail:
    it_response_free(&r);
    free(target);
    return -1;
}

/* ---- request ids and the access log --------------------------------------------- */

static int t_request_id(ctx *x)
{
    it_response a, b;
    memset(&a, 0, sizeof a);
    memset(&b, 0, sizeof b);
    if (!(get(x, "GET", "/healthz", NULL, &a, "special/request_id") == 0))
        goto fail;
    if (!(get(x, "GET", "/healthz", NULL, &b, "special/request_id") == 0))
        goto fail;
    const char *ia = it_header_get(&a, "X-Request-Id"), *ib = it_header_get(&b, "X-Request-Id");
    CHECK(is_hex16(ia) && is_hex16(ib), "generated ids \"%s\", \"%s\" are not 16 hex digits", ia, ib);
    CHECK(strcmp(ia, ib) != 0, "two requests got the same id %s", ia);
    it_response_free(&a);
    it_response_free(&b);

    const char *echo[] = { "X-Request-Id: it-log-check.1_a:b", NULL };
    if (!(get(x, "GET", "/healthz", echo, &a, "special/request_id") == 0))
        goto fail;
    CHECK(strcmp(it_header_get(&a, "X-Request-Id"), "it-log-check.1_a:b") == 0,
          "sane id not echoed: %s", it_header_get(&a, "X-Request-Id"));
    it_response_free(&a);

    char long_id[128];
    snprintf(long_id, sizeof long_id, "X-Request-Id: %065d", 7);
    const char *bad1[] = { long_id, NULL };
    const char *bad2[] = { "X-Request-Id: has spaces\"and quotes", NULL };
    if (!(get(x, "GET", "/healthz", bad1, &a, "special/request_id") == 0))
        goto fail;
    CHECK(is_hex16(it_header_get(&a, "X-Request-Id")), "65-character id was not replaced: %s",
          it_header_get(&a, "X-Request-Id"));
    it_response_free(&a);
    if (!(get(x, "GET", "/healthz", bad2, &a, "special/request_id") == 0))
        goto fail;
    CHECK(is_hex16(it_header_get(&a, "X-Request-Id")), "id with spaces was not replaced: %s",
          it_header_get(&a, "X-Request-Id"));
    it_response_free(&a);

    /* The access line is written when the response is done: allow a moment. */
    const char *needles[] = { "\"msg\":\"request\"", "\"level\":\"info\"",
                              "\"request_id\":\"it-log-check.1_a:b\"", "\"method\":\"GET\"",
                              "\"path\":\"/healthz\"", "\"status\":200", "\"bytes\":15",
                              "\"duration_us\":", "\"time\":\"", "Z\",", NULL };
    int found = 0;
    for (int i = 0; i < 100 && !found; i++) {
        found = it_server_log_has_line(x->main, needles);
        if (!found)
            sleep_ms(20);
    }
    CHECK(found, "no access log line with the echoed id, method, path, status, bytes and duration");
    /* Bodies stay out of the log unless --debug-bodies is given (the cases
     * posted several JSON bodies by now). */
    const char *body_field[] = { "\"body\":", NULL };
    CHECK(!it_server_log_has_line(x->main, body_field), "a request body was logged without --debug-bodies");
    return 0;
fail:
    it_response_free(&a);
    it_response_free(&b);
    return -1;
}

/* ---- metrics ------------------------------------------------------------------------ */

/* Checks the Prometheus text format 0.0.4 line by line: comments are HELP or
 * TYPE, samples are name{label="value",...} value, every sample belongs to a
 * family with a TYPE line, histogram buckets are cumulative and end in +Inf
 * equal to _count. Returns 0 or -1 with the reason. */
static int check_exposition(const char *text, char *why, size_t len)
{
    regex_t sample, help, type;
    int rc = 0;
    char types[64][128];
    size_t n_types = 0;
    regcomp(&sample, "^[a-zA-Z_:][a-zA-Z0-9_:]*(\\{([a-zA-Z_][a-zA-Z0-9_]*=\"([^\"\\\\]|\\\\.)*\",?)*\\})? "
                     "[-+]?([0-9.eE+-]+|Inf|NaN)$", REG_EXTENDED | REG_NOSUB);
    regcomp(&help, "^# HELP [a-zA-Z_:][a-zA-Z0-9_:]* .+$", REG_EXTENDED | REG_NOSUB);
    regcomp(&type, "^# TYPE ([a-zA-Z_:][a-zA-Z0-9_:]*) (counter|gauge|histogram|summary|untyped)$",
            REG_EXTENDED);
    const char *p = text;
    char last_bucket_name[256] = "";
    double last_bucket = -1;
    while (*p && rc == 0) {
        const char *e = strchr(p, '\n');
        if (!e) {
            snprintf(why, len, "the last line has no newline");
            rc = -1;
            break;
        }
        char line[1024];
        size_t l = (size_t)(e - p);
        if (l >= sizeof line)
            l = sizeof line - 1;
        memcpy(line, p, l);
        line[l] = '\0';
        p = e + 1;
        if (line[0] == '#') {
            regmatch_t m[3];
            if (regexec(&type, line, 3, m, 0) == 0) {
                if (n_types < 64) {
                    size_t nl = (size_t)(m[1].rm_eo - m[1].rm_so);
                    snprintf(types[n_types++], sizeof types[0], "%.*s", (int)nl, line + m[1].rm_so);
                }
            } else if (regexec(&help, line, 0, NULL, 0) != 0) {
                snprintf(why, len, "bad comment line: %.300s", line);
                rc = -1;
            }
            continue;
        }
        if (regexec(&sample, line, 0, NULL, 0) != 0) {
            snprintf(why, len, "bad sample line: %.300s", line);
            rc = -1;
            break;
        }
        size_t nl = strcspn(line, "{ ");
        int typed = 0;
        for (size_t i = 0; i < n_types && !typed; i++) {
            size_t tl = strlen(types[i]);
            if (nl >= tl && strncmp(line, types[i], tl) == 0 &&
                (nl == tl || !strcmp(line + tl, "") ||
                 !strncmp(line + tl, "_bucket", 7) || !strncmp(line + tl, "_sum", 4) ||
                 !strncmp(line + tl, "_count", 6)))
                typed = 1;
        }
        if (!typed) {
            snprintf(why, len, "sample without a TYPE line: %.300s", line);
            rc = -1;
            break;
        }
        const char *le = strstr(line, ",le=\"");
        if (strstr(line, "_bucket{") && le) {
            char series[256];
            size_t sl = (size_t)(le - line);
            snprintf(series, sizeof series, "%.*s", (int)(sl < 255 ? sl : 255), line);
            double v = strtod(strrchr(line, ' ') + 1, NULL);
            if (strcmp(series, last_bucket_name) == 0 && v < last_bucket) {
                snprintf(why, len, "histogram buckets not cumulative at: %.300s", line);
                rc = -1;
            }
            snprintf(last_bucket_name, sizeof last_bucket_name, "%s", series);
            last_bucket = v;
        } else if (strstr(line, "_count{") && last_bucket_name[0]) {
            double v = strtod(strrchr(line, ' ') + 1, NULL);
            if (v != last_bucket) {
                snprintf(why, len, "_count %g differs from the +Inf bucket %g: %.300s", v, last_bucket, line);
                rc = -1;
            }
            last_bucket_name[0] = '\0';
        }
    }
    regfree(&sample);
    regfree(&help);
    regfree(&type);
    return rc;
}

/* Value of the sample line starting with `series` (exact up to the space); 0 if absent. */
static double sample_value(const char *text, const char *series)
{
    size_t n = strlen(series);
    const char *p = text;
    while ((p = strstr(p, series)) != NULL) {
        if ((p == text || p[-1] == '\n') && p[n] == ' ')
            return strtod(p + n + 1, NULL);
        p += n;
    }
    return 0;
}

static int t_metrics(ctx *x)
{
    it_response m1, m2, r;
    char why[512];
    memset(&m1, 0, sizeof m1);
    memset(&m2, 0, sizeof m2);
    memset(&r, 0, sizeof r);
    static const char c_ok[] = "gascycled_http_requests_total{route=\"healthz\",method=\"GET\",status=\"200\"}";
    static const char c_404[] = "gascycled_http_requests_total{route=\"unmatched\",method=\"GET\",status=\"404\"}";
    static const char h_cnt[] = "gascycled_http_request_duration_seconds_count{route=\"healthz\"}";
    static const char e_404[] = "gascycled_errors_total{class=\"not_found\"}";

    if (!(get(x, "GET", "/metrics", NULL, &m1, "special/metrics") == 0))
        goto fail;
    CHECK(m1.status == 200, "/metrics status %ld", m1.status);
    CHECK(strncmp(it_header_get(&m1, "Content-Type"), "text/plain; version=0.0.4", 25) == 0,
          "/metrics Content-Type %s", it_header_get(&m1, "Content-Type"));
    CHECK(check_exposition(m1.body, why, sizeof why) == 0, "exposition format: %s", why);
    CHECK(sample_value(m1.body, "gascycled_http_requests_in_flight") >= 1,
          "in-flight gauge below 1 while /metrics itself is in flight");
    CHECK(sample_value(m1.body, "gascycled_uptime_seconds") > 0, "uptime not positive");

    for (int i = 0; i < 5; i++) {
        if (!(get(x, "GET", "/healthz", NULL, &r, "special/metrics") == 0))
        goto fail;
        it_response_free(&r);
    }
    if (!(get(x, "GET", "/it/metrics/no-such-page", NULL, &r, "special/metrics") == 0))
        goto fail;
    CHECK(r.status == 404, "unknown path status %ld", r.status);
    it_response_free(&r);
    /* Counters move when a response is done, which may lag the client's
     * view on a loaded machine: poll (up to 10 s) instead of sleeping a
     * fixed time. */
    for (int tries = 0; tries < 100; tries++) {
        if (!(get(x, "GET", "/metrics", NULL, &m2, "special/metrics") == 0))
            goto fail;
        if (tries == 99 ||
            (sample_value(m2.body, h_cnt) - sample_value(m1.body, h_cnt) >= 5 &&
             sample_value(m2.body, c_404) - sample_value(m1.body, c_404) >= 1))
            break;
        it_response_free(&m2);
        memset(&m2, 0, sizeof m2);
        sleep_ms(100);
    }
    CHECK(check_exposition(m2.body, why, sizeof why) == 0, "exposition format: %s", why);

    double d_ok = sample_value(m2.body, c_ok) - sample_value(m1.body, c_ok);
    double d_404 = sample_value(m2.body, c_404) - sample_value(m1.body, c_404);
    double d_hist = sample_value(m2.body, h_cnt) - sample_value(m1.body, h_cnt);
    double d_err = sample_value(m2.body, e_404) - sample_value(m1.body, e_404);
    CHECK(d_ok == 5, "%s rose by %g after 5 requests", c_ok, d_ok);
    CHECK(d_404 == 1, "%s rose by %g after 1 request", c_404, d_404);
    CHECK(d_hist == 5, "%s rose by %g after 5 requests", h_cnt, d_hist);
    CHECK(d_err == 1, "%s rose by %g after 1 not-found", e_404, d_err);
    it_response_free(&m1);
    it_response_free(&m2);
    return 0;
fail:
    it_response_free(&m1);
    it_response_free(&m2);
    it_response_free(&r);
    return -1;
}

/* ---- concurrency -------------------------------------------------------------------- */

typedef struct worker {
    const char *base;
    int id;
    int failures;
    long connects;
    char first_error[256];
} worker;

#define N_WORKERS 16
#define N_PER_WORKER 100

static void *worker_main(void *arg)
{
    worker *w = arg;
    CURL *h = curl_easy_init();
    char target[128];
    for (int i = 0; i < N_PER_WORKER; i++) {
        it_response r;
        long want = 200;
        switch (i % 4) {
        case 0: snprintf(target, sizeof target, "/healthz"); break;
        case 1: snprintf(target, sizeof target, "/v1/properties?gas=air&T=%d", 300 + w->id * 50 + i); break;
        case 2: snprintf(target, sizeof target, "/v1/gases"); break;
        default: snprintf(target, sizeof target, "/it/missing/%d", i); want = 404; break;
        }
        it_request rq = { "GET", target, NULL, NULL, 0, 0, 0 };
        it_http(h, w->base, &rq, &r);
        w->connects += r.connects;
        if (r.status != want) {
            if (!w->failures)
                snprintf(w->first_error, sizeof w->first_error, "GET %.100s: %ld (%.100s)", target, r.status, r.error);
            w->failures++;
        }
        it_response_free(&r);
    }
    curl_easy_cleanup(h);
    return NULL;
}

static int t_concurrency(ctx *x)
{
    pthread_t th[N_WORKERS];
    worker w[N_WORKERS];
    int failures = 0;
    long connects = 0;
    for (int i = 0; i < N_WORKERS; i++) {
        memset(&w[i], 0, sizeof w[i]);
        w[i].base = x->main->base;
        w[i].id = i;
        pthread_create(&th[i], NULL, worker_main, &w[i]);
    }
    for (int i = 0; i < N_WORKERS; i++) {
        pthread_join(th[i], NULL);
        failures += w[i].failures;
        connects += w[i].connects;
    }
    for (int i = 0; i < N_WORKERS; i++)
        CHECK(w[i].failures == 0, "%d of %d concurrent requests failed; first: %s", failures,
              N_WORKERS * N_PER_WORKER, w[i].first_error);
    CHECK(connects == N_WORKERS, "%ld connections for %d keep-alive clients", connects, N_WORKERS);
    return 0;
fail:
    return -1;
}

/* ---- slow clients and a second server ----------------------------------------------- */

static int t_timeout(ctx *x)
{
    it_server s2;
    char log[1024];
    int fd1 = -1, fd2 = -1;
    it_response r;
    memset(&r, 0, sizeof r);
    snprintf(log, sizeof log, "%s/server-timeout.log", x->logs);
    /* --timeout comes from the environment here (and a flag overrides a
     * variable: GASCYCLED_LOG_FORMAT=text loses to the harness's json flag). */
    const char *env[] = { "GASCYCLED_TIMEOUT=1", "GASCYCLED_LOG_FORMAT=text", "GASCYCLED_CORS=*", NULL };
    const char *args[] = { "--threads", "1", NULL };
    if (it_server_start(&s2, x->binary, log, args, env) != 0) {
        snprintf(x->msg, sizeof x->msg, "second server (GASCYCLED_TIMEOUT=1) did not start");
        it_server_free(&s2);
        return -1;
    }
    double t0 = it_now();
    fd1 = it_connect(s2.port);
    fd2 = it_connect(s2.port);
    CHECK(fd1 >= 0 && fd2 >= 0, "connect failed");
    static const char partial[] = "GET /healthz HTTP/1.1\r\nHost: t\r\n";   /* never finished */
    CHECK(it_send_all(fd1, partial, sizeof partial - 1) == 0, "send failed");
    /* Meanwhile the server keeps serving others. */
    it_request rq = { "GET", "/healthz", NULL, NULL, 0, 0, 0 };
    it_http(NULL, s2.base, &rq, &r);
    CHECK(r.status == 200, "healthz during a slow client: %ld", r.status);
    it_response_free(&r);
    CHECK(it_wait_closed(fd1, 10000) == 1, "half-sent request not dropped within 10 s (--timeout 1)");
    double t1 = it_now() - t0;
    CHECK(t1 >= 0.5, "connection dropped after %.2f s, before the 1 s timeout", t1);
    CHECK(it_wait_closed(fd2, 10000) == 1, "silent connection not dropped within 10 s (--timeout 1)");
    close(fd1);
    close(fd2);

    /* A body trickled a byte at a time is never idle for a second, but the
     * whole body must come within --timeout of the headers. */
    fd1 = it_connect(s2.port);
    CHECK(fd1 >= 0, "connect failed");
    static const char trickle[] = "POST /v1/properties HTTP/1.1\r\nHost: t\r\n"
                                  "Content-Type: application/json\r\nContent-Length: 100\r\n\r\n";
    CHECK(it_send_all(fd1, trickle, sizeof trickle - 1) == 0, "send failed");
    int dropped = 0;
    t0 = it_now();
    for (int k = 0; k < 40 && !dropped; k++) {
        sleep_ms(250);
        dropped = it_send_all(fd1, " ", 1) != 0 || it_wait_closed(fd1, 1) == 1;
    }
    CHECK(dropped, "a trickled body was not cut off within 10 s (--timeout 1)");
    CHECK(it_now() - t0 >= 0.9, "trickled body cut after %.2f s, before the timeout", it_now() - t0);

    /* --cors * from the environment: any origin, answered with "*". */
    const char *pre[] = { "Origin: https://anyone.example", "Access-Control-Request-Method: POST", NULL };
    it_request po = { "OPTIONS", "/v1/properties", pre, NULL, 0, 0, 0 };
    it_http(NULL, s2.base, &po, &r);
    CHECK(r.status == 204, "preflight status %ld", r.status);
    CHECK(it_header_get(&r, "Access-Control-Allow-Origin") &&
          strcmp(it_header_get(&r, "Access-Control-Allow-Origin"), "*") == 0,
          "--cors * preflight: Access-Control-Allow-Origin %s",
          it_header_get(&r, "Access-Control-Allow-Origin") ? it_header_get(&r, "Access-Control-Allow-Origin") : "(none)");
    it_response_free(&r);

    close(fd1);
    fd1 = fd2 = -1;
    int st = it_server_stop(&s2, 15);
    CHECK(st == 0, "second server exit status %d after SIGTERM", st);
    it_server_free(&s2);
    return 0;
fail:
    if (fd1 >= 0)
        close(fd1);
    if (fd2 >= 0)
        close(fd2);
    it_response_free(&r);
    it_server_free(&s2);
    return -1;
}

/* ---- flags --------------------------------------------------------------------------- */

static int t_flags(ctx *x)
{
    char *out = NULL, *err = NULL;
    char port[16];
    snprintf(port, sizeof port, "%u", x->main->port);
    const struct { const char *a[4]; const char *env; int want; const char *in_err; } runs[] = {
        { { "--port", "70000" }, NULL, 2, "--port" },
        { { "--port", "-1" }, NULL, 2, "--port" },
        { { "--bogus" }, NULL, 2, "--bogus" },
        { { "stray" }, NULL, 2, "stray" },
        { { "--max-body", "abc" }, NULL, 2, "--max-body" },
        { { "--max-body", "0" }, NULL, 2, "--max-body" },
        { { "--max-body=2T" }, NULL, 2, "--max-body" },
        { { "--threads", "0" }, NULL, 2, "--threads" },
        { { "--timeout", "0" }, NULL, 2, "--timeout" },
        { { "--timeout" }, NULL, 2, "--timeout" },
        { { "--log-format", "xml" }, NULL, 2, "--log-format" },
        { { "--log-level", "loud" }, NULL, 2, "--log-level" },
        { { "--cors", "ftp://x.example" }, NULL, 2, "--cors" },
        { { "--cors", "https://x.example/path" }, NULL, 2, "--cors" },
        { { "--listen", "999.1.1.1" }, NULL, 2, "--listen" },
        { { "--debug-bodies=yes" }, NULL, 2, "--debug-bodies" },
        { { NULL }, "GASCYCLED_PORT=abc", 2, "GASCYCLED_PORT" },
        { { NULL }, "GASCYCLED_MAX_BODY=-5", 2, "GASCYCLED_MAX_BODY" },
        { { "--port", port }, NULL, 1, "cannot start" },   /* taken by the main server */
    };
    for (size_t i = 0; i < sizeof runs / sizeof runs[0]; i++) {
        const char *env[] = { runs[i].env, NULL };
        int st = it_run_capture(x->binary, runs[i].a, env, &out, &err);
        CHECK(st == runs[i].want, "gascycled %s %s (env %s): exit %d, expected %d; stderr: %s",
              runs[i].a[0] ? runs[i].a[0] : "", runs[i].a[1] ? runs[i].a[1] : "",
              runs[i].env ? runs[i].env : "-", st, runs[i].want, err);
        CHECK(strstr(err, runs[i].in_err), "stderr for %s does not name %s: %s",
              runs[i].a[0] ? runs[i].a[0] : runs[i].env, runs[i].in_err, err);
        free(out);
        free(err);
        out = err = NULL;
    }

    const char *help[] = { "--help", NULL };
    CHECK(it_run_capture(x->binary, help, NULL, &out, &err) == 0, "--help exit status not 0");
    static const char *const documented[] = {
        "--listen", "GASCYCLED_LISTEN", "--port", "GASCYCLED_PORT", "--threads", "GASCYCLED_THREADS",
        "--max-body", "GASCYCLED_MAX_BODY", "--timeout", "GASCYCLED_TIMEOUT", "--grace", "GASCYCLED_GRACE",
        "--cors", "GASCYCLED_CORS", "--log-format", "GASCYCLED_LOG_FORMAT", "--log-level",
        "GASCYCLED_LOG_LEVEL", "--debug-bodies", "GASCYCLED_DEBUG_BODIES", "--version", "default: 8080",
        "default: 127.0.0.1", "default: 1M", "default: 30", NULL };
    for (size_t i = 0; documented[i]; i++)
        CHECK(strstr(out, documented[i]), "--help does not mention %s", documented[i]);
    free(out);
    free(err);
    out = err = NULL;

    const char *ver[] = { "--version", NULL };
    CHECK(it_run_capture(x->binary, ver, NULL, &out, &err) == 0, "--version exit status not 0");
    CHECK(strncmp(out, "gascycled ", 10) == 0, "--version printed \"%s\"", out);
    free(out);
    free(err);
    return 0;
fail:
    free(out);
    free(err);
    return -1;
}

/* ---- SIGTERM drain ----------------------------------------------------------------------- */

#define N_SLOW 3

static int t_drain(ctx *x)
{
    it_server s3;
    char log[1024], buf[4096];
    int fa = -1, fb[N_SLOW], i;
    for (i = 0; i < N_SLOW; i++)
        fb[i] = -1;
    snprintf(log, sizeof log, "%s/server-drain.log", x->logs);
    const char *args[] = { "--grace", "20", "--debug-bodies", NULL };
    if (it_server_start(&s3, x->binary, log, args, NULL) != 0) {
        snprintf(x->msg, sizeof x->msg, "drain server did not start");
        it_server_free(&s3);
        return -1;
    }
    static const char get_h[] = "GET /healthz HTTP/1.1\r\nHost: t\r\n\r\n";
    static const char get_r[] = "GET /readyz HTTP/1.1\r\nHost: t\r\n\r\n";
    /* A request with a body sent in two halves stays in flight in between. */
    static const char slow1[] = "GET /healthz HTTP/1.1\r\nHost: t\r\nContent-Length: 10\r\n\r\n12345";
    static const char slow2[] = "67890";

    fa = it_connect(s3.port);
    CHECK(fa >= 0, "connect failed");
    CHECK(it_send_all(fa, get_r, sizeof get_r - 1) == 0, "send failed");
    CHECK(it_read_response(fa, buf, sizeof buf, 5000) > 0 && strncmp(buf, "HTTP/1.1 200", 12) == 0,
          "readyz before SIGTERM: \"%.60s\"", buf);
    for (i = 0; i < N_SLOW; i++) {
        fb[i] = it_connect(s3.port);
        CHECK(fb[i] >= 0, "connect failed");
        CHECK(it_send_all(fb[i], slow1, sizeof slow1 - 1) == 0, "send failed");
    }
    sleep_ms(300);
    CHECK(kill(s3.pid, SIGTERM) == 0, "kill failed");
    sleep_ms(300);

    /* Open keep-alive connection: /readyz now says 503 and closes. The
     * signal reaches the server's main loop after a scheduling delay that a
     * loaded machine can stretch: a 200 (still serving) is asked again,
     * for up to 5 s, on the same connection. */
    for (int tries = 0; tries < 50; tries++) {
        CHECK(it_send_all(fa, get_r, sizeof get_r - 1) == 0, "send on the idle connection failed");
        CHECK(it_read_response(fa, buf, sizeof buf, 5000) > 0, "no answer from readyz");
        if (strncmp(buf, "HTTP/1.1 200", 12) != 0)
            break;
        sleep_ms(100);
    }
    CHECK(strncmp(buf, "HTTP/1.1 503", 12) == 0, "readyz while draining: \"%.60s\"", buf);
    CHECK(strcasestr(buf, "\r\nConnection: close"), "503 from readyz without Connection: close");
    CHECK(strstr(buf, "draining"), "readyz body does not say draining: %.500s", buf);

    /* No new connections. */
    int fc = it_connect(s3.port);
    if (fc >= 0) {
        int closed = it_send_all(fc, get_h, sizeof get_h - 1) != 0 || it_wait_closed(fc, 2000) == 1;
        close(fc);
        CHECK(closed, "a new connection was served while draining");
    }

    /* The requests in flight finish normally. */
    for (i = 0; i < N_SLOW; i++) {
        CHECK(it_send_all(fb[i], slow2, sizeof slow2 - 1) == 0, "sending the rest failed: the server cut an in-flight request");
        CHECK(it_read_response(fb[i], buf, sizeof buf, 5000) > 0 && strncmp(buf, "HTTP/1.1 200", 12) == 0,
              "in-flight request %d after SIGTERM: \"%.60s\"", i, buf);
        CHECK(strstr(buf, "{\"status\":\"ok\"}"), "in-flight response incomplete: %.500s", buf);
    }
    int st = it_server_wait(&s3, 15);
    CHECK(st == 0, "exit status %d after drain", st);
    const char *l1[] = { "\"msg\":\"draining\"", "\"signal\":\"SIGTERM\"", NULL };
    const char *l2[] = { "\"msg\":\"stopped\"", "\"reason\":\"drained\"", "\"requests_cut\":0", NULL };
    CHECK(it_server_log_has_line(&s3, l1), "no draining log line");
    CHECK(it_server_log_has_line(&s3, l2), "no stopped log line with reason drained");
    const char *l3[] = { "\"msg\":\"request\"", "\"body\":\"1234567890\"", NULL };
    CHECK(it_server_log_has_line(&s3, l3), "--debug-bodies: the request body is not in the access log");
    close(fa);
    for (i = 0; i < N_SLOW; i++)
        close(fb[i]);
    it_server_free(&s3);
    return 0;
fail:
    if (fa >= 0)
        close(fa);
    for (i = 0; i < N_SLOW; i++)
        if (fb[i] >= 0)
            close(fb[i]);
    it_server_free(&s3);
    return -1;
}

/* ---- main ----------------------------------------------------------------------------- */

typedef struct special {
    const char *name;
    int (*fn)(ctx *);
} special;

static const special specials[] = {
    { "keep_alive", t_keep_alive },
    { "body_limit", t_body_limit },
    { "recording_body_limit", t_recording_body_limit },
    { "head", t_head },
    { "long_target", t_long_target },
    { "request_id", t_request_id },
    { "metrics", t_metrics },
    { "concurrency", t_concurrency },
    { "timeout", t_timeout },
    { "flags", t_flags },
    { "drain", t_drain },
};

static void usage(void)
{
    fprintf(stderr, "usage: runner --server BIN --cases DIR [--dump DIR] [--logs DIR] [--filter TEXT] [--no-special]\n");
}

int main(int argc, char **argv)
{
    const char *server = NULL, *cases = NULL, *dump = NULL, *logs = "build/integration", *filter = NULL;
    int no_special = 0;
    for (int i = 1; i < argc; i++) {
        if (!strcmp(argv[i], "--server") && i + 1 < argc)
            server = argv[++i];
        else if (!strcmp(argv[i], "--cases") && i + 1 < argc)
            cases = argv[++i];
        else if (!strcmp(argv[i], "--dump") && i + 1 < argc)
            dump = argv[++i];
        else if (!strcmp(argv[i], "--logs") && i + 1 < argc)
            logs = argv[++i];
        else if (!strcmp(argv[i], "--filter") && i + 1 < argc)
            filter = argv[++i];
        else if (!strcmp(argv[i], "--no-special"))
            no_special = 1;
        else {
            usage();
            return 2;
        }
    }
    if (!server || !cases) {
        usage();
        return 2;
    }
    signal(SIGPIPE, SIG_IGN);
    curl_global_init(CURL_GLOBAL_DEFAULT);
    if (it_dump_init(dump) != 0) {
        fprintf(stderr, "runner: cannot prepare dump folder %s\n", dump);
        return 2;
    }
    {
        /* make the log folder (and parents) */
        char tmp[1024];
        snprintf(tmp, sizeof tmp, "%s", logs);
        for (char *p = tmp + 1; *p; p++)
            if (*p == '/') {
                *p = '\0';
                mkdir(tmp, 0755);
                *p = '/';
            }
        mkdir(tmp, 0755);
    }

    it_server s;
    char log[1024];
    snprintf(log, sizeof log, "%s/server-main.log", logs);
    const char *args[] = { "--cors", "https://portal.example,https://dash.example", NULL };
    if (it_server_start(&s, server, log, args, NULL) != 0) {
        fprintf(stderr, "runner: the server did not start (log: %s)\n", log);
        it_server_free(&s);
        return 2;
    }
    printf("server %s on port %u (log %s)\n", server, s.port, log);

    it_stats st = { 0, 0 };
    it_cases_run_dir(cases, s.base, filter, &st);

    if (!no_special) {
        ctx x = { server, logs, &s, "" };
        for (size_t i = 0; i < sizeof specials / sizeof specials[0]; i++) {
            char name[64];
            snprintf(name, sizeof name, "special/%s", specials[i].name);
            if (filter && !strstr(name, filter))
                continue;
            x.msg[0] = '\0';
            double t0 = it_now();
            if (specials[i].fn(&x) == 0) {
                printf("ok   %s (%.2f s)\n", name, it_now() - t0);
                st.passed++;
            } else {
                printf("FAIL %s: %s\n", name, x.msg);
                st.failed++;
            }
            fflush(stdout);
        }
    }

    int code = it_server_stop(&s, 30);
    if (code != 0) {
        printf("FAIL server exit status %d after SIGTERM (expected 0; log %s)\n", code, log);
        st.failed++;
    } else {
        printf("ok   server stopped by SIGTERM, exit status 0\n");
        st.passed++;
    }
    it_server_free(&s);
    curl_global_cleanup();
    printf("integration: %d passed, %d failed\n", st.passed, st.failed);
    return st.failed ? 1 : 0;
}
