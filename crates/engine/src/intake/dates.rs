//! Dates as day numbers: a two-way date read one way or the other, the frequency a set of
//! dates implies, and the period of a frequency that holds a date.
//!
//! Kept apart from: reading cells ([`super::label`]) and deciding a column's date order
//! ([`super::order`]) or its periods ([`super::period`]); both of those use these helpers, so
//! they live here, below both.
//!
//! Frequency from dates (distinct dates, sorted):
//! - all on the same day of the month, or all on month ends: months apart; the greatest common
//!   divisor g of the month steps gives yearly (g a multiple of 12), quarterly (of 3) or monthly;
//! - otherwise all day steps multiples of 7: weekly (each date names the Monday-to-Sunday week
//!   that holds it, so week-start and week-end dates both work);
//! - otherwise daily. A single date is monthly when it is a first or last of the month.
//!
//! Dates one a month on nearby days (a month's last business day) are daily by that rule;
//! [`one_a_month`] finds them, for the period reader to read them as months and say so.

use super::label::Label;
use crate::calendar::{
    civil_from_days, days_from_civil, days_in_month, is_valid_date, Frequency, Period,
};

/// The day number of a two-way date (`a/b/year`) read day-first or month-first; `None` when
/// that reading is no date.
pub(crate) fn two_way_days(label: Label, day_first: bool) -> Option<i64> {
    let Label::TwoWay { a, b, year } = label else {
        return None;
    };
    let (month, day) = if day_first { (b, a) } else { (a, b) };
    is_valid_date(year, month, day).then(|| days_from_civil(year, month, day))
}

/// The frequency implied by a set of dates (day numbers); see the module doc.
pub(crate) fn infer_frequency(days: &[i64]) -> Frequency {
    let mut distinct = days.to_vec();
    distinct.sort_unstable();
    distinct.dedup();
    let civil: Vec<(i32, u32, u32)> = distinct.iter().map(|d| civil_from_days(*d)).collect();
    let Some(&(_, _, first_day)) = civil.first() else {
        return Frequency::Daily;
    };
    let month_end = |&(y, m, d): &(i32, u32, u32)| d == days_in_month(y, m);
    let same_day = civil.iter().all(|c| c.2 == first_day);
    let all_ends = civil.iter().all(month_end);
    if civil.len() == 1 {
        return if first_day == 1 || all_ends {
            Frequency::Monthly
        } else {
            Frequency::Daily
        };
    }
    if same_day || all_ends {
        let months: Vec<i64> = civil
            .iter()
            .map(|&(y, m, _)| i64::from(y) * 12 + i64::from(m))
            .collect();
        let step = months.windows(2).fold(0, |g, w| gcd(g, w[1] - w[0]));
        return if step % 12 == 0 {
            Frequency::Yearly
        } else if step % 3 == 0 {
            Frequency::Quarterly
        } else {
            Frequency::Monthly
        };
    }
    let step = distinct.windows(2).fold(0, |g, w| gcd(g, w[1] - w[0]));
    if step % 7 == 0 {
        Frequency::Weekly
    } else {
        Frequency::Daily
    }
}

fn gcd(a: i64, b: i64) -> i64 {
    if b == 0 {
        a.abs()
    } else {
        gcd(b, a % b)
    }
}

/// How far apart, in days, the dates of [`one_a_month`] may fall within their months: a
/// month's last business day is up to 3 days before its end (a weekend, or Easter's Friday
/// and Monday), its first up to 3 days after its start, and the month's last (or first)
/// Friday up to 6.
pub(crate) const MONTH_DAY_SPREAD: u32 = 6;

/// Dates one a month on nearby days, each standing for its month (or quarter, or year): the
/// frequency their months imply, as for dates on one day of the month, with the days they
/// fall on (`Some` only where [`infer_frequency`] would read them as daily). Monthly totals
/// dated on a working day (the last business day, the 28th to the 31st) are so. Asked of
/// the distinct dates: at least 4, no two in one month, all within [`MONTH_DAY_SPREAD`] days
/// of each other counted from the month's start or from its end, read as daily by their
/// steps, or as weekly but in fewer than half the weeks from the first to the last (monthly
/// totals dated on the month's last Friday), and covering at least a third of the months (or
/// quarters, or years) from the first to the last (a kiosk open four months a year): a daily
/// item sold now and then is not so.
pub(crate) fn one_a_month(days: &[i64]) -> Option<(Frequency, OneAMonth)> {
    let mut distinct = days.to_vec();
    distinct.sort_unstable();
    distinct.dedup();
    let (&first_day, &last_day) = (distinct.first()?, distinct.last()?);
    let sparse_weeks = (distinct.len() as i64) * 2 < (last_day - first_day) / 7 + 1;
    let by_steps = infer_frequency(&distinct);
    if distinct.len() < 4
        || !(by_steps == Frequency::Daily || (by_steps == Frequency::Weekly && sparse_weeks))
    {
        return None;
    }
    let civil: Vec<(i32, u32, u32)> = distinct.iter().map(|d| civil_from_days(*d)).collect();
    let months: Vec<i64> = civil
        .iter()
        .map(|&(y, m, _)| i64::from(y) * 12 + i64::from(m))
        .collect();
    if months.windows(2).any(|w| w[0] == w[1]) {
        return None;
    }
    let spread = |of: &dyn Fn(&(i32, u32, u32)) -> u32| {
        let (lo, hi) = civil
            .iter()
            .map(of)
            .fold((u32::MAX, 0), |(lo, hi), v| (lo.min(v), hi.max(v)));
        (hi - lo <= MONTH_DAY_SPREAD).then_some((lo, hi))
    };
    let from_start = spread(&|&(_, _, d)| d);
    let from_end = spread(&|&(y, m, d)| days_in_month(y, m) - d);
    // The edge nearer the dates names the days (first business days are also 28 to 30 days
    // before the month's end); a tie is counted from the end.
    let side = match (from_start, from_end) {
        (Some((lo, hi)), Some((e_lo, _))) if lo - 1 < e_lo => OneAMonth::FromStart { lo, hi },
        (_, Some((lo, hi))) => OneAMonth::FromEnd { lo, hi },
        (Some((lo, hi)), None) => OneAMonth::FromStart { lo, hi },
        (None, None) => return None,
    };
    let step = months.windows(2).fold(0, |g, w| gcd(g, w[1] - w[0]));
    let (Some(first), Some(last)) = (months.first(), months.last()) else {
        return None;
    };
    let spanned = (last - first) / step + 1;
    if (months.len() as i64) * 3 < spanned {
        return None;
    }
    let frequency = if step % 12 == 0 {
        Frequency::Yearly
    } else if step % 3 == 0 {
        Frequency::Quarterly
    } else {
        Frequency::Monthly
    };
    Some((frequency, side))
}

