//! Alerts: why an item needs a planner's attention, each with its reason in words, read off the
//! item's plan. The Item board lists them and filters by them; the command line's `stock` JSON
//! carries them.
//!
//! Kept apart from: planning (the plan is taken as made) and showing (the front ends word
//! nothing themselves). The cut-offs are here, each with its source or marked as our choice.

use crate::calendar::Frequency;
use crate::plan::ItemPlan;

/// What an alert is about (for filtering; the reason says the rest).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum AlertKind {
    /// The holdout's tracking signal ended beyond its limit.
    TrackingSignal,
    /// The holdout's errors lean one way more than chance explains.
    Bias,
    /// Fewer than two seasons of history: the season cannot be checked.
    ShortHistory,
    /// Less than one season of history.
    NewItem,
    /// Intermittent or lumpy demand.
    SparseDemand,
    /// No demand in the latest periods after demand before.
    NoRecentDemand,
    /// Periods the fit misses by far more than the rest.
    Outliers,
    /// A band much wider than the forecast it surrounds.
    WideBand,
}

impl AlertKind {
    /// Every kind, in the order the front ends list them.
    pub const ALL: [AlertKind; 8] = [
        AlertKind::TrackingSignal,
        AlertKind::Bias,
        AlertKind::ShortHistory,
        AlertKind::NewItem,
        AlertKind::SparseDemand,
        AlertKind::NoRecentDemand,
        AlertKind::Outliers,
        AlertKind::WideBand,
    ];

    /// A short title for lists and filters (the reason says the rest).
    pub fn title(self) -> &'static str {
        match self {
            AlertKind::TrackingSignal => "Tracking signal",
            AlertKind::Bias => "Bias",
            AlertKind::ShortHistory => "Short history",
            AlertKind::NewItem => "New item",
            AlertKind::SparseDemand => "Sparse demand",
            AlertKind::NoRecentDemand => "No recent demand",
            AlertKind::Outliers => "Outliers",
            AlertKind::WideBand => "Wide band",
        }
    }

    /// Stable machine name.
    pub fn key(self) -> &'static str {
        match self {
            AlertKind::TrackingSignal => "tracking_signal",
            AlertKind::Bias => "bias",
            AlertKind::ShortHistory => "short_history",
            AlertKind::NewItem => "new_item",
            AlertKind::SparseDemand => "sparse_demand",
            AlertKind::NoRecentDemand => "no_recent_demand",
            AlertKind::Outliers => "outliers",
            AlertKind::WideBand => "wide_band",
        }
    }
}

/// One alert.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Alert {
    /// What it is about.
    pub kind: AlertKind,
    /// Why, in words a planner can act on.
    pub reason: String,
}

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

/// The periods without demand, at the end of a history that had demand before them, that make
/// "no recent demand": a quarter of the calendar season, at least 3 (our choice).
fn quiet_periods(frequency: Frequency) -> usize {
    (frequency.natural_season().unwrap_or(12) / 4).max(3)
}

/// The season the history is measured in for "short" and "new": the accepted one, else the
/// calendar's, else 12 periods (our choice for undated data).
fn season_for_length(plan: &ItemPlan, frequency: Frequency) -> usize {
    plan.season
        .length
        .or(frequency.natural_season())
        .unwrap_or(12)
}

