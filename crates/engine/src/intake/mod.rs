//! Intake: raw text (pasted, dropped or read from a file) to items, with a report of what was
//! understood. No configuration: delimiter, decimal mark, header, layout, date order and
//! frequency are all read from the text itself.
//!
//! Kept apart from: modelling. Intake never guesses silently: every assumption (delimiter,
//! decimal mark, layout, date order, frequency, gaps) is reported, and every rejected cell is an
//! error with its row, column and text. When there are errors the report still holds what could
//! be read; front ends decide what to do (the command line exits with status 2).
//!
//! The steps, each in its own module:
//! 1. `text`: strip a UTF-8 byte-order mark, choose the delimiter (tab, semicolon, pipe or
//!    comma: the one that splits the most records into the same number of cells, ties in that
//!    order; a one-column text is reported as comma), split into records with RFC 4180 quotes,
//!    LF, CRLF or lone CR line ends, and exact line numbers, in at most two passes whatever the
//!    quotes.
//! 2. `table`: title lines, header, and column roles, which fix the layout (single, wide, long;
//!    `across`: one row per item, the periods across the header);
//!    the header and layout rules are in that module's doc; `joined`: a period written across
//!    a year column and a month, quarter or week column (and a day).
//! 3. `mark` and `number`: the decimal mark for the whole file (cells only one mark can read
//!    decide by majority; in a comma-delimited file the mark is otherwise a dot, with a
//!    warning, since a decimal comma there needs quotes, and a "1.050" that reading makes
//!    a thousandth of its item's whole numbers (its column, its long rows, its across row)
//!    is an error at its cell (`mark::thousands_dots`); elsewhere a lone "1,234" or "1.234" is read as thousands with a
//!    warning; otherwise comma in semicolon files, dot elsewhere), and each value cell, with
//!    currency symbols and units stripped (listed in that module's doc) and reported once.
//! 4. `label`, `order` and `period`: period labels, day-first or month-first order decided
//!    from all rows (the ambiguity rule is in `order`'s doc), the frequency the dates imply, and
//!    the periods refused as likely typos.
//! 5. `build`: one item per value column (single, wide), per item name (long) or per row
//!    (across), with a regular run of periods, gaps as `None` (in a long table a period with
//!    rows for other items but none for this one is 0, no sales, with a warning, and a period
//!    no row names at all is no sales when closed or quiet, `build/unnamed`; in a single or
//!    wide table such a period is no sales when closed, with more caution), sorted rows,
//!    summed or rejected duplicates.
//! 6. `totals`: an item that is the sum of all the others in every period is left out.
//! 7. `unfinished`: a last period whose demand is far below the periods before it (and a
//!    season before) is named in a warning: data taken before it ended.
//!
//! Decisions, in short (each module's doc has the full rule):
//! - Header: the last record above the first row with at least half of its cells numbers,
//!   periods or `n/a`, if none of its cells reads as a number or a period, it names at least two
//!   columns (one in a one-column text; `n/a` names none) and none of its cells stands again
//!   below in its column (an item name); rows between the two are data (a bad cell in the first
//!   data row is an error, never a title); records above the header are title lines, skipped
//!   with a warning. A blank first cell over a named rest is a header too (`,sales`: the
//!   corner over an index a data tool wrote); a record further down that repeats the header
//!   cell for cell (exports joined) is skipped with a warning. In a one-column text the header is the first such record. No header: a
//!   warning, and the names below.
//! - Date order: a field above 12 decides; otherwise "all on the 1st of a month" one way only,
//!   then "a regular series with no missing period" one way only, each with a warning;
//!   otherwise an error on the first row whose readings differ (the report is then day-first).
//! - "Mar-24" is March 2024 (a month name with two digits is month and year); two-digit years
//!   are 1969–2068; month names are English.
//! - Layout: a column is item names only when most of its rows name something; a column mostly
//!   empty or `n/a` holds quantities, and its few words are bad cells (errors).
//! - Whole numbers in the first column are years (1800–2200), row positions (1, 2, 3, ... or
//!   0, 1, 2, ...),
//!   8-digit dates (20240131) or 6-digit months (202401) when more than half of the cells read
//!   so and, for years, months and positions, they mostly follow each other closely (every cell
//!   for positions); the other cells are errors. Otherwise they are values. The report's period
//!   description says which.
//! - Periods refused, each an error at its cell (the row is not read): a year outside 1000 to
//!   9633 (labels have four-digit years, and a forecast from the last period must still have
//!   them: every period label the engine writes is one this reader reads back), and a period
//!   beyond a gap of more than max(about two years of periods, 2 × the periods present): a
//!   likely typo, not a run of filled gaps.
//! - Numbers: scientific notation (`1e5`, `1.5E+03`, `2,5e3` with a decimal comma) is read;
//!   `inf`, `nan`, `infinity` and any value above 10^15 in size (the series' bound) are errors at
//!   their cell (they still count as numbers for the layout). 10^15: far above any sales
//!   quantity, exact in f64, and far from overflow in the computations that square and sum
//!   values.
//! - Empty cells and `NA`, `N/A`, `#N/A`, `null` are gaps, counted in `empty_cells`; a blank line
//!   is a gap in a table without periods and skipped (with a warning) in a dated one.
//! - Currency symbols, codes and units listed in `number` are stripped, with one warning naming
//!   them; anything else after a number ("12x") is an error.
//! - A total among the items (a "total" column, "All items" rows: an item equal to the sum of
//!   the others in every period, module `totals`) is left out with a warning naming it, so
//!   its demand is not ordered twice.
//! - Shapes of hand-made sales reports, each refused or read as it means (module `table`
//!   unless named): a row with more cells than the header names (empty header cells at its
//!   end name nothing) is an error at each such row (a decimal comma unquoted in a comma file
//!   would move numbers into the next item), except R's row names 1, 2, 3 under a header one
//!   cell short; parts of what a row is across the header (months, quarters or accounting
//!   periods over rows of plain years, weekdays over rows of ISO weeks, times over rows of
//!   dates) are a grid, refused at the header; a column naming a stock level, goods
//!   on order, received or returned, a running total, a rate, a share, a rank or a plan is
//!   no item and no quantity, and alone it is refused ("Qty on hand", "YTD Units", "Mix %"); a text column named as a note ("Comment",
//!   "Supplier") beside one row per period, or beside an item column whose items it splits in
//!   no period, is left out; number columns are read as item codes without a header word
//!   saying so only where at least half the periods stand on several rows and the rows are not stacked
//!   copies of one table (a wide table with a period repeated stays wide, the repeat an
//!   error), and one number on every row under "Item" names that one item;
//!   labels read as months under a header naming weeks are an error (`build`); in a daily
//!   or monthly single or wide table, periods without a row whose place in the season (a
//!   weekday, a month) has none in most of its occurrences nearby, at least three, while the
//!   other places have rows in 90 % of theirs and fewer than half the places are closed, are
//!   closed: no sales, warned (`build::closed_places`); the rest, where they are more than the
//!   rows, or more than half as many and at least six, are an error, nothing read (`build`; a
//!   long table reads such periods as no sales, with its warning); a subtotal with a total's word under the items it
//!   adds up ("Garden subtotal", "Total Inventory") is left out (`totals`).
//! - Nothing vanishes silently: an item whose cells are all empty or n/a is named in a warning
//!   (it has no values, so it is not planned); item names that differ only in white space or
//!   case are one item, with a warning naming each spelling and its lines; an `n/a` item cell names no
//!   item (an error).
//! - Bytes: `read_bytes` decodes UTF-8, or UTF-16 with its byte-order mark or without it (with
//!   a warning), and reports every
//!   line with bytes that are not text, with the bytes; `read` reports every line holding
//!   U+FFFD, the mark another program leaves for bytes it could not read (module `decode`).
//! - Work is proportional to the text: the tokeniser makes at most two passes, and all items
//!   together hold at most 100,000 periods plus 1,000 per row read (an item past that is an
//!   error).
//!
//! Names: a series is named after its value column's header; without a header the value columns
//! are "Series 1", "Series 2", ... and errors name columns "column 1", "column 2", ... A header
//! cell that is empty also gives "column N". Repeated header names get " (2)", " (3)" appended,
//! with a warning naming the columns, so item names are unique.
//!
//! Row numbers in errors are 1-based lines of the text as given: title lines, the header and
//! blank lines all count, a quoted cell spanning lines counts every line, and LF, CRLF and a
//! lone CR each end a line (in errors of undecodable bytes too).

