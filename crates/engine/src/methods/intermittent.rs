//! Methods for intermittent demand (many periods with no sale): Croston, SBA and TSB.
//!
//! Kept apart from: the smoothing family ([`super::smoothing`]); each recursion here is a few
//! lines of simple exponential smoothing written out, with its constants fitted by
//! [`super::optimize`].
//!
//! A period is a demand period when its value is above zero; zero and negative values (returns)
//! count as no demand. Notation: `q_i` the i-th demand size, `a_i` the number of periods since
//! the previous demand (the first interval counts from a notional demand just before the first
//! period, so a first demand in period k, 1-based, has `a_1 = k`).
//!
//! - Croston (J. D. Croston, "Forecasting and stock control for intermittent demands", ORQ 23
//!   (1972) 289-303, in the form of A. A. Syntetos & J. E. Boylan, "The accuracy of intermittent
//!   demand estimates", IJF 21 (2005) 303-314): after each demand,
//!   `z <- z + alpha (q_i - z)`, `p <- p + alpha (a_i - p)`; between demands nothing changes.
//!   Forecast `z / p` for every step.
//! - SBA (Syntetos & Boylan 2005): Croston's forecast times `(1 - alpha/2)`, which removes most of
//!   its bias.
//! - TSB (R. H. Teunter, A. A. Syntetos & M. Z. Babai, "Intermittent demand: linking forecasting
//!   to inventory obsolescence", EJOR 214 (2011) 606-615): the demand probability is smoothed
//!   every period, `d <- d + beta (1[y_t > 0] - d)`, the size only on demand periods,
//!   `z <- z + alpha (y_t - z)`. Forecast `d z`.
//!
//! Initialisation (all three): `z` = the first demand size, `p` = its interval `a_1` (TSB:
//! `d = 1 / a_1`). The recursions start in the period after the first demand, so fitted values
//! are `None` up to and including it.
//!
//! Fitting: the smoothing constants minimise the one-step in-sample SSE over the periods with a
//! fitted value, searched in `[0.05, 0.3]` (the range studied for these methods in the
//! literature above; common practice): Croston and SBA by a grid refined with golden-section
//! search, TSB by a grid over the square refined with Nelder-Mead. With no period after the first demand there is nothing
//! to score and the constants fall back to 0.1. No analytic variance is published for these
//! methods, so none is returned.

use super::optimize::minimise_scalar;
use super::optimize::{self, Bound, Settings};
use super::{Fitted, MethodError, MethodKind, Parameter};

/// Search range of every smoothing constant here.
const SMOOTHING_RANGE: Bound = Bound::new(0.05, 0.3);
/// Used when the history leaves nothing to fit on (common practice).
const FALLBACK_SMOOTHING: f64 = 0.1;

// For the reference tests (feature `internals`).
#[cfg(feature = "internals")]
/// The demand sizes `q_i` and inter-demand intervals `a_i` of a history (see the module doc).
pub fn demand_sizes_and_intervals(history: &[f64]) -> (Vec<f64>, Vec<usize>) {
    let mut sizes = Vec::new();
    let mut intervals = Vec::new();
    let mut since_last = 0usize;
    for &value in history {
        since_last += 1;
        if value > 0.0 {
            sizes.push(value);
            intervals.push(since_last);
            since_last = 0;
        }
    }
    (sizes, intervals)
}

/// Index of the first demand period, or the error that explains why there is none.
fn first_demand(kind: MethodKind, history: &[f64]) -> Result<usize, MethodError> {
    if history.is_empty() {
        return Err(MethodError::TooShort {
            method: kind,
            needed: 1,
            found: 0,
        });
    }
    history
        .iter()
        .position(|v| *v > 0.0)
        .ok_or(MethodError::NoDemand { method: kind })
}

/// Runs Croston's recursion, handing each one-step forecast `(t, F_t)` to `on_forecast`
/// (`scale` 1 for Croston, `1 - alpha/2` for SBA), and returns the final `(size, interval)`.
/// A callback instead of a vector keeps the fitting loop free of allocations.
fn run_croston(
    history: &[f64],
    first: usize,
    alpha: f64,
    scale: f64,
    mut on_forecast: impl FnMut(usize, f64),
) -> (f64, f64) {
    let mut size = history[first];
    let mut interval = (first + 1) as f64;
    let mut since_last = 0usize;
    for (t, &value) in history.iter().enumerate().skip(first + 1) {
        on_forecast(t, scale * size / interval);
        since_last += 1;
        if value > 0.0 {
            size += alpha * (value - size);
            interval += alpha * (since_last as f64 - interval);
            since_last = 0;
        }
    }
    (size, interval)
}

/// Runs the TSB recursion like [`run_croston`]; returns the final `(size, probability)`.
fn run_tsb(
    history: &[f64],
    first: usize,
    alpha: f64,
    beta: f64,
    mut on_forecast: impl FnMut(usize, f64),
) -> (f64, f64) {
    let mut size = history[first];
    let mut probability = 1.0 / (first + 1) as f64;
    for (t, &value) in history.iter().enumerate().skip(first + 1) {
        on_forecast(t, probability * size);
        if value > 0.0 {
            probability += beta * (1.0 - probability);
            size += alpha * (value - size);
        } else {
            probability -= beta * probability;
        }
    }
    (size, probability)
}

