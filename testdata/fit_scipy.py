#!/usr/bin/python3
"""Reference reactivity-ratio fits by scipy, for the copoly estimators.

This script makes testdata/fit_scipy.json, which copoly/fit/fit_scipy_test.go compares
fit.LeastSquares, fit.FinemanRoss and fit.KelenTudos (package copoly/fit) with. It is written from the
published equations and uses only numpy and scipy numerics; it shares no code with copoly.

Model (terminal model, reactivity ratios r1 = k11/k12, r2 = k22/k21)
--------------------------------------------------------------------
Instantaneous copolymer composition (Mayo-Lewis; F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc.
1944, 66, 1594), with f2 = 1 - f1:

    F1(f1) = (r1 f1^2 + f1 f2) / (r1 f1^2 + 2 f1 f2 + r2 f2^2)

Cumulative composition of a batch started from feed f10 at overall molar conversion X (mole
balance), with f1(X) the feed left at X:

    F1cum(f10, X) = (f10 - (1 - X) f1(X)) / X,      F1cum(f10, 0) = F1(f10)

f1(X) comes from the Meyer-Lowry closed-form integral of the Skeist equation (V. E. Meyer,
G. G. Lowry, J. Polym. Sci. A 1965, 3, 2843),

    1 - X = (f1/f10)^a (f2/f20)^b ((f10 - d)/(f1 - d))^g
    a = r2/(1 - r2), b = r1/(1 - r1), g = (1 - r1 r2)/((1 - r1)(1 - r2)),
    d = (1 - r2)/(2 - r1 - r2)

solved for f1 by scipy.optimize.brentq on its logarithm, bracketed between f10 and the end
point of the drift (0, 1 or the azeotrope d, whichever f1 moves towards: f1 - F1 has the sign
of (1 - r1) f1 - (1 - r2) f2). Where the closed form is singular or ill-conditioned (r1 or r2
within 1e-3 of 1, or r1 + r2 within 1e-3 of 2) f1(X) comes instead from the Skeist equation
(I. Skeist, J. Am. Chem. Soc. 1946, 68, 1781)

    df1/dX = (f1 - F1(f1)) / (1 - X),    f1(0) = f10

integrated by scipy.integrate.solve_ivp (DOP853, rtol 1e-12, atol 1e-15). A conversion past
the largest one the batch can reach (only when a ratio is 0) is clamped to it: f1 stays at the
end point.

Data sets
---------
an-aa-bulk: acrylonitrile (1) / acrylic acid (2), bulk, low conversion: composition data of
    Brar & Dutta, Eur. Polym. J. 1998, 34, 1585, as tabulated by Hauch, Zhou, Duever,
    Penlidis, Macromol. Symp. 2008, Table 2. X is not given, so every run is treated as
    instantaneous (X = 0). The row f1 = 0.50, F1 = 0.19 of that table is left out: its F1 is
    inconsistent with the triad fractions tabulated beside it in the same row.
sim-*: SIMULATED for this cross-check, not measurements. For true ratios (r1, r2), feeds
    f10 = 0.1, 0.3, 0.5, 0.7, 0.9 (outer loop) and conversions X = 0.05, 0.15, 0.25, 0.35
    (inner loop), F1 = F1cum(f10, X) + e with e from numpy.random.default_rng(seed).normal(0,
    0.01, 20) in that order, rounded to 6 decimals (the fixture stores these values, so the Go
    test fits exactly the same numbers). The seeds are arbitrary. True ratios: 0.52 / 0.46
    (styrene / methyl methacrylate-like) and 1.88 / 0.43 (r1 > 1 > r2).
sim-*-weighted: the same simulated runs, each with a standard uncertainty sF = 0.01 of F1
    (the noise's own standard deviation).
georgiev1995-acetone, georgiev1995-isopropanol: 3-methylstyrene (1) / methacrylic acid (2) at
    70 degC in acetone and in isopropanol, Table 1 of G. S. Georgiev, I. G. Dakova,
    S. J. Simpson, J. Macromol. Sci., Pure Appl. Chem. 1995, A32(3), 497, read from
    testdata/georgiev1995_table1.csv. The paper gives the conversion by weight, w (percent); the
    integrated model needs the overall molar conversion, from the mass balance on the polymer
    with the measured copolymer composition:

        X = w (f10 M1 + (1 - f10) M2) / (F1 M1 + (1 - F1) M2)

    with M1 = C9H10 and M2 = C4H6O2 from the IUPAC conventional atomic weights C 12.011,
    H 1.008, O 15.999. These sets also record, under "published", the paper's Kelen-Tudos pair
    (Table 2), the objective S at that pair, and the confidence level of the joint region whose
    boundary passes through it, level = F_cdf((S/S_min - 1)(n - 2)/2; 2, n - 2)
    (scipy.stats.f.cdf): the published pair lies inside the 95 % region when level < 0.95.

Estimates
---------
Nonlinear least squares on the model above (every run compared at its own X):

    S(r1, r2) = sum_i w_i (F1_i - F1cum(f10_i, X_i; r1, r2))^2

w_i = 1 unweighted, w_i = 1/sF_i^2 weighted (then S is chi^2). Minimised by
scipy.optimize.least_squares (method "trf", jac "3-point", bounds r >= 0, x_scale "jac",
ftol = xtol = gtol = 1e-14) from several starting points; the lowest S is kept and at least two
starts must reach it (to 1e-9 relative) as a check on the global minimum.

Linearised standard errors from the Jacobian J of the residuals at the estimate:
cov = s^2 (J^T J)^-1 with s^2 = S/(n - 2) unweighted, cov = (J^T W J)^-1 weighted (D. M. Bates,
D. G. Watts, Nonlinear Regression Analysis and Its Applications, Wiley 1988).

Joint 95 % confidence region {S(r) <= S_crit}:
    unweighted (F-based):  S_crit = S_min (1 + 2/(n - 2) F_0.95(2, n - 2))
    weighted (chi^2):      S_crit = chi^2_min + chi^2_0.95(2)
with the quantiles from scipy.stats.f.ppf and scipy.stats.chi2.ppf. Its bounding box
(r1Min, r1Max, r2Min, r2Max) is found two ways, which must agree: (1) minimise and maximise
each ratio subject to S(r) <= S_crit and r >= 0 by scipy.optimize.minimize (SLSQP) from
several starts inside the region; (2) the root of the profile S_prof(r_k) = min over the other
ratio of S, S_prof(r_k) = S_crit, by brentq (the inner minimum by least_squares). The fixture
records (2), the more precise; a bound where the region reaches r = 0 is recorded as 0.

Linear estimates with x = f1/f2 and y = F1/F2 (every run treated as low conversion):
    Fineman-Ross (M. Fineman, S. D. Ross, J. Polym. Sci. 1950, 5, 259):
        G = x (y - 1)/y, H = x^2/y, G = r1 H - r2 fitted by numpy.polyfit(H, G, 1)
    Kelen-Tudos (T. Kelen, F. Tudos, J. Macromol. Sci. Chem. 1975, A9, 1):
        alpha = sqrt(H_min H_max), eta = G/(alpha + H), xi = H/(alpha + H),
        eta = (r1 + r2/alpha) xi - r2/alpha fitted by numpy.polyfit(xi, eta, 1)

Usage
-----
    /usr/bin/python3 testdata/fit_scipy.py            # (re)write testdata/fit_scipy.json
    /usr/bin/python3 testdata/fit_scipy.py --check    # recompute; compare with the committed
                                                      # file; exit 1 on a mismatch
                                                      # (make test-fixtures)

Before writing (and with --check) the script checks itself: the Meyer-Lowry f1 agrees with
the integrated Skeist equation at every simulated design point to 1e-10 (measured: about
2e-13), at least two starts reach the minimum, and the SLSQP and profile boxes agree to 1e-5 of
the region's width (measured: 2e-11 or better).

--check compares the run data to 1e-12 absolute (they are rounded to 6 decimals, so they agree
exactly unless the model changed) and every computed number to 1e-7 relative. The fits are
not reproducible to machine precision because the optimisers stop at a tolerance, not at the
exact minimum: least_squares stops when a step or the decrease of S falls below its tolerance,
which leaves the estimate a few 1e-9 (relative) from the true minimum where S is flat (the
unweighted and weighted fits of the same simulated runs have the same minimum and stop 3e-9
apart). Another numpy/scipy build or BLAS changes the last bits of the finite-difference
Jacobians, hence the path and the stopping iterate, by that much; 1e-7 allows for it and still
catches any real change.
"""

