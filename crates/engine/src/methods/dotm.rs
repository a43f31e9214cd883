//! The Dynamic Optimised Theta Method (DOTM) and its static form, the Optimised Theta Method
//! (OTM): the Theta method as a state space model whose theta line and smoothing constant are
//! fitted, with the long-term trend line revised at every period (dynamic) or fitted once on the
//! whole history (static).
//!
//! Kept apart from: the benchmark Theta ([`super::theta`]), which keeps theta at 2 and the trend
//! line fixed, and stays the calibration against the published M3 figures; the seasonal
//! adjustment, borrowed from [`super::adjusted`] (classical multiplicative indices, shrunk or not
//! as the caller asks, for positive demand, as the benchmark Theta; additive ones when the
//! history holds zeros or returns; none with fewer than two full seasons), so the model itself
//! only sees a series without season.
//!
//! Method (J. A. Fiorucci, T. R. Pellegrini, F. Louzada, F. Petropoulos & A. B. Koehler,
//! "Models for optimising the theta method and their relationship to state space models", IJF
//! 32 (2016) 1151-1161). With observations `Y_1..Y_n` (1-based t here), theta >= 1, the
//! smoothing constant alpha and the trend weight `w = 1 - 1/theta`:
//!
//! ```text
//! Y_t   = mu_t + e_t
//! mu_t  = l_{t-1} + w [ (1 - alpha)^(t-1) A_{t-1} + G_t B_{t-1} ],   G_t = (1 - (1 - alpha)^t) / alpha
//! l_t   = alpha Y_t + (1 - alpha) l_{t-1}
//! ```
//!
//! In the dynamic model `A_t + B_t s` is the least-squares line of `Y_1..Y_t` on s = 1..t,
//! updated each period (the paper's recursion, equal to ordinary least squares from t = 2 on):
//!
//! ```text
//! Ybar_t = ((t - 1) Ybar_{t-1} + Y_t) / t
//! B_t    = ((t - 2) B_{t-1} + (6 / t) (Y_t - Ybar_{t-1})) / (t + 1)
//! A_t    = Ybar_t - ((t + 1) / 2) B_t
//! ```
//!
//! In the static model every `A_{t-1}, B_{t-1}` is the whole history's line `A_n, B_n`. The
//! h-step forecast of both is
//!
//! ```text
//! Y_hat(n + h | n) = l_n + w [ (1 - alpha)^n A_n + (h - 1 + G_{n+1}) B_n ].
//! ```
//!
//! With theta = 2 the static forecast is the benchmark Theta's (SES plus half the least-squares
//! slope, Hyndman & Billah 2003): the SES level `l'_t = l_t + w (1 - alpha)^t (A_n + B_n)` gives
//! `l'_n + w B_n (h - 1 + 1/alpha - (1 - alpha)^n / alpha)`; theta = 1 is SES alone.
//! The estimates differ all the same: the benchmark (like statsmodels' ThetaModel) takes alpha
//! from SES without the drift, while this model's one-step forecasts carry it, so its
//! least-squares alpha at theta = 2 is another (AirPassengers adjusted: 0.757 against 0.838).
//!
//! Start-up (our choice; the recursion needs a line before it has two points): `Ybar_1 = A_1 =
//! Y_1`, `B_1 = 0`, and before the first observation `A_0 = Y_1`, `B_0 = 0`, so `mu_1 = l_0 + w
//! Y_1`. A flat line through the first value keeps `l_{t-1} + w (1 - alpha)^(t-1) A_{t-1}` on
//! the series' level from t = 1 on (with `A_0 = 0` the first steps would jump by `w Y_1`).
//!
//! Estimation: alpha in `[1e-4, 1]`, theta in `[1, 100]` and `l_0` minimise the sum of squared
//! one-step errors `sum (Y_t - mu_t)^2` over t = 1..n (the Gaussian likelihood with the variance
//! profiled out, as in the paper). For a fixed alpha, `mu_t = F_{t-1} + (1 - alpha)^(t-1) l_0 +
//! w D_t` with `F` the smoothing of `Y` started from 0 and `D_t = (1 - alpha)^(t-1) A_{t-1} +
//! G_t B_{t-1}`: linear in `(l_0, w)`, so those two come from a 2x2 least-squares solve (w
//! clamped to its bound, which is exact since the sum of squares is convex in them). Alpha is then
//! found by a grid refined by golden-section search on that profile
//! ([`super::optimize::minimise_scalar`]).
//!
//! No analytic variance: with the line revised by every future observation the h-step error
//! variance has no closed form we have checked, so bands come from the backtest's errors.

