//! Alert laboratory: how often do the Bias and Outliers alerts fire on steady demand
//! (false alarms), and how often on demand that changed (detections)? A research tool: every
//! series is made up here, seeded (normal noise from a 64-bit linear congruential generator by
//! Box-Muller), planned as the page plans it, and judged by the Bias alert and, for
//! comparison, by the rules it replaced and by its own rule over single windows, and by the
//! Outliers alert. The README records what it showed.
//!
//! With `--outliers`, the Outliers study instead: steady items (even noise, noise that grows
//! with the level or changes halfway, count-like noise) with and without an oddity put in
//! (a typo, a spike, a dip, a promotion), judged by the alert, by the rule before it read the
//! errors' power (errors as they are) and by fixed powers; the share of items where the alert
//! fired, and where it named a period made odd.
//!
//! Run: `cargo bench --bench alert_lab [-- --count 200] [--outliers]` (about a minute each).

// Native only: the rule that sorts go through morrowcast_engine::sorting (clippy.toml) keeps
// the wasm small and does not bind benchmarks and tests.
#![allow(clippy::disallowed_methods)]

use morrowcast_engine::alerts::{alerts, lean_over, outlier_cut, outliers, AlertKind};
use morrowcast_engine::calendar::Period;
use morrowcast_engine::plan::{plan_item, ItemPlan};
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::PlanSettings;

#[path = "common/lab.rs"]
mod lab;
use lab::{count_option, Draws as Noise};

#[derive(Clone, Copy, Debug)]
enum Base {
    Level,
    Rough,
    Trend,
    Season,
    Wander,
    Sparse,
    /// A level rising from 50 to 5.5 times that, with noise a tenth of the level.
    Growing,
    /// A level of 100 with noise of sd 5 in the first half and 15 in the second.
    Louder,
}

#[derive(Clone, Copy, Debug, PartialEq)]
enum Change {
    None,
    /// Demand 30 % up over the last `k` periods.
    Up(usize),
    /// Demand 30 % down over the last `k` periods.
    Down(usize),
    /// Demand 45 % up for 6 periods ending 3 periods before the end.
    PromotionEnded,
    /// Demand rising by 2 % of the level each period over the last `k` periods.
    Rise(usize),
}

struct Shape {
    length: usize,
    start: Period,
    season: usize,
}

fn shapes() -> Vec<(&'static str, Shape)> {
    vec![
        (
            "monthly 36",
            Shape {
                length: 36,
                start: Period::month(2022, 1),
                season: 12,
            },
        ),
        (
            "quarterly 40",
            Shape {
                length: 40,
                start: Period::quarter(2016, 1),
                season: 4,
            },
        ),
        (
            "monthly 60",
            Shape {
                length: 60,
                start: Period::month(2020, 1),
                season: 12,
            },
        ),
        (
            "weekly 156",
            Shape {
                length: 156,
                start: Period::week_containing(2022, 1, 3),
                season: 52,
            },
        ),
        (
            "daily 540",
            Shape {
                length: 540,
                start: Period::day(2023, 1, 2),
                season: 7,
            },
        ),
    ]
}

fn series(shape: &Shape, base: Base, change: Change, noise: &mut Noise) -> Series {
    let n = shape.length;
    let mut level = 100.0;
    let values = (0..n)
        .map(|t| {
            let e = noise.normal();
            let mut y = match base {
                Base::Level => 100.0 + 10.0 * e,
                Base::Rough => 100.0 + 30.0 * e,
                Base::Trend => 100.0 + 0.5 * t as f64 * 12.0 / shape.season as f64 + 10.0 * e,
                Base::Season => {
                    let phase = 2.0 * std::f64::consts::PI * (t % shape.season) as f64
                        / shape.season as f64;
                    100.0 * (1.0 + 0.3 * phase.sin()) + 10.0 * e
                }
                Base::Sparse => {
                    if noise.uniform() < 0.3 {
                        (5.0 + 3.0 * e).max(1.0)
                    } else {
                        0.0
                    }
                }
                Base::Growing => (50.0 + 225.0 * t as f64 / n as f64) * (1.0 + 0.1 * e),
                Base::Louder => 100.0 + if 2 * t < n { 5.0 } else { 15.0 } * e,
                Base::Wander => {
                    level += 3.0 * noise.normal();
                    level + 10.0 * e
                }
            };
            let from_end = n - t; // 1 for the last period
            y *= match change {
                Change::None => 1.0,
                Change::Up(k) if from_end <= k => 1.3,
                Change::Down(k) if from_end <= k => 0.7,
                Change::PromotionEnded if (4..=9).contains(&from_end) => 1.45,
                Change::Rise(k) if from_end <= k => 1.0 + 0.02 * (k + 1 - from_end) as f64,
                _ => 1.0,
            };
            Some(y.max(0.0).round())
        })
        .collect();
    Series::new("made up", shape.start, values).unwrap()
}

