/*
 * respond.h — private to the API layer: the answer of one preset evaluation
 * in the format the request asked for, and the problem of one that failed.
 *
 *   json     the document (doc.h)
 *   select   the value at a JSON pointer: a scalar bare as text/plain
 *            (numbers at 10 significant digits), an object or array as JSON;
 *            400 when the pointer names nothing
 *   csv      the document's states and processes (or its one-row table) as
 *            RFC 4180 tables, units in the header row
 *   svg      the diagram (gascycle/diagram.h) of a cycle preset's result
 * A document holding a value that is not finite is never sent: 422
 * "not_finite" instead.
 *
 * Problems of a failed evaluation (gc_report errors, by field id): 503 when
 * memory ran out; else 422 with the class of the first error's code
 * (check_failed, infeasible, out_of_range, no_convergence, validation) and
 * every error with its JSON pointer.
 */
#ifndef GC_API_RESPOND_H
#define GC_API_RESPOND_H

#include "api/api.h"
#include "api/request/params.h"
#include "api/respond/doc.h"

/* Fills resp with the answer (always returns 0; on memory exhaustion a 503
 * problem). */
int gc_api_respond_preset(gc_api_response *resp, const gc_preset *p, const gc_api_params *v,
                          const void *echo, const void *result, const gc_report *rep);

/* Fills resp with the problem of rep's errors (prefix before every pointer,
 * may be NULL). The figures of the messages in the units the request wrote
 * (ctx, may be NULL) or the answer's system sys (localise.h). Returns 0. */
int gc_api_problem_report(gc_api_response *resp, const gc_preset *p, const gc_report *rep,
                          const char *prefix, const gc_decode_ctx *ctx, gc_unit_system sys);

/* rep's errors as field errors (pointers after prefix), figures localised. */
void gc_api_report_errors(const gc_preset *p, const gc_report *rep, const char *prefix,
                          const gc_decode_ctx *ctx, gc_unit_system sys, gc_api_errors *errs);

/* The class and title of a core status on a preset of kind `kind`. */
const char *gc_api_error_class(int code);

#endif
