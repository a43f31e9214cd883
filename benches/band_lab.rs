//! Band laboratory: how ways of turning rolling-origin errors into bands hold on the M3 data.
//! A research tool for choosing the band rule (the plan's own bands are scored by m3.rs); the
//! README records what it showed. Each series is planned as the page would plan it; then the
//! chosen candidate is refitted at the rolling origins (8, 36 or every one) and each rule turns
//! the errors into bands, scored on the held-out actuals.
//!
//! Rules: engine (bands::rolling_band without the model's psi-weights, which the lab does not
//! have: the h-block count; the plan counts by the weights from 30 errors); t_pure (the same,
//! written here); t_rms (df = k); t_eff (df = k / h with sqrt(1 + 1/df)); shape_t_eff and
//! hybrid (the pooled standardised errors' own quantiles); jack_block (an h-block leave-out scale);
//! conformal (split conformal on scaled errors). "rel" variants (36 origins) take each error
//! relative to its own forecast and scale the band by today's forecast; "shape" variants
//! divide each error by its forecast's size against the mean of that origin's path, and scale
//! today's band by the same shape of today's forecast (a seasonal item's band follows its
//! season, the scale stays additive).
//!
//! Run: `cargo bench --bench band_lab [-- --subset YEARLY --limit 200]` (a few minutes).

// Native only: the rule that sorts go through morrowcast_engine::sorting (clippy.toml) keeps
// the wasm small and does not bind benchmarks and tests.
#![allow(clippy::disallowed_methods)]

use std::collections::BTreeMap;

use morrowcast_engine::backtest;
use morrowcast_engine::bands::standard_normal_quantile;
use morrowcast_engine::plan;
use morrowcast_engine::settings::PlanSettings;

#[path = "common/m3_data.rs"]
mod m3_data;
use m3_data::{chosen_series, seasonal_scale as scale, series_for};

/// Student-t quantile by the Cornish-Fisher expansion in 1/nu (Abramowitz & Stegun 26.7.5).
fn t_quantile(p: f64, nu: f64) -> f64 {
    let z = standard_normal_quantile(p);
    let (z3, z5, z7) = (z.powi(3), z.powi(5), z.powi(7));
    z + (z3 + z) / (4.0 * nu)
        + (5.0 * z5 + 16.0 * z3 + 3.0 * z) / (96.0 * nu * nu)
        + (3.0 * z7 + 19.0 * z5 + 17.0 * z3 - 15.0 * z) / (384.0 * nu.powi(3))
}

#[derive(Default)]
struct Score {
    inside: [usize; 2],
    count: usize,
    msis: [f64; 2],
}

/// A rule: from the per-horizon errors, the (low, high) offsets below/above the forecast at
/// each horizon for level p.
type Rule = fn(&[Vec<f64>], usize, f64) -> Vec<(f64, f64)>;

fn rms(e: &[f64]) -> f64 {
    morrowcast_engine::bands::root_mean_square(e)
}

/// The engine's rule, bands::rolling_band with the h-block count (equal to t_pure).
fn engine(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let level = morrowcast_engine::bands::Level::new(p * 100.0).unwrap();
    let f = vec![0.0; h];
    match morrowcast_engine::bands::rolling_band(&f, errors, None, level, false) {
        Some(pts) => pts.iter().map(|b| (-b.low, b.high)).collect(),
        None => vec![(0.0, 0.0); h],
    }
}

/// Per-horizon RMS times a t quantile for its error count, with the predictive sqrt(1+1/k).
fn t_rms(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let mut out = Vec::new();
    let mut widest = 0.0f64;
    let mut last = 0.0;
    for e in errors.iter().take(h) {
        let k = e.len();
        let half = if k >= 2 {
            t_quantile((1.0 + p) / 2.0, k as f64) * rms(e) * (1.0 + 1.0 / k as f64).sqrt()
        } else {
            last
        };
        last = half;
        widest = widest.max(half);
        out.push((widest, widest));
    }
    while out.len() < h {
        out.push((widest, widest));
    }
    out
}

