"""Classical decomposition of the NIST quarterly sales, by hand, with the standard library only.

Run: python3 scripts/decompose_reference.py
Own script, independent re-implementation of the textbook steps (it shares no code with the
engine): 2x4 centred moving average, ratio (or difference) to it, mean per quarter, normalised to
mean 1 (or sum 0). Data: NIST/SEMATECH e-Handbook 6.4.3.6 (tests/fixtures/refs/
nist_quarterly_sales_24.csv). Prints the indices aligned with the LAST four quarters (the
engine's convention), the centred moving average, and the linear trend with seasonal indices
(least-squares line on the deseasonalised series) forecasts for two years; then the indices
shrunk by the James-Stein factor (Miller & Williams 2003) for AirPassengers, USAccDeaths (R
datasets, tests/fixtures/refs) and the NIST sales, multiplicative and additive, and the seasonal
strength of each (Wang, Smith & Hyndman 2006, from the additive classical decomposition).
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


def detrended_by_position(y, m, multiplicative):
    """The ratios (or differences) to the centred moving average, grouped by position t % m."""
    trend = centred_ma(y, m)
    by_position = [[] for _ in range(m)]
    for t, (v, level) in enumerate(zip(y, trend)):
        if level is not None:
            by_position[t % m].append(v / level if multiplicative else v - level)
    return by_position


def indices(y, m, multiplicative):
    by_position = detrended_by_position(y, m, multiplicative)
    raw = [sum(v) / len(v) for v in by_position]
    mean = sum(raw) / m
    norm = [r / mean if multiplicative else r - mean for r in raw]
    n = len(y)
    return [norm[(n - m + j) % m] for j in range(m)], norm


def shrunk(y, m, multiplicative):
    """Classical indices shrunk towards their mean by the positive-part James-Stein factor
    (Miller & Williams 2003, IJF 19): c = max(0, 1 - (m - 3) v / sum (S_i - mean S)^2), v the
    pooled variance of the detrended values about their position's raw index divided by the mean
    count per position. Returned aligned with the LAST m observations, normalised like the rest."""
    by_position = detrended_by_position(y, m, multiplicative)
    raw = [sum(v) / len(v) for v in by_position]
    within = sum((d - raw[i]) ** 2 for i, ds in enumerate(by_position) for d in ds)
    spare = sum(len(ds) - 1 for ds in by_position)
    per_position = sum(len(ds) for ds in by_position) / m
    v = within / spare / per_position
    centre = sum(raw) / m
    spread = sum((r - centre) ** 2 for r in raw)
    c = max(0.0, 1.0 - (m - 3) * v / spread)
    raw = [centre + c * (r - centre) for r in raw]
    mean = sum(raw) / m
    norm = [r / mean if multiplicative else r - mean for r in raw]
    n = len(y)
    return [norm[(n - m + j) % m] for j in range(m)], c


def strength(y, m):
    """Seasonal strength F_S = max(0, 1 - Var(R) / Var(S + R)) (Wang, Smith & Hyndman 2006) from
    an additive classical decomposition: S + R the detrended values y - CMA where the moving
    average exists, S their position means less the mean of those, R the rest; population
    variances."""
    trend = centred_ma(y, m)
    pairs = [(t % m, v - level) for t, (v, level) in enumerate(zip(y, trend)) if level is not None]
    means = [sum(ds) / len(ds) for ds in detrended_by_position(y, m, False)]
    centre = sum(means) / m
    sr = [d for _, d in pairs]
    r = [d - (means[p] - centre) for p, d in pairs]

    def var(a):
        mu = sum(a) / len(a)
        return sum((v - mu) ** 2 for v in a) / len(a)

    return max(0.0, 1.0 - var(r) / var(sr))


def series(name):
    with open(os.path.join(HERE, "..", "tests", "fixtures", "refs", name)) as f:
        return [float(r["value"]) for r in csv.DictReader(f)]


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
    # Shrunk indices (12-month seasons: m - 3 = 9; quarters: 1).
    for label, values, m in [
        ("AIR", series("AirPassengers.csv"), 12),
        ("USACC", series("USAccDeaths.csv"), 12),
        ("SALES", y, M),
    ]:
        for kind, multiplicative in [("MUL", True), ("ADD", False)]:
            shrunk_indices, factor = shrunk(values, m, multiplicative)
            print(f"const OWN_{label}_SHRUNK_{kind}: [f64; {m}] =", shrunk_indices, f"; // factor {factor!r}")
        print(f"const OWN_{label}_STRENGTH: f64 = {strength(values, m)!r};")


if __name__ == "__main__":
    main()
