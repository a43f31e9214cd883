//! The page's side of the reading worker: Intake's reading of a table over the Intake state's
//! `LARGE_TEXT` bytes, and every workbook, go to it (started at the first of them), so a
//! pasted or opened file of thousands of items, or a large workbook, does not freeze the page.
//!
//! Kept apart from: what reading means (src/worker/reading.rs, over the engine's
//! `intake::read`, the same function the page calls itself for smaller texts, so a report does
//! not depend on where it was made), the Intake state (state/intake.rs decides when to ask and
//! which answer is current) and what the page does with a sheet's text (panels.rs,
//! board_panel.rs). One worker answers in the order asked, so of two workbooks dropped one
//! after the other the later one's text is the last to arrive. A worker that faults, or leaves
//! an ask unanswered for [`SILENCE`], is given up in words ([`stopped`]); the next ask starts
//! a new one.

use std::cell::RefCell;
use std::collections::HashMap;
use std::rc::Rc;
use std::time::Duration;

use gloo_worker::WorkerBridge;
use leptos::prelude::*;
use morrowcast_engine::intake::{self, FileText, IntakeReport, RowError};

use super::browser;
use super::courier::{
    can_start_workers, names_worker, spawn_reading_worker, NoWorker, READING_WORKER,
};
use crate::worker::reading::{
    BookAsk, BookWant, ReadAsk, ReadNews, ReadingWorker, Refused, READ_FAULT_PREFIX,
};

type Deliver = Rc<dyn Fn(u64, IntakeReport)>;
type Done = Box<dyn FnOnce(Result<FileText, Refused>)>;

/// The page's one reading worker and who waits for its answers.
#[derive(Default)]
struct Reading {
    bridge: Option<WorkerBridge<ReadingWorker>>,
    /// Where large texts' reports go (the Intake state's [`Reader`]).
    texts: Option<Deliver>,
    /// The ticket of the large text asked about last and not answered yet.
    text_asked: Option<u64>,
    /// Each workbook's callback, by its ticket.
    books: HashMap<u64, Done>,
    next_book: u64,
    /// Whether the page listens for the worker's faults yet (from its first start).
    listening: bool,
}

thread_local! {
    static READING: RefCell<Reading> = RefCell::new(Reading::default());
}

/// Sends `ask` to the reading worker, starting it first if need be; `Err` when it cannot be
/// started (the page names no reading worker).
fn send(reading: &mut Reading, ask: ReadAsk) -> Result<(), NoWorker> {
    if !names_worker(READING_WORKER) {
        return Err(NoWorker::NotBuilt);
    }
    if reading.bridge.is_none() {
        reading.bridge = spawn_reading_worker(arrived);
        if !reading.listening {
            reading.listening = true;
            listen_for_faults();
        }
    }
    let bridge = reading.bridge.as_ref().ok_or(NoWorker::NotBuilt)?;
    let silent_drill = browser::drill().as_deref() == Some("reader-silent");
    let awaited = Awaited::of(&ask);
    // The page's `#drill=reader-silent` never sends (a worker that did not start looks so to
    // the page), so a test sees the silence said.
    if !silent_drill {
        bridge.send(ask);
    }
    let silence = if silent_drill { DRILL_SILENCE } else { SILENCE };
    set_timeout(
        move || {
            if READING.with(|r| awaited.is_awaited(&r.borrow())) {
                stopped(format!(
                    "Morrowcast's reading worker did not answer within {} s (it may not have \
                     started in this browser, or the file is too large to read here)",
                    silence.as_secs()
                ));
            }
        },
        silence,
    );
    Ok(())
}

/// An ask by its kind and ticket, to tell later whether its answer is still awaited.
#[derive(Clone, Copy)]
enum Awaited {
    Text(u64),
    Workbook(u64),
}

impl Awaited {
    fn of(ask: &ReadAsk) -> Awaited {
        match ask {
            ReadAsk::Text { ticket, .. } => Awaited::Text(*ticket),
            ReadAsk::Workbook(book) => Awaited::Workbook(book.ticket),
        }
    }

    fn is_awaited(self, reading: &Reading) -> bool {
        match self {
            Awaited::Text(ticket) => reading.text_asked == Some(ticket),
            Awaited::Workbook(ticket) => reading.books.contains_key(&ticket),
        }
    }
}

/// How long an ask may go unanswered before the reading worker is given up (our choice: the
/// largest text Intake takes, 64 MB, is read in well under a minute; a workbook of 65,760
/// rows took under a second natively).
const SILENCE: Duration = Duration::from_secs(120);

