//! The Look-ahead chart: history, the method's fit, the holdout forecast, the future forecast and
//! its band on one chart, with a marker where the holdout starts.
//!
//! Kept apart from: computing any of these (the engine's plan does); this only places them.
//! Positions: history at 0..n, forecast at n..n+h.

use plotters::element::DashedPathElement;
use plotters::prelude::*;

use super::axis::{
    draw_legend, frame, value_range, Corner, LegendEntry, Swatch, FAR_RING_RADIUS, FONT,
};
use super::palette::{ALERT, BAND_OPACITY, DEMAND, FITTED, FORECAST, HOLDOUT, MARKER};
use super::{clear, filled_gap_marker, filled_gaps_words, round_for_people, Area, ChartError};

/// One future period: point forecast and band.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct BandValue {
    pub value: f64,
    pub low: f64,
    pub high: f64,
}

/// What the Look-ahead chart shows.
#[derive(Clone, Debug, PartialEq)]
pub struct LookAhead {
    /// Labels of every position: the n history periods, then the h forecast periods.
    pub labels: Vec<String>,
    pub history: Vec<f64>,
    /// Positions in `history` that were gaps filled by interpolation (hollow markers).
    pub filled: Vec<usize>,
    /// Positions in `history` the fit misses by far (the Outliers alert's periods; wide rings).
    pub far: Vec<usize>,
    /// The fit aligned with `history` (`None` where the method has none).
    pub fitted: Vec<Option<f64>>,
    /// Position of the first holdout period, when there is a holdout.
    pub holdout_start: Option<usize>,
    /// Holdout forecasts from `holdout_start` on.
    pub holdout_forecast: Vec<f64>,
    pub forecast: Vec<BandValue>,
    /// Band level in percent, for the legend ("95% band").
    pub level_percent: f64,
    /// What a value counts, for the value axis ("units").
    pub unit: String,
}

/// Share of the value span added above the data, where the legend sits.
const LEGEND_HEADROOM: f64 = 0.45;

