#!/usr/bin/python3
"""Reference solutions of the Skeist equation for the terminal copolymerisation model.

This script makes testdata/skeist_scipy.csv, the table the copoly Go tests compare the
composition drift against. It is independent of copoly: the only numerics are scipy's.

Model
-----
Terminal model with reactivity ratios r1 = k11/k12 and r2 = k22/k21. For an unreacted monomer
mixture with mole fraction f1 of M1 (f2 = 1 - f1), the instantaneous copolymer composition is
the Mayo-Lewis equation

    F1(f1) = (r1 f1^2 + f1 f2) / (r1 f1^2 + 2 f1 f2 + r2 f2^2)

(F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 66, 1594 (1944), eq. 9 in mole-fraction form).
In a batch, the feed drifts with the overall molar conversion X according to the Skeist equation

    df1/dX = (f1 - F1(f1)) / (1 - X),        f1(0) = f10

(I. Skeist, J. Am. Chem. Soc. 68, 1781 (1946)), and a mole balance gives the cumulative
copolymer composition

    F1cum(X) = (f10 - (1 - X) f1(X)) / X,    F1cum(0) = F1(f10).

Integration variables
---------------------
We integrate in t = -ln(1 - X) and u = ln(f1/f2) rather than in X and f1. Since dX/dt = 1 - X and
df1/du = f1 f2, and since (expanding the Mayo-Lewis equation)

    f1 - F1 = f1 f2 ((1 - r1) f1 - (1 - r2) f2) / D,    D = r1 f1^2 + 2 f1 f2 + r2 f2^2,

the Skeist equation becomes

    du/dt = ((1 - r1) f1 - (1 - r2) f2) / D,    u(0) = ln(f10/f20),   f1 = 1/(1 + exp(-u)).

Why: (1) the right-hand side is autonomous and smooth, with no 1/(1 - X) factor (D > 0 on [0, 1]
for the positive ratios tabulated here), so X = 0.99 is t = 4.6, an ordinary point; in X the
right-hand side grows like 1/(1 - X).
(2) When a monomer runs out, f1 (or f2) decays like exp(-c t) with c up to 1/r - 1; in f1 that
falls below atol and the solver returns noise around zero (we saw 1e-15 values of either sign when
integrating f1 directly), while u just moves linearly, so every tabulated f1, however small, keeps
its relative accuracy. The requested conversions are passed as t_eval = -log1p(-X); solve_ivp
fills them in from DOP853's 7th-order dense output between its steps, and the self-checks below
measure that interpolation error together with the step error.

Accuracy: DOP853 with rtol = 1e-12, atol = 1e-14 (on u). The script checks itself two ways before
writing (see self_check): (1) a second integration with rtol = 1e-13, atol = 1e-16 must give every
f1 to a relative 1e-10 (f1 and f2 both, so tiny values count too);
(2) wherever r1 != 1, r2 != 1 and r1 + r2 != 2, the closed-form integral of the Skeist equation
(V. E. Meyer, G. G. Lowry, J. Polym. Sci. A 3, 2843 (1965)),

    1 - X = (f1/f10)^a (f2/f20)^b ((f10 - d)/(f1 - d))^g
    a = r2/(1 - r2), b = r1/(1 - r1), g = (1 - r1 r2)/((1 - r1)(1 - r2)), d = (1 - r2)/(2 - r1 - r2)

solved for f1 at each requested X (scipy.optimize.brentq, in log form) must give the integrated
f1 to 1e-10 (skipped once f1 or f2 falls below 1e-6, where the logarithms lose the digits).

Usage
-----
    /usr/bin/python3 testdata/skeist_scipy.py            # (re)write testdata/skeist_scipy.csv
    /usr/bin/python3 testdata/skeist_scipy.py --stdout   # print the table instead
    /usr/bin/python3 testdata/skeist_scipy.py --check    # recompute; compare with the committed
                                                         # CSV to 1e-9 absolute; exit 1 on the
                                                         # first mismatch (make test-fixtures)
"""

import argparse
import csv
import math
import os
import platform
import sys

import numpy as np
import scipy
from scipy.integrate import solve_ivp
from scipy.optimize import brentq

RTOL = 1e-12
ATOL = 1e-14
CHECK_TOL = 1e-9  # absolute tolerance of --check against the committed CSV
CSV_PATH = os.path.join(os.path.dirname(os.path.abspath(__file__)), "skeist_scipy.csv")
COMMAND = "/usr/bin/python3 testdata/skeist_scipy.py"
COLUMNS = ["case", "r1", "r2", "f10", "X", "f1", "F1", "F1cum"]

# Conversions at which every case is tabulated.
CONVERSIONS = [0.0, 0.05] + [round(0.1 * k, 1) for k in range(1, 10)] + [0.95, 0.99]

