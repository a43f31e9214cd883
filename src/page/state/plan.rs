//! The plan part of the page's state: the settings form, the ranking row the user picked, and
//! the plans the worker computes for the chosen item (asked for at once when any of these or
//! the item changes).
//!
//! Kept apart from: the Intake text (intake.rs; this part only reads its chosen series), how
//! plans are shown (results.rs) and the worker's messages (courier.rs).

use crate::worker::{parse_fault, Drill, PlanAnswer, PlanAsk, Shown};
use leptos::prelude::*;
use morrowcast_engine::backtest::Candidate;
use morrowcast_engine::plan::ItemPlan;
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::{PlanSettings, SettingsText};

use std::collections::BTreeMap;

use super::super::board::ItemChange;
use super::super::browser;
use super::super::courier::Courier;
use super::super::settings::{to_settings, FieldError};
use super::IntakeState;

/// How long the worker may stay silent while computing before the page says it stopped
/// (milliseconds; our choice: a live worker sends news after every candidate method, which
/// takes milliseconds, so 15 s of silence means it is not working).
const SILENCE_MS: f64 = 15_000.0;

/// The worker sends progress news once a plan has run this long (milliseconds; our choice: the
/// busy indicator shows after 200 ms, so news before 100 ms would not be seen).
const NEWS_AFTER_MS: f64 = 100.0;

/// A ranking row the user picked, with the series whose ranking it was picked from: a pick
/// holds only for that series (another item, or edited data, shows the engine's choice again).
#[derive(Clone, Debug, PartialEq)]
pub struct Picked {
    pub series: Series,
    pub candidate: Candidate,
}

/// The plan signals; `Copy`, handed around by context.
#[derive(Clone, Copy)]
pub struct PlanState {
    /// The settings form as typed.
    pub form: RwSignal<SettingsText>,
    pub form_errors: Memo<Vec<FieldError>>,
    /// The last settings that passed the checks.
    pub settings: Memo<PlanSettings>,
    /// The series the shown plan was made from (it lags the Intake's series while the worker
    /// computes).
    pub planned: RwSignal<Option<Series>>,
    /// The ranked plan of the chosen item, as the worker last answered.
    pub plan: RwSignal<Option<Result<ItemPlan, String>>>,
    /// True from a change of input until its plan is in.
    pub busy: RwSignal<bool>,
    /// (done, total) steps of the plan being computed, once the worker reports them.
    pub progress: RwSignal<Option<(usize, usize)>>,
    /// The ranking row the user picked; `None`: the engine's choice.
    pub picked: RwSignal<Option<Picked>>,
    /// The row the Look-ahead and the Error ledger show, with its plan.
    pub shown: RwSignal<Option<Shown>>,
    /// Time the worker took for the last plan, in milliseconds.
    pub compute_ms: RwSignal<f64>,
}

