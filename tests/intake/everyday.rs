//! Everyday export shapes a third review of the day's intake change read wrongly (about 90
//! files a shop or a planner would export): the quantity among price, size and takings
//! columns, times of day beside dates, order and customer numbers beside items, week numbers
//! written as six digits, items whose names hold a row word, a month in another language
//! across the header, a total beside one item, store subtotals. Each test failed before its
//! fix.
//!
//! Kept apart from: the export shapes of the first two reviews (`exports`) and the misreads
//! of mutated files (`misreads`).

use morrowcast_engine::calendar::Frequency;
use morrowcast_engine::intake::{read, Layout};

use super::expect::{check, some, Expect};

// A long table's quantity is the column that counts goods ("Count", "Pcs", "Qty sold"), not
// a price, a bag size or the takings ("Net sales", "Amount", "Sales (£)", "RRP"), which had
// been planned as demand when their header came first or named a quantity.
#[test]
fn the_quantity_is_the_count_of_goods_not_money_or_size() {
    for (header, rows) in [
        (
            "Date,Item,Unit price,Count",
            ["4.99,12", "4.99,7", "5.49,9"],
        ),
        ("Date,Item,Bag size (L),Pcs", ["40,12", "40,7", "40,9"]),
        ("Date,Item,RRP,Pieces", ["4.99,12", "4.99,7", "5.49,9"]),
        (
            "Date,Item,Net sales,Qty sold",
            ["59.88,12", "34.93,7", "49.41,9"],
        ),
        ("Date,Item,Amount,Qty", ["59.88,12", "34.93,7", "49.41,9"]),
        (
            "Date,Item,Sales (£),Units",
            ["59.88,12", "34.93,7", "49.41,9"],
        ),
        ("Date,Item,Value,Qty", ["59.88,12", "34.93,7", "49.41,9"]),
        // Every currency sign a number cell may carry marks money in a header too (the
        // header test had known four, and "Sales (₹)" was read as the quantity here).
        (
            "Date,Item,Sales (₹),Other",
            ["59.88,12", "34.93,7", "49.41,9"],
        ),
        (
            "Date,Item,Takings ₩,Other",
            ["59.88,12", "34.93,7", "49.41,9"],
        ),
    ] {
        let mut text = format!("{header}\n");
        for (day, row) in rows.iter().enumerate() {
            text.push_str(&format!("2024-01-0{},Rose fertiliser,{row}\n", day + 1));
        }
        check(
            &text,
            Expect {
                items: Some(vec![("Rose fertiliser", some(&[12.0, 7.0, 9.0]))]),
                layout: Some(Layout::Long),
                ..Expect::default()
            },
        );
    }
}

// Money beside one quantity column: a header with any currency sign is left out, not planned
// as an item ("Sales (₹)" had been, so its takings would have been ordered as goods).
#[test]
fn a_money_column_beside_one_quantity_is_left_out_whatever_its_currency() {
    for sign in ["£", "₹", "₽", "฿", "R$"] {
        check(
            &format!("Date,Sales ({sign}),Qty\n2024-01-01,59.88,12\n2024-01-02,34.93,7\n"),
            Expect {
                items: Some(vec![("Qty", some(&[12.0, 7.0]))]),
                warned: vec![vec!["names a price, an amount of money"]],
                ..Expect::default()
            },
        );
    }
}

// Times of day beside dates are calendar details: in a till export (date, time, item, qty)
// each sale had become an item ("09:15 / Rose fertiliser"); now the day's sales are summed,
// with warnings. Beside one column of values too (several times a day had been an error).
#[test]
fn times_of_day_are_not_items() {
    check(
        "Date,Time,Item,Qty\n2024-03-01,09:15,Rose fertiliser,2\n2024-03-01,10:02,Seed trays,4\n2024-03-01,11:40,Rose fertiliser,1\n2024-03-02,09:05,Seed trays,3\n2024-03-02,14:30,Rose fertiliser,5\n",
        Expect {
            items: Some(vec![
                ("Rose fertiliser", some(&[3.0, 5.0])),
                ("Seed trays", some(&[4.0, 3.0])),
            ]),
            warned: vec![
                vec!["\"Time\"", "calendar details", "times of day"],
                vec!["summed"],
            ],
            layout: Some(Layout::Long),
            ..Expect::default()
        },
    );
    check(
        "Date,Time,Compost\n2024-03-01,09:00,2\n2024-03-01,13:00,3\n2024-03-02,09:00,4\n",
        Expect {
            items: Some(vec![("Compost", some(&[5.0, 4.0]))]),
            warned: vec![vec!["1 row shares its day with an earlier row"]],
            ..Expect::default()
        },
    );
}

