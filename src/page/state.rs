//! The page's state: the Intake text, the chosen item, the settings form, and the plans the
//! worker computes from them (asked for at once when any of these changes).
//!
//! Kept apart from: how the state is shown (panels, results) and the worker's messages
//! (courier.rs). The page reads Intake itself (it is quick and the report shows as you type);
//! every plan is computed in the worker.

pub use crate::worker::Shown;
use crate::worker::{parse_fault, Drill, PlanAnswer, PlanAsk};
use leptos::prelude::*;
use morrowcast_engine::intake::{self, IntakeReport};
use morrowcast_engine::plan::{ItemPlan, PlanSettings};
use morrowcast_engine::series::Series;

use super::browser;
use super::courier::Courier;
use super::settings::{FieldError, SettingsForm};

/// Name of the demo as a source (file names and the intake report use it).
pub const DEMO_SOURCE: &str = "the demo";

/// How long the worker may stay silent while computing before the page says it stopped
/// (milliseconds; our choice: a live worker sends news after every candidate method, which
/// takes milliseconds, so 15 s of silence means it is not working).
const SILENCE_MS: f64 = 15_000.0;

/// The worker sends progress news once a plan has run this long (milliseconds; our choice: the
/// busy indicator shows after 200 ms, so news before 100 ms would not be seen).
const NEWS_AFTER_MS: f64 = 100.0;

/// Every signal of the page; `Copy`, handed around by context.
#[derive(Clone, Copy)]
pub struct State {
    pub text: RwSignal<String>,
    /// Where the text came from: "the demo", a file name, "pasted text".
    pub source: RwSignal<String>,
    pub report: Memo<IntakeReport>,
    pub item: RwSignal<usize>,
    pub form: RwSignal<SettingsForm>,
    pub form_errors: Memo<Vec<FieldError>>,
    /// The last settings that passed the checks.
    pub settings: Memo<PlanSettings>,
    /// The chosen item's series from the Intake text (what the next plan will be made from).
    pub series: Memo<Option<Result<Series, String>>>,
    /// The series the shown plan was made from (it lags `series` while the worker computes).
    pub planned: RwSignal<Option<Series>>,
    /// The ranked plan of the chosen item, as the worker last answered.
    pub plan: RwSignal<Option<Result<ItemPlan, String>>>,
    /// True from a change of input until its plan is in.
    pub busy: RwSignal<bool>,
    /// (done, total) steps of the plan being computed, once the worker reports them.
    pub progress: RwSignal<Option<(usize, usize)>>,
    /// Bumped when the window is resized, so charts redraw at their new size.
    pub layout: RwSignal<u32>,
    /// Label of the ranking row the user picked; `None`: the engine's choice.
    pub picked: RwSignal<Option<String>>,
    /// The row the Look-ahead and the Error ledger show, with its plan.
    pub shown: RwSignal<Option<Shown>>,
    /// Time the worker took for the last plan, in milliseconds.
    pub compute_ms: RwSignal<f64>,
}

impl State {
    pub fn new(initial_text: String, initial_source: String) -> State {
        let text = RwSignal::new(initial_text);
        let source = RwSignal::new(initial_source);
        let report = Memo::new(move |_| text.with(|t| intake::read(t)));
        let item = RwSignal::new(0usize);
        let form = RwSignal::new(SettingsForm::default());
        let form_errors =
            Memo::new(move |_| form.with(|f| f.to_settings().err().unwrap_or_default()));
        let settings = Memo::new(move |previous: Option<&PlanSettings>| {
            form.with(|f| f.to_settings())
                .unwrap_or_else(|_| previous.cloned().unwrap_or_default())
        });
        let series = Memo::new(move |_| {
            report.with(|r| {
                r.items
                    .get(item.get().min(r.items.len().saturating_sub(1)))
                    .map(|i| i.series().map_err(|e| e.to_string()))
            })
        });
        let compute_ms = RwSignal::new(0.0);
        let plan = RwSignal::new(None::<Result<ItemPlan, String>>);
        let planned = RwSignal::new(None::<Series>);
        let shown = RwSignal::new(None::<Shown>);
        let busy = RwSignal::new(false);
        let progress = RwSignal::new(None::<(usize, usize)>);
        let picked = RwSignal::new(None::<String>);
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
        Effect::new(move |_| {
            let settings = settings.get();
            let input = series.get();
            let picked = picked.get();
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
        State {
            text,
            source,
            report,
            item,
            form,
            form_errors,
            settings,
            series,
            planned,
            plan,
            busy,
            progress,
            layout: RwSignal::new(0),
            picked,
            shown,
            compute_ms,
        }
    }

    /// Replaces the Intake text (and keeps it for this tab).
    pub fn set_text(&self, text: String, source: &str) {
        browser::keep_text(&text, source);
        self.source.set(source.to_string());
        self.item.set(0);
        self.picked.set(None);
        self.text.set(text);
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
