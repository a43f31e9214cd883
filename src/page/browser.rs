//! Browser glue: the panic hook, the tab's own copy of the Intake text, downloads, the date and
//! performance measures, fault drills, and drawing a chart into a canvas.
//!
//! Kept apart from: the components. Nothing here reaches the network: downloads are local
//! `blob:` and `data:` links, storage is the tab's sessionStorage.

use plotters::prelude::IntoDrawingArea;
use plotters_canvas::CanvasBackend;
use wasm_bindgen::JsCast;
use web_sys::{Blob, BlobPropertyBag, HtmlAnchorElement, HtmlCanvasElement, Url};

use crate::chart::{Area, ChartError};

/// Key of the Intake text in sessionStorage (kept so a reload after a fault keeps the data).
const TEXT_KEY: &str = "morrowcast.intake-text";
/// Key of the name of the Intake text's source ("the demo", a file name, "pasted text").
const SOURCE_KEY: &str = "morrowcast.intake-source";

/// Shows the page's fault notice (static in index.html, so it exists even when the app does
/// not) with the panic message; the page itself stays as it was.
pub fn install_panic_hook() {
    std::panic::set_hook(Box::new(|info| {
        let message = info.to_string();
        web_sys::console::error_1(&message.clone().into());
        show_fault(&message);
    }));
}

/// Reveals the fault notice with `detail` in it (called by the panic hook).
pub fn show_fault(detail: &str) {
    let Some(doc) = web_sys::window().and_then(|w| w.document()) else {
        return;
    };
    if let Some(el) = doc.get_element_by_id("fault-detail") {
        el.set_text_content(Some(detail));
    }
    if let Some(el) = doc.get_element_by_id("fault-notice") {
        let _ = el.remove_attribute("hidden");
    }
}

fn session() -> Option<web_sys::Storage> {
    web_sys::window().and_then(|w| w.session_storage().ok().flatten())
}

/// The Intake text and its source kept by this tab, if any.
pub fn kept_text() -> Option<(String, String)> {
    let s = session()?;
    let text = s.get_item(TEXT_KEY).ok().flatten()?;
    let source = s
        .get_item(SOURCE_KEY)
        .ok()
        .flatten()
        .unwrap_or_else(|| "pasted text".into());
    Some((text, source))
}

/// Keeps the Intake text for this tab (ignored when storage is full or off).
pub fn keep_text(text: &str, source: &str) {
    if let Some(s) = session() {
        let _ = s.set_item(TEXT_KEY, text);
        let _ = s.set_item(SOURCE_KEY, source);
    }
}

/// Milliseconds from the page's clock.
pub fn now_ms() -> f64 {
    web_sys::window()
        .and_then(|w| w.performance())
        .map(|p| p.now())
        .unwrap_or(0.0)
}

/// Runs `work` between two marks and records it as the performance measure `name` (seen in
/// the browser's performance timeline; the end-to-end tests read them to say where a
/// recompute's time goes).
pub fn measured<T>(name: &str, work: impl FnOnce() -> T) -> T {
    let performance = web_sys::window().and_then(|w| w.performance());
    let start = format!("{name}:start");
    if let Some(p) = &performance {
        let _ = p.mark(&start);
    }
    let out = work();
    if let Some(p) = &performance {
        let _ = p.measure_with_start_mark(name, &start);
        p.clear_marks_with_mark_name(&start);
    }
    out
}

/// Marks the start of the performance measure `name`, ended by [`end_measure`] (for work that
/// ends in a later event, such as the worker's answer).
pub fn start_measure(name: &str) {
    if let Some(p) = web_sys::window().and_then(|w| w.performance()) {
        let _ = p.mark(&format!("{name}:start"));
    }
}

/// Records the performance measure `name` from its latest [`start_measure`] to now.
pub fn end_measure(name: &str) {
    if let Some(p) = web_sys::window().and_then(|w| w.performance()) {
        let start = format!("{name}:start");
        if p.measure_with_start_mark(name, &start).is_ok() {
            p.clear_marks_with_mark_name(&start);
        }
    }
}

/// The fault drill the page was opened with (`#drill=page-fault` or `#drill=worker-fault`), so
/// the browser tests can check that a fault is reported and the data kept.
pub fn drill() -> Option<String> {
    let hash = web_sys::window()?.location().hash().ok()?;
    hash.strip_prefix("#drill=").map(str::to_string)
}

/// Today as YYYY-MM-DD (local time), for file names.
pub fn today() -> String {
    let d = js_sys::Date::new_0();
    format!(
        "{:04}-{:02}-{:02}",
        d.get_full_year(),
        d.get_month() + 1,
        d.get_date()
    )
}

fn click_link(href: &str, file_name: &str) -> Option<()> {
    let doc = web_sys::window()?.document()?;
    let a: HtmlAnchorElement = doc.create_element("a").ok()?.dyn_into().ok()?;
    a.set_href(href);
    a.set_download(file_name);
    a.click();
    Some(())
}

/// A local `blob:` address holding `body` as `mime` (revoke it with `Url::revoke_object_url`).
pub fn blob_url(body: &str, mime: &str) -> Option<String> {
    let parts = js_sys::Array::of1(&wasm_bindgen::JsValue::from_str(body));
    let options = BlobPropertyBag::new();
    options.set_type(mime);
    let blob = Blob::new_with_str_sequence_and_options(&parts, &options).ok()?;
    Url::create_object_url_with_blob(&blob).ok()
}

/// Saves text as a file through a local blob link.
pub fn download_text(file_name: &str, mime: &str, body: &str) -> Option<()> {
    let url = blob_url(body, mime)?;
    click_link(&url, file_name);
    let _ = Url::revoke_object_url(&url);
    Some(())
}

/// Saves a canvas as PNG.
pub fn download_canvas(canvas: &HtmlCanvasElement, file_name: &str) -> Option<()> {
    let url = canvas.to_data_url_with_type("image/png").ok()?;
    click_link(&url, file_name)
}

/// Sizes the canvas to its laid-out size and draws into it.
pub fn draw_into(
    canvas: &HtmlCanvasElement,
    draw: impl FnOnce(&Area<'_, CanvasBackend>) -> Result<(), ChartError>,
) -> Result<(), ChartError> {
    let (w, h) = (
        canvas.client_width().max(320) as u32,
        canvas.client_height().max(200) as u32,
    );
    if canvas.width() != w {
        canvas.set_width(w);
    }
    if canvas.height() != h {
        canvas.set_height(h);
    }
    let backend = CanvasBackend::with_canvas_object(canvas.clone())
        .ok_or_else(|| ChartError::Backend("this browser gave no 2D canvas".into()))?;
    let area = backend.into_drawing_area();
    draw(&area)
}
