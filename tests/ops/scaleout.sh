#!/usr/bin/env bash
# tests/ops/scaleout.sh — gascycled replicas behind Debian's nginx, without
# containers. Two gascycled processes on two free ports, nginx (config from
# tests/ops/nginx-scaleout.conf; pid file, logs and temp paths in a mktemp
# folder; listening on 127.0.0.1 only) on a third.
#   check  (make scaleout-test) a few hundred requests through nginx: both
#          replicas serve some (nginx access log and their /metrics), every
#          answer equals the direct answer; then one replica is killed
#          (SIGKILL, by its PID) while requests are in flight and nginx must
#          keep answering with no 5xx (it retries on the other replica); the
#          survivor then stops on SIGTERM with exit code 0.
#   bench  (make bench-scaleout) wrk through nginx with two replicas, then
#          with one, then straight at one replica, ~5 s each; prints
#          requests/s and the replicas' resident memory. Figures only.
# Every process this script starts is stopped by its PID.
set -euo pipefail
cd "$(dirname "$0")/../.."
. tests/ops/lib.sh

MODE=${1:-check}
BUILD=${BUILD:-build}
SERVER=$BUILD/gascycled
NGINX=${NGINX:-/usr/sbin/nginx}
OUT=$BUILD/ops
mkdir -p "$OUT"
[ -x "$SERVER" ] || { echo "scaleout: $SERVER not built" >&2; exit 2; }
[ -x "$NGINX" ] || { echo "scaleout: $NGINX missing (scripts/deps.sh ops)" >&2; exit 2; }

