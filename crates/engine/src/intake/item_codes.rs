//! Item codes written as whole numbers: which number columns of a table name items rather
//! than give quantities (`date,item,store,sales`; `month,1001,1002`'s codes are `coded`'s).
//!
//! Kept apart from: the layout rules that ask (`table`), and the shapes of rows that make
//! numbers look like codes in hand-made reports (`shapes::codes_recur`).

use super::frame::{all_distinct, Table};
use super::headers::{header_is_only, header_says, ITEM_WORDS, PERIOD_WORDS, QUANTITY_WORDS};
use super::period::integer_meaning;
use super::shapes::codes_recur;
use super::table::{columns_of, named_items, once_per_period, whole_number, PeriodColumn};
use super::text::Record;
use crate::sorting;

/// Beside text item columns `names` and a period column (`periods`, its cells), the number
/// columns whose header names an item or store ([`named_items`]) that the items need: where the
/// names alone repeat a period and, with those numbers, never do (`date,item,store,sales`: one
/// item per product and store). None otherwise; one number column always stays.
pub(super) fn codes_beside_names(
    table: &Table,
    rows: &[&Record],
    names: &[usize],
    numeric: &[usize],
    periods: &[&str],
) -> Vec<usize> {
    let named = named_items(table, numeric);
    if named.is_empty() || named.len() >= numeric.len() {
        return Vec::new();
    }
    let unique = |columns: &[usize]| once_per_period(&columns_of(table, rows, columns), periods);
    let with: Vec<usize> = names.iter().chain(&named).copied().collect();
    let digits = columns_of(table, rows, &named)
        .iter()
        .all(|cells| cells.iter().all(|c| whole_number(c)));
    // Stores or products repeat down the rows; numbers that make most rows an item of their
    // own (an order or customer number) split no item's history, they number transactions.
    let repeating = distinct_rows(&columns_of(table, rows, &with)) * 2 <= rows.len();
    if digits && repeating && !unique(names) && unique(&with) {
        named
    } else {
        Vec::new()
    }
}

/// Beside a period column (`periods`, its cells), the number columns that name the items:
/// where the header names some as items, those together if their numbers are item codes
/// ([`item_codes`]) and none otherwise (the header has said which they are; the shape alone
/// must not pick another); without such words, the first column of item codes whose header
/// does not name a quantity ([`QUANTITY_WORDS`]) and whose numbers have the shape of a product
/// list ([`codes_recur`]). One number column always stays for the quantities.
pub(super) fn codes_beside(
    table: &Table,
    rows: &[&Record],
    numeric: &[usize],
    periods: &[&str],
) -> Vec<usize> {
    let named = named_items(table, numeric);
    let columns = |js: &[usize]| columns_of(table, rows, js);
    if !named.is_empty() {
        let cells = columns(&named);
        // One number on every row under a header naming an item and nothing more ("Item",
        // "Item no", "SKU"): one item's code (an export of a single product), never a
        // quantity. Not under "Shop A", a store whose sales may stand still.
        let one_item = named.len() == 1
            && header_is_only(&table.column_name(named[0]), &ITEM_WORDS)
            && cells.iter().all(|c| {
                c.iter().all(|cell| whole_number(cell)) && c.windows(2).all(|w| w[0] == w[1])
            })
            && periods.len() >= 2;
        return if named.len() < numeric.len() && (one_item || item_codes(&cells, periods)) {
            named
        } else {
            Vec::new()
        };
    }
    numeric
        .iter()
        .copied()
        .filter(|j| !header_says(&table.column_name(*j), &QUANTITY_WORDS))
        .find(|j| {
            let column = columns(&[*j]);
            item_codes(&column, periods) && codes_recur(&column[0], periods)
        })
        .into_iter()
        .collect()
}

/// In a table of numbers only, with no period column found by its cells: the columns whose
/// header names the item ([`ITEM_WORDS`]), when their numbers are item codes ([`item_codes`])
/// beside a column whose header names a period ([`PERIOD_WORDS`]) and whose whole numbers
/// count periods or years ([`integer_meaning`]). Without the header's words such a table reads
/// as wide: numbered items and numbered periods have the shape of other tables of whole
/// numbers (a year and a month column side by side). `(code columns, (period column, its
/// meaning))`.
pub(super) fn numbered_by_header(
    table: &Table,
    rows: &[&Record],
    numeric: &[usize],
) -> Option<(Vec<usize>, PeriodColumn)> {
    let periods_named: Vec<usize> = numeric
        .iter()
        .copied()
        .filter(|j| table.header.is_some() && header_says(&table.column_name(*j), &PERIOD_WORDS))
        .collect();
    // Two columns named as periods (a year and a month) make one period between them, which
    // this rule does not read: the table stays as it was.
    let &[p] = periods_named.as_slice() else {
        return None;
    };
    let periods = table.column(p, rows);
    let meaning = integer_meaning(&periods, false)?;
    let named: Vec<usize> = named_items(table, numeric)
        .into_iter()
        .filter(|j| *j != p)
        .collect();
    let codes = !named.is_empty()
        && named.len() + 1 < numeric.len()
        && item_codes(&columns_of(table, rows, &named), &periods);
    codes.then_some((named, (p, Some(meaning))))
}

/// Whether columns of numbers name items rather than count them: every cell a whole number
/// written with digits only, the items (a row's numbers across `columns`) repeating, beside a
/// period column whose periods repeat too, and each (item, period) pair on one row only. That
/// is the shape of product (and store) numbers in item, period, quantity rows; a quantity
/// column with a repeated period would repeat a pair (common practice: item codes are often
/// numeric).
fn item_codes(columns: &[Vec<&str>], periods: &[&str]) -> bool {
    if columns.is_empty() || periods.len() < 2 || all_distinct(periods) {
        return false;
    }
    if !columns
        .iter()
        .all(|c| c.len() == periods.len() && c.iter().all(|cell| whole_number(cell)))
    {
        return false;
    }
    distinct_rows(columns) < periods.len() && once_per_period(columns, periods)
}

/// How many different rows `columns` (each the cells of one column, all as long) make.
fn distinct_rows(columns: &[Vec<&str>]) -> usize {
    let rows = columns.first().map_or(0, Vec::len);
    let mut keys: Vec<Vec<&str>> = (0..rows)
        .map(|i| columns.iter().map(|c| c[i]).collect())
        .collect();
    sorting::sort(&mut keys);
    keys.dedup();
    keys.len()
}
