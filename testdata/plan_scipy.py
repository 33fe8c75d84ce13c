#!/usr/bin/python3
"""Simulation by scipy of a reactor following copoly's semi-batch and shot plans.

This script makes testdata/plan_scipy.json, which copoly/plan/plan_scipy_test.go compares
copoly's plans (plan.Make, package copoly/plan) with. It reads the plans from testdata/plan_copoly.json (written by the
Go test TestPlanScipyWrite; copoly's own output) and takes from each only what a chemist would
carry out: the initial charge (g), the time of every schedule row (min), the pump rates over
each row (g/min) and the shots (time, g) for the run in time; the cumulative fed masses per
row and the polymer mass at which each row ends for the run by polymer formed. The plan's
conversions, compositions and inventories are not read: the Go test compares them with the
simulation. The script shares no code with copoly; its only numerics are scipy's.

Model
-----
Terminal model with reactivity ratios r1 = k11/k12, r2 = k22/k21. The instantaneous copolymer
composition is the Mayo-Lewis equation (F. R. Mayo, F. M. Lewis, J. Am. Chem. Soc. 1944, 66,
1594), with f1 = N1/(N1 + N2) and f2 = 1 - f1:

    F1(f1) = (r1 f1^2 + f1 f2) / (r1 f1^2 + 2 f1 f2 + r2 f2^2)

The plans take an apparent first-order rate of polymerization in the unreacted monomer,
Rp = k (N1 + N2) (mol/min). The reactor balances in time, in mol, are

    dN1/dt = u1(t) - Rp F1(f1)          dP1/dt = Rp F1(f1)
    dN2/dt = u2(t) - Rp (1 - F1(f1))    dP2/dt = Rp (1 - F1(f1))

from N1(0), N2(0) the planned charge (g divided by the molar mass) and P1(0) = P2(0) = 0, with
u1, u2 the planned pump rates divided by the molar masses: constant over each row of the
schedule (the plan gives one rate per row, the fed mass of the row over its duration). A shot
adds its masses to N1, N2 at its time. The polymer P1, P2 is integrated as its own state, not
taken from the balance charge + fed - N, so the Go test's mass balance (N + P against the
plan's charge + fed masses) checks the integration and the plan's pump rates against its fed
masses.

The right-hand side is smooth within a row and jumps at row boundaries (the pump rates change),
so each row is integrated on its own by scipy.integrate.solve_ivp (method DOP853, rtol 1e-11,
atol 1e-14 mol), restarted from the state at the end of the row before. The state is recorded
at every row time: for a shot, the row ending the interval holds the state before the shot and
the next row (same time, no pump rate) the state after it. For a semi-batch plan the script
also samples F1 at 16 interior points of every row from DOP853's dense output and records the
largest |F1 - target| there (max_dev_between_rows): the pump rates are constant over a row
while the ideal policy's are not, so F1 is least exact inside the rows.

Second run: additions tied to the polymer formed
------------------------------------------------
The plan ties its additions to the polymer formed, not to the clock: a chemist following the
schedule by measured conversion adds each row's fed masses in proportion to the polymer made
over the row, and a row that makes no polymer is a shot. The script integrates that too, with
the mass w of polymer formed (g) as the independent variable, m(F1) = F1 M1 + (1 - F1) M2 the
molar mass of the units forming and alpha1, alpha2 a row's fed moles over its polymer mass
(from the plan's fed1_g, fed2_g and polymer_g columns):

    dN1/dw = alpha1 - F1/m(F1)          dP1/dw = F1/m(F1)
    dN2/dw = alpha2 - (1 - F1)/m(F1)    dP2/dw = (1 - F1)/m(F1)

row by row with the same solve_ivp settings (rows_by_polymer). This run does not use the rate
law, the times or the pump rates, so it separates errors in the amounts from errors in the
time axis: in time, the pump rates are constant over a row while the ideal policy's fall with
the inventory, so F1 strays from the target inside and at the end of the long last rows (about
1e-4 at the default 200 rows, falling as 1/rows^2); by polymer it does not stray at all.

Independent closed forms
------------------------
The feed f1* that gives the target copolymer composition F1* is found by
scipy.optimize.brentq on F1(f1) - F1* over [0, 1] (F1(0) = 0 and F1(1) = 1 for positive
ratios). The moles metered per mole of polymer that hold the unreacted mixture at f1* follow
from d(N1/N2) = 0 (R. J. Hanna, Ind. Eng. Chem. 1957, 49, 208, for the faster monomer):

    a = (F1* - f1*) / (y - f1*)

with y the mole fraction of M1 in the metered stream: y = 1 or 0 for the faster monomer alone
(y = 1 when F1* > f1*), y = F1* for a mixture at the copolymer composition (then a = 1). Both
are written to the fixture for the Go test to compare with the plan's StartF1 and
FeedPerPolymer.

Molar masses come from the formulas with the IUPAC conventional atomic weights (C 12.011,
H 1.008, O 15.999): styrene C8H8, methyl methacrylate C5H8O2, n-butyl acrylate C7H12O2.

Cases
-----
CASES below lists the inputs; the script refuses a plan_copoly.json made from other inputs.
Styrene / n-butyl acrylate r1 = 0.80, r2 = 0.15: Polymer Handbook, 4th ed. (J. Brandrup,
E. H. Immergut, E. A. Grulke, eds., Wiley 1999), reactivity-ratio table compiled by
R. Z. Greenley. Methyl methacrylate / n-butyl acrylate r1 = 1.88, r2 = 0.43: from memory (an
input; the comparison does not depend on where it came from). The rate constants are chosen
for the check, not measured.

Self-check
----------
Before writing (and with --check) every case is integrated a second time, both ways, with
rtol 1e-13, atol 1e-16; every recorded number must agree with the first run to 1e-9 relative
(measured: 2.4e-14).

Usage
-----
    /usr/bin/python3 testdata/plan_scipy.py            # (re)write testdata/plan_scipy.json
    /usr/bin/python3 testdata/plan_scipy.py --check    # recompute; compare with the committed
                                                       # file to 1e-8 relative; exit 1 on a
                                                       # mismatch (make test-fixtures)

After a change to copoly's plans, first rewrite plan_copoly.json:

    cd copoly/plan && COPOLY_WRITE_PLANS=../../testdata/plan_copoly.json go test -run TestPlanScipyWrite .
"""

