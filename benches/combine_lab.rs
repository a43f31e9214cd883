//! Combination laboratory: would weighting the combination's members by their backtest errors,
//! one more member always, or forecasting bucket totals at coarser levels (temporal
//! aggregation), help the automatic choice on the M3 data? A research tool: each series is planned as the page plans it, its
//! members are forecast on the whole train part and mixed by each rule; every rule is scored on
//! the held-out actuals (sMAPE with |y| + |f| in the denominator, MASE). The README records what
//! it showed.
//!
//! Run: `cargo bench --bench combine_lab [-- --subset MONTHLY --limit 200]` (about 30 s).

use morrowcast_engine::backtest::{self, Candidate, Seasons};
use morrowcast_engine::methods::MethodKind;

#[path = "common/m3_data.rs"]
mod m3_data;
use m3_data::{chosen_series, planned, M3Series, RuleScores};

/// The members' forecasts mixed with weights proportional to `weights`.
fn weighted(forecasts: &[Vec<f64>], weights: &[f64], h: usize) -> Vec<f64> {
    let total: f64 = weights.iter().sum();
    (0..h)
        .map(|i| {
            forecasts
                .iter()
                .zip(weights)
                .map(|(f, w)| f[i] * w)
                .sum::<f64>()
                / total
        })
        .collect()
}

/// The history in buckets of `k` periods (sums), the oldest `len % k` periods left out so the
/// last bucket ends with the history.
fn aggregate(history: &[f64], k: usize) -> Vec<f64> {
    history[history.len() % k..]
        .chunks(k)
        .map(|c| c.iter().sum())
        .collect()
}

/// Temporal aggregation: at each level k the anchors' combination forecasts the bucket totals;
/// each bucket total is spread over its periods in the proportions of `base` (the plan's own
/// forecast there), and the levels' forecasts are averaged (top-down by forecast proportions,
/// Athanasopoulos, Ahmed & Hyndman 2009; levels as in Kourentzes, Petropoulos & Trapero 2014).
fn temporal(
    s: &M3Series,
    base: &[f64],
    season: Option<usize>,
    levels: &[usize],
    members: &[MethodKind],
) -> Vec<f64> {
    let h = s.horizon;
    let mut sum = vec![0.0; h];
    let mut used = 0usize;
    for &k in levels {
        if k == 1 {
            for (t, v) in sum.iter_mut().enumerate() {
                *v += base[t];
            }
            used += 1;
            continue;
        }
        let agg = aggregate(&s.train, k);
        if agg.len() < 4 {
            continue;
        }
        let seasons = Seasons::accepted(season.filter(|m| m % k == 0).map(|m| m / k));
        let buckets = h.div_ceil(k);
        let Ok(f) = backtest::forecast_with(
            &Candidate::Combination(members.to_vec()),
            &agg,
            seasons,
            buckets,
        ) else {
            continue;
        };
        for (j, total) in f.iter().enumerate() {
            let span = j * k..(j + 1) * k;
            let share: f64 = base[span.clone()].iter().sum();
            for t in span.filter(|t| *t < h) {
                let part = if share.abs() > 1e-9 {
                    base[t] / share
                } else {
                    1.0 / k as f64
                };
                sum[t] += total * part;
            }
        }
        used += 1;
    }
    sum.iter().map(|v| v / used as f64).collect()
}

