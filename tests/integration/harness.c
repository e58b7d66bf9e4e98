/*
 * harness.c — server processes, libcurl client, raw sockets and the
 * response dump for the integration tests (see harness.h).
 */
#include "harness.h"

#include <arpa/inet.h>
#include <dirent.h>
#include <errno.h>
#include <fcntl.h>
#include <jansson.h>
#include <netinet/in.h>
#include <poll.h>
#include <signal.h>
#include <stdatomic.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/socket.h>
#include <sys/stat.h>
#include <sys/wait.h>
#include <time.h>
#include <unistd.h>

extern char **environ;

double it_now(void)
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

/* Removes GASCYCLED_* from the child's environment so the tests see only
 * the flags they pass. */
static void scrub_environment(void)
{
    for (;;) {
        int found = 0;
        for (char **e = environ; e && *e; e++) {
            if (strncmp(*e, "GASCYCLED_", 10) == 0) {
                char name[128];
                size_t n = strcspn(*e, "=");
                if (n >= sizeof name)
                    n = sizeof name - 1;
                memcpy(name, *e, n);
                name[n] = '\0';
                unsetenv(name);
                found = 1;
                break;
            }
        }
        if (!found)
            return;
    }
}

/* ---- server processes ------------------------------------------------------ */

static void *log_reader(void *arg)
{
    it_server *s = arg;
    char buf[4096];
    for (;;) {
        ssize_t n = read(s->log_fd, buf, sizeof buf);
        if (n < 0 && errno == EINTR)
            continue;
        if (n <= 0)
            break;
        pthread_mutex_lock(&s->mu);
        if (s->log_len + (size_t)n + 1 > s->log_cap) {
            size_t ncap = (s->log_cap ? s->log_cap * 2 : 65536) + (size_t)n;
            char *p = realloc(s->log, ncap);
            if (p) {
                s->log = p;
                s->log_cap = ncap;
            }
        }
        if (s->log_len + (size_t)n + 1 <= s->log_cap) {
            memcpy(s->log + s->log_len, buf, (size_t)n);
            s->log_len += (size_t)n;
            s->log[s->log_len] = '\0';
        }
        if (s->log_file) {
            fwrite(buf, 1, (size_t)n, s->log_file);
            fflush(s->log_file);
        }
        pthread_mutex_unlock(&s->mu);
    }
    return NULL;
}

/* Bound port from the listening line, 0 while it has not appeared. */
static unsigned find_port(it_server *s)
{
    unsigned port = 0;
    pthread_mutex_lock(&s->mu);
    const char *l = s->log ? strstr(s->log, "\"msg\":\"listening\"") : NULL;
    if (l) {
        const char *p = strstr(l, "\"port\":");
        const char *eol = strchr(l, '\n');
        if (p && (!eol || p < eol))
            port = (unsigned)strtoul(p + 7, NULL, 10);
    }
    pthread_mutex_unlock(&s->mu);
    return port;
}

