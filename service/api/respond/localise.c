/*
 * localise.c — figures of a message in the units the user wrote
 * (localise.h). Conversions through units.h only; a figure that cannot be
 * converted is left as it stands (never dropped).
 */
#include "api/respond/localise.h"

#include <ctype.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* SI base units as the core's sentences write them, longest first. */
static const struct { const char *unit; gc_quantity q; } si_base[] = {
    { "J/(kg K)", GC_Q_SPECIFIC_ENTROPY }, { "J/kg", GC_Q_SPECIFIC_ENERGY },
    { "kg/s", GC_Q_MASS_FLOW }, { "m3/kg", GC_Q_SPECIFIC_VOLUME }, { "Pa", GC_Q_PRESSURE },
    { "W", GC_Q_POWER }, { "J", GC_Q_ENERGY }, { "K", GC_Q_TEMPERATURE },
};

static int boundary(char c)
{
    return c == '\0' || c == ' ' || c == ',' || c == ';' || c == ':' || c == ')' || c == '.' ||
           c == '\'' || c == ']';
}

/* The unit at s among the SI base units and both systems' labels (longest
 * match) into unit; its length, 0 when none. */
static size_t unit_at(const char *s, char *unit, size_t n)
{
    size_t best = 0;
    for (size_t i = 0; i < sizeof si_base / sizeof si_base[0]; i++) {
        size_t len = strlen(si_base[i].unit);
        if (len > best && strncmp(s, si_base[i].unit, len) == 0 && boundary(s[len]))
            best = len;
    }
    for (int q = 0; q < GC_Q_COUNT; q++)
        for (int k = 0; k < 2; k++) {
            const char *l = gc_units_label((gc_quantity)q, (gc_unit_system)k);
            size_t len = strlen(l);
            if (strcmp(l, "-") != 0 && len > best && strncmp(s, l, len) == 0 && boundary(s[len]))
                best = len;
        }
    snprintf(unit, n, "%.*s", (int)best, s);
    return best;
}

/* The unit to show for the value written in `written`: a gauge or marked
 * unit as its absolute counterpart ("barg" -> "bar", "kPa(g)" -> "kPa"). */
static void display_unit(int q, const char *written, char *out, size_t n)
{
    size_t len = strlen(written);
    snprintf(out, n, "%s", written);
    if (len > 3 && (strcmp(written + len - 3, "(g)") == 0 || strcmp(written + len - 3, "(a)") == 0))
        out[len - 3] = '\0';
    else if (len > 2 && strcmp(written + len - 2, " g") == 0)
        out[len - 2] = '\0';
    else if (len > 1 && written[len - 1] == 'g' && q >= 0)
        out[len - 1] = '\0';
    double si;
    if (q < 0 || gc_units_to_si((gc_quantity)q, 1.0, out, &si, NULL) != GC_OK)
        snprintf(out, n, "%s", written);
}

/* The figure x unit rewritten into out; 1, or 0 to leave it. */
static int convert(double x, const char *unit, int q, const char *written, gc_unit_system sys,
                   char *out, size_t n)
{
    double si, y;
    if (written && *written && q >= 0 &&
        gc_units_to_si((gc_quantity)q, x, unit, &si, NULL) == GC_OK) {
        char disp[40];
        display_unit(q, written, disp, sizeof disp);
        if (strcmp(disp, unit) == 0 ||
            gc_units_from_si_unit((gc_quantity)q, si, disp, &y, NULL) != GC_OK)
            return 0;
        snprintf(out, n, "%.6g %s", y + 0.0, disp);
        return 1;
    }
    for (size_t i = 0; i < sizeof si_base / sizeof si_base[0]; i++) {
        if (strcmp(si_base[i].unit, unit) != 0)
            continue;
        gc_quantity bq = si_base[i].q;
        const char *label = gc_units_label(bq, sys);
        if (strcmp(label, unit) == 0)
            return 0;
        snprintf(out, n, "%.6g %s", gc_units_from_si(bq, sys, x) + 0.0, label);
        return 1;
    }
    return 0;
}

/* A number may start at i: a digit, or a sign or point before one, not inside a word. */
static int number_start(const char *m, size_t i)
{
    const char *p = m + i;
    int digit = isdigit((unsigned char)p[0]) ||
                ((p[0] == '-' || p[0] == '+' || p[0] == '.') && isdigit((unsigned char)p[1]));
    if (!digit)
        return 0;
    char prev = i ? m[i - 1] : ' ';
    return prev == ' ' || prev == '(' || prev == '[' || prev == '=';
}

void gc_api_localise(char *msg, size_t n, int q, const char *written, gc_unit_system sys)
{
    char out[1024];
    size_t o = 0;
    if (!msg || n == 0 || n > sizeof out)
        return;
    for (size_t i = 0; msg[i] && o + 1 < sizeof out;) {
        char *end = NULL;
        double x = number_start(msg, i) ? strtod(msg + i, &end) : 0.0;
        char unit[40], rep[80];
        size_t ulen = end && *end == ' ' ? unit_at(end + 1, unit, sizeof unit) : 0;
        if (ulen && convert(x, unit, q, written, sys, rep, sizeof rep)) {
            o += (size_t)snprintf(out + o, sizeof out - o, "%s", rep);
            if (o >= sizeof out)
                o = sizeof out - 1;
            i = (size_t)(end + 1 + ulen - msg);
            continue;
        }
        size_t step = end && end > msg + i ? (size_t)(end - msg) - i : 1;
        for (size_t k = 0; k < step && o + 1 < sizeof out; k++)
            out[o++] = msg[i + k];
        i += step;
    }
    out[o] = '\0';
    snprintf(msg, n, "%s", out);
}