/// Draws the Look-ahead chart into `area`.
pub fn draw_look_ahead<DB: DrawingBackend>(
    area: &Area<'_, DB>,
    data: &LookAhead,
) -> Result<(), ChartError>
where
    DB::ErrorType: 'static,
{
    clear(area)?;
    let n = data.history.len();
    let h = data.forecast.len();
    let all = data
        .history
        .iter()
        .copied()
        .chain(data.fitted.iter().flatten().copied())
        .chain(data.holdout_forecast.iter().copied())
        .chain(data.forecast.iter().flat_map(|b| [b.low, b.value, b.high]));
    let range = value_range(all).ok_or(ChartError::NoData)?;
    // Headroom above the data for the legend box (upper left), so it covers no line.
    let range = range.start..range.end + LEGEND_HEADROOM * (range.end - range.start);
    if n == 0 {
        return Err(ChartError::NoData);
    }
    let y_desc = format!("demand ({})", data.unit);
    let mut chart = frame(area, n + h, range, &y_desc, &data.labels)?;
    // The legend's rows, in the order the series are drawn.
    let mut legend = Vec::new();

    // The band first, so every line sits on top of it. It starts at the last demand so the
    // forecast visibly leaves from there.
    if h > 0 {
        let last = (n as f64 - 1.0, data.history[n - 1]);
        let upper = data
            .forecast
            .iter()
            .enumerate()
            .map(|(i, b)| ((n + i) as f64, b.high));
        let lower = data
            .forecast
            .iter()
            .enumerate()
            .rev()
            .map(|(i, b)| ((n + i) as f64, b.low));
        let outline: Vec<(f64, f64)> = std::iter::once(last).chain(upper).chain(lower).collect();
        chart.draw_series(std::iter::once(Polygon::new(
            outline,
            FORECAST.mix(BAND_OPACITY).filled(),
        )))?;
        legend.push(LegendEntry::new(
            format!("{}% band", round_for_people(data.level_percent)),
            Swatch::Fill(FORECAST, BAND_OPACITY),
        ));
    }

    if let Some(start) = data.holdout_start.filter(|s| *s < n) {
        let x = start as f64 - 0.5;
        let (lo, hi) = (chart.y_range().start, chart.y_range().end);
        chart.draw_series(std::iter::once(DashedPathElement::new(
            vec![(x, lo), (x, hi)],
            5,
            4,
            MARKER.stroke_width(1),
        )))?;
        // A few pixels right of the marker and below the top, so the words do not touch it.
        chart.draw_series(std::iter::once(
            EmptyElement::at((x, hi))
                + Text::new(
                    "holdout starts",
                    (4, 2),
                    (FONT, 12).into_font().color(&MARKER).pos(
                        plotters::style::text_anchor::Pos::new(
                            plotters::style::text_anchor::HPos::Left,
                            plotters::style::text_anchor::VPos::Top,
                        ),
                    ),
                ),
        ))?;
    }

    // The fit: dashed, drawn in runs where it exists.
    let fit = runs(&data.fitted);
    for run in &fit {
        chart.draw_series(std::iter::once(DashedPathElement::new(
            run.iter().copied(),
            6,
            3,
            FITTED.stroke_width(2),
        )))?;
    }
    if !fit.is_empty() {
        legend.push(LegendEntry::new(
            "fit on history",
            Swatch::Dashed(FITTED, 2),
        ));
    }

    let history: Vec<(f64, f64)> = data
        .history
        .iter()
        .enumerate()
        .map(|(i, v)| (i as f64, *v))
        .collect();
    chart.draw_series(std::iter::once(PathElement::new(
        history.clone(),
        DEMAND.stroke_width(2),
    )))?;
    legend.push(LegendEntry::new("demand", Swatch::Line(DEMAND, 2)));
    chart.draw_series(
        history
            .iter()
            .enumerate()
            .filter(|(i, _)| !data.filled.contains(i))
            .map(|(_, p)| Circle::new(*p, 3, DEMAND.filled())),
    )?;
    if !data.filled.is_empty() {
        // Filled gaps are not demand anyone saw: hollow, in the alert colour, as in the
        // Pattern view's history.
        chart.draw_series(
            data.filled
                .iter()
                .filter_map(|i| history.get(*i))
                .map(|p| filled_gap_marker(*p)),
        )?;
        legend.push(LegendEntry::new("filled gap", Swatch::Ring(ALERT)));
    }
    if !data.far.is_empty() {
        chart.draw_series(
            data.far
                .iter()
                .filter_map(|i| history.get(*i))
                .map(|p| Circle::new(*p, FAR_RING_RADIUS, ALERT.stroke_width(2))),
        )?;
        legend.push(LegendEntry::new(
            "missed by far (Outliers)",
            Swatch::Ringed(DEMAND, ALERT),
        ));
    }

    if let Some(start) = data
        .holdout_start
        .filter(|s| *s < n && !data.holdout_forecast.is_empty())
    {
        let points: Vec<(f64, f64)> = data
            .holdout_forecast
            .iter()
            .enumerate()
            .map(|(i, v)| ((start + i) as f64, *v))
            .collect();
        chart.draw_series(std::iter::once(PathElement::new(
            points.clone(),
            HOLDOUT.stroke_width(2),
        )))?;
        legend.push(LegendEntry::new(
            "holdout forecast",
            Swatch::Line(HOLDOUT, 2),
        ));
        chart.draw_series(
            points
                .iter()
                .map(|p| TriangleMarker::new(*p, 4, HOLDOUT.filled())),
        )?;
    }

    if h > 0 {
        let points: Vec<(f64, f64)> = data
            .forecast
            .iter()
            .enumerate()
            .map(|(i, b)| ((n + i) as f64, b.value))
            .collect();
        let line: Vec<(f64, f64)> = std::iter::once((n as f64 - 1.0, data.history[n - 1]))
            .chain(points.iter().copied())
            .collect();
        chart.draw_series(std::iter::once(PathElement::new(
            line,
            FORECAST.stroke_width(3),
        )))?;
        legend.push(LegendEntry::new("forecast", Swatch::Line(FORECAST, 3)));
        chart.draw_series(points.iter().map(|p| {
            Rectangle::new(
                [(p.0 - 0.12, p.1), (p.0 + 0.12, p.1)],
                FORECAST.stroke_width(6),
            )
        }))?;
    }

    draw_legend(&chart, &legend, Corner::UpperLeft)?;
    area.present()?;
    Ok(())
}

/// Runs of consecutive defined values as chart points.
fn runs(values: &[Option<f64>]) -> Vec<Vec<(f64, f64)>> {
    let mut out = Vec::new();
    let mut current = Vec::new();
    for (i, v) in values.iter().enumerate() {
        match v {
            Some(v) if v.is_finite() => current.push((i as f64, *v)),
            _ => {
                if current.len() > 1 {
                    out.push(std::mem::take(&mut current));
                } else {
                    current.clear();
                }
            }
        }
    }
    if current.len() > 1 {
        out.push(current);
    }
    out
}

