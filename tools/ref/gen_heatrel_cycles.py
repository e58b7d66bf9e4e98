#!/usr/bin/python3
"""gen_heatrel_cycles.py - a synthetic multi-cycle cylinder-pressure recording
and its cycle statistics computed with numpy and scipy, for
tests/unit/test_heatrel.c (combustion analysis, include/gascycle/heatrel.h).

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_heatrel_cycles.py tests/reference
or, to regenerate into a temporary folder and compare every number with the
committed tables (relative tolerance 1e-9; make heatrel-reference-check):
  /usr/bin/python3 tools/ref/gen_heatrel_cycles.py --check tests/reference

It writes five files into the given folder:
  heatrel_cycles.csv         the recording in the module's CSV format
                             ("angle [deg]", then "pN [bar]" per cycle)
  heatrel_cycles_numpy.csv   per cycle: cycle, imep_gross_Pa, imep_net_Pa,
                             pmep_Pa, p_max_Pa, angle_p_max_deg (numpy on the
                             numbers read back from the CSV text), flag (by
                             construction: 1 misfire, 2 partial burn, 0 none)
  heatrel_cycles_wiebe.csv   per cycle: cycle, ca10_deg, ca50_deg, ca90_deg,
                             q_total_J from the Wiebe closed form (0 for the
                             misfire)
  heatrel_stats_numpy.csv    per quantity: id, n, mean, std, cov, min, max,
                             lnv (numpy.mean, numpy.std(ddof=1),
                             scipy.stats.variation(ddof=1), min/mean); ids:
                             1 imep_gross, 2 imep_net, 3 pmep, 4 p_max,
                             5 angle_p_max (all cycles), 6 ca10, 7 ca50,
                             8 ca90 (closed form, cycles that burned)
  heatrel_ensemble_numpy.csv every 4th sample: angle_deg, p_mean_Pa (the mean
                             over all cycles, numpy.mean(axis=0))

Model of the synthetic cycles (Wiebe 1962 burn function with a = 6.908 and
form factor m = 2; constant k = 1.35, so that compression before and
expansion after the burn are exactly polytropic with n = k): intake at
constant pressure, closed part from -180 to 180 deg after firing TDC with
  p V^k = p0 V0^k + (k - 1) Q int V^(k-1) dx_b      (first law, constant k)
integrated by scipy.integrate.quad sample to sample, exhaust at constant
pressure. Cycle-to-cycle variation of the burn start, duration and heat from
numpy.random.RandomState(15) (the legacy generator, stable across numpy
versions); cycle 5 misfires (no heat), cycle 9 burns 45 % of its heat.
Geometry and pressures are arbitrary round numbers, not measurements.

Numbers are written with repr (17 significant digits) except the recording's
pressures (7 significant digits in bar, as a test cell would store them);
every reference value is computed from the numbers read back from that text,
so C and numpy see the same inputs. Compare with tolerances: another machine
may differ in the last digits.
"""
import os
import subprocess
import sys

import numpy as np
import scipy
from scipy import integrate, stats

# geometry (m), compression ratio, gas, pressures (Pa), temperature (K)
BORE, STROKE, ROD, CR = 0.09, 0.1, 0.16, 10.0
K = 1.35
P_INTAKE, P_EXHAUST = 0.95e5, 1.10e5
STEP_DEG = 1.0
N_CYCLES = 12
WIEBE_A, WIEBE_M = 6.908, 2.0
MISFIRE, PARTIAL = 4, 8          # 0-based cycle indices
FRACTIONS = (0.1, 0.5, 0.9)


def volume(theta_deg):
    """Slider-crank volume, m3 (theta from TDC, deg)."""
    th = np.radians(theta_deg)
    ap = 0.25 * np.pi * BORE ** 2
    a = 0.5 * STROKE
    vc = ap * STROKE / (CR - 1.0)
    return vc + ap * (ROD + a - a * np.cos(th) - np.sqrt(ROD ** 2 - (a * np.sin(th)) ** 2))


def wiebe_rate(theta, th0, dth):
    """dx_b/dtheta of Wiebe (1962), per deg."""
    y = (theta - th0) / dth
    if y <= 0.0:
        return 0.0
    return WIEBE_A * (WIEBE_M + 1.0) * y ** WIEBE_M * np.exp(-WIEBE_A * y ** (WIEBE_M + 1.0)) / dth


