//! Bytes to text: the encodings a sales export arrives in, and every byte that is not text.
//!
//! Kept apart from: everything after decoding (the rest of intake takes `&str`). Front ends that
//! hold bytes (a file read from disk, a dropped file) pass them here instead of decoding
//! themselves, so an undecodable byte is reported with its line instead of silently replaced.
//! Text that arrives already decoded may still carry U+FFFD, the mark another program left for
//! bytes it could not read: [`replacement_marks`] reports those lines too.
//!
//! Rules: a UTF-16 byte-order mark (FF FE little-endian, FE FF big-endian; spreadsheets write it
//! for "Unicode text") decodes as UTF-16, and so do bytes whose pairs are nearly all one zero
//! byte beside one that is not (UTF-16 without its mark, [`utf16_without_mark`]); anything
//! else decodes as UTF-8 (a UTF-8 byte-order
//! mark is dropped later by the tokeniser). Bytes that do not decode become U+FFFD, and each
//! line holding any is reported once, with the bytes found, so a front end never plans from a
//! misread file without saying so. Lines are counted as the tokeniser counts them: LF, CRLF and
//! a lone CR each end one.

use super::workbook;
use super::RowError;

/// Most lines with undecodable bytes reported one by one; the rest are counted in one more
/// error (our choice: a wrongly encoded file has them on most lines, and a thousand identical
/// messages help no one).
const MAX_REPORTED_LINES: usize = 20;

/// Decoded text and the lines whose bytes could not be decoded.
#[derive(Default)]
pub(crate) struct Decoded {
    pub text: String,
    pub errors: Vec<RowError>,
    /// What was assumed about the encoding, when anything was (UTF-16 without its mark), or
    /// which sheet of a workbook was read.
    pub assumed: Option<String>,
    /// The workbook's sheet read, for a front end naming its source.
    pub sheet: Option<String>,
    /// The workbook's sheets that may be read, for a front end offering a choice.
    pub sheets: Vec<String>,
    /// Why nothing could be read (a workbook that cannot be opened, or holds nothing); the
    /// text is then empty and this is the only error.
    pub refused: Option<String>,
}

/// The one error of a file refused whole (`Decoded::refused`): at its first row, naming no
/// cell.
pub(crate) fn refusal(why: String) -> RowError {
    RowError {
        row: 1,
        column: String::new(),
        text: String::new(),
        message: why,
    }
}

/// Which sheet of a workbook to read: the one named, else the one whose text `prefer`
/// accepts, else the fullest ([`workbook::choose`]).
pub(crate) struct SheetChoice<'a> {
    pub named: Option<&'a str>,
    pub prefer: &'a dyn Fn(&str) -> bool,
}

impl<'a> SheetChoice<'a> {
    /// The sheet named `sheet`, whatever the workbook would give.
    pub(crate) fn named(sheet: &'a str) -> SheetChoice<'a> {
        SheetChoice {
            named: Some(sheet),
            prefer: &|_| false,
        }
    }
}

/// The fullest sheet.
pub(crate) const FULLEST: SheetChoice<'static> = SheetChoice {
    named: None,
    prefer: &|_| false,
};

/// Decodes `bytes` by the rules of this module's doc; a workbook's fullest sheet.
pub(crate) fn decode(bytes: &[u8]) -> Decoded {
    decode_choosing(bytes, &FULLEST)
}

/// Decodes `bytes`; a workbook (module [`super::workbook`]) gives the sheet `choice` picks,
/// as comma-separated text.
pub(crate) fn decode_choosing(bytes: &[u8], choice: &SheetChoice<'_>) -> Decoded {
    if workbook::is_workbook(bytes) {
        return from_workbook(bytes, choice);
    }
    decode_text(bytes)
}

/// Decodes `bytes` as text, whatever they hold (a workbook's bytes too: the caller has told
/// them apart). Apart from [`decode_choosing`] so that a front end reading workbooks elsewhere
/// (the page, in its reading worker) links none of the workbook reader.
pub(crate) fn decode_text(bytes: &[u8]) -> Decoded {
    match bytes {
        [0xFF, 0xFE, rest @ ..] => decode_utf16(rest, true),
        [0xFE, 0xFF, rest @ ..] => decode_utf16(rest, false),
        _ => match utf16_without_mark(bytes) {
            Some(little_endian) => Decoded {
                assumed: Some(format!(
                    "the file has no byte-order mark but reads as UTF-16 ({}: a zero byte beside \
                     each letter), so it was read as such",
                    if little_endian {
                        "little-endian"
                    } else {
                        "big-endian"
                    }
                )),
                ..decode_utf16(bytes, little_endian)
            },
            None => decode_utf8(bytes),
        },
    }
}

