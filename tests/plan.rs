//! The whole plan on constructed series: defaults, overrides, gaps, short histories, bands.
//! The series here are made up for these checks (arithmetic cases), never outside references.

use morrowcast_engine::bands::{BandMethod, BandSource};
use morrowcast_engine::plan::{
    plan_item, plan_item_observed, plan_item_reusing, PlanError, Progress,
};
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::{Choice, PlanSettings, SeasonChoice};

use crate::support::monthly;

fn seasonal(n: usize) -> Vec<f64> {
    let shape = [0.6, 0.7, 0.9, 1.2, 1.5, 1.6, 1.4, 1.1, 0.9, 0.8, 0.7, 0.6];
    (0..n)
        .map(|t| ((100.0 + t as f64) * shape[t % 12] + ((t * 7919) % 13) as f64 - 6.0).round())
        .collect()
}

#[test]
fn defaults_detect_the_season_and_forecast_a_calendar_year() {
    let s = monthly(seasonal(60).into_iter().map(Some).collect());
    let p = plan_item(&s, &PlanSettings::default()).unwrap();
    assert_eq!(p.season.length, Some(12));
    assert_eq!(p.forecast.len(), 12);
    assert_eq!(p.forecast[0].period.to_string(), "2026-01");
    assert_eq!(p.ledger.len(), 12);
    assert_eq!(p.ledger[0].period.to_string(), "2025-01");
    assert_eq!(p.chosen.key(), "combination");
    for f in &p.forecast {
        assert!(f.band.low <= f.band.value && f.band.value <= f.band.high);
        assert!(f.band.low >= 0.0);
    }
}

#[test]
fn progress_counts_every_candidate_and_the_plan_is_the_same() {
    let s = monthly(seasonal(60).into_iter().map(Some).collect());
    let mut seen: Vec<Progress> = Vec::new();
    let p = plan_item_observed(&s, &PlanSettings::default(), &mut |step| seen.push(step)).unwrap();
    assert_eq!(p, plan_item(&s, &PlanSettings::default()).unwrap());
    let total = seen[0].total;
    // One step per candidate method (scored or skipped), then the refit and band.
    let candidates = p.backtest.ranking.len() - 1 + p.backtest.skipped.len();
    assert_eq!(total, candidates + 1);
    assert!(seen.iter().all(|s| s.total == total));
    let mut done: Vec<usize> = seen.iter().map(|s| s.done).collect();
    // The last step (refit and band) is heard again at each of the band's rolling origins: 60
    // periods, 12 to forecast, at least 24 to train, so 36 ends (24 to 59, the later ones with
    // the horizon cut at the end of the data), all within BAND_ORIGINS.
    let last_heard = done.iter().filter(|d| **d == total - 1).count();
    assert_eq!(last_heard, 1 + 36);
    done.dedup();
    assert_eq!(done, (0..total).collect::<Vec<_>>());
}

#[test]
fn three_years_with_a_season_keep_the_seasonal_methods() {
    // 36 months, holdout 12: three rolling origins would leave 22 to 24 training periods, too
    // few for Holt-Winters (two full seasons); the backtest uses fewer origins instead.
    let s = monthly(seasonal(36).into_iter().map(Some).collect());
    let settings = PlanSettings::default()
        .with_season(SeasonChoice::Fixed(12))
        .unwrap();
    let p = plan_item(&s, &settings).unwrap();
    assert_eq!(p.backtest.origins_used, 1);
    assert!(
        p.backtest.skipped.is_empty(),
        "left out: {:?}",
        p.backtest.skipped
    );
    assert!(p
        .backtest
        .ranking
        .iter()
        .any(|r| r.candidate.key() == "holt_winters_multiplicative"));
}

