//! Where intake says a problem is: row (1-based line of the text), column (header text or
//! "column N"), the text found, and that what could be read is still reported.

use morrowcast_engine::intake::{read, IntakeReport, RowError};

fn only_error(report: &IntakeReport) -> &RowError {
    assert_eq!(report.errors.len(), 1, "errors: {:#?}", report.errors);
    &report.errors[0]
}

fn at(error: &RowError) -> (usize, &str, &str) {
    (error.row, error.column.as_str(), error.text.as_str())
}

#[test]
fn bad_value_cell_is_located_and_the_rest_is_read() {
    let r = read("month,sales\n2024-01,5\n2024-02,abc\n2024-03,7\n");
    assert_eq!(at(only_error(&r)), (3, "sales", "abc"));
    assert!(only_error(&r).message.contains("expected a number"));
    assert_eq!(r.items[0].values, vec![Some(5.0), None, Some(7.0)]);
}

#[test]
fn title_line_and_header_count_as_lines() {
    let r = read("Shop sales\nmonth,sales\n2024-01,5\n2024-02,1.2.3\n");
    assert_eq!(at(only_error(&r)), (4, "sales", "1.2.3"));
}

#[test]
fn headerless_columns_are_called_column_n() {
    let r = read("2024-01,5\n2024-02,x5\n");
    assert_eq!(at(only_error(&r)), (2, "column 2", "x5"));
}

#[test]
fn blank_lines_and_crlf_count_as_lines() {
    let r = read("month,sales\r\n\r\n2024-01,5\r\n2024-02,?\r\n");
    assert_eq!(at(only_error(&r)), (4, "sales", "?"));
}

#[test]
fn a_quoted_cell_over_two_lines_counts_both() {
    let r = read("month,\"sales\nin kg\"\n2024-01,5\n2024-02,oops\n");
    assert_eq!(at(only_error(&r)), (4, "sales\nin kg", "oops"));
}

#[test]
fn unknown_unit_is_named() {
    let r = read("month,sales\n2024-01,5\n2024-02,12 apples\n");
    let error = only_error(&r);
    assert_eq!(at(error), (3, "sales", "12 apples"));
    assert!(error.message.contains("\"apples\""), "{}", error.message);
}

#[test]
fn decimal_comma_in_a_dot_file_is_an_error() {
    let r = read("month,sales\n2024-01,1.5\n2024-02,2.5\n2024-03,\"3,5\"\n");
    let error = only_error(&r);
    assert_eq!(at(error), (4, "sales", "3,5"));
    assert!(
        error.message.contains("dot decimal mark"),
        "{}",
        error.message
    );
    assert!(r.warnings.iter().any(|w| w.contains("mixes decimal marks")));
}

#[test]
fn unquoted_thousands_make_a_row_too_wide() {
    let r = read("month,sales\n2024-01,950\n2024-02,1,200\n");
    let error = only_error(&r);
    assert_eq!(at(error), (3, "column 3", "200"));
    assert!(error.message.contains("quoted"), "{}", error.message);
    assert_eq!(r.items[0].values, vec![Some(950.0)]);
}

#[test]
fn duplicate_period_in_a_single_table_names_both_rows() {
    let r = read("month,sales\n2024-01,5\n2024-02,6\n2024-01,7\n");
    let error = only_error(&r);
    assert_eq!(at(error), (4, "month", "2024-01"));
    assert!(error.message.contains("line 2"), "{}", error.message);
    assert_eq!(r.items[0].values, vec![Some(5.0), Some(6.0)]);
}

#[test]
fn unreadable_period_is_located_and_becomes_a_gap() {
    let r = read("month,sales\n2024-01,5\nsomeday,6\n2024-03,7\n");
    let error = only_error(&r);
    assert_eq!(at(error), (3, "month", "someday"));
    assert!(error.message.contains("2024-01"), "{}", error.message);
    assert_eq!(r.items[0].values, vec![Some(5.0), None, Some(7.0)]);
    assert_eq!(r.gaps_filled, 1);
}

#[test]
fn missing_period_cell_is_an_error() {
    let r = read("month,sales\n2024-01,5\n,6\n");
    assert_eq!(at(only_error(&r)), (3, "month", ""));
}

#[test]
fn truly_ambiguous_dates_are_an_error_naming_the_first_row() {
    // Day-first: 3 January, 3 February, 3 March (monthly, regular).
    // Month-first: 1, 2, 3 March (daily, regular). Nothing decides.
    let r = read("date,sales\n03/01/2024,1\n03/02/2024,2\n03/03/2024,3\n");
    let error = only_error(&r);
    assert_eq!(at(error), (2, "date", "03/01/2024"));
    assert!(error.message.contains("2024-01-03"), "{}", error.message);
    assert!(error.message.contains("2024-03-01"), "{}", error.message);
    // Still read (day-first) so the user sees what the file holds.
    assert_eq!(r.items[0].values.len(), 3);
}

#[test]
fn dates_in_both_orders_reject_the_minority() {
    let r = read("date,sales\n13/01/2024,1\n14/01/2024,2\n01/15/2024,3\n");
    let error = only_error(&r);
    assert_eq!(at(error), (4, "date", "01/15/2024"));
    assert!(error.message.contains("day-first"), "{}", error.message);
}

