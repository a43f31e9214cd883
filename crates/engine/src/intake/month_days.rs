//! Dates one a month on nearby days, each standing for its month (or quarter, or year):
//! monthly totals dated on a working day (the month's last business day, its last Friday,
//! its first working day), which their steps make daily.
//!
//! Asked of the dates (distinct per item, where a long table's `series` names each row's
//! item: two stores may close their months on the 28th and the 30th):
//! - a window of [`MONTH_DAY_SPREAD`] + 1 days counted from the month's start or from its end
//!   holding the most dates; in it, for each item and month, the date nearest the day most
//!   dates fall on is the month's "anchor" (at least 4 of them);
//! - the other dates few: none below 5 anchors, then one, and one in ten from 10 (a
//!   correction dated the 27th, a return on the 14th, a month-to-date row); each is read into
//!   the month that holds it and said;
//! - the anchors not weekly by their steps, or weekly but in fewer than half the weeks from
//!   the first to the last (all on Fridays); month ends with a stray date among them are
//!   read here too, since the stray makes the column daily;
//! - quarter or year ends but for one anchor in ten (one from 5) in a month their step
//!   skips: those are "misplaced" (a quarter's total filed a month late), for the reader to
//!   refuse at their rows rather than add to the next quarter;
//! - the anchors' months covering at least a third of the months (or quarters, or years) from
//!   the first to the last, or 6 anchors or more (a kiosk open two months a year): a daily
//!   item sold now and then is not so.
//!
//! Kept apart from: the frequency dates imply by their steps ([`super::dates`]) and how the
//! period reader uses what is found here ([`super::regroup`]).

use crate::sorting;
use std::collections::{BTreeMap, BTreeSet};

use super::dates::{date_period, gcd, infer_frequency};
use crate::calendar::{civil_from_days, days_in_month, Frequency};

/// How far apart, in days, the anchors may fall within their months: a month's last business
/// day is up to 3 days before its end (a weekend, or Easter's Friday and Monday), its first
/// up to 3 days after its start, and the month's last (or first) Friday up to 6.
pub(crate) const MONTH_DAY_SPREAD: u32 = 6;

/// What [`one_a_month`] found: the frequency the anchors' months imply, where in their months
/// they fall, and the dates off that pattern (day numbers, ascending).
#[derive(Debug, Clone, PartialEq, Eq)]
pub(crate) struct OneAMonth {
    pub frequency: Frequency,
    pub side: Side,
    pub off: Vec<i64>,
    /// Dates like the others in their month but in a month the others' step skips (a
    /// quarter's total filed a month late): not read, each an error at its rows.
    pub misplaced: Vec<i64>,
}

/// Where in their months the anchors fall: days `lo` to `hi` counted from the month's first
/// day (1 = the first) or from its last (0 = the last day).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Side {
    FromStart { lo: u32, hi: u32 },
    FromEnd { lo: u32, hi: u32 },
}

impl Side {
    /// Whether the dates all fall on one day so counted (month ends with a stray among them).
    pub(crate) fn one_day(self) -> bool {
        match self {
            Side::FromStart { lo, hi } | Side::FromEnd { lo, hi } => lo == hi,
        }
    }

    /// The days in words, for the warning that reads the dates as months.
    pub(crate) fn describe(self) -> String {
        let days = |n: u32| {
            if n == 1 {
                "1 day".to_string()
            } else {
                format!("{n} days")
            }
        };
        match self {
            Side::FromEnd { lo: 0, hi: 0 } => "on the month's last day".to_string(),
            Side::FromEnd { lo, hi } if lo == hi => {
                format!("{} before the month's last day", days(lo))
            }
            Side::FromStart { lo: 1, hi: 1 } => "on the month's first day".to_string(),
            Side::FromStart { lo, hi } if lo == hi => format!("on day {lo} of the month"),
            Side::FromEnd { lo: 0, hi } => {
                format!("on the month's last day or up to {} before it", days(hi))
            }
            Side::FromEnd { lo, hi } => format!("{lo} to {} before the month's last day", days(hi)),
            Side::FromStart { lo: 1, hi } => {
                format!(
                    "on the month's first day or up to {} after it",
                    days(hi - 1)
                )
            }
            Side::FromStart { lo, hi } => format!("on days {lo} to {hi} of the month"),
        }
    }
}

