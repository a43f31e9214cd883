//! Alerts on constructed series (arithmetic cases made up for these checks): each alert where
//! its cause was built in, and none on a clean seasonal history.

use morrowcast_engine::alerts::{alerts, AlertKind};
use morrowcast_engine::calendar::Frequency;
use morrowcast_engine::plan::plan_item;
use morrowcast_engine::settings::PlanSettings;

use crate::support::monthly;

fn check(values: Vec<f64>, expected: &[AlertKind]) {
    let series = monthly(values.iter().map(|v| Some(*v)).collect());
    let plan = plan_item(&series, &PlanSettings::default()).unwrap();
    let got = alerts(&plan, Frequency::Monthly);
    let kinds: Vec<AlertKind> = got.iter().map(|a| a.kind).collect();
    assert_eq!(kinds, expected, "{got:#?}");
    assert!(got.iter().all(|a| !a.reason.is_empty()));
}

/// A steady season around a level of 100, with a little deterministic noise. (With a trend
/// the combination ran 3 % low over the holdout, every period, and the tracking signal rightly
/// said so: consistent small errors are what it is for.)
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
    // 18 months: too few seasons to accept one, so the forecast has none and misses the
    // holdout's seasonal rise every period: the tracking signal and the bias say so.
    check(
        seasonal(18),
        &[
            AlertKind::TrackingSignal,
            AlertKind::Bias,
            AlertKind::ShortHistory,
        ],
    );
    check(seasonal(8), &[AlertKind::NewItem]);
}

#[test]
fn a_one_off_spike_is_an_outlier_and_widens_the_band() {
    // The spike's period and the fit's next steps stand out; the band's rolling origins that
    // cross it widen the band; and the spike lifted the forecast over the holdout.
    let mut y = seasonal(60);
    y[30] *= 4.0;
    check(
        y,
        &[
            AlertKind::TrackingSignal,
            AlertKind::Outliers,
            AlertKind::WideBand,
        ],
    );
}

#[test]
fn a_jump_in_the_holdout_shows_as_tracking_signal_and_bias() {
    // The refit also misses the jump's first period by far: an outlier too.
    let mut y = seasonal(60);
    for v in &mut y[48..] {
        *v += 150.0;
    }
    check(
        y,
        &[
            AlertKind::TrackingSignal,
            AlertKind::Bias,
            AlertKind::Outliers,
        ],
    );
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
    check(y, &[AlertKind::SparseDemand, AlertKind::NoRecentDemand]);
}

/// `count` monthly histories of 60 months: normal noise of sd 10 around 100 (a seeded
/// generator, Box-Muller on a 64-bit linear congruential one: made up for this check), plus
/// `shift` in the last 12 months (the default holdout).
fn noisy(count: usize, shift: f64) -> Vec<Vec<f64>> {
    let mut state: u64 = 0x2545_f491_4f6c_dd1d;
    let mut uniform = move || {
        state = state
            .wrapping_mul(6_364_136_223_846_793_005)
            .wrapping_add(1_442_695_040_888_963_407);
        ((state >> 11) as f64 + 0.5) / (1u64 << 53) as f64
    };
    (0..count)
        .map(|_| {
            (0..60)
                .map(|t| {
                    let z = (-2.0 * uniform().ln()).sqrt()
                        * (2.0 * std::f64::consts::PI * uniform()).cos();
                    (100.0 + 10.0 * z + if t >= 48 { shift } else { 0.0 }).round()
                })
                .collect()
        })
        .collect()
}

/// The share of `histories` raising each of `kinds`.
fn rates(histories: &[Vec<f64>], kinds: &[AlertKind]) -> Vec<f64> {
    let mut counts = vec![0usize; kinds.len()];
    for values in histories {
        let series = monthly(values.iter().map(|v| Some(*v)).collect());
        let plan = plan_item(&series, &PlanSettings::default()).unwrap();
        let got = alerts(&plan, Frequency::Monthly);
        for (count, kind) in counts.iter_mut().zip(kinds) {
            *count += usize::from(got.iter().any(|a| a.kind == *kind));
        }
    }
    counts
        .iter()
        .map(|c| *c as f64 / histories.len() as f64)
        .collect()
}

// Alerts that hold a false-alarm rate: on stable histories (nothing to alert about) the
// tracking signal over a 12-month holdout had passed ±4 for 39 % of items, and the bias test
// fired for 11 % (errors from one origin share its level error); measured on 300 such items
// through the command line on 2026-12-03. Each is now judged against the forecast's own past
// origins too, so each fires for at most about 1 in 10 here, while a 30 % jump in the holdout
// is still found for nearly every item.
#[test]
fn alerts_on_stable_histories_are_rare_and_a_jump_is_found() {
    let kinds = [
        AlertKind::TrackingSignal,
        AlertKind::Bias,
        AlertKind::Outliers,
    ];
    let stable = rates(&noisy(100, 0.0), &kinds);
    for (kind, rate) in kinds.iter().zip(&stable) {
        assert!(
            *rate <= 0.12,
            "{kind:?} on {:.0} % of stable items",
            100.0 * rate
        );
    }
    let jumped = rates(&noisy(50, 30.0), &kinds[..2]);
    assert!(jumped[1] >= 0.9, "bias found on {:.0} %", 100.0 * jumped[1]);
    assert!(
        jumped[0] >= 0.6,
        "tracking signal on {:.0} %",
        100.0 * jumped[0]
    );
}
