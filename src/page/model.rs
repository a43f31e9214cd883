//! From an engine plan to what the page shows: chart data, the ledger of any ranked row, and
//! the seasonal overlay's grouping by year.
//!
//! Kept apart from: the engine's computation and the DOM. This only rearranges the engine's
//! numbers (no fitting, no measures) and pairs them with period labels.

use morrowcast_engine::alerts::outliers;
use morrowcast_engine::backtest::Scored;
use morrowcast_engine::calendar::{Frequency, Period};
use morrowcast_engine::plan::{ItemPlan, LedgerEntry};
use morrowcast_engine::series::Series;

use crate::chart::lookahead::BandValue;
use crate::chart::{Autocorrelation, History, LookAhead, Overlay, Tracking};

/// The unit the value axes name (intake has no unit column yet).
pub const UNIT: &str = "units";

/// Labels of the series' periods.
pub fn history_labels(series: &Series) -> Vec<String> {
    series.periods().map(|p| p.to_string()).collect()
}

/// The Look-ahead chart's data: history and holdout from `ranked` (the plan the ranking came
/// from), fit and forecast from `shown` (the plan refitted with the row the user picked; the same
/// plan when the top row is shown).
pub fn look_ahead(series: &Series, ranked: &ItemPlan, row: &Scored, shown: &ItemPlan) -> LookAhead {
    let mut labels = history_labels(series);
    labels.extend(shown.forecast.iter().map(|f| f.period.to_string()));
    let k = ranked.backtest.holdout_demand.len();
    let n = ranked.history.len();
    LookAhead {
        labels,
        history: ranked.history.clone(),
        filled: series.gap_indices(),
        far: outliers(shown, series)
            .map(|o| o.periods.iter().map(|p| p.index).collect())
            .unwrap_or_default(),
        fitted: shown.fitted.clone(),
        holdout_start: (k > 0 && k < n).then(|| n - k),
        holdout_forecast: row.holdout_forecast.clone(),
        forecast: shown
            .forecast
            .iter()
            .map(|f| BandValue {
                value: f.band.value,
                low: f.band.low,
                high: f.band.high,
            })
            .collect(),
        level_percent: shown.level.percent(),
        unit: UNIT.into(),
    }
}

/// The history chart's data; gaps filled by interpolation are marked.
pub fn history(series: &Series, plan: &ItemPlan) -> History {
    History {
        labels: history_labels(series),
        values: plan.history.clone(),
        filled: series.gap_indices(),
        unit: UNIT.into(),
    }
}

/// The autocorrelation evidence of the season verdict.
pub fn autocorrelation(plan: &ItemPlan) -> Autocorrelation {
    Autocorrelation {
        values: plan.season.autocorrelation.clone(),
        candidate: plan.season.candidate,
        threshold: plan.season.threshold,
        strength: plan.season.strength,
    }
}

/// The tracking-signal chart's data for a ledger.
pub fn tracking(ledger: &[LedgerEntry], limit: f64) -> Tracking {
    Tracking {
        labels: ledger.iter().map(|e| e.period.to_string()).collect(),
        signal: ledger.iter().map(|e| e.row.tracking_signal).collect(),
        limit,
    }
}

const MONTHS: [&str; 12] = [
    "Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec",
];
const WEEKDAYS: [&str; 7] = ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"];

/// Name of season position `p` (0-based) on a calendar.
fn position_name(frequency: Frequency, p: usize) -> String {
    match frequency {
        Frequency::Monthly => MONTHS.get(p).map(|s| s.to_string()).unwrap_or_default(),
        Frequency::Quarterly => format!("Q{}", p + 1),
        Frequency::Daily => WEEKDAYS.get(p).map(|s| s.to_string()).unwrap_or_default(),
        Frequency::Weekly => format!("W{:02}", p + 1),
        Frequency::Yearly | Frequency::Undated => (p + 1).to_string(),
    }
}

/// The seasonal overlay: one line per year across the season positions when the season length
/// is the calendar's (12 months, 4 quarters, ...); otherwise one line per cycle of the season
/// length counted from the first period. `None` without a season length of at least 2.
pub fn overlay(series: &Series, values: &[f64], season: Option<usize>) -> Option<Overlay> {
    let m = season.filter(|m| *m >= 2)?;
    let frequency = series.frequency();
    let calendar = frequency.natural_season() == Some(m);
    let mut years: Vec<(String, Vec<Option<f64>>)> = Vec::new();
    for (i, v) in values.iter().enumerate() {
        let period: Period = series.period(i);
        let (key, pos) = match (calendar, period.calendar_year(), period.season_position()) {
            (true, Some(y), Some(p)) if p < m => (y.to_string(), p),
            _ => (format!("cycle {}", i / m + 1), i % m),
        };
        if years.last().map(|(k, _)| k != &key).unwrap_or(true) {
            years.push((key, vec![None; m]));
        }
        if let Some((_, slots)) = years.last_mut() {
            slots[pos] = Some(*v);
        }
    }
    let positions = (0..m)
        .map(|p| {
            if calendar {
                position_name(frequency, p)
            } else {
                (p + 1).to_string()
            }
        })
        .collect();
    Some(Overlay {
        positions,
        years,
        unit: UNIT.into(),
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn monthly_overlay_groups_by_calendar_year() {
        // 14 months from 2023-11: two months of 2023, all of 2024.
        let values: Vec<f64> = (0..14).map(f64::from).collect();
        let series = Series::new(
            "x",
            Period::month(2023, 11),
            values.iter().map(|v| Some(*v)).collect(),
        )
        .unwrap();
        let o = overlay(&series, &values, Some(12)).unwrap();
        assert_eq!(o.positions[0], "Jan");
        assert_eq!(o.years.len(), 2);
        assert_eq!(o.years[0].0, "2023");
        assert_eq!(o.years[0].1[10], Some(0.0));
        assert_eq!(o.years[0].1[0], None);
        assert_eq!(o.years[1].0, "2024");
        assert_eq!(o.years[1].1[0], Some(2.0));
        assert_eq!(o.years[1].1[11], Some(13.0));
    }

    #[test]
    fn other_season_lengths_group_by_cycle() {
        let values: Vec<f64> = (0..7).map(f64::from).collect();
        let series = Series::from_values("x", &values).unwrap();
        let o = overlay(&series, &values, Some(3)).unwrap();
        assert_eq!(o.positions, ["1", "2", "3"]);
        let names: Vec<&str> = o.years.iter().map(|(k, _)| k.as_str()).collect();
        assert_eq!(names, ["cycle 1", "cycle 2", "cycle 3"]);
        assert_eq!(o.years[2].1, vec![Some(6.0), None, None]);
        assert!(overlay(&series, &values, Some(1)).is_none());
    }
}
