"""Reference values for tests/methods/theta_models.rs from statsmodels 0.15.0.

Run: pip install statsmodels==0.15.0; python3 scripts/theta_models_reference_statsmodels.py
Writes tests/fixtures/refs/theta_models_reference.json (library versions recorded inside) and
prints the versions.

What is computed (statsmodels used only as a numerical reference): ThetaModel(use_test=False,
method="mul").fit() on three committed series, AirPassengers (period 12) and JohnsonJohnson
(period 4) seasonally adjusted by the library's classical multiplicative decomposition, and
USAccDeaths without adjustment. The library's 2-step fit is an OLS line X_t = a0 + b0 (t - 1) and
SES with its initial level KNOWN, equal to the first adjusted value, and its own alpha. Its
forecast for a given theta is

    X_hat(T + h) = ((theta - 1) / theta) b0 (h - 1 + 1/alpha - (1 - alpha)^T / alpha) + SES(T + h),

times the seasonal index. Recorded per series: alpha, the SES initial level, a0 and b0 (a0 from
the same least-squares solve the library makes, which it does not return), and the forecasts at
theta = 2 (the standard Theta method) and theta = 3.
"""
import csv
import json
import os

import numpy as np
import pandas
import statsmodels
from statsmodels.tsa.forecasting.theta import ThetaModel

HERE = os.path.dirname(os.path.abspath(__file__))
REFS = os.path.join(HERE, "..", "tests", "fixtures", "refs")
OUT = os.path.join(REFS, "theta_models_reference.json")


def read(name):
    with open(os.path.join(REFS, name)) as f:
        return np.array([float(r["value"]) for r in csv.DictReader(f)])


def reference(name, period, deseasonalize, horizon):
    y = read(name)
    model = ThetaModel(
        y, period=period, deseasonalize=deseasonalize, use_test=False, method="mul"
    )
    res = model.fit()
    adjusted, _ = model._deseasonalize_data()
    adjusted = np.asarray(adjusted, dtype=float)
    n = len(adjusted)
    design = np.column_stack([np.ones(n), np.arange(n, dtype=float)])
    a0, b0 = np.linalg.lstsq(design, adjusted, rcond=None)[0]
    assert abs(b0 - res.params["b0"]) <= 1e-12 * max(1.0, abs(b0))
    return {
        "file": name,
        "period": period,
        "deseasonalize": deseasonalize,
        "horizon": horizon,
        "alpha": float(res.params["alpha"]),
        "ses_initial_level": float(adjusted[0]),
        "a0": float(a0),
        "b0": float(b0),
        "forecast_theta_2": [float(v) for v in np.asarray(res.forecast(horizon, theta=2))],
        "forecast_theta_3": [float(v) for v in np.asarray(res.forecast(horizon, theta=3))],
    }


def main():
    versions = {
        "statsmodels": statsmodels.__version__,
        "numpy": np.__version__,
        "pandas": pandas.__version__,
    }
    print("versions:", ", ".join(f"{k} {v}" for k, v in versions.items()))
    out = {
        "source": "scripts/theta_models_reference_statsmodels.py: statsmodels ThetaModel "
        "(use_test=False, method='mul'), 2-step fit, forecasts at theta 2 and 3",
        "versions": versions,
        "series": [
            reference("AirPassengers.csv", 12, True, 24),
            reference("JohnsonJohnson.csv", 4, True, 8),
            reference("USAccDeaths.csv", 12, False, 12),
        ],
    }
    with open(OUT, "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")
    print("wrote", os.path.relpath(OUT, os.path.join(HERE, "..")))


if __name__ == "__main__":
    main()
