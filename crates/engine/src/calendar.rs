//! Calendar arithmetic: civil dates to day numbers and back, ISO weeks, and the [`Period`] type
//! that places one observation on the time axis of its [`Frequency`].
//!
//! Kept apart from: parsing (that is [`crate::intake`]). Dates are plain proleptic
//! Gregorian; there are no time zones or clocks, so the engine behaves the same on every machine.
//!
//! Day numbers use the algorithm of H. Hinnant, "chrono-Compatible Low-Level Date Algorithms"
//! (public domain): day 0 is 1970-01-01.

use std::fmt;

/// How often a series is observed.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Frequency {
    /// One observation a day.
    Daily,
    /// One a week (ISO weeks, Monday to Sunday).
    Weekly,
    /// One a month.
    Monthly,
    /// One a quarter.
    Quarterly,
    /// One a year.
    Yearly,
    /// Plain positions 1, 2, 3, ... with no calendar meaning.
    Undated,
}

impl Frequency {
    /// The name used in reports and JSON: `daily|weekly|monthly|quarterly|yearly|none`.
    pub fn as_str(self) -> &'static str {
        match self {
            Frequency::Daily => "daily",
            Frequency::Weekly => "weekly",
            Frequency::Monthly => "monthly",
            Frequency::Quarterly => "quarterly",
            Frequency::Yearly => "yearly",
            Frequency::Undated => "none",
        }
    }

    /// The season length the calendar suggests (7 daily, 52 weekly, 12 monthly, 4 quarterly);
    /// `None` when the calendar suggests none.
    pub fn natural_season(self) -> Option<usize> {
        match self {
            Frequency::Daily => Some(7),
            Frequency::Weekly => Some(52),
            Frequency::Monthly => Some(12),
            Frequency::Quarterly => Some(4),
            Frequency::Yearly | Frequency::Undated => None,
        }
    }

    /// What one period is called in words, singular and plural: ("month", "months"); for
    /// undated data ("period", "periods").
    pub fn period_words(self) -> (&'static str, &'static str) {
        match self {
            Frequency::Daily => ("day", "days"),
            Frequency::Weekly => ("week", "weeks"),
            Frequency::Monthly => ("month", "months"),
            Frequency::Quarterly => ("quarter", "quarters"),
            Frequency::Yearly => ("year", "years"),
            Frequency::Undated => ("period", "periods"),
        }
    }

    /// `n` periods in words: "1 month", "3 weeks".
    pub fn periods(self, n: usize) -> String {
        let (one, many) = self.period_words();
        format!("{n} {}", if n == 1 { one } else { many })
    }
}

impl fmt::Display for Frequency {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.as_str())
    }
}

/// Days since 1970-01-01 of a proleptic Gregorian date. `month` 1..=12, `day` 1..=31.
pub fn days_from_civil(year: i32, month: u32, day: u32) -> i64 {
    let y = i64::from(year) - i64::from(month <= 2);
    let era = y.div_euclid(400);
    let yoe = y - era * 400;
    let m = i64::from(month);
    let mp = (m + 9) % 12;
    let doy = (153 * mp + 2) / 5 + i64::from(day) - 1;
    let doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    era * 146_097 + doe - 719_468
}

/// The civil date (year, month, day) of a day number (days since 1970-01-01).
pub fn civil_from_days(days: i64) -> (i32, u32, u32) {
    let z = days + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z - era * 146_097;
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let day = (doy - (153 * mp + 2) / 5 + 1) as u32;
    let month = if mp < 10 { mp + 3 } else { mp - 9 } as u32;
    let year = (yoe + era * 400 + i64::from(month <= 2)) as i32;
    (year, month, day)
}

/// Whether `year`-`month`-`day` is a real calendar date.
pub fn is_valid_date(year: i32, month: u32, day: u32) -> bool {
    if !(1..=12).contains(&month) || day == 0 {
        return false;
    }
    day <= days_in_month(year, month)
}

/// Number of days in a month of the proleptic Gregorian calendar.
pub fn days_in_month(year: i32, month: u32) -> u32 {
    match month {
        1 | 3 | 5 | 7 | 8 | 10 | 12 => 31,
        4 | 6 | 9 | 11 => 30,
        _ => {
            let leap = (year % 4 == 0 && year % 100 != 0) || year % 400 == 0;
            if leap {
                29
            } else {
                28
            }
        }
    }
}

/// Day of the week, Monday = 0 ... Sunday = 6.
pub fn weekday(days: i64) -> u32 {
    // 1970-01-01 was a Thursday (3).
    ((days + 3).rem_euclid(7)) as u32
}

