//! The page's side of the plan worker: sends asks, keeps at most one in flight, and hands the
//! newest answer to the page's state.
//!
//! Kept apart from: what the worker computes (src/worker.rs) and how answers are shown. Only
//! this file and the worker serialise in the browser (gloo-worker's bincode codec).
//!
//! Why one in flight: a worker answers in order, so a burst of changes (typing a horizon, a
//! string of clicks) would otherwise queue a plan per keystroke. While one is out, newer asks
//! replace each other; when its answer arrives it is dropped if a newer ask waits, and that one
//! goes out. The page so always ends showing the plan of its latest inputs.

use std::cell::RefCell;
use std::rc::Rc;

use gloo_worker::{Spawnable, WorkerBridge};
use morrowcast::worker::{PlanAnswer, PlanAsk, PlanWorker, WorkerNews};

/// Where the worker's boot module is named: index.html gets a `<meta name="...">` from
/// scripts/inline-wasm.sh (its file name carries a hash, so a stale cached copy is never used).
const WORKER_META: &str = "morrowcast-worker";
/// The worker's own panic hook starts its message with this (src/bin/morrowcast-worker.rs).
pub const WORKER_FAULT_PREFIX: &str = "morrowcast worker:";

type Deliver = Rc<dyn Fn(PlanAnswer)>;
type Report = Rc<dyn Fn(usize, usize)>;

struct Inner {
    bridge: Option<WorkerBridge<PlanWorker>>,
    next_ticket: u64,
    in_flight: Option<u64>,
    waiting: Option<PlanAsk>,
    /// Ticket of the newest ask; `None` after [`Courier::forget`]. Only its answer is shown.
    latest: Option<u64>,
    deliver: Deliver,
    report: Report,
    /// Page clock (ms) when the worker was last asked or last heard from.
    last_heard: f64,
}

/// The page's handle on the worker; cheap to clone.
#[derive(Clone)]
pub struct Courier {
    inner: Rc<RefCell<Inner>>,
}

fn now_ms() -> f64 {
    web_sys::window()
        .and_then(|w| w.performance())
        .map(|p| p.now())
        .unwrap_or(0.0)
}

/// The worker's boot module as index.html names it.
fn worker_path() -> Option<String> {
    let doc = web_sys::window()?.document()?;
    let meta = doc
        .query_selector(&format!("meta[name=\"{WORKER_META}\"]"))
        .ok()??;
    meta.get_attribute("content")
}

impl Courier {
    /// Starts the worker; `deliver` gets each answer the page should show, `report` the
    /// progress (done, total) of the ask it waits for. `None` when the page does not name its
    /// worker (a build without scripts/inline-wasm.sh).
    pub fn start(
        deliver: impl Fn(PlanAnswer) + 'static,
        report: impl Fn(usize, usize) + 'static,
    ) -> Option<Courier> {
        let courier = Courier {
            inner: Rc::new(RefCell::new(Inner {
                bridge: None,
                next_ticket: 1,
                in_flight: None,
                waiting: None,
                latest: None,
                deliver: Rc::new(deliver),
                report: Rc::new(report),
                last_heard: 0.0,
            })),
        };
        courier.spawn()?;
        Some(courier)
    }

    fn spawn(&self) -> Option<()> {
        let path = worker_path()?;
        let weak = Rc::downgrade(&self.inner);
        let bridge = PlanWorker::spawner()
            .callback(move |news| {
                if let Some(inner) = weak.upgrade() {
                    match news {
                        WorkerNews::Answer(answer) => Courier { inner }.arrived(*answer),
                        WorkerNews::Progress {
                            ticket,
                            done,
                            total,
                        } => Courier { inner }.progressed(ticket, done, total),
                    }
                }
            })
            .with_loader(true)
            .spawn(&path);
        self.inner.borrow_mut().bridge = Some(bridge);
        Some(())
    }

    /// Asks for a plan (the ticket is filled in here).
    pub fn ask(&self, mut ask: PlanAsk) {
        let mut inner = self.inner.borrow_mut();
        ask.ticket = inner.next_ticket;
        inner.next_ticket += 1;
        inner.latest = Some(ask.ticket);
        if inner.in_flight.is_some() {
            inner.waiting = Some(ask);
            return;
        }
        inner.in_flight = Some(ask.ticket);
        inner.last_heard = now_ms();
        if let Some(bridge) = &inner.bridge {
            bridge.send(ask);
        }
    }

    /// How long the worker has been silent while an ask is out (milliseconds); `None` when
    /// nothing is out. A live worker sends news at least once per candidate method.
    pub fn silent_for(&self) -> Option<f64> {
        let inner = self.inner.borrow();
        inner.in_flight.map(|_| now_ms() - inner.last_heard)
    }

    fn arrived(&self, answer: PlanAnswer) {
        let deliver = {
            let mut inner = self.inner.borrow_mut();
            inner.last_heard = now_ms();
            if inner.in_flight != Some(answer.ticket) {
                return;
            }
            inner.in_flight = None;
            match inner.waiting.take() {
                Some(next) => {
                    inner.in_flight = Some(next.ticket);
                    inner.last_heard = now_ms();
                    if let Some(bridge) = &inner.bridge {
                        bridge.send(next);
                    }
                    return;
                }
                None if inner.latest == Some(answer.ticket) => inner.deliver.clone(),
                None => return,
            }
        };
        // Outside the borrow: delivering updates the page, which may ask again at once.
        deliver(answer);
    }

    fn progressed(&self, ticket: u64, done: usize, total: usize) {
        let report = {
            let mut inner = self.inner.borrow_mut();
            inner.last_heard = now_ms();
            // Only the ask whose answer will be shown (nothing newer waiting).
            if inner.in_flight != Some(ticket) || inner.waiting.is_some() {
                return;
            }
            inner.report.clone()
        };
        report(done, total);
    }

    /// Drops what was asked: the page's input has no plan to wait for any more.
    pub fn forget(&self) {
        let mut inner = self.inner.borrow_mut();
        inner.waiting = None;
        inner.latest = None;
    }

    /// The worker stopped (its panic reached the page, or it fell silent): forget what was in
    /// flight and start a new worker; the caller says what happened.
    pub fn restart(&self) {
        {
            let mut inner = self.inner.borrow_mut();
            inner.in_flight = None;
            inner.waiting = None;
            inner.latest = None;
            inner.bridge = None;
        }
        self.spawn();
    }
}
