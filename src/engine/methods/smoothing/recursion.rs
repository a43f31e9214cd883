//! The smoothing recursion with given parameters and initial states: one-step fitted values,
//! SSE, final states and forecasts.
//!
//! Kept apart from: how parameters and initial states are chosen ([`super::estimate`]). The
//! convention is exactly that of statsmodels 0.15.0's `ExponentialSmoothing` (checked to 1e-9
//! against tests/fixtures/refs/fixed_params_reference.json):
//!
//! * states l_0, b_0 come before y_1; seasonal initial state `s0[j]` applies to y_{j+1};
//! * fitted  ŷ_t = (l_{t-1} + φ b_{t-1}) (+ or ×) s_{t-m};
//! * level   l_t = α (y_t (− or ÷) s_{t-m}) + (1 − α)(l_{t-1} + φ b_{t-1});
//! * trend   b_t = β (l_t − l_{t-1}) + (1 − β) φ b_{t-1};
//! * season  s_t = γ (y_t (− or ÷) (l_{t-1} + φ b_{t-1})) + (1 − γ) s_{t-m} (the PRIOR level
//!   plus trend);
//! * forecast ŷ_{n+h} = (l_n + (φ + … + φ^h) b_n) (+ or ×) s_{n+h−m⌈h/m⌉};
//! * SSE = Σ_{t=1..n} (y_t − ŷ_t)², t = 1 included.
//!
//! Without a trend b ≡ 0 and β = 0; without damping φ = 1; without a season the seasonal terms
//! vanish.

use super::model::{Model, ModelError, Parameters, Season, States};

/// Everything the recursion yields for one history.
#[derive(Clone, Debug, PartialEq)]
pub struct Run {
    /// ŷ_t for t = 1..n.
    pub fitted: Vec<f64>,
    /// Σ (y_t − ŷ_t)².
    pub sse: f64,
    /// l_n, b_n and s_{n−m+1..n} in time order.
    pub final_states: States,
    /// ŷ_{n+h} for h = 1..horizon.
    pub forecast: Vec<f64>,
}

#[derive(Clone, Copy)]
enum SeasonForm {
    None,
    Additive,
    Multiplicative,
}

fn form(model: Model) -> SeasonForm {
    match model.season() {
        Season::None => SeasonForm::None,
        Season::Additive(_) => SeasonForm::Additive,
        Season::Multiplicative(_) => SeasonForm::Multiplicative,
    }
}

/// One observation: returns ŷ_t and moves (level, trend, season slot) from t−1 to t.
/// `slot` holds s_{t−m} on entry and s_t on exit.
#[inline(always)]
fn step(
    form: SeasonForm,
    p: &Parameters,
    y: f64,
    level: &mut f64,
    trend: &mut f64,
    slot: &mut f64,
) -> f64 {
    let base = *level + p.phi * *trend;
    let (fitted, new_level) = match form {
        SeasonForm::None => (base, p.alpha * y + (1.0 - p.alpha) * base),
        SeasonForm::Additive => {
            let s = *slot;
            *slot = p.gamma * (y - base) + (1.0 - p.gamma) * s;
            (base + s, p.alpha * (y - s) + (1.0 - p.alpha) * base)
        }
        SeasonForm::Multiplicative => {
            let s = *slot;
            *slot = p.gamma * (y / base) + (1.0 - p.gamma) * s;
            (base * s, p.alpha * (y / s) + (1.0 - p.alpha) * base)
        }
    };
    *trend = p.beta * (new_level - *level) + (1.0 - p.beta) * p.phi * *trend;
    *level = new_level;
    fitted
}

/// Runs the recursion over `history` with `parameters` and `initial` states and forecasts
/// `horizon` steps. Parameters are used as given (no bounds), so fixed-parameter references can
/// be reproduced; unused ones are ignored (see [`Parameters::effective`]).
pub fn run(
    model: Model,
    parameters: Parameters,
    initial: &States,
    history: &[f64],
    horizon: usize,
) -> Result<Run, ModelError> {
    parameters.check(model)?;
    initial.check(model)?;
    let p = parameters.effective(model);
    let form = form(model);
    let m = model.period();
    let mut level = initial.level;
    let mut trend = if model.has_trend() { initial.trend } else { 0.0 };
    let mut ring = initial.seasonal.clone();
    let mut dummy = 0.0;
    let mut fitted = Vec::with_capacity(history.len());
    let mut sse = 0.0;
    let mut j = 0usize;
    for &y in history {
        let slot = if m > 0 { &mut ring[j] } else { &mut dummy };
        let f = step(form, &p, y, &mut level, &mut trend, slot);
        sse += (y - f) * (y - f);
        fitted.push(f);
        if m > 0 {
            j += 1;
            if j == m {
                j = 0;
            }
        }
    }
    // The ring holds s_{n-m+1} at index n mod m (= j now); rotate into time order.
    ring.rotate_left(j);
    let final_states = States {
        level,
        trend,
        seasonal: ring,
    };
    let forecast = forecast(model, p, &final_states, horizon);
    Ok(Run {
        fitted,
        sse,
        final_states,
        forecast,
    })
}

/// ŷ_{n+h} = (l_n + (φ + … + φ^h) b_n) (+ or ×) s_{n+h−m⌈h/m⌉}, h = 1..horizon, from final
/// states (seasonal in time order, so the seasonal index is (h − 1) mod m).
pub(crate) fn forecast(model: Model, p: Parameters, last: &States, horizon: usize) -> Vec<f64> {
    let m = model.period();
    let mut damping_sum = 0.0;
    let mut phi_power = 1.0;
    (1..=horizon)
        .map(|h| {
            phi_power *= p.phi;
            damping_sum += phi_power;
            let base = last.level + damping_sum * last.trend;
            match form(model) {
                SeasonForm::None => base,
                SeasonForm::Additive => base + last.seasonal[(h - 1) % m],
                SeasonForm::Multiplicative => base * last.seasonal[(h - 1) % m],
            }
        })
        .collect()
}

/// SSE only, for the optimiser's objective: no allocation. `ring` is scratch of length m (its
/// contents are overwritten). Parameters must already be [`Parameters::effective`] and
/// `initial.seasonal` must have length m; non-finite results come back as NaN or infinity.
#[inline]
pub(crate) fn sse(
    model: Model,
    p: &Parameters,
    initial: &States,
    history: &[f64],
    ring: &mut [f64],
) -> f64 {
    let m = model.period();
    ring.copy_from_slice(&initial.seasonal);
    let mut level = initial.level;
    let mut trend = if model.has_trend() { initial.trend } else { 0.0 };
    match form(model) {
        SeasonForm::None => {
            let mut dummy = 0.0;
            history.iter().fold(0.0, |acc, &y| {
                let f = step(SeasonForm::None, p, y, &mut level, &mut trend, &mut dummy);
                acc + (y - f) * (y - f)
            })
        }
        f => {
            let mut total = 0.0;
            for chunk in history.chunks(m) {
                for (&y, slot) in chunk.iter().zip(ring.iter_mut()) {
                    let fit = step(f, p, y, &mut level, &mut trend, slot);
                    total += (y - fit) * (y - fit);
                }
            }
            total
        }
    }
}
