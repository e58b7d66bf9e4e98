#!/usr/bin/env python3
"""make_cases.py - writes the hostile-input catalog of issue 12 as case files
(format: tests/integration/README.md) under tests/integration/cases/hostile/.

The table below is the catalog; the case files are generated from it (run
this script after editing the table and commit both). Each case sends one
hostile request to one route and expects a 4xx problem document
(application/problem+json) that names the field at fault (errors/0/field, a
JSON pointer) or the limit met (limit/name). The catalog runner
(tests/hostile/catalog.c) runs these files with a stated time bound per
case, checks every answer for 5xx, NaN or Infinity tokens and the problem
shape, and adds the raw-socket framing cases a libcurl client cannot send.

Usage: tests/hostile/make_cases.py [OUT_DIR]   (default: the folder above)
"""
import json
import os
import shutil
import sys
from urllib.parse import quote

OUT = sys.argv[1] if len(sys.argv) > 1 else os.path.join(
    os.path.dirname(os.path.abspath(__file__)), "..", "integration", "cases", "hostile")

cases = []


def case(area, name, why, method, target, body=None, status="422", field=None, limit=None,
         cls=None, headers=(), extra=()):
    cases.append(dict(area=area, name=name, why=why, method=method, target=target, body=body,
                      status=status, field=field, limit=limit, cls=cls, headers=list(headers),
                      extra=list(extra)))


def q(s):
    """Percent-encodes a query value (space as %20)."""
    return quote(s, safe="")


# ---- single-evaluation routes: one attacked field each --------------------------------
# route, a numeric field, a temperature field, fields that make a valid base
ROUTES = [
    ("properties", "/v1/properties", "T", "T", {"T": 300}),
    ("otto", "/v1/cycles/otto", "compression_ratio", "peak_temperature", {}),
    ("diesel", "/v1/cycles/diesel", "cutoff_ratio", "intake_temperature", {}),
    ("dual", "/v1/cycles/dual", "pressure_ratio", "peak_temperature", {}),
    ("atkinson", "/v1/cycles/atkinson", "expansion_ratio", "intake_temperature", {}),
    ("miller", "/v1/cycles/miller", "effective_compression_ratio", "peak_temperature", {}),
    ("stirling", "/v1/cycles/stirling", "regenerator_effectiveness", "peak_temperature", {}),
    ("ericsson", "/v1/cycles/ericsson", "pressure_ratio", "intake_temperature", {}),
    ("lenoir", "/v1/cycles/lenoir", "pressure_ratio", "peak_temperature", {}),
    ("carnot", "/v1/cycles/carnot", "compression_ratio", "peak_temperature", {}),
    ("brayton", "/v1/cycles/brayton", "pressure_ratio", "turbine_inlet_temperature", {}),
    ("turbojet", "/v1/cycles/turbojet", "flight_mach_number", "turbine_inlet_temperature", {}),
]

# (kind, why, method, value-or-body builder, status, field is the attacked one?)
GET_VALUES = [
    ("infinity", "Infinity in a query value", "Infinity", "422"),
    ("nan", "NaN in a query value", "NaN", "422"),
    ("1e999", "a number beyond double range", "1e999", "422"),
    ("minus-1e999", "a negative number beyond double range", "-1e999", "422"),
    ("nul", "an encoded NUL: never read as the number before it", "10\x00junk", "400"),
    ("control", "control characters", "\x01\x02\x1f", "422"),
    ("huge-value", "a 12 KB value", "9" * 12000, "422"),
    ("hex-float", "a C hexadecimal float", "0x1p3", "422"),
    ("empty", "an empty value", "", "422"),
    ("unit-only", "a unit with no number", "K", "422"),
    ("absurd-high", "an absurd magnitude", "1e300", "422"),
    ("absurd-negative", "an absurd negative magnitude", "-1e300", "422"),
]
POST_VALUES = [
    ("true", "a boolean for a number", True, "422"),
    ("null", "null for a number", None, "422"),
    ("array", "an array for a number", [1, 2], "422"),
    ("object", "an object for a number", {"x": 1}, "422"),
    ("string-1e999", "a string number beyond double range", "1e999", "422"),
    ("wrong-unit", "a pressure unit for a temperature (or a dimensionless input)", "12 bar", "422"),
    ("minus-1e308", "-1e308", -1e308, "422"),
    ("unit-garbage", "an unknown unit", "300 furlongs", "422"),
]
# rotate the attacks over the routes so every route and every attack is covered
for i, (area, path, num, temp, base) in enumerate(ROUTES):
    picks = [GET_VALUES[(i + k) % len(GET_VALUES)] for k in range(0, len(GET_VALUES), 2)]
    picks.append(GET_VALUES[4])   # every route: the NUL case of issue 12
    seen = set()
    for kind, why, value, status in picks:
        if kind in seen:
            continue
        seen.add(kind)
        field = num if kind not in ("absurd-high", "absurd-negative") or area == "properties" else num
        extra_q = "".join(f"&{k}={q(str(v))}" for k, v in base.items() if k != field)
        cls = "malformed" if status == "400" else None
        case(area, f"get-{kind}", f"{why} in {field}", "GET",
             f"{path}?{field}={q(value)}{extra_q}", status=status, field="/" + field, cls=cls)
    for k in range(3):
        kind, why, value, status = POST_VALUES[(i + k * 3) % len(POST_VALUES)]
        field = temp if kind == "wrong-unit" else num
        body = dict(base)
        body[field] = value
        case(area, f"post-{kind}", f"{why} in {field}", "POST", path, json.dumps(body),
             status=status, field="/" + field)
    # one structural attack per route, rotating
    structural = [
        ("post-nan-token", "a bare NaN token (not JSON)", '{"%s": NaN}' % num, "400", ""),
        ("post-1e999-token", "a JSON number that overflows a double", '{"%s": 1e999}' % num,
         "400", ""),
        ("post-truncated", "a truncated JSON document", '{"%s": 1' % num, "400", ""),
        ("post-array-body", "a body that is an array", "[1, 2, 3]", "400", ""),
        ("post-duplicate-key", "a key given twice", '{"%s": 2, "%s": 3}' % (num, num), "400",
         ""),
        ("post-raw-control", "a raw control character inside a JSON string",
         '{"gas": "a\u0001b"}', "400", ""),
    ]
    for k in (i % len(structural), (i + 3) % len(structural)):
        nm, why, body, status, field = structural[k]
        case(area, nm, why, "POST", path, body, status=status, field=field, cls="malformed")
    # a huge unknown key, and deep nesting
    key = "k" * 300
    case(area, "post-huge-key", "an unknown 300-character key (the pointer is cut, not the "
         "server)", "POST", path, json.dumps({**base, key: 1}), status="422",
         extra=["expect json /errors/0/field matches ^/kkkk"])
    deep = 1
    for _ in range(40):
        deep = {"a": deep}
    case(area, "post-deep-nesting", "nesting 41 levels deep", "POST", path,
         json.dumps({num: deep}), status="400", cls="malformed",
         extra=["expect json /errors/0/field matches ^/%s/a/a" % num])
    case(area, "get-repeated-key", "a query key given twice", "GET",
         f"{path}?{num}=2&{num}=3", status="400", field="/" + num, cls="malformed")
    case(area, "get-format-xml", "an output format that does not exist", "GET",
         f"{path}?{num}=2&format=xml", status="400", field="/format", cls="bad_output")

