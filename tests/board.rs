//! The Item board's work and rules: the rows the worker pool sends back and the order plan the
//! page saves carry the same figures as `morrowcast stock --json` (one engine function,
//! `order::plan_order`, behind both); sorting and filtering on constructed rows.

use morrowcast_app::page::board::{
    look_back_cell, look_back_csv, look_back_misses, order_plan_csv, sort_rows, AlertFilter,
    Filter, ItemChange, SortKey, ORDER_PLAN_COLUMNS,
};
use morrowcast_app::worker::{answer_board, BoardAsk, BoardItem, BoardRow};
use morrowcast_engine::alerts::{Alert, AlertKind};
use morrowcast_engine::intake::StockRow;
use morrowcast_engine::intake::{self, read_stock_table};
use morrowcast_engine::lookback::{LookBack, LookBackStep, StockCheck};
use morrowcast_engine::settings::{Choice, PlanSettings, SeasonChoice};
use morrowcast_engine::stock::{StockText, Target};
use serde_json::Value;

use crate::support::{
    cli, close, item_named, table_file, wide_ending_early, with_a_new_item, within_count,
};

const STOCK_TABLE: &str = "item,on_hand,on_order,lead_time\nPotting mix 40 L,120,30,2\n";

/// The demo's every item through the board's batch, as the page sends it.
fn board_rows(text: &str, stock: &StockText, table: Option<&str>) -> Vec<BoardRow> {
    board_rows_looking_back(text, stock, table, 0)
}

/// The same with a Look-back of `look_back` periods from the file's end.
fn board_rows_looking_back(
    text: &str,
    stock: &StockText,
    table: Option<&str>,
    look_back: usize,
) -> Vec<BoardRow> {
    let report = intake::read(text);
    let table = table.map(|t| read_stock_table(t.as_bytes(), &report));
    let items = report
        .items
        .iter()
        .enumerate()
        .map(|(index, item)| BoardItem {
            index,
            series: item.series().unwrap(),
            settings: None,
            row: table.as_ref().and_then(|t| t.row(&item.name)).cloned(),
        })
        .collect();
    answer_board(&BoardAsk {
        ticket: 1,
        settings: PlanSettings::default(),
        stock: stock.clone(),
        table_given: table.is_some(),
        look_back,
        file_end: report.last_period(),
        items,
    })
}

fn cell_number(text: &str) -> Option<f64> {
    (!text.is_empty()).then(|| text.parse().unwrap())
}

/// Every figure of the order plan equals the command line's: the same engine function makes
/// both. The tolerance allows only last-bit differences between wasm's and the native maths
/// library (exp, ln, powf) when the page's export is compared (tests/e2e/board.rs).
pub fn compare(csv_text: &str, json: &Value) {
    let mut reader = csv::Reader::from_reader(csv_text.as_bytes());
    let headers = reader.headers().unwrap().clone();
    assert_eq!(headers.iter().collect::<Vec<_>>(), ORDER_PLAN_COLUMNS);
    let items = json["items"].as_array().unwrap();
    let records: Vec<csv::StringRecord> = reader.records().map(Result::unwrap).collect();
    assert_eq!(records.len(), items.len());
    for (record, item) in records.iter().zip(items) {
        let get = |name: &str| &record[headers.iter().position(|h| h == name).unwrap()];
        assert_eq!(get("name"), item["name"].as_str().unwrap());
        for key in [
            "lead_time",
            "review_period",
            "protection_periods",
            "demand_over_protection",
            "sd_over_protection",
            "safety_stock",
            "reorder_point",
            "order_up_to",
            "on_hand",
            "on_order",
            "suggested_order",
            "cycle_service_level",
            "fill_rate",
        ] {
            let (saved, wanted) = (cell_number(get(key)), item[key].as_f64());
            let same = match (saved, wanted) {
                (Some(a), Some(b)) => (a - b).abs() <= 1e-9 * b.abs().max(1.0),
                (a, b) => a == b,
            };
            assert!(
                same,
                "{} {key}: saved {saved:?}, command line {wanted:?}",
                get("name")
            );
        }
        for key in ["policy", "distribution"] {
            assert_eq!(get(key), item[key].as_str().unwrap(), "{key}");
        }
        assert_eq!(get("target_kind"), item["target"]["kind"].as_str().unwrap());
        assert_eq!(cell_number(get("target")), item["target"]["value"].as_f64());
        let kinds: Vec<&str> = item["alerts"]
            .as_array()
            .unwrap()
            .iter()
            .map(|a| a["kind"].as_str().unwrap())
            .collect();
        assert_eq!(get("alerts"), kinds.join(" "));
        let notes: Vec<&str> = item["notes"]
            .as_array()
            .unwrap()
            .iter()
            .map(|n| n.as_str().unwrap())
            .collect();
        assert_eq!(get("notes"), notes.join(" | "));
    }
}