import argparse
import csv
import json
import math
import os
import platform
import sys
import time

import numpy as np
import scipy
from scipy.integrate import solve_ivp
from scipy.optimize import brentq, least_squares, minimize
from scipy.stats import chi2, f as fdist

from fixturejson import dumps  # testdata/fixturejson.py

HERE = os.path.dirname(os.path.abspath(__file__))
JSON_PATH = os.path.join(HERE, "fit_scipy.json")
COMMAND = "/usr/bin/python3 testdata/fit_scipy.py"

LEVEL = 0.95
NEAR = 1e-3            # distance from r = 1 or r1 + r2 = 2 below which the ODE replaces Meyer-Lowry
DATA_TOL = 1e-12       # --check: absolute, on the run data
CHECK_TOL = 1e-7       # --check: relative, on every computed number (see the module docstring)
LSQ = dict(method="trf", jac="3-point", x_scale="jac", ftol=1e-14, xtol=1e-14, gtol=1e-14,
           bounds=([0.0, 0.0], [np.inf, np.inf]), max_nfev=2000)
STARTS = [(0.1, 0.1), (0.5, 0.5), (2.0, 0.3), (0.3, 2.0), (3.0, 3.0), (0.05, 5.0), (5.0, 0.05)]

# Acrylonitrile (1) / acrylic acid (2), bulk, low conversion: (f1, F1) of Brar & Dutta, Eur.
# Polym. J. 1998, 34, 1585, as tabulated by Hauch, Zhou, Duever, Penlidis, Macromol. Symp.
# 2008, Table 2. Left out: f1 = 0.50, F1 = 0.19, which is inconsistent with the triad fractions
# given in the same row of that table.
AN_AA = [(0.95, 0.94), (0.90, 0.88), (0.85, 0.82), (0.80, 0.76), (0.75, 0.62), (0.70, 0.57),
         (0.60, 0.40), (0.40, 0.19), (0.30, 0.17)]

