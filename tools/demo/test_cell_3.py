#!/usr/bin/python3
"""test_cell_3.py - an invented cylinder-pressure recording of the fictional
"Test cell 3" engine (1.6 L, four cylinders, bore 79 mm, stroke 81.5 mm, rod
129 mm, compression ratio 10.5) for the README and OpenAPI examples of
/v1/measured/combustion and the bench. Demo data only: never a check.

  /usr/bin/python3 tools/demo/test_cell_3.py [CYCLES] [STEP_DEG] [SEED] > rec.csv

Writes CSV text in the route's format: "angle [deg]" then one relative
(piezoelectric) pressure column per cycle "cN [bar]", 5 decimals. Each cycle:
intake at 0.92 bar, a first-law closed part with constant k = 1.32 and a
Wiebe (1962) burn (a = 6.908, m = 2) of about 0.95 kJ starting near -20 deg
over about 55 deg, exhaust at 1.08 bar; every 23rd cycle misfires. The
signal is the absolute pressure less 1.0 bar and a small drift per cycle
(what pegging must find). Arbitrary invented numbers, not measurements.
"""
import sys

import numpy as np

BORE, STROKE, ROD, CR = 0.079, 0.0815, 0.129, 10.5
K, A, M = 1.32, 6.908, 2.0
P_INTAKE, P_EXHAUST = 0.92e5, 1.08e5


def volume(th):
    ap = 0.25 * np.pi * BORE ** 2
    a = 0.5 * STROKE
    vc = ap * STROKE / (CR - 1.0)
    t = np.radians(th)
    return vc + ap * (ROD + a - a * np.cos(t) - np.sqrt(ROD ** 2 - (a * np.sin(t)) ** 2))


def cycle(angles, q, th0, dth):
    fine = np.linspace(-180.0, 180.0, 36001)
    y = np.clip((fine - th0) / dth, 0.0, None)
    dx = A * (M + 1.0) * y ** M * np.exp(-A * y ** (M + 1.0)) / dth
    f = np.concatenate(([0.0], np.cumsum(0.5 * (dx[1:] * volume(fine[1:]) ** (K - 1.0) +
                                              dx[:-1] * volume(fine[:-1]) ** (K - 1.0)) *
                                         np.diff(fine))))
    c0 = P_INTAKE * volume(-180.0) ** K
    closed = (c0 + (K - 1.0) * q * np.interp(angles, fine, f)) / volume(angles) ** K
    return np.where(angles < -180.0, P_INTAKE, np.where(angles > 180.0, P_EXHAUST, closed))


def main():
    n = int(sys.argv[1]) if len(sys.argv) > 1 else 50
    step = float(sys.argv[2]) if len(sys.argv) > 2 else 1.0
    rng = np.random.RandomState(int(sys.argv[3]) if len(sys.argv) > 3 else 3)
    angles = np.arange(-360.0, 360.0, step)
    cols = []
    for c in range(n):
        q = 0.0 if c % 23 == 22 else 950.0 * (1.0 + 0.03 * rng.standard_normal())
        p = cycle(angles, q, -20.0 + 2.0 * rng.standard_normal(), 55.0 + 3.0 * rng.standard_normal())
        cols.append(p / 1e5 - 1.0 - 0.01 * rng.standard_normal())
    out = sys.stdout
    out.write("# Test cell 3 (invented demo data), relative pressures, tools/demo/test_cell_3.py\n")
    out.write("angle [deg]," + ",".join("c%d [bar]" % (c + 1) for c in range(n)) + "\n")
    for i, th in enumerate(angles):
        out.write("%g," % th + ",".join("%.5f" % cols[c][i] for c in range(n)) + "\n")


if __name__ == "__main__":
    main()
