//! Records to a table: title lines, the header, the data rows, and the role of each column
//! (period, item name, value), which fixes the layout.
//!
//! Kept apart from: reading cell values (numbers in [`super::number`], periods in
//! [`super::period`]). This module only classifies; it decides the layout from what most cells
//! of each column look like, so one bad cell does not change the layout.
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
//!
//! Layout rule: a column is a period column when more than half of its non-empty cells read as
//! one family of period labels; failing that, the first column counts when its whole numbers
//! read as years, row positions (without a header from 1; under a blank header or one naming
//! a period or a row's number from 0 or 1; under an item's name never: [`counts_rows`]) or 8-
//! or 6-digit dates ([`super::period::integer_meaning`]). Calendar details beside the period,
//! text columns of weekday or month names and number columns whose header names nothing but
//! a period ("week", "Month no"; not "Day lily" or "Year planner", items' names), are
//! neither items nor quantities ([`calendar_columns`]): left out with a warning; with no
//! period to place them they are an error at their first cell, since read in file order
//! they could misplace a period. Number columns headed by parts of what a row is (months or
//! quarters over rows of plain years, weekdays over rows of weeks) are a grid of values with
//! the calendar across the header: refused ([`calendar_grid`]). In a single or wide table, a
//! number column whose header names a price, money, an order number, a stock level or a
//! running total and nothing else
//! ([`names_money`], [`names_order_number`], [`names_no_demand`]) is no item: left out with a
//! warning. Text columns that note the periods rather than name items are left out with a
//! warning ([`notes_columns`]). The header fixes the table's width: a row with a cell past
//! it is an error ([`wide_row_error`]). A
//! column is a value column when at least half of its cells that hold something (not empty, not
//! "n/a") read as numbers, or when fewer than half of its rows hold something (an item column
//! names the item on most rows, so one word in a column of gaps is a bad quantity); otherwise it
//! is an item column.
//! Any item column makes the layout long (item, period, quantity; several item columns are
//! joined with " / "); otherwise one value column is single and several are wide. Item codes
//! written as whole numbers make item columns too, with a warning: beside a period column, the
//! number columns the header names as items (item, sku, store, ...), together, or without such
//! words the first number column not named a quantity, whose (item, period) pairs never repeat
//! and whose rows have the shape of a product list ([`codes_beside`], [`item_codes`],
//! [`codes_recur`]), and one number on every row under a header naming only an item ("Item":
//! that one item's code); beside text item names, the number columns named as
//! items or stores where the names alone repeat a period (`date,item,store,sales`;
//! [`codes_beside_names`]); in a table of numbers only, the same where the header names the
//! items and one period column (`series,t,value`; [`numbered_by_header`]); numbers that would
//! make most rows an item of their own (order or customer numbers) are not codes. A long
//! table's quantity is the number column whose header counts goods ("Qty", "Pcs", "Count"),
//! else one named a quantity ("sales"), neither naming money or a size ("Net sales", "RRP",
//! "Bag size", a currency sign), else the first that names no item, period, price or money
//! ([`quantity_among`]); the others are reported as not used. Beside a period column, a
//! number column whose header names nothing but a row's number (id, row, index) with another
//! number on every row, or a first column under a blank header whose numbers increase,
//! numbers the rows (`id,date,value`,
//! `,date,value`; [`numbers_rows`]): left out, with a warning. A column
//! named year beside one named month, quarter or week (and a day), holding years and month
//! numbers or names, quarters or weeks, make one period between them (`year,month,sales`,
//! `year,quarter,sales`; [`SplitPeriod`]), found before any other rule so that month names
//! are not taken for items.

use super::joined::{short_form_of_parts, SplitPeriod};
use super::label::{calendar_name, Family};
use super::number::{holds_currency_sign, is_missing, looks_number};
use super::period::{
    dotted_labels, dotted_month, dotted_months_close, dotted_week, integer_meaning, mostly,
    strong_family, IntegerMeaning,
};
use super::shapes::{
    calendar_grid, codes_recur, names_no_demand, notes_columns, sale_details, SaleDetail, NO_DEMAND,
};
use super::text::{mode_of, Record};
use super::words::{weekday_shortened, WEEKDAY_WORDS, WEEK_WORDS, YEAR_WORDS};
use super::year_grid::{without_a_year, Columns, YearGrid};
use super::{Layout, RowError};

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
    sorted.sort_unstable();
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
    filled.sort_unstable();
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

/// A period column's index and, when it holds whole numbers, how they are read.
pub(crate) type PeriodColumn = (usize, Option<IntegerMeaning>);

/// The role of each column, and the layout they make.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Plan {
    pub layout: Layout,
    /// The period column and, when it holds whole numbers, how they are read.
    pub period: Option<PeriodColumn>,
    /// Item-name columns (long layout only).
    pub item_columns: Vec<usize>,
    /// Value columns: one for single and long, several for wide.
    pub values: Vec<usize>,
    /// Columns with cells that no role uses (long layout extras).
    pub ignored: Vec<usize>,
    /// Columns whose cells are all empty or "n/a".
    pub empty: Vec<usize>,
    /// Item columns of whole numbers (product or store numbers) that the first look took for
    /// quantities ([`item_codes`]); the report says so.
    pub codes: Vec<usize>,
    /// Number columns named as a row's number that hold another number on every row beside a
    /// period column ([`numbers_rows`]): not read; the report says so.
    pub row_numbers: Vec<usize>,
    /// Columns of calendar details beside the period ([`calendar_columns`]): weekday or month
    /// names, a number column named only as a period ("year", "week"): not read; the report
    /// says so.
    pub calendar: Vec<usize>,
    /// Number columns of a single or wide table whose header names a price, an amount of
    /// money, an order number, a stock level or a running total ([`names_money`],
    /// [`names_order_number`], [`names_no_demand`]): not items; not read, and the report says
    /// so.
    pub not_quantities: Vec<usize>,
    /// Of those, the ones naming the money or returns of the item in another column
    /// ([`of_another`]), with that column's name: what the report says of them.
    pub of_items: Vec<(usize, OfAnother, String)>,
    /// Text columns beside one row per period that note the periods ("ok", "promo", a
    /// supplier) rather than name items ([`notes_columns`]): not read; the report says so.
    pub notes: Vec<usize>,
    /// Text columns of a long table that tell how a sale was rung up (a till, a cashier, a
    /// receipt) beside the item's name ([`sale_details`]): not read, each item's rows of a
    /// period added up across them; the report says so.
    pub details: Vec<(usize, SaleDetail)>,
    /// Columns that make the period together with the period column, a year: a month,
    /// quarter or week, and a day ([`SplitPeriod`]); each period is read from them joined.
    pub split: Option<SplitPeriod>,
    /// A year down and months or quarters across ([`YearGrid`], layout across): each cell's
    /// period is its row's year and its column's part.
    pub grid: Option<YearGrid>,
}

