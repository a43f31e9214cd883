//! Intake on generated inputs: whatever the bytes, the report keeps its promises; files written
//! from known values read back exactly; a bad cell anywhere is reported at its cell. Also whole
//! files built from the committed reference series, and every input that ever failed, kept.
//!
//! Kept apart from: one feature per test (`formats`), error locations written by hand
//! (`errors`) and the named misreads of the robustness run (`misreads`).
//!
//! The generator is our own seeded xorshift (no property-testing crate: the inputs are the same
//! on every run and every machine, and a failure names the text to copy into
//! `regressions_keep_their_reports`). Inputs each test runs:
//! - `any_bytes_keep_the_reports_promises`: 16,000 (6,000 strings of an alphabet and row
//!   templates, 8,000 generated files with 1 to 4 mutations of their bytes, 2,000 strings of
//!   random bytes), each through `read_bytes`;
//! - `generated_files_read_back_exactly`: 3,000 files (every layout, periods across the header
//!   too, with the columns now and then in reverse time order; every delimiter, decimal
//!   convention and period style, with thousands separators, scientific notation, quotes,
//!   currency symbols or units, spaces after delimiters, trailing delimiters, titles, gaps and
//!   empty cells some of the time);
//! - `a_bad_cell_anywhere_is_reported_at_its_cell`: 3,000 files, each with one bad cell;
//! - `regressions_keep_their_reports`: the 11 inputs that once failed here, with their
//!   reports (the misreads of the first robustness run are in `misreads`).

use std::collections::HashSet;

use morrowcast_engine::calendar::{civil_from_days, days_in_month, Frequency, Period};
use morrowcast_engine::intake::{read, read_bytes, DecimalMark, Delimiter, IntakeReport, Layout};
use morrowcast_engine::series::MAX_ABS_VALUE;

use crate::support::fixture_text;

/// xorshift64* (Vigna, "An experimental exploration of Marsaglia's xorshift generators",
/// 2016): a seeded generator so every run feeds the same inputs.
struct Rng(u64);
impl Rng {
    fn next(&mut self) -> u64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        self.0.wrapping_mul(0x2545_f491_4f6c_dd1d)
    }
    fn below(&mut self, n: usize) -> usize {
        (self.next() % n.max(1) as u64) as usize
    }
    /// True one time in `n`.
    fn one_in(&mut self, n: usize) -> bool {
        self.below(n) == 0
    }
    fn pick<T: Copy>(&mut self, items: &[T]) -> T {
        items[self.below(items.len())]
    }
}

// ---------------------------------------------------------------------------------------------
// The promises a report keeps whatever it was given.

/// Largest size of a value read: the series' bound, which intake keeps too.
const MAX_MAGNITUDE: f64 = MAX_ABS_VALUE;

/// Slots all items may hold: 100,000 plus 1,000 per row (crates/engine/src/intake/build.rs).
fn slot_cap(lines: usize) -> usize {
    100_000 + 1_000 * lines
}

/// Lines as intake counts them: LF, CRLF and a lone CR each end one.
fn line_count(text: &str) -> usize {
    let mut lines = 1;
    let mut chars = text.chars().peekable();
    while let Some(c) = chars.next() {
        if c == '\n' || (c == '\r' && chars.peek() != Some(&'\n')) {
            lines += 1;
        }
    }
    lines
}

/// The text `read_bytes` sees (UTF-16 with its mark, else UTF-8 with replacements).
fn decoded(bytes: &[u8]) -> String {
    let utf16 = |little: bool| {
        let units = bytes[2..].chunks(2).map(|p| match (p, little) {
            ([a, b], true) => u16::from_le_bytes([*a, *b]),
            ([a, b], false) => u16::from_be_bytes([*a, *b]),
            _ => 0xFFFD,
        });
        char::decode_utf16(units)
            .map(|c| c.unwrap_or(char::REPLACEMENT_CHARACTER))
            .collect()
    };
    match bytes {
        [0xFF, 0xFE, ..] => utf16(true),
        [0xFE, 0xFF, ..] => utf16(false),
        _ => String::from_utf8_lossy(bytes).into_owned(),
    }
}

fn check_promises(input: &str, report: &IntakeReport) {
    let lines = line_count(input);
    let mut names = HashSet::new();
    let mut slots = 0;
    for item in &report.items {
        assert!(!item.name.is_empty(), "empty name in {input:?}");
        assert!(
            names.insert(item.name.clone()),
            "repeated name in {input:?}"
        );
        assert_eq!(item.periods.len(), item.values.len(), "{input:?}");
        assert!(
            item.values.iter().any(Option::is_some),
            "empty item in {input:?}"
        );
        for pair in item.periods.windows(2) {
            assert_eq!(pair[0].next(), pair[1], "irregular periods in {input:?}");
        }
        for p in &item.periods {
            assert_eq!(p.frequency(), report.frequency, "{input:?}");
            assert!(
                p.calendar_year().is_none_or(|y| y <= 9633),
                "{p} in {input:?}"
            );
        }
        for v in item.values.iter().flatten() {
            assert!(
                v.is_finite() && v.abs() <= MAX_MAGNITUDE,
                "{v} in {input:?}"
            );
        }
        slots += item.values.len();
    }
    assert!(slots <= slot_cap(lines), "{slots} slots for {lines} lines");
    for error in &report.errors {
        assert!(
            error.row >= 1 && error.row <= lines,
            "{error:?} beyond {lines} lines of {input:?}"
        );
        assert!(!error.message.is_empty());
    }
}

const ALPHABET: &[&str] = &[
    "0", "1", "2", "3", "9", "12", "2024", "-", "/", ".", ",", ";", "\t", "|", "\"", " ", "\n",
    "\r\n", "\r", "\u{feff}", "\u{a0}", "\u{202f}", "€", "$", "kg", "Q", "W", "Mar", "a", "x", "(",
    ")", "NA", ":", "T", "'", "e", "E+", "inf", "NaN", "20240101", "202401", "9999",
];

