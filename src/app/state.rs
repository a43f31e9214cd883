//! The page's state: the Intake text, the chosen item, the settings form, and the engine results
//! derived from them (recomputed at once when any of these changes).
//!
//! Kept apart from: how the state is shown (panels, results). The engine is called here only.

use leptos::prelude::*;
use morrowcast::engine::intake::{self, IntakeReport};
use morrowcast::engine::plan::{plan_item, Choice, ItemPlan, PlanSettings};
use morrowcast::engine::series::Series;

use super::browser;
use super::settings::{FieldError, SettingsForm};

/// A recompute faster than this (milliseconds) runs without first showing "Working…" (our
/// choice: well under the 100 ms a change may take, so a pause of one frame is not worth it).
const QUICK_MS: f64 = 40.0;

/// What the Look-ahead and the Error ledger show: one row of the ranking and its refit plan.
#[derive(Clone, Debug, PartialEq)]
pub struct Shown {
    /// Index of the row in the ranking.
    pub row: usize,
    /// The plan refitted with that row's candidate (the ranked plan itself for the row the
    /// engine chose).
    pub plan: ItemPlan,
}

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
    pub series: Memo<Option<Result<Series, String>>>,
    /// The ranked plan of the chosen item; computed one tick after its inputs change, so the
    /// page can show that it is working first.
    pub plan: RwSignal<Option<Result<ItemPlan, String>>>,
    /// True from a change of input until its plan is in.
    pub busy: RwSignal<bool>,
    /// Bumped when the window is resized, so charts redraw at their new size.
    pub layout: RwSignal<u32>,
    /// Label of the ranking row the user picked; `None`: the engine's choice.
    pub picked: RwSignal<Option<String>>,
    pub shown: Memo<Option<Shown>>,
    /// Time of the last recompute of the ranked plan, in milliseconds.
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
        let busy = RwSignal::new(false);
        Effect::new(move |_| {
            let s = settings.get();
            let input = series.get();
            let run = move || {
                let result = match input {
                    Some(Ok(series)) => {
                        let t0 = browser::now_ms();
                        let r = browser::measured("morrowcast:plan", || {
                            plan_item(&series, &s).map_err(|e| e.to_string())
                        });
                        compute_ms.set(browser::now_ms() - t0);
                        Some(r)
                    }
                    Some(Err(e)) => Some(Err(e)),
                    None => None,
                };
                plan.set(result);
                busy.set(false);
            };
            // A plan that was quick last time runs at once: waiting a tick to show "Working…"
            // would cost more than the work. Otherwise one tick later, so the busy indicator
            // is painted before the work starts.
            let was_quick =
                plan.with_untracked(|p| p.is_some()) && compute_ms.get_untracked() < QUICK_MS;
            if was_quick {
                run();
            } else {
                busy.set(true);
                set_timeout(run, std::time::Duration::ZERO);
            }
        });
        let picked = RwSignal::new(None::<String>);
        let shown = Memo::new(move |_| {
            let wanted = picked.get();
            let s = settings.get();
            plan.with(|p| {
                let Some(Ok(p)) = p else {
                    return None;
                };
                // The row the engine chose (not always the top one: its choice rule may prefer
                // the combination).
                let chosen = p
                    .backtest
                    .ranking
                    .iter()
                    .position(|r| r.candidate == p.chosen)
                    .unwrap_or(0);
                let row = wanted
                    .as_ref()
                    .and_then(|w| {
                        p.backtest
                            .ranking
                            .iter()
                            .position(|r| &r.candidate.label() == w)
                    })
                    .unwrap_or(chosen);
                if row == chosen {
                    return Some(Shown {
                        row,
                        plan: p.clone(),
                    });
                }
                let candidate = &p.backtest.ranking[row].candidate;
                // The same plan with the picked row chosen: the ranking stays whole.
                let only = PlanSettings {
                    choice: Choice::Named(candidate.key().to_string()),
                    ..s.clone()
                };
                let refit = series.with(|series| match series {
                    Some(Ok(series)) => plan_item(series, &only).ok(),
                    _ => None,
                });
                match refit {
                    Some(plan) if &plan.chosen == candidate => Some(Shown { row, plan }),
                    // The refit chose another candidate: show the engine's choice rather than
                    // mislabel the row.
                    _ => Some(Shown {
                        row: chosen,
                        plan: p.clone(),
                    }),
                }
            })
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
            plan,
            busy,
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
