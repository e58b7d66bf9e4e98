#!/usr/bin/python3
"""gen_air_real_iapws.py - real-gas departure of dry air from the ideal gas,
from the full Lemmon et al. (2000) equation of state as implemented by
Debian's python3-iapws (iapws.humidAir.Air), for tests/unit/test_validity.c
(the check of the virial estimate in service/core/validity.c).

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_air_real_iapws.py > tests/reference/air_real_lemmon2000_iapws.csv

Output: '#' header lines naming the library, its version, its constants and
this command; then CSV columns T_K, P_MPa, Z = P M / (rho R T) (the
compressibility factor, with the library's R and M), cp and cp0 (kJ/(kg K),
the real and the ideal-gas isobaric heat capacities at the state). The grid
spans the states of the service's routes where air departs from the ideal gas
by about 0.1 % to 50 %: 200..2000 K, 0.1..30 MPa. Numbers are printed with
17 significant digits (repr); make reference-live compares a fresh run
numerically (tools/ref/compare_tables.py).
"""
import subprocess

import iapws
from iapws.humidAir import Air

TEMPS = [200.0, 210.0, 230.0, 250.0, 263.7, 280.0, 300.0, 350.0, 400.0, 500.0, 600.0,
         800.0, 1000.0, 1500.0, 2000.0]
PRESSURES_MPA = [0.1, 0.5, 1.0, 2.3, 5.0, 9.0, 15.0, 30.0]


def deb_version(pkg):
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", pkg],
                              capture_output=True, text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def main():
    R = Air._constants["R"]          # J/(mol K)
    M = Air.M                        # g/mol
    print("# Lemmon et al. (2000) dry air, full equation of state, as implemented by "
          "python3-iapws %s (Debian package %s), iapws.humidAir.Air(T=T, P=P): Z, cp, cp0"
          % (iapws.__version__, deb_version("python3-iapws")))
    print("# library constants: R = %r J/(mol K), M = %r g/mol; Z = P M / (rho R T)" % (R, M))
    print("# command: /usr/bin/python3 tools/ref/gen_air_real_iapws.py "
          "> tests/reference/air_real_lemmon2000_iapws.csv")
    print("T_K,P_MPa,Z,cp_kJ_kgK,cp0_kJ_kgK")
    for T in TEMPS:
        for P in PRESSURES_MPA:
            a = Air(T=T, P=P)
            Z = P * 1e6 * (M / 1e3) / (a.rho * R * T)
            print("%r,%r,%r,%r,%r" % (T, P, float(Z), float(a.cp), float(a.cp0)))


if __name__ == "__main__":
    main()
