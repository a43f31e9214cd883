//! The Stock plan's arithmetic against the outside reference in tests/fixtures/refs/stock
//! (stock_reference.py with scipy 1.17.1 and numpy 2.4.6; formulas and their textbook sources in
//! that folder's README). Tolerances as its README proposes: 1e-9 relative on the loss, safety
//! stock and levels, 1e-9 absolute on z and k (1e-6 relative above 6), 1e-9 absolute on the
//! service fractions.

use morrowcast_engine::stock::{
    figures, inverse_normal_loss, normal_loss, sd_independent, sd_per_horizon,
    sd_variable_lead_time, IntervalDemand, Review, Target,
};
use serde_json::Value;

use crate::support::{json, numbers};

fn reference() -> Value {
    json("stock/stock_reference.json")
}

fn relative(got: f64, want: f64, tol: f64, what: &str) {
    assert!(
        (got - want).abs() <= tol * want.abs().max(1.0),
        "{what}: got {got}, want {want}"
    );
}

fn field(v: &Value, key: &str) -> Option<f64> {
    v.get(key).and_then(Value::as_f64)
}

/// One reference case: its inputs through the engine, compared with its outputs.
fn check(case: &Value) {
    let id = case["id"].as_str().unwrap();
    let i = &case["inputs"];
    let out = &case["outputs"];
    let lead_time = field(i, "lead_time_periods").unwrap();
    let lead_sd = field(i, "lead_time_sd_periods").unwrap_or(0.0);
    let review = match i["policy"].as_str().unwrap() {
        "sQ" => Review::continuous(field(i, "order_quantity").unwrap()).unwrap(),
        _ => Review::periodic(field(i, "review_period").unwrap()).unwrap(),
    };
    let periods = review.protection_periods(lead_time);
    relative(
        periods,
        field(out, "protection_interval_periods").unwrap(),
        1e-12,
        id,
    );
    let sigma = field(i, "sigma_per_period")
        .or(field(i, "rmse_per_period"))
        .or(field(i, "mad_per_period").map(|mad| mad * field(i, "mad_factor").unwrap_or(1.25)));
    // Means over P and over L alone, and the periodic cycle demand (over R).
    let (mean_p, mean_l, mean_r) = match i.get("mean_demand_per_horizon") {
        Some(path) => {
            let path = numbers(path);
            let (p, l) = (periods as usize, lead_time as usize);
            let sum = |a: usize, b: usize| path[a..b.min(path.len())].iter().sum::<f64>();
            (sum(0, p), sum(0, l), sum(l, p))
        }
        None => {
            let mu = field(i, "mean_demand_per_period").unwrap();
            (mu * periods, mu * lead_time, mu * (periods - lead_time))
        }
    };
    relative(
        mean_p,
        field(out, "mean_demand_protection").unwrap(),
        1e-12,
        id,
    );
    let (sd_p, sd_l) = match (i.get("sigma_per_horizon"), sigma) {
        (Some(s), _) => {
            let s = numbers(s);
            (
                sd_per_horizon(&s[..periods as usize]),
                sd_per_horizon(&s[..lead_time as usize]),
            )
        }
        (None, Some(sigma)) if lead_sd > 0.0 => {
            let mu = field(i, "mean_demand_per_period").unwrap();
            (
                sd_variable_lead_time(sigma, mu, periods, lead_sd),
                sd_variable_lead_time(sigma, mu, lead_time, lead_sd),
            )
        }
        (None, Some(sigma)) => (
            sd_independent(sigma, periods),
            sd_independent(sigma, lead_time),
        ),
        (None, None) => panic!("{id}: no spread in the inputs"),
    };
    relative(sd_p, field(out, "sigma_protection").unwrap(), 1e-12, id);
    let protection = IntervalDemand::new(mean_p, sd_p).unwrap();
    let lead = IntervalDemand::new(mean_l, sd_l).unwrap();
    let cycle = match review {
        Review::Continuous { order_quantity } => order_quantity,
        Review::Periodic { .. } => mean_r,
    };
    relative(cycle, field(out, "cycle_demand").unwrap(), 1e-12, id);
    let level_key = match review {
        Review::Continuous { .. } => "reorder_point",
        Review::Periodic { .. } => "order_up_to",
    };
    let exact_key = match review {
        Review::Continuous { .. } => "fill_rate_exact_backorder",
        Review::Periodic { .. } => "fill_rate_sobel_backorder",
    };
    for (block, target) in [
        (
            "csl_target",
            field(i, "target_csl").map(|p| Target::cycle_service(p).unwrap()),
        ),
        (
            "fill_rate_target",
            field(i, "target_fill_rate").map(|p| Target::fill_rate(p).unwrap()),
        ),
    ] {
        let Some(target) = target else { continue };
        let want = &out[block];
        let what = format!("{id} {block}");
        let got = figures(protection, lead, review, cycle, target).unwrap();
        let k_key = if block == "csl_target" { "z" } else { "k" };
        match (got.safety_factor, field(want, k_key)) {
            (Some(k), Some(w)) => {
                let tol = if w.abs() > 6.0 { 1e-6 * w.abs() } else { 1e-9 };
                assert!((k - w).abs() <= tol, "{what} k: got {k}, want {w}");
            }
            // A zero spread: no safety factor, though the reference prints the z of the target.
            (None, _) => assert_eq!(sd_p, 0.0, "{what}"),
            (Some(k), None) => panic!("{what}: k {k} where the reference has none"),
        }
        relative(
            got.safety_stock,
            field(want, "safety_stock").unwrap(),
            1e-9,
            &what,
        );
        relative(got.level, field(want, level_key).unwrap(), 1e-9, &what);
        if let Some(esc) = field(want, "expected_shortage_per_cycle") {
            relative(got.expected_shortage, esc, 1e-9, &what);
        }
        assert!(
            (got.fill_rate - field(want, "fill_rate").unwrap()).abs() < 1e-9,
            "{what}"
        );
        if let Some(csl) = field(want, "cycle_service_level") {
            assert!((got.cycle_service_level - csl).abs() < 1e-9, "{what}");
        }
        if let Some(exact) = field(want, exact_key) {
            assert!(
                (got.fill_rate_exact - exact).abs() < 1e-9,
                "{what} {exact_key}"
            );
        }
    }
}

#[test]
fn every_reference_case_matches() {
    let r = reference();
    let cases = r["cases"].as_array().unwrap();
    assert_eq!(cases.len(), 42);
    for case in cases {
        check(case);
    }
}

#[test]
fn loss_and_its_inverse_match_the_tables() {
    let r = reference();
    for row in r["normal_loss_table"].as_array().unwrap() {
        let (k, g) = (field(row, "k").unwrap(), field(row, "G").unwrap());
        relative(normal_loss(k), g, 1e-9, &format!("G({k})"));
        // 1e-12: the table agrees with 80-digit mpmath to 1.7e-13 (its crosscheck block).
        assert!((normal_loss(k) / g - 1.0).abs() < 1e-12, "G({k}) relative");
    }
    for row in r["inverse_loss_table"].as_array().unwrap() {
        let (g, k) = (field(row, "G_target").unwrap(), field(row, "k").unwrap());
        let got = inverse_normal_loss(g).unwrap();
        let tol = if k.abs() > 6.0 { 1e-6 * k.abs() } else { 1e-9 };
        assert!((got - k).abs() <= tol, "k for G = {g}: got {got}, want {k}");
    }
}
