//! `morrowcast stock`: its JSON contract, that it carries the engine's figures unchanged, and
//! its refusals. The figures' arithmetic is checked against outside references in stock.rs.

use morrowcast_engine::{intake, plan, stock};

use crate::support::{cli, item_named, table_file};

fn demo() -> Vec<u8> {
    cli(&["demo"], b"").stdout
}

/// The demo's `name` planned and stocked in process, as the command line should.
fn engine_stock(name: &str, settings: &stock::StockSettings) -> stock::StockPlan {
    let report = intake::read_bytes(&demo());
    let item = report.items.iter().find(|i| i.name == name).unwrap();
    let series = item.series().unwrap();
    let plan = plan::plan_item(&series, &Default::default()).unwrap();
    stock::plan_stock(&plan, settings).unwrap()
}

#[test]
fn stock_json_has_the_contract_fields_and_the_engine_figures() {
    let out = cli(&["stock", "-", "--lead-time", "2", "--json"], &demo());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let json = out.json();
    let items = json["items"].as_array().unwrap();
    assert_eq!(items.len(), 6);
    for item in items {
        for key in [
            "name",
            "policy",
            "lead_time",
            "review_period",
            "protection_periods",
            "distribution",
            "demand_over_protection",
            "sd_over_protection",
            "target",
            "safety_factor",
            "safety_stock",
            "reorder_point",
            "order_up_to",
            "on_hand",
            "on_order",
            "suggested_order",
            "cycle_service_level",
            "fill_rate",
            "alerts",
            "notes",
        ] {
            assert!(item.get(key).is_some(), "{key} missing in {item}");
        }
        assert_eq!(item["policy"], "continuous");
        assert!(item["order_up_to"].is_null());
        assert_eq!(item["target"]["kind"], "cycle_service_level");
        assert_eq!(item["target"]["value"], 0.95);
        let (mean, ss, s) = (
            item["demand_over_protection"].as_f64().unwrap(),
            item["safety_stock"].as_f64().unwrap(),
            item["reorder_point"].as_f64().unwrap(),
        );
        assert!((mean + ss - s).abs() < 1e-9 * s.abs().max(1.0), "{item}");
    }
    // Intermittent demand gets the empirical model and says so.
    let hose = items
        .iter()
        .find(|i| i["name"] == "Hose repair kit")
        .unwrap();
    assert_eq!(hose["distribution"], "empirical");
    assert!(hose["safety_factor"].is_null());
    assert!(hose["notes"][0]
        .as_str()
        .unwrap()
        .contains("rolling-origin totals"));
    // ...and the alert for sparse demand.
    assert!(hose["alerts"]
        .as_array()
        .unwrap()
        .iter()
        .any(|a| a["kind"] == "sparse_demand" && a["reason"].as_str().is_some()));
    // The numbers are the engine's.
    let settings =
        stock::StockSettings::new(2, None, stock::Target::cycle_service(0.95).unwrap()).unwrap();
    let seed = items.iter().find(|i| i["name"] == "Seed packets").unwrap();
    let want = engine_stock("Seed packets", &settings);
    assert_eq!(seed["reorder_point"].as_f64(), Some(want.figures.level));
    assert_eq!(
        seed["safety_stock"].as_f64(),
        Some(want.figures.safety_stock)
    );
    assert_eq!(
        seed["sd_over_protection"].as_f64(),
        Some(want.sd_over_protection)
    );
}

#[test]
fn periodic_review_with_a_fill_rate_target_in_percent() {
    let out = cli(
        &[
            "stock",
            "-",
            "--item",
            "Gift card",
            "--review",
            "3",
            "--lead-time",
            "1",
            "--fill-rate",
            "98",
            "--json",
        ],
        &demo(),
    );
    assert_eq!(out.code, 0, "{}", out.stderr);
    let item = &out.json()["items"][0];
    assert_eq!(item["policy"], "periodic");
    assert_eq!(item["protection_periods"], 4);
    assert!(item["reorder_point"].is_null());
    assert_eq!(item["target"]["kind"], "fill_rate");
    assert_eq!(item["target"]["value"], 0.98);
    assert!((item["fill_rate"].as_f64().unwrap() - 0.98).abs() < 1e-9);
}