# 3-methylstyrene (1) / methacrylic acid (2): Georgiev, Dakova, Simpson 1995, Table 1 (runs)
# and Table 2 (Kelen-Tudos estimates), in testdata/georgiev1995_table1.csv.
GEORGIEV_CSV = os.path.join(HERE, "georgiev1995_table1.csv")
GEORGIEV_PUBLISHED = {"acetone": (0.42, 0.51), "isopropanol": (0.33, 0.18)}
ATOMIC_WEIGHT = {"C": 12.011, "H": 1.008, "O": 15.999}  # IUPAC conventional atomic weights
M_3MS = 9 * ATOMIC_WEIGHT["C"] + 10 * ATOMIC_WEIGHT["H"]                            # C9H10
M_MAA = 4 * ATOMIC_WEIGHT["C"] + 6 * ATOMIC_WEIGHT["H"] + 2 * ATOMIC_WEIGHT["O"]    # C4H6O2

SIM_FEEDS = [0.1, 0.3, 0.5, 0.7, 0.9]
SIM_CONVERSIONS = [0.05, 0.15, 0.25, 0.35]
SIM_SD = 0.01
# (name, true r1, true r2, seed). Simulated for the cross-check, not measurements.
SIMULATED = [("sim-sm-like", 0.52, 0.46, 1944), ("sim-r1-above-one", 1.88, 0.43, 1965)]


# ---------------------------------------------------------------------------------------------
# Model

def mayo_lewis(r1, r2, f1):
    """Instantaneous copolymer composition F1(f1) (Mayo-Lewis)."""
    f2 = 1.0 - f1
    num = r1 * f1 * f1 + f1 * f2
    return num / (num + f1 * f2 + r2 * f2 * f2)


def near_singular(r1, r2):
    return abs(r1 - 1.0) < NEAR or abs(r2 - 1.0) < NEAR or abs(r1 + r2 - 2.0) < NEAR


def feed_skeist(r1, r2, f10, x):
    """f1 at conversion x from the Skeist equation integrated by solve_ivp."""
    def rhs(xx, y):
        return [(y[0] - mayo_lewis(r1, r2, y[0])) / (1.0 - xx)]
    sol = solve_ivp(rhs, (0.0, x), [f10], method="DOP853", rtol=1e-12, atol=1e-15)
    if not sol.success:
        raise RuntimeError("solve_ivp: r1=%r r2=%r f10=%r X=%r: %s" % (r1, r2, f10, x, sol.message))
    return float(sol.y[0, -1])


