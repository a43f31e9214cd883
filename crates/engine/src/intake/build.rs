//! Rows to items: each item gets a regular run of periods from its first to its last, with gaps
//! where a period is missing or a cell is empty, and every anomaly becomes a warning or an error.
//!
//! Kept apart from: classification (that is [`super::table`]) and cell reading (numbers and
//! periods). Here the decisions are about rows: order, duplicates, gaps, blank lines.
//!
//! Rules: single and wide tables must have one row per period (a repeated period is an error
//! naming both lines; rows out of order are sorted, with a warning). Long tables may list rows in
//! any order, and repeated (item, period) rows are summed, with a warning naming item, period and
//! lines; a total above the values' bound (10^15, see [`super::number`]) is an error. Item names
//! that differ only in white space (leading, trailing, repeated, tabs, no-break spaces) or case
//! are one item, with a warning naming each spelling and its lines. Tables with no period column number
//! their rows 1, 2, ...; a blank line inside such a table is a gap, while in dated tables blank
//! lines are skipped with a warning.
//!
//! Nothing vanishes: an item whose cells are all empty or "n/a" is not built and a warning says
//! it has no values; a value column whose header repeats another's gets " (2)", " (3)", ... and a
//! warning names the columns.
//!
//! Work: an item holds one slot per period from its first to its last, so a few rows far apart
//! could make many slots. Besides the typo rule for periods (in [`super::period`]) and
//! [`MAX_PERIODS`] per item, all items together hold at most [`MAX_PERIODS`] plus
//! [`SLOTS_PER_ROW`] slots per row read; an item that would pass that is an error, not read.
//! So reading takes time and memory proportional to the text.

use crate::sorting;
use std::collections::{HashMap, HashSet};

use super::frame::{wide_row_error, Table};
use super::headers::{header_is_only, header_says, names_money, OfAnother};
use super::label::TimeKey;
use super::number::{is_missing, parse_number};
use super::period::{read_periods_anchored, WeekAnchor};
use super::shapes::{names_no_demand, SaleDetail, NO_DEMAND};
use super::table::{names_weeks, Plan};
use super::text::Record;
use super::words::MONTH_WORDS;

mod across;
mod long;
mod parts_in_years;
mod readings;
mod unnamed;
mod year_grid;

use super::{DecimalMark, Item, Layout, RowError};
use crate::calendar::{Frequency, Period};
/// Header words naming a place items are sold at (the long layout's readings per place; the
/// group columns written once).
pub(crate) use readings::PLACE_WORDS;

/// Longest run of periods one item may span (about 270 years of days).
pub(crate) const MAX_PERIODS: i64 = 100_000;

/// Slots (periods of items) allowed per row read, on top of [`MAX_PERIODS`] (our choice: a
/// transaction log where most items sell a few times over years needs a few hundred per row).
pub(crate) const SLOTS_PER_ROW: usize = 1_000;

/// How many entries a warning lists before "and N more".
const LISTED: usize = 8;

/// What the rows made.
#[derive(Clone, Debug, Default, PartialEq)]
pub(crate) struct Built {
    pub items: Vec<Item>,
    pub frequency: Option<Frequency>,
    pub date_format: Option<String>,
    pub gaps_filled: usize,
    pub empty_cells: usize,
    pub warnings: Vec<String>,
    pub errors: Vec<RowError>,
    /// Each row's period and line in a table with a period column (single, wide, long):
    /// what leaving a period out removes. Empty for periods across the header.
    pub row_periods: Vec<(Period, usize)>,
}

/// "1 cell", "2 cells": a count with its noun.
pub(crate) fn count(n: usize, noun: &str) -> String {
    if n == 1 {
        format!("1 {noun}")
    } else {
        format!("{n} {noun}s")
    }
}

/// `one` for a count of 1, else `many`: a verb or pronoun agreeing with a count ("is" or
/// "are", "it" or "they").
pub(crate) fn agreeing<'w>(n: usize, one: &'w str, many: &'w str) -> &'w str {
    if n == 1 {
        one
    } else {
        many
    }
}

/// How an item's name joins its cells when several columns name items (a code and a
/// description, a store and an item): the long, across and year-grid layouts name items so,
/// totals.rs and the stock table's matching (stock_names.rs) split or build names by it.
pub(crate) const PART_JOIN: &str = " / ";

/// A cell or name with its runs of white space made one space and its ends trimmed: the form
/// in which the builders keep names and cells ("Oak  Lane" is "Oak Lane").
pub(crate) fn spaced(text: &str) -> String {
    text.split_whitespace().collect::<Vec<_>>().join(" ")
}

/// A row's cells in the item columns, in their order, white space runs made one space and ""
/// for an empty cell ([`Item::parts`]); none where fewer than two columns name items.
pub(crate) fn item_parts(row: &Record, item_columns: &[usize]) -> Vec<String> {
    if item_columns.len() < 2 {
        return Vec::new();
    }
    item_columns
        .iter()
        .map(|j| {
            let cell = row.cells.get(*j).map_or("", String::as_str);
            if is_missing(cell) {
                String::new()
            } else {
                spaced(cell)
            }
        })
        .collect()
}

/// "a, b, c and 4 more".
pub(crate) fn listing(entries: &[String]) -> String {
    let shown = entries
        .iter()
        .take(LISTED)
        .cloned()
        .collect::<Vec<_>>()
        .join(", ");
    if entries.len() > LISTED {
        format!("{shown} and {} more", entries.len() - LISTED)
    } else {
        shown
    }
}

/// "a", "a and b", "a, b and c"; past [`LISTED`] entries, "a, b, ... and N more".
pub fn list_in_words(entries: &[String]) -> String {
    match entries {
        [] => String::new(),
        [one] => one.clone(),
        _ if entries.len() > LISTED => listing(entries),
        [rest @ .., last] => format!("{} and {last}", rest.join(", ")),
    }
}

/// "line 3" or "lines 2 and 4".
pub(crate) fn lines(numbers: &[usize]) -> String {
    let numbers: Vec<String> = numbers.iter().map(usize::to_string).collect();
    let noun = if numbers.len() == 1 { "line" } else { "lines" };
    format!("{noun} {}", list_in_words(&numbers))
}

