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

// Two years of a monthly season, the automatic choice a combination with seasonal members:
// their own rolling origins need two full seasons of training, so none fit in 24 months, and
// the band rests on the seasonal naive method's errors at origins from month 12 on (a
// stand-in, said in a note), growing with the horizon; before, the MAD rule's flat band of
// the fit's one-step errors held about half its 95 % on such histories (README, Benchmarks).
// With a third year the method's own errors return.
#[test]
fn a_seasonal_fit_on_two_seasons_borrows_the_seasonal_naive_errors() {
    use morrowcast_engine::bands::BandSource;
    use morrowcast_engine::calendar::Period;
    use morrowcast_engine::plan::plan_item;
    use morrowcast_engine::series::Series;
    use morrowcast_engine::settings::{Choice, PlanSettings, SeasonChoice};
    let shape = [
        20.0, 22.0, 30.0, 45.0, 60.0, 70.0, 66.0, 50.0, 38.0, 30.0, 26.0, 40.0,
    ];
    let months = |n: usize| -> Vec<Option<f64>> {
        (0..n)
            .map(|t| Some(shape[t % 12] * (1.0 + 0.1 * (t / 12) as f64) + ((t * 7) % 5) as f64))
            .collect()
    };
    let settings = PlanSettings::default()
        .with_season(SeasonChoice::Fixed(12))
        .unwrap()
        .with_choice(Choice::Auto);
    let plan = |n: usize| {
        let series = Series::new("Frost cloth", Period::month(2023, 1), months(n)).unwrap();
        plan_item(&series, &settings).unwrap()
    };
    let two = plan(24);
    assert!(
        two.notes.iter().any(|n| n.contains("a stand-in")),
        "{:?}",
        two.notes
    );
    assert!(two
        .forecast
        .iter()
        .all(|f| f.source == BandSource::RollingOrigins));
    let width = |i: usize| two.forecast[i].band.high - two.forecast[i].band.low;
    assert!(width(11) > width(0), "{} vs {}", width(11), width(0));
    let three = plan(36);
    assert!(
        !three.notes.iter().any(|n| n.contains("a stand-in")),
        "{:?}",
        three.notes
    );
}
