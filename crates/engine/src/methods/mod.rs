//! Forecasting methods: each fits itself to a history and forecasts a horizon.
//!
//! Kept apart from: scoring and ranking ([`crate::backtest`]), bands
//! ([`crate::bands`], which uses the analytic variances returned here when a method has
//! them) and pattern detection (the caller passes the accepted season length).
//!
//! Every method goes through [`fit`]: history in, [`Fitted`] out. Parameters are fitted by
//! [`optimize`] on the history only, so a backtest that passes the training part never lets the
//! method see the holdout.

crate::internal_modules!(
    adjusted,
    decompose,
    dotm,
    intermittent,
    optimize,
    simple,
    smoothing,
    theta,
    trend_season,
);

use std::fmt;

use decompose::FOR_FORECASTS;

/// The AICc of the smoothing fits and the choice among them, for the backtest.
pub(crate) use smoothing::criterion;

/// The candidate methods. Published methods keep their usual names.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum MethodKind {
    /// Last value repeated.
    Naive,
    /// Value of the same season position one season ago.
    SeasonalNaive,
    /// Mean of the last k values, k chosen on the history by one-step SSE.
    MovingAverage,
    /// Simple exponential smoothing (Brown 1956).
    Ses,
    /// Holt's linear trend (Holt 1957).
    Holt,
    /// Additive damped trend (Gardner & McKenzie 1985).
    DampedTrend,
    /// Holt-Winters with additive season (Winters 1960).
    HoltWintersAdditive,
    /// Holt-Winters with multiplicative season (Winters 1960).
    HoltWintersMultiplicative,
    /// Holt-Winters additive with damped trend.
    DampedHoltWintersAdditive,
    /// Holt-Winters multiplicative with damped trend.
    DampedHoltWintersMultiplicative,
    /// The Theta method as the M3/M4 benchmark (Assimakopoulos & Nikolopoulos 2000).
    Theta,
    /// Dynamic optimised Theta (Fiorucci, Pellegrini, Louzada, Petropoulos & Koehler 2016).
    DynamicOptimisedTheta,
    /// The exponential smoothing model (simple, Holt, damped, Holt-Winters) with the lowest
    /// AICc on the history (Hyndman, Koehler, Snyder & Grose 2002).
    SmoothingByAicc,
    /// Least-squares line times seasonal indices (classical decomposition, shrunk).
    TrendSeasonal,
    /// Croston's method for intermittent demand (Croston 1972).
    Croston,
    /// Syntetos-Boylan approximation (Syntetos & Boylan 2005).
    Sba,
    /// Teunter-Syntetos-Babai (Teunter, Syntetos & Babai 2011).
    Tsb,
}

impl MethodKind {
    /// Every method, in a stable order.
    pub const ALL: [MethodKind; 17] = [
        MethodKind::Naive,
        MethodKind::SeasonalNaive,
        MethodKind::MovingAverage,
        MethodKind::Ses,
        MethodKind::Holt,
        MethodKind::DampedTrend,
        MethodKind::HoltWintersAdditive,
        MethodKind::HoltWintersMultiplicative,
        MethodKind::DampedHoltWintersAdditive,
        MethodKind::DampedHoltWintersMultiplicative,
        MethodKind::Theta,
        MethodKind::DynamicOptimisedTheta,
        MethodKind::SmoothingByAicc,
        MethodKind::TrendSeasonal,
        MethodKind::Croston,
        MethodKind::Sba,
        MethodKind::Tsb,
    ];

