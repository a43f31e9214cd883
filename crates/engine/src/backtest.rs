//! Backtest: fit each candidate on the training part, forecast the holdout, score and rank.
//!
//! Kept apart from: pattern detection and the final forecast ([`crate::plan`] decides
//! the season and refits the winner). This module owns the holdout rules, the rolling origins,
//! the ranking metric and the combination candidate.
//!
//! Evaluation (Tashman 2000, "Out-of-sample tests of forecasting accuracy", IJF 16:437-450): with
//! holdout length K and R origins, origin j (j = 0..R) trains on y_1..y_{n-K-j} and forecasts the
//! next K periods. Errors of all origins are pooled into the ranking measures; origin 0 (the last
//! K periods) is the one shown in the Error ledger. R = 1 is a single fixed holdout.
//!
//! The combination candidate averages up to [`COMBINATION_SIZE`] methods: the
//! [`COMBINATION_ANCHORS`] (the two Theta models) whenever they are candidates and could be
//! scored, the exponential smoothing model with the lowest AICc, then, with a season, the
//! best-ranked other methods (see `combination_members`). Anchoring the Theta models measured
//! better on the M3 data than the best-ranked three or four alone (README, Benchmarks): a short
//! holdout often ranks them below methods that fit its few points by chance. The AICc model's
//! holdout forecasts are those of the model the criterion picks at each origin, from the fits
//! made there anyway.

use crate::sorting;
use std::fmt;

use crate::accuracy::{self, ledger, mase_scale, LedgerRow, Measures};
use crate::methods::{self, criterion, Fitted, MethodError, MethodKind};
use crate::settings::MAX_HOLDOUT;

/// Most methods averaged by the combination candidate, with an accepted season (fewer when
/// fewer could be scored): the anchors, the exponential smoothing model with the lowest AICc
/// and the best-ranked others. Without a season the combination is the anchors and that model
/// alone when the ranking rests on few errors; otherwise the anchors and the best two others
/// (see [`combination_members`]).
pub const COMBINATION_SIZE: usize = 5;

/// Methods the combination holds whenever they are candidates and could be scored, whatever
/// their rank: the dynamic optimised Theta and the benchmark Theta. Measured on M3 (sMAPE all):
/// best 3 ranked 12.92, best 4 ranked 12.86 (with the dynamic optimised Theta a candidate), the
/// dynamic optimised Theta and the best 3 others 12.74, both Theta models and the best 2 others
/// 12.74 with the better quarterly figure (9.15 against 9.26) and the lower MSIS.
pub const COMBINATION_ANCHORS: [MethodKind; 2] =
    [MethodKind::DynamicOptimisedTheta, MethodKind::Theta];

/// The metric that orders the Backtest ranking.
///
/// Default: MASE (Hyndman & Koehler 2006). It is scale-free, so it compares across items, and it
/// stays defined when demand has zero periods, where MAPE divides by zero.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Default)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum RankBy {
    /// MAPE: lowest first (not available with zero demand, sorted last).
    Mape,
    /// RMSE: lowest first.
    Rmse,
    /// Absolute value of the bias (sum of errors): closest to zero first.
    Bias,
    #[default]
    /// MASE: lowest first (the default).
    Mase,
}

impl RankBy {
    /// "mape", "rmse", "bias" or "mase".
    pub fn key(self) -> &'static str {
        match self {
            RankBy::Mape => "mape",
            RankBy::Rmse => "rmse",
            RankBy::Bias => "bias",
            RankBy::Mase => "mase",
        }
    }
    /// The measure named by its key (see [`RankBy::key`]).
    pub fn from_key(key: &str) -> Option<RankBy> {
        match key {
            "mape" => Some(RankBy::Mape),
            "rmse" => Some(RankBy::Rmse),
            "bias" => Some(RankBy::Bias),
            "mase" => Some(RankBy::Mase),
            _ => None,
        }
    }
    /// The score to minimise; `None` when the measure is not available (sorted last).
    pub fn score(self, m: &Measures) -> Option<f64> {
        match self {
            RankBy::Mape => m.mape,
            RankBy::Rmse => Some(m.rmse),
            RankBy::Bias => Some(m.bias.abs()),
            RankBy::Mase => m.mase,
        }
    }
}

/// A candidate in the ranking: one method, or the equal-weight combination of several.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum Candidate {
    /// One method.
    Method(MethodKind),
    /// Plain mean of the members' forecasts. Equal weights: estimated weights rarely beat them
    /// out of sample (the "forecast combination puzzle", Smith & Wallis 2009, Oxford Bulletin of
    /// Economics and Statistics 71:331-355).
    Combination(Vec<MethodKind>),
}

impl Candidate {
    /// Machine name: the method key, or "combination".
    pub fn key(&self) -> &'static str {
        match self {
            Candidate::Method(k) => k.key(),
            Candidate::Combination(_) => "combination",
        }
    }
    /// The methods it forecasts with: the one method, or the combination's members.
    pub fn members(&self) -> &[MethodKind] {
        match self {
            Candidate::Method(kind) => std::slice::from_ref(kind),
            Candidate::Combination(members) => members,
        }
    }
    /// Name for people, e.g. "Combination of Theta, Damped trend, SBA".
    pub fn label(&self) -> String {
        match self {
            Candidate::Method(k) => k.label().to_string(),
            Candidate::Combination(members) => {
                let names: Vec<&str> = members.iter().map(|m| m.label()).collect();
                format!("Combination of {}", names.join(" + "))
            }
        }
    }
}

