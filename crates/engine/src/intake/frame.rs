//! Records to a table's frame: title lines, the header, the data rows, and a row wider than
//! the header. The [`Table`] the layout rules (`table`) and the shapes of hand-made reports
//! (`shapes`) read.
//!
//! Kept apart from: the role of each column and the layout (`table`), and reading cell values
//! (numbers in [`super::number`], periods in [`super::period`]).
//!
//! Header rule: a header-like record has no cell that reads as a number or a period, and at
//! least one cell (two in a table of two or more columns, not counting columns empty in every
//! record, as a delimiter at the end of every line makes) that names something: not empty and
//! not a "no value" marker such as `n/a` (a first data row of a bad period and an `n/a` is not
//! a header); and none of its cells stands again further down the same column (that is an item
//! name of a long table, so the record is a data row), except in a record that repeats it
//! whole (a header repeated where exports were joined: those records are left out of the
//! rows, with a warning). A blank first cell over a named rest is header-like too (`,sales`,
//! the corner over an index a data tool wrote). A data-like record has at least half of
//! its non-empty cells, and at least one, reading as numbers, periods or "no value" markers
//! (which stand where a quantity would). Among the first six
//! records, the header is the last header-like record above the first data-like record; the
//! records between the two are data rows whose bad cells are reported (a first row with a bad
//! cell is a data row with an error, never a title). In a one-column text nothing tells a title
//! from a header, or a header from a word in the first data cell, so there the header is the
//! first header-like record and everything below it is data. When there is no header, the data
//! starts at the first record with a cell that reads as a number, a period or a "no value"
//! marker, or that stands again further down its column; so a headerless first row whose only
//! cell is unreadable ("13/13/2024" alone) is a title line, with its warning. When none of the
//! six is data-like, the header is the first header-like record, and without one the data
//! starts as above. Records above the header, or above the data when there is no header, are
//! title lines: reported as warnings, not read.

use super::number::{is_missing, looks_number};
use super::text::{mode_of, Record};
use super::RowError;
use crate::sorting;

/// How far down a header or title line is looked for.
const HEADER_SEARCH: usize = 6;

/// A table: title lines, optional header, and data rows (blank records inside the data kept).
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Table {
    pub titles: Vec<Record>,
    pub header: Option<Record>,
    /// Lines further down that repeat the header cell for cell (files joined from several
    /// exports): left out of the rows; the report says so.
    pub repeated_headers: Vec<usize>,
    /// Whether the header runs across: its cells past the item columns are periods
    /// ([`super::across`]).
    pub across: bool,
    /// Whether the header names the items by number codes over a period column
    /// ([`super::coded`]).
    pub coded: bool,
    pub rows: Vec<Record>,
    pub width: usize,
    /// Whether the cells are split at commas, where a decimal comma or a thousands comma
    /// splits a number in two unless quoted (the hints of [`wide_row_error`]); set by the
    /// caller, which chose the delimiter.
    pub comma_delimited: bool,
}

impl Table {
    /// The name used for column `index` in reports: the header text, or "column N".
    pub fn column_name(&self, index: usize) -> String {
        self.header
            .as_ref()
            .and_then(|h| h.cells.get(index))
            .filter(|c| !c.is_empty())
            .cloned()
            .unwrap_or_else(|| format!("column {}", index + 1))
    }

