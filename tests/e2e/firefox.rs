//! The single file (dist/morrowcast.html) in Firefox, opened from disk: the demo planned by its
//! worker, the Item board filled by the pool, the work kept for a reload, a share link's
//! fragment opened. Firefox ESR (Debian's firefox-esr) through geckodriver; scripts/test.sh
//! installs both.
//!
//! Kept apart from: the Chromium tests, whose console watch needs Chromium's DevTools; here
//! only errors and policy violations raised after the page loaded are caught (a listener the
//! test installs), so the console check is weaker than Chromium's.

use std::path::Path;
use std::time::Duration;

use serde_json::json;

use super::page::{assert_work_notice, demo_link, dist, open_link, turn};
use super::webdriver::Browser;

const WAIT: Duration = Duration::from_secs(60);

/// A program found on PATH.
fn on_path(name: &str) -> Option<String> {
    std::env::var_os("PATH").and_then(|paths| {
        std::env::split_paths(&paths)
            .map(|d| d.join(name))
            .find(|p| p.exists())
            .map(|p| p.to_string_lossy().into_owned())
    })
}

fn wait_for_planned(browser: &Browser, item: &str) {
    browser.wait_for_args(
        "the item planned and every item on the board",
        "const h = document.getElementById('item-name'); const p = document.getElementById('board-progress'); \
         return !!h && h.textContent === arguments[0] && !!p && p.textContent.startsWith('Planned all 6 items') \
           && document.querySelectorAll('#forecast-table tbody tr').length > 0",
        json!([item]),
        WAIT,
    );
}

const WATCH: &str = "window.__seen = []; \
    document.addEventListener('securitypolicyviolation', e => window.__seen.push('policy: ' + e.violatedDirective + ' ' + e.blockedURI)); \
    window.addEventListener('error', e => window.__seen.push('error: ' + e.message)); \
    window.addEventListener('unhandledrejection', e => window.__seen.push('rejection: ' + e.reason));";

#[test]
fn the_single_file_runs_from_disk_in_firefox() {
    let Some(dist) = dist() else {
        return;
    };
    let (Some(driver), Some(firefox)) = (on_path("geckodriver"), on_path("firefox-esr")) else {
        assert!(
            std::env::var_os("MORROWCAST_REQUIRE_DIST").is_none(),
            "geckodriver or firefox-esr is missing: scripts/test.sh installs them"
        );
        eprintln!("SKIPPED the Firefox test: geckodriver or firefox-esr is missing");
        return;
    };
    let _turn = turn();
    let file = dist.join("morrowcast.html");
    assert!(Path::new(&file).exists(), "{} is missing", file.display());
    let address = format!("file://{}", file.display());
    let browser = Browser::start_firefox(&driver, &firefox, (1366, 900));
    browser.goto(&address);
    browser.js(WATCH);
    wait_for_planned(&browser, "Seed packets");
    let rows = browser.js("return document.querySelectorAll('#forecast-table tbody tr').length");
    assert_eq!(rows, json!(12));
    // Kept in this browser: a reload brings the work back.
    browser.wait_for(
        "the work kept",
        "const s = document.getElementById('kept-status'); return !!s && s.textContent.startsWith('Kept at')",
        WAIT,
    );
    assert_eq!(browser.js("return window.__seen"), json!([]));
    open_link(&browser, &address);
    browser.js(WATCH);
    wait_for_planned(&browser, "Seed packets");
    assert_work_notice(&browser, "Opened the work kept in this browser:");
    // A share link's fragment on the file.
    open_link(
        &browser,
        &demo_link(&["--item", "Gift card", "--page", &address]),
    );
    browser.js(WATCH);
    wait_for_planned(&browser, "Gift card");
    assert_eq!(browser.js("return window.__seen"), json!([]));
}