use super::adjusted;
use super::decompose::Indices;
use super::optimize::minimise_scalar;
use super::{Fitted, MethodError, MethodKind, Parameter};

/// Smallest smoothing constant searched, as the benchmark Theta (keeps `1/alpha` finite).
const ALPHA_LOW: f64 = 1e-4;
const ALPHA_HIGH: f64 = 1.0;
/// Largest theta searched (our bound; theta = 100 keeps 99 % of the least-squares slope).
const THETA_HIGH: f64 = 100.0;
/// Grid points before the golden-section refinement; the profile can have more than one dip.
const GRID_POINTS: usize = 21;
/// Golden-section stops when the bracket is this narrow: alpha to six places, past what moves
/// a forecast (1e-10 before; the M3 tables were the same to three places, the command line's
/// instructions 3 % fewer: README, Speed).
const ALPHA_TOLERANCE: f64 = 1e-6;
/// A 2x2 system with determinant below this share of the product of its diagonal is treated
/// as singular (the trend term is then a multiple of the level's: theta cannot be told apart).
const SINGULAR: f64 = 1e-12;

/// Whether the trend line is revised each period (DOTM) or fitted once (OTM).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Dynamics {
    /// `A_{t-1}, B_{t-1}` from `Y_1..Y_{t-1}`: the dynamic optimised Theta method.
    Dynamic,
    /// `A_n, B_n` from the whole history at every t: the optimised Theta method.
    Static,
}

/// The trend line each one-step forecast uses: `before[t - 1] = (A_{t-1}, B_{t-1})` for t =
/// 1..n, and `last = (A_n, B_n)`, the whole history's least-squares line.
struct Lines {
    before: Vec<(f64, f64)>,
    last: (f64, f64),
}

/// The paper's recursion (module doc) with our start-up; `y` is not empty.
fn trend_lines(y: &[f64], dynamics: Dynamics) -> Lines {
    let n = y.len();
    // (A_0, B_0) and (A_1, B_1): the flat line through the first value.
    let (mut mean, mut a, mut b) = (y[0], y[0], 0.0);
    let mut before = Vec::with_capacity(n);
    before.push((a, b));
    for (i, &value) in y.iter().enumerate().skip(1) {
        before.push((a, b));
        let t = (i + 1) as f64;
        b = ((t - 2.0) * b + (6.0 / t) * (value - mean)) / (t + 1.0);
        mean = ((t - 1.0) * mean + value) / t;
        a = mean - 0.5 * (t + 1.0) * b;
    }
    let last = (a, b);
    if dynamics == Dynamics::Static {
        before.iter_mut().for_each(|line| *line = last);
    }
    Lines { before, last }
}

/// Fitted `l_0`, trend weight `w` and their one-step SSE at one alpha.
#[derive(Clone, Copy, Debug, PartialEq)]
struct Profile {
    alpha: f64,
    level0: f64,
    weight: f64,
    sse: f64,
}

/// The largest trend weight, `1 - 1/THETA_HIGH`.
fn weight_high() -> f64 {
    1.0 - 1.0 / THETA_HIGH
}

