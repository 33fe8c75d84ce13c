#!/usr/bin/python3
"""Molar-mass averages computed by numpy from the textbook definitions, on a few distributions.

This script makes testdata/averages_numpy.json, the fixture
copoly/molarmass/averages_numpy_test.go compares molarmass.BinAverages and
molarmass.SliceAverages (package copoly/molarmass) against. It is independent of copoly: the
sums are numpy's.

Definitions
-----------
For classes (or slices) i of molar mass M_i holding a mass fraction w_i of the polymer
(P. J. Flory, Principles of Polymer Chemistry, Cornell 1953, chapter VIII):

    Mn = sum(w) / sum(w / M)        (number average)
    Mw = sum(w M) / sum(w)          (weight average)
    Mz = sum(w M^2) / sum(w M)      (z average)
    D  = Mw / Mn                    (dispersity)

A binned class from `low` to `high` g/mol is taken at its midpoint M = (low + high)/2, the
convention copoly documents for BinAverages. Number fractions N_i are turned into mass fractions
with w_i proportional to N_i M_i (a class of N chains of molar mass M weighs N M). Chromatogram
slices are taken at the molar mass of the slice with the detector signal as w (a concentration
detector and slices of equal elution volume). None of the sums needs the fractions to add to 1.

Distributions (all made-up test shapes, not measurements)
---------------------------------------------------------
  lognormal-weight   30 classes with log-spaced edges from 1 000 to 1 000 000 g/mol; weight
                     fractions shaped like a log-normal in M (peak 50 000 g/mol, sigma 0.8 in ln M,
                     evaluated at each class's geometric centre), normalised to sum 1.
  lognormal-number   the same classes given as number fractions N_i = w_i / M_i (normalised), with
                     w_i those of lognormal-weight. Converted back with w proportional to N M, the
                     averages must equal lognormal-weight's; the script checks that to 1e-13.
  sec-gaussian       121 chromatogram slices, elution volume V = 12.00 to 18.00 mL in 0.05 mL
                     steps; a linear calibration log10 M = 12 - 0.5 V (mL) gives M from 10^6 down
                     to 10^3 g/mol; signal a Gaussian in V (centre 15.2 mL, sigma 0.55 mL, height 1).
                     The script checks the sums against the continuous log-normal's closed forms
                     (see self_check) to 1e-4 relative.
  two-equal-masses   two point classes (low = high) of 10 000 and 30 000 g/mol, equal mass
                     fractions 0.5 and 0.5. By hand: Mn = 2/(1/10^4 + 1/(3 10^4)) = 15 000,
                     Mw = 20 000, Mz = (10^8 + 9 10^8)/(4 10^4) = 25 000, D = 4/3; the script
                     checks numpy's values against these to 1e-15 relative.

Usage
-----
    /usr/bin/python3 testdata/averages_numpy.py            # (re)write testdata/averages_numpy.json
    /usr/bin/python3 testdata/averages_numpy.py --stdout   # print the JSON instead
    /usr/bin/python3 testdata/averages_numpy.py --check    # recompute; compare every number with
                                                           # the committed JSON to 1e-12 relative;
                                                           # exit 1 on the first mismatch
"""

import argparse
import json
import os
import platform
import sys

import numpy as np

CHECK_TOL = 1e-12  # relative tolerance of --check against the committed JSON
JSON_PATH = os.path.join(os.path.dirname(os.path.abspath(__file__)), "averages_numpy.json")
COMMAND = "/usr/bin/python3 testdata/averages_numpy.py"
SOURCE = "made-up test shape (not a measurement)"


def averages(M, w):
    """Mn, Mw, Mz and dispersity from molar masses M and mass fractions (or signals) w."""
    M = np.asarray(M, dtype=np.float64)
    w = np.asarray(w, dtype=np.float64)
    if M.shape != w.shape or M.size == 0 or np.any(M <= 0) or np.any(w < 0) or not np.sum(w) > 0:
        raise ValueError("bad distribution")
    mn = np.sum(w) / np.sum(w / M)
    mw = np.sum(w * M) / np.sum(w)
    mz = np.sum(w * M * M) / np.sum(w * M)
    return {"Mn": float(mn), "Mw": float(mw), "Mz": float(mz), "dispersity": float(mw / mn)}