# ---- output parameters and query structure (properties as the example) ----------------
P = "/v1/properties"
case("output", "units-metric", "units=metric is not a unit system", "GET", P + "?T=300&units=metric",
     status="400", field="/units", cls="bad_output")
case("output", "select-nothing", "select names no value", "GET", P + "?T=300&select=/nope",
     status="400", field="/select", cls="bad_output")
case("output", "select-huge", "a 5 KB select pointer", "GET", P + "?T=300&select=/" + "a" * 5000,
     status="400", field="/select", cls="bad_output")
case("output", "select-bad-escape", "a JSON pointer with a bad ~ escape", "GET",
     P + "?T=300&select=/properties~2T", status="400", field="/select", cls="bad_output")
case("output", "format-sub-key", "an output parameter with a sub-key", "GET",
     P + "?T=300&format.x=csv", status="400", cls="malformed")
case("output", "select-in-body", "an output parameter in a POST body", "POST", P,
     '{"T": 300, "select": "/properties/cp"}', status="422", field="/select")
case("query", "value-and-subkey", "a key given as a value and with sub-keys", "GET",
     P + "?gas=air&gas.model=cold&T=300", status="400", field="/gas", cls="malformed")
case("query", "empty-key-part", "a dotted key with an empty part", "GET", P + "?T=300&gas..model=x",
     status="400", cls="malformed")
case("query", "deep-dotted-key", "a dotted key 40 levels deep", "GET",
     P + "?T=300&" + ".".join(["a"] * 40) + "=1", status="400", cls="malformed")
case("query", "invalid-utf8-value", "a query value that is not UTF-8", "GET", P + "?T=%ff%fe",
     status="400", cls="malformed")
case("query", "invalid-utf8-key", "a query key that is not UTF-8 (its message was dropped "
     "before)", "GET", P + "?T=300&%c3%28=1", status="400", cls="malformed",
     extra=["expect json /errors/0/message type string"])
case("query", "utf8-cut-by-message", "a key whose quote in the message is cut inside a "
     "character (the message was dropped before)", "GET", P + "?T=300&" + "a" * 59 + "%c3%a9b=1",
     status="422", extra=["expect json /errors/0/message type string",
                          "expect json /errors/0/field matches ^/aaaa"])
case("query", "nul-in-key", "an encoded NUL in a key", "GET", P + "?T=300&ga%00s=air",
     status="400", field="/ga%00s", cls="malformed")
case("query", "nul-in-dotted-key", "an encoded NUL in a nested value", "GET",
     P + "?T=300&gas.model=cold%00x", status="400", field="/gas/model", cls="malformed")
case("query", "params-512-ok", "exactly 512 parameters: read, then 511 unknown fields refused",
     "GET", P + "?T=300&" + "&".join(f"x{i}=1" for i in range(511)), status="422",
     extra=["expect json /errors_not_shown > 400"])
case("query", "params-513", "513 parameters: one past the limit", "GET",
     P + "?T=300&" + "&".join(f"x{i}=1" for i in range(512)), status="414",
     limit="max_query_parameters", cls="uri_too_long")
case("query", "params-3000-tiny", "3000 tiny parameters in 6 KB (the hang of issue 12)", "GET",
     "/healthz?" + "a&" * 3000, status="414", limit="max_query_parameters", cls="uri_too_long")
case("query", "healthz-232-params", "/healthz with 232 parameters (it hung before)", "GET",
     "/healthz?" + "&".join(f"a{i}=1" for i in range(232)), status="200", extra=[])
case("query", "custom-32-steps-get", "a 32-step custom chain as a GET, 6 keys a step "
     "(4.6 KB, 194 parameters; it hung before)", "GET",
     "/v1/cycles/custom?gas=cold&start.temperature=300&start.pressure=100&" + "&".join(
         f"steps.{i}.kind=isentropic&steps.{i}.end=ratio&steps.{i}.value=1.01&"
         f"steps.{i}.name=s{i}&steps.{i}.x=1&steps.{i}.y=2" for i in range(32)),
     status="422", extra=["expect json /errors/0/field matches ^/steps/0"])

# ---- bodies and headers --------------------------------------------------------------
case("body", "empty-post", "an empty POST body", "POST", P, "", status="400", field="",
     cls="malformed")
case("body", "whitespace-post", "a POST body of whitespace only", "POST", P, "   \n\t ",
     status="400", field="", cls="malformed")
case("body", "text-plain", "a POST body sent as text/plain", "POST", P, '{"T": 300}',
     status="415", cls="media_type", headers=["Content-Type: text/plain"])
case("body", "form-urlencoded", "an HTML form body", "POST", P, "T=300",
     status="415", cls="media_type", headers=["Content-Type: application/x-www-form-urlencoded"])
case("body", "json-string", "a JSON string as the body", "POST", P, '"T=300"', status="400",
     field="", cls="malformed")
case("body", "utf8-bom", "a byte-order mark before the JSON", "POST", P, '\ufeff{"T": 300}',
     status="400", field="", cls="malformed")
case("body", "two-documents", "two JSON documents in one body", "POST", P, '{"T": 300} {"T": 1}',
     status="400", field="", cls="malformed")
case("body", "query-field-with-post", "an input field in the query of a POST", "POST",
     P + "?T=300", '{"T": 300}', status="400", field="", cls="malformed")
case("body", "deep-array", "arrays nested 100 deep", "POST", P,
     '{"T": ' + "[" * 100 + "]" * 100 + "}", status="400", cls="malformed",
     extra=["expect json /errors/0/field matches ^/T/0/0"])
