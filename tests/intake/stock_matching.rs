//! Stock tables matched to histories whose items are named by several columns joined (a code
//! and a description, a store and a product): 570 pairs six probing reviews wrote, each
//! with the on-hand figure every history item should get as its writer judged the rows
//! (`tests/fixtures/stock_matching/README.md`).
//!
//! Two checks, one per strength: no case puts a figure on another item (an item whose row
//! is said to have no figure gets none; an item with one gets it or none: a row may be left
//! out, said, never misplaced), and the cases the rules read as meant keep being read so
//! (every figure, and whether the table is refused).

use morrowcast_engine::intake::{read, read_stock_table};
use serde_json::Value;

/// One case's verdict: `None` when it holds, else why not.
fn check(case: &Value) -> Option<String> {
    let history = read(case["history"].as_str().unwrap_or_default());
    let table = read_stock_table(
        case["stock"].as_str().unwrap_or_default().as_bytes(),
        &history,
    );
    let refused = history.has_errors() || !table.errors.is_empty();
    let strict = case["as_meant"].as_bool().unwrap_or(false);
    if strict && case["refuse"].as_bool() != Some(refused) {
        return Some(format!("refused {refused}, meant {}", case["refuse"]));
    }
    if refused {
        return None;
    }
    let got = |item: &str| {
        table
            .rows
            .iter()
            .find(|r| r.item == item)
            .and_then(|r| r.on_hand)
    };
    let expected = case["on_hand"].as_object()?;
    for (item, want) in expected {
        let have = got(item);
        let misplaced = match want.as_f64() {
            Some(w) => have.is_some_and(|h| h != w) || (strict && have.is_none()),
            // No figure meant ("ANY" leaves the item free).
            None if want.is_null() => have.is_some(),
            None => false,
        };
        if misplaced {
            return Some(format!("{item:?}: meant {want}, read {have:?}"));
        }
    }
    None
}

#[test]
fn no_stock_figure_lands_on_another_item_and_the_cases_read_as_meant_stay_so() {
    let text = include_str!("../fixtures/stock_matching/cases.jsonl");
    let cases: Vec<Value> = text
        .lines()
        .map(|l| serde_json::from_str(l).expect("a case per line"))
        .collect();
    assert_eq!(cases.len(), 570);
    let failed: Vec<String> = cases
        .iter()
        .filter_map(|c| check(c).map(|why| format!("{}: {why} ({})", c["case"], c["why"])))
        .collect();
    assert!(
        failed.is_empty(),
        "{} of {}:\n{}",
        failed.len(),
        cases.len(),
        failed.join("\n")
    );
}
