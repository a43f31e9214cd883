//! The stock table's header: which column gives which figure. Headers are compared
//! without case, spaces or punctuation (but for `#` and `%`), may name a unit of time
//! ("Lead time (days)") or of count ("Qty on hand"); of two columns giving one figure the one
//! under its own name is read; the item column is the one (or the columns joined, as the
//! history joins a code and a description, or a store and a product) whose names match the
//! history's.
//!
//! Kept apart from: reading the cells under the header (`stock_table`) and matching the
//! rows to the history's items (`stock_names`, whose lookup the item column's choice
//! uses).

use super::build::PART_JOIN;
use super::period_units::TimeUnit;
use super::stock_names::{Found, ItemNames};
use super::stock_table::StockTable;
use super::text::Record;
use super::RowError;

/// The known columns: (field, header spellings after [`normalise`]). A period column's header
/// may end in a unit of time ("Lead time (days)", "lead time in weeks"), a quantity column's
/// in a word for units ("On hand qty", "On order (units)").
const COLUMNS: [(Field, &[&str]); 11] = [
    (
        Field::Item,
        &[
            "item",
            "items",
            "name",
            "product",
            "itemname",
            "productname",
            "sku",
            "code",
            "itemcode",
            "productcode",
            "itemno",
            "itemnumber",
            "article",
            "description",
            "itemdescription",
            "productdescription",
        ],
    ),
    (
        Field::OnHand,
        &[
            "onhand",
            "stockonhand",
            "soh",
            "instock",
            "stock",
            "inventory",
            "currentstock",
            "stocklevel",
        ],
    ),
    (
        Field::OnOrder,
        &[
            "onorder",
            "incoming",
            "intransit",
            "inbound",
            "onpurchaseorder",
        ],
    ),
    (Field::LeadTime, &["leadtime", "lt", "supplierleadtime"]),
    (
        Field::LeadTimeSd,
        &[
            "leadtimesd",
            "leadtimestdev",
            "leadtimestddev",
            "leadtimestandarddeviation",
            "leadtimespread",
            "ltsd",
        ],
    ),
    (
        Field::Review,
        &["review", "reviewperiod", "reviewinterval", "reviewcycle"],
    ),
    (
        Field::Service,
        &[
            "service",
            "servicelevel",
            "cycleservicelevel",
            "csl",
            "servicetarget",
            "serviceleveltarget",
        ],
    ),
    (Field::FillRate, &["fillrate", "fillratetarget"]),
    (
        Field::OrderQuantity,
        &[
            "orderquantity",
            "orderqty",
            "reorderquantity",
            "reorderqty",
            "lotsize",
        ],
    ),
    (
        Field::OrderMultiple,
        &[
            "ordermultiple",
            "packsize",
            "casesize",
            "casepack",
            "multiple",
            "orderincrement",
        ],
    ),
    (
        Field::MinimumOrder,
        &["minimumorder", "minorder", "moq", "minimumorderquantity"],
    ),
];

/// Words before or after a quantity column's name that say only that it counts units.
const QUANTITY_WORDS: [&str; 8] = [
    "quantity", "qty", "units", "unit", "pcs", "count", "ea", "each",
];

/// A column's meaning.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Field {
    /// The item's name.
    Item,
    /// On hand.
    OnHand,
    /// On order.
    OnOrder,
    /// Lead time.
    LeadTime,
    /// Its standard deviation.
    LeadTimeSd,
    /// Review period.
    Review,
    /// Cycle service level.
    Service,
    /// Fill rate.
    FillRate,
    /// Order quantity.
    OrderQuantity,
    /// Order multiple.
    OrderMultiple,
    /// Minimum order.
    MinimumOrder,
}

impl Field {
    /// Whether the column counts periods (and may be written in days, weeks, ...).
    pub(crate) fn counts_periods(self) -> bool {
        matches!(self, Field::LeadTime | Field::LeadTimeSd | Field::Review)
    }

    /// Whether the column is an order rule (order quantity, multiple, minimum).
    pub(crate) fn counts_order_rules(self) -> bool {
        matches!(
            self,
            Field::OrderQuantity | Field::OrderMultiple | Field::MinimumOrder
        )
    }

