//! A period column as a whole: which label family it holds, day-first or month-first order,
//! the frequency the dates imply, and one [`Period`] per row.
//!
//! Kept apart from: reading single cells (that is [`super::label`]) and from gaps and duplicates
//! (that is [`super::build`]). Every decision here looks at all rows at once.
//!
//! The frequency the dates imply is the rule of [`super::dates`]; the date order of `a/b/year`
//! dates is decided in [`super::order`].

use super::dates::{date_period, infer_frequency, two_way_days};
use super::label::{parse_label, Family, Label};
use crate::calendar::{days_from_civil, Frequency, Period};

/// How plain whole numbers in a period column are read.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub(crate) enum IntegerMeaning {
    Years,
    Positions,
}

/// The outcome for a period column: one entry per input cell.
#[derive(Clone, Debug, PartialEq)]
pub(crate) struct PeriodColumn {
    pub periods: Vec<Option<Period>>,
    pub frequency: Frequency,
    pub description: String,
    /// (index into the cells, what was expected).
    pub errors: Vec<(usize, String)>,
    pub warnings: Vec<String>,
}

/// The label family most non-integer cells share, when more than half of the non-empty cells
/// share it.
pub(crate) fn strong_family(cells: &[&str]) -> Option<Family> {
    let filled: Vec<&str> = cells.iter().copied().filter(|c| !c.is_empty()).collect();
    let mut counts: Vec<(Family, usize)> = Vec::new();
    for label in filled.iter().filter_map(|c| parse_label(c)) {
        if label.family() == Family::Integer {
            continue;
        }
        match counts.iter_mut().find(|(f, _)| *f == label.family()) {
            Some((_, n)) => *n += 1,
            None => counts.push((label.family(), 1)),
        }
    }
    let (family, count) = counts.into_iter().max_by_key(|(_, n)| *n)?;
    (count * 2 > filled.len()).then_some(family)
}

/// Whether a column of whole numbers reads as years (all in 1800..=2200) or as row positions
/// (starting at 1, strictly increasing when `in_row_order`); both need the distinct values to
/// cover at least half of their span, so scattered quantities are not taken for periods.
pub(crate) fn integer_meaning(cells: &[&str], in_row_order: bool) -> Option<IntegerMeaning> {
    let mut values = Vec::with_capacity(cells.len());
    for cell in cells.iter().filter(|c| !c.is_empty()) {
        match parse_label(cell) {
            Some(Label::Integer(n)) => values.push(n),
            _ => return None,
        }
    }
    let increasing = values.windows(2).all(|w| w[0] < w[1]);
    let mut distinct = values.clone();
    distinct.sort_unstable();
    distinct.dedup();
    let (first, last) = (*distinct.first()?, *distinct.last()?);
    let dense = (last - first + 1) <= 2 * distinct.len() as i64;
    if !dense {
        return None;
    }
    if (1800..=2200).contains(&first) && (1800..=2200).contains(&last) {
        Some(IntegerMeaning::Years)
    } else if first == 1 && (increasing || !in_row_order) {
        Some(IntegerMeaning::Positions)
    } else {
        None
    }
}

