//! The Pattern view's charts: the history as a line with markers, the seasonal overlay (one line
//! per year across the season positions, with a legend) and the autocorrelation bars with the
//! threshold the season test uses.
//!
//! Kept apart from: detecting anything. The engine's season verdict supplies the
//! autocorrelations and the threshold; the app groups periods into years by their calendar.
//! Lines are straight segments between markers: periods are discrete.

use morrowcast_engine::patterns::STRONG_SEASON;
use plotters::element::DashedPathElement;
use plotters::prelude::*;

use super::axis::{draw_legend, frame, value_range, Corner, LegendEntry, Swatch};
use super::palette::{year_colour, DEMAND, FITTED, MARKER};
use super::{clear, filled_gap_marker, filled_gaps_words, round_for_people, Area, ChartError};

/// The history chart's data.
#[derive(Clone, Debug, PartialEq)]
pub struct History {
    pub labels: Vec<String>,
    pub values: Vec<f64>,
    /// Positions that were gaps filled by interpolation (drawn as hollow markers).
    pub filled: Vec<usize>,
    pub unit: String,
}

/// Draws the history: straight segments, a filled marker per observed period, a hollow one per
/// filled gap.
pub fn draw_history<DB: DrawingBackend>(
    area: &Area<'_, DB>,
    data: &History,
) -> Result<(), ChartError>
where
    DB::ErrorType: 'static,
{
    clear(area)?;
    let range = value_range(data.values.iter().copied()).ok_or(ChartError::NoData)?;
    let y_desc = format!("demand ({})", data.unit);
    let mut chart = frame(area, data.values.len(), range, &y_desc, &data.labels)?;
    let points: Vec<(f64, f64)> = data
        .values
        .iter()
        .enumerate()
        .map(|(i, v)| (i as f64, *v))
        .collect();
    chart.draw_series(std::iter::once(PathElement::new(
        points.clone(),
        DEMAND.stroke_width(2),
    )))?;
    chart.draw_series(points.iter().enumerate().map(|(i, p)| {
        if data.filled.contains(&i) {
            filled_gap_marker(*p)
        } else {
            Circle::new(*p, 3, DEMAND.filled())
        }
    }))?;
    area.present()?;
    Ok(())
}

/// Summary of the history chart.
pub fn history_summary(data: &History) -> String {
    let n = data.values.len();
    let (Some(first), Some(last)) = (data.labels.first(), data.labels.get(n.saturating_sub(1)))
    else {
        return "No history to show yet.".to_string();
    };
    let (lo, hi) = data
        .values
        .iter()
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| {
            (a.min(*v), b.max(*v))
        });
    let mut s = format!(
        "{n} periods from {first} to {last}; demand between {} and {} {}.",
        round_for_people(lo),
        round_for_people(hi),
        data.unit
    );
    s.push_str(&filled_gaps_words(data.filled.len()));
    s
}

/// The seasonal overlay: one line per year across the season positions.
#[derive(Clone, Debug, PartialEq)]
pub struct Overlay {
    /// Names of the season positions ("Jan", ..., or "1", "2", ...).
    pub positions: Vec<String>,
    /// (year label, value at each position; `None` where the year has no data there).
    pub years: Vec<(String, Vec<Option<f64>>)>,
    pub unit: String,
}

/// Draws the seasonal overlay with a legend; the newest year is darkest and thickest.
pub fn draw_overlay<DB: DrawingBackend>(
    area: &Area<'_, DB>,
    data: &Overlay,
) -> Result<(), ChartError>
where
    DB::ErrorType: 'static,
{
    clear(area)?;
    let range = value_range(
        data.years
            .iter()
            .flat_map(|(_, v)| v.iter().flatten().copied()),
    )
    .ok_or(ChartError::NoData)?;
    let y_desc = format!("demand ({})", data.unit);
    let mut chart = frame(area, data.positions.len(), range, &y_desc, &data.positions)?;
    let count = data.years.len();
    let mut legend = Vec::new();
    for (k, (year, values)) in data.years.iter().enumerate() {
        let colour = year_colour(k, count);
        let width = if k + 1 == count { 3 } else { 2 };
        let points: Vec<(f64, f64)> = values
            .iter()
            .enumerate()
            .filter_map(|(i, v)| v.map(|v| (i as f64, v)))
            .collect();
        chart.draw_series(std::iter::once(PathElement::new(
            points.clone(),
            colour.stroke_width(width),
        )))?;
        legend.push(LegendEntry::new(year.clone(), Swatch::Line(colour, width)));
        chart.draw_series(points.iter().map(|p| Circle::new(*p, 3, colour.filled())))?;
    }
    draw_legend(&chart, &legend, Corner::UpperRight)?;
    area.present()?;
    Ok(())
}

