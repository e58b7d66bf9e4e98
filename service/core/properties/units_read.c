/*
 * units_read.c — reading a value as people write it (units.h: gc_units_read,
 * gc_units_parse): the number (decimal point, or a decimal comma when the
 * caller asks), spellings of units ("deg C", "Celsius", "percent"), gauge
 * pressures ("5 barg", "75 psig", "2 bar(g)") and volume flows at named
 * standard conditions ("12000 Sm3/h", "450 scfm", "10 MMscfd"), which the
 * caller completes with a barometric pressure or a gas density.
 *
 * Standard conditions: ISO 13443:1996 (natural gas, standard reference
 * conditions: 288.15 K and 101.325 kPa) for "Sm3"; the "normal" cubic metre
 * at 273.15 K and 101.325 kPa (DIN 1343) for "Nm3"; US gas-industry practice
 * for "scf": 60 degF and 14.696 psia (common practice; the American Gas
 * Association's 14.73 psia base also occurs, so the echo names the base).
 * The density at those conditions is the ideal-gas density P M / (R T)
 * (R = 8.314462618 J/(mol K), CODATA 2018): natural gas departs from it by
 * about 0.2 % there (its compressibility factor is about 0.998; common
 * practice), which the echo states.
 *
 * Factors: the foot 0.3048 m (exact) gives the cubic foot 0.028316846592 m3
 * (NIST SP 811 B.8: 2.831685E-02); psi as in units.c.
 */
#include "gascycle/units.h"
#include "gascycle/gas.h"

#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

#define FT3 (0.3048 * 0.3048 * 0.3048)           /* m3, cubic foot (exact) */
#define PSI (0.45359237 * 9.80665 / (0.0254 * 0.0254)) /* Pa, pound-force per square inch */

/* ---- standard conditions --------------------------------------------------------------- */

int gc_units_std_conditions(gc_std_conditions c, double *T_K, double *P_Pa, const char **name)
{
    double T, P;
    const char *n;
    switch (c) {
    case GC_STD_ISO_13443:
        T = 288.15, P = 101325.0, n = "15 degC and 101.325 kPa (ISO 13443 standard reference)";
        break;
    case GC_STD_NORMAL:
        T = 273.15, P = 101325.0, n = "0 degC and 101.325 kPa (normal conditions, DIN 1343)";
        break;
    case GC_STD_US_60F:
        T = (60.0 + 459.67) / 1.8, P = 14.696 * PSI,
        n = "60 degF and 14.696 psia (US gas-industry standard conditions)";
        break;
    default:
        return GC_ERR_INVALID;
    }
    if (T_K)
        *T_K = T;
    if (P_Pa)
        *P_Pa = P;
    if (name)
        *name = n;
    return GC_OK;
}

double gc_units_std_density(gc_std_conditions c, double M_kg_per_mol)
{
    double T = 0.0, P = 0.0;
    if (gc_units_std_conditions(c, &T, &P, NULL) != GC_OK)
        return 0.0;
    return P * M_kg_per_mol / (GC_R_UNIVERSAL * T);
}

/* ---- spellings --------------------------------------------------------------------------- */

/* Whole-unit spellings read as another unit. */
static const char *alias_of(const char *unit)
{
    static const char *const alias[][2] = {
        { "deg C", "degC" }, { "deg F", "degF" }, { "deg R", "degR" }, { "deg K", "K" },
        { "Celsius", "degC" }, { "celsius", "degC" }, { "Fahrenheit", "degF" },
        { "fahrenheit", "degF" }, { "kelvin", "K" }, { "Kelvin", "K" }, { "percent", "%" },
    };
    for (size_t i = 0; i < sizeof alias / sizeof alias[0]; i++)
        if (strcmp(unit, alias[i][0]) == 0)
            return alias[i][1];
    return unit;
}

/* A gauge pressure unit -> Pa per unit; 0 when unit is none. */
static double gauge_factor(const char *unit)
{
    static const struct { const char *sym; double pa; } gauge[] = {
        { "psig", PSI }, { "psi(g)", PSI }, { "psi g", PSI },
        { "barg", 1e5 }, { "bar(g)", 1e5 }, { "bar g", 1e5 }, { "mbarg", 1e2 }, { "mbar(g)", 1e2 },
        { "kPag", 1e3 }, { "kPa(g)", 1e3 }, { "kPa g", 1e3 },
        { "MPag", 1e6 }, { "MPa(g)", 1e6 }, { "MPa g", 1e6 },
    };
    for (size_t i = 0; i < sizeof gauge / sizeof gauge[0]; i++)
        if (strcmp(unit, gauge[i].sym) == 0)
            return gauge[i].pa;
    return 0.0;
}

/* An absolute pressure spelled with its marker ("bar(a)", "kPa(a)", "psi(a)"):
 * the plain symbol, or NULL. */
