//! Best initial states for fixed smoothing parameters, by Gauss-Newton least squares.
//!
//! Kept apart from: the search over smoothing parameters ([`super::estimate`]), which calls this
//! between Nelder-Mead runs. Why: the one-step errors are affine in the initial states for
//! additive and non-seasonal models (the recursion is linear in (x_0, y)), so one Gauss-Newton
//! step is the exact least-squares solution there; with a multiplicative season a few damped
//! steps are taken. Searching 13+ states by simplex would cost far more evaluations.
//!
//! Free coordinates (the normalisation keeps Σ s0 fixed: 0 additive, m multiplicative): l0,
//! b0 (with a trend), and s0[j] for j < m − 1, each moving s0[m − 1] by the opposite amount.
//! Derivatives of ŷ_t with respect to them are carried forward through the recursion
//! (forward-mode differentiation of [`super::recursion`]'s update equations):
//!
//! * base' = l' + φ b'
//! * additive: ŷ' = base' + s'_{t−m}; l_t' = −α s'_{t−m} + (1−α) base'; s_t' = −γ base' + (1−γ) s'_{t−m}
//! * multiplicative: ŷ' = base' s + base s'; l_t' = −α y s'/s² + (1−α) base';
//!   s_t' = −γ y base'/base² + (1−γ) s'
//! * b_t' = β (l_t' − l_{t−1}') + (1−β) φ b_{t−1}'
//!
//! The step δ solves (J'J + λ diag(J'J)) δ = J' r with a tiny λ against rank deficiency.

use super::model::{Model, Parameters, States};
use super::recursion;

/// Reusable buffers, so repeated solves do not allocate.
pub(crate) struct StateSolver {
    size: usize,
    d_level: Vec<f64>,
    d_trend: Vec<f64>,
    /// Tangents of the seasonal ring, laid out [slot][coordinate].
    d_season: Vec<f64>,
    /// The last [`BLOCK`] Jacobian rows, laid out [step][coordinate], and their residuals,
    /// awaiting [`StateSolver::accumulate`].
    rows: Vec<f64>,
    residuals: [f64; BLOCK],
    normal: Vec<f64>,
    rhs: Vec<f64>,
    ring: Vec<f64>,
    trial: States,
}

/// Relative ridge added to the normal equations' diagonal.
const RIDGE: f64 = 1e-10;
/// Jacobian rows added to the normal equations together: each cell is then loaded and stored
/// once per four steps, its sum still taken over the steps in order (the same numbers).
const BLOCK: usize = 4;
/// Step halvings tried for a multiplicative season before giving up on a step.
const HALVINGS: usize = 6;

impl StateSolver {
    pub(crate) fn new(model: Model) -> StateSolver {
        let m = model.period();
        let size = model.free_state_count();
        StateSolver {
            size,
            d_level: vec![0.0; size],
            d_trend: vec![0.0; size],
            d_season: vec![0.0; m * size],
            rows: vec![0.0; BLOCK * size],
            residuals: [0.0; BLOCK],
            normal: vec![0.0; size * size],
            rhs: vec![0.0; size],
            ring: vec![0.0; m],
            trial: States {
                level: 0.0,
                trend: 0.0,
                seasonal: vec![0.0; m],
            },
        }
    }

    /// Moves `states` towards the least-squares initial states for parameters `p` (already
    /// [`Parameters::effective`]), taking up to `steps` Gauss-Newton steps; returns the SSE at
    /// the states it leaves. Never makes the SSE worse.
    pub(crate) fn refine(
        &mut self,
        model: Model,
        p: &Parameters,
        states: &mut States,
        y: &[f64],
        steps: usize,
    ) -> f64 {
        let mut current = recursion::sse(model, p, states, y, &mut self.ring);
        for _ in 0..steps {
            if !self.normal_equations(model, p, states, y) || !self.solve() {
                break;
            }
            let mut scale = 1.0;
            let mut accepted = false;
            for _ in 0..=HALVINGS {
                self.apply(model, states, scale);
                let trial = recursion::sse(model, p, &self.trial, y, &mut self.ring);
                let positive =
                    !model.is_multiplicative() || self.trial.seasonal.iter().all(|s| *s > 0.0);
                if positive && trial.is_finite() && trial <= current {
                    accepted = true;
                    current = trial;
                    break;
                }
                if !model.is_multiplicative() {
                    break;
                }
                scale *= 0.5;
            }
            if !accepted {
                break;
            }
            std::mem::swap(states, &mut self.trial);
            if !model.is_multiplicative() {
                break; // exact in one step
            }
        }
        current
    }

