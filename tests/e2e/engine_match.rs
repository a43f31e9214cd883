//! The page against the command line on the same text: a pasted table of two items, a dropped
//! file, and the forecast CSV the page saves, each compared with `morrowcast forecast --json`.
//!
//! Kept apart from: the demo tests (tests/e2e/demo.rs). The data is invented for these tests
//! (two items of 36 months); the reference is the engine itself run natively, so the check is
//! that the page computes, rounds, shows and exports what the engine does.

use serde_json::{json, Value};

use super::page::{engine_plan, forecast_table, open, paste, save_screenshot, wait_for_item, WAIT};
use super::webdriver::Browser;

/// Two items of three years of months (invented: a season with a rising trend, and a flat one).
const TWO_ITEMS: &str = "month,Seed trays,Garden twine
2023-01,83,28
2023-02,96,32
2023-03,131,27
2023-04,155,34
2023-05,161,29
2023-06,170,32
2023-07,174,32
2023-08,145,26
2023-09,131,32
2023-10,112,28
2023-11,88,31
2023-12,86,33
2024-01,100,30
2024-02,124,30
2024-03,146,30
2024-04,164,29
2024-05,188,27
2024-06,196,32
2024-07,188,27
2024-08,168,33
2024-09,152,29
2024-10,121,33
2024-11,108,30
2024-12,108,28
2025-01,112,27
2025-02,131,33
2025-03,155,31
2025-04,185,33
2025-05,203,29
2025-06,201,30
2025-07,200,34
2025-08,189,31
2025-09,170,30
2025-10,148,29
2025-11,136,27
2025-12,124,32
";

/// The same twine history as a tab-separated file, as a user would drop it.
fn twine_tsv() -> String {
    let mut out = String::from("month\tGarden twine\n");
    for line in TWO_ITEMS.lines().skip(1) {
        let cells: Vec<&str> = line.split(',').collect();
        out.push_str(&format!("{}\t{}\n", cells[0], cells[2]));
    }
    out
}

/// The page's method label (forecast table caption) and every table row equal the engine's,
/// rounded as the page rounds (one decimal).
fn assert_page_shows(browser: &Browser, plan: &Value) {
    let label = plan["chosen_label"].as_str().unwrap();
    let caption =
        browser.js("return document.querySelector('#forecast-table caption').textContent");
    assert_eq!(
        caption.as_str().unwrap_or(""),
        format!("Forecast by {label} with its 95% band"),
        "method or level differs from the engine's"
    );
    let lead = browser.js("return document.querySelector('#headline .lead').textContent");
    assert!(
        lead.as_str()
            .unwrap_or("")
            .contains(&format!("by {label},")),
        "headline: {lead}"
    );
    let shown = forecast_table(browser);
    let engine: Vec<Vec<String>> = plan["forecast"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| {
            let one = |k: &str| format!("{:.1}", p[k].as_f64().unwrap());
            vec![
                p["period"].as_str().unwrap().to_string(),
                one("value"),
                one("low"),
                one("high"),
            ]
        })
        .collect();
    assert!(!engine.is_empty());
    assert_eq!(
        shown, engine,
        "forecast table (page) vs morrowcast forecast --json"
    );
}

/// A pasted table of two items: the first item's method and forecast table equal the command
/// line's; choosing the second item shows the command line's numbers for it.
#[test]
fn pasted_table_shows_the_engines_numbers() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    // The demo (first item "Seed packets") loads first; then the paste replaces it.
    wait_for_item(browser, "Seed packets");
    paste(browser, TWO_ITEMS);
    wait_for_item(browser, "Seed trays");
    assert_page_shows(browser, &engine_plan(TWO_ITEMS, "Seed trays"));
    let options = browser
        .js("return [...document.querySelectorAll('#item-choice option')].map(o => o.textContent)");
    assert_eq!(options, json!(["Seed trays", "Garden twine"]));
    save_screenshot(browser, "paste-two-items.png");

    browser.js(
        "const s = document.getElementById('item-choice'); s.value = '1'; \
         s.dispatchEvent(new Event('change', { bubbles: true }));",
    );
    wait_for_item(browser, "Garden twine");
    assert_page_shows(browser, &engine_plan(TWO_ITEMS, "Garden twine"));
    save_screenshot(browser, "paste-second-item.png");
}

