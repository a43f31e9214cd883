//! Accuracy: error measures of forecasts against demand, and the period-by-period Error ledger.
//!
//! Kept apart from: fitting and ranking. These functions take paired forecasts and demands and
//! know nothing of methods.
//!
//! Sign convention (supply-chain texts): the error of period t is e_t = F_t - D_t, forecast minus
//! demand, so a positive error is an over-forecast. Bias is the running sum of errors; the
//! tracking signal is bias / MAD.

/// Summary error measures over a run of periods.
///
/// With n periods, e_t = F_t - D_t:
/// MAD = (1/n) sum |e_t|; MSE = (1/n) sum e_t^2; RMSE = sqrt(MSE);
/// MAPE = (100/n) sum |e_t| / |D_t| (not available when any D_t = 0);
/// bias = sum e_t; mean error = bias / n;
/// MASE = MAD / scale with scale = mean |y_t - y_{t-m}| over the training part (Hyndman &
/// Koehler 2006), not available when the scale is zero;
/// sMAPE = (100/n) sum 200 |e_t| / (|D_t| + |F_t|) / 100, the M3 definition (terms with
/// D_t = F_t = 0 count as zero error).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Measures {
    /// Periods scored.
    pub count: usize,
    /// Mean absolute error.
    pub mad: f64,
    /// Mean squared error.
    pub mse: f64,
    /// Root mean squared error.
    pub rmse: f64,
    /// Mean absolute percent error; `None` when a demand is zero.
    pub mape: Option<f64>,
    /// Sum of errors (positive: over-forecast).
    pub bias: f64,
    /// Mean error, bias / count.
    pub mean_error: f64,
    /// Mean absolute scaled error; `None` when the in-sample scale is zero or unknown.
    pub mase: Option<f64>,
    /// Symmetric MAPE, the M3 definition.
    pub smape: f64,
}

/// Why measures could not be computed.
#[derive(Clone, Debug, PartialEq)]
pub enum AccuracyError {
    /// No periods to score: make the holdout at least one period long.
    NoPeriods,
    /// Forecasts and demands differ in length (a programming error upstream).
    LengthMismatch {
        /// Forecasts given.
        forecasts: usize,
        /// Demands given.
        demands: usize,
    },
}

impl std::fmt::Display for AccuracyError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            AccuracyError::NoPeriods => write!(
                f,
                "no periods to score: use a holdout of at least one period"
            ),
            AccuracyError::LengthMismatch { forecasts, demands } => {
                write!(
                    f,
                    "{forecasts} forecasts cannot be scored against {demands} demands"
                )
            }
        }
    }
}

impl std::error::Error for AccuracyError {}

/// MASE scale: mean |y_t - y_{t-m}| over `training` (m = 1 when there is no season, and when the
/// training part is shorter than m + 1). `None` when the scale is zero or undefined.
pub fn mase_scale(training: &[f64], season_length: Option<usize>) -> Option<f64> {
    let mut m = season_length.filter(|m| *m >= 1).unwrap_or(1);
    if training.len() <= m {
        m = 1;
    }
    if training.len() <= m {
        return None;
    }
    let diffs: f64 = training.windows(m + 1).map(|w| (w[m] - w[0]).abs()).sum();
    let scale = diffs / (training.len() - m) as f64;
    (scale > 0.0 && scale.is_finite()).then_some(scale)
}

