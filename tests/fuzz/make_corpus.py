#!/usr/bin/env python3
"""make_corpus.py - writes the seed corpus of the libFuzzer targets
(tests/fuzz/corpus/<target>/, one file per seed, named by its SHA-1 as
libFuzzer names its own) and the dictionary tests/fuzz/gascycled.dict.

Sources: the request-body examples of openapi/openapi.json, and every case
file of tests/integration/cases (the integration cases and the hostile
catalog): their targets, query strings and bodies. Route names come from
the route table itself, as build/tools/list_routes prints it (the fixed
routes and one per registered preset). Run after changing either, and commit
the result:
    make fuzz-corpus
"""
import glob
import hashlib
import json
import os
import re
import shutil
import subprocess
import sys
from urllib.parse import unquote

ROOT = os.path.normpath(os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", ".."))
OUT = os.path.join(ROOT, "tests", "fuzz", "corpus")
MAX_LEN = 65536
# GC_Q_COUNT: the members of enum gc_quantity in include/gascycle/units.h
N_QUANTITIES = len(re.findall(r"^\s+GC_Q_(?!COUNT)[A-Z_0-9]+\b", re.search(
    r"typedef enum gc_quantity \{(.*?)GC_Q_COUNT", open(os.path.join(
        ROOT, "include", "gascycle", "units.h")).read(), re.S).group(1), re.M))

LIST_ROUTES = sys.argv[1] if len(sys.argv) > 1 else os.path.join(ROOT, "build", "tools",
                                                                  "list_routes")
routes = [tuple(line.split("\t", 1)) for line in
          subprocess.run([LIST_ROUTES], check=True, capture_output=True,
                         text=True).stdout.splitlines() if "\t" in line]


def route_name(path):
    for pattern, name in routes:
        rx = "^" + re.sub(r"\\\{[^}]*\\\}", "[^/]+", re.escape(pattern)) + "$"
        if re.match(rx, path) and "{" not in pattern:
            return name, None
    for pattern, name in routes:
        rx = "^" + re.sub(r"\\\{[^}]*\\\}", "([^/]+)", re.escape(pattern)) + "$"
        m = re.match(rx, path)
        if m:
            return name, m.group(1)
    return None, None


seeds = {"fuzz_routes": set(), "fuzz_query": set(), "fuzz_json": set(), "fuzz_units": set(),
         "fuzz_series": set()}
unit_values = set()


def add(target, data):
    if isinstance(data, str):
        data = data.encode("utf-8", "surrogateescape")
    if 0 < len(data) <= MAX_LEN:
        seeds[target].add(data)


def collect_values(v):
    if isinstance(v, dict):
        for x in v.values():
            collect_values(x)
    elif isinstance(v, list):
        for x in v:
            collect_values(x)
    elif isinstance(v, str) and re.match(r"^-?[0-9.]+(e-?[0-9]+)?\s*\S", v):
        unit_values.add(v)


def add_request(method, target, body):
    path, _, query = target.partition("?")
    name, param = route_name(unquote(path))
    add("fuzz_query", target)
    if body:
        add("fuzz_json", body)
        try:
            collect_values(json.loads(body))
        except ValueError:
            pass
    for part in query.split("&"):
        k, _, v = part.partition("=")
        if v and re.match(r"^-?[0-9.]", unquote(v)):
            unit_values.add(unquote(v.replace("+", " ")))
    if body and method == "POST" and unquote(path) == "/v1/measured/combustion":
        add("fuzz_series", body)   # a JSON recording (a text/csv body is refused alike)
    if name:
        head = name + ("/" + param if param else "")
        add("fuzz_routes", head + "\n" + query + "\n" + (body or "" if method == "POST" else ""))


# 1. OpenAPI request-body examples
doc = json.load(open(os.path.join(ROOT, "openapi", "openapi.json"), encoding="utf-8"))
for path, item in doc["paths"].items():
    for method, op in item.items():
        if not isinstance(op, dict):
            continue
        media = op.get("requestBody", {}).get("content", {}).get("application/json", {})
        for ex in media.get("examples", {}).values():
            add_request("POST", path, json.dumps(ex.get("value")))
        if "example" in media:
            add_request("POST", path, json.dumps(media["example"]))

# 2. every case file
for fn in sorted(glob.glob(os.path.join(ROOT, "tests", "integration", "cases", "**", "*.case"),
                           recursive=True)):
    method = target = body = None
    lines = open(fn, encoding="utf-8", errors="surrogateescape").read().split("\n")
    i = 0
    while i < len(lines):
        ln = lines[i]
        if ln.startswith("request "):
            _, method, target = ln.split(" ", 2)
        elif ln.startswith("body <<"):
            end = ln[7:].strip()
            j = i + 1
            chunk = []
            while j < len(lines) and lines[j] != end:
                chunk.append(lines[j])
                j += 1
            body = "\n".join(chunk)
            i = j
        elif ln.startswith("body-file "):
            p = os.path.join(os.path.dirname(fn), ln[10:].strip())
            if os.path.getsize(p) <= MAX_LEN:
                body = open(p, encoding="utf-8", errors="surrogateescape").read()
        elif ln.startswith("body "):
            body = ln[5:]
        i += 1
    if method and target:
        add_request(method, target, body)

# 3. unit values: each with a few quantities (the first byte picks one)
for k, v in enumerate(sorted(unit_values)):
    for j in range(3):
        add("fuzz_units", bytes([(k + 7 * j) % N_QUANTITIES]) + v.encode("utf-8", "surrogateescape"))

if os.path.isdir(OUT):
    shutil.rmtree(OUT)
for target, items in seeds.items():
    d = os.path.join(OUT, target)
    os.makedirs(d)
    for data in items:
        with open(os.path.join(d, hashlib.sha1(data).hexdigest()), "wb") as f:
            f.write(data)
    print(f"{target}: {len(items)} seeds")

# 4. the dictionary: JSON and query syntax, every property name of the
#    document, the unit words, the output parameters
words = set()


def names(v):
    if isinstance(v, dict):
        for k, x in v.items():
            if k == "properties" and isinstance(x, dict):
                words.update(x.keys())
            names(x)
    elif isinstance(v, list):
        for x in v:
            names(x)


names(doc)
units = ["K", "degC", "degF", "R", "Pa", "kPa", "MPa", "bar", "mbar", "psi", "psia", "atm",
         "kJ/kg", "J/kg", "Btu/lbm", "kJ/kg/K", "kJ/(kg K)", "m3/kg", "ft3/lbm", "W", "kW", "MW",
         "hp", "kg/s", "lbm/s", "m", "ft", "km", "L", "m3", "in3", "cc", "rpm", "rev/s", "m/s",
         "ft/s", "kJ/kWh", "Btu/kWh", "kg", "lbm", "kJ", "Btu", "kg/kmol", "kg/m3", "deg", "rad",
         "%", "-"]
syntax = ['{', '}', '[', ']', '":', '","', 'true', 'false', 'null', '1e999', '-0', 'NaN',
          'Infinity', '\\u0000', '&', '=', '%00', '%20', '%2e', '+', '.', '/0', '~1', '~0']
out = ["# gascycled.dict - libFuzzer dictionary, written by tests/fuzz/make_corpus.py",
       "# (JSON and query syntax, the property names of openapi.json, unit words)"]
for w in syntax + sorted(words) + units + ["format", "units", "select", "csv", "svg", "us", "si"]:
    esc = w.replace("\\", "\\\\").replace('"', '\\"')
    out.append(f'"{esc}"')
open(os.path.join(ROOT, "tests", "fuzz", "gascycled.dict"), "w").write("\n".join(out) + "\n")
print(f"dictionary: {len(out) - 2} entries")
