//! Speed benchmark: the whole plan (patterns, backtest of every candidate over the rolling
//! origins, combination, refit, band) for one 60-point monthly series, and for 1,000 such series
//! on one core. Targets: under 5 ms for one, under 5 s for 1,000.
//!
//! Run: `cargo bench --bench speed`. It also writes the 1,000 series to
//! target/speed_series.csv so that scripts/bench_statsmodels.py can time statsmodels fitting
//! the same candidate set on the same data.
//!
//! The series are synthetic (level, trend, multiplicative season, noise) from a seeded
//! generator: benchmark input only, never a check value.

use std::fmt::Write;
use std::time::Instant;

use morrowcast_engine::calendar::Period;
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

    // The same with the MAD-rule band, to show what the empirical band's rolling origins cost.
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
}