/// The combination's value at one position from its members' values there: their plain mean
/// (equal weights; see [`Candidate::Combination`]), `None` when any member has none or there
/// are no members. The one place this rule is written: the backtest's holdout forecasts, the
/// band's rolling origins and the refit on all data all combine through it.
pub(crate) fn combine_point(members: impl IntoIterator<Item = Option<f64>>) -> Option<f64> {
    let (mut sum, mut count) = (0.0, 0usize);
    for v in members {
        sum += v?;
        count += 1;
    }
    (count > 0).then(|| sum / count as f64)
}

/// Holdout errors the ranking must rest on (all origins pooled) before, without a season, its
/// best-ranked methods join the combination rather than the AICc model (chosen on the M3 data:
/// 24 took yearly sMAPE from 15.88 to 16.06, 30 and 36 scored the same; README, Benchmarks).
pub const ERRORS_TO_RANK_BY: usize = 30;

/// The combination's members from a ranking of single methods (best first), `pooled` the
/// holdout errors the ranking rests on. Always the [`COMBINATION_ANCHORS`] found there; then
/// - with an accepted season: the exponential smoothing model with the lowest AICc
///   ([`MethodKind::SmoothingByAicc`], Hyndman et al. 2002) and the best-ranked others,
///   [`COMBINATION_SIZE`] in all;
/// - without a season, on fewer than [`ERRORS_TO_RANK_BY`] errors (short histories: every
///   yearly M3 series): the AICc model alone, since so few errors rank close methods by chance;
/// - otherwise (a season only on trial, whose seasonal methods must stay free to lead; or
///   enough errors without a season; or no AICc model): the best-ranked others, one fewer in
///   all (the former rule).
///
/// Measured on the M3 data (README, Benchmarks; sMAPE yearly / quarterly / monthly / all): the
/// former rule everywhere 16.25 / 9.14 / 13.50 / 12.74; the anchors and the AICc model alone
/// everywhere 15.88 / 9.04 / 13.63 / 12.77; with the AICc model and the best others wherever a
/// season is accepted and the AICc model alone without one 15.88 / 9.03 / 13.54 / 12.71; this
/// rule 15.88 / 9.03 / 13.50 / 12.67; with 36 months of a season on trial the AICc model took
/// sMAPE from 14.48 to 14.89. Chosen on the same data it is scored on.
fn combination_members(ranking: &[Scored], seasons: Seasons, pooled: usize) -> Vec<MethodKind> {
    let ranked: Vec<MethodKind> = ranking
        .iter()
        .filter_map(|s| match s.candidate {
            Candidate::Method(kind) => Some(kind),
            Candidate::Combination(_) => None,
        })
        .collect();
    let mut members: Vec<MethodKind> = COMBINATION_ANCHORS
        .into_iter()
        .filter(|anchor| ranked.contains(anchor))
        .collect();
    let has_aicc = ranked.contains(&MethodKind::SmoothingByAicc);
    let with_aicc = has_aicc
        && match (seasons.accepted_length(), seasons.trial_length()) {
            (Some(_), _) => true,
            (None, Some(_)) => false,
            (None, None) => pooled < ERRORS_TO_RANK_BY,
        };
    if with_aicc {
        members.push(MethodKind::SmoothingByAicc);
        if seasons.longest().is_none() {
            return members;
        }
    }
    let size = if with_aicc {
        COMBINATION_SIZE
    } else {
        COMBINATION_SIZE - 1
    };
    let others = size.saturating_sub(members.len());
    // The AICc method is never one of the others: it repeats one of the smoothing models
    // ranked beside it, which would then count twice.
    let rest: Vec<MethodKind> = ranked
        .into_iter()
        .filter(|kind| !members.contains(kind) && *kind != MethodKind::SmoothingByAicc)
        .take(others)
        .collect();
    members.extend(rest);
    members
}

/// [`combine_point`] at every position of the members' forecasts. Every method forecasts the
/// whole horizon it is asked for and a combination has at least two members, so each position
/// has a value; NaN would mark a broken promise (and the accuracy measures refuse NaN).
pub(crate) fn combine_forecasts(members: &[Vec<f64>], len: usize) -> Vec<f64> {
    debug_assert!(!members.is_empty() && members.iter().all(|f| f.len() >= len));
    (0..len)
        .map(|h| combine_point(members.iter().map(|f| f.get(h).copied())).unwrap_or(f64::NAN))
        .collect()
}

/// The season length each method is fitted with.
///
/// Normally one: the accepted season, for every method (`None`: no season, and the seasonal
/// methods sit out). When the season test rejects the calendar's season on a short history
/// (its threshold is strict on few seasons), that length can be put on trial: the seasonal
/// methods are fitted with it and compete in the backtest on their holdout errors, while every
/// other method is fitted without a season, as the test decided. One rule, used by the
/// backtest, the band's origins and the refit alike.
#[derive(Clone, Copy, Debug, Default, PartialEq, Eq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Seasons {
    accepted: Option<usize>,
    trial: Option<usize>,
}

impl Seasons {
    /// Every method fitted with the accepted season (lengths below 2 mean none).
    pub fn accepted(length: Option<usize>) -> Seasons {
        Seasons {
            accepted: length.filter(|m| *m >= 2),
            trial: None,
        }
    }