    /// Stable machine name used in JSON and on the command line.
    pub fn key(self) -> &'static str {
        match self {
            MethodKind::Naive => "naive",
            MethodKind::SeasonalNaive => "seasonal_naive",
            MethodKind::MovingAverage => "moving_average",
            MethodKind::Ses => "ses",
            MethodKind::Holt => "holt",
            MethodKind::DampedTrend => "damped_trend",
            MethodKind::HoltWintersAdditive => "holt_winters_additive",
            MethodKind::HoltWintersMultiplicative => "holt_winters_multiplicative",
            MethodKind::DampedHoltWintersAdditive => "holt_winters_additive_damped",
            MethodKind::DampedHoltWintersMultiplicative => "holt_winters_multiplicative_damped",
            MethodKind::Theta => "theta",
            MethodKind::DynamicOptimisedTheta => "dynamic_optimised_theta",
            MethodKind::SmoothingByAicc => "smoothing_aicc",
            MethodKind::TrendSeasonal => "trend_seasonal",
            MethodKind::Croston => "croston",
            MethodKind::Sba => "sba",
            MethodKind::Tsb => "tsb",
        }
    }

    /// Name for people.
    pub fn label(self) -> &'static str {
        match self {
            MethodKind::Naive => "Naive",
            MethodKind::SeasonalNaive => "Seasonal naive",
            MethodKind::MovingAverage => "Moving average",
            MethodKind::Ses => "Simple exponential smoothing",
            MethodKind::Holt => "Holt's linear trend",
            MethodKind::DampedTrend => "Damped trend",
            MethodKind::HoltWintersAdditive => "Holt-Winters additive",
            MethodKind::HoltWintersMultiplicative => "Holt-Winters multiplicative",
            MethodKind::DampedHoltWintersAdditive => "Holt-Winters additive, damped",
            MethodKind::DampedHoltWintersMultiplicative => "Holt-Winters multiplicative, damped",
            MethodKind::Theta => "Theta",
            MethodKind::DynamicOptimisedTheta => "Dynamic optimised Theta",
            MethodKind::SmoothingByAicc => "Exponential smoothing chosen by AICc",
            MethodKind::TrendSeasonal => "Linear trend with seasonal indices",
            MethodKind::Croston => "Croston",
            MethodKind::Sba => "SBA",
            MethodKind::Tsb => "TSB",
        }
    }

    /// Parses a [`MethodKind::key`].
    pub fn from_key(key: &str) -> Option<MethodKind> {
        MethodKind::ALL.into_iter().find(|k| k.key() == key)
    }

    /// Whether the method needs an accepted season length of at least 2.
    pub fn needs_season(self) -> bool {
        matches!(
            self,
            MethodKind::SeasonalNaive
                | MethodKind::HoltWintersAdditive
                | MethodKind::HoltWintersMultiplicative
                | MethodKind::DampedHoltWintersAdditive
                | MethodKind::DampedHoltWintersMultiplicative
                | MethodKind::TrendSeasonal
        )
    }

    /// Whether the method is meant for intermittent demand (many zero periods).
    pub fn is_intermittent(self) -> bool {
        matches!(
            self,
            MethodKind::Croston | MethodKind::Sba | MethodKind::Tsb
        )
    }
}

impl fmt::Display for MethodKind {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.label())
    }
}

/// Why a method cannot be fitted to this history. Each message says what would make it fit.
#[derive(Clone, Debug, PartialEq)]
pub enum MethodError {
    /// Too few observations for the method.
    TooShort {
        /// The method.
        method: MethodKind,
        /// Observations it needs.
        needed: usize,
        /// Observations the history has.
        found: usize,
    },
    /// The method needs a season length of at least 2 and none was accepted.
    NeedsSeason {
        /// The method.
        method: MethodKind,
    },
    /// Multiplicative season needs strictly positive demand.
    NeedsPositive {
        /// The method.
        method: MethodKind,
    },
    /// Intermittent methods need at least one non-zero demand.
    NoDemand {
        /// The method.
        method: MethodKind,
    },
    /// The fit produced non-finite numbers (the data are too extreme for the method).
    Diverged {
        /// The method.
        method: MethodKind,
    },
}

impl fmt::Display for MethodError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            MethodError::TooShort {
                method,
                needed,
                found,
            } => write!(
                f,
                "{method} needs at least {needed} periods of history, this item has {found}"
            ),
            MethodError::NeedsSeason { method } => write!(
                f,
                "{method} needs a season length of 2 or more; none was detected (set one to use it)"
            ),
            MethodError::NeedsPositive { method } => write!(
                f,
                "{method} needs every period's demand above zero; this item has zeros or returns"
            ),
            MethodError::NoDemand { method } => {
                write!(
                    f,
                    "{method} needs at least one period with demand above zero"
                )
            }
            MethodError::Diverged { method } => write!(
                f,
                "{method} could not be fitted: its numbers ran out of range on this item"
            ),
        }
    }
}

impl std::error::Error for MethodError {}

/// A named fitted parameter or initial state, for display (e.g. "alpha", "l0").
#[derive(Clone, Debug, PartialEq)]
pub struct Parameter {
    /// Its name as printed (e.g. "alpha").
    pub name: &'static str,
    /// Its fitted value.
    pub value: f64,
}

