//! How long a change of setting takes to show on the page, for one demo item: measured and
//! printed, never asserted (timing targets live in benchmarks; the README records the figure).
//!
//! Kept apart from: the engine's own timing (benches/speed.rs). Three figures per change: the
//! engine's plan (the page's "Recomputed in N ms"), click to the updated forecast table with
//! every chart drawn (all work the change queued has run), and click to the next frame; then
//! the page's own performance measures (plan, each chart) say where the time goes.

use serde_json::json;

use super::page::{open, save_screenshot, wait_for_item, WAIT};

/// Clicks the band level `arguments[0]` and records, once the page shows it, the times since
/// the click; polled with zero timeouts, so the page's queued work (its plan runs one tick after
/// the change, its charts in the effects after that) has all run when the caption is checked.
const TIMED_CHANGE: &str = "
const level = arguments[0];
window.__timed = null;
const busy = document.getElementById('busy');
const t0 = performance.now();
document.getElementById('level-' + level).click();
const check = () => {
  const caption = document.querySelector('#forecast-table caption').textContent;
  if (caption.includes(level + '% band') && !busy.classList.contains('on')) {
    const shown = performance.now() - t0;
    requestAnimationFrame(() => setTimeout(() => {
      const parts = performance.getEntriesByType('measure').filter(m => m.startTime >= t0)
        .map(m => [m.name, m.startTime - t0, m.duration]);
      performance.clearMeasures();
      window.__timed = [document.getElementById('compute-time').textContent, shown, performance.now() - t0, parts];
    }, 0));
  } else {
    setTimeout(check, 0);
  }
};
setTimeout(check, 0);
";

fn median(mut v: Vec<f64>) -> f64 {
    v.sort_by(f64::total_cmp);
    v[v.len() / 2]
}

/// Changing the band level of the demo's first item recomputes and redraws; the times are
/// printed (run with `--nocapture` to see them; they are upper bounds on a shared machine).
#[test]
fn band_level_change_recompute_time_is_recorded() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let (mut engine, mut shown, mut frame) = (Vec::new(), Vec::new(), Vec::new());
    // The page's performance measures (src/app: the plan, each chart's drawing) per change.
    let mut parts: Vec<(String, Vec<f64>)> = Vec::new();
    let mut plan_start = Vec::new();
    for level in [80, 90, 99, 95].repeat(3) {
        browser.js_args(TIMED_CHANGE, json!([level]));
        let t = browser.wait_for("the timed recompute", "return window.__timed", WAIT);
        let t = t.as_array().unwrap();
        let text = t[0].as_str().unwrap_or("");
        let ms: f64 = text
            .strip_prefix("Recomputed in ")
            .and_then(|s| s.strip_suffix(" ms."))
            .and_then(|s| s.parse().ok())
            .unwrap_or_else(|| panic!("compute-time reads {text:?}"));
        engine.push(ms);
        shown.push(t[1].as_f64().unwrap());
        frame.push(t[2].as_f64().unwrap());
        for part in t[3].as_array().unwrap() {
            let name = part[0].as_str().unwrap_or("").to_string();
            let (start, duration) = (part[1].as_f64().unwrap(), part[2].as_f64().unwrap());
            if name == "morrowcast:plan" {
                plan_start.push(start);
            }
            match parts.iter_mut().find(|(n, _)| *n == name) {
                Some((_, v)) => v.push(duration),
                None => parts.push((name, vec![duration])),
            }
        }
    }
    let load = std::fs::read_to_string("/proc/loadavg").unwrap_or_default();
    let max = |v: &[f64]| v.iter().cloned().fold(0.0, f64::max);
    eprintln!(
        "recompute of one demo item (Seed packets, 60 months) on a \
         band-level change, 12 changes, median / max in ms: engine plan {:.0} / {:.0}; click to \
         table and charts updated {:.1} / {:.1}; click to next frame {:.1} / {:.1} (load average {})",
        median(engine.clone()),
        max(&engine),
        median(shown.clone()),
        max(&shown),
        median(frame.clone()),
        max(&frame),
        load.split_whitespace().take(3).collect::<Vec<_>>().join(" ")
    );
    let mut breakdown = format!("plan starts {:.1} ms after the click", median(plan_start));
    for (name, v) in &parts {
        breakdown.push_str(&format!(
            "; {} {:.1} ms in {} of 12 changes",
            name.trim_start_matches("morrowcast:"),
            median(v.clone()),
            v.len()
        ));
    }
    eprintln!("where the time goes (medians): {breakdown}");
    save_screenshot(browser, "recompute-95.png");
}