case("body", "nesting-16-ok", "nesting of exactly 16 levels is read", "POST", P,
     '{"T": 300, "x": ' + '{"a": ' * 15 + "1" + "}" * 15 + "}", status="422", field="/x")
case("body", "nesting-17", "nesting of 17 levels: one past the limit", "POST", P,
     '{"T": 300, "x": ' + '{"a": ' * 16 + "1" + "}" * 16 + "}", status="400", cls="malformed")
case("body", "string-63-ok", "a gas model name of 63 characters: read, unknown", "POST", P,
     json.dumps({"T": 300, "gas": "g" * 63}), status="422", field="/gas")
case("body", "huge-string", "a 60 KB string value", "POST", P,
     json.dumps({"T": "3" * 60000}), status="422", field="/T")
case("body", "many-keys", "5,000 unknown keys", "POST", P,
     json.dumps({**{"T": 300}, **{f"k{i}": 1 for i in range(5000)}}), status="422",
     extra=["expect json /errors_not_shown > 4900"])
case("body", "chunked-ok", "a chunked body is read", "POST", P, '{"T": 300, "P": -5}',
     status="422", field="/P", extra=[], headers=[])
cases[-1]["chunked"] = True
case("headers", "content-type-huge", "a 6 KB Content-Type", "POST", P, '{"T": 300}',
     status="415", cls="media_type", headers=["Content-Type: application/" + "x" * 6000])
case("headers", "header-fields-9k", "header fields of 9 KB: past 8192 bytes", "GET",
     "/healthz", status="431", limit="max_header_bytes", cls="header_too_large",
     headers=["X-Big: " + "b" * 9000])
case("headers", "request-id-hostile", "a request id with control and quote characters is "
     "replaced, not echoed", "GET", P + "?T=-1", status="422", field="/T",
     headers=['X-Request-Id: a"b\\c\x7f<script>'],
     extra=["expect header X-Request-Id matches ^[0-9a-f]{16}$"])
case("headers", "origin-hostile", "a hostile Origin is not reflected", "GET", P + "?T=-1",
     status="422", field="/T", headers=["Origin: null"],
     extra=["expect header Access-Control-Allow-Origin absent"])

# ---- routes without inputs, unknown routes and methods ---------------------------------
case("routes", "gases-unknown-param", "a parameter /v1/gases does not take", "GET",
     "/v1/gases?x=%00", status="400", field="/x", cls="malformed")
case("routes", "unknown-preset", "an unknown cycle preset", "GET", "/v1/cycles/%2e%2e",
     status="404", cls="not_found")
case("routes", "unknown-preset-not-utf8", "an unknown preset name that is not UTF-8 (its detail "
     "and message were dropped before; found by fuzz_routes)", "GET", "/v1/cycles/esur%f7!10%7d",
     status="404", field="/preset", cls="not_found",
     extra=["expect json /errors/0/message type string"])
case("routes", "dot-dot-path", "a path climbing out with ..", "GET", "/v1/../../etc/passwd",
     status="404", cls="not_found")
case("routes", "huge-path", "a 12 KB path", "GET", "/v1/" + "p" * 12000, status="404",
     cls="not_found")
case("routes", "delete-properties", "DELETE on an evaluation route", "DELETE", P, status="405",
     cls="method_not_allowed")
case("routes", "put-sweeps", "PUT on /v1/sweeps", "PUT", "/v1/sweeps", '{}', status="405",
     cls="method_not_allowed")
case("routes", "post-healthz-body", "POST with a body on /healthz", "POST", "/healthz", '{}',
     status="405", cls="method_not_allowed")
case("routes", "get-batch", "GET on the POST-only /v1/batch", "GET", "/v1/batch?requests=1",
     status="405", cls="method_not_allowed")
case("routes", "openapi-query-nul", "an encoded NUL in a query of /openapi.json", "GET",
     "/openapi.json?x=%00", status="400", field="/x", cls="malformed")
case("routes", "metrics-query-limit", "513 parameters on /metrics", "GET",
     "/metrics?" + "&".join(f"m{i}" for i in range(513)), status="414",
     limit="max_query_parameters", cls="uri_too_long")
case("routes", "readyz-huge-header", "a 9 KB header on /readyz", "GET", "/readyz",
     status="431", limit="max_header_bytes", cls="header_too_large",
     headers=["X-Pad: " + "r" * 9000])
case("routes", "demo-page-nul", "an encoded NUL in the demo page's query", "GET", "/?a=%00",
     status="400", field="/a", cls="malformed")

# ---- composite routes ----------------------------------------------------------------
S = "/v1/sweeps"
otto_sweep = {"cycle": "otto", "inputs": {"gas": "cold", "peak_temperature": 1800},
              "sweep": {"input": "compression_ratio", "from": 4, "to": 12, "steps": 4}}


def sweep_with(**kw):
    b = json.loads(json.dumps(otto_sweep))
    for k, v in kw.items():
        b["sweep"][k] = v
    return json.dumps(b)


case("sweeps", "steps-int64-max", "steps of 2^63-1 (it overflowed steps + 1 before)", "POST", S,
     sweep_with(steps=9223372036854775807), field="/sweep/steps")
case("sweeps", "steps-huge-get", "steps of 99999999999999999999 from a GET", "GET",
     S + "?cycle=otto&inputs.gas=cold&sweep.input=compression_ratio&sweep.from=4&sweep.to=12"
     "&sweep.steps=99999999999999999999", field="/sweep/steps")
case("sweeps", "steps-int64-min-get", "steps of -2^63 from a GET", "GET",
     S + "?cycle=otto&sweep.input=compression_ratio&sweep.from=4&sweep.to=12"
     "&sweep.steps=-9223372036854775808", field="/sweep/steps")
case("sweeps", "steps-2000", "steps of 2000: one past the 2000-point limit", "POST", S,
     sweep_with(steps=2000), field="/sweep/steps")
case("sweeps", "steps-fraction", "a fractional step count", "POST", S, sweep_with(steps=2.5),
     field="/sweep/steps")
case("sweeps", "steps-zero", "zero steps", "POST", S, sweep_with(steps=0), field="/sweep/steps")
case("sweeps", "values-2001", "2001 explicit values", "POST", S, json.dumps(
    {"cycle": "otto", "sweep": {"input": "compression_ratio", "values": list(range(2, 2003))}}),
    field="/sweep/values")