/// t_rms with the degrees of freedom cut to the independent errors: h-step errors of
/// neighbouring origins share h - 1 shocks, so k of them count about as k / h.
fn t_eff(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let mut out = Vec::new();
    let mut widest = 0.0f64;
    let mut last = 0.0;
    for (i, e) in errors.iter().take(h).enumerate() {
        let k = e.len();
        let half = if k >= 2 {
            let df = (k as f64 / (i + 1) as f64).max(1.0);
            t_quantile((1.0 + p) / 2.0, df) * rms(e) * (1.0 + 1.0 / df).sqrt()
        } else {
            last
        };
        last = half;
        widest = widest.max(half);
        out.push((widest, widest));
    }
    while out.len() < h {
        out.push((widest, widest));
    }
    out
}

/// t_eff without the sqrt(1 + 1/df) factor: e_new / s ~ t_df when s^2 is a mean of df squared
/// independent N(0, sigma^2) errors.
fn t_pure(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let mut out = Vec::new();
    let mut widest = 0.0f64;
    let mut last = 0.0;
    for (i, e) in errors.iter().take(h).enumerate() {
        let k = e.len();
        let half = if k >= 2 {
            let df = (k as f64 / (i + 1) as f64).max(1.0);
            t_quantile((1.0 + p) / 2.0, df) * rms(e)
        } else {
            last
        };
        last = half;
        widest = widest.max(half);
        out.push((widest, widest));
    }
    while out.len() < h {
        out.push((widest, widest));
    }
    out
}

/// Bartlett's (1946) count of effective errors among k overlapping h-step errors: were each a
/// sum of h independent shocks, neighbours j apart correlate (h - j) / h, and the mean of k
/// squared errors varies as that of k / (1 + 2 sum_j ((h - j) / h)^2) independent ones (about
/// 3k / 2h for long h, where k / h takes no credit for the part not shared).
fn bartlett_df(k: usize, h: usize) -> f64 {
    let hf = h as f64;
    let spread: f64 = 1.0 + 2.0 * (1..h).map(|j| ((hf - j as f64) / hf).powi(2)).sum::<f64>();
    (k as f64 / spread).max(1.0)
}

/// Unit-variance Student-t quantile for shape nu (normal when nu is infinite).
fn unit_t(p: f64, nu: f64) -> f64 {
    if nu.is_finite() {
        morrowcast_engine::bands::student_t_quantile(p, nu) * ((nu - 2.0) / nu).sqrt()
    } else {
        standard_normal_quantile(p)
    }
}

/// The shape nu of a Student-t with the kurtosis of the pooled standardised errors (moments
/// about zero, the forecast): excess kurtosis 6 / (nu - 4); normal when it is not positive or
/// fewer than `least` errors are pooled.
fn kurtosis_nu(errors: &[Vec<f64>], least: usize) -> f64 {
    let mut n = 0usize;
    let mut m4 = 0.0;
    for e in errors {
        let r = rms(e);
        if e.len() < 2 || r <= 0.0 {
            continue;
        }
        for x in e {
            m4 += (x / r).powi(4);
            n += 1;
        }
    }
    if n < least {
        return f64::INFINITY;
    }
    let excess = m4 / n as f64 - 3.0;
    if excess <= 0.0 {
        f64::INFINITY
    } else {
        (4.0 + 6.0 / excess).max(4.1)
    }
}

