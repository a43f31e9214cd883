//! Shapes of hand-made sales reports that read as tables of items but mean something else:
//! a calendar across the header (a grid of one item's values), columns of stock levels and
//! running totals beside the sales, text columns that note the rows, and quantities that look
//! like product numbers in stacked exports. Each rule answers one question for the layout
//! rule in [`super::table`], which calls them and reports what they decided.
//!
//! Kept apart from: deciding the layout (that is [`super::table`]) and reading cells. Every
//! word list here is common practice in sales exports, not a standard; each rule's doc says
//! which ordinary tables it must leave alone, and `tests/intake/sales_reports.rs` holds both
//! sides.

use crate::sorting;
use std::collections::HashMap;

use super::frame::{all_distinct, Table};
use super::headers::{header_is_only, header_says, header_words, ITEM_WORDS};
use super::label::{calendar_name, is_time_of_day, weekday_name, Family};
use super::period::{integer_meaning, IntegerMeaning};
use super::table::{columns_of, once_per_period, Role};
use super::text::Record;
use super::words::{month_in_other_languages, numbered_part};
use super::RowError;

/// Header words of a text column that notes rows rather than names items ("Comment",
/// "Supplier", "Promo"): common practice in sales exports; with (from memory) the German,
/// French, Dutch, Spanish and Italian ones ("Bemerkung": a review found it split items). Only
/// these: a column under any other name ("Model", "Style") may name items even where each
/// period has one row (a low-volume product line).
const NOTE_WORDS: [&str; 40] = [
    "comment",
    "comments",
    "note",
    "notes",
    "remark",
    "remarks",
    "memo",
    "supplier",
    "suppliers",
    "vendor",
    "status",
    "reason",
    "promo",
    "promotion",
    "event",
    "events",
    "weather",
    "flag",
    "info",
    "campaign",
    "explanation",
    "annotation",
    "bemerkung",
    "bemerkungen",
    "kommentar",
    "notiz",
    "hinweis",
    "lieferant",
    "aktion",
    "remarque",
    "commentaire",
    "fournisseur",
    "opmerking",
    "leverancier",
    "nota",
    "notas",
    "comentario",
    "proveedor",
    "commento",
    "fornitore",
];

/// Of the text columns `item_columns`, those that note the periods rather than name items:
/// the ones whose header names a note ([`NOTE_WORDS`]) and no item ([`ITEM_WORDS`]), where
/// they split what would otherwise be read as one history (each period on one row), or,
/// beside columns naming the items (text, or numbers under an item's header,
/// `named_numbers`), where those alone hold each item's period on one row.
/// `Month,Qty,Comment` over "ok", "promo", "ok" is one item's history with a note beside it;
/// read as items, "ok" and "promo" would split it, with the months of the other read as no
/// sales; `Month,Item,Supplier,Qty` with a supplier change would split an item in two.
pub(super) fn notes_columns(
    table: &Table,
    rows: &[&Record],
    item_columns: &[usize],
    named_numbers: &[usize],
    periods: &[&str],
) -> Vec<usize> {
    let notes_only = |j: &usize| {
        let name = table.column_name(*j);
        table.header.is_some()
            && header_says(&name, &NOTE_WORDS)
            && !header_says(&name, &ITEM_WORDS)
    };
    if item_columns.is_empty() || periods.len() != rows.len() {
        return Vec::new();
    }
    let (notes, mut others): (Vec<usize>, Vec<usize>) =
        item_columns.iter().partition(|j| notes_only(j));
    // Product numbers under an item's header ("SKU") name items too.
    others.extend(named_numbers.iter().copied());
    let unique = if others.is_empty() {
        all_distinct(periods)
    } else {
        once_per_period(&columns_of(table, rows, &others), periods)
    };
    if unique {
        notes
    } else {
        Vec::new()
    }
}

