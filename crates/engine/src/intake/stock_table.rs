//! The stock table: a second, small table with one row per item and what the Stock plan needs
//! beside the history (on hand, on order, and per-item lead time, review, target and order
//! rules). Read with the history's care: the same decoding, delimiter, quotes and decimal-mark
//! rules, and every rejected cell an error with its row, column and text.
//!
//! Kept apart from: the history table's reading (the rest of intake; this table has known
//! columns named in a header, so none of the history's layout guessing applies; it is read
//! against the history's period and item names, never changing them), which column gives
//! which figure (`stock_columns`), matching names (`stock_names`), units of time
//! (`period_units`), and the Stock plan's arithmetic (crate::stock applies a row).
//!
//! Rules (our choices): the header is the line, of the first six, naming items with the most
//! known columns (title and group lines above it left out, said); a column is known by its
//! header, compared without case, spaces or punctuation but for `#` and `%` ([`super::stock_columns`];
//! "Qty on hand", "Lead time (days)"; "Stock #" is no stock); a column with another header is
//! left out with a warning, a lead time in units no period count holds ("business days") is
//! an error at the header, and a table without an on-hand or on-order column is warned of;
//! of two columns giving one figure the one under its own name is read, the other left out,
//! said (two alike: an error); the item column is required, and where several headers could
//! name items ("SKU", "Description", "Store") the one, or the run of them joined as the
//! history joins its item columns, whose names match the history's most is read (alike: an
//! error); an empty cell (or `NA`, `n/a`, `null`) means "not given", so the file's
//! default applies; an item named twice is an error at its second row; rows are matched to
//! the history's items by name ([`super::stock_names`]); lead time, its spread and review
//! period are periods of the history, or days, weeks, months, quarters or years named in the
//! header or the cell, converted ([`super::period_units`]); a lead time of a year or more
//! without a unit, or a spread above its lead time, is warned of; quantities are units: a
//! unit of one or a measure after a number is removed and said, a package ("cases"), a
//! currency or a percent is an error, and so is any unit but one of one in an order rule; a
//! "1.234" or "1,234" is an error when no quantity of the table shows the decimal mark (an
//! on-hand figure a thousand times off orders that much); service targets are fractions
//! (0.95) or percents (95, 95%) from 50 % to below 100 %; a row may give a service level or a
//! fill rate, not both.

use super::build::{agreeing, count, listing};
use super::decode;
use super::mark::{decide_mark, evidence, Evidence, Tally};
use super::number::{is_missing, is_unit, parse_number, NumberError};
use super::period_units::{split_unit, to_periods, TimeUnit};
use super::stock_columns::{
    choose_item_columns, column_of, history_column, row_item, set_aside_second_spellings,
    unusable_time, Field,
};
use super::stock_names::{match_rows, Beside, ItemNames, ReadRow};
use super::text::{delimiter_char, sniff_delimiter, strip_bom, tokenize};
use super::{DecimalMark, Delimiter, IntakeReport, RowError};
use crate::calendar::Frequency;
use crate::stock::{service_fraction_of, Target, MAX_PERIODS};
use std::collections::HashSet;

/// One row: an item and what it gives; `None` where the cell is empty or the column absent.
#[derive(Clone, Debug, Default, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct StockRow {
    /// The item's name, as in the history.
    pub item: String,
    /// Units on hand (negative: backorders).
    pub on_hand: Option<f64>,
    /// Units ordered and not yet received.
    pub on_order: Option<f64>,
    /// Lead time in whole periods.
    pub lead_time: Option<usize>,
    /// The lead time's standard deviation in periods.
    pub lead_time_sd: Option<f64>,
    /// Review period in whole periods.
    pub review_period: Option<usize>,
    /// A cycle-service or fill-rate target.
    pub target: Option<Target>,
    /// Order quantity for continuous review.
    pub order_quantity: Option<f64>,
    /// Orders are whole multiples of this.
    pub order_multiple: Option<f64>,
    /// The smallest order accepted.
    pub minimum_order: Option<f64>,
}

/// What was read of a stock table.
#[derive(Clone, Debug, Default, PartialEq)]
pub struct StockTable {
    /// The rows read, in file order (a row with an error is left out, and the error says so).
    pub rows: Vec<StockRow>,
    /// What was assumed or left out, in words.
    pub warnings: Vec<String>,
    /// Every rejected cell or row with its row, column and text.
    pub errors: Vec<RowError>,
}

impl StockTable {
    /// The row of `item`, when the table has one.
    pub fn row(&self, item: &str) -> Option<&StockRow> {
        self.rows.iter().find(|r| r.item == item)
    }
}

/// How many lines above the header a stock table may have (a title, a date, a blank
/// line's worth of notes); our choice.
const TITLE_LINES: usize = 5;

/// Units that hold several of the item: a count of them is no count of units.
const PACKAGES: [&str; 12] = [
    "box", "boxes", "case", "cases", "pack", "packs", "bag", "bags", "bottle", "bottles", "pairs",
    "pallets",
];

/// Units that are one of the item, said only.
const ONE_UNIT: [&str; 7] = ["pc", "pcs", "pce", "unit", "units", "ea", "each"];

/// What the rows' cells needed saying: lead times turned from a unit into periods, units
/// removed from quantities.
#[derive(Default)]
struct Notes {
    /// (column, "\"14 days\" (row 2) as 2 weeks") per converted cell.
    converted: Vec<(String, String)>,
    /// Whether a conversion went across days and months.
    approximate: bool,
    /// Units removed from quantity cells, and how many cells had one.
    units: Vec<String>,
    unit_cells: usize,
    /// Lead-time spreads above their lead time: "5 against 2 (row 3)".
    spread_above: Vec<String>,
    /// Rows with on hand and an empty on-order cell: "\"A\" (row 2)".
    no_on_order: Vec<String>,
    /// Lead times or review periods written without a unit that come to a year or more:
    /// "\"21\" (row 2)".
    long: Vec<String>,
}

