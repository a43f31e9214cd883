//! The plan worker: what crosses between the page and its Web Worker, and the work done there.
//!
//! Kept apart from: the DOM (the worker has none) and the CLI's JSON contract (src/wire.rs).
//! The page sends a [`PlanAsk`] (the chosen item's series, the settings, the ranking row the
//! user picked); the worker answers with a [`PlanAnswer`] holding the ranked plan and the plan
//! of the picked row, after [`WorkerNews::Progress`] messages when the plan is slow. Messages are bincode (gloo-worker's codec) of the engine's own types: both
//! ends are built from this source at once, so the encoding is not a contract and may change
//! with any commit. Infinity and NaN cross unchanged (JSON could not carry them).
//!
//! [`PlanDesk`] is the worker's whole logic, pure and tested natively; the gloo-worker glue
//! (wasm only) only times it and passes messages.

use serde::{Deserialize, Serialize};

use morrowcast_engine::plan::{
    plan_item_observed, plan_item_reusing, Choice, ItemPlan, PlanSettings, Progress,
};
use morrowcast_engine::series::Series;

/// How a panic's message in the worker starts, as the page sees it in the error event:
/// `morrowcast worker, ask 17: panicked at ...`. The ask's ticket lets the page tell a fault of
/// its current worker from one of a worker it has already replaced.
pub const FAULT_PREFIX: &str = "morrowcast worker, ask ";

/// The message the worker's panic hook throws for a panic while answering ask `ticket`.
pub fn fault_message(ticket: u64, panic: &str) -> String {
    format!("{FAULT_PREFIX}{ticket}: {panic}")
}

/// The ask and the detail in a worker's fault message (the page's error event may wrap it,
/// as in "Uncaught Error: morrowcast worker, ask 17: ..."); `None` for any other message.
pub fn parse_fault(message: &str) -> Option<(u64, &str)> {
    let rest = &message[message.find(FAULT_PREFIX)? + FAULT_PREFIX.len()..];
    let (ticket, detail) = rest.split_once(": ")?;
    Some((ticket.parse().ok()?, detail))
}

/// One request to the worker.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct PlanAsk {
    /// Increases with every ask; the answer carries it back so the page can drop stale ones.
    pub ticket: u64,
    pub series: Series,
    pub settings: PlanSettings,
    /// Label of the ranking row the user picked (`Candidate::label`); `None`: the engine's choice.
    pub picked: Option<String>,
    /// A deliberate failure instead of a plan (the page's `#drill=worker-fault` and
    /// `#drill=worker-silent`), so the browser tests can check that it is caught, reported
    /// and recovered from.
    pub drill: Option<Drill>,
    /// Progress news is sent only once the plan has run this long (milliseconds): a quick
    /// plan's answer comes before any bar could be seen. The page sends 100, its
    /// `#drill=eager-news` 0 (so a test sees news whatever the machine's speed).
    pub news_after_ms: f64,
}

/// The worker's fault drills.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize, Deserialize)]
pub enum Drill {
    /// Panic (as a bug would).
    Panic,
    /// Never answer (as a worker that did not start would look to the page).
    Silence,
}

/// What the Look-ahead and the Error ledger show: one row of the ranking and its plan.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct Shown {
    /// Index of the row in the ranking.
    pub row: usize,
    /// The plan refitted with that row's candidate (the ranked plan itself for the row the
    /// engine chose).
    pub plan: ItemPlan,
}

/// What the worker sends back: news of how far an ask has come, then its answer.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub enum WorkerNews {
    /// `done` of `total` steps of the ask with this ticket (sent only for slow plans).
    Progress {
        ticket: u64,
        done: usize,
        total: usize,
    },
    /// Boxed: an answer is large, progress news small.
    Answer(Box<PlanAnswer>),
}

/// The worker's answer to one [`PlanAsk`].
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct PlanAnswer {
    pub ticket: u64,
    /// The series the plan was made from (the page's input may have moved on).
    pub series: Series,
    /// The ranked plan, or the engine's message saying why there is none.
    pub ranked: Result<ItemPlan, String>,
    /// The row to show; `None` when there is no ranked plan.
    pub shown: Option<Shown>,
    /// Time the worker spent on this ask, in milliseconds (0 natively).
    pub compute_ms: f64,
}

/// The worker's state: the last ranked plan, so picking a row of the same ranking refits only
/// that row's candidate (the engine reuses the ranking: `plan_item_reusing`).
#[derive(Debug, Default)]
pub struct PlanDesk {
    last: Option<(Series, PlanSettings, Result<ItemPlan, String>)>,
}

impl PlanDesk {
    pub fn new() -> PlanDesk {
        PlanDesk::default()
    }

    /// Answers one ask (with `compute_ms` 0: the caller times it).
    ///
    /// # Panics
    /// On purpose, when `ask.drill` is [`Drill::Panic`].
    pub fn answer(&mut self, ask: PlanAsk) -> PlanAnswer {
        self.answer_observed(ask, &mut |_| {})
    }

