//! A year and its parts under other names (2026-12-05): a year column beside its month,
//! quarter, week or day named in German, French, Dutch, Spanish or Italian; short forms
//! ("Mon", "MM", "Q", "W"); a year's parts summed into years where a header was not known;
//! and what four reviews of those rules found (helper-52 to helper-55, made-up files through
//! the builds before and after). Each test failed before its mend; values are worked by hand
//! from each table. The words of other languages are from memory.
//!
//! Kept apart from: the English shapes of exported tables (`exports`) and year grids
//! (`year_grid`).

use morrowcast_engine::calendar::Frequency;
use morrowcast_engine::intake::{read, Layout};

use super::expect::{check, some, Expect};

// A year and its part named in German, French, Dutch, Spanish or Italian (the words from
// memory, as Intake's other period words): `Artikel;Jahr;Monat;Menge` had been read as
// yearly, every month of a year summed into it (warned only as "calendar details" and rows
// summed); now one period as in English. A fiscal year's months under "Jahr" are refused
// as under "Year".
#[test]
fn a_year_and_its_part_named_in_other_languages_make_one_period() {
    for (header, first, frequency) in [
        ("Artikel;Jahr;Monat;Menge", "2023-11", Frequency::Monthly),
        ("Article;ANNÉE;Mois;Quantité", "2023-11", Frequency::Monthly),
        ("Artikel;Jaar;Maand;Aantal", "2023-11", Frequency::Monthly),
        ("Producto;Año;Mes;Cantidad", "2023-11", Frequency::Monthly),
        ("Articolo;Anno;Mese;Quantità", "2023-11", Frequency::Monthly),
        (
            "Artikel;Jahr;Quartal;Menge",
            "2023-Q3",
            Frequency::Quarterly,
        ),
        (
            "Article;Année;Trimestre;Quantité",
            "2023-Q3",
            Frequency::Quarterly,
        ),
        ("Artikel;Jahr;KW;Menge", "2023-W51", Frequency::Weekly),
    ] {
        // The last two parts of 2023 and the first of 2024 (ISO 2023 has 52 weeks).
        let part = |n: u32| match frequency {
            Frequency::Quarterly => n - 8,
            Frequency::Weekly => n + 40,
            _ => n,
        };
        let text = format!(
            "{header}\nKelle;2023;{};5\nKelle;2023;{};6\nKelle;2024;{};7\n",
            part(11),
            part(12),
            1
        );
        let report = check(
            &text,
            Expect {
                items: Some(vec![("Kelle", some(&[5.0, 6.0, 7.0]))]),
                frequency: Some(frequency),
                ..Expect::default()
            },
        );
        assert_eq!(report.items[0].periods[0].to_string(), first, "{header}");
    }
    let fiscal =
        read("Artikel;Jahr;Monat;Menge\nKelle;2023;Nov;5\nKelle;2023;Dec;6\nKelle;2023;Jan;7\n");
    assert!(
        fiscal.errors[0].message.contains("fiscal year"),
        "{fiscal:#?}"
    );
}

// A year read as the period beside a column left unread that holds parts of a year under a
// short form of a month's name Intake does not join ("Mon", "M", "Mnth"; 1 to 12, Jan to Dec): each item's
// months of a year had been summed into one yearly figure, said only as a column not used and
// rows summed. Now an error at that column saying how to name it. One row per item and year
// beside such numbers (a rank) is read as before.
#[test]
fn parts_of_a_year_under_an_unknown_header_are_not_summed_into_years() {
    for header in ["Item,Year,Mon,Qty", "Item,Year,M,Qty", "Item,Yr,Mnth,Qty"] {
        let mut text = format!("{header}\n");
        for year in [2023, 2024] {
            for month in 1..=12 {
                text.push_str(&format!("Trowel,{year},{month},{}\n", month + 4));
            }
        }
        let column = header.split(',').nth(2).unwrap();
        let report = check(
            &text,
            Expect {
                errors: vec![(2, column, "1")],
                ..Expect::default()
            },
        );
        assert!(
            report.errors[0].message.contains("name it Month"),
            "{header}: {report:#?}"
        );
    }
    // One row per item and year beside such numbers is read as before: no item's year holds
    // two rows for the column to tell apart.
    check(
        "Item,Year,Mon,Qty\nTrowel,2023,1,50\nTrowel,2024,2,60\nRake,2023,2,40\nRake,2024,1,70\n",
        Expect {
            items: Some(vec![
                ("Trowel", some(&[50.0, 60.0])),
                ("Rake", some(&[40.0, 70.0])),
            ]),
            frequency: Some(Frequency::Yearly),
            ..Expect::default()
        },
    );
}

