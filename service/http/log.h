/*
 * log.h — private to the HTTP layer: structured log lines on stderr, either
 * one JSON object per line (for containers and log shippers) or key=value
 * text (for a terminal). Every line carries time (RFC 3339, UTC, ms), level
 * and a short message; callers add typed fields. A line is formatted into one
 * buffer and written with a single write(2), so lines from different server
 * threads never interleave. Thread-safe after gc_log_init().
 */
#ifndef GC_HTTP_LOG_H
#define GC_HTTP_LOG_H

#include <stddef.h>

enum gc_log_level { GC_LOG_DEBUG = 0, GC_LOG_INFO = 1, GC_LOG_WARN = 2, GC_LOG_ERROR = 3 };
enum gc_log_format { GC_LOG_TEXT = 0, GC_LOG_JSON = 1 };

enum gc_log_ftype { GC_LF_STR_T, GC_LF_INT_T, GC_LF_UINT_T };

typedef struct gc_log_field {
    const char *key;              /* static field name, snake_case */
    enum gc_log_ftype type;
    const char *s;                /* GC_LF_STR_T: NUL-terminated, any bytes (escaped) */
    size_t s_len;                 /* GC_LF_STR_T: bytes of s to print; (size_t)-1 = strlen */
    long long i;                  /* GC_LF_INT_T */
    unsigned long long u;         /* GC_LF_UINT_T */
} gc_log_field;

#define GC_LF_STR(k, v) { (k), GC_LF_STR_T, (v), (size_t)-1, 0, 0 }
#define GC_LF_STRN(k, v, n) { (k), GC_LF_STR_T, (v), (n), 0, 0 }
#define GC_LF_INT(k, v) { (k), GC_LF_INT_T, NULL, 0, (long long)(v), 0 }
#define GC_LF_UINT(k, v) { (k), GC_LF_UINT_T, NULL, 0, 0, (unsigned long long)(v) }

/* Sets format and minimum level; call once before any thread logs. */
void gc_log_init(enum gc_log_format format, enum gc_log_level min_level);

/* 1 when a line of this level would be written. */
int gc_log_enabled(enum gc_log_level level);

/* Writes one line: level, msg, then the n fields in order. Lines longer than
 * the internal buffer (16 KiB) are cut, with the JSON still well-formed. */
void gc_log_event(enum gc_log_level level, const char *msg,
                  const gc_log_field *fields, size_t n);

/* The same without the level filter: for lines that must always appear
 * (the "listening" line, whose port tools read). */
void gc_log_write(enum gc_log_level level, const char *msg,
                  const gc_log_field *fields, size_t n);

/* Convenience for fields given as a compound literal array. */
#define GC_LOG(level, msg, ...)                                               \
    do {                                                                      \
        const gc_log_field gc_lf_[] = { __VA_ARGS__ };                        \
        gc_log_event((level), (msg), gc_lf_, sizeof gc_lf_ / sizeof gc_lf_[0]); \
    } while (0)

/* Rate limit for repeated warnings (a limit biting under attack): at most
 * one line a second per limiter. Zero-initialise; thread-safe. */
typedef struct gc_log_limiter {
    _Atomic long long last_s;         /* CLOCK_MONOTONIC second of the last line */
    _Atomic unsigned long long held;  /* lines held back since */
} gc_log_limiter;

/* 1 when a line may be written now; *held_back then gets the number of lines
 * held back since the last one. 0 when this one is held back. */
int gc_log_limiter_take(gc_log_limiter *l, unsigned long long *held_back);

/* Formats the current UTC time as "2024-05-01T12:00:00.123Z" (25 bytes with
 * the NUL); buf must hold at least 32 bytes. */
void gc_log_time_rfc3339(char *buf, size_t len);

#endif