    /// No accepted season; the seasonal methods alone fitted with `length` (below 2: none).
    pub fn on_trial(length: Option<usize>) -> Seasons {
        Seasons {
            accepted: None,
            trial: length.filter(|m| *m >= 2),
        }
    }

    /// The accepted season length.
    pub fn accepted_length(self) -> Option<usize> {
        self.accepted
    }

    /// The length on trial, when there is one.
    pub fn trial_length(self) -> Option<usize> {
        self.trial
    }

    /// The season length `kind` is fitted with.
    pub fn for_method(self, kind: MethodKind) -> Option<usize> {
        if kind.needs_season() {
            self.accepted.or(self.trial)
        } else {
            self.accepted
        }
    }

    /// The longest season any method is fitted with (training parts keep two of them).
    pub fn longest(self) -> Option<usize> {
        self.accepted.or(self.trial)
    }

    /// The training a rolling origin must keep for every member of `candidate` to fit with its
    /// season: one season for the seasonal naive method (it repeats the last one), two for the
    /// rest (classical indices and the Holt-Winters start each take two); `None` without a
    /// season. Where the seasonal naive method is the only member with a season (a season on
    /// trial beside the Theta models fitted without one), two seasons left the band few
    /// origins and its t quantile few errors: on the M3 series cut to 36 months the 95 % band
    /// held 97.8 % with MSIS 13.85 before, 97.7 % and 13.52 after; 12 quarters 96.1 % and
    /// 18.76, 95.9 % and 18.17 (README, Benchmarks).
    pub fn training_for(self, candidate: &Candidate) -> Option<usize> {
        candidate
            .members()
            .iter()
            .filter_map(|kind| {
                let m = self.for_method(*kind)?;
                Some(if *kind == MethodKind::SeasonalNaive {
                    m
                } else {
                    2 * m
                })
            })
            .max()
    }

    /// The longest season a member of `candidate` is fitted with.
    pub fn for_candidate(self, candidate: &Candidate) -> Option<usize> {
        candidate
            .members()
            .iter()
            .filter_map(|kind| self.for_method(*kind))
            .max()
    }
}

/// Forecasts `horizon` steps after `history` with a candidate. A combination fails when any
/// member fails.
pub fn forecast_with(
    candidate: &Candidate,
    history: &[f64],
    seasons: Seasons,
    horizon: usize,
) -> Result<Vec<f64>, MethodError> {
    let one = |kind: MethodKind| -> Result<Vec<f64>, MethodError> {
        Ok(
            methods::fit(kind, history, seasons.for_method(kind), horizon)?
                .forecast()
                .to_vec(),
        )
    };
    match candidate {
        Candidate::Method(kind) => one(*kind),
        Candidate::Combination(members) => {
            let forecasts = members
                .iter()
                .map(|kind| one(*kind))
                .collect::<Result<Vec<_>, _>>()?;
            Ok(combine_forecasts(&forecasts, horizon))
        }
    }
}

/// Why a backtest could not run.
#[derive(Clone, Debug, PartialEq)]
pub enum BacktestError {
    /// The history is too short to hold out the requested periods and still train.
    TooShort {
        /// Periods in the history.
        length: usize,
        /// Periods asked to hold out.
        holdout: usize,
    },
    /// Every candidate failed on this history.
    NoCandidate,
}

impl fmt::Display for BacktestError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            BacktestError::TooShort { length, holdout } => write!(
                f,
                "{length} periods are too few to hold out {holdout}: give at least {} periods or a shorter holdout",
                holdout + LEAST_TRAINING
            ),
            BacktestError::NoCandidate => write!(f, "no method could be fitted to this item's history"),
        }
    }
}

impl std::error::Error for BacktestError {}

/// The fewest periods a backtest trains on before its holdout.
pub const LEAST_TRAINING: usize = 3;

/// The default holdout length: the last full season (the accepted season length, else the
/// calendar's), at least one period and at most a third of the data; 1/5 of the data when no
/// season is known; never more than [`MAX_HOLDOUT`], the longest a user may ask for.
pub fn default_holdout(length: usize, season: Option<usize>) -> usize {
    let wanted = season.filter(|m| *m >= 2).unwrap_or((length / 5).max(1));
    wanted.clamp(1, (length / 3).max(1)).min(MAX_HOLDOUT)
}

/// What one candidate did in the backtest.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Scored {
    /// The candidate scored.
    pub candidate: Candidate,
    /// Measures pooled over all origins (what the ranking orders by); `bias` is the sum of
    /// errors over one holdout, averaged over the origins, so it reads like the Error ledger's
    /// final bias.
    pub measures: Measures,
    /// Forecasts of the last K periods from origin 0 (aligned with [`Backtest::holdout_demand`]).
    pub holdout_forecast: Vec<f64>,
}

impl Scored {
    /// The Error ledger of origin 0.
    pub fn ledger(&self, holdout_demand: &[f64], limit: f64) -> Vec<LedgerRow> {
        ledger(&self.holdout_forecast, holdout_demand, limit)
    }
}

/// A candidate that could not be scored, with the reason for the page to show.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Skipped {
    /// The candidate left out.
    pub candidate: Candidate,
    /// Why, in words for the page.
    pub reason: String,
}

/// Backtest settings.
#[derive(Clone, Debug, PartialEq)]
pub struct BacktestSettings {
    /// Holdout length K.
    pub holdout: usize,
    /// Number of rolling origins R (at least 1).
    pub origins: usize,
    /// The measure that orders the ranking.
    pub rank_by: RankBy,
    /// Methods to try.
    pub candidates: Vec<MethodKind>,
    /// Whether to add the combination candidate (the [`COMBINATION_ANCHORS`] and the best-ranked
    /// other methods, [`COMBINATION_SIZE`] in all).
    pub combine: bool,
}

