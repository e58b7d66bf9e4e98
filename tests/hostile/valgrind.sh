#!/bin/sh
# valgrind.sh — gascycled under valgrind memcheck with a short mixed load
# (tests/hostile/stress.c: every route, errors included, for VG_LOAD_S
# seconds, default 20), then SIGTERM: the server must exit 0 with "ERROR
# SUMMARY: 0 errors" (invalid reads and writes, uses of uninitialised
# values, and definite leaks all count as errors). Traffic: 127.0.0.1 only.
# usage: valgrind.sh SERVER STRESS   (env: BUILD, VG_LOAD_S)
set -eu
SERVER=$1
STRESS=$2
BUILD=${BUILD:-build}
OUT=$BUILD/hostile/valgrind
mkdir -p "$OUT"
log=$OUT/server.log
vlog=$OUT/memcheck.log
valgrind --tool=memcheck --error-exitcode=99 --leak-check=full --show-leak-kinds=definite \
    --errors-for-leak-kinds=definite --track-origins=yes --log-file="$vlog" \
    "$SERVER" --port 0 --log-format json --log-level warn --threads 2 2>"$log" &
PID=$!
trap 'kill -TERM $PID 2>/dev/null || true' EXIT INT TERM
PORT=
for _ in $(seq 1 600); do
    PORT=$(sed -n 's/.*"msg":"listening".*"port":\([0-9]*\).*/\1/p' "$log" | head -n 1)
    [ -n "$PORT" ] && break
    sleep 0.1
done
[ -n "$PORT" ] || { echo "valgrind: the server did not start (logs in $OUT)"; exit 1; }
"$STRESS" soak --port "$PORT" --pid "$PID" --conns 4 --duration "${VG_LOAD_S:-20}" --warmup 2 \
    --no-5xx > "$OUT/load.json" || { echo "valgrind: the load failed: $(cat "$OUT/load.json")"; exit 1; }
"$STRESS" bodies --port "$PORT" --pid "$PID" --conns 40 --size 262144 --duration 4 \
    > "$OUT/bodies.json" || true
kill -TERM $PID
status=0
wait $PID || status=$?
trap - EXIT INT TERM
summary=$(grep "ERROR SUMMARY" "$vlog" | tail -n 1)
echo "valgrind: load $(cat "$OUT/load.json")"
echo "valgrind: exit status $status; $summary"
[ "$status" -eq 0 ] && echo "$summary" | grep -q "ERROR SUMMARY: 0 errors" || {
    echo "valgrind: FAILED (see $vlog)"; exit 1; }