/// Reads a stock table from bytes (UTF-8, or UTF-16 with its byte-order mark) against the
/// history it goes with (its period, for lead times written in days or weeks, and its items'
/// names). Never panics.
pub fn read_stock_table(bytes: &[u8], history: &IntakeReport) -> StockTable {
    from_decoded(&decode::decode_choosing(bytes, &STOCK_SHEET), history)
}

/// Reads a stock table from bytes as [`read_stock_table`] does, or from the workbook sheet
/// `sheet` names, and gives the text read with it (a workbook's sheet, named), decoding once:
/// for a front end that keeps the text (the command line's works and links carry it;
/// `--stock-sheet` names the sheet). `Err` with why beside the table's refusal when nothing
/// could be read.
pub fn read_stock_table_and_text(
    bytes: &[u8],
    sheet: Option<&str>,
    history: &IntakeReport,
) -> (StockTable, Result<super::FileText, String>) {
    let decoded = match sheet {
        Some(sheet) => decode::decode_sheet(bytes, sheet),
        None => decode::decode_choosing(bytes, &STOCK_SHEET),
    };
    let table = from_decoded(&decoded, history);
    (table, super::FileText::of(decoded))
}

/// Reads a stock table that is already text (the page's stock table box) as
/// [`read_stock_table`] reads its bytes, without linking the workbook reader: a workbook's
/// sheet reaches the page as text from its own worker.
pub fn read_stock_table_text(text: &str, history: &IntakeReport) -> StockTable {
    from_decoded(&decode::decode_text(text.as_bytes()), history)
}

fn from_decoded(decoded: &decode::Decoded, history: &IntakeReport) -> StockTable {
    if let Some(why) = &decoded.refused {
        let mut table = StockTable::default();
        table.errors.push(decode::refusal(why.clone()));
        return table;
    }
    let mut table = read_text(&decoded.text, history);
    table.warnings.extend(decoded.assumed.clone());
    table.errors.extend(decode::all_errors(decoded));
    table.errors.sort_by_key(|e| e.row);
    table
}

/// A workbook's sheet for the stock table: the one whose first lines name an on-hand column
/// (a workbook may hold the sales and the stock on sheets of their own), else the fullest.
pub(crate) const STOCK_SHEET: decode::SheetChoice<'static> = decode::SheetChoice {
    named: None,
    prefer: &names_on_hand,
};

/// Whether a cell of the first lines of comma-separated `text` names on hand.
fn names_on_hand(text: &str) -> bool {
    let first = text
        .lines()
        .take(TITLE_LINES + 1)
        .collect::<Vec<_>>()
        .join("\n");
    tokenize(&first, ',').records.iter().any(|r| {
        r.cells
            .iter()
            .any(|c| column_of(c).is_some_and(|(f, _)| f == Field::OnHand))
    })
}

