//! The command-line front end: the engine for scripted use.
//!
//! Kept apart from: all computation (that is the engine, crates/engine) and the process itself
//! (src/main.rs only hands over its arguments and streams). [`run`] parses the arguments
//! ([`args`]), reads FILE (input.rs: a history as bytes, which the engine decodes and
//! reports, or a work file or share link), calls the engine, and prints a table ([`table`]) or
//! the JSON of [`wire`] (the command line's contract); `link` and `work` write a work through
//! the work crate, which owns that format.
//!
//! Exit codes: 0 success; 2 rejected input or bad arguments; 1 an item could not be planned.
//! With `--json`, standard output holds JSON whenever the input was read at all, also when it
//! was rejected (the intake report with its errors).

pub mod args;
mod input;
pub mod parallel;
pub mod table;
pub mod wire;

use std::cell::{Cell, RefCell};
use std::io::{Read, Write};

use morrowcast_engine::lookback::{self, LookBackTally};
use morrowcast_engine::settings::PlanSettings;
use morrowcast_engine::stock::StockSettings;
use morrowcast_engine::{demo, intake, order, plan, series};
use morrowcast_work::{SourcedText, Work, LINK_KEPT_BY_BROWSERS, LINK_KEPT_BY_MAIL};

use input::{read_any, source_of, stock_inputs, Input, Table};

use args::{Command, ForecastArgs, LinkArgs, LookBackArgs, StockArgs, Written};
use wire::{
    AlertJson, FailedJson, ForecastJson, InspectJson, Later, LookBackJson, LookBackTallyJson,
    PlanJson, StockItemJson, StockTableJson, Streamed,
};

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
        Command::Inspect {
            file,
            sheet,
            json,
            leave_out,
        } => match read_any(&file, sheet.as_deref(), stdin, leave_out) {
            Ok(input) => inspect(&mut console, input.report(), json),
            Err(message) => console.fail_input(&message),
        },
        Command::Forecast(fa) => match read_any(&fa.file, fa.sheet.as_deref(), stdin, fa.leave_out)
        {
            Ok(input) => {
                let settings = match input.settings(&fa.typed, &fa.settings) {
                    Ok(s) => s,
                    Err(message) => return console.fail_input(&message),
                };
                forecast(&mut console, &input, &settings, &fa)
            }
            Err(message) => console.fail_input(&message),
        },
        Command::Stock(sa) => match stock_inputs(&sa, stdin) {
            Ok((input, table, settings, stock_settings)) => stock(
                &mut console,
                &input,
                table.as_ref(),
                (&settings, &stock_settings),
                &sa,
            ),
            Err(message) => console.fail_input(&message),
        },
        Command::LookBack(la) => match stock_inputs(&la.stock, stdin) {
            Ok((input, table, settings, stock_settings)) => look_back(
                &mut console,
                &input,
                table.as_ref(),
                (&settings, &stock_settings),
                &la,
            ),
            Err(message) => console.fail_input(&message),
        },
        Command::Link(la) => link(&mut console, &la, stdin),
    }
}

