//! Classical seasonal decomposition: a centred moving-average trend and one seasonal index per
//! season position.
//!
//! Kept apart from: any forecasting method. Theta ([`super::theta`]) and the linear trend with
//! seasonal indices ([`super::trend_season`]) call it to take the season out of a history and put
//! it back into a forecast; it knows nothing about horizons beyond that.
//!
//! Method (classical decomposition, e.g. Hyndman & Athanasopoulos, "Forecasting: Principles and
//! Practice", section on classical decomposition):
//!
//! 1. Trend: centred moving average of order m. For odd m, `T_t = (1/m) sum_{j=-k..k} y_{t+j}`
//!    with `k = (m-1)/2`; for even m the 2xm average
//!    `T_t = (1/m) (y_{t-m/2}/2 + y_{t-m/2+1} + ... + y_{t+m/2-1} + y_{t+m/2}/2)`.
//!    It is undefined in the first and last half season.
//! 2. Detrended values `y_t / T_t` (multiplicative) or `y_t - T_t` (additive) where `T_t` exists.
//! 3. Raw index per season position: the mean of the detrended values at that position.
//! 4. Normalise: multiplicative indices divided by their mean (mean 1); additive indices minus
//!    their mean (sum 0).
//!
//! Shrunk indices ([`Indices::Shrunk`], what the forecasting methods use: [`FOR_FORECASTS`]):
//! the raw indices of step 3 pulled towards their mean by the James-Stein factor before step 4
//! (D. G. Miller & D. C. Williams, "Shrinkage estimators of time series seasonal factors and
//! their effect on forecasting accuracy", IJF 19 (2003) 669-684; the positive-part form below
//! is the textbook James-Stein estimator, its constant m − 3 for shrinking towards an estimated
//! mean from memory):
//!
//! ```text
//!   S*_i = S̄ + c (S_i − S̄),   c = max(0, 1 − (m − 3) v / Σ_i (S_i − S̄)²),   v = σ² / k̄
//! ```
//!
//! with S_i the raw index of position i, S̄ their mean, σ² the pooled variance of the detrended
//! values about their position's raw index (Σ (d − S_i)² over Σ (k_i − 1)), and k̄ the mean count
//! of detrended values per position, so v is the variance of one raw index. With few years the
//! raw indices spread more than the true season does (noise counted as season); the factor
//! takes that excess out and leaves a strong, well-measured season almost as it was (c near 1).
//! Measured on the M3 data (README, Benchmarks): sMAPE monthly 13.50 -> 13.45, quarterly 9.03
//! -> 9.01. No shrinkage when m <= 3 or no position has two detrended values.
//!
//! Indices are returned aligned with the LAST m observations: `indices[j]` belongs to observation
//! `n - m + j` (0-based). Forecast step h (1-based) then uses `indices[(h - 1) % m]`.

use std::fmt;

/// How the seasonal indices are estimated (module doc).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Indices {
    /// Classical decomposition as published: the mean detrended value per position. Only the
    /// reference checks and the M3 benchmark's calibration row ask for it (feature `internals`).
    #[cfg_attr(not(any(test, feature = "internals")), allow(dead_code))]
    Classical,
    /// Classical, then shrunk towards their mean by the James-Stein factor.
    Shrunk,
}

/// The indices every forecasting method that takes a season out uses: shrunk, which measured
/// better on the M3 data (module doc). The classical ones stay for the reference checks.
pub const FOR_FORECASTS: Indices = Indices::Shrunk;

/// How the season combines with the level.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Kind {
    /// `y = trend x index`; indices average 1. Needs strictly positive values.
    Multiplicative,
    /// `y = trend + index`; indices sum to 0.
    Additive,
}

/// Why a decomposition cannot be made. Each message says what would make it possible.
#[derive(Clone, Debug, PartialEq)]
pub enum DecomposeError {
    /// The season length is below 2.
    SeasonTooShort { season: usize },
    /// Fewer than two full seasons of history.
    TooShort { needed: usize, found: usize },
    /// Multiplicative decomposition met a value at or below zero.
    NotPositive,
    /// A value is NaN or infinite.
    NotFinite,
}

