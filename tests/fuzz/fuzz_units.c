/*
 * fuzz_units.c — libFuzzer target: the unit parser (units.h,
 * gc_units_parse) on arbitrary text for every quantity.
 *
 * Input: the first byte picks the quantity (modulo GC_Q_COUNT), the rest is
 * the text. Checks: a value the parser accepts is finite in SI, and (below
 * 1e300 in magnitude: every input field's own bounds are far below that)
 * finite again when converted to the si and us output units; a refused text
 * comes with a message.
 */
#include "gascycle/error.h"
#include "gascycle/units.h"

#include <math.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    if (size < 1)
        return 0;
    gc_quantity q = (gc_quantity)(data[0] % GC_Q_COUNT);
    char *text = malloc(size);
    if (!text)
        return 0;
    memcpy(text, data + 1, size - 1);
    text[size - 1] = '\0';
    double si = 0.0;
    gc_error err;
    gc_error_clear(&err);
    if (gc_units_parse(q, text, &si, &err) == GC_OK) {
        if (!isfinite(si)) {
            fprintf(stderr, "fuzz: '%s' parsed to a non-finite %g\n", text, si);
            abort();
        }
        double a = gc_units_from_si(q, GC_UNITS_SI, si), b = gc_units_from_si(q, GC_UNITS_US, si);
        if (fabs(si) < 1e300 && (!isfinite(a) || !isfinite(b))) {
            fprintf(stderr, "fuzz: '%s' (%g SI) converts to %g si, %g us\n", text, si, a, b);
            abort();
        }
    } else if (err.message[0] == '\0') {
        fprintf(stderr, "fuzz: '%s' refused without a message\n", text);
        abort();
    }
    free(text);
    return 0;
}
