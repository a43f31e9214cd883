//! Season length: which candidate to test, the seasonality test, and a verdict that carries its
//! evidence and a plain-words reason.
//!
//! Kept apart from: the autocorrelation arithmetic ([`super::acf`]), the decomposition
//! ([`crate::methods::decompose`], whose detrending and position means the strength reads) and
//! from any method that uses a season (methods receive the accepted length from the caller).
//!
//! The test is the one of the M4 competition's benchmark code (Makridakis, Spiliotis &
//! Assimakopoulos, "The M4 Competition: 100,000 time series and 61 forecasting methods",
//! International Journal of Forecasting 36(1), 2020, 54-74; the R function `SeasonalityTest` in
//! "Benchmarks and Evaluation.R" of the Mcompetitions/M4-methods repository, 2018). A lag m is
//! seasonal when
//!
//! ```text
//!   |r_m| > 1.645 * sqrt( (1 + 2 * sum_{k=1}^{m-1} r_k^2) / n )
//! ```
//!
//! i.e. r_m lies outside the 90 % band of Bartlett's large-lag variance for an MA(m-1) process.
//! The M4 code also refuses to test series shorter than three seasons; here the rule is at least
//! two full seasons (n >= 2m), the least that lets a method estimate each season position twice.
//!
//! A calendar season that fails the test is still accepted when its seasonal strength is at
//! least [`STRONG_SEASON`] (the measure of Wang, Smith & Hyndman, "Characteristic-based
//! clustering for time series data", Data Mining and Knowledge Discovery 13, 2006; the cut-off
//! 0.64 is the one Hyndman & Athanasopoulos, "Forecasting: Principles and Practice", 3rd ed.,
//! section 9.1, give for taking a seasonal difference):
//!
//! ```text
//!   F_S = max(0, 1 − Var(R) / Var(S + R))
//! ```
//!
//! with S the seasonal part and R the remainder of an additive classical decomposition (the
//! textbook decomposes by STL; our approximation), over the periods where the centred moving
//! average exists. Why both: the autocorrelation test's threshold grows with r_1..r_{m−1}, so a
//! trending series (large r_1) with a clear season fails it; the strength is measured after the
//! trend is taken out. Only the calendar's season gets this second chance: a lag found as the
//! autocorrelation's peak was already picked for looking seasonal. And only with at least
//! [`STRENGTH_NEEDS_SEASONS`] full seasons: the position means of a classical decomposition
//! take up about (m − 1)/(N − 1) of pure noise's variance (N detrended values), so on two or
//! three years noise alone scores 0.5 to 1 (the plan tries such seasons in its backtest
//! instead, [`crate::plan::TRIAL_BELOW_SEASONS`]); with four, about 0.3. Measured on the M3 data
//! (README, Benchmarks): sMAPE quarterly 9.01 -> 8.95, monthly 13.45 -> 13.43, MSIS lower.

use super::acf::autocorrelation;
use crate::calendar::Frequency;
use crate::methods::decompose::{self, Kind};

/// Critical value of the seasonality test (the standard normal 95 % quantile, as in M4).
pub const SEASON_TEST_CRITICAL_VALUE: f64 = 1.645;
/// Full seasons the data must hold before a season is accepted automatically.
pub const MIN_FULL_SEASONS: usize = 2;
/// Seasonal strength at or above which a calendar season is accepted though the
/// autocorrelation test turned it down (module doc).
pub const STRONG_SEASON: f64 = 0.64;
/// Full seasons the seasonal strength needs before it may accept a season (module doc).
pub const STRENGTH_NEEDS_SEASONS: usize = 4;
/// Autocorrelation lags shown when there is no candidate to centre the evidence on.
const LAGS_SHOWN_WITHOUT_CANDIDATE: usize = 24;

/// Where the season-length candidate came from.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum SeasonSource {
    /// The frequency's natural season ([`Frequency::natural_season`]).
    Calendar,
    /// The highest positive local peak of the autocorrelation (frequency gives none).
    Autocorrelation,
    /// The user chose the season length; their choice is the verdict.
    User,
    /// Neither the calendar nor the autocorrelation offered a lag to test.
    NoCandidate,
}

