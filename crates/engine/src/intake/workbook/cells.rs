//! A workbook's cells as text: each cell's value written as Intake reads it, and a sheet's
//! cells as comma-separated lines, one per sheet row.
//!
//! Kept apart from: opening the workbook and choosing the sheet (the parent module). Rules:
//! - a number in full (15 significant digits, as a workbook shows at most); of its display
//!   format only a percent or currency sign is kept ("95%", "$40", [`shown_as`]), so a money
//!   or percent column reads as one (an .xlsx file's formats; an .ods file's are not seen);
//! - a date-formatted cell as a date (2024-03-01) and, with a time of day, "2024-03-01
//!   14:30"; a time alone "14:30"; a duration as hours, minutes and seconds ("31:00:00"),
//!   which no quantity column takes;
//! - an error cell (#DIV/0!, #N/A) and TRUE or FALSE as shown, so Intake refuses or reads them
//!   where they stand;
//! - a line break inside a cell as a space (a wrapped name in one cell is one name, and each
//!   sheet row stays one line, so error rows are the sheet's).

use crate::sorting;
use calamine::Data;

/// Most significant digits a workbook keeps and shows (common practice of spreadsheet
/// programs, from memory): 0.1 + 0.2 is written 0.3, not 0.30000000000000004.
const DIGITS: usize = 15;

/// Most characters a sheet's text may take (our choice, far above any sales table): a
/// workbook with cells scattered to its last column on many rows is refused, not written out.
const MAX_TEXT: usize = 64 << 20;

/// One cell as text, by the rules of the module's doc (line breaks still in).
pub(super) fn cell_text(cell: &Data) -> String {
    match cell {
        Data::Empty => String::new(),
        Data::String(s) => s.clone(),
        Data::Int(i) => i.to_string(),
        Data::Float(f) => number_text(*f),
        Data::Bool(b) => if *b { "TRUE" } else { "FALSE" }.to_string(),
        Data::Error(e) => e.to_string(),
        Data::DateTimeIso(s) => s.clone(),
        Data::DurationIso(s) => iso_duration(s).unwrap_or_else(|| s.clone()),
        Data::DateTime(d) if d.is_duration() => clock((d.as_f64() * 86_400.0).round() as i64, true),
        Data::DateTime(d) => {
            let (year, month, day, hour, minute, second, _) = d.to_ymd_hms_milli();
            let time = match (hour, minute, second) {
                (0, 0, 0) => String::new(),
                (h, m, 0) => format!("{h:02}:{m:02}"),
                (h, m, s) => format!("{h:02}:{m:02}:{s:02}"),
            };
            // A time alone is stored as a fraction of the day before the first date.
            if d.as_f64() < 1.0 && !time.is_empty() {
                time
            } else if time.is_empty() {
                format!("{year:04}-{month:02}-{day:02}")
            } else {
                format!("{year:04}-{month:02}-{day:02} {time}")
            }
        }
    }
}

/// `seconds` as "h:mm:ss" (hours beyond a day as they are), or "hh:mm" where `always_seconds`
/// is false and they are whole minutes.
fn clock(seconds: i64, always_seconds: bool) -> String {
    let (sign, seconds) = if seconds < 0 {
        ("-", -seconds)
    } else {
        ("", seconds)
    };
    let (h, m, s) = (seconds / 3600, (seconds / 60) % 60, seconds % 60);
    if s == 0 && !always_seconds {
        format!("{sign}{h:02}:{m:02}")
    } else {
        format!("{sign}{h}:{m:02}:{s:02}")
    }
}

/// An OpenDocument time or duration ("PT09H15M00S", ISO 8601's form): a time of day under a
/// day as "09:15" (as an .xlsx time reads), longer as "h:mm:ss". `None` for another form.
fn iso_duration(text: &str) -> Option<String> {
    let rest = text.strip_prefix("PT")?;
    let mut seconds = 0.0;
    let mut number = String::new();
    for c in rest.chars() {
        match c {
            '0'..='9' | '.' => number.push(c),
            'H' | 'M' | 'S' => {
                let value: f64 = number.parse().ok()?;
                seconds += value
                    * match c {
                        'H' => 3600.0,
                        'M' => 60.0,
                        _ => 1.0,
                    };
                number.clear();
            }
            _ => return None,
        }
    }
    if !number.is_empty() {
        return None;
    }
    let seconds = seconds.round() as i64;
    Some(clock(seconds, seconds >= 86_400))
}

/// How a number cell's display format shows it, where that says what the number is: a
/// percent (0.95 shown as 95%) or an amount of money (shown with a currency sign). Written
/// so ("95%", "$40"), Intake's rules see what the user sees: a money or percent column is
/// no quantity, and a stock table refuses money where it wants units.
#[derive(Clone, Debug, PartialEq, Eq)]
pub(super) enum Shown {
    Percent,
    Money(String),
}

