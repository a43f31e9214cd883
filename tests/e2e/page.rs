//! What every browser test needs: the built app (dist/), the browser tools, one page opened on
//! the static server with its console watched, screenshots, and the command line's own answer
//! on the same text.
//!
//! Kept apart from: the assertions (demo.rs and the sibling modules here). The
//! browser tests take turns (one Chromium at a time): the machine has 2 cores, and the
//! recompute measurement needs a quiet page.
//!
//! The console check: every page is opened with a watcher installed before any of the page's
//! own scripts (a DevTools "script on new document"), which records each
//! `securitypolicyviolation` event, uncaught error and unhandled rejection; and the browser's
//! console log is kept (chromedriver's `goog:loggingPrefs`). When a test's [`Page`] is dropped,
//! at the end of the test, both are read and any finding fails the test, unless the test
//! declared it with [`Page::expect_console_errors`] (only the fault drills do).

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

/// This test's turn with the browsers (one browser test at a time).
pub fn turn() -> MutexGuard<'static, ()> {
    TURN.lock().unwrap_or_else(|e| e.into_inner())
}

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

/// A page of the app in headless Chromium. Its console is checked when it is dropped (see the
/// module's documentation). Fields drop in order: the browser closes before the next test gets
/// its turn.
pub struct Page {
    pub server: StaticServer,
    pub browser: Browser,
    /// Parts of the console findings this test provokes on purpose.
    expected: Vec<&'static str>,
    _turn: MutexGuard<'static, ()>,
}

/// Installed before the page's own scripts run, in every document the page opens: records
/// what the console check looks at (the events carry more than the log line: the directive,
/// the source and a sample of what was refused).
const WATCH_CONSOLE: &str = r#"
(() => {
  const seen = [];
  Object.defineProperty(window, '__morrowcastConsole', { value: seen });
  document.addEventListener('securitypolicyviolation', (e) => {
    seen.push('securitypolicyviolation: ' + e.effectiveDirective + ' refused '
      + (e.blockedURI || 'an inline part') + ' (' + (e.sourceFile || 'no source') + ':'
      + e.lineNumber + (e.sample ? ', sample "' + e.sample + '"' : '') + ')');
  }, true);
  window.addEventListener('error', (e) => {
    if (e.target !== window) {
      seen.push('failed to load ' + (e.target.src || e.target.href || e.target.tagName));
    } else {
      seen.push('uncaught error: ' + e.message + ' (' + e.filename + ':' + e.lineno + ')');
    }
  }, true);
  window.addEventListener('unhandledrejection', (e) => {
    seen.push('unhandled rejection: ' + e.reason);
  });
})();
"#;

/// Opens the app at the given window size; `None` when dist/ is missing (see [`dist`]).
pub fn open(window: (u32, u32)) -> Option<Page> {
    open_with(window, "", 1.0)
}

/// Opens the app with `fragment` after its address (such as `#drill=page-fault`).
pub fn open_at(window: (u32, u32), fragment: &str) -> Option<Page> {
    open_with(window, fragment, 1.0)
}

/// Opens the app on a screen of `device_scale` device pixels per CSS pixel (2: HiDPI).
pub fn open_with(window: (u32, u32), fragment: &str, device_scale: f64) -> Option<Page> {
    open_address(window, device_scale, None, &|server, _| {
        format!("{}/index.html{fragment}", server.origin)
    })
}

/// Opens the single file `dist/morrowcast.html` from disk (`file://`), with `fragment`.
pub fn open_file(window: (u32, u32), fragment: &str) -> Option<Page> {
    open_file_in(window, fragment, None)
}

/// [`open_file`] in a browser whose profile lives in `profile` and outlives it (`None`: a
/// fresh one).
pub fn open_file_in(window: (u32, u32), fragment: &str, profile: Option<&Path>) -> Option<Page> {
    open_address(window, 1.0, profile, &|_, dist| {
        let file = dist.join("morrowcast.html");
        assert!(
            file.exists(),
            "{} is missing: the build makes it",
            file.display()
        );
        format!("file://{}{fragment}", file.display())
    })
}

fn open_address(
    window: (u32, u32),
    device_scale: f64,
    profile: Option<&Path>,
    address: &dyn Fn(&StaticServer, &Path) -> String,
) -> Option<Page> {
    let dist = dist()?;
    // A test that failed while holding the turn leaves nothing behind (its browser is closed).
    let turn = TURN.lock().unwrap_or_else(|e| e.into_inner());
    let server = StaticServer::start(&dist);
    let browser = Browser::start_in(
        &tool("CHROMEDRIVER", "/usr/bin/chromedriver"),
        &tool("CHROMIUM", "/usr/bin/chromium"),
        window,
        device_scale,
        profile.map(Path::to_path_buf),
    );
    browser.devtools(
        "Page.addScriptToEvaluateOnNewDocument",
        serde_json::json!({ "source": WATCH_CONSOLE }),
    );
    browser.goto(&address(&server, &dist));
    Some(Page {
        server,
        browser,
        expected: Vec::new(),
        _turn: turn,
    })
}

