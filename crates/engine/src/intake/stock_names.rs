//! The stock table's rows matched to the history's items by name.
//!
//! Kept apart from: reading the table's cells (`stock_table`) and from the history's own
//! rule that names differing only in case or white space are one item (`build`), which this
//! follows and extends to what a second system changes in a name: punctuation, and the
//! leading zeros of a code of digits that a spreadsheet drops ("00123" and "123").
//!
//! Rules (our choices): a row naming an item exactly is that item's; otherwise a row whose
//! name has the same key ([`name_key`]) as exactly one item is that item's, said in a warning
//! naming both spellings. Where the history joins columns into its items' names (its report's
//! `item_columns`), a name given in all their parts matches by the parts' keys ("Oak Lane /
//! 123" for "Oak Lane / 00123"); and only where every joined column names each item on its own
//! (a code and a description, no two items sharing either, no cell empty), a part, or some
//! parts in the history's order, name the item (said; a stock table commonly
//! names items by their code alone), a single part under the history's own header only in that
//! column's place. A row matched by part must agree with the columns beside it that speak of
//! the history's items ([`Beside`]: a new code beside an old description is no old item), and
//! once such a column has named another item on some row, a row whose cell there is empty has
//! nothing to check it and is left out too (the column read may be another numbering whose
//! values are the history's codes of other items); it gives way to a row naming the item in
//! full; two rows naming one item by parts are both left
//! out. A key or parts several items share match none (said, left out); a row naming no item is
//! left out, said (a "Total" row, an item the history does not hold); two rows that come to the
//! same item in full are an error at the second. The parts are the history's own cells
//! ([`super::Item::parts`]), so a description holding " / " is one part, and a stock cell
//! holding " / " is read whole first. Four probing reviews found every rule that
//! guessed which joined column is a store, a category or a code misplacing stock somewhere, so
//! none does: where one column names each item once but another does not (two codes of one
//! description), rows naming items by that column alone are left out, said with the reason,
//! and offered to the person ([`Matched::could_read_by`]), who may choose to read by it
//! ([`ItemNames::new`]'s `read_by`). [`ItemNames::find`] is the one lookup: the item columns' choice
//! (`stock_columns`) scores columns by it too.

use super::build::{agreeing, count, listing, PART_JOIN};
use super::stock_table::StockRow;
use super::RowError;
use std::collections::{HashMap, HashSet};

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
    /// Some of this item's parts, and no other item's.
    Part(usize),
    /// The key, or a part's key, of these items: none is taken.
    Several(Vec<usize>),
    Nowhere,
}

/// The history's item names, indexed for [`ItemNames::find`].
pub(crate) struct ItemNames<'a> {
    exact: HashMap<&'a str, usize>,
    by_key: HashMap<String, Vec<usize>>,
    /// The history's item columns' headers, one per place.
    headers: Vec<String>,
    /// Per place, each item by its part's key there, where every item has one and no two
    /// share it (a code): a part there could name an item alone, were the person to choose it.
    sole: Vec<Option<HashMap<String, usize>>>,
    /// The place the person chose to read parts in alone (see `new`).
    chosen: Option<usize>,
    /// Why parts do not name items alone, in words: a cell two items share, or an item's
    /// empty cell.
    why_not_alone: Option<String>,
    /// Items by the keys of their parts in two places or more ([`places_key`]): all of them
    /// ("Oak Lane / 123" for "Oak Lane / 00123"), and where a part names an item alone
    /// ([`ItemNames::parts_name_items`]) some of them too.
    by_places: HashMap<String, Vec<usize>>,
    /// Where a part names an item alone, the items by each part's key, in each place.
    by_part: Vec<HashMap<String, Vec<usize>>>,
    /// How many places the history's names join (0 where they are not joined).
    places: usize,
    /// Whether every column the history joins names each item on its own (see `new`).
    alone: bool,
    /// Each item's parts' keys: its own cells ([`super::Item::parts`]), else its name cut at
    /// " / " where that gives the history's places.
    parts: Vec<Vec<String>>,
    /// Every part's key of every item.
    any_part: HashSet<String>,
    /// The items holding each part's key in any place: a part of several items is said to be
    /// theirs ("could be ...").
    holding: HashMap<String, Vec<usize>>,
    /// The items holding each part as written: a part written as one item writes it names
    /// that item, whatever another's key ("123" is not "0123", "Planter" not "PLANTER").
    written: HashMap<String, Vec<usize>>,
}

