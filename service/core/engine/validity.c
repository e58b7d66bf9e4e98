/*
 * validity.c — the real-gas and dissociation rules of validity.h: the
 * virial estimate from the Lemmon et al. (2000) air equation, the
 * equilibrium dissociation of CO2 from the NASA-9 Gibbs energies, and the
 * scan that names the worst state of a route for its warnings.
 *
 * Coefficients (Lemmon et al. 2000, the residual part of the air equation,
 * the terms that survive at low density; t_k exponents of tau = T_j / T):
 *   d = 1, polynomial:  N1 = 0.118160747229 (t 0), N2 = 0.713116392079 (t 0.33),
 *                       N3 = -1.61824192067 (t 1.01)
 *   d = 2, polynomial:  N4 = 0.0714140178971 (t 0)
 *   d = 1, exponential: N11 = -0.101365037912 (t 1.6, l 1),
 *                       N15 = -0.146629609713 (t 3.6, l 2),
 *                       N18 = 0.0148287891978 (t 3.5, l 3)
 * (the l = 1 term contributes -N11 tau^1.6 delta^2 to the delta^2 order
 * through exp(-delta) = 1 - delta + ...; the l = 2 and l = 3 terms do not).
 * Reducing values T_j = 132.6312 K, rho_j = 10.4477 mol/dm3, R = 8.31451
 * J/(mol K) are the equation's own. The numbers were transcribed from
 * Debian's python3-iapws 1.5.3 (iapws.humidAir.Air, which cites the paper),
 * and the estimate is checked against that library's full equation
 * (tests/unit/test_validity.c).
 *
 * Units: SI inside (K, Pa, mol/m3, J/(mol K)).
 */
#include "gascycle/validity.h"
#include "gascycle/strbuf.h"
#include "gascycle/species.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#define LEM_TJ_K 132.6312           /* reducing temperature, K */
#define LEM_RHOJ_MOL_M3 10447.7     /* reducing molar density, mol/m3 */
#define LEM_R 8.31451               /* J/(mol K), the equation's gas constant */

typedef struct term { double n, t; } term;

/* B rho_j = sum of the d = 1 terms */
static const term B_TERMS[] = {
    { 0.118160747229, 0.0 }, { 0.713116392079, 0.33 }, { -1.61824192067, 1.01 },
    { -0.101365037912, 1.6 }, { -0.146629609713, 3.6 }, { 0.0148287891978, 3.5 } };
/* C rho_j^2 / 2 = N4 - N11 tau^1.6 */
static const term C_HALF_TERMS[] = { { 0.0714140178971, 0.0 }, { 0.101365037912, 1.6 } };

/* sum n tau^t and its first two tau-derivatives */
static void series(const term *a, size_t n, double tau, double *f, double *f1, double *f2)
{
    *f = *f1 = *f2 = 0.0;
    for (size_t i = 0; i < n; i++) {
        double p = a[i].n * pow(tau, a[i].t);
        *f += p;
        *f1 += a[i].t * p / tau;
        *f2 += a[i].t * (a[i].t - 1.0) * p / (tau * tau);
    }
}

void gc_validity_air_virial(double T_K, double *B, double *C)
{
    double tau = LEM_TJ_K / T_K, b, c, d1, d2;
    series(B_TERMS, sizeof B_TERMS / sizeof B_TERMS[0], tau, &b, &d1, &d2);
    series(C_HALF_TERMS, sizeof C_HALF_TERMS / sizeof C_HALF_TERMS[0], tau, &c, &d1, &d2);
    if (B)
        *B = b / LEM_RHOJ_MOL_M3;
    if (C)
        *C = 2.0 * c / (LEM_RHOJ_MOL_M3 * LEM_RHOJ_MOL_M3);
}

int gc_validity_air_like(const gc_gas *g)
{
    if (g->kind == GC_GAS_COLD)
        return 1;
    double x = 0.0;
    for (int i = 0; i < g->n_species; i++)
        if (g->species[i] == GC_SP_N2 || g->species[i] == GC_SP_O2 ||
            g->species[i] == GC_SP_AR)
            x += g->x[i];
    return x >= GC_VALIDITY_AIR_LIKE;
}

/* Reduced density delta of the truncated virial equation
 * delta (1 + b delta + c delta^2) = p, by Newton's method from delta = 0
 * (monotone while the derivative stays positive); 0 when no gas-like root
 * is reached before the derivative vanishes. */
static int solve_delta(double b, double c, double p, double *delta)
{
    double d = 0.0;
    for (int it = 0; it < 200; it++) {
        double g = d * (1.0 + d * (b + c * d)) - p;
        double dg = 1.0 + d * (2.0 * b + 3.0 * c * d);
        if (!(dg > 0.0))
            return 0;
        double dn = d - g / dg;
        if (!(dn >= 0.0) || !isfinite(dn))
            return 0;
        if (fabs(dn - d) <= 1e-15 * dn) {
            *delta = dn;
            return 1;
        }
        d = dn;
    }
    return 0;
}

