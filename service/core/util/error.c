/*
 * error.c — status texts and the error-detail helpers declared in gascycle/error.h.
 */
#include "gascycle/error.h"

#include <stdarg.h>
#include <stdio.h>
#include <string.h>

int gc_error_set(gc_error *err, int code, const char *field, const char *fmt, ...)
{
    if (err == NULL)
        return code;
    err->code = code;
    err->field_id = 0;
    err->index[0] = err->index[1] = -1;
    snprintf(err->field, sizeof err->field, "%s", field ? field : "");
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(err->message, sizeof err->message, fmt, ap);
    va_end(ap);
    return code;
}

void gc_error_clear(gc_error *err)
{
    if (err == NULL)
        return;
    err->code = GC_OK;
    err->field_id = 0;
    err->index[0] = err->index[1] = -1;
    err->field[0] = '\0';
    err->message[0] = '\0';
}

const char *gc_strerror(int code)
{
    switch (code) {
    case GC_OK: return "ok";
    case GC_ERR_INVALID: return "invalid argument";
    case GC_ERR_RANGE: return "outside validity range";
    case GC_ERR_NOCONV: return "solver did not converge";
    case GC_ERR_UNKNOWN: return "unknown name";
    case GC_ERR_COMPOSITION: return "invalid composition";
    case GC_ERR_RICH: return "fuel-rich mixture";
    case GC_ERR_NOMEM: return "out of memory";
    case GC_ERR_CHECK: return "consistency check failed";
    case GC_ERR_INFEASIBLE: return "infeasible condition";
    default: return "unknown error";
    }
}
