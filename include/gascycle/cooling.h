/*
 * cooling.h — the cooled first turbine stage shared by the machine model
 * (machine.h) and the Brayton preset (brayton.h): cooling air bled at
 * compressor delivery for the first nozzle row and the first rotor row, each
 * row's coolant per kg of gas from the convective blade-cooling model of
 * Holland & Thake (1980) in the form given by Horlock, "Advanced Gas Turbine
 * Cycles" (2003), eq. 5.8:
 *     psi = m_coolant / m_gas = K (T_g - T_b) / (T_b - T_c),  psi = 0 if T_g <= T_b,
 * K the row's constant (cooling efficiency folded in), T_g the gas
 * temperature entering the row (nozzle: the combustor exit; rotor: the mixed
 * rotor inlet), T_b the allowed blade metal temperature, T_c the coolant
 * (compressor delivery) temperature. All coolant is mixed back before the
 * first rotor at the turbine inlet pressure (single-step cooling, the same
 * book ch. 4): a chain that burns all the compressor air to the mixed
 * rotor-inlet temperature has the same fuel flow, turbine gas and work as
 * core products at the combustor exit mixed with the coolant (complete
 * combustion, energy balance). So the combustor-exit (turbine inlet)
 * temperature and the rotor-inlet (firing) temperature are distinct, and
 * both are reported by every caller. Simplifications stated: the rotor row's
 * coolant is expanded through the whole turbine (optimistic for its lost
 * work); mixing is at constant pressure, its pressure loss not modelled.
 * (The implementation is service/core/machine_cool.c.)
 *
 * Units: SI (K, kg/kg).
 */
#ifndef GASCYCLE_COOLING_H
#define GASCYCLE_COOLING_H

#include "gascycle/combustion.h"
#include "gascycle/error.h"
#include "gascycle/gas.h"

#define GC_MACHINE_DEFAULT_BLADE_T_K 1123.15  /* 850 degC allowed metal temperature of cooled
                                                 first-stage blading (from memory, an
                                                 illustrative figure: give the machine's own) */
#define GC_MACHINE_DEFAULT_COOLING_K 0.05     /* Holland & Thake constant per row (from memory,
                                                 illustrative: give the machine's own) */
#define GC_MACHINE_COOLING_MIN_BLADE_T_K 900.0  /* accepted blade temperatures, K */
#define GC_MACHINE_COOLING_MAX_BLADE_T_K 1500.0
#define GC_MACHINE_COOLING_MAX_K 0.5            /* largest accepted row constant, - */

/* Cooled turbine (optional). Pointers "/cooling/...". */
typedef struct gc_machine_cooling {
    int enabled;                  /* 1: cooled first nozzle and rotor rows; default 0 */
    double blade_temperature_K;   /* allowed metal temperature T_b, K, [900, 1500],
                                     default GC_MACHINE_DEFAULT_BLADE_T_K */
    double nozzle_constant;       /* K of the first nozzle row, [0, 0.5],
                                     default GC_MACHINE_DEFAULT_COOLING_K */
    double rotor_constant;        /* K of the first rotor row, [0, 0.5], default as above;
                                     0 = uncooled rotor */
} gc_machine_cooling;

/* The split of one cooled operating point. */
typedef struct gc_machine_cooled {
    double coolant_fraction;      /* total coolant / compressor air, - */
    double nozzle_psi;            /* nozzle coolant / nozzle gas, - */
    double rotor_psi;             /* rotor coolant / rotor gas, - */
    double combustor_exit_T_K;    /* K */
    double rotor_inlet_T_K;       /* mixed, K */
    double fuel_air_ratio;        /* fuel / all compressor air, - */
    double core_fuel_air_ratio;   /* fuel / combustor air, - */
    double nozzle_gas_R_J_per_kgK; /* gas constant of the combustor-exit gas */
} gc_machine_cooled;

/* Cooling split for a mixed rotor-inlet temperature: all compressor air
 * (air, at the coolant temperature T_coolant_K) burnt with fuel_air_ratio
 * to T_rotor_inlet_K is split into core air, burnt to the combustor-exit
 * temperature, and coolant per the Holland & Thake rows of c. Errors:
 * GC_ERR_INVALID when T_b <= T_coolant ("/cooling/blade_temperature"),
 * GC_ERR_INFEASIBLE when no coolant fraction up to 0.5 satisfies the rows. */
int gc_machine_cooling_split(const gc_machine_cooling *c, const gc_fuel *fuel,
                             double T_fuel_K, const gc_gas *air, double T_coolant_K,
                             double fuel_air_ratio, double eta_b, double T_rotor_inlet_K,
                             gc_machine_cooled *out, gc_error *err);

/* The same from the combustor-exit temperature: finds the mixed rotor-inlet
 * temperature and the fuel-air ratio (e.g. for a Brayton chain that is given
 * the combustor exit). */
int gc_machine_cooling_from_tit(const gc_machine_cooling *c, const gc_fuel *fuel,
                                double T_fuel_K, const gc_gas *air, double T_coolant_K,
                                double eta_b, double T_combustor_exit_K,
                                gc_machine_cooled *out, gc_error *err);

#endif
