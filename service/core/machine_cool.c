/*
 * machine_cool.c — the cooled first turbine stage of machine.h: coolant bled
 * at compressor delivery for the first nozzle row and the first rotor row,
 * each row's coolant from the convective blade-cooling model of Holland &
 * Thake (1980) as written by Horlock, "Advanced Gas Turbine Cycles"
 * (Pergamon 2003), eq. 5.8:
 *     psi = m_coolant / m_gas = K (T_g - T_b) / (T_b - T_c),  psi = 0 if T_g <= T_b,
 * with K the row's constant (external Stanton number, area and heat-capacity
 * ratios and the internal cooling efficiency folded into one figure), T_g
 * the gas temperature entering the row, T_b the allowed blade metal
 * temperature and T_c the coolant inlet temperature. Nozzle row: T_g = the
 * combustor exit, m_gas = the combustor's gas. Rotor row: T_g = the mixed
 * rotor inlet (the rotor-relative total temperature is lower: neglected, on
 * the safe side), m_gas = combustor gas + nozzle coolant.
 *
 * All coolant re-enters the gas before the first rotor (single-step cooling,
 * the same book ch. 4) at constant pressure. Complete combustion makes the
 * mixed state independent of the split: core products at the combustor exit
 * mixed with coolant at compressor delivery have the enthalpy and
 * composition of all the air burnt with the same fuel, so a chain that burns
 * all the air to the mixed rotor-inlet temperature has the same fuel flow,
 * turbine gas and work. This file only finds the split.
 *
 * The split for a given mixed temperature solves for the coolant fraction
 * beta (per kg of compressor air) the fixed point
 *     beta = psi_n(T_ce(beta)) m_g + psi_r(T_rit) (1 + psi_n) m_g,
 *     m_g = 1 - beta + far,
 * T_ce(beta) being the core air (1 - beta kg at T_c) burnt with the whole
 * fuel (combustion.h, burner efficiency eta_b). Secant steps with a
 * bracket (machine.c), to 1e-14 in beta.
 *
 * Units: SI (K, kg/kg).
 */
#include "core/machine_internal.h"

#include <math.h>
#include <string.h>

#define BETA_MAX 0.5            /* largest coolant fraction accepted, - */

typedef struct split_ctx {
    const gc_machine_cooling *c;
    const gc_fuel *fuel;
    double T_fuel, T_c, far, eta_b, T_rit;
    const gc_gas *air;
    gc_burn burn;               /* last core burn */
    double psi_n, psi_r, beta_last;
} split_ctx;

static double row_psi(double K, double T_g, double T_b, double T_c)
{
    return T_g > T_b ? K * (T_g - T_b) / (T_b - T_c) : 0.0;
}

/* h(beta) = beta - coolant needed at beta */
static int split_fn(void *ctx, double beta, double *y, gc_error *err)
{
    split_ctx *S = ctx;
    double core = 1.0 - beta;
    int rc = gc_combustion_burn_far(S->fuel, S->T_fuel, S->air, S->T_c, core, S->far / core,
                                    S->eta_b, &S->burn, err);
    if (rc != GC_OK)
        return rc;
    double m_g = core + S->far;
    const double Tb = S->c->blade_temperature_K;
    S->psi_n = row_psi(S->c->nozzle_constant, S->burn.T_out_K, Tb, S->T_c);
    S->psi_r = row_psi(S->c->rotor_constant, S->T_rit, Tb, S->T_c);
    double need = S->psi_n * m_g + S->psi_r * (1.0 + S->psi_n) * m_g;
    *y = beta - need;
    S->beta_last = beta;
    return GC_OK;
}

/* d h / d beta, estimated: the combustor exit rises as the core air shrinks,
 * T_ce - T_c ~ 1/(1 - beta), and the nozzle row's demand with it. */
static double split_slope(const split_ctx *S, double beta)
{
    const double Tb = S->c->blade_temperature_K, T_ce = S->burn.T_out_K;
    if (!(T_ce > Tb))
        return 1.0;
    double dT = (T_ce - S->T_c) / (1.0 - beta);
    double m_g = 1.0 - beta + S->far;
    double dpsi = S->c->nozzle_constant / (Tb - S->T_c) * dT;
    double d = 1.0 - dpsi * m_g * (1.0 + S->psi_r) + (S->psi_n + S->psi_r * (1.0 + S->psi_n));
    return d > 0.1 ? d : 0.1;
}

static int check_cooling(const gc_machine_cooling *c, double T_c, gc_error *err)
{
    if (!(c->blade_temperature_K > T_c))
        return gc_error_set(err, GC_ERR_INVALID, "/cooling/blade_temperature",
                            "the allowed blade temperature %.2f K must be above the coolant "
                            "(compressor delivery) temperature %.2f K",
                            c->blade_temperature_K, T_c);
    return GC_OK;
}

