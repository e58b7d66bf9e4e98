#!/usr/bin/env bash
# run.sh — HTTP benchmark of gascycled with wrk, on 127.0.0.1 only: starts the
# given server binary on a free port (--port 0; the port is read from its
# "listening" log line), runs wrk for BENCH_SECONDS (default 5) against
# /healthz and against GET /v1/properties with a varying temperature
# (properties.lua), first with the access log on (written to a temporary
# file, as a log collector would take it) and then with --log-level warn,
# prints requests/s and latency percentiles, and stops the server by PID.
# Figures only: nothing here passes or fails on speed.
# Usage: bench/http/run.sh [build/gascycled]
set -euo pipefail
cd "$(dirname "$0")/../.."
server=${1:-build/gascycled}
. bench/lib.sh
bench_init bench-http

start_server() {   # $@: extra flags
    bench_start_server "$server" "$@"
    # Keep-alive must hold, or the figures measure connection set-up.
    local trace
    trace=$(curl -sv "http://127.0.0.1:$port/healthz" "http://127.0.0.1:$port/healthz" 2>&1 || true)
    case "$trace" in
        *"Re-using existing connection"*) ;;
        *) echo "bench-http: WARNING: keep-alive connection not reused" >&2 ;;
    esac
}

run_wrk() {   # $1 label, $2.. wrk args
    local label=$1; shift
    echo "== $label"
    wrk -t"$wrk_threads" -c"$conns" -d"${secs}s" --latency "$@" \
        | grep -E "Requests/sec|Latency|50%|90%|99%|Non-2xx|Socket errors|requests in"
}

echo "bench-http: $(nproc) cores, server threads = cores, wrk -t$wrk_threads -c$conns -d${secs}s"
for mode in "access log on" "access log off"; do
    if [ "$mode" = "access log on" ]; then start_server; else start_server --log-level warn; fi
    curl -sf "http://127.0.0.1:$port/v1/properties?gas=air&T=1000" >/dev/null \
        || { echo "bench-http: /v1/properties does not answer 200" >&2; exit 1; }
    run_wrk "GET /healthz ($mode)" "http://127.0.0.1:$port/healthz"
    run_wrk "GET /v1/properties?gas=air&T=<varying> ($mode)" -s bench/http/properties.lua "http://127.0.0.1:$port"
    bench_stop_server
done
