//! Workbooks (.xlsx, .xlsm, .ods) to the comma-separated text the rest of Intake reads: one
//! sheet's cells, row for row, so a row number in an error is the sheet's. The cells are
//! opened by the calamine crate (why a crate: the README's dependencies); this module
//! decides which sheet is read and what is said of it, [`cells`] how each cell is written.
//!
//! Kept apart from: reading the table (the text goes through the same rules as a CSV file's,
//! so a workbook is read with the same care) and decoding text files ([`super::decode`]
//! calls this first). Rules:
//! - a cell is read as its value: a formula's last saved result; a sheet with formulas saved
//!   without one (a workbook written by a program that does not calculate) is refused with
//!   the first such cell and what to do: read as empty, a column of them had been left out
//!   and the quantities taken from another column, an on-order column read as nothing on
//!   order;
//! - a cell merged down several rows (an item's name over its months) gives its value to each
//!   of those rows, said (.xlsx; an .ods file's merged cells are not seen);
//! - hidden sheets are not read (a backup or a lookup table the user does not see), nor
//!   sheets that cannot be read; both are named;
//! - the sheet read is the one `choice` prefers (the stock table's: the sheet naming on
//!   hand), else the fullest; where two sheets could be it (two naming on hand; the fullest
//!   and another with the same header, one sheet per year or store) the read is refused,
//!   naming them: which holds the figures is the user's to say.

mod cells;

use std::io::Cursor;

use calamine::{Data, DataRef, Ods, Reader, SheetType, SheetVisible, Xlsx, XlsxFormulaMetadata};

use std::collections::HashMap;

use cells::{cell_text, sheet_text, shown_as, shown_text, Shown};

/// A workbook's file starts with these: a zip archive (.xlsx, .xlsm, .ods) or an OLE compound
/// file (.xls, and an .xlsx protected by a password).
const ZIP: [u8; 4] = [0x50, 0x4B, 0x03, 0x04];
const OLE: [u8; 8] = [0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1];

/// One sheet as text, and what reading it needs saying.
#[derive(Clone, Debug, Default, PartialEq)]
pub(crate) struct Sheet {
    /// The sheet's name as the workbook gives it.
    pub name: String,
    /// Its cells as comma-separated text, a line per row from the sheet's first.
    pub text: String,
    /// How many cells hold something.
    pub filled: usize,
    /// Hidden in the workbook (not read).
    pub hidden: bool,
    /// Its part could not be read (not read).
    pub unreadable: bool,
    /// Formula cells saved without a result: (row, column) counted from 1, and the text
    /// written in their place.
    pub unsaved: Vec<(u32, u32, String)>,
    /// Cells whose line breaks were read as spaces.
    pub broken_lines: usize,
    /// Cells given the value of the cell merged down over them.
    pub merged_down: usize,
}

impl Sheet {
    /// Whether the sheet may be read: visible, readable, with something in it.
    fn readable(&self) -> bool {
        !self.hidden && !self.unreadable && self.filled > 0
    }

    /// Its first line of two or more cells (the header, after any title), to tell sheets of
    /// one layout.
    fn header(&self) -> Option<&str> {
        self.text
            .lines()
            .find(|l| l.split(',').filter(|c| !c.trim().is_empty()).count() >= 2)
    }
}

/// Whether `bytes` look like a workbook or another archive (zip, OLE) rather than text.
pub(crate) fn is_workbook(bytes: &[u8]) -> bool {
    bytes.starts_with(&ZIP) || bytes.starts_with(&OLE)
}

