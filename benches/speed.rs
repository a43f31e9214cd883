//! Speed benchmark: the whole plan (patterns, backtest of every candidate over the rolling
//! origins, combination, refit, band) for one 60-point monthly series, and for 1,000 such series
//! on one core (targets: under 5 ms for one, under 5 s for 1,000); each method's fit on 60
//! points; intake of large files; one very long history; a file of 5,000 items through the
//! command line. Timing lives here, never in tests; README records the results.
//!
//! Run: `cargo bench --bench speed`. It also writes the 1,000 series to
//! target/speed_series.csv so that scripts/bench_statsmodels.py can time statsmodels fitting
//! the same candidate set on the same data.
//!
//! The series are synthetic (level, trend, multiplicative season, noise) from a seeded
//! generator: benchmark input only, never a check value.

// Native only: the rule that sorts go through morrowcast_engine::sorting (clippy.toml) keeps
// the wasm small and does not bind benchmarks and tests.
#![allow(clippy::disallowed_methods)]

use std::fmt::Write;
use std::time::Instant;

use morrowcast_engine::calendar::{civil_from_days, Period};
use morrowcast_engine::intake;
use morrowcast_engine::methods::{self, MethodKind};
use morrowcast_engine::plan;
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::PlanSettings;

/// SplitMix64 (Steele, Lea & Flood 2014): a small, well-known seeded generator.
struct SplitMix(u64);
impl SplitMix {
    fn next_f64(&mut self) -> f64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        ((z ^ (z >> 31)) >> 11) as f64 / (1u64 << 53) as f64
    }
    fn normal(&mut self) -> f64 {
        let u1 = self.next_f64().max(1e-300);
        let u2 = self.next_f64();
        (-2.0 * u1.ln()).sqrt() * (2.0 * std::f64::consts::PI * u2).cos()
    }
}

fn make_series(count: usize) -> Vec<Vec<f64>> {
    let mut rng = SplitMix(20_261_201);
    (0..count)
        .map(|_| {
            let level = 50.0 + 200.0 * rng.next_f64();
            let trend = (rng.next_f64() - 0.4) * 0.01;
            let amplitude = 0.4 * rng.next_f64();
            let noise = 0.03 + 0.12 * rng.next_f64();
            (0..60)
                .map(|t| {
                    let season =
                        1.0 + amplitude * (2.0 * std::f64::consts::PI * t as f64 / 12.0).sin();
                    let v =
                        level * (1.0 + trend * t as f64) * season * (1.0 + noise * rng.normal());
                    v.max(0.0).round()
                })
                .collect()
        })
        .collect()
}

fn main() {
    let data = make_series(1000);
    let mut csv = String::from("series,t,value\n");
    for (i, s) in data.iter().enumerate() {
        for (t, v) in s.iter().enumerate() {
            let _ = writeln!(csv, "{i},{},{v}", t + 1);
        }
    }
    let out = concat!(env!("CARGO_MANIFEST_DIR"), "/target/speed_series.csv");
    if let Err(e) = std::fs::write(out, csv) {
        eprintln!("could not write {out}: {e}");
    }
    let series: Vec<Series> = data
        .iter()
        .enumerate()
        .map(|(i, v)| {
            Series::new(
                format!("s{i}"),
                Period::month(2020, 1),
                v.iter().map(|x| Some(*x)).collect(),
            )
            .expect("synthetic series are valid")
        })
        .collect();
    let settings = PlanSettings::default();

    // One series, repeated: median of 200 runs.
    let mut times = Vec::new();
    for _ in 0..200 {
        let t = Instant::now();
        let p = plan::plan_item(&series[0], &settings).expect("plan");
        std::hint::black_box(p);
        times.push(t.elapsed().as_secs_f64() * 1e3);
    }
    times.sort_by(f64::total_cmp);
    println!(
        "one 60-point monthly series: median {:.2} ms, p90 {:.2} ms (target < 5 ms)",
        times[100], times[180]
    );

    // The same with the MAD-rule band (the rolling origins are worked out either way: the Stock
    // plan's spread rests on them).
    let mad_settings =
        PlanSettings::default().with_band(morrowcast_engine::bands::BandMethod::MadRule);
    let mut times = Vec::new();
    for _ in 0..200 {
        let t = Instant::now();
        std::hint::black_box(plan::plan_item(&series[0], &mad_settings).expect("plan"));
        times.push(t.elapsed().as_secs_f64() * 1e3);
    }
    times.sort_by(f64::total_cmp);
    println!(
        "  the same with the MAD-rule band: median {:.2} ms",
        times[100]
    );

    let t = Instant::now();
    let mut chosen = std::collections::BTreeMap::<String, usize>::new();
    for s in &series {
        if let Ok(p) = plan::plan_item(s, &settings) {
            *chosen.entry(p.chosen.key().to_string()).or_default() += 1;
        }
    }
    let total = t.elapsed().as_secs_f64();
    println!("1,000 such series on one core: {total:.2} s (target < 5 s)");
    println!("chosen: {chosen:?}");
    thousand_through_the_command_line(&data);

    method_fits(&data[0]);
    intake_of_large_files();
    one_very_long_history();
    many_items_through_the_command_line();
}

