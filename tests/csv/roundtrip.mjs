// tests/csv/roundtrip.mjs — format=csv parsed back by a real CSV parser
// (npm csv-parse, RFC 4180) and compared value by value with the JSON
// response of the same request: for every cycle route, si and us units, the
// states, processes and summary sections (one CSV with all three, separated
// by an empty line, and each with table=states|processes|summary; the
// summary is one header row and one value row of the JSON summary's scalar
// members), and the same with decimal=comma (';' between fields, decimal
// commas); for the machine's correction curves and readings, their row
// tables and one-row sections; the uncertainty and sensitivity tables; and
// the combustion route's per-cycle and trace tables. Also checks the header
// row names each column's unit as the JSON "units" object does. Starts the
// server on a free port
// (--port 0, the port read from its "listening" log line) and stops it by
// its PID (SIGTERM; it must exit 0).
//
// Usage: node tests/csv/roundtrip.mjs [SERVER_BINARY] (default build/gascycled)
import { createRequire } from "node:module";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { readFileSync } from "node:fs";
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

// A plain machine (methane, a simple cycle near 45 MW) for the machine routes.
const MACHINE = "machine.design.pressure_ratio=12&machine.design.turbine_inlet_temperature=1400" +
  "&machine.design.compressor_efficiency=0.87&machine.design.turbine_efficiency=0.89" +
  "&machine.design.net_power=45%20MW&machine.design.fuel=methane&machine.control.igv_minimum_flow_fraction=0.75";
// The combustion-analysis route's tables (the per-cycle table and, with
// include=trace, the ensemble-average trace) for the reference recording
// of tests/reference/heatrel_cycles.csv sent as a text/csv body.
const combustion = "/v1/measured/combustion?bore=0.09&stroke=0.1&connecting_rod_length=0.16" +
  "&compression_ratio=10&gas.model=cold&gas.k=1.35&gas.cp=1.005&include=trace";

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
  "/v1/cycles/brayton?pressure_ratio=18&turbine_inlet_temperature=1650&fuel=methane&cooling.rotor_constant=0.04",
  `/v1/machine/site?${MACHINE}&site.temperature=30%20degC&load.fraction=0.7`,
  "/v1/cycles/combined?topping.cycle=brayton&topping.inputs.pressure_ratio=16&topping.inputs.turbine_inlet_temperature=1500&topping.inputs.compressor_efficiency=0.87&topping.inputs.turbine_efficiency=0.9&topping.inputs.fuel=methane&levels.0.pressure=100%20bar&levels.0.steam_temperature=540%20degC&levels.1.pressure=5%20bar&turbine_efficiency=0.88&deaerator_pressure=2%20bar",
];