#[test]
fn the_order_plan_carries_the_command_lines_figures() {
    let demo = morrowcast_engine::demo::demo_csv();
    let rows = board_rows(&demo, &StockText::default(), None);
    assert!(rows.iter().all(|r| r.figures.is_ok()), "{rows:?}");
    let refs: Vec<&BoardRow> = rows.iter().collect();
    let run = cli(&["stock", "-", "--json"], demo.as_bytes());
    compare(&order_plan_csv(&refs, |_| false), &run.json());

    // Periodic review at a fill-rate target with a stock table: the same again.
    let stock = StockText {
        review_period: "2".into(),
        target_kind: morrowcast_engine::stock::TargetKind::FillRate,
        target: "0.98".into(),
        ..StockText::default()
    };
    let rows = board_rows(&demo, &stock, Some(STOCK_TABLE));
    let refs: Vec<&BoardRow> = rows.iter().collect();
    let table = table_file("board-order-plan-stock.csv", STOCK_TABLE);
    let run = cli(
        &[
            "stock",
            "-",
            "--json",
            "--review",
            "2",
            "--fill-rate",
            "0.98",
            "--stock",
            &table,
        ],
        demo.as_bytes(),
    );
    let csv_text = order_plan_csv(&refs, |name| name == "Potting mix 40 L");
    compare(&csv_text, &run.json());
    assert!(csv_text.contains(",yes,"), "the changed item is marked");
}

// The board's "Bias (holdout)" and "Tracking signal (holdout)" are one calculation, the
// item's Error ledger's at its end (the command line's `ledger`): the bias had been the
// backtest's, pooled over three origins, beside the ledger's tracking signal (a review's
// bird seed: -11.7 beside -6.6, with a ledger bias of -40.9 and MAD of 6.2).
#[test]
fn the_boards_bias_and_tracking_signal_are_the_error_ledgers() {
    let demo = morrowcast_engine::demo::demo_csv();
    let rows = board_rows(&demo, &StockText::default(), None);
    let run = cli(&["forecast", "-", "--json"], demo.as_bytes()).json();
    for row in &rows {
        let figures = row.figures.as_ref().expect("the demo's items are planned");
        let item = run["items"]
            .as_array()
            .unwrap()
            .iter()
            .find(|i| i["name"] == row.name.as_str())
            .expect("the command line plans the item");
        let last = item["ledger"].as_array().unwrap().last().unwrap();
        let bias = last["bias"].as_f64().unwrap();
        assert!(
            close(figures.bias, bias, 1e-9),
            "{}: bias {} against {bias}",
            row.name,
            figures.bias
        );
        let tracking = last["tracking_signal"].as_f64();
        assert_eq!(
            figures.tracking_signal.is_some(),
            tracking.is_some(),
            "{}",
            row.name
        );
        if let (Some(ours), Some(theirs)) = (figures.tracking_signal, tracking) {
            assert!(
                close(ours, theirs, 1e-9),
                "{}: {ours} against {theirs}",
                row.name
            );
        }
    }
}

#[test]
fn bad_stock_settings_give_every_item_the_message_and_no_figures() {
    let demo = morrowcast_engine::demo::demo_csv();
    let stock = StockText {
        lead_time: "two".into(),
        ..StockText::default()
    };
    let rows = board_rows(&demo, &stock, None);
    for r in &rows {
        assert!(r.figures.as_ref().unwrap_err().contains("\"two\""), "{r:?}");
    }
    let refs: Vec<&BoardRow> = rows.iter().collect();
    let csv_text = order_plan_csv(&refs, |_| false);
    let line = csv_text.lines().nth(1).unwrap();
    assert!(line.contains("\"two\""), "{line}");
    assert!(
        !line.chars().any(|c| c.is_ascii_digit()),
        "no figure: {line}"
    );
}

