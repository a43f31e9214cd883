//! Tests of the page's pieces in a real browser (wasm-bindgen-test in headless Chromium): each
//! mounts one component, or draws one chart, into this test page's DOM and reads it back.
//!
//! Kept apart from: the whole page against the release build (tests/e2e/demo.rs), and the
//! pure parts (settings, words, export, chart data), tested natively. These run with
//! `cargo test --target wasm32-unknown-unknown -p morrowcast-app --lib` (the runner is set in
//! .cargo/config.toml; scripts/test.sh runs them).

use leptos::prelude::*;
use morrowcast_engine::intake;
use morrowcast_engine::plan::plan_item;
use morrowcast_engine::settings::PlanSettings;
use wasm_bindgen::JsCast;
use wasm_bindgen_test::*;
use web_sys::{CanvasRenderingContext2d, HtmlCanvasElement, HtmlElement, HtmlInputElement};

use super::browser;
use super::model;
use super::panels::{IntakePanel, SettingsPanel};
use super::state::{BoardState, IntakeState, PlanState, Resized, WorkState};
use crate::chart;

wasm_bindgen_test_configure!(run_in_browser);

fn document() -> web_sys::Document {
    web_sys::window().unwrap().document().unwrap()
}

/// A fresh element in the test page's body to mount into.
fn host() -> HtmlElement {
    let el: HtmlElement = document().create_element("div").unwrap().unchecked_into();
    document().body().unwrap().append_child(&el).unwrap();
    el
}

/// Lets the page's effects and timers run (Leptos updates the DOM after a microtask).
async fn settle() {
    let promise = js_sys::Promise::new(&mut |resolve, _| {
        web_sys::window()
            .unwrap()
            .set_timeout_with_callback_and_timeout_and_arguments_0(&resolve, 30)
            .unwrap();
    });
    wasm_bindgen_futures::JsFuture::from(promise).await.unwrap();
}

fn text_of(root: &HtmlElement, selector: &str) -> String {
    root.query_selector(selector)
        .unwrap()
        .unwrap_or_else(|| panic!("no {selector} on the page"))
        .text_content()
        .unwrap_or_default()
}

/// Mounts `view` with a fresh page state for `text` and returns its host element.
fn mount_with<V: IntoView + 'static>(text: &str, view: fn() -> V) -> HtmlElement {
    let el = host();
    let text = text.to_string();
    let handle = leptos::mount::mount_to(el.clone(), move || {
        let intake = IntakeState::new(text.clone(), "pasted text".into());
        let changes = RwSignal::new(std::collections::BTreeMap::new());
        let plan = PlanState::new(intake, changes);
        let board = BoardState::new(intake, plan, changes);
        provide_context(intake);
        provide_context(plan);
        provide_context(board);
        // Not started: these tests keep nothing in the browser and read nothing from it.
        provide_context(WorkState::new(intake, plan, board));
        provide_context(Resized(RwSignal::new(0)));
        view()
    });
    handle.forget();
    el
}

#[wasm_bindgen_test]
async fn intake_lists_each_rejected_cell_with_row_column_and_text() {
    let broken = "month,units\n2024-01,5\n2024-02,7\n2024-03,seven\n2024-04,6\n";
    let root = mount_with(broken, || view! { <IntakePanel/> });
    settle().await;
    let errors = text_of(&root, "#row-errors");
    assert!(errors.contains("Row 4"), "{errors}");
    assert!(errors.contains("column \"units\""), "{errors}");
    assert!(errors.contains("found \"seven\""), "{errors}");
    // The text stays in the box to fix.
    let area: web_sys::HtmlTextAreaElement = root
        .query_selector("#intake-text")
        .unwrap()
        .unwrap()
        .unchecked_into();
    assert_eq!(area.value(), broken);
}

#[wasm_bindgen_test]
async fn intake_offers_the_items_of_a_wide_file() {
    let wide = "month,Lantern oil,Seed packets\n2024-01,5,9\n2024-02,7,8\n2024-03,6,9\n";
    let root = mount_with(wide, || view! { <IntakePanel/> });
    settle().await;
    let options = text_of(&root, "#item-choice");
    assert!(
        options.contains("Lantern oil") && options.contains("Seed packets"),
        "{options}"
    );
}

