//! The command-line front end: the engine for scripted use.
//!
//! Kept apart from: all computation (that is the library's engine). This file reads input,
//! calls the engine, and prints a table or the JSON of [`morrowcast::wire`].
//!
//! Exit codes: 0 success; 2 rejected input or bad arguments; 1 an item could not be planned.

mod args;
mod table;

use std::io::Read;
use std::process::ExitCode;

use morrowcast::engine::{demo, intake, plan};
use morrowcast::wire::{FailedJson, ForecastJson, InspectJson, PlanJson};

use args::{Command, ForecastArgs};

fn main() -> ExitCode {
    let argv: Vec<String> = std::env::args().skip(1).collect();
    let command = match args::parse(&argv) {
        Ok(c) => c,
        Err(message) => {
            eprintln!("morrowcast: {message}\n\n{}", args::USAGE);
            return ExitCode::from(2);
        }
    };
    match command {
        Command::Help => {
            out(&format!("{}\n", args::USAGE));
            ExitCode::SUCCESS
        }
        Command::Demo => {
            out(&demo::demo_csv());
            ExitCode::SUCCESS
        }
        Command::Inspect { file, json } => match read_input(&file) {
            Ok(text) => inspect(&text, json),
            Err(message) => fail_input(&message),
        },
        Command::Forecast(fa) => match read_input(&fa.file) {
            Ok(text) => forecast(&text, &fa),
            Err(message) => fail_input(&message),
        },
    }
}

/// Writes to standard output; a closed pipe (e.g. `| head`) ends the program quietly instead of
/// panicking.
fn out(text: &str) {
    use std::io::Write;
    let mut stdout = std::io::stdout().lock();
    if stdout
        .write_all(text.as_bytes())
        .and_then(|()| stdout.flush())
        .is_err()
    {
        std::process::exit(0);
    }
}

fn fail_input(message: &str) -> ExitCode {
    eprintln!("morrowcast: {message}");
    ExitCode::from(2)
}

/// Reads a file, or standard input for "-".
fn read_input(file: &str) -> Result<String, String> {
    let bytes = if file == "-" {
        let mut buf = Vec::new();
        std::io::stdin()
            .read_to_end(&mut buf)
            .map_err(|e| format!("cannot read standard input: {e}"))?;
        buf
    } else {
        std::fs::read(file).map_err(|e| format!("cannot read {file}: {e}"))?
    };
    String::from_utf8(bytes).map_err(|e| {
        format!(
            "{file} is not UTF-8 text (first bad byte at offset {}): save it as UTF-8 or CSV UTF-8",
            e.utf8_error().valid_up_to()
        )
    })
}

fn print_json<T: serde::Serialize>(value: &T) {
    match serde_json::to_string_pretty(value) {
        Ok(s) => out(&format!("{s}\n")),
        Err(e) => eprintln!("morrowcast: could not write JSON: {e}"),
    }
}

fn inspect(text: &str, json: bool) -> ExitCode {
    let report = intake::read(text);
    if json {
        print_json(&InspectJson::from(&report));
    } else {
        out(&table::intake_report(&report));
    }
    if report.has_errors() {
        ExitCode::from(2)
    } else {
        ExitCode::SUCCESS
    }
}

fn forecast(text: &str, fa: &ForecastArgs) -> ExitCode {
    let report = intake::read(text);
    if report.has_errors() {
        if fa.json {
            print_json(&InspectJson::from(&report));
        } else {
            eprint!("{}", table::intake_report(&report));
        }
        return ExitCode::from(2);
    }
    let items: Vec<&intake::Item> = match &fa.item {
        Some(name) => match report.items.iter().find(|i| &i.name == name) {
            Some(item) => vec![item],
            None => {
                let names: Vec<&str> = report.items.iter().map(|i| i.name.as_str()).collect();
                return fail_input(&format!(
                    "no item named \"{name}\"; the file holds: {}",
                    names.join(", ")
                ));
            }
        },
        None => report.items.iter().collect(),
    };
    let mut plans = Vec::new();
    let mut failed = Vec::new();
    for item in items {
        let outcome = item
            .series()
            .map_err(|e| e.to_string())
            .and_then(|s| plan::plan_item(&s, &fa.settings).map_err(|e| e.to_string()));
        match outcome {
            Ok(p) => plans.push(p),
            Err(message) => failed.push(FailedJson {
                name: item.name.clone(),
                message,
            }),
        }
    }
    if fa.json {
        print_json(&ForecastJson {
            items: plans.iter().map(PlanJson::from).collect(),
            failed,
            warnings: report.warnings.clone(),
        });
    } else {
        for w in &report.warnings {
            out(&format!("note: {w}\n"));
        }
        for p in &plans {
            out(&table::plan(p));
        }
        for f in &failed {
            eprintln!("morrowcast: {}: {}", f.name, f.message);
        }
    }
    if plans.is_empty() {
        ExitCode::from(1)
    } else {
        ExitCode::SUCCESS
    }
}
