//! Lead times and review periods written in days, weeks, months, quarters or years ("Lead time
//! (days)" over 14, or "2 weeks" in a cell), turned into the history's periods.
//!
//! Kept apart from: reading the stock table's cells (`stock_table`, which asks here for a
//! cell's unit and its count of periods) and from the Stock plan, which knows only whole
//! periods.
//!
//! Rules (our choices, said in the stock table's warnings):
//! - Within days and weeks, and within months, quarters and years, the conversion is exact:
//!   a week is 7 days, a quarter 3 months, a year 12 months. A lead time or review period must
//!   come out whole (21 days on weekly data is 3 weeks; 10 days is an error saying 1.43 weeks).
//! - Across them a month is 365.25 / 12 = 30.4375 days (the Gregorian calendar's mean, common
//!   practice). A whole count within 2 % of the result is taken ("30 days" and "90 days" as 1
//!   and 3 months, "13 weeks" as a quarter), said in a warning; else an error naming the
//!   nearest whole periods. A lead time's spread is any number, so it is converted as it is.
//! - An undated history's periods have no length: a unit there is an error.

use crate::calendar::Frequency;

/// A unit of time a lead time, its spread or a review period may be written in.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum TimeUnit {
    Day,
    Week,
    Month,
    Quarter,
    Year,
}

/// Days in a month on average over the Gregorian calendar's 400-year cycle.
const DAYS_PER_MONTH: f64 = 365.25 / 12.0;

/// How far a count across days and months may be from a whole number of periods and still be
/// taken as it (relative): 30 days is 0.986 of a month.
const ACROSS_TOLERANCE: f64 = 0.02;

impl TimeUnit {
    /// The unit a word names, without case: "days", "wk", "mths", "qtr", "yrs", ...
    pub(crate) fn from_word(word: &str) -> Option<TimeUnit> {
        let w = word.trim().trim_end_matches('.').to_lowercase();
        let unit = match w.as_str() {
            "d" | "day" | "days" | "dys" | "calendarday" | "calendardays" => TimeUnit::Day,
            "w" | "wk" | "wks" | "week" | "weeks" => TimeUnit::Week,
            "mo" | "mos" | "mth" | "mths" | "month" | "months" => TimeUnit::Month,
            "q" | "qtr" | "qtrs" | "quarter" | "quarters" => TimeUnit::Quarter,
            "y" | "yr" | "yrs" | "year" | "years" => TimeUnit::Year,
            _ => return None,
        };
        Some(unit)
    }

    /// The unit's name for `count` of it.
    pub(crate) fn name(self, count: f64) -> &'static str {
        let frequency = match self {
            TimeUnit::Day => Frequency::Daily,
            TimeUnit::Week => Frequency::Weekly,
            TimeUnit::Month => Frequency::Monthly,
            TimeUnit::Quarter => Frequency::Quarterly,
            TimeUnit::Year => Frequency::Yearly,
        };
        let (one, many) = frequency.period_words();
        if count == 1.0 {
            one
        } else {
            many
        }
    }

    /// The unit's length: in days for days and weeks, in months for the rest.
    fn length(self) -> Length {
        match self {
            TimeUnit::Day => Length::Days(1.0),
            TimeUnit::Week => Length::Days(7.0),
            TimeUnit::Month => Length::Months(1.0),
            TimeUnit::Quarter => Length::Months(3.0),
            TimeUnit::Year => Length::Months(12.0),
        }
    }

    /// The unit of one period of a history of `frequency` (none for an undated one).
    pub(crate) fn of_period(frequency: Frequency) -> Option<TimeUnit> {
        match frequency {
            Frequency::Daily => Some(TimeUnit::Day),
            Frequency::Weekly => Some(TimeUnit::Week),
            Frequency::Monthly => Some(TimeUnit::Month),
            Frequency::Quarterly => Some(TimeUnit::Quarter),
            Frequency::Yearly => Some(TimeUnit::Year),
            Frequency::Undated => None,
        }
    }
}

#[derive(Clone, Copy)]
enum Length {
    Days(f64),
    Months(f64),
}

impl Length {
    fn in_days(self) -> f64 {
        match self {
            Length::Days(d) => d,
            Length::Months(m) => m * DAYS_PER_MONTH,
        }
    }

    fn same_kind(self, other: Length) -> bool {
        matches!(
            (self, other),
            (Length::Days(_), Length::Days(_)) | (Length::Months(_), Length::Months(_))
        )
    }
}

/// A count of `unit` as periods of a history of `frequency`.
#[derive(Clone, Copy, Debug, PartialEq)]
pub(crate) struct Converted {
    /// The periods (whole where asked for).
    pub periods: f64,
    /// Whether the conversion went across days and months, with the mean month's length.
    pub approximate: bool,
}

