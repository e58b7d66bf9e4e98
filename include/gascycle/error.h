/*
 * error.h — the core's status codes and its optional error-detail record.
 *
 * Every core function that can fail returns an int status: GC_OK (0) or one of
 * the gc_status codes below; results come back through out-parameters. A
 * caller may pass a gc_error to learn which input failed (as a JSON pointer
 * such as "/compression_ratio", matching the API's input keys where the core
 * can attribute the failure) and why, in a sentence fit to show a user.
 * A NULL gc_error is always allowed.
 *
 * The enum is append-only: add new codes last, never renumber or remove one.
 */
#ifndef GASCYCLE_ERROR_H
#define GASCYCLE_ERROR_H

typedef enum gc_status {
    GC_OK = 0,             /* success */
    GC_ERR_INVALID = 1,    /* an argument is outside its physical bounds (e.g. P <= 0, k <= 1) */
    GC_ERR_RANGE = 2,      /* a temperature is outside the property data's validity range */
    GC_ERR_NOCONV = 3,     /* an iterative solve did not converge (reported, never silent) */
    GC_ERR_UNKNOWN = 4,    /* an unknown name: species, fuel, preset, process kind */
    GC_ERR_COMPOSITION = 5,/* fractions negative or not summing to one, or too many species */
    GC_ERR_RICH = 6,       /* fuel-rich mixture: complete-combustion model does not apply */
    GC_ERR_NOMEM = 7,      /* allocation failed */
    GC_ERR_CHECK = 8,      /* a built-in consistency check of a result failed beyond tolerance */
    GC_ERR_INFEASIBLE = 9  /* the requested end condition cannot be reached from this state */
} gc_status;

#define GC_ERROR_FIELD_LEN 96
#define GC_ERROR_MESSAGE_LEN 256

typedef struct gc_error {
    int code;                              /* a gc_status */
    int field_id;                          /* id of the input at fault in the preset's field
                                              table (preset.h); 0 = none / the request */
    int index[2];                          /* list indices of that input, -1 = none */
    char field[GC_ERROR_FIELD_LEN];        /* path of the input at fault ("/site/altitude"),
                                              or "" */
    char message[GC_ERROR_MESSAGE_LEN];    /* one sentence for a user, no trailing newline */
} gc_error;

/* Fills *err (ignored when err is NULL) and returns code, so callers can write
 * `return gc_error_set(err, GC_ERR_INVALID, "/P", "must be positive");`.
 * field may be NULL. The message is printf-formatted and truncated to fit. */
int gc_error_set(gc_error *err, int code, const char *field, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));

/* Clears *err to GC_OK with no field id, empty field and message (NULL-safe). */
void gc_error_clear(gc_error *err);

/* A short fixed text for a code, e.g. "outside validity range"; never NULL. */
const char *gc_strerror(int code);

#endif