mod across;
mod build;
mod coded;
mod dates;
mod decode;
mod frame;
mod headers;
mod item_codes;
mod joined;
mod label;
mod leave_out;
mod mark;
mod month_days;
mod number;
mod order;
mod period;
mod period_units;
mod regroup;
mod shapes;
mod stock_columns;
mod stock_names;
mod stock_table;
mod table;
mod text;
mod totals;
mod unfinished;
mod words;
mod workbook;
mod written_once;
mod year_grid;

// The one rule for listing names in a sentence, the page's too.
pub use build::list_in_words;
pub use leave_out::{leave_out_rows, leave_out_unfinished, LeaveOutError};
pub use stock_table::{
    read_stock_table, read_stock_table_and_text, read_stock_table_text, StockRow, StockTable,
};
pub use unfinished::UnfinishedPeriod;

use crate::calendar::{Frequency, Period};
use crate::series::{Series, SeriesError};
use crate::sorting;

/// The field separator found.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Delimiter {
    /// `,`
    Comma,
    /// `;`
    Semicolon,
    /// A tab.
    Tab,
    /// `|`
    Pipe,
}
impl Delimiter {
    /// "comma", "semicolon", "tab" or "pipe".
    pub fn as_str(self) -> &'static str {
        match self {
            Delimiter::Comma => "comma",
            Delimiter::Semicolon => "semicolon",
            Delimiter::Tab => "tab",
            Delimiter::Pipe => "pipe",
        }
    }
}

