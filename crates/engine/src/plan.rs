//! Plan: the whole job for one item, from a validated series to a ranked, banded forecast.
//!
//! Kept apart from: reading text and showing results. This is thin glue over
//! [`crate::patterns`], [`crate::backtest`], [`crate::methods`] and
//! [`crate::bands`]; it owns only the defaults and the order of the steps:
//! 1. fill inner gaps by linear interpolation (named in the notes);
//! 2. detect season length (a user override wins), trend and demand class;
//! 3. choose the candidates that apply; backtest and rank them on the holdout;
//! 4. refit the winner on all data and forecast the horizon with its band, never narrower than
//!    the history's recording step allows ([`bands::recording_sd`]).

use std::fmt;

use crate::accuracy::LedgerRow;
use crate::backtest::{
    self, Backtest, BacktestError, BacktestSettings, Candidate, OriginErrors, Seasons,
};
use crate::bands::{self, BandMethod, BandPoint, BandSource, Level};
use crate::calendar::{Frequency, Period};
use crate::methods::{self, criterion, Fitted, MethodKind};
use crate::patterns::{
    self, DemandVerdict, SeasonSource, SeasonVerdict, TrendDirection, TrendVerdict,
};
use crate::series::Series;
use crate::settings::{Choice, PlanSettings, SeasonChoice};

/// Fewest periods the plan works with.
pub const MIN_PERIODS: usize = 4;

/// Most recent periods the backtest and the band's rolling origins work on (our choice: five
/// and a half years of daily periods; a monthly or weekly history never reaches it). They fit
/// every candidate method many times over, so their work grows with the history; older
/// periods add little to a ranking of how methods forecast now. The chosen method is refitted
/// on the whole history, and a note says when the window applied. Measured: 100,000 daily
/// periods took 6.9 s before the window (README, Benchmarks).
pub const RECENT_PERIODS: usize = 2_000;

/// Most rolling origins behind the band: the latest ends whose whole horizon falls in the
/// history, then later ones with the horizon cut at the end of the data
/// ([`backtest::band_origins`]). Measured on the M3 data (benches/band_lab.rs): 36 origins held
/// within 0.6 points of using every origin in each subset, 8 origins (the former count) held
/// 2-5 points less at 95 % with bands half again as wide at long horizons, because the
/// Student-t quantile of [`bands::rolling_band`] must allow for so few errors.
pub const BAND_ORIGINS: usize = 36;

/// Why an item could not be planned.
#[derive(Clone, Debug, PartialEq)]
pub enum PlanError {
    /// Fewer than [`MIN_PERIODS`] periods: add more history.
    TooShort {
        /// The item.
        name: String,
        /// Periods it has.
        length: usize,
    },
    /// The asked-for method could not be scored on this item: pick one of the available ones.
    NotCandidate {
        /// The item.
        name: String,
        /// The key asked for.
        wanted: String,
        /// The keys of the ranked candidates.
        available: Vec<String>,
    },
    /// The backtest failed (see its message).
    Backtest {
        /// The item.
        name: String,
        /// Why.
        source: BacktestError,
    },
    /// A number of the plan came out infinite or undefined (the last guard; no series within
    /// the bound is known to cause it).
    NotFinite {
        /// The item.
        name: String,
    },
    /// No ranked candidate could be refitted on all the data.
    NoRefit {
        /// The item.
        name: String,
        /// Each candidate's reason, in ranking order from the one chosen.
        reasons: Vec<String>,
    },
}

impl fmt::Display for PlanError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            PlanError::TooShort { name, length } => write!(
                f,
                "item \"{name}\" has {length} periods; at least {MIN_PERIODS} are needed to test and forecast"
            ),
            PlanError::NotCandidate { name, wanted, available } => write!(
                f,
                "item \"{name}\": method \"{wanted}\" could not be scored here; available: {}",
                available.join(", ")
            ),
            PlanError::Backtest { name, source } => write!(f, "item \"{name}\": {source}"),
            PlanError::NotFinite { name } => write!(
                f,
                "item \"{name}\": the computation gave a number that is not finite, so no \
                 forecast is shown; check the item's values for extreme ones"
            ),
            PlanError::NoRefit { name, reasons } => write!(
                f,
                "item \"{name}\": no method of the Backtest ranking could be refitted on all the data ({})",
                reasons.join("; ")
            ),
        }
    }
}

impl std::error::Error for PlanError {}

/// One forecast period.
#[derive(Clone, Copy, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct ForecastPoint {
    /// The period forecast.
    pub period: Period,
    /// The forecast and its band.
    pub band: BandPoint,
    /// Where the band's spread came from.
    pub source: BandSource,
}

