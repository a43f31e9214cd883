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

// The item list gives each item's history, from its first value to its last: it had given a
// wide table's every item the table's whole span, empty cells before and after included.
#[test]
fn inspect_lists_each_items_history_from_its_first_value_to_its_last() {
    let text = "month,Twine,Trowel\n2024-01,5,\n2024-02,6,\n2024-03,7,3\n2024-04,,4\n";
    let out = cli(&["inspect", "-"], text.as_bytes());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let listed = out.text();
    for line in [
        "  Twine: 3 periods, 2024-01 to 2024-03\n",
        "  Trowel: 2 periods, 2024-03 to 2024-04\n",
    ] {
        assert!(listed.contains(line), "{line:?} in {listed}");
    }
}

// `forecast` says, as the page does under the item's headline, that an item whose data ends
// before the file's last period is forecast from its own end.
#[test]
fn forecast_says_when_an_items_forecast_starts_before_the_files_end() {
    let text = crate::support::wide_ending_early(("Twine", "Trowel"), 30, 26);
    let out = cli(&["forecast", "-", "--json"], text.as_bytes());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let items = out.json()["items"].clone();
    let notes = |k: usize| items[k]["notes"].to_string();
    assert!(!notes(0).contains("does not start after the file's end"));
    assert!(
        notes(1).contains(
            "this forecast does not start after the file's end: its data ends at 2025-02, 4 \
             months before the file's last period (2025-06)"
        ),
        "{}",
        notes(1)
    );
}

#[test]
fn inspect_names_an_unfinished_last_period() {
    let out = cli(&["inspect", "-", "--json"], &demo());
    assert_eq!(out.json()["unfinished_last"], serde_json::Value::Null);
    let text = "month,sales\n2024-09,40\n2024-10,44\n2024-11,41\n2024-12,4\n";
    let out = cli(&["inspect", "-", "--json"], text.as_bytes());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let v = out.json();
    assert_eq!(v["unfinished_last"], "2024-12");
    assert!(v["warnings"]
        .to_string()
        .contains("the last period, 2024-12, looks unfinished"));
}