/// The decimal mark found.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum DecimalMark {
    /// `1.5`
    Dot,
    /// `1,5`
    Comma,
}
impl DecimalMark {
    /// "dot" or "comma".
    pub fn as_str(self) -> &'static str {
        match self {
            DecimalMark::Dot => "dot",
            DecimalMark::Comma => "comma",
        }
    }
}

/// How items are laid out in the table.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Layout {
    /// One column of values (with or without a period column).
    Single,
    /// A period column and one column per item.
    Wide,
    /// One row per item and period: item, period, quantity.
    Long,
    /// One row per item, one column per period: the periods run across the header.
    Across,
}
impl Layout {
    /// "single", "wide", "long" or "across".
    pub fn as_str(self) -> &'static str {
        match self {
            Layout::Single => "single",
            Layout::Wide => "wide",
            Layout::Long => "long",
            Layout::Across => "across",
        }
    }
}

/// One rejected cell or row.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct RowError {
    /// 1-based line number in the text (title line and header count).
    pub row: usize,
    /// The header text of the column; "column 3" style when there is no header or the header
    /// cell is empty; "" for problems of the whole text (such as an unclosed quote).
    pub column: String,
    /// The text found.
    pub text: String,
    /// What was expected, in words a user can act on.
    pub message: String,
}

/// One item as read: a regular run of periods (gaps included as `None`).
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Item {
    /// The item's name (from the header, or "Series N").
    pub name: String,
    /// Its periods, one per slot, without holes.
    pub periods: Vec<Period>,
    /// Its values; `None` for a gap.
    pub values: Vec<Option<f64>>,
    /// Where the history joins several columns into item names (the report's
    /// `item_columns`), the item's cell in each, in their order ("" for an empty one); empty
    /// otherwise. The stock table's matching reads parts from here, not by cutting the name
    /// at " / ", which a description may hold too.
    // Always written: the worker's codec (bincode) reads fields by position, so one skipped
    // when empty would misread every field after it.
    pub parts: Vec<String>,
}

