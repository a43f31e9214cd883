//! Long tables (item, period, quantity): rows grouped by item in any order, repeated (item,
//! period) rows summed with a warning, a period inside an item's run with rows for other
//! items but none for it read as no sales (0) with a warning (such tables, a till's or an
//! order system's export, leave out the zeros; interpolating there would invent demand), spellings of one name that differ only in white space
//! read as one item with a warning, and each item's own run of periods with gaps. A row whose
//! item cell is empty or a "no value" marker (`n/a`) is an error: it names no item.
//!
//! Kept apart from: single and wide tables (in [`super`]), where a repeated period is an error.

use std::collections::{HashMap, HashSet};

use super::{count, lines, listing, Builder, LongRow};
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
    pub(super) fn long(&mut self, kept: &[&'a Record], column: Option<&PeriodColumn>) {
        let value_column = self.plan.values[0];
        let item_columns = self.plan.item_columns.clone();
        let mut order: Vec<String> = Vec::new();
        let mut items: HashMap<String, LongItem<'a>> = HashMap::new();
        for (k, row) in kept.iter().enumerate() {
            // A "no value" marker names no item.
            let filled: Vec<usize> = item_columns
                .iter()
                .copied()
                .filter(|j| row.cells.get(*j).is_some_and(|c| !is_missing(c)))
                .collect();
            if filled.is_empty() {
                self.no_item_name(row, &item_columns);
                continue;
            }
            let name = filled
                .iter()
                .map(|j| row.cells[*j].as_str())
                .collect::<Vec<_>>()
                .join(" / ");
            let written = filled
                .iter()
                .map(|j| row.as_written(*j))
                .collect::<Vec<_>>()
                .join(" / ");
            // Names that differ only in white space are one item.
            let key = name.split_whitespace().collect::<Vec<_>>().join(" ");
            let next_position = items.get(&key).map_or(1, |i| i.rows.len() as i64 + 1);
            let period = match column {
                Some(col) => match col.periods.get(k).copied().flatten() {
                    Some(p) => p,
                    None => continue,
                },
                None => Period::position(next_position),
            };
            let Ok(value) = self.value(row, value_column) else {
                continue;
            };
            let item = items.entry(key).or_insert_with_key(|key| {
                order.push(key.clone());
                LongItem {
                    name,
                    rows: Vec::new(),
                    spellings: Vec::new(),
                    spelled: HashMap::new(),
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
        // The periods some row names: where an item has no row in one of them, it sold
        // nothing then (tables of rows leave out the zeros); a period no row names is a gap.
        let dated = column.is_some();
        let with_rows: HashSet<Period> = items
            .values()
            .flat_map(|item| item.rows.iter().map(|r| r.0))
            .collect();
        let mut summed = Vec::new();
        let mut zeros = Vec::new();
        for key in order {
            let Some(LongItem {
                name,
                mut rows,
                spellings,
                ..
            }) = items.remove(&key)
            else {
                continue;
            };
            if spellings.len() > 1 {
                let forms: Vec<String> = spellings
                    .iter()
                    .map(|(s, l)| format!("{} ({})", shown(s), lines(l)))
                    .collect();
                self.out.warnings.push(format!(
                    "\"{name}\" is written in {} ways that differ only in white space, read as \
                     one item: {}",
                    spellings.len(),
                    listing(&forms)
                ));
            }
            rows.sort_by_key(|r| r.0);
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
            for (period, value, rows) in merged.iter_mut().filter(|m| m.2.len() > 1) {
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
                summed.push(format!(
                    "\"{name}\" {period} ({}, total {total})",
                    lines(&numbers)
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
            let Some(len) = self.run(start, last.0, last_row, period_column) else {
                continue;
            };
            let item_column = item_columns[0];
            if !self.take_slots(len as usize, &name, first_row.line, item_column) {
                continue;
            }
            let mut values = vec![None; len as usize];
            let mut present = vec![false; len as usize];
            for (period, value, _) in &merged {
                let slot = start.steps_to(*period) as usize;
                present[slot] = true;
                values[slot] = *value;
                self.check_negative(&name, *period, *value);
            }
            let mut no_sales = 0;
            for i in 0..len as usize {
                if !present[i] && dated && with_rows.contains(&start.offset(i as i64)) {
                    values[i] = Some(0.0);
                    present[i] = true;
                    no_sales += 1;
                }
            }
            if no_sales > 0 {
                zeros.push(format!("\"{name}\" {no_sales}"));
            }
            let missing: Vec<String> = (0..len)
                .filter(|i| !present[*i as usize])
                .map(|i| start.offset(i).to_string())
                .collect();
            self.out.gaps_filled += missing.len();
            self.gap_warning(std::slice::from_ref(&name), &missing);
            let periods = (0..len).map(|i| start.offset(i)).collect();
            self.out.items.push(Item {
                name,
                periods,
                values,
            });
        }
        if !zeros.is_empty() {
            self.out.warnings.push(format!(
                "periods with rows for other items but none for an item were read as no sales \
                 (0) for it, since tables of rows usually leave out the zeros: {} (periods no \
                 row names at all are gaps)",
                listing(&zeros)
            ));
        }
        if !summed.is_empty() {
            self.out.warnings.push(format!(
                "{} on several rows, summed: {}",
                count(summed.len(), "(item, period) pair"),
                listing(&summed)
            ));
        }
    }
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
