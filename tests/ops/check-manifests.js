#!/usr/bin/env node
// tests/ops/check-manifests.js — validates the deployment files of docker/
// without a cluster or a container engine: YAML syntax (the npm `yaml`
// parser of tests/node, strict: any error or warning fails) and the keys the
// operators rely on in the Kubernetes manifests (docker/k8s/), the compose
// file (docker/compose.yaml), the Dockerfiles and the nginx configs. The
// nginx configs are also checked by `nginx -t` when nginx is installed, and
// the compose file by `docker compose config` when that plugin is present.
// Prints every problem found and exits 1 if there is any.
'use strict';
const fs = require('fs');
const path = require('path');
const os = require('os');
const { spawnSync } = require('child_process');

const root = path.resolve(__dirname, '..', '..');
const YAML = require(path.join(root, 'tests', 'node', 'node_modules', 'yaml'));

const problems = [];
let checks = 0;
function expect(cond, where, msg) {
    checks++;
    if (!cond) problems.push(`${where}: ${msg}`);
    return !!cond;
}
function get(obj, dotted) {
    return dotted.split('.').reduce((o, k) => (o == null ? undefined : o[k]), obj);
}
function read(rel) {
    return fs.readFileSync(path.join(root, rel), 'utf8');
}

// Parses every document of a YAML file; syntax errors and warnings count.
function loadYaml(rel) {
    const docs = YAML.parseAllDocuments(read(rel), { prettyErrors: true, uniqueKeys: true });
    const out = [];
    for (const d of docs) {
        for (const e of d.errors) expect(false, rel, `YAML error: ${e.message}`);
        for (const w of d.warnings) expect(false, rel, `YAML warning: ${w.message}`);
        if (d.errors.length === 0) out.push(d.toJS());
    }
    return out.filter((d) => d != null);
}

// Kubernetes quantities: "250m" CPU, "32Mi" / "64M" memory.
function cpuCores(q) {
    const s = String(q);
    return s.endsWith('m') ? Number(s.slice(0, -1)) / 1000 : Number(s);
}
function memBytes(q) {
    const m = /^([0-9.]+)([KMGT]i?)?$/.exec(String(q));
    if (!m) return NaN;
    const pow = { K: 1, M: 2, G: 3, T: 4 };
    if (!m[2]) return Number(m[1]);
    const base = m[2].endsWith('i') ? 1024 : 1000;
    return Number(m[1]) * Math.pow(base, pow[m[2][0]]);
}
// The server's limits as the environment sets them (defaults: gascycled --help).
const SERVER_DEFAULTS = {
    GASCYCLED_MAX_BODY_TOTAL: '32M', GASCYCLED_MAX_CONNECTIONS: '1000',
    GASCYCLED_MAX_REQUEST_MS: '10000', GASCYCLED_HEADER_TIMEOUT: '10',
};
const CONNECTION_MEMORY = 32 * 1024;          // bytes per connection (service/http/server.c)
const PROCESS_MEMORY = 32 * 1024 * 1024;      // process, threads and JSON being worked on
const MEASURED_PROBE_MAX_S = 0.008;           // slowest /healthz under 8 heavy clients (make attack-test)
function sizeBytes(s) {                       // the server's SIZE syntax: 1024-based k, M, G
    const m = /^(\d+)([kKmMgG]?)(i?B)?$/.exec(String(s));
    if (!m) return NaN;
    return Number(m[1]) * ({ '': 1, k: 1024, K: 1024, m: 1048576, M: 1048576, g: 1 << 30, G: 1 << 30 })[m[2]];
}
function serverEnv(env, k) {
    return env[k] !== undefined ? env[k] : SERVER_DEFAULTS[k];
}
// Memory the server may hold at its limits: bodies + connection memory + process.
function worstMemory(env) {
    return sizeBytes(serverEnv(env, 'GASCYCLED_MAX_BODY_TOTAL')) +
        Number(serverEnv(env, 'GASCYCLED_MAX_CONNECTIONS')) * CONNECTION_MEMORY + PROCESS_MEMORY;
}

function subsetOf(sel, labels) {
    return sel && labels && Object.keys(sel).length > 0 &&
        Object.entries(sel).every(([k, v]) => labels[k] === v);
}

