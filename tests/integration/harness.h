/*
 * harness.h — support for the integration tests: start build/gascycled as a
 * child process on a free port (--port 0; the bound port is read from its
 * "listening" log line), keep its log, stop it by PID and report its exit
 * status; an HTTP client on libcurl that records status, headers and body;
 * raw sockets for what libcurl will not do (half-sent requests); and the
 * dump of every JSON response for the contract test.
 */
#ifndef GC_IT_HARNESS_H
#define GC_IT_HARNESS_H

#include <curl/curl.h>
#include <pthread.h>
#include <stddef.h>
#include <sys/types.h>

/* ---- server processes ---------------------------------------------------- */

typedef struct it_server {
    pid_t pid;
    unsigned port;
    int log_fd;                /* read end of the child's stderr */
    pthread_t reader;
    pthread_mutex_t mu;
    char *log;                 /* everything the server wrote (NUL-terminated) */
    size_t log_len, log_cap;
    char log_path[512];        /* copy on disk, for a human after a failure */
    FILE *log_file;
    char base[64];             /* "http://127.0.0.1:PORT" */
} it_server;

/* Starts `binary` with "--port 0 --log-format json" plus args (NULL-ended)
 * and, in a scrubbed environment (no GASCYCLED_* variables), the "NAME=value"
 * entries of env (NULL-ended, may be NULL); waits for the listening line and
 * for /healthz to answer 200. Returns 0, or -1 with a message on stderr. */
int it_server_start(it_server *s, const char *binary, const char *log_path,
                    const char *const *args, const char *const *env);
/* Sends SIGTERM and waits up to wait_s seconds. Returns the exit status
 * (0..255), or -1 if it had to be killed or died from a signal. */
int it_server_stop(it_server *s, int wait_s);
/* Waits for an already signalled server; same return as it_server_stop. */
int it_server_wait(it_server *s, int wait_s);
/* 1 when the log holds a line containing every one of the NULL-ended needles. */
int it_server_log_has_line(it_server *s, const char *const *needles);
void it_server_free(it_server *s);

/* Runs binary with args and environment additions ("NAME=value", NULL-ended)
 * to completion; returns the exit status (-1 on a signal or timeout) and the
 * captured stdout/stderr (malloc'd, NUL-terminated). */
int it_run_capture(const char *binary, const char *const *args, const char *const *env,
                   char **out, char **err);

/* ---- HTTP client ---------------------------------------------------------- */

typedef struct it_header {
    char *name;
    char *value;
} it_header;

typedef struct it_response {
    long status;               /* 0 when the transfer failed */
    char *body;                /* NUL-terminated */
    size_t body_len;
    it_header *headers;        /* of the final response */
    size_t n_headers, cap_headers;
    long connects;             /* new connections this transfer made */
    char error[CURL_ERROR_SIZE];
} it_response;

typedef struct it_request {
    const char *method;        /* "GET", "HEAD", "POST", "OPTIONS", ... */
    const char *target;        /* path and query, e.g. "/v1/properties?gas=air" */
    const char *const *headers;/* "Name: value" lines, NULL-ended, may be NULL */
    const char *body;          /* NULL = none */
    size_t body_len;
    int chunked;               /* send the body with Transfer-Encoding: chunked */
    long timeout_ms;           /* 0 = 30 s */
} it_request;

/* Performs req on handle h (reused for keep-alive; NULL = a fresh handle).
 * Returns 0 when a response arrived (resp->status set), -1 otherwise. */
int it_http(CURL *h, const char *base, const it_request *req, it_response *resp);
void it_response_free(it_response *r);
/* Case-insensitive header lookup; NULL when absent. */
const char *it_header_get(const it_response *r, const char *name);

/* ---- raw sockets ------------------------------------------------------------ */

int it_connect(unsigned port);                       /* fd or -1 */
int it_send_all(int fd, const char *data, size_t n);  /* 0 or -1 */
/* Reads until the peer closes, or a full response (by Content-Length) is in,
 * or timeout_ms passes. Returns bytes read (NUL-terminated in buf) or -1. */
long it_read_response(int fd, char *buf, size_t cap, int timeout_ms);
/* Waits for the peer to close: 1 closed, 0 still open after timeout_ms. */
int it_wait_closed(int fd, int timeout_ms);

/* ---- dump for the contract test ------------------------------------------ */

/* Directory for dumped responses (created; *.json in it removed); NULL = off. */
int it_dump_init(const char *dir);
/* Writes {case, method, path, target, status, content_type, body} when the
 * response is JSON. Thread-safe. */
void it_dump(const char *case_name, const it_request *req, const it_response *resp);

double it_now(void);   /* monotonic seconds */

#endif
