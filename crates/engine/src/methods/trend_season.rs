//! Linear trend with seasonal indices: a least-squares line through the deseasonalised history,
//! multiplied (or shifted) by classical seasonal indices (shrunk or not, as the caller asks:
//! [`super::decompose::Indices`]).
//!
//! Kept apart from: the decomposition itself ([`super::decompose`]), which supplies the indices,
//! and the smoothing methods; this is the textbook regression-on-time benchmark.
//!
//! Method:
//! 1. Indices: classical multiplicative decomposition when every value is above zero, additive
//!    otherwise (multiplicative indices are meaningless around zero).
//! 2. Deseasonalised series `x_t = y_t / S_t` (or `y_t - S_t`).
//! 3. Least-squares line `x_t = a + b t` with `t = 0, 1, ..., n-1`:
//!    `b = sum (t - tbar)(x_t - xbar) / Sxx`, `a = xbar - b tbar`, `Sxx = sum (t - tbar)^2`.
//! 4. Fitted and forecast values: `(a + b t) S_t` (or `+ S_t`), for `t < n` and `t = n + h - 1`.
//!
//! Variance (an approximation: the indices are treated as known, and the line's residuals as
//! independent): the regression prediction variance on the adjusted scale,
//! `s^2 (1 + 1/n + (t - tbar)^2 / Sxx)` with `s^2 = sum (x_t - a - b t)^2 / (n - 2)`, times
//! `S_t^2` for multiplicative indices (unchanged for additive ones).

use super::decompose::{self, Indices, Kind};
use super::{Fitted, MethodError, MethodKind, Parameter};

/// A least-squares line on `t = 0, 1, ..., n-1` and what its prediction variance needs.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(super) struct Line {
    pub intercept: f64,
    pub slope: f64,
    pub t_mean: f64,
    /// `sum (t - tbar)^2`; zero only for a single point.
    pub sxx: f64,
    /// `sum (x_t - a - b t)^2`.
    pub residual_ss: f64,
}

impl Line {
    pub fn at(&self, t: f64) -> f64 {
        self.intercept + self.slope * t
    }
}

/// Fits the least-squares line to `x` (see the module doc). A single point gives slope 0.
pub(super) fn fit_line(x: &[f64]) -> Line {
    let n = x.len().max(1) as f64;
    let t_mean = (n - 1.0) / 2.0;
    let x_mean = x.iter().sum::<f64>() / n;
    let (mut sxy, mut sxx) = (0.0, 0.0);
    for (t, v) in x.iter().enumerate() {
        let dt = t as f64 - t_mean;
        sxy += dt * (v - x_mean);
        sxx += dt * dt;
    }
    let slope = if sxx > 0.0 { sxy / sxx } else { 0.0 };
    let intercept = x_mean - slope * t_mean;
    let residual_ss = x
        .iter()
        .enumerate()
        .map(|(t, v)| (v - intercept - slope * t as f64).powi(2))
        .sum();
    Line {
        intercept,
        slope,
        t_mean,
        sxx,
        residual_ss,
    }
}

