/*
 * stress.c — bounded load and attack traffic against a gascycled on
 * 127.0.0.1, with the figures that show whether normal clients are still
 * served: the soak, the /healthz probe under heavy clients, and the
 * slow-header, many-connection and large-body attacks of issue 12.
 *
 *   stress MODE --port N [--pid PID] [--duration S] [options] [limits]
 *
 * Modes
 *   probe      --heavy N clients loop on --heavy-target (keep-alive); a
 *              prober opens a new connection every --probe-ms and asks for
 *              /healthz with a --probe-timeout-ms deadline (a liveness probe).
 *   soak       --conns N keep-alive clients cycle through a fixed mix of
 *              routes (cheap, single evaluations, composites, errors) for
 *              --duration s; RSS of --pid sampled every 0.5 s after --warmup s.
 *   slowloris  --conns N connections send a request line, then one header
 *              byte every --interval-ms; the prober keeps asking meanwhile.
 *   conns      --conns N connections open and say nothing; prober as above.
 *   bodies     --conns N clients each POST a --size byte JSON body at once
 *              (declared by Content-Length); prober as above; RSS sampled.
 *
 * Every run stops by itself after --duration seconds (at most 600) and
 * sends traffic only to 127.0.0.1. The prober can bind its connections to
 * another loopback source address (--source 127.0.0.2) so that a
 * per-client-address cap meant for the attacker does not hit it.
 *
 * Pass/fail (exit 1 with the reason; 0 otherwise, 2 for bad usage):
 *   --min-probe-ok F     share of probe requests answered 200 in time (0..1)
 *   --max-latency-ms M   slowest successful probe (or soak request)
 *   --max-rss-growth-kb K  RSS at the end minus RSS after warm-up
 *   --max-rss-kb K       the highest RSS sampled
 *   --no-5xx             any status >= 500 fails (except 503 in modes where
 *                        a limit may answer it: bodies, probe heavy clients)
 * The figures go to stdout as one JSON object.
 */
#include <arpa/inet.h>
#include <errno.h>
#include <fcntl.h>
#include <netinet/in.h>
#include <netinet/tcp.h>
#include <poll.h>
#include <pthread.h>
#include <signal.h>
#include <stdatomic.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/resource.h>
#include <sys/socket.h>
#include <time.h>
#include <unistd.h>

#define MAX_THREADS 64
#define MAX_SLOW 4000
#define RESP_MAX (4u << 20)    /* bytes of a response we keep */

/* ---- options ---------------------------------------------------------------- */

static struct {
    const char *mode;
    unsigned port;
    long pid;
    double duration_s, warmup_s;
    int conns, heavy;
    const char *heavy_target;
    long probe_ms, probe_timeout_ms, interval_ms;
    size_t size;
    const char *source;
    double min_probe_ok, max_latency_ms;
    long max_rss_growth_kb, max_rss_kb;
    int no_5xx;
} opt = {
    .mode = NULL, .port = 0, .pid = 0, .duration_s = 10, .warmup_s = 2, .conns = 8,
    .heavy = 8, .heavy_target = NULL, .probe_ms = 250, .probe_timeout_ms = 2000,
    .interval_ms = 1000, .size = 1u << 20, .source = "127.0.0.1",
    .min_probe_ok = -1, .max_latency_ms = -1, .max_rss_growth_kb = -1, .max_rss_kb = -1, .no_5xx = 0,
};

static atomic_int stop_flag;
static double g_end_s;     /* when the run ends; heavy requests in flight get 1 s more */

static double now_s(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + (double)ts.tv_nsec * 1e-9;
}

static void sleep_ms(long ms)
{
    struct timespec ts = { ms / 1000, (ms % 1000) * 1000000L };
    while (nanosleep(&ts, &ts) != 0 && errno == EINTR)
        ;
}

/* ---- a small HTTP/1.1 client on blocking sockets with poll deadlines --------- */

