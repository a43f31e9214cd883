"""Croston, SBA and TSB on the FPP2 "product C" data with FIXED constants, standard library only.

Run: python3 scripts/croston_reference.py
Own script, independent re-implementation (it shares no code with the engine). Data: the open
textbook "Forecasting: Principles and Practice", 2nd ed., section 12.2 (tests/fixtures/refs/
productC.csv), which publishes the demand sizes and intervals and Croston's equations but no
numeric forecast. Conventions (the engine's, stated in src/engine/methods/intermittent.rs):
initial size = first demand, initial interval = its period number (1-based); updates start in the
period after the first demand; a demand period has value > 0. TSB: initial probability
1 / first interval, probability updated every period, size on demand periods.
"""
import csv
import os

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.join(HERE, "..", "tests", "fixtures", "refs", "productC.csv")
ALPHA = 0.1
TSB_ALPHA = 0.1
TSB_BETA = 0.2


def sizes_and_intervals(y):
    sizes, intervals, since = [], [], 0
    for v in y:
        since += 1
        if v > 0:
            sizes.append(v)
            intervals.append(since)
            since = 0
    return sizes, intervals


def croston(y, alpha):
    """Smooths the sizes and intervals lists directly (the textbook form): q_hat, a_hat."""
    sizes, intervals = sizes_and_intervals(y)
    q_hat, a_hat = sizes[0], intervals[0]
    for q, a in zip(sizes[1:], intervals[1:]):
        q_hat = (1 - alpha) * q_hat + alpha * q
        a_hat = (1 - alpha) * a_hat + alpha * a
    return q_hat, a_hat


def croston_fitted(y, alpha):
    """Period by period one-step forecasts, None up to and including the first demand."""
    first = next(i for i, v in enumerate(y) if v > 0)
    z, p, since = y[first], first + 1.0, 0
    out = [None] * len(y)
    for t in range(first + 1, len(y)):
        out[t] = z / p
        since += 1
        if y[t] > 0:
            z = (1 - alpha) * z + alpha * y[t]
            p = (1 - alpha) * p + alpha * since
            since = 0
    return out


def tsb(y, alpha, beta):
    first = next(i for i, v in enumerate(y) if v > 0)
    z, d = y[first], 1.0 / (first + 1)
    for t in range(first + 1, len(y)):
        if y[t] > 0:
            d = (1 - beta) * d + beta
            z = (1 - alpha) * z + alpha * y[t]
        else:
            d = (1 - beta) * d
    return z, d


def main():
    with open(DATA) as f:
        y = [float(r["demand"]) for r in csv.DictReader(f)]
    q_hat, a_hat = croston(y, ALPHA)
    print("sizes, intervals:", sizes_and_intervals(y))
    print(f"const OWN_CROSTON_SIZE: f64 = {q_hat!r};")
    print(f"const OWN_CROSTON_INTERVAL: f64 = {a_hat!r};")
    print(f"const OWN_CROSTON_FORECAST: f64 = {q_hat / a_hat!r};")
    print(f"const OWN_SBA_FORECAST: f64 = {(1 - ALPHA / 2) * q_hat / a_hat!r};")
    fitted = croston_fitted(y, ALPHA)
    sse = sum((f - v) ** 2 for f, v in zip(fitted, y) if f is not None)
    print(f"const OWN_CROSTON_SSE: f64 = {sse!r};")
    z, d = tsb(y, TSB_ALPHA, TSB_BETA)
    print(f"const OWN_TSB_FORECAST: f64 = {z * d!r}; // size {z!r}, probability {d!r}")


if __name__ == "__main__":
    main()
