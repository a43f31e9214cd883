//! The Item board end to end: a pasted file of many items planned by the worker pool, every
//! row shown, sorted, filtered, an item opened, a lead time changed for the file and for one
//! item, a stock table pasted, and the saved order plan compared with `morrowcast stock --json`
//! on the same text and settings.
//!
//! Kept apart from: the one-item checks (engine_match.rs). The data is invented for this test
//! (long layout, items of the demo's garden-supply scenario, figures from fixed formulas).

use std::time::Duration;

use serde_json::{json, Value};

use super::page::{open, paste, save_screenshot, wait_for_item, WAIT};
use super::webdriver::Browser;
use crate::board::compare;
use crate::support::{cli, table_file};

/// Twelve items of four years of months in long layout: seasonal ones at several levels, a
/// trending one, and a sparse one.
pub(super) fn many_items() -> String {
    let names = [
        "Seed trays",
        "Garden twine",
        "Bulb planter",
        "Rain gauge",
        "Cold frame",
        "Watering can 10 L",
        "Pruning saw",
        "Mulch 50 L",
        "Bird feeder",
        "Slug traps",
        "Grafting wax",
        "Kneeling pad",
    ];
    let mut out = String::from("item,month,units\n");
    for (k, name) in names.iter().enumerate() {
        for t in 0..48usize {
            let season = [0., 5., 9., 14., 11., 6., 2., -3., -7., -9., -6., -2.][t % 12];
            let wobble = ((t * 7 + k * 3) % 5) as f64 - 2.0;
            let value = match k {
                // Sparse: a few units every third or fourth month.
                10 => {
                    if (t * 5 + 1) % 7 < 2 {
                        (2 + t % 3) as f64
                    } else {
                        0.0
                    }
                }
                // Trending up.
                4 => 20.0 + 1.5 * t as f64 + season + wobble,
                _ => (30 + 12 * k) as f64 + season * (1.0 + k as f64 / 6.0) + wobble,
            };
            out.push_str(&format!(
                "{name},{}-{:02},{value}\n",
                2022 + t / 12,
                t % 12 + 1
            ));
        }
    }
    out
}

const STOCK_TABLE: &str = "item,on hand,on order\nSeed trays,40,10\nMulch 50 L,500,0\n";

pub(super) fn wait_until_planned(browser: &Browser, total: usize) {
    wait_until_planned_within(browser, total, WAIT);
}

/// Waits until the board says it has planned all `total` items (at most `wait`).
pub(super) fn wait_until_planned_within(browser: &Browser, total: usize, wait: Duration) {
    browser.wait_for_args(
        "every item planned",
        "const p = document.getElementById('board-progress'); \
         return !!p && p.textContent.startsWith('Planned all ' + arguments[0] + ' items')",
        json!([total]),
        wait,
    );
}

/// The board's row names in the order shown.
fn shown_names(browser: &Browser) -> Vec<String> {
    let v = browser.js(
        "return [...document.querySelectorAll('#board-table tbody tr th')].map(t => t.querySelector('button').textContent)",
    );
    v.as_array()
        .unwrap()
        .iter()
        .map(|n| n.as_str().unwrap().to_string())
        .collect()
}

/// A column's cells (by its heading's text) in the order shown.
fn column(browser: &Browser, title: &str) -> Vec<String> {
    let v = browser.js_args(
        "const heads = [...document.querySelectorAll('#board-table thead th')]; \
         const i = heads.findIndex(h => h.textContent.startsWith(arguments[0])); \
         return [...document.querySelectorAll('#board-table tbody tr')].map(r => r.children[i] ? r.children[i].textContent : '');",
        json!([title]),
    );
    v.as_array()
        .unwrap()
        .iter()
        .map(|n| n.as_str().unwrap().to_string())
        .collect()
}

