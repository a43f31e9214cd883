//! Text to records: byte-order mark, line ends, quoted fields, and the choice of delimiter.
//!
//! Kept apart from: what the cells mean (numbers, periods, layout). This module only splits text
//! into records of raw cells and remembers the line each record starts on, so that every later
//! error can point at a line of the user's file.
//!
//! The tokeniser is a small hand-written state machine rather than the `csv` crate because the
//! report needs exact 1-based line numbers and the blank lines themselves (a blank line inside a
//! one-column paste is an empty cell), and the crate skips blank lines and reports record
//! positions from before the skipped lines.
//!
//! Quoting follows RFC 4180: a field whose first non-space character is `"` is quoted; `""`
//! inside it is one quote mark; delimiters and line breaks inside it are text. A quote that closes
//! before other characters keeps them as text (spreadsheets write such fields when a cell holds
//! stray quotes). A quote that is never closed is reported and read as a plain character.

use super::Delimiter;

/// One record of raw cells and where it starts.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Record {
    /// 1-based line number of the record's first character.
    pub line: usize,
    /// The cells, trimmed of surrounding white space (spaces, tabs, no-break spaces).
    pub cells: Vec<String>,
}

impl Record {
    /// True when every cell is empty (an empty line, or a spreadsheet row of bare delimiters).
    pub fn is_blank(&self) -> bool {
        self.cells.iter().all(|c| c.is_empty())
    }
    /// Number of non-empty cells.
    pub fn filled(&self) -> usize {
        self.cells.iter().filter(|c| !c.is_empty()).count()
    }
}

/// The records of a text and the lines where a quote mark was opened and never closed.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct Tokens {
    pub records: Vec<Record>,
    pub unclosed_quotes: Vec<usize>,
}

/// Removes a leading UTF-8 byte-order mark (U+FEFF), which some spreadsheet exports write.
pub(crate) fn strip_bom(text: &str) -> &str {
    text.strip_prefix('\u{feff}').unwrap_or(text)
}

/// Splits `text` into records on `delimiter`. Blank lines are kept as records with one empty
/// cell, so that callers can decide what they mean.
pub(crate) fn tokenize(text: &str, delimiter: char) -> Tokens {
    let chars: Vec<char> = text.chars().collect();
    let mut literal_quotes: Vec<usize> = Vec::new();
    let mut unclosed_quotes = Vec::new();
    loop {
        match tokenize_once(&chars, delimiter, &literal_quotes) {
            Ok(records) => {
                return Tokens {
                    records,
                    unclosed_quotes,
                }
            }
            Err((index, line)) => {
                // Read that quote mark as text and start again; each retry retires one quote,
                // so this ends.
                literal_quotes.push(index);
                unclosed_quotes.push(line);
            }
        }
    }
}

/// One pass of the state machine. `Err((char index, line))` names an opening quote that is
/// never closed.
fn tokenize_once(
    chars: &[char],
    delimiter: char,
    literal_quotes: &[usize],
) -> Result<Vec<Record>, (usize, usize)> {
    let mut records = Vec::new();
    let mut cells: Vec<String> = Vec::new();
    let mut cell = String::new();
    let mut line = 1usize;
    let mut record_line = 1usize;
    let mut i = 0usize;
    let mut quote_open: Option<(usize, usize)> = None;
    let mut at_cell_start = true;
    while i < chars.len() {
        let c = chars[i];
        if quote_open.is_some() {
            if c == '"' {
                if chars.get(i + 1) == Some(&'"') {
                    cell.push('"');
                    i += 2;
                    continue;
                }
                quote_open = None;
            } else {
                if c == '\n' || (c == '\r' && chars.get(i + 1) != Some(&'\n')) {
                    line += 1;
                }
                cell.push(c);
            }
            i += 1;
            continue;
        }
        if c == '"' && at_cell_start && cell.trim().is_empty() && !literal_quotes.contains(&i) {
            cell.clear();
            quote_open = Some((i, line));
            at_cell_start = false;
            i += 1;
            continue;
        }
        if c == delimiter {
            cells.push(clean(&cell));
            cell.clear();
            at_cell_start = true;
        } else if c == '\n' || c == '\r' {
            if c == '\r' && chars.get(i + 1) == Some(&'\n') {
                i += 1;
            }
            cells.push(clean(&cell));
            cell.clear();
            records.push(Record {
                line: record_line,
                cells: std::mem::take(&mut cells),
            });
            line += 1;
            record_line = line;
            at_cell_start = true;
        } else {
            cell.push(c);
            if !c.is_whitespace() {
                at_cell_start = false;
            }
        }
        i += 1;
    }
    if let Some((index, open_line)) = quote_open {
        return Err((index, open_line));
    }
    if !cell.is_empty() || !cells.is_empty() {
        cells.push(clean(&cell));
        records.push(Record {
            line: record_line,
            cells,
        });
    }
    Ok(records)
}

