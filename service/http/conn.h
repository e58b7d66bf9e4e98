/*
 * conn.h — private to the HTTP layer: every open connection, the phase its
 * current request is in and that phase's deadline; the global and
 * per-client-address connection caps; and the watchdog thread that closes
 * a connection past its deadline.
 *
 * Why: libmicrohttpd 0.9.75 times a connection out only when it has been
 * idle for --timeout, and every byte received restarts that clock, so a
 * client that trickles its headers a byte at a time is never dropped. Here
 * each phase has an absolute deadline from the moment it began:
 *   IDLE  waiting for a request line (new or keep-alive)   --timeout
 *   HEAD  request line in, headers not complete             --header-timeout
 *   BODY  headers in, body arriving                         --timeout
 *   WORK  request complete, being answered                  none (the cost budget bounds it)
 *   SEND  response queued, being written                    --timeout
 * The watchdog (one thread, a tick of 200 ms) moves a late connection to CUT
 * with a compare-and-swap, so exactly one of it and the request's own thread
 * acts: the request thread's next phase change fails and it returns MHD_NO.
 * A connection cut in HEAD or BODY first gets a 408 problem document (when
 * nothing else is waiting in its send queue); then shutdown(2) makes
 * libmicrohttpd see end-of-stream and close it. The watchdog holds the
 * table's lock while it does so, and libmicrohttpd tells us a connection is
 * closed (gc_conn_close) before it closes the socket, so the descriptor can
 * never belong to another connection by then.
 *
 * Caps: the accept policy refuses a new connection (closes it at once,
 * before any byte is read) when --max-connections are open, or when its
 * client address already has --max-connections-per-client. Counts change
 * when libmicrohttpd reports a connection started or closed, so concurrent
 * accepts on different threads can overshoot a cap by at most the number of
 * server threads. Every refusal and every cut is counted in metrics
 * (gascycled_errors_total) and logged at warn, at most once a second per
 * kind with the number of further ones in between.
 */
#ifndef GC_HTTP_CONN_H
#define GC_HTTP_CONN_H

#include <stddef.h>
#include <stdint.h>
#include <sys/socket.h>

enum gc_conn_phase {
    GC_PHASE_IDLE = 0,
    GC_PHASE_HEAD,
    GC_PHASE_BODY,
    GC_PHASE_WORK,
    GC_PHASE_SEND,
    GC_PHASE_CUT
};

typedef struct gc_conn_limits {
    unsigned max_connections;      /* open connections in all */
    unsigned max_per_client;       /* open connections per client address; 0 = no cap */
    unsigned idle_s;               /* deadline of IDLE, BODY and SEND, s (--timeout) */
    unsigned header_s;             /* deadline of HEAD, s (--header-timeout) */
    /* request ids for the 408 answers the watchdog sends */
    void (*new_id)(void *cls, char *out, size_t len);
    void *id_cls;
} gc_conn_limits;

typedef struct gc_conn gc_conn;
typedef struct gc_conn_table gc_conn_table;

/* Creates the table and starts the watchdog. Returns 0, or -1 (no memory or
 * no thread). */
int gc_conn_table_new(const gc_conn_limits *lim, gc_conn_table **out);
/* Stops the watchdog and frees the table (every connection must be closed). */
void gc_conn_table_free(gc_conn_table *t);

/* Accept policy: 1 to accept a connection from addr, 0 to refuse it (logged). */
int gc_conn_accept_ok(gc_conn_table *t, const struct sockaddr *addr, socklen_t addr_len);
/* A connection started (fd, client address) / closed; NULL when out of memory
 * (the connection then runs without a record: no deadlines, not counted). */
gc_conn *gc_conn_open(gc_conn_table *t, int fd, const struct sockaddr *addr);
void gc_conn_close(gc_conn_table *t, gc_conn *c);

/* Moves c to phase `to` and restarts its deadline. Returns 0, or -1 when
 * the watchdog has cut the connection (then stop: return MHD_NO). NULL c
 * always succeeds. */
int gc_conn_enter(gc_conn *c, enum gc_conn_phase to);
/* The limit that cut c ("header_timeout", "body_timeout", ...) or NULL. */
const char *gc_conn_cut_reason(gc_conn *c);
/* The client address as text ("127.0.0.1", "::1"); "" for NULL. */
const char *gc_conn_client(const gc_conn *c);

/* Open connections with a record. */
unsigned gc_conn_count(gc_conn_table *t);

#endif
