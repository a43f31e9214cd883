//! Nothing lost: the work kept in this browser (IndexedDB) comes back after a reload and in a
//! new tab, a share link opened (at the start or put into an open tab's address) sets it
//! aside to be brought back, "Forget it now" removes it
//! at once and stops keeping, and a write the browser
//! refuses is said so, with nothing older left to come back as if it were current.
//!
//! Kept apart from: share links and work files (share.rs).

use serde_json::json;

use super::board::{many_items, set_field, wait_until_planned};
use super::page::{
    assert_work_notice, demo_link, open, open_link, paste, save_screenshot, wait_for_item, WAIT,
};
use super::webdriver::Browser;

const TROWEL: &str =
    "month,Trowel\n2024-01,5\n2024-02,6\n2024-03,5\n2024-04,7\n2024-05,6\n2024-06,8\n";

/// Waits until this browser's kept history text is `text` (`None`: nothing kept), read from
/// IndexedDB by the test.
pub(super) fn wait_until_kept(browser: &Browser, text: Option<&str>) {
    browser.wait_for_args(
        "the history kept in this browser",
        "if (!window.__reading) { window.__reading = true; \
           const r = indexedDB.open('morrowcast'); \
           r.onsuccess = () => { const db = r.result; \
             if (!db.objectStoreNames.contains('work')) { window.__reading = false; db.close(); return; } \
             const g = db.transaction('work').objectStore('work').get('history'); \
             g.onsuccess = () => { window.__kept = g.result; window.__reading = false; db.close(); }; \
             g.onerror = () => { window.__reading = false; db.close(); }; }; \
           r.onerror = () => { window.__reading = false; }; } \
         return (window.__kept === undefined ? null : window.__kept) === arguments[0];",
        json!([text]),
        WAIT,
    );
}

/// From the demo, pastes the Trowel table and waits until this browser keeps it.
fn paste_and_keep_trowel(browser: &Browser) {
    wait_for_item(browser, "Seed packets");
    paste(browser, TROWEL);
    wait_for_item(browser, "Trowel");
    wait_until_kept(browser, Some(TROWEL));
}

fn status(browser: &Browser) -> String {
    browser
        .js("return document.getElementById('kept-status').textContent")
        .as_str()
        .unwrap_or("")
        .to_string()
}

#[test]
fn a_reload_and_a_new_tab_bring_the_work_back_and_forget_removes_it() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let (server, browser) = (&page.server, &page.browser);
    wait_for_item(browser, "Seed packets");
    paste(browser, TROWEL);
    set_field(browser, "level", "90");
    wait_for_item(browser, "Trowel");
    wait_until_kept(browser, Some(TROWEL));
    browser.wait_for(
        "the kept status",
        "return document.getElementById('kept-status').textContent.startsWith('Kept at')",
        WAIT,
    );
    // The level is written after a pause: wait for the desk record too.
    std::thread::sleep(std::time::Duration::from_millis(800));
    let address = format!("{}/index.html", server.origin);

    // A reload: the same work, said so.
    browser.goto(&address);
    wait_for_item(browser, "Trowel");
    assert_work_notice(browser, "Opened the work kept in this browser:");
    assert_eq!(
        browser.js("return document.getElementById('level').value"),
        json!("90")
    );
    browser.js("document.getElementById('kept-here').scrollIntoView()");
    save_screenshot(browser, "kept-reloaded.png");

    // A new tab of the same browser: the same work.
    let first = browser.new_tab();
    browser.goto(&address);
    wait_for_item(browser, "Trowel");
    browser.close_tab(&first);

    // A colleague's share link opens, and the desk kept here is set aside, not lost.
    open_link(
        browser,
        &demo_link(&["--item", "Gift card", "--page", &address]),
    );
    wait_for_item(browser, "Gift card");
    browser.wait_for(
        "the desk set aside",
        "return !!document.getElementById('set-aside')",
        WAIT,
    );
    // Still there to bring back after a reload (the link's desk is the kept one meanwhile).
    std::thread::sleep(std::time::Duration::from_millis(800));
    browser.goto(&address);
    wait_for_item(browser, "Gift card");
    browser.wait_for(
        "the desk still set aside after a reload",
        "return !!document.getElementById('set-aside')",
        WAIT,
    );
    browser.js("document.getElementById('bring-back').click()");
    wait_for_item(browser, "Trowel");
    assert_work_notice(browser, "Opened the desk set aside:");
    wait_until_kept(browser, Some(TROWEL));

    // Forget it now: removed at once, and not kept again until allowed.
    browser.js("document.getElementById('forget-work').click()");
    browser.wait_for(
        "the work forgotten",
        "return document.getElementById('kept-status').textContent.startsWith('Forgotten')",
        WAIT,
    );
    assert_eq!(
        browser.js("return document.getElementById('keep-work').checked"),
        json!(false)
    );
    wait_until_kept(browser, None);
    browser.goto(&address);
    wait_for_item(browser, "Seed packets");
    assert!(
        status(browser).starts_with("Not kept"),
        "{}",
        status(browser)
    );
    // Allowed again: the desk is kept from then on.
    browser.js("document.getElementById('keep-work').click()");
    wait_until_kept(browser, Some(&morrowcast_engine::demo::demo_csv()));
}