int it_server_start(it_server *s, const char *binary, const char *log_path,
                    const char *const *args, const char *const *env)
{
    int fds[2];
    const char *argv[64];
    size_t n = 0;

    memset(s, 0, sizeof *s);
    pthread_mutex_init(&s->mu, NULL);
    snprintf(s->log_path, sizeof s->log_path, "%s", log_path ? log_path : "");
    if (log_path)
        s->log_file = fopen(log_path, "w");

    argv[n++] = binary;
    argv[n++] = "--port";
    argv[n++] = "0";
    argv[n++] = "--log-format";
    argv[n++] = "json";
    for (size_t i = 0; args && args[i] && n < 62; i++)
        argv[n++] = args[i];
    argv[n] = NULL;

    if (pipe(fds) != 0)
        return -1;
    pid_t pid = fork();
    if (pid < 0)
        return -1;
    if (pid == 0) {
        dup2(fds[1], STDERR_FILENO);
        dup2(fds[1], STDOUT_FILENO);
        close(fds[0]);
        close(fds[1]);
        scrub_environment();
        for (size_t i = 0; env && env[i]; i++)
            putenv((char *)(uintptr_t)env[i]);
        execv(binary, (char *const *)(uintptr_t)argv);
        fprintf(stderr, "exec %s: %s\n", binary, strerror(errno));
        _exit(127);
    }
    close(fds[1]);
    s->pid = pid;
    s->log_fd = fds[0];
    pthread_create(&s->reader, NULL, log_reader, s);

    double deadline = it_now() + 20.0;   /* sanitizer builds start slowly */
    while ((s->port = find_port(s)) == 0) {
        int st;
        if (waitpid(pid, &st, WNOHANG) == pid) {
            s->pid = 0;
            fprintf(stderr, "server exited before listening; log:\n%s\n", s->log ? s->log : "");
            return -1;
        }
        if (it_now() > deadline) {
            fprintf(stderr, "server did not print its listening line within 20 s\n");
            return -1;
        }
        sleep_ms(10);
    }
    snprintf(s->base, sizeof s->base, "http://127.0.0.1:%u", s->port);

    deadline = it_now() + 10.0;
    for (;;) {
        it_request rq = { "GET", "/healthz", NULL, NULL, 0, 0, 2000 };
        it_response rs;
        int ok = it_http(NULL, s->base, &rq, &rs) == 0 && rs.status == 200;
        it_response_free(&rs);
        if (ok)
            return 0;
        if (it_now() > deadline) {
            fprintf(stderr, "server on port %u never answered /healthz with 200\n", s->port);
            return -1;
        }
        sleep_ms(20);
    }
}

int it_server_wait(it_server *s, int wait_s)
{
    int st = 0;
    if (s->pid <= 0)
        return -1;
    double deadline = it_now() + wait_s;
    for (;;) {
        pid_t r = waitpid(s->pid, &st, WNOHANG);
        if (r == s->pid)
            break;
        if (r < 0) {
            s->pid = 0;
            return -1;
        }
        if (it_now() > deadline) {
            fprintf(stderr, "server pid %d did not exit within %d s; killing it\n", (int)s->pid, wait_s);
            kill(s->pid, SIGKILL);
            waitpid(s->pid, &st, 0);
            s->pid = 0;
            return -1;
        }
        sleep_ms(10);
    }
    s->pid = 0;
    if (s->reader) {
        pthread_join(s->reader, NULL);
        s->reader = 0;
    }
    if (WIFEXITED(st))
        return WEXITSTATUS(st);
    fprintf(stderr, "server died from signal %d\n", WIFSIGNALED(st) ? WTERMSIG(st) : -1);
    return -1;
}

int it_server_stop(it_server *s, int wait_s)
{
    if (s->pid <= 0)
        return -1;
    kill(s->pid, SIGTERM);
    return it_server_wait(s, wait_s);
}

int it_server_log_has_line(it_server *s, const char *const *needles)
{
    int found = 0;
    pthread_mutex_lock(&s->mu);
    const char *p = s->log;
    while (p && *p && !found) {
        const char *eol = strchr(p, '\n');
        size_t len = eol ? (size_t)(eol - p) : strlen(p);
        int all = 1;
        for (size_t i = 0; needles[i] && all; i++) {
            size_t nl = strlen(needles[i]);
            int hit = 0;
            for (size_t k = 0; k + nl <= len && !hit; k++)
                hit = memcmp(p + k, needles[i], nl) == 0;
            all = hit;
        }
        found = all;
        p = eol ? eol + 1 : NULL;
    }
    pthread_mutex_unlock(&s->mu);
    return found;
}

void it_server_free(it_server *s)
{
    if (s->pid > 0)
        it_server_stop(s, 10);
    if (s->reader)
        pthread_join(s->reader, NULL);
    if (s->log_fd > 0)
        close(s->log_fd);
    if (s->log_file)
        fclose(s->log_file);
    free(s->log);
    pthread_mutex_destroy(&s->mu);
    memset(s, 0, sizeof *s);
}