#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(super) enum Role {
    Period(Family),
    Value,
    Item,
    Empty,
}

/// Decides the column roles. `Err` when no column holds values.
pub(crate) fn plan(table: &Table) -> Result<Plan, RowError> {
    if table.across {
        return super::across::plan(table);
    }
    let rows = table.fitting_rows();
    // Week.year labels under a header that names weeks ("05.2024", as some exports write calendar
    // weeks) are ISO weeks: read as months, weeks 1 to 12 became January to December, and
    // the rest numbers of an item.
    let dotted_weeks = (0..table.width)
        .find(|&j| names_weeks(table, j) && mostly(&table.column(j, &rows), dotted_week));
    // Month.year ("03.2024") under a header that names a period and not weeks, or in a
    // table without a header when the months are close in time and no other column holds
    // periods: months.
    // A number to a cell ("10.2001" may be an article number), so only there.
    let dotted_months = (0..table.width).find(|&j| {
        let cells = table.column(j, &rows);
        match table.header {
            Some(_) => {
                Some(j) != dotted_weeks
                    && header_is_only(&table.column_name(j), &PERIOD_WORDS)
                    && !header_says(&table.column_name(j), &WEEK_WORDS)
                    && mostly(&cells, dotted_month)
            }
            // Beside a column of periods it names something else (article numbers).
            None => {
                dotted_months_close(&cells)
                    && (0..table.width)
                        .all(|k| k == j || strong_family(&table.column(k, &rows)).is_none())
            }
        }
    });
    let roles: Vec<Role> = (0..table.width)
        .map(|j| {
            let cells: Vec<&str> = table
                .column(j, &rows)
                .into_iter()
                .filter(|c| !is_missing(c))
                .collect();
            if cells.is_empty() {
                Role::Empty
            } else if Some(j) == dotted_weeks {
                Role::Period(Family::Week)
            } else if Some(j) == dotted_months {
                Role::Period(Family::Month)
            } else if let Some(family) = strong_family(&cells) {
                Role::Period(family)
            } else if cells.iter().filter(|c| looks_number(c)).count() * 2 >= cells.len()
                || cells.len() * 2 < rows.len()
            {
                // An item column names the item on most rows; a column mostly empty or "n/a"
                // holds quantities, and its few words are bad cells.
                Role::Value
            } else {
                Role::Item
            }
        })
        .collect();
    let mut item_columns: Vec<usize> = (0..roles.len())
        .filter(|j| roles[*j] == Role::Item)
        .collect();
    let mut numeric: Vec<usize> = (0..roles.len())
        .filter(|j| roles[*j] == Role::Value)
        .collect();
    let first_period = roles.iter().position(|r| matches!(r, Role::Period(_)));
    // A year column beside a column of months, quarters or weeks make one period between
    // them ([`SplitPeriod`]), before a text column of month names can be taken for items
    // or, never repeating in one year, for the periods.
    let split = SplitPeriod::find(table, &rows, first_period, &numeric)?;
    let mut period = first_period.map(|j| {
        (
            j,
            if Some(j) == dotted_weeks {
                Some(IntegerMeaning::DottedWeeks)
            } else {
                (Some(j) == dotted_months).then_some(IntegerMeaning::DottedMonths)
            },
        )
    });
    if let Some(split) = split {
        numeric.retain(|j| !split.columns().contains(j));
        item_columns.retain(|j| !split.columns().contains(j));
        period = Some((split.year(), None));
    }
    // Months or quarters across the header beside a year down and a column naming the items:
    // read, a cell's period its row's year and its column's part ([`YearGrid`]).
    if split.is_none() {
        let of_role = |role: fn(&Role) -> bool| -> Vec<usize> {
            (0..roles.len()).filter(|j| role(&roles[*j])).collect()
        };
        let (periods, empty) = (
            of_role(|r| matches!(r, Role::Period(_))),
            of_role(|r| *r == Role::Empty),
        );
        let columns = Columns {
            numeric: &numeric,
            periods: &periods,
            texts: &item_columns,
            empty: &empty,
        };
        if let Some(grid) = YearGrid::find(table, &rows, &columns) {
            return Ok(year_grid_plan(&roles, grid));
        }
        if let Some(error) = without_a_year(table, &rows, &columns) {
            return Err(error);
        }
    }
    // Number columns headed by parts of what a row is (months over years, weekdays over
    // weeks) hold one item's values, the calendar across the header ([`calendar_grid`]).
    if let Some(error) = calendar_grid(table, &rows, &roles, &numeric, split.is_some()) {
        return Err(error);
    }
    // Weekday or month names name no item ([`calendar_columns`]); without a period to stand
    // beside, they are the only time the table gives, and not enough to place a row.
    let mut calendar: Vec<usize> = calendar_columns(table, &rows, &item_columns, false);
    // Beside a period written across a year and its part, another column naming a part of
    // the year ("Half" with H1 and H2, "Quarter" beside "Month", "Semester") repeats the
    // calendar: a review found "H1" and "H2" made items, each history split in two.
    if split.is_some() && table.header.is_some() {
        let details: Vec<usize> = item_columns
            .iter()
            .copied()
            .filter(|j| {
                !calendar.contains(j) && header_is_only(&table.column_name(*j), &YEAR_PART_DETAILS)
            })
            .collect();
        calendar.extend(details);
    }
    item_columns.retain(|j| !calendar.contains(j));
    if period.is_none() {
        // A text column whose cells never repeat names periods, not items: reading it as the
        // period column turns each unreadable label into an error the user can act on.
        if let Some(k) = item_columns
            .iter()
            .position(|j| all_distinct(&table.column(*j, &rows)))
        {
            period = Some((item_columns.remove(k), None));
        }
    }
    if let (Some(&j), None) = (calendar.first(), period) {
        return Err(without_years(table, &rows, j));
    }
    if period.is_none() {
        if let Some(&j) = numeric.iter().find(|&&j| {
            !header_is_only(&table.column_name(j), &PERIOD_WORDS)
                && dotted_labels(&table.column(j, &rows))
        }) {
            return Err(dotted_labels_unnamed(table, &rows, j));
        }
    }
    let period_cells: Vec<String> = match (period, split) {
        (Some(_), Some(split)) => split.labels(&rows),
        (Some((p, _)), None) => table
            .column(p, &rows)
            .into_iter()
            .map(str::to_string)
            .collect(),
        _ => Vec::new(),
    };
    let period_refs: Vec<&str> = period_cells.iter().map(String::as_str).collect();
    // Beside a period column, a number column named as a row's number ([`ROW_WORDS`]) whose
    // every row holds another whole number numbers the rows: it is no quantity
    // (`id,date,value`). Only those words: a "Shop" column of a wide table holds quantities.
    // One number column always stays for the quantities.
    let found: Vec<usize> = match period {
        Some((p, None)) if rows.len() >= 2 => numeric
            .iter()
            .copied()
            .filter(|j| *j != p && numbers_rows(table, *j, &rows))
            .collect(),
        // Without a period, an index counting one by one numbers the periods (below); one
        // that skips (rows picked from a longer table) only numbers the rows.
        None if rows.len() >= 2 => numeric
            .iter()
            .copied()
            .filter(|j| *j == 0 && blank_header(table, 0) && numbers_rows(table, 0, &rows))
            .filter(|_| {
                let cells = table.column(0, &rows);
                integer_meaning(&cells, true) != Some(IntegerMeaning::Positions)
            })
            .collect(),
        _ => Vec::new(),
    };
    let row_numbers = if found.len() < numeric.len() {
        numeric.retain(|j| !found.contains(j));
        found
    } else {
        Vec::new()
    };
    // Words beside one row per period note the periods rather than name items, unless the
    // header says they name items ([`notes_columns`]).
    let named_numbers = named_items(table, &numeric);
    let notes = notes_columns(table, &rows, &item_columns, &named_numbers, &period_refs);
    item_columns.retain(|j| !notes.contains(j));
    // A till, cashier, payment or receipt beside the item's name tells how it was sold, not
    // what ([`sale_details`]): rows added up across it.
    let details = match period {
        Some(_) => sale_details(table, &rows, &item_columns, &named_numbers, &period_refs),
        None => Vec::new(),
    };
    item_columns.retain(|j| !details.iter().any(|(k, _)| k == j));
    // Without an item column, number columns may name the items ([`codes_beside`],
    // [`numbered_by_header`]); one number column must stay for the quantities.
    let codes: Vec<usize> = match period {
        // Beside a till or receipt left out, numbers under an item's header ("SKU") are the
        // items, their rows added up across the till as the names' are.
        Some(_) if !details.is_empty() && item_columns.is_empty() => named_numbers.clone(),
        Some((_, None)) if item_columns.is_empty() && numeric.len() >= 2 => {
            codes_beside(table, &rows, &numeric, &period_refs)
        }
        None if item_columns.is_empty() && numeric.len() >= 3 => {
            match numbered_by_header(table, &rows, &numeric) {
                Some((codes, numbered)) => {
                    period = Some(numbered);
                    codes
                }
                None => Vec::new(),
            }
        }
        Some(_) if !item_columns.is_empty() && numeric.len() >= 2 => {
            codes_beside_names(table, &rows, &item_columns, &numeric, &period_refs)
        }
        _ => Vec::new(),
    };
    item_columns.extend(codes.iter().copied());
    let long = !item_columns.is_empty();
    let value_columns: Vec<usize> = numeric.into_iter().filter(|j| !codes.contains(j)).collect();
    if period.is_none() && value_columns.len() >= 2 {
        let candidates: Vec<usize> = if long {
            value_columns.clone()
        } else {
            value_columns
                .iter()
                .copied()
                .take(1)
                .filter(|j| *j == 0)
                .collect()
        };
        period = candidates.into_iter().find_map(|j| {
            let cells: Vec<&str> = table.column(j, &rows);
            integer_meaning(&cells, !long)
                .filter(|m| *m != IntegerMeaning::Positions || counts_rows(table, j, &cells))
                .map(|m| match m {
                    // Six digits under a week's name are year and week, not year and month.
                    IntegerMeaning::CompactMonths
                        if header_says(&table.column_name(j), &WEEK_WORDS) =>
                    {
                        IntegerMeaning::CompactWeeks
                    }
                    m => m,
                })
                .map(|m| (j, Some(m)))
        });
    }
    let mut values: Vec<usize> = value_columns
        .into_iter()
        .filter(|j| period.is_none_or(|(p, _)| p != *j))
        .collect();
    // Number columns named only as periods ("year" beside a month column, "t,year,period,
    // value") count no quantity.
    // One number column always stays for the quantities. Without a period they are the
    // table's only time, unread (weeks 10, 11, 13, 12 in file order would be misplaced).
    let named_periods = calendar_columns(table, &rows, &values, true);
    if named_periods.len() < values.len() {
        if let (Some(&j), None) = (named_periods.first(), period) {
            return Err(unplaced_numbers(table, &rows, j));
        }
        values.retain(|j| !named_periods.contains(j));
        calendar.extend(named_periods);
    }
    calendar.sort_unstable();
    // Beside the quantities of a single or wide table, a price or an order number is no item
    // (`Date,Unit price,Sales units`); a long table chooses its quantity by the same words.
    let value_names: Vec<String> = values.iter().map(|j| table.column_name(*j)).collect();
    let of_items: Vec<(usize, OfAnother, String)> = if long || table.header.is_none() {
        Vec::new()
    } else {
        values
            .iter()
            .filter_map(|&j| {
                let money = written_as_money(&table.column(j, &rows));
                of_another(&table.column_name(j), &value_names, money)
                    .map(|(kind, other)| (j, kind, other))
            })
            .collect()
    };
    let not_quantities: Vec<usize> = if long {
        Vec::new()
    } else {
        values
            .iter()
            .copied()
            .filter(|j| {
                let name = table.column_name(*j);
                table.header.is_some()
                    && (names_money(&name)
                        || names_order_number(&name)
                        || names_no_demand(&name)
                        || of_items.iter().any(|(k, ..)| k == j))
            })
            .collect()
    };
    // One number column always stays for the quantities, and then nothing is left out.
    let not_quantities = if not_quantities.len() < values.len() {
        values.retain(|j| !not_quantities.contains(j));
        not_quantities
    } else {
        Vec::new()
    };
    let of_items: Vec<(usize, OfAnother, String)> = of_items
        .into_iter()
        .filter(|(j, ..)| not_quantities.contains(j))
        .collect();
    let mut ignored: Vec<usize> = (0..roles.len())
        .filter(|j| matches!(roles[*j], Role::Period(_)) && period.is_some_and(|(p, _)| p != *j))
        .filter(|j| split.is_none_or(|s| !s.columns().contains(j)))
        .collect();
    if values.is_empty() {
        let header_line = table.header.as_ref().map_or(1, |h| h.line);
        // Named at the first cell of a column named as a quantity, else of the last column
        // that is not the period's (where the quantities usually stand), so the text found
        // shows why it is no number.
        let first_cell = |j: usize| {
            let at = table.column(j, &rows).iter().position(|c| !is_missing(c))?;
            Some((j, at))
        };
        let not_period = |j: &usize| period.is_none_or(|(p, _)| p != *j);
        let candidate = (0..table.width)
            .filter(not_period)
            .filter(|j| {
                let name = table.column_name(*j);
                header_says(&name, &QUANTITY_WORDS) || header_says(&name, &UNIT_WORDS)
            })
            .find_map(first_cell)
            .or_else(|| {
                (0..table.width)
                    .rev()
                    .filter(not_period)
                    .find_map(first_cell)
            });
        return Err(match candidate {
            Some((j, at)) => RowError {
                row: rows[at].line,
                column: table.column_name(j),
                text: table.column(j, &rows)[at].to_string(),
                message: "expected a column of numbers (the quantities); none was found: write \
                          quantities as plain numbers (1500, not 1.5k; 12, not 12 dozen)"
                    .to_string(),
            },
            None => RowError {
                row: rows.first().map_or(header_line, |r| r.line),
                column: String::new(),
                text: String::new(),
                message: "expected a column of numbers (the quantities); none was found"
                    .to_string(),
            },
        });
    }
    // A stock level, a plan or a rank is never the demand, even as the only number column:
    // read so, `Date,Item,On hand` had planned the stock on hand as sales, without a word (a
    // review).
    if let (Some(header), Some(&first)) = (&table.header, values.first()) {
        if values
            .iter()
            .all(|j| names_no_demand(&table.column_name(*j)))
        {
            let name = table.column_name(first);
            return Err(RowError {
                row: header.line,
                column: name.clone(),
                text: name.clone(),
                message: format!(
                    "expected a column of the quantities sold; \"{name}\" names {NO_DEMAND}: add \
                     the quantities sold (such as a column \"Qty\"), or rename the column if it \
                     holds them"
                ),
            });
        }
    }
    let layout = if long {
        let quantity = quantity_among(table, &rows, &values);
        values.swap(0, quantity);
        ignored.extend(values.drain(1..));
        Layout::Long
    } else if values.len() == 1 {
        Layout::Single
    } else {
        Layout::Wide
    };
    ignored.sort_unstable();
    let empty = (0..roles.len())
        .filter(|j| roles[*j] == Role::Empty)
        .collect();
    Ok(Plan {
        layout,
        period,
        item_columns,
        values,
        ignored,
        empty,
        codes,
        row_numbers,
        calendar,
        not_quantities,
        of_items,
        notes,
        details,
        split,
        grid: None,
    })
}

