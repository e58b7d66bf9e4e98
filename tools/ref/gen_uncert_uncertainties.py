#!/usr/bin/python3
"""gen_uncert_uncertainties.py - first-order (linear) uncertainty propagation
of closed-form cycle functions by Debian's python3-uncertainties, the
reference for the linear method of the uncertainty engine
(tests/unit/test_uncert.c, include/gascycle/uncert.h).

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_uncert_uncertainties.py > tests/reference/uncert_uncertainties.csv

Models (units: temperatures K, pressures kPa, the rest dimensionless):
  model 1  cold-air-standard Otto efficiency   eta = 1 - r^(1 - k)
           inputs r (compression ratio), k (ratio of specific heats)
  model 2  cold-air-standard Brayton efficiency eta = 1 - rp^((1 - k) / k)
           inputs rp (pressure ratio), k
  model 3  isentropic-efficiency reduction from four station temperatures
           and two pressures (cold-air standard, k = 1.4 fixed, the turbine
           expanding from P2 back to P1):
             eta_c = T1 ((P2/P1)^((k-1)/k) - 1) / (T2 - T1)
             eta_t = (T3 - T4) / (T3 (1 - (P1/P2)^((k-1)/k)))
             eta_th = ((T3 - T4) - (T2 - T1)) / (T3 - T2)
           inputs T1, P1, T2, P2, T3, T4
Each model is propagated once with independent inputs and once with a
correlation matrix (illustrative values that exercise GUM eq. (13): e.g.
two temperatures read by the same instrument type); the input values and
uncertainties are illustrative too, in the ranges of the trade.

The uncertainties library differentiates exactly (automatic
differentiation), so the derivative rows are the exact sensitivity
coefficients; u(y) and the output correlations come from
correlated_values_norm and correlation_matrix.

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

K_FIXED = 1.4


def otto(x):
    r, k = x
    return [1 - r ** (1 - k)]


def brayton(x):
    rp, k = x
    return [1 - rp ** ((1 - k) / k)]


def reduction(x):
    t1, p1, t2, p2, t3, t4 = x
    e = (K_FIXED - 1) / K_FIXED
    eta_c = t1 * ((p2 / p1) ** e - 1) / (t2 - t1)
    eta_t = (t3 - t4) / (t3 * (1 - (p1 / p2) ** e))
    eta_th = ((t3 - t4) - (t2 - t1)) / (t3 - t2)
    return [eta_c, eta_t, eta_th]


MODELS = {1: otto, 2: brayton, 3: reduction}

# (case, model, [(value, u)], correlation pairs {(i, j): r})
CASES = [
    (1, 1, [(10.5, 0.1), (1.4, 0.01)], {}),
    (2, 1, [(10.5, 0.1), (1.4, 0.01)], {(0, 1): 0.4}),
    (3, 2, [(12.0, 0.15), (1.4, 0.005)], {}),
    (4, 2, [(12.0, 0.15), (1.4, 0.005)], {(0, 1): -0.3}),
    (5, 3, [(288.15, 0.5), (101.325, 0.1), (650.0, 1.0), (1215.9, 2.0),
            (1400.0, 3.0), (780.0, 2.0)], {}),
    (6, 3, [(288.15, 0.5), (101.325, 0.1), (650.0, 1.0), (1215.9, 2.0),
            (1400.0, 3.0), (780.0, 2.0)], {(0, 2): 0.5, (4, 5): 0.5, (1, 3): 0.3}),
]


def main():
    print("# linear (first-order) propagation by python3-uncertainties %s (Debian package %s), "
          "numpy %s: uncertainties.correlated_values_norm, correlation_matrix, derivatives"
          % (uncertainties.__version__, deb_version("python3-uncertainties"), numpy.__version__))
    print("# models: 1 Otto 1 - r^(1-k); 2 Brayton 1 - rp^((1-k)/k); 3 reduction eta_c, eta_t, "
          "eta_th from T1, P1 (kPa), T2, P2 (kPa), T3, T4 (K), k = 1.4")
    print("# kinds: 0 x, 1 u(x), 2 r(x_i,x_j), 3 y, 4 u(y), 5 dy_i/dx_j, 6 r(y_i,y_j)")
    print("# command: /usr/bin/python3 tools/ref/gen_uncert_uncertainties.py "
          "> tests/reference/uncert_uncertainties.csv")
    print("case,model,kind,i,j,value")
    for case, model, inputs, pairs in CASES:
        emit_case(MODELS, case, model, inputs, pairs)


if __name__ == "__main__":
    main()
