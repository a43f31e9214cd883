//! The tracking-signal chart of the Error ledger: the signal per holdout period against its
//! limits, out-of-limit periods marked.
//!
//! Kept apart from: computing the signal (the engine's ledger does: tracking signal = bias / MAD,
//! with bias the running sum of errors e = F - D). Periods where it is undefined (MAD zero) are
//! left out of the line.

use plotters::element::DashedPathElement;
use plotters::prelude::*;

use super::axis::frame;
use super::palette::{ALERT, DEMAND, MARKER};
use super::{clear, Area, ChartError};

/// The tracking-signal chart's data.
#[derive(Clone, Debug, PartialEq)]
pub struct Tracking {
    pub labels: Vec<String>,
    pub signal: Vec<Option<f64>>,
    /// The limit L: marks where |signal| > L.
    pub limit: f64,
}

/// Draws the signal with limits at plus and minus L; out-of-limit periods get a large hollow
/// ring in the alert colour around their marker.
pub fn draw_tracking<DB: DrawingBackend>(
    area: &Area<'_, DB>,
    data: &Tracking,
) -> Result<(), ChartError>
where
    DB::ErrorType: 'static,
{
    clear(area)?;
    let points: Vec<(f64, f64)> = data
        .signal
        .iter()
        .enumerate()
        .filter_map(|(i, s)| s.filter(|v| v.is_finite()).map(|v| (i as f64, v)))
        .collect();
    if data.signal.is_empty() {
        return Err(ChartError::NoData);
    }
    let extent = points
        .iter()
        .map(|p| p.1.abs())
        .fold(data.limit.abs(), f64::max)
        .max(1.0)
        * 1.15;
    let mut chart = frame(
        area,
        data.signal.len(),
        -extent..extent,
        "tracking signal",
        &data.labels,
    )?;
    let n = data.signal.len() as f64;
    for l in [data.limit, -data.limit] {
        chart.draw_series(std::iter::once(DashedPathElement::new(
            vec![(-0.5, l), (n - 0.5, l)],
            5,
            4,
            MARKER.stroke_width(1),
        )))?;
    }
    chart.draw_series(std::iter::once(PathElement::new(
        points.clone(),
        DEMAND.stroke_width(2),
    )))?;
    chart.draw_series(points.iter().map(|p| Circle::new(*p, 3, DEMAND.filled())))?;
    chart.draw_series(
        points
            .iter()
            .filter(|p| p.1.abs() > data.limit)
            .map(|p| Circle::new(*p, 8, ALERT.stroke_width(3))),
    )?;
    area.present()?;
    Ok(())
}

/// Summary: how many periods left the limits, and which.
pub fn tracking_summary(data: &Tracking) -> String {
    let out: Vec<&str> = data
        .signal
        .iter()
        .zip(&data.labels)
        .filter(|(s, _)| s.is_some_and(|v| v.abs() > data.limit))
        .map(|(_, l)| l.as_str())
        .collect();
    let limit = super::round_for_people(data.limit);
    if out.is_empty() {
        format!(
            "The tracking signal stayed within plus and minus {limit} in all {} holdout periods.",
            data.signal.len()
        )
    } else {
        format!(
            "The tracking signal left plus or minus {limit} in {} of {} holdout periods: {}.",
            out.len(),
            data.signal.len(),
            out.join(", ")
        )
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::chart::palette::hex;
    use crate::chart::probe::Svg;

    fn sample() -> Tracking {
        Tracking {
            labels: (1..=6).map(|m| format!("2025-{m:02}")).collect(),
            signal: vec![None, Some(1.0), Some(2.0), Some(4.5), Some(-5.0), Some(3.0)],
            limit: 4.0,
        }
    }

    #[test]
    fn marks_exactly_the_out_of_limit_periods() {
        let data = sample();
        let mut out = String::new();
        {
            let area = SVGBackend::with_string(&mut out, (600, 260)).into_drawing_area();
            draw_tracking(&area, &data).unwrap();
        }
        let svg = Svg::parse(&out);
        let line = &svg.polylines_with_stroke(&hex(DEMAND))[0];
        assert_eq!(line.len(), 5, "undefined first period left out");
        let rings: Vec<&crate::chart::probe::Element> = svg
            .elements
            .iter()
            .filter(|e| {
                e.tag == "circle"
                    && e.attr("stroke")
                        .is_some_and(|s| s.eq_ignore_ascii_case(&hex(ALERT)))
            })
            .collect();
        assert_eq!(rings.len(), 2);
        let ring_x: Vec<i32> = rings
            .iter()
            .map(|e| e.attr("cx").unwrap().parse().unwrap())
            .collect();
        assert_eq!(ring_x, vec![line[2].0, line[3].0]);
        assert_eq!(
            tracking_summary(&data),
            "The tracking signal left plus or minus 4 in 2 of 6 holdout periods: 2025-04, 2025-05."
        );
    }

    #[test]
    fn within_limits_sentence() {
        let mut data = sample();
        data.limit = 6.0;
        assert_eq!(
            tracking_summary(&data),
            "The tracking signal stayed within plus and minus 6 in all 6 holdout periods."
        );
    }
}
