//! The charts on a HiDPI screen (2 device pixels per CSS pixel, as Chromium's
//! `--force-device-scale-factor=2` makes it): each canvas's backing store holds twice its CSS
//! size, a one-pixel line of the chart is two device pixels wide and crisp, and "Save chart as
//! PNG" saves that sharp image.
//!
//! Kept apart from: what the charts show (src/chart's native tests, demo.rs) and the layout
//! (access.rs). A screenshot at density 2 is kept for review (tests/screenshots/density-2-*.png).

use serde_json::json;

use super::page::{number, open_with, save_screenshot, wait_for_item, WAIT};
use super::webdriver::decode_base64;

/// The canvases of the demo's charts (src/page/results.rs).
const CHARTS: [&str; 5] = [
    "look-ahead-chart",
    "tracking-chart",
    "history-chart",
    "overlay-chart",
    "acf-chart",
];

/// Per canvas: [backing width, backing height, CSS width, CSS height], once each is drawn
/// (some pixel differs from the chart background).
const SIZES: &str = r#"
return arguments[0].map(id => {
  const c = document.getElementById(id);
  if (!c || c.width === 0) return null;
  const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
  let drawn = false;
  for (let i = 0; i < d.length && !drawn; i += 4) {
    drawn = Math.abs(d[i] - 0xfb) + Math.abs(d[i + 1] - 0xfa) + Math.abs(d[i + 2] - 0xf7) > 12;
  }
  if (!drawn) return null;
  const r = c.getBoundingClientRect();
  return [c.width, c.height, r.width, r.height];
});
"#;

/// Runs of rows in the grid lines' colour (#e4e1da, src/chart/palette.rs GRID), down two
/// columns of the Look-ahead's backing store (inside the plot, right of the legend, left of the
/// forecast band), each with the colours just above and below it. The chart's horizontal grid
/// lines are one CSS pixel wide.
const GRID_RUNS: &str = r#"
const c = document.getElementById('look-ahead-chart');
const d = c.getContext('2d').getImageData(0, 0, c.width, c.height).data;
const at = (x, y) => { const i = (y * c.width + x) * 4; return [d[i], d[i + 1], d[i + 2]]; };
const grid = p => Math.abs(p[0] - 0xe4) <= 2 && Math.abs(p[1] - 0xe1) <= 2 && Math.abs(p[2] - 0xda) <= 2;
const runs = [];
for (const share of [0.45, 0.6]) {
  const x = Math.round(c.width * share);
  let start = -1;
  for (let y = 0; y <= c.height; y++) {
    const on = y < c.height && grid(at(x, y));
    if (on && start < 0) start = y;
    if (!on && start >= 0) {
      runs.push([y - start, start > 0 ? at(x, start - 1) : null, y < c.height ? at(x, y) : null]);
      start = -1;
    }
  }
}
return runs;
"#;

/// The width and height in a PNG's header (IHDR follows the 8-byte signature).
fn png_size(png: &[u8]) -> (u32, u32) {
    assert!(png.len() > 24 && png.starts_with(b"\x89PNG"), "not a PNG");
    let be = |i: usize| u32::from_be_bytes([png[i], png[i + 1], png[i + 2], png[i + 3]]);
    (be(16), be(20))
}

/// The demo at density 2: every chart's store is 2x its CSS size, its thin lines are two
/// device pixels of the line's own colour (no blend with the paper above or below), the
/// window's screenshot and the saved PNG are at full density.
#[test]
fn charts_are_drawn_at_the_screens_pixel_density() {
    let Some(page) = open_with((1366, 900), "", 2.0) else {
        return;
    };
    let browser = &page.browser;
    wait_for_item(browser, "Seed packets");
    assert_eq!(
        number(&browser.js("return window.devicePixelRatio")),
        2.0,
        "Chromium did not start at device scale 2"
    );
    let sizes = browser.wait_for_args(
        "every chart drawn",
        &format!("const s = (() => {{ {SIZES} }})(); return s.every(x => x) && s"),
        json!([CHARTS]),
        WAIT,
    );
    for (id, s) in CHARTS.iter().zip(sizes.as_array().unwrap()) {
        let (w, h, css_w, css_h) = (number(&s[0]), number(&s[1]), number(&s[2]), number(&s[3]));
        assert!(
            css_w >= 300.0 && css_h >= 200.0,
            "{id}: laid out at {css_w}x{css_h}"
        );
        assert!(
            w == (2.0 * css_w).round() && h == (2.0 * css_h).round(),
            "{id}: backing store {w}x{h} for {css_w}x{css_h} CSS pixels (density 2 wants twice)"
        );
    }

    let runs = browser.js(GRID_RUNS);
    let runs = runs.as_array().unwrap();
    assert!(runs.len() >= 6, "too few grid lines found: {runs:?}");
    let paper = json!([0xfb, 0xfa, 0xf7]);
    for run in runs {
        assert_eq!(
            run[0],
            json!(2),
            "a one-pixel grid line is not two device pixels: {runs:?}"
        );
        // Crisp: paper right above and below (a line drawn between device pixels would blend
        // into its neighbours).
        assert!(
            run[1] == paper && run[2] == paper,
            "a grid line's edge is blurred: {run}"
        );
    }

    // The screenshot is of the viewport (the window less its frame), in device pixels.
    let viewport = browser.js("return [window.innerWidth, window.innerHeight]");
    let shot = browser.screenshot();
    assert_eq!(
        png_size(&shot),
        (
            2 * number(&viewport[0]) as u32,
            2 * number(&viewport[1]) as u32
        ),
        "the screenshot is not at density 2"
    );
    save_screenshot(browser, "density-2-look-ahead.png");
    for (section, name) in [
        ("pattern-view", "density-2-pattern-view.png"),
        ("overlay-chart", "density-2-overlay.png"),
        ("tracking-chart", "density-2-tracking.png"),
    ] {
        browser.js_args(
            "document.getElementById(arguments[0]).scrollIntoView()",
            json!([section]),
        );
        std::thread::sleep(std::time::Duration::from_millis(300));
        save_screenshot(browser, name);
    }

    // "Save chart as PNG" saves the canvas at its full density: the link the button clicks is
    // caught (the click itself kept from saving).
    let link = browser.js("let href = null; \
         HTMLAnchorElement.prototype.click = function () { href = this.href; }; \
         document.querySelector('#look-ahead-chart ~ button').click(); \
         return href;");
    let href = link.as_str().expect("the button made no link");
    let png = decode_base64(
        href.strip_prefix("data:image/png;base64,")
            .expect("the link is a PNG data address"),
    );
    let s = &sizes[0];
    assert_eq!(
        png_size(&png),
        (number(&s[0]) as u32, number(&s[1]) as u32),
        "the saved PNG is not the canvas's full-density image"
    );
}
