//! Tests of the demo scenario: its shape, its reproducibility, and that the pattern verdicts
//! find what each item was built to show.

use super::*;
use crate::calendar::Frequency;
use crate::patterns::TrendDirection;
use crate::patterns::{classify_demand, detect_season, mann_kendall};

/// (header, month labels, one column of values per item) of a demo CSV.
fn parse(csv: &str) -> (Vec<String>, Vec<String>, Vec<Vec<f64>>) {
    let mut lines = csv.lines();
    let header: Vec<String> = lines.next().unwrap().split(',').map(String::from).collect();
    let mut months = Vec::new();
    let mut columns = vec![Vec::new(); header.len() - 1];
    for line in lines {
        let cells: Vec<&str> = line.split(',').collect();
        assert_eq!(cells.len(), header.len(), "row {line}");
        months.push(cells[0].to_string());
        for (column, cell) in columns.iter_mut().zip(&cells[1..]) {
            let units: u64 = cell.parse().expect("a non-negative whole number");
            column.push(units as f64);
        }
    }
    (header, months, columns)
}

// Reference outputs of SplitMix64 seeded with 0 (Vigna's splitmix64.c, prng.di.unimi.it, the
// generator that seeds the xoshiro family; the same three values appear in many ports).
#[test]
fn generator_matches_the_published_splitmix64_stream() {
    let mut random = SplitMix64::new(0);
    assert_eq!(random.next_u64(), 0xE220_A839_7B1D_CDAF);
    assert_eq!(random.next_u64(), 0x6E78_9E6A_A1B9_65F4);
    assert_eq!(random.next_u64(), 0x06C4_5D18_8009_454F);
}

#[test]
fn normal_draws_have_unit_scale() {
    let mut random = SplitMix64::new(7);
    let draws: Vec<f64> = (0..20_000).map(|_| random.normal()).collect();
    let mean = draws.iter().sum::<f64>() / draws.len() as f64;
    let variance = draws.iter().map(|z| (z - mean).powi(2)).sum::<f64>() / draws.len() as f64;
    // Standard errors at n = 20 000: 0.007 for the mean, 0.01 for the variance.
    assert!(mean.abs() < 0.03, "{mean}");
    assert!((variance - 1.0).abs() < 0.05, "{variance}");
    assert!(draws.iter().all(|z| z.is_finite()));
}

#[test]
fn the_demo_is_a_fixed_sixty_month_wide_csv() {
    let csv = demo_csv();
    assert_eq!(csv, demo_csv(), "two calls give the same text");
    assert_eq!(csv.lines().count(), 61);
    let (header, months, columns) = parse(&csv);
    assert_eq!(
        header.join(","),
        "month,Seed packets,Frost cloth,Potting mix 40 L,Hose repair kit,Gift card,Terracotta pot"
    );
    assert_eq!(months.first().map(String::as_str), Some("2021-12"));
    assert_eq!(months.last().map(String::as_str), Some("2026-11"));
    assert_eq!(months[1], "2022-01");
    assert_eq!(columns.len(), 6);
    assert!(columns.iter().all(|c| c.len() == DEMO_MONTHS));
    assert_eq!(DEMO_NAME, "Fernhollow Garden Supply");
}

/// What the scenario promises for one draw, as a list of broken promises (empty = all kept).
fn broken_promises(csv: &str, check_pot: bool) -> Vec<String> {
    let (_, _, columns) = parse(csv);
    let mut broken = Vec::new();
    for (item, column) in DEMO_ITEMS.iter().zip(&columns) {
        let season = detect_season(column, Frequency::Monthly, None);
        let seasonal = matches!(
            *item,
            "Seed packets" | "Frost cloth" | "Potting mix 40 L" | "Gift card"
        );
        if seasonal && season.length != Some(12) {
            broken.push(format!("{item}: {}", season.reason));
        }
        if check_pot && *item == "Terracotta pot" && season.length.is_some() {
            broken.push(format!("{item}: {}", season.reason));
        }
    }
    let trend = mann_kendall(&columns[0]);
    if trend.direction != TrendDirection::Up {
        broken.push(format!("Seed packets trend: {}", trend.reason));
    }
    let hose = classify_demand(&columns[3]);
    if !hose.class.is_sparse() {
        broken.push(format!("Hose repair kit: {}", hose.reason));
    }
    broken
}

#[test]
fn the_patterns_find_what_the_scenario_was_built_to_show() {
    let broken = broken_promises(&demo_csv(), true);
    assert!(broken.is_empty(), "{broken:#?}");
}

// The patterns are built in, not the luck of the committed seed: every promise but one holds
// for each of 40 other seeds (while tuning, all of 500 seeds kept them, with the seed-packet
// Mann-Kendall Z never below 3.1). The exception is the terracotta pot, which is pure noise: the
// seasonality test can pass on noise by chance (18 of those 500 draws), so it must be rejected in
// at least 80 % of the draws rather than in all.
#[test]
fn the_patterns_hold_for_other_seeds() {
    let mut pot_rejections = 0;
    for seed in 1..=40u64 {
        let csv = demo_csv_with_seed(seed);
        let broken = broken_promises(&csv, false);
        assert!(broken.is_empty(), "seed {seed}: {broken:#?}");
        let (_, _, columns) = parse(&csv);
        if detect_season(&columns[5], Frequency::Monthly, None)
            .length
            .is_none()
        {
            pot_rejections += 1;
        }
    }
    assert!(
        pot_rejections >= 32,
        "pot rejected in {pot_rejections} of 40"
    );
}
