//! A year read as the period beside a column left unread that counts the year's months,
//! quarters or weeks: `Item,Year,Mon,Qty` with "Mon" holding 1 to 12 (or Jan to Dec), its
//! header a short form Intake does not join ("Mon", "Mnth", "M"), or "Month" beside a year
//! column whose header is not read as the calendar year ("Sales year", "FY"). Read so, each
//! item's months of a year were summed into one yearly figure, said only as a column not used
//! and rows summed: a year's demand planned as one period. Now an error at that column saying
//! what to name.
//!
//! The header decides which part a column may be, never its numbers alone: store, line or
//! pack numbers of 1 to 12 beside yearly rows are read as before (a review found a rule by
//! the cells alone refusing 38 ordinary yearly tables); under a short form, some item's year
//! must hold most of the year's parts (widths under "W", grades under "Q" are none).
//!
//! Kept apart from: the columns joined with a year into one period
//! ([`super::super::joined`]), and the summing of repeated rows itself ([`super::long`]).

use std::collections::HashMap;

use super::long::item_key;
use crate::calendar::{Frequency, Period};
use crate::intake::label::month_name;
use crate::intake::table::{header_is_only, whole_number, Plan, Table};
use crate::intake::text::Record;
use crate::intake::words::{
    MONTH_SHORT_FORMS, MONTH_WORDS, QUARTER_SHORT_FORMS, QUARTER_WORDS, WEEK_SHORT_FORMS,
    WEEK_WORDS,
};
use crate::intake::RowError;

/// A part of the year a column's header may name, with the short forms not joined with a
/// year ("Mon", "Mnth", "M"; "Q", "Qr"; "W") beside the words that are.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Part {
    Month,
    Quarter,
    Week,
}

impl Part {
    const ALL: [Part; 3] = [Part::Month, Part::Quarter, Part::Week];

    fn short_forms(self) -> &'static [&'static str] {
        match self {
            Part::Month => &MONTH_SHORT_FORMS,
            Part::Quarter => &QUARTER_SHORT_FORMS,
            Part::Week => &WEEK_SHORT_FORMS,
        }
    }

    fn words(self) -> &'static [&'static str] {
        match self {
            Part::Month => &MONTH_WORDS,
            Part::Quarter => &QUARTER_WORDS,
            Part::Week => &WEEK_WORDS,
        }
    }

    fn count(self) -> u32 {
        match self {
            Part::Month => 12,
            Part::Quarter => 4,
            Part::Week => 53,
        }
    }

    fn name(self) -> &'static str {
        match self {
            Part::Month => "Month",
            Part::Quarter => "Quarter",
            Part::Week => "Week",
        }
    }

    /// Whether a cell is one of this part: 1 to its count, or a month's name.
    fn holds(self, cell: &str) -> bool {
        let cell = cell.trim_end_matches('.');
        (self == Part::Month && month_name(cell).is_some())
            || (whole_number(cell)
                && cell.len() <= 2
                && cell
                    .parse::<u32>()
                    .is_ok_and(|n| (1..=self.count()).contains(&n)))
    }
}

/// The error for the first unread column (calendar details or a long table's extra column)
/// whose header names a part of the year (a word or a short form, [`Part`]), whose filled
/// cells are at least three in four that part (a "Total" or "n/a" among them does not hide
/// it), and that tells one item's rows of one year apart in at least half of the (item,
/// year) pairs on several rows; `None` unless the periods are years. `periods` are the rows'
/// periods, as `rows`.
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
    let mut unread: Vec<usize> = plan.calendar.iter().chain(&plan.ignored).copied().collect();
    unread.sort_unstable();
    unread.into_iter().find_map(|j| {
        let name = table.column_name(j);
        let (part, named) = Part::ALL.into_iter().find_map(|part| {
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
        // Under a short form, most of a year's parts on some item's rows: "W" widths of 30, 45
        // and 50, "M" lengths or "Q" grades are no weeks, months or quarters (a review found
        // them refused).
        let fullest = several
            .iter()
            .map(|g| g.iter().collect::<std::collections::HashSet<_>>().len())
            .max()
            .unwrap_or(0);
        if !named && fullest * 2 <= part.count() as usize {
            return None;
        }
        let (row, text) = rows
            .iter()
            .zip(&cells)
            .find(|(_, c)| part.holds(c.trim()))
            .map(|(row, c)| (row.line, c.trim().to_string()))?;
        let year_name = table.column_name(year);
        let part_name = part.name();
        let what = if named {
            // The part is named: the year's header is what is not read as a calendar year.
            format!(
                "column \"{name}\" names the {} of each row, but column \"{year_name}\" is read \
                 as years alone, its header not naming the calendar year: if it is the calendar \
                 year, name it Year (Item,Year,{part_name},Qty); a fiscal year's {}s cannot be \
                 placed (write calendar months or dates)",
                part_name.to_lowercase(),
                part_name.to_lowercase()
            )
        } else {
            format!(
                "column \"{name}\" holds {}s (such as \"{text}\") beside the year in column \
                 \"{year_name}\", but its header is not one read as the {}: if they are, name \
                 it {part_name} (Item,Year,{part_name},Qty); if it counts something else, name \
                 it so",
                part_name.to_lowercase(),
                part_name.to_lowercase()
            )
        };
        Some(RowError {
            row,
            column: name,
            text,
            message: format!(
                "expected a year and its {} read as one period: {what}; read as it is, each \
                 item's rows of a year would be summed into one yearly figure",
                part_name.to_lowercase()
            ),
        })
    })
}
