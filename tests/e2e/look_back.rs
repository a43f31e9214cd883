//! The Item board's Look-back end to end: the demo planned, a look back of two periods asked
//! for, and every row's outcome and the counts above the board set against `morrowcast
//! look-back --json` on the same data and settings (the page's stock defaults: lead time 1,
//! continuous review, cycle service 95 %). Then a look back that cannot be made is refused
//! with a message, and 0 takes the column away again.

use serde_json::{json, Value};

use super::board::{saved_by, set_field, wait_until_planned};
use super::page::{open, open_at, save_screenshot, wait_for_item, WAIT};
use crate::support::{cli, within_count};

/// Sets the Look-back's field and tells the page it changed (it acts on "change").
fn look_back(browser: &super::webdriver::Browser, periods: &str) {
    set_field(browser, "board-look-back", periods);
    browser.js(
        "document.getElementById('board-look-back').dispatchEvent(new Event('change', { bubbles: true }))",
    );
}

/// Every row's (name, Look-back cell) in the file's order.
fn look_back_cells(browser: &super::webdriver::Browser) -> Vec<(String, String)> {
    let v = browser.js(
        "return [...document.querySelectorAll('#board-table tbody tr')].map(r => \
         [r.querySelector('th button').textContent, (r.querySelector('td.look-back') || {}).textContent || null])",
    );
    v.as_array()
        .unwrap()
        .iter()
        .map(|pair| {
            (
                pair[0].as_str().unwrap().to_string(),
                pair[1].as_str().unwrap_or("").to_string(),
            )
        })
        .collect()
}

#[test]
fn the_boards_look_back_sets_each_items_plan_of_then_against_what_sold() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    wait_until_planned(browser, 6);
    assert!(look_back_cells(browser).iter().all(|(_, c)| c.is_empty()));

    look_back(browser, "2");
    browser.wait_for(
        "the Look-back's counts",
        "const s = document.getElementById('board-look-back-summary'); \
         return !!s && s.textContent.includes('for 6 items')",
        WAIT,
    );
    wait_until_planned(browser, 6);
    save_screenshot(browser, "board-look-back.png");

    let demo = cli(&["demo"], b"").stdout;
    let run = cli(&["look-back", "-", "--periods", "2", "--json"], &demo);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let want: Value = run.json();
    let cells = look_back_cells(browser);
    let items = want["items"].as_array().unwrap();
    assert_eq!(cells.len(), items.len());
    for ((name, cell), item) in cells.iter().zip(items) {
        assert_eq!(name, item["name"].as_str().unwrap());
        let within = within_count(item);
        assert!(
            cell.contains(&format!("{within} of 2 within the band")),
            "{name}: {cell} (command line: {within} of 2)"
        );
        let held = match item["stock"]["covered"] {
            Value::Bool(true) => "stock level held",
            Value::Bool(false) => "stock level short by",
            _ => panic!("{name}: the command line judged no stock level: {item}"),
        };
        assert!(cell.contains(held), "{name}: {cell} (command line: {held})");
    }
    let tally = &want["tally"];
    let summary = browser
        .js("return document.getElementById('board-look-back-summary').textContent")
        .as_str()
        .unwrap()
        .to_string();
    for said in [
        format!(
            "{} of {} months within their band",
            tally["within"], tally["periods"]
        ),
        format!(
            "for {} of {} items",
            tally["covered"], tally["stock_checked"]
        ),
        "The plan made after 2026-09 (2 months ago)".to_string(),
    ] {
        assert!(summary.contains(&said), "{said}: {summary}");
    }

    // The open item's periods since, one by one, as the command line's.
    let shown = browser.js(
        "return [...document.querySelectorAll('#item-look-back-table tbody tr')].map(r => r.children[3].textContent)",
    );
    let sold: Vec<String> = items[0]["periods"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| format!("{}", p["sold"].as_f64().unwrap()))
        .collect();
    assert_eq!(shown, json!(sold), "the open item's periods since");
    browser.js("document.getElementById('item-look-back').scrollIntoView()");
    save_screenshot(browser, "item-look-back.png");
    browser.js("window.scrollTo(0, 0)");

    // Show only the items whose stock level fell short: as many as the command line says.
    let short = items
        .iter()
        .filter(|i| i["stock"]["covered"] == false)
        .count();
    let show = |value: &str| {
        browser.js_args(
            "const s = document.getElementById('board-alert'); s.value = arguments[0]; \
             s.dispatchEvent(new Event('change', { bubbles: true }));",
            json!([value]),
        )
    };
    show("short-stock");
    browser.wait_for_args(
        "only the items whose stock level fell short",
        "return document.getElementById('board-count').textContent.startsWith('Showing ' + arguments[0] + ' of ' + arguments[0] + ' matching')",
        json!([short]),
        WAIT,
    );
    show("all");
    browser.wait_for(
        "every item again",
        "return document.querySelectorAll('#board-table tbody tr').length === 6",
        WAIT,
    );

    // The saved Look-back: a row per item, its within count as the command line's.
    let (file, csv) = saved_by(browser, "export-look-back");
    assert!(
        file.contains("look-back") && file.ends_with(".csv"),
        "{file}"
    );
    let lines: Vec<&str> = csv.lines().collect();
    assert_eq!(lines.len(), 1 + items.len(), "{csv}");
    let within_at = lines[0].split(',').position(|c| c == "within").unwrap();
    for (line, item) in lines[1..].iter().zip(items) {
        let within = within_count(item);
        assert!(line.starts_with(item["name"].as_str().unwrap()), "{line}");
        assert_eq!(
            line.split(',').nth(within_at),
            Some(within.to_string().as_str()),
            "{line}"
        );
    }

    // A look back the field does not take is refused in words; the board keeps its counts.
    look_back(browser, "2.5");
    let refused = browser.wait_for(
        "the refusal",
        "const p = document.querySelector('.look-back-tools .problem'); return p ? p.textContent : ''",
        WAIT,
    );
    let refused = refused.as_str().unwrap();
    assert!(
        refused.contains("found \"2.5\". The Look-back shown is still of 2 months."),
        "{refused}"
    );
    let invalid = browser
        .js("return document.getElementById('board-look-back').getAttribute('aria-invalid')");
    assert_eq!(invalid, json!("true"));
    // 0 takes the Look-back away.
    look_back(browser, "0");
    browser.wait_for_args(
        "the Look-back gone",
        "return !document.getElementById('board-look-back-summary') && \
         ![...document.querySelectorAll('#board-table thead th')].some(h => h.textContent.startsWith(arguments[0]))",
        json!(["Look-back"]),
        WAIT,
    );
    wait_until_planned(browser, 6);
}

/// A share link made with `morrowcast link --look-back 2` opens the board with that Look-back:
/// the field shows it, the counts are there, and the notice names it.
#[test]
fn a_share_link_opens_the_board_with_its_look_back() {
    let demo = cli(&["demo"], b"").stdout;
    let made = cli(&["link", "-", "--look-back", "2"], &demo);
    assert_eq!(made.code, 0, "{}", made.stderr);
    let link = made.text();
    let fragment = link[link.find('#').unwrap()..].trim().to_string();
    let Some(page) = open_at((1366, 900), &fragment) else {
        return;
    };
    let browser = &page.browser;
    browser.wait_for(
        "the Look-back's counts",
        "const s = document.getElementById('board-look-back-summary'); \
         return !!s && s.textContent.includes('(2 months ago)') && s.textContent.includes('for 6 items')",
        WAIT,
    );
    let field = browser.js("return document.getElementById('board-look-back').value");
    assert_eq!(field, json!("2"));
}
