//! The Theta method as the M3/M4 benchmark: simple exponential smoothing plus half the slope of
//! the least-squares trend line, on a seasonally adjusted series.
//!
//! Kept apart from: the Holt-Winters family ([`super::smoothing`]); this module carries its own
//! small SES fitter so the two can change independently. Seasonal adjustment comes from
//! [`super::decompose`].
//!
//! Method (V. Assimakopoulos & K. Nikolopoulos, "The theta model: a decomposition approach to
//! forecasting", IJF 16 (2000) 521-530, in the closed form of R. J. Hyndman & B. Billah,
//! "Unmasking the Theta method", IJF 19 (2003) 287-290):
//!
//! 1. With a season length m, if every value is above zero, divide by classical multiplicative
//!    seasonal indices (as published; the plan asks for them shrunk, [`super::decompose`]);
//!    otherwise skip the adjustment and report `season_skipped_not_positive`.
//! 2. Theta line 0: least-squares line `a + b t`; only its slope b is used.
//! 3. SES on the adjusted series `x`: `l_t = alpha x_t + (1 - alpha) l_{t-1}`, with alpha and the
//!    initial level `l_0` chosen to minimise the one-step SSE (below).
//! 4. Forecast h steps after n observations:
//!    `x_hat(n+h) = l_n + (b/2) (h - 1 + 1/alpha - (1 - alpha)^n / alpha)`, times the index of
//!    that season position.
//!
//! In-sample fitted values use the same formula at each origin t with the full-history alpha,
//! `l_0` and b: `x_hat(t+1) = l_t + (b/2) (1 - (1 - alpha)^(t+1)) / alpha` (0-based t; at t = -1
//! this is `l_0`).
//!
//! Variance: Hyndman & Billah show the method is SES with drift, so the SES formula
//! `Var(h) = sigma^2 (1 + alpha^2 (h - 1))` is used on the adjusted scale, with sigma^2 the mean
//! squared one-step residual there, and multiplied by the squared seasonal index of the step
//! (the index is treated as known: an approximation).
//!
//! SES fit: for a fixed alpha the one-step forecasts are linear in `l_0`,
//! `f_t = A_t + (1 - alpha)^t l_0`, so the best `l_0` is the least-squares solution
//! `l_0 = sum c_t (x_t - A_t) / sum c_t^2` with `c_t = (1 - alpha)^t`. Alpha is then found by a
//! grid over `[1e-4, 1]` refined by golden-section search on the profiled SSE
//! ([`super::optimize::minimise_scalar`]).

use super::decompose::{self, Indices, Kind};
use super::optimize::minimise_scalar;
use super::trend_season::fit_line;
use super::{Fitted, MethodError, MethodKind, Parameter};

/// Smallest smoothing constant searched: keeps `1/alpha` finite (common practice).
const ALPHA_LOW: f64 = 1e-4;
const ALPHA_HIGH: f64 = 1.0;
/// Grid points before the golden-section refinement; the SSE surface can have more than one dip.
const GRID_POINTS: usize = 21;
/// Golden-section stops when the bracket is this narrow: alpha to six places, past what moves
/// a forecast (1e-10 before; the M3 tables were the same to three places, the command line's
/// instructions 3 % fewer: README, Speed).
const ALPHA_TOLERANCE: f64 = 1e-6;

/// Fitted SES parameters and their one-step SSE.
#[derive(Clone, Copy, Debug, PartialEq)]
struct SesFit {
    alpha: f64,
    level0: f64,
    sse: f64,
}

/// The best initial level for `alpha` and its SSE (see the module doc).
fn ses_profile(x: &[f64], alpha: f64) -> SesFit {
    let decay = 1.0 - alpha;
    let (mut free_part, mut weight) = (0.0, 1.0);
    let (mut cross, mut norm) = (0.0, 0.0);
    for &value in x {
        cross += weight * (value - free_part);
        norm += weight * weight;
        free_part = alpha * value + decay * free_part;
        weight *= decay;
    }
    let level0 = cross / norm;
    // Second pass for the SSE itself: subtracting sums of squares would lose digits.
    let mut level = level0;
    let mut sse = 0.0;
    for &value in x {
        sse += (value - level).powi(2);
        level = alpha * value + decay * level;
    }
    SesFit { alpha, level0, sse }
}

