//! The reading worker: Intake's reading of a large text, and a dropped or chosen workbook
//! (.xlsx, .xlsm, .ods) read into a sheet's text, beside the page, in a Web Worker built apart
//! that the page starts at its first large text or workbook.
//!
//! Kept apart from: what reading means (the engine's `intake::read`, which the page calls
//! itself for small texts, and `history_text`, `stock_table_text` and
//! `history_text_of_sheet`, which the command line calls too) and the plan worker (plans and
//! the board's rows). Why a worker of its own: Intake
//! and the workbook reader (calamine with its zip and XML readers and the encodings' tables)
//! are a large part of the wasm; the plan worker, loaded at start, then holds neither, the
//! page not the workbook reader; and a large text or workbook is read without freezing the
//! page.
//!
//! The answer logic ([`answer`]) is pure and tested natively; the gloo-worker glue (wasm only)
//! passes messages.

use morrowcast_engine::intake::{self, FileText, IntakeReport};
use serde::{Deserialize, Serialize};

/// Which text of the workbook the page wants.
#[derive(Clone, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum BookWant {
    /// A history's: the fullest sheet (Intake's drop zone and file picker).
    History,
    /// A stock table's: the sheet naming on hand, else the fullest (the Stock plan's).
    StockTable,
    /// This sheet's, as a history (the sheet choice).
    Sheet(String),
}

/// One workbook to read.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct BookAsk {
    /// Increases with every ask; the answer carries it back to the ask's own callback.
    pub ticket: u64,
    pub bytes: Vec<u8>,
    pub want: BookWant,
}

/// Why a workbook gave no text, and the sheets that could be read instead (for the sheet
/// choice; empty when none can).
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Refused {
    pub why: String,
    pub sheets: Vec<String>,
}

/// The reading of one [`BookAsk`].
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct BookAnswer {
    pub ticket: u64,
    pub read: Result<FileText, Refused>,
}

/// Reads the workbook as asked.
fn answer_book(ask: &BookAsk) -> BookAnswer {
    let read = match &ask.want {
        BookWant::History => intake::history_text(&ask.bytes),
        BookWant::StockTable => intake::stock_table_text(&ask.bytes),
        BookWant::Sheet(name) => intake::history_text_of_sheet(&ask.bytes, name),
    };
    BookAnswer {
        ticket: ask.ticket,
        read: read.map_err(|why| Refused {
            why,
            sheets: intake::workbook_sheets(&ask.bytes),
        }),
    }
}

/// What the page asks the reading worker for.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub enum ReadAsk {
    /// Intake's reading of a large text (the page reads small ones itself); the ticket is the
    /// text's version on the page.
    Text {
        ticket: u64,
        text: String,
    },
    Workbook(BookAsk),
}

/// The reading worker's answer to a [`ReadAsk`] of the same kind.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub enum ReadNews {
    /// Boxed: a report is large.
    Text {
        ticket: u64,
        report: Box<IntakeReport>,
    },
    Workbook(BookAnswer),
}

/// Answers one ask. Never panics, whatever the text or bytes (Intake and the workbook reader
/// are fuzzed: fuzz/fuzz_targets).
pub fn answer(ask: &ReadAsk) -> ReadNews {
    match ask {
        ReadAsk::Text { ticket, text } => ReadNews::Text {
            ticket: *ticket,
            report: Box::new(intake::read(text)),
        },
        ReadAsk::Workbook(book) => ReadNews::Workbook(answer_book(book)),
    }
}

/// How the message of a panic in the reading worker starts, as the page's error event shows
/// it (the plan workers' faults have their own, [`super::FAULT_PREFIX`]).
pub const READ_FAULT_PREFIX: &str = "morrowcast reading worker: ";

#[cfg(target_arch = "wasm32")]
mod glue {
    use gloo_worker::{HandlerId, Worker, WorkerScope};

    use super::{answer, ReadAsk, ReadNews};

    /// The Web Worker that reads (registered by src/bin/morrowcast-reader.rs).
    pub struct ReadingWorker;

