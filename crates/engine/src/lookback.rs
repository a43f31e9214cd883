//! The Look-back: how the plan made some periods ago did against what sold since.
//!
//! The engine is deterministic, so the plan a planner saw `k` periods ago is the plan of the
//! history without its last `k` periods, under the same settings ([`look_back`] makes it with
//! [`plan_order`], the one rule behind the Item board and `morrowcast stock`). Each period since
//! is set against that plan's forecast and band; the Stock plan's reorder point (or order-up-to
//! level) against the demand over its protection interval, once that interval has passed: the
//! held-out check of the figures an order was based on. [`LookBackTally`] counts a whole file.
//!
//! Kept apart from: how a plan and its figures are made (plan.rs, stock/, order.rs) and how the
//! result is shown (the front ends). What stock was on hand then is not known (the stock table
//! is today's), so the order of that day is not judged, only whether its level would have held.

use std::fmt;

use crate::bands::{BandPoint, Level};
use crate::calendar::Period;
use crate::intake::StockRow;
use crate::order::{plan_order, OrderError};
use crate::plan::{plan_item, ForecastPoint, MIN_PERIODS};
use crate::series::Series;
use crate::settings::{PlanSettings, SettingError};
use crate::stock::{counts_whole_units, StockPlan, StockSettings};

/// The most periods the page's Look-back (and a work carrying one) looks back over: our
/// choice, two years of months; further back the plan of then is no longer the question. The
/// command line's `look-back` takes any number the history allows.
pub const MOST_PERIODS_SHOWN: usize = 24;

/// Why an item has no Look-back.
#[derive(Clone, Debug, PartialEq)]
pub enum LookBackError {
    /// Looking back no periods compares nothing.
    NoPeriods,
    /// The history is not longer than the periods to look back over.
    TooFewPeriods {
        /// Periods asked for.
        asked: usize,
        /// Periods the history holds.
        held: usize,
    },
    /// The item's data ends before the periods looked back over.
    EndedBefore {
        /// Its last period with data.
        last: Period,
    },
    /// The horizon could not be lengthened to the periods asked for.
    Setting(SettingError),
    /// The earlier history could not be planned.
    Order(OrderError),
}

impl fmt::Display for LookBackError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            LookBackError::NoPeriods => {
                write!(f, "look back at least 1 period: 0 periods compare nothing")
            }
            LookBackError::TooFewPeriods { held, .. } if *held <= MIN_PERIODS => write!(
                f,
                "this item's {held} periods are too few to look back on: a plan needs at least \
                 {MIN_PERIODS} before the periods looked back over"
            ),
            LookBackError::TooFewPeriods { asked, held } => write!(
                f,
                "looking back {asked} periods leaves too little history to plan: this item's \
                 {held} periods allow a look back of at most {}",
                held - MIN_PERIODS
            ),
            LookBackError::EndedBefore { last } => write!(
                f,
                "this item's data ends at {last}, before the periods looked back over, so \
                 nothing sold since is recorded to compare with: look back further to reach its \
                 data, or, if it no longer sells, write its periods since as 0 in the file"
            ),
            LookBackError::Setting(e) => e.fmt(f),
            LookBackError::Order(e) => write!(f, "the plan of then: {e}"),
        }
    }
}

impl std::error::Error for LookBackError {}

/// One period since the plan: its forecast and band then, and what sold.
#[derive(Clone, Copy, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct LookBackStep {
    /// The period.
    pub period: Period,
    /// The forecast and band the plan gave it.
    pub band: BandPoint,
    /// What sold (`None`: a gap in the data).
    pub actual: Option<f64>,
    /// A shut place of the item's season (forecast 0 then): not counted as a hit of the band.
    pub shut: bool,
    /// Beyond the plan's horizon: forecast by the same plan made with a longer one.
    pub extended: bool,
    /// After the item's data ends (the file runs on, its figures do not): nothing recorded,
    /// which is not a gap inside its history.
    pub ended: bool,
}

/// What a period since came to against its band.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Outcome {
    /// What sold lay within the band (ends included).
    Within,
    /// Below its low end.
    Below,
    /// Above its high end.
    Above,
    /// A shut place (forecast 0): not a test of the band.
    Shut,
    /// A gap in the data.
    Gap,
    /// After the item's data ends: nothing recorded since.
    Ended,
}