#[wasm_bindgen_test]
async fn a_bad_horizon_is_marked_with_a_message_naming_the_field() {
    let root = mount_with("month,units\n2024-01,5\n", || view! { <SettingsPanel/> });
    settle().await;
    let input: HtmlInputElement = root
        .query_selector("#horizon")
        .unwrap()
        .unwrap()
        .unchecked_into();
    input.set_value("twelve");
    input
        .dispatch_event(&web_sys::Event::new("input").unwrap())
        .unwrap();
    settle().await;
    assert_eq!(input.get_attribute("aria-invalid").as_deref(), Some("true"));
    let message = text_of(&root, ".field.invalid .field-error");
    assert!(message.contains("twelve"), "{message}");
    // Fixing it clears the mark.
    input.set_value("12");
    input
        .dispatch_event(&web_sys::Event::new("input").unwrap())
        .unwrap();
    settle().await;
    assert_eq!(
        input.get_attribute("aria-invalid").as_deref(),
        Some("false")
    );
}

/// The demo's first item as the Look-ahead shows it (its plan computed here, in the test).
fn demo_look_ahead() -> chart::LookAhead {
    let report = intake::read(&morrowcast_engine::demo::demo_csv());
    let series = report.items[0].series().unwrap();
    let plan = plan_item(&series, &PlanSettings::default()).unwrap();
    let row = plan
        .backtest
        .ranking
        .iter()
        .find(|r| r.candidate == plan.chosen)
        .unwrap();
    model::look_ahead(&series, &plan, row, &plan)
}

/// A canvas laid out at 640x360 CSS pixels in the test page.
fn laid_out_canvas() -> HtmlCanvasElement {
    canvas_of_width("640px")
}

/// A canvas laid out `width` wide and 360 pixels high (this test page has no
/// Content-Security-Policy, so an inline size is allowed here).
fn canvas_of_width(width: &str) -> HtmlCanvasElement {
    let canvas: HtmlCanvasElement = document()
        .create_element("canvas")
        .unwrap()
        .unchecked_into();
    canvas
        .set_attribute(
            "style",
            &format!("display: block; width: {width}; height: 360px"),
        )
        .unwrap();
    document().body().unwrap().append_child(&canvas).unwrap();
    canvas
}

fn pixels(canvas: &HtmlCanvasElement) -> Vec<u8> {
    let ctx: CanvasRenderingContext2d = canvas.get_context("2d").unwrap().unwrap().unchecked_into();
    ctx.get_image_data(0.0, 0.0, canvas.width() as f64, canvas.height() as f64)
        .unwrap()
        .data()
        .to_vec()
}

#[wasm_bindgen_test]
fn the_look_ahead_draws_into_a_canvas() {
    let data = demo_look_ahead();
    let canvas = laid_out_canvas();
    browser::draw_into(&canvas, |area| chart::draw_look_ahead(area, &data)).unwrap();
    let (w, h) = (canvas.width(), canvas.height());
    let density = browser::density();
    assert_eq!(
        (w, h),
        (
            (640.0 * density).round() as u32,
            (360.0 * density).round() as u32
        )
    );
    let pixels = pixels(&canvas);
    let corner = &pixels[0..4].to_vec();
    let drawn = pixels.chunks(4).filter(|p| p != corner).count();
    // Lines, band and labels: well over 2 % of the canvas differs from its background.
    assert!(
        drawn * 50 > (w * h) as usize,
        "{drawn} of {} pixels drawn",
        w * h
    );
}

/// Rows of the grid lines' colour (src/chart/palette.rs GRID) down the column at `share` of
/// the width, as runs: (first row, rows).
fn grid_runs(canvas: &HtmlCanvasElement, share: f64) -> Vec<(u32, u32)> {
    let pixels = pixels(canvas);
    let (w, h) = (canvas.width(), canvas.height());
    let x = (f64::from(w) * share).round() as u32;
    let grid = |y: u32| {
        let i = ((y * w + x) * 4) as usize;
        let p = &pixels[i..i + 3];
        p[0].abs_diff(0xe4) <= 2 && p[1].abs_diff(0xe1) <= 2 && p[2].abs_diff(0xda) <= 2
    };
    let mut runs = Vec::new();
    let mut start = None;
    for y in 0..=h {
        match (y < h && grid(y), start) {
            (true, None) => start = Some(y),
            (false, Some(s)) => {
                runs.push((s, y - s));
                start = None;
            }
            _ => {}
        }
    }
    runs
}

