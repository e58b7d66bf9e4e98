/*
 * log.c — structured log lines on stderr (see log.h). JSON strings are
 * escaped per RFC 8259 (quote, backslash, control characters as \u00XX);
 * bytes >= 0x80 are copied as they are, so valid UTF-8 stays readable and
 * invalid UTF-8 cannot break the line structure (no byte below 0x20 is ever
 * written raw). Text format quotes values containing spaces, quotes or '='.
 */
#include "http/log.h"

#include <errno.h>
#include <stdatomic.h>
#include <stdio.h>
#include <string.h>
#include <time.h>
#include <unistd.h>

#define GC_LOG_LINE_MAX 16384

static enum gc_log_format g_format = GC_LOG_TEXT;  /* set once at start-up */
static enum gc_log_level g_min_level = GC_LOG_INFO; /* set once at start-up */

static const char *const level_name[] = { "debug", "info", "warn", "error" };
static const char *const level_text[] = { "DEBUG", "INFO ", "WARN ", "ERROR" };

void gc_log_init(enum gc_log_format format, enum gc_log_level min_level)
{
    g_format = format;
    g_min_level = min_level;
}

int gc_log_enabled(enum gc_log_level level)
{
    return level >= g_min_level;
}

void gc_log_time_rfc3339(char *buf, size_t len)
{
    /* The date-and-seconds part changes once a second: each thread keeps
     * its last one instead of formatting it for every line. */
    static _Thread_local time_t cached_sec = (time_t)-1;
    static _Thread_local char cached[24];
    struct timespec ts;

    clock_gettime(CLOCK_REALTIME, &ts);
    if (ts.tv_sec != cached_sec) {
        struct tm tm;
        gmtime_r(&ts.tv_sec, &tm);
        strftime(cached, sizeof cached, "%Y-%m-%dT%H:%M:%S", &tm);
        cached_sec = ts.tv_sec;
    }
    snprintf(buf, len, "%s.%03ldZ", cached, ts.tv_nsec / 1000000L);
}

/* A bounded output buffer; `full` is set once something did not fit. */
typedef struct line_buf {
    char *p;
    size_t len;
    size_t cap;   /* bytes usable, keeping room for the closing "}\n" */
    int full;
} line_buf;

static void put(line_buf *b, const char *s, size_t n)
{
    if (b->full)
        return;
    if (n > b->cap - b->len) {
        b->full = 1;
        return;
    }
    memcpy(b->p + b->len, s, n);
    b->len += n;
}

static void puts_(line_buf *b, const char *s)
{
    put(b, s, strlen(s));
}

/* Copies s as the inside of a JSON string, stopping cleanly if room ends. */
static void put_json_escaped(line_buf *b, const char *s, size_t n)
{
    static const char hex[] = "0123456789abcdef";
    for (size_t i = 0; i < n && !b->full; i++) {
        unsigned char c = (unsigned char)s[i];
        char esc[7];
        if (c == '"' || c == '\\') {
            esc[0] = '\\';
            esc[1] = (char)c;
            put(b, esc, 2);
        } else if (c < 0x20 || c == 0x7f) {
            esc[0] = '\\';
            esc[1] = 'u';
            esc[2] = '0';
            esc[3] = '0';
            esc[4] = hex[c >> 4];
            esc[5] = hex[c & 15];
            put(b, esc, 6);
        } else {
            put(b, (const char *)&s[i], 1);
        }
    }
}

/* Text values: printable bytes as they are; control bytes as \xHH. */
static void put_text_value(line_buf *b, const char *s, size_t n)
{
    static const char hex[] = "0123456789abcdef";
    int quote = (n == 0);
    for (size_t i = 0; i < n; i++)
        if (s[i] == ' ' || s[i] == '"' || s[i] == '=' || (unsigned char)s[i] < 0x20)
            quote = 1;
    if (quote)
        put(b, "\"", 1);
    for (size_t i = 0; i < n && !b->full; i++) {
        unsigned char c = (unsigned char)s[i];
        if (c < 0x20 || c == 0x7f) {
            char esc[4] = { '\\', 'x', hex[c >> 4], hex[c & 15] };
            put(b, esc, 4);
        } else if (c == '"' || c == '\\') {
            char esc[2] = { '\\', (char)c };
            put(b, esc, 2);
        } else {
            put(b, (const char *)&s[i], 1);
        }
    }
    if (quote)
        put(b, "\"", 1);
}