// ---- Kubernetes ------------------------------------------------------------
const k8sDir = 'docker/k8s';
const k8sFiles = fs.readdirSync(path.join(root, k8sDir)).filter((f) => /\.ya?ml$/.test(f)).sort();
const objects = [];
for (const f of k8sFiles) {
    for (const doc of loadYaml(`${k8sDir}/${f}`)) {
        const where = `${k8sDir}/${f}`;
        expect(typeof doc.apiVersion === 'string', where, 'apiVersion missing');
        expect(typeof doc.kind === 'string', where, 'kind missing');
        if (doc.kind !== 'Kustomization')
            expect(typeof get(doc, 'metadata.name') === 'string', where, 'metadata.name missing');
        objects.push({ where, doc });
    }
}
const byKind = (k) => objects.filter((o) => o.doc.kind === k);

const deps = byKind('Deployment');
let dep = null, podLabels = null, container = null;
if (expect(deps.length === 1, k8sDir, `expected one Deployment, found ${deps.length}`)) {
    const { where, doc } = deps[0];
    dep = doc;
    expect(doc.apiVersion === 'apps/v1', where, 'Deployment apiVersion must be apps/v1');
    expect(doc.spec && doc.spec.replicas === 2, where, 'spec.replicas must be 2');
    podLabels = get(doc, 'spec.template.metadata.labels');
    expect(subsetOf(get(doc, 'spec.selector.matchLabels'), podLabels), where,
        'spec.selector.matchLabels must select the pod template labels');
    const pod = get(doc, 'spec.template.spec') || {};
    const grace = pod.terminationGracePeriodSeconds;
    expect(Number.isInteger(grace) && grace > 0, where, 'terminationGracePeriodSeconds missing');
    expect(get(pod, 'securityContext.runAsNonRoot') === true, where, 'pod securityContext.runAsNonRoot must be true');
    const uid = get(pod, 'securityContext.runAsUser');
    expect(uid === undefined || (Number.isInteger(uid) && uid > 0), where, 'runAsUser must be a non-zero uid');
    const cs = pod.containers || [];
    container = cs.find((c) => c.name === 'gascycled') || cs[0];
    if (expect(container, where, 'no container')) {
        const w = `${where} container ${container.name}`;
        expect(typeof container.image === 'string' && container.image.includes('gascycled'), w, 'image must be a gascycled image');
        const ports = container.ports || [];
        const http = ports.find((p) => p.name === 'http');
        expect(http && http.containerPort === 8080, w, 'needs a port named http on 8080');
        const env = Object.fromEntries((container.env || []).map((e) => [e.name, e.value]));
        expect(env.GASCYCLED_PORT === undefined || Number(env.GASCYCLED_PORT) === (http && http.containerPort), w,
            'GASCYCLED_PORT must equal the container port');
        expect(env.GASCYCLED_LISTEN === undefined || env.GASCYCLED_LISTEN === '0.0.0.0', w,
            'GASCYCLED_LISTEN must be 0.0.0.0 so the kubelet and the Service reach the pod');
        const portOk = (p) => p === 'http' || p === (http && http.containerPort);
        expect(get(container, 'readinessProbe.httpGet.path') === '/readyz', w, 'readinessProbe must GET /readyz');
        expect(portOk(get(container, 'readinessProbe.httpGet.port')), w, 'readinessProbe port must be the http port');
        expect(get(container, 'livenessProbe.httpGet.path') === '/healthz', w, 'livenessProbe must GET /healthz');
        expect(portOk(get(container, 'livenessProbe.httpGet.port')), w, 'livenessProbe port must be the http port');
        const res = container.resources || {};
        for (const kind of ['requests', 'limits']) {
            for (const r of ['cpu', 'memory']) {
                expect(res[kind] && res[kind][r] !== undefined, w, `resources.${kind}.${r} missing`);
            }
        }
        if (res.requests && res.limits) {
            const cr = cpuCores(res.requests.cpu), cl = cpuCores(res.limits.cpu);
            const mr = memBytes(res.requests.memory), ml = memBytes(res.limits.memory);
            expect(cr > 0 && cl >= cr, w, `cpu limit ${res.limits.cpu} must be >= request ${res.requests.cpu} > 0`);
            expect(mr > 0 && ml >= mr, w, `memory limit ${res.limits.memory} must be >= request ${res.requests.memory} > 0`);
            expect(ml >= 16 * 1024 * 1024, w, 'memory limit below 16Mi leaves no room for the server');
            expect(ml >= worstMemory(env), w,
                `memory limit ${res.limits.memory} is below what the server may hold at its limits ` +
                `(${(worstMemory(env) / 1048576).toFixed(0)} MiB: GASCYCLED_MAX_BODY_TOTAL + ` +
                'GASCYCLED_MAX_CONNECTIONS x 32 KiB + 32 MiB)');
        }
        for (const probe of ['livenessProbe', 'readinessProbe']) {
            const t = get(container, `${probe}.timeoutSeconds`), f = get(container, `${probe}.failureThreshold`);
            expect(Number.isInteger(t) && t >= 1 && t > 10 * MEASURED_PROBE_MAX_S, w,
                `${probe}.timeoutSeconds must be >= 1 (measured: ${MEASURED_PROBE_MAX_S * 1000} ms under load)`);
            expect(Number.isInteger(f) && f >= 2, w, `${probe}.failureThreshold must be >= 2 (one late probe is not a dead pod)`);
        }
        expect(get(container, 'livenessProbe.failureThreshold') * get(container, 'livenessProbe.periodSeconds') >
            Number(serverEnv(env, 'GASCYCLED_MAX_REQUEST_MS')) / 1000, w,
            'livenessProbe failureThreshold x periodSeconds must exceed GASCYCLED_MAX_REQUEST_MS');
        const pre = get(container, 'lifecycle.preStop.exec.command') || [];
        const sleepS = pre[0] === 'sleep' ? Number(pre[1]) : NaN;
        expect(sleepS > 0, w, 'lifecycle.preStop must be ["sleep", N] so endpoints drain before SIGTERM');
        const serverGrace = env.GASCYCLED_GRACE !== undefined ? Number(env.GASCYCLED_GRACE) : 20; // server default
        expect(!(sleepS > 0) || grace > sleepS + serverGrace, w,
            `terminationGracePeriodSeconds (${grace}) must exceed the preStop sleep (${sleepS}) plus the server's drain grace (${serverGrace})`);
        expect(get(container, 'securityContext.readOnlyRootFilesystem') === true, w, 'readOnlyRootFilesystem must be true');
        expect(get(container, 'securityContext.allowPrivilegeEscalation') === false, w, 'allowPrivilegeEscalation must be false');
    }
}

