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
/// stable daily items with 540 days). From 3.5 at up to 107 errors to 3.9 at 540 and 4.3 at 3,650.
pub fn outlier_cut(n: usize) -> f64 {
    let per_error = 0.025 / n.max(1) as f64;
    OUTLIER_Z.max(crate::bands::standard_normal_quantile(1.0 - per_error))
}

/// Fewest rolling origins for judging a holdout statistic against the forecast's own past: with
/// k origins the smallest p-value is 1 / (k + 1), so 19 reach 5 %.
const OWN_PAST_ORIGINS: usize = 19;
/// The p-value at or below which a holdout statistic is beyond the forecast's own past (our
/// choice: 5 %).
const OWN_PAST_P: f64 = 0.05;

/// A holdout statistic against the same statistic over the forecast's own past origins.
#[derive(Clone, Copy)]
struct OwnPast {
    /// Origins whose statistic is at least as far from zero.
    as_far: usize,
    /// Origins compared.
    origins: usize,
}

impl OwnPast {
    /// The conformal p-value (1 + as_far) / (1 + origins) (Vovk, Gammerman & Shafer 2005),
    /// which holds whatever the errors' shape and their sharing of each origin's level error.
    fn p(self) -> f64 {
        (1 + self.as_far) as f64 / (1 + self.origins) as f64
    }
}

/// `observed`, a statistic of the holdout's errors, against the same statistic over each of
/// the past origins' `paths` (their errors over as many steps); `None` with fewer than
/// [`OWN_PAST_ORIGINS`] of them.
fn own_past(
    paths: &[&[f64]],
    statistic: impl Fn(&[f64]) -> Option<f64>,
    observed: f64,
) -> Option<OwnPast> {
    let past: Vec<f64> = paths.iter().filter_map(|p| statistic(p)).collect();
    (past.len() >= OWN_PAST_ORIGINS).then(|| OwnPast {
        as_far: past.iter().filter(|s| s.abs() >= observed.abs()).count(),
        origins: past.len(),
    })
}

/// The one-step errors of the rolling origins: their mean and its t statistic.
struct Lasting {
    mean: f64,
    t: f64,
    origins: usize,
}

/// A bias the forecast's past shares (a combination trailing a steady trend): the mean of the
/// rolling origins' one-step errors more than 2 standard errors from zero (t-test, common
/// practice; one-step errors of successive origins share no shock), with at least
/// [`OWN_PAST_ORIGINS`] origins. The holdout against its own past cannot see it, since the
/// past leans the same way.
fn lasting_bias(paths: &[Vec<f64>]) -> Option<Lasting> {
    let first: Vec<f64> = paths.iter().filter_map(|p| p.first().copied()).collect();
    let k = first.len();
    if k < OWN_PAST_ORIGINS {
        return None;
    }
    let mean = first.iter().sum::<f64>() / k as f64;
    let sd = (first.iter().map(|e| (e - mean).powi(2)).sum::<f64>() / (k - 1) as f64).sqrt();
    let t = mean / (sd / (k as f64).sqrt());
    (sd > 0.0 && t.abs() > 2.0).then_some(Lasting {
        mean,
        t,
        origins: k,
    })
}

/// The tracking signal of a run of errors: their sum over their mean absolute value (as the
/// Error ledger's last row has it); `None` when every error is 0.
fn tracking_signal(errors: &[f64]) -> Option<f64> {
    let mad = errors.iter().map(|e| e.abs()).sum::<f64>() / errors.len() as f64;
    (mad > 0.0).then(|| errors.iter().sum::<f64>() / mad)
}

fn mean_error(errors: &[f64]) -> Option<f64> {
    (!errors.is_empty()).then(|| errors.iter().sum::<f64>() / errors.len() as f64)
}

/// ", further out than 35 of the 36 forecasts made at past origins over as many periods" for
/// a reason; empty without the comparison.
fn past_words(past: Option<OwnPast>) -> String {
    past.map_or(String::new(), |past| {
        format!(
            ", further out than {} of the {} forecasts made at past origins over as many periods",
            past.origins - past.as_far,
            past.origins
        )
    })
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
        let errors: Vec<f64> = plan.ledger.iter().map(|e| e.row.error).collect();
        // The past: origins whose forecasts over as many periods ended before the holdout (a
        // shift inside the holdout would otherwise stand in its own reference).
        let holdout_start = plan.history.len().saturating_sub(errors.len());
        let paths = plan
            .origin_errors
            .ending_before(errors.len(), holdout_start);
        if let Some(ts) = last.row.tracking_signal {
            // The Error ledger's own mark, |tracking signal| beyond the plan's limit, where the
            // forecast's own past origins rarely ended so far out (a sum of multi-step errors
            // from one origin passes ±4 for about a third of well-forecast monthly items).
            let past = own_past(&paths, tracking_signal, ts);
            if last.row.out_of_limits && past.is_none_or(|past| past.p() <= OWN_PAST_P) {
                say(
                    AlertKind::TrackingSignal,
                    format!(
                        "tracking signal {ts:.1} over the holdout, beyond ±{}{}: the forecast ran \
                         {} than demand",
                        plan.tracking_limit,
                        past_words(past),
                        if ts > 0.0 { "higher" } else { "lower" }
                    ),
                );
            }
        }
        // Bias: the mean holdout error, with at least 4 errors, against the forecast's own
        // past origins' mean errors over as many steps; with too few origins, against its
        // standard error, beyond 2 (a mean error of zero rejected at about 95 %, t-test
        // common practice; errors from one origin share its level error, so it errs towards
        // alerting).
        let k = errors.len() as f64;
        if errors.len() >= 4 {
            let mean = errors.iter().sum::<f64>() / k;
            let sd = (errors.iter().map(|e| (e - mean).powi(2)).sum::<f64>() / (k - 1.0)).sqrt();
            let past = own_past(&paths, mean_error, mean);
            let beyond = match past {
                Some(past) => past.p() <= OWN_PAST_P,
                None => sd > 0.0 && mean.abs() > 2.0 * sd / k.sqrt(),
            };
            let lasting = lasting_bias(plan.origin_errors.paths()).filter(|b| b.mean * mean > 0.0);
            if let (false, Some(lasting)) = (beyond, lasting) {
                say(
                    AlertKind::Bias,
                    format!(
                        "over the last {} periods the forecast one period ahead ran {} by {:.1} \
                         on average ({:.1} standard errors from zero), and over the holdout by \
                         {:.1}: a lasting bias",
                        lasting.origins,
                        if mean > 0.0 { "high" } else { "low" },
                        lasting.mean.abs(),
                        lasting.t.abs(),
                        mean.abs()
                    ),
                );
            }
            if beyond {
                let why = match past {
                    Some(_) => format!("more than its own past explains{}", past_words(past)),
                    None => format!(
                        "more than chance explains (mean error {:.1} standard errors from zero)",
                        mean.abs() / (sd / k.sqrt())
                    ),
                };
                say(
                    AlertKind::Bias,
                    format!(
                        "over the holdout the forecast was {} by {:.1} per period on average, \
                         {why}",
                        if mean > 0.0 { "high" } else { "low" },
                        mean.abs(),
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