/// Where in their months the dates of [`one_a_month`] fall: days `lo` to `hi` counted from the
/// month's first day (1 = the first) or from its last (0 = the last day).
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum OneAMonth {
    FromStart { lo: u32, hi: u32 },
    FromEnd { lo: u32, hi: u32 },
}

impl OneAMonth {
    /// The days in words, for the warning that reads them as months.
    pub(crate) fn describe(self) -> String {
        let days = |n: u32| {
            if n == 1 {
                "1 day".to_string()
            } else {
                format!("{n} days")
            }
        };
        match self {
            OneAMonth::FromEnd { lo: 0, hi } => {
                format!("on the month's last day or up to {} before it", days(hi))
            }
            OneAMonth::FromEnd { lo, hi } => {
                format!("{lo} to {} before the month's last day", days(hi))
            }
            OneAMonth::FromStart { lo: 1, hi } => {
                format!(
                    "on the month's first day or up to {} after it",
                    days(hi - 1)
                )
            }
            OneAMonth::FromStart { lo, hi } => format!("on days {lo} to {hi} of the month"),
        }
    }
}

/// The period of `frequency` that holds the date.
pub(crate) fn date_period(days: i64, frequency: Frequency) -> Period {
    let (y, m, d) = civil_from_days(days);
    match frequency {
        Frequency::Weekly => Period::week_containing(y, m, d),
        Frequency::Monthly => Period::month(y, m),
        Frequency::Quarterly => Period::quarter(y, (m - 1) / 3 + 1),
        Frequency::Yearly => Period::year(y),
        Frequency::Daily | Frequency::Undated => Period::day(y, m, d),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn days(dates: &[(i32, u32, u32)]) -> Vec<i64> {
        dates
            .iter()
            .map(|&(y, m, d)| days_from_civil(y, m, d))
            .collect()
    }

    #[test]
    fn frequencies_from_dates() {
        let f = |d: &[(i32, u32, u32)]| infer_frequency(&days(d));
        assert_eq!(
            f(&[(2024, 1, 15), (2024, 2, 15), (2024, 4, 15)]),
            Frequency::Monthly
        );
        assert_eq!(
            f(&[(2024, 1, 31), (2024, 2, 29), (2024, 3, 31)]),
            Frequency::Monthly
        );
        assert_eq!(
            f(&[(2024, 1, 1), (2024, 4, 1), (2024, 10, 1)]),
            Frequency::Quarterly
        );
        assert_eq!(f(&[(2022, 6, 30), (2023, 6, 30)]), Frequency::Yearly);
        assert_eq!(
            f(&[(2024, 1, 7), (2024, 1, 14), (2024, 1, 28)]),
            Frequency::Weekly
        );
        assert_eq!(
            f(&[(2024, 1, 7), (2024, 1, 8), (2024, 1, 10)]),
            Frequency::Daily
        );
        assert_eq!(f(&[(2024, 1, 1)]), Frequency::Monthly);
        assert_eq!(f(&[(2024, 1, 9)]), Frequency::Daily);
    }

    #[test]
    fn dates_one_a_month_on_nearby_days() {
        let check = |dates: &[(i32, u32, u32)], expected: Option<(Frequency, OneAMonth)>| {
            assert_eq!(one_a_month(&days(dates)), expected, "{dates:?}");
        };
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
            Some((Frequency::Monthly, OneAMonth::FromEnd { lo: 0, hi: 3 })),
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
            Some((Frequency::Monthly, OneAMonth::FromStart { lo: 1, hi: 2 })),
        );
        check(
            &[(2023, 9, 29), (2023, 12, 29), (2024, 3, 28), (2024, 6, 28)],
            Some((Frequency::Quarterly, OneAMonth::FromEnd { lo: 1, hi: 3 })),
        );
        // The month's first Friday: weekly by its steps, but in 4 of 14 weeks.
        check(
            &[(2024, 1, 5), (2024, 2, 2), (2024, 3, 1), (2024, 4, 5)],
            Some((Frequency::Monthly, OneAMonth::FromStart { lo: 1, hi: 5 })),
        );
        // Not so: two dates in a month; days too far apart; too few; fewer than a third of
        // the months; weekly in most weeks (every other Friday, eight times: 8 of 15 weeks).
        check(
            &[(2024, 1, 30), (2024, 1, 31), (2024, 2, 29), (2024, 3, 28)],
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
            OneAMonth::FromEnd { lo: 0, hi: 1 }.describe(),
            "on the month's last day or up to 1 day before it"
        );
    }
}