/// Summary of the overlay: which position peaks in most years.
pub fn overlay_summary(data: &Overlay) -> String {
    if data.years.is_empty() || data.positions.is_empty() {
        return "No seasonal overlay: the periods carry no calendar season.".to_string();
    }
    let mut peaks = vec![0usize; data.positions.len()];
    for (_, values) in &data.years {
        let best = values
            .iter()
            .enumerate()
            .filter_map(|(i, v)| v.map(|v| (i, v)))
            .max_by(|a, b| a.1.total_cmp(&b.1));
        if let Some((i, _)) = best {
            peaks[i] += 1;
        }
    }
    let (top, times) = peaks
        .iter()
        .enumerate()
        .max_by_key(|(_, c)| **c)
        .map(|(i, c)| (i, *c))
        .unwrap_or((0, 0));
    format!(
        "{} years overlaid across {} season positions; the highest position was {} in {} of {} years.",
        data.years.len(),
        data.positions.len(),
        data.positions[top],
        times,
        data.years.len()
    )
}

/// Autocorrelation evidence for the season length.
#[derive(Clone, Debug, PartialEq)]
pub struct Autocorrelation {
    /// r_1, r_2, ... (lag k at index k - 1).
    pub values: Vec<f64>,
    /// The lag tested as season length, if any.
    pub candidate: Option<usize>,
    /// The threshold |r_m| must exceed.
    pub threshold: f64,
    /// The candidate's seasonal strength, where it may accept the season the test turned down.
    pub strength: Option<f64>,
}

/// Draws autocorrelation bars per lag, the candidate lag highlighted, and the threshold as
/// dashed lines at plus and minus its value.
pub fn draw_autocorrelation<DB: DrawingBackend>(
    area: &Area<'_, DB>,
    data: &Autocorrelation,
) -> Result<(), ChartError>
where
    DB::ErrorType: 'static,
{
    clear(area)?;
    if data.values.is_empty() {
        return Err(ChartError::NoData);
    }
    let labels: Vec<String> = (1..=data.values.len()).map(|k| k.to_string()).collect();
    let extent = data
        .values
        .iter()
        .map(|v| v.abs())
        .fold(data.threshold.abs(), f64::max)
        .clamp(0.1, 1.0)
        * 1.1;
    let mut chart = frame(
        area,
        labels.len(),
        -extent..extent,
        "autocorrelation",
        &labels,
    )?;
    chart.draw_series(data.values.iter().enumerate().map(|(i, r)| {
        let lag = i + 1;
        let colour = if Some(lag) == data.candidate {
            FITTED
        } else {
            DEMAND
        };
        Rectangle::new(
            [(i as f64 - 0.3, 0.0), (i as f64 + 0.3, *r)],
            colour.filled(),
        )
    }))?;
    let n = data.values.len() as f64;
    for t in [data.threshold, -data.threshold] {
        chart.draw_series(std::iter::once(DashedPathElement::new(
            vec![(-0.5, t), (n - 0.5, t)],
            5,
            4,
            MARKER.stroke_width(1),
        )))?;
    }
    area.present()?;
    Ok(())
}