TMP=$(mktemp -d "${TMPDIR:-/tmp}/gc-scaleout.XXXXXX")
chmod 755 "$TMP"   # nginx workers may run as another user and need to reach it
PIDS=()
cleanup() {
    set +e
    local i
    for ((i = ${#PIDS[@]} - 1; i >= 0; i--)); do stop_pid "${PIDS[$i]}" 5; done
    if [ "${KEEP_TMP:-0}" = 1 ]; then echo "scaleout: kept $TMP"; else rm -rf "$TMP"; fi
}
trap cleanup EXIT
fail() {
    echo "scaleout: FAIL: $*" >&2
    for f in "$TMP"/*.log; do [ -f "$f" ] && { echo "--- $f" >&2; tail -n 5 "$f" >&2; }; done
    exit 1
}

distinct_ports() {  # prints N distinct free ports
    local n=$1 p out=" "
    while [ "$(wc -w <<<"$out")" -lt "$n" ]; do
        p=$(free_port)
        case "$out" in *" $p "*) ;; *) out="$out$p ";; esac
    done
    echo $out
}
read -r PORT_A PORT_B PORT_LB PORT_LB1 <<<"$(distinct_ports 4)"

THREADS=${SCALEOUT_THREADS:-2}
start_replica() {  # start_replica NAME PORT -> sets REPLICA_PID
    "$SERVER" --listen 127.0.0.1 --port "$2" --threads "$THREADS" --log-format text \
        >"$TMP/$1.out" 2>"$TMP/$1.log" &
    REPLICA_PID=$!
    PIDS+=("$REPLICA_PID")
}

start_nginx() {  # start_nginx NAME LB_PORT REPLICAS(1|2) -> sets NGINX_PID
    local conf=$TMP/$1.conf dir=$TMP/$1
    mkdir -p "$dir"
    chmod 755 "$dir"
    sed -e "s#@TMP@#$dir#g" -e "s#@PORT_LB@#$2#g" -e "s#@PORT_A@#$PORT_A#g" -e "s#@PORT_B@#$PORT_B#g" \
        tests/ops/nginx-scaleout.conf > "$conf"
    [ "$3" = 2 ] || sed -i "/127.0.0.1:$PORT_B /d" "$conf"
    "$NGINX" -p "$dir" -e "$dir/error.log" -c "$conf" >"$TMP/$1-nginx.log" 2>&1 &
    NGINX_PID=$!
    PIDS+=("$NGINX_PID")
    wait_status "http://127.0.0.1:$2/healthz" 200 10 || fail "nginx $1 not answering on $2"
}

start_replica a "$PORT_A"; PID_A=$REPLICA_PID
start_replica b "$PORT_B"; PID_B=$REPLICA_PID
wait_status "http://127.0.0.1:$PORT_A/healthz" 200 10 || fail "replica a not up on $PORT_A"
wait_status "http://127.0.0.1:$PORT_B/healthz" 200 10 || fail "replica b not up on $PORT_B"
DIRECT=http://127.0.0.1:$PORT_A
EVAL=$(eval_path "$DIRECT") || fail "no route answers 200"
echo "scaleout: replicas a=$PORT_A (PID $PID_A) b=$PORT_B (PID $PID_B), route $EVAL"

# Sum of every sample of the request counter(s) in a replica's /metrics
# (metric names ending in _requests_total; 0 if the server exposes none).
requests_total() {
    curl -s -m 5 "http://127.0.0.1:$1/metrics" |
        awk '$1 !~ /^#/ && $1 ~ /_requests_total(\{|$)/ {s += $NF} END {printf "%d\n", s}'
}

if [ "$MODE" = check ]; then
    start_nginx lb "$PORT_LB" 2
    LB=http://127.0.0.1:$PORT_LB
    : > "$TMP/lb/access.log"
    before_a=$(requests_total "$PORT_A"); before_b=$(requests_total "$PORT_B")

    # Phase 1: both replicas up.
    out=$(node tests/ops/scaleout-client.js "$LB" "$DIRECT" "$EVAL" 300) \
        || fail "answers through nginx differ from direct answers: $out"
    echo "scaleout: phase 1 (2 replicas): $out"
    n_a=$(grep -c " 127.0.0.1:$PORT_A " "$TMP/lb/access.log" || true)
    n_b=$(grep -c " 127.0.0.1:$PORT_B " "$TMP/lb/access.log" || true)
    echo "scaleout: nginx access log: replica a served $n_a, replica b served $n_b"
    [ "$n_a" -gt 0 ] && [ "$n_b" -gt 0 ] || fail "one replica served nothing (a=$n_a b=$n_b)"
    after_a=$(requests_total "$PORT_A"); after_b=$(requests_total "$PORT_B")
    if [ "$after_a" -gt 0 ] || [ "$after_b" -gt 0 ]; then
        d_a=$((after_a - before_a)); d_b=$((after_b - before_b))
        echo "scaleout: /metrics request counters grew by a=$d_a b=$d_b"
        [ "$d_a" -gt 0 ] && [ "$d_b" -gt 0 ] || fail "a replica's request counter did not grow (a=$d_a b=$d_b)"
    else
        echo "scaleout: no *_requests_total metric exposed yet; relying on the nginx access log"
    fi

    # Phase 2: kill replica b while requests are in flight.
    : > "$TMP/lb/access.log"
    out=$(node tests/ops/scaleout-client.js "$LB" "$DIRECT" "$EVAL" 300 "$PID_B" 40) \
        || fail "nginx did not keep answering after replica b was killed: $out"
    echo "scaleout: phase 2 (b killed after 40 answers): $out"
    wait "$PID_B" 2>/dev/null || true
    kill -0 "$PID_B" 2>/dev/null && fail "replica b still running after SIGKILL"
    n5xx=$(awk '$1 ~ /^5/' "$TMP/lb/access.log" | wc -l)
    retried=$(grep -c ', ' "$TMP/lb/access.log" || true)
    echo "scaleout: nginx log after the kill: $n5xx answers 5xx to clients, $retried requests retried on the next replica"
    [ "$n5xx" -eq 0 ] || fail "$n5xx answers with 5xx after the kill"
    [ "$retried" -gt 0 ] || echo "scaleout: note: no request needed a retry (b had no request in flight)"

    # The survivor drains and exits 0 on SIGTERM.
    kill -TERM "$PID_A"
    rc=0; wait "$PID_A" || rc=$?
    [ "$rc" -eq 0 ] || fail "replica a exited with $rc after SIGTERM"
    echo "scaleout: passed"
    exit 0
fi

[ "$MODE" = bench ] || { echo "usage: $0 check|bench" >&2; exit 2; }
command -v wrk >/dev/null || { echo "scaleout: wrk missing (scripts/deps.sh bench)" >&2; exit 2; }
DUR=${BENCH_SECONDS:-5}
CONN=${BENCH_CONNECTIONS:-32}
FIG=$OUT/bench-scaleout.txt
: > "$FIG"
fig() { echo "bench-scaleout: $*"; echo "$*" >> "$FIG"; }
# The Lua script varies the first numeric query parameter on every request.
run_wrk() {  # run_wrk URL -> sets RPS; samples the replicas' RSS mid-run into MID_RSS
    wrk -t1 -c"$CONN" -d"${DUR}s" -s tests/ops/vary.lua "$1$EVAL" > "$TMP/wrk.txt" 2>&1 &
    local w=$!
    sleep "$(( DUR / 2 ))"
    MID_RSS="a=$(rss_kib "$PID_A") b=$(rss_kib "$PID_B")"
    wait "$w" || fail "wrk failed: $(cat "$TMP/wrk.txt")"
    if grep -q 'Non-2xx' "$TMP/wrk.txt"; then cat "$TMP/wrk.txt" >&2; fail "wrk saw non-2xx answers"; fi
    RPS=$(awk '/Requests\/sec/ {print $2}' "$TMP/wrk.txt")
}

fig "route $EVAL, replicas --threads $THREADS, wrk -t1 -c$CONN -d${DUR}s, $(nproc) cores shared by wrk, nginx and the replicas"
fig "rss_idle_kB a=$(rss_kib "$PID_A") b=$(rss_kib "$PID_B")"
start_nginx lb "$PORT_LB" 2; LB2_PID=$NGINX_PID
run_wrk "http://127.0.0.1:$PORT_LB"
fig "nginx + 2 replicas: $RPS req/s (rss_load_kB $MID_RSS)"
stop_pid "$LB2_PID" 5
start_nginx lb1 "$PORT_LB1" 1
run_wrk "http://127.0.0.1:$PORT_LB1"
fig "nginx + 1 replica: $RPS req/s (rss_load_kB $MID_RSS)"
run_wrk "$DIRECT"
fig "direct to 1 replica (no nginx): $RPS req/s (rss_load_kB $MID_RSS)"
fig "rss_peak_kB a=$(hwm_kib "$PID_A") b=$(hwm_kib "$PID_B")"
echo "bench-scaleout: figures in $FIG"
