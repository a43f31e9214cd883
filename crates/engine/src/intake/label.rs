//! Period labels: one cell of a period column read into a calendar label, before the column as a
//! whole decides date order and frequency.
//!
//! Kept apart from: decisions that need every row (day-first or month-first, which frequency);
//! those are in [`super::period`]. This module reads one cell and never looks at its neighbours.
//!
//! Accepted forms (letters in any case; separators `-`, `/`, `.`, space where shown):
//! - year-first dates `2024-03-31`, `2024/03/31`, `2024.03.31`;
//! - any of the dates below followed by a time of day (`2024-03-31 00:00`, which spreadsheets
//!   add, `2024-03-31T14:32:05Z`, `31/03/2024 14:32`, `31/03/2024, 2:32 PM`, with seconds,
//!   fractions and a UTC offset as ISO 8601 writes them): read as the date as written (the
//!   offset is not applied), the time left out; [`time_after_date`] tells the column so it
//!   can say so;
//! - two-way dates `31/03/2024`, `03/31/2024`, `31-03-24`, `31.03.2024` (order decided later);
//! - dates with month names `31 Mar 2024`, `31-Mar-24`, `Mar 31, 2024`, `March 31 2024`;
//! - months `2024-03`, `2024/03`, `03/2024`, `Mar 2024`, `March 2024`, `2024 Mar`, `Mar-24`
//!   (a month name and two digits is a spreadsheet's month-year form: never a day);
//!   `03.2024` is a number here: a column decides it is a month ([`super::period`]);
//! - quarters `2024 Q1`, `2024-Q1`, `2024Q1`, `Q1 2024`, `Q1-24`;
//! - ISO weeks `2024-W05`, `2024W05`, `2024 W5`, `W05 2024`;
//! - plain whole numbers (`2024`, `7`, `20240131`, `202401`): years, row positions, 8-digit dates
//!   or 6-digit months, decided by the column ([`super::period`]).
//!
//! Two-digit years follow the POSIX `strptime` `%y` rule (from memory): 69–99 are 1969–1999,
//! 00–68 are 2000–2068. Month names are English (full, three letters, or "Sept").

use crate::calendar::{is_valid_date, iso_weeks_in_year};

/// One cell read as a period label.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Label {
    /// An unambiguous date (year-first, or with a month name).
    Date {
        year: i32,
        month: u32,
        day: u32,
    },
    /// `a/b/year`: day-first if `a` is the day, month-first if `b` is.
    TwoWay {
        a: u32,
        b: u32,
        year: i32,
    },
    Month {
        year: i32,
        month: u32,
    },
    Quarter {
        year: i32,
        quarter: u32,
    },
    Week {
        year: i32,
        week: u32,
    },
    /// A plain whole number.
    Integer(i64),
}

/// The family a label belongs to; a period column holds one family.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub(crate) enum Family {
    Date,
    TwoWay,
    Month,
    Quarter,
    Week,
    Integer,
}