def burn_angle(f, th0, dth):
    """Closed form of the angle where x_b = f."""
    return th0 + dth * (-np.log(1.0 - f) / WIEBE_A) ** (1.0 / (WIEBE_M + 1.0))


def cycle_trace(angles, q, th0, dth):
    p = np.empty_like(angles)
    v0 = volume(-180.0)
    c0 = P_INTAKE * v0 ** K
    f = 0.0
    prev = -180.0
    for i, th in enumerate(angles):
        if th < -180.0:
            p[i] = P_INTAKE
        elif th <= 180.0:
            if q > 0.0 and th > prev:
                lo = max(prev, th0)
                if th > lo:
                    f += integrate.quad(lambda x: volume(x) ** (K - 1.0) * q *
                                        wiebe_rate(x, th0, dth), lo, th,
                                        epsabs=0.0, epsrel=1e-13, limit=200)[0]
            prev = th
            p[i] = (c0 + (K - 1.0) * f) / volume(th) ** K
        else:
            p[i] = P_EXHAUST
    return p


def loop_work(angles, p):
    """Trapezoid rule in V over the loop (closing segment included), split at
    |mid angle| >= 180 deg into pumping (four-stroke)."""
    v = volume(angles)
    ang2 = np.append(angles, angles[0] + 720.0)
    p2, v2 = np.append(p, p[0]), np.append(v, v[0])
    dw = 0.5 * (p2[1:] + p2[:-1]) * (v2[1:] - v2[:-1])
    mid = 0.5 * (ang2[1:] + ang2[:-1])
    pump = np.abs(mid) >= 180.0
    return dw[~pump].sum(), dw[pump].sum()


def deb_version(pkg):
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", pkg], capture_output=True,
                              text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def header(out, what):
    out.write("# %s\n" % what)
    out.write("# numpy %s (Debian %s), scipy %s (Debian %s); generator "
              "tools/ref/gen_heatrel_cycles.py\n"
              % (np.__version__, deb_version("python3-numpy"), scipy.__version__,
                 deb_version("python3-scipy")))
    out.write("# command: /usr/bin/python3 tools/ref/gen_heatrel_cycles.py tests/reference\n")


def stat_row(qid, x):
    x = np.asarray(x, dtype=float)
    mean = float(np.mean(x))
    return (qid, len(x), mean, float(np.std(x, ddof=1)), float(stats.variation(x, ddof=1)),
            float(np.min(x)), float(np.max(x)), float(np.min(x)) / mean)


def numbers(path):
    """The numeric cells of a table ('#' lines and the header line skipped)."""
    out = []
    with open(path) as f:
        rows = [ln for ln in f.read().splitlines() if ln and not ln.startswith("#")]
    for ln in rows[1:]:
        out.append([float(x) for x in ln.split(",")])
    return rows[0], out


def check(folder, tol=1e-9):
    """Regenerates into a temporary folder; compares each number with a
    relative tolerance (absolute near zero). Returns the process exit code."""
    import tempfile
    names = ["heatrel_cycles.csv", "heatrel_cycles_numpy.csv", "heatrel_cycles_wiebe.csv",
             "heatrel_stats_numpy.csv", "heatrel_ensemble_numpy.csv"]
    bad = 0
    with tempfile.TemporaryDirectory() as tmp:
        generate(tmp)
        for name in names:
            h1, a = numbers(os.path.join(folder, name))
            h2, b = numbers(os.path.join(tmp, name))
            worst = 0.0
            ok = h1 == h2 and len(a) == len(b) and all(len(r) == len(q) for r, q in zip(a, b))
            if ok:
                for r, q in zip(a, b):
                    for x, y in zip(r, q):
                        e = abs(x - y) / max(abs(x), abs(y), 1e-6)
                        worst = max(worst, e)
            if not ok or worst > tol:
                bad = 1
                print("heatrel-reference-check: %s differs from a fresh run (worst relative "
                      "difference %.3g, shape %s)" % (name, worst, "same" if ok else "differs"))
            else:
                print("heatrel-reference-check: %s matches (worst relative difference %.3g)"
                      % (name, worst))
    return bad


def main():
    if len(sys.argv) > 2 and sys.argv[1] == "--check":
        sys.exit(check(sys.argv[2]))
    generate(sys.argv[1] if len(sys.argv) > 1 else "tests/reference")


