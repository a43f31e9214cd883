//! A total among the items: an item (a wide table's "total" column, a long table's "All
//! items" rows) whose value in every period is the sum of the other items' values there.
//! Planned as an item, its demand would be ordered a second time. Named as a total ("Total",
//! "All items", "Sum", "Overall", ...), it is left out with a warning; otherwise it is kept
//! with a warning that says so (sparse items can add up by chance, and a real item must not
//! vanish on a coincidence).
//!
//! Subtotals too: an item with a total's name in one part of its joined name ("All stores /
//! Oak tray") that equals the sum of the items differing from it in that part only ("North /
//! Oak tray", "South / Oak tray"), or with a total's word in its name ("Garden subtotal",
//! "Total Inventory") that equals the sum of the items just before it, or a group's own row
//! with its lower cells empty ("Oak Lane" and no product) that equals the sum of the items
//! filling them ("Oak Lane / Trowel", "Oak Lane / Rake"), is left out the same way.
//!
//! Kept apart from: reading the table ([`super::build`] makes the items; this only looks at
//! them once built). The rule: at least two other items (or one, beside an item named as a
//! total, "Date,Compost,Total") and three periods compared; a period
//! is compared where every item holding it has a value and the sum is not zero (periods
//! without demand prove nothing), and the total must hold every period any item holds; equal
//! within 10^-9 of the period's sum (sums of decimals written in the file are not exact in
//! binary).

use crate::sorting;
use std::collections::BTreeMap;

use super::build::{agreeing, count, listing, PART_JOIN};
use super::Item;
use crate::calendar::Period;

/// Fewest periods compared before an item is taken for the others' total.
const PERIODS_COMPARED: usize = 3;

/// An item that adds up the others: where it stands, the periods compared, and whether its
/// name says it is a total.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) struct Total {
    pub index: usize,
    pub compared: usize,
    pub named: bool,
}

/// Whether a name is nothing but a total's: "Total", "All items", "Grand total", "Total
/// sales", "All stores" ("All-purpose compost" and "Total Garden feed" are items' names).
pub(crate) fn total_name(name: &str) -> bool {
    // Grand totals as other programs and languages write them.
    const NAMES: [&str; 22] = [
        "total",
        "totals",
        "sum",
        "all",
        "grand total",
        "overall",
        "subtotal",
        "sub total",
        "sum total",
        "total all",
        "gesamt",
        "gesamtergebnis",
        "summe",
        "totaal",
        "eindtotaal",
        "totale",
        "totale complessivo",
        "totalt",
        "suma",
        "total general",
        "total général",
        "σ",
    ];
    // What a total is taken over: "Total sales", "All stores"; not "All Rounder" or "Total
    // Weedkiller", products' names.
    const OVER: [&str; 16] = [
        "items",
        "products",
        "articles",
        "skus",
        "lines",
        "stores",
        "shops",
        "branches",
        "sites",
        "locations",
        "regions",
        "channels",
        "customers",
        "categories",
        "sales",
        "units",
    ];
    // "Total:", "TOTAL", "Total (all)", "Sub-total" read alike.
    let words = name_words(name);
    let words: Vec<&str> = words.iter().map(String::as_str).collect();
    let name = words.join(" ");
    NAMES.contains(&name.as_str())
        || (words.len() == 2 && matches!(words[0], "total" | "all") && OVER.contains(&words[1]))
        || (words.len() >= 2 && words[words.len() - 1] == "total")
}

/// The items whose name, or a part of it joined with " / " (a store or an item column),
/// is nothing but a total's ([`total_name`]) or reads as a group's subtotal
/// ([`subtotal_name`]), for the warning when such an item does not add
/// up to the others: a total whose figures differ (rounded, another filter, a subtotal of
/// one store's items) must not pass silently as an item.
pub(crate) fn named_like_totals(items: &[Item]) -> Vec<usize> {
    if items.len() < 2 {
        return Vec::new();
    }
    items
        .iter()
        .enumerate()
        .filter(|(_, item)| item.name.split(PART_JOIN).any(total_name) || subtotal_name(&item.name))
        .map(|(i, _)| i)
        .collect()
}