// Order and customer numbers number transactions: joined to the item they had split every
// item into one-period items ("Rose fertiliser / 5001"). Now they are not used, and the
// day's rows are summed.
#[test]
fn order_and_customer_numbers_do_not_split_items() {
    for header in ["Date,Order ID,Item,Qty", "Date,Customer ID,Item,Qty"] {
        check(
            &format!("{header}\n2024-03-01,5001,Rose fertiliser,2\n2024-03-01,5001,Seed tray,4\n2024-03-01,5002,Rose fertiliser,1\n2024-03-02,5003,Seed tray,3\n2024-03-02,5004,Rose fertiliser,5\n2024-03-02,5004,Seed tray,2\n"),
            Expect {
                items: Some(vec![
                    ("Rose fertiliser", some(&[3.0, 5.0])),
                    ("Seed tray", some(&[4.0, 5.0])),
                ]),
                warned: vec![vec!["not used"], vec!["summed"]],
                ..Expect::default()
            },
        );
    }
}

// Six digits under a week's name are ISO weeks (`Year week` 202401 had been read as January
// 2024, weeks 13 on refused); "Calendar week" over 01.2024, first an error rather than an
// item, is week.year since 2026-12-04 (formats.rs has the rest).
#[test]
fn six_digit_weeks_are_weeks() {
    let mut text = String::from("Year week,Compost\n");
    for week in 1..=20 {
        text.push_str(&format!("2024{week:02},{}\n", 10 + week));
    }
    let report = check(
        &text,
        Expect {
            frequency: Some(Frequency::Weekly),
            ..Expect::default()
        },
    );
    assert_eq!(report.items[0].periods[19].to_string(), "2024-W20");
    let report = read("Calendar week;Compost\n01.2024;11\n02.2024;12\n03.2024;13\n");
    assert!(report.errors.is_empty(), "{:?}", report.errors);
    assert_eq!(report.items[0].periods[2].to_string(), "2024-W03");
}

// Items whose names hold a row word ("Row cover fleece", "Plant ID tags", "Index cards") had
// been left out as row numbers when their numbers all differed.
#[test]
fn items_named_with_row_words_are_items() {
    check(
        "Date,Row cover fleece,Plant ID tags,Index cards,Cloche\n2024-01,22,5,40,3\n2024-02,23,6,41,3\n2024-03,25,8,43,3\n",
        Expect {
            items: Some(vec![
                ("Row cover fleece", some(&[22.0, 23.0, 25.0])),
                ("Plant ID tags", some(&[5.0, 6.0, 8.0])),
                ("Index cards", some(&[40.0, 41.0, 43.0])),
                ("Cloche", some(&[3.0; 3])),
            ]),
            ..Expect::default()
        },
    );
}

// A month in another language across the header ("Mär 2024") had been left out as a word,
// its demand read as gaps; now it is an error at the header. A total beside one item, equal
// to it, is left out as a total.
#[test]
fn a_year_in_an_unread_header_is_an_error_and_a_lone_total_goes() {
    let report = read("Artikel;Jan 2024;Feb 2024;Mär 2024\nKompost;5;6;7\nMulch;3;4;5\n");
    let columns: Vec<&str> = report.errors.iter().map(|e| e.column.as_str()).collect();
    assert_eq!(columns, ["Mär 2024"]);
    check(
        "Date,Compost,Total\n2024-01,12,12\n2024-02,8,8\n2024-03,9,9\n",
        Expect {
            items: Some(vec![("Compost", some(&[12.0, 8.0, 9.0]))]),
            warned: vec![vec!["\"Total\"", "left out"]],
            ..Expect::default()
        },
    );
}

