//! A table's columns: the role of each (period, item name, value), which fixes the layout.
//!
//! Kept apart from: finding the title lines, the header and the data rows ([`super::frame`]),
//! what a header says on its own ([`super::headers`]), item codes written as numbers
//! ([`super::item_codes`]) and reading cell values (numbers in [`super::number`], periods in
//! [`super::period`]). This module only classifies; it decides the layout from what most cells
//! of each column look like, so one bad cell does not change the layout.
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
//! it is an error ([`super::frame::wide_row_error`]). A
//! column is a value column when at least half of its cells that hold something (not empty, not
//! "n/a") read as numbers, or when fewer than half of its rows hold something (an item column
//! names the item on most rows, so one word in a column of gaps is a bad quantity); otherwise it
//! is an item column.
//! Any item column makes the layout long (item, period, quantity; several item columns are
//! joined with " / "); otherwise one value column is single and several are wide. Item codes
//! written as whole numbers make item columns too, with a warning: beside a period column, the
//! number columns the header names as items (item, sku, store, ...), together, or without such
//! words the first number column not named a quantity, whose (item, period) pairs never repeat
//! and whose rows have the shape of a product list ([`codes_beside`], `item_codes::item_codes`,
//! [`super::shapes::codes_recur`]), and one number on every row under a header naming only an item ("Item":
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

use super::frame::{all_distinct, Table};
use super::headers::{
    header_is_only, header_says, header_words, names_money, names_order_number, of_another,
    written_as_money, OfAnother, ITEM_WORDS, MONEY_WORDS, OTHER_WORDS, PACK_WORDS, PERIOD_WORDS,
    QUANTITY_WORDS, UNIT_WORDS,
};
use super::item_codes::{codes_beside, codes_beside_names, numbered_by_header};
use super::joined::{short_form_of_parts, SplitPeriod};
use super::label::{calendar_name, Family};
use super::number::{holds_currency_sign, is_missing, looks_number};
use super::period::{
    dotted_labels, dotted_month, dotted_months_close, dotted_week, integer_meaning, mostly,
    strong_family, IntegerMeaning,
};
use super::shapes::{
    calendar_grid, names_no_demand, notes_columns, sale_details, SaleDetail, NO_DEMAND,
};
use super::text::Record;
use super::words::{weekday_shortened, WEEKDAY_WORDS, WEEK_WORDS, YEAR_WORDS};
use super::year_grid::{without_a_year, Columns, YearGrid};
use super::{Layout, RowError};
use crate::sorting;

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
    /// quantities (`item_codes::item_codes`); the report says so.
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
    sorting::sort(&mut calendar);
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
    sorting::sort(&mut ignored);
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
    sorting::sort(&mut pairs);
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
pub(super) fn named_items(table: &Table, numeric: &[usize]) -> Vec<usize> {
    numeric
        .iter()
        .copied()
        .filter(|j| names_item(table, *j))
        .collect()
}

/// Header words of a column that names a part of the year beside one the period is already
/// read from ([`SplitPeriod`]).
const YEAR_PART_DETAILS: [&str; 9] = [
    "half", "semester", "quarter", "qtr", "month", "mth", "week", "wk", "season",
];

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