case("sweeps", "values-nan-string", "NaN among the explicit values", "POST", S, json.dumps(
    {"cycle": "otto", "sweep": {"input": "compression_ratio", "values": [4, "NaN", 8]}}),
    field="/sweep/values/1")
case("sweeps", "grid-too-large", "a 50 x 50 grid (2500 points)", "POST", S, json.dumps(
    {"cycle": "otto", "inputs": {"gas": "cold"},
     "sweep": [{"input": "compression_ratio", "from": 4, "to": 12, "steps": 49},
               {"input": "peak_temperature", "from": 1200, "to": 2400, "steps": 49}]}),
    field="/sweep")
case("sweeps", "three-dims", "three swept inputs", "POST", S, json.dumps(
    {"cycle": "otto", "sweep": [{"input": "compression_ratio", "from": 4, "to": 12}] * 3}),
    field="/sweep")
case("sweeps", "outputs-33", "33 output pointers", "POST", S, json.dumps(
    {**otto_sweep, "outputs": ["/summary/net_work"] * 33}), field="/outputs")
case("sweeps", "output-not-pointer", "an output that is not a JSON pointer", "POST", S,
     json.dumps({**otto_sweep, "outputs": ["summary"]}), field="/outputs/0")
case("sweeps", "cycle-sweeps", "a sweep of /v1/sweeps itself", "POST", S, json.dumps(
    {**otto_sweep, "cycle": "../sweeps"}), field="/cycle")
case("sweeps", "log-negative", "log spacing from a negative value", "POST", S,
     sweep_with(spacing="log", **{"from": -1}), field="/sweep/spacing")
case("sweeps", "from-infinity", "Infinity as the start", "POST", S,
     sweep_with(**{"from": "Infinity"}), field="/sweep/from")
case("sweeps", "inputs-array", "inputs that are an array", "POST", S,
     json.dumps({**otto_sweep, "inputs": [1]}), field="/inputs")
T = "/v1/targets"
otto_target = {"cycle": "otto", "inputs": {"gas": "cold", "peak_temperature": 2000},
               "free": {"input": "compression_ratio", "lower": 2, "upper": 40},
               "target": {"output": "/summary/thermal_efficiency", "value": 0.5}}


def target_with(part, **kw):
    b = json.loads(json.dumps(otto_target))
    for k, v in kw.items():
        b[part][k] = v
    return json.dumps(b)


case("targets", "scan-points-int64", "scan_points of 2^63-1", "POST", T,
     target_with("free", scan_points=9223372036854775807), field="/free/scan_points")
case("targets", "scan-points-huge-get", "scan_points of 10^20 from a GET", "GET",
     T + "?cycle=otto&inputs.gas=cold&free.input=compression_ratio&free.lower=2&free.upper=40"
     "&free.scan_points=100000000000000000000&target.output=/summary/thermal_efficiency"
     "&target.value=0.5", field="/free/scan_points")
case("targets", "scan-points-201", "scan_points one past 200", "POST", T,
     target_with("free", scan_points=201), field="/free/scan_points")
case("targets", "value-nan", "a NaN target value", "POST", T,
     target_with("target", value="NaN"), field="/target/value")
case("targets", "goal-unknown", "an unknown goal", "POST", T,
     target_with("target", goal="maximise-profit"), field="/target/goal")
case("targets", "lower-infinity", "a lower bound of -Infinity", "POST", T,
     target_with("free", lower="-Infinity"), field="/free/lower")
case("targets", "output-object", "an output pointer naming an object", "POST", T,
     target_with("target", output="/summary"), field="/target/output")
case("targets", "free-missing", "no free input", "POST", T,
     json.dumps({k: v for k, v in otto_target.items() if k != "free"}), field="/free")
B = "/v1/batch"
item = {"route": "/v1/cycles/otto", "body": {"gas": "cold", "compression_ratio": 8}}
case("batch", "items-101", "101 items: one past 100", "POST", B,
     json.dumps({"requests": [item] * 101}), field="/requests")
case("batch", "items-empty", "no items", "POST", B, json.dumps({"requests": []}),
     field="/requests")
case("batch", "item-body-array", "an item body that is an array", "POST", B,
     json.dumps({"requests": [{"route": "/v1/cycles/otto", "body": [1]}]}),
     field="/requests/0/body")
case("batch", "item-route-number", "an item route that is a number", "POST", B,
     json.dumps({"requests": [{"route": 7}]}), field="/requests/0/route")
case("batch", "item-units-bad", "item units that do not exist", "POST", B,
     json.dumps({"requests": [{**item, "units": "imperial"}]}), field="/requests/0/units")
case("batch", "item-id-object", "an item id that is an object", "POST", B,
     json.dumps({"requests": [{**item, "id": {"a": 1}}]}), field="/requests/0/id")
case("batch", "requests-string", "requests that are a string", "POST", B,
     json.dumps({"requests": "all"}), field="/requests")
case("batch", "unknown-top-key", "an unknown top-level key", "POST", B,
     json.dumps({"requests": [item], "parallel": True}), field="/parallel")

# ---- custom chains and measured data -------------------------------------------------
C = "/v1/cycles/custom"
step = {"kind": "isentropic", "end": {"pressure_ratio": 2}}
case("custom", "steps-33", "33 steps: one past 32", "POST", C,
     json.dumps({"gas": "cold", "start": {"temperature": 300, "pressure": 100},
                 "steps": [step] * 33}),
     field="/steps")
case("custom", "steps-object", "steps as an object", "POST", C,
     json.dumps({"steps": {"0": step}}), field="/steps")
case("custom", "step-kind-unknown", "an unknown process kind", "POST", C,
     json.dumps({"gas": "cold", "start": {"temperature": 300, "pressure": 100},
                 "steps": [{"kind": "teleport"}, step]}),
     extra=["expect json /errors/0/field matches ^/steps/0"])
case("custom", "start-nan", "a NaN start temperature", "POST", C,
     json.dumps({"gas": "cold", "start": {"temperature": "NaN", "pressure": 100},
                 "steps": [step, step]}),
     field="/start/temperature")
M = "/v1/measured/stations"
st = {"T": 300, "P": 100}
stations = {"compressor_inlet": st, "compressor_outlet": {"T": 650, "P": 1500},
            "turbine_inlet": {"T": 1400, "P": 1450}, "turbine_outlet": {"T": 800, "P": 105}}
case("measured", "stations-negative-T", "a negative absolute temperature", "POST", M,
     json.dumps({**stations, "compressor_inlet": {"T": -5, "P": 100}}),
     field="/compressor_inlet/T")
