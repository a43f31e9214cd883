//! Bounded Nelder-Mead minimisation, used to fit smoothing parameters and initial states, and a
//! grid-plus-golden-section search for one-parameter problems.
//!
//! Kept apart from: any model. The objective is a closure over a parameter slice; bounds are a
//! box. A compact implementation is used instead of a crate because the problems are tiny (one to
//! eight parameters), it must build unchanged for wasm, and speed on short series matters more
//! than generality.
//!
//! Method: J. A. Nelder and R. Mead, "A simplex method for function minimization", The Computer
//! Journal 7 (1965) 308-313, with the standard coefficients reflection 1, expansion 2,
//! contraction 1/2, shrink 1/2. Points are clamped into the box after every move.

/// A box constraint for one parameter.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Bound {
    pub low: f64,
    pub high: f64,
}

impl Bound {
    pub const fn new(low: f64, high: f64) -> Bound {
        Bound { low, high }
    }
    fn clamp(self, x: f64) -> f64 {
        x.clamp(self.low, self.high)
    }
}

/// The best point found and its objective value.
#[derive(Clone, Debug, PartialEq)]
pub struct Minimum {
    pub point: Vec<f64>,
    pub value: f64,
    pub evaluations: usize,
}

/// Settings of one minimisation.
#[derive(Clone, Copy, Debug)]
pub struct Settings {
    /// Stop when the spread of objective values across the simplex falls below this
    /// (relative to the best value's magnitude plus one).
    pub tolerance: f64,
    /// Stop after this many objective evaluations.
    pub max_evaluations: usize,
    /// Initial simplex step as a fraction of each bound's width.
    pub initial_step: f64,
}

impl Default for Settings {
    fn default() -> Self {
        Settings {
            tolerance: 1e-10,
            max_evaluations: 2000,
            initial_step: 0.1,
        }
    }
}

