//! A last period that looks unfinished. Data taken before its last period ended (a month
//! exported on its second day, a till's day taken at ten in the morning, a year's figures in
//! November) holds a fraction of a period's demand; planned as a whole period it pulls every
//! forecast, and with it every order, down.
//!
//! Kept apart from: reading the table (the items are built) and modelling. Nothing is
//! changed, only said: a real fall in demand (a lost customer, a shelf out of stock) looks the
//! same, and only the user knows which it is. The warning names the period, the figures and
//! what to do.
//!
//! The rule, on sums over the items whose values run to the file's last period P with a value
//! in every period compared (so one quiet item proves nothing, and a single item's file is
//! judged on its own figures):
//! - the sum at P is below half the median of the sums at P-1, P-2 and P-3 (a median, so
//!   one spike among them does not make an ordinary period look low), a median of at least
//!   [`LEAST_MEDIAN`];
//! - and, where the calendar suggests a season of m periods (7 days, 52 weeks, 12 months, 4
//!   quarters) and items reach back to P-m, the sum at P over those is below half their sum at
//!   P-m too: a quiet Sunday after a busy week, or a January after December, is the season.
//!
//! The cut-offs are our choice. With Poisson demand of mean 20 a whole period falls below 10
//! about once in 200 (P(X <= 9) = 0.0050 for mean 20: scipy 1.17.1, poisson.cdf(9, 20)), less at
//! higher volumes; on the M3 series, whose last periods are whole, the rule speaks for the
//! share measured in `tests/intake/last_period.rs` (0.42 % of 6,006 whole last periods; 99.8 %
//! of the same cut to a tenth).

use super::Item;
use crate::calendar::Period;

/// A last period that looks unfinished, and where its rows stand.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct UnfinishedPeriod {
    /// The period.
    pub period: Period,
    /// The 1-based lines of the rows holding it, for [`super::leave_out_rows`]; empty where
    /// it cannot be left out row by row (periods across the header).
    pub rows: Vec<usize>,
}

/// Periods before the last whose median it is compared with.
const RECENT: usize = 3;

/// Fraction of the periods compared below which the last one looks unfinished.
const FRACTION: f64 = 0.5;

/// Smallest median demand of the recent periods for the rule to speak: below it a half is a
/// few units, which ordinary ups and downs reach.
const LEAST_MEDIAN: f64 = 20.0;

/// The value `back` periods before an item's last one, when it has one there.
fn value_back(item: &Item, back: usize) -> Option<f64> {
    let len = item.values.len();
    if back >= len {
        return None;
    }
    item.values[len - 1 - back]
}

/// The sums over the items that have a value `back` periods before their last for every
/// `back` in `periods`, one sum per entry of `periods`, and how many items were summed.
fn sums(items: &[&Item], periods: &[usize]) -> (Vec<f64>, usize) {
    let mut totals = vec![0.0; periods.len()];
    let mut count = 0;
    for item in items {
        let values: Option<Vec<f64>> = periods.iter().map(|&b| value_back(item, b)).collect();
        if let Some(values) = values {
            for (t, v) in totals.iter_mut().zip(values) {
                *t += v;
            }
            count += 1;
        }
    }
    (totals, count)
}

/// A whole number percentage of `part` in `whole`.
fn percent(part: f64, whole: f64) -> String {
    format!("{:.0} %", 100.0 * part / whole)
}