const svcs = byKind('Service');
if (expect(svcs.length === 1, k8sDir, `expected one Service, found ${svcs.length}`)) {
    const { where, doc } = svcs[0];
    expect(subsetOf(get(doc, 'spec.selector'), podLabels), where, 'Service selector must match the Deployment pods');
    const ports = get(doc, 'spec.ports') || [];
    expect(ports.length > 0, where, 'no ports');
    for (const p of ports) {
        const cp = container && (container.ports || []).some((c) => c.name === p.targetPort || c.containerPort === p.targetPort);
        expect(cp, where, `targetPort ${p.targetPort} is not a container port of the Deployment`);
    }
}

const hpas = byKind('HorizontalPodAutoscaler');
if (expect(hpas.length === 1, k8sDir, `expected one HorizontalPodAutoscaler, found ${hpas.length}`)) {
    const { where, doc } = hpas[0];
    expect(doc.apiVersion === 'autoscaling/v2', where, 'apiVersion must be autoscaling/v2');
    const ref = get(doc, 'spec.scaleTargetRef') || {};
    expect(ref.kind === 'Deployment' && dep && ref.name === dep.metadata.name && ref.apiVersion === 'apps/v1', where,
        'scaleTargetRef must name the apps/v1 Deployment');
    const min = get(doc, 'spec.minReplicas'), max = get(doc, 'spec.maxReplicas');
    expect(Number.isInteger(min) && min >= 2, where, 'minReplicas must be at least 2');
    expect(Number.isInteger(max) && max >= min, where, 'maxReplicas must be >= minReplicas');
    const cpu = (get(doc, 'spec.metrics') || []).find((m) => m.type === 'Resource' && get(m, 'resource.name') === 'cpu');
    expect(cpu && get(cpu, 'resource.target.type') === 'Utilization', where, 'needs a Resource cpu Utilization metric');
    const u = cpu && get(cpu, 'resource.target.averageUtilization');
    expect(Number.isInteger(u) && u > 0 && u <= 100, where, 'averageUtilization must be 1..100');
    expect(container && get(container, 'resources.requests.cpu') !== undefined, where,
        'CPU utilisation needs a CPU request on the Deployment');
}

