//! Dates that stand for longer periods than their steps say: monthly totals dated on a
//! working day (the last business day: 28 March, 30 April, 31 May), and a long table's stores
//! or items each closing their weeks on their own weekday (Sunday and Saturday). By their
//! steps such dates are daily (or weekly, for monthly totals that all fall on a Friday), each
//! period's other days then "closed" with zeros; a review (2026-12-04) found both read so,
//! with reorder points over one day. Here they are read as the months (quarters, years) or
//! ISO weeks that hold them, said in a warning. Of the dates one a month, one off the
//! pattern is read into its period (added to the item's row there) and named; in a table of
//! one row per period, or where it sits in the first days of a period that has its row (a
//! total filed late: April's on 2 May), it is refused at its row instead, as is a quarter's
//! total a month off the quarters' months. Of the weekly dates, a moved delivery is placed
//! at its own item's weekday, and a last week the file ends in before some items' day is
//! left out.
//!
//! Kept apart from: the frequency dates imply by their steps ([`super::dates`]), finding
//! dates one a month ([`super::month_days`]) and the reading of the column as a whole
//! ([`super::period`]), which asks [`regroup`] before it looks for stray periods, so that a
//! closed season's gap is counted in months, not days.

use crate::sorting;
use std::collections::{BTreeMap, BTreeSet};

use super::dates::{date_period, gcd};
use super::month_days::{one_a_month, Side};
use super::period::{dated_as, stands_for, with_weekday, WeekAnchor, WEEKDAY_NAMES};
use crate::calendar::{civil_from_days, weekday, Frequency, Period};

/// Dates read as longer periods, with what to say of them.
pub(crate) struct Regrouped {
    /// One period per row; `None` for a row without a date, or left out (see [`weeks_of_items`]).
    pub periods: Vec<Option<Period>>,
    pub frequency: Frequency,
    pub warnings: Vec<String>,
    /// Rows whose date cannot stand for a period of the others (index, message).
    pub errors: Vec<(usize, String)>,
}

