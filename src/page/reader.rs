//! The page's reader of large texts: Intake's reading of a table over the Intake state's
//! `LARGE_TEXT` bytes runs in a worker of its own, so a pasted or opened file of thousands of
//! items does not freeze the page while it is read.
//!
//! Kept apart from: what reading means (the engine's `intake::read`, the same function the page
//! calls itself for smaller texts, so a report does not depend on where it was made) and the
//! Intake state (state/intake.rs decides when to ask and which answer is current).

use std::cell::RefCell;
use std::rc::Rc;

use gloo_worker::WorkerBridge;
use morrowcast_engine::intake::IntakeReport;

use super::courier::{can_start_workers, spawn_worker};
use crate::worker::{PlanWorker, WorkerAsk, WorkerNews};

type Deliver = Rc<dyn Fn(u64, IntakeReport)>;

/// The page's handle on its reading worker (started at the first large text); cheap to clone.
#[derive(Clone)]
pub struct Reader {
    bridge: Rc<RefCell<Option<WorkerBridge<PlanWorker>>>>,
    deliver: Deliver,
}

impl Reader {
    /// A reader whose answers go to `deliver` (with the ticket they were asked with); `None`
    /// when this page cannot start workers (the page then reads every text itself).
    pub fn new(deliver: impl Fn(u64, IntakeReport) + 'static) -> Option<Reader> {
        can_start_workers().ok()?;
        Some(Reader {
            bridge: Rc::new(RefCell::new(None)),
            deliver: Rc::new(deliver),
        })
    }

    /// Asks for the report of `text`; an answer to an older ask still comes, with its ticket.
    pub fn read(&self, ticket: u64, text: String) {
        let mut bridge = self.bridge.borrow_mut();
        if bridge.is_none() {
            let deliver = self.deliver.clone();
            *bridge = spawn_worker(move |news| {
                if let WorkerNews::Read { ticket, report } = news {
                    deliver(ticket, *report);
                }
            });
        }
        if let Some(b) = bridge.as_ref() {
            b.send(WorkerAsk::Read { ticket, text });
        }
    }
}