/// The plan of a year grid ([`YearGrid`]): its items named by the columns left of the months,
/// its values under the month or quarter columns, its row totals and what stands right of the
/// months not read (said as columns naming no period).
fn year_grid_plan(roles: &[Role], grid: YearGrid) -> Plan {
    // Months still to come, all empty, are the grid's values all the same.
    let empty = (0..roles.len())
        .filter(|j| roles[*j] == Role::Empty && !grid.part_columns().contains(j))
        .collect();
    Plan {
        grid: Some(grid.clone()),
        ..Plan::across(
            grid.items().to_vec(),
            grid.part_columns(),
            grid.ignored().to_vec(),
            empty,
        )
    }
}

impl Plan {
    /// A plan of periods across the header: the items named by `item_columns`, the values
    /// under `values`, the columns `ignored` said as not read, the `empty` ones; no other
    /// role (a table across has no period column, codes, notes or details).
    pub(crate) fn across(
        item_columns: Vec<usize>,
        values: Vec<usize>,
        ignored: Vec<usize>,
        empty: Vec<usize>,
    ) -> Plan {
        Plan {
            layout: Layout::Across,
            period: None,
            item_columns,
            values,
            ignored,
            empty,
            codes: Vec::new(),
            row_numbers: Vec::new(),
            calendar: Vec::new(),
            not_quantities: Vec::new(),
            of_items: Vec::new(),
            notes: Vec::new(),
            details: Vec::new(),
            split: None,
            grid: None,
        }
    }
}

