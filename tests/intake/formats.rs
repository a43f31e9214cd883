//! One small test per format feature intake reads, each with its input inline.
//!
//! Calendar facts used in expectations (ISO weeks, month lengths) are common practice and can be
//! checked in any calendar.

use morrowcast_engine::calendar::Frequency;
use morrowcast_engine::intake::{read, DecimalMark, Delimiter, IntakeReport, Item, Layout};

fn labels(item: &Item) -> Vec<String> {
    item.periods.iter().map(|p| p.to_string()).collect()
}

/// Reads text that must have no errors and exactly one item.
fn one(text: &str) -> (IntakeReport, Item) {
    let report = read(text);
    assert!(report.errors.is_empty(), "errors: {:#?}", report.errors);
    assert_eq!(report.items.len(), 1, "items: {:#?}", report.items);
    let item = report.items[0].clone();
    (report, item)
}

fn some(values: &[f64]) -> Vec<Option<f64>> {
    values.iter().map(|v| Some(*v)).collect()
}

fn warned(report: &IntakeReport, words: &[&str]) -> bool {
    report
        .warnings
        .iter()
        .any(|w| words.iter().all(|word| w.contains(word)))
}

#[test]
fn comma_file_with_header() {
    let (r, item) = one("month,sales\n2024-01,10\n2024-02,12.5\n");
    assert_eq!(r.delimiter, Delimiter::Comma);
    assert_eq!(r.decimal, DecimalMark::Dot);
    assert_eq!(r.layout, Layout::Single);
    assert_eq!(r.frequency, Frequency::Monthly);
    assert!(r.has_header);
    assert_eq!(item.name, "sales");
    assert_eq!(labels(&item), ["2024-01", "2024-02"]);
    assert_eq!(item.values, some(&[10.0, 12.5]));
    assert!(r.warnings.is_empty(), "{:?}", r.warnings);
}

#[test]
fn semicolon_file_with_decimal_comma_and_dot_thousands() {
    let (r, item) = one("Monat;Umsatz\n2024-01;10,5\n2024-02;1.234,5\n");
    assert_eq!(r.delimiter, Delimiter::Semicolon);
    assert_eq!(r.decimal, DecimalMark::Comma);
    assert_eq!(item.values, some(&[10.5, 1234.5]));
}

#[test]
fn tab_file_pasted_from_a_spreadsheet() {
    let (r, item) = one("Month\tSales\n2024-01\t12.5\n2024-02\t950\n");
    assert_eq!(r.delimiter, Delimiter::Tab);
    assert_eq!(item.values, some(&[12.5, 950.0]));
}

#[test]
fn pipe_file() {
    let (r, item) = one("month|sales\n2024-01|3\n2024-02|4\n");
    assert_eq!(r.delimiter, Delimiter::Pipe);
    assert_eq!(item.values, some(&[3.0, 4.0]));
}

#[test]
fn headerless_file_names_its_series_series_1() {
    let (r, item) = one("2024-01,10\n2024-02,11\n");
    assert!(!r.has_header);
    assert_eq!(item.name, "Series 1");
    assert!(warned(&r, &["no header"]));
}

#[test]
fn title_line_above_the_header_is_skipped_with_a_warning() {
    let (r, item) = one("Sales report, shop 2\nmonth,sales\n2024-01,1\n2024-02,2\n");
    assert_eq!(item.name, "sales");
    assert!(warned(&r, &["line 1", "title"]), "{:?}", r.warnings);
}

#[test]
fn title_line_padded_with_delimiters() {
    let r = read("Monthly sales;;\nMonth;Shop;Web\n2024-01;1;2\n2024-02;3;4\n");
    assert!(r.errors.is_empty(), "{:?}", r.errors);
    assert_eq!(r.layout, Layout::Wide);
    assert_eq!(r.items[0].name, "Shop");
    assert!(warned(&r, &["line 1", "Monthly sales"]));
    assert_eq!(r.items[1].name, "Web");
}

