//! Every sort of the engine and the page, through one compiled copy of a sort in WebAssembly.
//!
//! Why not `slice::sort_by` at each place: the standard library's sorts are generic over the
//! element and the comparison, so each call site with its own closure compiles a copy of the
//! whole algorithm (a few kilobytes each in WebAssembly). Thirty of them were 122 KB of the
//! page's code before optimisation, most of what stood between the page and its size target
//! (README, Browser targets). In WebAssembly the sort here sorts positions (`usize`) through a
//! comparison behind a reference to a trait object, so it is compiled once; what stays generic
//! per element type is the few lines that compare two elements and move them into place.
//! Natively (the command line, the tests, the benchmarks) size does not matter and each call
//! is the standard library's stable sort, faster per comparison.
//!
//! The same holds for an ordered set or map collected from an iterator: `collect()` sorts the
//! items with the standard library's stable sort, compiled for each element type, before it
//! builds the tree. [`set_of`] and [`map_of`] build them by insertion instead.
//!
//! Every sort here is stable, both ways: equal elements keep their order (ties are broken by
//! position), so `sort` may stand in for `sort_unstable` too, with the same result wherever
//! equal elements are alike, and the page and the command line sort alike.
//!
//! Kept apart from: what is sorted and why (each caller says).

use std::cmp::Ordering;
use std::collections::{BTreeMap, BTreeSet};

/// Sorts `items` in ascending order, stably.
pub fn sort<T: Ord>(items: &mut [T]) {
    sort_by(items, T::cmp);
}

/// Sorts `items` by the key `key` gives each, ascending, stably.
pub fn sort_by_key<T, K: Ord>(items: &mut [T], key: impl Fn(&T) -> K) {
    sort_by(items, |a, b| key(a).cmp(&key(b)));
}

/// Sorts `items` by `compare`, stably (equal elements keep their order): in WebAssembly by
/// [`sort_by_positions`], natively by the standard library's stable sort (size does not
/// matter there, and a sort of positions through a trait object costs about 2.5 times the
/// instructions: reading 60,000 rows took 16 % more). Both are stable, so the result is the
/// same.
pub fn sort_by<T>(items: &mut [T], compare: impl Fn(&T, &T) -> Ordering) {
    #[cfg(target_arch = "wasm32")]
    sort_by_positions(items, compare);
    #[cfg(not(target_arch = "wasm32"))]
    #[allow(clippy::disallowed_methods)]
    items.sort_by(compare);
}

/// Sorts `items` by `compare`, stably, through [`positions_in_order`]: the one compiled copy.
pub fn sort_by_positions<T>(items: &mut [T], compare: impl Fn(&T, &T) -> Ordering) {
    if items.len() < 2 {
        return;
    }
    let order = positions_in_order(items.len(), &|a, b| compare(&items[a], &items[b]));
    put_in_order(items, &order);
}

/// The set of `items`: in WebAssembly built by insertion ([`set_by_insertion`]), natively
/// collected.
pub fn set_of<T: Ord>(items: impl IntoIterator<Item = T>) -> BTreeSet<T> {
    #[cfg(target_arch = "wasm32")]
    return set_by_insertion(items);
    #[cfg(not(target_arch = "wasm32"))]
    return items.into_iter().collect();
}

/// The map of `pairs`, as [`set_of`] builds a set ([`map_by_insertion`] in WebAssembly); of
/// pairs with one key the last is kept, both ways.
pub fn map_of<K: Ord, V>(pairs: impl IntoIterator<Item = (K, V)>) -> BTreeMap<K, V> {
    #[cfg(target_arch = "wasm32")]
    return map_by_insertion(pairs);
    #[cfg(not(target_arch = "wasm32"))]
    return pairs.into_iter().collect();
}

/// The set of `items` built by insertion: as `collect()` gives it, without a sort of its own.
pub fn set_by_insertion<T: Ord>(items: impl IntoIterator<Item = T>) -> BTreeSet<T> {
    let mut set = BTreeSet::new();
    set.extend(items);
    set
}

