#!/usr/bin/python3
"""gen_atmosphere_fluids.py - reference values of the U.S. Standard Atmosphere
1976 from Debian's python3-fluids (fluids.atmosphere.ATMOSPHERE_1976), for
tests/unit/test_atmosphere.c.

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_atmosphere_fluids.py > tests/reference/atmosphere_ussa1976_fluids.csv

Output: '#' header lines naming the library, its version and this command,
then CSV columns z_m (geometric altitude, m), T_K, P_Pa, rho_kg_m3, each
printed with 17 significant digits (repr), so a re-run with the same library
reproduces the file byte for byte (mk/reference.mk, target reference-live).
"""
import subprocess

import fluids
from fluids.atmosphere import ATMOSPHERE_1976

# Altitudes (m): both ends of the standard's range, the layer bases of its
# Table 4 expressed as geometric altitudes (geopotential 11, 20, 32, 47, 51,
# 71 km are a little higher geometrically), points inside every layer, and the
# demo site's 320 m.
ALTITUDES = [-5000, -2000, -500, 0, 100, 320, 500, 1000, 1500, 2000, 3000,
             5000, 8000, 11000, 11019, 11020, 15000, 20000, 20063, 25000,
             32000, 32162, 40000, 47000, 47350, 50000, 51000, 51413, 60000,
             71000, 71802, 80000, 84000, 86000]


def deb_version(pkg):
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", pkg],
                              capture_output=True, text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def main():
    print("# U.S. Standard Atmosphere 1976 as implemented by python3-fluids %s "
          "(Debian package %s), fluids.atmosphere.ATMOSPHERE_1976(Z)"
          % (fluids.__version__, deb_version("python3-fluids")))
    print("# command: /usr/bin/python3 tools/ref/gen_atmosphere_fluids.py "
          "> tests/reference/atmosphere_ussa1976_fluids.csv")
    print("z_m,T_K,P_Pa,rho_kg_m3")
    for z in ALTITUDES:
        a = ATMOSPHERE_1976(float(z))
        print("%r,%r,%r,%r" % (float(z), float(a.T), float(a.P), float(a.rho)))


if __name__ == "__main__":
    main()