impl LookBackStep {
    /// e = F - D (positive: the plan forecast more than sold); `None` for a gap.
    pub fn error(&self) -> Option<f64> {
        self.actual.map(|d| self.band.value - d)
    }

    /// What the period came to: the one rule every front end words in its own way.
    pub fn outcome(&self) -> Outcome {
        match self.actual {
            None if self.ended => Outcome::Ended,
            None => Outcome::Gap,
            Some(_) if self.shut => Outcome::Shut,
            Some(d) if d < self.band.low => Outcome::Below,
            Some(d) if d > self.band.high => Outcome::Above,
            Some(_) => Outcome::Within,
        }
    }

    /// Whether what sold lies within the band; `None` for a gap and for a shut period.
    pub fn within(&self) -> Option<bool> {
        match self.outcome() {
            Outcome::Gap | Outcome::Shut | Outcome::Ended => None,
            Outcome::Within => Some(true),
            Outcome::Below | Outcome::Above => Some(false),
        }
    }
}

/// The Stock plan's level then against the demand over its protection interval since.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub enum StockCheck {
    /// The protection interval has passed.
    Checked {
        /// P, the protection interval in periods.
        periods: usize,
        /// Whether the level is an order-up-to level (periodic review), not a reorder point.
        periodic: bool,
        /// The reorder point (continuous review) or order-up-to level (periodic) of then.
        level: f64,
        /// The history counts whole units ([`counts_whole_units`]): the stock an order brings
        /// reaches the level rounded up, which is what the demand is set against.
        whole_units: bool,
        /// The demand over P the plan expected.
        expected: f64,
        /// The demand over P that came.
        demand: f64,
        /// The cycle service level the level was set for, Phi(k) (for a fill-rate target,
        /// the cycle service it implied).
        promised: f64,
    },
    /// Fewer periods have passed than the protection interval.
    TooSoon {
        /// P, the protection interval in periods.
        periods: usize,
        /// Periods since the plan.
        passed: usize,
    },
    /// No protection interval (continuous review with no lead time): nothing to cover.
    NoInterval,
    /// The plan of then had no Stock plan (why, as the Item board said it).
    NoFigures(String),
    /// A gap in the sales within the protection interval.
    Gap {
        /// P, the protection interval in periods.
        periods: usize,
    },
    /// The protection interval reaches past the item's data (nothing recorded there).
    AfterData {
        /// P, the protection interval in periods.
        periods: usize,
    },
}

impl StockCheck {
    /// Its name where the front ends write it (the command line's JSON, the page's CSV).
    pub fn key(&self) -> &'static str {
        match self {
            StockCheck::Checked { .. } => "checked",
            StockCheck::TooSoon { .. } => "too_soon",
            StockCheck::NoInterval => "no_interval",
            StockCheck::NoFigures(_) => "no_figures",
            StockCheck::Gap { .. } => "gap",
            StockCheck::AfterData { .. } => "after_data",
        }
    }

    /// P, where the plan of then had one to check over.
    pub fn protection_periods(&self) -> Option<usize> {
        match *self {
            StockCheck::Checked { periods, .. }
            | StockCheck::TooSoon { periods, .. }
            | StockCheck::Gap { periods }
            | StockCheck::AfterData { periods } => Some(periods),
            StockCheck::NoInterval | StockCheck::NoFigures(_) => None,
        }
    }

    /// How far the demand over P went beyond the level (0 when covered; `None` when not
    /// checked). With whole units the level counts rounded up: 71 sold against a level of
    /// 70.92 is covered, as the 71 units an order brings cover it.
    pub fn shortfall(&self) -> Option<f64> {
        self.stocked_less_demand().map(|d| (-d).max(0.0))
    }

    /// How far the level went beyond the demand over P (0 when short; `None` when not
    /// checked), the level counted as [`StockCheck::shortfall`] counts it: what was left on
    /// the shelf then, so a level far above what sold is seen, not only one below it.
    pub fn spare(&self) -> Option<f64> {
        self.stocked_less_demand().map(|d| d.max(0.0))
    }

    /// The level as stocked (rounded up with whole units) less the demand over P.
    fn stocked_less_demand(&self) -> Option<f64> {
        match *self {
            StockCheck::Checked {
                level,
                demand,
                whole_units,
                ..
            } => {
                let stocked = if whole_units { level.ceil() } else { level };
                Some(stocked - demand)
            }
            _ => None,
        }
    }

    /// Whether the level covered the demand over P (`None` when not checked).
    pub fn covered(&self) -> Option<bool> {
        self.shortfall().map(|short| short == 0.0)
    }
}