/// Per-horizon RMS times a Student-t quantile for `df(k, h)` degrees of freedom and a shape
/// nu: half = t_df(p) * unit_t_nu(p) / z(p) * r_h; widths never shrink with the horizon.
fn scaled_band(
    errors: &[Vec<f64>],
    h: usize,
    p: f64,
    df: fn(usize, usize) -> f64,
    nu: f64,
) -> Vec<(f64, f64)> {
    let upper = (1.0 + p) / 2.0;
    let shape = unit_t(upper, nu) / standard_normal_quantile(upper);
    let mut out = Vec::new();
    let mut widest = 0.0f64;
    for i in 0..h {
        if let Some(e) = errors.get(i).filter(|e| e.len() >= 2) {
            let t = morrowcast_engine::bands::student_t_quantile(upper, df(e.len(), i + 1));
            widest = widest.max(t * shape * rms(e));
        }
        out.push((widest, widest));
    }
    out
}

/// Pool adjacent violators (Barlow, Bartholomew, Bremner & Brunk 1972): the non-decreasing
/// sequence closest to `values` in weighted least squares.
fn isotonic(values: &[f64], weights: &[f64]) -> Vec<f64> {
    // Blocks of (mean, weight, count).
    let mut blocks: Vec<(f64, f64, usize)> = Vec::new();
    for (&v, &w) in values.iter().zip(weights) {
        blocks.push((v, w, 1));
        while blocks.len() >= 2 && blocks[blocks.len() - 2].0 > blocks[blocks.len() - 1].0 {
            let (m2, w2, c2) = blocks.pop().unwrap();
            let (m1, w1, c1) = blocks.pop().unwrap();
            let w = w1 + w2;
            blocks.push(((m1 * w1 + m2 * w2) / w.max(1e-300), w, c1 + c2));
        }
    }
    blocks
        .into_iter()
        .flat_map(|(m, _, c)| std::iter::repeat_n(m, c))
        .collect()
}

/// The mean squared error per horizon made non-decreasing by isotonic regression (weights
/// k_h) instead of a running maximum of noisy per-horizon widths (which is biased upward),
/// times t_df(p) for df(k_h, h).
fn isotonic_band(
    errors: &[Vec<f64>],
    h: usize,
    p: f64,
    df: fn(usize, usize) -> f64,
) -> Vec<(f64, f64)> {
    let upper = (1.0 + p) / 2.0;
    let usable: Vec<(usize, f64, usize)> = errors
        .iter()
        .take(h)
        .enumerate()
        .filter(|(_, e)| e.len() >= 2)
        .map(|(i, e)| (i, rms(e).powi(2), e.len()))
        .collect();
    if usable.is_empty() {
        return vec![(0.0, 0.0); h];
    }
    let mse: Vec<f64> = usable.iter().map(|u| u.1).collect();
    let weights: Vec<f64> = usable.iter().map(|u| u.2 as f64).collect();
    let fitted = isotonic(&mse, &weights);
    let mut out = vec![(0.0, 0.0); h];
    let mut last = (fitted[0], usable[0].2, usable[0].0);
    let mut next = 0;
    let mut widest = 0.0f64;
    for (i, slot) in out.iter_mut().enumerate() {
        if next < usable.len() && usable[next].0 == i {
            last = (fitted[next], usable[next].2, i);
            next += 1;
        }
        let t = morrowcast_engine::bands::student_t_quantile(upper, df(last.1, last.2 + 1));
        widest = widest.max(t * last.0.sqrt());
        *slot = (widest, widest);
    }
    out
}

fn iso_t(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    isotonic_band(errors, h, p, k_over_h)
}

fn iso_bartlett(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    isotonic_band(errors, h, p, bartlett_df)
}

/// Diagnostic only: t_df * r_h at each horizon with no rule that widths never shrink.
fn no_max(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let upper = (1.0 + p) / 2.0;
    let mut last = 0.0;
    (0..h)
        .map(|i| {
            if let Some(e) = errors.get(i).filter(|e| e.len() >= 2) {
                last =
                    morrowcast_engine::bands::student_t_quantile(upper, k_over_h(e.len(), i + 1))
                        * rms(e);
            }
            (last, last)
        })
        .collect()
}

fn k_over_h(k: usize, h: usize) -> f64 {
    (k as f64 / h as f64).max(1.0)
}