/// Minimises `objective` from `start` inside `bounds` (one bound per coordinate).
/// Non-finite objective values are treated as +infinity, so a model may reject a point by
/// returning NaN.
pub fn nelder_mead<F>(
    mut objective: F,
    start: &[f64],
    bounds: &[Bound],
    settings: Settings,
) -> Minimum
where
    F: FnMut(&[f64]) -> f64,
{
    let n = start.len();
    assert_eq!(n, bounds.len(), "one bound per parameter");
    let mut evaluations = 0usize;
    let mut eval = |p: &[f64], evaluations: &mut usize| {
        *evaluations += 1;
        let v = objective(p);
        if v.is_finite() {
            v
        } else {
            f64::INFINITY
        }
    };
    let clamp = |p: &mut [f64]| {
        for (x, b) in p.iter_mut().zip(bounds) {
            *x = b.clamp(*x);
        }
    };

    let mut simplex: Vec<Vec<f64>> = Vec::with_capacity(n + 1);
    let mut first = start.to_vec();
    clamp(&mut first);
    simplex.push(first.clone());
    for i in 0..n {
        let mut p = first.clone();
        let width = bounds[i].high - bounds[i].low;
        let step = if width.is_finite() {
            settings.initial_step * width
        } else {
            0.1 * (p[i].abs() + 1.0)
        };
        // Step towards the side with more room so the vertex stays distinct after clamping.
        if p[i] + step <= bounds[i].high {
            p[i] += step;
        } else {
            p[i] -= step;
        }
        clamp(&mut p);
        simplex.push(p);
    }
    let mut values: Vec<f64> = simplex.iter().map(|p| eval(p, &mut evaluations)).collect();

    let mut centroid = vec![0.0; n];
    let mut trial = vec![0.0; n];
    let mut trial2 = vec![0.0; n];
    while evaluations < settings.max_evaluations {
        // Order vertices best to worst, in place (insertion sort: n + 1 is at most ~16, and the
        // order is nearly sorted after one move, so this avoids any allocation per iteration).
        for i in 1..=n {
            let mut j = i;
            while j > 0 && values[j - 1] > values[j] {
                values.swap(j - 1, j);
                simplex.swap(j - 1, j);
                j -= 1;
            }
        }
        let best = values[0];
        let worst = values[n];
        if worst.is_finite() && (worst - best).abs() <= settings.tolerance * (best.abs() + 1.0) {
            break;
        }

        centroid.iter_mut().for_each(|c| *c = 0.0);
        for p in &simplex[..n] {
            for (c, x) in centroid.iter_mut().zip(p) {
                *c += x / n as f64;
            }
        }
        let towards = |coef: f64, out: &mut Vec<f64>, worst_p: &[f64], centroid: &[f64]| {
            for ((o, c), w) in out.iter_mut().zip(centroid).zip(worst_p) {
                *o = c + coef * (c - w);
            }
        };

        towards(1.0, &mut trial, &simplex[n], &centroid);
        clamp(&mut trial);
        let reflected = eval(&trial, &mut evaluations);
        if reflected < values[0] {
            towards(2.0, &mut trial2, &simplex[n], &centroid);
            clamp(&mut trial2);
            let expanded = eval(&trial2, &mut evaluations);
            if expanded < reflected {
                simplex[n].clone_from(&trial2);
                values[n] = expanded;
            } else {
                simplex[n].clone_from(&trial);
                values[n] = reflected;
            }
        } else if reflected < values[n - 1] {
            simplex[n].clone_from(&trial);
            values[n] = reflected;
        } else {
            // Contract: outside if the reflection improved on the worst, else inside.
            let coef = if reflected < values[n] { 0.5 } else { -0.5 };
            towards(coef, &mut trial2, &simplex[n], &centroid);
            clamp(&mut trial2);
            let contracted = eval(&trial2, &mut evaluations);
            if contracted < values[n].min(reflected) {
                simplex[n].clone_from(&trial2);
                values[n] = contracted;
            } else {
                // Shrink towards the best vertex.
                let (best, rest) = simplex.split_at_mut(1);
                for (vertex, value) in rest.iter_mut().zip(values[1..].iter_mut()) {
                    for (x, b) in vertex.iter_mut().zip(&best[0]) {
                        *x = b + 0.5 * (*x - b);
                    }
                    *value = eval(vertex, &mut evaluations);
                }
            }
        }
    }
    let (best_index, _) = values
        .iter()
        .enumerate()
        .min_by(|a, b| a.1.total_cmp(b.1))
        .unwrap_or((0, &f64::INFINITY));
    Minimum {
        point: simplex[best_index].clone(),
        value: values[best_index],
        evaluations,
    }
}

/// Runs [`nelder_mead`] from each start and keeps the best minimum ("more than one start"
/// guards against the local minima that smoothing-parameter surfaces often have).
pub fn minimise_from_starts<F>(
    mut objective: F,
    starts: &[Vec<f64>],
    bounds: &[Bound],
    settings: Settings,
) -> Minimum
where
    F: FnMut(&[f64]) -> f64,
{
    let mut best: Option<Minimum> = None;
    for start in starts {
        let m = nelder_mead(&mut objective, start, bounds, settings);
        if best.as_ref().is_none_or(|b| m.value < b.value) {
            best = Some(m);
        }
    }
    best.unwrap_or(Minimum {
        point: Vec::new(),
        value: f64::INFINITY,
        evaluations: 0,
    })
}

