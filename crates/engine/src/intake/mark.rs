//! The decimal mark of a whole file, decided from what every value cell allows.
//!
//! Kept apart from: reading one cell (that is [`super::number`]). A file has one decimal mark;
//! this module gathers the evidence and makes the choice, with a warning when it had to choose.

use super::number::parse_number;
use super::{DecimalMark, Delimiter};
use crate::sorting;

/// What one cell says about the file's decimal mark.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum Evidence {
    /// Reads the same either way (integers, space grouping) or not at all.
    Silent,
    /// Only a dot decimal mark reads it ("12.5", "1,234.5", "1,234,567").
    Dot,
    /// Only a comma decimal mark reads it ("12,5", "1.234,5", "1.234.567").
    Comma,
    /// Reads both ways with different values, with a lone "." before three digits ("1.234").
    AmbiguousDot,
    /// Reads both ways with different values, with a lone "," before three digits ("1,234").
    AmbiguousComma,
}

/// Classifies a cell by which decimal marks read it.
pub(crate) fn evidence(cell: &str) -> Evidence {
    let dot = parse_number(cell, DecimalMark::Dot);
    let comma = parse_number(cell, DecimalMark::Comma);
    match (dot, comma) {
        (Ok(_), Err(_)) => Evidence::Dot,
        (Err(_), Ok(_)) => Evidence::Comma,
        (Ok(d), Ok(c)) if d.value != c.value => {
            if cell.contains(',') {
                Evidence::AmbiguousComma
            } else {
                Evidence::AmbiguousDot
            }
        }
        _ => Evidence::Silent,
    }
}

/// Tallies of [`Evidence`] over a file's value cells.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
pub(crate) struct Tally {
    pub dot: usize,
    pub comma: usize,
    pub ambiguous_dot: usize,
    pub ambiguous_comma: usize,
}

impl Tally {
    pub fn add(&mut self, evidence: Evidence) {
        match evidence {
            Evidence::Silent => {}
            Evidence::Dot => self.dot += 1,
            Evidence::Comma => self.comma += 1,
            Evidence::AmbiguousDot => self.ambiguous_dot += 1,
            Evidence::AmbiguousComma => self.ambiguous_comma += 1,
        }
    }
}

/// The file's decimal mark and, when the choice was not forced by the cells, a warning saying
/// why it was made.
///
/// Rule: cells that only one mark reads decide, by majority; when both kinds are present the
/// warning says so and the minority are errors (a tie goes to the fallback below). Otherwise, in
/// a comma-delimited file the mark is a dot: there an unquoted comma is a delimiter, so a decimal
/// comma could only be inside quotes, and a quoted cell that only a comma reads would have
/// decided already; "1.250" is one and a quarter. In other files a lone separator before exactly
/// three digits ("1,234", "1.234") is read as a thousands separator, because whole quantities
/// grouped in thousands are more common in demand data than quantities with exactly three
/// decimals; the warning says so. With no clue at all: comma in semicolon files (the usual
/// pairing in spreadsheets set to a decimal-comma locale), dot otherwise.
pub(crate) fn decide_mark(tally: Tally, delimiter: Delimiter) -> (DecimalMark, Option<String>) {
    let fallback = if delimiter == Delimiter::Semicolon {
        DecimalMark::Comma
    } else {
        DecimalMark::Dot
    };
    if tally.dot > 0 || tally.comma > 0 {
        let mark = match tally.dot.cmp(&tally.comma) {
            std::cmp::Ordering::Greater => DecimalMark::Dot,
            std::cmp::Ordering::Less => DecimalMark::Comma,
            std::cmp::Ordering::Equal => fallback,
        };
        let warning = (tally.dot.min(tally.comma) > 0).then(|| {
            format!(
                "the file mixes decimal marks ({} cells need a dot, {} a comma); read with a \
                 {} decimal mark, and the other cells are reported as errors",
                tally.dot,
                tally.comma,
                mark.as_str()
            )
        });
        return (mark, warning);
    }
    let (mark, separator, count) = match (tally.ambiguous_comma, tally.ambiguous_dot) {
        (0, 0) => return (fallback, None),
        (0, d) if delimiter == Delimiter::Comma => {
            // A comma-delimited file has its decimal commas quoted, so the dot is the decimal
            // mark there; said, since "1.250" reads as 1250 where the dot groups thousands.
            return (
                DecimalMark::Dot,
                Some(format!(
                    "{} such as \"1.250\" could be read either way; in a comma-separated file \
                     the dot was read as the decimal mark (1.250 = 1.25); if it separates \
                     thousands there, write the numbers without it",
                    super::build::count(d, "cell")
                )),
            );
        }
        (c, _) if delimiter == Delimiter::Comma => (DecimalMark::Dot, ',', c),
        (c, 0) => (DecimalMark::Dot, ',', c),
        (0, d) => (DecimalMark::Comma, '.', d),
        (c, d) => {
            let separator = if fallback == DecimalMark::Dot {
                ','
            } else {
                '.'
            };
            (fallback, separator, c + d)
        }
    };
    let warning = format!(
        "{count} cells such as \"1{separator}234\" could be read either way; no cell shows the \
         decimal mark, so \"{separator}\" was read as a thousands separator (1{separator}234 = \
         1234); if it is a decimal mark, write one value with one or two decimals"
    );
    (mark, Some(warning))
}