// Store subtotals ("All stores" rows), each the sum of its item's rows at the stores, are
// left out as subtotals; they had been planned as items, their demand ordered twice.
#[test]
fn store_subtotals_are_left_out() {
    let mut text = String::from("Store,Month,Item,Units\n");
    for (store, oak, clay) in [
        ("Oakfield", [5, 6, 7], [1, 2, 3]),
        ("Riverside", [3, 4, 2], [2, 2, 2]),
        ("All stores", [8, 10, 9], [3, 4, 5]),
    ] {
        for m in 0..3 {
            text.push_str(&format!("{store},2024-0{},Oak tray,{}\n", m + 1, oak[m]));
            text.push_str(&format!("{store},2024-0{},Clay pot,{}\n", m + 1, clay[m]));
        }
    }
    check(
        &text,
        Expect {
            items: Some(vec![
                ("Oakfield / Oak tray", some(&[5.0, 6.0, 7.0])),
                ("Oakfield / Clay pot", some(&[1.0, 2.0, 3.0])),
                ("Riverside / Oak tray", some(&[3.0, 4.0, 2.0])),
                ("Riverside / Clay pot", some(&[2.0, 2.0, 2.0])),
            ]),
            warned: vec![
                vec!["\"All stores / Oak tray\"", "subtotal", "left out"],
                vec!["\"All stores / Clay pot\"", "subtotal", "left out"],
            ],
            ..Expect::default()
        },
    );
}

// A report's store row, its product cell empty, sums the store's products: it was planned as
// an item beside them without a word (review60 13b). Left out as their subtotal, said; with
// the store written once over its rows too. A store row that does not add up stays an item,
// said (it may be a total that does not add up, or sales of no product).
#[test]
fn a_groups_own_row_over_its_items_is_their_subtotal() {
    for text in [
        "Store,Product,2024-01,2024-02,2024-03\nOak Lane,,5,6,6\nOak Lane,Trowel,3,4,3\n\
         Oak Lane,Rake,2,2,3\nMill Road,,6,7,7\nMill Road,Trowel,5,6,5\nMill Road,Rake,1,1,2\n",
        "Store,Product,2024-01,2024-02,2024-03\nOak Lane,,5,6,6\n,Trowel,3,4,3\n,Rake,2,2,3\n\
         Mill Road,,6,7,7\n,Trowel,5,6,5\n,Rake,1,1,2\n",
    ] {
        check(
            text,
            Expect {
                items: Some(vec![
                    ("Oak Lane / Trowel", some(&[3.0, 4.0, 3.0])),
                    ("Oak Lane / Rake", some(&[2.0, 2.0, 3.0])),
                    ("Mill Road / Trowel", some(&[5.0, 6.0, 5.0])),
                    ("Mill Road / Rake", some(&[1.0, 1.0, 2.0])),
                ]),
                warned: vec![
                    vec![
                        "\"Oak Lane\" equals the sum of the 2 items",
                        "subtotal",
                        "left out",
                    ],
                    vec![
                        "\"Mill Road\" equals the sum of the 2 items",
                        "subtotal",
                        "left out",
                    ],
                ],
                ..Expect::default()
            },
        );
    }
    // Over one product: kept, and said.
    check(
        "Store,Product,2024-01,2024-02,2024-03\nMill Road,,5,6,5\nMill Road,Trowel,5,6,5\n\
         Oak Lane,Rake,2,2,3\n",
        Expect {
            items: Some(vec![
                ("Mill Road", some(&[5.0, 6.0, 5.0])),
                ("Mill Road / Trowel", some(&[5.0, 6.0, 5.0])),
                ("Oak Lane / Rake", some(&[2.0, 2.0, 3.0])),
            ]),
            warned: vec![vec![
                "\"Mill Road\" equals \"Mill Road / Trowel\" in each of the 3 periods",
                "planned as an item",
            ]],
            ..Expect::default()
        },
    );
    check(
        "Store,Product,2024-01,2024-02,2024-03\nOak Lane,,9,6,6\nOak Lane,Trowel,3,4,3\n\
         Oak Lane,Rake,2,2,3\n",
        Expect {
            items: Some(vec![
                ("Oak Lane", some(&[9.0, 6.0, 6.0])),
                ("Oak Lane / Trowel", some(&[3.0, 4.0, 3.0])),
                ("Oak Lane / Rake", some(&[2.0, 2.0, 3.0])),
            ]),
            warned: vec![vec![
                "\"Oak Lane\" lacks the rest of its name beside 2 items that have it \
                 (\"Oak Lane / Trowel\", \"Oak Lane / Rake\")",
                "not their sum",
                "planned as an item of its own",
            ]],
            ..Expect::default()
        },
    );
}