// What a review of the rules above found (helper-52, 258 made-up files, builds before and
// after compared), each failing before its mend: headers written in camel case ("MonthNo",
// "CalendarYear") had stopped being joined when the header was lower-cased first; "kW" (a
// power rating) was read as German calendar weeks; a "Total" row among the months hid them;
// store numbers, prices or days beside yearly rows were refused by a rule that looked at the
// numbers alone; "Menge", "Cantidad" and "Quantité" lost to a month or store column as the
// quantity (store numbers are now summed across as beside "Item" and "Qty"), "Umsatz" (revenue) was read as the demand, "Tag" and "Día" beside a year and a
// month were not read as the day; one week or month on every row ("Wk" 52: the weeks open)
// was joined as that week of each year; "Jan." under "Mon" made an item of each month; a
// note column in German split items, a rank beside yearly sales was planned as an item;
// month names in German, Dutch, Spanish and French beside a year were refused or, where some
// read as English ("Feb"), the others' months were taken as closed.
#[test]
fn what_the_review_of_the_year_parts_found() {
    let monthly = |header: &str| {
        let mut text = format!("{header}\n");
        for year in [2023, 2024] {
            for month in 1..=12 {
                text.push_str(&format!("Trowel,{year},{month},{}\n", month + 2));
            }
        }
        text
    };
    for header in ["Item,Year,MonthNo,Qty", "Item,CalendarYear,Month,Qty"] {
        check(
            &monthly(header),
            Expect {
                frequency: Some(Frequency::Monthly),
                ..Expect::default()
            },
        );
    }
    check(
        "Item,Year,kW,Qty\nHeater,2021,2,17\nHeater,2022,2,19\nHeater,2023,2,18\n",
        Expect {
            items: Some(vec![("Heater", some(&[17.0, 19.0, 18.0]))]),
            frequency: Some(Frequency::Yearly),
            ..Expect::default()
        },
    );
    let mut with_total = monthly("Item,Year,Mon,Qty");
    with_total.push_str("Trowel,2024,Total,114\n");
    check(
        &with_total,
        Expect {
            errors: vec![(2, "Mon", "1")],
            ..Expect::default()
        },
    );
    let beside = |header: &str, cells: [&str; 3]| {
        let mut text = format!("{header}\n");
        for year in [2023, 2024] {
            for (i, cell) in cells.iter().enumerate() {
                text.push_str(&format!("Trowel,{year},{cell},{}\n", i + 4));
            }
        }
        text
    };
    for (header, cells) in [
        ("Item,Year,Price,Qty", ["3", "4", "5"]),
        ("Item,Year,Day,Qty", ["5", "12", "20"]),
        ("Item,Year,Line no,Qty", ["1", "2", "3"]),
    ] {
        check(
            &beside(header, cells),
            Expect {
                items: Some(vec![("Trowel", some(&[15.0, 15.0]))]),
                frequency: Some(Frequency::Yearly),
                ..Expect::default()
            },
        );
    }
    check(
        "Artikel;Jahr;Filiale;Menge\nKelle;2023;1;5\nKelle;2023;2;6\nKelle;2024;1;7\nKelle;2024;2;8\n",
        Expect {
            // As "Item,Year,Store,Qty" is read: the stores' rows summed, said.
            items: Some(vec![("Kelle", some(&[11.0, 15.0]))]),
            warned: vec![vec!["\"Filiale\" was not used", "\"Menge\""]],
            ..Expect::default()
        },
    );
    check(
        "Artikel;Jahr;Monat;Umsatz;Menge\nKelle;2024;1;23;6\nKelle;2024;2;31;8\nKelle;2024;3;27;7\n",
        Expect {
            items: Some(vec![("Kelle", some(&[6.0, 8.0, 7.0]))]),
            frequency: Some(Frequency::Monthly),
            ..Expect::default()
        },
    );
    check(
        "Artículo;Año;Mes;Día;Cantidad\nPaleta;2024;1;3;6\nPaleta;2024;1;4;8\nPaleta;2024;1;5;7\n",
        Expect {
            items: Some(vec![("Paleta", some(&[6.0, 8.0, 7.0]))]),
            periods: Some(vec!["2024-01-03", "2024-01-04", "2024-01-05"]),
            ..Expect::default()
        },
    );
    check(
        "Item,Year,Wk,Qty\nTrowel,2023,52,201\nTrowel,2024,52,215\n",
        Expect {
            items: Some(vec![("Trowel", some(&[201.0, 215.0]))]),
            frequency: Some(Frequency::Yearly),
            ..Expect::default()
        },
    );
    // Months written out under a short form ("Jan." under "Mon") are joined: they had made
    // an item of each month ("Trowel / Jan."), or been refused as months without a year.
    check(
        "Item,Year,Mon,Qty\nTrowel,2024,Jan.,19\nTrowel,2024,Feb.,16\nTrowel,2024,Mar.,18\n",
        Expect {
            items: Some(vec![("Trowel", some(&[19.0, 16.0, 18.0]))]),
            frequency: Some(Frequency::Monthly),
            ..Expect::default()
        },
    );
    // Month names and abbreviations in German, Dutch, Spanish and French beside a year.
    for (header, months) in [
        ("Artikel;Jahr;Monat;Menge", ["Feb", "Mär", "Apr"]),
        ("Artikel;Jaar;Maand;Aantal", ["feb", "mrt", "apr"]),
        ("Artículo;Año;Mes;Cantidad", ["feb", "mar", "abr"]),
        ("Article;Année;Mois;Quantité", ["février", "mars", "avril"]),
    ] {
        let mut text = format!("{header}\n");
        for (i, month) in months.iter().enumerate() {
            text.push_str(&format!("Kelle;2024;{month};{}\n", i + 4));
        }
        let report = check(
            &text,
            Expect {
                items: Some(vec![("Kelle", some(&[4.0, 5.0, 6.0]))]),
                frequency: Some(Frequency::Monthly),
                ..Expect::default()
            },
        );
        assert_eq!(
            report.items[0].periods[0].to_string(),
            "2024-02",
            "{header}"
        );
    }
    // Weeks open under "Weeks", 52 or 53, one row per item and year: a plural names no week
    // to join ("Wk" 52 on every row, the part alike across years, is the case below).
    check(
        "Item,Year,Weeks,Qty\nTrowel,2020,53,150\nTrowel,2021,52,156\nTrowel,2022,52,170\n",
        Expect {
            items: Some(vec![("Trowel", some(&[150.0, 156.0, 170.0]))]),
            frequency: Some(Frequency::Yearly),
            ..Expect::default()
        },
    );
    // A German note column notes the rows, as "Comment" does; a rank is no item.
    check(
        "Artikel;Jahr;Monat;Menge;Bemerkung\nKelle;2024;1;3;ok\nKelle;2024;2;22;Aktion\nKelle;2024;3;5;ok\n",
        Expect {
            items: Some(vec![("Kelle", some(&[3.0, 22.0, 5.0]))]),
            warned: vec![vec!["\"Bemerkung\" was not used"]],
            ..Expect::default()
        },
    );
    check(
        "Year,Trowel,Rake,Rank\n2016,161,58,1\n2017,139,52,2\n2018,150,49,1\n",
        Expect {
            items: Some(vec![
                ("Trowel", some(&[161.0, 139.0, 150.0])),
                ("Rake", some(&[58.0, 52.0, 49.0])),
            ]),
            warned: vec![vec!["\"Rank\"", "a rank", "not used"]],
            ..Expect::default()
        },
    );
    let sales_year = read(&monthly("Item,Sales year,Month,Qty"));
    assert!(
        sales_year.errors[0].message.contains("name it Year"),
        "{sales_year:#?}"
    );
}

