/*
 * point.h — private to the API layer: one preset evaluated again and again
 * in process with one or two of its inputs changed, the engine of the
 * composite routes (sweeps, targets).
 *
 * The base inputs (a jansson object, as the client wrote them) are decoded
 * through the preset's field table once, with the first point's values in
 * place; every later point sets its values by their place in the input
 * struct through the same row decoder (gc_api_field_set: the same unit
 * parsing, bounds and sentences as a whole request), evaluates it
 * (gc_preset_evaluate) and reads the figures it was asked for through the
 * response writer in capture mode (jw.h targets: RFC 6901 pointers into the
 * document the route would answer, no text written). Nothing is serialised
 * or parsed between the outer request and its evaluations, except a failed
 * point's problem, which is built exactly as the route builds it.
 *
 * A free input that is not a plain number reached through objects (a list
 * item, a gas member, an unknown name) is decoded with the whole request at
 * every point instead: slower, same answers.
 *
 * Values captured: numbers are the document's (converted to the unit
 * system, rounded to the 10 significant digits the document shows), so a
 * composite reads exactly what a client reading the route would read.
 *
 * Numeric inputs set directly (the uncertainty and sensitivity routes): a
 * plain number of the input struct (reached through objects, one list item,
 * or the cold model's cp and k) is found once by its pointer
 * (gc_api_points_num_find) and then written as an SI double straight into
 * a copy of the decoded base inputs at every evaluation
 * (gc_api_points_run_nums): no text is parsed between the evaluations, and
 * the captured numbers are read unrounded (e->t[i].num) so finite
 * differences see the model, not the document's 10 digits. A clone
 * (gc_api_points_clone) shares the decoded base inputs read-only, so one
 * decoded request serves evaluations on several threads.
 */
#ifndef GC_API_POINT_H
#define GC_API_POINT_H

#include "api/request/decode.h"
#include "api/respond/problem.h"
#include "api/respond/jw.h"
#include "gascycle/preset.h"

#include <jansson.h>

#define GC_API_POINT_MAX_FREE 2

typedef struct gc_api_points {
    const gc_preset *p;
    json_t *inputs;               /* base inputs (borrowed), or NULL */
    int from_query;               /* 1: a GET (values as strings) */
    gc_unit_system sys;
    int n_free;
    char pointer[GC_API_POINT_MAX_FREE][GC_API_FIELD_LEN]; /* free inputs, "/pressure_ratio" */
    int row[GC_API_POINT_MAX_FREE];   /* their rows, -1 when not settable alone */
    unsigned lean;                /* GC_LEAN_* for the next evaluations */
    void *block;                  /* one allocation: input, work copy, echo, result, report */
    void *input, *work, *echo, *result;
    gc_report *rep;
    int have_base;                /* input holds a decoded request */
    int want_units;               /* 1: the next capture records the units (the first one
                                     does; later ones follow only the targets) */
    int n_targets;
    gc_jw_target t[GC_JW_MAX_TARGETS];
    gc_jw w;                      /* the last capture that recorded the units */
    gc_jw wq;                     /* the last quiet capture */
    /* the last point */
    int status;                   /* 200, 422 ... */
    json_t *problem;              /* a failed point's problem document (owned), or NULL */
    const char *error_class;      /* its class (static or inside problem) */
    int set_failed;               /* 1: a free pointer cannot be set in the inputs */
    int set_failed_dim;
    int shared_input;             /* 1: input is a clone's copy whose allocations belong to
                                     the original (never released here) */
    unsigned long evaluated;      /* points evaluated successfully */
    gc_api_response *tally;       /* the route's answer, where each success is counted for
                                     the metrics (api.h: evaluated), or NULL */
    gc_decode_ctx ctx;            /* how the inputs are read (input_units=, decimal=; set
                                     ctx.opts after init), and their deferred readings */
} gc_api_points;