#[test]
fn a_season_rejected_on_three_years_is_tried_in_the_backtest() {
    let s = monthly(seasonal(36).into_iter().map(Some).collect());
    let p = plan_item(&s, &PlanSettings::default()).unwrap();
    // The test's threshold is strict on three seasons: it rejects this clear season...
    assert_eq!(p.season.length, None, "{}", p.season.reason);
    // ...so the seasonal methods compete with it, the others stay without a season...
    assert_eq!(p.seasons.trial_length(), Some(12));
    assert_eq!(p.seasons.accepted_length(), None);
    let keys: Vec<&str> = p
        .backtest
        .ranking
        .iter()
        .map(|r| r.candidate.key())
        .collect();
    assert!(keys.contains(&"holt_winters_additive"), "{keys:?}");
    // ...they win it, and the forecast peaks in the pattern's peak month (index 5 of 12).
    let note = p
        .notes
        .iter()
        .find(|n| n.contains("rejected a 12-period season"));
    // The combination takes the two best (seasonal) members beside the two Theta models
    // (without the trial season): the note says the forecast follows it in part, as it does.
    assert!(
        note.is_some_and(|n| n.ends_with(
            "so the forecast follows it in part: 2 of the combination's 4 members use it, the \
             others do not, so its peaks and troughs are about half as deep as the seasonal \
             members have them"
        )),
        "{:?}",
        p.notes
    );
    let values: Vec<f64> = p.forecast.iter().map(|f| f.band.value).collect();
    let peak = (0..12)
        .max_by(|a, b| values[*a].total_cmp(&values[*b]))
        .unwrap();
    assert!(peak == 4 || peak == 5, "{values:?}");
    // "No season", chosen by the user, is not overridden by a trial.
    let none = PlanSettings::default()
        .with_season(SeasonChoice::Fixed(1))
        .unwrap();
    let q = plan_item(&s, &none).unwrap();
    assert_eq!(q.seasons.trial_length(), None);
    assert!(q
        .backtest
        .ranking
        .iter()
        .all(|r| !r.candidate.key().starts_with("holt_winters")));
    // Five years: the test accepts the season on its own; nothing is on trial.
    let long = plan_item(
        &monthly(seasonal(60).into_iter().map(Some).collect()),
        &PlanSettings::default(),
    )
    .unwrap();
    assert_eq!(long.seasons.accepted_length(), Some(12));
    assert_eq!(long.seasons.trial_length(), None);
}

/// (history, the length on trial): a rejected calendar season goes on trial only where the
/// backtest's earliest training part holds two seasons (a trial from one, tried on 2026-12-05,
/// lowered reorder points before a season's rise: README, Benchmarks).
fn check_trial(series: &Series, expected: Option<usize>) {
    let p = plan_item(series, &PlanSettings::default()).unwrap();
    assert_eq!(p.season.length, None, "{}", p.season.reason);
    assert_eq!(p.seasons.trial_length(), expected, "{:?}", p.notes);
}

#[test]
fn a_season_goes_on_trial_only_with_two_seasons_of_training() {
    // 30 months with a summer peak over a rise, 40 with the same: the test rejects the
    // season on both; only the longer holds the holdout and two seasons.
    let summer = |n: usize| -> Series {
        monthly(
            (0..n)
                .map(|t| {
                    let m = (t % 12) as f64;
                    let noise = ((t * 7919) % 11) as f64 - 5.0;
                    let peak = 15.0 * (std::f64::consts::TAU * (m - 3.0) / 12.0).sin();
                    Some((40.0 + peak + 0.8 * t as f64 + noise).round())
                })
                .collect(),
        )
    };
    check_trial(&summer(30), None);
    check_trial(&summer(40), Some(12));
}

#[test]
fn reusing_a_ranking_gives_the_same_plan_as_ranking_again() {
    let s = monthly(seasonal(60).into_iter().map(Some).collect());
    let auto = PlanSettings::default();
    let ranked = plan_item(&s, &auto).unwrap();
    let theta = auto.clone().with_choice(Choice::Named("theta".into()));
    let fresh = plan_item(&s, &theta).unwrap();
    assert_eq!(
        plan_item_reusing(&s, &theta, &ranked, &auto).unwrap(),
        fresh
    );
    assert_eq!(fresh.chosen.key(), "theta");
    // Other settings than the choice: the earlier ranking does not apply and is not used.
    let shorter = theta.clone().with_holdout(Some(6)).unwrap();
    assert_eq!(
        plan_item_reusing(&s, &shorter, &ranked, &auto).unwrap(),
        plan_item(&s, &shorter).unwrap()
    );
}

#[test]
fn user_season_override_wins() {
    let s = monthly(seasonal(60).into_iter().map(Some).collect());
    let settings = PlanSettings::default()
        .with_season(SeasonChoice::Fixed(1))
        .unwrap();
    let p = plan_item(&s, &settings).unwrap();
    assert_eq!(p.season.length, None);
    assert!(p
        .backtest
        .ranking
        .iter()
        .all(|r| r.candidate.key() != "holt_winters_additive"));
}

#[test]
fn gaps_are_interpolated_and_named() {
    let mut values: Vec<Option<f64>> = seasonal(48).into_iter().map(Some).collect();
    values[20] = None;
    let p = plan_item(&monthly(values), &PlanSettings::default()).unwrap();
    assert!(
        p.notes
            .iter()
            .any(|n| n.contains("interpolation") && n.contains("2022-09")),
        "{:?}",
        p.notes
    );
}

