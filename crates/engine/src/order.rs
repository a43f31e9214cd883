//! One item from its series to everything a planner's desk shows of it: the plan, its Stock
//! plan and its alerts. The command line's `stock` and the page's Item board both call
//! [`plan_order`], so their figures cannot drift apart.
//!
//! Kept apart from: how the plan, the figures and the alerts are made (plan.rs, stock/,
//! alerts.rs) and how they are shown or serialised (the front ends).

use std::fmt;

use crate::alerts::{alerts, Alert, AlertKind};
use crate::calendar::Period;
use crate::intake::{ends_before, StockRow};
use crate::plan::{default_horizon, plan_item, ItemPlan, PlanError};
use crate::series::Series;
use crate::settings::{PlanSettings, SettingError};
use crate::stock::{plan_stock, protection_periods_of, StockError, StockPlan, StockSettings};

/// An item's plan, Stock plan and alerts.
#[derive(Clone, Debug, PartialEq)]
pub struct ItemOrder {
    /// The ranked plan the figures come from.
    pub plan: ItemPlan,
    /// Safety stock, level, service and the order today.
    pub stock: StockPlan,
    /// Why the item needs attention, if it does.
    pub alerts: Vec<Alert>,
}

/// Why an item has no Stock plan.
#[derive(Clone, Debug, PartialEq)]
pub enum OrderError {
    /// The item could not be planned.
    Plan(PlanError),
    /// The item's stock settings failed.
    Stock(StockError),
    /// The item was planned, but its stock figures could not be worked out (too short a
    /// history for their spread, say): the plan and its alerts stand (a new item's row still
    /// shows its forecast and its "New item" alert).
    NoStockFigures {
        /// Why there are no figures.
        why: StockError,
        /// The plan, as [`ItemOrder::plan`].
        plan: Box<ItemPlan>,
        /// Its alerts, as [`ItemOrder::alerts`].
        alerts: Vec<Alert>,
    },
    /// A horizon the user set does not reach over the item's protection interval.
    HorizonShort {
        /// The horizon set.
        horizon: usize,
        /// The protection interval in periods.
        periods: usize,
    },
    /// The horizon could not be lengthened (see the message).
    Setting(SettingError),
    /// The item's data ends before the file's last period: what it sold since is not known,
    /// so a plan from its own end would forecast periods already past as if they were next.
    EndsEarly {
        /// Its last period with data.
        last: Period,
        /// The file's last period.
        file_end: Period,
    },
}

impl fmt::Display for OrderError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            OrderError::Plan(e) => e.fmt(f),
            OrderError::Stock(e) | OrderError::NoStockFigures { why: e, .. } => e.fmt(f),
            OrderError::HorizonShort { horizon, periods } => write!(
                f,
                "the horizon of {horizon} periods is shorter than this item's protection \
                 interval of {periods} periods: lengthen the horizon or leave it automatic"
            ),
            OrderError::Setting(e) => e.fmt(f),
            OrderError::EndsEarly { last, file_end } => {
                let behind = last.steps_to(*file_end);
                let (one, many) = last.frequency().period_words();
                write!(
                    f,
                    "its data ends at {last}, {behind} {} before the file's last period \
                     ({file_end}), and what it sold since is not known: planned from its own \
                     end, it is forecast from {} on as if that were next. If its rows since \
                     are missing from the file, add them; if it sold nothing since, write 0 \
                     for those periods; if it is no longer sold, leave it out",
                    if behind == 1 { one } else { many },
                    last.next()
                )
            }
        }
    }
}

impl std::error::Error for OrderError {}

/// The note on an item whose order is held back: no demand for longer than ever before.
pub const HELD_ORDER_NOTE: &str =
    "no order is suggested: no demand for longer than any quiet run before (see its alert), \
     so the forecast still leans on sales that have stopped; if it still sells, or its \
     shelf was empty, decide the order yourself";

/// The note on a sparse seasonal item whose protected periods sold nothing in any past season.
pub const QUIET_SEASON_NOTE: &str =
    "no order is suggested: the periods this level protects sold nothing at this time of year \
     in any past season, and the level comes from totals over every time of year; order ahead \
     of its busy periods by its season (the Look-ahead and the Pattern view show it)";

/// Whether a sparse item with an accepted season of m sold nothing, in every past season of
/// at least two, at each of the next `periods` places of its season: the positions t - m,
/// t - 2m, ... of each coming period t.
fn quiet_in_every_season(plan: &ItemPlan, periods: usize) -> bool {
    let (Some(m), true) = (plan.season.length, plan.demand.class.is_sparse()) else {
        return false;
    };
    let n = plan.history.len();
    if periods == 0 || m < 2 || n < 2 * m {
        return false;
    }
    (n..n + periods).all(|t| {
        let past: Vec<f64> = (1..)
            .map(|k| t.checked_sub(k * m))
            .take_while(Option::is_some)
            .flatten()
            .map(|i| plan.history[i])
            .collect();
        past.len() >= 2 && past.iter().all(|v| *v == 0.0)
    })
}