/// Looks for totals among `items` (see the module doc): leaves out, with a warning each, the
/// subtotals and then the grand total over what is left, where named as totals and adding
/// up, and warns about an item that adds up under an item's name or is named as a total
/// without adding up.
pub(crate) fn set_aside(items: &mut Vec<Item>, warnings: &mut Vec<String>) {
    let mut subs = subtotals(items);
    for sub in &subs {
        warnings.push(format!(
            "\"{}\" equals the sum of the {} items it stands for in each of the {} periods \
             with demand: read as their subtotal, not an item, and left out (planned, its \
             demand would be ordered twice)",
            items[sub.index].name, sub.group, sub.compared
        ));
    }
    sorting::sort_by_key(&mut subs, |s| std::cmp::Reverse(s.index));
    for sub in subs {
        items.remove(sub.index);
    }
    // A group's own row left among its items: over one item only and equal to it ("Mill
    // Road" over "Mill Road / Trowel"), its total or a coincidence; not their sum ("Oak Lane"
    // over "Oak Lane / Trowel" and "Oak Lane / Rake", a total with rounding or an item left
    // out, or sales of no product): kept as an item, and said either way, since a total
    // planned as an item orders its items' demand twice.
    for i in 0..items.len() {
        let Some(group) = group_row_items(items, i).filter(|g| !g.is_empty()) else {
            continue;
        };
        let equal = match group.as_slice() {
            [only] => adds_up(&items[i], &[&items[*only]]),
            _ => None,
        };
        if let Some(compared) = equal {
            warnings.push(format!(
                "\"{}\" equals \"{}\" in each of the {compared} periods with demand: if it \
                 is its group's total, take it out of the file, or its demand is ordered \
                 twice; it is planned as an item",
                items[i].name, items[group[0]].name
            ));
        } else {
            let named: Vec<String> = group
                .iter()
                .map(|j| format!("\"{}\"", items[*j].name))
                .collect();
            warnings.push(format!(
                "\"{}\" lacks the rest of its name beside {} that {} it ({}) and is not their \
                 sum in every period: it is planned as an item of its own; if it is their total \
                 or holds their sales too, correct the file, or that demand is ordered twice",
                items[i].name,
                count(group.len(), "item"),
                agreeing(group.len(), "has", "have"),
                listing(&named)
            ));
        }
    }
    let total = total_among(items);
    for i in named_like_totals(items) {
        if total.is_none_or(|t| t.index != i) {
            warnings.push(format!(
                "\"{}\" is named like a total of other items but does not add up to them in \
                 every period: it is planned as an item; if it is a total, take it out of the \
                 file, or its demand is ordered twice",
                items[i].name
            ));
        }
    }
    if let Some(total) = total {
        let evidence = format!(
            "\"{}\" equals the sum of the other items in each of the {} periods with demand",
            items[total.index].name, total.compared
        );
        if total.named {
            items.remove(total.index);
            warnings.push(format!(
                "{evidence}: read as their total, not an item, and left out (planned, its \
                 demand would be ordered twice)"
            ));
        } else {
            warnings.push(format!(
                "{evidence}: if it is their total, take it out of the file, or its demand is \
                 ordered twice; it is planned as an item"
            ));
        }
    }
}

/// An item named with a total's name in one part ("All stores / Oak tray") that adds up the
/// items sharing every other part ("North / Oak tray", "South / Oak tray").
struct Subtotal {
    index: usize,
    group: usize,
    compared: usize,
}

