//! Properties that hold for any settings and any series: generated inputs (proptest, which
//! shrinks a failure to its smallest case), checked for no panic, only finite numbers, bands
//! that hold their forecast, and limits that hold. The series are invented shapes for these
//! checks, never reference values.
//!
//! Cases per run: 300 settings texts, 300 typed settings, 200 plans (proptest's runner; each
//! failure it ever found is kept as a named regression test at the end). Time is not asserted
//! here (benches/ measures it; the fuzz targets in fuzz/ bound each input's time).

use proptest::prelude::*;

use morrowcast_engine::backtest::RankBy;
use morrowcast_engine::bands::BandMethod;
use morrowcast_engine::calendar::Period;
use morrowcast_engine::plan::{plan_item, ItemPlan};
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::{
    Choice, PlanSettings, SeasonChoice, SettingsText, MAX_HOLDOUT, MAX_HORIZON, MAX_ORIGINS,
    MAX_SEASON, MAX_TRACKING_LIMIT, MIN_TRACKING_LIMIT,
};

/// Text a person might type into a numeric setting: digits, signs, marks, words, huge numbers.
fn typed() -> impl Strategy<Value = String> {
    prop_oneof![
        "[0-9]{0,25}",
        "[-+ ]?[0-9]{1,4}([.,][0-9]{0,3})?[ %]?",
        "(auto|AUTO|none|inf|NaN|-inf|1e3|1E400|0x10| )",
        ".{0,12}",
    ]
}

fn settings_text() -> impl Strategy<Value = SettingsText> {
    (typed(), typed(), typed(), typed(), typed(), typed()).prop_map(
        |(horizon, holdout, season, level, tracking_limit, origins)| SettingsText {
            horizon,
            holdout,
            season,
            level,
            tracking_limit,
            origins,
            ..SettingsText::default()
        },
    )
}

/// What every accepted setting must satisfy (the limits of crates/engine/src/settings.rs).
fn within_limits(s: &PlanSettings) {
    assert!(s.horizon().is_none_or(|h| (1..=MAX_HORIZON).contains(&h)));
    assert!(s.holdout().is_none_or(|k| (1..=MAX_HOLDOUT).contains(&k)));
    if let SeasonChoice::Fixed(m) = s.season() {
        assert!((1..=MAX_SEASON).contains(&m));
    }
    assert!((50.0..=99.9).contains(&s.level().percent()));
    assert!((MIN_TRACKING_LIMIT..=MAX_TRACKING_LIMIT).contains(&s.tracking_limit()));
    assert!((1..=MAX_ORIGINS).contains(&s.origins()));
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(300))]

    /// Any typed text: accepted settings are within their limits; every refusal names its
    /// setting and the text found.
    #[test]
    fn any_settings_text_is_accepted_within_limits_or_refused_by_name(text in settings_text()) {
        match PlanSettings::from_text(&text) {
            Ok(s) => within_limits(&s),
            Err(errors) => {
                prop_assert!(!errors.is_empty());
                for e in errors {
                    let message = e.to_string();
                    prop_assert!(message.contains(e.setting.name()), "{message}");
                    prop_assert!(message.contains(&format!("\"{}\"", e.found)), "{message}");
                }
            }
        }
    }

    /// Any typed numbers through the checked steps: never a panic, never outside a limit.
    #[test]
    fn any_typed_setting_is_accepted_within_limits_or_refused(
        horizon in proptest::option::of(any::<u64>()),
        holdout in proptest::option::of(any::<u64>()),
        season in any::<usize>(),
        level in any::<f64>(),
        limit in any::<f64>(),
        origins in any::<u64>(),
    ) {
        let steps = PlanSettings::default()
            .with_horizon(horizon)
            .and_then(|s| s.with_holdout(holdout))
            .and_then(|s| s.with_season(SeasonChoice::Fixed(season)))
            .and_then(|s| s.with_level(level))
            .and_then(|s| s.with_tracking_limit(limit))
            .and_then(|s| s.with_origins(origins));
        if let Ok(s) = steps {
            within_limits(&s);
        }
    }
}

/// A shape of demand, as invented cases for these properties.
#[derive(Clone, Debug)]
enum Shape {
    Constant(f64),
    Line {
        start: f64,
        slope: f64,
    },
    Season {
        level: f64,
        amplitude: f64,
        length: usize,
    },
    /// Mostly zero with occasional demand.
    Sparse {
        every: usize,
        size: f64,
    },
    /// Seeded noise around a level, scaled by `scale`.
    Noise {
        level: f64,
        scale: f64,
        seed: u64,
    },
}

impl Shape {
    fn value(&self, t: usize) -> f64 {
        match *self {
            Shape::Constant(c) => c,
            Shape::Line { start, slope } => start + slope * t as f64,
            Shape::Season {
                level,
                amplitude,
                length,
            } => level + amplitude * ((t % length) as f64 / length as f64 - 0.5),
            Shape::Sparse { every, size } => {
                if t % every == every / 2 {
                    size
                } else {
                    0.0
                }
            }
            Shape::Noise { level, scale, seed } => {
                let mut z = seed.wrapping_add(0x9E37_79B9_7F4A_7C15u64.wrapping_mul(t as u64 + 1));
                z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
                z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
                let u = ((z ^ (z >> 31)) >> 11) as f64 / (1u64 << 53) as f64;
                level + scale * (u - 0.5)
            }
        }
    }
}