#[test]
fn quoted_fields_and_quoted_thousands() {
    let (r, item) = one("\"Month\",\"Sales\"\n\"2024-01\",\"1,234\"\n\"2024-02\",\"2,000.50\"\n");
    assert_eq!(r.decimal, DecimalMark::Dot);
    assert_eq!(item.values, some(&[1234.0, 2000.5]));
}

#[test]
fn lone_thousands_are_read_as_thousands_with_a_warning() {
    let (r, item) = one("month,sales\n2024-01,\"1,234\"\n2024-02,950\n");
    assert_eq!(item.values, some(&[1234.0, 950.0]));
    assert!(warned(&r, &["thousands separator"]), "{:?}", r.warnings);
}

#[test]
fn byte_order_mark_is_ignored() {
    let (_, item) = one("\u{feff}demand\n5\n");
    assert_eq!(item.name, "demand");
    let (r, item) = one("\u{feff}2024-01,5\n");
    assert_eq!(r.frequency, Frequency::Monthly);
    assert_eq!(labels(&item), ["2024-01"]);
}

#[test]
fn crlf_and_trailing_blank_lines() {
    let (r, item) = one("month,sales\r\n2024-01,1\r\n2024-02,2\r\n\r\n\r\n");
    assert_eq!(item.values, some(&[1.0, 2.0]));
    assert!(r.warnings.is_empty(), "{:?}", r.warnings);
}

#[test]
fn space_and_no_break_space_thousands_with_decimal_comma() {
    let text = "Mois;Ventes\n2024-01;1 234,5\n2024-02;2\u{a0}000,25\n2024-03;3\u{202f}100\n";
    let (r, item) = one(text);
    assert_eq!(r.decimal, DecimalMark::Comma);
    assert_eq!(item.values, some(&[1234.5, 2000.25, 3100.0]));
}

#[test]
fn currency_and_units_are_stripped_with_one_warning() {
    let text = "month,a,b,c,d\n2024-01,\"$1,200\",1 200 €,12 kg,£3.50\n2024-02,$5,7 €,3 kg,£1\n";
    let r = read(text);
    assert!(r.errors.is_empty(), "{:?}", r.errors);
    let firsts: Vec<Option<f64>> = r.items.iter().map(|i| i.values[0]).collect();
    assert_eq!(firsts, some(&[1200.0, 1200.0, 12.0, 3.5]));
    let affix_warnings: Vec<&String> = r.warnings.iter().filter(|w| w.contains("units")).collect();
    assert_eq!(affix_warnings.len(), 1, "{:?}", r.warnings);
    for form in ["\"$\"", "\"€\"", "\"kg\"", "\"£\"", "from 8 cells"] {
        assert!(affix_warnings[0].contains(form), "{}", affix_warnings[0]);
    }
}

#[test]
fn single_column_without_periods_is_undated() {
    let (r, item) = one("demand\n5\n7\n9\n");
    assert_eq!(r.frequency, Frequency::Undated);
    assert_eq!(r.date_format, None);
    assert_eq!(item.name, "demand");
    assert_eq!(labels(&item), ["1", "2", "3"]);
}

#[test]
fn blank_line_inside_a_pasted_column_is_a_gap() {
    let (r, item) = one("5\n\n9\n");
    assert_eq!(item.values, vec![Some(5.0), None, Some(9.0)]);
    assert_eq!(r.empty_cells, 1);
    assert!(warned(&r, &["blank lines 2", "gaps"]));
}

#[test]
fn blank_line_in_a_dated_table_is_skipped_with_a_warning() {
    let (r, item) = one("month,sales\n2024-01,1\n\n2024-02,2\n");
    assert_eq!(item.values, some(&[1.0, 2.0]));
    assert!(warned(&r, &["blank lines 3", "skipped"]));
}

#[test]
fn index_column_gives_positions() {
    let (r, item) = one("t,value\n1,5\n2,6\n3,7\n");
    assert_eq!(r.frequency, Frequency::Undated);
    assert_eq!(labels(&item), ["1", "2", "3"]);
    assert_eq!(item.name, "value");
}