for (const { where, doc } of byKind('PodDisruptionBudget')) {
    expect(doc.apiVersion === 'policy/v1', where, 'apiVersion must be policy/v1');
    expect(subsetOf(get(doc, 'spec.selector.matchLabels'), podLabels), where, 'selector must match the Deployment pods');
}

for (const { where, doc } of byKind('Kustomization')) {
    const listed = (doc.resources || []).slice().sort();
    const expected = k8sFiles.filter((f) => f !== 'kustomization.yaml').sort();
    expect(JSON.stringify(listed) === JSON.stringify(expected), where,
        `resources ${JSON.stringify(listed)} must list every manifest ${JSON.stringify(expected)}`);
}

function env0(svc) {
    const e = svc.environment || {};
    return Array.isArray(e) ? Object.fromEntries(e.map((kv) => kv.split(/=(.*)/s).slice(0, 2))) : e;
}

// ---- compose -----------------------------------------------------------------
const composeRel = 'docker/compose.yaml';
const [compose] = loadYaml(composeRel);
const nginxConfs = [];
if (expect(compose && compose.services, composeRel, 'no services')) {
    const svc = compose.services.gascycled;
    if (expect(svc, composeRel, 'no gascycled service')) {
        const w = `${composeRel} services.gascycled`;
        const ctx = path.resolve(root, 'docker', get(svc, 'build.context') || '.');
        const df = get(svc, 'build.dockerfile');
        expect(df && fs.existsSync(path.join(ctx, df)), w, `build.dockerfile ${df} not found in the build context`);
        expect(ctx === root, w, 'build.context must be the repository root (the Dockerfile copies the sources)');
        const rep = get(svc, 'deploy.replicas');
        expect(Number.isInteger(rep) && rep >= 2, w, 'deploy.replicas must be an integer >= 2');
        const hc = get(svc, 'healthcheck.test');
        expect(Array.isArray(hc) && hc.join(' ').includes('/healthz'), w, 'healthcheck.test must probe /healthz');
        expect(svc.stop_signal === 'SIGTERM', w, 'stop_signal must be SIGTERM');
        const sg = /^(\d+)s$/.exec(String(svc.stop_grace_period || ''));
        const serverGrace = env0(svc).GASCYCLED_GRACE !== undefined ? Number(env0(svc).GASCYCLED_GRACE) : 20;
        expect(sg && Number(sg[1]) > serverGrace, w,
            `stop_grace_period (${svc.stop_grace_period}) must exceed the server's drain grace (${serverGrace} s)`);
        const env = env0(svc);
        expect(env.GASCYCLED_LISTEN === '0.0.0.0', w, 'environment.GASCYCLED_LISTEN must be 0.0.0.0');
        expect(svc.ports === undefined, w, 'replicas must not publish ports (only the load balancer does)');
        expect(get(svc, 'deploy.resources.limits.memory') !== undefined, w, 'deploy.resources.limits.memory missing');
        const lim = memBytes(String(get(svc, 'deploy.resources.limits.memory') || '').replace(/B$/, ''));
        expect(lim >= worstMemory(env), w, `deploy.resources.limits.memory is below what the server may hold ` +
            `at its limits (${(worstMemory(env) / 1048576).toFixed(0)} MiB)`);
        expect(env.GASCYCLED_MAX_CONNECTIONS_PER_CLIENT === '0', w,
            'GASCYCLED_MAX_CONNECTIONS_PER_CLIENT must be 0: nginx is the only client of a replica');
    }
    const lb = compose.services.lb;
    if (expect(lb, composeRel, 'no lb service')) {
        const w = `${composeRel} services.lb`;
        expect(get(lb, 'depends_on.gascycled.condition') === 'service_healthy', w,
            'depends_on.gascycled.condition must be service_healthy');
        expect(Array.isArray(lb.ports) && lb.ports.length > 0, w, 'the load balancer must publish a port');
        const hc = get(lb, 'healthcheck.test');
        expect(Array.isArray(hc) && hc.length > 1, w, 'healthcheck missing');
        const ctx = path.resolve(root, 'docker', get(lb, 'build.context') || '.');
        const df = get(lb, 'build.dockerfile');
        if (expect(df && fs.existsSync(path.join(ctx, df)), w, `build.dockerfile ${df} not found`)) {
            const text = fs.readFileSync(path.join(ctx, df), 'utf8');
            expect(/apt-get install[^\n]*nginx/.test(text.replace(/\\\n/g, ' ')), `${df}`, 'must install Debian nginx');
            const m = /COPY\s+(\S+)\s+\/etc\/nginx\/nginx\.conf/.exec(text);
            if (expect(m, `${df}`, 'must COPY the nginx config to /etc/nginx/nginx.conf')) nginxConfs.push(m[1]);
        }
    }
}