case("measured", "stations-P-infinity", "an infinite pressure from a GET", "GET",
     M + "?compressor_inlet.T=300&compressor_inlet.P=Infinity&compressor_outlet.T=650"
     "&compressor_outlet.P=1500&turbine_inlet.T=1400&turbine_inlet.P=1450"
     "&turbine_outlet.T=800&turbine_outlet.P=105", field="/compressor_inlet/P")
case("measured", "stations-wrong-unit", "a temperature in bar", "POST", M,
     json.dumps({**stations, "turbine_inlet": {"T": "14 bar", "P": 1450}}),
     field="/turbine_inlet/T")
case("measured", "stations-mass-flow-nul", "an encoded NUL in a mass flow", "GET",
     M + "?air_mass_flow=100%00kg", status="400", field="/air_mass_flow", cls="malformed")
TR = "/v1/measured/pressure-trace"
case("measured", "trace-nan-point", "a NaN pressure in a trace", "POST", TR,
     json.dumps({"bore": 0.08, "stroke": 0.08, "connecting_rod_length": 0.14,
                 "compression_ratio": 10, "trace": [[-180, 100], [0, "NaN"], [180, 100]]}),
     extra=["expect json /errors/0/field matches ^/trace"])
case("measured", "trace-not-array", "a trace that is a string", "POST", TR,
     json.dumps({"bore": 0.08, "stroke": 0.08, "compression_ratio": 10, "trace": "x"}),
     extra=["expect json /errors/0/field matches ^/trace"])

# ---- the machine routes (/v1/machine/...) -------------------------------------------------
MS, MC, MR = "/v1/machine/site", "/v1/machine/corrections", "/v1/machine/readings"
MQ = "machine.design.net_power=45%20MW&machine.design.fuel=methane"
MB = {"design": {"net_power": "45 MW", "fuel": "methane"}}
case("machine", "site-design-infinity", "Infinity as a design pressure ratio", "GET",
     MS + "?machine.design.pressure_ratio=Infinity&" + MQ, field="/machine/design/pressure_ratio")
case("machine", "site-temperature-nan", "NaN as the ambient temperature", "GET",
     MS + "?site.temperature=NaN&" + MQ, field="/site/temperature")
case("machine", "site-load-1e999", "a load beyond double range", "GET",
     MS + "?load.power=1e999&" + MQ, field="/load/power")
case("machine", "site-net-power-nul", "an encoded NUL in the rated output", "GET",
     MS + "?machine.design.net_power=45%00MW&machine.design.fuel=methane", status="400",
     field="/machine/design/net_power", cls="malformed")
case("machine", "site-load-true", "a boolean for a load fraction", "POST", MS,
     json.dumps({"machine": MB, "load": {"fraction": True}}), field="/load/fraction")
case("machine", "site-condition-minus-1e308", "-1e308 as a flow change", "POST", MS,
     json.dumps({"machine": MB, "condition": {"compressor_flow_change": -1e308}}),
     field="/condition/compressor_flow_change")
case("machine", "site-chiller-wrong-unit", "a pressure unit for the chiller's set point", "POST",
     MS, json.dumps({"machine": MB, "inlet": {"treatment": "chiller",
                                              "chiller_temperature": "12 bar"}}),
     field="/inlet/chiller_temperature")
case("machine", "site-machine-array", "the machine as an array", "POST", MS,
     json.dumps({"machine": [1, 2]}), field="/machine")
case("machine", "site-treatment-unknown", "an inlet treatment that does not exist", "POST", MS,
     json.dumps({"machine": MB, "inlet": {"treatment": "snow"}}), field="/inlet/treatment")
case("machine", "site-rating-tiny-flow", "a rated exhaust flow of 1e-300 kg/s (less than the "
     "fuel)", "POST", MS, json.dumps({"machine": {"rating": {
         "net_power": "45 MW", "heat_rate": "9700 kJ/kWh", "exhaust_mass_flow": 1e-300,
         "exhaust_temperature": "850 K", "pressure_ratio": 15, "compressor_efficiency": 0.87,
         "fuel": "methane"}}}), field="/machine/rating/exhaust_mass_flow")
case("machine", "site-boiling-ambient", "200 degC and saturated air: vapour pressure above the "
     "total", "POST", MS, json.dumps({"machine": MB, "site": {"temperature": "200 degC",
                                                             "relative_humidity": 1}}),
     extra=["expect json /errors/0/field matches ^/site"])
case("machine", "site-load-tiny", "a load fraction of 1e-300", "POST", MS,
     json.dumps({"machine": MB, "load": {"fraction": 1e-300}}), field="/load/fraction")
case("machine", "corrections-rows-1e9", "a billion curve rows", "GET",
     MC + "?row_count=1000000000&" + MQ, field="/row_count")
case("machine", "corrections-width-huge", "an SVG 100000 px wide", "GET",
     MC + "?format=svg&width=100000&" + MQ, status="400", field="/width", cls="bad_output")
case("machine", "readings-negative-fuel", "a negative fuel flow", "POST", MR,
     json.dumps({"machine": MB, "readings": {"compressor_exit_pressure": 1400,
                                             "compressor_exit_temperature": 680,
                                             "exhaust_temperature": 850, "fuel_mass_flow": -1,
                                             "net_power": 40000}}),
     field="/readings/fuel_mass_flow")
case("machine", "readings-power-infinity", "an infinite output reading", "GET",
     MR + "?readings.compressor_exit_pressure=1400&readings.compressor_exit_temperature=680"
     "&readings.exhaust_temperature=850&readings.fuel_mass_flow=2.4&readings.net_power=Infinity&"
     + MQ, field="/readings/net_power")
case("machine", "brayton-cooling-nan", "NaN as a cooling constant", "GET",
     "/v1/cycles/brayton?fuel=methane&cooling.nozzle_constant=NaN",
     field="/cooling/nozzle_constant")
# ---- uncertainty and sensitivities (issue 14) -------------------------------------------
U = "/v1/uncertainty"
SE = "/v1/sensitivities"
otto_u = {"cycle": "otto", "inputs": {"gas": "cold", "compression_ratio": 8, "heat_added": 1800},
          "uncertainties": {"compression_ratio": "1 %"}, "outputs": ["/summary/thermal_efficiency"]}
otto_mc = {**otto_u, "method": "monte_carlo", "samples": 1000}
UQ = "?cycle=otto&inputs.gas=cold&inputs.compression_ratio=8&inputs.heat_added=1800"