/// Alpha (and `l_0`) minimising the one-step SSE of SES on `x`.
fn fit_ses(x: &[f64]) -> SesFit {
    let (alpha, _) = minimise_scalar(
        |alpha| ses_profile(x, alpha).sse,
        ALPHA_LOW,
        ALPHA_HIGH,
        GRID_POINTS,
        ALPHA_TOLERANCE,
    );
    ses_profile(x, alpha)
}

/// `(1 - (1 - alpha)^k) / alpha`, computed without cancellation for small alpha (tends to k).
fn drift_weight(alpha: f64, k: usize) -> f64 {
    if k == 0 {
        return 0.0;
    }
    if alpha >= 1.0 {
        // (1 - 1)^k = 0 for k >= 1; the logarithm below would be -infinity.
        return 1.0;
    }
    -((k as f64) * (-alpha).ln_1p()).exp_m1() / alpha
}

/// The series Theta works on, and how to put the season back.
struct Adjusted {
    values: Vec<f64>,
    indices: Option<Vec<f64>>,
    skipped_not_positive: bool,
}

fn adjust(history: &[f64], season: Option<usize>, how: Indices) -> Result<Adjusted, MethodError> {
    let kind = MethodKind::Theta;
    let n = history.len();
    let unadjusted = |skipped_not_positive| Adjusted {
        values: history.to_vec(),
        indices: None,
        skipped_not_positive,
    };
    let Some(m) = season.filter(|m| *m >= 2) else {
        return Ok(unadjusted(false));
    };
    if history.iter().any(|v| *v <= 0.0) {
        return Ok(unadjusted(true));
    }
    if n < 2 * m {
        return Err(MethodError::TooShort {
            method: kind,
            needed: (2 * m).max(3),
            found: n,
        });
    }
    let indices = decompose::indices(history, m, Kind::Multiplicative, how)
        .map_err(|_| MethodError::Diverged { method: kind })?;
    Ok(Adjusted {
        values: decompose::deseasonalise(history, &indices, Kind::Multiplicative),
        indices: Some(indices),
        skipped_not_positive: false,
    })
}

/// Theta with alpha and `l_0` fitted on the history (see the module doc). Needs 3 observations,
/// and two full seasons when it deseasonalises.
pub fn theta(
    history: &[f64],
    season: Option<usize>,
    how: Indices,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    check_length(history)?;
    let adjusted = adjust(history, season, how)?;
    let ses = fit_ses(&adjusted.values);
    assemble(history, adjusted, ses.alpha, ses.level0, horizon)
}

/// Theta with a given smoothing constant and initial level instead of fitted ones: to update an
/// earlier fit over a longer history ([`super::update`]) or to reproduce a result computed
/// elsewhere (the reference tests). `alpha` must lie in `(0, 1]`.
pub fn theta_with_smoothing(
    history: &[f64],
    season: Option<usize>,
    how: Indices,
    alpha: f64,
    level0: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    check_length(history)?;
    if !(alpha > 0.0 && alpha <= 1.0 && level0.is_finite()) {
        return Err(MethodError::Diverged {
            method: MethodKind::Theta,
        });
    }
    let adjusted = adjust(history, season, how)?;
    assemble(history, adjusted, alpha, level0, horizon)
}

fn check_length(history: &[f64]) -> Result<(), MethodError> {
    if history.len() < 3 {
        return Err(MethodError::TooShort {
            method: MethodKind::Theta,
            needed: 3,
            found: history.len(),
        });
    }
    Ok(())
}