/// Words of a header cell that name the item (or the store it is sold at), that name a
/// period, and that name a quantity, for tables whose item codes are numbers (common practice
/// in exported tables: `series,t,value`, `sku,week,units`, `date,store,item,sales`). With
/// (from memory) the German, French, Dutch, Spanish and Italian words for article, product,
/// store and customer: a review found store numbers under "Filiale" summed across.
pub(super) const ITEM_WORDS: [&str; 40] = [
    "item",
    "plu",
    "ean",
    "upc",
    "gtin",
    "barcode",
    "material",
    "variety",
    "sku",
    "product",
    "series",
    "code",
    "id",
    "article",
    "part",
    "store",
    "shop",
    "location",
    "site",
    "branch",
    "warehouse",
    "customer",
    "artikel",
    "articulo",
    "artículo",
    "articolo",
    "produkt",
    "produit",
    "producto",
    "prodotto",
    "filiale",
    "magasin",
    "tienda",
    "winkel",
    "negozio",
    "lager",
    "kunde",
    "client",
    "cliente",
    "klant",
];
/// Words naming a period in a header, English and (from memory) the common German, French,
/// Dutch, Spanish and Italian ones written in plain letters: under "Monat" the German
/// month.year labels ("03.2020") had been read as the numbers 3.202 of an item, silently;
/// named as a period they are an error that says how to write them. Words that name things in
/// English too ("tag", "dag", "data") are left out.
pub(super) const PERIOD_WORDS: [&str; 44] = [
    "t",
    "period",
    "time",
    "step",
    "date",
    "day",
    "week",
    "month",
    "quarter",
    "year",
    "wk",
    "mth",
    "qtr",
    "yr",
    "periode",
    "datum",
    "woche",
    "monat",
    "quartal",
    "jahr",
    "semaine",
    "mois",
    "trimestre",
    "maand",
    "kwartaal",
    "jaar",
    "fecha",
    "semana",
    "mese",
    "settimana",
    "kw",
    "monthly",
    "weekly",
    "anno",
    "mes",
    "ano",
    "año",
    "annee",
    "année",
    "yyyy",
    "kalenderjahr",
    "kalendermonat",
    "monatsnr",
    "periodo",
];
/// With (from memory) the German, French, Dutch, Spanish and Italian words for sales.
pub(super) const QUANTITY_WORDS: [&str; 18] = [
    "sales", "units", "qty", "quantity", "demand", "value", "amount", "volume", "sold", "orders",
    "absatz", "verkauf", "ventes", "verkoop", "ventas", "vendite", "actual", "actuals",
];
/// Whether a cell is a whole number written with digits only.
pub(super) fn whole_number(cell: &str) -> bool {
    !cell.is_empty() && cell.bytes().all(|b| b.is_ascii_digit())
}

/// The cells of each of `columns` over `rows`.
pub(super) fn columns_of<'a>(
    table: &'a Table,
    rows: &[&'a Record],
    columns: &[usize],
) -> Vec<Vec<&'a str>> {
    columns.iter().map(|j| table.column(*j, rows)).collect()
}