/// What a display format's code (its first section, for positive numbers) shows a number
/// as: a currency sign ($, €, £, ¥, ₹, or a "[$CHF-...]" locale tag) or a percent sign
/// outside quoted text; `None` for any other format.
pub(super) fn shown_as(code: &str) -> Option<Shown> {
    let first = code.split(';').next().unwrap_or("");
    if let Some(at) = first.find("[$") {
        let sign: String = first[at + 2..]
            .chars()
            .take_while(|c| *c != '-' && *c != ']')
            .collect();
        if !sign.is_empty() {
            return Some(Shown::Money(sign));
        }
    }
    if let Some(sign) = ['$', '€', '£', '¥', '₹']
        .into_iter()
        .find(|c| first.contains(*c))
    {
        return Some(Shown::Money(sign.to_string()));
    }
    let mut quoted = false;
    for c in first.chars() {
        match c {
            '"' => quoted = !quoted,
            '%' if !quoted => return Some(Shown::Percent),
            _ => {}
        }
    }
    None
}

/// A number cell as its display format shows it ([`Shown`]); other cells as [`cell_text`].
pub(super) fn shown_text(cell: &Data, shown: &Shown) -> String {
    let value = match cell {
        Data::Float(f) => *f,
        Data::Int(i) => *i as f64,
        other => return cell_text(other),
    };
    match shown {
        Shown::Percent => format!("{}%", number_text(value * 100.0)),
        Shown::Money(sign) if value < 0.0 => format!("-{sign}{}", number_text(-value)),
        Shown::Money(sign) => format!("{sign}{}", number_text(value)),
    }
}

/// A number with at most [`DIGITS`] significant digits, in plain decimals (no exponent), with
/// a dot.
fn number_text(value: f64) -> String {
    if !value.is_finite() {
        return value.to_string();
    }
    let rounded: f64 = format!("{value:.*e}", DIGITS - 1).parse().unwrap_or(value);
    // Display writes the shortest decimals that read back as the number, never an exponent.
    let text = rounded.to_string();
    if text == "-0" {
        "0".to_string()
    } else {
        text
    }
}

/// A cell quoted where it holds a comma or a quote mark.
fn quoted(cell: &str) -> String {
    if cell.contains([',', '"']) {
        format!("\"{}\"", cell.replace('"', "\"\""))
    } else {
        cell.to_string()
    }
}

/// A sheet's text from its filled cells as (row, column, text), counted from 0, and how many
/// cells held a line break: a line per row from the sheet's first, so line numbers are the
/// sheet's rows; each row's cells up to its last filled one (empty columns on the left kept,
/// so the columns stay in place); of two cells at one position, the first given.
pub(super) fn sheet_text(
    name: &str,
    mut cells: Vec<(u32, u32, String)>,
) -> Result<(String, usize), String> {
    sorting::sort_by_key(&mut cells, |&(row, column, _)| (row, column));
    let first_column = cells.iter().map(|c| c.1).min().unwrap_or(0);
    let mut text = String::new();
    let mut broken = 0;
    // The row being written, the next column on it, and whether a cell of it is written.
    let (mut row, mut next, mut started) = (0u32, first_column, false);
    for (r, c, cell) in &cells {
        while row < *r {
            text.push('\n');
            row += 1;
            (next, started) = (first_column, false);
        }
        if started && *c < next {
            continue;
        }
        let commas = if started {
            c - next + 1
        } else {
            c - first_column
        };
        text.extend(std::iter::repeat_n(',', commas as usize));
        if cell.contains(['\n', '\r']) {
            broken += 1;
            let one_line: String = cell
                .split(['\r', '\n'])
                .filter(|p| !p.is_empty())
                .collect::<Vec<_>>()
                .join(" ");
            text.push_str(&quoted(&one_line));
        } else {
            text.push_str(&quoted(cell));
        }
        (next, started) = (c + 1, true);
        if text.len() > MAX_TEXT {
            return Err(format!(
                "the sheet \"{name}\" is too large to read here (more than {} MB as text, cells \
                 out to row {} and column {}): save the rows with the sales as CSV, without \
                 stray cells far below or to the right",
                MAX_TEXT >> 20,
                r + 1,
                c + 1
            ));
        }
    }
    if !cells.is_empty() {
        text.push('\n');
    }
    Ok((text, broken))
}

#[cfg(test)]
mod tests {
    use super::*;
    use calamine::{CellErrorType, ExcelDateTime, ExcelDateTimeType};

    fn check(cell: Data, expected: &str) {
        assert_eq!(cell_text(&cell), expected, "{cell:?}");
    }

