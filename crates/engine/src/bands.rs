//! Bands: prediction intervals around point forecasts at a chosen level.
//!
//! Kept apart from: fitting (the analytic variances come from [`crate::methods`]) and
//! backtesting (the rolling-origin errors come from [`crate::backtest`]). This module
//! only turns spreads into low/high pairs.
//!
//! Two ways, selectable ([`BandMethod`]):
//! - the MAD rule, F ± z · 1.25 · MAD, with MAD the mean absolute one-step error of the fit
//!   (common practice; 1.25 approximates sqrt(pi/2) = 1.2533, the ratio of the standard deviation
//!   to the mean absolute deviation of normal errors). The same width at every horizon.
//! - horizon-aware: from the h-step errors of the candidate refitted at rolling origins, with
//!   a Student-t quantile for the errors they rest on ([`rolling_band`]); when the history is
//!   too short for them, F ± z · sqrt(v_h) with the analytic h-step variance v_h of Hyndman,
//!   Koehler, Ord & Snyder (2005) where the method's model has one, else the MAD rule.
//!
//! z = Φ⁻¹(1 - (1 - level)/2) from statrs. Bands of non-negative demand stop at zero.

use crate::sorting;
use std::fmt;

use statrs::distribution::{ContinuousCDF, Normal, StudentsT};

/// The MAD multiplier of the MAD rule (common practice; sqrt(pi/2) = 1.2533 rounded).
pub const MAD_TO_SIGMA: f64 = 1.25;

/// Why a band could not be set up.
#[derive(Clone, Debug, PartialEq)]
pub enum BandError {
    /// The level is outside 50 % to 99.9 %: choose a level in that range.
    LevelOutOfRange {
        /// The level asked for.
        percent: f64,
    },
}

impl fmt::Display for BandError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            BandError::LevelOutOfRange { percent } => {
                write!(f, "band level {percent} % is outside 50 % to 99.9 %: choose a level in that range")
            }
        }
    }
}

impl std::error::Error for BandError {}

/// A band level, validated to lie in 50 % ..= 99.9 %.
///
/// Crosses the worker boundary as its percent; reading it back re-checks the range.
#[derive(Clone, Copy, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
#[cfg_attr(feature = "serde", serde(try_from = "f64", into = "f64"))]
pub struct Level {
    percent: f64,
}

impl TryFrom<f64> for Level {
    type Error = BandError;
    fn try_from(percent: f64) -> Result<Level, BandError> {
        Level::new(percent)
    }
}

impl From<Level> for f64 {
    fn from(level: Level) -> f64 {
        level.percent
    }
}

impl Level {
    /// Lowest level a band may have (percent; our choice: a narrower band says little).
    pub const MIN_PERCENT: f64 = 50.0;
    /// Highest level a band may have (percent; beyond it the normal tails that set the band
    /// are far outside anything a few years of sales can check).
    pub const MAX_PERCENT: f64 = 99.9;

    /// A level of `percent` (see [`Level::MIN_PERCENT`] and [`Level::MAX_PERCENT`]).
    pub fn new(percent: f64) -> Result<Level, BandError> {
        if percent.is_finite() && (Level::MIN_PERCENT..=Level::MAX_PERCENT).contains(&percent) {
            Ok(Level { percent })
        } else {
            Err(BandError::LevelOutOfRange { percent })
        }
    }
    /// The level in percent.
    pub fn percent(self) -> f64 {
        self.percent
    }
    /// Two-sided normal quantile z = Φ⁻¹(1 - (1 - p)/2).
    pub fn z(self) -> f64 {
        standard_normal_quantile(1.0 - (1.0 - self.percent / 100.0) / 2.0)
    }
}

impl Default for Level {
    fn default() -> Self {
        Level { percent: 95.0 }
    }
}

/// Φ⁻¹(p) of the standard normal distribution (statrs).
pub fn standard_normal_quantile(p: f64) -> f64 {
    // Normal::new(0, 1) cannot fail: mean finite, standard deviation positive.
    match Normal::new(0.0, 1.0) {
        Ok(n) => n.inverse_cdf(p),
        Err(_) => f64::NAN,
    }
}

/// How bands are computed.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum BandMethod {
    /// F ± z · 1.25 · MAD.
    MadRule,
    /// Analytic h-step variances, else empirical rolling-origin quantiles.
    #[default]
    HorizonAware,
}

impl BandMethod {
    /// "mad" or "horizon".
    pub fn key(self) -> &'static str {
        match self {
            BandMethod::MadRule => "mad",
            BandMethod::HorizonAware => "horizon",
        }
    }
    /// The method named by its key (see [`BandMethod::key`]).
    pub fn from_key(key: &str) -> Option<BandMethod> {
        match key {
            "mad" => Some(BandMethod::MadRule),
            "horizon" => Some(BandMethod::HorizonAware),
            _ => None,
        }
    }
}