/// Each count of `fired` as a percent of `count`, the columns parted by bars.
fn percents(fired: &[usize], count: usize) -> String {
    let pct: Vec<String> = fired
        .iter()
        .map(|f| format!("{:5.1}", 100.0 * *f as f64 / count as f64))
        .collect();
    pct.join(" |")
}

/// The rules the Bias alert replaced, for comparison, read off the Error ledger: the holdout's
/// tracking signal beyond ±4 at its end, and the holdout's mean error more than 2 standard
/// errors from zero (at least 4 errors).
fn former_rules(plan: &ItemPlan) -> (bool, bool) {
    let signal = plan
        .ledger
        .last()
        .and_then(|e| e.row.tracking_signal)
        .is_some_and(|ts| ts.abs() > 4.0);
    let errors: Vec<f64> = plan.ledger.iter().map(|e| e.row.error).collect();
    let k = errors.len() as f64;
    let mean = errors.iter().sum::<f64>() / k;
    let sd = (errors.iter().map(|e| (e - mean).powi(2)).sum::<f64>() / (k - 1.0)).sqrt();
    let t_test = errors.len() >= 4 && sd > 0.0 && mean.abs() > 2.0 * sd / k.sqrt();
    (signal, t_test)
}

fn main() {
    let count = count_option(100);
    if std::env::args().any(|a| a == "--outliers") {
        outlier_study(count);
        return;
    }
    let bases = [
        Base::Level,
        Base::Rough,
        Base::Trend,
        Base::Season,
        Base::Wander,
        Base::Sparse,
        Base::Growing,
        Base::Louder,
    ];
    println!(
        "fired in % of {count} series: the Bias alert | the former rules: holdout tracking \
         signal beyond ±4, holdout t-test | the Bias rule over one window at 1.96 (nominal): the holdout's \
         length W, the last 3 | the Outliers alert"
    );
    for (label, shape) in shapes() {
        let changes = [
            Change::None,
            Change::Up(3),
            Change::Up(6),
            Change::Down(3),
            Change::PromotionEnded,
            Change::Rise(12),
        ];
        for base in bases {
            for change in changes {
                if change != Change::None && !matches!(base, Base::Level | Base::Season) {
                    continue;
                }
                let mut noise = Noise(0x2545_f491_4f6c_dd1d ^ (base as u64) << 7);
                let mut fired = [0usize; 6];
                let mut window = 0;
                for _ in 0..count {
                    let s = series(&shape, base, change, &mut noise);
                    let plan = plan_item(&s, &PlanSettings::default()).unwrap();
                    let kinds: Vec<AlertKind> =
                        alerts(&plan, &s).into_iter().map(|a| a.kind).collect();
                    window = plan.ledger.len();
                    let (former_signal, former_t) = former_rules(&plan);
                    let sparse = plan.demand.class.is_sparse();
                    let single =
                        |k: usize| !sparse && lean_over(&plan, &[k], |_| Some(1.96)).is_some();
                    let hits = [
                        kinds.contains(&AlertKind::Bias),
                        former_signal,
                        former_t,
                        single(window),
                        single(3),
                        kinds.contains(&AlertKind::Outliers),
                    ];
                    for (f, h) in fired.iter_mut().zip(hits) {
                        *f += usize::from(h);
                    }
                }
                println!(
                    "{label:11} {:7} {:22} W={window:3}  {}",
                    format!("{base:?}"),
                    format!("{change:?}"),
                    percents(&fired, count)
                );
            }
        }
    }
}

/// Something unusual put into an otherwise steady history, for the Outliers study.
#[derive(Clone, Copy, Debug, PartialEq)]
enum Oddity {
    None,
    /// The fourth period typed ten times too large.
    EarlyTypo,
    /// The middle period 60 % up.
    Spike,
    /// The middle period 60 % down (a stock-out, a missed entry).
    Dip,
    /// A promotion doubling demand from the middle for n / 50 periods (at least 2).
    Promotion,
}

fn with_oddity(mut values: Vec<f64>, oddity: Oddity) -> Vec<f64> {
    let n = values.len();
    let middle = n / 2;
    match oddity {
        Oddity::None => {}
        Oddity::EarlyTypo => values[3] *= 10.0,
        Oddity::Spike => values[middle] *= 1.6,
        Oddity::Dip => values[middle] *= 0.4,
        Oddity::Promotion => {
            for v in &mut values[middle..middle + (n / 50).max(2)] {
                *v *= 2.0;
            }
        }
    }
    values.into_iter().map(|v| v.round()).collect()
}

