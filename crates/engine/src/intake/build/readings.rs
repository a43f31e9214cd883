//! The periods a long table's item has no row in: no sales, or a gap. Tables of rows (a till's
//! or an order system's export) leave out the zeros, so:
//! - a period some row of the item's group names is no sales (0) for the item;
//! - without groups, a period no row names is read over all items by [`super::unnamed`]
//!   (closed, quiet: no sales; missing: a gap);
//! - with groups, a period no row of the item's group names is read the same way over the
//!   group's items, unless no row of the table names it and the table reads it as missing
//!   (a month missing from the whole export, which each store alone might take for chance).
//!
//! Groups: one, the table, unless a header column names a place (store, shop, branch,
//! location, site, outlet, depot, warehouse, centre, center, nursery, region) among two or
//! more item columns; then the items of each of its names (the place column with the most
//! names, at least two and fewer than the items) are a group, so a month of one store's export missing is a gap for its items, not no
//! sales because another store's rows name it. A customer, category, colour or unit column
//! groups nothing: a customer or a colour without sales in a month sold nothing then.
//!
//! Kept apart from: the arithmetic of the readings (`unnamed`) and the items' own runs
//! (`long`); this module words the warnings about them.

use crate::sorting;
use std::collections::{BTreeMap, HashMap, HashSet};

use super::unnamed::{classify, prefix, ItemRows, Unnamed, LONG_TABLE};
use super::{count, list_in_words, listing, MAX_PERIODS};
use crate::calendar::{Frequency, Period};
use crate::intake::headers::header_says;

/// Header words naming a place items are sold at (common practice in exported tables).
pub(crate) const PLACE_WORDS: [&str; 12] = [
    "store",
    "shop",
    "branch",
    "location",
    "site",
    "outlet",
    "depot",
    "warehouse",
    "centre",
    "center",
    "nursery",
    "region",
];

/// What one item brings to the readings: its group's name as written and as compared (the
/// builder's form for comparing names), the periods of its rows and the lines of its rows
/// of 0.
pub(super) struct ItemPeriods {
    pub group: String,
    pub group_key: String,
    pub periods: Vec<Period>,
    pub zero_lines: Vec<usize>,
}

/// How a period an item has no row in was read.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(super) enum Reading {
    /// Rows of other items of its group name it: no sales.
    OtherRows,
    /// Closed or quiet (see `unnamed`): no sales.
    NoSales,
    /// A gap.
    Gap,
}

/// The periods of one set of items (the table, or one group): those its rows name, the
/// readings of those they do not, and what was read for the items.
struct Periods {
    with_rows: HashSet<Period>,
    /// The latest period its rows name.
    last: Option<Period>,
    unnamed: HashMap<Period, Unnamed>,
    /// The line of the first row of 0 when the set writes its zeros.
    zero_line: Option<usize>,
    read: BTreeMap<Period, Unnamed>,
}

impl Periods {
    fn of<'a>(items: impl Iterator<Item = &'a ItemPeriods> + Clone, dated: bool) -> Periods {
        let with_rows: HashSet<Period> = items
            .clone()
            .flat_map(|item| item.periods.iter().copied())
            .collect();
        let (unnamed, zero_line) = if dated {
            unnamed_periods(items, &with_rows)
        } else {
            (HashMap::new(), None)
        };
        Periods {
            last: with_rows.iter().max().copied(),
            with_rows,
            unnamed,
            zero_line,
            read: BTreeMap::new(),
        }
    }

    fn reading(&self, period: Period) -> Unnamed {
        self.unnamed
            .get(&period)
            .copied()
            .unwrap_or(Unnamed::Missing)
    }

    /// Reads `period` as this set's readings have it and keeps it for the warnings.
    fn read(&mut self, period: Period) -> Reading {
        let reading = self.reading(period);
        self.read.insert(period, reading);
        match reading {
            Unnamed::Closed | Unnamed::Quiet => Reading::NoSales,
            Unnamed::Missing => Reading::Gap,
        }
    }
}

/// The readings of a long table's periods, per the module doc.
pub(super) struct Readings {
    table: Periods,
    /// Each item's group (an index into `groups`), in the order the items were given.
    item_group: Vec<Option<usize>>,
    /// The groups by name, in the order first seen, and the place column's header.
    groups: Vec<(String, Periods)>,
    place: Option<String>,
}

impl Readings {
    /// `place`: the header of the place column that groups `items`, if any.
    pub(super) fn new(items: &[ItemPeriods], place: Option<String>, dated: bool) -> Readings {
        let table = Periods::of(items.iter(), dated);
        let mut groups: Vec<(String, Periods)> = Vec::new();
        let mut item_group = vec![None; items.len()];
        if place.is_some() {
            let mut at: HashMap<String, usize> = HashMap::new();
            let mut members: Vec<Vec<&ItemPeriods>> = Vec::new();
            for (k, item) in items.iter().enumerate() {
                let g = *at.entry(item.group_key.clone()).or_insert_with(|| {
                    members.push(Vec::new());
                    members.len() - 1
                });
                members[g].push(item);
                item_group[k] = Some(g);
            }
            for list in members {
                let name = list[0].group.clone();
                groups.push((name, Periods::of(list.into_iter(), dated)));
            }
        }
        Readings {
            table,
            item_group,
            groups,
            place,
        }
    }