// A wide table whose column for one item is empty over its last months: that item's row has
// no figures and says why, as the command line does; the others are planned.
#[test]
fn an_item_whose_data_ends_early_gets_the_command_lines_message_and_no_figures() {
    let text = wide_ending_early(("Twine", "Trowel"), 40, 34);
    let rows = board_rows(&text, &StockText::default(), None);
    assert!(rows[0].figures.is_ok(), "{:?}", rows[0]);
    let why = rows[1].figures.as_ref().unwrap_err();
    assert!(
        why.contains("its data ends at 2025-10, 6 months before"),
        "{why}"
    );
    let run = cli(&["stock", "-", "--json"], text.as_bytes());
    let failed = &run.json()["failed"];
    assert_eq!(failed[0]["name"], "Trowel");
    assert_eq!(failed[0]["message"].as_str(), Some(why.as_str()));
    // In text, what it goes without comes first.
    let text_run = cli(&["stock", "-"], text.as_bytes());
    assert!(
        text_run
            .stderr
            .contains(&format!("morrowcast: Trowel: no stock figures: {why}")),
        "{}",
        text_run.stderr
    );
    let refs: Vec<&BoardRow> = rows.iter().collect();
    let line = order_plan_csv(&refs, |_| false)
        .lines()
        .nth(2)
        .unwrap()
        .to_string();
    assert!(
        line.starts_with("Trowel,") && line.contains("its data ends"),
        "{line}"
    );
}

/// A constructed row: its name, its MASE (`None` for an item without figures), its alerts.
type Spec<'a> = (&'a str, Option<Option<f64>>, &'a [AlertKind]);

