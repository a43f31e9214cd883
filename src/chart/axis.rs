//! Axes shared by the charts: the value range with headroom, and period labels on a position axis.
//!
//! Kept apart from: drawing the series. Periods sit at whole-number positions 0, 1, 2, ...;
//! the axis runs from -0.5 to n - 0.5 so the first and last points are not on the frame.

use std::ops::Range;

use plotters::coord::Shift;
use plotters::prelude::*;

use super::palette::{BACKGROUND, GRID, INK};
use super::ChartError;

/// Font family of chart text: the system's sans-serif (no remote fonts).
pub const FONT: &str = "sans-serif";

/// Draws the legend of the series drawn so far, in the charts' common style, at `position`.
pub fn draw_legend<'a, DB, CT>(
    chart: &mut ChartContext<'a, DB, CT>,
    position: SeriesLabelPosition,
) -> Result<(), ChartError>
where
    DB: DrawingBackend + 'a,
    DB::ErrorType: 'static,
    CT: CoordTranslate,
{
    chart
        .configure_series_labels()
        .position(position)
        .background_style(BACKGROUND.mix(0.9))
        .border_style(INK.mix(0.25))
        .label_font((FONT, 13).into_font().color(&INK))
        .draw()?;
    Ok(())
}

/// A value range covering every finite value, with 6 % headroom, from zero when all values are
/// non-negative (demand charts start at zero so heights compare honestly). `None` when no value
/// is finite.
pub fn value_range(values: impl IntoIterator<Item = f64>) -> Option<Range<f64>> {
    let (mut lo, mut hi) = (f64::INFINITY, f64::NEG_INFINITY);
    for v in values.into_iter().filter(|v| v.is_finite()) {
        lo = lo.min(v);
        hi = hi.max(v);
    }
    if !lo.is_finite() {
        return None;
    }
    if lo >= 0.0 {
        lo = 0.0;
    }
    if hi <= lo {
        hi = lo + 1.0;
    }
    let pad = (hi - lo) * 0.06;
    Some(if lo == 0.0 {
        0.0..hi + pad
    } else {
        lo - pad..hi + pad
    })
}

/// The label of the period at position `x` when `x` is (close to) a whole number inside the
/// labels, else "" (the mesh asks for labels at arbitrary tick values).
pub fn period_label(labels: &[String], x: f64) -> String {
    let r = x.round();
    if (x - r).abs() > 1e-6 || r < 0.0 {
        return String::new();
    }
    labels.get(r as usize).cloned().unwrap_or_default()
}

/// Number of x labels that fit: about one per 70 pixels, at most one per period.
pub fn x_label_count(width: u32, periods: usize) -> usize {
    ((width / 70) as usize).clamp(2, periods.max(2))
}

/// Positions that carry a period label: every `step` periods from the first, with the step the
/// smallest of 1, 2, 3, 4, 6, 12, 24, 36, ... (whole seasons of months and quarters) that keeps
/// the labels within `max_labels`. Regular steps keep a year's labels on the same month.
pub fn tick_positions(periods: usize, max_labels: usize) -> Vec<f64> {
    let max_labels = max_labels.max(1);
    let mut steps = vec![1usize, 2, 3, 4, 6];
    steps.extend(
        (1..)
            .map(|k| 12 * k)
            .take_while(|s| *s < periods.max(12) * 2),
    );
    let step = steps
        .into_iter()
        .find(|s| periods.div_ceil(*s) <= max_labels)
        .unwrap_or(periods.max(1));
    (0..periods).step_by(step).map(|p| p as f64).collect()
}

/// The time axis: positions as f64, labelled only at [`tick_positions`] (plotters would
/// otherwise pick "nice" decimal ticks, which drift across the months of a year).
pub struct PeriodAxis {
    inner: plotters::coord::types::RangedCoordf64,
    ticks: Vec<f64>,
}