pub(super) fn set_field(browser: &Browser, id: &str, value: &str) {
    browser.js_args(
        "const t = document.getElementById(arguments[0]); t.value = arguments[1]; \
         t.dispatchEvent(new Event('input', { bubbles: true }));",
        json!([id, value]),
    );
}

fn sort_by(browser: &Browser, title: &str) {
    browser.js_args(
        "[...document.querySelectorAll('#board-table thead th')].find(h => h.textContent.startsWith(arguments[0])).querySelector('button').click()",
        json!([title]),
    );
}

/// The order plan the page saves.
pub(super) fn saved_order_plan(browser: &Browser) -> (String, String) {
    saved_by(browser, "export-order-plan")
}

/// The file name and text a button saves (the Blob it makes, caught at URL.createObjectURL).
pub(super) fn saved_by(browser: &Browser, button: &str) -> (String, String) {
    // The catch is installed once: a second wrapper would record each blob twice.
    let caught = browser.js_args(
        "window.__saved = []; \
         if (!window.__catching) { \
           window.__catching = true; \
           const make = URL.createObjectURL; \
           URL.createObjectURL = function (blob) { window.__saved.push({ blob, name: null }); return make.call(URL, blob); }; \
           HTMLAnchorElement.prototype.click = function () { const s = window.__saved[window.__saved.length - 1]; if (s) s.name = this.download; }; \
         } \
         window.__savedText = null; \
         document.getElementById(arguments[0]).click(); \
         const s = window.__saved[0]; \
         if (!s || window.__saved.length !== 1) return null; \
         s.blob.text().then(t => { window.__savedText = t; }); \
         return s.name;",
        json!([button]),
    );
    let name = caught
        .as_str()
        .unwrap_or_else(|| panic!("the button made no blob: {caught}"))
        .to_string();
    let text = browser.wait_for(
        "the saved order plan",
        "return window.__savedText || ''",
        WAIT,
    );
    (name, text.as_str().unwrap().to_string())
}