/// Strings from the alphabet, plus a few built from row templates so layouts are exercised.
fn sample(rng: &mut Rng) -> String {
    let mut s = String::new();
    if rng.one_in(3) {
        let templates = [
            "2024-0{d},{d}\n",
            "{d}/0{d}/2024;{d},{d}\n",
            "item{d},2024-Q{d},{d}\n",
            "Mar 202{d}\t{d} {d}00\n",
            "2024-W{d}{d}|{d}\n",
            "{d}\n",
            "2024010{d},{d}e{d}\n",
            "item {d} ,{d}{d}{d}{d}-0{d},{d}\n",
        ];
        let template = rng.pick(&templates);
        for _ in 0..rng.below(12) {
            let mut row = String::new();
            for piece in template.split("{d}") {
                row.push_str(piece);
                row.push_str(&rng.below(10).to_string());
            }
            row.truncate(row.len() - 1);
            if rng.one_in(5) {
                row.insert_str(0, rng.pick(ALPHABET));
            }
            s.push_str(&row);
        }
    } else {
        for _ in 0..rng.below(60) {
            s.push_str(rng.pick(ALPHABET));
        }
    }
    s
}

/// Text put in place of a cell, or inserted, by a mutation.
const JUNK: &[&str] = &[
    "",
    "\"",
    "\"\"",
    "inf",
    "-inf",
    "NaN",
    "1e400",
    "1e15",
    "1e16",
    "9999-12",
    "0999-01",
    "10000-01",
    "20240132",
    "12x",
    "n/a",
    "Oak tray ",
    "Oak tray\t",
    "\u{a0}",
    ",",
    ";",
    "\t",
    "|",
    "\n",
    "\r",
    "\r\n",
    "1,234",
    "1.234",
    "(5)",
    "−3",
    "2,5e3",
    "99999999999999999999",
    "Q5 2024",
    "2024-W53",
    "31/02/2024",
    "Mar-24",
    "\u{feff}",
];

/// Mutates the bytes of a file: replace, insert, delete, repeat or swap pieces.
fn mutate(rng: &mut Rng, bytes: &mut Vec<u8>) {
    for _ in 0..1 + rng.below(4) {
        let at = rng.below(bytes.len() + 1);
        match rng.below(7) {
            0 => {
                let end = (at + rng.below(8)).min(bytes.len());
                bytes.splice(at..end, rng.pick(JUNK).bytes());
            }
            1 => {
                let junk = rng.pick(JUNK);
                bytes.splice(at..at, junk.bytes());
            }
            2 => {
                let byte = rng.pick(&[0xFF, 0xFE, 0xC3, 0x80, 0x00, b'"', b'\r', b'\n', b',']);
                bytes.insert(at, byte);
            }
            3 => {
                let end = (at + rng.below(20)).min(bytes.len());
                bytes.drain(at..end);
            }
            4 => {
                // Repeat a line.
                let start = bytes[..at]
                    .iter()
                    .rposition(|b| *b == b'\n')
                    .map_or(0, |i| i + 1);
                let end = bytes[at..]
                    .iter()
                    .position(|b| *b == b'\n')
                    .map_or(bytes.len(), |i| at + i + 1);
                let line = bytes[start..end].to_vec();
                bytes.splice(end..end, line);
            }
            5 => {
                // A digit changed.
                if let Some(i) = (at..bytes.len()).find(|i| bytes[*i].is_ascii_digit()) {
                    bytes[i] = b'0' + rng.below(10) as u8;
                }
            }
            _ => {
                if rng.one_in(3) {
                    // The whole text as UTF-16 with its mark (little-endian).
                    let text = String::from_utf8_lossy(bytes).into_owned();
                    *bytes = [0xFF, 0xFE]
                        .into_iter()
                        .chain(text.encode_utf16().flat_map(u16::to_le_bytes))
                        .collect();
                    return;
                }
            }
        }
    }
}

#[test]
fn any_bytes_keep_the_reports_promises() {
    let mut rng = Rng(0x9e37_79b9_7f4a_7c15);
    for _ in 0..6_000 {
        let text = sample(&mut rng);
        check_promises(&text, &read(&text));
        check_promises(&text, &read_bytes(text.as_bytes()));
    }
    let mut rng = Rng(0x2545_f491_4f6c_dd1d);
    for _ in 0..8_000 {
        let case = generate(&mut rng);
        let mut bytes = case.text.into_bytes();
        mutate(&mut rng, &mut bytes);
        let report = read_bytes(&bytes);
        check_promises(&decoded(&bytes), &report);
    }
    let mut rng = Rng(0x0123_4567_89ab_cdef);
    for _ in 0..2_000 {
        let bytes: Vec<u8> = (0..rng.below(200)).map(|_| rng.next() as u8).collect();
        check_promises(&decoded(&bytes), &read_bytes(&bytes));
    }
}

// ---------------------------------------------------------------------------------------------
// Files written from known values.

/// How a period is written; each style belongs to one frequency.
#[derive(Clone, Copy, Debug, PartialEq)]
enum Style {
    /// No period column: rows are positions.
    Undated,
    /// Daily: `2024-03-31` or `2024/03/31`.
    IsoDay(char),
    /// Daily: `31/03/2024` (separator, two-digit year).
    DayFirst(char, bool),
    /// Daily: `03/31/2024`.
    MonthFirst(char, bool),
    /// Daily: `31 Mar 2024`, `31-Mar-24`, `Mar 31, 2024`, `March 31 2024`.
    NamedDay(usize),
    /// Daily: `20240331`.
    CompactDay,
    /// Weekly: the ISO date of the week's Monday.
    Monday,
    /// Weekly: `2024-W05`, `2024W05`, `2024 W5`, `W05 2024`.
    IsoWeek(usize),
    /// Monthly: the month's last day, `2024-03-31`.
    MonthEnd,
    /// Monthly: `01/03/2024`, the 1st of the month, day first.
    FirstDayFirst(char),
    /// Monthly: `03/01/2024`, the 1st of the month, month first.
    FirstMonthFirst(char),
    /// Monthly: `2024-03`, `2024/03`, `03/2024`, `03.2024`.
    Month(usize),
    /// Monthly: `Mar 2024`, `March 2024`, `2024 Mar`, `Mar-24`.
    MonthName(usize),
    /// Monthly: `202403`.
    CompactMonth,
    /// Quarterly: the quarter's first day, `2024-04-01`.
    QuarterStart,
    /// Quarterly: `2024 Q1`, `2024-Q1`, `2024Q1`, `Q1 2024`, `Q1-24`.
    Quarter(usize),
    /// Yearly: `2024-06-30`.
    YearDate,
    /// Yearly: `2024`.
    Year,
}

