//! The stock table's rows matched to the history's items by name.
//!
//! Kept apart from: reading the table's cells (`stock_table`) and from the history's own
//! rule that names differing only in case or white space are one item (`build`), which this
//! follows and extends to what a second system changes in a name: punctuation, and the
//! leading zeros of a code of digits that a spreadsheet drops ("00123" and "123").
//!
//! Rules (our choices): a row naming an item exactly is that item's; otherwise a row whose
//! name has the same key ([`name_key`]) as exactly one item is that item's, said in a warning
//! naming both spellings; a key shared by several items matches none (said, left out); a row
//! naming no item is left out, said (a "Total" row, an item the history does not hold); two
//! rows that come to the same item are an error at the second.

use super::build::{agreeing, count, listing};
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
    let exact: HashMap<&str, usize> = items.iter().enumerate().map(|(i, n)| (*n, i)).collect();
    let mut by_key: HashMap<String, Vec<usize>> = HashMap::new();
    for (i, n) in items.iter().enumerate() {
        by_key.entry(name_key(n)).or_default().push(i);
    }
    let mut out = Matched::default();
    let (mut renamed, mut unknown, mut ambiguous) = (Vec::new(), Vec::new(), Vec::new());
    // The line that first took each item.
    let mut taken: Vec<Option<usize>> = vec![None; items.len()];
    for ReadRow {
        line,
        column,
        mut row,
    } in read
    {
        let index = match exact.get(row.item.as_str()) {
            Some(&i) => i,
            None => {
                let same = by_key
                    .get(&name_key(&row.item))
                    .map_or(&[][..], Vec::as_slice);
                match same {
                    [one] => *one,
                    [] => {
                        unknown.push(format!("\"{}\" (row {line})", row.item));
                        continue;
                    }
                    several => {
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
                }
            }
        };
        if let Some(first) = taken[index] {
            out.errors.push(RowError {
                row: line,
                column,
                text: row.item.clone(),
                message: format!(
                    "this row and row {first} both name the history's \"{}\" (names are matched \
                     without case, spacing or punctuation): keep one",
                    items[index]
                ),
            });
            continue;
        }
        taken[index] = Some(line);
        if row.item != items[index] {
            renamed.push(format!(
                "\"{}\" (row {line}) as \"{}\"",
                row.item, items[index]
            ));
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
