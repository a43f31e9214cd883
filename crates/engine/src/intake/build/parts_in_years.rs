//! A year read as the period beside a column that counts the year's months, quarters or
//! weeks: `Item,Year,Mon,Qty` with "Mon" holding 1 to 12, its header a short form
//! ("Mon", "Mnth", "M", "MM"; [`YearPart::short_forms`]) whose numbers are not joined with a
//! year, or a part's word ("Month") beside a year column whose header is not read as the
//! calendar year ("Sales year", "FY"). Read so, each item's months of a year were summed into
//! one yearly figure, said only as a column not used and rows summed: a year's demand
//! planned as one period. Now an error at that column saying what to name.
//!
//! The header decides which part a column may be, never its numbers alone: store, line or
//! pack numbers of 1 to 12 beside yearly rows are read as before (a review found a rule by
//! the cells alone refusing 38 ordinary yearly tables); under a short form, some item's year
//! must hold all the year's parts ([`YearPart::whole_year`]; widths under "W", grades under
//! "Q" are none). The
//! column read as the quantity is looked at too (`Item,Year,Mon,Revenue`: "Mon" had been
//! the quantity, money passed over).
//!
//! Kept apart from: the columns joined with a year into one period
//! ([`super::super::joined`], whose [`YearPart`] names the parts), and the summing of repeated
//! rows itself ([`super::long`]).

use crate::sorting;
use std::collections::{HashMap, HashSet};

use super::long::item_key;
use crate::calendar::{Frequency, Period};
use crate::intake::frame::Table;
use crate::intake::headers::header_is_only;
use crate::intake::joined::YearPart;
use crate::intake::table::Plan;
use crate::intake::text::Record;
use crate::intake::words::YEAR_WORDS;
use crate::intake::RowError;

/// The error for the first column not read as a period (calendar details, a long table's
/// extra column, or the column read as the quantity) whose header names a part of the year
/// (a word or a short form), whose filled cells are at least three in four that part (a
/// "Total" or "n/a" among them does not hide it), and that tells one item's rows of one year
/// apart in at least half of the (item, year) pairs on several rows; `None` unless the
/// periods are years. `periods` are the rows' periods, as `rows`.
pub(super) fn parts_summed_into_years(
    table: &Table,
    plan: &Plan,
    frequency: Frequency,
    rows: &[&Record],
    periods: &[Option<Period>],
) -> Option<RowError> {
    if frequency != Frequency::Yearly || plan.split.is_some() || table.header.is_none() {
        return None;
    }
    let (year, _) = plan.period?;
    let mut unread: Vec<usize> = plan
        .calendar
        .iter()
        .chain(&plan.ignored)
        .chain(&plan.values)
        .copied()
        .collect();
    sorting::sort(&mut unread);
    unread.dedup();
    unread.into_iter().find_map(|j| {
        let name = table.column_name(j);
        let (part, named) = YearPart::ALL.into_iter().find_map(|part| {
            if header_is_only(&name, part.words()) {
                Some((part, true))
            } else {
                header_is_only(&name, part.short_forms()).then_some((part, false))
            }
        })?;
        let cells = table.column(j, rows);
        let filled: Vec<&str> = cells
            .iter()
            .map(|c| c.trim())
            .filter(|c| !c.is_empty())
            .collect();
        let parts = filled.iter().filter(|c| part.holds(c)).count();
        if filled.is_empty() || parts * 4 < filled.len() * 3 {
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
        // Under a short form, all of a year's parts on some item's rows: "W" widths of 30, 45
        // and 50, "M" lengths, "Q" grades or "Mo" model numbers are no weeks, months or
        // quarters (reviews found them refused).
        let fullest = several
            .iter()
            .map(|g| g.iter().collect::<HashSet<_>>().len())
            .max()
            .unwrap_or(0);
        if !named && fullest < part.whole_year() {
            return None;
        }
        let (row, text) = rows
            .iter()
            .zip(&cells)
            .find(|(_, c)| part.holds(c.trim()))
            .map(|(row, c)| (row.line, c.trim().to_string()))?;
        let year_name = table.column_name(year);
        let (part_name, lower) = (part.name(), part.name().to_lowercase());
        let what = if !named {
            format!(
                "column \"{name}\" holds {lower}s (such as \"{text}\") beside the year in column \
                 \"{year_name}\", but its header is not one read as the {lower}: if they are, name \
                 it {part_name} (Item,Year,{part_name},Qty); if it counts something else, name \
                 it so"
            )
        } else if !header_is_only(&year_name, &YEAR_WORDS) {
            // The part is named: the year's header is what is not read as a calendar year.
            format!(
                "column \"{name}\" names the {lower} of each row, but column \"{year_name}\" is \
                 read as years alone, its header not naming the calendar year: if it is the \
                 calendar year, name it Year (Item,Year,{part_name},Qty); a fiscal year's \
                 {lower}s cannot be placed (write calendar months or dates)"
            )
        } else {
            format!(
                "column \"{name}\" names the {lower} of each row beside the year in column \
                 \"{year_name}\", but the two do not read as one period: write each row's \
                 period in one column (such as 2024-03)"
            )
        };
        Some(RowError {
            row,
            column: name,
            text,
            message: format!(
                "expected a year and its {lower} read as one period: {what}; read as it is, \
                 each item's rows of a year would be summed into one yearly figure"
            ),
        })
    })
}
