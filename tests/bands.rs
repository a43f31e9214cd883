//! Band arithmetic checked against outside values: the normal quantiles behind every band.

use morrowcast_engine::bands::{standard_normal_quantile, MAD_TO_SIGMA};

use crate::support::json;

// scipy 1.17.1 scipy.stats.norm.ppf (tests/fixtures/refs/scipy_reference.json): statrs must
// agree to 1e-9.
#[test]
fn normal_quantiles_match_scipy() {
    let json = json("scipy_reference.json");
    let table = json["norm_ppf"].as_object().unwrap();
    assert!(table.len() >= 10);
    for (p, expected) in table {
        let p: f64 = p.parse().unwrap();
        let z = standard_normal_quantile(p);
        assert!((z - expected.as_f64().unwrap()).abs() < 1e-9, "p {p}: {z}");
    }
    // sqrt(pi/2) from the same file: the 1.25 of the MAD rule is its rounding.
    let ratio = json["sqrt_pi_over_2"].as_f64().unwrap();
    assert!((ratio - (std::f64::consts::PI / 2.0).sqrt()).abs() < 1e-15);
    assert!((ratio - MAD_TO_SIGMA).abs() < 0.0034);
}

// scipy 1.17.1 scipy.stats.t.ppf (tests/fixtures/refs/t_quantiles.json, made by
// scripts/t_quantile_reference.py), fractional degrees of freedom included: statrs, which the
// rolling-origin band uses, must agree to 1e-8 relative.
#[test]
fn student_t_quantiles_match_scipy() {
    let reference = json("t_quantiles.json");
    let rows = reference["t_ppf"].as_array().unwrap();
    assert!(rows.len() >= 60);
    for row in rows {
        let (p, df, q) = (
            row["p"].as_f64().unwrap(),
            row["df"].as_f64().unwrap(),
            row["q"].as_f64().unwrap(),
        );
        let got = morrowcast_engine::bands::student_t_quantile(p, df);
        assert!(
            (got - q).abs() <= 1e-8 * q.abs().max(1.0),
            "t({df}) at {p}: {got} vs scipy {q}"
        );
    }
}