    /// Accumulates J'J and J'r at `states`; false if the pass produced non-finite numbers.
    fn normal_equations(&mut self, model: Model, p: &Parameters, s0: &States, y: &[f64]) -> bool {
        let k = self.size;
        let m = model.period();
        let trend_at = usize::from(model.has_trend());
        self.d_level.iter_mut().for_each(|v| *v = 0.0);
        self.d_trend.iter_mut().for_each(|v| *v = 0.0);
        self.d_season.iter_mut().for_each(|v| *v = 0.0);
        self.normal.iter_mut().for_each(|v| *v = 0.0);
        self.rhs.iter_mut().for_each(|v| *v = 0.0);
        self.d_level[0] = 1.0;
        if trend_at == 1 {
            self.d_trend[1] = 1.0;
        }
        for j in 0..m.saturating_sub(1) {
            let c = 1 + trend_at + j;
            self.d_season[j * k + c] = 1.0;
            self.d_season[(m - 1) * k + c] = -1.0;
        }
        self.ring.copy_from_slice(&s0.seasonal);
        let (mut level, mut trend) = (s0.level, if trend_at == 1 { s0.trend } else { 0.0 });
        let multiplicative = model.is_multiplicative();
        let mut slot = 0usize;
        let mut filled = 0usize;
        for &obs in y {
            let base = level + p.phi * trend;
            let season = if m > 0 { self.ring[slot] } else { 0.0 };
            let ds: &mut [f64] = if m > 0 {
                &mut self.d_season[slot * k..(slot + 1) * k]
            } else {
                &mut []
            };
            // Per-step factors of the multiplicative tangents, hoisted out of the coordinate loop.
            let (season_factor, base_factor) = if multiplicative {
                (
                    p.alpha * obs / (season * season),
                    p.gamma * obs / (base * base),
                )
            } else {
                (0.0, 0.0)
            };
            // One loop per kind of model, so that none branches per coordinate; each writes
            // the same expressions as the recursion's update equations (module doc).
            let trend_keep = (1.0 - p.beta) * p.phi;
            let tangents = self
                .d_level
                .iter_mut()
                .zip(self.d_trend.iter_mut())
                .zip(self.rows[filled * k..(filled + 1) * k].iter_mut());
            if m == 0 {
                for ((dl, dt), row) in tangents {
                    let d_base = *dl + p.phi * *dt;
                    let d_new_level = (1.0 - p.alpha) * d_base;
                    *dt = p.beta * (d_new_level - *dl) + trend_keep * *dt;
                    *dl = d_new_level;
                    *row = d_base;
                }
            } else if multiplicative {
                for (((dl, dt), row), d_season) in tangents.zip(ds.iter_mut()) {
                    let d_base = *dl + p.phi * *dt;
                    let d_old = *d_season;
                    *d_season = -base_factor * d_base + (1.0 - p.gamma) * d_old;
                    let d_new_level = -season_factor * d_old + (1.0 - p.alpha) * d_base;
                    *dt = p.beta * (d_new_level - *dl) + trend_keep * *dt;
                    *dl = d_new_level;
                    *row = d_base * season + base * d_old;
                }
            } else {
                for (((dl, dt), row), d_season) in tangents.zip(ds.iter_mut()) {
                    let d_base = *dl + p.phi * *dt;
                    let d_old = *d_season;
                    *d_season = -p.gamma * d_base + (1.0 - p.gamma) * d_old;
                    let d_new_level = -p.alpha * d_old + (1.0 - p.alpha) * d_base;
                    *dt = p.beta * (d_new_level - *dl) + trend_keep * *dt;
                    *dl = d_new_level;
                    *row = d_base + d_old;
                }
            }
            // Value update, same equations as the recursion.
            let (fit, new_level) = if m == 0 {
                (base, p.alpha * obs + (1.0 - p.alpha) * base)
            } else if multiplicative {
                self.ring[slot] = p.gamma * obs / base + (1.0 - p.gamma) * season;
                (
                    base * season,
                    p.alpha * obs / season + (1.0 - p.alpha) * base,
                )
            } else {
                self.ring[slot] = p.gamma * (obs - base) + (1.0 - p.gamma) * season;
                (
                    base + season,
                    p.alpha * (obs - season) + (1.0 - p.alpha) * base,
                )
            };
            trend = p.beta * (new_level - level) + (1.0 - p.beta) * p.phi * trend;
            level = new_level;
            self.residuals[filled] = obs - fit;
            filled += 1;
            if filled == BLOCK {
                self.accumulate(filled);
                filled = 0;
            }
            if m > 0 {
                slot += 1;
                if slot == m {
                    slot = 0;
                }
            }
        }
        self.accumulate(filled);
        self.normal.iter().chain(&self.rhs).all(|v| v.is_finite())
    }