/// `link` and `work`: the work FILE gives, or a history with the options given, written as a
/// share link or a work file. Refused while the history or the stock table has bad cells or
/// a setting does not pass, so a link never carries a desk that shows no figures.
fn link(console: &mut Console<'_>, la: &LinkArgs, stdin: &mut dyn Read) -> u8 {
    let sa = &la.stock;
    let (input, table, _, _) = match stock_inputs(sa, stdin) {
        Ok(found) => found,
        Err(message) => return console.fail_input(&message),
    };
    let report = input.report();
    if report.has_errors() {
        console.err(&table::intake_report(report));
        return 2;
    }
    // What --leave-out-unfinished did, which the link or work file does not say.
    for note in report
        .warnings
        .iter()
        .filter(|w| w.contains(args::LEAVE_OUT))
    {
        console.err(&format!("note: {note}\n"));
    }
    if let Some((t, _)) = table.as_ref().filter(|(t, _)| !t.errors.is_empty()) {
        console.err(&table::stock_table_errors(t));
        return 2;
    }
    let open = sa.items.first().cloned();
    if let Some(name) = &open {
        if !report.items.iter().any(|i| &i.name == name) {
            return console.fail_input(&format!(
                "--item: no item named {} in the file",
                table::quoted(name)
            ));
        }
    }
    let mut work = match input {
        Input::Work(w, _) => *w,
        Input::History(_, text, left_out, sheet) => {
            let source = source_of(&sa.file, sheet.as_deref());
            let source = match left_out {
                Some(period) => SourcedText::named_without(&source, &period),
                None => source,
            };
            Work::of_history(text, source)
        }
    };
    work.settings = sa.typed.over(&work.settings);
    work.stock = sa.typed_stock.over(&work.stock);
    work.stock_read_by = table.as_ref().and_then(|(t, _)| t.read_by.clone());
    work.stock_table = table.map(|(_, t)| t);
    work.open_item = open.or(work.open_item);
    work.look_back = la.look_back.unwrap_or(work.look_back);
    match la.written {
        Written::WorkFile => console.out(&format!("{}\n", work.to_file_text())),
        Written::Link => {
            let link = format!("{}{}", la.page, work.to_fragment());
            console.out(&format!("{link}\n"));
            console.err(
                "note: the link carries the data itself: whoever has the link has the data.\n",
            );
            let length = link.len();
            if length > LINK_KEPT_BY_BROWSERS {
                console.err(&format!(
                    "note: the link is {length} characters long; browsers and chat programs may \
                     cut links this long: hand over a work file instead (morrowcast work)\n"
                ));
            } else if length > LINK_KEPT_BY_MAIL {
                console.err(&format!(
                    "note: the link is {length} characters long; mail programs may cut links \
                     past about {LINK_KEPT_BY_MAIL} characters\n"
                ));
            }
        }
    }
    0
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

fn forecast(
    console: &mut Console<'_>,
    input: &Input,
    settings: &PlanSettings,
    fa: &ForecastArgs,
) -> u8 {
    let run = ItemRun {
        names: &fa.items,
        json: fa.json,
        header: None,
        warnings: Vec::new(),
        closing: None,
        failed_without: "",
    };
    let file_end = input.report().last_period();
    run.go(
        console,
        input.report(),
        |s| {
            let own = input.item_settings(s.name(), settings);
            let mut plan = plan::plan_item(s, own.as_ref().unwrap_or(settings))
                .map_err(|e| Failure::from(e.to_string()))?;
            // Said as the page says it under the item's headline.
            if let Some(why) = order::ends_early(s, file_end) {
                plan.notes.push(format!(
                    "this forecast does not start after the file's end: {why}"
                ));
            }
            Ok(plan)
        },
        |p| PlanJson::from(p),
        table::plan,
    )
}

fn stock(
    console: &mut Console<'_>,
    input: &Input,
    table: Option<&Table>,
    (settings, stock_settings): (&PlanSettings, &StockSettings),
    sa: &StockArgs,
) -> u8 {
    let report = input.report();
    let table = table.map(|(t, _)| t);
    let warnings = match stock_table_warnings(console, table, sa.json) {
        Ok(w) => w,
        Err(code) => return code,
    };
    let file_end = report.last_period();
    let run = ItemRun {
        names: &sa.items,
        json: sa.json,
        header: Some(table::stock_header(
            stock_settings,
            table.is_some(),
            report.frequency,
        )),
        warnings,
        closing: None,
        failed_without: "no stock figures: ",
    };
    run.go(
        console,
        report,
        |s| {
            let row = input.item_row(s.name(), table);
            let own = input.item_settings(s.name(), settings);
            let plan_settings = own.as_ref().unwrap_or(settings);
            order::plan_order(
                s,
                plan_settings,
                stock_settings,
                row.as_ref(),
                table.is_some(),
                file_end,
            )
            .map(|o| (o.plan, o.stock, o.alerts))
            .map_err(Failure::of_order)
        },
        |(plan, stock, alerts)| StockItemJson::new(plan, stock, alerts),
        |(plan, stock, alerts)| table::stock(plan, stock, alerts),
    )
}

/// Why an item could not be worked on, and, where it was planned without stock figures, its
/// alerts (a new item's "New item" stands without figures, as on the page's board).
struct Failure {
    message: String,
    alerts: Vec<morrowcast_engine::alerts::Alert>,
}

impl From<String> for Failure {
    fn from(message: String) -> Failure {
        Failure {
            message,
            alerts: Vec::new(),
        }
    }
}

impl Failure {
    fn of_order(e: order::OrderError) -> Failure {
        let alerts = match &e {
            order::OrderError::NoStockFigures { alerts, .. } => alerts.clone(),
            _ => Vec::new(),
        };
        Failure {
            message: e.to_string(),
            alerts,
        }
    }
}

/// A stock table's errors (written, and the exit code) or its warnings, the rows of items the
/// history does not hold among them (`stock` and `look-back`).
fn stock_table_warnings(
    console: &mut Console<'_>,
    table: Option<&intake::StockTable>,
    json: bool,
) -> Result<Vec<String>, u8> {
    let mut warnings = Vec::new();
    if let Some(table) = table {
        if !table.errors.is_empty() {
            if json {
                console.json(&StockTableJson::from(table));
            } else {
                console.err(&table::stock_table_errors(table));
            }
            return Err(2);
        }
        warnings.extend(table.warnings.iter().cloned());
        if let Some((column, rows)) = &table.could_read_by {
            warnings.push(format!(
                "to read {} by {} alone, give --stock-by {}",
                if *rows == 1 {
                    "that row".to_string()
                } else {
                    format!("those {rows} rows")
                },
                table::quoted(column),
                table::quoted(column)
            ));
        }
    }
    Ok(warnings)
}

/// `look-back`: the plan of N periods ago against what sold since, item by item, then the
/// file's counts.
fn look_back(
    console: &mut Console<'_>,
    input: &Input,
    table: Option<&Table>,
    (settings, stock_settings): (&PlanSettings, &StockSettings),
    la: &LookBackArgs,
) -> u8 {
    let sa = &la.stock;
    let periods = la.periods.unwrap_or(match input {
        Input::Work(w, _) if w.look_back > 0 => w.look_back,
        _ => 1,
    });
    let report = input.report();
    let table = table.map(|(t, _)| t);
    let warnings = match stock_table_warnings(console, table, sa.json) {
        Ok(w) => w,
        Err(code) => return code,
    };
    let tally = RefCell::new(LookBackTally::default());
    let file_end = report.last_period();
    let closing = Closing {
        text: Box::new(|failed| table::look_back_tally(&tally.borrow(), failed)),
        json: Box::new(|| {
            serde_json::to_value(LookBackTallyJson::from(&*tally.borrow()))
                .unwrap_or(serde_json::Value::Null)
        }),
    };
    let run = ItemRun {
        names: &sa.items,
        json: sa.json,
        header: Some(table::look_back_header(periods)),
        warnings,
        closing: Some(closing),
        failed_without: "no Look-back: ",
    };
    run.go(
        console,
        report,
        |s| {
            let row = input.item_row(s.name(), table);
            let own = input.item_settings(s.name(), settings);
            let plan_settings = own.as_ref().unwrap_or(settings);
            lookback::look_back(
                s,
                plan_settings,
                stock_settings,
                row.as_ref(),
                periods,
                file_end,
            )
            .map_err(|e| Failure::from(e.to_string()))
        },
        |l| {
            tally.borrow_mut().add(l);
            LookBackJson::from(l)
        },
        |l| {
            tally.borrow_mut().add(l);
            table::look_back(l)
        },
    )
}

/// What `look-back` writes after its items: text and JSON of one summary.
struct Closing<'a> {
    /// Given how many items failed.
    text: Box<dyn Fn(usize) -> String + 'a>,
    json: Box<dyn Fn() -> serde_json::Value + 'a>,
}

