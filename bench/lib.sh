# lib.sh — what the wrk benchmarks (bench/http/run.sh, bench/cycles/run.sh)
# share, sourced by them from the repository root: settings from the
# environment (BENCH_SECONDS, default 5; BENCH_CONNECTIONS, 64;
# BENCH_WRK_THREADS, 1), a temporary folder removed on exit, and a server
# started on 127.0.0.1 on a free port (--port 0; the port read from its JSON
# "listening" log line) and stopped by its PID.

# bench_init NAME: NAME prefixes the messages; sets secs, conns, wrk_threads, tmp.
bench_init() {
    bench_name=$1
    secs=${BENCH_SECONDS:-5}
    conns=${BENCH_CONNECTIONS:-64}
    wrk_threads=${BENCH_WRK_THREADS:-1}
    command -v wrk >/dev/null || { echo "$bench_name: wrk is not installed (scripts/deps.sh bench)" >&2; exit 2; }
    pid=""
    tmp=$(mktemp -d)
    trap bench_cleanup EXIT
}

bench_cleanup() {
    if [ -n "$pid" ]; then kill -TERM "$pid" 2>/dev/null || true; wait "$pid" 2>/dev/null || true; fi
    rm -rf "$tmp"
}

# bench_start_server SERVER [FLAGS...]: sets pid and port (log in $tmp/server.log).
bench_start_server() {
    local server=$1
    shift
    : > "$tmp/server.log"
    "$server" --listen 127.0.0.1 --port 0 --log-format json "$@" 2>"$tmp/server.log" &
    pid=$!
    port=""
    for _ in $(seq 1 200); do
        port=$(sed -n 's/.*"msg":"listening".*"port":\([0-9]*\).*/\1/p' "$tmp/server.log" | head -n1)
        [ -n "$port" ] && break
        sleep 0.05
    done
    [ -n "$port" ] || { echo "$bench_name: server did not start" >&2; cat "$tmp/server.log" >&2; exit 1; }
}

bench_stop_server() {
    kill -TERM "$pid"
    wait "$pid" || true
    pid=""
}