/// A method fitted to a history.
///
/// Invariants: `fitted.len()` equals the history length; `forecast.len()` equals the requested
/// horizon; `variance`, when present, has one positive entry per horizon step.
#[derive(Clone, Debug, PartialEq)]
pub struct Fitted {
    kind: MethodKind,
    fitted: Vec<Option<f64>>,
    forecast: Vec<f64>,
    variance: Option<Vec<f64>>,
    parameters: Vec<Parameter>,
    /// What [`update`] reuses of this fit, for the methods that can be updated.
    anchor: Option<Anchor>,
}

impl Fitted {
    /// Assembles a fit. Methods call this; checks the invariants in debug builds.
    pub fn new(
        kind: MethodKind,
        fitted: Vec<Option<f64>>,
        forecast: Vec<f64>,
        variance: Option<Vec<f64>>,
        parameters: Vec<Parameter>,
    ) -> Result<Fitted, MethodError> {
        let finite = forecast.iter().all(|v| v.is_finite())
            && fitted.iter().flatten().all(|v| v.is_finite())
            && variance
                .as_ref()
                .is_none_or(|v| v.iter().all(|x| x.is_finite() && *x >= 0.0));
        if !finite {
            return Err(MethodError::Diverged { method: kind });
        }
        Ok(Fitted {
            kind,
            fitted,
            forecast,
            variance,
            parameters,
            anchor: None,
        })
    }

    /// Keeps what [`update`] needs of this fit.
    pub(crate) fn with_anchor(mut self, anchor: Anchor) -> Fitted {
        self.anchor = Some(anchor);
        self
    }

    /// Carries over the [`smoothing::Anchor`] of the fit this one was built from.
    pub(crate) fn with_anchor_of(mut self, inner: &Fitted) -> Fitted {
        self.anchor = inner.anchor.clone();
        self
    }

    /// The method fitted.
    pub fn kind(&self) -> MethodKind {
        self.kind
    }
    /// One-step-ahead in-sample forecasts, aligned with the history; `None` where the method
    /// has no forecast yet (e.g. the first period of the naive method).
    pub fn fitted(&self) -> &[Option<f64>] {
        &self.fitted
    }
    /// Point forecasts for steps 1..=horizon after the history.
    pub fn forecast(&self) -> &[f64] {
        &self.forecast
    }
    /// Analytic h-step forecast-error variances (Hyndman, Koehler, Ord & Snyder 2005) where the
    /// method's model has them; an exponential smoothing [`update`] has none (only its
    /// forecast is read).
    pub fn variance(&self) -> Option<&[f64]> {
        self.variance.as_deref()
    }
    /// The fitted parameters and initial states, for display.
    pub fn parameters(&self) -> &[Parameter] {
        &self.parameters
    }
    /// One-step in-sample errors e_t = F_t - D_t where a fitted value exists.
    pub fn residuals(&self, history: &[f64]) -> Vec<f64> {
        self.fitted
            .iter()
            .zip(history)
            .filter_map(|(f, d)| f.map(|f| f - d))
            .collect()
    }
}

/// Fits `kind` to `history` and forecasts `horizon` steps. `season_length` is the accepted
/// season length (`None` or 1: no season). With a season, SES, Holt's and damped trend run on
/// the seasonally adjusted series ([`adjusted`]), as in the M3/M4 benchmarks; Theta and the
/// dynamic optimised Theta adjust themselves; the other methods model the season directly or
/// ignore it.
pub fn fit(
    kind: MethodKind,
    history: &[f64],
    season_length: Option<usize>,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let season = season_length.filter(|m| *m >= 2);
    if kind.needs_season() && season.is_none() {
        return Err(MethodError::NeedsSeason { method: kind });
    }
    match kind {
        MethodKind::Naive => simple::naive(history, horizon),
        MethodKind::SeasonalNaive => simple::seasonal_naive(history, season.unwrap_or(1), horizon),
        MethodKind::MovingAverage => simple::moving_average(history, horizon),
        MethodKind::Ses | MethodKind::Holt | MethodKind::DampedTrend => {
            match adjusted::applies(history, season) {
                Some(m) => adjusted::fit_adjusted(history, m, FOR_FORECASTS, horizon, |y| {
                    smoothing::fit(kind, y, None, horizon)
                }),
                None => smoothing::fit(kind, history, None, horizon),
            }
        }
        MethodKind::HoltWintersAdditive
        | MethodKind::HoltWintersMultiplicative
        | MethodKind::DampedHoltWintersAdditive
        | MethodKind::DampedHoltWintersMultiplicative => {
            smoothing::fit(kind, history, season, horizon)
        }
        MethodKind::Theta => theta::theta(history, season, FOR_FORECASTS, horizon),
        MethodKind::DynamicOptimisedTheta => dotm::dotm(history, season, FOR_FORECASTS, horizon),
        MethodKind::SmoothingByAicc => smoothing::criterion::fit_by_aicc(history, season, horizon),
        MethodKind::TrendSeasonal => {
            trend_season::trend_seasonal(history, season.unwrap_or(1), FOR_FORECASTS, horizon)
        }
        MethodKind::Croston | MethodKind::Sba | MethodKind::Tsb => {
            intermittent::fit(kind, history, horizon)
        }
    }
}

