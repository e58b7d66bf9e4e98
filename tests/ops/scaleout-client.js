#!/usr/bin/env node
// tests/ops/scaleout-client.js — the traffic side of tests/ops/scaleout.sh.
// Builds a small set of distinct evaluation requests from one GET path (the
// first numeric query parameter is varied; a POST with the same fields as a
// JSON body is added when the route accepts it), takes the direct answer of
// one replica for each, then sends a bounded number of requests through the
// load balancer and checks that every answer has the same status and the same
// body as the direct answer.
//   node scaleout-client.js LB_URL DIRECT_URL PATH COUNT [KILL_PID KILL_AFTER]
// With KILL_PID, that process (a replica the calling script started) is sent
// SIGKILL after KILL_AFTER answers, while requests are in flight, and every
// answer must still be good (nginx retries on the surviving replica).
// Prints one JSON line of counts; exits 1 on any mismatch or 5xx.
'use strict';

const [lb, direct, basePath, countArg, killPidArg, killAfterArg] = process.argv.slice(2);
const count = Number(countArg);
const killPid = killPidArg ? Number(killPidArg) : 0;
const killAfter = killAfterArg ? Number(killAfterArg) : 0;
const CONCURRENCY = 4;
const TIMEOUT_MS = 10000;

function variants(p) {
    const u = new URL(p, 'http://x');
    const keys = [...u.searchParams.keys()];
    const numKey = keys.find((k) => Number.isFinite(Number(u.searchParams.get(k))));
    const out = [];
    for (let i = 0; i < 10; i++) {
        const q = new URLSearchParams(u.searchParams);
        if (numKey) q.set(numKey, String(Math.round(Number(q.get(numKey)) * (1 + 0.05 * i) * 1000) / 1000));
        out.push({ method: 'GET', path: `${u.pathname}?${q}` });
        if (!numKey) break;
    }
    const body = {};
    for (const [k, v] of new URLSearchParams(out[0].path.split('?')[1])) {
        body[k] = Number.isFinite(Number(v)) && v !== '' ? Number(v) : v;
    }
    out.push({ method: 'POST', path: u.pathname, body: JSON.stringify(body) });
    return out;
}

async function send(base, r) {
    const ctl = AbortSignal.timeout(TIMEOUT_MS);
    const init = { method: r.method, signal: ctl };
    if (r.body !== undefined) {
        init.body = r.body;
        init.headers = { 'content-type': 'application/json' };
    }
    const res = await fetch(base + r.path, init);
    return { status: res.status, body: await res.text() };
}

async function main() {
    let reqs = variants(basePath);
    const expected = new Map();
    for (const r of reqs) {
        const d = await send(direct, r);
        if (r.method === 'POST' && d.status !== 200) continue; // route without POST
        if (d.status !== 200) throw new Error(`direct ${r.method} ${r.path} answered ${d.status}`);
        expected.set(r, d.body);
    }
    reqs = reqs.filter((r) => expected.has(r));

    const stats = { sent: 0, ok: 0, mismatch: 0, status5xx: 0, otherStatus: 0, failed: 0, killedAt: null,
                    distinct: reqs.length, post: reqs.some((r) => r.method === 'POST') };
    let next = 0, answered = 0;
    const firstErrors = [];
    async function worker() {
        while (next < count) {
            const r = reqs[next++ % reqs.length];
            stats.sent++;
            try {
                const a = await send(lb, r);
                if (a.status >= 500) stats.status5xx++;
                else if (a.status !== 200) stats.otherStatus++;
                else if (a.body !== expected.get(r)) stats.mismatch++;
                else stats.ok++;
                if (a.status !== 200 || a.body !== expected.get(r)) {
                    if (firstErrors.length < 3) firstErrors.push(`${r.method} ${r.path}: ${a.status} ${a.body.slice(0, 200)}`);
                }
            } catch (e) {
                stats.failed++;
                if (firstErrors.length < 3) firstErrors.push(`${r.method} ${r.path}: ${e.message}`);
            }
            answered++;
            if (killPid && stats.killedAt === null && answered >= killAfter) {
                stats.killedAt = answered;
                process.kill(killPid, 'SIGKILL');
            }
        }
    }
    await Promise.all(Array.from({ length: CONCURRENCY }, worker));
    console.log(JSON.stringify(stats));
    for (const e of firstErrors) console.error(`scaleout-client: ${e}`);
    const good = stats.ok === count && (!killPid || stats.killedAt !== null);
    process.exit(good ? 0 : 1);
}

main().catch((e) => {
    console.error(`scaleout-client: ${e.message}`);
    process.exit(1);
});
