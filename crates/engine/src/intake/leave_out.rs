//! Leaving a period out of a text at the user's request (the page's "Leave 2025-12 out"): the
//! text minus the rows that hold it, every other character as it was, so links and work files
//! carry the result as any text.
//!
//! Kept apart from: deciding which period looks unfinished (`unfinished`) and reading (the
//! result is read again like any text). The one promise: what is left reads as it did (the
//! same delimiter, decimal mark, layout, frequency and kind of period, the same items), or
//! nothing is left out and the error says why: rows can be the only ones showing the date
//! order or the decimal mark, and leaving them out would read the rest otherwise, unsaid.

use crate::sorting;
use std::fmt;

use super::{read, text, Delimiter, IntakeReport};

/// Why a period was not left out.
#[derive(Clone, Debug, PartialEq)]
pub enum LeaveOutError {
    /// Without its rows the rest would be read differently: what would change.
    ReadsDifferently {
        /// The period, as labels write it.
        period: String,
        /// Each change, "decimal mark dot to comma", "items without figures: Oak tray".
        changes: Vec<String>,
    },
}

impl fmt::Display for LeaveOutError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            LeaveOutError::ReadsDifferently { period, changes } => write!(
                f,
                "{period} was not left out: without its rows the rest of the table would be \
                 read differently ({}), since they decided part of the reading. Take them out \
                 of the file yourself and check Intake's reading.",
                changes.join("; ")
            ),
        }
    }
}

/// `text` without the records that start on the 1-based lines `rows` (each record with all
/// its lines, a quoted cell's line breaks included), every other character as it was. Lines
/// are those [`read`] reports.
pub fn leave_out_rows(text: &str, rows: &[usize]) -> String {
    let body = text::strip_bom(text);
    let delimiter = text::sniff_delimiter(body).unwrap_or(Delimiter::Comma);
    let records = text::tokenize(body, text::delimiter_char(delimiter)).records;
    let last_line = records.last().map_or(0, |r| r.line);
    let mut dropped = vec![false; last_line + 1];
    // At least the text's lines (a CRLF counts twice here): the last record's end.
    let lines_of_text = body.split(['\n', '\r']).count() + 1;
    let mut wanted = rows.to_vec();
    sorting::sort(&mut wanted);
    for (i, record) in records.iter().enumerate() {
        if wanted.binary_search(&record.line).is_ok() {
            let end = records.get(i + 1).map_or(lines_of_text, |next| next.line);
            dropped.resize(dropped.len().max(end + 1), false);
            dropped[record.line..end].fill(true);
        }
    }
    text::without_lines(text, &dropped)
}

/// The kind of period a report read, without its example ("day-first dates (31/01/2024)"
/// gives "day-first dates"): the example is the first row's, which may be the one left out.
fn period_kind(report: &IntakeReport) -> &str {
    let format = report.date_format.as_deref().unwrap_or("none");
    format.split(" (e.g.").next().unwrap_or(format)
}

/// `text` without the rows of the period `report` found unfinished ([`leave_out_rows`]),
/// with its reading (made to check it, so a caller need not read it again), when what is left
/// reads as the text did (module doc). `None` when there is nothing to leave out row by row.
pub fn leave_out_unfinished(
    text: &str,
    report: &IntakeReport,
) -> Option<Result<(String, IntakeReport), LeaveOutError>> {
    let unfinished = report.unfinished_last.as_ref()?;
    if unfinished.rows.is_empty() {
        return None;
    }
    let without = leave_out_rows(text, &unfinished.rows);
    let again = read(&without);
    let mut changes: Vec<String> = [
        (
            "delimiter",
            report.delimiter.as_str(),
            again.delimiter.as_str(),
        ),
        (
            "decimal mark",
            report.decimal.as_str(),
            again.decimal.as_str(),
        ),
        ("layout", report.layout.as_str(), again.layout.as_str()),
        (
            "frequency",
            report.frequency.as_str(),
            again.frequency.as_str(),
        ),
        ("periods", period_kind(report), period_kind(&again)),
    ]
    .into_iter()
    .filter(|(_, before, after)| before != after)
    .map(|(what, before, after)| format!("{what} {before} to {after}"))
    .collect();
    let lost: Vec<&str> = report
        .items
        .iter()
        .map(|i| i.name.as_str())
        .filter(|name| !again.items.iter().any(|i| i.name == *name))
        .collect();
    if !lost.is_empty() {
        changes.push(format!("items without figures: {}", lost.join(", ")));
    }
    if again.errors.len() > report.errors.len() {
        changes.push("rows that read now would be refused".to_string());
    }
    Some(if changes.is_empty() {
        Ok((without, again))
    } else {
        Err(LeaveOutError::ReadsDifferently {
            period: unfinished.period.to_string(),
            changes,
        })
    })
}
