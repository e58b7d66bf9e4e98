/*
 * machine_inlet.c — inlet air treatment of machine.h between the ambient and
 * the compressor: evaporative cooler, fogging to saturation, chiller, and
 * the added pressure loss.
 *
 * Psychrometrics: ASHRAE Handbook-Fundamentals (2017) ch. 1, SI, with the
 * saturation pressure and humidity ratio of humid.h (Hyland & Wexler, eqs.
 * 5, 6, 20):
 *   thermodynamic wet bulb t* (degC) of air at t, W, P: the root of
 *     W = [(2501 - 2.326 t*) Ws* - 1.006 (t - t*)] / (2501 + 1.86 t - 4.186 t*)   (eq. 33,
 *         t* >= 0 degC)
 *     W = [(2830 - 0.24 t*) Ws* - 1.006 (t - t*)] / (2830 + 1.86 t - 2.1 t*)      (eq. 35,
 *         t* < 0 degC)
 *   with Ws* = 0.621945 p_ws(t*) / (P - p_ws(t*)); Brent's method between the
 *   dew point and t, to 1e-10 K;
 *   moist-air enthalpy h = 1.006 t + W (2501 + 1.86 t) kJ/kg dry air (eq. 30);
 *   liquid water h_w = 4.186 t kJ/kg (the saturated-liquid term of eq. 33).
 * Evaporative cooler: adiabatic along the constant-wet-bulb line,
 *   T_out = T - eps (T - T_wb), W_out from eq. 33 at (T_out, T_wb); fogging
 *   is eps = 1 (saturated at the wet bulb). Off (with a warning) when the
 *   wet bulb is at or below 0 degC or the air is already saturated.
 * Chiller: cools to the set point at constant W, or, below the dew point, to
 *   saturation at the set point with the condensate leaving at the set point;
 *   duty = h_in - h_out - (W_in - W_out) h_w(T_set) per kg dry air, electric
 *   power = duty / COP, drawn from the output. Off (warning) when the ambient
 *   is at or below the set point.
 * The treatment works at the ambient pressure; its own pressure loss adds to
 * the design's inlet loss: L = 1 - (1 - L_design)(1 - L_added).
 *
 * Units: SI (K, Pa, J/kg); W in kg water per kg dry air.
 */
#include "core/machine_internal.h"
#include "gascycle/humid.h"

#include <math.h>
#include <string.h>

#define T0_K 273.15             /* 0 degC, K */
#define ICING_T_LO_K 268.15     /* inlet icing risk band and humidity (common practice: */
#define ICING_T_HI_K 280.15     /* anti-icing is used from about -5 to +7 degC in humid air) */
#define ICING_RH 0.70

static int W_sat(double T_K, double P_Pa, double *W, gc_error *err)
{
    double pws = 0.0;
    int rc = gc_humid_pws_T(T_K, &pws, err);
    if (rc != GC_OK)
        return rc;
    if (!(pws < P_Pa))
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/site/temperature",
                            "water boils at %.2f K and %.0f Pa", T_K, P_Pa);
    *W = GC_HUMID_EPS * pws / (P_Pa - pws);
    return GC_OK;
}

int gc_machine_W_from_wet_bulb(double T_K, double T_wb_K, double P_Pa, double *W,
                               gc_error *err)
{
    if (!(T_wb_K <= T_K))
        return gc_error_set(err, GC_ERR_INVALID, "/site/temperature",
                            "the wet bulb %.3f K is above the dry bulb %.3f K", T_wb_K, T_K);
    double Ws = 0.0;
    int rc = W_sat(T_wb_K, P_Pa, &Ws, err);
    if (rc != GC_OK)
        return rc;
    double t = T_K - T0_K, ts = T_wb_K - T0_K;
    if (ts >= 0.0)
        *W = ((2501.0 - 2.326 * ts) * Ws - 1.006 * (t - ts)) / (2501.0 + 1.86 * t - 4.186 * ts);
    else
        *W = ((2830.0 - 0.24 * ts) * Ws - 1.006 * (t - ts)) / (2830.0 + 1.86 * t - 2.1 * ts);
    return GC_OK;
}

typedef struct wb_ctx {
    double T, W, P;
} wb_ctx;

static int wb_fn(void *ctx, double Ts, double *y, gc_error *err)
{
    const wb_ctx *C = ctx;
    double W = 0.0;
    int rc = gc_machine_W_from_wet_bulb(C->T, Ts, C->P, &W, err);
    *y = W - C->W;
    return rc;
}

