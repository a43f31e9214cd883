//! Workbooks: .xlsx (in the 1900 and 1904 date systems) and .ods files written by other
//! programs' libraries (`scripts/workbook_fixtures.py`: openpyxl 3.1.5, odfpy 1.4.1), each read
//! as the text that script works out from the same values, and through Intake as that text
//! is; an older .xls (xlwt 1.3.0), a zip archive that holds no workbook, and damaged workbooks
//! refused with what to do, never a panic.

use morrowcast_engine::intake::{
    history_text, history_text_of_sheet, is_workbook, read, read_bytes, read_stock_table,
    read_stock_table_text, stock_table_text, text_file, workbook_sheets, FileText,
};

const DIR: &str = concat!(env!("CARGO_MANIFEST_DIR"), "/tests/fixtures/workbooks/");

fn bytes(name: &str) -> Vec<u8> {
    std::fs::read(format!("{DIR}{name}")).expect("fixture")
}

fn text(name: &str) -> String {
    String::from_utf8(bytes(name)).expect("UTF-8 fixture")
}

/// One workbook: the sheet its text comes from, and the text it must read as.
fn check(workbook: &str, sheet: &str, expected: &str) {
    let got: FileText = history_text(&bytes(workbook)).expect("opens");
    assert_eq!(got.sheet.as_deref(), Some(sheet), "{workbook}");
    assert_eq!(got.text, text(expected), "{workbook}");
    // Through Intake, the workbook is read as its text is, with the sheet said.
    let (from_book, from_text) = (read_bytes(&bytes(workbook)), read(&text(expected)));
    assert!(
        from_book.errors.is_empty(),
        "{workbook}: {:#?}",
        from_book.errors
    );
    assert_eq!(from_book.items, from_text.items, "{workbook}");
    assert!(
        from_book
            .warnings
            .iter()
            .any(|w| w.contains(&format!("read the sheet \"{sheet}\""))),
        "{workbook}: {:#?}",
        from_book.warnings
    );
}

#[test]
fn workbooks_are_read_as_their_cells_values() {
    check("sales.xlsx", "Sales", "sales_with_title.csv");
    check("sales_1904.xlsx", "Sales", "sales_with_title.csv");
    check("sales.ods", "Sales", "sales_plain.csv");
    let r = read_bytes(&bytes("sales.xlsx"));
    assert_eq!(r.items.len(), 3);
    assert_eq!(r.items[2].name, "Garden twine, 50 m");
    assert!(r
        .warnings
        .iter()
        .any(|w| w.contains("not read: \"Read me\", \"Stock\"")));
}

/// A stock table from a workbook holding the sales too: the sheet naming on hand.
#[test]
fn a_stock_table_comes_from_the_sheet_naming_on_hand() {
    for workbook in ["sales.xlsx", "sales.ods"] {
        let got = stock_table_text(&bytes(workbook)).expect("opens");
        assert_eq!(got.sheet.as_deref(), Some("Stock"), "{workbook}");
        assert_eq!(got.text, text("stock.csv"), "{workbook}");
        let history = read_bytes(&bytes(workbook));
        let table = read_stock_table(&bytes(workbook), &history);
        assert!(table.errors.is_empty(), "{workbook}: {:#?}", table.errors);
        assert_eq!(table.rows.len(), 3, "{workbook}");
        assert!(table
            .warnings
            .iter()
            .any(|w| w.contains("read the sheet \"Stock\"")));
    }
}

#[test]
fn archives_without_a_workbook_and_damaged_workbooks_are_refused() {
    let why = history_text(&bytes("sales_csv.zip")).expect_err("no workbook");
    assert!(why.contains("unzip it"), "{why}");
    let why = history_text(&bytes("sales.xls")).expect_err("not offered");
    assert!(
        why.contains("save the sheet with the sales as .xlsx, .ods or CSV"),
        "{why}"
    );
    let r = read_bytes(&bytes("sales_csv.zip"));
    assert_eq!(r.errors.len(), 1);
    assert_eq!((r.errors[0].row, r.items.len()), (1, 0));
    // Cut short anywhere, or with a byte changed, a workbook is read or refused, never a
    // panic.
    for name in ["sales.xlsx", "sales.ods"] {
        let whole = bytes(name);
        for cut in (0..whole.len()).step_by(97) {
            let _ = history_text(&whole[..cut]);
            let _ = read_bytes(&whole[..cut]);
        }
        for at in (8..whole.len()).step_by(211) {
            let mut changed = whole.clone();
            changed[at] ^= 0x5A;
            let _ = read_bytes(&changed);
        }
    }
}