#[test]
fn a_protection_interval_beyond_the_season_lengthens_the_automatic_horizon() {
    // Monthly demo: the automatic horizon is 12; 10 + 6 = 16 periods must still be planned.
    let out = cli(
        &[
            "stock",
            "-",
            "--item",
            "Seed packets",
            "--lead-time",
            "10",
            "--review",
            "6",
            "--json",
        ],
        &demo(),
    );
    assert_eq!(out.code, 0, "{}", out.stderr);
    assert_eq!(out.json()["items"][0]["protection_periods"], 16);
}

#[test]
fn text_output_says_the_figures_are_estimates() {
    let out = cli(&["stock", "-", "--item", "Frost cloth"], &demo());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let text = out.text();
    assert!(text.contains("estimates from past demand"), "{text}");
    assert!(text.contains("judgement decide the order"), "{text}");
    assert!(text.contains("reorder point"), "{text}");
}

fn check_refused(args: &[&str], expected: &str) {
    let out = cli(args, &demo());
    assert_eq!(out.code, 2, "{args:?}: {}", out.stderr);
    assert!(
        out.stderr.contains(expected),
        "{args:?}: stderr was\n{}",
        out.stderr
    );
    assert!(out.stdout.is_empty(), "{args:?}");
}

#[test]
fn stock_settings_beyond_their_limits_are_refused() {
    check_refused(
        &["stock", "-", "--service", "95", "--fill-rate", "0.9"],
        "give --service or --fill-rate, not both",
    );
    check_refused(
        &["stock", "-", "--service", "150"],
        "cycle service level target 150 is outside 50 % to 100 %",
    );
    check_refused(
        &["stock", "-", "--fill-rate", "lots"],
        "fill rate \"lots\" is not a number",
    );
    check_refused(
        &["stock", "-", "--review", "0"],
        "review period 0 is not usable: it must be a whole number of periods from 1 to 366",
    );
    check_refused(
        &["stock", "-", "--lead-time", "2.5"],
        "--lead-time takes a whole number of periods; found \"2.5\"",
    );
    check_refused(
        &["stock", "-", "--lead-time", "4", "--horizon", "3"],
        "--horizon 3 is shorter than the protection interval of 4 periods",
    );
    check_refused(
        &["stock", "-", "--review", "2", "--order-quantity", "50"],
        "--order-quantity is for continuous review",
    );
    check_refused(
        &["stock", "-", "--lead-time", "1", "--lead-time", "2"],
        "given twice",
    );
}

#[test]
fn a_stock_table_gives_on_hand_on_order_and_the_order_today() {
    let path = table_file(
        "stock_table_ok.csv",
        "Item,On hand,On order,Lead time,Order multiple\n\
         Seed packets,120,40,2,25\n\
         Frost cloth,15,,,\n\
         Unknown thing,4,,,\n",
    );
    let out = cli(
        &["stock", "-", "--stock", &path, "--review", "1", "--json"],
        &demo(),
    );
    assert_eq!(out.code, 0, "{}", out.stderr);
    let json = out.json();
    let item = |name: &str| item_named(&json, name).clone();
    let seed = item("Seed packets");
    // The row's lead time (2) overrides the file's (1): protection over R + L = 3.
    assert_eq!(seed["protection_periods"], 3);
    assert_eq!(seed["on_hand"], 120.0);
    assert_eq!(seed["on_order"], 40.0);
    // Order up to S from the position 160, rounded up to a multiple of 25.
    let s = seed["order_up_to"].as_f64().unwrap();
    let want = ((s - 160.0) / 25.0).ceil() * 25.0;
    assert_eq!(seed["suggested_order"].as_f64(), Some(want));
    // No on order given: 0; no multiple: whole units (the demo counts whole units).
    let frost = item("Frost cloth");
    assert_eq!(frost["on_order"], 0.0);
    let s = frost["order_up_to"].as_f64().unwrap();
    assert_eq!(frost["suggested_order"].as_f64(), Some((s - 15.0).ceil()));
    // An item without a row: no position, no order, and it says why.
    let pots = item("Terracotta pot");
    assert!(pots["on_hand"].is_null() && pots["suggested_order"].is_null());
    assert!(pots["notes"]
        .to_string()
        .contains("no row in the stock table"));
    // A row for an item the history does not hold is named.
    assert!(
        json["warnings"].to_string().contains("Unknown thing"),
        "{json}"
    );
}