impl PlanState {
    /// The plan state for the item `intake` has chosen, planned with the file's settings and
    /// the item's own season or method from `changes` (the Item board's); starts the worker.
    pub fn new(intake: IntakeState, changes: RwSignal<BTreeMap<String, ItemChange>>) -> PlanState {
        let series = intake.series;
        let form = RwSignal::new(SettingsText::default());
        let form_errors =
            Memo::new(move |_| form.with(|f| to_settings(f).err().unwrap_or_default()));
        let settings = Memo::new(move |previous: Option<&PlanSettings>| {
            form.with(to_settings)
                .unwrap_or_else(|_| previous.cloned().unwrap_or_default())
        });
        let compute_ms = RwSignal::new(0.0);
        let plan = RwSignal::new(None::<Result<ItemPlan, String>>);
        let planned = RwSignal::new(None::<Series>);
        let shown = RwSignal::new(None::<Shown>);
        let busy = RwSignal::new(false);
        let progress = RwSignal::new(None::<(usize, usize)>);
        let picked = RwSignal::new(None::<Picked>);
        // What every failure does: the message where the plan would be, nothing left busy.
        let fail = move |message: String| {
            plan.set(Some(Err(message)));
            shown.set(None);
            planned.set(None);
            busy.set(false);
            progress.set(None);
        };
        let courier = Courier::start(
            move |answer: PlanAnswer| {
                // The round trip from ask to answer, as a performance measure.
                browser::end_measure("morrowcast:plan");
                compute_ms.set(answer.compute_ms);
                planned.set(Some(answer.series));
                shown.set(answer.shown);
                plan.set(Some(answer.ranked));
                busy.set(false);
                progress.set(None);
            },
            move |done, total| progress.set(Some((done, total))),
        );
        if let Ok(courier) = courier.clone() {
            let watchdog = courier.clone();
            // A fault in the worker reaches the page as an error event with the worker's
            // message: say so where the plan would be, and start a new worker.
            // A fault of a worker already replaced (it named an older ask) changes nothing.
            let listener = window_event_listener(leptos::ev::error, move |e| {
                let message = e.message();
                let Some((ticket, detail)) = parse_fault(&message) else {
                    return;
                };
                e.prevent_default();
                if courier.is_current(ticket) {
                    courier.restart();
                    fail(worker_fault_words(detail));
                }
            });
            // The page lives as long as the tab.
            std::mem::forget(listener);
            // A worker that never answers (it did not start in this browser, or it hangs)
            // would leave "Working" up for ever: after SILENCE_MS without news, say so.
            let _ = set_interval_with_handle(
                move || {
                    if watchdog.silent_for().is_some_and(|ms| ms > SILENCE_MS) {
                        watchdog.restart();
                        fail(worker_silent_words());
                    }
                },
                std::time::Duration::from_secs(2),
            );
        }
        let eager_news = browser::drill().as_deref() == Some("eager-news");
        // A worker drill spoils the first plan only, so recovery can be seen.
        let drill_pending = StoredValue::new(match browser::drill().as_deref() {
            Some("worker-fault") => Some(Drill::Panic),
            Some("worker-silent") => Some(Drill::Silence),
            _ => None,
        });
        // Syncs the worker (outside the page) with the inputs: every change asks for a plan.
        Effect::new(move |_| {
            let settings = settings.get();
            let input = series.get();
            // The item's own season or method, as the board plans it.
            let settings = match &input {
                Some(Ok(s)) => changes
                    .with(|c| c.get(s.name()).and_then(|c| c.plan_settings(&settings)))
                    .unwrap_or(settings),
                _ => settings,
            };
            let picked = picked.with(|p| match (p, &input) {
                (Some(p), Some(Ok(s))) if &p.series == s => Some(p.candidate.clone()),
                _ => None,
            });
            match (input, &courier) {
                (Some(Ok(series)), Ok(courier)) => {
                    busy.set(true);
                    progress.set(None);
                    browser::start_measure("morrowcast:plan");
                    let drill = drill_pending.get_value();
                    drill_pending.set_value(None);
                    courier.ask(PlanAsk {
                        ticket: 0,
                        series,
                        settings,
                        picked,
                        drill,
                        news_after_ms: if eager_news { 0.0 } else { NEWS_AFTER_MS },
                    });
                }
                (Some(Ok(_)), Err(why)) => fail(why.words().into()),
                (Some(Err(e)), _) => {
                    if let Ok(c) = &courier {
                        c.forget();
                    }
                    fail(e);
                }
                (None, _) => {
                    if let Ok(c) = &courier {
                        c.forget();
                    }
                    plan.set(None);
                    shown.set(None);
                    planned.set(None);
                    busy.set(false);
                }
            }
        });
        PlanState {
            form,
            form_errors,
            settings,
            planned,
            plan,
            busy,
            progress,
            picked,
            shown,
            compute_ms,
        }
    }

    /// Shows the ranking row of `candidate` (picked on the plan being shown).
    pub fn pick(&self, candidate: Candidate) {
        if let Some(series) = self.planned.get_untracked() {
            self.picked.set(Some(Picked { series, candidate }));
        }
    }
}

/// What the page says when the worker stopped on a fault.
fn worker_fault_words(detail: &str) -> String {
    format!(
        "the computation stopped on a fault ({}). Your data is kept in the Intake box and a fresh \
         worker has started: change a setting to try again, or reload the page",
        detail.trim()
    )
}

/// What the page says when the worker has not answered for [`SILENCE_MS`].
fn worker_silent_words() -> String {
    format!(
        "the computing part of the page has not answered for {:.0} seconds, so it was restarted. \
         Your data is kept in the Intake box: change a setting to try again. If this repeats, \
         this browser may not run module Web Workers (recent Chromium, Edge, Firefox and Safari do)",
        SILENCE_MS / 1000.0
    )
}
