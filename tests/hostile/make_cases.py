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
