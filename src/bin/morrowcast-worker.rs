//! The page's Web Worker (wasm): registers the plan worker and waits for asks.
//!
//! Kept apart from: everything it registers ([`morrowcast::worker`]). Natively it only says what
//! it is, like the app's own entry point.

#[cfg(target_arch = "wasm32")]
fn main() {
    use gloo_worker::Registrable;
    // A panic in the worker is thrown as a JavaScript error with its message, so the page
    // (listening for the worker's errors) can say what happened and start a new worker.
    std::panic::set_hook(Box::new(|info| {
        wasm_bindgen::throw_str(&format!("morrowcast worker: {info}"));
    }));
    morrowcast::worker::PlanWorker::registrar().register();
}

#[cfg(not(target_arch = "wasm32"))]
fn main() {
    eprintln!("morrowcast-worker is the browser app's Web Worker: trunk builds it for wasm32 (bash scripts/start.sh)");
    std::process::exit(2);
}
