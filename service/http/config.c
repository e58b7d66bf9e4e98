/*
 * config.c — server configuration from defaults, GASCYCLED_* environment
 * variables and command-line flags (see http.h). One table lists every
 * option with its flag, variable, default and help text; --help is printed
 * from it, so the documentation cannot drift from what is parsed.
 * Flags take their value as "--flag value" or "--flag=value".
 */
#include "http/http.h"
#include "http/log.h"

#include <arpa/inet.h>
#include <ctype.h>
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <unistd.h>

#ifndef GC_VERSION
#define GC_VERSION "0.0.0"
#endif
#ifndef GC_GIT_REV
#define GC_GIT_REV "unknown"
#endif

#define MAX_BODY_LIMIT ((size_t)1 << 30)   /* bytes: 1 GiB, far above any real request */

typedef int (*apply_fn)(gc_http_config *cfg, const char *val, char *err, size_t err_len);

typedef struct option_spec {
    const char *flag;       /* "--port" */
    const char *env;        /* "GASCYCLED_PORT" */
    const char *metavar;    /* NULL for a switch without a value */
    const char *def;        /* default, as shown in --help */
    const char *help;
    apply_fn apply;
} option_spec;

/* Parses a whole decimal number (digits only) no larger than max. */
static int parse_uint(const char *s, unsigned long long max, unsigned long long *out)
{
    unsigned long long v = 0;
    if (!s || !*s)
        return -1;
    for (const char *p = s; *p; p++) {
        if (*p < '0' || *p > '9')
            return -1;
        unsigned d = (unsigned)(*p - '0');
        if (v > (max - d) / 10)
            return -1;
        v = v * 10 + d;
    }
    *out = v;
    return 0;
}

static int apply_listen(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned char buf[sizeof(struct in6_addr)];
    const char *addr = val;
    if (strcmp(val, "localhost") == 0)
        addr = "127.0.0.1";
    if (strlen(addr) >= sizeof cfg->listen ||
        (inet_pton(AF_INET, addr, buf) != 1 && inet_pton(AF_INET6, addr, buf) != 1)) {
        snprintf(err, err_len, "\"%s\" is not an IPv4 or IPv6 address (e.g. 127.0.0.1, 0.0.0.0, ::1)", val);
        return -1;
    }
    snprintf(cfg->listen, sizeof cfg->listen, "%s", addr);
    return 0;
}

static int apply_port(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (parse_uint(val, 65535, &v) != 0) {
        snprintf(err, err_len, "\"%s\" is not a port number (0..65535, 0 = any free port)", val);
        return -1;
    }
    cfg->port = (unsigned)v;
    return 0;
}

static int apply_threads(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (parse_uint(val, 1024, &v) != 0 || v < 1) {
        snprintf(err, err_len, "\"%s\" is not a thread count (1..1024)", val);
        return -1;
    }
    cfg->threads = (unsigned)v;
    return 0;
}

/* A size in bytes with an optional 1024-based suffix (k, M, G), 1 to 1G. */
static int parse_size(const char *val, size_t *out)
{
    char digits[32];
    size_t n = 0;
    unsigned long long v, mult = 1;
    while (val[n] >= '0' && val[n] <= '9' && n < sizeof digits - 1) {
        digits[n] = val[n];
        n++;
    }
    digits[n] = '\0';
    const char *suf = val + n;
    if (*suf == '\0' || strcmp(suf, "B") == 0)
        mult = 1;
    else if (!strcmp(suf, "k") || !strcmp(suf, "K") || !strcmp(suf, "KiB") || !strcmp(suf, "kB"))
        mult = 1024;
    else if (!strcmp(suf, "m") || !strcmp(suf, "M") || !strcmp(suf, "MiB") || !strcmp(suf, "MB"))
        mult = 1024 * 1024;
    else if (!strcmp(suf, "g") || !strcmp(suf, "G") || !strcmp(suf, "GiB") || !strcmp(suf, "GB"))
        mult = 1024 * 1024 * 1024;
    else
        mult = 0;
    if (mult == 0 || parse_uint(digits, MAX_BODY_LIMIT, &v) != 0 || v < 1 ||
        v > MAX_BODY_LIMIT / mult)
        return -1;
    *out = (size_t)(v * mult);
    return 0;
}

static int apply_max_body(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    if (parse_size(val, &cfg->max_body) != 0) {
        snprintf(err, err_len,
                 "\"%s\" is not a body size (bytes, 1 to 1G; suffixes k, M, G are powers of 1024)", val);
        return -1;
    }
    return 0;
}

