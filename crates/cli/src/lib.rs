//! The command-line front end: the engine for scripted use.
//!
//! Kept apart from: all computation (that is the engine, crates/engine) and the process itself
//! (src/main.rs only hands over its arguments and streams). [`run`] parses the arguments
//! ([`args`]), reads the input as bytes (the engine decodes and reports them), calls the engine,
//! and prints a table ([`table`]) or the JSON of [`wire`], the only JSON the project writes.
//!
//! Exit codes: 0 success; 2 rejected input or bad arguments; 1 an item could not be planned.
//! With `--json`, standard output holds JSON whenever the input was read at all, also when it
//! was rejected (the intake report with its errors).

pub mod args;
pub mod parallel;
pub mod table;
pub mod wire;

use std::cell::{Cell, RefCell};
use std::io::{Read, Write};

use morrowcast_engine::{demo, intake, plan};

use args::{Command, ForecastArgs};
use wire::{FailedJson, ForecastJson, InspectJson, PlanJson, Streamed};

/// Runs one command line. `argv` excludes the program name. Writes results to `stdout` and
/// messages to `stderr`; returns the exit code.
pub fn run(
    argv: &[String],
    stdin: &mut dyn Read,
    stdout: &mut dyn Write,
    stderr: &mut dyn Write,
) -> u8 {
    let mut console = Console { stdout, stderr };
    let command = match args::parse(argv) {
        Ok(c) => c,
        Err(message) => {
            console.err(&format!("morrowcast: {message}\n\n{}\n", args::usage()));
            return 2;
        }
    };
    match command {
        Command::Help => {
            console.out(&format!("{}\n", args::usage()));
            0
        }
        Command::Demo => {
            console.out(&demo::demo_csv());
            0
        }
        Command::Inspect { file, json } => match read_input(&file, stdin) {
            Ok(bytes) => inspect(&mut console, &intake::read_bytes(&bytes), json),
            Err(message) => console.fail_input(&message),
        },
        Command::Forecast(fa) => match read_input(&fa.file, stdin) {
            Ok(bytes) => forecast(&mut console, &intake::read_bytes(&bytes), &fa),
            Err(message) => console.fail_input(&message),
        },
    }
}

/// Standard output and error. A closed pipe (e.g. `| head`) is not an error: the rest of the
/// output is dropped quietly.
struct Console<'a> {
    stdout: &'a mut dyn Write,
    stderr: &'a mut dyn Write,
}

impl Console<'_> {
    fn out(&mut self, text: &str) {
        let _ = self
            .stdout
            .write_all(text.as_bytes())
            .and_then(|()| self.stdout.flush());
    }

    fn err(&mut self, text: &str) {
        let _ = self.stderr.write_all(text.as_bytes());
    }

    fn fail_input(&mut self, message: &str) -> u8 {
        self.err(&format!("morrowcast: {message}\n"));
        2
    }

    /// Writes `value` as pretty JSON straight to standard output (not through one string: a
    /// large plan list streams).
    fn json<T: serde::Serialize>(&mut self, value: &T) {
        let mut out = std::io::BufWriter::new(&mut *self.stdout);
        let written = serde_json::to_writer_pretty(&mut out, value)
            .map_err(std::io::Error::from)
            .and_then(|()| out.write_all(b"\n"))
            .and_then(|()| out.flush());
        drop(out);
        if let Err(e) = written {
            // A closed pipe (`| head`) is not worth a word; anything else is.
            if e.kind() != std::io::ErrorKind::BrokenPipe {
                self.err(&format!("morrowcast: could not write JSON: {e}\n"));
            }
        }
    }
}

/// Reads a file, or standard input for "-", as bytes (the engine decodes them).
fn read_input(file: &str, stdin: &mut dyn Read) -> Result<Vec<u8>, String> {
    if file == "-" {
        let mut buf = Vec::new();
        stdin
            .read_to_end(&mut buf)
            .map_err(|e| format!("cannot read standard input: {e}"))?;
        Ok(buf)
    } else {
        std::fs::read(file).map_err(|e| format!("cannot read {file}: {e}"))
    }
}

fn inspect(console: &mut Console<'_>, report: &intake::IntakeReport, json: bool) -> u8 {
    if json {
        console.json(&InspectJson::from(report));
    } else {
        console.out(&table::intake_report(report));
    }
    if report.has_errors() {
        2
    } else {
        0
    }
}

fn forecast(console: &mut Console<'_>, report: &intake::IntakeReport, fa: &ForecastArgs) -> u8 {
    if report.has_errors() {
        if fa.json {
            console.json(&InspectJson::from(report));
        } else {
            console.err(&table::intake_report(report));
        }
        return 2;
    }
    let mut items: Vec<&intake::Item> = Vec::new();
    for name in &fa.items {
        match report.items.iter().find(|i| &i.name == name) {
            Some(item) => items.push(item),
            None => {
                let names: Vec<String> = report
                    .items
                    .iter()
                    .map(|i| table::quoted(&i.name))
                    .collect();
                return console.fail_input(&format!(
                    "no item named {}; the file holds: {}",
                    table::quoted(name),
                    names.join(", ")
                ));
            }
        }
    }
    if fa.items.is_empty() {
        items = report.items.iter().collect();
    }
    // Plans are made on every core a batch at a time and written in the file's order
    // ([`parallel::InOrder`]), so a file of thousands of items never holds all its plans, or
    // all their JSON, in memory.
    let planned = Cell::new(0usize);
    let failed: RefCell<Vec<FailedJson>> = RefCell::new(Vec::new());
    let mut pending = parallel::InOrder::new(
        &items,
        parallel::available_threads(),
        |item: &&intake::Item| {
            item.series()
                .map_err(|e| e.to_string())
                .and_then(|s| plan::plan_item(&s, &fa.settings).map_err(|e| e.to_string()))
                .map_err(|message| FailedJson {
                    name: item.name.clone(),
                    message,
                })
        },
    );
    let mut next_plan = || {
        for outcome in pending.by_ref() {
            match outcome {
                Ok(p) => {
                    planned.set(planned.get() + 1);
                    return Some(p);
                }
                Err(failure) => failed.borrow_mut().push(failure),
            }
        }
        None
    };
    if fa.json {
        console.json(&ForecastJson {
            items: Streamed(RefCell::new(|| next_plan().as_ref().map(PlanJson::from))),
            // Written after `items`, so complete by then.
            failed: &failed,
            warnings: report.warnings.clone(),
        });
    } else {
        for w in &report.warnings {
            console.out(&format!("note: {}\n", table::clean(w)));
        }
        while let Some(p) = next_plan() {
            console.out(&table::plan(&p));
        }
        for f in failed.borrow().iter() {
            console.err(&format!(
                "morrowcast: {}: {}\n",
                table::clean(&f.name),
                table::clean(&f.message)
            ));
        }
    }
    if planned.get() == 0 {
        1
    } else {
        0
    }
}