/// One holdout period of the Error ledger.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct LedgerEntry {
    /// The holdout period.
    pub period: Period,
    /// Its errors and running measures.
    pub row: LedgerRow,
}

/// Everything the front ends show for one item.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct ItemPlan {
    /// The item's name.
    pub name: String,
    /// Season length verdict and its evidence.
    pub season: SeasonVerdict,
    /// The season lengths the methods were fitted with: the accepted one, or the rejected
    /// calendar season on trial for the seasonal methods.
    pub seasons: Seasons,
    /// The chosen candidate's forecast errors from up to [`BAND_ORIGINS`] rolling origins in the
    /// history, `horizon` steps each (fewer at the latest origins): what the horizon-aware band
    /// and the Stock plan's spread rest on. Empty when the history is too short for them.
    pub origin_errors: OriginErrors,
    /// Trend verdict and its evidence.
    pub trend: TrendVerdict,
    /// Demand class and its evidence.
    pub demand: DemandVerdict,
    /// The Backtest ranking.
    pub backtest: Backtest,
    /// The candidate that forecasts (see the notes when it is not the one asked for).
    pub chosen: Candidate,
    /// Holdout periods of the chosen candidate, with its Error ledger.
    pub ledger: Vec<LedgerEntry>,
    /// History after gap filling.
    pub history: Vec<f64>,
    /// Whether the history counts whole units: every value read (gaps aside, whose filled
    /// values may fall between units) is whole.
    pub whole_units: bool,
    /// The chosen candidate's one-step in-sample fit on all data (`None` where undefined; a
    /// combination's is the mean of the members that have one, so that it starts with the
    /// earliest member: a moving average's window, or a seasonal naive's first season, would
    /// otherwise leave the first periods without a forecast to judge them by).
    pub fitted: Vec<Option<f64>>,
    /// The forecast periods with their bands.
    pub forecast: Vec<ForecastPoint>,
    /// The band level.
    pub level: Level,
    /// How the band was worked out.
    pub band: BandMethod,
    /// The tracking-signal limit the Error ledger's marks were set with.
    pub tracking_limit: f64,
    /// Plain-words notes: gaps filled, methods skipped and why.
    pub notes: Vec<String>,
}

impl ItemPlan {
    /// How often the item's periods come (from its forecast's periods; a plan always has one).
    pub fn frequency(&self) -> Frequency {
        self.forecast
            .first()
            .map_or(Frequency::Undated, |f| f.period.frequency())
    }
}

/// Histories with fewer whole calendar seasons than this put a rejected calendar season on
/// trial ([`seasons_to_try`]). Our choice, measured on the M3 monthly data (README,
/// Benchmarks): with each history cut to its last 36 months the trial took sMAPE from 15.33 to
/// 14.48; on the whole histories (4 to 10 seasons) it cost 0.15.
pub const TRIAL_BELOW_SEASONS: usize = 4;

/// The seasons the methods are fitted with: the accepted one, or, when the test rejected the
/// calendar's season (`choice` automatic) and the backtest's earliest training part still holds
/// two such seasons, that season on trial for the seasonal methods ([`Seasons::on_trial`]).
/// Why: the test's threshold is strict on few seasons, so three years of a clear 12-month
/// season can fail it; the backtest then decides on the holdout, and a note shows how the
/// seasonal methods did. Tried on 2026-12-05 and not kept: the trial from one season of
/// training (24-35 months), which gained on the M3 series cut short but, a review of 66 and
/// 750 invented shop series found, lowered reorder points just before a season's rise and
/// brought a one-off spike back a year later (README, Benchmarks).
fn seasons_to_try(
    verdict: &SeasonVerdict,
    choice: SeasonChoice,
    length: usize,
    holdout: usize,
) -> Seasons {
    if verdict.length.is_some() || choice != SeasonChoice::Auto {
        return Seasons::accepted(verdict.length);
    }
    let trial = verdict
        .candidate
        .filter(|_| {
            verdict.source == SeasonSource::Calendar && verdict.full_seasons < TRIAL_BELOW_SEASONS
        })
        .filter(|m| length >= holdout + 2 * m);
    Seasons::on_trial(trial)
}