fn read_text(text: &str, history: &IntakeReport) -> StockTable {
    let mut out = StockTable::default();
    let text = strip_bom(text);
    let delimiter = sniff_delimiter(text).unwrap_or(Delimiter::Comma);
    let tokens = tokenize(text, delimiter_char(delimiter));
    for line in tokens.unclosed_quotes {
        out.errors.push(RowError {
            row: line,
            column: String::new(),
            text: String::new(),
            message: "a quote mark opened here is never closed".into(),
        });
    }
    let mut records: Vec<_> = tokens
        .records
        .into_iter()
        .filter(|r| !r.is_blank())
        .collect();
    // Title lines above the header ("Stock count, 30 June"). The header is the record, of the first few, with a column naming items and the most
    // known columns: a line of groups above it ("Product,Warehouse,,Supplier") has fewer.
    let known_columns = |r: &super::text::Record| {
        let fields: Vec<Field> = r
            .cells
            .iter()
            .filter_map(|c| column_of(c))
            .map(|(f, _)| f)
            .collect();
        if fields.contains(&Field::Item) {
            fields.len()
        } else {
            0
        }
    };
    let titles = records
        .iter()
        .take(TITLE_LINES + 1)
        .map(known_columns)
        .enumerate()
        .max_by_key(|&(i, k)| (k, std::cmp::Reverse(i)))
        .filter(|&(_, k)| k > 0)
        .map_or(0, |(i, _)| i);
    if titles > 0 {
        let lines: Vec<String> = records[..titles]
            .iter()
            .map(|r| format!("\"{}\" (row {})", r.cells.join(" "), r.line))
            .collect();
        out.warnings.push(format!(
            "{} above the stock table's header {} left out: {}",
            count(titles, "line"),
            agreeing(titles, "is", "are"),
            listing(&lines)
        ));
    }
    let mut records = records.drain(titles..);
    let Some(header) = records.next() else {
        out.errors.push(RowError {
            row: 1,
            column: String::new(),
            text: String::new(),
            message: "the stock table is empty: give a header row (item, on hand, ...) and a \
                      row per item"
                .into(),
        });
        return out;
    };
    let rows: Vec<_> = records.collect();
    let item_names: Vec<&str> = history.items.iter().map(|i| i.name.as_str()).collect();
    // The history's names indexed once, for the item columns' choice and the rows' matching.
    let names = ItemNames::new(&item_names, &history.item_columns);
    // A header naming a part the history joins into its items' names ("Store" beside a
    // history by store and product) may name the items too.
    let mut columns: Vec<Option<(Field, Option<TimeUnit>)>> = header
        .cells
        .iter()
        .map(|h| {
            column_of(h)
                .or_else(|| history_column(h, &history.item_columns).map(|_| (Field::Item, None)))
        })
        .collect();
    // Known headers, before the item column's choice and the second spellings set some aside
    // (each with its own warning).
    let known: Vec<bool> = columns.iter().map(Option::is_some).collect();
    let item_columns = match choose_item_columns(
        &mut columns,
        &header,
        &rows,
        (&names, &history.item_columns),
        &mut out.warnings,
    ) {
        Ok(i) => i,
        Err(e) => {
            out.errors.push(e);
            return out;
        }
    };
    set_aside_second_spellings(&mut columns, &header, &mut out);
    for (i, h) in header.cells.iter().enumerate() {
        if known[i] || h.is_empty() {
            continue;
        }
        match unusable_time(h) {
            Some(message) => out.errors.push(RowError {
                row: header.line,
                column: h.clone(),
                text: h.clone(),
                message,
            }),
            None => out.warnings.push(format!(
                "column \"{h}\" of the stock table is not one Morrowcast uses; it is left out"
            )),
        }
    }
    let fields: Vec<Option<Field>> = columns.iter().map(|c| c.map(|(f, _)| f)).collect();
    if !fields.contains(&Some(Field::OnHand)) {
        out.warnings.push(
            "the stock table has no on-hand column (\"on hand\", \"stock on hand\", \"qty on \
             hand\"): without it no order is suggested, only the safety stock and reorder point"
                .into(),
        );
    }
    if fields.contains(&Some(Field::OnHand)) && !fields.contains(&Some(Field::OnOrder)) {
        out.warnings.push(
            "the stock table has no on-order column (\"on order\", \"incoming\", \"qty on \
             order\"): goods on order are taken as 0 for every item"
                .into(),
        );
    }
    // The decimal mark, from every cell of the number columns; and from the quantities alone,
    // which alone may settle a "1.234" among them (a service level written "0.95" says little
    // of how the stock counts were written).
    let (mut tally, mut quantities) = (Tally::default(), Tally::default());
    for r in &rows {
        for (i, cell) in r.cells.iter().enumerate() {
            let Some(field) = fields.get(i).copied().flatten() else {
                continue;
            };
            if field != Field::Item {
                let number = split_unit(cell).map_or(cell.as_str(), |(n, _)| n);
                tally.add(evidence(number));
                if field.counts_units() {
                    quantities.add(evidence(number));
                }
            }
        }
    }
    // No quantity shows the mark: a "1.234" among them is refused below rather than guessed
    // (a stock table is short, and an on-hand figure a thousand times off orders that much).
    let undecided = |t: Tally| t.dot == 0 && t.comma == 0;
    let (quantities_undecided, all_undecided) = (undecided(quantities), undecided(tally));
    let (mark, mark_warning) = decide_mark(tally, delimiter);
    if !all_undecided {
        out.warnings.extend(mark_warning);
    }
    let column_name = |i: usize| {
        header
            .cells
            .get(i)
            .filter(|h| !h.is_empty())
            .cloned()
            .unwrap_or(format!("column {}", i + 1))
    };
    let reading = Reading {
        mark,
        quantities_undecided,
        all_undecided,
        frequency: history.frequency,
    };
    let mut notes = Notes::default();
    let mut seen: HashSet<String> = HashSet::new();
    let mut read = Vec::new();
    for r in rows {
        let mut row = StockRow::default();
        let mut bad = Vec::new();
        if r.cells.len() > header.cells.len() {
            let extra = &r.cells[header.cells.len()..];
            if extra.iter().any(|c| !c.is_empty()) {
                bad.push(RowError {
                    row: r.line,
                    column: column_name(header.cells.len()),
                    text: extra.join(", "),
                    message: format!(
                        "this row has {} cells, the header {}: a cell may hold a delimiter \
                         without quotes",
                        r.cells.len(),
                        header.cells.len()
                    ),
                });
            }
        }
        let item = row_item(&r, &item_columns.read);
        if item.is_empty() {
            bad.push(RowError {
                row: r.line,
                column: column_name(item_columns.read[0]),
                text: String::new(),
                message: "the item name is missing".into(),
            });
        } else if seen.contains(&item) {
            bad.push(RowError {
                row: r.line,
                column: column_name(item_columns.read[0]),
                text: item.clone(),
                message: "this item has a row above already: give one row per item".into(),
            });
        }
        if !item.is_empty() {
            seen.insert(item.clone());
        }
        row.item = item;
        let (mut service, mut fill) = (None, None);
        for (i, cell) in r.cells.iter().enumerate() {
            let Some((field, unit)) = columns.get(i).copied().flatten() else {
                continue;
            };
            if field == Field::Item || is_missing(cell) {
                continue;
            }
            let cell_at = CellAt {
                field,
                header_unit: unit,
                text: cell,
                line: r.line,
                column: column_name(i),
            };
            let target = Targets {
                service: &mut service,
                fill: &mut fill,
            };
            if let Err(message) = reading.cell(&cell_at, &mut row, target, &mut notes) {
                bad.push(RowError {
                    row: r.line,
                    column: column_name(i),
                    text: cell.clone(),
                    message,
                });
            }
        }
        row.target = match (service, fill) {
            (Some(_), Some(_)) => {
                bad.push(RowError {
                    row: r.line,
                    column: column_name(item_columns.read[0]),
                    text: row.item.clone(),
                    message: "this row gives both a service level and a fill rate: keep one".into(),
                });
                None
            }
            (Some(p), None) => Target::cycle_service(p).ok(),
            (None, Some(p)) => Target::fill_rate(p).ok(),
            (None, None) => None,
        };
        if row.on_hand.is_some() && row.on_order.is_none() && fields.contains(&Some(Field::OnOrder))
        {
            notes
                .no_on_order
                .push(format!("\"{}\" (row {})", row.item, r.line));
        }
        if let (Some(sd), Some(lead)) = (row.lead_time_sd, row.lead_time) {
            if sd > lead as f64 {
                notes
                    .spread_above
                    .push(format!("{sd} against {lead} (row {})", r.line));
            }
        }
        if bad.is_empty() {
            let beside = item_columns
                .beside
                .iter()
                .map(|&(i, strict)| Beside {
                    header: column_name(i),
                    cell: r.cells.get(i).cloned().unwrap_or_default(),
                    strict,
                })
                .collect();
            read.push(ReadRow {
                line: r.line,
                column: column_name(item_columns.read[0]),
                row,
                beside,
                place: item_columns.place,
            });
        } else {
            out.errors.extend(bad);
        }
    }
    out.warnings.extend(notes.warnings(history.frequency));
    let matched = match_rows(read, &item_names, &names);
    out.rows = matched.rows;
    out.warnings.extend(matched.warnings);
    out.errors.extend(matched.errors);
    out
}

