//! A last period that looks unfinished. Data taken before its last period ended (a month
//! exported on its second day, a till's day taken at ten in the morning, a year's figures in
//! November) holds a fraction of a period's demand; planned as a whole period it pulls every
//! forecast, and with it every order, down.
//!
//! Kept apart from: reading the table (the items are built) and modelling. Nothing is
//! changed, only said: a real fall in demand (a lost customer, a shelf out of stock, the end
//! of a season) looks the same, and only the user knows which it is. The warning names the
//! period, the figures and what to do; the page offers to leave the rows out.
//!
//! The rule. P is the last period with a figure (a template's empty future rows are not
//! demand). Sums over the items running to P with a value in every period compared (in a
//! long table, whose rows leave out the zeros, an item whose last row is at most three periods
//! before P sold nothing since: its till had no sale yet that day), so one quiet item proves
//! nothing and a single item's file is judged on its own figures. The places of the season
//! with no demand every time they were seen, at least twice (a weekend, a winter month), are
//! closed: P at one says nothing, and the periods compared skip them. P looks unfinished when:
//! - its sum is below half the median of the three open periods before it (a median, so one
//!   spike among them does not make an ordinary period look low), below half the open period
//!   just before it (after a fall one period earlier the last is the new level), and so far
//!   below the median that Poisson demand with that mean falls as low in at most [`TAIL`] of
//!   periods (from a median of 20 half is enough; at 10, 2 or fewer), on a median of at least
//!   [`LEAST_MEDIAN`] (below it the ups and downs of real demand, more spread than Poisson's,
//!   reach such falls);
//! - where the calendar suggests a season of m periods (7 days, 52 weeks, 12 months, 4
//!   quarters) and items reach back to P-m: the sum at P over those is below half their sum
//!   at P-m too (a quiet Sunday after a busy week, a January after December, is the season),
//!   unless, for weeks, months and quarters, P-m itself fell below half the median of the
//!   three periods before it, closed or not (the same fall a season before: a season's end;
//!   for days a habitually short Saturday falls so every week, and the day a week back alone
//!   decides);
//! - the items but the one that fell most are not whole (at least half their median, a median
//!   of at least [`OTHERS_SPEAK`]): data taken early cuts every item short, while one item
//!   falling alone (discontinued and written as 0, out of stock) leaves the period whole;
//! - the summed demand before P, closed places left out, is not intermittent (demand in at
//!   least one period in [`ADI_CUTOFF`], Syntetos, Boylan & Croston 2005): where empty
//!   periods are ordinary, an empty last one is too;
//! - without a period a season back to compare with: never for days (a till's first week: a
//!   short Saturday is a third of a weekday); otherwise the sum at P is below [`STRICT`] of
//!   the median (a season that ends, a summer item's October in a year's export, falls by
//!   half in whole months; measured by a review on its simulated 12-month garden-shop
//!   exports: 40-51 % of those ending in September or October were warned at a half, 4.5 %
//!   of all at 0.35, 96 % of their last months cut to a tenth still found), and not when two or
//!   more earlier periods (after the first) were at most twice as busy (a shop shut in
//!   winter).
//!
//! The cut-offs are our choice. Poisson tails: P(X <= 9) = 0.0050 for mean 20 (scipy 1.17.1,
//! poisson.cdf(9, 20)); statrs's Poisson gives the same (checked in the tests). Measured: on
//! the M3 series, whose last periods are whole, 0.25 % of 6,006 histories warned and 96.1 % of
//! the same cut to a tenth found (`tests/intake/last_period.rs`); on simulated shops (the
//! README's figures) false warnings 0-1 % for steady demand, 1-3 % for volatile, 6 % for
//! a few lumpy items.

use crate::sorting;
use statrs::distribution::{DiscreteCDF, Poisson};

use super::Item;
use crate::calendar::{Frequency, Period};
use crate::patterns::demand_class::{classify_demand, ADI_CUTOFF};

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

impl UnfinishedPeriod {
    /// The period as the warning names it ("2025-12"; plain positions "period 5").
    pub fn name(&self) -> String {
        period_name(self.period)
    }
}

/// Periods before the last whose median it is compared with.
const RECENT: usize = 3;

/// Fraction of the periods compared below which the last one looks unfinished.
const HALF: f64 = 0.5;

