//! Faults in the page and in its worker: each is reported in words, the user's text stays in the
//! Intake box, and (for the worker) the next change computes again.
//!
//! Kept apart from: how faults are caused. The page has two drills for this (src/app/browser.rs
//! `drill`): `#drill=page-fault` panics in the page after it has drawn, `#drill=worker-fault`
//! makes the worker panic on its first plan, `#drill=worker-silent` makes it never answer it,
//! `#drill=reader-silent` sends the reading worker nothing.
//! No input is known to panic; the drills stand in.

use super::page::{open_at, save_screenshot, wait_for_item, WAIT};

/// A panic in the page shows the fault notice with what to do; the data stays in the box.
#[test]
fn a_page_fault_shows_the_notice_and_keeps_the_text() {
    let Some(mut page) = open_at((1366, 768), "#drill=page-fault") else {
        return;
    };
    // The panic hook logs the panic; the aborted wasm throws "unreachable" as it stops.
    page.expect_console_errors(&["fault drill", "RuntimeError: unreachable"]);
    let browser = &page.browser;
    browser.wait_for(
        "the fault notice",
        "return !document.getElementById('fault-notice').hidden",
        WAIT,
    );
    let notice = browser.js("return document.getElementById('fault-notice').textContent");
    let notice = notice.as_str().unwrap_or("");
    assert!(notice.contains("still in the Intake box"), "{notice}");
    assert!(
        notice.contains("fault drill"),
        "the detail names the fault: {notice}"
    );
    // The page is still there (not blank) and so is the text.
    let text = browser.js("return document.getElementById('intake-text').value");
    assert!(text.as_str().unwrap_or("").starts_with("month,"), "{text}");
    save_screenshot(browser, "fault-page.png");
}

/// A panic in the worker is reported where the plan would be, and a new worker takes over.
#[test]
fn a_worker_fault_is_reported_and_the_next_change_computes_again() {
    let Some(mut page) = open_at((1366, 768), "#drill=worker-fault") else {
        return;
    };
    // The worker's panic reaches the page as an error event it does not handle.
    page.expect_console_errors(&["morrowcast worker, ask 1: panicked"]);
    let browser = &page.browser;
    let said = browser.wait_for(
        "the worker's fault in the headline",
        "const p = document.querySelector('#headline .problem'); return p && p.textContent",
        WAIT,
    );
    let said = said.as_str().unwrap_or("");
    assert!(
        said.contains("the computation stopped on a fault"),
        "{said}"
    );
    assert!(said.contains("fault drill"), "{said}");
    assert!(said.contains("Your data is kept"), "{said}");
    save_screenshot(browser, "fault-worker.png");
    // The notice for page faults stays hidden: the page itself is fine.
    let hidden = browser.js("return document.getElementById('fault-notice').hidden");
    assert_eq!(hidden, serde_json::json!(true));
    browser.js("document.getElementById('level-80').click()");
    wait_for_item(browser, "Seed packets");
}

/// A worker that never answers (as one that did not start would look) is reported after its
/// silence limit (15 s, src/app/state.rs), and a fresh worker computes the next change.
#[test]
fn a_silent_worker_is_reported_and_replaced() {
    let Some(page) = open_at((1366, 768), "#drill=worker-silent") else {
        return;
    };
    let browser = &page.browser;
    let said = browser.wait_for(
        "the silent worker in the headline",
        "const p = document.querySelector('#headline .problem'); return p && p.textContent",
        WAIT,
    );
    let said = said.as_str().unwrap_or("");
    assert!(said.contains("has not answered for 15 seconds"), "{said}");
    assert!(said.contains("Your data is kept"), "{said}");
    let busy = browser.js("return document.getElementById('busy').classList.contains('on')");
    assert_eq!(
        busy,
        serde_json::json!(false),
        "the progress indicator stays up"
    );
    browser.js("document.getElementById('level-80').click()");
    wait_for_item(browser, "Seed packets");
}

/// A reading worker that never answers (`#drill=reader-silent`: the page sends it nothing) is
/// given up after its silence limit (2 s under the drill, 120 s otherwise, src/page/reader.rs):
/// the dropped workbook is refused saying so, the desk kept, instead of "Reading the
/// workbook…" for ever (a code review found it so).
#[test]
fn a_silent_reading_worker_is_said() {
    let Some(page) = open_at((1366, 768), "#drill=reader-silent") else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let book = super::engine_match::workbooks_fixture("sales.xlsx");
    super::engine_match::drop_on(browser, "drop-zone", &book, "sales.xlsx");
    let said = browser.wait_for(
        "the silent reading worker said",
        "const n = document.getElementById('work-notice'); \
         return n && n.textContent.includes('did not answer') && n.textContent",
        WAIT,
    );
    let said = said.as_str().unwrap_or("");
    assert!(
        said.contains("sales.xlsx could not be read") && said.contains("within 2 s"),
        "{said}"
    );
    wait_for_item(browser, "Seed packets");
}

/// The page's Content-Security-Policy binds its worker: a worker started as the page starts its
/// own (a `blob:` module importing the worker's boot module, src/app/courier.rs) may load the
/// page's files but not connect anywhere, not even to the page's own host.
#[test]
fn the_page_policy_binds_its_worker() {
    let Some(mut page) = super::page::open((800, 600)) else {
        return;
    };
    // The test worker's fetch is refused, and the browser logs the refusal.
    page.expect_console_errors(&["connect-src 'none'", "Refused to connect"]);
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    browser.js(
        r#"
        window.__worker = [];
        const meta = document.querySelector('meta[name="morrowcast-worker"]').content;
        const boot = new URL(meta, document.baseURI).href;
        const src = 'import("' + boot + '").then(() => self.postMessage("imported"), e => self.postMessage("import failed " + e));'
          + 'fetch("' + boot + '").then(() => self.postMessage("fetch allowed"), () => self.postMessage("fetch blocked"));';
        const url = URL.createObjectURL(new Blob([src], { type: 'text/javascript' }));
        const w = new Worker(url, { type: 'module' });
        w.onmessage = (e) => { if (typeof e.data === 'string') window.__worker.push(e.data); };
        "#,
    );
    let seen = browser.wait_for(
        "the test worker's two reports",
        "return window.__worker.length >= 2 && window.__worker.slice().sort()",
        WAIT,
    );
    assert_eq!(seen, serde_json::json!(["fetch blocked", "imported"]));
}