impl Label {
    pub fn family(self) -> Family {
        match self {
            Label::Date { .. } => Family::Date,
            Label::TwoWay { .. } => Family::TwoWay,
            Label::Month { .. } => Family::Month,
            Label::Quarter { .. } => Family::Quarter,
            Label::Week { .. } => Family::Week,
            Label::Integer(_) => Family::Integer,
        }
    }
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Token<'a> {
    Digits(&'a str),
    Word(&'a str),
}

/// Splits a cell into digit runs and letter runs; separators (`-`, `/`, `.`, `,`, space) only
/// divide. The list of separators between tokens is returned too, trimmed of spaces.
fn tokens(cell: &str) -> Option<(Vec<Token<'_>>, Vec<String>)> {
    let mut out = Vec::new();
    let mut seps = Vec::new();
    let mut current_sep = String::new();
    let mut start: Option<(usize, bool)> = None;
    for (i, c) in cell.char_indices() {
        let kind = if c.is_ascii_digit() {
            Some(true)
        } else if c.is_alphabetic() {
            Some(false)
        } else {
            None
        };
        if let Some((s, digit)) = start {
            if kind != Some(digit) {
                let text = &cell[s..i];
                out.push(if digit {
                    Token::Digits(text)
                } else {
                    Token::Word(text)
                });
                start = None;
            }
        }
        match kind {
            Some(digit) => {
                if start.is_none() {
                    if !out.is_empty() {
                        seps.push(current_sep.trim().to_string());
                    }
                    current_sep.clear();
                    start = Some((i, digit));
                }
            }
            None if out.is_empty() && start.is_none() => return None,
            None if matches!(c, '-' | '/' | '.' | ',' | ' ' | '\u{a0}') => current_sep.push(c),
            None => return None,
        }
    }
    if let Some((s, digit)) = start {
        let text = &cell[s..];
        out.push(if digit {
            Token::Digits(text)
        } else {
            Token::Word(text)
        });
    } else if !current_sep.trim().is_empty() {
        return None;
    }
    Some((out, seps))
}

/// Month number of an English month name or abbreviation.
pub(crate) fn month_name(word: &str) -> Option<u32> {
    const NAMES: [&str; 12] = [
        "january",
        "february",
        "march",
        "april",
        "may",
        "june",
        "july",
        "august",
        "september",
        "october",
        "november",
        "december",
    ];
    let lower = word.to_lowercase();
    if lower == "sept" {
        return Some(9);
    }
    NAMES
        .iter()
        .position(|name| lower == *name || (lower.len() == 3 && name.starts_with(&lower)))
        .map(|i| i as u32 + 1)
}

/// Whether a cell names a part of a calendar without a year: a month or weekday name or
/// abbreviation ("Jan", "March", "Mon", "Thurs"), a quarter (Q1 to Q4), a week (W1 to W53)
/// or a time of day ("09:15", "13:00:00", "9:30 am"). Such a column holds calendar details,
/// not item names.
pub(crate) fn calendar_name(cell: &str) -> bool {
    let lower = cell.trim().to_lowercase();
    let numbered = |prefix: char, max: u32| {
        lower
            .strip_prefix(prefix)
            .filter(|n| !n.is_empty() && n.len() <= 2 && n.bytes().all(|b| b.is_ascii_digit()))
            .and_then(|n| n.parse::<u32>().ok())
            .is_some_and(|n| (1..=max).contains(&n))
    };
    month_name(&lower).is_some()
        || time_of_day(&lower)
        || weekday_name(&lower)
        || numbered('q', 4)
        || numbered('w', 53)
}

/// Whether a lower-case word names a weekday: in full or by its first three letters or more
/// ("mon", "thurs").
pub(crate) fn weekday_name(lower: &str) -> bool {
    const WEEKDAYS: [&str; 7] = [
        "monday",
        "tuesday",
        "wednesday",
        "thursday",
        "friday",
        "saturday",
        "sunday",
    ];
    WEEKDAYS
        .iter()
        .any(|day| lower == *day || (lower.len() >= 3 && day.starts_with(lower)))
        || super::words::weekday_in_other_languages(lower)
}

/// Whether a cell is a time of day alone ("09:15", "1:30 PM"): a till's time column.
pub(crate) fn is_time_of_day(cell: &str) -> bool {
    time_of_day(&cell.trim().to_lowercase())
}

/// A time of day: hours and minutes, perhaps seconds, perhaps am or pm ("9:15", "13:00:00").
fn time_of_day(lower: &str) -> bool {
    let clock = lower
        .strip_suffix("am")
        .or_else(|| lower.strip_suffix("pm"))
        .unwrap_or(lower)
        .trim();
    let parts: Vec<&str> = clock.split(':').collect();
    let number = |p: &str, max: u32| {
        !p.is_empty()
            && p.len() <= 2
            && p.bytes().all(|b| b.is_ascii_digit())
            && p.parse::<u32>().is_ok_and(|n| n <= max)
    };
    matches!(parts.len(), 2 | 3)
        && number(parts[0], 23)
        && parts[1..].iter().all(|p| p.len() == 2 && number(p, 59))
}

/// A year written with four digits, or two (1969 to 2068).
pub(crate) fn year_of(digits: &str) -> Option<i32> {
    match digits.len() {
        4 if !digits.starts_with('0') => digits.parse().ok(),
        2 => {
            let yy: i32 = digits.parse().ok()?;
            Some(if yy >= 69 { 1900 + yy } else { 2000 + yy })
        }
        _ => None,
    }
}

fn small(digits: &str, max_len: usize) -> Option<u32> {
    if digits.is_empty() || digits.len() > max_len {
        return None;
    }
    digits.parse().ok()
}

/// A cell split into what stands before a time of day and the time (`None` without one):
/// "2024-03-31T14:32:05.5+01:00" gives ("2024-03-31", "14:32:05.5"); "31/03/2024 2:32 PM"
/// gives ("31/03/2024", "2:32").
fn split_time(cell: &str) -> (&str, Option<Clock<'_>>) {
    // Every time of day has a colon; most cells have none (the reading's hot path).
    if !cell.contains(':') {
        return (cell, None);
    }
    let bytes = cell.as_bytes();
    let twelve_hour = bytes.len() >= 2
        && matches!(bytes[bytes.len() - 2].to_ascii_lowercase(), b'a' | b'p')
        && bytes[bytes.len() - 1].eq_ignore_ascii_case(&b'm');
    let clock_end = if twelve_hour {
        cell[..cell.len() - 2].trim_end().len()
    } else {
        cell.len()
    };
    let mut head = &cell[..clock_end];
    let mut zoned = false;
    // A zone written apart after the time: " UTC", " GMT", " +01:00" (as some exports write).
    if let Some((before, zone)) = head.rsplit_once(' ') {
        let zone_name = matches!(zone.to_ascii_uppercase().as_str(), "UTC" | "GMT" | "Z");
        if !twelve_hour && (zone_name || offset(zone)) {
            head = before.trim_end();
            zoned = true;
        }
    }
    let Some(pos) = head.rfind([' ', 'T', 't']) else {
        return (cell, None);
    };
    let mut time = &head[pos + 1..];
    // A UTC offset as ISO 8601 writes it: Z, +01:00, -0500.
    if let Some(t) = time.strip_suffix(['Z', 'z']) {
        time = t;
        zoned = true;
    } else if let Some(at) = time.rfind(['+', '-']) {
        if at > 0 && offset(&time[at..]) {
            time = &time[..at];
            zoned = true;
        }
    }
    // Fractions of a second after a dot, or a comma (ISO 8601 allows both).
    let (whole, fraction) = match time.split_once(['.', ',']) {
        Some((whole, fraction)) => (whole, Some(fraction)),
        None => (time, None),
    };
    let fraction_ok =
        fraction.is_none_or(|f| !f.is_empty() && f.bytes().all(|b| b.is_ascii_digit()));
    if pos == 0 || !fraction_ok || !time_of_day(whole) {
        return (cell, None);
    }
    // "1/5/2024, 2:32:00 PM": a comma between date and time, as some locales write it.
    let date = cell[..pos].trim_end();
    let date = date.strip_suffix(',').unwrap_or(date).trim_end();
    (date, Some(Clock { time: whole, zoned }))
}

/// A UTC offset as ISO 8601 writes it: a sign and four digits, perhaps with a colon ("+01:00",
/// "-0500").
fn offset(text: &str) -> bool {
    let Some(rest) = text.strip_prefix(['+', '-']) else {
        return false;
    };
    let digits = rest.replacen(':', "", 1);
    digits.len() == 4 && digits.bytes().all(|b| b.is_ascii_digit())
}

/// A time of day after a date: hours, minutes and seconds as written, and whether a UTC
/// offset (Z, +01:00) followed.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) struct Clock<'a> {
    pub time: &'a str,
    pub zoned: bool,
}

/// The time of day after a date in `cell`, when it is not midnight ("2024-03-31 14:32").
pub(crate) fn time_after_date(cell: &str) -> Option<Clock<'_>> {
    let (date, clock) = split_time(cell.trim());
    let midnight = |t: &str| t.bytes().all(|b| matches!(b, b'0' | b':'));
    clock.filter(|c| !midnight(c.time)).filter(|_| {
        parse_label(date).is_some_and(|l| matches!(l.family(), Family::Date | Family::TwoWay))
    })
}

