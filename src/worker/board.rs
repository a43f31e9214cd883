//! The Item board's work in the worker: a batch of items planned with their Stock plans
//! ([`morrowcast_engine::order::plan_order`], as the command line's `stock`), each boiled down
//! to the row the board shows and the order plan exports; with the Look-back asked for, the
//! plan of some periods ago against what sold since too (as the command line's `look-back`).
//!
//! Kept apart from: the page (it only shows rows) and the one-item detail (desk.rs keeps the
//! whole plan; a board row holds only what a row shows, so a file of 10,000 items fits).

use serde::{Deserialize, Serialize};

use morrowcast_engine::alerts::Alert;
use morrowcast_engine::backtest::Candidate;
use morrowcast_engine::calendar::{Frequency, Period};
use morrowcast_engine::intake::StockRow;
use morrowcast_engine::lookback::{look_back, LookBack};
use morrowcast_engine::order::{plan_order, ItemOrder, OrderError};
use morrowcast_engine::plan::ItemPlan;
use morrowcast_engine::series::Series;
use morrowcast_engine::settings::PlanSettings;
use morrowcast_engine::stock::{StockPlan, StockText, Target};

/// One item to plan for the board.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct BoardItem {
    /// Its place in the file (the board's rows keep the file's order by it).
    pub index: usize,
    pub series: Series,
    /// Its own plan settings (a season or method set for it alone); `None`: the file's.
    pub settings: Option<PlanSettings>,
    /// Its row of the stock table, with the board's per-item changes applied.
    pub row: Option<StockRow>,
}

/// A batch of items, all with the file's settings unless they carry their own.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct BoardAsk {
    /// The board's run this batch belongs to: rows of an older run are dropped.
    pub ticket: u64,
    pub settings: PlanSettings,
    /// The file's stock settings as typed (checked again here: a validated type is rebuilt
    /// by its constructor, never trusted off the wire).
    pub stock: StockText,
    /// Whether a stock table was given (an item without a row then gets a note).
    pub table_given: bool,
    /// Periods to look back over (the Look-back: the plan of then against what sold since);
    /// 0: none.
    pub look_back: usize,
    /// The file's last period: the Look-back counts back from it, and an item whose data ends
    /// before it gets no stock figures (`None`: each item's own end).
    pub file_end: Option<Period>,
    pub items: Vec<BoardItem>,
}

/// The figures of one row.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct BoardFigures {
    /// "smooth", "erratic", "intermittent" or "lumpy".
    pub demand_class: String,
    /// The season length the plan used (accepted, or set by the user).
    pub season: Option<usize>,
    /// "up", "down" or "none".
    pub trend: String,
    /// The chosen method's published name.
    pub method: String,
    /// The same, short enough for a narrow column (a combination by its number of members).
    pub method_short: String,
    /// The chosen method's MASE in the backtest (pooled over its origins, as the ranking).
    pub mase: Option<f64>,
    /// The chosen method's bias (sum of errors) over the holdout of its Error ledger, the one
    /// the tracking signal divides by the ledger's MAD.
    pub bias: f64,
    /// The tracking signal at the end of the holdout, and whether it is beyond its limit.
    pub tracking_signal: Option<f64>,
    pub tracking_beyond: bool,
    /// Periods of history.
    pub history: usize,
    /// The next period's forecast and its band.
    pub next: f64,
    pub next_lower: f64,
    pub next_upper: f64,
    /// The band's level in percent.
    pub level: f64,
    /// Why the item needs attention, if it does (standing with or without stock figures).
    pub alerts: Vec<Alert>,
    /// The stock figures, or why there are none (a new item's history too short for their
    /// spread): the plan and its alerts stand either way.
    pub stock: Result<BoardStock, NoStock>,
}

/// Why a row has no stock figures, with the stock the user gave for the item: the order plan
/// keeps on hand and on order beside why, as the user will still count them. Shown as why.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct NoStock {
    pub why: String,
    pub on_hand: Option<f64>,
    pub on_order: Option<f64>,
}

impl std::fmt::Display for NoStock {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.why)
    }
}

/// The stock figures of a row.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct BoardStock {
    /// Continuous (reorder point) or periodic (order-up-to level) review.
    pub periodic: bool,
    pub lead_time: usize,
    pub review_period: Option<usize>,
    pub protection_periods: usize,
    /// "normal" or "empirical".
    pub distribution: String,
    pub demand_over_protection: f64,
    pub sd_over_protection: f64,
    /// The target as set.
    pub target: Target,
    pub safety_stock: f64,
    /// The reorder point or the order-up-to level.
    pub level_units: f64,
    pub on_hand: Option<f64>,
    pub on_order: Option<f64>,
    pub suggested_order: Option<f64>,
    pub cycle_service_level: f64,
    pub fill_rate: f64,
    /// The Stock plan's notes.
    pub notes: Vec<String>,
    /// How often the item's periods come (the protection interval is said in them).
    pub frequency: Frequency,
}