/// The sheet `sheet` of the workbook in `bytes` as text (a front end letting the user name
/// it); refused when that sheet cannot be read, or `bytes` are no workbook.
pub(crate) fn decode_sheet(bytes: &[u8], sheet: &str) -> Decoded {
    if !workbook::is_workbook(bytes) {
        return Decoded {
            refused: Some(format!(
                "the sheet \"{sheet}\" was asked for, but the file is not a workbook (.xlsx, \
                 .xlsm or .ods): read it without naming a sheet"
            )),
            ..Decoded::default()
        };
    }
    from_workbook(bytes, &SheetChoice::named(sheet))
}

/// A workbook's chosen sheet as text, with a note of which; refused when it cannot be
/// opened or no sheet holds anything.
fn from_workbook(bytes: &[u8], choice: &SheetChoice<'_>) -> Decoded {
    let refused = |why: String| Decoded {
        refused: Some(why),
        ..Decoded::default()
    };
    let sheets = match workbook::sheets(bytes) {
        Ok(sheets) => sheets,
        Err(why) => return refused(why),
    };
    let chosen = match choice.named {
        Some(name) => workbook::named(&sheets, name),
        None => workbook::choose(&sheets, choice.prefer),
    };
    match chosen {
        // A workbook never calculated has no figure in any formula cell: nothing to read.
        Ok(sheet) if !sheet.unsaved.is_empty() => refused(workbook::unsaved(sheet)),
        Ok(sheet) => Decoded {
            text: sheet.text.clone(),
            assumed: Some(workbook::note(&sheets, sheet)),
            sheet: Some(sheet.name.clone()),
            sheets: workbook::readable(&sheets)
                .into_iter()
                .map(str::to_string)
                .collect(),
            ..Decoded::default()
        },
        Err(why) => refused(why),
    }
}

/// Whether bytes without a byte-order mark are UTF-16 text, and which byte order: nearly
/// every pair of the first 512 bytes (at least 9 of 10, and two pairs or more) one zero byte
/// and one that is not, the zero on the same side (latin text in UTF-16 is ASCII bytes
/// beside zeros; UTF-8 text holds no zero bytes). `Some(true)` little-endian (the zero
/// second). Our choice of 9 in 10: a few pairs of other scripts may have both bytes set.
fn utf16_without_mark(bytes: &[u8]) -> Option<bool> {
    let pairs: Vec<&[u8]> = bytes[..bytes.len().min(512)].chunks_exact(2).collect();
    let little = pairs.iter().filter(|p| p[1] == 0 && p[0] != 0).count();
    let big = pairs.iter().filter(|p| p[0] == 0 && p[1] != 0).count();
    let most = |count: usize| pairs.len() >= 2 && count * 10 >= pairs.len() * 9;
    match (most(little), most(big)) {
        (true, _) => Some(true),
        (_, true) => Some(false),
        _ => None,
    }
}

/// Line ends seen so far: LF, CRLF and a lone CR each end one line.
struct Lines {
    line: usize,
    after_cr: bool,
}

impl Lines {
    fn new() -> Lines {
        Lines {
            line: 1,
            after_cr: false,
        }
    }
    fn see(&mut self, c: char) {
        if c == '\r' || (c == '\n' && !self.after_cr) {
            self.line += 1;
        }
        self.after_cr = c == '\r';
    }
}

fn decode_utf8(bytes: &[u8]) -> Decoded {
    let mut text = String::with_capacity(bytes.len());
    let mut bad = BadLines::default();
    let mut lines = Lines::new();
    for chunk in bytes.utf8_chunks() {
        let valid = chunk.valid();
        valid.bytes().for_each(|b| lines.see(char::from(b)));
        text.push_str(valid);
        let invalid = chunk.invalid();
        if !invalid.is_empty() {
            text.push(char::REPLACEMENT_CHARACTER);
            lines.see(char::REPLACEMENT_CHARACTER);
            bad.add(lines.line, invalid);
        }
    }
    let errors = report(
        bad.0,
        "UTF-8",
        "save the file as UTF-8 (in a spreadsheet: CSV UTF-8) and read it again",
    );
    Decoded {
        text,
        errors,
        ..Decoded::default()
    }
}

