/*
 * uncert_route.h — private to the API layer: what the two routes of issue
 * 14 share. POST|GET /v1/uncertainty (a GUM budget of any preset's figures
 * from its inputs' uncertainties, Monte Carlo on request) and POST|GET
 * /v1/sensitivities (the matrix of derivatives and normalised elasticities,
 * no uncertainties needed) decode their request here (uncert_request.c),
 * evaluate the preset in process through point.h (uncert_model.c: the
 * model callback of the uncertainty engine, gascycle/uncert.h, one clone of
 * the decoded request per thread, the request's cost budget charged per
 * evaluation), and answer in JSON, CSV or SVG (uncertainty.c,
 * uncert_formats.c).
 *
 * Units: the engine works on the inputs in SI base units (K, Pa, rad, ...)
 * and on the outputs in the response's unit system (the numbers a client of
 * the preset's own route reads, unrounded); uncertainties and sensitivities
 * are converted to the response's units when written. A temperature's
 * uncertainty is a temperature difference.
 */
#ifndef GC_API_UNCERT_ROUTE_H
#define GC_API_UNCERT_ROUTE_H

#include "api/composites/point.h"
#include "api/respond/output.h"
#include "gascycle/uncert.h"

#include <jansson.h>

#define GC_API_UNCERT_MAX_SAMPLES 100000L     /* Monte Carlo samples per request */
#define GC_API_UNCERT_DEFAULT_SAMPLES 10000L
#define GC_API_UNCERT_DEFAULT_SEED 1
#define GC_API_UNCERT_MAX_SEED 9007199254740991LL   /* 2^53 - 1: exact in every JSON reader */
#define GC_API_UNCERT_MAX_INPUTS 64           /* = GC_UNCERT_MAX_INPUTS */
#define GC_API_UNCERT_MAX_OUTPUTS 32          /* = GC_UNCERT_MAX_OUTPUTS = GC_JW_MAX_TARGETS */
#define GC_API_UNCERT_MAX_THREADS 16
#define GC_API_UNCERT_STEP_MIN 1e-8           /* relative_step bounds */
#define GC_API_UNCERT_STEP_MAX 0.1
#define GC_API_UNCERT_UNIT_LEN 48

/* One input with an uncertainty (or, for /v1/sensitivities, one input the
 * derivatives are taken with respect to). */
typedef struct gc_api_uinput {
    char pointer[GC_API_FIELD_LEN];  /* the input, "/turbine_inlet_temperature" */
    char field[GC_API_FIELD_LEN];    /* where the request named it ("/uncertainties/..." or
                                        "/with_respect_to/2") */
    json_t *given;                   /* the specification as given (borrowed), or NULL */
    gc_api_points_num num;           /* its place and base value (SI) */
    gc_uncert_input u;               /* the engine's input, SI */
    const char *form;                /* "standard", "expanded", "half_width", "parts" */
    double expanded, k;              /* form "expanded": U and its coverage factor, SI */
    int relative;                    /* 1: some amount was given in % of the value */
    char unit[GC_API_UNCERT_UNIT_LEN]; /* label in the response's system ("K", "-") */
    double a, b;                     /* display = a x SI + b */
} gc_api_uinput;

/* One output (an RFC 6901 pointer into the preset's document). */
typedef struct gc_api_uoutput {
    char pointer[GC_API_FIELD_LEN];
    char name[GC_JW_TOKEN_LEN];      /* its last token */
    char unit[GC_API_UNCERT_UNIT_LEN]; /* label in the response's system ("-": none) */
    int quantity;                    /* the label's quantity, or -1 */
    int target;                      /* its target index in the evaluator */
    int by_default;                  /* 1: taken from /summary (a number by construction) */
} gc_api_uoutput;

typedef struct gc_api_ucorr {        /* one correlation as given */
    int i, j;                        /* indices into the inputs */
    double r;
} gc_api_ucorr;

enum { GC_API_U_LINEAR = 0, GC_API_U_MONTE_CARLO = 1 };

