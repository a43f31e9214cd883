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

// Source: statsmodels 0.15.0's 'heuristic' (Hyndman et al. 2008 sec. 2.6.1) and 'simple'
// initial states (init_heuristics_reference.json, rules spelled out in the file). The "train"
// entries of the file equal the "full" ones there; both are checked on the full series.
// Tolerance 1e-9 relative.
#[test]
fn initial_state_rules_match_statsmodels() {
    let reference = json("init_heuristics_reference.json");
    let mut checked = 0;
    for (series, cases) in reference["series"].as_object().unwrap() {
        let y = csv_column(&format!("{series}.csv"), "value");
        let m = match series.as_str() {
            "JohnsonJohnson" => 4,
            _ => 12,
        };
        for (case, rules) in cases.as_object().unwrap() {
            if !case.starts_with("full|") {
                continue;
            }
            let trend = case.contains("trend=add");
            let season = if case.ends_with("seasonal=add") {
                Season::Additive(m)
            } else if case.ends_with("seasonal=mul") {
                Season::Multiplicative(m)
            } else {
                Season::None
            };
            let model = Model::new(trend, false, season).unwrap();
            for (rule, got) in [
                ("heuristic", init::heuristic(model, &y).unwrap()),
                ("simple", init::simple(model, &y).unwrap()),
            ] {
                let want = &rules[rule];
                let what = format!("{series} {case} {rule}");
                assert!(close(got.level, want["level"].as_f64().unwrap(), 1e-9), "{what} level {}", got.level);
                if trend {
                    assert!(close(got.trend, want["trend"].as_f64().unwrap(), 1e-9), "{what} trend {}", got.trend);
                }
                if model.period() > 0 {
                    assert_all_close(&what, &got.seasonal, &numbers(&want["seasonal"]), 1e-9);
                }
                checked += 1;
            }
        }
    }
    assert_eq!(checked, 36);
}

/// statsmodels 0.15.0's default search region, for a like-for-like SSE comparison: α, β, γ in
/// [0, 1] with β ≤ α and γ ≤ 1 − α, φ in [0.8, 0.995] (read off its fitted values in
/// peer_holdout.json, which sit on those limits).
fn statsmodels_like_bounds() -> FitSettings {
    FitSettings {
        bounds: ParameterBounds {
            alpha: Bound::new(0.0, 1.0),
            beta_ratio: Bound::new(0.0, 1.0),
            gamma_ratio: Bound::new(0.0, 1.0),
            phi: Bound::new(0.8, 0.995),
        },
        ..FitSettings::default()
    }
}

fn mape(actual: &[f64], forecast: &[f64]) -> f64 {
    100.0 / actual.len() as f64
        * actual
            .iter()
            .zip(forecast)
            .map(|(a, f)| ((a - f) / a).abs())
            .sum::<f64>()
}

// Source: statsmodels 0.15.0 fitting each model itself ('estimated' initial states: all of
// l0, b0, s0 optimised, like ours) on the training span (peer_holdout.json). Our in-sample SSE
// must be no worse than statsmodels' + 0.5 %, both with statsmodels' own search region and with
// ours (φ <= 0.98, α <= 0.9999) where statsmodels' optimum lies inside ours.
#[test]
fn optimiser_reaches_statsmodels_sse_on_training_spans() {
    let reference = json("peer_holdout.json");
    let keys = ["ses", "holt", "damped", "hw_add", "hw_mul", "hw_add_damped", "hw_mul_damped"];
    let mut report = String::new();
    for (series, entry) in reference["series"].as_object().unwrap() {
        let y = csv_column(&format!("{series}.csv"), "value");
        let m = entry["m"].as_u64().unwrap() as usize;
        let n_train = entry["n_train"].as_u64().unwrap() as usize;
        let holdout = numbers(&entry["holdout"]);
        let train = &y[..n_train];
        for key in keys {
            let peer = &entry["fits"][format!("{key}|estimated")];
            let peer_sse = peer["sse"].as_f64().unwrap();
            let (model, kind) = model_for(key, m);
            let like = smoothing::fit_model(kind, model, train, holdout.len(), &statsmodels_like_bounds()).unwrap();
            let ours = smoothing::fit_model(kind, model, train, holdout.len(), &FitSettings::default()).unwrap();
            let line = format!(
                "{series:15} {key:14} sse sm {peer_sse:14.6e} like {:14.6e} ({:+.3}%) ours {:14.6e} ({:+.3}%) | MAPE sm {:6.3} like {:6.3} ours {:6.3} | evals {}\n",
                like.run.sse,
                100.0 * (like.run.sse / peer_sse - 1.0),
                ours.run.sse,
                100.0 * (ours.run.sse / peer_sse - 1.0),
                peer["metrics"]["MAPE"].as_f64().unwrap(),
                mape(&holdout, &like.run.forecast),
                mape(&holdout, &ours.run.forecast),
                ours.estimate.evaluations,
            );
            report.push_str(&line);
            assert!(like.run.sse <= peer_sse * 1.005, "{line}");
            let phi = peer["params"]["phi"].as_f64().unwrap_or(0.9);
            if phi <= 0.98 {
                assert!(ours.run.sse <= peer_sse * 1.005, "{line}");
            }
        }
    }
    println!("{report}");
}

