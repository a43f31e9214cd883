//! The work's two written forms (crates/work): a share link and a work file carry the whole
//! desk and open to the same work; a link cut short or changed is refused, never read as a
//! different desk; the command line reads them wherever FILE goes and writes them with `link`
//! and `work`.
//!
//! Outside reference: tests/fixtures/work/python-link.txt is work-v1.json packed by Python's
//! own zlib and base64 (scripts/work_reference.py, Python 3.11.7, zlib 1.2.13; the same
//! script checked that Python unpacks a link Morrowcast wrote to the file's JSON). work-v1.json
//! is a version-1 work file kept as written: every later version must still open it.

use std::collections::BTreeMap;

use morrowcast_engine::settings::{Choice, SeasonChoice, SettingsText};
use morrowcast_engine::stock::{StockText, Target, TargetKind};
use morrowcast_work::{ItemChange, SourcedText, Work, WorkError};

use crate::support::{cli, table_file};

const FIXTURES: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/work/");

fn fixture(name: &str) -> String {
    std::fs::read_to_string(format!("{FIXTURES}{name}")).unwrap()
}

/// What reading a text gives: the work, or the error's kind and message.
#[derive(Debug, PartialEq)]
enum Read {
    Opens(Box<Work>),
    NotWork,
    Damaged,
    Newer(u64),
    Unreadable(&'static str),
    BadChange(&'static str, &'static str),
    TooLarge,
}

fn check(text: &str, expected: Read) {
    let got = match Work::read(text) {
        Ok(w) => Read::Opens(Box::new(w)),
        Err(WorkError::NotWork) => Read::NotWork,
        Err(WorkError::Damaged { .. }) => Read::Damaged,
        Err(WorkError::Newer { version }) => Read::Newer(version),
        Err(WorkError::TooLarge) => Read::TooLarge,
        Err(e @ WorkError::Unreadable { .. }) => {
            // The message names what is wrong: the expected text must be in it.
            let Read::Unreadable(part) = expected else {
                panic!("{e}");
            };
            assert!(e.to_string().contains(part), "{e}");
            Read::Unreadable(part)
        }
        Err(e @ WorkError::BadChange { .. }) => {
            let Read::BadChange(item, field) = expected else {
                panic!("{e}");
            };
            let message = e.to_string();
            assert!(
                message.contains(item) && message.contains(field),
                "{message}"
            );
            Read::BadChange(item, field)
        }
    };
    assert_eq!(got, expected, "reading {:.80}", text);
}

/// The desk work-v1.json describes, built by hand.
fn fixture_work() -> Work {
    let file: serde_json::Value = serde_json::from_str(&fixture("work-v1.json")).unwrap();
    let history = file["history"]["text"].as_str().unwrap().to_string();
    let mut changes = BTreeMap::new();
    changes.insert(
        "Frost cloth".to_string(),
        ItemChange {
            season: Some(SeasonChoice::Fixed(1)),
            method: Choice::from_key("ses"),
            ..ItemChange::default()
        },
    );
    changes.insert(
        "Trowel".to_string(),
        ItemChange {
            lead_time: Some(3),
            target: Some(Target::FillRate(0.98)),
            ..ItemChange::default()
        },
    );
    Work {
        history: SourcedText {
            text: history,
            source: "fernhollow-sales.csv".into(),
        },
        settings: SettingsText {
            level: "90".into(),
            origins: "auto".into(),
            ..SettingsText::default()
        },
        stock: StockText {
            lead_time: "2".into(),
            ..StockText::default()
        },
        stock_table: Some(SourcedText {
            text: "item,on_hand,on_order\nSeed packets,60,20\nFrost cloth,15,0\nTrowel,4,6\n"
                .into(),
            source: "pasted text".into(),
        }),
        changes,
        open_item: Some("Frost cloth".into()),
        look_back: 0,
        stock_read_by: None,
    }
}

#[test]
fn a_version_one_file_and_a_link_packed_by_python_open_to_the_same_desk() {
    let expected = fixture_work();
    check(
        &fixture("work-v1.json"),
        Read::Opens(Box::new(expected.clone())),
    );
    let python = fixture("python-link.txt");
    check(&python, Read::Opens(Box::new(expected.clone())));
    // The fragment alone, with or without its '#', and broken over lines by a mail program.
    let fragment = python.split_once('#').unwrap().1.trim();
    check(fragment, Read::Opens(Box::new(expected.clone())));
    check(
        &format!("#{fragment}"),
        Read::Opens(Box::new(expected.clone())),
    );
    let wrapped: String = fragment
        .as_bytes()
        .chunks(76)
        .map(|c| format!("{}\n", std::str::from_utf8(c).unwrap()))
        .collect();
    check(
        &format!("#{wrapped}"),
        Read::Opens(Box::new(expected.clone())),
    );
    // Quoted in a sentence or a mail: the punctuation around it is not the link's.
    check(
        &format!("<{}>.", python.trim()),
        Read::Opens(Box::new(expected.clone())),
    );
    check(
        &format!("({}),", python.trim()),
        Read::Opens(Box::new(expected)),
    );
    // An encoding Morrowcast never wrote.
    check(&format!("#w0.{}", &fragment[3..]), Read::Damaged);
}

#[test]
fn what_morrowcast_writes_opens_to_what_it_wrote() {
    let work = fixture_work();
    // A work without a Look-back is written as version 1 (older builds open it), one with it
    // as version 2.
    assert!(work.to_file_text().contains("\"morrowcast_work\": 1,"));
    assert!(!work.to_file_text().contains("look_back"));
    let looking_back = Work {
        look_back: 2,
        ..work.clone()
    };
    let text = looking_back.to_file_text();
    assert!(text.contains("\"morrowcast_work\": 2,") && text.contains("\"look_back\": 2"));
    check(&text, Read::Opens(Box::new(looking_back.clone())));
    check(
        &looking_back.to_fragment(),
        Read::Opens(Box::new(looking_back)),
    );
    check(&work.to_file_text(), Read::Opens(Box::new(work.clone())));
    check(
        &format!("http://127.0.0.1:8080/{}", work.to_fragment()),
        Read::Opens(Box::new(work.clone())),
    );
    // Every field away from its default: a fill-rate target, typed numbers, a fixed season.
    let mut other = Work::of_history("a\n1\n2\n".into(), "the demo".into());
    other.settings = SettingsText {
        horizon: "7".into(),
        holdout: "4".into(),
        season: "none".into(),
        level: "97,5".into(),
        tracking_limit: "3.5".into(),
        origins: "2".into(),
        band: morrowcast_engine::bands::BandMethod::MadRule,
        rank_by: morrowcast_engine::backtest::RankBy::Rmse,
        choice: Choice::Best,
    };
    other.stock = StockText {
        lead_time: "3".into(),
        lead_time_sd: "0.5".into(),
        review_period: "2".into(),
        target_kind: TargetKind::FillRate,
        target: "98%".into(),
        order_quantity: String::new(),
    };
    other.changes.insert(
        "a".into(),
        ItemChange {
            season: Some(SeasonChoice::Auto),
            target: Some(Target::CycleService(0.9)),
            ..ItemChange::default()
        },
    );
    check(&other.to_file_text(), Read::Opens(Box::new(other.clone())));
    check(&other.to_fragment(), Read::Opens(Box::new(other.clone())));
    // Every target typed as a one-decimal percent reads back exactly.
    for tenth in 500..1000 {
        let mut w = other.clone();
        w.changes.insert(
            "a".into(),
            ItemChange {
                target: Some(Target::FillRate(f64::from(tenth) / 1000.0)),
                ..ItemChange::default()
            },
        );
        check(&w.to_file_text(), Read::Opens(Box::new(w.clone())));
    }
}

#[test]
fn a_link_cut_short_or_changed_is_refused_never_read_as_another_desk() {
    let python = fixture("python-link.txt");
    let link = python.trim();
    let start = link.find("#w1.").unwrap() + 4;
    // Cut at every place of its data. (Cut right after its mark, "…#w1." is no link at all:
    // a final dot is taken for the sentence's.)
    check(&link[..start], Read::NotWork);
    for end in start + 1..link.len() {
        check(&link[..end], Read::Damaged);
    }
    // One character changed, at places through the data.
    for at in (start..link.len()).step_by(37) {
        let mut bytes = link.as_bytes().to_vec();
        bytes[at] = if bytes[at] == b'A' { b'B' } else { b'A' };
        let changed = String::from_utf8(bytes).unwrap();
        let read = Work::read(&changed);
        assert!(
            matches!(
                read,
                Err(WorkError::Damaged { .. }) | Err(WorkError::Unreadable { .. })
            ),
            "a changed character at {at} gave {read:?}"
        );
    }
    // A character no link holds.
    check(
        &format!("{}!{}", &link[..start + 10], &link[start + 10..]),
        Read::NotWork,
    );
    check(&format!("{}~", &link[..start + 10]), Read::NotWork);
}

#[test]
fn newer_formats_strange_fields_and_bad_changes_are_named() {
    let file = fixture("work-v1.json");
    check("#w2.eJwDAAAAAAE", Read::Newer(2));
    check(
        &file.replacen("\"morrowcast_work\": 1", "\"morrowcast_work\": 4", 1),
        Read::Newer(4),
    );
    // Version 2 is version 1 and the Look-back; version 1 does not carry one.
    let looking_back = |version: u64, periods: usize| {
        file.replacen(
            "\"morrowcast_work\": 1",
            &format!("\"morrowcast_work\": {version}"),
            1,
        )
        .replacen(
            "\"open_item\"",
            &format!("\"look_back\": {periods},\n  \"open_item\""),
            1,
        )
    };
    check(
        &looking_back(2, 3),
        Read::Opens(Box::new(Work {
            look_back: 3,
            ..fixture_work()
        })),
    );
    check(
        &looking_back(1, 3),
        Read::Unreadable("look_back is a field of version 2"),
    );
    check(
        &looking_back(2, 30),
        Read::Unreadable("look_back takes 0 to 24"),
    );
    // Version 3 is version 2 and the stock table's reading by one column, only beside a
    // stock table.
    let read_by = |version: u64| {
        file.replacen(
            "\"morrowcast_work\": 1",
            &format!("\"morrowcast_work\": {version}"),
            1,
        )
        .replacen(
            "\"open_item\"",
            "\"stock_table_read_by\": \"Code\",\n  \"open_item\"",
            1,
        )
    };
    check(
        &read_by(3),
        Read::Opens(Box::new(Work {
            stock_read_by: Some("Code".into()),
            ..fixture_work()
        })),
    );
    check(
        &read_by(2),
        Read::Unreadable("stock_table_read_by is a field of version 3"),
    );
    check(
        &read_by(3).replacen("\"Code\"", "\" \"", 1),
        Read::Unreadable("stock_table_read_by names a column"),
    );
    let without_table = Work {
        stock_read_by: Some("Code".into()),
        stock_table: None,
        ..fixture_work()
    };
    check(
        &without_table.to_file_text(),
        Read::Unreadable("stock_table_read_by says how to read a stock table"),
    );
    check(
        &file.replacen("\"open_item\"", "\"opened_item\"", 1),
        Read::Unreadable("opened_item"),
    );
    check(
        &file.replacen("\"band\": \"horizon\"", "\"band\": \"wide\"", 1),
        Read::Unreadable("settings.band"),
    );
    check(
        &file.replacen("\"value\": 0.98", "\"value\": 1.5", 1),
        Read::BadChange("Trowel", "service target"),
    );
    check(
        &file.replacen("\"season\": \"none\"", "\"season\": \"0\"", 1),
        Read::BadChange("Frost cloth", "season length"),
    );
    check(
        &file.replacen("\"method\": \"ses\"", "\"method\": \"crystal\"", 1),
        Read::BadChange("Frost cloth", "method"),
    );
    check(
        "{\"morrowcast_work\": \"one\"}",
        Read::Unreadable("version"),
    );
    check("{\"morrowcast_work\": 1,", Read::Unreadable("not JSON"));
    check("[1, 2]", Read::NotWork);
    check("{\"morrowcast_work\": [1]}", Read::Unreadable("version"));
}

/// A JSON object may repeat a key, and a reader that keeps the last would drop the first
/// unsaid: each repeat is refused, naming it.
#[test]
fn a_field_or_item_given_twice_is_refused() {
    let file = fixture("work-v1.json");
    check(
        &file.replacen(
            "\"Trowel\": {",
            "\"Frost cloth\": {\"lead_time\": 9},\n    \"Trowel\": {",
            1,
        ),
        Read::Unreadable("item_changes names \"Frost cloth\" twice"),
    );
    check(
        &file.replacen("\"open_item\"", "\"settings\": {}, \"open_item\"", 1),
        Read::Unreadable("duplicate field `settings`"),
    );
    check(
        &file.replacen("\"open_item\"", "\"morrowcast_work\": 1, \"open_item\"", 1),
        Read::Unreadable("one \"morrowcast_work\" version"),
    );
    check(
        &file.replacen(
            "\"lead_time\": 3,",
            "\"lead_time\": 3, \"lead_time\": 5,",
            1,
        ),
        Read::Unreadable("duplicate field `lead_time`"),
    );
}

#[test]
fn a_link_that_unpacks_too_far_is_refused() {
    let huge = vec![b' '; 70_000_000];
    let packed = miniz_oxide::deflate::compress_to_vec_zlib(&huge, 6);
    use base64::Engine;
    let data = base64::engine::general_purpose::URL_SAFE_NO_PAD.encode(packed);
    check(&format!("#w1.{data}"), Read::TooLarge);
}

#[test]
fn histories_are_not_works() {
    let demo = morrowcast_engine::demo::demo_csv();
    check(&demo, Read::NotWork);
    check("item,month,units\nPot #w1.5,2024-01,3\n", Read::NotWork);
    check(
        "Pots#w1.abc,2024-01,3\nPots#w1.abc,2024-02,4\n",
        Read::NotWork,
    );
    check("{\"item\": 1}", Read::NotWork);
    check("w1.5\n3\n4\n6\n", Read::NotWork);
    check("", Read::NotWork);
}

/// The plan JSON of one item, without the time it took.
fn planned(args: &[&str]) -> serde_json::Value {
    let run = cli(args, b"");
    assert_eq!(run.code, 0, "{args:?}: {}", run.stderr);
    let mut json = run.json();
    strip_times(&mut json);
    json
}

fn strip_times(v: &mut serde_json::Value) {
    match v {
        serde_json::Value::Object(map) => {
            map.remove("compute_ms");
            map.values_mut().for_each(strip_times);
        }
        serde_json::Value::Array(items) => items.iter_mut().for_each(strip_times),
        _ => {}
    }
}

#[test]
fn the_command_line_plans_a_link_as_the_options_it_carries() {
    let work = fixture_work();
    let history = table_file("work-history.csv", &work.history.text);
    let table = table_file("work-stock.csv", &work.stock_table.as_ref().unwrap().text);
    let link = fixture("python-link.txt");
    let file = format!("{FIXTURES}work-v1.json");
    // Frost cloth has its own season (none) and method (ses); the file's level is 90.
    let by_options = planned(&[
        "forecast",
        &history,
        "--item",
        "Frost cloth",
        "--level",
        "90",
        "--origins",
        "auto",
        "--season",
        "none",
        "--method",
        "ses",
        "--json",
    ]);
    let file_settings_only = planned(&[
        "forecast",
        &history,
        "--item",
        "Frost cloth",
        "--level",
        "90",
        "--origins",
        "auto",
        "--json",
    ]);
    assert_ne!(
        file_settings_only, by_options,
        "the item's own settings change its plan"
    );
    for given in [link.trim(), file.as_str()] {
        assert_eq!(
            planned(&["forecast", given, "--item", "Frost cloth", "--json"]),
            by_options
        );
    }
    // Trowel has its own lead time (3) and fill rate (98 %) over the file's lead time 2.
    let stock_by_options = planned(&[
        "stock",
        &history,
        "--stock",
        &table,
        "--item",
        "Trowel",
        "--level",
        "90",
        "--origins",
        "auto",
        "--lead-time",
        "3",
        "--fill-rate",
        "0.98",
        "--json",
    ]);
    let stock_by_link = planned(&["stock", link.trim(), "--item", "Trowel", "--json"]);
    assert_eq!(stock_by_link, stock_by_options);
    assert_eq!(stock_by_link["items"][0]["lead_time"], 3);
    // An option given replaces the work's own.
    let seed = planned(&[
        "stock",
        link.trim(),
        "--item",
        "Seed packets",
        "--lead-time",
        "4",
        "--json",
    ]);
    assert_eq!(seed["items"][0]["lead_time"], 4);
    // `none` leaves out a figure the work has: a work with a review period, planned with
    // `--review none`, is planned as continuous review.
    let reviewed = cli(&["work", link.trim(), "--review", "2"], b"");
    assert_eq!(reviewed.code, 0, "{}", reviewed.stderr);
    let reviewed = table_file("work-reviewed.json", &reviewed.text());
    let seed_args = ["--item", "Seed packets", "--json"];
    let with_review = planned(&[&["stock", reviewed.as_str()][..], &seed_args].concat());
    let without = planned(
        &[
            &["stock", reviewed.as_str(), "--review", "none"][..],
            &seed_args,
        ]
        .concat(),
    );
    assert_ne!(with_review, without);
    assert_eq!(
        without,
        planned(&[&["stock", link.trim()][..], &seed_args].concat())
    );
    // A link written by `link` carries what it was given, and `work` writes the same desk.
    let made = cli(
        &[
            "link",
            &history,
            "--stock",
            &table,
            "--level",
            "90",
            "--origins",
            "auto",
            "--lead-time",
            "2",
            "--item",
            "Frost cloth",
            "--page",
            "file:///tmp/m.html",
        ],
        b"",
    );
    assert_eq!(made.code, 0, "{}", made.stderr);
    assert!(made.text().starts_with("file:///tmp/m.html#w1."));
    assert!(made.stderr.contains("whoever has the link has the data"));
    let mut opened = Work::read(&made.text()).unwrap();
    assert_eq!(opened.history.source, "work-history.csv");
    assert_eq!(
        opened.stock_table.as_ref().unwrap().source,
        "work-stock.csv"
    );
    opened.history.source = work.history.source.clone();
    opened.stock_table = work.stock_table.clone();
    let mut without_changes = work.clone();
    without_changes.changes.clear();
    assert_eq!(opened, without_changes);
    let written = cli(&["work", made.text().trim()], b"");
    assert_eq!(written.code, 0, "{}", written.stderr);
    assert_eq!(
        Work::read(&written.text()).unwrap(),
        Work::read(&made.text()).unwrap()
    );
}

#[test]
fn the_command_line_says_why_a_link_does_not_open() {
    let link = fixture("python-link.txt");
    let cut = &link.trim()[..link.len() / 2];
    let run = cli(&["forecast", cut], b"");
    assert_eq!(run.code, 2);
    assert!(
        run.stderr.contains("cut short or damaged"),
        "{}",
        run.stderr
    );
    let bad_item = cli(&["link", link.trim(), "--item", "Hammock"], b"");
    assert_eq!(bad_item.code, 2);
    assert!(
        bad_item.stderr.contains("\"Hammock\""),
        "{}",
        bad_item.stderr
    );
    let json = cli(&["link", link.trim(), "--json"], b"");
    assert_eq!(json.code, 2);
    // A history with a bad cell makes no link.
    let run = cli(
        &["link", "-"],
        b"month,units\n2024-01,3\n2024-02,x\n2024-03,4\n",
    );
    assert_eq!(run.code, 2, "{}", run.stderr);
    assert!(run.stdout.is_empty());
}

/// A work carries the board's Look-back: `work --look-back 2` writes it, `look-back` on that
/// work looks back over 2 periods unless told otherwise, and a bad count is refused.
#[test]
fn a_work_carries_the_look_back_to_the_command_line() {
    let demo = cli(&["demo"], b"").stdout;
    let written = cli(&["work", "-", "--look-back", "2"], &demo);
    assert_eq!(written.code, 0, "{}", written.stderr);
    let file = table_file("look-back-work.json", &written.text());
    assert!(written.text().contains("\"look_back\": 2"));
    let back = cli(&["look-back", &file], b"");
    assert_eq!(back.code, 0, "{}", back.stderr);
    assert!(
        back.text().contains("the plan of 2 period(s) ago"),
        "{}",
        back.text()
    );
    let told = cli(&["look-back", &file, "--periods", "1"], b"");
    assert!(
        told.text().contains("the plan of 1 period(s) ago"),
        "{}",
        told.text()
    );
    // Looking back 0 in the work leaves the command's own default, 1.
    let off = cli(&["work", &file, "--look-back", "0"], b"");
    assert!(!off.text().contains("look_back"), "{}", off.text());
    let bad = cli(&["work", "-", "--look-back", "25"], &demo);
    assert_eq!(bad.code, 2);
    assert!(
        bad.stderr.contains("--look-back takes a whole number"),
        "{}",
        bad.stderr
    );
}

#[test]
fn a_work_carries_the_choice_to_read_the_stock_table_by_one_column() {
    // Two codes share a description: a stock table by code is left out unless chosen.
    let mut text = "month,Code,Description,units\n".to_string();
    for month in 1..=9 {
        for (code, description, units) in [
            ("FG-1", "Birch trellis", 3 + month % 2),
            ("FG-2", "Rain barrel", 4 + month % 3),
            ("FG-9", "Birch trellis", 5 + month % 2),
        ] {
            text.push_str(&format!("2024-{month:02},{code},{description},{units}\n"));
        }
    }
    let history = table_file("shared-description.csv", &text);
    let table = table_file("by-code.csv", "Code,On hand\nFG-9,60\nFG-1,50\n");
    let plain = cli(&["stock", &history, "--stock", &table], b"");
    assert_eq!(plain.code, 0, "{}", plain.stderr);
    assert!(
        plain
            .text()
            .contains("to read those 2 rows by \"Code\" alone, give --stock-by \"Code\""),
        "{}",
        plain.text()
    );
    assert!(!plain.text().contains("on hand 60"), "{}", plain.text());
    let chosen = cli(
        &["stock", &history, "--stock", &table, "--stock-by", "Code"],
        b"",
    );
    assert!(chosen.text().contains("on hand 60"), "{}", chosen.text());
    // The work keeps the choice as taken (version 3); `--stock-by none` takes it back.
    let written = cli(
        &["work", &history, "--stock", &table, "--stock-by", "code"],
        b"",
    );
    assert_eq!(written.code, 0, "{}", written.stderr);
    assert!(
        written.text().contains("\"stock_table_read_by\": \"Code\"")
            && written.text().contains("\"morrowcast_work\": 3"),
        "{}",
        written.text()
    );
    let file = table_file("read-by-work.json", &written.text());
    let again = cli(&["stock", &file], b"");
    assert!(again.text().contains("on hand 50"), "{}", again.text());
    let undone = cli(&["stock", &file, "--stock-by", "none"], b"");
    assert_eq!(undone.code, 0, "{}", undone.stderr);
    assert!(!undone.text().contains("on hand 50"), "{}", undone.text());
    let unchosen = cli(&["work", &history, "--stock", &table], b"");
    assert_eq!(unchosen.code, 0, "{}", unchosen.stderr);
    assert!(
        unchosen.text().contains("\"stock_table\"")
            && !unchosen.text().contains("stock_table_read_by")
    );
    // A new table for the work is read without the choice made of the work's own.
    let other = table_file("by-code-again.csv", "Code,On hand\nFG-9,70\n");
    let replaced = cli(&["stock", &file, "--stock", &other], b"");
    assert!(
        !replaced.text().contains("on hand 70"),
        "{}",
        replaced.text()
    );
    assert!(replaced.text().contains("--stock-by \"Code\""));
    let no_table = cli(&["stock", &history, "--stock-by", "Code"], b"");
    assert_eq!(no_table.code, 2);
    assert!(
        no_table
            .stderr
            .contains("--stock-by says how to read a stock table"),
        "{}",
        no_table.stderr
    );
}