// nginx configs: the compose one and the scale-out test template.
function checkNginx(rel, upstreamServerRe) {
    const text = read(rel);
    const up = /upstream\s+\S+\s*\{([^}]*)\}/.exec(text);
    if (expect(up, rel, 'no upstream block')) {
        const servers = up[1].split('\n').filter((l) => /^\s*server\s/.test(l));
        expect(servers.length > 0 && servers.every((l) => upstreamServerRe.test(l)), rel,
            `upstream servers must match ${upstreamServerRe}`);
        expect(servers.every((l) => /max_fails=\d+/.test(l) && /fail_timeout=\d+/.test(l)), rel,
            'every upstream server needs max_fails and fail_timeout (passive health)');
    }
    const nu = /proxy_next_upstream\s+([^;]*);/.exec(text);
    const words = nu ? nu[1].split(/\s+/) : [];
    for (const w of ['error', 'timeout', 'http_502', 'http_503'])
        expect(words.includes(w), rel, `proxy_next_upstream must include ${w}`);
    expect(/proxy_pass\s+http:\/\//.test(text), rel, 'no proxy_pass');
    const rt = /proxy_read_timeout\s+(\d+)s;/.exec(text);
    const maxMs = Number(SERVER_DEFAULTS.GASCYCLED_MAX_REQUEST_MS);
    expect(!rt || Number(rt[1]) * 1000 > maxMs, rel,
        `proxy_read_timeout must exceed the server's time budget per request (${maxMs} ms), so a slow ` +
        'composite is answered by the server (503 with Retry-After), not cut by the proxy');
    return text;
}
for (const c of nginxConfs) checkNginx(c, /server\s+gascycled:8080\b/);
checkNginx('tests/ops/nginx-scaleout.conf', /server\s+127\.0\.0\.1:@PORT_[A-Z]@/);

// `nginx -t` on copies with the names and paths made local.
const nginxBin = ['/usr/sbin/nginx', '/usr/bin/nginx'].find((p) => fs.existsSync(p));
if (nginxBin) {
    const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'gc-ops-nginx-'));
    try {
        const variants = nginxConfs.map((c) => [c, read(c)
            .replace(/server\s+gascycled:8080/g, 'server 127.0.0.1:8080')
            .replace(/\/tmp\//g, `${tmp}/`)
            .replace(/\/dev\/stdout/g, `${tmp}/access.log`)
            .replace(/listen\s+8080/g, 'listen 127.0.0.1:8080')]);
        variants.push(['tests/ops/nginx-scaleout.conf', read('tests/ops/nginx-scaleout.conf')
            .replace(/@TMP@/g, tmp).replace(/@PORT_LB@/g, '18080')
            .replace(/@PORT_A@/g, '18081').replace(/@PORT_B@/g, '18082')]);
        variants.forEach(([rel, text], i) => {
            const conf = path.join(tmp, `t${i}.conf`);
            fs.writeFileSync(conf, text);
            const r = spawnSync(nginxBin, ['-t', '-q', '-p', tmp, '-e', path.join(tmp, 'error.log'), '-c', conf],
                { encoding: 'utf8' });
            expect(r.status === 0, rel, `nginx -t failed: ${(r.stderr || '').trim()}`);
        });
    } finally {
        fs.rmSync(tmp, { recursive: true, force: true });
    }
} else {
    console.log('check-manifests: nginx not installed, `nginx -t` skipped');
}