impl SeasonSource {
    /// "calendar", "autocorrelation", "user" or "none".
    pub fn as_str(self) -> &'static str {
        match self {
            SeasonSource::Calendar => "calendar",
            SeasonSource::Autocorrelation => "autocorrelation",
            SeasonSource::User => "user",
            SeasonSource::NoCandidate => "none",
        }
    }
}

/// The season-length verdict and its evidence.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct SeasonVerdict {
    /// Accepted season length (>= 2), or `None`.
    pub length: Option<usize>,
    /// The lag the evidence below is about. With a user choice of 1 ("no season") this is the
    /// lag the automatic rule would have tested, so the user sees what they overrode.
    pub candidate: Option<usize>,
    /// Where the candidate came from.
    pub source: SeasonSource,
    /// Sample autocorrelations r_1..r_L, L = min(n - 1, max(m, 2m)) around a candidate m, or
    /// min(n - 1, 24) without one.
    pub autocorrelation: Vec<f64>,
    /// |r_m| at the candidate lag (0 when the test could not run).
    pub statistic: f64,
    /// 1.645 sqrt((1 + 2 sum_{k<m} r_k^2)/n) (0 when the test could not run).
    pub threshold: f64,
    /// Whole seasons in the data, floor(n / m) (0 without a candidate).
    pub full_seasons: usize,
    /// Whether |r_m| exceeded the threshold; `None` when the test could not run (no candidate,
    /// m >= n, or values that are not finite).
    pub test_passed: Option<bool>,
    /// Seasonal strength F_S of the candidate where it may decide (module doc: the calendar's
    /// season, at least [`STRENGTH_NEEDS_SEASONS`] full seasons); `None` elsewhere.
    pub strength: Option<f64>,
    /// One sentence that explains the verdict.
    pub reason: String,
}

/// The seasonality test at one lag.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct SeasonTest {
    /// r_m itself (signed).
    pub autocorrelation: f64,
    /// |r_m|.
    pub statistic: f64,
    /// 1.645 sqrt((1 + 2 sum_{k=1}^{m-1} r_k^2) / n).
    pub threshold: f64,
    /// statistic > threshold.
    pub passed: bool,
}

/// Runs the seasonality test at lag `m` on autocorrelations `acf` (r_1 first) of `n` values.
/// `None` when m < 2, or `acf` does not reach lag m, or r_m is not finite.
pub fn season_test(acf: &[f64], n: usize, m: usize) -> Option<SeasonTest> {
    if m < 2 || acf.len() < m || n == 0 {
        return None;
    }
    let r_m = acf[m - 1];
    let sum_squares: f64 = acf[..m - 1].iter().map(|r| r * r).sum();
    let threshold = SEASON_TEST_CRITICAL_VALUE * ((1.0 + 2.0 * sum_squares) / n as f64).sqrt();
    if !r_m.is_finite() || !threshold.is_finite() {
        return None;
    }
    Some(SeasonTest {
        autocorrelation: r_m,
        statistic: r_m.abs(),
        threshold,
        passed: r_m.abs() > threshold,
    })
}

/// The lag k in 2..=n/3 with the highest r_k among positive local maxima
/// (r_{k-1} < r_k >= r_{k+1}, r_k > 0); the smallest such k on a tie. `acf` must reach lag
/// n/3 + 1. The n/3 bound leaves three cycles of the candidate in the data, so a peak is not one
/// coincidence; a trend alone gives a decaying ACF with no interior peak, hence no candidate.
pub fn autocorrelation_peak(acf: &[f64], n: usize) -> Option<usize> {
    let last = n / 3;
    let mut best: Option<(usize, f64)> = None;
    for k in 2..=last {
        let (Some(&before), Some(&here), Some(&after)) =
            (acf.get(k - 2), acf.get(k - 1), acf.get(k))
        else {
            break;
        };
        let is_peak = here > 0.0 && here > before && here >= after;
        if is_peak && best.is_none_or(|(_, top)| here > top) {
            best = Some((k, here));
        }
    }
    best.map(|(k, _)| k)
}