static const char *absolute_marker(const char *unit, char *buf, size_t n)
{
    size_t len = strlen(unit);
    if (len < 4 || strcmp(unit + len - 3, "(a)") != 0)
        return NULL;
    snprintf(buf, n, "%.*s", (int)(len - 3), unit);
    return buf;
}

/* ---- standard volume flows --------------------------------------------------------------- */

typedef struct std_volume {
    const char *sym;
    double m3;                 /* volume of one unit at its conditions, m3 */
    gc_std_conditions cond;
} std_volume;

static const std_volume std_volumes[] = {
    { "MMscf", 1e6 * FT3, GC_STD_US_60F }, { "Mscf", 1e3 * FT3, GC_STD_US_60F },
    { "kscf", 1e3 * FT3, GC_STD_US_60F }, { "scf", FT3, GC_STD_US_60F },
    { "Sm3", 1.0, GC_STD_ISO_13443 }, { "Nm3", 1.0, GC_STD_NORMAL },
};

static double time_unit(const char *t)
{
    static const struct { const char *sym; double s; } times[] = {
        { "s", 1.0 }, { "min", 60.0 }, { "h", 3600.0 }, { "hr", 3600.0 },
        { "d", 86400.0 }, { "day", 86400.0 },
    };
    for (size_t i = 0; i < sizeof times / sizeof times[0]; i++)
        if (strcmp(t, times[i].sym) == 0)
            return times[i].s;
    return 0.0;
}

/* "Sm3/h", "scfm", "MMscfd", "SCFH" -> m3/s per unit at *cond; 0 when unit is none. */
static double std_volume_factor(const char *unit, gc_std_conditions *cond)
{
    for (size_t i = 0; i < sizeof std_volumes / sizeof std_volumes[0]; i++) {
        const std_volume *v = &std_volumes[i];
        size_t n = strlen(v->sym);
        if (strncasecmp(unit, v->sym, n) != 0)
            continue;
        const char *rest = unit + n;
        int scf = v->cond == GC_STD_US_60F;
        double sec = 0.0;
        if (*rest == '/')
            sec = time_unit(rest + 1);
        else if (scf && rest[0] && !rest[1])   /* scfh, scfm, scfd */
            sec = strchr("hH", rest[0]) ? 3600.0 : strchr("mM", rest[0]) ? 60.0
                : strchr("dD", rest[0]) ? 86400.0 : 0.0;
        if (sec > 0.0 && (scf || strncmp(unit, v->sym, n) == 0)) {
            *cond = v->cond;
            return v->m3 / sec;
        }
        return 0.0;
    }
    return 0.0;
}

/* ---- numbers ------------------------------------------------------------------------------- */

/* The number at the start of s: [+-](digits[sep digits]|sep digits)[e[+-]digits] with sep
 * '.' (or ',' when comma); its length, 0 when there is none. *sep_at: the separator's
 * offset, or -1. */
static size_t number_span(const char *s, int comma, int *sep_at)
{
    size_t i = 0, digits = 0;
    *sep_at = -1;
    if (s[i] == '+' || s[i] == '-')
        i++;
    while (isdigit((unsigned char)s[i]))
        i++, digits++;
    if (s[i] == '.' || (comma && s[i] == ',')) {
        *sep_at = (int)i++;
        while (isdigit((unsigned char)s[i]))
            i++, digits++;
    }
    if (digits == 0)
        return 0;
    if (s[i] == 'e' || s[i] == 'E') {
        size_t j = i + 1;
        if (s[j] == '+' || s[j] == '-')
            j++;
        if (isdigit((unsigned char)s[j])) {
            while (isdigit((unsigned char)s[j]))
                j++;
            i = j;
        }
    }
    return i;
}

/* With decimal commas, a dotted number that reads as a thousands group
 * ("1.500", "12.000"): refused rather than guessed. */
static int ambiguous_dot(const char *num, int sep_at)
{
    const char *p = num;
    if (*p == '+' || *p == '-')
        p++;
    size_t lead = (size_t)(num + sep_at - p), frac = strspn(num + sep_at + 1, "0123456789");
    return num[sep_at] == '.' && lead >= 1 && lead <= 3 && p[0] != '0' && frac == 3 &&
           num[sep_at + 1 + frac] == '\0';
}

static int not_a_number(const char *text, const char *p, gc_error *err)
{
    const char *r = p;
    if (*r == '+' || *r == '-')
        r++;
    if (strncasecmp(r, "nan", 3) == 0 || strncasecmp(r, "inf", 3) == 0)
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "NaN and Infinity are not accepted; give a finite number");
    if (*p == '\0')
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "is empty; expected a number, optionally with a unit");
    return gc_error_set(err, GC_ERR_INVALID, NULL,
                        "'%.40s' is not a number with an optional unit (e.g. '12 bar')", text);
}

