//! Alerts on constructed series (arithmetic cases made up for these checks): each alert where
//! its cause was built in, and none on a clean seasonal history.

use morrowcast_engine::alerts::{alerts, AlertKind};
use morrowcast_engine::calendar::Period;
use morrowcast_engine::plan::plan_item;
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::PlanSettings;

use crate::support::monthly;

fn check(values: Vec<f64>, expected: &[AlertKind]) {
    let series = monthly(values.iter().map(|v| Some(*v)).collect());
    let plan = plan_item(&series, &PlanSettings::default()).unwrap();
    let got = alerts(&plan, &series);
    let kinds: Vec<AlertKind> = got.iter().map(|a| a.kind).collect();
    assert_eq!(kinds, expected, "{got:#?}");
    assert!(got.iter().all(|a| !a.reason.is_empty()));
}

/// A steady season around a level of 100, with a little deterministic noise.
fn seasonal(n: usize) -> Vec<f64> {
    let shape = [0.6, 0.7, 0.9, 1.2, 1.5, 1.6, 1.4, 1.1, 0.9, 0.8, 0.7, 0.6];
    (0..n)
        .map(|t| (100.0 * shape[t % 12] + ((t * 7919) % 13) as f64 - 6.0).round())
        .collect()
}

#[test]
fn a_clean_seasonal_history_raises_nothing() {
    check(seasonal(60), &[]);
}

#[test]
fn short_and_new_histories() {
    // 18 months: too few seasons to accept one, so the forecast, updated each month, has
    // none and runs below the season's rise for months: a bias.
    check(seasonal(18), &[AlertKind::Bias, AlertKind::ShortHistory]);
    check(seasonal(8), &[AlertKind::NewItem]);
    // The reason's tracking signal is that of the one-step forecasts it speaks of, not the
    // holdout's the board shows beside it (a review read the two as one measure).
    let series = monthly(seasonal(18).into_iter().map(Some).collect());
    let plan = plan_item(&series, &PlanSettings::default()).unwrap();
    let bias = alerts(&plan, &series)
        .into_iter()
        .find(|a| a.kind == AlertKind::Bias)
        .unwrap();
    assert!(
        bias.reason
            .contains("the forecasts, each made one month ahead,")
            && bias.reason.contains(": their tracking signal "),
        "{}",
        bias.reason
    );
}

#[test]
fn a_one_off_spike_is_an_outlier_and_widens_the_band() {
    // The spike's period and the fit's next steps stand out; the band's rolling origins that
    // cross it widen the band.
    let mut y = seasonal(60);
    y[30] *= 4.0;
    check(y, &[AlertKind::Outliers, AlertKind::WideBand]);
}

// A straight line of whole units (41 to 64): the fit misses by less than a unit here and
// there and nowhere else, which had scored a miss of 0.4 units in the hundreds and raised
// Outliers (seen on the page, 2026-12-05). A miss under the demand's resolution is none.
#[test]
fn a_straight_line_raises_no_outliers() {
    check((41..65).map(f64::from).collect(), &[]);
}

#[test]
fn the_outliers_reason_names_the_periods() {
    // Index 30 of a history from 2021-01 is 2023-07 (140 and a little noise, times 4). The
    // seasonal indices, taken from the whole history, carry the spike to every July, so the
    // other Julys are missed too: the reason names them all and the spike as the largest.
    let mut y = seasonal(60);
    y[30] *= 4.0;
    let series = monthly(y.into_iter().map(Some).collect());
    let plan = plan_item(&series, &PlanSettings::default()).unwrap();
    let got = alerts(&plan, &series);
    let outliers = got.iter().find(|a| a.kind == AlertKind::Outliers).unwrap();
    assert!(
        outliers.reason.contains("2022-07, 2023-07, 2024-07")
            && outliers
                .reason
                .contains("the largest, 2023-07: demand 568 against"),
        "{}",
        outliers.reason
    );
}

#[test]
fn one_unusual_latest_period_is_named_as_such() {
    // Tripled in the last month: an outlier, and with the small same-signed errors before it a
    // lean over three months, whose reason says that one month carries most of it.
    let mut y = seasonal(60);
    y[59] *= 3.0;
    check(y.clone(), &[AlertKind::Bias, AlertKind::Outliers]);
    let series = monthly(y.into_iter().map(Some).collect());
    let plan = plan_item(&series, &PlanSettings::default()).unwrap();
    let bias = alerts(&plan, &series).remove(0);
    assert!(
        bias.reason.contains("most of it is the last month alone"),
        "{}",
        bias.reason
    );
}

#[test]
fn a_jump_in_the_latest_year_shows_as_bias() {
    // The fit also misses the jump's first period by far: an outlier too.
    let mut y = seasonal(60);
    for v in &mut y[48..] {
        *v += 150.0;
    }
    check(y, &[AlertKind::Bias, AlertKind::Outliers]);
}

#[test]
fn sparse_demand_gone_quiet() {
    // Demand every third month, then nothing for the last four.
    let y: Vec<f64> = (0..48)
        .map(|t| {
            if t % 3 == 0 && t < 44 {
                (3 + t % 5) as f64
            } else {
                0.0
            }
        })
        .collect();
    check(
        y.clone(),
        &[AlertKind::SparseDemand, AlertKind::NoRecentDemand],
    );
    // The reason counts the whole quiet run (months 43 to 47: five), not the alert's three.
    let series = monthly(y.iter().map(|v| Some(*v)).collect());
    let plan = plan_item(&series, &PlanSettings::default()).unwrap();
    let said = alerts(&plan, &series);
    let quiet = said
        .iter()
        .find(|a| a.kind == AlertKind::NoRecentDemand)
        .unwrap();
    assert_eq!(
        quiet.reason,
        "no demand in the last 5 months: possibly discontinued"
    );
}