static int apply_max_recording_body(gc_http_config *cfg, const char *val, char *err,
                                    size_t err_len)
{
    if (parse_size(val, &cfg->max_recording_body) != 0) {
        snprintf(err, err_len,
                 "\"%s\" is not a body size (bytes, 1 to 1G; suffixes k, M, G are powers of 1024)", val);
        return -1;
    }
    return 0;
}

static int apply_max_body_total(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    if (parse_size(val, &cfg->max_body_total) != 0) {
        snprintf(err, err_len,
                 "\"%s\" is not a size (bytes, 1 to 1G; suffixes k, M, G are powers of 1024)", val);
        return -1;
    }
    return 0;
}

/* A whole number in [lo, hi] for the option `what`. */
static int apply_range(const char *val, unsigned long long lo, unsigned long long hi,
                       const char *what, unsigned long long *out, char *err, size_t err_len)
{
    if (parse_uint(val, hi, out) != 0 || *out < lo) {
        snprintf(err, err_len, "\"%s\" is not %s (%llu..%llu)", val, what, lo, hi);
        return -1;
    }
    return 0;
}

static int apply_header_timeout(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (apply_range(val, 1, 3600, "a header timeout (whole seconds)", &v, err, err_len) != 0)
        return -1;
    cfg->header_timeout_s = (unsigned)v;
    return 0;
}

static int apply_max_connections(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (apply_range(val, 1, 1000000, "a connection count", &v, err, err_len) != 0)
        return -1;
    cfg->max_connections = (unsigned)v;
    cfg->max_connections_set = 1;
    return 0;
}

static int apply_per_client(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (apply_range(val, 0, 1000000, "a connection count (0 = no cap)", &v, err, err_len) != 0)
        return -1;
    cfg->max_per_client = (unsigned)v;
    return 0;
}

static int apply_composite_workers(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (apply_range(val, 1, 256, "a worker count", &v, err, err_len) != 0)
        return -1;
    cfg->composite_workers = (unsigned)v;
    return 0;
}

static int apply_composite_queue(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (apply_range(val, 0, 100000, "a queue length", &v, err, err_len) != 0)
        return -1;
    cfg->composite_queue = (unsigned)v;
    cfg->composite_queue_set = 1;
    return 0;
}

static int apply_max_evaluations(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (apply_range(val, 0, 100000000, "an evaluation count (0 = no limit)", &v, err, err_len) != 0)
        return -1;
    cfg->max_evaluations = (unsigned long)v;
    return 0;
}

static int apply_max_request_ms(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (apply_range(val, 0, 3600000, "a time in milliseconds (0 = no limit)", &v, err,
                    err_len) != 0)
        return -1;
    cfg->max_request_ms = (unsigned long)v;
    return 0;
}

static int apply_timeout(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (parse_uint(val, 86400, &v) != 0 || v < 1) {
        snprintf(err, err_len, "\"%s\" is not a timeout (whole seconds, 1..86400)", val);
        return -1;
    }
    cfg->timeout_s = (unsigned)v;
    return 0;
}

static int apply_grace(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    unsigned long long v;
    if (parse_uint(val, 3600, &v) != 0) {
        snprintf(err, err_len, "\"%s\" is not a grace period (whole seconds, 0..3600)", val);
        return -1;
    }
    cfg->grace_s = (unsigned)v;
    return 0;
}

/* An origin is scheme "://" host [":" port], with no path, as browsers send it. */
static int valid_origin(const char *s, size_t len)
{
    size_t skip;
    if (len > 7 && strncasecmp(s, "http://", 7) == 0)
        skip = 7;
    else if (len > 8 && strncasecmp(s, "https://", 8) == 0)
        skip = 8;
    else
        return 0;
    for (size_t i = skip; i < len; i++) {
        unsigned char c = (unsigned char)s[i];
        if (!(isalnum(c) || c == '.' || c == '-' || c == ':' || c == '[' || c == ']' || c == '_'))
            return 0;
    }
    return 1;
}