    /// Whether the column counts units of the item.
    pub(crate) fn counts_units(self) -> bool {
        matches!(
            self,
            Field::OnHand
                | Field::OnOrder
                | Field::OrderQuantity
                | Field::OrderMultiple
                | Field::MinimumOrder
        )
    }
}

/// A header cell without case, spaces, hyphens, underscores, dots, brackets, slashes or
/// colons. Number and percent signs stay: "Stock #" is an identifier and "Stock %" a share,
/// neither a count on hand.
fn normalise(header: &str) -> String {
    header
        .chars()
        .filter(|c| !c.is_whitespace() && !"-_.()[]/:".contains(*c))
        .flat_map(char::to_lowercase)
        .collect()
}

fn field_named(key: &str) -> Option<Field> {
    COLUMNS
        .iter()
        .find(|(_, names)| names.contains(&key))
        .map(|(f, _)| *f)
}

/// A column: its field, and the unit of time its header names, if any.
pub(crate) fn column_of(header: &str) -> Option<(Field, Option<TimeUnit>)> {
    let key = normalise(header);
    column_of_key(&key).or_else(|| {
        // "Qty on hand", "Quantity on order (units)".
        without_quantity_word(&key)
            .and_then(column_of_key)
            .filter(|(f, _)| f.counts_units())
    })
}

/// Which of the history's item columns (`item_headers`, its report's `item_columns`, two or
/// more) a stock table's header is, if any: "Store" beside a history by store and product.
/// Such a column may be read with the item column, joined as the history joins them
/// ([`choose_item_columns`]), and a single one is looked up in its own place
/// (`ItemNames::find`); a "Branch" or "Location" under another header is not (a review found
/// aisle numbers under "Location" read as a history's store numbers).
pub(crate) fn history_column(header: &str, item_headers: &[String]) -> Option<usize> {
    let h = normalise(header);
    (item_headers.len() >= 2)
        .then(|| item_headers.iter().position(|g| normalise(g) == h))
        .flatten()
}

/// A header key without a word for counting before it ("qtyonhand" is "onhand").
fn without_quantity_word(key: &str) -> Option<&str> {
    QUANTITY_WORDS.iter().find_map(|w| key.strip_prefix(w))
}

fn column_of_key(key: &str) -> Option<(Field, Option<TimeUnit>)> {
    if let Some(f) = field_named(key) {
        return Some((f, None));
    }
    // "Service %", "Fill rate (%)": a target may say it is a percent.
    if let Some(f) = key
        .strip_suffix('%')
        .and_then(field_named)
        .filter(|f| matches!(f, Field::Service | Field::FillRate))
    {
        return Some((f, None));
    }
    for (at, _) in key.char_indices().skip(1) {
        let (base, tail) = key.split_at(at);
        let Some(field) = field_named(base) else {
            continue;
        };
        let tail = tail
            .strip_prefix("in")
            .filter(|t| !t.is_empty())
            .unwrap_or(tail);
        if field.counts_periods() {
            if matches!(tail, "period" | "periods") {
                return Some((field, None));
            }
            if let Some(unit) = TimeUnit::from_word(tail) {
                return Some((field, Some(unit)));
            }
        }
        if field.counts_units() && QUANTITY_WORDS.contains(&tail) {
            return Some((field, None));
        }
    }
    None
}

