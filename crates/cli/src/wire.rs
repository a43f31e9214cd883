//! The wire boundary: the JSON shapes of the command line's contract.
//!
//! Kept apart from: the engine's own types (they derive serde only for the browser worker's
//! bincode messages, src/worker.rs, which are not a contract). Only this module writes JSON, so
//! the contract's names live in one place. A measure that is not available (MAPE with zero demand)
//! is `null`, never infinity.

use serde::Serialize;

use morrowcast_engine::alerts::Alert;
use morrowcast_engine::backtest::{Candidate, Scored};
use morrowcast_engine::intake::IntakeReport;
use morrowcast_engine::lookback::{LookBack, LookBackTally, StockCheck};
use morrowcast_engine::plan::ItemPlan;
use morrowcast_engine::stock;

/// `morrowcast inspect --json`.
#[derive(Serialize, Debug)]
pub struct InspectJson {
    pub delimiter: &'static str,
    pub decimal: &'static str,
    pub frequency: &'static str,
    pub layout: &'static str,
    pub date_format: Option<String>,
    pub gaps_filled: usize,
    /// The last period when it looks unfinished (a warning says why), else null.
    pub unfinished_last: Option<String>,
    pub items: Vec<ItemJson>,
    pub warnings: Vec<String>,
    pub errors: Vec<ErrorJson>,
}

#[derive(Serialize, Debug)]
pub struct ItemJson {
    pub name: String,
    pub periods: Vec<String>,
    pub values: Vec<Option<f64>>,
}

#[derive(Serialize, Debug)]
pub struct ErrorJson {
    pub row: usize,
    pub column: String,
    pub text: String,
    pub message: String,
}

impl From<&IntakeReport> for InspectJson {
    fn from(r: &IntakeReport) -> Self {
        InspectJson {
            delimiter: r.delimiter.as_str(),
            decimal: r.decimal.as_str(),
            frequency: r.frequency.as_str(),
            layout: r.layout.as_str(),
            date_format: r.date_format.clone(),
            gaps_filled: r.gaps_filled,
            unfinished_last: r.unfinished_last.as_ref().map(|u| u.period.to_string()),
            items: r
                .items
                .iter()
                .map(|i| ItemJson {
                    name: i.name.clone(),
                    periods: i.periods.iter().map(ToString::to_string).collect(),
                    values: i.values.clone(),
                })
                .collect(),
            warnings: r.warnings.clone(),
            errors: r.errors.iter().map(ErrorJson::from).collect(),
        }
    }
}

impl From<&morrowcast_engine::intake::RowError> for ErrorJson {
    fn from(e: &morrowcast_engine::intake::RowError) -> Self {
        ErrorJson {
            row: e.row,
            column: e.column.clone(),
            text: e.text.clone(),
            message: e.message.clone(),
        }
    }
}

/// `morrowcast forecast --json`: `items` is a sequence of [`PlanJson`], `failed` one of
/// [`FailedJson`]. Generic so the command line can write the plans while it makes them (see
/// [`Streamed`]) instead of holding every plan of a large file in memory; the JSON is the same.
#[derive(Serialize, Debug)]
pub struct ForecastJson<'a, Items: Serialize, Failed: Serialize> {
    pub items: Items,
    /// Items that could not be planned, with the reason.
    pub failed: Failed,
    pub warnings: Vec<String>,
    /// `look-back` only: the file's counts ([`LookBackTallyJson`]), made once the items are
    /// written.
    #[serde(skip_serializing_if = "Option::is_none")]
    pub tally: Option<Later<'a>>,
}

/// A JSON value made when it is written (after the fields before it).
pub struct Later<'a>(pub Box<dyn Fn() -> serde_json::Value + 'a>);

impl Serialize for Later<'_> {
    fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        (self.0)().serialize(serializer)
    }
}

impl std::fmt::Debug for Later<'_> {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str("Later")
    }
}

/// A JSON sequence whose elements are made one at a time while it is written: `next` gives
/// each element in turn (`None` ends it). Made for one write.
pub struct Streamed<F>(pub std::cell::RefCell<F>);

impl<T: Serialize, F: FnMut() -> Option<T>> Serialize for Streamed<F> {
    fn serialize<S: serde::Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        use serde::ser::SerializeSeq;
        let mut seq = serializer.serialize_seq(None)?;
        let mut next = self.0.borrow_mut();
        while let Some(element) = next() {
            seq.serialize_element(&element)?;
        }
        seq.end()
    }
}

#[derive(Serialize, Debug)]
pub struct FailedJson {
    pub name: String,
    pub message: String,
    /// The alerts of an item planned without stock figures (a new item's "new_item").
    #[serde(skip_serializing_if = "Vec::is_empty")]
    pub alerts: Vec<AlertJson>,
    /// The same alerts as the text output says them ("New item (only 5 periods ...)").
    #[serde(skip)]
    pub alerts_said: Vec<String>,
}

