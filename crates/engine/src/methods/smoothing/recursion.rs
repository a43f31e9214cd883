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
    let mut trend = if model.has_trend() {
        initial.trend
    } else {
        0.0
    };
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
/// Same equations as [`run`], specialised per model shape so that absent terms cost nothing.
#[inline]
pub fn sse(
    model: Model,
    p: &Parameters,
    initial: &States,
    history: &[f64],
    ring: &mut [f64],
) -> f64 {
    ring.copy_from_slice(&initial.seasonal);
    let start = (initial.level, initial.trend);
    match (model.has_trend(), form(model)) {
        (false, SeasonForm::None) => sse_kernel::<false, 0>(p, start, history, ring),
        (true, SeasonForm::None) => sse_kernel::<true, 0>(p, start, history, ring),
        (false, SeasonForm::Additive) => sse_kernel::<false, 1>(p, start, history, ring),
        (true, SeasonForm::Additive) => sse_kernel::<true, 1>(p, start, history, ring),
        (false, SeasonForm::Multiplicative) => sse_kernel::<false, 2>(p, start, history, ring),
        (true, SeasonForm::Multiplicative) => sse_kernel::<true, 2>(p, start, history, ring),
    }
}

/// `SEASON`: 0 none, 1 additive, 2 multiplicative. Without a season `ring` is empty and the
/// history is walked in one chunk.
///
/// The equations of [`run`] rearranged so the loop-carried dependency is short (same values up
/// to rounding): with base_t = l_{t−1} + φ b_{t−1}, the season-adjusted residual
/// r_t = a_t − base_t where a_t = y_t, y_t − s_{t−m} or y_t / s_{t−m}, and q_t = φ b_t,
///
/// * l_t − base_t = α r_t, hence b_t = φ b_{t−1} + αβ r_t and q_t = φ q_{t−1} + φαβ r_t;
/// * base_{t+1} = l_t + q_t = base_t + φ q_{t−1} + (α + φαβ) r_t;
/// * the one-step error y_t − ŷ_t is r_t (none, additive) or s_{t−m} r_t (multiplicative).
#[inline(always)]
fn sse_kernel<const TREND: bool, const SEASON: u8>(
    p: &Parameters,
    (level, trend): (f64, f64),
    history: &[f64],
    ring: &mut [f64],
) -> f64 {
    let (alpha, gamma, phi) = (p.alpha, p.gamma, p.phi);
    let ab = p.alpha * p.beta;
    let gain = if TREND { alpha + phi * ab } else { alpha };
    let trend_gain = phi * ab;
    let mut q = if TREND { phi * trend } else { 0.0 };
    let mut base = level + q;
    let mut total = 0.0;
    let chunk = if SEASON == 0 {
        history.len().max(1)
    } else {
        ring.len()
    };
    let mut none = [0.0];
    for part in history.chunks(chunk) {
        let slots: &mut [f64] = if SEASON == 0 { &mut none } else { ring };
        for (i, &y) in part.iter().enumerate() {
            let (r, error) = match SEASON {
                0 => {
                    let r = y - base;
                    (r, r)
                }
                1 => {
                    let s = slots[i];
                    let r = (y - s) - base;
                    slots[i] = s + gamma * r;
                    (r, r)
                }
                _ => {
                    let s = slots[i];
                    let r = y / s - base;
                    slots[i] = gamma * (y / base) + (1.0 - gamma) * s;
                    (r, s * r)
                }
            };
            total += error * error;
            if TREND {
                base = (base + phi * q) + gain * r;
                q = phi * q + trend_gain * r;
            } else {
                base += gain * r;
            }
        }
    }
    total
}