/// The map of `pairs` built by insertion; of pairs with one key the last is kept, as
/// `collect()` keeps it.
pub fn map_by_insertion<K: Ord, V>(pairs: impl IntoIterator<Item = (K, V)>) -> BTreeMap<K, V> {
    let mut map = BTreeMap::new();
    map.extend(pairs);
    map
}

/// The positions 0..len in the order `compare` sets, ties by position: the one place the
/// standard library's sort is compiled.
#[inline(never)]
#[allow(clippy::disallowed_methods)]
fn positions_in_order(len: usize, compare: &dyn Fn(usize, usize) -> Ordering) -> Vec<usize> {
    let mut order: Vec<usize> = (0..len).collect();
    order.sort_unstable_by(|&a, &b| compare(a, b).then(a.cmp(&b)));
    order
}

/// Moves the element at `order[k]` to place k for every k, following each cycle of the
/// permutation with swaps (each element moves once; `order` is a permutation of 0..len).
fn put_in_order<T>(items: &mut [T], order: &[usize]) {
    let mut placed = vec![false; items.len()];
    for start in 0..items.len() {
        let mut at = start;
        // Place `at` holds the element that started at `start`; it takes the one it is owed
        // (at `order[at]`, not yet moved) until the cycle comes back to `start`.
        while !placed[at] {
            placed[at] = true;
            let from = order[at];
            if from == start {
                break;
            }
            items.swap(at, from);
            at = from;
        }
    }
}

#[cfg(test)]
// The standard library's sort is the reference these tests check against.
#[allow(clippy::disallowed_methods)]
mod tests {
    use super::*;

    /// Sorts a copy both ways and expects the standard library's stable sort's result.
    fn check(items: Vec<(i32, usize)>) {
        let mut ours = items.clone();
        sort_by_positions(&mut ours, |a, b| a.0.cmp(&b.0));
        let mut theirs = items;
        theirs.sort_by_key(|x| x.0);
        assert_eq!(ours, theirs);
    }

    #[test]
    fn sorts_like_the_standard_library_and_keeps_ties_in_order() {
        check(vec![]);
        check(vec![(1, 0)]);
        check(vec![(2, 0), (1, 1)]);
        check(vec![(3, 0), (1, 1), (3, 2), (2, 3), (1, 4), (3, 5)]);
        check((0..50).map(|i| (i % 3, i as usize)).collect());
        check((0..50).rev().map(|i| (i, i as usize)).collect());
        // Pseudo-random keys with many ties, several lengths (a fixed linear congruential
        // sequence, so a failure repeats).
        let mut state: u64 = 7;
        for len in [2, 3, 7, 16, 33, 100, 1000] {
            let items = (0..len)
                .map(|i| {
                    state = state
                        .wrapping_mul(6364136223846793005)
                        .wrapping_add(1442695040888963407);
                    (((state >> 33) % 10) as i32, i)
                })
                .collect();
            check(items);
        }
    }

    #[test]
    fn sorts_floats_by_total_order_and_owned_values() {
        let mut values = vec![2.5, -0.0, 0.0, -1.0, f64::INFINITY, 1.0];
        sort_by_positions(&mut values, f64::total_cmp);
        assert_eq!(format!("{values:?}"), "[-1.0, -0.0, 0.0, 1.0, 2.5, inf]");
        let mut names = vec![
            "pot".to_string(),
            "hose".into(),
            "cloth".into(),
            "hose".into(),
        ];
        sort(&mut names);
        assert_eq!(names, ["cloth", "hose", "hose", "pot"]);
    }

    #[test]
    fn sets_and_maps_by_insertion_equal_collected_ones() {
        let items = [5, 1, 5, 3, 1, 9];
        assert_eq!(
            set_by_insertion(items),
            items.into_iter().collect::<BTreeSet<_>>()
        );
        let pairs = [(2, "a"), (1, "b"), (2, "c"), (0, "d")];
        assert_eq!(
            map_by_insertion(pairs),
            pairs.into_iter().collect::<BTreeMap<_, _>>()
        );
        assert_eq!(
            map_by_insertion(pairs)[&2],
            "c",
            "the last pair of a key is kept"
        );
    }
}