#[test]
fn a_rejected_stock_table_names_row_column_and_text() {
    let path = table_file(
        "stock_table_bad.csv",
        "Item,On hand,Review\nSeed packets,ten,1\nFrost cloth,3,0\n",
    );
    let out = cli(&["stock", "-", "--stock", &path, "--json"], &demo());
    assert_eq!(out.code, 2);
    let errors = out.json()["stock_table_errors"].clone();
    assert_eq!(errors[0]["row"], 2);
    assert_eq!(errors[0]["column"], "On hand");
    assert_eq!(errors[0]["text"], "ten");
    assert_eq!(errors[1]["row"], 3);
    assert_eq!(errors[1]["column"], "Review");
    let text = cli(&["stock", "-", "--stock", &path], &demo());
    assert_eq!(text.code, 2);
    assert!(
        text.stderr
            .contains("stock table, row 2, column \"On hand\", found \"ten\""),
        "{}",
        text.stderr
    );
    check_refused(
        &["stock", "-", "--stock", "-"],
        "FILE and --stock TABLE cannot both be standard input",
    );
}

/// A stock table as a planner's system writes it, read against the demo's monthly history:
/// names matched without case, lead times in days turned into months, the items' own lead
/// times and the history's period named in the text, a row without on hand said.
#[test]
fn a_stock_table_in_a_planners_words() {
    let path = table_file(
        "stock_table_planner.csv",
        "Stock count\nSKU,Description,Qty on hand,Incoming,Lead time (days)\n\
         1001,seed packets,120,30,60\n1002,Frost cloth,,0,30\n",
    );
    let out = cli(&["stock", "-", "--stock", &path], &demo());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let stdout = String::from_utf8(out.stdout).unwrap();
    for said in [
        "1 line above the stock table's header is left out: \"Stock count\" (row 1)",
        "read from \"Description\"",
        "\"seed packets\" (row 3) as \"Seed packets\"",
        "\"60\" (row 3) as 2 months",
        "lead time 1 month;",
    ] {
        assert!(
            out.stderr.contains(said) || stdout.contains(said),
            "{said}: {stdout}{}",
            out.stderr
        );
    }
    assert!(
        stdout.contains("demand over 2 months (lead time 2)"),
        "{stdout}"
    );
    assert!(stdout.contains("on hand 120, on order 30"), "{stdout}");
    assert!(
        stdout.contains(morrowcast_engine::order::NO_ON_HAND_NOTE),
        "{stdout}"
    );
    // Money where units belong, and an unclear separator, are refused at their cells.
    let path = table_file(
        "stock_table_money.csv",
        "item,on hand,minimum order\nSeed packets,1.500,2\nFrost cloth,4,$50\n",
    );
    let out = cli(&["stock", "-", "--stock", &path], &demo());
    assert_eq!(out.code, 2);
    assert!(
        out.stderr
            .contains("row 2, column \"on hand\", found \"1.500\""),
        "{}",
        out.stderr
    );
    assert!(
        out.stderr
            .contains("row 3, column \"minimum order\", found \"$50\""),
        "{}",
        out.stderr
    );
}

