//! The desk's per-item glue (`order::plan_order`) and the Stock plan's settings as typed
//! (`stock::StockText`): constructed cases. The figures themselves are checked against their
//! outside references in stock.rs; here, that the settings reach them as the user gave them.

use morrowcast_engine::intake::StockRow;
use morrowcast_engine::order::{plan_order, OrderError, NO_ROW_NOTE};
use morrowcast_engine::settings::PlanSettings;
use morrowcast_engine::stock::{StockField, StockText, Target, TargetKind};
use Target::{CycleService as Csl, FillRate as Fill};

use crate::support::monthly;

/// The settings typed, and what the check gives: (lead time, review, target) or the fields
/// refused.
fn check(text: StockText, expected: Result<(usize, Option<usize>, Target), Vec<StockField>>) {
    let got = text
        .check()
        .map(|s| (s.lead_time(), s.review_period(), s.target()))
        .map_err(|errors| {
            for e in &errors {
                assert!(!e.message.is_empty(), "{e:?} has no message");
            }
            errors.iter().map(|e| e.field).collect::<Vec<_>>()
        });
    assert_eq!(got, expected, "{text:?}");
}

fn typed(lead: &str, review: &str, kind: TargetKind, target: &str, quantity: &str) -> StockText {
    StockText {
        lead_time: lead.into(),
        lead_time_sd: String::new(),
        review_period: review.into(),
        target_kind: kind,
        target: target.into(),
        order_quantity: quantity.into(),
    }
}

#[test]
fn stock_settings_as_typed_are_read_or_refused_field_by_field() {
    use StockField::*;
    use TargetKind::{CycleService, FillRate};
    check(StockText::default(), Ok((1, None, Csl(0.95))));
    check(
        typed("2", "4", FillRate, "0.98", ""),
        Ok((2, Some(4), Fill(0.98))),
    );
    check(
        typed(" 0 ", "", CycleService, "90%", "12"),
        Ok((0, None, Csl(0.9))),
    );
    check(
        typed("2.5", "", CycleService, "95", ""),
        Err(vec![LeadTime]),
    );
    check(typed("", "", CycleService, "95", ""), Err(vec![LeadTime]));
    check(
        typed("400", "", CycleService, "95", ""),
        Err(vec![LeadTime]),
    );
    check(
        typed("1", "0", CycleService, "95", ""),
        Err(vec![ReviewPeriod]),
    );
    check(typed("1", "", CycleService, "100", ""), Err(vec![Target]));
    check(typed("1", "", FillRate, "abc", ""), Err(vec![Target]));
    check(
        typed("1", "2", CycleService, "95", "10"),
        Err(vec![OrderQuantity]),
    );
    check(
        typed("1", "", CycleService, "95", "-3"),
        Err(vec![OrderQuantity]),
    );
    // Every bad field is named at once, not only the first.
    check(
        typed("x", "y", CycleService, "0", "z"),
        Err(vec![LeadTime, ReviewPeriod, Target, OrderQuantity]),
    );
    let spread = StockText {
        lead_time_sd: "-1".into(),
        ..StockText::default()
    };
    check(spread, Err(vec![LeadTimeSd]));
}

fn seasonal(months: usize) -> morrowcast_engine::series::Series {
    monthly(
        (0..months)
            .map(|t| {
                Some(
                    100.0
                        + 20.0 * ((t % 12) as f64 / 12.0 * std::f64::consts::TAU).sin()
                        + (t % 5) as f64,
                )
            })
            .collect(),
    )
}

#[test]
fn a_stock_row_overrides_the_files_settings_and_a_missing_row_is_noted() {
    let series = seasonal(60);
    let defaults = StockText::default().check().unwrap();
    let settings = PlanSettings::default();
    let plain = plan_order(&series, &settings, &defaults, None, false).unwrap();
    assert_eq!(plain.stock.protection_periods, 1);
    assert_eq!(plain.stock.suggested_order, None);
    assert!(!plain.stock.notes.iter().any(|n| n == NO_ROW_NOTE));
    let missing = plan_order(&series, &settings, &defaults, None, true).unwrap();
    assert!(missing.stock.notes.iter().any(|n| n == NO_ROW_NOTE));
    let row = StockRow {
        item: series.name().to_string(),
        on_hand: Some(40.0),
        lead_time: Some(3),
        review_period: Some(2),
        ..StockRow::default()
    };
    let rowed = plan_order(&series, &settings, &defaults, Some(&row), true).unwrap();
    assert_eq!(rowed.stock.protection_periods, 5);
    assert!(rowed.stock.suggested_order.is_some());
    // The plan reaches over the protection interval even past the automatic horizon.
    let long = StockRow {
        lead_time: Some(30),
        ..row.clone()
    };
    let far = plan_order(&series, &settings, &defaults, Some(&long), true).unwrap();
    assert!(far.plan.forecast.len() >= 32);
    // A horizon the user set must reach it.
    let short = settings.clone().with_horizon(Some(3)).unwrap();
    assert_eq!(
        plan_order(&series, &short, &defaults, Some(&row), true).unwrap_err(),
        OrderError::HorizonShort {
            horizon: 3,
            periods: 5
        }
    );
    // A target outside (0, 1) in a row built by other code is refused, not used.
    let bad = StockRow {
        target: Some(Target::CycleService(1.5)),
        ..row
    };
    assert!(matches!(
        plan_order(&series, &settings, &defaults, Some(&bad), true),
        Err(OrderError::Stock(_))
    ));
}
