//! Any bytes into Intake: no panic, no hang (libFuzzer's -timeout bounds each input), and the
//! report's promises: every error points at a line of the text, every value read is finite
//! and within the series bound, item names are unique, every item's periods run regularly;
//! leaving an unfinished last period out only takes text away.

#![no_main]

use libfuzzer_sys::fuzz_target;
use morrowcast_engine::intake::{leave_out_unfinished, read_bytes};
use morrowcast_engine::series::MAX_ABS_VALUE;

/// The text's lines as Intake counts them: LF, CRLF and a lone CR each end one; UTF-16 with
/// its byte-order mark is decoded first.
fn line_count(data: &[u8]) -> usize {
    let text: String = match data {
        [0xFF, 0xFE, rest @ ..] | [0xFE, 0xFF, rest @ ..] => {
            let little = data[0] == 0xFF;
            let units = rest.chunks(2).map(|p| match p {
                [a, b] if little => u16::from_le_bytes([*a, *b]),
                [a, b] => u16::from_be_bytes([*a, *b]),
                _ => 0xFFFD,
            });
            char::decode_utf16(units).map(|c| c.unwrap_or('\u{fffd}')).collect()
        }
        _ => String::from_utf8_lossy(data).into_owned(),
    };
    let mut lines = 1;
    let mut chars = text.chars().peekable();
    while let Some(c) = chars.next() {
        if c == '\n' || (c == '\r' && chars.peek() != Some(&'\n')) {
            lines += 1;
        }
    }
    lines
}

fuzz_target!(|data: &[u8]| {
    let report = read_bytes(data);
    // Leaving an unfinished last period out never panics and only ever takes text away.
    if let Ok(text) = std::str::from_utf8(data) {
        if let Some(Ok((without, _))) = leave_out_unfinished(text, &report) {
            assert!(without.len() < text.len(), "nothing left out");
        }
    }
    let lines = line_count(data);
    for e in &report.errors {
        assert!(e.row >= 1 && e.row <= lines, "row {} of {lines}", e.row);
    }
    let mut names = std::collections::HashSet::new();
    for item in &report.items {
        assert!(names.insert(item.name.clone()), "name {:?} twice", item.name);
        assert_eq!(item.periods.len(), item.values.len());
        for v in item.values.iter().flatten() {
            assert!(v.is_finite() && v.abs() <= MAX_ABS_VALUE, "{v}");
        }
        for pair in item.periods.windows(2) {
            assert_eq!(pair[0].offset(1), pair[1], "periods of {:?}", item.name);
        }
    }
});