/// Where several columns give one field: the one under its own name ("On hand") is read and
/// the others ("Stock", "In transit") are left out, said; two under the same kind of name
/// are an error at the header ("on hand" twice).
pub(crate) fn set_aside_second_spellings(
    columns: &mut [Option<(Field, Option<TimeUnit>)>],
    header: &Record,
    out: &mut StockTable,
) {
    let own_name = |i: usize| {
        let key = normalise(&header.cells[i]);
        let key = without_quantity_word(&key).unwrap_or(&key);
        COLUMNS.iter().any(|(_, names)| key.starts_with(names[0]))
    };
    for (field, _) in COLUMNS.iter().filter(|(f, _)| *f != Field::Item) {
        let at: Vec<usize> = (0..columns.len())
            .filter(|&i| matches!(columns[i], Some((f, _)) if f == *field))
            .collect();
        if at.len() < 2 {
            continue;
        }
        let own: Vec<usize> = at.iter().copied().filter(|&i| own_name(i)).collect();
        match own.as_slice() {
            [read] => {
                for &i in at.iter().filter(|&&i| i != *read) {
                    columns[i] = None;
                    out.warnings.push(format!(
                        "column \"{}\" of the stock table could give the same figure as \"{}\", \
                         which is read; \"{}\" is left out (if its figures belong in \"{}\", \
                         add them there)",
                        header.cells[i], header.cells[*read], header.cells[i], header.cells[*read]
                    ));
                }
            }
            _ => {
                for &i in &at[1..] {
                    out.errors.push(RowError {
                        row: header.line,
                        column: header.cells[i].clone(),
                        text: header.cells[i].clone(),
                        message: format!(
                            "this column gives the same figure as \"{}\": keep one",
                            header.cells[at[0]]
                        ),
                    });
                }
            }
        }
    }
}

/// The message for a lead-time or review header in a unit of time that cannot be turned
/// into the history's periods ("Lead time (business days)", "(hours)"): refused at the
/// header, since leaving the column out would plan with the default lead time.
pub(crate) fn unusable_time(header: &str) -> Option<String> {
    let key = normalise(header);
    let base = ["leadtimesd", "leadtime", "reviewperiod", "review"]
        .into_iter()
        .find(|b| key.starts_with(b))?;
    // Only units no count of periods holds: a "Lead time (days) max" beside its minimum is
    // left out as any other column is.
    let tail = &key[base.len()..];
    let timeish = ["business", "working", "workday", "hour", "hr"]
        .iter()
        .any(|w| tail.contains(w));
    timeish.then(|| {
        "a lead time or review in these units cannot be turned into the history's periods: \
         write calendar days, weeks or months (\"Lead time (days)\"), or periods; for \
         business days, the calendar days they span (10 business days are 14 days)"
            .to_string()
    })
}

/// The item columns a stock table is read by ([`choose_item_columns`]).
pub(crate) struct ItemColumns {
    /// The columns whose cells, joined ([`row_item`]), name each row's item.
    pub read: Vec<usize>,
    /// The history's place of the one column read, where its header is the history's
    /// ([`place_of`]).
    pub place: Option<usize>,
    /// Columns left out that speak of the history's items, each with whether strictly
    /// (`stock_names::Beside`): a row matched by part must agree with them.
    pub beside: Vec<(usize, bool)>,
}

/// The item columns: the only one, or, where several headers could name items ("SKU" and
/// "Description", "Store" and "Item"), the one, or several joined in any order as the history
/// joins its own ([`row_item`]), whose names match the most of the history's in full (exactly
/// or by key; `stock_names::ItemNames::find`), then the most exactly, then the most by one
/// part, then the history's own headers in its order; the others are left out with a warning.
/// A header is an item column by an item word, or by being one of the history's item
/// columns' ([`history_column`]). An error at the header when no header names items, or
/// when two choices match alike and give the rows different items (which holds whose stock
/// would be a guess).
pub(crate) fn choose_item_columns(
    columns: &mut [Option<(Field, Option<TimeUnit>)>],
    header: &Record,
    rows: &[Record],
    history: (&ItemNames, &[String]),
    warnings: &mut Vec<String>,
) -> Result<ItemColumns, RowError> {
    let (names, item_headers) = history;
    let candidates: Vec<usize> = (0..columns.len())
        .filter(|&i| matches!(columns[i], Some((Field::Item, _))))
        .collect();
    let read = read_columns(columns, header, rows, (names, item_headers), warnings)?;
    let beside = witnesses(columns, header, rows, &read, &candidates, names);
    let place = place_of(header, &read, item_headers);
    Ok(ItemColumns {
        read,
        beside,
        place,
    })
}

/// The history's place of the one item column `chosen`, where its header is one of the
/// history's item columns' ([`history_column`]).
fn place_of(header: &Record, chosen: &[usize], item_headers: &[String]) -> Option<usize> {
    match chosen {
        [one] => history_column(header.cells.get(*one)?, item_headers),
        _ => None,
    }
}