/// One forecast period with its band.
#[derive(Clone, Copy, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct BandPoint {
    /// The point forecast.
    pub value: f64,
    /// The band's low end.
    pub low: f64,
    /// The band's high end.
    pub high: f64,
}

/// Where the spread of each horizon came from, for the page to name.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum BandSource {
    /// The MAD rule.
    MadRule,
    /// The method's analytic h-step variance.
    Analytic,
    /// The h-step errors of rolling origins, with a Student-t quantile ([`rolling_band`]).
    RollingOrigins,
}

fn floor_at_zero(points: &mut [BandPoint], non_negative: bool) {
    if non_negative {
        for p in points {
            p.low = p.low.max(0.0);
            p.value = p.value.max(0.0);
            p.high = p.high.max(0.0);
        }
    }
}

/// The standard deviation of the error made by recording values to a step Δ: Δ/√12, the
/// spread of a uniform error on [-Δ/2, Δ/2] (Sheppard's correction for grouping, Sheppard 1898,
/// Proceedings of the London Mathematical Society 29). Δ is the coarsest decimal step (1e9, ...,
/// 10, 1, 0.1, ..., 1e-6) of which every value of the history is a whole multiple; a history
/// of zeros is taken to be recorded in whole units, and one recorded more finely than 1e-6
/// gives 0.
///
/// Why: a history that a method fits exactly (a straight line, a repeated season) leaves
/// errors of zero and so a band of zero width, a certainty the history cannot give: the next
/// demand is recorded to the same step, so it can differ from any forecast by rounding alone.
pub fn recording_sd(history: &[f64]) -> f64 {
    let finite: Vec<f64> = history.iter().copied().filter(|v| v.is_finite()).collect();
    if finite.iter().all(|v| *v == 0.0) {
        return 1.0 / 12f64.sqrt();
    }
    let is_multiple = |step: f64| {
        finite
            .iter()
            .all(|v| (v - (v / step).round() * step).abs() <= 1e-9 * v.abs())
    };
    (-6..=9)
        .rev()
        .map(|k| 10f64.powi(k))
        .find(|step| is_multiple(*step))
        .map_or(0.0, |step| step / 12f64.sqrt())
}

/// Widens each band to at least F ± z · `min_sd` (see [`recording_sd`]), keeping the band of
/// non-negative demand at or above zero.
pub fn widen_to_at_least(points: &mut [BandPoint], level: Level, min_sd: f64, non_negative: bool) {
    let half = level.z() * min_sd;
    for p in points.iter_mut() {
        p.low = p.low.min(p.value - half);
        p.high = p.high.max(p.value + half);
    }
    floor_at_zero(points, non_negative);
}

/// MAD rule: F ± z · 1.25 · MAD at every horizon, i.e. an analytic band whose variance is
/// (1.25 · MAD)² at every step.
pub fn mad_band(forecast: &[f64], mad: f64, level: Level, non_negative: bool) -> Vec<BandPoint> {
    let variance = vec![(MAD_TO_SIGMA * mad).powi(2); forecast.len()];
    analytic_band(forecast, &variance, level, non_negative)
}

/// Analytic band: F ± z · sqrt(v_h).
pub fn analytic_band(
    forecast: &[f64],
    variance: &[f64],
    level: Level,
    non_negative: bool,
) -> Vec<BandPoint> {
    let z = level.z();
    let mut points: Vec<BandPoint> = forecast
        .iter()
        .zip(variance)
        .map(|(&f, &v)| {
            let half = z * v.max(0.0).sqrt();
            BandPoint {
                value: f,
                low: f - half,
                high: f + half,
            }
        })
        .collect();
    floor_at_zero(&mut points, non_negative);
    points
}

/// Quantile of sorted data with linear interpolation between order statistics (Hyndman & Fan
/// 1996, definition 7).
pub fn quantile_sorted(sorted: &[f64], p: f64) -> Option<f64> {
    if sorted.is_empty() {
        return None;
    }
    let h = (sorted.len() - 1) as f64 * p.clamp(0.0, 1.0);
    let lo = h.floor() as usize;
    let hi = h.ceil() as usize;
    Some(sorted[lo] + (h - lo as f64) * (sorted[hi] - sorted[lo]))
}

/// sqrt((1/k) sum e^2): the spread of forecast errors about zero, bias included (the band's
/// per-horizon scale and the Stock plan's spread over a protection interval). 0 for no errors.
pub fn root_mean_square(errors: &[f64]) -> f64 {
    if errors.is_empty() {
        return 0.0;
    }
    (errors.iter().map(|e| e * e).sum::<f64>() / errors.len() as f64).sqrt()
}