// What a second review found (helper-53, 268 more made-up files), each failing before its
// mend: "Dia" (a pot's diameter) and "Tag" (a shelf tag) beside a year and a month in an
// English file read as the day; "Q" passed over as the quantity for "Price"; width classes
// "W1", "W2" under "W" and grades "Q1", "Q2" under "Q" joined as weeks and quarters; widths,
// lengths and grades under "W", "M", "Q" refused as a year's parts; "Wochen" (weeks open)
// read as each year's week; German month and quarter headers across beside "Jahr" read as a
// long table of January's figures; German and French weekday names splitting items;
// "Vorjahr", "LY" and "Budget" left of the months refusing a year grid; "Jän." and "fév."
// not read, and a month word not known refused at the year's column with the joined text.
#[test]
fn what_the_second_review_of_the_year_parts_found() {
    let days = "Item,Year,Month,Dia,Qty\nClay pot,2023,1,12,14\nClay pot,2023,2,12,16\n\
                Clay pot,2023,3,12,15\nBowl,2023,1,25,4\nBowl,2023,2,25,5\nBowl,2023,3,25,6\n";
    check(
        days,
        Expect {
            frequency: Some(Frequency::Monthly),
            items: Some(vec![
                ("Clay pot", some(&[14.0, 16.0, 15.0])),
                ("Bowl", some(&[4.0, 5.0, 6.0])),
            ]),
            ..Expect::default()
        },
    );
    check(
        "Date,Item,Price,Q\n2024-03-04,Trowel,4.50,9\n2024-03-05,Trowel,4.50,7\n2024-03-06,Trowel,4.50,8\n",
        Expect {
            items: Some(vec![("Trowel", some(&[9.0, 7.0, 8.0]))]),
            ..Expect::default()
        },
    );
    // Classes under "W" and "Q" that are not most of a year's weeks or quarters: not joined,
    // and refused as parts of the calendar without their years, as before the short forms.
    for (header, class) in [("Item,Year,W,Qty", "W"), ("Item,Year,Q,Qty", "Q")] {
        let text = format!(
            "{header}\nFrame,2022,{class}1,26\nFrame,2022,{class}2,30\nFrame,2023,{class}1,28\nFrame,2023,{class}2,31\n"
        );
        check(
            &text,
            Expect {
                errors: vec![(2, class, &format!("{class}1"))],
                ..Expect::default()
            },
        );
    }
    for header in ["Item,Year,W,Qty", "Item,Year,M,Qty", "Item,Year,Q,Qty"] {
        let text =
            format!("{header}\nHose,2022,5,10\nHose,2022,10,12\nHose,2023,5,11\nHose,2023,10,13\n");
        check(
            &text,
            Expect {
                items: Some(vec![("Hose", some(&[22.0, 24.0]))]),
                frequency: Some(Frequency::Yearly),
                ..Expect::default()
            },
        );
    }
    check(
        "Artikel;Jahr;Wochen;Menge\nKelle;2022;52;467\nHarke;2022;26;120\nKelle;2023;52;480\nHarke;2023;30;130\n",
        Expect {
            items: Some(vec![
                ("Kelle", some(&[467.0, 480.0])),
                ("Harke", some(&[120.0, 130.0])),
            ]),
            frequency: Some(Frequency::Yearly),
            ..Expect::default()
        },
    );
    let months =
        "Januar;Februar;März;April;Mai;Juni;Juli;August;September;Oktober;November;Dezember";
    check(
        &format!("Artikel;Jahr;{months}\nKelle;2024;1;2;3;4;5;6;7;8;9;10;11;12\n"),
        Expect {
            layout: Some(Layout::Across),
            items: Some(vec![(
                "Kelle",
                (1..=12).map(|v| Some(f64::from(v))).collect(),
            )]),
            ..Expect::default()
        },
    );
    check(
        "Artikel;Jahr;1. Quartal;2. Quartal;3. Quartal;4. Quartal\nKelle;2023;11;10;7;5\n",
        Expect {
            layout: Some(Layout::Across),
            frequency: Some(Frequency::Quarterly),
            ..Expect::default()
        },
    );
    check(
        "Datum;Wochentag;Artikel;Menge\n2024-03-04;Mo;Kelle;2\n2024-03-05;Di;Kelle;3\n2024-03-06;Mi;Kelle;4\n",
        Expect {
            items: Some(vec![("Kelle", some(&[2.0, 3.0, 4.0]))]),
            warned: vec![vec!["\"Wochentag\"", "calendar details"]],
            ..Expect::default()
        },
    );
    for header in ["Vorjahr", "LY", "Budget"] {
        check(
            &format!(
                "Item,Year,{header},Jan,Feb,Mar,Apr,May,Jun,Jul,Aug,Sep,Oct,Nov,Dec\n\
                 Trowel,2023,200,1,2,3,4,5,6,7,8,9,10,11,12\n"
            ),
            Expect {
                layout: Some(Layout::Across),
                warned: vec![vec![header, "was not used"]],
                ..Expect::default()
            },
        );
    }
    // Headers neither rule knew, each year's months summed into it before: "Month of year",
    // "Kalendermonat", "Mois n°" are joined; "MM" beside "YYYY", "Trim." and "Mnd" (short
    // forms) refused at their column; "Periode" (numbered periods) refused as "Period" is.
    let twelve = |header: &str| {
        let sep = if header.contains(';') { ';' } else { ',' };
        let mut text = format!("{header}\n");
        for year in [2023, 2024] {
            for month in 1..=12 {
                text.push_str(&format!("Kelle{sep}{year}{sep}{month}{sep}{}\n", month + 2));
            }
        }
        text
    };
    for header in [
        "Item,Year,Month of year,Qty",
        "Artikel;Jahr;Kalendermonat;Menge",
        "Produit;Année;Mois n°;Quantité",
    ] {
        check(
            &twelve(header),
            Expect {
                frequency: Some(Frequency::Monthly),
                ..Expect::default()
            },
        );
    }
    for (header, column) in [
        ("Item,YYYY,MM,Qty", "MM"),
        ("Artikel;Jaar;Mnd;Aantal", "Mnd"),
        ("Artikel;Jahr;Periode;Menge", "Periode"),
    ] {
        check(
            &twelve(header),
            Expect {
                errors: vec![(2, column, "1")],
                ..Expect::default()
            },
        );
    }
    // A shelf tag beside a year and a month in an English file is no day.
    check(
        "Item,Year,Month,Tag,Qty\nTrowel,2023,1,3,21\nTrowel,2023,2,3,19\nTrowel,2023,3,3,22\n",
        Expect {
            items: Some(vec![("Trowel", some(&[21.0, 19.0, 22.0]))]),
            frequency: Some(Frequency::Monthly),
            ..Expect::default()
        },
    );
    // A third review (helper-54, reading the code): two-letter country or state codes had
    // become weekdays (shortened weekdays in other languages count only under a weekday's
    // header); `Item,Year,Mon,Revenue` summed "Mon" as the quantity; German month headers
    // over rows of years read as twelve yearly items; one row a year in different months
    // (2022-03, 2023-07) read as yearly (kept: yearly totals are right, weeks open are not
    // weeks); week 53 of a 52-week year named at the year's
    // column with a label found in no cell.
    check(
        "Month,Country,Units\n2024-01,FR,5\n2024-01,ZA,6\n2024-02,FR,2\n2024-02,ZA,3\n",
        Expect {
            items: Some(vec![("FR", some(&[5.0, 2.0])), ("ZA", some(&[6.0, 3.0]))]),
            ..Expect::default()
        },
    );
    check(
        &twelve("Item,Year,Mon,Revenue"),
        Expect {
            errors: vec![(2, "Mon", "1")],
            ..Expect::default()
        },
    );
    check(
        &format!(
            "Jahr;{months}\n2023;1;2;3;4;5;6;7;8;9;10;11;12\n2024;1;2;3;4;5;6;7;8;9;10;11;12\n"
        ),
        Expect {
            errors: vec![(1, "Januar", "Januar")],
            ..Expect::default()
        },
    );
    // One row a year, each in another month: read as yearly totals (a part column that tells
    // no year's rows apart is not joined, for the weeks open above), each year's the row's.
    check(
        "Item,Year,Month,Qty\nTrowel,2022,3,10\nTrowel,2023,7,12\nTrowel,2024,1,9\n",
        Expect {
            items: Some(vec![("Trowel", some(&[10.0, 12.0, 9.0]))]),
            frequency: Some(Frequency::Yearly),
            ..Expect::default()
        },
    );
    // Items named as months are in other languages stay items in a wide yearly table.
    check(
        "Year,Mars,Mai,Set,Gen\n2018,116,70,117,183\n2019,200,151,154,133\n",
        Expect {
            layout: Some(Layout::Wide),
            ..Expect::default()
        },
    );
    check(
        "Item,Year,Week,Qty\nTrowel,2024,51,5\nTrowel,2024,52,6\nTrowel,2024,53,7\n",
        Expect {
            errors: vec![(4, "Week", "53")],
            ..Expect::default()
        },
    );
    // Sales by weekday each year: no history of years (Monday's column had been read).
    check(
        "Item,Year,Mon,Tue,Wed,Thu,Fri,Sat,Sun\nTrowel,2023,1,2,3,4,5,6,7\nTrowel,2024,2,3,4,5,6,7,8\n",
        Expect {
            errors: vec![(1, "Mon", "Mon")],
            ..Expect::default()
        },
    );
    check(
        "Artikel;Jahr;Monat;Menge\nKelle;2023;Dez.;13\nKelle;2024;Jän.;14\nKelle;2024;Feb.;12\n",
        Expect {
            items: Some(vec![("Kelle", some(&[13.0, 14.0, 12.0]))]),
            ..Expect::default()
        },
    );
    check(
        "Artikel;Jahr;Monat;Menge\nKelle;2024;Jan;13\nKelle;2024;Febr;14\nKelle;2024;Mär;12\n",
        Expect {
            errors: vec![(3, "Monat", "Febr")],
            ..Expect::default()
        },
    );
}

