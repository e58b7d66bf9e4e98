#!/usr/bin/env bash
# deps.sh — installs what the project needs on a fresh Debian 12 machine, and
# only what is missing: the Debian packages listed in scripts/packages/<group>.txt
# (one name per line, '#' comments) for each group named on the command line,
# and, for the group "node", the npm packages of tests/node (npm ci from the
# committed lock file). Runs apt-get as root, or through sudo otherwise.
# Usage: scripts/deps.sh build test node ...
set -euo pipefail
cd "$(dirname "$0")/.."

want=()
for group in "$@"; do
    [ "$group" = node ] && continue
    list="scripts/packages/$group.txt"
    [ -f "$list" ] || { echo "deps.sh: no package list $list" >&2; exit 2; }
    while read -r pkg _; do
        [ -n "$pkg" ] && [ "${pkg#\#}" = "$pkg" ] || continue
        # Node.js may come from outside Debian (its npm bundled, conflicting
        # with Debian's npm package): a working command is enough.
        case "$pkg" in
            nodejs) command -v node >/dev/null 2>&1 && continue ;;
            npm) command -v npm >/dev/null 2>&1 && continue ;;
        esac
        if ! dpkg-query -W -f='${Status}' "$pkg" 2>/dev/null | grep -q 'install ok installed'; then
            want+=("$pkg")
        fi
    done < "$list"
done

if [ ${#want[@]} -gt 0 ]; then
    sudo=""
    [ "$(id -u)" -eq 0 ] || sudo="sudo"
    echo "deps.sh: installing ${want[*]}"
    $sudo apt-get update -q
    DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -q --no-install-recommends "${want[@]}"
fi

for group in "$@"; do
    [ "$group" = node ] || continue
    stamp=tests/node/node_modules/.gascycled-stamp
    sum=$(sha256sum tests/node/package-lock.json | cut -d' ' -f1)
    if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$sum" ]; then
        echo "deps.sh: installing npm packages of tests/node"
        (cd tests/node && npm ci --no-audit --no-fund --loglevel=error)
        echo "$sum" > "$stamp"
    fi
done
