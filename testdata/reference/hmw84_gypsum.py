#!/usr/bin/env python3
"""Independent evaluation of the Harvie, Moller & Weare (1984) model (HMW84,
GCA 48:723) for gypsum solubility at 25 C in NaCl and in Na2SO4 solutions.

Written from the equations of testdata/reference/thermo.md section 6.1 and the
HMW84 parameters of section 6.3-6.4, independently of the Go code, with the
Pitzer (1975) approximation of J(x) (thermo.md 6.1) instead of Harvie's
Chebyshev series, A_phi = 0.392 and the HMW84 gypsum log K -4.581 [FROM MEMORY,
data/pitzer.csv header]. Its output is testdata/hmw84_gypsum.csv, a [COMPUTED]
regression target for saturation.TestGypsumHMW84: it checks that the Go
implementation reproduces the published model, not the measurements the model
was fitted to. Run: python3 testdata/reference/hmw84_gypsum.py > testdata/hmw84_gypsum.csv
"""
import math

A, B = 0.392, 1.2
Z = {"Na": 1, "Ca": 2, "Cl": -1, "SO4": -2}
# (beta0, beta1, beta2, Cphi, alpha1, alpha2): HMW84 Table 1
BIN = {("Na", "Cl"): (0.0765, 0.2664, 0, 0.00127, 2, 12),
       ("Ca", "Cl"): (0.3159, 1.614, 0, -0.00034, 2, 12),
       ("Na", "SO4"): (0.01958, 1.113, 0, 0.00497, 2, 12),
       ("Ca", "SO4"): (0.20, 3.1973, -54.24, 0, 1.4, 12)}
THETA = {frozenset(("Na", "Ca")): 0.07, frozenset(("Cl", "SO4")): 0.02}  # HMW84 Table 2
PSI = {(frozenset(("Na", "Ca")), "Cl"): -0.007, (frozenset(("Na", "Ca")), "SO4"): -0.055,
       (frozenset(("Cl", "SO4")), "Na"): 0.0014, (frozenset(("Cl", "SO4")), "Ca"): -0.018}
MW = 0.0180153  # kg/mol
LOGK_GYPSUM = -4.581


def j(x):
    return x / (4 + 4.581 * x ** -0.7237 * math.exp(-0.0120 * x ** 0.528))


def jp(x, h=1e-7):
    return (j(x + h) - j(x - h)) / (2 * h)


def etheta(zi, zj, i):
    """Unsymmetrical mixing term E-theta and its ionic-strength derivative."""
    if zi == zj:
        return 0.0, 0.0
    s = math.sqrt(i)
    xij, xii, xjj = 6 * zi * zj * A * s, 6 * zi * zi * A * s, 6 * zj * zj * A * s
    e = zi * zj / (4 * i) * (j(xij) - j(xii) / 2 - j(xjj) / 2)
    ep = -e / i + zi * zj / (8 * i * i) * (xij * jp(xij) - xii * jp(xii) / 2 - xjj * jp(xjj) / 2)
    return e, ep


def g(x):
    return 2 * (1 - (1 + x) * math.exp(-x)) / (x * x)


def gp(x):
    return -2 * (1 - (1 + x + x * x / 2) * math.exp(-x)) / (x * x)


def log_gamma_and_aw(m):
    """ln gamma of every ion and ln a_w of the solution m (mol/kg by ion)."""
    cats = [k for k in m if Z[k] > 0]
    ans = [k for k in m if Z[k] < 0]
    i = sum(m[k] * Z[k] ** 2 for k in m) / 2
    s = math.sqrt(i)
    zsum = sum(m[k] * abs(Z[k]) for k in m)

    def bterms(c, a):
        b0, b1, b2, cphi, a1, a2 = BIN[(c, a)]
        return (b0 + b1 * g(a1 * s) + b2 * g(a2 * s),
                (b1 * gp(a1 * s) + b2 * gp(a2 * s)) / i,
                b0 + b1 * math.exp(-a1 * s) + b2 * math.exp(-a2 * s),
                cphi / (2 * math.sqrt(abs(Z[c] * Z[a]))))

    f = -A * (s / (1 + B * s) + 2 / B * math.log(1 + B * s))
    f += sum(m[c] * m[a] * bterms(c, a)[1] for c in cats for a in ans)
    for same in (cats, ans):
        for x in range(len(same)):
            for y in range(x + 1, len(same)):
                f += m[same[x]] * m[same[y]] * etheta(Z[same[x]], Z[same[y]], i)[1]
    cc = sum(m[c] * m[a] * bterms(c, a)[3] for c in cats for a in ans)
    lng = {}
    for own, other in ((cats, ans), (ans, cats)):
        for ion in own:
            v = Z[ion] ** 2 * f + abs(Z[ion]) * cc
            for o in other:
                bt = bterms(ion, o) if ion in cats else bterms(o, ion)
                v += m[o] * (2 * bt[0] + zsum * bt[3])
            for k in own:
                if k != ion:
                    v += m[k] * (2 * (THETA.get(frozenset((ion, k)), 0) + etheta(Z[ion], Z[k], i)[0])
                                 + sum(m[o] * PSI.get((frozenset((ion, k)), o), 0) for o in other))
            for x in range(len(other)):
                for y in range(x + 1, len(other)):
                    v += m[other[x]] * m[other[y]] * PSI.get((frozenset((other[x], other[y])), ion), 0)
            lng[ion] = v
    osm = -A * i ** 1.5 / (1 + B * s)
    osm += sum(m[c] * m[a] * (bterms(c, a)[2] + zsum * bterms(c, a)[3]) for c in cats for a in ans)
    for same, other in ((cats, ans), (ans, cats)):
        for x in range(len(same)):
            for y in range(x + 1, len(same)):
                p, q = same[x], same[y]
                e, ep = etheta(Z[p], Z[q], i)
                osm += m[p] * m[q] * (THETA.get(frozenset((p, q)), 0) + e + i * ep
                                      + sum(m[o] * PSI.get((frozenset((p, q)), o), 0) for o in other))
    total = sum(m.values())
    phi = 1 + 2 * osm / total
    return lng, -phi * MW * total


def gypsum_solubility(na2so4=0.0, nacl=0.0):
    """CaSO4 dissolved (mol/kg) at gypsum saturation, by bisection."""
    lo, hi = 1e-5, 0.2
    for _ in range(100):
        x = (lo + hi) / 2
        m = {k: v for k, v in {"Na": 2 * na2so4 + nacl, "Ca": x, "SO4": x + na2so4, "Cl": nacl}.items() if v > 0}
        lng, lnaw = log_gamma_and_aw(m)
        lnq = lng["Ca"] + math.log(x) + lng["SO4"] + math.log(x + na2so4) + 2 * lnaw
        if lnq / math.log(10) > LOGK_GYPSUM:
            hi = x
        else:
            lo = x
    return (lo + hi) / 2


if __name__ == "__main__":
    print("medium,medium_mol_per_kg,gypsum_mmol_per_kg,source")
    src = "HMW84 evaluated by testdata/reference/hmw84_gypsum.py [COMPUTED]"
    print("water,0,%.3f,%s" % (1000 * gypsum_solubility(), src))
    for c in (0.05, 0.1, 0.2, 0.3, 0.5, 1, 1.5, 2):
        print("Na2SO4,%g,%.3f,%s" % (c, 1000 * gypsum_solubility(na2so4=c), src))
    for c in (0.5, 1, 2, 3, 4, 6):
        print("NaCl,%g,%.3f,%s" % (c, 1000 * gypsum_solubility(nacl=c), src))
