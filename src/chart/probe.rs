//! Test helpers: read back what a chart drew into plotters' SVG backend (one element per line)
//! and count pixels of a bitmap. Test-only; kept apart from the charts themselves.

use plotters::style::RGBColor;

type Point = (i32, i32);

/// One drawn element with its attributes.
#[derive(Debug, Clone)]
pub struct Element {
    pub tag: String,
    pub attrs: Vec<(String, String)>,
}

impl Element {
    pub fn attr(&self, key: &str) -> Option<&str> {
        self.attrs
            .iter()
            .find(|(k, _)| k == key)
            .map(|(_, v)| v.as_str())
    }
    fn points(&self) -> Vec<Point> {
        self.attr("points")
            .unwrap_or("")
            .split_whitespace()
            .filter_map(|p| {
                let (x, y) = p.split_once(',')?;
                Some((x.parse().ok()?, y.parse().ok()?))
            })
            .collect()
    }
    fn opaque(&self) -> bool {
        self.attr("opacity").map(|o| o == "1").unwrap_or(true)
    }
}

/// The elements and texts of one SVG document written by plotters.
#[derive(Debug, Default)]
pub struct Svg {
    pub elements: Vec<Element>,
    pub texts: Vec<String>,
}

impl Svg {
    pub fn parse(doc: &str) -> Svg {
        let mut svg = Svg::default();
        let mut lines = doc.lines();
        while let Some(line) = lines.next() {
            let line = line.trim();
            let Some(rest) = line.strip_prefix('<') else {
                continue;
            };
            if rest.starts_with('/') {
                continue;
            }
            let tag: String = rest
                .chars()
                .take_while(|c| c.is_ascii_alphabetic())
                .collect();
            let mut attrs = Vec::new();
            let mut s = &rest[tag.len()..];
            while let Some(eq) = s.find("=\"") {
                let key = s[..eq].trim().to_string();
                let after = &s[eq + 2..];
                let end = after.find('"').unwrap_or(after.len());
                attrs.push((key, after[..end].to_string()));
                s = &after[(end + 1).min(after.len())..];
            }
            if tag == "text" {
                let content = lines.next().unwrap_or("").replace("&amp;", "&");
                svg.texts.push(content);
            }
            svg.elements.push(Element { tag, attrs });
        }
        svg
    }

    /// Opaque polylines of this stroke colour with at least three points (legend swatches and
    /// dashes have two).
    pub fn polylines_with_stroke(&self, colour: &str) -> Vec<Vec<Point>> {
        self.select("polyline", "stroke", colour)
            .map(Element::points)
            .filter(|p| p.len() >= 3)
            .collect()
    }

    /// Opaque two-point polylines (dashes) of this stroke colour.
    pub fn dashes_with_stroke(&self, colour: &str) -> Vec<Vec<Point>> {
        self.select("polyline", "stroke", colour)
            .map(Element::points)
            .filter(|p| p.len() == 2)
            .collect()
    }

    /// Polygons of this fill colour (any opacity).
    pub fn polygons_with_fill(&self, colour: &str) -> Vec<Vec<Point>> {
        self.elements
            .iter()
            .filter(|e| e.tag == "polygon")
            .filter(|e| {
                e.attr("fill")
                    .is_some_and(|f| f.eq_ignore_ascii_case(colour))
            })
            .map(Element::points)
            .collect()
    }

    pub fn circles_with_fill(&self, colour: &str) -> usize {
        self.select("circle", "fill", colour).count()
    }

    /// Circles outlined in this colour (hollow markers).
    pub fn circles_with_stroke(&self, colour: &str) -> usize {
        self.select("circle", "stroke", colour).count()
    }

    /// Opaque rectangles of this fill colour, as (x, y, width, height).
    pub fn rects_with_fill(&self, colour: &str) -> Vec<(i32, i32, i32, i32)> {
        self.select("rect", "fill", colour)
            .filter_map(|e| {
                let n = |k| e.attr(k)?.parse::<i32>().ok();
                Some((n("x")?, n("y")?, n("width")?, n("height")?))
            })
            .collect()
    }

    fn select<'a>(
        &'a self,
        tag: &'a str,
        key: &'a str,
        colour: &'a str,
    ) -> impl Iterator<Item = &'a Element> + 'a {
        self.elements.iter().filter(move |e| {
            e.tag == tag
                && e.opaque()
                && e.attr(key).is_some_and(|v| v.eq_ignore_ascii_case(colour))
        })
    }
}

/// The colour of `top` at `opacity` over `bottom`.
pub fn blend(top: RGBColor, bottom: RGBColor, opacity: f64) -> RGBColor {
    let m = |a: u8, b: u8| (f64::from(a) * opacity + f64::from(b) * (1.0 - opacity)).round() as u8;
    RGBColor(m(top.0, bottom.0), m(top.1, bottom.1), m(top.2, bottom.2))
}