impl<'a> ItemNames<'a> {
    /// Indexes `names`, read from the history's item columns headed `headers` (the report's
    /// `item_columns`). Where the history joins two columns or more, a name given in all its
    /// parts matches by their keys. A part, or some of the parts, name an item only where
    /// every joined column names each item on its own: no two items share a cell in any place
    /// and none is empty (a code and a description). A history by store and product, by
    /// category, or with an empty cell is matched in full only: a store, a category or a product of several stores names no
    /// item, and reviews found every narrower rule (group words, place headers, agreeing
    /// columns) putting stock on another item in cases it did not foresee.
    ///
    /// `cells`: each item's own cells in the joined columns ([`super::Item::parts`]), where
    /// the history kept them; a name without them is cut at " / " instead.
    ///
    /// `read_by`: a place the person chose to read a part in alone (a stock table by code
    /// beside a history whose descriptions two codes share). Taken only where that column
    /// names each item once (no two items share a cell there, none is empty) and the parts do
    /// not name items already: the choice says the stock table numbers items as the history
    /// does there, which no count can tell from a store of one item.
    pub(crate) fn new(
        names: &'a [&'a str],
        cells: &[&[String]],
        headers: &[String],
        read_by: Option<usize>,
    ) -> ItemNames<'a> {
        let exact = names.iter().enumerate().map(|(i, n)| (*n, i)).collect();
        let mut by_key: HashMap<String, Vec<usize>> = HashMap::new();
        for (i, n) in names.iter().enumerate() {
            by_key.entry(name_key(n)).or_default().push(i);
        }
        let places = if headers.len() >= 2 { headers.len() } else { 0 };
        // Each item's parts as written: its own cells, else its name cut at " / ".
        let written_parts: Vec<Vec<String>> = names
            .iter()
            .enumerate()
            .map(
                |(i, n)| match cells.get(i).filter(|c| places > 0 && c.len() == places) {
                    Some(c) => c.to_vec(),
                    None => n.split(PART_JOIN).map(|p| p.trim().to_string()).collect(),
                },
            )
            .collect();
        let parts: Vec<Vec<String>> = written_parts
            .iter()
            .map(|w| {
                if places > 0 && w.len() == places {
                    w.iter().map(|p| name_key(p)).collect()
                } else {
                    Vec::new()
                }
            })
            .collect();
        let placed = places > 0 && parts.iter().all(|p| !p.is_empty());
        // An empty cell keeps parts from naming items: in a grouped export a store or a
        // category is written once over its items, and its empty cells below mean "the same"
        // (a review traced a category's stock onto its first product where empty cells were
        // taken for no part), which no count can tell from an item without a description.
        let sole: Vec<Option<HashMap<String, usize>>> = (0..places)
            .map(|at| {
                let mut keys = HashMap::new();
                for (i, p) in parts.iter().enumerate() {
                    if !placed || p[at].is_empty() || keys.insert(p[at].clone(), i).is_some() {
                        return None;
                    }
                }
                Some(keys)
            })
            .collect();
        let alone = placed && sole.iter().all(Option::is_some);
        let read_by_place =
            read_by.filter(|&at| !alone && sole.get(at).is_some_and(Option::is_some));
        let why_not_alone = (placed && !alone)
            .then(|| why_not_alone(names, &parts, &written_parts, headers, &sole))
            .flatten();
        let mut by_places: HashMap<String, Vec<usize>> = HashMap::new();
        for chosen in place_sets(places).filter(|c| alone || c.len() == places) {
            for (i, p) in parts.iter().enumerate().filter(|(_, p)| !p.is_empty()) {
                if chosen.iter().any(|&at| p[at].is_empty()) {
                    continue;
                }
                let keys: Vec<&str> = chosen.iter().map(|&at| p[at].as_str()).collect();
                by_places
                    .entry(places_key(&chosen, &keys))
                    .or_default()
                    .push(i);
            }
        }
        let mut by_part: Vec<HashMap<String, Vec<usize>>> = vec![HashMap::new(); places];
        let mut holding: HashMap<String, Vec<usize>> = HashMap::new();
        for (i, p) in parts.iter().enumerate() {
            for (at, key) in p.iter().enumerate().filter(|(_, k)| !k.is_empty()) {
                if alone || read_by_place == Some(at) {
                    by_part[at].entry(key.clone()).or_default().push(i);
                }
                hold(&mut holding, key, i);
            }
        }
        let mut written: HashMap<String, Vec<usize>> = HashMap::new();
        if places > 0 {
            for (i, w) in written_parts.iter().enumerate() {
                for piece in w.iter().filter(|p| !p.is_empty()) {
                    hold(&mut written, piece, i);
                }
            }
        }
        let any_part = parts
            .iter()
            .flatten()
            .filter(|k| !k.is_empty())
            .cloned()
            .collect();
        ItemNames {
            headers: headers.to_vec(),
            sole,
            chosen: read_by_place,
            why_not_alone,
            exact,
            by_key,
            by_places,
            by_part,
            places,
            alone,
            parts,
            any_part,
            holding,
            written,
        }
    }

    /// Whether a part of the history's names names an item alone (see `new`): then a stock
    /// row matched by part must agree with the item columns left out beside it.
    pub(crate) fn parts_name_items(&self) -> bool {
        self.alone || self.chosen.is_some()
    }

    /// The header of the place the person chose to read parts in alone, where it was taken.
    pub(crate) fn chosen_header(&self) -> Option<&str> {
        self.chosen.map(|at| self.headers[at].as_str())
    }

    /// Whether place `at` names each of the history's items once (a code), so a part there
    /// alone could be chosen to name an item.
    pub(crate) fn names_each_item_once(&self, at: usize) -> bool {
        self.sole.get(at).is_some_and(Option::is_some)
    }

    /// Where parts do not name items alone, the place in which `name` is one item's part in
    /// a column naming each item once (in `at` alone, where the stock table's column is the
    /// history's), and that item: what a choice to read by that column would read.
    fn sole_place_of(&self, name: &str, at: Option<usize>) -> Option<(usize, usize)> {
        if self.parts_name_items() {
            return None;
        }
        let key = name_key(name);
        self.sole.iter().enumerate().find_map(|(place, keys)| {
            keys.as_ref()
                .filter(|_| at.is_none_or(|a| a == place))
                .and_then(|k| k.get(&key))
                .map(|&item| (place, item))
        })
    }

    /// Where `name` is found: exactly, else by its key, else by its parts; a single part
    /// only in the place `at` where the stock table's column is the history's (its header
    /// "Product" beside the history's "Product": a category "Seeds" there is no product).
    pub(crate) fn find(&self, name: &str, at: Option<usize>) -> Found {
        if let Some(&i) = self.exact.get(name) {
            return Found::Exact(i);
        }
        let key = name_key(name);
        let several = |items: &[usize], one: fn(usize) -> Found| match items {
            [] => Found::Nowhere,
            [i] => one(*i),
            _ => Found::Several(items.to_vec()),
        };
        if let Some(items) = self.by_key.get(&key) {
            return several(&self.as_written(name, items.clone()), Found::Key);
        }
        // A cell holding " / " may be one part as written (a description "Hose repair kit /
        // 13 mm"): read whole first, cut at " / " only where that names nothing.
        let whole_is_a_part =
            name.contains(PART_JOIN)
                && self.by_part.iter().enumerate().any(|(place, by_key)| {
                    at.is_none_or(|a| a == place) && by_key.contains_key(&key)
                });
        let asked: Vec<String> = if whole_is_a_part {
            vec![key.clone()]
        } else {
            name.split(PART_JOIN).map(|p| name_key(p.trim())).collect()
        };
        let keys: Vec<&str> = asked.iter().map(String::as_str).collect();
        let mut found: Vec<usize> = Vec::new();
        if keys.len() < 2 {
            for (place, by_key) in self.by_part.iter().enumerate() {
                if at.is_none_or(|a| a == place) {
                    for &i in by_key.get(&key).into_iter().flatten() {
                        if !found.contains(&i) {
                            found.push(i);
                        }
                    }
                }
            }
        } else {
            // Every place (a name as the history's but for a part's case or leading zeros),
            // else, where parts name items, as many places in the history's order.
            for chosen in place_sets(self.places).filter(|c| c.len() == keys.len()) {
                for &i in self
                    .by_places
                    .get(&places_key(&chosen, &keys))
                    .into_iter()
                    .flatten()
                {
                    if !found.contains(&i) {
                        found.push(i);
                    }
                }
            }
        }
        if found.is_empty() {
            // A part of several items (a product two stores sell) is said to be theirs.
            return match self.holding.get(&key) {
                Some(items) if keys.len() < 2 && items.len() > 1 => Found::Several(items.clone()),
                _ => Found::Nowhere,
            };
        }
        let found = self.as_written(name, found);
        let whole = keys.len() == self.places;
        several(&found, if whole { Found::Key } else { Found::Part })
    }

    /// Of the items `found` for `name`, those that write each of its parts written as some
    /// item writes one: such a part names those items, not one whose part has only its key
    /// ("123" beside the items "0123" and "123"; "FG1001" beside "FG-1001" and "FG1001").
    fn as_written(&self, name: &str, mut found: Vec<usize>) -> Vec<usize> {
        for piece in name.split(PART_JOIN).map(str::trim) {
            if let Some(writers) = self.written.get(piece) {
                found.retain(|i| writers.contains(i));
            }
        }
        found
    }

    /// Whether `cell` is a part of some item's joined name (a column holding such cells
    /// speaks of the history's items: [`ReadRow::beside`]).
    pub(crate) fn is_a_part(&self, cell: &str) -> bool {
        self.any_part.contains(&name_key(cell))
    }

    /// Whether `cell` is item `index`'s name or one of its parts.
    fn agrees(&self, index: usize, cell: &str, name: &str) -> bool {
        // Written exactly as another item's part and not as this one's: another item's.
        if let Some(writers) = self.written.get(cell.trim()) {
            return writers.contains(&index);
        }
        let key = name_key(cell);
        key == name_key(name) || self.parts[index].contains(&key)
    }
}

