//! What FILE holds: a sales history, or a work (a work file or a share link, given as the
//! argument itself or held in a file or standard input) with its settings, stock inputs and
//! item changes; and the settings a run uses once the command line's options are laid over a
//! work's own.
//!
//! Kept apart from: what the commands do with it (lib.rs) and the work's format (the work
//! crate reads it). Files are read as bytes; the engine decodes them.

use std::io::Read;

use morrowcast_engine::intake;
use morrowcast_engine::settings::PlanSettings;
use morrowcast_engine::sorting;
use morrowcast_engine::stock::StockSettings;
use morrowcast_work::{SourcedText, Work};

use crate::args::{self, StockArgs};

/// What FILE held: a sales history (its report, its text, the period `--leave-out-unfinished`
/// left out of it and the workbook's sheet it was read from), or a work (a work file or a share link, FILE itself or its content) with
/// its data, settings, stock inputs and item changes.
pub enum Input {
    History(intake::IntakeReport, String, Option<String>, Option<String>),
    Work(Box<Work>, intake::IntakeReport),
}

impl Input {
    pub fn report(&self) -> &intake::IntakeReport {
        match self {
            Input::History(r, ..) | Input::Work(_, r) => r,
        }
    }

    pub fn work(&self) -> Option<&Work> {
        match self {
            Input::Work(w, _) => Some(w),
            Input::History(..) => None,
        }
    }

    /// The plan settings: the command line's, or the work's with the given options on top.
    pub fn settings(
        &self,
        typed: &args::TypedSettings,
        checked: &PlanSettings,
    ) -> Result<PlanSettings, String> {
        match self.work() {
            None => Ok(checked.clone()),
            Some(w) => PlanSettings::from_text(&typed.over(&w.settings)).map_err(|errors| {
                let all: Vec<String> = errors.iter().map(|e| e.to_string()).collect();
                format!(
                    "the settings (the work's, with the options given): {}",
                    all.join("; ")
                )
            }),
        }
    }

    /// The item's own settings, over the file's, when the work changes them.
    pub fn item_settings(&self, name: &str, file: &PlanSettings) -> Option<PlanSettings> {
        self.work()?.changes.get(name)?.plan_settings(file)
    }

    /// The item's stock-table row with the work's change for it applied.
    pub fn item_row(
        &self,
        name: &str,
        table: Option<&intake::StockTable>,
    ) -> Option<intake::StockRow> {
        let row = table.and_then(|t| t.row(name));
        match self.work().and_then(|w| w.changes.get(name)) {
            Some(change) => change.apply(name, row),
            None => row.cloned(),
        }
    }
}

/// Reads FILE: a share link given as the argument itself (when no file has that name), or a
/// file or standard input holding a work file, a share link or a history; with `leave_out`
/// (`--leave-out-unfinished`), [`leave_out_unfinished`] then.
pub fn read_any(
    file: &str,
    sheet: Option<&str>,
    stdin: &mut dyn Read,
    leave_out: bool,
) -> Result<Input, String> {
    let input = match sheet {
        Some(sheet) => read_sheet(file, sheet, stdin)?,
        None => read_whole(file, stdin)?,
    };
    if leave_out {
        leave_out_unfinished(input)
    } else {
        Ok(input)
    }
}

