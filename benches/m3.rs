//! M3 accuracy benchmark: runs the automatic choice (and our Theta as published, a calibration
//! of this scoring code against the published Theta figures, Theta as the plan fits it, with
//! shrunk seasonal indices, and our dynamic optimised Theta alone) on all 3003 M3 series, seeing
//! only each series' train part, and prints sMAPE and MASE beside the published results.
//!
//! Data: tests/fixtures/m3/m3.csv, the M3 competition series (Makridakis & Hibon 2000, IJF
//! 16:451-476) as distributed with the open data package Mcomp; see tests/fixtures/m3/README.md.
//!
//! Run: `cargo bench --bench m3` (add `-- --subset MONTHLY` or `-- --limit 200` to shorten;
//! `-- --keep 24` cuts each history to its last 24 periods, `-- --by-horizon` prints the bands'
//! scores per horizon and per source of the spread).
//!
//! Scoring (the competition's): sMAPE = 200|y - f|/(y + f) averaged over every series and
//! horizon of a subset; MASE = |y - f| divided by the in-sample mean absolute seasonal
//! difference, averaged the same way. "All" pools every series-horizon of every subset (this
//! reproduces the published "all" figures from the subset figures).
//!
//! Bands, at 95 % and 80 %: the share of held-out actuals inside the band ("holds"), and MSIS
//! as defined for the M4 competition (Makridakis, Spiliotis & Assimakopoulos 2020, IJF 36:
//! 54-74): [(U - L) + (2/a)(L - y)1{y < L} + (2/a)(y - U)1{y > U}] with a = 1 - level, divided
//! by the same in-sample seasonal-difference scale as MASE, averaged like MASE.

// Native only: the rule that sorts go through morrowcast_engine::sorting (clippy.toml) keeps
// the wasm small and does not bind benchmarks and tests.
#![allow(clippy::disallowed_methods)]

use std::collections::BTreeMap;
use std::time::Instant;

use morrowcast_engine::methods::decompose::Indices;
use morrowcast_engine::methods::{self, theta, MethodKind};
use morrowcast_engine::patterns;
use morrowcast_engine::plan;
use morrowcast_engine::settings::PlanSettings;
use morrowcast_engine::stock;

// This benchmark walks the subsets itself (keyed by subset), so the labs' chosen_series is
// not used here.
#[allow(dead_code)]
#[path = "common/m3_data.rs"]
mod m3_data;
use m3_data::{argument, load, seasonal_scale, series_for, M3Series, M3_FILE};

/// Band scores of one subset at one level.
#[derive(Default, Clone)]
struct BandTally {
    inside: usize,
    count: usize,
    msis_sum: f64,
    msis_count: usize,
}

impl BandTally {
    fn add(&mut self, s: &M3Series, bands: &[(f64, f64)], level: f64) {
        let scale = seasonal_scale(s);
        for (y, &band) in s.test.iter().zip(bands) {
            self.add_point(*y, band, scale, level);
        }
    }
    /// Scores horizon `h` (from 0) alone.
    fn add_one(&mut self, s: &M3Series, h: usize, band: (f64, f64), level: f64) {
        if let Some(y) = s.test.get(h) {
            self.add_point(*y, band, seasonal_scale(s), level);
        }
    }
    fn add_point(&mut self, y: f64, (low, high): (f64, f64), scale: f64, level: f64) {
        let alpha = 1.0 - level / 100.0;
        self.count += 1;
        if low <= y && y <= high {
            self.inside += 1;
        }
        let penalty = (2.0 / alpha) * ((low - y).max(0.0) + (y - high).max(0.0));
        let scaled = ((high - low) + penalty) / scale;
        if scaled.is_finite() {
            self.msis_sum += scaled;
            self.msis_count += 1;
        }
    }
    fn cells(&self) -> (String, String) {
        (
            format!(
                "{:.1}%",
                100.0 * self.inside as f64 / self.count.max(1) as f64
            ),
            format!("{:.2}", self.msis_sum / self.msis_count.max(1) as f64),
        )
    }
    fn merge(&mut self, o: &BandTally) {
        self.inside += o.inside;
        self.count += o.count;
        self.msis_sum += o.msis_sum;
        self.msis_count += o.msis_count;
    }
}

