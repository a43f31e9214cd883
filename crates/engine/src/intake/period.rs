//! A period column as a whole: which label family it holds, day-first or month-first order,
//! the frequency the dates imply, and one [`Period`] per row.
//!
//! Kept apart from: reading single cells (that is [`super::label`]) and from gaps and duplicates
//! (that is [`super::build`]). Every decision here looks at all rows at once.
//!
//! The frequency the dates imply is the rule of [`super::dates`]; the date order of `a/b/year`
//! dates is decided in [`super::order`].
//!
//! Whole numbers: a column of them is 8-digit dates `YYYYMMDD` when more than half of its cells
//! are valid dates with a year in [`PLAUSIBLE_YEARS`] (1800–2200);
//! 6-digit months `YYYYMM` when more than half are months of such years and their median step
//! is at most three months; years when more than half are in [`PLAUSIBLE_YEARS`] and their
//! median step is at most two; row positions (1, 2, 3, ... or 0, 1, 2, ...: indexes written by
//! data tools count from 0) when they start at 1 or 0 with a median
//! step of at most two, every cell one (and increase, in a first column). "More than half" and
//! the median step keep one bad cell or a typo far away from changing the reading (they are then
//! errors at their cells, as below) while scattered quantities are not taken for periods. The
//! report's period description says which reading was made.
//!
//! Periods refused, each as an error at its cell (the row is then not read):
//! - a year outside 1000 to [`LAST_YEAR`] (9633): labels have four-digit years, and a forecast
//!   reaches up to [`MAX_HORIZON`] periods (366 years at most) past the last period; every
//!   period the engine writes must have a label this reader reads back, so 9999 − 366 is the
//!   last year read;
//! - a period far from all the others, a likely typo (9999-12 or 2204-12 among the 2020s, 2042
//!   among 2019–2022): the distinct periods are split wherever more than `max(floor, 2 × N)`
//!   periods are missing between neighbours, N the number of distinct periods in the column and
//!   the floor about two years of the frequency (100 days, 104 weeks, 24 months, 8 quarters, 5
//!   years; 100 positions); the part holding the most periods is kept (the earliest of equal
//!   parts) and every period outside it is an error, instead of a run of filled gaps. Gaps up
//!   to that size are filled, with a warning listing them. For dates the frequency is then
//!   inferred again from the dates kept.

use crate::sorting;
use std::ops::RangeInclusive;

use super::dates::{date_period, infer_frequency, two_way_days};
use super::label::{parse_label, Family, Label};
use super::regroup::regroup;
use crate::calendar::{
    civil_from_days, days_from_civil, is_valid_date, weekday, Frequency, Period,
};
use crate::settings::MAX_HORIZON;

/// Years that plain whole numbers and 8- or 6-digit dates may name: plausible years of sales
/// history (our choice; two-digit years, 1969–2068, fall inside).
pub(crate) const PLAUSIBLE_YEARS: RangeInclusive<i32> = 1800..=2200;

/// The last year a period may fall in (see the module doc).
pub(crate) const LAST_YEAR: i32 = 9999 - MAX_HORIZON as i32;

/// The years a period may fall in: four-digit years, with room for a forecast after the last.
const YEARS_READ: RangeInclusive<i32> = 1000..=LAST_YEAR;

/// How plain whole numbers in a period column are read.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum IntegerMeaning {
    Years,
    Positions,
    /// `YYYYMMDD`.
    CompactDates,
    /// `YYYYMM`.
    CompactMonths,
    /// `YYYYWW`, ISO 8601 weeks: six digits under a header that names a week (the table
    /// decides, [`super::table`]); read as months they would put week 1 to 12 in January to
    /// December.
    CompactWeeks,
    /// `WW.YYYY`, ISO 8601 weeks as some exports write calendar weeks, under a header that names
    /// weeks (the table decides): read as months they would be January to December.
    DottedWeeks,
    /// `MM.YYYY`, months as European exports write them, under a header that names a period
    /// or across the header: numbers to a cell ("10.2001" may be an article number).
    DottedMonths,
}

/// The outcome for a period column: one entry per input cell.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct PeriodColumn {
    pub periods: Vec<Option<Period>>,
    pub frequency: Frequency,
    pub description: String,
    /// (index into the cells, what was expected).
    pub errors: Vec<(usize, String)>,
    pub warnings: Vec<String>,
}

/// The label family most non-integer cells share, when more than half of the non-empty cells
/// share it.
pub(crate) fn strong_family(cells: &[&str]) -> Option<Family> {
    let filled: Vec<&str> = cells.iter().copied().filter(|c| !c.is_empty()).collect();
    let mut counts: Vec<(Family, usize)> = Vec::new();
    for label in filled.iter().filter_map(|c| parse_label(c)) {
        if label.family() == Family::Integer {
            continue;
        }
        match counts.iter_mut().find(|(f, _)| *f == label.family()) {
            Some((_, n)) => *n += 1,
            None => counts.push((label.family(), 1)),
        }
    }
    let (family, count) = counts.into_iter().max_by_key(|(_, n)| *n)?;
    (count * 2 > filled.len()).then_some(family)
}

