//! The Outliers alert's rule: which periods the plan's one-step fit misses by far more than the
//! rest, each error first divided by the fit's size to the power the errors show
//! ([`spread_power`]), so that on an item whose noise grows with its level the loud stretch is
//! not taken for outliers. Kept apart from the wording (the alerts' own module) and from the
//! fit (the plan is taken as made).

use crate::plan::ItemPlan;
use crate::series::Series;
use crate::sorting;

/// Modified z-score beyond which a one-step error is an outlier: 3.5 (Iglewicz & Hoaglin 1993,
/// "How to detect and handle outliers"), with z = 0.6745 (e - median) / MAD over the errors;
/// the floor of [`outlier_cut`].
pub const OUTLIER_Z: f64 = 3.5;

/// The modified z-score an error must pass among `n`: 3.5, or where higher the normal quantile
/// that n normal errors all stay within with 95 % probability, z(1 - 0.025 / n) (Bonferroni's
/// correction for looking at n errors at once; 3.5 per error alone flagged about a third of
/// stable daily items with 540 days). From 3.5 at up to 107 errors to 3.9 at 540 and 4.3 at
/// 3,650.
pub fn outlier_cut(n: usize) -> f64 {
    let per_error = 0.025 / n.max(1) as f64;
    OUTLIER_Z.max(crate::bands::standard_normal_quantile(1.0 - per_error))
}

/// The fit's size counts from at least this share of its median (our choice), so that fits
/// near or below zero do not blow the divided errors up.
pub const SIZE_FLOOR: f64 = 0.1;

/// The power is read only where the upper third's median fit is at least this many times the
/// lower third's (our choice): below it, the power hardly changes the divided errors and the
/// thirds' spreads are mostly noise.
pub const LEVEL_RATIO_FOR_POWER: f64 = 2.0;

/// The power is read only where the upper third's spread passes the lower third's by more
/// than chance explains: ln(s_high / s_low) above this one-sided 5 % normal quantile times its
/// standard error under equal spreads ([`LOG_MEDIAN_SPREAD_SD`] sqrt(2 / k), k errors a third).
pub const POWER_TEST_Z: f64 = 1.645;

/// Rounds of reading the power, each from the periods that do not stand out at the power
/// before (our choice: the third round moved it for few items in the alert laboratory).
pub const POWER_ROUNDS: usize = 3;

/// The standard deviation of the log of the median |e| of k normal errors, times sqrt(k), for
/// large k: the sample median's variance 1 / (4 k f(m)^2) (Laplace; any statistics text), for
/// |e| with median m = z(0.75) = 0.6745 and density f(m) = 2 phi(m) = 0.6355, divided by m.
pub const LOG_MEDIAN_SPREAD_SD: f64 = 1.1664;

/// A period the fit misses by far.
#[derive(Clone, Debug, PartialEq)]
pub struct FarPeriod {
    /// Its place in the history (0 for the first period).
    pub index: usize,
    /// The demand entered.
    pub demand: f64,
    /// The fit's one-step forecast for it.
    pub fit: f64,
    /// Its modified z-score, after dividing by the fit's size to the [`Outliers::power`].
    pub z: f64,
}

/// The Outliers rule's reading of a plan.
#[derive(Clone, Debug, PartialEq)]
pub struct Outliers {
    /// The periods missed by far, in time order.
    pub periods: Vec<FarPeriod>,
    /// The power b each error was divided by the fit's size to (0: errors as they are).
    pub power: f64,
    /// The cut the modified z-scores had to pass ([`outlier_cut`] for the count judged).
    pub cut: f64,
    /// The first period with a one-step fit: earlier ones are not judged themselves.
    pub first_judged: usize,
}