/// How the plan made `k` periods ago did, for one item.
#[derive(Clone, Debug, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct LookBack {
    /// The item's name.
    pub name: String,
    /// The last period the plan saw.
    pub made_after: Period,
    /// The label of the method the plan chose then.
    pub method: String,
    /// The band level.
    pub level: Level,
    /// The periods since, oldest first.
    pub steps: Vec<LookBackStep>,
    /// The Stock plan's level against the demand since.
    pub stock: StockCheck,
}

impl LookBack {
    /// The periods whose sales are known, shut ones left out (a 0 forecast met by a 0 sold
    /// says nothing of the band).
    pub fn known(&self) -> impl Iterator<Item = &LookBackStep> {
        self.steps.iter().filter(|s| s.within().is_some())
    }

    /// The periods since left out of [`LookBack::known`]: (gaps, shut periods); those after
    /// the item's data ends are [`LookBack::after_data`].
    pub fn left_out(&self) -> (usize, usize) {
        (self.count(Outcome::Gap), self.count(Outcome::Shut))
    }

    /// How many periods since lie after the item's data ends ([`LookBackStep::ended`]).
    pub fn after_data(&self) -> usize {
        self.count(Outcome::Ended)
    }

    fn count(&self, outcome: Outcome) -> usize {
        self.steps.iter().filter(|s| s.outcome() == outcome).count()
    }

    /// How many periods since lie beyond the plan's horizon ([`LookBackStep::extended`]).
    pub fn extended(&self) -> usize {
        self.steps.iter().filter(|s| s.extended).count()
    }

    /// How many known periods lay within the band.
    pub fn within(&self) -> usize {
        self.known().filter(|s| s.within() == Some(true)).count()
    }

    /// The forecast and the demand summed over the known periods.
    pub fn totals(&self) -> (f64, f64) {
        self.known().fold((0.0, 0.0), |(f, d), s| {
            (f + s.band.value, d + s.actual.unwrap_or(0.0))
        })
    }
}

/// Makes the plan of the file as it stood `periods` periods ago, as [`plan_order`] makes it now
/// (same settings, stock settings and stock table row), and sets each period since against it.
///
/// The periods are counted back from `file_end`, the file's last period
/// ([`crate::intake::IntakeReport::last_period`]; `None`: the series' own last period), so
/// every item of a file is looked back on from the same period: an item whose data ends before
/// the file's has gaps since. Trailing gaps the cut leaves are trimmed as in any history, so
/// the plan of then ends at its last known period and the periods since start after it. The plan keeps the settings' horizon (an automatic one as it was then, so its
/// bands and Stock plan are the ones shown then); periods since beyond it are forecast by the
/// same plan made with a horizon reaching them, and marked [`LookBackStep::extended`].
pub fn look_back(
    series: &Series,
    settings: &PlanSettings,
    defaults: &StockSettings,
    row: Option<&StockRow>,
    periods: usize,
    file_end: Option<Period>,
) -> Result<LookBack, LookBackError> {
    if periods == 0 {
        return Err(LookBackError::NoPeriods);
    }
    let last = series.period(series.len() - 1);
    let blank_after = last.steps_to(file_end.unwrap_or(last)).max(0) as u64;
    if blank_after >= periods as u64 {
        return Err(LookBackError::EndedBefore { last });
    }
    let blank_after = blank_after as usize;
    let mut values = series.values().to_vec();
    values.resize(series.len() + blank_after, None);
    let held = values.len();
    let too_few = LookBackError::TooFewPeriods {
        asked: periods,
        held,
    };
    if periods + MIN_PERIODS > held {
        return Err(too_few);
    }
    let earlier = Series::new(
        series.name(),
        series.start(),
        values[..held - periods].to_vec(),
    )
    .map_err(|_| too_few.clone())?;
    if earlier.len() < MIN_PERIODS {
        return Err(too_few);
    }
    let since = held - earlier.len();
    let plan_failed = |e| LookBackError::Order(OrderError::Plan(e));
    // A plan without a Stock plan (too short a history for its spread) is still looked back on.
    let (plan, stock_plan) = match plan_order(&earlier, settings, defaults, row, false, None) {
        Ok(order) => (order.plan, Ok(order.stock)),
        Err(OrderError::NoStockFigures { why, plan, .. }) => (*plan, Err(why.to_string())),
        Err(e) => return Err(LookBackError::Order(e)),
    };
    let mut forecast: Vec<(ForecastPoint, bool)> =
        plan.forecast.iter().map(|p| (*p, false)).collect();
    if forecast.len() < since {
        let longer = settings
            .clone()
            .with_horizon(Some(since as u64))
            .map_err(LookBackError::Setting)?;
        let extended = plan_item(&earlier, &longer).map_err(plan_failed)?;
        let shown = forecast.len();
        forecast.extend(extended.forecast.iter().skip(shown).map(|p| (*p, true)));
    }
    let steps: Vec<LookBackStep> = forecast
        .iter()
        .zip(&values[earlier.len()..])
        .enumerate()
        .map(|(i, ((point, extended), actual))| LookBackStep {
            period: point.period,
            band: point.band,
            actual: *actual,
            shut: plan.demand.is_shut(earlier.len() + i),
            extended: *extended,
            ended: earlier.len() + i >= series.len(),
        })
        .collect();
    let stock = match stock_plan {
        Ok(stock) => stock_check(&steps, &stock, counts_whole_units(&plan)),
        Err(why) => StockCheck::NoFigures(why),
    };
    Ok(LookBack {
        name: series.name().to_string(),
        made_after: earlier.period(earlier.len() - 1),
        method: plan.chosen.label(),
        level: plan.level,
        steps,
        stock,
    })
}

