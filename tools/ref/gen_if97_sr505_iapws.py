#!/usr/bin/python3
"""gen_if97_sr505_iapws.py - region-3 specific volumes v(p, T) by the backward
equations of IAPWS SR5-05(2016) ("Revised Supplementary Release on Backward
Equations for Specific Volume as a Function of Pressure and Temperature
v(p,T) for Region 3 of the IAPWS-IF97") as implemented by Debian's
python3-iapws (iapws.iapws97._Backward3_v_PT, its subregion choice and
equations), for tests/unit/test_if97_sr505.c.

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_if97_sr505_iapws.py > tests/reference/if97_sr505_iapws97.csv

Columns: T_K, P_Pa (inputs), v_m3_kg (the library's v(p, T)), sub (the
subregion the library chose, 1 = 3a ... 26 = 3z: the one whose equation,
iapws.iapws97._Backward3x_v_PT, gives exactly the library's v), side (1 =
liquid side, p >= p_sat(T) below the critical temperature; 0 = vapour side
or T >= Tc; the side decides the subregion next to the saturation line).
Grid: region 3 only (623.15 K < T <= T_B23(p), p_B23(T) <= p <= 100 MPa), a
coarse grid over the whole region, a finer one around the critical point
(19..26 MPa, 640..660 K), finer ones next to it (21.8..22.6 MPa,
646.6..648.6 K), in the 22.5..23 MPa band of 3l..3p and where 3y and 3z
meet the saturation line (21.95..22.11 MPa, 646.7..647.4 K), so every
subregion 3a..3z has rows. Points within 1e-6
(relative) of the saturation pressure are left out (their side is a
rounding matter), as are points on which the library's subregion choice
raises (none seen on this grid).
Numbers are printed with 17 significant digits (repr).
"""
import iapws
from iapws.iapws97 import _Backward3_v_PT, _Backward3x_v_PT, _P23_T, _PSat_T

TC_K = 647.096
LETTERS = "abcdefghijklmnopqrstuvwxyz"


def same_v(T, P, x, v):
    """Whether subregion x's equation gives exactly v (other subregions'
    equations may overflow or need roots of negative numbers here)."""
    try:
        return _Backward3x_v_PT(T, P, x) == v
    except (OverflowError, ValueError, ZeroDivisionError):
        return False


def frange(lo, hi, n):
    return [lo + (hi - lo) * i / n for i in range(n + 1)]


def rows():
    out = []
    grids = [
        (frange(624.0, 862.0, 34), frange(16.6, 100.0, 27)),
        (frange(640.0, 660.0, 20), frange(19.0, 26.0, 35)),
        (frange(646.6, 648.6, 20), frange(21.8, 22.6, 40)),
        (frange(648.4, 650.6, 22), frange(22.52, 23.0, 12)),
        (frange(646.7, 647.4, 14), frange(21.95, 22.11, 16)),
    ]
    seen = set()
    for Ts, Ps in grids:
        for T in Ts:
            for P in Ps:   # MPa
                key = (repr(T), repr(P))
                if key in seen or P > 100.0 or P < _P23_T(T):
                    continue
                seen.add(key)
                side = 0
                if T < TC_K:
                    ps = _PSat_T(T)
                    if abs(P / ps - 1.0) < 1e-6:
                        continue
                    side = 1 if P >= ps else 0
                try:
                    v = _Backward3_v_PT(P, T)
                except Exception:
                    continue
                subs = [i + 1 for i, x in enumerate(LETTERS) if same_v(T, P, x, v)]
                if len(subs) != 1:
                    continue
                out.append((T, P * 1e6, v, subs[0], side))
    return out


def main():
    print("# IAPWS SR5-05(2016) region-3 v(p,T) backward equations as implemented by "
          "python3-iapws %s (Debian package 1.5.3-1), iapws.iapws97._Backward3_v_PT"
          % iapws.__version__)
    print("# sub: 1 = 3a ... 26 = 3z (the library's choice); side: 1 liquid side "
          "(p >= psat(T), T < Tc), 0 otherwise; SI units")
    print("# command: /usr/bin/python3 tools/ref/gen_if97_sr505_iapws.py > "
          "tests/reference/if97_sr505_iapws97.csv")
    print("T_K,P_Pa,v_m3_kg,sub,side")
    for T, P, v, sub, side in rows():
        print("%r,%r,%r,%r,%r" % (float(T), float(P), float(v), float(sub), float(side)))


if __name__ == "__main__":
    main()
