//! The Intake part of the page's state: the text, where it came from, the engine's reading of
//! it, and the chosen item.
//!
//! Kept apart from: plans (plan.rs asks the worker for them from [`IntakeState::series`]).

use leptos::prelude::*;
use morrowcast_engine::intake::{self, IntakeReport};
use morrowcast_engine::series::Series;

use super::super::browser;

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
    /// False when the text could not be kept for a reload of this tab (too large for the
    /// browser's session storage, or storage off).
    pub kept: RwSignal<bool>,
}

impl IntakeState {
    pub fn new(initial_text: String, initial_source: String) -> IntakeState {
        let text = RwSignal::new(initial_text);
        let source = RwSignal::new(initial_source);
        let report = Memo::new(move |_| {
            browser::measured("morrowcast:intake", || text.with(|t| intake::read(t)))
        });
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
            kept: RwSignal::new(true),
        }
    }

    /// Replaces the text as typed or pasted into the box (and keeps it for this tab).
    pub fn set_typed(&self, text: String) {
        self.kept.set(browser::keep_text(&text, "pasted text"));
        self.source.set("pasted text".into());
        self.text.set(text);
    }

    /// Replaces the Intake text (and keeps it for this tab); the first item is chosen.
    pub fn set_text(&self, text: String, source: &str) {
        self.kept.set(browser::keep_text(&text, source));
        self.source.set(source.to_string());
        self.item.set(0);
        self.text.set(text);
    }
}