static int apply_cors(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    cfg->cors_any = 0;
    cfg->n_origins = 0;
    const char *p = val;
    while (*p) {
        while (*p == ' ' || *p == ',')
            p++;
        if (!*p)
            break;
        const char *e = p;
        while (*e && *e != ',')
            e++;
        size_t len = (size_t)(e - p);
        while (len > 0 && p[len - 1] == ' ')
            len--;
        if (len == 1 && p[0] == '*') {
            cfg->cors_any = 1;
        } else if (!valid_origin(p, len) || len >= GC_HTTP_ORIGIN_LEN) {
            snprintf(err, err_len,
                     "\"%.*s\" is not an origin (write scheme://host[:port] with no path, or *)",
                     (int)(len > 200 ? 200 : len), p);
            return -1;
        } else if (cfg->n_origins >= GC_HTTP_MAX_ORIGINS) {
            snprintf(err, err_len, "at most %d origins may be listed", GC_HTTP_MAX_ORIGINS);
            return -1;
        } else {
            memcpy(cfg->origins[cfg->n_origins], p, len);
            cfg->origins[cfg->n_origins][len] = '\0';
            cfg->n_origins++;
        }
        p = e;
    }
    return 0;
}

static int apply_log_format(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    if (strcmp(val, "json") == 0)
        cfg->log_json = 1;
    else if (strcmp(val, "text") == 0)
        cfg->log_json = 0;
    else if (strcmp(val, "auto") == 0)
        cfg->log_json = !isatty(STDERR_FILENO);
    else {
        snprintf(err, err_len, "\"%s\" is not a log format (json, text or auto)", val);
        return -1;
    }
    return 0;
}

static int apply_log_level(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    if (strcmp(val, "debug") == 0)
        cfg->log_level = GC_LOG_DEBUG;
    else if (strcmp(val, "info") == 0)
        cfg->log_level = GC_LOG_INFO;
    else if (strcmp(val, "warn") == 0 || strcmp(val, "warning") == 0)
        cfg->log_level = GC_LOG_WARN;
    else if (strcmp(val, "error") == 0)
        cfg->log_level = GC_LOG_ERROR;
    else {
        snprintf(err, err_len, "\"%s\" is not a log level (debug, info, warn or error)", val);
        return -1;
    }
    return 0;
}

/* Switch: from a flag val is NULL (on); from the environment a boolean word. */
static int apply_debug_bodies(gc_http_config *cfg, const char *val, char *err, size_t err_len)
{
    if (!val || !strcmp(val, "1") || !strcasecmp(val, "true") || !strcasecmp(val, "yes") ||
        !strcasecmp(val, "on"))
        cfg->debug_bodies = 1;
    else if (!*val || !strcmp(val, "0") || !strcasecmp(val, "false") || !strcasecmp(val, "no") ||
             !strcasecmp(val, "off"))
        cfg->debug_bodies = 0;
    else {
        snprintf(err, err_len, "\"%s\" is not a boolean (1/0, true/false, yes/no, on/off)", val);
        return -1;
    }
    return 0;
}