/// The fraction of the recent median below which the last period looks unfinished when no
/// period a season back tells a season's end from an unfinished period.
const STRICT: f64 = 0.35;

/// Smallest median of the recent sums for the rule to speak.
const LEAST_MEDIAN: f64 = 10.0;

/// Largest chance, for Poisson demand with the recent median as its mean, of a whole period
/// as low as the last one: below it the fall is more than ordinary ups and downs.
const TAIL: f64 = 0.005;

/// Periods as quiet as the last seen before it that make it nothing new, where no period a
/// season back can tell (see [`quiet_before`]).
const QUIET_SEEN: usize = 2;

/// Smallest median of the other items' sums for their being whole to clear the period (see
/// [`others_whole`]); below it their ups and downs say little.
const OTHERS_SPEAK: f64 = 10.0;

/// An item's value `back` periods before `last`: in a table that leaves its zeros out
/// (`zeros_unwritten`), 0 after the item's own last row; `None` before its first period.
fn value_back(item: &Item, last: Period, back: usize, zeros_unwritten: bool) -> Option<f64> {
    let first = *item.periods.first()?;
    let index = usize::try_from(first.steps_to(last) - back as i64).ok()?;
    match item.values.get(index) {
        Some(value) => *value,
        None => zeros_unwritten.then_some(0.0),
    }
}

/// For the items with a value `back` periods before `last` for every `back` in `periods`:
/// their values, one row per item, as (item index, values).
fn rows_for(
    items: &[&Item],
    last: Period,
    periods: &[usize],
    zeros_unwritten: bool,
) -> Vec<(usize, Vec<f64>)> {
    items
        .iter()
        .enumerate()
        .filter_map(|(i, item)| {
            let values: Option<Vec<f64>> = periods
                .iter()
                .map(|&b| value_back(item, last, b, zeros_unwritten))
                .collect();
            values.map(|v| (i, v))
        })
        .collect()
}

/// Column sums of `rows`, `width` columns.
fn sums(rows: &[(usize, Vec<f64>)], width: usize) -> Vec<f64> {
    let mut totals = vec![0.0; width];
    for (_, values) in rows {
        for (t, v) in totals.iter_mut().zip(values) {
            *t += v;
        }
    }
    totals
}

fn median_of_three(values: &[f64]) -> f64 {
    let mut sorted = values.to_vec();
    sorting::sort_by(&mut sorted, f64::total_cmp);
    sorted[sorted.len() / 2]
}

/// The whole percentage of `part` in `whole`, rounded down (49.6 is "49 %": under half).
fn percent(part: f64, whole: f64) -> String {
    format!("{:.0} %", (100.0 * part / whole).floor())
}

/// How a period is named in the warning: plain positions as "period 5".
fn period_name(p: Period) -> String {
    match p.frequency() {
        Frequency::Undated => format!("period {p}"),
        _ => p.to_string(),
    }
}

/// Whether `last` is so far below `median` that Poisson demand of that mean is as low at most
/// [`TAIL`] of the time.
fn beyond_ordinary(last: f64, median: f64) -> bool {
    match Poisson::new(median) {
        Ok(poisson) => poisson.cdf(last.max(0.0).floor() as u64) <= TAIL,
        Err(_) => false,
    }
}

/// The history summed over `running` before `last` (index k: k + 1 periods back), over the
/// items with a value there (an item first sold later, or a gap, leaves out that item only),
/// back to the longest one's first period; `None` where none has one.
fn summed_before(running: &[&Item], last: Period, zeros_unwritten: bool) -> Vec<Option<f64>> {
    let longest = running
        .iter()
        .filter_map(|i| i.periods.first().map(|first| first.steps_to(last)))
        .max()
        .unwrap_or(0);
    (1..=usize::try_from(longest).unwrap_or(0))
        .map(|back| {
            running
                .iter()
                .filter_map(|item| value_back(item, last, back, zeros_unwritten))
                .fold(None, |sum, v| Some(sum.unwrap_or(0.0) + v))
        })
        .collect()
}

