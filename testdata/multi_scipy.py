#!/usr/bin/python3
"""Reference drift of batch terpolymerization and tetrapolymerization (terminal model), by scipy.

This script makes testdata/multi_scipy.json, the reference the copoly/multi Go tests compare the
N-monomer drift against. It is independent of copoly: its only numerics are numpy's and scipy's.

Model
-----
N monomers, reactivity ratios r_ij = k_ii/k_ij (r_ii = 1). For an unreacted mixture with mole
fractions f, the chain is a Markov chain with transition probabilities

    P_ij = (f_j / r_ij) / sum_k (f_k / r_ik)

and the copolymer being formed has the composition F of its stationary distribution,
F P = F, sum F = 1 (C. Walling, E. R. Briggs, J. Am. Chem. Soc. 67, 1774 (1945); for N = 3 the
equation of T. Alfrey, G. Goldfinger, J. Chem. Phys. 12, 322 (1944)). Here F comes from
numpy.linalg.solve (LAPACK gesv, LU with partial pivoting) on (P^T - I) F = 0 with the last row
replaced by sum F = 1.

In a batch the unreacted mixture drifts with the overall molar conversion X (I. Skeist, J. Am.
Chem. Soc. 68, 1781 (1946), written for N monomers):

    df_i/dX = (f_i - F_i(f)) / (1 - X),        Fcum_i(X) = (f_i0 - (1 - X) f_i(X)) / X.

Integration variables
---------------------
t = -ln(1 - X) and u_i = ln f_i, where the balance reads

    du_i/dt = 1 - F_i / f_i,

autonomous and bounded: a monomer being used up decays exponentially in t, u_i just moves
linearly, and every tabulated f_i keeps its relative accuracy however small it gets. The ratio
F_i / f_i is taken as sum_j F_j (1/r_ji) / sum_k (f_k / r_jk) (from F_i = sum_j F_j P_ji), which does
not divide by a vanishing f_i. The f used for F is exp(u) normalized to sum 1.

solve_ivp (method DOP853, rtol = 1e-12, atol = 1e-14 on u) fills the tabulated conversions from
its dense output (t_eval). A monomer counts as used up when its share falls below 1e-6 (the
threshold copoly reports); solve_ivp's event location (root of ln f_i - ln 1e-6 on the dense
output) gives the conversion at which it does.

Self-checks before writing
--------------------------
1. A second integration with rtol = 1e-13, atol = 1e-16 must give every f_i to 1e-10 relative.
2. For N = 3 the Alfrey-Goldfinger closed form must give the linear solve's F to 1e-12.
3. Fcum from the balance must equal the mean of F over [0, X] from a separate integration of
   dI/dt = F(f) (1 - X) (that is dI/dX = F), I(0) = 0: Fcum = I / X, to 1e-10.

Usage
-----
    /usr/bin/python3 testdata/multi_scipy.py            # (re)write testdata/multi_scipy.json
    /usr/bin/python3 testdata/multi_scipy.py --check    # recompute; compare with the committed
                                                        # JSON (1e-9 absolute, 1e-6 relative
                                                        # below 1e-3); exit 1 at the first
                                                        # mismatch (make test-fixtures)
"""

import argparse
import json
import math
import os
import platform
import sys

import numpy as np
import scipy
from scipy.integrate import solve_ivp

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from fixturejson import dumps  # noqa: E402

RTOL = 1e-12
ATOL = 1e-14
EXHAUSTED = 1e-6
CHECK_ABS = 1e-9
CHECK_REL = 1e-6
JSON_PATH = os.path.join(os.path.dirname(os.path.abspath(__file__)), "multi_scipy.json")
COMMAND = "/usr/bin/python3 testdata/multi_scipy.py"
CONVERSIONS = [0.0, 0.01, 0.05] + [round(0.1 * k, 1) for k in range(1, 10)] + [0.95, 0.99, 0.999]

