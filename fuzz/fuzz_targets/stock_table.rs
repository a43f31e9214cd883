//! Any bytes as a stock table: no panic, no hang; every row kept has an item name, no name
//! twice; every error names a row within the text; every kept row applies to the Stock plan's
//! settings without an error (the table checked what the settings check).

#![no_main]

use libfuzzer_sys::fuzz_target;
use morrowcast_engine::intake::{self, read_stock_table};
use morrowcast_engine::stock::{StockSettings, Target};

/// A weekly history (lead times in days and months both convert, or are refused) of items
/// named like the table's likely rows; and a long one naming its items by a store, a code and
/// a description joined ("Oak / 00123 / Seed packets"), so rows match by parts too; and one
/// whose codes name each item once beside a shared description, read by code as chosen too.
const HISTORIES: [&str; 3] = [
    "week,A,a-1,A1,00123,Seed packets\n2024-W01,1,2,3,4,5\n2024-W02,1,2,3,4,5\n",
    "week,store,code,description,units\n2024-W01,Oak,FG-00123,Seed packets,1\n\
     2024-W01,Mill,FG-00123,Seed packets,2\n2024-W01,Oak,A-1,Trowel / steel,3\n\
     2024-W01,Oak,B2,A1,4\n2024-W02,Oak,FG-00123,Seed packets,1\n\
     2024-W02,Mill,FG-00123,Seed packets,2\n2024-W02,Oak,A-1,Trowel / steel,3\n\
     2024-W02,Oak,B2,A1,4\n",
    "week,code,description,units\n2024-W01,A-1,Seed packets,1\n2024-W01,00123,Seed packets,2\n\
     2024-W01,B2,A1,3\n2024-W02,A-1,Seed packets,1\n2024-W02,00123,Seed packets,2\n\
     2024-W02,B2,A1,3\n",
];

fuzz_target!(|data: &[u8]| {
    for text in HISTORIES {
        check(data, &intake::read(text));
    }
});

fn check(data: &[u8], history: &intake::IntakeReport) {
    check_table(read_stock_table(data, history), data);
    let (chosen, _) = intake::read_stock_table_and_text(data, None, history, Some("code"));
    check_table(chosen, data);
}

fn check_table(table: intake::StockTable, data: &[u8]) {
    // An upper bound on the lines (CR LF counts twice; lone CR ends a line too).
    let lines = data.iter().filter(|b| **b == b'\n' || **b == b'\r').count() + 1;
    for e in &table.errors {
        assert!(e.row >= 1 && e.row <= lines, "row {} of {lines}", e.row);
    }
    let base = StockSettings::new(1, None, Target::cycle_service(0.95).unwrap()).unwrap();
    for (i, row) in table.rows.iter().enumerate() {
        assert!(!row.item.is_empty());
        assert!(table.rows[..i].iter().all(|r| r.item != row.item));
        base.for_row(row).expect("a row the table accepted applies");
    }
}
