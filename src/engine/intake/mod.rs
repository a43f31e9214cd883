//! Intake: raw text (pasted, dropped or read from a file) to items, with a report of what was
//! understood. (Placeholder API: being written.)
//!
//! Kept apart from: modelling. Intake never guesses silently: every assumption (delimiter,
//! decimal mark, layout, date order, frequency, gaps) is reported, and every rejected cell is an
//! error with its row, column and text.

use crate::engine::calendar::{Frequency, Period};
use crate::engine::series::{Series, SeriesError};

/// The field separator found.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Delimiter {
    Comma,
    Semicolon,
    Tab,
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
pub enum DecimalMark {
    Dot,
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
pub enum Layout {
    Single,
    Wide,
    Long,
}
impl Layout {
    /// "single", "wide" or "long".
    pub fn as_str(self) -> &'static str {
        match self {
            Layout::Single => "single",
            Layout::Wide => "wide",
            Layout::Long => "long",
        }
    }
}

/// One rejected cell or row.
#[derive(Clone, Debug, PartialEq)]
pub struct RowError {
    /// 1-based line number in the text (title line and header count).
    pub row: usize,
    /// The header text of the column ("" when there is no header; "column 3" style otherwise).
    pub column: String,
    /// The text found.
    pub text: String,
    /// What was expected, in words a user can act on.
    pub message: String,
}

/// One item as read: a regular run of periods (gaps included as `None`).
#[derive(Clone, Debug, PartialEq)]
pub struct Item {
    pub name: String,
    pub periods: Vec<Period>,
    pub values: Vec<Option<f64>>,
}

impl Item {
    /// The validated series for modelling.
    pub fn series(&self) -> Result<Series, SeriesError> {
        let start = self.periods.first().copied().unwrap_or(Period::position(1));
        Series::new(self.name.clone(), start, self.values.clone())
    }
}

/// What intake understood.
#[derive(Clone, Debug, PartialEq)]
pub struct IntakeReport {
    pub delimiter: Delimiter,
    pub decimal: DecimalMark,
    pub layout: Layout,
    pub frequency: Frequency,
    /// How the period column was read, in words (e.g. "day-first dates (31/01/2024)").
    pub date_format: Option<String>,
    pub items: Vec<Item>,
    /// Number of gaps inserted for missing periods, summed over items.
    pub gaps_filled: usize,
    pub warnings: Vec<String>,
    pub errors: Vec<RowError>,
}

impl IntakeReport {
    /// True when at least one cell or row was rejected.
    pub fn has_errors(&self) -> bool {
        !self.errors.is_empty()
    }
}

/// Reads text into a report. Never panics.
pub fn read(_text: &str) -> IntakeReport {
    IntakeReport {
        delimiter: Delimiter::Comma,
        decimal: DecimalMark::Dot,
        layout: Layout::Single,
        frequency: Frequency::Undated,
        date_format: None,
        items: Vec::new(),
        gaps_filled: 0,
        warnings: Vec::new(),
        errors: Vec::new(),
    }
}