/// The places of the calendar's season (`back % m`) that had no demand every time, at least
/// twice, in `before`: closed (a weekend, a winter month). Without a season, none.
fn closed_places(before: &[Option<f64>], season: Option<usize>) -> Vec<bool> {
    let Some(m) = season else {
        return vec![false];
    };
    let mut seen = vec![(0usize, false); m];
    for (k, v) in before.iter().enumerate() {
        if let Some(v) = v {
            let place = &mut seen[(k + 1) % m];
            place.0 += 1;
            place.1 |= *v > 0.0;
        }
    }
    seen.iter()
        .map(|(count, any)| *count >= 2 && !any)
        .collect()
}

/// Whether the summed demand before the last period, its closed places left out, comes in
/// fewer than one period in [`ADI_CUTOFF`] (Syntetos, Boylan & Croston 2005): intermittent,
/// where an empty period is ordinary.
fn intermittent(before: &[Option<f64>], closed: &[bool]) -> bool {
    let open: Vec<f64> = before
        .iter()
        .enumerate()
        .filter(|(k, _)| !closed[(k + 1) % closed.len()])
        .filter_map(|(_, v)| *v)
        .collect();
    // No history to judge by is no evidence of intermittent demand.
    !open.is_empty() && classify_demand(&open).adi >= ADI_CUTOFF
}

/// Whether, before the recent periods (and after the first, which may be unfinished itself),
/// at least [`QUIET_SEEN`] periods were at most twice `level`: a shop shut in winter; a period
/// that low is then nothing new.
fn quiet_before(before: &[Option<f64>], level: f64) -> bool {
    let earlier = before
        .get(RECENT..before.len().saturating_sub(1))
        .unwrap_or(&[]);
    earlier
        .iter()
        .flatten()
        .filter(|sum| **sum <= 2.0 * level)
        .count()
        >= QUIET_SEEN
}

/// The last period and the warning naming it, when it looks unfinished (module doc).
/// `zeros_unwritten`: the table leaves out rows of no sales (a long table).
pub(crate) fn last_period(items: &[Item], zeros_unwritten: bool) -> Option<(Period, String)> {
    // The last period with a figure: empty rows after it (a template's future months) are
    // not demand.
    let last: Period = items
        .iter()
        .filter_map(|i| {
            let at = i.values.iter().rposition(Option::is_some)?;
            i.periods.get(at)
        })
        .max()
        .copied()?;
    let reach = if zeros_unwritten { RECENT as i64 } else { 0 };
    let running: Vec<&Item> = items
        .iter()
        .filter(|i| i.periods.first().is_some_and(|first| *first <= last))
        .filter(|i| i.periods.last().is_some_and(|p| p.steps_to(last) <= reach))
        .collect();
    let season = last.frequency().natural_season();
    let before = summed_before(&running, last, zeros_unwritten);
    let closed = closed_places(&before, season);
    if closed[0] {
        return None;
    }
    // The periods compared: the last and the three open ones before it (a closed weekend
    // before a Monday compares nothing).
    let compared: Vec<usize> = std::iter::once(0)
        .chain(
            (1..=before.len())
                .filter(|back| !closed[back % closed.len()])
                .take(RECENT),
        )
        .collect();
    let rows = rows_for(&running, last, &compared, zeros_unwritten);
    if rows.is_empty() || compared.len() < RECENT + 1 {
        return None;
    }
    let totals = sums(&rows, RECENT + 1);
    let median = median_of_three(&totals[1..]);
    let fell = median >= LEAST_MEDIAN
        && totals[0] < HALF * median
        // Below the period just before too: after a fall one period earlier, the last one
        // is the new level, whole.
        && totals[0] < HALF * totals[1]
        && beyond_ordinary(totals[0], median);
    if !fell || others_whole(&rows) || intermittent(&before, &closed) {
        return None;
    }
    let subject = match (rows.len(), items.len()) {
        (_, 1) => "its demand".to_string(),
        (1, _) => "the demand of the one item with figures there".to_string(),
        (n, _) => format!("the demand summed over the {n} items with figures there"),
    };
    let mut evidence = if totals[0] < 0.0 {
        format!("{subject} is below zero (more came back than was sold)")
    } else {
        format!(
            "{subject} is {} of the median of the {RECENT} periods before it",
            percent(totals[0], median)
        )
    };
    let daily = last.frequency() == Frequency::Daily;
    match season_back(&running, last, zeros_unwritten) {
        SeasonBack::Above => return None,
        // A habitually short day (a Saturday) falls below the days before it every week:
        // the day a week back alone decides.
        SeasonBack::Fell { .. } if !daily => return None,
        SeasonBack::Below { then, share } | SeasonBack::Fell { then, share }
            if totals[0] >= 0.0 =>
        {
            let span = if daily { "a week" } else { "a year" };
            evidence.push_str(&format!(
                " and {share} of {}, {span} before",
                period_name(then)
            ));
        }
        SeasonBack::Below { .. } | SeasonBack::Fell { .. } => {}
        SeasonBack::None => {
            // Days without the same weekday a week back (a till's first week) say too little:
            // a short Saturday is a third of a weekday.
            if daily || totals[0] >= STRICT * median || quiet_before(&before, totals[0]) {
                return None;
            }
        }
    }
    let name = period_name(last);
    let warning = format!(
        "the last period, {name}, looks unfinished: {evidence}. If the data was taken before \
         it ended, leave it out until it is over: counted as a whole period, its low \
         figures pull every forecast and order down. If it really was this quiet, ignore this; \
         the forecasts use it as written."
    );
    Some((last, warning))
}