/* The number at p into *v and its length into *len; GC_OK or an error. */
static int read_number(const char *text, const char *p, int comma, double *v, size_t *len,
                       gc_error *err)
{
    int sep_at;
    size_t n = number_span(p, comma, &sep_at);
    if (n == 0)
        return not_a_number(text, p, err);
    char num[64];
    if (n >= sizeof num)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "the number is too long");
    memcpy(num, p, n);
    num[n] = '\0';
    if (comma && (p[n] == '.' || p[n] == ','))
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "'%.40s' has more than one separator: write no thousands separators",
                            text);
    if (comma && sep_at >= 0 && ambiguous_dot(num, sep_at))
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "'%s' could be a decimal or a thousands group: with decimal commas "
                            "write the decimal part after a comma and no group separators", num);
    if (sep_at >= 0)
        num[sep_at] = '.';
    *v = strtod(num, NULL);
    if (!isfinite(*v))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "the number %s is out of range", num);
    *len = n;
    return GC_OK;
}

/* ---- readings ------------------------------------------------------------------------------- */

/* The unit text after the number: trimmed into r->unit (alias applied). */
static int unit_text(const char *u, gc_reading *r, gc_error *err)
{
    const char *b = u, *e = u + strlen(u);
    while (b < e && isspace((unsigned char)*b))
        b++;
    while (e > b && isspace((unsigned char)e[-1]))
        e--;
    if ((size_t)(e - b) >= sizeof r->unit)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "the unit is too long");
    char raw[sizeof r->unit];
    memcpy(raw, b, (size_t)(e - b));
    raw[e - b] = '\0';
    snprintf(r->unit, sizeof r->unit, "%s", alias_of(raw));
    return GC_OK;
}

/* A unit needing context (gauge, standard volume): r filled, *found = 1; GC_OK with
 * *found = 0 when it is none; an error when it does not fit q. */
static int context_unit(gc_quantity q, gc_reading *r, int *found, gc_error *err)
{
    double g = gauge_factor(r->unit);
    gc_std_conditions cond = GC_STD_NONE;
    double sv = g > 0.0 ? 0.0 : std_volume_factor(r->unit, &cond);
    *found = 0;
    if (g == 0.0 && sv == 0.0)
        return GC_OK;
    if (g > 0.0 && q != GC_Q_PRESSURE)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "unit '%s' is a gauge pressure, expected "
                            "%s (%s)", r->unit, gc_quantity_words(q), gc_units_accepted(q));
    if (sv > 0.0 && q != GC_Q_MASS_FLOW)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "unit '%s' is a volume flow at standard "
                            "conditions, expected %s (%s)", r->unit, gc_quantity_words(q),
                            gc_units_accepted(q));
    r->kind = g > 0.0 ? GC_READING_GAUGE : GC_READING_STD_VOLUME;
    r->cond = cond;
    r->si = r->number * (g > 0.0 ? g : sv);
    if (!isfinite(r->si))
        return gc_error_set(err, GC_ERR_INVALID, NULL, "the value is too large");
    *found = 1;
    return GC_OK;
}

int gc_units_read(gc_quantity q, const char *text, const gc_units_opts *opts, gc_reading *r,
                  gc_error *err)
{
    static const gc_units_opts plain = { GC_UNITS_SI, 0 };
    const gc_units_opts *o = opts ? opts : &plain;
    memset(r, 0, sizeof *r);
    if (!text)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "no value given");
    if (q < 0 || q >= GC_Q_COUNT)
        return gc_error_set(err, GC_ERR_INVALID, NULL, "unknown quantity");
    const char *p = text;
    while (isspace((unsigned char)*p))
        p++;
    size_t n = 0;
    int rc = read_number(text, p, o->decimal_comma, &r->number, &n, err);
    if (rc != GC_OK || (rc = unit_text(p + n, r, err)) != GC_OK)
        return rc;
    if (r->unit[0] == '\0') {
        r->si = gc_units_to_si_sys(q, o->input_sys, r->number);
        return isfinite(r->si) ? GC_OK
                               : gc_error_set(err, GC_ERR_INVALID, NULL, "the value is too large");
    }
    int found = 0;
    rc = context_unit(q, r, &found, err);
    if (rc != GC_OK || found)
        return rc;
    char buf[sizeof r->unit];
    const char *plain_unit = absolute_marker(r->unit, buf, sizeof buf);
    return gc_units_to_si(q, r->number, plain_unit ? plain_unit : r->unit, &r->si, err);
}

int gc_units_parse(gc_quantity q, const char *text, double *si_value, gc_error *err)
{
    gc_reading r;
    int rc = gc_units_read(q, text, NULL, &r, err);
    if (rc != GC_OK)
        return rc;
    if (r.kind == GC_READING_GAUGE)
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "'%s' is a gauge pressure, which needs a barometric pressure to "
                            "read: here give an absolute pressure ('psia', 'bar', 'kPa')", r.unit);
    if (r.kind == GC_READING_STD_VOLUME)
        return gc_error_set(err, GC_ERR_INVALID, NULL,
                            "'%s' is a volume flow at standard conditions, which needs the gas's "
                            "density to read: here give a mass flow ('kg/s', 'lbm/h')", r.unit);
    *si_value = r.si;
    return GC_OK;
}