#[wasm_bindgen_test]
fn at_density_two_the_store_doubles_and_a_thin_line_is_two_pixels() {
    let data = demo_look_ahead();
    let canvas = laid_out_canvas();
    browser::draw_into_at(&canvas, 2.0, |area| {
        // The chart lays out in CSS pixels, whatever the density.
        assert_eq!(area.dim_in_pixel(), (640, 360));
        chart::draw_look_ahead(area, &data)
    })
    .unwrap();
    assert_eq!((canvas.width(), canvas.height()), (1280, 720));
    // The horizontal grid lines are one CSS pixel: two device rows each, in the line's own
    // colour (a line between device pixels would blend into two rows of a lighter tint).
    let runs = grid_runs(&canvas, 0.5);
    assert!(runs.len() >= 3, "{runs:?}");
    assert!(runs.iter().all(|r| r.1 == 2), "{runs:?}");
    // Drawn again at density 1, the same lines are one row each.
    browser::draw_into_at(&canvas, 1.0, |area| chart::draw_look_ahead(area, &data)).unwrap();
    assert_eq!((canvas.width(), canvas.height()), (640, 360));
    let runs = grid_runs(&canvas, 0.5);
    assert!(
        !runs.is_empty() && runs.iter().all(|r| r.1 == 1),
        "{runs:?}"
    );
    // A column half a pixel wider: the store holds its 873 device pixels, the chart the 436
    // whole CSS pixels in them, still at exactly two device pixels each.
    let canvas = canvas_of_width("436.5px");
    browser::draw_into_at(&canvas, 2.0, |area| {
        assert_eq!(area.dim_in_pixel(), (436, 360));
        chart::draw_look_ahead(area, &data)
    })
    .unwrap();
    assert_eq!(canvas.width(), 873);
    let runs = grid_runs(&canvas, 0.5);
    assert!(runs.len() >= 3 && runs.iter().all(|r| r.1 == 2), "{runs:?}");
}

/// Plotters' own text measuring in the browser adds a span with an inline style to the body
/// for every label (the page's Content-Security-Policy refuses it); the page's canvas measures
/// with the canvas, so drawing a chart adds and removes no element.
#[wasm_bindgen_test]
fn drawing_a_chart_adds_nothing_to_the_document() {
    let data = demo_look_ahead();
    let canvas = laid_out_canvas();
    let observer = web_sys::MutationObserver::new(&js_sys::Function::new_no_args("")).unwrap();
    let options = web_sys::MutationObserverInit::new();
    options.set_child_list(true);
    options.set_subtree(true);
    observer
        .observe_with_options(&document(), &options)
        .unwrap();
    browser::draw_into_at(&canvas, 2.0, |area| chart::draw_look_ahead(area, &data)).unwrap();
    let changes = observer.take_records();
    observer.disconnect();
    assert_eq!(changes.length(), 0, "drawing changed the document");
}

/// The canvas backend's text size is the canvas's own measure of the text in the font it is
/// drawn in (widths rounded up), so the legend's box fits its words.
#[wasm_bindgen_test]
fn chart_text_is_measured_by_the_canvas() {
    use plotters::prelude::*;
    let canvas = laid_out_canvas();
    let backend = chart::canvas::PageCanvas::new(&canvas, (640.0, 360.0), 1.0).unwrap();
    let area = backend.into_drawing_area();
    let style: TextStyle = (chart::axis::FONT, 13).into_font().into();
    let ctx: CanvasRenderingContext2d = canvas.get_context("2d").unwrap().unwrap().unchecked_into();
    ctx.set_font("normal 13px sans-serif");
    for text in ["demand", "holdout forecast", "95% band"] {
        let (w, h) = area.estimate_text_size(text, &style).unwrap();
        let wanted = ctx.measure_text(text).unwrap().width().ceil() as u32;
        assert_eq!(w, wanted, "{text}");
        assert!((13..=20).contains(&h), "{text}: height {h}");
    }
}

/// The fault notice exactly as index.html holds it (from its opening tag to the noscript).
fn notice_markup() -> &'static str {
    let page = include_str!("../../index.html");
    let start = page
        .find("<div id=\"fault-notice\"")
        .expect("index.html holds the fault notice");
    let end = page[start..]
        .find("<noscript>")
        .expect("the noscript note follows the fault notice");
    &page[start..start + end]
}

#[wasm_bindgen_test]
fn the_fault_notice_shows_the_message_and_says_the_data_is_kept() {
    // The notice is static in index.html (so it exists even when the app does not start).
    let holder = host();
    holder.set_inner_html(notice_markup());
    let notice = document().get_element_by_id("fault-notice").unwrap();
    assert!(notice.has_attribute("hidden"), "the notice starts hidden");
    browser::show_fault("panicked at src/somewhere.rs: a test fault");
    assert!(!notice.has_attribute("hidden"));
    let text = notice.text_content().unwrap_or_default();
    assert!(
        text.contains("Your data is still in the Intake box"),
        "{text}"
    );
    assert!(text.contains("Reload the page"), "{text}");
    let detail = document().get_element_by_id("fault-detail").unwrap();
    assert_eq!(
        detail.text_content().as_deref(),
        Some("panicked at src/somewhere.rs: a test fault")
    );
}