/// One cell being read, with where it stands.
struct CellAt<'a> {
    field: Field,
    header_unit: Option<TimeUnit>,
    text: &'a str,
    line: usize,
    column: String,
}

/// Where a row's targets go, checked against each other by the caller.
struct Targets<'a> {
    service: &'a mut Option<f64>,
    fill: &'a mut Option<f64>,
}

/// How the table's cells are read: its decimal mark (undecided where no quantity, or no
/// cell at all, showed it) and the history's period.
struct Reading {
    mark: DecimalMark,
    quantities_undecided: bool,
    all_undecided: bool,
    frequency: Frequency,
}

impl Reading {
    /// Reads one cell into `row` (a target into `targets`), or says what was expected.
    fn cell(
        &self,
        at: &CellAt<'_>,
        row: &mut StockRow,
        targets: Targets<'_>,
        notes: &mut Notes,
    ) -> Result<(), String> {
        let field = at.field;
        let (text, unit) = match split_unit(at.text) {
            Some((number, unit)) if field.counts_periods() => (number, Some(unit)),
            _ => (at.text, at.header_unit),
        };
        // Lead times and quantities only: a target reads as a fraction or a percent either way
        // (975 % is none).
        if (self.all_undecided && field.counts_periods()
            || self.quantities_undecided && field.counts_units())
            && matches!(
                evidence(text),
                Evidence::AmbiguousDot | Evidence::AmbiguousComma
            )
        {
            return Err(format!(
                "this could be a thousands separator or a decimal mark, and no other cell of \
                 the table shows which: write {} if it groups thousands, or {}0 if it marks \
                 decimals",
                text.replace([',', '.'], ""),
                text.trim()
            ));
        }
        let parsed = parse_number(text, self.mark).map_err(|e| number_message(&e, self.mark))?;
        let mut number = parsed.value;
        match parsed.affix {
            None => {}
            Some(a)
                if field.counts_units()
                    && is_unit(&a)
                    && PACKAGES.contains(&a.to_lowercase().as_str()) =>
            {
                return Err(format!(
                    "\"{a}\" holds more than one unit of the item: write the number of units \
                     (10 cases of 12 are 120)"
                ))
            }
            Some(a)
                if field.counts_order_rules()
                    && !ONE_UNIT.contains(&a.to_lowercase().as_str())
                    && is_unit(&a) =>
            {
                return Err(format!(
                    "an order rule in \"{a}\" may not count the units the history counts (a pack \
                     of 40 L is one bag): write it in the history's units"
                ))
            }
            Some(a) if field.counts_units() && is_unit(&a) => {
                notes.unit_cells += 1;
                if !notes.units.contains(&a) {
                    notes.units.push(a);
                }
            }
            Some(a) if a == "%" && matches!(field, Field::Service | Field::FillRate) => {
                number /= 100.0;
                if !(number > 0.0 && number < 1.0) {
                    return Err("expected a percent above 0 and below 100".into());
                }
            }
            Some(a) if field.counts_units() => {
                return Err(format!(
                    "\"{a}\" is a currency or a share, and this column counts units of the item, \
                     not their value: write the number of units"
                ))
            }
            Some(a) if field.counts_periods() => {
                return Err(format!(
                    "\"{a}\" is not a unit of time: write a number of periods, or of days, \
                     weeks, months, quarters or years (\"14 days\")"
                ))
            }
            Some(a) => {
                return Err(format!(
                    "\"{a}\" does not belong in this column: write the number alone"
                ))
            }
        }
        if let Some(unit) = unit.filter(|u| Some(*u) != TimeUnit::of_period(self.frequency)) {
            let whole = field != Field::LeadTimeSd;
            let converted = to_periods(number, unit, self.frequency, whole)?;
            let period = TimeUnit::of_period(self.frequency).expect("converted into a unit");
            notes.converted.push((
                at.column.clone(),
                format!(
                    "\"{}\" (row {}) as {} {}",
                    at.text.trim(),
                    at.line,
                    trimmed(converted.periods),
                    period.name(converted.periods)
                ),
            ));
            notes.approximate |= converted.approximate;
            number = converted.periods;
        }
        let year = self
            .frequency
            .natural_season()
            .filter(|_| self.frequency != Frequency::Daily);
        if unit.is_none()
            && matches!(field, Field::LeadTime | Field::Review)
            && year.is_some_and(|y| number >= y as f64)
        {
            notes
                .long
                .push(format!("\"{}\" (row {})", at.text.trim(), at.line));
        }
        let periods = |least: f64| {
            if number.fract() == 0.0 && number >= least && number <= MAX_PERIODS as f64 {
                Ok(number as usize)
            } else {
                Err(format!(
                    "expected a whole number of periods from {least} to {MAX_PERIODS}"
                ))
            }
        };
        let at_least_zero = || {
            (number >= 0.0)
                .then_some(number)
                .ok_or_else(|| "expected a quantity of 0 or more".to_string())
        };
        let above_zero = || {
            (number > 0.0)
                .then_some(number)
                .ok_or_else(|| "expected a quantity above 0".to_string())
        };
        let fraction = |what| service_fraction_of(what, number).map_err(|e| e.to_string());
        match field {
            Field::Item => {}
            Field::OnHand => row.on_hand = Some(number),
            Field::OnOrder => row.on_order = Some(at_least_zero()?),
            Field::LeadTime => row.lead_time = Some(periods(0.0)?),
            Field::LeadTimeSd => row.lead_time_sd = Some(at_least_zero()?),
            Field::Review => row.review_period = Some(periods(1.0)?),
            Field::Service => *targets.service = Some(fraction("cycle service level")?),
            Field::FillRate => *targets.fill = Some(fraction("fill rate")?),
            Field::OrderQuantity => row.order_quantity = Some(above_zero()?),
            Field::OrderMultiple => row.order_multiple = Some(above_zero()?),
            Field::MinimumOrder => row.minimum_order = Some(at_least_zero()?),
        }
        Ok(())
    }
}

