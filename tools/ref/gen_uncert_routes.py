#!/usr/bin/python3
"""gen_uncert_routes.py - first-order (linear) uncertainty propagation by
Debian's python3-uncertainties of the closed forms that four presets reduce
to on the cold-air standard, the reference for the routes /v1/uncertainty
and /v1/sensitivities evaluated through the real presets
(tests/unit/test_uncert_routes.c).

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_uncert_routes.py > tests/reference/uncert_routes_uncertainties.csv

Models, each named by the preset and the input pointers of the route
(units as the route's numbers without units: temperatures K, pressures
kPa, specific heats kJ/(kg K), works kJ/kg, the rest dimensionless):
  model 1  otto (gas cold, heat_added 1800 kJ/kg):
           eta = 1 - r^(1 - k)
           inputs /compression_ratio, /gas/k
  model 2  brayton (gas cold, turbine_inlet_temperature 1400 K):
           eta = 1 - rp^((1 - k) / k)
           inputs /pressure_ratio, /gas/k
  model 3  brayton (gas cold) with component efficiencies, m = (k - 1) / k:
           w = cp (eta_t T3 (1 - rp^-m) - T1 (rp^m - 1) / eta_c)
           T2 = T1 (1 + (rp^m - 1) / eta_c), eta = w / (cp (T3 - T2))
           inputs /pressure_ratio, /turbine_inlet_temperature,
           /site/temperature (T1), /compressor_efficiency,
           /turbine_efficiency, /gas/cp, /gas/k; outputs eta, w
  model 4  stations (gas cold, k = 1.4 as the preset's default):
           eta_c = T1 ((P2/P1)^m - 1) / (T2 - T1)
           eta_t = (T3 - T4) / (T3 (1 - (P4/P3)^m))
           eta_th = ((T3 - T4) - (T2 - T1)) / (T3 - T2)
           inputs /compressor_inlet/T, /compressor_inlet/P,
           /compressor_outlet/T, /compressor_outlet/P, /turbine_inlet/T,
           /turbine_inlet/P, /turbine_outlet/T, /turbine_outlet/P
Each model is propagated with independent inputs and with a correlation
matrix (illustrative: e.g. two temperatures read by the same instrument
type); the values and uncertainties are illustrative, in the ranges of the
trade. The library differentiates exactly (automatic differentiation), so
the derivative rows are exact sensitivity coefficients.

Output: '#' header lines (library, version, this command), then the
columns case, model, kind, i, j, value with kind:
  0 input value x_i            (i = input, j = -1)
  1 input standard uncertainty (i = input, j = -1)
  2 input correlation r(x_i, x_j), every pair i < j
  3 output value y_i           (i = output, j = -1)
  4 output standard uncertainty u(y_i)
  5 derivative dy_i / dx_j
  6 output correlation r(y_i, y_j), every pair i < j
Numbers are printed with 17 significant digits (repr).
"""
import numpy
import uncertainties

from uncert_linear import deb_version, emit_case

K_STATIONS = 1.4


def otto(x):
    r, k = x
    return [1 - r ** (1 - k)]


def brayton(x):
    rp, k = x
    return [1 - rp ** ((1 - k) / k)]


def brayton_eff(x):
    rp, t3, t1, eta_c, eta_t, cp, k = x
    m = (k - 1) / k
    w = cp * (eta_t * t3 * (1 - rp ** -m) - t1 * (rp ** m - 1) / eta_c)
    t2 = t1 * (1 + (rp ** m - 1) / eta_c)
    return [w / (cp * (t3 - t2)), w]


def stations(x):
    t1, p1, t2, p2, t3, p3, t4, p4 = x
    m = (K_STATIONS - 1) / K_STATIONS
    eta_c = t1 * ((p2 / p1) ** m - 1) / (t2 - t1)
    eta_t = (t3 - t4) / (t3 * (1 - (p4 / p3) ** m))
    eta_th = ((t3 - t4) - (t2 - t1)) / (t3 - t2)
    return [eta_c, eta_t, eta_th]


MODELS = {1: otto, 2: brayton, 3: brayton_eff, 4: stations}

BRAYTON_EFF = [(12.0, 0.12), (1400.0, 5.0), (300.0, 0.5), (0.86, 0.005), (0.9, 0.005),
               (1.005, 0.005), (1.4, 0.002)]
STATIONS = [(300.0, 0.5), (100.0, 0.25), (628.481551370559, 1.0), (1000.0, 2.5),
            (1400.0, 3.0), (1000.0, 2.5), (792.613809583133, 2.0), (100.0, 0.25)]

# (case, model, [(value, u)], correlation pairs {(i, j): r})
CASES = [
    (1, 1, [(8.0, 0.08), (1.4, 0.01)], {}),
    (2, 1, [(8.0, 0.08), (1.4, 0.01)], {(0, 1): 0.3}),
    (3, 2, [(10.0, 0.1), (1.4, 0.005)], {}),
    (4, 2, [(10.0, 0.1), (1.4, 0.005)], {(0, 1): -0.4}),
    (5, 3, BRAYTON_EFF, {}),
    (6, 3, BRAYTON_EFF, {(3, 4): 0.5, (1, 2): 0.2}),
    (7, 4, STATIONS, {}),
    (8, 4, STATIONS, {(0, 6): 0.5, (2, 4): 0.5, (3, 5): 0.8}),
]


def main():
    print("# linear (first-order) propagation by python3-uncertainties %s (Debian package %s), "
          "numpy %s: uncertainties.correlated_values_norm, correlation_matrix, derivatives"
          % (uncertainties.__version__, deb_version("python3-uncertainties"), numpy.__version__))
    print("# models (cold-air standard closed forms of the presets): 1 otto 1 - r^(1-k); "
          "2 brayton 1 - rp^((1-k)/k); 3 brayton eta and w with component efficiencies; "
          "4 stations eta_c, eta_t, eta_th (k = 1.4)")
    print("# kinds: 0 x, 1 u(x), 2 r(x_i,x_j), 3 y, 4 u(y), 5 dy_i/dx_j, 6 r(y_i,y_j)")
    print("# command: /usr/bin/python3 tools/ref/gen_uncert_routes.py "
          "> tests/reference/uncert_routes_uncertainties.csv")
    print("case,model,kind,i,j,value")
    for case, model, inputs, pairs in CASES:
        emit_case(MODELS, case, model, inputs, pairs)


if __name__ == "__main__":
    main()