struct Builder<'a> {
    table: &'a Table,
    plan: &'a Plan,
    mark: DecimalMark,
    out: Built,
    affixes: Vec<String>,
    affix_cells: usize,
    negatives: Vec<String>,
    /// Slots all items may still take (see the module doc), and the whole allowance.
    slots_left: usize,
    slots: usize,
    rows_read: usize,
    /// Cells (line, column) whose decimal-dot reading is a thousandth of their column's size
    /// ([`super::mark::thousands_dots`]): errors, with the value read, the size of the item's
    /// other values and whose values they are ("column's", "item's").
    thousands_dots: HashMap<(usize, usize), (f64, f64, &'static str)>,
    /// Single, wide and across tables: each item's empty cells after its last value, with
    /// that value's period, said once every item's end is known ([`Builder::after_the_last`]).
    after_last: Vec<(String, Vec<Period>, Period)>,
}

/// One row of a long table: period, quantity (None when empty) and the record it came from.
pub(crate) type LongRow<'a> = (Period, Option<f64>, &'a Record);

/// One row placed on the time axis.
struct Entry<'a> {
    period: Period,
    row: &'a Record,
}

/// Where periods in the file's order first break their run: the index of the period out of
/// it (a date typed with the wrong year, say) and of a neighbour it breaks the run with, or
/// `None` when every step goes one way (forward, or newest first, both read as written:
/// nothing to check). The run is the way most steps go. Of the two periods at a break, the
/// one whose removal mends the run there is out of it (the later when both or neither do).
/// Only a period that stands once counts: rows repeated per store, or an export stacked on
/// another, start again at the first period, and are summed or refused where they repeat; and
/// only one step against the run, or a quarter of the periods or fewer: more are a layout.
fn period_out_of_run(periods: &[Period]) -> Option<(usize, usize)> {
    let forward = periods.windows(2).filter(|w| w[1] > w[0]).count();
    let backward = periods.windows(2).filter(|w| w[1] < w[0]).count();
    if forward == 0 || backward == 0 {
        return None;
    }
    // Many steps against the run are a layout, not a slip (years side by side: Jan 2023,
    // Jan 2024, Feb 2023, ...): read as written, sorted, nothing to check.
    let against = forward.min(backward);
    if against >= 2 && 4 * against > periods.len() {
        return None;
    }
    let mut times: HashMap<Period, usize> = HashMap::new();
    for p in periods {
        *times.entry(*p).or_default() += 1;
    }
    let in_run = |a: Period, b: Period| if backward <= forward { a <= b } else { a >= b };
    let once = |i: usize| times[&periods[i]] == 1;
    let n = periods.len();
    (1..n)
        .filter(|&i| !in_run(periods[i - 1], periods[i]))
        .find_map(|i| {
            let without_earlier = i < 2 || in_run(periods[i - 2], periods[i]);
            let without_later = i + 1 >= n || in_run(periods[i - 1], periods[i + 1]);
            if without_earlier && !without_later && once(i - 1) {
                Some((i - 1, i))
            } else {
                once(i).then_some((i, i - 1))
            }
        })
}

/// A column's first three different values in sorted order, quoted, and ", ..." when it has
/// more: how a warning shows what a column it left out holds.
fn first_values(table: &Table, rows: &[&Record], column: usize) -> String {
    let mut words: Vec<&str> = table
        .column(column, rows)
        .into_iter()
        .filter(|c| !c.is_empty())
        .collect();
    sorting::sort(&mut words);
    words.dedup();
    let shown: Vec<String> = words.iter().take(3).map(|w| format!("\"{w}\"")).collect();
    let more = if words.len() > 3 { ", ..." } else { "" };
    format!("{}{more}", shown.join(", "))
}

/// Each item's value cells as (index into `rows`, column), with whose values they are in a
/// message: a value column in single and wide tables, the rows of one item in the value column
/// of a long table (grouped as that layout groups them), a row in an across table.
fn items_values(plan: &Plan, rows: &[&Record]) -> Vec<(Vec<(usize, usize)>, &'static str)> {
    match plan.layout {
        Layout::Single | Layout::Wide => plan
            .values
            .iter()
            .map(|&j| ((0..rows.len()).map(|i| (i, j)).collect(), "column's"))
            .collect(),
        Layout::Across => (0..rows.len())
            .map(|i| (plan.values.iter().map(|&j| (i, j)).collect(), "item's"))
            .collect(),
        Layout::Long => {
            let Some(&j) = plan.values.first() else {
                return Vec::new();
            };
            let mut order: Vec<String> = Vec::new();
            let mut groups: HashMap<String, Vec<(usize, usize)>> = HashMap::new();
            for (i, row) in rows.iter().enumerate() {
                let Some(key) = long::item_key(row, &plan.item_columns) else {
                    continue;
                };
                groups
                    .entry(key.clone())
                    .or_insert_with(|| {
                        order.push(key);
                        Vec::new()
                    })
                    .push((i, j));
            }
            order
                .into_iter()
                .filter_map(|k| groups.remove(&k))
                .map(|cells| (cells, "item's"))
                .collect()
        }
    }
}

/// The error for a period column whose header names weeks and nothing else ("Week", "Wk no",
/// "Year/Week", "Week ending") over labels read as months ("2024-01": January 2024, or week
/// 1?): at its first row, and nothing is read. Read as months, weekly demand would be planned a month at a time, about a
/// quarter of the real rate per period.
fn weeks_read_as_months(
    table: &Table,
    column: usize,
    frequency: Frequency,
    rows: &[&Record],
) -> Option<RowError> {
    let name = table.column_name(column);
    let weeks = names_weeks(table, column);
    let row = rows.first()?;
    let text = row.cells.get(column).cloned().unwrap_or_default();
    (weeks && frequency == Frequency::Monthly).then(|| RowError {
        row: row.line,
        column: name.clone(),
        message: format!(
            "expected weeks under \"{name}\"; its labels read as months (\"{text}\" as a \
             month), so nothing was read: write weeks with a W (2024-W01), or name the column \
             Month if they are months"
        ),
        text,
    })
}