    /// [`PlanDesk::answer`], reporting the plan's [`Progress`] as it goes.
    pub fn answer_observed(
        &mut self,
        ask: PlanAsk,
        progress: &mut dyn FnMut(Progress),
    ) -> PlanAnswer {
        if ask.drill == Some(Drill::Panic) {
            panic!("fault drill: a deliberate fault to check that the page reports it");
        }
        let last = match self.last.take() {
            Some(last) if last.0 == ask.series && last.1 == ask.settings => last,
            _ => {
                let ranked = plan_item_observed(&ask.series, &ask.settings, progress)
                    .map_err(|e| e.to_string());
                (ask.series.clone(), ask.settings.clone(), ranked)
            }
        };
        let (_, _, ranked) = self.last.insert(last);
        let shown = match ranked {
            Ok(plan) => Some(shown_row(plan, &ask)),
            Err(_) => None,
        };
        PlanAnswer {
            ticket: ask.ticket,
            series: ask.series,
            ranked: ranked.clone(),
            shown,
            compute_ms: 0.0,
        }
    }
}

/// The row the user picked with its refit plan, or the engine's choice.
fn shown_row(ranked: &ItemPlan, ask: &PlanAsk) -> Shown {
    let ranking = &ranked.backtest.ranking;
    // The row the engine chose (not always the top one: its choice rule may prefer the
    // combination).
    let chosen = ranking
        .iter()
        .position(|r| r.candidate == ranked.chosen)
        .unwrap_or(0);
    let engine_choice = Shown {
        row: chosen,
        plan: ranked.clone(),
    };
    let Some(row) = ask
        .picked
        .as_ref()
        .and_then(|w| ranking.iter().position(|r| &r.candidate.label() == w))
    else {
        return engine_choice;
    };
    if row == chosen {
        return engine_choice;
    }
    let candidate = &ranking[row].candidate;
    // The same plan with the picked row chosen: the ranking stays whole.
    let only = PlanSettings {
        choice: Choice::Named(candidate.key().to_string()),
        ..ask.settings.clone()
    };
    match plan_item_reusing(&ask.series, &only, ranked, &ask.settings) {
        Ok(plan) if &plan.chosen == candidate => Shown { row, plan },
        // The refit chose another candidate: show the engine's choice rather than mislabel
        // the row.
        _ => engine_choice,
    }
}

#[cfg(target_arch = "wasm32")]
pub use glue::{answering, PlanWorker};

/// The gloo-worker side (wasm only): one [`PlanDesk`], timed with the worker's clock.
#[cfg(target_arch = "wasm32")]
mod glue {
    use gloo_worker::{HandlerId, Worker, WorkerScope};
    use wasm_bindgen::JsCast;

    use super::{Drill, PlanAsk, PlanDesk, WorkerNews};

    /// The Web Worker that computes plans (registered by src/bin/morrowcast-worker.rs).
    pub struct PlanWorker {
        desk: PlanDesk,
    }

    thread_local! {
        /// The ask being answered, for the panic hook's message.
        static ANSWERING: std::cell::Cell<u64> = const { std::cell::Cell::new(0) };
    }

    /// The ticket of the ask the worker is answering (0 before the first).
    pub fn answering() -> u64 {
        ANSWERING.with(|a| a.get())
    }

    fn now_ms() -> f64 {
        js_sys::global()
            .dyn_into::<web_sys::WorkerGlobalScope>()
            .ok()
            .and_then(|g| g.performance())
            .map(|p| p.now())
            .unwrap_or(0.0)
    }

    impl Worker for PlanWorker {
        type Message = ();
        type Input = PlanAsk;
        type Output = WorkerNews;

        fn create(_scope: &WorkerScope<Self>) -> Self {
            PlanWorker {
                desk: PlanDesk::new(),
            }
        }

        fn update(&mut self, _scope: &WorkerScope<Self>, _msg: ()) {}

