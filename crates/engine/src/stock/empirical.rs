//! The empirical model for intermittent and lumpy demand, where a normal total puts weight on
//! negative demand and misses the skew: the demand over the protection interval is taken as
//! today's expected total minus each rolling origin's error of its total (the empirical
//! distribution of rolling-origin lead-time demand errors, one of the alternatives the
//! Stock plan's references name; common practice for sparse demand, with the caveat that a
//! few dozen origins put the upper quantiles on the few largest totals).
//!
//! Kept apart from: the normal model ([`super::normal`]) and where the scenarios come from
//! ([`super::item`]).

use crate::bands::quantile_sorted;

use super::{check_quantity, Figures, StockError, Target};

/// Expected shortage per cycle at `level`: the mean of (D_i - level)+ over the scenarios.
fn shortage(sorted: &[f64], level: f64) -> f64 {
    sorted.iter().map(|d| (d - level).max(0.0)).sum::<f64>() / sorted.len() as f64
}

/// Figures from demand scenarios D_i over the protection interval (at least two). For a cycle
/// service target p the level is the p-quantile of the D_i (Hyndman & Fan type 7, as the rest
/// of the engine); for a fill-rate target beta it is the level whose expected shortage
/// mean((D_i - level)+) equals (1 - beta) C, found by bisection (the shortage falls steadily
/// from the mean minus the level, below every D_i, to 0 at the largest). The service a level
/// gives is read off the same scenarios: the share of D_i at or below it, and
/// 1 - shortage / C. No safety factor: k belongs to the normal model. `mean` is today's
/// expected total, the safety stock is the level minus it.
pub fn empirical_figures(
    mean: f64,
    scenarios: &[f64],
    cycle_demand: f64,
    target: Target,
) -> Result<Figures, StockError> {
    let cycle_demand = check_quantity("demand per cycle", cycle_demand, true)?;
    let mut sorted: Vec<f64> = scenarios
        .iter()
        .copied()
        .filter(|d| d.is_finite())
        .collect();
    if sorted.len() < 2 {
        return Err(StockError::TooFewErrors {
            found: sorted.len(),
        });
    }
    sorted.sort_by(f64::total_cmp);
    let level = match target {
        Target::CycleService(p) => quantile_sorted(&sorted, p).unwrap_or(mean),
        Target::FillRate(beta) => {
            let wanted = (1.0 - beta) * cycle_demand;
            let average = sorted.iter().sum::<f64>() / sorted.len() as f64;
            let (lowest, highest) = (sorted[0], sorted[sorted.len() - 1]);
            if average - lowest <= wanted {
                // Below every scenario the shortage is the mean minus the level.
                average - wanted
            } else {
                let (mut low, mut high) = (lowest, highest);
                for _ in 0..200 {
                    let mid = 0.5 * (low + high);
                    if mid <= low || mid >= high {
                        break;
                    }
                    if shortage(&sorted, mid) > wanted {
                        low = mid;
                    } else {
                        high = mid;
                    }
                }
                0.5 * (low + high)
            }
        }
    };
    let expected_shortage = shortage(&sorted, level);
    let held = sorted.iter().filter(|d| **d <= level).count();
    let fill_rate = 1.0 - expected_shortage / cycle_demand;
    Ok(Figures {
        safety_factor: None,
        safety_stock: level - mean,
        level,
        expected_shortage,
        cycle_service_level: held as f64 / sorted.len() as f64,
        fill_rate,
        fill_rate_exact: fill_rate,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Scenarios 0..=9 (mean 4.5): each check by hand.
    fn check(target: Target, level: f64, shortage: f64, csl: f64) {
        let d: Vec<f64> = (0..10).map(f64::from).rev().collect();
        let f = empirical_figures(4.5, &d, 10.0, target).unwrap();
        assert!(
            (f.level - level).abs() < 1e-9,
            "{target:?}: level {}",
            f.level
        );
        assert!((f.expected_shortage - shortage).abs() < 1e-9, "{target:?}");
        assert!((f.cycle_service_level - csl).abs() < 1e-12, "{target:?}");
        assert!((f.safety_stock - (level - 4.5)).abs() < 1e-9);
        assert!((f.fill_rate - (1.0 - shortage / 10.0)).abs() < 1e-9);
    }

    #[test]
    fn levels_and_service_by_hand() {
        // 0.9-quantile of 0..=9, type 7: position 8.1 -> 8.1; shortage (0.9 / 10) = 0.09; 9 of
        // 10 scenarios at or below.
        check(Target::CycleService(0.9), 8.1, 0.09, 0.9);
        // Median: 4.5; shortage (0.5 + 1.5 + 2.5 + 3.5 + 4.5) / 10 = 1.25.
        check(Target::CycleService(0.5), 4.5, 1.25, 0.5);
        // Fill rate 0.9 with C = 10: shortage 1.0 wanted. Between 5 and 6 the shortage is
        // ((6 - x) + 3 + 2 + 1... ) / 10: at x = 5 it is (4+3+2+1)/10 = 1.0 exactly.
        check(Target::FillRate(0.9), 5.0, 1.0, 0.6);
        // Fill rate 0.5: shortage 5 wanted, more than mean - lowest (4.5): level = 4.5 - 5.
        check(Target::FillRate(0.5), -0.5, 5.0, 0.0);
        assert_eq!(
            empirical_figures(1.0, &[3.0], 1.0, Target::CycleService(0.9)),
            Err(StockError::TooFewErrors { found: 1 })
        );
    }
}
