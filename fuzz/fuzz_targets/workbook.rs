//! Any bytes as a workbook (seeded with the workbook fixtures, so the mutations are mostly
//! damaged .xlsx and .ods files): no panic, no hang, no allocation beyond the fuzzer's bound;
//! the text of a sheet read is Intake's as any text's, and a refusal says what to do.

#![no_main]

use libfuzzer_sys::fuzz_target;
use morrowcast_engine::intake::{history_text, read, read_bytes, stock_table_text};

fuzz_target!(|data: &[u8]| {
    match history_text(data) {
        Ok(file) => {
            // The bytes read as their text reads.
            assert_eq!(read_bytes(data).items, read(&file.text).items);
        }
        Err(why) => assert!(why.contains("save") || why.contains("paste"), "{why}"),
    }
    let _ = stock_table_text(data);
});