static void write_all(const char *p, size_t n)
{
    while (n > 0) {
        ssize_t w = write(STDERR_FILENO, p, n);
        if (w < 0) {
            if (errno == EINTR)
                continue;
            return;  /* nowhere to report a failing stderr */
        }
        p += w;
        n -= (size_t)w;
    }
}

void gc_log_event(enum gc_log_level level, const char *msg,
                  const gc_log_field *fields, size_t n)
{
    if (level >= g_min_level)
        gc_log_write(level, msg, fields, n);
}

void gc_log_write(enum gc_log_level level, const char *msg,
                  const gc_log_field *fields, size_t n)
{
    char out[GC_LOG_LINE_MAX];
    char ts[32];
    char num[32];
    line_buf b = { out, 0, sizeof out - 8, 0 };
    int json = (g_format == GC_LOG_JSON);

    if ((unsigned)level > GC_LOG_ERROR)
        level = GC_LOG_ERROR;
    gc_log_time_rfc3339(ts, sizeof ts);

    if (json) {
        puts_(&b, "{\"time\":\"");
        puts_(&b, ts);
        puts_(&b, "\",\"level\":\"");
        puts_(&b, level_name[level]);
        puts_(&b, "\",\"msg\":\"");
        put_json_escaped(&b, msg, strlen(msg));
        puts_(&b, "\"");
    } else {
        puts_(&b, ts);
        puts_(&b, " ");
        puts_(&b, level_text[level]);
        puts_(&b, " ");
        puts_(&b, msg);
    }

    for (size_t i = 0; i < n && !b.full; i++) {
        const gc_log_field *f = &fields[i];
        size_t mark = b.len;
        if (json) {
            puts_(&b, ",\"");
            puts_(&b, f->key);
            puts_(&b, "\":");
        } else {
            puts_(&b, " ");
            puts_(&b, f->key);
            puts_(&b, "=");
        }
        switch (f->type) {
        case GC_LF_STR_T: {
            const char *s = f->s ? f->s : "";
            size_t sl = (f->s_len == (size_t)-1) ? strlen(s) : f->s_len;
            if (json) {
                puts_(&b, "\"");
                put_json_escaped(&b, s, sl);
                puts_(&b, "\"");
            } else {
                put_text_value(&b, s, sl);
            }
            break;
        }
        case GC_LF_INT_T:
            snprintf(num, sizeof num, "%lld", f->i);
            puts_(&b, num);
            break;
        case GC_LF_UINT_T:
            snprintf(num, sizeof num, "%llu", f->u);
            puts_(&b, num);
            break;
        }
        if (b.full) {
            /* Drop the field that did not fit; mark the line as cut. */
            b.len = mark;
            b.full = 0;
            puts_(&b, json ? ",\"truncated\":true" : " truncated=true");
            break;
        }
    }
    /* Room for these was reserved in cap. */
    if (json) {
        out[b.len++] = '}';
    }
    out[b.len++] = '\n';
    write_all(out, b.len);
}

int gc_log_limiter_take(gc_log_limiter *l, unsigned long long *held_back)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    long long now = (long long)ts.tv_sec, last = atomic_load(&l->last_s);
    if (last != 0 && now - last < 1) {
        atomic_fetch_add(&l->held, 1);
        return 0;
    }
    if (!atomic_compare_exchange_strong(&l->last_s, &last, now == 0 ? 1 : now)) {
        atomic_fetch_add(&l->held, 1);
        return 0;
    }
    *held_back = atomic_exchange(&l->held, 0);
    return 1;
}
