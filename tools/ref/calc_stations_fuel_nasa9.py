#!/usr/bin/python3
"""calc_stations_fuel_nasa9.py - an independent calculation of a station
reduction with a named fuel and no flows (the check behind
tests/unit/test_measured.c, test_far_from_energy_balance): the fuel-air ratio
from the combustor energy balance, the turbine on the combustion products.

Invented readings (dry air, methane fuel at 298.15 K): compressor inlet
288.15 K / 101.325 kPa, outlet 650 K / 1520 kPa; turbine inlet 1450 K /
1460 kPa, outlet 820 K / 104 kPa.

Properties: NASA-9 polynomials of data/nasa9/nasa9.csv (McBride, Zehe &
Gordon 2002), summed species by species here; dry air N2 0.78084, O2
0.209476, Ar 0.00934, CO2 0.000314 by mole (renormalised; U.S. Standard
Atmosphere 1976); complete combustion CH4 + 2 O2 -> CO2 + 2 H2O; absolute
enthalpies (formation included) in the energy balance
  h_air(T2) + far h_CH4(298.15 K) = (1 + far) h_products(T3),
solved with scipy's brentq; LHV of methane from the same data at 298.15 K;
isentropic efficiencies (h_in - h_out) / (h_in - h_out,s) with the
isentrope of each gas (the mixture's s0 including its mixing term). Also the
old reduction's figures (turbine gas taken as air, heat input h(T3) - h(T2)).

Run from the repository root: /usr/bin/python3 tools/ref/calc_stations_fuel_nasa9.py
"""
import csv
import math

from scipy.optimize import brentq

RU = 8.314462618  # J/(mol K), CODATA 2018
ROWS = list(csv.DictReader(open("data/nasa9/nasa9.csv")))
AIR = {"N2": 0.78084, "O2": 0.209476, "Ar": 0.00934, "CO2": 0.000314}


def molar_mass(sp):
    return float(next(r for r in ROWS if r["species"] == sp)["molar_mass_g_per_mol"]) / 1000.0


def coef(sp, T):
    for r in ROWS:
        if r["species"] == sp and float(r["T_low_K"]) <= T <= float(r["T_high_K"]):
            return [float(r["a%d" % i]) for i in range(1, 8)] + [float(r["b1"]), float(r["b2"])]
    raise ValueError("no data for %s at %g K" % (sp, T))


def h_mol(sp, T):
    a = coef(sp, T)
    return RU * T * (-a[0] / T**2 + a[1] * math.log(T) / T + a[2] + a[3] * T / 2 + a[4] * T**2 / 3
                     + a[5] * T**3 / 4 + a[6] * T**4 / 5 + a[7] / T)


def s0_mol(sp, T):
    a = coef(sp, T)
    return RU * (-a[0] / T**2 / 2 - a[1] / T + a[2] * math.log(T) + a[3] * T + a[4] * T**2 / 2
                 + a[5] * T**3 / 3 + a[6] * T**4 / 4 + a[8])


class Mix:
    """An ideal-gas mixture given as moles of each species (per kg of air)."""

    def __init__(self, moles):
        self.n = {k: v for k, v in moles.items() if v > 0.0}
        self.N = sum(self.n.values())
        self.m = sum(v * molar_mass(k) for k, v in self.n.items())

    def H(self, T):  # J (for the moles held)
        return sum(v * h_mol(k, T) for k, v in self.n.items())

    def S0(self, T):  # J/K at 1 bar, with the mixing term
        return sum(v * (s0_mol(k, T) - RU * math.log(v / self.N)) for k, v in self.n.items())

    def T_isentropic(self, T1, pratio):
        return brentq(lambda T: self.S0(T) - self.S0(T1) - self.N * RU * math.log(pratio),
                      200.0, 6000.0, xtol=1e-12)


def main():
    tot = sum(AIR.values())
    M_air = sum(v / tot * molar_mass(k) for k, v in AIR.items())
    n_air = {k: v / tot / M_air for k, v in AIR.items()}  # mol per kg of air
    air = Mix(n_air)
    M_f = molar_mass("CH4")
    T1, P1, T2, P2 = 288.15, 101325.0, 650.0, 1520e3
    T3, P3, T4, P4 = 1450.0, 1460e3, 820.0, 104e3

    def products(far):
        nf = far / M_f
        n = dict(n_air)
        n["CO2"] = n.get("CO2", 0.0) + nf
        n["H2O"] = 2.0 * nf
        n["O2"] -= 2.0 * nf
        return Mix(n)

    hf = h_mol("CH4", 298.15) / M_f
    far = brentq(lambda f: air.H(T2) + f * hf - products(f).H(T3), 1e-6, 0.05, xtol=1e-15)
    LHV = (h_mol("CH4", 298.15) + 2 * h_mol("O2", 298.15) - h_mol("CO2", 298.15)
           - 2 * h_mol("H2O", 298.15)) / M_f
    g = products(far)
    w_c = air.H(T2) - air.H(T1)
    eta_c = (air.H(air.T_isentropic(T1, P2 / P1)) - air.H(T1)) / w_c
    w_t = g.H(T3) - g.H(T4)
    eta_t = w_t / (g.H(T3) - g.H(g.T_isentropic(T3, P4 / P3)))
    q = far * LHV
    print("fuel-air ratio %.10g, LHV %.10g kJ/kg" % (far, LHV / 1e3))
    print("compressor efficiency %.10g, turbine efficiency %.10g" % (eta_c, eta_t))
    print("net work %.10g kJ/kg, heat in %.10g kJ/kg, thermal efficiency %.10g"
          % ((w_t - w_c) / 1e3, q / 1e3, (w_t - w_c) / q))
    wt_air = air.H(T3) - air.H(T4)
    eta_t_air = wt_air / (air.H(T3) - air.H(air.T_isentropic(T3, P4 / P3)))
    q_air = air.H(T3) - air.H(T2)
    print("as air: turbine efficiency %.10g, thermal efficiency %.10g"
          % (eta_t_air, (wt_air - w_c) / q_air))


if __name__ == "__main__":
    main()