/// Sales kept as a year down and its months across (`Item,Year,Jan,...,Dec`), pasted: the
/// report says the layout, and the page plans each item as the engine does.
#[test]
fn a_year_down_with_its_months_across_is_planned() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let mut text = String::from("Item,Year,Jan,Feb,Mar,Apr,May,Jun,Jul,Aug,Sep,Oct,Nov,Dec\n");
    for (item, base) in [("Trowel", 20), ("Kneeling pad", 8)] {
        for year in 2022..=2024 {
            let months: Vec<String> = (1..=12)
                .map(|m| {
                    (base + (m * 7 + year) % 9 + if (4..=7).contains(&m) { 6 } else { 0 })
                        .to_string()
                })
                .collect();
            text.push_str(&format!("{item},{year},{}\n", months.join(",")));
        }
    }
    paste(browser, &text);
    wait_for_item(browser, "Trowel");
    let report = browser.js("return document.getElementById('intake-report').textContent");
    assert!(
        report.as_str().unwrap_or("").contains("per item and year"),
        "{report}"
    );
    assert_page_shows(browser, &engine_plan(&text, "Trowel"));
    super::board::wait_until_planned(browser, 2);
    save_screenshot(browser, "year-grid-pasted.png");
}

/// A file dropped on the drop zone (a DataTransfer holding a File, as a drag from the desktop
/// delivers it) is read: its text fills the box, its name is the source, its plan is the
/// engine's.
#[test]
fn dropped_file_is_read() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let tsv = twine_tsv();
    let name = "garden-twine.tsv";
    browser.js_args(
        "const dt = new DataTransfer(); \
         dt.items.add(new File([arguments[0]], arguments[1], { type: 'text/tab-separated-values' })); \
         window.__dropData = dt;",
        json!([tsv, name]),
    );
    // A drop zone must cancel dragover, or a real browser never delivers the drop.
    let accepted = browser.js(
        "const z = document.getElementById('drop-zone'); \
         const ev = t => z.dispatchEvent(new DragEvent(t, { dataTransfer: window.__dropData, bubbles: true, cancelable: true })); \
         ev('dragenter'); return ev('dragover');",
    );
    assert_eq!(accepted, json!(false), "dragover was not cancelled");
    browser.wait_for(
        "the drop zone to show the drag",
        "const z = document.getElementById('drop-zone'); \
         return z.classList.contains('dragging') && z.textContent.includes('Let go to read the file')",
        WAIT,
    );
    save_screenshot(browser, "drop-dragging.png");
    browser.js(
        "document.getElementById('drop-zone').dispatchEvent(new DragEvent('drop', \
           { dataTransfer: window.__dropData, bubbles: true, cancelable: true }));",
    );
    browser.wait_for_args(
        "the dropped file's name as the source",
        "return document.getElementById('intake-source').textContent === arguments[0]",
        json!([name]),
        WAIT,
    );
    let kept = browser.js("return document.getElementById('intake-text').value");
    assert_eq!(
        kept.as_str().unwrap_or(""),
        tsv,
        "the box holds the file's text"
    );
    let report = browser.js("return document.getElementById('intake-report').textContent");
    assert!(
        report
            .as_str()
            .unwrap_or("")
            .contains("Columns separated by tabs"),
        "intake report: {report}"
    );
    let dragging =
        browser.js("return document.getElementById('drop-zone').classList.contains('dragging')");
    assert_eq!(dragging, json!(false));
    wait_for_item(browser, "Garden twine");
    assert_page_shows(browser, &engine_plan(&tsv, "Garden twine"));
    save_screenshot(browser, "drop-read.png");
}

