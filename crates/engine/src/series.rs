//! The validated demand series every method works on, and its gap-filled view.
//!
//! Kept apart from: parsing. [`crate::intake`] produces raw items with possible gaps;
//! [`Series::new`] checks them once, so code that holds a `Series` never re-checks. Fields stay
//! private: a `Series` is always regular (one value slot per period, no skipped periods), finite,
//! and has at least one observed value.

use std::fmt;

use crate::calendar::{Frequency, Period};

/// Largest magnitude a value may have: a thousand million million units. No sales count comes
/// near it, and below it every computation of a plan stays finite (squares of errors summed
/// over a long history stay far below f64's 1.8e308; values of 1e155 and more overflowed there).
pub const MAX_ABS_VALUE: f64 = 1e15;

/// Why a series could not be built. Each message says what to change.
#[derive(Clone, Debug, PartialEq)]
pub enum SeriesError {
    /// The item has no observed value at all.
    Empty {
        /// The item.
        name: String,
    },
    /// A value is NaN or infinite.
    NotFinite {
        /// The item.
        name: String,
        /// Where, as a period label.
        period: String,
    },
    /// A value's magnitude is above [`MAX_ABS_VALUE`].
    TooLarge {
        /// The item.
        name: String,
        /// Where, as a period label.
        period: String,
        /// The value found.
        value: f64,
    },
    /// The start period's frequency differs from the series' frequency.
    MixedFrequency {
        /// The item.
        name: String,
    },
}

impl fmt::Display for SeriesError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            SeriesError::Empty { name } => {
                write!(
                    f,
                    "item \"{name}\" has no values: give it at least one number"
                )
            }
            SeriesError::NotFinite { name, period } => write!(
                f,
                "item \"{name}\" has a value at {period} that is not a finite number: replace it"
            ),
            SeriesError::TooLarge {
                name,
                period,
                value,
            } => write!(
                f,
                "item \"{name}\" has the value {value:e} at {period}, beyond the largest a plan \
                 works with ({MAX_ABS_VALUE:e} in magnitude): check that value"
            ),
            SeriesError::MixedFrequency { name } => write!(
                f,
                "item \"{name}\" mixes period kinds: use one kind of period label throughout"
            ),
        }
    }
}

impl std::error::Error for SeriesError {}

/// One item's demand: a regular run of periods from `start`, each with a value or a gap.
///
/// Invariants: at least one value is `Some`; the first and last slots are `Some` (leading and
/// trailing gaps are trimmed by [`Series::new`]); every value is finite.
///
/// Crosses the worker boundary as its parts; reading it back goes through [`Series::new`].
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(try_from = "SeriesParts"))]
pub struct Series {
    name: String,
    start: Period,
    values: Vec<Option<f64>>,
}

/// A series as it crosses the worker boundary, before [`Series::new`] checks it again.
#[cfg(feature = "serde")]
#[derive(serde::Deserialize)]
struct SeriesParts {
    name: String,
    start: Period,
    values: Vec<Option<f64>>,
}

#[cfg(feature = "serde")]
impl TryFrom<SeriesParts> for Series {
    type Error = SeriesError;
    fn try_from(parts: SeriesParts) -> Result<Series, SeriesError> {
        Series::new(parts.name, parts.start, parts.values)
    }
}

impl Series {
    /// Builds a series, trimming leading and trailing gaps (they are "not sold yet" or "no
    /// longer recorded", not zero demand) and rejecting non-finite values and values beyond
    /// [`MAX_ABS_VALUE`].
    pub fn new(
        name: impl Into<String>,
        start: Period,
        values: Vec<Option<f64>>,
    ) -> Result<Series, SeriesError> {
        let name = name.into();
        for (i, v) in values.iter().enumerate() {
            if let Some(x) = v {
                if !x.is_finite() {
                    return Err(SeriesError::NotFinite {
                        name,
                        period: start.offset(i as i64).to_string(),
                    });
                }
                if x.abs() > MAX_ABS_VALUE {
                    return Err(SeriesError::TooLarge {
                        name,
                        period: start.offset(i as i64).to_string(),
                        value: *x,
                    });
                }
            }
        }
        let first = values.iter().position(Option::is_some);
        let last = values.iter().rposition(Option::is_some);
        let (Some(first), Some(last)) = (first, last) else {
            return Err(SeriesError::Empty { name });
        };
        Ok(Series {
            name,
            start: start.offset(first as i64),
            values: values[first..=last].to_vec(),
        })
    }