/// The periods (indexes from `start`, in order) of a daily or monthly table of one
/// row per period that have no row and whose place in the calendar's season has none in most
/// of its occurrences nearby, while the other places have rows (a shop shut on Sundays and
/// Mondays, a kiosk shut in winter): closed, the long layout's rule (`unnamed`), asking more
/// ([`ONE_ROW_PER_PERIOD`]), and only where fewer than half the season's places are closed.
/// Why: a till's daily export writes no row for a day the shop is shut; filled as gaps those
/// days got the demand of the days around them, and a third of the days without a row was
/// refused as made up. Why the cautions (each from a file a review built): rows of another
/// period written as days read as mostly closed days (weekly rows with one stray weekday,
/// twice-weekly reports, "Mar-01" day labels read as thirty years of four months, fortnightly
/// or every-other-month rows): more than half the places closed is refused, as before; a
/// place missing by chance (rows missing at random from a quarter of the periods) is not
/// closed where the other places miss as many. Weekly tables are left out: the ISO year has 52
/// or 53 weeks, so a week's place does not recur every 52 periods; quarterly ones too: a
/// quarter missing every year is more often one the file leaves to the year's accounts than
/// a quarter the business is shut (a review's judgement; its rows stay gaps).
fn closed_places(present: &[bool], start: Period) -> Vec<usize> {
    let frequency = start.frequency();
    let season = match frequency.natural_season() {
        Some(season) if matches!(frequency, Frequency::Daily | Frequency::Monthly) => season,
        _ => return Vec::new(),
    };
    // One row per period writes every item's figure, zeros too: no period is quiet.
    let closed: Vec<usize> =
        unnamed::classify(present, Some(season), &[], true, ONE_ROW_PER_PERIOD)
            .iter()
            .enumerate()
            .filter(|(_, r)| **r == Some(unnamed::Unnamed::Closed))
            .map(|(t, _)| t)
            .collect();
    let mut places: Vec<usize> = closed.iter().map(|t| t % season).collect();
    sorting::sort(&mut places);
    places.dedup();
    if 2 * places.len() >= season {
        return Vec::new();
    }
    closed
}

/// The closed rule of a table of one row per period ([`closed_places`]): at least 3 of a
/// place's periods nearby without a row (two missing Julys in a year and a half are as likely
/// missing from the file), the other places with rows in at least 90 % of theirs (a shop's
/// open days miss only holidays). Our choice.
const ONE_ROW_PER_PERIOD: unnamed::ClosedRule = unnamed::ClosedRule {
    at_least: 3,
    open_share: 0.9,
};

/// A closed period is no sales (0) for an item that has a figure before and after it; one
/// before the item's first figure or after its last stays a gap, as the long layout reads it.
fn no_sales_when_closed(values: &mut [Option<f64>], closed: &[usize]) {
    let first = values.iter().position(Option::is_some);
    let last = values.iter().rposition(Option::is_some);
    if let (Some(first), Some(last)) = (first, last) {
        for &t in closed {
            if first < t && t < last {
                values[t] = Some(0.0);
            }
        }
    }
}

/// Fewest periods without a row that, with more than half as many as the rows, make a table
/// refused (`Builder::mostly_missing`): a few gaps among few rows are filled as before. Our
/// choice, as is the half.
const MADE_UP_PERIODS: usize = 6;

