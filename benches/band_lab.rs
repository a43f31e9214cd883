//! Band laboratory: how ways of turning rolling-origin errors into bands hold on the M3 data.
//! A research tool for choosing the band rule (the plan's own bands are scored by m3.rs); the
//! README records what it showed. Each series is planned as the page would plan it; then the
//! chosen candidate is refitted at the rolling origins (8, 36 or every one) and each rule turns
//! the errors into bands, scored on the held-out actuals.
//!
//! Rules: engine (bands::rolling_band, the rule the plan uses); t_pure (the same, written
//! here); t_rms (df = k); t_eff (df = k / h with sqrt(1 + 1/df)); shape_t_eff and hybrid (the
//! pooled standardised errors' own quantiles); jack_block (an h-block leave-out scale);
//! conformal (split conformal on scaled errors). "rel" variants (36 origins) take each error
//! relative to its own forecast and scale the band by today's forecast; "shape" variants
//! divide each error by its forecast's size against the mean of that origin's path, and scale
//! today's band by the same shape of today's forecast (a seasonal item's band follows its
//! season, the scale stays additive).
//!
//! Run: `cargo bench --bench band_lab [-- --subset YEARLY --limit 200]` (a few minutes).

use std::collections::BTreeMap;

use morrowcast_engine::backtest;
use morrowcast_engine::bands::standard_normal_quantile;
use morrowcast_engine::plan;
use morrowcast_engine::settings::PlanSettings;

#[path = "common/m3_data.rs"]
mod m3_data;
use m3_data::{load, seasonal_scale as scale, series_for};

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

/// The engine's rule, bands::rolling_band (equal to t_pure).
fn engine(errors: &[Vec<f64>], h: usize, p: f64) -> Vec<(f64, f64)> {
    let level = morrowcast_engine::bands::Level::new(p * 100.0).unwrap();
    let f = vec![0.0; h];
    match morrowcast_engine::bands::rolling_band(&f, errors, level, false) {
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
    let args: Vec<String> = std::env::args().collect();
    let arg = |name: &str| {
        args.iter()
            .position(|a| a == name)
            .and_then(|i| args.get(i + 1))
            .cloned()
    };
    let subset_filter = arg("--subset");
    let limit: usize = arg("--limit")
        .and_then(|v| v.parse().ok())
        .unwrap_or(usize::MAX);
    let all = load(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/fixtures/m3/m3.csv"
    ));
    let rules: [(&str, Rule); 8] = [
        ("engine", engine),
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
    let mut taken: BTreeMap<String, usize> = BTreeMap::new();
    for s in all
        .iter()
        .filter(|s| subset_filter.as_deref().is_none_or(|f| f == s.subset))
    {
        let n = taken.entry(s.subset.clone()).or_default();
        if *n >= limit {
            continue;
        }
        *n += 1;
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
                        let pen = (2.0 / alpha) * ((low - y).max(0.0) + (y - high).max(0.0));
                        score.msis[li] += ((high - low) + pen) / scale(s);
                    }
                }
                score.count += s.test.len().min(s.horizon);
            }
        }
        let _ = &s.id;
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
