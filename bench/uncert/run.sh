#!/usr/bin/env bash
# run.sh — the issue-14 Monte Carlo over HTTP, on 127.0.0.1 only: starts the
# given server on a free port (bench/lib.sh; its default threads, one per
# core, and its default limits), then POSTs /v1/uncertainty with the case of
# bench/uncert/brayton15.json (the fuel-fired Brayton, 2 + 2 stages with a
# regenerator, 15 uncertain inputs, 7 outputs) as a 10,000-sample Monte
# Carlo run, three times with the turbine inlet temperature varied, and the
# same inputs to POST /v1/cycles/brayton five times; prints the medians, the
# Monte Carlo time (target <= 1 s) and its ratio to one evaluation over HTTP,
# and stops the server by PID. Figures only: nothing here fails on speed.
# Usage: bench/uncert/run.sh [build/gascycled]
set -euo pipefail
cd "$(dirname "$0")/../.."
server=${1:-build/gascycled}
. bench/lib.sh
bench_init bench-uncert-http
bench_start_server "$server" --log-level warn
base="http://127.0.0.1:$port"

body() {   # $1 TIT, $2 extra members -> the request in $tmp/body.json
    sed -e "s/@TIT@/$1/" -e "s/@MC@/$2/" bench/uncert/brayton15.json > "$tmp/body.json"
}
post() {   # $1 path -> seconds; fails on a status other than 200
    local out
    out=$(curl -s -o "$tmp/out.json" -w '%{http_code} %{time_total}' \
          -H 'Content-Type: application/json' --data-binary @"$tmp/body.json" "$base$1")
    [ "${out%% *}" = 200 ] || { echo "bench-uncert-http: $1 answered ${out%% *}" >&2; \
                                head -c 400 "$tmp/out.json" >&2; exit 1; }
    echo "${out#* }"
}
median() { sort -g | awk '{ v[NR] = $1 } END { print v[int((NR + 1) / 2)] }'; }

python3 -c 'import json,sys; d=json.load(open(sys.argv[1])); json.dump(d["inputs"], open(sys.argv[2],"w"))' \
    <(sed -e 's/@TIT@/1400/' -e 's/@MC@//' bench/uncert/brayton15.json) "$tmp/inputs.json"
single() {   # $1 TIT
    sed -e "s/\"turbine_inlet_temperature\": \"[0-9.]* K\"/\"turbine_inlet_temperature\": \"$1 K\"/" \
        "$tmp/inputs.json" > "$tmp/body.json"
    post /v1/cycles/brayton
}
tits=(1384.2 1391.7 1399.3 1406.8 1413.1)
single 1400 >/dev/null   # warm-up
e=$(for t in "${tits[@]}"; do single "$t"; done | median)
mc=', "method": "monte_carlo", "samples": 10000, "seed": 7'
m=$(for t in 1387.5 1402.5 1417.5; do body "$t" "$mc"; post /v1/uncertainty; done | median)
threads=$(python3 -c 'import json,sys; print(json.load(open(sys.argv[1]))["conventions"]["monte_carlo"]["threads"])' "$tmp/out.json")
echo "bench-uncert-http: $(nproc) cores; server threads $threads; curl on 127.0.0.1; medians"
awk -v e="$e" -v m="$m" 'BEGIN {
    printf "POST /v1/cycles/brayton (one evaluation, full document)   %8.4f s\n", e;
    printf "POST /v1/uncertainty, Monte Carlo 10,000 samples          %8.3f s   (target <= 1 s) = %.0f single requests\n", m, m / e;
}'
