//! Till exports and fiscal years: columns that say how a sale was rung up (a till, a cashier,
//! a payment, a receipt) beside the item's name, and a year column that counts fiscal years
//! under a plain "Year" (found by a probe of hand-made files, 2026-12-05; each case failed
//! before its rule: the till split every product into a history per till, the receipts made
//! each sale an item of one period, the fiscal year put January to March a year early with
//! only a warning of rows out of order).

use super::expect::{check, some, Expect};
use morrowcast_engine::intake::Layout;

/// Rows of three days for two products, each sold at two tills (or by two cashiers, paid two
/// ways), under a header naming what tells the rows apart.
fn rung_up(header: &str, values: [&str; 2]) -> String {
    let mut text = format!("Date,{header},Item,Qty\n");
    for (day, base) in [("2024-03-01", 1), ("2024-03-02", 3), ("2024-03-03", 5)] {
        for item in ["Twine", "Frost cloth"] {
            for (k, value) in values.iter().enumerate() {
                text.push_str(&format!("{day},{value},{item},{}\n", base + k));
            }
        }
    }
    text
}

/// Each product is one history, its tills' rows added up, said with the column's values.
#[test]
fn tills_cashiers_payments_and_receipts_do_not_split_an_item() {
    for (header, values) in [
        ("Till", ["Till 1", "Till 2"]),
        ("Register ID", ["R1", "R2"]),
        ("Cashier", ["Wren", "Ash"]),
        ("Payment method", ["Cash", "Card"]),
        ("Cashier name", ["Moss", "Fern"]),
        ("Sold by", ["Moss", "Fern"]),
        ("Sales person", ["Moss", "Fern"]),
    ] {
        check(
            &rung_up(header, values),
            Expect {
                items: Some(vec![
                    ("Twine", some(&[3.0, 7.0, 11.0])),
                    ("Frost cloth", some(&[3.0, 7.0, 11.0])),
                ]),
                warned: vec![vec![
                    &format!("column \"{header}\""),
                    "was not used",
                    "rung up",
                    "added up across it",
                    "\"store\"",
                ]],
                layout: Some(Layout::Long),
                ..Expect::default()
            },
        );
    }
    // Receipt numbers under any header: a code of its own on most rows names sales.
    let mut text = String::from("Date,Ref,Item,Qty\n");
    for (n, day) in [
        "2024-03-01",
        "2024-03-01",
        "2024-03-02",
        "2024-03-02",
        "2024-03-03",
    ]
    .iter()
    .enumerate()
    {
        for item in ["Twine", "Seed packets"] {
            text.push_str(&format!("{day},S-{n}-{},{item},2\n", item.len()));
        }
    }
    check(
        &text,
        Expect {
            items: Some(vec![
                ("Twine", some(&[4.0, 4.0, 2.0])),
                ("Seed packets", some(&[4.0, 4.0, 2.0])),
            ]),
            warned: vec![vec!["column \"Ref\"", "10 of its 10 rows hold a code"]],
            ..Expect::default()
        },
    );
    // Receipts of several lines, each of one day, more receipts than days: sales, not items.
    let mut text = String::from("Date,Ref,Item,Qty\n");
    let mut codes = String::from("Date,Ref,Item,Qty\n");
    for day in 1..=4 {
        for receipt in 0..2 {
            for item in ["Twine", "Rake"] {
                text.push_str(&format!("2024-03-0{day},R-{day}{receipt},{item},1\n"));
                // The same lines under codes that recur every day: product codes, kept.
                codes.push_str(&format!("2024-03-0{day},P-{receipt},{item},1\n"));
            }
        }
    }
    check(
        &text,
        Expect {
            items: Some(vec![
                ("Twine", some(&[2.0, 2.0, 2.0, 2.0])),
                ("Rake", some(&[2.0, 2.0, 2.0, 2.0])),
            ]),
            warned: vec![vec![
                "column \"Ref\"",
                "8 codes each stand on rows of one period only",
            ]],
            ..Expect::default()
        },
    );
    let r = check(&codes, Expect::default());
    assert_eq!(r.items.len(), 4, "{:#?}", r.warnings);
    // Product numbers under an item's header beside a till are the items.
    check(
        "Date,SKU,Till,Qty\n2024-03-01,1001,T1,2\n2024-03-01,1001,T2,3\n2024-03-01,1002,T1,1\n\
         2024-03-02,1001,T2,4\n2024-03-02,1002,T1,5\n2024-03-02,1002,T2,1\n",
        Expect {
            items: Some(vec![
                ("1001", some(&[5.0, 4.0])),
                ("1002", some(&[1.0, 6.0])),
            ]),
            warned: vec![
                vec![
                    "column \"SKU\"",
                    "item codes",
                    "under a header naming items",
                ],
                vec!["column \"Till\"", "rung up"],
            ],
            ..Expect::default()
        },
    );
}