/// The note on an item with no row in a stock table that was given.
pub const NO_ROW_NOTE: &str =
    "no row in the stock table: on hand unknown, so no order is suggested";

/// The note on an item whose stock-table row gives no on hand.
pub const NO_ON_HAND_NOTE: &str =
    "its row in the stock table gives no on hand, so no order is suggested";

/// [`OrderError::EndsEarly`] when `series` ends before `file_end` (the file's last period,
/// by [`crate::intake::ends_before`]): behind the board's and the command line's refusal and
/// the page's notice.
pub fn ends_early(series: &Series, file_end: Option<Period>) -> Option<OrderError> {
    let last = series.period(series.len() - 1);
    file_end
        .filter(|end| ends_before(last, *end))
        .map(|file_end| OrderError::EndsEarly { last, file_end })
}

/// Plans one item and works out its Stock plan and alerts.
///
/// `defaults` are the file's stock settings; `row` the item's row of the stock table, whose
/// values replace them ([`StockSettings::for_row`]); `table_given` whether a stock table was
/// given at all (an item missing from one gets a note); `file_end` the file's last period
/// ([`crate::intake::IntakeReport::last_period`]): an item whose data ends before it is
/// refused ([`OrderError::EndsEarly`]), `None` plans every item from its own end. An
/// automatic horizon shorter than the protection interval is lengthened to it; a horizon the
/// user set must reach it.
pub fn plan_order(
    series: &Series,
    settings: &PlanSettings,
    defaults: &StockSettings,
    row: Option<&StockRow>,
    table_given: bool,
    file_end: Option<Period>,
) -> Result<ItemOrder, OrderError> {
    if let Some(early) = ends_early(series, file_end) {
        return Err(early);
    }
    let stock_settings = match row {
        Some(row) => defaults.for_row(row).map_err(OrderError::Stock)?,
        None => defaults.clone(),
    };
    let periods = stock_settings.protection_periods();
    let plan_settings = match settings.horizon() {
        None if default_horizon(series.frequency()) < periods => settings
            .clone()
            .with_horizon(Some(periods as u64))
            .map_err(OrderError::Setting)?,
        Some(horizon) if horizon < periods => {
            return Err(OrderError::HorizonShort { horizon, periods })
        }
        _ => settings.clone(),
    };
    let mut plan = plan_item(series, &plan_settings).map_err(OrderError::Plan)?;
    // Shut periods right after now lengthen the protection interval (known once planned).
    let needed = protection_periods_of(&plan, &stock_settings);
    if plan.forecast.len() < needed {
        match settings.horizon() {
            None => {
                let longer = settings
                    .clone()
                    .with_horizon(Some(needed as u64))
                    .map_err(OrderError::Setting)?;
                plan = plan_item(series, &longer).map_err(OrderError::Plan)?;
            }
            Some(horizon) => {
                return Err(OrderError::HorizonShort {
                    horizon,
                    periods: needed,
                })
            }
        }
    }
    let alerts = alerts(&plan, series);
    let mut stock = match plan_stock(&plan, &stock_settings) {
        Ok(stock) => stock,
        Err(why) => {
            return Err(OrderError::NoStockFigures {
                why,
                plan: Box::new(plan),
                alerts,
            })
        }
    };
    if table_given && row.is_none() {
        stock.notes.push(NO_ROW_NOTE.to_string());
    }
    if row.is_some_and(|r| r.on_hand.is_none()) {
        stock.notes.push(NO_ON_HAND_NOTE.to_string());
    }
    // An item without demand for longer than any quiet run before (possibly discontinued)
    // still forecasts from its past, slowly let down: an order from that is not one to
    // place unread (a review found 30 suggested for an item unsold for 8 months).
    if stock.suggested_order.is_some() && alerts.iter().any(|a| a.kind == AlertKind::NoRecentDemand)
    {
        stock.suggested_order = None;
        stock.notes.push(HELD_ORDER_NOTE.to_string());
    }
    // A sparse seasonal item's level pools every time of year (its Stock plan's note): where
    // the periods it protects sold nothing in any past season, an order from that level is
    // not one to place unread (a review found 56 holly wreaths suggested for a January).
    if stock.suggested_order.is_some() && quiet_in_every_season(&plan, stock.protection_periods) {
        stock.suggested_order = None;
        stock.notes.push(QUIET_SEASON_NOTE.to_string());
    }
    Ok(ItemOrder {
        plan,
        stock,
        alerts,
    })
}