static char *drain_fd_pair(int fo, int fe, char **err_out)
{
    char *bufs[2] = { NULL, NULL };
    size_t lens[2] = { 0, 0 }, caps[2] = { 0, 0 };
    struct pollfd p[2] = { { fo, POLLIN, 0 }, { fe, POLLIN, 0 } };
    int open_n = 2;
    double deadline = it_now() + 20.0;
    while (open_n > 0 && it_now() < deadline) {
        if (poll(p, 2, 200) < 0 && errno != EINTR)
            break;
        for (int i = 0; i < 2; i++) {
            if (p[i].fd < 0 || !(p[i].revents & (POLLIN | POLLHUP | POLLERR)))
                continue;
            char tmp[4096];
            ssize_t n = read(p[i].fd, tmp, sizeof tmp);
            if (n <= 0) {
                close(p[i].fd);
                p[i].fd = -1;
                open_n--;
                continue;
            }
            if (lens[i] + (size_t)n + 1 > caps[i]) {
                caps[i] = (caps[i] + (size_t)n + 1) * 2;
                char *q = realloc(bufs[i], caps[i]);
                if (!q)
                    continue;
                bufs[i] = q;
            }
            memcpy(bufs[i] + lens[i], tmp, (size_t)n);
            lens[i] += (size_t)n;
            bufs[i][lens[i]] = '\0';
        }
    }
    for (int i = 0; i < 2; i++)
        if (p[i].fd >= 0)
            close(p[i].fd);
    for (int i = 0; i < 2; i++)
        if (!bufs[i])
            bufs[i] = calloc(1, 1);
    *err_out = bufs[1];
    return bufs[0];
}

int it_run_capture(const char *binary, const char *const *args, const char *const *env,
                   char **out, char **err)
{
    int po[2], pe[2], st = 0;
    const char *argv[32];
    size_t n = 0;
    argv[n++] = binary;
    for (size_t i = 0; args && args[i] && n < 31; i++)
        argv[n++] = args[i];
    argv[n] = NULL;
    if (pipe(po) != 0 || pipe(pe) != 0)
        return -1;
    pid_t pid = fork();
    if (pid < 0)
        return -1;
    if (pid == 0) {
        dup2(po[1], STDOUT_FILENO);
        dup2(pe[1], STDERR_FILENO);
        close(po[0]);
        close(po[1]);
        close(pe[0]);
        close(pe[1]);
        scrub_environment();
        for (size_t i = 0; env && env[i]; i++)
            putenv((char *)(uintptr_t)env[i]);
        execv(binary, (char *const *)(uintptr_t)argv);
        _exit(127);
    }
    close(po[1]);
    close(pe[1]);
    *out = drain_fd_pair(po[0], pe[0], err);
    double deadline = it_now() + 20.0;
    for (;;) {
        pid_t r = waitpid(pid, &st, WNOHANG);
        if (r == pid)
            break;
        if (it_now() > deadline) {
            kill(pid, SIGKILL);
            waitpid(pid, &st, 0);
            return -1;
        }
        sleep_ms(10);
    }
    return WIFEXITED(st) ? WEXITSTATUS(st) : -1;
}

/* ---- HTTP client -------------------------------------------------------------- */

static size_t on_body(char *ptr, size_t size, size_t nmemb, void *ud)
{
    it_response *r = ud;
    size_t n = size * nmemb;
    char *p = realloc(r->body, r->body_len + n + 1);
    if (!p)
        return 0;
    r->body = p;
    memcpy(r->body + r->body_len, ptr, n);
    r->body_len += n;
    r->body[r->body_len] = '\0';
    return n;
}

static void clear_headers(it_response *r)
{
    for (size_t i = 0; i < r->n_headers; i++) {
        free(r->headers[i].name);
        free(r->headers[i].value);
    }
    r->n_headers = 0;
}

