//! The Item board's benchmark in the browser (issue targets: 1,000 items of 60 months planned
//! in under 3 s on this machine's 2 cores with the page answering input within 100 ms; 10,000
//! items without exhausting memory; one item's detail opened from the board in under 100 ms).
//! Measured and printed, never asserted: timing targets live in benchmarks, and this is one
//! that needs the browser harness, so it sits here, ignored unless asked for:
//!
//! ```text
//! cargo test --release --test checks e2e::board_speed -- --ignored --nocapture
//! ```
//!
//! The README records its figures. Main-thread responsiveness is measured two ways: the
//! browser's long tasks (PerformanceObserver "longtask", every task over 50 ms) and the delay of
//! a 25 ms timer re-armed throughout (how late the page would answer a key). Memory: the sum of
//! the proportional set size (Pss) of every Chromium process, sampled every 200 ms from /proc.

use std::sync::atomic::{AtomicBool, Ordering};
use std::sync::Arc;
use std::time::Duration;

use serde_json::json;

use super::board::wait_until_planned_within;
use super::page::{open, paste_event, save_screenshot, wait_for_item, WAIT};
use super::webdriver::Browser;

/// `n` items of 60 months in long layout (invented: a level, a season and noise from a fixed
/// formula, so every run plans the same file).
fn items(n: usize) -> String {
    let mut out = String::with_capacity(n * 60 * 24);
    out.push_str("item,month,units\n");
    for k in 0..n {
        let level = 20.0 + (k % 97) as f64 * 3.0;
        for t in 0..60usize {
            let season = [0., 4., 8., 12., 9., 5., 1., -3., -6., -8., -5., -2.][t % 12];
            let noise = ((t * 37 + k * 11) % 13) as f64 - 6.0;
            let v = (level + season * (1.0 + (k % 5) as f64 / 4.0) + noise).max(0.0);
            out.push_str(&format!(
                "Item {k:05},{}-{:02},{v}\n",
                2021 + t / 12,
                t % 12 + 1
            ));
        }
    }
    out
}

/// Kilobytes of Pss summed over every Chromium process.
fn chromium_pss_kb() -> u64 {
    let mut total = 0;
    for entry in std::fs::read_dir("/proc").into_iter().flatten().flatten() {
        let path = entry.path();
        let comm = std::fs::read_to_string(path.join("comm")).unwrap_or_default();
        if !comm.trim().starts_with("chromium") && !comm.trim().starts_with("chrome") {
            continue;
        }
        let rollup = std::fs::read_to_string(path.join("smaps_rollup")).unwrap_or_default();
        total += rollup
            .lines()
            .find(|l| l.starts_with("Pss:"))
            .and_then(|l| l.split_whitespace().nth(1))
            .and_then(|v| v.parse::<u64>().ok())
            .unwrap_or(0);
    }
    total
}

/// Samples [`chromium_pss_kb`] until stopped; returns the peak.
fn sample_memory(stop: Arc<AtomicBool>) -> std::thread::JoinHandle<u64> {
    std::thread::spawn(move || {
        let mut peak = 0;
        while !stop.load(Ordering::Relaxed) {
            peak = peak.max(chromium_pss_kb());
            std::thread::sleep(Duration::from_millis(200));
        }
        peak
    })
}

const WATCH: &str = "
window.__long = [];
new PerformanceObserver(l => { for (const e of l.getEntries()) window.__long.push(e.duration); })
  .observe({ type: 'longtask' });
window.__lag = 0;
window.__gaps = [];
let last = performance.now();
const tick = () => { const now = performance.now(); const lag = now - last - 25; if (lag > 100) window.__gaps.push([Math.round(last), Math.round(lag)]); window.__lag = Math.max(window.__lag, lag); last = now; window.__ticking = setTimeout(tick, 25); };
tick();
";