/// Minimises a function of one variable on `[low, high]`: the best of `grid_points` evenly
/// spaced points (at least 2), then golden-section search between its two neighbours until the
/// bracket is narrower than `tolerance`. The grid guards against the several dips an SSE curve
/// can have; golden section needs only one inside the final bracket. Returns `(x, f(x))`.
pub fn minimise_scalar(
    mut objective: impl FnMut(f64) -> f64,
    low: f64,
    high: f64,
    grid_points: usize,
    tolerance: f64,
) -> (f64, f64) {
    let points = grid_points.max(2);
    let step = (high - low) / (points - 1) as f64;
    let at = |i: usize| {
        if i + 1 == points {
            high
        } else {
            low + step * i as f64
        }
    };
    let mut value_of = |x: f64| {
        let v = objective(x);
        if v.is_finite() {
            v
        } else {
            f64::INFINITY
        }
    };
    let grid: Vec<f64> = (0..points).map(|i| value_of(at(i))).collect();
    let best = (0..points)
        .min_by(|&a, &b| grid[a].total_cmp(&grid[b]))
        .unwrap_or(0);
    let mut best_point = (at(best), grid[best]);
    let (mut lo, mut hi) = (at(best.saturating_sub(1)), at((best + 1).min(points - 1)));
    let ratio = (5f64.sqrt() - 1.0) / 2.0;
    let mut left = hi - ratio * (hi - lo);
    let mut right = lo + ratio * (hi - lo);
    let (mut f_left, mut f_right) = (value_of(left), value_of(right));
    while hi - lo > tolerance {
        if f_left <= f_right {
            hi = right;
            (right, f_right) = (left, f_left);
            left = hi - ratio * (hi - lo);
            f_left = value_of(left);
        } else {
            lo = left;
            (left, f_left) = (right, f_right);
            right = lo + ratio * (hi - lo);
            f_right = value_of(right);
        }
    }
    for candidate in [(left, f_left), (right, f_right)] {
        if candidate.1 < best_point.1 {
            best_point = candidate;
        }
    }
    best_point
}

#[cfg(test)]
mod tests {
    use super::*;

    // Rosenbrock's function (H. H. Rosenbrock, The Computer Journal 3 (1960) 175-184) has its
    // single minimum 0 at (1, 1): a standard test of unconstrained minimisers.
    #[test]
    fn finds_rosenbrock_minimum() {
        let f = |p: &[f64]| (1.0 - p[0]).powi(2) + 100.0 * (p[1] - p[0] * p[0]).powi(2);
        let bounds = [Bound::new(-5.0, 5.0), Bound::new(-5.0, 5.0)];
        let m = nelder_mead(
            f,
            &[-1.2, 1.0],
            &bounds,
            Settings {
                max_evaluations: 5000,
                ..Settings::default()
            },
        );
        assert!((m.point[0] - 1.0).abs() < 1e-4, "{:?}", m);
        assert!((m.point[1] - 1.0).abs() < 1e-4, "{:?}", m);
        assert!(m.value < 1e-8);
    }

    #[test]
    fn respects_bounds() {
        // Unconstrained minimum at x = 3 lies outside [0, 1]: the answer is the bound.
        let m = nelder_mead(
            |p| (p[0] - 3.0).powi(2),
            &[0.5],
            &[Bound::new(0.0, 1.0)],
            Settings::default(),
        );
        assert!((m.point[0] - 1.0).abs() < 1e-9);
    }

    #[test]
    fn nan_is_rejected_as_infinite() {
        let f = |p: &[f64]| {
            if p[0] < 0.2 {
                f64::NAN
            } else {
                (p[0] - 0.5).powi(2)
            }
        };
        let m = minimise_from_starts(
            f,
            &[vec![0.1], vec![0.9]],
            &[Bound::new(0.0, 1.0)],
            Settings::default(),
        );
        assert!((m.point[0] - 0.5).abs() < 1e-4);
    }

    // A quartic with two dips, (x^2 - 1)^2 + 0.3 x, has its global minimum near x = -1.04 and a
    // local one near 0.96 (calculus on the polynomial): the grid must pick the global one.
    #[test]
    fn scalar_search_finds_global_dip() {
        let (x, _) = minimise_scalar(|x| (x * x - 1.0).powi(2) + 0.3 * x, -2.0, 2.0, 21, 1e-10);
        let derivative = 4.0 * x * (x * x - 1.0) + 0.3;
        assert!(x < 0.0 && derivative.abs() < 1e-6, "{x}");
    }
}
