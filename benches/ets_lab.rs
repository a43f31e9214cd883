//! ETS laboratory: would choosing among the exponential smoothing models by AICc (Hyndman,
//! Koehler, Snyder & Grose 2002, IJF 18; additive errors, the models Morrowcast fits) help the
//! automatic choice on the M3 data? A research tool: each series is planned as the page plans
//! it, then the AICc choice is fitted on the same train part and put beside, into or in place of
//! members of the plan's combination; every rule is scored on the held-out actuals (sMAPE with
//! |y| + |f| in the denominator, MASE). The README records what it showed.
//!
//! AICc = n ln(SSE / n) + 2k + 2k(k + 1) / (n - k - 1), k = the smoothing parameters, the free
//! initial states (l0, b0, m - 1 seasonal) and the error variance (Hyndman et al. 2002, eq. for
//! the Gaussian likelihood of additive errors, up to a constant).
//!
//! Run: `cargo bench --bench ets_lab [-- --subset YEARLY --limit 200]` (about 30 s).

use std::collections::BTreeMap;

use morrowcast_engine::backtest::{self, Candidate};
use morrowcast_engine::methods::smoothing::criterion::{corrected_aic, likelihoods};
use morrowcast_engine::methods::smoothing::KINDS;
use morrowcast_engine::methods::{self, MethodKind};
use morrowcast_engine::plan::ItemPlan;

#[path = "common/m3_data.rs"]
mod m3_data;
use m3_data::{chosen_series, planned, RuleScores};

/// The AICc-chosen smoothing model's forecast, and its kind; with `both_errors` each fit is
/// also scored as a multiplicative-error model (the engine's `criterion::likelihoods`), when
/// every fitted value is positive. Unlike the engine's method, the non-seasonal models are
/// fitted to the raw history and k counts no seasonal adjustment: the lab as first run.
fn by_aicc(
    train: &[f64],
    season: Option<usize>,
    horizon: usize,
    both_errors: bool,
) -> Option<(MethodKind, Vec<f64>)> {
    let mut best: Option<(f64, MethodKind, Vec<f64>)> = None;
    for kind in KINDS {
        let m = if kind.needs_season() { season } else { None };
        if kind.needs_season() && m.is_none() {
            continue;
        }
        let Ok(fit) = methods::fit(kind, train, m, horizon) else {
            continue;
        };
        let Some(l) = likelihoods(fit.fitted(), train) else {
            continue;
        };
        let seasonal_states = m.map_or(0, |m| m - 1);
        let k = fit.parameters().len() + seasonal_states + 1;
        let minus_two_ll = match l.multiplicative.filter(|_| both_errors) {
            Some(multiplicative) => l.additive.min(multiplicative),
            None => l.additive,
        };
        let Some(aicc) = corrected_aic(minus_two_ll, l.periods, k) else {
            continue;
        };
        if best.as_ref().is_none_or(|b| aicc < b.0) {
            best = Some((aicc, kind, fit.forecast().to_vec()));
        }
    }
    best.map(|(_, k, f)| (k, f))
}

/// The ranking's single methods best first, without the two Theta models and the AICc method
/// (the places the rules fill from it).
fn ranked_others(p: &ItemPlan) -> Vec<MethodKind> {
    p.backtest
        .ranking
        .iter()
        .filter_map(|r| match r.candidate {
            Candidate::Method(k) => Some(k),
            Candidate::Combination(_) => None,
        })
        .filter(|k| {
            !matches!(
                k,
                MethodKind::Theta | MethodKind::DynamicOptimisedTheta | MethodKind::SmoothingByAicc
            )
        })
        .collect()
}

fn mean(forecasts: &[&Vec<f64>], h: usize) -> Vec<f64> {
    (0..h)
        .map(|i| forecasts.iter().map(|f| f[i]).sum::<f64>() / forecasts.len() as f64)
        .collect()
}