// --leave-out-unfinished does what the page's button does: the rows go, the rest is read and
// planned; a warning says so, or that nothing looked unfinished; refused (exit 2, with the
// reason) where the rest would read otherwise.
#[test]
fn the_unfinished_last_period_is_left_out_when_asked() {
    let mut text = String::from("month,sales\n");
    for m in 1..=11 {
        text.push_str(&format!("2024-{m:02},{}\n", 40 + m % 5));
    }
    text.push_str("2024-12,4\n");
    let out = cli(
        &["inspect", "-", "--json", "--leave-out-unfinished"],
        text.as_bytes(),
    );
    assert_eq!(out.code, 0, "{}", out.stderr);
    let v = out.json();
    assert_eq!(v["unfinished_last"], serde_json::Value::Null);
    assert_eq!(v["items"][0]["periods"].as_array().map(Vec::len), Some(11));
    assert!(v["warnings"]
        .to_string()
        .contains("2024-12 looked unfinished (its demand is 9 % of the median"));
    assert!(v["warnings"]
        .to_string()
        .contains("its 1 row(s) were skipped (line 13 of the file)"));
    let out = cli(
        &["forecast", "-", "--leave-out-unfinished"],
        text.as_bytes(),
    );
    assert_eq!(out.code, 0, "{}", out.stderr);
    assert!(out.text().contains("left out as asked"), "{}", out.text());
    // A link says so on standard error, and carries the history without the period.
    let out = cli(&["link", "-", "--leave-out-unfinished"], text.as_bytes());
    assert_eq!(out.code, 0, "{}", out.stderr);
    assert!(
        out.stderr.contains("note: 2024-12 looked unfinished"),
        "{}",
        out.stderr
    );
    let link = out.text();
    // A work file names its source as the page does once a period is left out.
    let work = cli(&["work", "-", "--leave-out-unfinished"], text.as_bytes()).text();
    assert!(work.contains(", without 2024-12\""), "{work}");
    let back = cli(&["inspect", link.trim(), "--json"], b"");
    assert_eq!(
        back.json()["items"][0]["periods"].as_array().map(Vec::len),
        Some(11)
    );
    let out = cli(
        &["inspect", "-", "--json", "--leave-out-unfinished"],
        &demo(),
    );
    assert!(out.json()["warnings"]
        .to_string()
        .contains("no last period looks unfinished"));
    // Month-first dates shown only by the last day (12/13): without it they read day-first.
    let mut us = String::from("date,Oak tray\n");
    for day in 1..=12 {
        us.push_str(&format!("12/{day:02}/2025,{}\n", 40 + day % 3));
    }
    us.push_str("12/13/2025,3\n");
    let out = cli(&["inspect", "-", "--leave-out-unfinished"], us.as_bytes());
    assert_eq!(out.code, 2, "{}", out.stderr);
    assert!(out.stderr.contains("was not left out"), "{}", out.stderr);
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
fn forecast_json_names_a_season_on_trial() {
    // 40 months of a summer peak over a rise (made up for this check): the season test
    // rejects it, and the seasonal methods are tried with it in the backtest.
    let mut text = String::from("month,units\n");
    for t in 0..40usize {
        let m = (t % 12) as f64;
        let noise = ((t * 7919) % 11) as f64 - 5.0;
        let peak = 15.0 * (std::f64::consts::TAU * (m - 3.0) / 12.0).sin();
        let value = (40.0 + peak + 0.8 * t as f64 + noise).round();
        text.push_str(&format!("{}-{:02},{value}\n", 2022 + t / 12, t % 12 + 1));
    }
    let out = cli(&["forecast", "-", "--json"], text.as_bytes());
    assert_eq!(out.code, 0, "{}", out.stderr);
    let item = &out.json()["items"][0];
    assert_eq!(item["season_length"], 1);
    assert_eq!(item["season_on_trial"], 12);
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
    // Five years: the season is accepted, nothing is on trial.
    assert_eq!(item["season_on_trial"], serde_json::Value::Null);
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

/// `morrowcast ARGS` on the demo must refuse with exit 2 and this line on standard error.
fn check_refused(args: &[&str], expected_line: &str) {
    let out = cli(args, &demo());
    assert_eq!(out.code, 2, "{args:?}: {}", out.stderr);
    assert!(
        out.stderr.lines().any(|l| l == expected_line),
        "{args:?}: stderr was\n{}",
        out.stderr
    );
    assert!(
        out.stdout.is_empty(),
        "{args:?}: nothing on standard output"
    );
}

// Settings outside their limits are refused, naming the setting, the value and the range
// (limits: crates/engine/src/settings.rs). Before the limits a horizon of 4294967296 aborted on
// a failed allocation, 10000000 took 10 GB, origins 0 became 1 and 99999999999 ran for a
// minute, season 0 was taken.
#[test]
fn settings_beyond_their_limits_are_refused_with_the_range() {
    let horizon = |v: &str| {
        format!(
            "morrowcast: the horizon \"{v}\" cannot be used: give auto, or a whole number of periods from 1 to 366"
        )
    };
    check_refused(
        &["forecast", "-", "--horizon", "4294967296"],
        &horizon("4294967296"),
    );
    check_refused(
        &["forecast", "-", "--horizon", "10000000"],
        &horizon("10000000"),
    );
    check_refused(&["forecast", "-", "--horizon", "0"], &horizon("0"));
    check_refused(
        &["forecast", "-", "--origins", "0"],
        "morrowcast: the number of rolling origins \"0\" cannot be used: give a whole number from 1 to 24",
    );
    check_refused(
        &["forecast", "-", "--origins", "99999999999"],
        "morrowcast: the number of rolling origins \"99999999999\" cannot be used: give a whole number from 1 to 24",
    );
    check_refused(
        &["forecast", "-", "--season", "0"],
        "morrowcast: the season length \"0\" cannot be used: give auto, none, or a whole number of periods from 1 (no season) to 366",
    );
    check_refused(
        &["forecast", "-", "--tracking-limit", "0"],
        "morrowcast: the tracking limit \"0\" cannot be used: give a number from 1 to 20 (4 is common practice)",
    );
    // Two refusals at once are both said.
    let out = cli(
        &["forecast", "-", "--horizon", "0", "--holdout", "x"],
        &demo(),
    );
    assert!(out.stderr.contains("horizon \"0\"") && out.stderr.contains("holdout \"x\""));
}

// A flag given twice used to keep its last value silently; --item may repeat and plans each.
#[test]
fn repeated_flags_are_refused_and_repeated_items_are_all_planned() {
    check_refused(
        &["forecast", "-", "--horizon", "3", "--horizon", "4"],
        "morrowcast: --horizon is given twice: give it once",
    );
    check_refused(
        &[
            "forecast",
            "-",
            "--item",
            "Gift card",
            "--item",
            "Gift card",
        ],
        "morrowcast: --item \"Gift card\" is given twice: name each item once",
    );
    check_refused(
        &["forecast", "a.csv", "b.csv"],
        "morrowcast: forecast takes one FILE; found \"a.csv\" and \"b.csv\"",
    );
    let out = cli(
        &[
            "forecast",
            "-",
            "--item",
            "Gift card",
            "--item",
            "Frost cloth",
            "--json",
        ],
        &demo(),
    );
    assert_eq!(out.code, 0, "{}", out.stderr);
    let names: Vec<String> = out.json()["items"]
        .as_array()
        .unwrap()
        .iter()
        .map(|p| p["name"].as_str().unwrap().to_string())
        .collect();
    assert_eq!(names, ["Gift card", "Frost cloth"]);
}

// The contract: with --json, JSON comes whenever the input was read, also when its bytes are
// not text (this used to exit 2 with nothing on standard output).
#[test]
fn bytes_that_are_not_text_give_json_with_their_line() {
    let bytes = b"month,sales\n2024-01,5\n2024-02,\xE9\n2024-03,7\n";
    for command in ["inspect", "forecast"] {
        let out = cli(&[command, "-", "--json"], bytes);
        assert_eq!(out.code, 2, "{command}");
        let v = out.json();
        let errors = v["errors"].as_array().unwrap();
        assert!(
            errors.iter().any(|e| e["row"] == 3 && e["text"] == "\\xE9"),
            "{command}: {v}"
        );
    }
}

// Names from a file reach a terminal only with their control characters escaped: an escape
// sequence in an item name must not recolour the terminal or move the cursor.
#[test]
fn terminal_escapes_in_names_are_shown_not_obeyed() {
    let text = "month,\"Oak\x1b[31m tray\u{202e}\"\n2024-01,5\n2024-02,6\n2024-03,7\n2024-04,8\n2024-05,9\n";
    for args in [&["inspect", "-"][..], &["forecast", "-"][..]] {
        let out = cli(args, text.as_bytes());
        let printed = out.text();
        assert!(
            !printed.contains('\x1b') && !printed.contains('\u{202e}'),
            "{printed}"
        );
        assert!(
            printed.contains("Oak\\u{1b}[31m tray\\u{202e}"),
            "{printed}"
        );
    }
}