/// Every sheet of the workbook in `bytes`, in the workbook's order; `Err` with what to do
/// when it cannot be read: an older .xls workbook or a password-protected one (its reader
/// failed on damaged files, so it is not offered), a zip holding no workbook, a damaged one,
/// a sheet too large.
pub(crate) fn sheets(bytes: &[u8]) -> Result<Vec<Sheet>, String> {
    if bytes.starts_with(&OLE) {
        return Err(
            "this file is an older binary workbook (.xls), a workbook protected by a password, \
             or another program's document, none of which Morrowcast opens: remove the \
             password, or save the sheet with the sales as .xlsx, .ods or CSV, and read that"
                .to_string(),
        );
    }
    if let Ok(book) = Xlsx::new(Cursor::new(bytes)) {
        return xlsx_sheets(book);
    }
    if let Ok(book) = Ods::new(Cursor::new(bytes)) {
        return ods_sheets(book);
    }
    Err(
        "this file is a zip archive that holds no workbook Morrowcast opens (.xlsx, .xlsm, \
         .ods), or a damaged one: open it in its program and save the sheet with the sales as \
         CSV, or unzip it and read the CSV inside"
            .to_string(),
    )
}

/// An .xlsx workbook's sheets, read cell by cell: only the cells written are kept, so a
/// stray cell far down or across costs nothing until the text is written.
fn xlsx_sheets(mut book: Xlsx<Cursor<&[u8]>>) -> Result<Vec<Sheet>, String> {
    let listed: Vec<(String, bool, bool)> = book
        .sheets_metadata()
        .iter()
        .map(|s| {
            let hidden = s.visible != SheetVisible::Visible;
            (s.name.clone(), hidden, s.typ == SheetType::WorkSheet)
        })
        .collect();
    let mut out = Vec::with_capacity(listed.len());
    for (name, hidden, table) in listed {
        // A chart, dialog or macro sheet holds no cells: an empty sheet, not a damaged one.
        if !table {
            out.push(Sheet {
                name,
                hidden,
                ..Sheet::default()
            });
            continue;
        }
        let shown = xlsx_shown(&mut book, &name);
        let mut cells: Vec<(u32, u32, String)> = Vec::new();
        let mut unsaved = Vec::new();
        let unreadable = match book.worksheet_cells_reader(&name) {
            Ok(mut reader) => loop {
                match reader.next_cell_with_formula_metadata() {
                    Ok(Some(record)) => {
                        let (row, column) = record.pos;
                        let text = match (&record.value, &record.formula) {
                            (DataRef::Empty, Some(formula)) => {
                                let written = match formula {
                                    XlsxFormulaMetadata::Normal { formula }
                                    | XlsxFormulaMetadata::Shared { formula, .. } => {
                                        format!("={formula}")
                                    }
                                    _ => "=(formula)".to_string(),
                                };
                                unsaved.push((row + 1, column + 1, written.clone()));
                                written
                            }
                            (value, _) => {
                                let value = Data::from(value.clone());
                                match shown.get(&(row, column)) {
                                    Some(how) => shown_text(&value, how),
                                    None => cell_text(&value),
                                }
                            }
                        };
                        if !text.is_empty() {
                            cells.push((row, column, text));
                        }
                    }
                    Ok(None) => break false,
                    Err(_) => break true,
                }
            },
            Err(_) => true,
        };
        let merged_down = match book.merge_cells_by_sheet_name(&name) {
            Ok(regions) => fill_merged_down(&mut cells, &regions),
            Err(_) => 0,
        };
        let mut sheet = sheet_of(name, cells)?;
        (sheet.hidden, sheet.unreadable) = (hidden, unreadable);
        (sheet.unsaved, sheet.merged_down) = (unsaved, merged_down);
        out.push(sheet);
    }
    Ok(out)
}

/// The cells of sheet `name` whose display format shows money or a percent ([`shown_as`]),
/// from a light pass over their styles alone.
fn xlsx_shown(book: &mut Xlsx<Cursor<&[u8]>>, name: &str) -> HashMap<(u32, u32), Shown> {
    let mut shown = HashMap::new();
    if let Ok(mut reader) = book.worksheet_cells_reader(name) {
        let styles: Vec<Option<Shown>> = reader
            .styles()
            .iter()
            .map(|s| {
                s.number_format
                    .as_ref()
                    .and_then(|f| shown_as(&f.format_code))
            })
            .collect();
        while let Ok(Some((row, column, style))) = reader.next_style_id() {
            if let Some(Some(how)) = styles.get(style) {
                shown.insert((row, column), how.clone());
            }
        }
    }
    shown
}