/// The same under `#drill=reader-silent`, so the test need not wait two minutes.
const DRILL_SILENCE: Duration = Duration::from_secs(2);

fn arrived(news: ReadNews) {
    match news {
        ReadNews::Text { ticket, report } => {
            let deliver = READING.with(|r| {
                let mut r = r.borrow_mut();
                if r.text_asked == Some(ticket) {
                    r.text_asked = None;
                }
                r.texts.clone()
            });
            // Outside the borrow: delivering updates the page, which may ask again at once.
            if let Some(deliver) = deliver {
                deliver(ticket, *report);
            }
        }
        ReadNews::Workbook(answer) => {
            let done = READING.with(|r| r.borrow_mut().books.remove(&answer.ticket));
            if let Some(done) = done {
                done(answer.read);
            }
        }
    }
}

/// A fault of the reading worker (a panic thrown as an error naming it) stops it
/// ([`stopped`]).
fn listen_for_faults() {
    let listener = window_event_listener(leptos::ev::error, move |e| {
        let message = e.message();
        let Some(at) = message.find(READ_FAULT_PREFIX) else {
            return;
        };
        e.prevent_default();
        let detail = &message[at + READ_FAULT_PREFIX.len()..];
        stopped(format!(
            "Morrowcast's reading worker stopped (a fault of ours: {detail})"
        ));
    });
    // The page lives as long as the tab.
    std::mem::forget(listener);
}

/// The reading worker is given up (a fault, or silence), `why` in words: every workbook it was
/// reading is refused saying so, the large text it was reading gets a report of one error
/// (else the page would wait for it), and the next ask starts a new worker.
fn stopped(why: String) {
    let (waiting, text, deliver) = READING.with(|r| {
        let mut r = r.borrow_mut();
        r.bridge = None;
        let waiting: Vec<Done> = r.books.drain().map(|(_, done)| done).collect();
        (waiting, r.text_asked.take(), r.texts.clone())
    });
    for done in waiting {
        done(Err(Refused {
            why: format!("{why}; save the sheet as CSV and read that"),
            sheets: Vec::new(),
        }));
    }
    if let (Some(ticket), Some(deliver)) = (text, deliver) {
        let mut report = intake::read("");
        report.errors.push(RowError {
            row: 1,
            column: String::new(),
            text: String::new(),
            message: format!("{why} while reading this text; change the text to read it again"),
        });
        deliver(ticket, report);
    }
}

/// The page's handle on the reading of large texts; cheap to clone.
#[derive(Clone)]
pub struct Reader;

impl Reader {
    /// A reader whose answers go to `deliver` (with the ticket they were asked with); `None`
    /// when this page cannot start workers (the page then reads every text itself).
    pub fn new(deliver: impl Fn(u64, IntakeReport) + 'static) -> Option<Reader> {
        can_start_workers().ok()?;
        if !names_worker(READING_WORKER) {
            return None;
        }
        READING.with(|r| r.borrow_mut().texts = Some(Rc::new(deliver)));
        Some(Reader)
    }

    /// Asks for the report of `text`; an answer to an older ask still comes, with its ticket.
    pub fn read(&self, ticket: u64, text: String) {
        READING.with(|r| {
            let mut r = r.borrow_mut();
            if send(&mut r, ReadAsk::Text { ticket, text }).is_ok() {
                r.text_asked = Some(ticket);
            }
        });
    }
}

/// Reads the workbook in `bytes` in the reading worker; `done` gets the text `want` names, or
/// why there is none (and the sheets that could be read instead).
pub fn read_workbook(
    bytes: Vec<u8>,
    want: BookWant,
    done: impl FnOnce(Result<FileText, Refused>) + 'static,
) {
    let sent = can_start_workers().and_then(|()| {
        READING.with(|r| {
            let r = &mut *r.borrow_mut();
            let ticket = r.next_book;
            r.next_book += 1;
            send(
                r,
                ReadAsk::Workbook(BookAsk {
                    ticket,
                    bytes,
                    want,
                }),
            )
            .map(|()| ticket)
        })
    });
    // The answer comes in a later task of the page, so `done` is in place before it.
    match sent {
        Ok(ticket) => {
            READING.with(|r| r.borrow_mut().books.insert(ticket, Box::new(done)));
        }
        Err(no) => done(Err(Refused {
            why: format!("{}; save the sheet as CSV and read that", no.words()),
            sheets: Vec::new(),
        })),
    }
}