/// The best `(l_0, w)` at `alpha` (or the best `l_0` at a given `w`) and its SSE.
fn profile(y: &[f64], lines: &Lines, alpha: f64, fixed_weight: Option<f64>) -> Profile {
    let decay = 1.0 - alpha;
    // Sums of the normal equations for u_t = Y_t - F_{t-1} on c_t = (1 - alpha)^(t-1), D_t.
    let (mut scc, mut scd, mut sdd, mut scu, mut sdu) = (0.0, 0.0, 0.0, 0.0, 0.0);
    let (mut free, mut c, mut g) = (0.0, 1.0, 0.0);
    for (&value, &(a, b)) in y.iter().zip(&lines.before) {
        g = 1.0 + decay * g;
        let d = c * a + g * b;
        let u = value - free;
        scc += c * c;
        scd += c * d;
        sdd += d * d;
        scu += c * u;
        sdu += d * u;
        free = alpha * value + decay * free;
        c *= decay;
    }
    // scc >= 1 (the t = 1 term), so the one-unknown solves never divide by zero.
    let level_at = |w: f64| (scu - w * scd) / scc;
    let (level0, weight) = match fixed_weight {
        Some(w) => (level_at(w), w),
        None => {
            let det = scc * sdd - scd * scd;
            if det > SINGULAR * scc * sdd {
                let w = (scc * sdu - scd * scu) / det;
                if (0.0..=weight_high()).contains(&w) {
                    ((sdd * scu - scd * sdu) / det, w)
                } else {
                    let w = w.clamp(0.0, weight_high());
                    (level_at(w), w)
                }
            } else {
                (level_at(0.0), 0.0)
            }
        }
    };
    // Second pass for the SSE itself: expanding the square would lose digits.
    let sse = one_step(y, lines, alpha, level0, weight)
        .map(|(value, mu)| (value - mu).powi(2))
        .sum();
    Profile {
        alpha,
        level0,
        weight,
        sse,
    }
}

/// The pairs `(Y_t, mu_t)` for t = 1..n.
fn one_step<'a>(
    y: &'a [f64],
    lines: &'a Lines,
    alpha: f64,
    level0: f64,
    weight: f64,
) -> impl Iterator<Item = (f64, f64)> + 'a {
    let decay = 1.0 - alpha;
    let (mut level, mut c, mut g) = (level0, 1.0, 0.0);
    y.iter().zip(&lines.before).map(move |(&value, &(a, b))| {
        g = 1.0 + decay * g;
        let mu = level + weight * (c * a + g * b);
        level = alpha * value + decay * level;
        c *= decay;
        (value, mu)
    })
}

/// Alpha, `l_0` and w (w fixed when given) minimising the one-step SSE.
fn estimate(y: &[f64], lines: &Lines, fixed_weight: Option<f64>) -> Profile {
    let (alpha, _) = minimise_scalar(
        |alpha| profile(y, lines, alpha, fixed_weight).sse,
        ALPHA_LOW,
        ALPHA_HIGH,
        GRID_POINTS,
        ALPHA_TOLERANCE,
    );
    profile(y, lines, alpha, fixed_weight)
}

fn kind_of(dynamics: Dynamics) -> MethodKind {
    match dynamics {
        // The static form has no variant of its own; its fits are labelled as the dynamic
        // method's only inside this module's tests and the reference checks.
        Dynamics::Dynamic | Dynamics::Static => MethodKind::DynamicOptimisedTheta,
    }
}

fn check(y: &[f64], dynamics: Dynamics) -> Result<(), MethodError> {
    // Three parameters (alpha, theta, l_0) and at least one error left to estimate them from.
    const NEEDED: usize = 4;
    if y.len() < NEEDED {
        return Err(MethodError::TooShort {
            method: kind_of(dynamics),
            needed: NEEDED,
            found: y.len(),
        });
    }
    Ok(())
}

/// Runs `plain` on the seasonally adjusted history when a season applies, else on the history.
fn with_season<F>(
    history: &[f64],
    season: Option<usize>,
    how: Indices,
    horizon: usize,
    plain: F,
) -> Result<Fitted, MethodError>
where
    F: Fn(&[f64]) -> Result<Fitted, MethodError>,
{
    match adjusted::applies(history, season) {
        Some(m) => adjusted::fit_adjusted(history, m, how, horizon, plain),
        None => plain(history),
    }
}

/// The dynamic optimised Theta method: season taken out when one applies, then alpha, theta and
/// `l_0` by least squares (module doc). Needs 4 observations.
pub fn dotm(
    history: &[f64],
    season: Option<usize>,
    how: Indices,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    fit_optimised(history, season, how, Dynamics::Dynamic, None, horizon)
}

