//! Any series within the bound, under settings drawn from the input: a plan whose every number
//! is finite and whose bands hold their forecast (at or above zero for non-negative demand),
//! or a message. libFuzzer's -timeout bounds each plan's time.
//!
//! Input layout: byte 0 picks the horizon, 1 the holdout, 2 the season, 3 the band and choice;
//! then each 3 bytes are one period: a gap when the first is 0xFF, else a value built from the
//! three bytes over magnitudes from 1e-6 to 1e15, both signs.

#![no_main]

use libfuzzer_sys::fuzz_target;
use morrowcast_engine::bands::BandMethod;
use morrowcast_engine::calendar::Period;
use morrowcast_engine::plan::plan_item;
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::{Choice, PlanSettings, SeasonChoice};

fn value(b: &[u8]) -> Option<f64> {
    if b[0] == 0xFF {
        return None;
    }
    let mantissa = f64::from(u16::from_le_bytes([b[1], b[2]]));
    let exponent = i32::from(b[0] % 22) - 6;
    let sign = if b[0] & 0x80 != 0 { -1.0 } else { 1.0 };
    Some((sign * mantissa * 10f64.powi(exponent) / 65_536.0 * 10.0).clamp(-1e15, 1e15))
}

fuzz_target!(|data: &[u8]| {
    if data.len() < 4 {
        return;
    }
    let values: Vec<Option<f64>> = data[4..].chunks_exact(3).map(value).collect();
    let Ok(series) = Series::new("fuzzed", Period::month(2020, 1), values) else {
        return;
    };
    let choice = match data[3] % 4 {
        0 => Choice::Auto,
        1 => Choice::Best,
        2 => Choice::Named("theta".into()),
        _ => Choice::Named("holt_winters_multiplicative".into()),
    };
    let band = if data[3] & 0x10 != 0 { BandMethod::MadRule } else { BandMethod::HorizonAware };
    let season = match data[2] % 30 {
        0 => SeasonChoice::Auto,
        m => SeasonChoice::Fixed(m as usize),
    };
    let settings = PlanSettings::default()
        .with_horizon(Some(u64::from(data[0] % 48) + 1))
        .and_then(|s| s.with_holdout((data[1] != 0).then(|| u64::from(data[1] % 40) + 1)))
        .and_then(|s| s.with_season(season))
        .expect("within the limits")
        .with_band(band)
        .with_choice(choice);
    let Ok(plan) = plan_item(&series, &settings) else {
        return;
    };
    let non_negative = plan.history.iter().all(|v| *v >= 0.0);
    for f in &plan.forecast {
        let b = f.band;
        assert!(b.low.is_finite() && b.value.is_finite() && b.high.is_finite(), "{b:?}");
        assert!(b.low <= b.value && b.value <= b.high, "{b:?}");
        assert!(!non_negative || b.low >= 0.0, "{b:?}");
    }
});
