//!Group columns written once over their rows: a report names a store or a category on the
//! first row of its group and leaves the cell empty below it ("Oak Lane, Trowel" then
//! ", Rake"). Read as written, the rows below lose their group: "Rake" of two stores became
//! one item (a long table summed both stores' sales into it; an across table refused the
//! second row). Each empty cell of such a column is read as the group above it, said.
//!
//! Kept apart from: choosing the item columns ([`super::table`]) and building the items
//! (`build`), which read the filled table as any other; the stock table's reading calls
//! [`fill_stock_rows`] on its own joined item columns, so a stock table written once matches
//! a history read so. Not mended here: a long table whose group column has empty cells is
//! not given that column as an item column at all (its rows are summed, warned).
//!
//! Rule (our choice): a column of the joined item names (two or more) other than the last,
//! whose header names a group (a place items are sold at, or a category, department, group,
//! family, section, class, range, supplier, vendor or brand; English words, common practice
//! in exported reports), that writes no group twice, whose first row with an item is filled,
//! and which has empty cells below filled ones, on rows whose other item cells are filled (a
//! row of no item at all is no item of the group, nor a total's row); truly empty cells
//! only ("n/a" says none); two groups or more receiving rows. A column writing a group twice (a long
//! table by period and store, a report repeating its store) is left as written: there an
//! empty cell is no group (web sales) or a row of its own, as reviews found. A code column is never filled: an empty code is no code, and
//! filling it would give an item another's code.

use super::frame::Table;
use super::headers::header_says;
use super::number::is_missing;
use super::table::Plan;
use super::text::Record;
use super::totals::total_name;
use crate::intake::build::{count, listing, spaced, PLACE_WORDS};
use std::collections::{HashMap, HashSet};

/// Header words naming an item's own number beside a group word ("Vendor SKU", "Vendor part
/// no"): such a column numbers items, and is never filled; so is one naming an item and a
/// number ("Supplier item code"). Not "code", "no" or "id" with the group alone: "Branch no"
/// and "Store ID" name the group, "Product group" too.
const CODE_WORDS: [&str; 5] = ["sku", "ean", "upc", "gtin", "part"];
const ITEM_NOUNS: [&str; 3] = ["item", "product", "article"];
const NUMBER_NOUNS: [&str; 6] = ["code", "no", "nr", "number", "id", "ref"];

/// Whether a header beside a group word names an item's own number (see [`CODE_WORDS`]).
fn names_an_items_number(named: &str) -> bool {
    header_says(named, &CODE_WORDS)
        || header_says(named, &ITEM_NOUNS) && header_says(named, &NUMBER_NOUNS)
}

/// Header words naming a group of items written once over them, beside the places items are
/// sold at (`PLACE_WORDS`, the long layout's list).
const GROUP_WORDS: [&str; 11] = [
    "category",
    "department",
    "dept",
    "group",
    "family",
    "section",
    "class",
    "range",
    "supplier",
    "vendor",
    "brand",
];

/// Fills the empty cells of each group column of the history written once over its rows
/// (see the module) with the group above them, and says so in `warnings`.
pub(crate) fn fill(table: &mut Table, plan: &Plan, warnings: &mut Vec<String>) {
    let Some(header) = table.header.clone() else {
        return;
    };
    // The columns that tell rows apart (items, periods), not those read as nothing.
    let not_telling: Vec<usize> = plan
        .ignored
        .iter()
        .chain(&plan.empty)
        .chain(&plan.row_numbers)
        .chain(&plan.calendar)
        .chain(&plan.not_quantities)
        .chain(&plan.notes)
        .copied()
        .chain(plan.of_items.iter().map(|(c, _, _)| *c))
        .chain(plan.details.iter().map(|(c, _)| *c))
        .chain(plan.values.iter().copied())
        .collect();
    let telling = |c: usize| !not_telling.contains(&c);
    warnings.extend(fill_rows(
        &header,
        &mut table.rows,
        &plan.item_columns,
        &telling,
        "the column",
    ));
}

/// [`fill`] for the stock table's rows, whose item columns `joined` are read joined as the
/// history's: its group written once as the history's is read the same way.
pub(crate) fn fill_stock_rows(
    header: &Record,
    rows: &mut [Record],
    joined: &[usize],
) -> Vec<String> {
    fill_rows(
        header,
        rows,
        joined,
        &|c| joined.contains(&c),
        "the stock table's column",
    )
}