/// Summary of the autocorrelation evidence.
pub fn autocorrelation_summary(data: &Autocorrelation) -> String {
    let tested = data
        .candidate
        .and_then(|m| data.values.get(m.wrapping_sub(1)).map(|r| (m, *r)));
    match (tested, data.strength) {
        (Some((m, r)), Some(f)) if r.abs() <= data.threshold => {
            format!(
                "Autocorrelation at lag {m} is {r:.2}; the threshold is {:.2}, so lag {m} does not pass this test. Its seasonal strength is {f:.2}, {}.",
                data.threshold,
                if f >= STRONG_SEASON {
                    format!("at least {STRONG_SEASON:.2}, which accepts it")
                } else {
                    format!("below {STRONG_SEASON:.2}")
                }
            )
        }
        (Some((m, r)), _) => format!(
            "Autocorrelation at lag {m} is {:.2}; the threshold is {:.2}, so lag {m} {} as the season length.",
            r,
            data.threshold,
            if r.abs() > data.threshold { "passes" } else { "does not pass" }
        ),
        (None, _) if data.values.is_empty() => "No autocorrelations: the history is too short.".to_string(),
        (None, _) => format!(
            "No lag was tested as season length; the largest autocorrelation is {:.2}.",
            data.values.iter().copied().fold(f64::NEG_INFINITY, f64::max)
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::chart::palette::hex;
    use crate::chart::probe::Svg;

    fn svg_of(draw: impl FnOnce(&Area<'_, SVGBackend<'_>>) -> Result<(), ChartError>) -> Svg {
        let mut out = String::new();
        {
            let area = SVGBackend::with_string(&mut out, (700, 300)).into_drawing_area();
            draw(&area).unwrap();
        }
        Svg::parse(&out)
    }

    #[test]
    fn history_has_a_marker_per_period_and_hollow_ones_for_gaps() {
        let data = History {
            labels: (1..=10)
                .map(|i| format!("2024-Q{}", (i - 1) % 4 + 1))
                .collect(),
            values: vec![5.0, 6.0, 7.0, 6.5, 6.0, 5.0, 8.0, 9.0, 7.0, 6.0],
            filled: vec![3],
            unit: "units".into(),
        };
        let svg = svg_of(|a| draw_history(a, &data));
        let line = svg.polylines_with_stroke(&hex(DEMAND));
        assert_eq!(line.len(), 1);
        assert_eq!(line[0].len(), 10);
        assert_eq!(svg.circles_with_fill(&hex(DEMAND)), 9);
        assert!(svg.texts.iter().any(|t| t == "2024-Q1"));
        let s = history_summary(&data);
        assert!(
            s.starts_with("10 periods from 2024-Q1 to 2024-Q2; demand between 5 and 9 units."),
            "{s}"
        );
        assert!(s.contains("1 missing period(s)"));
    }

    #[test]
    fn overlay_draws_one_line_per_year_with_a_legend() {
        let positions: Vec<String> = ["Jan", "Feb", "Mar", "Apr"]
            .iter()
            .map(|s| s.to_string())
            .collect();
        let data = Overlay {
            positions,
            years: vec![
                ("2022".into(), vec![None, Some(2.0), Some(5.0), Some(3.0)]),
                (
                    "2023".into(),
                    vec![Some(1.0), Some(2.5), Some(6.0), Some(3.0)],
                ),
                ("2024".into(), vec![Some(1.5), Some(7.0), Some(6.5), None]),
            ],
            unit: "units".into(),
        };
        let svg = svg_of(|a| draw_overlay(a, &data));
        for (k, (year, values)) in data.years.iter().enumerate() {
            let c = hex(year_colour(k, 3));
            let lines = svg.polylines_with_stroke(&c);
            assert_eq!(lines.len(), 1, "year {year}");
            assert_eq!(lines[0].len(), values.iter().flatten().count());
            assert!(svg.texts.iter().any(|t| t == year), "legend lacks {year}");
        }
        let s = overlay_summary(&data);
        assert_eq!(
            s,
            "3 years overlaid across 4 season positions; the highest position was Mar in 2 of 3 years."
        );
    }

    #[test]
    fn autocorrelation_bars_and_threshold_lines() {
        let data = Autocorrelation {
            values: vec![0.5, 0.1, -0.3, 0.7],
            candidate: Some(4),
            threshold: 0.4,
            strength: None,
        };
        let svg = svg_of(|a| draw_autocorrelation(a, &data));
        assert_eq!(svg.rects_with_fill(&hex(DEMAND)).len(), 3);
        let candidate = svg.rects_with_fill(&hex(FITTED));
        assert_eq!(candidate.len(), 1);
        // The negative bar hangs below the zero line: its top is where positive bars start.
        let bars = svg.rects_with_fill(&hex(DEMAND));
        let zero_y = bars[0].1 + bars[0].3;
        assert_eq!(bars[2].1, zero_y);
        let dashes = svg.dashes_with_stroke(&hex(MARKER));
        let ys: std::collections::BTreeSet<i32> = dashes.iter().map(|d| d[0].1).collect();
        assert_eq!(ys.len(), 2, "two threshold lines");
        assert_eq!(
            autocorrelation_summary(&data),
            "Autocorrelation at lag 4 is 0.70; the threshold is 0.40, so lag 4 passes as the season length."
        );
        // Turned down by the test, the season may still be accepted by its strength.
        let strong = Autocorrelation {
            values: vec![0.5, 0.1, -0.3, 0.3],
            strength: Some(0.71),
            ..data
        };
        assert_eq!(
            autocorrelation_summary(&strong),
            "Autocorrelation at lag 4 is 0.30; the threshold is 0.40, so lag 4 does not pass this test. Its seasonal strength is 0.71, at least 0.64, which accepts it."
        );
    }

    #[test]
    fn empty_inputs_are_errors() {
        let mut out = String::new();
        let area = SVGBackend::with_string(&mut out, (100, 100)).into_drawing_area();
        let empty = Autocorrelation {
            values: vec![],
            candidate: None,
            threshold: 0.0,
            strength: None,
        };
        assert_eq!(draw_autocorrelation(&area, &empty), Err(ChartError::NoData));
        let h = History {
            labels: vec![],
            values: vec![],
            filled: vec![],
            unit: "units".into(),
        };
        assert_eq!(draw_history(&area, &h), Err(ChartError::NoData));
        assert_eq!(history_summary(&h), "No history to show yet.");
    }
}
