//! Trend: the Mann-Kendall test for a monotonic trend, with its statistics as evidence.
//!
//! Kept apart from: trend estimation (methods fit their own slopes). This module only says
//! whether values tend to rise or fall over time, without assuming a straight line or normal
//! errors (Mann 1945, "Nonparametric tests against trend", Econometrica 13:245-259; Kendall
//! 1975, *Rank Correlation Methods*, 4th ed., Griffin).
//!
//! The test runs on the raw values, also for seasonal data, because that is the question asked:
//! "do the values drift up or down over the whole history?". It assumes independent
//! observations; positive autocorrelation (a season, or slow swings) makes the variance below too
//! small and the test too eager to call a trend. A seasonal variant (Hirsch, Slack & Smith 1982)
//! compares only like season positions; it is not used here.

use crate::sorting;
use statrs::distribution::{ContinuousCDF, Normal};

/// Two-sided significance level below which a trend is called.
pub const TREND_SIGNIFICANCE: f64 = 0.05;

/// Trend direction from the Mann-Kendall test.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum TrendDirection {
    /// Values tend to rise.
    Up,
    /// Values tend to fall.
    Down,
    /// No trend shown.
    None,
}

impl TrendDirection {
    /// "up", "down" or "none".
    pub fn as_str(self) -> &'static str {
        match self {
            TrendDirection::Up => "up",
            TrendDirection::Down => "down",
            TrendDirection::None => "none",
        }
    }
}

/// The trend verdict and its evidence.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct TrendVerdict {
    /// The verdict.
    pub direction: TrendDirection,
    /// S = sum_{i<j} sign(y_j - y_i).
    pub s: f64,
    /// var(S) with the tie correction.
    pub variance: f64,
    /// Standardised S with continuity correction.
    pub z: f64,
    /// Two-sided p-value, 2 (1 - Phi(|Z|)).
    pub p_value: f64,
    /// The level p is compared with ([`TREND_SIGNIFICANCE`]).
    pub significance: f64,
    /// Values the test used (non-finite values are left out).
    pub n: usize,
    /// One sentence that explains the verdict.
    pub reason: String,
}

/// S = sum_{i<j} sign(y_j - y_i) = (pairs that rise) - (pairs that fall), counted as Knight
/// (1966, "A computer method for calculating Kendall's tau with ungrouped data", JASA
/// 61:436-439) counts Kendall's pairs: walk the values in time order and ask a Fenwick tree
/// over their ranks how many earlier values lie below and above the current one. Ties add
/// nothing, as sign(0) = 0. Exact integer arithmetic: equal to the O(n^2) double sum.
fn s_statistic(values: &[f64]) -> i64 {
    // -0.0 + 0.0 is 0.0: the two zeros are one value (a tie), as the comparison in S has them.
    let values: Vec<f64> = values.iter().map(|v| v + 0.0).collect();
    let mut sorted: Vec<f64> = values.clone();
    sorting::sort_by(&mut sorted, f64::total_cmp);
    sorted.dedup();
    let rank = |v: f64| sorted.partition_point(|x| x.total_cmp(&v).is_lt());
    // tree[i] counts earlier values by rank (1-based Fenwick indexing).
    let mut tree = vec![0i64; sorted.len() + 1];
    let count_below = |tree: &[i64], r: usize| {
        let (mut i, mut c) = (r, 0);
        while i > 0 {
            c += tree[i];
            i &= i - 1;
        }
        c
    };
    let mut s = 0i64;
    for (seen, &v) in values.iter().enumerate() {
        let r = rank(v);
        let below = count_below(&tree, r);
        let at_or_below = count_below(&tree, r + 1);
        let above = seen as i64 - at_or_below;
        s += below - above;
        let mut i = r + 1;
        while i < tree.len() {
            tree[i] += 1;
            i += i & i.wrapping_neg();
        }
    }
    s
}

