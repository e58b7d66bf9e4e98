/*
 * http.h — the HTTP layer's interface to service/main.c: the server
 * configuration (flags and environment variables), and the server's
 * life cycle (start, drain, stop). Only service/http knows libmicrohttpd.
 *
 * Configuration precedence: built-in default < GASCYCLED_* environment
 * variable < command-line flag. Every value is range-checked; a bad one is
 * reported in one sentence naming the flag or variable.
 */
#ifndef GC_HTTP_H
#define GC_HTTP_H

#include <stddef.h>

#define GC_HTTP_MAX_ORIGINS 16
#define GC_HTTP_ORIGIN_LEN 256

typedef struct gc_http_config {
    char listen[64];              /* IPv4 or IPv6 literal address to bind */
    unsigned port;                /* TCP port, 0 = any free port */
    unsigned threads;             /* worker threads (libmicrohttpd pool size) */
    size_t max_body;              /* bytes; larger request bodies get 413 */
    size_t max_recording_body;    /* bytes; the same for the routes that take a recording
                                     (GC_ROUTE_LARGE_BODY) */
    size_t max_body_total;        /* bytes held in all request bodies at once; beyond: 503 */
    unsigned timeout_s;           /* s; idle limit of a connection, and of receiving a body */
    unsigned header_timeout_s;    /* s; request line to end of headers */
    unsigned grace_s;             /* s; longest wait for in-flight requests on SIGTERM */
    unsigned max_connections;     /* open connections in all; 0 = derived from the fd limit */
    int max_connections_set;      /* 1 when given by flag or variable (checked at start) */
    unsigned max_per_client;      /* open connections per client address; 0 = no cap */
    unsigned composite_workers;   /* threads for sweeps, targets, batch */
    unsigned composite_queue;     /* composite requests waiting at most; beyond: 503 */
    int composite_queue_set;      /* 1 when given (else 4 per worker) */
    unsigned long max_evaluations;/* evaluations per request; 0 = no limit */
    unsigned long max_request_ms; /* ms of wall time per evaluating request; 0 = no limit */
    int cors_any;                 /* 1 when --cors is "*" */
    size_t n_origins;             /* allowed CORS origins listed */
    char origins[GC_HTTP_MAX_ORIGINS][GC_HTTP_ORIGIN_LEN]; /* "https://host[:port]" */
    int log_json;                 /* 1 = JSON lines, 0 = text */
    int log_level;                /* enum gc_log_level */
    int debug_bodies;             /* 1 = request bodies go into the access log */
} gc_http_config;

enum gc_http_config_result {
    GC_HTTP_CONFIG_RUN = 0,       /* configuration complete: start the server */
    GC_HTTP_CONFIG_EXIT = 1,      /* --help or --version printed: exit 0 */
    GC_HTTP_CONFIG_ERROR = 2      /* bad flag or value: message in err, exit 2 */
};

/* Fills cfg from defaults, the environment and argv. */
enum gc_http_config_result gc_http_config_load(gc_http_config *cfg, int argc, char **argv,
                                               char *err, size_t err_len);

typedef struct gc_http_server gc_http_server;

/* Builds the router from gc_api_routes(), sets up metrics and logging and
 * starts listening. Returns 0, or -1 with a message in err. */
int gc_http_server_start(const gc_http_config *cfg, gc_http_server **out,
                         char *err, size_t err_len);

/* The configuration in force (--max-connections settled against the
 * open-file limit). */
const gc_http_config *gc_http_server_config(const gc_http_server *srv);

/* The port actually bound (useful with port 0). */
unsigned gc_http_server_port(const gc_http_server *srv);

/* Stops accepting connections and turns /readyz to 503; in-flight requests
 * continue and their responses carry "Connection: close". */
void gc_http_server_quiesce(gc_http_server *srv);

/* Requests received and not yet fully answered; open connections. */
long gc_http_server_in_flight(const gc_http_server *srv);
unsigned gc_http_server_connections(gc_http_server *srv);

/* A snapshot for the status log line (SIGUSR1). */
typedef struct gc_http_status {
    long in_flight;                 /* requests received, not yet answered */
    unsigned connections;           /* open connections */
    unsigned long long body_bytes;  /* bytes held for request bodies */
    unsigned composite_running;     /* composite requests being evaluated */
    unsigned composite_waiting;     /* composite requests queued */
} gc_http_status;
void gc_http_server_status(gc_http_server *srv, gc_http_status *st);

/* Stops composite jobs at their next evaluation (they answer 503), closes
 * every connection, joins the threads and frees the server. Returns the
 * number of requests that ended without an answer: every request whose
 * request line had arrived and whose answer was not complete. */
long gc_http_server_stop(gc_http_server *srv);

#endif