/// Errors a band needs beyond its quantile, (k + 1)(1 − p), before it takes the errors' own
/// quantile rather than a scale times a t quantile ([`rolling_band`]). Our choice, measured on
/// the M3 data (README, Benchmarks): with 36 errors it applies up to about 86 %; at 80 % it took
/// the quarterly band from 82.2 % to 81.8 %, monthly from 83.9 % to 82.9 %, other from 86.9 % to
/// 85.6 % (MSIS at 80 % other 10.20 to 9.81, the rest within 0.06); 3 instead of 5 held 81.2 %
/// and 82.9 %.
pub const ERRORS_BEYOND_QUANTILE: f64 = 5.0;

/// The ⌈(k + 1) p⌉-th smallest of the k absolute errors, where (k + 1)(1 − p) is at least
/// [`ERRORS_BEYOND_QUANTILE`]; `None` otherwise.
fn own_quantile(errors: &[f64], level: Level) -> Option<f64> {
    let p = level.percent() / 100.0;
    let k = errors.len() as f64;
    if (k + 1.0) * (1.0 - p) < ERRORS_BEYOND_QUANTILE {
        return None;
    }
    let mut sizes: Vec<f64> = errors.iter().map(|e| e.abs()).collect();
    sorting::sort_by(&mut sizes, f64::total_cmp);
    let rank = ((k + 1.0) * p).ceil() as usize;
    sizes.get(rank.clamp(1, sizes.len()) - 1).copied()
}

/// Errors of one horizon from which the band counts their overlap from the model's
/// psi-weights alone ([`effective_count`]), trend or not. Bartlett's count is a large-sample
/// approximation that trusts the model's description of how errors carry over; with fewer
/// errors it must also agree with the errors' own growth and the history must show no trend
/// ([`Carryover`]), else the cautious count stays. 30 is our choice, measured on the M3 data
/// (README, Benchmarks): with the model's count on every horizon the yearly 95 % band held
/// 91.7 %, with it from 20 errors 94.1 %, from 30 94.3 %.
pub const ERRORS_FOR_OVERLAP: usize = 30;

/// What a band knows of how the h-step errors of neighbouring rolling origins share their
/// shocks: the candidate's psi-weights, and whether the history shows a trend.
///
/// Why the trend: a trending history's errors come largely from a misjudged slope, which
/// persists from one origin to the next beyond the shocks the model says they share; on the
/// M3 yearly data (mostly trending) counting them by the psi-weights, the model's or the
/// errors' own, held 91-92 % at 95 %, the cautious h-block count 94.3 % (README, Benchmarks).
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Carryover<'a> {
    psi: &'a [f64],
    trending: bool,
}