/// What the period a season back says.
enum SeasonBack {
    /// No calendar season, or no item reaches back that far.
    None,
    /// The last period is not below half of it: the season.
    Above,
    /// The last period is below half of it, which itself fell below half of its own three
    /// periods before: the same fall a season ago.
    Fell { then: Period, share: String },
    /// The last period is below half of it, which did not fall itself.
    Below { then: Period, share: String },
}

fn season_back(running: &[&Item], last: Period, zeros_unwritten: bool) -> SeasonBack {
    let Some(m) = last.frequency().natural_season() else {
        return SeasonBack::None;
    };
    let then = last.offset(-(m as i64));
    let with_before: Vec<usize> = [0, m, m + 1, m + 2, m + 3].to_vec();
    let rows = rows_for(running, last, &with_before, zeros_unwritten);
    let (rows, before) = if rows.is_empty() {
        (rows_for(running, last, &[0, m], zeros_unwritten), false)
    } else {
        (rows, true)
    };
    if rows.is_empty() {
        return SeasonBack::None;
    }
    let totals = sums(&rows, if before { 5 } else { 2 });
    if totals[0] >= HALF * totals[1] {
        return SeasonBack::Above;
    }
    let share = percent(totals[0], totals[1]);
    if before && totals[1] < HALF * median_of_three(&totals[2..]) {
        return SeasonBack::Fell { then, share };
    }
    SeasonBack::Below { then, share }
}