/// A time of day as a point in the day, for telling rows of one day apart: hours (24-hour,
/// am and pm applied), minutes, seconds, and the fraction of a second in nanoseconds, so
/// "9:00" and "09:00:00" are one time and "9:00 AM" and "9:00 PM" two.
pub(crate) type TimeKey = (u32, u32, u32, u32);

/// The [`TimeKey`] of `clock` ("14:32:05"), written in `cell` (for am or pm and a fraction
/// after it).
fn time_key_of(clock: &str, cell: &str) -> Option<TimeKey> {
    let parts: Vec<u32> = clock
        .split(':')
        .map(|p| p.parse().ok())
        .collect::<Option<_>>()?;
    let (mut hours, minutes) = (*parts.first()?, *parts.get(1)?);
    let seconds = parts.get(2).copied().unwrap_or(0);
    let lower = cell.trim().to_ascii_lowercase();
    if lower.ends_with("pm") && hours < 12 {
        hours += 12;
    } else if lower.ends_with("am") && hours == 12 {
        hours = 0;
    }
    // The fraction: digits after a dot or a comma right after the clock in the cell.
    let after = cell.find(clock).map_or("", |at| &cell[at + clock.len()..]);
    let digits: String = after
        .strip_prefix(['.', ','])
        .map(|rest| {
            rest.chars()
                .take_while(char::is_ascii_digit)
                .take(9)
                .collect()
        })
        .unwrap_or_default();
    let nanos = format!("{digits:0<9}").parse().unwrap_or(0);
    Some((hours, minutes, seconds, nanos))
}