/// The power b in "the errors' spread grows like the fit's size to the b": with the errors
/// sorted by their fit f and cut in thirds, b = ln(s_high / s_low) / ln(f_high / f_low), s the
/// median |e| and f the median fit (floored at [`SIZE_FLOOR`] of the median fit) of the lower
/// and upper third, kept within 0 (noise of one size: errors as they are) and 1 (noise a share
/// of the level). 0 where a third holds fewer than 4 errors, either spread is 0, f_high <
/// [`LEVEL_RATIO_FOR_POWER`] f_low, or s_high does not pass s_low by more than chance explains
/// ([`POWER_TEST_Z`]). Count-like (Poisson) noise gives about 1/2. Medians; still, the errors a
/// typing error causes (its own and the fit's after it) can fill a third, so [`outliers`] reads
/// the power from its ordinary periods only. A robust form of reading the power
/// of the variance against the mean (Taylor 1961, Nature 189, for counts); the thirds and the
/// test are our choice.
pub fn spread_power(pairs: &[(f64, f64)]) -> f64 {
    let third = pairs.len() / 3;
    if third < 4 {
        return 0.0;
    }
    let floor = size_floor(pairs);
    let mut sorted = pairs.to_vec();
    sorting::sort_by(&mut sorted, |a, b| a.0.total_cmp(&b.0));
    let (low, high) = (&sorted[..third], &sorted[sorted.len() - third..]);
    let median_of = |part: &[(f64, f64)], pick: &dyn Fn(&(f64, f64)) -> f64| {
        super::median(part.iter().map(pick).collect()).unwrap_or(0.0)
    };
    let (level_low, level_high) = (
        median_of(low, &|p| p.0.max(floor)),
        median_of(high, &|p| p.0.max(floor)),
    );
    let (spread_low, spread_high) = (
        median_of(low, &|p| p.1.abs()),
        median_of(high, &|p| p.1.abs()),
    );
    if level_high < LEVEL_RATIO_FOR_POWER * level_low || spread_low <= 0.0 || spread_high <= 0.0 {
        return 0.0;
    }
    let chance = POWER_TEST_Z * LOG_MEDIAN_SPREAD_SD * (2.0 / third as f64).sqrt();
    if (spread_high / spread_low).ln() <= chance {
        return 0.0;
    }
    ((spread_high / spread_low).ln() / (level_high / level_low).ln()).clamp(0.0, 1.0)
}

/// [`SIZE_FLOOR`] of the median fit (and above 0).
fn size_floor(pairs: &[(f64, f64)]) -> f64 {
    let median_fit = super::median(pairs.iter().map(|p| p.0).collect()).unwrap_or(0.0);
    (SIZE_FLOOR * median_fit).max(f64::MIN_POSITIVE)
}

/// The Outliers rule on a plan's one-step fit (errors forecast minus demand) over the periods,
/// from the second, that `series` (the plan's) did not have filled in: each error over
/// max(f, floor)^b, b read by [`spread_power`] in up to [`POWER_ROUNDS`] rounds from the errors
/// that do not stand out at the power before and whose forecast lies within those periods'
/// demands; a period is far when its modified z-score passes [`outlier_cut`] for the count both
/// so weighed and as it is. `None` where no period is judged, and for sparse demand, where
/// every demand period stands out against the zeros (its own alert says so).
pub fn outliers(plan: &ItemPlan, series: &Series) -> Option<Outliers> {
    if plan.demand.class.is_sparse() {
        return None;
    }
    let filled = series.gap_indices();
    // Not the first period: its "forecast" comes from starting values fitted on the whole
    // history (some methods' even from its own demand), which an odd period anywhere pulls.
    let judged: Vec<(usize, f64, f64)> = plan
        .fitted
        .iter()
        .zip(&plan.history)
        .enumerate()
        .filter(|(t, _)| *t > 0 && !filled.contains(t))
        .filter_map(|(t, (f, d))| f.map(|f| (t, f, *d)))
        .collect();
    let first_judged = judged.first()?.0;
    let pairs: Vec<(f64, f64)> = judged.iter().map(|(_, f, d)| (*f, f - d)).collect();
    let cut = outlier_cut(pairs.len());
    let floor = size_floor(&pairs);
    let scaled_at = |power: f64| -> Vec<f64> {
        pairs
            .iter()
            .map(|(f, e)| e / f.max(floor).powf(power))
            .collect()
    };
    // The power from the ordinary periods alone: those whose error does not stand out, and
    // whose forecast lies within the ordinary periods' demand (a forecast beyond every
    // ordinary demand is the fit thrown off by an odd period, not the item's size). Which
    // errors stand out depends on the power, so it is read in rounds from 0: judged as they
    // are, the loud errors of an item whose noise grows with its level stand out and would
    // hide the very growth that explains them.
    let mut power = 0.0;
    for _ in 0..POWER_ROUNDS {
        let is_ordinary: Vec<bool> = modified_z(&scaled_at(power))
            .iter()
            .map(|z| z.abs() <= cut)
            .collect();
        let (lowest, highest) = judged
            .iter()
            .zip(&is_ordinary)
            .filter(|(_, ordinary)| **ordinary)
            .fold(
                (f64::INFINITY, f64::NEG_INFINITY),
                |(lo, hi), ((_, _, d), _)| (lo.min(*d), hi.max(*d)),
            );
        let ordinary: Vec<(f64, f64)> = pairs
            .iter()
            .zip(&is_ordinary)
            .filter(|(p, ordinary)| **ordinary && (lowest..=highest).contains(&p.0))
            .map(|(p, _)| *p)
            .collect();
        let next = spread_power(&ordinary);
        if next == power {
            break;
        }
        power = next;
    }
    // A period must stand out both weighed and as it is: the weighing only takes away alarms
    // (a loud stretch of a growing item), never adds them (a fit that a typo made rough
    // everywhere can read a power that blows up the small early misses).
    let as_they_are = modified_z(&scaled_at(0.0));
    // Nor is a miss smaller than the demand's own resolution an outlier: where the fit
    // misses nowhere else (a series on a straight line), a miss of 0.4 units had a modified
    // z-score in the hundreds and was flagged. Our choice: one unit where demand comes in
    // whole units, else a hundredth of the median fit.
    let resolution = if plan.whole_units {
        1.0
    } else {
        0.01 * floor / SIZE_FLOOR
    };
    let periods = modified_z(&scaled_at(power))
        .into_iter()
        .zip(&as_they_are)
        .zip(&judged)
        .filter(|((z, z_as_is), (_, f, d))| {
            z.abs() > cut && z_as_is.abs() > cut && (f - d).abs() >= resolution
        })
        .map(|((z, _), t)| (z, t))
        .map(|(z, (t, f, d))| FarPeriod {
            index: *t,
            demand: *d,
            fit: *f,
            z,
        })
        .collect();
    Some(Outliers {
        periods,
        power,
        cut,
        first_judged,
    })
}