/// Header words of a column that says how, where at the counter or by whom a sale was rung
/// up, not what was sold: a till or its operator, the payment, the receipt. Common practice
/// in till exports, not a standard. Only words that name no product line: a review found
/// "Basket", "Ticket", "Voucher", "Bill of materials", "Server rack", "Shift", "Rep", "Staff
/// uniform", "Order type" and "Lane" heading products, variants or stores.
const SALE_DETAIL_WORDS: [&str; 18] = [
    "till",
    "tills",
    "register",
    "checkout",
    "terminal",
    "pos",
    "cashier",
    "cashiers",
    "operator",
    "clerk",
    "salesperson",
    "seller",
    "waiter",
    "payment",
    "tender",
    "receipt",
    "transaction",
    "txn",
];

/// Headers of two or three words naming who rang a sale up (the words of each, lower case).
const DETAIL_PHRASES: [&[&str]; 4] = [
    &["sales", "person"],
    &["served", "by"],
    &["sold", "by"],
    &["rung", "up", "by"],
];

/// Words that may stand beside a detail's word in its header and leave it a detail ("Till
/// no", "Receipt ID", "Cashier name", "Payment method").
const DETAIL_OTHER_WORDS: [&str; 9] = [
    "id", "code", "no", "nr", "number", "num", "name", "method", "type",
];

/// Why a column was left out as a detail of the sale ([`sale_details`]).
#[derive(Clone, Debug, PartialEq, Eq)]
pub(crate) enum SaleDetail {
    /// Its header names a till, cashier, payment or receipt and nothing else
    /// ([`SALE_DETAIL_WORDS`]): the word.
    Named(String),
    /// Most of its rows hold a code of their own (a digit, no space), as receipt or order
    /// numbers do: how many rows of how many.
    OwnOnMostRows(usize, usize),
    /// Its values are codes each found in one period only, more of them than periods, as
    /// receipts of several lines are: how many codes, in how many periods.
    OnePeriodEach(usize, usize),
}

