#!/usr/bin/python3
"""tests/integration/run_port.py — `make run PORT=N` serves on port N, as the
README says (issue 17).

Picks a free port on 127.0.0.1, starts `make run PORT=<port>` in a session of
its own (so its process group is known: make and the server it runs), waits
at most 60 s for /healthz to answer on that port and for the server's
"listening" log line to name it, then stops that process group with SIGTERM
(SIGKILL after 10 s) and checks the server logged a clean stop.

Usage: python3 tests/integration/run_port.py   (from the top of the worktree)
"""
import json
import os
import signal
import socket
import subprocess
import sys
import tempfile
import time
import urllib.request


def free_port():
    s = socket.socket()
    s.bind(("127.0.0.1", 0))
    port = s.getsockname()[1]
    s.close()
    return port


def healthy(port):
    try:
        with urllib.request.urlopen(f"http://127.0.0.1:{port}/healthz", timeout=2) as r:
            return r.status == 200 and json.load(r).get("status") == "ok"
    except OSError:
        return False


def main():
    port = free_port()
    env = dict(os.environ, GASCYCLED_LOG_FORMAT="json")
    with tempfile.TemporaryFile(mode="w+") as log:
        child = subprocess.Popen(["make", "-s", "run", f"PORT={port}"], stdout=log,
                                 stderr=subprocess.STDOUT, env=env, start_new_session=True)
        up = False
        deadline = time.monotonic() + 60
        while time.monotonic() < deadline and child.poll() is None:
            if healthy(port):
                up = True
                break
            time.sleep(0.1)
        os.killpg(child.pid, signal.SIGTERM)
        try:
            child.wait(timeout=10)
        except subprocess.TimeoutExpired:
            os.killpg(child.pid, signal.SIGKILL)
            child.wait()
        log.seek(0)
        lines = log.read().splitlines()
    records = []
    for line in lines:
        try:
            records.append(json.loads(line))
        except ValueError:
            pass
    listening = [r for r in records if r.get("msg") == "listening"]
    problems = []
    if not up:
        problems.append(f"/healthz did not answer on port {port}")
    if not any(r.get("port") == port for r in listening):
        problems.append(f"no listening line names port {port}")
    if not any(r.get("msg") == "stopped" for r in records):
        problems.append("the server did not log a clean stop after SIGTERM")
    if problems:
        print("\n".join(lines[-20:]))
        for p in problems:
            print(f"FAIL make run PORT={port}: {p}")
        return 1
    print(f"ok   make run PORT={port} serves /healthz on port {port} and stops cleanly")
    return 0


if __name__ == "__main__":
    sys.exit(main())
