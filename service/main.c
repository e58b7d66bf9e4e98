/*
 * main.c — the gascycled program: reads the configuration (flags and
 * GASCYCLED_* environment variables, see `gascycled --help`), starts the
 * HTTP server and waits for SIGTERM or SIGINT.
 *
 * Signals: all of them below are blocked in every thread (the server
 * threads inherit the mask) and taken synchronously with sigwait(), so no
 * code runs in a signal handler and none of them can kill the process
 * without a drain:
 *   SIGTERM, SIGINT  drain and stop (below); a second one stops at once
 *   SIGUSR1          writes a "status" log line (in flight, connections,
 *                    composite queue, body bytes held); the server goes on
 *   SIGHUP           logged and ignored: there is no configuration file to
 *                    reload (flags and variables are read at start only)
 *   SIGUSR2, SIGALRM logged and ignored (no meaning here)
 *   SIGPIPE          ignored (a client that closes early is a normal event;
 *                    writes report EPIPE instead)
 * Drain: on SIGTERM or SIGINT the server stops accepting connections,
 * /readyz answers 503 (requests on open keep-alive connections are still
 * answered, with "Connection: close"); in-flight
 * requests finish (their responses close the connection); after they are
 * done, or after --grace seconds, or on a second signal, composite jobs stop
 * at their next evaluation (503), every connection is closed and the program
 * exits 0. The "stopped" line counts the requests cut: those whose request
 * line had arrived and whose answer was not complete. Exit status 1: the
 * server could not start; 2: bad flag.
 */
#include "http/http.h"
#include "http/log.h"

#include <signal.h>
#include <stdint.h>
#include <stdio.h>
#include <time.h>

#ifndef GC_VERSION
#define GC_VERSION "0.0.0"
#endif

#define QUIET_NS 100000000ull   /* 100 ms with no request in flight ends the drain */

static const struct { int sig; const char *name; } signals[] = {
    { SIGTERM, "SIGTERM" }, { SIGINT, "SIGINT" }, { SIGHUP, "SIGHUP" },
    { SIGUSR1, "SIGUSR1" }, { SIGUSR2, "SIGUSR2" }, { SIGALRM, "SIGALRM" },
};

static const char *signal_name(int sig)
{
    for (size_t i = 0; i < sizeof signals / sizeof signals[0]; i++)
        if (signals[i].sig == sig)
            return signals[i].name;
    return "other";
}

/* A signal that does not stop the server: 1 when it was one of those. */
static int side_signal(gc_http_server *srv, int sig)
{
    if (sig == SIGUSR1) {
        gc_http_status st;
        gc_http_server_status(srv, &st);
        GC_LOG(GC_LOG_INFO, "status", GC_LF_STR("signal", "SIGUSR1"),
               GC_LF_INT("in_flight", st.in_flight), GC_LF_UINT("connections", st.connections),
               GC_LF_UINT("composite_running", st.composite_running),
               GC_LF_UINT("composite_waiting", st.composite_waiting),
               GC_LF_UINT("body_bytes", st.body_bytes));
        return 1;
    }
    if (sig == SIGHUP || sig == SIGUSR2 || sig == SIGALRM) {
        GC_LOG(GC_LOG_WARN, "signal ignored", GC_LF_STR("signal", signal_name(sig)),
               GC_LF_STR("reason", sig == SIGHUP ? "no configuration file to reload; restart to "
                         "change flags" : "no action is defined for it"));
        return 1;
    }
    return 0;
}

static uint64_t mono_ns(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (uint64_t)ts.tv_sec * 1000000000u + (uint64_t)ts.tv_nsec;
}