/// Of the text columns `item_columns` of a long table, those that tell how a sale was rung
/// up rather than what was sold, beside another column that names the items (text, or
/// numbers under an item's header, `named_numbers`) whose names repeat: a header naming
/// only a till, cashier, payment or receipt ("Till", "Cashier ID", "Payment method", "Sold
/// by"); or,
/// under a header that names no item or place, a code of its own (a digit, no space) on
/// more than half of at least 8 rows (single-line receipt numbers), or codes each found in
/// one period only, more of them than periods (receipts of several lines). Joined into the item's
/// name they split each product into a history per till or cashier (a review's till export,
/// 2026-12-05), or into items of one sale each; left out, each item's rows of a period are
/// added up across them. A second review found product names of a long-tail catalogue
/// ("Description", "Title" beside a category) taken for receipts when any different value
/// counted: so only codes that stand once, and only these header words. Without another
/// column naming the items they stay (`Date,Till,Qty` is one history per till).
pub(super) fn sale_details(
    table: &Table,
    rows: &[&Record],
    item_columns: &[usize],
    named_numbers: &[usize],
    periods: &[&str],
) -> Vec<(usize, SaleDetail)> {
    let allowed: Vec<&str> = SALE_DETAIL_WORDS
        .iter()
        .chain(DETAIL_OTHER_WORDS.iter())
        .copied()
        .collect();
    let named = |j: usize| -> Option<String> {
        table.header.as_ref()?;
        let name = table.column_name(j);
        let words = header_words(&name);
        let mut lower: Vec<String> = words.iter().map(|w| w.to_lowercase()).collect();
        while lower
            .last()
            .is_some_and(|w| DETAIL_OTHER_WORDS.contains(&w.as_str()))
        {
            lower.pop();
        }
        if DETAIL_PHRASES.iter().any(|phrase| lower == *phrase) {
            return Some(name.clone());
        }
        if !header_is_only(&name, &allowed) {
            return None;
        }
        words
            .into_iter()
            .find(|w| SALE_DETAIL_WORDS.iter().any(|d| w.eq_ignore_ascii_case(d)))
    };
    // A column the header names as the item's or a place's is read so, however its values
    // fall; and receipts need a few rows to show.
    let may_be_receipts =
        |j: usize| rows.len() >= 8 && !header_says(&table.column_name(j), &ITEM_WORDS);
    // Rows whose cell is a code found on no other row.
    let codes_once = |cells: &[&str]| -> usize {
        let mut counts: HashMap<&str, usize> = HashMap::new();
        for cell in cells {
            *counts.entry(cell).or_default() += 1;
        }
        counts
            .iter()
            .filter(|(cell, n)| **n == 1 && is_code(cell))
            .count()
    };
    // Codes (nine in ten values at least) each on rows of one period, more of them than
    // periods: receipts or orders of several lines, each of one day. Products recur over
    // the periods; `None` where any value does.
    let codes_per_period = |cells: &[&str]| -> Option<(usize, usize)> {
        if periods.len() != rows.len() {
            return None;
        }
        let mut period_of: HashMap<&str, &str> = HashMap::new();
        for (cell, period) in cells.iter().zip(periods) {
            if *period_of.entry(cell).or_insert(period) != *period {
                return None;
            }
        }
        let codes = period_of.keys().filter(|c| is_code(c)).count();
        let mut spanned: Vec<&str> = period_of.values().copied().collect();
        sorting::sort(&mut spanned);
        spanned.dedup();
        (codes * 10 >= period_of.len() * 9 && period_of.len() > spanned.len())
            .then_some((period_of.len(), spanned.len()))
    };
    let details: Vec<(usize, SaleDetail)> = item_columns
        .iter()
        .filter_map(|&j| {
            if let Some(word) = named(j) {
                return Some((j, SaleDetail::Named(word)));
            }
            if !may_be_receipts(j) {
                return None;
            }
            let cells = table.column(j, rows);
            let once = codes_once(&cells);
            if once * 2 > rows.len() {
                return Some((j, SaleDetail::OwnOnMostRows(once, rows.len())));
            }
            codes_per_period(&cells)
                .map(|(codes, spanned)| (j, SaleDetail::OnePeriodEach(codes, spanned)))
        })
        .collect();
    let mut others: Vec<usize> = item_columns
        .iter()
        .copied()
        .filter(|j| !details.iter().any(|(k, _)| k == j))
        .collect();
    others.extend(named_numbers.iter().copied());
    if others.is_empty() {
        return Vec::new();
    }
    // The other columns' names must repeat: each row's joined key counted once.
    let mut keys: Vec<Vec<&str>> = rows
        .iter()
        .map(|r| {
            others
                .iter()
                .map(|&j| r.cells.get(j).map_or("", String::as_str))
                .collect()
        })
        .collect();
    sorting::sort(&mut keys);
    keys.dedup();
    if keys.len() * 2 > rows.len() {
        return Vec::new();
    }
    details
}

/// A code as receipts and orders are numbered: a digit in it and no space.
fn is_code(cell: &str) -> bool {
    cell.chars().any(|c| c.is_ascii_digit()) && !cell.chars().any(char::is_whitespace)
}