/// Each value's modified z-score 0.6745 (x - median) / MAD; all 0 when the MAD is 0 (more
/// than half the values equal: nothing stands out by this measure).
fn modified_z(values: &[f64]) -> Vec<f64> {
    let centre = super::median(values.to_vec()).unwrap_or(0.0);
    let mad = super::median(values.iter().map(|v| (v - centre).abs()).collect()).unwrap_or(0.0);
    values
        .iter()
        .map(|v| {
            if mad > 0.0 {
                0.6745 * (v - centre) / mad
            } else {
                0.0
            }
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn modified_z_scores_by_hand() {
        // Median 0, MAD 1: z = 0.6745 x; above 3.5 means |x| > 5.19.
        let check = |values: &[f64], want: usize| {
            let far = modified_z(values).iter().filter(|z| z.abs() > 3.5).count();
            assert_eq!(far, want, "{values:?}");
        };
        check(&[-1.0, 1.0, 0.0, -1.0, 1.0, 0.0, 5.0], 0);
        check(&[-1.0, 1.0, 0.0, -1.0, 1.0, 0.0, 5.3], 1);
        check(&[-1.0, 1.0, 0.0, -1.0, 1.0, 0.0, -9.0, 20.0, 0.0], 2);
        check(&[2.0, 2.0, 2.0, 2.0, 9.0], 0);
        check(&[], 0);
    }

    #[test]
    fn the_power_by_hand() {
        // Fits 10 (x4), 20 (x4), 40 (x4): thirds' medians 10 and 40, ratio 4.
        let check = |spreads: [f64; 3], want: f64| {
            let pairs: Vec<(f64, f64)> = [10.0, 20.0, 40.0]
                .iter()
                .zip(spreads)
                .flat_map(|(f, s)| [(*f, s), (*f, -s), (*f, s), (*f, -s)])
                .collect();
            let got = spread_power(&pairs);
            assert!(
                (got - want).abs() < 1e-12,
                "{spreads:?}: {got} against {want}"
            );
        };
        check([1.0, 1.0, 1.0], 0.0); // one size
        check([1.0, 2.0, 4.0], 1.0); // a share of the level: ln 4 / ln 4
        check([4.0, 2.0, 1.0], 0.0); // shrinking: kept at 0
        check([1.0, 4.0, 16.0], 1.0); // faster than the level: kept at 1

        // Like counts, ln 2 / ln 4, but with thirds of 4 a spread twice the other's is within
        // chance: 1.645 * 1.1664 * sqrt(2 / 4) = 1.357 > ln 2. With thirds of 40 (0.429) it
        // is read.
        check([1.0, 1.5, 2.0], 0.0);
        let many: Vec<(f64, f64)> = [(10.0, 1.0), (20.0, 1.5), (40.0, 2.0)]
            .iter()
            .flat_map(|(f, s)| (0..40).map(move |i| (*f, if i % 2 == 0 { *s } else { -s })))
            .collect();
        assert!((spread_power(&many) - 0.5).abs() < 1e-12);
        // Fits within twice each other: not read.
        let flat: Vec<(f64, f64)> = (0..12).map(|t| (10.0 + t as f64 / 4.0, t as f64)).collect();
        assert_eq!(spread_power(&flat), 0.0);
        // Too few for thirds of 4.
        assert_eq!(spread_power(&flat[..11]), 0.0);
    }
}
