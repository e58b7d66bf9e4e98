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
  await shot("demo-diagrams.png", page.locator(".diagrams"));
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