/// What became of a season on trial: how the best seasonal method ranked, and whether the
/// forecast uses a season.
fn trial_note(seasons: Seasons, bt: &Backtest, chosen: &Candidate) -> Option<String> {
    let m = seasons.trial_length()?;
    // With a season on trial only the seasonal methods get one; in a combination the others
    // flatten it (a review: "follows the season" over a May forecast of 29 where four Mays
    // sold 50 to 65, two of four members seasonal).
    let members = chosen.members();
    let seasonal = members
        .iter()
        .filter(|k| seasons.for_method(**k).is_some())
        .count();
    let outcome = if seasonal == 0 {
        "the forecast has no season".to_string()
    } else if seasonal < members.len() {
        format!(
            "so the forecast follows it in part: {seasonal} of the combination's {} members \
             use it, the others do not, so its peaks and troughs are about {} as deep as the \
             seasonal members have them",
            members.len(),
            share_in_words(seasonal, members.len())
        )
    } else {
        "so the forecast follows the season".to_string()
    };
    let best = bt
        .ranking
        .iter()
        .position(|s| matches!(s.candidate, Candidate::Method(k) if k.needs_season()));
    Some(match best {
        Some(i) => format!(
            "the season test rejected a {m}-period season on this short history, so the \
             seasonal methods were tried with it in the backtest: the best of them, {}, ranked \
             {} of {}; {outcome}",
            bt.ranking[i].candidate.label(),
            i + 1,
            bt.ranking.len()
        ),
        None => format!(
            "the season test rejected a {m}-period season on this short history; the seasonal \
             methods tried with it could not be fitted, so the forecast has no season"
        ),
    })
}

/// A share of the members in words ("half", "a third", "3 in 5").
fn share_in_words(part: usize, whole: usize) -> String {
    match (part, whole) {
        (p, w) if 2 * p == w => "half".to_string(),
        (p, w) if 3 * p == w => "a third".to_string(),
        (p, w) if 4 * p == w => "a quarter".to_string(),
        (p, w) if 3 * p == 2 * w => "two thirds".to_string(),
        (p, w) if 4 * p == 3 * w => "three quarters".to_string(),
        (p, w) => format!("{p} in {w}"),
    }
}

/// The horizon when the settings leave it automatic: one calendar season, else 6 periods.
pub fn default_horizon(frequency: Frequency) -> usize {
    frequency.natural_season().unwrap_or(6)
}

/// The methods that apply to a series with this season and demand class.
pub fn applicable_methods(
    season: Option<usize>,
    demand: &DemandVerdict,
    has_zeros: bool,
) -> Vec<MethodKind> {
    MethodKind::ALL
        .into_iter()
        .filter(|k| !k.needs_season() || season.is_some())
        .filter(|k| !k.is_intermittent() || has_zeros || demand.class.is_sparse())
        .collect()
}

/// How far a plan has come: `done` of `total` steps (one per candidate method in the backtest,
/// then one for the chosen method's refit and band, which is reported again at each of the
/// band's rolling origins, so a listener hears that the work goes on).
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub struct Progress {
    /// Steps done.
    pub done: usize,
    /// Steps in all.
    pub total: usize,
}

/// Plans one item.
pub fn plan_item(series: &Series, settings: &PlanSettings) -> Result<ItemPlan, PlanError> {
    plan_item_observed(series, settings, &mut |_| {})
}

/// [`plan_item`], reporting its [`Progress`] as it goes.
pub fn plan_item_observed(
    series: &Series,
    settings: &PlanSettings,
    progress: &mut dyn FnMut(Progress),
) -> Result<ItemPlan, PlanError> {
    plan_inner(series, settings, progress, None)
}

/// [`plan_item`] with another choice of candidate, reusing the ranking of `earlier` (the plan
/// of this series under `earlier_settings`) instead of backtesting again. The ranking is
/// reused only when it is the one these settings would make: the same history and settings
/// that differ at most in [`PlanSettings::choice`]; otherwise the plan is made afresh.
pub fn plan_item_reusing(
    series: &Series,
    settings: &PlanSettings,
    earlier: &ItemPlan,
    earlier_settings: &PlanSettings,
) -> Result<ItemPlan, PlanError> {
    let same_ranking = settings.clone().with_choice(Choice::Auto)
        == earlier_settings.clone().with_choice(Choice::Auto)
        && earlier.history == series.interpolated();
    let reuse = same_ranking.then_some(&earlier.backtest);
    plan_inner(series, settings, &mut |_| {}, reuse)
}