/// Whether each item (a row's cells across `columns`) has each of `periods` on one row only.
pub(super) fn once_per_period(columns: &[Vec<&str>], periods: &[&str]) -> bool {
    let mut pairs: Vec<(Vec<&str>, &str)> = (0..periods.len())
        .map(|i| (columns.iter().map(|c| c[i]).collect(), periods[i]))
        .collect();
    let count = pairs.len();
    pairs.sort_unstable();
    pairs.dedup();
    pairs.len() == count
}

/// Of `columns`, those that hold calendar details rather than items or quantities: text
/// columns whose cells are mostly weekday or month names, quarters or weeks without a year
/// ([`super::label::calendar_name`]: "Mon", "Jan", "Q1", "W5"), or, when `numbers`, number
/// columns whose header names a period and nothing else (no item, quantity or other word).
fn calendar_columns(
    table: &Table,
    rows: &[&Record],
    columns: &[usize],
    numbers: bool,
) -> Vec<usize> {
    columns
        .iter()
        .copied()
        .filter(|&j| {
            if numbers {
                let name = table.column_name(j);
                return table.header.is_some()
                    && header_is_only(&name, &PERIOD_WORDS)
                    && !header_says(&name, &ITEM_WORDS)
                    && !header_says(&name, &QUANTITY_WORDS)
                    && !header_says(&name, &OTHER_WORDS);
            }
            // Under a header that names items ("Product": May, June, as roses are called)
            // the names are items.
            if names_item(table, j) {
                return false;
            }
            let cells: Vec<&str> = table
                .column(j, rows)
                .into_iter()
                .filter(|c| !c.is_empty())
                .collect();
            // Weekdays shortened in other languages ("Mo", "Di", "lun.") only under a header
            // naming the weekday: alone, two letters are as often a country or a state.
            let weekday_header =
                table.header.is_some() && header_says(&table.column_name(j), &WEEKDAY_WORDS);
            let named = cells
                .iter()
                .filter(|c| calendar_name(c) || (weekday_header && weekday_shortened(c)))
                .count();
            !cells.is_empty() && named * 2 > cells.len()
        })
        .collect()
}

/// The error for calendar column `j` when the table has no period to place its rows: at the
/// first row with a cell there.
fn without_years(table: &Table, rows: &[&Record], j: usize) -> RowError {
    let cells = table.column(j, rows);
    let at = cells.iter().position(|c| !c.is_empty()).unwrap_or(0);
    RowError {
        row: rows.get(at).map_or(1, |r| r.line),
        column: table.column_name(j),
        text: cells.get(at).copied().unwrap_or("").to_string(),
        message: "expected periods with their years (e.g. 2023-01, or a year column beside \
                  this one); this column gives weekdays, months, quarters or weeks alone, \
                  which cannot place a row in time"
            .to_string(),
    }
}

/// Whether column `j` has a header cell that is blank, or "Unnamed: 0" as data tools call a
/// blank one when they read it back.
fn blank_header(table: &Table, j: usize) -> bool {
    table.header.as_ref().is_some_and(|header| {
        header.cells.get(j).is_none_or(|c| c.trim().is_empty())
            || table
                .column_name(j)
                .trim()
                .to_ascii_lowercase()
                .starts_with("unnamed")
    })
}

/// The error for number column `j`, named only as a period, when no period could be read:
/// at its first row.
fn unplaced_numbers(table: &Table, rows: &[&Record], j: usize) -> RowError {
    // Week.year under a header that does not name weeks (weeks past 12 are no months): the
    // error stands at the first that is no month.
    let cells = table.column(j, rows);
    let weeks = mostly(&cells, dotted_week);
    let at = weeks
        .then(|| {
            cells
                .iter()
                .position(|c| !c.is_empty() && dotted_month(c).is_none())
        })
        .flatten();
    let weeks = if weeks {
        "; if they are weeks written week.year (05.2024), name the column Week"
    } else {
        ""
    };
    let first = without_years(table, rows, j);
    let (row, text) = match at {
        Some(at) => (rows[at].line, cells[at].to_string()),
        None => (first.row, first.text.clone()),
    };
    RowError {
        row,
        text,
        message: format!(
            "expected periods that place each row in time; this column is named as a period \
             but its numbers neither count the rows (1, 2, 3, ...) nor read as years: write \
             periods with their years (e.g. 2023-01), or number the rows in order{weeks}"
        ),
        ..first
    }
}

/// The error for number column `j` whose cells are month.year or week.year labels in time
/// order ("01.2024", "02.2024", ...) under a header that names no period Intake knows
/// ("Fiscal week", "Zeitraum"): read as numbers, they had been planned as an item, silently.
fn dotted_labels_unnamed(table: &Table, rows: &[&Record], j: usize) -> RowError {
    RowError {
        message: "expected quantities; this column's cells read as periods written month.year \
                  or week.year (01.2024) in time order, not as quantities: name the column \
                  Month or Week, or write the periods as 2024-01 or 2024-W01"
            .to_string(),
        ..without_years(table, rows, j)
    }
}

/// Words of a header that names a row's number.
const ROW_WORDS: [&str; 3] = ["id", "row", "index"];

/// Whether a column of numbers counting 0 or 1, 2, 3, ... (`cells`) may number the periods:
/// it has a blank header, or one that names a period or a row's number ("t", "period",
/// "index", "no", "#"), or no header and counts from 1 (from 0 only an index a data tool
/// wrote, which has a header cell, if a blank one). Under any other name ("Oak tray") the
/// numbers are quantities that happen to count up, and reading them as positions would drop
/// that item.
fn counts_rows(table: &Table, j: usize, cells: &[&str]) -> bool {
    let Some(header) = &table.header else {
        return !cells.iter().any(|c| c.trim() == "0");
    };
    let name = header.cells.get(j).map_or("", |c| c.trim());
    name.is_empty()
        || name == "#"
        || header_says(name, &PERIOD_WORDS)
        || header_says(name, &ROW_WORDS)
        || header_says(
            name,
            &["no", "nr", "n", "idx", "num", "number", "obs", "seq"],
        )
}

/// Whether column `j` numbers the rows: its header names nothing but a row's number
/// ([`ROW_WORDS`]: "id", "Row no"; not "Row cover fleece" or "Plant ID tags"), and every row
/// holds another whole number; or it is the first column, its
/// header is blank (or "Unnamed: 0", as data tools name a blank one when they read it back)
/// and its numbers increase down the rows (an index written beside the data, perhaps of rows
/// picked from a longer table).
fn numbers_rows(table: &Table, j: usize, rows: &[&Record]) -> bool {
    if table.header.is_none() {
        return false;
    }
    let name = table.column_name(j);
    let cells = table.column(j, rows);
    let blank = blank_header(table, j);
    if !cells.iter().all(|c| whole_number(c)) {
        return false;
    }
    if blank {
        let numbers: Vec<u64> = cells.iter().filter_map(|c| c.parse().ok()).collect();
        return j == 0 && numbers.len() == cells.len() && numbers.windows(2).all(|w| w[0] < w[1]);
    }
    header_is_only(&name, &ROW_WORDS) && all_distinct(&cells)
}

