//! Models, parameters and states built from the fixtures' model keys, for the smoothing
//! reference tests.

use morrowcast_engine::methods::smoothing::{Model, Parameters, Season, States};
use morrowcast_engine::methods::MethodKind;
use serde_json::Value;

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
