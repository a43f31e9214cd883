//! NIST/SEMATECH e-Handbook and NAG examples, and closed-form variances.

use super::models::*;
use crate::support::*;
use morrowcast_engine::methods::smoothing::{
    self, init, recursion, variance, FitSettings, Model, Parameters, Season,
};
use morrowcast_engine::methods::MethodKind;

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
        let out =
            recursion::run(ses_model(), params(alpha, 0.0), &states(y[0], 0.0), &y, 0).unwrap();
        assert_all_close(
            "S_2..S_12",
            &out.fitted[1..],
            &numbers(&example[key]["S_2_to_n"]),
            1e-9,
        );
        assert!(close(out.sse, example[key]["SSE"].as_f64().unwrap(), 1e-9));
    }
    let out = recursion::run(ses_model(), params(0.1, 0.0), &states(y[0], 0.0), &y, 0).unwrap();
    assert!(
        (out.sse / 11.0 - 19.0).abs() < 0.05,
        "MSE {}",
        out.sse / 11.0
    );
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
    let out = recursion::run(
        ses_model(),
        params(0.1, 0.0),
        &states(y[0], 0.0),
        &carried,
        1,
    )
    .unwrap();
    let bootstrap: Vec<f64> = out.fitted[12..]
        .iter()
        .copied()
        .chain(out.forecast)
        .collect();
    for (got, want) in bootstrap.iter().zip(&published) {
        assert!((got - want).abs() <= 0.005 + 1e-9, "{got} vs {want}");
    }
    let mut extended = y.clone();
    extended.extend(&later);
    let out = recursion::run(
        ses_model(),
        params(0.1, 0.0),
        &states(y[0], 0.0),
        &extended,
        0,
    )
    .unwrap();
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
// sanity check: fitting the initial states too, our multiplicative Holt-Winters must not be
// worse than the published 520 and the additive one not worse than 936.
#[test]
fn nist_quarterly_sales_example() {
    let y = csv_column("nist_quarterly_sales_24.csv", "sales");
    let single =
        recursion::run(ses_model(), params(0.4694, 0.0), &states(y[0], 0.0), &y, 0).unwrap();
    assert!(
        (single.sse / 23.0 - 6906.0).abs() < 1.0,
        "{}",
        single.sse / 23.0
    );
    let double = recursion::run(
        holt_model(),
        params(0.1086, 1.0),
        &states(y[0], 6.348492114117889),
        &y[1..],
        0,
    )
    .unwrap();
    assert!((double.sse / 23.0 - 5053.66996841409).abs() < 1e-6 * 5054.0);
    assert!((double.sse / 23.0 - 5054.0).abs() < 1.0);
    let fitted =
        smoothing::fit_model(MethodKind::Ses, ses_model(), &y, 4, &FitSettings::default()).unwrap();
    assert!(
        fitted.run.sse <= 6906.34 * 23.0 * (1.0 + 1e-6),
        "{}",
        fitted.run.sse
    );
    for (kind, season, limit) in [
        (MethodKind::HoltWintersAdditive, Season::Additive(4), 936.0),
        (
            MethodKind::HoltWintersMultiplicative,
            Season::Multiplicative(4),
            520.0,
        ),
    ] {
        let model = Model::new(true, false, season).unwrap();
        let fit = smoothing::fit_model(kind, model, &y, 4, &FitSettings::default()).unwrap();
        let mse = fit.run.sse / 24.0;
        println!("{kind}: MSE {mse:.1}");
        assert!(mse <= limit, "{kind}: MSE {mse}");
    }
}

// Source: NIST e-Handbook 6.4.3.3/6.4.3.4 (pmc433.htm, pmc434.htm): published equations and
// b1 rules, example data FROM MEMORY; one-step forecasts, MSE and 5 forecasts as recomputed
// in handbook_examples.json, to 1e-9. NIST's S_1 = y_1 and b_1 are our l0, b0 for y_2..y_10.
#[test]
fn nist_double_smoothing_example() {
    let y = csv_column("nist_trend_10.csv", "y");
    let reference = json("handbook_examples.json");
    let cases = &reference["nist_6.4.3.3_6.4.3.4_double_exponential_smoothing"]
        ["computed_alpha_0_3623_gamma_1"];
    for rule in ["y2-y1", "mean_first3_diffs", "(yn-y1)/(n-1)"] {
        let case = &cases[rule];
        let b1 = case["b1"].as_f64().unwrap();
        let out = recursion::run(
            holt_model(),
            params(0.3623, 1.0),
            &states(y[0], b1),
            &y[1..],
            5,
        )
        .unwrap();
        assert_all_close(
            rule,
            &out.fitted,
            &numbers(&case["one_step_forecasts_t2_to_t10"]),
            1e-9,
        );
        assert!(
            close(out.sse / 9.0, case["MSE"].as_f64().unwrap(), 1e-9),
            "{rule}"
        );
        assert_all_close(
            rule,
            &out.forecast,
            &numbers(&case["forecasts_h1_to_h5"]),
            1e-9,
        );
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
    for (got, want) in out
        .fitted
        .iter()
        .zip(numbers(&published["one_step_forecasts"]))
    {
        assert!(near(*got, want), "{got} vs {want}");
    }
    let n = y.len() as f64;
    let rmse = (out.sse / n).sqrt();
    let mad = y
        .iter()
        .zip(&out.fitted)
        .map(|(a, f)| (a - f).abs())
        .sum::<f64>()
        / n;
    assert!(near(rmse, 25.473) && near(mad, 21.233), "{rmse} {mad}");
    for (got, want) in out
        .forecast
        .iter()
        .zip(numbers(&published["forecasts_h1_5"]))
    {
        assert!(near(*got, want), "{got} vs {want}");
    }
    let v = variance::forecast_variances(holt_model(), p, out.sse / n, 5).unwrap();
    for (got, want) in v
        .iter()
        .zip(numbers(&published["forecast_standard_errors"]))
    {
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
    let p = Parameters {
        alpha,
        beta: beta_sm,
        gamma,
        phi: 1.0,
    };
    let horizon = 30;
    let ann = variance::forecast_variances(ses_model(), p, sigma2, horizon).unwrap();
    let aan = variance::forecast_variances(holt_model(), p, sigma2, horizon).unwrap();
    let m = 4;
    let aaa_model = Model::new(true, false, Season::Additive(m)).unwrap();
    let aaa = variance::forecast_variances(aaa_model, p, sigma2, horizon).unwrap();
    for h in 1..=horizon {
        let hf = h as f64;
        let trend_part =
            (hf - 1.0) * (alpha * alpha + alpha * b * hf + b * b * hf * (2.0 * hf - 1.0) / 6.0);
        let k = ((h - 1) / m) as f64;
        let season_part = gamma * k * (2.0 * alpha + gamma + b * m as f64 * (k + 1.0));
        assert!(close(
            ann[h - 1],
            sigma2 * (1.0 + alpha * alpha * (hf - 1.0)),
            1e-12
        ));
        assert!(
            close(aan[h - 1], sigma2 * (1.0 + trend_part), 1e-12),
            "AAN h={h}"
        );
        assert!(
            close(aaa[h - 1], sigma2 * (1.0 + trend_part + season_part), 1e-12),
            "AAA h={h}"
        );
    }
    let mul = Model::new(true, false, Season::Multiplicative(m)).unwrap();
    assert!(variance::forecast_variances(mul, p, sigma2, horizon).is_none());
}