fn bartlett(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    scaled_band(errors, h, p, bartlett_df, f64::INFINITY)
}

fn kurt_t(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    scaled_band(errors, h, p, k_over_h, kurtosis_nu(errors, 30))
}

fn bartlett_kurt(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    scaled_band(errors, h, p, bartlett_df, kurtosis_nu(errors, 30))
}

/// The empirical shape of the pooled standardised errors where at least 10 of them lie beyond
/// each tail quantile (so the quantile rests on data), else t_pure; the scale per horizon with
/// its estimation noise as the ratio t_df / z for df = k_h / h.
fn hybrid(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let scales: Vec<f64> = errors.iter().map(|e| rms(e)).collect();
    let mut pooled: Vec<f64> = errors
        .iter()
        .zip(&scales)
        .flat_map(|(e, r)| e.iter().filter(move |_| *r > 0.0).map(move |x| x / r))
        .collect();
    if (pooled.len() as f64) * (1.0 - p) / 2.0 < 10.0 {
        return t_pure(errors, h, p);
    }
    pooled.sort_by(f64::total_cmp);
    let (q_lo, q_hi) = (
        quantile(&pooled, (1.0 - p) / 2.0),
        quantile(&pooled, (1.0 + p) / 2.0),
    );
    let z = standard_normal_quantile((1.0 + p) / 2.0);
    let mut out = Vec::new();
    let (mut below, mut above) = (0.0f64, 0.0f64);
    let mut last: (f64, usize) = (0.0, 1);
    for i in 0..h {
        let (r, k) = match errors.get(i) {
            Some(e) if e.len() >= 2 => (rms(e), e.len()),
            _ => last,
        };
        last = (r, k);
        let df = (k as f64 / (i + 1) as f64).max(1.0);
        let factor = t_quantile((1.0 + p) / 2.0, df) / z;
        below = below.max(q_hi.max(0.0) * r * factor);
        above = above.max((-q_lo).max(0.0) * r * factor);
        out.push((below, above));
    }
    out
}

/// Quantile of sorted values (Hyndman & Fan definition 7).
fn quantile(sorted: &[f64], p: f64) -> f64 {
    morrowcast_engine::bands::quantile_sorted(sorted, p).unwrap_or(0.0)
}

/// The shape from the pooled standardised errors (their own quantiles, both tails), the scale
/// per horizon, and the scale's estimation noise as the t/z ratio for k_h / h effective errors.
fn shape_t_eff(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let scales: Vec<f64> = errors.iter().map(|e| rms(e)).collect();
    let mut pooled: Vec<f64> = errors
        .iter()
        .zip(&scales)
        .flat_map(|(e, r)| e.iter().filter(move |_| *r > 0.0).map(move |x| x / r))
        .collect();
    pooled.sort_by(f64::total_cmp);
    if pooled.len() < 20 {
        return t_eff(errors, h, p);
    }
    // e = F - D: demand above the forecast is a negative error.
    let (q_lo, q_hi) = (
        quantile(&pooled, (1.0 - p) / 2.0),
        quantile(&pooled, (1.0 + p) / 2.0),
    );
    let z = standard_normal_quantile((1.0 + p) / 2.0);
    let mut out = Vec::new();
    let (mut below, mut above) = (0.0f64, 0.0f64);
    let mut last: (f64, usize) = (0.0, 1);
    for i in 0..h {
        let (r, k) = match errors.get(i) {
            Some(e) if e.len() >= 2 => (rms(e), e.len()),
            _ => last,
        };
        last = (r, k);
        let df = (k as f64 / (i + 1) as f64).max(1.0);
        let factor = t_quantile((1.0 + p) / 2.0, df) * (1.0 + 1.0 / df).sqrt() / z;
        below = below.max(q_hi.max(0.0) * r * factor);
        above = above.max((-q_lo).max(0.0) * r * factor);
        out.push((below, above));
    }
    out
}