/// The ranked outcome.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct Backtest {
    /// Best first by the ranking metric.
    pub ranking: Vec<Scored>,
    /// Candidates that could not be scored, with their reasons.
    pub skipped: Vec<Skipped>,
    /// The last K demands.
    pub holdout_demand: Vec<f64>,
    /// Origins actually used (fewer than asked when the history is short).
    pub origins_used: usize,
    /// The measure the ranking is ordered by.
    pub rank_by: RankBy,
}

/// Runs the backtest of `settings.candidates` on `history`, each method fitted with its season
/// from `seasons`.
pub fn run(
    history: &[f64],
    seasons: Seasons,
    settings: &BacktestSettings,
) -> Result<Backtest, BacktestError> {
    run_observed(history, seasons, settings, (0, &|_| false), &mut |_, _| {})
}

/// [`run`], calling `progress(done, total)` after each candidate method has been fitted at
/// every origin (`total` = the number of candidates), so a front end can show how far it is.
/// `shut`: the season of the history's shut places and whether period t of `history` falls
/// on one; every holdout forecast is taken there as the plan's is
/// ([`crate::patterns::forecast_at_shut_places`]),
/// so the ranking scores what the Look-ahead would show.
pub fn run_observed(
    history: &[f64],
    seasons: Seasons,
    settings: &BacktestSettings,
    shut: (usize, &dyn Fn(usize) -> bool),
    progress: &mut dyn FnMut(usize, usize),
) -> Result<Backtest, BacktestError> {
    let n = history.len();
    let k = settings.holdout.max(1);
    if n < k + LEAST_TRAINING {
        return Err(BacktestError::TooShort {
            length: n,
            holdout: k,
        });
    }
    // Keep at least three training periods at the earliest origin, and with a season two full
    // seasons where the history allows (seasonal methods need them to start): on a short
    // history fewer origins beat leaving the seasonal methods out.
    let mut origins = settings.origins.max(1).min(n - k - 2);
    if let Some(m) = seasons.longest().filter(|m| n - k >= 2 * m) {
        origins = origins.min(n - k - 2 * m + 1);
    }
    let train_end = n - k;
    let scale = mase_scale(&history[..train_end], seasons.accepted_length());

    let mut scored = Vec::new();
    let mut skipped = Vec::new();
    let mut per_origin: Vec<(MethodKind, Vec<Vec<f64>>)> = Vec::new();
    // At each origin (index j), the exponential smoothing fit with the lowest AICc so far:
    // the forecasts of [`MethodKind::SmoothingByAicc`] come from the fits made anyway. The
    // Holt-Winters models count only with an accepted season, as in its own fit.
    let by_aicc_wanted = settings.candidates.contains(&MethodKind::SmoothingByAicc);
    let mut by_aicc: Vec<Option<(f64, Vec<f64>)>> = vec![None; origins];
    let total = settings.candidates.len();
    'methods: for (done, &kind) in settings.candidates.iter().enumerate() {
        progress(done, total);
        if kind == MethodKind::SmoothingByAicc {
            continue;
        }
        let chooses = by_aicc_wanted
            && criterion::CHOICES.contains(&kind)
            && (!kind.needs_season() || seasons.accepted_length().is_some());
        let mut forecasts_by_origin = Vec::with_capacity(origins);
        // Earliest origin first: each later one starts its search from the fit one period
        // earlier, which saw less data, never more (so no origin's holdout reaches its fit).
        let mut neighbour: Option<Fitted> = None;
        for j in (0..origins).rev() {
            let end = train_end - j;
            let season = seasons.for_method(kind);
            let fitted = match &neighbour {
                Some(earlier) => methods::fit_near(earlier, &history[..end], season, k),
                None => methods::fit(kind, &history[..end], season, k),
            };
            match fitted {
                Ok(f) => {
                    // Only where it counts: the criterion runs over the whole fitted history.
                    if let Some(aicc) = chooses
                        .then(|| criterion::aicc(&f, &history[..end]))
                        .flatten()
                    {
                        if criterion::lower(aicc, by_aicc[j].as_ref().map(|b| b.0)) {
                            by_aicc[j] = Some((aicc, f.forecast().to_vec()));
                        }
                    }
                    forecasts_by_origin.push(f.forecast().to_vec());
                    neighbour = Some(f);
                }
                Err(e) => {
                    skipped.push(Skipped {
                        candidate: Candidate::Method(kind),
                        reason: e.to_string(),
                    });
                    continue 'methods;
                }
            }
        }
        forecasts_by_origin.reverse();
        per_origin.push((kind, forecasts_by_origin));
    }
    if by_aicc_wanted {
        match by_aicc.into_iter().collect::<Option<Vec<_>>>() {
            Some(chosen) => per_origin.push((
                MethodKind::SmoothingByAicc,
                chosen.into_iter().map(|(_, f)| f).collect(),
            )),
            None => skipped.push(Skipped {
                candidate: Candidate::Method(MethodKind::SmoothingByAicc),
                reason:
                    "no exponential smoothing model had enough periods for its AICc at every origin"
                        .into(),
            }),
        }
    }
    progress(total, total);
    let (cycle, is_shut) = shut;
    for (_, forecasts_by_origin) in per_origin.iter_mut() {
        for (j, f) in forecasts_by_origin.iter_mut().enumerate() {
            let end = train_end - j;
            crate::patterns::forecast_at_shut_places(f, cycle, |k| is_shut(end + k));
        }
    }

    let score = |forecasts_by_origin: &[Vec<f64>]| -> Option<Measures> {
        let mut f_all = Vec::with_capacity(origins * k);
        let mut d_all = Vec::with_capacity(origins * k);
        for (j, f) in forecasts_by_origin.iter().enumerate() {
            let end = train_end - j;
            f_all.extend_from_slice(f);
            d_all.extend_from_slice(&history[end..end + k]);
        }
        accuracy::measures(&f_all, &d_all, scale).ok().map(|mut m| {
            // Bias is a sum over one holdout; with several origins report the average holdout's.
            m.bias /= forecasts_by_origin.len().max(1) as f64;
            m
        })
    };
    for (kind, fbo) in &per_origin {
        if let Some(measures) = score(fbo) {
            scored.push(Scored {
                candidate: Candidate::Method(*kind),
                measures,
                holdout_forecast: fbo[0].clone(),
            });
        }
    }
    if scored.is_empty() {
        return Err(BacktestError::NoCandidate);
    }
    sort_ranking(&mut scored, settings.rank_by);

    if settings.combine && scored.len() >= 2 {
        let members = combination_members(&scored, seasons, origins * k);
        let member_forecasts: Vec<&Vec<Vec<f64>>> = members
            .iter()
            .filter_map(|m| {
                per_origin
                    .iter()
                    .find(|(kind, _)| kind == m)
                    .map(|(_, f)| f)
            })
            .collect();
        let combined: Vec<Vec<f64>> = (0..origins)
            .map(|j| {
                let at_origin: Vec<Vec<f64>> =
                    member_forecasts.iter().map(|f| f[j].clone()).collect();
                combine_forecasts(&at_origin, k)
            })
            .collect();
        if let Some(measures) = score(&combined) {
            scored.push(Scored {
                candidate: Candidate::Combination(members),
                measures,
                holdout_forecast: combined[0].clone(),
            });
            sort_ranking(&mut scored, settings.rank_by);
        }
    }

    Ok(Backtest {
        ranking: scored,
        skipped,
        holdout_demand: history[train_end..].to_vec(),
        origins_used: origins,
        rank_by: settings.rank_by,
    })
}