// From a fourth review (interactions of the day's rules): a price or an order number beside
// the quantities of a single or wide table had been planned as an item, silently.
#[test]
fn prices_and_order_numbers_are_not_items() {
    for (header, expected) in [
        ("Date,Unit price,Sales units", "\"Unit price\""),
        ("Date,Order ID,Qty", "\"Order ID\""),
        ("Date,Invoice no,Qty", "\"Invoice no\""),
    ] {
        let text = format!("{header}\n2024-01,4.99,12\n2024-02,5.49,7\n2024-03,4.99,9\n");
        let report = check(
            &text,
            Expect {
                warned: vec![vec![expected, "not a quantity", "not used"]],
                layout: Some(Layout::Single),
                ..Expect::default()
            },
        );
        assert_eq!(report.items[0].values, some(&[12.0, 7.0, 9.0]));
    }
    // An item whose name merely holds such a word stays an item.
    let report = read("Date,Price tag gun,Oak tray\n2024-01,2,12\n2024-02,3,7\n2024-03,1,9\n");
    assert_eq!(report.items.len(), 2);
    // Of two counts, the one without a unit of measure is the quantity.
    let report =
        read("Date,Product,Qty (kg),Units\n2024-01,Bark mulch,250,10\n2024-02,Bark mulch,300,12\n");
    assert_eq!(report.items[0].values, some(&[10.0, 12.0]));
}

// Totals as other programs and languages write them, subtotal rows with a grand total, and
// the subtotal rows' "X Total" names.
#[test]
fn totals_in_other_words_and_subtotal_rows() {
    for name in [
        "Total:",
        "TOTAL",
        "Gesamt",
        "Totaal",
        "Summe",
        "Grand Total",
    ] {
        let text = format!(
            "Date,Oak tray,Pine tray,{name}\n2024-01,5,2,7\n2024-02,6,3,9\n2024-03,7,4,11\n"
        );
        let report = read(&text);
        assert_eq!(report.items.len(), 2, "{name}: {:?}", report.warnings);
    }
    let report =
        read("Date,Oak tray,Pine tray,Total (all)\n2024-01,5,2,7\n2024-02,6,3,9\n2024-03,7,4,12\n");
    assert!(report
        .warnings
        .iter()
        .any(|w| w.contains("named like a total")));
    check(
        "Store,Product,2024-01,2024-02,2024-03\nNorth,Oak tray,5,6,7\nNorth,Pine tray,1,2,3\nNorth Total,,6,8,10\nSouth,Oak tray,2,2,2\nSouth,Pine tray,3,3,3\nSouth Total,,5,5,5\nGrand Total,,11,13,15\n",
        Expect {
            items: Some(vec![
                ("North / Oak tray", some(&[5.0, 6.0, 7.0])),
                ("North / Pine tray", some(&[1.0, 2.0, 3.0])),
                ("South / Oak tray", some(&[2.0, 2.0, 2.0])),
                ("South / Pine tray", some(&[3.0, 3.0, 3.0])),
            ]),
            warned: vec![
                vec!["\"North Total\"", "subtotal", "left out"],
                vec!["\"Grand Total\"", "total", "left out"],
            ],
            layout: Some(Layout::Across),
            ..Expect::default()
        },
    );
}