#[test]
fn the_board_plans_every_item_and_saves_the_command_lines_order_plan() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    // The demo's six items are on the board first.
    wait_until_planned(browser, 6);
    // A figure in periods says what a period is in this history.
    let hint = browser.js("return document.getElementById('lead-time-hint').textContent");
    assert_eq!(
        hint,
        json!("periods from ordering to receiving; here a period is a month")
    );
    let text = many_items();
    paste(browser, &text);
    wait_until_planned(browser, 12);
    let names = shown_names(browser);
    assert_eq!(names.len(), 12, "{names:?}");
    assert_eq!(names[0], "Seed trays");
    let estimates = browser.js("return document.getElementById('board-estimates').textContent");
    assert!(
        estimates.as_str().unwrap_or("").contains("estimates"),
        "{estimates}"
    );
    save_screenshot(browser, "board-twelve-items.png");

    // Sort by MASE, largest first: the numbers fall, "–" (not defined) last.
    sort_by(browser, "MASE");
    let mase = column(browser, "MASE");
    let numbers: Vec<f64> = mase.iter().filter_map(|m| m.parse().ok()).collect();
    assert!(numbers.windows(2).all(|w| w[0] >= w[1]), "{mase:?}");
    let sorted = browser.js(
        "return [...document.querySelectorAll('#board-table thead th')].find(h => h.textContent.startsWith('MASE')).getAttribute('aria-sort')",
    );
    assert_eq!(sorted, json!("descending"));
    // Again: smallest first.
    sort_by(browser, "MASE");
    let numbers: Vec<f64> = column(browser, "MASE")
        .iter()
        .filter_map(|m| m.parse().ok())
        .collect();
    assert!(numbers.windows(2).all(|w| w[0] <= w[1]), "{numbers:?}");

    // Filter by text, then by alert.
    set_field(browser, "board-filter", "saw");
    assert_eq!(shown_names(browser), ["Pruning saw"]);
    set_field(browser, "board-filter", "");
    browser.js(
        "const s = document.getElementById('board-alert'); s.value = 'sparse_demand'; \
         s.dispatchEvent(new Event('change', { bubbles: true }));",
    );
    assert_eq!(shown_names(browser), ["Grafting wax"]);
    let alerts = column(browser, "Alerts");
    assert!(alerts[0].contains("Sparse demand"), "{alerts:?}");
    save_screenshot(browser, "board-filtered.png");
    browser.js(
        "const s = document.getElementById('board-alert'); s.value = 'all'; \
         s.dispatchEvent(new Event('change', { bubbles: true }));",
    );

    // A row opens its item: the detail below shows it, with its Stock plan.
    browser.js_args(
        "[...document.querySelectorAll('#board-table .open-item')].find(b => b.textContent === arguments[0]).click()",
        json!(["Mulch 50 L"]),
    );
    wait_for_item(browser, "Mulch 50 L");
    let focused = browser.js("return document.activeElement && document.activeElement.id");
    assert_eq!(focused, json!("results"), "the focus moves to the detail");
    let stock_title = browser.js("return document.getElementById('item-stock-title').textContent");
    assert_eq!(stock_title, json!("Stock plan for Mulch 50 L"));
    save_screenshot(browser, "board-item-open.png");

    // The file's lead time and a stock table: the board plans again.
    set_field(browser, "lead-time", "3");
    set_field(browser, "stock-table", STOCK_TABLE);
    browser.wait_for(
        "the board planned with lead time 3",
        "const p = document.getElementById('board-progress').textContent; \
         const cells = [...document.querySelectorAll('#board-table tbody tr')].map(r => r.textContent); \
         return p.startsWith('Planned all 12') && cells.length === 12 && cells.every(c => c.includes(' in 3 months'));",
        WAIT,
    );
    let names = shown_names(browser);
    let orders = column(browser, "Order today");
    let order = |name: &str| orders[names.iter().position(|n| n == name).unwrap()].clone();
    assert_ne!(order("Seed trays"), "needs on hand", "{orders:?}");
    assert_eq!(order("Garden twine"), "needs on hand", "{orders:?}");

    let (name, saved) = saved_order_plan(browser);
    assert!(
        name.starts_with("morrowcast-all-items-order-plan-20") && name.ends_with(".csv"),
        "{name}"
    );
    let table = table_file("e2e-board-stock.csv", STOCK_TABLE);
    let run = cli(
        &[
            "stock",
            "-",
            "--json",
            "--lead-time",
            "3",
            "--stock",
            &table,
        ],
        text.as_bytes(),
    );
    assert_eq!(run.code, 0, "{}", run.stderr);
    compare(&saved, &run.json());

    // One item's own lead time: marked on the board, and in the order plan.
    set_field(browser, "item-lead-time", "5");
    browser.js("document.getElementById('item-change-apply').click()");
    browser.wait_for(
        "the changed item marked and replanned",
        "const r = [...document.querySelectorAll('#board-table tbody tr')].find(r => r.querySelector('th').textContent.startsWith('Mulch 50 L')); \
         return !!r && r.textContent.includes('(changed)') && r.textContent.includes(' in 5 months') \
           && document.getElementById('board-progress').textContent.startsWith('Planned all 12');",
        WAIT,
    );
    let (_, saved) = saved_order_plan(browser);
    let line: Vec<Value> = saved
        .lines()
        .filter(|l| l.starts_with("Mulch 50 L,"))
        .map(|l| json!(l))
        .collect();
    assert_eq!(line.len(), 1, "{saved}");
    let cells: Vec<&str> = line[0].as_str().unwrap().split(',').collect();
    assert_eq!(cells[2], "5", "lead time {cells:?}");
    assert!(line[0].as_str().unwrap().contains(",yes,"), "{line:?}");
    save_screenshot(browser, "board-changed-item.png");

    // Its own season (none) and method (simple exponential smoothing) too: the row, the
    // detail and the order plan follow, as the command line computes them with those options.
    set_field(browser, "item-season", "none");
    browser.js(
        "const s = document.getElementById('item-method'); s.value = 'ses'; \
         s.dispatchEvent(new Event('change', { bubbles: true })); \
         document.getElementById('item-change-apply').click();",
    );
    browser.wait_for(
        "the item planned with its own season and method",
        "const r = [...document.querySelectorAll('#board-table tbody tr')].find(r => r.querySelector('th').textContent.startsWith('Mulch 50 L')); \
         return !!r && r.textContent.includes('Simple exponential smoothing') \
           && document.getElementById('board-progress').textContent.startsWith('Planned all 12');",
        WAIT,
    );
    wait_for_item(browser, "Mulch 50 L");
    let lead = browser.js("return document.querySelector('#headline .lead').textContent");
    assert!(
        lead.as_str()
            .unwrap_or("")
            .contains("by Simple exponential smoothing"),
        "the detail plans the item as the board does: {lead}"
    );
    let (_, saved) = saved_order_plan(browser);
    let mut lines = saved.lines();
    let one = format!(
        "{}\n{}\n",
        lines.next().unwrap(),
        saved
            .lines()
            .find(|l| l.starts_with("Mulch 50 L,"))
            .unwrap()
    );
    let run = cli(
        &[
            "stock",
            "-",
            "--json",
            "--item",
            "Mulch 50 L",
            "--lead-time",
            "5",
            "--season",
            "none",
            "--method",
            "ses",
            "--stock",
            &table,
        ],
        text.as_bytes(),
    );
    assert_eq!(run.code, 0, "{}", run.stderr);
    compare(&one, &run.json());
    save_screenshot(browser, "board-own-method.png");
}