static size_t on_header(char *ptr, size_t size, size_t nmemb, void *ud)
{
    it_response *r = ud;
    size_t n = size * nmemb;
    if (n >= 5 && strncmp(ptr, "HTTP/", 5) == 0) {
        clear_headers(r);   /* a new response (e.g. after 100 Continue) */
        return n;
    }
    const char *colon = memchr(ptr, ':', n);
    if (!colon)
        return n;
    size_t nl = (size_t)(colon - ptr);
    const char *v = colon + 1;
    size_t vl = n - nl - 1;
    while (vl > 0 && (*v == ' ' || *v == '\t')) {
        v++;
        vl--;
    }
    while (vl > 0 && (v[vl - 1] == '\r' || v[vl - 1] == '\n' || v[vl - 1] == ' '))
        vl--;
    if (r->n_headers == r->cap_headers) {
        size_t nc = r->cap_headers ? r->cap_headers * 2 : 16;
        it_header *h = realloc(r->headers, nc * sizeof *h);
        if (!h)
            return 0;
        r->headers = h;
        r->cap_headers = nc;
    }
    r->headers[r->n_headers].name = strndup(ptr, nl);
    r->headers[r->n_headers].value = strndup(v, vl);
    r->n_headers++;
    return n;
}

typedef struct upload {
    const char *p;
    size_t left;
} upload;

static size_t on_read(char *buf, size_t size, size_t nitems, void *ud)
{
    upload *u = ud;
    size_t n = size * nitems;
    if (n > u->left)
        n = u->left;
    if (n > 65536)
        n = 65536;   /* several chunks for a chunked upload */
    memcpy(buf, u->p, n);
    u->p += n;
    u->left -= n;
    return n;
}

int it_http(CURL *h, const char *base, const it_request *req, it_response *resp)
{
    char *url;
    struct curl_slist *hl = NULL;
    int own = (h == NULL);
    int has_ct = 0, has_expect = 0;
    upload up = { req->body, req->body_len };

    memset(resp, 0, sizeof *resp);
    size_t ul = strlen(base) + strlen(req->target) + 1;
    if (!(url = malloc(ul)))
        return -1;
    snprintf(url, ul, "%s%s", base, req->target);
    if (own && !(h = curl_easy_init())) {
        free(url);
        return -1;
    }
    curl_easy_reset(h);
    curl_easy_setopt(h, CURLOPT_URL, url);
    curl_easy_setopt(h, CURLOPT_NOSIGNAL, 1L);
    curl_easy_setopt(h, CURLOPT_PATH_AS_IS, 1L);
    curl_easy_setopt(h, CURLOPT_TIMEOUT_MS, req->timeout_ms > 0 ? req->timeout_ms : 30000L);
    curl_easy_setopt(h, CURLOPT_WRITEFUNCTION, on_body);
    curl_easy_setopt(h, CURLOPT_WRITEDATA, resp);
    curl_easy_setopt(h, CURLOPT_HEADERFUNCTION, on_header);
    curl_easy_setopt(h, CURLOPT_HEADERDATA, resp);
    curl_easy_setopt(h, CURLOPT_ERRORBUFFER, resp->error);
    for (size_t i = 0; req->headers && req->headers[i]; i++) {
        if (strncasecmp(req->headers[i], "Content-Type:", 13) == 0)
            has_ct = 1;
        if (strncasecmp(req->headers[i], "Expect:", 7) == 0)
            has_expect = 1;
        hl = curl_slist_append(hl, req->headers[i]);
    }
    if (!has_expect)
        hl = curl_slist_append(hl, "Expect:");   /* no 100-continue round trip */
    if (req->body && !has_ct)
        hl = curl_slist_append(hl, "Content-Type: application/json");
    if (req->chunked)
        hl = curl_slist_append(hl, "Transfer-Encoding: chunked");

    if (strcmp(req->method, "HEAD") == 0) {
        curl_easy_setopt(h, CURLOPT_NOBODY, 1L);
    } else if (strcmp(req->method, "GET") == 0 && !req->body) {
        curl_easy_setopt(h, CURLOPT_HTTPGET, 1L);
    } else if (req->body) {
        /* A request that asks for "Expect: 100-continue" waits for the
         * server's answer to its head however loaded the machine is (an
         * early 413 then arrives before any of the body is sent; libcurl's
         * 1 s default would start sending into a connection being closed). */
        curl_easy_setopt(h, CURLOPT_EXPECT_100_TIMEOUT_MS, 30000L);
        if (req->chunked) {
            curl_easy_setopt(h, CURLOPT_POST, 1L);
            curl_easy_setopt(h, CURLOPT_READFUNCTION, on_read);
            curl_easy_setopt(h, CURLOPT_READDATA, &up);
        } else {
            curl_easy_setopt(h, CURLOPT_POSTFIELDS, req->body);
            curl_easy_setopt(h, CURLOPT_POSTFIELDSIZE_LARGE, (curl_off_t)req->body_len);
        }
        if (strcmp(req->method, "POST") != 0)
            curl_easy_setopt(h, CURLOPT_CUSTOMREQUEST, req->method);
    } else if (strcmp(req->method, "POST") == 0) {
        curl_easy_setopt(h, CURLOPT_POSTFIELDS, "");
        curl_easy_setopt(h, CURLOPT_POSTFIELDSIZE, 0L);
    } else {
        curl_easy_setopt(h, CURLOPT_CUSTOMREQUEST, req->method);
    }
    curl_easy_setopt(h, CURLOPT_HTTPHEADER, hl);

    CURLcode rc = curl_easy_perform(h);
    if (rc == CURLE_OK || resp->n_headers > 0) {
        curl_easy_getinfo(h, CURLINFO_RESPONSE_CODE, &resp->status);
        curl_easy_getinfo(h, CURLINFO_NUM_CONNECTS, &resp->connects);
    }
    if (rc != CURLE_OK && resp->error[0] == '\0')
        snprintf(resp->error, sizeof resp->error, "%s", curl_easy_strerror(rc));
    if (!resp->body)
        resp->body = calloc(1, 1);
    curl_easy_setopt(h, CURLOPT_HTTPHEADER, NULL);
    curl_slist_free_all(hl);
    free(url);
    if (own)
        curl_easy_cleanup(h);
    return (rc == CURLE_OK && resp->status > 0) ? 0 : -1;
}

