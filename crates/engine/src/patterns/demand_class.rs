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
//! - Places of the calendar's season without demand in (almost) all their periods (a shop shut
//!   on Sundays and Mondays: Intake reads its closed days as 0) are left out of n
//!   ([`shut_places`], [`classify_open_demand`]): their zeros are the calendar, not how often
//!   the item sells, and counted they made a shop selling every open day "intermittent" (ADI
//!   7/5 = 1.4 for a shop shut two days a week), which put SBA's flat forecast on every day.

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
    /// Periods left out as places of the season that (almost) never have demand
    /// ([`shut_places`]).
    pub shut_periods: usize,
    /// Those places (`t % shut_cycle`, t from the history's first period; empty when none),
    /// which the plan forecasts as 0.
    pub shut_places: Vec<usize>,
    /// The season the shut places are places of (0 when there are none).
    pub shut_cycle: usize,
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
        shut_periods: 0,
        shut_places: Vec::new(),
        shut_cycle: 0,
        reason,
    }
}

/// The factor that gives a forecast path's open steps what the methods spread over its shut
/// places ([`shut_places`]), in proportion: 1 + (s / (m - s)) (mean on shut steps / mean on
/// open steps), for s shut places of every `cycle` m. Over whole seasons this is total /
/// open; taken from the means it does not depend on how many shut steps a short path happens
/// to hold (over the path's count, a horizon ending just after a weekend piled two shut
/// days' share on one open day: a review found a reorder point 24 % high). 1 where the path
/// has no shut or no open step, or nothing above 0 on its open steps. `shut` is asked of each
/// step's index.
fn open_share_factor(values: &[f64], cycle: usize, shut: impl Fn(usize) -> bool) -> f64 {
    let mean = |at_shut: bool| {
        let on: Vec<f64> = values
            .iter()
            .enumerate()
            .filter(|(h, _)| shut(*h) == at_shut)
            .map(|(_, v)| *v)
            .collect();
        (!on.is_empty()).then(|| on.iter().sum::<f64>() / on.len() as f64)
    };
    let places = (0..cycle).filter(|h| shut(*h)).count();
    match (mean(true), mean(false)) {
        (Some(at_shut), Some(open)) if open > 0.0 && places < cycle => {
            1.0 + places as f64 * at_shut.max(0.0) / ((cycle - places) as f64 * open)
        }
        _ => 1.0,
    }
}

/// A forecast path as the plan makes it at shut places ([`shut_places`]): 0 there, and what
/// the method put there given to the open steps in proportion ([`open_share_factor`]). The
/// one rule for the plan's forecast, the Backtest ranking's holdout forecasts and the rolling
/// origins' errors. `shut` is asked of each step's index from 0.
pub fn forecast_at_shut_places(path: &mut [f64], cycle: usize, shut: impl Fn(usize) -> bool) {
    if !(0..path.len()).any(&shut) {
        return;
    }
    let factor = open_share_factor(path, cycle, &shut);
    for (k, f) in path.iter_mut().enumerate() {
        *f = if shut(k) { 0.0 } else { *f * factor };
    }
}

impl DemandVerdict {
    /// Whether period `t` (counted from the history's first, so `n + h` is the forecast's
    /// step h from 0) falls on one of the [`shut_places`].
    pub fn is_shut(&self, t: usize) -> bool {
        self.shut_cycle > 0 && self.shut_places.contains(&(t % self.shut_cycle))
    }

    /// How many periods from `t` on in a row are shut (fewer than a season: shut places are
    /// fewer than half the season's).
    pub fn shut_run_from(&self, t: usize) -> usize {
        (t..t + self.shut_cycle)
            .take_while(|u| self.is_shut(*u))
            .count()
    }
}

/// Fewest periods of a place of the season without demand for it to count as shut... Our
/// choice, as Intake's closed periods of one row per period ask (`intake::build`).
pub const SHUT_AT_LEAST: usize = 3;
/// ...and the share of its periods they must be (a shop shut on Saturdays opening for one
/// before Christmas is still shut then). Our choice, Intake's closed share.
pub const SHUT_SHARE: f64 = 0.8;

/// Share of the other places' periods with demand that makes places without any shut, not
/// sparse: a shop's open days all sell (bar holidays), a slow item's do not, and three
/// Januaries without a sale of an item that sells one month in three are chance. Our choice,
/// as Intake's 90 % of rows on the open places (`intake::build`).
pub const OPEN_DEMAND_SHARE: f64 = 0.9;

/// The places `t % places` (t counted from the history's first period) whose periods have no
/// demand (value 0 or less, or not a number) in at least [`SHUT_SHARE`] of them and at least
/// [`SHUT_AT_LEAST`], the latest [`SHUT_AT_LEAST`] among them (Sundays opened for the last
/// weeks are open: a review found them forecast 0 until ten had sold), when they are
/// fewer than half the places and the other places' periods have demand in at least
/// [`OPEN_DEMAND_SHARE`] of them: a business shut on those days or months. Empty otherwise
/// (places without demand among places that often go without are how sparse demand looks,
/// not a calendar).
pub fn shut_places(values: &[f64], places: usize) -> Vec<usize> {
    if places < 2 {
        return Vec::new();
    }
    let shut: Vec<usize> = (0..places)
        .filter(|&p| {
            let none = |v: &f64| !(v.is_finite() && *v > 0.0);
            let at: Vec<f64> = values.iter().skip(p).step_by(places).copied().collect();
            let without = at.iter().filter(|v| none(v)).count();
            // The latest periods of the place too (there are at least SHUT_AT_LEAST once
            // `without` is): a day reopened is not shut.
            without >= SHUT_AT_LEAST
                && without as f64 >= SHUT_SHARE * at.len() as f64
                && at.iter().rev().take(SHUT_AT_LEAST).all(none)
        })
        .collect();
    let (mut open, mut selling) = (0usize, 0usize);
    for (t, v) in values.iter().enumerate() {
        if !shut.contains(&(t % places)) {
            open += 1;
            selling += usize::from(v.is_finite() && *v > 0.0);
        }
    }
    let others_sell = open > 0 && selling as f64 >= OPEN_DEMAND_SHARE * open as f64;
    if 2 * shut.len() >= places || !others_sell {
        return Vec::new();
    }
    shut
}

