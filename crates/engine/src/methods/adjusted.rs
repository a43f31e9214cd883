//! Seasonal adjustment around non-seasonal methods, as the M3/M4 benchmarks apply SES, Holt and
//! damped trend: divide by classical multiplicative seasonal indices (shrunk or not, as the
//! caller asks: [`decompose::Indices`]), fit and forecast the adjusted series, multiply the
//! season back. Series with zeros or returns use additive indices
//! (subtract, then add back), since a ratio to a zero season is undefined.
//!
//! Kept apart from: the methods themselves, which stay plain; [`super::fit`] decides when to wrap
//! them. Applied only when a season is accepted and the history holds at least two full seasons;
//! otherwise the method runs on the raw series.
//!
//! With multiplicative indices s_t (mean 1 over a season) and the method's forecast x̂ of the
//! adjusted series x_t = y_t / s_t: ŷ_{n+h} = x̂_{n+h} s_{n+h}; fitted ŷ_t = x̂_t s_t; the h-step
//! variance is v_h s_{n+h}^2 (the indices are treated as known, an approximation). With additive
//! indices (sum 0): x_t = y_t - s_t, ŷ = x̂ + s, and the variance is unchanged.

use super::decompose::{self, Indices, Kind};
use super::{Fitted, MethodError, Parameter};

/// The parameter entry that marks an adjusted fit; its value is the season length.
pub const ADJUSTED: &str = "season_adjusted";

/// The season length to adjust by, when the adjustment applies to this history and season.
pub fn applies(history: &[f64], season: Option<usize>) -> Option<usize> {
    let m = season.filter(|m| *m >= 2)?;
    (history.len() >= 2 * m).then_some(m)
}

/// Multiplicative indices for strictly positive demand, additive otherwise.
fn kind_for(history: &[f64]) -> Kind {
    if history.iter().all(|v| *v > 0.0) {
        Kind::Multiplicative
    } else {
        Kind::Additive
    }
}

/// Runs `plain` on the seasonally adjusted history and puts the season back.
pub fn fit_adjusted<F>(
    history: &[f64],
    m: usize,
    how: Indices,
    horizon: usize,
    plain: F,
) -> Result<Fitted, MethodError>
where
    F: Fn(&[f64]) -> Result<Fitted, MethodError>,
{
    let kind = kind_for(history);
    let Ok(indices) = decompose::indices(history, m, kind, how) else {
        return plain(history);
    };
    let n = history.len();
    let adjusted = decompose::deseasonalise(history, &indices, kind);
    let put_back = |x: f64, index: f64| match kind {
        Kind::Multiplicative => x * index,
        Kind::Additive => x + index,
    };
    let inner = plain(&adjusted)?;
    let fitted = inner
        .fitted()
        .iter()
        .enumerate()
        .map(|(t, f)| f.map(|f| put_back(f, decompose::index_at(&indices, n, t))))
        .collect();
    let forecast = decompose::reseasonalise_forecast(inner.forecast(), &indices, kind);
    let variance = inner.variance().map(|v| {
        v.iter()
            .enumerate()
            .map(|(i, var)| match kind {
                Kind::Multiplicative => var * decompose::index_at(&indices, n, n + i).powi(2),
                Kind::Additive => *var,
            })
            .collect()
    });
    let mut parameters = inner.parameters().to_vec();
    parameters.push(Parameter {
        name: ADJUSTED,
        value: m as f64,
    });
    debug_assert_eq!(inner.forecast().len(), horizon);
    Ok(Fitted::new(inner.kind(), fitted, forecast, variance, parameters)?.with_anchor_of(&inner))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::methods::simple;

    // Naive on the adjusted series is the M3 "Naive2" benchmark (Makridakis & Hibon 2000). On an
    // exact multiplicative pattern around a flat level, the centred moving average is the level,
    // the indices are the pattern, and Naive2 forecasts the pattern itself (arithmetic check).
    #[test]
    fn naive_on_adjusted_pattern_returns_the_pattern() {
        let pattern = [0.8, 1.2, 1.1, 0.9];
        let y: Vec<f64> = (0..12).map(|t| 100.0 * pattern[t % 4]).collect();
        let f = fit_adjusted(&y, 4, Indices::Classical, 6, |x| simple::naive(x, 6)).unwrap();
        for (h, v) in f.forecast().iter().enumerate() {
            assert!(
                (v - 100.0 * pattern[(12 + h) % 4]).abs() < 1e-9,
                "h {h}: {v}"
            );
        }
        assert!(f
            .parameters()
            .iter()
            .any(|p| p.name == "season_adjusted" && p.value == 4.0));
    }

    #[test]
    fn applies_with_two_full_seasons() {
        assert_eq!(applies(&[1.0; 8], Some(4)), Some(4));
        assert_eq!(applies(&[1.0; 7], Some(4)), None);
        assert_eq!(applies(&[1.0; 8], None), None);
    }

    // With a zero in the history the adjustment is additive: on an exact additive pattern around
    // a flat level of 10 (arithmetic check) Naive2 forecasts the pattern itself.
    #[test]
    fn zeros_switch_to_additive_indices() {
        let pattern = [-10.0, 5.0, 3.0, 2.0];
        let y: Vec<f64> = (0..12).map(|t| 10.0 + pattern[t % 4]).collect();
        assert_eq!(y[0], 0.0);
        let f = fit_adjusted(&y, 4, Indices::Classical, 4, |x| simple::naive(x, 4)).unwrap();
        for (h, v) in f.forecast().iter().enumerate() {
            assert!(
                (v - (10.0 + pattern[(12 + h) % 4])).abs() < 1e-9,
                "h {h}: {v}"
            );
        }
    }
}