/// The dates (day numbers, one per row; `series` each row's item key in a long table) read as
/// one a month on nearby days, if they are so (see the module doc).
pub(crate) fn one_a_month(
    days: &[Option<i64>],
    series: Option<&[Option<String>]>,
) -> Option<OneAMonth> {
    let distinct: BTreeSet<i64> = sorting::set_of(days.iter().flatten().copied());
    let (from_end, lo) = best_window(&distinct)?;
    let place = |d: i64| place_in_month(d, from_end);
    let in_window = |d: i64| (lo..=lo + MONTH_DAY_SPREAD).contains(&place(d));
    // The day the window's dates fall on most (the nearer the edge among equals).
    let mut tally: BTreeMap<u32, usize> = BTreeMap::new();
    for d in distinct.iter().filter(|d| in_window(**d)) {
        *tally.entry(place(*d)).or_default() += 1;
    }
    let usual = tally
        .iter()
        .max_by_key(|(at, n)| (**n, std::cmp::Reverse(**at)))
        .map(|(at, _)| *at)?;
    // One anchor per item and month: the date nearest the usual day (the later of equals);
    // another in the same month (a correction dated the 27th) is off the pattern.
    let month = |d: i64| date_period(d, Frequency::Monthly).ordinal();
    let mut chosen: BTreeMap<(Option<&str>, i64), i64> = BTreeMap::new();
    for (i, d) in days.iter().enumerate() {
        let Some(d) = d.filter(|d| in_window(*d)) else {
            continue;
        };
        let key = series.and_then(|s| s.get(i)).and_then(|k| k.as_deref());
        let distance = |d: i64| (place(d).abs_diff(usual), std::cmp::Reverse(d));
        chosen
            .entry((key, month(d)))
            .and_modify(|kept| {
                if distance(d) < distance(*kept) {
                    *kept = d;
                }
            })
            .or_insert(d);
    }
    let anchors: Vec<i64> = sorting::set_of(chosen.values().copied())
        .into_iter()
        .collect();
    let off: Vec<i64> = distinct
        .iter()
        .copied()
        .filter(|d| anchors.binary_search(d).is_err())
        .collect();
    let allowed = match anchors.len() {
        0..=4 => 0,
        5..=19 => 1,
        n => n / 10,
    };
    if anchors.len() < 4 || off.len() > allowed {
        return None;
    }
    let (lo_seen, hi) = anchors
        .iter()
        .map(|d| place(*d))
        .fold((u32::MAX, 0), |(a, b), v| (a.min(v), b.max(v)));
    let side = if from_end {
        Side::FromEnd { lo: lo_seen, hi }
    } else {
        Side::FromStart { lo: lo_seen, hi }
    };
    let (first, last) = (anchors[0], anchors[anchors.len() - 1]);
    let sparse_weeks = (anchors.len() as i64) * 2 < (last - first) / 7 + 1;
    if infer_frequency(&anchors) == Frequency::Weekly && !sparse_weeks {
        return None;
    }
    let mut months: Vec<i64> = sorting::set_of(anchors.iter().map(|d| month(*d)))
        .into_iter()
        .collect();
    let mut step = months.windows(2).fold(0, |g, w| gcd(g, w[1] - w[0]));
    // Quarter or year ends but for a date or so a month or two off (a quarter's total filed
    // late): those are set apart, the step taken from the rest.
    let mut misplaced = Vec::new();
    if step % 3 != 0 && anchors.len() >= 5 {
        for modulus in [12, 3] {
            let mut residues: BTreeMap<i64, usize> = BTreeMap::new();
            for m in &months {
                *residues.entry(m.rem_euclid(modulus)).or_default() += 1;
            }
            let Some((&usual, &count)) = residues.iter().max_by_key(|(_, n)| **n) else {
                continue;
            };
            let stray = months.len() - count;
            if count >= 4 && stray >= 1 && stray <= (months.len() / 10).max(1) {
                misplaced = anchors
                    .iter()
                    .copied()
                    .filter(|d| month(*d).rem_euclid(modulus) != usual)
                    .collect();
                months.retain(|m| m.rem_euclid(modulus) == usual);
                step = months.windows(2).fold(0, |g, w| gcd(g, w[1] - w[0]));
                break;
            }
        }
    }
    if step == 0 {
        return None;
    }
    let spanned = (months[months.len() - 1] - months[0]) / step + 1;
    if (months.len() as i64) * 3 < spanned && anchors.len() < 6 {
        return None;
    }
    let frequency = if step % 12 == 0 {
        Frequency::Yearly
    } else if step % 3 == 0 {
        Frequency::Quarterly
    } else {
        Frequency::Monthly
    };
    Some(OneAMonth {
        frequency,
        side,
        off,
        misplaced,
    })
}