/// The history with the rows of a last period that looks unfinished left out of its text and
/// the text read again, as the page's button does (`intake::leave_out_unfinished`: refused
/// where the rest would read differently); a warning says what was done, or that nothing
/// looked unfinished. For a work, its history's text is the one changed.
fn leave_out_unfinished(input: Input) -> Result<Input, String> {
    let (report, text) = match &input {
        Input::History(report, text, ..) => (report, text.as_str()),
        Input::Work(work, report) => (report, work.history.text.as_str()),
    };
    let Some(found) = &report.unfinished_last else {
        let mut input = input;
        let note = "--leave-out-unfinished: no last period looks unfinished, so nothing was \
                    left out"
            .to_string();
        match &mut input {
            Input::History(report, ..) | Input::Work(_, report) => report.warnings.push(note),
        }
        return Ok(input);
    };
    let period = found.name();
    let rows = found.rows.len();
    let lines = skipped_lines(&found.rows);
    // The intake's evidence, kept for the note: the re-read report no longer has it.
    let evidence = report
        .warnings
        .iter()
        .find_map(|w| w.split_once("looks unfinished: "))
        .map(|(_, rest)| rest.split(". ").next().unwrap_or(rest).to_string());
    let (without, mut report) = match intake::leave_out_unfinished(text, report) {
        Some(Ok(left)) => left,
        Some(Err(refused)) => return Err(format!("--leave-out-unfinished: {refused}")),
        None if report.layout == intake::Layout::Across => {
            return Err(format!(
                "--leave-out-unfinished: {period} looks unfinished, but its figures are a \
                 column (periods across the header) or cells of a year's row (months across), \
                 not rows: take them out of the file"
            ))
        }
        None => {
            return Err(format!(
                "--leave-out-unfinished: {period} looks unfinished, but its rows cannot be told \
                 apart to leave them out: delete them from the file"
            ))
        }
    };
    report.warnings.insert(
        0,
        format!(
            "{period} looked unfinished ({}) and was left out as asked \
             (--leave-out-unfinished): its {rows} row(s) were skipped ({lines} of the file); row \
             and line numbers in this report count the lines left",
            evidence
                .as_deref()
                .unwrap_or("far below the periods before it")
        ),
    );
    Ok(match input {
        Input::History(.., sheet) => Input::History(report, without, Some(period), sheet),
        Input::Work(mut work, _) => {
            work.history.text = without;
            work.history.source = SourcedText::named_without(&work.history.source, &period);
            Input::Work(work, report)
        }
    })
}

/// The sheet `sheet` of the workbook FILE (`--sheet`), as its history.
fn read_sheet(file: &str, sheet: &str, stdin: &mut dyn Read) -> Result<Input, String> {
    history(&read_input(file, stdin)?, Some(sheet))
}

/// `bytes` read as a history: the workbook's sheet `sheet` names (`--sheet`; refused when it
/// cannot be read), else what Intake chooses (a workbook whose sheet to read is unclear: its
/// refusal in the report, with the sheets that can be read and how to name one).
fn history(bytes: &[u8], sheet: Option<&str>) -> Result<Input, String> {
    let (mut report, read) = intake::read_bytes_and_text(bytes, sheet);
    let (text, sheet_read) = match (read, sheet) {
        (Ok(file), _) => (file.text, file.sheet),
        (Err(why), Some(sheet)) => {
            return Err(format!("--sheet {}: {why}", crate::table::quoted(sheet)))
        }
        (Err(_), None) => {
            let sheets = intake::workbook_sheets(bytes);
            if sheets.len() >= 2 {
                let names: Vec<String> = sheets.iter().map(|s| crate::table::quoted(s)).collect();
                report.warnings.push(format!(
                    "the workbook's sheets that can be read: {}; --sheet NAME reads one",
                    names.join(", ")
                ));
            }
            (String::new(), None)
        }
    };
    Ok(Input::History(report, text, None, sheet_read))
}

/// FILE read as it is (see [`read_any`]).
fn read_whole(file: &str, stdin: &mut dyn Read) -> Result<Input, String> {
    let text = if file != "-" && !std::path::Path::new(file).exists() && Work::is_work(file) {
        file.to_string()
    } else {
        let bytes = read_input(file, stdin)?;
        // A workbook is never a work: its sheet is decoded once, with the report.
        let text = if intake::is_workbook(&bytes) {
            String::new()
        } else {
            intake::decode_bytes(&bytes)
        };
        if !Work::is_work(&text) {
            return history(&bytes, None);
        }
        text
    };
    let work = Work::read(&text).map_err(|e| e.to_string())?;
    let report = intake::read(&work.history.text);
    Ok(Input::Work(Box::new(work), report))
}

/// A stock table as read, with its text (for a work).
pub type Table = (intake::StockTable, SourcedText);

