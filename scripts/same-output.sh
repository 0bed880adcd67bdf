#!/usr/bin/env bash
# Checks that a change leaves every output as it was: builds scalerisk at
# REV (default main) and at the working tree, runs every command on the
# demo in every format with each, and compares the two sets of files.
# Only report.err differs (it names the output directory). Prints the
# diff and exits 1 when anything else differs.
# Usage: scripts/same-output.sh [REV]
set -euo pipefail
cd "$(dirname "$0")/.."
rev="${1:-main}"
tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"; git worktree remove --force "$tmp/base-src" 2>/dev/null || true' EXIT
git worktree add --detach --quiet "$tmp/base-src" "$rev"
(cd "$tmp/base-src" && go build -o "$tmp/before" ./cmd/scalerisk)
go build -o "$tmp/after" ./cmd/scalerisk

# outputs BINARY DIR: every command on the demo, every format.
outputs() {
	local b=$1 o=$2
	mkdir -p "$o"
	for f in text csv json; do
		"$b" assess --demo --format $f >"$o/assess.$f" 2>&1 || true
		"$b" assess --demo --temperature 60 --format $f >"$o/assess60.$f" 2>&1 || true
		"$b" dose --demo --reagent h2so4 --target lsi=0.5 --format $f >"$o/dose.$f" 2>&1 || true
		"$b" dose --demo --reagent naoh --target ph=8.5 --format $f >"$o/dosenaoh.$f" 2>&1 || true
		"$b" cycles --demo --limits no-inhibitor --format $f >"$o/cycles.$f" 2>&1 || true
		"$b" cycles --demo --limits inhibitor --carbonate ph=7.8 --format $f >"$o/cyclesph.$f" 2>&1 || true
		"$b" sweep --demo --vary temperature=10:80:8 --format $f >"$o/sweep.$f" 2>&1 || true
		"$b" sweep --demo --vary temperature=10:80:4 --vary cycles=1:5:3 --format $f >"$o/sweep2.$f" 2>&1 || true
		"$b" blend --demo --fraction 0.3 --format $f >"$o/blend.$f" 2>&1 || true
	done
	"$b" minerals >"$o/minerals.txt" 2>&1 || true
	"$b" report --demo -o "$o/report.html" >"$o/report.err" 2>&1 || true
}
outputs "$tmp/before" "$tmp/out-before"
outputs "$tmp/after" "$tmp/out-after"
if diff -r -x report.err "$tmp/out-before" "$tmp/out-after"; then
	echo "same output as $rev: $(ls "$tmp/out-after" | wc -l) files"
else
	exit 1
fi