/// Pastes `n` items and waits for every row; prints the figures.
fn run(browser: &Browser, n: usize, wait: Duration) {
    let text = items(n);
    browser.js(WATCH);
    let stop = Arc::new(AtomicBool::new(false));
    let memory = sample_memory(stop.clone());
    let profiling = std::env::var("MORROWCAST_PROFILE").is_ok();
    if profiling {
        browser.devtools("Profiler.enable", json!({}));
        browser.devtools("Profiler.setSamplingInterval", json!({ "interval": 1000 }));
        browser.devtools("Profiler.start", json!({}));
    }
    let t0 = browser.js("return performance.now()").as_f64().unwrap();
    if std::env::var("MORROWCAST_HIDE_TEXT").is_ok() {
        browser.js("document.getElementById('intake-text').style.display = 'none'");
    }
    paste_event(browser, &text);
    wait_until_planned_within(browser, n, wait);
    let t1 = browser.js("return performance.now()").as_f64().unwrap();
    if profiling {
        let profile = browser.devtools("Profiler.stop", json!({}));
        print_profile(&profile["profile"]);
    }
    let worker_ms = browser.js("return document.getElementById('board-progress').dataset.workerMs");
    let board = browser.js(
        "const m = performance.getEntriesByName('morrowcast:board'); return m.length ? m[m.length - 1].duration : null",
    );
    let watch = browser.js(
        "clearTimeout(window.__ticking); return [window.__long.length, Math.max(0, ...window.__long), window.__lag]",
    );
    let parts = browser.js_args(
        "const out = {}; for (const m of performance.getEntriesByType('measure')) { \
           if (m.startTime < arguments[0]) continue; \
           const o = out[m.name] || (out[m.name] = [0, 0, 0]); o[0] += 1; o[1] += m.duration; o[2] = Math.max(o[2], m.duration); } \
         return Object.entries(out).map(([k, v]) => k.replace('morrowcast:', '') + ' ' + v[0] + 'x, ' + v[1].toFixed(0) + ' ms in all, longest ' + v[2].toFixed(0) + ' ms').join('; ');",
        json!([t0]),
    );
    stop.store(true, Ordering::Relaxed);
    let peak = memory.join().unwrap_or(0);
    let load = std::fs::read_to_string("/proc/loadavg").unwrap_or_default();
    eprintln!(
        "board, {n} items of 60 months ({:.1} MB pasted) on {} workers: paste to every row {:.2} s \
         (the pool's run {:.2} s; the workers' own time {:.1} ms per item); long tasks {} (longest {:.0} ms); worst timer delay {:.0} ms; \
         peak memory of Chromium (Pss, all processes) {:.0} MB (load average {})",
        text.len() as f64 / 1e6,
        browser.js("return navigator.hardwareConcurrency"),
        (t1 - t0) / 1000.0,
        board.as_f64().unwrap_or(f64::NAN) / 1000.0,
        worker_ms.as_str().and_then(|w| w.parse::<f64>().ok()).unwrap_or(f64::NAN) / n as f64,
        watch[0],
        watch[1].as_f64().unwrap_or(0.0),
        watch[2].as_f64().unwrap_or(0.0),
        peak as f64 / 1024.0,
        load.split_whitespace().take(3).collect::<Vec<_>>().join(" ")
    );
    eprintln!(
        "  main thread, the page's own measures: {}",
        parts.as_str().unwrap_or("")
    );
    let gaps = browser.js_args(
        "return window.__gaps.map(([at, lag]) => [at - arguments[0], lag])",
        json!([t0]),
    );
    let starts = browser.js_args("return performance.getEntriesByType('measure').filter(m => m.startTime >= arguments[0]).map(m => [m.name, Math.round(m.startTime - arguments[0]), Math.round(m.duration)])", json!([t0]));
    eprintln!("  timer gaps over 100 ms [ms after the paste, delay]: {gaps}; measures [name, start, duration]: {starts}");
}

/// The main thread's self time per function, the 25 largest (a sampling profile).
fn print_profile(profile: &serde_json::Value) {
    let nodes = profile["nodes"].as_array().cloned().unwrap_or_default();
    let mut name_of = std::collections::HashMap::new();
    for n in &nodes {
        let f = &n["callFrame"];
        name_of.insert(
            n["id"].as_i64().unwrap_or(0),
            format!(
                "{} ({}:{})",
                f["functionName"].as_str().unwrap_or(""),
                f["url"]
                    .as_str()
                    .unwrap_or("")
                    .rsplit('/')
                    .next()
                    .unwrap_or(""),
                f["lineNumber"]
            ),
        );
    }
    let samples = profile["samples"].as_array().cloned().unwrap_or_default();
    let deltas = profile["timeDeltas"]
        .as_array()
        .cloned()
        .unwrap_or_default();
    let mut self_ms: std::collections::HashMap<String, f64> = std::collections::HashMap::new();
    for (s, d) in samples
        .iter()
        .zip(deltas.iter().skip(1).chain(std::iter::once(&json!(0))))
    {
        let name = name_of
            .get(&s.as_i64().unwrap_or(0))
            .cloned()
            .unwrap_or_default();
        *self_ms.entry(name).or_default() += d.as_f64().unwrap_or(0.0) / 1000.0;
    }
    let mut top: Vec<_> = self_ms.into_iter().collect();
    top.sort_by(|a, b| b.1.total_cmp(&a.1));
    for (name, ms) in top.iter().take(25) {
        eprintln!("  {ms:8.0} ms  {name}");
    }
}