import argparse
import hashlib
import json
import math
import os
import platform
import sys

import numpy as np
import scipy
from scipy.integrate import solve_ivp
from scipy.optimize import brentq

from fixturejson import dumps  # testdata/fixturejson.py

HERE = os.path.dirname(os.path.abspath(__file__))
PLANS_PATH = os.path.join(HERE, "plan_copoly.json")
JSON_PATH = os.path.join(HERE, "plan_scipy.json")
COMMAND = "/usr/bin/python3 testdata/plan_scipy.py"

RTOL, ATOL = 1e-11, 1e-14         # mol
RTOL2, ATOL2 = 1e-13, 1e-16       # self-check run
SELF_TOL = 1e-9                   # self-check, relative
CHECK_TOL = 1e-8                  # --check, relative
BETWEEN = 16                      # interior samples per row for max_dev_between_rows

ATOMIC = {"C": 12.011, "H": 1.008, "O": 15.999}  # IUPAC conventional atomic weights
FORMULA = {"styrene": {"C": 8, "H": 8}, "mma": {"C": 5, "H": 8, "O": 2}, "nba": {"C": 7, "H": 12, "O": 2}}


def molar_mass(name):
    return sum(ATOMIC[e] * n for e, n in FORMULA[name].items())


def case(name, m1, m2, r1, r2, target, mode, k, feed="faster", final=0.95, shots=0):
    return {"name": name, "monomers": [m1, m2], "r1": r1, "r2": r2, "target_f1": target,
            "molar_mass1": molar_mass(m1), "molar_mass2": molar_mass(m2), "polymer_mass": 1000.0,
            "mode": mode, "feed": feed, "feed_f1": 0.0, "final_conversion": final,
            "rate_constant": k, "shots": shots, "steps": 200}


CASES = [
    case("sty-nba-faster", "styrene", "nba", 0.80, 0.15, 0.5, "semibatch", 0.01),
    case("sty-nba-starved", "styrene", "nba", 0.80, 0.15, 0.5, "semibatch", 0.01, feed="mixture"),
    case("mma-nba-faster", "mma", "nba", 1.88, 0.43, 0.4, "semibatch", 0.02),
    # Four shots cannot reach a final conversion of 0.95; 0.6 gives a clear saw-tooth.
    case("sty-nba-shots4", "styrene", "nba", 0.80, 0.15, 0.5, "shots", 0.01, final=0.6, shots=4),
]

