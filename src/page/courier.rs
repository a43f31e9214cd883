//! The page's side of the plan worker: sends asks, keeps at most one in flight, and hands the
//! newest answer to the page's state; and how the page starts any of its workers (the plan
//! worker, the reading worker of reader.rs) under its policy, from the module index.html or
//! the single file names.
//!
//! Kept apart from: what the worker computes (src/worker) and how answers are shown. Only this
//! file and the worker serialise in the browser (gloo-worker's bincode codec). The rules of
//! which ask goes out and which answer is shown are the pure [`AskQueue`] (src/worker/queue.rs,
//! tested natively); this file joins it to the worker bridge and the page's clock.

use std::cell::RefCell;
use std::rc::Rc;

use crate::worker::reading::{ReadNews, ReadingWorker};
use crate::worker::{Arrival, AskQueue, PlanAnswer, PlanAsk, PlanWorker, WorkerAsk, WorkerNews};
use gloo_worker::{Worker, WorkerBridge, WorkerSpawner};
use serde::de::DeserializeOwned;
use serde::Serialize;

use super::browser::{blob_url, now_ms};
use wasm_bindgen::prelude::*;
use wasm_bindgen::JsCast;

/// One of the page's worker modules: where index.html names its boot module (a `<meta
/// name="...">` from scripts/inline-wasm.sh; its file name carries a hash, so a stale cached
/// copy is never used) and the id of the data block that carries the whole module in the
/// single file (scripts/single-file.sh: a page opened from disk may load no other file).
#[derive(Clone, Copy)]
pub struct WorkerFile {
    meta: &'static str,
    inline_id: &'static str,
}

/// The plan worker (src/bin/morrowcast-worker.rs): plans and the board's rows.
pub const PLAN_WORKER: WorkerFile = WorkerFile {
    meta: "morrowcast-worker",
    inline_id: "morrowcast-worker-source",
};

/// The reading worker (src/bin/morrowcast-reader.rs), started at the first large text or
/// workbook.
pub const READING_WORKER: WorkerFile = WorkerFile {
    meta: "morrowcast-reader",
    inline_id: "morrowcast-reader-source",
};

type Deliver = Rc<dyn Fn(PlanAnswer)>;
type Report = Rc<dyn Fn(usize, usize)>;

struct Inner {
    bridge: Option<WorkerBridge<PlanWorker>>,
    queue: AskQueue,
    deliver: Deliver,
    report: Report,
}

impl Inner {
    fn send(&self, ask: PlanAsk) {
        if let Some(bridge) = &self.bridge {
            bridge.send(WorkerAsk::Plan(ask));
        }
    }
}

/// The page's handle on the worker; cheap to clone.
#[derive(Clone)]
pub struct Courier {
    inner: Rc<RefCell<Inner>>,
}

thread_local! {
    /// The `data:` address of each inline worker module, by its block's id, made once and
    /// kept (every worker of the kind starts from it).
    static INLINE_WORKERS: RefCell<std::collections::HashMap<&'static str, Option<String>>> =
        RefCell::new(std::collections::HashMap::new());
}

/// The `data:` address of a worker module the page carries inside itself, when it does.
///
/// Why `data:` and not `blob:`: a page opened from disk has an opaque origin, and Chromium
/// 156 refused a module worker from its `blob:` address ("Refused to cross-origin redirects
/// of the top-level worker script"). A `data:` worker inherits the page's policy just as a
/// `blob:` one does (CSP Level 3: local schemes), so `connect-src 'none'` still binds it.
fn inline_worker(file: WorkerFile) -> Option<String> {
    INLINE_WORKERS.with(|cells| {
        cells
            .borrow_mut()
            .entry(file.inline_id)
            .or_insert_with(|| {
                let doc = web_sys::window()?.document()?;
                let code = doc.get_element_by_id(file.inline_id)?.text_content()?;
                let encoded: String = js_sys::encode_uri_component(&code).into();
                Some(format!("data:text/javascript,{encoded}"))
            })
            .clone()
    })
}

/// The address a worker starts from: the page's own worker module (the single file), or a
/// `blob:` module that imports the worker boot module index.html names (the served site).
fn worker_address(file: WorkerFile) -> Option<String> {
    inline_worker(file).or_else(|| worker_blob(&worker_module(file)?))
}

