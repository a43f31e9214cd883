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
//! [`super::month_days`] finds them, for the period reader to read them as months and say so.

use super::label::Label;
use crate::calendar::{
    civil_from_days, days_from_civil, days_in_month, is_valid_date, Frequency, Period,
};
use crate::sorting;

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
    sorting::sort(&mut distinct);
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

/// The greatest common divisor (of steps between dates or months).
pub(crate) fn gcd(a: i64, b: i64) -> i64 {
    if b == 0 {
        a.abs()
    } else {
        gcd(b, a % b)
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
}
