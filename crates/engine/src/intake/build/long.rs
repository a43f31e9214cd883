//! Long tables (item, period, quantity): rows grouped by item in any order, repeated (item,
//! period) rows summed with a warning, the periods inside an item's run without its row read
//! as no sales or gaps by [`super::readings`] (such tables, a till's or an order system's
//! export, leave out the zeros; interpolating there would invent demand), spellings of one
//! name that differ only in white space or case read as one item with a warning, and each
//! item's own run of periods with gaps. A row whose
//! item cell is empty or a "no value" marker (`n/a`) is an error: it names no item.
//!
//! Kept apart from: single and wide tables (in [`super`]), where a repeated period is an error.

use crate::sorting;
use std::collections::{HashMap, HashSet};

use super::readings::{place_column, ItemPeriods, Reading, Readings};
use super::{
    count, item_parts, lines, listing, period_out_of_run, spaced, Builder, LongRow, MAX_PERIODS,
    PART_JOIN,
};
use crate::calendar::Period;
use crate::intake::number::{is_missing, MAX_MAGNITUDE};
use crate::intake::period::PeriodColumn;
use crate::intake::text::Record;
use crate::intake::Item;

/// One item's rows as read, under the name of its first row.
struct LongItem<'a> {
    name: String,
    rows: Vec<LongRow<'a>>,
    /// Each spelling of the name as written (before trimming) and the lines that use it, in
    /// the order first seen; `spelled` finds a spelling's place.
    spellings: Vec<(String, Vec<usize>)>,
    spelled: HashMap<String, usize>,
    /// The item columns its first row fills.
    filled: Vec<usize>,
    /// Its first row's cells in the item columns ([`Item::parts`]).
    parts: Vec<String>,
}

/// A spelling in quotes, with tabs and white space other than the plain space made visible.
fn shown(spelling: &str) -> String {
    let mut s = String::from("\"");
    for c in spelling.chars() {
        match c {
            '\t' => s.push_str("\\t"),
            ' ' => s.push(' '),
            c if c.is_whitespace() || c == '\u{feff}' => {
                s.push_str(&format!("\\u{{{:x}}}", u32::from(c)));
            }
            c => s.push(c),
        }
    }
    s.push('"');
    s
}

impl<'a> Builder<'a> {
    /// Says that an item's name is written in several ways (`spellings`: each form as written
    /// and its lines) that differ only in white space or case, read as one item; in every
    /// layout that gathers an item from several rows.
    pub(super) fn spellings_said(&mut self, name: &str, spellings: &[(String, Vec<usize>)]) {
        if spellings.len() < 2 {
            return;
        }
        let forms: Vec<String> = spellings
            .iter()
            .map(|(s, l)| format!("{} ({})", shown(s), lines(l)))
            .collect();
        self.out.warnings.push(format!(
            "\"{name}\" is written in {} ways that differ only in white space or case, read \
             as one item: {}",
            spellings.len(),
            listing(&forms)
        ));
    }