/// A table over 200 KB is read beside the page (its reading worker): the board fills with every
/// item, the box shows the table's head with a note, and the report counts what the command
/// line's `inspect` counts.
#[test]
fn a_large_table_is_read_beside_the_page_and_planned_whole() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let mut text = String::from("item,month,units\n");
    for k in 0..250usize {
        for t in 0..48usize {
            let v =
                40 + (k % 17) * 3 + [0, 4, 8, 12, 9, 5, 1, 0, 2, 3, 5, 2][t % 12] + (t * 7 + k) % 5;
            text.push_str(&format!(
                "Hedge shears {k:03},{}-{:02},{v}\n",
                2022 + t / 12,
                t % 12 + 1
            ));
        }
    }
    assert!(text.len() > 200_000, "{}", text.len());
    // Pasted as a user does: the page takes the text from the paste event itself.
    super::page::paste_event(browser, &text);
    let taken = browser.js("return document.getElementById('intake-text').value.length");
    assert!(
        taken.as_u64().unwrap() < 20_000,
        "the box shows only the head: {taken}"
    );
    wait_until_planned(browser, 250);
    let partial = browser.js("return document.getElementById('intake-partial').textContent");
    assert!(
        partial.as_str().unwrap_or("").contains("first 200 lines"),
        "{partial}"
    );
    let shown =
        browser.js("return document.getElementById('intake-text').value.split('\\n').length");
    assert_eq!(shown, json!(200));
    let report = browser.js("return document.getElementById('intake-report').textContent");
    assert!(
        report.as_str().unwrap_or("").contains("250 items"),
        "{report}"
    );
    let run = cli(&["inspect", "-", "--json"], text.as_bytes());
    assert_eq!(run.json()["items"].as_array().map(Vec::len), Some(250));
    wait_for_item(browser, "Hedge shears 000");
    save_screenshot(browser, "board-large-table.png");
    // Its share link would be far too long: the page offers the work file first.
    browser.js("document.getElementById('make-link').click()");
    let offer = browser.wait_for(
        "the work file offered instead of a link",
        "const n = document.getElementById('share-too-large'); return n ? n.textContent : null",
        WAIT,
    );
    assert!(
        offer.as_str().unwrap().contains("Save a work file"),
        "{offer}"
    );
    assert_eq!(
        browser.js("return document.getElementById('share-link')"),
        json!(null)
    );
}