/// Standardised errors with a scale that leaves out the error itself and its neighbours that
/// share shocks with it (h-block leave-out: origins within h - 1 of it), pooled over the
/// horizons; the band is the full scale times their quantiles (both tails).
fn jack_block(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let mut pooled = Vec::new();
    let mut scales = Vec::new();
    for (i, e) in errors.iter().enumerate() {
        let k = e.len();
        scales.push(rms(e));
        let block = i; // neighbours on each side sharing shocks with an (i+1)-step error
        for j in 0..k {
            let lo = j.saturating_sub(block);
            let hi = (j + block + 1).min(k);
            let rest: Vec<f64> = e[..lo].iter().chain(&e[hi..]).copied().collect();
            if rest.len() >= 2 {
                let r = rms(&rest);
                if r > 0.0 {
                    pooled.push(e[j] / r);
                }
            }
        }
    }
    pooled.sort_by(f64::total_cmp);
    if pooled.len() < 20 {
        return t_eff(errors, h, p);
    }
    let (q_lo, q_hi) = (
        quantile(&pooled, (1.0 - p) / 2.0),
        quantile(&pooled, (1.0 + p) / 2.0),
    );
    let mut out = Vec::new();
    let (mut below, mut above) = (0.0f64, 0.0f64);
    let mut last = 0.0;
    for i in 0..h {
        let r = match errors.get(i) {
            Some(e) if e.len() >= 2 => rms(e),
            _ => last,
        };
        last = r;
        below = below.max(q_hi.max(0.0) * r);
        above = above.max((-q_lo).max(0.0) * r);
        out.push((below, above));
    }
    out
}

/// Conformal on scaled errors: per-horizon scale r_h (RMS), scores |e|/r_h pooled over all
/// horizons, the ceil((n+1)p)-th smallest score.
fn conformal(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let scales: Vec<f64> = errors.iter().map(|e| rms(e)).collect();
    let mut scores: Vec<f64> = errors
        .iter()
        .zip(&scales)
        .flat_map(|(e, r)| e.iter().filter(move |_| *r > 0.0).map(move |x| x.abs() / r))
        .collect();
    scores.sort_by(f64::total_cmp);
    let n = scores.len();
    let rank = (((n + 1) as f64) * p).ceil() as usize;
    let q = if rank >= 1 && rank <= n {
        scores[rank - 1]
    } else {
        *scores.last().unwrap_or(&2.0) * 1.5
    };
    let mut out = Vec::new();
    let mut widest = 0.0f64;
    for i in 0..h {
        let r = scales.get(i).copied().unwrap_or(0.0);
        widest = widest.max(q * r);
        out.push((widest, widest));
    }
    out
}

/// Conformal's pooled scaled scores for the shape (their ceil((n+1)p)-th smallest, symmetric),
/// the scale per horizon with its estimation noise as t_df(p) / z(p), df from `df`; the
/// t rule (scaled_band) where fewer than `least` scores lie beyond the quantile.
fn conformal_scaled(
    errors: &[Vec<f64>],
    h: usize,
    p: f64,
    df: fn(usize, usize) -> f64,
    least: f64,
) -> Vec<(f64, f64)> {
    let scales: Vec<f64> = errors.iter().map(|e| rms(e)).collect();
    let mut scores: Vec<f64> = errors
        .iter()
        .zip(&scales)
        .filter(|(e, _)| e.len() >= 2)
        .flat_map(|(e, r)| e.iter().filter(move |_| *r > 0.0).map(move |x| x.abs() / r))
        .collect();
    let n = scores.len();
    let rank = (((n + 1) as f64) * p).ceil() as usize;
    if (n as f64) * (1.0 - p) < least || rank > n || rank == 0 {
        return scaled_band(errors, h, p, df, f64::INFINITY);
    }
    scores.sort_by(f64::total_cmp);
    let q = scores[rank - 1];
    let upper = (1.0 + p) / 2.0;
    let z = standard_normal_quantile(upper);
    let mut out = Vec::new();
    let mut widest = 0.0f64;
    for i in 0..h {
        if let Some(e) = errors.get(i).filter(|e| e.len() >= 2) {
            let t = morrowcast_engine::bands::student_t_quantile(upper, df(e.len(), i + 1));
            widest = widest.max(q * t / z * rms(e));
        }
        out.push((widest, widest));
    }
    out
}

