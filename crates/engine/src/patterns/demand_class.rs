//! Demand class: smooth, erratic, intermittent or lumpy, from how often demand occurs and how
//! much its sizes vary (Syntetos, Boylan & Croston, "On the categorization of demand patterns",
//! Journal of the Operational Research Society 56(5), 2005, 495-503).
//!
//! Kept apart from: the intermittent-demand methods themselves; the class only guides which
//! methods are worth trying.
//!
//! Definitions used here (the paper fixes the cut-offs, not every estimator):
//! - ADI (average demand interval) = n / k, with n the number of periods and k the number of
//!   periods with demand. This counts leading and trailing zero periods; the mean of the gaps
//!   between successive demands (first gap counted from the start) equals (position of the last
//!   demand) / k instead, and differs only by the trailing zeros.
//! - CV^2 = s^2 / mean^2 of the k demand sizes, with the sample variance
//!   s^2 = sum (x - mean)^2 / (k - 1) (the usual unbiased estimator, common practice). With a
//!   single demand there is no observed variation and CV^2 = 0.
//! - Negative values (net returns) are not demand: they count as periods without demand and are
//!   reported in `negative_periods`. Taking them as sizes would let a return cancel a sale in the
//!   mean size and blow up CV^2 for no reason a buyer would recognise.
//! - No demand at all (every value zero or negative, or no values) gives ADI = infinity (n / 0),
//!   CV^2 = 0 and hence "intermittent": the cut-off rule applied to the honest numbers.

/// ADI at or above which demand counts as infrequent (Syntetos, Boylan & Croston 2005).
pub const ADI_CUTOFF: f64 = 1.32;
/// CV^2 of demand sizes at or above which sizes count as highly variable (same source).
pub const CV2_CUTOFF: f64 = 0.49;

/// Demand classes of Syntetos, Boylan & Croston (2005).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum DemandClass {
    /// Frequent demand of steady size (ADI < 1.32, CV^2 < 0.49).
    Smooth,
    /// Frequent demand of varying size (ADI < 1.32, CV^2 >= 0.49).
    Erratic,
    /// Infrequent demand of steady size (ADI >= 1.32, CV^2 < 0.49).
    Intermittent,
    /// Infrequent demand of varying size (ADI >= 1.32, CV^2 >= 0.49).
    Lumpy,
}

impl DemandClass {
    /// "smooth", "erratic", "intermittent" or "lumpy".
    pub fn as_str(self) -> &'static str {
        match self {
            DemandClass::Smooth => "smooth",
            DemandClass::Erratic => "erratic",
            DemandClass::Intermittent => "intermittent",
            DemandClass::Lumpy => "lumpy",
        }
    }

    /// Intermittent or lumpy: demands at least [`ADI_CUTOFF`] periods apart on average, where
    /// SBA is the automatic choice, the Stock plan leaves the normal model, and some alerts
    /// stand down.
    pub fn is_sparse(self) -> bool {
        matches!(self, DemandClass::Intermittent | DemandClass::Lumpy)
    }

    /// The class of an (ADI, CV^2) pair under the published cut-offs.
    pub fn from_measures(adi: f64, cv2: f64) -> DemandClass {
        match (adi >= ADI_CUTOFF, cv2 >= CV2_CUTOFF) {
            (false, false) => DemandClass::Smooth,
            (false, true) => DemandClass::Erratic,
            (true, false) => DemandClass::Intermittent,
            (true, true) => DemandClass::Lumpy,
        }
    }
}

/// The demand-class verdict and its evidence.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct DemandVerdict {
    /// The class the measures give.
    pub class: DemandClass,
    /// n / k (infinite when k = 0).
    pub adi: f64,
    /// Squared coefficient of variation of the demand sizes (sample variance).
    pub cv2: f64,
    /// n: periods looked at.
    pub periods: usize,
    /// k: periods with demand (value > 0).
    pub demand_periods: usize,
    /// Periods with a negative value (treated as no demand).
    pub negative_periods: usize,
    /// One sentence that explains the verdict.
    pub reason: String,
}

