//! The demo scenario: "Fernhollow Garden Supply", an invented garden shop with six items and
//! five years of monthly unit sales (2021-12 through 2026-11), so a first-time user sees every
//! kind of pattern the engine describes without bringing data.
//!
//! Kept apart from: parsing and everything downstream. The scenario is produced as CSV text,
//! exactly as a user file would arrive, by a seeded generator written out here (SplitMix64 and
//! Box-Muller, no outside crate), so it is the same on every machine and every build.
//!
//! The items and what each is built to show:
//! - "Seed packets": a strong spring peak that grows with the level (multiplicative season) on a
//!   level rising about 25 % a year;
//! - "Frost cloth": a winter peak on a flat level;
//! - "Potting mix 40 L": a summer peak of fixed size (additive season) on a mild rise;
//! - "Hose repair kit": intermittent, zero most months and now and then 1 to 4;
//! - "Gift card": a December spike;
//! - "Terracotta pot": steady with noise, no season.

use crate::calendar::Period;

/// The scenario's name as shown to users.
pub const DEMO_NAME: &str = "Fernhollow Garden Supply";
/// The six items, in column order.
pub const DEMO_ITEMS: [&str; 6] = [
    "Seed packets",
    "Frost cloth",
    "Potting mix 40 L",
    "Hose repair kit",
    "Gift card",
    "Terracotta pot",
];
/// Number of months in the scenario.
pub const DEMO_MONTHS: usize = 60;
/// The seed of the committed scenario. Changing it changes the demo everyone sees.
const DEMO_SEED: u64 = 0x4665_726E_686F_6C6C; // "Fernholl" in ASCII

/// The demo as a wide CSV: header `month,Seed packets,...`, then one row per month labelled
/// "YYYY-MM", every value a non-negative whole number.
pub fn demo_csv() -> String {
    demo_csv_with_seed(DEMO_SEED)
}

/// The same scenario drawn with another seed (used to check that the patterns are built in,
/// not luck of one draw).
pub(crate) fn demo_csv_with_seed(seed: u64) -> String {
    let columns = demo_columns(seed);
    let first = Period::month(2021, 12);
    let mut out = String::from("month");
    for item in DEMO_ITEMS {
        out.push(',');
        out.push_str(item);
    }
    out.push('\n');
    for month in 0..DEMO_MONTHS {
        out.push_str(&first.offset(month as i64).to_string());
        for column in &columns {
            out.push(',');
            out.push_str(&column[month].to_string());
        }
        out.push('\n');
    }
    out
}

/// One column of whole-number sales per item, in [`DEMO_ITEMS`] order.
fn demo_columns(seed: u64) -> Vec<Vec<u64>> {
    let first = Period::month(2021, 12);
    let months: Vec<(f64, usize)> = (0..DEMO_MONTHS)
        .map(|i| {
            let calendar_month = first.offset(i as i64).season_position().unwrap_or(0);
            (i as f64, calendar_month)
        })
        .collect();
    DEMO_ITEMS
        .iter()
        .enumerate()
        .map(|(item, _)| {
            // Each item draws from its own stream, so retuning one item leaves the others alone.
            let mut random = SplitMix64::new(seed ^ (item as u64 + 1).wrapping_mul(0xA5A5_5A5A));
            months
                .iter()
                .map(|&(t, month)| units(draw(item, t, month, &mut random)))
                .collect()
        })
        .collect()
}

/// Expected sales plus noise for item `item` at month index `t` (0 = 2021-12) and calendar
/// month `month` (0 = January).
fn draw(item: usize, t: f64, month: usize, random: &mut SplitMix64) -> f64 {
    let years = t / 12.0;
    match item {
        // Seed packets: level 80 growing 25 % a year, times a spring-heavy profile, with 8 %
        // multiplicative noise.
        0 => {
            const SPRING: [f64; 12] =
                [0.7, 1.3, 2.1, 2.3, 1.6, 0.9, 0.6, 0.55, 0.5, 0.5, 0.55, 0.8];
            let mean_factor = SPRING.iter().sum::<f64>() / 12.0;
            80.0 * 1.25f64.powf(years) * SPRING[month] / mean_factor
                * (1.0 + 0.08 * random.normal())
        }
        // Frost cloth: flat level 40 with a winter profile and additive noise.
        1 => {
            const WINTER: [f64; 12] = [2.3, 1.6, 0.8, 0.4, 0.2, 0.1, 0.1, 0.1, 0.3, 0.9, 2.0, 2.6];
            40.0 * WINTER[month] + 4.0 * random.normal()
        }
        // Potting mix: 150 rising 0.5 a month, plus a July-centred cosine of fixed size 60.
        2 => {
            let phase = 2.0 * std::f64::consts::PI * (month as f64 - 6.0) / 12.0;
            150.0 + 0.5 * t + 60.0 * phase.cos() + 10.0 * random.normal()
        }
        // Hose repair kit: a sale in about one month in four, of 1 to 4 kits.
        3 => {
            if random.uniform() < 0.25 {
                1.0 + (random.uniform() * 4.0).floor().min(3.0)
            } else {
                0.0
            }
        }
        // Gift card: about 12 a month, a little more in November, a spike in December.
        4 => {
            let extra = match month {
                10 => 8.0,
                11 => 70.0,
                _ => 0.0,
            };
            12.0 + extra + 3.0 * random.normal()
        }
        // Terracotta pot: steady 45 with noise and nothing else.
        _ => 45.0 + 5.0 * random.normal(),
    }
}

/// Rounds to a whole number of units, never below zero.
fn units(value: f64) -> u64 {
    if value.is_finite() && value > 0.0 {
        value.round() as u64
    } else {
        0
    }
}

/// SplitMix64 (Steele, Lea & Flood, "Fast splittable pseudorandom number generators",
/// OOPSLA 2014): a 64-bit counter passed through a fixed mixing function. Small, fast and fully
/// specified, which is all a reproducible demo needs.
struct SplitMix64 {
    state: u64,
}

impl SplitMix64 {
    fn new(seed: u64) -> SplitMix64 {
        SplitMix64 { state: seed }
    }

    fn next_u64(&mut self) -> u64 {
        self.state = self.state.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.state;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        z ^ (z >> 31)
    }

    /// Uniform on [0, 1) with 53 random bits.
    fn uniform(&mut self) -> f64 {
        (self.next_u64() >> 11) as f64 / (1u64 << 53) as f64
    }

    /// Standard normal by the Box-Muller transform: sqrt(-2 ln u1) cos(2 pi u2), with u1 in
    /// (0, 1] so the logarithm is finite. One value per call keeps the stream easy to follow.
    fn normal(&mut self) -> f64 {
        let u1 = 1.0 - self.uniform();
        let u2 = self.uniform();
        (-2.0 * u1.ln()).sqrt() * (2.0 * std::f64::consts::PI * u2).cos()
    }
}

#[cfg(test)]
mod tests;
