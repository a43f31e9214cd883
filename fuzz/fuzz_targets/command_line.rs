//! Any arguments and standard input through the command line: no panic, no hang, an exit code
//! of 0, 1 or 2, and with --json on read input, JSON on standard output.
//!
//! Input layout: up to the first 0x00 byte, the arguments separated by 0x1F (lossy UTF-8, as
//! the program's main refuses other arguments before the library sees them); the rest is
//! standard input. The reading commands get "-" (standard input) as their file; arguments with
//! a "/" are dropped, so no path such as /dev/zero is ever read.

#![no_main]

use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let (head, stdin) = match data.iter().position(|b| *b == 0) {
        Some(i) => (&data[..i], &data[i + 1..]),
        None => (data, &[][..]),
    };
    let mut args: Vec<String> = String::from_utf8_lossy(head)
        .split('\u{1f}')
        .filter(|a| !a.is_empty() && !a.contains('/'))
        .map(str::to_string)
        .collect();
    // Keep the command a reading one and its FILE standard input.
    match args.first().map(String::as_str) {
        Some("inspect") | Some("forecast") | Some("stock") => args.insert(1, "-".into()),
        _ => args.insert(0, "forecast".into()),
    }
    if args.first().map(String::as_str) == Some("forecast") && args.get(1).map(String::as_str) != Some("-") {
        args.insert(1, "-".into());
    }
    let json = args.iter().any(|a| a == "--json");
    let (mut out, mut err) = (Vec::new(), Vec::new());
    let code = morrowcast_cli::run(&args, &mut &stdin[..], &mut out, &mut err);
    assert!(code <= 2, "exit {code}");
    if json && !out.is_empty() {
        let text = std::str::from_utf8(&out).expect("UTF-8 output");
        assert!(text.trim_start().starts_with('{'), "{text}");
    }
});