/// `count` of `unit` in periods of `frequency`; `whole` asks for a whole number of periods.
/// The error says what the count is in periods and what to write.
pub(crate) fn to_periods(
    count: f64,
    unit: TimeUnit,
    frequency: Frequency,
    whole: bool,
) -> Result<Converted, String> {
    let Some(period) = TimeUnit::of_period(frequency) else {
        return Err(format!(
            "the history's periods have no calendar length, so {count} {} cannot be turned into \
             them: write the number of periods",
            unit.name(count)
        ));
    };
    let (from, to) = (unit.length(), period.length());
    let exact = from.same_kind(to);
    // Within days and weeks, or within months, quarters and years, the mean month cancels
    // exactly (30.4375 days is 487 / 16, so its small multiples are exact in binary).
    let periods = count * (from.in_days() / to.in_days());
    if !whole {
        return Ok(Converted {
            periods,
            approximate: !exact,
        });
    }
    let nearest = periods.round();
    let close = if exact || periods == 0.0 {
        (periods - nearest).abs() < 1e-9
    } else {
        nearest >= 1.0 && ((periods - nearest) / nearest).abs() <= ACROSS_TOLERANCE
    };
    if close {
        return Ok(Converted {
            periods: nearest,
            approximate: !exact && nearest != 0.0,
        });
    }
    let (below, above) = (periods.floor(), periods.ceil());
    Err(format!(
        "{count} {} is {:.2} {}, the history's periods, and the Stock plan counts whole \
         periods: write {below} or {above} ({})",
        unit.name(count),
        periods,
        period.name(periods),
        period.name(2.0),
    ))
}

/// A cell such as "14 days", "2 wks" or "3mo": its number text and unit.
pub(crate) fn split_unit(cell: &str) -> Option<(&str, TimeUnit)> {
    let t = cell.trim();
    let start = t
        .char_indices()
        .rev()
        .take_while(|(_, c)| c.is_alphabetic() || *c == '.')
        .last()
        .map(|(i, _)| i)?;
    let (number, word) = t.split_at(start);
    if number.trim().is_empty() {
        return None;
    }
    TimeUnit::from_word(word).map(|u| (number.trim(), u))
}

#[cfg(test)]
mod tests {
    use super::*;

    fn check(count: f64, unit: TimeUnit, frequency: Frequency, whole: bool, expected: &str) {
        let got = match to_periods(count, unit, frequency, whole) {
            Ok(c) => format!(
                "{}{}",
                c.periods,
                if c.approximate { " approx" } else { "" }
            ),
            Err(e) => format!("error: {e}"),
        };
        assert!(
            got == expected || (expected.starts_with("error") && got.starts_with(expected)),
            "{count} {unit:?} in {frequency:?}: {got}"
        );
    }

    #[test]
    fn conversions() {
        use Frequency::*;
        use TimeUnit::*;
        check(21.0, Day, Weekly, true, "3");
        check(2.0, Week, Daily, true, "14");
        check(6.0, Month, Quarterly, true, "2");
        check(2.0, Year, Monthly, true, "24");
        check(2.0, Month, Monthly, true, "2");
        check(10.0, Day, Weekly, true, "error: 10 days is 1.43 weeks");
        check(30.0, Day, Monthly, true, "1 approx");
        check(90.0, Day, Monthly, true, "3 approx");
        check(13.0, Week, Quarterly, true, "1 approx");
        check(4.0, Week, Monthly, true, "error: 4 weeks is 0.92 months");
        check(1.0, Month, Weekly, true, "error: 1 month is 4.35 weeks");
        check(14.0, Day, Monthly, true, "error: 14 days is 0.46 months");
        check(0.0, Day, Monthly, true, "0");
        check(0.0, Day, Weekly, true, "0");
        check(3.5, Day, Weekly, false, "0.5");
        check(
            1.0,
            Day,
            Undated,
            true,
            "error: the history's periods have no calendar length",
        );
    }

    #[test]
    fn cells_with_units() {
        assert_eq!(split_unit("14 days"), Some(("14", TimeUnit::Day)));
        assert_eq!(split_unit("2wks"), Some(("2", TimeUnit::Week)));
        assert_eq!(split_unit(" 1,5 mths. "), Some(("1,5", TimeUnit::Month)));
        assert_eq!(split_unit("days"), None);
        assert_eq!(split_unit("12"), None);
        assert_eq!(split_unit("12 kg"), None);
        assert_eq!(split_unit("2-3 weeks"), Some(("2-3", TimeUnit::Week)));
    }
}
