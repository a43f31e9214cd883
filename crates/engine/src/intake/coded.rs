//! A header that names the items by number codes over a period column (`month,1001,1002`,
//! the shape of an export whose products are numbered): the header rule takes no record whose
//! cells read as numbers for a header, so such a file was read headerless and refused at its
//! first cell ("month" is no period), with the items called "Series 1", "Series 2". Found
//! before the header rule, as [`super::across`] is; the table is then read as a wide one whose
//! items are named by their codes, and the report says so.
//!
//! Kept apart from: the header and layout rules ([`super::table`] asks [`header_at`] first)
//! and reading the cells (the same number and period rules as every table).
//!
//! Rule: the first record that reads as data is such a header when its first cell names a
//! period and no item or quantity ("month", "Date", "Week starting"); its other non-empty
//! cells, at least two, are whole numbers written with digits only that all differ; none of
//! them reads as a calendar number (a year from 1900 to 2100, a year and month 202401, a date
//! 20240131: periods across, as in a month-by-year grid) and they are not a run 0, 1, 2, ...
//! or 1, 2, 3, ... up to at most 53 (days of the month, hours, weekdays, weeks across: a
//! calendar grid); and the next record starts with a period other than a plain number and
//! holds numbers or "no value" markers in every other filled cell. Anything else stays as
//! before: a first data row with a mistyped period keeps its error (its first cell names no
//! period), and a header of calendar numbers is refused at its first cell, not read as items
//! (a review of 2026-12-03 found `month,1,2,...,31` over months read as 31 items "1".."31").

use super::label::{parse_label, Family};
use super::number::{is_missing, looks_number};
use super::table::{header_says, whole_number, ITEM_WORDS, PERIOD_WORDS, QUANTITY_WORDS};
use super::text::Record;

/// The index in `candidates` of a header naming items by number codes, given the table's test
/// of a data record; `None` when the first data-like record is not one.
pub(crate) fn header_at(
    records: &[Record],
    candidates: &[usize],
    data_like: impl Fn(&Record) -> bool,
) -> Option<usize> {
    let k = candidates.iter().position(|&i| data_like(&records[i]))?;
    let record = &records[candidates[k]];
    let first = record.cells.first()?;
    let codes = codes(record);
    let mut values: Vec<u64> = codes.iter().filter_map(|c| c.parse().ok()).collect();
    values.sort_unstable();
    values.dedup();
    let next = records.get(*candidates.get(k + 1)?)?;
    let (lead, cells) = next.cells.split_first()?;
    let dated_below = parse_label(lead).is_some_and(|l| l.family() != Family::Integer);
    let numbers_below = cells
        .iter()
        .all(|c| c.is_empty() || looks_number(c) || is_missing(c));
    let names_period = header_says(first, &PERIOD_WORDS)
        && !header_says(first, &ITEM_WORDS)
        && !header_says(first, &QUANTITY_WORDS);
    let coded = names_period
        && codes.len() >= 2
        && codes.iter().all(|c| whole_number(c))
        && values.len() == codes.len()
        && !codes.iter().any(|c| calendar_number(c))
        && !calendar_run(&values)
        && dated_below
        && numbers_below
        && data_like(next);
    coded.then_some(k)
}

/// A year from 1900 to 2100, a year and month (202401) or a date (20240131) written as digits.
fn calendar_number(cell: &str) -> bool {
    let part = |range: std::ops::Range<usize>| cell.get(range).and_then(|p| p.parse::<u32>().ok());
    let year = part(0..4).is_some_and(|y| (1900..=2100).contains(&y));
    let month = || part(4..6).is_some_and(|m| (1..=12).contains(&m));
    let day = || part(6..8).is_some_and(|d| (1..=31).contains(&d));
    match cell.len() {
        4 => year,
        6 => year && month(),
        8 => year && month() && day(),
        _ => false,
    }
}

/// Whether sorted distinct `values` run 0, 1, 2, ... or 1, 2, 3, ... without a gap, up to at
/// most 53: the days, hours, weekdays or weeks of a calendar grid.
fn calendar_run(values: &[u64]) -> bool {
    let Some(&start) = values.first() else {
        return false;
    };
    start <= 1
        && values.last().is_some_and(|&last| last <= 53)
        && values.iter().zip(start..).all(|(v, want)| *v == want)
}

/// The codes of a header found by [`header_at`]: its non-empty cells after the first.
pub(crate) fn codes(header: &Record) -> Vec<&str> {
    header
        .cells
        .iter()
        .skip(1)
        .map(String::as_str)
        .filter(|c| !c.is_empty())
        .collect()
}