#[test]
fn wide_layout_with_an_empty_cell() {
    let r = read("month,apples,pears\n2024-01,1,2\n2024-02,3,\n2024-03,4,5\n");
    assert!(r.errors.is_empty(), "{:?}", r.errors);
    assert_eq!(r.layout, Layout::Wide);
    assert_eq!(r.items[0].name, "apples");
    assert_eq!(r.items[1].values, vec![Some(2.0), None, Some(5.0)]);
    assert_eq!(r.empty_cells, 1);
    assert_eq!(r.gaps_filled, 0);
    assert!(
        warned(&r, &["\"pears\"", "1 empty cell read", "2024-02"]),
        "{:?}",
        r.warnings
    );
}

#[test]
fn not_available_markers_are_gaps() {
    let (r, item) = one("month,sales\n2024-01,1\n2024-02,NA\n2024-03,#N/A\n2024-04,4\n");
    assert_eq!(item.values, vec![Some(1.0), None, None, Some(4.0)]);
    assert_eq!(r.empty_cells, 2);
}

#[test]
fn wide_duplicate_headers_get_unique_names() {
    let r = read("month,shop,shop,\n2024-01,1,2,\n");
    let names: Vec<&str> = r.items.iter().map(|i| i.name.as_str()).collect();
    assert_eq!(names, ["shop", "shop (2)"]);
}

// A period with rows for other items but none for an item is no sales for it (tables of
// rows leave out the zeros; interpolating there would invent demand), after its last row too
// (its plan starts at the file's end); a period no row names at all is a gap in a table that
// writes zeros, and there an item's rows that stop are not followed by zeros: its figures end
// early, said (tests/intake/unnamed.rs has the rest).
#[test]
fn long_layout_in_any_order_with_a_missing_period() {
    let text =
        "item,period,qty\npears,2024-02,3\napples,2024-01,1\napples,2024-03,2\npears,2024-01,4\n";
    let r = read(text);
    assert!(r.errors.is_empty(), "{:?}", r.errors);
    assert_eq!(r.layout, Layout::Long);
    assert_eq!(r.items[0].name, "pears");
    assert_eq!(r.items[0].values, some(&[4.0, 3.0, 0.0]));
    // One period since is not a stop, only a period without a row, counted as the others.
    assert!(
        warned(&r, &["read as no sales (0)", "\"pears\" 1"]),
        "{:?}",
        r.warnings
    );
    assert!(
        !r.warnings.iter().any(|w| w.contains("stopped")),
        "{:?}",
        r.warnings
    );
    assert_eq!(r.items[1].name, "apples");
    assert_eq!(labels(&r.items[1]), ["2024-01", "2024-02", "2024-03"]);
    assert_eq!(r.items[1].values, some(&[1.0, 0.0, 2.0]));
    assert_eq!(r.gaps_filled, 0);
    assert!(
        warned(&r, &["read as no sales (0)", "\"apples\" 1"]),
        "{:?}",
        r.warnings
    );
    let text = "item,period,qty\napples,2024-01,1\napples,2024-03,2\npears,2024-01,0\n";
    let r = read(text);
    assert_eq!(r.items[0].values, vec![Some(1.0), None, Some(2.0)]);
    assert_eq!(r.items[1].values, vec![Some(0.0)]);
    assert!(warned(
        &r,
        &["the figures of 1 item end before the file's last period (2024-03): \"pears\" (2024-01)"]
    ));
    assert_eq!(r.gaps_filled, 1);
    assert!(
        warned(
            &r,
            &["1 period that no row names was taken as missing", "2024-02"]
        ),
        "{:?}",
        r.warnings
    );
}