const STYLES: &[Style] = &[
    Style::Undated,
    Style::IsoDay('-'),
    Style::IsoDay('/'),
    Style::DayFirst('/', false),
    Style::DayFirst('.', false),
    Style::DayFirst('-', true),
    Style::MonthFirst('/', false),
    Style::MonthFirst('/', true),
    Style::NamedDay(0),
    Style::NamedDay(1),
    Style::NamedDay(2),
    Style::NamedDay(3),
    Style::CompactDay,
    Style::Monday,
    Style::IsoWeek(0),
    Style::IsoWeek(1),
    Style::IsoWeek(2),
    Style::IsoWeek(3),
    Style::MonthEnd,
    Style::FirstDayFirst('/'),
    Style::FirstDayFirst('.'),
    Style::FirstMonthFirst('/'),
    Style::Month(0),
    Style::Month(1),
    Style::Month(2),
    Style::Month(3),
    Style::MonthName(0),
    Style::MonthName(1),
    Style::MonthName(2),
    Style::MonthName(3),
    Style::CompactMonth,
    Style::QuarterStart,
    Style::Quarter(0),
    Style::Quarter(1),
    Style::Quarter(2),
    Style::Quarter(3),
    Style::Quarter(4),
    Style::YearDate,
    Style::Year,
];

const MONTHS: [&str; 12] = [
    "January",
    "February",
    "March",
    "April",
    "May",
    "June",
    "July",
    "August",
    "September",
    "October",
    "November",
    "December",
];

impl Style {
    fn frequency(self) -> Frequency {
        use Style::*;
        match self {
            Undated => Frequency::Undated,
            IsoDay(_) | DayFirst(..) | MonthFirst(..) | NamedDay(_) | CompactDay => {
                Frequency::Daily
            }
            Monday | IsoWeek(_) => Frequency::Weekly,
            MonthEnd | FirstDayFirst(_) | FirstMonthFirst(_) | Month(_) | MonthName(_)
            | CompactMonth => Frequency::Monthly,
            QuarterStart | Quarter(_) => Frequency::Quarterly,
            YearDate | Year => Frequency::Yearly,
        }
    }

    /// Whether rows may be missing: the labels name their periods outright, so a missing row
    /// cannot change what the others mean (with dates it can change the frequency implied).
    fn may_skip(self) -> bool {
        use Style::*;
        matches!(
            self,
            IsoWeek(_) | Month(_) | MonthName(_) | CompactMonth | Quarter(_) | Year
        )
    }

    /// Fewest periods: two-way daily dates need days above 12 to tell their order.
    fn min_len(self) -> usize {
        match self {
            Style::DayFirst(..) | Style::MonthFirst(..) => 20,
            _ => 3,
        }
    }

    fn label(self, p: Period) -> String {
        use Style::*;
        let yy = |y: i32| format!("{:02}", y.rem_euclid(100));
        let ymd = civil_from_days(p.ordinal());
        let month = (
            p.ordinal().div_euclid(12) as i32,
            p.ordinal().rem_euclid(12) as u32 + 1,
        );
        let quarter = (
            p.ordinal().div_euclid(4) as i32,
            p.ordinal().rem_euclid(4) as u32 + 1,
        );
        match self {
            Undated => String::new(),
            IsoDay(s) => format!("{:04}{s}{:02}{s}{:02}", ymd.0, ymd.1, ymd.2),
            DayFirst(s, short) | MonthFirst(s, short) => {
                let (y, m, d) = ymd;
                let year = if short { yy(y) } else { y.to_string() };
                if matches!(self, DayFirst(..)) {
                    format!("{d:02}{s}{m:02}{s}{year}")
                } else {
                    format!("{m:02}{s}{d:02}{s}{year}")
                }
            }
            NamedDay(k) => {
                let (y, m, d) = ymd;
                let name = MONTHS[m as usize - 1];
                match k {
                    0 => format!("{d} {} {y}", &name[..3]),
                    1 => format!("{d:02}-{}-{}", &name[..3], yy(y)),
                    2 => format!("{} {d}, {y}", &name[..3]),
                    _ => format!("{name} {d} {y}"),
                }
            }
            CompactDay => format!("{:04}{:02}{:02}", ymd.0, ymd.1, ymd.2),
            Monday => {
                let (y, m, d) = civil_from_days(p.ordinal() * 7 - 3);
                format!("{y:04}-{m:02}-{d:02}")
            }
            IsoWeek(k) => {
                let label = p.to_string();
                let (y, w) = (&label[..4], &label[6..]);
                match k {
                    0 => label.clone(),
                    1 => format!("{y}W{w}"),
                    2 => format!("{y} W{}", w.trim_start_matches('0')),
                    _ => format!("W{w} {y}"),
                }
            }
            MonthEnd => {
                let (y, m) = month;
                format!("{y:04}-{m:02}-{:02}", days_in_month(y, m))
            }
            FirstDayFirst(s) => format!("01{s}{:02}{s}{}", month.1, month.0),
            FirstMonthFirst(s) => format!("{:02}{s}01{s}{}", month.1, month.0),
            Month(k) => match k {
                0 => format!("{}-{:02}", month.0, month.1),
                1 => format!("{}/{:02}", month.0, month.1),
                2 => format!("{:02}/{}", month.1, month.0),
                _ => format!("{:02}.{}", month.1, month.0),
            },
            MonthName(k) => {
                let name = MONTHS[month.1 as usize - 1];
                match k {
                    0 => format!("{} {}", &name[..3], month.0),
                    1 => format!("{name} {}", month.0),
                    2 => format!("{} {}", month.0, &name[..3]),
                    _ => format!("{}-{}", &name[..3], yy(month.0)),
                }
            }
            CompactMonth => format!("{}{:02}", month.0, month.1),
            QuarterStart => format!("{}-{:02}-01", quarter.0, 3 * quarter.1 - 2),
            Quarter(k) => match k {
                0 => format!("{} Q{}", quarter.0, quarter.1),
                1 => format!("{}-Q{}", quarter.0, quarter.1),
                2 => format!("{}Q{}", quarter.0, quarter.1),
                3 => format!("Q{} {}", quarter.1, quarter.0),
                _ => format!("Q{}-{}", quarter.1, yy(quarter.0)),
            },
            YearDate => format!("{}-06-30", p.ordinal()),
            Year => p.ordinal().to_string(),
        }
    }
}