fn conformal_t(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    conformal_scaled(errors, h, p, k_over_h, 10.0)
}

fn conformal_bt(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    conformal_scaled(errors, h, p, bartlett_df, 10.0)
}

fn conformal_t5(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    conformal_scaled(errors, h, p, k_over_h, 5.0)
}

/// Like backtest::band_origins, with `stride` periods between origins: the latest ends whose
/// whole horizon falls in the history, every `stride`-th going back, then later ends with the
/// horizon cut at the end of the data.
fn strided_origins(
    length: usize,
    horizon: usize,
    min_train: usize,
    most: usize,
    stride: usize,
) -> Vec<usize> {
    let mut ends = Vec::new();
    let full_last = length.saturating_sub(horizon);
    let mut end = full_last;
    while ends.len() < most && end >= min_train && end > 0 {
        ends.push(end);
        if end < stride {
            break;
        }
        end -= stride;
    }
    let mut partial = full_last + 1;
    while ends.len() < most && partial < length {
        if partial >= min_train {
            ends.push(partial);
        }
        partial += stride;
    }
    ends.sort_unstable();
    ends
}

fn main() {
    let all = chosen_series();
    let rules: [(&str, Rule); 17] = [
        ("engine", engine),
        ("iso_t", iso_t),
        ("iso_bartlett", iso_bartlett),
        ("no_max", no_max),
        ("conformal_t", conformal_t),
        ("conformal_bt", conformal_bt),
        ("conformal_t5", conformal_t5),
        ("bartlett", bartlett),
        ("kurt_t", kurt_t),
        ("bartlett_kurt", bartlett_kurt),
        ("t_pure", t_pure),
        ("t_rms", t_rms),
        ("t_eff", t_eff),
        ("shape_t_eff", shape_t_eff),
        ("hybrid", hybrid),
        ("jack_block", jack_block),
        ("conformal", conformal),
    ];
    // (most origins, periods between origins)
    let patterns = [
        (8usize, 1usize),
        (36, 1),
        (12, 3),
        (12, 2),
        (9, 4),
        (18, 2),
        (1000, 1),
    ];
    let mut scores: BTreeMap<(String, String), Score> = BTreeMap::new();
    let mut by_third: BTreeMap<(String, String), [usize; 3]> = BTreeMap::new();
    for s in &all {
        let settings = PlanSettings::default()
            .with_horizon(Some(s.horizon as u64))
            .unwrap();
        let Ok(p) = plan::plan_item(&series_for(s), &settings) else {
            continue;
        };
        let point: Vec<f64> = p.forecast.iter().map(|f| f.band.value).collect();
        let today_mean =
            (point.iter().map(|v| v.abs()).sum::<f64>() / point.len().max(1) as f64).max(1e-9);
        let min_train =
            (2 * p.seasons.for_candidate(&p.chosen).unwrap_or(1)).max(plan::MIN_PERIODS);
        // Forecasts at every end any pattern uses, made once per series.
        let mut made: BTreeMap<usize, Option<Vec<f64>>> = BTreeMap::new();
        for (count, stride) in patterns {
            let ends = strided_origins(s.train.len(), s.horizon, min_train, count, stride);
            let mut errors = vec![Vec::new(); s.horizon];
            // Errors relative to the forecast they belong to, for bands that scale with it.
            let mut relative = vec![Vec::new(); s.horizon];
            // Errors over the forecast's own shape: |f_h| / mean |f| of that origin's path.
            let mut shaped = vec![Vec::new(); s.horizon];
            for end in ends {
                let steps = s.horizon.min(s.train.len() - end);
                let f = made.entry(end).or_insert_with(|| {
                    backtest::forecast_with(&p.chosen, &s.train[..end], p.seasons, steps).ok()
                });
                if let Some(f) = f {
                    for (h, (fv, d)) in f.iter().zip(&s.train[end..end + steps]).enumerate() {
                        errors[h].push(fv - d);
                        if fv.abs() > 1e-9 {
                            relative[h].push((fv - d) / fv.abs());
                        }
                    }
                    let mean = f.iter().map(|v| v.abs()).sum::<f64>() / f.len().max(1) as f64;
                    for (h, (fv, d)) in f.iter().zip(&s.train[end..end + steps]).enumerate() {
                        let shape = fv.abs() / mean;
                        if mean > 1e-9 && shape > 1e-3 {
                            shaped[h].push((fv - d) / shape);
                        }
                    }
                }
            }
            let kinds: &[(&str, &Vec<Vec<f64>>)] = if count == 36 && stride == 1 {
                &[("abs", &errors), ("rel", &relative), ("shape", &shaped)]
            } else {
                &[("abs", &errors)]
            };
            for ((name, rule), (kind, errs)) in
                rules.iter().flat_map(|r| kinds.iter().map(move |k| (r, k)))
            {
                let key = (s.subset.clone(), format!("{name}/{kind}/{count}x{stride}"));
                let score = scores.entry(key).or_default();
                for (li, level) in [0.95, 0.80].iter().enumerate() {
                    let offsets = rule(errs, s.horizon, *level);
                    let alpha = 1.0 - level;
                    for ((y, f), (below, above)) in s.test.iter().zip(&point).zip(&offsets) {
                        let unit = match *kind {
                            "rel" => f.abs(),
                            "shape" => f.abs() / today_mean,
                            _ => 1.0,
                        };
                        let (low, high) = ((f - below * unit).max(0.0), f + above * unit);
                        if low <= *y && *y <= high {
                            score.inside[li] += 1;
                        }
                        // How the 36-origin bands hold by thirds of the horizon.
                        if count == 36 && stride == 1 && *kind == "abs" {
                            let h = s.test.iter().position(|t| std::ptr::eq(t, y)).unwrap_or(0);
                            let third = 3 * h / s.horizon;
                            let part = by_third
                                .entry((s.subset.clone(), format!("{name}@{}", third + 1)))
                                .or_insert([0usize; 3]);
                            part[li] += usize::from(low <= *y && *y <= high);
                            if li == 0 {
                                part[2] += 1;
                            }
                        }
                        let pen = (2.0 / alpha) * ((low - y).max(0.0) + (y - high).max(0.0));
                        score.msis[li] += ((high - low) + pen) / scale(s);
                    }
                }
                score.count += s.test.len().min(s.horizon);
            }
        }
        let _ = &s.id;
    }
    println!("| subset | rule@third of the horizon (36 origins) | 95% holds | 80% holds |");
    for ((subset, rule), [in95, in80, n]) in &by_third {
        let n = (*n).max(1) as f64;
        println!(
            "| {subset} | {rule} | {:.1}% | {:.1}% |",
            100.0 * *in95 as f64 / n,
            100.0 * *in80 as f64 / n
        );
    }
    println!("| subset | rule/origins | 95% holds | MSIS 95 | 80% holds | MSIS 80 |");
    for ((subset, rule), sc) in &scores {
        let c = sc.count.max(1) as f64;
        println!(
            "| {subset} | {rule} | {:.1}% | {:.2} | {:.1}% | {:.2} |",
            100.0 * sc.inside[0] as f64 / c,
            sc.msis[0] / c,
            100.0 * sc.inside[1] as f64 / c,
            sc.msis[1] / c
        );
    }
}