void gc_validity_real_gas(const gc_gas *g, double T_K, double P_Pa, gc_real_gas *e)
{
    memset(e, 0, sizeof *e);
    if (!(T_K > 0.0) || !(P_Pa > 0.0) || !isfinite(T_K) || !isfinite(P_Pa))
        return;
    e->applicable = gc_validity_air_like(g);
    if (!e->applicable)
        return;
    double tau = LEM_TJ_K / T_K, b, b1, b2, c, c1, c2;
    series(B_TERMS, sizeof B_TERMS / sizeof B_TERMS[0], tau, &b, &b1, &b2);
    series(C_HALF_TERMS, sizeof C_HALF_TERMS / sizeof C_HALF_TERMS[0], tau, &c, &c1, &c2);
    c *= 2.0; /* reduced C */
    c1 *= 2.0;
    c2 *= 2.0;
    double d;
    if (!solve_delta(b, c, P_Pa / (LEM_R * T_K * LEM_RHOJ_MOL_M3), &d)) {
        e->departure = 1.0; /* too dense for the estimate: far from an ideal gas */
        return;
    }
    /* alpha_r = b delta + c delta^2 / 2 and its derivatives */
    double ad = b + c * d, add = c;
    double att = d * b2 + 0.5 * d * d * c2, adt = b1 + c1 * d;
    double Z = 1.0 + d * ad;
    double num = 1.0 + d * ad - d * tau * adt;
    double cp_r = LEM_R * (-tau * tau * att + num * num / (1.0 + 2.0 * d * ad + d * d * add) - 1.0);
    /* the model's own ideal-gas cp, J/(mol K), at T held inside its data range */
    double Tc = T_K < g->T_min_K ? g->T_min_K : T_K > g->T_max_K ? g->T_max_K : T_K;
    double cp0 = gc_gas_cp_T(g, Tc) * g->M_kg_per_mol;
    if (!(Z > 0.0) || !(cp0 + cp_r > 0.0)) {
        e->departure = 1.0;
        return;
    }
    e->estimated = 1;
    e->Z = Z;
    e->v_departure = 1.0 / Z - 1.0;
    e->cp_departure = cp0 / (cp0 + cp_r) - 1.0;
    e->departure = fmax(fabs(e->v_departure), fabs(e->cp_departure));
}

/* ---- dissociation --------------------------------------------------------- */

static double g_RT(int id, double T)
{
    const gc_species *sp = gc_species_get(id);
    return (gc_species_h_molar(sp, T) - T * gc_species_s0_molar(sp, T)) / (GC_R_UNIVERSAL * T);
}

/* The dissociated fraction by bisection on (0, 1). With below > 0 the
 * bisection stops as soon as the root is known to lie under it (hi < below)
 * and returns hi: the scan only needs the fraction itself from its limit
 * up, and the steps it runs are the same steps, so a fraction at or above
 * `below` is bit for bit the one of the full bisection. */
static double dissociation(double T_K, double P_Pa, double below)
{
    if (!(T_K >= 1000.0) || !(P_Pa > 0.0) || !isfinite(T_K) || !isfinite(P_Pa))
        return 0.0;
    const gc_species *co2 = gc_species_get(GC_SP_CO2);
    if (T_K > co2->T_K[co2->n_intervals])
        T_K = co2->T_K[co2->n_intervals];
    double lnK = g_RT(GC_SP_CO2, T_K) - g_RT(GC_SP_CO, T_K) - 0.5 * g_RT(GC_SP_O2, T_K);
    double c = lnK - 0.5 * log(P_Pa / GC_P_STD_PA);
    /* f(a) = ln a - ln(1 - a) + (ln a - ln(2 + a)) / 2 - c, rising in a on (0, 1) */
    double lo = 0.0, hi = 1.0, a = 0.5;
    for (int it = 0; it < 200; it++) {
        a = 0.5 * (lo + hi);
        double f = 1.5 * log(a) - log1p(-a) - 0.5 * log(2.0 + a) - c;
        if (f > 0.0)
            hi = a;
        else
            lo = a;
        if (hi < below)
            return hi;
        if (hi - lo <= 1e-15 * hi)
            break;
    }
    return a;
}

double gc_validity_co2_dissociation(double T_K, double P_Pa)
{
    return dissociation(T_K, P_Pa, 0.0);
}

/* ---- scan ----------------------------------------------------------------- */

void gc_validity_scan_init(gc_validity_scan *s)
{
    memset(s, 0, sizeof *s);
}

static void keep(gc_validity_worst *w, const char *label, double T, double P, double value,
                 const gc_real_gas *rg)
{
    w->count++;
    if (w->count == 1 || value > w->value) {
        gc_text_copy(w->label, sizeof w->label, label ? label : "a state");
        w->T_K = T;
        w->P_Pa = P;
        w->value = value;
        if (rg)
            w->rg = *rg;
    }
}