/// A first period of `frequency` somewhere in 1995–2030.
fn first_period(rng: &mut Rng, frequency: Frequency) -> Period {
    let year = 1995 + rng.below(36) as i32;
    let month = 1 + rng.below(12) as u32;
    let day = 1 + rng.below(28) as u32;
    match frequency {
        Frequency::Daily => Period::day(year, month, day),
        Frequency::Weekly => Period::week_containing(year, month, day),
        Frequency::Monthly => Period::month(year, month),
        Frequency::Quarterly => Period::quarter(year, 1 + rng.below(4) as u32),
        Frequency::Yearly => Period::year(year),
        Frequency::Undated => Period::position(1),
    }
}

/// A decimal number written as `units` / 10^`decimals`.
#[derive(Clone, Copy, Debug)]
struct Num {
    units: i64,
    decimals: u32,
}

impl Num {
    fn digits(self) -> String {
        let digits = self.units.unsigned_abs().to_string();
        let width = self.decimals as usize + 1;
        format!("{digits:0>width$}")
    }
    /// The value: the canonical decimal text, parsed (Rust rounds correctly, so every way of
    /// writing the number gives this f64).
    fn value(self) -> f64 {
        let digits = self.digits();
        let split = digits.len() - self.decimals as usize;
        let sign = if self.units < 0 { "-" } else { "" };
        format!("{sign}{}.{}", &digits[..split], &digits[split..])
            .trim_end_matches('.')
            .parse()
            .unwrap()
    }
}

