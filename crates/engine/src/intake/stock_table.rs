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
use super::stock_names::{match_rows, quoted_together, Beside, ItemNames, ReadRow};
use super::text::{delimiter_char, sniff_delimiter, strip_bom, tokenize};
use super::{DecimalMark, Delimiter, IntakeReport, RowError};
use crate::calendar::Frequency;
use crate::sorting;
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
    /// A column of the history's joined item names that names each item once (a code), and
    /// how many rows left out name an item by it alone: the person may choose to read the
    /// rows by it (`read_by` of the reading functions).
    pub could_read_by: Option<(String, usize)>,
    /// The history's item column the rows were read by alone, as chosen.
    pub read_by: Option<String>,
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
    from_decoded(&decode::decode_choosing(bytes, &STOCK_SHEET), history, None)
}

/// Reads a stock table from bytes as [`read_stock_table`] does, or from the workbook sheet
/// `sheet` names, and gives the text read with it (a workbook's sheet, named), decoding once:
/// for a front end that keeps the text (the command line's works and links carry it;
/// `--stock-sheet` names the sheet). `Err` with why beside the table's refusal when nothing
/// could be read. `read_by`: the history's item column (its header) the person chose to read
/// the rows by alone ([`StockTable::could_read_by`]).
pub fn read_stock_table_and_text(
    bytes: &[u8],
    sheet: Option<&str>,
    history: &IntakeReport,
    read_by: Option<&str>,
) -> (StockTable, Result<super::FileText, String>) {
    let decoded = match sheet {
        Some(sheet) => decode::decode_sheet(bytes, sheet),
        None => decode::decode_choosing(bytes, &STOCK_SHEET),
    };
    let table = from_decoded(&decoded, history, read_by);
    (table, super::FileText::of(decoded))
}

/// Reads a stock table that is already text (the page's stock table box) as
/// [`read_stock_table`] reads its bytes, without linking the workbook reader: a workbook's
/// sheet reaches the page as text from its own worker. `read_by` as for
/// [`read_stock_table_and_text`].
pub fn read_stock_table_text(
    text: &str,
    history: &IntakeReport,
    read_by: Option<&str>,
) -> StockTable {
    from_decoded(&decode::decode_text(text.as_bytes()), history, read_by)
}

fn from_decoded(
    decoded: &decode::Decoded,
    history: &IntakeReport,
    read_by: Option<&str>,
) -> StockTable {
    if let Some(why) = &decoded.refused {
        let mut table = StockTable::default();
        table.errors.push(decode::refusal(why.clone()));
        return table;
    }
    let mut table = read_text(&decoded.text, history, read_by);
    table.warnings.extend(decoded.assumed.clone());
    table.errors.extend(decode::all_errors(decoded));
    sorting::sort_by_key(&mut table.errors, |e| e.row);
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

fn read_text(text: &str, history: &IntakeReport, read_by: Option<&str>) -> StockTable {
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
    let mut rows: Vec<_> = records.collect();
    let item_names: Vec<&str> = history.items.iter().map(|i| i.name.as_str()).collect();
    // The history's names indexed once, for the item columns' choice and the rows' matching.
    let item_cells: Vec<&[String]> = history.items.iter().map(|i| i.parts.as_slice()).collect();
    let read_by_place = read_by.and_then(|h| history_column(h, &history.item_columns));
    let names = ItemNames::new(
        &item_names,
        &item_cells,
        &history.item_columns,
        read_by_place,
    );
    if let Some(asked) = read_by {
        match names.chosen_header() {
            Some(header) => {
                out.read_by = Some(header.to_string());
                out.warnings.push(format!(
                    "as chosen, a row naming an item by its \"{header}\" alone is read as \
                     that item (\"{header}\" names each of the history's items once)"
                ));
            }
            // Every column names each item alone: parts are read without the choice.
            None if names.parts_name_items() && read_by_place.is_some() => {}
            None => out
                .warnings
                .push(not_read_by(asked, read_by_place, &names, history)),
        }
    }
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
    // A store written once over its rows, as the history's may be (`written_once`).
    out.warnings.extend(super::written_once::fill_stock_rows(
        &header,
        &mut rows,
        &item_columns.read,
    ));
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
    out.could_read_by = matched.could_read_by;
    out.rows = matched.rows;
    out.warnings.extend(matched.warnings);
    out.errors.extend(matched.errors);
    out
}

/// Why the choice to read the rows by the history's column `asked` alone was not taken.
fn not_read_by(
    asked: &str,
    place: Option<usize>,
    names: &ItemNames,
    history: &IntakeReport,
) -> String {
    let why = match place {
        None if history.item_columns.len() < 2 => {
            "the history names its items by one column".to_string()
        }
        None => format!(
            "the history's item names join {}, not \"{asked}\"",
            quoted_together(&history.item_columns)
        ),
        Some(at) if !names.names_each_item_once(at) => {
            format!("\"{asked}\" does not name each of the history's items once")
        }
        Some(_) => "it cannot be taken".to_string(),
    };
    format!("the rows are not read by \"{asked}\" alone as chosen: {why}")
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
