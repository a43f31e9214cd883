//! The work: the whole desk (the Intake text, the settings, the Stock plan's settings and
//! stock table, each item's own changes, the open item) as one value, for the share link and
//! the work file; opening one puts every part in place at once.
//!
//! Kept apart from: the written forms and their checks (crates/work, shared with the command
//! line) and how links and files are offered (share.rs).

use leptos::prelude::*;
use morrowcast_work::{SourcedText, Work};

use super::{BoardState, IntakeState, PlanState};

/// What the stock table's source says when none is given.
pub const NO_TABLE: &str = "none given";

/// What the last opening of a work said.
#[derive(Clone, Debug, PartialEq)]
pub enum WorkNotice {
    /// What was opened, in words.
    Opened(String),
    /// Why nothing was opened.
    Refused(String),
}

/// The work signals; `Copy`, handed around by context.
#[derive(Clone, Copy)]
pub struct WorkState {
    intake: IntakeState,
    plan: PlanState,
    board: BoardState,
    pub notice: RwSignal<Option<WorkNotice>>,
    /// The item a work opened on, chosen once Intake's report holds it (a large text is read
    /// in a worker, so its items come later).
    pending_item: RwSignal<Option<String>>,
}

impl WorkState {
    pub fn new(intake: IntakeState, plan: PlanState, board: BoardState) -> WorkState {
        let pending_item = RwSignal::new(None::<String>);
        // Syncs the chosen item with a work's open item once the report is in.
        Effect::new(move |_| {
            let Some(name) = pending_item.get() else {
                return;
            };
            if intake.reading.get() {
                return;
            }
            let found = intake
                .report
                .with(|r| r.items.iter().position(|i| i.name == name));
            if let Some(index) = found {
                intake.item.set(index);
            }
            pending_item.set(None);
        });
        WorkState {
            intake,
            plan,
            board,
            notice: RwSignal::new(None),
            pending_item,
        }
    }

    /// The desk as it is now.
    pub fn current(&self) -> Work {
        let table = self.board.table_text.get_untracked();
        Work {
            history: SourcedText {
                text: self.intake.text.get_untracked(),
                source: self.intake.source.get_untracked(),
            },
            settings: self.plan.form.get_untracked(),
            stock: self.board.stock_form.get_untracked(),
            stock_table: (!table.trim().is_empty()).then(|| SourcedText {
                text: table,
                source: self.board.table_source.get_untracked(),
            }),
            changes: self.board.changes.get_untracked(),
            open_item: self.intake.report.with_untracked(|r| {
                r.items
                    .get(self.intake.item.get_untracked())
                    .map(|i| i.name.clone())
            }),
        }
    }

    /// Puts every part of `work` in place; `from` says where it came from ("the share link",
    /// a file name).
    pub fn open(&self, work: Work, from: &str) {
        let changed = work.changes.len();
        let table = work.stock_table.is_some();
        self.intake
            .set_text(work.history.text, &work.history.source);
        self.plan.picked.set(None);
        self.plan.form.set(work.settings);
        self.board.stock_form.set(work.stock);
        match work.stock_table {
            Some(t) => {
                self.board.table_text.set(t.text);
                self.board.table_source.set(t.source);
            }
            None => {
                self.board.table_text.set(String::new());
                self.board.table_source.set(NO_TABLE.into());
            }
        }
        self.board.changes.set(work.changes);
        self.pending_item.set(work.open_item);
        let mut parts = vec![format!("the data ({})", work.history.source)];
        parts.push("the settings".into());
        parts.push("the Stock plan's settings".into());
        if table {
            parts.push("the stock table".into());
        }
        if changed > 0 {
            parts.push(format!(
                "own settings for {changed} item{}",
                if changed == 1 { "" } else { "s" }
            ));
        }
        let last = parts.pop().unwrap_or_default();
        self.notice.set(Some(WorkNotice::Opened(format!(
            "Opened {from}: {} and {last}.",
            parts.join(", ")
        ))));
    }

    /// Opens `text` when it is a work (a work file or a share link) and says so; a work that
    /// cannot be read is reported and changes nothing. False when `text` is not a work (the
    /// caller reads it as a history).
    pub fn open_text(&self, text: &str, from: &str) -> bool {
        if !Work::is_work(text) {
            return false;
        }
        match Work::read(text) {
            Ok(work) => self.open(work, from),
            Err(e) => {
                let mut first = from.chars();
                let capital: String = first
                    .next()
                    .map(|c| c.to_uppercase().collect())
                    .unwrap_or_default();
                self.notice.set(Some(WorkNotice::Refused(format!(
                    "{capital}{}: {e}.",
                    first.as_str()
                ))))
            }
        }
        true
    }
}
