//! Stock laboratory: does the empirical Stock plan (intermittent and lumpy items) hold the cycle
//! service it states, held out? A research tool: every series is made up here, seeded, by the
//! textbook process for sparse demand (a demand in each period with probability q, its size
//! drawn apart: Croston 1972's setting), planned as the page plans it, and the level over the
//! lead time set against the demand of the next periods, which the plan never saw. Rules for
//! the level from the n demand scenarios, sorted, at target p, and today's expected total and
//! spread (`stock::demand_over`):
//!
//! - type 7: the interpolated p-quantile (Hyndman & Fan 1996, type 7), the rule before;
//! - at or above: the smallest scenario with at least a share p of them at or below it,
//!   the ceil(n p)-th smallest (the empirical distribution's own p-quantile, type 1);
//! - conformal: the ceil((n + 1) p)-th smallest, the largest past n (split conformal, Vovk,
//!   Gammerman & Shafer 2005; Lei et al. 2018), which holds at least p for exchangeable
//!   scenarios;
//! - normal: the expected total plus z_p times the spread;
//! - negative binomial: the smallest count s with P(D <= s) >= p for the negative binomial of
//!   the same mean and variance (Poisson where the variance is not above the mean);
//! - conformal, else negative binomial: conformal where ceil((n + 1) p) <= n;
//! - larger: the larger of conformal and negative binomial;
//! - the engine: `stock::plan_stock` as the page runs it (conformal where the totals are
//!   enough, counting n overlapping totals over L periods as n / L; else the count
//!   distribution, at least the largest total), and the cycle service it states.
//!
//! Run: `cargo bench --bench stock_lab [-- --count 300]` (about a minute). The README records
//! what it showed.

// Native only: the rule that sorts go through morrowcast_engine::sorting (clippy.toml) keeps
// the wasm small and does not bind benchmarks and tests.
#![allow(clippy::disallowed_methods)]

use morrowcast_engine::calendar::Period;
use morrowcast_engine::plan::plan_item;
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::PlanSettings;
use morrowcast_engine::stock::{demand_over, demand_scenarios, plan_stock, StockSettings, Target};

#[path = "common/lab.rs"]
mod lab;
use lab::{count_option, Draws};

/// How a nonzero demand's size is drawn.
#[derive(Clone, Copy)]
enum Size {
    /// 1 + Poisson(mean): small, steady sizes (intermittent).
    OnePlusPoisson(f64),
    /// ceil(exp(N(mu, sigma))): sizes with a long right tail (lumpy).
    LogNormal(f64, f64),
}

impl Size {
    fn draw(self, d: &mut Draws) -> f64 {
        match self {
            Size::OnePlusPoisson(m) => 1.0 + d.poisson(m),
            Size::LogNormal(mu, sigma) => (mu + sigma * d.normal()).exp().ceil(),
        }
    }
}

const RULES: [&str; 8] = [
    "type 7",
    "at or above",
    "conformal",
    "normal",
    "negative binomial",
    "conformal, else negative binomial",
    "larger of conformal and negative binomial",
    "the engine",
];

/// P(0) and the step P(k + 1) / P(k) of the negative binomial of this mean and variance
/// (Poisson where the variance is not above the mean): P(k + 1) = P(k) (k + r) / (k + 1)
/// (1 - q), q = mean / variance, r = mean^2 / (variance - mean).
type CountSteps = (f64, Box<dyn Fn(f64) -> f64>);

fn count_steps(mean: f64, variance: f64) -> CountSteps {
    if variance > mean * 1.000_001 {
        let q = mean / variance;
        let r = mean * mean / (variance - mean);
        (
            q.powf(r),
            Box::new(move |k: f64| (k + r) / (k + 1.0) * (1.0 - q)),
        )
    } else {
        ((-mean).exp(), Box::new(move |k: f64| mean / (k + 1.0)))
    }
}

/// The smallest whole s with P(D <= s) >= p under [`count_steps`]'s distribution.
fn count_level(mean: f64, variance: f64, p: f64) -> f64 {
    if mean <= 0.0 {
        return 0.0;
    }
    let (mut prob, step) = count_steps(mean, variance);
    let mut total = prob;
    let mut k = 0.0;
    while total < p && k < 1e6 {
        prob *= step(k);
        k += 1.0;
        total += prob;
    }
    k
}

/// E[(D - s)+] under [`count_steps`]'s distribution: mean - s + sum_{k <= s} (s - k) P(k).
fn count_loss(mean: f64, variance: f64, s: f64) -> f64 {
    if mean <= 0.0 {
        return 0.0;
    }
    let (mut prob, step) = count_steps(mean, variance);
    let mut below = 0.0;
    let mut k = 0.0;
    while k <= s {
        below += (s - k) * prob;
        prob *= step(k);
        k += 1.0;
    }
    (mean - s + below).max(0.0)
}