fn assemble(
    history: &[f64],
    adjusted: Adjusted,
    alpha: f64,
    level0: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let n = history.len();
    let x = &adjusted.values;
    let half_slope = 0.5 * fit_line(x).slope;
    let index = |t: usize| {
        adjusted
            .indices
            .as_deref()
            .map_or(1.0, |idx| decompose::index_at(idx, n, t))
    };

    let mut level = level0;
    let mut fitted = Vec::with_capacity(n);
    let mut sse = 0.0;
    for (t, &value) in x.iter().enumerate() {
        let one_step = level + half_slope * drift_weight(alpha, t);
        sse += (value - one_step).powi(2);
        fitted.push(Some(one_step * index(t)));
        level = alpha * value + (1.0 - alpha) * level;
    }
    let sigma2 = sse / n as f64;
    let drift = drift_weight(alpha, n);
    let mut forecast = Vec::with_capacity(horizon);
    let mut variance = Vec::with_capacity(horizon);
    for h in 1..=horizon {
        let s = index(n + h - 1);
        forecast.push((level + half_slope * (h as f64 - 1.0 + drift)) * s);
        variance.push(sigma2 * (1.0 + alpha * alpha * (h as f64 - 1.0)) * s * s);
    }

    let mut parameters = vec![
        Parameter {
            name: "alpha",
            value: alpha,
        },
        Parameter {
            name: "l0",
            value: level0,
        },
        Parameter {
            name: "trend_slope",
            value: 2.0 * half_slope,
        },
    ];
    if let Some(indices) = &adjusted.indices {
        parameters.push(Parameter {
            name: "season_length",
            value: indices.len() as f64,
        });
    }
    if adjusted.skipped_not_positive {
        parameters.push(Parameter {
            name: "season_skipped_not_positive",
            value: 1.0,
        });
    }
    Ok(Fitted::new(
        MethodKind::Theta,
        fitted,
        forecast,
        Some(variance),
        parameters,
    )?
    .with_anchor(super::Anchor::Theta { alpha, level0 }))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn profiled_level_is_the_least_squares_optimum() {
        let x = [10.0, 12.0, 11.0, 13.0, 12.5, 14.0, 13.0];
        let fit = ses_profile(&x, 0.3);
        let sse_at = |l0: f64| {
            let mut l = l0;
            x.iter().fold(0.0, |s, v| {
                let e = v - l;
                l = 0.3 * v + 0.7 * l;
                s + e * e
            })
        };
        assert!((sse_at(fit.level0) - fit.sse).abs() < 1e-9);
        assert!(sse_at(fit.level0 + 0.01) > fit.sse);
        assert!(sse_at(fit.level0 - 0.01) > fit.sse);
    }

    #[test]
    fn fitted_alpha_beats_its_neighbours() {
        let x = [
            5.0, 7.0, 6.0, 8.0, 9.0, 7.5, 10.0, 11.0, 9.5, 12.0, 13.0, 12.0,
        ];
        let best = fit_ses(&x);
        for a in [best.alpha - 1e-3, best.alpha + 1e-3] {
            if (ALPHA_LOW..=ALPHA_HIGH).contains(&a) {
                assert!(ses_profile(&x, a).sse >= best.sse - 1e-12);
            }
        }
    }

    #[test]
    fn straight_line_gets_half_its_slope() {
        // On the exact line 5 + 2t, SES lags least with alpha = 1 (l_n = y_n), so by hand the
        // forecast is y_n + (2/2)(h - 1 + 1) = 43 + h: theta = 2 keeps half the trend.
        let y: Vec<f64> = (0..20).map(|t| 5.0 + 2.0 * t as f64).collect();
        let f = theta(&y, None, Indices::Classical, 3).unwrap();
        assert!((f.parameters()[0].value - 1.0).abs() < 1e-9);
        for (h, v) in f.forecast().iter().enumerate() {
            assert!((v - (44.0 + h as f64)).abs() < 1e-6, "{:?}", f.forecast());
        }
        let var = f.variance().unwrap();
        assert!(var[1] > var[0]);
    }

    #[test]
    fn drift_weight_small_alpha_limit() {
        assert!((drift_weight(1e-12, 10) - 10.0).abs() < 1e-6);
        assert!((drift_weight(1.0, 10) - 1.0).abs() < 1e-15);
    }

    #[test]
    fn short_and_non_positive() {
        assert!(matches!(
            theta(&[1.0, 2.0], None, Indices::Classical, 1),
            Err(MethodError::TooShort { needed: 3, .. })
        ));
        assert!(matches!(
            theta(&[1.0; 7], Some(4), Indices::Classical, 1),
            Err(MethodError::TooShort { needed: 8, .. })
        ));
        let y = [0.0, 3.0, 1.0, 4.0, 0.0, 3.0, 1.0];
        let f = theta(&y, Some(4), Indices::Classical, 2).unwrap();
        assert!(f
            .parameters()
            .iter()
            .any(|p| p.name == "season_skipped_not_positive"));
    }
}
