//! The stock table's rows matched to the history's items by name.
//!
//! Kept apart from: reading the table's cells (`stock_table`) and from the history's own
//! rule that names differing only in case or white space are one item (`build`), which this
//! follows and extends to what a second system changes in a name: punctuation, and the
//! leading zeros of a code of digits that a spreadsheet drops ("00123" and "123").
//!
//! Rules (our choices): a row naming an item exactly is that item's; otherwise a row whose
//! name has the same key ([`name_key`]) as exactly one item is that item's, said in a warning
//! naming both spellings; otherwise, where the history joined two columns into its items'
//! names ("FG-1001 / Birch trellis", a code and a description, or a store and an item), a row
//! whose key is that of one part of exactly one item's name is that item's, said in a warning
//! too (a stock table commonly names items by their code alone); a key, or a part, shared by
//! several items matches none (said, left out); a row naming no item is left out, said (a
//! "Total" row, an item the history does not hold); two rows that come to the same item are an
//! error at the second. [`ItemNames::find`] is the one lookup: the item column's choice
//! (`stock_columns`) scores columns by it too.

use super::build::{agreeing, count, listing, PART_JOIN};
use super::stock_table::StockRow;
use super::RowError;
use std::collections::HashMap;

/// A name without case, white space or punctuation; a name of digits alone also without its
/// leading zeros. Digits parted by anything stay parted ("1.5 L" is not "15 L", "1.23" not
/// "123").
pub(crate) fn name_key(name: &str) -> String {
    let mut key = String::new();
    let mut parted = false;
    for c in name.chars() {
        if !c.is_alphanumeric() {
            parted = !key.is_empty();
            continue;
        }
        if parted && c.is_ascii_digit() && key.ends_with(|k: char| k.is_ascii_digit()) {
            key.push('_');
        }
        parted = false;
        key.extend(c.to_lowercase());
    }
    if !key.is_empty() && key.chars().all(|c| c.is_ascii_digit()) {
        let trimmed = key.trim_start_matches('0');
        return if trimmed.is_empty() { "0" } else { trimmed }.to_string();
    }
    key
}

/// Where a stock row's name was found among the history's items.
#[derive(Clone, Debug, PartialEq)]
pub(crate) enum Found {
    /// The name as the history writes it.
    Exact(usize),
    /// The same key ([`name_key`]) as this item alone.
    Key(usize),
    /// The key of one part of this item's joined name, and of no other item's.
    Part(usize),
    /// The key, or a part's key, of these items: none is taken.
    Several(Vec<usize>),
    Nowhere,
}

/// The history's item names, indexed for [`ItemNames::find`].
pub(crate) struct ItemNames<'a> {
    exact: HashMap<&'a str, usize>,
    by_key: HashMap<String, Vec<usize>>,
    by_part: HashMap<String, Vec<usize>>,
}

impl<'a> ItemNames<'a> {
    pub(crate) fn new(names: &'a [&'a str]) -> ItemNames<'a> {
        let exact = names.iter().enumerate().map(|(i, n)| (*n, i)).collect();
        let mut by_key: HashMap<String, Vec<usize>> = HashMap::new();
        let mut by_part: HashMap<String, Vec<usize>> = HashMap::new();
        for (i, n) in names.iter().enumerate() {
            by_key.entry(name_key(n)).or_default().push(i);
            let parts: Vec<&str> = n.split(PART_JOIN).map(str::trim).collect();
            if parts.len() < 2 {
                continue;
            }
            for part in parts.into_iter().filter(|p| !p.is_empty()) {
                let items = by_part.entry(name_key(part)).or_default();
                if items.last() != Some(&i) {
                    items.push(i);
                }
            }
        }
        ItemNames {
            exact,
            by_key,
            by_part,
        }
    }

    /// Where `name` is found: exactly, else by its key, else by a part's key.
    pub(crate) fn find(&self, name: &str) -> Found {
        if let Some(&i) = self.exact.get(name) {
            return Found::Exact(i);
        }
        let key = name_key(name);
        let several = |items: &[usize], one: fn(usize) -> Found| match items {
            [] => Found::Nowhere,
            [i] => one(*i),
            _ => Found::Several(items.to_vec()),
        };
        match self.by_key.get(&key) {
            Some(items) => several(items, Found::Key),
            None => several(
                self.by_part.get(&key).map_or(&[][..], Vec::as_slice),
                Found::Part,
            ),
        }
    }
}

