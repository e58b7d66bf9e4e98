// tests/lib/server.mjs — starting and stopping a gascycled binary for the
// node-side tests (tests/browser, tests/csv): the server listens on
// 127.0.0.1 on a free port (--port 0; the port is read from its JSON
// "listening" log line) and is stopped by its PID with SIGTERM (SIGKILL after
// 10 s), so a test can require a clean exit.

import { spawn } from "node:child_process";

// Resolves to { child, port } once the server reports listening (10 s at most).
export function startServer(serverBin) {
  return new Promise((resolveStart, rejectStart) => {
    const child = spawn(serverBin, ["--listen", "127.0.0.1", "--port", "0", "--log-format", "json"],
      { stdio: ["ignore", "pipe", "pipe"] });
    let buf = "";
    const timer = setTimeout(() => rejectStart(new Error("server did not report listening in 10 s")), 10000);
    const onData = (chunk) => {
      buf += chunk.toString();
      let nl;
      while ((nl = buf.indexOf("\n")) >= 0) {
        const line = buf.slice(0, nl);
        buf = buf.slice(nl + 1);
        try {
          const rec = JSON.parse(line);
          if (rec.msg === "listening" && rec.port) {
            clearTimeout(timer);
            resolveStart({ child, port: rec.port });
          }
        } catch { /* not a JSON line */ }
      }
    };
    child.stdout.on("data", onData);
    child.stderr.on("data", onData);
    child.on("exit", (code) => rejectStart(new Error(`server exited early (${code})`)));
  });
}

// Resolves to the exit code (-1 when a signal ended it).
export function stopServer(child) {
  return new Promise((res) => {
    if (child.exitCode !== null) return res(child.exitCode);
    const t = setTimeout(() => { child.kill("SIGKILL"); }, 10000);
    child.once("exit", (code, signal) => { clearTimeout(t); res(signal ? -1 : code); });
    process.kill(child.pid, "SIGTERM");
  });
}