impl Item {
    /// The first period that holds a value.
    pub fn first_value(&self) -> Option<Period> {
        let at = self.values.iter().position(Option::is_some)?;
        self.periods.get(at).copied()
    }

    /// The last period that holds a value.
    pub fn last_value(&self) -> Option<Period> {
        let at = self.values.iter().rposition(Option::is_some)?;
        self.periods.get(at).copied()
    }

    /// The validated series for modelling.
    pub fn series(&self) -> Result<Series, SeriesError> {
        let start = self.periods.first().copied().unwrap_or(Period::position(1));
        Series::new(self.name.clone(), start, self.values.clone())
    }
}

/// What intake understood.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct IntakeReport {
    /// The field separator; comma when the text has a single column.
    pub delimiter: Delimiter,
    /// The decimal mark decided for the whole file.
    pub decimal: DecimalMark,
    /// How items are laid out.
    pub layout: Layout,
    /// How often the periods come.
    pub frequency: Frequency,
    /// How the period column was read, in words (e.g. "day-first dates (31/01/2024)").
    pub date_format: Option<String>,
    /// The items read.
    pub items: Vec<Item>,
    /// Number of gaps inserted for missing periods, summed over items.
    pub gaps_filled: usize,
    /// What was assumed or reinterpreted, in words.
    pub warnings: Vec<String>,
    /// What could not be read: each cell or line with its row, column and text.
    pub errors: Vec<RowError>,
    /// Whether a header row was found (item names come from it).
    pub has_header: bool,
    /// Empty value cells (including `NA`, `N/A`, `#N/A`, `null`): gaps, or, beside other rows
    /// of their day in a table with times of day, nothing added to it.
    pub empty_cells: usize,
    /// The last period, when its demand is so far below the periods before that it looks
    /// unfinished (data taken before it ended); a warning says why. Its figures are as read.
    pub unfinished_last: Option<UnfinishedPeriod>,
    /// The headers of the columns whose cells name the items, in the order their cells are
    /// joined with " / " ("Code", "Description" make "FG-1001 / Birch trellis"); empty where
    /// the header names the items. A stock table matches its rows by these.
    pub item_columns: Vec<String>,
}

impl IntakeReport {
    /// True when at least one cell or row was rejected.
    pub fn has_errors(&self) -> bool {
        !self.errors.is_empty()
    }

    /// The file's last period: the latest that holds a value of any item (an item's data may
    /// end before it; rows of periods no item has a figure for yet, such as next months
    /// written ahead with empty cells, do not count).
    pub fn last_period(&self) -> Option<Period> {
        self.items.iter().filter_map(Item::last_value).max()
    }
}

/// Reads bytes (a file as stored) into a report: UTF-8, or UTF-16 with its byte-order mark or
/// without it (said in a warning);
/// every line holding bytes that are not text is an error (see the `decode` module). Never
/// panics, whatever the bytes.
pub fn read_bytes(bytes: &[u8]) -> IntakeReport {
    report_of(&decode::decode(bytes))
}

/// Reads `bytes` as [`read_bytes`] does, or the workbook sheet `sheet` names, and gives the
/// text read with it (a workbook's sheet, named), decoding once: for a front end that keeps the
/// text (the command line's works and links carry it; `--sheet` names the sheet). `Err` with
/// why beside the report's refusal when nothing could be read (that sheet not there, a file
/// that is no workbook).
pub fn read_bytes_and_text(
    bytes: &[u8],
    sheet: Option<&str>,
) -> (IntakeReport, Result<FileText, String>) {
    let decoded = match sheet {
        Some(sheet) => decode::decode_sheet(bytes, sheet),
        None => decode::decode(bytes),
    };
    let report = report_of(&decoded);
    (report, FileText::of(decoded))
}

