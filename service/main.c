/*
 * main.c — the gascycled program: reads the configuration (flags and
 * GASCYCLED_* environment variables, see `gascycled --help`), starts the
 * HTTP server and waits for SIGTERM or SIGINT.
 *
 * Shutdown: the signals are blocked in every thread (the server threads
 * inherit the mask) and taken synchronously with sigwait(), so no code runs
 * in a signal handler. On the first signal the server stops accepting
 * connections and /readyz answers 503; in-flight requests finish (their
 * responses close the connection); after they are done, or after --grace
 * seconds, or on a second signal, every connection is closed and the
 * program exits 0. Exit status 1: the server could not start; 2: bad flag.
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

static uint64_t mono_ns(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (uint64_t)ts.tv_sec * 1000000000u + (uint64_t)ts.tv_nsec;
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
    sigaddset(&set, SIGTERM);
    sigaddset(&set, SIGINT);
    pthread_sigmask(SIG_BLOCK, &set, NULL);
    signal(SIGPIPE, SIG_IGN);

    if (gc_http_server_start(&cfg, &srv, err, sizeof err) != 0) {
        GC_LOG(GC_LOG_ERROR, "cannot start", GC_LF_STR("error", err));
        return 1;
    }
    /* Always written, whatever the level: tools read the bound port here. */
    {
        const gc_log_field f[] = {
            GC_LF_STR("address", cfg.listen), GC_LF_UINT("port", gc_http_server_port(srv)),
            GC_LF_UINT("threads", cfg.threads), GC_LF_UINT("max_body", cfg.max_body),
            GC_LF_UINT("timeout_s", cfg.timeout_s), GC_LF_STR("version", GC_VERSION),
        };
        gc_log_write(GC_LOG_INFO, "listening", f, sizeof f / sizeof f[0]);
    }

    while (sigwait(&set, &sig) != 0)
        ;
    GC_LOG(GC_LOG_INFO, "draining", GC_LF_STR("signal", sig == SIGINT ? "SIGINT" : "SIGTERM"),
           GC_LF_INT("in_flight", gc_http_server_in_flight(srv)));
    gc_http_server_quiesce(srv);

    uint64_t start = mono_ns(), deadline = start + (uint64_t)cfg.grace_s * 1000000000ull;
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
        if (sigtimedwait(&set, NULL, &ts) > 0) {
            why = "second signal";
            break;
        }
    }
    long left = gc_http_server_in_flight(srv);
    gc_http_server_stop(srv);
    GC_LOG(left ? GC_LOG_WARN : GC_LOG_INFO, "stopped", GC_LF_STR("reason", why),
           GC_LF_INT("requests_cut", left),
           GC_LF_UINT("drain_ms", (mono_ns() - start) / 1000000u));
    return 0;
}