static int connect_to(const char *source)
{
    struct sockaddr_in sa, src;
    int fd = socket(AF_INET, SOCK_STREAM | SOCK_CLOEXEC, 0);
    if (fd < 0)
        return -1;
    int one = 1;
    setsockopt(fd, IPPROTO_TCP, TCP_NODELAY, &one, sizeof one);
    if (source && strcmp(source, "127.0.0.1") != 0) {
        memset(&src, 0, sizeof src);
        src.sin_family = AF_INET;
        if (inet_pton(AF_INET, source, &src.sin_addr) != 1 ||
            bind(fd, (struct sockaddr *)&src, sizeof src) != 0) {
            close(fd);
            return -1;
        }
    }
    memset(&sa, 0, sizeof sa);
    sa.sin_family = AF_INET;
    sa.sin_port = htons((uint16_t)opt.port);
    sa.sin_addr.s_addr = htonl(INADDR_LOOPBACK);
    if (connect(fd, (struct sockaddr *)&sa, sizeof sa) != 0) {
        close(fd);
        return -1;
    }
    return fd;
}

static int send_all(int fd, const char *p, size_t n, double deadline)
{
    while (n > 0) {
        struct pollfd pf = { fd, POLLOUT, 0 };
        int ms = (int)((deadline - now_s()) * 1000);
        if (ms <= 0 || poll(&pf, 1, ms) <= 0)
            return -1;
        ssize_t w = send(fd, p, n, MSG_NOSIGNAL);
        if (w < 0 && (errno == EINTR || errno == EAGAIN))
            continue;
        if (w <= 0)
            return -1;
        p += w;
        n -= (size_t)w;
    }
    return 0;
}

typedef struct http_result {
    int status;          /* 0: no answer */
    int closes;          /* server said Connection: close */
    size_t body_len;
    int nan_leak;        /* "NaN" or "Infinity" in a JSON body */
    double seconds;
} http_result;

/* Sends req on *fd (connecting first when *fd < 0) and reads one response
 * with a Content-Length body. On any failure *fd is closed and set to -1. */
static void http_exchange(int *fd, const char *source, const char *req, size_t req_len,
                          long timeout_ms, char *buf, size_t cap, http_result *res)
{
    double t0 = now_s(), deadline = t0 + timeout_ms / 1000.0;
    memset(res, 0, sizeof *res);
    if (*fd < 0 && (*fd = connect_to(source)) < 0)
        goto fail;
    if (send_all(*fd, req, req_len, deadline) != 0)
        goto fail;
    size_t have = 0, head = 0, want = 0;
    for (;;) {
        if (head && have >= head + want)
            break;
        if (have + 1 >= cap)
            goto fail;
        struct pollfd pf = { *fd, POLLIN, 0 };
        int ms = (int)((deadline - now_s()) * 1000);
        if (ms <= 0 || poll(&pf, 1, ms) <= 0)
            goto fail;
        ssize_t r = recv(*fd, buf + have, cap - have - 1, 0);
        if (r < 0 && errno == EINTR)
            continue;
        if (r <= 0)
            goto fail;
        have += (size_t)r;
        buf[have] = '\0';
        if (!head) {
            char *e = strstr(buf, "\r\n\r\n");
            if (!e)
                continue;
            head = (size_t)(e - buf) + 4;
            if (strncmp(buf, "HTTP/1.", 7) != 0)
                goto fail;
            res->status = atoi(buf + 9);
            const char *cl = strcasestr(buf, "\r\nContent-Length:");
            want = (cl && cl < e) ? strtoul(cl + 17, NULL, 10) : 0;
            const char *cc = strcasestr(buf, "\r\nConnection: close");
            res->closes = cc && cc < e;
            if (strncmp(req, "HEAD ", 5) == 0)
                want = 0;
        }
    }
    res->body_len = want;
    if (want && memmem(buf + head, want, "NaN", 3) != NULL)
        res->nan_leak = 1;
    if (want && memmem(buf + head, want, "Infinity", 8) != NULL)
        res->nan_leak = 1;
    res->seconds = now_s() - t0;
    if (res->closes) {
        close(*fd);
        *fd = -1;
    }
    return;
fail:
    res->seconds = now_s() - t0;
    if (*fd >= 0)
        close(*fd);
    *fd = -1;
    if (!res->status)
        res->status = 0;
}