/// The model with alpha and `l_0` estimated and theta estimated (`None`) or fixed in `[1, 100]`,
/// season taken out when one applies.
pub fn fit_optimised(
    history: &[f64],
    season: Option<usize>,
    how: Indices,
    dynamics: Dynamics,
    theta: Option<f64>,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    with_season(history, season, how, horizon, |y| {
        fit_plain(y, dynamics, theta, horizon)
    })
}

fn fit_plain(
    y: &[f64],
    dynamics: Dynamics,
    theta: Option<f64>,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    check(y, dynamics)?;
    let fixed_weight = match theta {
        Some(theta) if (1.0..=THETA_HIGH).contains(&theta) => Some(1.0 - 1.0 / theta),
        Some(_) => {
            return Err(MethodError::Diverged {
                method: kind_of(dynamics),
            })
        }
        None => None,
    };
    let lines = trend_lines(y, dynamics);
    let best = estimate(y, &lines, fixed_weight);
    assemble(y, &lines, dynamics, best, horizon)
}

// For the reference tests (feature `internals`).
#[cfg(feature = "internals")]
/// The model with given alpha in `(0, 1]`, theta in `[1, 100]` and `l_0` (on the adjusted
/// scale), season taken out when one applies, e.g. to reproduce a computation made elsewhere.
#[allow(clippy::too_many_arguments)] // the model's own numbers, each named
pub fn with_parameters(
    history: &[f64],
    season: Option<usize>,
    how: Indices,
    dynamics: Dynamics,
    alpha: f64,
    theta: f64,
    level0: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    with_season(history, season, how, horizon, |y| {
        plain_with_parameters(y, dynamics, alpha, theta, level0, horizon)
    })
}

#[cfg(feature = "internals")]
fn plain_with_parameters(
    y: &[f64],
    dynamics: Dynamics,
    alpha: f64,
    theta: f64,
    level0: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    check(y, dynamics)?;
    let valid = alpha > 0.0
        && alpha <= 1.0
        && (1.0..=THETA_HIGH).contains(&theta)
        && level0.is_finite();
    if !valid {
        return Err(MethodError::Diverged {
            method: kind_of(dynamics),
        });
    }
    at_parameters(y, dynamics, alpha, 1.0 - 1.0 / theta, level0, horizon)
}

/// The model at given alpha, trend weight and `l_0` on the (adjusted) series `y`.
fn at_parameters(
    y: &[f64],
    dynamics: Dynamics,
    alpha: f64,
    weight: f64,
    level0: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let lines = trend_lines(y, dynamics);
    let sse = one_step(y, &lines, alpha, level0, weight)
        .map(|(value, mu)| (value - mu).powi(2))
        .sum();
    let chosen = Profile {
        alpha,
        level0,
        weight,
        sse,
    };
    assemble(y, &lines, dynamics, chosen, horizon)
}

fn assemble(
    y: &[f64],
    lines: &Lines,
    dynamics: Dynamics,
    p: Profile,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let n = y.len();
    let decay = 1.0 - p.alpha;
    let fitted: Vec<Option<f64>> = one_step(y, lines, p.alpha, p.level0, p.weight)
        .map(|(_, mu)| Some(mu))
        .collect();
    let level_n = y
        .iter()
        .fold(p.level0, |level, &value| p.alpha * value + decay * level);
    // (1 - alpha)^n and G_{n+1} by the same recursions as the fit, so both agree to the last bit.
    let (mut c, mut g) = (1.0, 0.0);
    for _ in 0..n {
        c *= decay;
        g = 1.0 + decay * g;
    }
    let g_next = 1.0 + decay * g;
    let (a_n, b_n) = lines.last;
    let forecast = (1..=horizon)
        .map(|h| level_n + p.weight * (c * a_n + (h as f64 - 1.0 + g_next) * b_n))
        .collect();
    let theta = 1.0 / (1.0 - p.weight);
    let parameters = vec![
        Parameter {
            name: "alpha",
            value: p.alpha,
        },
        Parameter {
            name: "theta",
            value: theta,
        },
        Parameter {
            name: "l0",
            value: p.level0,
        },
        Parameter {
            name: "trend_intercept",
            value: a_n,
        },
        Parameter {
            name: "trend_slope",
            value: b_n,
        },
    ];
    Ok(
        Fitted::new(kind_of(dynamics), fitted, forecast, None, parameters)?.with_anchor(
            super::Anchor::OptimisedTheta {
                dynamics,
                alpha: p.alpha,
                weight: p.weight,
                level0: p.level0,
            },
        ),
    )
}