COLUMNS = ["time_min", "N1_mol", "N2_mol", "P1_mol", "P2_mol", "F1", "polymer_g", "F1cum", "inventory_g"]
COLUMNS_BY_POLYMER = ["N1_mol", "N2_mol", "F1", "F1cum"]


def mayo_lewis(r1, r2, f1):
    f2 = 1.0 - f1
    num = r1 * f1 * f1 + f1 * f2
    return num / (num + f1 * f2 + r2 * f2 * f2)


def feed_policy(c):
    """f1* from brentq on Mayo-Lewis, and the moles a metered per mole of polymer."""
    F = c["target_f1"]
    fstar = brentq(lambda f: mayo_lewis(c["r1"], c["r2"], f) - F, 0.0, 1.0, xtol=1e-16, rtol=8.9e-16)
    if c["feed"] == "mixture":
        y = c["feed_f1"] or F
    else:
        y = 1.0 if F > fstar else 0.0
    return fstar, (F - fstar) / (y - fstar)


def check_inputs(c, plan):
    """Exit unless plan_copoly.json was made from the inputs of case c."""
    got = plan["input"]
    for k, v in c.items():
        if k in ("name", "monomers"):
            continue
        g = got.get(k)
        ok = (abs(g - v) <= 1e-12 * abs(v)) if isinstance(v, float) and isinstance(g, (int, float)) else g == v
        if not ok:
            sys.exit("%s: case %s: %s = %r, this script's case has %r: rewrite plan_copoly.json (see the docstring)"
                     % (PLANS_PATH, c["name"], k, g, v))
    if set(got) != set(c) - {"name", "monomers"}:
        sys.exit("%s: case %s: input fields %s, expected %s" % (PLANS_PATH, c["name"], sorted(got), sorted(set(c) - {"name", "monomers"})))


def simulate(c, plan, cols, rtol, atol):
    """Integrate the reactor following plan; return the rows and max_dev_between_rows."""
    r1, r2, k, M1, M2 = c["r1"], c["r2"], c["rate_constant"], c["molar_mass1"], c["molar_mass2"]
    ti, p1i, p2i = cols.index("time_min"), cols.index("pump1_g_per_min"), cols.index("pump2_g_per_min")
    rows = plan["rows"]
    shots = list(plan["shots"])  # [polymer, mass1, mass2, time]

    def rhs(_t, y, u1, u2):
        n1, n2 = y[0], y[1]
        rp = k * (n1 + n2)
        F1 = mayo_lewis(r1, r2, n1 / (n1 + n2))
        return [u1 - rp * F1, u2 - rp * (1.0 - F1), rp * F1, rp * (1.0 - F1)]

    def record(t, y):
        n1, n2, q1, q2 = (float(v) for v in y)
        F1 = mayo_lewis(r1, r2, n1 / (n1 + n2))
        cum = q1 / (q1 + q2) if q1 + q2 > 0 else F1
        return [float(t), n1, n2, q1, q2, F1, q1 * M1 + q2 * M2, cum, n1 * M1 + n2 * M2]

    y = np.array([plan["plan"]["charge1"] / M1, plan["plan"]["charge2"] / M2, 0.0, 0.0])
    t0 = float(rows[0][ti])
    if t0 != 0 or rows[0][p1i] is not None:
        sys.exit("case %s: row 0 must be at time 0 with no pump rate" % c["name"])
    out, worst = [record(t0, y)], 0.0
    for i in range(1, len(rows)):
        t1 = float(rows[i][ti])
        if t1 == t0:
            # A shot row: the next shot, at this time, with no pump rate.
            if not shots or shots[0][3] != t1 or rows[i][p1i] is not None or rows[i][p2i] is not None:
                sys.exit("case %s row %d: a row of no duration that is not the next shot" % (c["name"], i))
            _, m1, m2, _ = shots.pop(0)
            y = y + np.array([m1 / M1, m2 / M2, 0.0, 0.0])
            out.append(record(t1, y))
            continue
        if not t1 > t0 or rows[i][p1i] is None or rows[i][p2i] is None:
            sys.exit("case %s row %d: time %r after %r with pump rates %r, %r" % (c["name"], i, t1, t0, rows[i][p1i], rows[i][p2i]))
        u1, u2 = rows[i][p1i] / M1, rows[i][p2i] / M2
        sol = solve_ivp(rhs, (t0, t1), y, method="DOP853", rtol=rtol, atol=atol, args=(u1, u2),
                        dense_output=True)
        if sol.status != 0:
            sys.exit("case %s row %d: solve_ivp: %s" % (c["name"], i, sol.message))
        y = sol.y[:, -1]
        if c["mode"] == "semibatch":
            for s in np.linspace(t0, t1, BETWEEN + 2)[1:-1]:
                n1, n2 = sol.sol(s)[:2]
                worst = max(worst, abs(mayo_lewis(r1, r2, n1 / (n1 + n2)) - c["target_f1"]))
        out.append(record(t1, y))
        t0 = t1
    if shots:
        sys.exit("case %s: %d shots not applied (no row of no duration at their times)" % (c["name"], len(shots)))
    return out, worst