// Calendar details among the day's rules: a week column beside a year and a month makes weeks;
// a number or weekday column beside the item names of a table across is left out; products
// named like months under a header that names items are items; a title repeated with the
// header is skipped.
#[test]
fn calendar_details_in_company() {
    check(
        "Year,Month,Week,Qty\n2024,1,1,5\n2024,1,2,6\n2024,1,3,7\n",
        Expect {
            periods: Some(vec!["2024-W01", "2024-W02", "2024-W03"]),
            warned: vec![vec!["\"Month\"", "calendar details"]],
            ..Expect::default()
        },
    );
    for text in [
        "Product,Launch month,2024-01,2024-02,2024-03\nOak tray,3,5,6,7\nPine tray,5,2,3,4\n",
        "Product,Weekday,2024-01,2024-02,2024-03\nOak tray,Mon,5,6,7\nPine tray,Tue,2,3,4\n",
    ] {
        let report = read(text);
        assert_eq!(report.layout, Layout::Across, "{text}: {:?}", report.errors);
        assert_eq!(report.items[0].values, some(&[5.0, 6.0, 7.0]), "{text}");
        assert!(report.warnings.iter().any(|w| w.contains("not used")));
    }
    check(
        "Date,Product,Qty\n2024-01,May,5\n2024-01,June,2\n2024-02,May,6\n2024-02,June,3\n",
        Expect {
            items: Some(vec![
                ("May", some(&[5.0, 6.0])),
                ("June", some(&[2.0, 3.0])),
            ]),
            ..Expect::default()
        },
    );
    check(
        "Sales report\nDate,Oak tray,Pine tray\n2024-01,5,2\n2024-02,6,3\nSales report\nDate,Oak tray,Pine tray\n2024-03,7,4\n",
        Expect {
            items: Some(vec![
                ("Oak tray", some(&[5.0, 6.0, 7.0])),
                ("Pine tray", some(&[2.0, 3.0, 4.0])),
            ]),
            warned: vec![vec!["lines 5, 6 repeat the header"]],
            ..Expect::default()
        },
    );
}

// A report writes its store or category once over its rows: the rows below were items
// without their store, and the same product at two stores refused as one item. Each empty
// cell reads as the group above, said; a code column never does ("Vendor SKU" neither),
// nor a column that writes a group twice (an empty store there is no store: web sales).
#[test]
fn a_group_written_once_over_its_rows_names_each_row() {
    check(
        "Store,Product,2024-01,2024-02,2024-03\nOak Lane,Trowel,3,4,3\n,Rake,2,2,3\n,Hoe,1,1,1\n\
         Mill Road,Trowel,5,6,5\n,Rake,1,1,2\n",
        Expect {
            items: Some(vec![
                ("Oak Lane / Trowel", some(&[3.0, 4.0, 3.0])),
                ("Oak Lane / Rake", some(&[2.0, 2.0, 3.0])),
                ("Oak Lane / Hoe", some(&[1.0, 1.0, 1.0])),
                ("Mill Road / Trowel", some(&[5.0, 6.0, 5.0])),
                ("Mill Road / Rake", some(&[1.0, 1.0, 2.0])),
            ]),
            warned: vec![vec![
                "the column \"Store\" is written once over its rows: 3 rows with it empty are \
                 read as the Store above: row 3 as \"Oak Lane\", row 4 as \"Oak Lane\", row 6 \
                 as \"Mill Road\"",
            ]],
            ..Expect::default()
        },
    );
    // A row that filled would repeat another (a total over the stores, its store empty) says
    // the empty cell is no store: left as written.
    check(
        "Store,Item,2024-01,2024-02\n1,Trowel,1,2\n2,Trowel,101,102\n,Trowel,102,104\n",
        Expect {
            items: Some(vec![
                ("1 / Trowel", some(&[1.0, 2.0])),
                ("2 / Trowel", some(&[101.0, 102.0])),
                ("Trowel", some(&[102.0, 104.0])),
            ]),
            ..Expect::default()
        },
    );
    // A region over stores, both written once.
    check(
        "Region,Store,Product,2024-01,2024-02\nNorth,Oak Lane,Trowel,3,4\n,,Rake,2,2\n\
         ,Mill Road,Trowel,5,6\n,,Rake,1,1\nSouth,Station kiosk,Trowel,4,4\n,,Rake,1,2\n",
        Expect {
            items: Some(vec![
                ("North / Oak Lane / Trowel", some(&[3.0, 4.0])),
                ("North / Oak Lane / Rake", some(&[2.0, 2.0])),
                ("North / Mill Road / Trowel", some(&[5.0, 6.0])),
                ("North / Mill Road / Rake", some(&[1.0, 1.0])),
                ("South / Station kiosk / Trowel", some(&[4.0, 4.0])),
                ("South / Station kiosk / Rake", some(&[1.0, 2.0])),
            ]),
            ..Expect::default()
        },
    );
    // A code beside a group word is a code: never filled.
    check(
        "Vendor SKU,Description,2024-01,2024-02\nSUP-100,Birch trellis,3,4\n,Rain barrel,2,2\n\
         SUP-200,Kneeling pad,1,1\n,Hose,5,5\n",
        Expect {
            items: Some(vec![
                ("SUP-100 / Birch trellis", some(&[3.0, 4.0])),
                ("Rain barrel", some(&[2.0, 2.0])),
                ("SUP-200 / Kneeling pad", some(&[1.0, 1.0])),
                ("Hose", some(&[5.0, 5.0])),
            ]),
            ..Expect::default()
        },
    );
    // A code left empty is no code.
    check(
        "Code,Description,2024-01,2024-02\nFG-1,Birch trellis,3,4\n,Rain barrel,2,2\n",
        Expect {
            items: Some(vec![
                ("FG-1 / Birch trellis", some(&[3.0, 4.0])),
                ("Rain barrel", some(&[2.0, 2.0])),
            ]),
            ..Expect::default()
        },
    );
    // A store written on every row: the empty one is web sales, no store.
    check(
        "Store,Product,2024-01,2024-02\nOak Lane,Trowel,3,4\nOak Lane,Rake,2,2\n,Rake,7,7\n",
        Expect {
            items: Some(vec![
                ("Oak Lane / Trowel", some(&[3.0, 4.0])),
                ("Oak Lane / Rake", some(&[2.0, 2.0])),
                ("Rake", some(&[7.0, 7.0])),
            ]),
            ..Expect::default()
        },
    );
}

