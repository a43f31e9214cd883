//! Tables of a year down and its months or quarters across ([`crate::intake::Layout::Across`]
//! with a [`YearGrid`]): each row is one item's year, each cell the period of that year and
//! its column's part, read with the same number rules as any other layout (errors at the row,
//! under the part's header). An item's rows may come in any order; its name written in ways
//! that differ only in white space or case is one item, said, as in long tables; a year given
//! twice for one item is an error at the second row (adding them up could count one thing
//! twice); a year outside 1969 to 2068, or standing more than five years from the table's
//! others at its first or last, is an error at its cell (a code or a typo). Periods
//! an item's history spans that no row or column holds (a year without a row, months without
//! a column) are gaps, named in a warning; empty cells are said as in every layout.
//!
//! Kept apart from: finding such a table ([`crate::intake::year_grid`]) and the other layouts.

use crate::sorting;
use std::collections::HashMap;

use super::long::{item_name, name_key};
use super::{item_parts, spaced, Builder, PART_JOIN};
use crate::calendar::Period;
use crate::intake::text::Record;
use crate::intake::totals::total_name;
use crate::intake::year_grid::{believable_year, YearGrid};
use crate::intake::Item;

/// One item's rows: its name, each row with its year, and the ways its name is written (with
/// their lines).
struct ItemRows<'a> {
    name: String,
    rows: Vec<(i32, &'a Record)>,
    spellings: Vec<(String, Vec<usize>)>,
}

/// A year standing apart from the table's others, and the nearest of those.
struct Stray {
    year: i32,
    nearest: i32,
}

/// Most years a first or last year may stand from the next one before it is taken for a typo
/// (our choice: a product off sale for longer is rare, a mistyped year common).
const STRAY_GAP: i32 = 5;

/// The table's first or last year when it stands more than [`STRAY_GAP`] years from the next
/// (the last if both do: newer rows are typed by hand more often).
fn stray_year(years: &[(i32, &Record)]) -> Option<Stray> {
    let mut distinct: Vec<i32> = years.iter().map(|(y, _)| *y).collect();
    sorting::sort(&mut distinct);
    distinct.dedup();
    let n = distinct.len();
    if n < 2 {
        return None;
    }
    let (first, second) = (distinct[0], distinct[1]);
    let (before_last, last) = (distinct[n - 2], distinct[n - 1]);
    if last - before_last > STRAY_GAP {
        return Some(Stray {
            year: last,
            nearest: before_last,
        });
    }
    (second - first > STRAY_GAP).then_some(Stray {
        year: first,
        nearest: second,
    })
}

