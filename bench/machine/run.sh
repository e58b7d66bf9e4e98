#!/usr/bin/env bash
# run.sh — HTTP benchmark of the machine routes with wrk, on 127.0.0.1 only:
# starts the given server on a free port (bench/lib.sh; access log off),
# then with ONE connection (so the latency is the service time of one
# request) for BENCH_SECONDS (default 5) each: GET /v1/machine/site (ambient
# varied per request) and GET /v1/machine/corrections with a 50-point
# ambient-temperature curve (range varied per request), both from
# bench/machine/machine.lua. Prints requests/s, p50 and p99 latency, the
# curve's p50 against its target (<= 50 ms on the reference machine) and the
# ratio of the curve to one site evaluation measured in the same run.
# Figures only: nothing here passes or fails on speed.
# Usage: bench/machine/run.sh [build/gascycled]
set -euo pipefail
cd "$(dirname "$0")/../.."
server=${1:-build/gascycled}
. bench/lib.sh
bench_init bench-machine-http

bench_start_server "$server" --log-level warn
base="http://127.0.0.1:$port"
curl -sf "$base/v1/machine/site?machine.design.net_power=45000&machine.design.fuel=methane" >/dev/null \
    || { echo "bench-machine-http: /v1/machine/site does not answer 200" >&2; exit 1; }

ms() {   # wrk's latency text (us, ms or s) in ms
    awk -v v="$1" 'BEGIN { u = v; sub(/[0-9.]+/, "", u); x = v + 0;
        if (u == "us") x /= 1000; else if (u == "s") x *= 1000; printf "%.2f", x }'
}

run() {   # $1 label, $2 route; leaves p50 (ms) in $p50ms
    local out p50 p99 non2xx r
    out=$(MACHINE_ROUTE=$2 wrk -t1 -c1 -d"${secs}s" --latency -s bench/machine/machine.lua "$base")
    r=$(echo "$out" | sed -n 's/^Requests\/sec: *\([0-9.]*\).*/\1/p')
    p50=$(echo "$out" | sed -n 's/^ *50% *\([^ ]*\).*/\1/p')
    p99=$(echo "$out" | sed -n 's/^ *99% *\([^ ]*\).*/\1/p')
    non2xx=$(echo "$out" | sed -n 's/^ *Non-2xx or 3xx responses: *\([0-9]*\).*/\1/p')
    p50ms=$(ms "$p50")
    printf "%-52s %8s req/s   p50 %8s ms   p99 %8s ms%s\n" "$1" "$r" "$p50ms" "$(ms "$p99")" \
        "${non2xx:+   NON-2XX: $non2xx}"
}

echo "bench-machine-http: $(nproc) cores, one connection, wrk -t1 -c1 -d${secs}s, access log off"
run "GET /v1/machine/site (ambient varied)" site; s=$p50ms
run "GET /v1/machine/corrections, 50 points (range varied)" corrections; c=$p50ms
awk -v s="$s" -v c="$c" 'BEGIN {
    printf "50-point correction curve over HTTP: p50 %.2f ms (target <= 50 ms on this machine)\n", c;
    printf "ratio curve / one site evaluation over HTTP: %.1f\n", c / s;
}'
bench_stop_server