/// Decides the season length of `values` observed at `frequency`.
///
/// The candidate is the calendar's natural season, or, when the calendar has none, the
/// autocorrelation peak ([`autocorrelation_peak`]). It is accepted when [`season_test`] passes
/// and the data hold at least [`MIN_FULL_SEASONS`] full seasons. `user` always wins: `Some(m)`
/// with m >= 2 sets the length to m, `Some(0)` or `Some(1)` means "no season"; either way the
/// evidence is still computed and shown.
///
/// Cost: O(n L) for L autocorrelation lags; L is about 2m with a calendar, but n/3 for an
/// undated series (the peak search), so O(n^2 / 3) there.
pub fn detect_season(values: &[f64], frequency: Frequency, user: Option<usize>) -> SeasonVerdict {
    let n = values.len();
    if values.iter().any(|v| !v.is_finite()) {
        return verdict_without_evidence(
            user,
            n,
            "values include a number that is not finite, so no autocorrelation can be computed",
        );
    }
    let calendar = frequency.natural_season();
    let user_season = user.filter(|m| *m >= 2);
    let search_reach = if calendar.is_none() { n / 3 + 1 } else { 0 };
    let tested_reach = user_season.or(calendar).map_or(0, |m| 2 * m);
    let acf = autocorrelation(
        values,
        search_reach
            .max(tested_reach)
            .max(LAGS_SHOWN_WITHOUT_CANDIDATE),
    );

    let (automatic, automatic_source) = match calendar {
        Some(m) => (Some(m), SeasonSource::Calendar),
        None => match autocorrelation_peak(&acf, n) {
            Some(k) => (Some(k), SeasonSource::Autocorrelation),
            None => (None, SeasonSource::NoCandidate),
        },
    };
    let candidate = if user.is_some() {
        user_season.or(automatic)
    } else {
        automatic
    };
    let test = candidate.and_then(|m| season_test(&acf, n, m));
    let full_seasons = candidate.map_or(0, |m| n / m);
    // The strength speaks only for the calendar's season, with enough seasons (module doc).
    let strength = candidate
        .filter(|_| calendar.is_some() && candidate == calendar)
        .filter(|_| full_seasons >= STRENGTH_NEEDS_SEASONS)
        .and_then(|m| seasonal_strength(values, m));
    let strong = strength.is_some_and(|f| f >= STRONG_SEASON);
    let data_accepts =
        (test.is_some_and(|t| t.passed) || strong) && full_seasons >= MIN_FULL_SEASONS;

    // Lags 1..=2m around a candidate (2m >= m, so lag m itself is always shown when it exists).
    let shown = candidate.map_or(LAGS_SHOWN_WITHOUT_CANDIDATE, |m| 2 * m);
    let evidence =
        candidate.map(|m| (m, describe_evidence(m, test.as_ref(), strength, full_seasons, n)));
    let (length, source, reason) = match (user, evidence) {
        (Some(_), evidence) => {
            let reason = match (user_season, evidence) {
                (Some(m), Some((_, e))) => format!(
                    "{m}-period season set by you; the data alone would {}: {e}",
                    if data_accepts { "accept it" } else { "not" }
                ),
                (None, Some((m, e))) => format!(
                    "no season, as you chose; the data alone would {} a {m}-period season: {e}",
                    if data_accepts { "accept" } else { "reject" },
                ),
                (_, None) => format!(
                    "no season, as you chose; {}",
                    no_candidate_reason(n).trim_start_matches("no season: ")
                ),
            };
            (user_season, SeasonSource::User, reason)
        }
        (None, Some((m, e))) => {
            let verb = if data_accepts { "accepted" } else { "rejected" };
            let origin = if automatic_source == SeasonSource::Autocorrelation {
                " at the autocorrelation peak"
            } else {
                ""
            };
            let length = data_accepts.then_some(m);
            (
                length,
                automatic_source,
                format!("{m}-period season{origin} {verb}: {e}"),
            )
        }
        (None, None) => (None, SeasonSource::NoCandidate, no_candidate_reason(n)),
    };

    let mut shown_acf = acf;
    shown_acf.truncate(shown);
    SeasonVerdict {
        length,
        candidate,
        source,
        autocorrelation: shown_acf,
        statistic: test.map_or(0.0, |t| t.statistic),
        threshold: test.map_or(0.0, |t| t.threshold),
        full_seasons,
        test_passed: test.map(|t| t.passed),
        strength,
        reason,
    }
}