/// Median of `runs` timings of `work`, in milliseconds.
fn median_ms(runs: usize, mut work: impl FnMut()) -> f64 {
    let mut times: Vec<f64> = (0..runs)
        .map(|_| {
            let t = Instant::now();
            work();
            t.elapsed().as_secs_f64() * 1e3
        })
        .collect();
    times.sort_by(f64::total_cmp);
    times[runs / 2]
}

/// Every method's fit on one 60-point monthly series with a 12-month season and a horizon of 12
/// (a plan makes about 70 such fits).
fn method_fits(y: &[f64]) {
    println!("one fit on 60 monthly points (median of 200):");
    for kind in MethodKind::ALL {
        let ms = median_ms(200, || {
            std::hint::black_box(methods::fit(kind, std::hint::black_box(y), Some(12), 12).ok());
        });
        println!("  {:<44} {:>8.1} us", kind.label(), ms * 1e3);
    }
}

/// Intake of a 40,000-row daily file and of a 30,000-row long table of 500 weekly items.
fn intake_of_large_files() {
    let mut daily = String::from("date,sales\n");
    for day in 0..40_000 {
        let (year, month, dom) = civil_from_days(day);
        let _ = writeln!(daily, "{year}-{month:02}-{dom:02},{}", day % 17);
    }
    let mut long = String::from("item;week;qty\n");
    for row in 0..30_000 {
        let _ = writeln!(
            long,
            "sku{};2023-W{:02};{}",
            row % 500,
            row / 500 % 52 + 1,
            row % 7
        );
    }
    for (what, text) in [
        ("40,000 daily rows", &daily),
        ("30,000 rows of 500 items", &long),
    ] {
        let ms = median_ms(5, || {
            std::hint::black_box(intake::read(text));
        });
        println!("intake of {what}: {ms:.0} ms");
    }
}

/// One item of 100,000 daily periods (the backtest and band work on the most recent
/// `plan::RECENT_PERIODS`; the refit on all of them).
fn one_very_long_history() {
    let mut rng = SplitMix(7);
    let values: Vec<Option<f64>> = (0..100_000)
        .map(|t| {
            let week = [0.0, 4.0, 9.0, 3.0, -2.0, -6.0, -8.0][t % 7];
            Some((50.0 + week + 5.0 * rng.normal()).max(0.0).round())
        })
        .collect();
    let series = Series::new("long", Period::day(1750, 1, 1), values).expect("valid");
    let ms = median_ms(3, || {
        std::hint::black_box(plan::plan_item(&series, &PlanSettings::default()).ok());
    });
    println!("one item of 100,000 daily periods: {ms:.0} ms");
}

/// The 1,000 synthetic 60-month series through `morrowcast forecast - --json` (in process),
/// which plans on every core the machine offers (`taskset -c 0` limits it to one).
fn thousand_through_the_command_line(data: &[Vec<f64>]) {
    let mut text = String::from("item,month,units\n");
    for (i, s) in data.iter().enumerate() {
        for (t, v) in s.iter().enumerate() {
            let _ = writeln!(text, "s{i},{}-{:02},{v}", 2020 + t / 12, t % 12 + 1);
        }
    }
    let (seconds, code) = forecast_json_through_the_command_line(&text);
    println!(
        "the same 1,000 series through the command line on {} thread(s): {seconds:.2} s, exit \
         {code} (target < 1.5 s on 2 cores)",
        morrowcast_cli::parallel::available_threads(),
    );
}

/// Seconds `morrowcast forecast - --json` takes on `text` (in process: the command line's
/// library, output discarded), and its exit code.
fn forecast_json_through_the_command_line(text: &str) -> (f64, u8) {
    let args: Vec<String> = ["forecast", "-", "--json"].map(String::from).to_vec();
    let t = Instant::now();
    let code = morrowcast_cli::run(
        &args,
        &mut text.as_bytes(),
        &mut std::io::sink(),
        &mut std::io::sink(),
    );
    (t.elapsed().as_secs_f64(), code)
}

/// A long-layout file of 5,000 items of 24 months through `morrowcast forecast - --json` (in
/// process: the command line's library), output discarded.
fn many_items_through_the_command_line() {
    let mut rng = SplitMix(11);
    let mut text = String::from("item,month,units\n");
    for i in 0..5_000 {
        let base = 10.0 + 190.0 * rng.next_f64();
        for t in 0..24 {
            let v = base * (1.0 + 0.3 * (t % 12) as f64 / 12.0) + base * 0.1 * rng.normal();
            let _ = writeln!(
                text,
                "item {i},{}-{:02},{}",
                2023 + t / 12,
                t % 12 + 1,
                v.max(0.0).round()
            );
        }
    }
    let (seconds, code) = forecast_json_through_the_command_line(&text);
    println!(
        "5,000 items of 24 months through the command line (JSON): {seconds:.2} s, exit {code}"
    );
}