/* A numeric input found in the decoded base inputs (gc_api_points_num_find). */
typedef struct gc_api_points_num {
    int row;                      /* field id */
    int idx[2];                   /* list indices (-1: none) */
    size_t offset;                /* bytes from the input struct's start to the double */
    size_t gas;                   /* offset + 1 of the cold gc_gas rebuilt after setting it
                                     (its cp or k); 0: none */
    gc_quantity quantity;         /* the row's quantity */
    double value;                 /* the base value, SI */
    int has_lo, has_hi;           /* the row's bounds apply */
    double lo, hi;                /* the bounds, SI; an exclusive bound moved inside by one
                                     unit in the last place (every value in [lo, hi] is valid) */
} gc_api_points_num;

/* Prepares e for preset p (borrowed); returns 0 or -1 (memory). */
int gc_api_points_init(gc_api_points *e, const gc_preset *p, json_t *inputs, int from_query,
                       gc_unit_system sys, const char *const *free_pointers, int n_free);
void gc_api_points_free(gc_api_points *e);

/* Adds an output pointer to capture; its index, or -1 (malformed, too many). */
int gc_api_points_target(gc_api_points *e, const char *pointer);

/* Evaluates one point: values[d] for free input d (a number or a string with
 * a unit, as a client would give it). Returns the point's status (200:
 * e->t[] hold the captured values; otherwise e->problem is the route's
 * problem document), or -1 when memory ran out. */
int gc_api_points_run(gc_api_points *e, json_t *const *values);

/* The captured value of target i as a new jansson value (null when absent). */
json_t *gc_api_points_value(const gc_api_points *e, int i);

/* The last successful point's "warnings" array (new reference; NULL when
 * there are none). */
json_t *gc_api_points_warnings(gc_api_points *e);

/* The last successful point's whole document (new reference), or NULL. */
json_t *gc_api_points_document(gc_api_points *e);

/* The same as JSON text (malloc'd; *len its length), or NULL. */
char *gc_api_points_document_text(gc_api_points *e, size_t *len);

/* The lean flags (GC_LEAN_*) an evaluation may use when only the figure at
 * output (an RFC 6901 pointer) is read: the ideal counterpart unless it lies
 * under /bounds, the area check unless under /checks or /paths, the
 * real-gas and dissociation scans unless under /warnings. */
unsigned gc_api_points_lean_for(const char *output);

/* Finds the plain number at input pointer `pointer` in the decoded base
 * inputs (a successful gc_api_points_run first). Returns 0 and fills *n, or
 * -1 with a sentence in why (size wn): not an input of the preset, not a
 * number, not given (an optional input, or one whose value the preset
 * derives while it is not given: give it in the inputs), a list item that
 * does not exist, a member of a gas model other than cold. */
int gc_api_points_num_find(const gc_api_points *e, const char *pointer, gc_api_points_num *n,
                           char *why, size_t wn);

/* Evaluates the base inputs with x[k] (SI) written at nums[k] (k < n), with
 * the lean flags e->lean. Returns 200 (the targets hold the captured
 * values), another status when the preset refuses the values or the result
 * is not finite (with want_problem, e->problem is then the route's problem
 * document), or -1 when memory ran out. */
int gc_api_points_run_nums(gc_api_points *e, const gc_api_points_num *nums, const double *x,
                           int n, int want_problem);

/* dst becomes a copy of src for another thread: the same preset, targets,
 * lean flags and unit system, and src's decoded base inputs (shared read-
 * only: src must outlive dst). Returns 0, or -1 (memory; dst is then empty
 * and safe to free). */
int gc_api_points_clone(gc_api_points *dst, const gc_api_points *src);

/* The keys of the numbers directly inside the object at pointer (e.g.
 * "/summary") in the last successful point's document, in document order,
 * into keys[0..max) (each GC_JW_TOKEN_LEN bytes). Returns their count. */
int gc_api_points_numbers_under(gc_api_points *e, const char *pointer,
                                char (*keys)[GC_JW_TOKEN_LEN], int max);

/* The unit label the captured document records under key, or NULL: of the
 * first successful point, or of the last one run after setting
 * e->want_units. */
const char *gc_api_points_unit(const gc_api_points *e, const char *key);

#endif