// What a fourth review found (helper-55, 363 more made-up files, English tables first),
// each failing before its mend: "Q" passed over as the quantity for any other number column
// ("Temp"); grades, sizes and model numbers under "Q", "M", "MM", "Mo" beside yearly rows
// refused as a year's parts (now only where some item's year holds all of them); "YoY" left
// of a year grid's months (its capitals split the word); one weekday's column read as each
// week's demand beside a year and its week or beside week dates; English two-letter
// weekdays under "Day" planned as items; "Target", "Plan", "Forecast" read as the demand
// beside "Actual" or planned as items in a wide table; "MM" read as the quantity beside
// "Kilos".
#[test]
fn what_the_fourth_review_found() {
    check(
        "Date,Item,Q,Temp\n2024-03-04,Trowel,9,25\n2024-03-05,Trowel,7,21\n2024-03-06,Trowel,8,22\n",
        Expect {
            items: Some(vec![("Trowel", some(&[9.0, 7.0, 8.0]))]),
            ..Expect::default()
        },
    );
    let mut grades = "Item,Year,Q,Qty\n".to_string();
    for year in [2021, 2022] {
        for grade in 1..=3 {
            grades.push_str(&format!("Trowel,{year},{grade},{}\n", grade * 10));
        }
    }
    check(
        &grades,
        Expect {
            items: Some(vec![("Trowel", some(&[60.0, 60.0]))]),
            frequency: Some(Frequency::Yearly),
            ..Expect::default()
        },
    );
    let mut weeks = "Item,Year,W,Qty\n".to_string();
    for week in 1..=30 {
        weeks.push_str(&format!("Trowel,2024,{week},{}\n", week + 3));
    }
    check(
        &weeks,
        Expect {
            errors: vec![(2, "W", "1")],
            ..Expect::default()
        },
    );
    check(
        "Item,Year,YoY,Jan,Feb,Mar,Apr,May,Jun,Jul,Aug,Sep,Oct,Nov,Dec\n\
         Trowel,2023,5,1,2,3,4,5,6,7,8,9,10,11,12\n",
        Expect {
            layout: Some(Layout::Across),
            warned: vec![vec!["\"YoY\"", "was not used"]],
            ..Expect::default()
        },
    );
    for text in [
        "Item,Year,Week,Mon,Tue,Wed,Thu,Fri,Sat,Sun\nTrowel,2024,1,3,9,9,9,5,8,2\nTrowel,2024,2,4,2,9,3,7,2,7\n",
        "Item,Week,Mon,Tue,Wed,Thu,Fri,Sat,Sun\nTrowel,2024-01-01,3,9,9,9,5,8,2\nTrowel,2024-01-08,4,2,9,3,7,2,7\n",
    ] {
        check(
            text,
            Expect {
                errors: vec![(1, "Mon", "Mon")],
                ..Expect::default()
            },
        );
    }
    check(
        "Date,Day,Sales\n2024-03-04,Mo,5\n2024-03-05,Tu,6\n2024-03-06,We,7\n2024-03-07,Th,8\n",
        Expect {
            items: Some(vec![("Sales", some(&[5.0, 6.0, 7.0, 8.0]))]),
            warned: vec![vec!["\"Day\"", "calendar details"]],
            ..Expect::default()
        },
    );
    check(
        "Date,Item,Target,Actual\n2024-03-04,Trowel,10,9\n2024-03-05,Trowel,10,7\n2024-03-06,Trowel,10,8\n",
        Expect {
            items: Some(vec![("Trowel", some(&[9.0, 7.0, 8.0]))]),
            ..Expect::default()
        },
    );
    check(
        "Month,Trowel,Rake,Plan\n2024-01,5,6,12\n2024-02,7,8,14\n2024-03,6,7,13\n",
        Expect {
            items: Some(vec![
                ("Trowel", some(&[5.0, 7.0, 6.0])),
                ("Rake", some(&[6.0, 8.0, 7.0])),
            ]),
            warned: vec![vec!["\"Plan\"", "a plan", "not used"]],
            ..Expect::default()
        },
    );
    check(
        "Item,YYYY,MM,Kilos\nPala,2023,11,5\nPala,2023,12,6\nPala,2024,1,7\nPala,2024,2,8\n",
        Expect {
            warned: vec![vec!["\"MM\" was not used", "\"Kilos\""]],
            ..Expect::default()
        },
    );
    // A stock level, a plan or a rank alone is no demand: refused at its header (the stock
    // on hand of `Date,Item,On hand` had been planned as sales without a word).
    for (text, column) in [
        (
            "Date,Item,On hand\n2024-03-04,Trowel,40\n2024-03-05,Trowel,38\n",
            "On hand",
        ),
        (
            "Month,Item,Plan\n2024-01,Trowel,40\n2024-02,Trowel,38\n",
            "Plan",
        ),
        ("Month,Rank\n2024-01,1\n2024-02,2\n", "Rank"),
    ] {
        check(
            text,
            Expect {
                errors: vec![(1, column, column)],
                ..Expect::default()
            },
        );
    }
    // Money alone is read as the quantities (one number column always stays) but said;
    // "value" is not (it names quantities as often).
    check(
        "Date,Item,Revenue\n2024-03-04,Trowel,40\n2024-03-05,Trowel,38\n",
        Expect {
            items: Some(vec![("Trowel", some(&[40.0, 38.0]))]),
            warned: vec![vec!["\"Revenue\"", "names money"]],
            ..Expect::default()
        },
    );
    let value = read("series,t,value\nA,1,5\nA,2,6\n");
    assert!(
        value.warnings.iter().all(|w| !w.contains("names money")),
        "{value:#?}"
    );
    // Two-letter states as a wide table's items stay items.
    check(
        "Year,MA,MI,MO,NY\n2021,10,20,30,1\n2022,11,21,31,2\n",
        Expect {
            layout: Some(Layout::Wide),
            ..Expect::default()
        },
    );
}