// Speed target of the brief (common practice for a 5 ms pipeline budget): all seven variants on
// a 60-point monthly series in about 1 ms in release mode. Run with
// `cargo test --release --test smoothing_reference -- --ignored --nocapture`.
#[test]
#[ignore]
fn seven_variants_on_sixty_months_are_fast() {
    let y = csv_column("USAccDeaths.csv", "value");
    let train = &y[..60];
    let kinds = [
        MethodKind::Ses,
        MethodKind::Holt,
        MethodKind::DampedTrend,
        MethodKind::HoltWintersAdditive,
        MethodKind::HoltWintersMultiplicative,
        MethodKind::DampedHoltWintersAdditive,
        MethodKind::DampedHoltWintersMultiplicative,
    ];
    let repeats = 200;
    let mut per_kind = vec![0.0; kinds.len()];
    let start = std::time::Instant::now();
    for _ in 0..repeats {
        for (i, kind) in kinds.iter().enumerate() {
            let t = std::time::Instant::now();
            let fitted = smoothing::fit(*kind, train, Some(12), 12).unwrap();
            per_kind[i] += t.elapsed().as_secs_f64();
            std::hint::black_box(fitted);
        }
    }
    let total_ms = start.elapsed().as_secs_f64() * 1e3 / repeats as f64;
    for (kind, t) in kinds.iter().zip(&per_kind) {
        println!("{:40} {:8.1} µs", kind.label(), t * 1e6 / repeats as f64);
    }
    println!("all seven: {total_ms:.3} ms per fit of the seven");
    assert!(total_ms < 5.0, "{total_ms} ms");
}

// Source: NIST/SEMATECH e-Handbook 6.4.3.1 (pmc431.htm), data FROM MEMORY (consistent with
// 6.4.3.2), convention S_2 = y_1, errors t = 2..12, MSE = SSE/11 (handbook_examples.json). Our
// recursion with l0 = y_1 has zero error at t = 1, so the SSEs coincide. Unrounded values are
// checked to 1e-9 against the file's recomputation; the remembered MSE 19.0 (alpha 0.1) to its
// one decimal. The remembered MSE 16.29 at alpha 0.5 is not reproducible (file: unverified).
#[test]
fn nist_single_smoothing_example() {
    let y = csv_column("nist_ses_12.csv", "y");
    let reference = json("handbook_examples.json");
    let example = &reference["nist_6.4.3.1_single_exponential_smoothing"]["computed"];
    for (alpha, key) in [(0.1, "alpha=0.1,round=None"), (0.5, "alpha=0.5,round=None")] {
        let out = recursion::run(ses_model(), params(alpha, 0.0), &states(y[0], 0.0), &y, 0).unwrap();
        assert_all_close("S_2..S_12", &out.fitted[1..], &numbers(&example[key]["S_2_to_n"]), 1e-9);
        assert!(close(out.sse, example[key]["SSE"].as_f64().unwrap(), 1e-9));
    }
    let out = recursion::run(ses_model(), params(0.1, 0.0), &states(y[0], 0.0), &y, 0).unwrap();
    assert!((out.sse / 11.0 - 19.0).abs() < 0.05, "MSE {}", out.sse / 11.0);
}