/// Builds the items. `ambiguous_dots`: whether any value cell reads two ways with a lone dot
/// ("1.050", the decimal mark's tally), the only cells the thousands-dot check looks for.
pub(crate) fn build(table: &Table, plan: &Plan, mark: DecimalMark, ambiguous_dots: bool) -> Built {
    let rows_read = table.rows.iter().filter(|r| !r.is_blank()).count();
    let slots = MAX_PERIODS as usize + SLOTS_PER_ROW * rows_read;
    let mut b = Builder {
        table,
        plan,
        mark,
        out: Built::default(),
        affixes: Vec::new(),
        affix_cells: 0,
        negatives: Vec::new(),
        slots_left: slots,
        slots,
        rows_read,
        thousands_dots: HashMap::new(),
        after_last: Vec::new(),
    };
    // In a comma file a lone "1.050" is read with a decimal dot (module `mark`); where that
    // makes it a thousandth of its item's other values, it is refused, never read a thousand
    // times small. An item's values: its column in single and wide tables, its rows in a long
    // one (a column there mixes items of any size), its row in an across one.
    let rows = table.fitting_rows();
    if ambiguous_dots && table.comma_delimited && mark == DecimalMark::Dot {
        for (cells, whose) in items_values(plan, &rows) {
            let texts: Vec<&str> = cells
                .iter()
                .map(|&(i, j)| rows[i].cells.get(j).map_or("", String::as_str))
                .collect();
            for (k, value, size) in super::mark::thousands_dots(&texts) {
                let (i, j) = cells[k];
                b.thousands_dots
                    .insert((rows[i].line, j), (value, size, whose));
            }
        }
    }
    for &j in &plan.codes {
        let why = if plan.details.is_empty() {
            "they repeat, and each item has each period on one row"
        } else {
            "they repeat under a header naming items"
        };
        b.out.warnings.push(format!(
            "column \"{}\" holds whole numbers read as item codes, not as quantities: {why}",
            table.column_name(j)
        ));
    }
    for &j in &plan.row_numbers {
        b.out.warnings.push(format!(
            "column \"{}\" holds a different number on every row: read as row numbers, not \
             as quantities, and not used",
            table.column_name(j)
        ));
    }
    for &j in &plan.calendar {
        b.out.warnings.push(format!(
            "column \"{}\" holds calendar details (weekdays, months, times of day or other \
             parts of a period), not items or quantities: not used",
            table.column_name(j)
        ));
    }
    for &j in &plan.notes {
        let words = first_values(table, &rows, j);
        let why = match plan.item_columns.first() {
            Some(&k) => format!(
                "beside \"{}\", which names the items, it splits no item's period, so its words \
                 ({words}) note the rows rather than name items",
                table.column_name(k),
            ),
            None => format!(
                "each period has one row, so its words ({words}) note the periods rather than \
                 name items, and the table is read as one history"
            ),
        };
        b.out.warnings.push(format!(
            "column \"{}\" was not used: {why}; to plan them as items, name the column \"item\"",
            table.column_name(j)
        ));
    }
    for (j, why) in &plan.details {
        let what = match why {
            SaleDetail::Named(word) => format!(
                "its header's \"{word}\" names how or by whom a sale was rung up (a till, \
                 cashier, payment or receipt), not what was sold"
            ),
            SaleDetail::OnePeriodEach(codes, spanned) => format!(
                "its {codes} codes each stand on rows of one period only ({spanned} periods), \
                 as receipt or order numbers of several lines do, so it names sales, not items"
            ),
            SaleDetail::OwnOnMostRows(once, all) => format!(
                "{once} of its {all} rows hold a code found on no other row, as receipt or \
                 order numbers do, so it names sales, not items"
            ),
        };
        b.out.warnings.push(format!(
            "column \"{}\" ({}) was not used: {what}; each item's rows of one period were \
             added up across it (if it names what was sold or where, call the column \"item\" \
             or \"store\" and it is read so)",
            table.column_name(*j),
            first_values(table, &rows, *j)
        ));
    }
    // Money as the quantities: one number column always stays (a price list planned is
    // still the user's call), but never without a word ("Value" and "Amount" name
    // quantities as often, `series,t,value`, and are not said).
    if let (Some(&q), Layout::Long | Layout::Single, true) =
        (plan.values.first(), plan.layout, table.header.is_some())
    {
        let name = table.column_name(q);
        if names_money(&name) && !header_is_only(&name, &["value", "values", "amount"]) {
            b.out.warnings.push(format!(
                "the quantities were read from column \"{name}\", whose header names money: if \
                 it holds money rather than the quantities sold, the forecasts and stock figures \
                 are in money (add a column of the quantities sold)"
            ));
        }
    }
    for &j in &plan.not_quantities {
        let name = table.column_name(j);
        let of_item = plan.of_items.iter().find(|(k, ..)| *k == j);
        let what = match of_item {
            Some((_, OfAnother::Returns, other)) => format!(
                "the goods returned of the item in column \"{other}\", not its sales (to plan \
                 on sales less returns, subtract them in the file)"
            ),
            Some((_, OfAnother::Money, other)) => {
                format!("the money of the item in column \"{other}\", not a quantity")
            }
            None if names_no_demand(&name) => NO_DEMAND.to_string(),
            None => "a price, an amount of money or an order number, not a quantity".to_string(),
        };
        b.out
            .warnings
            .push(format!("column \"{name}\" names {what}: not used"));
    }
    for &j in &plan.ignored {
        let why = match (plan.layout, plan.period) {
            // A year grid's total, another year's figures ("Last year") or notes.
            (Layout::Across, _) if plan.grid.is_some() => {
                "it is neither a month or quarter of the row's year nor an item's name (a total, \
                 another year's figures, notes)"
                    .to_string()
            }
            (Layout::Across, _) => "its header names no period".to_string(),
            (Layout::Long, _) => format!(
                "a long table reads one item, one period and one quantity column, and the \
                 quantities are read from \"{}\"",
                plan.values
                    .first()
                    .map_or(String::new(), |q| table.column_name(*q))
            ),
            // A wide or single table (a second date column, "week end" beside "week start"):
            // the long table's words had been said of it (a review).
            (_, Some((p, _))) => format!(
                "the periods are read from \"{}\" alone, the quantities from the item columns",
                table.column_name(p)
            ),
            (_, None) => "it is neither a period nor an item's quantities".to_string(),
        };
        b.out.warnings.push(format!(
            "column \"{}\" was not used: {why}",
            table.column_name(j)
        ));
    }
    for &j in &plan.empty {
        let named = table
            .header
            .as_ref()
            .is_some_and(|h| h.cells.get(j).is_some_and(|c| !c.is_empty()));
        let marked = table
            .rows
            .iter()
            .any(|r| r.cells.get(j).is_some_and(|c| !c.is_empty()));
        if !(named || marked) {
            continue;
        }
        let name = table.column_name(j);
        b.out.warnings.push(if plan.layout == Layout::Long {
            format!("column \"{name}\" is empty (every cell is empty or n/a) and was not used")
        } else {
            format!("\"{name}\" has no values (every cell is empty or n/a), so it was not planned")
        });
    }
    let mut kept: Vec<&Record> = Vec::new();
    let mut blank_lines = Vec::new();
    let mut positions: Vec<Option<&Record>> = Vec::new();
    for row in &table.rows {
        if row.is_blank() {
            blank_lines.push(row.line.to_string());
            positions.push(None);
        } else if let Some(error) = wide_row_error(table, row) {
            b.out.errors.push(error);
            positions.push(None);
        } else {
            kept.push(row);
            positions.push(Some(row));
        }
    }
    let dated = plan.period.is_some();
    if !blank_lines.is_empty() {
        let what = if dated || plan.layout == Layout::Long {
            "were skipped"
        } else {
            "were read as gaps (a blank line in a pasted column is an empty cell)"
        };
        b.out
            .warnings
            .push(format!("blank lines {} {what}", listing(&blank_lines)));
    }
    let column = plan.period.map(|(p, meaning)| {
        let joined = plan.split.map(|split| split.labels(&kept));
        let cells: Vec<&str> = match &joined {
            Some(labels) => labels.iter().map(String::as_str).collect(),
            None => table.column(p, &kept),
        };
        let anchor = match (&table.header, &plan.split) {
            (Some(_), None) => WeekAnchor::of_header(&table.column_name(p)),
            _ => WeekAnchor::Unsaid,
        };
        let series: Option<Vec<Option<String>>> =
            (plan.layout == Layout::Long && plan.split.is_none()).then(|| {
                kept.iter()
                    .map(|row| long::item_key(row, &plan.item_columns))
                    .collect()
            });
        let col = read_periods_anchored(&cells, meaning, anchor, series.as_deref());
        // Week.year is written the same way: said where no header names months.
        let months: Vec<&str> = MONTH_WORDS
            .iter()
            .chain(&["months", "monthly"])
            .copied()
            .collect();
        if meaning == Some(super::period::IntegerMeaning::DottedMonths)
            && (table.header.is_none() || !header_says(&table.column_name(p), &months))
        {
            b.out.warnings.push(format!(
                "column \"{}\": labels such as \"{}\" were read as month.year; if they are \
                 weeks (week.year), name the column Week",
                table.column_name(p),
                cells.iter().find(|c| !c.is_empty()).copied().unwrap_or("")
            ));
        }
        for (i, message) in &col.errors {
            match plan
                .split
                .and_then(|split| split.part_at_fault(table, kept[*i]))
            {
                Some((part, text, message)) => b.error(kept[*i].line, part, text, message),
                None => b.error(kept[*i].line, p, cells[*i], message.clone()),
            }
        }
        b.out.warnings.extend(col.warnings.iter().cloned());
        b.out.frequency = Some(col.frequency);
        b.out.date_format = Some(match plan.split {
            Some(split) => format!("{}, {}", col.description, split.describe(table)),
            None => col.description.clone(),
        });
        col
    });
    if let (Some(col), Some((p, _)), None) = (column.as_ref(), plan.period, plan.split) {
        let error = weeks_read_as_months(table, p, col.frequency, &kept).or_else(|| {
            parts_in_years::parts_summed_into_years(table, plan, col.frequency, &kept, &col.periods)
        });
        if let Some(error) = error {
            b.out.errors.push(error);
            return b.finish();
        }
    }
    if plan.layout != Layout::Across {
        if let Some(col) = column.as_ref() {
            b.out.row_periods = kept
                .iter()
                .zip(&col.periods)
                .filter_map(|(row, p)| p.map(|p| (p, row.line)))
                .collect();
        }
    }
    // Every item's rows every few periods (every other week): no period holds them, and read
    // as weeks every other one would be closed. Only at the cadences of such exports (every
    // other or every fourth week, every other month): a slow seller's sales a whole number of
    // days apart are its own, not a period. Quarters or years written as their first or last
    // month come three or twelve months apart. And only for several items: one item's sales
    // every other month are its own. (Daily files, the largest, skip the sort.)
    let cadence = match b.out.frequency {
        Some(Frequency::Weekly) => [2, 4].as_slice(),
        Some(Frequency::Monthly) => [2, 3, 12].as_slice(),
        _ => [].as_slice(),
    };
    if let (Layout::Long, Some(col), Some((p, _)), false) = (
        plan.layout,
        column.as_ref(),
        plan.period,
        cadence.is_empty(),
    ) {
        let mut named: Vec<Entry<'_>> = kept
            .iter()
            .zip(&col.periods)
            .filter_map(|(row, p)| p.map(|period| Entry { period, row }))
            .collect();
        sorting::sort_by_key(&mut named, |e| (e.period, e.row.line));
        named.dedup_by_key(|e| e.period);
        let step = named.get(..2).map(|w| w[0].period.steps_to(w[1].period));
        let several_items = || {
            kept.iter()
                .map(|row| long::item_key(row, &plan.item_columns))
                .collect::<HashSet<Option<String>>>()
                .len()
                >= 2
        };
        if step.is_some_and(|s| cadence.contains(&s))
            && several_items()
            && b.every_few_periods(&named, p)
        {
            return b.finish();
        }
    }
    match (plan.layout, column) {
        (Layout::Long, column) => b.long(&kept, column.as_ref()),
        (Layout::Across, _) => match &plan.grid {
            Some(grid) => b.year_grid(&kept, grid),
            None => b.across(&kept),
        },
        (_, Some(col)) => {
            let entries = kept
                .iter()
                .zip(&col.periods)
                .filter_map(|(row, p)| p.map(|period| Entry { period, row }))
                .collect();
            b.single_or_wide(entries, true);
        }
        (_, None) => {
            let entries = positions
                .iter()
                .enumerate()
                .filter_map(|(i, row)| {
                    row.map(|row| Entry {
                        period: Period::position(i as i64 + 1),
                        row,
                    })
                })
                .collect();
            b.out.empty_cells += blank_lines.len() * plan.values.len();
            b.single_or_wide(entries, false);
        }
    }
    b.finish()
}