/// ISO 8601 week-numbering year and week (1..=53) of a day number.
pub fn iso_week(days: i64) -> (i32, u32) {
    let thursday = days - i64::from(weekday(days)) + 3;
    let (year, _, _) = civil_from_days(thursday);
    let first_thursday_week_monday = iso_week_monday(year, 1);
    let week = (thursday - 3 - first_thursday_week_monday) / 7 + 1;
    (year, week as u32)
}

/// Day number of the Monday that starts ISO week `week` of ISO year `year`.
pub fn iso_week_monday(year: i32, week: u32) -> i64 {
    let jan4 = days_from_civil(year, 1, 4);
    let monday_week1 = jan4 - i64::from(weekday(jan4));
    monday_week1 + 7 * (i64::from(week) - 1)
}

/// Number of ISO weeks (52 or 53) in ISO year `year`.
pub fn iso_weeks_in_year(year: i32) -> u32 {
    let (_, week) = iso_week(days_from_civil(year, 12, 28));
    week
}

/// One period on the time axis of a frequency, stored as a whole-number position so that
/// consecutive periods differ by one.
///
/// Invariant: `ordinal` counts days (daily), Monday-based weeks since the Monday 1969-12-29
/// (weekly), months since year 0 (monthly), quarters since year 0 (quarterly), years (yearly) or
/// positions starting at 1 (undated).
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Period {
    frequency: Frequency,
    ordinal: i64,
}

/// Day number of Monday 1969-12-29, the origin of weekly ordinals.
const WEEK_ORIGIN_MONDAY: i64 = -3;

impl Period {
    /// A day.
    pub fn day(year: i32, month: u32, day: u32) -> Period {
        Period {
            frequency: Frequency::Daily,
            ordinal: days_from_civil(year, month, day),
        }
    }
    /// The week (Monday to Sunday) that contains the given date.
    pub fn week_containing(year: i32, month: u32, day: u32) -> Period {
        let days = days_from_civil(year, month, day);
        Period {
            frequency: Frequency::Weekly,
            ordinal: (days - WEEK_ORIGIN_MONDAY).div_euclid(7),
        }
    }
    /// ISO week `week` of ISO year `year`.
    pub fn iso_week(year: i32, week: u32) -> Period {
        let monday = iso_week_monday(year, week);
        Period {
            frequency: Frequency::Weekly,
            ordinal: (monday - WEEK_ORIGIN_MONDAY).div_euclid(7),
        }
    }
    /// A month, 1..=12.
    pub fn month(year: i32, month: u32) -> Period {
        Period {
            frequency: Frequency::Monthly,
            ordinal: i64::from(year) * 12 + i64::from(month) - 1,
        }
    }
    /// A quarter, 1..=4.
    pub fn quarter(year: i32, quarter: u32) -> Period {
        Period {
            frequency: Frequency::Quarterly,
            ordinal: i64::from(year) * 4 + i64::from(quarter) - 1,
        }
    }
    /// A year.
    pub fn year(year: i32) -> Period {
        Period {
            frequency: Frequency::Yearly,
            ordinal: i64::from(year),
        }
    }
    /// Position `index` (1-based) of an undated series.
    pub fn position(index: i64) -> Period {
        Period {
            frequency: Frequency::Undated,
            ordinal: index,
        }
    }