/// Trims white space (including U+00A0 and U+202F, which `char::is_whitespace` covers) and
/// stray byte-order marks.
fn clean(cell: &str) -> String {
    cell.trim_matches(|c: char| c.is_whitespace() || c == '\u{feff}')
        .to_string()
}

/// Delimiters in the order preferred when two explain the text equally well: a tab or semicolon
/// file can hold commas inside numbers (decimal commas), the reverse is rare.
const CANDIDATES: [(Delimiter, char); 4] = [
    (Delimiter::Tab, '\t'),
    (Delimiter::Semicolon, ';'),
    (Delimiter::Pipe, '|'),
    (Delimiter::Comma, ','),
];

/// The character of a delimiter.
pub(crate) fn delimiter_char(delimiter: Delimiter) -> char {
    match delimiter {
        Delimiter::Comma => ',',
        Delimiter::Semicolon => ';',
        Delimiter::Tab => '\t',
        Delimiter::Pipe => '|',
    }
}

/// Chooses the delimiter that splits the most non-blank records into the same number (two or
/// more) of cells; ties go to the earlier of tab, semicolon, pipe, comma. When no candidate
/// gives two cells anywhere the text is one column and the answer is `None`.
pub(crate) fn sniff_delimiter(text: &str) -> Option<Delimiter> {
    let mut best: Option<(usize, Delimiter)> = None;
    for (delimiter, ch) in CANDIDATES {
        if !text.contains(ch) {
            continue;
        }
        let tokens = tokenize(text, ch);
        let widths: Vec<usize> = tokens
            .records
            .iter()
            .filter(|r| !r.is_blank())
            .map(|r| r.cells.len())
            .collect();
        let (mode, count) = mode_of(&widths);
        if mode < 2 {
            continue;
        }
        if best.is_none_or(|(best_count, _)| count > best_count) {
            best = Some((count, delimiter));
        }
    }
    best.map(|(_, d)| d)
}

/// The most common value and how often it occurs; ties go to the larger value. `(0, 0)` when
/// empty.
pub(crate) fn mode_of(values: &[usize]) -> (usize, usize) {
    let mut sorted = values.to_vec();
    sorted.sort_unstable();
    let mut best = (0usize, 0usize);
    let mut i = 0;
    while i < sorted.len() {
        let mut j = i;
        while j < sorted.len() && sorted[j] == sorted[i] {
            j += 1;
        }
        if j - i >= best.1 {
            best = (sorted[i], j - i);
        }
        i = j;
    }
    best
}

#[cfg(test)]
mod tests {
    use super::*;

    fn cells(text: &str, d: char) -> Vec<(usize, Vec<String>)> {
        tokenize(text, d)
            .records
            .into_iter()
            .map(|r| (r.line, r.cells))
            .collect()
    }

    #[test]
    fn crlf_and_blank_lines_keep_line_numbers() {
        let got = cells("a,b\r\n\r\n1,2\r\n", ',');
        assert_eq!(got.len(), 3);
        assert_eq!(got[0], (1, vec!["a".to_string(), "b".to_string()]));
        assert_eq!(got[1], (2, vec![String::new()]));
        assert_eq!(got[2], (3, vec!["1".to_string(), "2".to_string()]));
    }

    #[test]
    fn quoted_fields_hold_delimiters_quotes_and_line_breaks() {
        let got = cells("\"1,234\",\"say \"\"hi\"\"\"\n\"two\nlines\",x\nz,y", ',');
        assert_eq!(got[0].1, vec!["1,234", "say \"hi\""]);
        assert_eq!(got[1], (2, vec!["two\nlines".to_string(), "x".to_string()]));
        assert_eq!(got[2].0, 4);
    }

    #[test]
    fn unclosed_quote_is_reported_and_read_as_text() {
        let tokens = tokenize("a,b\n\"1,2\n3,4\n", ',');
        assert_eq!(tokens.unclosed_quotes, vec![2]);
        assert_eq!(tokens.records[1].cells, vec!["\"1", "2"]);
        assert_eq!(tokens.records[2].line, 3);
    }

    #[test]
    fn sniffing_prefers_semicolon_over_decimal_commas() {
        assert_eq!(
            sniff_delimiter("1,5;2,5\n3,5;4,5\n"),
            Some(Delimiter::Semicolon)
        );
        assert_eq!(sniff_delimiter("a\tb\n1\t2,5\n"), Some(Delimiter::Tab));
        assert_eq!(sniff_delimiter("a|b\n1|2\n"), Some(Delimiter::Pipe));
        assert_eq!(
            sniff_delimiter("Report\nm,v\n1,2\n3,4\n"),
            Some(Delimiter::Comma)
        );
        assert_eq!(sniff_delimiter("12\n13\n"), None);
    }
}
