//! A year read as the period beside a column left unread whose cells are parts of a year:
//! `Item,Year,Mon,Qty` with "Mon" holding 1 to 12 (or Jan to Dec), its header not one Intake
//! knows as a month's ([`super::super::words`]). Read so, each item's months of a year were
//! summed into one yearly figure, said only as a column not used and rows summed: a year's
//! demand planned as one period. Now an error at that column saying how to name it.
//!
//! Kept apart from: the columns named as a year's part, which are joined into one period
//! ([`super::super::joined`]), and the summing of repeated rows itself ([`super::long`]).

use std::collections::HashMap;

use super::long::item_key;
use crate::calendar::{Frequency, Period};
use crate::intake::label::month_name;
use crate::intake::table::{whole_number, Plan, Table};
use crate::intake::text::Record;
use crate::intake::RowError;

/// The error for the first unread column (calendar details or a long table's extra column)
/// whose filled cells are all month names or whole numbers from 1 to 53 and that tells one
/// item's rows of one year apart in at least half of the (item, year) pairs on several rows;
/// `None` unless the periods are years. `periods` are the rows' periods, as `rows`.
pub(super) fn parts_summed_into_years(
    table: &Table,
    plan: &Plan,
    frequency: Frequency,
    rows: &[&Record],
    periods: &[Option<Period>],
) -> Option<RowError> {
    if frequency != Frequency::Yearly || plan.split.is_some() {
        return None;
    }
    let (year, _) = plan.period?;
    let mut unread: Vec<usize> = plan.calendar.iter().chain(&plan.ignored).copied().collect();
    unread.sort_unstable();
    unread.into_iter().find_map(|j| {
        let cells = table.column(j, rows);
        let filled: Vec<&str> = cells
            .iter()
            .map(|c| c.trim())
            .filter(|c| !c.is_empty())
            .collect();
        if filled.is_empty() || !filled.iter().all(|c| part_of_a_year(c)) {
            return None;
        }
        let mut groups: HashMap<(Option<String>, Period), Vec<&str>> = HashMap::new();
        for ((row, period), cell) in rows.iter().zip(periods).zip(&cells) {
            if let Some(period) = period {
                groups
                    .entry((item_key(row, &plan.item_columns), *period))
                    .or_default()
                    .push(cell.trim());
            }
        }
        let several: Vec<&Vec<&str>> = groups.values().filter(|g| g.len() >= 2).collect();
        let apart = several
            .iter()
            .filter(|g| g.iter().any(|c| *c != g[0]))
            .count();
        if several.is_empty() || apart * 2 < several.len() {
            return None;
        }
        let name = table.column_name(j);
        let row = rows.first()?;
        Some(RowError {
            row: row.line,
            column: name.clone(),
            text: filled[0].to_string(),
            message: format!(
                "expected each row's period in one column, or a year beside a column named \
                 Month, Quarter or Week: column \"{name}\" holds parts of a year (such as \
                 \"{}\") that tell one item's rows of a year apart, beside the year in column \
                 \"{}\", and read so each year's rows would be summed into one yearly figure; \
                 if they are months, name the column Month (Item,Year,Month,Qty), if quarters \
                 Quarter, if weeks Week; if the column names something else, take it out of \
                 the file or name it \"store\" to plan each separately",
                filled[0],
                table.column_name(year)
            ),
        })
    })
}

/// A month's name ("Jan", "Jan.", "January") or a whole number from 1 to 53 (a month,
/// quarter or week within a year).
fn part_of_a_year(cell: &str) -> bool {
    let cell = cell.trim_end_matches('.');
    month_name(cell).is_some()
        || (whole_number(cell)
            && cell.len() <= 2
            && cell.parse::<u32>().is_ok_and(|n| (1..=53).contains(&n)))
}
