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
//! period and no item or quantity ("month", "Date", "Week starting"), every other non-empty cell (at least
//! one) is a whole number written with digits only, those all differ and are not all
//! four-digit numbers from 1900 to 2100 (years across: a month-by-year grid, or a mistyped
//! row of a table without a header), and the next record starts with a period other than a
//! plain number and reads as data. A first data row with a mistyped period keeps its error:
//! its first cell names no period.

use super::label::{parse_label, Family};
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
    let (first, rest) = records[candidates[k]].cells.split_first()?;
    let codes: Vec<&str> = rest
        .iter()
        .map(String::as_str)
        .filter(|c| !c.is_empty())
        .collect();
    let mut distinct = codes.clone();
    distinct.sort_unstable();
    distinct.dedup();
    let year_like =
        |c: &&str| c.len() == 4 && c.parse::<u32>().is_ok_and(|y| (1900..=2100).contains(&y));
    let next = records.get(*candidates.get(k + 1)?)?;
    let dated_below = next
        .cells
        .first()
        .and_then(|c| parse_label(c))
        .is_some_and(|l| l.family() != Family::Integer);
    let names_period = header_says(first, &PERIOD_WORDS)
        && !header_says(first, &ITEM_WORDS)
        && !header_says(first, &QUANTITY_WORDS);
    let coded = names_period
        && !codes.is_empty()
        && codes.iter().all(|c| whole_number(c))
        && distinct.len() == codes.len()
        && !codes.iter().all(year_like)
        && dated_below
        && data_like(next);
    coded.then_some(k)
}

/// The codes of a header found by [`header_at`], for the report.
pub(crate) fn codes(header: &Record) -> Vec<&str> {
    header
        .cells
        .iter()
        .skip(1)
        .map(String::as_str)
        .filter(|c| !c.is_empty())
        .collect()
}