impl<'a> Builder<'a> {
    /// The period as written on `row`: its period cell, or the cells joined where a month,
    /// quarter or week column (and a day) complete a year column ([`super::table::Plan::split`]).
    fn period_text(&self, row: &Record) -> String {
        let cell = |j: usize| row.cells.get(j).cloned().unwrap_or_default();
        match (self.plan.period, self.plan.split) {
            (Some(_), Some(split)) => split.label(|j| row.cells.get(j).map_or("", String::as_str)),
            (Some((p, _)), None) => cell(p),
            (None, _) => cell(0),
        }
    }

    fn error(&mut self, row: usize, column: usize, text: &str, message: String) {
        self.out.errors.push(RowError {
            row,
            column: self.table.column_name(column),
            text: text.to_string(),
            message,
        });
    }

    /// Reads one value cell: `Ok(None)` for an empty cell, `Err(())` when reported as an error.
    fn value(&mut self, row: &Record, column: usize) -> Result<Option<f64>, ()> {
        let cell = row.cells.get(column).map_or("", String::as_str);
        if is_missing(cell) {
            self.out.empty_cells += 1;
            return Ok(None);
        }
        if let Some(&(value, size, whose)) = self.thousands_dots.get(&(row.line, column)) {
            let message = format!(
                "expected a number of the {whose} size: with the decimal dot of this \
                 comma-separated file it reads as {value}, a hundredth or less of the {whose} \
                 other values (about {size}); if the dot separates thousands, write the number \
                 without it ({}); if it is right as written, write it with fewer decimals",
                cell.replace('.', "")
            );
            self.error(row.line, column, cell, message);
            return Err(());
        }
        match parse_number(cell, self.mark) {
            Ok(number) => {
                if let Some(affix) = number.affix {
                    self.affix_cells += 1;
                    if !self.affixes.contains(&affix) {
                        self.affixes.push(affix);
                    }
                }
                Ok(Some(number.value))
            }
            Err(problem) => {
                let message = problem.message(self.mark);
                self.error(row.line, column, cell, message);
                Err(())
            }
        }
    }

    fn check_negative(&mut self, item: &str, period: Period, value: Option<f64>) {
        if let Some(v) = value.filter(|v| *v < 0.0) {
            self.negatives.push(format!("\"{item}\" {period} ({v})"));
        }
    }

    /// The run from `first` to `last`, or an error at `row` when it is too long.
    fn run(&mut self, first: Period, last: Period, row: &Record, column: usize) -> Option<i64> {
        let steps = first.steps_to(last);
        if steps >= MAX_PERIODS {
            let cell = self.period_text(row);
            self.error(
                row.line,
                column,
                &cell,
                format!(
                    "expected periods within {MAX_PERIODS} steps of the first ({first}); this one \
                     is {steps} steps later: check its year"
                ),
            );
            return None;
        }
        Some(steps + 1)
    }

    /// Takes `len` slots more when the allowance has them beside the `reserved` ones (no
    /// error: the caller goes without).
    fn spare_slots(&mut self, len: usize, reserved: usize) -> bool {
        let spare = len.saturating_add(reserved) <= self.slots_left;
        if spare {
            self.slots_left -= len;
        }
        spare
    }

    /// Takes `len` slots for item `name`; `false`, with an error at `row` and `column`, when
    /// all items together would pass the allowance of the module doc.
    fn take_slots(&mut self, len: usize, name: &str, row: usize, column: usize) -> bool {
        if len <= self.slots_left {
            self.slots_left -= len;
            return true;
        }
        let message = format!(
            "expected the items' periods to fit in {} in all ({} rows read: {SLOTS_PER_ROW} per \
             row, plus {MAX_PERIODS}); \"{name}\" would need {len} more, so it was not read: \
             check for periods far from the rest",
            self.slots, self.rows_read
        );
        self.error(row, column, name, message);
        false
    }

