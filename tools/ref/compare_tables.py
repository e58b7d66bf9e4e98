#!/usr/bin/python3
"""compare_tables.py - compares a committed reference table of tests/reference/
with a fresh run of its generator, numerically.

Usage: compare_tables.py [--rtol R] COMMITTED FRESH
       compare_tables.py --self-test

Both files are the numeric CSV the generators of tools/ref/ write: '#'
comment lines (provenance: library, version, command), one column-name line,
then rows of numbers. A reference library gives the same numbers on every
machine only to its last digit or two (libm and vectorised code differ
between CPUs), so the rows are compared as numbers, never as text:

  - the column-name line and the number of rows must be identical;
  - each value must agree within |a - b| <= rtol * max(|a|, |b|, floor),
    where floor is 1e-3 of the column's largest magnitude (so a value that
    crosses zero, e.g. an enthalpy difference at its datum, is judged on the
    column's scale, not on its own);
  - comment lines may differ (a newer package version prints a new header);
    a difference there is reported, not failed.

Exit status 0 when the tables agree, 1 when they do not (with the first
mismatches printed), 2 on a usage or read error. Default rtol 1e-12: far
above the 1e-16 of a last-digit difference, far below any real change of a
library's model.
"""
import math
import sys

MAX_REPORTED = 20


def read_table(path):
    comments, header, rows = [], None, []
    with open(path, encoding="utf-8") as f:
        for lineno, line in enumerate(f, 1):
            line = line.rstrip("\n")
            if not line.strip():
                continue
            if line.startswith("#"):
                comments.append(line)
            elif header is None:
                header = line
            else:
                try:
                    rows.append((lineno, [float(x) for x in line.split(",")]))
                except ValueError:
                    sys.exit("compare_tables: %s:%d: not a row of numbers: %r" % (path, lineno, line))
    if header is None:
        sys.exit("compare_tables: %s: no column-name line" % path)
    return comments, header, rows


def column_scales(rows_a, rows_b, ncols):
    scales = [0.0] * ncols
    for rows in (rows_a, rows_b):
        for _, vals in rows:
            for j, v in enumerate(vals[:ncols]):
                if math.isfinite(v):
                    scales[j] = max(scales[j], abs(v))
    return scales


def compare(committed, fresh, rtol):
    ca, ha, ra = read_table(committed)
    cb, hb, rb = read_table(fresh)
    problems = []
    if ha != hb:
        problems.append("column names differ: %r vs %r" % (ha, hb))
    if len(ra) != len(rb):
        problems.append("row counts differ: %d vs %d" % (len(ra), len(rb)))
    if problems:
        return problems, ca != cb
    ncols = len(ha.split(","))
    scales = column_scales(ra, rb, ncols)
    worst = 0.0
    for (la, va), (_, vb) in zip(ra, rb):
        if len(va) != ncols or len(vb) != ncols:
            problems.append("line %d: %d and %d values, %d columns" % (la, len(va), len(vb), ncols))
            continue
        for j, (a, b) in enumerate(zip(va, vb)):
            if a == b:
                continue
            if not (math.isfinite(a) and math.isfinite(b)):
                problems.append("line %d column %d: %r vs %r" % (la, j + 1, a, b))
                continue
            ref = max(abs(a), abs(b), 1e-3 * scales[j])
            rel = abs(a - b) / ref
            worst = max(worst, rel)
            if rel > rtol:
                problems.append("line %d column %d: %r vs %r (relative %.3g > %.3g)"
                                % (la, j + 1, a, b, rel, rtol))
    if not problems:
        print("  %d rows x %d columns agree, worst relative difference %.3g (tolerance %.3g)"
              % (len(ra), ncols, worst, rtol))
    return problems, ca != cb


def self_test():
    """The comparison passes a last-digit difference (as seen between two CPUs:
    0.8710549092165389 vs 0.8710549092165390) and fails a real change."""
    import os
    import tempfile
    head = "# generator v1\nT_K,cp\n"
    base = head + "300.0,0.8710549092165389\n400.0,0.0\n"
    cases = [
        ("last digit", base.replace("5389", "5390"), True),
        ("zero vs tiny", base.replace("400.0,0.0", "400.0,1e-17"), True),
        ("new header line", base.replace("v1", "v2"), True),
        ("changed model", base.replace("0.8710549092165389", "0.8710549100000000"), False),
        ("missing row", head + "300.0,0.8710549092165389\n", False),
        ("renamed column", base.replace("T_K,cp", "T_K,cv"), False),
    ]
    failed = 0
    with tempfile.TemporaryDirectory() as d:
        a = os.path.join(d, "a.csv")
        b = os.path.join(d, "b.csv")
        with open(a, "w") as f:
            f.write(base)
        for name, text, should_agree in cases:
            with open(b, "w") as f:
                f.write(text)
            problems, _ = compare(a, b, 1e-12)
            if (not problems) != should_agree:
                print("compare_tables self-test: %s: expected %s" % (name, "agreement" if should_agree else "a mismatch"))
                failed += 1
    print("compare_tables self-test: %d of %d cases as expected" % (len(cases) - failed, len(cases)))
    return 1 if failed else 0


def main(argv):
    rtol = 1e-12
    args = argv[1:]
    if args == ["--self-test"]:
        return self_test()
    if len(args) >= 2 and args[0] == "--rtol":
        rtol = float(args[1])
        args = args[2:]
    if len(args) != 2:
        sys.stderr.write(__doc__)
        return 2
    problems, comments_differ = compare(args[0], args[1], rtol)
    if comments_differ:
        print("  note: the '#' provenance lines differ (library version?); numbers compared anyway")
    for p in problems[:MAX_REPORTED]:
        print("  " + p)
    if len(problems) > MAX_REPORTED:
        print("  ... and %d more" % (len(problems) - MAX_REPORTED))
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