impl Page {
    /// Declares console findings this test provokes on purpose (a fault drill): a finding that
    /// contains one of `parts` passes the console check, and each part must be found (so a
    /// declaration cannot outlive the fault it names).
    pub fn expect_console_errors(&mut self, parts: &[&'static str]) {
        self.expected.extend_from_slice(parts);
    }

    /// What the page's console holds: the watcher's records, then the browser's console log
    /// entries at error level.
    fn console_findings(&self) -> Result<Vec<String>, String> {
        let watched = self
            .browser
            .try_js("return window.__morrowcastConsole || ['the console watcher is missing']")?;
        let mut findings: Vec<String> = watched
            .as_array()
            .map(|a| {
                a.iter()
                    .map(|v| v.as_str().unwrap_or_default().to_string())
                    .collect()
            })
            .unwrap_or_default();
        for entry in self.browser.try_console_log()? {
            if entry["level"] == "SEVERE" {
                findings.push(format!(
                    "console error ({}): {}",
                    entry["source"].as_str().unwrap_or("?"),
                    entry["message"].as_str().unwrap_or_default()
                ));
            }
        }
        Ok(findings)
    }
}

/// Findings as lines, identical ones counted once ("22 x ...").
fn grouped(findings: &[&String]) -> String {
    let mut groups: Vec<(&String, usize)> = Vec::new();
    for f in findings {
        match groups.iter_mut().find(|(g, _)| g == f) {
            Some((_, n)) => *n += 1,
            None => groups.push((f, 1)),
        }
    }
    groups
        .iter()
        .map(|(f, n)| format!("\n  {n} x {f}"))
        .collect()
}

impl Drop for Page {
    /// The console check, at the end of every test: here so that no test can leave it out.
    fn drop(&mut self) {
        let findings = self.console_findings();
        if std::thread::panicking() {
            // The test failed already; say what the console held, for the diagnosis, without
            // a second panic.
            if let Ok(f) = &findings {
                if !f.is_empty() {
                    eprintln!(
                        "the page's console held:{}",
                        grouped(&f.iter().collect::<Vec<_>>())
                    );
                }
            }
            return;
        }
        let findings =
            findings.unwrap_or_else(|e| panic!("the page's console could not be read: {e}"));
        let (declared, unexpected): (Vec<&String>, Vec<&String>) = findings
            .iter()
            .partition(|f| self.expected.iter().any(|part| f.contains(part)));
        let missing: Vec<&&str> = self
            .expected
            .iter()
            .filter(|part| !declared.iter().any(|f| f.contains(**part)))
            .collect();
        assert!(
            unexpected.is_empty(),
            "the page's console is not clean: {} finding(s) (securitypolicyviolation events, \
             uncaught errors, console errors):{}",
            unexpected.len(),
            grouped(&unexpected)
        );
        assert!(
            missing.is_empty(),
            "the console findings this test declared did not appear: {missing:?} (it held:{})",
            grouped(&findings.iter().collect::<Vec<_>>())
        );
    }
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

/// Pastes `text` into the Intake box as the browser delivers a user's paste: a `paste` event
/// carrying it (the page may take a large text without the browser putting it in the box).
pub fn paste_event(browser: &Browser, text: &str) {
    let taken = browser.js_args(
        "const t = document.getElementById('intake-text'); t.focus(); t.select(); \
         const dt = new DataTransfer(); dt.setData('text/plain', arguments[0]); \
         const ev = new ClipboardEvent('paste', { clipboardData: dt, bubbles: true, cancelable: true }); \
         return !t.dispatchEvent(ev);",
        serde_json::json!([text]),
    );
    // A paste the page left to the browser: the browser's own insertion, as an input event.
    if taken != serde_json::json!(true) {
        paste(browser, text);
    }
}

/// The Intake panel's notice of the last work opened or refused (empty when there is none).
pub fn work_notice(browser: &Browser) -> String {
    browser
        .js("const n = document.getElementById('work-notice'); return n ? n.textContent : ''")
        .as_str()
        .unwrap_or("")
        .to_string()
}

/// Asserts that the work notice begins with `start`.
pub fn assert_work_notice(browser: &Browser, start: &str) {
    let notice = work_notice(browser);
    assert!(notice.starts_with(start), "the work notice: {notice:?}");
}

/// A share link to the demo's desk, made by `morrowcast link - ARGS` (the command line's own
/// link, so the page is checked against it).
pub fn demo_link(args: &[&str]) -> String {
    let demo = morrowcast_engine::demo::demo_csv();
    let argv: Vec<&str> = ["link", "-"].iter().chain(args).copied().collect();
    let made = crate::support::cli(&argv, demo.as_bytes());
    assert_eq!(made.code, 0, "{}", made.stderr);
    made.text().trim().to_string()
}

/// Opens `link` in a fresh page load (by way of about:blank: an address that differs only in
/// its fragment would not load the page again).
pub fn open_link(browser: &Browser, link: &str) {
    browser.goto("about:blank");
    browser.goto(link);
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
    crate::support::item_named(&out.json(), item).clone()
}
