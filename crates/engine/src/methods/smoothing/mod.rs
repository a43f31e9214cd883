//! Exponential smoothing family: simple, Holt's linear trend, damped trend and Holt-Winters
//! (additive or multiplicative season, optionally damped).
//!
//! Kept apart from: other methods, scoring and bands. Layout:
//!
//! * [`model`]: model shape, parameters, states;
//! * [`recursion`]: the recursion with GIVEN parameters and initial states (statsmodels 0.15.0
//!   convention, formulas there);
//! * [`init`]: heuristic and simple starting states;
//! * [`estimate`] with [`state_solve`]: fitting by SSE minimisation;
//! * [`variance`]: analytic h-step variances for the additive-error linear models;
//! * [`criterion`]: the AICc under additive and multiplicative errors.
//!
//! Decisions documented here:
//!
//! * Minimum history: SES 2 points, trend models 3, seasonal models 2 full seasons (2m), so
//!   each season position is seen twice and each trend has a change to learn from.
//! * Multiplicative seasons need every value > 0 ([`MethodError::NeedsPositive`]).
//! * σ² = SSE / (n − k), k = smoothing parameters + free initial states (l0, b0, m − 1
//!   seasonal). With n ≤ k no degrees of freedom are left and the variance is `None`.
//! * Speed: the objective allocates nothing and its loop-carried dependency is short (see
//!   [`recursion`]); the seven variants on 60 monthly points take 2-3 ms on the loaded shared
//!   development machine (ignored test `seven_variants_on_sixty_months_are_fast`).
//! * [`Fitted::parameters`] lists α, β, γ, φ (as used by the recursion), l0 and b0; the
//!   seasonal initial states are in [`Fit::estimate`].

pub mod criterion;
pub mod estimate;
pub mod init;
pub mod model;
pub mod recursion;
mod state_solve;
#[cfg(test)]
mod tests;
pub mod variance;

pub use estimate::{Estimate, FitSettings};
#[cfg(feature = "internals")]
pub use estimate::{estimate, ParameterBounds};
pub use model::Model;
#[cfg(feature = "internals")]
pub use model::{ModelError, Parameters, Season, States};
pub use recursion::Run;
#[cfg(feature = "internals")]
pub use recursion::run;

use super::{Fitted, MethodError, MethodKind, Parameter};

/// The methods this module fits, simplest first: the models the AICc chooses among
/// ([`criterion`]), and the list the tests here and the reference tests go through.
pub const KINDS: [MethodKind; 7] = [
    MethodKind::Ses,
    MethodKind::Holt,
    MethodKind::DampedTrend,
    MethodKind::HoltWintersAdditive,
    MethodKind::HoltWintersMultiplicative,
    MethodKind::DampedHoltWintersAdditive,
    MethodKind::DampedHoltWintersMultiplicative,
];

/// A model fitted to a history, with everything the tests and callers may inspect.
#[derive(Clone, Debug, PartialEq)]
pub struct Fit {
    pub model: Model,
    pub estimate: Estimate,
    /// The recursion at the estimate: fitted values, SSE, final states, forecasts.
    pub run: Run,
    /// σ² = SSE / (n − k); `None` when n ≤ k.
    pub sigma2: Option<f64>,
    /// v_h for h = 1..horizon; `None` for multiplicative seasons, without σ², or for an
    /// [`update`].
    pub variance: Option<Vec<f64>>,
}

/// Shortest history `model` accepts (see the module doc).
pub fn minimum_length(model: Model) -> usize {
    match model.period() {
        0 if model.has_trend() => 3,
        0 => 2,
        m => 2 * m,
    }
}

/// Checks the history for `model` (length, finiteness, positivity), fits it and forecasts.
pub fn fit_model(
    kind: MethodKind,
    model: Model,
    history: &[f64],
    horizon: usize,
    settings: &FitSettings,
) -> Result<Fit, MethodError> {
    fit_model_from(kind, model, history, horizon, settings, None)
}

/// [`fit_model`] with the search started from an earlier fit ([`estimate::estimate_from`]).
fn fit_model_from(
    kind: MethodKind,
    model: Model,
    history: &[f64],
    horizon: usize,
    settings: &FitSettings,
    start: Option<&Anchor>,
) -> Result<Fit, MethodError> {
    let needed = minimum_length(model);
    if history.len() < needed {
        return Err(MethodError::TooShort {
            method: kind,
            needed,
            found: history.len(),
        });
    }
    if history.iter().any(|v| !v.is_finite()) {
        return Err(MethodError::Diverged { method: kind });
    }
    if model.is_multiplicative() && history.iter().any(|v| *v <= 0.0) {
        return Err(MethodError::NeedsPositive { method: kind });
    }
    let start = start.map(|a| (a.parameters, &a.initial));
    let estimate = estimate::estimate_from(model, history, settings, start);
    let run = recursion::run(
        model,
        estimate.parameters,
        &estimate.initial,
        history,
        horizon,
    )
    .map_err(|_| MethodError::Diverged { method: kind })?;
    if !run.sse.is_finite() {
        return Err(MethodError::Diverged { method: kind });
    }
    Ok(finish(model, estimate, run, horizon))
}