/// The dates of a column (day numbers, one per row) read as longer periods where they stand
/// for them, `inferred` the frequency their steps imply; `series` holds each row's item key
/// in a long table. `None`: the dates mean what their steps say.
pub(crate) fn regroup(
    days: &[Option<i64>],
    series: Option<&[Option<String>]>,
    anchor: WeekAnchor,
    inferred: Frequency,
) -> Option<Regrouped> {
    if inferred == Frequency::Daily {
        if let Some(found) = series.and_then(|s| weeks_of_items(days, s, anchor)) {
            return Some(found);
        }
    }
    if !matches!(inferred, Frequency::Daily | Frequency::Weekly) {
        return None;
    }
    let found = one_a_month(days, series)?;
    let by = found.frequency;
    let what = match by {
        Frequency::Yearly => "year",
        Frequency::Quarterly => "quarter",
        _ => "month",
    };
    let working = if found.side.one_day() {
        ""
    } else {
        " (not on one fixed day of the month, as totals dated on a working day do)"
    };
    let whose = if series.is_some() {
        "each item's dates"
    } else {
        "the dates of this column"
    };
    let mut warnings = vec![format!(
        "{whose} fall one a {what}, {}{working}, so each row was read as the \
         {what} that holds its date; if these are single days' sales, write every day, with 0 \
         where nothing sold",
        found.side.describe()
    )];
    // Without an item column (one row per period), a date off the pattern in a period that
    // has its row cannot be added to it: refused at its row, below.
    let taken: BTreeSet<Period> = sorting::set_of(
        days.iter()
            .flatten()
            .filter(|d| !found.off.contains(d) && !found.misplaced.contains(d))
            .map(|d| date_period(*d, by)),
    );
    let refused =
        |d: i64| series.is_none() && found.off.contains(&d) && taken.contains(&date_period(d, by));
    // A date off the pattern in the first days of a period whose dates fall at its end (or
    // the last days, where they fall at its start) is the period before's total filed late
    // (or the next one's early), not a correction: added to its own period it would double
    // that one and leave the other a gap (a review: April's total dated 2 May).
    // Each item's periods held by its dates on the pattern: a date off it in a period
    // without one (a typo, 06-03 for 06-30) is read into that period as before.
    let key_of = |i: usize| series.and_then(|s| s.get(i)).and_then(|k| k.as_deref());
    let held: BTreeSet<(Option<&str>, Period)> =
        sorting::set_of(days.iter().enumerate().filter_map(|(i, d)| {
            let d = (*d)?;
            (!found.off.contains(&d)).then(|| (key_of(i), date_period(d, by)))
        }));
    let filed_off = |i: usize, d: i64| {
        let (y, m, day) = civil_from_days(d);
        let within = crate::intake::month_days::MONTH_DAY_SPREAD + 1;
        found.off.contains(&d)
            && held.contains(&(key_of(i), date_period(d, by)))
            && match found.side {
                Side::FromEnd { .. } => {
                    day <= within && date_period(d - i64::from(day), by) != date_period(d, by)
                }
                Side::FromStart { .. } => {
                    let left = crate::calendar::days_in_month(y, m) - day;
                    left < within && date_period(d + i64::from(left) + 1, by) != date_period(d, by)
                }
            }
    };
    let off: Vec<i64> = found
        .off
        .iter()
        .copied()
        .filter(|d| {
            !days
                .iter()
                .enumerate()
                .any(|(i, other)| *other == Some(*d) && filed_off(i, *d))
        })
        .collect();
    let off: Vec<i64> = off.into_iter().filter(|d| !refused(*d)).collect();
    if !off.is_empty() {
        let (these, each) = if off.len() == 1 {
            ("a date falls", "read")
        } else {
            ("dates fall", "each read")
        };
        let dates: Vec<String> = off
            .iter()
            .map(|d| date_period(*d, Frequency::Daily).to_string())
            .collect();
        warnings.push(format!(
            "{these} off that pattern, {each} into the {what} that holds it (added to that \
             {what}'s row where the item has one): check {}",
            dates.join(", ")
        ));
    }
    let mut errors = Vec::new();
    let periods = days
        .iter()
        .enumerate()
        .map(|(i, d)| {
            let d = (*d)?;
            if filed_off(i, d) {
                let (before, after) = match found.side {
                    Side::FromEnd { .. } => ("before", "late"),
                    Side::FromStart { .. } => ("after", "early"),
                };
                errors.push((
                    i,
                    format!(
                        "expected one date a {what} like the others ({}); this one, at the \
                         edge of {}, looks like the total of the {what} {before} it, filed \
                         {after}: date it within that {what} (or, if it corrects {}'s figures, \
                         add it to that row)",
                        found.side.describe(),
                        date_period(d, by),
                        date_period(d, by)
                    ),
                ));
                return None;
            }
            if refused(d) {
                errors.push((
                    i,
                    format!(
                        "expected one date a {what} like the others ({}); this one falls in {}, \
                         which has its own row: a correction or return belongs in that row's \
                         figures",
                        found.side.describe(),
                        date_period(d, by)
                    ),
                ));
                return None;
            }
            if found.misplaced.contains(&d) {
                errors.push((
                    i,
                    format!(
                        "expected a date one a {what} like the others ({}); this one is in another \
                         month of {} than theirs: if it is the total of the {what} before, \
                         filed late, date it within that {what}",
                        found.side.describe(),
                        date_period(d, by)
                    ),
                ));
                return None;
            }
            Some(date_period(d, by))
        })
        .collect();
    Some(Regrouped {
        periods,
        frequency: by,
        warnings,
        errors,
    })
}