/// The time of day written after the date in a period cell, midnight included
/// ("2024-03-31 00:00"), as a [`TimeKey`].
pub(crate) fn written_time(cell: &str) -> Option<TimeKey> {
    let (_, clock) = split_time(cell.trim());
    time_key_of(clock?.time, cell)
}

/// A cell holding a time of day alone (a till's time column) as a [`TimeKey`].
pub(crate) fn time_alone(cell: &str) -> Option<TimeKey> {
    if !is_time_of_day(cell) {
        return None;
    }
    let lower = cell.trim().to_ascii_lowercase();
    let clock = lower
        .strip_suffix("am")
        .or_else(|| lower.strip_suffix("pm"))
        .unwrap_or(&lower)
        .trim();
    time_key_of(clock, cell)
}

/// `cell` without a time of day after it ("2024-03-31T14:32" gives "2024-03-31").
pub(crate) fn without_time(cell: &str) -> &str {
    split_time(cell.trim()).0
}

/// Reads one cell as a period label; `None` when it is not one of the accepted forms. A time
/// of day is taken only after a date (a day), never after a month, quarter or week.
pub(crate) fn parse_label(cell: &str) -> Option<Label> {
    let (cell, time) = split_time(cell.trim());
    let label = parse_day_or_coarser(cell)?;
    match label.family() {
        Family::Date | Family::TwoWay => Some(label),
        _ if time.is_none() => Some(label),
        _ => None,
    }
}