#[test]
fn long_layout_sums_duplicate_rows_with_a_warning() {
    let r = read("item;month;qty\nA;2024-01;2\nA;2024-01;3\nA;2024-02;1\n");
    assert!(r.errors.is_empty(), "{:?}", r.errors);
    assert_eq!(r.items[0].values, some(&[5.0, 1.0]));
    assert!(
        warned(&r, &["summed", "\"A\" 2024-01", "lines 2 and 3, total 5)"]),
        "{:?}",
        r.warnings
    );
    // Lines alike in every cell: likelier a line entered twice, said so (a review).
    let r = read("item;month;qty\nA;2024-01;2\nA;2024-01;2\nA;2024-02;1\n");
    assert_eq!(r.items[0].values, some(&[4.0, 1.0]));
    assert!(
        warned(
            &r,
            &[
                "\"A\" 2024-01 (lines 2 and 3, total 4; the lines are identical: if one was \
                 entered twice, delete it)"
            ]
        ),
        "{:?}",
        r.warnings
    );
}

#[test]
fn long_layout_with_period_first_and_year_column() {
    let r = read("year,store,units\n2022,North,5\n2023,North,6\n2022,South,1\n2023,South,2\n");
    assert!(r.errors.is_empty(), "{:?}", r.errors);
    assert_eq!(r.layout, Layout::Long);
    assert_eq!(r.frequency, Frequency::Yearly);
    assert_eq!(labels(&r.items[1]), ["2022", "2023"]);
}

#[test]
fn iso_dates_daily() {
    let (r, item) = one("date,sales\n2024-02-28,1\n2024-02-29,2\n2024-03-01,3\n");
    assert_eq!(r.frequency, Frequency::Daily);
    assert_eq!(labels(&item), ["2024-02-28", "2024-02-29", "2024-03-01"]);
    assert!(r.date_format.unwrap().starts_with("year-month-day"));
}

#[test]
fn day_first_dates_decided_by_a_day_above_12() {
    let (r, item) = one("date,sales\n12/03/2024,1\n13/03/2024,2\n14/03/2024,3\n");
    assert_eq!(r.frequency, Frequency::Daily);
    assert_eq!(labels(&item)[0], "2024-03-12");
    assert!(r.date_format.unwrap().starts_with("day-first"));
}

#[test]
fn month_first_dates_decided_by_a_second_field_above_12() {
    let (r, item) = one("date,sales\n03/12/2024,1\n03/13/2024,2\n");
    assert_eq!(labels(&item), ["2024-03-12", "2024-03-13"]);
    assert!(r.date_format.unwrap().starts_with("month-first"));
}

#[test]
fn dashed_and_dotted_day_first_dates() {
    let (_, item) = one("date;sales\n30-01-2024;1\n31-01-2024;2\n");
    assert_eq!(labels(&item), ["2024-01-30", "2024-01-31"]);
    let (_, item) = one("date;sales\n30.01.2024;1\n31.01.2024;2\n");
    assert_eq!(labels(&item), ["2024-01-30", "2024-01-31"]);
}

#[test]
fn two_digit_years() {
    let (_, item) = one("date,sales\n31/01/24,1\n01/02/24,2\n");
    assert_eq!(labels(&item), ["2024-01-31", "2024-02-01"]);
}

#[test]
fn ambiguous_dates_all_on_day_one_read_as_months() {
    let (r, item) = one("date,sales\n01/02/2024,1\n01/03/2024,2\n01/04/2024,3\n");
    assert_eq!(r.frequency, Frequency::Monthly);
    assert_eq!(labels(&item), ["2024-02", "2024-03", "2024-04"]);
    assert!(
        warned(&r, &["day-first", "1st of a month"]),
        "{:?}",
        r.warnings
    );
}

#[test]
fn ambiguous_dates_with_one_regular_reading() {
    // Month-first: Saturdays 3 and 10 February 2024, a week apart (ISO weeks 5 and 6).
    // Day-first: 2 March and 2 October, months apart with gaps: not regular.
    let (r, item) = one("date,sales\n02/03/2024,1\n02/10/2024,2\n");
    assert_eq!(r.frequency, Frequency::Weekly);
    assert_eq!(labels(&item), ["2024-W05", "2024-W06"]);
    assert!(warned(&r, &["month-first", "regular"]), "{:?}", r.warnings);
}