int gc__machine_cooling_split_from(const gc_machine_cooling *c, const gc_fuel *fuel,
                                   double T_fuel_K, const gc_gas *air, double T_coolant_K,
                                   double fuel_air_ratio, double eta_b, double T_rotor_inlet_K,
                                   double beta_guess, gc_machine_cooled *out, gc_error *err)
{
    split_ctx S;
    memset(&S, 0, sizeof S);
    S.c = c;
    S.fuel = fuel;
    S.T_fuel = T_fuel_K;
    S.air = air;
    S.T_c = T_coolant_K;
    S.far = fuel_air_ratio;
    S.eta_b = eta_b;
    S.T_rit = T_rotor_inlet_K;
    memset(out, 0, sizeof *out);
    int rc = GC_OK;
    double beta = 0.0, y0 = 0.0, y = 0.0;
    if (c->enabled) {
        rc = check_cooling(c, T_coolant_K, err);
        if (rc != GC_OK)
            return rc;
    } else {
        beta_guess = 0.0;
    }
    double x0 = c->enabled && beta_guess > 0.0 && beta_guess < BETA_MAX ? beta_guess : 0.0;
    rc = split_fn(&S, x0, &y0, err);
    if (rc != GC_OK)
        return rc;
    beta = x0;
    if (c->enabled && (x0 > 0.0 ? fabs(y0) > 1e-14 : y0 < 0.0)) {
        /* Newton's first step with the estimated slope, then secant and Brent */
        double x1 = fmin(fmax(x0 - y0 / split_slope(&S, x0), 0.0), BETA_MAX);
        rc = gc__machine_root(split_fn, &S, x0, y0, x1, 0.0, BETA_MAX, 1e-15, 1e-14, &beta, &y,
                              err);
        if (rc == GC_ERR_INFEASIBLE)
            return gc_error_set(err, GC_ERR_INFEASIBLE, "/cooling/blade_temperature",
                                "the rows would need more than %.0f %% of the compressor air "
                                "as coolant at a rotor inlet of %.1f K: raise the allowed "
                                "blade temperature or lower the row constants",
                                100.0 * BETA_MAX, T_rotor_inlet_K);
        if (rc != GC_OK)
            return gc_error_set(err, rc, "/cooling/blade_temperature",
                                "the coolant fraction did not converge");
        if (S.beta_last != beta && (rc = split_fn(&S, beta, &y, err)) != GC_OK)
            return rc; /* leave S at the answer */
    }
    out->coolant_fraction = beta;
    out->nozzle_psi = c->enabled ? S.psi_n : 0.0;
    out->rotor_psi = c->enabled ? S.psi_r : 0.0;
    out->combustor_exit_T_K = c->enabled ? S.burn.T_out_K : T_rotor_inlet_K;
    out->rotor_inlet_T_K = T_rotor_inlet_K;
    out->fuel_air_ratio = fuel_air_ratio;
    out->core_fuel_air_ratio = fuel_air_ratio / (1.0 - beta);
    out->nozzle_gas_R_J_per_kgK = S.burn.products.R_J_per_kgK;
    return GC_OK;
}

int gc_machine_cooling_split(const gc_machine_cooling *c, const gc_fuel *fuel,
                             double T_fuel_K, const gc_gas *air, double T_coolant_K,
                             double fuel_air_ratio, double eta_b, double T_rotor_inlet_K,
                             gc_machine_cooled *out, gc_error *err)
{
    return gc__machine_cooling_split_from(c, fuel, T_fuel_K, air, T_coolant_K, fuel_air_ratio,
                                          eta_b, T_rotor_inlet_K, 0.0, out, err);
}

typedef struct tit_ctx {
    const gc_machine_cooling *c;
    const gc_fuel *fuel;
    double T_fuel, T_c, eta_b, T_ce;
    const gc_gas *air;
    gc_machine_cooled out;
} tit_ctx;

/* combustor exit of the split at mixed temperature T_rit, minus the target */
static int tit_fn(void *ctx, double T_rit, double *y, gc_error *err)
{
    tit_ctx *X = ctx;
    double far = 0.0;
    int rc = gc_combustion_far_for_T(X->fuel, X->T_fuel, X->air, X->T_c, T_rit, X->eta_b, &far,
                                     err);
    if (rc != GC_OK)
        return rc;
    rc = gc_machine_cooling_split(X->c, X->fuel, X->T_fuel, X->air, X->T_c, far, X->eta_b,
                                  T_rit, &X->out, err);
    if (rc != GC_OK)
        return rc;
    *y = X->out.combustor_exit_T_K - X->T_ce;
    return GC_OK;
}

int gc_machine_cooling_from_tit(const gc_machine_cooling *c, const gc_fuel *fuel,
                                double T_fuel_K, const gc_gas *air, double T_coolant_K,
                                double eta_b, double T_combustor_exit_K,
                                gc_machine_cooled *out, gc_error *err)
{
    tit_ctx X;
    memset(&X, 0, sizeof X);
    X.c = c;
    X.fuel = fuel;
    X.T_fuel = T_fuel_K;
    X.T_c = T_coolant_K;
    X.eta_b = eta_b;
    X.T_ce = T_combustor_exit_K;
    X.air = air;
    double y0 = 0.0, T = T_combustor_exit_K, y = 0.0;
    int rc = tit_fn(&X, T_combustor_exit_K, &y0, err);
    if (rc != GC_OK)
        return rc;
    if (y0 > 0.0) {
        rc = gc__machine_root(tit_fn, &X, T_combustor_exit_K, y0, T_combustor_exit_K - y0,
                              T_coolant_K + 1.0, T_combustor_exit_K, 1e-10, 1e-9, &T, &y, err);
        if (rc != GC_OK)
            return gc_error_set(err, rc, "/cooling/blade_temperature",
                                "no mixed rotor-inlet temperature gives a combustor exit of "
                                "%.1f K with this cooling", T_combustor_exit_K);
        rc = tit_fn(&X, T, &y, err);
        if (rc != GC_OK)
            return rc;
    }
    *out = X.out;
    return GC_OK;
}
