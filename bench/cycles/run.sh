#!/usr/bin/env bash
# run.sh — HTTP benchmark of the cycle routes with wrk, on 127.0.0.1 only:
# starts the given server on a free port (--port 0, read from its
# "listening" log line, access log off with --log-level warn), runs wrk for
# BENCH_SECONDS (default 5) each on /healthz, GET /v1/cycles/otto
# (otto.lua: compression ratio and peak temperature varied per request) and
# GET /v1/cycles/brayton (brayton.lua: pressure ratio and turbine inlet
# temperature varied; without the optimum searches (the default) and with
# them), prints
# requests/s and the ratios to /healthz, and stops the server by PID.
# Each route's rate is divided by the mean of the /healthz runs just before
# and just after it (the machine may be shared: the neighbours see the same
# load). BENCH_ROUNDS (default 1) repeats the whole sequence and prints the
# median ratio over the rounds.
# Figures only: nothing here passes or fails on speed.
# Usage: bench/cycles/run.sh [build/gascycled]
set -euo pipefail
cd "$(dirname "$0")/../.."
server=${1:-build/gascycled}
. bench/lib.sh
bench_init bench-cycles-http

bench_start_server "$server" --log-level warn
base="http://127.0.0.1:$port"
curl -sf "$base/v1/cycles/otto?compression_ratio=10.5&peak_temperature=2400" >/dev/null \
    || { echo "bench-cycles-http: /v1/cycles/otto does not answer 200" >&2; exit 1; }

rps() {   # $1 label, $2.. wrk args; prints the line and leaves req/s in $last
    local label=$1 out
    shift
    out=$(wrk -t"$wrk_threads" -c"$conns" -d"${secs}s" --latency "$@")
    last=$(echo "$out" | sed -n 's/^Requests\/sec: *\([0-9.]*\).*/\1/p')
    local p50 p99 non2xx
    p50=$(echo "$out" | sed -n 's/^ *50% *\([^ ]*\).*/\1/p')
    p99=$(echo "$out" | sed -n 's/^ *99% *\([^ ]*\).*/\1/p')
    non2xx=$(echo "$out" | sed -n 's/^ *Non-2xx or 3xx responses: *\([0-9]*\).*/\1/p')
    printf "%-58s %10s req/s   p50 %-8s p99 %-8s%s\n" "$label" "$last" "$p50" "$p99" \
        "${non2xx:+   NON-2XX: $non2xx}"
}

rounds=${BENCH_ROUNDS:-1}
echo "bench-cycles-http: $(nproc) cores, server threads = cores, wrk -t$wrk_threads -c$conns -d${secs}s, access log off, $rounds round(s), load average at start: $(cut -d' ' -f1-3 /proc/loadavg)"
: > "$tmp/ratios"
for round in $(seq 1 "$rounds"); do
    [ "$rounds" -gt 1 ] && echo "round $round"
    rps "GET /healthz" "$base/healthz"; h1=$last
    rps "GET /v1/cycles/otto (cr, peak T varied)" -s bench/cycles/otto.lua "$base"; o=$last
    rps "GET /healthz (again)" "$base/healthz"; h2=$last
    rps "GET /v1/cycles/brayton 2+2 stages, regen, fuel, no optimum" -s bench/cycles/brayton.lua "$base"; b0=$last
    rps "GET /healthz (again)" "$base/healthz"; h3=$last
    BRAYTON_EXTRA="&optimum_search=true" rps "GET /v1/cycles/brayton 2+2 stages, regen, fuel, optimum search" -s bench/cycles/brayton.lua "$base"; b1=$last
    rps "GET /healthz (again)" "$base/healthz"; h4=$last
    awk -v h1="$h1" -v h2="$h2" -v h3="$h3" -v h4="$h4" -v o="$o" -v b0="$b0" -v b1="$b1" 'BEGIN {
        printf "%.4f %.4f %.5f\n", o / ((h1 + h2) / 2), b0 / ((h2 + h3) / 2), b1 / ((h3 + h4) / 2);
    }' >> "$tmp/ratios"
done
awk '{ o[NR] = $1; b[NR] = $2; x[NR] = $3 }
function median(a, n,    i, j, t) {
    for (i = 2; i <= n; i++)
        for (j = i; j > 1 && a[j] < a[j - 1]; j--) { t = a[j]; a[j] = a[j - 1]; a[j - 1] = t }
    return n % 2 ? a[(n + 1) / 2] : (a[n / 2] + a[n / 2 + 1]) / 2;
}
END {
    n = NR;
    label = n > 1 ? sprintf(" (median of %d rounds)", n) : "";
    printf "ratio otto / healthz                 %.3f   (target >= 0.5)%s\n", median(o, n), label;
    printf "ratio brayton (no optimum) / healthz %.3f   (target >= 0.35)%s\n", median(b, n), label;
    printf "ratio brayton (optimum) / healthz    %.4f%s\n", median(x, n), label;
}' "$tmp/ratios"
echo "bench-cycles-http: load average at end: $(cut -d' ' -f1-3 /proc/loadavg)"