/// A long table where each item (a store's own, where a store column names them) is dated
/// on one weekday a week apart, but not all on the same one, read as ISO weeks. Asked: every
/// item with 2 dates or more on a single weekday but for one date in five at most (one, from
/// 4 dates: a delivery moved for a holiday), each standing in for a day of that weekday
/// within 3 days whose week has no other date of the item (read as that week, said); two
/// such items or more; "regular" ones (dated in at least a third of the weeks from the
/// item's first date to its last, a seasonal item, and, from 3 dates, not only every other
/// week or less often), one of them with 4 dates or more, at least as many as the others (an
/// item sold in a few weeks, one delivered fortnightly). Where the file ends before some
/// items' weekday came round in the last week, that week holds only the others' figures and
/// would give those items a 0 they never sold: its rows are left out, said.
fn weeks_of_items(
    days: &[Option<i64>],
    series: &[Option<String>],
    anchor: WeekAnchor,
) -> Option<Regrouped> {
    let mut by_item: BTreeMap<&str, Vec<i64>> = BTreeMap::new();
    for (d, key) in days.iter().zip(series) {
        if let (Some(d), Some(key)) = (d, key) {
            by_item.entry(key.as_str()).or_default().push(*d);
        }
    }
    let mut per_weekday = [0usize; 7];
    let (mut regular, mut irregular, mut long_enough) = (0, 0, 0);
    let mut usual: BTreeMap<&str, u32> = BTreeMap::new();
    let mut moved: Vec<(i64, i64)> = Vec::new();
    for (key, dates) in by_item.iter_mut() {
        sorting::sort(dates);
        dates.dedup();
        if dates.len() < 2 {
            continue;
        }
        let (day, off) = own_weekday(dates)?;
        // ISO weeks (Monday first: day numbers count from a Thursday, 1970-01-01), a date
        // off the item's weekday in the week of the usual day it stands in for.
        let week = |d: i64| (stands_for(d, day) + 3).div_euclid(7);
        let mut weeks: Vec<i64> = dates.iter().map(|d| week(*d)).collect();
        sorting::sort(&mut weeks);
        weeks.dedup();
        if weeks.len() < dates.len() {
            return None;
        }
        let (first, last) = (weeks[0], weeks[weeks.len() - 1]);
        let steps = weeks.windows(2).fold(0, |g, w| gcd(g, w[1] - w[0]));
        if (weeks.len() as i64) * 3 < last - first + 1 || (weeks.len() >= 3 && steps > 1) {
            irregular += 1;
        } else {
            regular += 1;
            long_enough += usize::from(dates.len() >= 4);
        }
        usual.insert(key, day);
        moved.extend(off.iter().map(|d| (*d, stands_for(*d, day))));
        per_weekday[day as usize] += 1;
    }
    let mut weekdays: Vec<(u32, usize)> = (0..7u32)
        .map(|w| (w, per_weekday[w as usize]))
        .filter(|(_, n)| *n > 0)
        .collect();
    if regular + irregular < 2 || long_enough < 1 || irregular > regular || weekdays.len() < 2 {
        return None;
    }
    sorting::sort_by_key(&mut weekdays, |(w, n)| (std::cmp::Reverse(*n), *w));
    // Each row's date as the day of its own item's weekday it stands for.
    let placed: Vec<Option<i64>> = days
        .iter()
        .zip(series)
        .map(|(d, key)| {
            let d = (*d)?;
            Some(
                key.as_deref()
                    .and_then(|k| usual.get(k))
                    .map_or(d, |day| stands_for(d, *day)),
            )
        })
        .collect();
    let mut periods = dated_as(&placed, Frequency::Weekly, anchor);
    let each: Vec<String> = weekdays
        .iter()
        .map(|(w, n)| {
            let s = if *n == 1 { "" } else { "s" };
            format!("{}s for {n} item{s}", WEEKDAY_NAMES[*w as usize])
        })
        .collect();
    let which = match anchor {
        WeekAnchor::Unsaid => "the ISO week (Monday to Sunday) that holds its date",
        WeekAnchor::Start | WeekAnchor::End => {
            "the ISO week (Monday to Sunday) holding most of the week its date names, as the \
             header says"
        }
    };
    let mut warnings = vec![format!(
        "each item's dates fall on one weekday a week apart, but not the same weekday for all \
         ({}): each row was read as {which}, as weekly sales each store or item dates by its \
         own day",
        each.join(", ")
    )];
    if !moved.is_empty() {
        sorting::sort(&mut moved);
        moved.dedup();
        let said: Vec<String> = moved
            .iter()
            .map(|(from, to)| {
                format!(
                    "{} as the week of {}",
                    with_weekday(*from),
                    date_period(*to, Frequency::Daily)
                )
            })
            .collect();
        warnings.push(format!(
            "dated off their item's usual weekday, each read as the week of the usual day \
             nearest it: {}; check them",
            said.join(", ")
        ));
    }
    if let Some(warning) = leave_out_unfinished_week(&placed, days, series, &mut periods) {
        warnings.push(warning);
    }
    Some(Regrouped {
        periods,
        frequency: Frequency::Weekly,
        warnings,
        errors: Vec::new(),
    })
}

