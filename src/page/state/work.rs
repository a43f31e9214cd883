//! The work: the whole desk (the Intake text, the settings, the Stock plan's settings and
//! stock table, each item's own changes, the open item) as one value, for the share link and
//! the work file; opening one puts every part in place at once.
//!
//! It also keeps the desk in this browser (keep.rs writes it): every change is written after
//! a short pause, the history's text only when it changed; the start opens a share link in
//! the address, else the kept work, else the demo.
//!
//! Kept apart from: the written forms and their checks (crates/work, shared with the command
//! line), the browser's storage itself (keep.rs) and how links and files are offered
//! (share.rs).

use std::time::Duration;

use leptos::prelude::*;
use leptos::task::spawn_local;
use morrowcast_engine::demo;
use morrowcast_work::{SourcedText, Work};

use super::super::board::how_many;
use super::super::{browser, keep};
use super::board::read_by_for;
use super::{BoardState, IntakeState, PlanState, DEMO_SOURCE};

/// The pause after the last change before the desk is written (our choice: typing a number
/// writes once, and a closed tab loses at most this much).
const WRITE_AFTER: Duration = Duration::from_millis(400);

/// Where the desk stands in this browser's keeping.
#[derive(Clone, Debug, PartialEq)]
pub enum Keeping {
    /// Looking for a kept work at the start.
    Starting,
    /// Written at this time of day.
    Kept(String),
    /// The user asked not to keep work; `forgotten` when they just had it removed.
    Off { forgotten: bool },
    /// The browser refused to keep it (why); anything kept before was removed.
    Failed(String),
    /// Not kept, so that what is kept stays as it is (why): a kept work this Morrowcast cannot
    /// open, a desk that could not be set aside, a failed "forget". Ticking the box keeps
    /// this desk in its place.
    Held(String),
}