def simulate_by_polymer(c, plan, cols, rtol, atol):
    """Integrate the reactor with the additions tied to the polymer formed; return the rows."""
    r1, r2, M1, M2 = c["r1"], c["r2"], c["molar_mass1"], c["molar_mass2"]
    wi, f1i, f2i = cols.index("polymer_g"), cols.index("fed1_g"), cols.index("fed2_g")
    rows = plan["rows"]

    def rhs(_w, y, a1, a2):
        n1, n2 = y[0], y[1]
        F1 = mayo_lewis(r1, r2, n1 / (n1 + n2))
        m = F1 * M1 + (1.0 - F1) * M2  # g per mol of copolymer units formed now
        return [a1 - F1 / m, a2 - (1.0 - F1) / m, F1 / m, (1.0 - F1) / m]

    def record(y):
        n1, n2, q1, q2 = (float(v) for v in y)
        F1 = mayo_lewis(r1, r2, n1 / (n1 + n2))
        return [n1, n2, F1, q1 / (q1 + q2) if q1 + q2 > 0 else F1]

    y = np.array([plan["plan"]["charge1"] / M1, plan["plan"]["charge2"] / M2, 0.0, 0.0])
    out = [record(y)]
    for i in range(1, len(rows)):
        a, b = rows[i - 1], rows[i]
        dw = b[wi] - a[wi]
        add = np.array([(b[f1i] - a[f1i]) / M1, (b[f2i] - a[f2i]) / M2, 0.0, 0.0])
        if dw <= 0:
            if dw < 0:
                sys.exit("case %s row %d: the polymer decreases" % (c["name"], i))
            y = y + add  # a shot
        else:
            sol = solve_ivp(rhs, (a[wi], b[wi]), y, method="DOP853", rtol=rtol, atol=atol,
                            args=(add[0] / dw, add[1] / dw))
            if sol.status != 0:
                sys.exit("case %s row %d: solve_ivp: %s" % (c["name"], i, sol.message))
            y = sol.y[:, -1]
        out.append(record(y))
    return out


def rel(a, b):
    d = abs(a - b)
    return d / max(abs(a), abs(b)) if d > 1e-300 else 0.0


