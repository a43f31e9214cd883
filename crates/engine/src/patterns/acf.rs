//! Sample autocorrelation of a series: the evidence behind the season-length test.
//!
//! Kept apart from: the decision about a season ([`super::season`]), which only reads these
//! numbers. Nothing here knows about calendars or demand.

/// Sample autocorrelations r_1, ..., r_L of `values`, with L = min(`max_lag`, n - 1).
///
/// The Box-Jenkins estimator (Box & Jenkins, *Time Series Analysis*, 1970), with ybar the mean
/// of all n values and the full-sample denominator at every lag:
///
/// ```text
///         sum_{t=k+1}^{n} (y_t - ybar)(y_{t-k} - ybar)
///   r_k = --------------------------------------------
///              sum_{t=1}^{n} (y_t - ybar)^2
/// ```
///
/// The common denominator keeps the sequence positive semi-definite and shrinks long lags
/// towards zero, which is what the seasonality test's variance formula assumes.
///
/// Edge cases, none of which panic: fewer than two values give an empty vector; a constant
/// series (zero denominator) has no defined autocorrelation and gives zeros, meaning "no
/// evidence of any pattern"; a non-finite value makes every r_k NaN, so callers that hold a
/// validated [`crate::series::Series`] never see one.
pub fn autocorrelation(values: &[f64], max_lag: usize) -> Vec<f64> {
    let n = values.len();
    if n < 2 {
        return Vec::new();
    }
    let lags = max_lag.min(n - 1);
    let mean = values.iter().sum::<f64>() / n as f64;
    let deviations: Vec<f64> = values.iter().map(|y| y - mean).collect();
    let denominator: f64 = deviations.iter().map(|d| d * d).sum();
    if denominator == 0.0 {
        return vec![0.0; lags];
    }
    (1..=lags)
        .map(|k| {
            let numerator: f64 = deviations[k..]
                .iter()
                .zip(&deviations[..n - k])
                .map(|(later, earlier)| later * earlier)
                .sum();
            numerator / denominator
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    // Worked by hand from the definition above (no outside source needed for a 5-value ramp).
    #[test]
    fn matches_hand_computation_on_a_short_ramp() {
        // Deviations d = [-2, -1, 0, 1, 2].
        // lag 1: d2 d1 + d3 d2 + d4 d3 + d5 d4 = 2 + 0 + 0 + 2 = 4      -> 0.4
        // lag 2: d3 d1 + d4 d2 + d5 d3         = 0 - 1 + 0     = -1     -> -0.1
        // lag 3: d4 d1 + d5 d2                 = -2 - 2        = -4     -> -0.4
        // lag 4: d5 d1                         = -4                     -> -0.4
        let r = autocorrelation(&[1.0, 2.0, 3.0, 4.0, 5.0], 10);
        let expected = [0.4, -0.1, -0.4, -0.4];
        assert_eq!(r.len(), 4, "lags are capped at n - 1");
        for (got, want) in r.iter().zip(expected) {
            assert!((got - want).abs() < 1e-15, "{got} vs {want}");
        }
    }

    #[test]
    fn degenerate_inputs_do_not_panic() {
        assert!(autocorrelation(&[], 5).is_empty());
        assert!(autocorrelation(&[3.0], 5).is_empty());
        assert_eq!(autocorrelation(&[2.0, 2.0, 2.0], 5), vec![0.0, 0.0]);
        assert!(autocorrelation(&[1.0, 2.0, 3.0], 0).is_empty());
        assert!(autocorrelation(&[1.0, f64::NAN, 3.0], 2)
            .iter()
            .all(|r| r.is_nan()));
    }
}
