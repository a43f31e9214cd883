//! The shape of an exponential smoothing model (trend, damping, season) and its numbers
//! (smoothing parameters, states).
//!
//! Kept apart from: running the recursion ([`super::recursion`]), choosing the numbers
//! ([`super::estimate`], [`super::init`]) and forecast variances ([`super::variance`]). This module
//! only describes and validates.

use std::fmt;

use crate::methods::MethodKind;

/// How the season enters the forecast.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Season {
    /// No seasonal component.
    None,
    /// Seasonal states are added to level plus trend; the payload is the season length m >= 2.
    Additive(usize),
    /// Seasonal states multiply level plus trend; the payload is the season length m >= 2.
    Multiplicative(usize),
}

impl Season {
    /// Season length m, or 0 without a season.
    pub fn period(self) -> usize {
        match self {
            Season::None => 0,
            Season::Additive(m) | Season::Multiplicative(m) => m,
        }
    }
}

/// A model of the family: level, optional additive (possibly damped) trend, optional season.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Model {
    trend: bool,
    damped: bool,
    season: Season,
}

/// Why a model, its parameters or its states were rejected. These are caller mistakes, not data
/// problems: each message says what to pass instead.
#[derive(Clone, Debug, PartialEq)]
pub enum ModelError {
    /// A damped model needs a trend to damp.
    DampedWithoutTrend,
    /// Season lengths below 2 mean "no season"; use [`Season::None`].
    SeasonTooShort { period: usize },
    /// The seasonal initial states must have one value per season position.
    SeasonalStatesLength { expected: usize, found: usize },
    /// A parameter or state was NaN or infinite.
    NotFinite { what: &'static str },
}

impl fmt::Display for ModelError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ModelError::DampedWithoutTrend => {
                write!(f, "a damped model needs a trend; set trend or drop damping")
            }
            ModelError::SeasonTooShort { period } => write!(
                f,
                "season length {period} is too short; use 2 or more, or no season"
            ),
            ModelError::SeasonalStatesLength { expected, found } => write!(
                f,
                "expected {expected} seasonal initial states (one per season position), got {found}"
            ),
            ModelError::NotFinite { what } => {
                write!(f, "{what} must be a finite number")
            }
        }
    }
}

impl std::error::Error for ModelError {}

impl Model {
    /// Validates the combination: damping needs a trend, a season needs m >= 2.
    pub fn new(trend: bool, damped: bool, season: Season) -> Result<Model, ModelError> {
        if damped && !trend {
            return Err(ModelError::DampedWithoutTrend);
        }
        if let Season::Additive(m) | Season::Multiplicative(m) = season {
            if m < 2 {
                return Err(ModelError::SeasonTooShort { period: m });
            }
        }
        Ok(Model {
            trend,
            damped,
            season,
        })
    }

    /// The model behind a [`MethodKind`] of this family; `None` for other kinds or for a
    /// seasonal kind without a season length of at least 2.
    pub fn for_kind(kind: MethodKind, season: Option<usize>) -> Option<Model> {
        let m = season.filter(|m| *m >= 2);
        let (trend, damped, season) = match kind {
            MethodKind::Ses => (false, false, Season::None),
            MethodKind::Holt => (true, false, Season::None),
            MethodKind::DampedTrend => (true, true, Season::None),
            MethodKind::HoltWintersAdditive => (true, false, Season::Additive(m?)),
            MethodKind::HoltWintersMultiplicative => (true, false, Season::Multiplicative(m?)),
            MethodKind::DampedHoltWintersAdditive => (true, true, Season::Additive(m?)),
            MethodKind::DampedHoltWintersMultiplicative => (true, true, Season::Multiplicative(m?)),
            _ => return None,
        };
        Model::new(trend, damped, season).ok()
    }

    pub fn has_trend(self) -> bool {
        self.trend
    }
    pub fn is_damped(self) -> bool {
        self.damped
    }
    pub fn season(self) -> Season {
        self.season
    }
    /// Season length m, or 0 without a season.
    pub fn period(self) -> usize {
        self.season.period()
    }
    pub fn is_multiplicative(self) -> bool {
        matches!(self.season, Season::Multiplicative(_))
    }

    /// Number of smoothing parameters the model fits: alpha, plus beta with a trend, gamma with
    /// a season, phi when damped.
    pub fn smoothing_count(self) -> usize {
        1 + usize::from(self.trend) + usize::from(self.period() > 0) + usize::from(self.damped)
    }

    /// Number of free initial states: l0, b0 with a trend, and m - 1 seasonal states (the last
    /// is implied by the normalisation, sum 0 or mean 1).
    pub fn free_state_count(self) -> usize {
        1 + usize::from(self.trend) + self.period().saturating_sub(1)
    }
}

/// Smoothing parameters in the convention of [`super::recursion`] (statsmodels' form).
///
/// `beta` is the trend smoothing of b_t = beta (l_t - l_{t-1}) + (1 - beta) phi b_{t-1}; the
/// state-space (error-correction) trend parameter is alpha * beta. `gamma` is the same in both
/// forms. Unused parameters are ignored: beta without a trend, gamma without a season, phi
/// without damping (taken as 1).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Parameters {
    pub alpha: f64,
    pub beta: f64,
    pub gamma: f64,
    pub phi: f64,
}

impl Parameters {
    /// The values the recursion uses for `model`: zero for unused smoothing, phi = 1 undamped.
    pub fn effective(self, model: Model) -> Parameters {
        Parameters {
            alpha: self.alpha,
            beta: if model.has_trend() { self.beta } else { 0.0 },
            gamma: if model.period() > 0 { self.gamma } else { 0.0 },
            phi: if model.is_damped() { self.phi } else { 1.0 },
        }
    }

    pub(crate) fn check(self, model: Model) -> Result<(), ModelError> {
        let p = self.effective(model);
        for (what, v) in [
            ("alpha", p.alpha),
            ("beta", p.beta),
            ("gamma", p.gamma),
            ("phi", p.phi),
        ] {
            if !v.is_finite() {
                return Err(ModelError::NotFinite { what });
            }
        }
        Ok(())
    }
}

/// States of the model at one time: level l, trend b, and the last m seasonal states.
///
/// As initial states (before y_1): `seasonal[j]` applies to observation j + 1, i.e. it is
/// s_{j+1-m}. As final states (after y_n): `seasonal` is s_{n-m+1}, ..., s_n in time order.
/// `trend` is 0 and `seasonal` empty when the model has none.
#[derive(Clone, Debug, PartialEq)]
pub struct States {
    pub level: f64,
    pub trend: f64,
    pub seasonal: Vec<f64>,
}

impl States {
    pub(crate) fn check(&self, model: Model) -> Result<(), ModelError> {
        let m = model.period();
        if self.seasonal.len() != m {
            return Err(ModelError::SeasonalStatesLength {
                expected: m,
                found: self.seasonal.len(),
            });
        }
        if !self.level.is_finite() {
            return Err(ModelError::NotFinite { what: "level" });
        }
        if !self.trend.is_finite() {
            return Err(ModelError::NotFinite { what: "trend" });
        }
        if self.seasonal.iter().any(|s| !s.is_finite()) {
            return Err(ModelError::NotFinite {
                what: "seasonal state",
            });
        }
        Ok(())
    }
}
