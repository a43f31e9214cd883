//! The stock table: a second, small table with one row per item and what the Stock plan needs
//! beside the history (on hand, on order, and per-item lead time, review, target and order
//! rules). Read with the history's care: the same decoding, delimiter, quotes and decimal-mark
//! rules, and every rejected cell an error with its row, column and text.
//!
//! Kept apart from: the history table's reading (the rest of intake; this table has a fixed
//! set of columns named in a header, so none of the history's layout guessing applies) and the
//! Stock plan's arithmetic (crate::stock applies a row).
//!
//! Rules (our choices): the first non-blank record is the header; a column is known by its
//! header, compared without case, spaces, hyphens or underscores ([`COLUMNS`]); a column with
//! another header is left out with a warning; the item column is required; an empty cell (or
//! `NA`, `n/a`, `null`) means "not given", so the file's default applies; an item named twice
//! is an error at its second row; lead time and review period are whole periods; service
//! targets are fractions (0.95) or percents (95); a row may give a service level or a fill
//! rate, not both.

use super::decode;
use super::mark::{decide_mark, evidence, Tally};
use super::number::{is_missing, parse_number};
use super::text::{delimiter_char, sniff_delimiter, strip_bom, tokenize};
use super::{DecimalMark, Delimiter, RowError};
use crate::stock::{service_fraction_of, Target, MAX_PERIODS};

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

/// The known columns: (field, header spellings after [`normalise`]).
pub const COLUMNS: [(Field, &[&str]); 11] = [
    (Field::Item, &["item", "name", "product"]),
    (Field::OnHand, &["onhand"]),
    (Field::OnOrder, &["onorder"]),
    (Field::LeadTime, &["leadtime"]),
    (Field::LeadTimeSd, &["leadtimesd"]),
    (Field::Review, &["review", "reviewperiod"]),
    (
        Field::Service,
        &["service", "servicelevel", "cycleservicelevel"],
    ),
    (Field::FillRate, &["fillrate"]),
    (Field::OrderQuantity, &["orderquantity"]),
    (Field::OrderMultiple, &["ordermultiple"]),
    (Field::MinimumOrder, &["minimumorder", "minorder"]),
];

/// A column's meaning.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Field {
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

/// A header cell without case, spaces, hyphens or underscores.
fn normalise(header: &str) -> String {
    header
        .chars()
        .filter(|c| !c.is_whitespace() && *c != '-' && *c != '_')
        .flat_map(char::to_lowercase)
        .collect()
}

fn field_of(header: &str) -> Option<Field> {
    let key = normalise(header);
    COLUMNS
        .iter()
        .find(|(_, names)| names.contains(&key.as_str()))
        .map(|(f, _)| *f)
}

/// Reads a stock table from bytes (UTF-8, or UTF-16 with its byte-order mark). Never panics.
pub fn read_stock_table(bytes: &[u8]) -> StockTable {
    let decoded = decode::decode(bytes);
    let mut table = read_text(&decoded.text);
    table.errors.extend(decode::all_errors(&decoded));
    table.errors.sort_by_key(|e| e.row);
    table
}