/// The columns left out (`columns` `None`, not `read`) that speak of the history's items,
/// where a part of a name names an item alone (`ItemNames::parts_name_items`): strictly the
/// columns that could have named the items (`candidates`: a "Code" beside the "Description"
/// read) and those whose cells are half or more the history's parts (a "Title" of descriptions),
/// else those where some cell is a part of the history's names.
fn witnesses(
    columns: &[Option<(Field, Option<TimeUnit>)>],
    header: &Record,
    rows: &[Record],
    read: &[usize],
    candidates: &[usize],
    names: &ItemNames,
) -> Vec<(usize, bool)> {
    if !names.parts_name_items() {
        return Vec::new();
    }
    (0..header.cells.len())
        // A column without a header speaks too: a store written beside a list by product
        // under no header names the list's store (review 59: Mill Road's list took Oak Lane's
        // item by product once parts named items).
        .filter(|&i| columns.get(i).is_some_and(Option::is_none) && !read.contains(&i))
        .filter_map(|i| {
            let filled: Vec<&str> = rows
                .iter()
                .filter_map(|r| r.cells.get(i).map(String::as_str))
                .filter(|c| !c.is_empty())
                .collect();
            let parts = filled.iter().filter(|c| names.is_a_part(c)).count();
            // Half its cells or more the history's parts: an item column under a header of
            // its own ("Title" over descriptions), as strict as a named one.
            let strict = candidates.contains(&i) || (parts > 0 && parts * 2 >= filled.len());
            (strict || parts > 0).then_some((i, strict))
        })
        .collect()
}