/// The forecast CSV the page saves equals the engine's forecast. The test catches the Blob the
/// button hands to the browser (URL.createObjectURL) and the file name on the link it clicks,
/// so the page's own download path runs unchanged; only the final click is kept from saving.
#[test]
fn exported_forecast_csv_equals_the_engines() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    paste(browser, TWO_ITEMS);
    wait_for_item(browser, "Seed trays");
    let caught = browser.js(
        "window.__saved = []; \
         const make = URL.createObjectURL; \
         URL.createObjectURL = function (blob) { window.__saved.push({ blob, name: null }); return make.call(URL, blob); }; \
         HTMLAnchorElement.prototype.click = function () { const s = window.__saved[window.__saved.length - 1]; if (s) s.name = this.download; }; \
         document.getElementById('export-forecast').click(); \
         const s = window.__saved[0]; \
         if (!s) return null; \
         s.blob.text().then(t => { window.__savedText = t; }); \
         return [window.__saved.length, s.name, s.blob.type];",
    );
    let caught = caught.as_array().expect("the button made no blob");
    assert_eq!(caught[0], json!(1), "one download per click");
    let file_name = caught[1].as_str().unwrap_or("");
    assert!(
        file_name.starts_with("morrowcast-seed-trays-forecast-20") && file_name.ends_with(".csv"),
        "file name: {file_name}"
    );
    assert_eq!(caught[2], json!("text/csv"));
    let text = browser.wait_for(
        "the saved CSV text",
        "return window.__savedText || ''",
        WAIT,
    );
    let text = text.as_str().unwrap().to_string();

    let plan = engine_plan(TWO_ITEMS, "Seed trays");
    let mut rows = csv::Reader::from_reader(text.as_bytes());
    assert_eq!(
        rows.headers().unwrap(),
        vec!["period", "value", "low", "high", "method", "level"]
    );
    let rows: Vec<csv::StringRecord> = rows.records().map(|r| r.unwrap()).collect();
    let engine = plan["forecast"].as_array().unwrap();
    assert_eq!(rows.len(), engine.len(), "{text}");
    for (row, point) in rows.iter().zip(engine) {
        assert_eq!(row[0], *point["period"].as_str().unwrap());
        for (i, key) in [(1, "value"), (2, "low"), (3, "high")] {
            let saved: f64 = row[i].parse().unwrap();
            let wanted = point[key].as_f64().unwrap();
            // Both sides print shortest round-trip decimals, so equal doubles give equal text;
            // the tolerance allows only last-bit differences between wasm's and the native
            // maths library (exp, ln, powf).
            assert!(
                (saved - wanted).abs() <= 1e-9 * wanted.abs().max(1.0),
                "{} {key}: saved {saved}, engine {wanted}",
                &row[0]
            );
        }
        assert_eq!(row[4], *plan["chosen_label"].as_str().unwrap());
        assert_eq!(
            row[5].parse::<f64>().unwrap(),
            plan["level"].as_f64().unwrap()
        );
    }
    save_screenshot(browser, "export-forecast.png");
}

/// Drops a file holding `bytes` (a JSON array of byte values) named `name` on the drop zone.
fn drop_bytes(browser: &Browser, bytes: &[u8], name: &str) {
    browser.js_args(
        "const dt = new DataTransfer(); \
         dt.items.add(new File([new Uint8Array(arguments[0])], arguments[1])); \
         const z = document.getElementById('drop-zone'); \
         z.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));",
        json!([bytes, name]),
    );
    browser.wait_for_args(
        "the dropped file's name as the source",
        "return document.getElementById('intake-source').textContent === arguments[0]",
        json!([name]),
        WAIT,
    );
}

/// A file's bytes are decoded by the engine, not by the browser: a UTF-16 export (as
/// spreadsheets write "Unicode text") is read whole, and a byte that is not text is reported at
/// its line (the browser's own decoding used to replace it without a word).
#[test]
fn dropped_bytes_are_decoded_by_the_engine() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let tsv = twine_tsv();
    let utf16: Vec<u8> = [0xFF, 0xFE]
        .into_iter()
        .chain(tsv.encode_utf16().flat_map(u16::to_le_bytes))
        .collect();
    drop_bytes(browser, &utf16, "twine-unicode.txt");
    wait_for_item(browser, "Garden twine");
    assert_page_shows(browser, &engine_plan(&tsv, "Garden twine"));

    let mut latin1 = b"month,Caf\xE9 chairs\n".to_vec();
    for line in TWO_ITEMS.lines().skip(1) {
        let cells: Vec<&str> = line.split(',').collect();
        latin1.extend_from_slice(format!("{},{}\n", cells[0], cells[1]).as_bytes());
    }
    drop_bytes(browser, &latin1, "chairs-latin1.csv");
    browser.wait_for(
        "the undecodable byte reported at its line",
        "const e = document.getElementById('row-errors'); \
         return !!e && e.textContent.includes('Row 1') && e.textContent.includes('\u{fffd}')",
        WAIT,
    );
    save_screenshot(browser, "drop-latin1.png");
}

