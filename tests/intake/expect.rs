//! The one `check(input, expected)` helper of intake's data-driven tests: what a read must
//! give, compared field by field where the test sets it.
//!
//! Kept apart from: the tests themselves (`misreads`, `exports`), which hold only their inputs
//! and expectations.

use morrowcast_engine::calendar::Frequency;
use morrowcast_engine::intake::{read, DecimalMark, IntakeReport, Layout};

/// An item as (name, values).
pub type Named<'a> = (&'a str, Vec<Option<f64>>);

/// What one read must give. `errors` are compared whole, as (row, column, text); the other
/// fields only when set. `warned`: for each list, some warning holds all of its words.
#[derive(Default)]
pub struct Expect<'a> {
    pub errors: Vec<(usize, &'a str, &'a str)>,
    pub items: Option<Vec<Named<'a>>>,
    pub periods: Option<Vec<&'a str>>,
    pub warned: Vec<Vec<&'a str>>,
    pub decimal: Option<DecimalMark>,
    pub layout: Option<Layout>,
    pub frequency: Option<Frequency>,
}

pub fn check(input: &str, expected: Expect<'_>) -> IntakeReport {
    let r = read(input);
    let errors: Vec<(usize, &str, &str)> = r
        .errors
        .iter()
        .map(|e| (e.row, e.column.as_str(), e.text.as_str()))
        .collect();
    assert_eq!(
        errors, expected.errors,
        "errors of {input:?}: {:#?}",
        r.errors
    );
    if let Some(items) = &expected.items {
        let got: Vec<Named<'_>> = r
            .items
            .iter()
            .map(|i| (i.name.as_str(), i.values.clone()))
            .collect();
        assert_eq!(&got, items, "items of {input:?}");
    }
    if let Some(periods) = &expected.periods {
        let got: Vec<String> = r.items[0].periods.iter().map(|p| p.to_string()).collect();
        assert_eq!(&got, periods, "periods of {input:?}");
    }
    for words in &expected.warned {
        assert!(
            r.warnings
                .iter()
                .any(|w| words.iter().all(|word| w.contains(word))),
            "no warning with {words:?} for {input:?}: {:#?}",
            r.warnings
        );
    }
    if let Some(mark) = expected.decimal {
        assert_eq!(r.decimal, mark, "decimal mark of {input:?}");
    }
    if let Some(layout) = expected.layout {
        assert_eq!(r.layout, layout, "layout of {input:?}");
    }
    if let Some(frequency) = expected.frequency {
        assert_eq!(r.frequency, frequency, "frequency of {input:?}");
    }
    r
}

pub fn some(values: &[f64]) -> Vec<Option<f64>> {
    values.iter().map(|v| Some(*v)).collect()
}
