// tests/browser/demo.mjs — the demo page (GET /) in Debian's headless
// Chromium, driven by playwright-core (tests/node): starts the server on a
// free port (--port 0, the port read from its "listening" log line), loads
// the page, drives one evaluation through the form, and asserts that the
// summary, the state table and both diagrams appear (each <img> loaded with a
// non-zero size; its SVG, fetched again in the page and parsed, has state
// markers); no request may leave the service, and the page must log no
// errors. Saves a screenshot to tests/artifacts/demo.png and stops the
// server by its PID (SIGTERM; it must exit 0).
//
// Usage: node tests/browser/demo.mjs [SERVER_BINARY] (default build/gascycled)
import { mkdtempSync, mkdirSync, rmSync } from "node:fs";
import { createRequire } from "node:module";
import { tmpdir } from "node:os";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
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

const { child, port } = await startServer(serverBin);
const base = `http://127.0.0.1:${port}`;
const profile = mkdtempSync(join(tmpdir(), "gascycled-chromium-"));
let context, page;
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
  // Page errors, and failed responses except the preset probe's (a preset
  // whose route is not served answers 404 there and is simply not offered;
  // Chromium logs each failed load to the console, so those lines are judged
  // by the responses instead).
  const pageErrors = [];
  page.on("pageerror", (e) => pageErrors.push(String(e)));
  page.on("console", (m) => {
    if (m.type() === "error" && !m.text().startsWith("Failed to load resource")) pageErrors.push(m.text());
  });
  page.on("response", (r) => {
    const probe = new URL(r.url()).searchParams.get("select") === "/summary/thermal_efficiency";
    if (r.status() >= 400 && !(probe && r.status() === 404)) pageErrors.push(`${r.status()} ${r.url()}`);
  });

  const resp = await page.goto(base + "/", { waitUntil: "load" });
  check(resp && resp.status() === 200, "GET / answers 200");
  check((resp.headers()["content-type"] || "").startsWith("text/html"), "GET / is text/html");
  check(await page.locator("h1").innerText() === "gascycled demo", "page heading");

  // the probe enables the preset list once some cycle route answers
  await page.waitForFunction(() => !document.getElementById("preset").disabled ||
    document.getElementById("status").classList.contains("error"), null, { timeout: 15000 });
  const options = await page.locator("#preset option").allInnerTexts();
  console.log("     presets offered:", options.join(" | "));
  check(!(await page.locator("#preset").isDisabled()), "at least one preset route answers");
  if (await page.locator("#preset").isDisabled())
    throw new Error("no cycle route answers: nothing to evaluate");
  const otto = await page.locator("#preset option[value=otto]").count();
  if (otto) await page.selectOption("#preset", "otto");

  // edit an input the way a user does (keyboard), then evaluate with Enter
  const first = page.locator("#fields input[type=text]").first();
  const firstName = await first.getAttribute("name");
  const firstValue = await first.inputValue();
  await first.fill("");
  await first.type(firstValue);
  await first.press("Enter");
  await page.waitForFunction(() => document.getElementById("summary").dataset.ready === "1" ||
    document.getElementById("status").classList.contains("error"), null, { timeout: 15000 });
  const status = await page.locator("#status").innerText();
  console.log(`     status after evaluation (${firstName}=${firstValue}): ${status}`);
  check(await page.locator("#summary").getAttribute("data-ready") === "1", "evaluation succeeded");

  // summary: the thermal efficiency shown equals the JSON response's value
  const eff = page.locator('#summary dd[data-pointer="/summary/thermal_efficiency"]');
  check(await eff.count() === 1, "summary shows the thermal efficiency");
  if (await eff.count() === 1) {
    const shown = parseFloat((await eff.innerText()).replace(/[^0-9.\-]/g, ""));
    const jsonUrl = await page.locator("#links a").first().getAttribute("href");
    const doc = await page.evaluate(async (u) => (await fetch(u)).json(), jsonUrl);
    const want = doc.summary.thermal_efficiency * 100;
    check(Math.abs(shown - want) <= 0.051, `shown efficiency ${shown} % = JSON ${want.toFixed(3)} %`);
  }
  const rows = await page.locator("#state-table tbody tr").count();
  check(rows >= 3, `state table has ${rows} rows`);

  // both diagrams: loaded with a size, and their SVG holds state markers
  for (const id of ["img-ts", "img-pv"]) {
    await page.waitForFunction((i) => ["loaded", "failed"].includes(document.getElementById(i).dataset.state),
      id, { timeout: 15000 });
    const info = await page.evaluate(async (i) => {
      const img = document.getElementById(i);
      const r = await fetch(img.src);
      const text = await r.text();
      const svg = new DOMParser().parseFromString(text, "image/svg+xml");
      return {
        state: img.dataset.state, w: img.naturalWidth, h: img.naturalHeight,
        shownW: img.getBoundingClientRect().width, type: r.headers.get("content-type"),
        parseError: svg.getElementsByTagName("parsererror").length,
        markers: svg.querySelectorAll(".gc-state").length,
        actual: svg.querySelectorAll(".gc-actual").length,
      };
    }, id);
    console.log(`     ${id}: ${JSON.stringify(info)}`);
    check(info.state === "loaded" && info.w > 0 && info.h > 0 && info.shownW > 100, `${id} loaded with a size`);
    check((info.type || "").startsWith("image/svg+xml"), `${id} is image/svg+xml`);
    check(info.parseError === 0 && info.actual === 1 && info.markers >= 3, `${id} SVG has the cycle and ${info.markers} state markers`);
  }

  mkdirSync(artifacts, { recursive: true });
  await page.screenshot({ path: join(artifacts, "demo.png"), fullPage: true });
  console.log("     screenshot: tests/artifacts/demo.png");
  check(foreign.length === 0, `no request left the service${foreign.length ? ": " + foreign.join(", ") : ""}`);
  check(pageErrors.length === 0, `no page errors${pageErrors.length ? ": " + pageErrors.join(" / ") : ""}`);
} catch (e) {
  check(false, "browser run: " + (e && e.message || e));
  if (page) {
    mkdirSync(artifacts, { recursive: true });
    await page.screenshot({ path: join(artifacts, "demo-failed.png"), fullPage: true }).catch(() => {});
    console.log("     screenshot of the failure: tests/artifacts/demo-failed.png");
  }
} finally {
  if (context) await context.close().catch(() => {});
  rmSync(profile, { recursive: true, force: true });
  const code = await stopServer(child);
  check(code === 0, `server stopped by PID ${child.pid}, exit ${code}`);
}
console.log(`browser-test: ${failures.length ? failures.length + " failed" : "passed"} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
process.exit(failures.length ? 1 : 0);
