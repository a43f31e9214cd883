"""Classical decomposition of the NIST quarterly sales, by hand, with the standard library only.

Run: python3 scripts/decompose_reference.py
Own script, independent re-implementation of the textbook steps (it shares no code with the
engine): 2x4 centred moving average, ratio (or difference) to it, mean per quarter, normalised to
mean 1 (or sum 0). Data: NIST/SEMATECH e-Handbook 6.4.3.6 (tests/fixtures/refs/
nist_quarterly_sales_24.csv). Prints the indices aligned with the LAST four quarters (the
engine's convention), the centred moving average, and the linear trend with seasonal indices
(least-squares line on the deseasonalised series) forecasts for two years.
"""
import csv
import os

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.join(HERE, "..", "tests", "fixtures", "refs", "nist_quarterly_sales_24.csv")
M = 4


def centred_ma(y, m):
    """2xm centred moving average for even m: T_t = (y[t-2]/2 + y[t-1] + y[t] + y[t+1] + y[t+2]/2)/4."""
    half = m // 2
    out = [None] * len(y)
    for t in range(half, len(y) - half):
        total = 0.5 * y[t - half] + sum(y[t - half + 1:t + half]) + 0.5 * y[t + half]
        out[t] = total / m
    return out


def indices(y, m, multiplicative):
    trend = centred_ma(y, m)
    by_position = [[] for _ in range(m)]
    for t, (v, level) in enumerate(zip(y, trend)):
        if level is not None:
            by_position[t % m].append(v / level if multiplicative else v - level)
    raw = [sum(v) / len(v) for v in by_position]
    mean = sum(raw) / m
    norm = [r / mean if multiplicative else r - mean for r in raw]
    n = len(y)
    return [norm[(n - m + j) % m] for j in range(m)], norm


def main():
    with open(DATA) as f:
        y = [float(r["sales"]) for r in csv.DictReader(f)]
    n = len(y)
    mul, mul_from_first = indices(y, M, True)
    add, _ = indices(y, M, False)
    print("const OWN_SALES_CMA:", [v for v in centred_ma(y, M)])
    print("const OWN_SALES_MUL_INDICES:", mul)
    print("const OWN_SALES_ADD_INDICES:", add)
    # Linear trend with seasonal indices on the deseasonalised series, t = 0..n-1.
    x = [v / mul_from_first[t % M] for t, v in enumerate(y)]
    tbar = (n - 1) / 2
    xbar = sum(x) / n
    sxx = sum((t - tbar) ** 2 for t in range(n))
    slope = sum((t - tbar) * (v - xbar) for t, v in enumerate(x)) / sxx
    intercept = xbar - slope * tbar
    forecast = [(intercept + slope * (n + h - 1)) * mul[(h - 1) % M] for h in range(1, 2 * M + 1)]
    print("const OWN_SALES_LINE:", [intercept, slope])
    print("const OWN_SALES_TREND_SEASONAL_FORECAST:", forecast)


if __name__ == "__main__":
    main()
