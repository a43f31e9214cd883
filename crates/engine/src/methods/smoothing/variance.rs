//! Analytic h-step forecast-error variances for the additive-error linear models.
//!
//! Kept apart from: fitting and the recursion. Source: Hyndman, Koehler, Ord & Snyder (2005),
//! "Prediction intervals for exponential smoothing using two new classes of state space
//! models", J. of Forecasting 24:17-37; also Hyndman et al. (2008), *Forecasting with
//! Exponential Smoothing*, ch. 6 (class 1).
//!
//! State-space (innovations) form with x_t = (l_t, b_t, s_t, s_{t−1}, …, s_{t−m+1})':
//!
//! * y_t = w' x_{t−1} + ε_t,  x_t = F x_{t−1} + g ε_t;
//! * w = (1, φ, 0, …, 0, 1) (the last entry picks s_{t−m});
//! * F: level row (1, φ, 0…), trend row (0, φ, 0…), new season row picks s_{t−m}, the other
//!   seasonal rows shift down by one;
//! * g = (α, α β, γ, 0, …, 0): the state-space trend parameter is α β in the convention of
//!   [`super::recursion`] (β there smooths the level change), γ is the same.
//!
//! Then v_h = σ² (1 + Σ_{j=1}^{h−1} c_j²) with c_j = w' F^{j−1} g, computed here generically
//! from the matrices. Models without trend or season drop those rows and columns.
//! Multiplicative seasons have no such linear form: they get `None` (callers then use
//! empirical quantiles).

use super::model::{Model, Parameters};

/// The matrices (w, F, g) of the linear innovations form of `model`, F row-major; `None` for a
/// multiplicative season.
pub fn state_space(model: Model, parameters: Parameters) -> Option<(Vec<f64>, Vec<f64>, Vec<f64>)> {
    if model.is_multiplicative() {
        return None;
    }
    let p = parameters.effective(model);
    let m = model.period();
    let trend = usize::from(model.has_trend());
    let size = 1 + trend + m;
    let season_at = 1 + trend;
    let mut w = vec![0.0; size];
    let mut f = vec![0.0; size * size];
    let mut g = vec![0.0; size];
    w[0] = 1.0;
    f[0] = 1.0;
    g[0] = p.alpha;
    if trend == 1 {
        w[1] = p.phi;
        f[1] = p.phi; // level row picks φ b
        f[size + 1] = p.phi; // trend row
        g[1] = p.alpha * p.beta;
    }
    if m > 0 {
        let last = season_at + m - 1;
        w[last] = 1.0;
        f[season_at * size + last] = 1.0; // s_t carries s_{t−m}
        for r in season_at + 1..size {
            f[r * size + r - 1] = 1.0; // shift
        }
        g[season_at] = p.gamma;
    }
    Some((w, f, g))
}

/// c_j = w' F^{j−1} g for j = 1..count (the weights of past errors in the h-step error).
pub fn error_weights(w: &[f64], f: &[f64], g: &[f64], count: usize) -> Vec<f64> {
    let size = w.len();
    let mut u = g.to_vec();
    let mut next = vec![0.0; size];
    let mut weights = Vec::with_capacity(count);
    for _ in 0..count {
        weights.push(w.iter().zip(&u).map(|(a, b)| a * b).sum());
        for (r, out) in next.iter_mut().enumerate() {
            *out = f[r * size..(r + 1) * size]
                .iter()
                .zip(&u)
                .map(|(a, b)| a * b)
                .sum();
        }
        std::mem::swap(&mut u, &mut next);
    }
    weights
}

/// v_h = σ² (1 + Σ_{j=1}^{h−1} c_j²) for h = 1..horizon; `None` for a multiplicative season.
pub fn forecast_variances(
    model: Model,
    parameters: Parameters,
    sigma2: f64,
    horizon: usize,
) -> Option<Vec<f64>> {
    let (w, f, g) = state_space(model, parameters)?;
    let weights = error_weights(&w, &f, &g, horizon.saturating_sub(1));
    let mut cumulative = 1.0;
    let mut out = Vec::with_capacity(horizon);
    for h in 0..horizon {
        if h > 0 {
            cumulative += weights[h - 1] * weights[h - 1];
        }
        out.push(sigma2 * cumulative);
    }
    Some(out)
}
