#!/usr/bin/python3
"""gen_air_iapws.py - ideal-gas properties of dry air from the Lemmon et al.
(2000) equation of state as implemented by Debian's python3-iapws
(iapws.humidAir.Air), for tests/unit/test_air_reference.c.

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_air_iapws.py > tests/reference/air_lemmon2000_iapws.csv

Output: '#' header lines naming the library, its version, its gas constant and
molar mass, and this command; then CSV columns T_K, cp0 (kJ/(kg K)),
dh0 = h0(T) - h0(300 K) (kJ/kg) and ds0 = s0(T, P) - s0(300 K, P) (kJ/(kg K))
at one pressure P. The library's datum (h = s = 0 at 273.15 K, 101.325 kPa)
cancels in the differences. iapws evaluates the ideal-gas part at the real
density of (T, P), so s0 carries -R ln(rho); P = 10 Pa makes the real density
the ideal one to better than 1e-7 and ds0 the pure integral of cp0/T dT.
Numbers are printed with 17 significant digits (repr).
"""
import subprocess

import iapws
from iapws.humidAir import Air

P_MPA = 1e-5      # 10 Pa
T_REF = 300.0     # K, datum of the differences
TEMPS = [250.0, 273.15, 298.15, 300.0] + [float(t) for t in range(350, 2001, 50)]


def deb_version(pkg):
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", pkg],
                              capture_output=True, text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def main():
    ref = Air(T=T_REF, P=P_MPA)
    print("# Lemmon et al. (2000) dry air, ideal-gas part, as implemented by python3-iapws %s "
          "(Debian package %s), iapws.humidAir.Air(T=T, P=%r MPa): cp0, h0, s0"
          % (iapws.__version__, deb_version("python3-iapws"), P_MPA))
    print("# library constants: R = %r J/(mol K), M = %r g/mol, R/M = %r kJ/(kg K)"
          % (Air._constants["R"], Air.M, ref.R))
    print("# command: /usr/bin/python3 tools/ref/gen_air_iapws.py "
          "> tests/reference/air_lemmon2000_iapws.csv")
    print("T_K,cp0_kJ_kgK,dh0_kJ_kg,ds0_kJ_kgK")
    for T in TEMPS:
        a = Air(T=T, P=P_MPA)
        print("%r,%r,%r,%r" % (T, float(a.cp0), float(a.h0 - ref.h0), float(a.s0 - ref.s0)))


if __name__ == "__main__":
    main()