/// Drops a file of `text` named `name` on the stock table's drop zone, as a drag from the
/// desktop delivers it.
fn drop_stock_table(browser: &Browser, text: &str, name: &str) {
    browser.js_args(
        "const dt = new DataTransfer(); \
         dt.items.add(new File([arguments[0]], arguments[1], { type: 'text/csv' })); \
         const z = document.getElementById('stock-drop'); \
         const ev = t => z.dispatchEvent(new DragEvent(t, { dataTransfer: dt, bubbles: true, cancelable: true })); \
         ev('dragenter'); ev('dragover'); ev('drop');",
        json!([text, name]),
    );
}

/// A stock table dropped as a file: a bad cell is named with its row, column and text and no
/// figures are shown; the corrected file gives the order.
#[test]
fn a_dropped_stock_table_is_read_with_intakes_care() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    paste(browser, &many_items());
    wait_until_planned(browser, 12);
    drop_stock_table(browser, "item,on hand\nSeed trays,4O\n", "on-hand.csv");
    let errors = browser.wait_for(
        "the stock table's error",
        "const e = document.getElementById('stock-table-errors'); return e && e.textContent",
        WAIT,
    );
    let errors = errors.as_str().unwrap_or("");
    assert!(
        errors.contains("4O") && errors.contains('2') && errors.to_lowercase().contains("on hand"),
        "{errors}"
    );
    browser.wait_for(
        "the board to say why it shows no figures",
        "return document.getElementById('board-progress').textContent.includes('stock table has cells that could not be read')",
        WAIT,
    );
    let source = browser.js("return document.getElementById('stock-source').textContent");
    assert_eq!(source, json!("on-hand.csv"));
    save_screenshot(browser, "stock-table-error.png");
    // Corrected as another system writes it: the name in lower case, the lead time in days.
    drop_stock_table(
        browser,
        "item,on hand,lead time (days)\nseed trays,40,60\n",
        "on-hand.csv",
    );
    wait_until_planned(browser, 12);
    let names = shown_names(browser);
    let orders = column(browser, "Order today");
    let seed = names.iter().position(|n| n == "Seed trays").unwrap();
    assert_ne!(orders[seed], "needs on hand", "{orders:?}");
    let over = column(browser, "Demand over protection");
    assert!(over[seed].ends_with("in 2 months"), "{over:?}");
    let report = browser.js("return document.getElementById('stock-table-report').textContent");
    let report = report.as_str().unwrap_or("");
    assert!(
        report.contains("\"seed trays\" (row 2) as \"Seed trays\"")
            && report.contains("\"60\" (row 2) as 2 months")
            && report.contains("Read 1 row for items of the history."),
        "{report}"
    );
}