/// The last period and the warning naming it, when it looks unfinished (module doc).
pub(crate) fn last_period(items: &[Item]) -> Option<(Period, String)> {
    let last: Period = items
        .iter()
        .filter_map(|i| i.periods.last())
        .max()
        .copied()?;
    let ending: Vec<&Item> = items
        .iter()
        .filter(|i| i.periods.last() == Some(&last))
        .collect();
    let recent: Vec<usize> = (0..=RECENT).collect();
    let (totals, count) = sums(&ending, &recent);
    if count == 0 {
        return None;
    }
    let mut recent_sums = totals[1..].to_vec();
    recent_sums.sort_by(f64::total_cmp);
    let median = recent_sums[RECENT / 2];
    if median < LEAST_MEDIAN || totals[0] >= FRACTION * median {
        return None;
    }
    let mut evidence = format!(
        "{} is {} of the median of the {RECENT} periods before it",
        if count == 1 && items.len() == 1 {
            "its demand".to_string()
        } else {
            format!("the demand of the {} items running to it", count)
        },
        percent(totals[0], median),
    );
    if let Some(m) = last.frequency().natural_season() {
        let (season, reaching) = sums(&ending, &[0, m]);
        if reaching > 0 {
            if season[0] >= FRACTION * season[1] {
                return None;
            }
            evidence.push_str(&format!(
                " and {} of {}, a season before",
                percent(season[0], season[1]),
                last.offset(-(m as i64))
            ));
        }
    }
    let warning = format!(
        "the last period, {last}, looks unfinished: {evidence}. If the data was taken before \
         {last} ended, its low figures pull every forecast and order down: leave its rows out \
         of the file, or add them once it is over. It is planned as it stands."
    );
    Some((last, warning))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Items of monthly values ending in December 2024, as (name, values) pairs; the warning
    /// or none.
    fn check(items: &[&[Option<f64>]], expected: Option<&str>) {
        let built: Vec<Item> = items
            .iter()
            .enumerate()
            .map(|(i, values)| {
                let len = values.len() as i64;
                let last = Period::month(2024, 12);
                Item {
                    name: format!("item {i}"),
                    periods: (0..len).map(|k| last.offset(k - len + 1)).collect(),
                    values: values.to_vec(),
                }
            })
            .collect();
        let got = last_period(&built).map(|(_, warning)| warning);
        match (got.as_deref(), expected) {
            (None, None) => {}
            (Some(got), Some(part)) => assert!(got.contains(part), "{got}"),
            (got, expected) => panic!("got {got:?}, expected a warning holding {expected:?}"),
        }
    }

    fn some(values: &[f64]) -> Vec<Option<f64>> {
        values.iter().map(|v| Some(*v)).collect()
    }

    #[test]
    fn a_low_last_period_is_named() {
        check(
            &[&some(&[30.0, 30.0, 30.0, 3.0])],
            Some("the last period, 2024-12, looks unfinished: its demand is 10 % of the median"),
        );
        // Summed over items: one busy, one quiet.
        check(
            &[
                &some(&[40.0, 40.0, 40.0, 4.0]),
                &some(&[1.0, 0.0, 2.0, 0.0]),
            ],
            Some("the demand of the 2 items running to it is 10 %"),
        );
    }

    #[test]
    fn whole_periods_and_small_volumes_are_left_alone() {
        check(&[&some(&[30.0, 30.0, 30.0, 16.0])], None);
        // Below the least median: a few units either way prove nothing.
        check(&[&some(&[6.0, 5.0, 7.0, 0.0])], None);
        // One spike among the periods before (a thousands separator read as written, a
        // promotion) does not make an ordinary last period look low.
        check(&[&some(&[20.0, 1234.0, 22.0, 18.0])], None);
        // Too short to compare.
        check(&[&some(&[30.0, 3.0])], None);
        // A gap among the periods compared: that item is not summed.
        check(&[&[Some(30.0), None, Some(30.0), Some(3.0)]], None);
    }

    #[test]
    fn the_season_a_year_before_decides_when_there_is_one() {
        let mut low_december = vec![30.0; 16];
        low_december[3] = 2.0; // December 2023, the same season position
        low_december[15] = 3.0;
        check(&[&some(&low_december)], None);
        let mut high_december = vec![30.0; 16];
        high_december[15] = 3.0;
        check(
            &[&some(&high_december)],
            Some("and 10 % of 2023-12, a season before"),
        );
    }

    #[test]
    fn items_that_stopped_earlier_do_not_count() {
        // The second item ends in November (shorter, same start): only the first is compared.
        let built = vec![
            Item {
                name: "a".into(),
                periods: (0..4).map(|k| Period::month(2024, 9).offset(k)).collect(),
                values: some(&[30.0, 30.0, 30.0, 30.0]),
            },
            Item {
                name: "b".into(),
                periods: (0..3).map(|k| Period::month(2024, 9).offset(k)).collect(),
                values: some(&[900.0, 900.0, 0.0]),
            },
        ];
        assert_eq!(last_period(&built), None);
    }
}