def feed_meyer_lowry(r1, r2, f10, x):
    """f1 at conversion x from the Meyer-Lowry closed form, solved by brentq in log form."""
    a = r2 / (1.0 - r2)
    b = r1 / (1.0 - r1)
    g = (1.0 - r1 * r2) / ((1.0 - r1) * (1.0 - r2))
    d = (1.0 - r2) / (2.0 - r1 - r2)
    drift = (1.0 - r1) * f10 - (1.0 - r2) * (1.0 - f10)  # sign of f1 - F1, i.e. of df1/dX
    if drift == 0.0:
        return f10  # azeotropic feed
    if drift > 0.0:
        end = d if f10 < d < 1.0 else 1.0
    else:
        end = d if 0.0 < d < f10 else 0.0
    log1mx = math.log1p(-x)

    def h(f1):
        # ln(1 - X(f1)) - ln(1 - x): positive at f1 = f10, falling towards the end point.
        return (a * math.log(f1 / f10) + b * math.log((1.0 - f1) / (1.0 - f10))
                + g * math.log((f10 - d) / (f1 - d)) - log1mx)

    # Bracket: steps of 10 % of the way to the end point, then ever closer to it.
    near = f10
    for t in ([f10 + (end - f10) * 0.1 * j for j in range(1, 10)]
              + [end - (end - f10) * 10.0 ** -k for k in range(2, 17)]):
        if t == end:
            break
        if h(t) < 0.0:
            lo, hi = (near, t) if near < t else (t, near)
            break
        near = t
    else:
        return end  # x is past the largest reachable conversion: clamp
    if t == end:
        return end
    return brentq(h, lo, hi, xtol=1e-300, rtol=4 * np.finfo(float).eps, maxiter=500)


def cumulative(r1, r2, f10, x):
    """Cumulative copolymer composition F1cum(f10, X); F1(f10) at X = 0."""
    if x == 0.0:
        return mayo_lewis(r1, r2, f10)
    if near_singular(r1, r2):
        f1 = feed_skeist(r1, r2, f10, x)
    else:
        f1 = feed_meyer_lowry(r1, r2, f10, x)
    return (f10 - (1.0 - x) * f1) / x


# ---------------------------------------------------------------------------------------------
# Data

def datasets():
    """The seven data sets: name, source text, weighted flag, runs as [f10, X, F1, sF]."""
    sets = [{
        "name": "an-aa-bulk",
        "source": "acrylonitrile (1) / acrylic acid (2), bulk, low conversion; Brar & Dutta, "
                  "Eur. Polym. J. 1998, 34, 1585, as tabulated by Hauch, Zhou, Duever, Penlidis, "
                  "Macromol. Symp. 2008, Table 2 (row f1 = 0.50, F1 = 0.19 left out: inconsistent "
                  "with its own triad fractions); X not given, fitted as instantaneous",
        "weighted": False,
        "runs": [[f1, 0.0, F1, 0.0] for f1, F1 in AN_AA],
    }]
    for name, r1, r2, seed in SIMULATED:
        noise = np.random.default_rng(seed).normal(0.0, SIM_SD, len(SIM_FEEDS) * len(SIM_CONVERSIONS))
        runs, k = [], 0
        for f10 in SIM_FEEDS:
            for x in SIM_CONVERSIONS:
                runs.append([f10, x, round(cumulative(r1, r2, f10, x) + float(noise[k]), 6), 0.0])
                k += 1
        src = ("SIMULATED for this cross-check, not measurements: F1cum of the terminal model at "
               "r1 = %g, r2 = %g plus Gaussian noise sd %g from numpy.random.default_rng(%d), "
               "rounded to 6 decimals" % (r1, r2, SIM_SD, seed))
        sets.append({"name": name, "source": src, "weighted": False, "runs": runs,
                     "true_r1": r1, "true_r2": r2})
        sets.append({"name": name + "-weighted", "source": src + "; each run given sF = 0.01",
                     "weighted": True, "runs": [[a, b, c, SIM_SD] for a, b, c, _ in runs],
                     "true_r1": r1, "true_r2": r2})
    for solvent in ("acetone", "isopropanol"):
        runs = []
        for f10, F1, w in georgiev_runs(solvent):
            x = w * (f10 * M_3MS + (1 - f10) * M_MAA) / (F1 * M_3MS + (1 - F1) * M_MAA)
            runs.append([f10, x, F1, 0.0])
        r1, r2 = GEORGIEV_PUBLISHED[solvent]
        sets.append({
            "name": "georgiev1995-" + solvent,
            "source": "3-methylstyrene (1) / methacrylic acid (2), 70 degC, in %s: G. S. Georgiev, "
                      "I. G. Dakova, S. J. Simpson, J. Macromol. Sci., Pure Appl. Chem. 1995, A32(3), "
                      "497, Table 1 (testdata/georgiev1995_table1.csv); X is the molar conversion "
                      "from the printed weight conversion and F1 (M1 = C9H10, M2 = C4H6O2)" % solvent,
            "weighted": False, "runs": runs,
            "published": {"r1": r1, "r2": r2, "table": "Table 2, Kelen-Tudos"},
        })
    return sets