/// What to write instead of a cell that is no number: the history's words, except where
/// they speak of sales in a period.
fn number_message(e: &NumberError, mark: DecimalMark) -> String {
    match e {
        NumberError::Dash | NumberError::NoneWord(_) => "expected a number: write 0, or leave \
             the cell empty where the figure is not known (the settings then apply; without on \
             hand no order is suggested)"
            .into(),
        NumberError::TooLarge => "expected a figure of at most 10^15 (1,000,000,000,000,000) \
             in size: check the cell for extra digits"
            .into(),
        NumberError::NotFinite => "expected a number; an infinity or \"not a number\" is none \
             (a formula's error?): write the figure, or leave the cell empty"
            .into(),
        NumberError::TrailingMinus(negative) => {
            format!("expected a number with its minus sign first: write {negative}")
        }
        _ => e.message(mark),
    }
}

/// A count with at most two decimals, without trailing zeros.
fn trimmed(x: f64) -> String {
    let s = format!("{x:.2}");
    s.trim_end_matches('0').trim_end_matches('.').to_string()
}

impl Notes {
    fn warnings(self, frequency: Frequency) -> Vec<String> {
        let mut out = Vec::new();
        let mut columns: Vec<&String> = Vec::new();
        for (c, _) in &self.converted {
            if !columns.contains(&c) {
                columns.push(c);
            }
        }
        let (_, period) = frequency.period_words();
        for c in columns {
            let cells: Vec<String> = self
                .converted
                .iter()
                .filter(|(k, _)| k == c)
                .map(|(_, t)| t.clone())
                .collect();
            out.push(format!(
                "\"{c}\" of the stock table was read in {period}, the history's periods{}: {}",
                if self.approximate {
                    " (a month taken as 30.44 days, the calendar's mean)"
                } else {
                    ""
                },
                listing(&cells)
            ));
        }
        if !self.long.is_empty() {
            out.push(format!(
                "{} of the stock table, without a unit, {} a year or more in {period}, the \
                 history's periods: {}; if {} days or weeks, write the unit in the cell (\"21 \
                 days\") or the header (\"Lead time (days)\")",
                count(self.long.len(), "lead time or review period"),
                agreeing(self.long.len(), "comes to", "come to"),
                listing(&self.long),
                agreeing(self.long.len(), "it counts", "they count"),
            ));
        }
        if !self.no_on_order.is_empty() {
            out.push(format!(
                "{} of the stock table {} on hand but no on order, taken as 0: {}",
                count(self.no_on_order.len(), "row"),
                agreeing(self.no_on_order.len(), "gives", "give"),
                listing(&self.no_on_order)
            ));
        }
        if !self.spread_above.is_empty() {
            out.push(format!(
                "{} of the stock table {} above {} lead time, a spread few lead times have: {}; \
                 if {} in days or weeks, name the unit (\"Lead time sd (days)\")",
                count(self.spread_above.len(), "lead-time spread"),
                agreeing(self.spread_above.len(), "is", "are"),
                agreeing(self.spread_above.len(), "its", "their"),
                listing(&self.spread_above),
                agreeing(self.spread_above.len(), "it counts", "they count"),
            ));
        }
        if !self.units.is_empty() {
            let forms: Vec<String> = self.units.iter().map(|a| format!("\"{a}\"")).collect();
            out.push(format!(
                "removed units from {} of the stock table ({}); the numbers were used as \
                 written, without any conversion: they must count the same units as the history",
                count(self.unit_cells, "cell"),
                forms.join(", ")
            ));
        }
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A monthly history of the items the tests name.
    fn history() -> IntakeReport {
        super::super::read(
            "month,Seed packets,Frost cloth,Gift card,A,B\n2024-01,1,2,3,4,5\n2024-02,1,2,3,4,5\n",
        )
    }

    fn check(text: &str, rows: &[StockRow], errors: &[(usize, &str, &str)]) -> StockTable {
        check_against(&history(), text, rows, errors)
    }

    fn check_against(
        history: &IntakeReport,
        text: &str,
        rows: &[StockRow],
        errors: &[(usize, &str, &str)],
    ) -> StockTable {
        let t = read_stock_table(text.as_bytes(), history);
        let got: Vec<(usize, &str, &str)> = t
            .errors
            .iter()
            .map(|e| (e.row, e.column.as_str(), e.text.as_str()))
            .collect();
        assert_eq!(got, errors, "{text}: {:?}", t.errors);
        assert_eq!(t.rows, rows, "{text}");
        t
    }

    /// Whether one of `t`'s warnings holds every one of `parts`.
    fn warns(t: &StockTable, parts: &[&str]) -> bool {
        t.warnings
            .iter()
            .any(|w| parts.iter().all(|p| w.contains(p)))
    }

    #[test]
    fn lead_times_in_days_weeks_or_months_become_the_history_periods() {
        let weekly = super::super::read("week,A,B,C\n2024-W01,1,2,3\n2024-W02,1,2,3\n");
        let t = check_against(
            &weekly,
            "item,on hand,lead time (days),review\nA,5,21,2 weeks\nB,5,14 days,1\nC,5,,14d\n",
            &[
                StockRow {
                    on_hand: Some(5.0),
                    lead_time: Some(3),
                    review_period: Some(2),
                    ..row("A")
                },
                StockRow {
                    on_hand: Some(5.0),
                    lead_time: Some(2),
                    review_period: Some(1),
                    ..row("B")
                },
                StockRow {
                    on_hand: Some(5.0),
                    review_period: Some(2),
                    ..row("C")
                },
            ],
            &[],
        );
        assert!(warns(
            &t,
            &[
                "\"lead time (days)\"",
                "in weeks",
                "\"21\" (row 2) as 3 weeks"
            ]
        ));
        assert!(warns(&t, &["\"review\"", "\"14d\" (row 4) as 2 weeks"]));
        // Not whole: refused with the periods it makes.
        check_against(
            &weekly,
            "item,lead time days\nA,10\n",
            &[],
            &[(2, "lead time days", "10")],
        );
        // Across days and months: within 2 % of whole months, said with the mean month.
        let t = check(
            "item,LT (days),lead time sd (days)\nA,60,10\nB,45,\n",
            &[StockRow {
                lead_time: Some(2),
                lead_time_sd: Some(10.0 / (365.25 / 12.0)),
                ..row("A")
            }],
            &[(3, "LT (days)", "45")],
        );
        assert!(warns(
            &t,
            &["\"LT (days)\"", "30.44 days", "\"60\" (row 2) as 2 months"]
        ));
        assert!(warns(&t, &["\"lead time sd (days)\"", "as 0.33 months"]));
        let err = read_stock_table(b"item,lead time\nA,45 days\n", &history()).errors;
        assert!(err[0].message.contains("45 days is 1.48 months"), "{err:?}");
        assert!(err[0].message.contains("write 1 or 2 (months)"), "{err:?}");
        // A lead time in kilograms is no lead time.
        check("item,lead time\nA,2 kg\n", &[], &[(2, "lead time", "2 kg")]);
    }

    #[test]
    fn quantities_are_units_not_money_and_unclear_separators_are_refused() {
        let t = check(
            "Item,Qty on hand,On order (units)\nA,12 pcs,\"1,200\"\nB,3.5,0\n",
            &[
                StockRow {
                    on_hand: Some(12.0),
                    on_order: Some(1200.0),
                    ..row("A")
                },
                StockRow {
                    on_hand: Some(3.5),
                    on_order: Some(0.0),
                    ..row("B")
                },
            ],
            &[],
        );
        assert!(warns(&t, &["removed units from 1 cell", "\"pcs\""]));
        // Money, packages, and an order rule in a unit the history may not count, refused.
        check(
            "item,on hand,on order,order multiple\nA,$40,0,\nB,5,12 EUR,\nSeed packets,12 \
             cases,,\nGift card,4,0,40 L\n",
            &[],
            &[
                (2, "on hand", "$40"),
                (3, "on order", "12 EUR"),
                (4, "on hand", "12 cases"),
                (5, "order multiple", "40 L"),
            ],
        );
        // A leading 0 groups no thousands, and a target is read either way.
        check(
            "item,on hand\nA,\"0,500\"\n",
            &[row_with_on_hand("A", 0.5)],
            &[],
        );
        check(
            "item,on hand,service\nA,4,0.975\n",
            &[StockRow {
                on_hand: Some(4.0),
                target: Some(Target::CycleService(0.975)),
                ..row("A")
            }],
            &[],
        );
        // No cell shows the decimal mark: "1.234" on hand is refused, not guessed.
        let t = check(
            "item,on hand\nA,1.234\nB,7\n",
            &[row_with_on_hand("B", 7.0)],
            &[(2, "on hand", "1.234")],
        );
        assert!(!warns(&t, &["decimal"]), "{:?}", t.warnings);
        // Another cell shows it: read by it.
        check(
            "item,on hand\nA,1.234\nB,7.5\n",
            &[row_with_on_hand("A", 1.234), row_with_on_hand("B", 7.5)],
            &[],
        );
        // Percent targets.
        check(
            "item,service %\nA,95%\nB,0.9\n",
            &[
                StockRow {
                    target: Some(Target::CycleService(0.95)),
                    ..row("A")
                },
                StockRow {
                    target: Some(Target::CycleService(0.9)),
                    ..row("B")
                },
            ],
            &[],
        );
    }

    // Found by a second probe (2026-12-05) of the rules above: identifiers and shares taken
    // for stock, a second spelling refusing a table that read before, items given to the
    // wrong row's item, a group line taken for the header, a lead time in business days left
    // out for the default.
    #[test]
    fn columns_that_only_look_like_stock_are_not_read_as_it() {
        let t = check("Stock #,Item,Stock %,Qty\nA-1,A,40,7\n", &[row("A")], &[]);
        assert!(warns(&t, &["\"Stock #\"", "left out"]));
        assert!(warns(&t, &["\"Stock %\"", "left out"]));
        let t = check(
            "Item,Stock,On hand,In transit,On order\nA,low,4,2,3\n",
            &[StockRow {
                on_hand: Some(4.0),
                on_order: Some(3.0),
                ..row("A")
            }],
            &[],
        );
        assert!(warns(&t, &["\"Stock\"", "\"On hand\", which is read"]));
        assert!(warns(
            &t,
            &["\"In transit\"", "\"On order\", which is read"]
        ));
        // The same name twice: an error at the header (the table is not used while it has one).
        check(
            "item,on hand,On Hand\nA,4,5\n",
            &[row_with_on_hand("A", 5.0)],
            &[(1, "On Hand", "On Hand")],
        );
        // Two item columns matching alike: refused, not the leftmost taken.
        check(
            "Description,Item,on hand\nA,B,4\n",
            &[],
            &[(1, "", "Description, Item, on hand")],
        );
        // An exact name counts before one matched without case.
        let t = check(
            "Code,SKU,on hand\na,A,4\nb,B,5\n",
            &[row_with_on_hand("A", 4.0), row_with_on_hand("B", 5.0)],
            &[],
        );
        assert!(warns(&t, &["read from \"SKU\""]));
        // Other systems' spellings with words for units of one.
        check(
            "item,Qty on hand (pcs),Qty on order (units)\nA,4,2\n",
            &[StockRow {
                on_hand: Some(4.0),
                on_order: Some(2.0),
                ..row("A")
            }],
            &[],
        );
        check(
            "item,On hand (ea)\nA,4\n",
            &[row_with_on_hand("A", 4.0)],
            &[],
        );
        // A lead time's minimum and maximum in days are left out, not refused.
        let t = check(
            "item,Lead time (days) min,Lead time (days) max\nA,4,9\n",
            &[row("A")],
            &[],
        );
        assert!(warns(&t, &["\"Lead time (days) max\"", "left out"]));
        // Lead times in units that cannot be counted in periods: refused at the header.
        check(
            "item,Lead time (business days)\nA,10\n",
            &[row("A")],
            &[(1, "Lead time (business days)", "Lead time (business days)")],
        );
        let t = check(
            "item,Lead time (calendar days),lead time sd\nA,60,5\n",
            &[StockRow {
                lead_time: Some(2),
                lead_time_sd: Some(5.0),
                ..row("A")
            }],
            &[],
        );
        assert!(warns(&t, &["spread", "5 against 2 (row 2)"]));
        // A line of groups above the header.
        let t = check(
            "Product,Warehouse,,Supplier\nItem,On hand,On order,Lead time\nA,4,0,2\n",
            &[StockRow {
                on_hand: Some(4.0),
                on_order: Some(0.0),
                lead_time: Some(2),
                ..row("A")
            }],
            &[],
        );
        assert!(warns(&t, &["1 line above", "(row 1)"]));
    }

    fn row_with_on_hand(item: &str, on_hand: f64) -> StockRow {
        StockRow {
            on_hand: Some(on_hand),
            ..row(item)
        }
    }

    #[test]
    fn items_named_by_joined_columns_match_by_the_join_or_by_one_part() {
        // The history joins a code and a description, each naming every item on its own.
        let coded = super::super::read(
            "month,code,description,units\n2024-01,FG-1,Birch trellis,3\n2024-01,FG-2,Rain \
             barrel,4\n2024-02,FG-1,Birch trellis,5\n2024-02,FG-2,Rain barrel,6\n",
        );
        assert_eq!(coded.item_columns, ["code", "description"]);
        let (trellis, barrel) = ("FG-1 / Birch trellis", "FG-2 / Rain barrel");
        // The code alone, as stock tables commonly name items: read as that item, said.
        let t = check_against(
            &coded,
            "Item code,On hand\nFG-1,5\nfg-2,6\n",
            &[
                row_with_on_hand(trellis, 5.0),
                row_with_on_hand(barrel, 6.0),
            ],
            &[],
        );
        assert!(warns(
            &t,
            &[
                "2 rows",
                "by part",
                "\"FG-1\" (row 2) as \"FG-1 / Birch trellis\""
            ]
        ));
        // Both columns, as the history has them: joined, nothing to say about the names.
        let t = check_against(
            &coded,
            "Code,Description,On hand\nFG-1,Birch trellis,5\nFG-2,Rain barrel,6\n",
            &[
                row_with_on_hand(trellis, 5.0),
                row_with_on_hand(barrel, 6.0),
            ],
            &[],
        );
        assert!(
            !warns(&t, &["by part"]) && !warns(&t, &["left out"]),
            "{t:?}"
        );
        // A description spelt otherwise: the two joined still name the most rows in full;
        // that row names no item.
        let t = check_against(
            &coded,
            "Code,Description,On hand\nFG-1,Birch trelis,5\nFG-2,Rain barrel,6\n",
            &[row_with_on_hand(barrel, 6.0)],
            &[],
        );
        assert!(
            warns(
                &t,
                &["no item of the history", "\"FG-1 / Birch trelis\" (row 2)"]
            ),
            "{t:?}"
        );
        // A new code beside an old description is no old item: the "Code" left out speaks
        // against the description read.
        let t = check_against(
            &coded,
            "Code,Description,On hand\nFG-9,Rain barrel,7\n",
            &[],
            &[],
        );
        assert!(warns(&t, &["but its \"Code\" says \"FG-9\""]), "{t:?}");
        // A column under a header of its own holding the history's descriptions speaks as an
        // item column: a new item's row ("Oak bench", its code one punctuation mark from an
        // old one) is no old item.
        let t = check_against(
            &coded,
            "Code,Item description,On hand\nFG2,Oak bench,2\nFG-1,Birch trellis,5\n",
            &[row_with_on_hand(trellis, 5.0)],
            &[],
        );
        assert!(
            warns(&t, &["but its \"Item description\" says \"Oak bench\""]),
            "{t:?}"
        );
        // A category of one item under the history's "Product" header names no product.
        let categories = super::super::read(
            "month,category,product,units\n2024-01,Seeds,Seed packets,3\n2024-01,Covers,Frost \
             cloth,4\n2024-02,Seeds,Seed packets,5\n2024-02,Covers,Frost cloth,6\n",
        );
        check_against(
            &categories,
            "Product,On hand\nSeeds,40\nFrost cloth,6\n",
            &[row_with_on_hand("Covers / Frost cloth", 6.0)],
            &[],
        );
        // The history names items by store and product; so does the stock table, in either
        // order, under the history's headers.
        let stores = super::super::read(
            "month,store,item,units\n2024-01,Oak Lane,Seed packets,3\n2024-01,Mill Road,Seed \
             packets,4\n2024-01,Oak Lane,Willow basket,2\n2024-02,Oak Lane,Seed packets,5\n\
             2024-02,Mill Road,Seed packets,6\n2024-02,Oak Lane,Willow basket,1\n",
        );
        let expected = [
            row_with_on_hand("Oak Lane / Seed packets", 5.0),
            row_with_on_hand("Mill Road / Seed packets", 6.0),
        ];
        for text in [
            "Store,Item,On hand\nOak Lane,Seed packets,5\nMill Road,Seed packets,6\n",
            "Item,Store,On hand\nSeed packets,Oak Lane,5\nSeed packets,Mill Road,6\n",
        ] {
            check_against(&stores, text, &expected, &[]);
        }
        // A product alone names no item of a history by store and product, even one only
        // one store sells (a chain's list, or one store's without its store column, is no one
        // store's); one two stores sell is said to be either.
        let t = check_against(
            &stores,
            "Item,On hand\nSeed packets,11\nWillow basket,3\n",
            &[],
            &[],
        );
        assert!(
            warns(
                &t,
                &["could name more than one item", "\"Seed packets\" (row 2)"]
            ),
            "{t:?}"
        );
        assert!(
            warns(&t, &["no item of the history", "\"Willow basket\" (row 3)"]),
            "{t:?}"
        );
        // Another store's list under the history's own headers: its rows name no item.
        let t = check_against(
            &stores,
            "Store,Item,On hand\nHarbour Street,Willow basket,7\n",
            &[],
            &[],
        );
        assert!(
            warns(&t, &["\"Harbour Street / Willow basket\" (row 2)"]),
            "{t:?}"
        );
        // Items numbered alone: a "Site" of small numbers beside them is no item column.
        let numbered = super::super::read(
            "month,item no,units\n2024-01,1,3\n2024-01,2,4\n2024-01,3,5\n2024-02,1,3\n2024-02,2,\
             4\n2024-02,3,5\n",
        );
        check_against(
            &numbered,
            "Site,Item no,On hand\n3,1,10\n1,2,20\n",
            &[row_with_on_hand("1", 10.0), row_with_on_hand("2", 20.0)],
            &[],
        );
        // No column names any item: every item column joined names each row in the warning,
        // not one column's repeats as "a row above".
        let t = check_against(
            &stores,
            "Item,Description,On hand\nSeed trays,Black,7\nSeed trays,Green,8\n",
            &[],
            &[],
        );
        assert!(warns(&t, &["\"Seed trays / Black\" (row 2)"]), "{t:?}");
        // A second item column left empty changes no name: the first is read, not refused as
        // matching alike.
        check(
            "Item,Description,on hand\nA,,4\n",
            &[row_with_on_hand("A", 4.0)],
            &[],
        );
    }

    #[test]
    fn items_by_the_column_whose_names_match_the_history() {
        let t = check(
            "SKU,Description,Stock on hand\n1001,seed packets,4\n1002,Frost cloth,6\n",
            &[
                row_with_on_hand("Seed packets", 4.0),
                row_with_on_hand("Frost cloth", 6.0),
            ],
            &[],
        );
        assert!(warns(&t, &["\"SKU\"", "read from \"Description\""]));
        assert!(warns(&t, &["\"seed packets\" (row 2) as \"Seed packets\""]));
        let t = check("item,reorder point\nA,4\n", &[row("A")], &[]);
        assert!(warns(&t, &["no on-hand column"]));
        assert!(warns(&t, &["\"reorder point\"", "left out"]));
        let t = check("item,on hand\nA,4\n", &[row_with_on_hand("A", 4.0)], &[]);
        assert!(warns(&t, &["no on-order column", "taken as 0"]));
        let t = check(
            "item,on hand,on order\nA,4,n/a\nB,5,1\n",
            &[
                row_with_on_hand("A", 4.0),
                StockRow {
                    on_hand: Some(5.0),
                    on_order: Some(1.0),
                    ..row("B")
                },
            ],
            &[],
        );
        assert!(warns(
            &t,
            &["1 row of the stock table gives on hand but no on order, taken as 0: \"A\" (row 2)"]
        ));
        // Spellings of other systems.
        let t = check(
            "Item code,Item name,Qty on hand,Qty on order,Reorder qty,MOQ,Pack size\n\
             X1,A,4,2,30,10,5\n",
            &[StockRow {
                on_hand: Some(4.0),
                on_order: Some(2.0),
                order_quantity: Some(30.0),
                minimum_order: Some(10.0),
                order_multiple: Some(5.0),
                ..row("A")
            }],
            &[],
        );
        assert!(!warns(&t, &["not one Morrowcast uses"]), "{:?}", t.warnings);
    }

    fn row(item: &str) -> StockRow {
        StockRow {
            item: item.into(),
            ..StockRow::default()
        }
    }

    #[test]
    fn rows_columns_and_defaults() {
        check(
            "Item,On hand,On order,Lead time,Service\nSeed packets,120,40,2,97\nFrost cloth,15,,,\n",
            &[
                StockRow {
                    on_hand: Some(120.0),
                    on_order: Some(40.0),
                    lead_time: Some(2),
                    target: Some(Target::CycleService(0.97)),
                    ..row("Seed packets")
                },
                StockRow {
                    on_hand: Some(15.0),
                    ..row("Frost cloth")
                },
            ],
            &[],
        );
        // Semicolons and decimal commas; header spellings without case, spaces or underscores.
        check(
            "product;ON_HAND;lead-time sd;fill rate\nGift card;12,5;0,5;0,98\n",
            &[StockRow {
                on_hand: Some(12.5),
                lead_time_sd: Some(0.5),
                target: Some(Target::FillRate(0.98)),
                ..row("Gift card")
            }],
            &[],
        );
    }

    #[test]
    fn bad_cells_are_reported_at_their_row_and_column() {
        check(
            "item,on hand,lead time,review,service,fill rate,order multiple\n\
             A,ten,2.5,0,150,,0\n\
             B,5,1,1,95,98,\n\
             A,1,,,,,\n\
             ,3,,,,,\n",
            &[],
            &[
                (2, "on hand", "ten"),
                (2, "lead time", "2.5"),
                (2, "review", "0"),
                (2, "service", "150"),
                (2, "order multiple", "0"),
                (3, "item", "B"),
                (4, "item", "A"),
                (5, "item", ""),
            ],
        );
        // Row 4's "A" is a second row of A even though row 2's was refused.
        let t = read_stock_table(b"name,on hand\n", &history());
        assert!(t.errors.is_empty() && t.rows.is_empty());
        let t = read_stock_table(b"on hand,on order\n5,6\n", &history());
        assert_eq!(t.errors.len(), 1);
        assert!(t.errors[0].message.contains("\"item\" column"));
        let t = read_stock_table(b"item,colour,on hand\nA,red,4\n", &history());
        assert_eq!(t.rows[0].on_hand, Some(4.0));
        assert!(t.warnings[0].contains("\"colour\""), "{:?}", t.warnings);
        let t = read_stock_table(b"", &history());
        assert_eq!(t.errors[0].row, 1);
        // A U+FFFD written in the file (another program could not read bytes there) is an
        // error at its line, as in the history: the row is not read as it stands.
        let t = read_stock_table(
            "item,on hand\nSeed p\u{fffd}ckets,4\n".as_bytes(),
            &history(),
        );
        assert!(t.errors.iter().any(|e| e.row == 2), "{:?}", t.errors);
    }
}