/// Words that make a header with an item word name something else about it ("item price",
/// "promo code", "customer count").
const OTHER_WORDS: [&str; 6] = ["price", "cost", "count", "promo", "promotion", "discount"];

/// Whether column `j` is headed by weeks and nothing else ("Week", "Wk no", "Year/Week",
/// "Week ending", "Calendar week", "KW").
pub(super) fn names_weeks(table: &Table, j: usize) -> bool {
    const BESIDE: [&str; 8] = [
        "period",
        "sales",
        "ending",
        "commencing",
        "starting",
        "beginning",
        "calendar",
        "iso",
    ];
    let name = table.column_name(j);
    let allowed: Vec<&str> = WEEK_WORDS
        .iter()
        .chain(&YEAR_WORDS)
        .chain(&BESIDE)
        .copied()
        .collect();
    table.header.is_some() && header_is_only(&name, &allowed) && header_says(&name, &WEEK_WORDS)
}

/// Whether header cell `name` holds one of `words` as a word of its own (split at anything
/// that is not a letter or digit and where a lower-case letter meets a capital, any case:
/// "Item ID", "sku_code", "StoreID", "T").
pub(super) fn header_says(name: &str, words: &[&str]) -> bool {
    header_words(name)
        .iter()
        .any(|word| words.iter().any(|w| same_word(word, w)))
}

/// Whether a header's word is `listed` (a word of a list, in lower case) in any case, capitals
/// beyond ASCII too ("ANNÉE" is "année"). The header is never lower-cased as a whole first: its
/// words split where a lower-case letter meets a capital ("MonthNo").
fn same_word(word: &str, listed: &str) -> bool {
    word.eq_ignore_ascii_case(listed) || (!word.is_ascii() && word.to_lowercase() == listed)
}

/// Words that may stand beside a period word in a header that names nothing else ("Month
/// no", "Week number", "Year of sale").
/// With (from memory) the German, French, Spanish and Italian ones ("Mois n°", "Mes nº").
const FILLER_WORDS: [&str; 12] = [
    "no", "nr", "num", "number", "of", "the", "calendar", "n", "nº", "nummer", "numero", "número",
];

/// Whether header cell `name` names only what `words` name: at least one of them, and every
/// other word a number or a filler ("Month no", "Month (1-12)"), so "Year planner", "Day lily"
/// or "Month end" (an item's name) do not count.
pub(super) fn header_is_only(name: &str, words: &[&str]) -> bool {
    let all = header_words(name);
    let is = |word: &str, list: &[&str]| list.iter().any(|w| same_word(word, w));
    all.iter().any(|w| is(w, words))
        && all
            .iter()
            .all(|w| is(w, words) || is(w, &FILLER_WORDS) || w.bytes().all(|b| b.is_ascii_digit()))
}

/// The words of a header cell: split at anything that is not a letter or digit and where a
/// lower-case letter meets a capital.
pub(super) fn header_words(name: &str) -> Vec<String> {
    let mut spaced = String::with_capacity(name.len() + 4);
    let mut previous_lower = false;
    for c in name.chars() {
        if previous_lower && c.is_uppercase() {
            spaced.push(' ');
        }
        previous_lower = c.is_lowercase();
        spaced.push(c);
    }
    spaced
        .split(|c: char| !c.is_alphanumeric())
        .filter(|w| !w.is_empty())
        .map(str::to_string)
        .collect()
}

/// Whether the header of column `j` names an item and nothing else: an item word
/// ([`ITEM_WORDS`]) without a period, quantity or other word ("week id", "item sales" and
/// "item price" name something else).
pub(super) fn names_item(table: &Table, j: usize) -> bool {
    let name = table.column_name(j);
    table.header.is_some()
        && header_says(&name, &ITEM_WORDS)
        && !header_says(&name, &PERIOD_WORDS)
        && !header_says(&name, &QUANTITY_WORDS)
        && !header_says(&name, &OTHER_WORDS)
}

/// The number columns among `numeric` whose header names an item ([`names_item`]).
fn named_items(table: &Table, numeric: &[usize]) -> Vec<usize> {
    numeric
        .iter()
        .copied()
        .filter(|j| names_item(table, *j))
        .collect()
}

/// Header words that name a count of goods: the surest names of a quantity.
/// With (from memory) the German, French, Dutch, Spanish and Italian ones: a review found
/// "Menge" passed over for a month column beside it.
const UNIT_WORDS: [&str; 30] = [
    "kilos",
    "kg",
    "qty",
    "quantity",
    "units",
    "pcs",
    "pieces",
    "count",
    "sold",
    "demand",
    "volume",
    "orders",
    "stk",
    "menge",
    "anzahl",
    "stück",
    "stueck",
    "quantité",
    "quantite",
    "qté",
    "qte",
    "aantal",
    "stuks",
    "cantidad",
    "unidades",
    "uds",
    "quantità",
    "quantita",
    "qtà",
    "pezzi",
];
/// Header words that name money or a size, never the quantity ordered ("Net sales", "RRP",
/// "Bag size (L)", "Amount").
/// With (from memory) the German, French, Dutch, Spanish and Italian ones for price, amount,
/// revenue and cost: a review found "Umsatz" (revenue) read as the demand.
const MONEY_WORDS: [&str; 35] = [
    "price",
    "cost",
    "rrp",
    "net",
    "gross",
    "revenue",
    "turnover",
    "takings",
    "value",
    "amount",
    "margin",
    "discount",
    "size",
    "weight",
    "eur",
    "usd",
    "preis",
    "betrag",
    "umsatz",
    "kosten",
    "prix",
    "montant",
    "coût",
    "cout",
    "precio",
    "importe",
    "coste",
    "prezzo",
    "importo",
    "costo",
    "fatturato",
    "prijs",
    "bedrag",
    "omzet",
    "kostprijs",
];

/// Words that stand beside a money word in a header that names money and nothing else ("Unit
/// price", "Net sales", "Avg selling price", "Price ex VAT").
const MONEY_COMPANIONS: [&str; 15] = [
    "unit", "per", "avg", "average", "list", "sale", "selling", "retail", "purchase", "sales",
    "ex", "inc", "incl", "vat", "tax",
];