/// Measures of `forecasts` against `demands`; `scale` from [`mase_scale`].
pub fn measures(
    forecasts: &[f64],
    demands: &[f64],
    scale: Option<f64>,
) -> Result<Measures, AccuracyError> {
    if forecasts.len() != demands.len() {
        return Err(AccuracyError::LengthMismatch {
            forecasts: forecasts.len(),
            demands: demands.len(),
        });
    }
    if forecasts.is_empty() {
        return Err(AccuracyError::NoPeriods);
    }
    let n = forecasts.len() as f64;
    let mut abs_sum = 0.0;
    let mut sq_sum = 0.0;
    let mut bias = 0.0;
    let mut pct_sum = 0.0;
    let mut mape_defined = true;
    let mut smape_sum = 0.0;
    for (f, d) in forecasts.iter().zip(demands) {
        let e = f - d;
        abs_sum += e.abs();
        sq_sum += e * e;
        bias += e;
        if *d == 0.0 {
            mape_defined = false;
        } else {
            pct_sum += 100.0 * e.abs() / d.abs();
        }
        let denom = d.abs() + f.abs();
        if denom > 0.0 {
            smape_sum += 200.0 * e.abs() / denom;
        }
    }
    let mad = abs_sum / n;
    let mse = sq_sum / n;
    Ok(Measures {
        count: forecasts.len(),
        mad,
        mse,
        rmse: mse.sqrt(),
        mape: mape_defined.then_some(pct_sum / n),
        bias,
        mean_error: bias / n,
        mase: scale.map(|s| mad / s),
        smape: smape_sum / n,
    })
}

/// The default limit for |tracking signal| (common practice: 4 MADs).
pub const DEFAULT_TRACKING_LIMIT: f64 = 4.0;

/// One period of the Error ledger: the period's own errors and the running measures up to it.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct LedgerRow {
    /// Demand D_t of the period.
    pub demand: f64,
    /// Forecast F_t of the period.
    pub forecast: f64,
    /// e_t = F_t - D_t.
    pub error: f64,
    /// |e_t|.
    pub abs_error: f64,
    /// e_t squared.
    pub sq_error: f64,
    /// 100 |e_t| / |D_t|; not available when D_t = 0.
    pub pct_error: Option<f64>,
    /// Running mean absolute error.
    pub mad: f64,
    /// Running mean squared error.
    pub mse: f64,
    /// Running root mean squared error.
    pub rmse: f64,
    /// Running MAPE; not available from the first period with zero demand on.
    pub mape: Option<f64>,
    /// Running sum of errors.
    pub bias: f64,
    /// bias / MAD; not available while MAD is zero.
    pub tracking_signal: Option<f64>,
    /// |tracking signal| above the limit.
    pub out_of_limits: bool,
}

/// The Error ledger: running measures period by period. `limit` is the |tracking signal| limit.
pub fn ledger(forecasts: &[f64], demands: &[f64], limit: f64) -> Vec<LedgerRow> {
    let mut rows = Vec::with_capacity(forecasts.len());
    let (mut abs_sum, mut sq_sum, mut bias, mut pct_sum) = (0.0, 0.0, 0.0, 0.0);
    let mut mape_defined = true;
    for (i, (f, d)) in forecasts.iter().zip(demands).enumerate() {
        let n = (i + 1) as f64;
        let error = f - d;
        abs_sum += error.abs();
        sq_sum += error * error;
        bias += error;
        let pct_error = (*d != 0.0).then(|| 100.0 * error.abs() / d.abs());
        match pct_error {
            Some(p) => pct_sum += p,
            None => mape_defined = false,
        }
        let mad = abs_sum / n;
        let mse = sq_sum / n;
        let tracking_signal = (mad > 0.0).then(|| bias / mad);
        rows.push(LedgerRow {
            demand: *d,
            forecast: *f,
            error,
            abs_error: error.abs(),
            sq_error: error * error,
            pct_error,
            mad,
            mse,
            rmse: mse.sqrt(),
            mape: mape_defined.then_some(pct_sum / n),
            bias,
            tracking_signal,
            out_of_limits: tracking_signal.is_some_and(|t| t.abs() > limit),
        });
    }
    rows
}

#[cfg(test)]
mod tests {
    use super::*;

    fn close(a: f64, b: f64, tol: f64) {
        assert!((a - b).abs() <= tol, "{a} vs {b} (tol {tol})");
    }

