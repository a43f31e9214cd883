//! Exports: the forecast and the Error ledger as CSV, and the file names of every download
//! (item and date in the name).
//!
//! Kept apart from: the browser's download mechanics (the page hands these strings to a Blob).
//! Numbers are written in Rust's shortest round-trip form, so an export compares exactly with
//! the engine's values (and with `morrowcast forecast --json`). Column names follow the JSON
//! contract of `src/wire.rs`.

use morrowcast_engine::plan::{ForecastPoint, LedgerEntry};

/// The forecast as CSV: `period,value,low,high,method,level`.
pub fn forecast_csv(points: &[ForecastPoint], method: &str, level_percent: f64) -> String {
    let mut w = csv::Writer::from_writer(Vec::new());
    let _ = w.write_record(["period", "value", "low", "high", "method", "level"]);
    for p in points {
        let _ = w.write_record([
            p.period.to_string(),
            p.band.value.to_string(),
            p.band.low.to_string(),
            p.band.high.to_string(),
            method.to_string(),
            level_percent.to_string(),
        ]);
    }
    finish(w)
}

/// The Error ledger as CSV, one row per holdout period; a measure that is not available is an
/// empty cell.
pub fn ledger_csv(ledger: &[LedgerEntry]) -> String {
    let mut w = csv::Writer::from_writer(Vec::new());
    let _ = w.write_record([
        "period",
        "demand",
        "forecast",
        "error",
        "abs_error",
        "sq_error",
        "pct_error",
        "mad",
        "mse",
        "rmse",
        "mape",
        "bias",
        "tracking_signal",
        "out_of_limits",
    ]);
    let opt = |v: Option<f64>| v.map(|v| v.to_string()).unwrap_or_default();
    for e in ledger {
        let r = &e.row;
        let _ = w.write_record([
            e.period.to_string(),
            r.demand.to_string(),
            r.forecast.to_string(),
            r.error.to_string(),
            r.abs_error.to_string(),
            r.sq_error.to_string(),
            opt(r.pct_error),
            r.mad.to_string(),
            r.mse.to_string(),
            r.rmse.to_string(),
            opt(r.mape),
            r.bias.to_string(),
            opt(r.tracking_signal),
            r.out_of_limits.to_string(),
        ]);
    }
    finish(w)
}

fn finish(w: csv::Writer<Vec<u8>>) -> String {
    w.into_inner()
        .map(|b| String::from_utf8_lossy(&b).into_owned())
        .unwrap_or_default()
}

/// A file name: `morrowcast-<item>-<what>-<date>.<ext>`, the item reduced to lower-case letters,
/// digits and dashes ("Potting mix 40 L" -> "potting-mix-40-l").
pub fn file_name(item: &str, what: &str, date: &str, ext: &str) -> String {
    let mut slug = String::new();
    for c in item.chars().flat_map(char::to_lowercase) {
        if c.is_alphanumeric() {
            slug.push(c);
        } else if !slug.ends_with('-') && !slug.is_empty() {
            slug.push('-');
        }
    }
    let slug = slug.trim_end_matches('-');
    let slug = if slug.is_empty() { "item" } else { slug };
    format!("morrowcast-{slug}-{what}-{date}.{ext}")
}

#[cfg(test)]
mod tests {
    use super::*;
    use morrowcast_engine::accuracy::ledger;
    use morrowcast_engine::bands::{BandPoint, BandSource};
    use morrowcast_engine::calendar::Period;

    #[test]
    fn forecast_csv_round_trips_numbers_and_quotes_labels() {
        let points = vec![ForecastPoint {
            period: Period::month(2026, 1),
            band: BandPoint {
                value: 0.1 + 0.2,
                low: 0.0,
                high: 12.5,
            },
            source: BandSource::Analytic,
        }];
        let csv = forecast_csv(&points, "Combination of Theta, SBA", 95.0);
        assert_eq!(
            csv,
            "period,value,low,high,method,level\n2026-01,0.30000000000000004,0,12.5,\"Combination of Theta, SBA\",95\n"
        );
    }

    #[test]
    fn ledger_csv_leaves_unavailable_measures_empty() {
        let rows = ledger(&[1.0, 3.0], &[0.0, 2.0], 4.0);
        let entries: Vec<LedgerEntry> = rows
            .into_iter()
            .enumerate()
            .map(|(i, row)| LedgerEntry {
                period: Period::quarter(2025, i as u32 + 1),
                row,
            })
            .collect();
        let csv = ledger_csv(&entries);
        let lines: Vec<&str> = csv.lines().collect();
        assert_eq!(lines.len(), 3);
        // Zero demand: percent error and MAPE not available; MAD 1 so tracking signal 1.
        assert_eq!(lines[1], "2025-Q1,0,1,1,1,1,,1,1,1,,1,1,false");
        assert!(
            lines[2].starts_with("2025-Q2,2,3,1,1,1,50,1,1,1,,2,2,false"),
            "{}",
            lines[2]
        );
    }

    #[test]
    fn file_names_carry_item_and_date() {
        assert_eq!(
            file_name("Potting mix 40 L", "forecast", "2026-12-01", "csv"),
            "morrowcast-potting-mix-40-l-forecast-2026-12-01.csv"
        );
        assert_eq!(
            file_name("  ", "ledger", "2026-12-01", "csv"),
            "morrowcast-item-ledger-2026-12-01.csv"
        );
    }
}
