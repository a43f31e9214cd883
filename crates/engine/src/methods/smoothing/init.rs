//! Starting values for the initial states l0, b0, s0 (before the optimiser refines them).
//!
//! Kept apart from: the optimiser ([`super::estimate`]), which treats these only as a start.
//! Two published rules, as implemented by statsmodels 0.15.0 and checked against
//! tests/fixtures/refs/init_heuristics_reference.json:
//!
//! * **heuristic** (Hyndman, Koehler, Ord & Snyder 2008, *Forecasting with Exponential
//!   Smoothing*, sec. 2.6.1): needs n >= 10, and with a season n >= 10 + 2⌊m/2⌋ and n >= 2m.
//!   Seasonal: use k = max(min(5, ⌊n/m⌋), ⌈(10 + 2⌊m/2⌋)/m⌉) cycles (at most n points); take a
//!   centred moving average of length m (2×m when m is even); detrend (y − MA or y / MA);
//!   s0_j = mean of the detrended values at season position j; normalise (subtract the mean or
//!   divide by it). Then regress the first 10 values (of the MA with a season, of y without) on
//!   t = 1..10: l0 = intercept (at t = 0), b0 = slope.
//! * **simple**: without a season l0 = y_1, b0 = y_2 − y_1; with a season l0 = mean(y_1..y_m),
//!   b0 = mean_j (y_{m+j} − y_j)/m, s0_j = y_j − l0 or y_j / l0.
//!
//! [`initial_states`] uses the heuristic where its length conditions hold, else the simple rule.

use super::model::{Model, States};

/// Least-squares line through (t, y_t), t = 1..len: returns (intercept at t = 0, slope).
/// A single point gives slope 0.
pub fn least_squares_line(y: &[f64]) -> (f64, f64) {
    let n = y.len() as f64;
    if y.is_empty() {
        return (0.0, 0.0);
    }
    let t_mean = (n + 1.0) / 2.0;
    let y_mean = y.iter().sum::<f64>() / n;
    let (mut sty, mut stt) = (0.0, 0.0);
    for (i, v) in y.iter().enumerate() {
        let dt = (i + 1) as f64 - t_mean;
        sty += dt * (v - y_mean);
        stt += dt * dt;
    }
    let slope = if stt > 0.0 { sty / stt } else { 0.0 };
    (y_mean - slope * t_mean, slope)
}

/// Centred moving average of length m over `y` (2×m when m is even), at the positions where it
/// is defined: returns (first position, values). For odd m position i averages
/// y[i−(m−1)/2 ..= i+(m−1)/2]; for even m it is the mean of the two length-m averages over
/// y[i−m/2 ..= i+m/2−1] and y[i−m/2+1 ..= i+m/2].
fn centred_moving_average(y: &[f64], m: usize) -> (usize, Vec<f64>) {
    let mean = |from: usize| y[from..from + m].iter().sum::<f64>() / m as f64;
    if m % 2 == 1 {
        let half = (m - 1) / 2;
        let count = (y.len() + 1).saturating_sub(m);
        (half, (0..count).map(mean).collect())
    } else {
        let half = m / 2;
        let count = y.len().saturating_sub(m);
        (
            half,
            (0..count).map(|i| 0.5 * (mean(i) + mean(i + 1))).collect(),
        )
    }
}

/// The heuristic rule (see the module doc); `None` when the history is too short for it.
pub fn heuristic(model: Model, y: &[f64]) -> Option<States> {
    let n = y.len();
    if n < 10 {
        return None;
    }
    let m = model.period();
    let trend_fit = |values: &[f64], seasonal: Vec<f64>| {
        let (intercept, slope) = least_squares_line(&values[..10]);
        States {
            level: intercept,
            trend: if model.has_trend() { slope } else { 0.0 },
            seasonal,
        }
    };
    if m == 0 {
        return Some(trend_fit(y, Vec::new()));
    }
    let min_obs = 10 + 2 * (m / 2);
    if n < min_obs || n < 2 * m {
        return None;
    }
    let cycles = (n / m).min(5).max(min_obs.div_ceil(m));
    let span = &y[..(cycles * m).min(n)];
    let (first, average) = centred_moving_average(span, m);
    let (mut sums, mut counts) = (vec![0.0; m], vec![0usize; m]);
    for (k, a) in average.iter().enumerate() {
        let i = first + k;
        let detrended = if model.is_multiplicative() {
            span[i] / a
        } else {
            span[i] - a
        };
        sums[i % m] += detrended;
        counts[i % m] += 1;
    }
    let mut seasonal: Vec<f64> = sums
        .iter()
        .zip(&counts)
        .map(|(s, c)| s / (*c).max(1) as f64)
        .collect();
    normalise(model, &mut seasonal);
    Some(trend_fit(&average, seasonal))
}

/// The simple rule (see the module doc); `None` with fewer than 2 points (2m with a season).
pub fn simple(model: Model, y: &[f64]) -> Option<States> {
    let m = model.period();
    if m == 0 {
        let first = *y.first()?;
        let trend = match (model.has_trend(), y.get(1)) {
            (true, Some(second)) => second - first,
            _ => 0.0,
        };
        return Some(States {
            level: first,
            trend,
            seasonal: Vec::new(),
        });
    }
    if y.len() < 2 * m {
        return None;
    }
    let level = y[..m].iter().sum::<f64>() / m as f64;
    let trend = if model.has_trend() {
        (0..m).map(|j| (y[m + j] - y[j]) / m as f64).sum::<f64>() / m as f64
    } else {
        0.0
    };
    let seasonal = y[..m]
        .iter()
        .map(|v| {
            if model.is_multiplicative() {
                v / level
            } else {
                v - level
            }
        })
        .collect();
    Some(States {
        level,
        trend,
        seasonal,
    })
}

/// Heuristic where possible, else simple, else (too short for both) the first value with no
/// trend and neutral seasonal states. Seasonal states come back normalised.
pub fn initial_states(model: Model, y: &[f64]) -> States {
    let mut states = heuristic(model, y)
        .or_else(|| simple(model, y))
        .unwrap_or_else(|| States {
            level: y.first().copied().unwrap_or(0.0),
            trend: 0.0,
            seasonal: vec![if model.is_multiplicative() { 1.0 } else { 0.0 }; model.period()],
        });
    normalise(model, &mut states.seasonal);
    states
}

/// Seasonal states to sum 0 (additive) or mean 1 (multiplicative). A multiplicative set with a
/// non-positive mean is left as it is (the data then were not positive, which callers reject).
pub fn normalise(model: Model, seasonal: &mut [f64]) {
    if seasonal.is_empty() {
        return;
    }
    let mean = seasonal.iter().sum::<f64>() / seasonal.len() as f64;
    if model.is_multiplicative() {
        if mean > 0.0 {
            seasonal.iter_mut().for_each(|s| *s /= mean);
        }
    } else {
        seasonal.iter_mut().for_each(|s| *s -= mean);
    }
}