#[test]
fn wider_level_widens_every_band_and_mad_rule_is_flat() {
    let s = monthly(seasonal(60).into_iter().map(Some).collect());
    let at = |level: f64, band: BandMethod| {
        let settings = PlanSettings::default()
            .with_level(level)
            .unwrap()
            .with_band(band);
        plan_item(&s, &settings).unwrap()
    };
    let (narrow, wide) = (
        at(80.0, BandMethod::HorizonAware),
        at(99.0, BandMethod::HorizonAware),
    );
    for (n, w) in narrow.forecast.iter().zip(&wide.forecast) {
        assert!(w.band.high - w.band.low > n.band.high - n.band.low);
    }
    let mad = at(95.0, BandMethod::MadRule);
    assert!(mad.forecast.iter().all(|f| f.source == BandSource::MadRule));
    // The MAD rule adds the same z · 1.25 · MAD above every forecast.
    let above: Vec<f64> = mad
        .forecast
        .iter()
        .map(|f| f.band.high - f.band.value)
        .collect();
    assert!(
        above.windows(2).all(|w| (w[0] - w[1]).abs() < 1e-9),
        "{above:?}"
    );
}

#[test]
fn named_method_is_used_and_unknown_is_an_error() {
    let s = monthly(seasonal(60).into_iter().map(Some).collect());
    let settings = PlanSettings::default().with_choice(Choice::from_key("theta").unwrap());
    assert_eq!(plan_item(&s, &settings).unwrap().chosen.key(), "theta");
    let short: Vec<Option<f64>> = seasonal(12).into_iter().map(Some).collect();
    let settings =
        PlanSettings::default().with_choice(Choice::from_key("holt_winters_additive").unwrap());
    assert!(matches!(
        plan_item(&monthly(short), &settings),
        Err(PlanError::NotCandidate { .. })
    ));
    assert!(Choice::from_key("magic").is_none());
}

#[test]
fn a_short_history_is_an_error_with_a_message() {
    let s = monthly(vec![Some(1.0), Some(2.0), Some(3.0)]);
    let e = plan_item(&s, &PlanSettings::default()).unwrap_err();
    assert!(e.to_string().contains("at least 4"));
    // A horizon of 0 cannot reach a plan: the settings refuse it (crates/engine/src/settings.rs).
    assert!(PlanSettings::default().with_horizon(Some(0)).is_err());
}

// A holdout asked for the whole file that a short item cannot give takes the automatic one
// there, said; before, the item was refused and its row lost its forecast and alerts (a
// review: a new item of 8 months under a holdout of 6). An item long enough keeps the asked.
#[test]
fn a_holdout_too_long_for_a_short_item_falls_back_to_the_automatic_one_said() {
    let six = PlanSettings::default().with_holdout(Some(6)).unwrap();
    let values =
        |n: usize| -> Vec<Option<f64>> { (0..n).map(|t| Some(20.0 + (t % 3) as f64)).collect() };
    for (n, held, said) in [(8, 2, true), (9, 6, false), (24, 6, false)] {
        let p = plan_item(&monthly(values(n)), &six).unwrap();
        assert_eq!(p.ledger.len(), held, "{n} periods");
        let note = p.notes.iter().find(|n| n.contains("too few to hold out"));
        assert_eq!(note.is_some(), said, "{n} periods: {:?}", p.notes);
        if said {
            assert_eq!(
                note.unwrap(),
                "8 periods are too few to hold out the 6 asked for (that needs at least 9): \
                 held out 2, as the automatic holdout would"
            );
        }
    }
    // Too short even for the automatic holdout: refused as before.
    assert!(plan_item(&monthly(values(3)), &six).is_err());
}

#[test]
fn intermittent_demand_gets_intermittent_methods_and_no_mape() {
    let values: Vec<Option<f64>> = (0..48)
        .map(|t| {
            Some(if t % 5 == 0 {
                ((t / 5) % 3 + 1) as f64
            } else {
                0.0
            })
        })
        .collect();
    let p = plan_item(&monthly(values), &PlanSettings::default()).unwrap();
    assert!(p
        .backtest
        .ranking
        .iter()
        .any(|r| r.candidate.key() == "croston"));
    assert!(p.backtest.ranking.iter().all(|r| r.measures.mape.is_none()));
    assert!(p.backtest.ranking.iter().all(|r| r.measures.mase.is_some()));
    assert!(p.forecast.iter().all(|f| f.band.low >= 0.0));
}

