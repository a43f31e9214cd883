//! The single file (dist/morrowcast.html, scripts/single-file.sh) opened from disk: the demo
//! planned, the Item board filled by its workers, nothing loaded from any other file, the
//! policy still forbidding every connection, the work kept for a reload; and opened with a
//! share link's fragment.

use serde_json::json;

use super::board::wait_until_planned;
use super::engine_match::drop_on;
use super::keep::wait_until_kept;
use super::page::{
    assert_work_notice, demo_link, forecast_table, open, open_file, open_file_in, open_link, paste,
    save_screenshot, wait_for_item, WAIT,
};

#[test]
fn the_single_file_runs_from_disk_like_the_served_page() {
    // The served page's forecast of the demo's first item, to compare with.
    let served = {
        let Some(page) = open((1366, 900)) else {
            return;
        };
        wait_for_item(&page.browser, "Seed packets");
        forecast_table(&page.browser)
    };
    let Some(page) = open_file((1366, 900), "") else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    wait_until_planned(browser, 6);
    assert_eq!(browser.js("return location.protocol"), json!("file:"));
    assert_eq!(forecast_table(browser), served);
    // Every resource the page used came from inside it (blob: workers, data: icon).
    let outside = browser.js(
        "return performance.getEntriesByType('resource').map(e => e.name).filter(n => !n.startsWith('blob:') && !n.startsWith('data:'))",
    );
    assert_eq!(outside, json!([]), "loaded from outside the file");
    let policy = browser.js(
        "return document.querySelector('meta[http-equiv=\"Content-Security-Policy\"]').content",
    );
    let policy = policy.as_str().unwrap();
    assert!(
        policy.contains("connect-src 'none'") && policy.contains("script-src 'sha256-"),
        "{policy}"
    );
    assert!(!policy.contains("'unsafe-inline'"), "{policy}");
    let kept = browser.wait_for(
        "the keeping status",
        "const s = document.getElementById('kept-status'); const f = document.getElementById('kept-failed'); \
         return (f && f.textContent) || (s && !s.textContent.startsWith('Looking') && !s.textContent.startsWith('Keeping this') && s.textContent) || null",
        WAIT,
    );
    assert!(kept.as_str().unwrap().starts_with("Kept at"), "{kept}");
    save_screenshot(browser, "single-file.png");
    // This browser keeps the work of a page from disk too: a reload brings it back.
    let file = browser.js("return location.href");
    open_link(browser, file.as_str().unwrap());
    wait_for_item(browser, "Seed packets");
    assert_work_notice(browser, "Opened the work kept in this browser:");
}

#[test]
fn the_single_file_opens_a_share_link() {
    let Some(page) = open_file((1366, 900), "") else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let file = browser.js("return location.href.split('#')[0]");
    let link = demo_link(&[
        "--item",
        "Gift card",
        "--level",
        "80",
        "--page",
        file.as_str().unwrap(),
    ]);
    open_link(browser, &link);
    wait_for_item(browser, "Gift card");
    assert_work_notice(browser, "Opened the share link:");
    assert_eq!(
        browser.js("return document.getElementById('level').value"),
        json!("80")
    );
    wait_until_planned(browser, 6);
}

/// A workbook dropped on the single file is read by the reading worker the file carries
/// inside itself (started from a data: address at the first workbook): the sales sheet fills
/// the box and its items are planned, as on the served page.
#[test]
fn the_single_file_reads_a_dropped_workbook() {
    let Some(page) = open_file((1366, 900), "") else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let book = super::engine_match::workbooks_fixture("sales.xlsx");
    drop_on(browser, "drop-zone", &book, "sales.xlsx");
    browser.wait_for(
        "the workbook's sheet as the source",
        "return document.getElementById('intake-source').textContent === 'sales.xlsx, sheet \u{201c}Sales\u{201d}'",
        WAIT,
    );
    wait_until_planned(browser, 3);
    let outside = browser.js(
        "return performance.getEntriesByType('resource').map(e => e.name).filter(n => !n.startsWith('blob:') && !n.startsWith('data:'))",
    );
    assert_eq!(outside, json!([]), "loaded from outside the file");
}

/// The work kept in this browser survives closing the browser and starting it again (the same
/// profile; the single file, whose address stays the same between runs).
#[test]
fn the_work_comes_back_after_the_browser_is_restarted() {
    let profile =
        std::env::temp_dir().join(format!("morrowcast-e2e-restart-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&profile);
    let table = "month,Trowel\n2024-01,5\n2024-02,6\n2024-03,5\n2024-04,7\n2024-05,6\n2024-06,8\n";
    {
        let Some(page) = open_file_in((1366, 900), "", Some(&profile)) else {
            return;
        };
        wait_for_item(&page.browser, "Seed packets");
        paste(&page.browser, table);
        wait_for_item(&page.browser, "Trowel");
        wait_until_kept(&page.browser, Some(table));
    }
    // The browser is closed (its page dropped); a new one starts on the same profile.
    std::thread::sleep(std::time::Duration::from_millis(500));
    let reopened = open_file_in((1366, 900), "", Some(&profile));
    let page = reopened.expect("the second browser");
    wait_for_item(&page.browser, "Trowel");
    assert_work_notice(&page.browser, "Opened the work kept in this browser:");
    drop(page);
    let _ = std::fs::remove_dir_all(&profile);
}