/// Classifies `values` (one per period, in any order) by ADI and CV^2; see the module docs for
/// the exact definitions. Non-finite values count as periods without demand.
pub fn classify_demand(values: &[f64]) -> DemandVerdict {
    let periods = values.len();
    let sizes: Vec<f64> = values
        .iter()
        .copied()
        .filter(|v| v.is_finite() && *v > 0.0)
        .collect();
    let negative_periods = values.iter().filter(|v| **v < 0.0).count();
    let demand_periods = sizes.len();
    let adi = if demand_periods == 0 {
        f64::INFINITY
    } else {
        periods as f64 / demand_periods as f64
    };
    let cv2 = squared_coefficient_of_variation(&sizes);
    let class = DemandClass::from_measures(adi, cv2);
    let reason =
        if demand_periods == 0 {
            format!(
                "{}: no period out of {periods} has any demand",
                class.as_str()
            )
        } else {
            format!(
            "{}: demand in {demand_periods} of {periods} periods (average interval {adi:.2}, {} \
             the {ADI_CUTOFF} cut-off) with size variation CV\u{b2} {cv2:.2} ({} the {CV2_CUTOFF} \
             cut-off)",
            class.as_str(),
            if adi >= ADI_CUTOFF { "at or above" } else { "below" },
            if cv2 >= CV2_CUTOFF { "at or above" } else { "below" },
        )
        };
    DemandVerdict {
        class,
        adi,
        cv2,
        periods,
        demand_periods,
        negative_periods,
        reason,
    }
}

/// s^2 / mean^2 with the (k - 1) divisor; 0 for fewer than two sizes. Sizes are positive, so
/// the mean is never zero.
fn squared_coefficient_of_variation(sizes: &[f64]) -> f64 {
    let k = sizes.len();
    if k < 2 {
        return 0.0;
    }
    let mean = sizes.iter().sum::<f64>() / k as f64;
    let sample_variance = sizes.iter().map(|x| (x - mean).powi(2)).sum::<f64>() / (k - 1) as f64;
    sample_variance / (mean * mean)
}

#[cfg(test)]
mod tests {
    use super::*;

    // Constructed boundary cases (cut-offs from Syntetos, Boylan & Croston 2005). ADI = 33/25 is
    // the double nearest 1.32, equal to the constant; sizes 3, 10, 17 have mean 10 and sample
    // variance (49 + 0 + 49)/2 = 49, so CV^2 = 49/100, the double nearest 0.49.
    #[test]
    fn cut_offs_are_inclusive_from_above() {
        let steady = |demands: usize, periods: usize| {
            let mut v = vec![5.0; demands];
            v.resize(periods, 0.0);
            classify_demand(&v)
        };
        assert_eq!(steady(25, 33).adi, ADI_CUTOFF);
        assert_eq!(steady(25, 33).class, DemandClass::Intermittent);
        assert_eq!(steady(25, 32).class, DemandClass::Smooth);

        let at_cv2 = classify_demand(&[3.0, 10.0, 17.0]);
        assert_eq!(at_cv2.cv2, CV2_CUTOFF);
        assert_eq!(at_cv2.class, DemandClass::Erratic);
        let below_cv2 = classify_demand(&[3.01, 10.0, 16.99]);
        assert!(below_cv2.cv2 < CV2_CUTOFF);
        assert_eq!(below_cv2.class, DemandClass::Smooth);
        let lumpy = classify_demand(&[3.0, 0.0, 10.0, 0.0, 17.0]);
        assert_eq!(lumpy.class, DemandClass::Lumpy);
        assert_eq!(
            DemandClass::from_measures(ADI_CUTOFF - 1e-9, CV2_CUTOFF),
            DemandClass::Erratic
        );
    }

    #[test]
    fn degenerate_inputs_do_not_panic() {
        let empty = classify_demand(&[]);
        assert_eq!(empty.class, DemandClass::Intermittent);
        assert!(empty.adi.is_infinite());
        let zeros = classify_demand(&[0.0; 12]);
        assert_eq!((zeros.class, zeros.cv2), (DemandClass::Intermittent, 0.0));
        let single = classify_demand(&[4.0]);
        assert_eq!((single.adi, single.cv2), (1.0, 0.0));
        assert_eq!(single.class, DemandClass::Smooth);
        let odd = classify_demand(&[f64::NAN, f64::INFINITY, 2.0, 2.0]);
        assert_eq!((odd.demand_periods, odd.adi), (2, 2.0));
    }

    #[test]
    fn returns_are_not_demand() {
        let v = classify_demand(&[5.0, -3.0, 5.0, 0.0]);
        assert_eq!((v.demand_periods, v.negative_periods), (2, 1));
        assert_eq!((v.adi, v.cv2), (2.0, 0.0));
        assert_eq!(v.class, DemandClass::Intermittent);
    }
}