    /// Where item `item`'s run of periods ends when its own rows stop earlier (see `long`):
    /// the latest period its group's rows name (the table's, without groups); `None` when
    /// the group writes its zeros and so does the item (`writes_zeros`: it has rows of 0):
    /// its rows stopping are then missing rows, not sales of 0. An item without rows of 0 in
    /// such a table is read after its last row as between its rows.
    pub(super) fn run_end(&self, item: usize, writes_zeros: bool) -> Option<Period> {
        let set = match self.group_of(item) {
            Some(g) => &self.groups[g].1,
            None => &self.table,
        };
        set.last
            .filter(|_| !(writes_zeros && set.zero_line.is_some()))
    }

    /// Item `item`'s group (an index; `None` without groups).
    pub(super) fn group_of(&self, item: usize) -> Option<usize> {
        self.item_group.get(item).copied().flatten()
    }

    /// Reads `period`, in which item `item` (its place in the items given) has no row.
    pub(super) fn read(&mut self, item: usize, period: Period) -> Reading {
        let group = self.group_of(item);
        let table_named = self.table.with_rows.contains(&period);
        match group {
            None if table_named => Reading::OtherRows,
            None => self.table.read(period),
            Some(g) if self.groups[g].1.with_rows.contains(&period) => Reading::OtherRows,
            // Missing from the whole export, though each group alone might take it for
            // chance (a month no row names among 30 items of 5 stores).
            Some(_) if !table_named && self.table.reading(period) == Unnamed::Missing => {
                self.table.read(period)
            }
            Some(g) => self.groups[g].1.read(period),
        }
    }

    /// The warnings about the readings: "rows for other items" (`zeros`: each item's count of
    /// them), the items whose rows stop before their group's (`stopped`: each in words), then
    /// the table's periods no row names, then each group's.
    pub(super) fn warnings(self, zeros: &[String], stopped: &[String]) -> Vec<String> {
        let mut out = Vec::new();
        let of_group = self
            .place
            .as_ref()
            .map_or(String::new(), |p| format!(" of its {p}"));
        if !stopped.is_empty() {
            let of_theirs = self
                .place
                .as_ref()
                .map_or(String::new(), |p| format!(" of the same {p}"));
            out.push(format!(
                "items that stopped, with no row since their last for longer than any run \
                 without one before it, while other items{of_theirs} have rows since: the \
                 periods since were read as no sales (0), as the periods between an item's \
                 rows are ({}): {}; if an item's rows since are missing rather than its sales, \
                 add them; if it is no longer sold, leave it out",
                count(stopped.len(), "item"),
                listing(stopped)
            ));
        }
        if !zeros.is_empty() {
            out.push(format!(
                "periods with rows for other items{of_group} but none for an item were read as \
                 no sales (0) for it, since tables of rows usually leave out the zeros: {}",
                listing(zeros)
            ));
        }
        unnamed_warnings(&mut out, None, &self.table);
        for (name, group) in &self.groups {
            unnamed_warnings(&mut out, Some(name), group);
        }
        out
    }
}

/// The place column that groups a long table's items (see the module doc): of `item_columns`,
/// those whose header names a place, the one with the most names (`names(j)`: the count of
/// distinct names in column j) when it has at least two and fewer than `items`.
pub(super) fn place_column(
    item_columns: &[usize],
    header: impl Fn(usize) -> Option<String>,
    names: impl Fn(usize) -> usize,
    items: usize,
) -> Option<usize> {
    if item_columns.len() < 2 {
        return None;
    }
    item_columns
        .iter()
        .copied()
        .filter(|j| header(*j).is_some_and(|h| header_says(&h, &PLACE_WORDS)))
        .map(|j| (names(j), j))
        .filter(|(count, _)| *count >= 2 && *count < items)
        .max_by_key(|(count, j)| (*count, std::cmp::Reverse(*j)))
        .map(|(_, j)| j)
}

/// The reading of each period inside the items' span that no row names (see `unnamed`), and
/// when they write their zeros, the line of the first row of 0. A span past [`MAX_PERIODS`]
/// (items far apart; each item's own run is checked by the builder) is left unread: its
/// unnamed periods stay gaps.
fn unnamed_periods<'a>(
    items: impl Iterator<Item = &'a ItemPeriods>,
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
    let named_before = prefix(n, |t| named[t]);
    let mut item_rows = Vec::new();
    // Periods with rows for other items but none for the item, against rows of 0.
    let (mut without_row, mut zero_rows, mut zero_line) = (0usize, 0usize, None::<usize>);
    for item in items {
        let mut periods: Vec<usize> = item.periods.iter().map(|p| index(*p)).collect();
        sorting::sort(&mut periods);
        periods.dedup();
        let (Some(&a), Some(&b)) = (periods.first(), periods.last()) else {
            continue;
        };
        without_row += named_before[b + 1] - named_before[a] - periods.len();
        zero_rows += item.zero_lines.len();
        if let Some(&line) = item.zero_lines.iter().min() {
            zero_line = Some(zero_line.map_or(line, |l| l.min(line)));
        }
        item_rows.push(ItemRows(periods));
    }
    let zero_line = zero_line.filter(|_| zero_rows > without_row);
    let readings = classify(
        &named,
        first.frequency().natural_season(),
        &item_rows,
        zero_line.is_some(),
        LONG_TABLE,
    );
    let unnamed = readings
        .iter()
        .enumerate()
        .filter_map(|(t, r)| r.map(|r| (first.offset(t as i64), r)))
        .collect();
    (unnamed, zero_line)
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