def bin_averages(low, high, fraction, kind):
    """Averages of a binned table; kind is "weight" or "number" (what `fraction` holds)."""
    low = np.asarray(low, dtype=np.float64)
    high = np.asarray(high, dtype=np.float64)
    frac = np.asarray(fraction, dtype=np.float64)
    M = (low + high) / 2.0
    if kind == "weight":
        w = frac
    elif kind == "number":
        w = frac * M
    else:
        raise ValueError(kind)
    return averages(M, w)


def lognormal_classes():
    """Log-spaced class edges 1e3..1e6 g/mol (30 classes) and log-normal-shaped weight fractions."""
    edges = np.logspace(3.0, 6.0, 31)
    low, high = edges[:-1], edges[1:]
    centre = np.sqrt(low * high)  # geometric centre: where the shape is evaluated (not the M used)
    shape = np.exp(-((np.log(centre) - np.log(5.0e4)) ** 2) / (2.0 * 0.8 ** 2))
    return low, high, shape / np.sum(shape)


def make_fixture():
    low, high, w = lognormal_classes()
    mid = (low + high) / 2.0
    n = w / mid
    n = n / np.sum(n)

    volume = 12.0 + 0.05 * np.arange(121)  # mL
    mass = 10.0 ** (12.0 - 0.5 * volume)  # g/mol, linear log10 M vs V calibration
    signal = np.exp(-((volume - 15.2) ** 2) / (2.0 * 0.55 ** 2))

    bins = [
        {"name": "lognormal-weight", "source": SOURCE, "kind": "weight",
         "low": low.tolist(), "high": high.tolist(), "fraction": w.tolist()},
        {"name": "lognormal-number", "source": SOURCE + "; the classes of lognormal-weight as number fractions",
         "kind": "number", "low": low.tolist(), "high": high.tolist(), "fraction": n.tolist()},
        {"name": "two-equal-masses", "source": "hand case: equal masses of 10 000 and 30 000 g/mol chains",
         "kind": "weight", "low": [1.0e4, 3.0e4], "high": [1.0e4, 3.0e4], "fraction": [0.5, 0.5]},
    ]
    for b in bins:
        b["expected"] = bin_averages(b["low"], b["high"], b["fraction"], b["kind"])
    slices = [
        {"name": "sec-gaussian", "source": SOURCE + "; log10 M = 12 - 0.5 V, Gaussian signal in V",
         "volume": volume.tolist(), "mass": mass.tolist(), "signal": signal.tolist()},
    ]
    for s in slices:
        s["expected"] = averages(s["mass"], s["signal"])
    return {
        "comment": "Molar-mass averages (Mn = sum w / sum w/M, Mw = sum wM / sum w, Mz = sum wM^2 / sum wM,"
                   " dispersity = Mw/Mn) computed by numpy; bins at the midpoint (low + high)/2, number"
                   " fractions converted with w = N M. Inputs are made-up test shapes. See testdata/README.md.",
        "made_by": COMMAND,
        "python": platform.python_version(),
        "numpy": np.__version__,
        "tolerance": CHECK_TOL,
        "bins": bins,
        "slices": slices,
    }


def rel(a, b):
    return abs(a - b) / max(abs(a), abs(b)) if a != b else 0.0