/// The error for a grid of one item's values with part of the calendar across the header
/// (`Year,Jan,Feb,...,Dec` over a row per year; `Week,Mon,...,Sun` over ISO week labels): at
/// least two of the number columns `numeric`, and more than half of them, headed by parts of
/// what a row is ([`grid_header`]): parts of a year over rows of plain years (no month column
/// beside, `split`), weekdays over rows of ISO weeks ("2024-W01"), of week dates, of years, or
/// of a year and its week or month (week numbers alone are not told from other rows here,
/// so those grids pass as items), times of day over rows of dates; numbered parts ("P1", "M01", "Qtr 1") counting 1, 2, 3, ... across. Read as a table of items, each month
/// would be an item of its own with a value a year, forecast by the year; so the table is
/// refused at its first such header cell, as [`super::across`] refuses the same grid turned
/// round. `None` otherwise: beside monthly rows "W1", "W2" are warehouses and "April", "May"
/// items; "M6", "M8" are bolt sizes.
pub(super) fn calendar_grid(
    table: &Table,
    rows: &[&Record],
    roles: &[Role],
    numeric: &[usize],
    split: bool,
) -> Option<RowError> {
    let header = table.header.as_ref()?;
    let parts: Vec<(usize, GridPart)> = numeric
        .iter()
        .filter_map(|j| Some((*j, grid_header(header.cells.get(*j)?)?)))
        .collect();
    if parts.len() < 2 {
        return None;
    }
    let other = |j: usize| !parts.iter().any(|(k, _)| *k == j);
    let years = !split
        && (0..roles.len())
            .filter(|j| other(*j))
            .any(|j| integer_meaning(&table.column(j, rows), true) == Some(IntegerMeaning::Years));
    let family = |f: Family| {
        (0..roles.len())
            .filter(|j| other(*j))
            .any(|j| roles[j] == Role::Period(f))
    };
    let (weeks, days) = (family(Family::Week), family(Family::Date));
    let fits = |part: &GridPart| match part {
        GridPart::Year(_) => years,
        // Weekdays across rows of years, of a year and its week or month, or of week dates
        // too (`Item,Year,Mon,...,Sun`, `Item,Year,Week,Mon,...`, `Item,Week,Mon,...`):
        // reviews found one weekday's column read as each period's demand.
        GridPart::Week => weeks || years || split || days,
        GridPart::Day => days,
    };
    let named: Vec<usize> = parts
        .iter()
        .filter(|(_, part)| fits(part))
        .map(|(j, _)| *j)
        .collect();
    // Numbered parts must count from 1 across the header, as a calendar does.
    let numbers: Vec<u32> = parts
        .iter()
        .filter_map(|(_, part)| match part {
            GridPart::Year(Some(n)) => Some(*n),
            _ => None,
        })
        .collect();
    let counting = numbers.iter().enumerate().all(|(i, n)| *n == i as u32 + 1);
    // Months named only in another language ("Mars", "Mai", "Set", "Gen" are items' names
    // too) make a grid only as half a year or more: a review found four such items refused.
    let foreign = named.iter().any(|j| {
        let cell = table.column_name(*j).to_lowercase();
        let word = cell.trim().trim_end_matches('.');
        !calendar_name(word) && month_in_other_languages(word).is_some()
    });
    if foreign && named.len() < 6 {
        return None;
    }
    let &first = named.first()?;
    (counting && named.len() >= 2 && named.len() * 2 > numeric.len()).then(|| RowError {
        row: header.line,
        column: table.column_name(first),
        text: table.column_name(first),
        message: format!(
            "expected items or quantities under the header; {} name parts of the calendar \
             (months, quarters, weeks, weekdays or times of day), so the table is a grid with \
             the calendar across the header: write one row per period (e.g. 2023-01,5; with an \
             item column where there are several items), or year, month and quantity columns",
            named
                .iter()
                .take(3)
                .map(|j| format!("\"{}\"", table.column_name(*j)))
                .chain((named.len() > 3).then(|| "...".to_string()))
                .collect::<Vec<_>>()
                .join(", ")
        ),
    })
}

/// What a grid's header cell names: a part of a year (a month, quarter, half, week or
/// accounting period, with its number where it is written as one), of a week (a weekday) or
/// of a day (a time).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum GridPart {
    Year(Option<u32>),
    Week,
    Day,
}

/// The part of the calendar a header cell names as grids write them: month names (also with
/// a dot, "Jan.", "Sept."), weekdays (also "Mo", "Tu"), times of day, and numbered parts
/// "Q1", "W5", "Qtr 1", "Quarter 1", "1st Qtr", "M01", "Month 1", "Week 1", "Wk 1", "P1" to
/// "P13" and "Period 1" (accounting periods), "H1", "H2", "Half 1". `None` for anything else.
fn grid_header(cell: &str) -> Option<GridPart> {
    let lower = cell.trim().trim_end_matches('.').to_lowercase();
    // Weekdays as grids shorten them too ("Mo", "Tu"), in English only: other languages'
    // two letters are as often states or names in a wide table's header ("MA", "MI", "Sam",
    // "Dom"; a review found them refused as weekday grids).
    let two_letters = matches!(
        lower.as_str(),
        "mo" | "tu" | "we" | "th" | "fr" | "sa" | "su"
    );
    if weekday_name(&lower) || two_letters {
        return Some(GridPart::Week);
    }
    if is_time_of_day(&lower) {
        return Some(GridPart::Day);
    }
    if let Some((_, number)) = numbered_part(&lower) {
        return Some(GridPart::Year(Some(number)));
    }
    // Months in German, French, Dutch, Spanish or Italian too ("Januar", "janv."): a review
    // found `Jahr;Januar;...;Dezember` over rows of years read as twelve yearly items.
    (calendar_name(&lower) || lower == "sept" || month_in_other_languages(&lower).is_some())
        .then_some(GridPart::Year(None))
}