fn report_of(decoded: &decode::Decoded) -> IntakeReport {
    if let Some(why) = &decoded.refused {
        let mut report = empty_report(Delimiter::Comma);
        report.errors.push(decode::refusal(why.clone()));
        return report;
    }
    let mut report = read_text(&decoded.text);
    report.warnings.extend(decoded.assumed.clone());
    report.errors.extend(decode::all_errors(decoded));
    sorting::sort_by_key(&mut report.errors, |e| e.row);
    header_read_as_data(&mut report);
    report
}

/// The text of `bytes` as [`read_bytes`] reads it (UTF-8, or UTF-16 with or without its
/// byte-order mark;
/// undecodable bytes become U+FFFD, which [`read`] then reports by line). For a front end that
/// shows the text itself, such as the page's Intake box.
pub fn decode_bytes(bytes: &[u8]) -> String {
    decode::decode(bytes).text
}

/// A file's text as Intake reads it, for a front end that shows the text itself (the page's
/// box) and names its source.
#[derive(Clone, Debug, Default, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct FileText {
    /// The text: the file's own, or a workbook's sheet as comma-separated text.
    pub text: String,
    /// The workbook's sheet read, if the file is a workbook.
    pub sheet: Option<String>,
    /// The workbook's sheets that may be read (the one read among them), for a choice.
    pub sheets: Vec<String>,
    /// What was read and how, in words (the sheet and the others not read), if anything
    /// needs saying.
    pub note: Option<String>,
}

impl FileText {
    /// The text `decoded` holds; `Err` with why when nothing could be read.
    fn of(decoded: decode::Decoded) -> Result<FileText, String> {
        match decoded.refused {
            Some(why) => Err(why),
            None => Ok(FileText {
                text: decoded.text,
                sheet: decoded.sheet,
                sheets: decoded.sheets,
                note: decoded.assumed,
            }),
        }
    }
}

/// Whether `bytes` are a workbook or another archive (zip, OLE) rather than text: a front end
/// that reads workbooks apart (the page, in its reading worker) tells them apart with this
/// and gives the rest to [`text_file`].
pub fn is_workbook(bytes: &[u8]) -> bool {
    workbook::is_workbook(bytes)
}

/// The text of a file that is not a workbook ([`is_workbook`]), as [`history_text`] and
/// [`stock_table_text`] give it, without linking the workbook reader: UTF-8, or UTF-16 with
/// or without its byte-order mark (said in the note); undecodable bytes become U+FFFD, which
/// [`read`] reports by line.
pub fn text_file(bytes: &[u8]) -> FileText {
    // Decoding text refuses nothing (only a workbook can be refused whole).
    FileText::of(decode::decode_text(bytes)).unwrap_or_default()
}

/// A history file's text (a workbook's fullest sheet, [`read_bytes`]'s); `Err` with why and
/// what to do when nothing can be read (a workbook that cannot be opened).
pub fn history_text(bytes: &[u8]) -> Result<FileText, String> {
    FileText::of(decode::decode(bytes))
}

/// A workbook's sheet `sheet` as a history's text, whichever the workbook would give; `Err`
/// as [`history_text`], or when that sheet cannot be read.
pub fn history_text_of_sheet(bytes: &[u8], sheet: &str) -> Result<FileText, String> {
    FileText::of(decode::decode_sheet(bytes, sheet))
}

/// The sheets of the workbook in `bytes` that may be read (visible, readable, holding cells),
/// in its order, for a front end offering a choice; empty for a file that is not a workbook
/// or cannot be opened.
pub fn workbook_sheets(bytes: &[u8]) -> Vec<String> {
    if !workbook::is_workbook(bytes) {
        return Vec::new();
    }
    workbook::sheets(bytes)
        .map(|sheets| {
            workbook::readable(&sheets)
                .into_iter()
                .map(str::to_string)
                .collect()
        })
        .unwrap_or_default()
}

