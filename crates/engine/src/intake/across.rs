//! Periods across the header: one row per item, one column per period (`item,2023-01,
//! 2023-02,...`), the shape of many sales reports. The header's first cells name the item
//! columns; from the first cell that reads as a period on, each column whose header reads as
//! a period, or as a period of another kind (an error at the header line, in
//! [`super::build`]), is a period column, and one whose header is a word ("Total", "Total
//! 2023") is not used, with a warning. The first column names the items; a later one before
//! the periods joins the name ("sku,name,...") unless it holds numbers under a header that
//! names no item (a price, a row total): then it is left out with a warning.
//!
//! Kept apart from: the other layouts ([`super::table`] asks [`header_at`] before its own
//! header rule, since such a header reads as data there) and building the items (the
//! builder's `across`, which reads the header's periods and each row's values with the same
//! number, period, gap and error rules as the other layouts).
//!
//! Rule: a record is a header across when its first cell is not a number or a period (it
//! names the item column, or is blank), at least two later cells read as periods (one family
//! of labels other than plain numbers, or four-digit years following each other closely),
//! those are more than half of its later non-empty cells and all differ, no later cell is
//! digits that read as no period (a quantity: the record is data), no record above reads as
//! data or a header while filling half as many cells or more (a title line fills fewer), and
//! the next record starts with no period, without being such a header itself (a table whose
//! rows each hold two dates is not periods across), and it or one of the two after it is data
//! (a bad cell in the first row keeps it from reading as data: it is reported at its cell).

use super::frame::Table;
use super::headers::{header_says, ITEM_WORDS, PERIOD_WORDS};
use super::label::{calendar_name, parse_label, Family};
use super::number::looks_number;
use super::period::{dotted_month, integer_meaning, mostly, strong_family, IntegerMeaning};
use super::table::{names_item, whole_number, Plan};
use super::text::Record;
use super::RowError;
use crate::sorting;

/// The number of item columns when `record` is a header across, else `None`.
fn item_columns(record: &Record) -> Option<usize> {
    let cells: Vec<&str> = record.cells.iter().map(String::as_str).collect();
    let first = *cells.first()?;
    if looks_number(first) || parse_label(first).is_some() {
        return None;
    }
    let is_period = |c: &&str| {
        parse_label(c).is_some_and(|l| l.family() != Family::Integer) || dotted_month(c).is_some()
    };
    let lead = cells.iter().position(is_period).or_else(|| {
        cells
            .iter()
            .position(|c| c.len() == 4 && whole_number(c))
            .filter(|k| *k > 0)
    })?;
    let rest: Vec<&str> = cells[lead..]
        .iter()
        .copied()
        .filter(|c| !c.is_empty())
        .collect();
    // The period cells: labels, or four-digit years. A cell of digits that is neither (a
    // quantity, "2023-13") makes the record a data row; a word ("Total", "Total 2023") is a
    // column to leave out.
    if rest.iter().any(|c| numeric_junk(c)) {
        return None;
    }
    let labels: Vec<&str> = rest.iter().copied().filter(|c| names_period(c)).collect();
    let periods = strong_family(&labels).is_some()
        || mostly(&labels, dotted_month)
        || (labels.iter().all(|c| c.len() == 4 && whole_number(c))
            && integer_meaning(&labels, true) == Some(IntegerMeaning::Years));
    let mut distinct = labels.clone();
    sorting::sort(&mut distinct);
    distinct.dedup();
    let mostly = labels.len() * 2 > rest.len();
    (lead >= 1 && labels.len() >= 2 && periods && mostly && distinct.len() == labels.len())
        .then_some(lead)
}

/// A header cell across that names a period: a period label, a month written `03.2024`, or a
/// four-digit whole number.
fn names_period(cell: &str) -> bool {
    parse_label(cell).is_some_and(|l| l.family() != Family::Integer)
        || dotted_month(cell).is_some()
        || (cell.len() == 4 && whole_number(cell))
}

/// A header cell that holds a year among letters but reads as no period and names no total
/// ("Mär 2024", a month in another language): an error at the header, not a column left out
/// with its demand ("Total 2023" is left out).
fn unread_period(cell: &str) -> bool {
    let year = cell
        .split(|c: char| !c.is_ascii_digit())
        .any(|run| run.len() == 4 && (run.starts_with("19") || run.starts_with("20")));
    year && !header_says(cell, &["total", "totals", "sum", "all", "grand", "ytd"])
}

/// A cell of digits without letters that names no period: a quantity, or a mistyped period.
fn numeric_junk(cell: &str) -> bool {
    cell.bytes().any(|b| b.is_ascii_digit())
        && !cell.chars().any(char::is_alphabetic)
        && !names_period(cell)
}

