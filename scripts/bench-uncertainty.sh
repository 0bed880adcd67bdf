#!/usr/bin/env bash
# Cost of the Monte Carlo uncertainty of one water: runs the uncertainty
# benchmarks COUNT times (default 5) and prints the median time of one
# central assessment and of 1000 draws (one worker), and the cost of the
# draws as a multiple of one central assessment, against the target of
# 0.2 × N draws (200 central assessments for 1000 draws).
set -euo pipefail
cd "$(dirname "$0")/.."
count="${1:-5}"
out="$(go test ./uncertainty -run '^$' -bench 'Central|Draws1000' -benchmem -count "$count")"
echo "$out" | grep '^Benchmark'
echo "$out" | awk '
/^BenchmarkCentral/    { c[++nc] = $3 }
/^BenchmarkDraws1000/  { d[++nd] = $3 }
function median(a, n,   i, j, t) {
	for (i = 2; i <= n; i++) for (j = i; j > 1 && a[j-1] > a[j]; j--) { t = a[j]; a[j] = a[j-1]; a[j-1] = t }
	return (n % 2) ? a[(n+1)/2] : (a[n/2] + a[n/2+1]) / 2
}
END {
	cc = median(c, nc); dd = median(d, nd)
	printf "\none central assessment:        %10.1f µs (median of %d)\n", cc/1000, nc
	printf "1000 draws (one worker):       %10.1f µs\n", dd/1000
	printf "1000 draws / central:          %10.1f central assessments (%.3f × N)\n", dd/cc, dd/cc/1000
	printf "target: under 0.2 × N (200 central assessments for 1000 draws)\n"
}'