/// A stock table file's text (a workbook's sheet naming on hand, else its fullest,
/// [`read_stock_table`]'s); `Err` as [`history_text`].
pub fn stock_table_text(bytes: &[u8]) -> Result<FileText, String> {
    FileText::of(decode::decode_choosing(bytes, &stock_table::STOCK_SHEET))
}

/// Reads text into a report; every line holding U+FFFD (bytes another program could not read
/// as text) is an error. Never panics, whatever the text.
pub fn read(text: &str) -> IntakeReport {
    let mut report = read_text(text);
    report.errors.extend(decode::replacement_marks(text));
    sorting::sort_by_key(&mut report.errors, |e| e.row);
    header_read_as_data(&mut report);
    report
}

/// Without a header, a first row refused at a cell that only names a period ("month") is
/// most likely the header itself, its other cells numbers or dates ("month,00123,1.50,2024"):
/// its error says so and what to write.
fn header_read_as_data(report: &mut IntakeReport) {
    if report.has_header {
        return;
    }
    let Some(first) = report.errors.first().map(|e| e.row) else {
        return;
    };
    for e in report.errors.iter_mut().filter(|e| e.row == first) {
        if headers::header_is_only(&e.text, &headers::PERIOD_WORDS) {
            e.message.push_str(
                "; this row looks like the header, read as data because its other cells read \
                 as numbers or dates: give the items names with a word in them (\"Item \
                 2024\")",
            );
        }
    }
}

/// Whether an item whose last figure is at `last` ends before the file's last period `end`:
/// the one rule of an item ending early (Intake's warning, `order::ends_early`). Undated items
/// are numbered each from its own first row, so their ends say nothing of each other: never.
pub fn ends_before(last: Period, end: Period) -> bool {
    last.frequency() == end.frequency() && last.frequency() != Frequency::Undated && last < end
}

/// The warning naming the items of a dated table whose figures end before the file's last
/// period (a column left empty since, a store whose export ends earlier): what they sold
/// since is not known, so the plan gives them no stock figures (`order::ends_early`).
fn ended_early(report: &IntakeReport) -> Option<String> {
    let end = report.last_period()?;
    let early: Vec<String> = report
        .items
        .iter()
        .filter_map(|item| {
            let last = item.last_value().filter(|last| ends_before(*last, end))?;
            Some(format!("\"{}\" ({last})", item.name))
        })
        .collect();
    (!early.is_empty()).then(|| {
        format!(
            "the figures of {} end before the file's last period ({end}): {}; what they sold \
             since is not known, so they get no stock figures (where nothing sold since, write \
             0 for those periods)",
            build::count(early.len(), "item"),
            build::listing(&early)
        )
    })
}

/// A report of nothing read yet.
fn empty_report(delimiter: Delimiter) -> IntakeReport {
    IntakeReport {
        delimiter,
        decimal: DecimalMark::Dot,
        layout: Layout::Single,
        frequency: Frequency::Undated,
        date_format: None,
        items: Vec::new(),
        gaps_filled: 0,
        warnings: Vec::new(),
        errors: Vec::new(),
        has_header: false,
        empty_cells: 0,
        unfinished_last: None,
        item_columns: Vec::new(),
    }
}

