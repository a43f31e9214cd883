//! Keeping the work in this browser: IndexedDB, one database of this site, two records (the
//! history's text, written only when it changed, and the rest of the desk as a work file
//! whose history text is left empty), plus one small preference in localStorage (whether to
//! keep at all).
//!
//! Why IndexedDB and not localStorage: a 10,000-item file of five years is about 14 MB of
//! text, beyond what Chromium's localStorage holds for a site (measured here: session storage
//! refused a 14 MB text), and localStorage writes on the page's only thread (32 ms for 1.4 MB,
//! measured), while IndexedDB writes beside it and holds hundreds of MB.
//!
//! Kept apart from: what a work holds (crates/work) and when it is written (state/work.rs
//! decides; this only reads, writes and forgets). Nothing here reaches the network.

use js_sys::Promise;
use wasm_bindgen::prelude::*;
use wasm_bindgen::JsCast;
use wasm_bindgen_futures::JsFuture;
use web_sys::{IdbDatabase, IdbObjectStore, IdbRequest, IdbTransaction, IdbTransactionMode};

/// The database, its one store and the two records' keys.
const DATABASE: &str = "morrowcast";
const STORE: &str = "work";
const DESK_KEY: &str = "desk";
const HISTORY_KEY: &str = "history";
/// Which writing of the history is kept: a tab writes its desk alone only while this is the
/// stamp of its own last history, so two tabs never leave one's desk with the other's history.
const HISTORY_STAMP_KEY: &str = "history-stamp";
/// The desk a share link replaced, set aside so it can be brought back.
const ASIDE_DESK_KEY: &str = "desk-before-link";
const ASIDE_HISTORY_KEY: &str = "history-before-link";
/// localStorage key of the preference (present with "no": the user asked not to keep work).
const KEEP_KEY: &str = "morrowcast.keep-work";

/// Whether the user lets this browser keep the work (the default: yes).
pub fn keeping_allowed() -> bool {
    local()
        .and_then(|s| s.get_item(KEEP_KEY).ok().flatten())
        .as_deref()
        != Some("no")
}

/// Records the preference; false when the browser would not store it.
pub fn allow_keeping(allowed: bool) -> bool {
    let Some(s) = local() else {
        return false;
    };
    if allowed {
        s.remove_item(KEEP_KEY).is_ok()
    } else {
        s.set_item(KEEP_KEY, "no").is_ok()
    }
}

fn local() -> Option<web_sys::Storage> {
    web_sys::window().and_then(|w| w.local_storage().ok().flatten())
}

fn message(value: &JsValue) -> String {
    value
        .dyn_ref::<web_sys::DomException>()
        .map(|e| format!("{}: {}", e.name(), e.message()))
        .or_else(|| value.as_string())
        .unwrap_or_else(|| "the browser gave no reason".into())
}

/// A promise with its two settling functions, for handlers that outlive the promise's own
/// callback.
fn promise() -> (Promise, js_sys::Function, js_sys::Function) {
    let mut settle = None;
    let promise = Promise::new(&mut |resolve, reject| settle = Some((resolve, reject)));
    // Promise::new calls back at once; the fallback is never used.
    let (resolve, reject) =
        settle.unwrap_or_else(|| (js_sys::Function::default(), js_sys::Function::default()));
    (promise, resolve, reject)
}

/// A handler that settles with `settle(value)` (Rust keeps it; dropped after the await, so a
/// handler that never fired does not keep the request, and a read's text, alive).
fn handler(
    settle: js_sys::Function,
    value: impl Fn() -> JsValue + 'static,
) -> Closure<dyn FnMut()> {
    Closure::new(move || {
        let _ = settle.call1(&JsValue::NULL, &value());
    })
}