def unc_with(**kw):
    return json.dumps({**otto_u, **kw})


case("uncertainty", "samples-int64-max", "samples of 2^63-1", "POST", U,
     json.dumps({**otto_mc, "samples": 2 ** 63 - 1}), field="/samples")
case("uncertainty", "samples-huge-get", "samples of 10^20 from a GET", "GET",
     U + UQ + "&uncertainties.compression_ratio=0.1&method=monte_carlo&samples=99999999999999999999",
     field="/samples")
case("uncertainty", "samples-100001", "samples one past the 100 000 limit", "POST", U,
     json.dumps({**otto_mc, "samples": 100001}), field="/samples")
case("uncertainty", "samples-budget", "100 000 samples: within the route's limit, beyond the "
     "evaluation budget", "POST", U, json.dumps({**otto_mc, "samples": 100000}),
     limit="max_evaluations", cls="budget_exceeded")
case("uncertainty", "seed-negative", "a negative seed", "POST", U,
     json.dumps({**otto_mc, "seed": -1}), field="/seed")
case("uncertainty", "seed-2-63-get", "a seed of 2^63 from a GET", "GET",
     U + UQ + "&uncertainties.compression_ratio=0.1&method=monte_carlo&seed=9223372036854775808",
     field="/seed")
case("uncertainty", "amount-nan", "NaN as an uncertainty", "POST", U,
     unc_with(uncertainties={"compression_ratio": "NaN"}), field="/uncertainties/compression_ratio")
case("uncertainty", "amount-infinity-get", "Infinity as an uncertainty from a GET", "GET",
     U + UQ + "&uncertainties.compression_ratio=Infinity",
     field="/uncertainties/compression_ratio")
case("uncertainty", "amount-1e308", "an uncertainty of 1e308: steps stay inside the input's "
     "bounds, the answer stays finite", "POST", U,
     unc_with(uncertainties={"compression_ratio": 1e308}), status="200|422")
case("uncertainty", "coverage-factor-zero", "a coverage factor of 0", "POST", U,
     unc_with(coverage_factor=0), field="/coverage_factor")
case("uncertainty", "relative-step-one", "a relative step of 1", "POST", U,
     unc_with(relative_step=1), field="/relative_step")
case("uncertainty", "inputs-65", "65 uncertain inputs", "POST", U,
     unc_with(uncertainties={f"x{i}": 1 for i in range(65)}),
     extra=["expect body contains at most 64"])
case("uncertainty", "correlations-129", "129 correlations", "POST", U,
     unc_with(correlations=[{"inputs": ["compression_ratio", "gas.k"], "coefficient": 0}] * 129),
     field="/correlations")
case("uncertainty", "correlation-2", "a correlation coefficient of 2", "POST", U,
     unc_with(uncertainties={"compression_ratio": "1 %", "gas.k": 0.01},
              correlations=[{"inputs": ["compression_ratio", "gas.k"], "coefficient": 2}]),
     field="/correlations/0/coefficient")
case("uncertainty", "outputs-33", "33 outputs", "POST", U,
     unc_with(outputs=["/summary/thermal_efficiency"] * 33), field="/outputs")
case("uncertainty", "cycle-path", "a preset named like a path", "POST", U,
     unc_with(cycle="../sweeps"), field="/cycle")
case("uncertainty", "nested-deep", "uncertainties nested six levels deep", "POST", U,
     unc_with(uncertainties={"a": {"b": {"c": {"d": {"e": {"f": 1}}}}}}),
     extra=["expect json /errors/0/field matches ^/uncertainties/a"])
case("sensitivities", "wrt-65", "65 inputs to differentiate with respect to", "POST", SE,
     json.dumps({"cycle": "otto", "inputs": otto_u["inputs"],
                 "with_respect_to": [f"x{i}" for i in range(65)]}),
     extra=["expect body contains at most 64"])
case("sensitivities", "wrt-object", "with_respect_to as a number", "POST", SE,
     json.dumps({"cycle": "otto", "inputs": otto_u["inputs"], "with_respect_to": 5}),
     field="/with_respect_to")
# ---- the combined cycle and the water properties (issue 16) -------------------------------
CC = "/v1/cycles/combined"
CCQ = CC + "?topping.cycle=brayton"
case("combined", "topping-infinity", "Infinity inside the topping's request", "GET",
     CCQ + "&topping.inputs.pressure_ratio=Infinity", field="/topping/inputs/pressure_ratio")
case("combined", "level-nan", "NaN in a level's pressure", "GET", CCQ + "&levels.0.pressure=NaN",
     field="/levels/0/pressure")
case("combined", "level-gap", "numbered level keys with a gap", "GET",
     CCQ + "&levels.5.pressure=1", field="/levels")
case("combined", "inputs-array", "the topping's inputs as an array", "POST", CC,
     json.dumps({"topping": {"cycle": "brayton", "inputs": [1, 2]}}), field="/topping/inputs")
case("combined", "cycle-number", "a number naming the topping", "POST", CC,
     json.dumps({"topping": {"cycle": 7}}), field="/topping/cycle")
case("combined", "topping-in-topping", "a topping nested in the topping's inputs", "POST", CC,
     json.dumps({"topping": {"cycle": "brayton", "inputs": {"topping": {"cycle": "brayton"}}}}),
     field="/topping/inputs/topping")
case("combined", "level-1e999", "a level pressure beyond double range", "POST", CC,
     json.dumps({"topping": {"cycle": "brayton"}, "levels": [{"pressure": "1e999"}]}),
     field="/levels/0/pressure")
case("combined", "thousand-levels", "a thousand pressure levels", "POST", CC,
     json.dumps({"topping": {"cycle": "brayton"}, "levels": [{"pressure": 1000}] * 1000}),
     field="/levels")
case("combined", "firing-without-fuel", "duct firing behind an exhaust with no fuel", "POST", CC,
     json.dumps({"topping": {"cycle": "exhaust", "inputs": {"temperature": 800}},
                 "firing_temperature": 1000}), field="/duct_burner_fuel")
case("combined", "diagram-markup", "markup as a diagram name", "GET",
     CCQ + "&format=svg&diagram=" + q("<script>"), status="400", field="/diagram",
     cls="bad_output")
case("combined", "svg-width", "an SVG 100 000 px wide", "GET", CCQ + "&format=svg&width=100000",
     status="400", field="/width", cls="bad_output")