/// How a column of whole numbers reads as periods, if it does (see the module doc);
/// `in_row_order` asks positions to increase down the column.
pub(crate) fn integer_meaning(cells: &[&str], in_row_order: bool) -> Option<IntegerMeaning> {
    let filled: Vec<&str> = cells.iter().copied().filter(|c| !c.is_empty()).collect();
    let most = |n: usize| n * 2 > filled.len();
    let dates = filled.iter().filter(|c| compact_date(c).is_some()).count();
    if most(dates) {
        return Some(IntegerMeaning::CompactDates);
    }
    let months: Vec<i64> = filled
        .iter()
        .filter_map(|c| match compact_month(c)? {
            Label::Month { year, month } => Some(Period::month(year, month).ordinal()),
            _ => None,
        })
        .collect();
    if most(months.len()) && close(&months, 3) {
        return Some(IntegerMeaning::CompactMonths);
    }
    let values: Vec<i64> = filled
        .iter()
        .filter_map(|c| match parse_label(c) {
            Some(Label::Integer(n)) => Some(n),
            _ => None,
        })
        .collect();
    let plausible = |n: &i64| i32::try_from(*n).is_ok_and(|y| PLAUSIBLE_YEARS.contains(&y));
    let years: Vec<i64> = values.iter().copied().filter(plausible).collect();
    if most(years.len()) && close(&years, 2) {
        return Some(IntegerMeaning::Years);
    }
    let increasing = values.windows(2).all(|w| w[0] < w[1]);
    let positions = values.len() == filled.len()
        && values.iter().min().is_some_and(|n| *n == 0 || *n == 1)
        && close(&values, 2)
        && (increasing || !in_row_order);
    positions.then_some(IntegerMeaning::Positions)
}

/// Whether the distinct values mostly follow each other closely: the median step between
/// neighbours (the lower one of an even count) is at most `step`. Years, months and positions
/// do, even with a typo far away; scattered quantities do not.
pub(crate) fn close(values: &[i64], step: i64) -> bool {
    let mut distinct = values.to_vec();
    sorting::sort(&mut distinct);
    distinct.dedup();
    let mut steps: Vec<i64> = distinct.windows(2).map(|w| w[1] - w[0]).collect();
    sorting::sort(&mut steps);
    steps
        .get(steps.len().saturating_sub(1) / 2)
        .is_none_or(|s| *s <= step)
}

/// An 8-digit date `YYYYMMDD` with a plausible year.
fn compact_date(cell: &str) -> Option<Label> {
    if cell.len() != 8 || !cell.bytes().all(|b| b.is_ascii_digit()) {
        return None;
    }
    let (year, month, day) = (
        cell[..4].parse().ok()?,
        cell[4..6].parse().ok()?,
        cell[6..].parse().ok()?,
    );
    (PLAUSIBLE_YEARS.contains(&year) && is_valid_date(year, month, day)).then_some(Label::Date {
        year,
        month,
        day,
    })
}

/// A 6-digit month `YYYYMM` with a plausible year.
fn compact_month(cell: &str) -> Option<Label> {
    if cell.len() != 6 || !cell.bytes().all(|b| b.is_ascii_digit()) {
        return None;
    }
    let (year, month): (i32, u32) = (cell[..4].parse().ok()?, cell[4..].parse().ok()?);
    (PLAUSIBLE_YEARS.contains(&year) && (1..=12).contains(&month))
        .then_some(Label::Month { year, month })
}

/// A 6-digit ISO week `YYYYWW` of a plausible year, a week that year has.
fn compact_week(cell: &str) -> Option<Label> {
    if cell.len() != 6 || !cell.bytes().all(|b| b.is_ascii_digit()) {
        return None;
    }
    let year: i32 = cell[..4].parse().ok()?;
    if !PLAUSIBLE_YEARS.contains(&year) {
        return None;
    }
    parse_label(&format!("{}-W{}", &cell[..4], &cell[4..]))
}

/// A month written `MM.YYYY` (one or two digits of month) of a plausible year.
pub(crate) fn dotted_month(cell: &str) -> Option<Label> {
    let (month, year) = dotted(cell)?;
    (1..=12)
        .contains(&month)
        .then_some(Label::Month { year, month })
}

/// `N.YYYY` with one or two digits of N and a plausible four-digit year.
fn dotted(cell: &str) -> Option<(u32, i32)> {
    let (n, year) = cell.trim().split_once('.')?;
    let digits = |t: &str, len: std::ops::RangeInclusive<usize>| {
        len.contains(&t.len()) && t.bytes().all(|b| b.is_ascii_digit())
    };
    if !digits(n, 1..=2) || !digits(year, 4..=4) {
        return None;
    }
    let year: i32 = year.parse().ok()?;
    PLAUSIBLE_YEARS
        .contains(&year)
        .then_some((n.parse().ok()?, year))
}

/// Whether the filled `cells` of a column without a header are mostly months written
/// `MM.YYYY` close in time (the median step between distinct months at most 3, as for
/// `YYYYMM`): article numbers such as 10.2001, 10.2002, 11.2005 are years apart.
pub(crate) fn dotted_months_close(cells: &[&str]) -> bool {
    let months: Vec<i64> = cells
        .iter()
        .filter_map(|c| match dotted_month(c)? {
            Label::Month { year, month } => Some(Period::month(year, month).ordinal()),
            _ => None,
        })
        .collect();
    mostly(cells, dotted_month) && close(&months, 3)
}