/// Header words that name a stock level, goods coming in or going back, a share, a rank or a
/// plan: figures beside the sales, never the demand itself ("Stock on hand", "Units in
/// stock", "Closing bal.", "Qty available", "Received", "Return qty", "Share", "Rank",
/// "Target", "Forecast"; a review found "Target" read beside "Actual").
const STOCK_WORDS: [&str; 32] = [
    "stock",
    "inventory",
    "inv",
    "hand",
    "onhand",
    "soh",
    "oh",
    "opening",
    "closing",
    "ending",
    "beginning",
    "balance",
    "bal",
    "available",
    "avail",
    "received",
    "returned",
    "returns",
    "return",
    "refund",
    "refunds",
    "share",
    "percent",
    "pct",
    "rank",
    "ranking",
    "plan",
    "planned",
    "target",
    "forecast",
    "fcst",
    "budget",
];

/// Words that stand beside a [`STOCK_WORDS`] word in a header that names such a figure and
/// nothing else ("Qty on hand", "Units in stock", "Free stock", "Stock level EOM"); not
/// "sales" or "sold": "Stock sales" are sales.
const STOCK_COMPANIONS: [&str; 16] = [
    "on", "in", "at", "of", "qty", "quantity", "units", "pcs", "level", "end", "start", "free",
    "wh", "month", "period", "eom",
];

/// Header words that name a running total ("YTD Units", "Cumulative sales", "Running total").
const RUNNING_WORDS: [&str; 7] = [
    "ytd",
    "mtd",
    "cumulative",
    "cum",
    "cumul",
    "running",
    "accumulated",
];

/// Words that stand beside a [`RUNNING_WORDS`] word, or make "to date" a running total ("Year
/// to date", "Sales to date").
const RUNNING_COMPANIONS: [&str; 12] = [
    "qty", "quantity", "units", "pcs", "sales", "sold", "total", "year", "month", "period", "to",
    "date",
];

/// Header words that name a rate or a ratio, never a quantity sold, when they end a header.
const RATIO_WORDS: [&str; 5] = ["rate", "ratio", "percent", "percentage", "pct"];

/// What a "Share of ..." header is a share of, when it names a share rather than a product.
const SHARE_OF: [&str; 10] = [
    "sales", "units", "qty", "quantity", "revenue", "turnover", "total", "volume", "value",
    "category",
];

/// What a column [`names_no_demand`] names, in the report's words.
pub(super) const NO_DEMAND: &str = "a stock level, goods received or returned, a running \
     total, a rate, a share, a rank or a plan, not the demand";

