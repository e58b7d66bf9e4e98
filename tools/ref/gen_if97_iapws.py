#!/usr/bin/python3
"""gen_if97_iapws.py - water and steam states by IAPWS-IF97 (IAPWS R7-97(2012))
as implemented by Debian's python3-iapws (iapws.IAPWS97), over all regions and
property routes, for tests/unit/test_if97.c.

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_if97_iapws.py > tests/reference/if97_iapws97.csv

Routes (column `route`): 1 = (T, P), 2 = (P, h), 3 = (P, s), 4 = (P, x),
5 = (T, x). Inputs in1, in2 in the route's order, SI units (K, Pa, J/kg,
J/(kg K), -). Outputs in SI units: T_K, P_Pa, v_m3_kg, h_J_kg, s_J_kgK,
cp_J_kgK, cv_J_kgK, w_m_s (0 where the library gives none: two-phase
mixtures), x (-1 where the library reports a single phase by x = 0 or 1 for
a state given by (T, P), (P, h) or (P, s) outside the dome) and region.

Grid: a (T, P) grid across regions 1, 2, 3 and 5 (points within 1e-6 of the
saturation pressure left out: their phase is a rounding matter); (P, h) and
(P, s) round trips from every third (T, P) point of regions 1, 2, 3 and 5 and
from two-phase points at pressures up to psat(623.15 K); (P, x) and (T, x) on
the saturation line from 612 Pa / 273.16 K to near the critical point.
Left out, because python3-iapws does not compute them by IF97 there:
(P, h) and (P, s) two-phase states above psat(623.15 K) (the library solves
the single-phase region-3 equation instead of the two-phase mixture).
Above 623.15 K the library's (T, x) route, and its (P, x) route for
0 < x < 1, stop at the saturated volumes of the IAPWS SR5-05 backward
equations without refining them on the basic equation (seen: up to 1.2 %
off in v at 22 MPa); only its (P, x) route for x = 0 and x = 1 refines
them (p(rho, Tsat) = P by scipy's fsolve). So above 623.15 K every
saturated state here is the library's (P, x = 0) or (P, x = 1) state (for
(T, x) at P = psat(T) from the library's own Eq. 30), and a mixture is
computed here from those two by the lever rule (v, h, s linear in x), as
IF97 defines it.
Numbers are printed with 17 significant digits (repr).
"""
import subprocess

import iapws
from iapws import IAPWS97
from iapws.iapws97 import _PSat_T

T_GRID = [273.15, 275.0, 300.0, 350.0, 400.0, 450.0, 500.0, 550.0, 600.0, 620.0,
          623.15, 630.0, 640.0, 645.0, 647.0, 650.0, 660.0, 680.0, 700.0, 750.0,
          800.0, 850.0, 900.0, 1000.0, 1073.15, 1100.0, 1300.0, 1500.0, 1800.0,
          2000.0, 2273.15]
P_GRID_MPA = [0.00062, 0.001, 0.01, 0.1, 0.5, 1.0, 2.0, 5.0, 10.0, 15.0, 16.6, 18.0,
              20.0, 21.0, 22.0, 23.0, 25.0, 30.0, 40.0, 50.0, 60.0, 80.0, 100.0]
P_SAT_MPA = [0.000612, 0.001, 0.01, 0.1, 1.0, 5.0, 10.0, 15.0, 16.0, 16.5, 17.0,
             18.0, 19.0, 20.0, 21.0, 21.5, 22.0]
T_SAT_K = [273.16, 300.0, 373.15, 450.0, 500.0, 550.0, 600.0, 620.0, 623.0, 625.0,
           630.0, 635.0, 640.0, 643.0, 645.0, 646.0]
X_SAT = [0.0, 0.25, 0.5, 0.9, 1.0]
P_S623_MPA = 16.529164252604478   # psat(623.15 K), R7-97 Eq. 30


def deb_version(pkg):
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", pkg],
                              capture_output=True, text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def num(v):
    return 0.0 if v is None else float(v)