/// Fits `earlier`'s method to `history`, which extends the history of `earlier` by a period or
/// so (the caller keeps it that way round, so a start never carries data the fit must not
/// see), with the search started from its parameters: for the Holt-Winters methods the
/// multi-start stage is skipped ([`smoothing::fit_near`]); every other method is fitted
/// afresh. The backtest's origins after the earliest use it. Measured on the M3 data (README, Speed): the
/// plan 5.0 -> 4.1-4.3 ms; warm starts for the non-seasonal smoothing methods too cost 0.1
/// sMAPE on the yearly series (other optima found), and for the band's refits they widened
/// the quarterly bands by 2 points at 80 %, so neither is done.
pub(crate) fn fit_near(
    earlier: &Fitted,
    history: &[f64],
    season_length: Option<usize>,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let kind = earlier.kind;
    let season = season_length.filter(|m| *m >= 2);
    match &earlier.anchor {
        Some(Anchor::Smoothing(anchor)) if kind.needs_season() => {
            smoothing::fit_near(kind, anchor, history, season, horizon)
        }
        _ => fit(kind, history, season_length, horizon),
    }
}

/// Psi-weights ψ_0 = 1, ψ_1, ..., ψ_{horizon-1} of a fit: the h-step error of its forecast is
/// sum_j ψ_j ε_{t+h-j} in the one-step errors ε after the origin, under the model the method
/// stands for (Hyndman, Koehler, Ord & Snyder 2005, IJF 21, error-correction form; from memory
/// for the simpler methods):
///
/// ```text
///   exponential smoothing   ψ_j = α (1 + β (φ + ... + φ^j)) + γ (1 − α) [j a multiple of m]
///                           (β, γ in the component form the fits report: the state-space
///                           trend weight is αβ, the seasonal one γ(1 − α); φ = 1 undamped)
///   Theta models, Croston, SBA, TSB   ψ_j = α (simple smoothing with a drift or of sizes)
///   naive                   ψ_j = 1;  seasonal naive  ψ_j = 1 at multiples of m, else 0
///   moving average of w     ψ_j = 1 / w
///   linear trend with seasonal indices   ψ_j = 0 (a fixed line: nothing carries over)
/// ```
///
/// Used to count how much the band's overlapping errors share ([`crate::bands::effective_count`]).
pub fn psi_weights(f: &Fitted, season: Option<usize>, horizon: usize) -> Vec<f64> {
    let get = |name: &str| {
        f.parameters
            .iter()
            .find(|p| p.name == name)
            .map(|p| p.value)
    };
    let alpha = get("alpha").unwrap_or(1.0);
    let m = season.filter(|m| *m >= 2).unwrap_or(0);
    let at_season = |j: usize| m > 0 && j % m == 0;
    let weight = |j: usize| match f.kind {
        MethodKind::Naive => 1.0,
        MethodKind::SeasonalNaive => f64::from(u8::from(at_season(j))),
        MethodKind::MovingAverage => 1.0 / get("window").unwrap_or(1.0).max(1.0),
        MethodKind::TrendSeasonal => 0.0,
        MethodKind::Ses
        | MethodKind::Holt
        | MethodKind::DampedTrend
        | MethodKind::HoltWintersAdditive
        | MethodKind::HoltWintersMultiplicative
        | MethodKind::DampedHoltWintersAdditive
        | MethodKind::DampedHoltWintersMultiplicative
        | MethodKind::SmoothingByAicc => {
            let beta = get("beta").unwrap_or(0.0);
            let phi = get("phi").unwrap_or(1.0);
            let damped: f64 = (1..=j).map(|i| phi.powi(i as i32)).sum();
            let seasonal = match get("gamma") {
                Some(gamma) if at_season(j) => gamma * (1.0 - alpha),
                _ => 0.0,
            };
            alpha * (1.0 + beta * damped) + seasonal
        }
        MethodKind::Theta
        | MethodKind::DynamicOptimisedTheta
        | MethodKind::Croston
        | MethodKind::Sba
        | MethodKind::Tsb => alpha,
    };
    (0..horizon.max(1))
        .map(|j| if j == 0 { 1.0 } else { weight(j) })
        .collect()
}