HANDBOOK = ("Polymer Handbook, 4th ed. (Wiley 1999), Greenley's table of reactivity ratios, as "
            "built into copoly (copoly.Pairs)")

# (name, monomers, r matrix, f0, source of the ratios). The ratios are inputs only: every
# expected number is computed by scipy from them.
CASES = [
    ("st-mma-an", ["styrene", "methyl methacrylate", "acrylonitrile"],
     [[1, 0.52, 0.40],
      [0.46, 1, 1.322],
      [0.04, 0.138, 1]],
     [0.2, 0.3, 0.5],
     HANDBOOK + ": St/MMA 0.52/0.46, St/AN 0.40/0.04, MMA/AN 1.322/0.138"),
    # Vinyl acetate is far less reactive than the other two: methyl methacrylate and
    # acrylonitrile are used up well before the end and vinyl acetate is what is left.
    ("mma-vac-an", ["methyl methacrylate", "vinyl acetate", "acrylonitrile"],
     [[1, 26, 1.322],
      [0.03, 1, 0.04],
      [0.138, 4.05, 1]],
     [0.2, 0.5, 0.3],
     HANDBOOK + ": MMA/VAc 26/0.03, MMA/AN 1.322/0.138, AN/VAc 4.05/0.04"),
    ("st-mma-an-nba", ["styrene", "methyl methacrylate", "acrylonitrile", "n-butyl acrylate"],
     [[1, 0.52, 0.40, 0.80],
      [0.46, 1, 1.322, 1.88],
      [0.04, 0.138, 1, 1.52],
      [0.15, 0.43, 0.75, 1]],
     [0.25, 0.25, 0.25, 0.25],
     HANDBOOK + ": St/MMA 0.52/0.46, St/AN 0.40/0.04, St/nBA 0.80/0.15, MMA/AN 1.322/0.138, "
     "MMA/nBA 1.88/0.43; AN/nBA 1.52/0.75 (Jordan, Doughty, Port, J. Appl. Polym. Sci. 1960, 4, "
     "as built into copoly)"),
    # A test shape, not a real system: M1 is taken by every radical far faster than the others
    # (r_i1 = 0.02) and prefers itself (r_1j = 20): it is used up near X = 0.38, after
    # which three monomers carry on.
    ("fast-first", ["M1", "M2", "M3", "M4"],
     [[1, 20, 20, 20],
      [0.02, 1, 0.5, 2],
      [0.02, 1.5, 1, 0.8],
      [0.02, 0.6, 1.2, 1]],
     [0.15, 0.3, 0.25, 0.3],
     "constructed for the test (no real system): a strongly favoured first monomer"),
]


def transition(r, f):
    """P_ij = (f_j/r_ij) / sum_k (f_k/r_ik)."""
    w = f[None, :] / r
    return w / w.sum(axis=1)[:, None]


def composition(r, f):
    """Stationary distribution of P: numpy.linalg.solve on (P^T - I) F = 0, sum F = 1."""
    n = len(f)
    a = transition(r, f).T - np.eye(n)
    a[-1, :] = 1.0
    b = np.zeros(n)
    b[-1] = 1.0
    return np.linalg.solve(a, b)


def alfrey_goldfinger(r, f):
    """The ternary composition equation of Alfrey and Goldfinger (1944)."""
    r12, r13, r21, r23, r31, r32 = r[0, 1], r[0, 2], r[1, 0], r[1, 2], r[2, 0], r[2, 1]
    f1, f2, f3 = f
    a = f1 * (f1 / (r31 * r21) + f2 / (r21 * r32) + f3 / (r31 * r23)) * (f1 + f2 / r12 + f3 / r13)
    b = f2 * (f1 / (r12 * r31) + f2 / (r12 * r32) + f3 / (r32 * r13)) * (f2 + f1 / r21 + f3 / r23)
    c = f3 * (f1 / (r13 * r21) + f2 / (r23 * r12) + f3 / (r13 * r23)) * (f3 + f1 / r31 + f2 / r32)
    s = a + b + c
    return np.array([a / s, b / s, c / s])