def row(route, in1, in2, st, single_phase):
    x = -1.0 if single_phase else float(st.x)
    two_phase = (not single_phase) and 0.0 < x < 1.0
    cp = 0.0 if two_phase else num(st.cp) * 1e3
    cv = 0.0 if two_phase else num(st.cv) * 1e3
    w = 0.0 if two_phase else num(st.w)
    vals = [route, in1, in2, st.T, st.P * 1e6, st.v, st.h * 1e3, st.s * 1e3, cp, cv, w,
            x, st.region]
    print(",".join(repr(float(v)) for v in vals))


class Mix:
    """A two-phase mixture by the lever rule between the library's refined
    saturated liquid and vapour (IF97: v, h, s linear in x)."""

    def __init__(self, liq, vap, x):
        self.T, self.P, self.x, self.region = liq.T, liq.P, x, 4
        self.v = liq.v + x * (vap.v - liq.v)
        self.h = liq.h + x * (vap.h - liq.h)
        self.s = liq.s + x * (vap.s - liq.s)
        self.cp = self.cv = self.w = None


def sat_state(p, x):
    """The library's (P, x) state; above psat(623.15 K) with 0 < x < 1, the
    lever rule between its refined x = 0 and x = 1 states."""
    if p <= P_S623_MPA or x in (0.0, 1.0):
        return IAPWS97(P=p, x=x)
    return Mix(IAPWS97(P=p, x=0.0), IAPWS97(P=p, x=1.0), x)


def tp_points():
    pts = []
    for T in T_GRID:
        for p in P_GRID_MPA:
            if T > 1073.15 and p > 50.0:
                continue
            if T <= 647.096 and abs(p / _PSat_T(T) - 1.0) < 1e-6:
                continue
            pts.append((T, p))
    return pts


def main():
    print("# IAPWS-IF97 (IAPWS R7-97(2012)) as implemented by python3-iapws %s "
          "(Debian package %s), iapws.IAPWS97" % (iapws.__version__, deb_version("python3-iapws")))
    print("# routes: 1 (T,P), 2 (P,h), 3 (P,s), 4 (P,x), 5 (T,x); SI units; "
          "cp, cv, w = 0 for two-phase mixtures; x = -1 single phase")
    print("# command: /usr/bin/python3 tools/ref/gen_if97_iapws.py "
          "> tests/reference/if97_iapws97.csv")
    print("route,in1,in2,T_K,P_Pa,v_m3_kg,h_J_kg,s_J_kgK,cp_J_kgK,cv_J_kgK,w_m_s,x,region")
    pts = tp_points()
    for T, p in pts:
        row(1, T, p * 1e6, IAPWS97(T=T, P=p), True)
    for i, (T, p) in enumerate(pts):
        if i % 3:
            continue
        st = IAPWS97(T=T, P=p)
        row(2, p * 1e6, st.h * 1e3, IAPWS97(P=p, h=st.h), True)
        row(3, p * 1e6, st.s * 1e3, IAPWS97(P=p, s=st.s), True)
    for p in P_SAT_MPA:
        if p > P_S623_MPA:
            continue
        liq, vap = IAPWS97(P=p, x=0.0), IAPWS97(P=p, x=1.0)
        for x in (0.05, 0.5, 0.95):
            h = liq.h + x * (vap.h - liq.h)
            s = liq.s + x * (vap.s - liq.s)
            row(2, p * 1e6, h * 1e3, IAPWS97(P=p, h=h), False)
            row(3, p * 1e6, s * 1e3, IAPWS97(P=p, s=s), False)
    for p in P_SAT_MPA:
        for x in X_SAT:
            row(4, p * 1e6, x, sat_state(p, x), False)
    for T in T_SAT_K:
        for x in X_SAT:
            if T <= 623.15:
                row(5, T, x, IAPWS97(T=T, x=x), False)
            else:
                row(5, T, x, sat_state(_PSat_T(T), x), False)


if __name__ == "__main__":
    main()
