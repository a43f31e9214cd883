//! Any text read as a work (a work file, a share link or a fragment): never a panic; a work
//! that reads is written back by Morrowcast to the same work (file and link alike); and any
//! bytes packed as a link's data are either a work or refused, never a panic.

#![no_main]

use libfuzzer_sys::fuzz_target;
use morrowcast_work::Work;

fuzz_target!(|data: &[u8]| {
    let text = String::from_utf8_lossy(data);
    for candidate in [text.to_string(), format!("#w1.{text}")] {
        if let Ok(work) = Work::read(&candidate) {
            assert_eq!(Work::read(&work.to_file_text()).as_ref(), Ok(&work));
            assert_eq!(Work::read(&work.to_fragment()).as_ref(), Ok(&work));
        }
    }
});