/// A worker's boot module as index.html names it, as an absolute address.
fn worker_module(file: WorkerFile) -> Option<String> {
    let doc = web_sys::window()?.document()?;
    let meta = doc
        .query_selector(&format!("meta[name=\"{}\"]", file.meta))
        .ok()??;
    let path = meta.get_attribute("content")?;
    let base = doc.base_uri().ok()??;
    Some(web_sys::Url::new_with_base(&path, &base).ok()?.href())
}

/// A `blob:` address of a one-line module that imports the worker's boot module.
///
/// Why: a worker started from a page's own file takes its Content-Security-Policy from that
/// file's HTTP headers, which a static host does not send, so it could connect anywhere. A
/// worker started from a `blob:` address inherits the page's policy instead (CSP Level 3,
/// "initialize a worker's policy container"), so `connect-src 'none'` binds it too.
///
/// The import is dynamic: Chromium 156 failed to load the static `import "..."` form in a
/// `blob:` module worker (an error event with no message), while `import()` loads. A failed
/// import is thrown again outside the promise, so it surfaces as the worker's error.
fn worker_blob(module: &str) -> Option<String> {
    blob_url(
        &format!(
            "import(\"{}\").catch((e) => setTimeout(() => {{ throw e; }}));",
            module.replace('"', "%22")
        ),
        "text/javascript",
    )
}

/// Whether this browser starts module workers (`new Worker(url, { type: "module" })`): a
/// browser that does not know the option never reads it, which the getter notices.
fn module_workers_supported() -> bool {
    let seen = Rc::new(std::cell::Cell::new(false));
    let flag = seen.clone();
    let getter = Closure::<dyn FnMut() -> JsValue>::new(move || {
        flag.set(true);
        JsValue::from_str("module")
    });
    let options = js_sys::Object::new();
    let descriptor = js_sys::Object::new();
    let _ = js_sys::Reflect::set(&descriptor, &"get".into(), getter.as_ref());
    let _ = js_sys::Reflect::define_property(&options, &"type".into(), &descriptor);
    // An empty module: nothing runs, nothing is fetched. The single file starts its workers
    // from data: addresses (see [`inline_worker`]), the served page from blob: ones.
    if inline_worker(PLAN_WORKER).is_some() {
        if let Ok(w) =
            web_sys::Worker::new_with_options("data:text/javascript,", options.unchecked_ref())
        {
            w.terminate();
        }
    } else if let Some(url) = blob_url("", "text/javascript") {
        if let Ok(w) = web_sys::Worker::new_with_options(&url, options.unchecked_ref()) {
            w.terminate();
        }
        let _ = web_sys::Url::revoke_object_url(&url);
    }
    seen.get()
}

/// Whether the page names the worker module `file` (built by scripts/inline-wasm.sh, or
/// carried inside the single file).
pub fn names_worker(file: WorkerFile) -> bool {
    worker_module(file).is_some() || inline_worker(file).is_some()
}

/// Why the page has no worker to compute with.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum NoWorker {
    /// The page does not name its worker (built without scripts/inline-wasm.sh).
    NotBuilt,
    /// This browser cannot start module workers.
    Unsupported,
}

impl NoWorker {
    /// The page's words for it.
    pub fn words(self) -> &'static str {
        match self {
            NoWorker::NotBuilt => {
                "this copy of the page has no worker to compute with (it was built without scripts/inline-wasm.sh)"
            }
            NoWorker::Unsupported => {
                "this browser cannot run the page's computing part (it needs module Web Workers, which recent Chromium, Edge, Firefox and Safari have). Your data stays in the Intake box"
            }
        }
    }
}

/// Whether the page can start its workers, and why not.
pub fn can_start_workers() -> Result<(), NoWorker> {
    if !names_worker(PLAN_WORKER) {
        return Err(NoWorker::NotBuilt);
    }
    if !module_workers_supported() {
        return Err(NoWorker::Unsupported);
    }
    Ok(())
}

/// Starts one plan worker under the page's policy (see [`worker_blob`]); `news` hears what it
/// sends. `None` when the page names no worker module.
pub fn spawn_worker(news: impl Fn(WorkerNews) + 'static) -> Option<WorkerBridge<PlanWorker>> {
    spawn(PLAN_WORKER, news)
}