static const option_spec options[] = {
    { "--listen", "GASCYCLED_LISTEN", "ADDR", "127.0.0.1",
      "IPv4 or IPv6 address to listen on; 0.0.0.0 or :: for all interfaces.", apply_listen },
    { "--port", "GASCYCLED_PORT", "N", "8080",
      "TCP port, 0..65535; 0 picks a free port (printed in the \"listening\" log line).", apply_port },
    { "--threads", "GASCYCLED_THREADS", "N", "number of CPU cores",
      "Worker threads answering requests, 1..1024.", apply_threads },
    { "--max-body", "GASCYCLED_MAX_BODY", "SIZE", "1M",
      "Largest request body in bytes (suffix k, M or G = 1024-based); larger bodies get 413.", apply_max_body },
    { "--max-recording-body", "GASCYCLED_MAX_RECORDING_BODY", "SIZE", "16M",
      "Largest body of the routes that take a recording (/v1/measured/combustion: 300 cycles x "
      "1440 samples is about 5 MB of CSV); larger bodies get 413.", apply_max_recording_body },
    { "--timeout", "GASCYCLED_TIMEOUT", "SECONDS", "30",
      "Idle connections are closed after this long, and a request body must arrive within it, 1..86400.",
      apply_timeout },
    { "--header-timeout", "GASCYCLED_HEADER_TIMEOUT", "SECONDS", "10",
      "The request line and headers must arrive within this long, 1..3600; else 408 and close.",
      apply_header_timeout },
    { "--max-body-total", "GASCYCLED_MAX_BODY_TOTAL", "SIZE", "32M",
      "Request bodies held at once, all requests together (suffix k, M, G); beyond: 503.",
      apply_max_body_total },
    { "--max-connections", "GASCYCLED_MAX_CONNECTIONS", "N",
      "1000, or the open-file limit minus 64 and 2 per thread if lower",
      "Open connections in all, 1..1000000 (below the open-file limit); more are refused.",
      apply_max_connections },
    { "--max-connections-per-client", "GASCYCLED_MAX_CONNECTIONS_PER_CLIENT", "N", "128",
      "Open connections from one client address, 0 = no cap (behind a proxy: 0 or above its pool).",
      apply_per_client },
    { "--composite-workers", "GASCYCLED_COMPOSITE_WORKERS", "N", "half the threads, at least 1",
      "Threads evaluating sweeps, targets and batches, apart from the request threads, 1..256.",
      apply_composite_workers },
    { "--composite-queue", "GASCYCLED_COMPOSITE_QUEUE", "N", "16 per composite worker",
      "Composite requests waiting for a worker at most, 0..100000; beyond: 503 with Retry-After.",
      apply_composite_queue },
    { "--max-evaluations", "GASCYCLED_MAX_EVALUATIONS", "N", "20000",
      "Evaluations a sweep, target search, batch or uncertainty run may take (beyond: 422); 0 = no limit.",
      apply_max_evaluations },
    { "--max-request-ms", "GASCYCLED_MAX_REQUEST_MS", "MS", "10000",
      "Wall time a sweep, target search or batch may take from its arrival (beyond: 503); 0 = no limit.",
      apply_max_request_ms },
    { "--grace", "GASCYCLED_GRACE", "SECONDS", "20",
      "On SIGTERM/SIGINT, longest wait for in-flight requests before closing, 0..3600.", apply_grace },
    { "--cors", "GASCYCLED_CORS", "ORIGINS", "none",
      "Comma-separated origins (scheme://host[:port]) allowed to call from a browser, or *.", apply_cors },
    { "--log-format", "GASCYCLED_LOG_FORMAT", "FORMAT", "json when stderr is not a terminal, else text",
      "Log line format: json (one object per line), text, or auto.", apply_log_format },
    { "--log-level", "GASCYCLED_LOG_LEVEL", "LEVEL", "info",
      "Least severe level written: debug, info (one access line per request), warn or error.", apply_log_level },
    { "--debug-bodies", "GASCYCLED_DEBUG_BODIES", NULL, "off",
      "Add request bodies (first 2 KiB) to the access log; off by default as they may hold plant data.",
      apply_debug_bodies },
};
#define N_OPTIONS (sizeof options / sizeof options[0])

static void print_help(void)
{
    printf("Usage: gascycled [FLAGS]\n"
           "Serves gas power cycle evaluations over HTTP/JSON (see /openapi.json).\n"
           "Every flag may also be given as an environment variable; a flag wins over\n"
           "its variable.\n\n");
    for (size_t i = 0; i < N_OPTIONS; i++) {
        const option_spec *o = &options[i];
        char left[64];
        snprintf(left, sizeof left, "%s%s%s", o->flag, o->metavar ? " " : "",
                 o->metavar ? o->metavar : "");
        printf("  %-30s %s\n", left, o->help);
        printf("  %-30s env %s, default: %s\n", "", o->env, o->def);
    }
    printf("  %-30s %s\n", "--version", "Print the version and source revision, then exit.");
    printf("  %-30s %s\n", "-h, --help", "Print this help, then exit.");
    printf("\nSignals: SIGTERM or SIGINT drains and stops (a second one stops at once);\n"
           "SIGUSR1 writes a status log line; SIGHUP, SIGUSR2 and SIGALRM are logged and\n"
           "ignored; SIGPIPE is ignored.\n");
    printf("\nExit status: 0 after a clean shutdown (SIGTERM/SIGINT) or --help/--version;\n"
           "1 when the server cannot start (e.g. the port is taken); 2 for a bad flag or value.\n");
}

static void set_defaults(gc_http_config *cfg)
{
    long cores = sysconf(_SC_NPROCESSORS_ONLN);
    memset(cfg, 0, sizeof *cfg);
    snprintf(cfg->listen, sizeof cfg->listen, "127.0.0.1");
    cfg->port = 8080;
    cfg->threads = (cores >= 1 && cores <= 1024) ? (unsigned)cores : 2;
    cfg->max_body = 1024 * 1024;
    cfg->max_recording_body = 16u * 1024 * 1024;
    cfg->max_body_total = 32u * 1024 * 1024;
    cfg->timeout_s = 30;
    cfg->header_timeout_s = 10;
    cfg->max_per_client = 128;
    cfg->max_evaluations = 20000;   /* a 10 000-sample Monte Carlo run fits */
    cfg->max_request_ms = 10000;
    cfg->grace_s = 20;
    cfg->log_json = !isatty(STDERR_FILENO);
    cfg->log_level = GC_LOG_INFO;
    cfg->debug_bodies = 0;
}

