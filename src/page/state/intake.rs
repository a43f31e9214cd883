//! The Intake part of the page's state: the text, where it came from, the engine's reading of
//! it, and the chosen item.
//!
//! Kept apart from: plans (plan.rs asks the worker for them from [`IntakeState::series`]).

use leptos::prelude::*;
use morrowcast_engine::intake::{self, IntakeReport};
use morrowcast_engine::series::Series;

use super::super::browser;
use super::super::reader::Reader;

/// Name of the demo as a source (file names and the intake report use it).
pub const DEMO_SOURCE: &str = "the demo";

/// The Intake signals; `Copy`, handed around by context.
#[derive(Clone, Copy)]
pub struct IntakeState {
    pub text: RwSignal<String>,
    /// Where the text came from: "the demo", a file name, "pasted text".
    pub source: RwSignal<String>,
    pub report: Memo<IntakeReport>,
    /// Index of the chosen item in the report.
    pub item: RwSignal<usize>,
    /// The chosen item's series (what the next plan will be made from), or why there is none.
    pub series: Memo<Option<Result<Series, String>>>,
    /// Counts the changes of text (see [`IntakeState::set_text`]).
    version: RwSignal<u64>,
    /// True while a large text is being read in the worker (the report is then empty).
    pub reading: Memo<bool>,
    /// The text before a period was left out of it, for putting it back; shown only while
    /// the text is still the one the leaving out wrote.
    pub left_out: RwSignal<Option<LeftOut>>,
    /// The workbook the text was read from, kept for reading another of its sheets; any other
    /// change of text lets it go.
    pub workbook: RwSignal<Option<OpenWorkbook>>,
}

/// A workbook opened in Intake: its bytes (on this machine only, never written anywhere),
/// the sheets that may be read and the one read.
#[derive(Clone, Debug, PartialEq)]
pub struct OpenWorkbook {
    /// The file's name.
    pub file: String,
    pub bytes: std::sync::Arc<Vec<u8>>,
    pub sheets: Vec<String>,
    /// The sheet whose text is in the box; `None` when none was read (which is unclear).
    pub sheet: Option<String>,
}

/// A period left out of the Intake text at the user's request, and what to put back.
#[derive(Clone, Debug, PartialEq)]
pub struct LeftOut {
    /// The period, as the page names it.
    pub period: String,
    /// The text and its source before.
    pub text: String,
    pub source: String,
    /// The text's version the leaving out wrote (see [`IntakeState::version`]).
    pub version: u64,
}

/// Texts longer than this are read in a worker and shown in the Intake box only in part (our
/// choice, measured: reading 1.4 MB on the page took 0.4-0.5 s, 14 MB 3.5 s, and Chromium laid
/// out the box's whole 1.4 MB text on the page's only thread for about 3 s, starving the Item
/// board's workers of their next batches). Shorter ones are read on the page, so the report
/// follows typing at once.
pub const LARGE_TEXT: usize = 200_000;

impl IntakeState {
    pub fn new(initial_text: String, initial_source: String) -> IntakeState {
        let text = RwSignal::new(initial_text);
        let source = RwSignal::new(initial_source);
        // Bumped with every change of text (set_typed, set_text: the only writers), so an
        // answer of the reading worker is shown only for the text it was asked about.
        let version = RwSignal::new(0u64);
        let answered = RwSignal::new(None::<(u64, IntakeReport)>);
        let reader = Reader::new(move |ticket, report| {
            if ticket == version.get_untracked() {
                answered.set(Some((ticket, report)));
            }
        });
        let off_page = reader.is_some();
        let large = Memo::new(move |_| off_page && text.with(|t| t.len() > LARGE_TEXT));
        let reading = Memo::new(move |_| {
            large.get() && answered.with(|a| a.as_ref().map(|a| a.0) != Some(version.get()))
        });
        let report = Memo::new(move |_| {
            if !large.get() {
                return browser::measured("morrowcast:intake", || text.with(|t| intake::read(t)));
            }
            let v = version.get();
            answered.with(|a| match a {
                Some((t, r)) if *t == v => r.clone(),
                // Nothing yet: the report of no text (no items, no errors) until it comes.
                _ => intake::read(""),
            })
        });
        // Syncs the reading worker (outside the page) with a large text.
        if let Some(reader) = reader {
            Effect::new(move |_| {
                let v = version.get();
                if large.get() {
                    reader.read(v, text.get_untracked());
                }
            });
        }
        let item = RwSignal::new(0usize);
        let series = Memo::new(move |_| {
            report.with(|r| {
                r.items
                    .get(item.get().min(r.items.len().saturating_sub(1)))
                    .map(|i| i.series().map_err(|e| e.to_string()))
            })
        });
        IntakeState {
            text,
            source,
            report,
            item,
            series,
            version,
            reading,
            left_out: RwSignal::new(None),
            workbook: RwSignal::new(None),
        }
    }