#[test]
fn a_link_put_into_the_address_of_an_open_tab_opens_without_a_reload() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let (server, browser) = (&page.server, &page.browser);
    let address = format!("{}/index.html", server.origin);
    browser.goto(&address);
    paste_and_keep_trowel(browser);
    browser.js("window.__same_load = true");
    // Same page address, a new fragment: the browser does not load the page again.
    browser.goto(&demo_link(&["--item", "Gift card", "--page", &address]));
    wait_for_item(browser, "Gift card");
    assert_work_notice(browser, "Opened the share link:");
    assert_eq!(
        browser.js("return window.__same_load === true && location.hash === ''"),
        json!(true),
        "opened in the same load, the fragment taken out of the address"
    );
    browser.wait_for(
        "the desk set aside",
        "return !!document.getElementById('set-aside')",
        WAIT,
    );
    wait_until_kept(browser, Some(&morrowcast_engine::demo::demo_csv()));
    browser.js("document.getElementById('bring-back').click()");
    wait_for_item(browser, "Trowel");
    wait_until_kept(browser, Some(TROWEL));
}

#[test]
fn a_write_the_browser_refuses_is_said_and_nothing_older_comes_back() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let (server, browser) = (&page.server, &page.browser);
    paste_and_keep_trowel(browser);
    // The browser's storage refuses from now on, as when it is full.
    browser.js("IDBObjectStore.prototype.put = function () { \
           throw new DOMException('The quota has been exceeded.', 'QuotaExceededError'); };");
    let text = many_items();
    paste(browser, &text);
    wait_until_planned(browser, 12);
    browser.wait_for(
        "the notice that the work is not kept",
        "const n = document.getElementById('kept-failed'); return !!n && n.textContent.includes('QuotaExceededError')",
        WAIT,
    );
    browser.js("document.getElementById('kept-here').scrollIntoView()");
    save_screenshot(browser, "kept-refused.png");
    // The data stays on the page; the older Trowel table was removed from the browser.
    assert_eq!(
        browser.js("return document.getElementById('intake-text').value.length"),
        json!(text.len())
    );
    wait_until_kept(browser, None);
    // A reload: not the older Trowel table, but the demo of a first visit.
    browser.goto(&format!("{}/index.html", server.origin));
    wait_for_item(browser, "Seed packets");
}

/// Two tabs on one desk: the tab that changes only a setting after the other tab kept another
/// history writes its own history with its desk, never its desk alone over the other's.
#[test]
fn two_tabs_never_leave_one_tabs_desk_with_the_others_history() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let (server, browser) = (&page.server, &page.browser);
    paste_and_keep_trowel(browser);
    // Another tab keeps another history.
    let first = browser.new_tab();
    browser.goto(&format!("{}/index.html", server.origin));
    wait_for_item(browser, "Trowel");
    let rake = "month,Rake\n2024-01,2\n2024-02,3\n2024-03,2\n2024-04,4\n2024-05,3\n2024-06,5\n";
    paste(browser, rake);
    wait_for_item(browser, "Rake");
    wait_until_kept(browser, Some(rake));
    browser.close_tab(&first);
    // The first tab changes a setting only: its own history is kept again with it.
    browser.js("window.__reading = false; window.__kept = undefined;");
    set_field(browser, "level", "80");
    wait_until_kept(browser, Some(TROWEL));
}
