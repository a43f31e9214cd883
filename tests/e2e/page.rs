//! What every browser test needs: the built app (dist/), the browser tools, one page opened on
//! the static server, screenshots, and the command line's own answer on the same text.
//!
//! Kept apart from: the assertions (demo.rs and the sibling modules here). The
//! browser tests take turns (one Chromium at a time): the machine has 2 cores, and the
//! recompute measurement needs a quiet page.

use std::path::{Path, PathBuf};
use std::sync::{Mutex, MutexGuard};
use std::time::Duration;

use serde_json::Value;

use super::serve::StaticServer;
use super::webdriver::Browser;

/// How long a test waits for the page before it fails.
pub const WAIT: Duration = Duration::from_secs(30);

/// One browser test at a time.
static TURN: Mutex<()> = Mutex::new(());

/// The built app, or `None` (with a note) when it is missing and the run allows a skip.
pub fn dist() -> Option<PathBuf> {
    let d = Path::new(env!("CARGO_MANIFEST_DIR")).join("dist");
    if d.join("index.html").exists() {
        Some(d)
    } else {
        // scripts/test.sh sets this: there a missing build is a failure, never a skip.
        assert!(
            std::env::var_os("MORROWCAST_REQUIRE_DIST").is_none(),
            "dist/ is missing but MORROWCAST_REQUIRE_DIST is set: build the app first"
        );
        eprintln!(
            "SKIPPED browser end-to-end test: dist/ is missing. Build it with `trunk build --release` \
             (scripts/test.sh does) to run these tests."
        );
        None
    }
}

fn tool(env_key: &str, default: &str) -> String {
    let path = std::env::var(env_key).unwrap_or_else(|_| default.to_string());
    assert!(
        Path::new(&path).exists(),
        "{path} is missing: install Debian's chromium and chromium-driver (scripts/test.sh does), or set {env_key}"
    );
    path
}

/// A page of the app in headless Chromium. Fields drop in order: the browser closes before
/// the next test gets its turn.
pub struct Page {
    pub server: StaticServer,
    pub browser: Browser,
    _turn: MutexGuard<'static, ()>,
}

/// Opens the app at the given window size; `None` when dist/ is missing (see [`dist`]).
pub fn open(window: (u32, u32)) -> Option<Page> {
    open_at(window, "")
}

/// Opens the app with `fragment` after its address (such as `#drill=page-fault`).
pub fn open_at(window: (u32, u32), fragment: &str) -> Option<Page> {
    let dist = dist()?;
    // A test that failed while holding the turn leaves nothing behind (its browser is closed).
    let turn = TURN.lock().unwrap_or_else(|e| e.into_inner());
    let server = StaticServer::start(&dist);
    let browser = Browser::start(
        &tool("CHROMEDRIVER", "/usr/bin/chromedriver"),
        &tool("CHROMIUM", "/usr/bin/chromium"),
        window,
    );
    browser.goto(&format!("{}/index.html{fragment}", server.origin));
    Some(Page {
        server,
        browser,
        _turn: turn,
    })
}

/// Saves the window as tests/screenshots/NAME (not committed; for review).
pub fn save_screenshot(browser: &Browser, name: &str) {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/screenshots");
    std::fs::create_dir_all(&dir).unwrap();
    let png = browser.screenshot();
    assert!(png.starts_with(b"\x89PNG"), "screenshot is not a PNG");
    std::fs::write(dir.join(name), png).unwrap();
}

/// A JSON number as f64 (NaN for anything else, so a comparison with it fails).
pub fn number(v: &Value) -> f64 {
    v.as_f64().unwrap_or(f64::NAN)
}

/// Puts text in the Intake box as a paste does (the page reads it on `input`).
pub fn paste(browser: &Browser, text: &str) {
    browser.js_args(
        "const t = document.getElementById('intake-text'); t.value = arguments[0]; \
         t.dispatchEvent(new Event('input', { bubbles: true }));",
        serde_json::json!([text]),
    );
}

/// Waits until the page shows a plan for the named item and no work is pending.
pub fn wait_for_item(browser: &Browser, name: &str) {
    browser.wait_for_args(
        &format!("the plan of {name}"),
        "const h = document.getElementById('item-name'); \
         return !!h && h.textContent === arguments[0] \
           && !document.getElementById('busy').classList.contains('on') \
           && document.querySelectorAll('#forecast-table tbody tr').length > 0",
        serde_json::json!([name]),
        WAIT,
    );
}

/// The rows of the forecast table as shown: [period, forecast, low, high] text.
pub fn forecast_table(browser: &Browser) -> Vec<Vec<String>> {
    let rows = browser.js(
        "return [...document.querySelectorAll('#forecast-table tbody tr')]\
           .map(r => [...r.children].map(c => c.textContent))",
    );
    rows.as_array()
        .unwrap()
        .iter()
        .map(|r| {
            r.as_array()
                .unwrap()
                .iter()
                .map(|c| c.as_str().unwrap_or("").to_string())
                .collect()
        })
        .collect()
}

/// `morrowcast forecast - --json --item ITEM` on `text` (the command line in-process): the
/// item's plan object.
pub fn engine_plan(text: &str, item: &str) -> Value {
    let out = crate::support::cli(
        &["forecast", "-", "--item", item, "--json"],
        text.as_bytes(),
    );
    assert_eq!(out.code, 0, "morrowcast forecast failed: {}", out.stderr);
    let json = out.json();
    let plan = json["items"]
        .as_array()
        .and_then(|items| items.iter().find(|p| p["name"] == item))
        .unwrap_or_else(|| panic!("no plan for {item} in {json}"))
        .clone();
    plan
}