/// One-step SSE of a recursion: `run` gets a callback that receives each `(t, F_t)`.
fn sse_of(history: &[f64], run: impl FnOnce(&mut dyn FnMut(usize, f64))) -> f64 {
    let mut total = 0.0;
    run(&mut |t, forecast| total += (forecast - history[t]).powi(2));
    total
}

/// Grid points per constant before refining (spacing 0.025 on the Croston line, 0.05 on the TSB
/// square): enough to land in the right dip of these short, bumpy SSE curves.
const CROSTON_GRID: usize = 11;
const TSB_GRID: usize = 6;
/// Refinement stops when the constant is known to this width.
const SMOOTHING_TOLERANCE: f64 = 1e-8;

/// The best `(alpha, beta)` for TSB: a coarse grid over the square, then Nelder-Mead from the
/// best grid point.
fn fit_tsb_constants(mut objective: impl FnMut(&[f64]) -> f64) -> (f64, f64) {
    let (low, high) = (SMOOTHING_RANGE.low, SMOOTHING_RANGE.high);
    let step = (high - low) / (TSB_GRID - 1) as f64;
    let mut start = vec![FALLBACK_SMOOTHING; 2];
    let mut best = f64::INFINITY;
    for i in 0..TSB_GRID {
        for j in 0..TSB_GRID {
            let point = [low + step * i as f64, low + step * j as f64];
            let value = objective(&point);
            if value < best {
                best = value;
                start = point.to_vec();
            }
        }
    }
    let settings = Settings {
        initial_step: 0.5 * step / (high - low),
        ..Settings::default()
    };
    let minimum = optimize::nelder_mead(objective, &start, &[SMOOTHING_RANGE; 2], settings);
    let point = if minimum.value <= best {
        minimum.point
    } else {
        start
    };
    match point[..] {
        [alpha, beta] => (alpha, beta),
        _ => (FALLBACK_SMOOTHING, FALLBACK_SMOOTHING),
    }
}

/// Fits `kind` (Croston, SBA or TSB) to `history` with constants chosen by one-step SSE.
pub fn fit(kind: MethodKind, history: &[f64], horizon: usize) -> Result<Fitted, MethodError> {
    let first = first_demand(kind, history)?;
    let nothing_to_score = first + 1 >= history.len();
    match kind {
        MethodKind::Croston | MethodKind::Sba => {
            let alpha = if nothing_to_score {
                FALLBACK_SMOOTHING
            } else {
                let sba = kind == MethodKind::Sba;
                let objective = |alpha: f64| {
                    let scale = if sba { 1.0 - alpha / 2.0 } else { 1.0 };
                    sse_of(history, |f| {
                        run_croston(history, first, alpha, scale, f);
                    })
                };
                minimise_scalar(
                    objective,
                    SMOOTHING_RANGE.low,
                    SMOOTHING_RANGE.high,
                    CROSTON_GRID,
                    SMOOTHING_TOLERANCE,
                )
                .0
            };
            croston_family(kind, history, first, alpha, horizon)
        }
        MethodKind::Tsb => {
            let (alpha, beta) = if nothing_to_score {
                (FALLBACK_SMOOTHING, FALLBACK_SMOOTHING)
            } else {
                fit_tsb_constants(|p| {
                    sse_of(history, |f| {
                        run_tsb(history, first, p[0], p[1], f);
                    })
                })
            };
            tsb_assemble(history, first, alpha, beta, horizon)
        }
        // Only reachable if a caller passes a non-intermittent kind; the dispatch in mod.rs never
        // does, and MethodError has no closer variant.
        _ => Err(MethodError::Diverged { method: kind }),
    }
}

// For the reference tests (feature `internals`) and this module's own tests.
#[cfg(any(test, feature = "internals"))]
/// Croston's method with a given smoothing constant (e.g. to reproduce a published example).
pub fn croston_with_alpha(
    history: &[f64],
    alpha: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let first = first_demand(MethodKind::Croston, history)?;
    croston_family(MethodKind::Croston, history, first, alpha, horizon)
}

// For the reference tests (feature `internals`) and this module's own tests.
#[cfg(any(test, feature = "internals"))]
/// SBA with a given smoothing constant.
pub fn sba_with_alpha(history: &[f64], alpha: f64, horizon: usize) -> Result<Fitted, MethodError> {
    let first = first_demand(MethodKind::Sba, history)?;
    croston_family(MethodKind::Sba, history, first, alpha, horizon)
}

// For the reference tests (feature `internals`) and this module's own tests.
#[cfg(any(test, feature = "internals"))]
/// TSB with given constants for the size (`alpha`) and the demand probability (`beta`).
pub fn tsb_with_parameters(
    history: &[f64],
    alpha: f64,
    beta: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let first = first_demand(MethodKind::Tsb, history)?;
    tsb_assemble(history, first, alpha, beta, horizon)
}