fn decode_utf16(bytes: &[u8], little_endian: bool) -> Decoded {
    let to_unit = |a: u8, b: u8| {
        if little_endian {
            u16::from_le_bytes([a, b])
        } else {
            u16::from_be_bytes([a, b])
        }
    };
    let as_found = |u: u16| {
        if little_endian {
            u.to_le_bytes()
        } else {
            u.to_be_bytes()
        }
    };
    let (pairs, odd) = (bytes.chunks_exact(2), bytes.len() % 2 == 1);
    let mut text = String::with_capacity(bytes.len() / 2);
    let mut bad = BadLines::default();
    let mut lines = Lines::new();
    for c in char::decode_utf16(pairs.map(|p| to_unit(p[0], p[1]))) {
        match c {
            Ok(c) => {
                lines.see(c);
                text.push(c);
            }
            Err(e) => {
                text.push(char::REPLACEMENT_CHARACTER);
                lines.see(char::REPLACEMENT_CHARACTER);
                bad.add(lines.line, &as_found(e.unpaired_surrogate()));
            }
        }
    }
    if odd {
        // An odd final byte: half a character.
        text.push(char::REPLACEMENT_CHARACTER);
        bad.add(lines.line, &bytes[bytes.len() - 1..]);
    }
    let errors = report(
        bad.0,
        "UTF-16 (the file starts with a UTF-16 byte-order mark)",
        "save the file again as UTF-8 (in a spreadsheet: CSV UTF-8) and read it again",
    );
    Decoded {
        text,
        errors,
        ..Decoded::default()
    }
}

/// Undecodable bytes gathered by line, in order.
#[derive(Default)]
struct BadLines(Vec<(usize, Vec<u8>)>);

impl BadLines {
    fn add(&mut self, line: usize, found: &[u8]) {
        match self.0.last_mut() {
            Some((l, f)) if *l == line => f.extend_from_slice(found),
            _ => self.0.push((line, found.to_vec())),
        }
    }
}

/// One error per line with undecodable bytes, the first [`MAX_REPORTED_LINES`] of them.
fn report(bad_lines: Vec<(usize, Vec<u8>)>, encoding: &str, remedy: &str) -> Vec<RowError> {
    let lines = bad_lines
        .into_iter()
        .map(|(line, bytes)| (line, hex(&bytes)));
    let message = format!(
        "expected {encoding} text; these bytes are not, so the line was read with \u{fffd} in \
         their place: {remedy}"
    );
    let more = format!("hold bytes that are not {encoding} text: {remedy}");
    capped(lines, &message, &more)
}

/// One error per line (with the text found there) for the first [`MAX_REPORTED_LINES`] lines,
/// then one error counting the rest ("N more lines after this one " + `more`).
fn capped(
    lines: impl Iterator<Item = (usize, String)>,
    message: &str,
    more: &str,
) -> Vec<RowError> {
    let mut errors = Vec::new();
    let mut rest = 0usize;
    for (row, text) in lines {
        if errors.len() < MAX_REPORTED_LINES {
            errors.push(RowError {
                row,
                column: String::new(),
                text,
                message: message.to_string(),
            });
        } else {
            rest += 1;
        }
    }
    if rest > 0 {
        let last = errors.last().map_or(1, |e| e.row);
        errors.push(RowError {
            row: last,
            column: String::new(),
            text: String::new(),
            message: format!("{rest} more lines after this one {more}"),
        });
    }
    errors
}

/// Every decoding error of `decoded`: its undecodable bytes, by line, and the U+FFFD marks
/// written in the text itself on the other lines (a line with undecodable bytes is reported
/// with those bytes, not again by its mark). The history and the stock table both use it.
pub(crate) fn all_errors(decoded: &Decoded) -> Vec<RowError> {
    let byte_rows: Vec<usize> = decoded.errors.iter().map(|e| e.row).collect();
    let marks = replacement_marks(&decoded.text)
        .into_iter()
        .filter(|e| !byte_rows.contains(&e.row));
    decoded.errors.iter().cloned().chain(marks).collect()
}

/// The lines of `text` that hold U+FFFD, the mark a program leaves where it could not read bytes
/// as text (a browser or editor that decoded a file wrongly, or a paste from one): each such
/// line is an error, so a name or number misread there is never planned without a word.
pub(crate) fn replacement_marks(text: &str) -> Vec<RowError> {
    let mut lines = Lines::new();
    let mut marked: Vec<usize> = Vec::new();
    for c in text.chars() {
        if c == char::REPLACEMENT_CHARACTER && marked.last() != Some(&lines.line) {
            marked.push(lines.line);
        }
        lines.see(c);
    }
    capped(
        marked.into_iter().map(|row| (row, "\u{fffd}".to_string())),
        "this line holds \u{fffd}, the mark left where bytes could not be read as text, so a \
         name or number here may be wrong: open or drop the file itself, or save it as UTF-8 \
         (in a spreadsheet: CSV UTF-8)",
        "hold \u{fffd}, the mark of bytes that could not be read as text",
    )
}