/// The shapes a review found misread (2026-12-05), each written by the libraries as a user's
/// program would (`scripts/workbook_fixtures.py`, `review_shapes`).
#[test]
fn formulas_hidden_sheets_year_sheets_merged_cells_times_and_line_breaks() {
    // Formulas saved without results: refused at the first, not read as empty (a column of
    // them had been left out and the quantities taken from another column).
    for (name, cell) in [
        ("formulas.xlsx", "cell E2, \"=C2*D2\""),
        ("formula.ods", "cell D8"),
    ] {
        let why = history_text(&bytes(name)).expect_err("never calculated");
        assert!(
            why.contains(cell) && why.contains("no saved result"),
            "{why}"
        );
    }
    // A hidden backup of more rows is not read; the visible sheet is, and the backup named.
    let r = read_bytes(&bytes("hidden_backup.xlsx"));
    assert_eq!(r.items[0].periods[0].to_string(), "2025-01");
    assert!(r
        .warnings
        .iter()
        .any(|w| w.contains("hidden, not read: \"Sales backup\"")));
    // One sheet per year: which to read is the user's to say, and then it is read.
    let why = history_text(&bytes("year_sheets.xlsx")).expect_err("two alike");
    assert!(
        why.contains("2 sheets with the same header (\"2024\", \"2025\")"),
        "{why}"
    );
    assert_eq!(
        workbook_sheets(&bytes("year_sheets.xlsx")),
        ["2024", "2025"]
    );
    let chosen = history_text_of_sheet(&bytes("year_sheets.xlsx"), "2025").expect("asked");
    assert_eq!(chosen.sheet.as_deref(), Some("2025"));
    assert_eq!(
        read(&chosen.text).items[0].periods[0].to_string(),
        "2025-01"
    );
    let why =
        history_text_of_sheet(&bytes("hidden_backup.xlsx"), "Sales backup").expect_err("hidden");
    assert!(why.contains("those that can: \"Sales\""), "{why}");
    assert!(workbook_sheets(&text("stock.csv").into_bytes()).is_empty());
    // Item names merged down their months: each month gets its item.
    assert_eq!(
        read_bytes(&bytes("merged_items.xlsx")).items,
        read(&text("merged_items.csv")).items
    );
    // An OpenDocument time column is times of day beside the date: one item, days summed.
    let r = read_bytes(&bytes("times.ods"));
    assert!(r.errors.is_empty(), "{:#?}", r.errors);
    assert_eq!(r.items.len(), 1);
    assert_eq!(r.items[0].values, vec![Some(5.0); 3]);
    // A line break inside a cell is a space, so the bad cell below keeps its sheet row.
    let r = read_bytes(&bytes("line_break.xlsx"));
    assert_eq!(r.items[0].name, "Seed packets");
    assert_eq!((r.errors[0].row, r.errors[0].text.as_str()), (3, "ten"));
    // A chart sheet beside the sales holds no table: the sales are read.
    let r = read_bytes(&bytes("chart_sheet.xlsx"));
    assert!(r.errors.is_empty(), "{:#?}", r.errors);
    assert_eq!(r.items.len(), 2);
    // Money and percent formats written with their signs, so Intake sees them as the user
    // does: a money column is no quantity, and a stock table refuses money as on hand.
    let shown = history_text(&bytes("formats.xlsx")).expect("opens");
    assert_eq!(shown.text, text("formats.csv"));
    let r = read_bytes(&bytes("formats.xlsx"));
    assert!(r
        .warnings
        .iter()
        .any(|w| w.contains("\"Takings\"") && w.contains("money")));
    let table = read_stock_table(
        &bytes("money_on_hand.xlsx"),
        &read_bytes(&bytes("sales.xlsx")),
    );
    let e = &table.errors[0];
    assert_eq!(
        (e.row, e.column.as_str(), e.text.as_str()),
        (2, "On hand", "€120")
    );
    // Two stock counts naming on hand: which is today's is the user's to say.
    let why = stock_table_text(&bytes("two_counts.xlsx")).expect_err("two counts");
    assert!(
        why.contains("(\"Count 2024-11\", \"Count 2024-12\")"),
        "{why}"
    );
}

/// A front end that reads workbooks apart (the page, in its reading worker) tells them by
/// `is_workbook` and reads every other file with `text_file` and `read_stock_table_text`,
/// which link no workbook reader: the same text, note and tables as the bytes' own readers.
#[test]
fn text_files_read_apart_read_as_through_the_workbook_aware_readers() {
    let utf16: Vec<u8> = [0xFF, 0xFE]
        .into_iter()
        .chain(
            text("stock.csv")
                .encode_utf16()
                .flat_map(|u| u.to_le_bytes()),
        )
        .collect();
    for file in [
        bytes("sales_plain.csv"),
        bytes("stock.csv"),
        utf16,
        b"a\xffb\n".to_vec(),
    ] {
        assert!(!is_workbook(&file));
        let apart = text_file(&file);
        assert_eq!(Ok(apart.clone()), history_text(&file));
        assert_eq!(Ok(apart.clone()), stock_table_text(&file));
        let history = read(&text("sales_plain.csv"));
        assert_eq!(
            read_stock_table_text(&apart.text, &history, None),
            read_stock_table(apart.text.as_bytes(), &history)
        );
    }
    for book in ["sales.xlsx", "sales.ods", "sales.xls", "sales_csv.zip"] {
        assert!(is_workbook(&bytes(book)), "{book}");
    }
}
