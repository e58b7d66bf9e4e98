#!/usr/bin/env bash
# apt-mirror.sh — prints the Debian archive mirror this machine's own apt
# configuration uses for the main suite (not the security suite), so tools
# that fetch Debian themselves (debootstrap in the image test) use the same
# mirror as apt-get and no archive host is written into the project.
# Reads deb822 files (/etc/apt/sources.list.d/*.sources: URIs + Suites) and
# one-line files (/etc/apt/sources.list, *.list: "deb URI SUITE ...").
# Usage: scripts/apt-mirror.sh [SUITE]   (default bookworm); exit 1 if none.
set -euo pipefail
suite=${1:-bookworm}
root=${APT_ROOT:-}

from_deb822() {
    # Prints the first URI of a stanza whose Suites list the suite itself
    # and whose Types include deb.
    awk -v suite="$suite" '
        function flush() {
            if (is_deb && has_suite && uri != "") { print uri; found = 1; exit }
            is_deb = 0; has_suite = 0; uri = ""
        }
        /^[ \t]*$/ { flush(); next }
        /^[ \t]*#/ { next }
        tolower($1) == "types:" { for (i = 2; i <= NF; i++) if ($i == "deb") is_deb = 1 }
        tolower($1) == "uris:" { uri = $2 }
        tolower($1) == "suites:" { for (i = 2; i <= NF; i++) if ($i == suite) has_suite = 1 }
        tolower($1) == "enabled:" && tolower($2) == "no" { is_deb = 0 }
        END { if (!found) flush() }
    ' "$1"
}

from_one_line() {
    awk -v suite="$suite" '
        $1 == "deb" {
            i = 2
            if ($i ~ /^\[/) { while (i <= NF && $i !~ /\]$/) i++; i++ }
            if ($(i + 1) == suite) { print $i; exit }
        }
    ' "$1"
}

for f in "$root"/etc/apt/sources.list.d/*.sources; do
    [ -f "$f" ] || continue
    uri=$(from_deb822 "$f")
    [ -n "$uri" ] && { echo "${uri%/}"; exit 0; }
done
for f in "$root"/etc/apt/sources.list "$root"/etc/apt/sources.list.d/*.list; do
    [ -f "$f" ] || continue
    uri=$(from_one_line "$f")
    [ -n "$uri" ] && { echo "${uri%/}"; exit 0; }
done
echo "apt-mirror.sh: no 'deb' source for suite $suite in the apt configuration" >&2
exit 1