/// The subtotals among `items`: for a name part that is a total's ([`total_name`]), the items
/// whose names differ from it in that part only, not a total's there ("All stores / Oak
/// tray" over "North / Oak tray", "South / Oak tray"); for a name "X Total" ("North Total",
/// as tables with subtotal rows write them), the items whose name starts with the part X
/// ("North / Oak tray", ...); for a name with a total's word anywhere ([`has_total_word`]),
/// the items just before it in the file, back to the previous such name (a group's subtotal
/// row or column, "Garden subtotal" under "Seeds" and "Bulbs"); two or more of them, whose
/// sum it equals ([`adds_up`]).
fn subtotals(items: &[Item]) -> Vec<Subtotal> {
    let parts: Vec<Vec<&str>> = items
        .iter()
        .map(|i| i.name.split(PART_JOIN).collect())
        .collect();
    let mut found = Vec::new();
    for (i, own) in parts.iter().enumerate() {
        let mut groups: Vec<Vec<usize>> = Vec::new();
        for k in (0..own.len()).filter(|k| own.len() >= 2 && total_name(own[*k])) {
            groups.push(
                (0..parts.len())
                    .filter(|j| {
                        let other = &parts[*j];
                        *j != i
                            && other.len() == own.len()
                            && !total_name(other[k])
                            && (0..own.len()).all(|m| m == k || other[m] == own[m])
                    })
                    .collect(),
            );
        }
        if let [single] = own.as_slice() {
            let words: Vec<&str> = single.split_whitespace().collect();
            if let [head @ .., last] = words.as_slice() {
                let head = head.join(" ");
                if last.eq_ignore_ascii_case("total") && !head.is_empty() && !total_name(&head) {
                    groups.push(
                        (0..parts.len())
                            .filter(|j| parts[*j].len() >= 2 && parts[*j][0] == head)
                            .collect(),
                    );
                }
            }
        }
        // A group's own row over its items (see `group_row_items`). Before, such a row was
        // planned as an item beside its products without a word (review60 13b).
        if let Some(group) = group_row_items(items, i) {
            groups.push(group);
        }
        // A row or column named with a total's word under the items it adds up ("Garden
        // subtotal", "Total Inventory", "Tools totals" below their group): the run of items
        // just before it, back to the previous such name.
        if has_total_word(&items[i].name) {
            let start = (0..i)
                .rev()
                .find(|j| has_total_word(&items[*j].name))
                .map_or(0, |j| j + 1);
            // A run of every other item is the grand total's case, with its own warning.
            groups.extend(
                (start..i.saturating_sub(1))
                    .rev()
                    .map(|s| (s..i).collect::<Vec<usize>>())
                    .filter(|run| run.len() + 1 < items.len()),
            );
        }
        for group in groups.into_iter().filter(|g| g.len() >= 2) {
            let members: Vec<&Item> = group.iter().map(|j| &items[*j]).collect();
            if let Some(compared) = adds_up(&items[i], &members) {
                found.push(Subtotal {
                    index: i,
                    group: members.len(),
                    compared,
                });
                break;
            }
        }
    }
    found
}

/// Where item `i` is a group's own row, its first cell (the group) filled and some later
/// ones empty ("Oak Lane" with no product, a report's store row), the items agreeing with its
/// filled cells and filling its empty ones ("Oak Lane / Trowel", "Oak Lane / Rake"). An item
/// without a store or a code in front is no group's row.
fn group_row_items(items: &[Item], i: usize) -> Option<Vec<usize>> {
    let cells = &items[i].parts;
    if cells.first().is_none_or(|c| c.is_empty()) || !cells.iter().any(String::is_empty) {
        return None;
    }
    Some(
        (0..items.len())
            .filter(|&j| {
                j != i
                    && items[j].parts.len() == cells.len()
                    && cells.iter().zip(&items[j].parts).all(|(own, other)| {
                        if own.is_empty() {
                            !other.is_empty()
                        } else {
                            own == other
                        }
                    })
            })
            .collect(),
    )
}