/// Constructed rows, in file order.
fn rows(spec: &[Spec<'_>]) -> Vec<BoardRow> {
    let demo = morrowcast_engine::demo::demo_csv();
    let template = board_rows(&demo, &StockText::default(), None)
        .remove(0)
        .figures
        .unwrap();
    spec.iter()
        .enumerate()
        .map(|(index, (name, mase, alerts))| BoardRow {
            index,
            run: 1,
            name: name.to_string(),
            look_back: None,
            figures: match mase {
                None => Err("too short".into()),
                Some(m) => {
                    let mut f = template.clone();
                    f.mase = *m;
                    f.alerts = alerts
                        .iter()
                        .map(|&kind| Alert {
                            kind,
                            reason: "reason".into(),
                        })
                        .collect();
                    Ok(f)
                }
            },
        })
        .collect()
}

/// Sorts `rows` by `key` (descending or not) and compares the names in order.
fn check(rows: &[BoardRow], key: SortKey, descending: bool, expected: &[&str]) {
    let mut refs: Vec<&BoardRow> = rows.iter().collect();
    sort_rows(&mut refs, key, descending);
    let got: Vec<&str> = refs.iter().map(|r| r.name.as_str()).collect();
    assert_eq!(got, expected, "{key:?} descending {descending}");
}

#[test]
fn rows_sort_with_missing_values_last_and_ties_in_file_order() {
    use AlertKind::*;
    let r = rows(&[
        ("b", Some(Some(0.9)), &[]),
        ("A", None, &[]),
        ("c", Some(None), &[Bias]),
        ("d", Some(Some(0.5)), &[Bias, Outliers]),
        ("e", Some(Some(0.9)), &[]),
    ]);
    check(&r, SortKey::File, false, &["b", "A", "c", "d", "e"]);
    check(&r, SortKey::Name, false, &["A", "b", "c", "d", "e"]);
    check(&r, SortKey::Name, true, &["e", "d", "c", "b", "A"]);
    check(&r, SortKey::Mase, false, &["d", "b", "e", "c", "A"]);
    check(&r, SortKey::Mase, true, &["b", "e", "d", "c", "A"]);
    check(&r, SortKey::Alerts, true, &["d", "c", "b", "e", "A"]);
}

/// Items whose stock level of then fell short in the Look-back: a made-up row short, one
/// covered, one without a Look-back, and one short whose figures of today failed (the
/// Look-back stands without them): the two short ones pass.
#[test]
fn the_short_stock_filter_shows_the_items_whose_level_fell_short() {
    use morrowcast_engine::bands::Level;
    use morrowcast_engine::calendar::Period;
    let mut r = rows(&[
        ("Seed tray", Some(Some(0.9)), &[]),
        ("Trowel", Some(Some(0.5)), &[]),
        ("Hose reel", Some(Some(0.5)), &[]),
        ("Seed drill", None, &[]),
    ]);
    for (row, demand) in r.iter_mut().zip([Some(12.0), Some(9.0), None, Some(12.0)]) {
        row.look_back = demand.map(|demand| {
            Ok(LookBack {
                name: row.name.clone(),
                made_after: Period::month(2026, 10),
                method: "Theta".into(),
                level: Level::try_from(95.0).unwrap(),
                steps: Vec::new(),
                stock: StockCheck::Checked {
                    periods: 1,
                    periodic: false,
                    level: 10.0,
                    whole_units: true,
                    expected: 8.0,
                    demand,
                    promised: 0.95,
                },
            })
        });
    }
    let filter = Filter {
        text: String::new(),
        alert: AlertFilter::from_key("short-stock"),
    };
    assert_eq!(filter.alert.key(), "short-stock");
    let passed: Vec<&str> = r
        .iter()
        .filter(|row| filter.passes(row))
        .map(|row| row.name.as_str())
        .collect();
    assert_eq!(passed, ["Seed tray", "Seed drill"]);
}

#[test]
fn filters_by_text_and_by_alert() {
    use AlertKind::*;
    let r = rows(&[
        ("Seed tray", Some(Some(0.9)), &[]),
        ("Hose reel", None, &[]),
        ("Seed drill", Some(None), &[Bias]),
        ("Trowel", Some(Some(0.5)), &[Outliers]),
    ]);
    let names = |filter: Filter| -> Vec<&str> {
        r.iter()
            .filter(|row| filter.passes(row))
            .map(|row| row.name.as_str())
            .collect()
    };
    let by = |text: &str, alert: AlertFilter| Filter {
        text: text.into(),
        alert,
    };
    assert_eq!(names(by("", AlertFilter::All)).len(), 4);
    assert_eq!(
        names(by(" SEED ", AlertFilter::All)),
        ["Seed tray", "Seed drill"]
    );
    assert_eq!(
        names(by("", AlertFilter::Any)),
        ["Hose reel", "Seed drill", "Trowel"]
    );
    assert_eq!(names(by("", AlertFilter::Failed)), ["Hose reel"]);
    assert_eq!(names(by("", AlertFilter::Kind(Outliers))), ["Trowel"]);
    assert_eq!(names(by("seed", AlertFilter::Kind(Bias))), ["Seed drill"]);
    // Methods by the start of a word, in full or as the row shows them: "hose" is no part
    // of "chosen" (a review found every AICc row under it).
    let mut aicc = rows(&[
        ("Trowel", Some(Some(0.5)), &[]),
        ("Seed tray", Some(Some(0.5)), &[]),
    ]);
    if let Ok(f) = &mut aicc[0].figures {
        f.method = "Exponential smoothing chosen by AICc".into();
        f.method_short = f.method.clone();
    }
    if let Ok(f) = &mut aicc[1].figures {
        f.method = "Combination of Theta + SES".into();
        f.method_short = "Combination of 2".into();
    }
    let found = |text: &str| -> Vec<&str> {
        let filter = by(text, AlertFilter::All);
        aicc.iter()
            .filter(|row| filter.passes(row))
            .map(|row| row.name.as_str())
            .collect()
    };
    assert!(found("hose").is_empty());
    assert_eq!(found("chosen"), ["Trowel"]);
    assert_eq!(found("aicc"), ["Trowel"]);
    assert_eq!(found("Combination of 2"), ["Seed tray"]);
    assert_eq!(found("theta"), ["Seed tray"]);
    assert!(found("heta").is_empty());
    // The holdout's tracking signal beyond its limit, which no alert repeats.
    let mut marked = rows(&[
        ("Trowel", Some(Some(0.5)), &[]),
        ("Seed tray", Some(Some(0.5)), &[]),
    ]);
    for (row, beyond) in marked.iter_mut().zip([true, false]) {
        if let Ok(f) = &mut row.figures {
            f.tracking_beyond = beyond;
        }
    }
    let beyond = by("", AlertFilter::TrackingBeyond);
    let shown: Vec<&str> = marked
        .iter()
        .filter(|row| beyond.passes(row))
        .map(|row| row.name.as_str())
        .collect();
    assert_eq!(shown, ["Trowel"]);
    assert!(names(by("", AlertFilter::TrackingBeyond))
        .iter()
        .all(|n| *n != "Hose reel"));
    for f in [
        AlertFilter::All,
        AlertFilter::Any,
        AlertFilter::Failed,
        AlertFilter::Kind(WideBand),
        AlertFilter::TrackingBeyond,
    ] {
        assert_eq!(AlertFilter::from_key(f.key()), f);
    }
}

#[test]
fn an_items_own_changes_reach_its_row_and_its_settings() {
    let file = PlanSettings::default();
    assert_eq!(ItemChange::default().plan_settings(&file), None);
    let change = ItemChange {
        lead_time: Some(4),
        target: Some(Target::FillRate(0.99)),
        season: Some(SeasonChoice::Fixed(1)),
        method: Choice::from_key("ses"),
    };
    let own = change.plan_settings(&file).unwrap();
    assert_eq!(own.season(), SeasonChoice::Fixed(1));
    assert_eq!(own.choice(), &Choice::Named("ses".into()));
    // Over a stock-table row: its lead time and target replaced, its on hand kept.
    let row = StockRow {
        item: "Trowel".into(),
        on_hand: Some(12.0),
        lead_time: Some(2),
        ..StockRow::default()
    };
    let applied = change.apply("Trowel", Some(&row)).unwrap();
    assert_eq!(
        (applied.lead_time, applied.target, applied.on_hand),
        (Some(4), Some(Target::FillRate(0.99)), Some(12.0))
    );
    // Without a row: a bare one with the change alone (no on hand, so no order).
    let bare = change.apply("Trowel", None).unwrap();
    assert_eq!((bare.item.as_str(), bare.on_hand), ("Trowel", None));
    // Season and method alone leave the row as it is.
    let season_only = ItemChange {
        season: Some(SeasonChoice::Fixed(4)),
        ..ItemChange::default()
    };
    assert_eq!(season_only.apply("Trowel", Some(&row)), Some(row));
    // A season as typed: checked with the file's limits.
    assert_eq!(ItemChange::check_season(" "), Ok(None));
    assert_eq!(
        ItemChange::check_season("none"),
        Ok(Some(SeasonChoice::Fixed(1)))
    );
    assert_eq!(
        ItemChange::check_season("12"),
        Ok(Some(SeasonChoice::Fixed(12)))
    );
    assert!(ItemChange::check_season("400").unwrap_err().contains("400"));
    assert!(ItemChange::check_season("x").unwrap_err().contains("\"x\""));
}

#[test]
fn an_items_own_settings_plan_it() {
    let demo = morrowcast_engine::demo::demo_csv();
    let report = intake::read(&demo);
    let item = &report.items[0];
    let own = ItemChange {
        season: Some(SeasonChoice::Fixed(1)),
        method: Choice::from_key("ses"),
        ..ItemChange::default()
    }
    .plan_settings(&PlanSettings::default());
    let rows = answer_board(&BoardAsk {
        ticket: 1,
        settings: PlanSettings::default(),
        stock: StockText::default(),
        table_given: false,
        look_back: 0,
        file_end: None,
        items: vec![BoardItem {
            index: 0,
            series: item.series().unwrap(),
            settings: own,
            row: None,
        }],
    });
    let f = rows[0].figures.as_ref().unwrap();
    assert_eq!(
        (f.method.as_str(), f.season),
        ("Simple exponential smoothing", None)
    );
}

/// The Look-back's cell for a made-up item: periods since as (forecast, low, high, sold), the
/// stock check; the text the board shows and the misses it sorts by.
fn check_look_back(since: &[(f64, f64, f64, Option<f64>)], stock: StockCheck, want: (&str, usize)) {
    check_look_back_ending(since, usize::MAX, stock, want);
}

/// [`check_look_back`] for an item whose data ends before the period since at `ends_at`.
fn check_look_back_ending(
    since: &[(f64, f64, f64, Option<f64>)],
    ends_at: usize,
    stock: StockCheck,
    want: (&str, usize),
) {
    use morrowcast_engine::bands::{BandPoint, Level};
    use morrowcast_engine::calendar::Period;
    let l = LookBack {
        name: "Oak tray".into(),
        made_after: Period::month(2026, 9),
        method: "Theta".into(),
        level: Level::try_from(95.0).unwrap(),
        steps: since
            .iter()
            .enumerate()
            .map(|(i, &(value, low, high, actual))| LookBackStep {
                period: Period::month(2026, 10 + i as u32),
                band: BandPoint { value, low, high },
                actual,
                shut: false,
                extended: false,
                ended: i >= ends_at,
            })
            .collect(),
        stock,
    };
    assert_eq!((look_back_cell(&l).as_str(), look_back_misses(&l)), want);
}

// Periods after an item's data ends are not gaps: the cell says so.
#[test]
fn the_look_back_cell_says_when_an_items_data_ended() {
    check_look_back_ending(
        &[
            (10.0, 5.0, 15.0, Some(12.0)),
            (10.0, 5.0, 15.0, None),
            (10.0, 5.0, 15.0, None),
        ],
        1,
        StockCheck::AfterData { periods: 2 },
        (
            "sold 12, forecast 10 (17% low) over 1 month (2 months after its data ends left \
             out); 1 of 1 within the band; stock level not judged (its data ends)",
            0,
        ),
    );
    check_look_back_ending(
        &[(10.0, 5.0, 15.0, None), (10.0, 5.0, 15.0, None)],
        0,
        StockCheck::AfterData { periods: 1 },
        (
            "no sales known since (2 months after its data ends left out); stock level not \
             judged (its data ends)",
            0,
        ),
    );
}

#[test]
fn the_look_back_cell_says_what_sold_against_the_band_and_whether_stock_held() {
    let checked =
        |periods: usize, level: f64, demand: f64, whole_units: bool| StockCheck::Checked {
            periods,
            periodic: false,
            level,
            whole_units,
            expected: 70.5,
            demand,
            promised: 0.95,
        };
    check_look_back(
        &[(70.54, 59.08, 82.0, Some(81.0))],
        checked(1, 79.83, 81.0, false),
        (
            "sold 81, forecast 70.5 (13% low), band 59.1–82: within; stock level short by 1.2",
            1,
        ),
    );
    check_look_back(
        &[(70.54, 59.08, 82.0, Some(50.0))],
        checked(1, 79.83, 50.0, false),
        (
            "sold 50, forecast 70.5 (41% high), band 59.1–82: below the band; stock level held, \
             29.8 to spare",
            1,
        ),
    );
    // Far more on the shelf than sold: said, not only a shortfall.
    check_look_back(
        &[(29.4, 10.0, 50.0, Some(3.0))],
        checked(1, 39.0, 3.0, true),
        (
            "sold 3, forecast 29.4 (880% high), band 10–50: below the band; stock level held, \
             36 to spare",
            1,
        ),
    );
    // Whole units: a level of 70.92 is stocked as 71, which covers 71 sold.
    check_look_back(
        &[(70.0, 60.0, 80.0, Some(71.0))],
        checked(1, 70.92, 71.0, true),
        (
            "sold 71, forecast 70 (1% low), band 60–80: within; stock level held, 0 to spare",
            0,
        ),
    );
    // The stock level is judged over its protection interval, the first 2 of 3 months.
    check_look_back(
        &[
            (10.0, 5.0, 15.0, Some(12.0)),
            (10.0, 5.0, 15.0, Some(13.0)),
            (10.0, 5.0, 15.0, Some(10.0)),
        ],
        checked(2, 24.0, 25.0, true),
        (
            "sold 35, forecast 30 (14% low) over 3 months; 3 of 3 within the band; stock level \
             short by 1 over the first 2 months",
            1,
        ),
    );
    check_look_back(
        &[(10.0, 5.0, 15.0, Some(16.0)), (10.0, 4.0, 16.0, Some(12.0))],
        StockCheck::TooSoon {
            periods: 3,
            passed: 2,
        },
        (
            "sold 28, forecast 20 (29% low) over 2 months; 1 of 2 within the band; stock level \
             not judged yet: 2 of its 3 months have passed",
            1,
        ),
    );
    check_look_back(
        &[(10.0, 5.0, 15.0, None)],
        StockCheck::Gap { periods: 1 },
        (
            "no sales known since (1 gap left out); stock level not judged (a gap)",
            0,
        ),
    );
    check_look_back(
        &[(10.0, 5.0, 15.0, Some(3.0)), (10.0, 5.0, 15.0, None)],
        StockCheck::NoFigures("too few origins".into()),
        (
            "sold 3, forecast 10 (233% high) over 1 month (1 gap left out); 0 of 1 within the \
             band; no Stock plan then",
            1,
        ),
    );
}

/// The Look-back the page saves carries the command line's figures: the board's batch and
/// `morrowcast look-back --json` on the same file and settings (one engine function behind both).
#[test]
fn the_saved_look_back_carries_the_command_lines_figures() {
    let demo = morrowcast_engine::demo::demo_csv();
    let stock = StockText {
        lead_time: "2".into(),
        ..StockText::default()
    };
    let rows = board_rows_looking_back(&demo, &stock, None, 3);
    let csv_text = look_back_csv(&rows.iter().collect::<Vec<_>>());
    let run = cli(
        &[
            "look-back",
            "-",
            "--periods",
            "3",
            "--lead-time",
            "2",
            "--json",
        ],
        demo.as_bytes(),
    );
    assert_eq!(run.code, 0, "{}", run.stderr);
    let want = run.json();
    let mut reader = csv::Reader::from_reader(csv_text.as_bytes());
    let header: Vec<String> = reader.headers().unwrap().iter().map(String::from).collect();
    let records: Vec<csv::StringRecord> = reader.records().map(Result::unwrap).collect();
    let items = want["items"].as_array().unwrap();
    assert_eq!(records.len(), items.len());
    let at = |r: &csv::StringRecord, name: &str| {
        r[header.iter().position(|h| h == name).unwrap()].to_string()
    };
    for (r, item) in records.iter().zip(items) {
        let name = item["name"].as_str().unwrap();
        assert_eq!(at(r, "name"), name);
        assert_eq!(at(r, "made_after"), item["made_after"].as_str().unwrap());
        let within = within_count(item);
        assert_eq!(at(r, "within"), within.to_string(), "{name}");
        for (column, value) in [
            ("forecast_total", &item["forecast_total"]),
            ("sold_total", &item["sold_total"]),
            ("reorder_point", &item["stock"]["reorder_point"]),
            ("demand", &item["stock"]["demand"]),
            ("shortfall", &item["stock"]["shortfall"]),
        ] {
            let got: f64 = at(r, column).parse().unwrap();
            let want = value.as_f64().unwrap();
            assert!(
                (got - want).abs() <= 1e-9 * want.abs().max(1.0),
                "{name} {column}: {got} against {want}"
            );
        }
        assert_eq!(
            at(r, "stock_check"),
            item["stock"]["check"].as_str().unwrap()
        );
    }
}

// An item whose column is empty over the file's last two months, looked back on over four:
// its last two periods since are after its data ends, not gaps, in the saved Look-back, the
// command line's JSON and its text alike.
#[test]
fn periods_after_an_items_data_ends_are_said_as_such() {
    let text = wide_ending_early(("Twine", "Trowel"), 40, 38);
    let rows = board_rows_looking_back(&text, &StockText::default(), None, 4);
    let csv_text = look_back_csv(&rows.iter().collect::<Vec<_>>());
    let mut reader = csv::Reader::from_reader(csv_text.as_bytes());
    let header: Vec<String> = reader.headers().unwrap().iter().map(String::from).collect();
    let records: Vec<csv::StringRecord> = reader.records().map(Result::unwrap).collect();
    let at = |r: &csv::StringRecord, name: &str| {
        r[header.iter().position(|h| h == name).unwrap()].to_string()
    };
    assert_eq!(
        [at(&records[1], "after_data"), at(&records[1], "gaps")],
        ["2", "0"]
    );
    assert_eq!(at(&records[0], "after_data"), "0");
    let run = cli(
        &["look-back", "-", "--periods", "4", "--json"],
        text.as_bytes(),
    );
    let periods = run.json()["items"][1]["periods"].clone();
    let after: Vec<bool> = periods
        .as_array()
        .unwrap()
        .iter()
        .map(|p| p["after_data"].as_bool().unwrap())
        .collect();
    assert_eq!(after, [false, false, true, true]);
    // A protection interval of three periods reaches past its data: not judged, and said so.
    let longer = cli(
        &[
            "look-back",
            "-",
            "--periods",
            "4",
            "--lead-time",
            "3",
            "--json",
        ],
        text.as_bytes(),
    );
    assert_eq!(longer.json()["items"][1]["stock"]["check"], "after_data");
    assert_eq!(longer.json()["items"][0]["stock"]["check"], "checked");
    let words = cli(&["look-back", "-", "--periods", "4"], text.as_bytes()).text();
    assert!(
        words.contains("(2 period(s) after its data ends left out)"),
        "{words}"
    );
}

/// A new item whose Stock plan of today cannot be made (too few rolling origins) still has its
/// Look-back on the board, as the command line gives it: the plan of then set against what
/// sold, its stock check "no figures".
// A new item of five months has too short a history for stock figures, but its plan and its
// "New item" alert stand: its row had shown only why, hiding its forecast and its alert (the
// "New item" filter counted none). Its row, the filters, the order plan and the command line
// all carry the plan and the alert beside why there are no figures.
#[test]
fn a_new_items_row_shows_its_forecast_and_alert_without_stock_figures() {
    let text = with_a_new_item();
    let table = "item,on_hand,on_order\nSolar lantern,7,3\n";
    let rows = board_rows(&text, &StockText::default(), Some(table));
    let lantern = rows.iter().find(|r| r.name == "Solar lantern").unwrap();
    let f = lantern.figures.as_ref().unwrap();
    let none = f.stock.as_ref().unwrap_err();
    let why = &none.why;
    assert!(why.contains("cannot be measured yet"), "{why}");
    assert_eq!((none.on_hand, none.on_order), (Some(7.0), Some(3.0)));
    assert!(f.next.is_finite() && f.history == 5, "{f:?}");
    assert!(
        f.alerts.iter().any(|a| a.kind == AlertKind::NewItem),
        "{:?}",
        f.alerts
    );
    let passing = |alert: AlertFilter| -> Vec<&str> {
        let filter = Filter {
            text: String::new(),
            alert,
        };
        rows.iter()
            .filter(|r| filter.passes(r))
            .map(|r| r.name.as_str())
            .collect()
    };
    assert_eq!(
        passing(AlertFilter::Kind(AlertKind::NewItem)),
        ["Solar lantern"]
    );
    assert_eq!(passing(AlertFilter::Failed), ["Solar lantern"]);
    // Sorted by the order, the item without figures goes last either way.
    for descending in [false, true] {
        let mut refs: Vec<&BoardRow> = rows.iter().collect();
        sort_rows(&mut refs, SortKey::Order, descending);
        assert_eq!(refs[1].name, "Solar lantern");
    }
    let refs: Vec<&BoardRow> = rows.iter().collect();
    let csv_text = order_plan_csv(&refs, |_| false);
    let mut reader = csv::Reader::from_reader(csv_text.as_bytes());
    let headers = reader.headers().unwrap().clone();
    let record = reader
        .records()
        .map(Result::unwrap)
        .find(|r| &r[0] == "Solar lantern")
        .unwrap();
    let get = |name: &str| record[headers.iter().position(|h| h == name).unwrap()].to_string();
    assert_eq!(get("problem"), *why);
    // On hand and on order as the stock table gave them (they had been left empty).
    assert_eq!(
        (get("on_hand").as_str(), get("on_order").as_str()),
        ("7", "3")
    );
    assert_eq!(get("alerts"), "new_item");
    assert_eq!(cell_number(&get("next_forecast")), Some(f.next));
    assert_eq!(get("history_periods"), "5");
    for empty in ["reorder_point", "safety_stock", "suggested_order", "policy"] {
        assert_eq!(get(empty), "", "{empty}");
    }
    let run = cli(&["stock", "-"], text.as_bytes());
    assert!(
        run.stderr.contains(&format!(
            "morrowcast: Solar lantern: no stock figures: {why}; its alerts: New item (only 5 \
             periods of history"
        )),
        "{}",
        run.stderr
    );
    // In JSON, the message is why alone and the alerts stand beside it, as an item's do.
    let json = cli(&["stock", "-", "--json"], text.as_bytes()).json();
    let failed = &json["failed"][0];
    assert_eq!(failed["message"].as_str(), Some(why.as_str()));
    assert_eq!(failed["alerts"][0]["kind"], "new_item");
    assert!(failed["alerts"][0]["reason"]
        .as_str()
        .is_some_and(|r| r.starts_with("only 5 periods of history")));
}

#[test]
fn a_look_back_stands_where_todays_figures_cannot_be_made() {
    let text = with_a_new_item();
    let rows = board_rows_looking_back(&text, &StockText::default(), None, 1);
    let lantern = rows.iter().find(|r| r.name == "Solar lantern").unwrap();
    assert!(
        lantern.figures.as_ref().is_ok_and(|f| f.stock.is_err()),
        "{:?}",
        lantern.figures
    );
    let Some(Ok(l)) = &lantern.look_back else {
        panic!("{:?}", lantern.look_back);
    };
    assert_eq!(l.known().count(), 1);
    assert!(matches!(l.stock, StockCheck::NoFigures(_)), "{:?}", l.stock);
    let run = cli(&["look-back", "-", "--json"], text.as_bytes());
    let json = run.json();
    let want = item_named(&json, "Solar lantern");
    assert_eq!(want["stock"]["check"], "no_figures");
    assert_eq!(
        want["periods"][0]["forecast"].as_f64().unwrap(),
        l.steps[0].band.value
    );
}

/// While no row has come back, the line above the board says the Look-back is on its way,
/// not "0 of 0 months"; once rows are in, it counts them.
#[test]
fn the_look_back_line_waits_for_rows_before_counting() {
    use morrowcast_app::page::board::{look_back_counts, look_back_summary};
    let words = ("month", "months");
    let waiting = look_back_summary(&look_back_counts(&[]), 2, words);
    assert_eq!(
        waiting,
        "The plan of 2 months ago is set against what sold since as the board plans each item."
    );
    let demo = morrowcast_engine::demo::demo_csv();
    let rows: Vec<Option<BoardRow>> =
        board_rows_looking_back(&demo, &StockText::default(), None, 2)
            .into_iter()
            .map(Some)
            .collect();
    let counted = look_back_summary(&look_back_counts(&rows), 2, words);
    assert!(
        counted.starts_with(
            "The plan made after 2026-09 (2 months ago), set against what sold since, for 6 items:"
        ),
        "{counted}"
    );
}