/// Entry point used by [`crate::methods::fit`] for the seven smoothing kinds.
pub fn fit(
    kind: MethodKind,
    history: &[f64],
    season: Option<usize>,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let model = match Model::for_kind(kind, season) {
        Some(model) => model,
        None if kind.needs_season() => return Err(MethodError::NeedsSeason { method: kind }),
        None => return Err(MethodError::Diverged { method: kind }),
    };
    let fit = fit_model(kind, model, history, horizon, &FitSettings::default())?;
    to_fitted(kind, fit)
}

/// Fits `kind` to `history` starting from `anchor`, an earlier fit of the same model to a
/// history a few periods longer or shorter ([`estimate::estimate_from`]); a fit from scratch
/// when the model differs.
pub fn fit_near(
    kind: MethodKind,
    anchor: &Anchor,
    history: &[f64],
    season: Option<usize>,
    horizon: usize,
) -> Result<Fitted, MethodError> {
    match Model::for_kind(kind, season) {
        Some(model) if model == anchor.model => {
            let settings = FitSettings::default();
            let fit = fit_model_from(kind, model, history, horizon, &settings, Some(anchor))?;
            to_fitted(kind, fit)
        }
        _ => fit(kind, history, season, horizon),
    }
}

/// Runs the recursion of an earlier fit of `kind` (its smoothing parameters and initial states
/// held fixed) over `history`, which extends the history of that fit, and forecasts `horizon`
/// steps: rolling-origin updating rather than recalibration (Tashman 2000, IJF 16, from memory),
/// thousands of times cheaper than a fit. The caller ([`crate::methods::update`]) falls back to
/// a fit where the earlier fit is not a smoothing fit.
pub fn update(
    kind: MethodKind,
    anchor: &Anchor,
    history: &[f64],
    horizon: usize,
) -> Result<Fitted, MethodError> {
    let model = anchor.model;
    if history.len() < minimum_length(model) {
        return Err(MethodError::TooShort {
            method: kind,
            needed: minimum_length(model),
            found: history.len(),
        });
    }
    if history.iter().any(|v| !v.is_finite()) {
        return Err(MethodError::Diverged { method: kind });
    }
    if model.is_multiplicative() && history.iter().any(|v| *v <= 0.0) {
        return Err(MethodError::NeedsPositive { method: kind });
    }
    let run = recursion::run(model, anchor.parameters, &anchor.initial, history, horizon)
        .map_err(|_| MethodError::Diverged { method: kind })?;
    if !run.sse.is_finite() {
        return Err(MethodError::Diverged { method: kind });
    }
    let estimate = Estimate {
        parameters: anchor.parameters,
        initial: anchor.initial.clone(),
        sse: run.sse,
        evaluations: 0,
    };
    // No analytic variances: an update serves the band's rolling origins, which use its
    // forecast alone (1.6 % of the command line's instructions went to them).
    let fit = Fit {
        model,
        estimate,
        run,
        sigma2: None,
        variance: None,
    };
    to_fitted(kind, fit)
}

/// What [`update`] keeps of a fit: the model, its smoothing parameters and initial states.
#[derive(Clone, Debug, PartialEq)]
pub struct Anchor {
    model: Model,
    parameters: model::Parameters,
    initial: model::States,
}

/// σ² and the analytic variances of a recursion run at an estimate.
fn finish(model: Model, estimate: Estimate, run: Run, horizon: usize) -> Fit {
    let n = run.fitted.len();
    let k = model.smoothing_count() + model.free_state_count();
    let sigma2 = (n > k).then(|| run.sse / (n - k) as f64);
    let variance =
        sigma2.and_then(|s2| variance::forecast_variances(model, estimate.parameters, s2, horizon));
    Fit {
        model,
        estimate,
        run,
        sigma2,
        variance,
    }
}

/// The [`Fitted`] of a smoothing fit, with its [`Anchor`] for later updates.
fn to_fitted(kind: MethodKind, fit: Fit) -> Result<Fitted, MethodError> {
    let model = fit.model;
    let p = fit.estimate.parameters.effective(model);
    let mut parameters = vec![Parameter {
        name: "alpha",
        value: p.alpha,
    }];
    if model.has_trend() {
        parameters.push(Parameter {
            name: "beta",
            value: p.beta,
        });
    }
    if model.period() > 0 {
        parameters.push(Parameter {
            name: "gamma",
            value: p.gamma,
        });
    }
    if model.is_damped() {
        parameters.push(Parameter {
            name: "phi",
            value: p.phi,
        });
    }
    parameters.push(Parameter {
        name: "l0",
        value: fit.estimate.initial.level,
    });
    if model.has_trend() {
        parameters.push(Parameter {
            name: "b0",
            value: fit.estimate.initial.trend,
        });
    }
    let anchor = Anchor {
        model,
        parameters: fit.estimate.parameters,
        initial: fit.estimate.initial.clone(),
    };
    Ok(Fitted::new(
        kind,
        fit.run.fitted.into_iter().map(Some).collect(),
        fit.run.forecast,
        fit.variance,
        parameters,
    )?
    .with_anchor(super::Anchor::Smoothing(anchor)))
}
