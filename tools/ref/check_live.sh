#!/usr/bin/env bash
# check_live.sh — re-runs the generator of each named reference table and
# compares its fresh output with the committed table numerically
# (compare_tables.py: column names and row count exact, values within a
# relative tolerance), never as text: a reference library's last digits
# differ between CPUs of the same kind.
#
# Each table names its own generator in a header line
#   # command: <generator command> > tests/reference/<table>.csv
# and that command (the part before '>') is what runs here, from the
# repository root. Usage: tools/ref/check_live.sh TABLE.csv ...
set -euo pipefail
cd "$(dirname "$0")/../.."
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
bad=0
for f in "$@"; do
    table="tests/reference/$f"
    cmd=$(sed -n 's/^# command: *\(.*\) >.*$/\1/p' "$table" | head -n 1)
    if [ -z "$cmd" ]; then
        echo "reference-live: $table has no '# command: ... > ...' header line"; bad=1; continue
    fi
    if ! bash -c "$cmd" > "$tmp/$f" 2> "$tmp/$f.err"; then
        echo "reference-live: the generator of $table failed: $cmd"; cat "$tmp/$f.err"; bad=1; continue
    fi
    echo "reference-live: $table against a fresh run of: $cmd"
    if ! /usr/bin/python3 tools/ref/compare_tables.py "$table" "$tmp/$f"; then
        echo "reference-live: $table differs from its generator"; bad=1
    fi
done
[ $bad -eq 0 ] || { echo "reference-live: FAILED (library changed or table edited by hand)"; exit 1; }