#[derive(Serialize, Debug)]
pub struct PlanJson {
    pub name: String,
    /// Accepted season length; 1 when no season was accepted.
    pub season_length: usize,
    /// The season length the seasonal methods were tried with in the backtest where the test
    /// rejected the calendar's season on a short history (null otherwise; the notes say how
    /// they ranked).
    pub season_on_trial: Option<usize>,
    pub trend: &'static str,
    pub demand_class: &'static str,
    pub evidence: EvidenceJson,
    pub ranking: Vec<RankJson>,
    pub rank_by: &'static str,
    pub origins: usize,
    pub chosen: &'static str,
    pub chosen_label: String,
    pub combination_members: Vec<&'static str>,
    pub level: f64,
    pub band_method: &'static str,
    pub forecast: Vec<ForecastPointJson>,
    pub ledger: Vec<LedgerJson>,
    pub notes: Vec<String>,
}

#[derive(Serialize, Debug)]
pub struct EvidenceJson {
    pub season_candidate: Option<usize>,
    pub season_statistic: f64,
    pub season_threshold: f64,
    pub season_full_seasons: usize,
    /// Seasonal strength of the candidate (null without one or two full seasons of it).
    pub season_strength: Option<f64>,
    pub season_reason: String,
    pub trend_s: f64,
    pub trend_z: f64,
    pub trend_p_value: f64,
    pub adi: f64,
    pub cv2: f64,
}

#[derive(Serialize, Debug)]
pub struct RankJson {
    pub method: &'static str,
    pub label: String,
    pub mape: Option<f64>,
    pub rmse: f64,
    pub bias: f64,
    pub mase: Option<f64>,
    pub mad: f64,
}

#[derive(Serialize, Debug)]
pub struct ForecastPointJson {
    pub period: String,
    pub value: f64,
    pub low: f64,
    pub high: f64,
}

#[derive(Serialize, Debug)]
pub struct LedgerJson {
    pub period: String,
    pub demand: f64,
    pub forecast: f64,
    pub error: f64,
    pub abs_error: f64,
    pub sq_error: f64,
    pub pct_error: Option<f64>,
    pub mad: f64,
    pub mse: f64,
    pub rmse: f64,
    pub mape: Option<f64>,
    pub bias: f64,
    pub tracking_signal: Option<f64>,
    pub out_of_limits: bool,
}

fn rank_json(s: &Scored) -> RankJson {
    RankJson {
        method: s.candidate.key(),
        label: s.candidate.label(),
        mape: s.measures.mape,
        rmse: s.measures.rmse,
        bias: s.measures.bias,
        mase: s.measures.mase,
        mad: s.measures.mad,
    }
}

impl From<&ItemPlan> for PlanJson {
    fn from(p: &ItemPlan) -> Self {
        PlanJson {
            name: p.name.clone(),
            season_length: p.season.length.unwrap_or(1),
            season_on_trial: p.seasons.trial_length(),
            trend: p.trend.direction.as_str(),
            demand_class: p.demand.class.as_str(),
            evidence: EvidenceJson {
                season_candidate: p.season.candidate,
                season_statistic: p.season.statistic,
                season_threshold: p.season.threshold,
                season_full_seasons: p.season.full_seasons,
                season_strength: p.season.strength,
                season_reason: p.season.reason.clone(),
                trend_s: p.trend.s,
                trend_z: p.trend.z,
                trend_p_value: p.trend.p_value,
                adi: p.demand.adi,
                cv2: p.demand.cv2,
            },
            ranking: p.backtest.ranking.iter().map(rank_json).collect(),
            rank_by: p.backtest.rank_by.key(),
            origins: p.backtest.origins_used,
            chosen: p.chosen.key(),
            chosen_label: p.chosen.label(),
            combination_members: match &p.chosen {
                Candidate::Combination(m) => m.iter().map(|k| k.key()).collect(),
                Candidate::Method(_) => Vec::new(),
            },
            level: p.level.percent(),
            band_method: p.band.key(),
            forecast: p
                .forecast
                .iter()
                .map(|f| ForecastPointJson {
                    period: f.period.to_string(),
                    value: f.band.value,
                    low: f.band.low,
                    high: f.band.high,
                })
                .collect(),
            ledger: p
                .ledger
                .iter()
                .map(|e| LedgerJson {
                    period: e.period.to_string(),
                    demand: e.row.demand,
                    forecast: e.row.forecast,
                    error: e.row.error,
                    abs_error: e.row.abs_error,
                    sq_error: e.row.sq_error,
                    pct_error: e.row.pct_error,
                    mad: e.row.mad,
                    mse: e.row.mse,
                    rmse: e.row.rmse,
                    mape: e.row.mape,
                    bias: e.row.bias,
                    tracking_signal: e.row.tracking_signal,
                    out_of_limits: e.row.out_of_limits,
                })
                .collect(),
            notes: p.notes.clone(),
        }
    }
}