    /// Adds the first `count` buffered rows to J'J (upper triangle) and J'r, in step order.
    fn accumulate(&mut self, count: usize) {
        let k = self.size;
        let rows = &self.rows;
        for a in 0..k {
            for (i, residual) in self.residuals[..count].iter().enumerate() {
                self.rhs[a] += rows[i * k + a] * residual;
            }
            let cells = &mut self.normal[a * k + a..(a + 1) * k];
            if count == BLOCK {
                let row = |i: usize| &rows[i * k + a..(i + 1) * k];
                let (a0, a1, a2, a3) = (rows[a], rows[k + a], rows[2 * k + a], rows[3 * k + a]);
                for ((((cell, b0), b1), b2), b3) in
                    cells.iter_mut().zip(row(0)).zip(row(1)).zip(row(2)).zip(row(3))
                {
                    *cell = *cell + a0 * b0 + a1 * b1 + a2 * b2 + a3 * b3;
                }
            } else {
                for i in 0..count {
                    let ja = rows[i * k + a];
                    for (cell, jb) in cells.iter_mut().zip(&rows[i * k + a..(i + 1) * k]) {
                        *cell += ja * jb;
                    }
                }
            }
        }
    }

    /// Solves the ridged normal equations in place by Cholesky; `rhs` becomes δ.
    fn solve(&mut self) -> bool {
        let k = self.size;
        let a = &mut self.normal;
        for i in 0..k {
            for j in 0..i {
                a[i * k + j] = a[j * k + i]; // mirror the upper triangle
            }
            a[i * k + i] *= 1.0 + RIDGE;
            a[i * k + i] += f64::MIN_POSITIVE;
        }
        for j in 0..k {
            let mut d = a[j * k + j];
            for q in 0..j {
                d -= a[j * k + q] * a[j * k + q];
            }
            if d.is_nan() || d <= 0.0 {
                return false;
            }
            let d = d.sqrt();
            a[j * k + j] = d;
            for i in j + 1..k {
                let mut v = a[i * k + j];
                for q in 0..j {
                    v -= a[i * k + q] * a[j * k + q];
                }
                a[i * k + j] = v / d;
            }
        }
        let b = &mut self.rhs;
        for i in 0..k {
            let mut v = b[i];
            for q in 0..i {
                v -= a[i * k + q] * b[q];
            }
            b[i] = v / a[i * k + i];
        }
        for i in (0..k).rev() {
            let mut v = b[i];
            for q in i + 1..k {
                v -= a[q * k + i] * b[q];
            }
            b[i] = v / a[i * k + i];
        }
        b.iter().all(|v| v.is_finite())
    }

    /// trial = states + scale · δ, in the free coordinates.
    fn apply(&mut self, model: Model, states: &States, scale: f64) {
        let m = model.period();
        let trend_at = usize::from(model.has_trend());
        self.trial.level = states.level + scale * self.rhs[0];
        self.trial.trend = states.trend
            + if trend_at == 1 {
                scale * self.rhs[1]
            } else {
                0.0
            };
        self.trial.seasonal.copy_from_slice(&states.seasonal);
        for j in 0..m.saturating_sub(1) {
            let step = scale * self.rhs[1 + trend_at + j];
            self.trial.seasonal[j] += step;
            self.trial.seasonal[m - 1] -= step;
        }
    }
}