def georgiev_runs(solvent):
    """(f10, F1, w) of one solvent from testdata/georgiev1995_table1.csv, w as a fraction."""
    out = []
    with open(GEORGIEV_CSV, newline="") as fh:
        rows = csv.reader(line for line in fh if not line.startswith("#"))
        header = next(rows)
        if header != ["solvent", "f1", "F1", "conversion_wt_pct"]:
            sys.exit("%s: unexpected header %r" % (GEORGIEV_CSV, header))
        for row in rows:
            if row[0] == solvent:
                out.append((float(row[1]), float(row[2]), float(row[3]) / 100))
    if len(out) != 7:
        sys.exit("%s: %d runs in %s, want 7" % (GEORGIEV_CSV, len(out), solvent))
    return out


# ---------------------------------------------------------------------------------------------
# Nonlinear least squares

class Problem:
    def __init__(self, runs, weighted):
        self.runs = runs
        self.weighted = weighted

    def residuals(self, r):
        r1, r2 = float(r[0]), float(r[1])
        out = np.empty(len(self.runs))
        for i, (f10, x, F1, sF) in enumerate(self.runs):
            e = F1 - cumulative(r1, r2, f10, x)
            out[i] = e / sF if self.weighted else e
        return out

    def S(self, r1, r2):
        e = self.residuals((r1, r2))
        return float(e @ e)


def fit(p):
    """Best least_squares solution over STARTS; returns (r, S, jac, starts that reached it)."""
    sols = []
    for s in STARTS:
        res = least_squares(p.residuals, np.array(s, dtype=float), **LSQ)
        sols.append((p.S(*res.x), res))
    sols.sort(key=lambda t: t[0])
    best_S, best = sols[0]
    agree = sum(1 for S, _ in sols if S <= best_S * (1 + 1e-9))
    if agree < 2:
        sys.exit("self-check: only one start reached the minimum S = %r" % best_S)
    return best.x.copy(), best_S, best.jac, agree


def profile(p, k, v, guess):
    """min over the other ratio of S with ratio k fixed at v; returns (S, argmin)."""
    def res(o):
        r = (v, o[0]) if k == 0 else (o[0], v)
        return p.residuals(r)
    out = least_squares(res, np.array([max(guess, 1e-8)]), method="trf", jac="3-point",
                        bounds=([0.0], [np.inf]), ftol=1e-14, xtol=1e-14, gtol=1e-14, max_nfev=500)
    return p.S(*((v, out.x[0]) if k == 0 else (out.x[0], v))), float(out.x[0])


def box_by_profile(p, rhat, se, crit):
    """Region bounds from the roots of S_prof(r_k) = crit; 0 where the region reaches r_k = 0."""
    box = {}
    for k, name in ((0, "r1"), (1, "r2")):
        other = rhat[1 - k]
        for sign, key in ((-1.0, name + "_min"), (1.0, name + "_max")):
            warm = [other]

            def g(v):
                s, o = profile(p, k, v, warm[0])
                warm[0] = o
                return s - crit

            lo, step, zero = rhat[k], se[k], False
            while True:
                hi = lo + sign * step
                if hi <= 0.0:
                    hi = 0.0
                    zero = g(0.0) < 0.0
                    break
                if g(hi) > 0.0:
                    break
                lo, step = hi, 2 * step
                if hi > 1e4:
                    sys.exit("the region of this set is open beyond r = 1e4")
            if zero:
                box[key] = 0.0  # the region reaches the bound r = 0
                continue
            warm[0] = other
            a, b = (lo, hi) if lo < hi else (hi, lo)
            box[key] = brentq(g, a, b, xtol=1e-14, rtol=1e-13, maxiter=200)
    return box