/// Whether a header names money and nothing else: a money word ([`MONEY_WORDS`], price,
/// cost) with only its companions beside it ("Unit price", "Net sales"; not "Price tag gun",
/// an item), or a currency sign number cells may carry ("Sales (£)", "Sales (₹)").
pub(super) fn names_money(name: &str) -> bool {
    let money: Vec<&str> = MONEY_WORDS
        .iter()
        .chain(&["price", "cost"])
        .copied()
        .collect();
    let allowed: Vec<&str> = money.iter().chain(&MONEY_COMPANIONS).copied().collect();
    holds_currency_sign(name) || (header_is_only(name, &allowed) && header_says(name, &money))
}

/// Header words of a column that names a part of the year beside one the period is already
/// read from ([`SplitPeriod`]).
const YEAR_PART_DETAILS: [&str; 9] = [
    "half", "semester", "quarter", "qtr", "month", "mth", "week", "wk", "season",
];

/// Words for what goods are packed in ("Units per case"): a header saying "per" one of them
/// is a conversion, never the quantity sold.
const PACK_WORDS: [&str; 14] = [
    "case", "cases", "pack", "packs", "box", "boxes", "carton", "cartons", "pallet", "crate",
    "bag", "tray", "bundle", "dozen",
];

/// Money words a header of an item's money ends with ("Seeds value", "Seeds (EUR)"); some end
/// products' names too ("Football goal net", "Pencils (gross)", "Apple turnover"), so
/// [`of_another`] asks the cells to be written as money as well. Not "weight" or "size".
const MONEY_SUFFIXES: [&str; 14] = [
    "value", "price", "revenue", "margin", "cost", "amount", "takings", "turnover", "net", "gross",
    "rrp", "eur", "usd", "gbp",
];

/// Header words that name goods returned or refunded, not sold.
const RETURN_WORDS: [&str; 5] = ["returns", "return", "returned", "refunds", "refund"];

/// What a header names about another column's item.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(super) enum OfAnother {
    /// Its money: a price, a value, a margin, an amount in a currency.
    Money,
    /// Its goods returned or refunded.
    Returns,
}

/// Whether a header names the money or the returns of the item another header names (and
/// which): it is another header (less its quantity and unit words) with a money or returns
/// word after it ("Seeds value" beside "Seeds qty", "Seeds (EUR)" or "Seeds margin" beside
/// "Seeds", "Bulbs refunds" beside "Bulbs"), and for money its cells are written as money
/// (`money_cells`: most with two decimals, or a currency sign). A review found such columns
/// of a wide table planned as items, a reorder point of 212 for "Seeds value", without a
/// word; a second review found products dropped when the word stood first or was also a
/// product's ("Value compost", "Return spring", "Football goal net", "Apple turnover"), so
/// only words after the name, money only in money's form. A header reduced to nothing
/// ("Revenue") is [`names_money`]'s.
fn of_another(name: &str, others: &[String], money_cells: bool) -> Option<(OfAnother, String)> {
    let words: Vec<String> = header_words(name)
        .iter()
        .map(|w| w.to_lowercase())
        .collect();
    let is = |w: &str, list: &[&str]| list.contains(&w);
    // The words after the name: money or returns words and their companions, at the end.
    let tail = words
        .iter()
        .rev()
        .take_while(|w| is(w, &MONEY_SUFFIXES) || is(w, &RETURN_WORDS) || is(w, &MONEY_COMPANIONS))
        .count();
    let (own, after) = words.split_at(words.len() - tail);
    let kind = if after.iter().any(|w| is(w, &RETURN_WORDS)) {
        OfAnother::Returns
    } else if (after.iter().any(|w| is(w, &MONEY_SUFFIXES)) || holds_currency_sign(name))
        && money_cells
    {
        OfAnother::Money
    } else {
        return None;
    };
    if own.is_empty() {
        return None;
    }
    let quantity: Vec<&str> = UNIT_WORDS.iter().chain(&QUANTITY_WORDS).copied().collect();
    let stem = |n: &str| -> Vec<String> {
        header_words(n)
            .iter()
            .map(|w| w.to_lowercase())
            .filter(|w| !quantity.contains(&w.as_str()))
            .collect()
    };
    others
        .iter()
        .find(|o| o.as_str() != name && stem(o) == own)
        .map(|o| (kind, o.clone()))
}

/// Whether most of a column's filled cells are written as money: two decimals ("170.00",
/// "2,50") or a currency sign.
fn written_as_money(cells: &[&str]) -> bool {
    let filled: Vec<&str> = cells
        .iter()
        .map(|c| c.trim())
        .filter(|c| !c.is_empty())
        .collect();
    let money = filled
        .iter()
        .filter(|c| {
            holds_currency_sign(c) || {
                let digits: Vec<&str> = c.rsplitn(2, ['.', ',']).collect();
                digits.len() == 2
                    && digits[0].len() == 2
                    && digits[0].bytes().all(|b| b.is_ascii_digit())
            }
        })
        .count();
    !filled.is_empty() && money * 2 > filled.len()
}

/// Whether a header names an order, invoice or receipt number and nothing else ("Order ID",
/// "Invoice no", "Receipt").
pub(super) fn names_order_number(name: &str) -> bool {
    const DOCUMENTS: [&str; 5] = ["order", "invoice", "receipt", "transaction", "ticket"];
    let allowed: Vec<&str> = DOCUMENTS
        .iter()
        .chain(&["id", "ref", "reference", "code"])
        .copied()
        .collect();
    header_is_only(name, &allowed) && header_says(name, &DOCUMENTS)
}

/// Of a long table's number columns left for quantities, the position of the one read: the
/// first whose header names a count of goods ([`UNIT_WORDS`]: "Qty", "Pcs", "Count"), else
/// one named a quantity ([`QUANTITY_WORDS`]: "sales"), neither naming money or a size
/// ([`MONEY_WORDS`], a currency sign) nor a stock level or running total ([`names_no_demand`]:
/// "Units in stock"); else the first whose header names no item, period, other thing, money or
/// stock, nor a short form over a year's parts only ([`short_form_of_parts`]: "MM" over 1 to
/// 12; "Q" or "M" is read: a review found "Temp" read beside them once every short form was
/// passed over); else the first
/// (`date,item,store,sales` reads "sales", not the store numbers; `Date,Item,Unit price,Count`
/// reads "Count"; the rest are reported as not used).
fn quantity_among(table: &Table, rows: &[&Record], values: &[usize]) -> usize {
    let says = |j: usize, words: &[&str]| header_says(&table.column_name(j), words);
    if table.header.is_none() {
        return 0;
    }
    // "Units per case" is a conversion, not a count sold (a review found it read as the
    // demand beside "Cases"); "Units sold per week" is a count.
    let per_pack = |j: usize| {
        let words: Vec<String> = header_words(&table.column_name(j))
            .iter()
            .map(|w| w.to_lowercase())
            .collect();
        words
            .windows(2)
            .any(|w| w[0] == "per" && PACK_WORDS.contains(&w[1].as_str()))
    };
    let not_demand = |j: usize| {
        says(j, &MONEY_WORDS)
            || per_pack(j)
            || holds_currency_sign(&table.column_name(j))
            || names_no_demand(&table.column_name(j))
    };
    // A count without a unit of measure before one with it ("Units" before "Qty (kg)").
    let measured = |j: usize| table.column_name(j).contains('(');
    values
        .iter()
        .position(|j| says(*j, &UNIT_WORDS) && !not_demand(*j) && !measured(*j))
        .or_else(|| {
            values
                .iter()
                .position(|j| says(*j, &UNIT_WORDS) && !not_demand(*j))
        })
        .or_else(|| {
            values
                .iter()
                .position(|j| says(*j, &QUANTITY_WORDS) && !not_demand(*j))
        })
        .or_else(|| {
            values.iter().position(|j| {
                !says(*j, &ITEM_WORDS)
                    && !says(*j, &PERIOD_WORDS)
                    && !says(*j, &OTHER_WORDS)
                    && !not_demand(*j)
                    && !short_form_of_parts(table, rows, *j)
            })
        })
        .unwrap_or(0)
}