/// Whether every filled cell (at least three) is `N.YYYY` with N from 1 to 53 and the
/// distinct labels follow each other (the median step one month or week): periods written
/// month.year or week.year, whatever a header says.
pub(crate) fn dotted_labels(cells: &[&str]) -> bool {
    let filled: Vec<&str> = cells
        .iter()
        .copied()
        .filter(|c| !c.trim().is_empty())
        .collect();
    let keys: Option<Vec<i64>> = filled
        .iter()
        .map(|c| {
            dotted(c)
                .filter(|(n, _)| (1..=53).contains(n))
                .map(|(n, year)| i64::from(year) * 53 + i64::from(n))
        })
        .collect();
    match keys {
        Some(keys) if keys.len() >= 3 => {
            let mut distinct = keys;
            sorting::sort(&mut distinct);
            distinct.dedup();
            distinct.len() >= 3 && close(&distinct, 1)
        }
        _ => false,
    }
}

/// Whether most of the filled `cells` read as `read` does.
pub(crate) fn mostly(cells: &[&str], read: fn(&str) -> Option<Label>) -> bool {
    let filled = cells.iter().filter(|c| !c.trim().is_empty()).count();
    let read = cells.iter().filter(|c| read(c).is_some()).count();
    read * 2 > filled
}

/// An ISO week written `WW.YYYY` (one or two digits of week) of a plausible year, a week that
/// year has.
pub(crate) fn dotted_week(cell: &str) -> Option<Label> {
    let (week, year) = dotted(cell)?;
    parse_label(&format!("{year}-W{week:02}"))
}

/// Says that period cells carry times of day (they are read by their dates), and refuses a
/// column whose every time is the same zoned time from 10:00 on: local midnights east of
/// Greenwich written in UTC (offsets +1 to +14 give 23:00 back to 10:00 the day before), each
/// date a day early; refused rather than shifted. West of Greenwich local midnight falls on the
/// same date in UTC.
fn times_of_day(cells: &[&str], errors: &mut Vec<(usize, String)>, warnings: &mut Vec<String>) {
    let timed: Vec<(usize, super::label::Clock<'_>)> = cells
        .iter()
        .enumerate()
        .filter_map(|(i, c)| Some((i, super::label::time_after_date(c)?)))
        .collect();
    let Some(&(at, clock)) = timed.first() else {
        return;
    };
    let hour = |time: &str| time.split(':').next().and_then(|h| h.parse::<u32>().ok());
    let one_zoned_time = timed.len() >= 2
        && hour(clock.time).is_some_and(|h| h >= 10)
        && timed.iter().all(|(_, c)| c.zoned && c.time == clock.time);
    if one_zoned_time {
        errors.push((
            at,
            format!(
                "expected dates in local time; every period here is at {} with a time zone, \
                 which is how local midnights look once turned into UTC: read as written, each \
                 date would be a day early (or late); export the dates without times",
                clock.time
            ),
        ));
    }
    warnings.push(format!(
        "{} carry a time of day (\"{}\"): each is read by its date and the time left out \
         (rows of one item and day add up; a UTC offset is not applied)",
        super::build::count(timed.len(), "period cell"),
        cells[at]
    ));
}

/// Reads every cell of a period column. Empty cells are errors (a row needs its period), and so
/// are the periods the module doc refuses.
/// Which day of its week a weekly date names, as the column's header says ("Week starting",
/// "Week ending"); unsaid, the date's own ISO week is taken.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum WeekAnchor {
    Unsaid,
    /// The week's first day: the week runs from the date for 7 days.
    Start,
    /// The week's last day: the week runs for 7 days up to the date.
    End,
}

