//! Seasonal adjustment around non-seasonal methods, as the M3/M4 benchmarks apply SES, Holt and
//! damped trend: divide by classical multiplicative seasonal indices, fit and forecast the
//! adjusted series, multiply the season back.
//!
//! Kept apart from: the methods themselves, which stay plain; [`super::fit`] decides when to wrap
//! them. Applied only when a season is accepted, every value is above zero and the history holds
//! at least two full seasons; otherwise the method runs on the raw series.
//!
//! With indices s_t (mean 1 over a season) and the method's forecast x̂ of the adjusted series
//! x_t = y_t / s_t: ŷ_{n+h} = x̂_{n+h} s_{n+h}; fitted ŷ_t = x̂_t s_t; the h-step variance is
//! v_h s_{n+h}^2 (the indices are treated as known, an approximation).

use super::decompose::{self, Kind};
use super::{Fitted, MethodError, Parameter};

/// Whether the adjustment applies to this history and season.
pub fn applies(history: &[f64], season: Option<usize>) -> Option<usize> {
    let m = season.filter(|m| *m >= 2)?;
    (history.len() >= 2 * m && history.iter().all(|v| *v > 0.0)).then_some(m)
}

/// Runs `plain` on the seasonally adjusted history and puts the season back.
pub fn fit_adjusted<F>(
    history: &[f64],
    m: usize,
    horizon: usize,
    plain: F,
) -> Result<Fitted, MethodError>
where
    F: Fn(&[f64]) -> Result<Fitted, MethodError>,
{
    let Ok(indices) = decompose::seasonal_indices(history, m, Kind::Multiplicative) else {
        return plain(history);
    };
    let n = history.len();
    let adjusted = decompose::deseasonalise(history, &indices, Kind::Multiplicative);
    let inner = plain(&adjusted)?;
    let fitted = inner
        .fitted()
        .iter()
        .enumerate()
        .map(|(t, f)| f.map(|f| f * decompose::index_at(&indices, n, t)))
        .collect();
    let forecast =
        decompose::reseasonalise_forecast(inner.forecast(), &indices, Kind::Multiplicative);
    let variance = inner.variance().map(|v| {
        v.iter()
            .enumerate()
            .map(|(i, var)| var * decompose::index_at(&indices, n, n + i).powi(2))
            .collect()
    });
    let mut parameters = inner.parameters().to_vec();
    parameters.push(Parameter {
        name: "season_adjusted",
        value: m as f64,
    });
    debug_assert_eq!(inner.forecast().len(), horizon);
    Fitted::new(inner.kind(), fitted, forecast, variance, parameters)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::engine::methods::simple;

    // Naive on the adjusted series is the M3 "Naive2" benchmark (Makridakis & Hibon 2000). On an
    // exact multiplicative pattern around a flat level, the centred moving average is the level,
    // the indices are the pattern, and Naive2 forecasts the pattern itself (arithmetic check).
    #[test]
    fn naive_on_adjusted_pattern_returns_the_pattern() {
        let pattern = [0.8, 1.2, 1.1, 0.9];
        let y: Vec<f64> = (0..12).map(|t| 100.0 * pattern[t % 4]).collect();
        let f = fit_adjusted(&y, 4, 6, |x| simple::naive(x, 6)).unwrap();
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
    fn applies_only_to_positive_series_with_two_seasons() {
        assert_eq!(applies(&[1.0; 8], Some(4)), Some(4));
        assert_eq!(applies(&[1.0; 7], Some(4)), None);
        assert_eq!(
            applies(&[1.0, 0.0, 1.0, 1.0, 1.0, 1.0, 1.0, 1.0], Some(4)),
            None
        );
        assert_eq!(applies(&[1.0; 8], None), None);
    }
}