# (case name, r1, r2, f10). The reactivity ratios are inputs only: every expected number in the
# CSV is computed by scipy from them. Where a ratio pair is a literature value, README.md says
# where it comes from.
CASES = [
    # r1 < 1 and r2 < 1: azeotrope at d = (1 - r2)/(2 - r1 - r2) = 0.96/1.56 = 0.6154.
    # Styrene (1) / acrylonitrile (2), Polymer Handbook 4th ed. (Greenley table), 0.40 / 0.04.
    ("sty-an-f0.3", 0.40, 0.04, 0.3),      # below the azeotrope: f1 drifts down
    ("sty-an-f0.615", 0.40, 0.04, 0.615),  # 0.0004 below the azeotrope: almost no drift
    ("sty-an-f0.8", 0.40, 0.04, 0.8),      # above the azeotrope: f1 drifts up
    # r1 > 1 and r2 < 1: no azeotrope, M1 enters the chain faster. Methyl methacrylate (1) /
    # n-butyl acrylate (2), 1.88 / 0.43 (from memory; used only as an input).
    ("mma-nba-f0.5", 1.88, 0.43, 0.5),
    # r1 = 1 exactly: Meyer-Lowry's b = r1/(1 - r1) is singular; the ODE is not.
    ("r1-one", 1.0, 0.5, 0.5),
    # r2 = 1 exactly: a = r2/(1 - r2) is singular.
    ("r2-one", 0.5, 1.0, 0.5),
    # r1 + r2 = 2: d = (1 - r2)/(2 - r1 - r2) has a zero denominator (no azeotrope).
    ("sum-two", 1.5, 0.5, 0.5),
    # r1 = r2 = 1: ideal azeotropic copolymerisation, F1 = f1 for every f1, so f1 never drifts.
    ("ideal-one", 1.0, 1.0, 0.4),
    # r1 > 1 and r2 > 1: unstable azeotrope at d = (-0.5)/(-1.5) = 1/3; f10 = 0.2 lies below it.
    ("both-above-one", 2.0, 1.5, 0.2),
    # Strong exhaustion: M1 is used up near X = f10 = 0.5 and f1 then decays like exp(-19 t).
    ("exhaustion", 5.0, 0.05, 0.5),
]


def mayo_lewis(r1, r2, f1):
    """Instantaneous copolymer composition F1(f1) (Mayo-Lewis)."""
    f2 = 1.0 - f1
    num = r1 * f1 * f1 + f1 * f2
    return num / (num + f1 * f2 + r2 * f2 * f2)


def expit(u):
    """f1 = 1/(1 + exp(-u)) without overflow, and f2 = 1 - f1 without cancellation."""
    if u >= 0:
        e = math.exp(-u)
        return 1.0 / (1.0 + e), e / (1.0 + e)
    e = math.exp(u)
    return e / (1.0 + e), 1.0 / (1.0 + e)


def integrate(r1, r2, f10, conversions, rtol=RTOL, atol=ATOL):
    """(f1, f2) at each conversion X, from the Skeist equation in t = -ln(1 - X), u = ln(f1/f2)."""
    t_eval = [-math.log1p(-x) for x in conversions]

    def rhs(_t, y):
        f1, f2 = expit(y[0])
        return [((1.0 - r1) * f1 - (1.0 - r2) * f2) / (r1 * f1 * f1 + 2.0 * f1 * f2 + r2 * f2 * f2)]

    u0 = math.log(f10 / (1.0 - f10))
    sol = solve_ivp(rhs, (0.0, t_eval[-1]), [u0], method="DOP853",
                    t_eval=t_eval, rtol=rtol, atol=atol)
    if not sol.success:
        raise RuntimeError("solve_ivp failed for r1=%r r2=%r f10=%r: %s" % (r1, r2, f10, sol.message))
    return [expit(float(u)) for u in sol.y[0]]


def rows_for(name, r1, r2, f10):
    """The CSV rows of one case, as lists of floats after the case name."""
    feeds = integrate(r1, r2, f10, CONVERSIONS)
    rows = []
    for x, (f1, _f2) in zip(CONVERSIONS, feeds):
        inst = mayo_lewis(r1, r2, f1)
        cum = mayo_lewis(r1, r2, f10) if x == 0 else (f10 - (1.0 - x) * f1) / x
        rows.append([name, r1, r2, f10, x, f1, inst, cum])
    return rows


def meyer_lowry_f1(r1, r2, f10, x, guess):
    """Feed f1 at conversion x from the Meyer-Lowry closed form, searched near guess.

    Root of  a ln(f1/f10) + b ln(f2/f20) + g ln((f10 - d)/(f1 - d)) - ln(1 - x)  in f1. The bracket
    is guess -+ 1e-8 (clipped to the side of d and of 0 and 1 where f10 lies); a bracket without a
    sign change means the integrated f1 is more than 1e-8 off, and the check fails.
    """
    a = r2 / (1.0 - r2)
    b = r1 / (1.0 - r1)
    g = (1.0 - r1 * r2) / ((1.0 - r1) * (1.0 - r2))
    d = (1.0 - r2) / (2.0 - r1 - r2)
    log1mx = math.log1p(-x)

    def h(f1):
        return (a * math.log(f1 / f10) + b * math.log((1.0 - f1) / (1.0 - f10))
                + g * math.log((f10 - d) / (f1 - d)) - log1mx)

    lo, hi = max(guess - 1e-8, 0.0), min(guess + 1e-8, 1.0)
    if 0.0 < d < 1.0:
        if f10 > d:
            lo = max(lo, d)
        else:
            hi = min(hi, d)
    lo, hi = math.nextafter(lo, 1.0), math.nextafter(hi, 0.0)
    if h(lo) * h(hi) > 0:
        return None
    return brentq(h, lo, hi, xtol=1e-16, rtol=4 * np.finfo(float).eps, maxiter=200)