/// The Mann-Kendall test on `values` in time order.
///
/// ```text
///   S      = sum_{i<j} sign(y_j - y_i)
///   var(S) = [ n(n-1)(2n+5) - sum_g t_g(t_g - 1)(2 t_g + 5) ] / 18     (t_g: size of tie group g)
///   Z      = (S - 1)/sqrt(var S) if S > 0,  0 if S = 0,  (S + 1)/sqrt(var S) if S < 0
///   p      = 2 (1 - Phi(|Z|))
/// ```
///
/// The direction is up (down) when p < [`TREND_SIGNIFICANCE`] and S > 0 (S < 0), otherwise
/// none. Fewer than two values, or all values equal (var S = 0), give Z = 0 and p = 1. Values
/// that are not finite are left out (a validated series never has any). S is counted in
/// O(n log n) ([`s_statistic`]), so ten years of daily data cost milliseconds.
pub fn mann_kendall(values: &[f64]) -> TrendVerdict {
    let finite: Vec<f64> = values.iter().copied().filter(|v| v.is_finite()).collect();
    let n = finite.len();
    let s = s_statistic(&finite);
    let variance = s_variance(&finite);
    let s = s as f64;
    let z = if variance <= 0.0 || s == 0.0 {
        0.0
    } else if s > 0.0 {
        (s - 1.0) / variance.sqrt()
    } else {
        (s + 1.0) / variance.sqrt()
    };
    let p_value = two_sided_p(z);
    let direction = if p_value < TREND_SIGNIFICANCE && s > 0.0 {
        TrendDirection::Up
    } else if p_value < TREND_SIGNIFICANCE && s < 0.0 {
        TrendDirection::Down
    } else {
        TrendDirection::None
    };
    let reason = match direction {
        TrendDirection::None if n < 3 => {
            format!("no trend: {n} values are too few to show one")
        }
        TrendDirection::None => format!(
            "no trend: Mann-Kendall Z is {z:.2} with p {}, not below {TREND_SIGNIFICANCE}",
            format_p(p_value)
        ),
        TrendDirection::Up | TrendDirection::Down => format!(
            "{} trend: Mann-Kendall Z is {z:.2} with p {}, below {TREND_SIGNIFICANCE}",
            if direction == TrendDirection::Up {
                "upward"
            } else {
                "downward"
            },
            format_p(p_value)
        ),
    };
    TrendVerdict {
        direction,
        s,
        variance,
        z,
        p_value,
        significance: TREND_SIGNIFICANCE,
        n,
        reason,
    }
}

/// var(S) = [n(n-1)(2n+5) - sum_g t(t-1)(2t+5)] / 18, computed in f64 (exact for n < 10^5).
fn s_variance(values: &[f64]) -> f64 {
    let term = |t: usize| {
        let t = t as f64;
        t * (t - 1.0) * (2.0 * t + 5.0)
    };
    let mut sorted = values.to_vec();
    sorting::sort_by(&mut sorted, f64::total_cmp);
    let mut ties = 0.0;
    let mut start = 0;
    while start < sorted.len() {
        let end = sorted[start..]
            .iter()
            .position(|v| *v != sorted[start])
            .map_or(sorted.len(), |offset| start + offset);
        ties += term(end - start);
        start = end;
    }
    (term(values.len()) - ties) / 18.0
}

/// 2 (1 - Phi(|z|)), computed as 2 Phi(-|z|) so that tiny p-values keep their digits.
fn two_sided_p(z: f64) -> f64 {
    match Normal::new(0.0, 1.0) {
        Ok(standard) => (2.0 * standard.cdf(-z.abs())).min(1.0),
        // Unreachable: (0, 1) are valid parameters. "No evidence" is the safe answer.
        Err(_) => 1.0,
    }
}