impl fmt::Display for DecomposeError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            DecomposeError::SeasonTooShort { season } => write!(
                f,
                "a season length of {season} cannot be decomposed: use 2 or more periods per season"
            ),
            DecomposeError::TooShort { needed, found } => write!(
                f,
                "seasonal indices need two full seasons ({needed} periods); this history has {found}"
            ),
            DecomposeError::NotPositive => write!(
                f,
                "multiplicative seasonal indices need every value above zero: use additive indices"
            ),
            DecomposeError::NotFinite => write!(
                f,
                "the history holds a value that is not a finite number: replace it"
            ),
        }
    }
}

impl std::error::Error for DecomposeError {}

/// Centred moving average of order `m` (2xm for even `m`), aligned with `y`; `None` in the first
/// and last half season where the window does not fit. Empty windows give all `None`.
pub fn centred_moving_average(y: &[f64], m: usize) -> Vec<Option<f64>> {
    let n = y.len();
    let mut out = vec![None; n];
    if m < 2 || n < m + (1 - m % 2) {
        return out;
    }
    let half = m / 2;
    let weight = 1.0 / m as f64;
    // Each window is summed afresh (m is small) so no rounding drifts along a running sum.
    for (t, slot) in out.iter_mut().enumerate().take(n - half).skip(half) {
        let sum: f64 = if m % 2 == 1 {
            y[t - half..=t + half].iter().sum()
        } else {
            0.5 * y[t - half] + y[t - half + 1..t + half].iter().sum::<f64>() + 0.5 * y[t + half]
        };
        *slot = Some(sum * weight);
    }
    out
}

/// Classical seasonal indices of `y` for season length `m` ([`indices`] with
/// [`Indices::Classical`]).
#[cfg(any(test, feature = "internals"))]
pub fn seasonal_indices(y: &[f64], m: usize, kind: Kind) -> Result<Vec<f64>, DecomposeError> {
    indices(y, m, kind, Indices::Classical)
}

/// Seasonal indices of `y` for season length `m`, estimated as `how` says, aligned with the last
/// m observations (see the module doc). Needs `m >= 2`, at least `2m` finite values, and for
/// [`Kind::Multiplicative`] every value above zero.
pub fn indices(
    y: &[f64],
    m: usize,
    kind: Kind,
    how: Indices,
) -> Result<Vec<f64>, DecomposeError> {
    if m < 2 {
        return Err(DecomposeError::SeasonTooShort { season: m });
    }
    let n = y.len();
    if n < 2 * m {
        return Err(DecomposeError::TooShort {
            needed: 2 * m,
            found: n,
        });
    }
    if y.iter().any(|v| !v.is_finite()) {
        return Err(DecomposeError::NotFinite);
    }
    if kind == Kind::Multiplicative && y.iter().any(|v| *v <= 0.0) {
        return Err(DecomposeError::NotPositive);
    }
    let detrended = detrended(y, m, kind);
    let (mut raw, counts) = position_means(&detrended, m);
    if how == Indices::Shrunk {
        shrink(&mut raw, &detrended, &counts);
    }
    let mean = raw.iter().sum::<f64>() / m as f64;
    let normalised: Vec<f64> = raw
        .iter()
        .map(|r| match kind {
            Kind::Multiplicative => r / mean,
            Kind::Additive => r - mean,
        })
        .collect();
    if normalised.iter().any(|v| !v.is_finite()) {
        return Err(DecomposeError::NotFinite);
    }
    // Re-align so that entry j belongs to observation n - m + j, i.e. position (n - m + j) % m.
    Ok((0..m).map(|j| normalised[(n - m + j) % m]).collect())
}

/// The ratios (multiplicative) or differences (additive) of `y` to its centred moving average of
/// order `m`, `None` where the average does not exist (steps 1 and 2 of the module doc).
pub(crate) fn detrended(y: &[f64], m: usize, kind: Kind) -> Vec<Option<f64>> {
    y.iter()
        .zip(centred_moving_average(y, m))
        .map(|(value, level)| {
            level.map(|level| match kind {
                Kind::Multiplicative => value / level,
                Kind::Additive => value - level,
            })
        })
        .collect()
}