/// Beside text item columns `names` and a period column (`periods`, its cells), the number
/// columns whose header names an item or store ([`named_items`]) that the items need: where the
/// names alone repeat a period and, with those numbers, never do (`date,item,store,sales`: one
/// item per product and store). None otherwise; one number column always stays.
fn codes_beside_names(
    table: &Table,
    rows: &[&Record],
    names: &[usize],
    numeric: &[usize],
    periods: &[&str],
) -> Vec<usize> {
    let named = named_items(table, numeric);
    if named.is_empty() || named.len() >= numeric.len() {
        return Vec::new();
    }
    let unique = |columns: &[usize]| once_per_period(&columns_of(table, rows, columns), periods);
    let with: Vec<usize> = names.iter().chain(&named).copied().collect();
    let digits = columns_of(table, rows, &named)
        .iter()
        .all(|cells| cells.iter().all(|c| whole_number(c)));
    // Stores or products repeat down the rows; numbers that make most rows an item of their
    // own (an order or customer number) split no item's history, they number transactions.
    let repeating = distinct_rows(&columns_of(table, rows, &with)) * 2 <= rows.len();
    if digits && repeating && !unique(names) && unique(&with) {
        named
    } else {
        Vec::new()
    }
}

/// Beside a period column (`periods`, its cells), the number columns that name the items:
/// where the header names some as items, those together if their numbers are item codes
/// ([`item_codes`]) and none otherwise (the header has said which they are; the shape alone
/// must not pick another); without such words, the first column of item codes whose header
/// does not name a quantity ([`QUANTITY_WORDS`]) and whose numbers have the shape of a product
/// list ([`codes_recur`]). One number column always stays for the quantities.
fn codes_beside(
    table: &Table,
    rows: &[&Record],
    numeric: &[usize],
    periods: &[&str],
) -> Vec<usize> {
    let named = named_items(table, numeric);
    let columns = |js: &[usize]| columns_of(table, rows, js);
    if !named.is_empty() {
        let cells = columns(&named);
        // One number on every row under a header naming an item and nothing more ("Item",
        // "Item no", "SKU"): one item's code (an export of a single product), never a
        // quantity. Not under "Shop A", a store whose sales may stand still.
        let one_item = named.len() == 1
            && header_is_only(&table.column_name(named[0]), &ITEM_WORDS)
            && cells.iter().all(|c| {
                c.iter().all(|cell| whole_number(cell)) && c.windows(2).all(|w| w[0] == w[1])
            })
            && periods.len() >= 2;
        return if named.len() < numeric.len() && (one_item || item_codes(&cells, periods)) {
            named
        } else {
            Vec::new()
        };
    }
    numeric
        .iter()
        .copied()
        .filter(|j| !header_says(&table.column_name(*j), &QUANTITY_WORDS))
        .find(|j| {
            let column = columns(&[*j]);
            item_codes(&column, periods) && codes_recur(&column[0], periods)
        })
        .into_iter()
        .collect()
}

/// In a table of numbers only, with no period column found by its cells: the columns whose
/// header names the item ([`ITEM_WORDS`]), when their numbers are item codes ([`item_codes`])
/// beside a column whose header names a period ([`PERIOD_WORDS`]) and whose whole numbers
/// count periods or years ([`integer_meaning`]). Without the header's words such a table reads
/// as wide: numbered items and numbered periods have the shape of other tables of whole
/// numbers (a year and a month column side by side). `(code columns, (period column, its
/// meaning))`.
fn numbered_by_header(
    table: &Table,
    rows: &[&Record],
    numeric: &[usize],
) -> Option<(Vec<usize>, PeriodColumn)> {
    let periods_named: Vec<usize> = numeric
        .iter()
        .copied()
        .filter(|j| table.header.is_some() && header_says(&table.column_name(*j), &PERIOD_WORDS))
        .collect();
    // Two columns named as periods (a year and a month) make one period between them, which
    // this rule does not read: the table stays as it was.
    let &[p] = periods_named.as_slice() else {
        return None;
    };
    let periods = table.column(p, rows);
    let meaning = integer_meaning(&periods, false)?;
    let named: Vec<usize> = named_items(table, numeric)
        .into_iter()
        .filter(|j| *j != p)
        .collect();
    let codes = !named.is_empty()
        && named.len() + 1 < numeric.len()
        && item_codes(&columns_of(table, rows, &named), &periods);
    codes.then_some((named, (p, Some(meaning))))
}

/// Whether columns of numbers name items rather than count them: every cell a whole number
/// written with digits only, the items (a row's numbers across `columns`) repeating, beside a
/// period column whose periods repeat too, and each (item, period) pair on one row only. That
/// is the shape of product (and store) numbers in item, period, quantity rows; a quantity
/// column with a repeated period would repeat a pair (common practice: item codes are often
/// numeric).
fn item_codes(columns: &[Vec<&str>], periods: &[&str]) -> bool {
    if columns.is_empty() || periods.len() < 2 || all_distinct(periods) {
        return false;
    }
    if !columns
        .iter()
        .all(|c| c.len() == periods.len() && c.iter().all(|cell| whole_number(cell)))
    {
        return false;
    }
    distinct_rows(columns) < periods.len() && once_per_period(columns, periods)
}

/// How many different rows `columns` (each the cells of one column, all as long) make.
fn distinct_rows(columns: &[Vec<&str>]) -> usize {
    let rows = columns.first().map_or(0, Vec::len);
    let mut keys: Vec<Vec<&str>> = (0..rows)
        .map(|i| columns.iter().map(|c| c[i]).collect())
        .collect();
    keys.sort_unstable();
    keys.dedup();
    keys.len()
}