/// FILE, the stock table and the settings of `stock` (and of `link`, `work`): a work's own
/// stock table and settings unless the command line gives them.
pub fn stock_inputs(
    sa: &StockArgs,
    stdin: &mut dyn Read,
) -> Result<(Input, Option<Table>, PlanSettings, StockSettings), String> {
    if sa.file == "-" && sa.table.as_deref() == Some("-") {
        return Err(
            "FILE and --stock TABLE cannot both be standard input: name one as a file".into(),
        );
    }
    let input = read_any(&sa.file, sa.sheet.as_deref(), stdin, sa.leave_out)?;
    // The column to read the stock rows by alone: the option's, else, for the work's own
    // table, the work's (a choice made of one table is not carried to another).
    let read_by = match (&sa.read_by, &sa.table) {
        (Some(given), _) => given.clone(),
        (None, Some(_)) => None,
        (None, None) => input.work().and_then(|w| w.stock_read_by.clone()),
    };
    let has_table = sa.table.is_some() || input.work().is_some_and(|w| w.stock_table.is_some());
    if matches!(sa.read_by, Some(Some(_))) && !has_table {
        return Err(
            "--stock-by says how to read a stock table: give --stock TABLE, or a work with one"
                .into(),
        );
    }
    let table = match &sa.table {
        Some(path) => {
            let bytes = read_input(path, stdin)?;
            // A workbook's sheet naming on hand (or the one --stock-sheet names), as the table
            // is read from, so a work or link carries the rows read.
            let (read, file) = intake::read_stock_table_and_text(
                &bytes,
                sa.table_sheet.as_deref(),
                input.report(),
                read_by.as_deref(),
            );
            let file = match (&sa.table_sheet, file) {
                (Some(sheet), Err(why)) => {
                    return Err(format!(
                        "--stock-sheet {}: {why}",
                        crate::table::quoted(sheet)
                    ))
                }
                (_, file) => file.unwrap_or_default(),
            };
            let text = SourcedText {
                text: file.text,
                source: source_of(path, file.sheet.as_deref()),
            };
            Some((read, text))
        }
        None => None,
    };
    let settings = input.settings(&sa.typed, &sa.settings)?;
    let Some(work) = input.work() else {
        return Ok((input, table, settings, sa.stock.clone()));
    };
    let stock_settings = sa.typed_stock.over(&work.stock).check().map_err(|errors| {
        let all: Vec<String> = errors.into_iter().map(|e| e.message).collect();
        format!(
            "the stock settings (the work's, with the options given): {}",
            all.join("; ")
        )
    })?;
    args::check_horizon(&settings, &stock_settings)?;
    let table = table.or_else(|| {
        work.stock_table.as_ref().map(|t| {
            let read = intake::read_stock_table_text(&t.text, input.report(), read_by.as_deref());
            (read, t.clone())
        })
    });
    Ok((input, table, settings, stock_settings))
}

/// A file's name as a work names its source (never the folders it sits in).
pub fn source_name(path: &str) -> String {
    if path == "-" {
        return "standard input".into();
    }
    std::path::Path::new(path)
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_else(|| path.to_string())
}

/// A file's name as a work names its source, with the workbook's sheet read, if any
/// ("sales.xlsx, sheet “2025”", as the page names it).
pub fn source_of(path: &str, sheet: Option<&str>) -> String {
    match sheet {
        Some(sheet) => format!("{}, sheet \u{201c}{sheet}\u{201d}", source_name(path)),
        None => source_name(path),
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

/// The lines of the rows left out, as runs: "line 32", "lines 32 to 40", "lines 32 and 63",
/// "lines 2 to 4, 9, 12 and 3 more" (a long table's rows of one period lie apart).
fn skipped_lines(rows: &[usize]) -> String {
    let mut sorted = rows.to_vec();
    sorting::sort(&mut sorted);
    sorted.dedup();
    let mut runs: Vec<String> = Vec::new();
    let mut i = 0;
    while i < sorted.len() {
        let mut j = i;
        while j + 1 < sorted.len() && sorted[j + 1] == sorted[j] + 1 {
            j += 1;
        }
        runs.push(if i == j {
            sorted[i].to_string()
        } else {
            format!("{} to {}", sorted[i], sorted[j])
        });
        i = j + 1;
    }
    const SHOWN: usize = 8;
    let noun = if sorted.len() == 1 { "line" } else { "lines" };
    let listed = match runs.len() {
        0 => return "no lines".to_string(),
        1 => runs[0].clone(),
        n if n > SHOWN => format!("{} and {} more", runs[..SHOWN].join(", "), n - SHOWN),
        n => format!("{} and {}", runs[..n - 1].join(", "), runs[n - 1]),
    };
    format!("{noun} {listed}")
}

#[cfg(test)]
mod tests {
    use super::skipped_lines;

    #[test]
    fn skipped_lines_are_said_as_runs() {
        for (rows, said) in [
            (&[32][..], "line 32"),
            (&[34, 32, 33], "lines 32 to 34"),
            (&[32, 63], "lines 32 and 63"),
            (&[2, 3, 4, 9, 12], "lines 2 to 4, 9 and 12"),
            (
                &[1, 3, 5, 7, 9, 11, 13, 15, 17, 19],
                "lines 1, 3, 5, 7, 9, 11, 13, 15 and 2 more",
            ),
        ] {
            assert_eq!(skipped_lines(rows), said, "{rows:?}");
        }
    }
}