int gc_machine_wet_bulb(double T_K, double W, double P_Pa, double *T_wb_K, gc_error *err)
{
    int rc = gc_humid_check_T(T_K, "/site/temperature", err);
    if (rc != GC_OK)
        return rc;
    if (!isfinite(W) || W < 0.0 || !(P_Pa > 0.0))
        return gc_error_set(err, GC_ERR_INVALID, "/site/relative_humidity",
                            "needs W >= 0 and P > 0");
    wb_ctx C = { T_K, W, P_Pa };
    double y_hi = 0.0, lo = GC_HUMID_T_MIN_K;
    rc = wb_fn(&C, T_K, &y_hi, err);
    if (rc != GC_OK)
        return rc;
    if (y_hi < 0.0)
        return gc_error_set(err, GC_ERR_INFEASIBLE, "/site/relative_humidity",
                            "the air holds more water than saturation at %.2f K", T_K);
    if (W > 0.0) {
        double pv = 0.0, Td = 0.0;
        if (gc_humid_pv_from_W(W, P_Pa, &pv, NULL) == GC_OK &&
            gc_humid_T_dew_from_pv(pv, &Td, NULL) == GC_OK && Td > lo && Td <= T_K)
            lo = Td;
    }
    double x = T_K, y = y_hi;
    rc = gc__machine_root(wb_fn, &C, T_K, y_hi, lo, lo, T_K, 1e-10, 0.0, &x, &y, err);
    if (rc == GC_ERR_INFEASIBLE && lo > GC_HUMID_T_MIN_K) {
        /* rounding at the dew point itself: the root is there */
        x = lo;
        rc = GC_OK;
    }
    if (rc != GC_OK)
        return gc_error_set(err, rc == GC_ERR_INFEASIBLE ? GC_ERR_RANGE : rc, "/site/temperature",
                            "the wet bulb of %.2f K air could not be found", T_K);
    *T_wb_K = x;
    return GC_OK;
}

/* ASHRAE eq. 30, J/kg dry air */
static double h_moist(double T_K, double W)
{
    double t = T_K - T0_K;
    return 1e3 * (1.006 * t + W * (2501.0 + 1.86 * t));
}

int gc__machine_inlet_check(const gc_machine_inlet *in, gc_error *err)
{
    if (in->kind < GC_MACHINE_INLET_NONE || in->kind > GC_MACHINE_INLET_CHILLER)
        return gc_error_set(err, GC_ERR_INVALID, "/inlet/kind",
                            "must be none, evaporative_cooler, fogging or chiller");
    if (!isfinite(in->added_pressure_loss) || in->added_pressure_loss < 0.0 ||
        in->added_pressure_loss > 0.1)
        return gc_error_set(err, GC_ERR_INVALID, "/inlet/added_pressure_loss",
                            "must be from 0 to 0.1");
    if (in->kind == GC_MACHINE_INLET_EVAPORATIVE &&
        (!isfinite(in->evaporative_effectiveness) || !(in->evaporative_effectiveness > 0.0) ||
         in->evaporative_effectiveness > 1.0))
        return gc_error_set(err, GC_ERR_INVALID, "/inlet/evaporative_effectiveness",
                            "must be above 0 up to 1");
    if (in->kind == GC_MACHINE_INLET_CHILLER) {
        if (!isfinite(in->chiller_temperature_K) || in->chiller_temperature_K < 274.15 ||
            in->chiller_temperature_K > 330.0)
            return gc_error_set(err, GC_ERR_INVALID, "/inlet/chiller_temperature",
                                "must be from 274.15 K to 330 K");
        if (!isfinite(in->chiller_cop) || in->chiller_cop < 0.5 || in->chiller_cop > 20.0)
            return gc_error_set(err, GC_ERR_INVALID, "/inlet/chiller_cop",
                                "must be from 0.5 to 20");
    }
    return GC_OK;
}

static int evaporate(const gc_machine_inlet *in, gc_machine_inlet_state *st,
                     gc_machine_warning *w, int *nw, gc_error *err)
{
    double eps = in->kind == GC_MACHINE_INLET_FOGGING ? 1.0 : in->evaporative_effectiveness;
    const char *what = in->kind == GC_MACHINE_INLET_FOGGING ? "fogging" : "evaporative cooler";
    if (!(st->wet_bulb_T_K > T0_K)) {
        gc__machine_warn(w, nw, GC_MACHINE_W_TREATMENT_IDLE, "/inlet/kind",
                         "the ambient wet bulb %.2f K is at or below freezing: the %s is taken "
                         "as off", st->wet_bulb_T_K, what);
        return GC_OK;
    }
    if (!(st->ambient_T_K - st->wet_bulb_T_K > 1e-9)) {
        gc__machine_warn(w, nw, GC_MACHINE_W_TREATMENT_IDLE, "/inlet/kind",
                         "the ambient air is saturated: the %s cannot cool it", what);
        return GC_OK;
    }
    /* eps = 1 is exactly the wet bulb (T - (T - T_wb) may round above it) */
    st->T_K = eps == 1.0 ? st->wet_bulb_T_K
                         : st->ambient_T_K - eps * (st->ambient_T_K - st->wet_bulb_T_K);
    int rc = gc_machine_W_from_wet_bulb(st->T_K, st->wet_bulb_T_K, st->ambient_P_Pa, &st->W,
                                        err);
    if (rc != GC_OK)
        return rc;
    st->water_added_kg_per_s = st->W - st->ambient_W;
    st->active = 1;
    return GC_OK;
}