fn plan_inner(
    series: &Series,
    settings: &PlanSettings,
    progress: &mut dyn FnMut(Progress),
    reuse: Option<&Backtest>,
) -> Result<ItemPlan, PlanError> {
    let name = series.name().to_string();
    let history = series.interpolated();
    let n = history.len();
    if n < MIN_PERIODS {
        return Err(PlanError::TooShort { name, length: n });
    }
    let frequency = series.frequency();
    let horizon = settings.horizon().unwrap_or(default_horizon(frequency));
    let mut notes = Vec::new();
    let gaps = series.gap_indices();
    if !gaps.is_empty() {
        let labels: Vec<String> = gaps.iter().map(|&i| series.period(i).to_string()).collect();
        notes.push(format!(
            "{} missing period(s) filled by straight-line interpolation: {}",
            gaps.len(),
            labels.join(", ")
        ));
    }

    let user_season = match settings.season() {
        SeasonChoice::Auto => None,
        SeasonChoice::Fixed(m) => Some(m),
    };
    let season = patterns::detect_season(&history, frequency, user_season);
    let trend = patterns::mann_kendall(&history);
    // The calendar's places where a business may be shut (days of the week, months, quarters);
    // weeks are left out: an ISO year has 52 or 53, so a week's place does not recur every 52.
    let calendar_places = frequency
        .natural_season()
        .filter(|_| frequency != Frequency::Weekly);
    let demand = patterns::classify_open_demand(&history, calendar_places);
    let m = season.length;
    let non_negative = history.iter().all(|v| *v >= 0.0);
    let has_zeros = history.contains(&0.0);

    let recent = &history[n.saturating_sub(RECENT_PERIODS)..];
    if recent.len() < n {
        notes.push(format!(
            "the Backtest ranking and the band use the last {} of the {n} periods; the chosen \
             method is refitted on all of them",
            recent.len()
        ));
    }
    let automatic = || backtest::default_holdout(recent.len(), m.or(frequency.natural_season()));
    // A holdout asked for the whole file that one short item cannot give (a new item's 8
    // months under a holdout of 6) takes the automatic one there, said: refused, the item
    // lost its forecast, its alerts and its row's figures (a review), and the planner has no
    // holdout per item to mend it with.
    let holdout = match settings.holdout() {
        Some(asked) if recent.len() < asked + backtest::LEAST_TRAINING => {
            let held = automatic();
            notes.push(format!(
                "{} periods are too few to hold out the {asked} asked for (that needs at least \
                 {}): held out {held}, as the automatic holdout would",
                recent.len(),
                asked + backtest::LEAST_TRAINING
            ));
            held
        }
        Some(asked) => asked,
        None => automatic(),
    };
    let seasons = seasons_to_try(&season, settings.season(), recent.len(), holdout);
    let candidates = settings
        .methods()
        .map(<[MethodKind]>::to_vec)
        .unwrap_or_else(|| applicable_methods(seasons.longest(), &demand, has_zeros));
    let bt_settings = BacktestSettings {
        holdout,
        origins: settings.origins(),
        rank_by: settings.rank_by(),
        candidates,
        combine: settings.combine(),
    };
    let steps = bt_settings.candidates.len() + 1;
    let bt = match reuse {
        Some(bt) => bt.clone(),
        None => backtest::run_observed(
            recent,
            seasons,
            &bt_settings,
            (demand.shut_cycle, &|t| demand.is_shut(t + n - recent.len())),
            &mut |done, _| progress(Progress { done, total: steps }),
        )
        .map_err(|source| PlanError::Backtest {
            name: name.clone(),
            source,
        })?,
    };
    for s in &bt.skipped {
        notes.push(format!("{} left out: {}", s.candidate.label(), s.reason));
    }
    let wanted =
        choose(&bt, settings.choice(), &demand).ok_or_else(|| PlanError::NotCandidate {
            name: name.clone(),
            wanted: match settings.choice() {
                Choice::Named(key) => key.clone(),
                _ => "auto".to_string(),
            },
            available: bt
                .ranking
                .iter()
                .map(|s| s.candidate.key().to_string())
                .collect(),
        })?;
    let (
        row,
        Refit {
            point,
            fitted,
            fitted_by_all,
            variance,
            fitted_as,
            psi,
        },
    ) = refit_first_that_fits(&bt, wanted, &mut notes, |c| {
        refit(c, &history, recent.len(), seasons, horizon)
    })
    .map_err(|reasons| PlanError::NoRefit {
        name: name.clone(),
        reasons,
    })?;
    let best = &bt.ranking[row];
    let chosen = best.candidate.clone();
    let over = if recent.len() < n {
        format!("the last {} periods", recent.len())
    } else {
        "the whole history".to_string()
    };
    if let Some(note) = aicc_note(&chosen, &fitted_as, &over) {
        notes.push(note);
    }
    if *settings.choice() == Choice::Auto && chosen == Candidate::Method(MethodKind::Sba) {
        notes.push(format!(
            "{}: SBA is the automatic choice for such demand (Syntetos, Boylan & Croston 2005); \
             the ranking shows how the other methods did",
            demand.class.as_str()
        ));
    }
    if let Some(note) = trial_note(seasons, &bt, &chosen) {
        notes.push(note);
    }
    let ledger: Vec<LedgerEntry> = best
        .ledger(&bt.holdout_demand, settings.tracking_limit())
        .into_iter()
        .enumerate()
        .map(|(i, row)| LedgerEntry {
            period: series.period(n - holdout + i),
            row,
        })
        .collect();

    let residual_mad = mean_abs_residual(&fitted_by_all, &history)
        .or_else(|| ledger.last().map(|e| e.row.mad))
        .unwrap_or(0.0);
    let mad_band = || {
        let pts = bands::mad_band(&point, residual_mad, settings.level(), non_negative);
        let src = vec![BandSource::MadRule; pts.len()];
        (pts, src)
    };
    // The chosen candidate's errors from rolling origins: the horizon-aware band and the Stock
    // plan's spread over the lead time both rest on them, so they are worked out whatever band
    // is shown.
    let min_train = seasons
        .training_for(&fitted_as)
        .unwrap_or(0)
        .max(MIN_PERIODS);
    let last_step = Progress {
        done: steps - 1,
        total: steps,
    };
    // The model the criterion chose is the one refitted at the origins.
    let origin_errors = backtest::rolling_errors(
        &fitted_as,
        recent,
        seasons,
        horizon,
        min_train,
        BAND_ORIGINS,
        &mut || progress(last_step),
    );
    // As the forecast will be: 0 at shut places, their share on the open steps; the steps
    // counted from the history's first period.
    let origin_errors = origin_errors.as_forecast_at_shut_places(
        recent,
        n - recent.len(),
        demand.shut_cycle,
        |t| demand.is_shut(t),
    );
    let trending = trend.direction != TrendDirection::None;
    let own_errors = origin_errors.by_horizon(horizon);
    let stand_in = seasonal_stand_in(&own_errors, &fitted_as, seasons, recent, horizon);
    if stand_in.is_some() && settings.band() == BandMethod::HorizonAware {
        notes.push(
            "the history is too short for rolling origins with two full seasons of training: \
             the band rests on the seasonal naive method's errors at origins from one season \
             on, a stand-in where the chosen method is another (widest at the far steps, \
             which few origins reach)"
                .into(),
        );
    }
    let rolling = || match &stand_in {
        Some((errors, weights)) => bands::rolling_band(
            &point,
            errors,
            Some(bands::Carryover::new(weights, trending)),
            settings.level(),
            non_negative,
        ),
        None => bands::rolling_band(
            &point,
            &own_errors,
            Some(bands::Carryover::new(&psi, trending)),
            settings.level(),
            non_negative,
        ),
    };
    let points_and_sources = match settings.band() {
        BandMethod::MadRule => mad_band(),
        BandMethod::HorizonAware => match (rolling(), variance) {
            (Some(pts), _) => {
                let src = vec![BandSource::RollingOrigins; pts.len()];
                (pts, src)
            }
            (None, Some(v)) => {
                notes.push(
                    "the history is too short for rolling-origin errors: the band uses the \
                     method's analytic variances, which leave out the uncertainty of its fitted \
                     parameters and are checked against no held-out errors, so it is likely \
                     narrower than its level says"
                        .into(),
                );
                let pts = bands::analytic_band(&point, &v, settings.level(), non_negative);
                let src = vec![BandSource::Analytic; pts.len()];
                (pts, src)
            }
            (None, None) => {
                notes.push(
                    "the history is too short for rolling-origin errors: the band uses the MAD \
                     rule, from the fit's one-step errors, which on so short a history understate \
                     the errors further ahead, so it is likely narrower than its level says (on \
                     the M3 monthly series cut to 24 months such bands held about half their \
                     95 %)"
                        .into(),
                );
                mad_band()
            }
        },
    };
    let (mut band_points, band_sources) = points_and_sources;
    bands::widen_to_at_least(
        &mut band_points,
        settings.level(),
        bands::recording_sd(&history),
        non_negative,
    );
    shut_places_forecast_zero(&mut band_points, n, &demand, &mut notes);
    let last = series.period(n - 1);
    let forecast = band_points
        .into_iter()
        .zip(band_sources)
        .enumerate()
        .map(|(h, (band, source))| ForecastPoint {
            period: last.offset(h as i64 + 1),
            band,
            source,
        })
        .collect();

    let plan = ItemPlan {
        name,
        season,
        seasons,
        origin_errors,
        trend,
        demand,
        backtest: bt,
        chosen,
        ledger,
        history,
        whole_units: series.values().iter().flatten().all(|v| v.fract() == 0.0),
        fitted,
        forecast,
        level: settings.level(),
        band: settings.band(),
        tracking_limit: settings.tracking_limit(),
        notes,
    };
    if numbers_are_finite(&plan) {
        Ok(plan)
    } else {
        Err(PlanError::NotFinite { name: plan.name })
    }
}