fn read_text(text: &str) -> IntakeReport {
    let text = text::strip_bom(text);
    let delimiter = text::sniff_delimiter(text).unwrap_or(Delimiter::Comma);
    let tokens = text::tokenize(text, text::delimiter_char(delimiter));
    let mut report = empty_report(delimiter);
    for line in &tokens.unclosed_quotes {
        report.errors.push(RowError {
            row: *line,
            column: String::new(),
            text: "\"".to_string(),
            message: "expected a closing quote mark for the cell opened on this line; the quote \
                      mark was read as plain text: close it or remove it"
                .to_string(),
        });
    }
    let mut table = frame::shape(tokens.records);
    table.comma_delimited = delimiter == Delimiter::Comma;
    for title in &table.titles {
        let words: Vec<&str> = title
            .cells
            .iter()
            .map(String::as_str)
            .filter(|c| !c.is_empty())
            .collect();
        report.warnings.push(format!(
            "line {} (\"{}\") reads as a title above the table and was skipped",
            title.line,
            words.join(" ")
        ));
    }
    if !table.repeated_headers.is_empty() {
        let lines: Vec<String> = table
            .repeated_headers
            .iter()
            .map(usize::to_string)
            .collect();
        let (noun, verb) = match lines.len() {
            1 => ("line", "repeats"),
            _ => ("lines", "repeat"),
        };
        report.warnings.push(format!(
            "{noun} {} {verb} the header (or a title line above it) and {} skipped",
            lines.join(", "),
            if lines.len() == 1 { "was" } else { "were" }
        ));
    }
    report.has_header = table.header.is_some();
    if table.rows.iter().all(text::Record::is_blank) {
        let (row, message) = match &table.header {
            Some(h) => (
                h.line,
                "expected rows of data below the header; there are none",
            ),
            None => (
                1,
                "expected a table of periods and quantities; the text is empty",
            ),
        };
        report.errors.push(RowError {
            row,
            column: String::new(),
            text: String::new(),
            message: message.to_string(),
        });
        return report;
    }
    if !report.has_header {
        report.warnings.push(
            "no header row: columns are called \"column 1\", \"column 2\", ... and series \
             \"Series 1\", \"Series 2\", ..."
                .to_string(),
        );
    }
    // Rows that are all wider than the header: each is an error of its own (read as columns
    // of their own, the numbers after a split decimal comma would move into other items).
    let rows = table.fitting_rows();
    if rows.is_empty() {
        report.errors.extend(
            table
                .rows
                .iter()
                .filter_map(|row| frame::wide_row_error(&table, row)),
        );
        if !report.errors.is_empty() {
            return report;
        }
    }
    let plan = match table::plan(&table) {
        Ok(plan) => plan,
        Err(error) => {
            report.errors.push(error);
            return report;
        }
    };
    report.layout = plan.layout;
    report.item_columns = plan
        .item_columns
        .iter()
        .map(|&j| table.column_name(j))
        .collect();
    if let Some(header) = table.header.as_ref().filter(|_| table.coded) {
        report.warnings.push(format!(
            "the header names the items by numbers ({}): read as item codes, not as a row of \
             data",
            coded::codes(header).join(", ")
        ));
    }
    // A store or category written once over its rows names each row's group.
    written_once::fill(&mut table, &plan, &mut report.warnings);
    let rows = table.fitting_rows();
    let mut tally = mark::Tally::default();
    for &j in &plan.values {
        for cell in table.column(j, &rows) {
            tally.add(mark::evidence(cell));
        }
    }
    let ambiguous_dots = tally.ambiguous_dot > 0;
    let (mark, warning) = mark::decide_mark(tally, delimiter);
    report.decimal = mark;
    report.warnings.extend(warning);
    let built = build::build(&table, &plan, mark, ambiguous_dots);
    report.frequency = built.frequency.unwrap_or(Frequency::Undated);
    report.date_format = built.date_format;
    report.items = built.items;
    totals::set_aside(&mut report.items, &mut report.warnings);
    let zeros_unwritten = report.layout == Layout::Long;
    let mut unfinished_warning = None;
    if let Some((period, warning)) = unfinished::last_period(&report.items, zeros_unwritten) {
        let rows = built
            .row_periods
            .iter()
            .filter(|(p, _)| *p == period)
            .map(|(_, line)| *line)
            .collect();
        report.unfinished_last = Some(UnfinishedPeriod { period, rows });
        unfinished_warning = Some(warning);
    }
    report.gaps_filled = built.gaps_filled;
    report.empty_cells = built.empty_cells;
    report.warnings.extend(built.warnings);
    report.warnings.extend(ended_early(&report));
    // After the reading's own notes: it speaks of the items they describe.
    report.warnings.extend(unfinished_warning);
    report.errors.extend(built.errors);
    sorting::sort_by_key(&mut report.errors, |e| e.row);
    report
}