typedef struct gc_api_ureq {
    int sensitivities;               /* 1: /v1/sensitivities */
    const gc_preset *p;
    json_t *root;                    /* the normalised request (owned) */
    json_t *inputs;                  /* its base inputs (borrowed), or NULL */
    json_t *specs;                   /* /uncertainties or /with_respect_to (borrowed) */
    json_t *corr_given;              /* /correlations (borrowed), or NULL */
    json_t *outs_given;              /* /outputs (borrowed), or NULL */
    int as_query;
    gc_unit_system sys;
    gc_api_budget *budget;
    int threads;
    int method;                      /* GC_API_U_* */
    gc_uncert_options opt;
    int k_given, p_given, step_given, samples_given, seed_given;
    int n_in;
    gc_api_uinput in[GC_API_UNCERT_MAX_INPUTS];
    int n_corr;
    gc_api_ucorr corr[GC_API_UNCERT_MAX_INPUTS * 2];
    double *R;                       /* n_in x n_in correlation matrix, or NULL (owned) */
    int n_out;
    gc_api_uoutput out[GC_API_UNCERT_MAX_OUTPUTS];
    gc_api_points ev;                /* the evaluator of the calling thread */
    json_t *base_warnings;           /* the base evaluation's warnings (owned), or NULL */
    long evaluations;                /* model evaluations run (the base one included) */
    int stopped;                     /* 1: the time budget or a shutdown stopped a run */
} gc_api_ureq;

/* ---- uncert_request.c ---- */

/* Reads everything that needs no evaluation: the preset, the options, the
 * syntax of the input specifications, correlations and outputs. Errors go
 * to errs with their JSON pointers. */
void gc_api_ureq_decode(gc_api_ureq *q, gc_api_errors *errs);

/* After the base evaluation: the outputs (default: the numbers of
 * /summary), each input's place, value and uncertainty in SI, the
 * correlation matrix. Returns 0, -1 with errs filled, or -2 (memory). */
int gc_api_ureq_resolve(gc_api_ureq *q, gc_api_errors *errs);

void gc_api_ureq_free(gc_api_ureq *q);

/* display = a x SI + b for quantity qty in system sys (a = 1, b = 0 for
 * qty < 0). */
void gc_api_unit_map(int qty, gc_unit_system sys, double *a, double *b);

/* "<y unit>/<x unit>" with "-" for none ("1/K", "kJ/kg/K", "-"). */
void gc_api_ratio_unit(const char *y, const char *x, char *out, size_t n);

/* ---- uncert_model.c ---- */

/* The base evaluation in full (its warnings and units kept): 200, or the
 * preset's status with q->ev.problem; -1 when memory ran out. */
int gc_api_umodel_base(gc_api_ureq *q);

/* Linear propagation into *lin (gascycle/uncert.h); GC_OK or the engine's
 * code with err. The evaluations are charged to the budget first. */
int gc_api_umodel_linear(gc_api_ureq *q, gc_uncert_linear_result *lin, gc_error *err);

/* Monte Carlo into *mc, validated against lin. */
int gc_api_umodel_monte_carlo(gc_api_ureq *q, const gc_uncert_linear_result *lin,
                              gc_uncert_mc_result *mc, gc_error *err);

/* Sensitivities into *s. */
int gc_api_umodel_sensitivities(gc_api_ureq *q, gc_uncert_sens *s, gc_error *err);

/* The problem of Monte Carlo sample j (re-drawn and evaluated on the
 * calling thread): its first error as "field: message" into out (size n);
 * "" when it evaluates after all. */
void gc_api_umodel_sample_problem(gc_api_ureq *q, long j, char *out, size_t n);

/* ---- uncert_formats.c ---- */

/* format=csv of a document of either route (doc borrowed): the budget table
 * or the sensitivity table. Returns 0 (resp filled). */
int gc_api_uncert_csv(const gc_api_ureq *q, json_t *doc, gc_api_response *resp);

/* format=svg: a bar chart of the first output's budget (shares of
 * variance) or elasticities, drawn with chart.h. Returns 0 (resp filled:
 * 200 or a problem). */
int gc_api_uncert_svg(const gc_api_ureq *q, const gc_out *o, json_t *doc,
                      gc_api_response *resp);

#endif