/// Headers quoted and joined: "\"Code\" and \"Description\"".
pub(crate) fn quoted_together(headers: &[String]) -> String {
    let quoted: Vec<String> = headers.iter().map(|h| format!("\"{h}\"")).collect();
    super::build::list_in_words(&quoted)
}

/// Why parts do not name items alone ([`ItemNames::new`]), in words: in the first place not
/// naming each item once, an item without a cell there, or a cell two items or more share
/// (as the first of them writes it).
fn why_not_alone(
    names: &[&str],
    parts: &[Vec<String>],
    written: &[Vec<String>],
    headers: &[String],
    sole: &[Option<HashMap<String, usize>>],
) -> Option<String> {
    let at = sole.iter().position(Option::is_none)?;
    let header = headers.get(at)?;
    if let Some(i) = parts.iter().position(|p| p[at].is_empty()) {
        return Some(format!("\"{}\" has no \"{header}\"", names[i]));
    }
    let mut first: HashMap<&str, usize> = HashMap::new();
    for (i, p) in parts.iter().enumerate() {
        if let Some(&j) = first.get(p[at].as_str()) {
            let sharing: Vec<String> = (0..parts.len())
                .filter(|&k| parts[k][at] == p[at])
                .map(|k| format!("\"{}\"", names[k]))
                .collect();
            let cell = written
                .get(j)
                .and_then(|w| w.get(at))
                .map_or("", String::as_str);
            return Some(format!(
                "\"{cell}\" is the \"{header}\" of {}",
                super::build::list_in_words(&sharing)
            ));
        }
        first.insert(p[at].as_str(), i);
    }
    None
}

