//! A total among the items: an item (a wide table's "total" column, a long table's "All
//! items" rows) whose value in every period is the sum of the other items' values there.
//! Planned as an item, its demand would be ordered a second time. Named as a total ("Total",
//! "All items", "Sum", "Overall", ...), it is left out with a warning; otherwise it is kept
//! with a warning that says so (sparse items can add up by chance, and a real item must not
//! vanish on a coincidence).
//!
//! Kept apart from: reading the table ([`super::build`] makes the items; this only looks at
//! them once built). The rule: at least two other items (or one, beside an item named as a
//! total, "Date,Compost,Total") and three periods compared; a period
//! is compared where every item holding it has a value and the sum is not zero (periods
//! without demand prove nothing), and the total must hold every period any item holds; equal
//! within 10^-9 of the period's sum (sums of decimals written in the file are not exact in
//! binary).

use std::collections::BTreeMap;

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
fn total_name(name: &str) -> bool {
    const NAMES: [&str; 9] = [
        "total",
        "totals",
        "sum",
        "all",
        "grand total",
        "overall",
        "subtotal",
        "sub-total",
        "sum total",
    ];
    let name = name.trim().to_lowercase();
    let words: Vec<&str> = name.split_whitespace().collect();
    NAMES.contains(&name.as_str())
        || (words.len() == 2 && matches!(words[0], "total" | "all"))
        || (words.len() >= 2 && words[words.len() - 1] == "total")
}

/// The items whose name, or a part of it joined with " / " (a store or an item column),
/// is nothing but a total's ([`total_name`]), for the warning when such an item does not add
/// up to the others: a total whose figures differ (rounded, another filter, a subtotal of
/// one store's items) must not pass silently as an item.
pub(crate) fn named_like_totals(items: &[Item]) -> Vec<usize> {
    if items.len() < 2 {
        return Vec::new();
    }
    items
        .iter()
        .enumerate()
        .filter(|(_, item)| item.name.split(" / ").any(total_name))
        .map(|(i, _)| i)
        .collect()
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
        let at: BTreeMap<&Period, f64> = item
            .periods
            .iter()
            .zip(&item.values)
            .filter_map(|(p, v)| v.map(|v| (p, v)))
            .collect();
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