/// [`choose_item_columns`]'s choice of the columns read.
fn read_columns(
    columns: &mut [Option<(Field, Option<TimeUnit>)>],
    header: &Record,
    rows: &[Record],
    history: (&ItemNames, &[String]),
    warnings: &mut Vec<String>,
) -> Result<Vec<usize>, RowError> {
    let (names, item_headers) = history;
    let candidates: Vec<usize> = (0..columns.len())
        .filter(|&i| matches!(columns[i], Some((Field::Item, _))))
        .collect();
    let at_header = |message: String| RowError {
        row: header.line,
        column: String::new(),
        text: header.cells.join(", "),
        message,
    };
    match candidates.as_slice() {
        [] => {
            return Err(at_header(
                "the stock table needs a header with an \"item\" column (the names as in the \
                 history) and columns such as \"on hand\" and \"on order\""
                    .into(),
            ))
        }
        [one] => return Ok(vec![*one]),
        _ => {}
    }
    // Each column alone, then every arrangement of two or more (the history may join a store
    // and a product in either order); past five item headers, each alone, every two in
    // either order, and all in the header's order.
    let mut choices: Vec<Vec<usize>> = Vec::new();
    if candidates.len() <= 5 {
        arrangements(&candidates, &mut Vec::new(), &mut choices);
    } else {
        choices.extend(candidates.iter().map(|&i| vec![i]));
        for &i in &candidates {
            choices.extend(candidates.iter().filter(|&&j| j != i).map(|&j| vec![i, j]));
        }
        choices.push(candidates.clone());
    }
    // (rows matched in full, exactly, by one part): a part never outweighs a name matched in
    // full (a "Willow basket" sold only in one store must not take the "Store" and "Item"
    // joined that name every row).
    // Last, how many of the choice's headers are the history's own in the history's order
    // ("Branch", "Code" over "Code", "Branch" where numbers cross).
    let in_order = |chosen: &[usize]| {
        let at: Vec<usize> = chosen
            .iter()
            .filter_map(|&i| history_column(&header.cells[i], item_headers))
            .collect();
        if at.windows(2).all(|w| w[0] < w[1]) {
            at.len()
        } else {
            0
        }
    };
    let score = |chosen: &[usize]| {
        let mut s = (0, 0, 0, in_order(chosen));
        let place = place_of(header, chosen, item_headers);
        for r in rows {
            match names.find(&row_item(r, chosen), place) {
                Found::Exact(_) => (s.0, s.1) = (s.0 + 1, s.1 + 1),
                Found::Key(_) => s.0 += 1,
                Found::Part(_) => s.2 += 1,
                Found::Several(_) | Found::Nowhere => {}
            }
        }
        s
    };
    let scores: Vec<(usize, usize, usize, usize)> = choices.iter().map(|c| score(c)).collect();
    let top = *scores.iter().max().expect("two choices or more");
    // Of choices that name the rows alike, the fewest columns (a column of empty cells
    // joined to another changes no name).
    let fewest = (0..choices.len())
        .filter(|&k| scores[k] == top)
        .map(|k| choices[k].len())
        .min()
        .unwrap_or(1);
    let tied: Vec<usize> = (0..choices.len())
        .filter(|&k| scores[k] == top && choices[k].len() == fewest)
        .collect();
    let named = |chosen: &[usize]| {
        let quoted: Vec<String> = chosen
            .iter()
            .map(|&i| format!("\"{}\"", header.cells[i]))
            .collect();
        match quoted.as_slice() {
            [one] => one.clone(),
            [rest @ .., last] => format!("{} and {last} joined", rest.join(", ")),
            [] => String::new(),
        }
    };
    // Two choices giving every row the same item ("SKU" beside a copy; a code and a
    // description of a history that joins a category too) are one choice.
    let item_of = |r: &Record, chosen: &[usize], place: Option<usize>| match names
        .find(&row_item(r, chosen), place)
    {
        Found::Exact(i) | Found::Key(i) | Found::Part(i) => Some(i),
        Found::Several(_) | Found::Nowhere => None,
    };
    let alike = |a: &[usize], b: &[usize]| {
        let (at_a, at_b) = (
            place_of(header, a, item_headers),
            place_of(header, b, item_headers),
        );
        // A row naming no item either way ("Total") tells the choices no apart.
        rows.iter()
            .all(|r| item_of(r, a, at_a) == item_of(r, b, at_b))
    };
    let first = &choices[tied[0]];
    let nothing = (top.0, top.1, top.2) == (0, 0, 0);
    if !nothing && tied.iter().any(|&k| !alike(first, &choices[k])) {
        let names: Vec<String> = tied.iter().map(|&k| named(&choices[k])).collect();
        return Err(at_header(format!(
            "{} could each name the items, and their names match the history's as often: keep \
             the one that names them as the history does",
            names.join(" and ")
        )));
    }
    // Nothing matches: every item column joined, so each row's unknown name is said whole
    // ("Central DC / Seed packets") rather than one column's repeating as "a row above".
    let best = if nothing {
        candidates.clone()
    } else {
        first.clone()
    };
    let matched = |s: (usize, usize, usize, usize)| s.0 + s.2;
    for &i in candidates.iter().filter(|i| !best.contains(i)) {
        columns[i] = None;
        warnings.push(format!(
            "column \"{}\" of the stock table could name the items too; they are read from \
             {}, whose names match the history's ({} of {} rows against {}), and \"{}\" is \
             left out",
            header.cells[i],
            named(&best),
            matched(top),
            rows.len(),
            matched(score(&[i])),
            header.cells[i]
        ));
    }
    Ok(best)
}

/// Every arrangement of some of `from` (each once, in every order) after `prefix`, into
/// `out`.
fn arrangements(from: &[usize], prefix: &mut Vec<usize>, out: &mut Vec<Vec<usize>>) {
    for &i in from {
        if prefix.contains(&i) {
            continue;
        }
        prefix.push(i);
        out.push(prefix.clone());
        arrangements(from, prefix, out);
        prefix.pop();
    }
}

/// A row's item under the item columns `chosen`: their cells that hold something, joined as
/// the history joins its item columns (`build::PART_JOIN`); empty when none does.
pub(crate) fn row_item(row: &Record, chosen: &[usize]) -> String {
    chosen
        .iter()
        .filter_map(|&i| row.cells.get(i))
        .filter(|c| !c.is_empty())
        .map(String::as_str)
        .collect::<Vec<_>>()
        .join(PART_JOIN)
}