#[test]
#[ignore = "a benchmark: run with --ignored --nocapture (README, Benchmarks)"]
fn board_of_a_thousand_and_ten_thousand_items() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    run(browser, 1000, WAIT);
    save_screenshot(browser, "board-1000.png");
    // A share link of the whole 1,000-item desk: the page offers the work file instead, and
    // makes the link on the page's thread only when asked again.
    let offered = browser.js(
        "const t0 = performance.now(); document.getElementById('make-link').click(); return performance.now() - t0;",
    );
    browser.wait_for(
        "the offer of a work file",
        "return !!document.getElementById('make-link-anyway')",
        WAIT,
    );
    let made = browser.js(
        "const t0 = performance.now(); document.getElementById('make-link-anyway').click(); return performance.now() - t0;",
    );
    let length = browser.wait_for(
        "the link shown",
        "const l = document.getElementById('share-link'); return l ? l.value.length : null",
        WAIT,
    );
    eprintln!(
        "share link of the 1,000-item desk: the work file offered in {:.0} ms; the link made anyway in {:.0} ms, {length} characters",
        offered.as_f64().unwrap_or(f64::NAN),
        made.as_f64().unwrap_or(f64::NAN)
    );
    // One item's detail from the board: click to its Look-ahead table shown.
    let mut opened = Vec::new();
    for k in [17, 412, 903, 5, 650] {
        browser.js_args(
            "window.__opened = null; const name = arguments[0]; const t0 = performance.now(); \
             [...document.querySelectorAll('#board-table .open-item')].find(b => b.textContent === name).click(); \
             const check = () => { const h = document.getElementById('item-name'); \
               if (h && h.textContent === name && !document.getElementById('busy').classList.contains('on') \
                   && document.querySelectorAll('#forecast-table tbody tr').length) { \
                 requestAnimationFrame(() => { window.__opened = performance.now() - t0; }); \
               } else { setTimeout(check, 0); } }; \
             setTimeout(check, 0);",
            json!([format!("Item {:05}", k % 100)]),
        );
        let ms = browser.wait_for("the item's detail", "return window.__opened", WAIT);
        opened.push(ms.as_f64().unwrap());
    }
    eprintln!("opening an item's detail from the board (5 items), ms: {opened:.0?}");
    // The Look-back of one period on the same 1,000 items: every item planned twice.
    let t0 = browser.js("return performance.now()").as_f64().unwrap();
    browser.js(
        "const f = document.getElementById('board-look-back'); f.value = '1'; \
         f.dispatchEvent(new Event('change', { bubbles: true }));",
    );
    browser.wait_for(
        "the Look-back's counts",
        "const s = document.getElementById('board-look-back-summary'); \
         return !!s && s.textContent.includes('for 1000 items')",
        WAIT,
    );
    let t1 = browser.js("return performance.now()").as_f64().unwrap();
    let worker_ms = browser.js("return document.getElementById('board-progress').dataset.workerMs");
    eprintln!(
        "the Look-back of 1 period on the 1,000 items: {:.2} s to every row (the workers' own \
         time {:.1} ms per item, both plans)",
        (t1 - t0) / 1000.0,
        worker_ms
            .as_str()
            .and_then(|w| w.parse::<f64>().ok())
            .unwrap_or(f64::NAN)
            / 1000.0
    );
    browser.js(
        "const f = document.getElementById('board-look-back'); f.value = '0'; \
         f.dispatchEvent(new Event('change', { bubbles: true }));",
    );
    wait_until_planned_within(browser, 1000, WAIT);
    if std::env::var("MORROWCAST_BOARD_10K").is_ok() {
        run(browser, 10_000, Duration::from_secs(600));
        // The size IndexedDB was chosen for: the 14 MB desk kept in this browser (the length
        // of the history text it holds, read back by the test).
        let kept = browser.wait_for(
            "the 10,000-item desk kept or refused",
            "const f = document.getElementById('kept-failed'); if (f) return f.textContent; \
             if (!window.__reading) { window.__reading = true; \
               const r = indexedDB.open('morrowcast'); \
               r.onsuccess = () => { const db = r.result; \
                 const g = db.transaction('work').objectStore('work').get('history'); \
                 g.onsuccess = () => { window.__keptLength = (g.result || '').length; window.__reading = false; db.close(); }; }; } \
             return window.__keptLength > 14000000 ? 'kept, ' + window.__keptLength + ' characters' : null;",
            Duration::from_secs(120),
        );
        eprintln!("keeping the 10,000-item desk in this browser: {kept}");
    }
    save_screenshot(browser, "board-10000.png");
}