    impl Worker for ReadingWorker {
        type Message = ();
        type Input = ReadAsk;
        type Output = ReadNews;

        fn create(_scope: &WorkerScope<Self>) -> Self {
            ReadingWorker
        }

        fn update(&mut self, _scope: &WorkerScope<Self>, _msg: ()) {}

        fn received(&mut self, scope: &WorkerScope<Self>, ask: ReadAsk, id: HandlerId) {
            scope.respond(id, answer(&ask));
        }
    }
}

#[cfg(target_arch = "wasm32")]
pub use glue::ReadingWorker;

#[cfg(test)]
mod tests {
    use super::*;

    fn fixture(name: &str) -> Vec<u8> {
        std::fs::read(format!(
            "{}/tests/fixtures/workbooks/{name}",
            env!("CARGO_MANIFEST_DIR")
        ))
        .expect("fixture")
    }

    /// (file, what is wanted) -> the sheet read, or the start of the refusal and the sheets
    /// offered instead.
    fn check(file: &str, want: BookWant, expected: Result<&str, (&str, &[&str])>) {
        let ReadNews::Workbook(answer) = answer(&ReadAsk::Workbook(BookAsk {
            ticket: 7,
            bytes: fixture(file),
            want: want.clone(),
        })) else {
            panic!("a workbook's answer to a workbook's ask");
        };
        assert_eq!(answer.ticket, 7);
        match (&answer.read, expected) {
            (Ok(file_text), Ok(sheet)) => {
                assert_eq!(file_text.sheet.as_deref(), Some(sheet), "{file} {want:?}");
                assert!(!file_text.text.is_empty());
            }
            (Err(refused), Err((why, sheets))) => {
                assert!(
                    refused.why.contains(why),
                    "{file} {want:?}: {}",
                    refused.why
                );
                assert_eq!(refused.sheets, sheets, "{file} {want:?}");
            }
            (got, _) => panic!("{file} {want:?}: {got:?}"),
        }
    }

    #[test]
    fn large_texts_are_read_as_the_page_reads_small_ones() {
        let text = "month,Trowel\n2024-01,5\n2024-02,x\n";
        let ReadNews::Text { ticket, report } = answer(&ReadAsk::Text {
            ticket: 3,
            text: text.into(),
        }) else {
            panic!("a text's answer to a text's ask");
        };
        assert_eq!((ticket, *report), (3, intake::read(text)));
    }

    #[test]
    fn reports_survive_the_workers_codec() {
        // bincode reads fields by position: a field left out when empty (an item's parts in a
        // one-column history) would shift every field after it. Both kinds of item, in one
        // message and in two.
        for text in [
            "month,code,description,units\n2024-01,FG-1,Birch trellis,5\n2024-01,FG-2,,4\n",
            "month,Trowel\n2024-01,5\n2024-02,6\n",
        ] {
            let news = answer(&ReadAsk::Text {
                ticket: 5,
                text: text.into(),
            });
            let bytes = bincode::serialize(&news).unwrap();
            let back: ReadNews = bincode::deserialize(&bytes).unwrap();
            let ReadNews::Text { report, .. } = back else {
                panic!("a text's answer to a text's ask");
            };
            assert_eq!(*report, intake::read(text));
        }
    }

    #[test]
    fn workbooks_are_read_as_the_page_asks() {
        check("sales.xlsx", BookWant::History, Ok("Sales"));
        check("sales.xlsx", BookWant::StockTable, Ok("Stock"));
        check(
            "sales.xlsx",
            BookWant::Sheet("Read me".into()),
            Ok("Read me"),
        );
        check(
            "sales.xls",
            BookWant::History,
            Err((".xlsx, .ods or CSV", &[])),
        );
        check(
            "year_sheets.xlsx",
            BookWant::History,
            Err(("same header", &["2024", "2025"])),
        );
        check(
            "year_sheets.xlsx",
            BookWant::Sheet("2025".into()),
            Ok("2025"),
        );
    }
}