impl Ranged for PeriodAxis {
    type FormatOption = plotters::coord::ranged1d::DefaultFormatting;
    type ValueType = f64;
    fn map(&self, value: &f64, limit: (i32, i32)) -> i32 {
        self.inner.map(value, limit)
    }
    fn key_points<Hint: plotters::coord::ranged1d::KeyPointHint>(&self, _hint: Hint) -> Vec<f64> {
        self.ticks.clone()
    }
    fn range(&self) -> Range<f64> {
        self.inner.range()
    }
}

/// A Cartesian chart over positions 0..periods and the given value range, with our calm frame:
/// light horizontal lines only, period labels below, the value unit on the left.
pub fn frame<'a, DB: DrawingBackend + 'a>(
    area: &'a DrawingArea<DB, Shift>,
    periods: usize,
    values: Range<f64>,
    y_desc: &str,
    labels: &'a [String],
) -> Result<
    ChartContext<'a, DB, Cartesian2d<PeriodAxis, plotters::coord::types::RangedCoordf64>>,
    ChartError,
>
where
    DB::ErrorType: 'static,
{
    let (width, _) = area.dim_in_pixel();
    let mut chart = ChartBuilder::on(area)
        .margin(12)
        .x_label_area_size(34)
        .y_label_area_size(56)
        .build_cartesian_2d(
            PeriodAxis {
                inner: (-0.5..(periods.max(1) as f64 - 0.5)).into(),
                ticks: tick_positions(periods, x_label_count(width, periods)),
            },
            values,
        )?;
    let label_fmt = move |x: &f64| period_label(labels, *x);
    let value_fmt = |v: &f64| super::round_for_people(*v);
    chart
        .configure_mesh()
        .disable_x_mesh()
        .light_line_style(BACKGROUND)
        .bold_line_style(GRID.stroke_width(1))
        .axis_style(INK.mix(0.6))
        .y_labels(6)
        .x_label_formatter(&label_fmt)
        .y_label_formatter(&value_fmt)
        .label_style((FONT, 13).into_font().color(&INK))
        .axis_desc_style((FONT, 13).into_font().color(&INK))
        .y_desc(y_desc)
        .draw()?;
    Ok(chart)
}

#[cfg(test)]
mod tests {
    use super::*;

    // Our choice: demand axes start at zero; negative data gets symmetric headroom.
    #[test]
    fn value_range_starts_at_zero_for_demand_and_pads() {
        let r = value_range([3.0, 10.0, f64::NAN]).unwrap();
        assert_eq!(r.start, 0.0);
        assert!((r.end - 10.6).abs() < 1e-12);
        let r = value_range([-2.0, 2.0]).unwrap();
        assert!((r.start + 2.24).abs() < 1e-12 && (r.end - 2.24).abs() < 1e-12);
        assert_eq!(value_range([f64::NAN]), None);
        let flat = value_range([0.0, 0.0]).unwrap();
        assert!(flat.end > flat.start);
    }

    #[test]
    fn period_labels_only_at_whole_positions() {
        let labels: Vec<String> = ["2024-01", "2024-02"]
            .iter()
            .map(|s| s.to_string())
            .collect();
        assert_eq!(period_label(&labels, 1.0), "2024-02");
        assert_eq!(period_label(&labels, 0.5), "");
        assert_eq!(period_label(&labels, 2.0), "");
        assert_eq!(period_label(&labels, -1.0), "");
        assert_eq!(x_label_count(700, 60), 10);
        assert_eq!(x_label_count(700, 3), 3);
    }

    #[test]
    fn ticks_step_by_whole_seasons() {
        assert_eq!(tick_positions(5, 10), vec![0.0, 1.0, 2.0, 3.0, 4.0]);
        // 72 months, 10 labels: every 12 months.
        let t = tick_positions(72, 10);
        assert_eq!(t.len(), 6);
        assert!(t.windows(2).all(|w| w[1] - w[0] == 12.0));
        // 240 months, 8 labels: every 36.
        assert_eq!(tick_positions(240, 8)[1], 36.0);
        assert_eq!(tick_positions(0, 8), Vec::<f64>::new());
    }
}
