//! The Item board's pool of plan workers: batches of items spread over one worker per core,
//! the next batch sent to whichever worker answers first (two out at each, so none waits on
//! the page), rows handed to the board as they come.
//!
//! Kept apart from: the one-item detail's worker (courier.rs: its own worker, so opening an
//! item never waits behind a file of thousands) and what rows mean (state/board.rs). The
//! batches and tickets are plain data; only this file touches the bridges.

use std::cell::RefCell;
use std::collections::VecDeque;
use std::rc::Rc;

use gloo_worker::WorkerBridge;

use super::courier::{can_start_workers, spawn_worker, NoWorker};
use crate::worker::{BoardAsk, BoardRow, PlanWorker, WorkerAsk, WorkerNews};

/// At most this many workers, whatever the browser reports (our choice: each holds its own
/// copy of the engine, about 2 MB, and past eight cores a file of thousands of items is
/// already quick).
const MAX_WORKERS: usize = 8;

/// Board tickets start here, so a fault message's ticket tells a board worker's fault from
/// the detail worker's (whose tickets count up from 1).
pub const BOARD_TICKETS: u64 = 1 << 40;

type Deliver = Rc<dyn Fn(u64, Vec<BoardRow>, f64)>;

/// Batches out at each worker at once (our choice: the next batch waits in the worker's own
/// queue, so a main thread busy for a moment does not leave the worker idle; a new run still
/// waits behind at most this many old batches, about 0.1 s).
const IN_FLIGHT: usize = 2;

struct Slot {
    bridge: Option<WorkerBridge<PlanWorker>>,
    /// The batches out at this worker, oldest first: their tickets and the (index, name) of
    /// their items.
    out: VecDeque<(u64, Vec<(usize, String)>)>,
}

struct Inner {
    slots: Vec<Slot>,
    waiting: VecDeque<BoardAsk>,
    deliver: Deliver,
    /// No batch is sent while held (the open item's detail is being planned: it goes first).
    held: bool,
    /// Whether the workers were started.
    started: bool,
}

/// The page's handle on the pool; cheap to clone.
#[derive(Clone)]
pub struct Pool {
    inner: Rc<RefCell<Inner>>,
}

/// Workers for this browser: one per core it reports, 1 to [`MAX_WORKERS`].
fn pool_size() -> usize {
    web_sys::window()
        .map(|w| w.navigator().hardware_concurrency())
        .filter(|n| n.is_finite() && *n >= 1.0)
        .map_or(2, |n| n as usize)
        .clamp(1, MAX_WORKERS)
}

impl Pool {
    /// Starts the pool; `deliver` gets each batch's rows with the batch's ticket and the
    /// worker's time on it.
    pub fn start(deliver: impl Fn(u64, Vec<BoardRow>, f64) + 'static) -> Result<Pool, NoWorker> {
        can_start_workers()?;
        let pool = Pool {
            inner: Rc::new(RefCell::new(Inner {
                slots: Vec::new(),
                waiting: VecDeque::new(),
                deliver: Rc::new(deliver),
                held: true,
                started: false,
            })),
        };
        // The workers start at the first release of the hold ([`Pool::hold`]), so they do not
        // compete with the page's first plan.
        for _ in 0..pool_size() {
            pool.inner.borrow_mut().slots.push(Slot {
                bridge: None,
                out: VecDeque::new(),
            });
        }
        Ok(pool)
    }

    /// How many workers the pool runs.
    pub fn size(&self) -> usize {
        self.inner.borrow().slots.len()
    }

    fn spawn(&self, slot: usize) {
        let weak = Rc::downgrade(&self.inner);
        let bridge = spawn_worker(move |news| {
            if let (
                Some(inner),
                WorkerNews::Rows {
                    ticket,
                    rows,
                    compute_ms,
                },
            ) = (weak.upgrade(), news)
            {
                Pool { inner }.arrived(slot, ticket, rows, compute_ms);
            }
        });
        self.inner.borrow_mut().slots[slot].bridge = bridge;
    }

    /// Plans these batches, dropping any not yet sent (batches out at a worker finish, and
    /// their rows come with their older ticket for the caller to drop).
    pub fn run(&self, batches: Vec<BoardAsk>) {
        self.inner.borrow_mut().waiting = batches.into();
        for slot in 0..self.size() {
            self.feed(slot);
        }
    }

    /// Holds back the batches not yet sent (while the open item's detail is planned, so the
    /// item a person is looking at comes first, on a machine with as many workers as cores),
    /// or lets them go again.
    pub fn hold(&self, held: bool) {
        self.inner.borrow_mut().held = held;
        if !held && !std::mem::replace(&mut self.inner.borrow_mut().started, true) {
            for slot in 0..self.size() {
                self.spawn(slot);
            }
        }
        if !held {
            for slot in 0..self.size() {
                self.feed(slot);
            }
        }
    }

    /// Sends waiting batches to a worker until it has [`IN_FLIGHT`] out.
    fn feed(&self, slot: usize) {
        while self.feed_one(slot) {}
    }

    fn feed_one(&self, slot: usize) -> bool {
        let mut inner = self.inner.borrow_mut();
        if inner.held || inner.slots[slot].out.len() >= IN_FLIGHT {
            return false;
        }
        let Some(batch) = inner.waiting.pop_front() else {
            return false;
        };
        let items = batch
            .items
            .iter()
            .map(|i| (i.index, i.series.name().to_string()))
            .collect();
        let s = &mut inner.slots[slot];
        s.out.push_back((batch.ticket, items));
        if let Some(bridge) = &s.bridge {
            bridge.send(WorkerAsk::Board(batch));
        }
        true
    }

    fn arrived(&self, slot: usize, ticket: u64, rows: Vec<BoardRow>, compute_ms: f64) {
        let deliver = {
            let mut inner = self.inner.borrow_mut();
            // A worker answers its batches in the order they were sent.
            inner.slots[slot].out.pop_front();
            inner.deliver.clone()
        };
        self.feed(slot);
        deliver(ticket, rows, compute_ms);
    }

    /// A board worker stopped on a fault (which one the page cannot tell): every batch out is
    /// answered with `message` for each of its items, every worker is started afresh, and the
    /// batches waiting go on.
    pub fn fault(&self, message: &str) {
        let (deliver, lost) = {
            let mut inner = self.inner.borrow_mut();
            let lost: Vec<(u64, Vec<(usize, String)>)> = inner
                .slots
                .iter_mut()
                .flat_map(|s| {
                    s.bridge = None;
                    std::mem::take(&mut s.out)
                })
                .collect();
            (inner.deliver.clone(), lost)
        };
        for slot in 0..self.size() {
            self.spawn(slot);
        }
        for (ticket, items) in lost {
            let rows = items
                .into_iter()
                .map(|(index, name)| BoardRow {
                    index,
                    run: ticket,
                    name,
                    figures: Err(message.to_string()),
                    // The batch asked for a Look-back or not: the message stands for both.
                    look_back: Some(Err(message.to_string())),
                })
                .collect();
            deliver(ticket, rows, 0.0);
        }
        for slot in 0..self.size() {
            self.feed(slot);
        }
    }
}