/// The request's result once it succeeds, or its error's words.
async fn settled(request: &IdbRequest) -> Result<JsValue, String> {
    let (promise, resolve, reject) = promise();
    let (done, failed) = (request.clone(), request.clone());
    let ok = handler(resolve, move || done.result().unwrap_or(JsValue::UNDEFINED));
    let bad = handler(reject, move || {
        let why = failed.error().ok().flatten().map(JsValue::from);
        JsValue::from_str(&message(&why.unwrap_or(JsValue::UNDEFINED)))
    });
    request.set_onsuccess(Some(ok.as_ref().unchecked_ref()));
    request.set_onerror(Some(bad.as_ref().unchecked_ref()));
    let out = JsFuture::from(promise).await;
    request.set_onsuccess(None);
    request.set_onerror(None);
    drop((ok, bad));
    out.map_err(|e| message(&e))
}

/// Waits until the transaction is written (its `complete`), or why it was not.
async fn committed(tx: &IdbTransaction) -> Result<(), String> {
    let (promise, resolve, reject) = promise();
    let why = {
        let t = tx.clone();
        move || {
            let why = t.error().map(JsValue::from).unwrap_or(JsValue::UNDEFINED);
            JsValue::from_str(&message(&why))
        }
    };
    let ok = handler(resolve, || JsValue::UNDEFINED);
    let aborted = handler(reject.clone(), why.clone());
    let failed = handler(reject, why);
    tx.set_oncomplete(Some(ok.as_ref().unchecked_ref()));
    tx.set_onabort(Some(aborted.as_ref().unchecked_ref()));
    tx.set_onerror(Some(failed.as_ref().unchecked_ref()));
    let out = JsFuture::from(promise).await;
    tx.set_oncomplete(None);
    tx.set_onabort(None);
    tx.set_onerror(None);
    drop((ok, aborted, failed));
    out.map(|_| ()).map_err(|e| message(&e))
}

async fn open() -> Result<IdbDatabase, String> {
    let factory = web_sys::window()
        .ok_or("no window")?
        .indexed_db()
        .map_err(|e| message(&e))?
        .ok_or("this browser keeps no databases for this page")?;
    let request = factory
        .open_with_u32(DATABASE, 1)
        .map_err(|e| message(&e))?;
    let r = request.clone();
    let upgrade = Closure::once_into_js(move || {
        if let Ok(db) = r.result() {
            let db: IdbDatabase = db.unchecked_into();
            if !db.object_store_names().contains(STORE) {
                let _ = db.create_object_store(STORE);
            }
        }
    });
    request.set_onupgradeneeded(Some(upgrade.unchecked_ref()));
    Ok(settled(&request).await?.unchecked_into())
}

/// Runs `ops` on the store in one read-write transaction and waits until it is written: all
/// of it, or on any error none of it (the transaction is aborted). The database is closed
/// in every case.
async fn change(ops: impl FnOnce(&IdbObjectStore) -> Result<(), JsValue>) -> Result<(), String> {
    let db = open().await?;
    let done = async {
        let tx = db
            .transaction_with_str_and_mode(STORE, IdbTransactionMode::Readwrite)
            .map_err(|e| message(&e))?;
        let store = tx.object_store(STORE).map_err(|e| message(&e))?;
        if let Err(e) = ops(&store) {
            let _ = tx.abort();
            return Err(message(&e));
        }
        committed(&tx).await
    }
    .await;
    db.close();
    done
}

/// The results of the requests `ask` makes in one read-only transaction, in order. The
/// database is closed in every case.
async fn look(
    ask: impl FnOnce(&IdbObjectStore) -> Result<Vec<IdbRequest>, JsValue>,
) -> Result<Vec<JsValue>, String> {
    let db = open().await?;
    let found = async {
        let tx = db.transaction_with_str(STORE).map_err(|e| message(&e))?;
        let store = tx.object_store(STORE).map_err(|e| message(&e))?;
        let mut results = Vec::new();
        for request in ask(&store).map_err(|e| message(&e))? {
            results.push(settled(&request).await?);
        }
        Ok(results)
    }
    .await;
    db.close();
    found
}