/// Linear trend times seasonal indices for season length `m`. Needs `m >= 2` and two full
/// seasons (`2m` observations).
pub fn trend_seasonal(
    history: &[f64],
    m: usize,
    how: Indices,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let method = MethodKind::TrendSeasonal;
    if m < 2 {
        return Err(MethodError::NeedsSeason { method });
    }
    let n = history.len();
    if n < 2 * m {
        return Err(MethodError::TooShort {
            method,
            needed: 2 * m,
            found: n,
        });
    }
    let kind = if history.iter().all(|v| *v > 0.0) {
        Kind::Multiplicative
    } else {
        Kind::Additive
    };
    let indices = decompose::indices(history, m, kind, how)
        .map_err(|_| MethodError::Diverged { method })?;
    let adjusted = decompose::deseasonalise(history, &indices, kind);
    let line = fit_line(&adjusted);
    let combine = |level: f64, index: f64| match kind {
        Kind::Multiplicative => level * index,
        Kind::Additive => level + index,
    };
    let fitted = (0..n)
        .map(|t| {
            Some(combine(
                line.at(t as f64),
                decompose::index_at(&indices, n, t),
            ))
        })
        .collect();
    // n >= 2m >= 4, so n - 2 >= 2 degrees of freedom.
    let s2 = line.residual_ss / (n - 2) as f64;
    let mut forecast = Vec::with_capacity(horizon);
    let mut variance = Vec::with_capacity(horizon);
    for h in 1..=horizon {
        let t = (n + h - 1) as f64;
        let index = decompose::index_at(&indices, n, n + h - 1);
        forecast.push(combine(line.at(t), index));
        let adjusted_variance = s2 * (1.0 + 1.0 / n as f64 + (t - line.t_mean).powi(2) / line.sxx);
        variance.push(match kind {
            Kind::Multiplicative => adjusted_variance * index * index,
            Kind::Additive => adjusted_variance,
        });
    }
    let parameters = vec![
        Parameter {
            name: "intercept",
            value: line.intercept,
        },
        Parameter {
            name: "slope",
            value: line.slope,
        },
        Parameter {
            name: "season_length",
            value: m as f64,
        },
        Parameter {
            name: "multiplicative",
            value: if kind == Kind::Multiplicative {
                1.0
            } else {
                0.0
            },
        },
    ];
    Fitted::new(method, fitted, forecast, Some(variance), parameters)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn line_fit_by_hand() {
        // x = 1, 3, 2, 5 on t = 0..3: tbar 1.5, xbar 2.75, Sxy = 5.5, Sxx = 5 -> b = 1.1, a = 1.1.
        let line = fit_line(&[1.0, 3.0, 2.0, 5.0]);
        assert!((line.slope - 1.1).abs() < 1e-12);
        assert!((line.intercept - 1.1).abs() < 1e-12);
        assert!((line.sxx - 5.0).abs() < 1e-12);
        // Residuals -0.1, 0.8, -1.3, 0.6: sum of squares 2.7.
        assert!((line.residual_ss - 2.7).abs() < 1e-12);
    }

    #[test]
    fn exact_trend_times_season_is_reproduced() {
        // y = (10 + t) * pattern: the 2x4 average of a line times a mean-one pattern is not
        // exactly the line, so allow a small tolerance; the shape must come through.
        let pattern = [0.8, 1.2, 1.1, 0.9];
        let y: Vec<f64> = (0..24)
            .map(|t| (100.0 + t as f64) * pattern[t % 4])
            .collect();
        let f = trend_seasonal(&y, 4, Indices::Classical, 4).unwrap();
        for (h, v) in f.forecast().iter().enumerate() {
            let truth = (100.0 + (24 + h) as f64) * pattern[h % 4];
            assert!((v - truth).abs() / truth < 2e-3, "{v} vs {truth}");
        }
        assert_eq!(f.parameters()[3].value, 1.0);
        let var = f.variance().unwrap();
        assert!(var.iter().all(|v| *v >= 0.0));
    }

    #[test]
    fn zeros_switch_to_additive_and_short_is_refused() {
        let y: Vec<f64> = (0..12).map(|t| [0.0, 4.0, 2.0][t % 3] + t as f64).collect();
        let f = trend_seasonal(&y, 3, Indices::Classical, 3).unwrap();
        assert_eq!(f.parameters()[3].value, 0.0);
        assert!(matches!(
            trend_seasonal(&y[..5], 3, Indices::Classical, 1),
            Err(MethodError::TooShort { needed: 6, .. })
        ));
        assert!(matches!(
            trend_seasonal(&y, 1, Indices::Classical, 1),
            Err(MethodError::NeedsSeason { .. })
        ));
    }
}
