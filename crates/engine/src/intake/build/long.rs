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

use super::unnamed::{classify, ItemRows, Unnamed};
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
        // The periods some row of the item's group names: where an item has no row in one of
        // them, it sold nothing then (tables of rows leave out the zeros); a period no row of
        // the group names is read by `unnamed`.
        let dated = column.is_some();
        let group_column = group_column(&item_columns, &items);
        let group_of =
            |item: &LongItem<'_>| group_column.map_or(String::new(), |j| group_name(item, j));
        let mut group_order: Vec<String> = Vec::new();
        let mut members: HashMap<String, Vec<&LongItem<'a>>> = HashMap::new();
        for key in &order {
            let item = &items[key];
            let group = group_of(item);
            if !members.contains_key(&group) {
                group_order.push(group.clone());
            }
            members.entry(group).or_default().push(item);
        }
        let mut groups: HashMap<String, Group> = members
            .into_iter()
            .map(|(name, members)| (name, Group::read(&members, dated)))
            .collect();
        let item_group: HashMap<String, String> = order
            .iter()
            .map(|key| (key.clone(), group_of(&items[key])))
            .collect();
        let mut summed = Vec::new();
        let mut zeros = Vec::new();
        for key in order {
            let Some(group) = item_group.get(&key).and_then(|g| groups.get_mut(g)) else {
                continue;
            };
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
                if group.with_rows.contains(&period) {
                    values[i] = Some(0.0);
                    present[i] = true;
                    no_sales += 1;
                } else if let Some(reading @ (Unnamed::Closed | Unnamed::Quiet)) =
                    group.unnamed.get(&period).copied()
                {
                    values[i] = Some(0.0);
                    present[i] = true;
                    group.read_as_none.insert(period, reading);
                } else {
                    group.missing.insert(period);
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
            if !dated {
                self.gap_warning(std::slice::from_ref(&name), &missing);
            }
            let periods = (0..len).map(|i| start.offset(i)).collect();
            self.out.items.push(Item {
                name,
                periods,
                values,
            });
        }
        if !zeros.is_empty() {
            let of_group = group_column.map_or(String::new(), |j| {
                format!(" of its {}", self.table.column_name(j))
            });
            self.out.warnings.push(format!(
                "periods with rows for other items{of_group} but none for an item were read as \
                 no sales (0) for it, since tables of rows usually leave out the zeros: {}",
                listing(&zeros)
            ));
        }
        for name in group_order {
            if let Some(group) = groups.remove(&name) {
                let whose = group_column.map(|_| name);
                self.unnamed_warnings(whose.as_deref(), group);
            }
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

/// The column that groups a long table's items for the periods' readings: of two or more item
/// columns, the one with the fewest distinct names, when it has at least two and fewer than
/// there are items (a store beside the item, "North / Oak tray": a period no row of North
/// names is read for North's items by `unnamed`, though South's rows name it); else none.
fn group_column(item_columns: &[usize], items: &HashMap<String, LongItem<'_>>) -> Option<usize> {
    if item_columns.len() < 2 {
        return None;
    }
    let (count, j) = item_columns
        .iter()
        .map(|&j| {
            let names: HashSet<String> = items.values().map(|item| group_name(item, j)).collect();
            (names.len(), j)
        })
        .min_by_key(|(count, j)| (*count, *j))?;
    (count >= 2 && count < items.len()).then_some(j)
}

/// An item's name in group column `j` (from its first row; white space as in item names).
fn group_name(item: &LongItem<'_>, j: usize) -> String {
    let cell = item.rows[0].2.cells.get(j).map_or("", String::as_str);
    cell.split_whitespace().collect::<Vec<_>>().join(" ")
}

/// The periods of one group of items: those its rows name, the readings of those they do
/// not, and what the items' loop found.
struct Group {
    with_rows: HashSet<Period>,
    unnamed: HashMap<Period, Unnamed>,
    /// The line of the group's first row of 0 when the group writes its zeros.
    zero_line: Option<usize>,
    read_as_none: BTreeMap<Period, Unnamed>,
    missing: BTreeSet<Period>,
}

impl Group {
    fn read(members: &[&LongItem<'_>], dated: bool) -> Group {
        let with_rows: HashSet<Period> = members
            .iter()
            .flat_map(|item| item.rows.iter().map(|r| r.0))
            .collect();
        let (unnamed, zero_line) = if dated {
            unnamed_periods(members, &with_rows)
        } else {
            (HashMap::new(), None)
        };
        Group {
            with_rows,
            unnamed,
            zero_line,
            read_as_none: BTreeMap::new(),
            missing: BTreeSet::new(),
        }
    }
}

/// The reading of each period inside the table's span that no row names (see `unnamed`), and
/// when the table writes its zeros, the line of its first row of 0. A span past
/// [`MAX_PERIODS`] (items far apart; each item's own run is checked by `run`) is left unread:
/// its unnamed periods stay gaps.
fn unnamed_periods(
    items: &[&LongItem<'_>],
    with_rows: &HashSet<Period>,
) -> (HashMap<Period, Unnamed>, Option<usize>) {
    let (Some(&first), Some(&last)) = (with_rows.iter().min(), with_rows.iter().max()) else {
        return (HashMap::new(), None);
    };
    let span = first.steps_to(last);
    if span >= MAX_PERIODS {
        return (HashMap::new(), None);
    }
    let n = span as usize + 1;
    let index = |p: Period| first.steps_to(p) as usize;
    let mut named = vec![false; n];
    for p in with_rows {
        named[index(*p)] = true;
    }
    let mut named_before = vec![0usize; n + 1];
    for t in 0..n {
        named_before[t + 1] = named_before[t] + usize::from(named[t]);
    }
    let mut item_rows = Vec::with_capacity(items.len());
    // Periods with rows for other items but none for the item, against rows of 0.
    let (mut without_row, mut zero_rows, mut zero_line) = (0usize, 0usize, None);
    for item in items {
        let mut periods: Vec<usize> = item.rows.iter().map(|r| index(r.0)).collect();
        periods.sort_unstable();
        periods.dedup();
        let (Some(&a), Some(&b)) = (periods.first(), periods.last()) else {
            continue;
        };
        without_row += named_before[b + 1] - named_before[a] - periods.len();
        for row in item.rows.iter().filter(|r| r.1 == Some(0.0)) {
            zero_rows += 1;
            zero_line = Some(zero_line.map_or(row.2.line, |l: usize| l.min(row.2.line)));
        }
        item_rows.push(ItemRows(periods));
    }
    let zero_line = zero_line.filter(|_| zero_rows > without_row);
    let readings = classify(
        &named,
        first.frequency().natural_season(),
        &item_rows,
        zero_line.is_some(),
    );
    let unnamed = readings
        .iter()
        .enumerate()
        .filter_map(|(t, r)| r.map(|r| (first.offset(t as i64), r)))
        .collect();
    (unnamed, zero_line)
}

/// Periods as ranges of consecutive ones: "2024-06-01 to 2024-06-30", "2024-12-25".
fn ranges(periods: &[Period]) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    let mut i = 0;
    while i < periods.len() {
        let mut j = i;
        while j + 1 < periods.len() && periods[j + 1] == periods[j].next() {
            j += 1;
        }
        out.push(if j == i {
            periods[i].to_string()
        } else {
            format!("{} to {}", periods[i], periods[j])
        });
        i = j + 1;
    }
    out
}

impl Builder<'_> {
    /// Says how the periods no row names were read: closed and quiet ones as no sales, the
    /// rest as gaps (in a dated long table an item's gaps are exactly these, so this is the
    /// one warning about them).
    fn unnamed_warnings(&mut self, whose: Option<&str>, group: Group) {
        let Group {
            read_as_none: readings,
            missing,
            zero_line,
            ..
        } = group;
        let no_row = whose.map_or("no row".to_string(), |g| format!("no row of \"{g}\""));
        let of = |kind: Unnamed| -> Vec<Period> {
            readings
                .iter()
                .filter(|(_, r)| **r == kind)
                .map(|(p, _)| *p)
                .collect()
        };
        let periods = |list: &[Period]| -> String {
            let daily = list
                .first()
                .is_some_and(|p| p.frequency() == Frequency::Daily);
            let noun = if daily { "day" } else { "period" };
            format!("{} that {no_row} names", count(list.len(), noun))
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
            let on = if first.frequency() == Frequency::Daily {
                "on"
            } else {
                "in"
            };
            self.out.warnings.push(format!(
                "{}, {on} {} (no row there in most of their occurrences nearby, while the other \
                 periods have rows), {} read as closed: no sales (0) for each item selling \
                 before and after them: {}",
                periods(&closed),
                super::joined(&names),
                if closed.len() == 1 { "was" } else { "were" },
                listing(&ranges(&closed))
            ));
        }
        let quiet = of(Unnamed::Quiet);
        if !quiet.is_empty() {
            self.out.warnings.push(format!(
                "{} {} read as no sales (0) for each item selling before and after them: the \
                 table writes no zeros, and its items go without sales often enough near them \
                 for a period without any sale to be likely: {} (if they are missing from the \
                 export instead, add them)",
                periods(&quiet),
                if quiet.len() == 1 { "was" } else { "were" },
                listing(&ranges(&quiet))
            ));
        }
        if !missing.is_empty() {
            let why = match zero_line {
                Some(line) => format!(
                    "the table writes its zeros (line {line} is one), so a period without sales \
                     would have rows"
                ),
                None => "its items sell in too many of the periods near them for none to sell \
                         by chance"
                    .to_string(),
            };
            let missing: Vec<Period> = missing.into_iter().collect();
            self.out.warnings.push(format!(
                "{} {} taken as missing from the export and filled as gaps for each item selling \
                 before and after them ({why}): {}; if nothing sold then (a holiday or a \
                 closure), add rows of 0 for them",
                periods(&missing),
                if missing.len() == 1 { "was" } else { "were" },
                listing(&ranges(&missing))
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