def feed(u):
    """f = exp(u) normalized, computed relative to the largest u (no overflow or underflow)."""
    e = np.exp(u - u.max())
    return e / e.sum()


def rhs(r):
    inv = 1.0 / r

    def g(_t, u):
        f = feed(u)
        F = composition(r, f)
        rowsum = (f[None, :] * inv).sum(axis=1)
        lam = (F[:, None] * inv / rowsum[:, None]).sum(axis=0)  # F_i / f_i
        return 1.0 - lam

    return g


def integrate(r, f0, rtol=RTOL, atol=ATOL):
    """f at each tabulated conversion, and (monomer, X) for each monomer used up by X = 0.999."""
    r = np.array(r, dtype=float)
    t_eval = [-math.log1p(-x) for x in CONVERSIONS]
    n = len(f0)
    events = []
    for i in range(n):
        def ev(_t, u, i=i):
            return math.log(feed(u)[i]) - math.log(EXHAUSTED)
        ev.direction = -1
        events.append(ev)
    u0 = np.log(np.array(f0, dtype=float))
    sol = solve_ivp(rhs(r), (0.0, t_eval[-1]), u0, method="DOP853", t_eval=t_eval,
                    rtol=rtol, atol=atol, events=events)
    if not sol.success:
        raise RuntimeError("solve_ivp failed: " + sol.message)
    feeds = [feed(sol.y[:, k]) for k in range(len(t_eval))]
    used_up = []
    for i, te in enumerate(sol.t_events):
        if len(te):
            used_up.append([i, -math.expm1(-float(te[0]))])
    used_up.sort(key=lambda e: e[1])
    return feeds, used_up


def mean_composition(r, f0, rtol=RTOL, atol=ATOL):
    """Mean of F over [0, X] at each tabulated X > 0, from dI/dt = F (1 - X) = F exp(-t)."""
    r = np.array(r, dtype=float)
    n = len(f0)
    g = rhs(r)

    def full(t, y):
        u = y[:n]
        return np.concatenate([g(t, u), composition(r, feed(u)) * math.exp(-t)])

    t_eval = [-math.log1p(-x) for x in CONVERSIONS]
    y0 = np.concatenate([np.log(np.array(f0, dtype=float)), np.zeros(n)])
    sol = solve_ivp(full, (0.0, t_eval[-1]), y0, method="DOP853", t_eval=t_eval, rtol=rtol, atol=atol)
    return [sol.y[n:, k] / x if x > 0 else None for k, x in enumerate(CONVERSIONS)]


def make_case(name, monomers, r, f0, source):
    feeds, used_up = integrate(r, f0)
    ra = np.array(r, dtype=float)
    start = composition(ra, np.array(f0, dtype=float))
    rows_f, rows_F, rows_cum = [], [], []
    for x, f in zip(CONVERSIONS, feeds):
        F = composition(ra, f)
        cum = start if x == 0 else (np.array(f0) - (1.0 - x) * f) / x
        rows_f.append([float(v) for v in f])
        rows_F.append([float(v) for v in F])
        rows_cum.append([float(v) for v in cum])
    return {"name": name, "monomers": monomers, "source": source, "r": r, "f0": f0,
            "conversion": CONVERSIONS, "f": rows_f, "F": rows_F, "Fcum": rows_cum,
            "exhausted": used_up}


