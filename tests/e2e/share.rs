//! Share links and work files end to end: the whole desk (data, settings, stock settings and
//! stock table, an item's own settings, the open item) put in a link, opened in a fresh page
//! load to the same numbers, read by the command line to the same order plan, saved as a work
//! file and dropped back; a link cut short refused with a message while the page starts as
//! usual.
//!
//! Kept apart from: the format's own checks (tests/work.rs). The data is the demo's.

use serde_json::json;

use super::board::{saved_by, saved_order_plan, set_field, wait_until_planned};
use super::page::{
    assert_work_notice, demo_link, forecast_table, open, open_at, open_link, paste,
    save_screenshot, wait_for_item, work_notice, WAIT,
};
use super::webdriver::Browser;
use crate::board::compare;
use crate::support::{cli, table_file};
use morrowcast_work::Work;

const STOCK_TABLE: &str = "item,on hand,on order\nFrost cloth,30,5\nTerracotta pot,12,0\n";

fn text_of(browser: &Browser, id: &str) -> String {
    let v = browser.js_args(
        "const e = document.getElementById(arguments[0]); return e ? (e.value !== undefined && e.tagName !== 'P' && e.tagName !== 'SPAN' ? e.value : e.textContent) : null",
        json!([id]),
    );
    v.as_str().unwrap_or_else(|| panic!("no #{id}")).to_string()
}

/// Waits for the board's row of `name` to be marked changed and planned with `months` (the
/// demo's periods).
fn wait_for_changed_row(browser: &Browser, name: &str, months: usize) {
    browser.wait_for_args(
        "the changed item replanned",
        "const r = [...document.querySelectorAll('#board-table tbody tr')].find(r => r.querySelector('th').textContent.startsWith(arguments[0])); \
         return !!r && r.textContent.includes('(changed)') && r.textContent.includes(' in ' + arguments[1] + ' months') \
           && document.getElementById('board-progress').textContent.startsWith('Planned all');",
        json!([name, months]),
        WAIT,
    );
}

#[test]
fn a_share_link_and_a_work_file_carry_the_whole_desk() {
    let Some(page) = open((1366, 1000)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    wait_until_planned(browser, 6);
    set_field(browser, "level", "90");
    set_field(browser, "lead-time", "3");
    set_field(browser, "stock-table", STOCK_TABLE);
    wait_until_planned(browser, 6);
    browser.wait_for_args(
        "the item's row to open",
        "const b = [...document.querySelectorAll('#board-table .open-item')].find(b => b.textContent === arguments[0]); \
         if (b) b.click(); return !!b;",
        json!(["Frost cloth"]),
        WAIT,
    );
    wait_for_item(browser, "Frost cloth");
    set_field(browser, "item-lead-time", "5");
    set_field(browser, "item-season", "none");
    browser.js("document.getElementById('item-change-apply').click()");
    wait_for_changed_row(browser, "Frost cloth", 5);
    wait_until_planned(browser, 6);
    wait_for_item(browser, "Frost cloth");
    let table_before = forecast_table(browser);
    let (_, plan_before) = saved_order_plan(browser);

    browser.js("document.getElementById('make-link').click()");
    let link = text_of(browser, "share-link");
    assert!(link.contains("#w1."), "{link:.80}");
    let length = text_of(browser, "share-link-length");
    assert!(length.ends_with("characters)"), "{length}");
    assert!(text_of(browser, "share-link-carries").contains("whoever has the link has the data"));
    browser.js("document.getElementById('share').scrollIntoView()");
    save_screenshot(browser, "share-link.png");

    // The command line reads the same link to the same order plan.
    let run = cli(&["stock", &link, "--json"], b"");
    assert_eq!(run.code, 0, "{}", run.stderr);
    compare(&plan_before, &run.json());

    // Opened in a fresh page load: the same desk, the same numbers.
    open_link(browser, &link);
    wait_for_item(browser, "Frost cloth");
    wait_until_planned(browser, 6);
    wait_for_changed_row(browser, "Frost cloth", 5);
    assert_work_notice(browser, "Opened the share link:");
    assert_eq!(forecast_table(browser), table_before);
    let (_, plan_after) = saved_order_plan(browser);
    assert_eq!(plan_after, plan_before);
    assert_eq!(
        browser.js("return location.hash"),
        json!(""),
        "the link leaves the address"
    );
    assert_eq!(text_of(browser, "level"), "90");
    assert_eq!(text_of(browser, "lead-time"), "3");
    assert_eq!(text_of(browser, "stock-source"), "pasted text");
    browser.js("document.getElementById('intake').scrollIntoView()");
    save_screenshot(browser, "share-link-opened.png");

    // The work file: the same desk as the link; the command line's order plan is the page's.
    let (name, file) = saved_by(browser, "save-work");
    assert!(
        name.starts_with("morrowcast-the-demo-work-20") && name.ends_with(".json"),
        "{name}"
    );
    assert_eq!(Work::read(&file).unwrap(), Work::read(&link).unwrap());
    let path = table_file("e2e-share-work.json", &file);
    let run = cli(&["stock", &path, "--json"], b"");
    assert_eq!(run.code, 0, "{}", run.stderr);
    compare(&plan_after, &run.json());

    // Another table pasted, then the work file dropped on Intake: the desk comes back.
    paste(
        browser,
        "month,units\n2025-01,4\n2025-02,6\n2025-03,5\n2025-04,7\n2025-05,6\n2025-06,8\n",
    );
    browser.wait_for(
        "the pasted table planned",
        "return document.getElementById('item-name') && !document.getElementById('board-table')",
        WAIT,
    );
    browser.js_args(
        "const dt = new DataTransfer(); \
         dt.items.add(new File([arguments[0]], 'desk.json', { type: 'application/json' })); \
         document.getElementById('drop-zone').dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));",
        json!([file]),
    );
    wait_for_item(browser, "Frost cloth");
    wait_until_planned(browser, 6);
    wait_for_changed_row(browser, "Frost cloth", 5);
    assert_eq!(
        work_notice(browser),
        "Opened the work file desk.json: the data (the demo), the settings, the Stock plan's \
         settings, the stock table and own settings for 1 item."
    );
    let (_, plan_dropped) = saved_order_plan(browser);
    assert_eq!(plan_dropped, plan_before);
}

#[test]
fn a_link_cut_short_is_refused_and_the_page_starts_as_usual() {
    let demo = morrowcast_engine::demo::demo_csv();
    let link = demo_link(&["--item", "Gift card"]);
    let fragment = link.split_once('#').unwrap().1;
    let cut = format!("#{}", &fragment[..fragment.len() / 2]);
    let Some(page) = open_at((1366, 900), &cut) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    assert_work_notice(
        browser,
        "The share link: this share link is cut short or damaged",
    );
    assert_eq!(
        browser.js("return document.getElementById('work-notice').getAttribute('role')"),
        json!("alert")
    );
    browser.js("document.getElementById('intake').scrollIntoView()");
    save_screenshot(browser, "share-link-refused.png");

    // A damaged link pasted into Intake: said so; the box shows the data it had (the demo).
    let before = browser.js("return document.getElementById('intake-text').value");
    assert_eq!(before, json!(demo));
    paste(
        browser,
        &format!("http://127.0.0.1:8080/#{}", &fragment[..fragment.len() - 3]),
    );
    assert_work_notice(
        browser,
        "The pasted share link: this share link is cut short",
    );
    assert_eq!(
        browser.js("return document.getElementById('intake-text').value"),
        before
    );
}