#[derive(Default, Clone)]
struct Tally {
    smape_sum: f64,
    smape_count: usize,
    mase_sum: f64,
    mase_count: usize,
}

impl Tally {
    fn add(&mut self, s: &M3Series, forecast: &[f64]) {
        let scale = seasonal_scale(s);
        for (y, f) in s.test.iter().zip(forecast) {
            self.smape_sum += 200.0 * (y - f).abs() / (y.abs() + f.abs());
            self.smape_count += 1;
            let scaled = (y - f).abs() / scale;
            if scaled.is_finite() {
                self.mase_sum += scaled;
                self.mase_count += 1;
            }
        }
    }
    fn cell(&self) -> String {
        format!(
            "{:.2} / {:.2}",
            self.smape_sum / self.smape_count as f64,
            self.mase_sum / self.mase_count as f64
        )
    }
    fn merge(&mut self, o: &Tally) {
        self.smape_sum += o.smape_sum;
        self.smape_count += o.smape_count;
        self.mase_sum += o.mase_sum;
        self.mase_count += o.mase_count;
    }
}

/// Theta as published (the autocorrelation test alone decides the season, classical seasonal
/// indices): the row that checks the scoring against the published Theta figures.
fn classical_theta(s: &M3Series) -> Vec<f64> {
    let series = series_for(s);
    let verdict = patterns::detect_season(&s.train, series.frequency(), None);
    let test_alone =
        verdict.test_passed == Some(true) && verdict.full_seasons >= patterns::MIN_FULL_SEASONS;
    let season = verdict.candidate.filter(|_| test_alone);
    forecast_or_last(
        theta::theta(&s.train, season, Indices::Classical, s.horizon),
        s,
    )
}

/// One method alone on the train part as the plan fits it, with the season the plan would
/// accept (seasonal indices shrunk where it takes a season out).
fn method_forecast(kind: MethodKind, s: &M3Series) -> Vec<f64> {
    let series = series_for(s);
    let season = patterns::detect_season(&s.train, series.frequency(), None).length;
    forecast_or_last(methods::fit(kind, &s.train, season, s.horizon), s)
}

/// A fit's forecast, or the last value repeated if the method could not be fitted.
fn forecast_or_last<E>(fit: Result<methods::Fitted, E>, s: &M3Series) -> Vec<f64> {
    match fit {
        Ok(f) => f.forecast().to_vec(),
        Err(_) => vec![*s.train.last().unwrap_or(&0.0); s.horizon],
    }
}

/// The Stock plan's reorder point held against the held-out demand over the lead time: for each
/// monthly series, lead times 1 to 3 and cycle-service targets 95 % and 90 %, whether the
/// demand of the first L held-out months stayed at or below the reorder point (the issue's
/// policy backtest; the reorder point from `stock::demand_over` and `stock::figures`).
#[derive(Default)]
struct PolicyTally {
    /// (lead time, target index) -> (cases held, cases, cases without a spread).
    cells: BTreeMap<(usize, usize), (usize, usize, usize)>,
}

const POLICY_TARGETS: [f64; 2] = [0.95, 0.90];

impl PolicyTally {
    fn add(&mut self, p: &plan::ItemPlan, test: &[f64]) {
        for lead in 1..=3usize {
            let actual: f64 = test[..lead].iter().sum();
            for (ti, target) in POLICY_TARGETS.iter().enumerate() {
                let cell = self.cells.entry((lead, ti)).or_default();
                cell.1 += 1;
                let Some((demand, _)) = stock::demand_over(p, lead) else {
                    cell.2 += 1;
                    continue;
                };
                let figures = stock::figures(
                    demand,
                    demand,
                    stock::Review::continuous(demand.mean().abs().max(1.0)).unwrap(),
                    demand.mean().abs().max(1.0),
                    stock::Target::cycle_service(*target).unwrap(),
                )
                .unwrap();
                if actual <= figures.level {
                    cell.0 += 1;
                }
            }
        }
    }

