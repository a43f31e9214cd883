//! The `morrowcast` program: hands its arguments, standard input and output to
//! [`morrowcast_cli::run`] and exits with the code it returns.
//!
//! Kept apart from: everything else (the library in this crate parses, reads and prints).

use std::io::Write;
use std::process::ExitCode;

fn main() -> ExitCode {
    let mut argv = Vec::new();
    for (i, arg) in std::env::args_os().skip(1).enumerate() {
        match arg.into_string() {
            Ok(a) => argv.push(a),
            Err(raw) => {
                // Never alter an argument silently (a file or item name would change).
                let _ = writeln!(
                    std::io::stderr(),
                    "morrowcast: argument {} ({}) is not UTF-8 text: give names and paths as UTF-8",
                    i + 1,
                    raw.to_string_lossy()
                );
                return ExitCode::from(2);
            }
        }
    }
    let code = morrowcast_cli::run(
        &argv,
        &mut std::io::stdin().lock(),
        &mut std::io::stdout().lock(),
        &mut std::io::stderr().lock(),
    );
    ExitCode::from(code)
}