fn put(store: &IdbObjectStore, key: &str, value: &str) -> Result<(), JsValue> {
    store
        .put_with_key(&JsValue::from_str(value), &JsValue::from_str(key))
        .map(|_| ())
}

fn delete(store: &IdbObjectStore, keys: &[&str]) -> Result<(), JsValue> {
    keys.iter()
        .try_for_each(|key| store.delete(&JsValue::from_str(key)).map(|_| ()))
}

fn get(store: &IdbObjectStore, key: &str) -> Result<IdbRequest, JsValue> {
    store.get(&JsValue::from_str(key))
}

/// Writes the desk (a work file's text) and, when given, the history's text with its stamp,
/// in one transaction: all or nothing.
pub async fn write(desk: String, history: Option<(String, String)>) -> Result<(), String> {
    change(|store| {
        if let Some((text, stamp)) = &history {
            put(store, HISTORY_KEY, text)?;
            put(store, HISTORY_STAMP_KEY, stamp)?;
        }
        put(store, DESK_KEY, &desk)
    })
    .await
}

/// The stamp of the history kept now, if any.
pub async fn history_stamp() -> Result<Option<String>, String> {
    let found = look(|store| Ok(vec![get(store, HISTORY_STAMP_KEY)?])).await?;
    Ok(found.first().and_then(JsValue::as_string))
}

/// A new stamp for a history about to be written (the time and a random number: two tabs
/// never draw the same).
pub fn new_stamp() -> String {
    format!(
        "{:x}-{:x}",
        js_sys::Date::now() as u64,
        (js_sys::Math::random() * 4_503_599_627_370_496.0) as u64
    )
}

/// The kept desk and history text, if both are there.
pub async fn read() -> Result<Option<(String, String)>, String> {
    read_pair(DESK_KEY, HISTORY_KEY).await
}

async fn read_pair(desk_key: &str, history_key: &str) -> Result<Option<(String, String)>, String> {
    let found = look(|store| Ok(vec![get(store, desk_key)?, get(store, history_key)?])).await?;
    let text = |i: usize| found.get(i).and_then(JsValue::as_string);
    Ok(text(0).zip(text(1)))
}

/// Sets the kept desk aside (before a share link's desk is kept in its place); true when
/// there was one. A desk already set aside stays (it is the user's own, from before the
/// first link; a later link's desk is not put in its place).
pub async fn set_aside() -> Result<bool, String> {
    if has_aside().await? {
        return Ok(true);
    }
    let Some((desk, history)) = read().await? else {
        return Ok(false);
    };
    change(|store| {
        put(store, ASIDE_DESK_KEY, &desk)?;
        put(store, ASIDE_HISTORY_KEY, &history)
    })
    .await
    .map(|()| true)
}

/// Whether a desk is set aside (counted, not read: it may be megabytes).
pub async fn has_aside() -> Result<bool, String> {
    let found = look(|store| {
        Ok(vec![
            store.count_with_key(&JsValue::from_str(ASIDE_DESK_KEY))?
        ])
    })
    .await?;
    Ok(found.first().and_then(JsValue::as_f64).unwrap_or(0.0) > 0.0)
}

/// Removes the desk set aside.
pub async fn discard_aside() -> Result<(), String> {
    change(|store| delete(store, &[ASIDE_DESK_KEY, ASIDE_HISTORY_KEY])).await
}

/// The desk set aside by [`set_aside`], if any.
pub async fn aside() -> Result<Option<(String, String)>, String> {
    read_pair(ASIDE_DESK_KEY, ASIDE_HISTORY_KEY).await
}

/// Removes the current desk only (a write the browser refused), leaving a desk set aside by
/// a share link where it is.
pub async fn forget_current() -> Result<(), String> {
    change(|store| delete(store, &[DESK_KEY, HISTORY_KEY, HISTORY_STAMP_KEY])).await
}

/// Removes everything kept.
pub async fn forget() -> Result<(), String> {
    change(|store| store.clear().map(|_| ())).await
}