/// Starts the reading worker as [`spawn_worker`] starts a plan worker; `None` when the page
/// names no reading worker module.
pub fn spawn_reading_worker(
    news: impl Fn(ReadNews) + 'static,
) -> Option<WorkerBridge<ReadingWorker>> {
    spawn(READING_WORKER, news)
}

/// Starts the worker `W` from its module `file` under the page's policy, as an ES-module
/// worker (gloo-worker's loader); `None` when the page names no such module.
fn spawn<W>(file: WorkerFile, news: impl Fn(W::Output) + 'static) -> Option<WorkerBridge<W>>
where
    W: Worker + 'static,
    W::Input: Serialize + DeserializeOwned,
    W::Output: Serialize + DeserializeOwned,
{
    let path = worker_address(file)?;
    Some(
        WorkerSpawner::<W>::new()
            .callback(news)
            .with_loader(true)
            .spawn(&path),
    )
}

impl Courier {
    /// Starts the worker; `deliver` gets each answer the page should show, `report` the
    /// progress (done, total) of the ask it waits for.
    pub fn start(
        deliver: impl Fn(PlanAnswer) + 'static,
        report: impl Fn(usize, usize) + 'static,
    ) -> Result<Courier, NoWorker> {
        can_start_workers()?;
        let courier = Courier {
            inner: Rc::new(RefCell::new(Inner {
                bridge: None,
                queue: AskQueue::new(),
                deliver: Rc::new(deliver),
                report: Rc::new(report),
            })),
        };
        courier.spawn().ok_or(NoWorker::NotBuilt)?;
        Ok(courier)
    }

    fn spawn(&self) -> Option<()> {
        let weak = Rc::downgrade(&self.inner);
        let bridge = spawn_worker(move |news| {
            if let Some(inner) = weak.upgrade() {
                match news {
                    WorkerNews::Answer(answer) => Courier { inner }.arrived(*answer),
                    WorkerNews::Progress {
                        ticket,
                        done,
                        total,
                    } => Courier { inner }.progressed(ticket, done, total),
                    // Board batches go to other workers, never to this one.
                    WorkerNews::Rows { .. } => {}
                }
            }
        })?;
        self.inner.borrow_mut().bridge = Some(bridge);
        Some(())
    }

    /// Asks for a plan (the ticket is filled in by the queue).
    pub fn ask(&self, ask: PlanAsk) {
        let mut inner = self.inner.borrow_mut();
        if let Some(now) = inner.queue.ask(ask, now_ms()) {
            inner.send(now);
        }
    }

    /// How long the worker has been silent while an ask is out (milliseconds); `None` when
    /// nothing is awaited. A live worker, once it has worked 100 ms on a plan, sends news after
    /// every candidate method and every rolling origin of the band.
    pub fn silent_for(&self) -> Option<f64> {
        self.inner.borrow().queue.silent_for(now_ms())
    }

    fn arrived(&self, answer: PlanAnswer) {
        let deliver = {
            let mut inner = self.inner.borrow_mut();
            match inner.queue.arrived(answer.ticket, now_ms()) {
                Arrival::Show => inner.deliver.clone(),
                Arrival::SendNext(next) => {
                    inner.send(*next);
                    return;
                }
                Arrival::Drop => return,
            }
        };
        // Outside the borrow: delivering updates the page, which may ask again at once.
        deliver(answer);
    }

    fn progressed(&self, ticket: u64, done: usize, total: usize) {
        let report = {
            let mut inner = self.inner.borrow_mut();
            if !inner.queue.progressed(ticket, now_ms()) {
                return;
            }
            inner.report.clone()
        };
        report(done, total);
    }

    /// Whether a fault on ask `ticket` concerns the current worker (the ask is the one out).
    pub fn is_current(&self, ticket: u64) -> bool {
        self.inner.borrow().queue.is_current(ticket)
    }

    /// Drops what was asked: the page's input has no plan to wait for any more.
    pub fn forget(&self) {
        self.inner.borrow_mut().queue.forget();
    }

    /// The worker stopped (its panic reached the page, or it fell silent): forget what was in
    /// flight and start a new worker; the caller says what happened.
    pub fn restart(&self) {
        {
            let mut inner = self.inner.borrow_mut();
            inner.queue.restart();
            inner.bridge = None;
        }
        self.spawn();
    }
}