/// A file whose last month was taken on its third day: the board and the item's headline say
/// so above their figures; a file of whole months says nothing.
#[test]
fn an_unfinished_last_period_is_said_above_the_figures() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    wait_until_planned(browser, 6);
    let notice = |id: &str| {
        browser
            .js_args(
                "const n = document.getElementById(arguments[0]); return n ? n.textContent : ''",
                json!([id]),
            )
            .as_str()
            .unwrap_or("")
            .to_string()
    };
    assert_eq!(notice("board-unfinished-last"), "");
    // Each item's December 2025 cut to a tenth, as three days of it.
    let text: String = many_items()
        .lines()
        .map(|line| match line.split_once(",2025-12,") {
            Some((name, units)) => {
                let units: f64 = units.parse().unwrap();
                format!("{name},2025-12,{:.1}\n", units / 10.0)
            }
            None => format!("{line}\n"),
        })
        .collect();
    paste(browser, &text);
    wait_until_planned(browser, 12);
    wait_for_item(browser, "Seed trays");
    for id in ["board-unfinished-last", "unfinished-last"] {
        let said = notice(id);
        assert!(
            said.starts_with("The last period, 2025-12, looks unfinished"),
            "#{id}: {said:?}"
        );
    }
    save_screenshot(browser, "board-unfinished-last.png");
    // An item other than the first is open: it stays open through the leaving out.
    browser.js(
        "[...document.querySelectorAll('#board-table button.open-item')].find(b => b.textContent === 'Mulch 50 L').click()",
    );
    wait_for_item(browser, "Mulch 50 L");
    // Left out at a click: the rows of 2025-12 go from the Intake text, and the plans with them;
    // a line says so, its button to put them back holding the focus.
    browser.js(
        "[...document.querySelectorAll('#board-unfinished-last button')].find(b => b.textContent === 'Leave 2025-12 out').click()",
    );
    browser.wait_for(
        "the period left out",
        "return document.getElementById('intake-source').textContent === 'pasted text, without 2025-12' \
           && document.activeElement && document.activeElement.id === 'board-unfinished-last-put-back'",
        WAIT,
    );
    assert!(notice("board-unfinished-last").starts_with("2025-12 is left out of the Intake text"));
    wait_until_planned(browser, 12);
    wait_for_item(browser, "Mulch 50 L");
    let text_now = browser.js("return document.getElementById('intake-text').value");
    let expected: String = text
        .lines()
        .filter(|line| !line.contains(",2025-12,"))
        .map(|line| format!("{line}\n"))
        .collect();
    assert_eq!(text_now.as_str(), Some(expected.as_str()));
    save_screenshot(browser, "board-left-out.png");
    // Put back: the text as it was, and the notice again.
    browser.js("document.getElementById('board-unfinished-last-put-back').click()");
    browser.wait_for(
        "the period put back",
        "const n = document.getElementById('board-unfinished-last'); \
         return !!n && n.textContent.startsWith('The last period, 2025-12, looks unfinished') \
           && document.activeElement && document.activeElement.id === 'board-unfinished-last-leave-out'",
        WAIT,
    );
    let text_back = browser.js("return document.getElementById('intake-text').value");
    assert_eq!(text_back.as_str(), Some(text.as_str()));

    // Rows that decided the reading (the only date showing the date order) are not left out:
    // the notice says why and the text stays.
    let mut us = String::from("date,Oak tray,Slate planter\n");
    for day in 1..=12 {
        us.push_str(&format!(
            "12/{day:02}/2025,{},{}\n",
            40 + day % 3,
            30 + day % 2
        ));
    }
    us.push_str("12/13/2025,3,2\n");
    paste(browser, &us);
    wait_until_planned(browser, 2);
    browser.js(
        "[...document.querySelectorAll('#board-unfinished-last button')].find(b => b.textContent === 'Leave 2025-12-13 out').click()",
    );
    browser.wait_for(
        "the refusal",
        "const n = document.getElementById('board-unfinished-last'); \
         return !!n && n.textContent.includes('2025-12-13 was not left out')",
        WAIT,
    );
    let kept = browser.js("return document.getElementById('intake-text').value");
    assert_eq!(kept.as_str(), Some(us.as_str()));
}