    /// The error for a table of one row per period whose rows leave more periods without a
    /// row (`missing`) than they hold, or more than half as many (a third of the periods) and
    /// at least [`MADE_UP_PERIODS`]: nothing is read. The labels most likely mean other
    /// periods ("Jan-01" to "Jan-20", days, read as January of 2001 to 2020; every other
    /// week), a typed year puts one row far from the rest, or the export leaves out the
    /// periods without sales: filled as gaps and interpolated, much of the history would be
    /// made up. Named at the row beside the widest gap that stands apart (the first or last
    /// row when the gap cuts it off: a typed year), else the row after it.
    fn mostly_missing(&mut self, unique: &[Entry<'a>], missing: usize, column: usize) {
        if self.every_few_periods(unique, column) {
            return;
        }
        let steps: Vec<i64> = unique
            .windows(2)
            .map(|w| w[0].period.steps_to(w[1].period))
            .collect();
        let Some((at, &widest)) = steps
            .iter()
            .enumerate()
            .filter(|(_, s)| **s > 1)
            .max_by_key(|(i, s)| (**s, std::cmp::Reverse(*i)))
        else {
            return;
        };
        // A gap wider than every other one that cuts off the first row stands it apart.
        let alone = steps.iter().filter(|s| **s == widest).count() == 1;
        let named = if at == 0 && alone { 0 } else { at + 1 };
        // Cut off at either end by a gap wider than any other: likely a typed year.
        let apart = alone && (at == 0 || at + 2 == unique.len());
        let year = if apart { "check this row's year; " } else { "" };
        let (first, last) = (unique[0].period, unique[unique.len() - 1].period);
        let frequency = self.out.frequency.map_or("", |f| f.as_str());
        let row = unique[named].row;
        let cell = self.period_text(row);
        self.error(
            row.line,
            column,
            &cell,
            format!(
                "expected periods that follow each other: read as {frequency} periods from \
                 {first} to {last}, the {} rows leave {missing} periods without a row, so \
                 nothing was read (gaps are filled by interpolation, and this many would make up \
                 much of the history); {year}if the labels mean other periods \
                 (days written like Jan-01), write whole dates such as 2024-01-01; if each row \
                 is a month's or a week's figure, write the month or week itself (2024-01, \
                 2024-W01); if the periods without a row had no sales, give them rows with 0",
                unique.len()
            ),
        );
    }

    /// The error for rows that come every few periods, always as many (every other week,
    /// every four weeks, every two months), at the second; true when given. Such rows hold
    /// a period of their own, which no frequency here holds: read as the shorter periods
    /// they would be totals beside empty or closed ones (`unique`: the first row of each
    /// period named, in order).
    fn every_few_periods(&mut self, unique: &[Entry<'a>], column: usize) -> bool {
        let steps: Vec<i64> = unique
            .windows(2)
            .map(|w| w[0].period.steps_to(w[1].period))
            .collect();
        let Some(&step) = steps.first().filter(|s| **s > 1) else {
            return false;
        };
        if steps.len() < 3 || steps.iter().any(|s| *s != step) {
            return false;
        }
        let (first, last) = (unique[0].period, unique[unique.len() - 1].period);
        let (one, many) = self
            .out
            .frequency
            .map_or(("period", "periods"), |f| f.period_words());
        let longer = match self.out.frequency {
            Some(Frequency::Daily) => " (or per week)",
            Some(Frequency::Weekly) => " (or per month)",
            Some(Frequency::Monthly) => " (or per quarter)",
            Some(Frequency::Quarterly) => " (or per year)",
            _ => "",
        };
        let row = unique[1].row;
        let cell = self.period_text(row);
        // Months three or twelve apart are quarters or years, which are read when written so.
        let written_longer = match (self.out.frequency, step) {
            (Some(Frequency::Monthly), 3) => Some(("a quarter", "the quarter itself (2022-Q1)")),
            (Some(Frequency::Monthly), 12) => Some(("a year", "the year itself (2022)")),
            _ => None,
        };
        let message = match written_longer {
            Some((what, write)) => format!(
                "expected periods that follow each other: the rows, {first} to {last}, come \
                 every {step} months, so nothing was read: if each row is {what}'s total, \
                 write {write} or its first day, and it is read so; if the months between the \
                 rows had no sales, give them rows with 0"
            ),
            None => format!(
                "expected periods that follow each other: the rows, {first} to {last}, come \
                 every {step} {many}, a period Morrowcast does not have, so nothing was read; \
                 a row holding {step} {many}' sales cannot be split into {many} without making \
                 figures up: give one row per {one}{longer} from your records, or, if the \
                 {many} between the rows had no sales, rows with 0 for them"
            ),
        };
        self.error(row.line, column, &cell, message);
        true
    }

    /// The warning naming an item's empty quantity cells (`cells` of them) read as gaps in
    /// `periods`, in every layout.
    fn empty_cells_read_as_gaps(&mut self, name: &str, cells: usize, periods: &[String]) {
        self.out.warnings.push(format!(
            "\"{name}\": {} read as {} ({})",
            count(cells, "empty cell"),
            if cells == 1 { "a gap" } else { "gaps" },
            listing(periods)
        ));
    }

    /// Says an item's empty cells (`cells`, one entry per cell) against its history from
    /// `first` to `last` (its first and last figures), in every layout: inside it they are
    /// gaps, which are filled; before it, left out (not sold yet); after it, kept for
    /// [`Builder::after_the_last`], which says them once every item's end is known.
    fn empty_cells(&mut self, name: &str, cells: Vec<Period>, first: Period, last: Period) {
        let (before, rest): (Vec<Period>, Vec<Period>) =
            cells.into_iter().partition(|p| *p < first);
        let (after, mut inner): (Vec<Period>, Vec<Period>) =
            rest.into_iter().partition(|p| *p > last);
        if !inner.is_empty() {
            let cells = inner.len();
            sorting::sort(&mut inner);
            inner.dedup();
            let periods: Vec<String> = inner.iter().map(Period::to_string).collect();
            self.empty_cells_read_as_gaps(name, cells, &periods);
        }
        self.outside_the_history(name, before, first, "first");
        if !after.is_empty() {
            self.after_last.push((name.to_string(), after, last));
        }
    }

    /// The warning naming an item's empty cells before its first value or after its last
    /// (`end`: "first" or "last", at `value`): its history does not reach them. After the last,
    /// what it sold since is unknown: where other items have figures then, the plan gives it
    /// no stock figures ([`crate::order::OrderError::EndsEarly`]) and says why.
    fn outside_the_history(
        &mut self,
        name: &str,
        mut cells: Vec<Period>,
        value: Period,
        end: &str,
    ) {
        if cells.is_empty() {
            return;
        }
        let n = cells.len();
        sorting::sort(&mut cells);
        cells.dedup();
        let (side, meaning) = if end == "first" {
            (
                "before",
                "its history starts there (not sold yet)".to_string(),
            )
        } else {
            (
                "after",
                "its history ends there (if those periods are past and it sold nothing in \
                 them, write 0 in them)"
                    .to_string(),
            )
        };
        self.out.warnings.push(format!(
            "\"{name}\": {} {side} its {end} value ({value}) left out ({}): {meaning}",
            count(n, "empty cell"),
            listing(&readings::ranges(&cells))
        ));
    }

    /// Says the empty cells after each item's last value (kept by `item_values`): up to the
    /// table's last period with a figure, item by item; the periods after it, where no item
    /// has a figure (next months written ahead), once for the table.
    fn after_the_last(&mut self, items: &[Item]) {
        let Some(end) = items.iter().filter_map(Item::last_value).max() else {
            self.after_last.clear();
            return;
        };
        let mut ahead: Vec<Period> = Vec::new();
        for (name, cells, last) in std::mem::take(&mut self.after_last) {
            let (within, beyond): (Vec<Period>, Vec<Period>) =
                cells.into_iter().partition(|p| *p <= end);
            ahead.extend(beyond);
            self.outside_the_history(&name, within, last, "last");
        }
        sorting::sort(&mut ahead);
        ahead.dedup();
        if !ahead.is_empty() {
            self.out.warnings.push(format!(
                "{} after the last with a figure ({end}) {} no figure for any item: left out \
                 ({}), as periods still to come",
                count(ahead.len(), "period"),
                if ahead.len() == 1 { "has" } else { "have" },
                listing(&readings::ranges(&ahead))
            ));
        }
    }

    fn gap_warning(&mut self, names: &[String], missing: &[String]) {
        if missing.is_empty() || names.is_empty() {
            return;
        }
        let whose = if names.len() == 1 {
            format!("\"{}\"", names[0])
        } else {
            format!("each of {}", listing(names))
        };
        self.out.warnings.push(format!(
            "{} filled as gaps for {whose}: {}",
            count(missing.len(), "missing period"),
            listing(missing)
        ));
    }

    /// The name of value column `column` (the `value_index`-th), before repeats are told apart.
    fn base_name(&self, value_index: usize, column: usize) -> String {
        if self.table.header.is_some() {
            self.table.column_name(column)
        } else {
            format!("Series {}", value_index + 1)
        }
    }

    fn single_or_wide(&mut self, mut entries: Vec<Entry<'a>>, dated: bool) {
        let periods: Vec<Period> = entries.iter().map(|e| e.period).collect();
        if let Some((odd, beside)) = period_out_of_run(&periods) {
            let (odd, beside) = (&entries[odd], &entries[beside]);
            self.out.warnings.push(format!(
                "rows are not in time order (line {}, {}, is out of the run of the rows beside \
                 it, such as line {}, {}); they were sorted by period (check that row's date)",
                odd.row.line, odd.period, beside.row.line, beside.period
            ));
        }
        sorting::sort_by_key(&mut entries, |e| e.period);
        let period_column = self.plan.period.map_or(0, |(p, _)| p);
        let mut unique: Vec<Entry<'a>> = Vec::with_capacity(entries.len());
        // Rows of a day already taken whose time of day tells them apart: added to it. The
        // times taken on the current day, with their lines.
        let mut same_day: Vec<Entry<'a>> = Vec::new();
        let mut day_times: Vec<(TimeKey, usize)> = Vec::new();
        for entry in entries {
            match unique.last() {
                Some(prev) if prev.period == entry.period => {
                    let time = self.row_time(entry.row);
                    if day_times.is_empty() {
                        if let Some(first) = self.row_time(prev.row) {
                            day_times.push((first, prev.row.line));
                        }
                    }
                    let repeated = time
                        .and_then(|t| day_times.iter().find(|(seen, _)| *seen == t).map(|s| s.1));
                    match (time, repeated) {
                        (Some(t), None) if !day_times.is_empty() => {
                            day_times.push((t, entry.row.line));
                            same_day.push(entry);
                            continue;
                        }
                        _ => {}
                    }
                    let first_line = repeated.unwrap_or(prev.row.line);
                    let cell = self.period_text(entry.row);
                    let what = if repeated.is_some() {
                        "at that time of day is also on line"
                    } else {
                        "is also on line"
                    };
                    self.error(
                        entry.row.line,
                        period_column,
                        &cell,
                        format!(
                            "expected each period once; {} {what} {first_line}: where one of \
                             the two rows is a correction or a copy, keep one of the two rows; \
                             where a column names items by numbers, name its header \"item\"; \
                             to add up several rows per period, use item, period, quantity rows",
                            entry.period
                        ),
                    );
                }
                _ => {
                    day_times.clear();
                    unique.push(entry);
                }
            }
        }
        if !same_day.is_empty() {
            let share = if same_day.len() == 1 {
                "shares its"
            } else {
                "share their"
            };
            self.out.warnings.push(format!(
                "{} {share} day with an earlier row, told apart only by the time of day: each \
                 day's quantities are added up",
                count(same_day.len(), "row")
            ));
        }
        let (Some(first), Some(last)) = (unique.first(), unique.last()) else {
            return;
        };
        let (start, last_row, first_line) = (first.period, last.row, first.row.line);
        let Some(len) = self.run(start, last.period, last_row, period_column) else {
            return;
        };
        let mut present = vec![false; len as usize];
        for e in &unique {
            present[start.steps_to(e.period) as usize] = true;
        }
        let closed = if dated {
            closed_places(&present, start)
        } else {
            Vec::new()
        };
        let missing: Vec<String> = (0..len as usize)
            .filter(|i| !present[*i] && closed.binary_search(i).is_err())
            .map(|i| start.offset(i as i64).to_string())
            .collect();
        let (gaps, held) = (missing.len(), unique.len());
        if dated && (gaps > held || (2 * gaps > held && gaps >= MADE_UP_PERIODS)) {
            // Nothing is read, closed periods neither: the message counts every period
            // without a row.
            let without_row = present.iter().filter(|p| !**p).count();
            self.mostly_missing(&unique, without_row, period_column);
            return;
        }
        let mut items: Vec<Item> = Vec::new();
        let value_columns = self.plan.values.clone();
        let mut names = Names::default();
        for (k, &j) in value_columns.iter().enumerate() {
            let name = names.unique(self.base_name(k, j), j);
            let cells: Vec<(Period, &Record, usize)> = unique
                .iter()
                .chain(&same_day)
                .map(|e| (e.period, e.row, j))
                .collect();
            let Some(mut values) = self.item_values(&name, start, len as usize, &cells) else {
                continue;
            };
            no_sales_when_closed(&mut values, &closed);
            let header_line = self.table.header.as_ref().map_or(first_line, |h| h.line);
            if !self.take_slots(len as usize, &name, header_line, j) {
                continue;
            }
            let periods = (0..len).map(|i| start.offset(i)).collect();
            items.push(Item {
                name,
                periods,
                values,
                parts: Vec::new(),
            });
        }
        self.out.warnings.extend(names.repeats());
        if !items.is_empty() {
            let closed: Vec<Period> = closed.iter().map(|&t| start.offset(t as i64)).collect();
            self.out
                .warnings
                .extend(readings::closed_warning(&closed, "no row"));
        }
        if dated {
            let names: Vec<String> = items.iter().map(|i| i.name.clone()).collect();
            self.out.gaps_filled += missing.len() * items.len();
            self.gap_warning(&names, &missing);
        }
        self.after_the_last(&items);
        self.out.items = items;
    }

    /// The time of day reading leaves out of a row: written after the date in its period cell
    /// (midnight too), or alone in a calendar column beside the date (a till's time column).
    /// Rows of one day at different times are a day's sales, added up.
    fn row_time(&self, row: &Record) -> Option<TimeKey> {
        super::label::written_time(&self.period_text(row)).or_else(|| {
            self.plan
                .calendar
                .iter()
                .find_map(|&j| row.cells.get(j).and_then(|c| super::label::time_alone(c)))
        })
    }

    /// One item's values over `len` periods from `start`: each (period, row, column) of
    /// `cells` read into its period's slot, added to what is there (a day's timed rows). Empty
    /// cells are gaps, named in a warning; an item with no value is named in a warning (unless
    /// its cells were errors) and gives `None`.
    fn item_values(
        &mut self,
        name: &str,
        start: Period,
        len: usize,
        cells: &[(Period, &Record, usize)],
    ) -> Option<Vec<Option<f64>>> {
        let mut values = vec![None; len];
        let mut empty = Vec::new();
        let mut errors = 0;
        for &(period, row, column) in cells {
            match self.value(row, column) {
                Ok(None) => empty.push(period),
                Ok(Some(v)) => {
                    self.check_negative(name, period, Some(v));
                    let slot = &mut values[start.steps_to(period) as usize];
                    *slot = Some(slot.unwrap_or(0.0) + v);
                }
                Err(()) => errors += 1,
            }
        }
        if values.iter().all(Option::is_none) {
            if errors == 0 {
                self.out.warnings.push(format!(
                    "\"{name}\" has no values (every cell is empty or n/a), so it was not planned"
                ));
            }
            return None;
        }
        // An empty cell on a day whose other rows hold quantities adds nothing to it; a day of
        // empty cells only is a gap.
        let (beside, gaps): (Vec<Period>, Vec<Period>) = empty
            .into_iter()
            .partition(|p| values[start.steps_to(*p) as usize].is_some());
        let first = values.iter().position(Option::is_some).unwrap_or(0);
        let last = values.iter().rposition(Option::is_some).unwrap_or(0);
        self.empty_cells(
            name,
            gaps,
            start.offset(first as i64),
            start.offset(last as i64),
        );
        if !beside.is_empty() {
            let days: Vec<String> = beside.iter().map(Period::to_string).collect();
            self.out.warnings.push(format!(
                "\"{name}\": {} on days with other rows added nothing to them ({})",
                count(beside.len(), "empty cell"),
                listing(&days)
            ));
        }
        Some(values)
    }

    /// The error for a row whose item columns name nothing, at the first of them.
    fn no_item_name(&mut self, row: &Record, item_columns: &[usize]) {
        let j = item_columns[0];
        let cell = row.cells.get(j).map_or("", String::as_str);
        self.error(
            row.line,
            j,
            cell,
            "expected an item name; this row has none".into(),
        );
    }

    fn finish(mut self) -> Built {
        if !self.affixes.is_empty() {
            let forms: Vec<String> = self.affixes.iter().map(|a| format!("\"{a}\"")).collect();
            self.out.warnings.push(format!(
                "removed currency symbols or units from {} ({}); the numbers were used as \
                 written, without any conversion",
                count(self.affix_cells, "cell"),
                forms.join(", ")
            ));
        }
        if !self.negatives.is_empty() {
            self.out.warnings.push(format!(
                "{} kept as written (returns or corrections?): {}",
                count(self.negatives.len(), "negative value"),
                listing(&self.negatives)
            ));
        }
        self.out
    }
}

/// Unique item names for value columns: a repeated header gets " (2)", " (3)", ...; each
/// repeat is told in a warning. Linear in the number of columns.
#[derive(Default)]
struct Names {
    taken: HashSet<String>,
    next_suffix: HashMap<String, usize>,
    /// Each header text with the columns (index, name given) that carry it, in order.
    headed: Vec<(String, Vec<(usize, String)>)>,
    headed_at: HashMap<String, usize>,
}

impl Names {
    fn unique(&mut self, base: String, column: usize) -> String {
        let mut name = base.clone();
        if !self.taken.insert(name.clone()) {
            let n = self.next_suffix.entry(base.clone()).or_insert(2);
            loop {
                name = format!("{base} ({n})");
                *n += 1;
                if self.taken.insert(name.clone()) {
                    break;
                }
            }
        }
        let at = *self.headed_at.entry(base.clone()).or_insert_with(|| {
            self.headed.push((base, Vec::new()));
            self.headed.len() - 1
        });
        self.headed[at].1.push((column, name.clone()));
        name
    }

    /// One warning per header text carried by several columns.
    fn repeats(&self) -> Vec<String> {
        self.headed
            .iter()
            .filter(|(_, columns)| columns.len() > 1)
            .map(|(base, columns)| {
                let numbers: Vec<String> =
                    columns.iter().map(|(j, _)| (j + 1).to_string()).collect();
                let names: Vec<String> = columns.iter().map(|(_, n)| format!("\"{n}\"")).collect();
                format!(
                    "columns {} are headed \"{base}\"; they are read as {}",
                    list_in_words(&numbers),
                    list_in_words(&names)
                )
            })
            .collect()
    }
}