def generate(folder):
    rng = np.random.RandomState(15)
    angles = np.arange(-360.0, 360.0, STEP_DEG)
    params = []
    for c in range(N_CYCLES):
        th0 = -22.0 + 2.0 * rng.standard_normal()
        dth = 55.0 + 3.0 * rng.standard_normal()
        q = 1000.0 * (1.0 + 0.04 * rng.standard_normal())
        if c == MISFIRE:
            q = 0.0
        if c == PARTIAL:
            q *= 0.45
        params.append((q, th0, dth))
    traces = [cycle_trace(angles, *prm) for prm in params]

    # the recording as text, then read back: the references use those numbers
    lines = ["angle [deg]," + ",".join("p%d [bar]" % (c + 1) for c in range(N_CYCLES))]
    for i, th in enumerate(angles):
        lines.append("%g," % th + ",".join("%.7g" % (tr[i] * 1e-5) for tr in traces))
    text = "\n".join(lines) + "\n"
    with open(os.path.join(folder, "heatrel_cycles.csv"), "w") as out:
        out.write("# synthetic recording (Wiebe 1962 burn, constant k = 1.35): bore 0.09 m, "
                  "stroke 0.1 m, rod 0.16 m, compression ratio 10, four-stroke, TDC at 0 deg\n")
        out.write("# generator tools/ref/gen_heatrel_cycles.py; command: /usr/bin/python3 "
                  "tools/ref/gen_heatrel_cycles.py tests/reference\n")
        out.write(text)
    rows = [r.split(",") for r in text.splitlines()[1:]]
    ang = np.array([float(r[0]) for r in rows])
    pres = np.array([[float(r[c + 1]) * 1e5 for r in rows] for c in range(N_CYCLES)])

    vd = 0.25 * np.pi * BORE ** 2 * STROKE
    per_cycle, wiebe = [], []
    for c in range(N_CYCLES):
        gross, pump = loop_work(ang, pres[c])
        k = int(np.argmax(pres[c]))
        flag = 1 if c == MISFIRE else (2 if c == PARTIAL else 0)
        per_cycle.append((c + 1, gross / vd, (gross + pump) / vd, -pump / vd,
                          float(pres[c][k]), float(ang[k]), flag))
        q, th0, dth = params[c]
        pts = [burn_angle(f, th0, dth) if q > 0.0 else 0.0 for f in FRACTIONS]
        wiebe.append((c + 1, pts[0], pts[1], pts[2], q))

    with open(os.path.join(folder, "heatrel_cycles_numpy.csv"), "w") as out:
        header(out, "per-cycle work side of heatrel_cycles.csv (numpy trapezoid rule in V)")
        out.write("cycle,imep_gross_Pa,imep_net_Pa,pmep_Pa,p_max_Pa,angle_p_max_deg,flag\n")
        for r in per_cycle:
            out.write("%d,%r,%r,%r,%r,%r,%d\n" % r)
    with open(os.path.join(folder, "heatrel_cycles_wiebe.csv"), "w") as out:
        header(out, "per-cycle Wiebe closed-form burn points of heatrel_cycles.csv")
        out.write("cycle,ca10_deg,ca50_deg,ca90_deg,q_total_J\n")
        for r in wiebe:
            out.write("%d,%r,%r,%r,%r\n" % r)

    burned = [c for c in range(N_CYCLES) if c != MISFIRE]
    srows = [stat_row(q + 1, [r[q + 1] for r in per_cycle]) for q in range(5)]
    for j in range(3):
        srows.append(stat_row(6 + j, [wiebe[c][1 + j] for c in burned]))
    with open(os.path.join(folder, "heatrel_stats_numpy.csv"), "w") as out:
        header(out, "cycle statistics (numpy.mean, numpy.std ddof=1, scipy.stats.variation "
                    "ddof=1, LNV = min/mean)")
        out.write("id,n,mean,std,cov,min,max,lnv\n")
        for r in srows:
            out.write("%d,%d,%r,%r,%r,%r,%r,%r\n" % r)
    ens = np.mean(pres, axis=0)
    with open(os.path.join(folder, "heatrel_ensemble_numpy.csv"), "w") as out:
        header(out, "ensemble average of heatrel_cycles.csv (numpy.mean over cycles)")
        out.write("angle_deg,p_mean_Pa\n")
        for i in range(0, len(ang), 4):
            out.write("%r,%r\n" % (float(ang[i]), float(ens[i])))


if __name__ == "__main__":
    main()