def self_check(fx):
    """Fail loudly unless the hand case and the number/weight round trip come out as stated."""
    by = {b["name"]: b["expected"] for b in fx["bins"]}
    hand = {"Mn": 15000.0, "Mw": 20000.0, "Mz": 25000.0, "dispersity": 4.0 / 3.0}  # by hand, docstring
    worst_hand = max(rel(by["two-equal-masses"][k], v) for k, v in hand.items())
    if worst_hand > 1e-15:
        sys.exit("self-check: two-equal-masses %r, by hand %r" % (by["two-equal-masses"], hand))
    worst_trip = max(rel(by["lognormal-number"][k], by["lognormal-weight"][k]) for k in hand)
    if worst_trip > 1e-13:
        sys.exit("self-check: lognormal-number %r differs from lognormal-weight %r"
                 % (by["lognormal-number"], by["lognormal-weight"]))
    # sec-gaussian against the continuous log-normal: with V linear in ln M, a Gaussian signal in V
    # is a mass distribution Gaussian in ln M with mean mu = ln(10) (12 - 0.5 Vc) and standard
    # deviation s = 0.5 ln(10) sigma_V, and the Gaussian moment-generating function,
    # E_w[M^k] = exp(k mu + k^2 s^2 / 2), gives Mn = exp(mu - s^2/2), Mw = exp(mu + s^2/2),
    # Mz = exp(mu + 3 s^2/2). The slices sample the Gaussian at 1/11 of sigma_V (the sum is then
    # the integral to far below 1e-12) and cut it 4.5 to 5.8 sigma_V from its centre, so the
    # sums lie within about 1e-5 of these closed forms.
    mu = np.log(10.0) * (12.0 - 0.5 * 15.2)
    s2 = (0.5 * np.log(10.0) * 0.55) ** 2
    closed = {"Mn": np.exp(mu - s2 / 2), "Mw": np.exp(mu + s2 / 2), "Mz": np.exp(mu + 1.5 * s2)}
    sec = fx["slices"][0]["expected"]
    worst_closed = max(rel(sec[k], float(v)) for k, v in closed.items())
    if worst_closed > 1e-4:
        sys.exit("self-check: sec-gaussian %r, continuous log-normal %r" % (sec, closed))
    return worst_hand, worst_trip, worst_closed


def compare(path, where, old, new):
    """Compare two decoded JSON values; numbers to CHECK_TOL relative. Return a message or None."""
    if isinstance(new, dict):
        if not isinstance(old, dict) or sorted(old) != sorted(new):
            return "%s: %s: keys %r, recomputed %r" % (path, where, sorted(old) if isinstance(old, dict) else old, sorted(new))
        for k in new:
            if where == "" and k in ("python", "numpy"):
                continue  # versions may differ; the numbers must not
            msg = compare(path, (where + "." if where else "") + k, old[k], new[k])
            if msg:
                return msg
        return None
    if isinstance(new, list):
        if not isinstance(old, list) or len(old) != len(new):
            return "%s: %s: length %s, recomputed %d" % (path, where, len(old) if isinstance(old, list) else "?", len(new))
        for i, (o, n) in enumerate(zip(old, new)):
            msg = compare(path, "%s[%d]" % (where, i), o, n)
            if msg:
                return msg
        return None
    if isinstance(new, float):
        if not isinstance(old, (int, float)) or isinstance(old, bool) or not rel(float(old), new) <= CHECK_TOL:
            return "%s: %s = %r, recomputed %r (relative difference > %g)" % (path, where, old, new, CHECK_TOL)
        return None
    if old != new:
        return "%s: %s = %r, recomputed %r" % (path, where, old, new)
    return None


def check(fx, path):
    with open(path, encoding="utf-8") as fh:
        committed = json.load(fh)
    msg = compare(path, "", committed, fx)
    if msg:
        print(msg)
        return 1
    if (committed.get("python"), committed.get("numpy")) != (fx["python"], fx["numpy"]):
        print("%s: note: made with python %s, numpy %s; rechecked with python %s, numpy %s"
              % (path, committed.get("python"), committed.get("numpy"), fx["python"], fx["numpy"]))
    print("%s: %d binned and %d sliced distributions agree with numpy %s to %g relative"
          % (path, len(fx["bins"]), len(fx["slices"]), np.__version__, CHECK_TOL))
    return 0


def dump(fx):
    return json.dumps(fx, indent=1) + "\n"


def main():
    p = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    g = p.add_mutually_exclusive_group()
    g.add_argument("--check", action="store_true", help="compare with the committed JSON instead of writing it")
    g.add_argument("--stdout", action="store_true", help="print the JSON instead of writing it")
    p.add_argument("--file", default=JSON_PATH, help="the JSON to write or check (default %(default)s)")
    args = p.parse_args()

    fx = make_fixture()
    hand, trip, closed = self_check(fx)
    print("self-check: hand case within %.1e relative; number/weight round trip within %.1e relative;"
          " sec-gaussian within %.1e of the continuous log-normal" % (hand, trip, closed), file=sys.stderr)
    if args.check:
        sys.exit(check(fx, args.file))
    if args.stdout:
        sys.stdout.write(dump(fx))
        return
    with open(args.file, "w", encoding="utf-8", newline="\n") as fh:
        fh.write(dump(fx))
    print("wrote %s" % args.file, file=sys.stderr)


if __name__ == "__main__":
    main()