    fn print(&self) {
        if self.cells.is_empty() {
            return;
        }
        println!();
        println!(
            "Stock plan, monthly: held-out demand over the lead time at or below the reorder point"
        );
        println!("| lead time | target 95 % | target 90 % |");
        println!("| --- | --- | --- |");
        for lead in 1..=3usize {
            let cell = |ti: usize| {
                let (held, cases, missing) = self.cells[&(lead, ti)];
                let with = cases - missing;
                format!(
                    "{:.1}% of {with}{}",
                    100.0 * held as f64 / with.max(1) as f64,
                    if missing > 0 {
                        format!(" ({missing} without a spread)")
                    } else {
                        String::new()
                    }
                )
            };
            println!("| {lead} | {} | {} |", cell(0), cell(1));
        }
    }
}

fn main() {
    let subset_filter = argument("--subset");
    let limit = m3_data::limit();
    // `--keep N`: a short-history study, each series' train cut to its last N periods.
    let keep: Option<usize> = argument("--keep").and_then(|v| v.parse().ok());
    let mut all = load(M3_FILE);
    if let Some(keep) = keep {
        for s in &mut all {
            let cut = s.train.len().saturating_sub(keep);
            s.train.drain(..cut);
        }
    }
    let subsets = ["YEARLY", "QUARTERLY", "MONTHLY", "OTHER"];
    let mut auto: BTreeMap<&str, Tally> = BTreeMap::new();
    let mut theta: BTreeMap<&str, Tally> = BTreeMap::new();
    let mut shrunk_theta: BTreeMap<&str, Tally> = BTreeMap::new();
    let mut dotm: BTreeMap<&str, Tally> = BTreeMap::new();
    let mut chosen: BTreeMap<String, usize> = BTreeMap::new();
    let levels = [95.0, 80.0];
    let mut bands: BTreeMap<(&str, usize), BandTally> = BTreeMap::new();
    // `--by-horizon`: the bands' scores per horizon and per source of the spread, every
    // subset run pooled (how short histories' long horizons fare).
    let by_horizon = std::env::args().any(|a| a == "--by-horizon");
    let mut horizons: BTreeMap<(usize, usize, String), BandTally> = BTreeMap::new();
    let mut policy = PolicyTally::default();
    let started = Instant::now();
    let mut count = 0;
    for subset in subsets {
        if subset_filter.as_deref().is_some_and(|f| f != subset) {
            continue;
        }
        for s in all.iter().filter(|s| s.subset == subset).take(limit) {
            for (i, level) in levels.iter().enumerate() {
                let settings = PlanSettings::default()
                    .with_horizon(Some(s.horizon as u64))
                    .and_then(|p| p.with_level(*level))
                    .expect("M3 horizons and these levels are within the limits");
                let (forecast, band): (Vec<f64>, Vec<(f64, f64)>) =
                    match plan::plan_item(&series_for(s), &settings) {
                        Ok(p) => {
                            if by_horizon {
                                for (h, f) in p.forecast.iter().enumerate() {
                                    let stand_in = p.notes.iter().any(|n| n.contains("a stand-in"));
                                    let source = format!(
                                        "{:?}{}",
                                        f.source,
                                        if stand_in { " (stand-in)" } else { "" }
                                    );
                                    horizons.entry((i, h + 1, source)).or_default().add_one(
                                        s,
                                        h,
                                        (f.band.low, f.band.high),
                                        *level,
                                    );
                                }
                            }
                            if i == 0 {
                                *chosen.entry(p.chosen.key().to_string()).or_default() += 1;
                                if subset == "MONTHLY" {
                                    policy.add(&p, &s.test);
                                }
                            }
                            p.forecast
                                .iter()
                                .map(|f| (f.band.value, (f.band.low, f.band.high)))
                                .unzip()
                        }
                        Err(e) => {
                            eprintln!("{}: {e}", s.id);
                            let last = *s.train.last().unwrap_or(&0.0);
                            (vec![last; s.horizon], vec![(last, last); s.horizon])
                        }
                    };
                if i == 0 {
                    auto.entry(subset).or_default().add(s, &forecast);
                }
                bands.entry((subset, i)).or_default().add(s, &band, *level);
            }
            theta.entry(subset).or_default().add(s, &classical_theta(s));
            shrunk_theta
                .entry(subset)
                .or_default()
                .add(s, &method_forecast(MethodKind::Theta, s));
            dotm.entry(subset)
                .or_default()
                .add(s, &method_forecast(MethodKind::DynamicOptimisedTheta, s));
            count += 1;
        }
    }
    let elapsed = started.elapsed();
    let published = [
        (
            "Theta (published)",
            [
                "16.90 / 2.81",
                "8.96 / 1.09",
                "13.85 / 0.86",
                "",
                "13.01 / 1.14",
            ],
        ),
        (
            "Comb S-H-D (published)",
            [
                "17.07 / 2.88",
                "9.22 / 1.11",
                "14.48 / 0.90",
                "",
                "13.52 / 1.18",
            ],
        ),
        (
            "Damped (published)",
            [
                "17.36 / 3.03",
                "9.36 / 1.13",
                "14.58 / 0.91",
                "",
                "13.64 / 1.21",
            ],
        ),
    ];
    println!(
        "M3: {count} series in {:.1} s (sMAPE / MASE; all = pooled)",
        elapsed.as_secs_f64()
    );
    println!("| method | yearly | quarterly | monthly | other | all |");
    println!("| --- | --- | --- | --- | --- | --- |");
    for (name, table) in [
        ("Morrowcast automatic choice", &auto),
        ("Morrowcast Theta", &theta),
        ("Morrowcast Theta, shrunk seasonal indices", &shrunk_theta),
        ("Morrowcast dynamic optimised Theta", &dotm),
    ] {
        let mut total = Tally::default();
        let mut cells = Vec::new();
        for subset in subsets {
            match table.get(subset) {
                Some(t) => {
                    cells.push(t.cell());
                    total.merge(t);
                }
                None => cells.push("-".into()),
            }
        }
        println!("| {name} | {} | {} |", cells.join(" | "), total.cell());
    }
    for (name, cells) in published {
        println!("| {name} | {} |", cells.join(" | "));
    }
    println!();
    println!("| subset | 95% band holds | MSIS at 95% | 80% band holds | MSIS at 80% |");
    println!("| --- | --- | --- | --- | --- |");
    let mut totals = [BandTally::default(), BandTally::default()];
    for subset in subsets {
        let mut cells = Vec::new();
        for (i, total) in totals.iter_mut().enumerate() {
            match bands.get(&(subset, i)) {
                Some(t) => {
                    let (holds, msis) = t.cells();
                    cells.push(format!("{holds} | {msis}"));
                    total.merge(t);
                }
                None => cells.push("- | -".into()),
            }
        }
        println!("| {} | {} |", subset.to_lowercase(), cells.join(" | "));
    }
    let all: Vec<String> = totals
        .iter()
        .map(|t| {
            let (holds, msis) = t.cells();
            format!("{holds} | {msis}")
        })
        .collect();
    println!("| all | {} |", all.join(" | "));
    let mut picks: Vec<_> = chosen.into_iter().collect();
    picks.sort_by_key(|p| std::cmp::Reverse(p.1));
    let picks: Vec<String> = picks.iter().map(|(k, v)| format!("{k} {v}")).collect();
    policy.print();
    if by_horizon {
        println!();
        println!("| level | horizon | spread from | count | holds | MSIS |");
        println!("| --- | --- | --- | --- | --- | --- |");
        for ((i, h, source), t) in &horizons {
            let (holds, msis) = t.cells();
            println!(
                "| {} | {h} | {source} | {} | {holds} | {msis} |",
                levels[*i], t.count
            );
        }
    }
    println!("chosen: {}", picks.join(", "));
}