#[test]
fn week_dates_forced_month_first_by_a_day_above_12() {
    let (r, item) = one("date,sales\n01/05/2024,1\n01/12/2024,2\n01/19/2024,3\n");
    assert_eq!(r.frequency, Frequency::Weekly);
    assert_eq!(labels(&item), ["2024-W01", "2024-W02", "2024-W03"]);
    assert!(r.warnings.iter().all(|w| !w.contains("month-first")));
    // Friday dates shown as ISO weeks: the description says which dates the first holds.
    assert!(
        r.date_format.as_deref().unwrap_or("").ends_with(
            ", a week apart, shown as ISO weeks, Monday to Sunday (2024-W01 is the week from \
             2024-01-01)"
        ),
        "{:?}",
        r.date_format
    );
}

#[test]
fn month_end_dates_are_monthly() {
    let (r, item) = one("date,sales\n2024-01-31,1\n2024-02-29,2\n2024-03-31,3\n");
    assert_eq!(r.frequency, Frequency::Monthly);
    assert_eq!(labels(&item), ["2024-01", "2024-02", "2024-03"]);
}

#[test]
fn same_day_of_month_is_monthly() {
    let (r, item) = one("date,sales\n2024-01-15,1\n2024-02-15,2\n");
    assert_eq!(r.frequency, Frequency::Monthly);
    assert_eq!(labels(&item), ["2024-01", "2024-02"]);
}

#[test]
fn week_start_dates_are_weekly() {
    // 2024-01-01 and 2024-01-08 are Mondays starting ISO weeks 1 and 2.
    let (r, item) = one("week,sales\n2024-01-01,1\n2024-01-08,2\n2024-01-15,3\n");
    assert_eq!(r.frequency, Frequency::Weekly);
    assert_eq!(labels(&item), ["2024-W01", "2024-W02", "2024-W03"]);
}

#[test]
fn month_name_forms() {
    for (text, first) in [
        ("m,s\nMar 2024,1\nApr 2024,2\n", "2024-03"),
        ("m,s\nMarch 2024,1\nApril 2024,2\n", "2024-03"),
        ("m,s\n2024 Mar,1\n2024 Apr,2\n", "2024-03"),
        ("m,s\nMar-24,1\nApr-24,2\n", "2024-03"),
        ("m,s\n2024/03,1\n2024/04,2\n", "2024-03"),
        ("m,s\n03/2024,1\n04/2024,2\n", "2024-03"),
    ] {
        let (r, item) = one(text);
        assert_eq!(r.frequency, Frequency::Monthly, "{text}");
        assert_eq!(labels(&item), [first, "2024-04"], "{text}");
    }
}

#[test]
fn quarter_forms() {
    for text in [
        "q,s\n2024 Q1,1\n2024 Q2,2\n",
        "q,s\n2024-Q1,1\n2024-Q2,2\n",
        "q,s\nQ1 2024,1\nQ2 2024,2\n",
    ] {
        let (r, item) = one(text);
        assert_eq!(r.frequency, Frequency::Quarterly, "{text}");
        assert_eq!(labels(&item), ["2024-Q1", "2024-Q2"], "{text}");
    }
}

#[test]
fn iso_weeks_across_a_53_week_year() {
    // ISO 8601: 2020 has 53 weeks, so 2020-W53 is followed by 2021-W01.
    let (r, item) = one("week,sales\n2020-W52,1\n2020-W53,2\n2021-W01,3\n");
    assert_eq!(r.frequency, Frequency::Weekly);
    assert_eq!(item.values, some(&[1.0, 2.0, 3.0]));
    assert_eq!(r.gaps_filled, 0);
}

#[test]
fn plain_years() {
    let (r, item) = one("year,sales\n2021,5\n2022,6\n2023,7\n");
    assert_eq!(r.frequency, Frequency::Yearly);
    assert_eq!(labels(&item), ["2021", "2022", "2023"]);
}