/// Bytes as `\xE9\x80` (at most 16 shown).
fn hex(bytes: &[u8]) -> String {
    let mut s: String = bytes
        .iter()
        .take(16)
        .map(|b| format!("\\x{b:02X}"))
        .collect();
    if bytes.len() > 16 {
        s.push('…');
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    /// (bytes, decoded text, lines reported with the bytes found).
    fn check(bytes: &[u8], text: &str, expected: &[(usize, &str)]) {
        let d = decode(bytes);
        assert_eq!(d.text, text);
        let got: Vec<(usize, &str)> = d.errors.iter().map(|e| (e.row, e.text.as_str())).collect();
        assert_eq!(got, expected);
    }

    #[test]
    fn encodings_and_bad_bytes() {
        check(b"a,b\n1,2\n", "a,b\n1,2\n", &[]);
        // Windows-1252 "Café" on line 2, then two bad bytes on line 3.
        check(
            b"name\nCaf\xE9\nx\xFF\xFEy\n",
            "name\nCaf\u{fffd}\nx\u{fffd}\u{fffd}y\n",
            &[(2, "\\xE9"), (3, "\\xFF\\xFE")],
        );
        // UTF-16 little-endian with its byte-order mark, as "Unicode text" exports are.
        let le: Vec<u8> = [0xFF, 0xFE]
            .into_iter()
            .chain("a\tb\n1\t2\n".encode_utf16().flat_map(u16::to_le_bytes))
            .collect();
        check(&le, "a\tb\n1\t2\n", &[]);
        let be: Vec<u8> = [0xFE, 0xFF]
            .into_iter()
            .chain("é\n".encode_utf16().flat_map(u16::to_be_bytes))
            .collect();
        check(&be, "é\n", &[]);
        // Without the mark, both orders, as some exports write them.
        let bare_le: Vec<u8> = "Month,Qty\n2024-01,10\n"
            .encode_utf16()
            .flat_map(u16::to_le_bytes)
            .collect();
        check(&bare_le, "Month,Qty\n2024-01,10\n", &[]);
        let bare_be: Vec<u8> = "Month,Qty\n"
            .encode_utf16()
            .flat_map(u16::to_be_bytes)
            .collect();
        check(&bare_be, "Month,Qty\n", &[]);
        // A zero byte or two in UTF-8 text is no UTF-16.
        check(b"a,b\n1\x00,2\n", "a,b\n1\x00,2\n", &[]);
        // An unpaired surrogate and an odd final byte.
        check(
            &[0xFF, 0xFE, 0x0A, 0x00, 0x00, 0xD8, 0x41],
            "\n\u{fffd}\u{fffd}",
            &[(2, "\\x00\\xD8\\x41")],
        );
        // Lines ended by CRLF and by a lone CR, counted as the tokeniser counts them.
        check(
            b"a\r\nb\rc\xE9\r\n\xE9",
            "a\r\nb\rc\u{fffd}\r\n\u{fffd}",
            &[(3, "\\xE9"), (4, "\\xE9")],
        );
        let le: Vec<u8> = [0xFF, 0xFE]
            .into_iter()
            .chain("a\rb\r\n".encode_utf16().flat_map(u16::to_le_bytes))
            .chain([0x00, 0xD8])
            .collect();
        check(&le, "a\rb\r\n\u{fffd}", &[(3, "\\x00\\xD8")]);
    }

    // Text decoded elsewhere (a browser's File.text(), an editor, a paste) carries U+FFFD where
    // bytes were lost: each line holding it is reported once, whatever its line ends.
    #[test]
    fn replacement_marks_are_reported_by_line() {
        let rows =
            |text: &str| -> Vec<usize> { replacement_marks(text).iter().map(|e| e.row).collect() };
        assert_eq!(rows("a,b\n1,2\n"), Vec::<usize>::new());
        assert_eq!(
            rows("name\nCaf\u{fffd}\u{fffd}\nok\r\n\u{fffd}\rx\u{fffd}"),
            [2, 4, 5]
        );
        let many: String = (0..25).map(|_| "\u{fffd}\n").collect();
        let errors = replacement_marks(&many);
        assert_eq!(errors.len(), MAX_REPORTED_LINES + 1);
        assert!(errors.last().unwrap().message.starts_with("5 more lines"));
    }

    #[test]
    fn many_bad_lines_are_counted_not_listed() {
        let bytes: Vec<u8> = (0..30).flat_map(|_| b"\xE9\n".to_vec()).collect();
        let d = decode(&bytes);
        assert_eq!(d.errors.len(), MAX_REPORTED_LINES + 1);
        assert!(d
            .errors
            .last()
            .unwrap()
            .message
            .starts_with("10 more lines"));
    }
}
