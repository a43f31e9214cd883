//! Alerts: why an item needs a planner's attention, each with its reason in words, read off the
//! item's plan. The Item board lists them and filters by them; the command line's `stock` JSON
//! carries them.
//!
//! Kept apart from: planning (the plan is taken as made) and showing (the front ends word
//! nothing themselves). The cut-offs are here, each with its source or marked as our choice.

mod outliers;

pub use outliers::{
    outlier_cut, outliers, spread_power, FarPeriod, Outliers, LEVEL_RATIO_FOR_POWER,
    LOG_MEDIAN_SPREAD_SD, OUTLIER_Z, POWER_ROUNDS, POWER_TEST_Z, SIZE_FLOOR,
};

use crate::calendar::Frequency;
use crate::plan::ItemPlan;
use crate::series::Series;
use crate::sorting;

/// What an alert is about (for filtering; the reason says the rest).
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash, PartialOrd, Ord)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum AlertKind {
    /// The forecast, updated each period, ran high or low over the latest periods more than
    /// chance explains ([`lean`]).
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
    pub const ALL: [AlertKind; 7] = [
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

/// The windows of latest periods the Bias alert reads the one-step errors over (our choice: a
/// quarter, a half and a whole year of months; the same counts of weeks or days catch a change
/// within a few weeks or days).
pub const BIAS_WINDOWS: [usize; 3] = [3, 6, 12];

/// One-step errors that must come before a window for it to be read (our choice).
pub const ERRORS_BEFORE: usize = 12;

/// The usual size of an error is taken from at most this many one-step errors just before a
/// window (our choice: two years of months). Recent, so that months a shop was shut, or noise
/// that grew with the level, long ago do not set it (a review measured a shut half-year hiding
/// a 30 % jump on 58 of 60 items when the whole history set it).
pub const SCALE_ERRORS: usize = 24;

/// The usual error is at least this share of the mean demand over the errors that set it (our
/// choice), so that on a nearly constant history a change of one unit is no lean.
pub const SCALE_FLOOR: f64 = 0.02;

/// Errors beyond this many usual errors (sigma) count only up to it in the test (our choice):
/// one unusual period alone does not make a lean. Still, a month tripled beside two ordinary
/// ones of the same sign can pass (it may be the first of a new level; the reason then says
/// that one period carries most of it). At 2 sigma that took a jump of 30 % kept over the
/// last three months from 95 to 76 of 100 found. The limits are simulated with this clip.
pub const CLIP_SIGMAS: f64 = 3.0;

/// The limit c(n) of the Bias rule ([`lean`]) for a history of n one-step errors, n = 15 (the
/// first window readable) to 36 (from there every window's sigma rests on [`SCALE_ERRORS`]
/// errors, and c stays): the value some window passes in 5 % of histories of independent
/// normal errors, by simulation of 1,000,000 histories for each n (`scripts/bias_limits.py`,
/// numpy 2.4.6). Above the normal quantile 1.96 because the windows overlap, the largest is
/// read and sigma is estimated from 12 to 24 errors; it steps up where a window joins (n = 18,
/// 24).
pub const BIAS_LIMITS: [f64; 22] = [
    2.23, 2.24, 2.20, 2.53, 2.51, 2.49, 2.48, 2.46, 2.45, 2.67, 2.66, 2.63, 2.63, 2.60, 2.60, 2.59,
    2.58, 2.58, 2.58, 2.57, 2.58, 2.56,
];

/// [`BIAS_LIMITS`] for `n` errors (the last entry from 36 on); `None` below 15.
pub fn bias_limit(n: usize) -> Option<f64> {
    let first = BIAS_WINDOWS[0] + ERRORS_BEFORE;
    let i = n.checked_sub(first)?.min(BIAS_LIMITS.len() - 1);
    Some(BIAS_LIMITS[i])
}

/// The median of `values`; `None` when empty.
fn median(mut values: Vec<f64>) -> Option<f64> {
    sorting::sort_by(&mut values, f64::total_cmp);
    crate::bands::quantile_sorted(&values, 0.5)
}

/// sigma / median |e| for normal errors with mean 0: 1 / z(0.75) = 1.4826.
const SIGMA_PER_MEDIAN_ABS: f64 = 1.482_602_218_505_602;

/// How the forecast, updated each period, leaned over a window of latest periods.
#[derive(Clone, Debug, PartialEq)]
pub struct Lean {
    /// The window: the last `periods` periods.
    pub periods: usize,
    /// Their one-step errors' sum (forecast minus demand): the bias over the window.
    pub sum: f64,
    /// The tracking signal over the window, the sum over the mean absolute one-step error
    /// before it (the trade's MAD); `None` where those errors are nearly all 0 (sigma set by
    /// [`SCALE_FLOOR`]).
    pub tracking_signal: Option<f64>,
    /// Its limit for this window, in the same units.
    pub limit: Option<f64>,
    /// Where one period's error is more than half the sum, that period, counted from the end
    /// (1 the last): the lean may be a one-off there.
    pub mostly_from: Option<usize>,
}

/// The window of latest periods over which the plan's one-step-ahead forecasts (its fit, each
/// forecast made with the demand up to the period before) leaned most, when that lean is more
/// than chance explains. The trade reads a tracking signal off forecasts updated each period;
/// the holdout's forecasts all come from one origin and share its error, so a fixed limit
/// there is passed by most steady items (README, Alerts). `None` when no window passes or
/// none can be read. The rule, for each window k of [`BIAS_WINDOWS`] with at least
/// [`ERRORS_BEFORE`] errors before it:
///
/// - sigma = max(1.4826 median |e|, [`SCALE_FLOOR`] mean |demand|) over the up to
///   [`SCALE_ERRORS`] errors just before the window (robust: the median of |e|);
/// - S = sum of the window's errors / (sigma sqrt(k)), and S' the same with each error
///   clipped to +-[`CLIP_SIGMAS`] sigma; for independent normal errors S is about standard
///   normal;
/// - the window passes when S and S' have the same sign and both pass c = [`bias_limit`]
///   of the number of errors. The largest S' decides.
///
/// The tracking signal reported is the trade's, sum / MAD of the errors before, and its limit
/// c sqrt(k) sigma / MAD (for normal errors MAD = sigma sqrt(2 / pi), so c sqrt(k) 1.2533).
pub fn lean(plan: &ItemPlan) -> Option<Lean> {
    lean_over(plan, &BIAS_WINDOWS, bias_limit)
}

/// [`lean`] over other windows, with the limit `limit(n)` for n errors: for the alert
/// laboratory's comparisons.
pub fn lean_over(
    plan: &ItemPlan,
    windows: &[usize],
    limit: impl Fn(usize) -> Option<f64>,
) -> Option<Lean> {
    let (errors, demand): (Vec<f64>, Vec<f64>) = plan
        .fitted
        .iter()
        .zip(&plan.history)
        .filter_map(|(f, d)| f.map(|f| (f - d, *d)))
        .unzip();
    let n = errors.len();
    let readable: Vec<usize> = windows
        .iter()
        .copied()
        .filter(|k| *k > 0 && n >= k + ERRORS_BEFORE)
        .collect();
    readable.first()?;
    let c = limit(n)?;
    let mut best: Option<(f64, Lean)> = None;
    for k in readable {
        let from = (n - k).saturating_sub(SCALE_ERRORS);
        let before = &errors[from..n - k];
        let Some(median_abs) = median(before.iter().map(|e| e.abs()).collect()) else {
            continue;
        };
        let mean = |v: &[f64]| v.iter().map(|x| x.abs()).sum::<f64>() / v.len() as f64;
        let spread = SIGMA_PER_MEDIAN_ABS * median_abs;
        let floor = SCALE_FLOOR * mean(&demand[from..n - k]);
        let sigma = spread.max(floor);
        if !sigma.is_finite() || sigma <= 0.0 {
            continue;
        }
        let window = &errors[n - k..];
        let root = (k as f64).sqrt();
        let sum: f64 = window.iter().sum();
        let clipped: f64 = window
            .iter()
            .map(|e| e.clamp(-CLIP_SIGMAS * sigma, CLIP_SIGMAS * sigma))
            .sum();
        let (plain, robust) = (sum / (sigma * root), clipped / (sigma * root));
        let passes = plain.abs() > c && robust.abs() > c && plain.signum() == robust.signum();
        if passes && best.as_ref().is_none_or(|(score, _)| robust.abs() > *score) {
            // Where the floor set sigma, the errors before were nearly 0 and a tracking signal
            // over their MAD would run to the hundreds: none is given.
            let mad = mean(before);
            let trade = (mad > 0.0 && spread >= floor).then_some(mad);
            best = Some((
                robust.abs(),
                Lean {
                    periods: k,
                    sum,
                    tracking_signal: trade.map(|m| sum / m),
                    limit: trade.map(|m| c * root * sigma / m),
                    mostly_from: window
                        .iter()
                        .rev()
                        .position(|e| e.signum() == sum.signum() && e.abs() > 0.5 * sum.abs())
                        .map(|i| i + 1),
                },
            ));
        }
    }
    best.map(|(_, lean)| lean)
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

/// Every alert of a plan made from `series`, in the order of [`AlertKind`].
pub fn alerts(plan: &ItemPlan, series: &Series) -> Vec<Alert> {
    let frequency = series.frequency();
    let mut out = Vec::new();
    let mut say = |kind, reason: String| out.push(Alert { kind, reason });
    let sparse = plan.demand.class.is_sparse();
    // Not for sparse demand: its errors are mostly the zeros' and the demands' sizes, far from
    // normal (its own alert says so).
    if let Some(lean) = lean(plan).filter(|_| !sparse) {
        let (one, many) = frequency.period_words();
        let single = match lean.mostly_from {
            Some(1) => format!("; most of it is the last {one} alone: it may be a one-off"),
            Some(j) => format!(
                "; most of it is one {one}, {} before the last: it may be a one-off",
                j - 1
            ),
            None => String::new(),
        };
        let signal = match (lean.tracking_signal, lean.limit) {
            (Some(ts), Some(limit)) => format!(
                ": their tracking signal {ts:.1} against a limit of ±{limit:.1} for {} {many} (on \
                 steady demand one of the limits read is passed about 1 time in 20)",
                lean.periods
            ),
            _ => String::new(),
        };
        say(
            AlertKind::Bias,
            format!(
                "over the last {} {many} the forecasts, each made one {one} ahead, were {} \
                 demand by {:.1} a {one} on average, more than chance explains{signal}{single}",
                lean.periods,
                if lean.sum > 0.0 { "above" } else { "below" },
                (lean.sum / lean.periods as f64).abs(),
            ),
        );
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
    if sparse {
        say(AlertKind::SparseDemand, plan.demand.reason.clone());
    }
    // The whole run without demand at the end, not only the periods that make it an alert:
    // "the last 3" of ten quiet months understated it. An item whose demand comes every few
    // periods is not quiet until the run outlasts every quiet run before it (one selling every
    // fourth month was called possibly discontinued after its usual three quiet months).
    let quiet = quiet_periods(frequency);
    let run = plan.history.iter().rev().take_while(|v| **v == 0.0).count();
    let before = &plan.history[..n - run];
    // From its first demand on: the periods before it were not quiet, only not yet selling.
    let selling = &before[before
        .iter()
        .position(|v| *v != 0.0)
        .unwrap_or(before.len())..];
    let longest_before = selling
        .split(|v| *v != 0.0)
        .map(<[f64]>::len)
        .max()
        .unwrap_or(0);
    if run >= quiet && run > longest_before && selling.iter().any(|v| *v > 0.0) {
        let (one, many) = frequency.period_words();
        say(
            AlertKind::NoRecentDemand,
            format!(
                "no demand in the last {run} {}: possibly discontinued",
                if run == 1 { one } else { many }
            ),
        );
    }
    if let Some(found) = outliers(plan, series).filter(|o| !o.periods.is_empty()) {
        say(AlertKind::Outliers, outliers_reason(series, &found));
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

/// Runs of far periods named at most in the Outliers reason (our choice); the rest counted.
const RUNS_NAMED: usize = 4;

/// The Outliers reason: the periods by name (runs of neighbouring ones as "from to"; the
/// first [`RUNS_NAMED`] runs, then how many periods more), the largest miss with its demand and
/// forecast, the cut, how the misses were weighed, and the periods before the fit starts, which
/// are not judged themselves.
fn outliers_reason(series: &Series, found: &Outliers) -> String {
    let frequency = series.frequency();
    let (one, many) = frequency.period_words();
    let words = |count: usize| if count == 1 { one } else { many };
    // Undated positions read "period 48", so that a position is not taken for a quantity.
    let name = |index: usize| match frequency {
        Frequency::Undated => format!("period {}", series.period(index)),
        _ => series.period(index).to_string(),
    };
    let mut runs: Vec<(usize, usize, usize)> = Vec::new(); // first, last, periods
    for far in &found.periods {
        match runs.last_mut() {
            Some((_, last, count)) if *last + 1 == far.index => {
                *last = far.index;
                *count += 1;
            }
            _ => runs.push((far.index, far.index, 1)),
        }
    }
    let mut named: Vec<String> = runs
        .iter()
        .take(RUNS_NAMED)
        .map(|(first, last, _)| {
            if first == last {
                name(*first)
            } else {
                format!("{} to {}", name(*first), name(*last))
            }
        })
        .collect();
    let rest: usize = runs.iter().skip(RUNS_NAMED).map(|r| r.2).sum();
    if rest > 0 {
        named.push(format!("and {rest} more {}", words(rest)));
    }
    let count = found.periods.len();
    let largest = found
        .periods
        .iter()
        .max_by(|a, b| a.z.abs().total_cmp(&b.z.abs()))
        .map(|far| {
            let figures = format!(
                "demand {} against a forecast of {:.1}",
                figure(far.demand),
                // Rounded first, so that a forecast just below 0 reads 0.0, not -0.0.
                (far.fit * 10.0).round() / 10.0 + 0.0
            );
            if count == 1 {
                format!(", {figures}")
            } else {
                format!("; the largest, {}: {figures}", name(far.index))
            }
        })
        .unwrap_or_default();
    let weighed = if found.power > 0.0 {
        format!(
            "; larger forecasts are allowed larger misses, since this item's misses grow with \
             its forecast, as its size to the power {:.2}",
            found.power
        )
    } else {
        String::new()
    };
    let unjudged = if found.first_judged > 1 {
        format!(
            ". The first {} {} have no forecast to be judged by: a typing error there shows \
             only as misses in the {many} after it",
            found.first_judged,
            words(found.first_judged)
        )
    } else {
        String::new()
    };
    format!(
        "{count} {} the fit misses by far more than the rest: {}{largest} (modified z-score \
         above {:.1}{weighed}); check {} for one-off events or typing errors{unjudged}",
        words(count),
        named.join(", "),
        found.cut,
        if count == 1 { "it" } else { "them" },
    )
}

/// A demand as the file would have it: whole numbers bare, else to one decimal.
fn figure(value: f64) -> String {
    if value.fract() == 0.0 {
        format!("{value:.0}")
    } else {
        format!("{value:.1}")
    }
}