void it_response_free(it_response *r)
{
    clear_headers(r);
    free(r->headers);
    free(r->body);
    memset(r, 0, sizeof *r);
}

const char *it_header_get(const it_response *r, const char *name)
{
    for (size_t i = 0; i < r->n_headers; i++)
        if (strcasecmp(r->headers[i].name, name) == 0)
            return r->headers[i].value;
    return NULL;
}

/* ---- raw sockets -------------------------------------------------------------- */

int it_connect(unsigned port)
{
    struct sockaddr_in sa;
    int fd = socket(AF_INET, SOCK_STREAM, 0);
    if (fd < 0)
        return -1;
    memset(&sa, 0, sizeof sa);
    sa.sin_family = AF_INET;
    sa.sin_port = htons((uint16_t)port);
    sa.sin_addr.s_addr = htonl(INADDR_LOOPBACK);
    if (connect(fd, (struct sockaddr *)&sa, sizeof sa) != 0) {
        close(fd);
        return -1;
    }
    return fd;
}

int it_send_all(int fd, const char *data, size_t n)
{
    while (n > 0) {
        ssize_t w = send(fd, data, n, MSG_NOSIGNAL);
        if (w < 0 && errno == EINTR)
            continue;
        if (w <= 0)
            return -1;
        data += w;
        n -= (size_t)w;
    }
    return 0;
}

long it_read_response(int fd, char *buf, size_t cap, int timeout_ms)
{
    size_t len = 0;
    double deadline = it_now() + timeout_ms / 1000.0;
    buf[0] = '\0';
    while (len + 1 < cap) {
        int left = (int)((deadline - it_now()) * 1000.0);
        if (left <= 0)
            break;
        struct pollfd p = { fd, POLLIN, 0 };
        int pr = poll(&p, 1, left);
        if (pr < 0 && errno == EINTR)
            continue;
        if (pr <= 0)
            break;
        ssize_t n = recv(fd, buf + len, cap - 1 - len, 0);
        if (n <= 0)
            break;
        len += (size_t)n;
        buf[len] = '\0';
        const char *end = strstr(buf, "\r\n\r\n");
        if (end) {
            const char *cl = strcasestr(buf, "\r\nContent-Length:");
            size_t want = (size_t)(end + 4 - buf);
            if (cl && cl < end)
                want += strtoul(cl + 17, NULL, 10);
            if (len >= want)
                break;
        }
    }
    return (long)len;
}

