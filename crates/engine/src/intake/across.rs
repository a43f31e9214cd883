//! Periods across the header: one row per item, one column per period (`item,2023-01,
//! 2023-02,...`), the shape of many sales reports. The header's first cells name the item
//! columns; from the first cell that reads as a period on, each column whose header holds a
//! digit is a period column (a header that does not read as a period is an error at the
//! header line, in [`super::build`]), and one without a digit ("Total") is not used, with a
//! warning.
//!
//! Kept apart from: the other layouts ([`super::table`] asks [`header_at`] before its own
//! header rule, since such a header reads as data there) and building the items (the
//! builder's `across`, which reads the header's periods and each row's values with the same
//! number, period, gap and error rules as the other layouts).
//!
//! Rule: a record is a header across when its first cell is not a number or a period (it
//! names the item column, or is blank), at least two later cells read as periods (one family of labels other than plain
//! numbers, or four-digit years following each other closely), those are more than half of its
//! later non-empty cells and all differ, and the next record is data without being such a
//! header itself (a table whose rows each hold two dates is not periods across).

use super::label::{parse_label, Family};
use super::number::looks_number;
use super::period::{integer_meaning, strong_family, IntegerMeaning};
use super::table::{header_says, whole_number, Plan, Table};
use super::text::Record;
use super::{Layout, RowError};

/// The number of item columns when `record` is a header across, else `None`.
fn item_columns(record: &Record) -> Option<usize> {
    let cells: Vec<&str> = record.cells.iter().map(String::as_str).collect();
    let first = *cells.first()?;
    if looks_number(first) || parse_label(first).is_some() {
        return None;
    }
    let is_period = |c: &&str| parse_label(c).is_some_and(|l| l.family() != Family::Integer);
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
    let labelled = strong_family(&rest).is_some()
        || integer_meaning(&rest, true) == Some(IntegerMeaning::Years);
    let mut distinct = rest.clone();
    distinct.sort_unstable();
    distinct.dedup();
    (lead >= 1 && rest.len() >= 2 && labelled && distinct.len() == rest.len()).then_some(lead)
}

/// Of `candidates` (indexes into `records`, non-blank, in order), the position of a header
/// across whose next record is data (see the module doc), given `data_like`, the table's
/// test of a data record. Only records above any data count.
pub(crate) fn header_at(
    records: &[Record],
    candidates: &[usize],
    data_like: impl Fn(&Record) -> bool,
) -> Option<usize> {
    for (k, &i) in candidates.iter().enumerate() {
        if item_columns(&records[i]).is_some() {
            let next = candidates.get(k + 1).map(|&n| &records[n]);
            let data_below = next.is_some_and(|r| data_like(r) && item_columns(r).is_none());
            return data_below.then_some(k);
        }
        if data_like(&records[i]) {
            return None;
        }
    }
    None
}

/// Whether a row label names a part of a year rather than an item: a month name, a quarter
/// (Q1 to Q4), or, when `numbered` (the column's header says month, quarter or week), a whole
/// number from 1 to 53.
fn names_part_of_year(cell: &str, numbered: bool) -> bool {
    let cell = cell.trim();
    if whole_number(cell) {
        return numbered && cell.parse::<u32>().is_ok_and(|n| (1..=53).contains(&n));
    }
    parse_label(&format!("2000 {cell}"))
        .is_some_and(|l| matches!(l.family(), Family::Month | Family::Quarter))
}

/// The plan of a table whose header runs across (see the module doc). A grid of years across
/// and months, quarters or weeks down (`month,2022,2023` over `Jan`, `Feb`, ...) is refused:
/// read as items it would make twelve yearly items of one item's months.
pub(crate) fn plan(table: &Table) -> Result<Plan, RowError> {
    let header = table
        .header
        .as_ref()
        .expect("a table across has the header it was found by");
    let lead = item_columns(header).unwrap_or(1);
    let header_cell = |j: usize| header.cells.get(j).map_or("", String::as_str);
    let rows = table.fitting_rows();
    let years_across = header.cells[lead..]
        .iter()
        .filter(|c| !c.is_empty())
        .all(|c| parse_label(c).is_some_and(|l| l.family() == Family::Integer));
    let labels = table.column(0, &rows);
    let numbered = header_says(header_cell(0), &["month", "quarter", "qtr", "week", "wk"]);
    let parts = labels
        .iter()
        .filter(|c| names_part_of_year(c, numbered))
        .count();
    if years_across && lead == 1 && parts * 2 > labels.len() {
        return Err(RowError {
            row: header.line,
            column: table.column_name(0),
            text: header_cell(0).to_string(),
            message: "expected one row per item; here the columns are years and the rows parts \
                      of a year (months, quarters or weeks) of one item: write one row per \
                      period (e.g. 2023-01,5), or year, month and quantity columns"
                .to_string(),
        });
    }
    let holds_values = |j: usize| table.column(j, &rows).iter().any(|c| !c.is_empty());
    let mut values = Vec::new();
    let mut ignored = Vec::new();
    let mut empty = Vec::new();
    for j in lead..table.width {
        let cell = header_cell(j);
        if cell.chars().any(|c| c.is_ascii_digit()) {
            values.push(j);
        } else if holds_values(j) {
            ignored.push(j);
        } else {
            empty.push(j);
        }
    }
    Ok(Plan {
        layout: Layout::Across,
        period: None,
        item_columns: (0..lead).collect(),
        values,
        ignored,
        empty,
        codes: Vec::new(),
        row_numbers: Vec::new(),
        split: None,
    })
}