/// Whether a name reads as a group's subtotal: it holds "subtotal", or ends with "total",
/// "totals" or "tot" ("Garden subtotal", "Tools totals", "Garden tot."). Not "Total
/// Weedkiller" or "Dim sum", products, which [`has_total_word`] lets through only where
/// their figures add up the items before them.
fn subtotal_name(name: &str) -> bool {
    let words = name_words(name);
    words
        .iter()
        .any(|w| matches!(w.as_str(), "subtotal" | "subtotals"))
        || words.len() >= 2 && matches!(words[words.len() - 1].as_str(), "total" | "totals" | "tot")
}

/// A name's words in lower case, split at anything that is not a letter or digit.
fn name_words(name: &str) -> Vec<String> {
    name.to_lowercase()
        .split(|c: char| !c.is_alphanumeric())
        .filter(|w| !w.is_empty())
        .map(str::to_string)
        .collect()
}

/// Whether a name holds a total's word anywhere ("Garden subtotal", "Total Inventory", "Tools
/// totals", "Garden tot.", "Sum of bulbs"): enough, with the figures adding up the items just
/// before it, to take it for their subtotal ([`subtotals`]).
fn has_total_word(name: &str) -> bool {
    name_words(name).iter().any(|w| {
        matches!(
            w.as_str(),
            "total" | "totals" | "tot" | "subtotal" | "subtotals" | "sum"
        )
    })
}

/// The periods compared when `total` equals the sum of `group` in every period where every
/// member holding it has a value and the sum or the total is not zero (at least
/// [`PERIODS_COMPARED`]), the total holding every period a member holds; `None` otherwise.
fn adds_up(total: &Item, group: &[&Item]) -> Option<usize> {
    let mut sums: BTreeMap<Period, (f64, bool)> = BTreeMap::new();
    for item in group {
        for (period, value) in item.periods.iter().zip(&item.values) {
            let entry = sums.entry(*period).or_insert((0.0, true));
            match value {
                Some(v) => entry.0 += v,
                None => entry.1 = false,
            }
        }
    }
    let at: BTreeMap<Period, Option<f64>> = sorting::map_of(
        total
            .periods
            .iter()
            .copied()
            .zip(total.values.iter().copied()),
    );
    if sums.keys().any(|p| !at.contains_key(p)) {
        return None;
    }
    let mut compared = 0;
    for (period, (sum, complete)) in &sums {
        let Some(Some(value)) = at.get(period) else {
            continue;
        };
        if !*complete || (*sum == 0.0 && *value == 0.0) {
            continue;
        }
        if (value - sum).abs() > 1e-9 * sum.abs().max(1.0) {
            return None;
        }
        compared += 1;
    }
    (compared >= PERIODS_COMPARED).then_some(compared)
}