void gc_validity_scan_state(gc_validity_scan *s, const gc_gas *g, double T_K, double P_Pa,
                            const char *label)
{
    gc_real_gas rg;
    gc_validity_real_gas(g, T_K, P_Pa, &rg);
    if (rg.applicable && rg.departure >= GC_VALIDITY_REAL_GAS_LIMIT)
        keep(&s->real_gas, label, T_K, P_Pa, rg.departure, &rg);
    else if (!rg.applicable && P_Pa >= GC_VALIDITY_UNKNOWN_GAS_P_PA)
        keep(&s->not_estimated, label, T_K, P_Pa, P_Pa, NULL);
    double a = dissociation(T_K, P_Pa, GC_VALIDITY_DISSOCIATION_LIMIT);
    if (a >= GC_VALIDITY_DISSOCIATION_LIMIT)
        keep(&s->dissociation, label, T_K, P_Pa, a, NULL);
}

/* Appends the text s to out (length *k, size n), cut as snprintf cuts. */
static void append(char *out, size_t n, size_t *k, const char *s)
{
    while (*s && *k + 1 < n)
        out[(*k)++] = *s++;
    out[*k] = '\0';
}

/* "<prefix>state <number>" (number >= 1), the text snprintf would write:
 * once per state of every evaluation, so without printf. */
static void state_label(char *out, size_t n, const char *prefix, int number)
{
    char digits[16];
    int nd = (int)sizeof digits - 1;
    digits[nd] = '\0';
    unsigned u = (unsigned)number;
    do {
        digits[--nd] = (char)('0' + u % 10u);
        u /= 10u;
    } while (u > 0u && nd > 0);
    size_t k = 0;
    out[0] = '\0';
    append(out, n, &k, prefix ? prefix : "");
    append(out, n, &k, "state ");
    append(out, n, &k, digits + nd);
}

void gc_validity_scan_run(gc_validity_scan *s, const gc_cycle_run *run, const char *prefix)
{
    int n = run->n_states;
    if (n > 1)
        n--; /* the closing state is the start again */
    for (int i = 0; i < n; i++) {
        const gc_cycle_state *st = &run->states[i];
        char label[64];
        state_label(label, sizeof label, prefix, i + 1);
        gc_validity_scan_state(s, &run->gases[st->gas], st->T_K, st->P_Pa, label);
    }
}

static void others(char *buf, size_t n, int count)
{
    if (count > 1)
        snprintf(buf, n, " (%d states cross the limit)", count);
    else
        buf[0] = '\0';
}

int gc_validity_scan_notes(const gc_validity_scan *s, gc_validity_note *notes, int max)
{
    int k = 0;
    char more[64];
    const gc_validity_worst *w = &s->real_gas;
    if (w->count > 0 && k < max) {
        gc_validity_note *nt = &notes[k++];
        snprintf(nt->code, sizeof nt->code, "real_gas");
        others(more, sizeof more, w->count);
        if (w->rg.estimated)
            snprintf(nt->message, sizeof nt->message,
                     "%s (%.4g K, %.4g MPa) is not an ideal gas: the ideal-gas v here is "
                     "%.2g %% off, cp %.2g %% (Z = %.4g; virial estimate, Lemmon et al. 2000 "
                     "air equation; flagged from 1 %%)%s",
                     w->label, w->T_K, w->P_Pa / 1e6, 100.0 * fabs(w->rg.v_departure),
                     100.0 * fabs(w->rg.cp_departure), w->rg.Z, more);
        else
            snprintf(nt->message, sizeof nt->message,
                     "%s (%.4g K, %.4g MPa) is far from an ideal gas, beyond the virial "
                     "estimate (Lemmon et al. 2000 air equation): the ideal-gas values here "
                     "may be off by tens of per cent%s",
                     w->label, w->T_K, w->P_Pa / 1e6, more);
    }
    w = &s->not_estimated;
    if (w->count > 0 && k < max) {
        gc_validity_note *nt = &notes[k++];
        snprintf(nt->code, sizeof nt->code, "real_gas_not_estimated");
        snprintf(nt->message, sizeof nt->message,
                 "no real-gas estimate for this gas (the virial estimate covers air-like "
                 "gases): at %.4g MPa (%s) a gas rich in CO2 or water vapour may depart from "
                 "the ideal gas by more than 1 %%", w->P_Pa / 1e6, w->label);
    }
    w = &s->dissociation;
    if (w->count > 0 && k < max) {
        gc_validity_note *nt = &notes[k++];
        snprintf(nt->code, sizeof nt->code, "dissociation");
        others(more, sizeof more, w->count);
        snprintf(nt->message, sizeof nt->message,
                 "%s reaches %.4g K at %.4g MPa: CO2 would be %.2g %% dissociated there "
                 "(equilibrium, NASA-9 data; flagged from 1 %%), which this model leaves "
                 "out, so it overstates temperature and efficiency%s",
                 w->label, w->T_K, w->P_Pa / 1e6, 100.0 * w->value, more);
    }
    return k;
}
