//! The page's drawing surface: a canvas drawn at the screen's pixel density, with chart text
//! measured by the canvas itself. wasm only.
//!
//! Kept apart from: the charts, which stay generic over plotters' `DrawingBackend` (native
//! tests draw them into SVG and bitmaps), and from the page's components (src/page/browser.rs
//! hands a canvas element here). Why not plotters_canvas::CanvasBackend alone: it measures text
//! through plotters' `web` font code, which appends a span with an inline `style` attribute to
//! the body (the page's Content-Security-Policy refuses it: one violation per label, and wrong
//! sizes), and it takes the canvas's backing store for the chart's size, so a store of twice
//! the CSS size would draw everything at half size. This type draws through it for every shape
//! and text, and answers those two questions itself.

use plotters_backend::{
    BackendColor, BackendCoord, BackendStyle, BackendTextStyle, DrawingBackend, DrawingErrorKind,
};
use plotters_canvas::CanvasBackend;
use wasm_bindgen::JsCast;
use web_sys::{CanvasRenderingContext2d, HtmlCanvasElement};

/// The error of the canvas underneath (plotters_canvas does not name its type).
type CanvasError = <CanvasBackend as DrawingBackend>::ErrorType;

/// Why a text could not be measured: the canvas refused the font or the measurement.
#[derive(Debug)]
pub struct MeasureError(String);

impl std::fmt::Display for MeasureError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "the canvas could not measure chart text ({})", self.0)
    }
}

impl std::error::Error for MeasureError {}

/// A canvas sized for the screen: its backing store holds `density` device pixels per CSS
/// pixel, its context is scaled to match, and charts draw in CSS pixels (so line widths, fonts
/// and layout are those of a density-1 screen, only sharper).
pub struct PageCanvas {
    inner: CanvasBackend,
    context: CanvasRenderingContext2d,
    /// The drawing size in whole CSS pixels, which the charts lay out in.
    size: (u32, u32),
}

impl PageCanvas {
    /// Sizes `canvas`'s backing store to `css` (its laid-out size in CSS pixels, fractions
    /// kept) times `density` (the window's devicePixelRatio), rounded, so one store pixel is
    /// one device pixel; scales its context by exactly `density`. The chart's size is the whole
    /// CSS pixels the store holds: a scale off by a fraction would put every line between
    /// device pixels and blur it, so a fraction of a CSS pixel right of and below the chart is
    /// left as paper. `None` when the browser gives no 2D context.
    pub fn new(canvas: &HtmlCanvasElement, css: (f64, f64), density: f64) -> Option<Self> {
        let density = if density.is_finite() && density > 0.0 {
            density
        } else {
            1.0
        };
        let store_of = |css: f64| ((css.max(1.0) * density).round() as u32).max(1);
        let store = (store_of(css.0), store_of(css.1));
        let whole_css = |store: u32| ((f64::from(store) / density).floor() as u32).max(1);
        let size = (whole_css(store.0), whole_css(store.1));
        // Setting a size clears the canvas and its state, so only when it changes; the
        // transform below is set absolutely, so a redraw never scales twice.
        if canvas.width() != store.0 {
            canvas.set_width(store.0);
        }
        if canvas.height() != store.1 {
            canvas.set_height(store.1);
        }
        let context: CanvasRenderingContext2d = canvas.get_context("2d").ok()??.dyn_into().ok()?;
        // The whole store in paper first, device pixel for device pixel, so the fraction beyond
        // the chart's whole CSS pixels is paper in a saved PNG too.
        context.set_transform(1.0, 0.0, 0.0, 1.0, 0.0, 0.0).ok()?;
        let paper = super::palette::BACKGROUND;
        context.set_fill_style_str(&format!("rgb({},{},{})", paper.0, paper.1, paper.2));
        context.fill_rect(0.0, 0.0, f64::from(store.0), f64::from(store.1));
        context
            .set_transform(density, 0.0, 0.0, density, 0.0, 0.0)
            .ok()?;
        let inner = CanvasBackend::with_canvas_object(canvas.clone())?;
        Some(PageCanvas {
            inner,
            context,
            size,
        })
    }