/// How numbers are written in one file.
#[derive(Clone, Copy, Debug)]
struct Writing {
    mark: char,
    /// Thousands separator, when grouping is used.
    thousands: Option<char>,
    /// One time in this many a value is in scientific notation (0: never).
    sci: usize,
    /// Accounting parentheses for negative values.
    parentheses: bool,
    /// A currency symbol or unit on every value: (text, before the number).
    affix: Option<(&'static str, bool)>,
}

fn write_num(rng: &mut Rng, n: Num, w: Writing, plain: bool) -> String {
    let digits = n.digits();
    let split = digits.len() - n.decimals as usize;
    let (whole, fraction) = digits.split_at(split);
    let body = if !plain && w.sci > 0 && rng.one_in(w.sci) {
        // Mantissa with `shift` digits after the mark, exponent making up the difference.
        let shift = rng.below(digits.len());
        let (a, b) = digits.split_at(digits.len() - shift);
        let exponent = shift as i64 - i64::from(n.decimals);
        let e = rng.pick(&["e", "E"]);
        let sign = if exponent >= 0 && rng.one_in(2) {
            "+"
        } else {
            ""
        };
        if b.is_empty() {
            format!("{a}{e}{sign}{exponent}")
        } else {
            format!("{a}{}{b}{e}{sign}{exponent}", w.mark)
        }
    } else {
        let whole = match w.thousands {
            Some(sep) if !plain && whole.len() > 3 => {
                let mut grouped = String::new();
                for (i, c) in whole.chars().enumerate() {
                    if i > 0 && (whole.len() - i) % 3 == 0 {
                        grouped.push(sep);
                    }
                    grouped.push(c);
                }
                grouped
            }
            _ => whole.to_string(),
        };
        if fraction.is_empty() {
            whole
        } else {
            format!("{whole}{}{fraction}", w.mark)
        }
    };
    let body = match w.affix {
        Some((affix, true)) => format!("{affix}{body}"),
        Some((affix, false)) => format!("{body}{affix}"),
        None => body,
    };
    match (n.units < 0, w.parentheses) {
        (false, _) => body,
        (true, true) => format!("({body})"),
        (true, false) => format!("-{body}"),
    }
}

/// A generated file and what intake must make of it.
struct Case {
    text: String,
    /// Header cells (empty when the file has none).
    header: Vec<String>,
    rows: Vec<Vec<String>>,
    /// Which columns hold periods and values (indices into a row).
    period_column: Option<usize>,
    value_columns: Vec<usize>,
    layout: Layout,
    delimiter: Delimiter,
    /// The decimal mark, when the file shows it (files of whole numbers read either way).
    mark: Option<DecimalMark>,
    frequency: Frequency,
    items: Vec<(String, Vec<Period>, Vec<Option<f64>>)>,
    /// How to write the text again from changed rows.
    render: Render,
    /// The (row, column) of the plain cell that shows the decimal mark.
    mark_cell: Option<(usize, usize)>,
}

#[derive(Clone, Debug)]
struct Render {
    delimiter: char,
    quote_all: bool,
    crlf: bool,
    bom: bool,
    title: Option<String>,
    trailing_blank: bool,
    /// A space after each delimiter ("a, b").
    pad: bool,
    /// A delimiter at the end of every line, as some exports write.
    trailing_delimiter: bool,
}

/// A cell in quotes when it must be (or always, with `quote_all`).
fn quoted(cell: &str, r: &Render) -> String {
    if r.quote_all || cell.contains([r.delimiter, '"', '\n', '\r']) {
        format!("\"{}\"", cell.replace('"', "\"\""))
    } else {
        cell.to_string()
    }
}

/// The text of a table, and the line of each row.
fn render(header: &[String], rows: &[Vec<String>], r: &Render) -> (String, Vec<usize>) {
    let end = if r.crlf { "\r\n" } else { "\n" };
    let mut text = String::new();
    if r.bom {
        text.push('\u{feff}');
    }
    let mut line = 1;
    let join = |cells: &[String]| -> String {
        let separator = if r.pad {
            format!("{} ", r.delimiter)
        } else {
            r.delimiter.to_string()
        };
        let mut line = cells
            .iter()
            .map(|c| quoted(c, r))
            .collect::<Vec<_>>()
            .join(&separator);
        if r.trailing_delimiter {
            line.push(r.delimiter);
        }
        line
    };
    if let Some(title) = &r.title {
        text.push_str(title);
        text.push_str(end);
        line += 1;
    }
    if !header.is_empty() {
        text.push_str(&join(header));
        text.push_str(end);
        line += 1;
    }
    let mut lines = Vec::with_capacity(rows.len());
    for row in rows {
        text.push_str(&join(row));
        text.push_str(end);
        lines.push(line);
        line += 1;
    }
    if r.trailing_blank {
        text.push_str(end);
    }
    (text, lines)
}

const NAMES: &[&str] = &[
    "Oak tray",
    "Pine box",
    "Bolt M8",
    "Café crème",
    "Glass jar, 1 l",
    "Seed mix \"B\"",
    "Rope 10 m",
    "Hinge",
    "Watering can",
    "Trowel",
    "Gloves (pair)",
    "Twine; jute",
];

/// An item's values where the rows are shared by every item (single, wide, across): its value
/// in each row present, nothing in a row left out.
fn shared_values(values: &[Option<Num>], present: &[bool]) -> Vec<Option<f64>> {
    values
        .iter()
        .zip(present)
        .map(|(v, here)| if *here { v.map(Num::value) } else { None })
        .collect()
}

/// A file from known values; see the module doc for what varies.
fn generate(rng: &mut Rng) -> Case {
    let layout = rng.pick(&[Layout::Single, Layout::Wide, Layout::Long, Layout::Across]);
    let style = if rng.one_in(8) {
        Style::Undated
    } else {
        rng.pick(STYLES)
    };
    // Periods across the header need labels a header can hold: not row positions, and not
    // 8- or 6-digit numbers, which read as quantities there.
    let layout = match (layout, style) {
        (Layout::Across, Style::Undated | Style::CompactDay | Style::CompactMonth) => Layout::Wide,
        (layout, _) => layout,
    };
    let one_column = layout == Layout::Single && style == Style::Undated;
    let delimiter = if one_column {
        ','
    } else {
        rng.pick(&[',', ';', '\t', '|'])
    };
    let comma_mark = rng.one_in(2);
    // A decimal comma in a comma-delimited file (or a one-column text) lives in quotes.
    let quote_all = (comma_mark && delimiter == ',') || rng.one_in(6);
    let mut fractions = !rng.one_in(4);
    // Whole numbers in a first value column could read as positions or years.
    if style == Style::Undated && layout != Layout::Single {
        fractions = true;
    }
    let mark = if comma_mark { ',' } else { '.' };
    let thousands = if rng.one_in(3) {
        let choices: &[char] = if comma_mark {
            if delimiter == ',' && !fractions {
                // Lone "1.234" in a comma file is a decimal dot (see mark.rs).
                &[' ', '\u{a0}']
            } else {
                &['.', ' ', '\u{a0}']
            }
        } else {
            &[',', ' ', '\u{a0}', '\'']
        };
        Some(rng.pick(choices))
    } else {
        None
    };
    let writing = Writing {
        mark,
        thousands,
        sci: if rng.one_in(3) { 4 } else { 0 },
        parentheses: rng.one_in(3),
        affix: rng.one_in(8).then(|| {
            rng.pick(&[
                ("$", true),
                ("€ ", true),
                (" €", false),
                (" kg", false),
                ("%", false),
            ])
        }),
    };
    let frequency = style.frequency();
    let n = style.min_len() + rng.below(25);
    let start = first_period(rng, frequency);
    let periods: Vec<Period> = (0..n as i64).map(|i| start.offset(i)).collect();
    let item_count = match layout {
        Layout::Single => 1,
        _ => 2 + rng.below(3),
    };
    let mut names: Vec<&str> = Vec::new();
    while names.len() < item_count {
        let name = rng.pick(NAMES);
        if !names.contains(&name) {
            names.push(name);
        }
    }
    let header = layout == Layout::Across || !rng.one_in(4);
    let empty_marks = ["", "NA", "n/a", "#N/A", "null"];
    // Values: rows present (a few may be missing where labels name their periods), empty
    // cells now and then, never at the ends of a one-column paste.
    let mut values: Vec<Vec<Option<Num>>> = Vec::new();
    let mut present: Vec<Vec<bool>> = Vec::new();
    for _ in 0..item_count {
        let mut item_values = Vec::with_capacity(n);
        let mut item_present = Vec::with_capacity(n);
        let scale = rng.pick(&[10i64, 1_000, 10_000_000, 900_000_000_000_000]);
        for i in 0..n {
            let ends = i == 0 || i == n - 1;
            // At most one row in three missing: years and 6-digit months must stay dense.
            item_present.push(ends || !style.may_skip() || i % 3 != 1 || !rng.one_in(3));
            let empty = !(ends && style == Style::Undated) && rng.one_in(10);
            item_values.push((!empty).then(|| {
                let decimals = if fractions && scale < 1_000_000_000 {
                    rng.pick(&[0u32, 1, 2, 2, 3])
                } else {
                    0
                };
                let magnitude = (rng.next() % scale as u64) as i64;
                let units = if rng.one_in(10) {
                    -magnitude
                } else {
                    magnitude
                };
                Num { units, decimals }
            }));
        }
        values.push(item_values);
        present.push(item_present);
    }
    if layout != Layout::Long {
        // Rows are shared: a row is present for every item or for none.
        let shared = present[0].clone();
        present.iter_mut().for_each(|p| *p = shared.clone());
    } else if style != Style::Undated {
        // A period no row names at all is read as no sales or as missing, as the items' own
        // rates make likely (tests/intake/unnamed.rs); here a gap is written as the first
        // item's "n/a" row, so the period is named and the rule for named periods holds.
        for i in 0..n {
            if !present.iter().any(|p| p[i]) {
                present[0][i] = true;
                values[0][i] = None;
            }
        }
    }
    // Every item has a value in a row present (a table without any is an error by design).
    for (item, item_present) in values.iter_mut().zip(&present) {
        if !item
            .iter()
            .zip(item_present)
            .any(|(v, p)| v.is_some() && *p)
        {
            item[0] = Some(Num {
                units: 7,
                decimals: 0,
            });
        }
    }
    // One plain cell with one decimal shows the mark when the file has fractions; a
    // comma-delimited file with decimal dots needs none (a decimal comma there needs quotes).
    if fractions && !(delimiter == ',' && !comma_mark && rng.one_in(2)) {
        values[0][0] = Some(Num {
            units: 1 + rng.below(9_999) as i64,
            decimals: 1,
        });
    }
    let render_cell = |rng: &mut Rng, v: Option<Num>, first: bool| -> String {
        match v {
            Some(n) => write_num(rng, n, writing, first),
            None => rng.pick(&empty_marks).to_string(),
        }
    };
    let mut header_cells: Vec<String> = Vec::new();
    let mut rows: Vec<Vec<String>> = Vec::new();
    let mut mark_cell = None;
    let (period_column, value_columns);
    let mut expected = Vec::new();
    match layout {
        Layout::Single | Layout::Wide => {
            let dated = style != Style::Undated;
            period_column = dated.then_some(0);
            let first_value = usize::from(dated);
            value_columns = (first_value..first_value + item_count).collect::<Vec<_>>();
            if dated {
                header_cells.push(
                    rng.pick(&["month", "date", "period", "Periode"])
                        .to_string(),
                );
            }
            for name in &names {
                header_cells.push(if layout == Layout::Single && rng.one_in(2) {
                    "sales".to_string()
                } else {
                    name.to_string()
                });
            }
            for i in (0..n).filter(|i| present[0][*i]) {
                let mut row = Vec::new();
                if dated {
                    row.push(style.label(periods[i]));
                }
                for (k, item) in values.iter().enumerate() {
                    row.push(render_cell(rng, item[i], k == 0 && i == 0));
                }
                if i == 0 {
                    mark_cell = Some((rows.len(), first_value));
                }
                rows.push(row);
            }
            for k in 0..item_count {
                let name = if header {
                    header_cells[first_value + k].clone()
                } else {
                    format!("Series {}", k + 1)
                };
                expected.push((
                    name,
                    periods.clone(),
                    shared_values(&values[k], &present[0]),
                ));
            }
            // Rows out of order are sorted (with a warning).
            if dated && rng.one_in(5) {
                rows.reverse();
                mark_cell = mark_cell.map(|(_, j)| (rows.len() - 1, j));
            }
        }
        Layout::Long => {
            let dated = style != Style::Undated;
            let period_first = dated && rng.one_in(3);
            let (item_at, period_at, value_at) = match (dated, period_first) {
                (false, _) => (0, None, 1),
                (true, false) => (0, Some(1), 2),
                (true, true) => (1, Some(0), 2),
            };
            period_column = period_at;
            value_columns = vec![value_at];
            header_cells = vec![String::new(); value_at + 1];
            header_cells[item_at] = rng.pick(&["item", "product", "SKU"]).to_string();
            header_cells[value_at] = rng.pick(&["qty", "units", "sales"]).to_string();
            if let Some(p) = period_at {
                header_cells[p] = rng.pick(&["month", "date", "period"]).to_string();
            }
            let mut entries: Vec<(usize, usize)> = Vec::new();
            for (k, item_present) in present.iter().enumerate() {
                entries.extend((0..n).filter(|i| item_present[*i]).map(|i| (k, i)));
            }
            // Interleaved, or shuffled when rows carry their periods.
            if dated && rng.one_in(2) {
                for a in (1..entries.len()).rev() {
                    let b = rng.below(a + 1);
                    entries.swap(a, b);
                }
            } else if rng.one_in(2) {
                entries.sort_by_key(|(k, i)| (*i, *k));
            }
            let mut order: Vec<usize> = Vec::new();
            for &(k, i) in &entries {
                let mut row = vec![String::new(); value_at + 1];
                row[item_at] = names[k].to_string();
                if let Some(p) = period_at {
                    row[p] = style.label(periods[i]);
                }
                row[value_at] = render_cell(rng, values[k][i], k == 0 && i == 0);
                if k == 0 && i == 0 {
                    mark_cell = Some((rows.len(), value_at));
                }
                rows.push(row);
                if !order.contains(&k) {
                    order.push(k);
                }
            }
            for k in order {
                let own: Vec<usize> = (0..n).filter(|i| present[k][*i]).collect();
                let (first, last) = (own[0], own[own.len() - 1]);
                let item_periods = if dated {
                    periods[first..=last].to_vec()
                } else {
                    (1..=own.len() as i64).map(Period::position).collect()
                };
                // A period another item has a row for is no sales for this one.
                let item_values: Vec<Option<f64>> = if dated {
                    (first..=last)
                        .map(|i| {
                            if present[k][i] {
                                values[k][i].map(Num::value)
                            } else if present.iter().any(|other| other[i]) {
                                Some(0.0)
                            } else {
                                None
                            }
                        })
                        .collect()
                } else {
                    own.iter().map(|i| values[k][*i].map(Num::value)).collect()
                };
                expected.push((names[k].to_string(), item_periods, item_values));
            }
        }
        Layout::Across => {
            // One row per item; the present periods across the header, now and then in
            // reverse order (the columns are put in time order).
            period_column = None;
            let mut order: Vec<usize> = (0..n).filter(|i| present[0][*i]).collect();
            if rng.one_in(5) {
                order.reverse();
            }
            header_cells.push(rng.pick(&["item", "product", "SKU"]).to_string());
            header_cells.extend(order.iter().map(|i| style.label(periods[*i])));
            value_columns = (1..=order.len()).collect();
            for (k, name) in names.iter().enumerate() {
                let mut row = vec![name.to_string()];
                for &i in &order {
                    row.push(render_cell(rng, values[k][i], k == 0 && i == 0));
                }
                rows.push(row);
                let item_values = shared_values(&values[k], &present[0]);
                expected.push((name.to_string(), periods.clone(), item_values));
            }
            let first = order.iter().position(|i| *i == 0).unwrap_or(0);
            mark_cell = Some((0, 1 + first));
        }
    }
    // An item with no value is not built (and says so): drop it from what is expected.
    expected.retain(|(_, _, v)| v.iter().any(Option::is_some));
    if !header {
        header_cells.clear();
    }
    let r = Render {
        delimiter,
        quote_all,
        crlf: rng.one_in(3),
        bom: rng.one_in(8),
        title: (!one_column && rng.one_in(6)).then(|| {
            let pad = delimiter.to_string().repeat(rng.below(3));
            format!("Sales export{pad}")
        }),
        trailing_blank: rng.one_in(4),
        pad: rng.one_in(6),
        trailing_delimiter: rng.one_in(8),
    };
    let (text, _) = render(&header_cells, &rows, &r);
    let layout_read = match (layout, expected.len()) {
        (Layout::Long, _) => Layout::Long,
        (Layout::Across, _) => Layout::Across,
        (_, 1) => Layout::Single,
        _ => Layout::Wide,
    };
    let delimiter_read = match delimiter {
        ',' => Delimiter::Comma,
        ';' => Delimiter::Semicolon,
        '\t' => Delimiter::Tab,
        _ => Delimiter::Pipe,
    };
    Case {
        text,
        header: header_cells,
        rows,
        period_column,
        value_columns,
        layout: layout_read,
        delimiter: delimiter_read,
        mark: fractions.then_some(if comma_mark {
            DecimalMark::Comma
        } else {
            DecimalMark::Dot
        }),
        frequency,
        items: expected,
        render: r,
        mark_cell,
    }
}

fn read_back(case: &Case) -> Result<(), String> {
    let r = read(&case.text);
    let fail = |what: String| Err(format!("{what}\ntext:\n{:?}", case.text));
    if !r.errors.is_empty() {
        return fail(format!("errors {:#?}", r.errors));
    }
    if (r.layout, r.delimiter, r.frequency) != (case.layout, case.delimiter, case.frequency) {
        return fail(format!(
            "read {:?} {:?} {:?}, wrote {:?} {:?} {:?}",
            r.layout, r.delimiter, r.frequency, case.layout, case.delimiter, case.frequency
        ));
    }
    if case.mark.is_some_and(|m| m != r.decimal) {
        return fail(format!("decimal mark {:?}", r.decimal));
    }
    let got: Vec<(String, Vec<Period>, Vec<Option<f64>>)> = r
        .items
        .iter()
        .map(|i| (i.name.clone(), i.periods.clone(), i.values.clone()))
        .collect();
    if got != case.items {
        return fail(format!(
            "items read {got:?}\nwritten {:?}\nwarnings {:?}",
            case.items, r.warnings
        ));
    }
    Ok(())
}

/// Files each of the two generated-file tests reads.
const ROUND_TRIPS: usize = 3_000;
const BAD_CELLS: usize = 3_000;

#[test]
fn generated_files_read_back_exactly() {
    let mut rng = Rng(0x5151_5eed_0000_0001);
    let mut failures = Vec::new();
    let mut across = 0;
    for _ in 0..ROUND_TRIPS {
        let case = generate(&mut rng);
        check_promises(&case.text, &read(&case.text));
        across += usize::from(case.layout == Layout::Across);
        if let Err(e) = read_back(&case) {
            failures.push(e);
        }
    }
    // Every layout is written: a fifth or so of the files have their periods across.
    assert!(across > ROUND_TRIPS / 8, "{across} of {ROUND_TRIPS} across");
    assert!(
        failures.is_empty(),
        "{} of {ROUND_TRIPS} failed; the first:\n{}",
        failures.len(),
        failures[0]
    );
}

// ---------------------------------------------------------------------------------------------
// One bad cell anywhere.

const BAD_VALUES: &[&str] = &[
    "12x",
    "abc",
    "1.2.3",
    "inf",
    "NaN",
    "1e999",
    "12 apples",
    "--3",
    "?",
    "#VALUE!",
    "99999999999999999999",
    "12-",
];
const BAD_PERIODS: &[&str] = &[
    "someday",
    "??",
    "2024-13-45",
    "13/13/2024",
    "Q5 2024",
    "W60 2024",
    "9999",
];

#[test]
fn a_bad_cell_anywhere_is_reported_at_its_cell() {
    let mut rng = Rng(0xbad0_ce11_0000_0001);
    let mut failures = Vec::new();
    let mut tried = 0;
    while tried < BAD_CELLS {
        let mut case = generate(&mut rng);
        // In a one-column text a word above the numbers is the header, so keep the header.
        if case.rows.len() < 3 || (case.header.is_empty() && case.value_columns == [0]) {
            continue;
        }
        tried += 1;
        let row = match rng.below(3) {
            0 => 0,
            1 => case.rows.len() - 1,
            _ => rng.below(case.rows.len()),
        };
        let in_period = case.period_column.is_some() && rng.one_in(3);
        let (column, bad) = match case.period_column.filter(|_| in_period) {
            Some(p) => (p, rng.pick(BAD_PERIODS)),
            None => (rng.pick(&case.value_columns), rng.pick(BAD_VALUES)),
        };
        // The one cell that shows the decimal mark stays (without it the mark is a guess).
        if !in_period && case.mark_cell == Some((row, column)) {
            continue;
        }
        case.rows[row][column] = bad.to_string();
        // Without a header, a first row whose one filled cell is unreadable is a title line
        // (table.rs says why); it is reported as such, so it is left out here.
        let filled = case.rows[row].iter().filter(|c| !c.is_empty()).count();
        if case.header.is_empty() && row == 0 && filled == 1 {
            continue;
        }
        let (text, lines) = render(&case.header, &case.rows, &case.render);
        let name = match case.header.get(column) {
            Some(h) if !h.is_empty() => h.clone(),
            _ => format!("column {}", column + 1),
        };
        let expected = (lines[row], name.as_str(), bad);
        let r = read(&text);
        check_promises(&text, &r);
        let found: Vec<(usize, &str, &str)> = r
            .errors
            .iter()
            .map(|e| (e.row, e.column.as_str(), e.text.as_str()))
            .collect();
        // The bad cell is the only error, in a value column or a period column alike.
        if found != [expected] {
            failures.push(format!(
                "expected {expected:?}, found {found:?} in\n{text:?}"
            ));
        }
    }
    assert!(
        failures.is_empty(),
        "{} of {BAD_CELLS} failed:\n{}",
        failures.len(),
        failures.join("\n")
    );
}

// ---------------------------------------------------------------------------------------------
// Every input that once failed, with what it must give: (input, errors as (row, column, text),
// items as (name, values)).

type Expected<'a> = (
    &'a [(usize, &'a str, &'a str)],
    &'a [(&'a str, &'a [Option<f64>])],
);