/// Item `i` among the holders of `part` in `by`, once (an item may hold a part in two places).
fn hold(by: &mut HashMap<String, Vec<usize>>, part: &str, i: usize) {
    let items = by.entry(part.to_string()).or_default();
    if items.last() != Some(&i) {
        items.push(i);
    }
}

/// The sets of two places or more among `places` (each in increasing order); past four
/// places only all of them.
fn place_sets(places: usize) -> impl Iterator<Item = Vec<usize>> {
    let every = (1u32 << places.min(31)).saturating_sub(1);
    (1u32..=every)
        .filter(move |mask| mask.count_ones() >= 2 && (places <= 4 || *mask == every))
        .map(move |mask| (0..places).filter(|at| mask & (1 << at) != 0).collect())
}

/// The key of parts' keys `keys` in places `chosen`.
fn places_key(chosen: &[usize], keys: &[&str]) -> String {
    let at: Vec<String> = chosen.iter().map(usize::to_string).collect();
    format!("{}\u{1f}{}", at.join(","), keys.join("\u{1f}"))
}

/// A row read, with the line it stands on and its item column's header.
pub(crate) struct ReadRow {
    pub line: usize,
    pub column: String,
    pub row: StockRow,
    /// The row's cells in columns left out that speak of the history's items (`stock_columns::
    /// witnesses`): a row matched by part must agree with them.
    pub beside: Vec<Beside>,
    /// The history's place of the one item column read, where its header is the history's.
    pub place: Option<usize>,
}

/// A cell beside a row's item, in a column left out that speaks of the history's items.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Beside {
    pub header: String,
    pub cell: String,
    /// The column could name the items (a "Code" left out beside the "Description" read): a
    /// cell that is not a part of the item names another (a new code beside an old
    /// description). Otherwise it only holds some of the history's parts: a cell speaks
    /// against the item only when it is another item's part (a bin "B-00-2" or a supplier's
    /// wording names nothing).
    pub strict: bool,
}

/// What matching left: the rows of the history's items, under the history's names, and what
/// was said about the rest.
#[derive(Default)]
pub(crate) struct Matched {
    pub rows: Vec<StockRow>,
    pub warnings: Vec<String>,
    pub errors: Vec<RowError>,
    /// The column naming each item once by which rows left out name items alone, and how
    /// many: the person may choose to read them by it ([`ItemNames::new`]'s `read_by`).
    pub could_read_by: Option<(String, usize)>,
}

