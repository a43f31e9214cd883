//! Pattern verdicts checked against outside references: statsmodels 0.15.0 and scipy 1.17.1
//! values in tests/fixtures/refs/patterns_reference.json, written by
//! scripts/patterns_reference.py (versions recorded in the file).

use morrowcast::engine::calendar::Frequency;
use morrowcast::engine::patterns::{
    autocorrelation, detect_season, mann_kendall, SeasonSource, TrendDirection,
};
use serde_json::Value;

fn reference() -> Value {
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/fixtures/refs/patterns_reference.json"
    ))
    .unwrap();
    serde_json::from_str(&text).unwrap()
}

/// One numeric column of a fixture CSV with a header row.
fn column(file: &str, name: &str) -> Vec<f64> {
    let path = format!("{}/tests/fixtures/refs/{file}", env!("CARGO_MANIFEST_DIR"));
    let text = std::fs::read_to_string(path).unwrap();
    let mut lines = text.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    let index = header.iter().position(|h| *h == name).unwrap();
    lines
        .filter(|line| !line.trim().is_empty())
        .map(|line| line.split(',').nth(index).unwrap().parse().unwrap())
        .collect()
}

fn number(value: &Value) -> f64 {
    value.as_f64().unwrap()
}

// Source: statsmodels 0.15.0 statsmodels.tsa.stattools.acf(adjusted=False, fft=False) on R's
// AirPassengers and USAccDeaths (SOURCES.md), via scripts/patterns_reference.py.
// Tolerance 1e-12 absolute on every lag.
#[test]
fn autocorrelation_matches_statsmodels() {
    let reference = reference();
    for file in ["AirPassengers.csv", "USAccDeaths.csv"] {
        let entry = &reference["series"][file];
        let expected = entry["acf"].as_array().unwrap();
        let values = column(file, "value");
        assert_eq!(values.len() as u64, entry["n"].as_u64().unwrap());
        let lags = expected.len() - 1;
        let ours = autocorrelation(&values, lags);
        assert_eq!(ours.len(), lags);
        assert_eq!(number(&expected[0]), 1.0);
        for (k, (got, want)) in ours.iter().zip(&expected[1..]).enumerate() {
            let want = number(want);
            assert!(
                (got - want).abs() < 1e-12,
                "{file} lag {}: {got} vs {want}",
                k + 1
            );
        }
    }
}

// Source: the M4 benchmark seasonality test (Makridakis, Spiliotis & Assimakopoulos 2020;
// "Benchmarks and Evaluation.R") evaluated in scripts/patterns_reference.py on statsmodels'
// autocorrelations. Tolerance 1e-12 on the statistic and the threshold.
#[test]
fn season_test_matches_the_reference_on_classic_monthly_series() {
    let reference = reference();
    for file in ["AirPassengers.csv", "USAccDeaths.csv"] {
        let expected = &reference["series"][file]["season_test_12"];
        let values = column(file, "value");
        let verdict = detect_season(&values, Frequency::Monthly, None);
        assert_eq!(verdict.source, SeasonSource::Calendar);
        assert_eq!(verdict.candidate, Some(12));
        assert!((verdict.statistic - number(&expected["statistic"])).abs() < 1e-12);
        assert!((verdict.threshold - number(&expected["threshold"])).abs() < 1e-12);
        assert_eq!(
            verdict.test_passed,
            Some(expected["passed"].as_bool().unwrap())
        );
        assert_eq!(verdict.length, Some(12), "{file}: {}", verdict.reason);
        assert_eq!(verdict.autocorrelation.len(), 24);
    }
}

// Source: Mann-Kendall statistics computed in scripts/patterns_reference.py with numpy (S, tie
// term) and scipy 1.17.1 scipy.stats.norm.sf (p), S cross-checked there against
// scipy.stats.kendalltau. Tolerance 1e-9 on S, var(S), Z; 1e-9 relative on p (AirPassengers'
// p is about 7e-47, so an absolute tolerance would test nothing).
#[test]
fn mann_kendall_matches_the_reference() {
    let reference = reference();
    for (file, name) in [
        ("AirPassengers.csv", "value"),
        ("USAccDeaths.csv", "value"),
        ("productC.csv", "demand"),
    ] {
        let expected = &reference["series"][file]["mann_kendall"];
        let verdict = mann_kendall(&column(file, name));
        assert_eq!(verdict.n as u64, expected["n"].as_u64().unwrap());
        assert!((verdict.s - number(&expected["s"])).abs() < 1e-9, "{file}");
        assert!((verdict.variance - number(&expected["variance"])).abs() < 1e-9);
        assert!((verdict.z - number(&expected["z"])).abs() < 1e-9, "{file}");
        let p = number(&expected["p_value"]);
        assert!(
            (verdict.p_value - p).abs() <= 1e-9 * p,
            "{file}: p {} vs {p}",
            verdict.p_value
        );
    }
    // The directions these numbers imply at the 5 % level.
    let air = mann_kendall(&column("AirPassengers.csv", "value"));
    assert_eq!(air.direction, TrendDirection::Up);
    let deaths = mann_kendall(&column("USAccDeaths.csv", "value"));
    assert_eq!(deaths.direction, TrendDirection::None);
}
