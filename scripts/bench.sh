#!/usr/bin/env bash
# Speed, memory and latency of scalerisk, measured side by side in one run.
#
# Usage: scripts/bench.sh [-n COUNT] [-t SECONDS] [--full-million]
#
#   -n COUNT        runs of each Go benchmark and whole-process run (default 3);
#                   medians are printed
#   -t SECONDS      how long the 1M-row runs go before they are stopped
#                   (default 30): peak RSS and samples done are measured on
#                   that timed portion
#   --full-million  run the 1M-row files to the end instead (hours at ~2 ms
#                   per sample per core)
#
# It builds the command, generates invented files of cooling-tower and
# brackish well waters (scripts/genwaters.sh: 10k and 1M rows, with a bad
# row about every 97th), runs the Go benchmarks of saturation and water and
# whole-process runs of the command, and prints the ratios and figures the
# targets are stated in, each with its target and whether it is met. The
# machine may be shared: the load average is printed at the start and end;
# quote the medians with it.
set -euo pipefail
cd "$(dirname "$0")/.."

count=3
portion=30
full=0
while [ $# -gt 0 ]; do
	case "$1" in
	-n) count="$2"; shift 2 ;;
	-t) portion="$2"; shift 2 ;;
	--full-million) full=1; shift ;;
	*) echo "usage: scripts/bench.sh [-n COUNT] [-t SECONDS] [--full-million]" >&2; exit 2 ;;
	esac
done

tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
bin="$tmp/scalerisk"
go build -o "$bin" ./cmd/scalerisk
echo "machine: $(nproc) cores, $(awk '/MemTotal/ {printf "%.1f GiB", $2/1048576}' /proc/meminfo); load average at start: $(cut -d' ' -f1-3 /proc/loadavg)"
echo "runs: $count of each (medians); 1M-row runs: $([ "$full" = 1 ] && echo "to the end" || echo "stopped after $portion s")"

# BENCH_ROWS, BENCH_BIG and BENCH_FEW shrink the files for a quick try of
# the script itself (the labels keep saying 10k, 1M and 1,000).
scripts/genwaters.sh "${BENCH_ROWS:-10000}" 1 >"$tmp/w10k.csv"
head -n "$((${BENCH_FEW:-1000} + 1))" "$tmp/w10k.csv" >"$tmp/w1k.csv"
scripts/genwaters.sh "${BENCH_BIG:-1000000}" 2 >"$tmp/w1m.csv"

# --- Go benchmarks ----------------------------------------------------------
echo
echo "== Go benchmarks (go test -bench, -count $count)"
{
	go test ./saturation -run '^$' -benchmem -count "$count" \
		-bench '^Benchmark(SpeciateCold|SpeciateWarm|Sweep100|DemoSpeciateCold|Assess|SweepPoint|SpeciatePitzerSeawater|SpeciateIonPairSeawater)$' || true
	go test ./water -run '^$' -benchmem -count "$count" -bench '^BenchmarkParseRow$' || true
} >"$tmp/gobench.txt" 2>&1
grep '^Benchmark' "$tmp/gobench.txt" || echo "(no benchmark ran; see go test output)"

# bench NAME FIELD: median over the runs of benchmark NAME (without the
# -GOMAXPROCS suffix) of FIELD (3: ns/op; the field before "allocs/op"
# when FIELD is allocs); NA when it did not run.
bench() {
	awk -v name="$1" -v field="$2" '
	{ n = $1; sub(/-[0-9]+$/, "", n) }
	n == name {
		if (field == "allocs") { for (i = 1; i <= NF; i++) if ($i == "allocs/op") v[++k] = $(i-1) }
		else v[++k] = $field
	}
	END {
		if (!k) { print "NA"; exit }
		for (i = 2; i <= k; i++) for (j = i; j > 1 && v[j-1] > v[j]; j--) { t = v[j]; v[j] = v[j-1]; v[j-1] = t }
		print (k % 2) ? v[(k+1)/2] : (v[k/2] + v[k/2+1]) / 2
	}' "$tmp/gobench.txt"
}

# --- whole-process runs -----------------------------------------------------
# timed OUT CMD...: runs CMD with stdout to OUT under /usr/bin/time and
# prints "seconds peak_rss_kb cpu_seconds" (cpu: user + system).
timed() {
	local out="$1"; shift
	/usr/bin/time -f '%e %M %U %S' -o "$tmp/time.txt" "$@" >"$out" 2>/dev/null || true
	tail -n 1 "$tmp/time.txt" | awk '{ print $1, $2, $3 + $4 }'
}