fn parse_day_or_coarser(cell: &str) -> Option<Label> {
    let (toks, seps) = tokens(cell)?;
    use Token::{Digits as D, Word as W};
    let same_sep = |allowed: &[&str]| seps.iter().all(|s| allowed.contains(&s.as_str()));
    let label = match toks.as_slice() {
        [D(n)] => {
            if n.len() > 12 {
                return None;
            }
            Label::Integer(n.parse().ok()?)
        }
        [D(y), D(m), D(d)] if y.len() == 4 => {
            if !(same_sep(&["-"]) || same_sep(&["/"]) || same_sep(&["."])) {
                return None;
            }
            date(year_of(y)?, small(m, 2)?, small(d, 2)?)?
        }
        [D(a), D(b), D(y)] if a.len() <= 2 && b.len() <= 2 => {
            if !(same_sep(&["-"]) || same_sep(&["/"]) || same_sep(&["."])) {
                return None;
            }
            let (a, b, year) = (small(a, 2)?, small(b, 2)?, year_of(y)?);
            if a == 0 || b == 0 || (a > 12 && b > 12) {
                return None;
            }
            Label::TwoWay { a, b, year }
        }
        [D(y), D(m)] if y.len() == 4 && same_sep(&["-", "/"]) => month(year_of(y)?, small(m, 2)?)?,
        [D(m), D(y)] if y.len() == 4 && same_sep(&["-", "/"]) => month(year_of(y)?, small(m, 2)?)?,
        [W(w), D(y)] if month_name(w).is_some() => month(year_of(y)?, month_name(w)?)?,
        [D(y), W(w)] if y.len() == 4 && month_name(w).is_some() => {
            month(year_of(y)?, month_name(w)?)?
        }
        [D(d), W(w), D(y)] if month_name(w).is_some() => {
            date(year_of(y)?, month_name(w)?, small(d, 2)?)?
        }
        [W(w), D(d), D(y)] if month_name(w).is_some() => {
            date(year_of(y)?, month_name(w)?, small(d, 2)?)?
        }
        [D(y), W(q), D(n)] if q.eq_ignore_ascii_case("q") && y.len() == 4 => {
            quarter(year_of(y)?, small(n, 1)?)?
        }
        [W(q), D(n), D(y)] if q.eq_ignore_ascii_case("q") => quarter(year_of(y)?, small(n, 1)?)?,
        [D(y), W(w), D(n)] if w.eq_ignore_ascii_case("w") && y.len() == 4 => {
            week(year_of(y)?, small(n, 2)?)?
        }
        [W(w), D(n), D(y)] if w.eq_ignore_ascii_case("w") && y.len() == 4 => {
            week(year_of(y)?, small(n, 2)?)?
        }
        _ => return None,
    };
    Some(label)
}