    // Worked example of a course page on exponential smoothing (wongsteve.com,
    // Exponential_Smoothing.htm; tests/fixtures/refs/ses_error_measures_example.csv): alpha 0.3,
    // F_2 = y_1, nine errors. Published with e = D - F: BIAS (mean error) -12.43, MAD 14.14,
    // MAPE 24.66 %, MSE 365.80. Our e = F - D flips the sign of the bias only.
    #[test]
    fn course_page_worked_example() {
        let data = [99.0, 88.0, 50.0, 58.0, 62.0, 60.0, 55.0, 62.0, 71.0, 65.0];
        let mut forecasts = vec![data[0]];
        for t in 1..data.len() - 1 {
            let prev = forecasts[t - 1];
            forecasts.push(0.3 * data[t] + 0.7 * prev);
        }
        let m = measures(&forecasts, &data[1..], None).unwrap();
        close(m.mean_error, 12.43, 0.005);
        close(m.mad, 14.14, 0.005);
        close(m.mape.unwrap(), 24.66, 0.005);
        close(m.mse, 365.80, 0.005);
        close(m.rmse, 19.1, 0.05);
    }

    // Tracking-signal teaching examples (studylib.net doc 25525097; qammunity.org 5140786;
    // tests/fixtures/refs/tracking_signal_examples.csv), published with e = A - F, so our bias
    // and tracking signal are their negatives. A weak source: a sign-convention sanity check.
    #[test]
    fn tracking_signal_examples() {
        let actual = [344.0, 468.0, 493.0, 293.0, 268.0, 568.0];
        let forecast = [244.0, 318.0, 393.0, 343.0, 368.0, 443.0];
        let published_rsfe = [100.0, 250.0, 350.0, 300.0, 200.0, 325.0];
        let published_mad = [100.0, 125.0, 116.67, 100.0, 100.0, 104.17];
        let published_ts = [1.0, 2.0, 3.0, 3.0, 2.0, 3.12];
        let rows = ledger(&forecast, &actual, 3.05);
        for (i, row) in rows.iter().enumerate() {
            close(row.bias, -published_rsfe[i], 1e-9);
            close(row.mad, published_mad[i], 0.005);
            close(row.tracking_signal.unwrap(), -published_ts[i], 0.005);
        }
        assert_eq!(rows.iter().filter(|r| r.out_of_limits).count(), 1);
        let first = ledger(&[10.0, 10.0, 10.0], &[8.0, 11.0, 12.0], 4.0);
        let ts: Vec<f64> = first.iter().map(|r| r.tracking_signal.unwrap()).collect();
        close(ts[0], 1.0, 1e-12);
        close(ts[1], 2.0 / 3.0, 1e-12);
        close(ts[2], -0.6, 1e-12);
    }

    #[test]
    fn zero_demand_makes_mape_unavailable_not_infinite() {
        let m = measures(&[1.0, 2.0], &[0.0, 2.0], None).unwrap();
        assert_eq!(m.mape, None);
        let rows = ledger(&[1.0, 2.0], &[0.0, 2.0], 4.0);
        assert_eq!(rows[0].pct_error, None);
        assert_eq!(rows[1].pct_error, Some(0.0));
        assert_eq!(rows[1].mape, None);
    }

    #[test]
    fn mase_scale_uses_seasonal_differences() {
        let y = [1.0, 2.0, 3.0, 5.0, 7.0, 9.0];
        close(mase_scale(&y, Some(3)).unwrap(), 5.0, 1e-12);
        close(mase_scale(&y, None).unwrap(), 1.6, 1e-12);
        assert_eq!(mase_scale(&[2.0, 2.0, 2.0], None), None);
        assert!(matches!(
            measures(&[], &[], None),
            Err(AccuracyError::NoPeriods)
        ));
    }

    // sMAPE as defined for the M3 competition (Makridakis & Hibon 2000): 200|y-f|/(y+f).
    #[test]
    fn smape_matches_m3_definition() {
        let m = measures(&[110.0], &[100.0], None).unwrap();
        close(m.smape, 200.0 * 10.0 / 210.0, 1e-12);
    }
}
