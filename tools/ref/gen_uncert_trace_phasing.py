#!/usr/bin/python3
"""gen_uncert_trace_phasing.py - the sensitivity of net IMEP to the
crank-angle phasing (the position of firing TDC on the trace's angle axis)
and to the pressure-sensor gain and offset, computed with numpy by an
independent re-integration of a cylinder-pressure trace, the reference for
/v1/sensitivities and /v1/uncertainty on the pressure-trace reduction
(tests/unit/test_uncert_routes.c).

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_uncert_trace_phasing.py > tests/reference/uncert_trace_phasing_numpy.csv

The trace: cycle 1 (column p1) of tests/reference/heatrel_cycles.csv, the
synthetic Wiebe (1962) recording of tools/ref/gen_heatrel_cycles.py (bore
0.09 m, stroke 0.1 m, rod 0.16 m, compression ratio 10, four-stroke, 1
degree samples from -360 to 359 degrees, pressures in bar as stored), read
back from its text so C and numpy see the same numbers.
Volumes: the slider-crank law V = Vc + (pi B^2 / 4) (l + a - a cos t -
sqrt(l^2 - a^2 sin^2 t)), a = S / 2, Vc = Vd / (r - 1), t the crank angle
from firing TDC: t = angle - tdc_angle.
IMEP_net = (1 / Vd) sum of the trapezoids 0.5 (P_i + P_i+1)(V_i+1 - V_i)
over the samples with the last joined to the first (the closed loop).
P = gain P_sample + offset. Derivatives by central differences in numpy
with steps 1e-3 degree, 1e-6 (gain) and 1 Pa (offset); the truncation
error of the first is below 1e-9 relative, and IMEP is linear in gain and
offset.

Output: '#' header lines (numpy version, this command), then the columns
id, value with id:
  1 IMEP_net at tdc_angle 0, gain 1, offset 0 (Pa)
  2 d IMEP_net / d tdc_angle (Pa per degree)
  3 d IMEP_net / d gain (Pa)
  4 d IMEP_net / d offset (Pa per Pa)
  5 d IMEP_net / d compression_ratio (Pa)
Numbers are printed with 17 significant digits (repr).
"""
import csv
import os

import numpy as np

BORE, STROKE, ROD, CR = 0.09, 0.1, 0.16, 10.0
HERE = os.path.dirname(os.path.abspath(__file__))
TRACE = os.path.join(HERE, "..", "..", "tests", "reference", "heatrel_cycles.csv")


def read_trace():
    with open(TRACE) as f:
        rows = [r for r in csv.reader(l for l in f if not l.startswith("#"))]
    data = [(float(r[0]), float(r[1])) for r in rows[1:]]
    a = np.array(data)
    return np.radians(a[:, 0]), a[:, 1] * 1e5


def imep(theta, p, tdc_deg=0.0, gain=1.0, offset=0.0, cr=CR):
    a = STROKE / 2
    area = np.pi / 4 * BORE * BORE
    vd = area * STROKE
    vc = vd / (cr - 1)
    t = theta - np.radians(tdc_deg)
    v = vc + area * (ROD + a - a * np.cos(t) - np.sqrt(ROD * ROD - (a * np.sin(t)) ** 2))
    pp = gain * p + offset
    vv = np.append(v, v[0])
    pl = np.append(pp, pp[0])
    return float(np.sum(0.5 * (pl[1:] + pl[:-1]) * np.diff(vv)) / vd)


def main():
    theta, p = read_trace()
    i0 = imep(theta, p)
    d_tdc = (imep(theta, p, tdc_deg=1e-3) - imep(theta, p, tdc_deg=-1e-3)) / 2e-3
    d_gain = (imep(theta, p, gain=1 + 1e-6) - imep(theta, p, gain=1 - 1e-6)) / 2e-6
    d_off = (imep(theta, p, offset=1.0) - imep(theta, p, offset=-1.0)) / 2.0
    d_cr = (imep(theta, p, cr=CR + 1e-4) - imep(theta, p, cr=CR - 1e-4)) / 2e-4
    print("# net IMEP of heatrel_cycles.csv cycle 1 and its derivatives, numpy %s "
          "(trapezoid rule on slider-crank volumes, central differences)" % np.__version__)
    print("# ids: 1 imep_net Pa, 2 dimep/dtdc Pa/deg, 3 dimep/dgain Pa, 4 dimep/doffset -, "
          "5 dimep/dcompression_ratio Pa")
    print("# command: /usr/bin/python3 tools/ref/gen_uncert_trace_phasing.py "
          "> tests/reference/uncert_trace_phasing_numpy.csv")
    print("id,value")
    for k, v in enumerate([i0, d_tdc, d_gain, d_off, d_cr], start=1):
        print("%d,%r" % (k, v))


if __name__ == "__main__":
    main()