/* The body limits against the memory for all bodies: 0, or -1 (err). */
static int check_body_limits(const gc_http_config *cfg, char *err, size_t err_len)
{
    if (cfg->max_body_total < cfg->max_body) {
        snprintf(err, err_len, "--max-body-total (%zu bytes) is below --max-body (%zu bytes): "
                 "no body of the largest size could ever be accepted", cfg->max_body_total,
                 cfg->max_body);
        return -1;
    }
    if (cfg->max_body_total < cfg->max_recording_body) {
        snprintf(err, err_len, "--max-body-total (%zu bytes) is below --max-recording-body (%zu "
                 "bytes): no recording of the largest size could ever be accepted (lower "
                 "--max-recording-body too)", cfg->max_body_total, cfg->max_recording_body);
        return -1;
    }
    return 0;
}

enum gc_http_config_result gc_http_config_load(gc_http_config *cfg, int argc, char **argv,
                                               char *err, size_t err_len)
{
    char why[384];

    int env_bad[N_OPTIONS];        /* 1: the variable's value was rejected */
    char env_why[N_OPTIONS][384];

    set_defaults(cfg);

    /* Variables first; a rejected one is an error only if no flag replaces it. */
    for (size_t i = 0; i < N_OPTIONS; i++) {
        const char *v = getenv(options[i].env);
        env_bad[i] = 0;
        if (v && options[i].apply(cfg, v, why, sizeof why) != 0) {
            env_bad[i] = 1;
            snprintf(env_why[i], sizeof env_why[i], "%s", why);
        }
    }

    for (int a = 1; a < argc; a++) {
        const char *arg = argv[a];
        if (strcmp(arg, "-h") == 0 || strcmp(arg, "--help") == 0) {
            print_help();
            return GC_HTTP_CONFIG_EXIT;
        }
        if (strcmp(arg, "--version") == 0) {
            printf("gascycled %s (revision %s)\n", GC_VERSION, GC_GIT_REV);
            return GC_HTTP_CONFIG_EXIT;
        }
        const option_spec *o = NULL;
        const char *eq = strchr(arg, '=');
        size_t name_len = eq ? (size_t)(eq - arg) : strlen(arg);
        for (size_t i = 0; i < N_OPTIONS; i++)
            if (strlen(options[i].flag) == name_len && strncmp(arg, options[i].flag, name_len) == 0)
                o = &options[i];
        if (!o) {
            if (arg[0] == '-')
                snprintf(err, err_len, "unknown flag %.*s (see gascycled --help)",
                         (int)(name_len > 100 ? 100 : name_len), arg);
            else
                snprintf(err, err_len, "unexpected argument \"%.100s\" (gascycled takes flags only; see --help)", arg);
            return GC_HTTP_CONFIG_ERROR;
        }
        const char *val;
        if (!o->metavar) {
            if (eq) {
                snprintf(err, err_len, "flag %s takes no value", o->flag);
                return GC_HTTP_CONFIG_ERROR;
            }
            val = NULL;
        } else if (eq) {
            val = eq + 1;
        } else if (a + 1 < argc) {
            val = argv[++a];
        } else {
            snprintf(err, err_len, "flag %s needs a value (%s)", o->flag, o->metavar);
            return GC_HTTP_CONFIG_ERROR;
        }
        if (o->apply(cfg, val, why, sizeof why) != 0) {
            snprintf(err, err_len, "flag %s: %s", o->flag, why);
            return GC_HTTP_CONFIG_ERROR;
        }
        env_bad[o - options] = 0;
    }
    for (size_t i = 0; i < N_OPTIONS; i++)
        if (env_bad[i]) {
            snprintf(err, err_len, "environment variable %s: %s", options[i].env, env_why[i]);
            return GC_HTTP_CONFIG_ERROR;
        }
    if (check_body_limits(cfg, err, err_len) != 0)
        return GC_HTTP_CONFIG_ERROR;
    if (!cfg->composite_workers)
        cfg->composite_workers = cfg->threads / 2 ? cfg->threads / 2 : 1;
    if (!cfg->composite_queue_set)
        cfg->composite_queue = 16 * cfg->composite_workers;
    return GC_HTTP_CONFIG_RUN;
}