/// One item of `morrowcast stock --json`. Service levels are fractions; `reorder_point` is set
/// for continuous review and `order_up_to` for periodic review, the other `null`; `on_hand`,
/// `on_order` and `suggested_order` are `null` without a stock table row for the item.
#[derive(Serialize, Debug)]
pub struct StockItemJson {
    pub name: String,
    pub policy: &'static str,
    pub lead_time: usize,
    pub lead_time_sd: f64,
    pub review_period: Option<usize>,
    pub protection_periods: usize,
    pub distribution: &'static str,
    pub demand_over_protection: f64,
    pub sd_over_protection: f64,
    pub origins_used: usize,
    pub target: TargetJson,
    pub safety_factor: Option<f64>,
    pub safety_stock: f64,
    pub reorder_point: Option<f64>,
    pub order_up_to: Option<f64>,
    pub order_quantity: Option<f64>,
    pub on_hand: Option<f64>,
    pub on_order: Option<f64>,
    pub suggested_order: Option<f64>,
    pub expected_shortage: f64,
    pub cycle_service_level: f64,
    pub fill_rate: f64,
    /// Hadley & Whitin's exact (s, Q) or Sobel's (R, S) fill rate; the empirical model's own.
    pub fill_rate_exact: f64,
    /// Why the item needs attention (the engine's alerts).
    pub alerts: Vec<AlertJson>,
    /// How the figures were worked out, where it is not the usual way.
    pub notes: Vec<String>,
}

#[derive(Serialize, Debug)]
pub struct AlertJson {
    pub kind: &'static str,
    pub reason: String,
}

impl AlertJson {
    /// Each alert's kind and reason.
    pub fn of(alerts: &[Alert]) -> Vec<AlertJson> {
        alerts
            .iter()
            .map(|a| AlertJson {
                kind: a.kind.key(),
                reason: a.reason.clone(),
            })
            .collect()
    }
}

#[derive(Serialize, Debug)]
pub struct TargetJson {
    pub kind: &'static str,
    pub value: f64,
}

impl StockItemJson {
    pub fn new(p: &ItemPlan, st: &stock::StockPlan, alerts: &[Alert]) -> Self {
        let f = &st.figures;
        let continuous = st.settings.review_period().is_none();
        let target = match st.settings.target() {
            stock::Target::CycleService(value) => TargetJson {
                kind: "cycle_service_level",
                value,
            },
            stock::Target::FillRate(value) => TargetJson {
                kind: "fill_rate",
                value,
            },
        };
        StockItemJson {
            name: p.name.clone(),
            policy: if continuous { "continuous" } else { "periodic" },
            lead_time: st.settings.lead_time(),
            lead_time_sd: st.settings.lead_time_sd(),
            review_period: st.settings.review_period(),
            protection_periods: st.protection_periods,
            distribution: st.distribution.key(),
            demand_over_protection: st.demand_over_protection,
            sd_over_protection: st.sd_over_protection,
            origins_used: st.origins_used,
            target,
            safety_factor: f.safety_factor,
            safety_stock: f.safety_stock,
            reorder_point: continuous.then_some(f.level),
            order_up_to: (!continuous).then_some(f.level),
            order_quantity: continuous.then_some(st.cycle_demand),
            on_hand: st.position.map(|p| p.on_hand),
            on_order: st.position.map(|p| p.on_order),
            suggested_order: st.suggested_order,
            expected_shortage: f.expected_shortage,
            cycle_service_level: f.cycle_service_level,
            fill_rate: f.fill_rate,
            fill_rate_exact: f.fill_rate_exact,
            alerts: AlertJson::of(alerts),
            notes: st.notes.clone(),
        }
    }
}

/// `morrowcast stock --stock TABLE --json` when the stock table is rejected.
#[derive(Serialize, Debug)]
pub struct StockTableJson {
    pub stock_table_errors: Vec<ErrorJson>,
    pub warnings: Vec<String>,
}

impl From<&morrowcast_engine::intake::StockTable> for StockTableJson {
    fn from(t: &morrowcast_engine::intake::StockTable) -> Self {
        StockTableJson {
            stock_table_errors: t.errors.iter().map(ErrorJson::from).collect(),
            warnings: t.warnings.clone(),
        }
    }
}

