//! The command line's contract: subcommands, JSON field names, exit codes. Scripts rely on these.

use crate::support::cli;

fn demo() -> Vec<u8> {
    let out = cli(&["demo"], b"");
    assert_eq!(out.code, 0);
    out.stdout
}

#[test]
fn inspect_json_has_the_contract_fields() {
    let out = cli(&["inspect", "-", "--json"], &demo());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let v = out.json();
    for key in [
        "delimiter",
        "decimal",
        "frequency",
        "layout",
        "items",
        "warnings",
        "errors",
    ] {
        assert!(v.get(key).is_some(), "missing {key}");
    }
    assert_eq!(v["frequency"], "monthly");
    assert_eq!(v["layout"], "wide");
    let items = v["items"].as_array().expect("items");
    assert_eq!(items.len(), 6);
    assert_eq!(items[0]["periods"].as_array().map(Vec::len), Some(60));
    assert_eq!(items[0]["periods"][0], "2021-12");
}

#[test]
fn inspect_rejects_with_row_column_text_and_exit_2() {
    let text = "month,sales\n2024-01,10\n2024-02,ten\n2024-03,12\n";
    let out = cli(&["inspect", "-", "--json"], text.as_bytes());
    assert_eq!(out.code, 2);
    let v = out.json();
    let e = &v["errors"][0];
    assert_eq!(e["row"], 3);
    assert_eq!(e["column"], "sales");
    assert_eq!(e["text"], "ten");
    assert!(e["message"].as_str().is_some_and(|m| !m.is_empty()));
}

#[test]
fn forecast_json_has_the_contract_fields() {
    let out = cli(
        &[
            "forecast",
            "-",
            "--item",
            "Frost cloth",
            "--json",
            "--level",
            "90",
        ],
        &demo(),
    );
    assert_eq!(out.code, 0, "{}", out.stderr);
    let v = out.json();
    let item = &v["items"][0];
    for key in [
        "name",
        "season_length",
        "trend",
        "demand_class",
        "ranking",
        "chosen",
        "forecast",
        "ledger",
    ] {
        assert!(item.get(key).is_some(), "missing {key}");
    }
    assert_eq!(item["name"], "Frost cloth");
    assert_eq!(item["season_length"], 12);
    let rank = &item["ranking"][0];
    for key in ["method", "mape", "rmse", "bias", "mase", "mad"] {
        assert!(rank.get(key).is_some(), "ranking misses {key}");
    }
    let f = &item["forecast"][0];
    for key in ["period", "value", "low", "high"] {
        assert!(f.get(key).is_some(), "forecast misses {key}");
    }
    assert_eq!(item["forecast"].as_array().map(Vec::len), Some(12));
    assert_eq!(item["forecast"][0]["period"], "2026-12");
    let low = f["low"].as_f64().expect("low");
    let high = f["high"].as_f64().expect("high");
    let value = f["value"].as_f64().expect("value");
    assert!(low <= value && value <= high);
    let ledger = item["ledger"].as_array().expect("ledger");
    assert_eq!(ledger.len(), 12);
    for key in [
        "period",
        "demand",
        "forecast",
        "error",
        "abs_error",
        "sq_error",
        "pct_error",
        "mad",
        "mse",
        "rmse",
        "mape",
        "bias",
        "tracking_signal",
    ] {
        assert!(ledger[0].get(key).is_some(), "ledger misses {key}");
    }
    // e = F - D.
    let row = &ledger[0];
    let e = row["forecast"].as_f64().unwrap() - row["demand"].as_f64().unwrap();
    assert!((row["error"].as_f64().unwrap() - e).abs() < 1e-9);
}

#[test]
fn every_item_when_no_item_is_named_and_mape_is_null_with_zero_demand() {
    let out = cli(&["forecast", "-", "--json"], &demo());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let v = out.json();
    let items = v["items"].as_array().expect("items");
    assert_eq!(items.len(), 6);
    let hose = items
        .iter()
        .find(|i| i["name"] == "Hose repair kit")
        .expect("hose item");
    assert!(matches!(
        hose["demand_class"].as_str(),
        Some("intermittent" | "lumpy")
    ));
    // Its holdout has zero-demand periods: MAPE is not available, so null, never infinity.
    assert!(hose["ranking"]
        .as_array()
        .unwrap()
        .iter()
        .all(|r| r["mape"].is_null()));
}

#[test]
fn wider_level_gives_wider_band() {
    let width = |level: &str| {
        let out = cli(
            &[
                "forecast",
                "-",
                "--item",
                "Terracotta pot",
                "--json",
                "--level",
                level,
            ],
            &demo(),
        );
        let v = out.json();
        let f = &v["items"][0]["forecast"][0];
        f["high"].as_f64().unwrap() - f["low"].as_f64().unwrap()
    };
    assert!(width("99") > width("80"));
}

#[test]
fn bad_arguments_say_what_and_exit_2() {
    let out = cli(&["forecast", "-", "--level", "120"], b"1\n2\n3\n");
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("120"));
    let out = cli(&["forecast", "-", "--rank-by", "best"], b"1\n2\n3\n");
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("best"));
    let out = cli(&["forecast", "-", "--item", "Nope"], &demo());
    assert_eq!(out.code, 2);
    assert!(out.stderr.contains("Seed packets"));
}

#[test]
fn text_output_states_the_error_sign() {
    let out = cli(&["forecast", "-", "--item", "Gift card"], &demo());
    assert_eq!(out.code, 0);
    let text = out.text();
    assert!(text.contains("error = forecast - demand"));
    assert!(text.contains("Backtest ranking"));
}