// A store cell left empty on a few rows made those rows an item of their own ("Milk" beside
// "North / Milk" and "South / Milk") without a word; now a warning names them, their lines and
// the empty column. A product without a variant among variants of others is not warned about.
#[test]
fn rows_leaving_an_item_column_empty_are_named() {
    check(
        "store,item,month,qty\nNorth,Milk,2023-01,5\nSouth,Milk,2023-01,4\nNorth,Milk,2023-02,6\n,Milk,2023-02,3\nSouth,Milk,2023-03,2\nNorth,Milk,2023-03,1\n",
        Expect {
            warned: vec![vec![
                "read as items of their own",
                "\"Milk\" (line 5; \"store\" empty; as in \"North / Milk\" and \"South / Milk\")",
            ]],
            ..Expect::default()
        },
    );
    let report = read(
        "product,variant,month,qty\nTee,Small,2023-01,5\nTee,Large,2023-01,4\nMug,,2023-01,3\nTee,Small,2023-02,6\nTee,Large,2023-02,2\nMug,,2023-02,1\n",
    );
    assert!(
        report
            .warnings
            .iter()
            .all(|w| !w.contains("items of their own")),
        "{:#?}",
        report.warnings
    );
    assert_eq!(report.items.len(), 3, "{:#?}", report.items);
}

// A till's export with a date and time in one column ("2024-01-05 14:32", ISO 8601's
// "2024-01-05T14:32:00Z", "05/01/2024 2:32 PM") had every row refused; each row is now read by
// its date, rows of one item and day added up, with a warning that the times were left out.
#[test]
fn dates_with_times_of_day_are_read_by_their_date() {
    for (text, first) in [
        (
            "Date/Time,Item,Qty\n2024-01-05 14:32,Oak tray,2\n2024-01-05 16:10,Oak tray,1\n2024-01-06 09:05,Oak tray,4\n2024-01-07 11:00,Oak tray,3\n",
            "2024-01-05 14:32",
        ),
        (
            "Sold at,Item,Qty\n2024-01-05T14:32:00Z,Oak tray,2\n2024-01-05T16:10:00.5+01:00,Oak tray,1\n2024-01-06T09:05:00Z,Oak tray,4\n2024-01-07T00:00:00Z,Oak tray,3\n",
            "2024-01-05T14:32:00Z",
        ),
        (
            "Date,Item,Qty\n05/01/2024 2:32 PM,Oak tray,2\n05/01/2024 4:10 PM,Oak tray,1\n06/01/2024 9:05 AM,Oak tray,4\n13/01/2024 11:00 AM,Oak tray,3\n",
            "05/01/2024 2:32 PM",
        ),
        // A zone written apart, and a comma before the fraction of a second (ISO 8601 allows
        // it): these had been refused.
        (
            "Sold at,Item,Qty\n2024-01-05 14:32:05 UTC,Oak tray,2\n2024-01-05 16:10:00 +01:00,Oak tray,1\n\"2024-01-06T09:05:00,250Z\",Oak tray,4\n2024-01-07 11:00:00 GMT,Oak tray,3\n",
            "2024-01-05 14:32:05 UTC",
        ),
    ] {
        let report = check(
            text,
            Expect {
                warned: vec![
                    vec!["carry a time of day", first, "read by its date"],
                    vec!["summed"],
                ],
                frequency: Some(Frequency::Daily),
                ..Expect::default()
            },
        );
        assert_eq!(report.items[0].values[..2], [Some(3.0), Some(4.0)], "{text}");
    }
}