/// Of one item's value `cells` (a column, or its rows in a long or across table) in a
/// comma-delimited file read with a decimal dot, those like "1.050" (not "0.050") whose dot
/// reading is a hundredth or less of the item's other values, while their thousands reading
/// (1050) is of the same size as those values, among cells that write no other decimals:
/// most likely a thousands dot, a thousand times too small as read. With their index, the
/// value read and the median size of the other values (at least three non-zero whole numbers
/// are needed). Our choice: a hundred times; "the same size", within ten times.
pub(crate) fn thousands_dots(cells: &[&str]) -> Vec<(usize, f64, f64)> {
    let kinds: Vec<Evidence> = cells.iter().map(|c| evidence(c)).collect();
    // A column that writes decimals elsewhere may mean "504.273" as written.
    if !kinds.contains(&Evidence::AmbiguousDot) || kinds.contains(&Evidence::Dot) {
        return Vec::new();
    }
    let mut others: Vec<f64> = cells
        .iter()
        .zip(&kinds)
        .filter(|(_, kind)| **kind == Evidence::Silent)
        .filter_map(|(c, _)| parse_number(c, DecimalMark::Dot).ok())
        .map(|n| n.value.abs())
        .filter(|v| *v > 0.0)
        .collect();
    if others.len() < 3 {
        return Vec::new();
    }
    sorting::sort_by(&mut others, f64::total_cmp);
    let median = others[others.len() / 2];
    cells
        .iter()
        .enumerate()
        // "0.050" is never a thousands group.
        .filter(|(i, c)| {
            kinds[*i] == Evidence::AmbiguousDot && c.chars().find(char::is_ascii_digit) != Some('0')
        })
        .filter_map(|(i, c)| Some((i, parse_number(c, DecimalMark::Dot).ok()?.value)))
        .filter(|(_, v)| {
            let size = v.abs();
            size * 100.0 <= median
                && size * 1000.0 >= median / 10.0
                && size * 1000.0 <= median * 10.0
        })
        .map(|(i, v)| (i, v, median))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;
    use DecimalMark::{Comma, Dot};

    #[test]
    fn evidence_and_the_decided_mark() {
        assert_eq!(evidence("12.5"), Evidence::Dot);
        assert_eq!(evidence("12,5"), Evidence::Comma);
        assert_eq!(evidence("1,234"), Evidence::AmbiguousComma);
        assert_eq!(evidence("1.234"), Evidence::AmbiguousDot);
        assert_eq!(evidence("1 234"), Evidence::Silent);
        assert_eq!(evidence("1.5e3"), Evidence::Dot);
        assert_eq!(evidence("1,5e3"), Evidence::Comma);
        assert_eq!(evidence("1e3"), Evidence::Silent);
    }

    fn tally(dot: usize, comma: usize, ambiguous_dot: usize, ambiguous_comma: usize) -> Tally {
        Tally {
            dot,
            comma,
            ambiguous_dot,
            ambiguous_comma,
        }
    }

    /// (cells' evidence, delimiter, the mark, whether a warning is given).
    fn check(t: Tally, delimiter: Delimiter, mark: DecimalMark, warned: bool) {
        let (got, warning) = decide_mark(t, delimiter);
        assert_eq!(
            (got, warning.is_some()),
            (mark, warned),
            "{t:?} in a {} file: {warning:?}",
            delimiter.as_str()
        );
    }

    #[test]
    fn decided_marks() {
        use Delimiter::{Comma as C, Pipe, Semicolon, Tab};
        check(tally(0, 0, 0, 0), Semicolon, Comma, false);
        check(tally(0, 0, 0, 0), C, Dot, false);
        check(tally(2, 0, 5, 0), Tab, Dot, false);
        check(tally(0, 1, 0, 3), Tab, Comma, false);
        check(tally(3, 1, 0, 0), Pipe, Dot, true);
        check(tally(1, 1, 0, 0), Semicolon, Comma, true);
        check(tally(1, 1, 0, 0), C, Dot, true);
        // A lone three-digit group: thousands, with a warning...
        check(tally(0, 0, 0, 1), Tab, Dot, true);
        check(tally(0, 0, 1, 0), Tab, Comma, true);
        check(tally(0, 0, 2, 2), Semicolon, Comma, true);
        // ...except a dot in a comma-delimited file, where a decimal comma needs quotes: a
        // decimal dot, with a warning that says so.
        check(tally(0, 0, 3, 0), C, Dot, true);
        check(tally(0, 0, 3, 1), C, Dot, true);
        check(tally(0, 0, 0, 1), C, Dot, true);
        // A quoted decimal comma still decides.
        check(tally(0, 1, 3, 0), C, Comma, false);
    }
}
