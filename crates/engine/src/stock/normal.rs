//! The normal model of demand over the protection interval: the standard normal loss, its
//! inverse, the spreads of the textbook cases, and the figures under a normal error.
//!
//! Kept apart from: where the mean and spread come from ([`super::item`]) and the empirical
//! model for sparse demand ([`super::empirical`]).

use std::f64::consts::PI;

use statrs::distribution::{ContinuousCDF, Normal};

use super::{
    check_quantity, traditional_fill_rate, Figures, IntervalDemand, Review, StockError, Target,
};

/// The standard normal density phi(k).
fn density(k: f64) -> f64 {
    (-0.5 * k * k).exp() / (2.0 * PI).sqrt()
}

/// 1 - Phi(k) from Marsaglia's series (G. Marsaglia, "Evaluating the normal distribution",
/// Journal of Statistical Software 11(4), 2004): Phi(k) - 1/2 = phi(k) times the sum of
/// k^(2n+1) / (1 3 5 ... (2n+1)) over n >= 0, every term of one sign, summed until it stops
/// changing the total. Accurate to a few
/// units in the last digit for k <= 0; for k > 0 the subtraction from 1/2 loses about
/// log10(1 / (1 - Phi(k))) digits (3.4 at k = 3), which is why [`normal_loss`] leaves it above 3.
fn upper_tail(k: f64) -> f64 {
    let (mut sum, mut term) = (k, k);
    let square = k * k;
    let mut odd = 1.0;
    loop {
        odd += 2.0;
        term *= square / odd;
        let next = sum + term;
        if next == sum {
            break;
        }
        sum = next;
    }
    0.5 - sum * density(k)
}

/// The standard normal loss G(k) = phi(k) - k (1 - Phi(k)) = E[(Z - k)+].
///
/// Up to k = 3 the formula as written with [`upper_tail`]: at k <= 0 both terms are positive;
/// for 0 < k <= 3 the tail loses at most 3.4 digits and the subtraction a factor
/// phi(k) / G(k) < 12, so about 1e-12 relative at worst. Above 3 G is taken from Laplace's
/// continued fraction for the Mills ratio (1 - Phi(k)) / phi(k) =
/// 1/(k + 1/(k + 2/(k + 3/(k + ...)))): with u = 1/(k + 2/(k + 3/(k + ...))),
/// G(k) = phi(k) u / (k + u), free of cancellation. (statrs' erfc was not used: its relative
/// error near k = 3.5 showed in G at 1e-9; the fraction converges slowly near k = 2, 2.5e-10
/// with 100 terms, hence the series below 3 and 400 terms above.)
pub fn normal_loss(k: f64) -> f64 {
    if k.is_nan() {
        return f64::NAN;
    }
    if k <= 3.0 {
        return density(k) - k * upper_tail(k);
    }
    let mut d = k;
    for j in (2..=400).rev() {
        d = k + j as f64 / d;
    }
    let u = 1.0 / d;
    density(k) * u / (k + u)
}

/// The k with G(k) = `loss` (> 0): bisection between -loss (where G(k) > -k >= loss) and the
/// first of 1, 2, 4, ... where G falls below `loss`; G is strictly decreasing, so the bracket
/// always holds the root. Bisection runs until the bracket stops shrinking.
pub fn inverse_normal_loss(loss: f64) -> Option<f64> {
    if !(loss > 0.0 && loss.is_finite()) {
        return None;
    }
    let mut low = -loss;
    let mut high = 1.0f64;
    while normal_loss(high) >= loss {
        high *= 2.0;
    }
    for _ in 0..300 {
        let mid = 0.5 * (low + high);
        if mid <= low || mid >= high {
            break;
        }
        if normal_loss(mid) > loss {
            low = mid;
        } else {
            high = mid;
        }
    }
    Some(0.5 * (low + high))
}

/// Phi^-1(p) for p in (0, 1).
pub(crate) fn normal_quantile(p: f64) -> f64 {
    Normal::standard().inverse_cdf(p)
}

/// Phi(k).
fn normal_cdf(k: f64) -> f64 {
    Normal::standard().cdf(k)
}

/// sigma_P = sigma sqrt(P): one-period errors taken as independent (Chopra & Meindl ch. 12).
pub fn sd_independent(sigma_per_period: f64, periods: f64) -> f64 {
    sigma_per_period * periods.max(0.0).sqrt()
}

/// sigma_P = sqrt(sum of sigma_h^2) over h = 1..P: the horizon-aware spreads, with the
/// covariances between horizons left out (tests/fixtures/refs/stock/README.md, trap 6: for a
/// re-estimated level they are positive, so this understates the spread of the total).
pub fn sd_per_horizon(sigma_by_horizon: &[f64]) -> f64 {
    sigma_by_horizon.iter().map(|s| s * s).sum::<f64>().sqrt()
}