/// What names a place, a customer or the item stays part of the item's name; a till alone,
/// with nothing else naming items, is one history per till as before.
#[test]
fn places_customers_and_tills_alone_still_name_histories() {
    for header in ["Store", "Customer", "Till store"] {
        check(
            &rung_up(header, ["North", "South"]),
            Expect {
                items: Some(vec![
                    ("North / Twine", some(&[1.0, 3.0, 5.0])),
                    ("South / Twine", some(&[2.0, 4.0, 6.0])),
                    ("North / Frost cloth", some(&[1.0, 3.0, 5.0])),
                    ("South / Frost cloth", some(&[2.0, 4.0, 6.0])),
                ]),
                ..Expect::default()
            },
        );
    }
    check(
        "Date,Till,Qty\n2024-03-01,T1,2\n2024-03-01,T2,3\n2024-03-02,T1,4\n2024-03-02,T2,5\n",
        Expect {
            items: Some(vec![("T1", some(&[2.0, 4.0])), ("T2", some(&[3.0, 5.0]))]),
            ..Expect::default()
        },
    );
    // An item column whose names are mostly one row each stays the item column.
    let mut text = String::from("Date,Range,Item,Qty\n");
    for day in 1..=5 {
        for k in 0..2 {
            text.push_str(&format!("2024-03-0{day},Tools,Trowel {day}{k},1\n"));
        }
    }
    let r = check(&text, Expect::default());
    assert_eq!(r.items.len(), 10, "{:#?}", r.warnings);
}

/// Found by a second review (2026-12-05), each read as before the rule: product names
/// under a header holding a detail's word, product lines of a long-tail catalogue named once
/// each beside their category, and a calendar file with one January added late.
#[test]
fn products_under_sale_words_and_one_off_names_still_name_items() {
    for header in [
        "Basket",
        "Order type",
        "Ticket",
        "Server rack",
        "Checkout offer",
    ] {
        let r = check(
            &rung_up(header, ["Fruit basket", "Gift basket"]),
            Expect::default(),
        );
        assert_eq!(r.items.len(), 4, "{header}: {:#?}", r.warnings);
    }
    let mut text = String::from("Month,Category,Description,Qty\n");
    for m in 1..=6 {
        for (k, part) in ["Drive belt", "Spark plug"].iter().enumerate() {
            text.push_str(&format!("2024-{m:02},Mower,{part},{}\n", 3 + k));
        }
        for k in 0..2 {
            text.push_str(&format!("2024-{m:02},Trimmer,Spool {m}{k} line,1\n"));
        }
    }
    let r = check(&text, Expect::default());
    assert_eq!(r.items.len(), 14, "{:#?}", r.warnings);
    let late_january: String = std::iter::once("Year,Month,Sales\n".to_string())
        .chain((2..=12).chain([1]).map(|m| format!("2022,{m},{m}\n")))
        .chain((1..=12).map(|m| format!("2023,{m},{m}\n")))
        .collect();
    check(
        &late_january,
        Expect {
            warned: vec![vec!["not in time order"]],
            ..Expect::default()
        },
    );
}

