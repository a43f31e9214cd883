//! A year down and its months or quarters across (`Item,Year,Jan,...,Dec`), the way many small
//! shops keep sales in a spreadsheet: each cell read as its row's year and its column's month.
//! Before, such tables were refused ("write one row per period"), and with counts of 1 to 4
//! under "Qtr 1" they were misread (counts taken for quarters). Values below are worked out by
//! hand from each table.

use morrowcast_engine::calendar::Frequency;
use morrowcast_engine::intake::{read, Layout};

use super::expect::{check, some, Expect};

const MONTHS: &str = "Jan,Feb,Mar,Apr,May,Jun,Jul,Aug,Sep,Oct,Nov,Dec";

/// A row of twelve months from `first`, one more each month.
fn year_of(first: u32) -> String {
    (first..first + 12)
        .map(|v| v.to_string())
        .collect::<Vec<_>>()
        .join(",")
}

#[test]
fn months_across_a_year_down_are_read_month_by_month() {
    // Rows out of year order, a category beside the item, a row total, the current year's
    // months still to come left empty, and a year without a row for one item.
    let text = format!(
        "Product,Category,Year,{MONTHS},Total\n\
         Trowel,Tools,2024,{},,,,,,,,40\n\
         Trowel,Tools,2023,{},126\n\
         Rake,Tools,2022,{},102\n\
         Rake,Tools,2024,{},,,,,,,,15\n",
        "6,7,8,9,10",
        year_of(5),
        year_of(3),
        "1,2,3,4,5",
    );
    // Every item over the table's months (2022-01 to 2024-12), as in every table of periods
    // across: Trowel's first year empty (before its first value), Rake's 2023 a gap.
    let mut trowel: Vec<Option<f64>> = vec![None; 12];
    trowel.extend((5..17).chain(6..11).map(|v| Some(f64::from(v))));
    // June to December of 2024 are still to come for both: empty, left out when planned.
    trowel.extend([None; 7]);
    let mut rake: Vec<Option<f64>> = (3..15).map(|v| Some(f64::from(v))).collect();
    rake.extend([None; 12]);
    rake.extend(some(&[1.0, 2.0, 3.0, 4.0, 5.0]));
    rake.extend([None; 7]);
    let report = check(
        &text,
        Expect {
            items: Some(vec![("Trowel / Tools", trowel), ("Rake / Tools", rake)]),
            layout: Some(Layout::Across),
            frequency: Some(Frequency::Monthly),
            warned: vec![
                vec!["\"Total\"", "not used"],
                vec!["12 missing periods", "Rake / Tools", "2023-01"],
                vec!["2024-06 to 2024-12", "still to come"],
            ],
            ..Expect::default()
        },
    );
    for item in &report.items {
        assert_eq!(item.periods[0].to_string(), "2022-01");
        assert_eq!(item.periods.len(), 36);
    }
    assert_eq!(report.gaps_filled, 12);
}

#[test]
fn quarters_and_numbered_months_across_are_read_too() {
    check(
        "Item,Year,Q1,Q2,Q3,Q4\nTrowel,2023,3,1,4,2\nTrowel,2024,2,3,1,4\n",
        Expect {
            items: Some(vec![(
                "Trowel",
                some(&[3.0, 1.0, 4.0, 2.0, 2.0, 3.0, 1.0, 4.0]),
            )]),
            frequency: Some(Frequency::Quarterly),
            periods: Some(vec![
                "2023-Q1", "2023-Q2", "2023-Q3", "2023-Q4", "2024-Q1", "2024-Q2", "2024-Q3",
                "2024-Q4",
            ]),
            ..Expect::default()
        },
    );
    let numbered: Vec<String> = (1..=12).map(|m| format!("M{m:02}")).collect();
    check(
        &format!(
            "SKU,Item,Year,{}\n1001,Trowel,2024,{}\n",
            numbered.join(","),
            year_of(1)
        ),
        Expect {
            items: Some(vec![(
                "1001 / Trowel",
                (1..=12).map(|v| Some(f64::from(v))).collect(),
            )]),
            frequency: Some(Frequency::Monthly),
            ..Expect::default()
        },
    );
}