/// [`classify_demand`] of the periods outside the [`shut_places`] of a season of `places`
/// (`None`: no calendar season, every period counts), said in the reason.
pub fn classify_open_demand(values: &[f64], places: Option<usize>) -> DemandVerdict {
    let shut = places.map_or_else(Vec::new, |m| shut_places(values, m));
    let Some(m) = places.filter(|_| !shut.is_empty()) else {
        return classify_demand(values);
    };
    let open: Vec<f64> = values
        .iter()
        .enumerate()
        .filter(|(t, _)| !shut.contains(&(t % m)))
        .map(|(_, v)| *v)
        .collect();
    let mut verdict = classify_demand(&open);
    verdict.shut_periods = values.len() - open.len();
    verdict.reason.push_str(&format!(
        "; {} periods left out: {} of every {m} (almost) never have demand (a business shut \
         then)",
        verdict.shut_periods,
        shut.len()
    ));
    verdict.shut_places = shut;
    verdict.shut_cycle = m;
    verdict
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

    /// `shut_places(values, places)` is `expected`.
    fn check_shut(values: &[f64], places: usize, expected: &[usize]) {
        assert_eq!(shut_places(values, places), expected, "{values:?}");
    }

    #[test]
    fn places_without_demand_in_every_season() {
        // A week of 5 open days and 2 shut, three weeks: places 5 and 6.
        let week = [4.0, 5.0, 6.0, 5.0, 4.0, 0.0, 0.0];
        let weeks: Vec<f64> = week.iter().copied().cycle().take(21).collect();
        check_shut(&weeks, 7, &[5, 6]);
        // Two weeks only: too few periods of each place.
        check_shut(&weeks[..14], 7, &[]);
        // One sale on a place of three weeks: not shut (2 of 3 without demand), and its two
        // days without demand leave the open places below 90 % with demand, so Sundays are
        // not shut either. In ten weeks the place is shut still (9 of 10). A return (negative)
        // is no demand.
        let mut sold = weeks.clone();
        sold[12] = 1.0;
        check_shut(&sold, 7, &[]);
        let mut ten: Vec<f64> = week.iter().copied().cycle().take(70).collect();
        ten[12] = 1.0;
        check_shut(&ten, 7, &[5, 6]);
        ten[13] = -2.0;
        check_shut(&ten, 7, &[5, 6]);
        // A slow item: a place without a sale in three weeks among places that sell half the
        // time is chance, not a shut day.
        let slow: Vec<f64> = (0..21)
            .map(|t| if t % 7 == 6 || t % 2 == 0 { 0.0 } else { 3.0 })
            .collect();
        check_shut(&slow, 7, &[]);
        // Sundays shut for ten weeks and open for the last two: not shut, and counted open
        // they leave the open places under 90 % with demand: nothing is shut.
        let mut reopened: Vec<f64> = week.iter().copied().cycle().take(84).collect();
        reopened[76] = 3.0;
        reopened[83] = 4.0;
        check_shut(&reopened, 7, &[]);
        // Saturdays selling, Sundays shut throughout: Sundays only.
        let mut saturdays: Vec<f64> = week.iter().copied().cycle().take(84).collect();
        for t in (0..84).filter(|t| t % 7 == 5) {
            saturdays[t] = 3.0;
        }
        check_shut(&saturdays, 7, &[6]);
        // Half the places or more without demand, or no demand at all: sparse, not shut.
        let sparse: Vec<f64> = [3.0, 0.0].iter().copied().cycle().take(12).collect();
        check_shut(&sparse, 2, &[]);
        check_shut(&[0.0; 21], 7, &[]);
        check_shut(&weeks, 1, &[]);
    }

    // The shop shut two days a week sells every open day: smooth once its shut days are left
    // out (ADI 21/15 = 1.4, intermittent, with them).
    #[test]
    fn shut_places_are_left_out_of_the_class() {
        let week = [4.0, 5.0, 6.0, 5.0, 4.0, 0.0, 0.0];
        let weeks: Vec<f64> = week.iter().copied().cycle().take(21).collect();
        let all = classify_demand(&weeks);
        assert_eq!((all.adi, all.class), (1.4, DemandClass::Intermittent));
        let open = classify_open_demand(&weeks, Some(7));
        assert_eq!((open.periods, open.adi, open.shut_periods), (15, 1.0, 6));
        assert_eq!(open.class, DemandClass::Smooth);
        assert!(open.reason.ends_with("6 periods left out: 2 of every 7 (almost) never have demand (a business shut then)"), "{}", open.reason);
        assert_eq!(classify_open_demand(&weeks, None), all);
    }

    #[test]
    fn returns_are_not_demand() {
        let v = classify_demand(&[5.0, -3.0, 5.0, 0.0]);
        assert_eq!((v.demand_periods, v.negative_periods), (2, 1));
        assert_eq!((v.adi, v.cv2), (2.0, 0.0));
        assert_eq!(v.class, DemandClass::Intermittent);
    }
}