/// Of `candidates` (indexes into `records`, non-blank, in order), the position of a header
/// across whose next record is data not starting with a period (see the module doc), given
/// the table's tests of a data record and of a header. Records above it may only be titles:
/// a record above that reads as data or as a header and fills half as many cells or more
/// belongs to a table of its own shape (a header of names above rows of dates is no header
/// across), one that fills fewer is a title line ("Garden Co,Sales report").
pub(crate) fn header_at(
    records: &[Record],
    candidates: &[usize],
    data_like: impl Fn(&Record) -> bool,
    header_like: impl Fn(&Record) -> bool,
) -> Option<usize> {
    let k = candidates
        .iter()
        .position(|&i| item_columns(&records[i]).is_some())?;
    let filled = records[candidates[k]].filled();
    let blocked = candidates[..k].iter().any(|&i| {
        let r = &records[i];
        (data_like(r) || header_like(r)) && r.filled() * 2 >= filled
    });
    // The next record is a row of the table (a bad cell may keep it from reading as data:
    // then one of the two after it must).
    let next = candidates.get(k + 1).map(|&n| &records[n]);
    let data_below = next.is_some_and(|r| {
        let first = r.cells.first().map_or("", String::as_str);
        item_columns(r).is_none()
            && parse_label(first).is_none_or(|l| l.family() == Family::Integer)
    }) && candidates
        .iter()
        .skip(k + 1)
        .take(3)
        .any(|&n| data_like(&records[n]));
    (!blocked && data_below).then_some(k)
}

/// Whether the rows of item column `j` name periods rather than items: its header says a
/// period (date, month, week, ...) and no item, or most of its labels read as periods or
/// calendar names (Jan, Mon, Q1, W5), or, under a blank or period header, as numbers from 1
/// to 53 (months, quarters or weeks counted).
fn rows_are_periods(table: &Table, rows: &[&Record], j: usize) -> bool {
    let header = table.header.as_ref().and_then(|h| h.cells.get(j));
    let name = header.map_or("", String::as_str);
    let period_named = header_says(name, &PERIOD_WORDS) && !header_says(name, &ITEM_WORDS);
    let numbered = name.trim().is_empty() || period_named;
    let labels: Vec<&str> = table
        .column(j, rows)
        .into_iter()
        .filter(|c| !c.is_empty())
        .collect();
    let periodic = labels
        .iter()
        .filter(|c| {
            calendar_name(c)
                || parse_label(c).is_some_and(|l| l.family() != Family::Integer)
                || (numbered
                    && whole_number(c)
                    && c.parse::<u32>().is_ok_and(|n| (1..=53).contains(&n)))
        })
        .count();
    period_named || (!labels.is_empty() && periodic * 2 > labels.len())
}

/// The plan of a table whose header runs across (see the module doc). Rows that name periods
/// (`month,2022,2023` over `Jan`, `Feb`, ...: a grid of one item's values) are refused: read
/// as items they would make each month an item of yearly values.
pub(crate) fn plan(table: &Table) -> Result<Plan, RowError> {
    let header = table
        .header
        .as_ref()
        .expect("a table across has the header it was found by");
    let lead = item_columns(header).unwrap_or(1);
    let header_cell = |j: usize| header.cells.get(j).map_or("", String::as_str);
    let rows = table.fitting_rows();
    let holds_values = |j: usize| table.column(j, &rows).iter().any(|c| !c.is_empty());
    let mut values = Vec::new();
    let mut ignored = Vec::new();
    let mut empty = Vec::new();
    // The first column names the items; a later one before the periods that holds numbers
    // (a price, a total) and whose header names no item is left out, so a price change does
    // not split an item's history.
    let mut item_columns = vec![0];
    for j in 1..lead {
        let cells: Vec<&str> = table
            .column(j, &rows)
            .into_iter()
            .filter(|c| !c.is_empty())
            .collect();
        let numbers = cells.iter().filter(|c| looks_number(c)).count();
        if !cells.is_empty() && numbers * 2 >= cells.len() && !names_item(table, j) {
            ignored.push(j);
        } else {
            item_columns.push(j);
        }
    }
    // A later column of weekdays or months beside item names that never repeat is a detail
    // of each item, left out; where the names repeat, it tells one item's rows apart by period,
    // and the table is a grid of those items' values (refused below).
    let names = table.column(0, &rows);
    let mut distinct = names.clone();
    sorting::sort(&mut distinct);
    distinct.dedup();
    let unique_names = distinct.len() == names.len();
    let details: Vec<usize> = item_columns
        .iter()
        .copied()
        .filter(|j| *j > 0 && unique_names && rows_are_periods(table, &rows, *j))
        .collect();
    item_columns.retain(|j| !details.contains(j));
    ignored.extend(details);
    if let Some(j) = item_columns
        .iter()
        .copied()
        .find(|j| rows_are_periods(table, &rows, *j))
    {
        return Err(RowError {
            row: header.line,
            column: table.column_name(j),
            text: header_cell(j).to_string(),
            message: "expected one row per item below periods across the header; these rows \
                      name periods (months, weeks, dates, ...), so the table is a grid of one \
                      item's values: write one row per period (e.g. 2023-01,5), or year, month \
                      and quantity columns"
                .to_string(),
        });
    }
    for j in lead..table.width {
        let cell = header_cell(j);
        if names_period(cell)
            || parse_label(cell).is_some()
            || numeric_junk(cell)
            || unread_period(cell)
        {
            values.push(j);
        } else if holds_values(j) {
            ignored.push(j);
        } else {
            empty.push(j);
        }
    }
    Ok(Plan::across(item_columns, values, ignored, empty))
}
