/*
 * validity.h — how far a gas state lies from the assumptions of the models,
 * one rule each for every route (properties, cycle presets, custom chains,
 * measured reductions), so the same state gets the same word everywhere.
 *
 * 1. Real gas. Every gas model of gas.h is an ideal gas. The departure of
 *    a state from it is estimated from the virial expansion of the dry-air
 *    equation of state of E. W. Lemmon, R. T Jacobsen, S. G. Penoncello,
 *    D. G. Friend, "Thermodynamic properties of air and mixtures of
 *    nitrogen, argon, and oxygen from 60 to 2000 K at pressures to
 *    2000 MPa", J. Phys. Chem. Ref. Data 29 (2000) 331: its residual
 *    Helmholtz energy alpha_r(tau, delta) = sum N_k delta^d_k tau^t_k
 *    [exp(-delta^l_k)], expanded at low density, gives the second and third
 *    virial coefficients exactly,
 *       B(tau) rho_j = sum over d_k = 1 of N_k tau^t_k,
 *       C(tau) rho_j^2 = 2 (sum over d_k = 2, no exponential, of N_k tau^t_k
 *                        - sum over d_k = 1, l_k = 1 of N_k tau^t_k),
 *    (tau = T_j / T, delta = rho / rho_j, T_j = 132.6312 K,
 *    rho_j = 10.4477 mol/dm3, R = 8.31451 J/(mol K) of that equation). The
 *    truncated expansion alpha_r = B rho + C rho^2 / 2 then gives, by the
 *    standard relations of a Helmholtz-energy equation of state:
 *       Z = P / (rho R T) = 1 + delta alpha_r_delta
 *       cp - cp0 = R [-tau^2 alpha_r_tautau + (1 + delta alpha_r_delta
 *                  - delta tau alpha_r_deltatau)^2 / (1 + 2 delta alpha_r_delta
 *                  + delta^2 alpha_r_deltadelta) - 1]
 *    with the molar density rho solved from P = rho R T Z. Reported as what
 *    the ideal-gas values are off by: v_ideal / v - 1 = 1/Z - 1 and
 *    cp0 / cp - 1 (cp0 the gas model's own ideal-gas cp). Checked against
 *    the full equation (python3-iapws) in tests/unit/test_validity.c with
 *    the table tests/reference/air_real_lemmon2000_iapws.csv (200..2000 K,
 *    0.1..30 MPa): where the departure is at most 5 % the estimate is within
 *    0.07 percentage points of it; beyond, the larger of the two departures
 *    is within 10 % of the equation's (at 210 K and 9 MPa: v 14.5 % for
 *    16.5 %, cp 30.9 % for 31.8 %), a little low at high density.
 *    Applies to air-like gases: the cold (air-standard) model and mixtures
 *    with at least GC_VALIDITY_AIR_LIKE mole fraction of N2 + O2 + Ar (dry and
 *    humid air, lean combustion products); for other mixtures no estimate is
 *    made (gc_real_gas.estimated = 0, applicable = 0). The equation covers
 *    60 to 2000 K; above 2000 K the coefficients are used as they extrapolate
 *    (B and C change slowly there and the departures are small).
 *    A state is flagged when either departure reaches
 *    GC_VALIDITY_REAL_GAS_LIMIT (1 %).
 *
 * 2. Dissociation. Models with complete combustion or fixed composition hold
 *    CO2 and H2O whole. The rule: the equilibrium degree of dissociation
 *    alpha of pure CO2 (CO2 = CO + 1/2 O2) at the state's T and P, from
 *    K_p(T) = exp(-(g_CO + g_O2 / 2 - g_CO2) / (R T)) with the NASA-9 Gibbs
 *    energies of species.h (McBride, Zehe & Gordon 2002) and
 *    K_p = alpha / (1 - alpha) sqrt(alpha / (2 + alpha)) sqrt(P / 1 bar).
 *    Flagged from GC_VALIDITY_DISSOCIATION_LIMIT (1 %): about 1930 K at
 *    1 bar, 2070 K at 10 bar, 2230 K at 100 bar (checked against the
 *    NIST-JANAF equilibrium constants in tests/unit/test_validity.c). CO2 dissociates more
 *    readily than H2O at these conditions and pure CO2 more than CO2 among
 *    products with excess oxygen, so the rule errs towards warning; it is a
 *    warning threshold, not a correction.
 *
 * Units: SI (K, Pa); departures and degrees are fractions (0.01 = 1 %).
 */