/// One workbook as the history and the stock table (`tests/fixtures/workbooks/sales.xlsx`:
/// a "Sales" and a "Stock" sheet): each read from its sheet, said; the work written carries
/// the stock sheet's rows, named with their sheet.
#[test]
fn one_workbook_gives_the_history_and_the_stock_table() {
    let book = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/fixtures/workbooks/sales.xlsx"
    );
    let out = cli(&["stock", book, "--stock", book, "--json"], b"");
    assert_eq!(out.code, 0, "{}", out.stderr);
    let json = out.json();
    let twine = item_named(&json, "Garden twine, 50 m");
    assert_eq!(twine["on_hand"], 15.5);
    assert_eq!(item_named(&json, "Frost cloth")["on_order"], 20.0);
    let warnings = json["warnings"].to_string();
    assert!(
        warnings.contains("read the sheet \\\"Stock\\\""),
        "{warnings}"
    );
    let work = cli(&["work", book, "--stock", book], b"");
    assert_eq!(work.code, 0, "{}", work.stderr);
    let written: serde_json::Value = serde_json::from_slice(&work.stdout).unwrap();
    let expected = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/fixtures/workbooks/stock.csv"
    ))
    .unwrap();
    assert_eq!(written["stock_table"]["text"], expected.as_str());
    assert_eq!(
        written["stock_table"]["source"],
        "sales.xlsx, sheet \u{201c}Stock\u{201d}"
    );
    // The history's source names its sheet too, as the page names it.
    assert_eq!(
        written["history"]["source"],
        "sales.xlsx, sheet \u{201c}Sales\u{201d}"
    );
}

/// A workbook whose sheet to read is unclear (one sheet per year, `year_sheets.xlsx`):
/// refused, its sheets listed with how to name one; `--sheet` reads the one named, in every
/// command reading FILE, and a work carries that sheet's rows named with it; `--stock-sheet`
/// names the stock table's sheet. A sheet that is not there, or `--sheet` for a file that is
/// no workbook, is refused in words.
#[test]
fn a_sheet_is_named_on_the_command_line() {
    let fixture = |name: &str| {
        format!(
            "{}/tests/fixtures/workbooks/{name}",
            env!("CARGO_MANIFEST_DIR")
        )
    };
    let years = fixture("year_sheets.xlsx");
    let unclear = cli(&["inspect", &years], b"");
    assert!(
        unclear.text().contains(
            "the workbook's sheets that can be read: \"2024\", \"2025\"; --sheet NAME reads one"
        ),
        "{}",
        unclear.text()
    );
    let chosen = cli(&["forecast", &years, "--sheet", "2025", "--json"], b"");
    assert_eq!(chosen.code, 0, "{}", chosen.stderr);
    let json = chosen.json();
    // The 2025 sheet runs from January to June: the forecast starts in July 2025.
    assert_eq!(json["items"][0]["forecast"][0]["period"], "2025-07");
    let work = cli(&["work", &years, "--sheet", "2024"], b"");
    assert_eq!(work.code, 0, "{}", work.stderr);
    let written: serde_json::Value = serde_json::from_slice(&work.stdout).unwrap();
    assert_eq!(
        written["history"]["source"],
        "year_sheets.xlsx, sheet \u{201c}2024\u{201d}"
    );
    assert!(written["history"]["text"]
        .as_str()
        .unwrap()
        .contains("2024-01"));
    let missing = cli(&["inspect", &years, "--sheet", "2026"], b"");
    assert_ne!(missing.code, 0);
    assert!(
        missing.stderr.contains("no sheet \"2026\"") && missing.stderr.contains("\"2025\""),
        "{}",
        missing.stderr
    );
    let not_a_book = cli(&["inspect", &fixture("stock.csv"), "--sheet", "2025"], b"");
    assert!(
        not_a_book.stderr.contains("not a workbook"),
        "{}",
        not_a_book.stderr
    );
    let book = fixture("sales.xlsx");
    let stock = cli(
        &[
            "stock",
            &book,
            "--stock",
            &book,
            "--stock-sheet",
            "Stock",
            "--json",
        ],
        b"",
    );
    assert_eq!(stock.code, 0, "{}", stock.stderr);
    assert_eq!(item_named(&stock.json(), "Frost cloth")["on_order"], 20.0);
    let alone = cli(&["stock", &book, "--stock-sheet", "Stock"], b"");
    assert!(
        alone.stderr.contains("give --stock TABLE too"),
        "{}",
        alone.stderr
    );
}