#[test]
fn what_cannot_be_placed_is_refused_at_its_cell() {
    // A year twice for one item: its second row is not added to the first.
    check(
        &format!(
            "Item,Year,{MONTHS}\nTrowel,2024,{}\nTrowel,2024,{}\n",
            year_of(1),
            year_of(2)
        ),
        Expect {
            errors: vec![(3, "Year", "2024")],
            ..Expect::default()
        },
    );
    // A year that is no year, a month that is no number.
    check(
        &format!(
            "Item,Year,{MONTHS}\nTrowel,2O24,{}\nRake,2024,1,2,x,4,5,6,7,8,9,10,11,12\n\
             Hoe,2024,{}\nSieve,2024,{}\n",
            year_of(1),
            year_of(2),
            year_of(3)
        ),
        Expect {
            errors: vec![(2, "Year", "2O24"), (3, "Mar", "x")],
            ..Expect::default()
        },
    );
}

/// Grids this layout does not read stay refused with what to write instead: no item column,
/// months missing from the header, months in a fiscal year's order, a price among the
/// months, weeks across, no year at all.
#[test]
fn other_grids_stay_refused() {
    let fiscal = "Apr,May,Jun,Jul,Aug,Sep,Oct,Nov,Dec,Jan,Feb,Mar";
    for (text, first) in [
        (format!("Year,{MONTHS}\n2024,{}\n", year_of(1)), "Jan"),
        (
            "Item,Year,Jan,Feb,Mar\nTrowel,2024,5,6,7\nRake,2024,1,2,3\n".to_string(),
            "Jan",
        ),
        (
            format!("Item,Fiscal year,{fiscal}\nTrowel,2024,{}\n", year_of(1)),
            "Apr",
        ),
        (
            format!("Item,Year,Price,{MONTHS}\nTrowel,2024,4.5,{}\n", year_of(1)),
            "Jan",
        ),
        (
            "Item,Year,W1,W2,W3\nTrowel,2024,5,6,7\nRake,2024,1,2,3\n".to_string(),
            "W1",
        ),
        // One year's sheet without its year: had been refused at the item column, as periods
        // written wrongly; now at the first month, saying to add the year.
        (
            format!(
                "Item,{MONTHS}\nTrowel,{}\nRake,{}\n",
                year_of(1),
                year_of(3)
            ),
            "Jan",
        ),
    ] {
        check(
            &text,
            Expect {
                errors: vec![(1, first, first)],
                ..Expect::default()
            },
        );
    }
    // Years under another name: refused, asking to name them if they are calendar years.
    let season = read(&format!(
        "Item,Season,{MONTHS}\nTrowel,2023,{}\n",
        year_of(1)
    ));
    assert!(
        season.errors[0]
            .message
            .contains("column \"Season\" holds years"),
        "{season:#?}"
    );
    // A year named in capitals beyond ASCII (from memory, as Intake's other period words):
    // read, as lower case is.
    let upper = read(&format!(
        "Article,ANNÉE,{MONTHS}\nTrowel,2023,{}\n",
        year_of(1)
    ));
    assert_eq!(upper.layout, Layout::Across, "{upper:#?}");
    // A year named in German (from memory, as Intake's other period words): read.
    check(
        &format!(
            "Artikel;Jahr;{}\nTrowel;2023;{}\n",
            MONTHS.replace(',', ";"),
            year_of(1).replace(',', ";")
        ),
        Expect {
            items: Some(vec![(
                "Trowel",
                (1..=12).map(|v| Some(f64::from(v))).collect(),
            )]),
            ..Expect::default()
        },
    );
    let without_year = read(&format!("Item,{MONTHS}\nTrowel,{}\n", year_of(1)));
    assert!(
        without_year.errors[0]
            .message
            .contains("add a column \"Year\""),
        "{without_year:#?}"
    );
}