// Local midnights written in UTC from east of Greenwich (2022-12-31T23:00:00.000Z for January
// in a shop an hour ahead) had every month read one early; a column whose every time is the
// same zoned time from 10:00 on is now refused at its first cell. West of Greenwich (05:00Z)
// the dates are right and read.
#[test]
fn local_midnights_written_in_utc_are_refused() {
    let mut east = String::from("month,sales\n");
    let mut west = String::from("month,sales\n");
    for (m, v) in [(1, 5), (2, 6), (3, 7)] {
        let (y, before) = if m == 1 { (2022, 12) } else { (2023, m - 1) };
        let last = [31, 31, 28][(m - 1) as usize];
        east.push_str(&format!("{y}-{before:02}-{last:02}T23:00:00.000Z,{v}\n"));
        west.push_str(&format!("2023-{m:02}-01T05:00:00Z,{v}\n"));
    }
    check(
        &east,
        Expect {
            errors: vec![(2, "month", "2022-12-31T23:00:00.000Z")],
            ..Expect::default()
        },
    );
    check(
        &west,
        Expect {
            periods: Some(vec!["2023-01", "2023-02", "2023-03"]),
            warned: vec![vec!["carry a time of day"]],
            ..Expect::default()
        },
    );
}

// Timed rows of one series or a wide table (a till's log of one product, an hourly meter):
// each day's second row had been refused, one error per row (1,380 for an hourly file); a
// day's rows are now added up, as a long table's are, with a warning. Two rows of one day
// without times stay an error: nothing tells them apart.
#[test]
fn timed_rows_of_a_day_in_one_series_or_a_wide_table_are_added_up() {
    check(
        "timestamp,kwh\n2024-01-05 00:00,5\n2024-01-05 02:00,7\n2024-01-06 01:00,4\n",
        Expect {
            items: Some(vec![("kwh", some(&[12.0, 4.0]))]),
            periods: Some(vec!["2024-01-05", "2024-01-06"]),
            warned: vec![vec![
                "1 row shares its day with an earlier row",
                "each day's quantities are added up",
            ]],
            ..Expect::default()
        },
    );
    check(
        "Sold at,Oak tray,Slate planter\n2024-01-05T09:30:00Z,1,\n2024-01-05T14:10:00Z,2,1\n\
         2024-01-06T10:00:00Z,,\n2024-01-07T11:00:00Z,3,2\n",
        Expect {
            items: Some(vec![
                ("Oak tray", vec![Some(3.0), None, Some(3.0)]),
                ("Slate planter", vec![Some(1.0), None, Some(2.0)]),
            ]),
            warned: vec![
                vec!["\"Slate planter\": 1 empty cell on days with other rows added nothing to them (2024-01-05)"],
                vec!["\"Oak tray\": 1 empty cell read as a gap (2024-01-06)"],
            ],
            ..Expect::default()
        },
    );
    // A time column beside the date tells the rows apart too.
    check(
        "date,time,qty\n2024-01-05,09:30,2\n2024-01-05,14:10,1\n2024-01-06,10:00,4\n",
        Expect {
            items: Some(vec![("qty", some(&[3.0, 4.0]))]),
            warned: vec![vec!["1 row shares its day with an earlier row"]],
            ..Expect::default()
        },
    );
    // A time repeated on one day (an export pasted twice, "09:00" and "9:00:00" alike) is an
    // error at the repeat, naming the line with that time; 9 AM and 9 PM are two times.
    let report =
        read("timestamp,kwh\n2024-01-05 09:00,5\n2024-01-05 10:00,7\n2024-01-05 9:00:00,5\n");
    assert_eq!(report.errors.len(), 1, "{:#?}", report.errors);
    assert_eq!(report.errors[0].row, 4);
    assert!(
        report.errors[0]
            .message
            .contains("2024-01-05 at that time of day is also on line 2"),
        "{}",
        report.errors[0].message
    );
    check(
        "Date,Qty\n05/01/2024 9:00 AM,2\n05/01/2024 9:00 PM,1\n06/01/2024 9:00 AM,4\n",
        Expect {
            items: Some(vec![("Qty", some(&[3.0, 4.0]))]),
            ..Expect::default()
        },
    );
    // Without times, or with a time on one row only: an error at the second row.
    for text in [
        "date,kwh\n2024-01-05,5\n2024-01-05,7\n",
        "date,kwh\n2024-01-05,5\n2024-01-05 02:00,7\n",
        "date,kwh\n2024-01-05 02:00,5\n2024-01-05 02:00,7\n",
        "date,weekday,kwh\n2024-01-05,Fri,5\n2024-01-05,Fri,7\n",
    ] {
        let report = read(text);
        assert_eq!(report.errors.len(), 1, "{text}: {:#?}", report.errors);
        assert_eq!(report.errors[0].row, 3);
        assert!(report.errors[0]
            .message
            .contains("keep one of the two rows"));
    }
}

