//! Benchmark methods: naive, seasonal naive and a moving average with its window chosen on the
//! history.
//!
//! Kept apart from: the smoothing family ([`super::smoothing`]) and anything that optimises a
//! continuous parameter. These methods are the yardsticks every other method must beat, so they
//! stay as plain as their definitions.
//!
//! Variances follow the random-walk view of each method (Hyndman & Athanasopoulos, "Forecasting:
//! Principles and Practice", section on benchmark methods). The one-step residual variance is
//! estimated as the mean squared one-step residual, `sigma^2 = (1/r) sum e_t^2` over the r
//! periods that have a fitted value (common practice).

use super::{Fitted, MethodError, MethodKind, Parameter};

/// Largest moving-average window tried (one year of months; common practice).
const MAX_WINDOW: usize = 12;
/// Smallest moving-average window tried: a window of 1 is the naive method.
const MIN_WINDOW: usize = 2;

/// Mean squared one-step residual over the periods with a fitted value; `None` if there are none.
fn residual_variance(history: &[f64], fitted: &[Option<f64>]) -> Option<f64> {
    let (sum, count) = fitted
        .iter()
        .zip(history)
        .filter_map(|(f, y)| f.map(|f| (f - y).powi(2)))
        .fold((0.0, 0usize), |(s, c), e2| (s + e2, c + 1));
    (count > 0).then(|| sum / count as f64)
}

/// Naive method: `F_{t+1} = y_t`, forecast `y_n` for every step.
///
/// Variance (random walk): `Var(h) = sigma^2 h`. Needs 1 observation; with only one there is no
/// residual, so no variance.
pub fn naive(history: &[f64], horizon: usize) -> Result<Fitted, MethodError> {
    let kind = MethodKind::Naive;
    let Some(&last) = history.last() else {
        return Err(MethodError::TooShort {
            method: kind,
            needed: 1,
            found: 0,
        });
    };
    let fitted: Vec<Option<f64>> = std::iter::once(None)
        .chain(history.iter().take(history.len() - 1).map(|v| Some(*v)))
        .collect();
    let variance = residual_variance(history, &fitted)
        .map(|s2| (1..=horizon).map(|h| s2 * h as f64).collect());
    Fitted::new(kind, fitted, vec![last; horizon], variance, Vec::new())
}

/// Seasonal naive method: `F_t = y_{t-m}`; step h forecasts the value of the same position in
/// the last season, `y_{n - m + ((h-1) mod m)}`.
///
/// Variance (seasonal random walk): `Var(h) = sigma^2 (floor((h-1)/m) + 1)`. Needs m
/// observations and `m >= 2`.
pub fn seasonal_naive(history: &[f64], m: usize, horizon: usize) -> Result<Fitted, MethodError> {
    let kind = MethodKind::SeasonalNaive;
    if m < 2 {
        return Err(MethodError::NeedsSeason { method: kind });
    }
    let n = history.len();
    if n < m {
        return Err(MethodError::TooShort {
            method: kind,
            needed: m,
            found: n,
        });
    }
    let fitted: Vec<Option<f64>> = (0..n)
        .map(|t| t.checked_sub(m).map(|back| history[back]))
        .collect();
    let last_season = &history[n - m..];
    let forecast: Vec<f64> = (0..horizon).map(|i| last_season[i % m]).collect();
    let variance = residual_variance(history, &fitted)
        .map(|s2| (0..horizon).map(|i| s2 * (i / m + 1) as f64).collect());
    Fitted::new(
        kind,
        fitted,
        forecast,
        variance,
        vec![Parameter {
            name: "season_length",
            value: m as f64,
        }],
    )
}

/// One-step moving-average forecasts of window k: `F_t = (1/k) sum_{j=1..k} y_{t-j}` for `t >= k`.
fn moving_average_fitted(history: &[f64], k: usize) -> Vec<Option<f64>> {
    let mut out = vec![None; history.len()];
    if k == 0 || history.len() <= k {
        return out;
    }
    for (t, slot) in out.iter_mut().enumerate().skip(k) {
        *slot = Some(history[t - k..t].iter().sum::<f64>() / k as f64);
    }
    out
}

