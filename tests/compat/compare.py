#!/usr/bin/python3
"""compare.py — compares two replay.py dumps (before and after a change) and
lists every difference a client could see:

    compare.py BEFORE/answers.json AFTER/answers.json [--rel 1e-12] [--summary]

Per answer (matched by case file and request number): status, content type,
and the body: JSON compared as values (numbers within the relative
tolerance, also when one side is an integer), members added or removed and a
changed member order reported by JSON pointer; CSV cell by cell (numbers
within the tolerance); SVG and text token by token, numbers within the
tolerance. Differences are printed one per line; --summary folds array
indices into '*' and counts each kind of difference once per pointer
pattern. The exit status is 1 when any difference was found.
"""
import argparse
import json
import re
import sys
from collections import OrderedDict

NUM = re.compile(r"-?\d+(?:\.\d+)?(?:[eE][-+]?\d+)?")


def close(a, b, rel):
    if a == b:
        return True
    return abs(a - b) <= rel * max(abs(a), abs(b))


def is_num(v):
    return isinstance(v, (int, float)) and not isinstance(v, bool)


def cmp_json(a, b, ptr, rel, out):
    if is_num(a) and is_num(b):
        if not close(float(a), float(b), rel):
            out.append(("value", ptr, "%r -> %r" % (a, b)))
        return
    if type(a) != type(b):
        out.append(("type", ptr, "%s -> %s" % (type(a).__name__, type(b).__name__)))
        return
    if isinstance(a, dict):
        for k in a:
            if k not in b:
                out.append(("removed", ptr + "/" + k, ""))
        for k in b:
            if k not in a:
                out.append(("added", ptr + "/" + k, ""))
        common_a = [k for k in a if k in b]
        common_b = [k for k in b if k in a]
        if common_a != common_b:
            out.append(("order", ptr, "%s -> %s" % (",".join(common_a)[:200],
                                                     ",".join(common_b)[:200])))
        for k in common_a:
            cmp_json(a[k], b[k], ptr + "/" + k, rel, out)
    elif isinstance(a, list):
        if len(a) != len(b):
            out.append(("length", ptr, "%d -> %d" % (len(a), len(b))))
        for i in range(min(len(a), len(b))):
            cmp_json(a[i], b[i], "%s/%d" % (ptr, i), rel, out)
    elif a != b:
        out.append(("value", ptr, "%r -> %r" % (a, b)))


def cmp_tokens(a, b, rel, out, what):
    ta, tb = NUM.split(a), NUM.split(b)
    na, nb = NUM.findall(a), NUM.findall(b)
    if ta != tb or len(na) != len(nb):
        out.append((what, "", "text differs"))
        return
    for i, (x, y) in enumerate(zip(na, nb)):
        if not close(float(x), float(y), rel):
            out.append((what, "#%d" % i, "%s -> %s" % (x, y)))


def cmp_csv(a, b, rel, out):
    la, lb = a.split("\r\n"), b.split("\r\n")
    if len(la) != len(lb):
        out.append(("csv-lines", "", "%d -> %d" % (len(la), len(lb))))
    for r, (x, y) in enumerate(zip(la, lb)):
        ca, cb = x.split(","), y.split(",")
        if len(ca) != len(cb):
            out.append(("csv-row", "row %d" % r, "%s -> %s" % (x[:120], y[:120])))
            continue
        for c, (u, v) in enumerate(zip(ca, cb)):
            if u == v:
                continue
            try:
                if close(float(u), float(v), rel):
                    continue
            except ValueError:
                pass
            out.append(("csv-cell", "row %d col %d" % (r, c), "%s -> %s" % (u, v)))


def compare(x, y, rel):
    out = []
    if x["status"] != y["status"]:
        out.append(("status", "", "%s -> %s" % (x["status"], y["status"])))
    if x["content_type"] != y["content_type"]:
        out.append(("content-type", "", "%s -> %s" % (x["content_type"], y["content_type"])))
    ct = x["content_type"]
    if "json" in ct and "json" in y["content_type"]:
        try:
            ja = json.loads(x["body"], object_pairs_hook=OrderedDict)
            jb = json.loads(y["body"], object_pairs_hook=OrderedDict)
        except ValueError as e:
            out.append(("unparsable", "", str(e)))
            return out
        cmp_json(ja, jb, "", rel, out)
    elif ct.startswith("text/csv"):
        cmp_csv(x["body"], y["body"], rel, out)
    elif x["body"] != y["body"]:
        cmp_tokens(x["body"], y["body"], rel, out, "svg" if "svg" in ct else "text")
    return out


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("before")
    ap.add_argument("after")
    ap.add_argument("--rel", type=float, default=1e-12)
    ap.add_argument("--summary", action="store_true")
    a = ap.parse_args()
    before = {(e["case"], e["n"]): e for e in json.load(open(a.before, encoding="utf-8"))}
    after = {(e["case"], e["n"]): e for e in json.load(open(a.after, encoding="utf-8"))}
    found = 0
    kinds = OrderedDict()
    for key in sorted(set(before) | set(after)):
        if key not in before or key not in after:
            print("%s#%d: only %s" % (key[0], key[1], "after" if key in after else "before"))
            found += 1
            continue
        diffs = compare(before[key], after[key], a.rel)
        for kind, ptr, what in diffs:
            found += 1
            if a.summary:
                pat = re.sub(r"/\d+(?=/|$)", "/*", ptr)
                kinds.setdefault((kind, pat), []).append(key[0])
            else:
                print("%s#%d %s %s %s" % (key[0], key[1], kind, ptr, what))
    if a.summary:
        for (kind, pat), cases in kinds.items():
            print("%-8s %-60s %4d answers, e.g. %s" % (kind, pat, len(cases), cases[0]))
    print("compare: %d differences in %d answers" % (found, len(after)))
    return 1 if found else 0


if __name__ == "__main__":
    sys.exit(main())