fn date(year: i32, month: u32, day: u32) -> Option<Label> {
    is_valid_date(year, month, day).then_some(Label::Date { year, month, day })
}
fn month(year: i32, month: u32) -> Option<Label> {
    (1..=12)
        .contains(&month)
        .then_some(Label::Month { year, month })
}
fn quarter(year: i32, quarter: u32) -> Option<Label> {
    (1..=4)
        .contains(&quarter)
        .then_some(Label::Quarter { year, quarter })
}
fn week(year: i32, week: u32) -> Option<Label> {
    (week >= 1 && week <= iso_weeks_in_year(year)).then_some(Label::Week { year, week })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn calendar_names() {
        for cell in [
            "Jan",
            "january",
            "Sept",
            "Mon",
            "Thurs",
            "SUNDAY",
            "Q1",
            "q4",
            "W1",
            "W53",
            "09:15",
            "9:30 am",
            "13:00:00",
            // German, French, Dutch, Spanish and Italian weekdays written out (from memory).
            "Montag",
            "lundi",
            "miércoles",
            "zaterdag",
            "giovedì",
        ] {
            assert!(calendar_name(cell), "{cell}");
        }
        for cell in [
            "Oak tray",
            "Sunflower seeds",
            "Q5",
            "W54",
            "W",
            // Two letters are as often a country or a state: shortened weekdays in other
            // languages count only under a weekday's header (table.rs).
            "Mo",
            "FR",
            "MA",
            "Sam",
            "2024",
            "Q1 2024",
            "25:00",
            "9:5",
            "1:2:3:4",
        ] {
            assert!(!calendar_name(cell), "{cell}");
        }
    }

    fn date_of(y: i32, m: u32, d: u32) -> Option<Label> {
        Some(Label::Date {
            year: y,
            month: m,
            day: d,
        })
    }
    fn month_of(y: i32, m: u32) -> Option<Label> {
        Some(Label::Month { year: y, month: m })
    }

    #[test]
    fn year_first_dates_with_and_without_midnight() {
        for cell in [
            "2024-03-31",
            "2024/03/31",
            "2024.03.31",
            "2024-03-31 00:00",
            "2024-03-31T00:00:00Z",
        ] {
            assert_eq!(parse_label(cell), date_of(2024, 3, 31), "{cell}");
        }
        assert_eq!(parse_label("2024-02-30"), None);
        assert_eq!(parse_label("2024-03/31"), None);
    }

    #[test]
    fn dates_with_times_of_day_are_their_dates() {
        // (cell, a time other than midnight)
        for (cell, timed) in [
            ("2024-03-31 14:30", true),
            ("2024-03-31T14:32:05Z", true),
            ("2024-03-31T14:32:05.250+01:00", true),
            ("2024-03-31T23:59:59-0500", true),
            ("2024-03-31 2:32 PM", true),
            ("2024-03-31, 2:32:00 PM", true),
            ("2024-03-31 00:00:00.000", false),
        ] {
            let zoned = cell.ends_with('Z') || cell.contains('+') || cell.ends_with("0500");
            assert_eq!(
                time_after_date(cell).map(|c| c.zoned),
                timed.then_some(zoned),
                "{cell}"
            );
            assert_eq!(parse_label(cell), date_of(2024, 3, 31), "{cell}");
            assert_eq!(time_after_date(cell).is_some(), timed, "{cell}");
        }
        assert_eq!(
            parse_label("31/03/2024 14:32"),
            Some(Label::TwoWay {
                a: 31,
                b: 3,
                year: 2024
            })
        );
        // Not a time: a month with a time, hours past 23, a stray word.
        for cell in [
            "2024-03 14:30",
            "2024-03-31 24:10",
            "2024-03-31 14:3",
            "2024-03-31 noon",
        ] {
            assert_eq!(parse_label(cell), None, "{cell}");
            assert!(time_after_date(cell).is_none(), "{cell}");
        }
    }

    #[test]
    fn two_way_dates_wait_for_the_column() {
        let two_way = |a, b, year| Some(Label::TwoWay { a, b, year });
        assert_eq!(parse_label("31/03/2024"), two_way(31, 3, 2024));
        assert_eq!(parse_label("03-31-24"), two_way(3, 31, 2024));
        assert_eq!(parse_label("05.06.99"), two_way(5, 6, 1999));
        assert_eq!(parse_label("31/31/2024"), None);
    }

    #[test]
    fn month_forms() {
        for cell in [
            "2024-03",
            "2024/03",
            "03/2024",
            "Mar 2024",
            "march 2024",
            "2024 Mar",
            "Mar-24",
            "MAR. 2024",
        ] {
            assert_eq!(parse_label(cell), month_of(2024, 3), "{cell}");
        }
        // A number to a cell; only a column makes it a month (period.rs).
        assert_eq!(parse_label("03.2024"), None);
        assert_eq!(parse_label("Sept 2024"), month_of(2024, 9));
        assert_eq!(parse_label("2024-13"), None);
        assert_eq!(parse_label("24-Mar"), None);
    }

    #[test]
    fn named_dates() {
        for cell in ["31 Mar 2024", "31-Mar-24", "Mar 31, 2024", "March 31 2024"] {
            assert_eq!(parse_label(cell), date_of(2024, 3, 31), "{cell}");
        }
    }

    #[test]
    fn quarters_weeks_and_integers() {
        let q1 = Some(Label::Quarter {
            year: 2024,
            quarter: 1,
        });
        for cell in ["2024 Q1", "2024-Q1", "2024Q1", "Q1 2024", "q1-24"] {
            assert_eq!(parse_label(cell), q1, "{cell}");
        }
        assert_eq!(parse_label("2024 Q5"), None);
        let w5 = Some(Label::Week {
            year: 2024,
            week: 5,
        });
        for cell in ["2024-W05", "2024W05", "2024 W5", "W05 2024"] {
            assert_eq!(parse_label(cell), w5, "{cell}");
        }
        // ISO 8601: 2020 has 53 weeks, 2024 has 52 (calendar facts, common practice).
        assert!(parse_label("2020-W53").is_some());
        assert_eq!(parse_label("2024-W53"), None);
        assert_eq!(parse_label("2024"), Some(Label::Integer(2024)));
        assert_eq!(parse_label("Sales"), None);
        assert_eq!(parse_label("12.5"), None);
        assert_eq!(parse_label("-5"), None);
    }
}
