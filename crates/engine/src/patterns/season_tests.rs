//! Tests of the season-length verdict on constructed series (the reference values from
//! statsmodels are checked in tests/patterns_reference.rs).

use super::*;
use crate::calendar::Frequency;

/// A sine of period `period` plus a small deterministic wobble (so ties and exact zeros do not
/// make the autocorrelation unusually clean).
fn seasonal(n: usize, period: usize, amplitude: f64) -> Vec<f64> {
    (0..n)
        .map(|t| {
            let angle = 2.0 * std::f64::consts::PI * t as f64 / period as f64;
            100.0 + amplitude * angle.sin() + wobble(t as u64)
        })
        .collect()
}

/// Pseudo-random numbers in [-1, 1) from a fixed integer hash (SplitMix64 finaliser).
fn wobble(t: u64) -> f64 {
    let mut z = t.wrapping_add(1).wrapping_mul(0x9E37_79B9_7F4A_7C15);
    z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
    z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
    z ^= z >> 31;
    (z >> 11) as f64 / (1u64 << 53) as f64 * 2.0 - 1.0
}

#[test]
fn calendar_season_is_accepted_with_its_evidence() {
    let values = seasonal(48, 12, 20.0);
    let v = detect_season(&values, Frequency::Monthly, None);
    assert_eq!(v.length, Some(12));
    assert_eq!(v.candidate, Some(12));
    assert_eq!(v.source, SeasonSource::Calendar);
    assert_eq!(v.autocorrelation.len(), 24);
    assert_eq!(v.full_seasons, 4);
    assert_eq!(v.test_passed, Some(true));
    // The threshold is the documented formula applied to the shown autocorrelations.
    let sum: f64 = v.autocorrelation[..11].iter().map(|r| r * r).sum();
    let threshold = 1.645 * ((1.0 + 2.0 * sum) / 48.0).sqrt();
    assert!((v.threshold - threshold).abs() < 1e-15);
    assert!((v.statistic - v.autocorrelation[11].abs()).abs() < 1e-15);
    assert!(v.statistic > v.threshold);
    let expected = format!(
        "12-period season accepted: autocorrelation at lag 12 is {:.2}, above the {:.2} \
         threshold, with 4 full seasons",
        v.statistic, v.threshold
    );
    assert_eq!(v.reason, expected);
}

#[test]
fn autocorrelation_peak_supplies_the_candidate_without_a_calendar() {
    let values = seasonal(40, 5, 20.0);
    let v = detect_season(&values, Frequency::Undated, None);
    assert_eq!(v.source, SeasonSource::Autocorrelation);
    assert_eq!(v.candidate, Some(5), "lag 5 beats its multiple 10: {:?}", v);
    assert_eq!(v.length, Some(5));
    assert_eq!(v.autocorrelation.len(), 10);
    assert!(v
        .reason
        .starts_with("5-period season at the autocorrelation peak accepted"));
}

#[test]
fn noise_is_rejected() {
    let values: Vec<f64> = (0..60).map(|t| 50.0 + 5.0 * wobble(t + 1000)).collect();
    let v = detect_season(&values, Frequency::Monthly, None);
    assert_eq!(v.length, None);
    assert_eq!(v.test_passed, Some(false));
    assert!(v.statistic <= v.threshold);
    assert!(
        v.reason.starts_with("12-period season rejected"),
        "{}",
        v.reason
    );
    assert!(v.reason.contains("not above"));
}

#[test]
fn one_full_season_is_not_enough() {
    let values = seasonal(18, 12, 20.0);
    let v = detect_season(&values, Frequency::Monthly, None);
    assert_eq!(v.length, None);
    assert_eq!(v.full_seasons, 1);
    assert_eq!(v.autocorrelation.len(), 17, "lags stop at n - 1");
}

#[test]
fn a_trend_alone_offers_no_candidate() {
    let values: Vec<f64> = (0..40).map(|t| t as f64 + wobble(t)).collect();
    let v = detect_season(&values, Frequency::Undated, None);
    assert_eq!((v.length, v.candidate), (None, None));
    assert_eq!(v.source, SeasonSource::NoCandidate);
    assert_eq!(v.test_passed, None);
    assert_eq!(v.autocorrelation.len(), 24);
    assert!(v.reason.contains("no positive peak between lags 2 and 13"));
}