def make(plans_bytes):
    plans = json.loads(plans_bytes)
    cols = plans["columns"]
    if [p["name"] for p in plans["cases"]] != [c["name"] for c in CASES]:
        sys.exit("%s: cases %s, this script has %s" % (PLANS_PATH, [p["name"] for p in plans["cases"]], [c["name"] for c in CASES]))
    cases, log = [], []
    for c, plan in zip(CASES, plans["cases"]):
        check_inputs(c, plan)
        fstar, a = feed_policy(c)
        rows, between = simulate(c, plan, cols, RTOL, ATOL)
        rows2, _ = simulate(c, plan, cols, RTOL2, ATOL2)
        byp = simulate_by_polymer(c, plan, cols, RTOL, ATOL)
        byp2 = simulate_by_polymer(c, plan, cols, RTOL2, ATOL2)
        self_err = max(rel(x, y) for r, s in list(zip(rows, rows2)) + list(zip(byp, byp2))
                       for x, y in zip(r, s) if abs(y) > 1e-12)
        if not self_err <= SELF_TOL:
            sys.exit("self-check: case %s: rtol %g and %g differ by %.2g relative (> %g)" % (c["name"], RTOL, RTOL2, self_err, SELF_TOL))
        hold = max(abs(r[5] - c["target_f1"]) for r in rows)
        hold_p = max(abs(r[2] - c["target_f1"]) for r in byp)
        log.append("%-16s %3d rows  f1* = %.12g  a = %.12g  max |F1 - target| in time %.2g at rows, %.2g "
                   "between; by polymer %.2g; self-check %.1e" % (c["name"], len(rows), fstar, a, hold, between, hold_p, self_err))
        cases.append({"name": c["name"], "start_f1": fstar, "feed_per_polymer": a,
                      "max_dev_between_rows": between, "rows": rows, "rows_by_polymer": byp})
    doc = {
        "comment": "Reactor balances integrated by scipy along copoly's plans in testdata/plan_copoly.json, "
                   "for copoly/plan/plan_scipy_test.go; see testdata/README.md and the docstring of "
                   "testdata/plan_scipy.py.",
        "made_by": COMMAND,
        "python": platform.python_version(),
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "solve_ivp": {"method": "DOP853", "rtol": RTOL, "atol": ATOL},
        "plans_sha256": hashlib.sha256(plans_bytes).hexdigest(),
        "columns": COLUMNS,
        "columns_by_polymer": COLUMNS_BY_POLYMER,
        "cases": cases,
    }
    return doc, log


def compare(old, new, where):
    """Differences between the committed and recomputed values, as messages."""
    if isinstance(new, dict):
        if not isinstance(old, dict) or set(old) != set(new):
            return ["%s: keys %s, recomputed %s" % (where, sorted(old) if isinstance(old, dict) else old, sorted(new))]
        out = []
        for k in new:
            if k in ("python", "numpy", "scipy"):
                continue  # recorded, not compared
            out += compare(old[k], new[k], "%s.%s" % (where, k))
        return out
    if isinstance(new, list):
        if not isinstance(old, list) or len(old) != len(new):
            return ["%s: length %s, recomputed %d" % (where, len(old) if isinstance(old, list) else old, len(new))]
        out = []
        for i, (o, n) in enumerate(zip(old, new)):
            out += compare(o, n, "%s[%d]" % (where, i))
        return out
    if isinstance(new, float) and not isinstance(old, bool) and isinstance(old, (int, float)):
        ok = abs(old - new) <= CHECK_TOL * max(abs(old), abs(new)) or abs(old - new) <= 1e-15
        return [] if ok else ["%s = %r, recomputed %r (tolerance %g relative)" % (where, old, new, CHECK_TOL)]
    return [] if old == new else ["%s = %r, recomputed %r" % (where, old, new)]


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    ap.add_argument("--check", action="store_true", help="compare with the committed file instead of writing it")
    ap.add_argument("--plans", default=PLANS_PATH, help="copoly's plans (default %(default)s)")
    ap.add_argument("--file", default=JSON_PATH, help="the JSON file to write or check (default %(default)s)")
    args = ap.parse_args()

    with open(args.plans, "rb") as fh:
        plans_bytes = fh.read()
    doc, log = make(plans_bytes)
    for line in log:
        print(line, file=sys.stderr)
    if args.check:
        with open(args.file) as fh:
            old = json.load(fh)
        bad = compare(old, json.loads(dumps(doc)), "plan_scipy")
        if bad:
            print("%s: differs from a fresh run of %s (python %s, numpy %s, scipy %s):"
                  % (args.file, COMMAND, platform.python_version(), np.__version__, scipy.__version__))
            for b in bad[:20]:
                print("  " + b)
            if len(bad) > 20:
                print("  ... and %d more" % (len(bad) - 20))
            sys.exit(1)
        print("%s: %d plans simulated again by scipy %s agree to %g relative"
              % (args.file, len(doc["cases"]), scipy.__version__, CHECK_TOL))
        return
    with open(args.file, "w") as fh:
        fh.write(dumps(doc) + "\n")
    print("wrote %s" % args.file, file=sys.stderr)


if __name__ == "__main__":
    main()