# median of the numbers on stdin.
median() {
	sort -g | awk '{ v[++k] = $1 } END { if (!k) { print "NA"; exit } print (k % 2) ? v[(k+1)/2] : (v[k/2] + v[k/2+1]) / 2 }'
}

# first_byte CMD...: milliseconds from start to the first byte on stdout
# (the run is then stopped by the closed pipe).
first_byte() {
	local start end
	start=$(date +%s%N)
	end=$({ "$@" 2>/dev/null || true; } | { head -c 1 >/dev/null; date +%s%N; })
	echo $(((end - start) / 1000000))
}

echo
echo "== Whole-process runs"
: >"$tmp/j1"; : >"$tmp/j2"; : >"$tmp/rss10k"; : >"$tmp/c1"; : >"$tmp/c2"
for _ in $(seq "$count"); do
	read -r s1 _ c1 < <(timed /dev/null "$bin" assess --format csv --jobs 1 "$tmp/w10k.csv")
	read -r s2 m2 c2 < <(timed /dev/null "$bin" assess --format csv --jobs 2 "$tmp/w10k.csv")
	echo "$s1" >>"$tmp/j1"; echo "$s2" >>"$tmp/j2"; echo "$m2" >>"$tmp/rss10k"; echo "$c1" >>"$tmp/c1"; echo "$c2" >>"$tmp/c2"
	echo "assess 10k rows, csv: 1 worker $s1 s (cpu $c1 s), 2 workers $s2 s (cpu $c2 s, peak RSS $((m2 / 1024)) MB)"
done
t1=$(median <"$tmp/j1"); t2=$(median <"$tmp/j2"); rss10k=$(median <"$tmp/rss10k")
cpu1=$(median <"$tmp/c1"); cpu2=$(median <"$tmp/c2")
read -r _ rss10kjson _ < <(timed /dev/null "$bin" assess --format json "$tmp/w10k.csv")
echo "assess 10k rows, json: peak RSS $((rss10kjson / 1024)) MB"

limit=()
[ "$full" = 1 ] || limit=(timeout "$portion")
declare -A rss1m done1m
for f in csv json; do
	read -r secs rss _ < <(timed "$tmp/out1m.$f" "${limit[@]}" "$bin" assess --format "$f" "$tmp/w1m.csv")
	if [ "$f" = csv ]; then n=$(($(wc -l <"$tmp/out1m.$f") - 1)); else n=$(grep -o '"line":' "$tmp/out1m.$f" | wc -l); fi
	rss1m[$f]=$rss; done1m[$f]=$n
	echo "assess 1M rows, $f: $n samples written in $secs s, peak RSS $((rss / 1024)) MB"
	rm -f "$tmp/out1m.$f"
done

: >"$tmp/fb10k"; : >"$tmp/fb1mcsv"; : >"$tmp/fb1mjson"
for _ in $(seq "$count"); do
	first_byte "$bin" assess --format csv "$tmp/w10k.csv" >>"$tmp/fb10k"
	first_byte "$bin" assess --format csv "$tmp/w1m.csv" >>"$tmp/fb1mcsv"
	first_byte "$bin" assess --format json "$tmp/w1m.csv" >>"$tmp/fb1mjson"
done
fb10k=$(median <"$tmp/fb10k"); fbcsv=$(median <"$tmp/fb1mcsv"); fbjson=$(median <"$tmp/fb1mjson")
echo "first output byte: 10k csv $fb10k ms, 1M csv $fbcsv ms, 1M json $fbjson ms (medians)"

read -r sweepsecs sweeprss _ < <(timed /dev/null "$bin" sweep --format json --vary temperature=10:80:20 --vary cycles=1:8:20 "$tmp/w1k.csv")
echo "sweep 20x20 of 1,000 samples: $sweepsecs s, peak RSS $((sweeprss / 1024)) MB"
read -r cycsecs cycrss _ < <(timed /dev/null "$bin" cycles --format csv "$tmp/w1k.csv")
echo "cycles of 1,000 samples: $cycsecs s, peak RSS $((cycrss / 1024)) MB"

# --- summary ----------------------------------------------------------------
cold_c=$(bench BenchmarkDemoSpeciateCold/cooling 3)
cold_b=$(bench BenchmarkDemoSpeciateCold/brackish 3)
assess_c=$(bench BenchmarkAssess/cooling 3)
assess_b=$(bench BenchmarkAssess/brackish 3)
parse=$(bench BenchmarkParseRow 3)
parse_allocs=$(bench BenchmarkParseRow allocs)
sweep=$(bench BenchmarkSweepPoint 3)
pitzer=$(bench BenchmarkSpeciatePitzerSeawater 3)
ionpair=$(bench BenchmarkSpeciateIonPairSeawater 3)

