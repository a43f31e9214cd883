//! Long tables (item, period, quantity): rows grouped by item in any order, repeated (item,
//! period) rows summed with a warning, a period inside an item's run with rows for other
//! items but none for it read as no sales (0) with a warning (such tables, a till's or an
//! order system's export, leave out the zeros; interpolating there would invent demand), a
//! period no row names at all read as [`super::unnamed`] decides, spellings of one name that
//! differ only in white space
//! read as one item with a warning, and each item's own run of periods with gaps. A row whose
//! item cell is empty or a "no value" marker (`n/a`) is an error: it names no item.
//!
//! Kept apart from: single and wide tables (in [`super`]), where a repeated period is an error.

use std::collections::{BTreeMap, BTreeSet, HashMap, HashSet};

use super::unnamed::{classify, Run, Unnamed};
use super::{count, lines, listing, Builder, LongRow, MAX_PERIODS};
use crate::calendar::{Frequency, Period};
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
        let (unnamed, writes_zeros) = if dated {
            unnamed_periods(&items, &with_rows)
        } else {
            (HashMap::new(), false)
        };
        let mut summed = Vec::new();
        let mut zeros = Vec::new();
        let mut read_as_none: Vec<(Period, Unnamed)> = Vec::new();
        let mut missing_periods: BTreeSet<Period> = BTreeSet::new();
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
                let period = start.offset(i as i64);
                if present[i] || !dated {
                    continue;
                }
                if with_rows.contains(&period) {
                    values[i] = Some(0.0);
                    present[i] = true;
                    no_sales += 1;
                } else if let Some(reading @ (Unnamed::Closed | Unnamed::Quiet)) =
                    unnamed.get(&period).copied()
                {
                    values[i] = Some(0.0);
                    present[i] = true;
                    read_as_none.push((period, reading));
                } else {
                    missing_periods.insert(period);
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
                 (0) for it, since tables of rows usually leave out the zeros: {}",
                listing(&zeros)
            ));
        }
        self.unnamed_warnings(read_as_none, missing_periods, writes_zeros);
        if !summed.is_empty() {
            self.out.warnings.push(format!(
                "{} on several rows, summed: {}",
                count(summed.len(), "(item, period) pair"),
                listing(&summed)
            ));
        }
    }
}

/// The name of a place in the calendar's season (`Period::season_position`), for the closed
/// periods' warning: "Sundays", "January", "Q1", "week 52".
fn season_place(frequency: Frequency, position: usize) -> String {
    const WEEKDAYS: [&str; 7] = [
        "Mondays",
        "Tuesdays",
        "Wednesdays",
        "Thursdays",
        "Fridays",
        "Saturdays",
        "Sundays",
    ];
    const MONTHS: [&str; 12] = [
        "January",
        "February",
        "March",
        "April",
        "May",
        "June",
        "July",
        "August",
        "September",
        "October",
        "November",
        "December",
    ];
    match frequency {
        Frequency::Daily => WEEKDAYS[position % 7].to_string(),
        Frequency::Monthly => MONTHS[position % 12].to_string(),
        Frequency::Quarterly => format!("Q{}", position + 1),
        _ => format!("week {}", position + 1),
    }
}

/// The reading of each period inside the table's span that no row names (see `unnamed`), and
/// whether the table writes zeros. A span past [`MAX_PERIODS`] (items far apart; each item's
/// own run is checked by `run`) is left unread: its unnamed periods stay gaps.
fn unnamed_periods(
    items: &HashMap<String, LongItem<'_>>,
    with_rows: &HashSet<Period>,
) -> (HashMap<Period, Unnamed>, bool) {
    let writes_zeros = items
        .values()
        .any(|item| item.rows.iter().any(|r| r.1 == Some(0.0)));
    let (Some(&first), Some(&last)) = (with_rows.iter().min(), with_rows.iter().max()) else {
        return (HashMap::new(), writes_zeros);
    };
    let span = first.steps_to(last);
    if span >= MAX_PERIODS {
        return (HashMap::new(), writes_zeros);
    }
    let n = span as usize + 1;
    let index = |p: Period| first.steps_to(p) as usize;
    let mut named = vec![false; n];
    for p in with_rows {
        named[index(*p)] = true;
    }
    let runs: Vec<Run> = items
        .values()
        .filter_map(|item| {
            let mut periods: Vec<Period> = item.rows.iter().map(|r| r.0).collect();
            periods.sort_unstable();
            periods.dedup();
            Some(Run {
                first: index(*periods.first()?),
                last: index(*periods.last()?),
                with_rows: periods.len(),
            })
        })
        .collect();
    let position = |t: usize| first.offset(t as i64).season_position().unwrap_or(0);
    let positions = first.frequency().natural_season();
    let readings = classify(
        &named,
        positions.map(|m| (&position as &dyn Fn(usize) -> usize, m)),
        &runs,
        writes_zeros,
    );
    let unnamed = readings
        .iter()
        .enumerate()
        .filter_map(|(t, r)| r.map(|r| (first.offset(t as i64), r)))
        .collect();
    (unnamed, writes_zeros)
}

impl Builder<'_> {
    /// Says how the periods no row names were read: closed days and quiet periods as no
    /// sales, the rest as gaps (each item's gaps are listed by `gap_warning` as well).
    fn unnamed_warnings(
        &mut self,
        read_as_none: Vec<(Period, Unnamed)>,
        missing: BTreeSet<Period>,
        writes_zeros: bool,
    ) {
        let readings: BTreeMap<Period, Unnamed> = read_as_none.into_iter().collect();
        let of = |kind: Unnamed| -> Vec<Period> {
            readings
                .iter()
                .filter(|(_, r)| **r == kind)
                .map(|(p, _)| *p)
                .collect()
        };
        let shown = |periods: &[Period]| -> String {
            listing(&periods.iter().map(Period::to_string).collect::<Vec<_>>())
        };
        let closed = of(Unnamed::Closed);
        if let Some(first) = closed.first() {
            let mut places: Vec<usize> =
                closed.iter().filter_map(|p| p.season_position()).collect();
            places.sort_unstable();
            places.dedup();
            let names: Vec<String> = places
                .iter()
                .map(|at| season_place(first.frequency(), *at))
                .collect();
            let (noun, on) = if first.frequency() == Frequency::Daily {
                ("day", "on")
            } else {
                ("period", "in")
            };
            self.out.warnings.push(format!(
                "{} no row names at all, {on} {} (with no row in most of them, while the rest of \
                 the calendar has rows), were read as closed: no sales (0) for every item \
                 selling before and after them: {}",
                count(closed.len(), noun),
                super::joined(&names),
                shown(&closed)
            ));
        }
        let quiet = of(Unnamed::Quiet);
        if !quiet.is_empty() {
            self.out.warnings.push(format!(
                "{} no row names at all were read as no sales (0) for every item selling before \
                 and after them: the table writes no zeros, and its items sell seldom enough for \
                 periods without any sale: {} (if they are missing from the export instead, add \
                 them)",
                count(quiet.len(), "period"),
                shown(&quiet)
            ));
        }
        if !missing.is_empty() {
            let why = if writes_zeros {
                "the table writes zeros elsewhere, so a period without sales would have its rows"
            } else {
                "the items sell too often for so long a stretch without any sale to be chance"
            };
            let missing: Vec<Period> = missing.into_iter().collect();
            self.out.warnings.push(format!(
                "{} no row names at all {} taken as missing from the export and filled as gaps \
                 ({why}): {}",
                count(missing.len(), "period"),
                if missing.len() == 1 { "was" } else { "were" },
                shown(&missing)
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