static int chill(const gc_machine_inlet *in, gc_machine_inlet_state *st, gc_machine_warning *w,
                 int *nw, gc_error *err)
{
    const double Ts = in->chiller_temperature_K;
    if (!(st->ambient_T_K > Ts)) {
        gc__machine_warn(w, nw, GC_MACHINE_W_TREATMENT_IDLE, "/inlet/chiller_temperature",
                         "the ambient %.2f K is at or below the set point %.2f K: the chiller "
                         "is off", st->ambient_T_K, Ts);
        return GC_OK;
    }
    double Ws = 0.0;
    int rc = W_sat(Ts, st->ambient_P_Pa, &Ws, err);
    if (rc != GC_OK)
        return gc_error_set(err, rc, "/inlet/chiller_temperature",
                            "no saturation state at the set point %.2f K", Ts);
    st->T_K = Ts;
    st->W = fmin(st->ambient_W, Ws);
    if (Ws < st->ambient_W) {
        st->condensate_kg_per_s = st->ambient_W - Ws;
        gc__machine_warn(w, nw, GC_MACHINE_W_CHILLER_CONDENSING, "/inlet/chiller_temperature",
                         "the set point %.2f K is below the ambient dew point: the coil "
                         "condenses %.2f g of water per kg of dry air", Ts,
                         1e3 * st->condensate_kg_per_s);
    }
    double hw = 1e3 * 4.186 * (Ts - T0_K);
    st->chiller_duty_W = h_moist(st->ambient_T_K, st->ambient_W) - h_moist(Ts, st->W) -
                         st->condensate_kg_per_s * hw;
    st->chiller_power_W = st->chiller_duty_W / in->chiller_cop;
    st->active = 1;
    return GC_OK;
}

static int leaving_RH(gc_machine_inlet_state *st, gc_error *err)
{
    double pv = 0.0, pws = 0.0;
    int rc = gc_humid_pv_from_W(st->W, st->ambient_P_Pa, &pv, err);
    if (rc == GC_OK)
        rc = gc_humid_pws_T(st->T_K, &pws, err);
    if (rc != GC_OK)
        return rc;
    st->RH = pv / pws;
    if (st->RH > 1.0 && st->RH < 1.0 + 1e-9)
        st->RH = 1.0; /* saturated, up to rounding */
    if (st->RH > 1.0)
        return gc_error_set(err, GC_ERR_CHECK, "/inlet/kind",
                            "the treated air came out supersaturated (RH %.6f)", st->RH);
    return GC_OK;
}

int gc__machine_inlet_apply(const gc_machine_inlet *in, const gc_site *amb,
                            double design_inlet_loss, gc_machine_inlet_state *st,
                            gc_machine_warning *w, int *nw, gc_error *err)
{
    int rc = gc__machine_inlet_check(in, err);
    if (rc != GC_OK)
        return rc;
    memset(st, 0, sizeof *st);
    st->ambient_T_K = amb->T_K;
    st->ambient_P_Pa = amb->P_Pa;
    st->ambient_RH = amb->RH;
    st->ambient_W = amb->W_kg_per_kg;
    st->T_K = amb->T_K;
    st->W = amb->W_kg_per_kg;
    st->RH = amb->RH;
    st->inlet_pressure_loss = 1.0 - (1.0 - design_inlet_loss) * (1.0 - in->added_pressure_loss);
    if (gc_machine_wet_bulb(amb->T_K, amb->W_kg_per_kg, amb->P_Pa, &st->wet_bulb_T_K, NULL) !=
        GC_OK)
        st->wet_bulb_T_K = 0.0; /* not needed unless a cooler runs (checked there) */
    if (in->kind == GC_MACHINE_INLET_EVAPORATIVE || in->kind == GC_MACHINE_INLET_FOGGING)
        rc = evaporate(in, st, w, nw, err);
    else if (in->kind == GC_MACHINE_INLET_CHILLER)
        rc = chill(in, st, w, nw, err);
    if (rc == GC_OK && st->active)
        rc = leaving_RH(st, err);
    if (rc != GC_OK)
        return rc;
    if (st->T_K >= ICING_T_LO_K && st->T_K <= ICING_T_HI_K && st->RH >= ICING_RH)
        gc__machine_warn(w, nw, GC_MACHINE_W_ICING, st->active ? "/inlet/kind" : "/site/temperature",
                         "compressor inlet air at %.1f K and %.0f %% relative humidity: inlet "
                         "icing is possible (anti-icing is not modelled)", st->T_K,
                         100.0 * st->RH);
    return GC_OK;
}

void gc__machine_inlet_scale(gc_machine_inlet_state *st, double m_air_kg_per_s)
{
    double m_da = m_air_kg_per_s / (1.0 + st->W);
    st->water_added_kg_per_s *= m_da;
    st->condensate_kg_per_s *= m_da;
    st->chiller_duty_W *= m_da;
    st->chiller_power_W *= m_da;
}
