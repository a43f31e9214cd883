//! The page's reading worker (wasm): registers it and waits for large texts and workbooks.
//!
//! Kept apart from: everything it registers ([`morrowcast_app::worker::reading`]). Built as a
//! wasm of its own so that the plan worker carries neither Intake nor the workbook reader, and
//! the page not the workbook reader; natively it only says what it is, like the app's own
//! entry point.

#[cfg(target_arch = "wasm32")]
fn main() {
    use gloo_worker::Registrable;
    use wasm_bindgen::JsCast;
    // A panic (a bug: Intake and the workbook reader are fuzzed) is thrown as a JavaScript error
    // the page knows by its start, so the page can say so for what was being read and start a
    // new worker;
    // the worker first closes itself, as the plan worker does.
    std::panic::set_hook(Box::new(|info| {
        let message = format!(
            "{}{info}",
            morrowcast_app::worker::reading::READ_FAULT_PREFIX
        );
        if let Ok(scope) = js_sys::global().dyn_into::<web_sys::DedicatedWorkerGlobalScope>() {
            scope.close();
        }
        wasm_bindgen::throw_str(&message);
    }));
    morrowcast_app::worker::reading::ReadingWorker::registrar().register();
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("morrowcast-reader is the browser app's reading worker: trunk builds it for wasm32 (bash scripts/start.sh)");
    std::process::exit(2);
}
