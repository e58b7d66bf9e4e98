// tests/browser/demo.mjs — the demo page (GET /) in Debian's headless
// Chromium, driven by playwright-core (tests/node). Starts the server on a
// free port (--port 0, the port read from its "listening" log line) and
// stops it by its PID (SIGTERM; it must exit 0). No request may leave the
// service and the page must log no errors.
//
// Scenes, each with its checks and a screenshot under tests/artifacts/
// (git-ignored):
//   demo-initial.png   before any evaluation: no broken-image placeholder
//                      (every <img> hidden or loaded, the figures hidden)
//   demo.png           Test cell 3 (Otto) through the form: summary, state
//                      table, both diagrams loaded with their state markers,
//                      the shown efficiency equal to the JSON response's
//   demo-quillmere-unit-1.png   Quillmere unit 1: the page's request is the
//                      OpenAPI example, the README's body is that example
//                      too, and the figures shown equal the route's answer
//                      to that example and the README's (38.0 %, 9,712 kJ/kWh)
//   demo-diagrams.png  the unit's diagrams: no two state numbers overlap
//                      (text boxes measured in the page)
//   demo-us.png        US units: inputs labelled and converted (°F, ft, kW),
//                      the same efficiency, Btu/kWh and °F in the results
//   demo-error.png     a refused input: the previous results are cleared
//                      (no summary, no state table, no diagram), the field
//                      marked
//   demo-log.png       logarithmic P-v axes: tick labels as engineers read
//                      them ("10 000"), never "1e+04"
//   demo-machine.png, demo-uncertainty.png, demo-heat-release.png,
//   demo-combined.png  the four capability panels: the page's own POST (taken
//                      from the browser's request events) is sent again from
//                      node and every figure shown must agree with that JSON
//                      within half the last digit shown; cautions and the
//                      curl request shown; every diagram loaded
//                      (naturalWidth > 0). Checks against the world beside
//                      them: the README's figures (40.68 MW, 10,019 kJ/kWh;
//                      0.8598 +- 0.0079; 66.95 MW, 54.7 %), 80 % load = 0.8
//                      of base, GT + ST - pumps = net, the machine_site
//                      topping's GT share = the machine route's output, and
//                      the synthetic recording's fitted polytropic exponents
//                      = the 1.36 / 1.28 it was generated with (pV^k const
//                      where dQ = 0, first law of a closed system)
//   demo-<panel>-error.png  a bad value per panel: the message naming its
//                      field (JSON pointer) appears, old figures, tables,
//                      diagrams and request link gone
//   demo-panels-us.png US units on two panels: 35 degC shown as 95 °F and
//                      sent as "95 degF", Btu/kWh = kJ/kWh / 1.05505585262,
//                      IMEP in psi, bore in inches (25.4 mm, exact)
//
// Usage: node tests/browser/demo.mjs [SERVER_BINARY] (default build/gascycled)
import { mkdtempSync, mkdirSync, readFileSync, rmSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { isDeepStrictEqual } from "node:util";
import { startServer, stopServer } from "../lib/server.mjs";

const here = dirname(fileURLToPath(import.meta.url));
const repo = resolve(here, "../..");
const require = createRequire(join(repo, "tests/node/package.json"));
const { chromium } = require("playwright-core");

const serverBin = resolve(repo, process.argv[2] || "build/gascycled");
const artifacts = join(repo, "tests/artifacts");
const started = Date.now();
const failures = [];
const check = (ok, what) => {
  console.log(`${ok ? "ok  " : "FAIL"} ${what}`);
  if (!ok) failures.push(what);
};
const near = (a, b, rel) => Math.abs(a - b) <= rel * Math.abs(b);
const number = (text) => parseFloat(String(text).replace(/[^0-9.\-]/g, ""));

/* The README's Quillmere unit 1 request body (the JSON after -d in its curl). */
function readmeUnit1() {
  const md = readFileSync(join(repo, "README.md"), "utf8");
  const at = md.indexOf("/v1/cycles/brayton' -H 'Content-Type: application/json' -d '{");
  if (at < 0) return null;
  const start = md.indexOf("{", at);
  const end = md.indexOf("}'", start);
  return { body: JSON.parse(md.slice(start, end + 1)), text: md };
}

const { child, port } = await startServer(serverBin);
const base = `http://127.0.0.1:${port}`;
const profile = mkdtempSync(join(tmpdir(), "gascycled-chromium-"));
let context, page;
const shot = async (name, el) => {
  mkdirSync(artifacts, { recursive: true });
  await (el || page).screenshot({ path: join(artifacts, name), ...(el ? {} : { fullPage: true }) });
  console.log(`     screenshot: tests/artifacts/${name}`);
};
let expectError = false;   // the error scene's own request answers 422 on purpose

async function waitEvaluated() {
  await page.waitForFunction(() => document.getElementById("summary").dataset.ready === "1" ||
    document.getElementById("status").classList.contains("error"), null, { timeout: 20000 });
}

async function waitDiagrams() {
  for (const id of ["img-ts", "img-pv"])
    await page.waitForFunction((i) => ["loaded", "failed"].includes(document.getElementById(i).dataset.state),
      id, { timeout: 20000 });
}

async function evaluateForm() {
  await page.evaluate(() => { document.getElementById("summary").dataset.ready = ""; });
  await page.click("#run");
  await waitEvaluated();
}

/* The figure the page shows for a JSON pointer (its number), or NaN. */
async function shown(ptr) {
  const dd = page.locator(`#summary dd[data-pointer="${ptr}"]`);
  return (await dd.count()) === 1 ? number(await dd.innerText()) : NaN;
}

async function sceneInitial() {
  const resp = await page.goto(base + "/", { waitUntil: "load" });
  check(resp && resp.status() === 200, "GET / answers 200");
  check((resp.headers()["content-type"] || "").startsWith("text/html"), "GET / is text/html");
  await page.waitForFunction(() => !document.getElementById("preset").disabled ||
    document.getElementById("status").classList.contains("error"), null, { timeout: 20000 });
  const options = await page.locator("#preset option").allInnerTexts();
  console.log("     demo units offered:", options.join(" | "));
  check(options.includes("Quillmere unit 1 (Brayton)"), "Quillmere unit 1 is offered");
  const imgs = await page.evaluate(() => [...document.querySelectorAll("img")].map((i) => ({
    id: i.id, visible: i.getClientRects().length > 0, src: i.getAttribute("src"),
    loaded: i.complete && i.naturalWidth > 0,
  })));
  check(imgs.every((i) => !i.visible || i.loaded), `no broken-image placeholder before the first evaluation ${JSON.stringify(imgs)}`);
  check(await page.locator("#fig-ts").isHidden() && await page.locator("#fig-pv").isHidden(),
    "the diagram frames are hidden before the first evaluation");
  await shot("demo-initial.png");
}

async function sceneOtto() {
  await page.selectOption("#preset", "otto");
  const first = page.locator("#fields input[type=text]").first();
  const v = await first.inputValue();
  await first.fill("");
  await first.type(v);
  await page.evaluate(() => { document.getElementById("summary").dataset.ready = ""; });
  await first.press("Enter");
  await waitEvaluated();
  check(await page.locator("#summary").getAttribute("data-ready") === "1", "Test cell 3 evaluation succeeded");
  const jsonUrl = await page.locator("#links a").first().getAttribute("href");
  const doc = await page.evaluate(async (u) => (await fetch(u)).json(), jsonUrl);
  const eff = await shown("/summary/thermal_efficiency");
  check(Math.abs(eff - doc.summary.thermal_efficiency * 100) <= 0.051,
    `shown efficiency ${eff} % = JSON ${(doc.summary.thermal_efficiency * 100).toFixed(3)} %`);
  check(await page.locator("#state-table tbody tr").count() >= 3, "state table shown");
  await waitDiagrams();
  for (const id of ["img-ts", "img-pv"]) {
    const info = await page.evaluate(async (i) => {
      const img = document.getElementById(i);
      const text = await (await fetch(img.src)).text();
      const svg = new DOMParser().parseFromString(text, "image/svg+xml");
      return { state: img.dataset.state, w: img.naturalWidth, shownW: img.getBoundingClientRect().width,
               parseError: svg.getElementsByTagName("parsererror").length,
               markers: svg.querySelectorAll(".gc-state").length, actual: svg.querySelectorAll(".gc-actual").length };
    }, id);
    check(info.state === "loaded" && info.w > 0 && info.shownW > 100, `${id} loaded with a size`);
    check(info.parseError === 0 && info.actual === 1 && info.markers >= 3, `${id} SVG has the cycle and ${info.markers} state markers`);
  }
  await shot("demo.png");
}

async function sceneUnit1() {
  await page.selectOption("#preset", "brayton-1");
  const openapi = await (await fetch(base + "/openapi.json")).json();
  const example = openapi.paths["/v1/cycles/brayton"].post.requestBody.content["application/json"]
    .examples.quillmere_unit_1.value;
  const readme = readmeUnit1();
  check(readme && isDeepStrictEqual(readme.body, example),
    "the README's Quillmere unit 1 body is the OpenAPI example quillmere_unit_1 (one definition)");
  await evaluateForm();
  const jsonUrl = await page.locator("#links a").first().getAttribute("href");
  const params = new URL(jsonUrl, base).searchParams;
  check(params.get("fuel.analysis.CH4") === String(example.fuel.analysis.CH4) &&
        params.get("combustor_pressure_loss") === String(example.combustor_pressure_loss),
    "the page's request carries the example's fuel and losses");
  const want = await (await fetch(base + "/v1/cycles/brayton", { method: "POST",
    headers: { "Content-Type": "application/json" }, body: JSON.stringify(example) })).json();
  const eff = await shown("/summary/thermal_efficiency");
  const hr = await shown("/plant/heat_rate");
  check(Math.abs(eff - want.summary.thermal_efficiency * 100) <= 0.051,
    `unit 1 efficiency shown ${eff} % = the example's ${(want.summary.thermal_efficiency * 100).toFixed(2)} %`);
  check(near(hr, want.plant.heat_rate, 1e-4), `unit 1 heat rate shown ${hr} = the example's ${want.plant.heat_rate}`);
  const readmeHr = readme && /heat rate on LHV and HHV \(([0-9,]+) and/.exec(readme.text.replace(/\s+/g, " "));
  check(readmeHr && Math.round(want.plant.heat_rate) === number(readmeHr[1]),
    `the README's unit 1 heat rate ${readmeHr && readmeHr[1]} kJ/kWh is the route's`);
  const effText = await page.locator('#summary dd[data-pointer="/summary/thermal_efficiency"]').innerText();
  const readmeEff = readme && /thermal efficiency of ([0-9.]+) \(([0-9.]+) %\)/.exec(readme.text.replace(/\s+/g, " "));
  check(readmeEff && near(Number(readmeEff[1]), want.summary.thermal_efficiency, 2e-3) &&
        effText === readmeEff[2] + " %",
    `unit 1 shows "${effText}", the README's ${readmeEff && readmeEff[2]} % (the route's ${want.summary.thermal_efficiency})`);
  await waitDiagrams();
  await shot("demo-quillmere-unit-1.png");
  return want;
}

async function sceneLabels() {
  for (const id of ["img-ts", "img-pv"]) {
    const r = await page.evaluate(async (i) => {
      const text = await (await fetch(document.getElementById(i).src)).text();
      const holder = document.createElement("div");
      holder.style.cssText = "position:absolute;left:-5000px;top:0";
      holder.innerHTML = text;
      document.body.appendChild(holder);
      const boxes = [...holder.querySelectorAll(".gc-state text")].map((t) => {
        const b = t.getBBox();
        return { n: t.textContent, x0: b.x, y0: b.y, x1: b.x + b.width, y1: b.y + b.height };
      });
      holder.remove();
      const clashes = [];
      for (let a = 0; a < boxes.length; a++)
        for (let b = a + 1; b < boxes.length; b++) {
          const w = Math.min(boxes[a].x1, boxes[b].x1) - Math.max(boxes[a].x0, boxes[b].x0);
          const h = Math.min(boxes[a].y1, boxes[b].y1) - Math.max(boxes[a].y0, boxes[b].y0);
          if (w > 0.5 && h > 0.5) clashes.push(boxes[a].n + "/" + boxes[b].n);
        }
      return { n: boxes.length, clashes };
    }, id);
    check(r.n >= 4 && r.clashes.length === 0,
      `${id}: ${r.n} state numbers, none overlapping${r.clashes.length ? " (" + r.clashes.join(", ") + ")" : ""}`);
  }
  await shot("demo-diagrams.png", page.locator("#panel-cycles .diagrams"));
}

async function sceneUs(siWant) {
  await page.selectOption("#units", "us");
  const label = async (key) => page.locator(`#f-${key.replace(".", "\\.")}-unit`).innerText();
  check(await label("turbine_inlet_temperature") === "[°F]", "US: the firing temperature is labelled °F");
  check(await label("site.altitude") === "[ft]", "US: the altitude is labelled ft");
  check(await label("net_power") === "[kW]", "US: the net power is labelled kW");
  const tit = Number(await page.inputValue("#f-turbine_inlet_temperature"));
  const alt = Number(await page.inputValue("#f-site\\.altitude"));
  check(near(tit, 1480 * 1.8 - 459.67, 1e-6), `US: 1480 K shown as ${tit} °F (NIST SP 811 B.8)`);
  check(near(alt, 320 / 0.3048, 1e-6), `US: 320 m shown as ${alt} ft (0.3048 m per ft, exact)`);
  check(await page.locator("#summary dd").count() === 0, "US: switching clears the SI results");
  await evaluateForm();
  const eff = await shown("/summary/thermal_efficiency");
  check(Math.abs(eff - siWant.summary.thermal_efficiency * 100) <= 0.051, `US: the same efficiency (${eff} %)`);
  const hrText = await page.locator('#summary dd[data-pointer="/plant/heat_rate"]').innerText();
  check(/Btu\/kWh$/.test(hrText) && near(number(hrText), siWant.plant.heat_rate / 1.05505585262, 2e-4),
    `US: heat rate ${hrText} (kJ/kWh / 1.05505585262, NIST SP 811 B.8 Btu_IT)`);
  const exText = await page.locator('#summary dd[data-pointer="/plant/exhaust_temperature"]').innerText();
  check(/°F$/.test(exText), `US: exhaust temperature in °F (${exText})`);
  const thT = await page.locator("#state-table thead th").nth(1).innerText();
  check(thT === "T [R]", `US: the state table's T in R (${thT})`);
  await waitDiagrams();
  await shot("demo-us.png");
  await page.selectOption("#units", "si");
}

async function sceneError() {
  await evaluateForm();
  check(await page.locator("#summary dd").count() > 0, "error scene starts from a result");
  expectError = true;
  await page.fill("#f-pressure_ratio", "0.5");
  await evaluateForm();
  expectError = false;
  check(await page.locator("#status").getAttribute("class") === "error", "the refusal is shown");
  check(await page.locator("#f-pressure_ratio").getAttribute("aria-invalid") === "true", "the refused input is marked");
  check(await page.locator("#summary dd").count() === 0, "after an error: no summary figures left");
  check(await page.locator("#state-table").count() === 0, "after an error: no state table left");
  check(await page.locator("#fig-ts").isHidden() && await page.locator("#fig-pv").isHidden() &&
        await page.locator("img[src]").count() === 0, "after an error: no diagram left");
  check(await page.locator("#links a").count() === 0, "after an error: no links to the old result");
  await shot("demo-error.png");
  await page.fill("#f-pressure_ratio", "15.5");
}

async function sceneLog() {
  await page.selectOption("#preset", "otto");
  await page.check("#pv-log");
  await evaluateForm();
  await waitDiagrams();
  const ticks = await page.evaluate(async () => {
    const text = await (await fetch(document.getElementById("img-pv").src)).text();
    const svg = new DOMParser().parseFromString(text, "image/svg+xml");
    return [...svg.querySelectorAll(".gc-ticks-x text, .gc-ticks-y text")].map((t) => t.textContent);
  });
  console.log("     log P-v tick labels:", ticks.join(" | "));
  check(ticks.length >= 4 && ticks.every((t) => !/\de[+-]?\d/i.test(t)), "log axes: no tick label in e-notation");
  check(ticks.some((t) => /^\d{1,3}(\u2009\d{3})+$/.test(t)), "log axes: a grouped label such as 10 000");
  await shot("demo-log.png", page.locator("#fig-pv"));
  await page.uncheck("#pv-log");
}

/* ---- the four capability panels ---- */

/* The last POST the page sent to each path: { url, body, ctype } (from the
   browser's own request events, so a replay is the very same request). */
const sent = new Map();

/* The same request sent again from node: the JSON the route answers. */
async function replay(path) {
  const r = sent.get(path);
  const resp = await fetch(r.url, { method: "POST", headers: { "Content-Type": r.ctype }, body: r.body });
  return resp.json();
}

/* "1,143.6 kPa" agrees with 1143.6371 when they differ by at most half the
   last digit shown (the page's rounding), "5.34 %" with 0.053433 as a
   percentage. */
function parseShown(text) {
  const m = /-?\d[\d,]*(\.\d+)?(e[-+]?\d+)?/i.exec(String(text));
  if (!m) return { x: NaN, dec: 0 };
  const dec = m[2] ? Number(m[1] ? m[1].length - 1 : 0) - Number(m[2].slice(1)) : (m[1] ? m[1].length - 1 : 0);
  return { x: Number(m[0].replace(/,/g, "")), dec };
}
function agrees(text, want, pct) {
  const { x, dec } = parseShown(text);
  const w = pct ? want * 100 : want;
  return typeof want === "number" && Math.abs(x - w) <= 0.5 * 10 ** -dec + 1e-9 * Math.abs(w);
}

async function panelText(id, ptr) {
  const dd = page.locator(`#panel-${id} [data-pointer="${ptr}"]`);
  return (await dd.count()) === 1 ? dd.innerText() : "";
}

async function panelRun(id) {
  await page.evaluate((i) => { document.getElementById(i + "-figures").dataset.ready = ""; }, id);
  await page.click(`#${id}-run`);
  await page.waitForFunction((i) => document.getElementById(i + "-figures").dataset.ready === "1" ||
    document.getElementById(i + "-status").classList.contains("error"), id, { timeout: 30000 });
}

async function panelDiagrams(id) {
  await page.waitForFunction((i) => [...document.querySelectorAll(`#panel-${i} img`)]
    .every((im) => ["loaded", "failed"].includes(im.dataset.state)), id, { timeout: 30000 });
  const imgs = await page.evaluate((i) => [...document.querySelectorAll(`#panel-${i} img`)].map((im) => ({
    id: im.id, state: im.dataset.state, w: im.naturalWidth, shownW: im.getBoundingClientRect().width })), id);
  for (const im of imgs)
    check(im.state === "loaded" && im.w > 0 && im.shownW > 100, `${im.id} loaded (naturalWidth ${im.w})`);
}

/* Figures shown = the replayed answer, pointer by pointer. */
async function compareFigures(id, want, list) {
  for (const [ptr, pct] of list) {
    const text = await panelText(id, ptr);
    const w = (() => { let c = want; for (const k of ptr.split("/").slice(1)) c = c == null ? c : c[k]; return c; })();
    check(agrees(text, w, pct), `${id}: ${ptr} shown "${text}" = JSON ${w}${pct ? " (as %)" : ""}`);
  }
}

async function checkCautions(id, want) {
  const shownC = await page.locator(`#${id}-cautions li`).allInnerTexts();
  check(want.cautions.length > 0 && isDeepStrictEqual(shownC, want.cautions),
    `${id}: the ${shownC.length} cautions of the answer are shown`);
  const details = page.locator(`#${id}-curl`);
  const curl = await page.locator(`#${id}-curl-text`).textContent();
  check(await details.count() === 1 && curl.startsWith("curl -X POST '" + base), `${id}: the exact request is offered as curl`);
}

/* A refused value: its message naming the field appears, old figures go. */
async function panelError(id, selector, bad, field) {
  check(await page.locator(`#${id}-figures dd, #panel-${id} td`).count() > 0, `${id}: the error scene starts from a result`);
  const old = await page.inputValue(selector);
  await page.fill(selector, bad);
  expectError = true;
  await panelRun(id);
  expectError = false;
  const problems = await page.locator(`#${id}-problems li`).allInnerTexts();
  check(await page.locator(`#${id}-status`).getAttribute("class") === "pstatus error", `${id}: the refusal is shown`);
  check(problems.some((p) => p.startsWith(field + ": ")), `${id}: "${bad}" refused, message naming ${field}: ${problems.join(" / ")}`);
  check(await page.locator(selector).getAttribute("aria-invalid") === "true", `${id}: the refused input is marked`);
  check(await page.locator(`#${id}-figures dd`).count() === 0 && await page.locator(`#panel-${id} td`).count() === 0,
    `${id}: after an error no figures or tables left`);
  check(await page.locator(`#panel-${id} img[src]`).count() === 0 && await page.locator(`#panel-${id} figure:not([hidden])`).count() === 0,
    `${id}: after an error no diagram left`);
  check(await page.locator(`#${id}-curl`).count() === 0 && await page.locator(`#${id}-cautions li`).count() === 0,
    `${id}: after an error no request link or cautions of the old result`);
  await shot(`demo-${id}-error.png`);
  await page.fill(selector, old);
}

/* The JSON body after "-d '" of the README's curl to a route. */
function readmeBody(route) {
  const md = readFileSync(join(repo, "README.md"), "utf8");
  const at = md.indexOf(route + "' -H 'Content-Type: application/json' -d '{");
  if (at < 0) return null;
  const start = md.indexOf("{", at);
  return { body: JSON.parse(md.slice(start, md.indexOf("}'", start) + 1)), text: md.replace(/\s+/g, " ") };
}

const fid = (id, key) => `#${id}-f-${key.replace(/\./g, "\\.")}`;

async function sceneMachine() {
  await page.click("#tab-machine");
  await panelRun("machine");
  check(await page.locator("#machine-figures").getAttribute("data-ready") === "1", "machine: evaluated");
  const req = JSON.parse(sent.get("/v1/machine/site").body);
  const readme = readmeBody("/v1/machine/site");
  check(readme && isDeepStrictEqual(req.machine, readme.body.machine), "machine: the page sends the README's Quillmere unit 1 machine");
  check(parseFloat(req.site.temperature) === 308.15 && req.site.relative_humidity === "60 %",
    `machine: ambient as the README's 35 degC, 60 % (sent ${req.site.temperature}, ${req.site.relative_humidity})`);
  const want = await replay("/v1/machine/site");
  await compareFigures("machine", want, [["/performance/net_power"], ["/performance/heat_rate"], ["/performance/thermal_efficiency", true],
    ["/performance/exhaust_mass_flow"], ["/performance/exhaust_temperature"], ["/performance/firing_temperature"]]);
  const limit = await panelText("machine", "/performance/active_limit");
  check(limit === want.performance.active_limit.replace(/_/g, " "), `machine: active limit "${limit}" = JSON ${want.performance.active_limit}`);
  // The README's figures for this request: 40.68 MW at 10,019 kJ/kWh, 855.5 K.
  const m = readme && /gives ([0-9.]+) MW at ([0-9,]+) kJ\/kWh \(LHV/.exec(readme.text);
  check(m && (want.performance.net_power / 1000).toFixed(2) === m[1] && Math.round(want.performance.heat_rate) === number(m[2]),
    `machine: the README's ${m && m[1]} MW at ${m && m[2]} kJ/kWh are the route's (${want.performance.net_power} kW, ${want.performance.heat_rate})`);
  await checkCautions("machine", want);
  await panelDiagrams("machine");
  await shot("demo-machine.png");
  // Part load with an evaporative cooler: the request carries them, the figures follow.
  await page.selectOption("#machine-load-mode", "fraction");
  await page.fill(fid("machine", "load.fraction"), "80");
  await page.selectOption("#machine-inlet-treatment", "evaporative_cooler");
  await panelRun("machine");
  const req2 = JSON.parse(sent.get("/v1/machine/site").body);
  check(req2.load && req2.load.fraction === "80 %" && req2.inlet && req2.inlet.treatment === "evaporative_cooler",
    `machine: 80 % load and the evaporative cooler sent (${JSON.stringify(req2.load)}, ${JSON.stringify(req2.inlet)})`);
  const want2 = await replay("/v1/machine/site");
  await compareFigures("machine", want2, [["/performance/net_power"], ["/performance/load_fraction", true], ["/performance/heat_rate"]]);
  check(Math.abs(want2.performance.net_power - 0.8 * want2.performance.base_net_power) <= 1e-6 * want2.performance.base_net_power,
    `machine: 80 % load is 0.8 of that day's base load (${want2.performance.net_power} of ${want2.performance.base_net_power} kW)`);
  await page.selectOption("#machine-load-mode", "base");
  await page.selectOption("#machine-inlet-treatment", "none");
  await panelRun("machine");
  await panelError("machine", fid("machine", "site.temperature"), "700", "/site/temperature");
  return want;
}

async function sceneUncertainty() {
  await page.click("#tab-uncert");
  await panelRun("uncert");
  const want = await replay("/v1/uncertainty");
  check(want.outputs && want.outputs.length === 3, "uncertainty: three outputs");
  for (let i = 0; i < want.outputs.length; i++) {
    await compareFigures("uncert", want, [[`/outputs/${i}/value`], [`/outputs/${i}/standard_uncertainty`],
      [`/outputs/${i}/expanded_uncertainty`], [`/outputs/${i}/coverage_factor`]]);
    const iv = await panelText("uncert", `/outputs/${i}/interval`);
    const [lo, hi] = iv.split("..");
    check(agrees(lo, want.outputs[i].interval[0]) && agrees(hi, want.outputs[i].interval[1]),
      `uncertainty: interval ${i} "${iv}" = JSON ${want.outputs[i].interval.join(" .. ")}`);
    const shares = await page.locator(`#uncert-budget-${i} td[data-pointer$="/share"]`).allInnerTexts();
    check(shares.length === want.outputs[i].budget.length &&
          shares.every((s, j) => agrees(s, want.outputs[i].budget[j].share, true)),
      `uncertainty: budget ${i} shares ${shares.slice(0, 3).join(", ")} ... = JSON`);
  }
  // The README: compressor efficiency 0.8598, U = 0.0079; plant heat rate 10,165, U = 114.
  const o = want.outputs;
  check(o[0].value.toFixed(4) === "0.8598" && o[0].expanded_uncertainty.toFixed(4) === "0.0079" &&
        Math.round(o[2].value) === 10165 && Math.round(o[2].expanded_uncertainty) === 114,
    `uncertainty: the README's figures (0.8598 +- 0.0079, 10,165 +- 114 kJ/kWh) are the route's`);
  await checkCautions("uncert", want);
  await panelDiagrams("uncert");
  await shot("demo-uncertainty.png");
  // A larger exhaust-temperature uncertainty: sent as typed with its unit, the
  // gas-path efficiency's U grows (it carries 31 % of that variance).
  await page.fill(fid("uncert", "uncertainties.turbine_outlet.T"), "4");
  await panelRun("uncert");
  const req2 = JSON.parse(sent.get("/v1/uncertainty").body);
  const want2 = await replay("/v1/uncertainty");
  check(req2.uncertainties.turbine_outlet.T === "4 K", `uncertainty: the edited value is sent as "${req2.uncertainties.turbine_outlet.T}"`);
  await compareFigures("uncert", want2, [["/outputs/1/expanded_uncertainty"]]);
  check(want2.outputs[1].expanded_uncertainty > o[1].expanded_uncertainty,
    `uncertainty: U of the efficiency grows with u(T exhaust) 2 -> 4 K (${o[1].expanded_uncertainty} -> ${want2.outputs[1].expanded_uncertainty})`);
  await page.fill(fid("uncert", "uncertainties.turbine_outlet.T"), "2");
  await panelError("uncert", fid("uncert", "uncertainties.compressor_inlet.T"), "-1", "/uncertainties/compressor_inlet/T");
}

async function sceneHeatRelease() {
  await page.click("#tab-heatrel");
  const note = await page.locator("#heatrel-synthetic-note").innerText();
  check(/synthetic/i.test(note) && /not a measurement/i.test(note), "heat release: the page says the built-in recording is synthetic");
  await panelRun("heatrel");
  const r = sent.get("/v1/measured/combustion");
  check(r && r.ctype.startsWith("text/csv") && /^# Synthetic/.test(r.body), "heat release: the recording goes as a text/csv body");
  const want = await replay("/v1/measured/combustion");
  await compareFigures("heatrel", want, [["/statistics/imep_net_mean"], ["/statistics/imep_net_cov", true], ["/statistics/ca10_mean"],
    ["/statistics/ca50_mean"], ["/statistics/ca90_mean"], ["/statistics/peak_pressure_mean"], ["/statistics/peak_pressure_angle_mean"]]);
  // The generator's compression (before the burn) and expansion (after it)
  // are pV^k = const with k = 1.36 and 1.28 (first law of a closed system,
  // dQ = 0): the route's fitted polytropic exponents must find them.
  const s = want.statistics;
  check(Math.abs(s.n_compression_mean - 1.36) <= 0.005 && Math.abs(s.n_expansion_mean - 1.28) <= 0.005,
    `heat release: fitted exponents ${s.n_compression_mean.toFixed(4)} / ${s.n_expansion_mean.toFixed(4)} = the generator's 1.36 / 1.28 (+-0.005)`);
  check(s.cycles === 10 && s.misfires === 0 && s.ca10_mean < s.ca50_mean && s.ca50_mean < s.ca90_mean,
    `heat release: 10 cycles, no misfire, CA10 < CA50 < CA90 (${s.ca10_mean.toFixed(1)}, ${s.ca50_mean.toFixed(1)}, ${s.ca90_mean.toFixed(1)})`);
  await checkCautions("heatrel", want);
  await panelDiagrams("heatrel");
  await shot("demo-heat-release.png");
  // A user's file: the first four cycles in kPa, ';'-separated.
  const rows = r.body.split("\n").filter((l) => l && !l.startsWith("#"));
  const user = rows.map((l, i) => {
    const c = l.split(",").slice(0, 5);
    return i === 0 ? "angle [deg];" + ["a", "b", "c", "d"].map((n) => n + " [kPa]").join(";")
      : c[0] + ";" + c.slice(1).map((v) => (Number(v) * 100).toFixed(3)).join(";");
  }).join("\n") + "\n";
  await page.selectOption("#heatrel-source", "file");
  await page.setInputFiles("#heatrel-file", { name: "cell3-user.csv", mimeType: "text/csv", buffer: Buffer.from(user) });
  await panelRun("heatrel");
  check(sent.get("/v1/measured/combustion").body === user, "heat release: the chosen file is the body sent");
  const want2 = await replay("/v1/measured/combustion");
  check(want2.statistics && want2.statistics.cycles === 4, "heat release: the file's four cycles analysed");
  await compareFigures("heatrel", want2, [["/statistics/imep_net_mean"], ["/statistics/ca50_mean"], ["/statistics/cycles"]]);
  await panelDiagrams("heatrel");
  await page.selectOption("#heatrel-source", "synthetic");
  await panelRun("heatrel");
  await panelError("heatrel", fid("heatrel", "bore"), "-79", "/bore");
}

async function sceneCombined(machineWant) {
  await page.click("#tab-combined");
  await panelRun("combined");
  const req = JSON.parse(sent.get("/v1/cycles/combined").body);
  const openapi = await (await fetch(base + "/openapi.json")).json();
  const unit1 = openapi.paths["/v1/cycles/brayton"].post.requestBody.content["application/json"].examples.quillmere_unit_1.value;
  check(req.topping.cycle === "brayton" && isDeepStrictEqual(req.topping.inputs, { ...unit1, exhaust_pressure_loss: 0.03 }),
    "combined: the topping is the unit 1 example with exhaust_pressure_loss 0.03 (the README's)");
  check(parseFloat(req.levels[0].pressure) === 7500 && parseFloat(req.levels[1].pressure) === 450 && parseFloat(req.levels[0].pinch) === 10,
    `combined: levels as the README's 75 bar and 4.5 bar, pinch 10 K (sent ${req.levels[0].pressure}, ${req.levels[1].pressure}, ${req.levels[0].pinch})`);
  const want = await replay("/v1/cycles/combined");
  await compareFigures("combined", want, [["/summary/net_power"], ["/summary/thermal_efficiency", true], ["/summary/heat_rate"],
    ["/summary/gas_turbine_power"], ["/summary/steam_turbine_power"], ["/summary/pump_power"], ["/summary/stack_temperature"]]);
  const sm = want.summary;
  check(Math.abs(sm.gas_turbine_power + sm.steam_turbine_power - sm.pump_power - sm.net_power) <= 1e-6 * sm.net_power,
    `combined: GT + ST - pumps = net (${sm.gas_turbine_power} + ${sm.steam_turbine_power} - ${sm.pump_power} = ${sm.net_power} kW)`);
  check((sm.net_power / 1000).toFixed(2) === "66.95" && (sm.thermal_efficiency * 100).toFixed(1) === "54.7" &&
        Math.round(sm.heat_rate) === 6581 && sm.stack_temperature.toFixed(1) === "409.6",
    "combined: the README's 66.95 MW, 54.7 %, 6,581 kJ/kWh, stack 409.6 K are the route's");
  await checkCautions("combined", want);
  await panelDiagrams("combined");
  await shot("demo-combined.png");
  // The machine at site conditions as the topping: its share is the machine route's output.
  await page.selectOption("#combined-topping", "machine_site");
  await panelRun("combined");
  const req2 = JSON.parse(sent.get("/v1/cycles/combined").body);
  const readme = readmeBody("/v1/machine/site");
  check(req2.topping.cycle === "machine_site" && isDeepStrictEqual(req2.topping.inputs, readme.body),
    "combined: the machine_site topping is the README's machine request");
  const want2 = await replay("/v1/cycles/combined");
  await compareFigures("combined", want2, [["/summary/net_power"], ["/summary/gas_turbine_power"], ["/summary/thermal_efficiency", true]]);
  check(Math.abs(want2.summary.gas_turbine_power - machineWant.performance.net_power) <= 1e-6 * machineWant.performance.net_power,
    `combined: GT share ${want2.summary.gas_turbine_power} kW = the machine panel's ${machineWant.performance.net_power} kW`);
  await panelDiagrams("combined");
  await page.selectOption("#combined-topping", "brayton");
  await panelRun("combined");
  await panelError("combined", fid("combined", "levels.0.pressure"), "750 bar", "/levels/0/pressure");
}

/* US units on two panels: labels, values sent with their unit, results in US units. */
async function scenePanelsUs(machineSi) {
  await page.selectOption("#units", "us");
  await page.click("#tab-machine");
  const unitT = await page.locator(fid("machine", "site.temperature") + "-unit").innerText();
  const t = Number(await page.inputValue(fid("machine", "site.temperature")));
  check(unitT === "[°F]" && near(t, 308.15 * 1.8 - 459.67, 1e-6), `US: ambient labelled ${unitT}, 35 degC shown as ${t} (NIST SP 811 B.8)`);
  check(await page.locator("#machine-figures dd").count() === 0, "US: switching clears the panel's SI results");
  await panelRun("machine");
  const req = JSON.parse(sent.get("/v1/machine/site").body);
  check(req.site.temperature === t + " degF", `US: the ambient is sent as "${req.site.temperature}"`);
  const want = await replay("/v1/machine/site");
  await compareFigures("machine", want, [["/performance/net_power"], ["/performance/heat_rate"], ["/performance/exhaust_temperature"]]);
  const hr = await panelText("machine", "/performance/heat_rate");
  check(/Btu\/kWh$/.test(hr) && agrees(hr, machineSi.performance.heat_rate / 1.05505585262),
    `US: machine heat rate ${hr} = SI ${machineSi.performance.heat_rate} kJ/kWh / 1.05505585262 (NIST SP 811 B.8 Btu_IT)`);
  await page.click("#tab-heatrel");
  await panelRun("heatrel");
  const wantH = await replay("/v1/measured/combustion");
  const imep = await panelText("heatrel", "/statistics/imep_net_mean");
  check(/psi/.test(imep) && agrees(imep, wantH.statistics.imep_net_mean), `US: IMEP ${imep} = JSON ${wantH.statistics.imep_net_mean}`);
  const bore = await page.inputValue(fid("heatrel", "bore"));
  check(near(Number(bore), 79 / 25.4, 1e-6), `US: bore 79 mm shown as ${bore} in (25.4 mm per in, exact)`);
  await shot("demo-panels-us.png");
  await page.selectOption("#units", "si");
  await page.click("#tab-cycles");
}

try {
  context = await chromium.launchPersistentContext(profile, {
    executablePath: "/usr/bin/chromium",
    headless: true,
    viewport: { width: 1360, height: 1000 },
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
      "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  page = context.pages()[0] || await context.newPage();
  const foreign = [];
  await context.route("**/*", (route) => {
    const url = new URL(route.request().url());
    if (url.origin === base || url.protocol === "data:") return route.continue();
    foreign.push(route.request().url());
    return route.abort();
  });
  // Page errors, and failed responses except the preset probe's (a route not
  // served answers 404 there and is not offered) and the error scene's own.
  const pageErrors = [];
  page.on("pageerror", (e) => pageErrors.push(String(e)));
  page.on("console", (m) => {
    if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) pageErrors.push(m.text());
  });
  page.on("request", (r) => {
    const u = new URL(r.url());
    if (r.method() === "POST" && u.origin === base && u.searchParams.get("format") === null)
      sent.set(u.pathname, { url: r.url(), body: r.postData(), ctype: r.headers()["content-type"] || "" });
  });
  page.on("response", (r) => {
    const probe = new URL(r.url()).searchParams.get("select") === "/summary/thermal_efficiency";
    if (r.status() >= 400 && !(probe && r.status() === 404) && !(expectError && r.status() === 422))
      pageErrors.push(`${r.status()} ${r.url()}`);
  });

  await sceneInitial();
  await sceneOtto();
  const unit1 = await sceneUnit1();
  await sceneLabels();
  await sceneUs(unit1);
  await page.selectOption("#preset", "brayton-1");
  await sceneError();
  await sceneLog();
  await page.waitForFunction(() => document.body.dataset.panels === "ready", null, { timeout: 20000 });
  const machineSi = await sceneMachine();
  await sceneUncertainty();
  await sceneHeatRelease();
  await sceneCombined(machineSi);
  await scenePanelsUs(machineSi);
  check(foreign.length === 0, `no request left the service${foreign.length ? ": " + foreign.join(", ") : ""}`);
  check(pageErrors.length === 0, `no page errors${pageErrors.length ? ": " + pageErrors.join(" / ") : ""}`);
} catch (e) {
  check(false, "browser run: " + (e && e.message || e));
  if (page) await shot("demo-failed.png").catch(() => {});
} finally {
  if (context) await context.close().catch(() => {});
  rmSync(profile, { recursive: true, force: true });
  const code = await stopServer(child);
  check(code === 0, `server stopped by PID ${child.pid}, exit ${code}`);
}
console.log(`browser-test: ${failures.length ? failures.length + " failed" : "passed"} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
process.exit(failures.length ? 1 : 0);