/// A new item of five months: its row shows its forecast and its "New item" alert, with why
/// it has no stock figures in one cell across the stock columns (the command line's words);
/// the "New item" filter finds it and its own Stock plan lists the alert.
#[test]
fn a_new_items_row_shows_its_alert_and_forecast_without_stock_figures() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    wait_until_planned(browser, 6);
    let text = crate::support::with_a_new_item();
    paste(browser, &text);
    wait_until_planned(browser, 2);
    let run = cli(&["stock", "-", "--json"], text.as_bytes());
    let message = run.json()["failed"][0]["message"]
        .as_str()
        .unwrap()
        .to_string();
    let why = message.split("; its alerts:").next().unwrap().to_string();
    browser.wait_for_args(
        "the row with its alert, forecast and why",
        "const row = [...document.querySelectorAll('#board-table tbody tr')]            .find(r => r.querySelector('th').textContent.startsWith('Solar lantern'));          if (!row) return false;          const problem = row.querySelector('td.problem');          return row.querySelector('td.alerts').textContent === 'New item'            && !!problem && problem.colSpan === 3            && problem.textContent === 'No stock figures: ' + arguments[0]            && [...row.querySelectorAll('td')].some(td => /^\\d+(\\.\\d)? \\(/.test(td.textContent));",
        json!([why]),
        WAIT,
    );
    browser.js(
        "const s = document.getElementById('board-alert'); s.value = 'new_item';          s.dispatchEvent(new Event('change', { bubbles: true }));",
    );
    assert_eq!(shown_names(browser), ["Solar lantern"]);
    save_screenshot(browser, "board-new-item.png");
    browser.js("document.querySelector('#board-table .open-item').click()");
    wait_for_item(browser, "Solar lantern");
    browser.wait_for_args(
        "the item's Stock plan with why and its alert",
        "const s = document.getElementById('item-stock');          return !!s && s.textContent.includes('No stock figures: ' + arguments[0])            && s.querySelector('.alerts-list').textContent.startsWith('New item: ');",
        json!([why]),
        WAIT,
    );
}

/// A wide table whose column for one item is empty over its last months: its row gives no
/// figures and says why (the command line's words), the "could not be planned" filter finds
/// it, and its own Stock plan says the same; the other items are planned.
#[test]
fn an_item_whose_data_ends_early_gets_no_stock_figures_and_says_why() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    wait_until_planned(browser, 6);
    let text = crate::support::wide_ending_early(("Garden twine", "Rain gauge"), 40, 34);
    paste(browser, &text);
    wait_until_planned(browser, 2);
    let run = cli(&["stock", "-", "--json"], text.as_bytes());
    let why = run.json()["failed"][0]["message"]
        .as_str()
        .unwrap()
        .to_string();
    assert!(
        why.starts_with("its data ends at 2025-10, 6 months before"),
        "{why}"
    );
    browser.wait_for_args(
        "the row saying why",
        "const rows = [...document.querySelectorAll('#board-table tbody tr')]; \
         return rows.length === 2 && rows[1].querySelector('td.problem') \
           && rows[1].querySelector('td.problem').textContent === 'No stock figures: ' + arguments[0];",
        json!([why]),
        WAIT,
    );
    browser.js(
        "const s = document.getElementById('board-alert'); s.value = 'failed'; \
         s.dispatchEvent(new Event('change', { bubbles: true }));",
    );
    assert_eq!(shown_names(browser), ["Rain gauge"]);
    browser.js("document.querySelector('#board-table .open-item').click()");
    wait_for_item(browser, "Rain gauge");
    browser.wait_for_args(
        "the item's Stock plan saying why",
        "const s = document.getElementById('item-stock'); \
         return !!s && s.textContent.includes('No stock figures: ' + arguments[0]);",
        json!([why]),
        WAIT,
    );
    // Its forecast, above, says where it starts.
    let said = browser
        .js("const n = document.getElementById('ends-early'); return n ? n.textContent : ''");
    assert_eq!(
        said.as_str(),
        Some(format!("This forecast does not start after the file's end: {why}.").as_str())
    );
    save_screenshot(browser, "board-ends-early.png");
    // An item planned to the file's end has no such line.
    browser.js(
        "const s = document.getElementById('board-alert'); s.value = 'all'; \
         s.dispatchEvent(new Event('change', { bubbles: true }));",
    );
    browser.js("document.querySelector('#board-table .open-item').click()");
    wait_for_item(browser, "Garden twine");
    assert_eq!(
        browser.js("return document.getElementById('ends-early') === null"),
        json!(true)
    );
}