fn main() {
    let all = chosen_series();
    let mut scores = RuleScores::default();
    let mut picked: BTreeMap<(String, &str), usize> = BTreeMap::new();
    for s in &all {
        let h = s.horizon;
        let Some((p, auto)) = planned(s) else {
            continue;
        };
        let season = p.seasons.for_method(MethodKind::HoltWintersAdditive);
        let Some((kind, ets)) = by_aicc(&s.train, season, h, false) else {
            continue;
        };
        let both = by_aicc(&s.train, season, h, true).map_or_else(|| ets.clone(), |b| b.1);
        *picked.entry((s.subset.clone(), kind.key())).or_default() += 1;
        let members = p.chosen.members();
        let member_forecasts: Vec<Vec<f64>> = members
            .iter()
            .map(|k| {
                backtest::forecast_with(&Candidate::Method(*k), &s.train, p.seasons, h)
                    .unwrap_or_else(|_| auto.clone())
            })
            .collect();
        let theta_pair: Vec<&Vec<f64>> = members
            .iter()
            .zip(&member_forecasts)
            .filter(|(k, _)| matches!(k, MethodKind::Theta | MethodKind::DynamicOptimisedTheta))
            .map(|(_, f)| f)
            .collect();
        let others: Vec<&Vec<f64>> = members
            .iter()
            .zip(&member_forecasts)
            .filter(|(k, _)| !matches!(k, MethodKind::Theta | MethodKind::DynamicOptimisedTheta))
            .map(|(_, f)| f)
            .collect();
        let mut rules: Vec<(&str, Vec<f64>)> = vec![("auto (today)", auto.clone())];
        // With an accepted season: the anchors, the AICc method and the best `k` others of
        // the ranking (today: k = 2), each forecast on the whole train part.
        if p.seasons.accepted_length().is_some() {
            let ranked = ranked_others(&p);
            let base = [
                MethodKind::DynamicOptimisedTheta,
                MethodKind::Theta,
                MethodKind::SmoothingByAicc,
            ];
            for (name, k, with_aicc) in [
                ("seasonal: anchors + AICc + best 1", 1usize, true),
                ("seasonal: anchors + AICc + best 3", 3, true),
                ("seasonal: anchors + best 2 (no AICc)", 2, false),
            ] {
                let kinds: Vec<MethodKind> = base
                    .iter()
                    .copied()
                    .filter(|b| with_aicc || *b != MethodKind::SmoothingByAicc)
                    .chain(ranked.iter().copied().take(k))
                    .collect();
                let f =
                    backtest::forecast_with(&Candidate::Combination(kinds), &s.train, p.seasons, h)
                        .unwrap_or_else(|_| auto.clone());
                rules.push((name, f));
            }
            for name in [
                "no season: former rule from 30 pooled errors, else anchors + AICc",
                "no season: anchors + best 2 (no AICc)",
                "no season: others from 24 pooled errors",
                "no season: others from 30 pooled errors",
                "no season: others from 36 pooled errors",
            ] {
                rules.push((name, auto.clone()));
            }
        } else {
            // Without a season: the best two others too where the backtest pooled at least
            // `least` holdout errors to rank them by.
            let pooled = p.backtest.origins_used * p.backtest.holdout_demand.len();
            let ranked: Vec<MethodKind> = ranked_others(&p).into_iter().take(2).collect();
            let former: Vec<MethodKind> = [MethodKind::DynamicOptimisedTheta, MethodKind::Theta]
                .into_iter()
                .chain(ranked.iter().copied())
                .collect();
            let former =
                backtest::forecast_with(&Candidate::Combination(former), &s.train, p.seasons, h)
                    .unwrap_or_else(|_| auto.clone());
            rules.push((
                "no season: former rule from 30 pooled errors, else anchors + AICc",
                if pooled >= 30 {
                    former.clone()
                } else {
                    auto.clone()
                },
            ));
            rules.push(("no season: anchors + best 2 (no AICc)", former));
            let mut kinds = vec![
                MethodKind::DynamicOptimisedTheta,
                MethodKind::Theta,
                MethodKind::SmoothingByAicc,
            ];
            kinds.extend(ranked);
            let with_others =
                backtest::forecast_with(&Candidate::Combination(kinds), &s.train, p.seasons, h)
                    .unwrap_or_else(|_| auto.clone());
            for (name, least) in [
                ("no season: others from 24 pooled errors", 24usize),
                ("no season: others from 30 pooled errors", 30),
                ("no season: others from 36 pooled errors", 36),
            ] {
                rules.push((
                    name,
                    if pooled >= least {
                        with_others.clone()
                    } else {
                        auto.clone()
                    },
                ));
            }
            rules.push(("seasonal: anchors + AICc + best 1", auto.clone()));
            rules.push(("seasonal: anchors + AICc + best 3", auto.clone()));
            rules.push(("seasonal: anchors + best 2 (no AICc)", auto.clone()));
        }
        rules.push(("ETS by AICc alone", ets.clone()));
        rules.push(("ETS, A and M errors, alone", both.clone()));
        if members.len() > 1 {
            let mut five: Vec<&Vec<f64>> = member_forecasts.iter().collect();
            five.push(&ets);
            rules.push(("the combination plus ETS by AICc", mean(&five, h)));
            if let Some(best_other) = others.first() {
                let mut four = theta_pair.clone();
                four.push(best_other);
                four.push(&ets);
                rules.push(("Theta pair + best other + ETS by AICc", mean(&four, h)));
            }
            let mut three = theta_pair.clone();
            three.push(&ets);
            rules.push(("Theta pair + ETS by AICc", mean(&three, h)));
            let mut three = theta_pair.clone();
            three.push(&both);
            rules.push(("Theta pair + ETS, A and M errors", mean(&three, h)));
            let mut five: Vec<&Vec<f64>> = member_forecasts.iter().collect();
            five.push(&both);
            rules.push(("the combination plus ETS, A and M errors", mean(&five, h)));
            let seasonless = p.seasons.accepted_length().is_none();
            let mut pair_both = theta_pair.clone();
            pair_both.push(&both);
            let pair_both = mean(&pair_both, h);
            let five_both = mean(&five, h);
            rules.push((
                "no season: pair + ETS A/M; else today's",
                if seasonless {
                    pair_both.clone()
                } else {
                    auto.clone()
                },
            ));
            rules.push((
                "no season: pair + ETS A/M; else today's + ETS A/M",
                if seasonless { pair_both } else { five_both },
            ));
        } else {
            rules.push(("the combination plus ETS by AICc", auto.clone()));
            rules.push(("Theta pair + best other + ETS by AICc", auto.clone()));
            rules.push(("Theta pair + ETS by AICc", auto.clone()));
            rules.push(("Theta pair + ETS, A and M errors", auto.clone()));
            rules.push(("the combination plus ETS, A and M errors", auto.clone()));
            rules.push(("no season: pair + ETS A/M; else today's", auto.clone()));
            rules.push((
                "no season: pair + ETS A/M; else today's + ETS A/M",
                auto.clone(),
            ));
        }
        for (name, f) in rules {
            scores.add(s, name, &f);
        }
    }
    scores.print(2);
    println!("| subset | model picked by AICc | series |");
    for ((subset, kind), n) in &picked {
        println!("| {subset} | {kind} | {n} |");
    }
}