/// Gives each region merged down several rows its top cell's value on its other rows, in its
/// first column; returns how many cells were given one.
fn fill_merged_down(
    cells: &mut Vec<(u32, u32, String)>,
    regions: &[calamine::Dimensions],
) -> usize {
    let mut given = 0;
    let down: Vec<&calamine::Dimensions> = regions.iter().filter(|r| r.end.0 > r.start.0).collect();
    let tops: std::collections::HashSet<(u32, u32)> = down.iter().map(|r| r.start).collect();
    let values: std::collections::HashMap<(u32, u32), String> = cells
        .iter()
        .filter(|(r, c, _)| tops.contains(&(*r, *c)))
        .map(|(r, c, text)| ((*r, *c), text.clone()))
        .collect();
    for region in down {
        let Some(top) = values.get(&region.start) else {
            continue;
        };
        for row in region.start.0 + 1..=region.end.0 {
            cells.push((row, region.start.1, top.clone()));
            given += 1;
        }
    }
    given
}

/// An OpenDocument workbook's sheets (all shown: the reader does not say which are hidden).
fn ods_sheets(mut book: Ods<Cursor<&[u8]>>) -> Result<Vec<Sheet>, String> {
    let listed: Vec<(String, bool)> = book
        .sheets_metadata()
        .iter()
        .map(|s| (s.name.clone(), s.visible != SheetVisible::Visible))
        .collect();
    let mut out = Vec::with_capacity(listed.len());
    for (name, hidden) in listed {
        let (range, unreadable) = match book.worksheet_range(&name) {
            Ok(range) => (range, false),
            Err(_) => (Default::default(), true),
        };
        let (top, left) = range.start().unwrap_or((0, 0));
        let mut cells: Vec<(u32, u32, String)> = range
            .used_cells()
            .map(|(row, column, cell)| (row as u32 + top, column as u32 + left, cell_text(cell)))
            .filter(|(.., text)| !text.is_empty())
            .collect();
        // Formulas whose cells hold no value: saved without their results.
        let mut unsaved = Vec::new();
        if let Ok(formulas) = book.worksheet_formula(&name) {
            let (top, left) = formulas.start().unwrap_or((0, 0));
            let valued: std::collections::HashSet<(u32, u32)> =
                cells.iter().map(|(r, c, _)| (*r, *c)).collect();
            for (row, column, formula) in formulas.used_cells() {
                let at = (row as u32 + top, column as u32 + left);
                if !formula.is_empty() && !valued.contains(&at) {
                    let written = format!("={}", formula.trim_start_matches("of:="));
                    unsaved.push((at.0 + 1, at.1 + 1, written.clone()));
                    cells.push((at.0, at.1, written));
                }
            }
        }
        let mut sheet = sheet_of(name, cells)?;
        (sheet.hidden, sheet.unreadable, sheet.unsaved) = (hidden, unreadable, unsaved);
        out.push(sheet);
    }
    Ok(out)
}

fn sheet_of(name: String, cells: Vec<(u32, u32, String)>) -> Result<Sheet, String> {
    let filled = cells.len();
    let (text, broken_lines) = sheet_text(&name, cells)?;
    Ok(Sheet {
        name,
        text,
        filled,
        broken_lines,
        ..Sheet::default()
    })
}