#[test]
fn impossible_date_is_an_error() {
    let r = read("date,sales\n2024-02-28,1\n2024-02-30,2\n2024-03-01,3\n");
    assert_eq!(at(only_error(&r)), (3, "date", "2024-02-30"));
}

#[test]
fn long_layout_bad_quantity_and_missing_item() {
    let r = read("item,month,qty\nA,2024-01,1\nA,2024-02,lots\n,2024-01,4\n");
    assert_eq!(r.errors.len(), 2, "{:#?}", r.errors);
    assert_eq!(at(&r.errors[0]), (3, "qty", "lots"));
    assert_eq!(at(&r.errors[1]), (4, "item", ""));
}

#[test]
fn unclosed_quote_is_reported() {
    let r = read("month,sales\n2024-01,\"5\n2024-02,6\n");
    assert!(
        r.errors.iter().any(|e| e.row == 2 && e.text == "\""),
        "{:#?}",
        r.errors
    );
}

#[test]
fn empty_text_and_header_only_are_errors() {
    let r = read("");
    assert_eq!(at(only_error(&r)), (1, "", ""));
    assert!(r.items.is_empty());
    let r = read("\n\n  \n");
    assert_eq!(only_error(&r).row, 1);
    let r = read("Shop report\nmonth,sales\n");
    let error = only_error(&r);
    assert_eq!(error.row, 2);
    assert!(
        error.message.contains("below the header"),
        "{}",
        error.message
    );
}

#[test]
fn text_without_numbers_is_an_error() {
    let r = read("name,colour\napple,red\npear,green\n");
    assert!(r.has_errors());
    assert!(r.items.is_empty());
    let r = read("name,colour\napple,5\npear,green\nplum,blue\n");
    assert!(r.has_errors());
    assert!(
        r.errors[0].message.contains("column of numbers"),
        "{:?}",
        r.errors
    );
}

#[test]
fn too_long_a_span_is_an_error_not_a_huge_series() {
    // Two dates far apart: the later one is the likely typo, and the earlier is read alone.
    let r = read("date,sales\n1024-01-01,1\n9024-01-02,2\n");
    let error = only_error(&r);
    assert_eq!(at(error), (3, "date", "9024-01-02"));
    assert_eq!(r.items[0].values, vec![Some(1.0)]);
}

#[test]
fn a_period_written_another_way_is_an_error() {
    let r = read("month,sales\n2024-01,1\n2024-02,2\n2024 Q1,3\n");
    let error = only_error(&r);
    assert_eq!(at(error), (4, "month", "2024 Q1"));
    assert!(
        error.message.contains("such as 2024-01"),
        "{}",
        error.message
    );
}

// Text decoded by another program (a browser, an editor, a paste) carries U+FFFD where bytes
// were lost; read as text it used to be taken silently (a name "Caf\u{fffd}", a number cell
// refused without saying why). Each such line is now an error. Read as bytes, a line with
// undecodable bytes is reported once, with the bytes.
#[test]
fn text_with_replacement_marks_is_reported_by_line() {
    let r = read("month,sales\n2024-01,5\n2024-02,\u{fffd}7\n2024-03,6\n");
    assert!(
        r.errors.iter().any(|e| e.row == 3
            && e.text == "\u{fffd}"
            && e.message.contains("could not be read as text")),
        "{:#?}",
        r.errors
    );
    let bytes = morrowcast_engine::intake::read_bytes(b"month,sales\n2024-01,5\n2024-02,\xE97\n");
    let on_row_3: Vec<&str> = bytes
        .errors
        .iter()
        .filter(|e| e.row == 3 && e.column.is_empty())
        .map(|e| e.text.as_str())
        .collect();
    assert_eq!(on_row_3, ["\\xE9"], "{:#?}", bytes.errors);
    assert_eq!(
        morrowcast_engine::intake::decode_bytes(b"a\n\xE9\n"),
        "a\n\u{fffd}\n"
    );
}

// A period column named in German: numbers there that are no periods ("03.20") are an error
// at the first, where month.year labels had been read as an item of numbers 3.202, 4.202, ...
// beside numbered rows, silently. Month.year labels with a four-digit year are months since
// 2026-12-04; dates under such a name read as before.
#[test]
fn numbers_under_a_period_named_in_another_language_are_an_error() {
    let report = read("Monat;Absatz\n03.20;122\n04.20;112\n05.20;130\n");
    assert!(report.items.is_empty(), "{:?}", report.items);
    assert_eq!(at(only_error(&report)), (2, "Monat", "03.20"));
    let months = read("Monat;Absatz\n03.2020;122\n04.2020;112\n05.2020;130\n");
    assert!(months.errors.is_empty(), "{:?}", months.errors);
    assert_eq!(months.items[0].name, "Absatz");
    assert_eq!(months.items[0].periods[0].to_string(), "2020-03");
    let dated = read("Datum,Menge\n2024-01-05,3\n2024-01-06,4\n2024-01-07,5\n");
    assert!(dated.errors.is_empty(), "{:?}", dated.errors);
    assert_eq!(dated.items.len(), 1);
    assert_eq!(dated.items[0].name, "Menge");
}
