//! Fixture readers and small builders shared by the smoothing reference tests.

use morrowcast::engine::methods::smoothing::{Model, Parameters, Season, States};
use morrowcast::engine::methods::MethodKind;
use serde_json::Value;

pub const REFS: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/refs/");

pub fn json(name: &str) -> Value {
    let text = std::fs::read_to_string(format!("{REFS}{name}")).unwrap();
    serde_json::from_str(&text).unwrap()
}

/// Column `column` of a fixture CSV (plain numbers, no quoting in these files).
pub fn csv_column(name: &str, column: &str) -> Vec<f64> {
    let text = std::fs::read_to_string(format!("{REFS}{name}")).unwrap();
    let mut lines = text.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    let at = header.iter().position(|h| h.trim() == column).unwrap();
    lines
        .filter(|l| !l.trim().is_empty())
        .map(|l| l.split(',').nth(at).unwrap().trim().parse().unwrap())
        .collect()
}

pub fn numbers(v: &Value) -> Vec<f64> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|x| x.as_f64().unwrap())
        .collect()
}

/// |a − b| <= tol · max(1, |b|): absolute for small values, relative for large ones.
pub fn close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol * b.abs().max(1.0)
}

pub fn assert_all_close(what: &str, got: &[f64], want: &[f64], tol: f64) {
    assert_eq!(got.len(), want.len(), "{what}: length");
    for (i, (g, w)) in got.iter().zip(want).enumerate() {
        assert!(close(*g, *w, tol), "{what}[{i}]: got {g}, want {w}");
    }
}

/// The fixture's model keys mapped to models and method kinds.
pub fn model_for(key: &str, m: usize) -> (Model, MethodKind) {
    let (trend, damped, season, kind) = match key {
        "ses" => (false, false, Season::None, MethodKind::Ses),
        "holt" => (true, false, Season::None, MethodKind::Holt),
        "damped" => (true, true, Season::None, MethodKind::DampedTrend),
        "hw_add" => (
            true,
            false,
            Season::Additive(m),
            MethodKind::HoltWintersAdditive,
        ),
        "hw_mul" => (
            true,
            false,
            Season::Multiplicative(m),
            MethodKind::HoltWintersMultiplicative,
        ),
        "hw_add_damped" => (
            true,
            true,
            Season::Additive(m),
            MethodKind::DampedHoltWintersAdditive,
        ),
        "hw_mul_damped" => (
            true,
            true,
            Season::Multiplicative(m),
            MethodKind::DampedHoltWintersMultiplicative,
        ),
        other => panic!("unknown model {other}"),
    };
    (Model::new(trend, damped, season).unwrap(), kind)
}

pub fn opt(v: &Value, default: f64) -> f64 {
    v.as_f64().unwrap_or(default)
}

pub fn ses_model() -> Model {
    Model::new(false, false, Season::None).unwrap()
}
pub fn holt_model() -> Model {
    Model::new(true, false, Season::None).unwrap()
}
pub fn params(alpha: f64, beta: f64) -> Parameters {
    Parameters {
        alpha,
        beta,
        gamma: 0.0,
        phi: 1.0,
    }
}
pub fn states(level: f64, trend: f64) -> States {
    States {
        level,
        trend,
        seasonal: Vec::new(),
    }
}
