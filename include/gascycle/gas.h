/*
 * gas.h — one interface over every working-fluid model, so a cycle does not
 * care which it has.
 *
 * Models (all ideal gases):
 *   cold      constant cp and k (cold-air standard; defaults cp = 1005 J/(kg K),
 *             k = 1.4). h = cp T, u = cv T, s°(T) = cp ln(T / 298.15 K).
 *   air       dry air, a fixed mixture of N2, O2, Ar, CO2 (composition named in
 *             gas.c), properties from the NASA 9-coefficient polynomials.
 *   humid air dry air plus H2O at a humidity ratio.
 *   mixture   any species mixture by mole fraction (combustion products are
 *             built as a mixture by combustion.h).
 * For mixtures the species coefficients are pre-combined, mass-weighted, into
 * one set per temperature interval when the gas is initialised, so a property
 * call costs one polynomial, not one per species.
 *
 * Units: SI base units throughout: T in K, P in Pa, h and u in J/kg (absolute,
 * including the enthalpy of formation, NASA/JANAF convention), s in J/(kg K)
 * with the standard pressure GC_P_STD_PA = 1e5 Pa, v in m3/kg, M in kg/mol.
 *
 * Fast calls (cp, h, u, s0 ...) do not check their argument: the caller checks
 * T once with gc_gas_check_T (or uses a solver, which checks). Everything that
 * can fail returns a gc_status and fills an optional gc_error.
 *
 * A gc_gas is a plain value: no heap, copy it with `=`, no destroy call.
 */
#ifndef GASCYCLE_GAS_H
#define GASCYCLE_GAS_H

#include "gascycle/error.h"

#define GC_R_UNIVERSAL 8.314462618     /* J/(mol K), CODATA 2018 (exact) */
#define GC_P_STD_PA 1.0e5              /* standard-state pressure, Pa */
#define GC_T_REF_K 298.15              /* thermochemical reference temperature, K */
#define GC_GAS_MAX_SPECIES 20          /* species in one mixture */
#define GC_GAS_MAX_INTERVALS 6         /* temperature sub-intervals of a mixture */
#define GC_GAS_LABEL_LEN 32

typedef enum gc_gas_kind {
    GC_GAS_COLD = 0,     /* constant cp and k */
    GC_GAS_MIXTURE = 1   /* NASA-9 ideal-gas mixture (air, humid air, products, custom) */
} gc_gas_kind;

typedef struct gc_gas {
    gc_gas_kind kind;
    char label[GC_GAS_LABEL_LEN];  /* "cold", "air", "humid air", "products", "mixture" */
    double M_kg_per_mol;           /* molar mass, kg/mol */
    double R_J_per_kgK;            /* specific gas constant, J/(kg K) */
    double T_min_K, T_max_K;       /* validity range of the data, K */

    /* cold model */
    double cp_cold_J_per_kgK;      /* constant cp, J/(kg K) */
    double k_cold;                 /* constant cp/cv, - */

    /* mixture model: species and fractions */
    int n_species;
    int species[GC_GAS_MAX_SPECIES];      /* gc_species ids (species.h) */
    double x[GC_GAS_MAX_SPECIES];         /* mole fractions, sum 1 */
    double y[GC_GAS_MAX_SPECIES];         /* mass fractions, sum 1 */
    double s_mix_J_per_kgK;               /* ideal mixing entropy, -R sum x ln x, J/(kg K) */

    /* pre-combined, mass-weighted NASA-9 coefficients: interval i covers
     * [T_break_K[i], T_break_K[i+1]]; a[i][0..6] = a1..a7 and a[i][7..8] = b1, b2,
     * each multiplied by the species' R/M, so cp comes out in J/(kg K). */
    int n_intervals;
    double T_break_K[GC_GAS_MAX_INTERVALS + 1];
    double a[GC_GAS_MAX_INTERVALS][9];
} gc_gas;

/* ---- construction ---------------------------------------------------- */

/* Cold-air-standard model with constant cp (J/(kg K)) and k. Bounds:
 * 100 <= cp <= 20000 J/(kg K), 1 < k <= 1.7. Validity range 1..20000 K. */
int gc_gas_init_cold(gc_gas *g, double cp_J_per_kgK, double k, gc_error *err);

/* Dry air (standard composition, see gas.c). Never fails. */
void gc_gas_init_air(gc_gas *g);

/* Dry air plus water vapour at humidity ratio w (kg H2O per kg dry air),
 * 0 <= w <= 0.5. */
int gc_gas_init_humid_air(gc_gas *g, double w_kg_per_kg, gc_error *err);

/* Any mixture of n species (gc_species ids) by mole fraction. Fractions must
 * be >= 0 and sum to 1 within 1e-6 (then they are renormalised). */