/// A date's place in its month: days before its last day (0 = the last), or its day (1 = the
/// first).
fn place_in_month(d: i64, from_end: bool) -> u32 {
    let (y, m, day) = civil_from_days(d);
    if from_end {
        days_in_month(y, m) - day
    } else {
        day
    }
}

/// The window of [`MONTH_DAY_SPREAD`] + 1 days, counted from the month's end (`true`) or
/// from its start, holding the most dates (the nearer edge where equal; a tie counted from
/// the end), with its first day so counted.
fn best_window(distinct: &BTreeSet<i64>) -> Option<(bool, u32)> {
    // For each edge, the start of the fullest window (the lowest start among equals), from
    // a tally of the days (a month has at most 31: linear in the dates, which a daily file
    // of a century has 36,500 of).
    let fullest = |place: &dyn Fn(i64) -> u32| {
        let mut tally = [0usize; 32];
        for d in distinct {
            tally[place(*d).min(31) as usize] += 1;
        }
        (0..32u32)
            .filter(|lo| tally[*lo as usize] > 0)
            .map(|lo| {
                let top = (lo + MONTH_DAY_SPREAD).min(31);
                let held: usize = tally[lo as usize..=top as usize].iter().sum();
                (held, std::cmp::Reverse(lo))
            })
            .max()
            .map(|(held, lo)| (held, lo.0))
    };
    let (start_held, start_lo) = fullest(&|d| place_in_month(d, false))?;
    let (end_held, end_lo) = fullest(&|d| place_in_month(d, true))?;
    if start_held > end_held || (start_held == end_held && start_lo - 1 < end_lo) {
        Some((false, start_lo))
    } else {
        Some((true, end_lo))
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::calendar::days_from_civil;

    fn days(dates: &[(i32, u32, u32)]) -> Vec<Option<i64>> {
        dates
            .iter()
            .map(|&(y, m, d)| Some(days_from_civil(y, m, d)))
            .collect()
    }

    /// `dates` (one item) against the frequency and side found, or `None`.
    fn check(dates: &[(i32, u32, u32)], expected: Option<(Frequency, Side)>) {
        let got = one_a_month(&days(dates), None).map(|found| (found.frequency, found.side));
        assert_eq!(got, expected, "{dates:?}");
    }

    #[test]
    fn dates_one_a_month_on_nearby_days() {
        // Last business days of 2024 (Easter: Friday 29 March and Monday 1 April).
        check(
            &[
                (2024, 1, 31),
                (2024, 2, 29),
                (2024, 3, 28),
                (2024, 4, 30),
                (2024, 5, 31),
                (2024, 6, 28),
            ],
            Some((Frequency::Monthly, Side::FromEnd { lo: 0, hi: 3 })),
        );
        // First business days; quarter ends on working days.
        check(
            &[
                (2024, 1, 2),
                (2024, 2, 1),
                (2024, 3, 1),
                (2024, 4, 2),
                (2024, 5, 1),
            ],
            Some((Frequency::Monthly, Side::FromStart { lo: 1, hi: 2 })),
        );
        check(
            &[(2023, 9, 29), (2023, 12, 29), (2024, 3, 28), (2024, 6, 28)],
            Some((Frequency::Quarterly, Side::FromEnd { lo: 1, hi: 3 })),
        );
        // The month's first Friday: weekly by its steps, but in 4 of 14 weeks.
        check(
            &[(2024, 1, 5), (2024, 2, 2), (2024, 3, 1), (2024, 4, 5)],
            Some((Frequency::Monthly, Side::FromStart { lo: 1, hi: 5 })),
        );
        // June and July of three years: 6 anchors, though in 6 of 26 months.
        check(
            &[
                (2021, 6, 30),
                (2021, 7, 30),
                (2022, 6, 30),
                (2022, 7, 29),
                (2023, 6, 30),
                (2023, 7, 31),
            ],
            Some((Frequency::Monthly, Side::FromEnd { lo: 0, hi: 2 })),
        );
        // Not so: two dates in a month, one of them off beside 4 anchors; days too far apart;
        // too few; fewer than a third of the months from 4; weekly in most weeks.
        check(
            &[
                (2024, 1, 30),
                (2024, 1, 31),
                (2024, 2, 29),
                (2024, 3, 28),
                (2024, 4, 30),
            ],
            None,
        );
        check(
            &[(2024, 1, 31), (2024, 2, 20), (2024, 3, 28), (2024, 4, 30)],
            None,
        );
        check(&[(2024, 1, 31), (2024, 2, 29), (2024, 3, 28)], None);
        check(
            &[(2024, 1, 31), (2024, 2, 29), (2024, 10, 31), (2025, 3, 31)],
            None,
        );
        let fortnights: Vec<(i32, u32, u32)> = (0..8)
            .map(|i| civil_from_days(days_from_civil(2024, 1, 5) + 14 * i))
            .collect();
        check(&fortnights, None);
        assert_eq!(
            Side::FromEnd { lo: 0, hi: 1 }.describe(),
            "on the month's last day or up to 1 day before it"
        );
        assert_eq!(
            Side::FromEnd { lo: 0, hi: 0 }.describe(),
            "on the month's last day"
        );
        assert_eq!(
            Side::FromStart { lo: 1, hi: 1 }.describe(),
            "on the month's first day"
        );
    }

    // Quarter ends with the first quarter of 2022 filed on 29 April: quarterly, that date set
    // apart.
    #[test]
    fn a_quarter_filed_a_month_late_is_set_apart() {
        let dates = [
            (2021, 3, 31),
            (2021, 6, 30),
            (2021, 9, 30),
            (2021, 12, 31),
            (2022, 4, 29),
            (2022, 6, 30),
            (2022, 9, 30),
            (2022, 12, 30),
            (2023, 3, 31),
            (2023, 6, 30),
        ];
        let found = one_a_month(&days(&dates), None).unwrap();
        assert_eq!(found.frequency, Frequency::Quarterly);
        assert_eq!(found.misplaced, vec![days_from_civil(2022, 4, 29)]);
        assert!(found.off.is_empty());
    }

    // A correction dated the 27th among twelve month ends is read into December, said; two
    // stores closing their months on the 28th and the 30th are one a month each.
    #[test]
    fn a_date_off_the_pattern_and_stores_of_their_own() {
        let mut dates: Vec<(i32, u32, u32)> = (1..=12)
            .map(|m| (2023, m, days_in_month(2023, m)))
            .collect();
        dates.push((2023, 12, 27));
        let found = one_a_month(&days(&dates), None).unwrap();
        assert_eq!(found.frequency, Frequency::Monthly);
        assert_eq!(found.off, vec![days_from_civil(2023, 12, 27)]);
        // Two such dates among 12 are too many.
        dates.push((2023, 6, 14));
        assert_eq!(one_a_month(&days(&dates), None), None);
        let mut rows = Vec::new();
        let mut keys = Vec::new();
        for m in 1..=6 {
            rows.push((2024, m, 28));
            keys.push(Some("north".to_string()));
            rows.push((2024, m, days_in_month(2024, m).min(30)));
            keys.push(Some("harbour".to_string()));
        }
        let found = one_a_month(&days(&rows), Some(&keys)).unwrap();
        assert_eq!(found.frequency, Frequency::Monthly);
        assert!(found.off.is_empty());
        // The same dates as one item: two in a month.
        assert_eq!(one_a_month(&days(&rows), None), None);
    }
}