/// Reads every cell of a period column. Empty cells are errors (a row needs its period).
pub(crate) fn read_periods(cells: &[&str], integers: Option<IntegerMeaning>) -> PeriodColumn {
    let labels: Vec<Option<Label>> = cells.iter().map(|c| parse_label(c)).collect();
    let family = match integers {
        Some(_) => Family::Integer,
        None => majority_family(&labels).unwrap_or(Family::Date),
    };
    let example = cells
        .iter()
        .zip(&labels)
        .find(|(_, l)| l.is_some_and(|l| l.family() == family))
        .map_or("2024-03 or 2024-03-31".to_string(), |(c, _)| c.to_string());
    let mut errors = Vec::new();
    let mut warnings = Vec::new();
    for (i, (cell, label)) in cells.iter().zip(&labels).enumerate() {
        if label.is_some_and(|l| l.family() == family) {
            continue;
        }
        let message = if cell.is_empty() {
            format!("expected a period such as {example}; this row has none")
        } else {
            format!("expected a period written like the rest of this column, such as {example}")
        };
        errors.push((i, message));
    }
    let keep = |l: &Option<Label>| l.filter(|l| l.family() == family);
    let (periods, frequency, kind) = match family {
        Family::Date | Family::TwoWay => {
            let mut days: Vec<Option<i64>> = Vec::with_capacity(labels.len());
            let mut kind = "year-month-day dates";
            if family == Family::TwoWay {
                let order = super::order::decide_order(&labels);
                kind = if order.day_first {
                    "day-first dates"
                } else {
                    "month-first dates"
                };
                warnings.extend(order.warning);
                errors.extend(order.errors);
                // Rows that do not fit the chosen order give no date (their error is above);
                // an ambiguity error keeps every row, read day-first.
                days.extend(
                    labels
                        .iter()
                        .map(|l| two_way_days(keep(l)?, order.day_first)),
                );
            } else {
                if labels.iter().flatten().any(|l| l.family() == Family::Date)
                    && example.chars().any(char::is_alphabetic)
                {
                    kind = "dates with month names";
                }
                days.extend(labels.iter().map(|l| match keep(l)? {
                    Label::Date { year, month, day } => Some(days_from_civil(year, month, day)),
                    _ => None,
                }));
            }
            let frequency = infer_frequency(&days.iter().flatten().copied().collect::<Vec<_>>());
            let periods = days
                .iter()
                .map(|d| d.map(|d| date_period(d, frequency)))
                .collect();
            (periods, frequency, kind)
        }
        Family::Month => (
            map_labels(&labels, family, |l| match l {
                Label::Month { year, month } => Some(Period::month(year, month)),
                _ => None,
            }),
            Frequency::Monthly,
            "months",
        ),
        Family::Quarter => (
            map_labels(&labels, family, |l| match l {
                Label::Quarter { year, quarter } => Some(Period::quarter(year, quarter)),
                _ => None,
            }),
            Frequency::Quarterly,
            "quarters",
        ),
        Family::Week => (
            map_labels(&labels, family, |l| match l {
                Label::Week { year, week } => Some(Period::iso_week(year, week)),
                _ => None,
            }),
            Frequency::Weekly,
            "ISO weeks",
        ),
        Family::Integer => {
            let years = integers != Some(IntegerMeaning::Positions);
            let periods = map_labels(&labels, family, |l| match l {
                Label::Integer(n) if years => i32::try_from(n).ok().map(Period::year),
                Label::Integer(n) => Some(Period::position(n)),
                _ => None,
            });
            if years {
                (periods, Frequency::Yearly, "years")
            } else {
                (periods, Frequency::Undated, "row numbers")
            }
        }
    };
    let apart = match (family, frequency) {
        (Family::Date | Family::TwoWay, Frequency::Weekly) => ", a week apart",
        (Family::Date | Family::TwoWay, Frequency::Monthly) => ", a month apart",
        (Family::Date | Family::TwoWay, Frequency::Quarterly) => ", a quarter apart",
        (Family::Date | Family::TwoWay, Frequency::Yearly) => ", a year apart",
        _ => "",
    };
    PeriodColumn {
        periods,
        frequency,
        description: format!("{kind} (e.g. {example}){apart}"),
        errors,
        warnings,
    }
}

fn majority_family(labels: &[Option<Label>]) -> Option<Family> {
    let mut counts: Vec<(Family, usize)> = Vec::new();
    for label in labels.iter().flatten() {
        match counts.iter_mut().find(|(f, _)| *f == label.family()) {
            Some((_, n)) => *n += 1,
            None => counts.push((label.family(), 1)),
        }
    }
    counts.sort_by_key(|(f, n)| (std::cmp::Reverse(*n), *f));
    counts.first().map(|(f, _)| *f)
}

fn map_labels(
    labels: &[Option<Label>],
    family: Family,
    to_period: impl Fn(Label) -> Option<Period>,
) -> Vec<Option<Period>> {
    labels
        .iter()
        .map(|l| l.filter(|l| l.family() == family).and_then(&to_period))
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn integer_columns() {
        assert_eq!(
            integer_meaning(&["2021", "2022", "2024"], true),
            Some(IntegerMeaning::Years)
        );
        assert_eq!(
            integer_meaning(&["1", "2", "3"], true),
            Some(IntegerMeaning::Positions)
        );
        assert_eq!(integer_meaning(&["1", "3", "2"], true), None);
        assert_eq!(integer_meaning(&["12", "15", "11"], true), None);
        assert_eq!(integer_meaning(&["1", "2", "x"], true), None);
    }

    #[test]
    fn week_start_sundays_map_to_consecutive_weeks() {
        let col = read_periods(&["07/01/2024", "14/01/2024", "21/01/2024"], None);
        assert_eq!(col.frequency, Frequency::Weekly);
        let p: Vec<i64> = col.periods.iter().map(|p| p.unwrap().ordinal()).collect();
        assert_eq!(p[1] - p[0], 1);
        assert_eq!(p[2] - p[1], 1);
    }
}