// A method scored on the training part may not refit on all the data: a multiplicative season
// needs demand above zero, and here only the last season holds a zero. The plan used to name
// the method while forecasting the last value; now the next method of the ranking that refits
// forecasts, is named as chosen, and a note says so (the page and the JSON show the notes).
#[test]
fn a_chosen_method_that_cannot_refit_hands_over_to_the_next_with_a_note() {
    let mut values: Vec<Option<f64>> = seasonal(60).into_iter().map(Some).collect();
    values[58] = Some(0.0);
    let s = monthly(values);
    let settings = PlanSettings::default()
        .with_choice(Choice::from_key("holt_winters_multiplicative").unwrap());
    let p = plan_item(&s, &settings).unwrap();
    let ranked: Vec<&str> = p
        .backtest
        .ranking
        .iter()
        .map(|r| r.candidate.key())
        .collect();
    assert!(
        ranked.contains(&"holt_winters_multiplicative"),
        "{ranked:?}"
    );
    assert_ne!(p.chosen.key(), "holt_winters_multiplicative");
    let note = p
        .notes
        .iter()
        .find(|n| n.contains("could not be refitted"))
        .unwrap_or_else(|| panic!("no note in {:?}", p.notes));
    assert!(
        note.contains("Holt-Winters") && note.contains(&p.chosen.label()),
        "{note}"
    );
    // The ledger is the stand-in's: its holdout forecasts.
    let row = p
        .backtest
        .ranking
        .iter()
        .find(|r| r.candidate == p.chosen)
        .unwrap();
    let ledger_forecasts: Vec<f64> = p.ledger.iter().map(|e| e.row.forecast).collect();
    assert_eq!(ledger_forecasts, row.holdout_forecast);
    // The forecast is the stand-in's own, not the last value repeated.
    let first = p.forecast[0].band.value;
    assert!(p
        .forecast
        .iter()
        .any(|f| (f.band.value - first).abs() > 1.0));
}

// A straight line is fitted exactly, so every error is zero; the band used to have zero
// width. It is now never narrower than the recording step allows (here 10: z x 10/sqrt(12)).
#[test]
fn a_perfectly_linear_history_still_gets_a_band() {
    let s = monthly((1..=36).map(|t| Some(10.0 * t as f64)).collect());
    for band in [BandMethod::HorizonAware, BandMethod::MadRule] {
        let p = plan_item(&s, &PlanSettings::default().with_band(band)).unwrap();
        let z = p.level.z();
        for f in &p.forecast {
            let half = (f.band.high - f.band.low) / 2.0;
            assert!(
                half >= z * 10.0 / 12f64.sqrt() - 1e-9,
                "{band:?}: {:?}",
                f.band
            );
            assert!(f.band.low <= f.band.value && f.band.value <= f.band.high);
        }
    }
}

// A very long history: the backtest and the band work on the most recent RECENT_PERIODS
// periods (said in a note), the chosen method is refitted on all of them, and the ledger's
// periods are the history's last ones. (Its time is measured in benches/speed.rs.)
#[test]
fn a_very_long_history_is_ranked_on_its_recent_periods_and_says_so() {
    use morrowcast_engine::plan::RECENT_PERIODS;
    let n = RECENT_PERIODS + 500;
    let values: Vec<Option<f64>> = (0..n)
        .map(|t| {
            Some(50.0 + ((t * 7919) % 23) as f64 + [0.0, 4.0, 9.0, 3.0, -2.0, -6.0, -8.0][t % 7])
        })
        .collect();
    let s = morrowcast_engine::series::Series::new(
        "Long item",
        morrowcast_engine::calendar::Period::day(2010, 1, 1),
        values,
    )
    .unwrap();
    let p = plan_item(&s, &PlanSettings::default()).unwrap();
    assert!(
        p.notes
            .iter()
            .any(|n| n.contains(&format!("last {RECENT_PERIODS} of the {} periods", s.len()))),
        "{:?}",
        p.notes
    );
    assert_eq!(p.history.len(), n);
    assert_eq!(p.fitted.len(), n);
    // The AICc method chooses its model on those recent periods too, and says so.
    let by_aicc = plan_item(
        &s,
        &PlanSettings::default().with_choice(Choice::Named("smoothing_aicc".into())),
    )
    .unwrap();
    assert!(
        by_aicc
            .notes
            .iter()
            .any(|n| n.starts_with("Exponential smoothing chosen by AICc:")
                && n.contains(&format!("lowest AICc on the last {RECENT_PERIODS} periods"))),
        "{:?}",
        by_aicc.notes
    );
    let last = s.period(n - 1);
    assert_eq!(p.ledger.last().unwrap().period, last);
    assert_eq!(p.forecast[0].period, last.offset(1));
}
