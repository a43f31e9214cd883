//! Periods a long table names nowhere. A till's export has a row per item and day sold, so a
//! day nothing sold has no row at all; such days had been gaps, filled by interpolation from
//! the days around them: a shop shut on Sundays got Sunday demand, a shop with a few slow
//! items demand on every quiet day (the plan's orders ran high). Each test but the last two
//! (a month missing from the export stays a gap, as before) failed before the rule.
//!
//! Tables of one row per period (single and wide) read closed places the same way, with more
//! caution (the last two tests).
//!
//! Kept apart from: periods with rows for other items but none for an item (`formats`), and
//! the rule's own arithmetic (the engine's `intake::build::unnamed` tests).

use morrowcast_engine::calendar::{civil_from_days, days_from_civil};

use morrowcast_engine::intake::read;

use super::expect::{check, Expect};

/// An item's sales on day t (`None`: no row).
type Sells<'a> = &'a dyn Fn(usize) -> Option<u32>;

/// Day t from 2024-03-04 (a Monday) as yyyy-mm-dd.
fn day_label(t: usize) -> String {
    let (y, m, d) = civil_from_days(days_from_civil(2024, 3, 4) + t as i64);
    format!("{y}-{m:02}-{d:02}")
}

/// A long daily table from 2024-03-04 (a Monday): for each item, its sales on the days
/// `sells(day)` gives (none: no row).
fn daily(items: &[(&str, Sells<'_>)], days: usize) -> String {
    let mut text = String::from("date,item,qty\n");
    for t in 0..days {
        for (name, sells) in items {
            if let Some(q) = sells(t) {
                text.push_str(&format!("{},{name},{q}\n", day_label(t)));
            }
        }
    }
    text
}

/// The values `sells` gives over `days`, a day without a row 0.
fn with_zeros(sells: Sells<'_>, days: usize) -> Vec<Option<f64>> {
    (0..days)
        .map(|t| Some(f64::from(sells(t).unwrap_or(0))))
        .collect()
}

// Two slow items, neither selling on most days: days no row names are no sales.
#[test]
fn quiet_days_of_slow_items_are_no_sales() {
    let tray = |t: usize| (t % 3 == 0).then_some(2);
    let tin = |t: usize| (t % 5 == 1).then_some(1);
    let days = 31;
    check(
        &daily(&[("Oak tray", &tray), ("Seed tin", &tin)], days),
        Expect {
            items: Some(vec![
                ("Oak tray", with_zeros(&tray, 31)),
                // After its last row (day 26) too: the table runs on to day 31. Four days
                // without a row, as between its rows: not a stop, counted with them.
                ("Seed tin", with_zeros(&tin, 31)[1..].to_vec()),
            ]),
            warned: vec![
                vec![
                    "days that no row names were read as no sales (0)",
                    "writes no zeros",
                    "2024-03-06",
                ],
                vec!["read as no sales (0)", "\"Seed tin\" 10"],
            ],
            ..Expect::default()
        },
    );
}

// A busy shop shut on Sundays: every Sunday is a closed day, no sales; so too with a void
// written as a row of 0 (a till writing one zero does not write its closed days), and for a
// stall open only at weekends.
#[test]
fn a_weekday_without_rows_is_a_closed_day() {
    let open = |t: usize| (t % 7 != 6).then_some(3 + (t % 4) as u32);
    let days = 27;
    let shop = daily(&[("Oak tray", &open), ("Seed tin", &open)], days);
    let void = shop.replace("2024-03-05,Seed tin,4", "2024-03-05,Seed tin,0");
    assert_ne!(void, shop);
    for text in [shop, void] {
        let report = check(
            &text,
            Expect {
                warned: vec![vec!["3 days", "on Sundays", "read as closed", "2024-03-10"]],
                ..Expect::default()
            },
        );
        assert_eq!(report.items[0].values, with_zeros(&open, days));
    }
    let weekends = |t: usize| (t % 7 >= 5).then_some(20);
    let stall = daily(&[("Oak tray", &weekends), ("Seed tin", &weekends)], 34);
    let report = check(
        &stall,
        Expect {
            warned: vec![vec![
                "20 days",
                "on Mondays, Tuesdays, Wednesdays, Thursdays and Fridays",
                "read as closed",
                "2024-03-11 to 2024-03-15",
            ]],
            ..Expect::default()
        },
    );
    assert_eq!(report.items[0].values, with_zeros(&weekends, 34)[5..]);
}

// A nursery shut in January and February: three busy items, no row in those months of
// three years (the export before had interpolated winter demand from the autumn and spring).
#[test]
fn months_without_rows_every_year_are_closed() {
    let mut text = String::from("item,month,units\n");
    for year in 2021..=2023 {
        for m in 3..=12 {
            for item in ["Oak tray", "Seed tin", "Rain gauge"] {
                text.push_str(&format!("{item},{year}-{m:02},{}\n", 10 + m));
            }
        }
    }
    text.push_str("Oak tray,2024-03,9\nSeed tin,2024-03,9\nRain gauge,2024-03,9\n");
    let report = check(
        &text,
        Expect {
            warned: vec![vec![
                "6 periods",
                "in January and February",
                "read as closed",
                "2022-01",
            ]],
            ..Expect::default()
        },
    );
    let winter = &report.items[0].values[10..12];
    assert_eq!(winter, [Some(0.0), Some(0.0)]);
    assert_eq!(report.gaps_filled, 0);
}

// Items selling every month but one month no row names: missing from the export, a gap.
#[test]
fn a_month_of_busy_items_without_rows_is_missing() {
    let mut text = String::from("item,month,units\n");
    for item in ["Oak tray", "Seed tin", "Rain gauge"] {
        for m in (1..=12).filter(|m| *m != 7) {
            text.push_str(&format!("{item},2023-{m:02},{}\n", 10 + m));
        }
    }
    let report = check(
        &text,
        Expect {
            warned: vec![vec![
                "1 period that no row names was taken as missing",
                "sell in too many of the periods near them",
                "2023-07",
            ]],
            ..Expect::default()
        },
    );
    assert!(report.items.iter().all(|i| i.values[6].is_none()));
    assert_eq!(report.gaps_filled, 3);
    // One item alone, selling every month but one: missing too, not quiet (its chance of a
    // month without a sale is taken from the months near it, all with sales).
    let one: String = text.lines().take(12).map(|l| format!("{l}\n")).collect();
    let report = check(
        &one,
        Expect {
            warned: vec![vec![
                "1 period that no row names was taken as missing",
                "2023-07",
            ]],
            ..Expect::default()
        },
    );
    assert_eq!(report.items[0].values[6], None);
}

// The slow items' table writing its zeros, but for three days no row names: it writes its
// quiet days, so those days are missing.
#[test]
fn a_table_writing_zeros_has_no_quiet_days() {
    let skipped = |t: usize| (10..13).contains(&t);
    let tray = |t: usize| (!skipped(t)).then_some(if t % 3 == 0 { 2 } else { 0 });
    let tin = |t: usize| (!skipped(t)).then_some(u32::from(t % 5 == 1));
    let report = check(
        &daily(&[("Oak tray", &tray), ("Seed tin", &tin)], 31),
        Expect {
            warned: vec![vec![
                "3 days that no row names were taken as missing",
                "writes its zeros (line 3 is one)",
                "2024-03-14 to 2024-03-16",
            ]],
            ..Expect::default()
        },
    );
    assert_eq!(report.items[0].values[10..13], [None, None, None]);
}

// Two stores in one table: a month of the South store's export missing had been read as no
// sales for its items (the North store's rows name those days). Periods are read per store.
#[test]
fn a_store_missing_from_the_export_has_gaps_not_zeros() {
    let mut text = String::from("store,item,date,qty\n");
    for t in 0..70 {
        let day = day_label(t);
        for store in ["North", "South"] {
            if store == "South" && (20..40).contains(&t) {
                continue;
            }
            for item in ["Oak tray", "Seed tin"] {
                text.push_str(&format!("{store},{item},{day},{}\n", 3 + t % 5));
            }
        }
    }
    let report = check(
        &text,
        Expect {
            warned: vec![vec![
                "20 days that no row of \"South\" names were taken as missing",
                "2024-03-24 to 2024-04-12",
            ]],
            ..Expect::default()
        },
    );
    let south = &report.items[2];
    assert_eq!(south.name, "South / Oak tray");
    assert!(south.values[20..40].iter().all(Option::is_none));
    assert_eq!(report.gaps_filled, 40);
}

// An item whose rows stop before its store's: the days after its last row are no sales, as
// between its rows (its plan then starts at the file's end, not at its last row); but only up
// to its store's last day: a store whose export ends earlier keeps its end (the plan refuses
// figures for it, tests/order.rs), its days after not taken for no sales from the other
// store's rows.
#[test]
fn an_item_whose_rows_stop_is_read_to_its_stores_last_day() {
    let mut text = String::from("store,item,date,qty\n");
    for t in 0..60 {
        let day = day_label(t);
        for store in ["North", "South"] {
            if store == "South" && t >= 50 {
                continue;
            }
            for item in ["Oak tray", "Seed tin", "Twine"] {
                if item == "Seed tin" && t >= 45 {
                    continue;
                }
                text.push_str(&format!("{store},{item},{day},{}\n", 3 + t % 5));
            }
        }
    }
    let report = check(
        &text,
        Expect {
            warned: vec![
                vec![
                    "items that stopped, with no row since their last for longer than any run \
                     without one before it, while other items of the same store have rows since",
                    "(2 items): \"North / Seed tin\" (last row 2024-04-17, line 267; 15 periods \
                     since, 15 read as 0), \"South / Seed tin\" (last row 2024-04-17, line 270; 5 \
                     periods since, 5 read as 0)",
                ],
                vec![
                    "the figures of 3 items end before the file's last period (2024-05-02): \
                     \"South / Oak tray\" (2024-04-22), \"South / Seed tin\" (2024-04-22), \
                     \"South / Twine\" (2024-04-22)",
                ],
            ],
            ..Expect::default()
        },
    );
    let ends: Vec<(&str, usize, Option<f64>)> = report
        .items
        .iter()
        .map(|i| (i.name.as_str(), i.values.len(), *i.values.last().unwrap()))
        .collect();
    assert_eq!(
        ends,
        [
            ("North / Oak tray", 60, Some(3.0 + 59.0 % 5.0)),
            ("North / Seed tin", 60, Some(0.0)),
            ("North / Twine", 60, Some(3.0 + 59.0 % 5.0)),
            ("South / Oak tray", 50, Some(3.0 + 49.0 % 5.0)),
            ("South / Seed tin", 50, Some(0.0)),
            ("South / Twine", 50, Some(3.0 + 49.0 % 5.0)),
        ]
    );
    assert!(report.items[1].values[45..].iter().all(|v| *v == Some(0.0)));
}

// A row shorter than the item columns (a store without its item) had made the store grouping
// index past the row's cells and panic (found by comparing probe files' reports).
#[test]
fn a_short_row_among_grouped_items_is_read_as_before() {
    check(
        "store,item,qty\nNorth,Oak tray,5\nNorth,Seed tin,3\nSouth,Oak tray,2\nSouth\n",
        Expect {
            items: Some(vec![
                ("North / Oak tray", vec![Some(5.0)]),
                ("North / Seed tin", vec![Some(3.0)]),
                ("South / Oak tray", vec![Some(2.0)]),
            ]),
            warned: vec![vec!["\"South\" has no values"]],
            ..Expect::default()
        },
    );
}

/// A monthly `header` table of rows from `rows`: (group, item, month of 2023, quantity).
fn monthly(header: &str, rows: &[(&str, &str, u32, u32)]) -> String {
    let mut text = format!("{header}\n");
    for (group, item, m, q) in rows {
        text.push_str(&format!("{group},{item},2023-{m:02},{q}\n"));
    }
    text
}

/// Rows for each of `groups` x `items` in months 1-12 but `skip(group, month)`.
fn busy(
    groups: &[&'static str],
    items: &[&'static str],
    skip: impl Fn(&str, u32) -> bool,
) -> Vec<(&'static str, &'static str, u32, u32)> {
    let mut rows = Vec::new();
    for m in 1..=12 {
        for g in groups {
            for i in items {
                if !skip(g, m) {
                    rows.push((*g, *i, m, 10 + m));
                }
            }
        }
    }
    rows
}

// Grouping, after a second review: a month no row of the whole table names is read over all
// items (per store it had looked like chance and read as no sales); only a column naming a
// place groups (a category's or a customer's month without sales is no sales, not a gap;
// grouping by them had made gaps); the place column groups in either order; store names
// differing only in case are one store and their items one item.
#[test]
fn items_are_grouped_only_by_a_place_and_the_table_reads_first() {
    let items = ["Oak tray", "Seed tin", "Rain gauge"];
    let all_stores_lost_june = busy(&["North", "South"], &items, |_, m| m == 6);
    let report = check(
        &monthly("store,item,month,qty", &all_stores_lost_june),
        Expect {
            warned: vec![vec![
                "1 period that no row names was taken as missing",
                "2023-06",
            ]],
            ..Expect::default()
        },
    );
    assert!(report.items.iter().all(|i| i.values[5].is_none()));
    let south_lost_june = busy(&["North", "South"], &items, |g, m| g == "South" && m == 6);
    for header in ["store,item,month,qty", "item,Store ID,month,qty"] {
        let rows: Vec<_> = if header.starts_with("item") {
            south_lost_june
                .iter()
                .map(|(g, i, m, q)| (*i, *g, *m, *q))
                .collect()
        } else {
            south_lost_june.clone()
        };
        let report = check(
            &monthly(header, &rows),
            Expect {
                warned: vec![vec![
                    "no row of \"South\" names was taken as missing",
                    "2023-06",
                ]],
                ..Expect::default()
            },
        );
        let gaps: Vec<&str> = report
            .items
            .iter()
            .filter(|i| i.values[5].is_none())
            .map(|i| i.name.as_str())
            .collect();
        assert_eq!(gaps.len(), 3, "{header}: {gaps:?}");
        assert!(gaps.iter().all(|name| name.contains("South")), "{gaps:?}");
    }
    for header in ["category,item,month,qty", "customer,item,month,qty"] {
        let report = check(
            &monthly(header, &south_lost_june),
            Expect {
                warned: vec![vec![
                    "rows for other items but none for an item",
                    "\"South / Oak tray\" 1",
                ]],
                ..Expect::default()
            },
        );
        assert_eq!(report.gaps_filled, 0, "{header}");
    }
    let mut text = monthly(
        "store,item,month,qty",
        &busy(&["North"], &items, |_, _| false),
    );
    text = text.replace("North,Oak tray,2023-04", "north,Oak tray,2023-04");
    let report = check(
        &text,
        Expect {
            warned: vec![vec![
                "\"North / Oak tray\" is written in 2 ways that differ only in white space or case",
            ]],
            ..Expect::default()
        },
    );
    assert_eq!(report.items.len(), 3);
    assert_eq!(report.gaps_filled, 0);
}

/// A table of one row per day from 2024-03-04 (a Monday), `sells(day)` each column's figure
/// (none: no row), columns named `names`.
fn one_row_per_day(names: &[&str], days: usize, sells: Sells<'_>) -> String {
    let mut text = format!("Date,{}\n", names.join(","));
    for t in 0..days {
        if let Some(q) = sells(t) {
            let cells = vec![q.to_string(); names.len()].join(",");
            text.push_str(&format!("{},{cells}\n", day_label(t)));
        }
    }
    text
}

// One row per day, a shop shut on Sundays and Mondays and on one Wednesday: the closed
// weekdays are no sales, the Wednesday a gap, in a single and a wide table. Before, every day
// without a row was a gap filled with the demand of the days around it (and with a third of
// the days without a row, nothing was read).
#[test]
fn closed_weekdays_in_a_table_of_one_row_per_day() {
    let holiday = 16;
    let open = |t: usize| (t % 7 != 0 && t % 7 != 6 && t != holiday).then_some(5 + (t % 3) as u32);
    let days = 43;
    let expected: Vec<Option<f64>> = (0..days)
        .map(|t| {
            if t == holiday {
                None
            } else {
                Some(f64::from(open(t).unwrap_or(0)))
            }
        })
        .collect();
    for names in [&["Qty"][..], &["Oak tray", "Seed tin"]] {
        let report = check(
            &one_row_per_day(names, days, &open),
            Expect {
                warned: vec![
                    vec![
                        "10 days",
                        "on Mondays and Sundays",
                        "read as closed",
                        "2024-03-10 to 2024-03-11",
                    ],
                    vec!["1 missing period filled as gaps", "2024-03-20"],
                ],
                ..Expect::default()
            },
        );
        assert_eq!(report.items.len(), names.len());
        for item in &report.items {
            // From the first Tuesday to the last Saturday.
            assert_eq!(item.values, expected[1..41], "{}", item.name);
        }
    }
}

// The cautions of one row per period: a month without a row in two years is as likely missing
// (a gap), in three years closed; rows of other periods that leave most places without rows
// are refused, not read as a business open a day a week or a month a year ("Jan-01" to
// "Jan-20" read as twenty Januaries: sales_reports.rs).
#[test]
fn closed_places_of_one_row_per_period_need_more_evidence() {
    let months = |years: std::ops::RangeInclusive<i32>| -> String {
        let mut text = String::from("Month,Qty\n");
        for year in years {
            for m in (1..=12).filter(|m| *m != 8) {
                text.push_str(&format!("{year}-{m:02},{}\n", 10 + m));
            }
        }
        text
    };
    let two = check(
        &months(2022..=2023),
        Expect {
            warned: vec![vec!["2 missing periods filled as gaps", "2022-08, 2023-08"]],
            ..Expect::default()
        },
    );
    assert_eq!(two.items[0].values[7], None);
    let three = check(
        &months(2021..=2023),
        Expect {
            warned: vec![vec![
                "3 periods",
                "in August",
                "read as closed",
                "2021-08, 2022-08, 2023-08",
            ]],
            ..Expect::default()
        },
    );
    assert_eq!(three.items[0].values[7], Some(0.0));
    assert_eq!(three.gaps_filled, 0);
    // Rows of another period written as days, mostly "closed" days: refused, nothing read
    // (each was read as closed days once): weekly rows with one stray weekday, twice-weekly
    // rows, "Mar-01" day labels read as months of thirty years. Weekly tables are not read
    // for closed weeks at all (an ISO year has 52 or 53 weeks).
    let weekly_with_a_stray = |t: usize| (t % 7 == 0 || t == 100).then_some(40u32);
    let twice_weekly = |t: usize| (t % 7 == 0 || t % 7 == 3).then_some(40u32);
    for sells in [&weekly_with_a_stray as Sells<'_>, &twice_weekly] {
        let report = read(&one_row_per_day(&["Qty"], 140, sells));
        assert!(
            report.items.is_empty() && report.errors.len() == 1,
            "{report:?}"
        );
    }
    let spring: String = ["Mar", "Apr", "May", "Jun"]
        .iter()
        .flat_map(|m| (1..=30).map(move |d| format!("{m}-{d:02},{}\n", 10 + d % 3)))
        .collect();
    let report = read(&format!("Day,Qty\n{spring}"));
    assert!(
        report.items.is_empty() && report.errors.len() == 1,
        "{report:?}"
    );
}

// Items that sold twice, long ago, beside one that runs on: filling every one's days since
// with zeros would pass the periods all items may take; those not filled are named, and their
// figures end early (said), never cut off unsaid.
#[test]
fn items_whose_periods_since_cannot_all_be_read_are_named() {
    let mut text = String::from("date,item,qty\n");
    // Slow sellers (two sales 2,000 days apart, the last 1,000 days before the end: not a
    // stop), their days since to be read as no sales.
    for k in 0..300 {
        text.push_str(&format!("{},Seed tin {k},1\n", day_label(0)));
        text.push_str(&format!("{},Seed tin {k},1\n", day_label(2000)));
    }
    for t in (0..3000).step_by(50) {
        text.push_str(&format!("{},Oak tray,2\n", day_label(t)));
    }
    let report = check(
        &text,
        Expect {
            warned: vec![vec![
                "the periods after the last row of",
                "were not read as no sales: all items together would pass the periods allowed",
                "(last row 2029-08-25)",
            ]],
            ..Expect::default()
        },
    );
    let (filled, unfilled): (Vec<_>, Vec<_>) = report
        .items
        .iter()
        .filter(|i| i.name.starts_with("Seed tin"))
        .partition(|i| i.values.len() > 2001);
    assert!(!filled.is_empty() && !unfilled.is_empty());
    let named = report
        .warnings
        .iter()
        .find(|w| w.starts_with("the periods after the last row of"))
        .unwrap();
    assert!(
        named.contains(&format!("of {} items", unfilled.len())),
        "{named}"
    );
    let early = report
        .warnings
        .iter()
        .find(|w| w.starts_with("the figures of"))
        .unwrap();
    assert!(
        early.contains(&format!("of {} items", unfilled.len())),
        "{early}"
    );
}

// A header naming a garden centre, a nursery or a region groups items as a store does: one
// centre's export ending early is not read as its items selling nothing.
#[test]
fn more_place_words_group_items() {
    for place in ["Garden centre", "Nursery", "Region"] {
        let mut text = format!("{place},item,month,qty\n");
        for t in 0..24 {
            let month = format!("{}-{:02}", 2024 + t / 12, t % 12 + 1);
            for (centre, last) in [("Hilltop", 21), ("Brookside", 23)] {
                for item in ["Compost", "Twine"] {
                    if t <= last {
                        text.push_str(&format!("{centre},{item},{month},{}\n", 5 + t % 3));
                    }
                }
            }
        }
        let report = check(&text, Expect::default());
        let hilltop = &report.items[0];
        assert_eq!(hilltop.name, "Hilltop / Compost", "{place}");
        assert_eq!(
            hilltop.values.len(),
            22,
            "{place}: filled to the other centre's end"
        );
    }
}

// One row typed a year ahead (2027-06 for 2026-06): the other three items' rows "stop" a year
// before the table's last period. Read as a year of no sales they had forecast a fall to 0 and
// got stock figures; so many stopping at once is held back, said, and their figures end early.
#[test]
fn a_row_dated_far_ahead_does_not_make_the_other_items_stop() {
    let mut text = String::from("item,month,qty\n");
    for t in 0..30 {
        let month = format!("{}-{:02}", 2024 + t / 12, t % 12 + 1);
        for item in ["Compost", "Bark", "Grit", "Twine"] {
            let month = if item == "Bark" && t == 29 {
                "2027-06".to_string()
            } else {
                month.clone()
            };
            text.push_str(&format!("{item},{month},{}\n", 5 + (t * 3) % 11));
        }
    }
    let report = check(
        &text,
        Expect {
            warned: vec![
                vec![
                    "3 items have no row for longer than any run without one before, while the \
                     rows of fewer items run on",
                    "\"Compost\" (last row 2026-06, the rows run on to 2027-06)",
                ],
                vec![
                    "the figures of 3 items end before the file's last period (2027-06): \
                     \"Compost\" (2026-06), \"Grit\" (2026-06), \"Twine\" (2026-06)",
                ],
            ],
            ..Expect::default()
        },
    );
    assert_eq!(
        report.items[0].values.len(),
        30,
        "no zeros after Compost's last row"
    );
}

// In a table that writes its zeros, an item that writes none of its own is read after its
// last row as between its rows (no sales); one that writes zeros and then stops is missing
// since, its figures ending early.
#[test]
fn after_its_last_row_an_item_is_read_as_between_its_rows() {
    let mut text = String::from("item,month,qty\n");
    for t in 0..24 {
        let month = format!("{}-{:02}", 2024 + t / 12, t % 12 + 1);
        for item in ["Pond pump", "Heater", "Net", "Liner", "Filter"] {
            let qty = match item {
                "Heater" if t >= 20 => continue,
                "Net" if t >= 18 => continue,
                "Net" if t % 2 == 0 => 0,
                "Liner" if [4, 9, 14].contains(&t) => continue,
                _ => 3 + t % 4,
            };
            text.push_str(&format!("{item},{month},{qty}\n"));
        }
    }
    let report = check(
        &text,
        Expect {
            warned: vec![vec![
                "the figures of 1 item end before the file's last period (2025-12): \"Net\" \
                 (2025-06)",
            ]],
            ..Expect::default()
        },
    );
    let ends: Vec<(&str, usize)> = report
        .items
        .iter()
        .map(|i| (i.name.as_str(), i.values.len()))
        .collect();
    assert_eq!(
        ends,
        [
            ("Pond pump", 24),
            ("Heater", 24),
            ("Net", 18),
            ("Liner", 24),
            ("Filter", 24)
        ]
    );
}
