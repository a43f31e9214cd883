//! Any bytes into Intake: no panic, no hang (libFuzzer's -timeout bounds each input), and the
//! report's promises: every error points at a line of the text, every value read is finite
//! and within the series bound, item names are unique, every item's periods run regularly.

#![no_main]

use libfuzzer_sys::fuzz_target;
use morrowcast_engine::intake::read_bytes;
use morrowcast_engine::series::MAX_ABS_VALUE;

fuzz_target!(|data: &[u8]| {
    let report = read_bytes(data);
    let lines = data.iter().filter(|b| **b == b'\n').count() + 1;
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