    /// Builds an undated series (positions 1, 2, ...) from plain numbers.
    pub fn from_values(name: impl Into<String>, values: &[f64]) -> Result<Series, SeriesError> {
        Series::new(
            name,
            Period::position(1),
            values.iter().map(|v| Some(*v)).collect(),
        )
    }

    /// The item's name.
    pub fn name(&self) -> &str {
        &self.name
    }
    /// How often the series is observed.
    pub fn frequency(&self) -> Frequency {
        self.start.frequency()
    }
    /// The first period (it always holds a value).
    pub fn start(&self) -> Period {
        self.start
    }
    /// Number of periods, gaps included.
    pub fn len(&self) -> usize {
        self.values.len()
    }
    /// Always false: a series holds at least one value (kept for clippy's `len_without_is_empty`).
    pub fn is_empty(&self) -> bool {
        self.values.is_empty()
    }
    /// The values with gaps as `None`.
    pub fn values(&self) -> &[Option<f64>] {
        &self.values
    }
    /// The period of slot `index`.
    pub fn period(&self, index: usize) -> Period {
        self.start.offset(index as i64)
    }
    /// All periods in order.
    pub fn periods(&self) -> impl Iterator<Item = Period> + '_ {
        (0..self.values.len()).map(|i| self.period(i))
    }
    /// Indices of the gaps.
    pub fn gap_indices(&self) -> Vec<usize> {
        self.values
            .iter()
            .enumerate()
            .filter(|(_, v)| v.is_none())
            .map(|(i, _)| i)
            .collect()
    }

    /// The values with each inner gap filled by straight-line interpolation between its
    /// neighbours: y_i = y_a + (y_b - y_a)(i - a)/(b - a) for a gap between observed slots a, b.
    pub fn interpolated(&self) -> Vec<f64> {
        let mut out = Vec::with_capacity(self.values.len());
        let mut last_seen: Option<(usize, f64)> = None;
        for (i, v) in self.values.iter().enumerate() {
            if let Some(x) = v {
                if let Some((a, ya)) = last_seen {
                    for gap in (a + 1)..i {
                        let t = (gap - a) as f64 / (i - a) as f64;
                        out.push(ya + (x - ya) * t);
                    }
                }
                out.push(*x);
                last_seen = Some((i, *x));
            }
        }
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn trims_edges_and_interpolates_inner_gaps() {
        let s = Series::new(
            "a",
            Period::month(2024, 1),
            vec![None, Some(1.0), None, None, Some(4.0), None],
        )
        .unwrap();
        assert_eq!(s.start(), Period::month(2024, 2));
        assert_eq!(s.len(), 4);
        assert_eq!(s.interpolated(), vec![1.0, 2.0, 3.0, 4.0]);
        assert_eq!(s.gap_indices(), vec![1, 2]);
    }

    #[test]
    fn rejects_empty_and_non_finite() {
        assert!(matches!(
            Series::new("a", Period::position(1), vec![None]),
            Err(SeriesError::Empty { .. })
        ));
        assert!(matches!(
            Series::new("a", Period::position(1), vec![Some(f64::NAN)]),
            Err(SeriesError::NotFinite { .. })
        ));
        // The bound is inclusive; 1e155 used to overflow squares into nulls downstream.
        assert!(Series::from_values("a", &[MAX_ABS_VALUE, -MAX_ABS_VALUE]).is_ok());
        let too_large = Series::new("a", Period::month(2024, 1), vec![Some(1.0), Some(-1e155)]);
        assert_eq!(
            too_large.unwrap_err().to_string(),
            "item \"a\" has the value -1e155 at 2024-02, beyond the largest a plan works with \
             (1e15 in magnitude): check that value"
        );
    }
}
