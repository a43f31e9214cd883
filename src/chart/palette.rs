//! The chart palette: one colour per meaning, the same on every chart, told apart by colour-blind
//! readers and by contrast.
//!
//! Kept apart from: drawing. Hues follow the colour-universal-design set of Okabe & Ito (2008,
//! "Color Universal Design: how to make figures and presentations that are friendly to colorblind
//! people"), darkened where needed so every line has at least 3:1 contrast with the background
//! (WCAG 2.1, success criterion 1.4.11, non-text contrast). Meaning never rests on colour alone:
//! lines also differ in dash and marker, and every chart has a text summary.

use plotters::style::RGBColor;

/// Chart background: warm paper white (the page's `--paper`).
pub const BACKGROUND: RGBColor = RGBColor(0xfb, 0xfa, 0xf7);
/// Text and axes.
pub const INK: RGBColor = RGBColor(0x24, 0x2b, 0x30);
/// Light grid lines (decoration only, no contrast requirement).
pub const GRID: RGBColor = RGBColor(0xe4, 0xe1, 0xda);
/// Demand (the history): near-black slate, solid with round markers.
pub const DEMAND: RGBColor = RGBColor(0x24, 0x2b, 0x30);
/// The method's fit on the history: Okabe-Ito blue, dashed.
pub const FITTED: RGBColor = RGBColor(0x00, 0x72, 0xb2);
/// The holdout forecast (the backtest): Okabe-Ito reddish purple, darkened.
pub const HOLDOUT: RGBColor = RGBColor(0x9c, 0x4f, 0x86);
/// The future forecast and its band: Okabe-Ito vermillion, darkened slightly.
pub const FORECAST: RGBColor = RGBColor(0xc0, 0x50, 0x00);
/// Opacity of the band fill over the background.
pub const BAND_OPACITY: f64 = 0.22;
/// Markers, limits and the holdout boundary: neutral grey.
pub const MARKER: RGBColor = RGBColor(0x5f, 0x67, 0x6d);
/// Out-of-limit marks: the forecast hue, so "alarm" reads the same everywhere.
pub const ALERT: RGBColor = FORECAST;

/// Seasonal-overlay line for year `index` of `count` (oldest first): one hue from light to dark,
/// so order reads without telling hues apart; the newest year is darkest.
pub fn year_colour(index: usize, count: usize) -> RGBColor {
    // Ends chosen to keep the lightest at >= 3:1 on the background (checked in the tests).
    let light = (0x5e, 0x8c, 0xb0);
    let dark = (0x0b, 0x2a, 0x45);
    let t = if count <= 1 {
        1.0
    } else {
        index.min(count - 1) as f64 / (count - 1) as f64
    };
    let mix = |a: u8, b: u8| (f64::from(a) + (f64::from(b) - f64::from(a)) * t).round() as u8;
    RGBColor(
        mix(light.0, dark.0),
        mix(light.1, dark.1),
        mix(light.2, dark.2),
    )
}

/// Relative luminance of an sRGB colour (WCAG 2.1 definition):
/// L = 0.2126 R + 0.7152 G + 0.0722 B, each channel c/255 linearised as
/// c/12.92 when c <= 0.04045, else ((c + 0.055)/1.055)^2.4.
#[cfg(test)]
pub fn relative_luminance(c: RGBColor) -> f64 {
    let lin = |v: u8| {
        let c = f64::from(v) / 255.0;
        if c <= 0.04045 {
            c / 12.92
        } else {
            ((c + 0.055) / 1.055).powf(2.4)
        }
    };
    0.2126 * lin(c.0) + 0.7152 * lin(c.1) + 0.0722 * lin(c.2)
}

/// Contrast ratio (L1 + 0.05) / (L2 + 0.05) with L1 the lighter (WCAG 2.1).
#[cfg(test)]
pub fn contrast(a: RGBColor, b: RGBColor) -> f64 {
    let (la, lb) = (relative_luminance(a), relative_luminance(b));
    let (hi, lo) = if la > lb { (la, lb) } else { (lb, la) };
    (hi + 0.05) / (lo + 0.05)
}

/// `#rrggbb` for the page's legend swatches.
#[cfg(test)]
pub fn hex(c: RGBColor) -> String {
    format!("#{:02x}{:02x}{:02x}", c.0, c.1, c.2)
}

#[cfg(test)]
mod tests {
    use super::*;

    // WCAG 2.1 "contrast ratio" definition, worked values: black on white is 21:1, white on
    // white 1:1; #777777 on white is about 4.48:1 (W3C WCAG 2.1 Understanding SC 1.4.3 names
    // #767676 as the lightest grey passing 4.5:1, so #777777 just fails).
    #[test]
    fn contrast_matches_the_wcag_definition() {
        let white = RGBColor(255, 255, 255);
        let black = RGBColor(0, 0, 0);
        assert!((contrast(black, white) - 21.0).abs() < 1e-9);
        assert!((contrast(white, white) - 1.0).abs() < 1e-12);
        assert!(contrast(RGBColor(0x76, 0x76, 0x76), white) >= 4.5);
        assert!(contrast(RGBColor(0x77, 0x77, 0x77), white) < 4.5);
    }

    // WCAG 2.1 SC 1.4.11: graphical objects need 3:1 against adjacent colours; chart text (INK)
    // needs 4.5:1 (SC 1.4.3).
    #[test]
    fn every_line_colour_meets_non_text_contrast() {
        for (name, c) in [
            ("demand", DEMAND),
            ("fitted", FITTED),
            ("holdout", HOLDOUT),
            ("forecast", FORECAST),
            ("marker", MARKER),
        ] {
            let r = contrast(c, BACKGROUND);
            assert!(r >= 3.0, "{name} has contrast {r:.2} on the background");
        }
        assert!(contrast(INK, BACKGROUND) >= 4.5);
        for i in 0..8 {
            let r = contrast(year_colour(i, 8), BACKGROUND);
            assert!(r >= 3.0, "year {i} has contrast {r:.2}");
        }
    }

    #[test]
    fn year_colours_darken_from_oldest_to_newest() {
        let l: Vec<f64> = (0..5)
            .map(|i| relative_luminance(year_colour(i, 5)))
            .collect();
        assert!(l.windows(2).all(|w| w[1] < w[0]), "{l:?}");
        assert_eq!(year_colour(0, 1), year_colour(3, 4));
    }

    #[test]
    fn hex_is_lower_case_six_digits() {
        assert_eq!(hex(RGBColor(0, 0x72, 0xb2)), "#0072b2");
    }
}