impl<'a> Builder<'a> {
    pub(super) fn year_grid(&mut self, kept: &[&'a Record], grid: &YearGrid) {
        let across = grid.across();
        let year_column = grid.year();
        self.out.frequency = Some(across.frequency());
        let example = across.period(2024, 1);
        self.out.date_format = Some(format!(
            "{} (e.g. {example}), from the year in column \"{}\" and the {} across the header",
            across.plural(),
            self.table.column_name(year_column),
            across.plural()
        ));
        let item_columns = self.plan.item_columns.clone();
        let year_cell = |row: &'a Record| row.cells.get(year_column).map_or("", String::as_str);
        let mut items_rows: Vec<ItemRows<'a>> = Vec::new();
        let mut index: HashMap<String, usize> = HashMap::new();
        let mut seen: HashMap<(usize, i32), usize> = HashMap::new();
        let mut years: Vec<(i32, &'a Record)> = Vec::new();
        for &row in kept {
            let Some((filled, name)) = item_name(row, &item_columns) else {
                self.no_item_name(row, &item_columns);
                continue;
            };
            let cell = year_cell(row);
            // A total row with its year left blank ("Grand total,,..."): the items' total, as
            // the other layouts leave out a total item; said.
            if cell.trim().is_empty() && total_name(&name) {
                self.out.warnings.push(format!(
                    "row {} (\"{name}\") names a total and no year: not read, as the items' \
                     total",
                    row.line
                ));
                continue;
            }
            let Some(year) = believable_year(cell) else {
                self.error(
                    row.line,
                    year_column,
                    cell,
                    format!(
                        "expected a year of four digits from 1969 to 2068 (such as 2024): the \
                         {} across the header are of this row's year",
                        across.plural()
                    ),
                );
                continue;
            };
            // Names that differ only in white space or case are one item, as in long tables.
            let at = *index.entry(name_key(&name)).or_insert_with(|| {
                items_rows.push(ItemRows {
                    name: spaced(&name),
                    rows: Vec::new(),
                    spellings: Vec::new(),
                });
                items_rows.len() - 1
            });
            if let Some(first) = seen.get(&(at, year)) {
                let message = format!(
                    "expected each item's year on one row; \"{name}\" {year} is also on line \
                     {first}: this row was not read (to add up several rows, use item, period, \
                     quantity rows)"
                );
                self.error(row.line, year_column, cell, message);
                continue;
            }
            seen.insert((at, year), row.line);
            years.push((year, row));
            let written = filled
                .iter()
                .map(|j| row.as_written(*j))
                .collect::<Vec<_>>()
                .join(PART_JOIN);
            let spellings = &mut items_rows[at].spellings;
            match spellings.iter_mut().find(|(s, _)| *s == written) {
                Some((_, lines)) => lines.push(row.line),
                None => spellings.push((written, vec![row.line])),
            }
            items_rows[at].rows.push((year, row));
        }
        // A year far from the table's others, first or last, is a typo: read, it would
        // spread its items over years of gaps.
        if let Some(stray) = stray_year(&years) {
            for item in &mut items_rows {
                item.rows.retain(|(year, _)| *year != stray.year);
            }
            for (year, row) in years.iter().filter(|(y, _)| *y == stray.year) {
                self.error(
                    row.line,
                    year_column,
                    year_cell(row),
                    format!(
                        "expected a year near the table's others ({year} is {} years from \
                         {}, the nearest): check this row's year; the row was not read",
                        (year - stray.nearest).abs(),
                        stray.nearest
                    ),
                );
            }
        }
        let cells_of = |rows: &[(i32, &'a Record)]| -> Vec<(Period, &'a Record, usize)> {
            rows.iter()
                .flat_map(|&(year, row)| {
                    grid.parts()
                        .iter()
                        .map(move |&(j, n)| (across.period(year, n), row, j))
                })
                .collect()
        };
        let all: Vec<Period> = items_rows
            .iter()
            .flat_map(|item| cells_of(&item.rows))
            .map(|c| c.0)
            .collect();
        let (Some(&start), Some(&last)) = (all.iter().min(), all.iter().max()) else {
            return;
        };
        // Years run 1969 to 2068 (`believable_year`): at most 1,200 months, far within the
        // builder's longest run (`MAX_PERIODS`), so no span is refused here.
        let steps = start.steps_to(last);
        let len = steps as usize + 1;
        let mut items: Vec<Item> = Vec::new();
        for item in items_rows {
            let Some(&(_, first_row)) = item.rows.first() else {
                continue;
            };
            self.spellings_said(&item.name, &item.spellings);
            let cells = cells_of(&item.rows);
            let Some(values) = self.item_values(&item.name, start, len, &cells) else {
                continue;
            };
            // Periods inside the item's history that no cell holds: gaps, said.
            let mut held = vec![false; len];
            for (period, ..) in &cells {
                held[start.steps_to(*period) as usize] = true;
            }
            let first = values.iter().position(Option::is_some).unwrap_or(0);
            let last = values.iter().rposition(Option::is_some).unwrap_or(0);
            let missing: Vec<String> = (first..=last)
                .filter(|i| !held[*i])
                .map(|i| start.offset(i as i64).to_string())
                .collect();
            if !self.take_slots(len, &item.name, first_row.line, item_columns[0]) {
                continue;
            }
            self.out.gaps_filled += missing.len();
            self.gap_warning(std::slice::from_ref(&item.name), &missing);
            items.push(Item {
                name: item.name,
                periods: (0..len).map(|i| start.offset(i as i64)).collect(),
                values,
                parts: item_parts(first_row, &item_columns),
            });
        }
        self.after_the_last(&items);
        self.out.items = items;
    }
}