/// A row read, with the line it stands on and its item column's header.
pub(crate) struct ReadRow {
    pub line: usize,
    pub column: String,
    pub row: StockRow,
}

/// What matching left: the rows of the history's items, under the history's names, and what
/// was said about the rest.
#[derive(Default)]
pub(crate) struct Matched {
    pub rows: Vec<StockRow>,
    pub warnings: Vec<String>,
    pub errors: Vec<RowError>,
}

/// Matches `read` to the history's item names `items`.
pub(crate) fn match_rows(read: Vec<ReadRow>, items: &[&str]) -> Matched {
    let names = ItemNames::new(items);
    let mut out = Matched::default();
    let (mut renamed, mut by_part, mut unknown, mut ambiguous) =
        (Vec::new(), Vec::new(), Vec::new(), Vec::new());
    // The line that first took each item.
    let mut taken: Vec<Option<usize>> = vec![None; items.len()];
    for ReadRow {
        line,
        column,
        mut row,
    } in read
    {
        let index = match names.find(&row.item) {
            Found::Exact(i) | Found::Key(i) | Found::Part(i) => i,
            Found::Nowhere => {
                unknown.push(format!("\"{}\" (row {line})", row.item));
                continue;
            }
            Found::Several(several) => {
                let names: Vec<String> = several
                    .iter()
                    .map(|&i| format!("\"{}\"", items[i]))
                    .collect();
                ambiguous.push(format!(
                    "\"{}\" (row {line}) could be {}",
                    row.item,
                    names.join(" or ")
                ));
                continue;
            }
        };
        if let Some(first) = taken[index] {
            out.errors.push(RowError {
                row: line,
                column,
                text: row.item.clone(),
                message: format!(
                    "this row and row {first} both name the history's \"{}\" (names are matched \
                     without case, spacing or punctuation, and by one part of a joined name): \
                     keep one",
                    items[index]
                ),
            });
            continue;
        }
        taken[index] = Some(line);
        if row.item != items[index] {
            let pair = format!("\"{}\" (row {line}) as \"{}\"", row.item, items[index]);
            if name_key(&row.item) == name_key(items[index]) {
                renamed.push(pair);
            } else {
                by_part.push(pair);
            }
            row.item = items[index].to_string();
        }
        out.rows.push(row);
    }
    if !renamed.is_empty() {
        out.warnings.push(format!(
            "{} of the stock table {} an item as the history does but for case, spacing, \
             punctuation or leading zeros, and {} read as that item: {}",
            count(renamed.len(), "row"),
            agreeing(renamed.len(), "names", "name"),
            agreeing(renamed.len(), "is", "are"),
            listing(&renamed)
        ));
    }
    if !by_part.is_empty() {
        out.warnings.push(format!(
            "{} of the stock table {} an item by one part of the history's name for it (the \
             history joins two columns into its items' names), and {} read as that item: {}",
            count(by_part.len(), "row"),
            agreeing(by_part.len(), "names", "name"),
            agreeing(by_part.len(), "is", "are"),
            listing(&by_part)
        ));
    }
    if !ambiguous.is_empty() {
        out.warnings.push(format!(
            "{} of the stock table could name more than one item of the history, so {} left \
             out (write the name exactly as in the history): {}",
            count(ambiguous.len(), "row"),
            agreeing(ambiguous.len(), "it is", "they are"),
            listing(&ambiguous)
        ));
    }
    if !unknown.is_empty() {
        out.warnings.push(format!(
            "{} of the stock table {} no item of the history, so {} left out: {}",
            count(unknown.len(), "row"),
            agreeing(unknown.len(), "names", "name"),
            agreeing(unknown.len(), "it is", "they are"),
            listing(&unknown)
        ));
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Rows named `names` (on lines 2, 3, ...) against `items`: the kept rows' names, then
    /// each warning and error.
    fn check(names: &[&str], items: &[&str], expected: &[&str]) {
        let read = names
            .iter()
            .enumerate()
            .map(|(i, n)| ReadRow {
                line: i + 2,
                column: "item".into(),
                row: StockRow {
                    item: n.to_string(),
                    ..StockRow::default()
                },
            })
            .collect();
        let m = match_rows(read, items);
        let mut got: Vec<String> = m.rows.iter().map(|r| r.item.clone()).collect();
        got.extend(m.warnings.iter().map(|w| format!("warning: {w}")));
        got.extend(
            m.errors
                .iter()
                .map(|e| format!("error {} {}: {}", e.row, e.text, e.message)),
        );
        assert_eq!(got.len(), expected.len(), "{got:#?}");
        for (g, e) in got.iter().zip(expected) {
            assert!(g.starts_with(e), "{g}\nexpected to start with\n{e}");
        }
    }

    #[test]
    fn names_match_exactly_then_by_key() {
        let items = ["Seed packets", "Potting mix 40 L", "00123", "A-1", "A1"];
        check(&["Seed packets"], &items, &["Seed packets"]);
        check(
            &["seed  PACKETS", "Potting mix 40L", "123"],
            &items,
            &[
                "Seed packets",
                "Potting mix 40 L",
                "00123",
                "warning: 3 rows of the stock table name an item as the history does but for \
                 case, spacing, punctuation or leading zeros, and are read as that item: \"seed  \
                 PACKETS\" (row 2) as \"Seed packets\", \"Potting mix 40L\" (row 3) as \
                 \"Potting mix 40 L\", \"123\" (row 4) as \"00123\"",
            ],
        );
        // An exact name wins over a key; a key of two items matches neither.
        check(
            &["A1", "a 1"],
            &items,
            &[
                "A1",
                "warning: 1 row of the stock table could name more than one item of the history, \
             so it is left out (write the name exactly as in the history): \"a 1\" (row 3) \
             could be \"A-1\" or \"A1\"",
            ],
        );
        check(
            &["Total", "Seed packet"],
            &items,
            &[
                "warning: 2 rows of the stock table name no item of the history, so they are left \
             out: \"Total\" (row 2), \"Seed packet\" (row 3)",
            ],
        );
        // Two spellings of one item: the second is an error.
        check(
            &["Seed packets", "SEED PACKETS"],
            &items,
            &[
                "Seed packets",
                "error 3 SEED PACKETS: this row and row 2 both name the history's \"Seed packets\"",
            ],
        );
    }

    #[test]
    fn a_part_of_a_joined_name_matches_where_it_is_one_items() {
        let items = ["FG-1 / Birch trellis", "Oak / Seed", "Mill / Seed", "Mill"];
        check(
            &["fg 1", "Seed", "Oak"],
            &items,
            &[
                "FG-1 / Birch trellis",
                "Oak / Seed",
                "warning: 2 rows of the stock table name an item by one part of the history's \
                 name for it (the history joins two columns into its items' names), and are \
                 read as that item: \"fg 1\" (row 2) as \"FG-1 / Birch trellis\", \"Oak\" \
                 (row 4) as \"Oak / Seed\"",
                "warning: 1 row of the stock table could name more than one item of the history, \
                 so it is left out (write the name exactly as in the history): \"Seed\" (row 3) \
                 could be \"Oak / Seed\" or \"Mill / Seed\"",
            ],
        );
        // A whole name before a part ("Mill" is an item); two rows for one item by its two
        // parts: an error at the second.
        check(
            &["Mill", "FG-1", "Birch trellis"],
            &items,
            &[
                "Mill",
                "FG-1 / Birch trellis",
                "warning: 1 row of the stock table names an item by one part",
                "error 4 Birch trellis: this row and row 3 both name the history's \"FG-1 / \
                 Birch trellis\"",
            ],
        );
    }

    #[test]
    fn keys() {
        assert_eq!(name_key("Potting mix, 40 L"), "pottingmix40l");
        assert_eq!(name_key("000"), "0");
        assert_eq!(name_key("0012-A"), "0012a");
        assert_eq!(name_key("Bulbe d'été"), "bulbedété");
        assert_eq!(name_key("Terracotta pot 1.5 L"), "terracottapot1_5l");
        assert_eq!(name_key("Terracotta pot 15 L"), "terracottapot15l");
        assert_eq!(name_key("1.23"), "1_23");
        assert_eq!(name_key("00 123"), "00_123");
    }
}
