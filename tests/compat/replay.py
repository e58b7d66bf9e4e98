#!/usr/bin/python3
"""replay.py — sends the request of every integration case file (and every
`expect same-as METHOD /target` request) to a running gascycled and stores
each answer, whatever its content type, for a before/after comparison of a
refactoring (tests/compat/compare.py).

    replay.py --base http://127.0.0.1:PORT --cases tests/integration/cases \
              --out DIR [--skip-area http]

    replay.py ... --corpus tests/compat/corpus.txt adds the requests listed there.

DIR/answers.json holds one entry per request: case, method, target, status,
content_type, body (text). The http/ area (transport framing, limits) is left
out by default: it tests the HTTP layer, not the answers.
"""
import argparse
import http.client
import json
import os
import sys
import urllib.parse


def parse_case(path):
    req = {"method": None, "target": None, "headers": [], "body": None}
    same = []
    with open(path, encoding="utf-8") as f:
        lines = f.read().split("\n")
    i = 0
    while i < len(lines):
        line = lines[i]
        i += 1
        s = line.strip()
        if not s or s.startswith("#"):
            continue
        kw, _, rest = line.partition(" ")
        if kw == "request":
            m, _, t = rest.partition(" ")
            req["method"], req["target"] = m, t
        elif kw == "header":
            name, _, value = rest.partition(":")
            req["headers"].append((name.strip(), value.strip()))
        elif kw == "body":
            if rest.startswith("<<"):
                end = rest[2:].strip()
                body = []
                while i < len(lines) and lines[i] != end:
                    body.append(lines[i])
                    i += 1
                i += 1
                req["body"] = "\n".join(body)
            else:
                req["body"] = rest
        elif kw == "body-file":
            with open(os.path.join(os.path.dirname(path), rest.strip()), encoding="utf-8") as bf:
                req["body"] = bf.read()
        elif kw == "expect" and rest.startswith("same-as "):
            arg = rest[len("same-as "):].strip()
            if arg.endswith(".case"):
                continue
            m, _, t = arg.partition(" ")
            same.append({"method": m, "target": t, "headers": [], "body": None})
    return req, same


def send(base, r):
    u = urllib.parse.urlsplit(base)
    conn = http.client.HTTPConnection(u.hostname, u.port, timeout=120)
    headers = {}
    for k, v in r["headers"]:
        if v:
            headers[k] = v
    body = r["body"]
    if body is not None and not any(k.lower() == "content-type" for k in headers):
        headers["Content-Type"] = "application/json"
    data = body.encode("utf-8") if body is not None else None
    conn.request(r["method"], r["target"], body=data, headers=headers)
    resp = conn.getresponse()
    text = resp.read().decode("utf-8", errors="replace")
    out = {"status": resp.status, "content_type": resp.getheader("Content-Type") or "",
           "body": text}
    conn.close()
    return out


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("--base", required=True)
    ap.add_argument("--cases", required=True)
    ap.add_argument("--out", required=True)
    ap.add_argument("--skip-area", action="append", default=["http"])
    ap.add_argument("--corpus", help="extra requests, one per line: 'GET /t' or 'POST /t BODY'")
    a = ap.parse_args()
    answers = []
    if a.corpus:
        with open(a.corpus, encoding="utf-8") as f:
            for k, line in enumerate(f):
                line = line.rstrip("\n")
                if not line or line.startswith("#"):
                    continue
                m, _, rest = line.partition(" ")
                t, _, body = rest.partition(" ")
                r = {"method": m, "target": t, "headers": [], "body": body or None}
                try:
                    ans = send(a.base, r)
                except Exception as e:
                    ans = {"status": 0, "content_type": "", "body": "error: %s" % e}
                ans.update({"case": "corpus:%d" % (k + 1), "n": 0, "method": m, "target": t})
                answers.append(ans)
    for root, dirs, files in os.walk(a.cases):
        dirs.sort()
        rel = os.path.relpath(root, a.cases)
        if rel.split(os.sep)[0] in a.skip_area:
            continue
        for name in sorted(files):
            if not name.endswith(".case"):
                continue
            path = os.path.join(root, name)
            req, same = parse_case(path)
            if not req["method"]:
                continue
            for k, r in enumerate([req] + same):
                try:
                    ans = send(a.base, r)
                except Exception as e:  # a refused or broken answer is recorded too
                    ans = {"status": 0, "content_type": "", "body": "error: %s" % e}
                ans.update({"case": os.path.join(rel, name), "n": k, "method": r["method"],
                            "target": r["target"]})
                answers.append(ans)
    os.makedirs(a.out, exist_ok=True)
    with open(os.path.join(a.out, "answers.json"), "w", encoding="utf-8") as f:
        json.dump(answers, f, indent=1)
    print("replay: %d answers -> %s" % (len(answers), a.out))


if __name__ == "__main__":
    sys.exit(main())
