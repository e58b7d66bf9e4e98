#!/usr/bin/env bash
# tests/ops/image-test.sh — builds the container image of docker/Dockerfile on
# this machine and checks that it behaves like an operator expects:
#   - the base is a local Debian bookworm made with debootstrap (no registry is
#     reachable here), imported as local/bookworm; the rootfs tarball is cached
#     under build/ops/ so a second run skips debootstrap;
#   - the container (host network, GASCYCLED_PORT on a free port) answers
#     /healthz, /readyz, one evaluation route and /metrics, runs as a non-root
#     user, carries the OCI labels, and its HEALTHCHECK reports "healthy";
#   - `docker stop` (SIGTERM) ends it with exit code 0 inside the grace period.
# It also prints figures (never pass/fail): image size, time from `docker run`
# to the first 200 on /healthz, and the replica's memory idle and under load.
# dockerd is started by hand if none is running (TOOLING.md recipe) and stopped
# again, by its PID, only if this script started it.
# Usage: tests/ops/image-test.sh   (as root; `make image-test` calls it)
set -euo pipefail
cd "$(dirname "$0")/../.."
. tests/ops/lib.sh

OUT=${BUILD:-build}/ops
TAG=${IMAGE_TAG:-gascycled:image-test}
BASE=local/bookworm
# The Debian mirror for debootstrap: DEBIAN_MIRROR, else the one this
# machine's own apt configuration uses (no archive host is written here).
MIRROR=${DEBIAN_MIRROR:-$(scripts/apt-mirror.sh bookworm)} \
    || { echo "image-test: no Debian mirror: set DEBIAN_MIRROR" >&2; exit 1; }
GRACE=${STOP_GRACE:-10}          # s, docker stop timeout before SIGKILL
DOCKER=${DOCKER:-}
if [ -z "$DOCKER" ]; then
    if [ -x /usr/bin/docker ]; then DOCKER=/usr/bin/docker; else DOCKER=docker; fi
fi
export DOCKER_BUILDKIT=0         # the classic builder honours --network=host

mkdir -p "$OUT"
OUT=$(cd "$OUT" && pwd)
FIG=$OUT/image-test.txt
: > "$FIG"
fig() { echo "image-test: $*"; echo "$*" >> "$FIG"; }
fail() { echo "image-test: FAIL: $*" >&2; exit 1; }

DOCKERD_PID=""
CID=""
cleanup() {
    set +e
    if [ -n "$CID" ]; then
        "$DOCKER" rm -f "$CID" >/dev/null 2>&1
    fi
    if [ -n "$DOCKERD_PID" ]; then
        echo "image-test: stopping the dockerd this test started (PID $DOCKERD_PID)"
        stop_pid "$DOCKERD_PID" 20
    fi
}
trap cleanup EXIT

# One image test at a time on a machine: a second one would otherwise race
# for the daemon (and stop it under the first one's feet).
exec 9>"${TMPDIR:-/tmp}/gascycled-image-test.lock"
flock -w 1200 9 || fail "another image test holds the lock for over 20 minutes"

# --- the daemon -------------------------------------------------------------
if ! "$DOCKER" info >/dev/null 2>&1; then
    echo "image-test: starting dockerd (log: $OUT/dockerd.log)"
    dockerd --iptables=false --bridge=none --storage-driver=vfs \
        >"$OUT/dockerd.log" 2>&1 9>&- &
    DOCKERD_PID=$!
    for _ in $(seq 1 150); do
        "$DOCKER" info >/dev/null 2>&1 && break
        if ! kill -0 "$DOCKERD_PID" 2>/dev/null; then
            # Lost a race with a daemon someone else started: use theirs.
            wait "$DOCKERD_PID" 2>/dev/null || true
            DOCKERD_PID=""
            "$DOCKER" info >/dev/null 2>&1 && break
            sleep 1
            "$DOCKER" info >/dev/null 2>&1 && break
            fail "dockerd exited; see $OUT/dockerd.log"
        fi
        sleep 0.2
    done
    "$DOCKER" info >/dev/null 2>&1 || fail "dockerd not ready after 30 s"
fi