/// The part of the reason that states the test's numbers, e.g. "autocorrelation at lag 12 is
/// 0.74, above the 0.41 threshold, with 5 full seasons". `strength` is given where it may
/// decide (the calendar's season).
fn describe_evidence(
    m: usize,
    test: Option<&SeasonTest>,
    strength: Option<f64>,
    full: usize,
    n: usize,
) -> String {
    let Some(test) = test else {
        return format!("a {m}-period season cannot be tested on {n} values");
    };
    let value = if test.autocorrelation < 0.0 {
        format!("{:.2} (size {:.2})", test.autocorrelation, test.statistic)
    } else {
        format!("{:.2}", test.autocorrelation)
    };
    let seasons = plural(full, "full season", "full seasons");
    if !test.passed {
        let below = format!(
            "autocorrelation at lag {m} is {value}, not above the {:.2} threshold",
            test.threshold
        );
        match strength {
            Some(f) if f >= STRONG_SEASON => format!(
                "{below}, but the seasonal strength is {f:.2}, at least {STRONG_SEASON:.2}, \
                 with {seasons}"
            ),
            Some(f) => format!("{below}, and the seasonal strength is {f:.2}, below {STRONG_SEASON:.2}"),
            None => below,
        }
    } else if full < MIN_FULL_SEASONS {
        format!(
            "autocorrelation at lag {m} is {value}, above the {:.2} threshold, but only {seasons} \
             where {MIN_FULL_SEASONS} are needed",
            test.threshold
        )
    } else {
        format!(
            "autocorrelation at lag {m} is {value}, above the {:.2} threshold, with {seasons}",
            test.threshold
        )
    }
}

fn no_candidate_reason(n: usize) -> String {
    if n / 3 < 2 {
        format!(
            "no season: the calendar suggests none, and {} too few to look for one in the \
             autocorrelation",
            plural(n, "value is", "values are")
        )
    } else {
        format!(
            "no season: the calendar suggests none, and the autocorrelation has no positive peak \
             between lags 2 and {}",
            n / 3
        )
    }
}

/// A verdict with no numbers: only a user's choice can set a length.
fn verdict_without_evidence(user: Option<usize>, n: usize, why: &str) -> SeasonVerdict {
    let length = user.filter(|m| *m >= 2);
    let reason = match (user, length) {
        (Some(_), Some(m)) => format!("{m}-period season set by you; {why}"),
        (Some(_), None) => format!("no season, as you chose; {why}"),
        (None, _) => format!("no season: {why}"),
    };
    SeasonVerdict {
        length,
        candidate: length,
        source: if user.is_some() {
            SeasonSource::User
        } else {
            SeasonSource::NoCandidate
        },
        autocorrelation: Vec::new(),
        statistic: 0.0,
        threshold: 0.0,
        full_seasons: length.map_or(0, |m| n / m),
        test_passed: None,
        strength: None,
        reason,
    }
}

/// Seasonal strength F_S of `values` at season length `m` (module doc), from an additive
/// classical decomposition; `None` with fewer than two full seasons or no variation left once
/// the trend is out.
pub fn seasonal_strength(values: &[f64], m: usize) -> Option<f64> {
    if m < 2 || values.len() < 2 * m {
        return None;
    }
    let detrended = decompose::detrended(values, m, Kind::Additive);
    let (raw, _) = decompose::position_means(&detrended, m);
    let mean = raw.iter().sum::<f64>() / m as f64;
    let (seasonal_and_remainder, remainder): (Vec<f64>, Vec<f64>) = detrended
        .iter()
        .enumerate()
        .filter_map(|(t, d)| d.map(|d| (d, d - (raw[t % m] - mean))))
        .unzip();
    let variance = |a: &[f64]| {
        let mu = a.iter().sum::<f64>() / a.len() as f64;
        a.iter().map(|v| (v - mu).powi(2)).sum::<f64>() / a.len() as f64
    };
    let total = variance(&seasonal_and_remainder);
    (total > 0.0 && total.is_finite())
        .then(|| (1.0 - variance(&remainder) / total).max(0.0))
}

/// "1 full season", "5 full seasons".
fn plural(count: usize, one: &str, many: &str) -> String {
    if count == 1 {
        format!("{count} {one}")
    } else {
        format!("{count} {many}")
    }
}
