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

// Times of day beside dates are calendar details: in a till export (date, time, item, qty)
// each sale had become an item ("09:15 / Rose fertiliser"); now the day's sales are summed,
// with warnings. Beside one column of values, several times a day are an error.
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
    let report =
        read("Date,Time,Compost\n2024-03-01,09:00,2\n2024-03-01,13:00,3\n2024-03-02,09:00,4\n");
    assert!(!report.errors.is_empty());
    assert!(report.items.iter().all(|i| !i.name.contains(':')));
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
// 2024, weeks 13 on refused); a period-named column of numbers that place nothing
// ("Calendar week" 01.2024) is an error, not an item.
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
    assert_eq!(report.errors.len(), 1, "{:?}", report.errors);
    assert!(report.items.is_empty());
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
