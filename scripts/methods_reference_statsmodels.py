"""Reference values for tests/methods_reference.rs from statsmodels 0.15.0.

Run: pip install statsmodels==0.15.0; python3 scripts/methods_reference_statsmodels.py
Prints Rust-ready arrays; the test file embeds them and names this script as their source.

What is computed (statsmodels used only as a numerical reference):
- seasonal_decompose (classical, two-sided centred moving average) seasonal indices for the NIST
  quarterly sales (m = 4, multiplicative and additive) and AirPassengers (m = 12, multiplicative).
  statsmodels tiles its indices from the FIRST observation; the project aligns them with the LAST
  m observations, so they are rotated here: aligned[j] = seasonal[n - m + j].
- ThetaModel(period=m, deseasonalize=True, use_test=False, method="mul").fit() forecasts: its SES
  uses the KNOWN initial level y_adj[0] and its own optimised alpha; both are printed so the
  project can be run with the same two numbers.
- The full pipeline with the initial level ESTIMATED: seasonal_decompose -> ExponentialSmoothing
  (initialization_method="estimated") -> OLS slope -> Hyndman-Billah forecast. Optimisers differ,
  so the test compares loosely and checks that the project's SSE is not worse.
- Linear trend with seasonal indices: OLS on the deseasonalised series (statsmodels OLS), point
  forecasts times the index and the prediction variance (obs) times the index squared.
"""
import csv
import os

import numpy as np
import statsmodels
from statsmodels.regression.linear_model import OLS
from statsmodels.tsa.forecasting.theta import ThetaModel
from statsmodels.tsa.holtwinters import ExponentialSmoothing
from statsmodels.tsa.seasonal import seasonal_decompose

HERE = os.path.dirname(os.path.abspath(__file__))
REFS = os.path.join(HERE, "..", "tests", "fixtures", "refs")


def read(name, column):
    with open(os.path.join(REFS, name)) as f:
        return np.array([float(r[column]) for r in csv.DictReader(f)])


def rust(name, values):
    body = ", ".join(repr(float(v)) for v in values)
    print(f"const {name}: [f64; {len(values)}] = [{body}];")


def aligned_indices(y, m, model):
    seasonal = seasonal_decompose(y, model=model, period=m).seasonal
    n = len(y)
    return seasonal[n - m:], seasonal


def theta_library(y, m, horizon):
    res = ThetaModel(y, period=m, deseasonalize=True, use_test=False, method="mul").fit()
    _, seasonal = aligned_indices(y, m, "multiplicative")
    adjusted = y / seasonal
    return res.params["alpha"], adjusted[0], np.asarray(res.forecast(horizon))


def theta_estimated(y, m, horizon):
    idx, seasonal = aligned_indices(y, m, "multiplicative")
    x = y / seasonal
    n = len(x)
    ses = ExponentialSmoothing(x, initialization_method="estimated").fit()
    alpha = ses.params["smoothing_level"]
    l0 = ses.params["initial_level"]
    t = np.arange(n, dtype=float)
    slope = np.polyfit(t, x, 1)[0]
    level = ses.level[-1]
    h = np.arange(1, horizon + 1, dtype=float)
    adj = level + 0.5 * slope * (h - 1 + 1 / alpha - (1 - alpha) ** n / alpha)
    season = np.array([idx[(k - 1) % m] for k in range(1, horizon + 1)])
    return alpha, l0, ses.sse, adj * season


def trend_seasonal(y, m, horizon):
    idx, seasonal = aligned_indices(y, m, "multiplicative")
    x = y / seasonal
    n = len(x)
    design = np.column_stack([np.ones(n), np.arange(n, dtype=float)])
    fit = OLS(x, design).fit()
    future = np.column_stack([np.ones(horizon), np.arange(n, n + horizon, dtype=float)])
    pred = fit.get_prediction(future)
    season = np.array([idx[(k - 1) % m] for k in range(1, horizon + 1)])
    var_obs = pred.se_obs ** 2
    return fit.params, pred.predicted_mean * season, var_obs * season ** 2


def main():
    print(f"// statsmodels {statsmodels.__version__}, numpy {np.__version__}")
    sales = read("nist_quarterly_sales_24.csv", "sales")
    air = read("AirPassengers.csv", "value")
    jj = read("JohnsonJohnson.csv", "value")

    rust("SM_SALES_MUL_INDICES", aligned_indices(sales, 4, "multiplicative")[0])
    rust("SM_SALES_ADD_INDICES", aligned_indices(sales, 4, "additive")[0])
    rust("SM_AIR_MUL_INDICES", aligned_indices(air, 12, "multiplicative")[0])

    for label, y, m in (("AIR", air, 12), ("JJ", jj, 4)):
        alpha, l0, fc = theta_library(y, m, 2 * m)
        print(f"const SM_{label}_THETA_ALPHA: f64 = {float(alpha)!r};")
        print(f"const SM_{label}_THETA_L0: f64 = {float(l0)!r};")
        rust(f"SM_{label}_THETA_FORECAST", fc)
        alpha, l0, sse, fc = theta_estimated(y, m, 2 * m)
        print(f"const SM_{label}_SES_EST_ALPHA: f64 = {float(alpha)!r};")
        print(f"const SM_{label}_SES_EST_L0: f64 = {float(l0)!r};")
        print(f"const SM_{label}_SES_EST_SSE: f64 = {float(sse)!r};")
        rust(f"SM_{label}_THETA_EST_FORECAST", fc)

    for label, y, m in (("SALES", sales, 4), ("AIR", air, 12)):
        params, fc, var = trend_seasonal(y, m, 2 * m)
        rust(f"SM_{label}_LINE", params)
        rust(f"SM_{label}_TREND_SEASONAL_FORECAST", fc)
        rust(f"SM_{label}_TREND_SEASONAL_VARIANCE", var)


if __name__ == "__main__":
    main()