echo
echo "load average at end: $(cut -d' ' -f1-3 /proc/loadavg)"
echo
awk -v cold_c="$cold_c" -v cold_b="$cold_b" -v assess_c="$assess_c" -v assess_b="$assess_b" \
	-v parse="$parse" -v parse_allocs="$parse_allocs" -v sweep="$sweep" -v pitzer="$pitzer" -v ionpair="$ionpair" \
	-v t1="$t1" -v t2="$t2" -v cpu1="$cpu1" -v cpu2="$cpu2" -v rss10k="$rss10k" -v rss10kjson="$rss10kjson" \
	-v rsscsv="${rss1m[csv]}" -v rssjson="${rss1m[json]}" -v ncsv="${done1m[csv]}" -v njson="${done1m[json]}" \
	-v fb10k="$fb10k" -v fbcsv="$fbcsv" -v fbjson="$fbjson" -v sweeprss="$sweeprss" -v cycrss="$cycrss" -v full="$full" '
function na(x) { return x == "NA" || x == "" }
function ratio(a, b) { return (na(a) || na(b) || b == 0) ? "NA" : a / b }
function row(what, v, fmt, target, ok) {
	if (na(v)) { printf "%-46s %12s  %-10s %s\n", what, "n/a", target, "(benchmark not found)"; return }
	printf "%-46s " fmt "  %-10s %s\n", what, v, target, (target == "" ? "" : (ok ? "met" : "MISSED"))
}
BEGIN {
	printf "%-46s %12s  %-10s %s\n", "quantity", "measured", "target", "verdict"
	r = ratio(assess_c, cold_c); row("full assess / cold speciation, cooling", r, "%11.1fx", "<= 6x", r <= 6)
	r = ratio(assess_b, cold_b); row("full assess / cold speciation, brackish", r, "%11.1fx", "<= 6x", r <= 6)
	r = ratio(parse, cold_c); row("CSV parse of a row / one speciation", r, "%11.2fx", "<= 0.2x", r <= 0.2)
	row("allocations per parsed row", parse_allocs, "%12d", "<= 10", parse_allocs <= 10)
	r = ratio(t1, t2); row("two workers / one worker, 10k rows (speed-up)", r, "%11.2fx", ">= 1.8x", r >= 1.8)
	r = ratio(cpu2, t2); row("  cores kept busy by 2 workers (cpu / wall)", r, "%11.2fx", "", 1)
	r = ratio(cpu2, cpu1); row("  cpu of 2 workers / cpu of 1 (overhead)", r, "%11.2fx", "", 1)
	r = ratio(sweep, cold_c); row("warm sweep point / cold solve", r, "%11.2fx", "", 1)
	r = ratio(pitzer, ionpair); row("Pitzer / ion association (seawater)", r, "%11.2fx", "", 1)
	row("peak RSS, 10k rows, csv (MB)", rss10k / 1024, "%12.1f", "< 100", rss10k / 1024 < 100)
	row("peak RSS, 10k rows, json (MB)", rss10kjson / 1024, "%12.1f", "< 100", rss10kjson / 1024 < 100)
	part = full ? "" : " (timed portion)"
	row("peak RSS, 1M rows, csv (MB)" part, rsscsv / 1024, "%12.1f", "< 100", rsscsv / 1024 < 100)
	row("peak RSS, 1M rows, json (MB)" part, rssjson / 1024, "%12.1f", "< 100", rssjson / 1024 < 100)
	printf "%-46s %12s\n", "  samples written in that portion, csv / json", ncsv " / " njson
	row("first output byte, 10k rows, csv (ms)", fb10k, "%12d", "", 1)
	row("first output byte, 1M rows, csv (ms)", fbcsv, "%12d", "< 1000", fbcsv < 1000)
	row("first output byte, 1M rows, json (ms)", fbjson, "%12d", "< 1000", fbjson < 1000)
	row("peak RSS, sweep 20x20 of 1,000 samples (MB)", sweeprss / 1024, "%12.1f", "< 100", sweeprss / 1024 < 100)
	row("peak RSS, cycles of 1,000 samples (MB)", cycrss / 1024, "%12.1f", "< 100", cycrss / 1024 < 100)
	printf "\nunits: cold speciation cooling %s ns, brackish %s ns; assess %s / %s ns; parse %s ns/row; 1 worker %s s, 2 workers %s s\n", \
		cold_c, cold_b, assess_c, assess_b, parse, t1, t2
}'