/// Whether a header names a stock level, goods received or returned, a running total or a
/// share, and nothing else ([`STOCK_WORDS`], [`RUNNING_WORDS`] with their companions, "to
/// date", "On order", "Goods in", a percent sign not after a number), or a rate or share
/// ([`RATIO_WORDS`], "Share of ..."): "Qty on hand", "YTD Units", "Year to date", "Mix %",
/// "Sell-through rate", "Share of sales" do; "Stock" alone (a flower), "Stock 500", "Gin 40%", "Stock pot",
/// "Stock sales" and "Sales" do not. Read as demand, such a column would be planned as an
/// item (a wide table) or read as the quantity sold (a long table's "Units in stock" before
/// "Units sold"). Common practice: sales reports carry these columns beside the sales.
pub(super) fn names_no_demand(name: &str) -> bool {
    let only = |core: &[&str], companions: &[&str]| {
        let allowed: Vec<&str> = core.iter().chain(companions).copied().collect();
        header_is_only(name, &allowed) && header_says(name, core)
    };
    let words: Vec<String> = header_words(name)
        .iter()
        .map(|w| w.to_lowercase())
        .collect();
    let to_date = words.windows(2).any(|w| w[0] == "to" && w[1] == "date")
        && header_is_only(name, &RUNNING_COMPANIONS);
    // Goods on their way in: "On order", "Goods in" (not "Order qty", a customer's order).
    let inbound = matches!(
        words
            .iter()
            .map(String::as_str)
            .collect::<Vec<_>>()
            .as_slice(),
        ["on", "order"] | ["qty" | "units", "on", "order"] | ["goods", "in"]
    );
    // A percent sign after a number names a product ("Gin 40%"); alone, a share ("Mix %").
    let share = name.match_indices('%').any(|(at, _)| {
        !name[..at]
            .trim_end()
            .ends_with(|c: char| c.is_ascii_digit())
    });
    // One of these words alone may name a product ("Stock", a flower; "Balance", a board);
    // with a number after it, too ("Stock 500"); "YTD 2024" is still a running total.
    const ALONE_AMBIGUOUS: [&str; 9] = [
        "stock", "balance", "returns", "return", "share", "opening", "closing", "hand", "running",
    ];
    let digits = |w: &String| w.bytes().all(|b| b.is_ascii_digit());
    let ambiguous = match words.as_slice() {
        [w] => ALONE_AMBIGUOUS.contains(&w.as_str()),
        [w, n] => ALONE_AMBIGUOUS.contains(&w.as_str()) && digits(n),
        _ => false,
    };
    // A rate or a share of something ("Sell-through rate", "Share of sales"): the rate word
    // last, or "share of" a measure; not "Heart rate monitor" or "Share of harvest box",
    // products a review found dropped when the word stood anywhere.
    let ratio = words
        .last()
        .is_some_and(|w| RATIO_WORDS.contains(&w.as_str()))
        || (words.starts_with(&["share".into(), "of".into()])
            && words.len() > 2
            && words[2..].iter().all(|w| SHARE_OF.contains(&w.as_str())));
    share
        || ratio
        || inbound
        || (!ambiguous
            && (only(&STOCK_WORDS, &STOCK_COMPANIONS)
                || only(&RUNNING_WORDS, &RUNNING_COMPANIONS)
                || to_date))
}

/// Whether a column of whole numbers that no header word names as items (`codes`, beside
/// the period cells `periods`, the two as long, in file order) has the shape of a product
/// list: at least half the periods stand on two rows or more (several products each period), and the rows
/// are not two or more copies of one table stacked. A table of one row per period with a
/// period repeated holds quantities: a correction row repeats a few periods only; stacked
/// exports run through the periods in long runs (each period later than the one above)
/// within which the column changes from row to row, where a product list sorted by product
/// keeps one code through each such run and one sorted by period runs over a period's few
/// rows only. Read as codes, quantities would make items of quantities, so those tables are
/// read as they look, with the repeats errors. Our choices: half the periods; runs of three
/// rows on average; a code changing within most runs.
pub(super) fn codes_recur(codes: &[&str], periods: &[&str]) -> bool {
    let mut sorted = periods.to_vec();
    sorting::sort(&mut sorted);
    let distinct = sorted.chunk_by(|a, b| a == b).count();
    let repeating = sorted
        .chunk_by(|a, b| a == b)
        .filter(|run| run.len() >= 2)
        .count();
    // Runs of rows whose period labels rise, compared as written: ISO labels (2024-01,
    // 2024-01-31) rise as text; other forms break runs early, which only keeps the codes
    // (the reading before this rule).
    let mut runs: Vec<(usize, usize)> = Vec::new();
    for i in 0..periods.len() {
        match runs.last_mut() {
            Some((_, end)) if periods[i] > periods[i - 1] => *end = i + 1,
            _ => runs.push((i, i + 1)),
        }
    }
    let long_runs = 3 * runs.len() <= periods.len();
    let changing = runs
        .iter()
        .filter(|(start, end)| codes[*start..*end].iter().any(|c| *c != codes[*start]))
        .count();
    let stacked = long_runs && 2 * changing > runs.len();
    2 * repeating >= distinct && !stacked
}
