#!/usr/bin/env python3
"""Reference values for the pattern tests (tests/patterns_reference.rs).

Writes tests/fixtures/refs/patterns_reference.json with
- statsmodels' sample autocorrelation (statsmodels.tsa.stattools.acf, adjusted=False, fft=False)
  of AirPassengers and USAccDeaths (column `value`),
- the M4 benchmark seasonality test at lag 12 computed from those autocorrelations:
  |r_m| > 1.645 sqrt((1 + 2 sum_{k<m} r_k^2) / n),
- the Mann-Kendall statistics of AirPassengers, USAccDeaths and productC (column `demand`):
  S, var(S) with the tie correction, Z with continuity correction, two-sided p from
  scipy.stats.norm. S and the tie term are cross-checked against scipy.stats.kendalltau
  (tau-b against time, whose numerator is S).

Run from the repository root:  python3 scripts/patterns_reference.py
Needs statsmodels 0.15.0 (PyPI), which brings numpy, scipy and pandas.
"""

import csv
import json
import math
import os
import platform

import numpy as np
import scipy
import statsmodels
from scipy.stats import kendalltau, norm
from statsmodels.tsa.stattools import acf

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
REFS = os.path.join(ROOT, "tests", "fixtures", "refs")


def column(file_name, name):
    with open(os.path.join(REFS, file_name), newline="") as handle:
        return np.array([float(row[name]) for row in csv.DictReader(handle)])


def season_test(r, n, m):
    """r[0] is lag 0 (= 1) as statsmodels returns it."""
    threshold = 1.645 * math.sqrt((1.0 + 2.0 * float(np.sum(r[1:m] ** 2))) / n)
    statistic = abs(float(r[m]))
    return {
        "lag": m,
        "statistic": statistic,
        "threshold": threshold,
        "passed": statistic > threshold,
    }


def mann_kendall(y):
    n = len(y)
    s = 0
    for i in range(n - 1):
        s += int(np.sum(np.sign(y[i + 1 :] - y[i])))
    _, counts = np.unique(y, return_counts=True)
    ties = int(np.sum(counts * (counts - 1) * (2 * counts + 5)))
    variance = (n * (n - 1) * (2 * n + 5) - ties) / 18.0
    if s > 0:
        z = (s - 1) / math.sqrt(variance)
    elif s < 0:
        z = (s + 1) / math.sqrt(variance)
    else:
        z = 0.0
    p = 2.0 * norm.sf(abs(z))

    # Cross-check: Kendall's tau-b of (time, y) has numerator S and denominator
    # sqrt(n0 * (n0 - n2)), n0 = n(n-1)/2, n2 = sum t(t-1)/2 over tie groups of y.
    tau, _ = kendalltau(np.arange(n), y)
    n0 = n * (n - 1) / 2
    n2 = float(np.sum(counts * (counts - 1) / 2))
    assert abs(tau * math.sqrt(n0 * (n0 - n2)) - s) < 1e-6, (tau, s)

    return {
        "n": n,
        "s": s,
        "variance": variance,
        "tie_term": ties,
        "z": z,
        "p_value": p,
    }


def main():
    result = {
        "generator": "scripts/patterns_reference.py",
        "versions": {
            "python": platform.python_version(),
            "statsmodels": statsmodels.__version__,
            "scipy": scipy.__version__,
            "numpy": np.__version__,
        },
        "acf_call": "statsmodels.tsa.stattools.acf(x, nlags=L, adjusted=False, fft=False)",
        "acf_note": "acf[0] is lag 0 (always 1); acf[k] is r_k",
        "mann_kendall_p": "2 * scipy.stats.norm.sf(|Z|)",
        "series": {},
    }
    for file_name, nlags in [("AirPassengers.csv", 48), ("USAccDeaths.csv", 36)]:
        y = column(file_name, "value")
        r = acf(y, nlags=nlags, adjusted=False, fft=False)
        result["series"][file_name] = {
            "column": "value",
            "n": len(y),
            "acf": [float(v) for v in r],
            "season_test_12": season_test(r, len(y), 12),
            "mann_kendall": mann_kendall(y),
        }
    demand = column("productC.csv", "demand")
    result["series"]["productC.csv"] = {
        "column": "demand",
        "n": len(demand),
        "mann_kendall": mann_kendall(demand),
    }
    out = os.path.join(REFS, "patterns_reference.json")
    with open(out, "w") as handle:
        json.dump(result, handle, indent=1)
        handle.write("\n")
    print("wrote", out)


if __name__ == "__main__":
    main()