// Source: NIST e-Handbook 6.4.3.2 (pmc432.htm), published table: bootstrap forecasts 71.50,
// 71.35, 71.21, 71.09, 70.98 (alpha 0.1, last value 70 carried forward) to their 2 decimals;
// single-smoothing forecasts with the later data 75, 75, 74, 78, 86 are published rounded to
// 1 decimal at every step (file's assessment), so the unrounded ones are checked within 0.1.
#[test]
fn nist_bootstrap_example() {
    let y = csv_column("nist_ses_12.csv", "y");
    let published = csv_column("nist_bootstrap_6432.csv", "bootstrap_published");
    let later = csv_column("nist_bootstrap_6432.csv", "data");
    let single = csv_column("nist_bootstrap_6432.csv", "single_published");
    let mut carried = y.clone();
    carried.extend([70.0; 4]);
    let out = recursion::run(ses_model(), params(0.1, 0.0), &states(y[0], 0.0), &carried, 1).unwrap();
    let bootstrap: Vec<f64> = out.fitted[12..].iter().copied().chain(out.forecast).collect();
    for (got, want) in bootstrap.iter().zip(&published) {
        assert!((got - want).abs() <= 0.005 + 1e-9, "{got} vs {want}");
    }
    let mut extended = y.clone();
    extended.extend(&later);
    let out = recursion::run(ses_model(), params(0.1, 0.0), &states(y[0], 0.0), &extended, 0).unwrap();
    for (got, want) in out.fitted[12..].iter().zip(&single) {
        assert!((got - want).abs() < 0.1, "{got} vs {want}");
    }
}

// Source: NIST e-Handbook 6.4.3.6 (pmc436.htm), published MSE table for 24 quarters of sales:
// single 6906 (alpha .4694), double 5054 (alpha .1086, trend 1.0). Single: MSE = SSE/23 with
// S_2 = y_1, within 1 of the published integer. Double: the published value needs b1 fitted
// (file: b1 = 6.3485 gives 5053.67), within 1. Fitted by our optimiser (l0 also free), single
// smoothing must do at least as well as the file's best alpha with l0 = y_1 (MSE 6906.34).
// Triple smoothing: the initialisation behind 520 / 936 is unpublished (file), so only a loose
// sanity check: our fitted Holt-Winters beats double smoothing's 5054 by far.
#[test]
fn nist_quarterly_sales_example() {
    let y = csv_column("nist_quarterly_sales_24.csv", "sales");
    let single = recursion::run(ses_model(), params(0.4694, 0.0), &states(y[0], 0.0), &y, 0).unwrap();
    assert!((single.sse / 23.0 - 6906.0).abs() < 1.0, "{}", single.sse / 23.0);
    let double = recursion::run(holt_model(), params(0.1086, 1.0), &states(y[0], 6.348492114117889), &y[1..], 0)
        .unwrap();
    assert!((double.sse / 23.0 - 5053.66996841409).abs() < 1e-6 * 5054.0);
    assert!((double.sse / 23.0 - 5054.0).abs() < 1.0);
    let fitted = smoothing::fit_model(MethodKind::Ses, ses_model(), &y, 4, &FitSettings::default()).unwrap();
    assert!(fitted.run.sse <= 6906.34 * 23.0 * (1.0 + 1e-6), "{}", fitted.run.sse);
    for (kind, season) in [
        (MethodKind::HoltWintersAdditive, Season::Additive(4)),
        (MethodKind::HoltWintersMultiplicative, Season::Multiplicative(4)),
    ] {
        let model = Model::new(true, false, season).unwrap();
        let fit = smoothing::fit_model(kind, model, &y, 4, &FitSettings::default()).unwrap();
        let mse = fit.run.sse / 24.0;
        println!("{kind}: MSE {mse:.1}");
        assert!(mse < 1100.0, "{kind}: MSE {mse}");
    }
}

// Source: NIST e-Handbook 6.4.3.3/6.4.3.4 (pmc433.htm, pmc434.htm): published equations and
// b1 rules, example data FROM MEMORY; one-step forecasts, MSE and 5 forecasts as recomputed
// in handbook_examples.json, to 1e-9. NIST's S_1 = y_1 and b_1 are our l0, b0 for y_2..y_10.
#[test]
fn nist_double_smoothing_example() {
    let y = csv_column("nist_trend_10.csv", "y");
    let reference = json("handbook_examples.json");
    let cases = &reference["nist_6.4.3.3_6.4.3.4_double_exponential_smoothing"]["computed_alpha_0_3623_gamma_1"];
    for rule in ["y2-y1", "mean_first3_diffs", "(yn-y1)/(n-1)"] {
        let case = &cases[rule];
        let b1 = case["b1"].as_f64().unwrap();
        let out = recursion::run(holt_model(), params(0.3623, 1.0), &states(y[0], b1), &y[1..], 5).unwrap();
        assert_all_close(rule, &out.fitted, &numbers(&case["one_step_forecasts_t2_to_t10"]), 1e-9);
        assert!(close(out.sse / 9.0, case["MSE"].as_f64().unwrap(), 1e-9), "{rule}");
        assert_all_close(rule, &out.forecast, &numbers(&case["forecasts_h1_to_h5"]), 1e-9);
    }
}