/// Which sheet to read: the first readable one `prefer` accepts, the only such, else the
/// fullest readable one, alone in its layout; `Err` with the sheets that could be it, or
/// when none holds anything.
pub(crate) fn choose(sheets: &[Sheet], prefer: impl Fn(&str) -> bool) -> Result<&Sheet, String> {
    // A damaged part may be the very sheet to read: nothing is read in its place.
    if let Some(broken) = sheets.iter().find(|s| s.unreadable && !s.hidden) {
        return Err(format!(
            "the workbook's sheet \"{}\" could not be read (the file is damaged or written in \
             a way Morrowcast does not read): open it in its program and save it again, or save \
             the sheet with the sales as CSV",
            broken.name
        ));
    }
    let readable = || sheets.iter().filter(|s| s.readable());
    let named = |list: &[&Sheet]| {
        let names: Vec<String> = list.iter().map(|s| format!("\"{}\"", s.name)).collect();
        super::build::listing(&names)
    };
    let preferred: Vec<&Sheet> = readable().filter(|s| prefer(&s.text)).collect();
    match preferred.as_slice() {
        [one] => return Ok(one),
        [] => {}
        several => {
            return Err(format!(
                "the workbook has {} sheets naming on hand ({}): which to read is not clear; \
                 save the one to read as CSV and read that",
                several.len(),
                named(several)
            ))
        }
    }
    let fullest = readable().rev().max_by_key(|s| s.filled).ok_or_else(|| {
        "the workbook's sheets hold no cells that can be read (hidden sheets are not \
             read): save the sheet with the sales as CSV, or paste its rows"
            .to_string()
    })?;
    let alike: Vec<&Sheet> = readable()
        .filter(|s| s.header().is_some() && s.header() == fullest.header())
        .collect();
    if alike.len() > 1 {
        return Err(format!(
            "the workbook has {} sheets with the same header ({}), one per year or store \
             perhaps: which holds the history is not clear; copy their rows under one \
             another into one sheet (or save the one to read as CSV) and read that",
            alike.len(),
            named(&alike)
        ));
    }
    Ok(fullest)
}

/// The sheet `name`, when it may be read (visible, readable, holding cells); `Err` saying
/// which may.
pub(crate) fn named<'s>(sheets: &'s [Sheet], name: &str) -> Result<&'s Sheet, String> {
    sheets
        .iter()
        .find(|s| s.name == name && s.readable())
        .ok_or_else(|| {
            let names: Vec<String> = readable(sheets)
                .iter()
                .map(|s| format!("\"{s}\""))
                .collect();
            format!(
                "the workbook has no sheet \"{name}\" that can be read; those that can: {}",
                super::build::listing(&names)
            )
        })
}

/// The names of the sheets that may be read, in the workbook's order.
pub(crate) fn readable(sheets: &[Sheet]) -> Vec<&str> {
    sheets
        .iter()
        .filter(|s| s.readable())
        .map(|s| s.name.as_str())
        .collect()
}

/// What the report says of a sheet read: which, how its cells were taken, and which other
/// sheets hold something, are hidden or could not be read.
pub(crate) fn note(sheets: &[Sheet], read: &Sheet) -> String {
    let names = |keep: &dyn Fn(&Sheet) -> bool| -> Vec<String> {
        sheets
            .iter()
            .filter(|s| s.name != read.name && keep(s))
            .map(|s| format!("\"{}\"", s.name))
            .collect()
    };
    let mut note = format!(
        "read the sheet \"{}\" of the workbook, its cells as values (a formula's last result, \
         dates as 2024-03-01, numbers in full, with a currency or percent sign where their \
         format shows one)",
        read.name
    );
    if read.merged_down > 0 {
        note.push_str(&format!(
            "; {} given the value of the cell merged down over them",
            super::build::count(read.merged_down, "cell")
        ));
    }
    if read.broken_lines > 0 {
        note.push_str(&format!(
            "; line breaks inside {} read as spaces",
            super::build::count(read.broken_lines, "cell")
        ));
    }
    for (what, list) in [
        ("not read", names(&|s| s.readable())),
        ("hidden, not read", names(&|s| s.hidden && s.filled > 0)),
        ("could not be read", names(&|s| s.unreadable)),
    ] {
        if !list.is_empty() {
            note.push_str(&format!("; {what}: {}", list.join(", ")));
        }
    }
    note
}

