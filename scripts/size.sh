#!/usr/bin/env bash
# Units over the size guide of DEVELOPERS.md: non-test functions longer
# than 80 lines and Go files longer than 600 lines (test files included in
# the file count). Prints one line per unit, longest first, and exits 1
# when there is any. Other limits: size.sh -func N -file N.
set -euo pipefail
cd "$(dirname "$0")/.."
bin="$(mktemp)"
trap 'rm -f "$bin"' EXIT
go build -o "$bin" ./scripts/sizecheck
"$bin" "$@" .