#[test]
fn dates_with_midnight_times() {
    let (r, item) = one("date,sales\n2024-01-01 00:00:00,1\n2024-02-01 00:00:00,2\n");
    assert_eq!(r.frequency, Frequency::Monthly);
    assert_eq!(labels(&item), ["2024-01", "2024-02"]);
}

#[test]
fn rows_out_of_order_are_sorted_with_a_warning() {
    let (r, item) = one("month,sales\n2024-02,2\n2024-01,1\n2024-03,3\n");
    assert_eq!(item.values, some(&[1.0, 2.0, 3.0]));
    assert!(warned(&r, &["not in time order", "sorted"]));
}

#[test]
fn missing_periods_become_gaps_with_a_warning() {
    let (r, item) = one("month,sales\n2024-01,1\n2024-04,4\n");
    assert_eq!(item.values, vec![Some(1.0), None, None, Some(4.0)]);
    assert_eq!(r.gaps_filled, 2);
    assert!(
        warned(&r, &["2 missing periods", "\"sales\"", "2024-02, 2024-03"]),
        "{:?}",
        r.warnings
    );
}

#[test]
fn negative_values_are_kept_with_a_warning() {
    let (r, item) = one("month,sales\n2024-01,5\n2024-02,-2\n2024-03,(1)\n");
    assert_eq!(item.values, some(&[5.0, -2.0, -1.0]));
    assert!(
        warned(&r, &["2 negative values", "2024-02 (-2)"]),
        "{:?}",
        r.warnings
    );
}

#[test]
fn item_series_is_ready_for_modelling() {
    let (_, item) = one("month,sales\n2024-01,1\n2024-03,3\n");
    let series = item.series().unwrap();
    assert_eq!(series.len(), 3);
    assert_eq!(series.frequency(), Frequency::Monthly);
}

#[test]
fn wide_missing_rows_are_gaps_for_every_item_in_one_warning() {
    let r = read("2024-01;1;2\n2024-03;3;4\n");
    assert!(r.errors.is_empty(), "{:?}", r.errors);
    let names: Vec<&str> = r.items.iter().map(|i| i.name.as_str()).collect();
    assert_eq!(names, ["Series 1", "Series 2"]);
    assert_eq!(r.gaps_filled, 2);
    assert!(
        warned(
            &r,
            &["1 missing period", "each of Series 1, Series 2", "2024-02"]
        ),
        "{:?}",
        r.warnings
    );
}

// Month.year, as European exports write months (2026-12-04): under a header that names a
// period (long tables too) and across the header, beside decimal commas and thousands dots,
// which it must not sway. A number to a cell: "10.2001" beside periods is an article
// number, and a column of such numbers under an item's name stays quantities.
#[test]
fn month_dot_year_labels_are_months_where_a_column_says_so() {
    let (r, item) = one("Monat;Absatz\n11.2023;1.250,5\n12.2023;980\n01.2024;1.100\n");
    assert_eq!(
        (r.frequency, r.decimal),
        (Frequency::Monthly, DecimalMark::Comma)
    );
    assert_eq!(labels(&item), ["2023-11", "2023-12", "2024-01"]);
    assert_eq!(item.values, some(&[1250.5, 980.0, 1100.0]));
    let long = read("Periode;Artikel;Menge\n01.2024;Samen;5\n01.2024;Zwiebeln;7\n02.2024;Samen;6\n02.2024;Zwiebeln;8\n");
    assert!(long.errors.is_empty(), "{:#?}", long.errors);
    assert_eq!((long.layout, long.items.len()), (Layout::Long, 2));
    assert_eq!(labels(&long.items[1]), ["2024-01", "2024-02"]);
    let (r, item) = one("Artikel;01.2024;02.2024;03.2024\nSamen;5;6;7\n");
    assert_eq!(r.layout, Layout::Across);
    assert_eq!(labels(&item), ["2024-01", "2024-02", "2024-03"]);
    let codes =
        read("Article,2024-01,2024-02,2024-03\n10.2001,5,6,7\n10.2002,5,6,7\n11.2005,5,6,7\n");
    assert!(codes.errors.is_empty(), "{:#?}", codes.errors);
    let names: Vec<&str> = codes.items.iter().map(|i| i.name.as_str()).collect();
    assert_eq!(names, ["10.2001", "10.2002", "11.2005"]);
    // Without a header, months close in time.
    let (r, item) = one("01.2024,5\n02.2024,6\n03.2024,7\n");
    assert!(!r.has_header);
    assert_eq!(labels(&item), ["2024-01", "2024-02", "2024-03"]);
    let (_, item) = one("Month,Seeds\n2024-01,1.2024\n2024-02,2.2024\n2024-03,3.2024\n");
    assert_eq!(item.values, some(&[1.2024, 2.2024, 3.2024]));
    // Four decimals with a year outside the plausible ones stay numbers under a period word.
    let (_, item) = one("month,sales\n2024-01,10.2500\n2024-02,11.2500\n");
    assert_eq!(item.values, some(&[10.25, 11.25]));
}