fn check(input: &str, expected: Expected<'_>) {
    let r = read(input);
    check_promises(input, &r);
    let errors: Vec<(usize, &str, &str)> = r
        .errors
        .iter()
        .map(|e| (e.row, e.column.as_str(), e.text.as_str()))
        .collect();
    assert_eq!(errors, expected.0, "errors of {input:?}");
    let items: Vec<(&str, &[Option<f64>])> = r
        .items
        .iter()
        .map(|i| (i.name.as_str(), i.values.as_slice()))
        .collect();
    assert_eq!(items, expected.1, "items of {input:?}");
}

#[test]
fn regressions_keep_their_reports() {
    let v = |values: &[f64]| values.iter().map(|v| Some(*v)).collect::<Vec<_>>();
    // A bad cell in a headerless file's first row, with "no value" beside it: read as a title.
    check(
        "??;null\n2024-01;1,5\n2024-02;2\n2024-03;3\n",
        (
            &[(1, "column 1", "??")],
            &[("Series 1", &v(&[1.5, 2.0, 3.0]))],
        ),
    );
    // The same under a header: the row and the header were read as titles, and the row as the
    // header.
    check(
        "date,sales\n??,n/a\n2024-01-31,5\n2024-02-29,6\n2024-03-31,7\n",
        (&[(2, "date", "??")], &[("sales", &v(&[5.0, 6.0, 7.0]))]),
    );
    // A long table's first row with a bad period looked like a header: its item name stands
    // again below, so it is a data row.
    check(
        "date,item,units\nsomeday,Twine,n/a\n2024-01-01,Twine,5\n2024-01-02,Twine,6\n",
        (&[(2, "date", "someday")], &[("Twine", &v(&[5.0, 6.0]))]),
    );
    check(
        "Pine box|W60 2024|\nPine box|2024-W01|5\nPine box|2024-W02|6\n",
        (
            &[(1, "column 2", "W60 2024")],
            &[("Pine box", &v(&[5.0, 6.0]))],
        ),
    );
    // Two columns of item and quantity, no header: half of each row is a number, which was
    // not enough for a data row, so a later row with "NA" became the header.
    check(
        "Oak tray|1.5\nPine box|2\nOak tray|3\nPine box|NA\nOak tray|4\n",
        (
            &[],
            &[
                ("Oak tray", &v(&[1.5, 3.0, 4.0])),
                ("Pine box", &[Some(2.0), None]),
            ],
        ),
    );
    // One word in a column of gaps made the column item names (a long table of "12-", "n/a"
    // and "#N/A" items): a column mostly without values holds quantities.
    check(
        "month,a,b\n2024-01,1,12-\n2024-02,2,n/a\n2024-03,3,#N/A\n",
        (&[(2, "b", "12-")], &[("a", &v(&[1.0, 2.0, 3.0]))]),
    );
    // ... and in a long table "n/a" was an item of its own: it names none.
    check(
        "item,month,qty\nOak,2024-01,5\nn/a,2024-01,3\nOak,2024-02,6\n",
        (&[(3, "item", "n/a")], &[("Oak", &v(&[5.0, 6.0]))]),
    );
    // A one-column export with a delimiter at the end of every line lost its header to a
    // title line.
    check(
        "sales,\n5,\n,\n7,\n",
        (&[], &[("sales", &[Some(5.0), None, Some(7.0)])]),
    );
    // ... but a row whose last cell is empty still counts that column: the title above was
    // taken for the header of a one-column text.
    check(
        "Sales export\n04/2009\t890.8\n06/2009\t\n",
        (&[], &[("Series 1", &[Some(890.8), None, None])]),
    );
    // Rows of "n/a" quantities were not data-like, so the data was not found within six rows
    // and the title line became a data row: "n/a" stands where a quantity would.
    check(
        "Sales export|\n1996 Feb|Oak|#VALUE!\n1996 Mar|Pine|#N/A\n1996 Jan|Oak|NA\n\
         1996 Jan|Pine|null\n1995 Nov|Oak|null\n1996 Feb|Pine|8\n",
        (
            &[(2, "column 3", "#VALUE!")],
            &[("Pine", &[None, Some(8.0), None])],
        ),
    );
    // Lines ended by a lone CR count as lines in decoding errors too.
    let r = read_bytes(b"month,sales\r2024-01,5\r2024-02,\xFF6\r2024-03,7\r");
    let rows: Vec<usize> = r.errors.iter().map(|e| e.row).collect();
    assert_eq!(rows, [3, 3], "{:?}", r.errors);
}

// ---------------------------------------------------------------------------------------------
// Whole files built from the committed reference series.

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
// the columns named only as periods (year, period, time) are calendar details, left out with
// a warning each; "value" is the series as published.
#[test]
fn air_passengers_file_as_committed() {
    let report = read(&fixture_text("AirPassengers.csv"));
    assert!(report.errors.is_empty(), "{:?}", report.errors);
    assert_eq!(report.layout, Layout::Single);
    assert_eq!(report.items.len(), 1);
    for column in ["year", "period", "time"] {
        assert!(
            report
                .warnings
                .iter()
                .any(|w| w.contains(&format!("\"{column}\" holds calendar details"))),
            "{column}: {:?}",
            report.warnings
        );
    }
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
