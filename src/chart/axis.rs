//! What the charts share around their series: the value range with headroom, period labels on
//! a position axis, the frame, and the legend.
//!
//! Kept apart from: drawing the series. Periods sit at whole-number positions 0, 1, 2, ...;
//! the axis runs from -0.5 to n - 0.5 so the first and last points are not on the frame.

use std::ops::Range;

use plotters::coord::Shift;
use plotters::element::DashedPathElement;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};

use super::palette::{BACKGROUND, GRID, INK};
use super::ChartError;

/// Font family of chart text: the system's sans-serif (no remote fonts).
pub const FONT: &str = "sans-serif";

/// What a legend row shows before its words: a sample of how its series is drawn.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Swatch {
    /// A solid line of this colour and width.
    Line(RGBColor, u32),
    /// A dashed line of this colour and width.
    Dashed(RGBColor, u32),
    /// A box filled with this colour at this opacity (a band).
    Fill(RGBColor, f64),
    /// A hollow ring (the filled-gap marker).
    Ring(RGBColor),
    /// A dot in a wide ring (a period the fit misses by far).
    Ringed(RGBColor, RGBColor),
}

/// Radius of the ring around a period the fit misses by far, in pixels: wider than the
/// filled-gap ring (4), so the two read apart.
pub const FAR_RING_RADIUS: i32 = 7;

/// One legend row: a swatch and its words.
#[derive(Clone, Debug, PartialEq)]
pub struct LegendEntry {
    pub label: String,
    pub swatch: Swatch,
}

impl LegendEntry {
    pub fn new(label: impl Into<String>, swatch: Swatch) -> Self {
        LegendEntry {
            label: label.into(),
            swatch,
        }
    }
}

/// Where the legend box sits in the plotting area.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum Corner {
    UpperLeft,
    UpperRight,
}

/// Size of legend text in pixels (as the axis labels).
const LEGEND_TEXT: u32 = 13;
/// Gap between the plotting area's edge and the legend box, and inside the box around its rows.
const LEGEND_INSET: i32 = 6;
const LEGEND_PADDING: i32 = 8;
/// Width of a swatch and the gap between it and its words.
const SWATCH_WIDTH: i32 = 18;
const SWATCH_GAP: i32 = 8;

/// Where a legend's parts go, in pixels of the plotting area.
struct LegendLayout {
    upper_left: (i32, i32),
    size: (i32, i32),
    /// Where each row's words start: (left, middle y); its swatch sits before them.
    rows: Vec<(i32, i32)>,
}

/// The legend box's place and its rows, from the measured size of each label.
fn legend_layout(area: (u32, u32), text_sizes: &[(u32, u32)], corner: Corner) -> LegendLayout {
    let widest = text_sizes.iter().map(|s| s.0 as i32).max().unwrap_or(0);
    // Rows as tall as the tallest text, and never tighter than 1.25 lines (plotters' own
    // legend spacing), so rows never touch.
    let row = text_sizes
        .iter()
        .map(|s| s.1 as i32)
        .max()
        .unwrap_or(0)
        .max((f64::from(LEGEND_TEXT) * 1.25).round() as i32);
    let size = (
        LEGEND_PADDING + SWATCH_WIDTH + SWATCH_GAP + widest + LEGEND_PADDING,
        LEGEND_PADDING * 2 + row * text_sizes.len() as i32,
    );
    let left = match corner {
        Corner::UpperLeft => LEGEND_INSET,
        Corner::UpperRight => area.0 as i32 - size.0 - LEGEND_INSET,
    };
    let top = LEGEND_INSET;
    let rows = (0..text_sizes.len() as i32)
        .map(|i| {
            (
                left + LEGEND_PADDING + SWATCH_WIDTH + SWATCH_GAP,
                top + LEGEND_PADDING + i * row + row / 2,
            )
        })
        .collect();
    LegendLayout {
        upper_left: (left, top),
        size,
        rows,
    }
}