/// What spreadsheets put beside such a grid: notes and a total right of the months (not
/// read), a total row (left out as the items' total, as in every layout), item codes as
/// numbers under "Item".
#[test]
fn what_stands_beside_the_months_is_said() {
    let row = year_of(1);
    let total = year_of(2)
        .split(',')
        .map(|v| (v.parse::<u32>().unwrap() * 2 - 2).to_string())
        .collect::<Vec<_>>()
        .join(",");
    check(
        &format!(
            "Item,Year,{MONTHS},Notes\nTrowel,2023,{row},\nTrowel,2024,{row},promo\n\
             Rake,2024,{row},\nTotal,2024,{total},\n"
        ),
        Expect {
            warned: vec![vec!["\"Notes\"", "not used"], vec!["\"Total\"", "left out"]],
            ..Expect::default()
        },
    );
    let report = check(
        &format!("Item,Year,{MONTHS}\n1001,2023,{row}\n1002,2023,{row}\n"),
        Expect {
            frequency: Some(Frequency::Monthly),
            ..Expect::default()
        },
    );
    let names: Vec<&str> = report.items.iter().map(|i| i.name.as_str()).collect();
    assert_eq!(names, ["1001", "1002"]);
}

/// What a review of this layout found read wrongly, each failing before its mend: item codes
/// or a typo under "Year" taken for years (an item spread over centuries of gaps), figures
/// under "Last year" or "Year total" taken for each item's year, a name written in two cases
/// split into two items, annual totals under "Year" read as each item's own year.
#[test]
fn years_that_are_no_years_and_names_in_two_cases() {
    let rows = |years: &[&str]| -> String {
        years
            .iter()
            .enumerate()
            .map(|(i, y)| format!("Trowel,{y},{}\n", year_of(i as u32 + 1)))
            .collect()
    };
    // Codes 1001 to 1004 under "Year": not a year grid (refused as before, at the first).
    let codes = check(
        &format!(
            "Item,Year,{MONTHS}\n{}",
            rows(&["1001", "1002", "1003", "1004"])
        ),
        Expect {
            errors: vec![(2, "Year", "1001")],
            ..Expect::default()
        },
    );
    assert!(codes.items.is_empty());
    // One typo among years: refused at its cell, the rest read.
    for (typo, years) in [
        ("1005", ["2019", "2020", "2021", "1005"]),
        ("1999", ["2021", "2022", "2023", "1999"]),
        ("2042", ["2019", "2020", "2021", "2042"]),
    ] {
        let report = check(
            &format!("Item,Year,{MONTHS}\n{}", rows(&years)),
            Expect {
                errors: vec![(5, "Year", typo)],
                ..Expect::default()
            },
        );
        assert_eq!(
            report.items[0].values.iter().flatten().count(),
            36,
            "{typo}"
        );
    }
    for header in ["Last year", "Prior year", "Year total", "Fiscal year"] {
        let report = read(&format!(
            "Item,{header},{MONTHS}\nTrowel,2023,{}\nSeed tray,2024,{}\n",
            year_of(1),
            year_of(2)
        ));
        assert_ne!(report.layout, Layout::Across, "{header}: {report:#?}");
    }
    check(
        &format!(
            "Item,Year,{MONTHS}\nTrowel,2023,{}\ntrowel ,2024,{}\n",
            year_of(1),
            year_of(13)
        ),
        Expect {
            items: Some(vec![(
                "Trowel",
                (1..=24).map(|v| Some(f64::from(v))).collect(),
            )]),
            warned: vec![vec!["\"Trowel\"", "2 ways", "one item"]],
            ..Expect::default()
        },
    );
    let annual = read(&format!(
        "Item,Year,{MONTHS}\nTrowel,1978,{}\nSeed tray,2011,{}\nKneeling pad,1990,{}\n",
        year_of(1),
        year_of(2),
        year_of(3)
    ));
    assert_ne!(annual.layout, Layout::Across, "{annual:#?}");
}

