// tests/csv/roundtrip.mjs — format=csv parsed back by a real CSV parser
// (npm csv-parse, RFC 4180) and compared value by value with the JSON
// response of the same request: for every cycle route, si and us units, the
// states, processes and summary sections (one CSV with all three, separated
// by an empty line, and each with table=states|processes|summary; the
// summary is one header row and one value row of the JSON summary's scalar
// members), and the same with decimal=comma (';' between fields, decimal
// commas). Also checks the header row names each column's unit as the JSON
// "units" object does. Starts the server on a free port
// (--port 0, the port read from its "listening" log line) and stops it by
// its PID (SIGTERM; it must exit 0).
//
// Usage: node tests/csv/roundtrip.mjs [SERVER_BINARY] (default build/gascycled)
import { createRequire } from "node:module";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { startServer, stopServer } from "../lib/server.mjs";

const here = dirname(fileURLToPath(import.meta.url));
const repo = resolve(here, "../..");
const require = createRequire(join(repo, "tests/node/package.json"));
const { parse } = require("csv-parse/sync");

const serverBin = resolve(repo, process.argv[2] || "build/gascycled");
let passed = 0, failed = 0;
const check = (ok, what) => {
  if (ok) passed++; else { failed++; console.log(`FAIL ${what}`); }
};

// Requests: every route that serves the states/processes tables.
const requests = [
  "/v1/cycles/otto?compression_ratio=10.5&peak_temperature=2400&compression_efficiency=0.9&expansion_efficiency=0.92",
  "/v1/cycles/diesel?compression_ratio=18&cutoff_ratio=2",
  "/v1/cycles/dual?compression_ratio=16&pressure_ratio=1.5&cutoff_ratio=1.6",
  "/v1/cycles/atkinson?compression_ratio=9&expansion_ratio=14",
  "/v1/cycles/miller?compression_ratio=12&effective_compression_ratio=9&peak_temperature=2300",
  "/v1/cycles/stirling?compression_ratio=4&peak_temperature=900&regenerator_effectiveness=0.8",
  "/v1/cycles/ericsson?pressure_ratio=6&peak_temperature=1000",
  "/v1/cycles/lenoir?peak_temperature=1500",
  "/v1/cycles/carnot?compression_ratio=80&peak_temperature=1200",
  "/v1/cycles/brayton?pressure_ratio=16&turbine_inlet_temperature=1450&compressor_efficiency=0.86&turbine_efficiency=0.9&regenerator_effectiveness=0.7&fuel=methane&optimum_search=false",
  "/v1/cycles/turbojet?flight_mach_number=0.8&altitude=10000&pressure_ratio=20&turbine_inlet_temperature=1500",
];

// CSV cell -> number (or null for an empty cell) and JSON value -> the same.
let comma = false;   // decimal=comma: cells hold decimal commas
const num = (cell) => (cell === "" ? null : Number(comma ? cell.replace(",", ".") : cell));
const same = (a, b) => {
  if (a === null || b === null || b === undefined) return (a === null) === (b === null || b === undefined);
  if (typeof b !== "number") return String(a) === String(b);
  if (b === 0) return Math.abs(a) < 1e-12;
  return Math.abs(a - b) <= 1e-9 * Math.abs(b);
};

// Compares one parsed table (array of records keyed by header) with a JSON
// array of objects. The header is "key [unit]" or "key".
function compareTable(what, records, header, rows, units) {
  check(records.length === rows.length, `${what}: ${records.length} CSV rows vs ${rows.length} JSON rows`);
  for (const col of header) {
    const m = /^(.*?)(?: \[(.*)\])?$/.exec(col);
    const key = m[1], unit = m[2];
    if (unit !== undefined && units && units[key] !== undefined)
      check(units[key] === unit, `${what}: column ${key} unit [${unit}] vs JSON units ${units[key]}`);
    for (let i = 0; i < Math.min(records.length, rows.length); i++) {
      const cell = records[i][col], jv = rows[i][key];
      const a = typeof jv === "number" ? num(cell) : (cell === "" ? null : cell);
      check(same(a, jv), `${what}: row ${i + 1} ${key}: CSV ${cell} vs JSON ${JSON.stringify(jv)}`);
    }
  }
}

// Splits a CSV into its sections (states, processes, summary; an empty line
// between them) and parses each.
function sections(text) {
  const delimiter = comma ? ";" : ",";
  const parts = text.replace(/\r\n/g, "\n").split(/\n\s*\n/).filter((p) => p.trim() !== "");
  return parts.map((p) => {
    const recs = parse(p, { columns: true, skip_empty_lines: true, relax_column_count: false, delimiter });
    const header = parse(p, { to_line: 1, delimiter })[0];
    return { recs, header };
  });
}

// The summary's scalar members: what its CSV row holds.
const summaryRow = (doc) => [Object.fromEntries(Object.entries(doc.summary || {})
  .filter(([, v]) => v === null || typeof v !== "object"))];

const { child, port } = await startServer(serverBin);
const base = `http://127.0.0.1:${port}`;
let code;
try {
  for (const target of requests) {
    for (const [units, dec] of [["si", ""], ["us", ""], ["si", "&decimal=comma"]]) {
      comma = dec !== "";
      const t = `${target}&units=${units}${dec}`;
      const jr = await fetch(`${base}${t}`);
      check(jr.status === 200, `${t}: JSON status ${jr.status}`);
      if (jr.status !== 200) continue;
      const doc = await jr.json();
      const cr = await fetch(`${base}${t}&format=csv`);
      check(cr.status === 200 && /^text\/csv/.test(cr.headers.get("content-type") || ""),
        `${t}: CSV status ${cr.status} type ${cr.headers.get("content-type")}`);
      const secs = sections(await cr.text());
      check(secs.length === 3, `${t}: CSV has ${secs.length} sections, expected states, processes, summary`);
      if (secs.length === 3) {
        compareTable(`${t} states`, secs[0].recs, secs[0].header, doc.states, doc.units);
        compareTable(`${t} processes`, secs[1].recs, secs[1].header, doc.processes, doc.units);
        compareTable(`${t} summary`, secs[2].recs, secs[2].header, summaryRow(doc), doc.units);
      }
      for (const table of ["states", "processes", "summary"]) {
        const r = await fetch(`${base}${t}&format=csv&table=${table}`);
        const s = sections(await r.text());
        check(r.status === 200 && s.length === 1, `${t} table=${table}: status ${r.status}, ${s.length} sections`);
        const rows = table === "summary" ? summaryRow(doc) : doc[table];
        if (s.length === 1) compareTable(`${t} table=${table}`, s[0].recs, s[0].header, rows, doc.units);
      }
    }
  }
} finally {
  code = await stopServer(child);
}
check(code === 0, `server exit code ${code} after SIGTERM`);
console.log(`csv round trip: ${passed} passed, ${failed} failed`);
process.exit(failed === 0 && passed > 0 ? 0 : 1);