/// Moving average with its window k chosen on the history.
///
/// Window choice: every k in `2..=max(2, min(12, n/2))` is scored by the sum of squared one-step
/// in-sample errors over the SAME periods `t = k_max .. n-1` (a common scoring window, so longer
/// windows are not favoured by scoring fewer periods); the smallest sum wins, ties going to the
/// smaller k. Forecast: the mean of the last k values for every step.
///
/// Variance (common practice; the mean of k independent errors adds `sigma^2 / k`):
/// `Var(h) = sigma^2 (1 + 1/k)`, with sigma^2 from the chosen window's one-step residuals.
/// Needs 3 observations.
pub fn moving_average(history: &[f64], horizon: usize) -> Result<Fitted, MethodError> {
    let kind = MethodKind::MovingAverage;
    let n = history.len();
    if n < 3 {
        return Err(MethodError::TooShort {
            method: kind,
            needed: 3,
            found: n,
        });
    }
    let max_window = (n / 2).clamp(MIN_WINDOW, MAX_WINDOW);
    let mut best: Option<(usize, f64)> = None;
    for k in MIN_WINDOW..=max_window {
        let fitted = moving_average_fitted(history, k);
        let score: f64 = fitted[max_window..]
            .iter()
            .zip(&history[max_window..])
            .filter_map(|(f, y)| f.map(|f| (f - y).powi(2)))
            .sum();
        // Strictly smaller only: equal scores keep the smaller window found first.
        if best.is_none_or(|(_, s)| score < s) {
            best = Some((k, score));
        }
    }
    let (window, _) = best.unwrap_or((MIN_WINDOW, 0.0));
    let fitted = moving_average_fitted(history, window);
    let level = history[n - window..].iter().sum::<f64>() / window as f64;
    let variance = residual_variance(history, &fitted)
        .map(|s2| vec![s2 * (1.0 + 1.0 / window as f64); horizon]);
    Fitted::new(
        kind,
        fitted,
        vec![level; horizon],
        variance,
        vec![Parameter {
            name: "window",
            value: window as f64,
        }],
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn naive_forecast_and_variance() {
        let y = [3.0, 5.0, 4.0, 6.0];
        let f = naive(&y, 3).unwrap();
        assert_eq!(f.fitted(), &[None, Some(3.0), Some(5.0), Some(4.0)]);
        assert_eq!(f.forecast(), &[6.0, 6.0, 6.0]);
        // Residuals 2, -1, 2: sigma^2 = 9/3 = 3; Var(h) = 3h.
        let v = f.variance().unwrap();
        assert!((v[0] - 3.0).abs() < 1e-12 && (v[2] - 9.0).abs() < 1e-12);
        assert!(naive(&[7.0], 2).unwrap().variance().is_none());
        assert!(matches!(
            naive(&[], 2),
            Err(MethodError::TooShort { needed: 1, .. })
        ));
    }

    #[test]
    fn seasonal_naive_repeats_last_season() {
        let y = [1.0, 2.0, 3.0, 2.0, 3.0, 5.0];
        let f = seasonal_naive(&y, 3, 7).unwrap();
        assert_eq!(f.forecast(), &[2.0, 3.0, 5.0, 2.0, 3.0, 5.0, 2.0]);
        assert_eq!(f.fitted()[3], Some(1.0));
        // Residuals -1, -1, -2: sigma^2 = 2; steps 1-3 -> 2, 4-6 -> 4, 7 -> 6.
        let v = f.variance().unwrap();
        assert!((v[2] - 2.0).abs() < 1e-12);
        assert!((v[3] - 4.0).abs() < 1e-12);
        assert!((v[6] - 6.0).abs() < 1e-12);
        assert!(matches!(
            seasonal_naive(&y[..2], 3, 1),
            Err(MethodError::TooShort { needed: 3, .. })
        ));
    }

    #[test]
    fn moving_average_picks_the_best_window() {
        // Alternating values: a window of 2 averages them exactly (error 0 everywhere).
        let y: Vec<f64> = (0..20)
            .map(|t| if t % 2 == 0 { 10.0 } else { 20.0 })
            .collect();
        let f = moving_average(&y, 2).unwrap();
        assert_eq!(f.parameters()[0].value, 2.0);
        assert_eq!(f.forecast(), &[15.0, 15.0]);
        // A constant series ties every window: the smaller one (2) is kept.
        let c = moving_average(&[4.0; 10], 1).unwrap();
        assert_eq!(c.parameters()[0].value, 2.0);
        assert_eq!(c.variance().unwrap(), &[0.0]);
        // Period-3 pattern: windows 3, 6, 9, 12 all average whole cycles (same forecast 5, same
        // lowest error); the tie goes to 3.
        let p: Vec<f64> = (0..30).map(|t| [1.0, 5.0, 9.0][t % 3]).collect();
        let f = moving_average(&p, 1).unwrap();
        assert_eq!(f.parameters()[0].value, 3.0);
        assert!(f.fitted()[2].is_none() && f.fitted()[3].is_some());
    }

    #[test]
    fn moving_average_short_histories() {
        assert!(matches!(
            moving_average(&[1.0, 2.0], 1),
            Err(MethodError::TooShort { needed: 3, .. })
        ));
        let f = moving_average(&[1.0, 2.0, 4.0], 2).unwrap();
        assert_eq!(f.forecast(), &[3.0, 3.0]);
        // One residual: 1.5 - 4 = -2.5; Var = 6.25 * 1.5.
        assert!((f.variance().unwrap()[0] - 9.375).abs() < 1e-12);
    }
}