/// The item that is the sum of all the others, if exactly one is.
pub(crate) fn total_among(items: &[Item]) -> Option<Total> {
    // Beside one item only a total by name is looked for (the two are equal either way).
    let pair = items.len() == 2;
    if items.len() < 2 || (pair && !items.iter().any(|i| total_name(&i.name))) {
        return None;
    }
    let holders_needed = items.len().min(3);
    // Per period: the sum over the items holding it, whether every one has a value there,
    // and how many items hold it.
    let mut sums: BTreeMap<Period, (f64, bool, usize)> = BTreeMap::new();
    for item in items {
        for (period, value) in item.periods.iter().zip(&item.values) {
            let entry = sums.entry(*period).or_insert((0.0, true, 0));
            match value {
                Some(v) => entry.0 += v,
                None => entry.1 = false,
            }
            entry.2 += 1;
        }
    }
    let compared: Vec<(&Period, f64)> = sums
        .iter()
        .filter(|(_, (sum, complete, holders))| {
            *complete && *holders >= holders_needed && *sum != 0.0
        })
        .map(|(p, (sum, _, _))| (p, *sum))
        .collect();
    if compared.len() < PERIODS_COMPARED {
        return None;
    }
    let is_total = |item: &Item| {
        if item.periods.len() != sums.len() {
            return false;
        }
        let at: BTreeMap<&Period, f64> = sorting::map_of(
            item.periods
                .iter()
                .zip(&item.values)
                .filter_map(|(p, v)| v.map(|v| (p, v))),
        );
        compared.iter().all(|(p, sum)| {
            at.get(p)
                .is_some_and(|v| (2.0 * v - sum).abs() <= 1e-9 * sum.abs().max(1.0))
        })
    };
    let mut found = items
        .iter()
        .enumerate()
        .filter(|(_, item)| (!pair || total_name(&item.name)) && is_total(item));
    match (found.next(), found.next()) {
        (Some((index, item)), None) => Some(Total {
            index,
            compared: compared.len(),
            named: total_name(&item.name),
        }),
        _ => None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn item(name: &str, start: i32, values: &[Option<f64>]) -> Item {
        Item {
            name: name.to_string(),
            periods: (0..values.len())
                .map(|i| Period::year(start + i as i32))
                .collect(),
            values: values.to_vec(),
            parts: Vec::new(),
        }
    }

    fn check(items: &[Item], expected: Option<&str>) {
        let found = total_among(items).map(|t| items[t.index].name.as_str());
        assert_eq!(found, expected);
    }

    // Arithmetic checks: 5 + 3 = 8, 6 + 4 = 10, 7 + 2 = 9.
    #[test]
    fn the_sum_of_the_others_is_found() {
        let a = item("north", 2020, &[Some(5.0), Some(6.0), Some(7.0)]);
        let b = item("south", 2020, &[Some(3.0), Some(4.0), Some(2.0)]);
        let total = item("total", 2020, &[Some(8.0), Some(10.0), Some(9.0)]);
        check(&[a.clone(), b.clone(), total.clone()], Some("total"));
        // Decimals whose binary sums are not exact: 0.1 + 0.2.
        let c = item("c", 2020, &[Some(0.1), Some(0.1), Some(0.1)]);
        let d = item("d", 2020, &[Some(0.2), Some(0.2), Some(0.2)]);
        let e = item("e", 2020, &[Some(0.3), Some(0.3), Some(0.3)]);
        check(&[c, d, e], Some("e"));
        // Two items only: one equal to the other is no total.
        check(&[a.clone(), a.clone()], None);
        // Off by one in one period: no total.
        let near = item("total", 2020, &[Some(8.0), Some(10.0), Some(10.0)]);
        check(&[a.clone(), b.clone(), near], None);
        // Two periods compared are too few.
        let short = |name: &str, v: &[f64]| {
            item(name, 2020, &v.iter().map(|x| Some(*x)).collect::<Vec<_>>())
        };
        check(
            &[
                short("a", &[5.0, 6.0]),
                short("b", &[3.0, 4.0]),
                short("t", &[8.0, 10.0]),
            ],
            None,
        );
        // All zero: every item would be "the sum of the others".
        check(
            &[
                short("a", &[0.0; 4]),
                short("b", &[0.0; 4]),
                short("c", &[0.0; 4]),
            ],
            None,
        );
        // Sparse items: only periods with demand count, and here two are too few.
        check(
            &[
                short("a", &[0.0, 1.0, 0.0, 0.0, 0.0]),
                short("b", &[0.0, 0.0, 2.0, 0.0, 0.0]),
                short("c", &[0.0, 1.0, 2.0, 0.0, 0.0]),
            ],
            None,
        );
        // A total that misses a period another item holds is no total.
        let later = item("west", 2021, &[Some(1.0), Some(1.0), Some(1.0)]);
        let partial = item("total", 2020, &[Some(8.0), Some(11.0), Some(10.0)]);
        check(&[a, b, later, partial], None);
    }

    // A gap leaves its period out of the comparison; the other periods still decide.
    #[test]
    fn gaps_are_not_compared() {
        let a = item("a", 2020, &[Some(5.0), None, Some(7.0), Some(1.0)]);
        let b = item("b", 2020, &[Some(3.0), Some(4.0), Some(2.0), Some(1.0)]);
        let t = item("t", 2020, &[Some(8.0), Some(99.0), Some(9.0), Some(2.0)]);
        check(&[a, b, t], Some("t"));
    }
}