/// What [`update`] keeps of a fit: the fitted parameters and starting states, without the
/// parts that are recomputed from the longer history (states run on, trend lines and seasonal
/// indices worked out again).
#[derive(Clone, Debug, PartialEq)]
pub(crate) enum Anchor {
    /// A smoothing fit's model, parameters and initial states.
    Smoothing(smoothing::Anchor),
    /// Theta's smoothing constant and initial level.
    Theta { alpha: f64, level0: f64 },
    /// The optimised Theta models' smoothing constant, trend weight and initial level.
    OptimisedTheta {
        dynamics: dotm::Dynamics,
        alpha: f64,
        weight: f64,
        level0: f64,
    },
}

/// Forecasts `horizon` steps after `history` with the model of `earlier`, a fit of the same
/// method to a prefix of `history`: its parameters and initial states are kept and only the
/// recursion runs over the longer history (rolling-origin updating, Tashman 2000, IJF 16,
/// from memory); trend lines and seasonal indices are recomputed. Methods without an
/// [`Anchor`], cheap to fit, are fitted afresh. Used for the band's many rolling origins
/// ([`crate::backtest::rolling_errors`]), where a fit at each origin would cost ten times more.
pub(crate) fn update(
    earlier: &Fitted,
    history: &[f64],
    season_length: Option<usize>,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let kind = earlier.kind;
    let season = season_length.filter(|m| *m >= 2);
    match &earlier.anchor {
        None => fit(kind, history, season_length, horizon),
        Some(Anchor::Smoothing(anchor)) => match kind {
            MethodKind::Ses | MethodKind::Holt | MethodKind::DampedTrend => {
                match adjusted::applies(history, season) {
                    Some(m) => adjusted::fit_adjusted(history, m, FOR_FORECASTS, horizon, |y| {
                        smoothing::update(kind, anchor, y, horizon)
                    }),
                    None => smoothing::update(kind, anchor, history, horizon),
                }
            }
            _ => smoothing::update(kind, anchor, history, horizon),
        },
        Some(Anchor::Theta { alpha, level0 }) => {
            theta::theta_with_smoothing(history, season, FOR_FORECASTS, *alpha, *level0, horizon)
        }
        Some(Anchor::OptimisedTheta {
            dynamics,
            alpha,
            weight,
            level0,
        }) => dotm::update(
            history,
            season,
            FOR_FORECASTS,
            *dynamics,
            *alpha,
            *weight,
            *level0,
            horizon,
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Updating a fit over its own history reproduces it; over a longer one, it keeps its
    /// parameters (alpha and the starting level, and theta for the optimised models).
    #[test]
    fn updates_reproduce_the_fit_and_keep_the_parameters() {
        let y: Vec<f64> = (0..48)
            .map(|t| 100.0 + 1.5 * t as f64 + 12.0 * ((t % 12) as f64 - 5.5).abs() + (t % 5) as f64)
            .collect();
        for kind in [
            MethodKind::Ses,
            MethodKind::DampedTrend,
            MethodKind::HoltWintersMultiplicative,
            MethodKind::Theta,
            MethodKind::DynamicOptimisedTheta,
        ] {
            for season in [None, Some(12)] {
                let Ok(earlier) = fit(kind, &y[..40], season, 6) else {
                    continue;
                };
                assert!(
                    earlier.anchor.is_some(),
                    "{kind:?} keeps what updating needs"
                );
                let same = update(&earlier, &y[..40], season, 6).unwrap();
                for (a, b) in same.forecast().iter().zip(earlier.forecast()) {
                    assert!(
                        (a - b).abs() <= 1e-9 * b.abs(),
                        "{kind:?} {season:?}: {a} vs {b}"
                    );
                }
                let later = update(&earlier, &y, season, 6).unwrap();
                let kept = |f: &Fitted, name: &str| {
                    f.parameters()
                        .iter()
                        .find(|p| p.name == name)
                        .map(|p| p.value)
                };
                for name in ["alpha", "theta", "l0"] {
                    assert_eq!(kept(&later, name), kept(&earlier, name), "{kind:?} {name}");
                }
                assert_eq!(later.fitted().len(), 48);
            }
        }
    }
}