/// Periods as ranges of consecutive ones: "2024-06-01 to 2024-06-30", "2024-12-25".
pub(super) fn ranges(periods: &[Period]) -> Vec<String> {
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

/// "3 days that `no_row` names" ("periods" where not daily).
fn unnamed_count(list: &[Period], no_row: &str) -> String {
    let daily = list
        .first()
        .is_some_and(|p| p.frequency() == Frequency::Daily);
    let noun = if daily { "day" } else { "period" };
    format!("{} that {no_row} names", count(list.len(), noun))
}

fn were(list: &[Period]) -> &'static str {
    if list.len() == 1 {
        "was"
    } else {
        "were"
    }
}

/// The warning naming the periods read as closed (`closed`, in order), their places in the
/// season ("on Sundays") and what they were read as; `no_row`: "no row" or "no row of" a
/// group. The one wording for every layout. `None` when there are none.
pub(super) fn closed_warning(closed: &[Period], no_row: &str) -> Option<String> {
    let first = closed.first()?;
    let mut places: Vec<usize> = closed.iter().filter_map(|p| p.season_position()).collect();
    sorting::sort(&mut places);
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
    Some(format!(
        "{}, {on} {} (no row there in most of their occurrences nearby, while the other \
         periods have rows), {} read as closed: no sales (0) for each item selling before and \
         after them: {}",
        unnamed_count(closed, no_row),
        list_in_words(&names),
        were(closed),
        listing(&ranges(closed))
    ))
}

/// Says how the periods no row of `set` names were read: closed and quiet ones as no sales,
/// the rest as gaps (in a dated long table an item's gaps are exactly these, so this is the
/// one warning about them). `whose`: the group's name, `None` for the table.
fn unnamed_warnings(out: &mut Vec<String>, whose: Option<&str>, set: &Periods) {
    let of = |kind: Unnamed| -> Vec<Period> {
        set.read
            .iter()
            .filter(|(_, r)| **r == kind)
            .map(|(p, _)| *p)
            .collect()
    };
    let no_row = whose.map_or("no row".to_string(), |g| format!("no row of \"{g}\""));
    let periods = |list: &[Period]| unnamed_count(list, &no_row);
    out.extend(closed_warning(&of(Unnamed::Closed), &no_row));
    let quiet = of(Unnamed::Quiet);
    if !quiet.is_empty() {
        out.push(format!(
            "{} {} read as no sales (0) for each item selling before and after them: the table \
             writes no zeros, and its items go without sales often enough near them for a \
             period without any sale to be likely: {} (if they are missing from the export \
             instead, add them)",
            periods(&quiet),
            were(&quiet),
            listing(&ranges(&quiet))
        ));
    }
    let missing = of(Unnamed::Missing);
    if !missing.is_empty() {
        let why = match set.zero_line {
            Some(line) => format!(
                "the table writes its zeros (line {line} is one), so a period without sales would \
                 have rows"
            ),
            None => {
                "its items sell in too many of the periods near them for none to sell by chance"
                    .to_string()
            }
        };
        out.push(format!(
            "{} {} taken as missing from the export and filled as gaps for each item selling \
             before and after them ({why}): {}; if nothing sold then (a holiday or a closure), \
             add rows of 0 for them",
            periods(&missing),
            were(&missing),
            listing(&ranges(&missing))
        ));
    }
}

#[cfg(test)]
mod tests {
    use super::place_column;

    #[test]
    fn only_a_column_naming_a_place_groups_items() {
        // (headers, distinct names per column, items) -> the place column.
        fn check(headers: &[&str], names: &[usize], items: usize, expected: Option<usize>) {
            let columns: Vec<usize> = (0..headers.len()).collect();
            let got = place_column(
                &columns,
                |j| Some(headers[j].to_string()),
                |j| names[j],
                items,
            );
            assert_eq!(got, expected, "{headers:?}");
        }
        check(&["store", "item"], &[2, 3], 6, Some(0));
        check(&["item", "Store ID"], &[3, 2], 6, Some(1));
        check(&["region", "store", "item"], &[2, 4, 3], 12, Some(1));
        check(&["store", "item"], &[6, 3], 18, Some(0));
        check(&["category", "item"], &[2, 5], 5, None);
        check(&["customer", "part"], &[3, 8], 24, None);
        check(&["item", "colour"], &[4, 3], 12, None);
        check(&["shop", "item"], &[1, 5], 5, None);
        check(&["item"], &[5], 5, None);
    }
}
