#!/usr/bin/env bash
# Speed of the equilibrium engine: runs the saturation benchmarks COUNT
# times (default 5) and prints the median time of one sample cold and warm,
# the warm/cold ratio, and the median time per point of a 100-temperature
# sweep, against the 50 µs per-sample target.
set -euo pipefail
cd "$(dirname "$0")/.."
count="${1:-5}"
out="$(go test ./saturation -run '^$' -bench 'SpeciateCold|SpeciateWarm|Sweep100' -benchmem -count "$count")"
echo "$out" | grep '^Benchmark'
echo "$out" | awk '
/^BenchmarkSpeciateCold/ { cold[++nc] = $3 }
/^BenchmarkSpeciateWarm/ { warm[++nw] = $3 }
/^BenchmarkSweep100/     { sweep[++ns] = $3 / 100 }
function median(a, n,   i, j, t) {
	for (i = 2; i <= n; i++) for (j = i; j > 1 && a[j-1] > a[j]; j--) { t = a[j]; a[j] = a[j-1]; a[j-1] = t }
	return (n % 2) ? a[(n+1)/2] : (a[n/2] + a[n/2+1]) / 2
}
END {
	c = median(cold, nc); w = median(warm, nw); s = median(sweep, ns)
	printf "\none sample, cold start:        %8.1f µs (median of %d)\n", c/1000, nc
	printf "one sample, warm start:        %8.1f µs\n", w/1000
	printf "warm / cold:                   %8.2f\n", w/c
	printf "sweep, per temperature point:  %8.1f µs\n", s/1000
	printf "target: one sample under 50 µs; warm cheaper than cold\n"
}'