    /// The cells of column `index` over the rows that fit the table's width.
    pub fn column<'a>(&'a self, index: usize, rows: &[&'a Record]) -> Vec<&'a str> {
        rows.iter()
            .map(|r| r.cells.get(index).map_or("", String::as_str))
            .collect()
    }

    /// Non-blank data rows with no non-empty cell beyond the table's width.
    pub fn fitting_rows(&self) -> Vec<&Record> {
        self.rows
            .iter()
            .filter(|r| !r.is_blank() && overflow(r, self.width).is_none())
            .collect()
    }
}

/// The first non-empty cell beyond `width`, as (column index, text).
fn overflow(record: &Record, width: usize) -> Option<(usize, &str)> {
    record
        .cells
        .iter()
        .enumerate()
        .skip(width)
        .find(|(_, c)| !c.is_empty())
        .map(|(i, c)| (i, c.as_str()))
}

/// The error for a row with a cell beyond the table's width (the header's, when there is
/// one), at that cell; `None` when the row fits.
pub(crate) fn wide_row_error(table: &Table, row: &Record) -> Option<RowError> {
    let (column, text) = overflow(row, table.width)?;
    let hint = if !table.comma_delimited {
        ""
    } else if text.chars().all(|c| c.is_ascii_digit()) && text.len() == 3 {
        "; a number whose thousands separator is also the delimiter must be quoted, like \
         \"1,200\""
    } else if looks_number(text) {
        "; a number whose decimal comma is also the delimiter must be quoted, like \"12,5\" (or \
         the file saved with semicolons), and a column the header does not name needs a name \
         there"
    } else {
        ""
    };
    let named_by = if table.header.is_some() {
        "as the header names"
    } else {
        "as in the rest of the table"
    };
    Some(RowError {
        row: row.line,
        column: table.column_name(column),
        text: text.to_string(),
        message: format!(
            "expected at most {} cells in a row, {named_by}; this row has {} and was not \
             read{hint}",
            table.width,
            row.cells.len()
        ),
    })
}

/// The most common width; ties go to the narrower, so one over-long row among two does not
/// widen the table and pass unreported.
fn mode_preferring_narrow(widths: &[usize]) -> (usize, usize) {
    let mut sorted = widths.to_vec();
    sorting::sort(&mut sorted);
    let mut best = (0usize, 0usize);
    for run in sorted.chunk_by(|a, b| a == b) {
        if run.len() > best.1 {
            best = (run[0], run.len());
        }
    }
    best
}

pub(super) fn all_distinct(cells: &[&str]) -> bool {
    let mut filled: Vec<&str> = cells.iter().copied().filter(|c| !c.is_empty()).collect();
    let count = filled.len();
    sorting::sort(&mut filled);
    filled.dedup();
    count >= 2 && filled.len() == count
}

fn reads_as_data(cell: &str) -> bool {
    looks_number(cell) || super::label::parse_label(cell).is_some()
}

/// A cell that reads as a number or a period, or a "no value" marker standing in for one.
fn data_or_gap(cell: &str) -> bool {
    !cell.is_empty() && (reads_as_data(cell) || is_missing(cell))
}

fn data_like(record: &Record) -> bool {
    let filled = record.filled();
    let data = record.cells.iter().filter(|c| data_or_gap(c)).count();
    data > 0 && data * 2 >= filled
}

/// A cell that names something: not empty, and not a "no value" marker such as `n/a`.
fn names(cell: &str) -> bool {
    !cell.is_empty() && !is_missing(cell)
}

/// A header-like record names at least two columns (one in a one-column table), or every
/// column but a blank first one: the corner over a column of row numbers, as data tools
/// write an unnamed index (`,sales`).
fn header_like(record: &Record, width: usize) -> bool {
    let named = record.cells.iter().filter(|c| names(c)).count();
    let blank_corner = width >= 2
        && record.cells.first().is_some_and(|c| c.is_empty())
        && record
            .cells
            .iter()
            .skip(1)
            .take(width - 1)
            .all(|c| names(c));
    (named >= width.clamp(1, 2) || blank_corner)
        && record
            .cells
            .iter()
            .all(|c| c.is_empty() || !reads_as_data(c))
}

/// Whether a cell of `records[at]` also stands in its column further down: an item name, so
/// the record is a row of a long table rather than its header. A record repeated whole further
/// down does not count: that is a header repeated where exports were joined.
fn repeats_below(records: &[Record], at: usize) -> bool {
    let cells = &records[at].cells;
    records[at + 1..].iter().any(|r| {
        !same_cells(r, &records[at])
            && r.cells
                .iter()
                .zip(cells)
                .any(|(below, cell)| names(cell) && below == cell)
    })
}

/// Whether two records hold the same cells, empty cells at the end aside, two or more of them
/// filled (one word repeated in one column is a bad cell, not a repeated header).
fn same_cells(a: &Record, b: &Record) -> bool {
    let (na, nb) = (a.filled_width(), b.filled_width());
    na == nb && a.filled() >= 2 && a.cells[..na] == b.cells[..nb]
}

/// Splits records into titles, header and data rows; leading and trailing blank records go.
pub(crate) fn shape(records: Vec<Record>) -> Table {
    let mut records: Vec<Record> = records;
    while records.last().is_some_and(Record::is_blank) {
        records.pop();
    }
    let first = records
        .iter()
        .position(|r| !r.is_blank())
        .unwrap_or(records.len());
    records.drain(..first);
    let widths: Vec<usize> = records
        .iter()
        .filter(|r| !r.is_blank())
        .map(|r| r.cells.len())
        .collect();
    // Columns empty in every record (a delimiter at the end of every line) do not count.
    let used = records.iter().map(Record::filled_width).max().unwrap_or(0);
    let mode_width = mode_of(&widths).0.min(used);
    let non_blank: Vec<usize> = (0..records.len())
        .filter(|i| !records[*i].is_blank())
        .collect();
    let window: Vec<usize> = non_blank.iter().take(HEADER_SEARCH).copied().collect();
    let header_like_at =
        |i: &&usize| header_like(&records[**i], mode_width) && !repeats_below(&records, **i);
    // A header of periods reads as data here: it is looked for first.
    let across_at =
        super::across::header_at(&records, &window, data_like, |r| header_like(r, mode_width));
    // So does a header of item codes over a period column.
    let coded_at = match across_at {
        Some(_) => None,
        None => super::coded::header_at(&records, &window, data_like),
    };
    let data_at = match across_at.or(coded_at) {
        Some(k) => Some(k + 1),
        None => window.iter().position(|i| data_like(&records[*i])),
    };
    let above = &window[..data_at.unwrap_or(window.len())];
    let header_at = match (across_at.or(coded_at), data_at) {
        (Some(k), _) => Some(&window[k]),
        (None, Some(_)) if mode_width >= 2 => above.iter().rfind(header_like_at),
        (None, _) => above.iter().find(header_like_at),
    }
    .copied();
    // Without a header the data starts at the first record that reads as data in part.
    let first_data = above
        .iter()
        .copied()
        .find(|i| records[*i].cells.iter().any(|c| data_or_gap(c)) || repeats_below(&records, *i))
        .or(data_at.map(|k| window[k]))
        .or(window.first().copied())
        .unwrap_or(0);
    let body_start = header_at.unwrap_or(first_data);
    let mut rest = records.split_off(body_start);
    let titles: Vec<Record> = records.into_iter().filter(|r| !r.is_blank()).collect();
    let mut header = match header_at {
        Some(_) if !rest.is_empty() => Some(rest.remove(0)),
        _ => None,
    };
    let first_row = rest
        .iter()
        .position(|r| !r.is_blank())
        .unwrap_or(rest.len());
    rest.drain(..first_row);
    // A header repeated below, and a title line repeated just above it (exports joined
    // whole), are skipped.
    let mut repeated_headers = Vec::new();
    if let Some(h) = &header {
        let filled = |r: &Record| -> Vec<String> { r.cells[..r.filled_width()].to_vec() };
        let title_texts: Vec<Vec<String>> = titles.iter().map(filled).collect();
        let mut skip = vec![false; rest.len()];
        for i in 0..rest.len() {
            if same_cells(&rest[i], h) {
                skip[i] = true;
                let above = (0..i).rev().find(|k| !rest[*k].is_blank());
                if let Some(k) = above.filter(|k| title_texts.contains(&filled(&rest[*k]))) {
                    skip[k] = true;
                }
            }
        }
        let mut index = 0;
        rest.retain(|r| {
            let skipped = skip[index];
            index += 1;
            if skipped {
                repeated_headers.push(r.line);
            }
            !skipped
        });
    }
    let data_widths: Vec<usize> = rest
        .iter()
        .filter(|r| !r.is_blank())
        .map(|r| r.cells.len())
        .collect();
    let (data_width, count) = mode_preferring_narrow(&data_widths);
    // A header one cell short over rows numbered 1, 2, 3, ... in their first cell: the row
    // names R's write.table puts first without a header cell over them. The blank corner is
    // put back, as other tools write it (`,date,value`), and the numbering column is then
    // read as such (with its warning).
    if let Some(h) = header.as_mut() {
        // The first named column must hold something other than numbers (R's dates or
        // names): under `Period,Seeds` rows `1,12,5` are a decimal comma, not row names.
        let numbered = rest
            .iter()
            .filter(|r| !r.is_blank())
            .enumerate()
            .all(|(i, r)| r.cells.first().is_some_and(|c| *c == (i + 1).to_string()))
            && rest
                .iter()
                .filter(|r| !r.is_blank())
                .any(|r| r.cells.get(1).is_some_and(|c| !looks_number(c)));
        if numbered && data_width == h.filled_width() + 1 && count == data_widths.len() {
            h.cells.insert(0, String::new());
            for (index, _) in h.untrimmed.iter_mut() {
                *index += 1;
            }
        }
    }
    // Empty cells at the end of the header name no column (a spreadsheet's trailing
    // delimiters): numbers beneath them are past the header, as in a shorter one.
    let header_width = header.as_ref().map_or(0, Record::filled_width);
    // The header fixes the width: a row with more cells than it names is an error at each
    // such row, never columns of its own. Rows wider than the header are mostly numbers
    // with a decimal comma, unquoted in a comma-separated file ("12,5" read as 12 and 5
    // would move every later number into the next item's column), or a header missing a
    // name, and which column lacks it the text cannot say. Without a header, the most
    // common width.
    let width = if header_width > 0 {
        header_width
    } else {
        data_width
    };
    let width = width.max(1);
    Table {
        titles,
        header,
        repeated_headers,
        across: across_at.is_some(),
        coded: coded_at.is_some(),
        rows: rest,
        width,
        comma_delimited: false,
    }
}