    /// The CSS font of a text style, as plotters_canvas sets it before it draws the text
    /// ("normal 13px sans-serif"), so measuring and drawing use the same font.
    fn font<S: BackendTextStyle>(style: &S) -> String {
        format!(
            "{} {}px {}",
            style.style().as_str(),
            style.size(),
            style.family().as_str()
        )
    }
}

impl DrawingBackend for PageCanvas {
    type ErrorType = CanvasError;

    fn get_size(&self) -> (u32, u32) {
        self.size
    }

    fn ensure_prepared(&mut self) -> Result<(), DrawingErrorKind<CanvasError>> {
        self.inner.ensure_prepared()
    }

    fn present(&mut self) -> Result<(), DrawingErrorKind<CanvasError>> {
        self.inner.present()
    }

    fn draw_pixel(
        &mut self,
        point: BackendCoord,
        color: BackendColor,
    ) -> Result<(), DrawingErrorKind<CanvasError>> {
        self.inner.draw_pixel(point, color)
    }

    fn draw_line<S: BackendStyle>(
        &mut self,
        from: BackendCoord,
        to: BackendCoord,
        style: &S,
    ) -> Result<(), DrawingErrorKind<CanvasError>> {
        self.inner.draw_line(from, to, style)
    }

    fn draw_rect<S: BackendStyle>(
        &mut self,
        upper_left: BackendCoord,
        bottom_right: BackendCoord,
        style: &S,
        fill: bool,
    ) -> Result<(), DrawingErrorKind<CanvasError>> {
        self.inner.draw_rect(upper_left, bottom_right, style, fill)
    }

    fn draw_path<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(
        &mut self,
        path: I,
        style: &S,
    ) -> Result<(), DrawingErrorKind<CanvasError>> {
        self.inner.draw_path(path, style)
    }

    fn draw_circle<S: BackendStyle>(
        &mut self,
        center: BackendCoord,
        radius: u32,
        style: &S,
        fill: bool,
    ) -> Result<(), DrawingErrorKind<CanvasError>> {
        self.inner.draw_circle(center, radius, style, fill)
    }

    fn fill_polygon<S: BackendStyle, I: IntoIterator<Item = BackendCoord>>(
        &mut self,
        vert: I,
        style: &S,
    ) -> Result<(), DrawingErrorKind<CanvasError>> {
        self.inner.fill_polygon(vert, style)
    }

    fn draw_text<S: BackendTextStyle>(
        &mut self,
        text: &str,
        style: &S,
        pos: BackendCoord,
    ) -> Result<(), DrawingErrorKind<CanvasError>> {
        self.inner.draw_text(text, style, pos)
    }

    /// Width from the canvas's own measurement of `text` in the style's font; height from the
    /// font's box (ascent plus descent), the same for every text of a font as a line box is,
    /// so labels of one size line up. Rounded up, so a box sized from it holds the text.
    fn estimate_text_size<S: BackendTextStyle>(
        &self,
        text: &str,
        style: &S,
    ) -> Result<(u32, u32), DrawingErrorKind<CanvasError>> {
        self.context.set_font(&Self::font(style));
        let metrics = self.context.measure_text(text).map_err(|e| {
            DrawingErrorKind::FontError(Box::new(MeasureError(
                e.as_string().unwrap_or_else(|| format!("{e:?}")),
            )))
        })?;
        let height = metrics.font_bounding_box_ascent() + metrics.font_bounding_box_descent();
        // A browser without font boxes: a line of the font's size, as CSS's `normal` is about.
        let height = if height.is_finite() && height > 0.0 {
            height
        } else {
            style.size() * 1.2
        };
        Ok((metrics.width().ceil() as u32, height.ceil() as u32))
    }
}