/// What `forecast` and `stock` share: the items asked for, every core working on them, and
/// the output in the file's order as JSON or text.
struct ItemRun<'a> {
    names: &'a [String],
    json: bool,
    /// Printed before the items in text output.
    header: Option<String>,
    /// Said besides the history's own warnings.
    warnings: Vec<String>,
    /// Written after the items.
    closing: Option<Closing<'a>>,
    /// What an item that failed goes without, said before why in text output ("no stock
    /// figures: "); the JSON's `failed` keeps the message alone.
    failed_without: &'static str,
}

impl ItemRun<'_> {
    fn go<R: Send, J: serde::Serialize>(
        &self,
        console: &mut Console<'_>,
        report: &intake::IntakeReport,
        work: impl Fn(&series::Series) -> Result<R, Failure> + Sync,
        to_json: impl Fn(&R) -> J,
        to_text: impl Fn(&R) -> String,
    ) -> u8 {
        if report.has_errors() {
            if self.json {
                console.json(&InspectJson::from(report));
            } else {
                console.err(&table::intake_report(report));
            }
            return 2;
        }
        let mut items: Vec<&intake::Item> = Vec::new();
        for name in self.names {
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
        if self.names.is_empty() {
            items = report.items.iter().collect();
        }
        // Items are worked on every core while this thread writes them in the file's order
        // ([`parallel::in_order`]), so a file of thousands of items never holds all its plans,
        // or all their JSON, in memory.
        let done = Cell::new(0usize);
        let failed: RefCell<Vec<FailedJson>> = RefCell::new(Vec::new());
        let plan_one = |item: &&intake::Item| {
            item.series()
                .map_err(|e| Failure::from(e.to_string()))
                .and_then(|s| work(&s))
                .map_err(|f| FailedJson {
                    name: item.name.clone(),
                    message: f.message,
                    alerts: AlertJson::of(&f.alerts),
                    alerts_said: f
                        .alerts
                        .iter()
                        .map(|a| format!("{} ({})", a.kind.title(), a.reason))
                        .collect(),
                })
        };
        parallel::in_order(&items, parallel::available_threads(), plan_one, |results| {
            let mut next = || {
                for outcome in &mut *results {
                    match outcome {
                        Ok(r) => {
                            done.set(done.get() + 1);
                            return Some(r);
                        }
                        Err(failure) => failed.borrow_mut().push(failure),
                    }
                }
                None
            };
            if self.json {
                console.json(&ForecastJson {
                    items: Streamed(RefCell::new(|| next().as_ref().map(&to_json))),
                    // Written after `items`, so complete by then.
                    failed: &failed,
                    warnings: report
                        .warnings
                        .iter()
                        .chain(&self.warnings)
                        .cloned()
                        .collect(),
                    tally: self
                        .closing
                        .as_ref()
                        .map(|c| Later(Box::new(|| (c.json)()))),
                });
            } else {
                for w in report.warnings.iter().chain(&self.warnings) {
                    console.out(&format!("note: {}\n", table::clean(w)));
                }
                if let Some(header) = &self.header {
                    console.out(header);
                }
                while let Some(r) = next() {
                    console.out(&to_text(&r));
                }
                if let Some(closing) = &self.closing {
                    console.out(&(closing.text)(failed.borrow().len()));
                }
                for f in failed.borrow().iter() {
                    let alerts = if f.alerts_said.is_empty() {
                        String::new()
                    } else {
                        format!("; its alerts: {}", f.alerts_said.join("; "))
                    };
                    console.err(&format!(
                        "morrowcast: {}: {}{}{}\n",
                        table::clean(&f.name),
                        self.failed_without,
                        table::clean(&f.message),
                        table::clean(&alerts)
                    ));
                }
            }
        });
        if done.get() == 0 {
            1
        } else {
            0
        }
    }
}