def box_by_slsqp(p, rhat, se, crit):
    """Region bounds by SLSQP: extreme r_k subject to S <= crit, from several inner starts."""
    cons = [{"type": "ineq", "fun": lambda r: (crit - p.S(r[0], r[1])) / crit}]
    box = {}
    for k, name in ((0, "r1"), (1, "r2")):
        for sign, key in ((-1.0, name + "_min"), (1.0, name + "_max")):
            best = None
            for u in ((0.5, 0.0), (0.3, 0.3), (0.3, -0.3)):
                x0 = np.array(rhat, dtype=float)
                x0[k] += sign * u[0] * se[k]
                x0[1 - k] += u[1] * se[1 - k]
                x0 = np.maximum(x0, 0.0)
                res = minimize(lambda r: -sign * r[k], x0, method="SLSQP", constraints=cons,
                               bounds=[(0.0, None), (0.0, None)],
                               options={"ftol": 1e-14, "maxiter": 500})
                if p.S(*res.x) > crit * (1 + 1e-6):
                    continue
                v = float(res.x[k])
                if best is None or sign * v > sign * best:
                    best = v
            box[key] = best
    return box


def nonlinear(p):
    n = len(p.runs)
    rhat, S, J, agree = fit(p)
    A = J.T @ J
    cov = np.linalg.inv(A) if p.weighted else S / (n - 2) * np.linalg.inv(A)
    se = np.sqrt(np.diag(cov))
    if p.weighted:
        crit = S + float(chi2.ppf(LEVEL, 2))
    else:
        crit = S * (1.0 + 2.0 / (n - 2) * float(fdist.ppf(LEVEL, 2, n - 2)))
    box = box_by_profile(p, rhat, se, crit)
    slsqp = box_by_slsqp(p, rhat, se, crit)
    width = {"r1": box["r1_max"] - box["r1_min"], "r2": box["r2_max"] - box["r2_min"]}
    worst = 0.0
    for key, v in box.items():
        w = slsqp[key]
        diff = abs(w - v) / width[key[:2]] if w is not None else math.inf
        worst = max(worst, diff)
        if diff > 1e-5:
            sys.exit("self-check: region bound %s: profile root %r, SLSQP %r" % (key, v, w))
    out = {"r1": float(rhat[0]), "r2": float(rhat[1]), "s_min": S, "n": n,
           "se1": float(se[0]), "se2": float(se[1]),
           "corr": float(cov[0, 1] / (se[0] * se[1])),
           "kind": "chi2" if p.weighted else "F", "critical": crit}
    out.update(box)
    return out, {"starts_at_min": agree, "slsqp_vs_profile": worst}


# ---------------------------------------------------------------------------------------------
# Linear methods

def fineman_ross_kelen_tudos(runs):
    f = np.array([r[0] for r in runs])
    F = np.array([r[2] for r in runs])
    x, y = f / (1 - f), F / (1 - F)
    G, H = x * (y - 1) / y, x * x / y
    slope, icpt = np.polyfit(H, G, 1)
    fr = {"r1": float(slope), "r2": float(-icpt)}
    alpha = math.sqrt(H.min() * H.max())
    slope, icpt = np.polyfit(H / (alpha + H), G / (alpha + H), 1)
    kt = {"r1": float(slope + icpt), "r2": float(-alpha * icpt), "alpha": alpha}
    return fr, kt


# ---------------------------------------------------------------------------------------------
# Fixture

def check_model():
    """Worst |f1 Meyer-Lowry - f1 Skeist ODE| over the simulated design; exit if above 1e-10."""
    worst = 0.0
    for name, r1, r2, _seed in SIMULATED:
        for f10 in SIM_FEEDS:
            for x in SIM_CONVERSIONS:
                a, b = feed_meyer_lowry(r1, r2, f10, x), feed_skeist(r1, r2, f10, x)
                if not abs(a - b) <= 1e-10:
                    sys.exit("self-check: %s f10=%g X=%g: Meyer-Lowry f1 = %r, Skeist ODE %r" % (name, f10, x, a, b))
                worst = max(worst, abs(a - b))
    return worst


