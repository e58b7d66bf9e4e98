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

Then the same in a comma-decimal locale (issue 17): the office's locale is set
to de-DE (its configuration, org.openoffice.Setup/L10N), and a new sheet holds
    B1  10.5 (a number; Calc shows and concatenates it as "10,5")
    B2  =WEBSERVICE("...?compression_ratio="&B1&"&...&decimal=comma&select=...")
    B3  =VALUE(B2)*100
    B4  =WEBSERVICE(".../v1/cycles/brayton?...&decimal=comma&select=/stations/turbine_inlet/T")
    B5  =WEBSERVICE("...a refused input...&on_error=cell")   B6  =ISERROR(VALUE(B5))
    B7  =WEBSERVICE(the request of B2 without decimal=comma)   B8  =ISERROR(VALUE(B7))
B3 and VALUE(B4) must equal the JSON values, B5 must show the reason
("error 422: ..."), and B8 shows why decimal=comma exists: in de-DE, VALUE()
of a decimal point is an error.

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


def set_office_locale(ctx, tag):
    """The office's locale (what VALUE() and number display use), set through
    its configuration; applies to documents made after it."""
    cp = ctx.ServiceManager.createInstanceWithContext(
        "com.sun.star.configuration.ConfigurationProvider", ctx)
    node = PropertyValue()
    node.Name, node.Value = "nodepath", "/org.openoffice.Setup/L10N"
    ua = cp.createInstanceWithArguments("com.sun.star.configuration.ConfigurationUpdateAccess",
                                        (node,))
    ua.setPropertyValue("ooSetupSystemLocale", tag)
    ua.commitChanges()


def comma_sheet(ctx, desktop, base, hidden):
    """The de-DE sheet (module docstring): checks its cells against the JSON."""
    set_office_locale(ctx, "de-DE")
    doc = desktop.loadComponentFromURL("private:factory/scalc", "_blank", 0, (hidden,))
    de = Locale()
    de.Language, de.Country = "de", "DE"
    doc.CharLocale = de
    sheet = doc.Sheets.getByIndex(0)
    cell = sheet.getCellRangeByName
    rest = ("&intake_temperature=305&intake_pressure=98&peak_temperature=2400"
            "&compression_efficiency=0,92&expansion_efficiency=0,94")
    sel = "&select=" + POINTER
    otto = base + PATH + "?compression_ratio="
    _, text = http_get(base + PATH + "?" + urllib.parse.urlencode(PARAMS, safe=""))
    want = float(pointer(json.loads(text), POINTER))
    brayton = (base + "/v1/cycles/brayton?pressure_ratio=15,5&turbine_inlet_temperature=1480"
               "&inlet_pressure_loss=0,01")
    _, text = http_get(brayton.replace(",", "."))
    want_t = float(pointer(json.loads(text), "/stations/turbine_inlet/T"))
    cell("B1").setValue(10.5)
    cell("B2").setFormula('=WEBSERVICE("%s"&B1&"%s&decimal=comma%s")' % (otto, rest, sel))
    cell("B3").setFormula("=VALUE(B2)*100")
    cell("B4").setFormula('=WEBSERVICE("%s&decimal=comma&select=/stations/turbine_inlet/T")'
                          % brayton)
    cell("B5").setFormula('=WEBSERVICE("%s0.5%s&on_error=cell%s")' % (otto, rest, sel))
    cell("B6").setFormula("=ISERROR(VALUE(B5))")
    cell("B7").setFormula('=WEBSERVICE("%s10.5%s%s")' % (otto, rest.replace(",", "."), sel))
    cell("B8").setFormula("=ISERROR(VALUE(B7))")
    doc.calculateAll()
    got = {c: (cell(c).getString(), cell(c).getValue()) for c in
           ("B1", "B2", "B3", "B4", "B5", "B6", "B7", "B8")}
    print("     de-DE sheet: %r (JSON %r, turbine inlet %r)" % (got, want, want_t))
    check(got["B1"][0] == "10,5", "de-DE shows the number 10.5 as '10,5' (so a URL gets '10,5')")
    check(got["B2"][0].startswith("0,") and "." not in got["B2"][0],
          "B2: decimal=comma answers with a decimal comma")
    check(abs(got["B3"][1] - want * 100) <= 1e-9 * want * 100,
          "B3: =VALUE(B2)*100 in de-DE equals 100 x the JSON value")
    t_cell = float(got["B4"][0].replace(",", ".")) if got["B4"][0][:1].isdigit() else -1.0
    check(abs(t_cell - want_t) <= 1e-9 * want_t, "B4: /stations/turbine_inlet/T equals the JSON")
    check(got["B5"][0].startswith("error 422: /compression_ratio:"),
          "B5: on_error=cell shows the reason in the cell")
    check(got["B6"][1] == 1.0, "B6: VALUE() of the error text is an error")
    check(got["B8"][1] == 1.0, "B8: without decimal=comma, VALUE() of '0.48...' fails in de-DE")
    doc.close(True)


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
        comma_sheet(ctx, desktop, base, hidden)
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