    /// The frequency of the axis this period lies on.
    pub fn frequency(self) -> Frequency {
        self.frequency
    }
    /// The whole-number position on the frequency's axis (see the type's invariant).
    pub fn ordinal(self) -> i64 {
        self.ordinal
    }
    /// The period `steps` after this one (negative: before).
    pub fn offset(self, steps: i64) -> Period {
        Period {
            frequency: self.frequency,
            ordinal: self.ordinal + steps,
        }
    }
    /// The next period.
    pub fn next(self) -> Period {
        self.offset(1)
    }
    /// Number of steps from `self` to `later` (same frequency assumed).
    pub fn steps_to(self, later: Period) -> i64 {
        later.ordinal - self.ordinal
    }
    /// Position within the calendar's natural season, 0-based (month 0..12, quarter 0..4,
    /// weekday 0..7 with Monday 0, ISO week 0..52); `None` where the calendar has no season.
    pub fn season_position(self) -> Option<usize> {
        match self.frequency {
            Frequency::Monthly => Some(self.ordinal.rem_euclid(12) as usize),
            Frequency::Quarterly => Some(self.ordinal.rem_euclid(4) as usize),
            Frequency::Daily => Some(weekday(self.ordinal) as usize),
            Frequency::Weekly => {
                let (_, week) = iso_week(self.ordinal * 7 + WEEK_ORIGIN_MONDAY);
                Some((week.min(52) - 1) as usize)
            }
            Frequency::Yearly | Frequency::Undated => None,
        }
    }
    /// A week's Monday as "2024-01-01" (ISO weeks run Monday to Sunday); `None` for other
    /// periods.
    pub fn monday(self) -> Option<String> {
        (self.frequency == Frequency::Weekly).then(|| {
            let (y, m, d) = civil_from_days(self.ordinal * 7 + WEEK_ORIGIN_MONDAY);
            format!("{y}-{m:02}-{d:02}")
        })
    }
    /// The calendar year the period lies in (ISO year for weeks); `None` when undated.
    pub fn calendar_year(self) -> Option<i32> {
        match self.frequency {
            Frequency::Daily => Some(civil_from_days(self.ordinal).0),
            Frequency::Weekly => Some(iso_week(self.ordinal * 7 + WEEK_ORIGIN_MONDAY).0),
            Frequency::Monthly => Some(self.ordinal.div_euclid(12) as i32),
            Frequency::Quarterly => Some(self.ordinal.div_euclid(4) as i32),
            Frequency::Yearly => Some(self.ordinal as i32),
            Frequency::Undated => None,
        }
    }
}

/// Labels: "YYYY-MM-DD", "YYYY-Www", "YYYY-MM", "YYYY-Qn", "YYYY", or "1", "2", ... undated.
impl fmt::Display for Period {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self.frequency {
            Frequency::Daily => {
                let (y, m, d) = civil_from_days(self.ordinal);
                write!(f, "{y:04}-{m:02}-{d:02}")
            }
            Frequency::Weekly => {
                let (y, w) = iso_week(self.ordinal * 7 + WEEK_ORIGIN_MONDAY);
                write!(f, "{y:04}-W{w:02}")
            }
            Frequency::Monthly => {
                let y = self.ordinal.div_euclid(12);
                let m = self.ordinal.rem_euclid(12) + 1;
                write!(f, "{y:04}-{m:02}")
            }
            Frequency::Quarterly => {
                let y = self.ordinal.div_euclid(4);
                let q = self.ordinal.rem_euclid(4) + 1;
                write!(f, "{y:04}-Q{q}")
            }
            Frequency::Yearly => write!(f, "{:04}", self.ordinal),
            Frequency::Undated => write!(f, "{}", self.ordinal),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn day_numbers_round_trip() {
        assert_eq!(days_from_civil(1970, 1, 1), 0);
        assert_eq!(days_from_civil(2000, 3, 1), 11_017);
        for d in -800_000..800_000i64 {
            if d % 997 == 0 {
                let (y, m, day) = civil_from_days(d);
                assert_eq!(days_from_civil(y, m, day), d);
            }
        }
    }

    // ISO 8601 examples (common practice; calendar facts checkable in any calendar):
    // 2021-01-03 is in 2020-W53; 2024-01-01 (a Monday) starts 2024-W01.
    #[test]
    fn iso_weeks_match_calendar_facts() {
        assert_eq!(iso_week(days_from_civil(2021, 1, 3)), (2020, 53));
        assert_eq!(iso_week(days_from_civil(2024, 1, 1)), (2024, 1));
        assert_eq!(iso_week(days_from_civil(2024, 12, 30)), (2025, 1));
        assert_eq!(iso_weeks_in_year(2020), 53);
        assert_eq!(iso_weeks_in_year(2024), 52);
        assert_eq!(Period::iso_week(2024, 5).to_string(), "2024-W05");
        assert_eq!(Period::week_containing(2024, 2, 1).to_string(), "2024-W05");
    }

    #[test]
    fn labels_and_steps() {
        let m = Period::month(2024, 11);
        assert_eq!(m.to_string(), "2024-11");
        assert_eq!(m.offset(2).to_string(), "2025-01");
        assert_eq!(Period::quarter(2024, 4).next().to_string(), "2025-Q1");
        assert_eq!(Period::day(2024, 2, 28).next().to_string(), "2024-02-29");
        assert_eq!(Period::position(3).to_string(), "3");
        assert_eq!(Period::month(2024, 3).season_position(), Some(2));
        assert_eq!(Period::month(2023, 1).steps_to(Period::month(2024, 1)), 12);
    }
}