# --- the local base image ---------------------------------------------------
t0=$(now_ms)
if ! "$DOCKER" image inspect "$BASE" >/dev/null 2>&1; then
    tarball=$OUT/bookworm-minbase.tar
    if [ ! -s "$tarball" ]; then
        echo "image-test: debootstrap --variant=minbase bookworm ($MIRROR)"
        rootfs=$OUT/rootfs
        rm -rf "$rootfs"
        debootstrap --variant=minbase bookworm "$rootfs" "$MIRROR" \
            >"$OUT/debootstrap.log" 2>&1 || fail "debootstrap failed; see $OUT/debootstrap.log"
        rm -rf "$rootfs"/var/cache/apt/archives/*.deb "$rootfs"/var/cache/apt/*.bin "$rootfs"/var/lib/apt/lists/*
        tar -C "$rootfs" -c . > "$tarball.tmp"
        mv "$tarball.tmp" "$tarball"
        rm -rf "$rootfs"
    fi
    "$DOCKER" import "$tarball" "$BASE" >/dev/null
fi
fig "base_ready_s=$(( ($(now_ms) - t0) / 1000 ))"

# --- the image ----------------------------------------------------------------
old_id=$("$DOCKER" image inspect -f '{{.Id}}' "$TAG" 2>/dev/null || true)
build_start=$(date +%s)
t0=$(now_ms)
timeout 900 "$DOCKER" build --network=host -f docker/Dockerfile \
    --build-arg BASE_IMAGE="$BASE" \
    --build-arg VERSION="$(cat VERSION)" \
    --build-arg GIT_REV="$(git rev-parse --short HEAD 2>/dev/null || echo unknown)" \
    -t "$TAG" . >"$OUT/image-build.log" 2>&1 \
    || { tail -n 30 "$OUT/image-build.log" >&2; fail "docker build failed; see $OUT/image-build.log"; }
fig "build_s=$(( ($(now_ms) - t0) / 1000 ))"
# The image this test built last time is now untagged: remove it (and its
# intermediate layers) so repeated runs do not fill the disk (vfs copies
# every layer in full).
new_id=$("$DOCKER" image inspect -f '{{.Id}}' "$TAG")
if [ -n "$old_id" ] && [ "$old_id" != "$new_id" ]; then
    "$DOCKER" rmi "$old_id" >/dev/null 2>&1 || true
fi
# Build-stage leaves of earlier runs (the current one stays as the cache).
"$DOCKER" image prune -f --filter label=gascycled.stage=build --filter "until=$build_start" >/dev/null 2>&1 || true
size=$("$DOCKER" image inspect -f '{{.Size}}' "$TAG")
base_size=$("$DOCKER" image inspect -f '{{.Size}}' "$BASE")
fig "image_size_MB=$(( size / 1000000 )) (base local/bookworm: $(( base_size / 1000000 )) MB, layers on top: $(( (size - base_size) / 1000 )) kB)"
"$DOCKER" history --no-trunc --format '{{.Size}}\t{{.CreatedBy}}' "$TAG" | cut -c1-160 > "$OUT/image-history.txt"

# Static properties of the image.
user=$("$DOCKER" image inspect -f '{{.Config.User}}' "$TAG")
case "$user" in ""|0|0:*|root|root:*) fail "image runs as root (User='$user')";; esac
[ "$("$DOCKER" image inspect -f '{{.Config.StopSignal}}' "$TAG")" = SIGTERM ] || fail "STOPSIGNAL is not SIGTERM"
"$DOCKER" image inspect -f '{{json .Config.Healthcheck.Test}}' "$TAG" | grep -q healthz || fail "no HEALTHCHECK on /healthz"
"$DOCKER" image inspect -f '{{json .Config.ExposedPorts}}' "$TAG" | grep -q '8080/tcp' || fail "port 8080 not exposed"
labels=$("$DOCKER" image inspect -f '{{json .Config.Labels}}' "$TAG")
for key in title description version revision created licenses source; do
    printf '%s' "$labels" | grep -q "\"org.opencontainers.image.$key\":" \
        || fail "label org.opencontainers.image.$key missing"
done
[ "$("$DOCKER" image inspect -f '{{index .Config.Labels "org.opencontainers.image.licenses"}}' "$TAG")" = MIT ] \
    || fail "label org.opencontainers.image.licenses is not MIT"
"$DOCKER" image inspect -f '{{range .Config.Env}}{{println .}}{{end}}' "$TAG" | grep -qx 'GASCYCLED_LISTEN=0.0.0.0' \
    || fail "GASCYCLED_LISTEN=0.0.0.0 not set in the image"

# --- run it -------------------------------------------------------------------
port=$(free_port)
base_url=http://127.0.0.1:$port
t0=$(now_ms)
CID=$("$DOCKER" run -d --network=host --health-interval=1s --health-start-period=0s \
      -e GASCYCLED_PORT="$port" --name "gascycled-image-test-$$" "$TAG")
wait_status "$base_url/healthz" 200 30 || { "$DOCKER" logs "$CID" 2>&1 | tail -n 20 >&2; fail "no 200 on /healthz within 30 s"; }
t_ok=$(now_ms)
fig "docker_run_to_first_healthz_200_ms=$(( t_ok - t0 ))"
# From the moment the container's process started (its rootfs is ready) to
# the first 200: the service's own start-up, without the storage driver's
# copy of the image.
started=$("$DOCKER" inspect -f '{{.State.StartedAt}}' "$CID")
fig "process_start_to_first_healthz_200_ms=$(( t_ok - $(date -d "$started" +%s%N) / 1000000 ))"

pid=$("$DOCKER" inspect -f '{{.State.Pid}}' "$CID")
uid=$(awk '/^Uid:/ {print $2}' "/proc/$pid/status")
[ "$uid" != 0 ] || fail "the service process runs as uid 0"

[ "$(curl -s -o /dev/null -w '%{http_code}' "$base_url/readyz")" = 200 ] || fail "/readyz is not 200"
path=$(eval_path "$base_url") || fail "no evaluation route answered 200"
[ "$path" != /healthz ] || fail "no API route (/v1/cycles/otto, /v1/properties, /v1/gases) answered 200"
body=$(curl -sf "$base_url$path") || fail "GET $path failed"
printf '%s' "$body" | node -e 'JSON.parse(require("fs").readFileSync(0,"utf8"))' \
    || fail "GET $path did not return JSON"
echo "image-test: GET $path -> 200, $(printf '%s' "$body" | wc -c) bytes of JSON"
metrics=$(curl -sf -D "$OUT/metrics.headers" "$base_url/metrics") || fail "GET /metrics failed"
grep -qi '^content-type: text/plain' "$OUT/metrics.headers" || fail "/metrics is not text/plain"
printf '%s\n' "$metrics" | grep -q '^# TYPE ' || fail "/metrics has no '# TYPE' lines"

# The HEALTHCHECK command itself must work inside the image.
health=""
for _ in $(seq 1 100); do
    health=$("$DOCKER" inspect -f '{{.State.Health.Status}}' "$CID")
    [ "$health" = healthy ] && break
    sleep 0.1
done
[ "$health" = healthy ] || fail "container health is '$health', not healthy"

# Access log lines reach the container's log stream, as JSON objects (the
# image sets GASCYCLED_LOG_FORMAT=json).
line=$("$DOCKER" logs "$CID" 2>&1 | grep -m 1 '/healthz' || true)
[ -n "$line" ] || fail "no access-log line for /healthz in docker logs"
printf '%s' "$line" | node -e '
const o = JSON.parse(require("fs").readFileSync(0, "utf8"));
for (const k of ["method", "path", "status"]) if (!(k in o)) throw new Error("log line without " + k);' \
    || fail "the access-log line is not a JSON object with method, path, status: $line"

# --- memory figures -----------------------------------------------------------
fig "rss_idle_kB=$(rss_kib "$pid")"
fig "docker_stats_idle=$("$DOCKER" stats --no-stream --format '{{.MemUsage}}' "$CID")"
if command -v wrk >/dev/null; then
    wrk -t1 -c16 -d3s -s tests/ops/vary.lua "$base_url$path" > "$OUT/image-wrk.txt" 2>&1 &
    wrk_pid=$!
    sleep 1.5
    fig "docker_stats_load=$("$DOCKER" stats --no-stream --format '{{.MemUsage}} cpu {{.CPUPerc}}' "$CID")"
    wait "$wrk_pid" || true
    fig "rss_peak_kB=$(hwm_kib "$pid") after 3 s of wrk -c16 on $path ($(awk '/Requests\/sec/ {print $2}' "$OUT/image-wrk.txt") req/s, shared cores)"
fi

# --- graceful stop --------------------------------------------------------------
t0=$(now_ms)
"$DOCKER" stop -t "$GRACE" "$CID" >/dev/null
stop_ms=$(( $(now_ms) - t0 ))
code=$("$DOCKER" inspect -f '{{.State.ExitCode}}' "$CID")
oom=$("$DOCKER" inspect -f '{{.State.OOMKilled}}' "$CID")
fig "stop_ms=$stop_ms exit_code=$code (grace ${GRACE}s)"
[ "$code" = 0 ] || { "$DOCKER" logs "$CID" 2>&1 | tail -n 20 >&2; fail "exit code $code after SIGTERM"; }
[ "$oom" = false ] || fail "container was OOM-killed"
[ "$stop_ms" -lt $(( GRACE * 1000 )) ] || fail "stop took ${stop_ms} ms, not inside the ${GRACE} s grace period"

echo "image-test: passed (figures in $FIG)"
