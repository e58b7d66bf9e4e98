#!/usr/bin/python3
"""calc_atkinson_nasa9.py - an independent calculation of the Atkinson case of
issue 10 (the check behind tests/unit/test_piston.c, test_atkinson_efficiency):

  compression_ratio 8.1, expansion_ratio 12.7, intake 296.2 K and 99.1 kPa,
  compression_efficiency 0.92, expansion_efficiency 0.90, dry air.

Properties: dry air (N2 0.78084, O2 0.209476, Ar 0.00934, CO2 0.000314 by
mole, renormalised; U.S. Standard Atmosphere 1976) from the NASA-9
polynomials of data/nasa9/nasa9.csv (McBride, Zehe & Gordon 2002), summed
species by species here, with scipy's brentq for every inverse. Closed frame,
per kg: compression over 8.1 with its efficiency on the isentrope to the same
end volume; constant-volume heat to T3; expansion to the intake pressure with
its efficiency on the isentrope to the same end pressure, ending at exactly
12.7 times the compression-end volume (T3 solved for that); constant-pressure
heat rejection. Also the ideal counterpart (efficiencies 1, the same two
volume ratios).

Run from the repository root: /usr/bin/python3 tools/ref/calc_atkinson_nasa9.py
"""
import csv
import math

from scipy.optimize import brentq

RU = 8.314462618  # J/(mol K), CODATA 2018
AIR = {"N2": 0.78084, "O2": 0.209476, "Ar": 0.00934, "CO2": 0.000314}


def load():
    rows = list(csv.DictReader(open("data/nasa9/nasa9.csv")))
    tot = sum(AIR.values())
    x = {k: v / tot for k, v in AIR.items()}
    M = sum(x[k] * float(next(r for r in rows if r["species"] == k)["molar_mass_g_per_mol"])
            for k in x) / 1000.0
    return rows, x, M


ROWS, X, M = load()
R = RU / M


def coef(sp, T):
    for r in ROWS:
        if r["species"] == sp and float(r["T_low_K"]) <= T <= float(r["T_high_K"]):
            return [float(r["a%d" % i]) for i in range(1, 8)] + [float(r["b1"]), float(r["b2"])]
    raise ValueError("no data for %s at %g K" % (sp, T))


def h(T):
    t = 0.0
    for sp, xi in X.items():
        a = coef(sp, T)
        t += xi * (-a[0] / T**2 + a[1] * math.log(T) / T + a[2] + a[3] * T / 2 + a[4] * T**2 / 3
                   + a[5] * T**3 / 4 + a[6] * T**4 / 5 + a[7] / T) * T
    return t * RU / M


def s0(T):
    t = 0.0
    for sp, xi in X.items():
        a = coef(sp, T)
        t += xi * (-a[0] / T**2 / 2 - a[1] / T + a[2] * math.log(T) + a[3] * T + a[4] * T**2 / 2
                   + a[5] * T**3 / 3 + a[6] * T**4 / 4 + a[8])
    return t * RU / M


def u(T):
    return h(T) - R * T


def T_isentropic_v(T1, vratio):
    return brentq(lambda T: s0(T) - s0(T1) - R * math.log(T / T1) + R * math.log(vratio), 200, 6000,
                  xtol=1e-12)


def T_isentropic_P(T1, pratio):
    return brentq(lambda T: s0(T) - s0(T1) - R * math.log(pratio), 200, 6000, xtol=1e-12)


def main():
    T1, P1, r, re, ec, ee = 296.2, 99.1e3, 8.1, 12.7, 0.92, 0.90
    v1 = R * T1 / P1
    v2 = v1 / r
    T2s = T_isentropic_v(T1, 1.0 / r)
    u2 = u(T1) + (u(T2s) - u(T1)) / ec
    T2 = brentq(lambda T: u(T) - u2, T1, 3000, xtol=1e-12)
    T4 = P1 * re * v2 / R

    def residual(T3):
        T4s = T_isentropic_P(T3, P1 / (R * T3 / v2))
        return u(T3) - ee * (u(T3) - u(T4s)) - u(T4)

    T3 = brentq(residual, T2 + 1.0, 3000.0, xtol=1e-12)
    q_in, q_out = u(T3) - u(T2), h(T4) - h(T1)
    print("actual: T2 %.9g K, T3 %.9g K, T4 %.9g K" % (T2, T3, T4))
    print("actual: heat_in %.9g kJ/kg, net_work %.9g kJ/kg, thermal_efficiency %.9g"
          % (q_in / 1e3, (q_in - q_out) / 1e3, (q_in - q_out) / q_in))
    T3i = T_isentropic_v(T4, 1.0 / re)
    qi = u(T3i) - u(T2s)
    print("ideal:  T3 %.9g K, net_work %.9g kJ/kg, thermal_efficiency %.9g"
          % (T3i, (qi - q_out) / 1e3, (qi - q_out) / qi))


if __name__ == "__main__":
    main()
