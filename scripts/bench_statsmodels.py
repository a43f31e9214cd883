"""Times statsmodels fitting Morrowcast's exponential-smoothing and Theta candidates on the
same 1,000 synthetic 60-point monthly series as `cargo bench --bench speed` (which writes them to
target/speed_series.csv). Reference timing only; nothing here is a check value.

Setup: pip install statsmodels==0.15.0   (PyPI)
Run:   python3 scripts/bench_statsmodels.py [target/speed_series.csv] [count]

Prints the mean time of one fit per method, to set beside the per-method fit times that
`cargo bench --bench speed` prints for Morrowcast (README, Speed). Each series gets one fit per
candidate on all 60 points (SES, Holt, damped, Holt-Winters additive and multiplicative, both
damped, Theta).
"""
import csv
import sys
import time
import warnings
from collections import defaultdict

import numpy as np
import statsmodels
from statsmodels.tsa.forecasting.theta import ThetaModel
from statsmodels.tsa.holtwinters import ExponentialSmoothing

warnings.filterwarnings("ignore")
path = sys.argv[1] if len(sys.argv) > 1 else "target/speed_series.csv"
count = int(sys.argv[2]) if len(sys.argv) > 2 else 1000
series = defaultdict(list)
with open(path) as fh:
    for row in csv.DictReader(fh):
        series[int(row["series"])].append(float(row["value"]))
keys = sorted(series)[:count]

specs = [
    dict(trend=None, seasonal=None),
    dict(trend="add", seasonal=None),
    dict(trend="add", damped_trend=True, seasonal=None),
    dict(trend="add", seasonal="add", seasonal_periods=12),
    dict(trend="add", seasonal="mul", seasonal_periods=12),
    dict(trend="add", damped_trend=True, seasonal="add", seasonal_periods=12),
    dict(trend="add", damped_trend=True, seasonal="mul", seasonal_periods=12),
]
names = [
    "Simple exponential smoothing",
    "Holt's linear trend",
    "Damped trend",
    "Holt-Winters additive",
    "Holt-Winters multiplicative",
    "Holt-Winters additive, damped",
    "Holt-Winters multiplicative, damped",
]
per_method = defaultdict(float)
fits = defaultdict(int)
start = time.perf_counter()
for k in keys:
    y = np.asarray(series[k])
    positive = bool((y > 0).all())
    for name, spec in zip(names, specs):
        if spec.get("seasonal") == "mul" and not positive:
            continue
        t = time.perf_counter()
        ExponentialSmoothing(y, initialization_method="estimated", **spec).fit().forecast(12)
        per_method[name] += time.perf_counter() - t
        fits[name] += 1
    t = time.perf_counter()
    ThetaModel(y, period=12).fit().forecast(12)
    per_method["Theta"] += time.perf_counter() - t
    fits["Theta"] += 1
elapsed = time.perf_counter() - start
print(f"statsmodels {statsmodels.__version__}: {len(keys)} series, 8 candidate fits each: "
      f"{elapsed:.2f} s ({1000 * elapsed / len(keys):.2f} ms per series)")
print("one fit on 60 monthly points (mean):")
for name in names + ["Theta"]:
    print(f"  {name:<44} {1e6 * per_method[name] / max(fits[name], 1):10.0f} us")
