//! What the tests share: where the fixtures are and how to read them, the tolerance rule for
//! reference values, series builders, and the command line run in-process.
//!
//! Kept apart from: the checks themselves (each module of the test binary).

use morrowcast_engine::calendar::Period;
use morrowcast_engine::series::Series;
use serde_json::Value;

/// The outside reference material (tests/fixtures/refs/SOURCES.md names every origin).
pub const REFS: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/refs/");

/// A fixture file of [`REFS`] as text.
pub fn fixture_text(name: &str) -> String {
    std::fs::read_to_string(format!("{REFS}{name}"))
        .unwrap_or_else(|e| panic!("fixture {name}: {e}"))
}

/// A JSON fixture of [`REFS`].
pub fn json(name: &str) -> Value {
    serde_json::from_str(&fixture_text(name)).unwrap_or_else(|e| panic!("fixture {name}: {e}"))
}

/// Column `column` of a fixture CSV of [`REFS`] (plain numbers with a header row; no quoting
/// in these files).
pub fn csv_column(name: &str, column: &str) -> Vec<f64> {
    let text = fixture_text(name);
    let mut lines = text.lines();
    let header: Vec<&str> = lines.next().unwrap().split(',').collect();
    let at = header
        .iter()
        .position(|h| h.trim() == column)
        .unwrap_or_else(|| panic!("fixture {name} has no column {column}"));
    lines
        .filter(|l| !l.trim().is_empty())
        .map(|l| l.split(',').nth(at).unwrap().trim().parse().unwrap())
        .collect()
}

/// The numbers of a JSON array.
pub fn numbers(v: &Value) -> Vec<f64> {
    v.as_array()
        .unwrap()
        .iter()
        .map(|x| x.as_f64().unwrap())
        .collect()
}

/// The tolerance rule of every reference check: |a − b| <= tol · max(1, |b|), absolute for
/// small values and relative for large ones.
pub fn close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol * b.abs().max(1.0)
}

/// [`close`] at every position, with the position named on failure.
pub fn assert_all_close(what: &str, got: &[f64], want: &[f64], tol: f64) {
    assert_eq!(got.len(), want.len(), "{what}: length");
    for (i, (g, w)) in got.iter().zip(want).enumerate() {
        assert!(
            close(*g, *w, tol),
            "{what}[{i}]: got {g}, want {w} (tol {tol})"
        );
    }
}

/// SplitMix64 (Steele, Lea & Flood 2014), for seeded series of our own making.
pub struct SplitMix(pub u64);

impl SplitMix {
    /// Uniform on [0, 1).
    pub fn next_f64(&mut self) -> f64 {
        self.0 = self.0.wrapping_add(0x9E37_79B9_7F4A_7C15);
        let mut z = self.0;
        z = (z ^ (z >> 30)).wrapping_mul(0xBF58_476D_1CE4_E5B9);
        z = (z ^ (z >> 27)).wrapping_mul(0x94D0_49BB_1331_11EB);
        ((z ^ (z >> 31)) >> 11) as f64 / (1u64 << 53) as f64
    }

    /// Standard normal, by the Box-Muller transform (Box & Muller 1958).
    pub fn normal(&mut self) -> f64 {
        let u = 1.0 - self.next_f64();
        let v = self.next_f64();
        (-2.0 * u.ln()).sqrt() * (std::f64::consts::TAU * v).cos()
    }
}

/// How many of a `morrowcast look-back --json` item's periods lay within their band.
pub fn within_count(item: &Value) -> usize {
    item["periods"]
        .as_array()
        .map_or(0, |p| p.iter().filter(|p| p["within"] == true).count())
}

/// A monthly series from January 2021 named "Test item" (gaps as `None`).
pub fn monthly(values: Vec<Option<f64>>) -> Series {
    Series::new("Test item", Period::month(2021, 1), values).unwrap()
}

/// A shop shut on Saturdays and Sundays: `days` daily sales from a Monday, 0 at weekends and
/// 20 to 27 on the other days (invented: the shut-places tests share it).
pub fn shop_shut_at_weekends(days: usize) -> Series {
    let values = (0..days)
        .map(|t| {
            Some(if t % 7 >= 5 {
                0.0
            } else {
                20.0 + ((t * 5) % 8) as f64
            })
        })
        .collect();
    Series::new("Oak tray", Period::day(2024, 3, 4), values).unwrap()
}

/// A stock table written to a file of its own (named `name`, unique per test) for one test;
/// its path.
pub fn table_file(name: &str, text: &str) -> String {
    let path = std::path::Path::new(env!("CARGO_TARGET_TMPDIR")).join(name);
    std::fs::write(&path, text).unwrap();
    path.to_string_lossy().into_owned()
}

/// What one in-process run of the command line gave.
pub struct CliRun {
    pub code: u8,
    pub stdout: Vec<u8>,
    pub stderr: String,
}

/// The item named `name` in the command line's JSON (`{"items": [...]}`), failing with the
/// JSON shown when there is none.
pub fn item_named<'a>(json: &'a Value, name: &str) -> &'a Value {
    json["items"]
        .as_array()
        .and_then(|items| items.iter().find(|i| i["name"] == name))
        .unwrap_or_else(|| panic!("no item {name} in {json}"))
}

impl CliRun {
    /// Standard output as JSON (failing with both streams shown when it is not).
    pub fn json(&self) -> Value {
        serde_json::from_slice(&self.stdout).unwrap_or_else(|e| {
            panic!(
                "not JSON ({e}): {}\nstderr: {}",
                String::from_utf8_lossy(&self.stdout),
                self.stderr
            )
        })
    }

    /// Standard output as text.
    pub fn text(&self) -> String {
        String::from_utf8(self.stdout.clone()).expect("the command line writes UTF-8")
    }
}

/// Runs `morrowcast ARGS` in-process with `stdin` as standard input (the library the program
/// is a thin shell over: crates/cli/src/main.rs).
pub fn cli(args: &[&str], stdin: &[u8]) -> CliRun {
    let argv: Vec<String> = args.iter().map(|a| a.to_string()).collect();
    let (mut stdout, mut stderr) = (Vec::new(), Vec::new());
    let code = morrowcast_cli::run(&argv, &mut &stdin[..], &mut stdout, &mut stderr);
    CliRun {
        code,
        stdout,
        stderr: String::from_utf8_lossy(&stderr).into_owned(),
    }
}

/// A long table of three years of an oak tray and a solar lantern new five months ago
/// (invented figures; the tests of a new item's board row share it).
pub fn with_a_new_item() -> String {
    let mut text = String::from("item,month,units\n");
    for t in 0..36 {
        text.push_str(&format!(
            "Oak tray,{}-{:02},{}\n",
            2022 + t / 12,
            t % 12 + 1,
            20 + t % 5
        ));
    }
    for m in 8..=12 {
        text.push_str(&format!("Solar lantern,2024-{m:02},{}\n", 30 + m));
    }
    text
}

/// A wide monthly table from 2023-01 of `months` rows and two items, `names`: the first sells
/// every month, the second's column is empty after its first `ends_after` months (invented
/// figures; the tests of an item whose data ends before the file's last period share it).
pub fn wide_ending_early(names: (&str, &str), months: usize, ends_after: usize) -> String {
    let mut text = format!("month,{},{}\n", names.0, names.1);
    for t in 0..months {
        let second = if t < ends_after {
            (20 + t % 7).to_string()
        } else {
            String::new()
        };
        text.push_str(&format!(
            "{}-{:02},{},{second}\n",
            2023 + t / 12,
            t % 12 + 1,
            50 + t % 9
        ));
    }
    text
}