fn level(sorted: &[f64], p: f64, rule: usize, mean: f64, sd: f64) -> f64 {
    let n = sorted.len();
    match rule {
        0 => {
            let h = (n - 1) as f64 * p;
            let (lo, frac) = (h.floor() as usize, h - h.floor());
            if lo + 1 < n {
                sorted[lo] + frac * (sorted[lo + 1] - sorted[lo])
            } else {
                sorted[n - 1]
            }
        }
        1 => sorted[((n as f64 * p).ceil() as usize).clamp(1, n) - 1],
        2 => sorted[(((n + 1) as f64 * p).ceil() as usize).clamp(1, n) - 1],
        5 if ((n + 1) as f64 * p).ceil() as usize > n => count_level(mean, sd * sd, p),
        5 => level(sorted, p, 2, mean, sd),
        6 => level(sorted, p, 2, mean, sd).max(count_level(mean, sd * sd, p)),
        3 => {
            mean + sd
                * if p > 0.925 {
                    1.644_853_626_951_472_2
                } else {
                    1.281_551_565_544_600_5
                }
        }
        _ => count_level(mean, sd * sd, p),
    }
}

fn main() {
    let count = count_option(300);
    let processes: [(&str, f64, Size); 4] = [
        ("q 0.3, 1 + Poisson(1)", 0.3, Size::OnePlusPoisson(1.0)),
        ("q 0.15, 1 + Poisson(0.5)", 0.15, Size::OnePlusPoisson(0.5)),
        ("q 0.3, lognormal(1.5, 1)", 0.3, Size::LogNormal(1.5, 1.0)),
        ("q 0.5, lognormal(2, 0.8)", 0.5, Size::LogNormal(2.0, 0.8)),
    ];
    let targets = [0.95, 0.90];
    println!(
        "Empirical Stock plan, held out: share of made-up sparse items whose demand over the \
         lead time stayed at or below the level ({count} series per row and length; only items \
         read as intermittent or lumpy)"
    );
    println!();
    println!("| process | months | lead | items | target | type 7 | at or above | conformal | normal | negative binomial | conformal, else NB | larger | the engine | stated by the engine | scenarios |");
    println!("| --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- | --- |");
    let mut pooled = vec![[0usize; 8]; targets.len()];
    let mut pooled_cases = 0usize;
    let mut pooled_stated = vec![0.0; targets.len()];
    // Per target: the held-out shortage per cycle, the engine's stated one, the count
    // distribution's at the same level, and the rule before (the larger of the totals' plain
    // mean excess and that).
    let mut shortfall = vec![[0.0f64; 4]; targets.len()];
    // The same per lead time, and under fill-rate targets: the held-out shortage and the
    // cycle demand it is measured against, with the fill rate stated.
    let mut by_lead = vec![vec![[0.0f64; 4]; targets.len()]; 3];
    let mut lead_cases = [0usize; 3];
    let mut fill = vec![[0.0f64; 3]; targets.len()];
    let mut fill_by_lead = vec![vec![[0.0f64; 3]; targets.len()]; 3];
    let mut fill_mean = vec![0.0f64; targets.len()];
    for (name, q, size) in processes {
        for months in [24usize, 36, 60] {
            for lead in [1usize, 2, 3] {
                let mut held = vec![[0usize; 8]; targets.len()];
                let mut stated = vec![0.0; targets.len()];
                let mut cases = 0usize;
                let mut scenario_count = 0usize;
                let mut draws = Draws(0x5EED ^ (months as u64) << 8 ^ (lead as u64) << 16);
                for _ in 0..count {
                    let values: Vec<f64> = (0..months + lead)
                        .map(|_| {
                            if draws.uniform() < q {
                                size.draw(&mut draws)
                            } else {
                                0.0
                            }
                        })
                        .collect();
                    let (history, ahead) = values.split_at(months);
                    let Ok(series) = Series::new(
                        "made up",
                        Period::month(2020, 1),
                        history.iter().map(|v| Some(*v)).collect(),
                    ) else {
                        continue;
                    };
                    let Ok(plan) = plan_item(&series, &PlanSettings::default()) else {
                        continue;
                    };
                    if !plan.demand.class.is_sparse() {
                        continue;
                    }
                    let mut sorted = demand_scenarios(&plan, lead);
                    if sorted.len() < 2 {
                        continue;
                    }
                    sorted.sort_by(f64::total_cmp);
                    let actual: f64 = ahead.iter().sum();
                    let Some((demand, _)) = demand_over(&plan, lead) else {
                        continue;
                    };
                    cases += 1;
                    lead_cases[lead - 1] += 1;
                    scenario_count += sorted.len();
                    for (ti, p) in targets.iter().enumerate() {
                        for (rule, h) in held[ti].iter_mut().enumerate().take(7) {
                            if actual <= level(&sorted, *p, rule, demand.mean(), demand.sd()) + 1e-9
                            {
                                *h += 1;
                            }
                        }
                        let settings =
                            StockSettings::new(lead, None, Target::cycle_service(*p).unwrap())
                                .unwrap();
                        let stock = plan_stock(&plan, &settings).unwrap();
                        stated[ti] += stock.figures.cycle_service_level;
                        let level = stock.figures.level;
                        shortfall[ti][0] += (actual - level).max(0.0);
                        shortfall[ti][1] += stock.figures.expected_shortage;
                        let model = count_loss(demand.mean(), demand.sd().powi(2), level);
                        shortfall[ti][2] += model;
                        let plain = sorted.iter().map(|x| (x - level).max(0.0)).sum::<f64>()
                            / sorted.len() as f64;
                        shortfall[ti][3] += model.max(plain);
                        let row = &mut by_lead[lead - 1][ti];
                        row[0] += (actual - level).max(0.0);
                        row[1] += stock.figures.expected_shortage;
                        row[3] += model.max(plain);
                        let settings =
                            StockSettings::new(lead, None, Target::fill_rate(*p).unwrap()).unwrap();
                        let for_fill = plan_stock(&plan, &settings).unwrap();
                        fill[ti][0] += (actual - for_fill.figures.level).max(0.0);
                        fill[ti][1] += for_fill.cycle_demand;
                        fill[ti][2] += for_fill.figures.fill_rate;
                        fill_mean[ti] += (1.0
                            - (actual - for_fill.figures.level).max(0.0) / for_fill.cycle_demand)
                            .max(0.0);
                        let f = &mut fill_by_lead[lead - 1][ti];
                        f[0] += (actual - for_fill.figures.level).max(0.0);
                        f[1] += for_fill.cycle_demand;
                        if actual <= stock.figures.level + 1e-9 {
                            held[ti][7] += 1;
                        }
                    }
                }
                pooled_cases += cases;
                for (ti, p) in targets.iter().enumerate() {
                    let share = |h: usize| 100.0 * h as f64 / cases.max(1) as f64;
                    println!(
                        "| {name} | {months} | {lead} | {cases} | {:.0} % | {:.1} | {:.1} | {:.1} | {:.1} | {:.1} | {:.1} | {:.1} | {:.1} | {:.1} | {:.1} |",
                        100.0 * p,
                        share(held[ti][0]),
                        share(held[ti][1]),
                        share(held[ti][2]),
                        share(held[ti][3]),
                        share(held[ti][4]),
                        share(held[ti][5]),
                        share(held[ti][6]),
                        share(held[ti][7]),
                        100.0 * stated[ti] / cases.max(1) as f64,
                        scenario_count as f64 / cases.max(1) as f64
                    );
                    for rule in 0..8 {
                        pooled[ti][rule] += held[ti][rule];
                    }
                    pooled_stated[ti] += stated[ti];
                }
            }
        }
    }
    println!();
    println!("Pooled over every row ({pooled_cases} cases per target):");
    for (ti, p) in targets.iter().enumerate() {
        let cells: Vec<String> = (0..8)
            .map(|r| {
                format!(
                    "{} {:.1} %",
                    RULES[r],
                    100.0 * pooled[ti][r] as f64 / pooled_cases.max(1) as f64
                )
            })
            .collect();
        println!(
            "target {:.0} %: {}; stated by the engine {:.1} %",
            100.0 * p,
            cells.join(", "),
            100.0 * pooled_stated[ti] / pooled_cases.max(1) as f64
        );
        let per = |v: f64| v / pooled_cases.max(1) as f64;
        println!(
            "  shortage per cycle, held out {:.4}; stated by the engine {:.4}; the count \
             distribution's at the same level {:.4}; the rule before (the larger of the \
             totals' plain mean excess and that) {:.4}",
            per(shortfall[ti][0]),
            per(shortfall[ti][1]),
            per(shortfall[ti][2]),
            per(shortfall[ti][3])
        );
        for (l, rows) in by_lead.iter().enumerate() {
            let per = |v: f64| v / lead_cases[l].max(1) as f64;
            let r = rows[ti];
            println!(
                "    lead time {}: held out {:.4}; stated {:.4}; the rule before {:.4}",
                l + 1,
                per(r[0]),
                per(r[1]),
                per(r[3])
            );
        }
        println!(
            "  fill-rate target {:.0} %: held out {:.1} % (1 - shortage / cycle demand, pooled); \
             stated {:.1} %",
            100.0 * p,
            100.0 * (1.0 - fill[ti][0] / fill[ti][1].max(f64::MIN_POSITIVE)),
            100.0 * per(fill[ti][2])
        );
        let held: Vec<String> = fill_by_lead
            .iter()
            .map(|rows| {
                let f = rows[ti];
                format!(
                    "{:.1} %",
                    100.0 * (1.0 - f[0] / f[1].max(f64::MIN_POSITIVE))
                )
            })
            .collect();
        println!(
            "    held out at lead times 1 / 2 / 3: {}; the items' own fill rates, averaged: {:.1} %",
            held.join(" / "),
            100.0 * per(fill_mean[ti])
        );
    }
}
