//! The AICc that picks the combination's exponential smoothing model
//! (methods/smoothing/criterion.rs), checked against statsmodels' state space likelihoods.

use crate::support::*;
use morrowcast_engine::methods::smoothing::criterion::{corrected_aic, fit_by_aicc, likelihoods};
use morrowcast_engine::methods::MethodKind;

// Source: statsmodels 0.15.0 ETSModel.smooth at fixed parameters and known initial states, with
// additive and with multiplicative errors, on JohnsonJohnson (aicc_reference.json, written by
// scripts/aicc_reference_statsmodels.py). Its log-likelihood includes the constant
// -n (ln 2 pi + 1) / 2 that Morrowcast leaves out. Tolerance 1e-9 relative.
#[test]
fn likelihoods_match_statsmodels_under_both_errors() {
    let reference = json("aicc_reference.json");
    let cases = reference["cases"].as_array().unwrap();
    assert_eq!(cases.len(), 3);
    for case in cases {
        let y: Vec<f64> = floats(&case["y"]);
        let n = y.len() as f64;
        let constant = n * ((2.0 * std::f64::consts::PI).ln() + 1.0);
        for error in ["add", "mul"] {
            let fitted: Vec<Option<f64>> = floats(&case[error]["fitted"])
                .into_iter()
                .map(Some)
                .collect();
            let l = likelihoods(&fitted, &y).unwrap();
            assert_eq!(l.periods, y.len());
            let expected = -2.0 * case[error]["llf"].as_f64().unwrap() - constant;
            let got = match error {
                "add" => l.additive,
                _ => l.multiplicative.unwrap(),
            };
            assert!(
                (got - expected).abs() <= 1e-9 * expected.abs().max(1.0),
                "{} {error}: {got} vs {expected}",
                case["trend"]
            );
        }
    }
}

fn floats(v: &serde_json::Value) -> Vec<f64> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|x| x.as_f64().unwrap())
        .collect()
}

// The correction term of Hurvich & Tsai (1989), as Hyndman et al. (2002) use it: arithmetic.
#[test]
fn corrected_aic_arithmetic() {
    assert_eq!(corrected_aic(10.0, 20, 3), Some(10.0 + 6.0 + 24.0 / 16.0));
    assert_eq!(corrected_aic(10.0, 4, 3), None, "n - k - 1 = 0");
    // A fitted value at or below zero: no multiplicative-error likelihood.
    let l = likelihoods(&[Some(1.0), Some(-1.0)], &[2.0, 1.0]).unwrap();
    assert!(l.multiplicative.is_none());
    assert!(likelihoods(&[Some(1.0)], &[1.0]).is_none(), "an exact fit");
}

/// The model the criterion picks for `y` (no season) is one of `expected`.
fn check_choice(y: &[f64], expected: &[MethodKind]) {
    let fit = fit_by_aicc(y, None, 4).unwrap();
    assert!(expected.contains(&fit.kind()), "{:?}", fit.kind());
}

// Common practice, and what the criterion is for: a level with noise needs no trend, a steady
// climb does.
#[test]
fn the_criterion_picks_a_trend_only_where_there_is_one() {
    let noise = |t: usize| ((t * 7919) % 13) as f64 - 6.0;
    let level: Vec<f64> = (0..48).map(|t| 100.0 + noise(t)).collect();
    check_choice(&level, &[MethodKind::Ses]);
    let climb: Vec<f64> = (0..48).map(|t| 100.0 + 5.0 * t as f64 + noise(t)).collect();
    check_choice(&climb, &[MethodKind::Holt, MethodKind::DampedTrend]);
}
