#!/usr/bin/env python3
"""check_function_length.py — fails when a C function under the given
folders (default: service) has a body longer than the limit (default 80
lines), so every function can be read at once (DEVELOPERS.md).

A function is a definition in the project's style: its opening brace alone
on a line at column 0 and its closing brace alone at column 0 (data tables
open with "= {" and are not counted). Prints each offender as
path:line: name (n lines) and exits 1 when there is one.

Usage: tools/check_function_length.py [--max N] [folder ...]
"""
import os
import re
import sys


def functions(path):
    lines = open(path, encoding="utf-8", errors="replace").read().split("\n")
    i = 0
    while i < len(lines):
        if lines[i] == "{" and i > 0:
            start = i
            j = i - 1
            while j > 0 and "(" not in lines[j]:
                j -= 1
            m = re.search(r"([A-Za-z_][A-Za-z0-9_]*)\s*\(", lines[j])
            name = m.group(1) if m else "?"
            k = i + 1
            while k < len(lines) and lines[k] != "}":
                k += 1
            yield name, start + 1, k - start - 1
            i = k
        i += 1


def main(argv):
    limit = 80
    folders = []
    it = iter(argv)
    for a in it:
        if a == "--max":
            limit = int(next(it))
        else:
            folders.append(a)
    bad = 0
    for folder in folders or ["service"]:
        for root, _, files in os.walk(folder):
            for f in sorted(files):
                if not f.endswith(".c"):
                    continue
                p = os.path.join(root, f)
                for name, line, n in functions(p):
                    if n > limit:
                        print(f"{p}:{line}: {name} ({n} lines, at most {limit})")
                        bad += 1
    if bad:
        print(f"function-length-check: {bad} function(s) over {limit} lines", file=sys.stderr)
        return 1
    print(f"function-length-check: every function under {', '.join(folders or ['service'])} "
          f"has at most {limit} lines")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