int gc_gas_init_mixture(gc_gas *g, int n, const int *species_ids,
                        const double *mole_fractions, gc_error *err);

/* ---- validity -------------------------------------------------------- */

/* GC_OK when T_min_K <= T <= T_max_K and T is finite, else GC_ERR_RANGE with a
 * message naming the range; field is copied into err->field. */
int gc_gas_check_T(const gc_gas *g, double T_K, const char *field, gc_error *err);

/* GC_OK when 0 < P (finite), else GC_ERR_INVALID. */
int gc_gas_check_P(double P_Pa, const char *field, gc_error *err);

/* ---- properties at T (unchecked: T must be inside the validity range) ---- */

double gc_gas_cp_T(const gc_gas *g, double T_K);   /* J/(kg K) */
double gc_gas_cv_T(const gc_gas *g, double T_K);   /* J/(kg K) */
double gc_gas_k_T(const gc_gas *g, double T_K);    /* cp/cv, - */
double gc_gas_h_T(const gc_gas *g, double T_K);    /* J/kg, absolute */
double gc_gas_u_T(const gc_gas *g, double T_K);    /* J/kg, h - R T */
double gc_gas_s0_T(const gc_gas *g, double T_K);   /* J/(kg K), at GC_P_STD_PA, incl. mixing */
double gc_gas_s_TP(const gc_gas *g, double T_K, double P_Pa); /* s0 - R ln(P/P_std) */
double gc_gas_v_TP(const gc_gas *g, double T_K, double P_Pa); /* R T / P, m3/kg */

/* Relative pressure pr = exp((s0(T) - s0(T_ref)) / R) and relative volume
 * vr = (T / T_ref) / pr, both 1 at T_ref = 298.15 K, so that along an
 * isentrope P2/P1 = pr2/pr1 and v2/v1 = vr2/vr1. (Table values such as the
 * Keenan-Kaye air tables use another normalisation: compare ratios.) */
double gc_gas_pr_T(const gc_gas *g, double T_K);
double gc_gas_vr_T(const gc_gas *g, double T_K);

/* ---- inverse solves (checked; bracketed Halley/Newton, GC_ERR_NOCONV if not met) --
 * Tolerance: |T - T_true| below 1e-9 K relative. A result outside the
 * validity range is GC_ERR_RANGE. */

int gc_gas_T_from_h(const gc_gas *g, double h_J_per_kg, double *T_K, gc_error *err);
int gc_gas_T_from_u(const gc_gas *g, double u_J_per_kg, double *T_K, gc_error *err);
int gc_gas_T_from_s0(const gc_gas *g, double s0_J_per_kgK, double *T_K, gc_error *err);

/* The same as gc_gas_T_from_h / _u, started from T_guess_K (a temperature
 * near the answer, e.g. from a cold-air estimate; any other value, 0
 * included, means no guess). Same tolerance, same errors; a good guess saves
 * iterations. */
int gc_gas_T_from_h_guess(const gc_gas *g, double h_J_per_kg, double T_guess_K,
                          double *T_K, gc_error *err);
int gc_gas_T_from_u_guess(const gc_gas *g, double u_J_per_kg, double T_guess_K,
                          double *T_K, gc_error *err);

/* End temperature of an isentropic step from T1 for a pressure ratio
 * P2/P1 (> 0) or a volume ratio v2/v1 (> 0). */
int gc_gas_T_isentropic_P(const gc_gas *g, double T1_K, double P2_over_P1,
                          double *T2_K, gc_error *err);
int gc_gas_T_isentropic_v(const gc_gas *g, double T1_K, double v2_over_v1,
                          double *T2_K, gc_error *err);

/* End temperature of a polytropic step P v^n = const from T1 for a pressure
 * ratio P2/P1: T2 = T1 (P2/P1)^((n-1)/n) (exact for an ideal gas, any model). */
int gc_gas_T_polytropic_P(const gc_gas *g, double T1_K, double P2_over_P1,
                          double n, double *T2_K, gc_error *err);

/* Adiabatic mixing of two streams of the same gas model at one pressure:
 * the temperature with m_a h(Ta) + m_b h(Tb) = (m_a + m_b) h(T). Streams of
 * different compositions are mixed by combustion.h / gc_gas_mix. */
int gc_gas_mix_T(const gc_gas *g, double m_a_kg, double Ta_K,
                 double m_b_kg, double Tb_K, double *T_K, gc_error *err);

/* Mixture of two gases by mass (m_a of gas a, m_b of gas b): fills *out with
 * the combined composition (both must be mixtures). */
int gc_gas_mix(const gc_gas *a, double m_a_kg, const gc_gas *b, double m_b_kg,
               gc_gas *out, gc_error *err);

#endif