fn main() {
    let all = chosen_series();
    let mut scores = RuleScores::default();
    for s in &all {
        let h = s.horizon;
        let Some((p, auto)) = planned(s) else {
            continue;
        };
        let members = p.chosen.members().to_vec();
        let mut rules: Vec<(String, Vec<f64>)> = vec![("auto (today)".into(), auto.clone())];
        if members.len() > 1 {
            for extra in [
                MethodKind::DampedTrend,
                MethodKind::Ses,
                MethodKind::SeasonalNaive,
            ] {
                let mut kinds = members.clone();
                if !kinds.contains(&extra) {
                    kinds.push(extra);
                }
                let f =
                    backtest::forecast_with(&Candidate::Combination(kinds), &s.train, p.seasons, h)
                        .unwrap_or_else(|_| auto.clone());
                rules.push((format!("members + {}", extra.key()), f));
            }
        } else {
            for extra in [
                MethodKind::DampedTrend,
                MethodKind::Ses,
                MethodKind::SeasonalNaive,
            ] {
                rules.push((format!("members + {}", extra.key()), auto.clone()));
            }
        }
        let longest = h.div_ceil(12).max(1) * 12;
        let base = backtest::forecast_with(&p.chosen, &s.train, p.seasons, longest)
            .unwrap_or_else(|_| auto.clone());
        if base.len() >= longest {
            let season = p.seasons.accepted_length();
            let m = s.season;
            let divisors: Vec<usize> = (1..=m).filter(|k| m % k == 0).collect();
            let levels: Vec<usize> = if m > 1 { divisors } else { vec![1, 2, 3] };
            let anchors = [
                MethodKind::DynamicOptimisedTheta,
                MethodKind::Theta,
                MethodKind::SmoothingByAicc,
            ];
            let thetas = [MethodKind::DynamicOptimisedTheta, MethodKind::Theta];
            rules.push((
                "TA: all levels, anchors+AICc".into(),
                temporal(s, &base, season, &levels, &anchors),
            ));
            rules.push((
                "TA: all levels, Theta pair".into(),
                temporal(s, &base, season, &levels, &thetas),
            ));
            let ends = [1, *levels.last().unwrap()];
            rules.push((
                "TA: 1 and top, anchors+AICc".into(),
                temporal(s, &base, season, &ends, &anchors),
            ));
        } else {
            for name in [
                "TA: all levels, anchors+AICc",
                "TA: all levels, Theta pair",
                "TA: 1 and top, anchors+AICc",
            ] {
                rules.push((name.into(), auto.clone()));
            }
        }
        if members.len() > 1 {
            let forecasts: Vec<Vec<f64>> = members
                .iter()
                .map(|k| {
                    backtest::forecast_with(&Candidate::Method(*k), &s.train, p.seasons, h)
                        .unwrap_or_else(|_| auto.clone())
                })
                .collect();
            let measures: Vec<_> = members
                .iter()
                .map(|k| {
                    p.backtest
                        .ranking
                        .iter()
                        .find(|r| r.candidate == Candidate::Method(*k))
                        .map(|r| r.measures.clone())
                })
                .collect();
            let equal = vec![1.0; members.len()];
            rules.push(("equal (recomputed)".into(), weighted(&forecasts, &equal, h)));
            if measures
                .iter()
                .all(|m| m.as_ref().is_some_and(|m| m.mse > 0.0))
            {
                let ms: Vec<_> = measures.into_iter().flatten().collect();
                let inv_mse: Vec<f64> = ms.iter().map(|m| 1.0 / m.mse).collect();
                let inv_mad: Vec<f64> = ms.iter().map(|m| 1.0 / m.mad).collect();
                let inv_rmse: Vec<f64> = ms.iter().map(|m| 1.0 / m.rmse).collect();
                let total: f64 = inv_mse.iter().sum();
                let half: Vec<f64> = inv_mse
                    .iter()
                    .map(|w| 0.5 * w / total + 0.5 / members.len() as f64)
                    .collect();
                rules.push(("1/MSE".into(), weighted(&forecasts, &inv_mse, h)));
                rules.push(("1/MAD".into(), weighted(&forecasts, &inv_mad, h)));
                rules.push(("1/RMSE".into(), weighted(&forecasts, &inv_rmse, h)));
                rules.push((
                    "half 1/MSE, half equal".into(),
                    weighted(&forecasts, &half, h),
                ));
            } else {
                for name in ["1/MSE", "1/MAD", "1/RMSE", "half 1/MSE, half equal"] {
                    rules.push((name.into(), auto.clone()));
                }
            }
        } else {
            for name in [
                "equal (recomputed)",
                "1/MSE",
                "1/MAD",
                "1/RMSE",
                "half 1/MSE, half equal",
            ] {
                rules.push((name.into(), auto.clone()));
            }
        }
        for (name, f) in rules {
            scores.add(s, &name, &f);
        }
    }
    scores.print(3);
}