def self_check(table):
    """Fail loudly unless the table passes the two accuracy checks in the module comment."""
    worst_rerun = 0.0
    worst_closed = 0.0
    for name, r1, r2, f10 in CASES:
        rows = [r for r in table if r[0] == name]
        fine = integrate(r1, r2, f10, CONVERSIONS, rtol=1e-13, atol=1e-16)
        coarse = integrate(r1, r2, f10, CONVERSIONS)
        for row, (c1, c2), (f1, f2) in zip(rows, coarse, fine):
            diff = max(abs(c1 - f1) / f1, abs(c2 - f2) / f2)
            worst_rerun = max(worst_rerun, diff)
            if diff > 1e-10:
                sys.exit("self-check: %s X=%g: f1 = %.17g at rtol 1e-12 but %.17g at rtol 1e-13"
                         % (name, row[4], c1, f1))
        if r1 == 1.0 or r2 == 1.0 or r1 + r2 == 2.0:
            continue
        for row in rows[1:]:
            x, f1 = row[4], row[5]
            if min(f1, 1.0 - f1) < 1e-6:
                continue
            closed = meyer_lowry_f1(r1, r2, f10, x, f1)
            if closed is None or abs(closed - f1) > 1e-10:
                sys.exit("self-check: %s X=%g: integrated f1 = %.17g, Meyer-Lowry f1 = %r"
                         % (name, x, f1, closed))
            worst_closed = max(worst_closed, abs(closed - f1))
    return worst_rerun, worst_closed


def make_table():
    table = []
    for name, r1, r2, f10 in CASES:
        table.extend(rows_for(name, r1, r2, f10))
    return table


def header():
    return ("# Skeist equation solved by scipy.integrate.solve_ivp (DOP853, rtol=%g, atol=%g, in t=-ln(1-X) and u=ln(f1/f2));"
            " python %s, numpy %s, scipy %s; made by: %s"
            % (RTOL, ATOL, platform.python_version(), np.__version__, scipy.__version__, COMMAND))


def fmt(v):
    return v if isinstance(v, str) else "%.15g" % v


def write(table, out):
    out.write(header() + "\n")
    w = csv.writer(out, lineterminator="\n")
    w.writerow(COLUMNS)
    for row in table:
        w.writerow([fmt(v) for v in row])


def check(table, path):
    """Compare the recomputed table with the committed CSV; return an exit status."""
    with open(path, newline="") as fh:
        numbered = [(n, ln) for n, ln in enumerate(fh, 1) if not ln.startswith("#")]
    committed = list(csv.reader(ln for _, ln in numbered))
    line_of = [n for n, _ in numbered[1:]]
    if not committed or committed[0] != COLUMNS:
        print("%s: header is %r, want %r" % (path, committed[0] if committed else None, COLUMNS))
        return 1
    committed = committed[1:]
    if len(committed) != len(table):
        print("%s: %d rows, recomputed %d" % (path, len(committed), len(table)))
        return 1
    for i, (old, new) in enumerate(zip(committed, table)):
        if old[0] != new[0]:
            print("%s:%d: case %r, recomputed %r" % (path, line_of[i], old[0], new[0]))
            return 1
        for col, o, n in zip(COLUMNS[1:], old[1:], new[1:]):
            if not abs(float(o) - n) <= CHECK_TOL:
                print("%s:%d: case %s, X=%s: %s = %s, recomputed %.15g (|diff| > %g)"
                      % (path, line_of[i], old[0], old[4], col, o, n, CHECK_TOL))
                return 1
    print("%s: %d rows agree with scipy %s to %g" % (path, len(table), scipy.__version__, CHECK_TOL))
    return 0


def main():
    p = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    g = p.add_mutually_exclusive_group()
    g.add_argument("--check", action="store_true", help="compare with the committed CSV instead of writing it")
    g.add_argument("--stdout", action="store_true", help="print the table instead of writing the CSV")
    p.add_argument("--file", default=CSV_PATH, help="the CSV to write or check (default %(default)s)")
    args = p.parse_args()

    table = make_table()
    rerun, closed = self_check(table)
    print("self-check: rerun at rtol 1e-13 within %.1e relative; Meyer-Lowry closed form within %.1e in f1"
          % (rerun, closed), file=sys.stderr)
    if args.check:
        sys.exit(check(table, args.file))
    if args.stdout:
        write(table, sys.stdout)
        return
    with open(args.file, "w", newline="") as fh:
        write(table, fh)
    print("wrote %s (%d rows)" % (args.file, len(table)), file=sys.stderr)


if __name__ == "__main__":
    main()