/// `count` histories of `length` periods from `start`, period t of each `shape(t, z)` with z
/// a standard normal draw, rounded (a seeded generator, Box-Muller on a 64-bit linear
/// congruential one: made up for these checks).
fn made_up(
    count: usize,
    start: Period,
    length: usize,
    shape: impl Fn(usize, f64) -> f64,
) -> Vec<Series> {
    let mut state: u64 = 0x2545_f491_4f6c_dd1d;
    let mut uniform = move || {
        state = state
            .wrapping_mul(6_364_136_223_846_793_005)
            .wrapping_add(1_442_695_040_888_963_407);
        ((state >> 11) as f64 + 0.5) / (1u64 << 53) as f64
    };
    (0..count)
        .map(|_| {
            let values = (0..length)
                .map(|t| {
                    let z = (-2.0 * uniform().ln()).sqrt()
                        * (2.0 * std::f64::consts::PI * uniform()).cos();
                    Some(shape(t, z).round())
                })
                .collect();
            Series::new("made up", start, values).unwrap()
        })
        .collect()
}

// Outliers among many errors: at 3.5 for each error, about a third of stable daily items of
// 540 days had one (measured on 200 through the command line on 2026-12-03: 63); the cut now
// rises with the count (Bonferroni), so at most about 1 in 10 does.
#[test]
fn outliers_on_long_stable_histories_are_rare() {
    let flagged = flagged(
        &made_up(100, Period::day(2023, 1, 2), 540, steady),
        AlertKind::Outliers,
    );
    assert!(flagged <= 10, "outliers on {flagged} of 100 stable items");
}

// Noise a tenth of a level that grows 5.5-fold over five years: the loud late years are no
// outliers once each error is weighed against the fit's size (alerts::spread_power). Judged
// by one spread for all errors, 61 % of 200 such items were flagged (benches/alert_lab.rs
// --outliers, 2026-12-04); weighed, 18.5 %.
#[test]
fn noise_growing_with_the_level_is_no_outlier() {
    let growing = |t: usize, z: f64| (50.0 + 225.0 * t as f64 / 60.0) * (1.0 + 0.1 * z);
    let items = made_up(100, Period::month(2021, 1), 60, growing);
    let flagged = flagged(&items, AlertKind::Outliers);
    assert!(flagged <= 25, "outliers on {flagged} of 100 growing items");
    // A tenfold typo in the middle of each is still found, and named.
    let with_typo: Vec<Series> = items
        .iter()
        .map(|s| {
            let mut values = s.values().to_vec();
            values[30] = values[30].map(|v| v * 10.0);
            Series::new("made up", s.start(), values).unwrap()
        })
        .collect();
    let named = with_typo
        .iter()
        .filter(|s| {
            let plan = plan_item(s, &PlanSettings::default()).unwrap();
            morrowcast_engine::alerts::outliers(&plan, s)
                .is_some_and(|o| o.periods.iter().any(|p| p.index == 30))
        })
        .count();
    assert_eq!(named, 100);
}

/// Normal noise of sd 10 around 100.
fn steady(_: usize, z: f64) -> f64 {
    100.0 + 10.0 * z
}

/// How many of `items` raise an alert of `kind`.
fn flagged(items: &[Series], kind: AlertKind) -> usize {
    items
        .iter()
        .filter(|series| {
            let plan = plan_item(series, &PlanSettings::default()).unwrap();
            alerts(&plan, series).iter().any(|a| a.kind == kind)
        })
        .count()
}

// The Bias alert's limits are set so that steady demand passes them about 1 time in 20
// (alerts::bias_limit); the holdout's tracking signal it replaced passed ±4 for about half
// of such items (benches/alert_lab.rs: 43 % of 200 monthly items of 60 months, 2026-12-03).
// A jump of 30 % in the last three months is found for most (86.5 % of 200 in the lab).
#[test]
fn bias_holds_its_false_alarm_rate_and_finds_a_jump() {
    let start = Period::month(2021, 1);
    let calm = flagged(&made_up(100, start, 60, steady), AlertKind::Bias);
    assert!(calm <= 8, "bias on {calm} of 100 steady items");
    let jump = |t: usize, z: f64| steady(t, z) * if t >= 57 { 1.3 } else { 1.0 };
    let jumped = flagged(&made_up(100, start, 60, jump), AlertKind::Bias);
    assert!(
        jumped >= 85,
        "bias on only {jumped} of 100 items that jumped 30 %"
    );
}

// An item selling every fourth month, with its usual three quiet months at the end, is not
// called possibly discontinued; a fourth quiet month is longer than any run before and is.
#[test]
fn a_quiet_run_no_longer_than_the_items_usual_ones_is_not_an_alert() {
    let every_fourth = |len: usize| -> Vec<f64> {
        (0..len)
            .map(|t| if t % 4 == 0 { (4 + t % 3) as f64 } else { 0.0 })
            .collect()
    };
    let quiet_alert = |y: Vec<f64>| {
        let series = monthly(y.iter().map(|v| Some(*v)).collect());
        let plan = plan_item(&series, &PlanSettings::default()).unwrap();
        alerts(&plan, &series)
            .into_iter()
            .any(|a| a.kind == AlertKind::NoRecentDemand)
    };
    assert!(!quiet_alert(every_fourth(48))); // ends at t = 47: three quiet months
    let mut longer = every_fourth(48);
    longer.push(0.0);
    assert!(quiet_alert(longer));
}