// Week.year under a header that names weeks, as some exports write calendar weeks (2026-12-04): ISO
// weeks. Read as months, weeks 1 to 12 were January to December ("Calendar week") or the
// column an item of numbers 1.2024, 2.2024, ... ("KW", silently).
#[test]
fn week_dot_year_under_a_week_header_is_iso_weeks() {
    let table = |header: &str, weeks: std::ops::RangeInclusive<u32>, year: i32| {
        let rows: String = weeks
            .map(|w| format!("{w:02}.{year};{}\n", 50 + w % 5))
            .collect();
        format!("{header};Menge\n{rows}")
    };
    for header in [
        "Calendar week",
        "KW",
        "Woche",
        "Week",
        "Kalenderwoche",
        "KW/Jahr",
        "Weekly",
        "Period (weeks)",
    ] {
        for (weeks, first, last) in [
            (1..=52, "2024-W01", "2024-W52"),
            (1..=7, "2024-W01", "2024-W07"),
        ] {
            let (r, item) = one(&table(header, weeks, 2024));
            assert_eq!(r.frequency, Frequency::Weekly, "{header}");
            let got = labels(&item);
            assert_eq!(
                (got[0].as_str(), got[got.len() - 1].as_str()),
                (first, last),
                "{header}"
            );
        }
    }
    // 2020 has a week 53, 2021 none: an error at that cell.
    let (_, item) = one(&table("KW", 50..=53, 2020));
    assert_eq!(labels(&item).last().map(String::as_str), Some("2020-W53"));
    let r = read(&table("KW", 50..=53, 2021));
    let errors: Vec<(usize, &str)> = r.errors.iter().map(|e| (e.row, e.text.as_str())).collect();
    assert_eq!(errors, [(5, "53.2021")], "{:#?}", r.errors);
    // Under a header that names no period Intake knows, labels in time order are no
    // quantities: an error (they had been planned as an item "Fiscal week").
    let r = read(&table("Fiscal week", 1..=30, 2024));
    assert!(r.items.is_empty(), "{:#?}", r.items);
    assert!(
        r.errors[0]
            .message
            .contains("name the column Month or Week"),
        "{:#?}",
        r.errors
    );
    // Twelve or fewer under a neutral header read as months, said.
    let (r, _) = one(&table("Period", 1..=12, 2024));
    assert_eq!(r.frequency, Frequency::Monthly);
    assert!(
        warned(&r, &["read as month.year", "name the column Week"]),
        "{:#?}",
        r.warnings
    );
    // Under a header that does not say weeks, week.year beyond 12 is no period: an error
    // at the first that is no month, that says how to name them.
    let r = read(&table("Period", 1..=52, 2024));
    assert!(
        r.errors
            .iter()
            .any(|e| e.message.contains("name the column Week")),
        "{:#?}",
        r.errors
    );
    assert_eq!(
        (r.errors[0].row, r.errors[0].text.as_str()),
        (14, "13.2024")
    );
}