/// Steady histories for the Outliers study: the alert lab's bases, and counts (noise the square
/// root of the mean, as for Poisson demand) with a strong season or growing.
fn steady_for_outliers(shape: &Shape, base: &str, noise: &mut Noise) -> Vec<f64> {
    let n = shape.length;
    (0..n)
        .map(|t| {
            let z = noise.normal();
            let phase =
                2.0 * std::f64::consts::PI * (t % shape.season) as f64 / shape.season as f64;
            let y = match base {
                "level" => 100.0 + 10.0 * z,
                "season" => 100.0 * (1.0 + 0.3 * phase.sin()) + 10.0 * z,
                "growing" => (50.0 + 225.0 * t as f64 / n as f64) * (1.0 + 0.1 * z),
                "louder" => 100.0 + if 2 * t < n { 5.0 } else { 15.0 } * z,
                "trend" => 40.0 + 240.0 * t as f64 / n as f64 + 10.0 * z,
                "season counts" => {
                    let mean = 20.0 * (1.0 + 0.6 * phase.sin());
                    mean + mean.sqrt() * z
                }
                _ => {
                    let mean = 5.0 + 55.0 * t as f64 / n as f64;
                    mean + mean.sqrt() * z
                }
            };
            y.max(0.0)
        })
        .collect()
}

/// The periods whose errors pass the Outliers cut after dividing each by its fitted value
/// (floored at a tenth of the median fit, as the alert does) to a fixed `power` (0: the rule
/// before the power was read from the errors).
fn outliers_scaled(plan: &ItemPlan, power: f64) -> Vec<usize> {
    let judged: Vec<(usize, f64, f64)> = plan
        .fitted
        .iter()
        .zip(&plan.history)
        .enumerate()
        .filter_map(|(t, (f, d))| f.map(|f| (t, f, f - d)))
        .collect();
    if judged.is_empty() {
        return Vec::new();
    }
    let floor = (0.1 * median(judged.iter().map(|p| p.1).collect())).max(1e-9);
    let scaled: Vec<f64> = judged
        .iter()
        .map(|(_, f, e)| e / f.max(floor).powf(power))
        .collect();
    let centre = median(scaled.clone());
    let mad = median(scaled.iter().map(|v| (v - centre).abs()).collect());
    if mad <= 0.0 {
        return Vec::new();
    }
    let cut = outlier_cut(scaled.len());
    judged
        .iter()
        .zip(&scaled)
        .filter(|(_, v)| 0.6745 * (*v - centre).abs() / mad > cut)
        .map(|(p, _)| p.0)
        .collect()
}

/// The median as the engine takes it (the mean of the middle two of an even count).
fn median(mut values: Vec<f64>) -> f64 {
    values.sort_by(f64::total_cmp);
    (values[(values.len() - 1) / 2] + values[values.len() / 2]) / 2.0
}

/// The periods an oddity was put in.
fn odd_periods(length: usize, oddity: Oddity) -> std::ops::Range<usize> {
    let middle = length / 2;
    match oddity {
        Oddity::None => 0..0,
        Oddity::EarlyTypo => 3..4,
        Oddity::Spike | Oddity::Dip => middle..middle + 1,
        Oddity::Promotion => middle..middle + (length / 50).max(2),
    }
}

fn outlier_study(count: usize) {
    println!(
        "Outliers, in % of {count} series: the alert (errors over fitted^b) fired, named \
         a period made odd | the former rule (errors as they are) fired, named | errors over \
         sqrt(fitted) fired | over fitted fired"
    );
    for (label, shape) in shapes() {
        for (index, base) in [
            "level",
            "season",
            "growing",
            "louder",
            "trend",
            "season counts",
            "growing counts",
        ]
        .into_iter()
        .enumerate()
        {
            for oddity in [
                Oddity::None,
                Oddity::EarlyTypo,
                Oddity::Spike,
                Oddity::Dip,
                Oddity::Promotion,
            ] {
                let mut noise = Noise(0x2545_f491_4f6c_dd1d ^ (index as u64) << 9);
                let mut fired = [0usize; 6];
                for _ in 0..count {
                    let values = with_oddity(steady_for_outliers(&shape, base, &mut noise), oddity);
                    let s = Series::new(
                        "made up",
                        shape.start,
                        values.into_iter().map(Some).collect(),
                    )
                    .unwrap();
                    let plan = plan_item(&s, &PlanSettings::default()).unwrap();
                    if plan.demand.class.is_sparse() {
                        continue;
                    }
                    let odd = odd_periods(shape.length, oddity);
                    let alert: Vec<usize> = outliers(&plan, &s)
                        .map(|o| o.periods.iter().map(|p| p.index).collect())
                        .unwrap_or_default();
                    let former = outliers_scaled(&plan, 0.0);
                    let hits = [
                        !alert.is_empty(),
                        alert.iter().any(|t| odd.contains(t)),
                        !former.is_empty(),
                        former.iter().any(|t| odd.contains(t)),
                        !outliers_scaled(&plan, 0.5).is_empty(),
                        !outliers_scaled(&plan, 1.0).is_empty(),
                    ];
                    for (f, h) in fired.iter_mut().zip(hits) {
                        *f += usize::from(h);
                    }
                }
                println!(
                    "{label:12} {base:14} {:10} {}",
                    format!("{oddity:?}"),
                    percents(&fired, count)
                );
            }
        }
    }
}