fn valid_constant(c: f64) -> bool {
    (0.0..=1.0).contains(&c)
}

fn croston_family(
    kind: MethodKind,
    history: &[f64],
    first: usize,
    alpha: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    if !valid_constant(alpha) {
        return Err(MethodError::Diverged { method: kind });
    }
    let scale = if kind == MethodKind::Sba {
        1.0 - alpha / 2.0
    } else {
        1.0
    };
    let mut fitted = vec![None; history.len()];
    let (size, interval) = run_croston(history, first, alpha, scale, |t, f| fitted[t] = Some(f));
    let level = scale * size / interval;
    let parameters = vec![
        Parameter {
            name: "alpha",
            value: alpha,
        },
        Parameter {
            name: "size",
            value: size,
        },
        Parameter {
            name: "interval",
            value: interval,
        },
    ];
    Fitted::new(kind, fitted, vec![level; horizon], None, parameters)
}

fn tsb_assemble(
    history: &[f64],
    first: usize,
    alpha: f64,
    beta: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let kind = MethodKind::Tsb;
    if !(valid_constant(alpha) && valid_constant(beta)) {
        return Err(MethodError::Diverged { method: kind });
    }
    let mut fitted = vec![None; history.len()];
    let (size, probability) = run_tsb(history, first, alpha, beta, |t, f| fitted[t] = Some(f));
    let parameters = vec![
        Parameter {
            name: "alpha",
            value: alpha,
        },
        Parameter {
            name: "beta",
            value: beta,
        },
        Parameter {
            name: "size",
            value: size,
        },
        Parameter {
            name: "probability",
            value: probability,
        },
    ];
    let level = probability * size;
    Fitted::new(kind, fitted, vec![level; horizon], None, parameters)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn croston_by_hand() {
        // Demands 4 at t=1 and 6 at t=4 (0-based): init z = 4, p = 2; after t=4 with alpha 0.5:
        // z = 5, p = 2 + 0.5 (3 - 2) = 2.5, forecast 2.
        let y = [0.0, 4.0, 0.0, 0.0, 6.0, 0.0];
        let f = croston_with_alpha(&y, 0.5, 2).unwrap();
        assert_eq!(&f.fitted()[..2], &[None, None]);
        assert_eq!(f.fitted()[2], Some(2.0));
        assert_eq!(f.forecast(), &[2.0, 2.0]);
        let s = sba_with_alpha(&y, 0.5, 1).unwrap();
        assert!((s.forecast()[0] - 1.5).abs() < 1e-12);
    }

    #[test]
    fn tsb_by_hand() {
        // Init z = 4, d = 1/2. t=2 (no demand), beta 0.5: d = 0.25; t=3 (demand 8), alpha 0.5:
        // d = 0.625, z = 6; forecast 3.75.
        let y = [0.0, 4.0, 0.0, 8.0];
        let f = tsb_with_parameters(&y, 0.5, 0.5, 1).unwrap();
        assert_eq!(f.fitted()[2], Some(2.0));
        assert_eq!(f.fitted()[3], Some(1.0));
        assert!((f.forecast()[0] - 3.75).abs() < 1e-12);
    }

    #[test]
    fn fitted_constants_stay_in_range_and_beat_the_fallback() {
        let y = [
            0.0, 3.0, 0.0, 0.0, 5.0, 0.0, 2.0, 0.0, 0.0, 0.0, 6.0, 0.0, 1.0, 0.0, 4.0, 0.0,
        ];
        for kind in [MethodKind::Croston, MethodKind::Sba, MethodKind::Tsb] {
            let f = fit(kind, &y, 3).unwrap();
            let alpha = f.parameters()[0].value;
            assert!((0.05..=0.3).contains(&alpha), "{kind}: {alpha}");
            let fallback = match kind {
                MethodKind::Croston => croston_with_alpha(&y, 0.1, 3),
                MethodKind::Sba => sba_with_alpha(&y, 0.1, 3),
                _ => tsb_with_parameters(&y, 0.1, 0.1, 3),
            }
            .unwrap();
            let sse = |g: &Fitted| g.residuals(&y).iter().map(|e| e * e).sum::<f64>();
            assert!(sse(&f) <= sse(&fallback) + 1e-12);
        }
    }

    #[test]
    fn no_demand_and_edge_cases() {
        assert_eq!(
            fit(MethodKind::Croston, &[0.0, 0.0, -1.0], 2),
            Err(MethodError::NoDemand {
                method: MethodKind::Croston
            })
        );
        assert!(matches!(
            fit(MethodKind::Tsb, &[], 2),
            Err(MethodError::TooShort { .. })
        ));
        // Only the last period has demand: nothing to fit, the fallback constant is used.
        let f = fit(MethodKind::Sba, &[0.0, 0.0, 3.0], 1).unwrap();
        assert_eq!(f.parameters()[0].value, 0.1);
        assert!((f.forecast()[0] - 0.95).abs() < 1e-12);
        assert!(croston_with_alpha(&[1.0], 1.5, 1).is_err());
    }
}