    fn date(serial: f64) -> Data {
        Data::DateTime(ExcelDateTime::new(
            serial,
            ExcelDateTimeType::DateTime,
            false,
        ))
    }

    /// Serial dates from the 1900 system: 45352 is 2024-03-01 (day 1 is 1900-01-01, with the
    /// system's 29 February 1900; 60 is that day, 61 is 1 March 1900, from memory).
    #[test]
    fn cells_are_written_as_intake_reads_them() {
        check(Data::Empty, "");
        check(Data::Int(12), "12");
        check(Data::Float(0.1 + 0.2), "0.3");
        check(Data::Float(1234567.0), "1234567");
        check(Data::Float(-0.0), "0");
        check(Data::Float(12.5), "12.5");
        check(Data::Float(1e20), "100000000000000000000");
        check(date(45352.0), "2024-03-01");
        check(date(45352.5), "2024-03-01 12:00");
        check(date(0.604_166_666_666_666_6), "14:30");
        check(date(61.0), "1900-03-01");
        let hours = |days: f64| {
            Data::DateTime(ExcelDateTime::new(
                days,
                ExcelDateTimeType::TimeDelta,
                false,
            ))
        };
        check(hours(1.5), "36:00:00");
        check(hours(0.25), "6:00:00");
        check(Data::DurationIso("PT09H15M00S".into()), "09:15");
        check(Data::DurationIso("PT14H30M05S".into()), "14:30:05");
        check(Data::DurationIso("PT31H00M00S".into()), "31:00:00");
        check(Data::DurationIso("P1DT2H".into()), "P1DT2H");
        check(Data::Error(CellErrorType::Div0), "#DIV/0!");
        check(Data::Bool(true), "TRUE");
        check(Data::String("Seeds, early".into()), "Seeds, early");
        assert_eq!(quoted("Seeds, \"early\""), "\"Seeds, \"\"early\"\"\"");
        assert_eq!(quoted("Seeds"), "Seeds");
    }

    #[test]
    fn money_and_percent_formats_are_written_as_shown() {
        let money = |sign: &str| Some(Shown::Money(sign.to_string()));
        for (code, shown) in [
            ("General", None),
            ("0.00", None),
            ("#,##0", None),
            ("0%", Some(Shown::Percent)),
            ("0.00%", Some(Shown::Percent)),
            ("\"$\"#,##0.00", money("$")),
            ("[$€-407] #,##0.00", money("€")),
            ("#,##0.00 [$CHF]", money("CHF")),
            ("£#,##0;[Red]-£#,##0", money("£")),
            ("0\" %\"", None),
            ("yyyy-mm-dd", None),
        ] {
            assert_eq!(shown_as(code), shown, "{code}");
        }
        assert_eq!(shown_text(&Data::Float(0.955), &Shown::Percent), "95.5%");
        assert_eq!(
            shown_text(&Data::Float(40.0), &Shown::Money("$".into())),
            "$40"
        );
        assert_eq!(shown_text(&Data::Int(-5), &Shown::Money("€".into())), "-€5");
        assert_eq!(
            shown_text(&Data::String("n/a".into()), &Shown::Percent),
            "n/a"
        );
    }

    /// Rows from the sheet's first, each up to its last filled cell, columns in place; a
    /// line break inside a cell is a space, so the next row keeps its line.
    #[test]
    fn a_sheets_cells_become_lines_of_the_sheets_rows() {
        let text = |cells: &[(u32, u32, &str)]| {
            let cells = cells
                .iter()
                .map(|&(r, c, t)| (r, c, t.to_string()))
                .collect();
            sheet_text("S", cells)
        };
        assert_eq!(text(&[]), Ok((String::new(), 0)));
        assert_eq!(
            text(&[
                (2, 1, "Month"),
                (2, 2, "Qty"),
                (3, 1, "2024-01"),
                (3, 3, "x"),
                (5, 2, "4")
            ]),
            Ok(("\n\nMonth,Qty\n2024-01,,x\n\n,4\n".to_string(), 0))
        );
        // Out of order and repeated positions: sorted, the first kept.
        assert_eq!(
            text(&[(0, 1, "b"), (0, 0, "a"), (0, 1, "c")]),
            Ok(("a,b\n".to_string(), 0))
        );
        assert_eq!(
            text(&[(0, 0, "Seed\npackets, red"), (1, 0, "x")]),
            Ok(("\"Seed packets, red\"\nx\n".to_string(), 1))
        );
        let stray: Vec<(u32, u32, String)> = (0..5000)
            .map(|r| (r, 16_383, "x".to_string()))
            .chain([(0, 0, "Month".to_string())])
            .collect();
        let refused = sheet_text("Sales", stray).expect_err("too large");
        assert!(refused.contains("\"Sales\" is too large"), "{refused}");
    }
}