/// Every alert of a plan, in the order of [`AlertKind`].
pub fn alerts(plan: &ItemPlan, frequency: Frequency) -> Vec<Alert> {
    let mut out = Vec::new();
    let mut say = |kind, reason: String| out.push(Alert { kind, reason });
    if let Some(last) = plan.ledger.last() {
        if let Some(ts) = last.row.tracking_signal {
            // The Error ledger's own mark: |tracking signal| beyond the plan's limit.
            if last.row.out_of_limits {
                say(
                    AlertKind::TrackingSignal,
                    format!(
                        "tracking signal {ts:.1} over the holdout, beyond ±{}: the forecast ran \
                         {} than demand",
                        plan.tracking_limit,
                        if ts > 0.0 { "higher" } else { "lower" }
                    ),
                );
            }
        }
        // Bias: the mean holdout error against its standard error, beyond 2 (a mean error of
        // zero rejected at about 95 %, t-test common practice) with at least 4 errors.
        let errors: Vec<f64> = plan.ledger.iter().map(|e| e.row.error).collect();
        let k = errors.len() as f64;
        if errors.len() >= 4 {
            let mean = errors.iter().sum::<f64>() / k;
            let sd = (errors.iter().map(|e| (e - mean).powi(2)).sum::<f64>() / (k - 1.0)).sqrt();
            if sd > 0.0 && mean.abs() > 2.0 * sd / k.sqrt() {
                say(
                    AlertKind::Bias,
                    format!(
                        "over the holdout the forecast was {} by {:.1} per period on average, \
                         more than chance explains (mean error {:.1} standard errors from zero)",
                        if mean > 0.0 { "high" } else { "low" },
                        mean.abs(),
                        mean.abs() / (sd / k.sqrt())
                    ),
                );
            }
        }
    }
    let n = plan.history.len();
    let season = season_for_length(plan, frequency);
    if n < season {
        say(
            AlertKind::NewItem,
            format!("only {n} periods of history, less than one season of {season}: a new item"),
        );
    } else if n < 2 * season {
        say(
            AlertKind::ShortHistory,
            format!(
                "only {n} periods of history, fewer than two seasons of {season}: the season \
                 cannot be checked"
            ),
        );
    }
    let sparse = plan.demand.class.is_sparse();
    if sparse {
        say(AlertKind::SparseDemand, plan.demand.reason.clone());
    }
    let quiet = quiet_periods(frequency);
    if n > quiet {
        let (before, latest) = plan.history.split_at(n - quiet);
        if latest.iter().all(|v| *v == 0.0) && before.iter().any(|v| *v > 0.0) {
            say(
                AlertKind::NoRecentDemand,
                format!("no demand in the last {quiet} periods: possibly discontinued"),
            );
        }
    }
    // Outliers among the fit's one-step errors; not for sparse demand, where every demand
    // period stands out against the zeros (its own alert says so).
    let residuals: Vec<f64> = plan
        .fitted
        .iter()
        .zip(&plan.history)
        .filter_map(|(f, d)| f.map(|f| f - d))
        .collect();
    let far = if sparse { 0 } else { outliers(&residuals) };
    if far > 0 {
        say(
            AlertKind::Outliers,
            format!(
                "{far} period(s) the fit misses by far more than the rest (modified z-score \
                 above {:.1}): check them for one-off events or typing errors",
                outlier_cut(residuals.len())
            ),
        );
    }
    // A wide band, except for sparse demand, whose band is always wide against its small mean.
    if let Some(first) = plan.forecast.first().filter(|_| !sparse) {
        let width = first.band.high - first.band.low;
        if first.band.value > 0.0 && width > 2.0 * first.band.value {
            say(
                AlertKind::WideBand,
                format!(
                    "the next period's band ({:.1} to {:.1}) is more than twice as wide as the \
                     forecast ({:.1}): the forecast is rough",
                    first.band.low, first.band.high, first.band.value
                ),
            );
        }
    }
    out
}

/// How many values have a modified z-score above [`outlier_cut`] for their count; none when
/// the MAD is 0.
fn outliers(values: &[f64]) -> usize {
    let median = |v: &mut Vec<f64>| {
        v.sort_by(f64::total_cmp);
        crate::bands::quantile_sorted(v, 0.5)
    };
    let mut sorted = values.to_vec();
    let Some(centre) = median(&mut sorted) else {
        return 0;
    };
    let mut deviations: Vec<f64> = values.iter().map(|v| (v - centre).abs()).collect();
    let Some(mad) = median(&mut deviations) else {
        return 0;
    };
    if mad <= 0.0 {
        return 0;
    }
    values
        .iter()
        .filter(|v| 0.6745 * (*v - centre).abs() / mad > outlier_cut(values.len()))
        .count()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn modified_z_scores_by_hand() {
        // Median 0, MAD 1: z = 0.6745 |x|; above 3.5 means |x| > 5.19.
        let check = |values: &[f64], want: usize| assert_eq!(outliers(values), want, "{values:?}");
        check(&[-1.0, 1.0, 0.0, -1.0, 1.0, 0.0, 5.0], 0);
        check(&[-1.0, 1.0, 0.0, -1.0, 1.0, 0.0, 5.3], 1);
        check(&[-1.0, 1.0, 0.0, -1.0, 1.0, 0.0, -9.0, 20.0, 0.0], 2);
        check(&[2.0, 2.0, 2.0, 2.0, 9.0], 0);
        check(&[], 0);
    }
}
