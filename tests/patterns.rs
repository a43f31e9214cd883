//! Pattern verdicts checked against outside references: statsmodels 0.15.0 and scipy 1.17.1
//! values in tests/fixtures/refs/patterns_reference.json, written by
//! scripts/patterns_reference.py (versions recorded in the file), and the seasonal strength
//! against an own script.

use morrowcast_engine::calendar::Frequency;
use morrowcast_engine::patterns::{
    autocorrelation, classify_demand, detect_season, mann_kendall, seasonal_strength, DemandClass,
    SeasonSource, TrendDirection,
};
use serde_json::Value;

use crate::support::{csv_column, json};

fn reference() -> Value {
    json("patterns_reference.json")
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
        let values = csv_column(file, "value");
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

// Source: own script scripts/decompose_reference.py (standard library only, no code shared with
// the engine): seasonal strength F_S (Wang, Smith & Hyndman 2006) from the additive classical
// decomposition. Tolerance 1e-12.
#[test]
fn seasonal_strength_matches_own_script() {
    for (file, column, m, expected) in [
        ("AirPassengers.csv", "value", 12, 0.7787219427520644),
        ("USAccDeaths.csv", "value", 12, 0.9362165525078306),
        (
            "nist_quarterly_sales_24.csv",
            "sales",
            4,
            0.9105678990640536,
        ),
    ] {
        let f = seasonal_strength(&csv_column(file, column), m).unwrap();
        assert!((f - expected).abs() < 1e-12, "{file}: {f} vs {expected}");
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
        let values = csv_column(file, "value");
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
        let verdict = mann_kendall(&csv_column(file, name));
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
    let air = mann_kendall(&csv_column("AirPassengers.csv", "value"));
    assert_eq!(air.direction, TrendDirection::Up);
    let deaths = mann_kendall(&csv_column("USAccDeaths.csv", "value"));
    assert_eq!(deaths.direction, TrendDirection::None);
}

// Source: "Forecasting: Principles and Practice" 2nd ed., section 12.2 (productC.csv; see
// tests/fixtures/refs/SOURCES.md). By hand: 36 months, 11 with demand, so ADI = 36/11 =
// 3.2727. Sizes 2,1,11,2,6,3,7,3,1,1,1: sum 38, mean 38/11 = 3.4545, sum of squares 236,
// sum of squared deviations 236 - 38^2/11 = 1152/11 = 104.727, sample variance 1152/110 =
// 10.4727, CV^2 = (1152/110) / (38/11)^2 = 11 * 1152 / 14440 = 0.877562. (With the
// population divisor it would be 0.7978: the same class.)
// Lumpy: both measures are at or above the cut-offs.
#[test]
fn product_c_is_lumpy() {
    let demand = csv_column("productC.csv", "demand");
    let v = classify_demand(&demand);
    assert_eq!((v.periods, v.demand_periods), (36, 11));
    assert!((v.adi - 36.0 / 11.0).abs() < 1e-12);
    assert!((v.cv2 - 11.0 * 1152.0 / 14440.0).abs() < 1e-12, "{}", v.cv2);
    assert_eq!(v.class, DemandClass::Lumpy);
}