        fn received(&mut self, scope: &WorkerScope<Self>, ask: PlanAsk, id: HandlerId) {
            if ask.drill == Some(Drill::Silence) {
                return;
            }
            ANSWERING.with(|a| a.set(ask.ticket));
            let t0 = now_ms();
            let ticket = ask.ticket;
            let news_after_ms = ask.news_after_ms;
            let mut answer = self.desk.answer_observed(ask, &mut |p| {
                if now_ms() - t0 >= news_after_ms {
                    scope.respond(
                        id,
                        WorkerNews::Progress {
                            ticket,
                            done: p.done,
                            total: p.total,
                        },
                    );
                }
            });
            answer.compute_ms = now_ms() - t0;
            scope.respond(id, WorkerNews::Answer(Box::new(answer)));
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use morrowcast_engine::calendar::Period;
    use morrowcast_engine::plan::plan_item;

    fn seasonal() -> Series {
        let values = (0..48)
            .map(|t| {
                Some(
                    100.0
                        + 2.0 * t as f64
                        + [0., 5., 9., 4., -3., -8., -6., 1., 7., 3., -5., -7.][t % 12],
                )
            })
            .collect();
        Series::new("test item", Period::month(2022, 1), values).unwrap()
    }

    fn ask(ticket: u64, picked: Option<String>) -> PlanAsk {
        PlanAsk {
            ticket,
            series: seasonal(),
            settings: PlanSettings::default(),
            picked,
            drill: None,
            news_after_ms: 0.0,
        }
    }

    #[test]
    fn answer_carries_the_ranked_plan_of_the_engine() {
        let mut desk = PlanDesk::new();
        let a = desk.answer(ask(7, None));
        assert_eq!(a.ticket, 7);
        let direct = plan_item(&seasonal(), &PlanSettings::default()).unwrap();
        assert_eq!(a.ranked.as_ref().unwrap(), &direct);
        let shown = a.shown.unwrap();
        assert_eq!(shown.plan, direct);
        assert_eq!(direct.backtest.ranking[shown.row].candidate, direct.chosen);
    }

    #[test]
    fn a_picked_row_is_refitted_with_its_own_candidate() {
        let mut desk = PlanDesk::new();
        let first = desk.answer(ask(1, None)).ranked.unwrap();
        let other = first
            .backtest
            .ranking
            .iter()
            .position(|r| r.candidate != first.chosen)
            .unwrap();
        let label = first.backtest.ranking[other].candidate.label();
        let a = desk.answer(ask(2, Some(label)));
        let shown = a.shown.unwrap();
        assert_eq!(shown.row, other);
        assert_eq!(shown.plan.chosen, first.backtest.ranking[other].candidate);
        // The ranking itself is the same as before the pick.
        assert_eq!(a.ranked.unwrap(), first);
    }

    #[test]
    fn progress_is_reported_while_answering() {
        let mut desk = PlanDesk::new();
        let mut steps = Vec::new();
        let a = desk.answer_observed(ask(1, None), &mut |p| steps.push(p));
        assert!(a.ranked.is_ok());
        let last = steps.last().unwrap();
        assert_eq!(last.done + 1, last.total, "{steps:?}");
        // The same ask again reuses the ranked plan: no backtest, so no progress.
        steps.clear();
        desk.answer_observed(ask(2, None), &mut |p| steps.push(p));
        assert!(steps.is_empty(), "{steps:?}");
    }

    #[test]
    fn fault_messages_name_their_ask_and_read_back() {
        let m = fault_message(17, "panicked at src/x.rs:1:2: boom");
        assert_eq!(
            parse_fault(&m),
            Some((17, "panicked at src/x.rs:1:2: boom"))
        );
        let wrapped = format!("Uncaught Error: {m}");
        assert_eq!(parse_fault(&wrapped).map(|f| f.0), Some(17));
        assert_eq!(parse_fault("Uncaught TypeError: x is undefined"), None);
    }

    #[test]
    #[should_panic(expected = "fault drill")]
    fn the_fault_drill_panics_on_purpose() {
        let mut q = ask(1, None);
        q.drill = Some(Drill::Panic);
        PlanDesk::new().answer(q);
    }

    #[test]
    fn an_unknown_pick_shows_the_engine_choice() {
        let mut desk = PlanDesk::new();
        let a = desk.answer(ask(1, Some("no such method".into())));
        let ranked = a.ranked.unwrap();
        assert_eq!(a.shown.unwrap().plan, ranked);
    }

    #[test]
    fn messages_survive_the_codec_both_ways() {
        // The worker's codec is bincode (gloo-worker's default); this is the same encoding.
        let mut desk = PlanDesk::new();
        let a = desk.answer(ask(3, None));
        let bytes = bincode::serialize(&a).unwrap();
        let back: PlanAnswer = bincode::deserialize(&bytes).unwrap();
        assert_eq!(back, a);
        let q = ask(4, Some("SES".into()));
        let back: PlanAsk = bincode::deserialize(&bincode::serialize(&q).unwrap()).unwrap();
        assert_eq!(back, q);
    }

    #[test]
    fn a_series_that_breaks_its_invariants_is_refused_on_arrival() {
        // An infinite value: Series::new refuses it, so a message holding one was not made by
        // Series::new; reading it back must check again. The bytes are built by hand.
        #[derive(Serialize)]
        struct Parts {
            name: String,
            start: Period,
            values: Vec<Option<f64>>,
        }
        let bad = Parts {
            name: "x".into(),
            start: Period::month(2022, 1),
            values: vec![Some(f64::INFINITY)],
        };
        let bytes = bincode::serialize(&bad).unwrap();
        assert!(bincode::deserialize::<Series>(&bytes).is_err());
    }
}
