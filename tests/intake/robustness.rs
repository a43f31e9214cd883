//! Intake on arbitrary text: no panic, and the report's promises hold for whatever was read.
//! Also whole files built from the committed reference series.

use std::collections::HashSet;

use morrowcast_engine::calendar::{civil_from_days, Frequency};
use morrowcast_engine::intake::{read, IntakeReport, Layout};

use crate::support::fixture_text;

/// xorshift64* (Vigna, "An experimental exploration of Marsaglia's xorshift generators",
/// 2016): a seeded generator so every run feeds the same strings.
struct Rng(u64);
impl Rng {
    fn next(&mut self) -> u64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        self.0.wrapping_mul(0x2545_f491_4f6c_dd1d)
    }
    fn below(&mut self, n: usize) -> usize {
        (self.next() % n as u64) as usize
    }
}

const ALPHABET: &[&str] = &[
    "0", "1", "2", "3", "9", "12", "2024", "-", "/", ".", ",", ";", "\t", "|", "\"", " ", "\n",
    "\r\n", "\u{feff}", "\u{a0}", "\u{202f}", "€", "$", "kg", "Q", "W", "Mar", "a", "x", "(", ")",
    "NA", ":", "T", "'",
];

/// Strings from the alphabet, plus a few built from row templates so layouts are exercised.
fn sample(rng: &mut Rng) -> String {
    let mut s = String::new();
    if rng.below(3) == 0 {
        let templates = [
            "2024-0{d},{d}\n",
            "{d}/0{d}/2024;{d},{d}\n",
            "item{d},2024-Q{d},{d}\n",
            "Mar 202{d}\t{d} {d}00\n",
            "2024-W{d}{d}|{d}\n",
            "{d}\n",
        ];
        let template = templates[rng.below(templates.len())];
        for _ in 0..rng.below(12) {
            let mut row = String::new();
            for piece in template.split("{d}") {
                row.push_str(piece);
                row.push_str(&rng.below(10).to_string());
            }
            row.truncate(row.len() - 1);
            if rng.below(5) == 0 {
                row.insert_str(0, ALPHABET[rng.below(ALPHABET.len())]);
            }
            s.push_str(&row);
        }
    } else {
        for _ in 0..rng.below(60) {
            s.push_str(ALPHABET[rng.below(ALPHABET.len())]);
        }
    }
    s
}

fn check_promises(text: &str, report: &IntakeReport) {
    let mut names = HashSet::new();
    for item in &report.items {
        assert!(names.insert(item.name.clone()), "repeated name in {text:?}");
        assert_eq!(item.periods.len(), item.values.len(), "{text:?}");
        assert!(
            item.values.iter().any(Option::is_some),
            "empty item in {text:?}"
        );
        for pair in item.periods.windows(2) {
            assert_eq!(pair[0].next(), pair[1], "irregular periods in {text:?}");
        }
        assert!(item.values.iter().flatten().all(|v| v.is_finite()));
    }
    let lines = text.split('\n').count().max(1);
    for error in &report.errors {
        assert!(
            error.row >= 1 && error.row <= lines,
            "{error:?} in {text:?}"
        );
        assert!(!error.message.is_empty());
    }
}

#[test]
fn thousands_of_random_strings_never_panic() {
    let mut rng = Rng(0x9e37_79b9_7f4a_7c15);
    for _ in 0..6000 {
        let text = sample(&mut rng);
        let report = read(&text);
        check_promises(&text, &report);
    }
}

/// Reads a committed reference CSV (`t,year,period,time,value`) into (year, period, value).
fn fixture(name: &str) -> Vec<(i32, u32, String)> {
    fixture_text(name)
        .lines()
        .skip(1)
        .map(|line| {
            let cells: Vec<&str> = line.split(',').collect();
            (
                cells[1].parse().unwrap(),
                cells[2].parse().unwrap(),
                cells[4].to_string(),
            )
        })
        .collect()
}

