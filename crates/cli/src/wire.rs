//! The wire boundary: the JSON shapes of the command line's contract.
//!
//! Kept apart from: the engine's own types (they derive serde only for the browser worker's
//! bincode messages, src/worker.rs, which are not a contract). Only this module writes JSON, so
//! the contract's names live in one place. A measure that is not available (MAPE with zero demand)
//! is `null`, never infinity.

use serde::Serialize;

use morrowcast_engine::backtest::{Candidate, Scored};
use morrowcast_engine::intake::IntakeReport;
use morrowcast_engine::plan::ItemPlan;

/// `morrowcast inspect --json`.
#[derive(Serialize, Debug)]
pub struct InspectJson {
    pub delimiter: &'static str,
    pub decimal: &'static str,
    pub frequency: &'static str,
    pub layout: &'static str,
    pub date_format: Option<String>,
    pub gaps_filled: usize,
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
            errors: r
                .errors
                .iter()
                .map(|e| ErrorJson {
                    row: e.row,
                    column: e.column.clone(),
                    text: e.text.clone(),
                    message: e.message.clone(),
                })
                .collect(),
        }
    }
}

/// `morrowcast forecast --json`: `items` is a sequence of [`PlanJson`], `failed` one of
/// [`FailedJson`]. Generic so the command line can write the plans while it makes them (see
/// [`Streamed`]) instead of holding every plan of a large file in memory; the JSON is the same.
#[derive(Serialize, Debug)]
pub struct ForecastJson<Items: Serialize, Failed: Serialize> {
    pub items: Items,
    /// Items that could not be planned, with the reason.
    pub failed: Failed,
    pub warnings: Vec<String>,
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
}

#[derive(Serialize, Debug)]
pub struct PlanJson {
    pub name: String,
    /// Accepted season length; 1 when no season was accepted.
    pub season_length: usize,
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
            trend: p.trend.direction.as_str(),
            demand_class: p.demand.class.as_str(),
            evidence: EvidenceJson {
                season_candidate: p.season.candidate,
                season_statistic: p.season.statistic,
                season_threshold: p.season.threshold,
                season_full_seasons: p.season.full_seasons,
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