/// A typing error in a pasted item: the Look-ahead rings the period the command line's
/// Outliers alert names, and says so in its summary; the clean item has no ring.
#[test]
fn a_typing_error_is_ringed_where_the_outliers_alert_names_it() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    // Garden twine's 2024-06 typed ten times too large (32 as 320).
    let text = TWO_ITEMS.replace("2024-06,196,32", "2024-06,196,320");
    let out = crate::support::cli(&["stock", "-", "--json"], text.as_bytes());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let json = out.json();
    let alert_of = |item: &str| {
        crate::support::item_named(&json, item)["alerts"]
            .as_array()
            .unwrap()
            .iter()
            .find(|a| a["kind"] == "outliers")
            .map(|a| a["reason"].as_str().unwrap().to_string())
    };
    let reason = alert_of("Garden twine").expect("an outliers alert on Garden twine");
    assert!(reason.contains(": 2024-06"), "{reason}");
    assert_eq!(alert_of("Seed trays"), None);

    paste(browser, &text);
    wait_for_item(browser, "Seed trays");
    let summary = || {
        browser
            .js("return document.getElementById('look-ahead-chart-summary').textContent")
            .as_str()
            .unwrap_or("")
            .to_string()
    };
    assert!(!summary().contains("ringed"), "{}", summary());
    browser.js(
        "const s = document.getElementById('item-choice'); s.value = '1'; \
         s.dispatchEvent(new Event('change', { bubbles: true }));",
    );
    wait_for_item(browser, "Garden twine");
    browser.wait_for(
        "the ring's words in the Look-ahead summary",
        "return document.getElementById('look-ahead-chart-summary').textContent.includes('ringed: 2024-06')",
        WAIT,
    );
    save_screenshot(browser, "outlier-ringed.png");
}