/// One item of `morrowcast look-back --json`: the plan of some periods ago against what sold.
#[derive(Serialize, Debug)]
pub struct LookBackJson {
    pub name: String,
    /// The last period the plan saw.
    pub made_after: String,
    /// The method the plan chose then.
    pub method: String,
    /// The band level, in percent.
    pub level: f64,
    pub periods: Vec<LookBackPeriodJson>,
    /// The forecast and what sold, summed over the periods whose sales are known (gaps and
    /// shut periods left out).
    pub forecast_total: f64,
    pub sold_total: f64,
    pub stock: StockCheckJson,
}

#[derive(Serialize, Debug)]
pub struct LookBackPeriodJson {
    pub period: String,
    pub forecast: f64,
    pub low: f64,
    pub high: f64,
    /// null: a gap in the data.
    pub sold: Option<f64>,
    /// Forecast minus sold.
    pub error: Option<f64>,
    /// null for a gap and for a shut period (a shut place of the season, forecast 0).
    pub within: Option<bool>,
    pub shut: bool,
    /// Beyond the plan's horizon: forecast by the same plan made with a longer one.
    pub extended: bool,
    /// After the item's data ends (the file runs on, its figures do not): `sold` is null
    /// because nothing is recorded, not because of a gap inside its history.
    pub after_data: bool,
}

/// The Stock plan of then against the demand since. `check` is "checked" (the other fields
/// filled), "too_soon" (fewer periods have passed than P), "no_interval" (no lead time under
/// continuous review), "gap" (a gap within P), "after_data" (P reaches past the item's data) or
/// "no_figures" (`why` says why).
#[derive(Serialize, Debug)]
pub struct StockCheckJson {
    pub check: &'static str,
    pub protection_periods: Option<usize>,
    pub reorder_point: Option<f64>,
    pub order_up_to: Option<f64>,
    pub expected: Option<f64>,
    pub demand: Option<f64>,
    /// Whether the level covered the demand (with whole units, the level rounded up, as the
    /// stock an order brings), and by how much the demand went beyond it.
    pub covered: Option<bool>,
    pub shortfall: Option<f64>,
    pub promised_cycle_service: Option<f64>,
    pub why: Option<String>,
}

impl From<&LookBack> for LookBackJson {
    fn from(l: &LookBack) -> Self {
        let (forecast_total, sold_total) = l.totals();
        LookBackJson {
            name: l.name.clone(),
            made_after: l.made_after.to_string(),
            method: l.method.clone(),
            level: l.level.percent(),
            periods: l
                .steps
                .iter()
                .map(|s| LookBackPeriodJson {
                    period: s.period.to_string(),
                    forecast: s.band.value,
                    low: s.band.low,
                    high: s.band.high,
                    sold: s.actual,
                    error: s.error(),
                    within: s.within(),
                    shut: s.shut,
                    extended: s.extended,
                    after_data: s.ended,
                })
                .collect(),
            forecast_total,
            sold_total,
            stock: StockCheckJson::from(&l.stock),
        }
    }
}

impl From<&StockCheck> for StockCheckJson {
    fn from(c: &StockCheck) -> Self {
        let mut out = StockCheckJson {
            check: c.key(),
            protection_periods: c.protection_periods(),
            reorder_point: None,
            order_up_to: None,
            expected: None,
            demand: None,
            covered: c.covered(),
            shortfall: c.shortfall(),
            promised_cycle_service: None,
            why: None,
        };
        match c {
            StockCheck::Checked {
                periodic,
                level,
                expected,
                demand,
                promised,
                ..
            } => {
                if *periodic {
                    out.order_up_to = Some(*level);
                } else {
                    out.reorder_point = Some(*level);
                }
                out.expected = Some(*expected);
                out.demand = Some(*demand);
                out.promised_cycle_service = Some(*promised);
            }
            StockCheck::NoFigures(why) => out.why = Some(why.clone()),
            StockCheck::TooSoon { .. }
            | StockCheck::NoInterval
            | StockCheck::Gap { .. }
            | StockCheck::AfterData { .. } => {}
        }
        out
    }
}

/// The whole file's Look-back in counts (`tally` of `morrowcast look-back --json`).
#[derive(Serialize, Debug)]
pub struct LookBackTallyJson {
    pub items: usize,
    /// Periods with known sales over every item, and how many lay within their band.
    pub periods: usize,
    pub within: usize,
    pub within_share: Option<f64>,
    /// Items whose protection interval has passed, and how many their level covered.
    pub stock_checked: usize,
    pub covered: usize,
    pub covered_share: Option<f64>,
    /// The mean cycle service level those levels promised.
    pub promised_cycle_service: Option<f64>,
}

impl From<&LookBackTally> for LookBackTallyJson {
    fn from(t: &LookBackTally) -> Self {
        LookBackTallyJson {
            items: t.items,
            periods: t.periods,
            within: t.within,
            within_share: t.within_share(),
            stock_checked: t.stock_checked,
            covered: t.covered,
            covered_share: t.covered_share(),
            promised_cycle_service: t.promised(),
        }
    }
}
