#!/usr/bin/env bash
# run.sh — HTTP benchmark of /v1/measured/combustion with wrk, on 127.0.0.1
# only: a test-cell recording of 300 cycles x 1,440 samples (0.5 degree) per
# request, reduced by the real server (body received and parsed, pegging,
# heat release with k from the air model, burn points, statistics, the JSON
# answer written). Four invented recordings (tools/demo/test_cell_3.py, seeds
# 1..4: burn start, duration and heat vary from cycle to cycle) are sent in
# turn, one request at a time (wrk -t1 -c1, so latency is the request's own
# time), first as text/csv bodies, then as JSON; the server starts on a free
# port (--port 0) and stops by its PID (the JSON bodies carry the inputs the
# CSV requests give in the query string). Prints the median and p99 latency and
# the median's share of the issue's 0.5 s budget, and the JSON/CSV ratio
# measured in the same run. Figures only: nothing passes or fails on speed.
# Usage: bench/combustion/run.sh [build/gascycled]
set -euo pipefail
cd "$(dirname "$0")/../.."
server=${1:-build/gascycled}
. bench/lib.sh
bench_init bench-combustion-http

for seed in 1 2 3 4; do
    /usr/bin/python3 tools/demo/test_cell_3.py 300 0.5 "$seed" > "$tmp/rec$seed.csv"
    /usr/bin/python3 - "$tmp/rec$seed.csv" "$tmp/rec$seed.json" <<'PY'
import json, sys
rows = [l.split(",") for l in open(sys.argv[1]).read().splitlines() if l and not l.startswith("#")]
cols = list(zip(*rows[1:]))
with open(sys.argv[2], "w") as f:
    f.write('{"bore": "79 mm", "stroke": "81.5 mm", "connecting_rod_length": "129 mm", '
            '"compression_ratio": 10.5, "speed": 2000, "pegging": {"method": "intake", '
            '"intake_pressure": 92}, "ivc_temperature": 330, "pressure_unit": "bar", '
            '"crank_angle": [' + ",".join(cols[0]) + '], "cycles": [' +
            ",".join("[" + ",".join(c) + "]" for c in cols[1:]) + "]}")
PY
done
query="bore=79%20mm&stroke=81.5%20mm&connecting_rod_length=129%20mm&compression_ratio=10.5"
query="$query&speed=2000&pegging.method=intake&pegging.intake_pressure=92&ivc_temperature=330"
bench_start_server "$server" --log-level warn
url="http://127.0.0.1:$port/v1/measured/combustion?$query"
code=$(curl -s -o /dev/null -w '%{http_code}' -H 'Content-Type: text/csv' \
       --data-binary @"$tmp/rec1.csv" "$url")
[ "$code" = 200 ] || { echo "bench-combustion-http: the route answers $code" >&2; exit 1; }

to_ms() {   # wrk's "412.35ms" / "1.02s" / "850us" -> ms
    awk -v v="$1" 'BEGIN { n = v + 0; if (v ~ /us$/) n /= 1000; else if (v ~ /ms$/) n += 0;
                           else if (v ~ /s$/) n *= 1000; printf "%.1f", n }'
}

run() {   # $1 label, $2 URL, $3.. recordings; leaves the median in ms in $p50
    local label=$1 target=$2 out p99 reqs non2xx
    shift 2
    out=$(wrk -t1 -c1 -d"${secs}s" --timeout 10s --latency -s bench/combustion/recordings.lua \
          "$target" -- "$@")
    p50=$(to_ms "$(echo "$out" | sed -n 's/^ *50% *\([^ ]*\).*/\1/p')")
    p99=$(to_ms "$(echo "$out" | sed -n 's/^ *99% *\([^ ]*\).*/\1/p')")
    reqs=$(echo "$out" | sed -n 's/^ *\([0-9]*\) requests in.*/\1/p')
    non2xx=$(echo "$out" | sed -n 's/^ *Non-2xx or 3xx responses: *\([0-9]*\).*/\1/p')
    printf "%-44s %4s requests   p50 %7s ms   p99 %7s ms   p50 = %3.0f %% of 0.5 s%s\n" \
        "$label" "$reqs" "$p50" "$p99" "$(awk -v m="$p50" 'BEGIN { print m / 5 }')" \
        "${non2xx:+   NON-2XX: $non2xx}"
}

size=$(wc -c < "$tmp/rec1.csv")
jsize=$(wc -c < "$tmp/rec1.json")
echo "bench-combustion-http: $(nproc) cores, 300 cycles x 1440 samples per request ($((size / 1024)) KiB CSV, $((jsize / 1024)) KiB JSON), wrk -t1 -c1 -d${secs}s"
run "POST text/csv (4 recordings in turn)" "$url" "$tmp"/rec[1-4].csv; c=$p50
run "POST JSON (the same recordings)" "${url%%\?*}" "$tmp"/rec[1-4].json; j=$p50
awk -v c="$c" -v j="$j" 'BEGIN { printf "ratio JSON / CSV body (median)               %.2f\n", j / c }'
bench_stop_server