/// The mean of the detrended values at each position t % m (counted from the first
/// observation) and how many there are (step 3 of the module doc). With at least 2m values
/// every position has one: n - m (even m) or n - m + 1 (odd m) moving averages exist.
pub(crate) fn position_means(detrended: &[Option<f64>], m: usize) -> (Vec<f64>, Vec<usize>) {
    let mut sums = vec![0.0; m];
    let mut counts = vec![0usize; m];
    for (t, d) in detrended.iter().enumerate() {
        if let Some(d) = d {
            sums[t % m] += d;
            counts[t % m] += 1;
        }
    }
    let means = sums
        .iter()
        .zip(&counts)
        .map(|(s, c)| s / (*c).max(1) as f64)
        .collect();
    (means, counts)
}

/// Pulls the raw indices towards their mean by the James-Stein factor (module doc), given the
/// detrended values they are the means of (position t % m) and the count per position.
fn shrink(raw: &mut [f64], detrended: &[Option<f64>], counts: &[usize]) {
    let m = raw.len();
    let spare: usize = counts.iter().map(|c| c.saturating_sub(1)).sum();
    if m <= 3 || spare == 0 {
        return;
    }
    let within: f64 = detrended
        .iter()
        .enumerate()
        .filter_map(|(t, d)| d.map(|d| (d - raw[t % m]).powi(2)))
        .sum();
    let per_position = counts.iter().sum::<usize>() as f64 / m as f64;
    let variance = within / spare as f64 / per_position;
    let centre = raw.iter().sum::<f64>() / m as f64;
    let spread: f64 = raw.iter().map(|r| (r - centre).powi(2)).sum();
    let factor = if spread > 0.0 {
        (1.0 - (m as f64 - 3.0) * variance / spread).max(0.0)
    } else {
        0.0
    };
    for r in raw.iter_mut() {
        *r = centre + factor * (*r - centre);
    }
}

/// The index that applies to observation `t` (0-based; `t >= n` means the future) of a history of
/// length `n`, given indices from [`seasonal_indices`]. An empty index list gives NaN (which
/// [`super::Fitted::new`] turns into an error rather than a silent wrong number).
pub fn index_at(indices: &[f64], n: usize, t: usize) -> f64 {
    let m = indices.len();
    if m == 0 {
        return f64::NAN;
    }
    // Observation n - m has position 0; shift by a multiple of m so the subtraction stays >= 0.
    indices[(t + m - n % m) % m]
}

/// The history with the season taken out: `y_t / index_t` or `y_t - index_t`.
pub fn deseasonalise(y: &[f64], indices: &[f64], kind: Kind) -> Vec<f64> {
    let n = y.len();
    y.iter()
        .enumerate()
        .map(|(t, v)| match kind {
            Kind::Multiplicative => v / index_at(indices, n, t),
            Kind::Additive => v - index_at(indices, n, t),
        })
        .collect()
}

