//! A plan shows how far it has come: ten years of daily sales (3,650 periods, invented for this
//! check) in the worker, with every step reported (the eager-news drill).
//!
//! Kept apart from: the speed of the plan (benches) and the quick demo items (recompute.rs),
//! whose answers come before any bar is due.

use super::page::{open_at, paste, wait_for_item};

/// Ten years of daily demand with a weekly pattern (made up for this test).
fn daily_history() -> String {
    let mut text = String::from("day,Trellis ties\n");
    let start = morrowcast_engine::calendar::days_from_civil(2016, 1, 1);
    for t in 0..3650i64 {
        let (y, m, d) = morrowcast_engine::calendar::civil_from_days(start + t);
        let weekly = 8.0 * (2.0 * std::f64::consts::PI * t as f64 / 7.0).sin();
        let v = 40.0 + 0.01 * t as f64 + weekly + ((t * 7919) % 13 - 6) as f64;
        text.push_str(&format!("{y:04}-{m:02}-{d:02},{v:.0}\n"));
    }
    text
}

/// Records every progress state the busy indicator shows, from before the paste on.
const WATCH_PROGRESS: &str = "
window.__progress = [];
const busy = document.getElementById('busy');
new MutationObserver(() => {
  const bar = busy.querySelector('progress');
  if (bar && bar.hasAttribute('value')) {
    window.__progress.push([Number(bar.value), Number(bar.max), busy.textContent]);
  }
}).observe(busy, { subtree: true, childList: true, attributes: true, characterData: true });
";

#[test]
fn a_slow_plan_shows_its_steps() {
    // With the eager-news drill the worker reports every step (not only after 100 ms of work),
    // so the steps are seen whatever this machine's speed.
    let Some(page) = open_at((1366, 768), "#drill=eager-news") else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    browser.js(WATCH_PROGRESS);
    paste(browser, &daily_history());
    wait_for_item(browser, "Trellis ties");
    let took = browser.js("return document.getElementById('compute-time').textContent");
    let ms: f64 = took
        .as_str()
        .and_then(|t| t.strip_prefix("Recomputed in "))
        .and_then(|t| t.strip_suffix(" ms."))
        .and_then(|t| t.parse().ok())
        .unwrap_or_else(|| panic!("compute-time reads {took}"));
    let seen = browser.js("return window.__progress");
    let seen = seen.as_array().cloned().unwrap_or_default();
    eprintln!(
        "3,650 daily periods: plan {ms} ms in the worker; progress states seen: {}",
        seen.len()
    );
    assert!(!seen.is_empty(), "a {ms} ms plan showed no progress");
    let last = &seen[seen.len() - 1];
    let text = last[2].as_str().unwrap_or("");
    assert!(
        text.contains("Ranking the methods for Trellis ties: step"),
        "{text}"
    );
    let (done, total) = (
        last[0].as_f64().unwrap_or(-1.0),
        last[1].as_f64().unwrap_or(0.0),
    );
    assert!(total > 1.0 && (0.0..=total).contains(&done), "{last}");
}