// Source: NAG numerical library, example of g13amc (linear Holt, published data and results,
// handbook_examples.json): initial values 168.018, 3.800 = least-squares line on t = 1..11;
// alpha 0.01, trend 1.0; one-step forecasts, RMSE 25.473, MAD 21.233, forecasts and their
// standard errors, all published to 3 decimals (tolerance 5e-4 + rounding slack 1e-9). The
// standard errors use sigma^2 = SSE/n (NAG's "mean deviation"), fed to our generic variance.
#[test]
fn nag_holt_example() {
    let y = csv_column("nag_g13amc_holt.csv", "y");
    let reference = json("handbook_examples.json");
    let published = &reference["nag_g13amc_linear_holt_example"]["published"];
    let (l0, b0) = init::least_squares_line(&y);
    let near = |a: f64, b: f64| (a - b).abs() <= 5e-4 + 1e-9;
    assert!(near(l0, 168.018) && near(b0, 3.8), "{l0} {b0}");
    let p = params(0.01, 1.0);
    let out = recursion::run(holt_model(), p, &states(l0, b0), &y, 5).unwrap();
    for (got, want) in out.fitted.iter().zip(numbers(&published["one_step_forecasts"])) {
        assert!(near(*got, want), "{got} vs {want}");
    }
    let n = y.len() as f64;
    let rmse = (out.sse / n).sqrt();
    let mad = y.iter().zip(&out.fitted).map(|(a, f)| (a - f).abs()).sum::<f64>() / n;
    assert!(near(rmse, 25.473) && near(mad, 21.233), "{rmse} {mad}");
    for (got, want) in out.forecast.iter().zip(numbers(&published["forecasts_h1_5"])) {
        assert!(near(*got, want), "{got} vs {want}");
    }
    let v = variance::forecast_variances(holt_model(), p, out.sse / n, 5).unwrap();
    for (got, want) in v.iter().zip(numbers(&published["forecast_standard_errors"])) {
        assert!(near(got.sqrt(), want), "{} vs {want}", got.sqrt());
    }
}

// Source: Hyndman, Koehler, Ord & Snyder (2005), J. of Forecasting 24:17-37 (closed forms for
// class-1 models, also Hyndman et al. 2008 Table 6.1): ANN v_h = s2 (1 + a^2 (h-1)); AAN
// v_h = s2 [1 + (h-1){a^2 + a b h + b^2 h(2h-1)/6}] with state-space b = alpha * beta here.
// AAA, FROM MEMORY: s2 [1 + (h-1){a^2 + a b h + b^2 h(2h-1)/6} + g k {2a + g + b m (k+1)}],
// k = floor((h-1)/m). The generic w' F^{j-1} g computation must agree to 1e-12 relative.
#[test]
fn variances_match_closed_forms() {
    let (sigma2, alpha, beta_sm, gamma) = (2.5, 0.3, 0.4, 0.2);
    let b = alpha * beta_sm;
    let p = Parameters { alpha, beta: beta_sm, gamma, phi: 1.0 };
    let horizon = 30;
    let ann = variance::forecast_variances(ses_model(), p, sigma2, horizon).unwrap();
    let aan = variance::forecast_variances(holt_model(), p, sigma2, horizon).unwrap();
    let m = 4;
    let aaa_model = Model::new(true, false, Season::Additive(m)).unwrap();
    let aaa = variance::forecast_variances(aaa_model, p, sigma2, horizon).unwrap();
    for h in 1..=horizon {
        let hf = h as f64;
        let trend_part = (hf - 1.0) * (alpha * alpha + alpha * b * hf + b * b * hf * (2.0 * hf - 1.0) / 6.0);
        let k = ((h - 1) / m) as f64;
        let season_part = gamma * k * (2.0 * alpha + gamma + b * m as f64 * (k + 1.0));
        assert!(close(ann[h - 1], sigma2 * (1.0 + alpha * alpha * (hf - 1.0)), 1e-12));
        assert!(close(aan[h - 1], sigma2 * (1.0 + trend_part), 1e-12), "AAN h={h}");
        assert!(close(aaa[h - 1], sigma2 * (1.0 + trend_part + season_part), 1e-12), "AAA h={h}");
    }
    let mul = Model::new(true, false, Season::Multiplicative(m)).unwrap();
    assert!(variance::forecast_variances(mul, p, sigma2, horizon).is_none());
}
