#!/usr/bin/python3
"""tests/calc/webservice.py — LibreOffice Calc as a real spreadsheet client.

Starts build/gascycled on a free port and a headless LibreOffice (socket
listener, a throw-away profile), opens a new Calc document over UNO, puts
    A1  =WEBSERVICE("http://127.0.0.1:PORT/v1/cycles/otto?...&select=/summary/thermal_efficiency")
    A2  =VALUE(A1)*100
into the sheet, recalculates, and checks that A1 and A2 equal the value of
the same request's JSON response (fetched separately with urllib, the pointer
resolved here). Calc sends OPTIONS and HEAD before its GET; the server's
access log shows which requests it made, and the test requires its GET.

Both processes are stopped by their PIDs (LibreOffice through its own
terminate call first). Run with Debian's python3 (python3-uno):
    /usr/bin/python3 tests/calc/webservice.py [SERVER_BINARY]
"""
import json
import os
import shutil
import signal
import socket
import subprocess
import sys
import tempfile
import time
import urllib.parse
import urllib.request

import uno  # noqa: E402  (python3-uno)
from com.sun.star.beans import PropertyValue  # noqa: E402
from com.sun.star.lang import Locale  # noqa: E402

REPO = os.path.abspath(os.path.join(os.path.dirname(__file__), "..", ".."))
SERVER = os.path.abspath(sys.argv[1] if len(sys.argv) > 1 else os.path.join(REPO, "build/gascycled"))

# Demo inputs (the invented Test cell 3 engine, DESIGN.md).
PATH = "/v1/cycles/otto"
PARAMS = {"compression_ratio": "10.5", "intake_temperature": "305", "intake_pressure": "98",
          "peak_temperature": "2400", "compression_efficiency": "0.92",
          "expansion_efficiency": "0.94"}
POINTER = "/summary/thermal_efficiency"

failures = []


def check(ok, what):
    print(("ok   " if ok else "FAIL ") + what, flush=True)
    if not ok:
        failures.append(what)


def free_port():
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def start_server():
    log = tempfile.NamedTemporaryFile(prefix="gascycled-calc-", suffix=".log", delete=False)
    proc = subprocess.Popen([SERVER, "--listen", "127.0.0.1", "--port", "0", "--log-format", "json"],
                            stdout=log, stderr=log)
    deadline = time.time() + 10
    while time.time() < deadline:
        with open(log.name) as f:
            for line in f:
                try:
                    rec = json.loads(line)
                except ValueError:
                    continue
                if rec.get("msg") == "listening":
                    return proc, rec["port"], log.name
        if proc.poll() is not None:
            break
        time.sleep(0.05)
    proc.kill()
    raise SystemExit("server did not start")


def pointer(doc, ptr):
    cur = doc
    for tok in ptr.split("/")[1:]:
        cur = cur[tok.replace("~1", "/").replace("~0", "~")]
    return cur


def http_get(url):
    with urllib.request.urlopen(url, timeout=10) as r:
        return r.status, r.read().decode("utf-8")


def connect(port, deadline):
    local = uno.getComponentContext()
    resolver = local.ServiceManager.createInstanceWithContext("com.sun.star.bridge.UnoUrlResolver", local)
    while True:
        try:
            return resolver.resolve(
                "uno:socket,host=127.0.0.1,port=%d;urp;StarOffice.ComponentContext" % port)
        except Exception:  # NoConnectException until soffice listens
            if time.time() > deadline:
                raise
            time.sleep(0.25)


def stop_by_pid(proc, wait_s):
    """SIGTERM to the process group we started (soffice runs oosplash, which
    runs soffice.bin), then SIGKILL; returns the exit code."""
    if proc.poll() is None:
        try:
            os.killpg(proc.pid, signal.SIGTERM)
        except ProcessLookupError:
            pass
        try:
            proc.wait(wait_s)
        except subprocess.TimeoutExpired:
            os.killpg(proc.pid, signal.SIGKILL)
            proc.wait(5)
    return proc.returncode