/// Two codes sharing a description: a stock table by code is left out with the reason and
/// the choice; chosen, the rows give orders and the work file keeps the choice; taken back,
/// they are left out again.
#[test]
fn a_stock_table_by_code_is_read_alone_when_chosen() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let mut history = "month,Code,Description,units\n".to_string();
    for month in 0..24 {
        let (year, m) = (2023 + month / 12, month % 12 + 1);
        for (code, description, units) in [
            ("FG-1", "Birch trellis", 12 + month % 3),
            ("FG-2", "Rain barrel", 8 + month % 4),
            ("FG-9", "Birch trellis", 20 + month % 5),
        ] {
            history.push_str(&format!("{year}-{m:02},{code},{description},{units}\n"));
        }
    }
    paste(browser, &history);
    wait_until_planned(browser, 3);
    drop_stock_table(
        browser,
        "Code,On hand,On order\nFG-1,30,0\nFG-2,5,0\nFG-9,2,0\n",
        "by-code.csv",
    );
    let offer = browser.wait_for(
        "the choice to read the rows by code",
        "const b = document.getElementById('stock-read-by'); return b && b.textContent",
        WAIT,
    );
    assert_eq!(
        offer,
        json!("Read those 3 rows by \u{201c}Code\u{201d} alone")
    );
    let report = browser.js("return document.getElementById('stock-table-report').textContent");
    assert!(
        report.as_str().unwrap_or("").contains(
            "as \"Birch trellis\" is the \"Description\" of \"FG-1 / Birch trellis\" and \
             \"FG-9 / Birch trellis\""
        ),
        "{report}"
    );
    wait_until_planned(browser, 3);
    assert!(column(browser, "Order today")
        .iter()
        .all(|o| o == "needs on hand"));
    // The board says so above its rows, with the same choice.
    let above = browser
        .js("const e = document.getElementById('board-stock-rows'); return e && e.textContent");
    assert!(
        above
            .as_str()
            .unwrap_or("")
            .contains("The stock table has rows for 0 of 3 items"),
        "{above}"
    );
    assert_eq!(
        browser.js("return document.getElementById('board-read-by').textContent"),
        offer
    );
    browser.js("document.getElementById('stock-read-by').click()");
    browser.wait_for(
        "the choice taken",
        "return !!document.getElementById('stock-read-in-full')",
        WAIT,
    );
    wait_until_planned(browser, 3);
    let names = shown_names(browser);
    let orders = column(browser, "Order today");
    let scarce = names
        .iter()
        .position(|n| n == "FG-9 / Birch trellis")
        .unwrap();
    assert_ne!(orders[scarce], "needs on hand", "{orders:?}");
    assert_eq!(
        browser.js("return document.getElementById('board-stock-rows')"),
        json!(null)
    );
    save_screenshot(browser, "stock-read-by-code.png");
    let (_, work) = saved_by(browser, "save-work");
    assert!(work.contains("\"stock_table_read_by\": \"Code\""), "{work}");
    browser.js("document.getElementById('stock-read-in-full').click()");
    browser.wait_for(
        "the choice offered again",
        "return !!document.getElementById('stock-read-by')",
        WAIT,
    );
    wait_until_planned(browser, 3);
    assert!(column(browser, "Order today")
        .iter()
        .all(|o| o == "needs on hand"));
    // A choice is made of one table: edited, the table is read by full names again.
    browser.js("document.getElementById('board-read-by').click()");
    browser.wait_for(
        "the choice taken from above the board",
        "return !!document.getElementById('stock-read-in-full')",
        WAIT,
    );
    set_field(browser, "stock-table", "Code,On hand,On order\nFG-9,3,0\n");
    browser.wait_for(
        "the choice offered for the edited table",
        "const b = document.getElementById('stock-read-by'); return !!b && b.textContent.includes('that row')",
        WAIT,
    );
}