/// The text beside the chart: what it shows, in words.
pub fn look_ahead_summary(data: &LookAhead) -> String {
    let n = data.history.len();
    let label = |i: usize| data.labels.get(i).cloned().unwrap_or_default();
    if n == 0 {
        return "No history to show yet.".to_string();
    }
    let mut s = format!(
        "Demand for {n} periods, {} to {}, last {} {}.",
        label(0),
        label(n - 1),
        round_for_people(data.history[n - 1]),
        data.unit
    );
    s.push_str(&filled_gaps_words(data.filled.len()));
    if !data.far.is_empty() {
        let named: Vec<String> = data.far.iter().take(4).map(|i| label(*i)).collect();
        s.push_str(&format!(
            " {} period(s) the fit misses by far are ringed: {}{}.",
            data.far.len(),
            named.join(", "),
            if data.far.len() > 4 { ", ..." } else { "" }
        ));
    }
    if let Some(start) = data.holdout_start.filter(|s| *s < n) {
        s.push_str(&format!(
            " The holdout runs from {} ({} periods).",
            label(start),
            n - start
        ));
    }
    if let (Some(first), Some(last)) = (data.forecast.first(), data.forecast.last()) {
        let h = data.forecast.len();
        s.push_str(&format!(
            " Forecast for {h} periods, {} to {}: {} in the first period ({}% band {} to {}), {} in the last ({} to {}).",
            label(n),
            label(n + h - 1),
            round_for_people(first.value),
            round_for_people(data.level_percent),
            round_for_people(first.low),
            round_for_people(first.high),
            round_for_people(last.value),
            round_for_people(last.low),
            round_for_people(last.high),
        ));
    }
    s
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::chart::palette::{hex, BACKGROUND};
    use crate::chart::probe::{self, Svg};

    fn sample() -> LookAhead {
        // Invented shapes for drawing checks only (no forecast is computed here).
        let history: Vec<f64> = (0..24)
            .map(|t| 50.0 + 10.0 * ((t % 12) as f64 / 2.0).sin())
            .collect();
        let fitted = (0..24)
            .map(|t| (t > 0).then_some(50.0 + t as f64 * 0.1))
            .collect();
        let forecast: Vec<BandValue> = (0..6)
            .map(|i| BandValue {
                value: 55.0,
                low: 45.0 - i as f64,
                high: 65.0 + i as f64,
            })
            .collect();
        let labels = (0..30).map(|i| format!("2024-{:02}", i % 12 + 1)).collect();
        LookAhead {
            labels,
            history,
            filled: vec![],
            far: vec![],
            fitted,
            holdout_start: Some(18),
            holdout_forecast: vec![52.0; 6],
            forecast,
            level_percent: 95.0,
            unit: "units".into(),
        }
    }

    fn draw_svg(data: &LookAhead) -> Svg {
        let mut out = String::new();
        {
            let area = SVGBackend::with_string(&mut out, (800, 400)).into_drawing_area();
            draw_look_ahead(&area, data).unwrap();
        }
        Svg::parse(&out)
    }

    #[test]
    fn draws_history_with_a_marker_per_period_and_labels() {
        let svg = draw_svg(&sample());
        let demand = svg.polylines_with_stroke(&hex(DEMAND));
        assert_eq!(demand.len(), 1);
        assert_eq!(demand[0].len(), 24);
        // x strictly increasing: one point per period, in order.
        assert!(demand[0].windows(2).all(|w| w[1].0 > w[0].0));
        assert_eq!(svg.circles_with_fill(&hex(DEMAND)), 24);
        assert!(svg.texts.iter().any(|t| t == "demand (units)"));
        assert!(svg.texts.iter().any(|t| t == "95% band"));
        assert!(svg.texts.iter().any(|t| t == "holdout starts"));
        assert!(svg.texts.iter().any(|t| t.starts_with("2024-")));
    }

    #[test]
    fn filled_gaps_get_hollow_markers_and_a_legend_entry() {
        let mut data = sample();
        data.filled = vec![4, 5];
        let svg = draw_svg(&data);
        // 22 observed periods keep their filled markers; the two gaps are hollow (stroked in
        // the alert colour), plus the legend's sample.
        assert_eq!(svg.circles_with_fill(&hex(DEMAND)), 22);
        assert_eq!(svg.circles_with_stroke(&hex(ALERT)), 3);
        assert!(svg.texts.iter().any(|t| t == "filled gap"));
        assert!(look_ahead_summary(&data).contains("2 missing period(s) filled"));
        // Without gaps, no legend entry.
        let svg = draw_svg(&sample());
        assert!(!svg.texts.iter().any(|t| t == "filled gap"));
    }

    #[test]
    fn periods_missed_by_far_get_wide_rings_and_a_legend_entry() {
        let mut data = sample();
        data.far = vec![7];
        let svg = draw_svg(&data);
        // Every demand marker stays (24, plus the legend's dot); one ring in the alert colour
        // around period 7, plus the legend's.
        assert_eq!(svg.circles_with_fill(&hex(DEMAND)), 25);
        assert_eq!(svg.circles_with_stroke(&hex(ALERT)), 2);
        assert!(svg.texts.iter().any(|t| t == "missed by far (Outliers)"));
        assert!(look_ahead_summary(&data).contains("1 period(s) the fit misses by far are ringed"));
        let svg = draw_svg(&sample());
        assert!(!svg.texts.iter().any(|t| t == "missed by far (Outliers)"));
    }

    #[test]
    fn band_encloses_the_forecast_and_widens() {
        let data = sample();
        let svg = draw_svg(&data);
        let bands = svg.polygons_with_fill(&hex(FORECAST));
        // Legend swatch is a rectangle, so exactly one band polygon.
        assert_eq!(bands.len(), 1);
        let band = &bands[0];
        assert_eq!(band.len(), 1 + 2 * data.forecast.len());
        let forecast = svg.polylines_with_stroke(&hex(FORECAST));
        assert_eq!(forecast.len(), 1);
        let line = &forecast[0];
        assert_eq!(line.len(), 1 + data.forecast.len());
        // For each forecast position the band's high (smaller SVG y) is above the line and its
        // low below, and the band grows with the horizon as the data says.
        let h = data.forecast.len();
        let mut widths = Vec::new();
        for i in 0..h {
            let hi = band[1 + i];
            let lo = band[2 * h - i];
            assert_eq!(hi.0, lo.0);
            let p = line[1 + i];
            assert!((p.0 - hi.0).abs() <= 1);
            assert!(hi.1 < p.1 && p.1 < lo.1, "period {i}: {hi:?} {p:?} {lo:?}");
            widths.push(lo.1 - hi.1);
        }
        assert!(widths.windows(2).all(|w| w[1] > w[0]), "{widths:?}");
        // The forecast leaves from the last demand point.
        let demand = &svg.polylines_with_stroke(&hex(DEMAND))[0];
        assert_eq!(line[0], *demand.last().unwrap());
    }

    #[test]
    fn holdout_marker_sits_between_the_last_training_and_first_holdout_points() {
        let data = sample();
        let svg = draw_svg(&data);
        let demand = &svg.polylines_with_stroke(&hex(DEMAND))[0];
        let (x17, x18) = (demand[17].0, demand[18].0);
        let marker = svg.dashes_with_stroke(&hex(MARKER));
        assert!(!marker.is_empty());
        let x = marker[0][0].0;
        assert!(x17 < x && x < x18, "{x17} < {x} < {x18}");
        let holdout = svg.polylines_with_stroke(&hex(HOLDOUT));
        assert_eq!(holdout[0].len(), 6);
        assert_eq!(holdout[0][0].0, x18);
        // The fit has one run (first period undefined) drawn as dashes.
        assert!(svg.dashes_with_stroke(&hex(FITTED)).len() > 10);
    }

    #[test]
    fn bitmap_has_band_pixels_inside_the_forecast_region() {
        let data = sample();
        let (w, h) = (600u32, 300u32);
        let mut buf = vec![0u8; (w * h * 3) as usize];
        {
            let area = probe::TextlessBitmap(BitMapBackend::with_buffer(&mut buf, (w, h)))
                .into_drawing_area();
            draw_look_ahead(&area, &data).unwrap();
        }
        let tinted =
            probe::count_pixels_near(&buf, probe::blend(FORECAST, BACKGROUND, BAND_OPACITY), 12);
        assert!(tinted > 500, "only {tinted} band pixels");
        let background = probe::count_pixels_near(&buf, BACKGROUND, 0);
        assert!(background < (w * h) as usize, "the canvas is blank");
    }

    #[test]
    fn no_history_is_an_error_not_a_panic() {
        let mut data = sample();
        data.history.clear();
        data.fitted.clear();
        data.forecast.clear();
        data.holdout_forecast.clear();
        let mut out = String::new();
        let area = SVGBackend::with_string(&mut out, (300, 200)).into_drawing_area();
        assert_eq!(draw_look_ahead(&area, &data), Err(ChartError::NoData));
    }

    #[test]
    fn summary_names_periods_band_and_holdout() {
        let s = look_ahead_summary(&sample());
        assert!(s.contains("Demand for 24 periods"), "{s}");
        assert!(s.contains("holdout runs from 2024-07 (6 periods)"), "{s}");
        assert!(s.contains("Forecast for 6 periods"), "{s}");
        assert!(s.contains("95% band 45 to 65"), "{s}");
        assert!(s.contains("in the last (40 to 70)"), "{s}");
    }
}
