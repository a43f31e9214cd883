//! Picking a row of the Backtest ranking: the Look-ahead, the forecast table and the Error
//! ledger show that method, with the numbers the command line gives for `--method` of the same
//! candidate; the pick holds for the item it was made on only.
//!
//! Kept apart from: the demo's first view (demo.rs) and the default plans (engine_match.rs).
//! The data is the demo; the reference is the command line in-process.

use serde_json::Value;

use super::page::{forecast_table, open, save_screenshot, wait_for_item, WAIT};
use super::webdriver::Browser;
use crate::support::cli;

/// The label of the row shown as picked (aria-pressed), if any.
fn pressed_label(browser: &Browser) -> String {
    browser
        .js(
            "const b = document.querySelector('#ranking-table button.row-pick[aria-pressed=\"true\"]'); \
             return b ? b.textContent : '';",
        )
        .as_str()
        .unwrap_or("")
        .to_string()
}

/// The Error ledger's forecast column as shown.
fn ledger_forecasts(browser: &Browser) -> Vec<String> {
    browser
        .js("return [...document.querySelectorAll('#ledger-table tbody tr')].map(r => r.children[2].textContent)")
        .as_array()
        .unwrap()
        .iter()
        .map(|c| c.as_str().unwrap_or("").to_string())
        .collect()
}

fn one_decimal(v: &Value) -> String {
    format!("{:.1}", v.as_f64().unwrap())
}

#[test]
fn a_picked_row_shows_that_method_as_the_command_line_computes_it() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let demo = cli(&["demo"], b"").stdout;
    let ranked = cli(
        &["forecast", "-", "--item", "Seed packets", "--json"],
        &demo,
    )
    .json();
    let chosen = ranked["items"][0]["chosen_label"]
        .as_str()
        .unwrap()
        .to_string();
    assert_eq!(
        pressed_label(browser),
        chosen,
        "the engine's choice is shown first"
    );

    // The last row of the ranking: a single method, not the engine's choice.
    let row = ranked["items"][0]["ranking"]
        .as_array()
        .unwrap()
        .last()
        .unwrap()
        .clone();
    let (key, label) = (
        row["method"].as_str().unwrap(),
        row["label"].as_str().unwrap(),
    );
    assert_ne!(label, chosen);
    browser.js_args(
        "[...document.querySelectorAll('#ranking-table button.row-pick')]\
           .find(b => b.textContent === arguments[0]).click();",
        serde_json::json!([label]),
    );
    browser.wait_for_args(
        "the picked method in the headline",
        "const l = document.querySelector('#headline .lead'); \
         return !!l && l.textContent.includes('by ' + arguments[0] + ',') \
           && !document.getElementById('busy').classList.contains('on');",
        serde_json::json!([label]),
        WAIT,
    );
    assert_eq!(pressed_label(browser), label);
    save_screenshot(browser, "picked-row.png");

    // The same candidate through the command line.
    let picked = cli(
        &[
            "forecast",
            "-",
            "--item",
            "Seed packets",
            "--method",
            key,
            "--json",
        ],
        &demo,
    )
    .json();
    let plan = &picked["items"][0];
    assert_eq!(plan["chosen_label"], label);
    let engine_forecast: Vec<Vec<String>> = plan["forecast"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| {
            vec![
                p["period"].as_str().unwrap().to_string(),
                one_decimal(&p["value"]),
                one_decimal(&p["low"]),
                one_decimal(&p["high"]),
            ]
        })
        .collect();
    assert_eq!(forecast_table(browser), engine_forecast, "forecast table");
    let engine_ledger: Vec<String> = plan["ledger"]
        .as_array()
        .unwrap()
        .iter()
        .map(|e| one_decimal(&e["forecast"]))
        .collect();
    assert_eq!(
        ledger_forecasts(browser),
        engine_ledger,
        "Error ledger forecasts"
    );

    // Another item shows its engine's choice; back on Seed packets the pick holds again (a
    // pick belongs to the series it was made on).
    let choose_item = |index: &str| {
        browser.js_args(
            "const s = document.getElementById('item-choice'); s.value = arguments[0]; \
             s.dispatchEvent(new Event('change', { bubbles: true }));",
            serde_json::json!([index]),
        );
    };
    let second = ranked_item(&demo, 1);
    choose_item("1");
    wait_for_item(browser, second["name"].as_str().unwrap());
    wait_for_pressed(browser, second["chosen_label"].as_str().unwrap());
    choose_item("0");
    wait_for_item(browser, "Seed packets");
    wait_for_pressed(browser, label);
}

/// The plan the command line makes for the demo's item at `index`.
fn ranked_item(demo: &[u8], index: usize) -> Value {
    cli(&["forecast", "-", "--json"], demo).json()["items"][index].clone()
}

fn wait_for_pressed(browser: &Browser, label: &str) {
    browser.wait_for_args(
        &format!("{label} shown as the picked row"),
        "const b = document.querySelector('#ranking-table button.row-pick[aria-pressed=\"true\"]'); \
         return !!b && b.textContent === arguments[0] \
           && !document.getElementById('busy').classList.contains('on');",
        serde_json::json!([label]),
        WAIT,
    );
}