// AirPassengers (R datasets; Box & Jenkins series G), tests/fixtures/refs/AirPassengers.csv:
// 144 monthly totals, January 1949 to December 1960. Rewritten as a semicolon file with month
// names, a title and CRLF, intake must give back every value exactly.
#[test]
fn air_passengers_with_month_names_reads_back_exactly() {
    const MONTHS: [&str; 12] = [
        "Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec",
    ];
    let rows = fixture("AirPassengers.csv");
    let mut text = String::from("International airline passengers\r\nMonth;Passengers\r\n");
    for (year, month, value) in &rows {
        text.push_str(&format!(
            "{} {year};{value}\r\n",
            MONTHS[*month as usize - 1]
        ));
    }
    let report = read(&text);
    assert!(report.errors.is_empty(), "{:?}", report.errors);
    assert_eq!(report.frequency, Frequency::Monthly);
    let item = &report.items[0];
    assert_eq!(item.name, "Passengers");
    assert_eq!(item.periods.len(), 144);
    assert_eq!(item.periods[0].to_string(), "1949-01");
    assert_eq!(item.periods[143].to_string(), "1960-12");
    let expected: Vec<Option<f64>> = rows.iter().map(|r| r.2.parse().ok()).collect();
    assert_eq!(item.values, expected);
}

// JohnsonJohnson (R datasets), tests/fixtures/refs/JohnsonJohnson.csv: 84 quarterly earnings
// per share, 1960 Q1 to 1980 Q4, with two decimals. Pasted as tab-separated "1960 Q1" labels
// with decimal commas, intake must give back every value to within 1e-12.
#[test]
fn johnson_johnson_with_decimal_commas_reads_back() {
    let rows = fixture("JohnsonJohnson.csv");
    let mut text = String::from("Quarter\tEPS\n");
    for (year, quarter, value) in &rows {
        text.push_str(&format!("{year} Q{quarter}\t{}\n", value.replace('.', ",")));
    }
    let report = read(&text);
    assert!(report.errors.is_empty(), "{:?}", report.errors);
    assert_eq!(report.frequency, Frequency::Quarterly);
    let item = &report.items[0];
    assert_eq!(item.periods.len(), 84);
    assert_eq!(item.periods[83].to_string(), "1980-Q4");
    for (got, (_, _, want)) in item.values.iter().zip(&rows) {
        let want: f64 = want.parse().unwrap();
        assert!((got.unwrap() - want).abs() < 1e-12);
    }
}

// The committed file itself (`t,year,period,time,value`): the index column t gives positions,
// the four other numeric columns are a wide table; "value" is the series as published.
#[test]
fn air_passengers_file_as_committed() {
    let report = read(&fixture_text("AirPassengers.csv"));
    assert!(report.errors.is_empty(), "{:?}", report.errors);
    assert_eq!(report.layout, Layout::Wide);
    assert_eq!(report.frequency, Frequency::Undated);
    let value = report.items.iter().find(|i| i.name == "value").unwrap();
    assert_eq!(value.values.len(), 144);
    assert_eq!(value.values[0], Some(112.0));
    assert_eq!(value.values[143], Some(432.0));
}

// A long daily file and a long table of many items are read whole (their reading time is
// measured in benches/speed.rs).
#[test]
fn large_inputs_are_read_whole() {
    let mut text = String::from("date,sales\n");
    for day in 0..40_000 {
        let (year, month, dom) = civil_from_days(day);
        text.push_str(&format!("{year}-{month:02}-{dom:02},{}\n", day % 17));
    }
    let report = read(&text);
    assert!(report.errors.is_empty());
    assert_eq!(report.frequency, Frequency::Daily);
    assert_eq!(report.items[0].values.len(), 40_000);
    let mut text = String::from("item;week;qty\n");
    for row in 0..30_000 {
        text.push_str(&format!(
            "sku{};2023-W{:02};{}\n",
            row % 500,
            row / 500 % 52 + 1,
            row % 7
        ));
    }
    let report = read(&text);
    assert!(report.errors.is_empty(), "{:?}", &report.errors[..1]);
    assert_eq!(report.items.len(), 500);
}