def make():
    sets, log = [], ["model: Meyer-Lowry f1 within %.1e of the Skeist ODE on the simulated design" % check_model()]
    for ds in datasets():
        t0 = time.perf_counter()
        nl, checks = nonlinear(Problem(ds["runs"], ds["weighted"]))
        fr, kt = fineman_ross_kelen_tudos(ds["runs"])
        dt = time.perf_counter() - t0
        if "published" in ds:
            # The objective at the published pair, and the level of the joint region whose
            # boundary passes through it (inverting S_crit = S_min (1 + 2/(n - 2) F(2, n - 2))).
            p = Problem(ds["runs"], ds["weighted"])
            pub = dict(ds["published"])
            pub["s"] = p.S(pub["r1"], pub["r2"])
            n = len(ds["runs"])
            pub["level"] = float(fdist.cdf((pub["s"] / nl["s_min"] - 1) * (n - 2) / 2, 2, n - 2))
            ds = dict(ds, published=pub)
        ds = dict(ds, nonlinear=nl, fineman_ross=fr, kelen_tudos=kt)
        sets.append(ds)
        log.append("%-26s r1 = %.10g r2 = %.10g S = %.10g  (%d starts at the minimum; SLSQP box "
                   "within %.1e of the width; %.1f s)"
                   % (ds["name"], nl["r1"], nl["r2"], nl["s_min"], checks["starts_at_min"],
                      checks["slsqp_vs_profile"], dt))
    doc = {
        "comment": "Reactivity-ratio fits by scipy for copoly/fit/fit_scipy_test.go; see "
                   "testdata/README.md and the docstring of testdata/fit_scipy.py. Run columns: "
                   "f10, X (0 = instantaneous), F1, sF (0 = none).",
        "made_by": COMMAND,
        "python": platform.python_version(),
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "level": LEVEL,
        "least_squares": {k: v for k, v in LSQ.items() if k != "bounds"},
        "starts": STARTS,
        "sets": sets,
    }
    return doc, log


def compare(old, new, where, data):
    """Differences between the committed and recomputed values, as messages."""
    if isinstance(new, dict):
        if not isinstance(old, dict) or set(old) != set(new):
            return ["%s: keys %s, recomputed %s" % (where, sorted(old) if isinstance(old, dict) else old, sorted(new))]
        out = []
        for k in new:
            if k in ("python", "numpy", "scipy"):
                continue  # recorded, not compared
            out += compare(old[k], new[k], "%s.%s" % (where, k), data or k == "runs")
        return out
    if isinstance(new, (list, tuple)):
        if not isinstance(old, list) or len(old) != len(new):
            return ["%s: %r, recomputed %r" % (where, old, new)]
        out = []
        for i, (o, n) in enumerate(zip(old, new)):
            out += compare(o, n, "%s[%d]" % (where, i), data)
        return out
    if isinstance(new, float) and not isinstance(old, bool) and isinstance(old, (int, float)):
        if data:
            ok = abs(old - new) <= DATA_TOL
        else:
            ok = abs(old - new) <= CHECK_TOL * max(abs(old), abs(new)) or abs(old - new) <= 1e-15
        return [] if ok else ["%s = %r, recomputed %r (tolerance %g %s)"
                              % (where, old, new, DATA_TOL if data else CHECK_TOL,
                                 "absolute" if data else "relative")]
    return [] if old == new else ["%s = %r, recomputed %r" % (where, old, new)]


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--check", action="store_true", help="compare with the committed file instead of writing it")
    ap.add_argument("--file", default=JSON_PATH, help="the JSON file to write or check (default %(default)s)")
    args = ap.parse_args()

    t0 = time.perf_counter()
    doc, log = make()
    for line in log:
        print(line, file=sys.stderr)
    print("scipy total %.1f s" % (time.perf_counter() - t0), file=sys.stderr)
    if args.check:
        with open(args.file) as fh:
            old = json.load(fh)
        # Round-trip the recomputed document through JSON so both sides have the same types.
        bad = compare(old, json.loads(dumps(doc)), "fit_scipy", False)
        if bad:
            print("%s: differs from a fresh run of %s (python %s, numpy %s, scipy %s):"
                  % (args.file, COMMAND, platform.python_version(), np.__version__, scipy.__version__))
            for b in bad:
                print("  " + b)
            sys.exit(1)
        print("%s: %d data sets agree with scipy %s (estimates to %g relative)"
              % (args.file, len(doc["sets"]), scipy.__version__, CHECK_TOL))
        return
    with open(args.file, "w") as fh:
        fh.write(dumps(doc) + "\n")
    print("wrote %s" % args.file, file=sys.stderr)


if __name__ == "__main__":
    main()
