//! Exponential smoothing checked against outside references (tests/fixtures/refs, see
//! SOURCES.md there): statsmodels 0.15.0 values, NIST/SEMATECH e-Handbook and NAG examples.

use morrowcast::engine::methods::smoothing::{
    self, init, recursion, variance, FitSettings, Model, ParameterBounds, Parameters, Season,
    States,
};
use morrowcast::engine::methods::optimize::Bound;
use morrowcast::engine::methods::MethodKind;
use serde_json::Value;

const REFS: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/refs/");

fn json(name: &str) -> Value {
    let text = std::fs::read_to_string(format!("{REFS}{name}")).unwrap();
    serde_json::from_str(&text).unwrap()
}

/// Column `column` of a fixture CSV (plain numbers, no quoting in these files).
fn csv_column(name: &str, column: &str) -> Vec<f64> {
    let text = std::fs::read_to_string(format!("{REFS}{name}")).unwrap();
    let mut lines = text.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    let at = header.iter().position(|h| h.trim() == column).unwrap();
    lines
        .filter(|l| !l.trim().is_empty())
        .map(|l| l.split(',').nth(at).unwrap().trim().parse().unwrap())
        .collect()
}

fn numbers(v: &Value) -> Vec<f64> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|x| x.as_f64().unwrap())
        .collect()
}

/// |a − b| <= tol · max(1, |b|): absolute for small values, relative for large ones.
fn close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol * b.abs().max(1.0)
}

fn assert_all_close(what: &str, got: &[f64], want: &[f64], tol: f64) {
    assert_eq!(got.len(), want.len(), "{what}: length");
    for (i, (g, w)) in got.iter().zip(want).enumerate() {
        assert!(close(*g, *w, tol), "{what}[{i}]: got {g}, want {w}");
    }
}

/// The fixture's model keys mapped to models and method kinds.
fn model_for(key: &str, m: usize) -> (Model, MethodKind) {
    let (trend, damped, season, kind) = match key {
        "ses" => (false, false, Season::None, MethodKind::Ses),
        "holt" => (true, false, Season::None, MethodKind::Holt),
        "damped" => (true, true, Season::None, MethodKind::DampedTrend),
        "hw_add" => (true, false, Season::Additive(m), MethodKind::HoltWintersAdditive),
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

fn opt(v: &Value, default: f64) -> f64 {
    v.as_f64().unwrap_or(default)
}

fn ses_model() -> Model {
    Model::new(false, false, Season::None).unwrap()
}
fn holt_model() -> Model {
    Model::new(true, false, Season::None).unwrap()
}
fn params(alpha: f64, beta: f64) -> Parameters {
    Parameters {
        alpha,
        beta,
        gamma: 0.0,
        phi: 1.0,
    }
}
fn states(level: f64, trend: f64) -> States {
    States {
        level,
        trend,
        seasonal: Vec::new(),
    }
}

// Source: statsmodels 0.15.0 ExponentialSmoothing with fixed parameters and known initial
// states on AirPassengers, JohnsonJohnson, USAccDeaths (fixed_params_reference.json; the
// "forecast" field is corrected for the library's h = m bug, see SOURCES.md). Tolerance 1e-9,
// relative where values exceed 1.
#[test]
fn recursion_matches_statsmodels_with_fixed_parameters() {
    let reference = json("fixed_params_reference.json");
    let mut checked = 0;
    for (series, entry) in reference["series"].as_object().unwrap() {
        let y = csv_column(&format!("{series}.csv"), "value");
        let m = entry["m"].as_u64().unwrap() as usize;
        let horizon = entry["H"].as_u64().unwrap() as usize;
        assert_eq!(y.len(), entry["n"].as_u64().unwrap() as usize);
        for (key, r) in entry["models"].as_object().unwrap() {
            let (model, _) = model_for(key, m);
            let p = Parameters {
                alpha: opt(&r["params"]["alpha"], 0.0),
                beta: opt(&r["params"]["beta"], 0.0),
                gamma: opt(&r["params"]["gamma"], 0.0),
                phi: opt(&r["params"]["phi"], 1.0),
            };
            let initial = States {
                level: opt(&r["initial"]["level"], 0.0),
                trend: opt(&r["initial"]["trend"], 0.0),
                seasonal: r["initial"]["seasonal"]
                    .as_array()
                    .map(|_| numbers(&r["initial"]["seasonal"]))
                    .unwrap_or_default(),
            };
            let out = recursion::run(model, p, &initial, &y, horizon).unwrap();
            let what = format!("{series}/{key}");
            assert_all_close(&format!("{what} fitted"), &out.fitted, &numbers(&r["fitted"]), 1e-9);
            assert!(close(out.sse, r["sse"].as_f64().unwrap(), 1e-9), "{what} sse");
            let last = &r["final_state"];
            assert!(close(out.final_states.level, last["level"].as_f64().unwrap(), 1e-9));
            assert!(close(out.final_states.trend, opt(&last["trend"], 0.0), 1e-9));
            if model.period() > 0 {
                assert_all_close(
                    &format!("{what} final seasonal"),
                    &out.final_states.seasonal,
                    &numbers(&last["seasonal_last_m"]),
                    1e-9,
                );
            }
            assert_all_close(&format!("{what} forecast"), &out.forecast, &numbers(&r["forecast"]), 1e-9);
            checked += 1;
        }
    }
    assert_eq!(checked, 21, "three series times seven models");
}