/// Monthly rows of a fiscal year from April under a plain "Year".
fn fiscal(item_major: bool) -> String {
    let months = [
        "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec", "Jan", "Feb", "Mar",
    ];
    let mut text = String::from("Year,Month,Item,Sales\n");
    let mut rows: Vec<(usize, String)> = Vec::new();
    for (y, year) in [2022, 2023].iter().enumerate() {
        for (m, month) in months.iter().enumerate() {
            for (i, item) in ["Twine", "Seed packets"].iter().enumerate() {
                let order = if item_major {
                    i * 100 + y * 12 + m
                } else {
                    (y * 12 + m) * 2 + i
                };
                rows.push((order, format!("{year},{month},{item},{}\n", 10 + m)));
            }
        }
    }
    rows.sort();
    text.extend(rows.into_iter().map(|(_, row)| row));
    text
}

/// A year whose months run April to March is a fiscal year: refused at the first January,
/// in a table going period by period (line 20: two items a month) or item by item (line 11);
/// a single history too.
#[test]
fn a_fiscal_year_under_a_plain_year_is_refused() {
    check(
        &fiscal(false),
        Expect {
            errors: vec![(20, "Year", "2022 Jan")],
            ..Expect::default()
        },
    );
    // Newest first: read backwards, refused at the same January.
    let newest_first: String = {
        let text = fiscal(true);
        let mut lines: Vec<&str> = text.lines().collect();
        let header = lines.remove(0);
        lines.reverse();
        std::iter::once(header)
            .chain(lines)
            .map(|l| format!("{l}\n"))
            .collect()
    };
    let r = check(
        &newest_first,
        Expect {
            errors: vec![(4, "Year", "2023 Jan")],
            ..Expect::default()
        },
    );
    assert!(
        r.errors.iter().any(|e| e.message.contains("fiscal year")),
        "{:#?}",
        r.errors
    );
    check(
        &fiscal(true),
        Expect {
            errors: vec![(11, "Year", "2022 Jan")],
            ..Expect::default()
        },
    );
    let r = check(
        "Year,Month,Sales\n2023,10,5\n2023,11,6\n2023,12,7\n2023,1,8\n2023,2,9\n2023,3,10\n",
        Expect {
            errors: vec![(5, "Year", "2023-01")],
            ..Expect::default()
        },
    );
    assert!(
        r.errors[0].message.contains("fiscal year"),
        "{:#?}",
        r.errors
    );
}

/// Calendar years stay read: one item's year ending where the next item's begins, and months
/// in no order at all (alphabetical: a layout, sorted).
#[test]
fn calendar_years_in_any_order_are_not_taken_for_fiscal_ones() {
    check(
        "Year,Month,Item,Sales\n2022,11,Twine,1\n2022,12,Twine,2\n2022,1,Seeds,3\n2022,2,Seeds,4\n\
         2022,3,Seeds,5\n",
        Expect {
            items: Some(vec![
                ("Twine", some(&[1.0, 2.0])),
                ("Seeds", some(&[3.0, 4.0, 5.0])),
            ]),
            ..Expect::default()
        },
    );
    check(
        "Year,Month,Sales\n2023,Apr,4\n2023,Aug,8\n2023,Dec,12\n2023,Feb,2\n2023,Jan,1\n\
         2023,Jul,7\n2023,Jun,6\n2023,Mar,3\n2023,May,5\n2023,Nov,11\n2023,Oct,10\n2023,Sep,9\n",
        Expect {
            items: Some(vec![(
                "Sales",
                some(&[
                    1.0, 2.0, 3.0, 4.0, 5.0, 6.0, 7.0, 8.0, 9.0, 10.0, 11.0, 12.0,
                ]),
            )]),
            ..Expect::default()
        },
    );
}