impl WeekAnchor {
    /// Header words naming a week's first day.
    const START_WORDS: [&'static str; 7] = [
        "starting",
        "start",
        "starts",
        "beginning",
        "begins",
        "commencing",
        "from",
    ];
    /// Header words naming a week's last day.
    const END_WORDS: [&'static str; 5] = ["ending", "end", "ends", "to", "until"];

    /// The anchor a period column's header names: only a header of week and date words with
    /// a start or an end word ("Week starting", "Week to", "From"), not one that spells the
    /// span ("Week (Mon to Sun)") or says something else ("Sales date (from till)"), which a
    /// review found moved every week.
    pub(crate) fn of_header(name: &str) -> WeekAnchor {
        use super::headers::{header_is_only, header_says};
        use super::words::WEEK_WORDS;
        let allowed: Vec<&str> = WEEK_WORDS
            .iter()
            .chain(&Self::START_WORDS)
            .chain(&Self::END_WORDS)
            .chain(&["date", "dates", "day", "up", "of", "the", "w", "c", "e"])
            .copied()
            .collect();
        if !header_is_only(name, &allowed) {
            WeekAnchor::Unsaid
        } else if header_says(name, &Self::START_WORDS) && !header_says(name, &Self::END_WORDS) {
            WeekAnchor::Start
        } else if header_says(name, &Self::END_WORDS) && !header_says(name, &Self::START_WORDS) {
            WeekAnchor::End
        } else {
            WeekAnchor::Unsaid
        }
    }

    /// The day whose ISO week holds most of the week the date names: the week's middle day,
    /// 3 days after its start or before its end (a week of 7 days has 4 or more in that ISO
    /// week). "Week starting" 2023-12-31, a Sunday, is 2024-W01 (6 of its 7 days), not
    /// 2023-W52 as the date's own ISO week would have it (a review's probe).
    fn middle(self, days: i64) -> i64 {
        match self {
            WeekAnchor::Unsaid => days,
            WeekAnchor::Start => days + 3,
            WeekAnchor::End => days - 3,
        }
    }
}

pub(crate) fn read_periods(cells: &[&str], integers: Option<IntegerMeaning>) -> PeriodColumn {
    read_periods_anchored(cells, integers, WeekAnchor::Unsaid, None)
}

/// [`read_periods`] of a column whose header may name which day of its week a weekly date
/// is ([`WeekAnchor`]), and, in a long table, with each row's item key (`series`; see
/// [`super::regroup`]).
pub(crate) fn read_periods_anchored(
    cells: &[&str],
    integers: Option<IntegerMeaning>,
    anchor: WeekAnchor,
    series: Option<&[Option<String>]>,
) -> PeriodColumn {
    let (labels, family, compact): (Vec<Option<Label>>, Family, Option<&str>) = match integers {
        Some(IntegerMeaning::CompactDates) => (
            cells.iter().map(|c| compact_date(c)).collect(),
            Family::Date,
            Some("8-digit year-month-day dates"),
        ),
        Some(IntegerMeaning::CompactMonths) => (
            cells.iter().map(|c| compact_month(c)).collect(),
            Family::Month,
            Some("6-digit year-month months"),
        ),
        Some(IntegerMeaning::CompactWeeks) => (
            cells.iter().map(|c| compact_week(c)).collect(),
            Family::Week,
            Some("6-digit year-week ISO weeks"),
        ),
        Some(IntegerMeaning::DottedWeeks) => (
            cells.iter().map(|c| dotted_week(c)).collect(),
            Family::Week,
            Some("week.year ISO weeks"),
        ),
        Some(IntegerMeaning::DottedMonths) => (
            cells.iter().map(|c| dotted_month(c)).collect(),
            Family::Month,
            Some("month.year months"),
        ),
        Some(_) => (
            cells.iter().map(|c| parse_label(c)).collect(),
            Family::Integer,
            None,
        ),
        None => {
            let labels: Vec<Option<Label>> = cells.iter().map(|c| parse_label(c)).collect();
            let family = majority_family(&labels).unwrap_or(Family::Date);
            (labels, family, None)
        }
    };
    let found = cells
        .iter()
        .zip(&labels)
        .find(|(_, l)| l.is_some_and(|l| l.family() == family))
        .map(|(c, _)| *c);
    let example = found.map_or("2024-03 or 2024-03-31".to_string(), str::to_string);
    let mut errors = Vec::new();
    let mut warnings = Vec::new();
    times_of_day(cells, &mut errors, &mut warnings);
    for (i, (cell, label)) in cells.iter().zip(&labels).enumerate() {
        if label.is_some_and(|l| l.family() == family) {
            continue;
        }
        let message = if cell.is_empty() {
            format!("expected a period such as {example}; this row has none")
        } else {
            format!("expected a period written like the rest of this column, such as {example}")
        };
        errors.push((i, message));
    }
    let keep = |l: &Option<Label>| l.filter(|l| l.family() == family);
    let mut days: Option<Vec<Option<i64>>> = None;
    let (mut periods, mut frequency, kind) = match family {
        Family::Date | Family::TwoWay => {
            let mut kind = "year-month-day dates";
            let column_days: Vec<Option<i64>> = if family == Family::TwoWay {
                let order = super::order::decide_order(&labels);
                kind = if order.day_first {
                    "day-first dates"
                } else {
                    "month-first dates"
                };
                warnings.extend(order.warning);
                errors.extend(order.errors);
                // Rows that do not fit the chosen order give no date (their error is above);
                // an ambiguity error keeps every row, read day-first.
                labels
                    .iter()
                    .map(|l| two_way_days(keep(l)?, order.day_first))
                    .collect()
            } else {
                if found.is_some_and(|c| {
                    super::label::without_time(c)
                        .chars()
                        .any(char::is_alphabetic)
                }) {
                    kind = "dates with month names";
                }
                labels
                    .iter()
                    .map(|l| match keep(l)? {
                        Label::Date { year, month, day } => Some(days_from_civil(year, month, day)),
                        _ => None,
                    })
                    .collect()
            };
            let mut column_days = column_days;
            for (i, d) in column_days.iter_mut().enumerate() {
                if d.is_some_and(|d| !YEARS_READ.contains(&civil_from_days(d).0)) {
                    errors.push((i, year_out_of_range()));
                    *d = None;
                }
            }
            let (periods, frequency) = dated(&column_days, anchor);
            days = Some(column_days);
            (periods, frequency, compact.unwrap_or(kind))
        }
        Family::Month => (
            map_labels(&labels, family, |l| match l {
                Label::Month { year, month } => Some(Period::month(year, month)),
                _ => None,
            }),
            Frequency::Monthly,
            compact.unwrap_or("months"),
        ),
        Family::Quarter => (
            map_labels(&labels, family, |l| match l {
                Label::Quarter { year, quarter } => Some(Period::quarter(year, quarter)),
                _ => None,
            }),
            Frequency::Quarterly,
            "quarters",
        ),
        Family::Week => (
            map_labels(&labels, family, |l| match l {
                Label::Week { year, week } => Some(Period::iso_week(year, week)),
                _ => None,
            }),
            Frequency::Weekly,
            compact.unwrap_or("ISO weeks"),
        ),
        Family::Integer => {
            let years = integers != Some(IntegerMeaning::Positions);
            let periods = map_labels(&labels, family, |l| match l {
                // A number too large for a year still gives a period, refused below.
                Label::Integer(n) if years => {
                    Some(Period::year(i32::try_from(n).unwrap_or(i32::MAX)))
                }
                Label::Integer(n) => Some(Period::position(n)),
                _ => None,
            });
            if years {
                (periods, Frequency::Yearly, "years")
            } else {
                (periods, Frequency::Undated, "numbered periods")
            }
        }
    };
    for (i, p) in periods.iter_mut().enumerate() {
        if p.and_then(Period::calendar_year)
            .is_some_and(|y| !YEARS_READ.contains(&y))
        {
            errors.push((i, year_out_of_range()));
            *p = None;
        }
    }
    // Dates standing for longer periods than their steps say (monthly totals on a working
    // day, stores' own weekdays): read so before strays are looked for, whose gaps are
    // counted in the periods read (a review found closed months refused as typos, counted
    // in days).
    let mut regrouped = false;
    if let Some(column_days) = days.as_ref() {
        if let Some(read) = regroup(column_days, series, anchor, frequency) {
            (periods, frequency) = (read.periods, read.frequency);
            warnings.extend(read.warnings);
            errors.extend(read.errors);
            regrouped = true;
        }
    }
    let strays = stray_periods(&periods);
    if !strays.is_empty() {
        for (i, message) in strays {
            periods[i] = None;
            if let Some(days) = days.as_mut() {
                days[i] = None;
            }
            errors.push((i, message));
        }
        // A stray date can hide the frequency of the others (monthly dates and one typo on
        // the 15th read as daily): infer it again from the dates kept, and check once more.
        if let (Some(days), false) = (&days, regrouped) {
            (periods, frequency) = dated(days, anchor);
            if let Some(read) = regroup(days, series, anchor, frequency) {
                (periods, frequency) = (read.periods, read.frequency);
                warnings.extend(read.warnings);
                errors.extend(read.errors);
            }
            for (i, message) in stray_periods(&periods) {
                periods[i] = None;
                errors.push((i, message));
            }
        }
    }
    // A weekly column with a week or two dated a day or so off (a Saturday among Sundays,
    // that week's Sunday absent) reads as daily, its other days "closed": those dates are
    // read as the week of the usual weekday nearest them, warned. A review found a reorder
    // point over one day for a weekly demand of about 15 so; a second found correct daily
    // files refused by a first rule that made every odd date an error.
    if frequency == Frequency::Daily {
        if let Some(column_days) = days.as_mut() {
            let moved = off_weekday(column_days);
            if !moved.is_empty() {
                let mut said: Vec<String> = Vec::new();
                for &(i, usual_day) in &moved {
                    if let Some(d) = column_days[i] {
                        let text = with_weekday(d);
                        if !said.contains(&text) {
                            said.push(text);
                        }
                    }
                    column_days[i] = Some(usual_day);
                }
                let usual = WEEKDAY_NAMES[weekday(moved[0].1) as usize];
                warnings.push(format!(
                    "the dates of this column are a week apart on {usual}s but for {}: each was \
                     read as the week of the {usual} nearest it, whose own row is absent; check \
                     them",
                    said.join(", ")
                ));
                (periods, frequency) = dated(column_days, anchor);
            }
        }
    }
    // Weeks are shown as ISO weeks whatever weekday the file names them by: say which
    // dates the first one holds, so "2024-W01" is not taken for something else.
    let weeks_shown = periods
        .iter()
        .flatten()
        .next()
        .and_then(|first| Some((first, first.monday()?)))
        .map(|(first, monday)| {
            let named = match anchor {
                WeekAnchor::Unsaid => "",
                WeekAnchor::Start => {
                    "; the header names each week by its first day, and each is shown as the \
                     ISO week holding most of its days"
                }
                WeekAnchor::End => {
                    "; the header names each week by its last day, and each is shown as the \
                     ISO week holding most of its days"
                }
            };
            format!(
                ", a week apart, shown as ISO weeks, Monday to Sunday ({first} is the week from \
                 {monday}){named}"
            )
        });
    let apart = match (family, frequency) {
        (Family::Date | Family::TwoWay, Frequency::Weekly) => {
            weeks_shown.as_deref().unwrap_or(", a week apart")
        }
        (Family::Date | Family::TwoWay, Frequency::Monthly) => ", a month apart",
        (Family::Date | Family::TwoWay, Frequency::Quarterly) => ", a quarter apart",
        (Family::Date | Family::TwoWay, Frequency::Yearly) => ", a year apart",
        _ => "",
    };
    PeriodColumn {
        periods,
        frequency,
        description: format!("{kind} (e.g. {example}){apart}"),
        errors,
        warnings,
    }
}

/// The periods of dates (day numbers) at the frequency they imply.
fn dated(days: &[Option<i64>], anchor: WeekAnchor) -> (Vec<Option<Period>>, Frequency) {
    let frequency = infer_frequency(&days.iter().flatten().copied().collect::<Vec<_>>());
    (dated_as(days, frequency, anchor), frequency)
}

/// The periods of `frequency` that hold the dates (day numbers).
pub(super) fn dated_as(
    days: &[Option<i64>],
    frequency: Frequency,
    anchor: WeekAnchor,
) -> Vec<Option<Period>> {
    days.iter()
        .map(|d| {
            d.map(|d| match frequency {
                Frequency::Weekly => date_period(anchor.middle(d), frequency),
                _ => date_period(d, frequency),
            })
        })
        .collect()
}

/// The day of weekday `usual` within 3 days of `d` (`d` itself on that weekday): the day a
/// date off its column's (or item's) usual weekday stands in for.
pub(super) fn stands_for(d: i64, usual: u32) -> i64 {
    let ahead = (i64::from(usual) - i64::from(weekday(d))).rem_euclid(7);
    if ahead <= 3 {
        d + ahead
    } else {
        d + ahead - 7
    }
}

/// A date (day number) as messages write it, with its weekday: "2024-02-10 (a Saturday)".
pub(super) fn with_weekday(d: i64) -> String {
    format!(
        "{} (a {})",
        date_period(d, Frequency::Daily),
        WEEKDAY_NAMES[weekday(d) as usize]
    )
}

/// Weekday names, Monday first, as [`weekday`] numbers them.
pub(super) const WEEKDAY_NAMES: [&str; 7] = [
    "Monday",
    "Tuesday",
    "Wednesday",
    "Thursday",
    "Friday",
    "Saturday",
    "Sunday",
];

/// The dates of a column that is weekly but for a few, each with the day it stands in for: at
/// least 8 distinct dates, four in five of them or more on one weekday a whole number of weeks
/// apart and covering at least eight in ten of the weeks from the first to the last, and each
/// other date within 3 days of a day of that weekday which the column lacks (one per such
/// day). Empty when the column is not so: daily sales (a market's Saturdays and a bank
/// holiday beside one), a slow item sold on some Saturdays.
fn off_weekday(days: &[Option<i64>]) -> Vec<(usize, i64)> {
    let mut distinct: Vec<i64> = days.iter().flatten().copied().collect();
    sorting::sort(&mut distinct);
    distinct.dedup();
    if distinct.len() < 8 {
        return Vec::new();
    }
    let mut count = [0usize; 7];
    for d in &distinct {
        count[weekday(*d) as usize] += 1;
    }
    let usual = (0..7).max_by_key(|w| count[*w]).unwrap_or(0) as u32;
    let on_usual: Vec<i64> = distinct
        .iter()
        .copied()
        .filter(|d| weekday(*d) == usual)
        .collect();
    let off = distinct.len() - on_usual.len();
    let (Some(first), Some(last)) = (on_usual.first(), on_usual.last()) else {
        return Vec::new();
    };
    let weeks = (last - first) / 7 + 1;
    let weekly = on_usual.windows(2).all(|w| (w[1] - w[0]) % 7 == 0);
    if off == 0 || off * 5 > distinct.len() || !weekly || (on_usual.len() as i64) * 10 < 8 * weeks {
        return Vec::new();
    }
    let mut moved: Vec<(i64, i64)> = Vec::new();
    for d in distinct.iter().copied().filter(|d| weekday(*d) != usual) {
        let u = stands_for(d, usual);
        if on_usual.binary_search(&u).is_ok() || moved.iter().any(|(_, v)| *v == u) {
            return Vec::new();
        }
        moved.push((d, u));
    }
    days.iter()
        .enumerate()
        .filter_map(|(i, d)| {
            let d = (*d)?;
            moved
                .iter()
                .find(|(from, _)| *from == d)
                .map(|(_, u)| (i, *u))
        })
        .collect()
}

fn year_out_of_range() -> String {
    format!(
        "expected a year from {} to {LAST_YEAR}, so that every period and a forecast of up to \
         {MAX_HORIZON} periods after them have four-digit years: check the year",
        YEARS_READ.start()
    )
}

/// Missing periods between neighbours that a gap may hold before it counts as a typo, whatever
/// the number of periods: about two years (a hundred days, or a hundred positions).
fn typo_gap_floor(frequency: Frequency) -> usize {
    match frequency {
        Frequency::Daily | Frequency::Undated => 100,
        Frequency::Weekly => 104,
        Frequency::Monthly => 24,
        Frequency::Quarterly => 8,
        Frequency::Yearly => 5,
    }
}

/// The periods far from all the others (the module doc's rule), as (index, what was expected).
pub(crate) fn stray_periods(periods: &[Option<Period>]) -> Vec<(usize, String)> {
    let mut distinct: Vec<Period> = periods.iter().flatten().copied().collect();
    sorting::sort(&mut distinct);
    distinct.dedup();
    let Some(first) = distinct.first() else {
        return Vec::new();
    };
    let limit = typo_gap_floor(first.frequency()).max(2 * distinct.len()) as i64;
    // Parts of the sorted distinct periods, split at every gap longer than the limit.
    let mut parts: Vec<(usize, usize)> = Vec::new();
    let mut start = 0;
    for i in 1..=distinct.len() {
        if i == distinct.len() || distinct[i - 1].steps_to(distinct[i]) - 1 > limit {
            parts.push((start, i - 1));
            start = i;
        }
    }
    if parts.len() < 2 {
        return Vec::new();
    }
    let mut kept = parts[0];
    for part in &parts[1..] {
        if part.1 - part.0 > kept.1 - kept.0 {
            kept = *part;
        }
    }
    let (first, last) = (distinct[kept.0], distinct[kept.1]);
    periods
        .iter()
        .enumerate()
        .filter_map(|(i, p)| {
            let p = (*p)?;
            let (steps, side) = if p < first {
                (p.steps_to(first), "before")
            } else if p > last {
                (last.steps_to(p), "after")
            } else {
                return None;
            };
            Some((
                i,
                format!(
                    "expected a period near the others in this column ({first} to {last}); \
                     this one is {steps} periods {side} them, more than a gap of {limit} \
                     periods allows: check its year"
                ),
            ))
        })
        .collect()
}

fn majority_family(labels: &[Option<Label>]) -> Option<Family> {
    let mut counts: Vec<(Family, usize)> = Vec::new();
    for label in labels.iter().flatten() {
        match counts.iter_mut().find(|(f, _)| *f == label.family()) {
            Some((_, n)) => *n += 1,
            None => counts.push((label.family(), 1)),
        }
    }
    sorting::sort_by_key(&mut counts, |(f, n)| (std::cmp::Reverse(*n), *f));
    counts.first().map(|(f, _)| *f)
}

fn map_labels(
    labels: &[Option<Label>],
    family: Family,
    to_period: impl Fn(Label) -> Option<Period>,
) -> Vec<Option<Period>> {
    labels
        .iter()
        .map(|l| l.filter(|l| l.family() == family).and_then(&to_period))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn integer_columns() {
        assert_eq!(
            integer_meaning(&["2021", "2022", "2024"], true),
            Some(IntegerMeaning::Years)
        );
        assert_eq!(
            integer_meaning(&["1", "2", "3"], true),
            Some(IntegerMeaning::Positions)
        );
        assert_eq!(integer_meaning(&["1", "3", "2"], true), None);
        assert_eq!(integer_meaning(&["12", "15", "11"], true), None);
        assert_eq!(integer_meaning(&["1", "2", "x"], true), None);
        // A typo far away, or one bad cell, keeps the reading (and is refused as a period
        // later)...
        let years = Some(IntegerMeaning::Years);
        assert_eq!(
            integer_meaning(&["2019", "2020", "2021", "2042"], true),
            years
        );
        assert_eq!(
            integer_meaning(&["2019", "2020", "2021", "20222"], true),
            years
        );
        assert_eq!(
            integer_meaning(&["2019", "2020", "someday", "2022"], true),
            years
        );
        assert_eq!(
            integer_meaning(&["2018", "2020", "2022", "2024"], true),
            years
        );
        // ...while scattered quantities, even inside 1800-2200, are not periods.
        assert_eq!(
            integer_meaning(&["1850", "1900", "1875", "2010"], true),
            None
        );
        assert_eq!(integer_meaning(&["2019", "2020", "5", "7"], true), None);
        assert_eq!(
            integer_meaning(&["1", "2", "3", "50"], true),
            Some(IntegerMeaning::Positions)
        );
    }

    #[test]
    fn compact_columns() {
        use IntegerMeaning::{CompactDates, CompactMonths};
        let meaning = |cells: &[&str]| integer_meaning(cells, true);
        assert_eq!(meaning(&["20240101", "20240102"]), Some(CompactDates));
        assert_eq!(
            meaning(&["20240101", "20240132", "20240103"]),
            Some(CompactDates)
        );
        // More than half must be dates of a plausible year.
        assert_eq!(meaning(&["20240101", "20240132"]), None);
        assert_eq!(meaning(&["99990101", "99990102"]), None);
        assert_eq!(
            meaning(&["20240101", "someday", "20240103"]),
            Some(CompactDates)
        );
        assert_eq!(
            meaning(&["202401", "202402", "202404"]),
            Some(CompactMonths)
        );
        assert_eq!(meaning(&["202401", "202413"]), None);
        assert_eq!(meaning(&["202401", "202501"]), None);
        assert_eq!(meaning(&["123456", "123457"]), None);
        let col = read_periods(&["20240101", "20240132", "20240103"], Some(CompactDates));
        assert_eq!(col.frequency, Frequency::Daily);
        assert_eq!(col.errors.len(), 1);
        assert_eq!(col.errors[0].0, 1);
        assert!(
            col.description.starts_with("8-digit"),
            "{}",
            col.description
        );
        let col = read_periods(&["202401", "202402"], Some(CompactMonths));
        assert_eq!(col.periods[1], Some(Period::month(2024, 2)));
    }

    /// (periods present, as offsets from `start`, and the offsets refused).
    fn check_strays_from(start: Period, offsets: &[i64], refused: &[i64]) {
        let periods: Vec<Option<Period>> = offsets.iter().map(|o| Some(start.offset(*o))).collect();
        let got: Vec<i64> = stray_periods(&periods)
            .into_iter()
            .map(|(i, _)| offsets[i])
            .collect();
        assert_eq!(got, refused, "{offsets:?} from {start}");
    }

    /// Positions, whose floor is 100 missing periods.
    fn check_strays(offsets: &[i64], refused: &[i64]) {
        check_strays_from(Period::position(10_000), offsets, refused);
    }

    #[test]
    fn strays_are_periods_beyond_a_gap_longer_than_the_floor_or_twice_the_count() {
        // Two periods: the limit is 100 missing periods between them; the later one goes.
        check_strays(&[0, 101], &[]);
        check_strays(&[0, 102], &[102]);
        // Sixty periods and one more: the limit is 2 × 61 = 122 missing periods.
        let mut sixty: Vec<i64> = (0..60).collect();
        sixty.push(59 + 123);
        check_strays(&sixty, &[]);
        sixty.pop();
        sixty.push(59 + 124);
        check_strays(&sixty, &[59 + 124]);
        // Before or after, and the larger part kept whichever side it is on.
        check_strays(&[-5000, 0, 1, 2], &[-5000]);
        check_strays(&[0, 1, 2, 9000, 9001, 9002, 9003], &[0, 1, 2]);
        // Repeated periods count once, and every row of a stray period is refused.
        check_strays(&[0, 0, 1, 5000, 5000], &[5000, 5000]);
        check_strays(&[7], &[]);
        // The floor by frequency: 24 months, 5 years.
        let month = Period::month(2020, 1);
        check_strays_from(month, &[0, 25], &[]);
        check_strays_from(month, &[0, 26], &[26]);
        let year = Period::year(2019);
        check_strays_from(year, &[0, 1, 2, 3, 23], &[23]);
        check_strays_from(year, &[0, 1, 2, 3, 14], &[]);
        check_strays_from(year, &[0, 1, 2, 3, 15], &[15]);
    }

    #[test]
    fn a_stray_date_does_not_decide_the_frequency() {
        let mut cells: Vec<String> = (1..=12).map(|m| format!("2024-{m:02}-01")).collect();
        cells.push("2042-01-15".to_string());
        let cells: Vec<&str> = cells.iter().map(String::as_str).collect();
        let col = read_periods(&cells, None);
        assert_eq!(col.frequency, Frequency::Monthly);
        assert_eq!(col.errors.len(), 1);
        assert_eq!(col.errors[0].0, 12);
        assert_eq!(col.periods[12], None);
    }

    /// The period a label of `p`'s frequency reads back as.
    fn read_back(p: Period) -> Option<Period> {
        let label = parse_label(&p.to_string())?;
        match (label, p.frequency()) {
            (Label::Date { year, month, day }, Frequency::Daily) => {
                Some(Period::day(year, month, day))
            }
            (Label::Week { year, week }, Frequency::Weekly) => Some(Period::iso_week(year, week)),
            (Label::Month { year, month }, Frequency::Monthly) => Some(Period::month(year, month)),
            (Label::Quarter { year, quarter }, Frequency::Quarterly) => {
                Some(Period::quarter(year, quarter))
            }
            (Label::Integer(n), Frequency::Yearly) => Some(Period::year(i32::try_from(n).ok()?)),
            (Label::Integer(n), Frequency::Undated) => Some(Period::position(n)),
            _ => None,
        }
    }

    // Every period intake can read, and every period a forecast of up to MAX_HORIZON periods
    // reaches from it, has a label this reader reads back as the same period.
    #[test]
    fn every_period_written_reads_back() {
        for year in [1000, 1969, 2024, LAST_YEAR] {
            for last in [
                Period::day(year, 12, 31),
                Period::week_containing(year, 12, 31),
                Period::month(year, 12),
                Period::quarter(year, 4),
                Period::year(year),
            ] {
                for k in 0..=MAX_HORIZON as i64 {
                    let p = last.offset(k);
                    assert_eq!(read_back(p), Some(p), "{p}");
                }
            }
        }
        for n in [1, 100_000, 100_000 + MAX_HORIZON as i64] {
            assert_eq!(read_back(Period::position(n)), Some(Period::position(n)));
        }
        // The edge of the history's years: 9633 read, 9634 refused.
        let col = read_periods(&["9633-12", "9634-01"], None);
        assert_eq!(col.periods, vec![Some(Period::month(LAST_YEAR, 12)), None]);
        assert!(
            col.errors[0].1.contains("from 1000 to 9633"),
            "{:?}",
            col.errors
        );
        let col = read_periods(&["9633-12-31", "9634-01-01"], None);
        assert_eq!(col.errors.len(), 1, "{:?}", col.errors);
    }

    #[test]
    fn week_start_sundays_map_to_consecutive_weeks() {
        let col = read_periods(&["07/01/2024", "14/01/2024", "21/01/2024"], None);
        assert_eq!(col.frequency, Frequency::Weekly);
        let p: Vec<i64> = col.periods.iter().map(|p| p.unwrap().ordinal()).collect();
        assert_eq!(p[1] - p[0], 1);
        assert_eq!(p[2] - p[1], 1);
    }
}
