//! Charts: the drawings of the page (Look-ahead, Pattern view, tracking signal), as functions
//! generic over plotters' [`DrawingBackend`], each with a plain-words summary for the text beside it.
//!
//! Kept apart from: the engine and the DOM. A chart takes plain numbers and labels (the app turns
//! an engine plan into them) and draws into any backend: a canvas in the page, SVG or a bitmap in
//! native tests. Nothing here computes a forecast or a measure; it only places what it is given.
//! The one piece that knows a browser object is canvas.rs (wasm only): the page's backend.

pub mod axis;
#[cfg(target_arch = "wasm32")]
pub mod canvas;
pub mod lookahead;
pub mod palette;
pub mod pattern;
pub mod tracking;

#[cfg(test)]
mod probe;

use std::fmt;

use plotters::coord::Shift;
use plotters::drawing::DrawingAreaErrorKind;
use plotters::prelude::{DrawingArea, DrawingBackend};

pub use lookahead::{draw_look_ahead, look_ahead_summary, LookAhead};
pub use pattern::{
    autocorrelation_summary, draw_autocorrelation, draw_history, draw_overlay, history_summary,
    overlay_summary, Autocorrelation, History, Overlay,
};
pub use tracking::{draw_tracking, tracking_summary, Tracking};

/// Why a chart could not be drawn.
#[derive(Clone, Debug, PartialEq)]
pub enum ChartError {
    /// There is nothing to draw: load data first.
    NoData,
    /// The drawing surface refused a drawing step (the message is the surface's); reload the page.
    Backend(String),
}

impl fmt::Display for ChartError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            ChartError::NoData => f.write_str("there is nothing to draw yet: load data first"),
            ChartError::Backend(m) => {
                write!(f, "the chart could not be drawn ({m}): reload the page")
            }
        }
    }
}

impl std::error::Error for ChartError {}

impl<E: std::error::Error + Send + Sync> From<DrawingAreaErrorKind<E>> for ChartError {
    fn from(e: DrawingAreaErrorKind<E>) -> Self {
        ChartError::Backend(e.to_string())
    }
}

/// The drawing area every chart function takes.
pub type Area<'a, DB> = DrawingArea<DB, Shift>;

/// Clears the area to the chart background.
pub(crate) fn clear<DB: DrawingBackend>(area: &Area<'_, DB>) -> Result<(), ChartError>
where
    DB::ErrorType: 'static,
{
    area.fill(&palette::BACKGROUND)?;
    Ok(())
}

/// The hollow marker of a gap filled by interpolation (not demand anyone saw), the same on
/// every chart of the history.
pub(crate) fn filled_gap_marker(at: (f64, f64)) -> plotters::element::Circle<(f64, f64), i32> {
    use plotters::style::Color;
    plotters::element::Circle::new(at, 4, palette::ALERT.stroke_width(2))
}

/// The summaries' sentence on filled gaps (empty when there are none).
pub(crate) fn filled_gaps_words(count: usize) -> String {
    if count == 0 {
        return String::new();
    }
    format!(" {count} missing period(s) filled by straight-line interpolation (hollow markers).")
}

/// A number for people: no decimals from 100 up, one below, two below 1 (charts and summaries).
pub fn round_for_people(v: f64) -> String {
    if !v.is_finite() {
        return "not available".to_string();
    }
    let a = v.abs();
    if a >= 100.0 {
        format!("{v:.0}")
    } else if a >= 1.0 || a == 0.0 {
        let s = format!("{v:.1}");
        s.strip_suffix(".0").map(str::to_string).unwrap_or(s)
    } else {
        format!("{v:.2}")
    }
}

#[cfg(test)]
mod tests {
    use super::round_for_people;

    // Rounding rule of this project (our choice): whole numbers from 100 up.
    #[test]
    fn rounding_for_people() {
        assert_eq!(round_for_people(1234.56), "1235");
        assert_eq!(round_for_people(12.34), "12.3");
        assert_eq!(round_for_people(12.0), "12");
        assert_eq!(round_for_people(0.456), "0.46");
        assert_eq!(round_for_people(0.0), "0");
        assert_eq!(round_for_people(-3.25), "-3.2");
        assert_eq!(round_for_people(f64::NAN), "not available");
    }
}