/// When the chosen candidate has a season and too short a history for two of its own one-step
/// errors at rolling origins (its seasonal members need two full seasons before the first),
/// the seasonal naive method's errors at origins from one season on, by horizon, and its
/// psi-weights (1 at multiples of the season): the band's stand-in. Why: the fallback before,
/// the MAD rule from the fit's one-step errors, held about half its 95 % on the M3 monthly
/// series cut to 24 months (a seasonal fit on two seasons has almost as many states as data);
/// the stand-in held 93.2 % there and 96.0 % on 25 months, MSIS 47.6 to 27.0 and 34.1 to 24.3
/// (README, Benchmarks). The seasonal naive method is a forecast the chosen one should beat, so
/// its errors lean wide. `None` otherwise.
fn seasonal_stand_in(
    own: &[Vec<f64>],
    fitted_as: &Candidate,
    seasons: Seasons,
    history: &[f64],
    horizon: usize,
) -> Option<(Vec<Vec<f64>>, Vec<f64>)> {
    let m = seasons.for_candidate(fitted_as)?;
    if own.first().is_some_and(|first| first.len() >= 2) {
        return None;
    }
    let errors = backtest::rolling_errors(
        &Candidate::Method(MethodKind::SeasonalNaive),
        history,
        Seasons::accepted(Some(m)),
        horizon,
        m.max(MIN_PERIODS),
        BAND_ORIGINS,
        &mut || {},
    );
    let weights = (0..horizon)
        .map(|j| if j % m == 0 { 1.0 } else { 0.0 })
        .collect();
    Some((errors.by_horizon(horizon), weights))
}