#[test]
fn the_user_always_wins_and_still_sees_the_evidence() {
    let values = seasonal(48, 12, 20.0);
    // A season of 3 against a 12-period sine: r_3 = cos(pi/2) is near zero. (A choice of 7 would
    // pass, because the test looks at |r_m| and r_7 = cos(7 pi / 6) is strongly negative.)
    let chosen = detect_season(&values, Frequency::Monthly, Some(3));
    assert_eq!(chosen.length, Some(3));
    assert_eq!(chosen.source, SeasonSource::User);
    assert_eq!(chosen.candidate, Some(3));
    assert_eq!(chosen.autocorrelation.len(), 6);
    assert!(chosen
        .reason
        .starts_with("3-period season set by you; the data alone would not:"));

    let none = detect_season(&values, Frequency::Monthly, Some(1));
    assert_eq!(none.length, None);
    assert_eq!(none.source, SeasonSource::User);
    assert_eq!(none.candidate, Some(12));
    assert_eq!(none.test_passed, Some(true));
    assert!(none
        .reason
        .starts_with("no season, as you chose; the data alone would accept a 12-period season"));

    let too_long = detect_season(&values[..10], Frequency::Monthly, Some(100));
    assert_eq!(too_long.length, Some(100));
    assert_eq!(too_long.test_passed, None);
    assert!(too_long.reason.contains("cannot be tested on 10 values"));
}

#[test]
fn degenerate_inputs_do_not_panic() {
    for frequency in [Frequency::Monthly, Frequency::Undated, Frequency::Yearly] {
        for user in [None, Some(0), Some(1), Some(3)] {
            for values in [
                &[][..],
                &[5.0],
                &[5.0, 5.0, 5.0, 5.0, 5.0, 5.0, 5.0],
                &[1.0, f64::NAN, 2.0],
            ] {
                let v = detect_season(values, frequency, user);
                assert!(!v.reason.is_empty());
                assert_eq!(v.length, user.filter(|m| *m >= 2));
            }
        }
    }
    let short = detect_season(&[1.0, 2.0, 1.0, 2.0, 1.0], Frequency::Undated, None);
    assert!(
        short.reason.contains("5 values are too few"),
        "{}",
        short.reason
    );
}

/// A steep trend plus a sine of period `period`: the trend fills r_1 .. r_{m-1}, which lifts the
/// autocorrelation test's threshold above r_m.
fn trending_seasonal(n: usize, period: usize, amplitude: f64) -> Vec<f64> {
    seasonal(n, period, amplitude)
        .iter()
        .enumerate()
        .map(|(t, v)| v + 10.0 * t as f64)
        .collect()
}

#[test]
fn a_strong_calendar_season_on_a_trend_is_accepted_by_its_strength() {
    let values = trending_seasonal(24, 4, 30.0);
    let v = detect_season(&values, Frequency::Quarterly, None);
    assert_eq!(v.test_passed, Some(false), "{}", v.reason);
    let strength = v.strength.unwrap();
    assert!(strength >= STRONG_SEASON, "{strength}");
    assert_eq!(v.length, Some(4));
    let expected = format!(
        "4-period season accepted: autocorrelation at lag 4 is {:.2}, not above the {:.2} \
         threshold, but the seasonal strength is {strength:.2}, at least 0.64, with 6 full seasons",
        v.autocorrelation[3], v.threshold
    );
    assert_eq!(v.reason, expected);
}

#[test]
fn strength_needs_four_seasons_and_a_calendar() {
    // Three years: noise alone can score high, so the test alone decides (the plan puts such
    // a season on trial).
    let short = detect_season(&trending_seasonal(12, 4, 30.0), Frequency::Quarterly, None);
    assert_eq!(short.test_passed, Some(false));
    assert_eq!(short.length, None, "{}", short.reason);
    assert!(!short.reason.contains("strength"), "{}", short.reason);
    // No calendar: the lag was found as the autocorrelation's peak, so only the test counts.
    let undated = detect_season(&trending_seasonal(60, 5, 30.0), Frequency::Undated, None);
    if undated.test_passed == Some(false) {
        assert_eq!(undated.length, None, "{}", undated.reason);
    }
    assert!(!undated.reason.contains("strength"), "{}", undated.reason);
}

#[test]
fn noise_has_no_strength_to_speak_of() {
    let values: Vec<f64> = (0..60).map(|t| 100.0 + 10.0 * wobble(t)).collect();
    let f = seasonal_strength(&values, 12).unwrap();
    assert!(f < STRONG_SEASON, "{f}");
    let v = detect_season(&values, Frequency::Monthly, None);
    assert_eq!(v.length, None, "{}", v.reason);
    assert!(v.reason.contains("below 0.64"), "{}", v.reason);
    // Undefined cases give no number rather than a made-up one.
    assert_eq!(seasonal_strength(&values[..23], 12), None);
    assert_eq!(seasonal_strength(&[5.0; 24], 4), None);
}
