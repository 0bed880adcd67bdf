#!/usr/bin/env bash
# Usage: genwaters.sh ROWS [SEED] — prints a wide laboratory CSV of ROWS
# invented waters of the fictional Kestrel Fen site (cooling-tower waters
# and brackish well waters, about half each), with a bad row about every
# 97th row (a decimal comma, a word for a number, a negative value, a
# short row) so that the good-rows-kept rule is exercised. The same ROWS and
# SEED give the same file.
set -euo pipefail
rows="${1:?usage: genwaters.sh ROWS [SEED]}"
seed="${2:-1}"
awk -v rows="$rows" -v seed="$seed" '
function u(a, b) { return a + (b - a) * rand() }
function f(x, d) { return sprintf("%." d "f", x) }
BEGIN {
	srand(seed)
	print "name,date,temperature [C],pH,pH_temperature [C],Ca [mg/L],Mg [mg/L],Na [mg/L],K [mg/L],Ba [mg/L],Sr [mg/L],Fe [mg/L],Mn [mg/L],Cl [mg/L],SO4 [mg/L],alkalinity [mg/L as CaCO3],SiO2 [mg/L],PO4 [mg/L],F [mg/L],NO3 [mg/L as N],B [mg/L],TDS [mg/L],conductivity [µS/cm]"
	for (i = 1; i <= rows; i++) {
		if (rand() < 0.5) {
			kind = "tower"; t = u(15, 45); ph = u(7.0, 8.8)
			ca = u(40, 400); mg = u(10, 120); na = u(20, 400); k = u(2, 30)
			cl = u(30, 600); so4 = u(30, 1000); alk = u(50, 300); si = u(5, 120)
		} else {
			kind = "brackish well"; t = u(12, 30); ph = u(6.8, 8.0)
			ca = u(100, 800); mg = u(50, 500); na = u(500, 5000); k = u(10, 120)
			cl = u(800, 9000); so4 = u(200, 3000); alk = u(100, 600); si = u(10, 60)
		}
		ba = u(0.01, 0.3); sr = u(0.1, 12); fe = u(0.01, 0.2); mn = u(0.005, 0.05)
		po4 = (rand() < 0.8) ? f(u(0.05, 5), 2) : ""
		fl = (rand() < 0.9) ? f(u(0.1, 2), 2) : "<0.1"
		no3 = u(0.5, 10); b = u(0.02, 1.5)
		tds = ca + mg + na + k + cl + so4 + 0.6 * alk + si
		ec = 1.6 * tds
		name = sprintf("Kestrel Fen %s %d", kind, i)
		line = name ",2026-04-" sprintf("%02d", 1 + i % 28) "," f(t, 1) "," f(ph, 2) "," f(t, 1) "," f(ca, 1) "," f(mg, 1) "," f(na, 1) "," f(k, 1) "," f(ba, 3) "," f(sr, 2) "," f(fe, 3) "," f(mn, 3) "," f(cl, 1) "," f(so4, 1) "," f(alk, 1) "," f(si, 1) "," po4 "," fl "," f(no3, 2) "," f(b, 2) "," f(tds, 0) "," f(ec, 0)
		if (i % 97 == 0) {
			n = int(i / 97) % 4
			if (n == 0) sub(/,[0-9.]+,/, ",12,5,", line)          # decimal comma: a short-row error
			else if (n == 1) sub(/,[0-9.]+,/, ",about seven,", line) # a word for a number
			else if (n == 2) sub(/,[0-9.]+,/, ",-3,", line)          # negative
			else line = name ",2026-04-01," f(t, 1)                  # short row
		}
		print line
	}
}'
