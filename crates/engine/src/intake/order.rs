//! Day-first or month-first: the order of `a/b/year` dates, decided once for a whole column.
//!
//! Kept apart from: reading the cells (that is [`super::label`]) and turning dates into periods
//! (that is [`super::period`], with the helpers of [`super::dates`]). The rule:
//!
//! Decided from all rows: a first field above 12 anywhere means
//! day-first, a second field above 12 means month-first; if both happen, the order more rows fit
//! wins and the others are errors. With no field above 12 and readings that differ: if one
//! reading puts every date on day 1 of a month, it is chosen; else if exactly one reading gives a
//! regular series with no missing period (dates one a month on nearby days, such as first
//! working days, counted as months), it is chosen; either choice is reported as a warning.
//! Otherwise the column is truly ambiguous: an error names the first row whose readings differ,
//! and the rest of the report is built day-first so the user still sees what was read.

use super::dates::{date_period, infer_frequency, two_way_days};
use super::label::Label;
use super::month_days::one_a_month;
use crate::calendar::{civil_from_days, Frequency};
use crate::sorting;

/// The decided order of two-way dates.
pub(crate) struct Order {
    pub day_first: bool,
    pub warning: Option<String>,
    pub errors: Vec<(usize, String)>,
}

pub(crate) fn decide_order(labels: &[Option<Label>]) -> Order {
    let two_way: Vec<(usize, u32, u32, i32)> = labels
        .iter()
        .enumerate()
        .filter_map(|(i, l)| match l {
            Some(Label::TwoWay { a, b, year }) => Some((i, *a, *b, *year)),
            _ => None,
        })
        .collect();
    let fits = |day_first: bool| -> Vec<bool> {
        two_way
            .iter()
            .map(|&(_, a, b, y)| two_way_days(Label::TwoWay { a, b, year: y }, day_first).is_some())
            .collect()
    };
    let forced_day = two_way.iter().any(|t| t.1 > 12);
    let forced_month = two_way.iter().any(|t| t.2 > 12);
    if forced_day || forced_month {
        let (dmy, mdy) = (fits(true), fits(false));
        let count = |v: &[bool]| v.iter().filter(|f| **f).count();
        let day_first = if forced_day && forced_month {
            count(&dmy) >= count(&mdy)
        } else {
            forced_day
        };
        let (fit, order) = if day_first {
            (dmy, "day-first (day/month/year)")
        } else {
            (mdy, "month-first (month/day/year)")
        };
        let errors = two_way
            .iter()
            .zip(fit)
            .filter(|(_, ok)| !ok)
            .map(|(t, _)| {
                (
                    t.0,
                    format!("expected a {order} date, the order the other rows use"),
                )
            })
            .collect();
        return Order {
            day_first,
            warning: None,
            errors,
        };
    }
    let Some(&(first_differing, a, b, y)) = two_way.iter().find(|t| t.1 != t.2) else {
        return Order {
            day_first: true,
            warning: None,
            errors: Vec::new(),
        };
    };
    let reading = |day_first: bool| -> Vec<i64> {
        two_way
            .iter()
            .filter_map(|&(_, a, b, year)| two_way_days(Label::TwoWay { a, b, year }, day_first))
            .collect()
    };
    let (dmy, mdy) = (reading(true), reading(false));
    let on_day_one = |days: &[i64]| days.iter().all(|d| civil_from_days(*d).2 == 1);
    let chosen = match (on_day_one(&dmy), on_day_one(&mdy)) {
        (true, false) => Some((true, "it puts every date on the 1st of a month")),
        (false, true) => Some((false, "it puts every date on the 1st of a month")),
        _ => match (is_regular(&dmy), is_regular(&mdy)) {
            (true, false) => Some((
                true,
                "only it gives a regular series with no missing period",
            )),
            (false, true) => Some((
                false,
                "only it gives a regular series with no missing period",
            )),
            _ => None,
        },
    };
    let example = format!("{a:02}/{b:02}/{y}");
    match chosen {
        Some((day_first, why)) => Order {
            day_first,
            warning: Some(format!(
                "dates such as {example} fit both day-first and month-first order; read {} \
                 because {why}; write dates as year-month-day (e.g. 2024-03-31) to be sure",
                if day_first {
                    "day-first"
                } else {
                    "month-first"
                }
            )),
            errors: Vec::new(),
        },
        None => Order {
            day_first: true,
            warning: None,
            errors: vec![(
                first_differing,
                format!(
                    "expected dates whose order is clear: {example} is {} day-first and {} \
                     month-first, and both readings give a plausible series; write dates as \
                     year-month-day (e.g. 2024-03-31). This report reads them day-first",
                    human(a, b, y),
                    human(b, a, y)
                ),
            )],
        },
    }
}

fn human(day: u32, month: u32, year: i32) -> String {
    format!("{year:04}-{month:02}-{day:02}")
}

/// True when the dates, at their inferred frequency, cover every period from first to last;
/// dates one a month on nearby days ([`one_a_month`]: first working days) count as months.
fn is_regular(days: &[i64]) -> bool {
    let frequency = match infer_frequency(days) {
        inferred @ (Frequency::Daily | Frequency::Weekly) => {
            let dates: Vec<Option<i64>> = days.iter().map(|d| Some(*d)).collect();
            one_a_month(&dates, None).map_or(inferred, |found| found.frequency)
        }
        inferred => inferred,
    };
    let mut ordinals: Vec<i64> = days
        .iter()
        .map(|d| date_period(*d, frequency).ordinal())
        .collect();
    sorting::sort(&mut ordinals);
    ordinals.dedup();
    ordinals.windows(2).all(|w| w[1] - w[0] == 1)
}