// Routes whose CSV is one or more sections that are not states/processes:
// each section is compared with the JSON array (or one-row object) at the
// pointer listed in the same order.
const tableRequests = [
  { target: `/v1/machine/corrections?${MACHINE}&variable=temperature&row_count=6`, sections: ["rows"] },
  { target: `/v1/machine/readings?${MACHINE}&site.temperature=24%20degC&readings.compressor_exit_pressure=1194.2%20kPa` +
      "&readings.compressor_exit_temperature=640.5%20K&readings.exhaust_temperature=842.4%20K&readings.fuel_mass_flow=2.371" +
      "&readings.net_power=42.14%20MW", sections: ["heat_balance", "corrected", "degradation"] },
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

// /v1/uncertainty and /v1/sensitivities: one CSV row per output and input,
// equal to the JSON's outputs and budgets (or its derivative matrices).
const UQ = "cycle=otto&inputs.gas=cold&inputs.compression_ratio=8&inputs.heat_added=1800" +
  "&outputs=/summary/thermal_efficiency,/summary/net_work";
async function budgetTables(base) {
  for (const units of ["si", "us"]) {
    for (const route of ["uncertainty", "sensitivities"]) {
      const t = `/v1/${route}?${UQ}&units=${units}` + (route === "uncertainty"
        ? "&uncertainties.compression_ratio=0.08&uncertainties.gas.k=0.01"
        : "&with_respect_to=compression_ratio,gas.k");
      const doc = await (await fetch(`${base}${t}`)).json();
      const cr = await fetch(`${base}${t}&format=csv`);
      check(cr.status === 200, `${t}: CSV status ${cr.status}`);
      const recs = parse(await cr.text(), { columns: true, skip_empty_lines: true });
      const rows = [];
      if (route === "uncertainty") {
        for (const o of doc.outputs || [])
          for (const b of o.budget)
            rows.push({ output: o.output, output_unit: o.unit, value: o.value,
              standard_uncertainty: o.standard_uncertainty, coverage_factor: o.coverage_factor,
              expanded_uncertainty: o.expanded_uncertainty, input: b.input, input_unit: b.unit,
              input_standard_uncertainty: b.standard_uncertainty, sensitivity: b.sensitivity,
              sensitivity_unit: b.sensitivity_unit, contribution: b.contribution, share: b.share });
      } else {
        (doc.outputs || []).forEach((o, k) => doc.with_respect_to.forEach((w, i) =>
          rows.push({ output: o.output, output_unit: o.unit, output_value: o.value,
            input: w.input, input_unit: w.unit, input_value: w.value,
            sensitivity: doc.sensitivities[k][i], sensitivity_unit: doc.sensitivity_units[k][i],
            elasticity: doc.elasticities[k][i] })));
      }
      compareTable(t, recs, Object.keys(recs[0] || {}), rows, null);
    }
  }
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
  comma = false;   // the tables below are read with the default separator
  for (const { target, sections: names } of tableRequests) {
    for (const units of ["si", "us"]) {
      const t = `${target}&units=${units}`;
      const jr = await fetch(`${base}${t}`);
      check(jr.status === 200, `${t}: JSON status ${jr.status}`);
      if (jr.status !== 200) continue;
      const doc = await jr.json();
      const cr = await fetch(`${base}${t}&format=csv`);
      check(cr.status === 200 && /^text\/csv/.test(cr.headers.get("content-type") || ""),
        `${t}: CSV status ${cr.status}`);
      const secs = sections(await cr.text());
      check(secs.length === names.length, `${t}: CSV has ${secs.length} sections, expected ${names.length}`);
      names.forEach((name, k) => {
        if (!secs[k]) return;
        const rows = Array.isArray(doc[name]) ? doc[name] : [doc[name]];
        compareTable(`${t} ${name}`, secs[k].recs, secs[k].header, rows, doc.units);
      });
    }
  }
  await budgetTables(base);
  const recording = readFileSync(join(repo, "tests/reference/heatrel_cycles.csv"));
  for (const units of ["si", "us"]) {
    const t = `${combustion}&units=${units}`;
    const post = (q) => fetch(`${base}${q}`, { method: "POST", body: recording,
      headers: { "Content-Type": "text/csv" } });
    const jr = await post(t);
    check(jr.status === 200, `${t}: JSON status ${jr.status}`);
    if (jr.status !== 200) continue;
    const doc = await jr.json();
    const cr = await post(`${t}&format=csv`);
    check(cr.status === 200 && /^text\/csv/.test(cr.headers.get("content-type") || ""),
      `${t}: CSV status ${cr.status}`);
    const secs = sections(await cr.text());
    check(secs.length === 2, `${t}: CSV has ${secs.length} sections, expected cycles and trace`);
    if (secs.length === 2) {
      compareTable(`${t} cycles`, secs[0].recs, secs[0].header, doc.cycles, doc.units);
      compareTable(`${t} trace`, secs[1].recs, secs[1].header, doc.trace, doc.units);
    }
  }
} finally {
  code = await stopServer(child);
}
check(code === 0, `server exit code ${code} after SIGTERM`);
console.log(`csv round trip: ${passed} passed, ${failed} failed`);
process.exit(failed === 0 && passed > 0 ? 0 : 1);
