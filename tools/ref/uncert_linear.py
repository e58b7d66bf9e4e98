"""uncert_linear.py - what the two linear-propagation table generators share
(gen_uncert_uncertainties.py, gen_uncert_routes.py): the Debian package
version for the header, the correlation matrix of a case and the rows of one
case written by python3-uncertainties (first-order propagation with
correlated_values_norm, correlation_matrix and the exact derivatives of
independent variables). Row layout: case, model, kind, i, j, value, as each
generator's docstring describes.
"""
import subprocess

import numpy
from uncertainties import correlated_values_norm, correlation_matrix, ufloat


def deb_version(pkg):
    try:
        return subprocess.run(["dpkg-query", "-W", "-f=${Version}", pkg],
                              capture_output=True, text=True, check=True).stdout.strip()
    except (OSError, subprocess.CalledProcessError):
        return "unknown"


def corr_matrix(n, pairs):
    r = numpy.identity(n)
    for (i, j), v in pairs.items():
        r[i, j] = r[j, i] = v
    return r


def row(case, model, kind, i, j, value):
    print("%d,%d,%d,%d,%d,%r" % (case, model, kind, i, j, float(value)))


def emit_case(models, case, model, inputs, pairs):
    f = models[model]
    n = len(inputs)
    for i, (v, u) in enumerate(inputs):
        row(case, model, 0, i, -1, v)
        row(case, model, 1, i, -1, u)
    r = corr_matrix(n, pairs)
    for i in range(n):
        for j in range(i + 1, n):
            row(case, model, 2, i, j, r[i, j])
    # exact derivatives from independent variables
    indep = [ufloat(v, u) for v, u in inputs]
    y_ind = f(indep)
    # u(y) and output correlations with the correlated inputs
    y_cor = f(correlated_values_norm(inputs, r)) if pairs else y_ind
    for o, y in enumerate(y_cor):
        row(case, model, 3, o, -1, y.nominal_value)
        row(case, model, 4, o, -1, y.std_dev)
    for o, y in enumerate(y_ind):
        for i, x in enumerate(indep):
            row(case, model, 5, o, i, y.derivatives.get(x, 0.0))
    if len(y_cor) > 1:
        c = correlation_matrix(y_cor)
        for o in range(len(y_cor)):
            for p in range(o + 1, len(y_cor)):
                row(case, model, 6, o, p, c[o][p])