/// The Stock plan's level against the demand over the first P periods since.
fn stock_check(steps: &[LookBackStep], stock: &StockPlan, whole_units: bool) -> StockCheck {
    let stock_periods = stock.protection_periods;
    if stock_periods == 0 {
        StockCheck::NoInterval
    } else if steps.len() < stock_periods {
        StockCheck::TooSoon {
            periods: stock_periods,
            passed: steps.len(),
        }
    } else {
        let window = &steps[..stock_periods];
        match window.iter().map(|s| s.actual).sum::<Option<f64>>() {
            None if window.iter().any(|s| s.ended) => StockCheck::AfterData {
                periods: stock_periods,
            },
            None => StockCheck::Gap {
                periods: stock_periods,
            },
            Some(demand) => StockCheck::Checked {
                periods: stock_periods,
                periodic: stock.settings.review_period().is_some(),
                level: stock.figures.level,
                whole_units,
                expected: stock.demand_over_protection,
                demand,
                promised: stock.figures.cycle_service_level,
            },
        }
    }
}

/// A whole file's Look-back in a few counts: how often the bands held, how often the stock
/// levels covered the demand, against what they promised.
#[derive(Clone, Copy, Debug, Default, PartialEq)]
#[cfg_attr(feature = "serde", derive(serde::Serialize, serde::Deserialize))]
pub struct LookBackTally {
    /// Items counted.
    pub items: usize,
    /// Known periods over every item.
    pub periods: usize,
    /// Of those, within their band.
    pub within: usize,
    /// Items whose protection interval has passed.
    pub stock_checked: usize,
    /// Of those, covered by their level.
    pub covered: usize,
    /// The sum of their promised cycle service levels (their mean: this over `stock_checked`).
    pub promised_sum: f64,
}

impl LookBackTally {
    /// Counts one item in.
    pub fn add(&mut self, item: &LookBack) {
        self.items += 1;
        self.periods += item.known().count();
        self.within += item.within();
        if let StockCheck::Checked { promised, .. } = item.stock {
            self.stock_checked += 1;
            self.promised_sum += promised;
            if item.stock.covered() == Some(true) {
                self.covered += 1;
            }
        }
    }

    /// The share of known periods within their band (`None` without one).
    pub fn within_share(&self) -> Option<f64> {
        (self.periods > 0).then(|| self.within as f64 / self.periods as f64)
    }

    /// The share of checked items whose level covered the demand.
    pub fn covered_share(&self) -> Option<f64> {
        (self.stock_checked > 0).then(|| self.covered as f64 / self.stock_checked as f64)
    }

    /// The mean cycle service level the checked items' levels promised.
    pub fn promised(&self) -> Option<f64> {
        (self.stock_checked > 0).then(|| self.promised_sum / self.stock_checked as f64)
    }
}
