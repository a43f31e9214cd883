//! M3 accuracy benchmark: runs the automatic choice (and our Theta, as a calibration of this
//! scoring code against the published Theta figures) on all 3003 M3 series, seeing only each
//! series' train part, and prints sMAPE and MASE beside the published results.
//!
//! Data: tests/fixtures/m3/m3.csv, the M3 competition series (Makridakis & Hibon 2000, IJF
//! 16:451-476) as distributed with the open data package Mcomp; see tests/fixtures/m3/README.md.
//!
//! Run: `cargo bench --bench m3` (add `-- --subset MONTHLY` or `-- --limit 200` to shorten).
//!
//! Scoring (the competition's): sMAPE = 200|y - f|/(y + f) averaged over every series and
//! horizon of a subset; MASE = |y - f| divided by the in-sample mean absolute seasonal
//! difference, averaged the same way. "All" pools every series-horizon of every subset (this
//! reproduces the published "all" figures from the subset figures).

use std::collections::BTreeMap;
use std::time::Instant;

use morrowcast_engine::calendar::Period;
use morrowcast_engine::methods::{self, MethodKind};
use morrowcast_engine::patterns;
use morrowcast_engine::plan;
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::PlanSettings;

struct M3Series {
    id: String,
    subset: String,
    season: usize,
    horizon: usize,
    train: Vec<f64>,
    test: Vec<f64>,
}

fn load(path: &str) -> Vec<M3Series> {
    let text = std::fs::read_to_string(path).unwrap_or_else(|e| panic!("cannot read {path}: {e}"));
    let mut by_id: BTreeMap<String, M3Series> = BTreeMap::new();
    for line in text.lines().skip(1) {
        let f: Vec<&str> = line.split(',').collect();
        if f.len() < 8 {
            continue;
        }
        let entry = by_id.entry(f[0].to_string()).or_insert_with(|| M3Series {
            id: f[0].to_string(),
            subset: f[1].to_string(),
            season: f[3].parse().unwrap_or(1),
            horizon: f[4].parse().unwrap_or(1),
            train: Vec::new(),
            test: Vec::new(),
        });
        let v: f64 = f[7].parse().unwrap_or(f64::NAN);
        if f[6] == "train" {
            entry.train.push(v);
        } else {
            entry.test.push(v);
        }
    }
    by_id.into_values().collect()
}

fn series_for(s: &M3Series) -> Series {
    let start = match s.subset.as_str() {
        "MONTHLY" => Period::month(2000, 1),
        "QUARTERLY" => Period::quarter(2000, 1),
        "YEARLY" => Period::year(1900),
        _ => Period::position(1),
    };
    Series::new(
        s.id.clone(),
        start,
        s.train.iter().map(|v| Some(*v)).collect(),
    )
    .unwrap_or_else(|e| panic!("{e}"))
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
        let m = s.season.max(1);
        let scale = if s.train.len() > m {
            s.train
                .windows(m + 1)
                .map(|w| (w[m] - w[0]).abs())
                .sum::<f64>()
                / (s.train.len() - m) as f64
        } else {
            f64::NAN
        };
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

fn theta_forecast(s: &M3Series) -> Vec<f64> {
    let series = series_for(s);
    let season = patterns::detect_season(&s.train, series.frequency(), None).length;
    match methods::fit(MethodKind::Theta, &s.train, season, s.horizon) {
        Ok(f) => f.forecast().to_vec(),
        Err(_) => vec![*s.train.last().unwrap_or(&0.0); s.horizon],
    }
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
    let path = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/m3/m3.csv");
    let all = load(path);
    let subsets = ["YEARLY", "QUARTERLY", "MONTHLY", "OTHER"];
    let mut auto: BTreeMap<&str, Tally> = BTreeMap::new();
    let mut theta: BTreeMap<&str, Tally> = BTreeMap::new();
    let mut chosen: BTreeMap<String, usize> = BTreeMap::new();
    let started = Instant::now();
    let mut count = 0;
    for subset in subsets {
        if subset_filter.as_deref().is_some_and(|f| f != subset) {
            continue;
        }
        for s in all.iter().filter(|s| s.subset == subset).take(limit) {
            let settings = PlanSettings::default()
                .with_horizon(Some(s.horizon as u64))
                .expect("M3 horizons are within the limit");
            let forecast = match plan::plan_item(&series_for(s), &settings) {
                Ok(p) => {
                    *chosen.entry(p.chosen.key().to_string()).or_default() += 1;
                    p.forecast.iter().map(|f| f.band.value).collect()
                }
                Err(e) => {
                    eprintln!("{}: {e}", s.id);
                    vec![*s.train.last().unwrap_or(&0.0); s.horizon]
                }
            };
            auto.entry(subset).or_default().add(s, &forecast);
            theta.entry(subset).or_default().add(s, &theta_forecast(s));
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
    let mut picks: Vec<_> = chosen.into_iter().collect();
    picks.sort_by_key(|p| std::cmp::Reverse(p.1));
    let picks: Vec<String> = picks.iter().map(|(k, v)| format!("{k} {v}")).collect();
    println!("chosen: {}", picks.join(", "));
}
