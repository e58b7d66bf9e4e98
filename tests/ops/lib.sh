# tests/ops/lib.sh — shell helpers shared by the ops tests (sourced, not run):
# free TCP ports on 127.0.0.1, waiting for an HTTP status, and millisecond
# clocks. Needs bash, curl and node (node only to ask the kernel for a port).

# Prints a TCP port that is free on 127.0.0.1 right now (the kernel picks it;
# a small race with other programs remains, as with any such helper).
free_port() {
    node -e 'const s=require("net").createServer();s.listen(0,"127.0.0.1",()=>{console.log(s.address().port);s.close();});'
}

# Milliseconds since the epoch.
now_ms() {
    echo $(( $(date +%s%N) / 1000000 ))
}

# wait_status URL STATUS TIMEOUT_S: polls URL every 20 ms until it answers
# with STATUS; returns 1 after TIMEOUT_S seconds.
wait_status() {
    local url=$1 want=$2 timeout_s=$3 code deadline
    deadline=$(( $(now_ms) + timeout_s * 1000 ))
    while [ "$(now_ms)" -lt "$deadline" ]; do
        code=$(curl -s -o /dev/null -m 1 -w '%{http_code}' "$url" 2>/dev/null || true)
        [ "$code" = "$want" ] && return 0
        sleep 0.02
    done
    return 1
}

# rss_kib PID: resident set size of a process in KiB (VmRSS).
rss_kib() {
    awk '/^VmRSS:/ {print $2}' "/proc/$1/status" 2>/dev/null || echo 0
}

# hwm_kib PID: peak resident set size of a process in KiB (VmHWM).
hwm_kib() {
    awk '/^VmHWM:/ {print $2}' "/proc/$1/status" 2>/dev/null || echo 0
}

# stop_pid PID [GRACE_S]: SIGTERM, wait up to GRACE_S (default 5) seconds,
# then SIGKILL. Only for processes this test started itself.
stop_pid() {
    local pid=$1 grace=${2:-5} i
    kill -0 "$pid" 2>/dev/null || return 0
    kill -TERM "$pid" 2>/dev/null || true
    for ((i = 0; i < grace * 20; i++)); do
        kill -0 "$pid" 2>/dev/null || { wait "$pid" 2>/dev/null || true; return 0; }
        sleep 0.05
    done
    kill -KILL "$pid" 2>/dev/null || true
    wait "$pid" 2>/dev/null || true
}

# eval_path BASE_URL: the first API route the server serves, as a path with a
# query string: an Otto cycle if that route exists, else /v1/properties, else
# /v1/gases, else /healthz (while the API layer is still being built).
eval_path() {
    local base=$1 p
    for p in '/v1/cycles/otto?compression_ratio=8&peak_temperature=1800' \
             '/v1/properties?gas=air&T=300&P=101.325' \
             '/v1/gases' \
             '/healthz'; do
        if [ "$(curl -s -o /dev/null -m 5 -w '%{http_code}' "$base$p")" = 200 ]; then
            echo "$p"
            return 0
        fi
    done
    return 1
}