#ifndef GASCYCLE_VALIDITY_H
#define GASCYCLE_VALIDITY_H

#include "gascycle/cycle.h"
#include "gascycle/gas.h"

#define GC_VALIDITY_REAL_GAS_LIMIT 0.01      /* departure that is flagged, - */
#define GC_VALIDITY_DISSOCIATION_LIMIT 0.01  /* CO2 dissociation that is flagged, - */
#define GC_VALIDITY_AIR_LIKE 0.8             /* N2 + O2 + Ar mole fraction of an air-like gas */
#define GC_VALIDITY_MESSAGE_LEN 512      /* room for any label; the texts stay near 200 */

/* Real-gas estimate of one state. */
typedef struct gc_real_gas {
    int applicable;             /* 1: the gas is air-like (the estimate applies) */
    int estimated;              /* 1: the virial estimate has a gas-like density root;
                                   0: not applicable, or the state is too dense for it
                                   (then it is far from an ideal gas) */
    double Z;                   /* compressibility factor P / (rho R T), - */
    double v_departure;         /* ideal-gas v over the real v, minus 1, - */
    double cp_departure;        /* ideal-gas cp over the real cp, minus 1, - */
    double departure;           /* max(|v_departure|, |cp_departure|), - (1 when the state
                                   is too dense for the estimate, 0 when not applicable) */
} gc_real_gas;

/* 1 when the gas is air-like (see the top of this file). */
int gc_validity_air_like(const gc_gas *g);

/* Estimate for the state (T, P) of gas g. T and P must be positive and
 * finite (else e is zeroed, not applicable). */
void gc_validity_real_gas(const gc_gas *g, double T_K, double P_Pa, gc_real_gas *e);

/* Virial coefficients of the Lemmon et al. (2000) air equation at T:
 * B in m3/mol and C in m6/mol2 (each may be NULL). */
void gc_validity_air_virial(double T_K, double *B_m3_per_mol, double *C_m6_per_mol2);

/* Equilibrium degree of dissociation of pure CO2 at (T, P), 0..1 (0 below
 * 1000 K, where it is below 1e-8). */
double gc_validity_co2_dissociation(double T_K, double P_Pa);

/* ---- scanning states ------------------------------------------------------
 * A scan visits states and keeps, per rule, the worst one and the count of
 * states beyond the limit; gc_validity_scan_notes writes one note per rule
 * that fired (code "real_gas", "real_gas_not_estimated" or
 * "dissociation", and one sentence naming the worst state with its figures).
 */
typedef struct gc_validity_worst {
    int count;                  /* states beyond the limit */
    char label[48];             /* the worst state's label */
    double T_K, P_Pa;           /* its temperature and pressure */
    double value;               /* its departure / degree of dissociation, - */
    gc_real_gas rg;             /* real gas: its estimate */
} gc_validity_worst;

typedef struct gc_validity_scan {
    gc_validity_worst real_gas;       /* worst real-gas departure */
    gc_validity_worst not_estimated;  /* highest pressure of a gas without an estimate, above
                                         GC_VALIDITY_UNKNOWN_GAS_P_PA */
    gc_validity_worst dissociation;   /* worst CO2 dissociation */
} gc_validity_scan;

/* Pressure from which a gas that is not air-like is mentioned (no estimate), Pa. */
#define GC_VALIDITY_UNKNOWN_GAS_P_PA 1.0e6

typedef struct gc_validity_note {
    char code[32];                          /* "real_gas", "real_gas_not_estimated",
                                               "dissociation" */
    char message[GC_VALIDITY_MESSAGE_LEN];  /* one sentence */
} gc_validity_note;

void gc_validity_scan_init(gc_validity_scan *s);

/* Visits one state of gas g; label names it in a note ("state 3",
 * "turbine inlet", ...). */
void gc_validity_scan_state(gc_validity_scan *s, const gc_gas *g, double T_K, double P_Pa,
                            const char *label);

/* Visits every state of a cycle run: the start and each process end except
 * the closing state (the start again), labelled "<prefix>state <i + 1>" in
 * the API's numbering (cycle_out.h). prefix may be NULL. */
void gc_validity_scan_run(gc_validity_scan *s, const gc_cycle_run *run, const char *prefix);

/* Writes up to max notes (one per rule that fired); returns how many. */
int gc_validity_scan_notes(const gc_validity_scan *s, gc_validity_note *notes, int max);

#endif