/// Matches `read` to the history's item names `items` (indexed as `names`): rows naming an
/// item exactly or by key first, then rows naming one by a part, which give way to them.
pub(crate) fn match_rows(read: Vec<ReadRow>, items: &[&str], names: &ItemNames) -> Matched {
    let mut out = Matched::default();
    let (mut unknown, mut ambiguous, mut disagree, mut second, mut clash) =
        (Vec::new(), Vec::new(), Vec::new(), Vec::new(), Vec::new());
    let mut disagreed_strictly = false;
    // Rows left out naming an item by a part alone: by place where that column names each
    // item once (a choice could read them), else together.
    let mut by_sole: Vec<Vec<(String, usize)>> = vec![Vec::new(); names.headers.len()];
    let mut part_alone = Vec::new();
    let found: Vec<Found> = read
        .iter()
        .map(|r| names.find(&r.row.item, r.place))
        .collect();
    let in_full = |k: usize| matches!(found[k], Found::Exact(_) | Found::Key(_));
    // The row that first took each item, and each row's item.
    let mut taken: Vec<Option<usize>> = vec![None; items.len()];
    let mut chosen: Vec<Option<usize>> = vec![None; read.len()];
    for by_a_part in [false, true] {
        for (k, r) in read.iter().enumerate() {
            let line = r.line;
            // A row left out that a choice to read by one column would read, and as what.
            let offered = match (&found[k], by_a_part) {
                (Found::Nowhere | Found::Several(_), false) => {
                    names.sole_place_of(&r.row.item, r.place)
                }
                _ => None,
            };
            if let Some((at, item)) = offered {
                by_sole[at].push((format!("\"{}\" (row {line})", r.row.item), item));
                continue;
            }
            let index = match (&found[k], by_a_part) {
                (Found::Exact(i) | Found::Key(i), false) | (Found::Part(i), true) => *i,
                (Found::Nowhere, false) => {
                    let listed = format!("\"{}\" (row {line})", r.row.item);
                    if !names.parts_name_items() && names.is_a_part(&r.row.item) {
                        part_alone.push(listed);
                    } else {
                        unknown.push(listed);
                    }
                    continue;
                }
                (Found::Several(several), false) => {
                    let names: Vec<String> = several
                        .iter()
                        .map(|&i| format!("\"{}\"", items[i]))
                        .collect();
                    ambiguous.push(format!(
                        "\"{}\" (row {line}) could be {}",
                        r.row.item,
                        names.join(" or ")
                    ));
                    continue;
                }
                _ => continue,
            };
            if by_a_part {
                let against = r.beside.iter().find(|b| {
                    !b.cell.is_empty()
                        && !names.agrees(index, &b.cell, items[index])
                        && (b.strict || names.is_a_part(&b.cell))
                });
                if let Some(b) = against {
                    // Only a cell naming another item says the column read may be another
                    // numbering; a new code beside names nothing.
                    disagreed_strictly |= b.strict && names.is_a_part(&b.cell);
                    disagree.push(format!(
                        "\"{}\" (row {line}) would be \"{}\", but its \"{}\" says \"{}\"",
                        r.row.item, items[index], b.header, b.cell
                    ));
                    continue;
                }
                if let Some(first) = taken[index] {
                    let first_line = read[first].line;
                    if in_full(first) {
                        second.push(format!(
                            "\"{}\" (row {line}) would be \"{}\", which row {first_line} names",
                            r.row.item, items[index]
                        ));
                    } else {
                        // Two rows naming one item by parts ("Seeds", a category of one item,
                        // and "Seed packets"): which figure is its is a guess, so neither is
                        // read.
                        chosen[first] = None;
                        clash.push(format!(
                            "\"{}\" (row {line}) and row {first_line} would both be \"{}\"",
                            r.row.item, items[index]
                        ));
                    }
                    continue;
                }
            } else if let Some(first) = taken[index] {
                out.errors.push(RowError {
                    row: line,
                    column: r.column.clone(),
                    text: r.row.item.clone(),
                    message: format!(
                        "this row and row {} both name the history's \"{}\" (names are \
                         matched without case, spacing or punctuation, and by part of a \
                         joined name): keep one",
                        read[first].line, items[index]
                    ),
                });
                continue;
            }
            taken[index] = Some(k);
            chosen[k] = Some(index);
        }
    }
    // Where an item column left out names other items than the column read on some rows (a
    // wholesaler's numbers that are the history's codes of other items), the column read may
    // not follow the history's naming at all: a row matched by its part alone, that column's
    // cell empty, has nothing to check it and is left out too (review 56 found such rows
    // landing on the item whose code the wholesaler's number happened to be).
    let mut unchecked = Vec::new();
    if disagreed_strictly {
        for (k, r) in read.iter().enumerate() {
            let strict: Vec<&Beside> = r.beside.iter().filter(|b| b.strict).collect();
            if let Some(index) = chosen[k].filter(|_| {
                !in_full(k) && !strict.is_empty() && strict.iter().all(|b| b.cell.is_empty())
            }) {
                chosen[k] = None;
                let headers: Vec<String> =
                    strict.iter().map(|b| format!("\"{}\"", b.header)).collect();
                unchecked.push(format!(
                    "\"{}\" (row {}) would be \"{}\", its {} empty",
                    r.row.item,
                    r.line,
                    items[index],
                    headers.join(" and ")
                ));
            }
        }
    }
    // What each row read under another name than the history's was read as, said.
    let (mut renamed, mut by_part) = (Vec::new(), Vec::new());
    for (k, (r, index)) in read.iter().zip(&chosen).enumerate() {
        if let Some(&index) = index.as_ref().filter(|&&i| r.row.item != items[i]) {
            let pair = format!(
                "\"{}\" (row {}) as \"{}\"",
                r.row.item, r.line, items[index]
            );
            if in_full(k) {
                renamed.push(pair);
            } else {
                by_part.push(pair);
            }
        }
    }
    for (r, index) in read.into_iter().zip(chosen) {
        if let Some(index) = index {
            let mut row = r.row;
            row.item = items[index].to_string();
            out.rows.push(row);
        }
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
            "{} of the stock table {} an item by part of the history's name for it (the \
             history joins columns into its items' names), and {} read as that item: {}",
            count(by_part.len(), "row"),
            agreeing(by_part.len(), "names", "name"),
            agreeing(by_part.len(), "is", "are"),
            listing(&by_part)
        ));
    }
    if !disagree.is_empty() {
        out.warnings.push(format!(
            "{} of the stock table {} an item by part of the history's name, but another \
             of {} columns names another, so {} left out: {}",
            count(disagree.len(), "row"),
            agreeing(disagree.len(), "names", "name"),
            agreeing(disagree.len(), "its", "their"),
            agreeing(disagree.len(), "it is", "they are"),
            listing(&disagree)
        ));
    }
    if !unchecked.is_empty() {
        out.warnings.push(format!(
            "{} of the stock table {} an item by part of the history's name with nothing \
             beside to check it, while other rows' columns name other items than the parts \
             read, so {} left out (fill in the empty cell): {}",
            count(unchecked.len(), "row"),
            agreeing(unchecked.len(), "names", "name"),
            agreeing(unchecked.len(), "it is", "they are"),
            listing(&unchecked)
        ));
    }
    if !second.is_empty() {
        out.warnings.push(format!(
            "{} of the stock table {} by part an item another row names in full, so {} \
             left out: {}",
            count(second.len(), "row"),
            agreeing(second.len(), "names", "name"),
            agreeing(second.len(), "it is", "they are"),
            listing(&second)
        ));
    }
    if !clash.is_empty() {
        out.warnings.push(format!(
            "{} of the stock table {} by part an item another row names by part too, so both \
             are left out (write the name as in the history): {}",
            count(clash.len(), "row"),
            agreeing(clash.len(), "names", "name"),
            listing(&clash)
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
    // The column most rows name items by alone is offered; rows by another join the rest.
    let offered = (0..by_sole.len())
        .filter(|&at| !by_sole[at].is_empty())
        .max_by_key(|&at| (by_sole[at].len(), std::cmp::Reverse(at)));
    for at in (0..by_sole.len()).filter(|&at| Some(at) != offered) {
        part_alone.extend(by_sole[at].iter().map(|(listed, _)| listed.clone()));
    }
    let why = names
        .why_not_alone
        .as_deref()
        .unwrap_or("two items share a part");
    if let Some(at) = offered {
        let header = &names.headers[at];
        let rows: Vec<String> = by_sole[at]
            .iter()
            .map(|(listed, item)| format!("{listed} as \"{}\"", items[*item]))
            .collect();
        out.could_read_by = Some((header.clone(), rows.len()));
        out.warnings.push(format!(
            "{} of the stock table {} an item by its \"{header}\" alone and {} left out: \
             the history names its items by {} together, and as {why}, a part alone is not \
             taken to name an item; \"{header}\" names each item once, so you may choose to \
             read the rows by it, if the stock table counts the history's own items (not \
             another store's, not a category's total), each row as: {}",
            count(rows.len(), "row"),
            agreeing(rows.len(), "names", "name"),
            agreeing(rows.len(), "is", "are"),
            quoted_together(&names.headers),
            listing(&rows)
        ));
    }
    if !part_alone.is_empty() {
        out.warnings.push(format!(
            "{} of the stock table {} an item by part of the history's name alone, which is \
             not read as naming it while {why}, so {} left out (write the name as the history \
             does): {}",
            count(part_alone.len(), "row"),
            agreeing(part_alone.len(), "names", "name"),
            agreeing(part_alone.len(), "it is", "they are"),
            listing(&part_alone)
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
        check_joined(names, items, 1, expected);
    }

    /// Rows named `names`, on lines 2, 3, ..., with nothing beside them.
    fn read_rows(names: &[&str]) -> Vec<ReadRow> {
        names
            .iter()
            .enumerate()
            .map(|(i, n)| ReadRow {
                line: i + 2,
                column: "item".into(),
                row: StockRow {
                    item: n.to_string(),
                    ..StockRow::default()
                },
                beside: Vec::new(),
                place: None,
            })
            .collect()
    }

    /// [`check`] against items named by `joined` columns.
    fn check_joined(names: &[&str], items: &[&str], joined: usize, expected: &[&str]) {
        let read = read_rows(names);
        let headers: Vec<String> = (0..joined).map(|k| format!("column {k}")).collect();
        let m = match_rows(read, items, &ItemNames::new(items, &[], &headers, None));
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
    fn a_part_names_an_item_only_where_every_joined_column_names_each_item() {
        // Codes and descriptions each name every item: a part matches.
        let unique = ["FG-1 / Birch trellis", "FG-2 / Rain barrel"];
        check_joined(
            &["fg 1", "Rain barrel"],
            &unique,
            2,
            &[
                "FG-1 / Birch trellis",
                "FG-2 / Rain barrel",
                "warning: 2 rows of the stock table name an item by part of the history's name \
                 for it (the history joins columns into its items' names), and are read as that \
                 item: \"fg 1\" (row 2) as \"FG-1 / Birch trellis\", \"Rain barrel\" (row 3) as \
                 \"FG-2 / Rain barrel\"",
            ],
        );
        // A part gives way to a row naming the item in full; two rows by parts are both left
        // out.
        check_joined(
            &["FG-1", "FG-1 / Birch trellis"],
            &unique,
            2,
            &[
                "FG-1 / Birch trellis",
                "warning: 1 row of the stock table names by part an item another row names in \
                 full, so it is left out: \"FG-1\" (row 2) would be \"FG-1 / Birch trellis\", \
                 which row 3 names",
            ],
        );
        check_joined(
            &["FG-1", "Birch trellis"],
            &unique,
            2,
            &[
                "warning: 1 row of the stock table names by part an item another row names by \
               part too, so both are left out",
            ],
        );
        // Two items share a description: no part names an item, a shared one is said.
        let shared = [
            "FG-1 / Birch trellis",
            "FG-2 / Rain barrel",
            "FG-3 / Rain barrel",
        ];
        check_joined(
            &["fg 1", "Rain barrel"],
            &shared,
            2,
            &[
                "warning: 1 row of the stock table could name more than one item of the \
                 history, so it is left out (write the name exactly as in the history): \
                 \"Rain barrel\" (row 3) could be \"FG-2 / Rain barrel\" or \"FG-3 / Rain \
                 barrel\"",
                "warning: 1 row of the stock table names an item by its \"column 0\" alone and \
                 is left out: the history names its items by \"column 0\" and \"column 1\" \
                 together, and as \"Rain barrel\" is the \"column 1\" of \"FG-2 / Rain \
                 barrel\" and \"FG-3 / Rain barrel\", a part alone is not taken to name an \
                 item; \"column 0\" names each item once, so you may choose to read the rows by \
                 it, if the stock table counts the history's own items (not another store's, not \
                 a category's total), each row as: \"fg 1\" (row 2) as \"FG-1 / Birch trellis\"",
            ],
        );
        // Chosen, the codes name their items alone; the descriptions still do not.
        let headers = ["column 0".to_string(), "column 1".to_string()];
        let chosen = ItemNames::new(&shared, &[], &headers, Some(0));
        assert_eq!(chosen.chosen_header(), Some("column 0"));
        let m = match_rows(read_rows(&["fg 1", "Rain barrel"]), &shared, &chosen);
        assert_eq!(m.rows.len(), 1);
        assert_eq!(m.rows[0].item, "FG-1 / Birch trellis");
        assert_eq!(m.could_read_by, None);
        // A column that does not name each item once cannot be chosen.
        let refused = ItemNames::new(&shared, &[], &headers, Some(1));
        assert_eq!(refused.chosen_header(), None);
        assert!(!refused.parts_name_items());
        // Stores and products repeat: a product alone names no item, said as a part.
        check_joined(
            &["Frost"],
            &["Oak / Seed", "Mill / Seed", "Oak / Frost"],
            2,
            &[
                "warning: 1 row of the stock table names an item by part of the history's name \
               alone, which is not read as naming it while \"Oak\" is the \"column 0\" of \
               \"Oak / Seed\" and \"Oak / Frost\"",
            ],
        );
        // Names of one column holding " / " are never split.
        check(
            &["Bark mulch"],
            &["Bark mulch / 50 L", "Basil pot / 1 L", "Trowel / steel"],
            &["warning: 1 row of the stock table names no item"],
        );
    }

    #[test]
    fn a_part_written_as_another_item_writes_it_is_that_items() {
        // "123" and "0123" are two codes, "FG1001" and "FG-1001" too: a name in all its parts
        // by their keys is not the item whose part only has the key.
        let items = [
            "0123 / Pot 12 cm",
            "123 / Pot 13 cm",
            "FG-1001 / Birch trellis",
            "FG1001 / Birch trellis kit",
        ];
        check_joined(
            &[
                "123 / Pot 12 cm",
                "FG1001 / Birch trellis",
                "0123 / pot 12 CM",
            ],
            &items,
            2,
            &[
                "0123 / Pot 12 cm",
                "warning: 1 row of the stock table names an item as the history does but for \
                 case",
                "warning: 2 rows of the stock table name no item of the history, so they are \
                 left out: \"123 / Pot 12 cm\" (row 2), \"FG1001 / Birch trellis\" (row 3)",
            ],
        );
        // "Planter" is one item's description and, by its key, another's code.
        let planters = [
            "FG-2002 / Planter",
            "PLANTER / Cedar planter box",
            "FG-2003 / Birch trellis",
        ];
        check_joined(
            &["Planter", "planter"],
            &planters,
            2,
            &[
                "FG-2002 / Planter",
                "warning: 1 row of the stock table names an item by part",
                "warning: 1 row of the stock table could name more than one item",
            ],
        );
    }

    #[test]
    fn parts_in_several_places_match_by_their_keys() {
        // A store repeats: only every part together names an item, by their keys.
        let stores = [
            "Oak / 00123 / Trowel",
            "Mill / 00123 / Trowel",
            "Oak / 00456 / Rake",
        ];
        check_joined(
            &["Mill / 123 / trowel", "Oak / 123"],
            &stores,
            3,
            &[
                "Mill / 00123 / Trowel",
                "warning: 1 row of the stock table names an item as the history does but for \
                 case, spacing, punctuation or leading zeros, and is read as that item: \"Mill \
                 / 123 / trowel\" (row 2) as \"Mill / 00123 / Trowel\"",
                "warning: 1 row of the stock table names no item of the history, so it is left \
                 out: \"Oak / 123\" (row 3)",
            ],
        );
        // Every place names each item: some parts in the history's order do too.
        let unique = ["S1 / 00123 / Trowel", "S2 / 00456 / Rake"];
        check_joined(
            &["S1 / 123", "Rake / 456"],
            &unique,
            3,
            &[
                "S1 / 00123 / Trowel",
                "warning: 1 row of the stock table names an item by part",
                "warning: 1 row of the stock table names no item",
            ],
        );
    }

    #[test]
    fn a_row_matched_by_a_part_agrees_with_the_columns_beside_it() {
        let items = ["FG-1 / Seed", "FG-2 / Frost"];
        let row = |line: usize, item: &str, store: &str| ReadRow {
            line,
            column: "Item".into(),
            row: StockRow {
                item: item.into(),
                ..StockRow::default()
            },
            beside: vec![Beside {
                header: "Code".into(),
                cell: store.into(),
                strict: true,
            }],
            place: None,
        };
        let headers = ["Code".to_string(), "Item".to_string()];
        let m = match_rows(
            vec![row(2, "Seed", "FG-1"), row(3, "Frost", "FG-9")],
            &items,
            &ItemNames::new(&items, &[], &headers, None),
        );
        let kept: Vec<&str> = m.rows.iter().map(|r| r.item.as_str()).collect();
        assert_eq!(kept, ["FG-1 / Seed"]);
        assert!(
            m.warnings.iter().any(|w| w.contains(
                "\"Frost\" (row 3) would be \"FG-2 / Frost\", but its \"Code\" says \"FG-9\""
            )),
            "{:?}",
            m.warnings
        );
        // Once the "Code" beside names another item, a row with it empty is not taken on
        // its part alone: the column read may be another numbering altogether.
        let items = ["FG-1 / Seed", "FG-2 / Frost", "FG-3 / Twine"];
        let m = match_rows(
            vec![row(2, "FG-2", "Seed"), row(3, "FG-3", "")],
            &items,
            &ItemNames::new(&items, &[], &headers, None),
        );
        assert!(m.rows.is_empty(), "{:?}", m.rows);
        assert!(
            m.warnings
                .iter()
                .any(|w| w
                    .contains("\"FG-3\" (row 3) would be \"FG-3 / Twine\", its \"Code\" empty")),
            "{:?}",
            m.warnings
        );
        // A new code beside names nothing: the column read is not thereby in doubt.
        let m = match_rows(
            vec![row(2, "FG-2", "FG-20"), row(3, "FG-3", "")],
            &items,
            &ItemNames::new(&items, &[], &headers, None),
        );
        let kept: Vec<&str> = m.rows.iter().map(|r| r.item.as_str()).collect();
        assert_eq!(kept, ["FG-3 / Twine"]);
        // Where no row disagrees, an empty cell beside is no reason to leave a row out.
        let m = match_rows(
            vec![row(2, "FG-2", "Frost"), row(3, "FG-3", "")],
            &items,
            &ItemNames::new(&items, &[], &headers, None),
        );
        let kept: Vec<&str> = m.rows.iter().map(|r| r.item.as_str()).collect();
        assert_eq!(kept, ["FG-2 / Frost", "FG-3 / Twine"]);
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