int it_wait_closed(int fd, int timeout_ms)
{
    double deadline = it_now() + timeout_ms / 1000.0;
    char tmp[1024];
    for (;;) {
        int left = (int)((deadline - it_now()) * 1000.0);
        if (left <= 0)
            return 0;
        struct pollfd p = { fd, POLLIN, 0 };
        int pr = poll(&p, 1, left);
        if (pr < 0 && errno == EINTR)
            continue;
        if (pr == 0)
            return 0;
        ssize_t n = recv(fd, tmp, sizeof tmp, 0);
        if (n == 0 || (n < 0 && errno != EINTR && errno != EAGAIN))
            return 1;
    }
}

/* ---- dump ---------------------------------------------------------------------- */

static char g_dump_dir[512];
static atomic_uint g_dump_seq;
static pthread_mutex_t g_dump_mu = PTHREAD_MUTEX_INITIALIZER;

int it_dump_init(const char *dir)
{
    if (!dir) {
        g_dump_dir[0] = '\0';
        return 0;
    }
    snprintf(g_dump_dir, sizeof g_dump_dir, "%s", dir);
    /* mkdir -p */
    char tmp[512];
    snprintf(tmp, sizeof tmp, "%s", dir);
    for (char *p = tmp + 1; *p; p++)
        if (*p == '/') {
            *p = '\0';
            mkdir(tmp, 0755);
            *p = '/';
        }
    mkdir(tmp, 0755);
    DIR *d = opendir(dir);
    if (!d)
        return -1;
    struct dirent *e;
    while ((e = readdir(d)) != NULL) {
        size_t n = strlen(e->d_name);
        if (n > 5 && strcmp(e->d_name + n - 5, ".json") == 0) {
            char path[1024];
            snprintf(path, sizeof path, "%s/%s", dir, e->d_name);
            unlink(path);
        }
    }
    closedir(d);
    return 0;
}

static int is_json_type(const char *ct)
{
    if (!ct)
        return 0;
    size_t n = strcspn(ct, ";");
    while (n > 0 && ct[n - 1] == ' ')
        n--;
    return (n == 16 && strncasecmp(ct, "application/json", 16) == 0) ||
           (n > 5 && strncasecmp(ct + n - 5, "+json", 5) == 0);
}

void it_dump(const char *case_name, const it_request *req, const it_response *resp)
{
    const char *ct = it_header_get(resp, "Content-Type");
    if (!g_dump_dir[0] || !is_json_type(ct) || resp->body_len == 0 ||
        strcmp(req->method, "HEAD") == 0)
        return;
    char path[256];
    size_t pl = strcspn(req->target, "?");
    if (pl >= sizeof path)
        pl = sizeof path - 1;
    memcpy(path, req->target, pl);
    path[pl] = '\0';
    json_error_t jerr;
    json_t *body = json_loadb(resp->body, resp->body_len, JSON_DECODE_ANY, &jerr);
    json_t *o = json_object();
    json_object_set_new(o, "case", json_string(case_name));
    json_object_set_new(o, "method", json_string(req->method));
    json_object_set_new(o, "path", json_stringn(path, strlen(path)));
    json_object_set_new(o, "target", json_string(req->target));
    json_object_set_new(o, "status", json_integer(resp->status));
    json_object_set_new(o, "content_type", json_string(ct));
    if (body) {
        json_object_set_new(o, "body", body);
    } else {
        json_object_set_new(o, "body", json_null());
        json_object_set_new(o, "body_text", json_stringn(resp->body, resp->body_len));
        json_object_set_new(o, "parse_error", json_string(jerr.text));
    }
    unsigned seq = atomic_fetch_add(&g_dump_seq, 1) + 1;
    char file[1024];
    snprintf(file, sizeof file, "%s/%05u.json", g_dump_dir, seq);
    pthread_mutex_lock(&g_dump_mu);
    json_dump_file(o, file, JSON_INDENT(1) | JSON_SORT_KEYS);
    pthread_mutex_unlock(&g_dump_mu);
    json_decref(o);
}