/// sigma_P = sqrt(P sigma^2 + mu^2 s_L^2) for a lead time with standard deviation s_L, demand
/// and lead time independent (Chopra & Meindl ch. 12, from memory; with s_L = 0 it is
/// [`sd_independent`] exactly).
pub fn sd_variable_lead_time(
    sigma_per_period: f64,
    mean_per_period: f64,
    periods: f64,
    lead_time_sd: f64,
) -> f64 {
    (periods.max(0.0) * sigma_per_period * sigma_per_period
        + mean_per_period * mean_per_period * lead_time_sd * lead_time_sd)
        .sqrt()
}

/// Works out the figures. `protection` is the demand over P (L, or R + L); `lead` the demand
/// over L alone (used by Sobel's (R, S) fill rate; for continuous review it is `protection`);
/// `cycle_demand` C is Q (continuous) or the expected demand over R (periodic).
pub fn figures(
    protection: IntervalDemand,
    lead: IntervalDemand,
    review: Review,
    cycle_demand: f64,
    target: Target,
) -> Result<Figures, StockError> {
    let cycle_demand = check_quantity("demand per cycle", cycle_demand, true)?;
    let sigma = protection.sd;
    let k = if sigma > 0.0 {
        Some(match target {
            Target::CycleService(p) => normal_quantile(p),
            Target::FillRate(beta) => {
                let wanted = (1.0 - beta) * cycle_demand / sigma;
                inverse_normal_loss(wanted).ok_or(StockError::BadQuantity {
                    what: "fill-rate loss",
                    value: wanted,
                    needs: "a positive finite number",
                })?
            }
        })
    } else {
        None
    };
    let Some(k) = k else {
        return Ok(Figures {
            safety_factor: None,
            safety_stock: 0.0,
            level: protection.mean,
            expected_shortage: 0.0,
            cycle_service_level: 1.0,
            fill_rate: 1.0,
            fill_rate_exact: 1.0,
        });
    };
    let safety_stock = k * sigma;
    let level = protection.mean + safety_stock;
    let expected_shortage = sigma * normal_loss(k);
    let exact_shortage = match review {
        Review::Continuous { order_quantity } => {
            expected_shortage - sigma * normal_loss(k + order_quantity / sigma)
        }
        Review::Periodic { .. } if lead.sd > 0.0 => {
            let k_lead = (level - lead.mean) / lead.sd;
            expected_shortage - lead.sd * normal_loss(k_lead)
        }
        Review::Periodic { .. } => expected_shortage - (lead.mean - level).max(0.0),
    };
    Ok(Figures {
        safety_factor: Some(k),
        safety_stock,
        level,
        expected_shortage,
        cycle_service_level: normal_cdf(k),
        fill_rate: traditional_fill_rate(expected_shortage, cycle_demand),
        fill_rate_exact: 1.0 - exact_shortage / cycle_demand,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn loss_identities() {
        // G(k) - G(-k) = -k (E[(Z-k)+] - E[(k-Z)+] = E[Z - k]); G(0) = phi(0).
        for k in [0.1, 0.5, 1.0, 1.9, 2.1, 3.0, 5.0, 6.0] {
            let gap = normal_loss(k) - normal_loss(-k) + k;
            assert!(gap.abs() < 1e-14, "{k}: {gap:e}");
        }
        assert!((normal_loss(0.0) - 1.0 / (2.0 * PI).sqrt()).abs() < 1e-16);
        // The two forms meet at k = 3.
        let direct = density(3.0) - 3.0 * upper_tail(3.0);
        assert!((normal_loss(3.0 + 1e-13) / direct - 1.0).abs() < 1e-11);
        for g in [5.0, 1.0, 0.1, 1e-3, 1e-9, 1e-14] {
            let k = inverse_normal_loss(g).unwrap();
            assert!((normal_loss(k) / g - 1.0).abs() < 1e-12, "{g}: {k}");
        }
        assert_eq!(inverse_normal_loss(0.0), None);
    }

    #[test]
    fn inputs_are_checked() {
        assert!(Target::cycle_service(1.0).is_err());
        assert!(Target::fill_rate(0.0).is_err());
        assert!(Review::periodic(0.0).is_err());
        assert!(Review::continuous(f64::NAN).is_err());
        assert!(IntervalDemand::new(10.0, -1.0).is_err());
        let message = Target::cycle_service(95.0).unwrap_err().to_string();
        assert!(
            message.contains("95") && message.contains("0.95"),
            "{message}"
        );
    }
}