/* Always written, whatever the level: tools read the bound port here. */
static void log_listening(const gc_http_config *cfg, gc_http_server *srv)
{
    const gc_log_field f[] = {
        GC_LF_STR("address", cfg->listen), GC_LF_UINT("port", gc_http_server_port(srv)),
        GC_LF_UINT("threads", cfg->threads), GC_LF_UINT("max_body", cfg->max_body),
        GC_LF_UINT("max_recording_body", cfg->max_recording_body),
        GC_LF_UINT("timeout_s", cfg->timeout_s), GC_LF_UINT("header_timeout_s", cfg->header_timeout_s),
        GC_LF_UINT("max_connections", gc_http_server_config(srv)->max_connections),
        GC_LF_UINT("max_connections_per_client", cfg->max_per_client),
        GC_LF_UINT("composite_workers", cfg->composite_workers),
        GC_LF_UINT("composite_queue", cfg->composite_queue),
        GC_LF_UINT("max_evaluations", cfg->max_evaluations),
        GC_LF_UINT("max_request_ms", cfg->max_request_ms),
        GC_LF_UINT("max_body_total", cfg->max_body_total), GC_LF_STR("version", GC_VERSION),
    };
    gc_log_write(GC_LOG_INFO, "listening", f, sizeof f / sizeof f[0]);
}

/* Waits for the connections to finish (or go quiet) until the deadline or
 * a second signal; the reason it stopped waiting. */
static const char *drain(gc_http_server *srv, const sigset_t *set, uint64_t deadline)
{
    uint64_t quiet_since = 0;
    const char *why = "drained";
    for (;;) {
        uint64_t now = mono_ns();
        if (gc_http_server_connections(srv) == 0)
            break;
        if (gc_http_server_in_flight(srv) == 0) {
            if (!quiet_since)
                quiet_since = now;
            else if (now - quiet_since >= QUIET_NS)
                break;
        } else {
            quiet_since = 0;
        }
        if (now >= deadline) {
            why = "grace period over";
            break;
        }
        struct timespec ts = { 0, 10000000L };   /* 10 ms */
        int got = sigtimedwait(set, NULL, &ts);
        if (got > 0 && !side_signal(srv, got)) {
            why = "second signal";
            break;
        }
    }
    return why;
}

int main(int argc, char **argv)
{
    gc_http_config cfg;
    gc_http_server *srv;
    char err[512];
    sigset_t set;
    int sig = 0;

    switch (gc_http_config_load(&cfg, argc, argv, err, sizeof err)) {
    case GC_HTTP_CONFIG_RUN:
        break;
    case GC_HTTP_CONFIG_EXIT:
        return 0;
    case GC_HTTP_CONFIG_ERROR:
    default:
        fprintf(stderr, "gascycled: %s\n", err);
        return 2;
    }

    sigemptyset(&set);
    for (size_t i = 0; i < sizeof signals / sizeof signals[0]; i++)
        sigaddset(&set, signals[i].sig);
    pthread_sigmask(SIG_BLOCK, &set, NULL);
    signal(SIGPIPE, SIG_IGN);

    if (gc_http_server_start(&cfg, &srv, err, sizeof err) != 0) {
        GC_LOG(GC_LOG_ERROR, "cannot start", GC_LF_STR("error", err));
        return 1;
    }
    log_listening(&cfg, srv);

    for (;;) {
        if (sigwait(&set, &sig) != 0)
            continue;
        if (!side_signal(srv, sig))
            break;
    }
    GC_LOG(GC_LOG_INFO, "draining", GC_LF_STR("signal", signal_name(sig)),
           GC_LF_INT("in_flight", gc_http_server_in_flight(srv)));
    gc_http_server_quiesce(srv);

    uint64_t start = mono_ns();
    const char *why = drain(srv, &set, start + (uint64_t)cfg.grace_s * 1000000000ull);
    long in_flight = gc_http_server_in_flight(srv);
    long cut = gc_http_server_stop(srv);
    GC_LOG(cut ? GC_LOG_WARN : GC_LOG_INFO, "stopped", GC_LF_STR("reason", why),
           GC_LF_INT("requests_cut", cut), GC_LF_INT("in_flight_at_stop", in_flight),
           GC_LF_UINT("drain_ms", (mono_ns() - start) / 1000000u));
    return 0;
}