/// An item's usual weekday and its dates off it: all on one weekday, or all but one in five
/// (one from 4 dates); `None` otherwise.
fn own_weekday(dates: &[i64]) -> Option<(u32, Vec<i64>)> {
    let mut count = [0usize; 7];
    for d in dates {
        count[weekday(*d) as usize] += 1;
    }
    let usual = (0..7u32).max_by_key(|w| count[*w as usize])?;
    let off: Vec<i64> = dates
        .iter()
        .copied()
        .filter(|d| weekday(*d) != usual)
        .collect();
    let allowed = if dates.len() >= 4 {
        (dates.len() / 5).max(1)
    } else {
        0
    };
    (off.len() <= allowed).then_some((usual, off))
}

/// Where some item's weekday had not come round in the last week when the file ends (its
/// last date a week or less before the file's last date, in an earlier week; dates as
/// placed, a moved delivery at the day it stands for), the rows of that last week are left
/// out (their periods set to `None`); the warning says so, naming any item left without a
/// row (a new item whose first week it was).
fn leave_out_unfinished_week(
    days: &[Option<i64>],
    written: &[Option<i64>],
    series: &[Option<String>],
    periods: &mut [Option<Period>],
) -> Option<String> {
    let end = days.iter().flatten().copied().max()?;
    // The message names the last date as written (a moved delivery's own day).
    let last_written = written.iter().flatten().copied().max()?;
    let last_week = periods.iter().flatten().copied().max()?;
    let mut latest: BTreeMap<&str, (i64, Period)> = BTreeMap::new();
    for ((d, key), p) in days.iter().zip(series).zip(periods.iter()) {
        if let (Some(d), Some(key), Some(p)) = (d, key, p) {
            let entry = latest.entry(key.as_str()).or_insert((*d, *p));
            if *d > entry.0 {
                *entry = (*d, *p);
            }
        }
    }
    let waiting: Vec<u32> = latest
        .values()
        .filter(|(d, p)| *p < last_week && d + 7 > end)
        .map(|(d, _)| weekday(*d))
        .collect();
    if waiting.is_empty() {
        return None;
    }
    let mut rows = 0;
    let mut kept: BTreeSet<&str> = BTreeSet::new();
    let mut dropped: BTreeSet<&str> = BTreeSet::new();
    for (p, key) in periods.iter_mut().zip(series) {
        let key = key.as_deref();
        if *p == Some(last_week) {
            *p = None;
            rows += 1;
            dropped.extend(key);
        } else if p.is_some() {
            kept.extend(key);
        }
    }
    let gone: Vec<&str> = dropped.difference(&kept).copied().collect();
    let gone = if gone.is_empty() {
        String::new()
    } else {
        format!(
            "; with it the only rows of {}, which will show once a week of theirs is over",
            gone.iter()
                .map(|k| format!("\"{k}\""))
                .collect::<Vec<_>>()
                .join(", ")
        )
    };
    let mut names: Vec<&str> = waiting.iter().map(|w| WEEKDAY_NAMES[*w as usize]).collect();
    sorting::sort(&mut names);
    names.dedup();
    Some(format!(
        "the last week, {last_week}, was left out ({rows} row(s)): the file ends on {} {}, \
         before the {} that other items' weeks are dated by, so that week holds only some \
         items' figures and would give the others a 0 they did not sell{gone}",
        WEEKDAY_NAMES[weekday(last_written) as usize],
        date_period(last_written, Frequency::Daily),
        names.join(" or ")
    ))
}