case("combined", "include-paths", "include=paths on a cycle without an engine chain", "GET",
     CCQ + "&include=paths", status="400", field="/include", cls="bad_output")
case("combined", "nested-huge-key", "a 300-character key inside the topping's inputs", "POST",
     CC, json.dumps({"topping": {"cycle": "brayton", "inputs": {"k" * 300: 1}}}),
     extra=["expect json /errors/0/field matches ^/topping/inputs/kkkk"])
W = "/v1/properties/water"
case("water", "get-infinity", "Infinity for T", "GET", W + "?T=Infinity&P=1", field="/T")
case("water", "get-nan", "NaN for P", "GET", W + "?T=300&P=NaN", field="/P")
case("water", "get-1e999", "a temperature beyond double range", "GET", W + "?T=1e999&P=1",
     field="/T")
case("water", "post-wrong-unit", "a pressure unit for a temperature", "POST", W,
     json.dumps({"T": "300 bar", "P": 100}), field="/T")
case("water", "post-boolean", "a boolean for a quality", "POST", W,
     json.dumps({"x": True, "P": 100}), field="/x")
case("water", "pressure-1e300", "an absurd pressure", "GET", W + "?P=1e300&T=300", field="/P",
     cls="out_of_range")
case("water", "enthalpy-1e300", "an absurd enthalpy", "GET", W + "?h=1e300&P=1000", field="/h",
     cls="out_of_range")
case("water", "critical-mixture", "a two-phase mixture at the critical point", "GET",
     W + "?T=647.096&x=0.5", field="/T", cls="out_of_range")
case("water", "get-nul", "an encoded NUL: never read as the number before it", "GET",
     W + "?T=300%00junk&P=1", status="400", field="/T", cls="malformed")
# ---- combustion analysis of a recording (issue 15) -----------------------------------
CB = "/v1/measured/combustion"
GEO = "?bore=0.09&stroke=0.1&connecting_rod_length=0.16&compression_ratio=10"
CSV = ["Content-Type: text/csv"]


def recording(n=180, cells=None, header="angle [deg],p1 [bar]"):
    """A CSV recording of one cycle at 4 degrees; cells: {row: text} replaces a pressure."""
    rows = [header]
    for i in range(n):
        rows.append("%g,%s" % (-360 + 720.0 * i / n, (cells or {}).get(i, "1.0")))
    return "\n".join(rows) + "\n"


case("combustion", "csv-nan", "NaN in a CSV pressure cell", "POST", CB + GEO,
     recording(cells={7: "NaN"}), status="400", field="/cycles/0", headers=CSV)
case("combustion", "csv-infinity", "inf in a CSV pressure cell", "POST", CB + GEO,
     recording(cells={7: "-inf"}), status="400", field="/cycles/0", headers=CSV)
case("combustion", "csv-hex", "a C hexadecimal float in a CSV cell", "POST", CB + GEO,
     recording(cells={3: "0x1p3"}), status="400", field="/cycles/0", headers=CSV)
case("combustion", "csv-1e999", "a number beyond double range in a CSV cell", "POST",
     CB + GEO, recording(cells={3: "1e999"}), status="400", field="/cycles/0", headers=CSV)
case("combustion", "csv-nul", "a NUL byte inside a CSV cell", "POST", CB + GEO,
     recording(cells={3: "1\x002"}), status="400", field="/cycles/0", headers=CSV)
case("combustion", "csv-gauge-unit", "a gauge pressure unit in the header", "POST", CB + GEO,
     recording(header="angle [deg],p1 [barg]"), status="400", headers=CSV)
case("combustion", "csv-no-units", "a header without units", "POST", CB + GEO,
     recording(header="angle,p1"), status="400", headers=CSV)
case("combustion", "csv-one-column", "a header with the angle column only", "POST",
     CB + GEO, "angle [deg]\n0\n1\n", status="400", headers=CSV)
case("combustion", "csv-1001-cycles", "1001 pressure columns: one past 1000", "POST",
     CB + GEO, "angle [deg]," + ",".join("p%d [bar]" % i for i in range(1001)) + "\n",
     status="400", headers=CSV)
case("combustion", "csv-empty", "an empty text/csv body", "POST", CB + GEO, "",
     status="400", headers=CSV)
case("combustion", "csv-comments-only", "a CSV body of comment lines only", "POST",
     CB + GEO, "# a\n# b\n\n", status="400", headers=CSV)
case("combustion", "csv-angles-backwards", "crank angles that decrease", "POST", CB + GEO,
     "angle [deg],p1 [bar]\n" + "".join("%d,1.0\n" % (360 - 4 * i) for i in range(180)),
     field="/crank_angle", headers=CSV)
case("combustion", "csv-too-many-rows", "7201 rows: one past 7200", "POST", CB + GEO,
     "angle [deg],p [bar]\n" + "".join("%.1f,1\n" % (-360 + 0.1 * i) for i in range(7201)),
     headers=CSV)
case("combustion", "csv-zero-pressure", "an all-zero (unpegged) signal", "POST", CB + GEO,
     recording(cells={i: "0" for i in range(180)}), field="/cycles", headers=CSV)
case("combustion", "csv-with-pressure-unit", "pressure_unit beside a CSV body", "POST",
     CB + GEO + "&pressure_unit=bar", recording(), field="/pressure_unit", headers=CSV)
case("combustion", "csv-and-json-recording", "crank_angle in the query beside a CSV body",
     "POST", CB + GEO + "&crank_angle=1,2", recording(), field="/crank_angle", headers=CSV)
BASE = {"bore": 0.09, "stroke": 0.1, "connecting_rod_length": 0.16, "compression_ratio": 10}
ANG = [-360 + 4 * i for i in range(180)]
case("combustion", "json-nan-pressure", "a NaN string in a cycle", "POST", CB,
     json.dumps({**BASE, "crank_angle": ANG, "cycles": [[100.0] * 5 + ["NaN"] + [100.0] * 174]}),
     field="/cycles/0/5")
case("combustion", "json-cycles-string", "cycles as a string", "POST", CB,
     json.dumps({**BASE, "crank_angle": ANG, "cycles": "x"}), field="/cycles")
case("combustion", "json-cycles-ragged", "cycles of different lengths", "POST", CB,
     json.dumps({**BASE, "crank_angle": ANG, "cycles": [[100.0] * 180, [100.0] * 181]}),
     field="/cycles/1")
