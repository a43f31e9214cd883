//! The M3 competition data as the benchmarks read it (tests/fixtures/m3/m3.csv: one row per
//! value, with id, subset, season length, horizon and whether it is train or test), the
//! calendar each subset is given, the MASE/MSIS scale, and the series a benchmark's command
//! line asks for, and the research labs' shared scoring of rules (sMAPE, MASE). Shared by
//! benches/m3.rs, band_lab.rs, ets_lab.rs and combine_lab.rs through `#[path]`.

use std::collections::BTreeMap;

use morrowcast_engine::calendar::Period;
use morrowcast_engine::plan::{self, ItemPlan};
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::PlanSettings;

/// One M3 series: its train part (what a method sees) and test part (held out).
pub struct M3Series {
    pub id: String,
    pub subset: String,
    pub season: usize,
    pub horizon: usize,
    pub train: Vec<f64>,
    pub test: Vec<f64>,
}

/// The value after `name` on the benchmark's command line (`-- --subset MONTHLY`).
pub fn argument(name: &str) -> Option<String> {
    let args: Vec<String> = std::env::args().collect();
    args.iter()
        .position(|a| a == name)
        .and_then(|i| args.get(i + 1))
        .cloned()
}

/// `--limit N` on the command line: the first N series of each subset (all without it).
pub fn limit() -> usize {
    argument("--limit")
        .and_then(|v| v.parse().ok())
        .unwrap_or(usize::MAX)
}

/// The M3 file's path in the fixtures.
pub const M3_FILE: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/m3/m3.csv");

/// The series of the M3 file that the command line asks for, in id order (the subsets then
/// come yearly, quarterly, monthly, other): `--subset NAME` keeps one subset, [`limit`] the
/// first series of each.
pub fn chosen_series() -> Vec<M3Series> {
    let subset = argument("--subset");
    let most = limit();
    let mut taken: BTreeMap<String, usize> = BTreeMap::new();
    load(M3_FILE)
        .into_iter()
        .filter(|s| subset.as_deref().is_none_or(|f| f == s.subset))
        .filter(|s| {
            let n = taken.entry(s.subset.clone()).or_default();
            *n += 1;
            *n <= most
        })
        .collect()
}

/// Every series of the file at `path`, ordered by id.
pub fn load(path: &str) -> Vec<M3Series> {
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

/// The train part as a series: monthly and quarterly from 2000, yearly from 1900, others by
/// position.
pub fn series_for(s: &M3Series) -> Series {
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
/// The in-sample mean absolute seasonal difference (the MASE and MSIS scale).
pub fn seasonal_scale(s: &M3Series) -> f64 {
    let m = s.season.max(1);
    if s.train.len() > m {
        s.train
            .windows(m + 1)
            .map(|w| (w[m] - w[0]).abs())
            .sum::<f64>()
            / (s.train.len() - m) as f64
    } else {
        f64::NAN
    }
}

/// sMAPE (|y| + |f| in the denominator) and MASE summed over every series-horizon added: the
/// research benches' score of a rule. (m3.rs and band_lab.rs score otherwise: not used there.)
#[allow(dead_code)]
#[derive(Default)]
pub struct PointTally {
    pub smape: f64,
    pub mase: f64,
    pub count: usize,
}

#[allow(dead_code)]
impl PointTally {
    /// Adds a series' forecast of its held-out part.
    pub fn add(&mut self, s: &M3Series, f: &[f64]) {
        let scale = seasonal_scale(s);
        for (y, f) in s.test.iter().zip(f) {
            let d = y.abs() + f.abs();
            self.smape += if d > 0.0 {
                200.0 * (y - f).abs() / d
            } else {
                0.0
            };
            self.mase += (y - f).abs() / scale;
            self.count += 1;
        }
    }
}

/// Each rule's [`PointTally`] per subset and over all ("ALL"), printed as a table.
#[allow(dead_code)]
#[derive(Default)]
pub struct RuleScores(BTreeMap<(String, String), PointTally>);

#[allow(dead_code)]
impl RuleScores {
    /// Adds the rule's forecast `f` of series `s` to its subset and to "ALL".
    pub fn add(&mut self, s: &M3Series, rule: &str, f: &[f64]) {
        for subset in [s.subset.clone(), "ALL".to_string()] {
            self.0
                .entry((subset, rule.to_string()))
                .or_default()
                .add(s, f);
        }
    }

    /// Prints "| subset | rule | sMAPE | MASE |" rows, sMAPE to `decimals` places, MASE to one
    /// more.
    pub fn print(&self, decimals: usize) {
        println!("| subset | rule | sMAPE | MASE |");
        for ((subset, rule), t) in &self.0 {
            let c = t.count.max(1) as f64;
            println!(
                "| {subset} | {rule} | {:.*} | {:.*} |",
                decimals,
                t.smape / c,
                decimals + 1,
                t.mase / c
            );
        }
    }
}

/// The series' train part planned as the page plans it, over its horizon, and the plan's
/// point forecast (the automatic choice); `None` when it cannot be planned.
#[allow(dead_code)]
pub fn planned(s: &M3Series) -> Option<(ItemPlan, Vec<f64>)> {
    let settings = PlanSettings::default()
        .with_horizon(Some(s.horizon as u64))
        .ok()?;
    let p = plan::plan_item(&series_for(s), &settings).ok()?;
    let auto = p.forecast.iter().map(|f| f.band.value).collect();
    Some((p, auto))
}