/// The model of an earlier fit (alpha, trend weight and `l_0` kept) over a longer history, the
/// trend lines and seasonal indices worked out again ([`super::update`]).
#[allow(clippy::too_many_arguments)] // the model's own numbers, each named
pub(crate) fn update(
    history: &[f64],
    season: Option<usize>,
    how: Indices,
    dynamics: Dynamics,
    alpha: f64,
    weight: f64,
    level0: f64,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    with_season(history, season, how, horizon, |y| {
        check(y, dynamics)?;
        at_parameters(y, dynamics, alpha, weight, level0, horizon)
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::methods::theta;
    use crate::methods::trend_season::fit_line;

    fn wave(n: usize) -> Vec<f64> {
        (0..n)
            .map(|t| 50.0 + 0.8 * t as f64 + 6.0 * (t as f64 * 0.9).sin())
            .collect()
    }

    fn parameter(f: &Fitted, name: &str) -> f64 {
        f.parameters()
            .iter()
            .find(|p| p.name == name)
            .map(|p| p.value)
            .unwrap()
    }

    // The recursion's line equals ordinary least squares on 1..t from t = 2 (the paper's claim;
    // checked here against our own least-squares fit, whose time axis starts at 0).
    #[test]
    fn recursion_is_least_squares() {
        let y = wave(17);
        for t in 2..=y.len() {
            let lines = trend_lines(&y[..t], Dynamics::Dynamic);
            let ols = fit_line(&y[..t]);
            let (a, b) = lines.last;
            assert!((b - ols.slope).abs() < 1e-12, "t {t}: {b} vs {}", ols.slope);
            assert!((a + b - ols.intercept).abs() < 1e-10, "t {t}");
        }
        let dynamic = trend_lines(&y, Dynamics::Dynamic);
        let whole = trend_lines(&y[..9], Dynamics::Dynamic).last;
        assert_eq!(dynamic.before[9], whole);
        assert_eq!(dynamic.before[0], (y[0], 0.0));
        assert_eq!(dynamic.before[1], (y[0], 0.0));
        let fixed = trend_lines(&y, Dynamics::Static);
        assert!(fixed.before.iter().all(|l| *l == dynamic.last));
    }

    // The profile is the least-squares optimum in (l_0, w): nudging either raises the SSE (w
    // only inside its bounds). Checked at an interior w and at the bound.
    #[test]
    fn profile_is_the_optimum_in_level_and_weight() {
        let y = wave(30);
        let mut interior = 0;
        for dynamics in [Dynamics::Dynamic, Dynamics::Static] {
            let lines = trend_lines(&y, dynamics);
            for alpha in [0.05, 0.4, 0.9] {
                let p = profile(&y, &lines, alpha, None);
                let sse = |l0: f64, w: f64| -> f64 {
                    one_step(&y, &lines, alpha, l0, w)
                        .map(|(v, mu)| (v - mu).powi(2))
                        .sum()
                };
                for (dl, dw) in [(0.01, 0.0), (-0.01, 0.0), (0.0, 1e-3), (0.0, -1e-3)] {
                    let w = p.weight + dw;
                    if (0.0..=weight_high()).contains(&w) {
                        assert!(sse(p.level0 + dl, w) > p.sse, "{dynamics:?} {p:?}");
                    }
                }
                if p.weight > 0.0 && p.weight < weight_high() {
                    interior += 1;
                }
            }
        }
        assert!(interior > 0);
    }

    // With theta fixed at 2 the static model's forecast is the benchmark Theta's at the same
    // alpha (module doc), once l_0 = l'_0 - w (A_n + B_n) carries the SES start. Own consistency
    // check of the algebra; the reference against statsmodels is in the integration tests. The
    // fitted alphas differ (the model's one-step forecasts carry the drift, SES's do not), so
    // each is tried at the other's.
    #[test]
    fn static_theta_two_is_the_benchmark_theta() {
        let y: Vec<f64> = wave(40)
            .iter()
            .enumerate()
            .map(|(t, v)| v + 9.0 * ((t * 7) % 5) as f64)
            .collect();
        let benchmark = theta::theta(&y, None, Indices::Classical, 8).unwrap();
        let ours =
            fit_optimised(&y, None, Indices::Classical, Dynamics::Static, Some(2.0), 8).unwrap();
        let fitted_alpha = parameter(&ours, "alpha");
        assert!((fitted_alpha - parameter(&benchmark, "alpha")).abs() > 1e-3);
        let lines = trend_lines(&y, Dynamics::Static);
        let (a_n, b_n) = lines.last;
        let alpha = parameter(&benchmark, "alpha");
        let level0 = parameter(&benchmark, "l0") - 0.5 * (a_n + b_n);
        let sse = one_step(&y, &lines, alpha, level0, 0.5)
            .map(|(v, mu)| (v - mu).powi(2))
            .sum();
        let at_benchmark = Profile {
            alpha,
            level0,
            weight: 0.5,
            sse,
        };
        let same = assemble(&y, &lines, Dynamics::Static, at_benchmark, 8).unwrap();
        for (a, b) in same.forecast().iter().zip(benchmark.forecast()) {
            assert!((a - b).abs() < 1e-9 * b.abs(), "{a} vs {b}");
        }
        // Fitted at its own criterion, the model is no worse there than at the SES alpha.
        let own = profile(&y, &lines, fitted_alpha, Some(0.5));
        assert!(own.sse <= profile(&y, &lines, alpha, Some(0.5)).sse);
    }

    // On an exact line the forecast keeps to it: theta goes to its bound, where the model
    // carries 99 % of the line's slope (a loose check of direction and level).
    #[test]
    fn straight_line_is_followed() {
        let y: Vec<f64> = (0..20).map(|t| 5.0 + 2.0 * t as f64).collect();
        let f = dotm(&y, None, Indices::Classical, 3).unwrap();
        for (h, v) in f.forecast().iter().enumerate() {
            let exact = 5.0 + 2.0 * (20 + h) as f64;
            assert!((v - exact).abs() < 0.2, "{:?}", f.forecast());
        }
    }

    // A flat series: the trend is zero, theta cannot be told apart, the forecast is the level.
    #[test]
    fn flat_series_and_short_ones() {
        let f = dotm(&[7.0; 10], None, Indices::Classical, 4).unwrap();
        assert!(f.forecast().iter().all(|v| (v - 7.0).abs() < 1e-9));
        assert_eq!(parameter(&f, "theta"), 1.0);
        assert!(matches!(
            dotm(&[1.0, 2.0, 3.0], None, Indices::Classical, 1),
            Err(MethodError::TooShort { needed: 4, .. })
        ));
        let static_half = Some(0.5);
        let classical = Indices::Classical;
        assert!(fit_optimised(&wave(10), None, classical, Dynamics::Static, static_half, 1).is_err());
    }

    // The fitted parameters never leave their bounds and extreme data stay finite or are refused.
    #[test]
    fn bounds_and_extremes() {
        for y in [
            wave(25),
            (0..25).map(|t| 1e12 * (t as f64 * 1.3).sin()).collect(),
            (0..25).map(|t| 1e-12 * (t % 4) as f64).collect(),
            vec![0.0, 0.0, 0.0, 5.0, 0.0, 0.0],
        ] {
            if let Ok(f) = dotm(&y, None, Indices::Classical, 6) {
                let alpha = parameter(&f, "alpha");
                let theta = parameter(&f, "theta");
                assert!((ALPHA_LOW..=ALPHA_HIGH).contains(&alpha));
                assert!((1.0..=THETA_HIGH + 1e-9).contains(&theta));
                assert_eq!(f.fitted().len(), y.len());
            }
        }
    }
}