impl BoardStock {
    fn new(stock: &StockPlan, frequency: Frequency) -> BoardStock {
        let f = &stock.figures;
        BoardStock {
            periodic: stock.settings.review_period().is_some(),
            lead_time: stock.settings.lead_time(),
            review_period: stock.settings.review_period(),
            protection_periods: stock.protection_periods,
            distribution: stock.distribution.key().to_string(),
            demand_over_protection: stock.demand_over_protection,
            sd_over_protection: stock.sd_over_protection,
            target: stock.settings.target(),
            safety_stock: f.safety_stock,
            level_units: f.level,
            on_hand: stock.position.map(|p| p.on_hand),
            on_order: stock.position.map(|p| p.on_order),
            suggested_order: stock.suggested_order,
            cycle_service_level: f.cycle_service_level,
            fill_rate: f.fill_rate,
            notes: stock.notes.clone(),
            frequency,
        }
    }
}

/// One row of the board: an item and its figures, or why it has none.
#[derive(Clone, Debug, PartialEq, Serialize, Deserialize)]
pub struct BoardRow {
    pub index: usize,
    /// The ticket of the board's run it was made in (a new run's row is a new row to show).
    pub run: u64,
    pub name: String,
    pub figures: Result<BoardFigures, String>,
    /// The Look-back, when asked for: the plan of then against what sold, or why there is none
    /// (made whether or not today's figures could be: a new item's plan of then may stand where
    /// today's Stock plan cannot).
    pub look_back: Option<Result<LookBack, String>>,
}

impl BoardFigures {
    /// The row's figures from an item's plan, its alerts and its Stock plan or why it has none.
    pub fn new(
        plan: &ItemPlan,
        alerts: &[Alert],
        stock: Result<&StockPlan, NoStock>,
    ) -> BoardFigures {
        let scored = plan
            .backtest
            .ranking
            .iter()
            .find(|r| r.candidate == plan.chosen);
        let last = plan.ledger.last().map(|e| &e.row);
        let tracking_signal = last.and_then(|r| r.tracking_signal);
        let next = plan.forecast.first().map(|f| f.band);
        BoardFigures {
            demand_class: plan.demand.class.as_str().to_string(),
            season: plan.season.length,
            trend: plan.trend.direction.as_str().to_string(),
            method: plan.chosen.label(),
            method_short: match &plan.chosen {
                Candidate::Combination(members) => format!("Combination of {}", members.len()),
                Candidate::Method(_) => plan.chosen.label(),
            },
            mase: scored.and_then(|s| s.measures.mase),
            // The Error ledger's, as the tracking signal beside it (its bias over its MAD):
            // the backtest's bias pooled over its origins had stood beside the ledger's
            // tracking signal, two columns no one could reconcile (a review: -11.7 beside
            // -6.6 with a ledger's MAD of 6.2).
            bias: last.map_or_else(|| scored.map_or(0.0, |s| s.measures.bias), |r| r.bias),
            tracking_signal,
            tracking_beyond: last.is_some_and(|r| r.out_of_limits),
            history: plan.history.len(),
            next: next.map_or(f64::NAN, |b| b.value),
            next_lower: next.map_or(f64::NAN, |b| b.low),
            next_upper: next.map_or(f64::NAN, |b| b.high),
            level: plan.level.percent(),
            alerts: alerts.to_vec(),
            stock: stock.map(|s| BoardStock::new(s, plan.frequency())),
        }
    }

    /// The row's figures from an item's order, or from a plan without stock figures (the
    /// plan and alerts stand, with the stock table's `row` for the item); `Err` when the item
    /// has no plan at all.
    pub fn of(
        order: Result<ItemOrder, OrderError>,
        row: Option<&StockRow>,
    ) -> Result<BoardFigures, String> {
        match order {
            Ok(order) => Ok(BoardFigures::new(
                &order.plan,
                &order.alerts,
                Ok(&order.stock),
            )),
            Err(OrderError::NoStockFigures { why, plan, alerts }) => {
                // As a Stock plan takes them: on order counts (0 when blank) only beside
                // an on hand.
                let on_hand = row.and_then(|r| r.on_hand);
                let none = NoStock {
                    why: why.to_string(),
                    on_hand,
                    on_order: on_hand.map(|_| row.and_then(|r| r.on_order).unwrap_or(0.0)),
                };
                Ok(BoardFigures::new(&plan, &alerts, Err(none)))
            }
            Err(e) => Err(e.to_string()),
        }
    }
}

/// Plans every item of a batch, in order.
pub fn answer_board(ask: &BoardAsk) -> Vec<BoardRow> {
    let defaults = ask.stock.check();
    ask.items
        .iter()
        .map(|item| {
            let settings = item.settings.as_ref().unwrap_or(&ask.settings);
            let series = &item.series;
            let (figures, look_back) = match &defaults {
                Err(errors) => {
                    let why = errors
                        .iter()
                        .map(|e| e.message.as_str())
                        .collect::<Vec<_>>()
                        .join("; ");
                    (Err(why.clone()), (ask.look_back > 0).then_some(Err(why)))
                }
                Ok(defaults) => (
                    BoardFigures::of(
                        plan_order(
                            series,
                            settings,
                            defaults,
                            item.row.as_ref(),
                            ask.table_given,
                            ask.file_end,
                        ),
                        item.row.as_ref(),
                    ),
                    (ask.look_back > 0).then(|| {
                        look_back(
                            series,
                            settings,
                            defaults,
                            item.row.as_ref(),
                            ask.look_back,
                            ask.file_end,
                        )
                        .map_err(|e| e.to_string())
                    }),
                ),
            };
            BoardRow {
                index: item.index,
                run: ask.ticket,
                name: series.name().to_string(),
                figures,
                look_back,
            }
        })
        .collect()
}