case("combustion", "json-cycle-nested", "a cycle of arrays", "POST", CB,
     json.dumps({**BASE, "crank_angle": ANG, "cycles": [[[1]] * 180]}), field="/cycles/0/0")
case("combustion", "json-angle-1e308", "an absurd crank angle", "POST", CB,
     json.dumps({**BASE, "crank_angle": [1e308] + ANG[1:], "cycles": [[100.0] * 180]}),
     field="/crank_angle/0")
case("combustion", "json-burn-fraction-one", "a burn fraction of 1", "POST", CB,
     json.dumps({**BASE, "crank_angle": ANG, "cycles": [[100.0] * 180], "burn_fractions": [1]}),
     field="/burn_fractions/0")
case("combustion", "get-cycles-gap", "cycles.1 without cycles.0", "GET",
     CB + GEO + "&crank_angle=" + ",".join(str(a) for a in ANG) + "&cycles.1=1,2", field="/cycles")
case("combustion", "get-tdc-infinity", "an infinite TDC angle", "GET",
     CB + GEO + "&tdc_angle=Infinity", field="/tdc_angle")
case("combustion", "form-body", "a form-encoded body", "POST", CB + GEO, "a=1",
     status="415", headers=["Content-Type: application/x-www-form-urlencoded"], cls="media_type")
case("combustion", "include-unknown", "an unknown include part", "POST",
     CB + GEO + "&include=everything", recording(), status="400", field="/include", headers=CSV)
# ---- issue 17: readings in context, input systems, decimal commas ---------------------------
O = "/v1/cycles/otto?peak_temperature=2400&"
case("habits", "gauge-huge", "a gauge pressure at the edge of double", "GET",
     O + "intake_pressure=" + q("1e308 barg"), field="/intake_pressure")
case("habits", "gauge-below-vacuum", "a gauge pressure below a vacuum", "GET",
     O + "intake_pressure=" + q("-200 kPag"), field="/intake_pressure")
case("habits", "gauge-nan", "NaN as a gauge pressure", "GET",
     O + "intake_pressure=" + q("NaN psig"), field="/intake_pressure")
case("habits", "gauge-site-pressure", "a gauge site pressure (the reference itself)", "POST",
     "/v1/cycles/brayton", json.dumps({"site": {"pressure": "-1e300 psig"}}),
     field="/site/pressure")
case("habits", "std-volume-nan", "NaN as a standard volume fuel flow", "POST", M,
     json.dumps({**stations, "fuel": "methane", "fuel_mass_flow": "NaN Sm3/h"}),
     field="/fuel_mass_flow")
case("habits", "std-volume-huge", "a standard volume flow at the edge of double", "POST", M,
     json.dumps({**stations, "fuel": "methane", "fuel_mass_flow": "1e308 MMscfd"}),
     field="/fuel_mass_flow")
case("habits", "std-volume-no-fuel-liquid", "a standard volume with a liquid fuel", "POST", M,
     json.dumps({**stations, "fuel_mass_flow": "1 Sm3/h",
                 "fuel": {"formula": "C12H23", "lower_heating_value": "43 MJ/kg"}}),
     field="/fuel_mass_flow")
case("habits", "input-units-us-huge", "a huge plain number read in us units", "GET",
     O + "input_units=us&intake_temperature=1e308", field="/intake_temperature")
case("habits", "input-units-bad", "an unknown input unit system", "GET",
     O + "input_units=" + q("us%00"), status="400", field="/input_units", cls="bad_output")
case("habits", "decimal-comma-garbage", "a number of commas with decimal=comma", "GET",
     O + "decimal=comma&compression_ratio=" + q("1,2,3"), field="/compression_ratio")
case("habits", "decimal-comma-mixed", "both separators with decimal=comma", "GET",
     O + "decimal=comma&compression_ratio=" + q("1.000,5"), field="/compression_ratio")
case("habits", "decimal-comma-exponent", "a comma number past double with decimal=comma", "GET",
     O + "decimal=comma&compression_ratio=" + q("9,9e999"), field="/compression_ratio")
case("habits", "unit-too-long", "a unit longer than any unit", "GET",
     O + "intake_pressure=" + q("1 " + "k" * 200), field="/intake_pressure")
case("habits", "unit-suggest-long", "a long unknown unit for the suggestion", "GET",
     O + "intake_pressure=" + q("1 " + "kPaa" * 7), field="/intake_pressure")
case("habits", "unit-percent-heat-rate", "percent on a heat rate", "POST", M,
     json.dumps({**stations, "net_power": "45 %"}), field="/net_power")
case("habits", "on-error-bad", "an unknown error form", "GET",
     O + "compression_ratio=10&on_error=" + q("x" * 300), status="400", field="/on_error",
     cls="bad_output")

# ---- writing -----------------------------------------------------------------------------
if os.path.isdir(OUT):
    shutil.rmtree(OUT)
names = set()
for c in cases:
    d = os.path.join(OUT, c["area"])
    os.makedirs(d, exist_ok=True)
    fn = os.path.join(d, c["name"] + ".case")
    assert fn not in names, fn
    names.add(fn)
    lines = ["# Hostile input (issue 12, generated by tests/hostile/make_cases.py): "
             + c["why"] + ".",
             "# Expected: a 4xx problem document naming the field or the limit; never a 5xx.",
             f"request {c['method']} {c['target']}"]
    for h in c["headers"]:
        lines.append("header " + h)
    if c.get("chunked"):
        lines.append("chunked")
    if c["body"] is not None:
        body = c["body"]
        if "\n" in body or len(body) > 2000:
            lines.append("body-file " + c["name"] + ".body")
            with open(os.path.join(d, c["name"] + ".body"), "w", encoding="utf-8") as f:
                f.write(body)
        else:
            lines.append("body " + body)
    lines.append(f"expect status {c['status']}")
    if not c["status"].startswith("2"):
        lines.append("expect content-type application/problem+json")
        lines.append(f"expect json /status = {c['status']}")
        lines.append("expect json /detail type string")
    if c["cls"]:
        lines.append(f'expect json /type = "https://gascycled.invalid/problems/{c["cls"]}"')
    if c["field"] is not None:
        lines.append(f"expect json /errors/0/field = {json.dumps(c['field'])}")
    if c["limit"]:
        lines.append(f'expect json /limit/name = "{c["limit"]}"')
    lines.extend(c["extra"])
    with open(fn, "w", encoding="utf-8") as f:
        f.write("\n".join(lines) + "\n")
print(f"{len(cases)} hostile cases written to {OUT}")