/// Whether the items but the one that fell most are whole: their sum at the last period is
/// at least half their median before, on a median of at least [`OTHERS_SPEAK`]. Data taken
/// early cuts every item's period short; one item falling alone (discontinued, written as 0;
/// out of stock) leaves the period whole.
fn others_whole(rows: &[(usize, Vec<f64>)]) -> bool {
    let fall = |v: &Vec<f64>| median_of_three(&v[1..]) - v[0];
    let Some(most) = rows
        .iter()
        .enumerate()
        .max_by(|a, b| fall(&a.1 .1).total_cmp(&fall(&b.1 .1)))
        .map(|(at, _)| at)
    else {
        return false;
    };
    let others: Vec<(usize, Vec<f64>)> = rows
        .iter()
        .enumerate()
        .filter(|(at, _)| *at != most)
        .map(|(_, row)| row.clone())
        .collect();
    if others.is_empty() {
        return false;
    }
    let totals = sums(&others, RECENT + 1);
    let median = median_of_three(&totals[1..]);
    median >= OTHERS_SPEAK && totals[0] >= HALF * median
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Items of monthly values ending in December 2024; the warning or none.
    fn check(items: &[&[Option<f64>]], expected: Option<&str>) {
        let last = Period::month(2024, 12);
        let built: Vec<Item> = items.iter().map(|values| item(values, last)).collect();
        check_items(&built, false, expected);
    }

    /// An item whose `values` end at `last`.
    fn item(values: &[Option<f64>], last: Period) -> Item {
        let len = values.len() as i64;
        Item {
            name: format!("item of {len}"),
            periods: (0..len).map(|k| last.offset(k - len + 1)).collect(),
            values: values.to_vec(),
            parts: Vec::new(),
        }
    }

    fn check_items(built: &[Item], zeros_unwritten: bool, expected: Option<&str>) {
        let got = last_period(built, zeros_unwritten).map(|(_, warning)| warning);
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
            Some("the demand summed over the 2 items with figures there is 9 %"),
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
            Some("and 10 % of 2023-12, a year before"),
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
                parts: Vec::new(),
            },
            Item {
                name: "b".into(),
                periods: (0..3).map(|k| Period::month(2024, 9).offset(k)).collect(),
                values: some(&[900.0, 900.0, 0.0]),
                parts: Vec::new(),
            },
        ];
        assert_eq!(last_period(&built, false), None);
    }

    #[test]
    fn without_a_season_back_the_fall_must_be_deeper() {
        // 40 %: a season's end in whole months looks like this.
        check(&[&some(&[30.0, 30.0, 30.0, 12.0])], None);
        check(
            &[&some(&[30.0, 30.0, 30.0, 9.0])],
            Some("is 30 % of the median"),
        );
    }

    #[test]
    fn the_same_fall_a_season_before_is_the_season() {
        // Summer sales, then October a fifth of them, in 2023 and in 2024.
        let year = [
            5.0, 5.0, 10.0, 20.0, 40.0, 40.0, 40.0, 40.0, 40.0, 8.0, 4.0, 4.0,
        ];
        let mut values: Vec<f64> = year.iter().chain(&year[..10]).copied().collect();
        *values.last_mut().unwrap() = 7.0;
        let built = vec![item(&some(&values), Period::month(2024, 10))];
        check_items(&built, false, None);
        // Whole the October before, the fall is new: said.
        let idx = values.len() - 13;
        values[idx] = 40.0;
        let built = vec![item(&some(&values), Period::month(2024, 10))];
        check_items(&built, false, Some("and 17 % of 2023-10, a year before"));
    }

    #[test]
    fn quiet_periods_seen_before_make_a_quiet_last_one_nothing_new() {
        // Twelve months of a summer shop, November to October: shut in winter.
        let summer = [
            0.0, 0.0, 0.0, 0.0, 40.0, 130.0, 260.0, 160.0, 270.0, 100.0, 90.0, 6.0,
        ];
        let built = vec![item(&some(&summer), Period::month(2025, 10))];
        check_items(&built, false, None);
        // Open all year, the same October is said.
        let mut open = summer;
        open[..4].copy_from_slice(&[50.0, 45.0, 40.0, 45.0]);
        let built = vec![item(&some(&open), Period::month(2025, 10))];
        check_items(&built, false, Some("its demand is 6 % of the median"));
    }

    #[test]
    fn one_item_falling_alone_leaves_the_period_whole() {
        check(
            &[
                &some(&[100.0, 100.0, 100.0, 0.0]),
                &some(&[20.0, 22.0, 18.0, 21.0]),
            ],
            None,
        );
        // Every item falling: an unfinished period.
        check(
            &[
                &some(&[100.0, 100.0, 100.0, 0.0]),
                &some(&[20.0, 22.0, 18.0, 2.0]),
            ],
            Some("is 1 % of the median"),
        );
    }

    #[test]
    fn a_till_day_with_few_items_sold_yet_counts_the_others_as_none() {
        // A long table: ten items selling every day; on the last day two have a row.
        let last = Period::day(2024, 3, 9);
        let mut built: Vec<Item> = (0..10)
            .map(|_| item(&some(&[6.0; 8]), last.offset(-1)))
            .collect();
        built.push(item(
            &some(&[6.0, 6.0, 6.0, 6.0, 6.0, 6.0, 6.0, 6.0, 1.0]),
            last,
        ));
        built.push(item(
            &some(&[6.0, 6.0, 6.0, 6.0, 6.0, 6.0, 6.0, 6.0, 1.0]),
            last,
        ));
        check_items(
            &built,
            true,
            Some("the demand summed over the 12 items with figures there is 2 %"),
        );
        // A table that writes its zeros (wide) leaves such items out: the two are compared.
        check_items(
            &built,
            false,
            Some("the demand summed over the 2 items with figures there is 16 %"),
        );
    }

    #[test]
    fn where_empty_periods_are_ordinary_an_empty_last_one_is_too() {
        // Lumpy: demand in 5 of 11 months before.
        let lumpy = [
            0.0, 40.0, 0.0, 0.0, 95.0, 0.0, 31.0, 0.0, 34.0, 0.0, 47.0, 0.0,
        ];
        check(&[&some(&lumpy)], None);
        // A shop open on weekdays only: its weekends are closed, not intermittent demand, and
        // a Friday taken in the morning is said.
        let last = Period::day(2024, 3, 8); // a Friday
        let days: Vec<f64> = (0..26i64)
            .map(|k| {
                let weekday = k % 7; // Monday 0: the first day, 2024-02-12, a Monday
                if k == 25 {
                    3.0
                } else if weekday >= 5 {
                    0.0
                } else {
                    30.0
                }
            })
            .collect();
        let built = vec![item(&some(&days), last)];
        check_items(&built, false, Some("its demand is 10 % of the median"));
    }

    #[test]
    fn a_monday_after_a_closed_weekend_is_compared_with_the_open_days() {
        // A shop open Monday to Friday, eight weeks, the last day a Monday taken at ten.
        let last = Period::day(2024, 3, 25); // a Monday
        let days: Vec<f64> = (0..50i64)
            .map(|k| match (k, k % 7) {
                (49, _) => 3.0,
                (_, 5 | 6) => 0.0,
                _ => 30.0,
            })
            .collect();
        let built = vec![item(&some(&days), last)];
        check_items(&built, false, Some("its demand is 10 % of the median"));
    }

    #[test]
    fn a_short_saturday_cut_short_is_still_said() {
        // Six days a week, Saturday 40 % of a weekday; the last Saturday at a tenth of that.
        let last = Period::day(2024, 3, 23); // a Saturday
        let days: Vec<f64> = (0..48i64)
            .map(|k| match (k, k % 7) {
                (47, _) => 1.0,
                (_, 5) => 12.0,
                (_, 6) => 0.0,
                _ => 30.0,
            })
            .collect();
        let built = vec![item(&some(&days), last)];
        check_items(&built, false, Some("and 8 % of 2024-03-16, a week before"));
    }

    #[test]
    fn empty_rows_after_the_last_figures_are_not_the_last_period() {
        // A template: October cut short, November and December still empty.
        let mut values = some(&[40.0, 42.0, 38.0, 41.0, 4.0]);
        values.extend([None, None]);
        let built = vec![item(&values, Period::month(2024, 12))];
        let (period, _) = last_period(&built, false).expect("October said");
        assert_eq!(period, Period::month(2024, 10));
    }

    #[test]
    fn after_a_fall_one_period_earlier_the_last_is_the_new_level() {
        check(&[&some(&[100.0, 100.0, 100.0, 100.0, 30.0, 31.0])], None);
    }

    #[test]
    fn a_first_week_of_days_says_nothing() {
        // No day a week back: a short Saturday is a third of a weekday.
        let last = Period::day(2024, 3, 9); // a Saturday
        let built = vec![item(&some(&[30.0, 31.0, 29.0, 30.0, 8.0]), last)];
        check_items(&built, false, None);
    }

    #[test]
    fn an_item_first_sold_in_the_last_period_does_not_hide_it() {
        let last = Period::month(2024, 12);
        let built = vec![
            item(&some(&[40.0, 42.0, 38.0, 41.0, 40.0, 4.0]), last),
            item(&some(&[1.0]), last),
        ];
        check_items(
            &built,
            true,
            Some("the one item with figures there is 10 %"),
        );
    }

    #[test]
    fn wording() {
        assert_eq!(percent(49.6, 100.0), "49 %");
        check(
            &[&some(&[100.0, 100.0, 100.0, -12.0])],
            Some("its demand is below zero (more came back than was sold). If"),
        );
        assert_eq!(period_name(Period::position(5)), "period 5");
        // The Poisson tail as scipy 1.17.1 gives it: poisson.cdf(9, 20) = 0.0049954123083075785.
        let tail = Poisson::new(20.0).unwrap().cdf(9);
        assert!((tail - 0.004_995_412_308_307_578_5).abs() < 1e-12, "{tail}");
    }
}
