#!/usr/bin/python3
"""gen_uncert_quantiles.py - quantiles of the standard normal and Student's t
distributions from Debian's python3-scipy, the reference for the coverage
factors of the uncertainty engine (tests/unit/test_uncert.c,
include/gascycle/uncert.h).

Normal: scipy.special.ndtri. Student's t: scipy.stats.t.ppf refined by four
Newton steps on scipy.special.stdtr (the CDF) with scipy.stats.t.pdf, on the
tail nearer the point. scipy 1.10's t.ppf alone was seen to deviate from a
40-digit mpmath evaluation by up to 5e-9 relative (nu = 30, P = 0.95); the
refined values agreed with mpmath to 2e-15 on this table's grid.

Run from the repository root with Debian's interpreter:
  /usr/bin/python3 tools/ref/gen_uncert_quantiles.py > tests/reference/uncert_quantiles_scipy.csv

Columns: P (the lower-tail probability), nu (degrees of freedom; 0 for the
normal distribution), quantile. The probabilities are the one-sided points
(1 + p) / 2 of the coverage probabilities p the trade quotes (those of
+-1, +-2 and +-3 standard deviations of the normal, "68.27 %", "95.45 %",
"99.73 %", exactly erf(k / sqrt 2); and 90 %, 95 %, 99 %) and a few tail and
central points; nu covers
small samples, a non-integer value (Welch-Satterthwaite gives those) and
the large values where t approaches the normal. Numbers with 17
significant digits (repr).
"""
import subprocess

import math

import scipy
from scipy import special, stats

COVERAGE = [math.erf(1 / math.sqrt(2)), 0.90, 0.95, math.erf(2 / math.sqrt(2)), 0.99,
            math.erf(3 / math.sqrt(2))]
EXTRA_P = [1e-6, 0.001, 0.025, 0.3, 0.6]
NUS = [0, 1, 2, 3, 4, 5, 7.5, 10, 16, 30, 100, 1000, 1e4, 1e5, 1e6]


def deb_version(pkg):
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", pkg],
                              capture_output=True, text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def t_quantile(P, nu):
    t = stats.t.ppf(P, nu)
    for _ in range(4):
        if P > 0.5:
            t += (special.stdtr(nu, -t) - (1.0 - P)) / stats.t.pdf(t, nu)
        else:
            t -= (special.stdtr(nu, t) - P) / stats.t.pdf(t, nu)
    return t


def main():
    print("# quantiles by python3-scipy %s (Debian package %s): scipy.special.ndtri (nu = 0); "
          "scipy.stats.t.ppf refined by Newton steps on scipy.special.stdtr"
          % (scipy.__version__, deb_version("python3-scipy")))
    print("# command: /usr/bin/python3 tools/ref/gen_uncert_quantiles.py "
          "> tests/reference/uncert_quantiles_scipy.csv")
    print("P,nu,quantile")
    probs = [0.5 * (1 + p) for p in COVERAGE] + EXTRA_P
    for nu in NUS:
        for P in probs:
            q = special.ndtri(P) if nu == 0 else t_quantile(P, nu)
            print("%r,%r,%r" % (float(P), float(nu), float(q)))


if __name__ == "__main__":
    main()