// `docker compose config` only where the compose plugin exists.
const compo = spawnSync('docker', ['compose', 'version'], { encoding: 'utf8' });
if (compo.status === 0) {
    const r = spawnSync('docker', ['compose', '-f', path.join(root, composeRel), 'config', '-q'], { encoding: 'utf8' });
    expect(r.status === 0, composeRel, `docker compose config: ${(r.stderr || '').trim()}`);
} else {
    console.log('check-manifests: no docker compose plugin, compose file checked by the YAML parser only');
}

// ---- Dockerfile ----------------------------------------------------------------
{
    const rel = 'docker/Dockerfile';
    const text = read(rel).replace(/\\\n/g, ' ');
    const lines = text.split('\n').filter((l) => l.trim() && !l.trim().startsWith('#'));
    const firstFrom = lines.findIndex((l) => /^FROM\s/i.test(l));
    expect(lines.slice(0, firstFrom).some((l) => /^ARG\s+BASE_IMAGE=debian:bookworm-slim\s*$/.test(l)), rel,
        'ARG BASE_IMAGE=debian:bookworm-slim must come before the first FROM');
    const froms = lines.filter((l) => /^FROM\s/i.test(l));
    expect(froms.length >= 2, rel, 'must be multi-stage');
    expect(froms.every((l) => /^FROM\s+\$\{BASE_IMAGE\}/.test(l)), rel, 'every stage must start FROM ${BASE_IMAGE}');
    const runtime = text.slice(text.lastIndexOf('\nFROM '));
    expect(/make\b[^\n]*build\/gascycled/.test(text), rel, 'the build stage must run make build/gascycled');
    expect(!/-dev\b/.test(runtime) && !/\bgcc\b/.test(runtime), rel, 'the runtime stage must not install compilers or -dev packages');
    expect(/libmicrohttpd12/.test(runtime) && /libjansson4/.test(runtime), rel, 'the runtime stage needs libmicrohttpd12 and libjansson4');
    const user = /^USER\s+(\S+)/m.exec(runtime);
    expect(user && !/^(0|root)(:|$)/.test(user[1]), rel, 'the runtime stage must run as a non-root USER');
    expect(/^ENV\s[^\n]*GASCYCLED_LISTEN=0\.0\.0\.0/m.test(runtime), rel, 'ENV GASCYCLED_LISTEN=0.0.0.0 missing');
    const g = /GASCYCLED_GRACE=(\d+)/.exec(runtime);
    expect(g && Number(g[1]) < 10, rel, 'ENV GASCYCLED_GRACE must stay below docker stop\'s default 10 s');
    expect(/^EXPOSE\s+8080\b/m.test(runtime), rel, 'EXPOSE 8080 missing');
    expect(/^STOPSIGNAL\s+SIGTERM\b/m.test(runtime), rel, 'STOPSIGNAL SIGTERM missing');
    expect(/^HEALTHCHECK\s[^\n]*\/healthz/m.test(runtime), rel, 'HEALTHCHECK against /healthz missing');
    for (const k of ['title', 'description', 'version', 'licenses', 'source', 'revision'])
        expect(runtime.includes(`org.opencontainers.image.${k}=`), rel, `label org.opencontainers.image.${k} missing`);
    expect(/org\.opencontainers\.image\.licenses="MIT"/.test(runtime), rel, 'licenses label must be MIT');
    expect(/nvidia|cuda/i.test(text) === false, rel, 'no GPU packages');
    const ignore = read('.dockerignore').split('\n').map((l) => l.trim());
    for (const p of ['build/', 'build-san/', 'tests/node/node_modules/', '.git'])
        expect(ignore.includes(p), '.dockerignore', `must exclude ${p}`);
}

if (problems.length) {
    for (const p of problems) console.error(`check-manifests: ${p}`);
    console.error(`check-manifests: ${problems.length} problem(s) in ${checks} checks`);
    process.exit(1);
}
console.log(`check-manifests: ${checks} checks passed (${k8sFiles.length} Kubernetes files, compose, Dockerfiles, nginx)`);
