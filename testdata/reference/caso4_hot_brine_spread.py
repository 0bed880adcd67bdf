#!/usr/bin/env python3
"""How far apart two published Pitzer sets put the calcium sulfate saturation
index of hot NaCl brines.

Set A is ours (data/pitzer.csv): HMW84 at 25 C; NaCl, Na2SO4 and CaCl2 changing with
temperature by Moller (1988) eq. 13 functions anchored at the HMW84 25 C values;
Ca-SO4 beta1 and beta2 by Silvester & Pitzer (1979) slopes over 0-50 C, held
beyond; mixing terms at 25 C. Set B is Moller (1988) GCA 52:821 (Na-Ca-Cl-SO4,
25-250 C, fitted to CaSO4 solubilities in hot NaCl solutions) as transcribed in
testdata/reference/thermo.md section 6.3. The two sets have different solubility
products, so both are anchored to the same solubility in pure water (set A's, the
one our log K functions give); the script then finds the composition of a
saturated brine under set B and prints set A's saturation index of it: how high
our SI reads where set B says the brine is just saturated. [COMPUTED]

Uses the equation code of testdata/reference/hmw84_gypsum.py.
Run: python3 testdata/reference/caso4_hot_brine_spread.py
"""
import math
import os
import runpy

ln_gamma_aw = runpy.run_path(os.path.join(os.path.dirname(os.path.abspath(__file__)), "hmw84_gypsum.py"))["log_gamma_and_aw"]
H = ln_gamma_aw.__globals__  # the equations read A, BIN, THETA and PSI from here


def p88(a, t):
    return a[0] + a[1] * t + a[2] / t + a[3] * math.log(t) + a[4] / (t - 263) + a[5] * t * t + a[6] / (680 - t) + a[7] / (t - 227)


APHI = [3.36901532e-1, -6.32100430e-4, 9.14252359, -1.35143986e-2, 2.26089488e-3, 1.92118597e-6, 4.52586464e1, 0]
M88 = {("Na", "Cl"): ([1.43783204e1, 5.60767406e-3, -4.22185236e2, -2.51226677, 0, -2.61718135e-6, 4.43854508, -1.70502337],
                      [-4.83060685e-1, 1.40677479e-3, 1.19311989e2, 0, 0, 0, 0, -4.23433299],
                      [-1.00588714e-1, -1.80529413e-5, 8.61185543, 1.24880954e-2, 0, 3.41172108e-8, 6.83040995e-2, 2.93922611e-1]),
       ("Ca", "Cl"): ([-9.41895832e1, -4.04750026e-2, 2.34550368e3, 1.70912300e1, -9.22885841e-1, 1.51488122e-5, -1.39082000, 0],
                      [3.47870000, -1.54170000e-2, 0, 0, 0, 3.17910000e-5, 0, 0],
                      [-3.03578731e1, -1.36264728e-2, 7.64582238e2, 5.50458061, -3.27377782e-1, 5.69405869e-6, -5.36231106e-1, 0]),
       ("Na", "SO4"): ([8.16920027e1, 3.01104957e-2, -2.32193726e3, -1.43780207e1, -6.66496111e-1, -1.03923656e-5, 0, 0],
                       [1.00463018e3, 5.77453682e-1, -2.18434467e4, -1.89110656e2, -2.03550548e-1, -3.23949532e-4, 1.46772243e3, 0],
                       [-8.07816886e1, -3.54521126e-2, 2.02438830e3, 1.46197730e1, -9.16974740e-2, 1.43946005e-5, -2.42272049, 0])}
HMW = {("Na", "Cl"): (0.0765, 0.2664, 0.00127), ("Ca", "Cl"): (0.3159, 1.614, -0.00034), ("Na", "SO4"): (0.01958, 1.113, 0.00497)}
# Our anhydrite and gypsum solubilities in pure water (mol/kg) at 25, 50, 75, 90 C (the Go model).
PURE = {"gypsum": {25: 0.01527, 50: 0.01530, 75: 0.01370, 90: 0.01239},
        "anhydrite": {25: 0.02292, 50: 0.01660, 75: 0.01089, 90: 0.00817}}
WATERS = {"gypsum": 2, "anhydrite": 0}


def use_set(name, tc):
    t = tc + 273.15
    ch = lambda a: p88(a, t) - p88(a, 298.15)
    if name == "ours":
        H["A"] = 0.392 + ch(APHI)
        for k, f in M88.items():
            b0, b1, c = HMW[k]
            H["BIN"][k] = (b0 + ch(f[0]), b1 + ch(f[1]), 0, c + ch(f[2]), 2, 12)
        d = min(max(tc, 0), 50) - 25
        H["BIN"][("Ca", "SO4")] = (0.20, 3.1973 + 0.0546 * d, -54.24 - 0.516 * d, 0, 1.4, 12)
        H["THETA"].update({frozenset(("Na", "Ca")): 0.07, frozenset(("Cl", "SO4")): 0.02})
        H["PSI"].update({(frozenset(("Na", "Ca")), "Cl"): -0.007, (frozenset(("Na", "Ca")), "SO4"): -0.055,
                         (frozenset(("Cl", "SO4")), "Na"): 0.0014, (frozenset(("Cl", "SO4")), "Ca"): -0.018})
    else:
        H["A"] = p88(APHI, t)
        for k, f in M88.items():
            H["BIN"][k] = (p88(f[0], t), p88(f[1], t), 0, p88(f[2], t), 2, 12)
        H["BIN"][("Ca", "SO4")] = (0.15, 3.00, -1.29399287e2 + 4.00431027e-1 * t, 0, 1.4, 12)
        H["THETA"].update({frozenset(("Na", "Ca")): 0.05, frozenset(("Cl", "SO4")): 0.07})
        H["PSI"].update({(frozenset(("Na", "Ca")), "Cl"): -0.003, (frozenset(("Na", "Ca")), "SO4"): -0.012,
                         (frozenset(("Cl", "SO4")), "Na"): -0.009, (frozenset(("Cl", "SO4")), "Ca"): -0.018})


def log_iap(x, nacl, waters):
    m = {k: v for k, v in {"Na": nacl, "Cl": nacl, "Ca": x, "SO4": x}.items() if v > 0}
    lng, lnaw = ln_gamma_aw(m)
    return (lng["Ca"] + lng["SO4"] + 2 * math.log(x) + waters * lnaw) / math.log(10)


def saturated(nacl, waters, logk):
    lo, hi = 1e-5, 0.5
    for _ in range(80):
        x = (lo + hi) / 2
        if log_iap(x, nacl, waters) > logk:
            hi = x
        else:
            lo = x
    return (lo + hi) / 2


if __name__ == "__main__":
    print("mineral,t_c,nacl_mol_per_kg,si_ours_at_set_b_saturation")
    for mineral, pure in PURE.items():
        n = WATERS[mineral]
        for tc, s0 in pure.items():
            use_set("ours", tc)
            k_ours = log_iap(s0, 0, n)
            use_set("m88", tc)
            k_m88 = log_iap(s0, 0, n)
            for nacl in (0.5, 1, 2, 4):
                use_set("m88", tc)
                x = saturated(nacl, n, k_m88)
                use_set("ours", tc)
                print("%s,%d,%g,%+.3f" % (mineral, tc, nacl, log_iap(x, nacl, n) - k_ours))