    /// The period left out, while the text is still the one that left it out.
    pub fn current_left_out(&self) -> Option<LeftOut> {
        let version = self.version.get();
        self.left_out.get().filter(|left| left.version == version)
    }

    /// Whether the unfinished last period can be left out here: rows to leave out, and a text
    /// read on the page (a larger one would be read again on the page's only thread; the
    /// notice then says to take it out of the file).
    pub fn can_leave_out_last(&self) -> bool {
        let rows = self.report.with(|r| {
            r.unfinished_last
                .as_ref()
                .is_some_and(|u| !u.rows.is_empty())
        });
        rows && self.text.with(|t| t.len() <= LARGE_TEXT)
    }

    /// Leaves the unfinished last period out of the text, keeping what to put back; `Err`
    /// says why not (its rows decided part of the reading).
    pub fn leave_out_last(&self) -> Result<(), String> {
        if !self.can_leave_out_last() {
            return Ok(());
        }
        let (text, source) = (self.text.get_untracked(), self.source.get_untracked());
        let outcome = self.report.with_untracked(|r| {
            let period = r.unfinished_last.as_ref()?.period.to_string();
            Some((period, intake::leave_out_unfinished(&text, r)?))
        });
        match outcome {
            // The reading made to check it is read again as the Intake text is: on a worker.
            Some((period, Ok((without, _)))) => {
                let new_source = morrowcast_work::SourcedText::named_without(&source, &period);
                self.set_text_keeping_item(without, &new_source);
                self.left_out.set(Some(LeftOut {
                    period,
                    text,
                    source,
                    version: self.version(),
                }));
                Ok(())
            }
            Some((_, Err(why))) => Err(why.to_string()),
            None => Ok(()),
        }
    }

    /// Puts back the period left out: the text and source as they were.
    pub fn put_back(&self) {
        if let Some(left) = self.left_out.get_untracked() {
            self.set_text_keeping_item(left.text, &left.source);
            self.left_out.set(None);
        }
    }

    /// Replaces the text and keeps the chosen item where the new text still has it (by name).
    pub fn set_text_keeping_item(&self, text: String, source: &str) {
        let name = self.report.with_untracked(|r| {
            r.items
                .get(self.item.get_untracked())
                .map(|i| i.name.clone())
        });
        self.set_text(text, source);
        if let Some(name) = name {
            let at = self
                .report
                .with_untracked(|r| r.items.iter().position(|i| i.name == name));
            if let Some(at) = at {
                self.item.set(at);
            }
        }
    }

    /// The text's version: bumped at once by every change of text (see
    /// [`IntakeState::set_text`]), so a writer can tell whether the text it last wrote is the
    /// current one.
    pub fn version(&self) -> u64 {
        self.version.get_untracked()
    }

    /// Replaces the text as typed or pasted into the box. This and
    /// [`IntakeState::set_text`] are the only ways the text changes.
    pub fn set_typed(&self, text: String) {
        self.version.update(|v| *v += 1);
        self.workbook.set(None);
        self.source.set("pasted text".into());
        self.text.set(text);
    }

    /// Replaces the Intake text; the first item is chosen.
    pub fn set_text(&self, text: String, source: &str) {
        self.version.update(|v| *v += 1);
        self.workbook.set(None);
        self.source.set(source.to_string());
        self.item.set(0);
        self.text.set(text);
    }
}