/// The rule on `rows` under `header`, the items named by the columns `joined`; `telling`:
/// whether a column tells rows apart; `column` names a column in words. Gives the warnings.
fn fill_rows(
    header: &Record,
    rows: &mut [Record],
    joined: &[usize],
    telling: &dyn Fn(usize) -> bool,
    column: &str,
) -> Vec<String> {
    let mut warnings = Vec::new();
    if joined.len() < 2 {
        return warnings;
    }
    // Innermost first: a store filled before its region tells apart the rows the region's
    // own filling would otherwise find alike (two stores' "Rake" under one region).
    for &j in joined[..joined.len() - 1].iter().rev() {
        let named = header.cells.get(j).map_or("", String::as_str);
        // "Vendor SKU", "Supplier item code": an item's number, never filled (an empty code
        // is no code).
        let names_a_group = header_says(named, &PLACE_WORDS) || header_says(named, &GROUP_WORDS);
        if !names_a_group || names_an_items_number(named) {
            continue;
        }
        let others: Vec<usize> = joined.iter().copied().filter(|&o| o != j).collect();
        let filled = |cells: &[String], at: usize| cells.get(at).is_some_and(|c| !is_missing(c));
        // Written once: no group written twice. A column that writes its group on every row
        // (a long table by period and store, a report repeating the store) leaves a cell
        // empty for no group ("web sales"), or for a row of its own.
        let mut groups = HashSet::new();
        let once = rows
            .iter()
            .filter(|r| filled(&r.cells, j))
            .all(|r| groups.insert(spaced(&r.cells[j])));
        if !once {
            continue;
        }
        // The rows to fill, with their group: none where the first row with an item has no
        // group (the column is not written once). Only a truly empty cell is filled ("n/a"
        // says no group), and never a total's row ("All products" under the last store is
        // the report's, not the store's).
        let mut above: Option<&str> = None;
        let mut fills: Vec<(usize, String)> = Vec::new();
        for (i, row) in rows.iter().enumerate().filter(|(_, r)| !r.is_blank()) {
            let rest: Vec<&str> = others
                .iter()
                .filter_map(|&o| row.cells.get(o).map(String::as_str))
                .filter(|c| !is_missing(c))
                .collect();
            if filled(&row.cells, j) {
                above = Some(row.cells[j].as_str());
            } else if rest.is_empty()
                || total_name(&rest.join(" "))
                || !row.cells.get(j).is_none_or(|c| c.trim().is_empty())
            {
                continue;
            } else {
                match above {
                    Some(group) => fills.push((i, group.to_string())),
                    None => {
                        fills.clear();
                        break;
                    }
                }
            }
        }
        // Two groups or more receive rows: one group with empty cells below it may as well be
        // a group beside rows of none (a supplier's products, then products of no supplier).
        let receiving: HashSet<&str> = fills.iter().map(|(_, g)| g.as_str()).collect();
        if receiving.len() < 2 {
            continue;
        }
        // A filled row that would repeat another (a total over the stores, its store cell
        // empty, under the last store's row of that item; a web sale under the last store's
        // row of that product and month) says the empty cell is no group. Compared: the
        // columns that tell rows apart (items, periods), not those read as nothing.
        let key = |cells: &[String], group: Option<&str>| -> Vec<String> {
            (0..cells.len())
                .filter(|&c| telling(c))
                .map(|c| match group {
                    Some(g) if c == j => spaced(g),
                    _ => spaced(&cells[c]),
                })
                .collect()
        };
        let filling: HashMap<usize, &str> = fills.iter().map(|(i, g)| (*i, g.as_str())).collect();
        let mut rows_of: HashMap<Vec<String>, usize> = HashMap::new();
        for (i, r) in rows.iter().enumerate().filter(|(_, r)| !r.is_blank()) {
            *rows_of
                .entry(key(&r.cells, filling.get(&i).copied()))
                .or_default() += 1;
        }
        let repeats = fills
            .iter()
            .any(|(i, g)| rows_of[&key(&rows[*i].cells, Some(g))] > 1);
        if repeats {
            continue;
        }
        let mut read_as: Vec<String> = Vec::new();
        for (i, group) in fills {
            let row = &mut rows[i];
            if row.cells.len() <= j {
                row.cells.resize(j + 1, String::new());
            }
            read_as.push(format!("row {} as \"{group}\"", row.line));
            row.cells[j] = group;
        }
        if read_as.is_empty() {
            continue;
        }
        warnings.push(format!(
            "{column} \"{named}\" is written once over its rows: {} with it empty {} read as \
             the {named} above: {}",
            count(read_as.len(), "row"),
            if read_as.len() == 1 { "is" } else { "are" },
            listing(&read_as)
        ));
    }
    warnings
}