fn format_p(p: f64) -> String {
    if p < 0.001 {
        "< 0.001".to_string()
    } else {
        format!("= {p:.3}")
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// S by its definition, the double sum (O(n^2)).
    fn s_by_definition(values: &[f64]) -> i64 {
        let mut s = 0;
        for (i, a) in values.iter().enumerate() {
            for b in &values[i + 1..] {
                s += match b.partial_cmp(a) {
                    Some(std::cmp::Ordering::Greater) => 1,
                    Some(std::cmp::Ordering::Less) => -1,
                    _ => 0,
                };
            }
        }
        s
    }

    // The O(n log n) count equals the definition on series with many ties, both zeros, runs
    // and reversals (values from a seeded generator: arithmetic, not a reference).
    #[test]
    fn counted_s_equals_the_double_sum() {
        let mut state = 7u64;
        let mut next = || {
            state = state.wrapping_mul(6364136223846793005).wrapping_add(1442695040888963407);
            (state >> 33) % 9
        };
        for n in [0, 1, 2, 3, 10, 57, 300] {
            let values: Vec<f64> = (0..n)
                .map(|t| match next() {
                    0 => -0.0,
                    1 => 0.0,
                    k => k as f64 * if t % 5 == 0 { -1.0 } else { 1.0 },
                })
                .collect();
            assert_eq!(s_statistic(&values), s_by_definition(&values), "n {n}");
        }
        let rising: Vec<f64> = (0..200).map(f64::from).collect();
        assert_eq!(s_statistic(&rising), 200 * 199 / 2);
        let falling: Vec<f64> = rising.iter().rev().copied().collect();
        assert_eq!(s_statistic(&falling), -(200 * 199 / 2));
    }

    // Worked by hand from the definitions above; p from a printed standard normal table.
    #[test]
    fn short_series_by_hand() {
        // Pairs: (1,3)+ (1,2)+ (1,5)+ (1,4)+ (3,2)- (3,5)+ (3,4)+ (2,5)+ (2,4)+ (5,4)-  -> S = 6.
        // var = 5*4*15/18 = 16.667; Z = 5/4.0825 = 1.2247; p = 0.2207 (normal table, two-sided).
        let v = mann_kendall(&[1.0, 3.0, 2.0, 5.0, 4.0]);
        assert_eq!(v.s, 6.0);
        assert!((v.variance - 300.0 / 18.0).abs() < 1e-12);
        assert!((v.z - 5.0 / (300.0f64 / 18.0).sqrt()).abs() < 1e-12);
        assert!((v.p_value - 0.2207).abs() < 1e-4);
        assert_eq!(v.direction, TrendDirection::None);
    }

    #[test]
    fn ties_reduce_the_variance() {
        // Tie groups {1,1} and {2,2,2}: sum t(t-1)(2t+5) = 2*1*9 + 3*2*11 = 18 + 66 = 84.
        // n = 6: 6*5*17 = 510; var = (510 - 84)/18 = 23.667.
        let v = mann_kendall(&[1.0, 2.0, 1.0, 2.0, 2.0, 3.0]);
        assert!((v.variance - 426.0 / 18.0).abs() < 1e-12);
    }

    #[test]
    fn clear_trends_are_called() {
        let rising: Vec<f64> = (0..30).map(|t| t as f64 + (t % 3) as f64).collect();
        assert_eq!(mann_kendall(&rising).direction, TrendDirection::Up);
        let falling: Vec<f64> = rising.iter().rev().copied().collect();
        let verdict = mann_kendall(&falling);
        assert_eq!(verdict.direction, TrendDirection::Down);
        assert!(
            verdict.reason.starts_with("downward trend"),
            "{}",
            verdict.reason
        );
    }

    #[test]
    fn degenerate_inputs_do_not_panic() {
        for values in [
            &[][..],
            &[4.0],
            &[2.0, 2.0, 2.0],
            &[1.0, f64::NAN, f64::INFINITY],
        ] {
            let v = mann_kendall(values);
            assert_eq!(v.direction, TrendDirection::None);
            assert_eq!(v.z, 0.0);
            assert_eq!(v.p_value, 1.0);
        }
    }
}