def self_check(cases):
    worst = [0.0, 0.0, 0.0]
    for case in cases:
        r, f0 = case["r"], case["f0"]
        fine, _ = integrate(r, f0, rtol=1e-13, atol=1e-16)
        for x, a, b in zip(CONVERSIONS, case["f"], fine):
            for i, (p, q) in enumerate(zip(a, b)):
                d = abs(p - q) / q
                worst[0] = max(worst[0], d)
                if d > 1e-10:
                    sys.exit("self-check: %s X=%g: f[%d] = %.17g at rtol 1e-12, %.17g at rtol 1e-13"
                             % (case["name"], x, i, p, q))
        if len(f0) == 3:
            ra = np.array(r, dtype=float)
            for f, F in zip(case["f"], case["F"]):
                ag = alfrey_goldfinger(ra, np.array(f))
                d = float(np.max(np.abs(ag - np.array(F))))
                worst[1] = max(worst[1], d)
                if d > 1e-12:
                    sys.exit("self-check: %s: Alfrey-Goldfinger differs from the linear solve by %g"
                             % (case["name"], d))
        means = mean_composition(r, f0)
        for x, cum, mean in zip(CONVERSIONS, case["Fcum"], means):
            if mean is None:
                continue
            d = float(np.max(np.abs(np.array(cum) - mean)))
            worst[2] = max(worst[2], d)
            if d > 1e-10:
                sys.exit("self-check: %s X=%g: Fcum by the balance %r, by the mean of F %r"
                         % (case["name"], x, cum, list(mean)))
    return worst


def document(cases):
    return {
        "comment": "Batch drift of the N-monomer terminal model (f, F, Fcum at each conversion) and the "
                   "conversions at which a monomer's share falls below 1e-6, by scipy.integrate.solve_ivp; "
                   "see testdata/multi_scipy.py and testdata/README.md",
        "made_by": COMMAND,
        "python": platform.python_version(),
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "solve_ivp": {"method": "DOP853", "rtol": RTOL, "atol": ATOL,
                      "variables": "t = -ln(1 - X), u_i = ln f_i"},
        "exhausted_fraction": EXHAUSTED,
        "cases": cases,
    }


def close(a, b):
    if abs(a - b) <= CHECK_ABS:
        return abs(b) >= 1e-3 or abs(a - b) <= CHECK_REL * abs(b) or abs(a - b) <= 1e-15
    return False


def compare(path, new):
    with open(path) as fh:
        old = json.load(fh)

    def walk(o, n, where):
        if isinstance(n, dict):
            for k in n:
                if k in ("python", "numpy", "scipy"):
                    if o.get(k) != n[k]:
                        print("note: %s was %s, now %s" % (k, o.get(k), n[k]))
                    continue
                if k not in o:
                    return "%s.%s missing from %s" % (where, k, path)
                msg = walk(o[k], n[k], where + "." + k)
                if msg:
                    return msg
            return None
        if isinstance(n, list):
            if not isinstance(o, list) or len(o) != len(n):
                return "%s: length differs" % where
            for i, (a, b) in enumerate(zip(o, n)):
                msg = walk(a, b, "%s[%d]" % (where, i))
                if msg:
                    return msg
            return None
        if isinstance(n, float) or isinstance(o, float):
            if not close(float(o), float(n)):
                return "%s = %r in %s, recomputed %r" % (where, o, path, n)
            return None
        if o != n:
            return "%s = %r in %s, recomputed %r" % (where, o, path, n)
        return None

    msg = walk(old, new, "")
    if msg:
        print(msg)
        return 1
    print("%s: %d cases agree with scipy %s (%g absolute, %g relative below 1e-3)"
          % (path, len(new["cases"]), scipy.__version__, CHECK_ABS, CHECK_REL))
    return 0


def main():
    p = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    p.add_argument("--check", action="store_true", help="compare with the committed JSON instead of writing it")
    p.add_argument("--file", default=JSON_PATH, help="the JSON to write or check (default %(default)s)")
    args = p.parse_args()
    cases = [make_case(*c) for c in CASES]
    worst = self_check(cases)
    print("self-check: rerun within %.1e relative; Alfrey-Goldfinger within %.1e; balance vs mean of F within %.1e"
          % tuple(worst), file=sys.stderr)
    doc = document(cases)
    if args.check:
        sys.exit(compare(args.file, doc))
    with open(args.file, "w") as fh:
        fh.write(dumps(doc) + "\n")
    print("wrote %s (%d cases)" % (args.file, len(cases)), file=sys.stderr)


if __name__ == "__main__":
    main()