def main():
    t0 = time.time()
    server, port, server_log = start_server()
    base = "http://127.0.0.1:%d" % port
    office = None
    profile = tempfile.mkdtemp(prefix="gascycled-lo-profile-")
    try:
        # the request the sheet will make, and the JSON answer to compare with
        path, ptr = PATH, POINTER
        query = urllib.parse.urlencode(PARAMS, safe="")
        status, text = http_get(base + path + "?" + query)
        check(status == 200, "JSON request %s answers 200" % path)
        want = float(pointer(json.loads(text), ptr))
        url = base + path + "?" + query + "&select=" + ptr
        print("     WEBSERVICE URL: " + url)

        lo_port = free_port()
        office = subprocess.Popen(
            ["soffice", "--headless", "--invisible", "--norestore", "--nologo", "--nodefault",
             "--nolockcheck",
             "--accept=socket,host=127.0.0.1,port=%d;urp;" % lo_port,
             "-env:UserInstallation=file://" + urllib.parse.quote(profile)],
            stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL, start_new_session=True,
            # The sheet must read "0.489" the same way on any machine: the
            # office's locale is fixed here, never taken from the host.
            env=dict(os.environ, LC_ALL="C.UTF-8", LANG="C.UTF-8", LANGUAGE="en_US"))
        ctx = connect(lo_port, time.time() + 90)
        t_conn = time.time()
        smgr = ctx.ServiceManager
        desktop = smgr.createInstanceWithContext("com.sun.star.frame.Desktop", ctx)
        hidden = PropertyValue()
        hidden.Name, hidden.Value = "Hidden", True
        doc = desktop.loadComponentFromURL("private:factory/scalc", "_blank", 0, (hidden,))
        en_us = Locale()
        en_us.Language, en_us.Country = "en", "US"
        doc.CharLocale = en_us   # VALUE() parses with the document's locale
        sheet = doc.Sheets.getByIndex(0)
        a1, a2 = sheet.getCellRangeByName("A1"), sheet.getCellRangeByName("A2")
        a1.setFormula('=WEBSERVICE("%s")' % url.replace('"', '""'))
        a2.setFormula("=VALUE(A1)*100")
        doc.calculateAll()
        got_text, got_value = a1.getString(), a2.getValue()
        print("     A1 = %r, A2 = %r (JSON value %r)" % (got_text, got_value, want))
        check(got_text != "" and abs(float(got_text) - want) <= 1e-12 * abs(want),
              "A1 (WEBSERVICE) equals the JSON response's value")
        check(abs(got_value - want * 100) <= 1e-9 * abs(want * 100),
              "A2 (=VALUE(A1)*100) equals 100 x the JSON value")
        doc.close(True)
        try:
            desktop.terminate()
        except Exception:  # the bridge goes away while terminating
            pass
        try:
            office.wait(20)
        except subprocess.TimeoutExpired:
            pass
        print("     LibreOffice connected after %.1f s, sheet done after %.1f s"
              % (t_conn - t0, time.time() - t0))
    finally:
        if office is not None:
            code = stop_by_pid(office, 10)
            print("     LibreOffice (PID %d) ended, exit %s" % (office.pid, code))
        shutil.rmtree(profile, ignore_errors=True)
        server.send_signal(signal.SIGTERM)
        try:
            code = server.wait(10)
        except subprocess.TimeoutExpired:
            server.kill()
            code = -1
        check(code == 0, "server (PID %d) stopped, exit %d" % (server.pid, code))

    # requests to the target path by method; one GET of them was our own urllib fetch
    methods = {}
    with open(server_log) as f:
        for line in f:
            try:
                rec = json.loads(line)
            except ValueError:
                continue
            if rec.get("msg") == "request" and rec.get("path") == path:
                key = "%s %s" % (rec.get("method"), rec.get("status"))
                methods[key] = methods.get(key, 0) + 1
    os.unlink(server_log)
    print("     requests to %s seen by the server (method status: count): %s" % (path, methods))
    check(methods.get("GET 200", 0) >= 2, "the spreadsheet's GET reached the server and got 200")
    print("calc-test: %s in %.1f s" % ("passed" if not failures else "%d failed" % len(failures),
                                        time.time() - t0))
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