/// Forecasts and bands of 0 at the places of the calendar's season that had no demand in at
/// least 80 % of their periods, the others selling (a shop shut on Sundays;
/// [`patterns::shut_places`]), said in a note: the methods spread some of the open days'
/// demand over them (a method that does not follow the season forecasts the same every day),
/// which a business shut then would not sell. What they took is given back to the open steps
/// in proportion ([`patterns::forecast_at_shut_places`], the band moved with it):
/// a non-seasonal level is the mean over shut and open days, and zeros alone cut the week's
/// total by the shut share (a review found a shop shut three days a week at 72 where it sells
/// 120). The forecast's step h (from 0) is period n + h of the history's count.
fn shut_places_forecast_zero(
    points: &mut [BandPoint],
    n: usize,
    demand: &DemandVerdict,
    notes: &mut Vec<String>,
) {
    let (shut, m) = (&demand.shut_places, demand.shut_cycle);
    if shut.is_empty() {
        return;
    }
    let is_shut = |h: usize| demand.is_shut(n + h);
    let mut values: Vec<f64> = points.iter().map(|p| p.value).collect();
    patterns::forecast_at_shut_places(&mut values, m, is_shut);
    for ((h, point), value) in points.iter_mut().enumerate().zip(values) {
        if is_shut(h) {
            *point = BandPoint {
                value: 0.0,
                low: 0.0,
                high: 0.0,
            };
        } else {
            let moved = value - point.value;
            let floor = if point.low >= 0.0 {
                0.0
            } else {
                f64::NEG_INFINITY
            };
            *point = BandPoint {
                value,
                low: (point.low + moved).max(floor),
                high: point.high + moved,
            };
        }
    }
    notes.push(format!(
        "{} of every {m} periods had no demand in (almost) every season of the history while \
         the others sold (a business shut then): they are forecast as 0, the other periods \
         carrying the forecast's total, and left out of the demand class",
        shut.len()
    ));
}