/// A workbook dropped on Intake's drop zone and on the stock table's, as a planner keeps sales
/// and stock on two sheets of one file: the sales sheet's text fills the box (exactly the
/// text `scripts/workbook_fixtures.py` works out), named with its sheet, the notice names
/// the sheets not read, the items are planned, and the stock sheet gives the orders. An older
/// .xls is refused in words, the desk kept.
#[test]
fn a_dropped_workbook_is_read_sheet_by_sheet() {
    let Some(page) = open((1366, 900)) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    let book = workbooks_fixture("sales.xlsx");
    drop_on(browser, "drop-zone", &book, "sales.xlsx");
    browser.wait_for(
        "the workbook's sheet as the source",
        "return document.getElementById('intake-source').textContent === 'sales.xlsx, sheet \u{201c}Sales\u{201d}'",
        WAIT,
    );
    let text = browser.js("return document.getElementById('intake-text').value");
    let expected = String::from_utf8(workbooks_fixture("sales_with_title.csv")).unwrap();
    assert_eq!(text.as_str().unwrap_or(""), expected);
    let notice = browser.js("return document.getElementById('work-notice').textContent");
    let notice = notice.as_str().unwrap_or("");
    assert!(
        notice.contains("read the sheet \"Sales\"")
            && notice.contains("not read: \"Read me\", \"Stock\""),
        "{notice}"
    );
    wait_for_item(browser, "Seed packets");
    browser.js("document.getElementById('work-notice').scrollIntoView()");
    save_screenshot(browser, "workbook-dropped.png");
    drop_on(browser, "stock-drop", &book, "sales.xlsx");
    browser.wait_for(
        "the stock sheet as the stock table's source",
        "return document.getElementById('stock-source').textContent === 'sales.xlsx, sheet \u{201c}Stock\u{201d}'",
        WAIT,
    );
    let report = browser.wait_for(
        "the stock table's report",
        "const r = document.getElementById('stock-table-report'); return r && r.textContent.includes('Read 3 rows') && r.textContent",
        WAIT,
    );
    let errors = browser.js("return document.getElementById('stock-table-errors').textContent");
    assert_eq!(errors, json!(""), "{report}");
    super::board::wait_until_planned(browser, 3);
    let board = browser.js("return document.getElementById('item-board').textContent");
    assert!(
        !board.as_str().unwrap_or("").contains("needs on hand"),
        "{board}"
    );
    browser.js("window.scrollTo(0, 0)");
    save_screenshot(browser, "workbook-stock-sheet.png");
    // The workbook's sheets offered, the one read chosen.
    let offered = browser.js("const s = document.getElementById('sheet-choice'); \
         return [s.value, Array.from(s.options).map(o => o.value)]");
    assert_eq!(offered, json!(["Sales", ["Read me", "Sales", "Stock"]]));
    // An older binary workbook: refused, the desk as it was.
    drop_on(
        browser,
        "drop-zone",
        &workbooks_fixture("sales.xls"),
        "sales.xls",
    );
    let refused = browser.wait_for(
        "the .xls refused in words",
        "const n = document.getElementById('work-notice'); return n && n.textContent.includes('sales.xls could not be read') && n.textContent",
        WAIT,
    );
    assert!(
        refused
            .as_str()
            .unwrap_or("")
            .contains(".xlsx, .ods or CSV"),
        "{refused}"
    );
    let kept = browser.js("return document.getElementById('intake-text').value");
    assert_eq!(kept.as_str().unwrap_or(""), expected);
    // One sheet per year: refused until a sheet is chosen, then that sheet is read.
    drop_on(
        browser,
        "drop-zone",
        &workbooks_fixture("year_sheets.xlsx"),
        "year_sheets.xlsx",
    );
    browser.wait_for(
        "the sheets offered while which to read is unclear",
        "const s = document.getElementById('sheet-choice'); \
         return !!s && s.value === '' && s.options.length === 3 \
           && document.getElementById('work-notice').textContent.includes('same header')",
        WAIT,
    );
    browser.js("document.getElementById('work-notice').scrollIntoView()");
    save_screenshot(browser, "workbook-sheet-choice.png");
    browser.js(
        "const s = document.getElementById('sheet-choice'); s.value = '2025'; \
         s.dispatchEvent(new Event('change', { bubbles: true }));",
    );
    browser.wait_for(
        "the chosen sheet read",
        "return document.getElementById('intake-source').textContent === 'year_sheets.xlsx, sheet \u{201c}2025\u{201d}' \
           && document.getElementById('sheet-choice').value === '2025'",
        WAIT,
    );
    super::board::wait_until_planned(browser, 2);
    let text = browser.js("return document.getElementById('intake-text').value");
    assert!(
        text.as_str()
            .unwrap_or("")
            .contains("2025-06-01,Frost cloth"),
        "{text}"
    );
    // Typing in the box lets the workbook go.
    browser.js(
        "const t = document.getElementById('intake-text'); t.value = t.value + ' '; \
         t.dispatchEvent(new Event('input', { bubbles: true }));",
    );
    browser.wait_for(
        "the sheet choice gone",
        "return document.getElementById('sheet-choice') === null",
        WAIT,
    );
}

/// The bytes of the fixture `name` of tests/fixtures/workbooks (written by
/// scripts/workbook_fixtures.py).
pub(super) fn workbooks_fixture(name: &str) -> Vec<u8> {
    std::fs::read(format!(
        "{}/tests/fixtures/workbooks/{name}",
        env!("CARGO_MANIFEST_DIR")
    ))
    .expect("fixture")
}

/// Drops a file of `bytes` named `name` on the drop zone `zone` (Intake's or the stock
/// table's), as a drag from the desktop delivers it.
pub(super) fn drop_on(browser: &Browser, zone: &str, bytes: &[u8], name: &str) {
    browser.js_args(
        "const dt = new DataTransfer(); \
         dt.items.add(new File([new Uint8Array(arguments[0])], arguments[1])); \
         const z = document.getElementById(arguments[2]); \
         const ev = t => z.dispatchEvent(new DragEvent(t, { dataTransfer: dt, bubbles: true, cancelable: true })); \
         ev('dragenter'); ev('dragover'); ev('drop');",
        json!([bytes, name, zone]),
    );
}