/// What a reading of the code found (helper-51's review), each failing before its mend: this
/// year's sheet with its months still to come empty (those columns had no role and the grid
/// was refused), a text column named with a total's word left of the months ("Full name":
/// dropped from the names), a text column among the months (joined to every name), a
/// grand total row with its year left blank (an error), "Year total" right of the months
/// hiding that no year is written.
#[test]
fn what_the_code_review_found() {
    check(
        &format!(
            "Item,Year,{MONTHS}\nTrowel,2024,5,6,7,8,9,10,11,12,13,,,\n\
             Rake,2024,1,2,3,4,5,6,7,8,9,,,\n"
        ),
        Expect {
            items: Some(vec![
                (
                    "Trowel",
                    (5..=13)
                        .map(|v| Some(f64::from(v)))
                        .chain([None; 3])
                        .collect(),
                ),
                (
                    "Rake",
                    (1..=9)
                        .map(|v| Some(f64::from(v)))
                        .chain([None; 3])
                        .collect(),
                ),
            ]),
            warned: vec![vec!["2024-10 to 2024-12", "still to come"]],
            ..Expect::default()
        },
    );
    let report = check(
        &format!(
            "Full name,Year,{MONTHS}\nTrowel,2024,{}\nRake,2024,{}\n",
            year_of(1),
            year_of(2)
        ),
        Expect {
            layout: Some(Layout::Across),
            ..Expect::default()
        },
    );
    let names: Vec<&str> = report.items.iter().map(|i| i.name.as_str()).collect();
    assert_eq!(names, ["Trowel", "Rake"]);
    let among = read(
        "Item,Year,Jan,Feb,Mar,Note,Apr,May,Jun,Jul,Aug,Sep,Oct,Nov,Dec\n\
         Trowel,2024,1,2,3,promo,4,5,6,7,8,9,10,11,12\n",
    );
    assert_ne!(among.layout, Layout::Across, "{among:#?}");
    check(
        &format!(
            "Item,Year,{MONTHS}\nTrowel,2024,{}\nRake,2024,{}\nGrand total,,{}\n",
            year_of(1),
            year_of(1),
            (1..=12)
                .map(|v| (2 * v).to_string())
                .collect::<Vec<_>>()
                .join(",")
        ),
        Expect {
            warned: vec![vec!["row 4", "Grand total", "names a total and no year"]],
            ..Expect::default()
        },
    );
    let without = read(&format!(
        "Item,{MONTHS},Year total\nTrowel,{},78\n",
        year_of(1)
    ));
    assert!(
        without.errors[0].message.contains("add a column \"Year\""),
        "{without:#?}"
    );
}

/// A figure column under a header that mentions a year ("Last year", "Prior year") left of
/// the whole year's months, with no year anywhere: the year of the months is not written.
/// With one row the table had been read as a long table of January's figure alone (each other
/// column warned as not used), with two as periods written wrongly in the item column.
#[test]
fn last_years_figures_name_no_year_for_the_months() {
    for (rows, header) in [(1, "Last year"), (2, "Last year"), (2, "Prior year total")] {
        let text = format!(
            "Item,{header},{MONTHS}\nTrowel,120,{}\n{}",
            year_of(1),
            if rows == 2 {
                format!("Rake,80,{}\n", year_of(3))
            } else {
                String::new()
            }
        );
        let report = check(
            &text,
            Expect {
                errors: vec![(1, "Jan", "Jan")],
                ..Expect::default()
            },
        );
        assert!(
            report.errors[0].message.contains("add a column \"Year\""),
            "{text}: {report:#?}"
        );
    }
}

/// Last year's figures beside the year's own column ("Last year", "LY", "Vorjahr") are not
/// read, said; the grid is read ("Last year" had made it refused as a calendar grid; "Prior
/// year total" was left out before as a total, now said as another year's figures).
#[test]
fn last_years_figures_beside_the_year_are_not_read() {
    for header in ["Item,Year,Last year", "Item,Prior year total,Year"] {
        let first_year = if header.ends_with("Year") {
            "120,2024"
        } else {
            "2024,120"
        };
        check(
            &format!("{header},{MONTHS}\nTrowel,{first_year},{}\n", year_of(1)),
            Expect {
                layout: Some(Layout::Across),
                items: Some(vec![(
                    "Trowel",
                    (1..=12).map(|v| Some(f64::from(v))).collect(),
                )]),
                warned: vec![vec!["was not used", "another year's figures"]],
                ..Expect::default()
            },
        );
    }
}