/// Sorts best first; unavailable scores last; ties keep the candidate order (simpler first).
fn sort_ranking(scored: &mut [Scored], rank_by: RankBy) {
    sorting::sort_by(scored, |a, b| {
        match (rank_by.score(&a.measures), rank_by.score(&b.measures)) {
            (Some(x), Some(y)) => x.total_cmp(&y),
            (Some(_), None) => std::cmp::Ordering::Less,
            (None, Some(_)) => std::cmp::Ordering::Greater,
            (None, None) => a.measures.rmse.total_cmp(&b.measures.rmse),
        }
    });
}

/// The training ends of the rolling origins used for empirical bands: the `max_origins` latest
/// ends from which the whole `horizon` still falls inside the history (each origin then gives one
/// error at every horizon), topped up, when the history is too short for that, with later ends
/// whose horizon is cut at the end of the data. No end leaves fewer than `min_train` periods.
pub fn band_origins(
    length: usize,
    horizon: usize,
    min_train: usize,
    max_origins: usize,
) -> Vec<usize> {
    let mut ends: Vec<usize> = Vec::with_capacity(max_origins);
    let full_last = length.saturating_sub(horizon);
    let mut end = full_last;
    while ends.len() < max_origins && end >= min_train && end > 0 {
        ends.push(end);
        end -= 1;
    }
    let mut partial = full_last + 1;
    while ends.len() < max_origins && partial < length {
        if partial >= min_train {
            ends.push(partial);
        }
        partial += 1;
    }
    sorting::sort(&mut ends);
    ends
}

/// Rolling origins per fit in [`rolling_errors`]: the candidate's methods are fitted at the
/// first origin and every `REFIT_EVERY`-th after it, and updated in between
/// ([`methods::update`]: parameters kept, states run on). Our choice, measured on the M3 data
/// (README, Benchmarks): against a fit at every origin the band held 0.0-1.2 points more per
/// subset, for a fifth of the time; refitting every twelfth raised its MSIS by 2-6 %.
pub const REFIT_EVERY: usize = 6;

/// Forecast errors e = F - D of a candidate from rolling origins: one path e_1, e_2, ... per
/// origin, oldest origin first (paths from the latest origins stop at the end of the data).
#[derive(Clone, Debug, Default, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct OriginErrors {
    paths: Vec<Vec<f64>>,
    /// The history index of each path's first step.
    starts: Vec<usize>,
    /// Per path, the steps at shut places (empty: none), which have no error of their own:
    /// forecast 0, sold nothing ([`Self::as_forecast_at_shut_places`]).
    at_shut: Vec<Vec<bool>>,
}

impl OriginErrors {
    /// The paths, oldest origin first.
    pub fn paths(&self) -> &[Vec<f64>] {
        &self.paths
    }