/// Whether every number a front end shows or acts on is finite: forecasts and band ends,
/// holdout forecasts, ranking measures, the Error ledger and the fit. A series within
/// [`crate::series::MAX_ABS_VALUE`] keeps them finite (tests/properties.rs checks it on
/// generated series); this is the last guard, so a number that is not finite is never shown
/// as if it were a forecast.
fn numbers_are_finite(plan: &ItemPlan) -> bool {
    let measures = plan.backtest.ranking.iter().all(|r| {
        let m = &r.measures;
        [m.rmse, m.mad, m.bias].iter().all(|v| v.is_finite())
            && m.mape.is_none_or(f64::is_finite)
            && m.mase.is_none_or(f64::is_finite)
            && r.holdout_forecast.iter().all(|v| v.is_finite())
    });
    let ledger = plan.ledger.iter().all(|e| {
        let r = &e.row;
        [
            r.demand,
            r.forecast,
            r.error,
            r.abs_error,
            r.sq_error,
            r.mad,
            r.mse,
            r.rmse,
            r.bias,
        ]
        .iter()
        .all(|v| v.is_finite())
            && r.pct_error.is_none_or(f64::is_finite)
            && r.mape.is_none_or(f64::is_finite)
            && r.tracking_signal.is_none_or(f64::is_finite)
    });
    let forecast = plan
        .forecast
        .iter()
        .all(|f| f.band.low.is_finite() && f.band.value.is_finite() && f.band.high.is_finite());
    measures && ledger && forecast && plan.fitted.iter().flatten().all(|v| v.is_finite())
}

/// The row of the ranking that `choice` selects.
/// The ranking row `choice` picks. The automatic choice is SBA for intermittent and lumpy
/// demand (average interval between demands at or above 1.32), as the classification of
/// Syntetos, Boylan & Croston (2005) recommends: on such short, sparse holdouts the ranking
/// cannot tell the methods apart, and on 52 sparse series of our own making every combination
/// we tried (of all methods, of the intermittent ones, of SBA with SES or TSB) forecast the
/// held-out periods worse than SBA alone (tests/intermittent_choice.rs). Otherwise it is the
/// combination.
fn choose(bt: &Backtest, choice: &Choice, demand: &DemandVerdict) -> Option<usize> {
    let ranking = &bt.ranking;
    let sparse = demand.class.is_sparse();
    let sba = || {
        ranking
            .iter()
            .position(|s| s.candidate == Candidate::Method(MethodKind::Sba))
    };
    match choice {
        Choice::Best => (!ranking.is_empty()).then_some(0),
        Choice::Auto => sparse
            .then(sba)
            .flatten()
            .or_else(|| {
                ranking
                    .iter()
                    .position(|s| matches!(s.candidate, Candidate::Combination(_)))
            })
            .or((!ranking.is_empty()).then_some(0)),
        Choice::Named(key) => ranking.iter().position(|s| s.candidate.key() == key),
    }
}

/// A candidate refitted on all data: point forecasts, in-sample one-step fit (`None` where
/// undefined) and analytic variances where the method has them.
struct Refit {
    point: Vec<f64>,
    /// The one-step fit; a combination's is the mean of the members that have one (so it
    /// starts where its earliest member does).
    fitted: Vec<Option<f64>>,
    /// The same where every member has one: what the MAD rule's residuals were measured on
    /// before the fit started with the earliest member (kept so its bands stay as measured).
    fitted_by_all: Vec<Option<f64>>,
    variance: Option<Vec<f64>>,
    /// The candidate with each member as fitted: [`MethodKind::SmoothingByAicc`] replaced by
    /// the model it chose.
    fitted_as: Candidate,
    /// Its psi-weights for the horizon: the members' mean ([`methods::psi_weights`]).
    psi: Vec<f64>,
}

/// Which model [`MethodKind::SmoothingByAicc`] chose, when `chosen` has it; `over` says on
/// which periods (the whole history, or its most recent [`RECENT_PERIODS`]).
fn aicc_note(chosen: &Candidate, fitted_as: &Candidate, over: &str) -> Option<String> {
    let at = chosen
        .members()
        .iter()
        .position(|k| *k == MethodKind::SmoothingByAicc)?;
    let model = fitted_as.members().get(at)?;
    Some(format!(
        "{}: {} has the lowest AICc on {over} (Hyndman, Koehler, Snyder & Grose 2002)",
        MethodKind::SmoothingByAicc.label(),
        model.label()
    ))
}

/// The refit of ranking row `wanted` or, when that candidate cannot be refitted on all the
/// data (it was scored on the shorter training part, which may lack what it needs: a
/// multiplicative season cannot take a zero that only the holdout holds), of the next row of
/// the ranking that can, then of the rows above it, best first. A stand-in is named in `notes`
/// and becomes the chosen candidate, so the plan never names one method while forecasting with
/// another. `Err` holds every candidate's reason when none can be refitted.
fn refit_first_that_fits(
    bt: &Backtest,
    wanted: usize,
    notes: &mut Vec<String>,
    mut try_refit: impl FnMut(&Candidate) -> Result<Refit, String>,
) -> Result<(usize, Refit), Vec<String>> {
    let order = (wanted..bt.ranking.len()).chain(0..wanted);
    let mut reasons = Vec::new();
    for row in order {
        let candidate = &bt.ranking[row].candidate;
        match try_refit(candidate) {
            Ok(refit) => {
                if row != wanted {
                    notes.push(format!(
                        "{} could not be refitted on all the data ({}); the forecast uses {}, \
                         the next method in the Backtest ranking that could",
                        bt.ranking[wanted].candidate.label(),
                        reasons.first().map_or("", String::as_str),
                        candidate.label()
                    ));
                }
                return Ok((row, refit));
            }
            Err(reason) => reasons.push(reason),
        }
    }
    Err(reasons)
}