/// Why a sheet whose formula cells were saved without results is not read, naming the
/// first of them.
pub(crate) fn unsaved(read: &Sheet) -> String {
    let Some((row, column, text)) = read.unsaved.first() else {
        return String::new();
    };
    format!(
        "{} of the sheet \"{}\" (the first in cell {}{row}, \"{text}\") {} no saved result: \
         the workbook was written by a program that does not calculate; open it in its \
         spreadsheet program, save it, and read it again",
        super::build::count(read.unsaved.len(), "formula cell"),
        read.name,
        column_letters(*column),
        super::build::agreeing(read.unsaved.len(), "has", "have")
    )
}

/// A column's letters as a workbook names it, from 1: 1 is A, 27 is AA.
fn column_letters(mut column: u32) -> String {
    let mut letters = Vec::new();
    while column > 0 {
        let rest = (column - 1) % 26;
        letters.push(char::from(b'A' + rest as u8));
        column = (column - 1) / 26;
    }
    letters.iter().rev().collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn columns_are_named_by_letters() {
        for (column, letters) in [(1, "A"), (3, "C"), (26, "Z"), (27, "AA"), (16_384, "XFD")] {
            assert_eq!(column_letters(column), letters);
        }
    }

    fn sheet(name: &str, text: &str, filled: usize) -> Sheet {
        Sheet {
            name: name.into(),
            text: text.into(),
            filled,
            ..Sheet::default()
        }
    }

    #[test]
    fn the_fullest_readable_sheet_is_read_unless_one_is_preferred_or_two_could_be() {
        let name = |s: Result<&Sheet, String>| s.map(|s| s.name.clone());
        let sheets = vec![
            sheet("Notes", "a\n", 3),
            sheet("Sales", "Month,Item,Qty\n", 400),
            sheet("Stock", "Item,On hand\n", 40),
        ];
        assert_eq!(name(choose(&sheets, |_| false)), Ok("Sales".into()));
        assert_eq!(
            name(choose(&sheets, |t| t.starts_with("Item"))),
            Ok("Stock".into())
        );
        let refused = choose(&sheets, |t| t.contains(',')).expect_err("two");
        assert!(
            refused.contains("2 sheets naming on hand (\"Sales\", \"Stock\")"),
            "{refused}"
        );
        // One sheet per year: refused; a hidden backup of the same layout is not read.
        let mut years = vec![
            sheet("2024", "Month,Item,Qty\n", 400),
            sheet("2025", "Month,Item,Qty\n", 200),
        ];
        let refused = choose(&years, |_| false).expect_err("alike");
        assert!(refused.contains("(\"2024\", \"2025\")"), "{refused}");
        years[0].hidden = true;
        assert_eq!(name(choose(&years, |_| false)), Ok("2025".into()));
        assert!(note(&years, &years[1]).contains("hidden, not read: \"2024\""));
        assert!(choose(&[sheet("Empty", "", 0)], |_| true).is_err());
        assert!(note(&sheets, &sheets[1]).contains("; not read: \"Notes\", \"Stock\""));
    }

    #[test]
    fn a_cell_merged_down_gives_its_value_to_its_rows() {
        let mut cells = vec![(1, 0, "Twine".to_string()), (1, 1, "4".to_string())];
        let regions = [
            calamine::Dimensions::new((1, 0), (3, 0)),
            calamine::Dimensions::new((0, 0), (0, 2)),
        ];
        assert_eq!(fill_merged_down(&mut cells, &regions), 2);
        assert_eq!(
            sheet_text("S", cells).map(|t| t.0),
            Ok("\nTwine,4\nTwine\nTwine\n".to_string())
        );
    }
}
