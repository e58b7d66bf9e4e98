// validate.mjs — the contract test: openapi/openapi.json against the OpenAPI
// 3.1 schema (@seriousme/openapi-schema-validator), then every JSON response
// the integration runner dumped (one file per response: {case, method, path,
// target, status, content_type, body}) against the document's schema for its
// path, method, status and media type (ajv, JSON Schema 2020-12, with
// ajv-formats). Also checked: every route of the router is in the document,
// and every request-body example validates against its schema. A response
// with no matching schema, or one that drifts from it, fails.
//
// Usage: node tests/contract/validate.mjs [--doc openapi/openapi.json] DUMP_DIR
// Tools come from tests/node/node_modules (scripts/deps.sh node installs them).
import { readFileSync, readdirSync, existsSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";

const here = dirname(fileURLToPath(import.meta.url));
const repo = resolve(here, "..", "..");
const nodeDir = join(repo, "tests", "node");
const require = createRequire(join(nodeDir, "package.json"));
const Ajv2020 = require("ajv/dist/2020").default;
const addFormats = require("ajv-formats").default;
const { Validator } = await import(
  pathToFileURL(join(nodeDir, "node_modules", "@seriousme", "openapi-schema-validator", "index.js")).href
);

let docPath = join(repo, "openapi", "openapi.json");
const rest = [];
for (let i = 2; i < process.argv.length; i++) {
  if (process.argv[i] === "--doc") docPath = resolve(process.argv[++i]);
  else rest.push(process.argv[i]);
}
const dumpDir = rest[0];
if (!dumpDir) {
  console.error("usage: validate.mjs [--doc FILE] DUMP_DIR");
  process.exit(2);
}

const failures = [];
const fail = (msg) => failures.push(msg);

// 1. the document itself
const doc = JSON.parse(readFileSync(docPath, "utf8"));
const oas = new Validator();
const res = await oas.validate(doc);
if (!res.valid) {
  console.error("openapi.json is not a valid OpenAPI document:");
  console.error(JSON.stringify(res.errors, null, 1));
  process.exit(1);
}
if (!String(doc.openapi).startsWith("3.1")) fail(`openapi version is ${doc.openapi}, expected 3.1.x`);

// 2. every route the router knows is documented (api routes from routes.c;
//    the http layer's operational routes are fixed by DESIGN.md)
const routesC = readFileSync(join(repo, "service", "api", "routes", "table.c"), "utf8");
const known = [...routesC.matchAll(/\{\s*"(\/[^"]*)"\s*,/g)].map((m) => m[1]);
for (const p of [...known, "/healthz", "/readyz", "/metrics"]) {
  if (!doc.paths[p]) fail(`route ${p} is not in openapi.json`);
}

// 3. schemas
const ajv = new Ajv2020({ strict: false, allErrors: true });
addFormats(ajv);
ajv.addSchema(doc, "openapi.json");
const esc = (s) => s.replace(/~/g, "~0").replace(/\//g, "~1");
const compiled = new Map();
function validatorAt(pointer) {
  if (!compiled.has(pointer)) compiled.set(pointer, ajv.compile({ $ref: "openapi.json#" + pointer }));
  return compiled.get(pointer);
}
function deref(obj, pointer) {
  // OpenAPI-level $ref (responses, parameters): returns [object, its pointer]
  while (obj && obj.$ref && obj.$ref.startsWith("#/")) {
    pointer = obj.$ref.slice(1);
    obj = pointer.split("/").slice(1).reduce((o, t) => o?.[t.replace(/~1/g, "/").replace(/~0/g, "~")], doc);
  }
  return [obj, pointer];
}
function check(v, value, what) {
  if (!v(value)) {
    fail(`${what}: ${ajv.errorsText(v.errors, { separator: "; " })}`);
    return false;
  }
  return true;
}

// request-body examples must satisfy their own schema
for (const [p, item] of Object.entries(doc.paths)) {
  for (const [m, op] of Object.entries(item)) {
    const content = op?.requestBody?.content;
    for (const [mt, media] of Object.entries(content || {})) {
      for (const [name, ex] of Object.entries(media.examples || {})) {
        const ptr = `/paths/${esc(p)}/${m}/requestBody/content/${esc(mt)}/schema`;
        check(validatorAt(ptr), ex.value, `example ${name} of ${m.toUpperCase()} ${p}`);
      }
    }
  }
}

// The schema location (a JSON pointer into doc) describing the value at the
// RFC 6901 pointer sel of a response whose schema is at ptr; null when none.
function schemaAtPointer(ptr, sel) {
  const at = (p) => p.split("/").slice(1).reduce((o, t) => o?.[t.replace(/~1/g, "/").replace(/~0/g, "~")], doc);
  const tokens = sel.split("/").slice(1).map((t) => t.replace(/~1/g, "/").replace(/~0/g, "~"));
  for (const tok of tokens) {
    let s = at(ptr);
    while (s && s.$ref) {
      ptr = s.$ref.slice(1);
      s = at(ptr);
    }
    if (!s) return null;
    if (s.properties && s.properties[tok]) ptr += "/properties/" + esc(tok);
    else if (s.items && /^(0|[1-9][0-9]*)$/.test(tok)) ptr += "/items";
    else if (s.additionalProperties && typeof s.additionalProperties === "object") ptr += "/additionalProperties";
    else return null;
  }
  return ptr;
}

// 4. the dumped responses
const templates = Object.keys(doc.paths).map((p) => ({
  p,
  re: new RegExp("^" + p.replace(/[.*+?^$()|[\]\\]/g, "\\$&").replace(/\{[^}]+\}/g, "[^/]+") + "$"),
})).sort((x, y) => (x.p.match(/\{/g) || []).length - (y.p.match(/\{/g) || []).length);
// (concrete paths match before templated ones, as OpenAPI 3.1 says; a stable sort keeps
// the document's order otherwise)
if (!existsSync(dumpDir)) {
  console.error(`contract test: no dump folder ${dumpDir} (run the integration tests first)`);
  process.exit(1);
}
const files = readdirSync(dumpDir).filter((f) => f.endsWith(".json")).sort();
if (files.length === 0) {
  console.error(`contract test: ${dumpDir} holds no dumped responses`);
  process.exit(1);
}
const problemV = validatorAt("/components/schemas/Problem");
const seen = new Map();
for (const f of files) {
  const d = JSON.parse(readFileSync(join(dumpDir, f), "utf8"));
  const what = `${f} [${d.case}] ${d.method} ${d.target} -> ${d.status}`;
  const mt = String(d.content_type || "").split(";")[0].trim().toLowerCase();
  if (d.body === null) {
    fail(`${what}: body is not JSON (${d.parse_error})`);
    continue;
  }
  // a route reached with one trailing slash is the route itself (README, issue 17)
  const route = d.path.length > 1 && d.path.endsWith("/") && !d.path.endsWith("//")
    ? d.path.slice(0, -1) : d.path;
  const t = templates.find((x) => x.re.test(d.path)) || templates.find((x) => x.re.test(route));
  const op = t && doc.paths[t.p][d.method.toLowerCase()];
  if (!t || !op) {
    // unknown path or method: the HTTP layer's 404/405, a problem document
    if (![404, 405].includes(d.status) && !(d.method === "OPTIONS" && t)) {
      fail(`${what}: ${t ? "method" : "path"} not in openapi.json`);
    } else if (mt !== "application/problem+json") {
      fail(`${what}: expected application/problem+json, got ${mt}`);
    } else {
      check(problemV, d.body, what);
    }
    continue;
  }
  const key = `${d.method} ${t.p} ${d.status}`;
  seen.set(key, (seen.get(key) || 0) + 1);
  const opPtr = `/paths/${esc(t.p)}/${d.method.toLowerCase()}`;
  const code = String(d.status);
  const rkey = op.responses[code] ? code : op.responses[code[0] + "XX"] ? code[0] + "XX" : op.responses.default ? "default" : null;
  if (!rkey) {
    fail(`${what}: status ${code} is not documented for ${d.method} ${t.p}`);
    continue;
  }
  const [resp, respPtr] = deref(op.responses[rkey], `${opPtr}/responses/${rkey}`);
  if (!resp?.content?.[mt]) {
    fail(`${what}: media type ${mt} is not documented for status ${code}`);
    continue;
  }
  let schemaPtr = `${respPtr}/content/${esc(mt)}/schema`;
  const sel = new URLSearchParams(d.target.split("?")[1] || "").get("select");
  if (sel && d.status === 200) {
    // select of an object or array: the body is that part of the document
    schemaPtr = schemaAtPointer(`/paths/${esc(t.p)}/${d.method.toLowerCase()}/responses/200/content/application~1json/schema`, sel);
    if (!schemaPtr) {
      fail(`${what}: select=${sel} names no part of the documented response`);
      continue;
    }
  }
  check(validatorAt(schemaPtr), d.body, what);
}

for (const [k, n] of [...seen.entries()].sort()) console.log(`  ${String(n).padStart(4)}  ${k}`);
if (failures.length) {
  console.error(`contract test: ${failures.length} failure(s)`);
  for (const m of failures.slice(0, 200)) console.error("  " + m);
  process.exit(1);
}
console.log(`contract test: openapi.json valid (OpenAPI ${doc.openapi}); ${files.length} responses match it`);