impl Keeping {
    /// Whether changes are written now (or will be, once the start is done).
    pub fn writes(&self) -> bool {
        matches!(self, Keeping::Kept(_) | Keeping::Failed(_))
    }
}

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
    pub keeping: RwSignal<Keeping>,
    /// True when a share link opened at the start replaced a desk this browser kept, which
    /// was set aside and can be brought back.
    pub set_aside: RwSignal<bool>,
    /// The Intake text's version when the history was last written.
    text_written: StoredValue<Option<u64>>,
    /// The stamp of this tab's last written history (see keep.rs).
    stamp: StoredValue<Option<String>>,
    /// Changes of the desk; a write waits [`WRITE_AFTER`] and goes only if none followed.
    desk_changes: StoredValue<u64>,
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
        let work = WorkState {
            intake,
            plan,
            board,
            notice: RwSignal::new(None),
            pending_item,
            keeping: RwSignal::new(Keeping::Starting),
            set_aside: RwSignal::new(false),
            text_written: StoredValue::new(None),
            stamp: StoredValue::new(None),
            desk_changes: StoredValue::new(0),
        };
        // Syncs this browser's copy (outside the page) with the desk: each change is written
        // after a pause, once the start has put the first desk in place.
        Effect::new(move |_| {
            intake.text.track();
            intake.source.track();
            intake.item.track();
            plan.form.track();
            board.stock_form.track();
            board.table_text.track();
            board.table_source.track();
            board.table_read_by.track();
            board.changes.track();
            board.look_back.track();
            if !work.keeping.get_untracked().writes() {
                return;
            }
            work.desk_changes.update_value(|n| *n += 1);
            let stamp = work.desk_changes.get_value();
            set_timeout(
                move || {
                    if work.desk_changes.get_value() == stamp {
                        work.write_now();
                    }
                },
                WRITE_AFTER,
            );
        });
        work
    }

    /// Puts the first desk in place: a share link in the address, else the work this browser
    /// kept (unless the user turned keeping off), else the demo. Then keeping starts.
    pub fn start(&self) {
        let this = *self;
        let mut refused_link = None;
        if let Some(fragment) = browser::work_fragment() {
            match self.open_address_link(&fragment) {
                Ok(()) => {
                    if !keep::keeping_allowed() {
                        self.keeping.set(Keeping::Off { forgotten: false });
                        return;
                    }
                    // The desk this browser kept is set aside before the link's is kept in
                    // its place, so opening a colleague's link never loses one's own work.
                    spawn_local(async move { this.set_aside_then_keep().await });
                    return;
                }
                Err(why) => refused_link = why,
            }
        }
        if !keep::keeping_allowed() {
            self.load_demo();
            self.keeping.set(Keeping::Off { forgotten: false });
            return;
        }
        spawn_local(async move {
            let kept = keep::read().await;
            // Something was pasted or opened while the kept work was looked for: it stays,
            // and the kept desk is set aside rather than written over.
            if !this.intake.source.get_untracked().is_empty() {
                return this.set_aside_then_keep().await;
            }
            match kept {
                Ok(Some((desk, history))) => match Work::read(&desk) {
                    Ok(mut kept) => {
                        kept.history.text = history;
                        this.open(kept, "the work kept in this browser");
                        if let Some(why) = refused_link {
                            this.notice.set(Some(WorkNotice::Refused(format!(
                                "{why} The work kept in this browser was opened instead."
                            ))));
                        }
                        // What was just read is what is kept: nothing to write until a change.
                        this.text_written.set_value(Some(this.intake.version()));
                        this.stamp
                            .set_value(keep::history_stamp().await.ok().flatten());
                        this.keeping.set(Keeping::Kept(browser::time_of_day()));
                        // A desk set aside by a link earlier is still there to bring back.
                        if let Ok(true) = keep::has_aside().await {
                            this.set_aside.set(true);
                        }
                    }
                    Err(e) => {
                        this.load_demo();
                        this.notice.set(Some(WorkNotice::Refused(format!(
                            "The work kept in this browser could not be opened ({e}); the demo is shown instead, and the kept work is left as it was."
                        ))));
                        this.keeping.set(Keeping::Held(
                            "the work kept here could not be opened by this Morrowcast".into(),
                        ));
                    }
                },
                Ok(None) => {
                    this.load_demo();
                    this.keep_from_now();
                }
                Err(e) => {
                    this.load_demo();
                    this.keeping.set(Keeping::Failed(e));
                }
            }
        });
    }

    /// A share link put into the address bar of this open tab: the browser does not reload
    /// for a new fragment, so the link is opened here as at the start, and the desk kept in
    /// this browser is set aside before the link's is kept in its place. Writes pause while
    /// it is set aside, so the link's desk is never written first. Any other fragment (the
    /// skip link's `#results`) is left alone.
    pub fn follow_address(&self) {
        let Some(fragment) = browser::work_fragment() else {
            return;
        };
        let before = self.keeping.get_untracked();
        let keeps = before.writes();
        if keeps {
            self.keeping.set(Keeping::Starting);
        }
        let opened = self.open_address_link(&fragment).is_ok();
        if keeps {
            if opened {
                let this = *self;
                spawn_local(async move { this.set_aside_then_keep().await });
            } else {
                self.keeping.set(before);
            }
        }
    }

    /// Opens `fragment`, a share link's from the address, and once it is open takes it out of
    /// the address (a reload then shows the desk as it is, not as the link had it). `Err`
    /// holds the refusal's words, which the notice shows too.
    fn open_address_link(&self, fragment: &str) -> Result<(), Option<String>> {
        self.open_text(fragment, "the share link");
        match self.notice.get_untracked() {
            Some(WorkNotice::Opened(_)) => {
                browser::clear_fragment();
                Ok(())
            }
            Some(WorkNotice::Refused(why)) => Err(Some(why)),
            None => Err(None),
        }
    }

    /// Sets the desk this browser kept aside, then keeps the one on the page. If it cannot be
    /// set aside, nothing is written over it.
    async fn set_aside_then_keep(self) {
        match keep::set_aside().await {
            Ok(had_one) => {
                if had_one {
                    self.set_aside.set(true);
                }
                self.keep_from_now();
            }
            Err(why) => self.keeping.set(Keeping::Held(format!(
                "the desk kept here before could not be set aside ({why}), so this one is not kept over it"
            ))),
        }
    }

    /// Removes the desk set aside, at the user's word.
    pub fn discard_aside(&self) {
        let this = *self;
        spawn_local(async move {
            match keep::discard_aside().await {
                Ok(()) => this.set_aside.set(false),
                Err(why) => this.notice.set(Some(WorkNotice::Refused(format!(
                    "The desk set aside could not be removed from this browser: {why}."
                )))),
            }
        });
    }

    /// Brings back the desk a share link replaced at the start.
    pub fn bring_back(&self) {
        let this = *self;
        spawn_local(async move {
            match keep::aside().await {
                Ok(Some((desk, history))) => match Work::read(&desk) {
                    Ok(mut before) => {
                        before.history.text = history;
                        this.open(before, "the desk set aside");
                        this.set_aside.set(false);
                        // Brought back: it is the kept desk again, no longer set aside.
                        let _ = keep::discard_aside().await;
                    }
                    Err(e) => this.notice.set(Some(WorkNotice::Refused(format!(
                        "The desk set aside could not be opened: {e}."
                    )))),
                },
                Ok(None) => this.set_aside.set(false),
                Err(why) => this.notice.set(Some(WorkNotice::Refused(format!(
                    "The desk set aside could not be read from this browser: {why}."
                )))),
            }
        });
    }

    fn load_demo(&self) {
        self.intake.set_text(demo::demo_csv(), DEMO_SOURCE);
    }

    /// Keeps the desk from now on (the start found its first desk, or the user allowed it).
    fn keep_from_now(&self) {
        self.keeping.set(Keeping::Kept(String::new()));
        self.write_now();
    }

    /// Writes the desk now (the history's text only when it changed since it was last
    /// written). A write the browser refuses removes what was kept before, so an older desk
    /// never comes back on a reload as if it were the current one.
    fn write_now(&self) {
        if !self.keeping.get_untracked().writes() || !keep::keeping_allowed() {
            return;
        }
        let this = *self;
        let mut desk = self.current();
        let changes = self.intake.version();
        let changed = self.text_written.get_value() != Some(changes);
        let text = std::mem::take(&mut desk.history.text);
        let desk = desk.to_file_text();
        let mine = self.stamp.get_value();
        spawn_local(async move {
            // Another tab may have kept its own history since this one wrote: then this
            // tab's history goes with its desk, never its desk alone over the other's.
            let stored = keep::history_stamp().await.ok().flatten();
            let history =
                (changed || mine.is_none() || stored != mine).then(|| (text, keep::new_stamp()));
            let stamp = history.as_ref().map(|(_, s)| s.clone()).or(mine);
            match keep::write(desk, history).await {
                Ok(()) => {
                    this.text_written.set_value(Some(changes));
                    this.stamp.set_value(stamp);
                    // A "forget" or a held state meanwhile wins over this write's news.
                    if this.keeping.get_untracked().writes() {
                        this.keeping.set(Keeping::Kept(browser::time_of_day()));
                    }
                }
                Err(why) => {
                    // The current desk only: a desk set aside by a link stays.
                    let _ = keep::forget_current().await;
                    this.text_written.set_value(None);
                    if this.keeping.get_untracked().writes() {
                        this.keeping.set(Keeping::Failed(why));
                    }
                }
            }
        });
    }

    /// The user's choice: keep this desk in this browser, or not (and then nothing kept stays).
    pub fn set_keeping(&self, allowed: bool) {
        keep::allow_keeping(allowed);
        if allowed {
            self.text_written.set_value(None);
            self.keep_from_now();
        } else {
            self.forget();
        }
    }

    /// Removes what this browser keeps at once and keeps nothing more until allowed again.
    pub fn forget(&self) {
        keep::allow_keeping(false);
        self.keeping.set(Keeping::Off { forgotten: false });
        let this = *self;
        spawn_local(async move {
            match keep::forget().await {
                Ok(()) => this.keeping.set(Keeping::Off { forgotten: true }),
                Err(why) => this.keeping.set(Keeping::Held(format!(
                    "\u{201c}Forget it now\u{201d} did not work ({why}); nothing more is kept"
                ))),
            }
        });
    }

    /// The desk as it is now.
    pub fn current(&self) -> Work {
        let table = self.board.table_text.get_untracked();
        // The choice of the table as it is (its column checked again when the work opens).
        let stock_read_by = self
            .board
            .table_read_by
            .with_untracked(|c| read_by_for(c, &table))
            .filter(|_| !table.trim().is_empty());
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
            // A work's open item waits for its report (a large text is read in a worker).
            open_item: self.pending_item.get_untracked().or_else(|| {
                self.intake.report.with_untracked(|r| {
                    r.items
                        .get(self.intake.item.get_untracked())
                        .map(|i| i.name.clone())
                })
            }),
            look_back: self.board.look_back.get_untracked(),
            stock_read_by,
        }
    }

    /// Puts every part of `work` in place; `from` says where it came from ("the share link",
    /// a file name).
    pub fn open(&self, work: Work, from: &str) {
        let changed = work.changes.len();
        let table = work.stock_table.is_some();
        let look_back = work.look_back;
        self.intake
            .set_text(work.history.text, &work.history.source);
        self.plan.picked.set(None);
        self.plan.form.set(work.settings);
        self.board.stock_form.set(work.stock);
        // Set before the text, so the table is never read once without the work's choice.
        let read_by = work
            .stock_read_by
            .zip(work.stock_table.as_ref().map(|t| t.text.clone()));
        self.board.table_read_by.set(read_by);
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
        self.board.look_back.set(work.look_back);
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
        if look_back > 0 {
            parts.push(format!(
                "a Look-back of {}",
                how_many(look_back, ("period", "periods"))
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