/// Refits a candidate on all data; a combination through [`backtest::combine_point`], the
/// rule the backtest scored it with.
fn refit(
    candidate: &Candidate,
    history: &[f64],
    recent: usize,
    seasons: Seasons,
    horizon: usize,
) -> Result<Refit, String> {
    let fit = |kind: &MethodKind| {
        methods::fit(*kind, history, seasons.for_method(*kind), horizon).map_err(|e| e.to_string())
    };
    let members = candidate.members();
    // The AICc method chooses on the `recent` periods, as the ranking does, and the model it
    // chose is fitted on all of them. When those are all, a member that is one of the models
    // it fitted, with the same season, takes that fit rather than a second, identical one.
    let (each, by_aicc) = if members.contains(&MethodKind::SmoothingByAicc) {
        let window = &history[history.len() - recent.min(history.len())..];
        let each = criterion::fit_each(window, seasons.accepted_length(), horizon);
        let chosen = criterion::choose(&each, window).map_err(|e| e.to_string())?;
        if window.len() == history.len() {
            (each, Some(chosen))
        } else {
            let whole = methods::fit(chosen.kind(), history, seasons.accepted_length(), horizon)
                .map_err(|e| e.to_string())?;
            (Vec::new(), Some(whole))
        }
    } else {
        (Vec::new(), None)
    };
    let fits = members
        .iter()
        .map(|kind| match kind {
            MethodKind::SmoothingByAicc => by_aicc
                .clone()
                .ok_or_else(|| "no exponential smoothing model could be fitted".to_string()),
            _ => match each
                .iter()
                .find(|(k, _)| k == kind && seasons.for_method(*kind) == seasons.accepted_length())
            {
                Some((_, done)) => done.clone().map_err(|e| e.to_string()),
                None => fit(kind),
            },
        })
        .collect::<Result<Vec<_>, _>>()?;
    // A combination's error is the mean of its members' errors: so are its weights, each
    // member's error taken as made of the same one-step errors (an approximation).
    let mut psi = vec![0.0; horizon];
    for f in &fits {
        let weights = methods::psi_weights(f, seasons.for_method(f.kind()), horizon);
        for (sum, w) in psi.iter_mut().zip(weights) {
            *sum += w / fits.len() as f64;
        }
    }
    if let (Candidate::Method(_), Some(f)) = (candidate, fits.first()) {
        return Ok(Refit {
            point: f.forecast().to_vec(),
            fitted: f.fitted().to_vec(),
            fitted_by_all: f.fitted().to_vec(),
            variance: f.variance().map(<[f64]>::to_vec),
            fitted_as: Candidate::Method(f.kind()),
            psi,
        });
    }
    let forecasts: Vec<Vec<f64>> = fits.iter().map(|f| f.forecast().to_vec()).collect();
    let fitted_by_all = (0..history.len())
        .map(|t| backtest::combine_point(fits.iter().map(|f| f.fitted()[t])))
        .collect();
    let fitted = (0..history.len())
        .map(|t| {
            let present: Vec<f64> = fits.iter().filter_map(|f| f.fitted()[t]).collect();
            (!present.is_empty()).then(|| present.iter().sum::<f64>() / present.len() as f64)
        })
        .collect();
    Ok(Refit {
        point: backtest::combine_forecasts(&forecasts, horizon),
        fitted,
        fitted_by_all,
        // A combination has no analytic variance: its band comes from rolling-origin errors.
        variance: None,
        fitted_as: Candidate::Combination(fits.iter().map(Fitted::kind).collect()),
        psi,
    })
}

fn mean_abs_residual(fitted: &[Option<f64>], history: &[f64]) -> Option<f64> {
    let errors: Vec<f64> = fitted
        .iter()
        .zip(history)
        .filter_map(|(f, d)| f.map(|f| (f - d).abs()))
        .collect();
    (!errors.is_empty()).then(|| errors.iter().sum::<f64>() / errors.len() as f64)
}