/// Draws a legend of `entries` in a corner of the chart's plotting area, in the charts' common
/// style. Each label is measured by the chart's own backend (the page's canvas measures with
/// the canvas: src/chart/canvas.rs), so the box fits the words as drawn. Plotters' own series
/// legend is not used: it measures through the font, which in the browser means a span with an
/// inline style in the page (refused by its Content-Security-Policy).
pub fn draw_legend<'a, DB, CT>(
    chart: &ChartContext<'a, DB, CT>,
    entries: &[LegendEntry],
    corner: Corner,
) -> Result<(), ChartError>
where
    DB: DrawingBackend + 'a,
    DB::ErrorType: 'static,
    CT: CoordTranslate,
{
    if entries.is_empty() {
        return Ok(());
    }
    let area = chart.plotting_area().strip_coord_spec();
    let style = (FONT, LEGEND_TEXT)
        .into_font()
        .color(&INK)
        .pos(Pos::new(HPos::Left, VPos::Center));
    let sizes = entries
        .iter()
        .map(|e| area.estimate_text_size(&e.label, &style))
        .collect::<Result<Vec<_>, _>>()?;
    let LegendLayout {
        upper_left: (left, top),
        size: (w, h),
        rows,
    } = legend_layout(area.dim_in_pixel(), &sizes, corner);
    let corners = [(left, top), (left + w, top + h)];
    area.draw(&Rectangle::new(corners, BACKGROUND.mix(0.9).filled()))?;
    area.draw(&Rectangle::new(corners, INK.mix(0.25)))?;
    for (entry, (x, y)) in entries.iter().zip(rows) {
        let x0 = x - SWATCH_GAP - SWATCH_WIDTH;
        let ends = vec![(x0, y), (x0 + SWATCH_WIDTH, y)];
        match entry.swatch {
            Swatch::Line(c, width) => area.draw(&PathElement::new(ends, c.stroke_width(width)))?,
            Swatch::Dashed(c, width) => {
                area.draw(&DashedPathElement::new(ends, 6, 3, c.stroke_width(width)))?
            }
            Swatch::Fill(c, opacity) => area.draw(&Rectangle::new(
                [(x0, y - 5), (x0 + SWATCH_WIDTH, y + 5)],
                c.mix(opacity).filled(),
            ))?,
            Swatch::Ring(c) => area.draw(&Circle::new(
                (x0 + SWATCH_WIDTH / 2, y),
                4,
                c.stroke_width(2),
            ))?,
            Swatch::Ringed(dot, ring) => {
                area.draw(&Circle::new((x0 + SWATCH_WIDTH / 2, y), 3, dot.filled()))?;
                area.draw(&Circle::new(
                    (x0 + SWATCH_WIDTH / 2, y),
                    FAR_RING_RADIUS,
                    ring.stroke_width(2),
                ))?
            }
        }
        area.draw(&Text::new(entry.label.as_str(), (x, y), style.clone()))?;
    }
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

    /// Draws a legend of two rows into a recorder measuring `char_width` pixels a character.
    fn recorded_legend(char_width: u32, corner: Corner) -> crate::chart::probe::Record {
        use crate::chart::palette::{DEMAND, HOLDOUT};
        use crate::chart::probe::Recorder;
        let record = std::rc::Rc::new(std::cell::RefCell::new(Default::default()));
        let area = Recorder {
            size: (600, 300),
            char_width,
            record: record.clone(),
        }
        .into_drawing_area();
        let chart = ChartBuilder::on(&area)
            .build_cartesian_2d(0.0..1.0, 0.0..1.0)
            .unwrap();
        let entries = [
            LegendEntry::new("demand", Swatch::Line(DEMAND, 2)),
            LegendEntry::new("holdout forecast", Swatch::Line(HOLDOUT, 2)),
        ];
        draw_legend(&chart, &entries, corner).unwrap();
        drop(chart);
        drop(area);
        std::rc::Rc::try_unwrap(record).unwrap().into_inner()
    }

    // Our layout: the box is as wide as its widest label as the backend measures it, plus the
    // swatch and paddings; every label lies inside it, rows one under the other.
    #[test]
    fn the_legend_box_is_sized_from_the_backends_measurements() {
        for char_width in [7, 14] {
            let record = recorded_legend(char_width, Corner::UpperRight);
            let boxes: Vec<_> = record
                .filled_rects
                .iter()
                .filter(|r| r.2 == BACKGROUND)
                .collect();
            assert_eq!(boxes.len(), 1, "{boxes:?}");
            let (upper_left, lower_right, _) = *boxes[0];
            let widest = 16 * char_width as i32;
            assert_eq!(
                lower_right.0 - upper_left.0,
                LEGEND_PADDING * 2 + SWATCH_WIDTH + SWATCH_GAP + widest
            );
            assert_eq!(lower_right.0, 600 - LEGEND_INSET, "flush with the right");
            assert_eq!(record.texts.len(), 2);
            let mut last_bottom = upper_left.1;
            for (text, (x, y), (w, h)) in &record.texts {
                let (w, h) = (*w as i32, *h as i32);
                assert!(
                    upper_left.0 < *x && x + w <= lower_right.0 - LEGEND_PADDING,
                    "{text} sticks out sideways"
                );
                assert!(
                    last_bottom <= y - h / 2 && y + h / 2 <= lower_right.1 - LEGEND_PADDING / 2,
                    "{text} overlaps a row or sticks out"
                );
                last_bottom = y + h / 2;
            }
        }
        let left = recorded_legend(7, Corner::UpperLeft);
        assert_eq!(left.filled_rects[0].0, (LEGEND_INSET, LEGEND_INSET));
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
