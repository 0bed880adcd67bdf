#!/bin/sh
# random-waters.sh [N]: N random waters (default 100000) from fresh to brine, pH 2-12,
# 0-100 °C, with trace Ba, Sr, F, SiO2, PO4, Fe and Mn, through speciation, saturation indices
# and joint precipitation (saturation.TestRandomWaterSuite). Prints the summary line: waters
# converged, sample errors (inconsistent, no convergence) and failures by kind (panic, NaN,
# joint precipitation, error without a reason). Exits 1 when the test fails.
set -eu
cd "$(dirname "$0")/.."
n="${1:-100000}"
out="$(SCALERISK_RANDOM_WATERS="$n" go test ./saturation -run '^TestRandomWaterSuite$' -count=1 -v -timeout 60m 2>&1)" || status=$?
printf '%s\n' "$out" | grep -E 'random waters:|reliability_test' || true
exit "${status:-0}"