    pub(super) fn long(&mut self, kept: &[&'a Record], column: Option<&PeriodColumn>) {
        let value_column = self.plan.values[0];
        let item_columns = self.plan.item_columns.clone();
        let mut order: Vec<String> = Vec::new();
        let mut items: HashMap<String, LongItem<'a>> = HashMap::new();
        let mut unread: HashSet<usize> = HashSet::new();
        for (k, row) in kept.iter().enumerate() {
            let Some((filled, name)) = item_name(row, &item_columns) else {
                self.no_item_name(row, &item_columns);
                continue;
            };
            let written = filled
                .iter()
                .map(|j| row.as_written(*j))
                .collect::<Vec<_>>()
                .join(PART_JOIN);
            // Names that differ only in white space or case are one item.
            let key = name_key(&name);
            let next_position = items.get(&key).map_or(1, |i| i.rows.len() as i64 + 1);
            let period = match column {
                Some(col) => match col.periods.get(k).copied().flatten() {
                    Some(p) => p,
                    None => continue,
                },
                None => Period::position(next_position),
            };
            // A quantity that could not be read (an error at its cell) is unknown: a gap, not
            // no sales, and the row keeps its place among the item's rows.
            let value = match self.value(row, value_column) {
                Ok(value) => value,
                Err(()) => {
                    unread.insert(row.line);
                    None
                }
            };
            let item = items.entry(key).or_insert_with_key(|key| {
                order.push(key.clone());
                LongItem {
                    name,
                    rows: Vec::new(),
                    spellings: Vec::new(),
                    spelled: HashMap::new(),
                    filled: filled.clone(),
                    parts: item_parts(row, &item_columns),
                }
            });
            item.rows.push((period, value, row));
            match item.spelled.get(&written) {
                Some(at) => item.spellings[*at].1.push(row.line),
                None => {
                    item.spelled.insert(written.clone(), item.spellings.len());
                    item.spellings.push((written, vec![row.line]));
                }
            }
        }
        let period_column = self.plan.period.map_or(0, |(p, _)| p);
        let dated = column.is_some();
        self.partly_named(&item_columns, &order, &items);
        let mut readings = self.readings(&item_columns, &order, &items, dated);
        let runs = item_runs(&order, &items, &readings, dated);
        // Every item's own run is served before any run after its last row: the slots those
        // take must not leave a later item unread.
        let mut reserved: usize = runs.iter().map(|r| r.span).sum();
        let mut held = Vec::new();
        let mut summed = Vec::new();
        let mut zeros = Vec::new();
        let mut stopped = Vec::new();
        let mut unread_since = Vec::new();
        let mut out_of_order: Vec<String> = Vec::new();
        for (k, key) in order.into_iter().enumerate() {
            reserved = reserved.saturating_sub(runs[k].span);
            let Some(LongItem {
                name,
                mut rows,
                spellings,
                parts,
                ..
            }) = items.remove(&key)
            else {
                continue;
            };
            let zeros_written = rows.iter().any(|r| r.1 == Some(0.0));
            self.spellings_said(&name, &spellings);
            let periods: Vec<Period> = rows.iter().map(|r| r.0).collect();
            if let Some((odd, beside)) = period_out_of_run(&periods) {
                let (odd, beside) = (&rows[odd], &rows[beside]);
                out_of_order.push(format!(
                    "\"{name}\" (line {}, {}, out of the run of its rows beside it, such as \
                     line {}, {})",
                    odd.2.line, odd.0, beside.2.line, beside.0
                ));
            }
            sorting::sort_by_key(&mut rows, |r| r.0);
            let mut merged: Vec<(Period, Option<f64>, Vec<&'a Record>)> = Vec::new();
            for (period, value, row) in rows {
                match merged.last_mut() {
                    Some(last) if last.0 == period => {
                        last.1 = match (last.1, value) {
                            (Some(a), Some(b)) => Some(a + b),
                            (a, b) => a.or(b),
                        };
                        last.2.push(row);
                    }
                    _ => merged.push((period, value, vec![row])),
                }
            }
            // A period with a row that could not be read has no known total.
            let unreadable = |rows: &[&Record]| rows.iter().any(|r| unread.contains(&r.line));
            for m in merged.iter_mut().filter(|m| unreadable(&m.2)) {
                m.1 = None;
            }
            // An item with no readable quantity but the errors: they say it.
            if merged.iter().any(|m| unreadable(&m.2)) && merged.iter().all(|m| m.1.is_none()) {
                continue;
            }
            // Periods whose rows hold only empty quantity cells: gaps, named as the other
            // layouts name them (one entry per row; those before the first figure and after
            // the last lie outside the history and are said apart).
            let blank: Vec<Period> = merged
                .iter()
                .filter(|m| m.1.is_none() && !unreadable(&m.2))
                .flat_map(|m| std::iter::repeat_n(m.0, m.2.len()))
                .collect();
            for (period, value, rows) in merged
                .iter_mut()
                .filter(|m| m.2.len() > 1 && !unreadable(&m.2))
            {
                let numbers: Vec<usize> = rows.iter().map(|r| r.line).collect();
                let total = value.map_or("no value".to_string(), |v| v.to_string());
                if value.is_some_and(|v| v.abs() > MAX_MAGNITUDE) {
                    let last = rows[rows.len() - 1];
                    let cell = last.cells.get(value_column).cloned().unwrap_or_default();
                    self.error(
                        last.line,
                        value_column,
                        &cell,
                        format!(
                            "expected the rows of \"{name}\" for {period} ({}) to add up to at \
                             most 10^15 in size; they add up to {total}: check them",
                            lines(&numbers)
                        ),
                    );
                    *value = None;
                    continue;
                }
                // Rows alike in every cell are likelier a line entered twice than two sales
                // (a review: a pasted line doubled a reorder point, 19.4 to 29.4).
                let alike = rows.windows(2).all(|w| w[0].cells == w[1].cells);
                summed.push(format!(
                    "\"{name}\" {period} ({}, total {total}{})",
                    lines(&numbers),
                    if alike {
                        "; the lines are identical: if one was entered twice, delete it"
                    } else {
                        ""
                    }
                ));
            }
            if merged.iter().all(|m| m.1.is_none()) {
                self.out.warnings.push(format!(
                    "\"{name}\" has no values (every quantity is empty or n/a), so it was not \
                     planned"
                ));
                continue;
            }
            let (Some(first), Some(last)) = (merged.first(), merged.last()) else {
                continue;
            };
            let start = first.0;
            let (first_row, last_row) = (first.2[0], last.2[last.2.len() - 1]);
            let Some(own) = self.run(start, last.0, last_row, period_column) else {
                continue;
            };
            let item_column = item_columns[0];
            if !self.take_slots(own as usize, &name, first_row.line, item_column) {
                continue;
            }
            // Rows that stop before the group's last period: the periods after them are read
            // as the periods between rows are, so the plan starts from the file's end, not
            // from the item's last row as if the months since were still to come.
            let after = match readings.run_end(k, zeros_written) {
                Some(end) if runs[k].held => {
                    held.push(format!(
                        "\"{name}\" (last row {}, the rows run on to {end})",
                        last.0
                    ));
                    0
                }
                Some(end) if dated && end > last.0 && start.steps_to(end) < MAX_PERIODS => {
                    let extra = last.0.steps_to(end) as usize;
                    if self.spare_slots(extra, reserved) {
                        extra as i64
                    } else {
                        unread_since.push(format!("\"{name}\" (last row {})", last.0));
                        0
                    }
                }
                _ => 0,
            };
            let len = own + after;
            let mut values = vec![None; len as usize];
            let mut present = vec![false; len as usize];
            for (period, value, _) in &merged {
                let slot = start.steps_to(*period) as usize;
                present[slot] = true;
                values[slot] = *value;
                self.check_negative(&name, *period, *value);
            }
            let (mut no_sales, mut since) = (0, 0);
            for i in 0..len as usize {
                let period = start.offset(i as i64);
                if present[i] || !dated {
                    continue;
                }
                let reading = readings.read(k, period);
                if reading != Reading::Gap {
                    values[i] = Some(0.0);
                    present[i] = true;
                }
                if i as i64 >= own {
                    since += usize::from(reading != Reading::Gap);
                } else {
                    no_sales += usize::from(reading == Reading::OtherRows);
                }
            }
            if runs[k].stopped && after > 0 {
                let gaps = if since < after as usize {
                    format!(", {} a gap", after as usize - since)
                } else {
                    String::new()
                };
                stopped.push(format!(
                    "\"{name}\" (last row {}, line {}; {} since, {since} read as 0{gaps})",
                    last.0,
                    last_row.line,
                    count(after as usize, "period")
                ));
            } else {
                no_sales += since;
            }
            if no_sales > 0 {
                zeros.push(format!("\"{name}\" {no_sales}"));
            }
            let missing: Vec<String> = (0..len)
                .filter(|i| !present[*i as usize])
                .map(|i| start.offset(i).to_string())
                .collect();
            self.out.gaps_filled += missing.len();
            if !dated {
                self.gap_warning(std::slice::from_ref(&name), &missing);
            }
            self.blank_rows(&name, blank, start, &values);
            let periods = (0..len).map(|i| start.offset(i)).collect();
            self.out.items.push(Item {
                name,
                periods,
                values,
                parts,
            });
        }
        if !out_of_order.is_empty() {
            self.out.warnings.push(format!(
                "rows of {} are not in time order: {}; they were sorted by period (check \
                 that row's date)",
                count(out_of_order.len(), "item"),
                listing(&out_of_order)
            ));
        }
        let built = std::mem::take(&mut self.out.items);
        self.after_the_last(&built);
        self.out.items = built;
        let warnings = readings.warnings(&zeros, &stopped);
        if !held.is_empty() {
            self.out.warnings.push(format!(
                "{} {} no row for longer than any run without one before, while the rows of \
                 fewer items run on: too many to have all stopped at once, so their periods \
                 since were not read as no sales (check the dates of those later rows: one \
                 typed a year or months ahead makes every other item look stopped): {}; their \
                 figures end early",
                count(held.len(), "item"),
                if held.len() == 1 { "has" } else { "have" },
                listing(&held)
            ));
        }
        if !unread_since.is_empty() {
            self.out.warnings.push(format!(
                "the periods after the last row of {} were not read as no sales: all items \
                 together would pass the periods allowed in all ({}); their data end at their \
                 last row, so they get no stock figures: {}",
                count(unread_since.len(), "item"),
                self.slots,
                listing(&unread_since)
            ));
        }
        self.out.warnings.extend(warnings);
        if !summed.is_empty() {
            self.out.warnings.push(format!(
                "{} on several rows, summed: {}",
                count(summed.len(), "(item, period) pair"),
                listing(&summed)
            ));
        }
    }
}

impl<'a> Builder<'a> {
    /// Says an item's rows of empty quantity cells (`blank`, one entry per row) against its
    /// values from `start` (no sales read in already): inside its history they are gaps;
    /// before its first figure or after its last, left out (those after, once every item's
    /// end is known: [`Builder::after_the_last`]).
    fn blank_rows(
        &mut self,
        name: &str,
        blank: Vec<Period>,
        start: Period,
        values: &[Option<f64>],
    ) {
        let first = values.iter().position(Option::is_some);
        let last = values.iter().rposition(Option::is_some);
        let (Some(first), Some(last)) = (first, last) else {
            return;
        };
        self.empty_cells(
            name,
            blank,
            start.offset(first as i64),
            start.offset(last as i64),
        );
    }

    /// The readings of the periods the items have no row in, grouped by a place column.
    fn readings(
        &self,
        item_columns: &[usize],
        order: &[String],
        items: &HashMap<String, LongItem<'a>>,
        dated: bool,
    ) -> Readings {
        let place = place_column(
            item_columns,
            |j| {
                self.table
                    .header
                    .as_ref()
                    .map(|_| self.table.column_name(j))
            },
            |j| {
                let names: HashSet<String> = items
                    .values()
                    .map(|item| name_key(&group_name(item, j)))
                    .collect();
                names.len()
            },
            items.len(),
        );
        let periods: Vec<ItemPeriods> = order
            .iter()
            .map(|key| {
                let item = &items[key];
                let group = place.map_or(String::new(), |j| group_name(item, j));
                ItemPeriods {
                    group_key: name_key(&group),
                    group,
                    periods: item.rows.iter().map(|r| r.0).collect(),
                    zero_lines: item
                        .rows
                        .iter()
                        .filter(|r| r.1 == Some(0.0))
                        .map(|r| r.2.line)
                        .collect(),
                }
            })
            .collect();
        Readings::new(&periods, place.map(|j| self.table.column_name(j)), dated)
    }

    /// Warns about items named by some item columns only where items named in full share
    /// those names (",Milk" among "North,Milk" and "South,Milk": a store cell left empty, so
    /// the rows are read as an item of their own). A product without a variant beside
    /// variants of others ("Mug," among "Tee,Small") shares no name and is not warned about.
    fn partly_named(
        &mut self,
        item_columns: &[usize],
        order: &[String],
        items: &HashMap<String, LongItem<'a>>,
    ) {
        let in_full = |item: &LongItem<'_>| item.filled.len() == item_columns.len();
        let mut named: HashMap<(usize, String), Vec<&str>> = HashMap::new();
        for item in items.values().filter(|i| in_full(i)) {
            for &j in item_columns {
                let key = (j, name_key(&group_name(item, j)));
                named.entry(key).or_default().push(&item.name);
            }
        }
        let mut found = Vec::new();
        for item in order.iter().map(|k| &items[k]).filter(|i| !in_full(i)) {
            let Some(&first) = item.filled.first() else {
                continue;
            };
            let key_at = |j: usize| (j, name_key(&group_name(item, j)));
            let Some(candidates) = named.get(&key_at(first)) else {
                continue;
            };
            let mut alike: Vec<String> = candidates
                .iter()
                .filter(|full| {
                    item.filled
                        .iter()
                        .all(|&j| named.get(&key_at(j)).is_some_and(|l| l.contains(full)))
                })
                .map(|full| format!("\"{full}\""))
                .collect();
            if alike.is_empty() {
                continue;
            }
            sorting::sort(&mut alike);
            alike.dedup();
            let empty: Vec<String> = item_columns
                .iter()
                .filter(|j| !item.filled.contains(j))
                .map(|j| format!("\"{}\"", self.table.column_name(*j)))
                .collect();
            let numbers: Vec<usize> = item.rows.iter().map(|r| r.2.line).collect();
            found.push(format!(
                "\"{}\" ({}; {} empty; as in {})",
                item.name,
                lines(&numbers),
                super::list_in_words(&empty),
                super::list_in_words(&alike)
            ));
        }
        if !found.is_empty() {
            self.out.warnings.push(format!(
                "rows that leave an item column empty were read as items of their own, though \
                 items named in full share their other names: {}; fill in the empty cells",
                listing(&found)
            ));
        }
    }
}

/// What an item's rows say of its run of periods, before any is built.
struct ItemRun {
    /// Periods from its first row to its last (the slots its own run takes).
    span: usize,
    /// It stopped: the run since its last row up to its group's last period is longer than
    /// any without a row between its rows, and of at least two (a slow seller's last quiet
    /// spell is not a stop).
    stopped: bool,
    /// Its run since is held back from being read as no sales: it stopped together with half
    /// or more of its group's items. So many stopping at once is rarer than a few rows dated
    /// ahead (a row typed 2027-06 for 2026-06 made every other item read as a year of no sales
    /// and forecast falling).
    held: bool,
}

/// Each item's [`ItemRun`], in `order`.
fn item_runs(
    order: &[String],
    items: &HashMap<String, LongItem<'_>>,
    readings: &Readings,
    dated: bool,
) -> Vec<ItemRun> {
    let mut runs: Vec<ItemRun> = order
        .iter()
        .enumerate()
        .map(|(k, key)| {
            let item = &items[key];
            let mut periods: Vec<Period> = item.rows.iter().map(|r| r.0).collect();
            sorting::sort(&mut periods);
            periods.dedup();
            let (Some(&first), Some(&last)) = (periods.first(), periods.last()) else {
                return ItemRun {
                    span: 0,
                    stopped: false,
                    held: false,
                };
            };
            let writes_zeros = item.rows.iter().any(|r| r.1 == Some(0.0));
            let longest = periods
                .windows(2)
                .map(|w| w[0].steps_to(w[1]) - 1)
                .max()
                .unwrap_or(0);
            let stopped = readings.run_end(k, writes_zeros).is_some_and(|end| {
                let run = last.steps_to(end);
                dated && run >= 2 && run > longest
            });
            ItemRun {
                span: (first.steps_to(last).clamp(0, MAX_PERIODS) + 1) as usize,
                stopped,
                held: false,
            }
        })
        .collect();
    let mut tally: HashMap<Option<usize>, (usize, usize)> = HashMap::new();
    for (k, run) in runs.iter().enumerate() {
        let entry = tally.entry(readings.group_of(k)).or_default();
        entry.0 += usize::from(run.stopped);
        entry.1 += 1;
    }
    for (k, run) in runs.iter_mut().enumerate() {
        let (stops, all) = tally[&readings.group_of(k)];
        run.held = run.stopped && 2 * stops >= all;
    }
    runs
}

/// An item's name in column `j` (from its first row), its white space runs as one space.
/// The item columns that name `row`'s item (a "no value" marker names nothing) and the name
/// they make; `None` when none does.
pub(super) fn item_name(row: &Record, item_columns: &[usize]) -> Option<(Vec<usize>, String)> {
    let filled: Vec<usize> = item_columns
        .iter()
        .copied()
        .filter(|j| row.cells.get(*j).is_some_and(|c| !is_missing(c)))
        .collect();
    let name = filled
        .iter()
        .map(|j| row.cells[*j].as_str())
        .collect::<Vec<_>>()
        .join(PART_JOIN);
    (!filled.is_empty()).then_some((filled, name))
}

/// The key that makes `row` one item with the rows of the same name, white space and case
/// aside, as the long layout reads it; `None` for a row that names no item.
pub(super) fn item_key(row: &Record, item_columns: &[usize]) -> Option<String> {
    item_name(row, item_columns).map(|(_, name)| name_key(&name))
}

fn group_name(item: &LongItem<'_>, j: usize) -> String {
    spaced(item.rows[0].2.cells.get(j).map_or("", String::as_str))
}

/// The form in which names are compared: white space runs as one space, ends trimmed, lower
/// case ("Oak  tray", "oak tray" and "OAK TRAY" are one item).
pub(super) fn name_key(name: &str) -> String {
    name.split_whitespace()
        .collect::<Vec<_>>()
        .join(" ")
        .to_lowercase()
}

#[cfg(test)]
mod tests {
    use super::shown;

    #[test]
    fn spellings_show_their_white_space() {
        assert_eq!(shown("Oak tray "), "\"Oak tray \"");
        assert_eq!(shown("Oak tray\t"), "\"Oak tray\\t\"");
        assert_eq!(shown("Oak\u{a0}tray"), "\"Oak\\u{a0}tray\"");
        assert_eq!(shown("Oak\u{202f}tray"), "\"Oak\\u{202f}tray\"");
    }
}
