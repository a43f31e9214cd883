//! The work: everything a planner gives Morrowcast (the history, the plan settings, the Stock
//! plan's settings and stock table, each item's own changes, the item open in the detail) as
//! one value, and its two written forms:
//!
//! - the **work file** ([`Work::to_file_text`], [`Work::read`]): JSON of our own, versioned,
//!   every name of it in format.rs and documented in the README ("Work file format");
//! - the **share link** ([`Work::to_fragment`], [`Work::read`]): the same JSON, zlib-compressed
//!   and base64url-encoded into the link's fragment (`#w1.`…), which a browser never sends to
//!   any server.
//!
//! Kept apart from: reading the history and the stock table (opening a work hands their text
//! to the engine's Intake, with the same care as anything pasted), checking the settings (the
//! engine's `PlanSettings::from_text` and `StockText::check`, when the work is used), and any
//! page or terminal. The command line and the page read and write work through this crate
//! only, so a link made by one opens the same in the other.

mod change;
mod format;
mod link;

use std::collections::BTreeMap;
use std::fmt;

use morrowcast_engine::settings::SettingsText;
use morrowcast_engine::stock::StockText;

pub use change::ItemChange;
pub use link::{LINK_KEPT_BY_BROWSERS, LINK_KEPT_BY_MAIL};

/// The newest version of the work format this build reads and writes. Version 2 adds the
/// Look-back (`look_back`), version 3 the stock table's reading by one column
/// (`stock_table_read_by`); each is written only for a work that has it, so a work without
/// them stays version 1 and opens in builds that read only that.
pub const WORK_VERSION: u64 = 3;

/// A text as given, with where it came from ("the demo", a file name, "pasted text").
#[derive(Clone, Debug, PartialEq)]
pub struct SourcedText {
    pub text: String,
    pub source: String,
}

impl SourcedText {
    /// Where a text came from once a period was left out of it: "sales.csv, without 2025-12"
    /// (the page's Intake and the command line's `--leave-out-unfinished` name it alike).
    pub fn named_without(source: &str, period: &str) -> String {
        if source.is_empty() {
            format!("the text, without {period}")
        } else {
            format!("{source}, without {period}")
        }
    }
}

/// The whole desk. Its texts are as typed: they are checked where they are used, by the same
/// code that checks what a person types; only the item changes are checked when read, since
/// they hold values (see [`ItemChange`]).
#[derive(Clone, Debug, PartialEq)]
pub struct Work {
    /// The sales history, as pasted or read from a file.
    pub history: SourcedText,
    /// The plan settings as typed.
    pub settings: SettingsText,
    /// The Stock plan's settings for the whole file, as typed.
    pub stock: StockText,
    /// The stock table (item, on hand, on order, ...), when one was given.
    pub stock_table: Option<SourcedText>,
    /// Each item's own changes, by item name.
    pub changes: BTreeMap<String, ItemChange>,
    /// The item open in the detail, by name.
    pub open_item: Option<String>,
    /// The periods the Item board's Look-back looks back over (0: none), at most
    /// [`morrowcast_engine::lookback::MOST_PERIODS_SHOWN`].
    pub look_back: usize,
    /// The history's item column (its header) the stock table's rows are read by alone, as
    /// the person chose (the engine's `StockTable::could_read_by`); only with a stock table.
    pub stock_read_by: Option<String>,
}

impl Work {
    /// A work of `history` alone, with the default settings.
    pub fn of_history(text: String, source: String) -> Work {
        Work {
            history: SourcedText { text, source },
            settings: SettingsText::default(),
            stock: StockText::default(),
            stock_table: None,
            changes: BTreeMap::new(),
            open_item: None,
            look_back: 0,
            stock_read_by: None,
        }
    }

    /// The work file's text (pretty JSON, so a person can read it).
    pub fn to_file_text(&self) -> String {
        format::to_json(self, true)
    }

    /// The share link's fragment, with its `#`: append it to the page's address.
    pub fn to_fragment(&self) -> String {
        link::encode(format::to_json(self, false).as_bytes())
    }

    /// Reads a work from a work file's text, a share link, or a link's fragment (with or
    /// without its `#`). [`WorkError::NotWork`] when the text is none of these, so the caller
    /// can read it as a history instead.
    pub fn read(text: &str) -> Result<Work, WorkError> {
        if let Some(payload) = link::payload(text) {
            let json = link::decode(payload)?;
            return format::from_json(&json);
        }
        if format::looks_like_work_file(text) {
            return format::from_json(text.trim_start_matches('\u{feff}'));
        }
        Err(WorkError::NotWork)
    }

    /// Whether `text` is meant as a work (a work file or a share link), whatever its state:
    /// the caller then reads it with [`Work::read`] and reports its error, never as a history.
    pub fn is_work(text: &str) -> bool {
        link::payload(text).is_some() || format::looks_like_work_file(text)
    }
}

/// Why a work could not be read. Each message says what to do.
#[derive(Clone, Debug, PartialEq)]
pub enum WorkError {
    /// Neither a work file nor a share link.
    NotWork,
    /// A share link whose data does not survive decoding: cut short or changed on the way.
    Damaged { detail: String },
    /// A link or file written by a newer Morrowcast.
    Newer { version: u64 },
    /// A work file whose JSON does not have the work's shape.
    Unreadable { detail: String },
    /// An item's own change holds a value its field does not take.
    BadChange {
        item: String,
        field: &'static str,
        detail: String,
    },
    /// The link unpacks to more than [`link::MAX_UNPACKED`] bytes.
    TooLarge,
}

impl fmt::Display for WorkError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            WorkError::NotWork => write!(f, "this is neither a Morrowcast work file nor a share link"),
            WorkError::Damaged { detail } => write!(
                f,
                "this share link is cut short or damaged ({detail}), so nothing of it was opened; \
                 ask for the link again (some mail programs cut long links), or for the work file"
            ),
            WorkError::Newer { version } => write!(
                f,
                "this work was saved by a newer Morrowcast (format {version}; this one reads up to \
                 format {WORK_VERSION}): open it with the newer Morrowcast"
            ),
            WorkError::Unreadable { detail } => write!(
                f,
                "this work file cannot be read ({detail}), so nothing of it was opened; save it \
                 again from Morrowcast"
            ),
            WorkError::BadChange { item, field, detail } => write!(
                f,
                "the item \"{item}\" has its own {field} that cannot be used ({detail}), so nothing \
                 of this work was opened; save the work again from Morrowcast, or remove that \
                 item's change from the file"
            ),
            WorkError::TooLarge => write!(
                f,
                "this share link unpacks to more than {} MB, more than any work Morrowcast writes, \
                 so it was not opened",
                link::MAX_UNPACKED / 1_000_000
            ),
        }
    }
}

impl std::error::Error for WorkError {}