/// Puts the season back into a forecast of the deseasonalised series: step h (1-based) is
/// multiplied by (or added to) `indices[(h - 1) % m]`.
pub fn reseasonalise_forecast(forecast: &[f64], indices: &[f64], kind: Kind) -> Vec<f64> {
    let m = indices.len();
    forecast
        .iter()
        .enumerate()
        .map(|(i, f)| {
            let index = if m == 0 { f64::NAN } else { indices[i % m] };
            match kind {
                Kind::Multiplicative => f * index,
                Kind::Additive => f + index,
            }
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn centred_average_odd_and_even() {
        let y = [1.0, 2.0, 3.0, 4.0, 5.0, 6.0];
        let odd = centred_moving_average(&y, 3);
        assert_eq!(odd[0], None);
        assert_eq!(odd[5], None);
        assert!((odd[1].unwrap() - 2.0).abs() < 1e-12);
        assert!((odd[4].unwrap() - 5.0).abs() < 1e-12);
        // 2x4 average at t = 2: (0.5*1 + 2 + 3 + 4 + 0.5*5) / 4 = 3.
        let even = centred_moving_average(&y, 4);
        assert_eq!(even[1], None);
        assert_eq!(even[4], None);
        assert!((even[2].unwrap() - 3.0).abs() < 1e-12);
        assert!((even[3].unwrap() - 4.0).abs() < 1e-12);
    }

    // Arithmetic checks of the shrinkage (module doc): an exact pattern has no spread within a
    // position, so the factor is 1 and nothing moves; a "season" that flips sign from one year
    // to the next has raw indices near 0 and a large spread within each position, so the factor
    // clamps at 0 and no season is left.
    #[test]
    fn shrinkage_keeps_an_exact_pattern_and_removes_a_flipping_one() {
        let pattern = [0.5, 1.0, 1.5, 1.0];
        let y: Vec<f64> = (0..12).map(|t| 100.0 * pattern[t % 4]).collect();
        let kept = indices(&y, 4, Kind::Multiplicative, Indices::Shrunk).unwrap();
        let classical = seasonal_indices(&y, 4, Kind::Multiplicative).unwrap();
        for (a, b) in kept.iter().zip(&classical) {
            assert!((a - b).abs() < 1e-12, "{kept:?} vs {classical:?}");
        }
        let q = [1.0, -1.0, 2.0, -2.0, 1.0, -1.0];
        let y: Vec<f64> = (0..24)
            .map(|t| 10.0 + if (t / 6) % 2 == 0 { 1.0 } else { -1.0 } * q[t % 6])
            .collect();
        let classical = seasonal_indices(&y, 6, Kind::Additive).unwrap();
        assert!(classical.iter().any(|s| s.abs() > 0.01), "{classical:?}");
        let removed = indices(&y, 6, Kind::Additive, Indices::Shrunk).unwrap();
        assert!(removed.iter().all(|s| s.abs() < 1e-12), "{removed:?}");
    }

    #[test]
    fn pure_seasonal_pattern_is_recovered() {
        // A constant level times a fixed pattern: the indices are the pattern over its mean.
        let pattern = [0.5, 1.0, 1.5, 1.0];
        let y: Vec<f64> = (0..12).map(|t| 100.0 * pattern[t % 4]).collect();
        let idx = seasonal_indices(&y, 4, Kind::Multiplicative).unwrap();
        for (a, b) in idx.iter().zip(pattern) {
            assert!((a - b).abs() < 1e-12, "{idx:?}");
        }
        let flat = deseasonalise(&y, &idx, Kind::Multiplicative);
        assert!(flat.iter().all(|v| (v - 100.0).abs() < 1e-9));
        let back = reseasonalise_forecast(&[100.0; 5], &idx, Kind::Multiplicative);
        // The history has 12 points, so step 1 is position 12 % 4 = 0 of the pattern.
        assert!((back[0] - 50.0).abs() < 1e-9 && (back[4] - 50.0).abs() < 1e-9);
    }

    #[test]
    fn alignment_follows_the_last_season() {
        // 13 points: the last observation sits at pattern position 0, so indices[m-1] = pattern[0].
        let pattern = [2.0, -1.0, -1.0];
        let y: Vec<f64> = (0..13).map(|t| 10.0 + pattern[t % 3]).collect();
        let idx = seasonal_indices(&y, 3, Kind::Additive).unwrap();
        assert!((idx[2] - 2.0).abs() < 1e-12, "{idx:?}");
        assert!((idx[0] + 1.0).abs() < 1e-12);
        assert!((index_at(&idx, 13, 12) - 2.0).abs() < 1e-12);
        assert!((index_at(&idx, 13, 0) - 2.0).abs() < 1e-12);
        assert!((index_at(&idx, 13, 13) + 1.0).abs() < 1e-12);
    }

    #[test]
    fn rejects_bad_input() {
        assert_eq!(
            seasonal_indices(&[1.0; 7], 4, Kind::Additive),
            Err(DecomposeError::TooShort {
                needed: 8,
                found: 7
            })
        );
        assert_eq!(
            seasonal_indices(&[1.0; 8], 1, Kind::Additive),
            Err(DecomposeError::SeasonTooShort { season: 1 })
        );
        let mut y = vec![1.0; 8];
        y[3] = 0.0;
        assert_eq!(
            seasonal_indices(&y, 4, Kind::Multiplicative),
            Err(DecomposeError::NotPositive)
        );
        y[3] = f64::NAN;
        assert_eq!(
            seasonal_indices(&y, 4, Kind::Additive),
            Err(DecomposeError::NotFinite)
        );
    }
}