impl<'a> Carryover<'a> {
    /// `psi` the candidate's psi-weights (ψ_0 = 1 first, [`crate::methods::psi_weights`]);
    /// `trending` whether the history shows a trend ([`crate::patterns::mann_kendall`]).
    pub fn new(psi: &'a [f64], trending: bool) -> Carryover<'a> {
        Carryover { psi, trending }
    }
}

/// The psi-weights the errors' own growth over the horizons implies. Under an additive model
/// the h-step error variance is v_h = σ² sum_{j<h} ψ_j² (Box & Jenkins 1970, the psi-weight
/// form; Hyndman, Koehler, Ord & Snyder 2005 for exponential smoothing), so each horizon's
/// increase is one more weight squared:
///
/// ```text
///   v_h  = the nondecreasing fit ([`nondecreasing`]), weighted by k_h, to the h-step
///          mean squared errors (1/k_h) sum e², over the horizons from 1 with two errors or more
///   ψ_0  = 1,   ψ_j = sqrt((v_{j+1} − v_j) / v_1)
/// ```
///
/// The weights' signs are not identified; all are taken positive, which counts the most
/// shared. Empty when the first horizon has fewer than two errors or v_1 is 0.
pub fn psi_from_growth(errors_by_horizon: &[Vec<f64>]) -> Vec<f64> {
    let squares: Vec<(f64, f64)> = errors_by_horizon
        .iter()
        .take_while(|e| e.len() >= 2)
        .map(|e| (root_mean_square(e).powi(2), e.len() as f64))
        .filter(|(v, _)| !v.is_nan())
        .collect();
    let v = nondecreasing(&squares);
    match v.first() {
        Some(&v1) if v1 > 0.0 && v1.is_finite() => std::iter::once(1.0)
            .chain(v.windows(2).map(|w| ((w[1] - w[0]) / v1).max(0.0).sqrt()))
            .collect(),
        _ => Vec::new(),
    }
}

/// The independent errors among `k` h-step errors of consecutive origins, before the floor
/// at 1 ([`rolling_band`]'s df):
///
/// ```text
///   k >= ERRORS_FOR_OVERLAP, weights known    n = Bartlett's count from the model's weights
///   fewer, weights known, no trend            n = max(k / h, min(n_model, n_growth))
///   otherwise                                 n = k / h   (the cautious h-block count)
/// ```
///
/// with n_growth Bartlett's count from [`psi_from_growth`]: the model's word alone is not
/// taken on few errors, but where both it and the errors' own growth say little carries
/// over, k / h (which falls below one error at horizons past k) undercounts. On the M3 data
/// cut to their last 24 months it took the 95 % band from 98.6 % to 97.5 %, MSIS 25.9 to 21.6,
/// the whole histories moving by 0.4 points at most (README, Benchmarks).
fn independent_errors(k: usize, h: usize, carry: Option<Carryover>, grown: &[f64]) -> f64 {
    let (count, cautious) = (k as f64, k as f64 / h as f64);
    match carry {
        Some(c) if k >= ERRORS_FOR_OVERLAP => effective_count(count, c.psi, h),
        Some(c) if !c.trending && !grown.is_empty() => {
            let model = effective_count(count, c.psi, h);
            cautious.max(model.min(effective_count(count, grown, h)))
        }
        _ => cautious,
    }
}

/// Bartlett's (1946) effective number of independent errors among `k` h-step errors of
/// consecutive origins, for errors made of the one-step errors after their origin with
/// psi-weights `psi` (ψ_0 = 1 first):
///
/// ```text
///   rho_s = sum_{i=0}^{h-1-s} ψ_i ψ_{i+s} / sum_{i=0}^{h-1} ψ_i^2     (s = 1 .. h-1)
///   n     = k / (1 + 2 sum_{s=1}^{h-1} rho_s^2)
/// ```
///
/// rho_s is the correlation of two h-step errors whose origins are s periods apart (they
/// share the shocks of h - s periods). Random-walk weights (all 1) give about 1.5 k / h for
/// long h; weights of 0 after ψ_0 (no carry-over) give k. Steps beyond `psi` count as 0.
pub fn effective_count(k: f64, psi: &[f64], h: usize) -> f64 {
    let weight = |i: usize| psi.get(i).copied().unwrap_or(0.0);
    let total: f64 = (0..h).map(|i| weight(i).powi(2)).sum();
    if total <= 0.0 || !total.is_finite() {
        return k;
    }
    let shared: f64 = (1..h)
        .map(|s| {
            let c: f64 = (0..h - s).map(|i| weight(i) * weight(i + s)).sum();
            (c / total).powi(2)
        })
        .sum();
    k / (1.0 + 2.0 * shared)
}

/// The weighted least-squares nondecreasing fit to `values`, (value, weight) pairs in order:
/// pool adjacent violators (Ayer, Brunk, Ewing, Reid & Silverman 1955, Ann. Math. Statist. 26;
/// Barlow, Bartholomew, Bremner & Brunk 1972). Each run of values that falls is replaced by
/// its weighted mean, so no value is raised further than the data ask.
pub fn nondecreasing(values: &[(f64, f64)]) -> Vec<f64> {
    debug_assert!(
        values.iter().all(|(v, w)| !v.is_nan() && *w > 0.0),
        "values are numbers and weights positive"
    );
    // Blocks of (weighted mean, weight, values in it), merged while a block's mean lies below
    // the one before it.
    let mut blocks: Vec<(f64, f64, usize)> = Vec::with_capacity(values.len());
    for &(value, weight) in values {
        blocks.push((value, weight, 1));
        while let [.., (v1, w1, c1), (v2, w2, c2)] = blocks[..] {
            if v1 <= v2 {
                break;
            }
            blocks.truncate(blocks.len() - 2);
            blocks.push(((v1 * w1 + v2 * w2) / (w1 + w2), w1 + w2, c1 + c2));
        }
    }
    blocks
        .into_iter()
        .flat_map(|(mean, _, count)| std::iter::repeat_n(mean, count))
        .collect()
}

/// Student-t quantile t_df(p) (statrs); `df` may be fractional.
pub fn student_t_quantile(p: f64, df: f64) -> f64 {
    // StudentsT::new(0, 1, df) fails only for df <= 0 or NaN, which callers never pass; the
    // normal quantile (df infinite) is the honest limit then.
    match StudentsT::new(0.0, 1.0, df) {
        Ok(t) => t.inverse_cdf(p),
        Err(_) => standard_normal_quantile(p),
    }
}

/// Rolling-origin band: `errors_by_horizon[h-1]` holds the h-step errors e = F - D of the
/// candidate refitted at every rolling origin (see [`crate::backtest::rolling_errors`]), and
/// `carry` the candidate's psi-weights (ψ_0 = 1, ψ_1, ...: how its h-step error is made of the
/// one-step errors after the origin; [`crate::methods`]' `psi_weights`) and the history's
/// trend, when known ([`Carryover`]).
///
/// ```text
///   r_h   = sqrt( (1/k_h) sum e^2 )          the h-step error scale from its k_h errors
///   df_h  = max(1, n_h)                      the errors it rests on that are independent
///                                            ([`independent_errors`])
///   w_h   = t_{df_h}((1 + p)/2) · r_h
///   band  = F ± w*_h,  w* the nondecreasing fit to the w_h weighted by k_h ([`nondecreasing`])
/// ```
///
/// except where the errors reach past the band's own quantile often enough to measure it,
/// (k_h + 1)(1 − p) >= [`ERRORS_BEYOND_QUANTILE`]: there the half-width is the
/// ⌈(k_h + 1) p⌉-th smallest |e| (the split-conformal quantile: Vovk, Gammerman & Shafer,
/// "Algorithmic Learning in a Random World", 2005; Lei, G'Sell, Rinaldo, Tibshirani &
/// Wasserman 2018, JASA 113), which follows the errors' own shape where a scale times a t
/// quantile assumes a normal one. Errors of several series are heavier-tailed than normal, so
/// the t rule that holds at 95 % is wide at 80 % (README, Benchmarks).
///
/// Why the nondecreasing fit: an error h + 1 steps ahead holds the shocks of h steps and one
/// more, so a band never narrows with the horizon, but each w_h comes from its own errors and
/// a later one can fall below an earlier one by chance. The running maximum (the rule before)
/// kept every chance high: on the M3 data the 80 % band held 82.9 % on monthly series, with the
/// fit 81.2 % (README, Benchmarks).
///
/// Why t: a future error over a scale estimated from df squared errors is t-distributed with
/// df degrees of freedom when errors are normal (the prediction interval of a normal sample
/// with unknown variance, with a known centre: the forecast). Why n_h: h-step errors of
/// neighbouring origins share shocks, so k_h of them hold fewer independent ones. With the
/// candidate's psi-weights and at least [`ERRORS_FOR_OVERLAP`] errors, n_h is Bartlett's
/// count ([`effective_count`]); with fewer, Bartlett's too where the history shows no trend
/// and the errors' own growth agrees; otherwise the cautious h-block count k_h / h (Bartlett
/// gives about 1.5 k_h / h for errors that accumulate like a random walk, and more where the
/// model passes on less of each shock). Refitting at the origins (every
/// [`crate::backtest::REFIT_EVERY`]-th; updated between) puts the parameters' own uncertainty
/// into the errors.
///
/// On the M3 data this rule, with up to [`crate::plan::BAND_ORIGINS`] origins, held 94.1-96.8 %
/// at 95 % and 79.9-85.3 % at 80 % per subset (the h-block count and the t rule alone:
/// 94.3-97.4 % and 80.9-87.7 %, MSIS 5 % higher), where the former per-horizon RMS with
/// pooled standardised quantiles from 8 origins held 64-78 % and 52-64 % (README, Benchmarks;
/// the rules compared are in benches/band_lab.rs). A horizon with fewer than two errors borrows
/// the width of the horizon before; `None` when the first horizon has fewer than two (it has
/// the most errors of all).
pub fn rolling_band(
    forecast: &[f64],
    errors_by_horizon: &[Vec<f64>],
    carry: Option<Carryover>,
    level: Level,
    non_negative: bool,
) -> Option<Vec<BandPoint>> {
    let upper = 1.0 - (1.0 - level.percent() / 100.0) / 2.0;
    let grown = psi_from_growth(errors_by_horizon);
    // (horizon, half-width, errors it rests on) where a horizon has two errors or more.
    let mut measured: Vec<(usize, f64, f64)> = Vec::with_capacity(forecast.len());
    for h in 0..forecast.len() {
        let errors = errors_by_horizon.get(h).map(Vec::as_slice).unwrap_or(&[]);
        if errors.len() >= 2 {
            let k = errors.len() as f64;
            let df = independent_errors(errors.len(), h + 1, carry, &grown).max(1.0);
            let half = match own_quantile(errors, level) {
                Some(q) => q,
                None => student_t_quantile(upper, df) * root_mean_square(errors),
            };
            // A width that is not a number is not a measurement (the running maximum before
            // passed over it too); an infinite one stays and widens every later horizon.
            if !half.is_nan() {
                measured.push((h, half, k));
            }
        }
    }
    let pairs: Vec<(f64, f64)> = measured.iter().map(|&(_, half, k)| (half, k)).collect();
    let halves = nondecreasing(&pairs);
    let mut points = Vec::with_capacity(forecast.len());
    let mut smoothed = measured.iter().map(|m| m.0).zip(halves).peekable();
    let mut current: Option<f64> = None;
    for (h, &f) in forecast.iter().enumerate() {
        if let Some((_, half)) = smoothed.next_if(|(at, _)| *at == h) {
            current = Some(half);
        }
        let half = current?;
        points.push(BandPoint {
            value: f,
            low: f - half,
            high: f + half,
        });
    }
    floor_at_zero(&mut points, non_negative);
    Some(points)
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A history and the recording step it implies (the floor is that step / sqrt(12)).
    fn check_step(history: &[f64], step: f64) {
        let got = recording_sd(history) * 12f64.sqrt();
        assert!(
            (got - step).abs() <= 1e-12 * step.max(1.0),
            "{history:?}: {got}"
        );
    }

    // The steps are arithmetic facts of the values; the 1/sqrt(12) is Sheppard's (1898).
    #[test]
    fn recording_steps() {
        check_step(&[10.0, 20.0, 30.0], 10.0);
        check_step(&[12.0, 15.0, 7.0], 1.0);
        check_step(&[12.5, 13.0], 0.1);
        check_step(&[0.25, 0.5], 0.01);
        check_step(&[3000.0, 5000.0, 0.0], 1000.0);
        check_step(&[0.0, 0.0], 1.0);
        check_step(&[1.0 / 3.0], 0.0);
        check_step(&[-20.0, 40.0], 10.0);
    }

    #[test]
    fn a_band_is_widened_to_the_floor_and_kept_above_zero() {
        let level = Level::new(95.0).unwrap();
        let mut points = mad_band(&[10.0, 0.5], 0.0, level, true);
        assert_eq!(
            points[0].low, points[0].high,
            "zero MAD: zero width before the floor"
        );
        widen_to_at_least(&mut points, level, 1.0, true);
        let z = level.z();
        assert!(
            (points[0].high - 10.0 - z).abs() < 1e-12 && (10.0 - points[0].low - z).abs() < 1e-12
        );
        assert_eq!(points[1].low, 0.0);
        // A band already wider stays as it was.
        let mut wide = mad_band(&[10.0], 4.0, level, true);
        let before = wide.clone();
        widen_to_at_least(&mut wide, level, 1.0, true);
        assert_eq!(wide, before);
    }

    #[test]
    fn level_is_validated() {
        assert!(Level::new(49.9).is_err());
        assert!(Level::new(99.95).is_err());
        assert!(Level::new(f64::NAN).is_err());
        // scipy norm.ppf(0.975) = 1.959963984540054 (same file).
        assert!((Level::new(95.0).unwrap().z() - 1.959963984540054).abs() < 1e-9);
    }

    #[test]
    fn mad_rule_and_zero_floor() {
        let b = mad_band(&[10.0, 1.0], 2.0, Level::new(95.0).unwrap(), true);
        let half = 1.959963984540054 * 1.25 * 2.0;
        assert!((b[0].high - (10.0 + half)).abs() < 1e-9);
        assert!((b[0].low - (10.0 - half)).abs() < 1e-9);
        assert_eq!(b[1].low, 0.0);
    }

    #[test]
    fn higher_level_widens_band() {
        let v = [4.0, 5.0, 6.0];
        let narrow = analytic_band(&[10.0; 3], &v, Level::new(80.0).unwrap(), false);
        let wide = analytic_band(&[10.0; 3], &v, Level::new(99.0).unwrap(), false);
        for (n, w) in narrow.iter().zip(&wide) {
            assert!(w.high - w.low > n.high - n.low);
        }
    }

    // Arithmetic of the rule (the t quantiles themselves are checked against scipy in
    // tests/bands.rs): errors ±3 at horizon 1 (k 8, RMS 3, df 8) and ±6 at horizon 2 (k 6,
    // RMS 6, df 3).
    #[test]
    fn rolling_band_arithmetic() {
        let level = Level::new(95.0).unwrap();
        let ones = vec![3.0, -3.0, 3.0, -3.0, 3.0, -3.0, 3.0, -3.0];
        let twos = vec![6.0, -6.0, 6.0, -6.0, 6.0, -6.0];
        let b = rolling_band(
            &[100.0, 100.0, 100.0],
            &[ones, twos, vec![1.0]],
            None,
            level,
            false,
        )
        .unwrap();
        assert!((b[0].high - 100.0 - student_t_quantile(0.975, 8.0) * 3.0).abs() < 1e-9);
        assert!((b[1].high - 100.0 - student_t_quantile(0.975, 3.0) * 6.0).abs() < 1e-9);
        // One error at horizon 3: it borrows the width before.
        assert_eq!(b[2].high, b[1].high);
        assert_eq!(b[0].high - 100.0, 100.0 - b[0].low);
        // Widths never shrink with the horizon.
        let b = rolling_band(
            &[0.0, 0.0],
            &[vec![5.0, -5.0, 5.0, -5.0], vec![1.0, -1.0, 1.0, -1.0]],
            None,
            level,
            false,
        )
        .unwrap();
        // The second horizon's width falls below the first: both take their mean weighted
        // by their error counts (4 and 4), t_4(0.975) x 5 and t_2(0.975) x 1.
        let pooled = (student_t_quantile(0.975, 4.0) * 5.0 + student_t_quantile(0.975, 2.0)) / 2.0;
        assert!((b[0].high - pooled).abs() < 1e-9, "{}", b[0].high);
        assert!((b[1].high - pooled).abs() < 1e-9, "{}", b[1].high);
        // No horizon with two errors: no band from them.
        assert!(rolling_band(&[1.0], &[vec![2.0]], None, level, false).is_none());
    }

    /// `got` equals `expected` to 1e-12 at every position; `input` named on failure.
    fn assert_all_within(input: &dyn std::fmt::Debug, got: &[f64], expected: &[f64]) {
        assert_eq!(got.len(), expected.len(), "{input:?}: {got:?}");
        for (g, e) in got.iter().zip(expected) {
            assert!((g - e).abs() < 1e-12, "{input:?}: {got:?} vs {expected:?}");
        }
    }

    /// `nondecreasing(values)` equals `expected` to 1e-12.
    fn check_nondecreasing(values: &[(f64, f64)], expected: &[f64]) {
        assert_all_within(&values, &nondecreasing(values), expected);
    }

    // Pooling adjacent violators by hand: a falling run takes its weighted mean, and a pooled
    // block that falls below the one before pools again.
    #[test]
    fn nondecreasing_fits_by_hand() {
        check_nondecreasing(&[], &[]);
        check_nondecreasing(&[(1.0, 1.0), (2.0, 1.0)], &[1.0, 2.0]);
        check_nondecreasing(&[(1.0, 1.0), (3.0, 1.0), (2.0, 1.0)], &[1.0, 2.5, 2.5]);
        check_nondecreasing(&[(3.0, 1.0), (1.0, 3.0)], &[1.5, 1.5]);
        // 4 and 2 pool to 3 (weight 2); 0 (weight 2) then pools all three to 1.5.
        check_nondecreasing(&[(4.0, 1.0), (2.0, 1.0), (0.0, 2.0)], &[1.5, 1.5, 1.5]);
        check_nondecreasing(
            &[(1.0, 1.0), (5.0, 1.0), (3.0, 1.0), (6.0, 1.0)],
            &[1.0, 4.0, 4.0, 6.0],
        );
    }

    /// `effective_count(k, psi, h)` equals `expected` to 1e-12.
    fn check_count(k: f64, psi: &[f64], h: usize, expected: f64) {
        let got = effective_count(k, psi, h);
        assert!(
            (got - expected).abs() < 1e-12,
            "{psi:?} h {h}: {got} vs {expected}"
        );
    }

    // Arithmetic of Bartlett's count from its formula (doc of effective_count).
    #[test]
    fn effective_counts_by_hand() {
        // One step: nothing shared.
        check_count(36.0, &[1.0, 0.7], 1, 36.0);
        // Random walk, h 2: rho_1 = 1/2, n = k / (1 + 2/4).
        check_count(36.0, &[1.0, 1.0], 2, 24.0);
        // Random walk, h 3: rho_1 = 2/3, rho_2 = 1/3, n = k / (1 + 2 (4/9 + 1/9)) = 9k / 19.
        check_count(38.0, &[1.0, 1.0, 1.0], 3, 18.0);
        // SES weights (1, a, a): total 1 + 2a^2, rho_1 = (a + a^2)/total, rho_2 = a/total.
        let a: f64 = 0.5;
        let total = 1.0 + 2.0 * a * a;
        let shared = ((a + a * a) / total).powi(2) + (a / total).powi(2);
        check_count(30.0, &[1.0, a, a], 3, 30.0 / (1.0 + 2.0 * shared));
        // No carry-over after the first step: every error counts; missing weights count as 0.
        check_count(30.0, &[1.0], 5, 30.0);
    }

    // With enough errors the model's count replaces k / h: errors that share nothing (weights
    // 0 after the first) give df = k at horizon 2 instead of k / 2, trend or not.
    #[test]
    fn the_models_count_needs_enough_errors() {
        let level = Level::new(95.0).unwrap();
        let many: Vec<f64> = (0..ERRORS_FOR_OVERLAP)
            .map(|i| if i % 2 == 0 { 2.0 } else { -2.0 })
            .collect();
        let few = many[..ERRORS_FOR_OVERLAP - 2].to_vec();
        let psi = [1.0, 0.0];
        let k = ERRORS_FOR_OVERLAP as f64;
        let carry = Some(Carryover::new(&psi, true));
        let b = rolling_band(&[0.0, 0.0], &[many.clone(), many], carry, level, false).unwrap();
        assert!((b[1].high - student_t_quantile(0.975, k) * 2.0).abs() < 1e-9);
        let b = rolling_band(&[0.0, 0.0], &[few.clone(), few], carry, level, false).unwrap();
        let cautious = (k - 2.0) / 2.0;
        assert!((b[1].high - student_t_quantile(0.975, cautious) * 2.0).abs() < 1e-9);
    }

    /// `psi_from_growth(errors)` equals `expected` to 1e-12.
    fn check_growth(errors: &[Vec<f64>], expected: &[f64]) {
        assert_all_within(&errors, &psi_from_growth(errors), expected);
    }

    // Arithmetic of the weights implied by growth (doc of psi_from_growth).
    #[test]
    fn psi_from_growth_by_hand() {
        // Mean squares 1, 4, 4: psi_1 = sqrt((4 - 1) / 1), psi_2 = 0.
        check_growth(
            &[vec![1.0, -1.0], vec![2.0, -2.0], vec![2.0, -2.0]],
            &[1.0, 3f64.sqrt(), 0.0],
        );
        // A fall pools by weight: (4 x 4 + 1 x 2) / 6 = 3 at both horizons, nothing grows.
        check_growth(&[vec![2.0, -2.0, 2.0, -2.0], vec![1.0, -1.0]], &[1.0, 0.0]);
        // A horizon with one error ends the weights; none from a first horizon of one error
        // or of zeros.
        check_growth(&[vec![1.0, -1.0], vec![5.0]], &[1.0]);
        check_growth(&[vec![1.0]], &[]);
        check_growth(&[vec![0.0, 0.0], vec![1.0, 1.0]], &[]);
    }

    /// The 95 % band's half-width at horizon 2 from `errors` (one vector per horizon, the
    /// same count) with `carry`, against t_{df}(0.975) times the horizon's RMS.
    fn check_df(errors: &[Vec<f64>], carry: Option<Carryover>, df: f64) {
        let level = Level::new(95.0).unwrap();
        let b = rolling_band(&[0.0, 0.0], errors, carry, level, false).unwrap();
        let expected = student_t_quantile(0.975, df) * root_mean_square(&errors[1]);
        assert!(
            (b[1].high - expected).abs() < 1e-9,
            "{carry:?}: {} vs {expected} (df {df})",
            b[1].high
        );
    }

    // Ten errors at horizon 2 (fewer than ERRORS_FOR_OVERLAP): without a trend, Bartlett's
    // count from the more cautious of the model's weights and the errors' growth, never below
    // k / h = 5; with a trend or no weights, k / h.
    #[test]
    fn few_errors_count_by_both_weights_without_a_trend() {
        let flat: Vec<f64> = (0..10)
            .map(|i| if i % 2 == 0 { 2.0 } else { -2.0 })
            .collect();
        let same = [flat.clone(), flat.clone()];
        let none = [1.0, 0.0];
        let walk = [1.0, 1.0];
        check_df(&same, Some(Carryover::new(&none, true)), 5.0);
        check_df(&same, None, 5.0);
        // Both say nothing carries over: every error counts.
        check_df(&same, Some(Carryover::new(&none, false)), 10.0);
        // The model says a random walk: rho_1 = 1/2, n = 10 / (1 + 2/4).
        check_df(&same, Some(Carryover::new(&walk, false)), 10.0 / 1.5);
        // The errors double: grown weights (1, sqrt 3), rho_1 = sqrt 3 / 4, n = 10 / (1 + 6/16).
        let half: Vec<f64> = flat.iter().map(|e| e / 2.0).collect();
        check_df(
            &[half, flat],
            Some(Carryover::new(&none, false)),
            10.0 / 1.375,
        );
    }

    // With enough errors beyond it, the band is the errors' own quantile: 30 errors of sizes
    // 1 .. 30 at 80 %: (31)(0.2) = 6.2 beyond, rank ceil(31 x 0.8) = 25, half-width 25. At 95 %
    // (31)(0.05) = 1.55 is too few: the t rule.
    #[test]
    fn the_errors_own_quantile_where_enough_lie_beyond_it() {
        let errors: Vec<f64> = (1..=30)
            .map(|i| if i % 2 == 0 { i as f64 } else { -(i as f64) })
            .collect();
        let at = |percent: f64| {
            let level = Level::new(percent).unwrap();
            rolling_band(&[100.0], std::slice::from_ref(&errors), None, level, false).unwrap()[0]
        };
        let b = at(80.0);
        assert_eq!((b.low, b.high), (75.0, 125.0));
        let b = at(95.0);
        let t = student_t_quantile(0.975, 30.0) * root_mean_square(&errors);
        assert!((b.high - 100.0 - t).abs() < 1e-9);
    }
}