// A wide table where one item starts late and another stops early: the empty cells before
// the first value and after the last are not gaps (they had been said to be "read as gaps",
// and the item list gave every item the table's whole span); the one inside is. Next months
// written ahead with no figure do not move the file's end.
#[test]
fn empty_cells_outside_an_items_history_are_said_apart_from_its_gaps() {
    let report = check(
        "month,Twine,Trowel,Rake\n2024-01,5,,9\n2024-02,6,,8\n2024-03,7,3,\n2024-04,8,,7\n\
         2024-05,9,4,\n2024-06,,,\n",
        Expect {
            items: Some(vec![
                (
                    "Twine",
                    some(&[5.0, 6.0, 7.0, 8.0, 9.0])
                        .into_iter()
                        .chain([None])
                        .collect(),
                ),
                ("Trowel", vec![None, None, Some(3.0), None, Some(4.0), None]),
                (
                    "Rake",
                    vec![Some(9.0), Some(8.0), None, Some(7.0), None, None],
                ),
            ]),
            warned: vec![
                vec![
                    "\"Trowel\": 2 empty cells before its first value (2024-03) left out \
                     (2024-01 to 2024-02): its history starts there",
                ],
                vec!["\"Trowel\": 1 empty cell read as a gap (2024-04)"],
                vec!["\"Rake\": 1 empty cell read as a gap (2024-03)"],
                vec![
                    "\"Rake\": 1 empty cell after its last value (2024-04) left out \
                     (2024-05): its history ends there",
                    "write 0 in them",
                ],
                // The month written ahead is said once, for every item.
                vec![
                    "1 period after the last with a figure (2024-05) has no figure for any \
                     item: left out (2024-06), as periods still to come",
                ],
                vec![
                    "the figures of 1 item end before the file's last period (2024-05): \
                     \"Rake\" (2024-04)",
                ],
            ],
            ..Expect::default()
        },
    );
    let spans: Vec<(String, String)> = report
        .items
        .iter()
        .map(|i| {
            (
                i.first_value().unwrap().to_string(),
                i.last_value().unwrap().to_string(),
            )
        })
        .collect();
    assert_eq!(
        spans,
        [
            ("2024-01".into(), "2024-05".into()),
            ("2024-03".into(), "2024-05".into()),
            ("2024-01".into(), "2024-04".into())
        ]
    );
    assert_eq!(report.last_period().unwrap().to_string(), "2024-05");
}