fn shape() -> impl Strategy<Value = Shape> {
    let magnitude = prop_oneof![
        Just(0.0),
        -1e3..1e3f64,
        0.0..1e12f64,
        1e-9..1e-3f64,
        -1e12..-1e6f64,
        // At the largest magnitude a series may hold (MAX_ABS_VALUE).
        Just(1e15),
        Just(-1e15),
    ];
    prop_oneof![
        magnitude.clone().prop_map(Shape::Constant),
        (magnitude.clone(), -1e6..1e6f64).prop_map(|(start, slope)| Shape::Line { start, slope }),
        // Alternating between the largest magnitudes (a crude worst case for squares).
        Just(Shape::Season {
            level: 0.0,
            amplitude: 1.99e15,
            length: 2
        }),
        (magnitude.clone(), 0.0..1e6f64, 2usize..15).prop_map(|(level, amplitude, length)| {
            Shape::Season {
                level,
                amplitude,
                length,
            }
        }),
        (2usize..20, 0.0..1e4f64).prop_map(|(every, size)| Shape::Sparse { every, size }),
        (magnitude, 0.0..1e9f64, any::<u64>()).prop_map(|(level, scale, seed)| Shape::Noise {
            level,
            scale,
            seed
        }),
    ]
}

/// A series of 0 to 120 monthly periods, some of them gaps, from a shape.
fn series() -> impl Strategy<Value = Series> {
    (
        shape(),
        0usize..120,
        proptest::collection::vec(any::<bool>(), 0..120),
        0usize..7,
    )
        .prop_filter_map("a series needs a value", |(shape, n, gaps, gap_every)| {
            let values = (0..n)
                .map(|t| {
                    let gap = gap_every > 0
                        && t % (gap_every + 3) == 1
                        && gaps.get(t).copied().unwrap_or(false);
                    (!gap).then(|| shape.value(t))
                })
                .collect();
            // Values beyond the series' bound are refused by Series::new (tested there).
            Series::new("generated", Period::month(2020, 1), values).ok()
        })
}

fn plan_settings() -> impl Strategy<Value = PlanSettings> {
    (
        proptest::option::of(1u64..40),
        proptest::option::of(1u64..30),
        prop_oneof![
            Just(SeasonChoice::Auto),
            (1usize..26).prop_map(SeasonChoice::Fixed)
        ],
        50.0..99.9f64,
        prop_oneof![Just(BandMethod::HorizonAware), Just(BandMethod::MadRule)],
        prop_oneof![
            Just(RankBy::Mase),
            Just(RankBy::Mape),
            Just(RankBy::Rmse),
            Just(RankBy::Bias)
        ],
        1u64..5,
        prop_oneof![
            Just(Choice::Auto),
            Just(Choice::Best),
            Just(Choice::Named("theta".into())),
            Just(Choice::Named("holt_winters_multiplicative".into())),
            Just(Choice::Named("croston".into())),
        ],
    )
        .prop_map(|(h, k, season, level, band, rank_by, origins, choice)| {
            PlanSettings::default()
                .with_horizon(h)
                .and_then(|s| s.with_holdout(k))
                .and_then(|s| s.with_season(season))
                .and_then(|s| s.with_level(level))
                .and_then(|s| s.with_origins(origins))
                .expect("generated within the limits")
                .with_band(band)
                .with_rank_by(rank_by)
                .with_choice(choice)
        })
}

/// What every plan must satisfy, whatever its input.
fn check_plan(series: &Series, settings: &PlanSettings, plan: &ItemPlan) {
    let non_negative = series.interpolated().iter().all(|v| *v >= 0.0);
    if let Some(h) = settings.horizon() {
        assert_eq!(plan.forecast.len(), h);
    }
    for f in &plan.forecast {
        let b = f.band;
        assert!(
            b.low.is_finite() && b.value.is_finite() && b.high.is_finite(),
            "{b:?}"
        );
        assert!(b.low <= b.value && b.value <= b.high, "{b:?}");
        if non_negative {
            assert!(b.low >= 0.0, "{b:?}");
        }
    }
    for r in &plan.backtest.ranking {
        let m = &r.measures;
        assert!(
            m.rmse.is_finite() && m.mad.is_finite() && m.bias.is_finite(),
            "{m:?}"
        );
        assert!(m.mape.is_none_or(f64::is_finite) && m.mase.is_none_or(f64::is_finite));
        assert!(r.holdout_forecast.iter().all(|v| v.is_finite()));
    }
    for e in &plan.ledger {
        let r = &e.row;
        for v in [r.demand, r.forecast, r.error, r.mad, r.mse, r.rmse, r.bias] {
            assert!(v.is_finite(), "{r:?}");
        }
    }
    assert!(plan.fitted.iter().flatten().all(|v| v.is_finite()));
    assert_eq!(plan.fitted.len(), plan.history.len());
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(200))]

    /// Any finite series under any settings: a plan that keeps every promise, or a message.
    #[test]
    fn any_series_gets_a_sound_plan_or_a_message(s in series(), settings in plan_settings()) {
        match plan_item(&s, &settings) {
            Ok(plan) => check_plan(&s, &settings, &plan),
            Err(e) => prop_assert!(!e.to_string().is_empty()),
        }
    }
}
