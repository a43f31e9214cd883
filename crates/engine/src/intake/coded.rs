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
//! cells, at least two, all differ and are whole numbers written with digits only, or names
//! that read as no number or period ("SKU-00123", "Frost cloth" beside "00124"), at least one
//! of them a number (else the header rule takes the record); none of the numbers reads as a
//! calendar number (a year from 1900 to 2100, a year and month 202401, a date
//! 20240131: periods across, as in a month-by-year grid) and they are not a run 0, 1, 2, ...
//! or 1, 2, 3, ... up to at most 53 (days of the month, hours, weekdays, weeks across: a
//! calendar grid); and the next record starts with a period other than a plain number and
//! holds numbers or "no value" markers in every other filled cell. Anything else stays as
//! before: a first data row with a mistyped period keeps its error (its first cell names no
//! period), and a header of calendar numbers is refused at its first cell, not read as items
//! (a review of 2026-12-03 found `month,1,2,...,31` over months read as 31 items "1".."31").

use super::frame::all_distinct;
use super::headers::{header_says, ITEM_WORDS, PERIOD_WORDS, QUANTITY_WORDS};
use super::label::{parse_label, Family};
use super::number::{is_missing, looks_number};
use super::table::whole_number;
use super::text::Record;
use crate::sorting;

/// The index in `candidates` of a header naming items by number codes, given the table's test
/// of a data record; `None` when neither the first data-like record (codes alone read as data)
/// nor the record above it (codes beside names) is one.
pub(crate) fn header_at(
    records: &[Record],
    candidates: &[usize],
    data_like: impl Fn(&Record) -> bool,
) -> Option<usize> {
    let k = candidates.iter().position(|&i| data_like(&records[i]))?;
    let coded_at = |h: usize| {
        let next = candidates.get(h + 1).and_then(|&i| records.get(i));
        next.is_some_and(|next| coded(&records[candidates[h]], next, &data_like))
    };
    if coded_at(k) {
        Some(k)
    } else {
        k.checked_sub(1).filter(|&h| coded_at(h))
    }
}

/// Whether `record` is a header of item codes over `next`, a row of data.
fn coded(record: &Record, next: &Record, data_like: &impl Fn(&Record) -> bool) -> bool {
    let Some(first) = record.cells.first() else {
        return false;
    };
    let header_cells = item_cells(record);
    let codes = codes(record);
    let mut values: Vec<u64> = codes.iter().filter_map(|c| c.parse().ok()).collect();
    sorting::sort(&mut values);
    values.dedup();
    // Names beside the codes ("00124" beside "Frost cloth"): cells that read as nothing else.
    let named = |c: &&str| !looks_number(c) && parse_label(c).is_none();
    let Some((lead, cells)) = next.cells.split_first() else {
        return false;
    };
    let dated_below = parse_label(lead).is_some_and(|l| l.family() != Family::Integer);
    let numbers_below = cells
        .iter()
        .all(|c| c.is_empty() || looks_number(c) || is_missing(c));
    let names_period = header_says(first, &PERIOD_WORDS)
        && !header_says(first, &ITEM_WORDS)
        && !header_says(first, &QUANTITY_WORDS);
    names_period
        && header_cells.len() >= 2
        && !codes.is_empty()
        && header_cells.iter().all(|c| whole_number(c) || named(c))
        && all_distinct(&header_cells)
        && values.len() == codes.len()
        && !codes.iter().any(|c| calendar_number(c))
        && !calendar_run(&values)
        && dated_below
        && numbers_below
        && data_like(next)
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

/// A header's item cells: its non-empty cells after the first.
fn item_cells(header: &Record) -> Vec<&str> {
    header
        .cells
        .iter()
        .skip(1)
        .map(String::as_str)
        .filter(|c| !c.is_empty())
        .collect()
}

/// The codes of a header found by [`header_at`]: its item cells written as whole numbers.
pub(crate) fn codes(header: &Record) -> Vec<&str> {
    item_cells(header)
        .into_iter()
        .filter(|c| whole_number(c))
        .collect()
}