    /// The h-step errors for h = 1..=horizon, one list per step (for the band), leaving out
    /// steps at shut places: a band for a period that sells rests on periods that sold.
    pub fn by_horizon(&self, horizon: usize) -> Vec<Vec<f64>> {
        (0..horizon)
            .map(|h| {
                self.paths
                    .iter()
                    .enumerate()
                    .filter(|(i, _)| self.at_shut.get(*i).is_none_or(|m| m.get(h) != Some(&true)))
                    .filter_map(|(_, p)| p.get(h).copied())
                    .collect()
            })
            .collect()
    }

    /// The errors as the plan's forecast would have made them at shut places
    /// ([`crate::patterns::forecast_at_shut_places`]),
    /// with each path's start counted from the history's first period (`history` is the part
    /// the errors were worked out on, `offset` periods in). `shut` is asked of that count.
    pub fn as_forecast_at_shut_places(
        self,
        history: &[f64],
        offset: usize,
        cycle: usize,
        shut: impl Fn(usize) -> bool,
    ) -> OriginErrors {
        let starts: Vec<usize> = self.starts.iter().map(|s| s + offset).collect();
        let at_shut = self
            .paths
            .iter()
            .zip(&starts)
            .map(|(path, &at)| (0..path.len()).map(|k| shut(at + k)).collect())
            .collect();
        let paths = self
            .paths
            .iter()
            .zip(&self.starts)
            .zip(&starts)
            .map(|((path, &start), &at)| {
                if !(0..path.len()).any(|k| shut(at + k)) {
                    return path.clone();
                }
                let demand = &history[start..start + path.len()];
                let mut forecast: Vec<f64> = path.iter().zip(demand).map(|(e, d)| e + d).collect();
                crate::patterns::forecast_at_shut_places(&mut forecast, cycle, |k| shut(at + k));
                forecast.iter().zip(demand).map(|(f, d)| f - d).collect()
            })
            .collect();
        OriginErrors {
            paths,
            starts,
            at_shut,
        }
    }

    /// Errors of the total over each origin's first `steps` steps that `shut` leaves in (it
    /// is asked of a step's history index), from each origin whose path reaches that many:
    /// the errors of a total over as many open periods as a window holds, where a window's
    /// shut periods are forecast as 0 and sell nothing ([`crate::patterns::shut_places`]).
    /// With no shut periods, the totals over the first `steps` steps: every covariance
    /// between the steps is in them.
    pub fn open_totals(&self, steps: usize, shut: impl Fn(usize) -> bool) -> Vec<f64> {
        if steps == 0 {
            return Vec::new();
        }
        self.paths
            .iter()
            .zip(&self.starts)
            .filter_map(|(path, &start)| {
                let open: Vec<f64> = path
                    .iter()
                    .enumerate()
                    .filter(|(k, _)| !shut(start + k))
                    .map(|(_, e)| *e)
                    .take(steps)
                    .collect();
                (open.len() == steps).then(|| open.iter().sum())
            })
            .collect()
    }
}

