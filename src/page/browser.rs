//! Browser glue: the panic hook, the address's fragment, the clipboard, downloads, the date and
//! performance measures, fault drills, and drawing a chart into a canvas at the screen's pixel
//! density.
//!
//! Kept apart from: the components. Nothing here reaches the network: downloads are local
//! `blob:` and `data:` links (keeping the work in this browser is keep.rs).

use plotters::prelude::IntoDrawingArea;
use wasm_bindgen::JsCast;
use web_sys::{Blob, BlobPropertyBag, HtmlAnchorElement, HtmlCanvasElement, Url};

use crate::chart::canvas::PageCanvas;
use crate::chart::{Area, ChartError};

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

/// The address's fragment when it carries a work (a share link's `#w1.`…).
pub fn work_fragment() -> Option<String> {
    let hash = web_sys::window()?.location().hash().ok()?;
    morrowcast_work::Work::is_work(&hash).then_some(hash)
}

/// Takes the fragment out of the address without reloading: once a link's work is open, a
/// reload shows the desk as it is then, not as the link had it. The page's address stays the
/// same otherwise, so a link made later starts with it.
pub fn clear_fragment() {
    let Some(w) = web_sys::window() else {
        return;
    };
    let location = w.location();
    let address = format!(
        "{}{}",
        location.pathname().unwrap_or_default(),
        location.search().unwrap_or_default()
    );
    if let Ok(history) = w.history() {
        let _ = history.replace_state_with_url(&wasm_bindgen::JsValue::NULL, "", Some(&address));
    }
}

/// The page's own address without its fragment (a share link starts with it).
pub fn page_address() -> String {
    let Some(w) = web_sys::window() else {
        return String::new();
    };
    let href = w.location().href().unwrap_or_default();
    match href.split_once('#') {
        Some((address, _)) => address.to_string(),
        None => href,
    }
}

/// Puts `text` on the clipboard; `done` hears whether the browser allowed it.
pub fn copy_text(text: &str, done: impl FnOnce(bool) + 'static) {
    let Some(w) = web_sys::window() else {
        return done(false);
    };
    let promise = w.navigator().clipboard().write_text(text);
    wasm_bindgen_futures::spawn_local(async move {
        done(wasm_bindgen_futures::JsFuture::from(promise).await.is_ok());
    });
}

/// The time of day as HH:MM:SS (local time).
pub fn time_of_day() -> String {
    let d = js_sys::Date::new_0();
    format!(
        "{:02}:{:02}:{:02}",
        d.get_hours(),
        d.get_minutes(),
        d.get_seconds()
    )
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

/// Saves a canvas as PNG: its backing store, so at the density it was drawn at.
pub fn download_canvas(canvas: &HtmlCanvasElement, file_name: &str) -> Option<()> {
    let url = canvas.to_data_url_with_type("image/png").ok()?;
    click_link(&url, file_name)
}

/// Device pixels per CSS pixel of the screen the page is on (2 on most HiDPI screens).
pub fn density() -> f64 {
    web_sys::window()
        .map(|w| w.device_pixel_ratio())
        .unwrap_or(1.0)
}

/// Draws into the canvas at its laid-out size in CSS pixels, sharp at the screen's density.
pub fn draw_into(
    canvas: &HtmlCanvasElement,
    draw: impl FnOnce(&Area<'_, PageCanvas>) -> Result<(), ChartError>,
) -> Result<(), ChartError> {
    draw_into_at(canvas, density(), draw)
}

/// [`draw_into`] at a given density (the browser tests draw at 2 on any screen). The laid-out
/// size keeps its fractions (a canvas in a 436.5-pixel column holds 873 device pixels at
/// density 2), and has a floor so a canvas not laid out yet still gets a readable chart.
pub fn draw_into_at(
    canvas: &HtmlCanvasElement,
    density: f64,
    draw: impl FnOnce(&Area<'_, PageCanvas>) -> Result<(), ChartError>,
) -> Result<(), ChartError> {
    let laid_out = canvas.get_bounding_client_rect();
    let css = (laid_out.width().max(320.0), laid_out.height().max(200.0));
    let backend = PageCanvas::new(canvas, css, density)
        .ok_or_else(|| ChartError::Backend("this browser gave no 2D canvas".into()))?;
    draw(&backend.into_drawing_area())
}
