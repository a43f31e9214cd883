//! The gloo-worker side (wasm only): one [`PlanDesk`], timed with the worker's clock.
//!
//! Kept apart from: the worker's logic (desk.rs, pure) and the page (it never runs here).

use gloo_worker::{HandlerId, Worker, WorkerScope};
use wasm_bindgen::JsCast;

use super::board::answer_board;
use super::desk::PlanDesk;
use super::protocol::{Drill, WorkerAsk, WorkerNews};

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
    type Input = WorkerAsk;
    type Output = WorkerNews;

    fn create(_scope: &WorkerScope<Self>) -> Self {
        PlanWorker {
            desk: PlanDesk::new(),
        }
    }

    fn update(&mut self, _scope: &WorkerScope<Self>, _msg: ()) {}

    fn received(&mut self, scope: &WorkerScope<Self>, ask: WorkerAsk, id: HandlerId) {
        let ask = match ask {
            WorkerAsk::Plan(ask) => ask,
            WorkerAsk::Board(batch) => {
                ANSWERING.with(|a| a.set(batch.ticket));
                let t0 = now_ms();
                let rows = answer_board(&batch);
                scope.respond(
                    id,
                    WorkerNews::Rows {
                        ticket: batch.ticket,
                        rows,
                        compute_ms: now_ms() - t0,
                    },
                );
                return;
            }
        };
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