/// Pixels of an RGB buffer within `tolerance` (per channel) of `colour`.
pub fn count_pixels_near(buf: &[u8], colour: RGBColor, tolerance: u8) -> usize {
    buf.chunks_exact(3)
        .filter(|p| {
            p[0].abs_diff(colour.0) <= tolerance
                && p[1].abs_diff(colour.1) <= tolerance
                && p[2].abs_diff(colour.2) <= tolerance
        })
        .count()
}

/// A bitmap backend that skips text: plotters' bitmap backend needs a font library to draw
/// text, which the app does not build natively. Shapes are drawn as usual; text sizes are
/// estimated (about 0.6 em per character), so the layout matches a real font roughly.
pub struct TextlessBitmap<'a>(pub plotters::prelude::BitMapBackend<'a>);

impl plotters::prelude::DrawingBackend for TextlessBitmap<'_> {
    type ErrorType =
        <plotters::prelude::BitMapBackend<'static> as plotters::prelude::DrawingBackend>::ErrorType;
    fn get_size(&self) -> (u32, u32) {
        self.0.get_size()
    }
    fn ensure_prepared(
        &mut self,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        self.0.ensure_prepared()
    }
    fn present(&mut self) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        self.0.present()
    }
    fn draw_pixel(
        &mut self,
        point: plotters_backend::BackendCoord,
        color: plotters_backend::BackendColor,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        self.0.draw_pixel(point, color)
    }
    fn draw_line<S: plotters_backend::BackendStyle>(
        &mut self,
        from: plotters_backend::BackendCoord,
        to: plotters_backend::BackendCoord,
        style: &S,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        self.0.draw_line(from, to, style)
    }
    fn draw_rect<S: plotters_backend::BackendStyle>(
        &mut self,
        upper_left: plotters_backend::BackendCoord,
        bottom_right: plotters_backend::BackendCoord,
        style: &S,
        fill: bool,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        self.0.draw_rect(upper_left, bottom_right, style, fill)
    }
    fn fill_polygon<
        S: plotters_backend::BackendStyle,
        I: IntoIterator<Item = plotters_backend::BackendCoord>,
    >(
        &mut self,
        vert: I,
        style: &S,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        self.0.fill_polygon(vert, style)
    }
    fn draw_text<TStyle: plotters_backend::BackendTextStyle>(
        &mut self,
        _text: &str,
        _style: &TStyle,
        _pos: plotters_backend::BackendCoord,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        Ok(())
    }
    fn estimate_text_size<TStyle: plotters_backend::BackendTextStyle>(
        &self,
        text: &str,
        style: &TStyle,
    ) -> Result<(u32, u32), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        let size = style.size();
        Ok((
            (size * 0.6 * text.chars().count() as f64) as u32,
            size as u32,
        ))
    }
}

/// What a [`Recorder`] was asked to draw.
#[derive(Debug, Default)]
pub struct Record {
    /// Filled rectangles: upper left, lower right, colour.
    pub filled_rects: Vec<(Point, Point, RGBColor)>,
    /// Texts: the words, where they were placed, and the size the backend measured for them.
    pub texts: Vec<(String, Point, (u32, u32))>,
}

/// A backend that draws nothing: it records filled rectangles and texts, and measures text as
/// `char_width` pixels a character by the font's size, so a test knows what each label
/// measures and can tell that a layout took its sizes from the backend.
pub struct Recorder {
    pub size: (u32, u32),
    pub char_width: u32,
    pub record: std::rc::Rc<std::cell::RefCell<Record>>,
}

impl plotters::prelude::DrawingBackend for Recorder {
    type ErrorType = std::convert::Infallible;
    fn get_size(&self) -> (u32, u32) {
        self.size
    }
    fn ensure_prepared(
        &mut self,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        Ok(())
    }
    fn present(&mut self) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        Ok(())
    }
    fn draw_pixel(
        &mut self,
        _point: plotters_backend::BackendCoord,
        _color: plotters_backend::BackendColor,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        Ok(())
    }
    fn draw_rect<S: plotters_backend::BackendStyle>(
        &mut self,
        upper_left: plotters_backend::BackendCoord,
        bottom_right: plotters_backend::BackendCoord,
        style: &S,
        fill: bool,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        if fill {
            let (r, g, b) = style.color().rgb;
            self.record.borrow_mut().filled_rects.push((
                upper_left,
                bottom_right,
                RGBColor(r, g, b),
            ));
        }
        Ok(())
    }
    fn draw_text<TStyle: plotters_backend::BackendTextStyle>(
        &mut self,
        text: &str,
        style: &TStyle,
        pos: plotters_backend::BackendCoord,
    ) -> Result<(), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        let size = self.estimate_text_size(text, style)?;
        self.record
            .borrow_mut()
            .texts
            .push((text.to_string(), pos, size));
        Ok(())
    }
    fn estimate_text_size<TStyle: plotters_backend::BackendTextStyle>(
        &self,
        text: &str,
        style: &TStyle,
    ) -> Result<(u32, u32), plotters_backend::DrawingErrorKind<Self::ErrorType>> {
        Ok((
            self.char_width * text.chars().count() as u32,
            style.size().ceil() as u32,
        ))
    }
}