/// Errors e = F - D of a candidate from the rolling origins of [`band_origins`], for the band
/// and the Stock plan. Between refits the methods are updated ([`REFIT_EVERY`]). `tick` is
/// called at each origin, so a front end hears that the work goes on.
#[allow(clippy::too_many_arguments)]
pub fn rolling_errors(
    candidate: &Candidate,
    history: &[f64],
    seasons: Seasons,
    horizon: usize,
    min_train: usize,
    max_origins: usize,
    tick: &mut dyn FnMut(),
) -> OriginErrors {
    let n = history.len();
    let members = candidate.members();
    // A method may stand twice (the model the AICc chose may also be a best other): each
    // distinct one is fitted once and counted as often as it stands.
    let mut distinct: Vec<MethodKind> = Vec::new();
    for kind in members {
        if !distinct.contains(kind) {
            distinct.push(*kind);
        }
    }
    let slot: Vec<usize> = members
        .iter()
        .map(|k| distinct.iter().position(|d| d == k).unwrap_or(0))
        .collect();
    let mut latest_fit: Vec<Option<Fitted>> = vec![None; distinct.len()];
    let mut paths = Vec::new();
    let mut starts = Vec::new();
    for (i, end) in band_origins(n, horizon, min_train, max_origins)
        .into_iter()
        .enumerate()
    {
        tick();
        let steps = horizon.min(n - end);
        let train = &history[..end];
        let refit = i % REFIT_EVERY == 0;
        let forecasts = distinct
            .iter()
            .zip(&mut latest_fit)
            .map(|(kind, latest)| -> Result<Vec<f64>, MethodError> {
                match latest.as_ref().filter(|_| !refit) {
                    Some(earlier) => {
                        Ok(
                            methods::update(earlier, train, seasons.for_method(*kind), steps)?
                                .forecast()
                                .to_vec(),
                        )
                    }
                    None => {
                        let season = seasons.for_method(*kind);
                        let fitted = methods::fit(*kind, train, season, steps)?;
                        let f = fitted.forecast().to_vec();
                        *latest = Some(fitted);
                        Ok(f)
                    }
                }
            })
            .collect::<Result<Vec<_>, _>>();
        let Ok(forecasts) = forecasts else {
            continue;
        };
        let standing: Vec<Vec<f64>> = slot.iter().map(|&i| forecasts[i].clone()).collect();
        let f = combine_forecasts(&standing, steps);
        paths.push(
            f.iter()
                .zip(&history[end..end + steps])
                .map(|(fv, d)| fv - d)
                .collect(),
        );
        starts.push(end);
    }
    OriginErrors {
        paths,
        starts,
        at_shut: Vec::new(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn default_holdout_rules() {
        assert_eq!(default_holdout(60, Some(12)), 12);
        assert_eq!(default_holdout(24, Some(12)), 8);
        assert_eq!(default_holdout(2, None), 1);
        assert_eq!(default_holdout(50, None), 10);
        assert_eq!(default_holdout(100_000, None), 366);
    }

    #[test]
    fn band_origins_prefer_full_horizons() {
        // 60 periods, horizon 12: the 8 latest ends with a full horizon are 41..=48.
        assert_eq!(band_origins(60, 12, 24, 8), (41..=48).collect::<Vec<_>>());
        // 30 periods, horizon 12, at least 24 to train: no end leaves a full horizon, so the
        // ends 24..=29 with horizons cut at the end of the data are used.
        assert_eq!(band_origins(30, 12, 24, 8), (24..=29).collect::<Vec<_>>());
        // Too short for any origin.
        assert!(band_origins(10, 12, 24, 8).is_empty());
    }

    fn settings(candidates: Vec<MethodKind>) -> BacktestSettings {
        BacktestSettings {
            holdout: 6,
            origins: 3,
            rank_by: RankBy::Rmse,
            candidates,
            combine: true,
        }
    }

    fn wave(n: usize) -> Vec<f64> {
        (0..n)
            .map(|t| 50.0 + 0.5 * t as f64 + 10.0 * ((t % 6) as f64 - 2.5).abs())
            .collect()
    }

    #[test]
    fn methods_never_see_the_holdout() {
        let y = wave(40);
        let mut changed = y.clone();
        for v in &mut changed[34..] {
            *v *= 3.0;
        }
        let kinds = vec![
            MethodKind::Naive,
            MethodKind::Ses,
            MethodKind::Holt,
            MethodKind::Theta,
        ];
        let a = run(&y, Seasons::default(), &settings(kinds.clone())).unwrap();
        let b = run(&changed, Seasons::default(), &settings(kinds)).unwrap();
        // Scores differ (the demand differs) but each method's origin-0 forecast is the same.
        assert_eq!(a.ranking.len(), b.ranking.len());
        for x in &a.ranking {
            let same = b
                .ranking
                .iter()
                .find(|s| s.candidate == x.candidate)
                .unwrap();
            assert_eq!(x.holdout_forecast, same.holdout_forecast);
        }
        assert_eq!(a.holdout_demand, y[34..].to_vec());
    }

    #[test]
    fn ranking_is_sorted_and_combination_is_the_mean_of_its_members() {
        let y = wave(40);
        let kinds = vec![
            MethodKind::Naive,
            MethodKind::Ses,
            MethodKind::Holt,
            MethodKind::DampedTrend,
            MethodKind::Theta,
        ];
        let bt = run(&y, Seasons::default(), &settings(kinds)).unwrap();
        let scores: Vec<f64> = bt.ranking.iter().map(|s| s.measures.rmse).collect();
        assert!(scores.windows(2).all(|w| w[0] <= w[1]), "{scores:?}");
        let combo = bt
            .ranking
            .iter()
            .find(|s| matches!(s.candidate, Candidate::Combination(_)))
            .unwrap();
        let Candidate::Combination(members) = &combo.candidate else {
            unreachable!()
        };
        assert_eq!(members.len(), COMBINATION_SIZE - 1);
        for h in 0..6 {
            let mean = members
                .iter()
                .map(|k| {
                    bt.ranking
                        .iter()
                        .find(|s| s.candidate == Candidate::Method(*k))
                        .unwrap()
                        .holdout_forecast[h]
                })
                .sum::<f64>()
                / members.len() as f64;
            assert!((combo.holdout_forecast[h] - mean).abs() < 1e-9);
        }
        assert_eq!(bt.origins_used, 3);
    }

    /// The combination's members for `y` with `seasons`, `kinds` as candidates and a holdout of
    /// `holdout` (3 origins): the anchors first, then (`aicc`) the AICc method, then the
    /// best-ranked others in ranking order, `size` in all.
    fn check_members(
        y: &[f64],
        (seasons, holdout): (Seasons, usize),
        kinds: &[MethodKind],
        aicc: bool,
        size: usize,
    ) {
        let bt = run(
            y,
            seasons,
            &BacktestSettings {
                holdout,
                ..settings(kinds.to_vec())
            },
        )
        .unwrap();
        let Some(Candidate::Combination(members)) = bt
            .ranking
            .iter()
            .map(|s| &s.candidate)
            .find(|c| matches!(c, Candidate::Combination(_)))
        else {
            panic!("no combination")
        };
        let mut expected = COMBINATION_ANCHORS.to_vec();
        if aicc {
            expected.push(MethodKind::SmoothingByAicc);
        }
        let others: Vec<MethodKind> = bt
            .ranking
            .iter()
            .filter_map(|s| match s.candidate {
                Candidate::Method(k)
                    if !expected.contains(&k) && k != MethodKind::SmoothingByAicc =>
                {
                    Some(k)
                }
                _ => None,
            })
            .collect();
        expected.extend(others.into_iter().take(size.saturating_sub(expected.len())));
        assert_eq!(members, &expected, "{seasons:?}");
    }

    // The Theta models are members whatever their rank, and the exponential smoothing model
    // with the lowest AICc; with an accepted season the other places go to the best-ranked
    // others, in ranking order; without a season there are none while the ranking rests on
    // fewer than ERRORS_TO_RANK_BY errors; with a season on trial, enough errors without a
    // season, or without the AICc method, the former rule (anchors and the best two others).
    #[test]
    fn combination_holds_the_theta_models_the_aicc_model_and_the_best_others() {
        let y = wave(40);
        let mut kinds = vec![
            MethodKind::Naive,
            MethodKind::Ses,
            MethodKind::Holt,
            MethodKind::DampedTrend,
            MethodKind::MovingAverage,
            MethodKind::Theta,
            MethodKind::DynamicOptimisedTheta,
            MethodKind::HoltWintersAdditive,
        ];
        let former = COMBINATION_SIZE - 1;
        let few = 6; // 18 errors pooled over 3 origins
        let enough = ERRORS_TO_RANK_BY.div_ceil(3);
        check_members(&y, (Seasons::default(), few), &kinds, false, former);
        kinds.push(MethodKind::SmoothingByAicc);
        check_members(&y, (Seasons::default(), few), &kinds, true, 3);
        check_members(&y, (Seasons::default(), enough), &kinds, false, former);
        check_members(&y, (Seasons::default(), enough - 1), &kinds, true, 3);
        let season = Seasons::accepted(Some(6));
        check_members(&y, (season, few), &kinds, true, COMBINATION_SIZE);
        check_members(&y, (season, enough), &kinds, true, COMBINATION_SIZE);
        check_members(&y, (Seasons::on_trial(Some(6)), few), &kinds, false, former);

        let two = run(
            &y,
            Seasons::default(),
            &settings(vec![MethodKind::Naive, MethodKind::Ses]),
        )
        .unwrap();
        assert!(two.ranking.iter().any(|s| s.candidate
            == Candidate::Combination(vec![MethodKind::Naive, MethodKind::Ses])
            || s.candidate == Candidate::Combination(vec![MethodKind::Ses, MethodKind::Naive])));
    }

    #[test]
    fn failing_methods_are_skipped_with_a_reason() {
        let y = wave(20);
        let bt = run(
            &y,
            Seasons::default(),
            &settings(vec![MethodKind::Naive, MethodKind::HoltWintersAdditive]),
        )
        .unwrap();
        assert_eq!(bt.skipped.len(), 1);
        assert!(bt.skipped[0].reason.contains("season length"));
        assert!(matches!(
            run(
                &y[..5],
                Seasons::default(),
                &settings(vec![MethodKind::Naive])
            ),
            Err(BacktestError::TooShort { .. })
        ));
    }

    // A business shut every other period (odd ones): a flat forecast of 5 against 10 sold on
    // open periods and 0 on shut ones errs by -5 and +5. As the plan forecasts, 0 when shut
    // and the path's total on the open periods (10), it errs by 0, and the shut steps are
    // no errors of the band's.
    #[test]
    fn origin_errors_as_forecast_at_shut_places() {
        let history: Vec<f64> = (0..12)
            .map(|t| if t % 2 == 1 { 0.0 } else { 10.0 })
            .collect();
        let paths: Vec<Vec<f64>> = [4, 5, 6]
            .iter()
            .map(|&start| history[start..start + 4].iter().map(|d| 5.0 - d).collect())
            .collect();
        let raw = OriginErrors {
            paths,
            starts: vec![4, 5, 6],
            at_shut: Vec::new(),
        };
        assert_eq!(raw.by_horizon(2)[0], [-5.0, 5.0, -5.0]);
        // Worked out on history[2..]: its index 4 is period 6 of the whole history.
        let shut = |t: usize| t % 2 == 1;
        let plan = raw.as_forecast_at_shut_places(&history[2..], 2, 2, shut);
        assert_eq!(plan.starts, [6, 7, 8]);
        let by_step = plan.by_horizon(4);
        assert_eq!(by_step[0], [0.0, 0.0]);
        assert_eq!(by_step[1], [0.0]);
        assert_eq!(plan.open_totals(2, shut), [0.0, 0.0, 0.0]);
        assert!(plan.open_totals(3, shut).is_empty());
    }

    #[test]
    fn rolling_errors_refit_then_update() {
        // A straight line: every method that follows a trend forecasts it exactly, whether
        // fitted or updated, so all errors are ~0; Naive's h-step error is -h * slope.
        let y: Vec<f64> = (0..40).map(|t| 10.0 + 2.0 * t as f64).collect();
        let mut ticks = 0;
        let naive = rolling_errors(
            &Candidate::Method(MethodKind::Naive),
            &y,
            Seasons::default(),
            3,
            10,
            20,
            &mut || ticks += 1,
        )
        .by_horizon(3);
        assert_eq!(ticks, 20);
        for (h, errs) in naive.iter().enumerate() {
            assert!(errs.iter().all(|e| (e + 2.0 * (h + 1) as f64).abs() < 1e-9));
        }
        let holt = rolling_errors(
            &Candidate::Method(MethodKind::Holt),
            &y,
            Seasons::default(),
            3,
            10,
            20,
            &mut || {},
        )
        .by_horizon(3);
        assert_eq!(holt.iter().map(Vec::len).sum::<usize>(), 3 * 20);
        assert!(holt.iter().flatten().all(|e| e.abs() < 1e-3), "{holt:?}");
    }

    #[test]
    fn rank_keys_round_trip() {
        for r in [RankBy::Mape, RankBy::Rmse, RankBy::Bias, RankBy::Mase] {
            assert_eq!(RankBy::from_key(r.key()), Some(r));
        }
        assert_eq!(RankBy::default(), RankBy::Mase);
    }
}