/* ---- shared statistics ------------------------------------------------------ */

typedef struct stats {
    pthread_mutex_t mu;
    long n, ok, fail, s2, s4, s503, s5other, nan;
    double max_s;
    double lat[200000];        /* successful latencies, for p99 */
    long n_lat;
} stats;

static void stats_add(stats *s, const http_result *r)
{
    pthread_mutex_lock(&s->mu);
    s->n++;
    if (r->status == 0) {
        s->fail++;
    } else {
        if (r->status < 400)
            s->s2++;
        else if (r->status < 500)
            s->s4++;
        else if (r->status == 503)
            s->s503++;
        else
            s->s5other++;
        if (r->status >= 200 && r->status < 500) {
            s->ok++;
            if (r->seconds > s->max_s)
                s->max_s = r->seconds;
            if (s->n_lat < (long)(sizeof s->lat / sizeof s->lat[0]))
                s->lat[s->n_lat++] = r->seconds;
        }
    }
    s->nan += r->nan_leak;
    pthread_mutex_unlock(&s->mu);
}

static int cmp_d(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

static double p99(stats *s)
{
    if (s->n_lat == 0)
        return 0;
    qsort(s->lat, (size_t)s->n_lat, sizeof s->lat[0], cmp_d);
    return s->lat[(long)(0.99 * (double)(s->n_lat - 1))];
}

static void stats_json(const char *name, stats *s)
{
    printf("\"%s\":{\"requests\":%ld,\"answered_ok\":%ld,\"no_answer\":%ld,\"2xx_3xx\":%ld,"
           "\"4xx\":%ld,\"503\":%ld,\"5xx_other\":%ld,\"nan_leaks\":%ld,\"max_ms\":%.1f,"
           "\"p99_ms\":%.1f}", name, s->n, s->ok, s->fail, s->s2, s->s4, s->s503, s->s5other,
           s->nan, s->max_s * 1000, p99(s) * 1000);
}

static stats probe_stats = { .mu = PTHREAD_MUTEX_INITIALIZER };
static stats load_stats = { .mu = PTHREAD_MUTEX_INITIALIZER };

/* ---- RSS of the server --------------------------------------------------------- */

static long rss_kb(long pid)
{
    char path[64], line[256];
    long kb = -1;
    if (pid <= 0)
        return -1;
    snprintf(path, sizeof path, "/proc/%ld/status", pid);
    FILE *f = fopen(path, "r");
    if (!f)
        return -1;
    while (fgets(line, sizeof line, f))
        if (strncmp(line, "VmRSS:", 6) == 0)
            kb = strtol(line + 6, NULL, 10);
    fclose(f);
    return kb;
}

static atomic_long rss_start = -1, rss_end = -1, rss_max = -1, rss_first = -1;

static void *rss_main(void *arg)
{
    (void)arg;
    double t0 = now_s();
    int warmed = 0;
    rss_first = rss_kb(opt.pid);
    while (!atomic_load(&stop_flag)) {
        long kb = rss_kb(opt.pid);
        if (kb > rss_max)
            rss_max = kb;
        if (!warmed && now_s() - t0 >= opt.warmup_s) {
            rss_start = kb;
            warmed = 1;
        }
        rss_end = kb;
        sleep_ms(500);
    }
    if (!warmed)
        rss_start = rss_first;
    long kb = rss_kb(opt.pid);
    if (kb > 0)
        rss_end = kb;
    return NULL;
}

/* ---- the prober: a fresh connection per request, like a liveness probe -------- */

static void *probe_main(void *arg)
{
    (void)arg;
    static const char *const reqs[] = {
        "GET /healthz HTTP/1.1\r\nHost: probe\r\nConnection: close\r\n\r\n",
        "GET /v1/properties?T=300 HTTP/1.1\r\nHost: probe\r\nConnection: close\r\n\r\n",
    };
    char *buf = malloc(65536);
    int k = 0;
    double next = now_s();
    while (buf && !atomic_load(&stop_flag)) {
        const char *rq = reqs[strcmp(opt.mode, "probe") == 0 ? 0 : (k++ & 1)];
        int fd = -1;
        http_result r;
        http_exchange(&fd, opt.source, rq, strlen(rq), opt.probe_timeout_ms, buf, 65536, &r);
        if (fd >= 0)
            close(fd);
        if (r.status != 200)
            r.status = r.status ? r.status : 0;
        /* a probe counts as a success only with 200 inside the timeout */
        if (r.status != 200) {
            http_result f = r;
            f.status = 0;
            stats_add(&probe_stats, &f);
        } else {
            stats_add(&probe_stats, &r);
        }
        next += opt.probe_ms / 1000.0;
        double wait = next - now_s();
        if (wait > 0)
            sleep_ms((long)(wait * 1000));
        else
            next = now_s();
    }
    free(buf);
    return NULL;
}

/* ---- soak: the request mix ------------------------------------------------------- */

typedef struct mix_item {
    const char *method, *target, *body;
} mix_item;

static const mix_item mix[] = {
    { "GET", "/healthz", NULL },
    { "GET", "/readyz", NULL },
    { "GET", "/metrics", NULL },
    { "GET", "/v1/gases", NULL },
    { "GET", "/v1/properties?T=300", NULL },
    { "POST", "/v1/properties", "{\"gas\": \"air\", \"T\": \"15 degC\", \"P\": \"97.5 kPa\"}" },
    { "GET", "/v1/cycles/otto?compression_ratio=10.5&peak_temperature=2400&intake_temperature=305",
      NULL },
    { "GET", "/v1/cycles/diesel?compression_ratio=18&cutoff_ratio=2", NULL },
    { "POST", "/v1/cycles/brayton", "{\"pressure_ratio\": 15.5, \"turbine_inlet_temperature\": "
      "\"1480 K\", \"compressor_efficiency\": 0.87, \"turbine_efficiency\": 0.9, \"fuel\": "
      "\"methane\", \"net_power\": \"45 MW\"}" },
    { "GET", "/v1/cycles/brayton?pressure_ratio=12&turbine_inlet_temperature=1400&format=csv",
      NULL },
    { "GET", "/v1/cycles/otto?compression_ratio=9&format=svg&diagram=Ts", NULL },
    { "POST", "/v1/sweeps", "{\"cycle\": \"otto\", \"inputs\": {\"gas\": \"cold\", "
      "\"peak_temperature\": 1800}, \"sweep\": {\"input\": \"compression_ratio\", \"from\": 4, "
      "\"to\": 12, \"steps\": 8}}" },
    { "POST", "/v1/targets", "{\"cycle\": \"otto\", \"inputs\": {\"gas\": \"cold\"}, \"target\": "
      "{\"output\": \"/summary/thermal_efficiency\", \"value\": 0.5}, \"free\": {\"input\": "
      "\"compression_ratio\", \"lower\": 2, \"upper\": 40}}" },
    { "POST", "/v1/batch", "{\"requests\": [{\"route\": \"/v1/cycles/otto\", \"body\": "
      "{\"compression_ratio\": 8}}, {\"route\": \"/v1/properties\", \"body\": {\"T\": 500}}]}" },
    { "GET", "/v1/properties?T=-5", NULL },                       /* 422 */
    { "POST", "/v1/properties", "{\"T\": 300,}" },                 /* 400 */
    { "GET", "/v1/nowhere", NULL },                               /* 404 */
    { "GET", "/v1/properties?T=10%00junk", NULL },                /* 400 (NUL) */
    { "HEAD", "/v1/gases", NULL },
};
#define N_MIX (sizeof mix / sizeof mix[0])

static size_t build_request(char *out, size_t cap, const char *method, const char *target,
                            const char *body, size_t body_len, const char *extra)
{
    int n = snprintf(out, cap, "%s %s HTTP/1.1\r\nHost: stress\r\n%s", method, target,
                     extra ? extra : "");
    if (body)
        n += snprintf(out + n, cap - (size_t)n,
                      "Content-Type: application/json\r\nContent-Length: %zu\r\n", body_len);
    n += snprintf(out + n, cap - (size_t)n, "\r\n");
    if (body && (size_t)n + body_len < cap) {
        memcpy(out + n, body, body_len);
        n += (int)body_len;
    }
    return (size_t)n;
}

static void *soak_main(void *arg)
{
    unsigned seed = (unsigned)(uintptr_t)arg * 2654435761u + 1;
    char *req = malloc(8192), *buf = malloc(RESP_MAX);
    int fd = -1;
    while (req && buf && !atomic_load(&stop_flag)) {
        seed = seed * 1103515245u + 12345u;
        const mix_item *m = &mix[(seed >> 8) % N_MIX];
        size_t n = build_request(req, 8192, m->method, m->target, m->body,
                                 m->body ? strlen(m->body) : 0, NULL);
        http_result r;
        http_exchange(&fd, "127.0.0.1", req, n, 30000, buf, RESP_MAX, &r);
        stats_add(&load_stats, &r);
    }
    if (fd >= 0)
        close(fd);
    free(req);
    free(buf);
    return NULL;
}

/* ---- probe mode: heavy clients ----------------------------------------------------- */

static void *heavy_main(void *arg)
{
    (void)arg;
    char *req = malloc(8192), *buf = malloc(RESP_MAX);
    int fd = -1;
    while (req && buf && !atomic_load(&stop_flag)) {
        size_t n = build_request(req, 8192, "GET", opt.heavy_target, NULL, 0, NULL);
        http_result r;
        long left_ms = (long)((g_end_s + 1 - now_s()) * 1000);
        http_exchange(&fd, "127.0.0.1", req, n, left_ms > 1000 ? left_ms : 1000, buf, RESP_MAX, &r);
        stats_add(&load_stats, &r);
        if (r.status == 503)
            sleep_ms(200);   /* a client that honours the answer a little */
    }
    if (fd >= 0)
        close(fd);
    free(req);
    free(buf);
    return NULL;
}

static struct {
    int fd;
    double opened, closed_at;
    size_t sent;
} slow[MAX_SLOW];
static int n_slow_open_failed;

/* ---- bodies mode: N uploads held open at once ------------------------------------------- */

/* Opens --conns connections, sends each a POST head declaring --size bytes,
 * pushes every body up to its last byte round-robin (the server holds what
 * it accepted), keeps them so for half the duration, then sends the last
 * bytes and reads the answers. */
static void bodies_attack(void)
{
    int n = opt.conns > MAX_SLOW ? MAX_SLOW : opt.conns;
    char head[512], *chunk = malloc(65536), *buf = malloc(65536);
    size_t *sent = calloc((size_t)n, sizeof *sent);
    int *fds = malloc((size_t)n * sizeof *fds);
    if (!chunk || !buf || !sent || !fds)
        goto out;
    memset(chunk, ' ', 65536);
    int hl = snprintf(head, sizeof head, "POST /v1/properties HTTP/1.1\r\nHost: stress\r\n"
                      "Content-Type: application/json\r\nContent-Length: %zu\r\n\r\n{\"T\": 300",
                      opt.size);
    size_t prefix = strlen("{\"T\": 300");   /* body bytes sent with the head */
    double t0 = now_s(), hold_until = t0 + opt.duration_s / 2, end = t0 + opt.duration_s;
    for (int i = 0; i < n; i++) {
        fds[i] = connect_to("127.0.0.1");
        if (fds[i] < 0) {
            n_slow_open_failed++;
            continue;
        }
        if (send_all(fds[i], head, (size_t)hl, now_s() + 5) != 0) {
            close(fds[i]);
            fds[i] = -1;
            continue;
        }
        fcntl(fds[i], F_SETFL, O_NONBLOCK);
        sent[i] = prefix;
    }
    /* push the bodies up to the last byte */
    int busy = 1;
    while (busy && now_s() < hold_until) {
        busy = 0;
        for (int i = 0; i < n; i++) {
            if (fds[i] < 0 || sent[i] + 1 >= opt.size)
                continue;
            size_t want = opt.size - 1 - sent[i];
            if (want > 65536)
                want = 65536;
            ssize_t w = send(fds[i], chunk, want, MSG_NOSIGNAL);
            if (w > 0) {
                sent[i] += (size_t)w;
                busy = 1;
            } else if (w < 0 && errno != EAGAIN && errno != EWOULDBLOCK) {
                sent[i] = opt.size;   /* the server answered early and closed */
            } else {
                busy = 1;
            }
        }
        if (busy)
            sleep_ms(5);
    }
    while (now_s() < hold_until)
        sleep_ms(50);
    /* finish: last byte, then the answer */
    for (int i = 0; i < n; i++) {
        if (fds[i] < 0)
            continue;
        fcntl(fds[i], F_SETFL, 0);
        http_result r;
        if (sent[i] + 1 == opt.size) {
            static const char last[] = "}";
            send(fds[i], last, 1, MSG_NOSIGNAL);
        }
        double left = end - now_s();
        http_exchange(&fds[i], "127.0.0.1", "", 0, left > 1 ? (long)(left * 1000) : 1000, buf,
                      65536, &r);
        stats_add(&load_stats, &r);
        if (fds[i] >= 0)
            close(fds[i]);
        fds[i] = -1;
    }
out:
    free(chunk);
    free(buf);
    free(sent);
    free(fds);
}

/* ---- slowloris and idle connections ---------------------------------------------------- */


static void slow_attack(int trickle)
{
    static const char line[] = "GET /healthz HTTP/1.1\r\n";
    static const char hdr[] = "X-Slow-Header-Name-That-Never-Ends: aaaaaaaaaaaaaaaaaaaaaaaa";
    int n = opt.conns > MAX_SLOW ? MAX_SLOW : opt.conns;
    for (int i = 0; i < n; i++) {
        slow[i].fd = connect_to("127.0.0.1");
        slow[i].opened = now_s();
        slow[i].closed_at = 0;
        slow[i].sent = 0;
        if (slow[i].fd < 0) {
            n_slow_open_failed++;
            continue;
        }
        fcntl(slow[i].fd, F_SETFL, O_NONBLOCK);
        if (trickle && send(slow[i].fd, line, sizeof line - 1, MSG_NOSIGNAL) < 0) {
            close(slow[i].fd);
            slow[i].fd = -1;
            slow[i].closed_at = now_s();
        }
    }
    double end = now_s() + opt.duration_s;
    while (now_s() < end) {
        for (int i = 0; i < n; i++) {
            if (slow[i].fd < 0)
                continue;
            char tmp[4096];
            ssize_t r = recv(slow[i].fd, tmp, sizeof tmp, MSG_DONTWAIT);
            int gone = (r == 0) || (r < 0 && errno != EAGAIN && errno != EWOULDBLOCK);
            if (!gone && r > 0)
                gone = 1;   /* the server answered (e.g. 408) and will close */
            if (!gone && trickle) {
                char c = hdr[slow[i].sent % (sizeof hdr - 1)];
                if (send(slow[i].fd, &c, 1, MSG_NOSIGNAL) < 0 && errno != EAGAIN)
                    gone = 1;
                else
                    slow[i].sent++;
            }
            if (gone) {
                close(slow[i].fd);
                slow[i].fd = -1;
                slow[i].closed_at = now_s();
            }
        }
        sleep_ms(trickle ? opt.interval_ms : 200);
    }
}

static void slow_report(void)
{
    int n = opt.conns > MAX_SLOW ? MAX_SLOW : opt.conns, closed = 0, open = 0;
    double first = 0, last = 0;
    for (int i = 0; i < n; i++) {
        if (slow[i].fd >= 0) {
            open++;
            close(slow[i].fd);
            slow[i].fd = -1;
        } else if (slow[i].closed_at > 0) {
            double t = slow[i].closed_at - slow[i].opened;
            if (!closed || t < first)
                first = t;
            if (t > last)
                last = t;
            closed++;
        }
    }
    printf(",\"attack\":{\"connections\":%d,\"connect_failed\":%d,\"closed_by_server\":%d,"
           "\"still_open_at_end\":%d,\"first_close_s\":%.2f,\"last_close_s\":%.2f}",
           n, n_slow_open_failed, closed, open, first, last);
}

/* ---- main ------------------------------------------------------------------------------- */

static void usage(void)
{
    fprintf(stderr, "usage: stress probe|soak|slowloris|conns|bodies --port N [--pid PID] "
            "[--duration S] [--warmup S] [--conns N] [--heavy N] [--heavy-target T] "
            "[--probe-ms MS] [--probe-timeout-ms MS] [--interval-ms MS] [--size BYTES] "
            "[--source ADDR] [--min-probe-ok F] [--max-latency-ms MS] "
            "[--max-rss-growth-kb KB] [--max-rss-kb KB] [--no-5xx]\n");
}

static int parse_args(int argc, char **argv)
{
    if (argc < 2)
        return -1;
    opt.mode = argv[1];
    for (int i = 2; i < argc; i++) {
        const char *a = argv[i], *v = i + 1 < argc ? argv[i + 1] : NULL;
        if (!strcmp(a, "--no-5xx")) {
            opt.no_5xx = 1;
            continue;
        }
        if (!v)
            return -1;
        i++;
        if (!strcmp(a, "--port")) opt.port = (unsigned)atoi(v);
        else if (!strcmp(a, "--pid")) opt.pid = atol(v);
        else if (!strcmp(a, "--duration")) opt.duration_s = atof(v);
        else if (!strcmp(a, "--warmup")) opt.warmup_s = atof(v);
        else if (!strcmp(a, "--conns")) opt.conns = atoi(v);
        else if (!strcmp(a, "--heavy")) opt.heavy = atoi(v);
        else if (!strcmp(a, "--heavy-target")) opt.heavy_target = v;
        else if (!strcmp(a, "--probe-ms")) opt.probe_ms = atol(v);
        else if (!strcmp(a, "--probe-timeout-ms")) opt.probe_timeout_ms = atol(v);
        else if (!strcmp(a, "--interval-ms")) opt.interval_ms = atol(v);
        else if (!strcmp(a, "--size")) opt.size = (size_t)atol(v);
        else if (!strcmp(a, "--source")) opt.source = v;
        else if (!strcmp(a, "--min-probe-ok")) opt.min_probe_ok = atof(v);
        else if (!strcmp(a, "--max-latency-ms")) opt.max_latency_ms = atof(v);
        else if (!strcmp(a, "--max-rss-growth-kb")) opt.max_rss_growth_kb = atol(v);
        else if (!strcmp(a, "--max-rss-kb")) opt.max_rss_kb = atol(v);
        else return -1;
    }
    if (!opt.port || opt.duration_s <= 0 || opt.duration_s > 600 || opt.conns < 1 ||
        opt.heavy < 1 || opt.size < 16 || opt.probe_ms < 10)
        return -1;
    if (!strcmp(opt.mode, "probe") && !opt.heavy_target)
        return -1;
    return 0;
}

int main(int argc, char **argv)
{
    pthread_t th[MAX_THREADS], prober, rss;
    int nth = 0, fail = 0;
    char why[512] = "";
    if (parse_args(argc, argv) != 0) {
        usage();
        return 2;
    }
    signal(SIGPIPE, SIG_IGN);
    struct rlimit rl;
    if (getrlimit(RLIMIT_NOFILE, &rl) == 0 && rl.rlim_cur < rl.rlim_max) {
        rl.rlim_cur = rl.rlim_max;
        setrlimit(RLIMIT_NOFILE, &rl);
    }
    int is_soak = !strcmp(opt.mode, "soak"), is_probe = !strcmp(opt.mode, "probe");
    int is_bodies = !strcmp(opt.mode, "bodies");
    int is_slow = !strcmp(opt.mode, "slowloris"), is_conns = !strcmp(opt.mode, "conns");
    if (!is_soak && !is_probe && !is_bodies && !is_slow && !is_conns) {
        usage();
        return 2;
    }
    pthread_create(&rss, NULL, rss_main, NULL);
    if (!is_soak)
        pthread_create(&prober, NULL, probe_main, NULL);
    double t0 = now_s();
    g_end_s = t0 + opt.duration_s;
    if (is_soak || is_probe) {
        int n = is_probe ? opt.heavy : opt.conns;
        if (n > MAX_THREADS)
            n = MAX_THREADS;
        for (nth = 0; nth < n; nth++)
            pthread_create(&th[nth], NULL, is_soak ? soak_main : heavy_main,
                           (void *)(uintptr_t)nth);
        while (now_s() - t0 < opt.duration_s)
            sleep_ms(100);
    } else if (is_bodies) {
        bodies_attack();
    } else {
        slow_attack(is_slow);
    }
    atomic_store(&stop_flag, 1);
    for (int i = 0; i < nth; i++)
        pthread_join(th[i], NULL);
    if (!is_soak)
        pthread_join(prober, NULL);
    pthread_join(rss, NULL);

    printf("{\"mode\":\"%s\",\"seconds\":%.1f,", opt.mode, now_s() - t0);
    stats_json(is_soak ? "load" : "probe", is_soak ? &load_stats : &probe_stats);
    if (!is_soak && (is_probe || is_bodies)) {
        printf(",");
        stats_json(is_probe ? "heavy" : "uploads", &load_stats);
    }
    if (is_slow || is_conns)
        slow_report();
    printf(",\"rss_kb\":{\"first\":%ld,\"after_warmup\":%ld,\"end\":%ld,\"max\":%ld}}\n",
           (long)rss_first, (long)rss_start, (long)rss_end, (long)rss_max);

    /* ---- verdict ---- */
    stats *main_stats = is_soak ? &load_stats : &probe_stats;
    if (opt.min_probe_ok >= 0 && !is_soak) {
        double share = probe_stats.n ? (double)probe_stats.ok / (double)probe_stats.n : 0;
        if (share < opt.min_probe_ok) {
            snprintf(why, sizeof why, "only %ld of %ld probe requests answered 200 within %ld ms "
                     "(need %.0f %%)", probe_stats.ok, probe_stats.n, opt.probe_timeout_ms,
                     opt.min_probe_ok * 100);
            fail = 1;
        }
    }
    if (opt.max_latency_ms >= 0 && main_stats->max_s * 1000 > opt.max_latency_ms) {
        snprintf(why, sizeof why, "slowest %s request took %.0f ms (limit %.0f ms)",
                 is_soak ? "soak" : "probe", main_stats->max_s * 1000, opt.max_latency_ms);
        fail = 1;
    }
    if (opt.max_rss_growth_kb >= 0 && rss_start > 0 && rss_end - rss_start > opt.max_rss_growth_kb) {
        snprintf(why, sizeof why, "RSS grew by %ld kB after warm-up (limit %ld kB)",
                 (long)(rss_end - rss_start), opt.max_rss_growth_kb);
        fail = 1;
    }
    if (opt.max_rss_kb >= 0 && rss_max > opt.max_rss_kb) {
        snprintf(why, sizeof why, "RSS reached %ld kB (limit %ld kB)", (long)rss_max,
                 opt.max_rss_kb);
        fail = 1;
    }
    if (opt.no_5xx) {
        long bad = probe_stats.s5other + probe_stats.s503 * 0 + load_stats.s5other;
        if (is_soak)
            bad += load_stats.s503;
        if (bad) {
            snprintf(why, sizeof why, "%ld answers with a 5xx status", bad);
            fail = 1;
        }
    }
    if (probe_stats.nan + load_stats.nan) {
        snprintf(why, sizeof why, "%ld bodies hold NaN or Infinity", probe_stats.nan + load_stats.nan);
        fail = 1;
    }
    if (is_soak && load_stats.fail) {
        snprintf(why, sizeof why, "%ld soak requests got no answer", load_stats.fail);
        fail = 1;
    }
    if (fail)
        fprintf(stderr, "stress %s: FAIL: %s\n", opt.mode, why);
    return fail;
}