fn read_text(text: &str) -> StockTable {
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
    let mut records = tokens.records.into_iter().filter(|r| !r.is_blank());
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
    let fields: Vec<Option<Field>> = header.cells.iter().map(|h| field_of(h)).collect();
    for (i, h) in header.cells.iter().enumerate() {
        if fields[i].is_none() && !h.is_empty() {
            out.warnings.push(format!(
                "column \"{h}\" of the stock table is not one Morrowcast uses; it is left out"
            ));
        }
        if let Some(f) = fields[i] {
            if fields[..i].contains(&Some(f)) {
                out.errors.push(RowError {
                    row: header.line,
                    column: h.clone(),
                    text: h.clone(),
                    message: "this column is named twice in the header: keep one".into(),
                });
            }
        }
    }
    let Some(item_column) = fields.iter().position(|f| *f == Some(Field::Item)) else {
        out.errors.push(RowError {
            row: header.line,
            column: String::new(),
            text: header.cells.join(", "),
            message: "the stock table needs a header with an \"item\" column (the names as in \
                      the history) and columns such as \"on hand\" and \"on order\""
                .into(),
        });
        return out;
    };
    let rows: Vec<_> = records.collect();
    // The decimal mark, from every cell of the number columns.
    let mut tally = Tally::default();
    for r in &rows {
        for (i, cell) in r.cells.iter().enumerate() {
            if fields
                .get(i)
                .copied()
                .flatten()
                .is_some_and(|f| f != Field::Item)
            {
                tally.add(evidence(cell));
            }
        }
    }
    let (mark, mark_warning) = decide_mark(tally, delimiter);
    out.warnings.extend(mark_warning);
    let column_name = |i: usize| {
        header
            .cells
            .get(i)
            .filter(|h| !h.is_empty())
            .cloned()
            .unwrap_or(format!("column {}", i + 1))
    };
    let mut seen: Vec<String> = Vec::new();
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
        let item = r.cells.get(item_column).cloned().unwrap_or_default();
        if item.is_empty() {
            bad.push(RowError {
                row: r.line,
                column: column_name(item_column),
                text: String::new(),
                message: "the item name is missing".into(),
            });
        } else if seen.contains(&item) {
            bad.push(RowError {
                row: r.line,
                column: column_name(item_column),
                text: item.clone(),
                message: "this item has a row above already: give one row per item".into(),
            });
        }
        if !item.is_empty() && !seen.contains(&item) {
            seen.push(item.clone());
        }
        row.item = item;
        let (mut service, mut fill) = (None, None);
        for (i, cell) in r.cells.iter().enumerate() {
            let Some(field) = fields.get(i).copied().flatten() else {
                continue;
            };
            if field == Field::Item || is_missing(cell) {
                continue;
            }
            if let Err(message) = read_cell(field, cell, mark, &mut row, &mut service, &mut fill) {
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
                    column: column_name(item_column),
                    text: row.item.clone(),
                    message: "this row gives both a service level and a fill rate: keep one".into(),
                });
                None
            }
            (Some(p), None) => Target::cycle_service(p).ok(),
            (None, Some(p)) => Target::fill_rate(p).ok(),
            (None, None) => None,
        };
        if bad.is_empty() {
            out.rows.push(row);
        } else {
            out.errors.extend(bad);
        }
    }
    out
}

/// Reads one cell of `field` into `row` (a service or fill-rate target into `service` or
/// `fill`, which the caller checks against each other), or says what was expected instead.
fn read_cell(
    field: Field,
    cell: &str,
    mark: DecimalMark,
    row: &mut StockRow,
    service: &mut Option<f64>,
    fill: &mut Option<f64>,
) -> Result<(), String> {
    let number = parse_number(cell, mark).map_err(|e| e.message(mark))?.value;
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
        Field::Service => *service = Some(fraction("cycle service level")?),
        Field::FillRate => *fill = Some(fraction("fill rate")?),
        Field::OrderQuantity => row.order_quantity = Some(above_zero()?),
        Field::OrderMultiple => row.order_multiple = Some(above_zero()?),
        Field::MinimumOrder => row.minimum_order = Some(at_least_zero()?),
    }
    Ok(())
}

#[cfg(test)]
mod tests {
    use super::*;

    fn check(text: &str, rows: &[StockRow], errors: &[(usize, &str, &str)]) {
        let t = read_stock_table(text.as_bytes());
        let got: Vec<(usize, &str, &str)> = t
            .errors
            .iter()
            .map(|e| (e.row, e.column.as_str(), e.text.as_str()))
            .collect();
        assert_eq!(got, errors, "{text}: {:?}", t.errors);
        assert_eq!(t.rows, rows, "{text}");
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
        let t = read_stock_table(b"name,on hand\n");
        assert!(t.errors.is_empty() && t.rows.is_empty());
        let t = read_stock_table(b"on hand,on order\n5,6\n");
        assert_eq!(t.errors.len(), 1);
        assert!(t.errors[0].message.contains("\"item\" column"));
        let t = read_stock_table(b"item,colour,on hand\nA,red,4\n");
        assert_eq!(t.rows[0].on_hand, Some(4.0));
        assert!(t.warnings[0].contains("\"colour\""), "{:?}", t.warnings);
        let t = read_stock_table(b"");
        assert_eq!(t.errors[0].row, 1);
        // A U+FFFD written in the file (another program could not read bytes there) is an
        // error at its line, as in the history: the row is not read as it stands.
        let t = read_stock_table("item,on hand\nSeed p\u{fffd}ckets,4\n".as_bytes());
        assert!(t.errors.iter().any(|e| e.row == 2), "{:?}", t.errors);
    }
}
